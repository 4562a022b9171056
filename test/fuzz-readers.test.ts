/**
 * Fuzzing of the two readers (JSON model, Matrix Market) and of `eigenframe modes` on files:
 * arbitrary strings, and mutations of valid files (characters deleted, duplicated or replaced,
 * tokens swapped, numbers changed to NaN, 1e400, -0, strings, null…, and structural edits of
 * the parsed JSON). The contract under test is DESIGN.md's: bad input gives a typed error
 * (an EigenframeError subclass) whose path names the item and whose message is not empty —
 * never a TypeError, RangeError or other crash; the CLI answers with status 0, or a non-zero
 * status and exactly one line on standard error (and never its "internal error" line).
 */
import fc from 'fast-check';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../src/cli/run';
import { EigenframeError } from '../src/errors';
import { readMatrixMarket } from '../src/io/matrix-market';
import type { SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { modalAnalysis } from '../src/modal/analysis';
import { assemble } from '../src/model/assemble';
import { findMechanisms } from '../src/model/mechanisms';
import { jsonErrorOffset, parseModel, validateModel } from '../src/model/read';

const SEED = Number(process.env.FC_SEED ?? 42);
const runs = (n: number) => Number(process.env.FC_RUNS ?? n);

/** Runs fn; returns 'ok' or the error class name, and fails on anything but a well-formed EigenframeError. */
function outcome(fn: () => unknown): string {
  try {
    fn();
    return 'ok';
  } catch (e) {
    if (!(e instanceof EigenframeError)) throw e;
    expect(e.path.length, `empty path: ${e.message}`).toBeGreaterThan(0);
    expect(e.detail.trim().length, `empty message at ${e.path}`).toBeGreaterThan(0);
    return e.name;
  }
}

// ---------------------------------------------------------------------------------------------
// Valid seeds (small invented models and matrices, demo data)

const PLANE_MODEL = {
  format: 'eigenframe-model/1',
  title: 'portal with a strut',
  space: 'plane',
  mass: 'consistent',
  materials: { steel: { E: 2.1e11, G: 8.1e10, density: 7850 } },
  sections: { col: { A: 5e-3, Iz: 4e-5, kappa: 0.8 }, rod: { A: 1e-3 } },
  nodes: [
    { id: 'a', x: 0, y: 0 },
    { id: 'b', x: 4, y: 0 },
    { id: 'c', x: 0, y: 3 },
    { id: 'd', x: 4, y: 3 },
  ],
  elements: [
    { id: 'c1', kind: 'beam', nodes: ['a', 'c'], material: 'steel', section: 'col' },
    { id: 'c2', kind: 'timoshenko', nodes: ['b', 'd'], material: 'steel', section: 'col' },
    { id: 'g1', kind: 'beam', nodes: ['c', 'd'], material: 'steel', section: 'col' },
    { id: 's1', kind: 'bar', nodes: ['a', 'd'], material: 'steel', section: 'rod' },
  ],
  supports: [
    { node: 'a', fixed: ['ux', 'uy', 'rz'] },
    { node: 'b', fixed: ['ux', 'uy'] },
  ],
  springs: [{ node: 'd', dof: 'ux', stiffness: 2e6 }],
  masses: [{ node: 'c', mass: 120, inertia: 3 }],
};

const SPACE_MODEL = {
  format: 'eigenframe-model/1',
  space: 'space',
  mass: 'lumped',
  materials: { al: { E: 7e10, G: 2.6e10, density: 2700 } },
  sections: { tube: { A: 2e-3, Iz: 3e-6, Iy: 3e-6, J: 6e-6 }, wire: { A: 2e-4 } },
  nodes: [
    { id: 'p', x: 0, y: 0, z: 0 },
    { id: 'q', x: 0, y: 0, z: 3 },
    { id: 'r', x: 2, y: 0, z: 3 },
    { id: 's', x: 2, y: 1, z: 0 },
  ],
  elements: [
    { id: 'm1', kind: 'beam', nodes: ['p', 'q'], material: 'al', section: 'tube', orientation: [1, 0, 0] },
    { id: 'm2', kind: 'beam', nodes: ['q', 'r'], material: 'al', section: 'tube' },
    { id: 'w1', kind: 'bar', nodes: ['r', 's'], material: 'al', section: 'wire' },
  ],
  supports: [
    { node: 'p', fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] },
    { node: 's', fixed: ['ux', 'uy', 'uz'] },
  ],
  springs: [{ node: 'r', to: 'q', dof: 'uy', stiffness: 1e5 }, { node: 'r', dof: 'uy', stiffness: 1e5 }],
  masses: [{ node: 'r', mass: 40 }],
};

const MODEL_TEXTS = [JSON.stringify(PLANE_MODEL, null, 1), JSON.stringify(SPACE_MODEL)];

// K of a 4-DOF spring chain and a diagonal M, in three Matrix Market layouts.
const MTX_TEXTS = [
  '%%MatrixMarket matrix coordinate real symmetric\n% stiffness, N/m\n4 4 7\n1 1 2e6\n2 1 -1e6\n2 2 2e6\n3 2 -1e6\n3 3 2e6\n4 3 -1e6\n4 4 1e6\n',
  '%%MatrixMarket matrix coordinate real general\n3 3 5\n1 1 4.5\n1 2 -1.25\n2 1 -1.25\n2 2 3\n3 3 1.0e+00\n',
  '%%MatrixMarket matrix array real symmetric\n3 3\n2\n-1\n0\n2\n-1\n2\n',
];
const MASS_MTX = '%%MatrixMarket matrix coordinate real symmetric\n4 4 4\n1 1 10\n2 2 10\n3 3 10\n4 4 5\n';

// ---------------------------------------------------------------------------------------------
// Text mutations

const REPLACEMENTS = ['NaN', '1e400', '-1e400', '-0', '0', '-1', '1e-320', '"7"', 'null', 'true', '[]', '{}', 'Infinity', '0x10', '1e', '.5', '5.', '99999999999', '1e308', '-', '""', '1e-300', '1e300', '5e-324', '1.7976931348623157e308', '-1e-300', '1e-12', '1e12'];
const CHARS = ['{', '}', '[', ']', ',', ':', '"', '-', '.', 'e', '0', '9', ' ', '\n', '%', '\u0000', '\uFFFF', 'x', '\\', '\r', '\t', 'é'];

type Mutation =
  | { op: 'delete' | 'duplicate'; at: number; len: number }
  | { op: 'replaceChar'; at: number; c: string }
  | { op: 'swapTokens'; at: number; with: number }
  | { op: 'number'; at: number; to: string };

const mutationArb: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ op: fc.constantFrom<'delete' | 'duplicate'>('delete', 'duplicate'), at: fc.nat(), len: fc.integer({ min: 1, max: 12 }) }),
  fc.record({ op: fc.constant<'replaceChar'>('replaceChar'), at: fc.nat(), c: fc.constantFrom(...CHARS) }),
  fc.record({ op: fc.constant<'swapTokens'>('swapTokens'), at: fc.nat(), with: fc.nat() }),
  fc.record({ op: fc.constant<'number'>('number'), at: fc.nat(), to: fc.constantFrom(...REPLACEMENTS) }),
);

const TOKEN = /"(?:[^"\\]|\\.)*"|-?\d+(?:\.\d*)?(?:[eE][+-]?\d+)?|[A-Za-z%]+|[^\s]/g;
const NUMBER = /-?\d+(?:\.\d*)?(?:[eE][+-]?\d+)?/g;

function spans(text: string, re: RegExp): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (const m of text.matchAll(re)) out.push([m.index!, m.index! + m[0].length]);
  return out;
}

function mutate(text: string, muts: readonly Mutation[]): string {
  let t = text;
  for (const m of muts) {
    const L = Math.max(t.length, 1);
    if (m.op === 'delete') {
      const a = m.at % L;
      t = t.slice(0, a) + t.slice(a + m.len);
    } else if (m.op === 'duplicate') {
      const a = m.at % L;
      t = t.slice(0, a + m.len) + t.slice(a, a + m.len) + t.slice(a + m.len);
    } else if (m.op === 'replaceChar') {
      const a = m.at % L;
      t = t.slice(0, a) + m.c + t.slice(a + 1);
    } else if (m.op === 'swapTokens') {
      const s = spans(t, TOKEN);
      if (s.length < 2) continue;
      let [i, j] = [m.at % s.length, m.with % s.length];
      if (i === j) continue;
      if (i > j) [i, j] = [j, i];
      const [a0, a1] = s[i];
      const [b0, b1] = s[j];
      t = t.slice(0, a0) + t.slice(b0, b1) + t.slice(a1, b0) + t.slice(a0, a1) + t.slice(b1);
    } else if (m.op === 'number') {
      const s = spans(t, NUMBER);
      if (s.length === 0) continue;
      const [a0, a1] = s[m.at % s.length];
      t = t.slice(0, a0) + m.to + t.slice(a1);
    }
  }
  return t;
}

const mutatedModelText = fc.tuple(fc.constantFrom(...MODEL_TEXTS), fc.array(mutationArb, { minLength: 1, maxLength: 4 })).map(([t, m]) => mutate(t, m));
// Numbers changed to values that keep the JSON valid (so the model reaches validation,
// assembly and the solver): extremes of the double range, zeros, and other JSON types.
const JSON_NUMBERS = ['-0', '0', '-1', '1e-300', '1e300', '5e-324', '1.7976931348623157e308', '1e-12', '1e12', '1e400', '"7"', 'null', 'true', '[]', '{}', '2', '0.5'];
const numberEdits = fc.array(fc.record({ op: fc.constant<'number'>('number'), at: fc.nat(), to: fc.constantFrom(...JSON_NUMBERS) }), { minLength: 1, maxLength: 3 });
const numberMutatedModelText = fc.tuple(fc.constantFrom(...MODEL_TEXTS), numberEdits).map(([t, m]) => mutate(t, m));
const mutatedMtxText = fc.tuple(fc.constantFrom(...MTX_TEXTS), fc.array(mutationArb, { minLength: 1, maxLength: 4 })).map(([t, m]) => mutate(t, m));

// Structural edits of the parsed model: set a value at a random path to an arbitrary JSON
// value, delete a key, or duplicate an array item (duplicate ids, repeated supports…).
type Edit = { kind: 'set' | 'delete' | 'duplicate'; pick: number[]; value: unknown };
const editArb: fc.Arbitrary<Edit> = fc.record({
  kind: fc.constantFrom<'set' | 'delete' | 'duplicate'>('set', 'set', 'delete', 'duplicate'),
  pick: fc.array(fc.nat(), { minLength: 1, maxLength: 5 }),
  value: fc.oneof(
    fc.jsonValue({ maxDepth: 2 }),
    fc.constantFrom(0, -0, -1, 1e-300, 1e300, Number.MAX_VALUE, '', 'a', 'c', 'steel', 'ux', 'rz', 'uz', [1, 0, 0], [0, 0, 0], [1, 2], ['a', 'a'], ['c', 'd']),
  ),
});

function applyEdit(root: unknown, e: Edit): unknown {
  const copy = structuredClone(root);
  let parent: Record<string, unknown> | unknown[] | undefined;
  let key: string | number | undefined;
  let cur: unknown = copy;
  for (const p of e.pick) {
    if (typeof cur !== 'object' || cur === null) break;
    const keys = Array.isArray(cur) ? cur.map((_, i) => i) : Object.keys(cur);
    if (keys.length === 0) break;
    parent = cur as Record<string, unknown>;
    key = keys[p % keys.length];
    cur = (cur as Record<string, unknown>)[key as string];
  }
  if (parent === undefined || key === undefined) return e.value;
  if (e.kind === 'set') (parent as Record<string, unknown>)[key as string] = e.value;
  else if (e.kind === 'delete') {
    if (Array.isArray(parent)) parent.splice(key as number, 1);
    else delete parent[key as string];
  } else if (Array.isArray(parent)) parent.splice(key as number, 0, structuredClone(parent[key as number]));
  return copy;
}

/** Reads a model text; when valid, assembles it, lists mechanisms and solves a few modes. */
function readAndSolve(text: string): string {
  return outcome(() => {
    const model = parseModel(text, 'fuzz.json');
    const asm = assemble(model);
    findMechanisms(asm);
    const r = modalAnalysis(asm, { count: Math.min(3, asm.stiffness.n) });
    // A result is a real result: finite, non-negative frequencies (DESIGN.md, command line).
    for (const m of r.modes) expect(Number.isFinite(m.frequency) && m.frequency >= 0, `frequency ${m.frequency}`).toBe(true);
  });
}

/** Structural checks of a matrix the reader returned. */
function wellFormed(a: SymmetricCsc): void {
  expect(a.colPtr.length).toBe(a.n + 1);
  expect(a.colPtr[0]).toBe(0);
  expect(a.rowIdx.length).toBe(a.colPtr[a.n]);
  expect(a.values.length).toBe(a.colPtr[a.n]);
  for (let j = 0; j < a.n; j++) {
    expect(a.colPtr[j + 1]).toBeGreaterThanOrEqual(a.colPtr[j]);
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      expect(a.rowIdx[p]).toBeGreaterThanOrEqual(p === a.colPtr[j] ? j : a.rowIdx[p - 1] + 1);
      expect(a.rowIdx[p]).toBeLessThan(a.n);
      expect(Number.isFinite(a.values[p])).toBe(true);
    }
  }
}

// ---------------------------------------------------------------------------------------------

/**
 * Counts the outcomes of `readAndSolve` over a property run; `expectBothOutcomes` checks the run
 * was not vacuous: some inputs still solved and others were refused with a ModelError.
 */
function tally(): { add: (outcome: string) => void; expectBothOutcomes: () => void } {
  const seen = new Map<string, number>();
  return {
    add: (r) => void seen.set(r, (seen.get(r) ?? 0) + 1),
    expectBothOutcomes: () => {
      if (process.env.FC_DEBUG) console.log(seen);
      expect(seen.get('ok') ?? 0).toBeGreaterThan(0);
      expect(seen.get('ModelError') ?? 0).toBeGreaterThan(0);
    },
  };
}

describe('fuzz: JSON model reader', () => {
  it('the seed models are valid and solve', () => {
    for (const t of MODEL_TEXTS) expect(readAndSolve(t)).toBe('ok');
  });

  it('an unknown key that is not an identifier is named in bracket form (found by this fuzzer: the path was empty)', () => {
    const top = (() => { try { validateModel({ '': 0 }); } catch (e) { return e as EigenframeError; } })();
    expect(top?.name).toBe('ModelError');
    expect(top?.path).toBe('[""]');
    const nested = (() => { try { validateModel({ ...PLANE_MODEL, materials: { steel: { E: 2e11, density: 7850, 'G ': 8e10 } } }); } catch (e) { return e as EigenframeError; } })();
    expect(nested?.path).toBe('materials.steel["G "]');
  });

  it('valid properties that overflow in the element formulas are refused by element (found by this fuzzer: NaN reached the solver)', () => {
    // κ = 1e-300 passes validation (> 0) but makes the Timoshenko shear parameter
    // Φ = 12EI/(κGAL²) infinite and the element matrices NaN.
    const model = structuredClone(PLANE_MODEL);
    model.sections.col.kappa = 1e-300;
    let err: EigenframeError | undefined;
    try {
      modalAnalysis(parseModel(JSON.stringify(model)), { count: 2 });
    } catch (e) {
      err = e as EigenframeError;
    }
    expect(err?.name).toBe('ModelError');
    expect(err?.path).toBe('elements[1]');
    expect(err?.detail).toMatch(/element "c2"/);
  });

  it('deeply nested invalid JSON: a ModelError with line and column, not a stack overflow (found by this suite)', () => {
    for (const text of ['['.repeat(100000), '{"a":'.repeat(50000)]) {
      let err: unknown;
      try {
        parseModel(text, 'deep.json');
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(EigenframeError);
      expect((err as EigenframeError).path).toBe(`deep.json:1:${text.length + 1}`);
    }
  });

  it('the syntax-error locator agrees with JSON.parse on what is valid JSON (RFC 8259)', () => {
    const text = fc.oneof(fc.string({ maxLength: 60 }), fc.json({ maxDepth: 3 }), mutatedModelText, fc.json().map((j) => ` ${j}\n`), fc.constantFrom('', ' ', '01', '-', '1.', '.5', '1e', '"\\u12"', '[1,]', '{"a":1,}', 'nul', '"\t"'));
    fc.assert(
      fc.property(text, (t) => {
        let valid = true;
        try {
          JSON.parse(t);
        } catch {
          valid = false;
        }
        const at = jsonErrorOffset(t);
        expect(at === -1, `${JSON.stringify(t)}: offset ${at}`).toBe(valid);
        if (!valid) expect(at).toBeLessThanOrEqual(t.length);
      }),
      { seed: SEED, numRuns: runs(600) },
    );
  });

  it('arbitrary strings: a model or a typed error with a path', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 200 }), fc.string({ unit: 'binary', maxLength: 80 }), fc.json({ maxDepth: 3 })), (text) => {
        outcome(() => parseModel(text));
      }),
      { seed: SEED, numRuns: runs(400) },
    );
  });

  it('arbitrary JSON values through validateModel: a model or a typed error with a path', () => {
    fc.assert(
      fc.property(fc.anything({ maxDepth: 3, withNullPrototype: true, withObjectString: true }), (value) => {
        outcome(() => validateModel(value));
      }),
      { seed: SEED, numRuns: runs(300) },
    );
  });

  it('mutated valid files (text level): typed error or a result, through reading, assembly and solve', () => {
    const seen = tally();
    fc.assert(
      fc.property(mutatedModelText, (text) => {
        const r = readAndSolve(text);
        seen.add(r);
      }),
      { seed: SEED, numRuns: runs(300) },
    );
    seen.expectBothOutcomes();
  });

  it('numbers changed to extreme or ill-typed values: typed error or finite frequencies', () => {
    const seen = tally();
    fc.assert(
      fc.property(numberMutatedModelText, (text) => {
        const r = readAndSolve(text);
        seen.add(r);
      }),
      { seed: SEED, numRuns: runs(300) },
    );
    seen.expectBothOutcomes();
  });

  it('mutated valid models (structure level): typed error or a result, through reading, assembly and solve', () => {
    const seen = tally();
    fc.assert(
      fc.property(fc.constantFrom(PLANE_MODEL, SPACE_MODEL), fc.array(editArb, { minLength: 1, maxLength: 3 }), (base, edits) => {
        const value = edits.reduce<unknown>((v, e) => applyEdit(v, e), base);
        const r = readAndSolve(JSON.stringify(value) ?? 'undefined');
        seen.add(r);
        outcome(() => validateModel(value));
      }),
      { seed: SEED, numRuns: runs(400) },
    );
    seen.expectBothOutcomes();
  });
});

describe('fuzz: Matrix Market reader', () => {
  it('the seed files are valid', () => {
    for (const t of [...MTX_TEXTS, MASS_MTX]) wellFormed(readMatrixMarket(t, 'seed.mtx'));
  });

  it('arbitrary strings, with and without a valid banner: a matrix or a typed error with a path', () => {
    const banner = fc.constantFrom('', '%%MatrixMarket matrix coordinate real symmetric\n', '%%MatrixMarket matrix array real general\n', '%%MatrixMarket matrix coordinate integer general\n');
    fc.assert(
      fc.property(banner, fc.string({ maxLength: 120 }), (b, body) => {
        let a: SymmetricCsc | undefined;
        const r = outcome(() => {
          a = readMatrixMarket(b + body, 'fuzz.mtx');
        });
        if (r === 'ok') wellFormed(a!);
        else expect(r).toBe('MatrixMarketError');
      }),
      { seed: SEED, numRuns: runs(400) },
    );
  });

  it('mutated valid files: a well-formed matrix or a MatrixMarketError naming file:line', () => {
    fc.assert(
      fc.property(mutatedMtxText, (text) => {
        let a: SymmetricCsc | undefined;
        let err: unknown;
        try {
          a = readMatrixMarket(text, 'K.mtx');
        } catch (e) {
          err = e;
        }
        if (err === undefined) {
          wellFormed(a!);
          return;
        }
        expect(err).toBeInstanceOf(EigenframeError);
        const e = err as EigenframeError;
        expect(e.name).toBe('MatrixMarketError');
        expect(e.path).toMatch(/^K\.mtx:\d+$/);
        expect(e.detail.length).toBeGreaterThan(0);
      }),
      { seed: SEED, numRuns: runs(500) },
    );
  });
});

describe('fuzz: eigenframe modes on mutated files', () => {
  const dir = mkdtempSync(join(tmpdir(), 'eigenframe-fuzz-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  /** Status 0, or non-zero with exactly one stderr line that is not an internal error. */
  function checkCli(r: { status: number; stdout: string; stderr: string }): void {
    if (r.status === 0) {
      expect(r.stdout.length).toBeGreaterThan(0);
      return;
    }
    expect(r.stderr.endsWith('\n'), r.stderr).toBe(true);
    expect(r.stderr.slice(0, -1).includes('\n'), r.stderr).toBe(false);
    expect(r.stderr, r.stderr).not.toMatch(/internal error/);
    expect([1, 2]).toContain(r.status);
    expect(r.stdout).toBe('');
  }

  it('model files: status 0, or one line on stderr', () => {
    let k = 0;
    fc.assert(
      fc.property(fc.oneof(mutatedModelText, numberMutatedModelText), (text) => {
        const file = join(dir, `m${k++}.json`);
        writeFileSync(file, text);
        checkCli(runCli(['modes', file, '--count', '3']));
      }),
      { seed: SEED, numRuns: runs(25) },
    );
  });

  it('random command lines for modes (options, values, order): status 0, or one line on stderr', () => {
    const model = join(dir, 'valid.json');
    writeFileSync(model, MODEL_TEXTS[0]);
    const kFile = join(dir, 'valid.K.mtx');
    const mFile = join(dir, 'valid.M.mtx');
    writeFileSync(kFile, MTX_TEXTS[0]);
    writeFileSync(mFile, MASS_MTX);
    const token = fc.constantFrom(
      model, kFile, mFile, join(dir, 'missing.json'), dir,
      '--count', '--from', '--to', '--near', '--method', '--lumped', '--json', '--shapes', '--stiffness', '--mass', '--bogus', '-c', '--', '--count=2',
      '0', '1', '3', '-1', '2.5', '1e400', 'NaN', '', 'abc', 'dense', 'lanczos', 'subspace', 'jacobi', '1e-300', '1e300', '7',
    );
    fc.assert(
      fc.property(fc.array(token, { maxLength: 7 }), (args) => {
        const r = runCli(['modes', ...args]);
        checkCli(r);
      }),
      { seed: SEED, numRuns: runs(150) },
    );
  });

  it('Matrix Market pairs: status 0, or one line on stderr', () => {
    let k = 0;
    fc.assert(
      fc.property(fc.array(mutationArb, { minLength: 1, maxLength: 3 }), fc.boolean(), (muts, which) => {
        const kFile = join(dir, `k${k}.mtx`);
        const mFile = join(dir, `m${k++}.mtx`);
        writeFileSync(kFile, which ? mutate(MTX_TEXTS[0], muts) : MTX_TEXTS[0]);
        writeFileSync(mFile, which ? MASS_MTX : mutate(MASS_MTX, muts));
        checkCli(runCli(['modes', '--stiffness', kFile, '--mass', mFile, '--count', '2', '--json']));
      }),
      { seed: SEED, numRuns: runs(25) },
    );
  });
});
