/**
 * compareValues and parseResults on good and bad input. Values here are small hand-made lists
 * (test data, not results); the expected errors follow from the definition in compare.ts.
 */
import { describe, expect, it } from 'vitest';
import { compareValues, parseResults } from '../src/reference/compare';
import { thrown } from './argument-path';

describe('compareValues', () => {
  it('gives the per-mode relative error and passes within tolerance', () => {
    const r = compareValues([10, 20, 40], [10.001, 19.99, 40], 1e-3);
    expect(r.rows.map((x) => x.relativeError)).toEqual([expect.closeTo(1e-4, 12), expect.closeTo(5e-4, 12), 0]);
    expect(r.passed).toBe(true);
    expect(r.missing).toBe(0);
    expect(r.extra).toEqual([]);
    expect(r.maxRelativeError).toBeCloseTo(5e-4, 12);
  });

  it('fails one mode outside tolerance and says which', () => {
    const r = compareValues([10, 20], [10, 20.1], 1e-3);
    expect(r.passed).toBe(false);
    expect(r.rows.map((x) => x.passed)).toEqual([true, false]);
    expect(r.rows[1].relativeError).toBeCloseTo(5e-3, 12);
  });

  it('counts missing modes as failures and lists extra ones unchecked', () => {
    const short = compareValues([1, 2, 3], [1, 2], 1e-3);
    expect(short.missing).toBe(1);
    expect(short.rows[2]).toEqual({ mode: 3, expected: 3, actual: null, relativeError: null, passed: false });
    expect(short.passed).toBe(false);
    const long = compareValues([1, 2], [1, 2, 3, 4], 1e-3);
    expect(long.extra).toEqual([3, 4]);
    expect(long.passed).toBe(true);
  });

  it('measures a rigid-body mode (expected 0) against the largest expected value', () => {
    const r = compareValues([0, 0, 50], [1e-4, -0.0, 50], 1e-3);
    expect(r.rows[0].relativeError).toBeCloseTo(2e-6, 15);
    expect(r.passed).toBe(true);
    expect(compareValues([0, 100], [0.2, 100], 1e-3).passed).toBe(false);
  });

  it('rejects non-finite values and a bad tolerance, naming the item', () => {
    expect(thrown(() => compareValues([1, NaN], [1, 2], 1e-3)).path).toBe('expected[1]');
    expect(thrown(() => compareValues([1, 2], [1, Infinity], 1e-3)).path).toBe('actual[1]');
    expect(thrown(() => compareValues([1], [1], 0)).path).toBe('tolerance');
    expect(thrown(() => compareValues([1], [1], NaN)).path).toBe('tolerance');
    expect(thrown(() => compareValues([], [1], 1e-3)).path).toBe('expected');
  });
});

describe('parseResults', () => {
  it('reads plain text, one number per line, with comments and blank lines', () => {
    const text = '# frequencies from my solver, Hz\n5.1775\n\n 32.44 # second\n9.0852e1\r\n';
    expect(parseResults(text, 'r.txt', 'frequency')).toEqual([5.1775, 32.44, 90.852]);
  });

  it('names the line of a bad entry in plain text', () => {
    const e = thrown(() => parseResults('1.0\n2.0\nabc\n', 'r.txt', 'frequency'));
    expect(e.path).toBe('r.txt:3');
    expect(e.detail).toContain('"abc" is not a number');
    expect(thrown(() => parseResults('1.0 2.0\n', 'r.txt', 'frequency')).path).toBe('r.txt:1');
  });

  it('reads a JSON array of numbers', () => {
    expect(parseResults('[1.5, 2.5, 3]', 'r.json', 'frequency')).toEqual([1.5, 2.5, 3]);
    expect(thrown(() => parseResults('[1.5, "x"]', 'r.json', 'frequency')).path).toBe('r.json:[1]');
  });

  it('reads eigenframe --json output: frequency, else eigenvalue turned into Hz', () => {
    const json = JSON.stringify({ format: 'eigenframe-modes/1', modes: [{ mode: 1, eigenvalue: -1e-9, frequency: 0 }, { mode: 2, eigenvalue: (2 * Math.PI * 3) ** 2 }] });
    const v = parseResults(json, 'r.json', 'frequency');
    expect(v[0]).toBe(0);
    expect(v[1]).toBeCloseTo(3, 12);
  });

  it('reads buckling factors from loadFactor or eigenvalue', () => {
    expect(parseResults('{"modes":[{"loadFactor":0.25},{"eigenvalue":2.25}]}', 'b.json', 'buckling')).toEqual([0.25, 2.25]);
    expect(thrown(() => parseResults('{"modes":[{"frequency":1}]}', 'b.json', 'buckling')).path).toBe('b.json:modes[0]');
  });

  it('names the JSON path or line of a bad entry', () => {
    expect(thrown(() => parseResults('{"modes":[{"frequency":1},{"frequency":"2"}]}', 'r.json', 'frequency')).path).toBe('r.json:modes[1].frequency');
    expect(thrown(() => parseResults('{"modes":[{"period":1}]}', 'r.json', 'frequency')).path).toBe('r.json:modes[0]');
    expect(thrown(() => parseResults('{"modes":[3]}', 'r.json', 'frequency')).path).toBe('r.json:modes[0]');
    expect(thrown(() => parseResults('{"frequencies":[1]}', 'r.json', 'frequency')).path).toBe('r.json');
    const syntax = thrown(() => parseResults('[\n1,\n2,,\n3]', 'r.json', 'frequency'));
    expect(syntax.path).toBe('r.json:3');
    expect(syntax.detail).toContain('not valid JSON');
  });

  it('rejects an empty file', () => {
    expect(thrown(() => parseResults('# nothing\n\n', 'r.txt', 'frequency')).detail).toContain('no values');
    expect(thrown(() => parseResults('[]', 'r.json', 'frequency')).path).toBe('r.json');
  });
});
