/**
 * Dense generalized symmetric eigensolvers for K x = λ M x (small problems, references, and the
 * projected problems of the iterative solvers).
 */
import { ArgumentError, FactorizationError, VerificationError } from '../../errors';
import type { EigenResult } from '../types';
import { fromDenseArray, symmetricMultiply, type SymmetricCsc } from '../../linalg/sparse/symmetric';
import { orthogonalityError, residuals, matrixNorm1 } from '../verify';
import { choleskyInPlace, choleskyRoute, type DensePairs } from './cholesky';
import { condenseMassless, expandModes } from './condense';
import { toDenseSymmetric, type DenseEigenInput } from './input';
import { generalizedJacobi, JACOBI_DEFAULTS } from './jacobi';
import { reduceNullMass, type NullMassReduction } from './nullmass';

export type { DenseEigenInput, DenseSymmetric } from './input';
export { generalizedJacobi, JACOBI_DEFAULTS, type JacobiOptions } from './jacobi';
export { choleskyRoute, type DensePairs } from './cholesky';
export { condenseMassless, expandModes, type Condensed } from './condense';
export { reduceNullMass, NULL_MASS_TOLERANCE, type NullMassReduction } from './nullmass';
export { symmetricEigen, type SymmetricEigenResult } from './symmetric';
export { toDenseSymmetric } from './input';

function isCsc(a: DenseEigenInput): a is SymmetricCsc {
  return (a as SymmetricCsc).colPtr instanceof Int32Array;
}

/** Options of {@link denseEigen}. */
export interface DenseEigenOptions {
  /**
   * `'cholesky'`: M = LLᵀ reduction + Householder/QL (fast, the default). `'jacobi'`:
   * generalized Jacobi on K and M together (Bathe §11.3.3). @defaultValue 'cholesky'
   */
  method?: 'jacobi' | 'cholesky';
  /** Lowest modes wanted, ≥ 1. @defaultValue all finite modes (one per massive DOF) */
  count?: number;
  /** Jacobi convergence tolerance (see JacobiOptions). @defaultValue 1e-12 */
  tolerance?: number;
  /** Jacobi sweep limit. @defaultValue 50 */
  maxSweeps?: number;
  /**
   * Largest accepted relative residual ‖Kx − λMx‖ / (‖K‖₁‖x‖); above it the result fails its
   * own check and VerificationError is thrown; `Infinity` turns the check off.
   * @defaultValue 1e-8 (DESIGN.md accuracy target)
   */
  residualTolerance?: number;
  /**
   * Largest dimension accepted. Dense storage needs 8n² bytes per copy (several copies are
   * made) and the time grows as n³: at 8,000 DOFs that is 0.5 GB per copy and tens of minutes;
   * larger problems belong to the sparse solvers. @defaultValue 8000
   */
  maxDofs?: number;
  /** Largest accepted max |ΦᵀMΦ − I|; `Infinity` turns the check off. @defaultValue 1e-10 (DESIGN.md accuracy target) */
  orthogonalityTolerance?: number;
}

/** Defaults of {@link DenseEigenOptions} (count has none: all finite modes). */
export const DENSE_EIGEN_DEFAULTS = {
  method: 'cholesky',
  tolerance: JACOBI_DEFAULTS.tolerance,
  maxSweeps: JACOBI_DEFAULTS.maxSweeps,
  residualTolerance: 1e-8,
  orthogonalityTolerance: 1e-10,
  maxDofs: 8000,
} as const;

/**
 * Lowest eigenpairs of K x = λ M x with dense methods.
 *
 * Massless DOFs (zero rows of M) are condensed out statically first, so their infinite
 * eigenvalues never appear; the modes are expanded back to all n DOFs. When M is still
 * singular (null directions that are not DOFs, e.g. lumped torsional inertia of skew members)
 * those directions are condensed too (nullmass.ts): count ≤ rank M. Eigenvalues are returned
 * as the Rayleigh quotients of their vectors on the full K and M. A singular K (free-free
 * structure) gives rigid-body eigenvalues ≈ 0 (possibly a tiny negative number).
 *
 * @param K - stiffness, n × n symmetric (N/m, N·m/rad): SymmetricCsc, ml-matrix Matrix or
 *   `{ n, data }` row-major; not modified
 * @param M - mass, n × n symmetric positive semidefinite (kg, kg·m²), same forms; not modified
 * @param options - see {@link DenseEigenOptions}
 * @returns eigenvalues ascending (rad²/s²), M-orthonormal mode shapes column-major n × count,
 *   residuals, orthogonality error, stats (ms per phase, massless DOFs, massless directions
 *   that are not DOFs, Jacobi sweeps/rotations)
 * @throws ArgumentError for malformed input or options (path `K`, `M(i, j)`, `count`, …);
 *   FactorizationError (path `row i`) when M is indefinite or the massless block of K is
 *   singular; VerificationError (path `modes[j]` or `maxSweeps`) when the result fails its checks
 */
export function denseEigen(K: DenseEigenInput, M: DenseEigenInput, options: DenseEigenOptions = {}): EigenResult {
  const tStart = performance.now();
  const opts = { ...DENSE_EIGEN_DEFAULTS, ...options };
  if (opts.method !== 'cholesky' && opts.method !== 'jacobi') {
    throw new ArgumentError(`unknown method ${JSON.stringify(opts.method)}; use 'cholesky' or 'jacobi'`, 'method');
  }
  for (const key of ['tolerance', 'residualTolerance', 'orthogonalityTolerance'] as const) {
    if (!(opts[key] > 0) || (key === 'tolerance' && !Number.isFinite(opts[key]))) throw new ArgumentError(`${key} is ${opts[key]}; pass a positive number`, key);
  }
  if (!Number.isInteger(opts.maxSweeps) || opts.maxSweeps < 1) {
    throw new ArgumentError(`maxSweeps is ${opts.maxSweeps}; pass a positive integer`, 'maxSweeps');
  }
  if (!(opts.maxDofs >= 1)) throw new ArgumentError(`maxDofs is ${opts.maxDofs}; pass a positive number`, 'maxDofs');
  const nIn = (K as { n?: number }).n ?? (K as { rows?: number }).rows;
  if (typeof nIn === 'number' && nIn > opts.maxDofs) {
    throw new ArgumentError(`K has ${nIn} DOFs, more than maxDofs = ${opts.maxDofs} for a dense solve (${((8 * nIn * nIn) / 1e9).toFixed(1)} GB per copy); use a sparse method or raise maxDofs`, 'K');
  }
  const k = toDenseSymmetric(K, 'K');
  const m = toDenseSymmetric(M, 'M');
  if (m.n !== k.n) throw new ArgumentError(`M is ${m.n} × ${m.n} but K is ${k.n} × ${k.n}; pass matrices of one size`, 'M');
  const n = k.n;

  // ---- condense massless DOFs ----
  let t0 = performance.now();
  const c = condenseMassless(k, m);
  const nm = c.massive.length;
  // A singular M without zero rows (e.g. the lumped torsional inertia of skew space members):
  // condense its null space too (nullmass.ts). Tried only when M_mm is not positive definite.
  let reduction: NullMassReduction | null = null;
  if (nm > 0 && !positiveDefinite(nm, c.m, c.massive)) reduction = reduceNullMass(nm, c.k, c.m, c.massive);
  const msCondense = performance.now() - t0;
  const finite = reduction ? reduction.r : nm;
  const count = options.count ?? finite;
  if (!Number.isInteger(count) || count < (options.count === undefined ? 0 : 1) || count > finite) {
    throw new ArgumentError(
      `count is ${count} but the problem has ${finite} finite modes (${n} DOFs, ${n - finite} massless DOFs or directions); pass an integer from 1 to ${finite}`,
      'count',
    );
  }

  // ---- solve the reduced problem ----
  const [kr, mr, dofOf] = reduction ? [reduction.k, reduction.m, reduction.dofOf] : [c.k, c.m, c.massive];
  const pairs: DensePairs =
    opts.method === 'jacobi'
      ? generalizedJacobi(finite, kr, mr, count, dofOf, { tolerance: opts.tolerance, maxSweeps: opts.maxSweeps })
      : choleskyRoute(finite, kr, mr, count, dofOf);
  const vectors = expandModes(c, reduction ? reduction.expand(pairs.vectors, count) : pairs.vectors, count);

  // ---- verify on the full K and M ----
  // Checks run on sparse copies (exact zeros dropped): O(count · nnz) instead of O(count · n²)
  // for the banded matrices of structures; a full matrix costs what it costs.
  t0 = performance.now();
  const kCheck: SymmetricCsc = isCsc(K) ? K : fromDenseArray(n, k.data);
  const mCheck: SymmetricCsc = isCsc(M) ? M : fromDenseArray(n, m.data);
  const normK = matrixNorm1(kCheck);
  rayleighQuotients(kCheck, mCheck, pairs.values, vectors, count);
  const res = residuals(kCheck, mCheck, pairs.values, vectors, normK);
  const orth = orthogonalityError(mCheck, vectors, count);
  const msVerify = performance.now() - t0;
  for (let j = 0; j < count; j++) {
    if (!(res[j] <= opts.residualTolerance)) {
      throw new VerificationError(
        `relative residual ${res[j].toExponential(3)} of eigenvalue ${pairs.values[j]} exceeds ${opts.residualTolerance}; the problem may be too ill-conditioned for ${opts.method} (try the other method or check M's conditioning)`,
        `modes[${j}]`,
      );
    }
  }
  if (!(orth <= opts.orthogonalityTolerance)) {
    throw new VerificationError(
      `M-orthonormality error ${orth.toExponential(3)} exceeds ${opts.orthogonalityTolerance}; M may be nearly singular (check its conditioning) or try the other method`,
      'modes',
    );
  }
  return {
    n,
    eigenvalues: pairs.values,
    vectors,
    residuals: res,
    orthogonalityError: orth,
    method: opts.method,
    stats: { ...pairs.stats, masslessDofs: n - nm, masslessDirections: nm - finite, normK, msCondense, msVerify, msTotal: performance.now() - tStart },
  };
}

/** Whether the row-major n × n symmetric m passes the Cholesky pivot test (cholesky.ts). */
function positiveDefinite(n: number, m: Float64Array, dofOf: Int32Array): boolean {
  try {
    choleskyInPlace(n, new Float64Array(m), dofOf);
    return true;
  } catch (e) {
    if (e instanceof FactorizationError) return false;
    throw e;
  }
}

/**
 * Replaces each eigenvalue by the Rayleigh quotient xᵀKx / xᵀMx of its computed vector, on the
 * full K and M, then restores ascending order (vectors moved along).
 *
 * Why: the Cholesky reduction computes λ with an absolute error of order ε·λ_max (Golub & Van
 * Loan, 4th ed., §8.7.2: the error grows with ‖L⁻¹‖², i.e. with the spread of M), which for a
 * lumped mass with small rotary inertias is a relative error of ~1e-8 on the lowest modes even
 * though the residual passes. The Rayleigh quotient's error is quadratic in the vector's error
 * (Parlett, The Symmetric Eigenvalue Problem, §4.6; from memory), so it brings the low
 * eigenvalues back to round-off of ‖K‖‖x‖² — where the Jacobi route and the sparse solvers
 * already are.
 * @param values - eigenvalues, length count, rad²/s² (overwritten)
 * @param vectors - M-orthonormal modes, column-major n × count (reordered when values swap)
 */
function rayleighQuotients(K: SymmetricCsc, M: SymmetricCsc, values: Float64Array, vectors: Float64Array, count: number): void {
  const n = K.n;
  const kx = new Float64Array(n);
  const mx = new Float64Array(n);
  let sorted = true;
  for (let j = 0; j < count; j++) {
    const x = vectors.subarray(j * n, (j + 1) * n);
    symmetricMultiply(K, x, kx);
    symmetricMultiply(M, x, mx);
    let xkx = 0;
    let xmx = 0;
    for (let i = 0; i < n; i++) {
      xkx += x[i] * kx[i];
      xmx += x[i] * mx[i];
    }
    if (xmx > 0 && Number.isFinite(xkx)) values[j] = xkx / xmx;
    if (j > 0 && values[j] < values[j - 1]) sorted = false;
  }
  if (sorted) return;
  const order = Array.from({ length: count }, (_, j) => j).sort((a, b) => values[a] - values[b] || a - b);
  const v = values.slice(0, count);
  const x = vectors.slice(0, count * n);
  for (let j = 0; j < count; j++) {
    values[j] = v[order[j]];
    vectors.set(x.subarray(order[j] * n, (order[j] + 1) * n), j * n);
  }
}
