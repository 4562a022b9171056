/**
 * Standard symmetric eigenproblem A y = λ y on a flat row-major Float64Array: Householder
 * reduction to tridiagonal form followed by the implicit QL method.
 *
 * Method: EISPACK tred2 / tql2 (Wilkinson & Reinsch, Handbook for Automatic Computation
 * vol. II, contributions II/2 and II/3), in the form of the public-domain JAMA port that
 * ml-matrix also carries (there on arrays of rows; here on one flat buffer). The QL sweeps
 * record each step's Givens rotations and then apply the whole sequence row by row, one pass
 * over V per QL step with contiguous access (the delayed-rotation idea of LAPACK's dsteqr/dlasr).
 */

/** Result of {@link symmetricEigen}. */
export interface SymmetricEigenResult {
  /** Eigenvalues, ascending, length n. */
  readonly values: Float64Array;
  /** Orthonormal eigenvectors, row-major n × n: row i (offset i·n) is the eigenvector of values[i]. */
  readonly vectors: Float64Array;
}

/**
 * Eigenvalues and orthonormal eigenvectors of a symmetric n × n matrix.
 * @param n - dimension
 * @param a - row-major n × n symmetric matrix (only read; its lower triangle is what is used
 *   first by the reduction, but a symmetric input is assumed)
 * @returns values ascending; vectors row-major with one eigenvector per row
 */
export function symmetricEigen(n: number, a: Float64Array): SymmetricEigenResult {
  const v = new Float64Array(a); // V stored transposed: v[i·n + k] = V(k, i)
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  if (n === 0) return { values: d, vectors: v };
  tred2(n, e, d, v);
  // tred2 leaves V transposed (row i = column i of V); the QL sweeps want V itself, so that
  // all rotations of one QL step stream along each row k (see tql2).
  transposeInPlace(n, v);
  tql2(n, e, d, v);
  transposeInPlace(n, v); // row i = eigenvector i
  return { values: d, vectors: v };
}

// ---- Householder tridiagonalization (tred2) -------------------------------------------------
function tred2(n: number, e: Float64Array, d: Float64Array, v: Float64Array): void {
  for (let j = 0; j < n; j++) d[j] = v[j * n + n - 1];

  for (let i = n - 1; i > 0; i--) {
    let scale = 0;
    let h = 0;
    for (let k = 0; k < i; k++) scale += Math.abs(d[k]);
    if (scale === 0) {
      e[i] = d[i - 1];
      for (let j = 0; j < i; j++) {
        d[j] = v[j * n + i - 1];
        v[j * n + i] = 0;
        v[i * n + j] = 0;
      }
    } else {
      for (let k = 0; k < i; k++) {
        d[k] /= scale;
        h += d[k] * d[k];
      }
      let f = d[i - 1];
      let g = Math.sqrt(h);
      if (f > 0) g = -g;
      e[i] = scale * g;
      h -= f * g;
      d[i - 1] = f - g;
      for (let j = 0; j < i; j++) e[j] = 0;

      // w = A u (A's lower part held in rows of v)
      for (let j = 0; j < i; j++) {
        const row = j * n;
        f = d[j];
        v[i * n + j] = f;
        g = e[j] + v[row + j] * f;
        for (let k = j + 1; k <= i - 1; k++) {
          const vjk = v[row + k];
          g += vjk * d[k];
          e[k] += vjk * f;
        }
        e[j] = g;
      }
      f = 0;
      for (let j = 0; j < i; j++) {
        e[j] /= h;
        f += e[j] * d[j];
      }
      const hh = f / (h + h);
      for (let j = 0; j < i; j++) e[j] -= hh * d[j];
      // A ← A − u wᵀ − w uᵀ
      for (let j = 0; j < i; j++) {
        const row = j * n;
        f = d[j];
        g = e[j];
        for (let k = j; k <= i - 1; k++) v[row + k] -= f * e[k] + g * d[k];
        d[j] = v[row + i - 1];
        v[row + i] = 0;
      }
    }
    d[i] = h;
  }

  // Accumulate the transformations.
  for (let i = 0; i < n - 1; i++) {
    v[i * n + n - 1] = v[i * n + i];
    v[i * n + i] = 1;
    const h = d[i + 1];
    const rowNext = (i + 1) * n;
    if (h !== 0) {
      for (let k = 0; k <= i; k++) d[k] = v[rowNext + k] / h;
      for (let j = 0; j <= i; j++) {
        const row = j * n;
        let g = 0;
        for (let k = 0; k <= i; k++) g += v[rowNext + k] * v[row + k];
        for (let k = 0; k <= i; k++) v[row + k] -= g * d[k];
      }
    }
    for (let k = 0; k <= i; k++) v[rowNext + k] = 0;
  }
  for (let j = 0; j < n; j++) {
    d[j] = v[j * n + n - 1];
    v[j * n + n - 1] = 0;
  }
  v[(n - 1) * n + n - 1] = 1;
  e[0] = 0;
}

/** A ← Aᵀ for a row-major n × n array. */
export function transposeInPlace(n: number, a: Float64Array): void {
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const t = a[i * n + j];
      a[i * n + j] = a[j * n + i];
      a[j * n + i] = t;
    }
  }
}

// ---- Implicit QL on the tridiagonal matrix (tql2) -------------------------------------------

/** tql2 on V stored as itself: v[k·n + i] = V(k, i), eigenvector i is column i. */
function tql2(n: number, e: Float64Array, d: Float64Array, v: Float64Array): void {
  const cs = new Float64Array(n);
  const sn = new Float64Array(n);
  for (let i = 1; i < n; i++) e[i - 1] = e[i];
  e[n - 1] = 0;
  let f = 0;
  let tst1 = 0;
  const eps = Number.EPSILON;

  for (let l = 0; l < n; l++) {
    tst1 = Math.max(tst1, Math.abs(d[l]) + Math.abs(e[l]));
    let m = l;
    while (m < n) {
      if (Math.abs(e[m]) <= eps * tst1) break;
      m++;
    }
    if (m > l) {
      do {
        let g = d[l];
        let p = (d[l + 1] - g) / (2 * e[l]);
        let r = Math.hypot(p, 1);
        if (p < 0) r = -r;
        d[l] = e[l] / (p + r);
        d[l + 1] = e[l] * (p + r);
        const dl1 = d[l + 1];
        let h = g - d[l];
        for (let i = l + 2; i < n; i++) d[i] -= h;
        f += h;

        p = d[m];
        let c = 1;
        let c2 = c;
        let c3 = c;
        const el1 = e[l + 1];
        let s = 0;
        let s2 = 0;
        for (let i = m - 1; i >= l; i--) {
          c3 = c2;
          c2 = c;
          s2 = s;
          g = c * e[i];
          h = c * p;
          r = Math.hypot(p, e[i]);
          e[i + 1] = s * r;
          s = e[i] / r;
          c = p / r;
          p = c * d[i] - s * g;
          d[i + 1] = h + s * (c * g + s * d[i]);
          cs[i] = c;
          sn[i] = s;
        }
        // Apply the step's rotations (i = m−1 … l, on columns i, i+1 of V) along each row.
        for (let k = 0; k < n; k++) {
          const row = k * n;
          let t = v[row + m];
          for (let i = m - 1; i >= l; i--) {
            const u = v[row + i];
            v[row + i + 1] = sn[i] * u + cs[i] * t;
            t = cs[i] * u - sn[i] * t;
          }
          v[row + l] = t;
        }
        p = (-s * s2 * c3 * el1 * e[l]) / dl1;
        e[l] = s * p;
        d[l] = c * p;
      } while (Math.abs(e[l]) > eps * tst1);
    }
    d[l] += f;
    e[l] = 0;
  }

  // Selection sort, ascending, swapping eigenvector columns.
  for (let i = 0; i < n - 1; i++) {
    let k = i;
    let p = d[i];
    for (let j = i + 1; j < n; j++) {
      if (d[j] < p) {
        k = j;
        p = d[j];
      }
    }
    if (k !== i) {
      d[k] = d[i];
      d[i] = p;
      for (let j = 0; j < n; j++) {
        const row = j * n;
        const t = v[row + i];
        v[row + i] = v[row + k];
        v[row + k] = t;
      }
    }
  }
}
