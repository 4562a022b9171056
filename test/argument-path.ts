/** Test helper: the path of the ArgumentError a call throws. */
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
