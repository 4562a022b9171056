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
  return runVariant(model, options, cache, onProgress, false).outcome;
}

/**
 * {@link solveVariant} with the mode shapes packed in one typed array instead of one JSON array
 * per mode, so that a worker thread can transfer them rather than copy them. With
 * `options.shapes`, `result.modes[j]` carries no `shape` and `shapes` holds all of them.
 * @returns the outcome, and with `options.shapes` on success `shapes`: length n·m, column-major
 *   (mode j at [j·n, (j+1)·n), in the order of `result.dofs`), n free DOFs, m modes
 */
export function solveVariantPacked(model: unknown, options: VariantOptions = {}, cache?: SymbolicCache, onProgress?: (phase: string, fraction: number) => void): { outcome: VariantOutcome; shapes?: Float64Array } {
  return runVariant(model, options, cache, onProgress, true);
}

function runVariant(model: unknown, options: VariantOptions, cache: SymbolicCache | undefined, onProgress: ((phase: string, fraction: number) => void) | undefined, packed: boolean): { outcome: VariantOutcome; shapes?: Float64Array } {
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
    if (packed && shapes === true) {
      const n = analysis.assembled.dofs.length;
      const result = modesJsonObject(analysis, { shapes: false });
      result.dofs = analysis.assembled.dofs.map((d) => ({ node: d.node, dof: d.dof })); // as modesJsonObject's `shapes` adds it
      // Own buffer (the solver's vectors may be a view into a larger workspace), transferable.
      const packedShapes = analysis.eigen.vectors.slice(0, n * analysis.modes.length);
      return { outcome: { ok: true, result, symbolicReused: reused, ms: performance.now() - t0 }, shapes: packedShapes };
    }
    return { outcome: { ok: true, result: modesJsonObject(analysis, { shapes: shapes === true }), symbolicReused: reused, ms: performance.now() - t0 } };
  } catch (e) {
    return { outcome: { ok: false, error: describeError(e), ms: performance.now() - t0 } };
  }
}

// --- JSON Merge Patch (RFC 7396) ------------------------------------------------------------------

/** A plain JSON object: not null, not an array, prototype Object.prototype or null. */
function isPlainObject(v: unknown): v is Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v) as unknown;
  return proto === Object.prototype || proto === null;
}

/**
 * Applies a JSON Merge Patch (IETF RFC 7396, section 2) to `target` and returns the patched
 * document: object members of the patch merge recursively, a `null` member removes that member,
 * anything else (numbers, strings, arrays) replaces the target's value wholesale.
 *
 * Neither argument is modified: objects on the patched paths are copied, and the result shares
 * every unchanged member with `target` (so the same base can be patched again and again).
 * @param target - the document to patch (a model object, usually)
 * @param patch - the merge patch; a non-object patch replaces the whole target
 * @returns the patched document
 */
export function applyMergePatch(target: unknown, patch: unknown): unknown {
  if (!isPlainObject(patch)) return patch;
  const out: Record<string, unknown> = isPlainObject(target) ? { ...target } : {};
  for (const key of Object.keys(patch)) {
    const value = patch[key];
    if (value === null) delete out[key];
    else if (value !== undefined) out[key] = applyMergePatch(out[key], value);
  }
  return out;
}

/** Marks "no difference" inside {@link createMergePatch}; NOT_PATCHABLE marks "cannot be expressed". */
const SAME = Symbol('same');
const NOT_PATCHABLE = Symbol('not patchable');

/**
 * The JSON Merge Patch (RFC 7396) that turns `base` into `variant`, for sending a variant as its
 * difference from a base model the receiver already holds: `applyMergePatch(base, patch)` then
 * has the same JSON as `variant`. Arrays that differ are sent whole (RFC 7396 replaces arrays).
 * @param base - the base document (plain JSON data)
 * @param variant - the variant document (plain JSON data)
 * @returns the patch (`{}` when the two are equal), or `undefined` when no merge patch can express
 *   the difference: `variant` is not a plain object (a JSON text, say), has a `null` member
 *   (which a merge patch reads as "remove"), or holds values JSON does not have (a Date, a typed
 *   array, a class instance); send the variant whole then
 */
export function createMergePatch(base: unknown, variant: unknown): unknown {
  if (!isPlainObject(base) || !isPlainObject(variant)) return undefined;
  const d = diffObject(base, variant);
  if (d === NOT_PATCHABLE) return undefined;
  return d === SAME ? {} : d;
}

function diffObject(a: Record<string, unknown>, b: Record<string, unknown>): Record<string, unknown> | typeof SAME | typeof NOT_PATCHABLE {
  let patch: Record<string, unknown> | undefined;
  for (const key of Object.keys(b)) {
    const bv = b[key];
    if (bv === undefined) continue; // JSON has no undefined: the member is absent
    if (bv === null) return NOT_PATCHABLE;
    const av = a[key];
    let d: unknown;
    if (isPlainObject(bv)) {
      if (isPlainObject(av)) d = diffObject(av, bv);
      // Merged into {} by the receiver: fine unless it holds null members (they would vanish).
      else d = hasNullMember(bv) ? NOT_PATCHABLE : bv;
    } else if (typeof bv === 'object' && !Array.isArray(bv)) {
      return NOT_PATCHABLE; // Date, Map, typed array, class instance: not JSON
    } else {
      d = av !== undefined && jsonEqual(av, bv) ? SAME : bv;
    }
    if (d === NOT_PATCHABLE) return NOT_PATCHABLE;
    if (d !== SAME) (patch ??= {})[key] = d;
  }
  for (const key of Object.keys(a)) {
    if (a[key] !== undefined && b[key] === undefined) (patch ??= {})[key] = null;
  }
  return patch ?? SAME;
}

/** Whether an object (outside arrays, where RFC 7396 keeps nulls) has a null member at any depth. */
function hasNullMember(o: Record<string, unknown>): boolean {
  for (const key of Object.keys(o)) {
    const v = o[key];
    if (v === null) return true;
    if (isPlainObject(v) && hasNullMember(v)) return true;
  }
  return false;
}

/** Equality of JSON values: primitives by Object.is, arrays element by element, plain objects member by member (undefined members count as absent). */
function jsonEqual(a: unknown, b: unknown): boolean {
  if (Object.is(a, b)) return true;
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!jsonEqual(a[i], b[i])) return false;
    return true;
  }
  if (isPlainObject(a) && isPlainObject(b)) {
    let na = 0;
    for (const key of Object.keys(a)) {
      if (a[key] === undefined) continue;
      na++;
      if (!jsonEqual(a[key], b[key])) return false;
    }
    let nb = 0;
    for (const key of Object.keys(b)) if (b[key] !== undefined) nb++;
    return na === nb;
  }
  return false;
}

/** Whether `solve` will analyse the pattern: the sparse methods always, the dense ones to verify. */
function needsSymbolic(n: number, o: VariantOptions): boolean {
  const method = o.method ?? 'auto';
  const dense = method === 'dense' || method === 'cholesky' || method === 'jacobi' || (method === 'auto' && n <= DENSE_CROSSOVER);
  return !dense || o.verify !== false;
}
