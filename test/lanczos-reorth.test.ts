/**
 * Lanczos reorthogonalization and restart bookkeeping (src/eigen/lanczos.ts): the three-term
 * step, then either nothing (the new vector measured M-orthogonal to the basis within
 * ORTHOGONALITY_BUDGET / basis size) or one Gram–Schmidt pass with the DGKS test for a second
 * one, M·V not stored.
 * Reference values: ml-matrix's dense generalized eigensolver (mlMatrixGeneralized, a
 * general-purpose reference library) on the same matrices.
 */
import { describe, expect, it } from 'vitest';
import { lanczos, ORTHOGONALITY_BUDGET } from '../src/eigen/lanczos';
import { inverseOperator, matrixOperator } from '../src/eigen/operators';
import { ShiftedPencil } from '../src/eigen/pencil';
import { mlMatrixGeneralized } from '../src/eigen/baseline';
import { symmetricMultiply } from '../src/linalg/sparse/symmetric';
import { randomSparsePair, springChain, toMatrix } from './eigen-sparse-helpers';

/** max |XᵀY − I| over p columns of length n. */
function orthError(x: Float64Array, y: Float64Array, n: number, p: number): number {
  let e = 0;
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let q = 0; q < n; q++) s += x[i * n + q] * y[j * n + q];
      e = Math.max(e, Math.abs(s - (i === j ? 1 : 0)));
    }
  }
  return e;
}

describe('lanczos reorthogonalization (conditional second pass)', () => {
  it('clustered chain modes, many thick restarts: eigenvalues match ml-matrix, M-orthogonal to 1e-10', () => {
    const n = 200;
    const { K, M } = springChain(n, 1, 1, 'fixed-free');
    const ref = mlMatrixGeneralized(toMatrix(K), toMatrix(M)).eigenvalues;
    const { factor, shift } = new ShiftedPencil(K, M).factorAt(0);
    // A small basis forces several restarts, so restart bookkeeping (residual vector and its
    // M-image carried over, kept Ritz vectors without an M-image) is exercised.
    const r = lanczos(inverseOperator(factor), matrixOperator(M), { count: 8, shift, basisSize: 12 });
    expect(r.converged).toBe(true);
    expect(r.restarts).toBeGreaterThan(2);
    for (let i = 0; i < 8; i++) expect(Math.abs(r.eigenvalues[i] - ref[i])).toBeLessThan(1e-9 * ref[i]);
    expect(orthError(r.vectors, r.massVectors, n, 8)).toBeLessThan(1e-10);
    // massVectors really is M times vectors.
    const mx = new Float64Array(n);
    for (let c = 0; c < 8; c++) {
      symmetricMultiply(M, r.vectors.subarray(c * n, (c + 1) * n), mx);
      for (let q = 0; q < n; q++) expect(Math.abs(mx[q] - r.massVectors[c * n + q])).toBeLessThan(1e-12);
    }
    // After the three-term step one pass nearly always suffices (Parlett, The Symmetric
    // Eigenvalue Problem, §13.1): the second pass is the exception, not the rule.
    expect(r.secondPasses).toBeLessThan(r.steps / 2);
  });

  it('random sparse pair with locked vectors: new vectors M-orthogonal to the locked ones', () => {
    const n = 150;
    const { K, M } = randomSparsePair(n, 5, 29);
    const ref = mlMatrixGeneralized(toMatrix(K), toMatrix(M)).eigenvalues;
    const { factor, shift } = new ShiftedPencil(K, M).factorAt(0);
    const inv = inverseOperator(factor);
    const mop = matrixOperator(M);
    const first = lanczos(inv, mop, { count: 4, shift });
    const locked = first.vectors.slice(0, 4 * n);
    const lockedM = first.massVectors.slice(0, 4 * n);
    const second = lanczos(inv, mop, { count: 4, shift, locked, lockedCount: 4, seed: 5 });
    expect(second.converged).toBe(true);
    for (let i = 0; i < 4; i++) expect(Math.abs(second.eigenvalues[i] - ref[4 + i])).toBeLessThan(1e-9 * ref[4 + i]);
    let cross = 0;
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        let s = 0;
        for (let q = 0; q < n; q++) s += second.vectors[i * n + q] * lockedM[j * n + q];
        cross = Math.max(cross, Math.abs(s));
      }
    }
    expect(cross).toBeLessThan(1e-10);
  });

  it('steps kept without the subtraction: the basis stays M-orthogonal within the budget, results unchanged to 1e-10', () => {
    const n = 400;
    const { K, M } = randomSparsePair(n, 6, 41);
    const ref = mlMatrixGeneralized(toMatrix(K), toMatrix(M)).eigenvalues;
    const { factor, shift } = new ShiftedPencil(K, M).factorAt(0);
    const r = lanczos(inverseOperator(factor), matrixOperator(M), { count: 12, shift });
    expect(r.converged).toBe(true);
    // Some steps did skip (otherwise this test would not exercise the skip), not all of them.
    expect(r.orthogonalSteps).toBeGreaterThan(0);
    expect(r.orthogonalSteps).toBeLessThan(r.steps);
    for (let i = 0; i < 12; i++) expect(Math.abs(r.eigenvalues[i] - ref[i])).toBeLessThan(1e-10 * ref[i]);
    // Pairwise basis products ≤ budget / basis size bound the Ritz vectors' error by the budget.
    expect(orthError(r.vectors, r.massVectors, n, 12)).toBeLessThan(ORTHOGONALITY_BUDGET);
  });

  it('massVectors: false normalizes from the basis (1 + g²) and returns the same vectors as the products do', () => {
    const n = 200;
    const { K, M } = springChain(n, 1, 1, 'fixed-free');
    const { factor, shift } = new ShiftedPencil(K, M).factorAt(0);
    const opts = { count: 8, shift, basisSize: 12 };
    const withMass = lanczos(inverseOperator(factor), matrixOperator(M), opts);
    const without = lanczos(inverseOperator(factor), matrixOperator(M), { ...opts, massVectors: false });
    expect(without.massVectors.length).toBe(0);
    expect(Array.from(without.eigenvalues)).toEqual(Array.from(withMass.eigenvalues));
    let diff = 0;
    for (let q = 0; q < 8 * n; q++) diff = Math.max(diff, Math.abs(without.vectors[q] - withMass.vectors[q]));
    expect(diff).toBeLessThan(1e-12);
    const mx = new Float64Array(8 * n);
    for (let c = 0; c < 8; c++) symmetricMultiply(M, without.vectors.subarray(c * n, (c + 1) * n), mx.subarray(c * n, (c + 1) * n));
    expect(orthError(without.vectors, mx, n, 8)).toBeLessThan(1e-12);
  });
});
