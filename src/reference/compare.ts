/**
 * Comparison of a solver's values with a reference case's exact values, and the reader of a
 * user's results file.
 */
import { ArgumentError } from '../errors';
import { jsonErrorOffset } from '../model/read';
import type { ReferenceQuantity } from './types';

/** One row of a comparison. */
export interface ModeComparison {
  /** Mode number, 1 = lowest. */
  readonly mode: number;
  /** Exact value (Hz or load factor). */
  readonly expected: number;
  /** The solver's value, or null when the results have fewer modes. */
  readonly actual: number | null;
  /**
   * |actual − expected| / |expected|; for an expected 0 (a rigid-body mode) the scale is the
   * largest |expected| of the list instead. Null when `actual` is missing.
   */
  readonly relativeError: number | null;
  /** relativeError ≤ tolerance (false when missing). */
  readonly passed: boolean;
}

/** Outcome of `compareValues`. */
export interface ComparisonResult {
  /** One row per expected value, lowest first. */
  readonly rows: readonly ModeComparison[];
  /** Expected values the results do not reach (results shorter than the expected list). */
  readonly missing: number;
  /** Results beyond the expected list, not checked. */
  readonly extra: readonly number[];
  /** Largest relative error over the rows that have a value (0 when none). */
  readonly maxRelativeError: number;
  /** The tolerance used. */
  readonly tolerance: number;
  /** Every expected value has a result within tolerance. */
  readonly passed: boolean;
}

function finiteList(values: readonly number[], name: string): void {
  if (!Array.isArray(values)) throw new ArgumentError(`is not an array of numbers; pass a list of values`, name);
  values.forEach((v, i) => {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new ArgumentError(`is ${String(v)}; every value must be a finite number`, `${name}[${i}]`);
  });
}

/**
 * Compares values mode by mode, in the order given (both lists lowest first).
 * @param expected - exact values (Hz or load factors), length ≥ 1
 * @param actual - the solver's values, same unit, any length
 * @param tolerance - largest accepted relative error, > 0
 * @throws ArgumentError (path `expected[i]`, `actual[i]` or `tolerance`) on non-finite input
 */
export function compareValues(expected: readonly number[], actual: readonly number[], tolerance: number): ComparisonResult {
  finiteList(expected, 'expected');
  finiteList(actual, 'actual');
  if (expected.length === 0) throw new ArgumentError('is empty; give at least one expected value', 'expected');
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) {
    throw new ArgumentError(`is ${tolerance}; give a finite relative tolerance > 0 such as 1e-3`, 'tolerance');
  }
  const scale = Math.max(...expected.map(Math.abs));
  let maxRelativeError = 0;
  const rows = expected.map((e, i): ModeComparison => {
    const a = i < actual.length ? actual[i] : null;
    if (a === null) return { mode: i + 1, expected: e, actual: null, relativeError: null, passed: false };
    const denominator = e !== 0 ? Math.abs(e) : scale > 0 ? scale : 1;
    const relativeError = Math.abs(a - e) / denominator;
    maxRelativeError = Math.max(maxRelativeError, relativeError);
    return { mode: i + 1, expected: e, actual: a, relativeError, passed: relativeError <= tolerance };
  });
  const missing = Math.max(0, expected.length - actual.length);
  return {
    rows,
    missing,
    extra: actual.slice(expected.length),
    maxRelativeError,
    tolerance,
    passed: missing === 0 && rows.every((r) => r.passed),
  };
}

/**
 * Reads a results file: the values a solver produced, lowest first, in the unit of the case's
 * quantity (frequencies in Hz, or buckling load factors). Accepted forms:
 * - a JSON array of numbers;
 * - a JSON object with `modes: [...]`, each entry carrying `frequency` (Hz) or `eigenvalue`
 *   (rad²/s², turned into √max(λ, 0)/2π Hz) for frequencies, or `loadFactor` or `eigenvalue`
 *   for buckling (eigenframe's own `--json` output has this form);
 * - plain text with one number per line; blank lines and anything after `#` are ignored.
 * @param text - the file's content
 * @param source - the file name, used in error paths (`results.txt:7`, `results.json:modes[2]`)
 * @throws ArgumentError naming the line or JSON path of the first bad entry
 */
export function parseResults(text: string, source: string, quantity: ReferenceQuantity): number[] {
  const body = text.replace(/^\uFEFF/, '');
  const first = body.trimStart()[0];
  const values = first === '[' || first === '{' ? parseJsonResults(body, source, quantity) : parseTextResults(body, source);
  if (values.length === 0) {
    throw new ArgumentError('contains no values; give one number per line, a JSON array, or a JSON object with "modes"', source);
  }
  return values;
}

function parseTextResults(text: string, source: string): number[] {
  const out: number[] = [];
  text.split(/\r?\n/).forEach((raw, k) => {
    const line = raw.replace(/#.*$/, '').trim();
    if (line === '') return;
    const v = Number(line);
    if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(line) || !Number.isFinite(v)) {
      throw new ArgumentError(`"${line}" is not a number; write one number per line (comments start with #)`, `${source}:${k + 1}`);
    }
    out.push(v);
  });
  return out;
}

function parseJsonResults(text: string, source: string, quantity: ReferenceQuantity): number[] {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    // V8's messages do not always give a position (and may quote the whole file); locate it.
    const at = jsonErrorOffset(text);
    const before = text.slice(0, at).split('\n');
    const line = before.length;
    const column = before[before.length - 1].length + 1;
    const near = text.slice(at, at + 20).split('\n')[0];
    throw new ArgumentError(
      `is not valid JSON at column ${column}${near ? ` (near "${near}")` : ' (the text ends early)'}; fix the syntax or give plain text with one number per line`,
      `${source}:${line}`,
    );
  }
  const number = (v: unknown, path: string, what: string): number => {
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new ArgumentError(`${what} is ${JSON.stringify(v) ?? String(v)}; give a finite number`, `${source}:${path}`);
    }
    return v;
  };
  if (Array.isArray(data)) return data.map((v, i) => number(v, `[${i}]`, 'the value'));
  const modes = (data as { modes?: unknown }).modes;
  if (data === null || typeof data !== 'object' || !Array.isArray(modes)) {
    throw new ArgumentError('is a JSON object without a "modes" array; give a JSON array of numbers or {"modes": [{"frequency": …}, …]}', source);
  }
  return modes.map((m, i) => {
    const path = `modes[${i}]`;
    if (m === null || typeof m !== 'object' || Array.isArray(m)) {
      throw new ArgumentError(`is ${JSON.stringify(m)}; each mode must be an object such as {"frequency": 12.5}`, `${source}:${path}`);
    }
    const o = m as Record<string, unknown>;
    if (quantity === 'frequency') {
      if (o.frequency !== undefined) return number(o.frequency, `${path}.frequency`, 'the frequency');
      if (o.eigenvalue !== undefined) {
        const lambda = number(o.eigenvalue, `${path}.eigenvalue`, 'the eigenvalue');
        return Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI);
      }
      throw new ArgumentError('has neither "frequency" (Hz) nor "eigenvalue" (rad²/s²); add one', `${source}:${path}`);
    }
    if (o.loadFactor !== undefined) return number(o.loadFactor, `${path}.loadFactor`, 'the load factor');
    if (o.eigenvalue !== undefined) return number(o.eigenvalue, `${path}.eigenvalue`, 'the eigenvalue');
    throw new ArgumentError('has neither "loadFactor" nor "eigenvalue" (the buckling load factor); add one', `${source}:${path}`);
  });
}
