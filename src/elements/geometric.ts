/**
 * Geometric (stress) stiffness of members carrying an axial force N (N, tension positive), for
 * linear buckling (K + μ·K_G(N)) φ = 0 and for stress-stiffened vibration.
 *
 * Bending: K_G = N ∫₀ᴸ (dN_v/dx)ᵀ (dN_v/dx) dx over the transverse interpolation N_v of the
 * element (Przemieniecki 1968, ch. 15, from memory). With the Euler-Bernoulli Hermite cubics
 * (Φ = 0) this is N/(30L) · [36 3L −36 3L; 3L 4L² −3L −L²; −36 −3L 36 −3L; 3L −L² −3L 4L²];
 * with Φ > 0 it uses the interdependent Timoshenko interpolation (Friedman & Kosmatka 1993),
 * integrated here by 3-point Gauss-Legendre quadrature, exact for these quartic integrands.
 * A string-like transverse term N/L·(I − ccᵀ) serves bars; the space frame adds the torsional
 * (Wagner) term N·Iₚ/(A·L)·[1 −1; −1 1] on θx (McGuire, Gallagher & Ziemian, Matrix Structural
 * Analysis, 2nd ed., geometric stiffness of a 3D member; from memory). The axial DOFs get no
 * geometric term.
 *
 * Units: N in N, lengths in m; entries in N/m, N, N·m (per radian).
 */
import { ArgumentError } from '../errors';
import { memberAxes } from './spaceFrame';
import { timoshenkoShearParameter } from './timoshenko';
import { memberLength, positive, transformSymmetric3 } from './transform';
import type { PlaneFrameProps, SpaceFrameProps } from './types';

// 3-point Gauss-Legendre on [0, 1] (Abramowitz & Stegun, Table 25.4).
const GX = [0.5 - 0.5 * Math.sqrt(3 / 5), 0.5, 0.5 + 0.5 * Math.sqrt(3 / 5)];
const GW = [5 / 18, 8 / 18, 5 / 18];
const b4 = new Float64Array(16);
const local = new Float64Array(144);
const rot = new Float64Array(9);
const AXES = new Float64Array(9);
const dn = new Float64Array(4);

function finite(N: number): number {
  if (!Number.isFinite(N)) throw new ArgumentError(`axial force is ${N}; it must be a finite number (N, tension positive)`, 'N');
  return N;
}

/**
 * Consistent geometric stiffness of a beam in one plane, 4 × 4 row-major over (v1, θ1, v2, θ2).
 * @param N - axial force, N, tension positive
 * @param L - length, m
 * @param phi - Timoshenko shear parameter Φ = 12EI/(κGAL²) @defaultValue 0 (Euler-Bernoulli)
 */
export function beamGeometricStiffness(N: number, L: number, phi = 0, out?: Float64Array): Float64Array {
  finite(N);
  positive(L, 'L');
  if (!(phi >= 0) || !Number.isFinite(phi)) positive(phi, 'phi');
  const o = out ?? new Float64Array(16);
  o.fill(0, 0, 16);
  const mu = 1 / (1 + phi);
  for (let g = 0; g < 3; g++) {
    const x = GX[g];
    // dN_v/dx of the interdependent interpolation (ξ = x/L).
    const d = dn;
    d[0] = (mu * (6 * x * x - 6 * x - phi)) / L;
    d[1] = mu * (3 * x * x - (4 + phi) * x + 1 + phi / 2);
    d[2] = -d[0];
    d[3] = mu * (3 * x * x - (2 - phi) * x - phi / 2);
    const w = GW[g] * L * N;
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) o[i * 4 + j] += w * d[i] * d[j];
  }
  return o;
}

/**
 * Plane bar geometric stiffness N/L · [G −G; −G G], G = I − ccᵀ (transverse only),
 * 4 × 4 over (ux1, uy1, ux2, uy2). @param dx - x₂ − x₁, m; @param dy - y₂ − y₁, m
 */
export function barGeometricStiffnessPlane(N: number, dx: number, dy: number, out?: Float64Array): Float64Array {
  return barGeometric(N, [dx, dy], 2, out);
}

/** Space bar geometric stiffness, 6 × 6 over (ux1, uy1, uz1, ux2, uy2, uz2); as the plane form. */
export function barGeometricStiffnessSpace(N: number, dx: number, dy: number, dz: number, out?: Float64Array): Float64Array {
  return barGeometric(N, [dx, dy, dz], 3, out);
}

function barGeometric(N: number, v: number[], d: number, out?: Float64Array): Float64Array {
  finite(N);
  const L = memberLength(v[0], v[1], d === 3 ? v[2] : 0);
  const n = 2 * d;
  const o = out ?? new Float64Array(n * n);
  const s = N / L;
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      const g = s * ((i === j ? 1 : 0) - (v[i] / L) * (v[j] / L));
      o[i * n + j] = g;
      o[(i + d) * n + j + d] = g;
      o[i * n + j + d] = -g;
      o[(i + d) * n + j] = -g;
    }
  }
  return o;
}

function phiOf(theory: string, E: number, I: number, G: number | undefined, A: number, kappa: number | undefined, L: number): number {
  if (theory === 'euler-bernoulli') return 0;
  if (theory !== 'timoshenko') throw new ArgumentError(`theory "${theory}" is unknown; use "euler-bernoulli" or "timoshenko"`, 'theory');
  return timoshenkoShearParameter(E, I, G ?? NaN, A, kappa ?? NaN, L);
}

/**
 * Plane frame geometric stiffness in global axes, 6 × 6 over (ux1, uy1, rz1, ux2, uy2, rz2):
 * the beam term on (v, θ) of the member's theory, rotated as planeFrameStiffness.
 */
export function planeFrameGeometricStiffness(p: PlaneFrameProps, N: number, dx: number, dy: number, out?: Float64Array): Float64Array {
  const L = memberLength(dx, dy, 0);
  beamGeometricStiffness(N, L, phiOf(p.theory, p.E, p.I, p.G, p.A, p.kappa, L), b4);
  local.fill(0, 0, 36);
  const idx = [1, 2, 4, 5];
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) local[idx[i] * 6 + idx[j]] = b4[i * 4 + j];
  const c = dx / L, s = dy / L;
  rot[0] = c; rot[1] = s; rot[2] = 0; rot[3] = -s; rot[4] = c; rot[5] = 0; rot[6] = 0; rot[7] = 0; rot[8] = 1;
  return transformSymmetric3(local, rot, 2, out);
}

/**
 * Space frame geometric stiffness in global axes, 12 × 12 over (ux1 … rz2): beam terms in both
 * bending planes (θy = −dw/dx), the torsional term N·Iₚ/(A·L), rotated by memberAxes.
 */
export function spaceFrameGeometricStiffness(p: SpaceFrameProps, N: number, dx: number, dy: number, dz: number, orientation?: ArrayLike<number>, out?: Float64Array): Float64Array {
  const L = memberLength(dx, dy, dz);
  const r = memberAxes(dx, dy, dz, orientation, AXES);
  local.fill(0, 0, 144);
  const put = (idx: number[], sign: number[]) => {
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) local[idx[i] * 12 + idx[j]] = sign[i] * sign[j] * b4[i * 4 + j];
  };
  beamGeometricStiffness(N, L, phiOf(p.theory, p.E, p.Iz, p.G, p.A, p.kappa, L), b4);
  put([1, 5, 7, 11], [1, 1, 1, 1]);
  beamGeometricStiffness(N, L, phiOf(p.theory, p.E, p.Iy, p.G, p.A, p.kappa, L), b4);
  put([2, 4, 8, 10], [1, -1, 1, -1]);
  const t = (N * (p.Ip ?? p.Iy + p.Iz)) / (positive(p.A, 'A') * L);
  local[3 * 12 + 3] = t; local[9 * 12 + 9] = t; local[3 * 12 + 9] = -t; local[9 * 12 + 3] = -t;
  return transformSymmetric3(local, r, 4, out);
}
