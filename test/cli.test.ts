import { mkdtempSync, readFileSync, writeFileSync, readdirSync, existsSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, EXIT } from '../src/cli/run';
import { parseModel } from '../src/model/read';
import { assemble } from '../src/model/assemble';
import { writeMatrixMarket } from '../src/io/matrix-market';
import { VERSION } from '../src/version';

const DEMO = join(__dirname, '..', 'examples', 'footbridge.json');

function scratch(): string {
  return mkdtempSync(join(tmpdir(), 'eigenframe-cli-'));
}

/** A plane cantilever, 10 Euler–Bernoulli elements, steel tube (for the closed-form check). */
function cantileverText(): string {
  const L = 3;
  const n = 10;
  const nodes = Array.from({ length: n + 1 }, (_, i) => ({ id: `n${i}`, x: (L * i) / n, y: 0 }));
  const elements = Array.from({ length: n }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'steel', section: 'tube' }));
  return JSON.stringify({
    format: 'eigenframe-model/1',
    title: 'cantilever',
    space: 'plane',
    materials: { steel: { E: 2.1e11, density: 7850 } },
    sections: { tube: { A: 6e-3, Iz: 3e-5 } },
    nodes,
    elements,
    supports: [{ node: 'n0', fixed: ['ux', 'uy', 'rz'] }],
  });
}

describe('eigenframe modes', () => {
  it('prints the modes table of the demo with the caution', () => {
    const r = runCli(['modes', DEMO, '--count', '6']);
    expect(r.status).toBe(EXIT.ok);
    expect(r.stderr).toBe('');
    expect(r.stdout).toContain('frequency');
    expect(r.stdout).toContain('Sturm check passed');
    expect(r.stdout).toMatch(/never replace, design to the local codes by a licensed engineer/);
    const rows = r.stdout.split('\n').filter((l) => /^\s+\d+\s+\d/.test(l));
    expect(rows.length).toBe(6);
  });

  it('--json: one object, modes lowest first, eigenvalue and frequency numbers (DESIGN.md contract)', () => {
    const r = runCli(['modes', DEMO, '--count', '5', '--json']);
    expect(r.status).toBe(EXIT.ok);
    const o = JSON.parse(r.stdout);
    expect(o.modes).toHaveLength(5);
    for (let k = 0; k < 5; k++) {
      const m = o.modes[k];
      expect(typeof m.eigenvalue).toBe('number');
      expect(typeof m.frequency).toBe('number');
      // f = √λ / 2π (definition of ω² = λ).
      expect(m.frequency).toBeCloseTo(Math.sqrt(m.eigenvalue) / (2 * Math.PI), 10);
      if (k > 0) expect(m.eigenvalue).toBeGreaterThanOrEqual(o.modes[k - 1].eigenvalue);
    }
    expect(o.verification.sturm.passed).toBe(true);
  });

  it('cantilever first frequency against Euler–Bernoulli theory', () => {
    // Source: Euler–Bernoulli cantilever, β₁L = 1.87510407 (root of 1 + cos x cosh x = 0, from memory).
    const dir = scratch();
    const path = join(dir, 'cantilever.json');
    writeFileSync(path, cantileverText());
    const o = JSON.parse(runCli(['modes', path, '--count', '2', '--json']).stdout);
    const f1 = ((1.87510407 / 3) ** 2 * Math.sqrt((2.1e11 * 3e-5) / (7850 * 6e-3))) / (2 * Math.PI);
    expect(Math.abs(o.modes[0].frequency - f1) / f1).toBeLessThan(1e-4);
  });

  it('window and target requests', () => {
    const all = JSON.parse(runCli(['modes', DEMO, '--count', '12', '--json']).stdout).modes;
    const f1 = all[2].frequency - 0.01;
    const f2 = all[6].frequency + 0.01;
    const win = JSON.parse(runCli(['modes', DEMO, '--from', String(f1), '--to', String(f2), '--json']).stdout).modes;
    expect(win.map((m: { frequency: number }) => m.frequency)).toEqual(
      all.filter((m: { frequency: number }) => m.frequency >= f1 && m.frequency <= f2).map((m: { frequency: number }) => expect.closeTo(m.frequency, 6)),
    );
    const near = JSON.parse(runCli(['modes', DEMO, '--near', String(all[4].frequency), '--count', '1', '--json']).stdout).modes;
    expect(near[0].frequency).toBeCloseTo(all[4].frequency, 6);
  });

  it('solves a Matrix Market pair and agrees with the model route', () => {
    const dir = scratch();
    const asm = assemble(parseModel(readFileSync(DEMO, 'utf8')));
    writeFileSync(join(dir, 'K.mtx'), writeMatrixMarket(asm.stiffness));
    writeFileSync(join(dir, 'M.mtx'), writeMatrixMarket(asm.mass));
    const a = JSON.parse(runCli(['modes', '--stiffness', join(dir, 'K.mtx'), '--mass', join(dir, 'M.mtx'), '--count', '4', '--json']).stdout).modes;
    const b = JSON.parse(runCli(['modes', DEMO, '--count', '4', '--json']).stdout).modes;
    for (let k = 0; k < 4; k++) expect(a[k].eigenvalue / b[k].eigenvalue).toBeCloseTo(1, 9);
    const text = runCli(['modes', '--stiffness', join(dir, 'K.mtx'), '--mass', join(dir, 'M.mtx'), '--count', '3']);
    expect(text.status).toBe(0);
    expect(text.stdout).toContain('eigenvalue');
  });

  it('--output writes the report and nothing is left behind', () => {
    const dir = scratch();
    const out = join(dir, 'modes.json');
    const r = runCli(['modes', DEMO, '--count', '3', '--json', '--output', out]);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe('');
    expect(JSON.parse(readFileSync(out, 'utf8')).modes).toHaveLength(3);
    expect(readdirSync(dir)).toEqual(['modes.json']);
  });
});

describe('eigenframe export', () => {
  it('writes K, M and the DOF map that read back', () => {
    const dir = scratch();
    const r = runCli(['export', DEMO, '--dir', dir]);
    expect(r.status).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['footbridge.K.mtx', 'footbridge.M.mtx', 'footbridge.dofs.json']);
    expect(readFileSync(join(dir, 'footbridge.K.mtx'), 'utf8')).toMatch(/^%%MatrixMarket matrix coordinate real symmetric/);
  });
});

describe('bad input: one line naming the item, non-zero exit', () => {
  const dir = scratch();
  const bad = join(dir, 'bad.json');
  writeFileSync(bad, '{ "format": "eigenframe-model/1",\n  "space": "plane", }');
  const sub = join(dir, 'folder');
  mkdirSync(sub);
  const cases: Array<[string, string[], number, RegExp]> = [
    ['no command', [], EXIT.usage, /Usage: eigenframe COMMAND/],
    ['unknown command', ['vibrate'], EXIT.usage, /unknown command "vibrate"/],
    ['unknown option', ['modes', DEMO, '--colour'], EXIT.usage, /--colour: unknown option/],
    ['count zero', ['modes', DEMO, '--count', '0'], EXIT.usage, /--count: 0 is out of range/],
    ['count not integer', ['modes', DEMO, '--count', '2.5'], EXIT.usage, /--count: "2.5" is not a whole number/],
    ['count negative', ['modes', DEMO, '--count', '-3'], EXIT.usage, /--count: -3 is out of range; give a positive integer/],
    ['count above the DOFs', ['modes', DEMO, '--count', '100000'], EXIT.input, /count/],
    ['missing file', ['modes', join(dir, 'nope.json')], EXIT.input, /nope\.json: model file not found/],
    ['directory', ['modes', sub], EXIT.input, /is a directory/],
    ['JSON syntax', ['modes', bad], EXIT.input, /line 2/],
    ['model and matrices', ['modes', DEMO, '--stiffness', 'K.mtx', '--mass', 'M.mtx'], EXIT.input, /either a model file or --stiffness/],
    ['mass without stiffness', ['modes', '--mass', 'M.mtx'], EXIT.usage, /--stiffness/],
    ['shapes without json', ['modes', DEMO, '--shapes'], EXIT.usage, /--shapes: goes with --json/],
    ['bad method', ['modes', DEMO, '--method', 'guess'], EXIT.usage, /--method: "guess" is not a method/],
  ];
  it.each(cases)('%s', (_name, argv, status, message) => {
    const r = runCli(argv);
    expect(r.status).toBe(status);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(message);
    expect(r.stderr.trim().split('\n').length).toBe(r.stderr.includes('Usage:') ? r.stderr.trim().split('\n').length : 1);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('a failed write leaves no partial file', () => {
    const r = runCli(['modes', DEMO, '--count', '2', '--output', sub]);
    expect(r.status).not.toBe(0);
    expect(readdirSync(sub)).toEqual([]);
  });
});

describe('help and version', () => {
  it('every command has --help', () => {
    for (const c of ['modes', 'export', 'reference']) {
      const r = runCli([c, '--help']);
      expect(r.status).toBe(0);
      expect(r.stdout).toContain(`eigenframe ${c}`);
    }
    expect(runCli(['--help']).stdout).toContain('Commands:');
  });

  it('version equals package.json', () => {
    const pkg = JSON.parse(readFileSync(join(__dirname, '..', 'package.json'), 'utf8'));
    expect(VERSION).toBe(pkg.version);
    expect(runCli(['--version']).stdout.trim()).toBe(pkg.version);
  });

  it('the built binary runs (after npm run build)', async () => {
    const bin = join(__dirname, '..', 'dist', 'cli.cjs');
    if (!existsSync(bin)) throw new Error('dist/cli.cjs missing: npm test builds first (pretest)');
    const { spawnSync } = await import('node:child_process');
    const r = spawnSync(process.execPath, [join(__dirname, '..', 'bin', 'eigenframe.cjs'), 'modes', DEMO, '--count', '2', '--json'], { encoding: 'utf8' });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).modes).toHaveLength(2);
    const bad = spawnSync(process.execPath, [join(__dirname, '..', 'bin', 'eigenframe.cjs'), 'modes', 'missing.json'], { encoding: 'utf8' });
    expect(bad.status).toBe(1);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
  });
});
