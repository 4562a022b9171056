/**
 * Rayleigh–Ritz on a subspace: given a basis X (n × q) of an approximate invariant subspace,
 * solve the projected problem (Xᵀ K X) Q = (Xᵀ M X) Q Λ densely and rotate X ← X Q. The result
 * is M-orthonormal to round-off and carries the best eigenvalue estimates the subspace holds
 * (Parlett, The Symmetric Eigenvalue Problem, §11.3; Bathe, Finite Element Procedures §11.6.3).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { VerificationError } from '../errors';
import type { Operator } from '../linalg/operator';
import { combineColumnsInPlace, dotColumns, gram, subtractColumns } from './kernels';

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

/**
 * {@link rayleighRitz} with K given as an operator: Xᵀ K X is formed one column at a time
 * (one n-vector of work instead of an n × q block K·X), with the same sums as `gram`, so the
 * result is the same to the bit.
 * @param x - basis, column-major n × q (overwritten with the Ritz vectors)
 * @param k - y ← K·x
 * @param mx - M·X, column-major n × q (overwritten with M times the Ritz vectors when
 *   `rotateMass`, else left as it is: M times the input basis)
 * @param tmp - work buffer, length ≥ q (larger is faster: rows are rotated in blocks)
 * @param rotateMass - rotate mx too (a caller that needs no M·X afterwards saves an n × q × q
 *   product) @defaultValue true
 */
export function rayleighRitzOperator(x: Float64Array, k: Operator, mx: Float64Array, n: number, q: number, tmp: Float64Array, rotateMass = true): Float64Array {
  const a = new Float64Array(q * q);
  const b = new Float64Array(q * q);
  const kx = new Float64Array(n);
  for (let j = 0; j < q; j++) {
    k.apply(x.subarray(j * n, (j + 1) * n), kx);
    dotColumns(x, n, 0, q, kx, a.subarray(j * q, (j + 1) * q));
  }
  gram(x, mx, n, q, q, b);
  const { values, vectors } = projectedEigen(a, b, q);
  combineColumnsInPlace(x, n, 0, q, vectors, q, q, tmp);
  if (rotateMass) combineColumnsInPlace(mx, n, 0, q, vectors, q, q, tmp);
  return values;
}

/** Result of {@link mGramSchmidt}. */
export interface GramSchmidtResult {
  /** Columns kept, k. */
  readonly kept: number;
  /** Smallest M-norm² ratio (after / before orthogonalisation) of a kept column; 0 when one was dropped, 1 when none lost norm. */
  readonly minRatio: number;
}

/**
 * Rank-revealing M-orthonormalisation of a block in place by classical Gram–Schmidt with one
 * reorthogonalisation ("twice is enough": Giraud, Langou & Rozložník, Comput. Math. Appl. 50,
 * 2005; Parlett, The Symmetric Eigenvalue Problem, §6.9), in the M-inner product with M·x kept
 * alongside (no operator applications). A column whose M-norm after orthogonalisation falls to
 * dropTolerance times its M-norm before is dropped as M-dependent; norms, not Gram matrices, are
 * compared, so an independence of 1e-8 is still seen (a Gram matrix would square it to ε).
 * The kept k columns are compacted to [0, k) of x and mx, in their original order.
 * M·x is updated by the same recurrence, so its error grows as ε / (kept norm ratio): a second
 * call after recomputing mx = M x brings it back to round-off.
 * @param x - block, column-major n × m (overwritten)
 * @param mx - M·x, column-major n × m (overwritten)
 * @param dropTolerance - relative M-norm floor, in (0, 1)
 * @param t - output, column-major m × m (length ≥ m²): columns [0, k) hold T with x_new = x_old T
 * @param h - work buffer, length ≥ m
 * @returns the number k of M-orthonormal columns kept, and the smallest M-norm² ratio
 *   (after / before orthogonalisation) among them, 0 when a column was dropped
 * @throws VerificationError (path `projection`) when a column holds non-finite values
 */
export function mGramSchmidt(x: Float64Array, mx: Float64Array, n: number, m: number, dropTolerance: number, t: Float64Array, h: Float64Array): GramSchmidtResult {
  t.fill(0, 0, m * m);
  const tj = new Float64Array(m);
  let k = 0;
  let minRatio = 1;
  for (let j = 0; j < m; j++) {
    const v = x.subarray(j * n, (j + 1) * n);
    const w = mx.subarray(j * n, (j + 1) * n);
    let s0 = 0;
    for (let i = 0; i < n; i++) s0 += v[i] * w[i];
    if (!Number.isFinite(s0)) {
      throw new VerificationError(`basis vector ${j} has M-norm² ${s0}; the iteration produced non-finite values — check K and M for NaN or overflow`, 'projection');
    }
    if (!(s0 > 0)) continue;
    tj.fill(0);
    tj[j] = 1;
    let s = s0;
    // Second pass only when the first removed more than half of the M-norm² (Kahan–Parlett
    // criterion, Parlett §6.9: a norm kept above 1/√2 leaves orthogonality at round-off).
    for (let pass = 0; pass < 2 && k > 0 && !(pass === 1 && s > 0.5 * s0); pass++) {
      dotColumns(mx, n, 0, k, v, h); // h_i = (M q_i)ᵀ v = q_iᵀ M v
      subtractColumns(x, n, 0, k, h, v);
      subtractColumns(mx, n, 0, k, h, w);
      for (let i = 0; i < k; i++) {
        const hi = h[i];
        if (hi === 0) continue;
        for (let r = 0; r < m; r++) tj[r] -= t[i * m + r] * hi;
      }
      s = 0;
      for (let i = 0; i < n; i++) s += v[i] * w[i];
    }
    if (!(s > dropTolerance * dropTolerance * s0)) {
      minRatio = 0;
      continue;
    }
    if (s < minRatio * s0) minRatio = s / s0;
    const inv = 1 / Math.sqrt(s);
    const o = k * n;
    for (let i = 0; i < n; i++) {
      x[o + i] = v[i] * inv;
      mx[o + i] = w[i] * inv;
    }
    for (let r = 0; r < m; r++) t[k * m + r] = tj[r] * inv;
    k++;
  }
  return { kept: k, minRatio };
}

/**
 * C ← Tᵀ A T (a congruence) for A column-major m × m symmetric and T column-major m × k; C is
 * k × k column-major, symmetrised.
 */
export function congruence(a: Float64Array, m: number, t: Float64Array, k: number): Float64Array {
  const at = new Float64Array(m * k);
  for (let c = 0; c < k; c++) {
    for (let j = 0; j < m; j++) {
      const tj = t[c * m + j];
      if (tj === 0) continue;
      for (let i = 0; i < m; i++) at[c * m + i] += a[j * m + i] * tj;
    }
  }
  const out = new Float64Array(k * k);
  for (let c = 0; c < k; c++) {
    for (let r = 0; r <= c; r++) {
      let s = 0;
      for (let i = 0; i < m; i++) s += t[r * m + i] * at[c * m + i];
      out[c * k + r] = s;
    }
  }
  for (let c = 0; c < k; c++) for (let r = c + 1; r < k; r++) out[c * k + r] = out[r * k + c];
  return out;
}

/** C ← A B for A column-major m × l and B column-major l × k; C is m × k column-major. */
export function multiplySmall(a: Float64Array, m: number, l: number, b: Float64Array, k: number): Float64Array {
  const c = new Float64Array(m * k);
  for (let col = 0; col < k; col++) {
    for (let j = 0; j < l; j++) {
      const bj = b[col * l + j];
      if (bj === 0) continue;
      for (let i = 0; i < m; i++) c[col * m + i] += a[j * m + i] * bj;
    }
  }
  return c;
}
