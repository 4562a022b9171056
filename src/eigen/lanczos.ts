/**
 * Shift-invert Lanczos in the M-inner product with thick restart.
 *
 * Methods followed:
 * - Spectral transformation: the operator OP = (K − σM)⁻¹ M has eigenvalues θ = 1/(λ − σ) and
 *   is self-adjoint in the M-inner product, so a symmetric Lanczos run on it in that inner
 *   product finds the λ nearest σ first (Ericsson & Ruhe 1980, Math. Comp. 35, §2–3; Grimes,
 *   Lewis & Simon 1994, SIAM J. Matrix Anal. Appl. 15(1), §2).
 * - Start vector and Ritz vectors are kept in the range of OP (start = OP·random; each Ritz
 *   vector is purified with one implicit OP step, x = y + (β sₘ/θ) vₘ₊₁), so that singular M
 *   (massless DOFs, infinite λ) does not pollute the vectors (Nour-Omid, Parlett, Ericsson &
 *   Jensen 1987, "How to implement the spectral transformation", Math. Comp. 48, §4–5).
 * - Full reorthogonalization: the three-term step, then the new vector's M-inner products with
 *   the whole basis are measured (blocked dense kernels); when all are below
 *   ORTHOGONALITY_BUDGET / (basis size) of its norm the vector is kept as it is, else one
 *   classical Gram–Schmidt pass removes them, and a second pass follows only when the DGKS test
 *   asks for it (Parlett, The Symmetric Eigenvalue Problem, §6.9 and §13.1; Daniel, Gragg,
 *   Kaufman & Stewart 1976; Giraud et al. 2005). Unlike partial reorthogonalization's estimates
 *   (Simon 1984), the products are computed, so every pair of basis vectors is known to be that
 *   orthogonal.
 * - Thick restart: keep the k best Ritz vectors and continue from the residual vector; the
 *   projected matrix becomes an arrowhead plus a tridiagonal (Wu & Simon 2000, "Thick-restart
 *   Lanczos method for large symmetric eigenvalue problems", SIAM J. Matrix Anal. Appl. 22(2),
 *   §2–3).
 * - Converged Ritz pairs are locked at a restart (kept, purified, no longer recombined; their
 *   couplings, below the tolerance, are dropped), so a restart recombines only the active
 *   columns (Lehoucq & Sorensen 1996, SIAM J. Matrix Anal. Appl. 17(4), §3). Convergence is
 *   also tested inside a cycle when a test is cheap next to a step, so a run ends at the step
 *   where the wanted pairs converge.
 * - Locked vectors (already known eigenvectors) are kept in front of the basis and every new
 *   Lanczos vector is M-orthogonalized against them, which is how a missed copy of a repeated
 *   eigenvalue is found by a second run (Grimes, Lewis & Simon 1994, §3.3).
 *
 * Storage: the basis is one column-major Float64Array n × (L + ncv + 1) (L locked columns,
 * ncv Lanczos columns and the next residual vector); M·V is not kept (coefficients come from
 * Vᵀ(M w)), only M v of the current and next Lanczos vectors. Every work buffer is allocated
 * before the iteration.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { Operator } from '../linalg/operator';
import { AbortedError, ArgumentError } from '../errors';
import { axpy, axpy2, combineColumnsInPlace, dot, dotColumns, scaleBoth, scaleInto, SeededRandom, subtractColumns } from './kernels';

/** Progress report: phase name and fraction done in [0, 1]. */
export type ProgressCallback = (phase: string, fraction: number) => void;

export interface LanczosOptions {
  /** Number of eigenvalues wanted: those nearest the shift σ. @defaultValue 20 */
  count?: number;
  /** Shift σ (rad²/s²) of the factor behind `inverse`; used to map θ back to λ = σ + 1/θ. @defaultValue 0 */
  shift?: number;
  /**
   * A Ritz pair (θ, y) is accepted when ‖OP y − θ y‖_M ≤ tolerance · |θ|, which bounds the
   * relative residual of the original problem by about the same amount (Ericsson & Ruhe 1980,
   * §3). @defaultValue 1e-12
   */
  tolerance?: number;
  /**
   * Lanczos vectors kept between restarts (ncv). `0` picks max(2·count + 1, 20), capped by the
   * dimension. @defaultValue 0
   */
  basisSize?: number;
  /** Thick restarts allowed before giving up. @defaultValue 500 */
  maxRestarts?: number;
  /** Seed of the start vector. @defaultValue 1 */
  seed?: number;
  /**
   * Known eigenvectors (column-major n × lockedCount, M-orthonormal) the new vectors are kept
   * M-orthogonal to. @defaultValue none
   */
  locked?: Float64Array;
  /** Number of columns in `locked`. @defaultValue 0 */
  lockedCount?: number;
  /** Called after each restart with ('lanczos', converged / count). */
  onProgress?: ProgressCallback;
  /** Checked at every Lanczos step; when aborted, AbortedError is thrown. */
  signal?: AbortSignal;
  /**
   * Return M times the vectors (one mass product each). Without them the vectors are
   * M-normalized from the basis itself: a purified Ritz vector V s + g v (s a unit vector, v the
   * residual vector, all M-orthonormal) has ‖·‖²_M = 1 + g², with no product. @defaultValue true
   */
  massVectors?: boolean;
}

/** Defaults of {@link LanczosOptions}. */
export const LANCZOS_DEFAULTS = {
  count: 20,
  shift: 0,
  tolerance: 1e-12,
  basisSize: 0,
  maxRestarts: 500,
  seed: 1,
  lockedCount: 0,
  massVectors: true,
} as const;

export interface LanczosResult {
  /** Converged eigenvalues λ = σ + 1/θ in rad²/s², ascending, length m (≥ count unless `exhausted` or not converged). */
  readonly eigenvalues: Float64Array;
  /** Ritz vectors, column-major n × m, M-normalized and purified (a view into the solver's basis buffer). */
  readonly vectors: Float64Array;
  /**
   * M times the vectors, column-major n × m (may be a view into the same buffer as `vectors`);
   * empty when `options.massVectors` is false.
   */
  readonly massVectors: Float64Array;
  /** Estimated ‖OP x − θ x‖_M / |θ| per returned pair. */
  readonly errorEstimates: Float64Array;
  /** True when the wanted `count` pairs all converged. */
  readonly converged: boolean;
  /**
   * True when the Krylov space closed: every eigenvector of OP with θ ≠ 0 outside the locked
   * span is in the basis, so no further finite eigenvalue exists there.
   */
  readonly exhausted: boolean;
  /** Lanczos steps (one OP application each, plus start and restart vectors). */
  readonly steps: number;
  /** Thick restarts performed. */
  readonly restarts: number;
  /** Lanczos steps whose Gram–Schmidt needed the second pass (DGKS test failed). */
  readonly secondPasses: number;
  /**
   * Lanczos steps whose new vector, after the three-term step, was measured M-orthogonal to the
   * whole basis within ORTHOGONALITY_BUDGET / (basis size), so its subtraction and second mass
   * product were skipped.
   */
  readonly orthogonalSteps: number;
}

/**
 * Orthogonality a Lanczos basis of c columns may lose to skipped subtractions: a new vector is
 * kept without its Gram–Schmidt subtraction when its measured M-inner product with every basis
 * vector is at most ORTHOGONALITY_BUDGET / c of its M-norm. Basis vectors do not change after
 * they are made (a restart rotates them by an orthogonal matrix; purification at locking adds a
 * multiple of at most the tolerance of the residual vector), so the basis's Gram matrix then
 * differs from I by at most c · (budget / c) = budget in 2-norm (bounded by the Frobenius norm),
 * and so do its Ritz vectors: a tenth of the 1e-10 the checks require. A step with larger
 * products gets the full pass.
 */
export const ORTHOGONALITY_BUDGET = 1e-11;

/**
 * Shift-invert Lanczos: the `count` eigenpairs of K x = λ M x nearest σ.
 * @param inverse - y ← (K − σM)⁻¹ x, n × n (e.g. `inverseOperator` of an LDLᵀ factor)
 * @param mass - y ← M x, n × n symmetric positive semidefinite
 * @param options - see {@link LanczosOptions}; defaults in {@link LANCZOS_DEFAULTS}
 * @throws ArgumentError on invalid options (path names the option), AbortedError when aborted
 */
export function lanczos(inverse: Operator, mass: Operator, options: LanczosOptions = {}): LanczosResult {
  const o = { ...LANCZOS_DEFAULTS, ...options };
  const n = inverse.n;
  if (mass.n !== n) throw new ArgumentError(`mass operator has size ${mass.n}, the inverse ${n}; pass operators of one size`, 'mass');
  if (!Number.isInteger(o.count) || o.count < 1) throw new ArgumentError(`count ${o.count} is not a positive integer; ask for at least one mode`, 'count');
  if (!(o.tolerance > 0 && o.tolerance < 1)) throw new ArgumentError(`tolerance ${o.tolerance} is outside (0, 1); use e.g. 1e-12`, 'tolerance');
  if (!Number.isFinite(o.shift)) throw new ArgumentError(`shift ${o.shift} is not a finite number; pass a shift in rad²/s²`, 'shift');
  const lockedCount = o.lockedCount;
  if (!Number.isInteger(lockedCount) || lockedCount < 0 || lockedCount >= n) {
    throw new ArgumentError(`lockedCount ${lockedCount} must be an integer in [0, ${n - 1}]`, 'lockedCount');
  }
  if (lockedCount > 0 && (!o.locked || o.locked.length < lockedCount * n)) {
    throw new ArgumentError(`locked holds ${o.locked ? o.locked.length : 0} values, fewer than n · lockedCount = ${n * lockedCount}; pass the locked vectors`, 'locked');
  }
  const L = lockedCount;
  const avail = n - L;
  const nev = Math.min(o.count, avail);
  let ncv = o.basisSize > 0 ? o.basisSize : Math.max(2 * nev + 1, 20);
  ncv = Math.min(Math.max(ncv, nev + 1), avail);
  const sigma = o.shift;
  const tol = o.tolerance;

  // ---- workspace, sized once ----
  const cols = L + ncv + 1;
  const slack = ORTHOGONALITY_BUDGET / cols; // see ORTHOGONALITY_BUDGET
  const V = new Float64Array(n * cols);
  const fresh = new Float64Array(n); // start vectors are drawn and orthogonalized here
  let mw = new Float64Array(n); // M w before a Gram–Schmidt pass (trades places with mvNext when a step keeps w)
  // M v_j of the current Lanczos vector and M v_{j+1} of the next one, swapped after each step.
  // M·V is not stored: the Gram–Schmidt coefficients are h = Vᵀ(M w), one sparse product per
  // pass, and the Ritz combination at a restart then touches V only.
  let mvCur = new Float64Array(n);
  let mvNext = new Float64Array(n);
  const h = new Float64Array(cols);
  const T = new Float64Array(ncv * ncv); // column-major, symmetric
  const tmp = new Float64Array(Math.max(ncv, 256 * ncv));
  const rng = new SeededRandom(o.seed);
  let steps = 0;
  let restarts = 0;

  if (L > 0) {
    V.set(o.locked!.subarray(0, n * L));
  }

  // Column views, made once so that the Lanczos steps allocate nothing.
  const vCol = Array.from({ length: cols }, (_, c) => V.subarray(c * n, (c + 1) * n));
  const checkAbort = (): void => {
    if (o.signal?.aborted) throw new AbortedError('the eigen solve was aborted through its AbortSignal; run it again without aborting to get the modes', 'signal');
  };

  /**
   * Orthogonalizes `fresh` (in place) twice against basis columns [0, upto) in the M-inner
   * product (start vectors only; the Lanczos steps use the conditional second pass below).
   */
  let secondPasses = 0; // Lanczos steps that needed the second Gram–Schmidt pass
  let orthogonalSteps = 0; // Lanczos steps whose vector was orthogonal enough after the three-term step
  const reorthogonalize = (upto: number): void => {
    if (upto === 0) return; // nothing to be orthogonal to (and no mass products to spend)
    for (let pass = 0; pass < 2; pass++) {
      mass.apply(fresh, mw);
      dotColumns(V, n, 0, upto, mw, h);
      subtractColumns(V, n, 0, upto, h, fresh);
    }
  };

  /**
   * Puts a new start vector, M-orthogonal to columns [0, c), into column c: OP applied to a
   * seeded random vector (so it lies in the range of OP). Returns false when nothing is left
   * (its M-norm collapsed under orthogonalization three times in a row). Its M-image goes to `z`.
   */
  const newStartVector = (c: number, z: Float64Array): boolean => {
    const v = vCol[c];
    for (let attempt = 0; attempt < 3; attempt++) {
      // Orthogonalize the random vector before applying OP: its image then carries no large
      // component along basis eigenvectors with huge θ (shift next to an eigenvalue), so the
      // collapse test below measures only what is genuinely new.
      rng.fill(fresh);
      reorthogonalize(c);
      mass.apply(fresh, v);
      inverse.apply(v, fresh);
      steps++;
      mass.apply(fresh, z);
      const before = dot(fresh, z, n);
      let after = before;
      if (c > 0) {
        reorthogonalize(c);
        mass.apply(fresh, z);
        after = dot(fresh, z, n);
      }
      if (before > 0 && after > 1e-20 * before) {
        const inv = 1 / Math.sqrt(after);
        scaleInto(v, fresh, inv, n);
        scaleInto(z, z, inv, n);
        return true;
      }
    }
    return false;
  };

  let exhausted = !newStartVector(L, mvCur);
  let m = exhausted ? 0 : ncv; // Lanczos columns in use at the last restart
  let k = 0; // locked + kept Ritz vectors: the Lanczos steps continue from column L + k
  // Locked Ritz pairs (Lanczos columns [0, nl)): converged at a restart, purified, and from then
  // on only orthogonalized against; their couplings (≤ tolerance · |θ|) are dropped from T,
  // so each restart recombines only the active columns (deflation by locking: Lehoucq &
  // Sorensen 1996, SIAM J. Matrix Anal. Appl. 17(4), §3; Stathopoulos & Saad's "locking").
  let nl = 0;
  const lockedTheta = new Float64Array(ncv);
  const lockedEst = new Float64Array(ncv);
  let betaLast = 0;
  let ma = 0; // active columns [nl, m) in the last projection
  let theta = new Float64Array(ncv);
  let S = new Float64Array(ncv * ncv); // Ritz vectors of the active T, column-major ma × ma
  const order = new Int32Array(ncv);
  const stage = new Float64Array(ncv * ncv); // S's kept columns, staged during a restart
  let nconv = 0; // converged among the wanted active pairs (a prefix of `order`)
  let done = exhausted;

  // Convergence is tested at the end of each cycle and, when it is cheap enough, every
  // `testEvery` steps within it, so that a run stops at the step where the wanted pairs have
  // converged rather than at the next full basis. A test (dense eigen-decomposition of the
  // active projected matrix, ≈ 10·m³ flops) then costs at most about a tenth of the steps' own
  // Gram–Schmidt work (≥ 2·n·m flops per step with m basis vectors): q = ⌈50·m² / n⌉.
  const testEvery = Math.max(1, Math.ceil((50 * ncv * ncv) / n));
  let tested = -1; // m of the last Ritz computation, when T has not changed since

  /** Ritz pairs of the active part T[nl .. mCur): θ, S, order by |θ|, converged wanted prefix. */
  const ritz = (mCur: number, beta: number): void => {
    ma = mCur - nl;
    const evd = ritzOfActive(T, ncv, nl, ma);
    const lam = evd.realEigenvalues;
    const Z = evd.eigenvectorMatrix;
    for (let c = 0; c < ma; c++) {
      theta[c] = lam[c];
      for (let i = 0; i < ma; i++) S[c * ma + i] = Z.get(i, c);
    }
    // Wanted first: largest |θ| (λ nearest σ); ties broken by index for determinism.
    for (let i = 0; i < ma; i++) order[i] = i;
    sortByMagnitude(order, theta, ma);
    const nevA = nev - nl;
    nconv = 0;
    for (let r = 0; r < Math.min(nevA, ma); r++) {
      const i = order[r];
      if (Math.abs(beta * S[i * ma + ma - 1]) <= tol * Math.abs(theta[i]) && theta[i] !== 0) nconv++;
      else break;
    }
    tested = mCur;
  };

  while (!done) {
    // ---- Lanczos steps from column k to ncv − 1 ----
    m = ncv;
    tested = -1;
    for (let j = k; j < ncv; j++) {
      checkAbort();
      // w = OP v_j = (K − σM)⁻¹ M v_j, built in place in the next basis column: the mass
      // products' pass over the basis then also gives ‖w‖²_M (its last column).
      const w = vCol[L + j + 1];
      inverse.apply(mvCur, w);
      steps++;
      // Orthogonalization of w against the basis (Paige's three-term recurrence followed by
      // full reorthogonalization, Parlett, The Symmetric Eigenvalue Problem, §13.1 and §6.9):
      // 1. the local step removes α v_j and β_{j−1} v_{j−1}, which carry nearly all of w when
      //    the Ritz values converge (not needed right after a restart: that step couples to
      //    every kept Ritz vector, so it goes straight to the full passes);
      // 2. h = Vᵀ(M w); unless every |hᵢ| ≤ slack · ‖w‖_M (ORTHOGONALITY_BUDGET; then w is kept
      //    as it is), one classical Gram–Schmidt pass over the whole basis, w −= V h;
      // 3. a second pass only when the first removed more than half of ‖w‖²_M — the DGKS test
      //    with η = 1/√2 (Daniel, Gragg, Kaufman & Stewart 1976, Math. Comp. 30, §4; the test
      //    of ARPACK's dsaitr). Giraud, Langou, Rozložník & van den Eshof 2005 (Numer. Math.
      //    101) show a pass under that test keeps the basis orthogonal to working precision.
      //    ‖w‖²_M before the pass is Σh² + ‖w‖²_M after it (Pythagoras, w ⟂_M the basis), so the
      //    test needs only the mass product z = M w that β needs anyway.
      let z = mvNext;
      const upto = L + j + 1;
      let alpha = 0;
      let removed = 0; // ‖w‖²_M taken out so far: the part of ‖OP v_j‖²_M inside the basis
      if (j > k) {
        alpha = dot(mvCur, w, n);
        const betaPrev = T[(j - 1) * ncv + j];
        axpy2(w, vCol[L + j], -alpha, vCol[L + j - 1], -betaPrev, n);
        removed = alpha * alpha + betaPrev * betaPrev;
      }
      let bb = 0;
      for (let pass = 0; pass < 2; pass++) {
        // h[0 .. upto) = Vᵀ(M w), h[upto] = ‖w‖²_M (pass 0; z = M w after the previous pass).
        if (pass === 0) mass.apply(w, mw);
        dotColumns(V, n, 0, pass === 0 ? upto + 1 : upto, pass === 0 ? mw : z, h);
        if (pass === 0 && j > k) {
          // After the three-term step the coefficients h are the new vector's measured M-inner
          // products with the whole basis. When every one is below slack · ‖w‖_M, w is kept as
          // it is: the subtraction would change it by less than that, and M w is already at
          // hand (no second mass product).
          let hmax = 0;
          for (let c = 0; c < upto; c++) {
            const a = Math.abs(h[c]);
            if (a > hmax) hmax = a;
          }
          const bb0 = h[upto];
          if (hmax <= slack * Math.sqrt(bb0)) {
            bb = bb0;
            const t = z;
            z = mw;
            mw = t;
            orthogonalSteps++;
            break;
          }
        }
        alpha += h[L + j];
        let hh = 0;
        for (let c = 0; c < upto; c++) hh += h[c] * h[c];
        removed += hh;
        subtractColumns(V, n, 0, upto, h, w);
        mass.apply(w, z);
        bb = dot(w, z, n);
        if (hh <= bb) break; // ‖w_after‖² ≥ ½‖w_before‖²: no second pass needed
        if (pass === 0) secondPasses++;
      }
      T[j * ncv + j] = alpha;
      let beta = Math.sqrt(Math.max(bb, 0));
      // ‖OP v_j‖²_M ≈ removed + β²; an invariant subspace shows as β ≪ that norm. The new
      // vector is then drawn afresh (in the range of OP) and the coupling set to zero.
      if (beta <= 1e-12 * Math.sqrt(removed + bb)) beta = 0;
      if (beta === 0) {
        // Invariant subspace: continue with a fresh start vector, coupling zero.
        if (!newStartVector(L + j + 1, z)) {
          exhausted = true;
          m = j + 1;
          break;
        }
      } else scaleBoth(w, z, 1 / beta, n); // v_{j+1} = w / β in place, and its M-image
      if (j + 1 < ncv) {
        T[j * ncv + j + 1] = beta;
        T[(j + 1) * ncv + j] = beta;
      } else betaLast = beta;
      mvNext = mvCur;
      mvCur = z;
      if (j + 1 < ncv && j + 1 - nl > nev - nl && (ncv - j - 1) % testEvery === 0) {
        ritz(j + 1, beta);
        if (nl + nconv >= nev) {
          m = j + 1;
          betaLast = beta;
          break;
        }
      }
    }
    if (exhausted) betaLast = 0;

    // ---- Ritz values of the active part of the projected matrix ----
    if (tested !== m || exhausted) ritz(m, betaLast);
    const nevA = nev - nl;
    o.onProgress?.('lanczos', Math.min(1, (nl + nconv) / nev));
    if (nl + nconv >= nev || exhausted || restarts >= o.maxRestarts) break;

    // ---- thick restart (Wu & Simon 2000, §3): keep kA active Ritz vectors, lock the converged
    // ones among them, then continue from the residual vector ----
    const kA = Math.min(ma - 1, nevA + Math.max(1, Math.floor((ma - nevA) / 2)));
    const sel = S.subarray(0, ma * kA);
    gatherColumns(S, ma, order, kA, sel, stage);
    // gatherColumns left S's columns in `order` in sel; the couplings and θ follow that order.
    const coupling = new Float64Array(kA);
    const thetaSel = new Float64Array(kA);
    for (let c = 0; c < kA; c++) {
      thetaSel[c] = theta[order[c]];
      coupling[c] = betaLast * sel[c * ma + ma - 1];
    }
    combineColumnsInPlace(V, n, L + nl, ma, sel, ma, kA, tmp);
    const vm = vCol[L + m];
    const lockNow = Math.min(nconv, kA);
    for (let c = 0; c < lockNow; c++) {
      // Purify on locking, while the residual vector is at hand (Nour-Omid et al. 1987, §4).
      const g = coupling[c] / thetaSel[c];
      const x = vCol[L + nl + c];
      if (g !== 0) axpy(x, vm, g, n);
      lockedTheta[nl + c] = thetaSel[c];
      lockedEst[nl + c] = Math.abs(coupling[c]) / Math.abs(thetaSel[c]);
    }
    k = nl + kA;
    V.copyWithin((L + k) * n, (L + m) * n, (L + m + 1) * n);
    // The residual vector moves to column k; its M-image stays in mvCur. The kept Ritz vectors
    // need no M-image: OP is applied only to the newest Lanczos vector.
    T.fill(0);
    for (let c = lockNow; c < kA; c++) {
      const q = nl + c;
      T[q * ncv + q] = thetaSel[c];
      T[k * ncv + q] = coupling[c];
      T[q * ncv + k] = coupling[c];
    }
    nl += lockNow;
    restarts++;
  }

  // ---- Ritz vectors of the converged pairs: the locked ones, then the converged active ones,
  // purified, then put in ascending λ ----
  const acceptedA: number[] = [];
  for (let r = 0; r < ma; r++) {
    const i = order[r];
    if (theta[i] === 0) continue;
    const est = Math.abs(betaLast * S[i * ma + ma - 1]) / Math.abs(theta[i]);
    if (est <= tol || exhausted) acceptedA.push(i);
    else if (r >= nev - nl) break; // beyond the wanted ones, stop at the first unconverged
  }
  const pA = acceptedA.length;
  const p = nl + pA;
  const thetaAll = new Float64Array(p);
  const estAll = new Float64Array(p);
  for (let c = 0; c < nl; c++) {
    thetaAll[c] = lockedTheta[c];
    estAll[c] = lockedEst[c];
  }
  const sel = new Float64Array(ma * pA);
  for (let c = 0; c < pA; c++) {
    const i = acceptedA[c];
    sel.set(S.subarray(i * ma, i * ma + ma), c * ma);
    thetaAll[nl + c] = theta[i];
    estAll[nl + c] = Math.abs(betaLast * S[i * ma + ma - 1]) / Math.abs(theta[i]);
  }
  if (pA > 0) combineColumnsInPlace(V, n, L + nl, ma, sel, ma, pA, tmp);
  // The results are views into the basis buffer (no copy: on large models the fresh pages of
  // a copy cost as much as a restart). Mass vectors take the columns after the vectors when
  // they fit, else a buffer of their own.
  const vectors = V.subarray(L * n, (L + p) * n);
  const massVectors = L + 2 * p <= cols ? V.subarray((L + p) * n, (L + 2 * p) * n) : new Float64Array(p * n);
  const vm = vCol[L + m];
  // Purify every active vector first: the residual vector vm may lie where the mass vectors go.
  if (!exhausted) {
    for (let c = 0; c < pA; c++) {
      const i = acceptedA[c];
      const g = (betaLast * S[i * ma + ma - 1]) / theta[i];
      if (g === 0) continue;
      axpy(vectors.subarray((nl + c) * n, (nl + c + 1) * n), vm, g, n);
    }
  }
  // Ascending λ = σ + 1/θ (ties by position, for determinism); columns are permuted through
  // the mass-vector area, which is then overwritten.
  const perm = Array.from({ length: p }, (_, c) => c).sort((a, b) => sigma + 1 / thetaAll[a] - (sigma + 1 / thetaAll[b]) || a - b);
  let sorted = true;
  for (let c = 0; c < p; c++) if (perm[c] !== c) sorted = false;
  if (!sorted) {
    for (let c = 0; c < p; c++) massVectors.set(vectors.subarray(perm[c] * n, (perm[c] + 1) * n), c * n);
    vectors.set(massVectors.subarray(0, p * n));
  }
  const eigenvalues = new Float64Array(p);
  const errorEstimates = new Float64Array(p);
  for (let c = 0; c < p; c++) {
    eigenvalues[c] = sigma + 1 / thetaAll[perm[c]];
    errorEstimates[c] = estAll[perm[c]];
  }
  for (let c = 0; c < p; c++) {
    const x = vectors.subarray(c * n, (c + 1) * n);
    if (o.massVectors) {
      const mx = massVectors.subarray(c * n, (c + 1) * n);
      mass.apply(x, mx);
      scaleBoth(x, mx, 1 / Math.sqrt(dot(x, mx, n)), n);
    } else {
      // The error estimate is |g|, the purification's coefficient (zero when not purified).
      const g = errorEstimates[c];
      const inv = 1 / Math.sqrt(1 + g * g);
      if (inv !== 1) scaleInto(x, x, inv, n);
    }
  }
  return {
    eigenvalues,
    vectors,
    massVectors: o.massVectors ? massVectors : new Float64Array(0),
    errorEstimates,
    converged: nl + nconv >= nev || (exhausted && p >= nev),
    exhausted,
    steps,
    restarts,
    secondPasses,
    orthogonalSteps,
  };
}

/**
 * Eigen-decomposition of the active block T[nl .. nl+ma) of the projected matrix (column-major,
 * leading dimension ld), through ml-matrix's symmetric tridiagonal QL.
 */
function ritzOfActive(T: Float64Array, ld: number, nl: number, ma: number): EigenvalueDecomposition {
  const a = new Matrix(ma, ma);
  for (let i = 0; i < ma; i++) for (let j = 0; j < ma; j++) a.set(i, j, T[(nl + j) * ld + nl + i]);
  return new EigenvalueDecomposition(a, { assumeSymmetric: true });
}

/** Sorts order[0 .. m) by |θ| descending, ties by index (insertion sort: m is a few dozen). */
function sortByMagnitude(order: Int32Array, theta: Float64Array, m: number): void {
  for (let r = 1; r < m; r++) {
    const i = order[r];
    const ai = Math.abs(theta[i]);
    let q = r - 1;
    while (q >= 0) {
      const aq = Math.abs(theta[order[q]]);
      if (aq > ai || (aq === ai && order[q] < i)) break;
      order[q + 1] = order[q];
      q--;
    }
    order[q + 1] = i;
  }
}

/**
 * out[:, c] ← s[:, order[c]] for c < k (s column-major m × m); `out` may be s's own storage
 * (the columns are staged through `work`, length ≥ m·k).
 */
function gatherColumns(s: Float64Array, m: number, order: Int32Array, k: number, out: Float64Array, work: Float64Array): void {
  for (let c = 0; c < k; c++) work.set(s.subarray(order[c] * m, order[c] * m + m), c * m);
  out.set(work.subarray(0, m * k));
}
