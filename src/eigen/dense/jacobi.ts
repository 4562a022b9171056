/**
 * The generalized Jacobi method for K x = λ M x, working on K and M together: Bathe, Finite
 * Element Procedures (1996), §11.3.3, after Bathe & Wilson, Numerical Methods in Finite Element
 * Analysis (1976). Each rotation P (unit diagonal, P_ij = α, P_ji = γ) zeroes K_ij and M_ij at
 * once; cyclic sweeps visit every pair whose coupling factors K_ij²/(K_ii K_jj) or
 * M_ij²/(M_ii M_jj) exceed the sweep threshold 10^(−2s). At convergence K and M are diagonal
 * and λ_i = K_ii / M_ii, φ_i = (column i of Π P) / √M_ii.
 *
 * Requires M symmetric positive definite (lumped mass with rotational inertia on every DOF, or
 * consistent mass); massless DOFs must be condensed out first (./condense.ts). K may be
 * singular (free-free structures). Dense, O(n³) per sweep: meant for small problems and for
 * the projected problems of subspace iteration.
 */
import { VerificationError } from '../../errors';
import { choleskyInPlace, type DensePairs } from './cholesky';

/** Options of {@link generalizedJacobi}. */
export interface JacobiOptions {
  /**
   * Convergence tolerance: stop when every relative eigenvalue change of a sweep is ≤ tol and
   * every coupling factor is ≤ tol². @defaultValue 1e-12
   */
  tolerance?: number;
  /** Sweeps before giving up with VerificationError. @defaultValue 50 */
  maxSweeps?: number;
}

/** Defaults of {@link JacobiOptions}. */
export const JACOBI_DEFAULTS = { tolerance: 1e-12, maxSweeps: 50 } as const;

/** Applies the congruence A ← Pᵀ A P on rows/columns i, j of a full symmetric row-major A. */
function rotate(n: number, a: Float64Array, i: number, j: number, alpha: number, gamma: number): void {
  const ri = i * n;
  const rj = j * n;
  const aii = a[ri + i];
  const ajj = a[rj + j];
  const aij = a[ri + j];
  for (let k = 0; k < n; k++) {
    if (k === i || k === j) continue;
    const aki = a[ri + k];
    const akj = a[rj + k];
    const ni = aki + gamma * akj;
    const nj = alpha * aki + akj;
    a[ri + k] = ni;
    a[rj + k] = nj;
    a[k * n + i] = ni;
    a[k * n + j] = nj;
  }
  a[ri + i] = aii + 2 * gamma * aij + gamma * gamma * ajj;
  a[rj + j] = ajj + 2 * alpha * aij + alpha * alpha * aii;
  a[ri + j] = 0;
  a[rj + i] = 0;
}

/**
 * Lowest `count` eigenpairs of K x = λ M x by generalized Jacobi.
 * @param n - dimension
 * @param k - stiffness, row-major n × n symmetric (not modified)
 * @param m - mass, row-major n × n symmetric positive definite (not modified)
 * @param count - number of modes wanted, 0 ≤ count ≤ n
 * @param dofOf - original DOF index of each row, for error paths
 * @throws FactorizationError (path `row i`) when M is not positive definite;
 *   VerificationError (path `maxSweeps`) when the sweeps do not converge
 */
export function generalizedJacobi(n: number, k: Float64Array, m: Float64Array, count: number, dofOf: Int32Array, options: JacobiOptions = {}): DensePairs {
  const { tolerance, maxSweeps } = { ...JACOBI_DEFAULTS, ...options };
  const t0 = performance.now();
  const K = new Float64Array(k);
  const M = new Float64Array(m);
  // M must be positive definite (positive diagonals alone do not make it so): a Cholesky
  // factorization of a copy proves it, names the first failing DOF, and costs n³/3, a few per
  // cent of one sweep (≈ 10n³).
  choleskyInPlace(n, new Float64Array(m), dofOf);
  const phi = new Float64Array(n * n); // row i = column i of Φ = Π P (contiguous rotations)
  const lambda = new Float64Array(n);
  let kScale = 0;
  for (let i = 0; i < n; i++) {
    phi[i * n + i] = 1;
    lambda[i] = K[i * n + i] / M[i * n + i];
    kScale = Math.max(kScale, Math.abs(K[i * n + i]));
  }
  // K couplings smaller than this are round-off (rigid-body modes have K_ii ≈ 0 and must not be
  // rotated against each other forever).
  const kTiny = 16 * Number.EPSILON * kScale;
  const tol2 = tolerance * tolerance;
  let sweeps = 0;
  let rotations = 0;
  let converged = n <= 1;
  let worst = 0;

  // ---- one cyclic sweep: rotate every pair whose coupling exceeds the threshold ----
  const sweep = (threshold: number): void => {
    for (let i = 0; i < n - 1; i++) {
      for (let j = i + 1; j < n; j++) {
        const kii = K[i * n + i];
        const kjj = K[j * n + j];
        const kij = K[i * n + j];
        const mii = M[i * n + i];
        const mjj = M[j * n + j];
        const mij = M[i * n + j];
        const ck = Math.abs(kij) <= kTiny ? 0 : (kij * kij) / Math.abs(kii * kjj);
        const cm = (mij * mij) / (mii * mjj);
        if (!(ck > threshold) && !(cm > threshold)) continue;
        // Bathe (1996), §11.3.3: α = k̄_jj / x, γ = −k̄_ii / x.
        const kbii = kii * mij - mii * kij;
        const kbjj = kjj * mij - mjj * kij;
        const kb = kii * mjj - kjj * mii;
        const half = 0.5 * kb;
        const root = Math.sqrt(Math.max(0, half * half + kbii * kbjj));
        const x = half >= 0 ? half + root : half - root;
        let alpha: number;
        let gamma: number;
        if (x === 0) {
          // K and M blocks proportional: any rotation that diagonalises one diagonalises both.
          alpha = 0;
          gamma = kjj !== 0 ? -kij / kjj : -mij / mjj;
        } else {
          alpha = kbjj / x;
          gamma = -kbii / x;
        }
        rotate(n, K, i, j, alpha, gamma);
        rotate(n, M, i, j, alpha, gamma);
        const ri = i * n;
        const rj = j * n;
        for (let p = 0; p < n; p++) {
          const a = phi[ri + p];
          const b = phi[rj + p];
          phi[ri + p] = a + gamma * b;
          phi[rj + p] = alpha * a + b;
        }
        rotations++;
      }
    }
  };

  while (!converged && sweeps < maxSweeps) {
    sweeps++;
    sweep(Math.max(Math.pow(10, -2 * sweeps), tol2));
    // ---- convergence check (Bathe 1996, §11.3.3: eigenvalue change and coupling factors) ----
    converged = true;
    let lamMax = 0;
    for (let i = 0; i < n; i++) lamMax = Math.max(lamMax, Math.abs(K[i * n + i] / M[i * n + i]));
    const lamFloor = 16 * Number.EPSILON * lamMax;
    for (let i = 0; i < n; i++) {
      const now = K[i * n + i] / M[i * n + i];
      if (Math.abs(now - lambda[i]) > tolerance * Math.abs(now) + lamFloor) converged = false;
      lambda[i] = now;
    }
    worst = 0;
    for (let i = 0; i < n - 1; i++) {
      for (let j = i + 1; j < n; j++) {
        const kij = K[i * n + j];
        const mij = M[i * n + j];
        const ck = Math.abs(kij) <= kTiny ? 0 : (kij * kij) / Math.abs(K[i * n + i] * K[j * n + j]);
        const cm = (mij * mij) / (M[i * n + i] * M[j * n + j]);
        worst = Math.max(worst, ck, cm);
      }
    }
    if (!(worst <= tol2)) converged = false;
  }
  if (converged && n > 1) {
    // Polishing sweep: with couplings ≤ tol² one more sweep at threshold ε² takes K and M to
    // diagonal within round-off (Jacobi converges quadratically), so the returned modes are
    // M-orthonormal to ~1e-15 rather than to tol.
    sweeps++;
    sweep(Number.EPSILON * Number.EPSILON);
    for (let i = 0; i < n; i++) lambda[i] = K[i * n + i] / M[i * n + i];
  }
  if (!converged) {
    throw new VerificationError(
      `generalized Jacobi did not converge in ${maxSweeps} sweeps (largest coupling factor ${worst.toExponential(3)}, target ${tol2.toExponential(3)}); raise maxSweeps or loosen tolerance`,
      'maxSweeps',
    );
  }

  // ---- sort ascending, scale to unit modal mass ----
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => lambda[a] - lambda[b]);
  const values = new Float64Array(count);
  const vectors = new Float64Array(n * count);
  for (let c = 0; c < count; c++) {
    const i = order[c];
    values[c] = lambda[i];
    const s = 1 / Math.sqrt(M[i * n + i]);
    const src = i * n;
    const dst = c * n;
    for (let p = 0; p < n; p++) vectors[dst + p] = phi[src + p] * s;
  }
  return { values, vectors, stats: { sweeps, rotations, msJacobi: performance.now() - t0 } };
}
