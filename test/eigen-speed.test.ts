/**
 * The faster kernels and paths of the sparse eigen solve (kernels.ts, ritz.ts, verify.ts,
 * lanczos.ts): each rewritten kernel gives the same bits as the plain computation it replaces,
 * and Lanczos stops inside a cycle once the wanted pairs have converged.
 * Random matrices are invented, seeded test data; the spring chain's eigenvalues come from its
 * closed form, cross-checked here against ml-matrix's dense symmetric decomposition.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { combineColumnsInPlace, dotColumns, gram } from '../src/eigen/kernels';
import { lanczos } from '../src/eigen/lanczos';
import { inverseOperator, matrixOperator } from '../src/eigen/operators';
import { ShiftedPencil } from '../src/eigen/pencil';
import { rayleighRitz, rayleighRitzOperator } from '../src/eigen/ritz';
import { solve } from '../src/eigen/solve';
import { modeChecks, orthogonalityError, residuals } from '../src/eigen/verify';
import { ArgumentError } from '../src/errors';
import { symmetricMultiply, symmetricMultiplyMany, toDenseArray } from '../src/linalg/sparse/symmetric';
import { randomSparsePair, rng, springChain } from './eigen-sparse-helpers';

/** Bitwise equality of two Float64Arrays. */
function sameBits(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

function randomColumns(n: number, q: number, seed: number): Float64Array {
  const r = rng(seed);
  const x = new Float64Array(n * q);
  for (let i = 0; i < x.length; i++) x[i] = r() - 0.5;
  return x;
}

/**
 * Fixed-free chain of n unit masses and unit springs: λⱼ = 4 sin²((2j − 1)π / (2(2n + 1))),
 * j = 1..n (closed form of the tridiagonal chain matrix, from memory; checked against ml-matrix
 * below).
 */
function chainEigenvalue(n: number, j: number): number {
  return 4 * Math.sin(((2 * j - 1) * Math.PI) / (2 * (2 * n + 1))) ** 2;
}

describe('sparse eigen kernels', () => {
  it('symmetricMultiply (diagonal taken out of the inner loop) gives the bits of the plain loop over the stored entries', () => {
    const { K, M } = randomSparsePair(700, 6, 11);
    for (const a of [K, M]) {
      const x = randomColumns(a.n, 1, 3);
      const y1 = new Float64Array(a.n);
      const y2 = new Float64Array(a.n);
      // Plain product: each stored entry once, a branch on the diagonal, the column's sum last.
      for (let j = 0; j < a.n; j++) {
        let s = 0;
        for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
          const i = a.rowIdx[p];
          if (i === j) s += a.values[p] * x[j];
          else {
            y1[i] += a.values[p] * x[j];
            s += a.values[p] * x[i];
          }
        }
        y1[j] += s;
      }
      symmetricMultiply(a, x, y2);
      expect(sameBits(y1, y2)).toBe(true);
    }
  });

  it('symmetricMultiplyMany (four columns per pass) gives each column the bits of symmetricMultiply', () => {
    const { K, M } = randomSparsePair(500, 6, 13);
    // M without the diagonal entries of its even columns: columns with no stored diagonal too.
    const colPtr = new Int32Array(M.n + 1);
    const rows: number[] = [];
    const vals: number[] = [];
    for (let j = 0; j < M.n; j++) {
      for (let p = M.colPtr[j]; p < M.colPtr[j + 1]; p++) {
        if (M.rowIdx[p] === j && j % 2 === 0) continue;
        rows.push(M.rowIdx[p]);
        vals.push(M.values[p]);
      }
      colPtr[j + 1] = rows.length;
    }
    const holed = { n: M.n, colPtr, rowIdx: Int32Array.from(rows), values: Float64Array.from(vals) };
    for (const a of [K, M, holed]) {
      const n = a.n;
      for (const k of [1, 3, 4, 5, 9]) {
        const x = randomColumns(n, k, 17 + k);
        const many = new Float64Array(n * k).fill(Number.NaN); // stale output must be overwritten
        symmetricMultiplyMany(a, x, many, k);
        const one = new Float64Array(n);
        for (let c = 0; c < k; c++) {
          symmetricMultiply(a, x.subarray(c * n, (c + 1) * n), one);
          expect(sameBits(many.subarray(c * n, (c + 1) * n), one)).toBe(true);
        }
      }
    }
  });

  it('gram (4 × 2 blocks) gives the bits of one dotColumns per column', () => {
    const n = 333;
    for (const [p, q] of [[7, 5], [8, 8], [1, 3], [13, 1]]) {
      const x = randomColumns(n, p, 5);
      const y = randomColumns(n, q, 6);
      const g = new Float64Array(p * q);
      gram(x, y, n, p, q, g);
      const ref = new Float64Array(p * q);
      for (let j = 0; j < q; j++) dotColumns(x, n, 0, p, y.subarray(j * n, (j + 1) * n), ref.subarray(j * p, (j + 1) * p));
      expect(sameBits(g, ref), `${p} × ${q}`).toBe(true);
    }
  });

  it('combineColumnsInPlace gives the bits of a plain sequential product V·S', () => {
    const n = 517;
    const m = 9;
    for (const k of [9, 6, 3]) {
      const v = randomColumns(n, m, 7);
      const s = randomColumns(m, k, 8);
      const ref = new Float64Array(n * k);
      for (let c = 0; c < k; c++) {
        for (let r = 0; r < n; r++) {
          let t = 0;
          for (let i = 0; i < m; i++) t += v[i * n + r] * s[c * m + i];
          ref[c * n + r] = t;
        }
      }
      combineColumnsInPlace(v, n, 0, m, s, m, k, new Float64Array(5 * m));
      expect(sameBits(v.subarray(0, n * k), ref), `k = ${k}`).toBe(true);
    }
  });

  it('modeChecks returns the residuals and the orthogonality error of the separate checks', () => {
    const { K, M } = randomSparsePair(400, 5, 21);
    const r = solve(K, M, { count: 6, method: 'lanczos' });
    const both = modeChecks(K, M, r.eigenvalues, r.vectors);
    expect(sameBits(both.residuals, residuals(K, M, r.eigenvalues, r.vectors))).toBe(true);
    expect(both.orthogonalityError).toBe(orthogonalityError(M, r.vectors, 6));
    expect(both.orthogonalityError).toBeLessThanOrEqual(1e-10);
  });

  it('rayleighRitzOperator gives the bits of rayleighRitz with K·X formed', () => {
    const { K, M } = randomSparsePair(300, 5, 31);
    const n = K.n;
    const q = 5;
    const x1 = randomColumns(n, q, 9);
    const x2 = x1.slice();
    const mx1 = new Float64Array(n * q);
    const kx = new Float64Array(n * q);
    const kop = matrixOperator(K);
    matrixOperator(M).applyMany(x1, mx1, q);
    kop.applyMany(x1, kx, q);
    const mx2 = mx1.slice();
    const v1 = rayleighRitz(x1, kx, mx1, n, q, new Float64Array(256 * q));
    const v2 = rayleighRitzOperator(x2, kop, mx2, n, q, new Float64Array(256 * q));
    expect(sameBits(v1, v2)).toBe(true);
    expect(sameBits(x1, x2)).toBe(true);
    expect(sameBits(mx1, mx2)).toBe(true);
  });
});

describe('Lanczos stopping point', () => {
  it('chain closed form agrees with ml-matrix (n = 40)', () => {
    const n = 40;
    const { K } = springChain(n, 1, 1, 'fixed-free');
    const dense = toDenseArray(K);
    const rows = Array.from({ length: n }, (_, i) => Array.from(dense.subarray(i * n, (i + 1) * n)));
    const ev = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b);
    for (let j = 1; j <= n; j++) expect(Math.abs(ev[j - 1] - chainEigenvalue(n, j))).toBeLessThan(1e-12);
  });

  it('stops inside a cycle once the wanted pairs converge (chain, n = 20,000, basis 60)', () => {
    const n = 20000;
    const { K, M } = springChain(n, 1, 1, 'fixed-free');
    const pencil = new ShiftedPencil(K, M);
    const f = pencil.factorAt(0, -1).factor;
    const basisSize = 60;
    const r = lanczos(inverseOperator(f), matrixOperator(M), { count: 20, basisSize });
    expect(r.converged).toBe(true);
    // Without tests inside the cycle the run would end at the full basis (basisSize steps plus
    // the start vector) or later.
    expect(r.restarts).toBe(0);
    expect(r.steps).toBeLessThan(basisSize);
    for (let j = 1; j <= 20; j++) {
      const exact = chainEigenvalue(n, j); // Source: closed form above
      expect(Math.abs(r.eigenvalues[j - 1] - exact) / exact, `mode ${j}`).toBeLessThan(1e-9);
    }
  });

  it('locking on restart keeps every pair: clustered chain, small basis, many restarts', () => {
    const n = 3000;
    const { K, M } = springChain(n, 1, 1, 'fixed-free');
    const r = solve(K, M, { count: 12, method: 'lanczos' });
    expect(r.sturm?.passed).toBe(true);
    expect(r.orthogonalityError).toBeLessThanOrEqual(1e-10);
    for (let j = 1; j <= 12; j++) {
      const exact = chainEigenvalue(n, j); // Source: closed form above
      expect(Math.abs(r.eigenvalues[j - 1] - exact) / exact, `mode ${j}`).toBeLessThan(1e-8);
      expect(r.residuals[j - 1]).toBeLessThanOrEqual(1e-8);
    }
    const pencil = new ShiftedPencil(K, M);
    const f = pencil.factorAt(0, -1).factor;
    const small = lanczos(inverseOperator(f), matrixOperator(M), { count: 12, basisSize: 16 });
    expect(small.restarts).toBeGreaterThan(1);
    for (let j = 1; j <= 12; j++) {
      const exact = chainEigenvalue(n, j); // Source: closed form above
      expect(Math.abs(small.eigenvalues[j - 1] - exact) / exact, `mode ${j} (basis 16)`).toBeLessThan(1e-8);
    }
  });
});

describe('factor storage reuse', () => {
  it('a recycled factor refuses to solve; the next factorization into its storage equals a fresh one', () => {
    const { K, M } = randomSparsePair(500, 6, 41);
    const pencil = new ShiftedPencil(K, M);
    const first = pencil.factorAt(0.3, 1).factor;
    pencil.recycle(first);
    const b = randomColumns(K.n, 1, 12);
    const x = new Float64Array(K.n);
    let err: unknown;
    try {
      first.solve(b, x);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ArgumentError);
    expect((err as ArgumentError).path).toBe('factor');
    const reused = pencil.factorAt(0.7, 1).factor;
    const fresh = new ShiftedPencil(K, M, { symbolic: pencil.symbolic }).factorAt(0.7, 1).factor;
    expect(reused.negativePivots).toBe(fresh.negativePivots);
    const x1 = new Float64Array(K.n);
    const x2 = new Float64Array(K.n);
    reused.solve(b, x1);
    fresh.solve(b, x2);
    expect(sameBits(x1, x2)).toBe(true);
  });
});
