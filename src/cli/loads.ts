/**
 * Nodal loads on the command line: `NODE:DOF:VALUE[,NODE:DOF:VALUE...]`, one syntax for every
 * command that takes loads (buckling, response).
 */
import { ArgumentError } from '../errors';
import { DOF_NAMES } from '../model/dofs';
import type { NodalLoad } from '../model/loads';
import type { DofName } from '../model/types';

/**
 * Parses `NODE:DOF:VALUE[,NODE:DOF:VALUE...]` into nodal loads. A node id that contains ":" is
 * read up to the last two colons.
 * @param text - the option's value
 * @param option - the option name used in errors, e.g. `--load`
 * @throws ArgumentError (path = option) naming the malformed item
 */
export function parseNodalLoads(text: string, option = '--load'): NodalLoad[] {
  const items = text.split(',').map((s) => s.trim());
  return items.map((item, i) => {
    const which = items.length > 1 ? `load ${i + 1} ("${item}")` : `"${item}"`;
    const b = item.lastIndexOf(':');
    const a = b > 0 ? item.lastIndexOf(':', b - 1) : -1;
    if (a <= 0) throw new ArgumentError(`${which} is not NODE:DOF:VALUE; write e.g. top:uy:-1000`, option);
    const node = item.slice(0, a);
    const dof = item.slice(a + 1, b);
    const raw = item.slice(b + 1);
    if (!(DOF_NAMES as readonly string[]).includes(dof)) throw new ArgumentError(`${which} names DOF "${dof}"; use one of ${DOF_NAMES.join(', ')}`, option);
    const value = Number(raw);
    if (raw.trim() === '' || !Number.isFinite(value)) throw new ArgumentError(`${which} has value "${raw}", not a finite number; give the load in N (N·m on rotations)`, option);
    return { node, dof: dof as DofName, value };
  });
}

/**
 * Re-labels a library error about `${path}[i]…` with the command-line option the loads came
 * from, naming the load; other errors pass through.
 */
export function loadErrorAsOption(e: unknown, path: string, option: string, loads: readonly NodalLoad[]): unknown {
  if (e instanceof ArgumentError && (e.path === path || e.path.startsWith(`${path}[`))) {
    const m = /^[^[]*\[(\d+)\]/.exec(e.path);
    const l = m ? loads[Number(m[1])] : undefined;
    const which = l ? ` (load ${Number(m![1]) + 1}, ${l.node}:${l.dof})` : '';
    return new ArgumentError(`${e.detail}${which}`, option);
  }
  return e;
}
