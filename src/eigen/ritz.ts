/**
 * Rayleigh–Ritz on a subspace: given a basis X (n × q) of an approximate invariant subspace,
 * solve the projected problem (Xᵀ K X) Q = (Xᵀ M X) Q Λ densely and rotate X ← X Q. The result
 * is M-orthonormal to round-off and carries the best eigenvalue estimates the subspace holds
 * (Parlett, The Symmetric Eigenvalue Problem, §11.3; Bathe, Finite Element Procedures §11.6.3).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { VerificationError } from '../errors';
import { combineColumnsInPlace, gram } from './kernels';

/** Solution of a small dense generalized symmetric problem A q = λ B q, B positive definite. */
export interface ProjectedEigen {
  /** Eigenvalues, ascending, length q. */
  readonly values: Float64Array;
  /** Eigenvectors, column-major q × q, B-orthonormal. */
  readonly vectors: Float64Array;
}

/**
 * Solves A q = λ B q for small dense symmetric A and positive definite B (both column-major
 * q × q) by Cholesky B = L Lᵀ and the symmetric eigenproblem of L⁻¹ A L⁻ᵀ (Golub & Van Loan,
 * Matrix Computations, 4th ed., §8.7.2); the symmetric step uses ml-matrix's tridiagonal QL.
 * @throws VerificationError (path `projection`) when B is not numerically positive definite,
 * i.e. the basis has lost M-independence.
 */
export function projectedEigen(a0: Float64Array, b0: Float64Array, q: number): ProjectedEigen {
  // Symmetric diagonal scaling D B D with D = diag(B)^(-1/2): columns of very different M-norm
  // (subspace iteration right after a solve) would otherwise make the Cholesky fail needlessly.
  const dsc = new Float64Array(q);
  for (let j = 0; j < q; j++) {
    const bjj = b0[j * q + j];
    if (!(bjj > 0) || !Number.isFinite(bjj)) {
      throw new VerificationError(
        `basis vector ${j} has M-norm² ${bjj}; the subspace basis lost M-independence — try another seed or start vector`,
        'projection',
      );
    }
    dsc[j] = 1 / Math.sqrt(bjj);
  }
  const a = new Float64Array(q * q);
  const b = new Float64Array(q * q);
  for (let j = 0; j < q; j++) {
    for (let i = 0; i < q; i++) {
      a[j * q + i] = a0[j * q + i] * dsc[i] * dsc[j];
      b[j * q + i] = b0[j * q + i] * dsc[i] * dsc[j];
    }
  }
  // Cholesky of B, lower L stored column-major in l.
  const l = new Float64Array(q * q);
  for (let j = 0; j < q; j++) {
    let d = b[j * q + j];
    for (let k = 0; k < j; k++) d -= l[k * q + j] * l[k * q + j];
    if (!(d > 0)) {
      throw new VerificationError(
        `the projected mass matrix is not positive definite at column ${j} (pivot ${d}); the subspace basis lost M-independence — try another seed or start vector`,
        'projection',
      );
    }
    const ljj = Math.sqrt(d);
    l[j * q + j] = ljj;
    for (let i = j + 1; i < q; i++) {
      let s = 0.5 * (b[j * q + i] + b[i * q + j]);
      for (let k = 0; k < j; k++) s -= l[k * q + i] * l[k * q + j];
      l[j * q + i] = s / ljj;
    }
  }
  // C = L⁻¹ A L⁻ᵀ: first W = L⁻¹ A (forward substitution on each column of A), then C = L⁻¹ Wᵀ.
  const w = new Float64Array(q * q);
  const forward = (src: Float64Array, dst: Float64Array, transposeSrc: boolean): void => {
    for (let c = 0; c < q; c++) {
      for (let i = 0; i < q; i++) {
        let s = transposeSrc ? src[i * q + c] : src[c * q + i];
        for (let k = 0; k < i; k++) s -= l[k * q + i] * dst[c * q + k];
        dst[c * q + i] = s / l[i * q + i];
      }
    }
  };
  const asym = new Float64Array(q * q);
  for (let j = 0; j < q; j++) for (let i = 0; i < q; i++) asym[j * q + i] = 0.5 * (a[j * q + i] + a[i * q + j]);
  forward(asym, w, false);
  const c = new Float64Array(q * q);
  forward(w, c, true);
  const rows: number[][] = [];
  for (let i = 0; i < q; i++) {
    const row = new Array<number>(q);
    for (let j = 0; j < q; j++) row[j] = 0.5 * (c[j * q + i] + c[i * q + j]);
    rows.push(row);
  }
  const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
  const lam = evd.realEigenvalues;
  const z = evd.eigenvectorMatrix;
  const order = lam.map((_, i) => i).sort((i, j) => lam[i] - lam[j] || i - j);
  const values = new Float64Array(q);
  const vectors = new Float64Array(q * q);
  // Q = L⁻ᵀ Z: back substitution with Lᵀ on each eigenvector.
  for (let c2 = 0; c2 < q; c2++) {
    const src = order[c2];
    values[c2] = lam[src];
    const o = c2 * q;
    for (let i = q - 1; i >= 0; i--) {
      let s = z.get(i, src);
      for (let k = i + 1; k < q; k++) s -= l[i * q + k] * vectors[o + k];
      vectors[o + i] = s / l[i * q + i];
    }
    for (let i = 0; i < q; i++) vectors[o + i] *= dsc[i];
  }
  return { values, vectors };
}

/**
 * Rayleigh–Ritz in place: X ← X Q where (Xᵀ K X) Q = (Xᵀ M X) Q Λ, with KX and MX given; MX
 * is rotated alongside. Returns Λ ascending.
 * @param x - basis, column-major n × q (overwritten with the Ritz vectors)
 * @param kx - K·X, column-major n × q (read only; not rotated)
 * @param mx - M·X, column-major n × q (overwritten with M times the Ritz vectors)
 * @param tmp - work buffer, length ≥ q (larger is faster: rows are rotated in blocks)
 */
export function rayleighRitz(x: Float64Array, kx: Float64Array, mx: Float64Array, n: number, q: number, tmp: Float64Array): Float64Array {
  const a = new Float64Array(q * q);
  const b = new Float64Array(q * q);
  gram(x, kx, n, q, q, a);
  gram(x, mx, n, q, q, b);
  const { values, vectors } = projectedEigen(a, b, q);
  combineColumnsInPlace(x, n, 0, q, vectors, q, q, tmp);
  combineColumnsInPlace(mx, n, 0, q, vectors, q, q, tmp);
  return values;
}
