/**
 * Parameter-study speed-up across worker threads: a long steel truss footbridge (bench/models,
 * 240 panels of 1.5 m, twelve spans of 30 m, 2,836 DOF) whose chord and web tubes take 20 × 10
 * wall-thickness scales (200 variants, 20 modes each, about 0.05–0.1 s of work each), solved
 * (a) serially on the calling thread with one symbolic cache, (b) by solveBatch with 1 worker,
 * (c) by solveBatch with every core. Each variant is a JSON Merge Patch of the base (RFC 7396),
 * as a study would send it. The bench checks that all runs give the same frequencies.
 *
 * Call `runBatchBench()` (async) and print `formatBatchBench(result)`; bench/main.ts does after
 * the table. Wall times depend on other load on the machine: the report prints the load average
 * and the CPU seconds of each run beside them.
 */
import { availableParallelism, loadavg } from 'node:os';
import { Worker } from 'node:worker_threads';
import { performance as perf } from 'node:perf_hooks';
import { solveBatch, type VariantResult } from '../src/node/batch';
import { applyMergePatch, solveVariant, SymbolicCache } from '../src/node/variant';
import { trussFootbridge } from './models/footbridge';

/** Options of {@link runBatchBench}. */
export interface BatchBenchOptions {
  /** Variants in the study: the first N of the 20 × 10 grid (repeated beyond 200). @defaultValue 200 */
  variants?: number;
  /** Modes per variant. @defaultValue 20 */
  count?: number;
  /** Worker counts to time. @defaultValue [1, os.availableParallelism()] (one entry if equal) */
  workers?: readonly number[];
  /** Variants per message (solveBatch's chunkSize). @defaultValue 'auto' */
  chunkSize?: number | 'auto';
  /** The built worker script. @defaultValue solveBatch's own default (dist/batch-worker.*) */
  workerFile?: string;
  /** Panels of the footbridge, 1.5 m each, a pier every 20 (2,836 DOF at 240). @defaultValue 240 */
  panels?: number;
}

/** One timed run. */
export interface BatchBenchRun {
  /** `serial` (calling thread) or the number of worker threads. */
  readonly workers: number | 'serial';
  /** Wall time, ms. */
  readonly ms: number;
  /** CPU time of the whole process (user + system, every thread), ms. */
  readonly cpuMs: number;
  /** Sum of the variants' own times (measured where each was solved), ms. */
  readonly variantMs: number;
  /** Serial wall time / this wall time. */
  readonly speedupSerial: number;
  /** 1-worker wall time / this wall time (NaN when 1 worker was not run). */
  readonly speedupOneWorker: number;
  /** Variants that reused a symbolic analysis. */
  readonly symbolicReused: number;
  /** Time the calling thread was busy (event-loop active time), ms: making and sending chunks, receiving results. */
  readonly callerBusyMs: number;
  /** 1-minute load average before and after the run. */
  readonly load: readonly [number, number];
}

/** What {@link runBatchBench} measured. */
export interface BatchBenchResult {
  readonly variants: number;
  readonly dofs: number;
  readonly count: number;
  readonly cores: number;
  readonly runs: readonly BatchBenchRun[];
  /** Largest relative difference of any frequency between the batch runs and the serial run. */
  readonly maxRelativeDifference: number;
  /** What the machine allows: speed-up of two plain kernels on every core against one. */
  readonly ceiling: ParallelCeiling;
}

/** Speed-ups of two synthetic kernels, every core against one (the same work per thread). */
export interface ParallelCeiling {
  /** Arithmetic in registers (square roots). */
  readonly compute: number;
  /** Streaming over a 32 MiB array (memory bandwidth). */
  readonly memory: number;
}

const KERNELS = `
const { parentPort, workerData } = require('node:worker_threads');
function compute() { let s = 0; for (let i = 0; i < 2e8; i++) s += Math.sqrt(i) * 1e-9; return s; }
function memory() { const a = new Float64Array(4 << 20); let s = 0; for (let r = 0; r < 40; r++) for (let i = 0; i < a.length; i++) { a[i] += i * 1e-9; s += a[i]; } return s; }
const t = performance.now();
(workerData === 'compute' ? compute : memory)();
parentPort.postMessage(performance.now() - t);
`;

/** Wall ms of `threads` workers each running one kernel at once. */
async function kernelWall(kind: 'compute' | 'memory', threads: number): Promise<number> {
  const t = performance.now();
  await Promise.all(Array.from({ length: threads }, () => new Promise<void>((done, fail) => {
    const w = new Worker(KERNELS, { eval: true, workerData: kind });
    w.once('message', () => void w.terminate().then(() => done()));
    w.once('error', fail);
  })));
  return performance.now() - t;
}

/**
 * The machine's own ceiling for a parallel speed-up: the same kernel on one worker and on
 * `cores` workers at once (each doing the full work), speed-up = cores × t₁ / t_cores.
 */
export async function parallelCeiling(cores: number): Promise<ParallelCeiling> {
  const out: Record<string, number> = {};
  for (const kind of ['compute', 'memory'] as const) {
    const one = await kernelWall(kind, 1);
    const all = await kernelWall(kind, cores);
    out[kind] = (cores * one) / all;
  }
  return { compute: out.compute, memory: out.memory };
}

type Scales = { chord: number; web: number };

/** 20 chord × 10 web wall-thickness scales in [0.6, 1.4]. */
function grid(n: number): Scales[] {
  const out: Scales[] = [];
  for (let k = 0; k < n; k++) {
    const i = k % 200;
    out.push({ chord: 0.6 + (0.8 * Math.floor(i / 10)) / 19, web: 0.6 + (0.8 * (i % 10)) / 9 });
  }
  return out;
}

type Tube = { A: number; Iy?: number; Iz?: number; J?: number };

/** A thin-walled tube with its wall scaled by s keeps its diameter: A, I and J all scale by s. */
function thicker(t: Tube, s: number): Tube {
  return { A: t.A * s, Iy: (t.Iy ?? 0) * s, Iz: (t.Iz ?? 0) * s, J: (t.J ?? 0) * s };
}

function frequencies(r: { ok: boolean; result?: Record<string, unknown>; error?: { message: string } }): number[] {
  if (!r.ok || !r.result) throw new Error(`a bench variant failed: ${r.error?.message ?? '?'}`);
  return (r.result.modes as Array<{ frequency: number }>).map((m) => m.frequency);
}

/** Runs the study serially and with solveBatch; see {@link BatchBenchOptions}. */
export async function runBatchBench(options: BatchBenchOptions = {}): Promise<BatchBenchResult> {
  const n = options.variants ?? 200;
  const count = options.count ?? 20;
  const cores = availableParallelism();
  const workerCounts = options.workers ?? [...new Set([1, cores])];
  const base = trussFootbridge({ panels: options.panels ?? 240, panelLength: 1.5, spanPanels: 20 });
  const sections = base.sections as Record<string, Tube>;
  const patch = (p: Scales): unknown => ({
    title: `chord wall × ${p.chord.toFixed(3)}, web wall × ${p.web.toFixed(3)}`,
    sections: { chord: thicker(sections.chord, p.chord), web: thicker(sections.web, p.web) },
  });
  const parameters = grid(n);
  const runs: BatchBenchRun[] = [];

  // (a) Serial, the same per-variant work a worker does: patch, then solveVariant with a cache.
  const cache = new SymbolicCache();
  let load0 = loadavg()[0];
  let c0 = process.cpuUsage();
  let t0 = performance.now();
  const serial = parameters.map((p) => solveVariant(applyMergePatch(base, patch(p)), { count }, cache));
  const serialMs = performance.now() - t0;
  runs.push({ workers: 'serial', ms: serialMs, cpuMs: cpuMs(process.cpuUsage(c0)), variantMs: serial.reduce((a, r) => a + r.ms, 0), speedupSerial: 1, speedupOneWorker: NaN, symbolicReused: serial.filter((r) => r.ok && r.symbolicReused).length, callerBusyMs: serialMs, load: [load0, loadavg()[0]] });
  const reference = serial.map(frequencies);
  const dofs = serial[0].ok ? (serial[0].result.dofCount as number) : 0;

  // (b), (c) solveBatch.
  let maxDiff = 0;
  for (const w of workerCounts) {
    load0 = loadavg()[0];
    c0 = process.cpuUsage();
    const elu0 = perf.eventLoopUtilization();
    t0 = performance.now();
    const results: VariantResult<Scales>[] = await solveBatch(
      { base, parameters, patch },
      { workers: w, count, chunkSize: options.chunkSize ?? 'auto', ...(options.workerFile ? { workerFile: options.workerFile } : {}) },
    );
    const ms = performance.now() - t0;
    const cpu = cpuMs(process.cpuUsage(c0));
    const busy = perf.eventLoopUtilization(elu0).active;
    results.forEach((r, i) => frequencies(r).forEach((f, j) => (maxDiff = Math.max(maxDiff, Math.abs(f - reference[i][j]) / reference[i][j]))));
    runs.push({ workers: w, ms, cpuMs: cpu, variantMs: results.reduce((a, r) => a + r.ms, 0), speedupSerial: serialMs / ms, speedupOneWorker: NaN, symbolicReused: results.filter((r) => r.ok && r.symbolicReused).length, callerBusyMs: busy, load: [load0, loadavg()[0]] });
  }
  const one = runs.find((r) => r.workers === 1)?.ms;
  const withOne = runs.map((r) => ({ ...r, speedupOneWorker: one !== undefined && r.workers !== 'serial' ? one / r.ms : NaN }));
  const ceiling = await parallelCeiling(cores);
  return { variants: n, dofs, count, cores, runs: withOne, maxRelativeDifference: maxDiff, ceiling };
}

function cpuMs(u: NodeJS.CpuUsage): number {
  return (u.user + u.system) / 1000;
}

/** A short text table of a {@link BatchBenchResult}. */
export function formatBatchBench(r: BatchBenchResult): string {
  const s = (ms: number): string => (ms / 1000).toFixed(2).padStart(6);
  const x = (v: number): string => (Number.isFinite(v) ? `×${v.toFixed(2)}` : '  –  ').padStart(6);
  const lines = [
    `Parameter study: truss footbridge (${r.dofs} DOF), ${r.variants} variants (chord × web wall thickness), ${r.count} modes each; ${r.cores} cores`,
    `  run                   wall s   cpu s  cores used  variants s  caller s  vs serial  vs 1 worker  symbolic reused  load avg (1 min) before → after`,
    ...r.runs.map((u) => {
      const name = u.workers === 'serial' ? 'serial (this thread)' : `solveBatch, ${u.workers} worker${u.workers === 1 ? ' ' : 's'}`;
      return `  ${name.padEnd(21)} ${s(u.ms)}  ${s(u.cpuMs)}      ${(u.cpuMs / u.ms).toFixed(2)}    ${s(u.variantMs)}    ${s(u.callerBusyMs)}     ${x(u.speedupSerial)}      ${x(u.speedupOneWorker)}        ${String(u.symbolicReused).padStart(3)}/${r.variants}       ${u.load[0].toFixed(2)} → ${u.load[1].toFixed(2)}`;
    }),
    '  (cpu s = user + system time of every thread of the process, V8\'s garbage-collector threads included; cores used = cpu s / wall s;',
    '   variants s = sum of the variants\' own solve times;',
    '   caller s = time the calling thread was busy: making, sending and receiving the variants, or solving them when serial;',
    '   a wall-time speed-up needs idle cores: with a load average near the core count, other work holds them)',
    `  largest relative frequency difference vs serial: ${r.maxRelativeDifference.toExponential(1)}`,
    `  this machine's own ceiling, ${r.cores} threads against 1 (same work each): arithmetic ×${r.ceiling.compute.toFixed(2)}, streaming a 32 MiB array ×${r.ceiling.memory.toFixed(2)}`,
  ];
  return lines.join('\n');
}
