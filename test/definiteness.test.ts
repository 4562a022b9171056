/**
 * The complete check that a mass matrix is positive semidefinite (src/eigen/definiteness.ts):
 * an LDLᵀ inertia count of D^{-1/2} M D^{-1/2} + δI (Sylvester's law of inertia) where the
 * O(nnz) tests prove nothing. Expected eigenvalues are derived in each test; random cases are
 * checked against ml-matrix's dense symmetric eigendecomposition (the reference library).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { checkMassSemidefinite, MASS_CHECK_DEFAULTS, MASS_DEFINITENESS_TOLERANCE } from '../src/eigen/definiteness';
import { solve } from '../src/eigen/solve';
import { ArgumentError } from '../src/errors';
import { CooBuilder, fromDenseArray, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { assemble } from '../src/model/assemble';
import { planeBeamModel } from './model-helpers';
import { thrown } from './argument-path';

/**
 * S(c) = I + c·B, B = [[0, 1, 1], [1, 0, −1], [1, −1, 0]]. B's characteristic polynomial is
 * −μ³ + 3μ − 2 = −(μ − 1)²(μ + 2) (derived here: det(B − μI) with b₁₂b₁₃b₂₃ = −1), so S(c) has
 * eigenvalues 1 + c (twice) and 1 − 2c. Its diagonal is 1 and every 2 × 2 minor is 1 − c² > 0
 * for |c| < 1: the O(nnz) tests cannot see that it is indefinite for c > 1/2.
 */
function blockS(c: number): number[] {
  return [1, c, c, c, 1, -c, c, -c, 1];
}

/** An n-DOF chain (K tridiagonal 2, −1) with unit masses, and `block` (3 × 3, row-major, scaled by d) at rows at..at+2 of M. */
function chainWithBlock(n: number, at: number, block: number[], d: [number, number, number] = [1, 1, 1]): { K: SymmetricCsc; M: SymmetricCsc } {
  const K = new CooBuilder(n);
  const M = new CooBuilder(n);
  for (let i = 0; i < n; i++) {
    K.add(i, i, 2);
    if (i > 0) K.add(i, i - 1, -1);
    if (i < at || i > at + 2) M.add(i, i, 1);
  }
  for (let r = 0; r < 3; r++) for (let c = 0; c <= r; c++) M.add(at + r, at + c, block[3 * r + c] * Math.sqrt(d[r] * d[c]));
  return { K: K.toCsc(), M: M.toCsc() };
}

describe('an indefinite mass matrix whose diagonal and 2 × 2 minors are all positive is refused', () => {
  // S(0.9): eigenvalues 1.9, 1.9, −0.8 (blockS above); minors 1 − 0.81 = 0.19 > 0.
  for (const method of ['dense', 'lanczos', 'subspace'] as const) {
    it(`S(0.9) inside a 300-DOF chain (${method}): path M, one negative eigenvalue, the fix`, () => {
      const { K, M } = chainWithBlock(300, 40, blockS(0.9));
      const e = thrown(() => solve(K, M, { count: 3, method }));
      expect(e.path).toBe('M');
      expect(e.detail).toMatch(/not positive semidefinite: it has 1 negative eigenvalue/);
      expect(e.detail).toMatch(/check the signs of its coupling \(off-diagonal\) masses/);
    });
  }

  it('units do not hide it: the same block on kg (1000) and kg·m² (1e-3) diagonals', () => {
    // M = D^{1/2} S(0.9) D^{1/2} is congruent to S(0.9): one negative eigenvalue (Sylvester),
    // although its size relative to max m_ii is tiny.
    const { M } = chainWithBlock(20, 5, blockS(0.9), [1000, 1000, 1e-3]);
    const e = thrown(() => checkMassSemidefinite(M));
    expect(e.path).toBe('M');
    expect(e.detail).toMatch(/1 negative eigenvalue/);
  });

  it('two indefinite blocks: the count is 2', () => {
    const n = 12;
    const b = new CooBuilder(n);
    const S = blockS(0.9);
    for (const at of [0, 6]) for (let r = 0; r < 3; r++) for (let c = 0; c <= r; c++) b.add(at + r, at + c, S[3 * r + c]);
    for (const i of [3, 4, 5, 9, 10, 11]) b.add(i, i, 2);
    const e = thrown(() => checkMassSemidefinite(b.toCsc()));
    expect(e.detail).toMatch(/it has 2 negative eigenvalue/);
  });

  it('δ separates round-off from a real negative eigenvalue: 1 − 2c = −1e-9 is refused, −1e-14 is accepted', () => {
    // δ = MASS_DEFINITENESS_TOLERANCE = 1e-12 (relative to the scaled unit diagonal).
    expect(MASS_DEFINITENESS_TOLERANCE).toBe(1e-12);
    const refused = chainWithBlock(9, 3, blockS(0.5 + 0.5e-9)).M;
    expect(thrown(() => checkMassSemidefinite(refused)).path).toBe('M');
    const accepted = chainWithBlock(9, 3, blockS(0.5 + 0.5e-14)).M;
    expect(checkMassSemidefinite(accepted).provedBy).toBe('factorization');
  });
});

describe('semidefinite mass matrices pass, singular ones included', () => {
  it('S(0.5) (eigenvalues 1.5, 1.5, 0: singular, no zero row) passes; its scaled row sums are exactly 1 (Gershgorin)', () => {
    expect(checkMassSemidefinite(chainWithBlock(30, 10, blockS(0.5)).M).provedBy).toBe('diagonal dominance');
  });

  it('a rank-one lumped inertia block x·xᵀ beside a massless DOF, with a round-off coupling to it', () => {
    // ρIₚL/2 · x xᵀ for a skew member axis x (eigenvalues 2, 0, 0), plus a DOF with no mass whose
    // coupling 1e-300 is round-off (stage 1 allows ≤ 1e-14 · max m_ii): semidefinite.
    const x = [1 / Math.sqrt(3), 1 / Math.sqrt(3), 1 / Math.sqrt(3)];
    const b = new CooBuilder(5);
    for (let i = 0; i < 3; i++) for (let j = 0; j <= i; j++) b.add(i, j, 2 * x[i] * x[j]);
    b.add(4, 4, 1);
    b.add(4, 3, 1e-300);
    expect(checkMassSemidefinite(b.toCsc()).provedBy).toBe('factorization');
  });

  it('a lumped (diagonal) mass is proved by the O(nnz) stage, with no factorization', () => {
    const a = assemble({ ...planeBeamModel({ elements: 10, L: 3, E: 2.1e11, density: 7850, A: 1e-3, I: 1e-6, left: ['uy', 'rz'], right: [] }), mass: 'lumped' });
    expect(checkMassSemidefinite(a.mass).provedBy).toBe('diagonal dominance');
  });

  it('a consistent beam mass is not diagonally dominant after scaling: the factorization proves it', () => {
    // Cubic beam mass (ρAL/420)[156 22L 54 −13L; …; 4L² …]: |22L|/√(156·4L²) = 0.88 plus the
    // other couplings exceed 1 in the rotation rows, so stage 2 cannot prove it.
    const a = assemble(planeBeamModel({ elements: 10, L: 3, E: 2.1e11, density: 7850, A: 1e-3, I: 1e-6, left: ['uy', 'rz'], right: [] }));
    expect(checkMassSemidefinite(a.mass).provedBy).toBe('factorization');
    expect(checkMassSemidefinite(a.mass, { check: 'minors' }).provedBy).toBe('minors');
    // And the solve accepts it either way, with the same eigenvalues.
    const r1 = solve(a.stiffness, a.mass, { count: 3 });
    const r2 = solve(a.stiffness, a.mass, { count: 3, massCheck: 'minors' });
    expect(Array.from(r2.eigenvalues)).toEqual(Array.from(r1.eigenvalues));
  });
});

describe('agreement with ml-matrix on random 6 × 6 matrices that pass the 2 × 2 test', () => {
  it('refused exactly when the smallest eigenvalue of D^-1/2 M D^-1/2 (ml-matrix) is below −δ', () => {
    // Seeded linear congruential generator (Numerical Recipes constants, from memory).
    let state = 12345;
    const rand = () => {
      state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
      return state / 2 ** 32;
    };
    const n = 6;
    let refused = 0;
    let accepted = 0;
    for (let trial = 0; trial < 200; trial++) {
      const d = Array.from({ length: n }, () => 10 ** (6 * rand() - 3)); // diagonals over 6 decades
      const s = new Array<number>(n * n).fill(0);
      const density = rand();
      for (let i = 0; i < n; i++) {
        s[i * n + i] = 1;
        for (let j = 0; j < i; j++) if (rand() < density) s[i * n + j] = s[j * n + i] = 0.95 * (2 * rand() - 1);
      }
      const m = s.map((v, k) => v * Math.sqrt(d[Math.floor(k / n)] * d[k % n]));
      const ref = Math.min(...new EigenvalueDecomposition(new Matrix(Array.from({ length: n }, (_, i) => s.slice(i * n, i * n + n))), { assumeSymmetric: true }).realEigenvalues);
      if (Math.abs(ref) < 1e-9) continue; // too close to the boundary to call either way
      const M = fromDenseArray(n, m);
      let threw = false;
      try {
        checkMassSemidefinite(M);
      } catch (e) {
        expect(e).toBeInstanceOf(ArgumentError);
        expect((e as ArgumentError).path).toBe('M');
        threw = true;
      }
      expect(threw, `trial ${trial}: λ_min(S) = ${ref}`).toBe(ref < 0);
      if (threw) refused++;
      else accepted++;
    }
    // Not vacuous: both outcomes occur.
    expect(refused).toBeGreaterThan(10);
    expect(accepted).toBeGreaterThan(10);
  });
});

describe('options and stiffness entries', () => {
  it('defaults: the complete check, with the solver\'s ordering and memory limit', () => {
    expect(MASS_CHECK_DEFAULTS).toEqual({ check: 'complete', ordering: 'auto', maxFactorBytes: 8 * 2 ** 30 });
    // solve() leaves massCheck unset, so MASS_CHECK_DEFAULTS.check applies: S(0.9) is refused.
    const { K, M } = chainWithBlock(10, 2, blockS(0.9));
    expect(thrown(() => solve(K, M, { count: 1 })).path).toBe('M');
  });

  it('an unknown massCheck is an ArgumentError naming the option', () => {
    const { K, M } = chainWithBlock(10, 2, blockS(0.2));
    const e = thrown(() => solve(K, M, { count: 1, massCheck: 'full' as never }));
    expect(e.path).toBe('massCheck');
    expect(e.detail).toMatch(/'complete'.*'minors'/);
  });

  it("massCheck: 'minors' skips the factorization: the indefinite S(0.9) is then not refused by validation", () => {
    const { M } = chainWithBlock(30, 10, blockS(0.9));
    expect(checkMassSemidefinite(M, { check: 'minors' }).provedBy).toBe('minors');
  });

  it('a non-finite stiffness entry names K(i, j)', () => {
    const { K, M } = chainWithBlock(10, 2, blockS(0.2));
    K.values[K.colPtr[4]] = NaN; // diagonal entry of column 4
    const e = thrown(() => solve(K, M, { count: 1 }));
    expect(e.path).toBe('K(4, 4)');
    expect(e.detail).toMatch(/is NaN; a stiffness matrix holds finite numbers/);
  });
});
