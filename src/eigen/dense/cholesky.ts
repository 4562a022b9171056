/**
 * Generalized symmetric eigenproblem K x = λ M x, M symmetric positive definite, by reduction to
 * standard form: M = L Lᵀ, A = L⁻¹ K L⁻ᵀ (symmetric), A y = λ y, x = L⁻ᵀ y.
 * Golub & Van Loan, Matrix Computations (4th ed.), §8.7.2 (the Cholesky reduction of the
 * symmetric-definite problem); the symmetric solver is Householder tridiagonalization + implicit
 * QL (./symmetric.ts). Flat row-major Float64Array throughout.
 *
 * With y orthonormal, x = L⁻ᵀ y is M-orthonormal: xᵀ M x = yᵀ L⁻¹ L Lᵀ L⁻ᵀ y = yᵀ y.
 */
import { FactorizationError } from '../../errors';
import { symmetricEigen, transposeInPlace } from './symmetric';

/**
 * Pivot threshold of the Cholesky factorization of M: a pivot ≤ tol · max M_ii means M is not
 * positive definite. @defaultValue 1e-14
 */
export const MASS_PIVOT_TOLERANCE = 1e-14;

/** Eigenpairs of the dense generalized problem. */
export interface DensePairs {
  /** Lowest `count` eigenvalues, ascending, rad²/s². */
  readonly values: Float64Array;
  /** Matching M-orthonormal vectors, column-major n × count. */
  readonly vectors: Float64Array;
  /** Numerical facts (ms per phase, sweeps, rotations). */
  readonly stats: Record<string, number>;
}

/**
 * In-place Cholesky factorization M = L Lᵀ of a row-major n × n symmetric matrix; the lower
 * triangle of `a` is overwritten by L (the strict upper triangle is left as it was).
 * Row-oriented (dot products of contiguous row prefixes): Golub & Van Loan, Alg. 4.2.1 (gaxpy).
 * @param dofOf - original DOF index of each row, for error paths
 * @throws FactorizationError (path `row i`) when a pivot is not positive
 */
export function choleskyInPlace(n: number, a: Float64Array, dofOf: Int32Array): void {
  let dMax = 0;
  for (let i = 0; i < n; i++) dMax = Math.max(dMax, a[i * n + i]);
  const tol = MASS_PIVOT_TOLERANCE * dMax;
  for (let j = 0; j < n; j++) {
    const rj = j * n;
    let s = a[rj + j];
    for (let p = 0; p < j; p++) s -= a[rj + p] * a[rj + p];
    if (!(s > tol)) {
      throw new FactorizationError(
        `M is not positive definite at DOF ${dofOf[j]} (Cholesky pivot ${s.toExponential(3)}, largest diagonal mass ${dMax.toExponential(3)}); ` +
          'check this DOF for negative or linearly dependent mass, or make it massless (zero row) so that it is condensed out',
        `row ${dofOf[j]}`,
      );
    }
    const ljj = Math.sqrt(s);
    a[rj + j] = ljj;
    const inv = 1 / ljj;
    for (let i = j + 1; i < n; i++) {
      const ri = i * n;
      let t = a[ri + j];
      for (let p = 0; p < j; p++) t -= a[ri + p] * a[rj + p];
      a[ri + j] = t * inv;
    }
  }
}

/** X ← L⁻¹ X for row-major n × n X, L lower in `l` (row-major). Row axpys, no allocation. */
function forwardSolveRows(n: number, l: Float64Array, x: Float64Array): void {
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    for (let p = 0; p < i; p++) {
      const c = l[ri + p];
      if (c === 0) continue;
      const rp = p * n;
      for (let b = 0; b < n; b++) x[ri + b] -= c * x[rp + b];
    }
    const inv = 1 / l[ri + i];
    for (let b = 0; b < n; b++) x[ri + b] *= inv;
  }
}

/**
 * Lowest `count` eigenpairs of K x = λ M x by the Cholesky reduction.
 * @param n - dimension
 * @param k - stiffness, row-major n × n symmetric (not modified)
 * @param m - mass, row-major n × n symmetric positive definite (not modified)
 * @param count - number of modes wanted, 0 ≤ count ≤ n
 * @param dofOf - original DOF index of each row, for error paths
 * @throws FactorizationError (path `row i`) when M is not positive definite
 */
export function choleskyRoute(n: number, k: Float64Array, m: Float64Array, count: number, dofOf: Int32Array): DensePairs {
  let t0 = performance.now();
  // ---- M = L Lᵀ ----
  const l = new Float64Array(m);
  choleskyInPlace(n, l, dofOf);
  const tFactor = performance.now() - t0;

  // ---- A = L⁻¹ (L⁻¹ K)ᵀ = L⁻¹ K L⁻ᵀ ----
  t0 = performance.now();
  const a = new Float64Array(k);
  forwardSolveRows(n, l, a);
  transposeInPlace(n, a);
  forwardSolveRows(n, l, a);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const s = 0.5 * (a[i * n + j] + a[j * n + i]);
      a[i * n + j] = s;
      a[j * n + i] = s;
    }
  }
  const tReduce = performance.now() - t0;

  // ---- A y = λ y ----
  t0 = performance.now();
  const eig = symmetricEigen(n, a);
  const tEigen = performance.now() - t0;

  // ---- x = L⁻ᵀ y: column-oriented back substitution, four modes per pass so that each row
  // of L is read once per four modes (the solve is bound by reading L) ----
  t0 = performance.now();
  const values = eig.values.slice(0, count);
  const padded = Math.ceil(count / 4) * 4;
  const work = new Float64Array(padded * n); // rows ≥ count stay zero and solve to zero
  work.set(eig.vectors.subarray(0, count * n)); // row c of eig.vectors = mode c
  for (let c = 0; c < padded; c += 4) {
    const o0 = c * n;
    const o1 = o0 + n;
    const o2 = o1 + n;
    const o3 = o2 + n;
    for (let i = n - 1; i >= 0; i--) {
      const ri = i * n;
      const inv = 1 / l[ri + i];
      const x0 = (work[o0 + i] *= inv);
      const x1 = (work[o1 + i] *= inv);
      const x2 = (work[o2 + i] *= inv);
      const x3 = (work[o3 + i] *= inv);
      for (let p = 0; p < i; p++) {
        const lp = l[ri + p];
        work[o0 + p] -= lp * x0;
        work[o1 + p] -= lp * x1;
        work[o2 + p] -= lp * x2;
        work[o3 + p] -= lp * x3;
      }
    }
  }
  const vectors = padded === count ? work : work.slice(0, count * n);
  const tBack = performance.now() - t0;
  return { values, vectors, stats: { msFactor: tFactor, msReduce: tReduce, msEigen: tEigen, msBack: tBack } };
}
