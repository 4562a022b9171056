/**
 * `eigenframe screen`: which modes of a model sit in (or near) the frequency bands that walkers,
 * crowds or machines excite, and what frequency would clear them.
 */
import { ArgumentError } from '../../errors';
import type { CommandSpec, ParsedArgs } from '../args';
import { readText, writeFilesAtomically } from '../files';
import type { CommandOutput } from '../output';
import { parseModel } from '../../model/read';
import { modalAnalysis } from '../../modal/analysis';
import { BAND_PRESET_NAMES, bandPreset, machineBand, validateBand, type BandDirection, type BandSpec } from '../../modal/bands';
import { screenResonance, SCREENING_DEFAULTS } from '../../modal/screening';
import { formatScreeningText, screeningJsonObject } from '../../io/report-screening';
import { eigenvalueOf } from '../requests';

/** Presets used when no band is named. */
export const DEFAULT_SCREEN_PRESETS: readonly string[] = ['walking-vertical', 'walking-vertical-2', 'walking-lateral', 'walking-longitudinal'];

export const SCREEN_SPEC: CommandSpec = {
  name: 'screen',
  summary: 'resonance screening: modes inside or near the bands walkers, crowds or machines excite',
  usage: [
    'screen MODEL.json [--preset NAME,...] [--band NAME:F1:F2:DIRECTION,...] [--json]',
    'screen MODEL.json --rpm 1480 [--rpm-tolerance 10]',
  ],
  positionals: { name: 'model file', max: 1 },
  options: [
    { name: 'preset', kind: 'string', value: 'NAMES', help: `built-in bands, comma-separated: ${BAND_PRESET_NAMES.join(', ')} (default: the four walking bands)` },
    { name: 'band', kind: 'string', value: 'SPECS', help: 'bands of your own, comma-separated NAME:F1:F2:DIRECTION with F in Hz and DIRECTION vertical, lateral, longitudinal, torsional or any (join several with +)' },
    { name: 'rpm', kind: 'number', value: 'RPM', help: 'a rotating machine: running speed in revolutions per minute (band rpm/60 Hz ± tolerance, any direction)' },
    { name: 'rpm-tolerance', kind: 'number', value: 'PERCENT', help: 'half-width of the machine band, % of the running frequency (default 10)' },
    { name: 'clearance', kind: 'number', value: 'PERCENT', help: `margin beyond a band edge still flagged as near, and added to the target frequency (default ${100 * SCREENING_DEFAULTS.clearance})` },
    { name: 'count', kind: 'count', value: 'N', help: 'screen the lowest N modes (default: every mode up to the highest band edge plus the clearance)' },
    { name: 'json', kind: 'flag', help: 'print one JSON object instead of the report' },
    { name: 'output', kind: 'file', value: 'FILE', help: 'write the report to FILE (all or nothing) instead of standard output' },
    { name: 'help', kind: 'flag', help: 'show this help' },
  ],
  notes: [
    'Preset bands are recalled from published guidance and common practice; each report names its source.',
    'Screening flags candidates for a response check (eigenframe response); comfort and safety are decided by the local codes and a licensed engineer.',
  ],
};

const DIRECTIONS = ['vertical', 'lateral', 'longitudinal', 'torsional', 'any'];

/** Parses `NAME:F1:F2:DIRECTION[+DIRECTION]`. */
export function parseBandOption(text: string, k: number): BandSpec {
  const parts = text.split(':');
  if (parts.length !== 4) {
    throw new ArgumentError(`band ${k + 1} "${text}" is not NAME:F1:F2:DIRECTION; write e.g. pump:9:11:vertical`, '--band');
  }
  const [name, a, b, dir] = parts.map((s) => s.trim());
  const fLow = Number(a);
  const fHigh = Number(b);
  if (a === '' || !Number.isFinite(fLow)) throw new ArgumentError(`band "${name}": F1 "${a}" is not a number of Hz`, '--band');
  if (b === '' || !Number.isFinite(fHigh)) throw new ArgumentError(`band "${name}": F2 "${b}" is not a number of Hz`, '--band');
  const directions = dir.split('+').map((d) => d.trim());
  for (const d of directions) {
    if (!DIRECTIONS.includes(d)) throw new ArgumentError(`band "${name}": "${d}" is not a direction; use ${DIRECTIONS.join(', ')}`, '--band');
  }
  const spec: BandSpec = { name, fLow, fHigh, directions: directions as BandDirection[], source: 'user (command line)' };
  try {
    return validateBand(spec, `band ${k + 1}`);
  } catch (e) {
    if (e instanceof ArgumentError) throw new ArgumentError(`${e.path}: ${e.detail}`, '--band');
    throw e;
  }
}

/** The bands asked for on the command line. */
export function screenBands(o: ParsedArgs['options']): BandSpec[] {
  const bands: BandSpec[] = [];
  if (o.preset !== undefined) {
    for (const name of String(o.preset).split(',').map((s) => s.trim()).filter((s) => s !== '')) {
      if (!BAND_PRESET_NAMES.includes(name)) throw new ArgumentError(`"${name}" is not a preset; use ${BAND_PRESET_NAMES.join(', ')}`, '--preset');
      bands.push(bandPreset(name));
    }
  }
  if (o.band !== undefined) String(o.band).split(',').forEach((t, k) => bands.push(parseBandOption(t, k)));
  if (o['rpm-tolerance'] !== undefined && o.rpm === undefined) throw new ArgumentError('goes with --rpm; add the machine speed', '--rpm-tolerance');
  if (o.rpm !== undefined) {
    const rpm = Number(o.rpm);
    if (!(rpm > 0)) throw new ArgumentError(`${rpm} is not a positive speed in revolutions per minute`, '--rpm');
    const tol = o['rpm-tolerance'] === undefined ? undefined : Number(o['rpm-tolerance']);
    if (tol !== undefined && !(tol >= 0 && tol < 100)) throw new ArgumentError(`${tol} % is not in [0, 100)`, '--rpm-tolerance');
    bands.push(machineBand(rpm, tol === undefined ? {} : { tolerancePercent: tol }));
  }
  if (bands.length === 0) for (const name of DEFAULT_SCREEN_PRESETS) bands.push(bandPreset(name));
  return bands;
}

/** Runs `screen`. */
export function runScreen(args: ParsedArgs): CommandOutput {
  const o = args.options;
  const modelPath = args.positionals[0];
  if (modelPath === undefined) throw new ArgumentError('no model given; write "eigenframe screen MODEL.json"', 'screen');
  const bands = screenBands(o);
  const clearance = o.clearance === undefined ? SCREENING_DEFAULTS.clearance : Number(o.clearance) / 100;
  if (!(clearance >= 0 && clearance < 1)) throw new ArgumentError(`${Number(o.clearance)} % is not in [0, 100)`, '--clearance');
  const path = String(modelPath);
  const model = parseModel(readText(path, 'model file'), path);
  // Every mode up to the highest band edge plus the clearance (Sturm-counted), unless --count.
  const fMax = Math.max(...bands.map((b) => b.fHigh)) * (1 + clearance);
  const analysis = o.count !== undefined ? modalAnalysis(model, { count: Number(o.count) }) : modalAnalysis(model, { range: [0, eigenvalueOf(fMax)] });
  const result = screenResonance(analysis, bands, { clearance });
  const text = o.json ? JSON.stringify(screeningJsonObject(result), null, 2) + '\n' : formatScreeningText(result);
  if (o.output !== undefined) {
    writeFilesAtomically([{ path: String(o.output), content: text }]);
    return { stdout: '', stderr: `eigenframe: report written to ${String(o.output)}\n` };
  }
  return { stdout: text, stderr: '' };
}
