/**
 * Matrix Market exchange format, the open NIST text format for sparse and dense matrices
 * (Boisvert, Pozo, Remington, "The Matrix Market Exchange Formats: Initial Design",
 * NISTIR 5935, 1996). Strings in, strings out: no file system access here.
 *
 * Read: `matrix coordinate real|integer general|symmetric` and `matrix array real|integer
 * general|symmetric`, square only, into symmetric lower-triangle storage. Write: `matrix
 * coordinate real symmetric`, lower triangle, with the shortest decimal that converts back to
 * the same double (as exact as C's `%.17g`, and shorter).
 *
 * The text is scanned with `charCodeAt`/`indexOf` (no split, no per-line regular expression), so
 * a 1.5 M-entry file parses in well under a second.
 */
import { MatrixMarketError, ArgumentError } from '../errors';
import type { SymmetricCsc } from '../linalg/sparse/symmetric';

/** Options of {@link readMatrixMarket}. */
export interface ReadMatrixMarketOptions {
  /**
   * `general` files must be symmetric: entries (i, j) and (j, i) are accepted when
   * |a_ij − a_ji| ≤ symmetryTolerance · max(|a_ij|, |a_ji|, √|a_ii·a_jj|); the stored value is
   * their mean. An entry whose mirror is absent is compared with 0. Must be ≥ 0.
   * @defaultValue 1e-12
   */
  symmetryTolerance?: number;
  /**
   * Largest dimension n accepted, an integer from 1 to 2³¹ − 1 (indices are 32-bit). Reading a
   * coordinate file allocates by the entry count plus a few arrays of length n (about 20n bytes:
   * 1 GB at the default), so a size line that declares a huge n with few entries is refused
   * before anything is allocated. @defaultValue 50,000,000
   */
  maxDimension?: number;
  /**
   * Largest dimension n accepted for an `array` file, which is read through a dense n × n
   * buffer (12n² bytes: 0.77 GB at the default, the dense solver's own limit). Larger matrices
   * belong in coordinate files. @defaultValue 8000
   */
  maxArrayDimension?: number;
}

/** Defaults of {@link ReadMatrixMarketOptions}. */
export const READ_MATRIX_MARKET_DEFAULTS = { symmetryTolerance: 1e-12, maxDimension: 50_000_000, maxArrayDimension: 8000 } as const;

const NL = 10; // \n
const CR = 13; // \r
const SP = 32;
const TAB = 9;
const PERCENT = 37;

// Exact powers of ten for the Clinger fast path (10^0 … 10^22 are exact doubles).
const POW10 = new Float64Array(23);
for (let k = 0, p = 1; k <= 22; k++, p *= 10) POW10[k] = p;

/**
 * Parses a decimal real in text[a, b): `[+-]? (d+ (. d*)? | . d+) ([eE] [+-]? d+)?`.
 * Returns NaN when the token is not of that form (so "0x10", "1,5", "" are rejected, unlike
 * `Number`). Short mantissas (≤ 15 digits, |exponent| ≤ 22) take Clinger's exact fast path
 * (W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990); all others go to
 * `Number`, which rounds correctly.
 */
function parseReal(text: string, a: number, b: number): number {
  let p = a;
  let neg = false;
  let c = text.charCodeAt(p);
  if (c === 43 || c === 45) {
    neg = c === 45;
    p++;
  }
  let mant = 0;
  let digits = 0; // significant digits accumulated into mant
  let intDigits = 0;
  let fracDigits = 0;
  let dropped = 0; // integer digits beyond the fast-path capacity
  let exact = true;
  while (p < b) {
    c = text.charCodeAt(p);
    if (c < 48 || c > 57) break;
    if (digits < 15) {
      if (mant !== 0 || c !== 48) digits++;
      mant = mant * 10 + (c - 48);
    } else {
      exact = false;
      dropped++;
    }
    intDigits++;
    p++;
  }
  let scale = dropped;
  if (p < b && text.charCodeAt(p) === 46) {
    p++;
    while (p < b) {
      c = text.charCodeAt(p);
      if (c < 48 || c > 57) break;
      if (digits < 15) {
        if (mant !== 0 || c !== 48) digits++;
        mant = mant * 10 + (c - 48);
        scale--;
      } else if (c !== 48) exact = false;
      fracDigits++;
      p++;
    }
  }
  if (intDigits + fracDigits === 0) return NaN;
  if (p < b) {
    c = text.charCodeAt(p);
    if (c !== 101 && c !== 69) return NaN;
    p++;
    let eneg = false;
    c = text.charCodeAt(p);
    if (c === 43 || c === 45) {
      eneg = c === 45;
      p++;
    }
    let e = 0;
    let eDigits = 0;
    while (p < b) {
      c = text.charCodeAt(p);
      if (c < 48 || c > 57) return NaN;
      if (e < 100000) e = e * 10 + (c - 48);
      eDigits++;
      p++;
    }
    if (eDigits === 0) return NaN;
    scale += eneg ? -e : e;
  }
  if (exact && scale >= -22 && scale <= 22) {
    const v = scale >= 0 ? mant * POW10[scale] : mant / POW10[-scale];
    return neg ? -v : v;
  }
  return Number(text.slice(a, b));
}

/** True when text[a, b) reads as nan, inf or infinity (any case, optional sign). */
function isNonFiniteWord(text: string, a: number, b: number): boolean {
  let t = text.slice(a, b).toLowerCase();
  if (t.startsWith('+') || t.startsWith('-')) t = t.slice(1);
  return t === 'nan' || t === 'inf' || t === 'infinity';
}

/** Parses an optionally signed decimal integer in text[a, b); NaN if not of that form. */
function parseInteger(text: string, a: number, b: number): number {
  let p = a;
  let neg = false;
  const c0 = text.charCodeAt(p);
  if (c0 === 43 || c0 === 45) {
    neg = c0 === 45;
    p++;
  }
  if (p >= b) return NaN;
  let v = 0;
  for (; p < b; p++) {
    const c = text.charCodeAt(p);
    if (c < 48 || c > 57) return NaN;
    v = v * 10 + (c - 48);
  }
  return neg ? -v : v;
}

type Format = 'coordinate' | 'array';
type Field = 'real' | 'integer';

/**
 * The value of one entry, text[a, b), as its field requires; `fail(line, message)` throws the
 * reader's line-numbered error for a value that is not an integer, not a number, or not finite.
 */
function entryValue(text: string, a: number, b: number, field: Field, line: number, fail: (at: number, message: string) => never): number {
  if (field === 'integer') {
    const v = parseInteger(text, a, b);
    if (Number.isNaN(v)) fail(line, `value "${text.slice(a, b)}" is not an integer, as field "integer" requires; write an integer or declare field "real"`);
    return v;
  }
  const v = parseReal(text, a, b);
  if (Number.isNaN(v)) {
    if (isNonFiniteWord(text, a, b)) fail(line, `value "${text.slice(a, b)}" is not finite; every entry must be a finite number`);
    fail(line, `value "${text.slice(a, b)}" is not a number; write a decimal such as 2.5e+06`);
  }
  if (!Number.isFinite(v)) fail(line, `value "${text.slice(a, b)}" overflows to infinity; every entry must be a finite number`);
  return v;
}
type Symmetry = 'general' | 'symmetric';

/**
 * Reads a square symmetric matrix from Matrix Market text.
 *
 * Accepted headers: `%%MatrixMarket matrix coordinate|array real|integer general|symmetric`
 * (keywords in any case). Comment lines start with `%`; blank lines are skipped; indices are
 * 1-based. A `symmetric` file stores one triangle: either triangle is accepted (the NIST
 * specification stores the lower one), but an off-diagonal pair given in both triangles is an
 * error. A `general` file must be symmetric within `symmetryTolerance` (see
 * {@link ReadMatrixMarketOptions}). Repeated coordinate entries are an error (they are not
 * summed). Explicit zeros in coordinate files stay in the pattern; array files keep the nonzero
 * entries and the whole diagonal.
 *
 * @param text - the whole file
 * @param source - name used in error paths, e.g. `K.mtx` @defaultValue 'matrix.mtx'
 * @returns n × n symmetric matrix, lower-triangle CSC
 * @throws MatrixMarketError with path `<source>:<line>` (1-based line) for a bad banner, an
 *   unsupported format, field (complex, pattern) or symmetry (skew-symmetric, hermitian), a bad
 *   or non-square size line, a dimension above `maxDimension` (or `maxArrayDimension` for an
 *   array file; nothing is allocated before this check), a non-numeric, non-integer or non-finite value, an out-of-range
 *   index, a repeated entry, a pair in both triangles, an asymmetric `general` file, too few
 *   entries (the path is the last line) or too many.
 * @throws ArgumentError when `symmetryTolerance` is negative or not a number, or `maxDimension`
 *   or `maxArrayDimension` is not an integer from 1 to 2³¹ − 1.
 */
export function readMatrixMarket(text: string, source = 'matrix.mtx', options: ReadMatrixMarketOptions = {}): SymmetricCsc {
  const opts = { ...READ_MATRIX_MARKET_DEFAULTS, ...options };
  if (!(opts.symmetryTolerance >= 0)) {
    throw new ArgumentError(`symmetryTolerance ${opts.symmetryTolerance} is not a number ≥ 0; pass e.g. 1e-12`, 'symmetryTolerance');
  }
  for (const key of ['maxDimension', 'maxArrayDimension'] as const) {
    const v = opts[key];
    if (!Number.isInteger(v) || v < 1 || v > 0x7fffffff) {
      throw new ArgumentError(`${key} ${v} is not an integer from 1 to 2147483647 (2³¹ − 1); pass e.g. ${READ_MATRIX_MARKET_DEFAULTS[key]}`, key);
    }
  }
  const len = text.length;
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0; // start of the current line (after a byte-order mark)
  let line = 0; // 1-based number of the current line
  let lineStart = 0;
  let lineEnd = 0; // exclusive, without \r\n

  const fail = (at: number, message: string): never => {
    throw new MatrixMarketError(message, `${source}:${at}`);
  };
  /** Advances to the next line; false at end of text. */
  const nextLine = (): boolean => {
    if (pos >= len) return false;
    let e = text.indexOf('\n', pos);
    if (e < 0) e = len;
    lineStart = pos;
    pos = e + 1;
    if (e > lineStart && text.charCodeAt(e - 1) === CR) e--;
    lineEnd = e;
    line++;
    return true;
  };
  const skipBlanks = (p: number): number => {
    while (p < lineEnd) {
      const c = text.charCodeAt(p);
      if (c !== SP && c !== TAB && c !== CR) break;
      p++;
    }
    return p;
  };
  const tokenEnd = (p: number): number => {
    while (p < lineEnd) {
      const c = text.charCodeAt(p);
      if (c === SP || c === TAB || c === CR) break;
      p++;
    }
    return p;
  };
  /** Advances to the next line holding data (not blank, not a comment); false at end. */
  const nextDataLine = (): boolean => {
    while (nextLine()) {
      const p = skipBlanks(lineStart);
      if (p < lineEnd && text.charCodeAt(p) !== PERCENT) return true;
    }
    return false;
  };

  // ── Banner ────────────────────────────────────────────────────────────────────────────
  if (!nextLine()) fail(1, 'the file is empty; a Matrix Market file starts with "%%MatrixMarket matrix coordinate real symmetric"');
  const banner = text.slice(lineStart, lineEnd).trim().split(/[ \t]+/);
  if (banner[0].toLowerCase() !== '%%matrixmarket') {
    fail(line, `the first line "${text.slice(lineStart, Math.min(lineEnd, lineStart + 60))}" is not a Matrix Market banner; start the file with "%%MatrixMarket matrix coordinate real symmetric" (or general)`);
  }
  if (banner.length !== 5) {
    fail(line, `the banner has ${banner.length - 1} keywords after %%MatrixMarket, expected 4 (object format field symmetry), e.g. "%%MatrixMarket matrix coordinate real symmetric"`);
  }
  const [, objectKw, formatKw, fieldKw, symmetryKw] = banner.map((s) => s.toLowerCase());
  if (objectKw !== 'matrix') fail(line, `object "${banner[1]}" is not supported; only "matrix" files can be read`);
  if (formatKw !== 'coordinate' && formatKw !== 'array') {
    fail(line, `format "${banner[2]}" is unknown; use "coordinate" (sparse) or "array" (dense)`);
  }
  if (fieldKw === 'pattern') {
    fail(line, 'field "pattern" carries no values, so it cannot define a stiffness or mass matrix; write the file with field "real"');
  }
  if (fieldKw !== 'real' && fieldKw !== 'integer') {
    fail(line, `field "${banner[3]}" is not supported; write the matrix with field "real" (or "integer")`);
  }
  if (symmetryKw !== 'general' && symmetryKw !== 'symmetric') {
    fail(line, `symmetry "${banner[4]}" is not supported; stiffness and mass matrices are symmetric, so write "symmetric" (lower triangle) or "general"`);
  }
  const format = formatKw as Format;
  const field: Field = fieldKw === 'integer' ? 'integer' : 'real';
  const symmetry = symmetryKw as Symmetry;

  // ── Size line ─────────────────────────────────────────────────────────────────────────
  if (!nextDataLine()) fail(line, 'the file ends before the size line; add "rows columns entries" (coordinate) or "rows columns" (array)');
  const sizeLine = line;
  const want = format === 'coordinate' ? 3 : 2;
  const sizes: number[] = [];
  {
    let p = skipBlanks(lineStart);
    while (p < lineEnd) {
      const e = tokenEnd(p);
      const v = parseInteger(text, p, e);
      if (!(v >= 0)) fail(line, `size line "${text.slice(lineStart, lineEnd).trim()}": "${text.slice(p, e)}" is not a non-negative integer; give ${want === 3 ? '"rows columns entries"' : '"rows columns"'} as integers`);
      sizes.push(v);
      p = skipBlanks(e);
    }
  }
  if (sizes.length !== want) {
    fail(line, `size line "${text.slice(lineStart, lineEnd).trim()}" has ${sizes.length} numbers, expected ${want} for a ${format} file (${want === 3 ? 'rows columns entries' : 'rows columns'})`);
  }
  const n = sizes[0];
  if (sizes[1] !== n) fail(line, `the matrix is ${sizes[0]} × ${sizes[1]}, not square; stiffness and mass matrices are square`);
  // Refuse sizes whose storage cannot fit before allocating anything (a size line of 10⁹ would
  // otherwise allocate gigabytes of O(n) arrays for a file of three lines).
  if (n > 0x7fffffff) fail(line, `dimension ${n} is too large for 32-bit indices (at most 2147483647); correct the size line`);
  if (n > opts.maxDimension) {
    fail(line, `dimension ${n} exceeds maxDimension = ${opts.maxDimension} (reading needs about ${((20 * n) / 1e9).toFixed(1)} GB of index arrays of length n); correct the size line, or raise the maxDimension option if the matrix really is that large`);
  }
  if (format === 'array' && n > opts.maxArrayDimension) {
    fail(line, `an array file of dimension ${n} exceeds maxArrayDimension = ${opts.maxArrayDimension} (it is read through a dense ${n} × ${n} buffer of ${((12 * n * n) / 1e9).toFixed(1)} GB); store the matrix as a coordinate file, correct the size line, or raise the maxArrayDimension option`);
  }

  if (format === 'array') return readArray(n);
  return readCoordinate(n, sizes[2]);

  // ── Coordinate data ───────────────────────────────────────────────────────────────────
  function readCoordinate(n: number, declared: number): SymmetricCsc {
    const maxEntries = symmetry === 'symmetric' ? (n * (n + 1)) / 2 : n * n;
    if (declared > maxEntries) {
      fail(sizeLine, `${declared} entries are declared, more than the ${maxEntries} a ${symmetry} ${n} × ${n} matrix can hold; correct the entry count`);
    }
    // Each entry needs at least 6 characters ("1 1 1\n"), which bounds the allocation.
    const cap = Math.min(declared, Math.floor(len / 6) + 1);
    const rows = new Int32Array(cap);
    const cols = new Int32Array(cap);
    const vals = new Float64Array(cap);
    const lines = new Int32Array(cap);
    let count = 0;
    const integerField = field === 'integer';
    for (;;) {
      // Fast path: lines of the exact form `[blanks] i blanks j blanks value [blanks] \n` with
      // valid indices and a finite value, scanned with local state only. Anything else (a
      // comment, a blank line, a malformed or out-of-range entry) leaves it to the careful path
      // below, which accepts the line or reports the error.
      let q = pos;
      let head = pos; // start of the line being scanned
      let ln = line;
      while (count < declared && count < cap) {
        let c = text.charCodeAt(q);
        while (c === SP || c === TAB) c = text.charCodeAt(++q);
        let i = 0;
        let d0 = q;
        while (c >= 48 && c <= 57) {
          i = i * 10 + (c - 48);
          c = text.charCodeAt(++q);
        }
        if (q === d0 || (c !== SP && c !== TAB)) break;
        while (c === SP || c === TAB) c = text.charCodeAt(++q);
        let j = 0;
        d0 = q;
        while (c >= 48 && c <= 57) {
          j = j * 10 + (c - 48);
          c = text.charCodeAt(++q);
        }
        if (q === d0 || (c !== SP && c !== TAB)) break;
        while (c === SP || c === TAB) c = text.charCodeAt(++q);
        const vs = q;
        while (q < len && c !== SP && c !== TAB && c !== CR && c !== NL) c = text.charCodeAt(++q);
        const ve = q;
        while (c === SP || c === TAB || c === CR) c = text.charCodeAt(++q);
        if (q < len && c !== NL) break;
        if (vs === ve || i < 1 || i > n || j < 1 || j > n) break;
        const v = integerField ? parseInteger(text, vs, ve) : parseReal(text, vs, ve);
        if (!Number.isFinite(v)) break;
        rows[count] = i - 1;
        cols[count] = j - 1;
        vals[count] = v;
        lines[count] = ++ln;
        count++;
        head = ++q;
      }
      pos = head;
      line = ln;
      // Careful path: one line (or the end of the text).
      if (!nextDataLine()) break;
      if (count === declared) {
        fail(line, `more entries than the ${declared} declared on line ${sizeLine}; remove the extra lines or correct the count`);
      }
      if (count === cap) fail(line, `more entries than the text can hold; the file is corrupt`);
      let p = skipBlanks(lineStart);
      let e = tokenEnd(p);
      const i = parseInteger(text, p, e);
      if (Number.isNaN(i)) fail(line, `row index "${text.slice(p, e)}" is not an integer; each entry line is "row column value" with 1-based integer indices`);
      p = skipBlanks(e);
      e = tokenEnd(p);
      if (p === e) fail(line, `entry "${text.slice(lineStart, lineEnd).trim()}" has 1 number, expected 3 (row column value)`);
      const j = parseInteger(text, p, e);
      if (Number.isNaN(j)) fail(line, `column index "${text.slice(p, e)}" is not an integer; each entry line is "row column value" with 1-based integer indices`);
      if (i < 1 || i > n || j < 1 || j > n) {
        fail(line, `entry (${i}, ${j}) lies outside the ${n} × ${n} matrix; indices are 1-based, from 1 to ${n}`);
      }
      p = skipBlanks(e);
      e = tokenEnd(p);
      if (p === e) fail(line, `entry "${text.slice(lineStart, lineEnd).trim()}" has 2 numbers, expected 3 (row column value)`);
      const v = entryValue(text, p, e, field, line, fail);
      p = skipBlanks(e);
      if (p < lineEnd) {
        fail(line, `entry "${text.slice(lineStart, lineEnd).trim()}" has more than 3 numbers, expected "row column value"${text.charCodeAt(p) === PERCENT ? '' : ' (complex values are not supported)'}`);
      }
      rows[count] = i - 1;
      cols[count] = j - 1;
      vals[count] = v;
      lines[count] = line;
      count++;
    }
    if (count < declared) {
      fail(line, `the file ends after ${count} of the ${declared} entries declared on line ${sizeLine}; the file is truncated, or correct the count`);
    }
    return assembleCoordinate(n, count, rows, cols, vals, lines);
  }

  function assembleCoordinate(n: number, nz: number, rows: Int32Array, cols: Int32Array, vals: Float64Array, lines: Int32Array): SymmetricCsc {
    // Sort entries by (lower column lo = min(i, j), row hi = max(i, j)) with two stable counting
    // passes, so an entry and its mirror or duplicate become neighbours, in file order.
    const byHi = new Int32Array(nz);
    const order = new Int32Array(nz);
    const ptr = new Int32Array(n + 1);
    for (let k = 0; k < nz; k++) ptr[Math.max(rows[k], cols[k]) + 1]++;
    for (let i = 0; i < n; i++) ptr[i + 1] += ptr[i];
    for (let k = 0; k < nz; k++) byHi[ptr[Math.max(rows[k], cols[k])]++] = k;
    ptr.fill(0);
    for (let k = 0; k < nz; k++) ptr[Math.min(rows[k], cols[k]) + 1]++;
    for (let j = 0; j < n; j++) ptr[j + 1] += ptr[j];
    const colPtr = ptr.slice();
    for (let q = 0; q < nz; q++) {
      const k = byHi[q];
      order[ptr[Math.min(rows[k], cols[k])]++] = k;
    }
    // Diagonal values, for the symmetry scale √|a_ii a_jj|.
    const diag = new Float64Array(n);
    for (let k = 0; k < nz; k++) if (rows[k] === cols[k]) diag[rows[k]] = vals[k];

    const tol = opts.symmetryTolerance;
    const rowIdx = new Int32Array(nz);
    const values = new Float64Array(nz);
    let w = 0;
    let errLine = Infinity;
    let errMessage = '';
    const report = (at: number, message: string): void => {
      if (at < errLine) {
        errLine = at;
        errMessage = message;
      }
    };
    const out = new Int32Array(n + 1);
    for (let j = 0; j < n; j++) {
      out[j] = w;
      let q = colPtr[j];
      const end = colPtr[j + 1];
      while (q < end) {
        const k = order[q];
        const hi = Math.max(rows[k], cols[k]);
        let g = q + 1;
        while (g < end && Math.max(rows[order[g]], cols[order[g]]) === hi) g++;
        const size = g - q;
        const upper = rows[k] < cols[k];
        if (size > 1) {
          const k2 = order[q + 1];
          const upper2 = rows[k2] < cols[k2];
          if (hi === j || upper === upper2 || size > 2) {
            // The same position twice (for size > 2, two of the lines share an orientation).
            let a = k;
            let b = k2;
            if (!(hi === j || upper === upper2)) {
              const k3 = order[q + 2];
              const upper3 = rows[k3] < cols[k3];
              b = k3;
              a = upper3 === upper ? k : k2;
            }
            report(lines[b], `entry (${rows[b] + 1}, ${cols[b] + 1}) repeats line ${lines[a]}; give each entry once (values are not summed)`);
          } else if (symmetry === 'symmetric') {
            report(lines[k2], `entry (${rows[k2] + 1}, ${cols[k2] + 1}) mirrors (${rows[k] + 1}, ${cols[k] + 1}) on line ${lines[k]}; a symmetric file stores one triangle only, so remove one of the two`);
          } else {
            const a = vals[k];
            const b = vals[k2];
            const scale = Math.max(Math.abs(a), Math.abs(b), Math.sqrt(Math.abs(diag[hi] * diag[j])));
            if (Math.abs(a - b) > tol * scale) {
              report(lines[k2], `the matrix is not symmetric: (${rows[k2] + 1}, ${cols[k2] + 1}) = ${b} but (${rows[k] + 1}, ${cols[k] + 1}) = ${a} on line ${lines[k]} (relative difference ${(Math.abs(a - b) / scale).toExponential(2)} > ${tol}); stiffness and mass matrices must be symmetric`);
            }
            rowIdx[w] = hi;
            values[w++] = 0.5 * (a + b);
          }
        } else {
          if (symmetry === 'general' && hi !== j) {
            const a = vals[k];
            const scale = Math.max(Math.abs(a), Math.sqrt(Math.abs(diag[hi] * diag[j])));
            if (Math.abs(a) > tol * scale) {
              report(lines[k], `the matrix is not symmetric: (${rows[k] + 1}, ${cols[k] + 1}) = ${a} has no mirror entry (${cols[k] + 1}, ${rows[k] + 1}); a general file must give both, or declare "symmetric" and give one triangle`);
            }
          }
          rowIdx[w] = hi;
          values[w++] = vals[k];
        }
        q = g;
      }
    }
    out[n] = w;
    if (errLine < Infinity) fail(errLine, errMessage);
    return { n, colPtr: out, rowIdx: w === nz ? rowIdx : rowIdx.slice(0, w), values: w === nz ? values : values.slice(0, w) };
  }

  // ── Array data ────────────────────────────────────────────────────────────────────────
  function readArray(n: number): SymmetricCsc {
    // Column-major: all n² values (general) or the lower triangle column by column (symmetric).
    const total = symmetry === 'symmetric' ? (n * (n + 1)) / 2 : n * n;
    if (total > len) fail(sizeLine, `a ${n} × ${n} ${symmetry} array needs ${total} values, more than the file can hold; the file is truncated, or correct the size`);
    const dense = new Float64Array(n * n);
    const lineOf = new Int32Array(n * n);
    let count = 0;
    let i = 0;
    let j = 0;
    while (nextDataLine()) {
      let p = skipBlanks(lineStart);
      while (p < lineEnd) {
        if (text.charCodeAt(p) === PERCENT) break;
        const e = tokenEnd(p);
        if (count === total) fail(line, `more values than the ${total} a ${n} × ${n} ${symmetry} array holds (size on line ${sizeLine}); remove the extra values or correct the size`);
        const v = entryValue(text, p, e, field, line, fail);
        dense[i + j * n] = v;
        lineOf[i + j * n] = line;
        count++;
        i++;
        if (i === n) {
          j++;
          i = symmetry === 'symmetric' ? j : 0;
        }
        p = skipBlanks(e);
      }
    }
    if (count < total) fail(line, `the file ends after ${count} of the ${total} values of a ${n} × ${n} ${symmetry} array (size on line ${sizeLine}); the file is truncated, or correct the size`);
    if (symmetry === 'general') {
      const tol = opts.symmetryTolerance;
      let errLine = Infinity;
      let errMessage = '';
      for (let c = 0; c < n; c++) {
        for (let r = c + 1; r < n; r++) {
          const a = dense[r + c * n];
          const b = dense[c + r * n];
          const scale = Math.max(Math.abs(a), Math.abs(b), Math.sqrt(Math.abs(dense[r + r * n] * dense[c + c * n])));
          if (Math.abs(a - b) > tol * scale) {
            const at = Math.max(lineOf[r + c * n], lineOf[c + r * n]);
            if (at < errLine) {
              errLine = at;
              errMessage = `the matrix is not symmetric: (${r + 1}, ${c + 1}) = ${a} on line ${lineOf[r + c * n]} but (${c + 1}, ${r + 1}) = ${b} on line ${lineOf[c + r * n]}; stiffness and mass matrices must be symmetric`;
            }
          }
          dense[r + c * n] = 0.5 * (a + b);
        }
      }
      if (errLine < Infinity) fail(errLine, errMessage);
    }
    let nz = 0;
    for (let c = 0; c < n; c++) for (let r = c; r < n; r++) if (r === c || dense[r + c * n] !== 0) nz++;
    const colPtr = new Int32Array(n + 1);
    const rowIdx = new Int32Array(nz);
    const values = new Float64Array(nz);
    let w = 0;
    for (let c = 0; c < n; c++) {
      for (let r = c; r < n; r++) {
        const v = dense[r + c * n];
        if (r === c || v !== 0) {
          rowIdx[w] = r;
          values[w++] = v;
        }
      }
      colPtr[c + 1] = w;
    }
    return { n, colPtr, rowIdx, values };
  }
}

/** Shortest decimal that reads back as the same double (keeps the sign of −0). */
function formatReal(v: number): string {
  return v === 0 && 1 / v < 0 ? '-0' : String(v);
}

/**
 * Writes a symmetric matrix as `%%MatrixMarket matrix coordinate real symmetric`: the lower
 * triangle (row ≥ column), column by column, 1-based. Each value is the shortest decimal that
 * converts back to the same double, so `readMatrixMarket(writeMatrixMarket(a))` returns a
 * bit-identical matrix.
 *
 * @param a - n × n symmetric matrix, lower-triangle CSC
 * @param comment - optional text, one `%` comment line per line of text
 * @returns the file text, ending with a newline
 * @throws ArgumentError (path `values[p]` or `rowIdx[p]`) for a non-finite value or an entry
 *   above the diagonal or outside the matrix
 */
export function writeMatrixMarket(a: SymmetricCsc, comment?: string): string {
  const { n, colPtr, rowIdx, values } = a;
  const nz = colPtr[n];
  let header = '%%MatrixMarket matrix coordinate real symmetric\n';
  if (comment !== undefined && comment !== '') {
    for (const l of comment.split(/\r?\n/)) header += `%${l === '' ? '' : ' '}${l}\n`;
  }
  header += `${n} ${n} ${nz}\n`;
  // The entries are ASCII: bytes into one growing buffer, decoded once at the end (measured
  // faster than string concatenation for millions of lines). Room for the first entries.
  let buf = new Uint8Array(Math.max(1024, Math.min(nz * 24, 1 << 26)));
  let p = 0;
  for (let j = 0; j < n; j++) {
    for (let q = colPtr[j]; q < colPtr[j + 1]; q++) {
      const i = rowIdx[q];
      const v = values[q];
      if (!Number.isFinite(v)) throw new ArgumentError(`value ${v} at (${i + 1}, ${j + 1}) is not finite; a Matrix Market file holds finite numbers only`, `values[${q}]`);
      if (i < j || i >= n) throw new ArgumentError(`row ${i} in column ${j} is not in the lower triangle of a ${n} × ${n} matrix; store rows ≥ column`, `rowIdx[${q}]`);
      // Longest line: two 10-digit indices, a 24-character double, 2 blanks and a newline.
      if (p + 64 > buf.length) {
        const grown = new Uint8Array(buf.length * 2);
        grown.set(buf);
        buf = grown;
      }
      p = writeIndex(buf, p, i + 1);
      buf[p++] = SP;
      p = writeIndex(buf, p, j + 1);
      buf[p++] = SP;
      const str = formatReal(v);
      for (let k = 0; k < str.length; k++) buf[p++] = str.charCodeAt(k);
      buf[p++] = NL;
    }
  }
  return header + new TextDecoder().decode(buf.subarray(0, p));
}

/** Writes the decimal digits of a positive integer x at buf[p]; returns the next position. */
function writeIndex(buf: Uint8Array, p: number, x: number): number {
  let d = 1;
  while (d * 10 <= x) d *= 10;
  for (; d >= 1; d /= 10) {
    const digit = Math.floor(x / d);
    buf[p++] = 48 + digit;
    x -= digit * d;
  }
  return p;
}

// The DOF map that goes with exported K.mtx and M.mtx lives beside this file; re-exported so
// that one import serves an export command.
export { writeDofMap, type DofMapOptions, type DofMapFormat, DOF_MAP_DEFAULTS } from './matrix-market-dofs';
