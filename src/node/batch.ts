/**
 * Parameter studies across CPU cores: many model variants solved in `worker_threads`, results in
 * input order, each failure reported for its own variant without stopping the others.
 *
 * Node only (this folder is the `eigenframe/node` entry). Each worker runs {@link solveVariant}
 * on model JSON and sends back plain JSON (`eigenframe-modes/1` objects), and keeps its own
 * {@link SymbolicCache}, so variants that share a sparsity pattern reuse one symbolic analysis
 * per worker. Variants are handed out one at a time to whichever worker is free (a shared
 * queue), which balances variants of unequal cost.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { AbortedError, ArgumentError } from '../errors';
import { describeError, SYMBOLIC_CACHE_DEFAULTS, type VariantError, type VariantOptions } from './variant';

/** A study as a base model and a function of one parameter that returns the variant's model. */
export interface ParameterStudy<P> {
  /** The base model (JSON object or text), passed to `vary` unchanged. */
  readonly base: unknown;
  /**
   * Returns the model of one variant (JSON object or text). Runs on the calling thread, one
   * variant at a time just before it is sent to a worker; it must not modify `base`.
   */
  readonly vary: (base: unknown, parameter: P, index: number) => unknown;
  /** One entry per variant, in order. */
  readonly parameters: readonly P[];
}

/** Options of {@link solveBatch}: each variant's analysis options, plus how the batch runs. */
export interface BatchOptions extends VariantOptions {
  /** Worker threads, ≥ 1 (never more than the variants). @defaultValue os.availableParallelism() */
  workers?: number;
  /** Aborting terminates the workers and rejects with AbortedError (path `signal`). @defaultValue none */
  signal?: AbortSignal;
  /** Called as variants finish: ('variants', finished / total). @defaultValue none */
  onProgress?: (phase: string, fraction: number) => void;
  /**
   * The solver's own progress inside each variant, forwarded from the workers: (variant index,
   * phase, fraction in [0, 1]); phases as `solve` reports them. Useful for one long solve run off
   * the main thread (`solveBatch([model], …)`). @defaultValue none (not forwarded)
   */
  onVariantProgress?: (index: number, phase: string, fraction: number) => void;
  /**
   * Worker script: the built `batch-worker` entry. @defaultValue `batch-worker.js` (ESM build)
   * or `batch-worker.cjs` (CJS build) beside this module's file
   */
  workerFile?: string | URL;
  /** Symbolic analyses each worker keeps, ≥ 1. @defaultValue 8 (BATCH_DEFAULTS.cacheSize) */
  cacheSize?: number;
}

/** Defaults of {@link BatchOptions} with a fixed value (`workers` defaults to os.availableParallelism()). */
export const BATCH_DEFAULTS = { cacheSize: SYMBOLIC_CACHE_DEFAULTS.capacity } as const;

/** Outcome of one variant, at its input position. */
export type VariantResult<P = unknown> = {
  /** Position in the input, 0-based. */
  readonly index: number;
  /** The study parameter of this variant (parameter studies only). */
  readonly parameter?: P;
  /** Wall time of the variant inside its worker, ms (0 when it failed before reaching one). */
  readonly ms: number;
} & (
  | {
      readonly ok: true;
      /** The `eigenframe-modes/1` object (as `eigenframe modes --json` prints). */
      readonly result: Record<string, unknown>;
      /** True when the worker reused a symbolic analysis made for an earlier variant. */
      readonly symbolicReused: boolean;
    }
  | { readonly ok: false; readonly error: VariantError }
);

/** Message to a worker: one variant. */
export interface BatchJob {
  readonly index: number;
  readonly model: unknown;
}

/** Messages from a worker: `ready` once its script has loaded, then per job any `progress` and one `result`. */
export type BatchWorkerMessage =
  | { readonly type: 'ready' }
  | { readonly type: 'progress'; readonly index: number; readonly phase: string; readonly fraction: number }
  | ({ readonly type: 'result'; readonly index: number } & (
      | { readonly ok: true; readonly result: Record<string, unknown>; readonly symbolicReused: boolean; readonly ms: number }
      | { readonly ok: false; readonly error: VariantError; readonly ms: number }
    ));

/** Data every worker starts with. */
export interface BatchWorkerData {
  readonly options: VariantOptions;
  readonly cacheSize: number;
  /** Post the solver's progress of each variant. */
  readonly forwardProgress: boolean;
}

/**
 * Solves model variants in parallel worker threads.
 * @param variants - a list of models (JSON objects or texts), or a {@link ParameterStudy}
 * @param options - analysis options applied to every variant (count, method, …; see
 *   {@link VariantOptions}) and batch options (workers, signal, onProgress, workerFile)
 * @returns one {@link VariantResult} per variant, in input order; a bad variant gives
 *   `ok: false` with its error's name, path and message, and the others still run
 * @throws ArgumentError (path `variants`, `workers` or `workerFile`) for bad arguments;
 *   AbortedError (path `signal`) when aborted
 */
export async function solveBatch<P = unknown>(variants: readonly unknown[] | ParameterStudy<P>, options: BatchOptions = {}): Promise<VariantResult<P>[]> {
  const { workers: workersOption, signal, onProgress, onVariantProgress, workerFile, cacheSize, ...variantOptions } = options;
  const study = isStudy<P>(variants) ? variants : undefined;
  if (!study && !Array.isArray(variants)) {
    throw new ArgumentError('is neither an array of models nor { base, vary, parameters }; pass one of those', 'variants');
  }
  if (study && (typeof study.vary !== 'function' || !Array.isArray(study.parameters))) {
    throw new ArgumentError('a parameter study needs a function "vary" and an array "parameters"; pass { base, vary, parameters }', 'variants');
  }
  const total = study ? study.parameters.length : (variants as readonly unknown[]).length;
  const wanted = workersOption ?? availableParallelism();
  if (!Number.isInteger(wanted) || wanted < 1) throw new ArgumentError(`workers is ${wanted}; pass a positive integer`, 'workers');
  const keep = cacheSize ?? BATCH_DEFAULTS.cacheSize;
  if (!Number.isInteger(keep) || keep < 1) throw new ArgumentError(`cacheSize is ${keep}; pass a positive integer (analyses kept per worker)`, 'cacheSize');
  const file = workerFile ?? defaultWorkerFile();
  const filePath = file instanceof URL ? fileURLToPath(file) : file;
  if (!existsSync(filePath)) {
    throw new ArgumentError(`worker script "${filePath}" does not exist; build the package (npm run build) or pass workerFile`, 'workerFile');
  }
  if (signal?.aborted) throw abortError();
  if (total === 0) return [];

  const results: Array<VariantResult<P> | undefined> = new Array(total);
  const data: BatchWorkerData = { options: variantOptions, cacheSize: keep, forwardProgress: onVariantProgress !== undefined };
  let next = 0;
  let finished = 0;

  return new Promise<VariantResult<P>[]>((resolve, reject) => {
    const pool = new Set<Worker>();
    let settled = false;

    const finish = (error?: unknown): void => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener('abort', onAbort);
      for (const w of pool) void w.terminate();
      pool.clear();
      if (error !== undefined) reject(error);
      else resolve(results as VariantResult<P>[]);
    };
    const onAbort = (): void => finish(abortError());
    signal?.addEventListener('abort', onAbort, { once: true });

    const record = (r: VariantResult<P>): void => {
      results[r.index] = r;
      finished++;
      onProgress?.('variants', finished / total);
      if (finished === total) finish();
    };
    const parameterOf = (index: number): { parameter?: P } => (study ? { parameter: study.parameters[index] } : {});

    /** Hands the next variant to `w`; variants whose `vary` throws are recorded on the spot. */
    const feed = (w: Worker, state: { job: number }): void => {
      while (!settled && next < total) {
        const index = next++;
        let model: unknown;
        try {
          model = study ? study.vary(study.base, study.parameters[index], index) : (variants as readonly unknown[])[index];
        } catch (e) {
          const err = describeError(e);
          record({ index, ...parameterOf(index), ms: 0, ok: false, error: { ...err, path: err.path || `parameters[${index}]` } });
          continue;
        }
        state.job = index;
        try {
          w.postMessage({ index, model } satisfies BatchJob);
        } catch (e) {
          // The model could not be cloned to the worker (a function, a symbol, …).
          state.job = -1;
          const err = describeError(e);
          record({ index, ...parameterOf(index), ms: 0, ok: false, error: { name: 'ArgumentError', path: study ? `parameters[${index}]` : `variants[${index}]`, message: `the model cannot be sent to a worker (${err.message}); pass plain JSON data` } });
          continue;
        }
        return;
      }
      // Nothing left for this worker.
      pool.delete(w);
      void w.terminate();
    };

    const spawn = (): void => {
      const w = new Worker(filePath, { workerData: data });
      const state = { job: -1, ready: false };
      pool.add(w);
      w.on('message', (msg: BatchWorkerMessage) => {
        if (settled) return;
        if (msg.type === 'ready') {
          state.ready = true;
          return;
        }
        if (msg.type === 'progress') {
          onVariantProgress?.(msg.index, msg.phase, msg.fraction);
          return;
        }
        const { type: _type, ...outcome } = msg;
        record({ ...outcome, ...parameterOf(msg.index) } as VariantResult<P>);
        feed(w, state);
      });
      const lost = (why: string): void => {
        if (settled || !pool.has(w)) return;
        pool.delete(w);
        if (!state.ready) {
          // Died before its script loaded: no variant is to blame, so the batch fails.
          finish(new ArgumentError(`the worker thread failed to start (${why}); check that the script is the built batch-worker entry`, 'workerFile'));
          return;
        }
        if (state.job < 0) {
          if (pool.size === 0 && next < total) spawn();
          return;
        }
        const index = state.job;
        state.job = -1;
        record({ index, ...parameterOf(index), ms: 0, ok: false, error: { name: 'Error', path: study ? `parameters[${index}]` : `variants[${index}]`, message: `the worker thread solving this variant stopped (${why}); the model may be too large for the memory of one thread` } });
        if (!settled && next < total) spawn();
      };
      w.on('error', (e) => lost(e instanceof Error ? e.message : String(e)));
      w.on('exit', (code) => lost(`exit code ${code}`));
      feed(w, state);
    };

    const count = Math.min(wanted, total);
    for (let k = 0; k < count && next < total && !settled; k++) spawn();
  });
}

function isStudy<P>(v: unknown): v is ParameterStudy<P> {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && 'parameters' in v;
}

function abortError(): AbortedError {
  return new AbortedError('the batch was aborted through its AbortSignal; its workers were stopped and no results are returned; run it again without aborting', 'signal');
}

/**
 * The built worker script beside this module: `batch-worker.cjs` next to the CJS build (which
 * has `__filename`), else `batch-worker.js` next to the ESM build.
 */
function defaultWorkerFile(): string {
  if (typeof __filename === 'string' && __filename.endsWith('.cjs')) return join(dirname(__filename), 'batch-worker.cjs');
  return fileURLToPath(new URL('./batch-worker.js', import.meta.url));
}
