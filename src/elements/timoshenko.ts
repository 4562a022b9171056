/**
 * Timoshenko beam element (shear deformation and rotary inertia), bending in one plane:
 * 4 × 4 row-major over (v1, θ1, v2, θ2), θ the rotation of the cross-section (rad).
 *
 * Interdependent interpolation (cubic v, quadratic θ, exact for the static homogeneous
 * equations), giving the matrices of Przemieniecki, Theory of Matrix Structural Analysis (1968),
 * ch. 5 and ch. 11 (from memory), re-derived from shape functions by Friedman & Kosmatka, "An improved two-node
 * Timoshenko beam finite element", Computers & Structures 47 (1993) 473–481. The shear
 * parameter is Φ = 12EI / (κGAL²); Φ = 0 gives the Euler-Bernoulli matrices (plus rotary
 * inertia in the mass).
 *
 * Units: E, G in Pa; I in m⁴; A in m²; density ρ in kg/m³; L in m; κ dimensionless.
 */
import { fillBeamStiffness } from './beam';
import { positive, nonNegative } from './transform';

/** Shear parameter Φ = 12EI / (κGAL²), dimensionless, ≥ 0. */
export function timoshenkoShearParameter(E: number, I: number, G: number, A: number, kappa: number, L: number): number {
  return (12 * positive(E, 'E') * positive(I, 'I')) / (positive(kappa, 'kappa') * positive(G, 'G') * positive(A, 'A') * positive(L, 'L') ** 2);
}

/**
 * Stiffness EI/((1+Φ)L³) · [12 6L −12 6L; 6L (4+Φ)L² −6L (2−Φ)L²; …], 4 × 4 row-major
 * (N/m, N, N·m/rad).
 * @param phi - shear parameter Φ (see timoshenkoShearParameter), ≥ 0
 */
export function timoshenkoStiffness(E: number, I: number, L: number, phi: number, out?: Float64Array): Float64Array {
  if (!(phi >= 0) || !Number.isFinite(phi)) positive(phi, 'phi');
  return fillBeamStiffness(positive(E, 'E') * positive(I, 'I'), positive(L, 'L'), phi, out ?? new Float64Array(16));
}

/**
 * Consistent mass with rotary inertia, 4 × 4 row-major: translational part
 * ρAL/(1+Φ)² · M_t(Φ) plus rotary part ρI/((1+Φ)²L) · M_r(Φ) (Przemieniecki 1968, ch. 11;
 * Friedman & Kosmatka 1993). Units kg, kg·m, kg·m².
 * @param phi - shear parameter Φ, ≥ 0
 */
export function timoshenkoConsistentMass(density: number, A: number, I: number, L: number, phi: number, out?: Float64Array): Float64Array {
  nonNegative(density, 'density');
  positive(A, 'A');
  positive(L, 'L');
  if (!(I >= 0) || !Number.isFinite(I)) positive(I, 'I');
  if (!(phi >= 0) || !Number.isFinite(phi)) positive(phi, 'phi');
  return fillTimoshenkoMass(density * A, density * I, L, phi, out ?? new Float64Array(16));
}

/**
 * Lumped mass: ρAL/2 on each translation and the rotary inertia ρIL/2 on each rotation
 * (the rotary inertia is what the Timoshenko theory adds; an Euler-Bernoulli lumped beam has
 * zero there), diagonal 4 × 4 row-major.
 */
export function timoshenkoLumpedMass(density: number, A: number, I: number, L: number, out?: Float64Array): Float64Array {
  const m = (nonNegative(density, 'density') * positive(A, 'A') * positive(L, 'L')) / 2;
  if (!(I >= 0) || !Number.isFinite(I)) positive(I, 'I');
  const o = out ?? new Float64Array(16);
  o.fill(0, 0, 16);
  o[0] = m;
  o[5] = (density * I * L) / 2;
  o[10] = m;
  o[15] = (density * I * L) / 2;
  return o;
}

/**
 * Writes the Timoshenko consistent mass for mass per length μ = ρA (kg/m) and rotary inertia
 * per length r = ρI (kg·m) into out (16 entries). Shared with the frame elements.
 */
export function fillTimoshenkoMass(mu: number, r: number, L: number, phi: number, out: Float64Array): Float64Array {
  const p = phi;
  const p2 = p * p;
  const q = (1 + p) * (1 + p);
  const t = (mu * L) / q;
  const L2 = L * L;
  // Translational inertia (Przemieniecki 1968, ch. 11).
  const t11 = t * (13 / 35 + (7 * p) / 10 + p2 / 3);
  const t12 = t * (11 / 210 + (11 * p) / 120 + p2 / 24) * L;
  const t13 = t * (9 / 70 + (3 * p) / 10 + p2 / 6);
  const t14 = -t * (13 / 420 + (3 * p) / 40 + p2 / 24) * L;
  const t22 = t * (1 / 105 + p / 60 + p2 / 120) * L2;
  const t24 = -t * (1 / 140 + p / 60 + p2 / 120) * L2;
  // Rotary inertia.
  const s = r / (q * L);
  const r11 = s * (6 / 5);
  const r12 = s * (1 / 10 - p / 2) * L;
  const r22 = s * (2 / 15 + p / 6 + p2 / 3) * L2;
  const r24 = s * (-1 / 30 - p / 6 + p2 / 6) * L2;
  const m11 = t11 + r11;
  const m12 = t12 + r12;
  const m13 = t13 - r11;
  const m14 = t14 + r12;
  const m22 = t22 + r22;
  const m24 = t24 + r24;
  out[0] = m11; out[1] = m12; out[2] = m13; out[3] = m14;
  out[4] = m12; out[5] = m22; out[6] = -m14; out[7] = m24;
  out[8] = m13; out[9] = -m14; out[10] = m11; out[11] = -m12;
  out[12] = m14; out[13] = m24; out[14] = -m12; out[15] = m22;
  return out;
}
