// Check my solver: you have the stiffness K and mass M of a structure as Matrix Market files,
// written by your own program, and the frequencies your own eigensolver found for them. This
// script solves the same K and M with eigenframe and compares the two mode by mode, then checks
// both against the exact values of the structure.
//
//   npm run build && node docs/examples/check-my-solver.mjs
//
// Step 0 stands in for what you already have: it writes K.mtx, M.mtx and my-results.txt to a
// temporary folder. The structure is eigenframe's reference case `beam-two-span` (a continuous
// beam over two equal spans, whose frequencies come in close pairs: a good test of a solver);
// "your solver" is the plain dense route through ml-matrix (Cholesky of M, symmetric
// eigendecomposition of L⁻¹ K L⁻ᵀ), printing 9 significant digits as many programs do.
// Replace step 0 with your own files.

import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';
import {
  assemble,
  compareValues,
  eigenvalueToFrequency,
  parseResults,
  readMatrixMarket,
  referenceCase,
  solve,
  toDenseArray,
  writeMatrixMarket,
} from 'eigenframe';

const COUNT = 6;
const dir = mkdtempSync(join(tmpdir(), 'eigenframe-check-'));
try {
  // ---- Step 0: what you already have (see the header) ----------------------------------------
  const ref = referenceCase('beam-two-span');
  const assembled = assemble(ref.build(ref.mesh));
  writeFileSync(join(dir, 'K.mtx'), writeMatrixMarket(assembled.stiffness, 'stiffness, N/m and N·m/rad'));
  writeFileSync(join(dir, 'M.mtx'), writeMatrixMarket(assembled.mass, 'mass, kg and kg·m²'));
  writeFileSync(join(dir, 'my-results.txt'), yourSolver(join(dir, 'K.mtx'), join(dir, 'M.mtx'), COUNT));

  // ---- Step 1: read your matrices and solve them with eigenframe -----------------------------
  const K = readMatrixMarket(readFileSync(join(dir, 'K.mtx'), 'utf8'), 'K.mtx');
  const M = readMatrixMarket(readFileSync(join(dir, 'M.mtx'), 'utf8'), 'M.mtx');
  const ours = solve(K, M, { count: COUNT });
  const ourHz = Array.from(ours.eigenvalues, eigenvalueToFrequency);

  // ---- Step 2: read your results and compare, mode by mode ------------------------------------
  // parseResults accepts one number per line (# comments), a JSON array, or { modes: [...] }.
  const yourHz = parseResults(readFileSync(join(dir, 'my-results.txt'), 'utf8'), 'my-results.txt', 'frequency');
  // Two correct double-precision solvers agree far below 1e-7 on a problem this small; the 9
  // printed digits of your results limit the agreement to about 5e-9.
  const vsOurs = compareValues(ourHz, yourHz, 1e-7);
  // Exact values of the continuous beam; the case states the tolerance its mesh reaches.
  const exact = ref.exact(COUNT);
  const vsExactYours = compareValues(exact, yourHz, ref.tolerance);
  const vsExactOurs = compareValues(exact, ourHz, ref.tolerance);

  console.log(`Your K and M: ${K.n} DOFs (K.mtx, M.mtx, read back from a temporary folder)`);
  console.log(`Structure: ${ref.description}\n`);
  console.log('mode   your solver Hz    eigenframe Hz   rel. diff     exact Hz   your error  eigenframe error');
  for (let i = 0; i < COUNT; i++) {
    const d = vsOurs.rows[i];
    console.log(
      `${String(i + 1).padStart(4)}  ${yourHz[i].toFixed(6).padStart(15)}  ${ourHz[i].toFixed(6).padStart(15)}  ${(d.relativeError ?? NaN).toExponential(1).padStart(9)}  ` +
        `${exact[i].toFixed(4).padStart(11)}  ${(vsExactYours.rows[i].relativeError ?? NaN).toExponential(1).padStart(11)}  ${(vsExactOurs.rows[i].relativeError ?? NaN).toExponential(1).padStart(16)}`,
    );
  }
  const sturm = ours.sturm;
  console.log(
    `\neigenframe's own checks: largest residual ${Math.max(...ours.residuals).toExponential(1)}, M-orthonormality error ` +
      `${ours.orthogonalityError.toExponential(1)}, Sturm count ${sturm?.countBelow} below the check shift, ${sturm?.returnedBelow} returned (${sturm?.passed ? 'none missed' : 'MISSED'}).`,
  );
  console.log(`Your solver vs eigenframe: largest relative difference ${vsOurs.maxRelativeError.toExponential(1)} (tolerance ${vsOurs.tolerance}): ${vsOurs.passed ? 'AGREE' : 'DISAGREE'}.`);
  console.log(
    `Both vs the exact values (tolerance ${ref.tolerance} at this mesh): yours ${vsExactYours.passed ? 'pass' : 'FAIL'}, eigenframe ${vsExactOurs.passed ? 'pass' : 'FAIL'}.`,
  );
  process.exitCode = vsOurs.passed && vsExactYours.passed && vsExactOurs.passed ? 0 : 1;
} finally {
  rmSync(dir, { recursive: true, force: true });
}

/**
 * Stand-in for your own solver: dense, through ml-matrix. Returns the lowest `count`
 * frequencies (Hz), one per line, 9 significant digits.
 */
function yourSolver(kPath, mPath, count) {
  const dense = (path) => {
    const a = readMatrixMarket(readFileSync(path, 'utf8'), path);
    return Matrix.from1DArray(a.n, a.n, toDenseArray(a));
  };
  const K = dense(kPath);
  const M = dense(mPath);
  const Linv = inverse(new CholeskyDecomposition(M).lowerTriangularMatrix);
  const A = Linv.mmul(K).mmul(Linv.transpose());
  const lambdas = new EigenvalueDecomposition(A, { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b);
  const hz = lambdas.slice(0, count).map((l) => Math.sqrt(Math.max(l, 0)) / (2 * Math.PI));
  return `# my in-house solver, lowest ${count} frequencies, Hz\n${hz.map((f) => f.toPrecision(9)).join('\n')}\n`;
}
