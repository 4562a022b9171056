/**
 * Parameter-study speed-up: the demo footbridge with its chord section scaled over N values
 * (default 200), 12 modes each, solved (a) serially on the calling thread with one symbolic
 * cache, (b) by solveBatch with 1 worker, (c) with every core. Same results in all three, the
 * bench checks it (frequencies agree to 1e-12 relative).
 *
 * Call `runBatchBench()` from bench/main.ts (async) and print `formatBatchBench(result)`.
 */
import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { solveBatch, type VariantResult } from '../src/node/batch';
import { solveVariant, SymbolicCache } from '../src/node/variant';

/** Options of {@link runBatchBench}. */
export interface BatchBenchOptions {
  /** Variants in the study. @defaultValue 200 */
  variants?: number;
  /** Modes per variant. @defaultValue 12 */
  count?: number;
  /** Worker counts to time. @defaultValue [1, os.availableParallelism()] (one entry if equal) */
  workers?: readonly number[];
  /** The built worker script. @defaultValue solveBatch's own default (dist/batch-worker.*) */
  workerFile?: string;
  /** The base model file. @defaultValue examples/footbridge.json (resolved from the working directory) */
  modelFile?: string;
}

/** What {@link runBatchBench} measured. */
export interface BatchBenchResult {
  readonly variants: number;
  readonly dofs: number;
  readonly cores: number;
  /** Serial, on the calling thread, with symbolic reuse, ms. */
  readonly serialMs: number;
  /** CPU time of the serial run (user + system, all threads of the process), ms. */
  readonly serialCpuMs: number;
  /** solveBatch wall time per worker count, ms, and speed-up against the 1-worker run (or serial when 1 was not run). */
  readonly runs: ReadonlyArray<{ readonly workers: number; readonly ms: number; readonly cpuMs: number; readonly speedup: number; readonly symbolicReused: number }>;
  /** Largest relative difference of any frequency between the batch runs and the serial run. */
  readonly maxRelativeDifference: number;
}

type Section = { A: number; Iy?: number; Iz?: number; J?: number };

/** The study parameter: chord scale s from 0.5 to 1.5; A × s, I and J × s². */
function vary(base: unknown, s: number): unknown {
  const m = structuredClone(base) as { title: string; sections: Record<string, Section> };
  const c = m.sections.chord;
  m.sections.chord = { ...c, A: c.A * s, Iy: (c.Iy ?? 0) * s * s, Iz: (c.Iz ?? 0) * s * s, J: (c.J ?? 0) * s * s };
  m.title = `chord scale ${s.toFixed(4)}`;
  return m;
}

function frequencies(r: { ok: boolean; result?: Record<string, unknown> }): number[] {
  if (!r.ok || !r.result) throw new Error('a bench variant failed');
  return (r.result.modes as Array<{ frequency: number }>).map((m) => m.frequency);
}

/** Runs the study serially and with solveBatch; see {@link BatchBenchOptions}. */
export async function runBatchBench(options: BatchBenchOptions = {}): Promise<BatchBenchResult> {
  const n = options.variants ?? 200;
  const count = options.count ?? 12;
  const cores = availableParallelism();
  const workerCounts = options.workers ?? [...new Set([1, cores])];
  const base = JSON.parse(readFileSync(options.modelFile ?? 'examples/footbridge.json', 'utf8')) as unknown;
  const parameters = Array.from({ length: n }, (_, i) => 0.5 + (n === 1 ? 0 : i / (n - 1)));

  const cache = new SymbolicCache();
  let c0 = process.cpuUsage();
  let t0 = performance.now();
  const serial = parameters.map((s) => solveVariant(vary(base, s), { count }, cache));
  const serialMs = performance.now() - t0;
  const serialCpuMs = cpuMs(process.cpuUsage(c0));
  const reference = serial.map(frequencies);
  const dofs = serial[0].ok ? (serial[0].result.dofCount as number) : 0;

  const runs: Array<{ workers: number; ms: number; cpuMs: number; speedup: number; symbolicReused: number }> = [];
  let maxDiff = 0;
  for (const w of workerCounts) {
    c0 = process.cpuUsage();
    t0 = performance.now();
    const results: VariantResult<number>[] = await solveBatch({ base, vary, parameters }, { workers: w, count, ...(options.workerFile ? { workerFile: options.workerFile } : {}) });
    const ms = performance.now() - t0;
    const cpu = cpuMs(process.cpuUsage(c0));
    results.forEach((r, i) => frequencies(r).forEach((f, j) => (maxDiff = Math.max(maxDiff, Math.abs(f - reference[i][j]) / reference[i][j]))));
    runs.push({ workers: w, ms, cpuMs: cpu, speedup: 0, symbolicReused: results.filter((r) => r.ok && r.symbolicReused).length });
  }
  const one = runs.find((r) => r.workers === 1)?.ms ?? serialMs;
  for (const r of runs) r.speedup = one / r.ms;
  return { variants: n, dofs, cores, serialMs, serialCpuMs, runs, maxRelativeDifference: maxDiff };
}

function cpuMs(u: NodeJS.CpuUsage): number {
  return (u.user + u.system) / 1000;
}

/** A short text table of a {@link BatchBenchResult}. */
export function formatBatchBench(r: BatchBenchResult): string {
  const lines = [
    `Parameter study: demo footbridge (${r.dofs} DOF), ${r.variants} variants, chord section scaled; ${r.cores} cores`,
    `  serial (calling thread, symbolic reuse)  wall ${(r.serialMs / 1000).toFixed(2)} s   cpu ${(r.serialCpuMs / 1000).toFixed(2)} s`,
    ...r.runs.map((x) => `  solveBatch, ${String(x.workers).padStart(2)} worker(s)            wall ${(x.ms / 1000).toFixed(2)} s   cpu ${(x.cpuMs / 1000).toFixed(2)} s   speed-up ×${x.speedup.toFixed(2)}   symbolic reused ${x.symbolicReused}/${r.variants}`),
    `  (cpu = user + system time of all threads; a wall-time speed-up needs idle cores: load average ${loadavg()[0].toFixed(1)})`,
    `  largest relative frequency difference vs serial: ${r.maxRelativeDifference.toExponential(1)}`,
  ];
  return lines.join('\n');
}
