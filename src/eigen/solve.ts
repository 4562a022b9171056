/**
 * The one entry for K x = λ M x: picks a method, a shift strategy and a mode selection
 * (lowest N, all in a window, nearest a target), runs it, verifies the result and reports the
 * numbers of the run.
 *
 * Sparse path (Grimes, Lewis & Simon 1994, §3–4): analyse the union pattern of K and M once,
 * factorize K − σM, run shift-invert Lanczos (or subspace iteration) for the modes nearest σ,
 * Rayleigh–Ritz the converged vectors with K and M, then prove with a Sturm count that no mode
 * was missed; when one was (the second copy of a repeated eigenvalue), run again from a new
 * start vector kept M-orthogonal to the modes already found, until the counts agree.
 */
import { AbortedError, ArgumentError, FactorizationError, VerificationError } from '../errors';
import type { LdltFactor, OrderingName, SymbolicFactor } from '../linalg/ldlt/types';
import type { SymmetricCsc } from '../linalg/sparse/symmetric';
import { assertAccepted } from './accept';
import { checkMassSemidefinite, type MassCheck } from './definiteness';
import { denseEigen } from './dense/index';
import { lanczos, type ProgressCallback } from './lanczos';
import { inverseOperator, matrixOperator, type BlockOperator } from './operators';
import { SHIFT_NUDGE, ShiftedPencil } from './pencil';
import { rayleighRitzOperator } from './ritz';
import { lowestModesShift, type LowestModesShift } from './shift';
import { STURM_PIVOT_TOLERANCE, sturmCheck } from './sturm';
import { subspaceIteration } from './subspace';
import type { EigenMethod, EigenResult, SturmCheck } from './types';
import { checkWorkLength, matrixNorm1, modeChecks, rayleighModeChecks } from './verify';

/** Methods `solve` accepts: `auto`, `dense` (= the dense default, Cholesky), or a named one. */
export type SolveMethod = 'auto' | 'dense' | EigenMethod;

/**
 * Problem size (DOFs) up to which `auto` uses the dense solver. Measured (Node 20, one core,
 * best of 9) on 3D frame towers of 1 × 1 bays, 20 modes, dense Cholesky route vs Lanczos:
 * n = 48: 2 vs 34 ms; 96: 9 vs 10 ms; 144: 27 vs 27 ms; 192: 66 vs 16 ms; 288: 206 vs 22 ms.
 * The crossover sits near 150 DOF; below it the dense route also handles every count ≤ n.
 */
export const DENSE_CROSSOVER = 150;

/**
 * Free-free structures (K singular): the lowest-modes shift is at most σ = −FREE_SHIFT ·
 * trace(K)/trace(M), a small fraction of a typical eigenvalue, so that K − σM is positive
 * definite, rigid-body modes have the largest θ = 1/(λ − σ) and come out first, with λ ≈ 0
 * (possibly a tiny negative number). When Sturm counts find an eigenvalue that is not ≈ 0 below
 * that, |σ| is reduced to its scale (shift.ts, lowestModesShift).
 */
export const FREE_SHIFT = 1e-6;

/**
 * Smallest pivot of K (relative to its largest diagonal entry) for which the lowest modes are
 * sought with σ = 0; below it K is treated as singular and σ = −FREE_SHIFT · trace(K)/trace(M)
 * is used instead. Measured: supported 3D frame towers and truss footbridges give 2.5e-3…5.3e-3;
 * free-free frames and chains have a pivot below the factorization's own 1e-13 tolerance. The
 * margin guards against a singular K whose zero pivot round-off left just above that tolerance,
 * which would give the rigid-body modes θ ≈ 1e12… and drown the flexible ones in cancellation.
 */
export const ZERO_SHIFT_PIVOT_RATIO = 1e-10;

/** Sturm/rerun rounds before a missed mode is reported as a VerificationError. */
export const MAX_ROUNDS = 8;

/** Modes solved per shift in a range; wider windows are split at Sturm-counted midpoints. */
export const RANGE_BLOCK = 48;

export interface SolveOptions {
  /** Lowest N modes (or, with `near`, the N nearest the target). @defaultValue 20 */
  count?: number;
  /**
   * All modes with λ in [λlow, λhigh] (rad²/s²); the Sturm counts at both ends give the exact
   * number, and the result holds exactly that many. Overrides `count`. @defaultValue none
   */
  range?: readonly [number, number];
  /** The `count` modes whose λ is nearest this target (rad²/s²). @defaultValue none */
  near?: number;
  /**
   * `auto`: dense up to DENSE_CROSSOVER DOFs, else `lanczos`. `dense`: the dense Cholesky route.
   * `jacobi`, `cholesky`: dense methods by name. `lanczos`, `subspace`: the sparse shift-invert
   * methods. @defaultValue 'auto'
   */
  method?: SolveMethod;
  /**
   * Explicit shift σ (rad²/s²) of the sparse methods. Default: lowest modes, 0 if K is positive
   * definite, else a negative σ sized by Sturm counts to the lowest eigenvalue that is not ≈ 0,
   * at most −FREE_SHIFT · trace(K)/trace(M) (shift.ts); `near`: the target; `range`: each
   * window's midpoint. @defaultValue automatic
   */
  shift?: number;
  /**
   * Convergence tolerance of the sparse methods: Lanczos accepts ‖OP y − θy‖_M ≤ tol·|θ|,
   * subspace iteration a relative residual ≤ tol. @defaultValue 1e-12 (lanczos), 1e-11 (subspace)
   */
  tolerance?: number;
  /** Seed of the start vectors (same seed, same result, bit for bit). @defaultValue 1 */
  seed?: number;
  /** Progress: (phase, fraction in [0, 1]); phases 'analyse', 'factorize', 'lanczos' | 'subspace', 'verify'. */
  onProgress?: ProgressCallback;
  /** Stops a long solve; AbortedError (path `signal`) is thrown. */
  signal?: AbortSignal;
  /** Fill-reducing ordering of the sparse factorization. @defaultValue 'auto' */
  ordering?: OrderingName | Int32Array;
  /**
   * An analysis of the union pattern of K and M (`analyse(unionPattern(K, M).pattern)`), reused
   * across design variants with the same pattern. @defaultValue none (analysed here)
   */
  symbolic?: SymbolicFactor;
  /**
   * Check residuals (≤ 1e-8), M-orthonormality (≤ 1e-10) and the Sturm count, throwing
   * VerificationError when one fails. With false, residuals and orthogonality are still
   * reported but nothing throws, and no Sturm count is made (so missed repeated copies are not
   * searched for). @defaultValue true
   */
  verify?: boolean;
  /**
   * Largest numeric factor allowed, bytes; larger problems are refused after the symbolic
   * analysis, with the estimate, before anything large is allocated. @defaultValue FACTOR_MEMORY_LIMIT (8 GiB)
   */
  maxFactorBytes?: number;
  /**
   * How M is checked to be positive semidefinite (definiteness.ts): `complete` adds one sparse
   * LDLᵀ factorization of the diagonally scaled M where the O(nnz) tests (diagonal, 2 × 2 minors,
   * scaled diagonal dominance) prove nothing; `minors` skips it, for a mass matrix that is
   * semidefinite by construction (assembled from element mass matrices and point masses).
   * @defaultValue 'complete' (MASS_CHECK_DEFAULTS.check)
   */
  massCheck?: MassCheck;
}

/** Defaults of {@link SolveOptions} (those that have a fixed value). */
export const SOLVE_DEFAULTS = {
  count: 20,
  method: 'auto',
  seed: 1,
  ordering: 'auto',
  verify: true,
} as const;

const METHODS: readonly SolveMethod[] = ['auto', 'dense', 'jacobi', 'cholesky', 'lanczos', 'subspace'];

/**
 * Pairs found so far: ascending λ and M-orthonormal X, column-major n × m (a merge computes
 * M·X afresh when it needs it).
 */
interface Pool {
  m: number;
  values: Float64Array;
  x: Float64Array;
  /**
   * False while the pool is one Lanczos run taken as it came (values σ + 1/θ, see extend's
   * `projectFirstRun`): the result's checks then replace them by Rayleigh quotients.
   */
  projected: boolean;
}

/**
 * Eigenpairs of K x = λ M x: the lowest `count`, all in `range`, or the `count` nearest `near`.
 * @param K - stiffness, n × n symmetric, lower CSC (N/m, N·m/rad); not modified
 * @param M - mass, n × n symmetric positive semidefinite, lower CSC (kg, kg·m²); not modified.
 *   Massless DOFs give infinite eigenvalues, which are never returned.
 * @param options - see {@link SolveOptions}; defaults in {@link SOLVE_DEFAULTS}
 * @returns eigenvalues ascending (rad²/s²), M-orthonormal modes column-major n × m, residuals,
 *   orthogonality error, Sturm check, and stats. Sparse path stats: `iterations` (Lanczos steps
 *   or subspace iterations), `restarts`, `operatorApplications` (solves with the factor),
 *   `factorizations` (all, Sturm checks included), `rounds` (reruns after a Sturm count found a
 *   missed mode), `shift` (σ of the last iteration factor), `nnzL`, and milliseconds per phase:
 *   `analyseMs`, `factorizeMs` (iteration shifts and range-end counts), `iterationMs`,
 *   `verifyMs` (Rayleigh–Ritz, Sturm-check factorizations, residuals, orthogonality),
 *   `totalMs`. Dense path: the dense solver's stats plus `factorizations`, `verifyMs`, `totalMs`.
 * @throws ArgumentError (path = the option, `K` or `M`) for bad input, including a count above
 *   the number of finite eigenvalues; VerificationError (path `modes[k]`) when the result fails
 *   its checks; FactorizationError when K and M share a null vector; AbortedError when aborted
 */
export function solve(K: SymmetricCsc, M: SymmetricCsc, options: SolveOptions = {}): EigenResult {
  const t0 = performance.now();
  const given = Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined)) as SolveOptions;
  const o: Resolved = { ...SOLVE_DEFAULTS, ...given };
  validate(K, M, o);
  checkAbort(o);
  const n = K.n;
  const method: Exclude<SolveMethod, 'auto' | 'dense'> =
    o.method === 'auto' ? (n <= DENSE_CROSSOVER ? 'cholesky' : 'lanczos') : o.method === 'dense' ? 'cholesky' : o.method;
  if (method === 'cholesky' || method === 'jacobi') return solveDense(K, M, o, method, t0);
  return solveSparse(K, M, o, method, t0);
}

function checkAbort(o: SolveOptions): void {
  if (o.signal?.aborted) throw new AbortedError('the eigen solve was aborted through its AbortSignal; run it again without aborting to get the modes', 'signal');
}

type Resolved = SolveOptions & {
  count: number;
  method: SolveMethod;
  seed: number;
  ordering: OrderingName | Int32Array;
  verify: boolean;
};

function validate(K: SymmetricCsc, M: SymmetricCsc, o: Resolved): void {
  if (!K || !(K.colPtr instanceof Int32Array)) throw new ArgumentError('is not a SymmetricCsc; build it with CooBuilder.toCsc', 'K');
  if (!M || !(M.colPtr instanceof Int32Array)) throw new ArgumentError('is not a SymmetricCsc; build it with CooBuilder.toCsc', 'M');
  if (M.n !== K.n) throw new ArgumentError(`M is ${M.n} × ${M.n} but K is ${K.n} × ${K.n}; pass matrices of one size`, 'M');
  if (K.n < 1) throw new ArgumentError('has dimension 0; pass a matrix with at least one DOF', 'K');
  if (!METHODS.includes(o.method)) throw new ArgumentError(`unknown method ${JSON.stringify(o.method)}; use one of ${METHODS.join(', ')}`, 'method');
  if (!Number.isInteger(o.count) || o.count < 1) throw new ArgumentError(`count is ${o.count}; pass a positive integer`, 'count');
  if (o.range !== undefined) {
    const r = o.range;
    if (!Array.isArray(r) || r.length !== 2 || !Number.isFinite(r[0]) || !Number.isFinite(r[1]) || !(r[0] < r[1])) {
      throw new ArgumentError(`range is ${JSON.stringify(r)}; pass [λlow, λhigh] with finite λlow < λhigh in rad²/s²`, 'range');
    }
    if (o.near !== undefined) throw new ArgumentError('cannot be combined with range; pass either range or near', 'near');
  }
  if (o.near !== undefined && !Number.isFinite(o.near)) throw new ArgumentError(`near is ${o.near}; pass a finite target eigenvalue in rad²/s²`, 'near');
  if (o.shift !== undefined && !Number.isFinite(o.shift)) throw new ArgumentError(`shift is ${o.shift}; pass a finite number in rad²/s²`, 'shift');
  if (o.tolerance !== undefined && !(o.tolerance > 0 && o.tolerance < 1e-8)) {
    throw new ArgumentError(`tolerance is ${o.tolerance}; pass a number in (0, 1e-8) so that results can meet the 1e-8 residual target`, 'tolerance');
  }
  if (!Number.isInteger(o.seed)) throw new ArgumentError(`seed is ${o.seed}; pass an integer`, 'seed');
  checkStiffnessFinite(K);
  checkMassSemidefinite(M, { check: o.massCheck, ordering: o.ordering, maxFactorBytes: o.maxFactorBytes });
}

/** Finite entries of K (K's symmetry is built into its lower storage; its pattern is checked by analyse). */
function checkStiffnessFinite(K: SymmetricCsc): void {
  const { n, colPtr, rowIdx, values } = K;
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      if (!Number.isFinite(values[p])) throw new ArgumentError(`entry (${rowIdx[p]}, ${j}) is ${values[p]}; a stiffness matrix holds finite numbers (check the file or the element properties)`, `K(${rowIdx[p]}, ${j})`);
    }
  }
}

/** Number of DOFs whose row of M is not entirely zero: an upper bound on the finite eigenvalues. */
function massiveDofs(M: SymmetricCsc): number {
  const has = new Uint8Array(M.n);
  for (let j = 0; j < M.n; j++) {
    for (let p = M.colPtr[j]; p < M.colPtr[j + 1]; p++) {
      if (M.values[p] !== 0) {
        has[j] = 1;
        has[M.rowIdx[p]] = 1;
      }
    }
  }
  let c = 0;
  for (let i = 0; i < M.n; i++) c += has[i];
  return c;
}

// ---------------------------------------------------------------------------------------------
// Dense path
// ---------------------------------------------------------------------------------------------

function solveDense(K: SymmetricCsc, M: SymmetricCsc, o: Resolved, method: 'cholesky' | 'jacobi', t0: number): EigenResult {
  o.onProgress?.(method, 0);
  const all = denseEigen(K, M, { method, residualTolerance: Infinity, orthogonalityTolerance: Infinity });
  o.onProgress?.(method, 1);
  const total = all.eigenvalues.length;
  const n = K.n;
  let first = 0;
  let m: number;
  if (o.range) {
    while (first < total && all.eigenvalues[first] < o.range[0]) first++;
    let last = first;
    while (last < total && all.eigenvalues[last] <= o.range[1]) last++;
    m = last - first;
  } else {
    if (o.count > total) throw countError(o.count, total, n);
    m = o.count;
    if (o.near !== undefined) [first] = nearestBlock(all.eigenvalues, o.near, m);
  }
  const values = all.eigenvalues.slice(first, first + m);
  const vectors = all.vectors.slice(first * n, (first + m) * n);
  const tv = performance.now();
  let sturm: SturmCheck | undefined;
  let pencil: ShiftedPencil | undefined;
  if (o.verify && (m > 0 || o.range)) {
    pencil = new ShiftedPencil(K, M, { ordering: o.ordering, symbolic: o.symbolic, maxFactorBytes: o.maxFactorBytes });
    if (o.range) sturm = rangeCheck(pencil, o.range, m);
    else sturm = sturmCheck(pencil, all.eigenvalues, m, first, { window: o.near !== undefined, minimumGap: 1e-9 * pencil.typicalEigenvalue });
  }
  return verifiedResult(K, M, values, vectors, sturm, method, o.verify, undefined, tv, (verifyMs) => ({
    ...all.stats,
    factorizations: pencil?.factorizations ?? 0,
    verifyMs,
    totalMs: performance.now() - t0,
  }));
}

/**
 * The result of a solve: residuals and M-orthonormality from one pass over the modes
 * (verify.ts `modeChecks`), the acceptance test when `verify`, and the stats, which receive the
 * milliseconds spent here since `tv`.
 */
function verifiedResult(
  K: SymmetricCsc,
  M: SymmetricCsc,
  values: Float64Array,
  vectors: Float64Array,
  sturm: SturmCheck | undefined,
  method: EigenMethod,
  verify: boolean,
  normK: number | undefined,
  tv: number,
  stats: (verifyMs: number) => Record<string, number>,
  rayleigh = false,
): EigenResult {
  let res: Float64Array;
  let orth: number;
  // The products of the checks go to the solver's buffer behind the vectors when it has room
  // (the Lanczos basis's unused columns: memory already touched, no fresh pages).
  const work = spareAfter(vectors, checkWorkLength(K.n, values.length));
  if (rayleigh) {
    ({ residuals: res, orthogonalityError: orth } = rayleighModeChecks(K, M, values, vectors, normK, work));
    ({ values, vectors, residuals: res } = ascending(values, vectors, res, K.n));
  } else {
    ({ residuals: res, orthogonalityError: orth } = modeChecks(K, M, values, vectors, normK, work));
  }
  if (verify) assertAccepted(values, res, orth, sturm);
  const verifyMs = performance.now() - tv;
  return {
    n: K.n,
    eigenvalues: values,
    vectors,
    residuals: res,
    orthogonalityError: orth,
    ...(sturm ? { sturm } : {}),
    method,
    stats: stats(verifyMs),
  };
}

/** `length` entries of x's buffer after x itself, when the buffer holds them. */
function spareAfter(x: Float64Array, length: number): Float64Array | undefined {
  const start = x.byteOffset + x.byteLength;
  return x.buffer.byteLength - start >= 8 * length ? new Float64Array(x.buffer, start, length) : undefined;
}

/**
 * The modes in ascending order of value (ties keep their order). Rayleigh quotients of nearly
 * equal eigenvalues may come out of the order of the values they replaced; the arrays are then
 * permuted into new ones, else returned as they are.
 */
function ascending(values: Float64Array, vectors: Float64Array, residuals: Float64Array, n: number): { values: Float64Array; vectors: Float64Array; residuals: Float64Array } {
  const m = values.length;
  let sorted = true;
  for (let j = 1; j < m; j++) if (values[j] < values[j - 1]) sorted = false;
  if (sorted) return { values, vectors, residuals };
  const perm = Array.from({ length: m }, (_, j) => j).sort((a, b) => values[a] - values[b] || a - b);
  const v = new Float64Array(m);
  const x = new Float64Array(m * n);
  const r = new Float64Array(m);
  perm.forEach((from, to) => {
    v[to] = values[from];
    r[to] = residuals[from];
    x.set(vectors.subarray(from * n, (from + 1) * n), to * n);
  });
  return { values: v, vectors: x, residuals: r };
}

function countError(count: number, finite: number, n: number): ArgumentError {
  return new ArgumentError(
    `count is ${count} but the problem has only ${finite} finite eigenvalues (${n} DOFs; massless DOFs have none); pass a count from 1 to ${finite}`,
    'count',
  );
}

/** Start index of the m values nearest the target in an ascending list (a contiguous block). */
function nearestBlock(values: Float64Array, target: number, m: number): [number, number] {
  let lo = 0;
  let hi = values.length; // the block is [lo, hi); shrink from the farther end
  while (hi - lo > m) {
    if (Math.abs(values[lo] - target) > Math.abs(values[hi - 1] - target)) lo++;
    else hi--;
  }
  return [lo, hi];
}

// ---------------------------------------------------------------------------------------------
// Sparse path
// ---------------------------------------------------------------------------------------------

interface Run {
  readonly pencil: ShiftedPencil;
  readonly kop: BlockOperator;
  readonly mop: BlockOperator;
  readonly normK: number;
  readonly o: Resolved;
  readonly method: 'lanczos' | 'subspace';
  iterations: number;
  restarts: number;
  applications: number;
  iterationMs: number;
  /** Time in Rayleigh–Ritz and Sturm checks during the iteration rounds. */
  verifyMs: number;
  /** Factorization time spent inside Sturm checks (part of verifyMs, not of factorizeMs). */
  sturmFactorizeMs: number;
  rounds: number;
  seed: number;
}

function solveSparse(K: SymmetricCsc, M: SymmetricCsc, o: Resolved, method: 'lanczos' | 'subspace', t0: number): EigenResult {
  const n = K.n;
  const massive = massiveDofs(M);
  if (!o.range && o.count > massive) throw countError(o.count, massive, n);
  o.onProgress?.('analyse', 0);
  const pencil = new ShiftedPencil(K, M, { ordering: o.ordering, symbolic: o.symbolic, maxFactorBytes: o.maxFactorBytes });
  o.onProgress?.('analyse', 1);
  const run: Run = {
    pencil,
    kop: matrixOperator(K),
    mop: matrixOperator(M),
    normK: matrixNorm1(K),
    o,
    method,
    iterations: 0,
    restarts: 0,
    applications: 0,
    iterationMs: 0,
    verifyMs: 0,
    sturmFactorizeMs: 0,
    rounds: 0,
    seed: o.seed,
  };
  let values: Float64Array;
  let vectors: Float64Array;
  let sturm: SturmCheck | undefined;
  let shiftUsed: number;
  let rayleigh: boolean | undefined;
  if (o.range) {
    ({ values, vectors, sturm, shiftUsed } = solveRange(run, o.range));
  } else {
    ({ values, vectors, sturm, shiftUsed, rayleigh } = o.near !== undefined ? solveNear(run, o.near, o.count) : solveLowest(run, o.count));
  }
  const tv = performance.now();
  o.onProgress?.('verify', 0);
  const result = verifiedResult(K, M, values, vectors, sturm, method, o.verify, run.normK, tv, (verifyMs) => ({
      iterations: run.iterations,
      restarts: run.restarts,
      operatorApplications: run.applications,
      factorizations: pencil.factorizations,
      rounds: run.rounds,
      ...(Number.isFinite(shiftUsed) ? { shift: shiftUsed } : {}),
      nnzL: pencil.symbolic.nnzL,
      analyseMs: pencil.msAnalyse,
      factorizeMs: pencil.msFactorize - run.sturmFactorizeMs,
      iterationMs: run.iterationMs,
      verifyMs: verifyMs + run.verifyMs,
      totalMs: performance.now() - t0,
  }), rayleigh === true);
  o.onProgress?.('verify', 1);
  return result;
}

interface Found {
  values: Float64Array;
  vectors: Float64Array;
  sturm?: SturmCheck;
  shiftUsed: number;
  /** The values are a Lanczos run's σ + 1/θ: the checks replace them by Rayleigh quotients. */
  rayleigh?: boolean;
}

/**
 * One method run for the `want` pairs nearest σ, kept M-orthogonal to the pool; the pool is
 * then extended and Rayleigh–Ritz'd with K and M (ritz.ts), which leaves it ascending and
 * M-orthonormal. With `projectFirstRun` false, a first Lanczos run is taken as it comes: its
 * vectors are Ritz vectors of one fully reorthogonalized basis (M-orthonormal to round-off,
 * ascending), and the caller's checks replace its values by Rayleigh quotients from the products
 * with K they make anyway (verify.ts rayleighModeChecks), which saves the projection's own.
 * Returns whether the Krylov space was exhausted.
 */
function extend(run: Run, pool: Pool, inv: BlockOperator, sigma: number, want: number, fixed?: { x: Float64Array; m: number }, projectFirstRun = true): boolean {
  const n = run.pencil.n;
  const o = run.o;
  const t = performance.now();
  // Locked for the iteration: the fixed vectors (another window's modes), then the pool.
  let lockedCount = pool.m;
  let locked = pool.x;
  if (fixed && fixed.m > 0) {
    lockedCount = fixed.m + pool.m;
    locked = new Float64Array(n * lockedCount);
    locked.set(fixed.x.subarray(0, n * fixed.m));
    locked.set(pool.x.subarray(0, n * pool.m), n * fixed.m);
  }
  const common = {
    count: want,
    shift: sigma,
    seed: run.seed + run.rounds,
    ...(lockedCount > 0 ? { locked, lockedCount } : {}),
    ...(o.onProgress ? { onProgress: o.onProgress } : {}),
    ...(o.signal ? { signal: o.signal } : {}),
    ...(o.tolerance !== undefined ? { tolerance: o.tolerance } : {}),
  };
  // M·x of the new vectors is read only by the projection below: a first run taken as it comes
  // skips those products.
  const keepsFirstRun = pool.m === 0 && run.method === 'lanczos' && !projectFirstRun;
  let newValues: Float64Array;
  let newX: Float64Array;
  let newMX: Float64Array;
  let exhausted = false;
  let converged: boolean;
  let convergedCount: number;
  if (run.method === 'lanczos') {
    const r = lanczos(inv, run.mop, keepsFirstRun ? { ...common, massVectors: false } : common);
    run.iterations += r.steps;
    run.restarts += r.restarts;
    newValues = r.eigenvalues;
    newX = r.vectors;
    newMX = r.massVectors;
    exhausted = r.exhausted;
    converged = r.converged;
    convergedCount = r.eigenvalues.length;
  } else {
    const r = subspaceIteration(inv, run.mop, run.kop, { ...common, normK: run.normK });
    run.iterations += r.iterations;
    newValues = r.eigenvalues;
    newX = r.vectors;
    newMX = r.massVectors;
    converged = r.converged;
    convergedCount = r.convergedCount;
  }
  run.iterationMs += performance.now() - t;
  if (!converged && !exhausted) {
    throw new VerificationError(
      `the ${run.method} iteration did not converge for all ${want} wanted mode(s) near σ = ${sigma} rad²/s² (${convergedCount} converged); try the other method, another shift or a larger tolerance`,
      `modes[${pool.m + Math.min(convergedCount, want - 1)}]`,
    );
  }
  // ---- merge and Rayleigh–Ritz over the pool ----
  const tr = performance.now();
  const m0 = pool.m;
  const p = newValues.length;
  const m = m0 + p;
  if (p === 0) return exhausted;
  // The first run's vectors are used where the method left them (its own buffers, free now);
  // later runs are appended to a copy of the pool.
  let x: Float64Array;
  if (m0 === 0) {
    x = newX.subarray(0, n * p);
  } else {
    x = new Float64Array(n * m);
    x.set(pool.x.subarray(0, n * m0));
    x.set(newX.subarray(0, n * p), n * m0);
  }
  if (keepsFirstRun) {
    pool.values = newValues;
    pool.projected = false;
  } else {
    // M·x of the merged basis: the new vectors' from the method, the pool's afresh (a rerun
    // after a Sturm count, rare). It is not rotated with the vectors: nothing reads it later.
    let mx: Float64Array;
    if (m0 === 0) mx = newMX.subarray(0, n * p);
    else {
      mx = new Float64Array(n * m);
      run.mop.applyMany(pool.x, mx, m0);
      mx.set(newMX.subarray(0, n * p), n * m0);
    }
    pool.values = rayleighRitzOperator(x, run.kop, mx, n, m, new Float64Array(256 * m), false);
    pool.projected = true;
  }
  pool.x = x;
  pool.m = m;
  run.verifyMs += performance.now() - tr;
  return exhausted;
}

function emptyPool(): Pool {
  return { m: 0, values: new Float64Array(0), x: new Float64Array(0), projected: true };
}

function operatorsAt(
  run: Run,
  sigma: number,
  direction: 1 | -1,
  attempts?: number,
  pivotTolerance?: number,
): { inv: BlockOperator; factor: LdltFactor; shift: number; negative: number; minPivotRatio: number } {
  run.o.onProgress?.('factorize', 0);
  const f = run.pencil.factorAt(sigma, direction, attempts, pivotTolerance === undefined ? {} : { pivotTolerance });
  run.o.onProgress?.('factorize', 1);
  checkAbort(run.o);
  const inv = inverseOperator(f.factor);
  const counted: BlockOperator = {
    n: inv.n,
    applications: 0,
    apply(a, b) {
      inv.apply(a, b);
      counted.applications++;
      run.applications++;
    },
    applyMany(a, b, k) {
      inv.applyMany(a, b, k);
      counted.applications += k;
      run.applications += k;
    },
  };
  return { inv: counted, factor: f.factor, shift: f.shift, negative: f.factor.negativePivots, minPivotRatio: f.factor.minPivotRatio };
}

function shortOfModes(run: Run, found: number, count: number): VerificationError {
  return new VerificationError(
    `only ${found} of ${count} modes converged after ${run.rounds} rerun(s) of ${run.method}; try the other method or another shift`,
    `modes[${found}]`,
  );
}

/**
 * Operators at an interior shift (near a target, or a window's centre). A shift within
 * ZERO_SHIFT_PIVOT_RATIO (relative pivot) of an eigenvalue is moved up by SHIFT_NUDGE ·
 * max(|σ|, typical λ): an eigenvalue sitting almost on σ would get θ ≈ 1e13 and leave the
 * subspace iteration's projected mass matrix numerically singular.
 */
function interiorOperators(run: Run, sigma: number): ReturnType<typeof operatorsAt> {
  const op = operatorsAt(run, sigma, 1);
  if (op.minPivotRatio >= ZERO_SHIFT_PIVOT_RATIO) return op;
  return operatorsAt(run, op.shift + SHIFT_NUDGE * Math.max(Math.abs(op.shift), run.pencil.typicalEigenvalue), 1);
}

/** Runs a Sturm check, booking its time (factorizations included) to the verify phase. */
function timedSturm(run: Run, check: () => SturmCheck): SturmCheck {
  const t = performance.now();
  const f0 = run.pencil.msFactorize;
  const r = check();
  run.sturmFactorizeMs += run.pencil.msFactorize - f0;
  run.verifyMs += performance.now() - t;
  return r;
}

/** Lowest `count` modes from a shift at or below the bottom of the spectrum. */
function solveLowest(run: Run, count: number): Found {
  const { pencil, o } = run;
  let op: ReturnType<typeof operatorsAt> | undefined;
  let freeChoice: LowestModesShift | undefined;
  let freeTolerance: number | undefined;
  if (o.shift !== undefined) op = operatorsAt(run, o.shift, -1);
  else {
    // σ = 0 when K is clearly positive definite: no negative pivot and none smaller than
    // ZERO_SHIFT_PIVOT_RATIO times the largest diagonal …
    try {
      op = operatorsAt(run, 0, -1, 1);
      if (op.negative > 0 || op.minPivotRatio < ZERO_SHIFT_PIVOT_RATIO) op = undefined;
    } catch (e) {
      if (!(e instanceof FactorizationError)) throw e;
      op = undefined;
    }
    // … else a small negative shift (free-free: rigid-body modes at λ ≈ 0), sized by Sturm
    // counts to the lowest eigenvalue that is not ≈ 0 (shift.ts), moved down until no eigenvalue
    // lies below it (Sturm count 0) or three tries are spent. K − σM is then positive definite,
    // so a pivot far below the factorization's default tolerance is real, not a breakdown.
    if (!op) {
      freeChoice = lowestModesShift(pencil, FREE_SHIFT * pencil.typicalEigenvalue);
      let s = -freeChoice.magnitude;
      for (let tries = 0; tries < 3; tries++, s *= 100) {
        op = operatorsAt(run, s, -1, undefined, STURM_PIVOT_TOLERANCE);
        if (op.negative === 0) break;
      }
      freeTolerance = STURM_PIVOT_TOLERANCE;
    }
  }
  const shift = op!.shift;
  let inv: BlockOperator | undefined = op!.inv;
  let factor: LdltFactor | undefined = op!.factor;
  op = undefined;
  // The check gap follows the returned modes (sturm.ts, STURM_GAP · λ_max). Only a free-free
  // result made of rigid-body modes alone (all λ ≈ 0, round-off of either sign) needs a floor,
  // at the resolution of the negative shift; with σ ≥ 0 no returned mode is ≈ 0. A floor from
  // trace(K)/trace(M) would put the check far above λ_max on a stiffness contrast (e.g. 1e8
  // between members), and every mode below it would then have to be computed.
  // With a searched shift, the floor of the search (below which eigenvalues are ≈ 0) is the
  // resolution: σ may then sit close to λ₁, and 1e-3·|σ| can be below the rigid modes' round-off.
  const minimumGap = shift < 0 ? Math.max(1e-3 * Math.abs(shift), freeChoice?.floor ?? 0) : 0;
  const pool = emptyPool();
  let want = count;
  let sturm: SturmCheck | undefined;
  for (;;) {
    // After a failed Sturm check (a missed copy of a repeated mode, rare) the iteration factor
    // is made again at the same shift: one more factorization, in exchange for never holding
    // two factors at once (peak memory, DESIGN.md).
    if (!inv) {
      const again = operatorsAt(run, shift, -1, 1, freeTolerance);
      inv = again.inv;
      factor = again.factor;
    }
    const exhausted = extend(run, pool, inv, shift, want, undefined, false);
    if (pool.m < count) {
      if (exhausted) throw countError(count, pool.m, pencil.n);
      want = count - pool.m;
      run.rounds++;
      if (run.rounds > MAX_ROUNDS) break;
      continue;
    }
    if (!o.verify) break;
    // Release the iteration factor before the check factorizes K − σM at its own shift, so
    // that the two factors are never alive together; the check writes into its storage.
    inv = undefined;
    if (factor) pencil.recycle(factor);
    factor = undefined;
    sturm = timedSturm(run, () => sturmCheck(pencil, pool.values, count, 0, { minimumGap }));
    if (sturm.passed) break;
    const inside = sturm.returnedBelow + (sturm.extraBelow ?? 0);
    const missing = sturm.countBelow - inside;
    if (missing < 0 || exhausted || run.rounds >= MAX_ROUNDS) break; // assertAccepted reports it
    run.rounds++;
    want = missing;
  }
  if (pool.m < count) throw shortOfModes(run, pool.m, count);
  // A view, not a copy: the pool's buffer is the iteration's, free now, and a copy would add
  // count · n values to the solve's peak memory.
  return { values: pool.values.slice(0, count), vectors: pool.x.subarray(0, count * pencil.n), ...(sturm ? { sturm } : {}), shiftUsed: shift, rayleigh: !pool.projected };
}

/** The `count` modes nearest a target. */
function solveNear(run: Run, target: number, count: number): Found {
  const { pencil, o } = run;
  const { inv, shift } = interiorOperators(run, o.shift ?? target);
  const pool = emptyPool();
  let want = count;
  let sturm: SturmCheck | undefined;
  let first = 0;
  for (;;) {
    const exhausted = extend(run, pool, inv, shift, want, undefined, false);
    if (pool.m < count) {
      if (exhausted) throw countError(count, pool.m, pencil.n);
      want = count - pool.m;
      run.rounds++;
      if (run.rounds > MAX_ROUNDS) break;
      continue;
    }
    [first] = nearestBlock(pool.values, target, count);
    if (!o.verify) break;
    sturm = timedSturm(run, () => sturmCheck(pencil, pool.values, count, first, { window: true, minimumGap: 1e-9 * pencil.typicalEigenvalue }));
    if (sturm.passed) break;
    const inside = sturm.returnedBelow + (sturm.extraBelow ?? 0);
    const missing = sturm.countBelow - (sturm.countBelowLower ?? 0) - inside;
    if (missing < 0 || exhausted || run.rounds >= MAX_ROUNDS) break;
    run.rounds++;
    want = missing;
  }
  if (pool.m < count) throw shortOfModes(run, pool.m, count);
  const n = pencil.n;
  return { values: pool.values.slice(first, first + count), vectors: pool.x.subarray(first * n, (first + count) * n), ...(sturm ? { sturm } : {}), shiftUsed: shift, rayleigh: !pool.projected };
}

/** Sturm counts at both ends of a range, as a SturmCheck of `found` modes. */
function rangeCheck(pencil: ShiftedPencil, range: readonly [number, number], found: number): SturmCheck {
  const lower = pencil.factorAt(range[0], -1);
  const upper = pencil.factorAt(range[1], 1);
  const inWindow = upper.factor.negativePivots - lower.factor.negativePivots;
  return {
    shift: upper.shift,
    countBelow: upper.factor.negativePivots,
    lowerShift: lower.shift,
    countBelowLower: lower.factor.negativePivots,
    returnedBelow: found,
    passed: inWindow === found,
  };
}

/** Every mode in [a, b]: Sturm counts fix the number; windows of more than RANGE_BLOCK modes are split. */
function solveRange(run: Run, range: readonly [number, number]): Found {
  const { pencil } = run;
  const n = pencil.n;
  const lower = pencil.factorAt(range[0], -1);
  const upper = pencil.factorAt(range[1], 1);
  const parts: Array<{ values: Float64Array; vectors: Float64Array }> = [];
  let lastShift = NaN;
  // Windows [a, b) with their Sturm counts; processed lowest first (a stack, upper half pushed first).
  const stack: Array<[number, number, number, number]> = [[lower.shift, lower.factor.negativePivots, upper.shift, upper.factor.negativePivots]];
  while (stack.length > 0) {
    const [a, ca, b, cb] = stack.pop()!;
    const k = cb - ca;
    if (k === 0) continue;
    if (k > RANGE_BLOCK) {
      const mid = pencil.factorAt(0.5 * (a + b), 1);
      const cm = mid.factor.negativePivots;
      if (mid.shift > a && mid.shift < b && cm > ca && cm < cb) {
        stack.push([mid.shift, cm, b, cb]);
        stack.push([a, ca, mid.shift, cm]);
        continue;
      }
    }
    const center = run.o.shift !== undefined && run.o.shift > a && run.o.shift < b ? run.o.shift : 0.5 * (a + b);
    const { inv, shift } = interiorOperators(run, center);
    lastShift = shift;
    const pool = emptyPool();
    let want = k;
    let inside = 0;
    let from = 0;
    // The lower windows' modes stay locked, so every window's modes come out M-orthogonal to
    // theirs (with a loose residual, as subspace iteration's 1e-11, two windows' modes are
    // otherwise only orthogonal to about residual · ‖K‖ / gap).
    let fixed: { x: Float64Array; m: number } | undefined;
    if (parts.length > 0) {
      const m = parts.reduce((s2, p2) => s2 + p2.values.length, 0);
      const x = new Float64Array(n * m);
      let c = 0;
      for (const p2 of parts) {
        x.set(p2.vectors, c * n);
        c += p2.values.length;
      }
      fixed = { x, m };
    }
    for (let rounds = 0; ; rounds++) {
      const exhausted = extend(run, pool, inv, shift, want, fixed);
      from = 0;
      while (from < pool.m && pool.values[from] < a) from++;
      let to = from;
      while (to < pool.m && pool.values[to] < b) to++;
      inside = to - from;
      if (inside >= k || exhausted || rounds >= MAX_ROUNDS) break;
      run.rounds++;
      want = k - inside;
    }
    if (inside !== k && run.o.verify) {
      throw new VerificationError(
        `the Sturm counts find ${k} eigenvalue(s) in [${a}, ${b}) rad²/s² but the ${run.method} iteration found ${inside}; try another seed or method`,
        `modes[${parts.reduce((s, p2) => s + p2.values.length, 0) + Math.min(inside, k - 1)}]`,
      );
    }
    const take = Math.min(inside, k);
    parts.push({ values: pool.values.slice(from, from + take), vectors: pool.x.slice(from * n, (from + take) * n) });
  }
  const total = parts.reduce((s, p) => s + p.values.length, 0);
  const values = new Float64Array(total);
  const vectors = new Float64Array(total * n);
  let c = 0;
  for (const p of parts) {
    values.set(p.values, c);
    vectors.set(p.vectors, c * n);
    c += p.values.length;
  }
  const sturm: SturmCheck = {
    shift: upper.shift,
    countBelow: upper.factor.negativePivots,
    lowerShift: lower.shift,
    countBelowLower: lower.factor.negativePivots,
    returnedBelow: total,
    passed: upper.factor.negativePivots - lower.factor.negativePivots === total,
  };
  return { values, vectors, sturm, shiftUsed: lastShift };
}
