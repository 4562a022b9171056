/**
 * dist/browser/eigenframe.js, the self-contained browser ES module (tsup entry `platform:
 * 'browser'`, ml-matrix bundled in): a browser loads it from a static server with no bundler and
 * no import map, so it must import nothing at all — no bare specifier (`ml-matrix`), no `node:`
 * module, no relative file, no `require`. Checked on its syntax tree (vite's `parseAst`, an
 * ESTree parser), then by evaluating it from a `data:` URL in a separate Node process (a
 * `data:` module cannot resolve bare or relative specifiers) and solving a beam with it.
 * Its exports must be those of src/index.ts.
 */
import { execFile } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parseAst } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as library from '../src/index';
import { simplySupportedBeam } from './beam-fixture';

const ROOT = resolve(new URL('..', import.meta.url).pathname);
const BUNDLE = join(ROOT, 'dist', 'browser', 'eigenframe.js');

type Node = { type: string; [key: string]: unknown };

/** Every node of an ESTree tree, depth first. */
function* walk(node: unknown): Generator<Node> {
  if (Array.isArray(node)) {
    for (const child of node) yield* walk(child);
    return;
  }
  if (typeof node !== 'object' || node === null) return;
  const n = node as Node;
  if (typeof n.type === 'string') yield n;
  for (const key of Object.keys(n)) {
    const v = n[key];
    if (typeof v === 'object' && v !== null) yield* walk(v);
  }
}

let text = '';
let program: Node;
let dir = '';

beforeAll(() => {
  if (!existsSync(BUNDLE)) throw new Error('dist/browser/eigenframe.js is missing: run `npm run build` (npm test does it through pretest)');
  text = readFileSync(BUNDLE, 'utf8');
  program = parseAst(text) as unknown as Node;
  dir = mkdtempSync(join(tmpdir(), 'eigenframe-bundle-'));
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('dist/browser/eigenframe.js', () => {
  it('imports nothing: no bare, node:, relative or dynamic import, no require', () => {
    const imports: string[] = [];
    for (const n of walk(program)) {
      const source = (n.source as { value?: unknown } | null | undefined)?.value;
      if (n.type === 'ImportDeclaration' || n.type === 'ExportAllDeclaration' || (n.type === 'ExportNamedDeclaration' && n.source)) imports.push(`${n.type} ${String(source)}`);
      else if (n.type === 'ImportExpression') imports.push(`import(${String(source ?? '…')})`);
      else if (n.type === 'CallExpression' && (n.callee as Node).type === 'Identifier' && (n.callee as { name: string }).name === 'require') imports.push('require(…)');
    }
    expect(imports).toEqual([]);
    // The parser did see the module: one export list, ending the file.
    expect([...walk(program)].filter((n) => n.type === 'ExportNamedDeclaration')).toHaveLength(1);
  });

  it('exports exactly what src/index.ts exports', () => {
    const names: string[] = [];
    for (const n of walk(program)) {
      if (n.type !== 'ExportNamedDeclaration') continue;
      for (const s of n.specifiers as Array<{ exported: { name?: string; value?: string } }>) names.push(s.exported.name ?? String(s.exported.value));
    }
    expect(names.sort()).toEqual(Object.keys(library).sort());
  });

  it('evaluates with no module resolution (from a data: URL) and solves a simply supported beam', async () => {
    const beam = simplySupportedBeam('beam');
    const script = join(dir, 'load.mjs');
    writeFileSync(
      script,
      `import { readFileSync } from 'node:fs';
       const url = 'data:text/javascript;base64,' + readFileSync(${JSON.stringify(BUNDLE)}).toString('base64');
       const lib = await import(url);
       const a = lib.modalAnalysis(lib.parseModel(${JSON.stringify(JSON.stringify(beam))}), { count: 3 });
       process.stdout.write(JSON.stringify({ version: lib.VERSION, f: a.modes.map((m) => m.frequency) }));`,
    );
    const out = await new Promise<string>((done, fail) =>
      execFile(process.execPath, [script], { cwd: dir, timeout: 60_000, encoding: 'utf8' }, (err, stdout, stderr) => (err ? fail(new Error(stderr || err.message)) : done(stdout))),
    );
    const got = JSON.parse(out) as { version: string; f: number[] };
    expect(got.version).toBe(library.VERSION);
    // Source: Euler–Bernoulli simply supported beam, f1 = (π / 2L²)·√(EI/ρA) (closed form).
    const f1 = (Math.PI / (2 * 36)) * Math.sqrt((2.1e11 * 2.2e-6) / (7850 * 1.5e-3));
    expect(Math.abs(got.f[0] - f1) / f1).toBeLessThan(1e-5);
    // Same code as the Node build: the same frequencies to round-off.
    const node = library.modalAnalysis(library.parseModel(JSON.stringify(beam)), { count: 3 });
    got.f.forEach((f, j) => expect(Math.abs(f - node.modes[j].frequency) / node.modes[j].frequency).toBeLessThan(1e-12));
  });
});
