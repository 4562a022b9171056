/** Test helpers: the ArgumentError a call throws, and its path. */
import { expect } from 'vitest';
import { ArgumentError } from '../src/errors';

/** Runs f; expects an ArgumentError and returns its path, or 'no error' when f returns. */
export function pathOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(ArgumentError);
    return (e as ArgumentError).path;
  }
  return 'no error';
}

/** Runs f; expects it to throw an ArgumentError and returns it (fails the test when f returns). */
export function thrown(f: () => unknown): ArgumentError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(ArgumentError);
    return e as ArgumentError;
  }
  throw new Error('expected an ArgumentError');
}
