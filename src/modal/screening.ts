/**
 * Resonance screening: which modes sit inside (or close to) a band of frequencies that people
 * or machines excite, in a direction that band drives, and what frequency would clear it.
 *
 * A mode "responds" in a direction when its kinetic energy share there (classify.ts) is at
 * least `directionShare`; a band applies to the mode when it excites one of those directions.
 * With clearance c, a frequency f is clear of the band [fLow, fHigh] when
 *   f ≤ fLow·(1 − c)  or  f ≥ fHigh·(1 + c);
 * inside the band it is `inside`, between the band and those limits `near`. The target that
 * clears the band is the nearer of the two limits (nearer in ratio, since stiffness scales
 * with f²): with the mass unchanged, scaling the stiffness that the mode engages by
 * (target / f)² moves it there (Rayleigh quotient, λ = φᵀKφ / φᵀMφ).
 *
 * The result is plain data; reports (src/io/report-screening.ts) add the engineering caution.
 * Screening flags candidates for a response check; it decides neither comfort nor safety.
 */
import { ArgumentError } from '../errors';
import type { ModalAnalysis } from './analysis-types';
import { bandExcites, MOTION_DIRECTIONS, validateBands, type BandSpec, type ExcitationBand, type MotionDirection } from './bands';
import { classifyModes, type ClassifyOptions, type ModeClassification, type StructureAxes } from './classify';

/** Options of {@link screenResonance}. */
export interface ScreeningOptions extends ClassifyOptions {
  /**
   * Clearance c as a fraction of the band edge: the band is cleared below fLow·(1 − c) and
   * above fHigh·(1 + c). A choice for a first screen, not a code value. @defaultValue 0.1
   */
  clearance?: number;
  /**
   * Kinetic energy share, 0..1, from which a mode counts as moving in a direction (a
   * choice of this library, not a published figure). @defaultValue 0.2
   */
  directionShare?: number;
}

/** Defaults of {@link ScreeningOptions} (besides those of classification). */
export const SCREENING_DEFAULTS = { clearance: 0.1, directionShare: 0.2 } as const;

/** How one mode stands against one band whose direction it shares. */
export interface BandCheck {
  /** Band name. */
  readonly band: string;
  /** Directions both excited by the band and moved by the mode (share ≥ directionShare). */
  readonly directions: readonly MotionDirection[];
  /** `inside` the band, or `near` it (outside, within the clearance). */
  readonly status: 'inside' | 'near';
  /** Distance from f to the nearest band edge, Hz: negative inside the band, positive outside. */
  readonly marginHz: number;
  /** marginHz / f × 100, %. */
  readonly marginPercent: number;
  /** fLow·(1 − c), Hz; null when that is not above 0. */
  readonly targetBelow: number | null;
  /** fHigh·(1 + c), Hz. */
  readonly targetAbove: number;
  /** The nearer of the two targets (in ratio to f), Hz. */
  readonly target: number;
  /** (target / f)²: the stiffness scale (mass unchanged) that would move the mode to the target. */
  readonly stiffnessFactor: number;
}

/** Screening of one mode. */
export interface ModeScreening extends ModeClassification {
  /** The bands this mode is inside or near, in the order of the bands. */
  readonly checks: readonly BandCheck[];
  /** Worst status over the checks: `in-band`, `near-band` or `clear`. */
  readonly verdict: ScreeningVerdict;
}

/** A verdict of screening (never one of comfort or safety). */
export type ScreeningVerdict = 'in-band' | 'near-band' | 'clear';

/** Whether the modes computed cover every band. */
export interface ScreeningCoverage {
  /** fHigh·(1 + c) of the highest band, Hz: modes up to here matter. */
  readonly requiredFrequency: number;
  /** Frequency up to which no mode is missing (Sturm count or highest mode computed), Hz. */
  readonly coveredFrequency: number;
  /** True when coveredFrequency ≥ requiredFrequency and the modes start from the lowest. */
  readonly complete: boolean;
}

/** Result of {@link screenResonance}. */
export interface ScreeningResult {
  readonly title: string;
  readonly bands: readonly ExcitationBand[];
  readonly clearance: number;
  readonly directionShare: number;
  readonly axes: StructureAxes;
  /** Every mode of the analysis, lowest first. */
  readonly modes: readonly ModeScreening[];
  /** Worst verdict over the modes. */
  readonly verdict: ScreeningVerdict;
  readonly coverage: ScreeningCoverage;
}

/**
 * Screens the modes of an analysis against excitation bands.
 * @param analysis - modal analysis of the structure (modes lowest first)
 * @param bands - presets (`BAND_PRESETS`), machine bands (`machineBand`) and the user's own
 * @param options - see {@link ScreeningOptions}; defaults in {@link SCREENING_DEFAULTS}
 * @throws ArgumentError whose path names the band for a bad band (bands.ts); (path
 *   `clearance`, `directionShare`) for values out of range
 */
export function screenResonance(analysis: ModalAnalysis, bands: readonly BandSpec[], options: ScreeningOptions = {}): ScreeningResult {
  const o = { ...SCREENING_DEFAULTS, ...options };
  if (!(o.clearance >= 0 && o.clearance < 1)) {
    throw new ArgumentError(`${o.clearance} is not in [0, 1); give the clearance as a fraction of the band edge, e.g. 0.1 for 10 %`, 'clearance');
  }
  if (!(o.directionShare > 0 && o.directionShare <= 1)) {
    throw new ArgumentError(`${o.directionShare} is not in (0, 1]; give the kinetic energy share from which a mode counts as moving in a direction, e.g. 0.2`, 'directionShare');
  }
  const valid = validateBands(bands);
  const classification = classifyModes(analysis, options);
  const c = o.clearance;
  const modes: ModeScreening[] = classification.modes.map((mc) => {
    const f = mc.frequency;
    const moving = MOTION_DIRECTIONS.filter((d) => mc.shares[d] >= o.directionShare);
    const checks: BandCheck[] = [];
    for (const b of valid) {
      const directions = moving.filter((d) => bandExcites(b, d));
      if (directions.length === 0) continue;
      const below = b.fLow * (1 - c);
      const above = b.fHigh * (1 + c);
      const inside = f >= b.fLow && f <= b.fHigh;
      const near = !inside && f > below && f < above;
      if (!inside && !near) continue;
      const marginHz = inside ? -Math.min(f - b.fLow, b.fHigh - f) : f < b.fLow ? b.fLow - f : f - b.fHigh;
      const targetBelow = below > 0 ? below : null;
      // Nearer in ratio: compare |ln(target / f)|; a rigid mode (f = 0) can only go up.
      const target = targetBelow !== null && f > 0 && Math.log(f / targetBelow) < Math.log(above / f) ? targetBelow : above;
      checks.push({
        band: b.name,
        directions,
        status: inside ? 'inside' : 'near',
        marginHz,
        marginPercent: f > 0 ? (100 * marginHz) / f : -Infinity,
        targetBelow,
        targetAbove: above,
        target,
        stiffnessFactor: f > 0 ? (target / f) ** 2 : Infinity,
      });
    }
    const verdict: ScreeningVerdict = checks.some((k) => k.status === 'inside') ? 'in-band' : checks.length > 0 ? 'near-band' : 'clear';
    return { ...mc, checks, verdict };
  });
  const verdict: ScreeningVerdict = modes.some((m) => m.verdict === 'in-band') ? 'in-band' : modes.some((m) => m.verdict === 'near-band') ? 'near-band' : 'clear';
  return {
    title: analysis.title,
    bands: valid,
    clearance: c,
    directionShare: o.directionShare,
    axes: classification.axes,
    modes,
    verdict,
    coverage: coverage(analysis, valid, c),
  };
}

function coverage(analysis: ModalAnalysis, bands: readonly ExcitationBand[], c: number): ScreeningCoverage {
  const requiredFrequency = Math.max(...bands.map((b) => b.fHigh * (1 + c)));
  const top = analysis.modes.length > 0 ? analysis.modes[analysis.modes.length - 1].frequency : 0;
  const sturm = analysis.eigen.sturm;
  let coveredFrequency = top;
  let fromLowest = true;
  if (sturm) {
    if (sturm.passed) coveredFrequency = Math.max(top, Math.sqrt(Math.max(sturm.shift, 0)) / (2 * Math.PI));
    if (sturm.lowerShift !== undefined) {
      // A window: modes below its lower end were not asked for.
      const fLowest = Math.min(...bands.map((b) => b.fLow * (1 - c)));
      fromLowest = Math.sqrt(Math.max(sturm.lowerShift, 0)) / (2 * Math.PI) <= fLowest;
    }
  }
  // λ → f → λ round trips lose the last bits: compare with a relative tolerance.
  return { requiredFrequency, coveredFrequency, complete: fromLowest && coveredFrequency >= requiredFrequency * (1 - 1e-9) };
}
