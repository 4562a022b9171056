#!/usr/bin/env node
'use strict';
// The eigenframe command line; the code lives in the built package (npm run build).
try {
  require('../dist/cli.cjs');
} catch (e) {
  if (e && e.code === 'MODULE_NOT_FOUND' && String(e.message).includes('dist/cli.cjs')) {
    process.stderr.write('eigenframe: the package is not built yet; run "npm run build" in its folder first\n');
    process.exit(70);
  }
  throw e;
}
