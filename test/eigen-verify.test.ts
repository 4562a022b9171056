import { describe, expect, it } from 'vitest';
import { Matrix } from 'ml-matrix';
import { mlMatrixGeneralized } from '../src/eigen/baseline';
import { checkWorkLength, matrixNorm1, modeChecks, orthogonalityError, rayleighModeChecks, residuals } from '../src/eigen/verify';
import { ArgumentError, VerificationError } from '../src/errors';
import type { Operator } from '../src/linalg/operator';
import { fromDenseArray, symmetricMultiply } from '../src/linalg/sparse/symmetric';
import { randomSpd, seeded } from './eigen-dense-helpers';

function toMatrix(n: number, a: Float64Array): Matrix {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, a[i * n + j]);
  return m;
}

/** Reference 1-norm through ml-matrix: max over columns of the column sums of |A|. */
function norm1Reference(a: Matrix): number {
  return Math.max(...a.clone().abs().sum('column'));
}

describe('verify: checks of eigenpairs', () => {
  const n = 15;
  const rand = seeded(31);
  const k = randomSpd(n, rand, 0.2);
  const m = randomSpd(n, rand, 1.0);
  const K = fromDenseArray(n, k);
  const M = fromDenseArray(n, m);
  // Reference eigenpairs: ml-matrix's dense route (general-purpose library).
  const ref = mlMatrixGeneralized(toMatrix(n, k), toMatrix(n, m));

  it('matrixNorm1 of SymmetricCsc, dense and ml-matrix equals ml-matrix column sums', () => {
    const expected = norm1Reference(toMatrix(n, k));
    expect(matrixNorm1(K)).toBeCloseTo(expected, 10);
    expect(matrixNorm1({ n, data: k })).toBeCloseTo(expected, 10);
    expect(matrixNorm1(toMatrix(n, k))).toBeCloseTo(expected, 10);
  });

  it("matrixNorm1 of a bare Operator (Hager's estimate) is a lower bound close to the norm", () => {
    const op: Operator = { n, apply: (x, y) => symmetricMultiply(K, x, y) };
    const exact = norm1Reference(toMatrix(n, k));
    const est = matrixNorm1(op);
    expect(est).toBeLessThanOrEqual(exact * (1 + 1e-14));
    // Hager's estimate is rarely off by more than a factor 3 (Higham 1988, from memory).
    expect(est).toBeGreaterThan(exact / 3);
  });

  it('residuals of the reference pairs are at round-off; of perturbed values they are not', () => {
    const r = residuals(K, M, ref.eigenvalues, ref.vectors);
    for (const x of r) expect(x).toBeLessThan(1e-12);
    const wrong = ref.eigenvalues.slice();
    wrong[3] *= 1.01;
    const r2 = residuals(K, M, wrong, ref.vectors);
    expect(r2[3]).toBeGreaterThan(1e-4);
    expect(r2[2]).toBeLessThan(1e-12);
  });

  it('modeChecks with a work space (stale contents, or too short) gives the bits it gives without', () => {
    const plain = modeChecks(K, M, ref.eigenvalues, ref.vectors);
    const stale = new Float64Array(checkWorkLength(n, n)).fill(Number.NaN);
    const withWork = modeChecks(K, M, ref.eigenvalues, ref.vectors, undefined, stale);
    expect(Array.from(withWork.residuals)).toEqual(Array.from(plain.residuals));
    expect(withWork.orthogonalityError).toBe(plain.orthogonalityError);
    const short = modeChecks(K, M, ref.eigenvalues, ref.vectors, undefined, new Float64Array(3));
    expect(Array.from(short.residuals)).toEqual(Array.from(plain.residuals));
  });

  it('rayleighModeChecks replaces perturbed values by the Rayleigh quotients of the modes', () => {
    // The reference modes are exact eigenvectors (ml-matrix's dense route), so each Rayleigh
    // quotient xᵀKx / xᵀMx is its eigenvalue: values off by 1 % come back to the reference, and
    // the residuals and orthogonality are those modeChecks gives with the reference values.
    const wrong = ref.eigenvalues.map((v, j) => v * (j % 2 === 0 ? 1.01 : 0.99));
    const got = rayleighModeChecks(K, M, wrong, ref.vectors);
    for (let j = 0; j < n; j++) expect(Math.abs(wrong[j] - ref.eigenvalues[j]) / ref.eigenvalues[j]).toBeLessThan(1e-12);
    for (const x of got.residuals) expect(x).toBeLessThan(1e-12);
    expect(got.orthogonalityError).toBe(modeChecks(K, M, ref.eigenvalues, ref.vectors).orthogonalityError);
    // A mode scaled by 1.1 has the same quotient (scale-invariant); its M-norm error shows.
    const v = ref.vectors.slice();
    for (let i = 0; i < n; i++) v[4 * n + i] *= 1.1;
    const values = ref.eigenvalues.slice();
    values[4] *= 2;
    const scaled = rayleighModeChecks(K, M, values, v);
    expect(Math.abs(values[4] - ref.eigenvalues[4]) / ref.eigenvalues[4]).toBeLessThan(1e-12);
    expect(scaled.orthogonalityError).toBeCloseTo(0.21, 10);
  });

  it('orthogonalityError of the reference modes is at round-off, and sees a scaled mode', () => {
    expect(orthogonalityError(M, ref.vectors, n)).toBeLessThan(1e-12);
    const v = ref.vectors.slice();
    for (let i = 0; i < n; i++) v[2 * n + i] *= 1.1; // φ₂ᵀMφ₂ = 1.21
    expect(orthogonalityError({ n, data: m }, v, n)).toBeCloseTo(0.21, 10);
  });

  it('size mismatches throw ArgumentError', () => {
    const M3 = fromDenseArray(3, [1, 0, 0, 0, 1, 0, 0, 0, 1]);
    expect(() => residuals(K, M3, ref.eigenvalues, ref.vectors)).toThrow(ArgumentError);
    expect(() => orthogonalityError(M, new Float64Array(n), 2)).toThrow(ArgumentError);
  });
});
