/**
 * Steady-state response to a harmonic load by modal superposition (Chopra, Dynamics of
 * Structures, §3.2 for one mode, §12.4–12.5 for the uncoupled modal equations, classical
 * damping; section numbers from memory).
 *
 * Load f(t) = F cos Ωt with a real amplitude vector F. Each mass-normalised mode answers with
 * the complex receptance
 *   Hⱼ(Ω) = 1 / (ωⱼ² − Ω² + 2i ζⱼ ωⱼ Ω),
 * and the displacement is u(t) = Re(U e^{iΩt}), U = Σⱼ φⱼ (φⱼᵀ F) Hⱼ(Ω). Velocity and
 * acceleration amplitudes are Ω|U| and Ω²|U|, with phases arg U + π/2 and arg U + π.
 * The phase reported is arg U in (−π, π]: minus the phase lag of Chopra §3.2 (0 well below a
 * resonance, −π/2 at it, towards −π above).
 *
 * With all n modes this is the exact solution of (K − Ω²M + iΩC) U = F for C = M Φ diag(2ζⱼωⱼ)
 * Φᵀ M, and for Rayleigh damping C = αM + βK (test/response-harmonic.test.ts checks it
 * against a dense solve).
 */
import { ArgumentError } from '../errors';
import type { ModalAnalysis } from './analysis-types';
import { dampingRatios, type Damping } from './damping';
import { nodalLoadVector, type NodalLoad } from '../model/loads';
import { modalLoads, resolveDofs, responseModes, type DofRef } from './harmonic-dofs';

/** Options of {@link harmonicResponse}. */
export interface HarmonicOptions {
  /** Load amplitude F: a vector of length n (N, N·m), or nodal loads `{ node, dof, value }`. Required. */
  load: Float64Array | readonly NodalLoad[];
  /** DOFs whose response is wanted. Required, at least one. */
  at: readonly DofRef[];
  /** Excitation frequencies Ω/2π, Hz, each ≥ 0 ({@link frequencySweep} makes a sweep). Required. */
  frequencies: ArrayLike<number>;
  /**
   * Modal damping. @defaultValue `{ kind: 'constant', ratio: 0.01 }` (1 %; welded steel
   * footbridges are often assumed lower, so give the value of the governing guidance)
   */
  damping?: Damping;
  /** Modes superposed, the first ones. @defaultValue all modes of the analysis */
  count?: number;
}

/** Defaults of {@link HarmonicOptions}. */
export const HARMONIC_DEFAULTS = { damping: { kind: 'constant', ratio: 0.01 } as Damping } as const;

/** Response of one DOF over the frequencies; every array has one entry per frequency. */
export interface DofHarmonicResponse {
  /** Free DOF index. */
  readonly dof: number;
  readonly node: string;
  readonly name: string;
  /** Re U and Im U, m (rad on rotations). */
  readonly real: Float64Array;
  readonly imag: Float64Array;
  /** |U|, m (rad). */
  readonly displacement: Float64Array;
  /** Ω|U|, m/s (rad/s). */
  readonly velocity: Float64Array;
  /** Ω²|U|, m/s² (rad/s²). */
  readonly acceleration: Float64Array;
  /** arg U, rad, in (−π, π]; velocity leads by π/2, acceleration by π. */
  readonly phase: Float64Array;
}

/** Result of {@link harmonicResponse}. */
export interface HarmonicResult {
  /** Hz, as given. */
  readonly frequencies: Float64Array;
  readonly responses: readonly DofHarmonicResponse[];
  /** Damping ratio of each mode used. */
  readonly dampingRatios: Float64Array;
  /** Modes superposed. */
  readonly modesUsed: number;
}

/** Options of {@link frequencySweep}. */
export interface SweepOptions {
  /** `linear` or `log` spacing. @defaultValue 'linear' */
  spacing?: 'linear' | 'log';
  /** Frequencies to add (e.g. the natural frequencies in the range, so no peak is missed), Hz. */
  include?: ArrayLike<number>;
}

/**
 * Frequencies from `from` to `to` Hz, `steps` points, sorted, with `include` values inside the
 * range merged in (duplicates removed).
 * @throws ArgumentError (path `from`, `to`, `steps`) for a bad range or count
 */
export function frequencySweep(from: number, to: number, steps: number, options: SweepOptions = {}): Float64Array {
  const spacing = options.spacing ?? 'linear';
  if (!(from >= 0) || !Number.isFinite(from)) throw new ArgumentError(`${from} Hz is not a frequency ≥ 0`, 'from');
  if (!(to > from) || !Number.isFinite(to)) throw new ArgumentError(`${to} Hz is not above from = ${from} Hz; give the upper end of the sweep`, 'to');
  if (!Number.isInteger(steps) || steps < 2 || steps > 1e6) throw new ArgumentError(`${steps} is not a whole number of points from 2 to 1000000`, 'steps');
  if (spacing === 'log' && !(from > 0)) throw new ArgumentError('a logarithmic sweep needs from > 0 Hz', 'from');
  const out: number[] = [];
  for (let k = 0; k < steps; k++) {
    const t = k / (steps - 1);
    out.push(spacing === 'log' ? from * (to / from) ** t : from + (to - from) * t);
  }
  for (const f of Array.from(options.include ?? [])) if (f >= from && f <= to) out.push(f);
  out.sort((a, b) => a - b);
  return Float64Array.from(out.filter((f, k) => k === 0 || f - out[k - 1] > 1e-12 * Math.max(1, f)));
}

/**
 * Steady harmonic response at chosen DOFs over a set of excitation frequencies.
 * @param analysis - modal analysis (mass-normalised modes, λ > 0)
 * @param options - see {@link HarmonicOptions}; defaults in {@link HARMONIC_DEFAULTS}
 * @throws ArgumentError (path `load`, `load[k]`, `at[k]`, `frequencies[k]`, `count`,
 *   `damping.*`, `modes[j]`) naming the bad input
 */
export function harmonicResponse(analysis: ModalAnalysis, options: HarmonicOptions): HarmonicResult {
  const o = { ...HARMONIC_DEFAULTS, ...options };
  const assembled = analysis.assembled;
  if (!o.at || o.at.length === 0) throw new ArgumentError('no response DOF given; name at least one { node, dof }', 'at');
  if (!o.load) throw new ArgumentError('no load given; give a load vector or nodal loads { node, dof, value }', 'load');
  if (!o.frequencies || o.frequencies.length === 0) throw new ArgumentError('no excitation frequency given; give frequencies in Hz or a sweep', 'frequencies');
  const freqs = Float64Array.from(o.frequencies);
  freqs.forEach((f, k) => {
    if (!(f >= 0) || !Number.isFinite(f)) throw new ArgumentError(`${f} Hz is not a frequency ≥ 0`, `frequencies[${k}]`);
  });
  const modes = responseModes(analysis, o.count);
  const zeta = dampingRatios(o.damping, modes.angular);
  const F = o.load instanceof Float64Array ? o.load : nodalLoadVector(assembled, o.load, 'load');
  const g = modalLoads(modes, F, 'load');
  const idx = resolveDofs(assembled, o.at, 'at');
  const { n, m, angular, vectors } = modes;
  const nf = freqs.length;
  const responses: DofHarmonicResponse[] = [];
  // Receptances of every mode at every frequency, then one pass per DOF.
  const hRe = new Float64Array(m * nf);
  const hIm = new Float64Array(m * nf);
  for (let j = 0; j < m; j++) {
    const w = angular[j];
    for (let k = 0; k < nf; k++) {
      const W = 2 * Math.PI * freqs[k];
      const a = w * w - W * W;
      const b = 2 * zeta[j] * w * W;
      const d = a * a + b * b;
      if (d === 0) {
        throw new ArgumentError(`${freqs[k]} Hz is exactly the frequency of undamped mode ${j + 1}: the steady response is unbounded; add damping or move the frequency`, `frequencies[${k}]`);
      }
      hRe[j * nf + k] = a / d;
      hIm[j * nf + k] = -b / d;
    }
  }
  for (const i of idx) {
    const re = new Float64Array(nf);
    const im = new Float64Array(nf);
    for (let j = 0; j < m; j++) {
      const c = vectors[j * n + i] * g[j];
      if (c === 0) continue;
      for (let k = 0; k < nf; k++) {
        re[k] += c * hRe[j * nf + k];
        im[k] += c * hIm[j * nf + k];
      }
    }
    const displacement = new Float64Array(nf);
    const velocity = new Float64Array(nf);
    const acceleration = new Float64Array(nf);
    const phase = new Float64Array(nf);
    for (let k = 0; k < nf; k++) {
      const W = 2 * Math.PI * freqs[k];
      displacement[k] = Math.hypot(re[k], im[k]);
      velocity[k] = W * displacement[k];
      acceleration[k] = W * W * displacement[k];
      phase[k] = Math.atan2(im[k], re[k]);
    }
    const d = assembled.dofs[i];
    responses.push({ dof: i, node: d.node, name: d.dof, real: re, imag: im, displacement, velocity, acceleration, phase });
  }
  return { frequencies: freqs, responses, dampingRatios: zeta, modesUsed: m };
}
