import { describe, expect, it } from 'vitest';
import { solve } from '../src/eigen/solve';
import { CooBuilder } from '../src/linalg/sparse/symmetric';
import { thrown } from './argument-path';

/**
 * A mass matrix must be positive semidefinite. Two necessary conditions are checked before any
 * solve (linear algebra, e.g. Golub & Van Loan §4.2: a PSD matrix has a non-negative diagonal and
 * non-negative 2 × 2 principal minors, |m_ij| ≤ √(m_ii m_jj)).
 */
function chain(n: number, mass: (b: CooBuilder) => void): { K: ReturnType<CooBuilder['toCsc']>; M: ReturnType<CooBuilder['toCsc']> } {
  const K = new CooBuilder(n);
  const M = new CooBuilder(n);
  for (let i = 0; i < n; i++) {
    K.add(i, i, 2);
    if (i > 0) K.add(i, i - 1, -1);
  }
  mass(M);
  return { K: K.toCsc(), M: M.toCsc() };
}

describe('mass matrices that cannot be positive semidefinite are refused, naming the entry', () => {
  for (const method of ['dense', 'lanczos'] as const) {
    it(`negative diagonal (${method})`, () => {
      const { K, M } = chain(300, (b) => {
        for (let i = 0; i < 300; i++) b.add(i, i, i === 7 ? -1 : 1);
      });
      const e = thrown(() => solve(K, M, { count: 3, method }));
      expect(e.path).toBe('M(7, 7)');
      expect(e.detail).toMatch(/negative.*check the sign/);
    });

    it(`coupling larger than the diagonal allows (${method})`, () => {
      const { K, M } = chain(300, (b) => {
        for (let i = 0; i < 300; i++) b.add(i, i, 1);
        b.add(11, 10, 1.5);
      });
      const e = thrown(() => solve(K, M, { count: 3, method }));
      expect(e.path).toBe('M(11, 10)');
    });
  }

  it('a rank-one lumped inertia block (m_ij² = m_ii m_jj exactly, up to round-off) is accepted', () => {
    // ρIₚL/2 · x xᵀ for a skew member axis x: PSD, singular, no zero rows.
    const x = [1 / Math.sqrt(3), 1 / Math.sqrt(3), 1 / Math.sqrt(3)];
    const { K, M } = chain(3, (b) => {
      for (let i = 0; i < 3; i++) for (let j = 0; j <= i; j++) b.add(i, j, 2 * x[i] * x[j]);
    });
    const r = solve(K, M, { count: 1, method: 'dense' });
    expect(r.eigenvalues).toHaveLength(1);
  });
});
