import { defineConfig } from 'tsup';

export default defineConfig([
  {
    entry: { index: 'src/index.ts' },
    format: ['esm', 'cjs'],
    dts: true,
    sourcemap: true,
    clean: false,
    target: 'node20',
    splitting: false,
  },
  {
    entry: { cli: 'src/cli/main.ts', bench: 'bench/main.ts' },
    format: ['cjs'],
    dts: false,
    sourcemap: true,
    clean: false,
    target: 'node20',
    splitting: false,
  },
  {
    // Node-only entry `eigenframe/node` (worker-thread batch) and its worker script.
    entry: { node: 'src/node/index.ts', 'batch-worker': 'src/node/batch-worker.ts' },
    format: ['esm', 'cjs'],
    dts: { entry: { node: 'src/node/index.ts' } },
    sourcemap: true,
    clean: false,
    target: 'node20',
    platform: 'node',
    splitting: false,
    shims: true,
  },
  {
    // Self-contained browser ES module: the library entry with ml-matrix (and its own
    // dependencies) bundled in, no bare and no node: imports, so a page or a module Web Worker
    // can `import` dist/browser/eigenframe.js straight from a static server.
    entry: { eigenframe: 'src/index.ts' },
    outDir: 'dist/browser',
    format: ['esm'],
    dts: false,
    sourcemap: true,
    clean: false,
    target: 'es2022',
    platform: 'browser',
    splitting: false,
    noExternal: [/.*/],
  },
]);
