/**
 * Inputs shared by the responses by modal superposition (harmonic, spectrum, transient): naming
 * DOFs by node and DOF name, and taking the modes used. Loads are nodal loads (model/loads).
 */
import { ArgumentError } from '../errors';
import { freeDofLookup, notFreeReason } from '../model/dofs';
import type { AssembledModel, DofName } from '../model/types';
import type { ModalAnalysis } from './analysis-types';

/** A free DOF: its index in the assembled system, or its node id and DOF name. */
export type DofRef = number | { readonly node: string; readonly dof: DofName };

/**
 * Free DOF index of each reference.
 * @param path - option name for errors, e.g. `at`; items are `at[k]`
 * @throws ArgumentError (path `at[k]`) for an index outside 0..n−1, an unknown node, or a DOF
 *   the node does not have or that is supported
 */
export function resolveDofs(assembled: AssembledModel, refs: readonly DofRef[], path: string): Int32Array {
  const n = assembled.dofs.length;
  const out = new Int32Array(refs.length);
  let freeDof: ReturnType<typeof freeDofLookup> | undefined;
  refs.forEach((ref, k) => {
    const p = `${path}[${k}]`;
    if (typeof ref === 'number') {
      if (!Number.isInteger(ref) || ref < 0 || ref >= n) throw new ArgumentError(`DOF index ${ref} is not in 0..${n - 1}; give a free DOF index or { node, dof }`, p);
      out[k] = ref;
      return;
    }
    freeDof ??= freeDofLookup(assembled);
    const i = freeDof(ref.node, ref.dof);
    if (i === undefined) {
      throw new ArgumentError(
        notFreeReason(assembled.model, ref.node, ref.dof) !== 'unknown node'
          ? `node "${ref.node}" has no free ${ref.dof} DOF (it is supported, or no element uses it); choose a DOF that moves`
          : `node "${ref.node}" is not in the model; check the node id`,
        p,
      );
    }
    out[k] = i;
  });
  return out;
}

/** The modes a response uses: the first m of an analysis. */
export interface ResponseModes {
  /** DOFs n. */
  readonly n: number;
  /** Modes used m. */
  readonly m: number;
  /** ωⱼ, rad/s, length m. */
  readonly angular: Float64Array;
  /** Mass-normalised shapes, column-major n × m (a view, not a copy). */
  readonly vectors: Float64Array;
}

/**
 * The first `count` modes of an analysis, checked for use in a dynamic response.
 * @throws ArgumentError (path `count`) unless count is an integer in 1..m; (path `modes[j]`)
 *   for a mode with λ ≤ 0 (rigid-body or unstable: support the structure)
 */
export function responseModes(analysis: ModalAnalysis, count?: number): ResponseModes {
  const total = analysis.modes.length;
  const m = count ?? total;
  if (!Number.isInteger(m) || m < 1 || m > total) {
    throw new ArgumentError(`count ${m} is not an integer from 1 to the ${total} modes of the analysis; ask the analysis for more modes or lower the count`, 'count');
  }
  const n = analysis.eigen.n;
  const angular = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const lambda = analysis.eigen.eigenvalues[j];
    if (!(lambda > 0)) {
      throw new ArgumentError(`eigenvalue ${lambda} rad²/s² is not positive: a rigid-body or unstable mode has no resonance; support the structure`, `modes[${j}]`);
    }
    angular[j] = Math.sqrt(lambda);
  }
  return { n, m, angular, vectors: analysis.eigen.vectors.subarray(0, n * m) };
}

/** Γ = Φᵀ f for the modes used: modal loads, length m (N·kg^-½). */
export function modalLoads(modes: ResponseModes, f: Float64Array, path = 'load'): Float64Array {
  const { n, m, vectors } = modes;
  if (f.length !== n || !f.every((v) => Number.isFinite(v))) {
    throw new ArgumentError(`load vector must hold ${n} finite numbers (one per free DOF), got length ${f.length}`, path);
  }
  const g = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    let s = 0;
    const o = j * n;
    for (let i = 0; i < n; i++) s += vectors[o + i] * f[i];
    g[j] = s;
  }
  return g;
}
