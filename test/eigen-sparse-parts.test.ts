/**
 * Building blocks of the sparse eigensolvers: operators (src/eigen/operators.ts), dense kernels
 * (kernels.ts), the projected problem (ritz.ts), Lanczos and subspace iteration on their own
 * (lanczos.ts, subspace.ts) and the Sturm count (sturm.ts, pencil.ts).
 */
import { describe, expect, it } from 'vitest';
import { Matrix } from 'ml-matrix';
import { ArgumentError, FactorizationError } from '../src/errors';
import { combineColumnsInPlace, dotColumns, SeededRandom, subtractColumns } from '../src/eigen/kernels';
import { lanczos, LANCZOS_DEFAULTS } from '../src/eigen/lanczos';
import { inverseOperator, matrixOperator, shiftInvertOperator } from '../src/eigen/operators';
import { ShiftedPencil } from '../src/eigen/pencil';
import { projectedEigen } from '../src/eigen/ritz';
import { STURM_GAP, sturmCheck, sturmCount } from '../src/eigen/sturm';
import { subspaceIteration, SUBSPACE_DEFAULTS } from '../src/eigen/subspace';
import { CooBuilder, symmetricMultiply } from '../src/linalg/sparse/symmetric';
import { maxRelDiff, randomSparsePair, springChain, toMatrix } from './eigen-sparse-helpers';
import { mlMatrixGeneralized } from '../src/eigen/baseline';

/** Fixed-free uniform chain eigenvalue (see eigen-sparse.test.ts for the derivation). */
function chainEigen(n: number, k: number, m: number, j: number): number {
  const s = Math.sin(((2 * j - 1) * Math.PI) / (2 * (2 * n + 1)));
  return ((4 * k) / m) * s * s;
}

describe('kernels', () => {
  const rnd = new SeededRandom(3);
  const n = 37;
  const m = 9;
  const V = new Float64Array(n * m);
  rnd.fill(V);
  const w = new Float64Array(n);
  rnd.fill(w);

  it('dotColumns and subtractColumns equal the plain loops', () => {
    const h = new Float64Array(m);
    dotColumns(V, n, 0, m, w, h);
    for (let c = 0; c < m; c++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += V[c * n + i] * w[i];
      expect(h[c]).toBeCloseTo(s, 13);
    }
    const w2 = w.slice();
    subtractColumns(V, n, 2, 7, h, w2);
    for (let i = 0; i < n; i++) {
      let s = w[i];
      for (let c = 2; c < 7; c++) s -= V[c * n + i] * h[c - 2];
      expect(w2[i]).toBeCloseTo(s, 13);
    }
  });

  it('combineColumnsInPlace equals V·S (row blocks smaller than n)', () => {
    const k = 6;
    const S = new Float64Array(m * k);
    rnd.fill(S);
    const out = V.slice();
    combineColumnsInPlace(out, n, 0, m, S, m, k, new Float64Array(5 * m)); // 5-row blocks
    for (let c = 0; c < k; c++) {
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let t = 0; t < m; t++) s += V[t * n + i] * S[c * m + t];
        expect(out[c * n + i]).toBeCloseTo(s, 13);
      }
    }
  });

  it('SeededRandom: same seed, same sequence; values in [−0.5, 0.5)', () => {
    const a = new SeededRandom(42);
    const b = new SeededRandom(42);
    const c = new SeededRandom(43);
    let differ = false;
    let same = true;
    let inRange = true;
    let mean = 0;
    for (let i = 0; i < 10000; i++) {
      const x = a.next();
      if (x !== b.next()) same = false;
      if (x !== c.next()) differ = true;
      if (!(x >= -0.5 && x < 0.5)) inRange = false;
      mean += x / 10000;
    }
    expect(same).toBe(true);
    expect(inRange).toBe(true);
    expect(differ).toBe(true);
    expect(Math.abs(mean)).toBeLessThan(0.02); // uniform: mean 0, σ/√N ≈ 0.003
  });
});

describe('projected problem', () => {
  it('projectedEigen matches the ml-matrix dense route (src/eigen/baseline.ts) and is B-orthonormal', () => {
    const q = 7;
    const r = new SeededRandom(5);
    const g = Matrix.zeros(q, q);
    const h = Matrix.zeros(q, q);
    for (let i = 0; i < q; i++) for (let j = 0; j < q; j++) {
      g.set(i, j, r.next());
      h.set(i, j, r.next());
    }
    const A = g.mmul(g.transpose());
    const B = h.mmul(h.transpose()).add(Matrix.eye(q).mul(0.5));
    const flat = (x: Matrix) => Float64Array.from({ length: q * q }, (_, t) => x.get(t % q, Math.floor(t / q)));
    const { values, vectors } = projectedEigen(flat(A), flat(B), q);
    const ref = mlMatrixGeneralized(A, B).eigenvalues;
    expect(maxRelDiff(values, ref, 1e-12)).toBeLessThan(1e-11);
    // QᵀBQ = I
    const Q = new Matrix(q, q);
    for (let c = 0; c < q; c++) for (let i = 0; i < q; i++) Q.set(i, c, vectors[c * q + i]);
    const I = Q.transpose().mmul(B).mmul(Q);
    for (let i = 0; i < q; i++) for (let j = 0; j < q; j++) expect(I.get(i, j)).toBeCloseTo(i === j ? 1 : 0, 11);
  });
});

describe('operators', () => {
  const { K, M } = springChain(30, 5, 2, 'fixed-free');
  const pencil = new ShiftedPencil(K, M);
  const { factor } = pencil.factorAt(0.7);

  it('shiftInvertOperator = (K − σM)⁻¹ M, and counts applications', () => {
    const op = shiftInvertOperator(factor, M);
    const x = new Float64Array(30).map((_, i) => Math.sin(i));
    const y = new Float64Array(30);
    op.apply(x, y);
    // (K − σM) y must equal M x.
    const ky = new Float64Array(30);
    const my = new Float64Array(30);
    const mx = new Float64Array(30);
    symmetricMultiply(K, y, ky);
    symmetricMultiply(M, y, my);
    symmetricMultiply(M, x, mx);
    for (let i = 0; i < 30; i++) expect(ky[i] - 0.7 * my[i]).toBeCloseTo(mx[i], 10);
    const X = new Float64Array(90);
    X.set(x);
    X.set(x, 60);
    const Y = new Float64Array(90);
    op.applyMany(X, Y, 3);
    expect(op.applications).toBe(4);
    for (let i = 0; i < 30; i++) expect(Y[60 + i]).toBeCloseTo(y[i], 13);
    // Five columns (four per pass over M, then one): each column bit-equal to a single apply.
    const X5 = new Float64Array(150).map((_, i) => Math.cos(0.3 * i));
    const Y5 = new Float64Array(150);
    op.applyMany(X5, Y5, 5);
    const yc = new Float64Array(30);
    for (let c = 0; c < 5; c++) {
      op.apply(X5.subarray(30 * c, 30 * (c + 1)), yc);
      expect(Array.from(Y5.subarray(30 * c, 30 * (c + 1)))).toEqual(Array.from(yc));
    }
    const inv = inverseOperator(factor);
    const z = new Float64Array(30);
    inv.apply(mx, z);
    for (let i = 0; i < 30; i++) expect(z[i]).toBeCloseTo(y[i], 13);
    const mo = matrixOperator(M);
    mo.apply(x, z);
    for (let i = 0; i < 30; i++) expect(z[i]).toBe(mx[i]);
  });
});

describe('Sturm count', () => {
  const n = 60;
  const { K, M } = springChain(n, 7, 3, 'fixed-free');

  it('counts the eigenvalues below σ (closed-form chain eigenvalues)', () => {
    for (const j of [1, 5, 17, 60]) {
      const mid = j < n ? 0.5 * (chainEigen(n, 7, 3, j) + chainEigen(n, 7, 3, j + 1)) : 2 * chainEigen(n, 7, 3, n);
      expect(sturmCount(K, M, mid)).toBe(j);
    }
    expect(sturmCount(K, M, -1)).toBe(0);
  });

  it('a shift exactly on an eigenvalue is nudged upward, so that eigenvalue counts as below', () => {
    // A 1-DOF pair: λ = 2 exactly, K − 2M has a zero pivot.
    const k = new CooBuilder(1);
    k.add(0, 0, 4);
    const m = new CooBuilder(1);
    m.add(0, 0, 2);
    expect(sturmCount(k.toCsc(), m.toCsc(), 2)).toBe(1);
  });

  it('K and M with a common null vector: FactorizationError naming the row', () => {
    const k = new CooBuilder(2);
    k.add(0, 0, 1);
    k.add(1, 1, 0);
    const m = new CooBuilder(2);
    m.add(0, 0, 1);
    m.add(1, 1, 0);
    let err: unknown;
    try {
      sturmCount(k.toCsc(), m.toCsc(), 0.5);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(FactorizationError);
    expect((err as FactorizationError).path).toBe('row 1');
  });

  it('sturmCheck: passes with every mode, fails with one left out', () => {
    const pencil = new ShiftedPencil(K, M);
    const all = Float64Array.from({ length: 8 }, (_, j) => chainEigen(n, 7, 3, j + 1));
    const ok = sturmCheck(pencil, all, 8);
    expect(ok.passed).toBe(true);
    expect(ok.countBelow).toBe(8);
    expect(ok.shift).toBeGreaterThan(all[7]);
    expect(ok.shift - all[7]).toBeCloseTo(STURM_GAP * all[7], 12);
    const missing = Float64Array.from([all[0], all[1], all[3], all[4]]);
    const bad = sturmCheck(pencil, missing, 4);
    expect(bad.passed).toBe(false);
    expect(bad.countBelow).toBe(5);
    const win = sturmCheck(pencil, all, 3, 2, { window: true });
    expect(win.passed).toBe(true);
    expect(win.countBelow - win.countBelowLower!).toBe(3);
  });

  it('a symbolic analysis of another pattern is refused (path symbolic)', () => {
    const other = springChain(61, 1, 1, 'fixed-free');
    const sym = new ShiftedPencil(other.K, other.M).symbolic;
    expect(() => sturmCount(K, M, 1, sym)).toThrow(ArgumentError);
  });
});

describe('lanczos and subspaceIteration on their own', () => {
  const { K, M } = randomSparsePair(250, 5, 17);
  const ref = mlMatrixGeneralized(toMatrix(K), toMatrix(M)).eigenvalues;
  const pencil = new ShiftedPencil(K, M);

  it('defaults are the documented values', () => {
    expect(LANCZOS_DEFAULTS).toEqual({ count: 20, shift: 0, tolerance: 1e-12, basisSize: 0, maxRestarts: 500, seed: 1, lockedCount: 0, massVectors: true });
    expect(SUBSPACE_DEFAULTS).toEqual({ count: 20, shift: 0, subspaceSize: 0, tolerance: 1e-11, normK: 0, maxIterations: 300, seed: 1, lockedCount: 0 });
  });

  it('lanczos: modes nearest an interior shift; locked vectors are skipped', () => {
    const sigma = 0.5 * (ref[40] + ref[41]);
    const { factor, shift } = pencil.factorAt(sigma);
    const r = lanczos(inverseOperator(factor), matrixOperator(M), { count: 6, shift });
    expect(r.converged).toBe(true);
    // The six nearest σ among the reference eigenvalues.
    const nearest = Array.from(ref).sort((a, b) => Math.abs(a - sigma) - Math.abs(b - sigma)).slice(0, 6).sort((a, b) => a - b);
    const got = Array.from(r.eigenvalues).filter((v) => nearest.some((e) => Math.abs(e - v) < 1e-8 * e));
    expect(got.length).toBe(6);
    // Lock the first three found: the next run returns the others and not those.
    const locked = r.vectors.slice(0, 3 * 250);
    const r2 = lanczos(inverseOperator(factor), matrixOperator(M), { count: 3, shift, locked, lockedCount: 3, seed: 2 });
    for (let i = 0; i < 3; i++) for (const v of r2.eigenvalues) expect(Math.abs(v - r.eigenvalues[i])).toBeGreaterThan(1e-8 * Math.abs(v));
  });

  it('lanczos on a 3-DOF problem exhausts the space and returns all three eigenvalues', () => {
    const c = springChain(3, 1, 1, 'fixed-free');
    const p = new ShiftedPencil(c.K, c.M);
    const { factor } = p.factorAt(0);
    const r = lanczos(inverseOperator(factor), matrixOperator(c.M), { count: 3 });
    expect(r.exhausted).toBe(true);
    expect(maxRelDiff(r.eigenvalues, [1, 2, 3].map((j) => chainEigen(3, 1, 1, j)))).toBeLessThan(1e-12);
  });

  it('subspaceIteration: lowest modes from σ = 0, residual-converged', () => {
    const { factor } = pencil.factorAt(0);
    const r = subspaceIteration(inverseOperator(factor), matrixOperator(M), matrixOperator(K), { count: 5 });
    expect(r.converged).toBe(true);
    expect(maxRelDiff(r.eigenvalues, ref.slice(0, 5))).toBeLessThan(1e-10);
    for (const res of r.residuals) expect(res).toBeLessThanOrEqual(1e-11);
  });

  it('bad options are ArgumentErrors naming the option', () => {
    const { factor } = pencil.factorAt(0);
    expect(() => lanczos(inverseOperator(factor), matrixOperator(M), { count: 0 })).toThrow(ArgumentError);
    expect(() => lanczos(inverseOperator(factor), matrixOperator(M), { lockedCount: 2 })).toThrow(ArgumentError);
    expect(() => subspaceIteration(inverseOperator(factor), matrixOperator(M), matrixOperator(K), { tolerance: 2 })).toThrow(ArgumentError);
  });
});
