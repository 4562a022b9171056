/**
 * The model file format `eigenframe-model/1` (see docs/model-format.md) as TypeScript types,
 * and the assembled form the solvers consume. SI units throughout: N, m, kg, s.
 */
import type { SymmetricCsc } from '../linalg/sparse/symmetric';

/** `"plane"`: x–y plane, DOFs ux uy rz per node. `"space"`: ux uy uz rx ry rz. */
export type Space = 'plane' | 'space';
/** Degree-of-freedom names. */
export type DofName = 'ux' | 'uy' | 'uz' | 'rx' | 'ry' | 'rz';
/** Element kinds. */
export type ElementKind = 'bar' | 'beam' | 'timoshenko';
/** Mass formulation. */
export type MassKind = 'consistent' | 'lumped';

export interface MaterialSpec {
  /** Young's modulus, Pa. */
  E: number;
  /** Shear modulus, Pa (needed for torsion in space and for Timoshenko elements). */
  G?: number;
  /** Density, kg/m³. */
  density: number;
}

export interface SectionSpec {
  /** Area, m². */
  A: number;
  /** Second moment about local z (bending in the local x–y plane; the plane-frame bending), m⁴. */
  Iz?: number;
  /** Second moment about local y, m⁴ (space). */
  Iy?: number;
  /** Torsion constant, m⁴ (space). */
  J?: number;
  /** Polar moment for torsional inertia, m⁴ (space; default Iy + Iz). */
  Ip?: number;
  /** Shear correction factor κ (Timoshenko). */
  kappa?: number;
}

export interface NodeSpec {
  id: string;
  x: number;
  y: number;
  z?: number;
}

export interface ElementSpec {
  id: string;
  kind: ElementKind;
  nodes: [string, string];
  material: string;
  section: string;
  /** Space only: a vector in the local x–y plane (see docs for the default rule). */
  orientation?: [number, number, number];
}

export interface SupportSpec {
  node: string;
  fixed: DofName[];
}

export interface SpringSpec {
  /** Grounded spring at this node. */
  node: string;
  /** Two-node spring: the other node (omit for grounded). */
  to?: string;
  dof: DofName;
  /** N/m, or N·m/rad on rotations. */
  stiffness: number;
}

export interface MassSpec {
  node: string;
  /** Translational mass, kg (on every translational DOF of the node). */
  mass: number;
  /** Rotary inertia, kg·m² (on every rotational DOF of the node), default 0. */
  inertia?: number;
}

/** A model as read from `eigenframe-model/1` JSON, after validation. */
export interface Model {
  format: 'eigenframe-model/1';
  title?: string;
  space: Space;
  mass?: MassKind;
  materials: Record<string, MaterialSpec>;
  sections: Record<string, SectionSpec>;
  nodes: NodeSpec[];
  elements: ElementSpec[];
  supports?: SupportSpec[];
  springs?: SpringSpec[];
  masses?: MassSpec[];
}

/** One free (unsupported) degree of freedom of the assembled system. */
export interface DofInfo {
  /** Node id. */
  readonly node: string;
  /** Index of the node in `model.nodes`. */
  readonly nodeIndex: number;
  /** DOF name. */
  readonly dof: DofName;
}

/** K and M over the free DOFs, ready for the solvers. */
export interface AssembledModel {
  readonly model: Model;
  /** Stiffness, free DOFs, N/m (N·m/rad on rotations), lower-stored symmetric. */
  readonly stiffness: SymmetricCsc;
  /** Mass, free DOFs, kg (kg·m² on rotations), lower-stored symmetric; same n as stiffness. */
  readonly mass: SymmetricCsc;
  /** dofs[i] describes free DOF i. */
  readonly dofs: readonly DofInfo[];
  /** Node coordinates, length 3·nodes (x, y, z; z = 0 in the plane), m. */
  readonly coordinates: Float64Array;
  /**
   * dofMap[6·node + slot] = free DOF index, or −1 when the node lacks that DOF or it is
   * supported; slots in the order ux, uy, uz, rx, ry, rz (length 6·nodes). Set by `assemble`.
   */
  readonly dofMap?: Int32Array;
}
