/** `eigenframe buckling` (src/cli/commands/buckling.ts) through its command function. */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from '../src/cli/args';
import { BUCKLING_SPEC, runBuckling } from '../src/cli/commands/buckling';
import { parseNodalLoads as parseLoads } from '../src/cli/loads';
import { ModelError } from '../src/errors';
import { bisect } from './model-helpers';
import { pathOf } from './argument-path';

const dir = mkdtempSync(join(tmpdir(), 'eigenframe-buckling-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const run = (...argv: string[]) => runBuckling(parseArgs(BUCKLING_SPEC, argv));

const E = 2.1e11, I = 2e-6, L = 3, ne = 16;
// fixed-pinned column (invented demo section); expected P = x₁²EI/L², x₁ the first root of tan x = x
const model = {
  format: 'eigenframe-model/1', title: 'Column', space: 'plane',
  materials: { steel: { E, density: 7850 } }, sections: { c: { A: 4e-3, Iz: I } },
  nodes: Array.from({ length: ne + 1 }, (_, i) => ({ id: i === ne ? 'top:1' : `n${i}`, x: 0, y: (L * i) / ne })),
  elements: Array.from({ length: ne }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, i + 1 === ne ? 'top:1' : `n${i + 1}`], material: 'steel', section: 'c' })),
  supports: [{ node: 'n0', fixed: ['ux', 'uy', 'rz'] }, { node: 'top:1', fixed: ['ux'] }],
};
const path = join(dir, 'column.json');
writeFileSync(path, JSON.stringify(model));

describe('eigenframe buckling', () => {
  it('text table: the lowest load factor is the fixed-pinned Euler load (Timoshenko & Gere §2.3, from memory)', () => {
    const x1 = bisect((x) => Math.tan(x) - x, Math.PI + 0.1, 1.5 * Math.PI - 1e-6);
    const r = run(path, '--load', 'top:1:uy:-500,top:1:uy:-500', '--count', '2');
    expect(r.stderr).toBe('');
    const row = r.stdout.split('\n').find((l) => /^\s+1\s/.test(l))!;
    const mu = Number(row.trim().split(/\s+/)[1]);
    expect(Math.abs((mu * 1000) / ((x1 * x1 * E * I) / L ** 2) - 1)).toBeLessThan(1e-4);
    expect(r.stdout).toContain('Sturm check passed');
    expect(r.stdout).toContain('Caution');
  });

  it('JSON output with shapes; written atomically with --output', () => {
    const j = JSON.parse(run(path, '--load', 'top:1:uy:-1000', '--json', '--shapes', '--count', '3').stdout);
    expect(j.format).toBe('eigenframe-buckling/1');
    expect(j.modes).toHaveLength(3);
    expect(j.modes[0].loadFactor).toBeLessThan(j.modes[1].loadFactor);
    expect(j.modes[0].shape).toHaveLength(j.dofs.length);
    expect(j.axialForces[0].axialForce).toBeCloseTo(-1000, 6);
    expect(j.verification.sturm.passed).toBe(true);
    const out = join(dir, 'b.json');
    const r = run(path, '--load', 'top:1:uy:-1000', '--json', '--output', out);
    expect(r.stdout).toBe('');
    expect(JSON.parse(readFileSync(out, 'utf8')).modes).toHaveLength(4);
  });

  it('load syntax: node ids with colons, several loads, typed errors on --load', () => {
    expect(parseLoads('a:b:uy:-3,c:rz:2e3')).toEqual([{ node: 'a:b', dof: 'uy', value: -3 }, { node: 'c', dof: 'rz', value: 2000 }]);
    const bad: [string[], string][] = [
      [[path], '--load'],
      [[path, '--load', 'top:1:uy'], '--load'],
      [[path, '--load', 'top:1:uq:-1'], '--load'],
      [[path, '--load', 'top:1:uy:abc'], '--load'],
      [[path, '--load', 'nowhere:uy:-1'], '--load'],
      [[path, '--load', 'n0:uy:-1'], '--load'], // supported DOF
      [[path, '--load', 'top:1:uy:1'], '--load'], // tension only
      [[path, '--load', 'top:1:uy:-1', '--method', 'fast'], '--method'],
      [[path, '--load', 'top:1:uy:-1', '--shapes'], '--shapes'],
      [[path, '--load', 'top:1:uy:-1', '--count', '99'], 'count'],
    ];
    for (const [argv, p] of bad) expect(pathOf(() => run(...argv)), argv.join(' ')).toBe(p);
  });

  it('a model with a mechanism is a ModelError naming a node', () => {
    const loose = JSON.parse(JSON.stringify(model));
    loose.supports = [{ node: 'n0', fixed: ['ux', 'uy'] }];
    const p = join(dir, 'loose.json');
    writeFileSync(p, JSON.stringify(loose));
    expect(() => run(p, '--load', 'top:1:uy:-1')).toThrowError(ModelError);
  });
});
