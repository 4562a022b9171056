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
]);
