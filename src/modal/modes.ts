/**
 * The part of an eigen result the modal quantities need, and its validation.
 */
import { ArgumentError } from '../errors';
import type { EigenResult } from '../eigen/types';

/**
 * Mode shapes with their eigenvalues: `vectors` is column-major n × m (mode j at
 * [j·n, (j+1)·n)), `eigenvalues` has length m, in rad²/s². Any `EigenResult` is a ModeSet.
 */
export type ModeSet = Pick<EigenResult, 'n' | 'eigenvalues' | 'vectors'>;

/**
 * Checks that `modes` is consistent and matches dimension n; returns the number of modes m.
 * @throws ArgumentError (path `modes`) when the sizes disagree
 */
export function modeCount(modes: ModeSet, n: number): number {
  const m = modes.eigenvalues.length;
  if (modes.n !== n) {
    throw new ArgumentError(`the modes have dimension ${modes.n} but the matrices have ${n}; pass modes of this model`, 'modes');
  }
  if (modes.vectors.length !== n * m) {
    throw new ArgumentError(`vectors hold ${modes.vectors.length} numbers, expected n × m = ${n} × ${m} = ${n * m}; store modes column-major, one per eigenvalue`, 'modes.vectors');
  }
  return m;
}

/**
 * Resolves a `count` option against the m modes available.
 * @throws ArgumentError (path `count`) unless count is an integer in 0..m
 */
export function resolveCount(count: number | undefined, m: number): number {
  if (count === undefined) return m;
  if (!Number.isInteger(count) || count < 0 || count > m) {
    throw new ArgumentError(`count ${count} is not an integer from 0 to the ${m} modes available; pass a count in that range or omit it for all modes`, 'count');
  }
  return count;
}

/** Dot product of x and y over [0, n). */
export function dot(x: Float64Array, xo: number, y: Float64Array, yo: number, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += x[xo + i] * y[yo + i];
  return s;
}
