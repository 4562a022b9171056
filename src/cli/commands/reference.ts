/**
 * `eigenframe reference`: the closed-form reference cases, for checking a solver (eigenframe's
 * or one's own) against exact answers.
 *   reference list
 *   reference write ID|all --dir FOLDER [--mesh N]
 *   reference check ID RESULTS_FILE [--tolerance T] [--count N]
 */
import { join } from 'node:path';
import { ArgumentError } from '../../errors';
import type { CommandSpec, ParsedArgs } from '../args';
import { readText, writeFilesAtomically } from '../files';
import type { CommandOutput } from '../output';
import { validateModel } from '../../model/read';
import { assemble } from '../../model/assemble';
import { readMatrixMarket, writeMatrixMarket } from '../../io/matrix-market';
import { solve } from '../../eigen/solve';
import { eigenvalueToFrequency, frequencyToEigenvalue } from '../../modal/frequencies';
import { writeDofMap } from '../../io/matrix-market-dofs';
import { referenceCase, referenceCases } from '../../reference/catalogue';
import { compareValues, parseResults } from '../../reference/compare';
import type { ReferenceCase } from '../../reference/types';

export const REFERENCE_SPEC: CommandSpec = {
  name: 'reference',
  summary: 'closed-form reference cases: list them, write their models and exact values, check results against them',
  usage: [
    'reference list',
    'reference write ID|all --dir FOLDER [--mesh N]',
    'reference check ID RESULTS_FILE [--tolerance T] [--count N]',
    'reference check RESULTS_FILE --stiffness K.mtx --mass M.mtx [--tolerance T]',
  ],
  positionals: { name: 'arguments (list | write ID | check ID RESULTS_FILE)', max: 3 },
  options: [
    { name: 'dir', kind: 'file', value: 'FOLDER', help: 'write: folder to write into (created if missing)' },
    { name: 'mesh', kind: 'count', value: 'N', help: "write: mesh of the model (default: the case's stated mesh)" },
    { name: 'tolerance', kind: 'number', value: 'T', help: "check: largest accepted relative error (default: the case's stated tolerance)" },
    { name: 'count', kind: 'count', value: 'N', help: "check: number of lowest values compared (default: the case's stated count)" },
    { name: 'stiffness', kind: 'file', value: 'K.mtx', help: 'check: compare with our own solution of this stiffness matrix (with --mass) instead of a case' },
    { name: 'mass', kind: 'file', value: 'M.mtx', help: 'check: the mass matrix that goes with --stiffness' },
    { name: 'help', kind: 'flag', help: 'show this help' },
  ],
  notes: [
    'write produces, per case: ID.model.json (eigenframe-model/1), ID.expected.json (exact values,',
    'source, parameters), ID.K.mtx and ID.dofs.csv (assembled stiffness over the free DOFs, Matrix',
    'Market), and ID.M.mtx for frequency cases. Buckling cases list their reference load in ID.expected.json.',
    'check reads RESULTS_FILE as a JSON array of numbers, a JSON object with "modes" (eigenframe --json',
    'output: "frequency" or "eigenvalue"; buckling: "loadFactor" or "eigenvalue"), or plain text with',
    'one number per line (# starts a comment). Values are Hz, or load factors for buckling cases,',
    'lowest first. Exit status 1 when any compared value is missing or outside the tolerance.',
    'With --stiffness and --mass, the reference is eigenframe\'s own verified solution of that pair: the',
    'Sturm count up to your highest frequency says exactly how many modes lie there, so missing and',
    'extra (spurious) modes are both reported; the default tolerance is 1e-6.',
  ],
};

const SUBCOMMANDS = ['list', 'write', 'check'];

/** Runs `reference`; a failed check returns status 1. */
export function runReference(args: ParsedArgs): CommandOutput {
  const [sub, ...rest] = args.positionals;
  if (sub === undefined) {
    throw new ArgumentError('needs a subcommand; write "eigenframe reference list", "reference write ID --dir FOLDER" or "reference check ID RESULTS_FILE"', 'reference');
  }
  if (!SUBCOMMANDS.includes(sub)) {
    throw new ArgumentError(`"${sub}" is not a subcommand of reference; use list, write or check`, 'reference');
  }
  const allowed: Record<string, string[]> = { list: [], write: ['dir', 'mesh'], check: ['tolerance', 'count', 'stiffness', 'mass'] };
  for (const name of Object.keys(args.options)) {
    if (name !== 'help' && !allowed[sub].includes(name)) {
      throw new ArgumentError(`does not apply to "reference ${sub}"; remove it (see eigenframe reference --help)`, `--${name}`);
    }
  }
  if (sub === 'list') {
    if (rest.length) throw new ArgumentError(`unexpected argument "${rest[0]}"; "reference list" takes none`, 'reference');
    return { stdout: listText(), stderr: '' };
  }
  if (sub === 'write') return runWrite(rest, args.options);
  if (args.options.stiffness !== undefined || args.options.mass !== undefined) return runMatrixCheck(rest, args.options);
  return runCheck(rest, args.options);
}

function listText(): string {
  const cases = referenceCases();
  const w = Math.max(...cases.map((c) => c.id.length));
  const lines = [`${'id'.padEnd(w)}  quantity   count  mesh  tolerance  description`];
  for (const c of cases) {
    lines.push(`${c.id.padEnd(w)}  ${c.quantity.padEnd(9)}  ${String(c.count).padStart(5)}  ${String(c.mesh).padStart(4)}  ${c.tolerance.toExponential(0).padStart(9)}  ${c.description}`);
  }
  lines.push('', `${cases.length} cases. "mesh": elements (per span for beam-two-span) at which eigenframe's own`, 'discretisation reaches "tolerance" on the first "count" values. Sources and parameters: the ID.expected.json', 'that "eigenframe reference write ID --dir FOLDER" produces.');
  return lines.join('\n') + '\n';
}

function unitOf(c: ReferenceCase): string {
  return c.quantity === 'frequency' ? 'Hz' : 'load factor';
}

/** The expected-values document of a case at a mesh (serialise with JSON.stringify). */
function expectedObject(c: ReferenceCase, mesh: number): Record<string, unknown> {
  const o: Record<string, unknown> = {
    format: 'eigenframe-reference/1',
    id: c.id,
    description: c.description,
    source: c.source,
    quantity: c.quantity,
    unit: unitOf(c),
    parameters: c.parameters,
    mesh,
    meshUnit: c.meshUnit,
    stated: { mesh: c.mesh, count: c.count, tolerance: c.tolerance },
    values: c.exact(c.count),
  };
  if (c.loads) o.loads = c.loads(mesh);
  return o;
}

function runWrite(rest: string[], o: ParsedArgs['options']): CommandOutput {
  const [id, extra] = rest;
  if (id === undefined) throw new ArgumentError('write needs a case id or "all"; run "eigenframe reference list" for the ids', 'reference');
  if (extra !== undefined) throw new ArgumentError(`unexpected argument "${extra}"; "reference write" takes one id`, extra);
  if (o.dir === undefined) throw new ArgumentError('is required; say where to write, e.g. --dir reference-cases', '--dir');
  const dir = String(o.dir);
  const cases = id === 'all' ? referenceCases() : [referenceCase(id)];
  const files: { path: string; content: string }[] = [];
  let dofCount = 0;
  for (const c of cases) {
    const mesh = o.mesh === undefined ? c.mesh : Number(o.mesh);
    const model = c.build(mesh);
    const text = JSON.stringify(model, null, 2) + '\n';
    const asm = assemble(validateModel(JSON.parse(text)));
    dofCount += asm.dofs.length;
    files.push({ path: join(dir, `${c.id}.model.json`), content: text });
    files.push({ path: join(dir, `${c.id}.expected.json`), content: JSON.stringify(expectedObject(c, mesh), null, 2) + '\n' });
    files.push({ path: join(dir, `${c.id}.K.mtx`), content: writeMatrixMarket(asm.stiffness, `stiffness of reference case ${c.id}, mesh ${mesh}, free DOFs, N/m and N·m/rad`) });
    if (c.quantity === 'frequency') {
      files.push({ path: join(dir, `${c.id}.M.mtx`), content: writeMatrixMarket(asm.mass, `mass of reference case ${c.id}, mesh ${mesh}, free DOFs, kg and kg·m²`) });
    }
    files.push({ path: join(dir, `${c.id}.dofs.csv`), content: writeDofMap(asm.dofs) });
  }
  writeFilesAtomically(files);
  return { stdout: files.map((f) => f.path).join('\n') + '\n', stderr: `eigenframe: ${cases.length} reference case${cases.length === 1 ? '' : 's'} written (${dofCount} free DOFs in all)\n` };
}

function fmt(v: number): string {
  return v === 0 ? '0' : v.toPrecision(9);
}

function runCheck(rest: string[], o: ParsedArgs['options']): CommandOutput {
  const [id, file] = rest;
  if (id === undefined) throw new ArgumentError('check needs a case id and a results file; run "eigenframe reference list" for the ids', 'reference');
  if (file === undefined) throw new ArgumentError(`check needs a results file after the id; write "eigenframe reference check ${id} RESULTS_FILE"`, 'reference');
  const c = referenceCase(id);
  const tolerance = o.tolerance === undefined ? c.tolerance : Number(o.tolerance);
  if (!(tolerance > 0)) throw new ArgumentError(`${tolerance} is not a relative tolerance; give a number > 0 such as 1e-3`, '--tolerance');
  const count = o.count === undefined ? c.count : Number(o.count);
  const actual = parseResults(readText(file, 'results file'), file, c.quantity);
  const result = compareValues(c.exact(count), actual, tolerance);

  const header = [
    `${c.id}: ${c.description}`,
    `Exact values: ${c.source}.`,
    `Stated: eigenframe reaches ${c.tolerance.toExponential(0)} on ${c.count} values at ${c.mesh} ${c.meshUnit}.`,
    `Results: ${file} (${actual.length} value${actual.length === 1 ? '' : 's'}); relative tolerance ${tolerance.toExponential(1)}.`,
  ];
  return checkReport(header, result, { unit: unitOf(c), reference: 'exact', file, label: `reference check ${c.id}`, extraFails: false });
}

/** `reference check RESULTS_FILE --stiffness K.mtx --mass M.mtx`: the user's frequencies against our solution of their pair. */
function runMatrixCheck(rest: string[], o: ParsedArgs['options']): CommandOutput {
  if (o.stiffness === undefined) throw new ArgumentError('--mass needs --stiffness K.mtx as well', '--stiffness');
  if (o.mass === undefined) throw new ArgumentError('--stiffness needs --mass M.mtx as well', '--mass');
  if (o.count !== undefined) throw new ArgumentError('does not apply with --stiffness: every mode up to your highest frequency is compared', '--count');
  const [file, more] = rest;
  if (file === undefined) throw new ArgumentError('check needs a results file; write "eigenframe reference check RESULTS_FILE --stiffness K.mtx --mass M.mtx"', 'reference');
  if (more !== undefined) throw new ArgumentError(`unexpected argument "${more}"; with --stiffness, check takes only the results file`, more);
  const tolerance = o.tolerance === undefined ? MATRIX_CHECK_TOLERANCE : Number(o.tolerance);
  if (!(tolerance > 0)) throw new ArgumentError(`${tolerance} is not a relative tolerance; give a number > 0 such as 1e-6`, '--tolerance');
  const kPath = String(o.stiffness);
  const mPath = String(o.mass);
  const K = readMatrixMarket(readText(kPath, 'stiffness matrix file'), kPath);
  const M = readMatrixMarket(readText(mPath, 'mass matrix file'), mPath);
  if (K.n !== M.n) throw new ArgumentError(`is ${M.n} × ${M.n} but the stiffness matrix is ${K.n} × ${K.n}; give K and M of the same size`, mPath);
  const actual = parseResults(readText(file, 'results file'), file, 'frequency');
  if (actual.length === 0) throw new ArgumentError('holds no values; list your frequencies in Hz, lowest first', file);
  // Every eigenvalue up to the user's highest frequency (widened by the tolerance): the Sturm
  // counts at both ends of the window make the reference count exact, so missing and spurious
  // modes both show.
  const top = frequencyToEigenvalue(Math.max(...actual)) * (1 + tolerance) ** 2;
  const eigen = solve(K, M, { range: [-Math.max(1e-9, 1e-6 * top), Math.max(top, 1e-9)] });
  const ours = Array.from(eigen.eigenvalues, eigenvalueToFrequency);
  const result = compareValues(ours.length ? ours : [0], actual, tolerance);
  const header = [
    `Your results ${file} (${actual.length} value${actual.length === 1 ? '' : 's'}) against eigenframe's solution of ${kPath} and ${mPath} (${K.n} DOFs, ${eigen.method}).`,
    `Sturm count: ${ours.length} mode${ours.length === 1 ? '' : 's'} up to ${eigenvalueToFrequency(top).toPrecision(6)} Hz; relative tolerance ${tolerance.toExponential(1)}.`,
  ];
  return checkReport(header, result, { unit: 'Hz', reference: 'ours', file, label: 'reference check against K and M', extraFails: true });
}

/** Default tolerance of a check against our own solution of the same K and M. */
const MATRIX_CHECK_TOLERANCE = 1e-6;

/** The comparison table, verdict and exit status of a check. */
function checkReport(
  header: string[],
  result: ReturnType<typeof compareValues>,
  how: { unit: string; reference: string; file: string; label: string; extraFails: boolean },
): CommandOutput {
  const { unit, tolerance } = { unit: how.unit, tolerance: result.tolerance };
  const lines = [...header, ''];
  const head = ['mode', `${how.reference} (${unit})`, `yours (${unit})`, 'rel. error', 'result'];
  const rows = result.rows.map((r) => [
    String(r.mode),
    fmt(r.expected),
    r.actual === null ? 'missing' : fmt(r.actual),
    r.relativeError === null ? '-' : r.relativeError.toExponential(2),
    r.passed ? 'ok' : r.actual === null ? 'MISSING' : 'FAIL',
  ]);
  result.extra.forEach((v, k) => rows.push([String(result.rows.length + k + 1), '-', fmt(v), '-', how.extraFails ? 'EXTRA' : 'not checked']));
  const widths = head.map((h, k) => Math.max(h.length, ...rows.map((r) => r[k].length)));
  const line = (cells: string[]) => cells.map((s, k) => (k === cells.length - 1 ? s : s.padStart(widths[k]))).join('  ');
  lines.push(line(head), ...rows.map(line), '');
  const within = result.rows.filter((r) => r.passed).length;
  const passed = result.passed && !(how.extraFails && result.extra.length > 0);
  const extra = result.extra.length
    ? how.extraFails
      ? `; ${result.extra.length} extra value${result.extra.length === 1 ? '' : 's'} (no such mode below your highest frequency)`
      : `; ${result.extra.length} further value${result.extra.length === 1 ? '' : 's'} not checked`
    : '';
  lines.push(`${passed ? 'PASS' : 'FAIL'}: ${within} of ${result.rows.length} values within ${tolerance.toExponential(1)} (largest relative error ${result.maxRelativeError.toExponential(2)})${result.missing ? `; ${result.missing} missing` : ''}${extra}`);
  return {
    stdout: lines.join('\n') + '\n',
    stderr: passed ? '' : `eigenframe: ${how.file}: ${how.label} failed; see the table for the modes outside the tolerance\n`,
    status: passed ? 0 : 1,
  };
}


