/**
 * Closed-form and characteristic-equation results the reference cases are built on. Every
 * transcendental root is solved here (roots.ts), never copied from a table.
 *
 * Sources:
 * - Euler–Bernoulli beams: EI w'''' = ρA ω² w with the boundary conditions of each end; the
 *   frequency equations below follow from the general solution
 *   w = a cos βξ + b sin βξ + c cosh βξ + d sinh βξ (Timoshenko, Young & Weaver, Vibration
 *   Problems in Engineering, 4th ed. (1974), ch. 5, from memory). ω = β² √(EI/(ρA L⁴)).
 * - Axial rods and torsional shafts: the wave equation with c = √(E/ρ) or √(GJ/(ρ Ip))
 *   (Timoshenko, Young & Weaver 1974, ch. 5, from memory).
 * - Timoshenko beam, simply supported: the two-equation theory (Timoshenko 1921/1922) with
 *   w = W sin kx, ψ = Ψ cos kx, k = nπ/L, gives a quadratic in ω² (Han, Benaroya & Wei,
 *   "Dynamics of transversely vibrating beams using four engineering theories", J. Sound
 *   Vib. 225 (1999) 935–988 (from memory)); derived again in the comment of
 *   `timoshenkoSimplySupported`.
 * - Euler buckling: EI w'''' + P w'' = 0 with the end conditions (Timoshenko & Gere, Theory of
 *   Elastic Stability, 2nd ed. (1961), ch. 2, from memory).
 */
import { ArgumentError } from '../errors';
import { findRoots } from './roots';

/** End conditions of a single-span Euler–Bernoulli beam (first end, second end). */
export type BeamSupports = 'clamped-free' | 'pinned-pinned' | 'clamped-clamped' | 'clamped-pinned' | 'free-free';

/** Checks a count argument. */
export function checkCount(count: number): void {
  if (!Number.isInteger(count) || count < 0) throw new ArgumentError(`count is ${count}; give a whole number ≥ 0`, 'count');
}

/**
 * The first `count` positive roots β of the frequency equation of a uniform beam (the elastic
 * modes; the two rigid-body modes of a free-free beam are not included).
 * - clamped-free: 1 + cos β cosh β = 0, written cos β + 1/cosh β = 0 (no overflow);
 * - pinned-pinned: sin β = 0, β = nπ;
 * - clamped-clamped and free-free: 1 − cos β cosh β = 0, written cos β − 1/cosh β = 0;
 * - clamped-pinned: tan β = tanh β, written sin β − cos β tanh β = 0 (no poles).
 */
export function beamRoots(supports: BeamSupports, count: number): number[] {
  checkCount(count);
  switch (supports) {
    case 'clamped-free':
      return findRoots((x) => Math.cos(x) + 1 / Math.cosh(x), 1, count);
    case 'pinned-pinned':
      return Array.from({ length: count }, (_, k) => (k + 1) * Math.PI);
    case 'clamped-clamped':
    case 'free-free':
      return findRoots((x) => Math.cos(x) - 1 / Math.cosh(x), 1, count);
    case 'clamped-pinned':
      return findRoots((x) => Math.sin(x) - Math.cos(x) * Math.tanh(x), 1, count);
    default:
      throw new ArgumentError(`supports "${String(supports)}" are unknown; use clamped-free, pinned-pinned, clamped-clamped, clamped-pinned or free-free`, 'supports');
  }
}

/**
 * Roots β of a cantilever carrying a point mass at its free end (no rotary inertia):
 * 1 + cos β cosh β + μ β (cos β sinh β − sin β cosh β) = 0, μ = tip mass / beam mass,
 * derived from the clamped end and, at the tip, EI w'' = 0 and EI w''' = −m_tip ω² w
 * (divided by cosh β here to avoid overflow).
 * @param massRatio - μ = m_tip / (ρ A L), ≥ 0
 */
export function tipMassRoots(massRatio: number, count: number): number[] {
  checkCount(count);
  if (!(massRatio >= 0) || !Number.isFinite(massRatio)) throw new ArgumentError(`mass ratio is ${massRatio}; give a finite number ≥ 0`, 'massRatio');
  const mu = massRatio;
  return findRoots((x) => 1 / Math.cosh(x) + Math.cos(x) + mu * x * (Math.cos(x) * Math.tanh(x) - Math.sin(x)), 0.05, count, { step: 0.005 });
}

/**
 * Frequency in Hz of an Euler–Bernoulli beam mode with root β:
 * f = β² / (2π L²) · √(EI / (ρA)).
 * @param E - Pa; @param I - m⁴; @param density - kg/m³; @param A - m²; @param L - m
 */
export function beamFrequency(beta: number, E: number, I: number, density: number, A: number, L: number): number {
  return ((beta * beta) / (2 * Math.PI * L * L)) * Math.sqrt((E * I) / (density * A));
}

/**
 * Frequencies (Hz) of a uniform rod or shaft, f_n = a_n c / (2π L), a_n = (2n − 1)π/2 for
 * fixed-free and a_n = nπ (after a 0 for the rigid mode) for free-free.
 * @param c - wave speed, m/s: √(E/ρ) axially, √(GJ/(ρ Ip)) in torsion
 */
export function rodFrequencies(ends: 'fixed-free' | 'free-free', c: number, L: number, count: number): number[] {
  checkCount(count);
  const out: number[] = [];
  for (let n = 1; n <= count; n++) {
    out.push(ends === 'fixed-free' ? ((2 * n - 1) * c) / (4 * L) : ((n - 1) * c) / (2 * L));
  }
  return out;
}

/** Inputs of the simply supported Timoshenko beam, SI units. */
export interface TimoshenkoBeam {
  /** Young's modulus, Pa. */ readonly E: number;
  /** Shear modulus, Pa. */ readonly G: number;
  /** Density, kg/m³. */ readonly density: number;
  /** Area, m². */ readonly A: number;
  /** Second moment of area, m⁴. */ readonly I: number;
  /** Shear correction factor κ. */ readonly kappa: number;
  /** Span, m. */ readonly L: number;
}

/**
 * The lowest `count` natural frequencies (Hz) of a simply supported Timoshenko beam, both
 * spectra merged and sorted. With ρA ẅ = κGA (w'' − ψ') and ρI ψ̈ = EI ψ'' + κGA (w' − ψ),
 * w = W sin kx, ψ = Ψ cos kx, k = nπ/L, the 2 × 2 determinant gives
 *   ρA ρI ω⁴ − (κGA ρI k² + ρA EI k² + ρA κGA) ω² + κGA EI k⁴ = 0,
 * whose lower root is the bending mode n and upper root the shear ("second spectrum") mode n.
 * n = 0 adds the pure-shear mode w = 0, ψ = const, ω² = κGA / (ρI).
 */
export function timoshenkoSimplySupported(beam: TimoshenkoBeam, count: number): number[] {
  checkCount(count);
  const { E, G, density, A, I, kappa, L } = beam;
  const s = kappa * G * A;
  const mA = density * A;
  const mI = density * I;
  const values: number[] = [Math.sqrt(s / mI) / (2 * Math.PI)];
  for (let n = 1; n <= count; n++) {
    const k = (n * Math.PI) / L;
    const a = mA * mI;
    const b = s * mI * k * k + mA * E * I * k * k + mA * s;
    const c = s * E * I * k ** 4;
    const disc = Math.sqrt(b * b - 4 * a * c);
    // Stable pair of roots: the smaller from c / (larger) (no cancellation).
    const upper = (b + disc) / (2 * a);
    const lower = c / (a * upper);
    values.push(Math.sqrt(lower) / (2 * Math.PI), Math.sqrt(upper) / (2 * Math.PI));
  }
  // Every bending root n ≤ count is present; any value missing from the list is above them.
  return values.sort((x, y) => x - y).slice(0, count);
}

/** End conditions of an axially loaded column (first end at the base, second at the load). */
export type ColumnSupports = 'fixed-free' | 'pinned-pinned' | 'fixed-pinned' | 'fixed-fixed';

/**
 * The first `count` buckling loads of a uniform Euler column as factors of P_E = π²EI/L²
 * (the pinned-pinned load), i.e. (kL/π)² for the roots kL of the buckling equation:
 * - fixed-free: cos kL = 0, factors (2n − 1)²/4;
 * - pinned-pinned: sin kL = 0, factors n²;
 * - fixed-pinned: tan kL = kL, written sin x − x cos x = 0 (first root ≈ 4.4934, K ≈ 0.699);
 * - fixed-fixed: 2(1 − cos x) − x sin x = 2 sin(x/2) (2 sin(x/2) − x cos(x/2)) = 0, so
 *   x = 2nπ (symmetric modes) and x = 2y with tan y = y (antisymmetric modes), merged.
 */
export function bucklingFactors(supports: ColumnSupports, count: number): number[] {
  checkCount(count);
  const tanRoots = (m: number) => findRoots((x) => Math.sin(x) - x * Math.cos(x), 1, m);
  let roots: number[];
  switch (supports) {
    case 'fixed-free':
      roots = Array.from({ length: count }, (_, k) => ((2 * k + 1) * Math.PI) / 2);
      break;
    case 'pinned-pinned':
      roots = Array.from({ length: count }, (_, k) => (k + 1) * Math.PI);
      break;
    case 'fixed-pinned':
      roots = tanRoots(count);
      break;
    case 'fixed-fixed': {
      const sym = Array.from({ length: count }, (_, k) => 2 * (k + 1) * Math.PI);
      const anti = tanRoots(count).map((y) => 2 * y);
      roots = [...sym, ...anti].sort((x, y) => x - y).slice(0, count);
      break;
    }
    default:
      throw new ArgumentError(`supports "${String(supports)}" are unknown; use fixed-free, pinned-pinned, fixed-pinned or fixed-fixed`, 'supports');
  }
  return roots.map((x) => (x / Math.PI) ** 2);
}

/** Merges ascending lists and returns the lowest `count` values. */
export function lowest(lists: readonly (readonly number[])[], count: number): number[] {
  return lists.flat().sort((a, b) => a - b).slice(0, count);
}
