// CommonJS check: the package loads with require() as well as with import. Solves the
// reference case `beam-cantilever` (Euler–Bernoulli cantilever, 1 + cos β cosh β = 0) at its
// stated mesh and compares the lowest frequencies with the exact ones.
//
//   npm run build && node docs/examples/require-check.cjs

'use strict';
const { VERSION, compareValues, modalAnalysis, referenceCase } = require('eigenframe');

const ref = referenceCase('beam-cantilever');
const analysis = modalAnalysis(ref.build(ref.mesh), { count: ref.count });
const ours = analysis.modes.map((m) => m.frequency);
const exact = ref.exact(ref.count);
const cmp = compareValues(exact, ours, ref.tolerance);

console.log(`eigenframe ${VERSION} loaded with require()`);
console.log(`${ref.id}: ${ref.description}; mesh ${ref.mesh} ${ref.meshUnit}\n`);
console.log('mode   eigenframe Hz     exact Hz  rel. error');
for (const row of cmp.rows) {
  console.log(`${String(row.mode).padStart(4)}  ${row.actual.toFixed(6).padStart(14)}  ${row.expected.toFixed(6).padStart(11)}  ${row.relativeError.toExponential(1).padStart(10)}`);
}
console.log(`\nLargest relative error ${cmp.maxRelativeError.toExponential(1)}, tolerance ${ref.tolerance}: ${cmp.passed ? 'pass' : 'FAIL'}.`);
process.exitCode = cmp.passed ? 0 : 1;
