/**
 * Is a mass matrix positive semidefinite? K x = λ M x with an indefinite M has modes of negative
 * "mass" that no solver here returns correctly (the M-inner product of Lanczos is not an inner
 * product, and the Sturm count no longer counts eigenvalues below σ), so M is checked before any
 * solve, in three stages of rising cost:
 *
 * 1. O(nnz), necessary conditions: finite entries, a non-negative diagonal, and every 2 × 2
 *    principal minor ≥ 0, i.e. |m_ij| ≤ √(m_ii m_jj) (Golub & Van Loan, Matrix Computations,
 *    4th ed., §4.2.1: principal submatrices of a semidefinite matrix are semidefinite). The
 *    offending entry is named.
 * 2. O(nnz), a sufficient condition: with D = diag(M), the scaled matrix S = D^{-1/2} M D^{-1/2}
 *    has a unit diagonal; if every row of S has Σ_{j≠i} |s_ij| ≤ 1, Gershgorin's theorem puts
 *    every eigenvalue of S in [0, 2], so S, and M (congruent to S), is semidefinite (Golub & Van
 *    Loan §7.2.1; Sylvester's law of inertia). A diagonal (lumped) mass passes here.
 * 3. One sparse LDLᵀ factorization (stage `complete`), where stage 2 proves nothing: the
 *    inertia of S + δI, δ = MASS_DEFINITENESS_TOLERANCE. By Sylvester's law its negative pivots
 *    count the eigenvalues of S below −δ, i.e. the directions x with xᵀMx < −δ·xᵀDx: M is
 *    refused with that count. S + δI is positive definite for any semidefinite M (singular ones
 *    included: massless DOFs, rank-one lumped inertia blocks), so the factorization without
 *    pivoting is stable there (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed.,
 *    §10.1). The scaling by D makes the test independent of units: kg on translations and
 *    kg·m² on rotations can differ by many orders of magnitude.
 *
 * A mass matrix assembled from element mass matrices (each semidefinite) and point masses is
 * semidefinite by construction; a caller that knows this passes `massCheck: 'minors'` and skips
 * stage 3. Matrices from outside (Matrix Market files, other programs) get the complete check.
 */
import { ArgumentError, FactorizationError } from '../errors';
import { analyse } from '../linalg/ldlt/analyse';
import { factorize } from '../linalg/ldlt/factorize';
import type { OrderingName } from '../linalg/ldlt/types';
import type { SymmetricCsc } from '../linalg/sparse/symmetric';

/** How much of the semidefiniteness check of M to make: see the file header. */
export type MassCheck = 'complete' | 'minors';

/**
 * δ of stage 3: an eigenvalue of D^{-1/2} M D^{-1/2} below −δ makes M indefinite. Relative to
 * the unit diagonal of the scaled matrix, so far above round-off (≈ 1e-16 · n), far below any
 * physical negative mass.
 */
export const MASS_DEFINITENESS_TOLERANCE = 1e-12;

/** Options of {@link checkMassSemidefinite}. */
export interface MassCheckOptions {
  /** `complete`: all three stages; `minors`: stages 1 and 2 only. @defaultValue 'complete' */
  check?: MassCheck;
  /** Fill-reducing ordering of the stage-3 factorization. @defaultValue 'auto' */
  ordering?: OrderingName | Int32Array;
  /** Largest factor allowed for stage 3, bytes; above it the check is refused (FactorizationError, path `memory`). @defaultValue 8 GiB */
  maxFactorBytes?: number;
}

/** Defaults of {@link MassCheckOptions}. */
export const MASS_CHECK_DEFAULTS = { check: 'complete', ordering: 'auto', maxFactorBytes: 8 * 2 ** 30 } as const;

/** What the check found; M failing it throws instead. */
export interface MassCheckResult {
  /** The stage that proved M semidefinite: `diagonal dominance` (stage 2), `factorization` (stage 3), or `minors` when stage 3 was skipped unproven. */
  readonly provedBy: 'diagonal dominance' | 'factorization' | 'minors';
  /** Milliseconds spent in the check. */
  readonly ms: number;
}

/**
 * Checks that a mass matrix is positive semidefinite (file header: three stages).
 * @param M - mass, n × n symmetric, lower CSC (kg, kg·m²); not modified
 * @param options - see {@link MassCheckOptions}; defaults in {@link MASS_CHECK_DEFAULTS}
 * @returns which stage proved it, and the time taken
 * @throws ArgumentError with path `M(i, j)` for a non-finite entry, a negative diagonal entry or
 *   a 2 × 2 minor below zero; with path `M` when the factorization finds negative eigenvalues
 *   (the message gives their number); with path `massCheck` for an unknown check
 */
export function checkMassSemidefinite(M: SymmetricCsc, options: MassCheckOptions = {}): MassCheckResult {
  const t0 = performance.now();
  const o = { ...MASS_CHECK_DEFAULTS, ...Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined)) } as Required<MassCheckOptions>;
  if (o.check !== 'complete' && o.check !== 'minors') {
    throw new ArgumentError(`massCheck is ${JSON.stringify(o.check)}; use 'complete' (a factorization where the cheap tests prove nothing) or 'minors' (for a mass matrix assembled from element matrices)`, 'massCheck');
  }
  const { n, colPtr, rowIdx, values } = M;

  // ---- stage 1: finite entries, diagonal ≥ 0, 2 × 2 minors ≥ 0 ----
  const d = new Float64Array(n);
  let maxDiag = 0;
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const v = values[p];
      if (!Number.isFinite(v)) throw new ArgumentError(`entry (${rowIdx[p]}, ${j}) is ${v}; a mass matrix holds finite numbers`, `M(${rowIdx[p]}, ${j})`);
      if (rowIdx[p] === j) d[j] = v;
    }
    if (d[j] < 0) {
      throw new ArgumentError(`diagonal entry ${d[j]} of row ${j} is negative, so M is not positive semidefinite; masses and inertias must be ≥ 0 (check the sign)`, `M(${j}, ${j})`);
    }
    if (d[j] > maxDiag) maxDiag = d[j];
  }
  const slack = 1e-14 * maxDiag;
  // Row sums of the scaled off-diagonal magnitudes, for stage 2.
  const rowSum = new Float64Array(n);
  let dominant = true;
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      if (i === j) continue;
      const a = Math.abs(values[p]);
      const g = Math.sqrt(d[i] * d[j]);
      if (a > g * (1 + 1e-8) + slack) {
        throw new ArgumentError(
          `|m(${i}, ${j})| = ${a} exceeds √(m(${i}, ${i})·m(${j}, ${j})) = ${g}, so M is not positive semidefinite; check the coupling mass between these DOFs`,
          `M(${i}, ${j})`,
        );
      }
      // A coupling beside a zero diagonal passed stage 1 only as round-off (≤ slack): it is
      // treated as zero, as the solvers treat that DOF as massless.
      if (a === 0 || g === 0) continue;
      rowSum[i] += a / g;
      rowSum[j] += a / g;
    }
  }
  // ---- stage 2: scaled diagonal dominance (Gershgorin) ----
  for (let i = 0; i < n && dominant; i++) if (rowSum[i] > 1) dominant = false;
  if (dominant) return { provedBy: 'diagonal dominance', ms: performance.now() - t0 };
  if (o.check === 'minors') return { provedBy: 'minors', ms: performance.now() - t0 };

  // ---- stage 3: inertia of S + δI, S = D^{-1/2} M D^{-1/2} ----
  // A zero-diagonal row (a massless DOF) keeps only its pivot δ: its couplings are round-off
  // (stage 1) and are dropped, as in stage 2.
  const scale = new Float64Array(n);
  for (let i = 0; i < n; i++) scale[i] = d[i] > 0 ? 1 / Math.sqrt(d[i]) : 0;
  const { pattern, map, diagAt } = withDiagonal(M);
  const sym = analyse(pattern, { ordering: o.ordering });
  const bytes = 8 * (sym.nnzL + 3 * sym.n);
  if (bytes > o.maxFactorBytes) {
    throw new FactorizationError(
      `the check that the ${n}-DOF mass matrix is positive semidefinite needs about ${(bytes / 2 ** 30).toFixed(2)} GiB (nnz(L) = ${sym.nnzL.toExponential(3)} with the ${sym.ordering} ordering), above the limit of ${(o.maxFactorBytes / 2 ** 30).toFixed(2)} GiB; reduce the model, raise maxFactorBytes where the machine has the memory, or pass massCheck: 'minors' if M is known to be semidefinite`,
      'memory',
    );
  }
  const s = new Float64Array(pattern.colPtr[n]);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) s[map[p]] = values[p] * scale[rowIdx[p]] * scale[j];
  }
  let delta = MASS_DEFINITENESS_TOLERANCE;
  for (let attempt = 0; ; attempt++) {
    const a = attempt === 0 ? s : s.slice();
    for (let j = 0; j < n; j++) a[diagAt[j]] += delta;
    let negative: number;
    try {
      negative = factorize(sym, a, { pivotTolerance: Number.EPSILON * Number.EPSILON }).negativePivots;
    } catch (e) {
      // A pivot of exactly zero: an eigenvalue of S at −δ. Decide one step further out.
      if (!(e instanceof FactorizationError) || attempt > 0) throw e;
      delta *= 2;
      continue;
    }
    if (negative > 0) {
      throw new ArgumentError(
        `the mass matrix is not positive semidefinite: it has ${negative} negative eigenvalue(s) (an LDLᵀ factorization of D^-1/2·M·D^-1/2 + ${delta}·I, D = diag(M), has ${negative} negative pivot(s)), although its diagonal and every 2 × 2 minor are ≥ 0; check the signs of its coupling (off-diagonal) masses, or the program that wrote it`,
        'M',
      );
    }
    return { provedBy: 'factorization', ms: performance.now() - t0 };
  }
}

/**
 * M's lower pattern with every diagonal entry present (an absent one is a massless DOF), and the
 * position of each of M's entries and of each diagonal in it.
 */
function withDiagonal(M: SymmetricCsc): { pattern: SymmetricCsc; map: Int32Array; diagAt: Int32Array } {
  const { n, colPtr, rowIdx } = M;
  let missing = 0;
  for (let j = 0; j < n; j++) if (!(colPtr[j + 1] > colPtr[j] && rowIdx[colPtr[j]] === j)) missing++;
  const nz = colPtr[n] + missing;
  const cp = new Int32Array(n + 1);
  const ri = new Int32Array(nz);
  const map = new Int32Array(colPtr[n]);
  const diagAt = new Int32Array(n);
  let q = 0;
  for (let j = 0; j < n; j++) {
    cp[j] = q;
    const a = colPtr[j];
    // Rows are ascending and ≥ j, so the diagonal, when stored, comes first.
    if (!(colPtr[j + 1] > a && rowIdx[a] === j)) ri[q++] = j;
    diagAt[j] = cp[j];
    for (let p = a; p < colPtr[j + 1]; p++) {
      map[p] = q;
      ri[q++] = rowIdx[p];
    }
  }
  cp[n] = q;
  return { pattern: { n, colPtr: cp, rowIdx: ri, values: new Float64Array(nz) }, map, diagAt };
}
