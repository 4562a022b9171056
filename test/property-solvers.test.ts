/**
 * Property-based tests of `solve` on random sparse symmetric positive definite pairs
 * (test/arbitraries.ts, n from 20 to 300): the sparse methods (shift-invert Lanczos, subspace
 * iteration) against the dense route, the Sturm count against an independent count, and the
 * eigen-decomposition reconstructing K.
 *
 * Sources:
 * - acceptance rule (residual ≤ 1e-8, M-orthonormality ≤ 1e-10, Sturm count): DESIGN.md;
 * - Sylvester's law of inertia: the negative pivots of K − σM count the eigenvalues below σ
 *   (Bathe, Finite Element Procedures, §11.4.3; from memory);
 * - with Φ M-orthonormal and complete, ΦᵀKΦ = Λ and K = M Φ Λ Φᵀ M (spectral theorem for the
 *   symmetric-definite pencil, Golub & Van Loan, 4th ed., §8.7.1; from memory);
 * - eigenvalue perturbation: two backward-stable solvers agree to ~ε·κ; the pairs here are
 *   diagonally dominant (λ_max / λ_min ≲ 1e2), so 1e-8 relative is a loose bound; eigenvectors
 *   are compared only for modes whose relative gap to both neighbours exceeds 1e-3
 *   (Davis–Kahan: vector error ~ ε‖A‖ / gap).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solve } from '../src/eigen/solve';
import { sturmCount } from '../src/eigen/sturm';
import { symmetricMultiply } from '../src/linalg/sparse/symmetric';
import { dense, pairSpecArb, randomPair, rel } from './arbitraries';

const SEED = Number(process.env.FC_SEED ?? 42);
const runs = (n: number) => Number(process.env.FC_RUNS ?? n);

describe('solve on random sparse SPD pairs', () => {
  it('lanczos, subspace and dense agree per mode; Sturm counts match; vectors agree on separated modes', () => {
    fc.assert(
      fc.property(pairSpecArb, fc.integer({ min: 1, max: 16 }), (spec, want) => {
        const { K, M } = randomPair(spec);
        const n = K.n;
        const count = Math.min(want, n);
        const all = solve(K, M, { method: 'dense', count: n });
        const lam = all.eigenvalues;
        for (const method of ['lanczos', 'subspace'] as const) {
          const r = solve(K, M, { method, count });
          expect(r.eigenvalues.length).toBe(count);
          for (let k = 0; k < count; k++) {
            expect(rel(r.eigenvalues[k], lam[k]), `${method} n=${n} mode ${k + 1}`).toBeLessThan(1e-8);
            expect(r.residuals[k]).toBeLessThanOrEqual(1e-8);
          }
          expect(r.orthogonalityError).toBeLessThanOrEqual(1e-10);
          // The solver's own Sturm check ...
          const s = r.sturm!;
          expect(s.passed).toBe(true);
          expect(s.countBelow).toBe(s.returnedBelow + (s.extraBelow ?? 0));
          // ... and an independent one: the dense spectrum says how many λ lie below s.shift.
          expect(s.countBelow).toBe(lam.filter((v) => v < s.shift).length);
          // Mode shapes, up to sign, on well-separated modes: |φᵀ M ψ| = 1.
          const mpsi = new Float64Array(n);
          for (let k = 0; k < count; k++) {
            const gapLo = k === 0 ? Infinity : (lam[k] - lam[k - 1]) / lam[k];
            const gapHi = k + 1 >= n ? Infinity : (lam[k + 1] - lam[k]) / lam[k];
            if (Math.min(gapLo, gapHi) < 1e-3) continue;
            symmetricMultiply(M, all.vectors.subarray(k * n, (k + 1) * n), mpsi);
            let d = 0;
            for (let i = 0; i < n; i++) d += r.vectors[k * n + i] * mpsi[i];
            expect(Math.abs(Math.abs(d) - 1), `${method} mode ${k + 1} shape`).toBeLessThan(1e-7);
          }
        }
        // Sturm count at a shift between λ_count and λ_count+1 is exactly count.
        if (count < n && lam[count] - lam[count - 1] > 1e-6 * lam[count]) {
          expect(sturmCount(K, M, 0.5 * (lam[count - 1] + lam[count]))).toBe(count);
        }
      }),
      { seed: SEED, numRuns: runs(5) },
    );
  });

  it('all modes by the dense route: ΦᵀMΦ = I, ΦᵀKΦ = Λ, and K = MΦΛΦᵀM (reconstruction)', () => {
    fc.assert(
      fc.property(pairSpecArb.map((s) => ({ ...s, n: 20 + (s.n % 50) })), (spec) => {
        const { K, M } = randomPair(spec);
        const n = K.n;
        for (const method of ['cholesky', 'jacobi'] as const) {
          const r = solve(K, M, { method, count: n });
          const Kd = dense(K);
          const Md = dense(M);
          // Φ as an ml-matrix (columns = modes).
          const Phi = dense(K).clone();
          for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) Phi.set(i, j, r.vectors[j * n + i]);
          const PtKP = Phi.transpose().mmul(Kd).mmul(Phi);
          const normK = Kd.norm('frobenius');
          for (let i = 0; i < n; i++) {
            for (let j = 0; j < n; j++) {
              const want = i === j ? r.eigenvalues[i] : 0;
              expect(Math.abs(PtKP.get(i, j) - want)).toBeLessThan(1e-10 * normK);
            }
          }
          const MP = Md.mmul(Phi);
          const L = MP.clone();
          for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) L.set(i, j, MP.get(i, j) * r.eigenvalues[j]);
          const Krec = L.mmul(MP.transpose());
          expect(Krec.sub(Kd).norm('frobenius')).toBeLessThan(1e-10 * normK);
        }
      }),
      { seed: SEED, numRuns: runs(8) },
    );
  });

  it('modes in a range and modes near a target: exactly the Sturm-counted set, same values as dense', () => {
    fc.assert(
      fc.property(pairSpecArb.map((s) => ({ ...s, n: 100 + (s.n % 120) })), fc.integer({ min: 2, max: 30 }), fc.integer({ min: 1, max: 12 }), (spec, lo, width) => {
        const { K, M } = randomPair(spec);
        const n = K.n;
        const lam = solve(K, M, { method: 'dense', count: n }).eigenvalues;
        // A window between two eigenvalues (midpoints), so no end sits on an eigenvalue.
        const a = 0.5 * (lam[lo - 1] + lam[lo]);
        const hiIdx = Math.min(lo + width, n - 1);
        const b = 0.5 * (lam[hiIdx - 1] + lam[hiIdx]);
        fc.pre(b > a);
        const expected = Array.from(lam).filter((v) => v >= a && v <= b);
        for (const method of ['lanczos', 'subspace'] as const) {
          const r = solve(K, M, { method, range: [a, b] });
          expect(r.eigenvalues.length, `${method} range count`).toBe(expected.length);
          for (let k = 0; k < expected.length; k++) expect(rel(r.eigenvalues[k], expected[k])).toBeLessThan(1e-8);
          expect(r.sturm!.passed).toBe(true);
          const target = lam[lo];
          const near = solve(K, M, { method, near: target * (1 + 1e-4), count: 3 });
          expect(near.eigenvalues.some((v) => rel(v, target) < 1e-8), `${method} near ${target}`).toBe(true);
          expect(near.sturm!.passed).toBe(true);
        }
      }),
      { seed: SEED, numRuns: runs(4) },
    );
  });
});
