/**
 * Determinism: the same input gives bit-identical results, run after run (STYLE.md §4: every
 * random start vector is seeded). Checked for Lanczos and subspace iteration (the methods with
 * random starts), the dense route, `modalAnalysis`, and the CLI's JSON output. Inputs are
 * rebuilt from scratch for the second run, so no state can leak through shared buffers.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../src/cli/run';
import { solve } from '../src/eigen/solve';
import { modalAnalysis } from '../src/modal/analysis';
import { assemble } from '../src/model/assemble';
import { modelArb, pairSpecArb, randomPair } from './arbitraries';

/** Bitwise equality of two Float64Arrays (NaN-safe, distinguishes −0 from 0). */
function sameBits(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  const x = new BigUint64Array(a.buffer, a.byteOffset, a.length);
  const y = new BigUint64Array(b.buffer, b.byteOffset, b.length);
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return false;
  return true;
}

describe('determinism', () => {
  it('solve: lanczos, subspace and dense give bit-identical eigenvalues and vectors on a repeat run', () => {
    fc.assert(
      fc.property(pairSpecArb.map((s) => ({ ...s, n: 20 + (s.n % 160) })), fc.integer({ min: 1, max: 12 }), (spec, count) => {
        for (const method of ['lanczos', 'subspace', 'dense'] as const) {
          const first = randomPair(spec);
          const a = solve(first.K, first.M, { method, count });
          const again = randomPair(spec);
          const b = solve(again.K, again.M, { method, count });
          expect(sameBits(a.eigenvalues, b.eigenvalues), `${method} eigenvalues`).toBe(true);
          expect(sameBits(a.vectors, b.vectors), `${method} vectors`).toBe(true);
          expect(sameBits(a.residuals, b.residuals), `${method} residuals`).toBe(true);
        }
      }),
      { seed: 42, numRuns: 5 },
    );
  });

  it('solve: the same seed gives the same bits after other solves ran in between; near and range too', () => {
    const spec = { n: 200, perRow: 2, seed: 7, mass: 'banded' as const };
    const { K, M } = randomPair(spec);
    const runs = () => [
      solve(K, M, { method: 'lanczos', count: 10, seed: 5 }).eigenvalues,
      solve(K, M, { method: 'subspace', count: 10, seed: 5 }).eigenvalues,
      solve(K, M, { method: 'lanczos', near: 3, count: 4 }).eigenvalues,
      solve(K, M, { method: 'lanczos', range: [1, 1.2] }).eigenvalues,
      solve(K, M, { method: 'subspace', range: [1, 1.05] }).eigenvalues,
    ];
    const a = runs();
    // Something else in between (other sizes, other seeds) must not change the next result.
    const other = randomPair({ n: 90, perRow: 1, seed: 3, mass: 'diagonal' });
    solve(other.K, other.M, { method: 'lanczos', count: 7, seed: 99 });
    solve(other.K, other.M, { method: 'subspace', count: 3 });
    const b = runs();
    for (let i = 0; i < a.length; i++) expect(sameBits(a[i], b[i]), `call ${i}`).toBe(true);
  });

  it('modalAnalysis on random models: frequencies and participation bit-identical on a repeat run (lanczos and subspace)', () => {
    fc.assert(
      fc.property(modelArb('consistent'), ({ model }) => {
        for (const method of ['lanczos', 'subspace'] as const) {
          const count = Math.min(5, assemble(model).stiffness.n);
          const a = modalAnalysis(structuredClone(model), { count, method });
          const b = modalAnalysis(structuredClone(model), { count, method });
          expect(sameBits(Float64Array.from(a.modes, (m) => m.frequency), Float64Array.from(b.modes, (m) => m.frequency))).toBe(true);
          expect(a.modes.map((m) => m.effectiveMass)).toEqual(b.modes.map((m) => m.effectiveMass));
          expect(sameBits(a.eigen.vectors, b.eigen.vectors)).toBe(true);
        }
      }),
      { seed: 42, numRuns: 8 },
    );
  });

  describe('CLI', () => {
    const dir = mkdtempSync(join(tmpdir(), 'eigenframe-determinism-'));
    afterAll(() => rmSync(dir, { recursive: true, force: true }));

    it('eigenframe modes --json: the same modes, bit for bit, twice (lanczos)', () => {
      const [{ model }] = fc.sample(modelArb('consistent'), { seed: 42, numRuns: 1 });
      const file = join(dir, 'model.json');
      writeFileSync(file, JSON.stringify(model));
      const run = () => {
        const r = runCli(['modes', file, '--count', '4', '--method', 'lanczos', '--json']);
        expect(r.status, r.stderr).toBe(0);
        return (JSON.parse(r.stdout) as { modes: unknown[] }).modes;
      };
      const a = run();
      expect(a).toHaveLength(4);
      expect(run()).toEqual(a); // JSON numbers print the shortest round-trip decimal: equal text ⇔ equal bits
    });
  });
});
