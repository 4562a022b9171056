/**
 * Matrices from outside, end to end through `eigenframe modes --stiffness K.mtx --mass M.mtx`:
 * an asymmetric `general` stiffness file and an indefinite mass file whose diagonal and 2 × 2
 * minors pass are refused with status 1 and one line on standard error naming the item; a
 * semidefinite singular mass passes. Matrices are invented test data; expected eigenvalues are
 * derived in each test.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../src/cli/run';
import { readMatrixMarket } from '../src/io/matrix-market';
import { checkMassSemidefinite } from '../src/eigen/definiteness';

const dir = mkdtempSync(join(tmpdir(), 'eigenframe-reliability-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function file(name: string, lines: string[]): string {
  const p = join(dir, name);
  writeFileSync(p, lines.join('\n') + '\n');
  return p;
}

// K = [[2, −1, 0], [−1, 2, −1], [0, −1, 2]] (symmetric, lower triangle).
const K_SYM = file('K.mtx', ['%%MatrixMarket matrix coordinate real symmetric', '3 3 5', '1 1 2', '2 1 -1', '2 2 2', '3 2 -1', '3 3 2']);

function oneLineError(args: string[]): string {
  const r = runCli(args);
  expect(r.status).toBe(1);
  expect(r.stdout).toBe('');
  const lines = r.stderr.trimEnd().split('\n');
  expect(lines).toHaveLength(1);
  return lines[0];
}

describe('eigenframe modes on Matrix Market pairs', () => {
  it('a general stiffness file that is not symmetric: the line of the mirror entry and both values', () => {
    const K = file('K-general.mtx', ['%%MatrixMarket matrix coordinate real general', '3 3 7', '1 1 2', '2 1 -1', '1 2 -1.001', '2 2 2', '3 2 -1', '2 3 -1', '3 3 2']);
    const M = file('M-unit.mtx', ['%%MatrixMarket matrix coordinate real symmetric', '3 3 3', '1 1 1', '2 2 1', '3 3 1']);
    const line = oneLineError(['modes', '--stiffness', K, '--mass', M, '--count', '2', '--json']);
    expect(line).toMatch(/K-general\.mtx:5: the matrix is not symmetric: \(1, 2\) = -1\.001 but \(2, 1\) = -1 on line 4/);
  });

  it('a mass file with diagonal 1 and couplings ±0.9 (eigenvalues 1.9, 1.9, −0.8): refused, naming M', () => {
    // S = I + 0.9·B, B = [[0, 1, 1], [1, 0, −1], [1, −1, 0]] with eigenvalues 1, 1, −2 (derived in
    // test/definiteness.test.ts); every 2 × 2 minor is 1 − 0.81 > 0.
    const M = file('M-indefinite.mtx', ['%%MatrixMarket matrix coordinate real symmetric', '3 3 6', '1 1 1', '2 1 0.9', '3 1 0.9', '2 2 1', '3 2 -0.9', '3 3 1']);
    const line = oneLineError(['modes', '--stiffness', K_SYM, '--mass', M, '--count', '2', '--json']);
    expect(line).toMatch(/^eigenframe: M: the mass matrix is not positive semidefinite: it has 1 negative eigenvalue/);
  });

  it('a singular semidefinite mass (couplings ±0.5: eigenvalues 1.5, 1.5, 0) is accepted: the two finite modes', () => {
    // M = I + 0.5·B is singular (B has eigenvalue −2), so det(K − λM) = p(λ) is a quadratic, not a
    // cubic: one eigenvalue is infinite and the two finite ones are the roots of p. p is fitted
    // exactly from p(−1), p(0), p(1) (3 × 3 determinants, cofactor expansion) and solved here.
    const lines = ['%%MatrixMarket matrix coordinate real symmetric', '3 3 6', '1 1 1', '2 1 0.5', '3 1 0.5', '2 2 1', '3 2 -0.5', '3 3 1'];
    const M = file('M-singular.mtx', lines);
    expect(checkMassSemidefinite(readMatrixMarket(lines.join('\n'))).provedBy).toBe('diagonal dominance'); // scaled row sums exactly 1
    const r = runCli(['modes', '--stiffness', K_SYM, '--mass', M, '--count', '2', '--json']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const modes = (JSON.parse(r.stdout) as { modes: Array<{ eigenvalue: number }> }).modes;
    const p = (l: number): number => {
      const k = [[2, -1, 0], [-1, 2, -1], [0, -1, 2]];
      const m = [[1, 0.5, 0.5], [0.5, 1, -0.5], [0.5, -0.5, 1]];
      const a = k.map((row, i) => row.map((v, j) => v - l * m[i][j]));
      return a[0][0] * (a[1][1] * a[2][2] - a[1][2] * a[2][1]) - a[0][1] * (a[1][0] * a[2][2] - a[1][2] * a[2][0]) + a[0][2] * (a[1][0] * a[2][1] - a[1][1] * a[2][0]);
    };
    const c = p(0);
    const bq = (p(1) - p(-1)) / 2;
    const aq = (p(1) + p(-1)) / 2 - c;
    const disc = Math.sqrt(bq * bq - 4 * aq * c);
    const roots = [(-bq - disc) / (2 * aq), (-bq + disc) / (2 * aq)].sort((x, y) => x - y);
    expect(modes).toHaveLength(2);
    for (let i = 0; i < 2; i++) expect(Math.abs(modes[i].eigenvalue / roots[i] - 1)).toBeLessThan(1e-10);
  });
});
