/**
 * Nodal loads: the one way a load is named everywhere in eigenframe (buckling reference load
 * cases, harmonic and transient responses), and their load vector over the free DOFs.
 */
import { ArgumentError } from '../errors';
import { freeDofLookup, notFreeReason, SPACE_DOFS } from './dofs';
import type { AssembledModel, DofName } from './types';

/** A concentrated force or moment at one DOF of one node. */
export interface NodalLoad {
  /** Node id. */
  readonly node: string;
  /** DOF the load acts along (a force on ux, uy, uz; a moment on rx, ry, rz). */
  readonly dof: DofName;
  /** N on translations, N·m on rotations; sign along the global axis. */
  readonly value: number;
}

/** Nodal loads applied together. */
export type LoadCase = readonly NodalLoad[];

/**
 * Load vector over the free DOFs of an assembled model.
 * @param asm - the assembled model
 * @param loads - nodal loads (N, N·m), at least one; loads on the same DOF add up
 * @param path - option name used in errors, e.g. `loads`; items are `${path}[i]`
 * @returns length n (free DOFs), N and N·m
 * @throws ArgumentError (path `${path}`, `${path}[i].node`, `${path}[i].dof`, `${path}[i].value`)
 *   for an empty list, an unknown node, a DOF the space lacks, a DOF that is supported or that the
 *   node does not have, or a non-finite value
 */
export function nodalLoadVector(asm: AssembledModel, loads: LoadCase, path = 'loads'): Float64Array {
  const model = asm.model;
  if (!Array.isArray(loads) || loads.length === 0) {
    throw new ArgumentError('no load given; give at least one nodal load { node, dof, value }', path);
  }
  const freeDof = freeDofLookup(asm);
  const nodes = new Set(model.nodes.map((nd) => nd.id));
  const allowed = SPACE_DOFS[model.space];
  const f = new Float64Array(asm.dofs.length);
  loads.forEach((l, i) => {
    const where = `${path}[${i}]`;
    if (l === null || typeof l !== 'object') throw new ArgumentError(`${String(l)} is not a nodal load; write { node, dof, value }`, where);
    if (!nodes.has(l.node)) throw new ArgumentError(`node "${l.node}" is not in the model; use the id of one of its ${model.nodes.length} nodes`, `${where}.node`);
    if (!allowed.includes(l.dof)) throw new ArgumentError(`DOF "${l.dof}" does not exist in a ${model.space} model; use one of ${allowed.join(', ')}`, `${where}.dof`);
    if (typeof l.value !== 'number' || !Number.isFinite(l.value)) throw new ArgumentError(`value is ${String(l.value)}; give a finite load in N (N·m on rotations)`, `${where}.value`);
    const g = freeDof(l.node, l.dof);
    if (g === undefined) {
      throw new ArgumentError(
        notFreeReason(model, l.node, l.dof) === 'supported'
          ? `DOF ${l.dof} of node "${l.node}" is supported, so a load there goes straight into the support; load a free DOF`
          : `node "${l.node}" has no ${l.dof} DOF (no element, spring or mass there uses it); load a DOF the node has`,
        `${where}.dof`,
      );
    }
    f[g] += l.value;
  });
  return f;
}
