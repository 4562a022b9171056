/**
 * The dense route a JavaScript developer has today with ml-matrix alone (src/eigen/baseline.ts:
 * Cholesky M = L Lᵀ, A = L⁻¹ K L⁻ᵀ, ml-matrix's symmetric EigenvalueDecomposition, x = L⁻ᵀ y),
 * timed from our sparse K and M.
 */
import { Matrix } from 'ml-matrix';
import { mlMatrixGeneralized } from '../src/eigen/baseline';
import type { SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { toDenseArray } from '../src/linalg/sparse/symmetric';

export interface MlMatrixDenseResult {
  /** Lowest `count` eigenvalues, rad²/s², ascending. */
  eigenvalues: number[];
  /** Wall time, s: copy to dense ml-matrix matrices, then the decomposition route. */
  seconds: { dense: number; decomposition: number; total: number };
}

function toMatrix(a: SymmetricCsc): Matrix {
  const n = a.n;
  const d = toDenseArray(a);
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, d[i * n + j]);
  return m;
}

/** Lowest `count` eigenvalues of K x = λ M x by the ml-matrix dense route (M must be SPD). */
export function mlMatrixDense(K: SymmetricCsc, M: SymmetricCsc, count: number): MlMatrixDenseResult {
  const t0 = performance.now();
  const k = toMatrix(K);
  const m = toMatrix(M);
  const t1 = performance.now();
  const r = mlMatrixGeneralized(k, m);
  const t2 = performance.now();
  return {
    eigenvalues: Array.from(r.eigenvalues.subarray(0, count)),
    seconds: { dense: (t1 - t0) / 1000, decomposition: (t2 - t1) / 1000, total: (t2 - t0) / 1000 },
  };
}
