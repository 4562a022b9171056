/**
 * `eigenframe response`: steady harmonic response by modal superposition, over a frequency
 * sweep at one DOF, or a walker at a mode's antinode compared with a comfort limit.
 */
import { ArgumentError } from '../../errors';
import type { CommandSpec, ParsedArgs } from '../args';
import { readText, writeFilesAtomically } from '../files';
import type { CommandOutput } from '../output';
import { parseModel } from '../../model/read';
import { DOF_NAMES } from '../../model/dofs';
import type { DofName } from '../../model/types';
import { modalAnalysis } from '../../modal/analysis';
import { assemble } from '../../model/assemble';
import { frequencySweep, harmonicResponse, HARMONIC_DEFAULTS } from '../../modal/harmonic';
import { pedestrianResponse } from '../../modal/harmonic-pedestrian';
import type { Damping } from '../../modal/damping';
import { formatHarmonicText, formatPedestrianText, harmonicJsonObject, pedestrianJsonObject } from '../../io/report-response';
import { eigenvalueOf } from '../requests';
import { loadErrorAsOption, parseNodalLoads } from '../loads';
import { screenBands } from './screen';
import { validateBands } from '../../modal/bands';
import { frequencyResponseSvg } from '../../io/svg-response';

export const RESPONSE_SPEC: CommandSpec = {
  name: 'response',
  summary: 'steady harmonic response by modal superposition: a frequency sweep, or a walker at a mode’s antinode',
  usage: [
    'response MODEL.json --node N --dof uz --sweep F1:F2:STEPS [--load NODE:DOF:VALUE,...] [--damping 0.01] [--svg FILE] [--json]',
    'response MODEL.json --walker MODE [--comfort-limit 0.7] [--damping 0.01] [--json]',
  ],
  positionals: { name: 'model file', max: 1 },
  options: [
    { name: 'node', kind: 'string', value: 'ID', help: 'node whose response is reported (with --dof)' },
    { name: 'dof', kind: 'string', value: 'DOF', help: 'its DOF: ux uy uz (m) or rx ry rz (rad)' },
    { name: 'sweep', kind: 'string', value: 'F1:F2:STEPS', help: 'excitation frequencies from F1 to F2 Hz in STEPS points; the natural frequencies inside are added' },
    { name: 'load', kind: 'string', value: 'NODE:DOF:VALUE,...', help: 'harmonic force amplitudes, e.g. m3:uz:280 (N; N·m on a rotation), comma-separated for several (default: 1 N at the response DOF)' },
    { name: 'damping', kind: 'number', value: 'RATIO', help: `damping ratio of every mode, fraction of critical (default ${(HARMONIC_DEFAULTS.damping as { ratio: number }).ratio})` },
    { name: 'walker', kind: 'count', value: 'MODE', help: 'one walker in resonance with mode MODE, at its antinode (700 N × dynamic load factor, from memory)' },
    { name: 'comfort-limit', kind: 'number', value: 'M/S2', help: 'with --walker: acceleration limit from the governing guidance, m/s²' },
    { name: 'count', kind: 'count', value: 'N', help: 'superpose the lowest N modes (default: every mode up to twice the highest frequency of interest)' },
    { name: 'svg', kind: 'file', value: 'FILE', help: 'with --sweep: also write the acceleration curve as an SVG chart, bands shaded, natural frequencies marked' },
    { name: 'preset', kind: 'string', value: 'NAMES', help: 'with --svg: built-in bands to shade, comma-separated (default: the four walking bands)' },
    { name: 'band', kind: 'string', value: 'SPECS', help: 'with --svg: bands of your own to shade, comma-separated NAME:F1:F2:DIRECTION' },
    { name: 'json', kind: 'flag', help: 'print one JSON object instead of the report' },
    { name: 'output', kind: 'file', value: 'FILE', help: 'write the report to FILE (all or nothing) instead of standard output' },
    { name: 'help', kind: 'flag', help: 'show this help' },
  ],
  notes: [
    'Classical (modal) damping; amplitudes of the steady state, phases relative to the load.',
    'A response is a screening figure: comfort and safety are decided by the local codes and a licensed engineer.',
  ],
};

/** Fewest modes the command superposes when --count is not given. */
export const MIN_RESPONSE_MODES = 12;

function dofName(text: string, option: string): DofName {
  if (!DOF_NAMES.includes(text as DofName)) throw new ArgumentError(`"${text}" is not a DOF; use ${DOF_NAMES.join(', ')}`, option);
  return text as DofName;
}

function parseSweep(text: string): [number, number, number] {
  const parts = text.split(':');
  const nums = parts.map((s) => Number(s));
  if (parts.length !== 3 || parts.some((s) => s.trim() === '') || !nums.every((v) => Number.isFinite(v))) {
    throw new ArgumentError(`"${text}" is not F1:F2:STEPS; write e.g. 1:12:200`, '--sweep');
  }
  const [f1, f2, steps] = nums;
  if (f1 < 0) throw new ArgumentError(`F1 = ${f1} Hz is negative`, '--sweep');
  if (!(f2 > f1)) throw new ArgumentError(`F2 = ${f2} Hz is not above F1 = ${f1} Hz`, '--sweep');
  if (!Number.isInteger(steps) || steps < 2 || steps > 100000) throw new ArgumentError(`STEPS = ${steps} is not a whole number from 2 to 100000`, '--sweep');
  return [f1, f2, steps];
}

/** Runs `response`. */
export function runResponse(args: ParsedArgs): CommandOutput {
  const o = args.options;
  const modelPath = args.positionals[0];
  if (modelPath === undefined) throw new ArgumentError('no model given; write "eigenframe response MODEL.json ..."', 'response');
  const walker = o.walker !== undefined;
  if (walker && o.sweep !== undefined) throw new ArgumentError('choose a sweep or a walker, not both', '--walker');
  if (!walker && o.sweep === undefined) throw new ArgumentError('say what to compute: --sweep F1:F2:STEPS with --node and --dof, or --walker MODE', 'response');
  if (!walker && o['comfort-limit'] !== undefined) throw new ArgumentError('goes with --walker', '--comfort-limit');
  for (const opt of ['preset', 'band'] as const) {
    if (o[opt] !== undefined && o.svg === undefined) throw new ArgumentError('goes with --svg (the bands are shaded on the chart); add --svg FILE', `--${opt}`);
  }
  if (walker && o.svg !== undefined) throw new ArgumentError('a chart is drawn for a sweep; use --sweep with --node and --dof, or remove --svg', '--svg');
  const chartBands = o.svg === undefined ? [] : validateBands(screenBands(o));
  if (walker && (o.node !== undefined || o.dof !== undefined || o.load !== undefined)) {
    throw new ArgumentError('a walker is placed at the antinode of its mode; remove --node, --dof and --load', o.node !== undefined ? '--node' : o.dof !== undefined ? '--dof' : '--load');
  }
  let damping: Damping = HARMONIC_DEFAULTS.damping;
  if (o.damping !== undefined) {
    const z = Number(o.damping);
    if (!(z >= 0 && z < 1)) throw new ArgumentError(`${z} is not a damping ratio in [0, 1); give a fraction of critical such as 0.01`, '--damping');
    damping = { kind: 'constant', ratio: z };
  }
  const path = String(modelPath);
  const model = parseModel(readText(path, 'model file'), path);
  const title = model.title ?? '';
  const assembled = assemble(model);
  const modesUpTo = (fTop: number) => {
    if (o.count !== undefined) return modalAnalysis(assembled, { count: Number(o.count) });
    // Every mode up to twice the top frequency of interest (the quasi-static contribution of
    // the modes above falls off as 1/ω²), and never fewer than the lowest MIN_RESPONSE_MODES.
    const a = modalAnalysis(assembled, { range: [0, eigenvalueOf(2 * fTop)] });
    const least = Math.min(MIN_RESPONSE_MODES, assembled.dofs.length);
    return a.modes.length >= least ? a : modalAnalysis(assembled, { count: least });
  };

  let text: string;
  let chart: string | undefined;
  if (walker) {
    const mode = Number(o.walker);
    // Lowest `mode` modes first, to know the mode's frequency; then all up to twice it.
    const first = modalAnalysis(assembled, { count: mode });
    const analysis = o.count !== undefined ? modesUpTo(0) : modesUpTo(first.modes[mode - 1].frequency);
    if (analysis.modes.length < mode) throw new ArgumentError(`only ${analysis.modes.length} modes were computed; raise --count to at least ${mode}`, '--count');
    const limit = o['comfort-limit'] === undefined ? undefined : Number(o['comfort-limit']);
    const r = pedestrianResponse(analysis, { mode, damping, ...(limit !== undefined ? { comfortLimit: limit } : {}) });
    text = o.json ? JSON.stringify(pedestrianJsonObject(r, title), null, 2) + '\n' : formatPedestrianText(r, title);
  } else {
    if (o.node === undefined) throw new ArgumentError('the response DOF needs --node ID (with --dof)', '--node');
    if (o.dof === undefined) throw new ArgumentError('the response DOF needs --dof (ux uy uz rx ry rz)', '--dof');
    const at = { node: String(o.node), dof: dofName(String(o.dof), '--dof') };
    const [f1, f2, steps] = parseSweep(String(o.sweep));
    const analysis = modesUpTo(f2);
    const loads = o.load === undefined ? [{ ...at, value: 1 }] : parseNodalLoads(String(o.load));
    const freqs = frequencySweep(f1, f2, steps, { include: analysis.modes.map((m) => m.frequency) });
    let r;
    try {
      r = harmonicResponse(analysis, { load: loads, at: [at], frequencies: freqs, damping });
    } catch (e) {
      // Library paths name the option of the library; the user wrote command-line options.
      if (e instanceof ArgumentError && e.path.startsWith('at[')) throw new ArgumentError(e.detail, '--node');
      if (o.load === undefined && e instanceof ArgumentError && e.path.startsWith('load')) throw new ArgumentError(e.detail, '--node');
      throw loadErrorAsOption(e, 'load', '--load', loads);
    }
    const loadText = loads.map((l) => `${l.value} N at node ${l.node} ${l.dof}`).join(' + ');
    const about = { title, load: loadText };
    text = o.json ? JSON.stringify(harmonicJsonObject(r, about), null, 2) + '\n' : formatHarmonicText(r, about);
    if (o.svg !== undefined) {
      chart = frequencyResponseSvg(r, { bands: chartBands, naturalFrequencies: analysis.modes.map((md) => md.frequency), title: `${title ? `${title}: ` : ''}acceleration at node ${at.node} ${at.dof}` });
    }
  }
  // Report and chart are written together or not at all.
  const files: Array<{ path: string; content: string; what: string }> = [];
  if (o.output !== undefined) files.push({ path: String(o.output), content: text, what: 'report' });
  if (chart !== undefined) files.push({ path: String(o.svg), content: chart + '\n', what: 'chart' });
  if (files.length > 0) writeFilesAtomically(files);
  const notes = files.map((f) => `eigenframe: ${f.what} written to ${f.path}\n`).join('');
  return o.output !== undefined ? { stdout: '', stderr: notes } : { stdout: text, stderr: notes };
}
