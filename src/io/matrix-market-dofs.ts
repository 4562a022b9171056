/**
 * DOF map that accompanies exported K.mtx and M.mtx: row/column r (1-based, as in the Matrix
 * Market files) ↔ node id and DOF name. Strings out; no file system access.
 */
import { ArgumentError } from '../errors';
import type { DofInfo } from '../model/types';

/** Output formats of {@link writeDofMap}. */
export type DofMapFormat = 'csv' | 'json';

/** Options of {@link writeDofMap}. */
export interface DofMapOptions {
  /** `csv` (header `row,node,dof`) or `json`. @defaultValue 'csv' */
  format?: DofMapFormat;
}

/** Defaults of {@link DofMapOptions}. */
export const DOF_MAP_DEFAULTS = { format: 'csv' } as const;

/** RFC 4180 quoting: a field with a comma, quote, CR or LF is quoted, quotes doubled. */
function csvField(s: string): string {
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * Writes the map from matrix row to node and DOF.
 *
 * CSV: header `row,node,dof`, then one line per free DOF, `row` 1-based (the row and column of
 * that DOF in the Matrix Market files), node ids quoted per RFC 4180 when needed.
 * JSON: `{ "format": "eigenframe-dofs/1", "indexBase": 1, "dofs": [{ "row": 1, "node": "a",
 * "dof": "ux" }, …] }`.
 *
 * @param dofs - free DOFs, `dofs[i]` is row i + 1 of K and M (`AssembledModel.dofs`)
 * @returns the file text, ending with a newline
 * @throws ArgumentError (path `format`) for an unknown format
 */
export function writeDofMap(dofs: readonly DofInfo[], options: DofMapOptions = {}): string {
  const { format } = { ...DOF_MAP_DEFAULTS, ...options };
  if (format === 'csv') {
    const parts = ['row,node,dof\n'];
    for (let i = 0; i < dofs.length; i++) parts.push(`${i + 1},${csvField(dofs[i].node)},${dofs[i].dof}\n`);
    return parts.join('');
  }
  if (format === 'json') {
    const body = dofs.map((d, i) => `    ${JSON.stringify({ row: i + 1, node: d.node, dof: d.dof })}`).join(',\n');
    return `{\n  "format": "eigenframe-dofs/1",\n  "indexBase": 1,\n  "dofs": [\n${body}${dofs.length ? '\n' : ''}  ]\n}\n`;
  }
  throw new ArgumentError(`format "${String(format)}" is unknown; use "csv" or "json"`, 'format');
}
