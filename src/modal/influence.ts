/**
 * Influence vectors r: the displacement of every free DOF when the whole structure moves as a
 * rigid body by a unit amount in one global direction (Chopra, Dynamics of Structures, §13.1:
 * the influence vector of ground motion; extended here to rotations).
 *
 * Translations ux, uy, uz: 1 on the DOFs of that direction, 0 elsewhere. Rotations about an
 * axis through the reference point p, small-rotation kinematics u = θ × (x − p):
 *   rx: uy = −(z − p_z), uz = (y − p_y), rx = 1
 *   ry: ux = (z − p_z),  uz = −(x − p_x), ry = 1
 *   rz: ux = −(y − p_y), uy = (x − p_x), rz = 1
 * Plane models (x–y) have ux, uy and rz only. Supported DOFs are not in the system, so r holds
 * the free DOFs only.
 */
import { ArgumentError } from '../errors';
import { symmetricMultiply } from '../linalg/sparse/symmetric';
import type { AssembledModel, DofName } from '../model/types';
import { dot } from './modes';

/** Point in m, (x, y, z); z = 0 in plane models. */
export type Point3 = readonly [number, number, number];

/** Directions of a plane model, in report order. */
export const PLANE_DIRECTIONS: readonly DofName[] = ['ux', 'uy', 'rz'];
/** Directions of a space model, in report order. */
export const SPACE_DIRECTIONS: readonly DofName[] = ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'];

/** The directions that exist in a model's space. */
export function directionsOf(assembled: AssembledModel): readonly DofName[] {
  return assembled.model.space === 'plane' ? PLANE_DIRECTIONS : SPACE_DIRECTIONS;
}

function checkPoint(p: Point3, path: string): void {
  if (p.length !== 3 || !p.every((v) => Number.isFinite(v))) {
    throw new ArgumentError(`reference point [${p.join(', ')}] is not three finite coordinates in m; pass [x, y, z]`, path);
  }
}

/**
 * Influence vector of one direction.
 * @param assembled - the assembled model (free DOFs and node coordinates)
 * @param direction - `ux` `uy` `uz` (translation, m per m) or `rx` `ry` `rz` (rotation about
 *   an axis through `point`, m per rad on translations, 1 on rotations)
 * @param point - reference point of rotations, m @defaultValue [0, 0, 0]
 * @returns length n (free DOFs)
 * @throws ArgumentError (path `direction`) for a direction that the model's space lacks;
 *   (path `referencePoint`) for a point that is not three finite numbers
 */
export function influenceVector(assembled: AssembledModel, direction: DofName, point: Point3 = [0, 0, 0]): Float64Array {
  if (!directionsOf(assembled).includes(direction)) {
    throw new ArgumentError(`direction "${direction}" does not exist in a ${assembled.model.space} model; use one of ${directionsOf(assembled).join(', ')}`, 'direction');
  }
  checkPoint(point, 'referencePoint');
  const { dofs, coordinates } = assembled;
  const n = dofs.length;
  const r = new Float64Array(n);
  const [px, py, pz] = point;
  for (let i = 0; i < n; i++) {
    const d = dofs[i];
    const k = 3 * d.nodeIndex;
    const dx = coordinates[k] - px;
    const dy = coordinates[k + 1] - py;
    const dz = coordinates[k + 2] - pz;
    let v = 0;
    switch (direction) {
      case 'ux':
      case 'uy':
      case 'uz':
        v = d.dof === direction ? 1 : 0;
        break;
      case 'rx':
        v = d.dof === 'uy' ? -dz : d.dof === 'uz' ? dy : d.dof === 'rx' ? 1 : 0;
        break;
      case 'ry':
        v = d.dof === 'ux' ? dz : d.dof === 'uz' ? -dx : d.dof === 'ry' ? 1 : 0;
        break;
      case 'rz':
        v = d.dof === 'ux' ? -dy : d.dof === 'uy' ? dx : d.dof === 'rz' ? 1 : 0;
        break;
    }
    r[i] = v;
  }
  return r;
}

/**
 * Centre of mass of what the free DOFs carry, m.
 *
 * The first moments come from the mass matrix itself, so consistent and lumped masses are both
 * exact: for a rigid rotation about z through the origin and a unit translation along y,
 * r_uyᵀ M r_rz = ∫ x dm, since the element shape functions reproduce rigid-body motion. Each
 * coordinate is the mass-weighted mean of the estimates from the two translations that see it
 * (x from uy and uz, y from ux and uz, z from ux and uy); they coincide unless supports remove
 * different mass from different directions. In the plane, z = 0.
 *
 * A coordinate that no mass locates (e.g. x of a shear building whose only free DOFs are ux)
 * is returned as 0. It then changes no mass-weighted result: it enters the rotation influence
 * vectors only on DOFs whose rows of M are zero (M is positive semidefinite).
 *
 * @param assembled - the assembled model
 * @returns [x, y, z] in m
 */
export function centreOfMass(assembled: AssembledModel): [number, number, number] {
  const M = assembled.mass;
  const n = M.n;
  const space = assembled.model.space === 'space';
  const origin: Point3 = [0, 0, 0];
  const trans: Partial<Record<DofName, { m: number; Mr: Float64Array }>> = {};
  for (const t of space ? (['ux', 'uy', 'uz'] as const) : (['ux', 'uy'] as const)) {
    const r = influenceVector(assembled, t);
    const Mr = new Float64Array(n);
    symmetricMultiply(M, r, Mr);
    trans[t] = { m: dot(r, 0, Mr, 0, n), Mr };
  }
  const rot: Partial<Record<DofName, Float64Array>> = {};
  for (const d of space ? (['rx', 'ry', 'rz'] as const) : (['rz'] as const)) rot[d] = influenceVector(assembled, d, origin);
  // First moment ∫ c dm estimated from the pair (translation t, rotation q) with sign s.
  const moment = (t: DofName, q: DofName, s: number): [number, number] => {
    const tr = trans[t];
    const rq = rot[q];
    if (!tr || !rq) return [0, 0];
    return [s * dot(tr.Mr, 0, rq, 0, n), tr.m];
  };
  const coordinate = (a: [number, number], b: [number, number]): number => {
    const w = a[1] + b[1];
    return w > 0 ? (a[0] + b[0]) / w : 0;
  };
  const x = coordinate(moment('uy', 'rz', 1), moment('uz', 'ry', -1));
  const y = coordinate(moment('ux', 'rz', -1), moment('uz', 'rx', 1));
  const z = space ? coordinate(moment('ux', 'ry', 1), moment('uy', 'rx', -1)) : 0;
  return [x, y, z];
}

/** Options of {@link influenceVectors}. */
export interface InfluenceOptions {
  /** Point the rotations are taken about, m. @defaultValue the centre of mass ({@link centreOfMass}) */
  referencePoint?: Point3;
  /** Directions wanted. @defaultValue all of the model's space (ux uy rz; or all six) */
  directions?: readonly DofName[];
}

/** Influence vectors of several directions about one reference point. */
export interface InfluenceVectors {
  /** Directions, in the order asked for. */
  readonly directions: readonly DofName[];
  /** One vector of length n per direction. */
  readonly vectors: Readonly<Partial<Record<DofName, Float64Array>>>;
  /** Point the rotations are taken about, m. */
  readonly referencePoint: Point3;
}

/**
 * Influence vectors of the model's directions.
 * @throws ArgumentError as {@link influenceVector} does
 */
export function influenceVectors(assembled: AssembledModel, options: InfluenceOptions = {}): InfluenceVectors {
  const directions = options.directions ?? directionsOf(assembled);
  const referencePoint: Point3 = options.referencePoint ?? centreOfMass(assembled);
  checkPoint(referencePoint, 'referencePoint');
  const vectors: Partial<Record<DofName, Float64Array>> = {};
  for (const d of directions) vectors[d] = influenceVector(assembled, d, referencePoint);
  return { directions, vectors, referencePoint };
}
