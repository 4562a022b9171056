/**
 * Excitation bands: frequency ranges (Hz) in which people or machines push a structure, with the
 * directions they push in. A mode whose frequency lies in a band and whose motion has a share in
 * one of the band's directions can resonate (screening.ts).
 *
 * The presets are screening aids, not design rules. Each carries where its numbers come from and
 * whether they were recalled rather than read from the document while writing this file
 * (`fromMemory`). Comfort and safety are decided by the governing code and a licensed engineer.
 */
import { ArgumentError } from '../errors';

/** A direction of motion of a mode, in the structure's own axes (see classify.ts). */
export type MotionDirection = 'vertical' | 'lateral' | 'longitudinal' | 'torsional';

/** Direction(s) a band excites; `any` matches every direction. */
export type BandDirection = MotionDirection | 'any';

/** All motion directions, in report order. */
export const MOTION_DIRECTIONS: readonly MotionDirection[] = ['vertical', 'lateral', 'longitudinal', 'torsional'];

/** A band as a user writes it. */
export interface BandSpec {
  /** Name shown in reports and in error paths, non-empty. */
  readonly name: string;
  /** Lower end, Hz, ≥ 0. */
  readonly fLow: number;
  /** Upper end, Hz, > fLow. */
  readonly fHigh: number;
  /** Directions of motion the excitation drives; at least one. */
  readonly directions: readonly BandDirection[];
  /** Where the numbers come from. @defaultValue 'user' */
  readonly source?: string;
  /** True when the numbers were recalled, not read from the source. @defaultValue false */
  readonly fromMemory?: boolean;
  /** Free text shown with the band (e.g. what load it stands for). */
  readonly note?: string;
}

/** A validated band. */
export interface ExcitationBand {
  readonly name: string;
  /** Hz. */
  readonly fLow: number;
  /** Hz. */
  readonly fHigh: number;
  readonly directions: readonly BandDirection[];
  readonly source: string;
  readonly fromMemory: boolean;
  readonly note?: string;
}

const BACHMANN =
  'Bachmann & Ammann, Vibrations in Structures Induced by Man and Machines, IABSE Structural Engineering Documents 3e, 1987';
const SETRA = 'Sétra/AFGC, Footbridges: assessment of vibrational behaviour under pedestrian loading, technical guide, 2006';

/**
 * Built-in presets. The numbers are recalled (all `fromMemory: true`); check them against the
 * guidance that governs the project before relying on them.
 */
export const BAND_PRESETS: Readonly<Record<string, ExcitationBand>> = {
  'walking-vertical': {
    name: 'walking-vertical',
    fLow: 1.6,
    fHigh: 2.4,
    directions: ['vertical'],
    source: `${BACHMANN}; fib Bulletin 32, Guidelines for the design of footbridges, 2005 (pace 1.6–2.4 Hz)`,
    fromMemory: true,
    note: 'pace frequency of normal walking, first harmonic of the vertical footfall force',
  },
  'walking-vertical-2': {
    name: 'walking-vertical-2',
    fLow: 3.2,
    fHigh: 4.8,
    directions: ['vertical'],
    source: `common practice: twice the walking pace band; ${SETRA} treats 2.6–5 Hz as a low-risk range for the second harmonic`,
    fromMemory: true,
    note: 'second harmonic of the vertical walking force',
  },
  'walking-lateral': {
    name: 'walking-lateral',
    fLow: 0.5,
    fHigh: 1.2,
    directions: ['lateral'],
    source: `common practice: half the pace band (0.8–1.2 Hz) widened downwards as in ${SETRA} (lateral range 0.5–1.1 Hz, with 1.1–1.3 Hz next to it)`,
    fromMemory: true,
    note: 'sideways sway of walkers, at half the pace frequency; crowds may lock in',
  },
  'walking-longitudinal': {
    name: 'walking-longitudinal',
    fLow: 1.6,
    fHigh: 2.4,
    directions: ['longitudinal'],
    source: `${SETRA} (vertical and longitudinal share one range); pace band from ${BACHMANN}`,
    fromMemory: true,
    note: 'fore-and-aft footfall force at the pace frequency',
  },
  jogging: {
    name: 'jogging',
    fLow: 2.0,
    fHigh: 3.5,
    directions: ['vertical'],
    source: `${BACHMANN} (running 2.0–3.5 Hz)`,
    fromMemory: true,
    note: 'running and jogging pace',
  },
  'rhythmic-crowd': {
    name: 'rhythmic-crowd',
    fLow: 1.5,
    fHigh: 3.5,
    directions: ['vertical', 'lateral'],
    source: `common practice envelope of jumping (≈1.8–3.4 Hz) and dancing (≈1.5–3.0 Hz) after ${BACHMANN}`,
    fromMemory: true,
    note: 'jumping, dancing, rhythmic crowds (stands, gymnasia, dance floors)',
  },
};

/** Names of the presets, in a stable order. */
export const BAND_PRESET_NAMES: readonly string[] = Object.keys(BAND_PRESETS);

/**
 * A preset by name.
 * @throws ArgumentError (path `preset`) for an unknown name, listing the known ones
 */
export function bandPreset(name: string): ExcitationBand {
  const b = BAND_PRESETS[name];
  if (!b) throw new ArgumentError(`"${name}" is not a band preset; use one of ${BAND_PRESET_NAMES.join(', ')}`, 'preset');
  return b;
}

/** Options of {@link machineBand}. */
export interface MachineBandOptions {
  /** Band half-width as a percentage of the running frequency. @defaultValue 10 */
  tolerancePercent?: number;
  /** Multiple of the running frequency (2 for twice-per-revolution forces). @defaultValue 1 */
  harmonic?: number;
  /** Directions driven. @defaultValue ['any'] */
  directions?: readonly BandDirection[];
  /** Band name. @defaultValue `machine <rpm> rpm` (with `×h` for a harmonic h > 1) */
  name?: string;
}

/** Defaults of {@link MachineBandOptions}. */
export const MACHINE_BAND_DEFAULTS = { tolerancePercent: 10, harmonic: 1, directions: ['any'] as readonly BandDirection[] } as const;

/**
 * Band of a rotating machine: running frequency f = h · rpm / 60 Hz, ± tolerance %. The
 * tolerance covers speed variation and the uncertainty of the model; its size is the user's
 * choice (the 10 % default is common practice for a first screen, not a rule).
 * @param rpm - running speed, revolutions per minute, > 0
 * @throws ArgumentError (path `rpm`, `tolerancePercent`, `harmonic`) for values out of range
 */
export function machineBand(rpm: number, options: MachineBandOptions = {}): ExcitationBand {
  const o = { ...MACHINE_BAND_DEFAULTS, ...options };
  if (!(rpm > 0) || !Number.isFinite(rpm)) throw new ArgumentError(`running speed ${rpm} rpm is not a positive number; give the machine speed in revolutions per minute`, 'rpm');
  if (!(o.tolerancePercent >= 0 && o.tolerancePercent < 100)) {
    throw new ArgumentError(`${o.tolerancePercent} % is not in [0, 100); give the band half-width as a percentage of the running frequency, e.g. 10`, 'tolerancePercent');
  }
  if (!Number.isInteger(o.harmonic) || o.harmonic < 1) throw new ArgumentError(`harmonic ${o.harmonic} is not a whole number ≥ 1`, 'harmonic');
  const f = (o.harmonic * rpm) / 60;
  const t = o.tolerancePercent / 100;
  const name = o.name ?? `machine ${rpm} rpm${o.harmonic > 1 ? ` ×${o.harmonic}` : ''}`;
  return validateBand(
    {
      name,
      fLow: f * (1 - t),
      fHigh: f * (1 + t),
      directions: o.directions,
      source: `running frequency ${o.harmonic > 1 ? `${o.harmonic} × ` : ''}rpm/60 = ${f.toPrecision(4)} Hz ± ${o.tolerancePercent} % (tolerance chosen by the user)`,
      fromMemory: false,
      note: 'rotating machinery',
    },
    name,
  );
}

function bandPath(spec: Partial<BandSpec> | undefined, fallback: string): string {
  return typeof spec?.name === 'string' && spec.name !== '' ? `band "${spec.name}"` : fallback;
}

/**
 * Validates one band.
 * @param spec - the band as given
 * @param fallbackPath - path used when the band has no usable name, e.g. `bands[2]`
 * @throws ArgumentError whose path names the band (`band "pump".fHigh`) for a missing name,
 *   a negative or non-finite fLow, fHigh ≤ fLow, or an empty or unknown direction
 */
export function validateBand(spec: BandSpec, fallbackPath = 'band'): ExcitationBand {
  const p = bandPath(spec, fallbackPath);
  if (typeof spec !== 'object' || spec === null) throw new ArgumentError('is not a band object { name, fLow, fHigh, directions }', fallbackPath);
  if (typeof spec.name !== 'string' || spec.name.trim() === '') throw new ArgumentError('has no name; give each band a non-empty name', `${p}.name`);
  if (typeof spec.fLow !== 'number' || !(spec.fLow >= 0) || !Number.isFinite(spec.fLow)) {
    throw new ArgumentError(`fLow ${String(spec.fLow)} Hz is not a finite number ≥ 0; give the lower end of the band in Hz`, `${p}.fLow`);
  }
  if (typeof spec.fHigh !== 'number' || !Number.isFinite(spec.fHigh) || !(spec.fHigh > spec.fLow)) {
    throw new ArgumentError(`fHigh ${String(spec.fHigh)} Hz is not a finite number above fLow ${spec.fLow} Hz; give the upper end of the band in Hz`, `${p}.fHigh`);
  }
  if (!Array.isArray(spec.directions) || spec.directions.length === 0) {
    throw new ArgumentError(`has no directions; give one or more of ${[...MOTION_DIRECTIONS, 'any'].join(', ')}`, `${p}.directions`);
  }
  spec.directions.forEach((d, k) => {
    if (d !== 'any' && !MOTION_DIRECTIONS.includes(d as MotionDirection)) {
      throw new ArgumentError(`"${String(d)}" is not a direction; use ${[...MOTION_DIRECTIONS, 'any'].join(', ')}`, `${p}.directions[${k}]`);
    }
  });
  return {
    name: spec.name,
    fLow: spec.fLow,
    fHigh: spec.fHigh,
    directions: [...new Set(spec.directions)],
    source: spec.source ?? 'user',
    fromMemory: spec.fromMemory ?? false,
    ...(spec.note !== undefined ? { note: spec.note } : {}),
  };
}

/**
 * Validates a list of bands (presets, machine bands and user bands mixed).
 * @throws ArgumentError as {@link validateBand}; (path `bands`) for an empty list or two bands
 *   of one name
 */
export function validateBands(bands: readonly BandSpec[]): ExcitationBand[] {
  if (!Array.isArray(bands) || bands.length === 0) throw new ArgumentError('no excitation bands given; pass at least one preset, machine band or band of your own', 'bands');
  const out = bands.map((b, k) => validateBand(b, `bands[${k}]`));
  const seen = new Set<string>();
  for (const b of out) {
    if (seen.has(b.name)) throw new ArgumentError(`two bands are named "${b.name}"; give each band its own name`, `band "${b.name}".name`);
    seen.add(b.name);
  }
  return out;
}

/** True when a band drives motion in direction d. */
export function bandExcites(band: ExcitationBand, d: MotionDirection): boolean {
  return band.directions.includes('any') || band.directions.includes(d);
}
