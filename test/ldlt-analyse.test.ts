/**
 * analyse (src/linalg/ldlt/analyse.ts) with minimum degree takes the elimination tree and column
 * counts from the ordering's block elimination instead of a second symbolic pass over the full
 * pattern; the result must be the one the full pass gives for the same permutation.
 */
import { describe, expect, it } from 'vitest';
import { analyse, type SupernodalSymbolic } from '../src/linalg/ldlt/analyse';
import { factorize } from '../src/linalg/ldlt/factorize';
import { symbolicFill } from '../src/linalg/ordering';
import type { SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { buildingFrame } from './ldlt-helpers';
import { buildingPattern, footbridgePattern, randomPattern } from './ordering-helpers';

const FIELDS = ['perm', 'pinv', 'superStart', 'superOf', 'rowPtr', 'rows', 'lxPtr', 'lxPos', 'diagPos'] as const;

function expectSameSymbolic(a: SupernodalSymbolic, b: SupernodalSymbolic): void {
  for (const f of FIELDS) expect(Array.from(a[f]), f).toEqual(Array.from(b[f]));
  for (const f of ['n', 'nnzL', 'flops', 'supernodes', 'patternNnz', 'maxCols', 'maxRows', 'maxBlock'] as const) expect(a[f], f).toBe(b[f]);
}

describe('analyse: minimum degree from its block elimination', () => {
  const cases: [string, SymmetricCsc][] = [
    ['frame, 6 indistinguishable DOFs per node', buildingFrame({ bx: 3, by: 3, bz: 4 }, 2).K],
    ['frame pattern with dense node blocks', buildingPattern(3, 3, 5)],
    ['long truss (node groupings skipped)', footbridgePattern(400)],
    ['random pattern (nothing merges)', randomPattern(400, 5, 11)],
  ];
  for (const [name, a] of cases) {
    it(`${name}: the same factor structure as the full symbolic pass on its permutation`, () => {
      const viaBlocks = analyse(a, { ordering: 'amd' }) as SupernodalSymbolic;
      // An explicit permutation goes through the full pass (etree and column counts of P A Pᵀ,
      // Davis 2006 §4.1–4.5); the permutation is already postordered, so it comes back unchanged.
      const viaFull = analyse(a, { ordering: viaBlocks.perm }) as SupernodalSymbolic;
      expectSameSymbolic(viaBlocks, viaFull);
      // Independent count by row subtrees (src/linalg/ordering/fill.ts symbolicFill).
      const ref = symbolicFill(a, viaBlocks.perm);
      expect(viaBlocks.nnzL).toBe(ref.nnzL);
      expect(viaBlocks.flops).toBe(ref.flops);
    });
  }

  it("'auto' on the long truss stops after minimum degree, with the same factor as 'amd'", () => {
    const a = footbridgePattern(400);
    const auto = analyse(a) as SupernodalSymbolic;
    expect(auto.candidates?.map((c) => c.ordering)).toEqual(['amd']);
    expectSameSymbolic(auto, analyse(a, { ordering: 'amd' }) as SupernodalSymbolic);
  });

  it('the analysed frame factorizes: K x = b to round-off', () => {
    const { K } = buildingFrame({ bx: 2, by: 3, bz: 4 }, 3);
    const f = factorize(analyse(K, { ordering: 'amd' }), K.values);
    const b = new Float64Array(K.n).fill(1);
    const x = new Float64Array(K.n);
    f.solve(b, x);
    // residual ‖K x − b‖∞ / ‖b‖∞ from the stored lower triangle
    const r = Float64Array.from(b, (v) => -v);
    for (let j = 0; j < K.n; j++) {
      for (let p = K.colPtr[j]; p < K.colPtr[j + 1]; p++) {
        const i = K.rowIdx[p];
        r[i] += K.values[p] * x[j];
        if (i !== j) r[j] += K.values[p] * x[i];
      }
    }
    expect(Math.max(...r.map(Math.abs))).toBeLessThan(1e-9);
  });
});
