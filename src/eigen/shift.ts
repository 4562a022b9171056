/**
 * The shift for the lowest modes when K is singular (free-free structures: rigid-body modes at
 * λ ≈ 0) or so ill-conditioned that σ = 0 is unsafe (members whose stiffness differs by 1e8).
 *
 * Shift-invert turns λ into θ = 1/(λ − σ). With σ = −s, the rigid-body modes get θ ≈ 1/s and the
 * first flexible mode θ = 1/(λ₁ + s): the iteration separates them only when s is not far above
 * λ₁ (Ericsson & Ruhe 1980; Grimes, Lewis & Simon 1994, §3: the shift belongs near the wanted
 * eigenvalues). A fixed fraction of trace(K)/trace(M) fails on a stiffness contrast: trace(K) is
 * dominated by the stiff members, λ₁ by the soft ones, and s came out 1e6…1e9 × λ₁, where the
 * flexible modes' θ agree to 1e-7…1e-9 and Lanczos or subspace iteration cannot tell them apart.
 *
 * So s is found with Sturm counts (Sylvester's law of inertia: the negative pivots of K − σM
 * count the eigenvalues below σ; Bathe, Finite Element Procedures, §11.4.3):
 *
 * 1. r = count(s_floor), s_floor = FREE_SHIFT_FLOOR · t, t = trace(K)/trace(M): the eigenvalues
 *    that cannot be told from 0 (rigid-body modes, computed as ±round-off).
 * 2. If count(s_ceiling) = r (s_ceiling the caller's default, FREE_SHIFT · t), no eigenvalue lies
 *    between the two, λ_{r+1} ≥ s_ceiling, and s = s_ceiling: the former default, unchanged for
 *    ordinary free-free structures.
 * 3. Else bisect log s between them on "count(s) = r" until the bracket is within a factor
 *    FREE_SHIFT_RESOLUTION; s = its lower end, so λ_{r+1}/s lies in [1, FREE_SHIFT_RESOLUTION].
 *
 * Costs 2 factorizations (ordinary free-free), or 2 + ⌈log₂(log₁₀(s_ceiling/s_floor)/2)⌉ (4 with
 * the default constants) when a mode lies below s_ceiling; all are counted in the solver's
 * `factorizations`.
 */
import { STURM_PIVOT_TOLERANCE } from './sturm';
import type { ShiftedPencil } from './pencil';

/**
 * Lower end of the search, relative to trace(K)/trace(M): about 45 ε. Eigenvalues below it are
 * treated as zero (rigid-body) by the search: a backward error of ε·‖K‖ moves eigenvalues by
 * about ε · (largest eigenvalue), and the largest eigenvalue is at least trace(K)/trace(M) up to
 * the spread of the diagonal. Measured on free-free stepped beams with a 1e8 contrast: rigid-body
 * eigenvalues came out at |λ| ≤ 5e-16 · t, the first flexible ones at 2e-13 · t and above.
 */
export const FREE_SHIFT_FLOOR = 1e-14;

/** The search stops when the bracket [lo, hi] around λ_{r+1} has hi/lo ≤ this; s = lo. */
export const FREE_SHIFT_RESOLUTION = 100;

/** Outcome of {@link lowestModesShift}. */
export interface LowestModesShift {
  /** s > 0 in rad²/s²: factorize K + sM (σ = −s) for the lowest modes. */
  readonly magnitude: number;
  /** Eigenvalues counted below s_floor (rigid-body modes and round-off), r. */
  readonly belowFloor: number;
  /** s_floor in rad²/s²: results made only of modes below it are ≈ 0 at this resolution. */
  readonly floor: number;
  /** Sturm-count factorizations the search made. */
  readonly factorizations: number;
}

/**
 * Chooses σ = −s for the lowest modes of a pencil whose K is singular or nearly so (file header).
 * @param pencil - K − σM on its analysed pattern; its factorization counter advances
 * @param ceiling - largest s to use, rad²/s² (the former fixed default); > 0
 * @returns s and the facts of the search
 * @throws FactorizationError when K and M share a null vector (no shift makes K − σM regular)
 */
export function lowestModesShift(pencil: ShiftedPencil, ceiling: number): LowestModesShift {
  const floor = Math.min(FREE_SHIFT_FLOOR * pencil.typicalEigenvalue, ceiling / FREE_SHIFT_RESOLUTION);
  let factorizations = 0;
  // A count needs only the signs of the pivots (sturm.ts); a nudge off an eigenvalue moves σ by
  // a fraction of σ itself, not of the typical eigenvalue, so that it stays in its bracket.
  const count = (s: number): number => {
    factorizations++;
    return pencil.factorAt(s, 1, undefined, { pivotTolerance: STURM_PIVOT_TOLERANCE, nudge: 1e-6 * s }).factor.negativePivots;
  };
  const r = count(floor);
  let lo = floor;
  let hi = ceiling;
  if (count(hi) === r) return { magnitude: ceiling, belowFloor: r, floor, factorizations };
  while (hi / lo > FREE_SHIFT_RESOLUTION) {
    const mid = Math.sqrt(lo * hi);
    if (count(mid) === r) lo = mid;
    else hi = mid;
  }
  return { magnitude: lo, belowFloor: r, floor, factorizations };
}
