/**
 * Condensation of a mass matrix's null space when it is not made of whole zero rows.
 *
 * condense.ts removes DOFs whose row of M is zero. A singular M can also have no zero row: the
 * lumped torsional inertia of a skew space member is ρIₚL/2 · x xᵀ on the three rotations of
 * each node (rank 1, every row nonzero), so a node reached by one skew member has two massless
 * rotation directions that are not DOFs. The Cholesky reduction then meets a zero pivot.
 *
 * Here M = Q diag(d) Qᵀ (symmetric eigendecomposition); the directions with d ≈ 0 (Q₀) are
 * massless, the others (Q₁) carry mass. In the basis x = Q₁ y₁ + Q₀ y₀:
 *
 *   K̂ = QᵀKQ,  M̂ = diag(d₁, 0),  K* = K̂₁₁ − K̂₁₀ K̂₀₀⁻¹ K̂₀₁,  K* y₁ = λ diag(d₁) y₁,
 *   y₀ = −K̂₀₀⁻¹ K̂₀₁ y₁,
 *
 * the static condensation of condense.ts applied in the eigenbasis of M (Bathe, Finite Element
 * Procedures, 1996, §10.3.1; exact for directions without mass). The finite eigenvalues are
 * those of the r × r problem, r = rank M.
 */
import { FactorizationError } from '../../errors';
import { symmetricEigen } from './symmetric';

/** An eigenvalue of M at or below this times the largest is a massless direction. @defaultValue 1e-13 */
export const NULL_MASS_TOLERANCE = 1e-13;

/** The reduced problem on M's range, and how to map its modes back. */
export interface NullMassReduction {
  /** Rank of M: the number of finite eigenvalues. */
  readonly r: number;
  /** K*, row-major r × r. */
  readonly k: Float64Array;
  /** diag(d₁) as a row-major r × r matrix. */
  readonly m: Float64Array;
  /** For error paths: the original DOF that dominates each reduced row, length r. */
  readonly dofOf: Int32Array;
  /** Maps reduced modes (column-major r × count) to modes of the input problem (column-major n × count). */
  expand(y: Float64Array, count: number): Float64Array;
}

/**
 * Reduces K x = λ M x with M symmetric positive semidefinite and singular (n × n row-major) to
 * its finite part.
 * @param n - dimension
 * @param k - stiffness, row-major n × n (not modified)
 * @param m - mass, row-major n × n positive semidefinite (not modified)
 * @param dofOf - original DOF index of each row, for error paths
 * @returns the reduction, or null when M has no null direction or is clearly indefinite (an
 *   eigenvalue below −√tol · max): then use k and m as they are (the Cholesky route reports an
 *   indefinite M by DOF)
 * @throws FactorizationError (path `row i`) when K is singular on M's null space (a massless
 *   mechanism)
 */
export function reduceNullMass(n: number, k: Float64Array, m: Float64Array, dofOf: Int32Array): NullMassReduction | null {
  // ---- M = Q diag(d) Qᵀ; rows of q are eigenvectors, d ascending ----
  const { values: d, vectors: q } = symmetricEigen(n, m);
  const dMax = Math.max(Math.abs(d[0]), Math.abs(d[n - 1]));
  const tol = NULL_MASS_TOLERANCE * dMax;
  // Clearly indefinite: not a null space to condense; the Cholesky route reports it by DOF.
  if (d[0] < -Math.sqrt(NULL_MASS_TOLERANCE) * dMax) return null;
  let s = 0;
  while (s < n && d[s] <= tol) s++;
  if (s === 0) return null;
  const r = n - s;

  // ---- KQ, then K̂ = QᵀKQ (row-major n × n, in the order of d) ----
  const kq = new Float64Array(n * n); // kq[i·n + c] = (K Q)(i, c), Q(·, c) = row c of q
  for (let i = 0; i < n; i++) {
    const ki = i * n;
    for (let c = 0; c < n; c++) {
      const qc = c * n;
      let t = 0;
      for (let j = 0; j < n; j++) t += k[ki + j] * q[qc + j];
      kq[ki + c] = t;
    }
  }
  const kh = new Float64Array(n * n);
  for (let a = 0; a < n; a++) {
    const qa = a * n;
    for (let c = 0; c <= a; c++) {
      let t = 0;
      for (let i = 0; i < n; i++) t += q[qa + i] * kq[i * n + c];
      kh[a * n + c] = t;
      kh[c * n + a] = t;
    }
  }

  // ---- Cholesky of K̂₀₀ (indices 0..s−1): K positive semidefinite, so it must be definite ----
  const l = new Float64Array(s * s);
  let kMax = 0;
  for (let a = 0; a < s; a++) kMax = Math.max(kMax, kh[a * n + a]);
  for (let j = 0; j < s; j++) {
    let v = kh[j * n + j];
    for (let p = 0; p < j; p++) v -= l[j * s + p] ** 2;
    if (!(v > 1e-13 * kMax)) {
      const at = largestEntry(q, j, n);
      throw new FactorizationError(
        `a massless motion (mostly DOF ${dofOf[at]}) has no stiffness (pivot ${v.toExponential(3)}): K and M share a null vector; add stiffness or mass there`,
        `row ${dofOf[at]}`,
      );
    }
    const ljj = Math.sqrt(v);
    l[j * s + j] = ljj;
    for (let i = j + 1; i < s; i++) {
      let t = kh[i * n + j];
      for (let p = 0; p < j; p++) t -= l[i * s + p] * l[j * s + p];
      l[i * s + j] = t / ljj;
    }
  }
  // Z = K̂₀₀⁻¹ K̂₀₁, s × r, column by column (forward then backward substitution).
  const z = new Float64Array(s * r);
  for (let c = 0; c < r; c++) {
    for (let i = 0; i < s; i++) {
      let t = kh[i * n + s + c];
      for (let p = 0; p < i; p++) t -= l[i * s + p] * z[p * r + c];
      z[i * r + c] = t / l[i * s + i];
    }
    for (let i = s - 1; i >= 0; i--) {
      let t = z[i * r + c];
      for (let p = i + 1; p < s; p++) t -= l[p * s + i] * z[p * r + c];
      z[i * r + c] = t / l[i * s + i];
    }
  }
  // K* = K̂₁₁ − K̂₁₀ Z, symmetrised; M* = diag(d₁).
  const ks = new Float64Array(r * r);
  const ms = new Float64Array(r * r);
  for (let a = 0; a < r; a++) {
    for (let b = 0; b <= a; b++) {
      let t = kh[(s + a) * n + s + b];
      for (let p = 0; p < s; p++) t -= kh[(s + a) * n + p] * z[p * r + b];
      ks[a * r + b] = t;
    }
    ms[a * r + a] = d[s + a];
  }
  for (let a = 0; a < r; a++) for (let b = 0; b < a; b++) ks[b * r + a] = ks[a * r + b];

  return {
    r,
    k: ks,
    m: ms,
    dofOf: Int32Array.from({ length: r }, (_, c) => dofOf[largestEntry(q, s + c, n)]),
    expand(y: Float64Array, count: number): Float64Array {
      const x = new Float64Array(n * count);
      const y0 = new Float64Array(s);
      for (let j = 0; j < count; j++) {
        const yj = j * r;
        for (let i = 0; i < s; i++) {
          let t = 0;
          for (let b = 0; b < r; b++) t -= z[i * r + b] * y[yj + b];
          y0[i] = t;
        }
        const xj = j * n;
        for (let c = 0; c < s; c++) {
          const qc = c * n;
          for (let i = 0; i < n; i++) x[xj + i] += q[qc + i] * y0[c];
        }
        for (let c = 0; c < r; c++) {
          const qc = (s + c) * n;
          const v = y[yj + c];
          for (let i = 0; i < n; i++) x[xj + i] += q[qc + i] * v;
        }
      }
      return x;
    },
  };
}

/** Index of the largest |entry| of row `row` of the row-major n × n array q. */
function largestEntry(q: Float64Array, row: number, n: number): number {
  let best = 0;
  for (let i = 1; i < n; i++) if (Math.abs(q[row * n + i]) > Math.abs(q[row * n + best])) best = i;
  return best;
}
