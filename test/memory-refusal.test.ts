import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { FactorizationError } from '../src/errors';
import { solve } from '../src/eigen/solve';
import { FACTOR_MEMORY_LIMIT, ShiftedPencil, factorBytes } from '../src/eigen/pencil';
import { parseModel } from '../src/model/read';
import { assemble } from '../src/model/assemble';

const DEMO = join(__dirname, '..', 'examples', 'footbridge.json');

describe('a factor too large for the memory allowed is refused before it is allocated', () => {
  const asm = assemble(parseModel(readFileSync(DEMO, 'utf8')));

  it('the estimate comes from the symbolic analysis: 8 bytes per entry of L, D and workspace', () => {
    const pencil = new ShiftedPencil(asm.stiffness, asm.mass);
    const sym = pencil.symbolic;
    expect(factorBytes(sym)).toBe(8 * (sym.nnzL + 3 * sym.n));
    expect(FACTOR_MEMORY_LIMIT).toBe(8 * 2 ** 30); // documented default
  });

  it('solve throws FactorizationError at path "memory" with the estimate and the fix', () => {
    try {
      solve(asm.stiffness, asm.mass, { count: 5, method: 'lanczos', maxFactorBytes: 1000 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(FactorizationError);
      const err = e as FactorizationError;
      expect(err.path).toBe('memory');
      expect(err.detail).toMatch(/needs about \d+\.\d\d GiB \(nnz\(L\) = /);
      expect(err.detail).toMatch(/raise maxFactorBytes/);
    }
    // Within the limit the same call succeeds.
    expect(solve(asm.stiffness, asm.mass, { count: 5, method: 'lanczos' }).eigenvalues).toHaveLength(5);
  });

  it('a bad limit is an ArgumentError naming the option', () => {
    expect(() => solve(asm.stiffness, asm.mass, { count: 5, method: 'lanczos', maxFactorBytes: -1 })).toThrow(/maxFactorBytes/);
  });
});
