/**
 * One member's stiffness and mass in global axes, exactly as assembly uses them: the element
 * function chosen by kind, space and mass formulation, and the node-local DOF slots of its
 * matrix rows. Shared by assembly and by the per-member quantities of the modal layer
 * (sensitivity), so that Σ φ_eᵀ k_e φ_e over the members equals φᵀKφ less the springs.
 */
import { barConsistentMassPlane, barConsistentMassSpace, barLumpedMassPlane, barLumpedMassSpace, barStiffnessPlane, barStiffnessSpace } from '../elements/bar';
import { planeFrameConsistentMass, planeFrameLumpedMass, planeFrameStiffness } from '../elements/planeFrame';
import { spaceFrameConsistentMass, spaceFrameLumpedMass, spaceFrameStiffness } from '../elements/spaceFrame';
import type { PlaneFrameProps, SpaceFrameProps } from '../elements/types';
import { ArgumentError } from '../errors';
import type { AssembledModel, ElementSpec, Model } from './types';

// Node-local slots (ux uy uz rx ry rz = 0..5) of each element's DOFs, in element-matrix order.
const SLOTS_BAR_PLANE: readonly number[] = [0, 1];
const SLOTS_BAR_SPACE: readonly number[] = [0, 1, 2];
const SLOTS_FRAME_PLANE: readonly number[] = [0, 1, 5];
const SLOTS_FRAME_SPACE: readonly number[] = [0, 1, 2, 3, 4, 5];

/** Section properties of a frame member, reused across members of one kind, material and section. */
export type FrameProps = PlaneFrameProps | SpaceFrameProps;

/**
 * Fills `ke` and `me` (row-major d × d, d = 2 × slots.length, buffers of at least 144) with the
 * global-axis stiffness (N/m; N, N·m on rotations) and mass (kg; kg·m on rotations) of element
 * `e`, whose end-2-minus-end-1 offset is (dx, dy, dz) m.
 * @param propsCache - optional cache of frame properties by kind, material and section
 * @returns the node-local DOF slots of each end (the same for both ends)
 */
export function fillElementMatrices(
  model: Model,
  e: ElementSpec,
  dx: number,
  dy: number,
  dz: number,
  ke: Float64Array,
  me: Float64Array,
  propsCache?: Map<string, FrameProps>,
): readonly number[] {
  const plane = model.space === 'plane';
  const lumped = model.mass === 'lumped';
  const mat = model.materials[e.material];
  const sec = model.sections[e.section];
  if (e.kind === 'bar') {
    if (plane) {
      barStiffnessPlane(mat.E, sec.A, dx, dy, ke);
      (lumped ? barLumpedMassPlane : barConsistentMassPlane)(mat.density, sec.A, dx, dy, me);
      return SLOTS_BAR_PLANE;
    }
    barStiffnessSpace(mat.E, sec.A, dx, dy, dz, ke);
    (lumped ? barLumpedMassSpace : barConsistentMassSpace)(mat.density, sec.A, dx, dy, dz, me);
    return SLOTS_BAR_SPACE;
  }
  const key = `${e.kind}\u0000${e.material}\u0000${e.section}`;
  let props = propsCache?.get(key);
  const theory = e.kind === 'timoshenko' ? 'timoshenko' : 'euler-bernoulli';
  if (plane) {
    if (props === undefined) {
      props = { E: mat.E, A: sec.A, I: sec.Iz!, density: mat.density, theory, G: mat.G, kappa: sec.kappa } as PlaneFrameProps;
      propsCache?.set(key, props);
    }
    planeFrameStiffness(props as PlaneFrameProps, dx, dy, ke);
    if (lumped) planeFrameLumpedMass(props as PlaneFrameProps, Math.hypot(dx, dy), me);
    else planeFrameConsistentMass(props as PlaneFrameProps, dx, dy, me);
    return SLOTS_FRAME_PLANE;
  }
  if (props === undefined) {
    props = { E: mat.E, G: mat.G!, A: sec.A, Iz: sec.Iz!, Iy: sec.Iy!, J: sec.J!, Ip: sec.Ip, density: mat.density, theory, kappa: sec.kappa } as SpaceFrameProps;
    propsCache?.set(key, props);
  }
  spaceFrameStiffness(props as SpaceFrameProps, dx, dy, dz, e.orientation, ke);
  (lumped ? spaceFrameLumpedMass : spaceFrameConsistentMass)(props as SpaceFrameProps, dx, dy, dz, e.orientation, me);
  return SLOTS_FRAME_SPACE;
}

/** Global-axis element matrices of one member and where its DOFs sit in the free-DOF system. */
export interface ElementMatrices {
  /** Element DOF count d (4 plane bar, 6 space bar or plane frame, 12 space frame). */
  readonly size: number;
  /** Free DOF index of each element DOF, or −1 when that DOF is supported; length d. */
  readonly dofs: Int32Array;
  /** k_e, d × d row-major, global axes, N/m (N, N·m on rotations). */
  readonly stiffness: Float64Array;
  /** m_e, d × d row-major, global axes, kg (kg·m on rotations). */
  readonly mass: Float64Array;
  /** Member mass ρ A L, kg. */
  readonly memberMass: number;
}

// Node id → index, cached per nodes array (checked on every use, rebuilt if the array changed).
const NODE_INDEX = new WeakMap<readonly unknown[], Map<string, number>>();

function nodeIndexOf(model: Model, id: string): number {
  let map = NODE_INDEX.get(model.nodes);
  let i = map?.get(id);
  if (i === undefined || model.nodes[i]?.id !== id) {
    map = new Map(model.nodes.map((nd, k) => [nd.id, k]));
    NODE_INDEX.set(model.nodes, map);
    i = map.get(id);
  }
  if (i === undefined) throw new ArgumentError(`node "${id}" is not in the model; validate the model first`, 'nodes');
  return i;
}

/**
 * Element stiffness and mass of element `k` in global axes, as assembled into K and M.
 * @param asm - the assembled model (its dofMap and coordinates)
 * @param k - element index in model.elements
 * @throws ArgumentError (path `element`) for an index out of range
 */
export function elementMatrices(asm: AssembledModel, k: number): ElementMatrices {
  const model = asm.model;
  const e = model.elements[k];
  if (!Number.isInteger(k) || e === undefined) throw new ArgumentError(`element index ${k} is out of range; use 0..${model.elements.length - 1}`, 'element');
  const a = nodeIndexOf(model, e.nodes[0]);
  const b = nodeIndexOf(model, e.nodes[1]);
  const xyz = asm.coordinates;
  const dx = xyz[3 * b] - xyz[3 * a], dy = xyz[3 * b + 1] - xyz[3 * a + 1], dz = xyz[3 * b + 2] - xyz[3 * a + 2];
  const ke = new Float64Array(144);
  const me = new Float64Array(144);
  const slots = fillElementMatrices(model, e, dx, dy, dz, ke, me);
  const per = slots.length;
  const d = 2 * per;
  const dofs = new Int32Array(d);
  const dofMap = asm.dofMap!;
  for (let s = 0; s < per; s++) {
    dofs[s] = dofMap[6 * a + slots[s]];
    dofs[per + s] = dofMap[6 * b + slots[s]];
  }
  const sec = model.sections[e.section];
  return { size: d, dofs, stiffness: ke.slice(0, d * d), mass: me.slice(0, d * d), memberMass: model.materials[e.material].density * sec.A * Math.hypot(dx, dy, dz) };
}
