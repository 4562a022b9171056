/**
 * The runnable examples of docs/examples/ run with node against the BUILT package (their
 * `import … from 'eigenframe'` resolves through package.json "exports" to dist/), exit 0, and
 * print the numbers the library computes in-process (from src/) for the same structure.
 * `npm test` builds first (pretest); run `npm run build` before running this file alone.
 */
import { execFile } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import {
  assemble,
  bandPreset,
  bucklingAnalysis,
  eigenvalueToFrequency,
  machineBand,
  modalAnalysis,
  parseModel,
  readMatrixMarket,
  referenceCase,
  screenResonance,
  solve,
  writeMatrixMarket,
  type Model,
} from '../src/index';

const ROOT = resolve(__dirname, '..');
const EXAMPLES = join(ROOT, 'docs', 'examples');
const FILES = ['footbridge-screening.mjs', 'mast-modes.mjs', 'parameter-study.mjs', 'check-my-solver.mjs', 'require-check.cjs'] as const;

interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
}

function run(file: string): Promise<Run> {
  return new Promise((done) => {
    execFile(process.execPath, [join(EXAMPLES, file)], { cwd: ROOT, timeout: 60_000, encoding: 'utf8' }, (err, stdout, stderr) => {
      const code = err ? (typeof err.code === 'number' ? err.code : null) : 0;
      done({ code, stdout, stderr });
    });
  });
}

/** The model builders the examples use (plain JS, no imports), loaded in-process. */
interface Structures {
  STEEL: { E: number; G: number; density: number };
  boxSection(b: number, h: number, t: number): { A: number; Iy: number; Iz: number; J: number };
  iSection(h: number, b: number, tf: number, tw: number): { A: number; Iz: number };
  footbridgeDeck(o: { span: number; elements: number; girder: object; deckMass: number; deckWidth: number }): Model;
  squareMast(o: { height: number; elements: number; width: number; wall: number; headMass: number }): Model;
  machinePortal(o: { height: number; span: number; column: object; beam: object; machineMass: number; perMember: number }): Model;
}

const runs = new Map<string, Run>();
let S: Structures;

beforeAll(async () => {
  if (!existsSync(join(ROOT, 'dist', 'index.js')) || !existsSync(join(ROOT, 'dist', 'index.cjs'))) {
    throw new Error('dist/ is missing: run `npm run build` (npm test does it through pretest)');
  }
  S = (await import(pathToFileURL(join(EXAMPLES, 'structures.mjs')).href)) as Structures;
  const results = await Promise.all(FILES.map((f) => run(f)));
  FILES.forEach((f, i) => runs.set(f, results[i]));
}, 120_000);

function output(file: string): string {
  const r = runs.get(file)!;
  expect(r.stderr, `${file} wrote to standard error`).toBe('');
  expect(r.code, `${file} exit status`).toBe(0);
  return r.stdout;
}

/** Numbers printed with `d` decimals agree with the in-process value to half a unit of the last place. */
function expectPrinted(printed: number, computed: number, decimals: number): void {
  expect(Math.abs(printed - computed)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12 * Math.abs(computed));
}

describe('docs/examples', () => {
  it('every example exits 0 with an empty standard error', () => {
    for (const f of FILES) output(f);
  });

  it('footbridge-screening: frequencies, what-if factors and verdicts as the library computes them; the chosen depth is the first clear for every deck mass', () => {
    const out = output('footbridge-screening.mjs');
    // Inputs of the example (its constants): 20 m, 20 elements, 600 × depth × 16 mm box,
    // 450 kg/m deck 2.5 m wide, deck mass bracket ×0.8 and ×1.2.
    const bands = ['walking-vertical', 'walking-vertical-2', 'walking-lateral', 'walking-longitudinal'].map(bandPreset);
    const screenIt = (depth: number, k = 1) => {
      const girder = S.boxSection(0.6, depth, 0.016);
      const analysis = modalAnalysis(S.footbridgeDeck({ span: 20, elements: 20, girder, deckMass: 450 * k, deckWidth: 2.5 }), { count: 8 });
      return { girder, analysis, screening: screenResonance(analysis, bands) };
    };
    const V = '(in-band|near-band|clear)';
    const rows = [...out.matchAll(new RegExp(`^\\s*(\\d\\.\\d\\d)\\s+\\d+\\s+([\\d.]+)\\s+([\\d.]+)\\s+[\\d.]+\\s+[\\d.]+\\s+${V}\\s+${V}\\s+${V}\\s*$`, 'gm'))];
    expect(rows).toHaveLength(21);
    const chosen = Number(/Chosen girder depth: ([\d.]+) m/.exec(out)?.[1]);
    const firstAllClear = rows.find((r) => r[4] === 'clear' && r[5] === 'clear' && r[6] === 'clear');
    expect(Number(firstAllClear?.[1])).toBe(chosen);
    for (const [, depthText, fText, closedText, verdict, low, high] of rows) {
      const depth = Number(depthText);
      const { girder, screening } = screenIt(depth);
      const vertical = screening.modes.find((m) => m.direction === 'vertical')!;
      expectPrinted(Number(fText), vertical.frequency, 4);
      expect(verdict).toBe(screening.verdict);
      // Source: simply supported Euler–Bernoulli beam, f1 = (π/2L²)√(EI/m) (Timoshenko, Young &
      // Weaver, ch. 5; from memory), m = girder + deck per metre; 20 cubic elements: < 1e-5.
      const f1 = (Math.PI / (2 * 20 * 20)) * Math.sqrt((S.STEEL.E * girder.Iy) / (S.STEEL.density * girder.A + 450));
      expectPrinted(Number(closedText), f1, 4);
      expect(Math.abs(vertical.frequency - f1) / f1).toBeLessThan(1e-5);
      if (Math.abs(depth - chosen) < 0.06) {
        // The chosen depth and its neighbours: the ±20 % deck mass verdicts too.
        expect(low).toBe(screenIt(depth, 0.8).screening.verdict);
        expect(high).toBe(screenIt(depth, 1.2).screening.verdict);
      }
    }
    // What-if on the first design. The girder is the whole structure and the supports are rigid,
    // so scaling its stiffness by α scales every λ by α exactly: the factor must be (target/f)².
    const base = screenIt(0.4).screening;
    const f0 = base.modes.find((m) => m.direction === 'vertical')!.frequency;
    const whatIfs = [...out.matchAll(/what-if: girder stiffness x([\d.]+) puts mode \d+ at ([\d.]+) Hz/g)];
    expect(whatIfs).toHaveLength(2);
    for (const [, factor, target] of whatIfs) expectPrinted(Number(factor), (Number(target) / f0) ** 2, 4);
    // Targets from the presets with the default 10 % clearance: 2.4 × 1.1 and 4.8 × 1.1 Hz.
    expect(whatIfs.map((w) => Number(w[2]))).toEqual([2.64, 5.28]);
    expect(out).toContain('never replaces, design to the local codes by a licensed engineer');
  });

  it('mast-modes: printed frequencies equal the in-process solve, pairs repeated, Sturm count passed', () => {
    const out = output('mast-modes.mjs');
    const rows = [...out.matchAll(/^\s*(\d+)\s+([\d.]+)\s+[\d.]+%\s+[\d.]+%\s+[\d.]+%\s+[\d.]+%\s+(bending|axial|torsion)\s+([\d.]+)\s+(\S+)$/gm)];
    expect(rows).toHaveLength(14);
    const analysis = modalAnalysis(S.squareMast({ height: 24, elements: 24, width: 0.25, wall: 0.01, headMass: 200 }), { count: 14 });
    rows.forEach(([, mode, f, , exact, rel], i) => {
      expect(Number(mode)).toBe(i + 1);
      expectPrinted(Number(f), analysis.modes[i].frequency, 4);
      // Closed forms of the example (cantilever with tip mass, fixed–free shaft and rod) agree
      // to the mesh's accuracy: cubic bending elements far better, linear axial/torsion ~h².
      expect(Math.abs(Number(rel))).toBeLessThan(5e-4);
      expect(Number(exact)).toBeGreaterThan(0);
    });
    expect(rows.filter((r) => r[3] === 'torsion')).toHaveLength(1);
    expect(rows.filter((r) => r[3] === 'axial')).toHaveLength(1);
    // A square tube bends alike about both axes: modes 1 and 2 are one repeated frequency.
    expect(Math.abs(analysis.modes[1].frequency - analysis.modes[0].frequency) / analysis.modes[0].frequency).toBeLessThan(1e-9);
    expect(out).toMatch(/Sturm count 14 modes below [\d.]+ Hz, 14 returned: none missed/);
    // Buckling under 1 kN at the top: the factors are kN. Source: Euler fixed–free column,
    // P = π²EI/(2L)² (Timoshenko & Gere 1961, ch. 2; from memory); 24 cubic elements: < 1e-6.
    const b = /Buckling under a load at the top: ([\d.]+) kN and ([\d.]+) kN \(a pair\); Euler fixed-free ([\d.]+) kN/.exec(out);
    expect(b).not.toBeNull();
    const model = S.squareMast({ height: 24, elements: 24, width: 0.25, wall: 0.01, headMass: 200 });
    const inProcess = bucklingAnalysis(model, [{ node: 'm24', dof: 'uz', value: -1000 }], { count: 2 });
    expectPrinted(Number(b![1]), inProcess.loadFactors[0], 2);
    expectPrinted(Number(b![2]), inProcess.loadFactors[1], 2);
    const Iy = S.boxSection(0.25, 0.25, 0.01).Iy;
    const euler = (Math.PI ** 2 * S.STEEL.E * Iy) / (4 * 24 * 24);
    expectPrinted(Number(b![3]), euler / 1000, 2);
    expect(Math.abs(inProcess.loadFactors[0] * 1000 - euler) / euler).toBeLessThan(1e-6);
  });

  it('parameter-study: each depth prints the in-process vertical frequency and verdict against the fan band', () => {
    const out = output('parameter-study.mjs');
    const rows = [...out.matchAll(/^\s*(\d\.\d\d)\s+[\d.]+\s+([\d.]+)\s+[\d.]+\s+([\d.]+)\s+[\d.]+\s+(in-band|near-band|clear)\b/gm)];
    expect(rows).toHaveLength(9);
    // Inputs of the example: column I 200 × 200 × 15/9, beam flanges 180 × 13.5, web 8.6 mm,
    // 1500 kg at mid-span, fan at 740 rpm ± 10 %.
    const column = S.iSection(0.2, 0.2, 0.015, 0.009);
    const band = machineBand(740, { tolerancePercent: 10 });
    const verdicts = new Set<string>();
    for (const [, hText, swayText, fText, verdict] of rows) {
      const beam = S.iSection(Number(hText), 0.18, 0.0135, 0.0086);
      const analysis = modalAnalysis(S.machinePortal({ height: 4, span: 6, column, beam, machineMass: 1500, perMember: 6 }), { count: 6 });
      const byMass = (d: 'ux' | 'uy') => analysis.modes.reduce((a, b) => ((b.effectiveMassRatio[d] ?? 0) > (a.effectiveMassRatio[d] ?? 0) ? b : a));
      expectPrinted(Number(swayText), byMass('ux').frequency, 3);
      expectPrinted(Number(fText), byMass('uy').frequency, 4);
      expect(verdict).toBe(screenResonance(analysis, [band]).verdict);
      verdicts.add(verdict);
    }
    // The study crosses the band: some depths clear, some in it.
    expect(verdicts.has('clear') && verdicts.has('in-band')).toBe(true);
    expect(out).toMatch(/Symbolic analysis made once .* reused for 9 variants/);
  });

  it('check-my-solver: eigenframe frequencies of the Matrix Market K and M equal an in-process solve; both solvers agree', () => {
    const out = output('check-my-solver.mjs');
    const rows = [...out.matchAll(/^\s*(\d+)\s+([\d.]+)\s+([\d.]+)\s+(\S+)\s+([\d.]+)\s+(\S+)\s+(\S+)$/gm)];
    expect(rows).toHaveLength(6);
    const ref = referenceCase('beam-two-span');
    const a = assemble(ref.build(ref.mesh));
    // Same round trip as the example: write and read Matrix Market (bit-identical by contract).
    const K = readMatrixMarket(writeMatrixMarket(a.stiffness), 'K.mtx');
    const M = readMatrixMarket(writeMatrixMarket(a.mass), 'M.mtx');
    const ours = Array.from(solve(K, M, { count: 6 }).eigenvalues, eigenvalueToFrequency);
    const exact = ref.exact(6);
    rows.forEach(([, mode, yours, eigenframe, rel, ex], i) => {
      expect(Number(mode)).toBe(i + 1);
      expectPrinted(Number(eigenframe), ours[i], 6);
      expectPrinted(Number(ex), exact[i], 4);
      expect(Math.abs(Number(yours) - ours[i]) / ours[i]).toBeLessThan(1e-7);
      expect(Number(rel)).toBeLessThan(1e-7);
    });
    expect(out).toContain('AGREE');
    expect(out).toContain('yours pass, eigenframe pass');
  });

  it('require-check.cjs: loads with require() and prints the in-process cantilever frequencies', () => {
    const out = output('require-check.cjs');
    expect(out).toMatch(/eigenframe \d+\.\d+\.\d+ loaded with require\(\)/);
    const rows = [...out.matchAll(/^\s*(\d+)\s+([\d.]+)\s+([\d.]+)\s+(\S+)$/gm)];
    const ref = referenceCase('beam-cantilever');
    expect(rows).toHaveLength(ref.count);
    const analysis = modalAnalysis(ref.build(ref.mesh), { count: ref.count });
    rows.forEach(([, , f], i) => expectPrinted(Number(f), analysis.modes[i].frequency, 6));
    expect(out).toMatch(/: pass\.$/m);
  });

  it('getting-started guide: its table of docs/examples/first-model.json is what the library computes', () => {
    const guide = readFileSync(join(ROOT, 'docs', 'guides', 'getting-started.md'), 'utf8');
    const block = /```\n(First model:[\s\S]*?)```/.exec(guide)?.[1] ?? '';
    const rows = [...block.matchAll(/^\s+(\d+)\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+[\d.]+\s+([\d.]+)/gm)];
    expect(rows).toHaveLength(4);
    const model = parseModel(readFileSync(join(EXAMPLES, 'first-model.json'), 'utf8'), 'first-model.json');
    const analysis = modalAnalysis(model, { count: 4 });
    rows.forEach(([, mode, f, T, w, ux, uy], i) => {
      const m = analysis.modes[i];
      expect(Number(mode)).toBe(m.mode);
      // Each number agrees to half a unit of its last printed decimal.
      for (const [printed, value] of [[f, m.frequency], [T, m.period], [w, m.angularFrequency]] as const) {
        expectPrinted(Number(printed), value, printed.split('.')[1]?.length ?? 0);
      }
      expectPrinted(Number(ux), 100 * (m.effectiveMassRatio.ux ?? 0), 1);
      expectPrinted(Number(uy), 100 * (m.effectiveMassRatio.uy ?? 0), 1);
    });
    expect(block).toContain(`ux ${analysis.totalMass.ux!.toFixed(2)} kg, uy ${analysis.totalMass.uy!.toFixed(2)} kg`);
  });
});
