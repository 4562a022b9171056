/** Dense input to the symmetric sparse storage (src/linalg/sparse/symmetric.ts fromDenseArray). */
import { describe, expect, it } from 'vitest';
import { fromDenseArray, toDenseArray } from '../src/linalg/sparse/symmetric';
import { pathOf } from './argument-path';

describe('fromDenseArray', () => {
  it('round-trips a symmetric matrix, and accepts round-off asymmetry', () => {
    const a = [4, 1, 0, 1, 5, 2, 0, 2, 6];
    expect(Array.from(toDenseArray(fromDenseArray(3, a)))).toEqual(a);
    const noisy = [4, 1, 0, 1 + 1e-15, 5, 2, 0, 2, 6];
    expect(() => fromDenseArray(3, noisy)).not.toThrow();
  });

  it('refuses an asymmetric matrix instead of dropping its upper half, naming the entry', () => {
    expect(pathOf(() => fromDenseArray(3, [4, 1, 0, 1, 5, 3, 0, 2, 6]))).toBe('(2, 1)');
  });

  it('refuses a wrong length and a non-finite entry', () => {
    expect(pathOf(() => fromDenseArray(3, [1, 2, 3]))).toBe('dense');
    expect(pathOf(() => fromDenseArray(2, [1, Number.NaN, Number.NaN, 1]))).toBe('(0, 1)');
  });
});
