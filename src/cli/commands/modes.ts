/**
 * `eigenframe modes`: natural frequencies and mode shapes of a model file, or of a user's own
 * K and M given as Matrix Market files.
 */
import { ArgumentError } from '../../errors';
import type { CommandSpec, ParsedArgs } from '../args';
import { readText, writeFilesAtomically } from '../files';
import { parseModel } from '../../model/read';
import { modalAnalysis } from '../../modal/analysis';
import { solve, type SolveMethod, type SolveOptions } from '../../eigen/solve';
import { readMatrixMarket } from '../../io/matrix-market';
import { formatModesText, formatMatrixModesText } from '../../io/report-text';
import { modesJsonObject, matrixModesJsonObject } from '../../io/report-json';
import type { CommandOutput } from '../output';
import { frequencyRequest } from '../requests';
import { createProgress } from '../progress';

export const MODES_SPEC: CommandSpec = {
  name: 'modes',
  summary: 'natural frequencies, periods, mode shapes and effective mass of a structure',
  usage: [
    'modes MODEL.json [--count N] [--json] [--shapes] [--output FILE]',
    'modes MODEL.json --from F1 --to F2        (every mode between F1 and F2 Hz)',
    'modes MODEL.json --near F [--count N]     (the N modes nearest F Hz)',
    'modes --stiffness K.mtx --mass M.mtx [--count N] [--json]',
  ],
  positionals: { name: 'model file', max: 1 },
  options: [
    { name: 'count', kind: 'count', value: 'N', help: 'number of modes, lowest first (default 12; with --near, nearest first)' },
    { name: 'from', kind: 'number', value: 'F1', help: 'lower end of a frequency window, Hz (with --to)' },
    { name: 'to', kind: 'number', value: 'F2', help: 'upper end of a frequency window, Hz (with --from)' },
    { name: 'near', kind: 'number', value: 'F', help: 'target frequency, Hz: return the modes nearest to it' },
    { name: 'method', kind: 'string', value: 'NAME', help: 'auto (default), dense, jacobi, cholesky, lanczos or subspace' },
    { name: 'lumped', kind: 'flag', help: 'use lumped mass, whatever the model says' },
    { name: 'stiffness', kind: 'file', value: 'K.mtx', help: 'stiffness matrix in Matrix Market format (with --mass)' },
    { name: 'mass', kind: 'file', value: 'M.mtx', help: 'mass matrix in Matrix Market format (with --stiffness)' },
    { name: 'json', kind: 'flag', help: 'print one JSON object instead of the table' },
    { name: 'shapes', kind: 'flag', help: 'with --json: include each mode shape and the DOF map' },
    { name: 'output', kind: 'file', value: 'FILE', help: 'write the report to FILE (all or nothing) instead of standard output' },
    { name: 'help', kind: 'flag', help: 'show this help' },
  ],
  notes: [
    'Units are SI: frequencies in Hz, eigenvalues in rad²/s², masses in kg.',
    'Every result is verified (residual, M-orthonormality, Sturm count) before it is printed.',
  ],
};

/** Runs `modes`; returns the text to print (or write). */
export function runModes(args: ParsedArgs): CommandOutput {
  const o = args.options;
  const modelPath = args.positionals[0];
  const matrixMode = o.stiffness !== undefined || o.mass !== undefined;
  if (matrixMode && modelPath !== undefined) {
    throw new ArgumentError('give either a model file or --stiffness and --mass, not both', modelPath);
  }
  if (!matrixMode && modelPath === undefined) {
    throw new ArgumentError('no model given; write "eigenframe modes MODEL.json" or use --stiffness K.mtx --mass M.mtx', 'modes');
  }
  if (o.shapes && !o.json) throw new ArgumentError('goes with --json; add --json or remove --shapes', '--shapes');
  const request = frequencyRequest(o);
  const method = o.method === undefined ? 'auto' : String(o.method);
  const methods = ['auto', 'dense', 'jacobi', 'cholesky', 'lanczos', 'subspace'];
  if (!methods.includes(method)) throw new ArgumentError(`"${method}" is not a method; use one of ${methods.join(', ')}`, '--method');

  // A progress line on a terminal's stderr only; Ctrl-C ends the process at once (signals: null)
  // and the atomic writes of files.ts leave no partial output.
  const progress = createProgress(process.stderr, { signals: null });
  const solverOptions = { ...request, method: method as SolveMethod, onProgress: progress.onProgress };
  let text: string;
  try {
    text = matrixMode ? matrixReport(o, solverOptions) : modelReport(String(modelPath), o, solverOptions);
  } finally {
    progress.done();
  }
  if (o.output !== undefined) {
    writeFilesAtomically([{ path: String(o.output), content: text }]);
    return { stdout: '', stderr: `eigenframe: report written to ${String(o.output)}\n` };
  }
  return { stdout: text, stderr: '' };
}

type Options = ParsedArgs['options'];

/** Report of a user's own K, M pair. */
function matrixReport(o: Options, solverOptions: SolveOptions): string {
  if (o.stiffness === undefined) throw new ArgumentError('--mass needs --stiffness K.mtx as well', '--stiffness');
  if (o.mass === undefined) throw new ArgumentError('--stiffness needs --mass M.mtx as well', '--mass');
  if (o.lumped) throw new ArgumentError('applies to model files only; a Matrix Market mass is used as given', '--lumped');
  const kPath = String(o.stiffness);
  const mPath = String(o.mass);
  const K = readMatrixMarket(readText(kPath, 'stiffness matrix file'), kPath);
  const M = readMatrixMarket(readText(mPath, 'mass matrix file'), mPath);
  if (K.n !== M.n) {
    throw new ArgumentError(`is ${M.n} × ${M.n} but the stiffness matrix is ${K.n} × ${K.n}; give K and M of the same size`, mPath);
  }
  const eigen = solve(K, M, solverOptions);
  return o.json ? JSON.stringify(matrixModesJsonObject(eigen), null, 2) + '\n' : formatMatrixModesText(eigen);
}

/** Report of a model file. */
function modelReport(path: string, o: Options, solverOptions: SolveOptions): string {
  const model = parseModel(readText(path, 'model file'), path);
  if (o.lumped) model.mass = 'lumped';
  const result = modalAnalysis(model, solverOptions);
  return o.json ? JSON.stringify(modesJsonObject(result, { shapes: Boolean(o.shapes) }), null, 2) + '\n' : formatModesText(result);
}
