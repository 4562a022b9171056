/**
 * The BUILT package as its users load it: `import('eigenframe')` (ESM, dist/index.js) and
 * `require('eigenframe')` (CJS, dist/index.cjs) resolve through package.json "exports", expose
 * the same functions as src/index.ts, compute the same numbers, and ship type declarations.
 * Each load runs in a fresh node process so that Node's own resolver, not the test runner's, is
 * what is tested. `npm test` builds first (pretest); run `npm run build` before this file alone.
 */
import { execFile } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as src from '../src/index';
import * as srcNode from '../src/node/index';

const ROOT = resolve(__dirname, '..');
const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8'));

/** What a probe prints: resolved file, export names with their typeof, and one computed value. */
interface Probe {
  resolved: string;
  exports: Record<string, string>;
  /** Lowest frequency (Hz) of the reference cantilever at its stated mesh. */
  f1: number;
  version: string;
}

const BODY = `
  const names = Object.keys(ef).filter((k) => k !== 'default' && k !== '__esModule').sort();
  const exportsTypes = Object.fromEntries(names.map((k) => [k, typeof ef[k]]));
  const ref = ef.referenceCase('beam-cantilever');
  const f1 = ef.modalAnalysis(ef.referenceCase('beam-cantilever').build(ref.mesh), { count: 1 }).modes[0].frequency;
  process.stdout.write(JSON.stringify({ resolved: RESOLVED, exports: exportsTypes, f1, version: ef.VERSION }));
`;
const ESM = `import * as ef from 'eigenframe'; const RESOLVED = import.meta.resolve('eigenframe'); ${BODY}`;
const CJS = `const ef = require('eigenframe'); const RESOLVED = require.resolve('eigenframe'); ${BODY}`;

function probe(cwd: string, kind: 'esm' | 'cjs'): Promise<Probe> {
  const args = kind === 'esm' ? ['--input-type=module', '-e', ESM] : ['--input-type=commonjs', '-e', CJS];
  return new Promise((done, fail) => {
    execFile(process.execPath, args, { cwd, timeout: 60_000, encoding: 'utf8' }, (err, stdout, stderr) => {
      if (err) fail(new Error(`${kind} probe in ${cwd} failed: ${stderr || err.message}`));
      else done(JSON.parse(stdout) as Probe);
    });
  });
}

/** The Node-only entry `eigenframe/node`: resolved file and export kinds, both ways. */
const NODE_ESM = `import * as n from 'eigenframe/node'; process.stdout.write(JSON.stringify({ resolved: import.meta.resolve('eigenframe/node'), exports: Object.fromEntries(Object.keys(n).sort().map((k) => [k, typeof n[k]])) }));`;
const NODE_CJS = `const n = require('eigenframe/node'); process.stdout.write(JSON.stringify({ resolved: require.resolve('eigenframe/node'), exports: Object.fromEntries(Object.keys(n).filter((k) => k !== '__esModule').sort().map((k) => [k, typeof n[k]])) }));`;

function probeNode(kind: 'esm' | 'cjs'): Promise<Pick<Probe, 'resolved' | 'exports'>> {
  const args = kind === 'esm' ? ['--input-type=module', '-e', NODE_ESM] : ['--input-type=commonjs', '-e', NODE_CJS];
  return new Promise((done, fail) => {
    execFile(process.execPath, args, { cwd: ROOT, timeout: 60_000, encoding: 'utf8' }, (err, stdout, stderr) => {
      if (err) fail(new Error(`eigenframe/node ${kind} probe failed: ${stderr || err.message}`));
      else done(JSON.parse(stdout));
    });
  });
}

let inRepo: { esm: Probe; cjs: Probe };
let nodeEntry: { esm: Pick<Probe, 'resolved' | 'exports'>; cjs: Pick<Probe, 'resolved' | 'exports'> };
let consumer: { esm: Probe; cjs: Probe };
let consumerDir: string;

beforeAll(async () => {
  for (const f of ['index.js', 'index.cjs']) {
    if (!existsSync(join(ROOT, 'dist', f))) throw new Error(`dist/${f} is missing: run \`npm run build\` (npm test does it through pretest)`);
  }
  // A consumer project elsewhere on disk with the package in its node_modules (as `npm install`
  // of a local folder links it).
  consumerDir = mkdtempSync(join(tmpdir(), 'eigenframe-consumer-'));
  mkdirSync(join(consumerDir, 'node_modules'));
  symlinkSync(ROOT, join(consumerDir, 'node_modules', 'eigenframe'), 'dir');
  const [a, b, c, d, e, f] = await Promise.all([
    probe(ROOT, 'esm'),
    probe(ROOT, 'cjs'),
    probe(consumerDir, 'esm'),
    probe(consumerDir, 'cjs'),
    probeNode('esm'),
    probeNode('cjs'),
  ]);
  inRepo = { esm: a, cjs: b };
  consumer = { esm: c, cjs: d };
  nodeEntry = { esm: e, cjs: f };
}, 120_000);

afterAll(() => {
  if (consumerDir) rmSync(consumerDir, { recursive: true, force: true });
});

describe('built package', () => {
  it('import resolves to dist/index.js and require to dist/index.cjs (package.json "exports")', () => {
    expect(inRepo.esm.resolved).toBe(`file://${join(ROOT, 'dist', 'index.js')}`);
    expect(inRepo.cjs.resolved).toBe(join(ROOT, 'dist', 'index.cjs'));
    expect(pkg.exports['.'].import.default).toBe('./dist/index.js');
    expect(pkg.exports['.'].require.default).toBe('./dist/index.cjs');
  });

  it('ESM and CJS expose the same names with the same kinds, and exactly the runtime exports of src/index.ts', () => {
    const fromSrc = Object.fromEntries(
      Object.keys(src)
        .sort()
        .map((k) => [k, typeof (src as Record<string, unknown>)[k]]),
    );
    expect(Object.keys(inRepo.esm.exports).length).toBeGreaterThan(100);
    expect(inRepo.cjs.exports).toEqual(inRepo.esm.exports);
    expect(inRepo.esm.exports).toEqual(fromSrc);
    for (const name of ['parseModel', 'modalAnalysis', 'solve', 'readMatrixMarket', 'writeMatrixMarket', 'referenceCases', 'participation', 'screenResonance']) {
      expect(inRepo.esm.exports[name], name).toBe('function');
    }
  });

  it('both builds compute the same frequency as src/, which matches the closed form', () => {
    const ref = src.referenceCase('beam-cantilever');
    const f1 = src.modalAnalysis(ref.build(ref.mesh), { count: 1 }).modes[0].frequency;
    expect(inRepo.esm.f1).toBe(f1);
    expect(inRepo.cjs.f1).toBe(f1);
    // Source: Euler–Bernoulli cantilever, 1 + cos β cosh β = 0 (the case's exact value); the
    // case states its mesh reaches its tolerance.
    expect(Math.abs(f1 - ref.exact(1)[0]) / ref.exact(1)[0]).toBeLessThan(ref.tolerance);
    expect(inRepo.esm.version).toBe(pkg.version);
    expect(inRepo.cjs.version).toBe(pkg.version);
  });

  it('a consumer project outside the repository loads it both ways', () => {
    expect(consumer.esm.exports).toEqual(inRepo.esm.exports);
    expect(consumer.cjs.exports).toEqual(inRepo.esm.exports);
    expect(consumer.esm.f1).toBe(inRepo.esm.f1);
    expect(consumer.cjs.f1).toBe(inRepo.cjs.f1);
  });

  it('ships type declarations for both entries, declaring every runtime export', () => {
    expect(pkg.types).toBe('./dist/index.d.ts');
    expect(pkg.exports['.'].import.types).toBe('./dist/index.d.ts');
    expect(pkg.exports['.'].require.types).toBe('./dist/index.d.cts');
    const dts = readFileSync(join(ROOT, 'dist', 'index.d.ts'), 'utf8');
    expect(existsSync(join(ROOT, 'dist', 'index.d.cts'))).toBe(true);
    const missing = Object.keys(inRepo.esm.exports).filter((name) => !new RegExp(`\\b${name}\\b`).test(dts));
    expect(missing).toEqual([]);
    expect(dts).toMatch(/export \{[^}]*\bmodalAnalysis\b/);
  });

  it('the Node-only entry eigenframe/node loads both ways with the exports of src/node/index.ts', () => {
    expect(nodeEntry.esm.resolved).toBe(`file://${join(ROOT, 'dist', 'node.js')}`);
    expect(nodeEntry.cjs.resolved).toBe(join(ROOT, 'dist', 'node.cjs'));
    const fromSrc = Object.fromEntries(
      Object.keys(srcNode)
        .sort()
        .map((k) => [k, typeof (srcNode as Record<string, unknown>)[k]]),
    );
    expect(nodeEntry.esm.exports).toEqual(fromSrc);
    expect(nodeEntry.cjs.exports).toEqual(fromSrc);
    expect(existsSync(join(ROOT, 'dist', 'node.d.ts'))).toBe(true);
    expect(existsSync(join(ROOT, 'dist', 'node.d.cts'))).toBe(true);
  });

  it('"files" publishes dist/ (with the CLI bin)', () => {
    expect(pkg.files).toContain('dist');
    expect(existsSync(join(ROOT, pkg.bin.eigenframe))).toBe(true);
  });
});
