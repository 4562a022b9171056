/**
 * Shift-invert Lanczos in the M-inner product with thick restart.
 *
 * Methods followed:
 * - Spectral transformation: the operator OP = (K − σM)⁻¹ M has eigenvalues θ = 1/(λ − σ) and
 *   is self-adjoint in the M-inner product, so a symmetric Lanczos run on it in that inner
 *   product finds the λ nearest σ first (Ericsson & Ruhe 1980, Math. Comp. 35, §2–3; Grimes,
 *   Lewis & Simon 1994, SIAM J. Matrix Anal. Appl. 15(1), §2).
 * - Start vector and Ritz vectors are kept in the range of OP (start = OP·random; each Ritz
 *   vector is purified with one implicit OP step, x = y + (β sₘ/θ) vₘ₊₁), so that singular M
 *   (massless DOFs, infinite λ) does not pollute the vectors (Nour-Omid, Parlett, Ericsson &
 *   Jensen 1987, "How to implement the spectral transformation", Math. Comp. 48, §4–5).
 * - Full reorthogonalization by classical Gram–Schmidt done twice ("twice is enough",
 *   Parlett, The Symmetric Eigenvalue Problem, §6.9; Giraud et al. 2005), in blocked dense
 *   kernels over the column-major basis, with M·V kept beside V so no extra M product is needed.
 * - Thick restart: keep the k best Ritz vectors and continue from the residual vector; the
 *   projected matrix becomes an arrowhead plus a tridiagonal (Wu & Simon 2000, "Thick-restart
 *   Lanczos method for large symmetric eigenvalue problems", SIAM J. Matrix Anal. Appl. 22(2),
 *   §2–3).
 * - Locked vectors (already known eigenvectors) are kept in front of the basis and every new
 *   Lanczos vector is M-orthogonalized against them, which is how a missed copy of a repeated
 *   eigenvalue is found by a second run (Grimes, Lewis & Simon 1994, §3.3).
 *
 * Storage: the basis is one column-major Float64Array n × (L + ncv + 1) (L locked columns,
 * ncv Lanczos columns and the next residual vector), its M-image another; every work buffer is
 * allocated before the iteration.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { Operator } from '../linalg/operator';
import { AbortedError, ArgumentError } from '../errors';
import { combineColumnsInPlace, dotColumns, SeededRandom, subtractColumns } from './kernels';

/** Progress report: phase name and fraction done in [0, 1]. */
export type ProgressCallback = (phase: string, fraction: number) => void;

export interface LanczosOptions {
  /** Number of eigenvalues wanted: those nearest the shift σ. @defaultValue 20 */
  count?: number;
  /** Shift σ (rad²/s²) of the factor behind `inverse`; used to map θ back to λ = σ + 1/θ. @defaultValue 0 */
  shift?: number;
  /**
   * A Ritz pair (θ, y) is accepted when ‖OP y − θ y‖_M ≤ tolerance · |θ|, which bounds the
   * relative residual of the original problem by about the same amount (Ericsson & Ruhe 1980,
   * §3). @defaultValue 1e-12
   */
  tolerance?: number;
  /**
   * Lanczos vectors kept between restarts (ncv). `0` picks max(2·count + 1, 20), capped by the
   * dimension. @defaultValue 0
   */
  basisSize?: number;
  /** Thick restarts allowed before giving up. @defaultValue 500 */
  maxRestarts?: number;
  /** Seed of the start vector. @defaultValue 1 */
  seed?: number;
  /**
   * Known eigenvectors (column-major n × lockedCount, M-orthonormal) the new vectors are kept
   * M-orthogonal to. @defaultValue none
   */
  locked?: Float64Array;
  /** Number of columns in `locked`. @defaultValue 0 */
  lockedCount?: number;
  /** Called after each restart with ('lanczos', converged / count). */
  onProgress?: ProgressCallback;
  /** Checked at every Lanczos step; when aborted, AbortedError is thrown. */
  signal?: AbortSignal;
}

/** Defaults of {@link LanczosOptions}. */
export const LANCZOS_DEFAULTS = {
  count: 20,
  shift: 0,
  tolerance: 1e-12,
  basisSize: 0,
  maxRestarts: 500,
  seed: 1,
  lockedCount: 0,
} as const;

export interface LanczosResult {
  /** Converged eigenvalues λ = σ + 1/θ in rad²/s², ascending, length m (≥ count unless `exhausted` or not converged). */
  readonly eigenvalues: Float64Array;
  /** Ritz vectors, column-major n × m, M-normalized and purified. */
  readonly vectors: Float64Array;
  /** M times the vectors, column-major n × m. */
  readonly massVectors: Float64Array;
  /** Estimated ‖OP x − θ x‖_M / |θ| per returned pair. */
  readonly errorEstimates: Float64Array;
  /** True when the wanted `count` pairs all converged. */
  readonly converged: boolean;
  /**
   * True when the Krylov space closed: every eigenvector of OP with θ ≠ 0 outside the locked
   * span is in the basis, so no further finite eigenvalue exists there.
   */
  readonly exhausted: boolean;
  /** Lanczos steps (one OP application each, plus start and restart vectors). */
  readonly steps: number;
  /** Thick restarts performed. */
  readonly restarts: number;
}

/**
 * Shift-invert Lanczos: the `count` eigenpairs of K x = λ M x nearest σ.
 * @param inverse - y ← (K − σM)⁻¹ x, n × n (e.g. `inverseOperator` of an LDLᵀ factor)
 * @param mass - y ← M x, n × n symmetric positive semidefinite
 * @param options - see {@link LanczosOptions}; defaults in {@link LANCZOS_DEFAULTS}
 * @throws ArgumentError on invalid options (path names the option), AbortedError when aborted
 */
export function lanczos(inverse: Operator, mass: Operator, options: LanczosOptions = {}): LanczosResult {
  const o = { ...LANCZOS_DEFAULTS, ...options };
  const n = inverse.n;
  if (mass.n !== n) throw new ArgumentError(`mass operator has size ${mass.n}, the inverse ${n}; pass operators of one size`, 'mass');
  if (!Number.isInteger(o.count) || o.count < 1) throw new ArgumentError(`count ${o.count} is not a positive integer; ask for at least one mode`, 'count');
  if (!(o.tolerance > 0 && o.tolerance < 1)) throw new ArgumentError(`tolerance ${o.tolerance} is outside (0, 1); use e.g. 1e-12`, 'tolerance');
  if (!Number.isFinite(o.shift)) throw new ArgumentError(`shift ${o.shift} is not a finite number; pass a shift in rad²/s²`, 'shift');
  const lockedCount = o.lockedCount;
  if (!Number.isInteger(lockedCount) || lockedCount < 0 || lockedCount >= n) {
    throw new ArgumentError(`lockedCount ${lockedCount} must be an integer in [0, ${n - 1}]`, 'lockedCount');
  }
  if (lockedCount > 0 && (!o.locked || o.locked.length < lockedCount * n)) {
    throw new ArgumentError(`locked holds ${o.locked ? o.locked.length : 0} values, fewer than n · lockedCount = ${n * lockedCount}; pass the locked vectors`, 'locked');
  }
  const L = lockedCount;
  const avail = n - L;
  const nev = Math.min(o.count, avail);
  let ncv = o.basisSize > 0 ? o.basisSize : Math.max(2 * nev + 1, 20);
  ncv = Math.min(Math.max(ncv, nev + 1), avail);
  const sigma = o.shift;
  const tol = o.tolerance;

  // ---- workspace, sized once ----
  const cols = L + ncv + 1;
  const V = new Float64Array(n * cols);
  const MV = new Float64Array(n * cols);
  const w = new Float64Array(n);
  const h = new Float64Array(cols);
  const T = new Float64Array(ncv * ncv); // column-major, symmetric
  const tmp = new Float64Array(Math.max(ncv, 256 * ncv));
  const rng = new SeededRandom(o.seed);
  let steps = 0;
  let restarts = 0;

  if (L > 0) {
    V.set(o.locked!.subarray(0, n * L));
    for (let c = 0; c < L; c++) mass.apply(V.subarray(c * n, (c + 1) * n), MV.subarray(c * n, (c + 1) * n));
  }

  // Column views, made once so that the Lanczos steps allocate nothing.
  const vCol = Array.from({ length: cols }, (_, c) => V.subarray(c * n, (c + 1) * n));
  const mvCol = Array.from({ length: cols }, (_, c) => MV.subarray(c * n, (c + 1) * n));
  const checkAbort = (): void => {
    if (o.signal?.aborted) throw new AbortedError('the eigen solve was aborted through its AbortSignal; run it again without aborting to get the modes', 'signal');
  };

  /**
   * Orthogonalizes w (in place) twice against basis columns [0, upto) in the M-inner product.
   * Returns the summed coefficient of column `track` (or 0 when track < 0).
   */
  let projectedSquare = 0; // Σ h² of the first pass: the part of ‖w‖²_M inside the basis
  const reorthogonalize = (upto: number, track: number): number => {
    let tracked = 0;
    for (let pass = 0; pass < 2; pass++) {
      dotColumns(MV, n, 0, upto, w, h);
      if (track >= 0) tracked += h[track];
      if (pass === 0) {
        projectedSquare = 0;
        for (let c = 0; c < upto; c++) projectedSquare += h[c] * h[c];
      }
      subtractColumns(V, n, 0, upto, h, w);
    }
    return tracked;
  };

  /**
   * Puts a new start vector, M-orthogonal to columns [0, c), into column c: OP applied to a
   * seeded random vector (so it lies in the range of OP). Returns false when nothing is left
   * (its M-norm collapsed under orthogonalization three times in a row).
   */
  const newStartVector = (c: number): boolean => {
    const z = mvCol[c];
    const v = vCol[c];
    for (let attempt = 0; attempt < 3; attempt++) {
      // Orthogonalize the random vector before applying OP: its image then carries no large
      // component along basis eigenvectors with huge θ (shift next to an eigenvalue), so the
      // collapse test below measures only what is genuinely new.
      rng.fill(w);
      reorthogonalize(c, -1);
      mass.apply(w, v);
      inverse.apply(v, w);
      steps++;
      mass.apply(w, z);
      let before = 0;
      for (let i = 0; i < n; i++) before += w[i] * z[i];
      reorthogonalize(c, -1);
      mass.apply(w, z);
      let after = 0;
      for (let i = 0; i < n; i++) after += w[i] * z[i];
      if (before > 0 && after > 1e-20 * before) {
        const inv = 1 / Math.sqrt(after);
        for (let i = 0; i < n; i++) {
          v[i] = w[i] * inv;
          z[i] *= inv;
        }
        return true;
      }
    }
    return false;
  };

  let exhausted = !newStartVector(L);
  let m = exhausted ? 0 : ncv; // Lanczos columns in use at the last restart
  let k = 0; // kept Ritz vectors
  let betaLast = 0;
  let theta = new Float64Array(0);
  let S = new Float64Array(0); // Ritz vectors of T, column-major m × m
  let order: number[] = [];
  let nconv = 0;
  let done = exhausted;

  while (!done) {
    // ---- Lanczos steps from column k to ncv − 1 ----
    m = ncv;
    for (let j = k; j < ncv; j++) {
      checkAbort();
      inverse.apply(mvCol[L + j], w); // w = OP v_j = (K − σM)⁻¹ M v_j
      steps++;
      T[j * ncv + j] = reorthogonalize(L + j + 1, L + j);
      const z = mvCol[L + j + 1];
      mass.apply(w, z);
      let bb = 0;
      for (let i = 0; i < n; i++) bb += w[i] * z[i];
      let beta = Math.sqrt(Math.max(bb, 0));
      // ‖OP v_j‖_M ≈ √(Σh² + β²); an invariant subspace shows as β ≪ that norm. The new
      // vector is then drawn afresh (in the range of OP) and the coupling set to zero.
      if (beta <= 1e-12 * Math.sqrt(projectedSquare + bb)) beta = 0;
      const v = vCol[L + j + 1];
      if (beta === 0) {
        // Invariant subspace: continue with a fresh start vector, coupling zero.
        if (!newStartVector(L + j + 1)) {
          exhausted = true;
          m = j + 1;
          break;
        }
      } else {
        const inv = 1 / beta;
        for (let i = 0; i < n; i++) {
          v[i] = w[i] * inv;
          z[i] *= inv;
        }
      }
      if (j + 1 < ncv) {
        T[j * ncv + j + 1] = beta;
        T[(j + 1) * ncv + j] = beta;
      } else betaLast = beta;
    }
    if (exhausted) betaLast = 0;

    // ---- Ritz values of the projected matrix ----
    const rows: number[][] = [];
    for (let i = 0; i < m; i++) {
      const row = new Array<number>(m);
      for (let j = 0; j < m; j++) row[j] = T[j * ncv + i];
      rows.push(row);
    }
    const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
    theta = Float64Array.from(evd.realEigenvalues);
    const Z = evd.eigenvectorMatrix;
    S = new Float64Array(m * m);
    for (let c = 0; c < m; c++) for (let i = 0; i < m; i++) S[c * m + i] = Z.get(i, c);
    // Wanted first: largest |θ| (λ nearest σ); ties broken by index for determinism.
    order = Array.from({ length: m }, (_, i) => i).sort((a, b) => Math.abs(theta[b]) - Math.abs(theta[a]) || a - b);
    nconv = 0;
    for (let r = 0; r < Math.min(nev, m); r++) {
      const i = order[r];
      if (Math.abs(betaLast * S[i * m + m - 1]) <= tol * Math.abs(theta[i]) && theta[i] !== 0) nconv++;
      else break;
    }
    o.onProgress?.('lanczos', Math.min(1, nconv / nev));
    if (nconv >= nev || exhausted || restarts >= o.maxRestarts) break;

    // ---- thick restart (Wu & Simon 2000, §3): keep k Ritz vectors, then the residual vector ----
    k = Math.min(m - 1, nev + Math.max(1, Math.floor((m - nev) / 2)));
    const sel = new Float64Array(m * k);
    for (let c = 0; c < k; c++) sel.set(S.subarray(order[c] * m, order[c] * m + m), c * m);
    combineColumnsInPlace(V, n, L, m, sel, m, k, tmp);
    combineColumnsInPlace(MV, n, L, m, sel, m, k, tmp);
    V.copyWithin((L + k) * n, (L + m) * n, (L + m + 1) * n);
    MV.copyWithin((L + k) * n, (L + m) * n, (L + m + 1) * n);
    T.fill(0);
    for (let c = 0; c < k; c++) {
      const i = order[c];
      T[c * ncv + c] = theta[i];
      const coupling = betaLast * S[i * m + m - 1];
      T[k * ncv + c] = coupling;
      T[c * ncv + k] = coupling;
    }
    restarts++;
  }

  // ---- Ritz vectors of the converged pairs, purified, ascending in λ ----
  const accepted: number[] = [];
  for (let r = 0; r < m; r++) {
    const i = order[r];
    if (theta[i] === 0) continue;
    const est = Math.abs(betaLast * S[i * m + m - 1]) / Math.abs(theta[i]);
    if (est <= tol || exhausted) accepted.push(i);
    else if (r >= nev) break; // beyond the wanted ones, stop at the first unconverged
  }
  accepted.sort((a, b) => sigma + 1 / theta[a] - (sigma + 1 / theta[b]) || a - b);
  const p = accepted.length;
  const eigenvalues = new Float64Array(p);
  const errorEstimates = new Float64Array(p);
  const sel = new Float64Array(m * p);
  for (let c = 0; c < p; c++) {
    const i = accepted[c];
    sel.set(S.subarray(i * m, i * m + m), c * m);
    eigenvalues[c] = sigma + 1 / theta[i];
    errorEstimates[c] = Math.abs(betaLast * S[i * m + m - 1]) / Math.abs(theta[i]);
  }
  if (p > 0) {
    combineColumnsInPlace(V, n, L, m, sel, m, p, tmp);
    combineColumnsInPlace(MV, n, L, m, sel, m, p, tmp);
  }
  const vectors = V.slice(L * n, (L + p) * n);
  const massVectors = MV.slice(L * n, (L + p) * n);
  const vm = vCol[L + m];
  const mvm = mvCol[L + m];
  for (let c = 0; c < p; c++) {
    const i = accepted[c];
    const x = vectors.subarray(c * n, (c + 1) * n);
    const mx = massVectors.subarray(c * n, (c + 1) * n);
    const g = exhausted ? 0 : (betaLast * S[i * m + m - 1]) / theta[i];
    if (g !== 0) {
      for (let r = 0; r < n; r++) {
        x[r] += g * vm[r];
        mx[r] += g * mvm[r];
      }
    }
    let nn = 0;
    for (let r = 0; r < n; r++) nn += x[r] * mx[r];
    const inv = 1 / Math.sqrt(nn);
    for (let r = 0; r < n; r++) {
      x[r] *= inv;
      mx[r] *= inv;
    }
  }
  return {
    eigenvalues,
    vectors,
    massVectors,
    errorEstimates,
    converged: nconv >= nev || (exhausted && p >= nev),
    exhausted,
    steps,
    restarts,
  };
}
