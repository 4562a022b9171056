import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { denseEigen, DENSE_EIGEN_DEFAULTS, JACOBI_DEFAULTS, symmetricEigen } from '../src/eigen/dense/index';
import { mlMatrixGeneralized } from '../src/eigen/baseline';
import { ArgumentError, FactorizationError, VerificationError } from '../src/errors';
import { fromDenseArray } from '../src/linalg/sparse/symmetric';
import { maxRelDiff, randomSpd, seeded } from './eigen-dense-helpers';

const methods = ['cholesky', 'jacobi'] as const;

function toMatrix(n: number, a: Float64Array): Matrix {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, a[i * n + j]);
  return m;
}

describe('denseEigen: random SPD pairs against ml-matrix', () => {
  // Source: ml-matrix 6.15.1 (general-purpose reference library): Cholesky of M and its
  // symmetric EigenvalueDecomposition of L⁻¹KL⁻ᵀ (src/eigen/baseline.ts).
  // Data: seeded random pairs (invented).
  for (const n of [1, 2, 3, 5, 8, 13, 21, 34, 60]) {
    it(`n = ${n}: residual, M-orthonormality, eigenvalues, Jacobi = Cholesky`, () => {
      const rand = seeded(1000 + n);
      const k = randomSpd(n, rand, 0.1);
      const m = randomSpd(n, rand, 1.0);
      const ref = mlMatrixGeneralized(toMatrix(n, k), toMatrix(n, m));
      const byMethod = methods.map((method) => denseEigen({ n, data: k }, { n, data: m }, { method }));
      for (const r of byMethod) {
        expect(r.eigenvalues.length).toBe(n);
        for (let j = 0; j < n; j++) expect(r.residuals[j]).toBeLessThanOrEqual(1e-10);
        expect(r.orthogonalityError).toBeLessThanOrEqual(1e-12);
        for (let j = 1; j < n; j++) expect(r.eigenvalues[j]).toBeGreaterThanOrEqual(r.eigenvalues[j - 1]);
        expect(maxRelDiff(r.eigenvalues, ref.eigenvalues)).toBeLessThan(1e-10);
      }
      expect(maxRelDiff(byMethod[1].eigenvalues, byMethod[0].eigenvalues)).toBeLessThan(1e-10);
      expect(byMethod[0].method).toBe('cholesky');
      expect(byMethod[1].method).toBe('jacobi');
    });
  }

  it('count returns the lowest modes; SymmetricCsc, ml-matrix and flat inputs agree; inputs untouched', () => {
    const n = 12;
    const rand = seeded(77);
    const k = randomSpd(n, rand, 0.1);
    const m = randomSpd(n, rand, 1.0);
    const kCopy = k.slice();
    const all = denseEigen({ n, data: k }, { n, data: m });
    const some = denseEigen(fromDenseArray(n, k), toMatrix(n, m), { count: 4 });
    expect(some.eigenvalues.length).toBe(4);
    expect(some.vectors.length).toBe(4 * n);
    expect(maxRelDiff(some.eigenvalues, all.eigenvalues.subarray(0, 4))).toBeLessThan(1e-12);
    expect(Array.from(k)).toEqual(Array.from(kCopy));
  });
});

describe('denseEigen: closed forms', () => {
  for (const method of methods) {
    it(`${method}: one DOF, λ = k/m`, () => {
      // Source: single-DOF oscillator, ω² = k/m (any vibrations text).
      const r = denseEigen({ n: 1, data: new Float64Array([2.0e6]) }, { n: 1, data: new Float64Array([120]) }, { method });
      expect(r.eigenvalues[0]).toBeCloseTo(2.0e6 / 120, 9);
      expect(r.vectors[0]).toBeCloseTo(1 / Math.sqrt(120), 14); // unit modal mass: m·x² = 1
    });

    it(`${method}: two-DOF spring-mass chain against the quadratic formula`, () => {
      // ground —k1— m1 —k2— m2. det(K − λM) = 0 gives
      // m1 m2 λ² − (m1 k2 + m2 (k1 + k2)) λ + k1 k2 = 0 (derived here; the standard 2-DOF
      // frequency equation), and the mode ratio x2/x1 = k2 / (k2 − λ m2).
      const [k1, k2, m1, m2] = [3.0e5, 1.2e5, 40, 15];
      const K = new Float64Array([k1 + k2, -k2, -k2, k2]);
      const M = new Float64Array([m1, 0, 0, m2]);
      const a = m1 * m2;
      const b = -(m1 * k2 + m2 * (k1 + k2));
      const c = k1 * k2;
      const disc = Math.sqrt(b * b - 4 * a * c);
      const lam = [(-b - disc) / (2 * a), (-b + disc) / (2 * a)];
      const r = denseEigen({ n: 2, data: K }, { n: 2, data: M }, { method });
      for (let j = 0; j < 2; j++) {
        expect(Math.abs(r.eigenvalues[j] - lam[j]) / lam[j]).toBeLessThan(1e-13);
        const ratio = r.vectors[j * 2 + 1] / r.vectors[j * 2];
        expect(Math.abs(ratio - k2 / (k2 - lam[j] * m2))).toBeLessThan(1e-10);
      }
    });

    it(`${method}: free-free three-mass chain has one rigid-body mode ≈ 0, not NaN`, () => {
      // m —k— m —k— m, no supports: K = k·[[1,−1,0],[−1,2,−1],[0,−1,1]], eigenvalues of the
      // bracket are 0, 1, 3 (trace 4, det 0; derived here), so λ = 0, k/m, 3k/m.
      const kk = 5.0e4;
      const mm = 2.5;
      const K = new Float64Array([kk, -kk, 0, -kk, 2 * kk, -kk, 0, -kk, kk]);
      const M = new Float64Array([mm, 0, 0, 0, mm, 0, 0, 0, mm]);
      const r = denseEigen({ n: 3, data: K }, { n: 3, data: M }, { method });
      const normK = 4 * kk; // 1-norm of K: middle column |−k| + 2k + |−k|
      const normM = mm;
      expect(Number.isNaN(r.eigenvalues[0])).toBe(false);
      expect(Math.abs(r.eigenvalues[0])).toBeLessThanOrEqual((1e-8 * normK) / normM);
      expect(r.eigenvalues[1]).toBeCloseTo(kk / mm, 6);
      expect(r.eigenvalues[2]).toBeCloseTo((3 * kk) / mm, 6);
      // rigid-body mode: equal displacements 1/√(3m)
      for (let i = 0; i < 3; i++) expect(Math.abs(r.vectors[i])).toBeCloseTo(1 / Math.sqrt(3 * mm), 10);
      expect(r.orthogonalityError).toBeLessThan(1e-12);
    });

    it(`${method}: massless middle DOF is condensed; only massive modes are returned`, () => {
      // ground —k— m —k— (massless) —k— m —k— ground. The two springs through the massless DOF
      // act in series, k/2 (series springs, any statics text), so
      // K* = [[3k/2, −k/2], [−k/2, 3k/2]], M = m·I → λ = k/m (in phase), 2k/m (out of phase);
      // the massless DOF follows statically: x1 = (x0 + x2)/2.
      const kk = 8.0e3;
      const mm = 4.0;
      const K = new Float64Array([2 * kk, -kk, 0, -kk, 2 * kk, -kk, 0, -kk, 2 * kk]);
      const M = new Float64Array([mm, 0, 0, 0, 0, 0, 0, 0, mm]);
      const r = denseEigen({ n: 3, data: K }, { n: 3, data: M }, { method });
      expect(r.eigenvalues.length).toBe(2); // two massive DOFs → two modes
      expect(r.stats.masslessDofs).toBe(1);
      expect(r.eigenvalues[0]).toBeCloseTo(kk / mm, 8);
      expect(r.eigenvalues[1]).toBeCloseTo((2 * kk) / mm, 8);
      for (let j = 0; j < 2; j++) {
        const x = r.vectors.subarray(j * 3, j * 3 + 3);
        expect(x[1]).toBeCloseTo((x[0] + x[2]) / 2, 12);
        expect(r.residuals[j]).toBeLessThan(1e-12);
      }
      expect(r.orthogonalityError).toBeLessThan(1e-12);
    });
  }

  for (const method of methods) {
    it(`${method}: two unconnected free-free pairs: a repeated zero eigenvalue, M-orthonormal`, () => {
      // Two copies of m —k— m with no supports: each has λ = 0 and λ = 2k/m (K = k[[1,−1],[−1,1]],
      // M = m·I; derived here), so λ = 0 and λ = 2k/m are both double: a test of repeated
      // eigenvalues, rigid-body ones included.
      const kk = 1.0e5;
      const mm = 3.0;
      const K = new Float64Array(16);
      const M = new Float64Array(16);
      for (const o of [0, 2]) {
        K[o * 4 + o] = kk;
        K[(o + 1) * 4 + o + 1] = kk;
        K[o * 4 + o + 1] = -kk;
        K[(o + 1) * 4 + o] = -kk;
        M[o * 4 + o] = mm;
        M[(o + 1) * 4 + o + 1] = mm;
      }
      const r = denseEigen({ n: 4, data: K }, { n: 4, data: M }, { method, residualTolerance: 1e-12 });
      const bound = (1e-8 * 2 * kk) / mm; // |λ| ≤ 1e-8 ‖K‖₁/‖M‖₁
      expect(Math.abs(r.eigenvalues[0])).toBeLessThanOrEqual(bound);
      expect(Math.abs(r.eigenvalues[1])).toBeLessThanOrEqual(bound);
      expect(r.eigenvalues[2]).toBeCloseTo((2 * kk) / mm, 6);
      expect(r.eigenvalues[3]).toBeCloseTo((2 * kk) / mm, 6);
      expect(r.orthogonalityError).toBeLessThan(1e-12);
    });
  }

  it('every DOF massless: no finite modes, an empty result (infinite eigenvalues are never listed)', () => {
    const K = { n: 2, data: new Float64Array([2, -1, -1, 2]) };
    const M = { n: 2, data: new Float64Array(4) };
    for (const method of methods) {
      const r = denseEigen(K, M, { method });
      expect(r.eigenvalues.length).toBe(0);
      expect(r.vectors.length).toBe(0);
      expect(r.stats.masslessDofs).toBe(2);
    }
  });

  it('massless DOFs in a random consistent pair: condensed result equals the ml-matrix route on K*', () => {
    // Reference: K* = K_mm − K_m0 K_00⁻¹ K_0m formed with ml-matrix's `solve` (Bathe 1996,
    // §10.3.1), then ml-matrix's generalized route; data seeded random (invented).
    const n = 10;
    const massless = [2, 5, 9];
    const massive = [0, 1, 3, 4, 6, 7, 8];
    const rand = seeded(4242);
    const k = randomSpd(n, rand, 0.5);
    const m = randomSpd(n, rand, 1.0);
    for (const i of massless) for (let j = 0; j < n; j++) {
      m[i * n + j] = 0;
      m[j * n + i] = 0;
    }
    const K = toMatrix(n, k);
    const kmm = K.selection(massive, massive);
    const km0 = K.selection(massive, massless);
    const k00 = K.selection(massless, massless);
    const kStar = kmm.sub(km0.mmul(solve(k00, km0.transpose())));
    const ref = mlMatrixGeneralized(kStar, toMatrix(n, m).selection(massive, massive));
    for (const method of methods) {
      const r = denseEigen({ n, data: k }, { n, data: m }, { method });
      expect(r.eigenvalues.length).toBe(massive.length);
      expect(maxRelDiff(r.eigenvalues, ref.eigenvalues)).toBeLessThan(1e-10);
      for (const res of r.residuals) expect(res).toBeLessThan(1e-10);
      expect(r.orthogonalityError).toBeLessThan(1e-12);
    }
  });
});

describe('denseEigen: bad input → typed errors with a path', () => {
  const I2 = { n: 2, data: new Float64Array([1, 0, 0, 1]) };
  const catchIt = (f: () => unknown): unknown => {
    try {
      f();
    } catch (e) {
      return e;
    }
    throw new Error('expected a throw');
  };

  it('non-square ml-matrix', () => {
    const e = catchIt(() => denseEigen(new Matrix(2, 3), I2));
    expect(e).toBeInstanceOf(ArgumentError);
    expect((e as ArgumentError).path).toBe('K');
  });
  it('flat data of the wrong length', () => {
    const e = catchIt(() => denseEigen({ n: 2, data: new Float64Array(3) }, I2));
    expect(e).toBeInstanceOf(ArgumentError);
    expect((e as ArgumentError).path).toBe('K.data');
  });
  it('size mismatch between K and M', () => {
    const e = catchIt(() => denseEigen(I2, { n: 3, data: new Float64Array(9) }));
    expect(e).toBeInstanceOf(ArgumentError);
    expect((e as ArgumentError).path).toBe('M');
  });
  it('non-finite entry names the entry', () => {
    const e = catchIt(() => denseEigen(I2, { n: 2, data: new Float64Array([1, 0, 0, Number.NaN]) }));
    expect(e).toBeInstanceOf(ArgumentError);
    expect((e as ArgumentError).path).toBe('M(1, 1)');
    expect((e as ArgumentError).message).toMatch(/NaN/);
  });
  it('non-finite value in a SymmetricCsc', () => {
    const k = fromDenseArray(2, [1, 0, 0, 1]);
    k.values[1] = Number.POSITIVE_INFINITY;
    const e = catchIt(() => denseEigen(k, I2));
    expect(e).toBeInstanceOf(ArgumentError);
    expect((e as ArgumentError).path).toBe('K(1, 1)');
  });
  it('non-symmetric dense matrix', () => {
    const e = catchIt(() => denseEigen({ n: 2, data: new Float64Array([2, 1, 0, 2]) }, I2));
    expect(e).toBeInstanceOf(ArgumentError);
    expect((e as ArgumentError).path).toBe('K(1, 0)');
  });
  it('zero diagonal mass with coupling mass (M indefinite) names the DOF', () => {
    const e = catchIt(() => denseEigen(I2, { n: 2, data: new Float64Array([1, 0.5, 0.5, 0]) }));
    expect(e).toBeInstanceOf(FactorizationError);
    expect((e as FactorizationError).path).toBe('row 1');
  });
  for (const method of methods) {
    it(`${method}: M not positive definite names the DOF`, () => {
      // [[1, 2], [2, 1]] has eigenvalues 3 and −1: indefinite.
      const e = catchIt(() => denseEigen(I2, { n: 2, data: new Float64Array([1, 2, 2, 1]) }, { method }));
      expect(e).toBeInstanceOf(FactorizationError);
      expect((e as FactorizationError).path).toBe('row 1');
    });
  }
  it('massless DOF without stiffness (K_00 singular) names the DOF', () => {
    const K = { n: 3, data: new Float64Array([2, -1, 0, -1, 2, 0, 0, 0, 0]) };
    const M = { n: 3, data: new Float64Array([1, 0, 0, 0, 1, 0, 0, 0, 0]) };
    const e = catchIt(() => denseEigen(K, M));
    expect(e).toBeInstanceOf(FactorizationError);
    expect((e as FactorizationError).path).toBe('row 2');
    expect((e as FactorizationError).message).toMatch(/add stiffness/);
  });
  it('options: count out of range, unknown method, sweep limit', () => {
    const e1 = catchIt(() => denseEigen(I2, I2, { count: 3 }));
    expect(e1).toBeInstanceOf(ArgumentError);
    expect((e1 as ArgumentError).path).toBe('count');
    const e0 = catchIt(() => denseEigen(I2, I2, { count: 1.5 }));
    expect((e0 as ArgumentError).path).toBe('count');
    const e4 = catchIt(() => denseEigen(I2, I2, { residualTolerance: 0 }));
    expect((e4 as ArgumentError).path).toBe('residualTolerance');
    // Infinity turns the self-check off (used by callers that check on their own).
    expect(denseEigen(I2, I2, { residualTolerance: Infinity, orthogonalityTolerance: Infinity }).eigenvalues.length).toBe(2);
    const e5 = catchIt(() => denseEigen(I2, I2, { maxDofs: 1 }));
    expect((e5 as ArgumentError).path).toBe('K');
    const e2 = catchIt(() => denseEigen(I2, I2, { method: 'qr' as 'jacobi' }));
    expect((e2 as ArgumentError).path).toBe('method');
    const rand = seeded(9);
    const n = 20;
    const e3 = catchIt(() => denseEigen({ n, data: randomSpd(n, rand, 0.1) }, { n, data: randomSpd(n, rand, 1) }, { method: 'jacobi', maxSweeps: 1 }));
    expect(e3).toBeInstanceOf(VerificationError);
    expect((e3 as VerificationError).path).toBe('maxSweeps');
  });
});

describe('defaults', () => {
  it('are the documented ones', () => {
    expect(DENSE_EIGEN_DEFAULTS).toEqual({ method: 'cholesky', tolerance: 1e-12, maxSweeps: 50, residualTolerance: 1e-8, orthogonalityTolerance: 1e-10, maxDofs: 8000 });
    expect(JACOBI_DEFAULTS).toEqual({ tolerance: 1e-12, maxSweeps: 50 });
  });
});

describe('symmetricEigen (Householder + QL)', () => {
  it('second-difference matrix tridiag(−1, 2, −1) against its closed form', () => {
    // Source: eigenvalues of the n × n second-difference matrix are 2 − 2cos(kπ/(n+1)),
    // eigenvectors sin(jkπ/(n+1)) (Strang, Introduction to Applied Mathematics §1.5, from memory).
    const n = 40;
    const a = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      a[i * n + i] = 2;
      if (i > 0) a[i * n + i - 1] = a[(i - 1) * n + i] = -1;
    }
    const { values, vectors } = symmetricEigen(n, a);
    for (let k = 1; k <= n; k++) {
      expect(Math.abs(values[k - 1] - (2 - 2 * Math.cos((k * Math.PI) / (n + 1))))).toBeLessThan(1e-13);
      // |cosine| between computed and analytic eigenvector is 1
      let dot = 0;
      let nn = 0;
      for (let j = 0; j < n; j++) {
        const s = Math.sin(((j + 1) * k * Math.PI) / (n + 1));
        dot += s * vectors[(k - 1) * n + j];
        nn += s * s;
      }
      expect(Math.abs(Math.abs(dot) / Math.sqrt(nn) - 1)).toBeLessThan(1e-12);
    }
  });
});
