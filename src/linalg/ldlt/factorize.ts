import { ArgumentError, FactorizationError } from '../../errors';
import type { SupernodalSymbolic } from './analyse';
import { gemmSubNT } from './kernels';
import { backwardSolve, forwardSolve } from './triangular';
import type { FactorizeOptions, LdltFactor, SymbolicFactor } from './types';

/** Defaults of {@link FactorizeOptions}. */
export const FACTORIZE_DEFAULTS = { pivotTolerance: 1e-13 } as const;

/** Width of the column panels inside a supernode (blocked left-looking within the supernode). */
const PANEL = 16;

/**
 * Supernodal LDLᵀ factor of C = P A Pᵀ: L unit lower triangular in dense row-major supernode
 * blocks, D diagonal. Solves run supernode by supernode with dense inner loops (triangular.ts).
 */
class SupernodalFactor implements LdltFactor {
  readonly n: number;
  readonly negativePivots: number;
  readonly minPivotRatio: number;
  readonly memoryBytes: number;
  private readonly perm: Int32Array;
  private readonly superStart: Int32Array;
  private readonly rowPtr: Int32Array;
  private readonly rows: Int32Array;
  private readonly lxPtr: Int32Array;
  private readonly lx: Float64Array;
  private readonly d: Float64Array;
  private work: Float64Array;
  private released = false;

  constructor(sym: SupernodalSymbolic, lx: Float64Array, d: Float64Array, negativePivots: number, minPivotRatio: number) {
    this.n = sym.n;
    this.perm = sym.perm;
    this.superStart = sym.superStart;
    this.rowPtr = sym.rowPtr;
    this.rows = sym.rows;
    this.lxPtr = sym.lxPtr;
    this.lx = lx;
    this.d = d;
    this.negativePivots = negativePivots;
    this.minPivotRatio = minPivotRatio;
    this.work = new Float64Array(sym.n);
    this.memoryBytes =
      lx.byteLength + d.byteLength + this.work.byteLength + this.perm.byteLength + this.superStart.byteLength + this.rowPtr.byteLength + this.rows.byteLength + this.lxPtr.byteLength;
  }

  solve(b: Float64Array, x: Float64Array): void {
    this.solveMany(b, x, 1);
  }

  /**
   * Gives up the factor's value storage (for `factorizeReusing`, so that the next factorization
   * of the same analysis writes into memory already touched). The factor cannot solve afterwards.
   * @returns L's value array
   */
  releaseStorage(): Float64Array {
    this.released = true;
    return this.lx;
  }

  /**
   * X ← A⁻¹ B, k columns. Each column goes through exactly the arithmetic of a one-vector solve
   * (so the two agree bit for bit); the k columns are taken supernode by supernode, so that a
   * supernode's block of L serves all of them while it is in cache.
   */
  solveMany(b: Float64Array, x: Float64Array, k: number): void {
    const n = this.n;
    if (this.released) throw new ArgumentError('this factor gave up its storage for another factorization; factorize again to solve', 'factor');
    if (!(Number.isInteger(k) && k >= 0)) throw new ArgumentError(`k is ${k}; pass the number of right-hand sides, an integer ≥ 0`, 'k');
    if (b.length < n * k || x.length < n * k) {
      throw new ArgumentError(`b has length ${b.length} and x ${x.length}, need n·k = ${n * k}; pass column-major n × k arrays`, b.length < n * k ? 'b' : 'x');
    }
    if (this.work.length < n * k) this.work = new Float64Array(n * k);
    const y = this.work;
    // The loops over the rows live in functions of their own: a long loop here would be compiled
    // on its own (on-stack replacement) before the code after it had run, and that code would
    // then drop the compiled loop on every call of the first solves (25 times on the 83,784-DOF
    // footbridge's first solve).
    permuteInto(y, b, this.perm, n, k);
    forwardSolve(y, k, n, this.superStart, this.rowPtr, this.rows, this.lxPtr, this.lx);
    backwardSolve(y, k, n, this.superStart, this.rowPtr, this.rows, this.lxPtr, this.lx, this.d);
    permuteBack(x, y, this.perm, n, k);
  }
}

/** y[r·n + q] ← b[r·n + perm[q]] for the k columns (the factor's order). */
function permuteInto(y: Float64Array, b: Float64Array, perm: Int32Array, n: number, k: number): void {
  for (let r = 0; r < k; r++) {
    const o = r * n;
    for (let q = 0; q < n; q++) y[o + q] = b[o + perm[q]];
  }
}

/** x[r·n + perm[q]] ← y[r·n + q] for the k columns (back to the caller's order). */
function permuteBack(x: Float64Array, y: Float64Array, perm: Int32Array, n: number, k: number): void {
  for (let r = 0; r < k; r++) {
    const o = r * n;
    for (let q = 0; q < n; q++) x[o + perm[q]] = y[o + q];
  }
}

/**
 * Numeric phase: LDLᵀ of P A Pᵀ with 1×1 pivots in the order fixed by `analyse` (no further
 * pivoting, as structural eigen codes do for K − σM). Counts negative pivots for the Sturm check.
 * @param sym - result of `analyse` on the pattern of A
 * @param values - A's lower-triangle values aligned with that pattern's rowIdx (length nnz)
 * @param options - {@link FactorizeOptions}
 * @throws ArgumentError when values do not match the pattern or are not finite
 * @throws FactorizationError (path `row <original index>`) when a pivot is ≤ pivotTolerance·max|A_jj|
 */
export function factorize(sym: SymbolicFactor, values: Float64Array, options: FactorizeOptions = {}): LdltFactor {
  return factorizeNamed(sym, values, options, 'matrix');
}

/**
 * `factorize`, naming the matrix in the singular-pivot message (e.g. 'K' for a static solve).
 * Supernodal left-looking LDLᵀ (Ng & Peyton 1993, "Block sparse Cholesky algorithms on advanced
 * uniprocessor computers", SIAM J. Sci. Comput. 14(5); Davis 2006 §9): for each supernode,
 * gather the updates of the descendants that touch it (dense products through a scratch block
 * and relative indices), then factor its block by column panels.
 */
export function factorizeNamed(symbolic: SymbolicFactor, values: Float64Array, options: FactorizeOptions, matrixName: string): LdltFactor {
  return factorizeReusing(symbolic, values, options, matrixName, undefined);
}

/**
 * `factorizeNamed`, writing L into `storage` when it has the right length (the array a released
 * factor of the same analysis gave up, see SupernodalFactor.releaseStorage): on systems where a
 * fresh page costs microseconds, reusing touched memory saves the page faults of a new factor.
 * Internal to the linalg and eigen layers.
 */
export function factorizeReusing(symbolic: SymbolicFactor, values: Float64Array, options: FactorizeOptions, matrixName: string, storage: Float64Array | undefined): LdltFactor {
  // An option given as undefined takes its default.
  const tolerance = options.pivotTolerance ?? FACTORIZE_DEFAULTS.pivotTolerance;
  if (typeof tolerance !== 'number' || !(tolerance >= 0) || !Number.isFinite(tolerance)) {
    throw new ArgumentError(`pivotTolerance is ${tolerance}; pass a finite number ≥ 0 (default 1e-13)`, 'options.pivotTolerance');
  }
  const sym = symbolic as SupernodalSymbolic;
  if (sym?.kind !== 'supernodal') throw new ArgumentError('the symbolic factor was not made by analyse; call analyse(pattern) first', 'sym');
  if (!(values instanceof Float64Array) || values.length !== sym.patternNnz) {
    throw new ArgumentError(
      `values has length ${(values as { length?: number })?.length}, expected ${sym.patternNnz} (the nnz of the pattern given to analyse); form the values on that pattern`,
      'values',
    );
  }
  const n = sym.n;
  const ns = sym.supernodes;
  const lxPtr = sym.lxPtr;

  // --- Scatter A into the supernode blocks ------------------------------------------------
  const lx = storage !== undefined && storage.length === lxPtr[ns] ? storage.fill(0) : new Float64Array(lxPtr[ns]);
  scatterValues(values, sym.lxPos, sym.patternNnz, lx);
  const maxDiag = largestDiagonal(values, sym.diagPos, n);
  const w = new NumericWork(sym, lxPtr, lx, tolerance * maxDiag, maxDiag, matrixName);
  for (let s = 0; s < ns; s++) factorSupernode(w, s);
  return new SupernodalFactor(sym, lx, w.d, w.negative, n === 0 ? Infinity : w.minRatio);
}

/** lx[lxPos[p]] ← values[p], refusing a non-finite value. */
function scatterValues(values: Float64Array, lxPos: Int32Array, nz: number, lx: Float64Array): void {
  for (let p = 0; p < nz; p++) {
    const v = values[p];
    if (!Number.isFinite(v)) throw new ArgumentError(`value ${v} is not finite; the matrix must hold finite numbers`, `values[${p}]`);
    lx[lxPos[p]] = v;
  }
}

/** max |A_jj| over the stored diagonal. */
function largestDiagonal(values: Float64Array, diagPos: Int32Array, n: number): number {
  let maxDiag = 0;
  for (let j = 0; j < n; j++) if (diagPos[j] >= 0) maxDiag = Math.max(maxDiag, Math.abs(values[diagPos[j]]));
  return maxDiag;
}

/**
 * Everything one numeric factorization reads and writes, sized by analyse; the phases of a
 * supernode are small functions over it (each compiles to optimized code on its own, early in
 * the first factorization, instead of one large function recompiled as rare branches appear).
 */
class NumericWork {
  readonly perm: Int32Array;
  readonly superStart: Int32Array;
  readonly superOf: Int32Array;
  readonly rowPtr: Int32Array;
  readonly rows: Int32Array;
  readonly d: Float64Array;
  readonly rel: Int32Array;
  readonly linkHead: Int32Array;
  readonly linkNext: Int32Array;
  readonly nextPos: Int32Array;
  readonly scratch: Float64Array;
  /**
   * Scaled copy of L_d's rows that hit the target (q × ncd, q ≤ rows below d's block) or of a
   * panel's rows (PANEL × columns on its left).
   */
  readonly scaled: Float64Array;
  readonly colLocal: Int32Array;
  /** wd(j, c) = L(j, c)·d_c of the current panel, row-major with stride PANEL. */
  readonly wd: Float64Array;
  readonly inv: Float64Array;
  negative = 0;
  minRatio = Infinity;

  constructor(
    sym: SupernodalSymbolic,
    readonly lxPtr: Int32Array,
    readonly lx: Float64Array,
    readonly tol: number,
    readonly maxDiag: number,
    readonly matrixName: string,
  ) {
    const n = sym.n;
    const ns = sym.supernodes;
    this.perm = sym.perm;
    this.superStart = sym.superStart;
    this.superOf = sym.superOf;
    this.rowPtr = sym.rowPtr;
    this.rows = sym.rows;
    this.d = new Float64Array(n);
    this.rel = new Int32Array(n);
    this.linkHead = new Int32Array(ns).fill(-1);
    this.linkNext = new Int32Array(ns);
    this.nextPos = new Int32Array(ns);
    this.scratch = new Float64Array(sym.maxBlock);
    let scaledSize = Math.min(PANEL, sym.maxCols) * sym.maxCols;
    for (let s = 0; s < ns; s++) {
      const nc = this.superStart[s + 1] - this.superStart[s];
      scaledSize = Math.max(scaledSize, nc * Math.min(this.rowPtr[s + 1] - this.rowPtr[s] - nc, sym.maxCols));
    }
    this.scaled = new Float64Array(scaledSize);
    this.colLocal = new Int32Array(sym.maxCols);
    this.wd = new Float64Array(PANEL * PANEL);
    this.inv = new Float64Array(PANEL);
  }
}

/** Updates supernode s from its descendants, factors its block by panels, links it to its ancestor. */
function factorSupernode(w: NumericWork, s: number): void {
  const { superStart, rowPtr, rows, rel } = w;
  const f = superStart[s];
  const nc = superStart[s + 1] - f;
  const r0 = rowPtr[s];
  const nr = rowPtr[s + 1] - r0;
  for (let t = 0; t < nr; t++) rel[rows[r0 + t]] = t;

  // --- Updates from descendants: L_s −= L_d(rows ≥ f) · D_d · L_d(rows in [f, l])ᵀ ---------
  let dn = w.linkHead[s];
  w.linkHead[s] = -1;
  while (dn !== -1) {
    const nextD = w.linkNext[dn];
    updateFromDescendant(w, s, dn);
    dn = nextD;
  }

  // --- Factor the supernode's block, panel by panel ---------------------------------------
  const base = w.lxPtr[s];
  for (let j0 = 0; j0 < nc; j0 += PANEL) {
    const j1 = Math.min(nc, j0 + PANEL);
    if (j0 > 0) updatePanel(w, f, nc, nr, base, j0, j1);
    factorDiagonalBlock(w, f, nc, base, j0, j1);
    solveBelowPanel(w, nc, nr, base, j0, j1);
  }
  // This supernode now updates its ancestors: link it to the supernode of its first row below.
  if (nc < nr) {
    w.nextPos[s] = nc;
    const t = w.superOf[rows[r0 + nc]];
    w.linkNext[s] = w.linkHead[t];
    w.linkHead[t] = s;
  }
}

/**
 * L_s −= L_d(rows ≥ f) · D_d · L_d(rows in [f, l])ᵀ for one descendant dn of supernode s, entry
 * by entry for a narrow descendant, else through the scratch block, placed by relative indices;
 * then links dn to the next supernode it updates.
 */
function updateFromDescendant(w: NumericWork, s: number, dn: number): void {
  const { superStart, rowPtr, rows, lxPtr, lx, d, scaled, colLocal } = w;
  const f = superStart[s];
  const nc = superStart[s + 1] - f;
  const l = f + nc - 1;
  const base = lxPtr[s];
  const fd = superStart[dn];
  const ncd = superStart[dn + 1] - fd;
  const rd0 = rowPtr[dn];
  const nrd = rowPtr[dn + 1] - rd0;
  const based = lxPtr[dn];
  const p1 = w.nextPos[dn];
  let p2 = p1;
  while (p2 < nrd && rows[rd0 + p2] <= l) p2++;
  const m = nrd - p1;
  const q = p2 - p1;
  const r0 = rd0 + p1;
  const a0 = based + p1 * ncd;
  // Rows of L_d facing the columns of s, scaled by D_d, and those columns' local numbers.
  for (let j = 0; j < q; j++) {
    const src = a0 + j * ncd;
    const dst = j * ncd;
    for (let c = 0; c < ncd; c++) scaled[dst + c] = lx[src + c] * d[fd + c];
    colLocal[j] = rows[r0 + j] - f;
  }
  if (ncd <= DIRECT_UPDATE_COLUMNS && m * q <= DIRECT_UPDATE_ENTRIES) updateDirect(w, nc, base, ncd, r0, a0, m, q);
  else updateThroughScratch(w, nc, base, ncd, r0, a0, m, q);
  w.nextPos[dn] = p2;
  if (p2 < nrd) {
    const t = w.superOf[rows[rd0 + p2]];
    w.linkNext[dn] = w.linkHead[t];
    w.linkHead[t] = dn;
  }
}

/**
 * Updates from descendants of at most DIRECT_UPDATE_COLUMNS columns into at most
 * DIRECT_UPDATE_ENTRIES entries (m · q) go entry by entry, without the scratch block and the
 * blocked product, whose set-up costs more than so few products (the bulk of a bar structure's
 * updates; measured: footbridge factorization −10 %). Larger ones keep the register blocking.
 */
const DIRECT_UPDATE_COLUMNS = 6;
const DIRECT_UPDATE_ENTRIES = 128;

/**
 * The update of updateFromDescendant entry by entry: L_s(i, j) −= Σ_c L_d(i, c) d_c L_d(j, c),
 * each sum over c in ascending order from zero, as the blocked product forms it (same bits).
 * r0 is the position in `rows` and a0 in `lx` of the descendant's first row below or at f;
 * `scaled` and `colLocal` hold its first q rows scaled by D and their local columns.
 */
function updateDirect(w: NumericWork, nc: number, base: number, ncd: number, r0: number, a0: number, m: number, q: number): void {
  const { rows, lx, scaled, colLocal, rel } = w;
  for (let i = 0; i < m; i++) {
    const ri = base + rel[rows[r0 + i]] * nc;
    const ai = a0 + i * ncd;
    const jmax = i < q ? i + 1 : q;
    for (let j = 0; j < jmax; j++) {
      const bj = j * ncd;
      let t = 0;
      for (let c = 0; c < ncd; c++) t += lx[ai + c] * scaled[bj + c];
      lx[ri + colLocal[j]] -= t;
    }
  }
}

/** The update of updateFromDescendant through the scratch block and the blocked product. */
function updateThroughScratch(w: NumericWork, nc: number, base: number, ncd: number, r0: number, a0: number, m: number, q: number): void {
  const { rows, lx, scaled, colLocal, scratch, rel } = w;
  scratch.fill(0, 0, m * q);
  gemmSubNT(m, q, ncd, lx, a0, ncd, scaled, 0, ncd, scratch, 0, q, 0);
  for (let i = 0; i < m; i++) {
    const ri = base + rel[rows[r0 + i]] * nc;
    const jmax = i < q ? i + 1 : q;
    const ui = i * q;
    for (let j = 0; j < jmax; j++) lx[ri + colLocal[j]] += scratch[ui + j];
  }
}

/** Panel update from the columns on its left: L(j0:, j0:j1) −= L(j0:, :j0) D L(j0:j1, :j0)ᵀ. */
function updatePanel(w: NumericWork, f: number, nc: number, nr: number, base: number, j0: number, j1: number): void {
  const { lx, d, scaled } = w;
  const width = j1 - j0;
  for (let j = 0; j < width; j++) {
    const src = base + (j0 + j) * nc;
    const dst = j * j0;
    for (let c = 0; c < j0; c++) scaled[dst + c] = lx[src + c] * d[f + c];
  }
  gemmSubNT(nr - j0, width, j0, lx, base + j0 * nc, nc, scaled, 0, j0, lx, base + j0 * nc + j0, nc, 0);
}

/**
 * Diagonal block of the panel: unblocked LDLᵀ in dot-product form; wd(j, c) = L(j, c)·d_c is
 * kept (row-major, stride PANEL) for the rows below. Counts negative pivots and the smallest
 * pivot ratio; a pivot at or below the tolerance is a FactorizationError naming the row.
 */
function factorDiagonalBlock(w: NumericWork, f: number, nc: number, base: number, j0: number, j1: number): void {
  const { lx, d, wd, inv } = w;
  for (let j = j0; j < j1; j++) {
    const rj = base + j * nc;
    const wj = (j - j0) * PANEL - j0;
    let dj = lx[rj + j];
    for (let c = j0; c < j; c++) {
      const t = lx[rj + c] * d[f + c];
      wd[wj + c] = t;
      dj -= t * lx[rj + c];
    }
    if (!(Math.abs(dj) > w.tol)) throw singularPivot(w, f + j, dj);
    d[f + j] = dj;
    inv[j - j0] = 1 / dj;
    if (dj < 0) w.negative++;
    const ratio = Math.abs(dj) / w.maxDiag;
    if (ratio < w.minRatio) w.minRatio = ratio;
    for (let i = j + 1; i < j1; i++) {
      const ri = base + i * nc;
      let t = lx[ri + j];
      for (let c = j0; c < j; c++) t -= lx[ri + c] * wd[wj + c];
      lx[ri + j] = t / dj;
    }
  }
}

function singularPivot(w: NumericWork, column: number, dj: number): FactorizationError {
  const row = w.perm[column];
  return new FactorizationError(
    `${w.matrixName} is singular at row ${row} (pivot ${dj.toExponential(2)}, tolerance ${w.tol.toExponential(2)} = pivotTolerance × max|A_jj|); the structure may be a mechanism there, or the shift sits on an eigenvalue — add a support or spring, or move the shift`,
    `row ${row}`,
  );
}

/**
 * Rows below the panel's diagonal block: L(i, j) = (A(i, j) − Σ_c L(i, c)·wd(j, c)) / d_j, a
 * triangular solve done four rows at a time so that each wd load serves four rows.
 */
function solveBelowPanel(w: NumericWork, nc: number, nr: number, base: number, j0: number, j1: number): void {
  const { lx, wd, inv } = w;
  let i = j1;
  for (; i + 4 <= nr; i += 4) {
    const a0 = base + i * nc;
    const a1 = a0 + nc;
    const a2 = a1 + nc;
    const a3 = a2 + nc;
    for (let j = j0; j < j1; j++) {
      const wj = (j - j0) * PANEL - j0;
      let t0 = lx[a0 + j];
      let t1 = lx[a1 + j];
      let t2 = lx[a2 + j];
      let t3 = lx[a3 + j];
      for (let c = j0; c < j; c++) {
        const wc = wd[wj + c];
        t0 -= lx[a0 + c] * wc;
        t1 -= lx[a1 + c] * wc;
        t2 -= lx[a2 + c] * wc;
        t3 -= lx[a3 + c] * wc;
      }
      const r = inv[j - j0];
      lx[a0 + j] = t0 * r;
      lx[a1 + j] = t1 * r;
      lx[a2 + j] = t2 * r;
      lx[a3 + j] = t3 * r;
    }
  }
  for (; i < nr; i++) {
    const a0 = base + i * nc;
    for (let j = j0; j < j1; j++) {
      const wj = (j - j0) * PANEL - j0;
      let t0 = lx[a0 + j];
      for (let c = j0; c < j; c++) t0 -= lx[a0 + c] * wd[wj + c];
      lx[a0 + j] = t0 * inv[j - j0];
    }
  }
}
