/**
 * Response spectrum analysis by modal superposition (Chopra, Dynamics of Structures, §13.7–13.8, section numbers from memory):
 * a design spectrum of pseudo-acceleration A(T), given as a table and interpolated linearly in
 * T; each mode's peak response to ground acceleration along one global direction d; and the
 * modal peaks combined by SRSS or CQC (spectrum-combination.ts).
 *
 * For mass-normalised φⱼ, Γⱼ = φⱼᵀ M r_d (participation.ts) and Aⱼ = A(Tⱼ):
 *   peak modal displacement  uⱼ = Γⱼ φⱼ Aⱼ / ωⱼ²,
 *   equivalent static forces fⱼ = M φⱼ Γⱼ Aⱼ,
 *   base shear along e       Vⱼ,e = r_eᵀ fⱼ = Γⱼ,e Γⱼ Aⱼ  (along d itself: m_eff,j Aⱼ).
 * Every combined quantity is combined from its own modal values (never from combined
 * displacements). The share of the mass in d that the modes used capture, Σⱼ m_eff,j / rᵀMr, is
 * reported: common practice (many seismic codes) asks for at least 90 %.
 */
import { ArgumentError } from '../errors';
import type { DofName } from '../model/types';
import type { ModalAnalysis } from './analysis-types';
import { dampingRatios, type Damping } from './damping';
import { resolveDofs, responseModes, type DofRef } from './harmonic-dofs';
import { correlationMatrix, type CombinationRule } from './spectrum-combination';

/** Standard gravity, m/s² (the conventional value of the CGPM, 1901). */
export const STANDARD_GRAVITY = 9.80665;

/** One point of a design spectrum. */
export interface SpectrumPoint {
  /** Period T, s, ≥ 0. */
  readonly period: number;
  /** Pseudo-acceleration A(T) in the table's unit, ≥ 0. */
  readonly acceleration: number;
}

/** Options of {@link designSpectrum}. */
export interface DesignSpectrumOptions {
  /** Unit of the accelerations: `m/s2` or `g` (× 9.80665 m/s²). @defaultValue 'm/s2' */
  unit?: 'm/s2' | 'g';
  /**
   * Periods outside the table: `hold` the end values, or `error`. @defaultValue 'hold'
   */
  beyond?: 'hold' | 'error';
}

/** Defaults of {@link DesignSpectrumOptions}. */
export const DESIGN_SPECTRUM_DEFAULTS = { unit: 'm/s2', beyond: 'hold' } as const;

/** A validated design spectrum. */
export interface DesignSpectrum {
  /** Periods, s, strictly increasing. */
  readonly periods: Float64Array;
  /** A(T) at those periods, m/s². */
  readonly accelerations: Float64Array;
  readonly beyond: 'hold' | 'error';
}

/**
 * A design spectrum from a table.
 * @param points - at least two, periods strictly increasing
 * @throws ArgumentError (path `spectrum[k].period`, `spectrum[k].acceleration`, `spectrum`,
 *   `unit`, `beyond`)
 */
export function designSpectrum(points: readonly SpectrumPoint[], options: DesignSpectrumOptions = {}): DesignSpectrum {
  const o = { ...DESIGN_SPECTRUM_DEFAULTS, ...options };
  if (o.unit !== 'm/s2' && o.unit !== 'g') throw new ArgumentError(`"${String(o.unit)}" is not a unit; use m/s2 or g`, 'unit');
  if (o.beyond !== 'hold' && o.beyond !== 'error') throw new ArgumentError(`"${String(o.beyond)}" is not a rule for periods outside the table; use hold or error`, 'beyond');
  if (!Array.isArray(points) || points.length < 2) throw new ArgumentError('a design spectrum needs at least two points { period, acceleration }', 'spectrum');
  const scale = o.unit === 'g' ? STANDARD_GRAVITY : 1;
  const periods = new Float64Array(points.length);
  const accelerations = new Float64Array(points.length);
  points.forEach((p, k) => {
    if (!(p.period >= 0) || !Number.isFinite(p.period)) throw new ArgumentError(`period ${p.period} s is not a finite number ≥ 0`, `spectrum[${k}].period`);
    if (k > 0 && !(p.period > points[k - 1].period)) {
      throw new ArgumentError(`period ${p.period} s does not follow ${points[k - 1].period} s; list the points by increasing period, each once`, `spectrum[${k}].period`);
    }
    if (!(p.acceleration >= 0) || !Number.isFinite(p.acceleration)) throw new ArgumentError(`acceleration ${p.acceleration} is not a finite number ≥ 0`, `spectrum[${k}].acceleration`);
    periods[k] = p.period;
    accelerations[k] = p.acceleration * scale;
  });
  return { periods, accelerations, beyond: o.beyond };
}

/**
 * A(T), m/s², by linear interpolation in T.
 * @throws ArgumentError (path `period`) for T outside the table when `beyond` is `error`
 */
export function spectralAcceleration(spectrum: DesignSpectrum, period: number): number {
  const { periods: P, accelerations: A } = spectrum;
  const last = P.length - 1;
  if (period <= P[0] || period >= P[last]) {
    if (spectrum.beyond === 'error' && (period < P[0] || period > P[last])) {
      throw new ArgumentError(`period ${period.toPrecision(4)} s lies outside the spectrum (${P[0]}–${P[last]} s); extend the table or allow holding its end values`, 'period');
    }
    return period <= P[0] ? A[0] : A[last];
  }
  let lo = 0;
  let hi = last;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (P[mid] <= period) lo = mid;
    else hi = mid;
  }
  const t = (period - P[lo]) / (P[hi] - P[lo]);
  return A[lo] + t * (A[hi] - A[lo]);
}

/** Options of {@link responseSpectrum}. */
export interface ResponseSpectrumOptions {
  /** Direction of the ground motion: a translation of the model's space. Required. */
  direction: DofName;
  /** Combination rule. @defaultValue 'cqc' */
  rule?: CombinationRule;
  /** Modal damping (CQC uses it; it should match the spectrum's). @defaultValue constant 0.05 (design spectra are commonly given for 5 %) */
  damping?: Damping;
  /** Modes used, the first ones. @defaultValue all modes of the analysis */
  count?: number;
  /** DOFs whose combined peak displacement is listed separately. @defaultValue none */
  at?: readonly DofRef[];
}

/** Defaults of {@link ResponseSpectrumOptions}. */
export const RESPONSE_SPECTRUM_DEFAULTS = { rule: 'cqc', damping: { kind: 'constant', ratio: 0.05 } as Damping } as const;

/** Peak response of one mode. */
export interface ModalPeak {
  readonly mode: number;
  /** s. */
  readonly period: number;
  /** A(T), m/s². */
  readonly acceleration: number;
  /** A/ω², m. */
  readonly spectralDisplacement: number;
  /** Γ along the ground motion, kg^½. */
  readonly participationFactor: number;
  /** kg. */
  readonly effectiveMass: number;
  /** Signed base shear of this mode along each translation of the space, N. */
  readonly baseShear: Readonly<Partial<Record<DofName, number>>>;
}

/** Result of {@link responseSpectrum}. */
export interface ResponseSpectrumResult {
  readonly direction: DofName;
  readonly rule: CombinationRule;
  readonly modesUsed: number;
  readonly dampingRatios: Float64Array;
  /** Σ m_eff / total mass along the direction, over the modes used, 0..1. */
  readonly massCaptured: number;
  /** Total mass along the direction, kg. */
  readonly totalMass: number;
  readonly modal: readonly ModalPeak[];
  /** Combined peak base shear along each translation of the space, N (≥ 0). */
  readonly baseShear: Readonly<Partial<Record<DofName, number>>>;
  /** Combined peak displacement of every free DOF, m (rad), length n. */
  readonly displacement: Float64Array;
  /** The `at` DOFs: index, node, DOF name, combined peak displacement. */
  readonly at: ReadonlyArray<{ readonly dof: number; readonly node: string; readonly name: DofName; readonly displacement: number }>;
}

const TRANSLATIONS: readonly DofName[] = ['ux', 'uy', 'uz'];

/**
 * Response spectrum analysis for ground motion along one direction.
 * @throws ArgumentError (path `direction`, `count`, `rule`, `damping.*`, `at[k]`, `modes[j]`,
 *   `period` when the spectrum refuses a period)
 */
export function responseSpectrum(analysis: ModalAnalysis, spectrum: DesignSpectrum, options: ResponseSpectrumOptions): ResponseSpectrumResult {
  const o = { ...RESPONSE_SPECTRUM_DEFAULTS, ...options };
  const space = analysis.assembled.model.space;
  const translations = space === 'plane' ? TRANSLATIONS.slice(0, 2) : TRANSLATIONS;
  if (!translations.includes(o.direction)) {
    throw new ArgumentError(`"${String(o.direction)}" is not a ground-motion direction of a ${space} model; use ${translations.join(', ')}`, 'direction');
  }
  if (o.rule !== 'srss' && o.rule !== 'cqc') throw new ArgumentError(`"${String(o.rule)}" is not a combination rule; use srss or cqc`, 'rule');
  const modes = responseModes(analysis, o.count);
  const { n, m, angular, vectors } = modes;
  const zeta = dampingRatios(o.damping, angular);
  const rho = correlationMatrix(o.rule, angular, zeta);
  const d = o.direction;
  const modal: ModalPeak[] = [];
  const coef = new Float64Array(m); // Γⱼ Aⱼ / ωⱼ²: scale of φⱼ in the peak displacement
  let massCaptured = 0;
  const shearValues: Partial<Record<DofName, Float64Array>> = {};
  for (const e of translations) shearValues[e] = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const ms = analysis.modes[j];
    const T = 2 * Math.PI / angular[j];
    const A = spectralAcceleration(spectrum, T);
    const G = ms.participationFactor[d] ?? 0;
    coef[j] = (G * A) / (angular[j] * angular[j]);
    massCaptured += ms.effectiveMassRatio[d] ?? 0;
    const baseShear: Partial<Record<DofName, number>> = {};
    for (const e of translations) {
      const v = (ms.participationFactor[e] ?? 0) * G * A;
      baseShear[e] = v;
      shearValues[e]![j] = v;
    }
    modal.push({
      mode: ms.mode,
      period: T,
      acceleration: A,
      spectralDisplacement: A / (angular[j] * angular[j]),
      participationFactor: G,
      effectiveMass: ms.effectiveMass[d] ?? G * G,
      baseShear,
    });
  }
  const combine = (vals: ArrayLike<number>): number => {
    let s = 0;
    for (let i = 0; i < m; i++) {
      const vi = vals[i];
      if (vi === 0) continue;
      s += vi * vi;
      for (let j = i + 1; j < m; j++) s += 2 * rho[i * m + j] * vi * vals[j];
    }
    return Math.sqrt(Math.max(s, 0));
  };
  const baseShear: Partial<Record<DofName, number>> = {};
  for (const e of translations) baseShear[e] = combine(shearValues[e]!);
  const displacement = new Float64Array(n);
  const vals = new Float64Array(m);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < m; j++) vals[j] = coef[j] * vectors[j * n + i];
    displacement[i] = combine(vals);
  }
  const idx = o.at ? resolveDofs(analysis.assembled, o.at, 'at') : new Int32Array(0);
  const at = Array.from(idx, (i) => ({ dof: i, node: analysis.assembled.dofs[i].node, name: analysis.assembled.dofs[i].dof, displacement: displacement[i] }));
  return {
    direction: d,
    rule: o.rule,
    modesUsed: m,
    dampingRatios: zeta,
    massCaptured,
    totalMass: analysis.totalMass[d] ?? 0,
    modal,
    baseShear,
    displacement,
    at,
  };
}
