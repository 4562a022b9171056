import { ArgumentError } from '../../src/errors';

/** Throws ArgumentError unless v is an integer ≥ min. */
export function requireInteger(v: unknown, min: number, path: string): number {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < min) {
    throw new ArgumentError(`${String(v)} is not an integer ≥ ${min}; pass a whole number of at least ${min}`, path);
  }
  return v;
}

/** Throws ArgumentError unless v is a finite number > 0. */
export function requirePositive(v: unknown, path: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
    throw new ArgumentError(`${String(v)} is not a positive length; pass a finite number > 0 (m)`, path);
  }
  return v;
}
