/**
 * `eigenframe buckling`: critical load factors and buckled shapes of a model under a reference
 * load case given on the command line.
 */
import { ArgumentError } from '../../errors';
import type { CommandSpec, ParsedArgs } from '../args';
import { readText, writeFilesAtomically } from '../files';
import type { CommandOutput } from '../output';
import { parseModel } from '../../model/read';
import type { NodalLoad } from '../../model/loads';
import { bucklingAnalysis, type BucklingResult } from '../../modal/buckling';
import { loadErrorAsOption, parseNodalLoads } from '../loads';
import { ENGINEERING_CAUTION } from '../../io/caution';
import { significant } from '../../io/number-format';

/** `digits` significant figures; ±∞ and NaN as JavaScript writes them. */
const sig = (v: number, digits = 5): string => (Number.isFinite(v) ? significant(v, digits) : String(v));

export const BUCKLING_SPEC: CommandSpec = {
  name: 'buckling',
  summary: 'critical load factors and buckled shapes under a reference load case',
  usage: [
    'buckling MODEL.json --load NODE:DOF:VALUE[,NODE:DOF:VALUE...] [--count N] [--json]',
  ],
  positionals: { name: 'model file', max: 1 },
  options: [
    { name: 'load', kind: 'string', value: 'NODE:DOF:VALUE,...', help: 'the reference load case: nodal loads separated by commas, e.g. top:uy:-1000 (N; N·m on rotations)' },
    { name: 'count', kind: 'count', value: 'N', help: 'number of load factors, lowest first (default 4)' },
    { name: 'method', kind: 'string', value: 'NAME', help: 'auto (default), dense or lanczos' },
    { name: 'json', kind: 'flag', help: 'print one JSON object instead of the table' },
    { name: 'shapes', kind: 'flag', help: 'with --json: include each buckled shape and the DOF map' },
    { name: 'output', kind: 'file', value: 'FILE', help: 'write the report to FILE (all or nothing) instead of standard output' },
    { name: 'help', kind: 'flag', help: 'show this help' },
  ],
  notes: [
    'The structure buckles, by linear theory, under (load factor) × (the load case). Axial forces come from a linear static solve under the load case.',
    'A node id that contains ":" is read up to the last two colons; ids with "," cannot be loaded here.',
  ],
};

/** Runs the analysis for the CLI, with load errors named by `option`. */
export function runBucklingAnalysis(modelText: string, source: string, loadText: string, option: string, count: number | undefined, method: string): BucklingResult {
  const model = parseModel(modelText, source);
  const loads = parseNodalLoads(loadText, option);
  const methods = ['auto', 'dense', 'lanczos'];
  if (!methods.includes(method)) throw new ArgumentError(`"${method}" is not a method for buckling; use one of ${methods.join(', ')}`, '--method');
  try {
    return bucklingAnalysis(model, loads, { ...(count !== undefined ? { count } : {}), method: method as 'auto' });
  } catch (e) {
    throw loadErrorAsOption(e, 'loads', option, loads);
  }
}

/** Plain-text report of a buckling result. */
export function formatBucklingText(r: BucklingResult, loads: readonly NodalLoad[]): string {
  const model = r.assembled.model;
  const lines: string[] = [];
  if (model.title) lines.push(model.title);
  lines.push(`${r.assembled.dofs.length} free DOFs, ${model.elements.length} elements; reference load case: ${loads.map((l) => `${l.node} ${l.dof} ${sig(l.value)}`).join(', ')}`);
  lines.push('');
  const head = ['shape', 'load factor', 'residual'];
  const rows = Array.from(r.loadFactors, (mu, j) => [String(j + 1), sig(mu, 6), r.residuals[j].toExponential(1)]);
  const w = head.map((h, c) => Math.max(h.length, ...rows.map((x) => x[c].length)));
  const fmt = (x: string[]) => x.map((s, c) => s.padStart(w[c])).join('  ');
  lines.push(fmt(head), w.map((x) => '-'.repeat(x)).join('  '));
  for (const x of rows) lines.push(fmt(x));
  lines.push('');
  const order = Array.from(r.axialForce, (N, k) => [N, k] as const).filter(([N]) => N < 0).sort((a, b) => a[0] - b[0]).slice(0, 5);
  if (order.length) lines.push(`Most compressed members under the reference load: ${order.map(([N, k]) => `${model.elements[k].id} ${sig(N, 4)} N`).join(', ')}.`);
  if (r.sturm) {
    lines.push(r.sturm.passed
      ? `Sturm check passed: ${r.sturm.countBelow} positive load factor(s) below ${sig(r.sturm.shift, 5)}, none missed (method: ${r.method}).`
      : `Sturm check FAILED: ${r.sturm.countBelow} expected, ${r.sturm.returnedBelow} found.`);
  }
  lines.push('Linear buckling ignores imperfections, plasticity and large displacements; real capacities are lower.');
  lines.push(ENGINEERING_CAUTION);
  return lines.join('\n') + '\n';
}

/** The JSON object of a buckling result. */
export function bucklingJsonObject(r: BucklingResult, loads: readonly NodalLoad[], shapes = false): Record<string, unknown> {
  const n = r.assembled.stiffness.n;
  const model = r.assembled.model;
  const out: Record<string, unknown> = {
    format: 'eigenframe-buckling/1',
    title: model.title ?? '',
    dofCount: n,
    loads,
    modes: Array.from(r.loadFactors, (mu, j) => ({
      mode: j + 1,
      loadFactor: mu,
      residual: r.residuals[j],
      ...(shapes ? { shape: Array.from(r.shapes.subarray(j * n, (j + 1) * n)) } : {}),
    })),
    axialForces: model.elements.map((e, k) => ({ element: e.id, axialForce: r.axialForce[k] })),
    verification: { maxResidual: r.residuals.reduce((a, b) => Math.max(a, b), 0), sturm: r.sturm ? { ...r.sturm } : null },
    solver: { method: r.method, stats: r.stats },
    caution: ENGINEERING_CAUTION,
  };
  if (shapes) out.dofs = r.assembled.dofs.map((d) => ({ node: d.node, dof: d.dof }));
  return out;
}

/** Runs `buckling`; returns the text to print (or write). */
export function runBuckling(args: ParsedArgs): CommandOutput {
  const o = args.options;
  const path = args.positionals[0];
  if (path === undefined) throw new ArgumentError('no model given; write "eigenframe buckling MODEL.json --load NODE:DOF:VALUE"', 'buckling');
  if (o.load === undefined) throw new ArgumentError('the reference load case is missing; add --load NODE:DOF:VALUE (several separated by commas)', '--load');
  if (o.shapes && !o.json) throw new ArgumentError('goes with --json; add --json or remove --shapes', '--shapes');
  const loads = parseNodalLoads(String(o.load));
  const r = runBucklingAnalysis(readText(path, 'model file'), path, String(o.load), '--load', o.count === undefined ? undefined : Number(o.count), o.method === undefined ? 'auto' : String(o.method));
  const text = o.json ? JSON.stringify(bucklingJsonObject(r, loads, Boolean(o.shapes)), null, 2) + '\n' : formatBucklingText(r, loads);
  if (o.output !== undefined) {
    writeFilesAtomically([{ path: String(o.output), content: text }]);
    return { stdout: '', stderr: `eigenframe: report written to ${String(o.output)}\n` };
  }
  return { stdout: text, stderr: '' };
}
