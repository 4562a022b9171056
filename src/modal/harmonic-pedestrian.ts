/**
 * Peak acceleration under one walker's harmonic force at a mode's antinode, compared with a
 * comfort limit the user gives.
 *
 * Load: F cos Ωt at the DOF where the mode moves most in the chosen direction, with Ω the mode's
 * own circular frequency by default (resonance, the worst pace in a band). F = weight × dynamic
 * load factor; the defaults, 700 N and factors 0.4 vertical, 0.2 longitudinal, 0.05 lateral
 * (280 N, 140 N, 35 N), are the single-pedestrian first-harmonic amplitudes of the Sétra 2006
 * footbridge guide, recalled from memory. The steady response (harmonic.ts, all modes used) is
 * an upper bound for one walker crossing a short span, who does not stay long enough at the
 * antinode to build it up (common practice treats it as conservative). Crowds, lock-in and
 * the reduction factors of the guidance are not modelled: this is a screening figure, not a
 * comfort assessment.
 *
 * The single-mode figure at resonance, a ≈ F φ_a² / (2ζ) (mass-normalised φ, Chopra §3.2:
 * dynamic amplification 1/(2ζ) on the static modal response F φ_a² / ω²), is returned beside
 * the superposed one as a hand check.
 */
import { ArgumentError } from '../errors';
import type { DofName } from '../model/types';
import type { ModalAnalysis } from './analysis-types';
import { BAND_PRESETS, type MotionDirection } from './bands';
import { classifyModes } from './classify';
import type { Damping } from './damping';
import { harmonicResponse, HARMONIC_DEFAULTS } from './harmonic';

/** Options of {@link pedestrianResponse}. */
export interface PedestrianOptions {
  /** Mode number, 1 = lowest. Required. */
  mode: number;
  /**
   * Direction of the force: `vertical`, `lateral` or `longitudinal`. @defaultValue the mode's
   * dominant direction (classify.ts), vertical for a torsional mode (a walker at the edge)
   */
  direction?: Exclude<MotionDirection, 'torsional'>;
  /** Walker weight, N. @defaultValue 700 (from memory, the usual design walker) */
  weight?: number;
  /**
   * Dynamic load factor of the first harmonic. @defaultValue 0.4 vertical, 0.2 longitudinal,
   * 0.05 lateral (Sétra 2006, from memory)
   */
  dynamicLoadFactor?: number;
  /** Force amplitude, N; overrides weight × factor. */
  force?: number;
  /** Pace (load) frequency, Hz. @defaultValue the mode's frequency */
  frequency?: number;
  /** Modal damping. @defaultValue HARMONIC_DEFAULTS.damping (1 %) */
  damping?: Damping;
  /** Modes superposed. @defaultValue all */
  count?: number;
  /** Only these nodes can carry the walker (the deck). @defaultValue every node */
  nodes?: readonly string[];
  /** Comfort limit on the acceleration amplitude, m/s², from the governing guidance. @defaultValue none (no verdict) */
  comfortLimit?: number;
}

/** Defaults of {@link PedestrianOptions}. */
export const PEDESTRIAN_DEFAULTS = {
  weight: 700,
  dynamicLoadFactor: { vertical: 0.4, longitudinal: 0.2, lateral: 0.05 },
} as const;

/** Result of {@link pedestrianResponse}. */
export interface PedestrianResult {
  readonly mode: number;
  /** Mode frequency, Hz. */
  readonly modeFrequency: number;
  /** Load frequency, Hz. */
  readonly frequency: number;
  readonly direction: Exclude<MotionDirection, 'torsional'>;
  /** The antinode: free DOF index, node id, DOF name. */
  readonly dof: number;
  readonly node: string;
  readonly dofName: DofName;
  /** Force amplitude, N. */
  readonly force: number;
  /** Damping ratio of the mode. */
  readonly dampingRatio: number;
  /** Acceleration amplitude at the antinode, all modes used, m/s². */
  readonly acceleration: number;
  /** Single-mode resonance estimate F φ_a² / (2ζ), m/s² (only when the load is at the mode's frequency). */
  readonly singleModeAcceleration: number | null;
  readonly comfortLimit: number | null;
  /** `within-limit`, `exceeds-limit`, or null without a limit. */
  readonly verdict: 'within-limit' | 'exceeds-limit' | null;
  /**
   * Cautions about the load: set when the load frequency lies outside the first-harmonic pace
   * band of the direction (BAND_PRESETS), where one walker's first harmonic cannot act.
   */
  readonly warnings: readonly string[];
}

/** The first-harmonic pace band of each direction (bands.ts presets). */
const PACE_BAND = { vertical: 'walking-vertical', longitudinal: 'walking-longitudinal', lateral: 'walking-lateral' } as const;

/** Global translation closest to a structure axis. */
function globalDof(axis: readonly [number, number, number]): DofName {
  const c = [0, 1, 2].reduce((b, q) => (Math.abs(axis[q]) > Math.abs(axis[b]) ? q : b), 0);
  return (['ux', 'uy', 'uz'] as const)[c];
}

/**
 * Acceleration amplitude at a mode's antinode under one walker's harmonic force.
 * @throws ArgumentError (path `mode`, `direction`, `weight`, `dynamicLoadFactor`, `force`,
 *   `frequency`, `nodes[k]`, `comfortLimit`) naming the bad option; as {@link harmonicResponse}
 */
export function pedestrianResponse(analysis: ModalAnalysis, options: PedestrianOptions): PedestrianResult {
  const total = analysis.modes.length;
  const modeNo = options.mode;
  if (!Number.isInteger(modeNo) || modeNo < 1 || modeNo > total) throw new ArgumentError(`mode ${modeNo} is not a mode number from 1 to ${total}`, 'mode');
  const j = modeNo - 1;
  const cls = classifyModes(analysis);
  const dominant = cls.modes[j].direction;
  const direction = options.direction ?? (dominant === 'torsional' ? 'vertical' : dominant);
  const axis = direction === 'vertical' ? cls.axes.vertical : direction === 'longitudinal' ? cls.axes.longitudinal : cls.axes.lateral;
  if (!axis || !['vertical', 'lateral', 'longitudinal'].includes(direction)) {
    throw new ArgumentError(`direction "${direction}" is not available in a ${analysis.assembled.model.space} model; use vertical or longitudinal${cls.axes.lateral ? ' or lateral' : ''}`, 'direction');
  }
  const dofName = globalDof(axis);
  const weight = options.weight ?? PEDESTRIAN_DEFAULTS.weight;
  if (!(weight > 0) || !Number.isFinite(weight)) throw new ArgumentError(`${weight} N is not a positive weight`, 'weight');
  const factor = options.dynamicLoadFactor ?? PEDESTRIAN_DEFAULTS.dynamicLoadFactor[direction];
  if (!(factor > 0) || !Number.isFinite(factor)) throw new ArgumentError(`${factor} is not a positive dynamic load factor`, 'dynamicLoadFactor');
  const force = options.force ?? weight * factor;
  if (!(force > 0) || !Number.isFinite(force)) throw new ArgumentError(`${force} N is not a positive force amplitude`, 'force');
  const modeFrequency = analysis.modes[j].frequency;
  const frequency = options.frequency ?? modeFrequency;
  if (!(frequency > 0) || !Number.isFinite(frequency)) throw new ArgumentError(`${frequency} Hz is not a positive pace frequency`, 'frequency');
  if (options.count !== undefined && options.count < modeNo) {
    throw new ArgumentError(`count ${options.count} leaves out mode ${modeNo} itself; use at least ${modeNo} modes`, 'count');
  }
  const limit = options.comfortLimit;
  if (limit !== undefined && (!(limit > 0) || !Number.isFinite(limit))) throw new ArgumentError(`${limit} m/s² is not a positive acceleration limit`, 'comfortLimit');

  // ---- antinode: the largest |φ| among the allowed nodes' DOFs of that name ----
  const { assembled, eigen } = analysis;
  const n = eigen.n;
  let allowed: Set<string> | null = null;
  if (options.nodes) {
    const ids = new Set(assembled.model.nodes.map((nd) => nd.id));
    options.nodes.forEach((id, k) => {
      if (!ids.has(id)) throw new ArgumentError(`node "${id}" is not in the model; check the node id`, `nodes[${k}]`);
    });
    allowed = new Set(options.nodes);
  }
  let best = -1;
  let bestAbs = -1;
  for (let i = 0; i < n; i++) {
    const d = assembled.dofs[i];
    if (d.dof !== dofName || (allowed && !allowed.has(d.node))) continue;
    const v = Math.abs(eigen.vectors[j * n + i]);
    if (v > bestAbs) {
      bestAbs = v;
      best = i;
    }
  }
  if (best < 0) throw new ArgumentError(`no free ${dofName} DOF on the nodes allowed; include deck nodes that move ${direction}ly`, options.nodes ? 'nodes' : 'direction');
  const d = assembled.dofs[best];
  const load = new Float64Array(n);
  load[best] = force;
  const damping = options.damping ?? HARMONIC_DEFAULTS.damping;
  const r = harmonicResponse(analysis, { load, at: [best], frequencies: [frequency], damping, count: options.count });
  const acceleration = r.responses[0].acceleration[0];
  const zeta = r.dampingRatios[j];
  const phiA = eigen.vectors[j * n + best];
  const singleModeAcceleration = frequency === modeFrequency && zeta > 0 ? (force * phiA * phiA) / (2 * zeta) : null;
  const warnings: string[] = [];
  const pace = BAND_PRESETS[PACE_BAND[direction]];
  if (options.force === undefined && options.dynamicLoadFactor === undefined && (frequency < pace.fLow || frequency > pace.fHigh)) {
    const second = direction === 'vertical' && frequency >= BAND_PRESETS['walking-vertical-2'].fLow && frequency <= BAND_PRESETS['walking-vertical-2'].fHigh;
    warnings.push(
      second
        ? `${frequency.toPrecision(4)} Hz lies in the band of the second harmonic of walking, whose force is several times smaller than the first's; pass its own dynamic load factor`
        : `${frequency.toPrecision(4)} Hz lies outside the ${pace.name} band (${pace.fLow}–${pace.fHigh} Hz): a walker's first-harmonic force does not act there, so this figure is far above what one walker causes`,
    );
  }
  return {
    warnings,
    mode: modeNo,
    modeFrequency,
    frequency,
    direction,
    dof: best,
    node: d.node,
    dofName,
    force,
    dampingRatio: zeta,
    acceleration,
    singleModeAcceleration,
    comfortLimit: limit ?? null,
    verdict: limit === undefined ? null : acceleration <= limit ? 'within-limit' : 'exceeds-limit',
  };
}
