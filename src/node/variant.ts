/**
 * One variant of a parameter study, solved from model JSON to plain JSON: the pure function a
 * worker thread (or any job-queue worker) runs. No Node-only imports, so it also runs in a
 * browser's Web Worker.
 *
 * Symbolic reuse: design variants that change member sizes, materials or masses keep the
 * sparsity pattern of K and M, so the fill-reducing ordering and symbolic factorization of the
 * first one serve all the others (analyse once, factorize many: Eigen's SimplicialLDLT
 * `analyzePattern`/`factorize` split; Davis 2006, "Direct Methods for Sparse Linear Systems",
 * ch. 4). A {@link SymbolicCache} keeps analyses keyed by a hash of the union pattern and
 * confirms a hit by comparing the pattern itself.
 */
import { EigenframeError } from '../errors';
import { DENSE_CROSSOVER } from '../eigen/solve';
import { modesJsonObject } from '../io/report-json';
import { modalAnalysis, type ModalAnalysisOptions } from '../modal/analysis';
import { assemble } from '../model/assemble';
import { parseModel, validateModel } from '../model/read';
import { analyse } from '../linalg/ldlt/analyse';
import type { SymbolicFactor } from '../linalg/ldlt/types';
import { unionPattern, type SymmetricCsc } from '../linalg/sparse/symmetric';

/**
 * Options of one variant's modal analysis: everything {@link ModalAnalysisOptions} takes that can
 * cross a thread boundary (no callbacks, no signal, no symbolic analysis), plus `shapes`.
 */
export interface VariantOptions extends Omit<ModalAnalysisOptions, 'onProgress' | 'signal' | 'symbolic'> {
  /** Include each mode's shape vector and the DOF list in the result. @defaultValue false */
  shapes?: boolean;
}

/** Why one variant failed: the error's class name, its path and its message (without the path). */
export interface VariantError {
  /** Class name: `ModelError`, `ArgumentError`, `VerificationError`, …, or `Error` for anything else. */
  readonly name: string;
  /** The offending item (`elements[3].section`, `count`, `modes[2]`), or `` when the error has none. */
  readonly path: string;
  /** What is wrong, the value, and what would fix it. */
  readonly message: string;
}

/** Outcome of one variant: the `eigenframe-modes/1` JSON object, or the error. */
export type VariantOutcome =
  | {
      readonly ok: true;
      /** `modesJsonObject(analysis, { shapes })`: the same object `eigenframe modes --json` prints. */
      readonly result: Record<string, unknown>;
      /** True when the symbolic analysis came from the cache (same pattern as an earlier variant). */
      readonly symbolicReused: boolean;
      /** Wall time of this variant, ms. */
      readonly ms: number;
    }
  | { readonly ok: false; readonly error: VariantError; readonly ms: number };

/** Defaults of {@link SymbolicCache}. */
export const SYMBOLIC_CACHE_DEFAULTS = { capacity: 8 } as const;

interface CacheEntry {
  readonly hash: number;
  readonly pattern: SymmetricCsc;
  readonly ordering: string;
  readonly symbolic: SymbolicFactor;
}

/**
 * Symbolic analyses of union patterns of K and M, most recently used first, at most `capacity`.
 * Not shared between threads: each worker keeps its own.
 */
export class SymbolicCache {
  readonly capacity: number;
  /** Lookups answered from the cache, and lookups that had to analyse. */
  hits = 0;
  misses = 0;
  private readonly entries: CacheEntry[] = [];

  /** @param capacity - analyses kept, ≥ 1 @defaultValue 8 */
  constructor(capacity: number = SYMBOLIC_CACHE_DEFAULTS.capacity) {
    this.capacity = Math.max(1, Math.floor(capacity));
  }

  /**
   * The analysis of `pattern` with `ordering`, from the cache or made now.
   * @param pattern - union pattern of K and M (lower CSC; values ignored)
   * @param ordering - ordering name, as `analyse` takes it @defaultValue 'auto'
   */
  get(pattern: SymmetricCsc, ordering: string = 'auto'): { symbolic: SymbolicFactor; reused: boolean } {
    const hash = patternHash(pattern);
    for (let k = 0; k < this.entries.length; k++) {
      const e = this.entries[k];
      if (e.hash === hash && e.ordering === ordering && samePattern(e.pattern, pattern)) {
        this.entries.splice(k, 1);
        this.entries.unshift(e);
        this.hits++;
        return { symbolic: e.symbolic, reused: true };
      }
    }
    this.misses++;
    const symbolic = analyse(pattern, { ordering: ordering as 'auto' });
    this.entries.unshift({ hash, pattern, ordering, symbolic });
    if (this.entries.length > this.capacity) this.entries.pop();
    return { symbolic, reused: false };
  }
}

/** FNV-1a (32-bit) over n, column pointers and row indices of a lower CSC pattern. */
export function patternHash(a: SymmetricCsc): number {
  let h = 0x811c9dc5;
  const mix = (v: number): void => {
    h ^= v;
    h = Math.imul(h, 0x01000193);
  };
  mix(a.n);
  for (let j = 0; j <= a.n; j++) mix(a.colPtr[j]);
  const nz = a.colPtr[a.n];
  for (let p = 0; p < nz; p++) mix(a.rowIdx[p]);
  return h >>> 0;
}

function samePattern(a: SymmetricCsc, b: SymmetricCsc): boolean {
  if (a.n !== b.n) return false;
  for (let j = 0; j <= a.n; j++) if (a.colPtr[j] !== b.colPtr[j]) return false;
  const nz = a.colPtr[a.n];
  for (let p = 0; p < nz; p++) if (a.rowIdx[p] !== b.rowIdx[p]) return false;
  return true;
}

/** A thrown value as a {@link VariantError}. */
export function describeError(e: unknown): VariantError {
  if (e instanceof EigenframeError) return { name: e.name, path: e.path, message: e.detail };
  if (e instanceof Error) return { name: e.name || 'Error', path: typeof (e as { path?: unknown }).path === 'string' ? (e as unknown as { path: string }).path : '', message: e.message };
  return { name: 'Error', path: '', message: String(e) };
}

/**
 * Modal analysis of one model given as JSON, returned as plain JSON; never throws.
 * @param model - model JSON text, or the parsed object (validated here either way)
 * @param options - see {@link VariantOptions}; the defaults of modalAnalysis apply (12 modes)
 * @param cache - symbolic analyses to reuse across calls @defaultValue none (analysed each time)
 * @param onProgress - the solver's progress, (phase, fraction in [0, 1]) @defaultValue none
 * @returns `{ ok: true, result }` with `result` = modesJsonObject of the analysis, or
 *   `{ ok: false, error }` with the error's class name, path and message
 */
export function solveVariant(model: unknown, options: VariantOptions = {}, cache?: SymbolicCache, onProgress?: (phase: string, fraction: number) => void): VariantOutcome {
  const t0 = performance.now();
  try {
    const { shapes, ...analysisOptions } = options;
    const parsed = typeof model === 'string' ? parseModel(model) : validateModel(model);
    const asm = assemble(parsed);
    let symbolic: SymbolicFactor | undefined;
    let reused = false;
    const ordering = analysisOptions.ordering ?? 'auto';
    if (cache && typeof ordering === 'string' && needsSymbolic(asm.stiffness.n, analysisOptions)) {
      const got = cache.get(unionPattern(asm.stiffness, asm.mass).pattern, ordering);
      symbolic = got.symbolic;
      reused = got.reused;
    }
    const analysis = modalAnalysis(asm, { ...analysisOptions, ...(symbolic ? { symbolic } : {}), ...(onProgress ? { onProgress } : {}) });
    return { ok: true, result: modesJsonObject(analysis, { shapes: shapes === true }), symbolicReused: reused, ms: performance.now() - t0 };
  } catch (e) {
    return { ok: false, error: describeError(e), ms: performance.now() - t0 };
  }
}

/** Whether `solve` will analyse the pattern: the sparse methods always, the dense ones to verify. */
function needsSymbolic(n: number, o: VariantOptions): boolean {
  const method = o.method ?? 'auto';
  const dense = method === 'dense' || method === 'cholesky' || method === 'jacobi' || (method === 'auto' && n <= DENSE_CROSSOVER);
  return !dense || o.verify !== false;
}
