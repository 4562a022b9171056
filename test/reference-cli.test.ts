/**
 * `eigenframe reference` (list, write, check) through its command function. The results files
 * checked here are produced by eigenframe's own solver on the written model (the check must
 * pass) and then altered (the check must fail), so nothing is hard-coded.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from '../src/cli/args';
import { REFERENCE_SPEC, runReference } from '../src/cli/commands/reference';
import { referenceCase, referenceCases } from '../src/reference/catalogue';
import { parseModel } from '../src/model/read';
import { assemble } from '../src/model/assemble';
import { solve } from '../src/eigen/solve';
import { readMatrixMarket } from '../src/io/matrix-market';
import { toDenseArray } from '../src/linalg/sparse/symmetric';
import { thrown } from './argument-path';

const dir = mkdtempSync(join(tmpdir(), 'eigenframe-reference-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = (...argv: string[]) => runReference(parseArgs(REFERENCE_SPEC, argv));

/** Frequencies (Hz) of a written model, solved by eigenframe. */
function solvedFrequencies(modelPath: string, count: number): number[] {
  const asm = assemble(parseModel(readFileSync(modelPath, 'utf8'), modelPath));
  const r = solve(asm.stiffness, asm.mass, { count });
  return Array.from(r.eigenvalues, (l) => Math.sqrt(Math.max(l, 0)) / (2 * Math.PI));
}

describe('reference list', () => {
  it('lists every case with its stated mesh and tolerance', () => {
    const out = run('list');
    for (const c of referenceCases()) expect(out.stdout).toContain(c.id);
    expect(out.stdout).toContain(`${referenceCases().length} cases`);
    expect(out.status ?? 0).toBe(0);
  });
});

describe('reference write', () => {
  it('writes the model, expected values, K, M and the DOF map of one case', () => {
    const out = run('write', 'beam-cantilever', '--dir', dir);
    const c = referenceCase('beam-cantilever');
    const stem = join(dir, 'beam-cantilever');
    for (const ext of ['model.json', 'expected.json', 'K.mtx', 'M.mtx', 'dofs.csv']) expect(existsSync(`${stem}.${ext}`)).toBe(true);
    expect(out.stdout.trim().split('\n')).toHaveLength(5);
    const model = parseModel(readFileSync(`${stem}.model.json`, 'utf8'), 'model.json');
    expect(model.elements).toHaveLength(c.mesh);
    const expected = JSON.parse(readFileSync(`${stem}.expected.json`, 'utf8'));
    expect(expected.format).toBe('eigenframe-reference/1');
    expect(expected.values).toEqual(c.exact(c.count));
    expect(expected.stated).toEqual({ mesh: c.mesh, count: c.count, tolerance: c.tolerance });
    expect(expected.source).toBe(c.source);
    // K.mtx reads back to the assembled stiffness, bit for bit.
    const K = readMatrixMarket(readFileSync(`${stem}.K.mtx`, 'utf8'), 'K.mtx');
    expect(Array.from(toDenseArray(K))).toEqual(Array.from(toDenseArray(assemble(model).stiffness)));
  });

  it('writes every case at a given mesh; buckling cases carry their load, no M', () => {
    const sub = join(dir, 'all');
    run('write', 'all', '--dir', sub, '--mesh', '4');
    for (const c of referenceCases()) expect(existsSync(join(sub, `${c.id}.model.json`))).toBe(true);
    expect(existsSync(join(sub, 'buckling-fixed-free.M.mtx'))).toBe(false);
    const e = JSON.parse(readFileSync(join(sub, 'buckling-fixed-free.expected.json'), 'utf8'));
    expect(e.mesh).toBe(4);
    expect(e.loads).toEqual([{ node: 'n4', dof: 'uy', force: expect.any(Number) }]);
    expect(e.unit).toBe('load factor');
  });

  it('rejects a missing --dir, an unknown id and misplaced options', () => {
    expect(thrown(() => run('write', 'beam-cantilever')).path).toBe('--dir');
    const unknown = thrown(() => run('write', 'beam-cantilevr', '--dir', dir));
    expect(unknown.path).toBe('beam-cantilevr');
    expect(unknown.detail).toContain('beam-cantilever');
    expect(thrown(() => run('write', 'beam-cantilever', '--dir', dir, '--tolerance', '1e-3')).path).toBe('--tolerance');
    expect(thrown(() => run('frobnicate')).path).toBe('reference');
    expect(thrown(() => run()).path).toBe('reference');
  });
});

describe('reference check', () => {
  const c = referenceCase('beam-free-free');
  run('write', c.id, '--dir', dir);
  const values = solvedFrequencies(join(dir, `${c.id}.model.json`), c.count + 2);

  it('passes eigenframe results in plain text, with the table and status 0', () => {
    const file = join(dir, 'results.txt');
    writeFileSync(file, `# eigenframe, ${c.id}\n${values.join('\n')}\n`);
    const out = run('check', c.id, file);
    expect(out.status ?? 0).toBe(0);
    expect(out.stdout).toContain(`PASS: ${c.count} of ${c.count} values`);
    expect(out.stdout).toContain('2 further values not checked');
    expect(out.stderr).toBe('');
  });

  it('passes eigenframe --json shaped results (eigenvalues only)', () => {
    const file = join(dir, 'results.json');
    writeFileSync(file, JSON.stringify({ modes: values.map((f, k) => ({ mode: k + 1, eigenvalue: (2 * Math.PI * f) ** 2 })) }));
    expect(run('check', c.id, file).status ?? 0).toBe(0);
  });

  it('fails a value off by 1e-3 and a short list, with status 1', () => {
    const file = join(dir, 'bad.json');
    const bad = values.slice(0, c.count);
    bad[3] *= 1.001;
    writeFileSync(file, JSON.stringify(bad));
    const out = run('check', c.id, file);
    expect(out.status).toBe(1);
    expect(out.stdout).toMatch(/FAIL: 5 of 6/);
    expect(out.stderr).toContain('failed');
    // The same values pass a looser tolerance.
    expect(run('check', c.id, file, '--tolerance', '2e-3').status ?? 0).toBe(0);
    writeFileSync(file, JSON.stringify(values.slice(0, 3)));
    const short = run('check', c.id, file);
    expect(short.status).toBe(1);
    expect(short.stdout).toContain('MISSING');
    expect(short.stdout).toContain('3 missing');
  });

  it('names the bad line of a results file and rejects a missing one', () => {
    const file = join(dir, 'typo.txt');
    writeFileSync(file, '0\n0\n32.9x\n');
    expect(thrown(() => run('check', c.id, file)).path).toBe(`${file}:3`);
    expect(thrown(() => run('check', c.id, join(dir, 'nope.txt'))).path).toBe(join(dir, 'nope.txt'));
    expect(thrown(() => run('check', c.id)).path).toBe('reference');
    expect(thrown(() => run('check', c.id, file, '--dir', dir)).path).toBe('--dir');
  });
});
