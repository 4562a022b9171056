import { describe, expect, it } from 'vitest';
import { readMatrixMarket, writeMatrixMarket, READ_MATRIX_MARKET_DEFAULTS } from '../src/io/matrix-market';
import { writeDofMap, DOF_MAP_DEFAULTS } from '../src/io/matrix-market-dofs';
import { ArgumentError, MatrixMarketError } from '../src/errors';
import { CooBuilder, toDenseArray, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { mulberry32 as rng } from '../src/linalg/random';
import { thrown } from './argument-path';

// Format reference throughout: Boisvert, Pozo, Remington, "The Matrix Market Exchange Formats:
// Initial Design", NISTIR 5935 (1996): banner "%%MatrixMarket matrix <format> <field>
// <symmetry>", '%' comment lines, a size line, then 1-based entries; symmetric files store one
// triangle.

/** Catches the MatrixMarketError of fn, failing if another error (or none) is thrown. */
const mmError = (fn: () => unknown): MatrixMarketError => thrown(fn, MatrixMarketError);

const dense = (a: SymmetricCsc) => Array.from(toDenseArray(a));


describe('readMatrixMarket: accepted files', () => {
  it('coordinate real symmetric, lower triangle, comments and blank lines', () => {
    const text = [
      '%%MatrixMarket matrix coordinate real symmetric',
      '% a 3 × 3 stiffness',
      '',
      '3 3 5',
      '1 1 4.0',
      '2 1 -1',
      '2 2 4e0',
      '3 2 -1.0E+00',
      '   3   3   .4e1  ',
    ].join('\n');
    const a = readMatrixMarket(text, 'K.mtx');
    expect(a.n).toBe(3);
    expect(Array.from(a.colPtr)).toEqual([0, 2, 4, 5]);
    expect(dense(a)).toEqual([4, -1, 0, -1, 4, -1, 0, -1, 4]);
  });

  it('symmetric file given by its upper triangle is mirrored; CRLF line ends', () => {
    const text = '%%MatrixMarket matrix coordinate real symmetric\r\n2 2 3\r\n1 1 2\r\n1 2 -0.5\r\n2 2 3\r\n';
    expect(dense(readMatrixMarket(text))).toEqual([2, -0.5, -0.5, 3]);
  });

  it('coordinate real general that is symmetric within tolerance keeps the mean', () => {
    const text = '%%MatrixMarket matrix coordinate real general\n2 2 4\n1 1 1\n2 1 0.3\n1 2 0.30000000000000004\n2 2 1\n';
    const a = readMatrixMarket(text);
    expect(a.values.length).toBe(3);
    expect(Math.abs(toDenseArray(a)[1] - 0.3)).toBeLessThan(1e-16);
  });

  it('a leading byte-order mark is skipped', () => {
    expect(dense(readMatrixMarket('\uFEFF%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 2.5\n'))).toEqual([2.5]);
  });

  it('coordinate integer field; keywords in any case', () => {
    const text = '%%MatrixMarket MATRIX Coordinate Integer Symmetric\n2 2 2\n1 1 7\n2 2 -3\n';
    expect(dense(readMatrixMarket(text))).toEqual([7, 0, 0, -3]);
  });

  it('array real general and array real symmetric (column-major, lower triangle)', () => {
    // Column-major order of array data, NISTIR 5935 §"array format".
    const general = '%%MatrixMarket matrix array real general\n3 3\n2\n-1\n0\n-1\n2\n-1\n0\n-1\n2\n';
    const symmetric = '%%MatrixMarket matrix array real symmetric\n3 3\n2\n-1\n0\n2\n-1\n2\n';
    const expected = [2, -1, 0, -1, 2, -1, 0, -1, 2];
    expect(dense(readMatrixMarket(general))).toEqual(expected);
    const s = readMatrixMarket(symmetric);
    expect(dense(s)).toEqual(expected);
    expect(s.values.length).toBe(5); // the zero (3, 1) is not stored
  });

  it('explicit zeros of a coordinate file stay in the pattern', () => {
    const a = readMatrixMarket('%%MatrixMarket matrix coordinate real symmetric\n2 2 3\n1 1 1\n2 1 0\n2 2 1\n');
    expect(a.values.length).toBe(3);
  });

  it('default options are documented values', () => {
    expect(READ_MATRIX_MARKET_DEFAULTS).toEqual({ symmetryTolerance: 1e-12, maxDimension: 50_000_000, maxArrayDimension: 8000 });
    expect(DOF_MAP_DEFAULTS).toEqual({ format: 'csv' });
  });
});

describe('writeMatrixMarket', () => {
  it('round trip is bit-exact, including extreme and awkward doubles', () => {
    const n = 60;
    const r = rng(7);
    const b = new CooBuilder(n);
    const special = [1 / 3, -2 / 3, 0.1, 5e-324, -1.7976931348623157e308, 1e21, 1.2345678901234567e-300, -0, 123456789012345680];
    for (let j = 0; j < n; j++) {
      b.add(j, j, j < special.length ? special[j] : 1 + r());
      for (let i = j + 1; i < n; i++) if (r() < 0.1) b.add(i, j, (r() - 0.5) * 10 ** Math.floor(r() * 40 - 20));
    }
    const a = b.toCsc();
    const text = writeMatrixMarket(a, 'round trip\nsecond comment line');
    expect(text.startsWith('%%MatrixMarket matrix coordinate real symmetric\n% round trip\n% second comment line\n')).toBe(true);
    const back = readMatrixMarket(text, 'rt.mtx');
    expect(back.n).toBe(n);
    expect(Array.from(back.colPtr)).toEqual(Array.from(a.colPtr));
    expect(Array.from(back.rowIdx)).toEqual(Array.from(a.rowIdx));
    for (let p = 0; p < a.values.length; p++) expect(Object.is(back.values[p], a.values[p])).toBe(true);
  });

  it('reformatted (tabs, runs of blanks, CRLF, comments between entries) and general form read back the same', () => {
    const n = 300;
    const r = rng(13);
    const b = new CooBuilder(n);
    for (let j = 0; j < n; j++) {
      b.add(j, j, 10 + r());
      for (let i = j + 1; i < Math.min(n, j + 6); i++) b.add(i, j, r() - 0.5);
    }
    const a = b.toCsc();
    const lines = writeMatrixMarket(a).split('\n');
    const messy = lines
      .map((l, k) => (k < 2 || l === '' ? l : (k % 3 === 0 ? '\t' : '') + l.replace(/ /g, k % 2 ? '\t ' : '   ') + (k % 5 === 0 ? '  ' : '') + (k % 7 === 0 ? '\n% note\n' : '')))
      .join('\r\n');
    const m = readMatrixMarket(messy, 'messy.mtx');
    expect(Array.from(m.values)).toEqual(Array.from(a.values));
    expect(Array.from(m.rowIdx)).toEqual(Array.from(a.rowIdx));
    const parts = [`%%MatrixMarket matrix coordinate real general\n${n} ${n} ${2 * a.values.length - n}\n`];
    for (let j = 0; j < n; j++) {
      for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
        const i = a.rowIdx[p];
        parts.push(`${i + 1} ${j + 1} ${a.values[p]}\n`);
        if (i !== j) parts.push(`${j + 1} ${i + 1} ${a.values[p]}\n`);
      }
    }
    const g = readMatrixMarket(parts.join(''), 'general.mtx');
    expect(Array.from(g.values)).toEqual(Array.from(a.values));
  });

  it('writes the lower triangle, 1-based, with the entry count', () => {
    const b = new CooBuilder(2);
    b.add(0, 0, 2);
    b.add(0, 1, -1); // given as upper: stored lower
    b.add(1, 1, 2);
    expect(writeMatrixMarket(b.toCsc())).toBe('%%MatrixMarket matrix coordinate real symmetric\n2 2 3\n1 1 2\n2 1 -1\n2 2 2\n');
  });

  it('rejects a non-finite value with its position', () => {
    const b = new CooBuilder(2);
    b.add(0, 0, 1);
    b.add(1, 1, NaN);
    expect(() => writeMatrixMarket(b.toCsc())).toThrow(ArgumentError);
    try {
      writeMatrixMarket(b.toCsc());
    } catch (e) {
      expect((e as ArgumentError).path).toBe('values[1]');
    }
  });
});

describe('readMatrixMarket: each malformed case names its line', () => {
  const cases: Array<[string, string, number, RegExp]> = [
    ['empty file', '', 1, /empty/],
    ['bad banner', '%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 1\n', 1, /not a Matrix Market banner/],
    ['banner missing a keyword', '%%MatrixMarket matrix coordinate real\n1 1 1\n1 1 1\n', 1, /expected 4/],
    ['pattern field', '%%MatrixMarket matrix coordinate pattern symmetric\n1 1 1\n1 1\n', 1, /pattern/],
    ['complex field', '%%MatrixMarket matrix coordinate complex general\n1 1 1\n1 1 1 0\n', 1, /complex.*not supported/],
    ['skew-symmetric', '%%MatrixMarket matrix coordinate real skew-symmetric\n2 2 1\n2 1 1\n', 1, /skew-symmetric.*not supported/],
    ['unknown format', '%%MatrixMarket matrix sparse real general\n1 1 1\n1 1 1\n', 1, /format "sparse"/],
    ['size line with two numbers', '%%MatrixMarket matrix coordinate real general\n% c\n3 3\n', 3, /expected 3/],
    ['size line not numeric', '%%MatrixMarket matrix coordinate real general\n3 x 3\n', 2, /"x" is not a non-negative integer/],
    ['non-square', '%%MatrixMarket matrix coordinate real general\n3 4 1\n1 1 1\n', 2, /3 × 4, not square/],
    ['no size line', '%%MatrixMarket matrix coordinate real general\n% only comments\n', 2, /before the size line/],
    ['too many entries declared', '%%MatrixMarket matrix coordinate real symmetric\n2 2 4\n1 1 1\n', 2, /more than the 3/],
    ['index out of range', '%%MatrixMarket matrix coordinate real symmetric\n3 3 2\n1 1 1\n\n4 1 2\n', 5, /\(4, 1\) lies outside the 3 × 3/],
    ['zero index (1-based)', '%%MatrixMarket matrix coordinate real symmetric\n3 3 1\n0 1 2\n', 3, /indices are 1-based/],
    ['non-integer index', '%%MatrixMarket matrix coordinate real symmetric\n3 3 1\n1.5 1 2\n', 3, /row index "1.5" is not an integer/],
    ['CRLF file keeps line numbers', '%%MatrixMarket matrix coordinate real symmetric\r\n3 3 2\r\n1 1 1\r\n\r\n4 1 2\r\n', 5, /outside the 3 × 3/],
    ['value glued to a comment', '%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 2%c\n', 3, /"2%c" is not a number/],
    ['truncated (path: the last line)', '%%MatrixMarket matrix coordinate real symmetric\n3 3 3\n1 1 1\n2 2 1\n', 4, /ends after 2 of the 3 entries/],
    ['extra entries', '%%MatrixMarket matrix coordinate real symmetric\n3 3 1\n1 1 1\n% note\n2 2 1\n', 5, /more entries than the 1 declared on line 2/],
    ['non-numeric value', '%%MatrixMarket matrix coordinate real symmetric\n2 2 2\n1 1 1\n2 2 1,5\n', 4, /"1,5" is not a number/],
    ['hexadecimal value', '%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 0x10\n', 3, /"0x10" is not a number/],
    ['NaN value', '%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 NaN\n', 3, /not finite/],
    ['Inf value', '%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 -inf\n', 3, /not finite/],
    ['overflowing value', '%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 1e400\n', 3, /overflows/],
    ['missing value', '%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1\n', 3, /2 numbers, expected 3/],
    ['four numbers', '%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 2 3\n', 3, /more than 3 numbers/],
    ['integer field with a real', '%%MatrixMarket matrix coordinate integer symmetric\n1 1 1\n1 1 2.5\n', 3, /not an integer/],
    ['both triangles in a symmetric file', '%%MatrixMarket matrix coordinate real symmetric\n3 3 4\n1 1 1\n2 1 3\n2 2 1\n1 2 3\n', 6, /mirrors \(2, 1\) on line 4.*one triangle/],
    ['repeated entry', '%%MatrixMarket matrix coordinate real symmetric\n2 2 3\n1 1 1\n2 2 1\n1 1 1\n', 5, /repeats line 3/],
    ['array truncated', '%%MatrixMarket matrix array real symmetric\n2 2\n1\n0\n', 4, /ends after 2 of the 3 values/],
    ['array extra value', '%%MatrixMarket matrix array real symmetric\n1 1\n1\n2\n', 4, /more values than the 1/],
  ];
  for (const [name, text, lineNo, message] of cases) {
    it(name, () => {
      const e = mmError(() => readMatrixMarket(text, 'K.mtx'));
      expect(e.path).toBe(`K.mtx:${lineNo}`);
      expect(e.detail).toMatch(message);
    });
  }

  it('general file not symmetric: the first offending pair in file order, with both lines', () => {
    const text = [
      '%%MatrixMarket matrix coordinate real general',
      '3 3 7',
      '1 1 4',
      '3 2 -2', // line 4, mirror on line 9 differs
      '2 1 -1', // line 5, mirror on line 7 differs: this pair completes first (line 7)
      '2 2 4',
      '1 2 -1.5',
      '3 3 4',
      '2 3 -2.5',
    ].join('\n');
    const e = mmError(() => readMatrixMarket(text, 'K.mtx'));
    expect(e.path).toBe('K.mtx:7');
    expect(e.detail).toMatch(/\(1, 2\) = -1.5 but \(2, 1\) = -1 on line 5/);
  });

  it('the non-symmetric 5 × 5 example of NISTIR 5935 is rejected at its first unmirrored entry', () => {
    // The spec's coordinate example (values from memory): a_14 = 6 has no a_41.
    const text = [
      '%%MatrixMarket matrix coordinate real general',
      '% example after NISTIR 5935',
      '5  5  8',
      '    1     1   1.000e+00',
      '    2     2   1.050e+01',
      '    3     3   1.500e-02',
      '    1     4   6.000e+00',
      '    4     2   2.505e+02',
      '    4     4  -2.800e+02',
      '    4     5   3.332e+01',
      '    5     5   1.200e+01',
    ].join('\n');
    const e = mmError(() => readMatrixMarket(text, 'nist.mtx'));
    expect(e.path).toBe('nist.mtx:7');
    expect(e.detail).toMatch(/\(1, 4\) = 6 has no mirror entry \(4, 1\)/);
  });

  it('array general not symmetric names both lines', () => {
    const text = '%%MatrixMarket matrix array real general\n2 2\n1\n2\n3\n1\n';
    const e = mmError(() => readMatrixMarket(text, 'A.mtx'));
    expect(e.path).toBe('A.mtx:5');
    expect(e.detail).toMatch(/\(2, 1\) = 2 on line 4 but \(1, 2\) = 3 on line 5/);
  });

  it('a negative symmetry tolerance is an ArgumentError', () => {
    expect(() => readMatrixMarket('%%MatrixMarket matrix coordinate real general\n1 1 1\n1 1 1\n', 'x', { symmetryTolerance: -1 })).toThrow(ArgumentError);
  });

  it('a wider symmetry tolerance accepts a mildly asymmetric general file', () => {
    const text = '%%MatrixMarket matrix coordinate real general\n2 2 4\n1 1 1\n2 1 0.5\n1 2 0.5000001\n2 2 1\n';
    expect(() => readMatrixMarket(text)).toThrow(MatrixMarketError);
    const a = readMatrixMarket(text, 'x', { symmetryTolerance: 1e-6 });
    expect(toDenseArray(a)[1]).toBeCloseTo(0.50000005, 12);
  });
});

describe('writeDofMap', () => {
  const dofs = [
    { node: 'a', nodeIndex: 0, dof: 'ux' as const },
    { node: 'b,"top"', nodeIndex: 1, dof: 'rz' as const },
  ];
  it('CSV: 1-based rows, RFC 4180 quoting', () => {
    expect(writeDofMap(dofs)).toBe('row,node,dof\n1,a,ux\n2,"b,""top""",rz\n');
  });
  it('JSON: parses back to the same map', () => {
    const o = JSON.parse(writeDofMap(dofs, { format: 'json' }));
    expect(o).toEqual({
      format: 'eigenframe-dofs/1',
      indexBase: 1,
      dofs: [
        { row: 1, node: 'a', dof: 'ux' },
        { row: 2, node: 'b,"top"', dof: 'rz' },
      ],
    });
  });
  it('unknown format is an ArgumentError on "format"', () => {
    try {
      writeDofMap(dofs, { format: 'xml' as never });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('format');
    }
  });
});

describe('readMatrixMarket: sizes whose storage cannot fit are refused at the size line', () => {
  // Regression: a three-line file declaring 999999999 × 999999999 with one entry was accepted
  // and took minutes and gigabytes (O(n) index arrays). The caps are the documented defaults
  // (READ_MATRIX_MARKET_DEFAULTS), not measured limits.
  it('coordinate n = 999999999 with one entry: MatrixMarketError at line 2, quickly', () => {
    const t = performance.now();
    const e = mmError(() => readMatrixMarket('%%MatrixMarket matrix coordinate real symmetric\n999999999 999999999 1\n1 1 1\n', 'big.mtx'));
    expect(performance.now() - t).toBeLessThan(1000);
    expect(e.path).toBe('big.mtx:2');
    expect(e.message).toContain('999999999');
    expect(e.message).toContain('maxDimension = 50000000');
    expect(e.message).toContain('correct the size line');
  });

  it('beyond 32-bit indices (2³¹): refused whatever maxDimension says', () => {
    const e = mmError(() => readMatrixMarket('%%MatrixMarket matrix coordinate real general\n2147483648 2147483648 1\n1 1 1\n', 'K.mtx', { maxDimension: 0x7fffffff }));
    expect(e.path).toBe('K.mtx:2');
    expect(e.message).toContain('32-bit');
  });

  it('array n above maxArrayDimension: refused (dense n × n buffer), with the coordinate format as the fix', () => {
    const e = mmError(() => readMatrixMarket('%\n%%MatrixMarket matrix array real symmetric\n% c\n8001 8001\n1\n'.slice(2), 'A.mtx'));
    expect(e.path).toBe('A.mtx:3');
    expect(e.message).toContain('maxArrayDimension = 8000');
    expect(e.message).toContain('coordinate');
  });

  it('the caps are options: a lower maxDimension refuses a small file, the default accepts it', () => {
    const text = '%%MatrixMarket matrix coordinate real symmetric\n3 3 1\n1 1 2\n';
    expect(mmError(() => readMatrixMarket(text, 'K.mtx', { maxDimension: 2 })).path).toBe('K.mtx:2');
    const a = readMatrixMarket(text, 'K.mtx');
    expect(a.n).toBe(3);
    expect(dense(a)[0]).toBe(2);
    const arr = '%%MatrixMarket matrix array real general\n2 2\n1\n0\n0\n4\n';
    expect(mmError(() => readMatrixMarket(arr, 'A.mtx', { maxArrayDimension: 1 })).path).toBe('A.mtx:2');
    expect(dense(readMatrixMarket(arr, 'A.mtx'))).toEqual([1, 0, 0, 4]);
  });

  it('bad cap options are ArgumentErrors naming the option', () => {
    for (const [key, v] of [['maxDimension', 0], ['maxDimension', 2.5], ['maxArrayDimension', 2 ** 31]] as const) {
      try {
        readMatrixMarket('%%MatrixMarket matrix coordinate real symmetric\n1 1 1\n1 1 1\n', 'K.mtx', { [key]: v });
        expect.unreachable();
      } catch (e) {
        expect(e).toBeInstanceOf(ArgumentError);
        expect((e as ArgumentError).path).toBe(key);
      }
    }
  });
});
