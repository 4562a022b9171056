/**
 * The public entry to the reference suite: the list of cases and lookup by id.
 */
import { ArgumentError } from '../errors';
import { buildCatalogue } from './cases';
import type { ReferenceCase } from './types';

let catalogue: readonly ReferenceCase[] | undefined;

/** Every reference case, in catalogue order (bars, beams, shaft, mast, buckling). A fresh array each call. */
export function referenceCases(): ReferenceCase[] {
  catalogue ??= buildCatalogue();
  return [...catalogue];
}

/**
 * The case with this id.
 * @throws ArgumentError (path: the id) listing the known ids when there is none
 */
export function referenceCase(id: string): ReferenceCase {
  const all = referenceCases();
  const found = all.find((c) => c.id === id);
  if (!found) {
    throw new ArgumentError(`is not a reference case; the cases are ${all.map((c) => c.id).join(', ')}`, String(id));
  }
  return found;
}
