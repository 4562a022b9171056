/** `eigenframe sensitivity` (src/cli/commands/sensitivity.ts) through its command function. */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from '../src/cli/args';
import { runSensitivity, SENSITIVITY_SPEC } from '../src/cli/commands/sensitivity';
import { modalAnalysis } from '../src/modal/analysis';
import { validateModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import { pathOf } from './argument-path';

const dir = mkdtempSync(join(tmpdir(), 'eigenframe-sensitivity-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const run = (...argv: string[]) => runSensitivity(parseArgs(SENSITIVITY_SPEC, argv));

/** Simply supported plane beam, 10 elements, two sections (invented demo data). */
const L = 6, ne = 10;
const model = {
  format: 'eigenframe-model/1', title: 'Beam', space: 'plane',
  materials: { steel: { E: 2.1e11, density: 7850 } },
  sections: { end: { A: 4e-3, Iz: 3e-6 }, mid: { A: 4e-3, Iz: 3e-6 } },
  nodes: Array.from({ length: ne + 1 }, (_, i) => ({ id: `n${i}`, x: (L * i) / ne, y: 0 })),
  elements: Array.from({ length: ne }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'steel', section: i >= 3 && i < 7 ? 'mid' : 'end' })),
  supports: [{ node: 'n0', fixed: ['ux', 'uy'] }, { node: `n${ne}`, fixed: ['uy'] }],
};
const path = join(dir, 'beam.json');
writeFileSync(path, JSON.stringify(model));

describe('eigenframe sensitivity', () => {
  it('ranks the middle of a simply supported beam first for mode 1 (curvature is largest there)', () => {
    const r = run(path, '--mode', '1', '--top', '3');
    const rows = r.stdout.split('\n').filter((l) => /^\d+\s+e\d/.test(l));
    expect(rows).toHaveLength(3);
    expect(['e4', 'e5']).toContain(rows[0].split(/\s+/)[1]);
    expect(r.stdout).toContain('Caution');
  });

  it('JSON: group sums and a what-if that clears a band, confirmed by a fresh model', () => {
    const base = modalAnalysis(validateModel(JSON.parse(JSON.stringify(model))), { count: 6 });
    const f1 = base.modes[0].frequency;
    const j = JSON.parse(run(path, '--mode', '1', '--section', 'mid', '--stiffness-scale', '1.6', '--from', String(0.8 * f1), '--to', String(1.1 * f1), '--json').stdout);
    expect(j.format).toBe('eigenframe-sensitivity/1');
    const sum = j.members.filter((m: { section: string }) => m.section === 'mid').reduce((s: number, m: { stiffness: number }) => s + m.stiffness, 0);
    expect(j.group.stiffness).toBeCloseTo(sum, 6);
    expect(j.whatIf.band.before).toEqual([1]);
    expect(j.whatIf.band.after).toEqual([]);
    // the same change described in the model: E × 1.6 for the "mid" members
    const m2 = JSON.parse(JSON.stringify(model)) as Model;
    m2.materials.stiff = { E: 2.1e11 * 1.6, density: 7850 };
    for (const e of m2.elements) if (e.section === 'mid') e.material = 'stiff';
    const fresh = modalAnalysis(validateModel(m2), { count: 6 });
    expect(Math.abs(j.whatIf.modes[0].frequency / fresh.modes[0].frequency - 1)).toBeLessThan(1e-10);
    expect(j.whatIf.modes[0].before).toBeCloseTo(f1, 9);
  });

  it('text what-if table and band line', () => {
    const r = run(path, '--mode', '2', '--members', 'e0,e9', '--mass-scale', '3', '--count', '4');
    expect(r.stdout).toContain('What-if: "e0,e9" stiffness × 1, mass × 3');
    expect(r.stdout).toMatch(/after Hz/);
  });

  it('--target finds the stiffness factor; a fresh model with that E confirms the frequency', () => {
    const base = modalAnalysis(validateModel(JSON.parse(JSON.stringify(model))), { count: 6 });
    const target = 1.25 * base.modes[0].frequency;
    const j = JSON.parse(run(path, '--mode', '1', '--section', 'mid', '--target', String(target), '--json').stdout);
    const alpha = j.target.stiffnessScale;
    expect(alpha).toBeGreaterThan(1);
    const m2 = JSON.parse(JSON.stringify(model)) as Model;
    m2.materials.stiff = { E: 2.1e11 * alpha, density: 7850 };
    for (const e of m2.elements) if (e.section === 'mid') e.material = 'stiff';
    const fresh = modalAnalysis(validateModel(m2), { count: 6 });
    expect(Math.abs(fresh.modes[0].frequency / target - 1)).toBeLessThan(1e-6);
    const t = run(path, '--mode', '1', '--section', 'mid', '--target', String(target)).stdout;
    expect(t).toMatch(/Target: mode 1 at .* Hz needs the stiffness of "mid" × /);
  });

  it('bad options name the option', () => {
    const bad: [string[], string][] = [
      [[path, '--rank', 'size'], '--rank'],
      [[path, '--members', 'e1', '--section', 'mid'], '--section'],
      [[path, '--stiffness-scale', '2'], '--stiffness-scale'],
      [[path, '--section', 'mid', '--stiffness-scale', '0'], '--stiffness-scale'],
      [[path, '--section', 'mid', '--mass-scale', '-1'], '--mass-scale'],
      [[path, '--section', 'mid', '--stiffness-scale', '2', '--from', '3'], '--from'],
      [[path, '--section', 'nope'], '--section'],
      [[path, '--members', 'e1,zz'], '--members'],
      [[path, '--mode', '3', '--count', '2'], '--count'],
      [[path, '--mode', '99'], '--mode'],
      [[path, '--target', '5'], '--target'],
      [[path, '--section', 'mid', '--target', '5', '--stiffness-scale', '2'], '--target'],
      [[path, '--section', 'mid', '--target', '-5'], '--target'],
      [[path, '--section', 'end', '--mode', '1', '--target', '1e6'], '--target'],
    ];
    for (const [argv, p] of bad) expect(pathOf(() => run(...argv)), argv.join(' ')).toBe(p);
  });
});
