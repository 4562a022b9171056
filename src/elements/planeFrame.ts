/**
 * Plane frame element: axial bar + beam bending in the x–y plane, 6 × 6 row-major over
 * (ux1, uy1, rz1, ux2, uy2, rz2). Local axes: x along the member from node 1 to node 2, y at
 * +90° (counterclockwise); global form k = Tᵀ k_local T with T = blockdiag(R, R),
 * R = [c s 0; −s c 0; 0 0 1] (Przemieniecki 1968, ch. 6).
 *
 * Bending follows `props.theory`: Euler-Bernoulli (beam.ts) or Timoshenko (timoshenko.ts).
 * Lumped mass: ρAL/2 on ux and uy of each node (the member mass is isotropic), zero on rz for
 * Euler-Bernoulli, ρIL/2 on rz for Timoshenko.
 *
 * Units: as PlaneFrameProps (Pa, m², m⁴, kg/m³); dx, dy in m; stiffness N/m, N, N·m/rad;
 * mass kg, kg·m, kg·m².
 */
import { ArgumentError } from '../errors';
import { barConsistentMassLocal } from './bar';
import { beamConsistentMass, fillBeamStiffness } from './beam';
import { fillTimoshenkoMass, timoshenkoShearParameter } from './timoshenko';
import { memberLength, positive, transformSymmetric3, nonNegative } from './transform';
import type { PlaneFrameProps } from './types';

const AXIAL = [0, 3];
const BEND = [1, 2, 4, 5];
const b4 = new Float64Array(16);
const a4 = new Float64Array(4);
const local = new Float64Array(36);
const rot = new Float64Array(9);

function shearParameter(p: PlaneFrameProps, L: number): number {
  if (p.theory === 'euler-bernoulli') return 0;
  if (p.theory !== 'timoshenko') throw new ArgumentError(`theory "${String(p.theory)}" is unknown; use "euler-bernoulli" or "timoshenko"`, 'theory');
  return timoshenkoShearParameter(p.E, p.I, p.G ?? NaN, p.A, p.kappa ?? NaN, L);
}

function scatter(o: Float64Array, n: number, src: Float64Array, idx: number[]): void {
  const m = idx.length;
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) o[idx[i] * n + idx[j]] += src[i * m + j];
}

/** Local stiffness, 6 × 6 row-major over (u1, v1, θ1, u2, v2, θ2). */
export function planeFrameStiffnessLocal(p: PlaneFrameProps, L: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(36);
  o.fill(0, 0, 36);
  const ea = (positive(p.E, 'E') * positive(p.A, 'A')) / positive(L, 'L');
  o[0] = ea; o[3] = -ea; o[18] = -ea; o[21] = ea;
  scatter(o, 6, fillBeamStiffness(p.E * positive(p.I, 'I'), L, shearParameter(p, L), b4), BEND);
  return o;
}

/** Local consistent mass, 6 × 6 row-major (axial ρAL/6·[2 1; 1 2] + bending). */
export function planeFrameConsistentMassLocal(p: PlaneFrameProps, L: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(36);
  o.fill(0, 0, 36);
  scatter(o, 6, barConsistentMassLocal(p.density, p.A, L, a4), AXIAL);
  const phi = shearParameter(p, L);
  if (p.theory === 'timoshenko') scatter(o, 6, fillTimoshenkoMass(p.density * p.A, p.density * p.I, L, phi, b4), BEND);
  else scatter(o, 6, beamConsistentMass(p.density, p.A, L, b4), BEND);
  return o;
}

/** Lumped mass, 6 × 6 diagonal (the same in local and global axes). */
export function planeFrameLumpedMass(p: PlaneFrameProps, L: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(36);
  o.fill(0, 0, 36);
  const m = (nonNegative(p.density, 'density') * positive(p.A, 'A') * positive(L, 'L')) / 2;
  const r = p.theory === 'timoshenko' ? (p.density * positive(p.I, 'I') * L) / 2 : 0;
  o[0] = m; o[7] = m; o[14] = r; o[21] = m; o[28] = m; o[35] = r;
  return o;
}

function rotation(dx: number, dy: number, L: number): Float64Array {
  const c = dx / L;
  const s = dy / L;
  rot[0] = c; rot[1] = s; rot[2] = 0;
  rot[3] = -s; rot[4] = c; rot[5] = 0;
  rot[6] = 0; rot[7] = 0; rot[8] = 1;
  return rot;
}

/**
 * Global stiffness, 6 × 6 row-major over (ux1, uy1, rz1, ux2, uy2, rz2).
 * @param dx - x₂ − x₁, m; @param dy - y₂ − y₁, m. Throws ArgumentError on zero length or bad props.
 */
export function planeFrameStiffness(p: PlaneFrameProps, dx: number, dy: number, out?: Float64Array): Float64Array {
  const L = memberLength(dx, dy, 0);
  planeFrameStiffnessLocal(p, L, local);
  return transformSymmetric3(local, rotation(dx, dy, L), 2, out);
}

/** Global consistent mass, 6 × 6 row-major over (ux1, uy1, rz1, ux2, uy2, rz2). */
export function planeFrameConsistentMass(p: PlaneFrameProps, dx: number, dy: number, out?: Float64Array): Float64Array {
  const L = memberLength(dx, dy, 0);
  planeFrameConsistentMassLocal(p, L, local);
  return transformSymmetric3(local, rotation(dx, dy, L), 2, out);
}
