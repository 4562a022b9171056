/**
 * `eigenframe export`: writes a model's assembled K and M over the free DOFs as Matrix Market
 * files, with the DOF map, so users can compare with their own solvers.
 */
import { join } from 'node:path';
import { ArgumentError } from '../../errors';
import type { CommandSpec, ParsedArgs } from '../args';
import { readText, writeFilesAtomically } from '../files';
import { parseModel } from '../../model/read';
import { assemble } from '../../model/assemble';
import { writeMatrixMarket, writeDofMap } from '../../io/matrix-market';
import type { CommandOutput } from '../output';

export const EXPORT_SPEC: CommandSpec = {
  name: 'export',
  summary: "write a model's assembled stiffness and mass (free DOFs) as Matrix Market files, with the DOF map",
  usage: ['export MODEL.json --dir FOLDER [--name NAME] [--lumped]'],
  positionals: { name: 'model file', max: 1 },
  options: [
    { name: 'dir', kind: 'file', value: 'FOLDER', help: 'folder to write into (created if missing)' },
    { name: 'name', kind: 'string', value: 'NAME', help: 'file name stem (default: the model file name): NAME.K.mtx, NAME.M.mtx, NAME.dofs.json' },
    { name: 'lumped', kind: 'flag', help: 'use lumped mass, whatever the model says' },
    { name: 'help', kind: 'flag', help: 'show this help' },
  ],
  notes: ['K is in N/m (N·m/rad on rotations), M in kg (kg·m² on rotations); both coordinate real symmetric, lower triangle.'],
};

export function runExport(args: ParsedArgs): CommandOutput {
  const path = args.positionals[0];
  if (path === undefined) throw new ArgumentError('no model given; write "eigenframe export MODEL.json --dir FOLDER"', 'export');
  if (args.options.dir === undefined) throw new ArgumentError('is required; say where to write, e.g. --dir out', '--dir');
  const model = parseModel(readText(path, 'model file'), path);
  if (args.options.lumped) model.mass = 'lumped';
  const asm = assemble(model);
  const stem = args.options.name !== undefined ? String(args.options.name) : path.replace(/^.*[\\/]/, '').replace(/\.json$/i, '');
  if (/[\\/]/.test(stem)) throw new ArgumentError(`"${stem}" contains a path separator; give a plain name`, '--name');
  const dir = String(args.options.dir);
  const title = model.title ? ` of ${model.title}` : '';
  const files = [
    { path: join(dir, `${stem}.K.mtx`), content: writeMatrixMarket(asm.stiffness, `stiffness${title}, free DOFs, N/m and N·m/rad`) },
    { path: join(dir, `${stem}.M.mtx`), content: writeMatrixMarket(asm.mass, `mass${title}, free DOFs, kg and kg·m²`) },
    { path: join(dir, `${stem}.dofs.json`), content: writeDofMap(asm.dofs, { format: 'json' }) },
  ];
  writeFilesAtomically(files);
  return { stdout: files.map((f) => f.path).join('\n') + '\n', stderr: `eigenframe: ${asm.dofs.length} free DOFs written\n` };
}
