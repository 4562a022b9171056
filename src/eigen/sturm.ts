/**
 * Sturm-sequence checks of K x = λ M x.
 *
 * Sylvester's law of inertia: K − σM = L D Lᵀ (after a symmetric permutation) has as many
 * negative pivots in D as negative eigenvalues. With M positive definite, K − σM is congruent
 * to M^{1/2}(M^{-1/2} K M^{-1/2} − σ I)M^{1/2}, so the count equals the number of eigenvalues
 * λ < σ (Bathe, Finite Element Procedures, §11.4.3; Grimes, Lewis & Simon 1994, §4).
 *
 * Singular M (massless DOFs, M positive semidefinite): for K positive definite,
 * K − σM = K^{1/2}(I − σ C)K^{1/2} with C = K^{-1/2} M K^{-1/2} positive semidefinite; C's
 * eigenvalues are μ = 1/λ for the finite λ and 0 for the infinite ones. For σ > 0 a negative
 * eigenvalue 1 − σμ < 0 needs μ > 1/σ, i.e. a finite λ < σ; the infinite ones (μ = 0) give
 * 1 > 0 and are never counted. For σ ≤ 0 every 1 − σμ ≥ 1 > 0: count 0, as there are no
 * λ < σ ≤ 0. So the count still equals the number of finite eigenvalues below σ. For a singular
 * K (free-free) the same holds by continuity for any σ that is not an eigenvalue, as long as K
 * and M share no null vector (the pencil is regular).
 */
import type { SymbolicFactor } from '../linalg/ldlt/types';
import type { SymmetricCsc } from '../linalg/sparse/symmetric';
import type { SturmCheck } from './types';
import { ShiftedPencil } from './pencil';

/**
 * Relative gap between the highest returned eigenvalue and the shift of the Sturm check:
 * σ = λ_max + STURM_GAP · max(|λ_max|, |λ_min|, λ_max − λ_min) (for results that are all ≈ 0,
 * see SturmCheckOptions.minimumGap). A mode closer
 * than that above λ_max is counted too and must then have been computed (it is, as an extra).
 * A copy of a repeated eigenvalue split by round-off (≈ 1e-12 relative) lies well inside it.
 */
export const STURM_GAP = 1e-6;

/**
 * Pivot tolerance (relative to max|A_jj|) of the check factorizations. A count needs only the
 * signs of the pivots, not a well-conditioned factor, and the default 1e-13 is too coarse when
 * members differ in stiffness by orders of magnitude: with a contrast of 1e8 the soft part's
 * pivots are already ≈ 5e-12 · max|A_jj| at σ = 0 and ≈ 5e-18 at STURM_GAP above a mode. Only a
 * pivot at round-off of round-off (ε²) is treated as σ sitting on an eigenvalue.
 */
export const STURM_PIVOT_TOLERANCE = Number.EPSILON * Number.EPSILON;

/**
 * Number of eigenvalues of K x = λ M x below σ: the negative pivots of K − σM.
 * When σ is itself an eigenvalue (a vanishing pivot) σ is nudged upward (pencil.ts,
 * SHIFT_NUDGE), so an eigenvalue at σ counts as below.
 * @param K - stiffness, n × n symmetric lower CSC
 * @param M - mass, n × n symmetric positive semidefinite lower CSC
 * @param sigma - shift, rad²/s²
 * @param sym - an analysis of the union pattern of K and M to reuse (optional)
 * @throws ArgumentError for mismatched sizes or analysis; FactorizationError when K and M share a null vector
 */
export function sturmCount(K: SymmetricCsc, M: SymmetricCsc, sigma: number, sym?: SymbolicFactor): number {
  const pencil = new ShiftedPencil(K, M, sym ? { symbolic: sym } : {});
  return pencil.factorAt(sigma, 1).factor.negativePivots;
}

/** Options of {@link sturmCheck}. */
export interface SturmCheckOptions {
  /** Check the window [λ_min − gap, λ_max + gap) instead of everything below λ_max + gap. @defaultValue false */
  window?: boolean;
  /**
   * Smallest gap in rad²/s², for results whose eigenvalues are all ≈ 0 (below this value): the
   * gap is then widened to it, but never past half the distance to the next computed eigenvalue.
   * Results with any eigenvalue above it use the relative gap alone. @defaultValue 0
   */
  minimumGap?: number;
}

/**
 * Verifies that no eigenvalue was missed: the Sturm count at σ = λ_max + gap (and, for a
 * window, at λ_min − gap) must equal the number of computed eigenvalues in that interval.
 * @param pencil - the pencil the result was computed for
 * @param computed - every eigenvalue computed and verified, ascending, rad²/s² (may extend
 *   beyond the returned ones)
 * @param returned - how many of `computed` (the lowest of them) are returned; ≥ 1
 * @param firstReturned - index in `computed` of the lowest returned eigenvalue @defaultValue 0
 */
export function sturmCheck(pencil: ShiftedPencil, computed: Float64Array, returned: number, firstReturned = 0, options: SturmCheckOptions = {}): SturmCheck {
  const lo = computed[firstReturned];
  const hi = computed[firstReturned + returned - 1];
  const scale = Math.max(Math.abs(hi), Math.abs(lo), hi - lo);
  let gap = STURM_GAP * scale;
  const floor = options.minimumGap ?? 0;
  if (floor > gap && scale < floor) {
    // Every returned eigenvalue is ≈ 0 at the floor's resolution (rigid-body modes, round-off
    // of either sign): widen the gap to the floor, but stop halfway to the nearest computed
    // eigenvalue beyond the returned ones, so that the check never asks for modes that the
    // result has no reason to hold.
    let g = floor;
    const next = firstReturned + returned < computed.length ? computed[firstReturned + returned] : Infinity;
    if (next > hi + gap) g = Math.min(g, 0.5 * (next - hi));
    if (options.window && firstReturned > 0) {
      const prev = computed[firstReturned - 1];
      if (prev < lo - gap) g = Math.min(g, 0.5 * (lo - prev));
    }
    gap = Math.max(gap, g);
  }
  gap = Math.max(gap, Number.MIN_VALUE);
  // A nudge (σ on an eigenvalue) moves by a fraction of the gap, not of the typical λ.
  const checkOptions = { pivotTolerance: STURM_PIVOT_TOLERANCE, nudge: 0.1 * gap };
  const upper = pencil.factorAt(hi + gap, 1, undefined, checkOptions);
  const shift = upper.shift;
  const countBelow = upper.factor.negativePivots;
  // Only the counts are kept: the next factorization of the pencil reuses the storage.
  pencil.recycle(upper.factor);
  let lowerShift: number | undefined;
  let countBelowLower: number | undefined;
  if (options.window) {
    const lower = pencil.factorAt(lo - gap, -1, undefined, checkOptions);
    lowerShift = lower.shift;
    countBelowLower = lower.factor.negativePivots;
    pencil.recycle(lower.factor);
  }
  const from = lowerShift ?? -Infinity;
  let inside = 0;
  let returnedInside = 0;
  for (let i = 0; i < computed.length; i++) {
    if (computed[i] < shift && computed[i] >= from) {
      inside++;
      if (i >= firstReturned && i < firstReturned + returned) returnedInside++;
    }
  }
  const expected = countBelow - (countBelowLower ?? 0);
  return {
    shift,
    countBelow,
    returnedBelow: returnedInside,
    passed: expected === inside,
    ...(lowerShift !== undefined ? { lowerShift, countBelowLower } : {}),
    ...(inside > returnedInside ? { extraBelow: inside - returnedInside } : {}),
  };
}
