import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../src/cli/run';
import { referenceCase } from '../src/reference/catalogue';

/**
 * `reference check RESULTS --stiffness K.mtx --mass M.mtx`: a user's frequencies against
 * eigenframe's own verified solution of the same pair. Reference values: the case's exact
 * frequencies (Euler–Bernoulli cantilever, see reference-cases.test.ts) stand in for "a user's
 * solver", which must agree with our solution of the written K and M to the discretisation error.
 */
describe('reference check against a K, M pair', () => {
  const dir = mkdtempSync(join(tmpdir(), 'eigenframe-refcheck-'));
  expect(runCli(['reference', 'write', 'beam-cantilever', '--dir', dir]).status).toBe(0);
  const K = join(dir, 'beam-cantilever.K.mtx');
  const M = join(dir, 'beam-cantilever.M.mtx');
  const ours = JSON.parse(runCli(['modes', '--stiffness', K, '--mass', M, '--count', '6', '--json']).stdout).modes.map((m: { frequency: number }) => m.frequency) as number[];

  it('passes a solver that agrees, and names the Sturm count', () => {
    const file = join(dir, 'good.txt');
    writeFileSync(file, `# my solver\n${ours.map((f) => f * (1 + 1e-9)).join('\n')}\n`);
    const r = runCli(['reference', 'check', file, '--stiffness', K, '--mass', M]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/Sturm count: 6 modes up to/);
    expect(r.stdout).toMatch(/^PASS: 6 of 6/m);
  });

  it('exact beam-theory values pass at the case tolerance and fail at a tight one', () => {
    const exact = referenceCase('beam-cantilever').exact(6);
    const file = join(dir, 'exact.json');
    writeFileSync(file, JSON.stringify(exact));
    expect(runCli(['reference', 'check', file, '--stiffness', K, '--mass', M, '--tolerance', '1e-4']).status).toBe(0);
    const tight = runCli(['reference', 'check', file, '--stiffness', K, '--mass', M, '--tolerance', '1e-9']);
    expect(tight.status).toBe(1);
    expect(tight.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('a skipped mode shows as missing', () => {
    const file = join(dir, 'skipped.txt');
    writeFileSync(file, [ours[0], ours[1], ours[3], ours[4], ours[5]].join('\n'));
    const r = runCli(['reference', 'check', file, '--stiffness', K, '--mass', M]);
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/1 missing/);
  });

  it('bad combinations name the option', () => {
    const file = join(dir, 'good.txt');
    expect(runCli(['reference', 'check', file, '--stiffness', K]).stderr).toMatch(/^eigenframe: --mass: /);
    expect(runCli(['reference', 'check', file, '--stiffness', K, '--mass', M, '--count', '3']).stderr).toMatch(/^eigenframe: --count: /);
    expect(readFileSync(file, 'utf8').length).toBeGreaterThan(0);
  });
});
