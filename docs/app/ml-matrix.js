/**
 * ml-matrix as an ES module for the browser, without a bundler.
 *
 * ml-matrix ships `matrix.mjs`, but that file only re-exports its CommonJS build (`matrix.js`),
 * which a browser cannot import. Its UMD build (`matrix.umd.js`) has every dependency inlined;
 * here it is fetched and run with a CommonJS-style `module`, and its exports re-exported by
 * name (the names of ml-matrix 6.15's `matrix.mjs`). Top-level await makes importers wait.
 *
 * The page maps the bare specifier `ml-matrix` to this file with an import map; the Web Worker,
 * where import maps do not apply, loads the library through worker.js's loader, which points
 * the specifier here directly.
 */
const url = new URL('../../node_modules/ml-matrix/matrix.umd.js', import.meta.url);
const response = await fetch(url);
if (!response.ok) throw new Error(`ml-matrix: cannot load ${url} (HTTP ${response.status}); serve the repository root so that node_modules/ml-matrix is reachable`);
const source = await response.text();
const module = { exports: {} };
// The UMD wrapper picks CommonJS when `module` and `exports` exist.
new Function('module', 'exports', source)(module, module.exports);
const m = module.exports;

export default m.Matrix;
export const {
  AbstractMatrix, CHO, CholeskyDecomposition, DistanceMatrix, EVD, EigenvalueDecomposition, LU,
  LuDecomposition, Matrix, MatrixColumnSelectionView, MatrixColumnView, MatrixFlipColumnView,
  MatrixFlipRowView, MatrixRowSelectionView, MatrixRowView, MatrixSelectionView, MatrixSubView,
  MatrixTransposeView, NIPALS, Nipals, QR, QrDecomposition, SVD, SingularValueDecomposition,
  SymmetricMatrix, WrapperMatrix1D, WrapperMatrix2D, correlation, covariance, determinant, inverse,
  linearDependencies, pseudoInverse, solve, wrap,
} = m;
