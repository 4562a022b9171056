/** Test helpers: the error a call throws (an ArgumentError unless told), and its path. */
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

/**
 * Runs f; expects it to throw an error of `type` (ArgumentError unless given) and returns it
 * (fails the test when f returns).
 */
export function thrown<E extends Error = ArgumentError>(f: () => unknown, type: abstract new (...args: never[]) => E = ArgumentError as unknown as abstract new (...args: never[]) => E): E {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(type);
    return e as E;
  }
  throw new Error(`expected a ${type.name}`);
}
