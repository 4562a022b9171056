/**
 * src/node/batch.ts and src/node/variant.ts: parameter studies across worker threads.
 * Reference: the serial library path, `modalAnalysis` on the same model, variant by variant
 * (the batch must change where the work runs, not its result).
 *
 * The worker script is built here from src/node/batch-worker.ts with tsup's API (CJS, into a
 * temporary folder, ml-matrix bundled in), as the package build does for dist/batch-worker.cjs.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'tsup';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AbortedError, ArgumentError } from '../src/errors';
import { modalAnalysis } from '../src/modal/analysis';
import { assemble } from '../src/model/assemble';
import { parseModel, validateModel } from '../src/model/read';
import { unionPattern } from '../src/linalg/sparse/symmetric';
import { BATCH_DEFAULTS, solveBatch } from '../src/node/batch';
import { patternHash, solveVariant, SymbolicCache, SYMBOLIC_CACHE_DEFAULTS } from '../src/node/variant';
import { simplySupportedBeam } from './beam-fixture';

const root = new URL('..', import.meta.url);
const footbridgeText = readFileSync(new URL('examples/footbridge.json', root), 'utf8');
const footbridge = JSON.parse(footbridgeText) as { title: string; sections: Record<string, { A: number; Iy?: number; Iz?: number; J?: number }> };

let dir = '';
let workerFile = '';

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'eigenframe-batch-'));
  await build({
    entry: { 'batch-worker': 'src/node/batch-worker.ts' },
    format: ['cjs'],
    outDir: dir,
    platform: 'node',
    noExternal: ['ml-matrix'], // the temporary folder has no node_modules to resolve it from
    target: 'node20',
    splitting: false,
    sourcemap: false,
    dts: false,
    clean: false,
    silent: true,
    config: false,
  });
  workerFile = join(dir, 'batch-worker.cjs');
}, 60_000);

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

/** The demo footbridge with its chord members' section scaled by s (A by s, I and J by s²). */
function scaledChord(base: unknown, s: number): unknown {
  const m = structuredClone(base) as typeof footbridge;
  const c = m.sections.chord;
  m.sections.chord = { ...c, A: c.A * s, Iy: (c.Iy ?? 0) * s * s, Iz: (c.Iz ?? 0) * s * s, J: (c.J ?? 0) * s * s };
  m.title = `chord × ${s}`;
  return m;
}

/** Simply supported plane beam of `parts` elements (the shared test fixture). */
function planeBeam(parts: number, title: string): unknown {
  return simplySupportedBeam(title, parts);
}

function relDiff(a: number, b: number): number {
  return Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);
}

type ModeJson = { frequency: number; eigenvalue: number; effectiveMassRatio: Record<string, number> };

describe('solveBatch', () => {
  it('gives, variant by variant, what the serial modalAnalysis gives, and reuses the symbolic analysis', async () => {
    const scales = [0.8, 1, 1.2, 1.4];
    const results = await solveBatch({ base: footbridge, vary: (b, s: number) => scaledChord(b, s), parameters: scales }, { workers: 2, workerFile, count: 8 });
    expect(results).toHaveLength(scales.length);
    for (const [i, r] of results.entries()) {
      expect(r.index).toBe(i);
      expect(r.parameter).toBe(scales[i]);
      if (!r.ok) throw new Error(`variant ${i} failed: ${r.error.message}`);
      const serial = modalAnalysis(validateModel(scaledChord(footbridge, scales[i])), { count: 8 });
      const modes = r.result.modes as ModeJson[];
      expect(modes).toHaveLength(8);
      expect(r.result.title).toBe(`chord × ${scales[i]}`);
      modes.forEach((m, j) => {
        // Same code, same pattern, same ordering: agreement to round-off (in practice bit for bit).
        expect(relDiff(m.eigenvalue, serial.modes[j].eigenvalue)).toBeLessThan(1e-12);
        expect(relDiff(m.frequency, serial.modes[j].frequency)).toBeLessThan(1e-12);
        for (const d of ['ux', 'uy', 'uz'] as const) {
          expect(Math.abs(m.effectiveMassRatio[d] - (serial.modes[j].effectiveMassRatio[d] ?? 0))).toBeLessThan(1e-9);
        }
      });
    }
    // Stiffer chords, higher first frequency: the study really varied the model.
    const f1 = results.map((r) => (r.ok ? (r.result.modes as ModeJson[])[0].frequency : NaN));
    for (let i = 1; i < f1.length; i++) expect(f1[i]).not.toBe(f1[i - 1]);
    // Two workers, one pattern: each analyses once, every later variant in it reuses that.
    const reused = results.filter((r) => r.ok && r.symbolicReused).length;
    expect(reused).toBeGreaterThanOrEqual(scales.length - 2);
  });

  it('reports a bad variant alone (error name, path, message) and solves the others', async () => {
    const good = planeBeam(8, 'good');
    const missingSection = { ...(planeBeam(8, 'bad section') as object), elements: [{ id: 'e0', kind: 'beam', nodes: ['n0', 'n1'], material: 'steel', section: 'tube2' }] };
    // A node with a point mass that no element or spring holds: a mechanism (DESIGN.md: report it).
    const base4 = planeBeam(4, 'mechanism') as { nodes: object[] };
    const mechanism = { ...base4, nodes: [...base4.nodes, { id: 'loose', x: 3, y: 1 }], masses: [{ node: 'loose', mass: 10 }] };
    const variants = [good, missingSection, JSON.stringify(good), '{ "format": ', mechanism, good];
    const results = await solveBatch(variants, { workers: 2, workerFile, count: 3 });
    expect(results.map((r) => r.ok)).toEqual([true, false, true, false, false, true]);
    const e1 = results[1].ok ? undefined : results[1].error;
    expect(e1?.name).toBe('ModelError');
    expect(e1?.path).toBe('elements[0].section');
    expect(e1?.message).toMatch(/tube2/);
    const e3 = results[3].ok ? undefined : results[3].error;
    expect(e3?.name).toBe('ModelError');
    expect(e3?.path).toMatch(/^model:1:\d+$/);
    const e4 = results[4].ok ? undefined : results[4].error;
    expect(e4?.name).toBe('ModelError');
    expect(e4?.path).toMatch(/loose|nodes\[5\]/);
    // The good ones match the serial path; text and object input give the same answer.
    const serial = modalAnalysis(validateModel(good), { count: 3 });
    for (const k of [0, 2, 5]) {
      const r = results[k];
      if (!r.ok) throw new Error('expected success');
      (r.result.modes as ModeJson[]).forEach((m, j) => expect(relDiff(m.frequency, serial.modes[j].frequency)).toBeLessThan(1e-12));
    }
  });

  it('keeps input order when variants finish out of order', async () => {
    // Large and small models interleaved: with 2 workers the small ones finish first.
    const sizes = [120, 4, 100, 6, 8, 90, 5];
    const results = await solveBatch(sizes.map((p) => planeBeam(p, `beam of ${p}`)), { workers: 2, workerFile, count: 2 });
    expect(results.map((r) => (r.ok ? r.result.title : r.error.message))).toEqual(sizes.map((p) => `beam of ${p}`));
    // Source: Euler–Bernoulli simply supported beam, f1 = (π²/2π L²)·√(EI/ρA) (closed form).
    const f1 = (Math.PI / (2 * 6 * 6)) * Math.sqrt((2.1e11 * 2.2e-6) / (7850 * 1.5e-3));
    for (const [i, r] of results.entries()) {
      if (!r.ok) throw new Error(r.error.message);
      expect(relDiff((r.result.modes as ModeJson[])[0].frequency, f1)).toBeLessThan(sizes[i] >= 8 ? 1e-4 : 5e-3);
    }
  });

  it('records a failing vary() at its parameter, and reports progress up to 1', async () => {
    const fractions: number[] = [];
    const results = await solveBatch(
      {
        base: footbridge,
        vary: (b, s: number) => {
          if (s < 0) throw new RangeError(`scale ${s} is negative`);
          return scaledChord(b, s);
        },
        parameters: [1, -1, 1.5],
      },
      { workers: 2, workerFile, count: 4, onProgress: (_p, f) => fractions.push(f) },
    );
    expect(results.map((r) => r.ok)).toEqual([true, false, true]);
    const e = results[1].ok ? undefined : results[1].error;
    expect(e).toEqual({ name: 'RangeError', path: 'parameters[1]', message: 'scale -1 is negative' });
    expect(fractions.at(-1)).toBe(1);
    expect(fractions).toHaveLength(3);
  });

  it('forwards the solver progress of a variant from its worker (one long solve off the main thread)', async () => {
    const seen: Array<[number, string, number]> = [];
    const [r] = await solveBatch([footbridgeText], { workers: 1, workerFile, count: 4, onVariantProgress: (i, phase, f) => seen.push([i, phase, f]) });
    expect(r.ok).toBe(true);
    expect(seen.length).toBeGreaterThan(0);
    expect(seen.every(([i, , f]) => i === 0 && f >= 0 && f <= 1)).toBe(true);
    expect(seen.some(([, phase]) => phase === 'lanczos')).toBe(true); // 298 DOF: the sparse path
  });

  it('an abort stops the workers and rejects with AbortedError (path "signal")', async () => {
    const controller = new AbortController();
    const run = solveBatch(Array.from({ length: 40 }, () => planeBeam(150, 'slow')), {
      workers: 2,
      workerFile,
      count: 4,
      signal: controller.signal,
      onProgress: () => controller.abort(),
    });
    await expect(run).rejects.toBeInstanceOf(AbortedError);
    await expect(run).rejects.toMatchObject({ path: 'signal' });
  });

  it('a worker thread that dies fails only the variant it was solving, and is replaced', async () => {
    // A stand-in worker script: follows the message protocol, exits on the model "die".
    const script = join(dir, 'dying-worker.cjs');
    writeFileSync(
      script,
      `const { parentPort } = require('node:worker_threads');
       parentPort.on('message', (job) => {
         for (const item of job.items) {
           if (item.model === 'die') process.exit(3);
           parentPort.postMessage({ type: 'result', index: item.index, ok: true, result: { echo: item.model }, symbolicReused: false, ms: 0 });
         }
       });
       parentPort.postMessage({ type: 'ready' });`,
    );
    const results = await solveBatch(['a', 'die', 'b', 'c', 'die', 'd'], { workers: 2, workerFile: script });
    expect(results.map((r) => (r.ok ? r.result.echo : r.error.path))).toEqual(['a', 'variants[1]', 'b', 'c', 'variants[4]', 'd']);
    const e = results[1].ok ? undefined : results[1].error;
    expect(e?.message).toMatch(/stopped \(exit code 3\)/);
  });

  it('a patch study (RFC 7396 merge patches of a base sent once per worker) gives what vary and the serial path give', async () => {
    const scales = [0.7, 0.9, 1.1, 1.3, 1.5];
    const chord = footbridge.sections.chord;
    const patch = (s: number): unknown => ({ title: `chord × ${s}`, sections: { chord: { A: chord.A * s, Iy: (chord.Iy ?? 0) * s * s, Iz: (chord.Iz ?? 0) * s * s, J: (chord.J ?? 0) * s * s } } });
    // Fixed chunks of 2 and guided chunks, 2 workers; the same study through vary, 1 worker.
    const byPatch = await solveBatch({ base: footbridgeText, parameters: scales, patch }, { workers: 2, workerFile, count: 6, chunkSize: 2 });
    const byPatchAuto = await solveBatch({ base: footbridge, parameters: scales, patch }, { workers: 2, workerFile, count: 6 });
    const byVary = await solveBatch({ base: footbridge, parameters: scales, vary: (b, s: number) => scaledChord(b, s) }, { workers: 1, workerFile, count: 6 });
    for (const [i, s] of scales.entries()) {
      // Reference: the serial library path on the whole variant model.
      const serial = modalAnalysis(validateModel(scaledChord(footbridge, s)), { count: 6 });
      for (const run of [byPatch, byPatchAuto, byVary]) {
        const r = run[i];
        expect(r.index).toBe(i);
        expect(r.parameter).toBe(s);
        if (!r.ok) throw new Error(`variant ${i} failed: ${r.error.message}`);
        expect(r.result.title).toBe(`chord × ${s}`);
        (r.result.modes as ModeJson[]).forEach((m, j) => expect(relDiff(m.frequency, serial.modes[j].frequency)).toBeLessThan(1e-12));
      }
    }
    // One worker, one pattern: one analysis, every later variant reuses it.
    expect(byVary.filter((r) => r.ok && r.symbolicReused)).toHaveLength(scales.length - 1);
  });

  it('returns mode shapes as Float64Array views, equal to the serial shapes', async () => {
    const models = [planeBeam(10, 'a'), planeBeam(14, 'b')];
    const results = await solveBatch(models, { workers: 2, workerFile, count: 3, shapes: true });
    for (const [i, r] of results.entries()) {
      if (!r.ok) throw new Error(r.error.message);
      const serial = solveVariant(models[i], { count: 3, shapes: true });
      if (!serial.ok) throw new Error(serial.error.message);
      const modes = r.result.modes as Array<{ shape: Float64Array }>;
      const ref = serial.result.modes as Array<{ shape: number[] }>;
      expect(r.result.dofs).toEqual(serial.result.dofs);
      modes.forEach((m, j) => {
        expect(m.shape).toBeInstanceOf(Float64Array);
        expect(m.shape).toHaveLength(r.result.dofCount as number);
        m.shape.forEach((v, k) => expect(Math.abs(v - ref[j].shape[k])).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(ref[j].shape[k]))));
      });
    }
  });

  it('a worker that dies mid-chunk fails its current variant only; the rest of its chunk is solved elsewhere', async () => {
    const script = join(dir, 'dying-chunk-worker.cjs');
    writeFileSync(
      script,
      `const { parentPort } = require('node:worker_threads');
       parentPort.on('message', (job) => {
         for (const item of job.items) {
           if (item.model === 'die') process.exit(5);
           parentPort.postMessage({ type: 'result', index: item.index, ok: true, result: { echo: item.model, size: job.items.length }, symbolicReused: false, ms: 0 });
         }
       });
       parentPort.postMessage({ type: 'ready' });`,
    );
    const input = ['a', 'b', 'die', 'c', 'd', 'e', 'f', 'g', 'h'];
    const results = await solveBatch(input, { workers: 2, workerFile: script, chunkSize: 4 });
    expect(results.map((r) => (r.ok ? r.result.echo : r.error.path))).toEqual(['a', 'b', 'variants[2]', 'c', 'd', 'e', 'f', 'g', 'h']);
    // Chunks of 4 really were sent (the first chunk held a, b, die, c).
    expect(results[0].ok && results[0].result.size).toBe(4);
  });

  it('rejects a study with both or neither of patch and vary, a non-JSON base text for patch, and a bad chunkSize', async () => {
    const both = { base: footbridge, parameters: [1], patch: () => ({}), vary: (b: unknown) => b } as unknown as unknown[];
    await expect(solveBatch(both, { workerFile })).rejects.toMatchObject({ name: 'ArgumentError', path: 'variants' });
    await expect(solveBatch({ base: footbridge, parameters: [1] } as unknown as unknown[], { workerFile })).rejects.toMatchObject({ name: 'ArgumentError', path: 'variants' });
    await expect(solveBatch({ base: '{ "format": ', parameters: [1], patch: () => ({}) }, { workerFile })).rejects.toMatchObject({ name: 'ArgumentError', path: 'variants.base' });
    for (const chunkSize of [0, 1.5, -2, 'big']) {
      await expect(solveBatch([planeBeam(2, 'x')], { workerFile, chunkSize: chunkSize as number })).rejects.toMatchObject({ name: 'ArgumentError', path: 'chunkSize' });
    }
    await expect(solveBatch({ base: { ...footbridge, note: () => 1 }, parameters: [1], patch: () => ({}) }, { workerFile })).rejects.toMatchObject({ name: 'ArgumentError', path: 'variants.base' });
    expect(BATCH_DEFAULTS.chunkSize).toBe('auto');
  });

  it('rejects bad arguments with ArgumentError naming the option', async () => {
    await expect(solveBatch([planeBeam(2, 'x')], { workers: 0, workerFile })).rejects.toMatchObject({ name: 'ArgumentError', path: 'workers' });
    await expect(solveBatch([planeBeam(2, 'x')], { workerFile: join(dir, 'missing.cjs') })).rejects.toMatchObject({ name: 'ArgumentError', path: 'workerFile' });
    await expect(solveBatch('nope' as unknown as unknown[], { workerFile })).rejects.toBeInstanceOf(ArgumentError);
    await expect(solveBatch([planeBeam(2, 'x')], { workerFile, cacheSize: 0 })).rejects.toMatchObject({ name: 'ArgumentError', path: 'cacheSize' });
    await expect(solveBatch([], { workerFile })).resolves.toEqual([]);
    expect(BATCH_DEFAULTS.cacheSize).toBe(SYMBOLIC_CACHE_DEFAULTS.capacity);
    expect(SYMBOLIC_CACHE_DEFAULTS.capacity).toBe(8);
    expect(new SymbolicCache().capacity).toBe(8);
    // A script that is not the worker: fails at start-up, reported once for the batch.
    await expect(solveBatch([planeBeam(2, 'x')], { workerFile: join(dir, '..', 'no-such-dir', 'x.cjs') })).rejects.toMatchObject({ path: 'workerFile' });
  });
});

describe('solveVariant and SymbolicCache', () => {
  it('solves one variant in-thread like modalAnalysis, reusing the analysis on the same pattern', () => {
    const cache = new SymbolicCache(2);
    const a = solveVariant(scaledChord(footbridge, 1.1), { count: 5 }, cache);
    const b = solveVariant(scaledChord(footbridge, 0.7), { count: 5, shapes: true }, cache);
    expect(a.ok && !a.symbolicReused).toBe(true);
    expect(b.ok && b.symbolicReused).toBe(true);
    expect(cache.hits).toBe(1);
    expect(cache.misses).toBe(1);
    const serial = modalAnalysis(validateModel(scaledChord(footbridge, 0.7)), { count: 5 });
    if (!b.ok) throw new Error(b.error.message);
    const modes = b.result.modes as Array<ModeJson & { shape: number[] }>;
    modes.forEach((m, j) => expect(relDiff(m.frequency, serial.modes[j].frequency)).toBeLessThan(1e-12));
    expect(modes[0].shape).toHaveLength(serial.assembled.stiffness.n);
    expect(JSON.parse(JSON.stringify(b.result))).toEqual(b.result); // plain JSON through and through
  });

  it('tells patterns apart: the hash and the cache follow the sparsity pattern, not the values', () => {
    const p1 = unionPattern(assemble(parseModel(footbridgeText)).stiffness, assemble(parseModel(footbridgeText)).mass).pattern;
    const scaled = assemble(validateModel(scaledChord(footbridge, 2)));
    const p2 = unionPattern(scaled.stiffness, scaled.mass).pattern;
    expect(patternHash(p1)).toBe(patternHash(p2));
    const other = assemble(validateModel(planeBeam(10, 'x')));
    const p3 = unionPattern(other.stiffness, other.mass).pattern;
    expect(patternHash(p3)).not.toBe(patternHash(p1));
    const cache = new SymbolicCache(1);
    expect(cache.get(p1).reused).toBe(false);
    expect(cache.get(p2).reused).toBe(true);
    expect(cache.get(p3).reused).toBe(false);
    expect(cache.get(p1).reused).toBe(false); // capacity 1: p3 pushed p1 out
  });

  it('reports a bad option as the variant error, not a throw', () => {
    const r = solveVariant(planeBeam(4, 'x'), { count: 0 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatchObject({ name: 'ArgumentError', path: 'count' });
  });
});
