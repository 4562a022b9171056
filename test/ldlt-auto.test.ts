/**
 * `ordering: 'auto'` in src/linalg/ldlt/analyse.ts: the candidate scan stops once the best
 * factorization is cheaper than computing another ordering (AUTO_ENOUGH_FLOPS_PER_ENTRY);
 * small patterns keep trying every candidate.
 */
import { describe, expect, it } from 'vitest';
import { analyse, AUTO_CANDIDATES, AUTO_ENOUGH_FLOPS_PER_ENTRY, AUTO_ENOUGH_MIN_N } from '../src/linalg/ldlt/analyse';
import { CooBuilder } from '../src/linalg/sparse/symmetric';

/** Tridiagonal pattern of a fixed-free spring chain (k = 1 per spring), n × n. */
function chain(n: number) {
  const a = new CooBuilder(n);
  for (let i = 0; i < n; i++) {
    a.add(i, i, i === n - 1 ? 1 : 2);
    if (i + 1 < n) a.add(i + 1, i, -1);
  }
  return a.toCsc();
}

describe("analyse, ordering 'auto'", () => {
  it('a long chain (n = 12,000) stops after minimum degree: its factor costs fewer flops than another ordering', () => {
    const n = 12000;
    expect(n).toBeGreaterThanOrEqual(AUTO_ENOUGH_MIN_N);
    const a = chain(n);
    const sym = analyse(a);
    // A tridiagonal matrix factors with no fill under minimum degree: nnz(L) = n − 1 and 3(n − 1)
    // flops (Davis 2006, §7.1: a path graph has an elimination order without fill), far below
    // AUTO_ENOUGH_FLOPS_PER_ENTRY · nnz(pattern) = 1000 · (2n − 1).
    expect(sym.candidates?.map((c) => c.ordering)).toEqual([AUTO_CANDIDATES[0]]);
    expect(sym.nnzL).toBe(n - 1);
    expect(sym.flops).toBeLessThan(AUTO_ENOUGH_FLOPS_PER_ENTRY * a.colPtr[n]);
  });

  it('small patterns still try every candidate', () => {
    const a = chain(500);
    expect(analyse(a).candidates?.length).toBe(AUTO_CANDIDATES.length);
  });
});
