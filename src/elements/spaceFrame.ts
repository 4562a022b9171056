/**
 * Space frame element: axial, St Venant torsion, and bending in two planes; 12 × 12 row-major
 * over (ux1, uy1, uz1, rx1, ry1, rz1, ux2, …, rz2). Local DOFs per node: u, v, w, θx, θy, θz.
 * Bending in the local x–y plane (v, θz) uses Iz; in the local x–z plane (w, θy) uses Iy with
 * θy = −dw/dx. Global form k = Tᵀ k_local T, T = blockdiag(R, R, R, R), R's rows the local axes
 * in global components (Przemieniecki 1968, ch. 5–6; McGuire, Gallagher & Ziemian,
 * Matrix Structural Analysis, 2nd ed.; section numbers not quoted, from memory).
 *
 * Local axes rule (memberAxes):
 * - local x runs from node 1 to node 2;
 * - with an `orientation` vector v (any vector in the local x–y plane, not parallel to x):
 *   z = normalise(x × v), y = z × x;
 * - without one, for a member that is not vertical: y = normalise(Z × x), i.e. local y is
 *   horizontal (in the global X–Y plane), and z = x × y points upward (z·Z > 0). For a member
 *   along +X that gives y = +Y, z = +Z;
 * - without one, for a vertical member (horizontal projection ≤ 1e-6 · L): y = global +Y,
 *   z = x × y (so z = −X when the member points up, +X when it points down).
 *
 * Mass: axial ρAL/6·[2 1; 1 2] on u; torsion ρIₚL/6·[2 1; 1 2] on θx (Iₚ = Iy + Iz unless
 * given); bending as beam.ts (Euler-Bernoulli, translational inertia only) or timoshenko.ts
 * (with rotary inertia). Lumped: ρAL/2 on each translation, ρIₚL/2 about the member axis
 * (torsional inertia, kept so torsional modes exist), zero on the bending rotations for
 * Euler-Bernoulli and ρIyL/2, ρIzL/2 for Timoshenko. In global axes the lumped torsional
 * inertia of a skew member is a 3 × 3 block per node (ρIₚL/2 · x xᵀ), not a diagonal.
 *
 * Units: as SpaceFrameProps (Pa, m², m⁴, kg/m³); coordinates m; stiffness N/m, N, N·m/rad;
 * mass kg, kg·m, kg·m².
 */
import { ArgumentError } from '../errors';
import { barConsistentMassLocal, barStiffnessLocal } from './bar';
import { beamConsistentMass, fillBeamStiffness } from './beam';
import { fillTimoshenkoMass, timoshenkoShearParameter } from './timoshenko';
import { memberLength, positive, transformSymmetric3, nonNegative } from './transform';
import type { SpaceFrameProps } from './types';

/** A member whose horizontal projection is at most this fraction of its length is vertical. */
export const VERTICAL_TOLERANCE = 1e-6;
/** An orientation vector within this sine of the member axis is parallel to it (an error). */
export const PARALLEL_TOLERANCE = 1e-6;

const AXIAL = [0, 6];
const TORSION = [3, 9];
const BEND_XY = [1, 5, 7, 11];
const BEND_XZ = [2, 4, 8, 10];
const SIGN_XZ = [1, -1, 1, -1];
const PLUS = [1, 1, 1, 1];
const b4 = new Float64Array(16);
const a4 = new Float64Array(4);
const local = new Float64Array(144);
const axes = new Float64Array(9);

function scatter(o: Float64Array, src: Float64Array, idx: number[], sign: number[]): void {
  const m = idx.length;
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) o[idx[i] * 12 + idx[j]] += sign[i] * sign[j] * src[i * m + j];
}

function phis(p: SpaceFrameProps, L: number, out: number[]): void {
  if (p.theory === 'euler-bernoulli') {
    out[0] = 0;
    out[1] = 0;
  } else if (p.theory === 'timoshenko') {
    out[0] = timoshenkoShearParameter(p.E, p.Iz, p.G, p.A, p.kappa ?? NaN, L); // x–y plane
    out[1] = timoshenkoShearParameter(p.E, p.Iy, p.G, p.A, p.kappa ?? NaN, L); // x–z plane
  } else throw new ArgumentError(`theory "${String(p.theory)}" is unknown; use "euler-bernoulli" or "timoshenko"`, 'theory');
}
const ph = [0, 0];

function polar(p: SpaceFrameProps): number {
  return p.Ip === undefined ? p.Iy + p.Iz : positive(p.Ip, 'Ip');
}

/**
 * Local axes of a member as a 3 × 3 row-major rotation R (rows: local x, y, z in global
 * components), by the rule in this file's header.
 * @param dx - x₂ − x₁, m (likewise dy, dz)
 * @param orientation - optional vector in the local x–y plane (any length > 0)
 * @throws ArgumentError on zero length, or an orientation parallel to the member
 */
export function memberAxes(dx: number, dy: number, dz: number, orientation?: ArrayLike<number>, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(9);
  const L = memberLength(dx, dy, dz);
  const x0 = dx / L, x1 = dy / L, x2 = dz / L;
  let z0: number, z1: number, z2: number;
  if (orientation !== undefined) {
    const v0 = orientation[0], v1 = orientation[1], v2 = orientation[2];
    const vn = Math.sqrt(v0 * v0 + v1 * v1 + v2 * v2);
    z0 = x1 * v2 - x2 * v1;
    z1 = x2 * v0 - x0 * v2;
    z2 = x0 * v1 - x1 * v0;
    const zn = Math.sqrt(z0 * z0 + z1 * z1 + z2 * z2);
    if (!(vn > 0) || !(zn > PARALLEL_TOLERANCE * vn)) {
      throw new ArgumentError(`orientation (${v0}, ${v1}, ${v2}) is zero or parallel to the member axis (${x0}, ${x1}, ${x2}); give a vector that lies in the local x–y plane but not along the member`, 'orientation');
    }
    z0 /= zn; z1 /= zn; z2 /= zn;
  } else {
    const h = Math.sqrt(x0 * x0 + x1 * x1);
    let y0: number, y1: number, y2: number;
    if (h > VERTICAL_TOLERANCE) {
      y0 = -x1 / h; y1 = x0 / h; y2 = 0; // y = Z × x, normalised
    } else {
      y0 = 0; y1 = 1; y2 = 0; // vertical member: y = global Y
    }
    z0 = x1 * y2 - x2 * y1;
    z1 = x2 * y0 - x0 * y2;
    z2 = x0 * y1 - x1 * y0;
    const zn = Math.sqrt(z0 * z0 + z1 * z1 + z2 * z2);
    z0 /= zn; z1 /= zn; z2 /= zn;
  }
  // y = z × x
  o[0] = x0; o[1] = x1; o[2] = x2;
  o[3] = z1 * x2 - z2 * x1; o[4] = z2 * x0 - z0 * x2; o[5] = z0 * x1 - z1 * x0;
  o[6] = z0; o[7] = z1; o[8] = z2;
  return o;
}

/** Local stiffness, 12 × 12 row-major over (u1, v1, w1, θx1, θy1, θz1, u2, …, θz2). */
export function spaceFrameStiffnessLocal(p: SpaceFrameProps, L: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(144);
  o.fill(0, 0, 144);
  positive(L, 'L');
  phis(p, L, ph);
  scatter(o, barStiffnessLocal(p.E, p.A, L, a4), AXIAL, PLUS);
  const gj = (positive(p.G, 'G') * positive(p.J, 'J')) / L;
  a4[0] = gj; a4[1] = -gj; a4[2] = -gj; a4[3] = gj;
  scatter(o, a4, TORSION, PLUS);
  scatter(o, fillBeamStiffness(p.E * positive(p.Iz, 'Iz'), L, ph[0], b4), BEND_XY, PLUS);
  scatter(o, fillBeamStiffness(p.E * positive(p.Iy, 'Iy'), L, ph[1], b4), BEND_XZ, SIGN_XZ);
  return o;
}

/** Local consistent mass, 12 × 12 row-major (see the header for the parts). */
export function spaceFrameConsistentMassLocal(p: SpaceFrameProps, L: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(144);
  o.fill(0, 0, 144);
  positive(L, 'L');
  phis(p, L, ph);
  scatter(o, barConsistentMassLocal(p.density, p.A, L, a4), AXIAL, PLUS);
  const t = (p.density * polar(p) * L) / 6;
  a4[0] = 2 * t; a4[1] = t; a4[2] = t; a4[3] = 2 * t;
  scatter(o, a4, TORSION, PLUS);
  if (p.theory === 'timoshenko') {
    const mu = p.density * p.A;
    scatter(o, fillTimoshenkoMass(mu, p.density * positive(p.Iz, 'Iz'), L, ph[0], b4), BEND_XY, PLUS);
    scatter(o, fillTimoshenkoMass(mu, p.density * positive(p.Iy, 'Iy'), L, ph[1], b4), BEND_XZ, SIGN_XZ);
  } else {
    beamConsistentMass(p.density, p.A, L, b4);
    scatter(o, b4, BEND_XY, PLUS);
    scatter(o, b4, BEND_XZ, SIGN_XZ);
  }
  return o;
}

/** Local lumped mass, 12 × 12 diagonal row-major (see the header). */
export function spaceFrameLumpedMassLocal(p: SpaceFrameProps, L: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(144);
  o.fill(0, 0, 144);
  const m = (nonNegative(p.density, 'density') * positive(p.A, 'A') * positive(L, 'L')) / 2;
  const tor = (p.density * polar(p) * L) / 2;
  const ry = p.theory === 'timoshenko' ? (p.density * p.Iy * L) / 2 : 0;
  const rz = p.theory === 'timoshenko' ? (p.density * p.Iz * L) / 2 : 0;
  for (let node = 0; node < 2; node++) {
    const b = node * 6;
    o[(b + 0) * 13] = m; o[(b + 1) * 13] = m; o[(b + 2) * 13] = m;
    o[(b + 3) * 13] = tor; o[(b + 4) * 13] = ry; o[(b + 5) * 13] = rz;
  }
  return o;
}

/**
 * Global stiffness, 12 × 12 row-major over (ux1, uy1, uz1, rx1, ry1, rz1, ux2, …, rz2).
 * @param dx - x₂ − x₁, m (likewise dy, dz); @param orientation - see memberAxes
 */
export function spaceFrameStiffness(p: SpaceFrameProps, dx: number, dy: number, dz: number, orientation?: ArrayLike<number>, out?: Float64Array): Float64Array {
  const r = memberAxes(dx, dy, dz, orientation, axes);
  spaceFrameStiffnessLocal(p, memberLength(dx, dy, dz), local);
  return transformSymmetric3(local, r, 4, out);
}

/** Global consistent mass, 12 × 12 row-major; arguments as spaceFrameStiffness. */
export function spaceFrameConsistentMass(p: SpaceFrameProps, dx: number, dy: number, dz: number, orientation?: ArrayLike<number>, out?: Float64Array): Float64Array {
  const r = memberAxes(dx, dy, dz, orientation, axes);
  spaceFrameConsistentMassLocal(p, memberLength(dx, dy, dz), local);
  return transformSymmetric3(local, r, 4, out);
}

/** Global lumped mass, 12 × 12 row-major (block diagonal per node); arguments as spaceFrameStiffness. */
export function spaceFrameLumpedMass(p: SpaceFrameProps, dx: number, dy: number, dz: number, orientation?: ArrayLike<number>, out?: Float64Array): Float64Array {
  const r = memberAxes(dx, dy, dz, orientation, axes);
  spaceFrameLumpedMassLocal(p, memberLength(dx, dy, dz), local);
  return transformSymmetric3(local, r, 4, out);
}
