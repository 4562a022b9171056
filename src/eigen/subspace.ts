/**
 * Shift-invert subspace iteration with Rayleigh–Ritz (Bathe, Finite Element Procedures, 1996,
 * §11.6; Bathe & Wilson 1972): iterate q = max(2p, p + 8) vectors with
 * X̄ = (K − σM)⁻¹ M X, project K − σM and M onto X̄, solve the q × q problem densely, rotate.
 * Vector i converges at the rate |λᵢ − σ| / |λ_{q+1} − σ| (Bathe §11.6.2).
 *
 * Before the projection X̄ is M-orthonormalised by rank-revealing Gram–Schmidt (ritz.ts
 * `mGramSchmidt`): M-dependent directions are dropped and re-seeded with random vectors,
 * and when dropping repeats without gain the block shrinks to the span the operator can reach
 * (at most rank M − lockedCount: massless DOFs of a lumped mass, or a spectrum so wide that
 * (K − σM)⁻¹ M X has fewer independent columns than q in double precision).
 *
 * Workspaces (X, X̄, M·X) are column-major n × q Float64Arrays sized once; the small q × q
 * problems allocate.
 */
import { AbortedError, ArgumentError, VerificationError } from '../errors';
import type { Operator } from '../linalg/operator';
import { dotColumns, gram, combineColumnsInPlace, residualSquares, SeededRandom, subtractColumns } from './kernels';
import type { BlockOperator } from './operators';
import type { ProgressCallback } from './lanczos';
import { congruence, mGramSchmidt, multiplySmall, projectedEigen } from './ritz';
import { matrixNorm1 } from './verify';

/**
 * Relative M-norm floor of rank-revealing Gram–Schmidt (ritz.ts `mGramSchmidt`): a column that
 * keeps less than this fraction of its M-norm after orthogonalisation to the others is dropped
 * as M-dependent. Exactly dependent directions (a singular M) keep about ε·cond; a column that
 * keeps 1e-9 still carries its information (a 2-DOF pencil with λ₂/λ₁ ≈ 1e9 needs it).
 */
const DROP_TOLERANCE = 1e-11;
/**
 * When a kept column lost more than this fraction of its M-norm² to orthogonalisation, M·X̄ is
 * recomputed and Gram–Schmidt repeated: the recurrence for M·X̄ carries an error of about
 * ε / ratio (ritz.ts `mGramSchmidt`), 1e-12 at this ratio.
 */
const RECOMPUTE_RATIO = 1e-4;

export interface SubspaceOptions {
  /** Eigenpairs wanted (p): those nearest the shift σ. @defaultValue 20 */
  count?: number;
  /** Shift σ (rad²/s²) of the factor behind `inverse`. @defaultValue 0 */
  shift?: number;
  /** Iteration vectors q; `0` picks max(2p, p + 8) (Bathe §11.6.3), capped by the dimension. @defaultValue 0 */
  subspaceSize?: number;
  /** A pair is converged when ‖Kx − λMx‖ / (normK ‖x‖) ≤ tolerance. @defaultValue 1e-11 */
  tolerance?: number;
  /** ‖K‖₁ used in the residual test; `0` estimates it from the stiffness operator (verify.ts `matrixNorm1`, Hager's estimate). @defaultValue 0 */
  normK?: number;
  /** Iteration limit. @defaultValue 300 */
  maxIterations?: number;
  /** Seed of the start vectors. @defaultValue 1 */
  seed?: number;
  /** Known eigenvectors to stay M-orthogonal to, column-major n × lockedCount. @defaultValue none */
  locked?: Float64Array;
  /** Columns in `locked`. @defaultValue 0 */
  lockedCount?: number;
  /** Called after each iteration with ('subspace', converged / count). */
  onProgress?: ProgressCallback;
  /** Checked every iteration; when aborted, AbortedError is thrown. */
  signal?: AbortSignal;
}

/** Defaults of {@link SubspaceOptions}. */
export const SUBSPACE_DEFAULTS = {
  count: 20,
  shift: 0,
  subspaceSize: 0,
  tolerance: 1e-11,
  normK: 0,
  maxIterations: 300,
  seed: 1,
  lockedCount: 0,
} as const;

export interface SubspaceResult {
  /** Eigenvalues nearest σ, ascending, rad²/s², length m = count (fewer, with `converged` false, when the reachable span holds fewer than count pairs). */
  readonly eigenvalues: Float64Array;
  /** Their vectors, column-major n × m, M-orthonormal. */
  readonly vectors: Float64Array;
  /** M times the vectors, column-major n × m. */
  readonly massVectors: Float64Array;
  /** Relative residual of each returned pair as measured in the last iteration. */
  readonly residuals: Float64Array;
  /** True when all `count` wanted pairs converged (or stagnated at round-off within 100 × tolerance). */
  readonly converged: boolean;
  /** Wanted pairs whose residual met the tolerance in the last iteration. */
  readonly convergedCount: number;
  /** Iterations done. */
  readonly iterations: number;
}

/**
 * Shift-invert subspace iteration: the `count` eigenpairs of K x = λ M x nearest σ.
 * @param inverse - Y ← (K − σM)⁻¹ X, n × n, with a block form
 * @param mass - Y ← M X, n × n symmetric positive semidefinite, with a block form
 * @param stiffness - y ← K x, n × n symmetric (for the residual test)
 * @param options - see {@link SubspaceOptions}; defaults in {@link SUBSPACE_DEFAULTS}
 * @throws ArgumentError on invalid options, AbortedError when aborted, VerificationError (path
 *   `projection`) when every iteration vector has zero M-norm or holds non-finite values
 */
export function subspaceIteration(inverse: BlockOperator, mass: BlockOperator, stiffness: Operator, options: SubspaceOptions = {}): SubspaceResult {
  const o = { ...SUBSPACE_DEFAULTS, ...options };
  const n = inverse.n;
  if (mass.n !== n || stiffness.n !== n) throw new ArgumentError(`operators have sizes ${n}, ${mass.n}, ${stiffness.n}; pass operators of one size`, 'mass');
  if (!Number.isInteger(o.count) || o.count < 1) throw new ArgumentError(`count ${o.count} is not a positive integer; ask for at least one mode`, 'count');
  if (!(o.tolerance > 0 && o.tolerance < 1)) throw new ArgumentError(`tolerance ${o.tolerance} is outside (0, 1); use e.g. 1e-11`, 'tolerance');
  const L = o.lockedCount;
  if (!Number.isInteger(L) || L < 0 || L >= n) throw new ArgumentError(`lockedCount ${L} must be an integer in [0, ${n - 1}]`, 'lockedCount');
  if (L > 0 && (!o.locked || o.locked.length < L * n)) throw new ArgumentError(`locked holds fewer than n · lockedCount = ${n * L} values; pass the locked vectors`, 'locked');
  const avail = n - L;
  const p = Math.min(o.count, avail);
  const q = Math.min(o.subspaceSize > 0 ? Math.max(o.subspaceSize, p) : Math.max(2 * p, p + 8), avail);
  const sigma = o.shift;
  const normK = o.normK > 0 ? o.normK : matrixNorm1(stiffness);

  // ---- workspace ----
  let X = new Float64Array(n * q);
  let Xb = new Float64Array(n * q);
  const MX = new Float64Array(n * q);
  const kx = new Float64Array(n);
  const A = new Float64Array(q * q);
  const B = new Float64Array(q * q);
  const T1 = new Float64Array(q * q);
  const T2 = new Float64Array(q * q);
  const h2 = new Float64Array(q);
  const h = new Float64Array(Math.max(L, 1));
  const tmp = new Float64Array(256 * q);
  const lockedM = new Float64Array(n * L);
  if (L > 0) mass.applyMany(o.locked!, lockedM, L);
  const rng = new SeededRandom(o.seed);
  rng.fill(X);
  const omega = new Float64Array(q);
  const res = new Float64Array(q);
  const opRes = new Float64Array(q).fill(Infinity);
  const opFloor = new Float64Array(q).fill(Infinity);
  const sums = new Float64Array(2); // residualSquares' two sums
  let opConverged = false;
  let residualsConverged = false;
  const best = new Float64Array(p).fill(Infinity);
  let stale = 0;
  let stagnated = false;
  let iterations = 0;
  let nconv = 0;
  // Active block size qa ≤ q and Ritz pairs held k ≤ qa: the block shrinks when the operator's
  // range is exhausted (rank M − lockedCount < q, e.g. massless rotations of a lumped mass).
  let qa = q;
  let k = 0;
  let want = p;
  let droppedLast = -1;

  /** Removes the locked directions from columns [c0, c1) of y (M-orthogonal projection, twice). */
  const deflate = (y: Float64Array, c0: number, c1: number): void => {
    if (L === 0) return;
    for (let c = c0; c < c1; c++) {
      const v = y.subarray(c * n, (c + 1) * n);
      for (let pass = 0; pass < 2; pass++) {
        dotColumns(lockedM, n, 0, L, v, h);
        subtractColumns(o.locked!, n, 0, L, h, v);
      }
    }
  };

  deflate(X, 0, q);
  mass.applyMany(X, MX, q);
  let order: number[] = [];
  while (iterations < o.maxIterations) {
    if (o.signal?.aborted) throw new AbortedError('the eigen solve was aborted through its AbortSignal; run it again without aborting to get the modes', 'signal');
    iterations++;
    // X̄ = (K − σM)⁻¹ M X  (Bathe eq. 11.107)
    inverse.applyMany(MX, Xb, qa);
    deflate(Xb, 0, qa);
    // Residual of the last Ritz pairs in the shift-inverted space, ‖OP x − θx‖ ≤ tol·|θ|‖x‖
    // with θ = 1/(λ − σ), from X̄ at no extra solve. The K-relative residual alone is too loose
    // when stiffnesses differ by orders of magnitude: the soft members' modes can meet it while
    // their eigenvalues are still off by percents; this test is relative to each mode's own θ.
    if (iterations > 1) {
      opConverged = true;
      // Round-off floor: X̄ carries an error of about ε·|θ_max|·‖x‖ (θ_max the largest wanted
      // |θ|), which no iteration removes; below 1000 times that a pair counts as converged.
      let thetaMax = 0;
      for (let r = 0; r < want; r++) thetaMax = Math.max(thetaMax, Math.abs(1 / omega[order[r]]));
      for (let r = 0; r < want; r++) {
        const c = order[r];
        const theta = 1 / omega[c];
        const x = X.subarray(c * n, (c + 1) * n);
        residualSquares(Xb.subarray(c * n, (c + 1) * n), x, x, theta, n, sums);
        const d2 = sums[0];
        const x2 = sums[1];
        const floor = (1e3 * Number.EPSILON * thetaMax) / Math.abs(theta);
        opFloor[c] = floor > o.tolerance ? o.tolerance : Infinity; // above its floor, a pair's op residual is no longer information
        opRes[c] = Math.sqrt(d2) / (Math.abs(theta) * Math.sqrt(x2) || 1);
        if (!(opRes[c] <= Math.max(o.tolerance, floor))) opConverged = false;
      }
      // The pairs of the last iteration met both tests: return them (X, ω and the order are theirs).
      if (opConverged && residualsConverged) break;
    }
    // Projection of K − σM onto X̄ is X̄ᵀ M X, since (K − σM) X̄ = M X (Bathe eq. 11.108).
    gram(Xb, MX, n, qa, qa, A);
    // M-orthonormalise X̄ before projecting M (rank-revealing Gram–Schmidt, ritz.ts): with a
    // wide spectrum the columns of X̄ differ in M-norm by |λ_q − σ| / |λ_1 − σ| and the solve's
    // round-off leaves them nearly dependent, so the Cholesky of X̄ᵀ M X̄ (eq. 11.109) fails.
    // M-dependent directions are dropped. When a column lost most of its norm, M X̄ is
    // recomputed and the process repeated, so the basis Z = X̄ T is M-orthonormal to
    // round-off; the projected problem becomes (Tᵀ A T) Q = (Zᵀ M Z) Q Ω with Zᵀ M Z ≈ I.
    mass.applyMany(Xb, MX, qa);
    const gs = mGramSchmidt(Xb, MX, n, qa, DROP_TOLERANCE, T1, h2);
    const k1 = gs.kept;
    let T: Float64Array = T1;
    k = k1;
    if (gs.minRatio < RECOMPUTE_RATIO && k1 > 0) {
      mass.applyMany(Xb, MX, k1);
      k = mGramSchmidt(Xb, MX, n, k1, DROP_TOLERANCE, T2, h2).kept;
      T = multiplySmall(T1, qa, k1, T2, k);
    } else if (qa !== k1) {
      T = T1.subarray(0, qa * k1);
    }
    if (k === 0) {
      throw new VerificationError(
        'every iteration vector has zero M-norm after (K − σM)⁻¹ M; M is zero on the free DOFs or every mode is locked — check the mass matrix',
        'projection',
      );
    }
    gram(Xb, MX, n, k, k, B);
    const { values, vectors } = projectedEigen(congruence(A, qa, T, k), B, k);
    // Rotate: X = Z Q, M X = (M Z) Q (eq. 11.111).
    combineColumnsInPlace(Xb, n, 0, k, vectors, k, k, tmp);
    combineColumnsInPlace(MX, n, 0, k, vectors, k, k, tmp);
    const swap = X;
    X = Xb;
    Xb = swap;
    for (let c = 0; c < k; c++) omega[c] = values[c];
    // Lost columns: re-seed them with random vectors; if the block lost columns on two
    // iterations running without gaining any, its span is exhausted: shrink it.
    if (k < qa) {
      if (droppedLast >= 0 && k <= droppedLast) {
        qa = k;
      } else {
        const fresh = X.subarray(k * n, qa * n);
        rng.fill(fresh);
        deflate(X, k, qa);
        mass.applyMany(fresh, MX.subarray(k * n, qa * n), qa - k);
      }
      droppedLast = k;
    } else {
      droppedLast = -1;
    }
    want = Math.min(p, k);
    // Wanted first: |λ − σ| smallest.
    order = Array.from({ length: k }, (_, i) => i).sort((a, b) => Math.abs(omega[a]) - Math.abs(omega[b]) || a - b);
    // Residuals of the wanted pairs: ‖K x − λ M x‖ / (‖K‖ ‖x‖).
    nconv = 0;
    for (let r = 0; r < want; r++) {
      const c = order[r];
      const x = X.subarray(c * n, (c + 1) * n);
      const mx = MX.subarray(c * n, (c + 1) * n);
      stiffness.apply(x, kx);
      residualSquares(kx, mx, x, sigma + omega[c], n, sums);
      res[c] = Math.sqrt(sums[0]) / (normK * Math.sqrt(sums[1]) || 1);
      if (res[c] <= o.tolerance) nconv++;
    }
    o.onProgress?.('subspace', nconv / p);
    // All wanted pairs met the K-relative test (or the span holds fewer than p pairs and every
    // one did): the next iteration's X̄ confirms them in the shift-inverted space, or goes on.
    residualsConverged = nconv === p || (qa < p && nconv === want);
    // Stagnation at round-off: no wanted residual (either test; the shift-inverted one of the
    // previous pairs) improved by 10 % for 10 iterations while all are within 100× the
    // tolerance; further iterations cannot improve them.
    let improved = false;
    let within = true;
    for (let r = 0; r < want; r++) {
      const c = order[r];
      const worst = Math.max(res[c], Math.min(opRes[c], opFloor[c]));
      if (!(worst >= 0.9 * best[r])) improved = true;
      if (worst < best[r]) best[r] = worst;
      if (worst > 100 * o.tolerance) within = false;
    }
    stale = improved ? 0 : stale + 1;
    if (within && stale >= 10 && want === p) {
      stagnated = true;
      break;
    }
  }

  const sel = order.slice(0, want).sort((a, b) => omega[a] - omega[b] || a - b);
  const eigenvalues = new Float64Array(want);
  const residuals = new Float64Array(want);
  const vectors = new Float64Array(n * want);
  const massVectors = new Float64Array(n * want);
  for (let c = 0; c < want; c++) {
    const s = sel[c];
    eigenvalues[c] = sigma + omega[s];
    residuals[c] = res[s];
    vectors.set(X.subarray(s * n, (s + 1) * n), c * n);
    massVectors.set(MX.subarray(s * n, (s + 1) * n), c * n);
  }
  return { eigenvalues, vectors, massVectors, residuals, converged: (nconv === p && opConverged) || stagnated, convergedCount: nconv, iterations };
}
