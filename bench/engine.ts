/**
 * The library calls the benchmark times: assembly of K and M, and the eigen solve (sparse path,
 * or our dense solver), plus the reading of the per-phase numbers the solver reports.
 */
import { solve } from '../src/eigen/solve';
import type { EigenResult } from '../src/eigen/types';
import type { SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { assemble } from '../src/model/assemble';
import { validateModel } from '../src/model/read';
import type { AssembledModel, Model } from '../src/model/types';

/** `sparse`: the default `solve` path; `dense`: our dense solver; `mlmatrix`: the ml-matrix route. */
export type EngineName = 'sparse' | 'dense' | 'mlmatrix';

/** K and M of a model over its free DOFs, after the validation every model file goes through. */
export function assembleModel(model: Model): AssembledModel {
  return assemble(validateModel(model));
}

/** Lowest `count` modes with one of our engines. */
export function solveModes(K: SymmetricCsc, M: SymmetricCsc, count: number, engine: 'sparse' | 'dense'): EigenResult {
  // K and M come from assembly, as in modalAnalysis: M is semidefinite by construction, so the
  // cheap mass checks suffice there too (massCheck: 'minors'), the route a model takes.
  return engine === 'dense' ? solve(K, M, { count, method: 'dense', massCheck: 'minors' }) : solve(K, M, { count, massCheck: 'minors' });
}

/** First of `keys` that the stats hold (solve reports analyseMs, factorizeMs, iterationMs, verifyMs, nnzL). */
function pick(stats: Readonly<Record<string, number>>, keys: readonly string[]): number {
  for (const k of keys) if (typeof stats[k] === 'number') return stats[k];
  return Number.NaN;
}

/** Per-phase seconds and nnz(L) from a result's stats (NaN where the solver does not report it). */
export function phaseSeconds(stats: Readonly<Record<string, number>>): { analyse: number; factorization: number; iterations: number; verify: number; nnzL: number } {
  return {
    analyse: pick(stats, ['analyseMs']) / 1000,
    factorization: pick(stats, ['factorizeMs']) / 1000,
    iterations: pick(stats, ['iterationMs']) / 1000,
    verify: pick(stats, ['verifyMs']) / 1000,
    nnzL: pick(stats, ['nnzL']),
  };
}
