/**
 * Degree-of-freedom numbering. A node's DOF set is the union of the DOFs its elements, springs
 * and masses use; supports then remove DOFs from it. So a node touched only by bars has
 * translations only (no rotations to be mechanisms), a plane truss node has ux, uy, and a
 * node of a beam has all of its space's DOFs.
 *
 * What each item uses:
 * - bar: ux, uy (plane) or ux, uy, uz (space) at both nodes;
 * - beam, timoshenko: ux, uy, rz (plane) or all six (space) at both nodes;
 * - spring: its `dof` at `node` (and at `to`);
 * - point mass: the translations of its space (so a mass on an otherwise unconnected node shows
 *   up as a mechanism rather than vanishing); its rotary inertia acts only on rotations the node
 *   already has — a pin-jointed node's rotation is coupled to nothing, so it is left out.
 *
 * Free DOFs are numbered in node order, then in the order ux, uy, uz, rx, ry, rz.
 */
import type { AssembledModel, DofInfo, DofName, Model } from './types';

/** DOF names in numbering order; the slot of a name is its index here. */
export const DOF_NAMES: readonly DofName[] = ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'];
/** Slot of each DOF name (index into DOF_NAMES and into a node's 6 entries of dofMap). */
export const DOF_SLOT: Readonly<Record<DofName, number>> = { ux: 0, uy: 1, uz: 2, rx: 3, ry: 4, rz: 5 };
/** DOF names allowed in each space. */
export const SPACE_DOFS: Readonly<Record<'plane' | 'space', readonly DofName[]>> = {
  plane: ['ux', 'uy', 'rz'],
  space: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'],
};

/**
 * Free DOF index of a node's DOF in an assembled model: a lookup built once over `asm.dofs`
 * (so it serves hand-built assembled models without a dofMap too).
 * @returns a function giving the index, or undefined when that DOF is not free
 */
export function freeDofLookup(asm: AssembledModel): (node: string, dof: DofName) => number | undefined {
  const byName = new Map<string, number>();
  asm.dofs.forEach((d, i) => byName.set(`${d.node}\u0000${d.dof}`, i));
  return (node, dof) => byName.get(`${node}\u0000${dof}`);
}

/** Why a node's DOF is not free: the node is unknown, the DOF is supported, or nothing uses it. */
export function notFreeReason(model: Model, node: string, dof: DofName): 'unknown node' | 'supported' | 'unused' {
  if (!model.nodes.some((nd) => nd.id === node)) return 'unknown node';
  return (model.supports ?? []).some((s) => s.node === node && s.fixed.includes(dof)) ? 'supported' : 'unused';
}

const BAR_PLANE = 0b000011;
const BAR_SPACE = 0b000111;
const FRAME_PLANE = 0b100011;
const FRAME_SPACE = 0b111111;

/** Outcome of numberDofs. */
export interface DofNumbering {
  /** dofMap[6·node + slot] = free DOF index, or −1 when the node lacks that DOF or it is fixed. */
  readonly dofMap: Int32Array;
  /** dofs[i] describes free DOF i. */
  readonly dofs: DofInfo[];
  /** Bit mask per node of the DOFs it has before supports (bit = slot). */
  readonly used: Uint8Array;
  /** Node id → index in model.nodes. */
  readonly nodeIndex: Map<string, number>;
}

/** Bit mask of the DOFs an element of this kind uses at each node, in this space. */
export function elementDofMask(kind: string, space: 'plane' | 'space'): number {
  if (kind === 'bar') return space === 'plane' ? BAR_PLANE : BAR_SPACE;
  return space === 'plane' ? FRAME_PLANE : FRAME_SPACE;
}

/**
 * Numbers the free DOFs of a validated model (node references must resolve).
 * @returns the map from (node, DOF) to free index, and the free DOF list
 */
export function numberDofs(model: Model): DofNumbering {
  const nNodes = model.nodes.length;
  const nodeIndex = new Map<string, number>();
  for (let i = 0; i < nNodes; i++) nodeIndex.set(model.nodes[i].id, i);
  const used = new Uint8Array(nNodes);
  for (const e of model.elements) {
    const m = elementDofMask(e.kind, model.space);
    used[nodeIndex.get(e.nodes[0])!] |= m;
    used[nodeIndex.get(e.nodes[1])!] |= m;
  }
  for (const s of model.springs ?? []) {
    const bit = 1 << DOF_SLOT[s.dof];
    used[nodeIndex.get(s.node)!] |= bit;
    if (s.to !== undefined) used[nodeIndex.get(s.to)!] |= bit;
  }
  const translations = model.space === 'plane' ? BAR_PLANE : BAR_SPACE;
  for (const m of model.masses ?? []) used[nodeIndex.get(m.node)!] |= translations;
  const fixed = new Uint8Array(nNodes);
  for (const s of model.supports ?? []) {
    const i = nodeIndex.get(s.node)!;
    for (const d of s.fixed) fixed[i] |= 1 << DOF_SLOT[d];
  }
  const dofMap = new Int32Array(6 * nNodes).fill(-1);
  const dofs: DofInfo[] = [];
  for (let i = 0; i < nNodes; i++) {
    const free = used[i] & ~fixed[i];
    if (free === 0) continue;
    const id = model.nodes[i].id;
    for (let s = 0; s < 6; s++) {
      if (free & (1 << s)) {
        dofMap[6 * i + s] = dofs.length;
        dofs.push({ node: id, nodeIndex: i, dof: DOF_NAMES[s] });
      }
    }
  }
  return { dofMap, dofs, used, nodeIndex };
}
