import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { ArgumentError } from '../src/errors';
import { symmetricMultiply } from '../src/linalg/sparse/symmetric';
import { spectralStiffness, truncationError, TRUNCATION_DEFAULTS } from '../src/modal/reconstruction';
import { modalStatic } from '../src/modal/static';
import { denseModes, randomSpd, sym, toMatrix } from './modal-dense';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);
const n = 12;
// Random SPD K and M (invented; the identities below hold for any SPD pair).
const K = sym(randomSpd(n, 101));
const M = sym(randomSpd(n, 102, 0.4));
const modes = denseModes(K, M); // ml-matrix reference eigenpairs

/** K_m = M Φ_m Λ_m Φ_mᵀ M formed densely with ml-matrix (reference). */
function denseKm(count: number): Matrix {
  const Mm = toMatrix(M);
  const Phi = new Matrix(n, count);
  for (let j = 0; j < count; j++) for (let i = 0; i < n; i++) Phi.set(i, j, modes.vectors[j * n + i]);
  const Lam = Matrix.diag(Array.from(modes.eigenvalues.subarray(0, count)));
  return Mm.mmul(Phi).mmul(Lam).mmul(Phi.transpose()).mmul(Mm);
}

/** ‖K − K_m‖_F / ‖K‖_F, dense (reference). */
function denseTruncation(count: number): number {
  return toMatrix(K).sub(denseKm(count)).norm('frobenius') / toMatrix(K).norm('frobenius');
}

describe('spectral reconstruction K = M Φ Λ Φᵀ M', () => {
  it('operator with all modes equals K·x (spectral decomposition identity)', () => {
    const op = spectralStiffness(M, modes);
    const x = Float64Array.from({ length: n }, (_, i) => Math.sin(i + 1));
    const y = new Float64Array(n);
    const ref = new Float64Array(n);
    op.apply(x, y);
    symmetricMultiply(K, x, ref);
    for (let i = 0; i < n; i++) expect(Math.abs(y[i] - ref[i])).toBeLessThan(1e-11 * Math.max(...ref.map(Math.abs)));
  });
  it('operator over the first 5 modes equals the dense K_5·x', () => {
    const op = spectralStiffness(M, modes, { count: 5 });
    const x = Float64Array.from({ length: n }, (_, i) => Math.cos(2 * i));
    const y = new Float64Array(n);
    op.apply(x, y);
    const ref = denseKm(5).mmul(Matrix.columnVector(Array.from(x))).getColumn(0);
    const scale = Math.max(...ref.map(Math.abs));
    for (let i = 0; i < n; i++) expect(Math.abs(y[i] - ref[i])).toBeLessThan(1e-12 * scale);
  });
  it('truncation error: ≈ 0 with all modes; matches the dense ml-matrix difference for m < n', () => {
    expect(TRUNCATION_DEFAULTS).toEqual({ method: 'auto' });
    expect(truncationError(K, M, modes, { method: 'columns' })).toBeLessThan(1e-13);
    expect(truncationError(K, M, modes, { method: 'trace' })).toBeLessThan(1e-6); // cancellation floor √ε
    for (const count of [1, 4, 9]) {
      const ref = denseTruncation(count);
      expect(rel(truncationError(K, M, modes, { count }), ref)).toBeLessThan(1e-10);
      expect(rel(truncationError(K, M, modes, { count, method: 'columns' }), ref)).toBeLessThan(1e-10);
      expect(rel(truncationError(K, M, modes, { count, method: 'trace' }), ref)).toBeLessThan(1e-8);
    }
  });
  it('bad count and method: ArgumentError with the option as path', () => {
    expect(() => truncationError(K, M, modes, { count: n + 1 })).toThrow(ArgumentError);
    try {
      truncationError(K, M, modes, { method: 'svd' as never });
    } catch (e) {
      expect((e as ArgumentError).path).toBe('method');
    }
  });
});

describe('static deflection by modal summation', () => {
  const f = Float64Array.from({ length: n }, (_, i) => (i % 3) - 1 + 0.25 * i);
  const Kd = toMatrix(K);
  const uRef = Float64Array.from(solve(Kd, Matrix.columnVector(Array.from(f))).getColumn(0)); // dense ml-matrix solve
  const fu = f.reduce((s, v, i) => s + v * uRef[i], 0);

  it('all modes: equals the dense solve K⁻¹f', () => {
    const r = modalStatic(modes, f);
    const scale = Math.max(...uRef.map(Math.abs));
    for (let i = 0; i < n; i++) expect(Math.abs(r.displacement[i] - uRef[i])).toBeLessThan(1e-11 * scale);
    expect(rel(r.compliance[n - 1], fu)).toBeLessThan(1e-11);
  });
  it('partial sums: compliance rises monotonically and ‖u − u_m‖²_K = fᵀK⁻¹f − fᵀu_m (identity)', () => {
    const r = modalStatic(modes, f);
    const e = new Float64Array(n);
    const Ke = new Float64Array(n);
    for (let count = 1; count <= n; count++) {
      if (count > 1) expect(r.compliance[count - 1]).toBeGreaterThanOrEqual(r.compliance[count - 2]);
      const um = modalStatic(modes, f, { count }).displacement;
      for (let i = 0; i < n; i++) e[i] = uRef[i] - um[i];
      symmetricMultiply(K, e, Ke);
      const energy = e.reduce((s, v, i) => s + v * Ke[i], 0);
      expect(Math.abs(energy - (fu - r.compliance[count - 1]))).toBeLessThan(1e-10 * fu);
    }
  });
  it('three-storey shear frame, top load: floor i moves F·Σ_{s≤i} 1/k_s (springs in series)', () => {
    // Closed form: the storeys below a top load F all carry the shear F.
    const k = [6e7, 4e7, 2e7]; // N/m, invented storey stiffnesses
    const ms = [3e4, 3e4, 2e4]; // kg
    const Ks = sym([
      [k[0] + k[1], -k[1], 0],
      [-k[1], k[1] + k[2], -k[2]],
      [0, -k[2], k[2]],
    ]);
    const Ms = sym([
      [ms[0], 0, 0],
      [0, ms[1], 0],
      [0, 0, ms[2]],
    ]);
    const F = 1e5;
    const r = modalStatic(denseModes(Ks, Ms), Float64Array.from([0, 0, F]));
    let u = 0;
    for (let i = 0; i < 3; i++) {
      u += F / k[i];
      expect(rel(r.displacement[i], u)).toBeLessThan(1e-12);
    }
  });
  it('a rigid-body mode or a wrong load length: ArgumentError', () => {
    const rigid = { n: 2, eigenvalues: Float64Array.from([0, 4]), vectors: Float64Array.from([1, 1, 1, -1]) };
    try {
      modalStatic(rigid, Float64Array.from([1, 0]));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('modes[0]');
    }
    expect(() => modalStatic(modes, new Float64Array(3))).toThrow(ArgumentError);
  });
});
