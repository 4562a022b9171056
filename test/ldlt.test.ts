/**
 * Sparse LDLᵀ (src/linalg/ldlt): analyse → factorize → solve, checked against ml-matrix's dense
 * decompositions (CholeskyDecomposition, LuDecomposition, EigenvalueDecomposition) as reference.
 */
import { describe, expect, it } from 'vitest';
import { CholeskyDecomposition, EigenvalueDecomposition, LuDecomposition, Matrix } from 'ml-matrix';
import { ANALYSE_DEFAULTS, analyse } from '../src/linalg/ldlt/analyse';
import { FACTORIZE_DEFAULTS, factorize } from '../src/linalg/ldlt/factorize';
import { solveStatic } from '../src/linalg/ldlt/static';
import { ArgumentError, FactorizationError } from '../src/errors';
import { order, symbolicFill } from '../src/linalg/ordering';
import { CooBuilder, combineOnUnion, symmetricMultiply, unionPattern, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { buildingFrame, randomSymmetric, rng, toRows } from './ldlt-helpers';

function randomVector(n: number, seed: number): Float64Array {
  const r = rng(seed);
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) v[i] = 2 * r() - 1;
  return v;
}

function maxRelDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < a.length; i++) {
    num = Math.max(num, Math.abs(a[i] - b[i]));
    den = Math.max(den, Math.abs(b[i]));
  }
  return num / den;
}

/** Reference solution from ml-matrix's dense decomposition. */
function denseSolve(a: SymmetricCsc, b: Float64Array, spd: boolean): number[] {
  const A = new Matrix(toRows(a));
  const B = Matrix.columnVector(Array.from(b));
  return (spd ? new CholeskyDecomposition(A).solve(B) : new LuDecomposition(A).solve(B)).getColumn(0);
}

/** Negative eigenvalues of a symmetric matrix, from ml-matrix's EigenvalueDecomposition. */
function negativeEigenvalues(a: SymmetricCsc): { count: number; minAbs: number } {
  const ev = new EigenvalueDecomposition(new Matrix(toRows(a)), { assumeSymmetric: true }).realEigenvalues;
  return { count: ev.filter((x) => x < 0).length, minAbs: Math.min(...ev.map(Math.abs)) };
}

function shifted(K: SymmetricCsc, M: SymmetricCsc, sigma: number): SymmetricCsc {
  const u = unionPattern(K, M);
  const values = new Float64Array(u.pattern.rowIdx.length);
  combineOnUnion(u, 1, K, -sigma, M, values);
  return { ...u.pattern, values };
}

const orderings = ['auto', 'natural', 'amd', 'nd', 'rcm'] as const;

describe('sparse LDLᵀ against dense references', () => {
  for (const [n, seed] of [
    [12, 1],
    [80, 2],
    [400, 3],
  ] as const) {
    it(`random SPD n=${n}: solve equals ml-matrix Cholesky`, () => {
      const a = randomSymmetric(n, 6, seed, true);
      const b = randomVector(n, seed + 10);
      const f = factorize(analyse(a), a.values);
      const x = new Float64Array(n);
      f.solve(b, x);
      // Reference: ml-matrix CholeskyDecomposition of the same dense matrix.
      expect(maxRelDiff(x, denseSolve(a, b, true))).toBeLessThan(1e-12);
      expect(f.negativePivots).toBe(0); // SPD: no negative eigenvalue (Sylvester)
    });

    it(`random indefinite n=${n}: solve equals ml-matrix LU, inertia equals the eigenvalue count`, () => {
      const a = randomSymmetric(n, 6, seed + 100, false);
      const b = randomVector(n, seed + 20);
      const f = factorize(analyse(a), a.values);
      const x = new Float64Array(n);
      f.solve(b, x);
      expect(maxRelDiff(x, denseSolve(a, b, false))).toBeLessThan(1e-11);
      // Sylvester's law of inertia: negative pivots of LDLᵀ = negative eigenvalues (ml-matrix).
      const ref = negativeEigenvalues(a);
      expect(ref.count).toBeGreaterThan(0);
      expect(f.negativePivots).toBe(ref.count);
    });
  }

  it('building frame K − σM: inertia equals the negative eigenvalues of ml-matrix, every ordering', () => {
    const { K, M } = buildingFrame({ bx: 2, by: 2, bz: 3 }, 7); // 216 DOF
    for (const sigma of [0.05, 0.4, 1.3]) {
      const a = shifted(K, M, sigma);
      const ref = negativeEigenvalues(a);
      expect(ref.minAbs).toBeGreaterThan(1e-6); // σ is not on an eigenvalue
      for (const ordering of orderings) {
        const f = factorize(analyse(a, { ordering }), a.values);
        expect(f.negativePivots, `σ=${sigma} ${ordering}`).toBe(ref.count);
        const b = randomVector(a.n, 5);
        const x = new Float64Array(a.n);
        f.solve(b, x);
        expect(maxRelDiff(x, denseSolve(a, b, false))).toBeLessThan(1e-9 / ref.minAbs);
      }
    }
  });

  it('building frame n≈1,000: solve equals ml-matrix Cholesky', () => {
    const { K } = buildingFrame({ bx: 4, by: 4, bz: 6 }, 3); // 25·7·6 = 1,050 DOF
    const b = randomVector(K.n, 9);
    const x = new Float64Array(K.n);
    factorize(analyse(K), K.values).solve(b, x);
    expect(maxRelDiff(x, denseSolve(K, b, true))).toBeLessThan(1e-10);
  });

  it('building frame n≈2,000: residual ‖Ax − b‖/‖b‖ is at round-off level', () => {
    const { K } = buildingFrame({ bx: 5, by: 5, bz: 9 }, 4); // 36·10·6 = 2,160 DOF
    const b = randomVector(K.n, 11);
    const x = new Float64Array(K.n);
    const f = factorize(analyse(K), K.values);
    f.solve(b, x);
    const ax = new Float64Array(K.n);
    symmetricMultiply(K, x, ax);
    let r = 0;
    let nb = 0;
    for (let i = 0; i < K.n; i++) {
      r += (ax[i] - b[i]) ** 2;
      nb += b[i] ** 2;
    }
    expect(Math.sqrt(r / nb)).toBeLessThan(1e-10);
    expect(f.negativePivots).toBe(0); // K SPD by construction (sum of SPD blocks + shift)
  });
});

describe('supernodal paths', () => {
  it('dense-like indefinite matrix (one wide supernode, blocked panels): solve and inertia vs ml-matrix', () => {
    const a = randomSymmetric(150, 150, 41, false);
    const sym = analyse(a);
    expect(sym.supernodes).toBeLessThan(10); // fill makes it (nearly) dense: a few wide supernodes
    const f = factorize(sym, a.values);
    const b = randomVector(a.n, 42);
    const x = new Float64Array(a.n);
    f.solve(b, x);
    // Reference: ml-matrix LuDecomposition; inertia from ml-matrix EigenvalueDecomposition.
    expect(maxRelDiff(x, denseSolve(a, b, false))).toBeLessThan(1e-11);
    expect(f.negativePivots).toBe(negativeEigenvalues(a).count);
  });

  it('building frame K − σM, 480 DOF, nd and amd: inertia equals ml-matrix eigenvalue count', () => {
    const { K, M } = buildingFrame({ bx: 3, by: 3, bz: 4 }, 11);
    const a = shifted(K, M, 0.6);
    const ref = negativeEigenvalues(a);
    expect(ref.count).toBeGreaterThan(0);
    expect(ref.minAbs).toBeGreaterThan(1e-6);
    for (const ordering of ['nd', 'amd'] as const) {
      const f = factorize(analyse(a, { ordering }), a.values);
      expect(f.negativePivots, ordering).toBe(ref.count);
    }
  });

  it("'auto' measures each candidate's fill; counts agree with the ordering module's symbolicFill", () => {
    const { K } = buildingFrame({ bx: 3, by: 3, bz: 5 }, 2);
    const sym = analyse(K);
    expect(sym.candidates?.length).toBeGreaterThanOrEqual(2);
    let best = Infinity;
    for (const c of sym.candidates ?? []) {
      // Independent count (row-subtree traversal in src/linalg/ordering/fill.ts) of the same ordering.
      const ref = symbolicFill(K, order(K, c.ordering as 'amd'));
      expect(c.nnzL, c.ordering).toBe(ref.nnzL);
      expect(c.flops, c.ordering).toBe(ref.flops);
      best = Math.min(best, c.flops);
    }
    expect(sym.flops).toBe(best);
    expect(sym.candidates?.find((c) => c.flops === best)?.ordering).toBe(sym.ordering);
  });

  it('solveMany on a frame factor equals column-by-column solve; memory is reported', () => {
    const { K } = buildingFrame({ bx: 3, by: 4, bz: 6 }, 5);
    const f = factorize(analyse(K, { ordering: 'nd' }), K.values);
    const k = 3;
    const B = randomVector(K.n * k, 6);
    const X = new Float64Array(K.n * k);
    f.solveMany(B, X, k);
    for (let c = 0; c < k; c++) {
      const x = new Float64Array(K.n);
      f.solve(B.subarray(c * K.n, (c + 1) * K.n), x);
      expect(Array.from(X.subarray(c * K.n, (c + 1) * K.n))).toEqual(Array.from(x));
    }
    expect(f.memoryBytes).toBeGreaterThan(8 * (analyse(K, { ordering: 'nd' }).nnzL + K.n));
  });

  it('solveStatic equals analyse + factorize + solve', () => {
    const { K } = buildingFrame({ bx: 2, by: 2, bz: 5 }, 8);
    const fvec = randomVector(K.n, 9);
    const u = solveStatic(K, fvec);
    const x = new Float64Array(K.n);
    factorize(analyse(K), K.values).solve(fvec, x);
    expect(Array.from(u)).toEqual(Array.from(x));
  });
});

describe('sparse LDLᵀ contract', () => {
  it('solveMany equals repeated solve; solve may alias', () => {
    const a = randomSymmetric(150, 8, 31, false);
    const f = factorize(analyse(a), a.values);
    const k = 3;
    const B = randomVector(a.n * k, 4);
    const X = new Float64Array(a.n * k);
    f.solveMany(B, X, k);
    for (let c = 0; c < k; c++) {
      const x = new Float64Array(a.n);
      f.solve(B.subarray(c * a.n, (c + 1) * a.n), x);
      expect(Array.from(X.subarray(c * a.n, (c + 1) * a.n))).toEqual(Array.from(x));
    }
    const inPlace = B.slice();
    f.solveMany(inPlace, inPlace, k);
    expect(Array.from(inPlace)).toEqual(Array.from(X));
    const v = B.slice(0, a.n);
    f.solve(v, v);
    expect(Array.from(v)).toEqual(Array.from(X.subarray(0, a.n)));
  });

  it('analyse once + factorize for two shifts equals fresh analyse + factorize', () => {
    const { K, M } = buildingFrame({ bx: 2, by: 3, bz: 4 }, 2);
    const u = unionPattern(K, M);
    const sym = analyse(u.pattern);
    const values = new Float64Array(u.pattern.rowIdx.length);
    const b = randomVector(K.n, 3);
    for (const sigma of [0.2, 0.9]) {
      combineOnUnion(u, 1, K, -sigma, M, values);
      const reused = factorize(sym, values);
      const a = shifted(K, M, sigma);
      const fresh = factorize(analyse(a), a.values);
      expect(reused.negativePivots).toBe(fresh.negativePivots);
      const x1 = new Float64Array(K.n);
      const x2 = new Float64Array(K.n);
      reused.solve(b, x1);
      fresh.solve(b, x2);
      expect(Array.from(x1)).toEqual(Array.from(x2));
    }
  });

  it('does not modify its inputs', () => {
    const a = randomSymmetric(100, 6, 8, false);
    const copy = { colPtr: a.colPtr.slice(), rowIdx: a.rowIdx.slice(), values: a.values.slice() };
    const b = randomVector(a.n, 1);
    const bCopy = b.slice();
    const sym = analyse(a);
    const permCopy = sym.perm.slice();
    const f = factorize(sym, a.values);
    f.solve(b, new Float64Array(a.n));
    f.solveMany(b, new Float64Array(a.n), 1);
    expect(Array.from(a.colPtr)).toEqual(Array.from(copy.colPtr));
    expect(Array.from(a.rowIdx)).toEqual(Array.from(copy.rowIdx));
    expect(Array.from(a.values)).toEqual(Array.from(copy.values));
    expect(Array.from(b)).toEqual(Array.from(bCopy));
    expect(Array.from(sym.perm)).toEqual(Array.from(permCopy));
  });

  it('singular matrix → FactorizationError whose path names the row', () => {
    // Row/column 17 holds only a zero diagonal: singular whatever the ordering.
    const base = randomSymmetric(40, 4, 5, true);
    const b = new CooBuilder(40);
    for (let j = 0; j < 40; j++) {
      for (let p = base.colPtr[j]; p < base.colPtr[j + 1]; p++) {
        const i = base.rowIdx[p];
        if (i !== 17 && j !== 17) b.add(i, j, base.values[p]);
      }
    }
    b.add(17, 17, 0);
    const a = b.toCsc();
    for (const ordering of orderings) {
      let err: unknown;
      try {
        factorize(analyse(a, { ordering }), a.values);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(FactorizationError);
      expect((err as FactorizationError).path).toBe('row 17');
    }
  });

  it('n = 0 and n = 1', () => {
    const empty: SymmetricCsc = { n: 0, colPtr: new Int32Array(1), rowIdx: new Int32Array(0), values: new Float64Array(0) };
    const f0 = factorize(analyse(empty), empty.values);
    expect(f0.negativePivots).toBe(0);
    f0.solve(new Float64Array(0), new Float64Array(0));
    const one: SymmetricCsc = { n: 1, colPtr: Int32Array.from([0, 1]), rowIdx: Int32Array.from([0]), values: Float64Array.from([-4]) };
    const f1 = factorize(analyse(one), one.values);
    expect(f1.negativePivots).toBe(1);
    const x = new Float64Array(1);
    f1.solve(Float64Array.from([2]), x);
    expect(x[0]).toBe(-0.5); // 2 / (−4)
  });

  it('explicit permutation: same fill and solution; bad options and values throw ArgumentError with a path', () => {
    const a = randomSymmetric(60, 6, 12, true);
    const perm = new Int32Array(60);
    for (let k = 0; k < 60; k++) perm[k] = 59 - k;
    const sym = analyse(a, { ordering: perm });
    expect(sym.ordering).toBe('given');
    // analyse may renumber within the elimination tree (postorder), which keeps the fill:
    // nnz(L) equals the ordering module's symbolic count for the given permutation.
    expect(sym.nnzL).toBe(symbolicFill(a, perm).nnzL);
    const b = randomVector(60, 2);
    const x = new Float64Array(60);
    factorize(sym, a.values).solve(b, x);
    expect(maxRelDiff(x, denseSolve(a, b, true))).toBeLessThan(1e-12);
    const bad = perm.slice();
    bad[3] = bad[4];
    expect(() => analyse(a, { ordering: bad })).toThrowError(expect.objectContaining({ path: 'options.ordering[4]' }));
    // @ts-expect-error unknown ordering name on purpose
    expect(() => analyse(a, { ordering: 'fast' })).toThrow(ArgumentError);
    expect(() => factorize(sym, a.values.subarray(1))).toThrowError(expect.objectContaining({ path: 'values' }));
    const nan = a.values.slice();
    nan[5] = NaN;
    expect(() => factorize(sym, nan)).toThrowError(expect.objectContaining({ path: 'values[5]' }));
  });

  it('defaults: ordering auto, pivotTolerance 1e-13 (as documented in types.ts); undefined options take them', () => {
    expect(ANALYSE_DEFAULTS.ordering).toBe('auto');
    expect(FACTORIZE_DEFAULTS.pivotTolerance).toBe(1e-13);
    const a = randomSymmetric(50, 6, 3, true);
    expect(analyse(a, { ordering: undefined }).ordering).toBe(analyse(a).ordering);
    // diag(1, 1e-14): the second pivot is below 1e-13·max|A_jj| → singular by default,
    // accepted with a smaller tolerance (the pivot rule of FactorizeOptions).
    const tiny: SymmetricCsc = { n: 2, colPtr: Int32Array.from([0, 1, 2]), rowIdx: Int32Array.from([0, 1]), values: Float64Array.from([1, 1e-14]) };
    const sym = analyse(tiny, { ordering: 'natural' });
    expect(() => factorize(sym, tiny.values, { pivotTolerance: undefined })).toThrowError(expect.objectContaining({ path: 'row 1' }));
    expect(factorize(sym, tiny.values, { pivotTolerance: 1e-15 }).minPivotRatio).toBeCloseTo(1e-14, 20);
    expect(() => factorize(sym, tiny.values, { pivotTolerance: -1 })).toThrowError(expect.objectContaining({ path: 'options.pivotTolerance' }));
  });

  it('symbolic facts: nnzL, flops, supernodes are consistent with the perm', () => {
    const { K } = buildingFrame({ bx: 2, by: 2, bz: 2 }, 1);
    const sym = analyse(K, { ordering: 'natural' });
    expect(sym.n).toBe(K.n);
    expect(sym.patternNnz).toBe(K.rowIdx.length);
    expect(sym.nnzL).toBeGreaterThanOrEqual(K.rowIdx.length - K.n); // L holds at least A's pattern
    expect(sym.supernodes).toBeGreaterThan(0);
    expect(sym.supernodes).toBeLessThanOrEqual(K.n);
    expect(sym.flops).toBeGreaterThan(0);
  });
});

describe('solveStatic', () => {
  it('springs in series: tip displacement F·N/k (Hooke\'s law, series springs)', () => {
    // N springs of stiffness k in a chain fixed at one end; free DOFs 1..N → tridiagonal K.
    const N = 50;
    const k = 2.0e6;
    const F = 1000;
    const b = new CooBuilder(N);
    for (let i = 0; i < N; i++) {
      b.add(i, i, i === N - 1 ? k : 2 * k);
      if (i + 1 < N) b.add(i + 1, i, -k);
    }
    const f = new Float64Array(N);
    f[N - 1] = F;
    const u = solveStatic(b.toCsc(), f);
    expect(Math.abs(u[N - 1] - (F * N) / k) / ((F * N) / k)).toBeLessThan(1e-12);
    expect(Math.abs(u[9] - (F * 10) / k) / ((F * 10) / k)).toBeLessThan(1e-12); // F·(i+1)/k
  });

  it('mechanism → FactorizationError naming the row', () => {
    // Free chain (no support): the rigid translation makes K singular.
    const N = 6;
    const b = new CooBuilder(N);
    for (let i = 0; i < N; i++) {
      b.add(i, i, i === 0 || i === N - 1 ? 1 : 2);
      if (i + 1 < N) b.add(i + 1, i, -1);
    }
    let err: unknown;
    try {
      solveStatic(b.toCsc(), new Float64Array(N));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(FactorizationError);
    expect((err as FactorizationError).path).toMatch(/^row [0-5]$/);
    expect((err as FactorizationError).message).toMatch(/K is singular at row/);
  });
});
