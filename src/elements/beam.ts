/**
 * Euler-Bernoulli beam element, bending in one plane: 4 × 4 row-major over (v1, θ1, v2, θ2),
 * v the transverse displacement (m), θ = dv/dx the rotation (rad, counterclockwise when v is
 * along local y). Cubic Hermite interpolation; matrices as in Przemieniecki, Theory of Matrix
 * Structural Analysis (1968), ch. 5 (stiffness) and ch. 11 (consistent mass); chapter numbers from memory.
 *
 * Units: E in Pa, I in m⁴, A in m², density ρ in kg/m³, L in m. Stiffness in N/m, N, N·m/rad;
 * mass in kg, kg·m, kg·m².
 */
import { positive, nonNegative } from './transform';

/** Bending stiffness EI/L³ · [12 6L −12 6L; 6L 4L² −6L 2L²; …], 4 × 4 row-major. */
export function beamStiffness(E: number, I: number, L: number, out?: Float64Array): Float64Array {
  return fillBeamStiffness(positive(E, 'E') * positive(I, 'I'), positive(L, 'L'), 0, out ?? new Float64Array(16));
}

/**
 * Consistent mass ρAL/420 · [156 22L 54 −13L; 22L 4L² 13L −3L²; 54 13L 156 −22L;
 * −13L −3L² −22L 4L²], translational inertia only (no rotary inertia), 4 × 4 row-major, kg.
 */
export function beamConsistentMass(density: number, A: number, L: number, out?: Float64Array): Float64Array {
  const m = (nonNegative(density, 'density') * positive(A, 'A') * positive(L, 'L')) / 420;
  const o = out ?? new Float64Array(16);
  const a = 22 * L * m;
  const b = 13 * L * m;
  const c = 4 * L * L * m;
  const d = -3 * L * L * m;
  o[0] = 156 * m; o[1] = a; o[2] = 54 * m; o[3] = -b;
  o[4] = a; o[5] = c; o[6] = b; o[7] = d;
  o[8] = 54 * m; o[9] = b; o[10] = 156 * m; o[11] = -a;
  o[12] = -b; o[13] = d; o[14] = -a; o[15] = c;
  return o;
}

/**
 * Lumped mass: half the member mass ρAL/2 on each translation, zero on both rotations
 * (diag(ρAL/2, 0, ρAL/2, 0)), 4 × 4 row-major, kg. The zero rotational entries make M
 * singular; their eigenvalues are infinite and the solvers do not return them.
 */
export function beamLumpedMass(density: number, A: number, L: number, out?: Float64Array): Float64Array {
  const m = (nonNegative(density, 'density') * positive(A, 'A') * positive(L, 'L')) / 2;
  const o = out ?? new Float64Array(16);
  o.fill(0, 0, 16);
  o[0] = m;
  o[10] = m;
  return o;
}

/**
 * Shared by the Euler-Bernoulli (Φ = 0) and Timoshenko beams: EI/((1+Φ)L³) ·
 * [12 6L −12 6L; 6L (4+Φ)L² −6L (2−Φ)L²; −12 −6L 12 −6L; 6L (2−Φ)L² −6L (4+Φ)L²]
 * (Przemieniecki 1968, ch. 5). Writes 16 entries of out.
 */
export function fillBeamStiffness(EI: number, L: number, phi: number, out: Float64Array): Float64Array {
  const c = EI / ((1 + phi) * L * L * L);
  const a = 12 * c;
  const b = 6 * L * c;
  const d = (4 + phi) * L * L * c;
  const e = (2 - phi) * L * L * c;
  out[0] = a; out[1] = b; out[2] = -a; out[3] = b;
  out[4] = b; out[5] = d; out[6] = -b; out[7] = e;
  out[8] = -a; out[9] = -b; out[10] = a; out[11] = -b;
  out[12] = b; out[13] = e; out[14] = -b; out[15] = d;
  return out;
}
