/**
 * Parameter studies across CPU cores: many model variants solved in `worker_threads`, results in
 * input order, each failure reported for its own variant without stopping the others.
 *
 * Node only (this folder is the `eigenframe/node` entry). One pool of workers per call. Each
 * worker gets the study's base model once (in its `workerData`), then chunks of variants, each a
 * whole model or a JSON Merge Patch of the base (RFC 7396), runs {@link solveVariantPacked} on
 * them with its own {@link SymbolicCache} (variants that share a sparsity pattern reuse one
 * symbolic analysis per worker), and posts each result as plain JSON with the mode shapes as a
 * transferred Float64Array.
 *
 * Scheduling: a shared queue; each worker holds two chunks (one solving, one waiting) and asks
 * for more as they finish, so workers of unequal speed, or variants of unequal cost, balance.
 * Chunk sizes follow guided self-scheduling (Polychronopoulos and Kuck 1987): large while much
 * is left, single variants at the end. The per-message cost (structured clone, event loop hop,
 * about 0.1 ms plus the data) is paid per chunk; the per-variant data is a small patch.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { AbortedError, ArgumentError } from '../errors';
import { createMergePatch, describeError, SYMBOLIC_CACHE_DEFAULTS, type VariantError, type VariantOptions } from './variant';

/**
 * A study as a base model, the list of parameters, and one of two ways to make a variant from a
 * parameter:
 * - `patch(parameter, index)` returns a JSON Merge Patch (IETF RFC 7396) of the base, e.g.
 *   `{ sections: { chord: { A: 0.012 } } }`: objects merge member by member, `null` removes a
 *   member, arrays and numbers replace. The base goes to each worker once and the worker applies
 *   the patch, so a variant costs the calling thread almost nothing. The faster way.
 * - `vary(base, parameter, index)` returns the whole variant model. It runs on the calling
 *   thread; the variant is then sent as its merge patch against the base when one can express
 *   it (plain JSON objects without null members), else whole.
 */
export type ParameterStudy<P> = {
  /** The base model (JSON object or text). */
  readonly base: unknown;
  /** One entry per variant, in order. */
  readonly parameters: readonly P[];
} & (
  | {
      /**
       * The variant as a merge patch of the base (RFC 7396); runs on the calling thread, one
       * chunk of variants at a time. Must return plain JSON data.
       */
      readonly patch: (parameter: P, index: number) => unknown;
      readonly vary?: undefined;
    }
  | {
      /**
       * Returns the model of one variant (JSON object or text). Runs on the calling thread, one
       * chunk of variants at a time just before they are sent; it must not modify `base`.
       */
      readonly vary: (base: unknown, parameter: P, index: number) => unknown;
      readonly patch?: undefined;
    }
);

/** Options of {@link solveBatch}: each variant's analysis options, plus how the batch runs. */
export interface BatchOptions extends VariantOptions {
  /** Worker threads, ≥ 1 (never more than the variants). @defaultValue os.availableParallelism() */
  workers?: number;
  /**
   * Variants per message to a worker, an integer ≥ 1, or `'auto'`: guided self-scheduling
   * (Polychronopoulos and Kuck, IEEE Trans. Computers C-36(12), 1987), each chunk
   * ⌈remaining / (4 · workers)⌉ variants, at most 32, so that early chunks are large (few
   * messages) and the last ones single variants (the workers finish together).
   * @defaultValue 'auto' (BATCH_DEFAULTS.chunkSize)
   */
  chunkSize?: number | 'auto';
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
export const BATCH_DEFAULTS = { cacheSize: SYMBOLIC_CACHE_DEFAULTS.capacity, chunkSize: 'auto' } as const;

/** Guided self-scheduling of `chunkSize: 'auto'`: chunks of ⌈remaining / (GUIDED_FACTOR · workers)⌉, at most GUIDED_MAX. */
const GUIDED_FACTOR = 4;
const GUIDED_MAX = 32;
/** Chunks each worker holds at once: one being solved, one waiting, so a worker never waits for the calling thread. */
const CHUNKS_AHEAD = 2;

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
      /**
       * The `eigenframe-modes/1` object (as `eigenframe modes --json` prints). With
       * `shapes: true`, each `modes[j].shape` is a Float64Array of the free DOFs (one view per
       * mode into one buffer transferred from the worker, not copied); `Array.from` it before
       * `JSON.stringify`.
       */
      readonly result: Record<string, unknown>;
      /** True when the worker reused a symbolic analysis made for an earlier variant. */
      readonly symbolicReused: boolean;
    }
  | { readonly ok: false; readonly error: VariantError }
);

/** One variant as sent to a worker: its whole model, or a merge patch of the worker's base. */
export type BatchItem = { readonly index: number; readonly model: unknown } | { readonly index: number; readonly patch: unknown };

/** Message to a worker: a chunk of variants, solved in order. */
export interface BatchJob {
  readonly type: 'chunk';
  readonly items: readonly BatchItem[];
}

/**
 * Messages from a worker: `ready` once its script has loaded, then per variant any `progress`
 * and one `result` (in the order of the chunk). `shapes` (with the `shapes` option) is the
 * packed n × m mode-shape array, transferred.
 */
export type BatchWorkerMessage =
  | { readonly type: 'ready' }
  | { readonly type: 'progress'; readonly index: number; readonly phase: string; readonly fraction: number }
  | ({ readonly type: 'result'; readonly index: number } & (
      | { readonly ok: true; readonly result: Record<string, unknown>; readonly symbolicReused: boolean; readonly ms: number; readonly shapes?: Float64Array }
      | { readonly ok: false; readonly error: VariantError; readonly ms: number }
    ));

/** Data every worker starts with. */
export interface BatchWorkerData {
  readonly options: VariantOptions;
  readonly cacheSize: number;
  /** Post the solver's progress of each variant. */
  readonly forwardProgress: boolean;
  /** The study's base model (parsed), which `patch` items apply to; absent for a list of models. */
  readonly base?: unknown;
}

/**
 * Solves model variants in parallel worker threads.
 *
 * One pool of workers per call, each started once: it receives the base model once (parameter
 * studies), then chunks of variants (whole models or merge patches, see {@link ParameterStudy}),
 * keeps its own symbolic analyses, and posts each variant's result as it finishes, with mode
 * shapes as transferred typed arrays.
 * @param variants - a list of models (JSON objects or texts), or a {@link ParameterStudy}
 * @param options - analysis options applied to every variant (count, method, …; see
 *   {@link VariantOptions}) and batch options (workers, chunkSize, signal, onProgress, workerFile)
 * @returns one {@link VariantResult} per variant, in input order; a bad variant gives
 *   `ok: false` with its error's name, path and message, and the others still run
 * @throws ArgumentError (path `variants`, `variants.base`, `workers`, `chunkSize`, `cacheSize`
 *   or `workerFile`) for bad arguments; AbortedError (path `signal`) when aborted
 */
export async function solveBatch<P = unknown>(variants: readonly unknown[] | ParameterStudy<P>, options: BatchOptions = {}): Promise<VariantResult<P>[]> {
  const { workers: workersOption, chunkSize: chunkOption, signal, onProgress, onVariantProgress, workerFile, cacheSize, ...variantOptions } = options;
  const study = isStudy<P>(variants) ? variants : undefined;
  if (!study && !Array.isArray(variants)) {
    throw new ArgumentError('is neither an array of models nor { base, parameters, patch | vary }; pass one of those', 'variants');
  }
  if (study && (!Array.isArray(study.parameters) || (typeof study.vary === 'function') === (typeof study.patch === 'function'))) {
    throw new ArgumentError('a parameter study needs an array "parameters" and exactly one function, "patch" or "vary"; pass { base, parameters, patch } or { base, parameters, vary }', 'variants');
  }
  const total = study ? study.parameters.length : (variants as readonly unknown[]).length;
  const wanted = workersOption ?? availableParallelism();
  if (!Number.isInteger(wanted) || wanted < 1) throw new ArgumentError(`workers is ${wanted}; pass a positive integer`, 'workers');
  const chunkSize = chunkOption ?? BATCH_DEFAULTS.chunkSize;
  if (chunkSize !== 'auto' && (!Number.isInteger(chunkSize) || chunkSize < 1)) {
    throw new ArgumentError(`chunkSize is ${String(chunkSize)}; pass a positive integer (variants per message) or 'auto'`, 'chunkSize');
  }
  const keep = cacheSize ?? BATCH_DEFAULTS.cacheSize;
  if (!Number.isInteger(keep) || keep < 1) throw new ArgumentError(`cacheSize is ${keep}; pass a positive integer (analyses kept per worker)`, 'cacheSize');
  const file = workerFile ?? defaultWorkerFile();
  const filePath = file instanceof URL ? fileURLToPath(file) : file;
  if (!existsSync(filePath)) {
    throw new ArgumentError(`worker script "${filePath}" does not exist; build the package (npm run build) or pass workerFile`, 'workerFile');
  }
  // The base every worker holds: parsed once here; a `vary` study with a base that is not JSON
  // sends its variants whole.
  let base: unknown;
  if (study) {
    if (typeof study.base !== 'string') base = study.base;
    else {
      try {
        base = JSON.parse(study.base) as unknown;
      } catch (e) {
        if (study.patch) throw new ArgumentError(`base is not JSON text (${e instanceof Error ? e.message : String(e)}); pass the model object or valid JSON text`, 'variants.base');
      }
    }
  }
  if (signal?.aborted) throw abortError();
  if (total === 0) return [];

  const workerCount = Math.min(wanted, total);
  const results: Array<VariantResult<P> | undefined> = new Array(total);
  const data: BatchWorkerData = { options: variantOptions, cacheSize: keep, forwardProgress: onVariantProgress !== undefined, ...(base !== undefined ? { base } : {}) };
  let next = 0;
  let finished = 0;
  /** Items taken back from a worker that died: sent again before new ones. */
  const retry: BatchItem[] = [];

  return new Promise<VariantResult<P>[]>((resolve, reject) => {
    const pool = new Map<Worker, WorkerState>();
    let settled = false;

    const finish = (error?: unknown): void => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener('abort', onAbort);
      for (const w of pool.keys()) void w.terminate();
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
    const pathOf = (index: number): string => (study ? `parameters[${index}]` : `variants[${index}]`);

    /** The next variant as an item to send, or undefined when none is left; failures of `patch`/`vary` are recorded on the spot. */
    const nextItem = (): BatchItem | undefined => {
      const again = retry.shift();
      if (again) return again;
      while (!settled && next < total) {
        const index = next++;
        try {
          if (!study) return { index, model: (variants as readonly unknown[])[index] };
          if (study.patch) return { index, patch: study.patch(study.parameters[index], index) };
          const model = study.vary(study.base, study.parameters[index], index);
          const patch = base !== undefined ? createMergePatch(base, model) : undefined;
          return patch !== undefined ? { index, patch } : { index, model };
        } catch (e) {
          const err = describeError(e);
          record({ index, ...parameterOf(index), ms: 0, ok: false, error: { ...err, path: err.path || `parameters[${index}]` } });
        }
      }
      return undefined;
    };

    /** Size of the next chunk: fixed, or guided by what is left. */
    const nextChunkSize = (): number => {
      if (chunkSize !== 'auto') return chunkSize;
      const remaining = total - next + retry.length;
      return Math.max(1, Math.min(GUIDED_MAX, Math.ceil(remaining / (GUIDED_FACTOR * workerCount))));
    };

    /** Posts one chunk; items that cannot be cloned to a worker are failed alone. */
    const post = (w: Worker, state: WorkerState, items: BatchItem[]): void => {
      try {
        w.postMessage({ type: 'chunk', items } satisfies BatchJob);
        state.inFlight.push(...items);
        return;
      } catch {
        // Some item holds a function, a symbol, …: send them one by one to find it.
      }
      for (const item of items) {
        try {
          w.postMessage({ type: 'chunk', items: [item] } satisfies BatchJob);
          state.inFlight.push(item);
        } catch (e) {
          record({ index: item.index, ...parameterOf(item.index), ms: 0, ok: false, error: { name: 'ArgumentError', path: pathOf(item.index), message: `the model cannot be sent to a worker (${describeError(e).message}); pass plain JSON data` } });
        }
      }
    };

    /** Keeps `w` supplied with CHUNKS_AHEAD chunks; retires it when nothing is left for it. */
    const feed = (w: Worker, state: WorkerState): void => {
      while (!settled && state.chunkEnds.length < CHUNKS_AHEAD) {
        const size = nextChunkSize();
        const items: BatchItem[] = [];
        while (items.length < size) {
          const item = nextItem();
          if (!item) break;
          items.push(item);
        }
        if (items.length === 0) break;
        const before = state.inFlight.length;
        post(w, state, items);
        if (state.inFlight.length > before) state.chunkEnds.push(state.inFlight.length - before);
      }
      if (!settled && state.inFlight.length === 0) {
        // Nothing left for this worker.
        pool.delete(w);
        void w.terminate();
      }
    };

    const spawn = (): void => {
      let w: Worker;
      try {
        w = new Worker(filePath, { workerData: data });
      } catch (e) {
        // workerData is cloned here: a base with a function, a symbol, … cannot cross.
        finish(new ArgumentError(`the base model cannot be sent to a worker (${describeError(e).message}); pass plain JSON data`, 'variants.base'));
        return;
      }
      const state: WorkerState = { ready: false, inFlight: [], chunkEnds: [] };
      pool.set(w, state);
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
        const k = state.inFlight.findIndex((it) => it.index === msg.index);
        if (k >= 0) state.inFlight.splice(k, 1);
        if (state.chunkEnds.length > 0 && --state.chunkEnds[0] === 0) state.chunkEnds.shift();
        record({ ...withShapes(outcome), ...parameterOf(msg.index) } as VariantResult<P>);
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
        // The first variant not yet answered was the one being solved; the rest go back in the queue.
        const [current, ...waiting] = state.inFlight;
        state.inFlight.length = 0;
        retry.unshift(...waiting);
        if (current) {
          record({ index: current.index, ...parameterOf(current.index), ms: 0, ok: false, error: { name: 'Error', path: pathOf(current.index), message: `the worker thread solving this variant stopped (${why}); the model may be too large for the memory of one thread` } });
        }
        if (!settled && (retry.length > 0 || next < total)) spawn();
      };
      w.on('error', (e) => lost(e instanceof Error ? e.message : String(e)));
      w.on('exit', (code) => lost(`exit code ${code}`));
      feed(w, state);
    };

    for (let k = 0; k < workerCount && !settled && (next < total || retry.length > 0); k++) spawn();
  });
}

/** What the calling thread keeps per worker: the items sent and not yet answered, in order, and the chunks they came in. */
interface WorkerState {
  ready: boolean;
  readonly inFlight: BatchItem[];
  /** Unanswered variants left in each outstanding chunk, oldest first (its length: chunks held). */
  readonly chunkEnds: number[];
}

/** Puts the transferred packed shapes back on the modes, one Float64Array view per mode. */
function withShapes<T extends { ok: boolean; shapes?: Float64Array; result?: Record<string, unknown> }>(outcome: T): Omit<T, 'shapes'> {
  const { shapes, ...rest } = outcome;
  if (!shapes || !rest.ok || !rest.result) return rest;
  const modes = rest.result.modes as Array<Record<string, unknown>>;
  const n = rest.result.dofCount as number;
  modes.forEach((m, j) => (m.shape = shapes.subarray(j * n, (j + 1) * n)));
  return rest;
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
