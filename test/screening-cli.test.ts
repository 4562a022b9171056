import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseArgs } from '../src/cli/args';
import { runScreen, SCREEN_SPEC, parseBandOption } from '../src/cli/commands/screen';
import { runResponse, RESPONSE_SPEC } from '../src/cli/commands/response';
import { ENGINEERING_CAUTION } from '../src/io/caution';
import { findAll, parseXml } from './svg-helpers';
import { pathOf } from './argument-path';

const model = new URL('../examples/footbridge.json', import.meta.url).pathname;
const screen = (...argv: string[]) => runScreen(parseArgs(SCREEN_SPEC, argv));
const response = (...argv: string[]) => runResponse(parseArgs(RESPONSE_SPEC, argv));

describe('eigenframe screen', () => {
  it('default walking bands: text with verdict, coverage and caution', () => {
    const out = screen(model);
    expect(out.stdout).toContain('Verdict:');
    expect(out.stdout).toContain('Coverage: every mode up to');
    expect(out.stdout).toContain(ENGINEERING_CAUTION);
    expect(out.stdout).toContain('walking-lateral');
  });

  it('a machine band and a band of the user, as JSON', () => {
    // 580 rpm = 9.667 Hz (rpm/60), which the demo's vertical mode sits next to.
    const out = screen(model, '--rpm', '580', '--rpm-tolerance', '5', '--band', 'deck:0:1:vertical+lateral', '--json');
    const j = JSON.parse(out.stdout);
    expect(j.format).toBe('eigenframe-screening/1');
    expect(j.bands.map((b: { name: string }) => b.name)).toEqual(['deck', 'machine 580 rpm']);
    expect(j.bands[1].fLow).toBeCloseTo((580 / 60) * 0.95, 9);
    expect(j.coverage.complete).toBe(true);
    expect(j.verdict).toBe('in-band');
    expect(j.caution).toBe(ENGINEERING_CAUTION);
  });

  it('writes the report to a file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'ef-screen-'));
    try {
      const out = screen(model, '--preset', 'jogging', '--output', join(dir, 'r.txt'));
      expect(out.stdout).toBe('');
      expect(readFileSync(join(dir, 'r.txt'), 'utf8')).toContain('jogging');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('bad input names the option', () => {
    expect(pathOf(() => screen(model, '--band', 'pump:9:x:any'))).toBe('--band');
    expect(pathOf(() => screen(model, '--band', 'pump:9:8:any'))).toBe('--band');
    expect(pathOf(() => screen(model, '--band', 'pump:9:10:sideways'))).toBe('--band');
    expect(pathOf(() => screen(model, '--preset', 'marching'))).toBe('--preset');
    expect(pathOf(() => screen(model, '--rpm-tolerance', '5'))).toBe('--rpm-tolerance');
    expect(pathOf(() => screen(model, '--clearance', '150'))).toBe('--clearance');
    expect(pathOf(() => screen())).toBe('screen');
    expect(parseBandOption('pump:9:11:vertical+torsional', 0).directions).toEqual(['vertical', 'torsional']);
  });
});

describe('eigenframe response', () => {
  it('sweep at a deck node: natural frequencies merged into the sweep, JSON', () => {
    // The same NODE:DOF:VALUE syntax as `buckling --load`: two loads of 0.5 N equal the default 1 N.
    const split = JSON.parse(response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '8:11:4', '--load', 'nb3:uz:0.5,nb3:uz:0.5', '--json').stdout);
    const j = JSON.parse(response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '8:11:4', '--json').stdout);
    expect(split.responses[0]).toEqual(j.responses[0]);
    expect(j.format).toBe('eigenframe-harmonic/1');
    expect(j.frequencies.length).toBeGreaterThan(4);
    expect(j.frequencies[0]).toBe(8);
    expect(j.responses[0].dof).toBe('uz');
    expect(j.modesUsed).toBeGreaterThanOrEqual(12);
    const text = response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '8:11:4', '--damping', '0.02').stdout;
    expect(text).toContain('damping 2.00 %');
    expect(text).toContain(ENGINEERING_CAUTION);
  });

  it('walker on a mode with a comfort limit', () => {
    const j = JSON.parse(response(model, '--walker', '3', '--comfort-limit', '0.7', '--json').stdout);
    expect(j.mode).toBe(3);
    expect(j.comfortLimit).toBe(0.7);
    expect(['within-limit', 'exceeds-limit']).toContain(j.verdict);
    expect(response(model, '--walker', '3').stdout).toContain('antinode');
  });

  it('bad input names the option', () => {
    expect(pathOf(() => response(model, '--node', 'nb3', '--dof', 'uw', '--sweep', '1:2:3'))).toBe('--dof');
    expect(pathOf(() => response(model, '--node', 'zz', '--dof', 'uz', '--sweep', '1:2:3'))).toBe('--node');
    expect(pathOf(() => response(model, '--node', 'nb0', '--dof', 'uz', '--sweep', '1:2:3'))).toBe('--node'); // supported DOF
    expect(pathOf(() => response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '3:2:3'))).toBe('--sweep');
    expect(pathOf(() => response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '1:2:3', '--load', 'nb3:uz'))).toBe('--load');
    expect(pathOf(() => response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '1:2:3', '--load', 'zz:uz:100'))).toBe('--load');
    expect(pathOf(() => response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '1:2:3', '--load', 'nb0:uz:100'))).toBe('--load'); // supported DOF
    expect(pathOf(() => response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '1:2:3', '--damping', '2'))).toBe('--damping');
    expect(pathOf(() => response(model, '--walker', '2', '--node', 'nb3'))).toBe('--node');
    expect(pathOf(() => response(model))).toBe('response');
    expect(pathOf(() => response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '1:2:3', '--preset', 'walking-vertical'))).toBe('--preset');
    expect(pathOf(() => response(model, '--walker', '2', '--svg', join(tmpdir(), 'never.svg')))).toBe('--svg');
  });

  it('--svg writes the acceleration chart with the chosen bands shaded', () => {
    const dir = mkdtempSync(join(tmpdir(), 'eigenframe-frf-'));
    try {
      const file = join(dir, 'frf.svg');
      const out = response(model, '--node', 'nb3', '--dof', 'uz', '--sweep', '1:12:120', '--svg', file, '--band', 'pump:9:10.5:vertical', '--json');
      expect(out.stderr).toContain(`chart written to ${file}`);
      const j = JSON.parse(out.stdout);
      const root = parseXml(readFileSync(file, 'utf8'));
      const bands = findAll(root, (e) => e.attrs.class === 'band');
      expect(bands.map((b) => b.attrs['data-band'])).toEqual(['pump']);
      const peak = findAll(root, (e) => e.attrs.class === 'peak')[0];
      const acc: number[] = j.responses[0].acceleration;
      expect(Number(peak.attrs['data-value'])).toBeCloseTo(Math.max(...acc), 12);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
