/**
 * The route a JavaScript user has today for K x = λ M x with ml-matrix alone: Cholesky of M,
 * A = L⁻¹ K L⁻ᵀ with ml-matrix's `inverse`, ml-matrix's symmetric `EigenvalueDecomposition`,
 * x = L⁻ᵀ y. Used as the independent reference in tests and as the speed baseline in benches.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, inverse, Matrix } from 'ml-matrix';
import { ArgumentError } from '../errors';

/** Eigenpairs from {@link mlMatrixGeneralized}. */
export interface BaselineResult {
  /** All n eigenvalues, ascending, rad²/s². */
  readonly eigenvalues: Float64Array;
  /** M-orthonormal mode shapes, column-major n × n. */
  readonly vectors: Float64Array;
}

/**
 * All eigenpairs of K x = λ M x through ml-matrix's dense decompositions.
 * @param K - stiffness, n × n symmetric ml-matrix Matrix
 * @param M - mass, n × n symmetric positive definite ml-matrix Matrix
 * @throws ArgumentError (path `M`) when M is not positive definite or the sizes differ
 */
export function mlMatrixGeneralized(K: Matrix, M: Matrix): BaselineResult {
  const n = K.rows;
  if (K.columns !== n || M.rows !== n || M.columns !== n) {
    throw new ArgumentError(`K is ${K.rows} × ${K.columns} and M is ${M.rows} × ${M.columns}; pass square matrices of one size`, 'M');
  }
  const chol = new CholeskyDecomposition(M);
  if (!chol.isPositiveDefinite()) {
    throw new ArgumentError('is not positive definite (ml-matrix Cholesky failed); the baseline needs M positive definite', 'M');
  }
  const linv = inverse(chol.lowerTriangularMatrix);
  const a = linv.mmul(K).mmul(linv.transpose());
  const evd = new EigenvalueDecomposition(a, { assumeSymmetric: true });
  const x = linv.transpose().mmul(evd.eigenvectorMatrix);
  const d = evd.realEigenvalues;
  const order = d.map((_, i) => i).sort((p, q) => d[p] - d[q]);
  const eigenvalues = new Float64Array(n);
  const vectors = new Float64Array(n * n);
  for (let c = 0; c < n; c++) {
    eigenvalues[c] = d[order[c]];
    for (let i = 0; i < n; i++) vectors[c * n + i] = x.get(i, order[c]);
  }
  return { eigenvalues, vectors };
}
