/** Helpers of the benchmark report: the log–log least-squares growth exponent and table cells. */
import { describe, expect, it } from 'vitest';
import { growthExponent } from '../bench/fit';
import { maxRelativeDifference, renderTable } from '../bench/table';

describe('growthExponent', () => {
  it('recovers p exactly from y = c·xᵖ (a power law is a straight line in log–log)', () => {
    const x = [1500, 4704, 11664, 23232, 40560];
    for (const p of [1, 1.5, 2.3]) expect(growthExponent(x, x.map((v) => 0.003 * v ** p))).toBeCloseTo(p, 12);
  });
  it('matches the closed-form least-squares slope on noisy data', () => {
    // Source: OLS slope b = Σ(u−ū)(v−v̄)/Σ(u−ū)², u = ln x, v = ln y; here u = ln 1, ln e, ln e²
    // = 0, 1, 2 and v = 0, 2, 3 give b = ((−1)(−5/3) + 0 + (1)(4/3)) / 2 = 1.5 (hand computed).
    expect(growthExponent([1, Math.E, Math.E ** 2], [1, Math.E ** 2, Math.E ** 3])).toBeCloseTo(1.5, 12);
  });
  it('is NaN with fewer than two usable points', () => {
    expect(growthExponent([100], [1])).toBeNaN();
    expect(growthExponent([100, 200], [1, Number.NaN])).toBeNaN();
  });
});

describe('report cells', () => {
  it('maxRelativeDifference is the largest |a − b| / |b|', () => {
    expect(maxRelativeDifference([1, 2.002, 3], [1, 2, 3.0003])).toBeCloseTo(0.001, 12);
    expect(maxRelativeDifference([], [1])).toBeNaN();
  });
  it('renderTable aligns every column to its widest cell', () => {
    const t = renderTable(['case', 'DOF'], [['a', '1,500'], ['longer', '7']]).split('\n');
    expect(t.map((l) => l.length)).toEqual([13, 13, 13, 13]);
    expect(t[3]).toBe('longer      7');
  });
});
