/**
 * `eigenframe report`: one self-contained HTML file with the model summary, the modes table,
 * the effective-mass chart, a picture of each mode, optionally linear buckling, and the
 * verification figures. Written all or nothing.
 */
import { ArgumentError } from '../../errors';
import type { CommandSpec, ParsedArgs } from '../args';
import { readText, writeFilesAtomically } from '../files';
import type { CommandOutput } from '../output';
import { parseModel } from '../../model/read';
import { modalAnalysis } from '../../modal/analysis';
import { htmlReport } from '../../io/report-html';
import { runBucklingAnalysis } from './buckling';
import { DEFAULT_COUNT } from '../requests';

export const REPORT_SPEC: CommandSpec = {
  name: 'report',
  summary: 'a self-contained HTML report: modes, effective mass, mode pictures, verification',
  usage: [
    'report MODEL.json --output FILE.html [--count N] [--pictures N] [--title TEXT]',
    'report MODEL.json --output FILE.html --load NODE:DOF:VALUE,... [--load-factors N]   (adds linear buckling)',
  ],
  positionals: { name: 'model file', max: 1 },
  options: [
    { name: 'output', kind: 'file', value: 'FILE', help: 'the HTML file to write (required)' },
    { name: 'count', kind: 'count', value: 'N', help: `number of modes, lowest first (default ${DEFAULT_COUNT})` },
    { name: 'pictures', kind: 'string', value: 'N', help: 'modes drawn, lowest first (default all, at most 24; 0 for none)' },
    { name: 'title', kind: 'string', value: 'TEXT', help: 'report title (default: the model title)' },
    { name: 'lumped', kind: 'flag', help: 'use lumped mass, whatever the model says' },
    { name: 'load', kind: 'string', value: 'NODE:DOF:VALUE,...', help: 'add a linear buckling section for this reference load case (N; N·m on rotations)' },
    { name: 'load-factors', kind: 'count', value: 'N', help: 'with --load: buckling load factors reported (default 4)' },
    { name: 'help', kind: 'flag', help: 'show this help' },
  ],
  notes: ['The file has no scripts and no external links; it prints as it shows.'],
};

/** Runs `report`; writes the file and returns a short confirmation on standard error. */
export function runReport(args: ParsedArgs): CommandOutput {
  const o = args.options;
  const path = args.positionals[0];
  if (path === undefined) throw new ArgumentError('no model given; write "eigenframe report MODEL.json --output report.html"', 'report');
  if (o.output === undefined) throw new ArgumentError('the report needs a file to go to; add --output report.html', '--output');
  if (o['load-factors'] !== undefined && o.load === undefined) throw new ArgumentError('goes with --load; add the reference load case or remove --load-factors', '--load-factors');
  let pictures: number | undefined;
  if (o.pictures !== undefined) {
    const raw = String(o.pictures).trim();
    if (!/^\d+$/.test(raw)) throw new ArgumentError(`"${raw}" is not a whole number; give 0 or more`, '--pictures');
    pictures = Number(raw);
  }
  const text = readText(path, 'model file');
  const model = parseModel(text, path);
  if (o.lumped) model.mass = 'lumped';
  const count = o.count === undefined ? DEFAULT_COUNT : Number(o.count);
  const analysis = modalAnalysis(model, { count });
  if (pictures !== undefined && pictures > analysis.modes.length) {
    throw new ArgumentError(`${pictures} pictures asked for but ${analysis.modes.length} modes solved; give at most ${analysis.modes.length} or raise --count`, '--pictures');
  }
  const buckling = o.load === undefined ? undefined : runBucklingAnalysis(text, path, String(o.load), '--load', o['load-factors'] === undefined ? undefined : Number(o['load-factors']), 'auto');
  const html = htmlReport(analysis, {
    source: path.split(/[\\/]/).pop(),
    ...(o.title !== undefined ? { title: String(o.title) } : {}),
    ...(pictures !== undefined ? { shapes: pictures } : {}),
    ...(buckling ? { buckling } : {}),
  });
  writeFilesAtomically([{ path: String(o.output), content: html }]);
  return { stdout: '', stderr: `eigenframe: report written to ${String(o.output)} (${analysis.modes.length} modes${buckling ? `, ${buckling.loadFactors.length} buckling load factors` : ''})\n` };
}
