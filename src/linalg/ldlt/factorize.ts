import { ArgumentError, FactorizationError } from '../../errors';
import type { SupernodalSymbolic } from './analyse';
import { gemmSubNT } from './kernels';
import type { FactorizeOptions, LdltFactor, SymbolicFactor } from './types';

/** Defaults of {@link FactorizeOptions}. */
export const FACTORIZE_DEFAULTS = { pivotTolerance: 1e-13 } as const;

/** Width of the column panels inside a supernode (blocked left-looking within the supernode). */
const PANEL = 16;

/**
 * Supernodal LDLᵀ factor of C = P A Pᵀ: L unit lower triangular in dense row-major supernode
 * blocks, D diagonal. Solves run supernode by supernode with dense inner loops.
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
  private readonly lxPtr: Float64Array;
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
   * X ← A⁻¹ B, k columns. Each column goes through exactly the arithmetic of a one-vector solve
   * (so the two agree bit for bit); the k columns are taken supernode by supernode, so that a
   * supernode's block of L serves all of them while it is in cache.
   */
  /**
   * Gives up the factor's value storage (for `factorizeReusing`, so that the next factorization
   * of the same analysis writes into memory already touched). The factor cannot solve afterwards.
   * @returns L's value array
   */
  releaseStorage(): Float64Array {
    this.released = true;
    return this.lx;
  }

  solveMany(b: Float64Array, x: Float64Array, k: number): void {
    const n = this.n;
    if (this.released) throw new ArgumentError('this factor gave up its storage for another factorization; factorize again to solve', 'factor');
    if (!(Number.isInteger(k) && k >= 0)) throw new ArgumentError(`k is ${k}; pass the number of right-hand sides, an integer ≥ 0`, 'k');
    if (b.length < n * k || x.length < n * k) {
      throw new ArgumentError(`b has length ${b.length} and x ${x.length}, need n·k = ${n * k}; pass column-major n × k arrays`, b.length < n * k ? 'b' : 'x');
    }
    if (this.work.length < n * k) this.work = new Float64Array(n * k);
    const y = this.work;
    const { perm } = this;
    for (let r = 0; r < k; r++) {
      const o = r * n;
      for (let q = 0; q < n; q++) y[o + q] = b[o + perm[q]];
    }
    this.forward(y, k);
    this.backward(y, k);
    for (let r = 0; r < k; r++) {
      const o = r * n;
      for (let q = 0; q < n; q++) x[o + perm[q]] = y[o + q];
    }
  }

  /**
   * Y ← L⁻¹ Y (permuted numbering, k columns of length n), supernode by supernode (supernodal
   * triangular solve, Davis 2006, §8.3; Ng & Peyton 1993). Supernodes of 1 to 4 columns, the
   * bulk of a bar or frame factor, keep the supernode's solved unknowns in locals and stream the
   * rows below once; wider ones take the diagonal block four rows at a time and the rows below
   * as dot products. The order of every sum is fixed (same bits on every path). No allocation.
   */
  private forward(y: Float64Array, k: number): void {
    const { n, superStart, rowPtr, rows, lxPtr, lx } = this;
    const ns = superStart.length - 1;
    const end = k * n;
    for (let s = 0; s < ns; s++) {
      const fs = superStart[s];
      const nc = superStart[s + 1] - fs;
      const r0 = rowPtr[s];
      const nr = rowPtr[s + 1] - r0;
      const base = lxPtr[s];
      for (let o = 0; o < end; o += n) {
        const f = o + fs;
        if (nc === 1) {
          const y0 = y[f];
          if (y0 === 0) continue;
          for (let i = 1, a = base + 1; i < nr; i++, a++) y[o + rows[r0 + i]] -= lx[a] * y0;
        } else if (nc === 2) {
          const y0 = y[f];
          const y1 = y[f + 1] - lx[base + 2] * y0;
          y[f + 1] = y1;
          for (let i = 2, a = base + 4; i < nr; i++, a += 2) y[o + rows[r0 + i]] -= lx[a] * y0 + lx[a + 1] * y1;
        } else if (nc === 3) {
          const y0 = y[f];
          const y1 = y[f + 1] - lx[base + 3] * y0;
          const y2 = y[f + 2] - lx[base + 6] * y0 - lx[base + 7] * y1;
          y[f + 1] = y1;
          y[f + 2] = y2;
          for (let i = 3, a = base + 9; i < nr; i++, a += 3) y[o + rows[r0 + i]] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2;
        } else if (nc === 4) {
          const y0 = y[f];
          const y1 = y[f + 1] - lx[base + 4] * y0;
          const y2 = y[f + 2] - (lx[base + 8] * y0 + lx[base + 9] * y1);
          const y3 = y[f + 3] - (lx[base + 12] * y0 + lx[base + 13] * y1 + lx[base + 14] * y2);
          y[f + 1] = y1;
          y[f + 2] = y2;
          y[f + 3] = y3;
          for (let i = 4, a = base + 16; i < nr; i++, a += 4) y[o + rows[r0 + i]] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2 + lx[a + 3] * y3;
        } else {
          // Diagonal block: unit lower triangular solve, four rows at a time (its rows are contiguous).
          let j = 0;
          for (; j + 4 <= nc; j += 4) {
            const a0 = base + j * nc;
            const a1 = a0 + nc;
            const a2 = a1 + nc;
            const a3 = a2 + nc;
            let t0 = y[f + j];
            let t1 = y[f + j + 1];
            let t2 = y[f + j + 2];
            let t3 = y[f + j + 3];
            for (let c = 0; c < j; c++) {
              const yc = y[f + c];
              t0 -= lx[a0 + c] * yc;
              t1 -= lx[a1 + c] * yc;
              t2 -= lx[a2 + c] * yc;
              t3 -= lx[a3 + c] * yc;
            }
            t1 -= lx[a1 + j] * t0;
            t2 -= lx[a2 + j] * t0 + lx[a2 + j + 1] * t1;
            t3 -= lx[a3 + j] * t0 + lx[a3 + j + 1] * t1 + lx[a3 + j + 2] * t2;
            y[f + j] = t0;
            y[f + j + 1] = t1;
            y[f + j + 2] = t2;
            y[f + j + 3] = t3;
          }
          for (; j < nc; j++) {
            const rj = base + j * nc;
            let t = y[f + j];
            for (let c = 0; c < j; c++) t -= lx[rj + c] * y[f + c];
            y[f + j] = t;
          }
          // Rows below: y_i −= L(i, :)·y_s, four rows per pass over y_s.
          let i = nc;
          for (; i + 4 <= nr; i += 4) {
            const a0 = base + i * nc;
            const a1 = a0 + nc;
            const a2 = a1 + nc;
            const a3 = a2 + nc;
            let t0 = 0;
            let t1 = 0;
            let t2 = 0;
            let t3 = 0;
            for (let c = 0; c < nc; c++) {
              const yc = y[f + c];
              t0 += lx[a0 + c] * yc;
              t1 += lx[a1 + c] * yc;
              t2 += lx[a2 + c] * yc;
              t3 += lx[a3 + c] * yc;
            }
            const g = r0 + i;
            y[o + rows[g]] -= t0;
            y[o + rows[g + 1]] -= t1;
            y[o + rows[g + 2]] -= t2;
            y[o + rows[g + 3]] -= t3;
          }
          for (; i < nr; i++) {
            const a0 = base + i * nc;
            let t = 0;
            for (let c = 0; c < nc; c++) t += lx[a0 + c] * y[f + c];
            y[o + rows[r0 + i]] -= t;
          }
        }
      }
    }
  }

  /**
   * Y ← L⁻ᵀ D⁻¹ Y (permuted numbering, k columns of length n), supernodes in reverse order: the
   * supernode's unknowns are divided by D, updated from the (final) unknowns below, eight rows
   * of L at a time, then solved with the transposed diagonal block. Same specialisation by width
   * as `forward`, with the same order of every sum on every path.
   */
  private backward(y: Float64Array, k: number): void {
    const { n, superStart, rowPtr, rows, lxPtr, lx, d } = this;
    const ns = superStart.length - 1;
    const end = k * n;
    for (let s = ns - 1; s >= 0; s--) {
      const fs = superStart[s];
      const nc = superStart[s + 1] - fs;
      const r0 = rowPtr[s];
      const nr = rowPtr[s + 1] - r0;
      const base = lxPtr[s];
      const nr8 = nc + ((nr - nc) & ~7);
      for (let o = 0; o < end; o += n) {
        const f = o + fs;
        // One or two unknowns (most supernodes of bar and frame factors) in locals; rows below in
        // blocks of eight, then one by one.
        if (nc === 1) {
          let t0 = y[f] / d[fs];
          for (let i = 1; i < nr8; i += 8) {
            const g = r0 + i;
            const a = base + i;
            t0 -= lx[a] * y[o + rows[g]] + lx[a + 1] * y[o + rows[g + 1]] + lx[a + 2] * y[o + rows[g + 2]] + lx[a + 3] * y[o + rows[g + 3]] + (lx[a + 4] * y[o + rows[g + 4]] + lx[a + 5] * y[o + rows[g + 5]] + lx[a + 6] * y[o + rows[g + 6]] + lx[a + 7] * y[o + rows[g + 7]]);
          }
          for (let i = nr8; i < nr; i++) t0 -= lx[base + i] * y[o + rows[r0 + i]];
          y[f] = t0;
          continue;
        }
        if (nc === 2) {
          let t0 = y[f] / d[fs];
          let t1 = y[f + 1] / d[fs + 1];
          for (let i = 2; i < nr8; i += 8) {
            const g = r0 + i;
            const x0 = y[o + rows[g]];
            const x1 = y[o + rows[g + 1]];
            const x2 = y[o + rows[g + 2]];
            const x3 = y[o + rows[g + 3]];
            const x4 = y[o + rows[g + 4]];
            const x5 = y[o + rows[g + 5]];
            const x6 = y[o + rows[g + 6]];
            const x7 = y[o + rows[g + 7]];
            const a = base + 2 * i;
            t0 -= lx[a] * x0 + lx[a + 2] * x1 + lx[a + 4] * x2 + lx[a + 6] * x3 + (lx[a + 8] * x4 + lx[a + 10] * x5 + lx[a + 12] * x6 + lx[a + 14] * x7);
            t1 -= lx[a + 1] * x0 + lx[a + 3] * x1 + lx[a + 5] * x2 + lx[a + 7] * x3 + (lx[a + 9] * x4 + lx[a + 11] * x5 + lx[a + 13] * x6 + lx[a + 15] * x7);
          }
          for (let i = nr8; i < nr; i++) {
            const xi = y[o + rows[r0 + i]];
            const a = base + 2 * i;
            t0 -= lx[a] * xi;
            t1 -= lx[a + 1] * xi;
          }
          t0 -= lx[base + 2] * t1;
          y[f] = t0;
          y[f + 1] = t1;
          continue;
        }
        for (let c = 0; c < nc; c++) y[f + c] /= d[fs + c];
        // y_s −= L(below, :)ᵀ y_below, eight rows of L per pass over y_s.
        let i = nc;
        for (; i < nr8; i += 8) {
          const a0 = base + i * nc;
          const a1 = a0 + nc;
          const a2 = a1 + nc;
          const a3 = a2 + nc;
          const a4 = a3 + nc;
          const a5 = a4 + nc;
          const a6 = a5 + nc;
          const a7 = a6 + nc;
          const g = r0 + i;
          const x0 = y[o + rows[g]];
          const x1 = y[o + rows[g + 1]];
          const x2 = y[o + rows[g + 2]];
          const x3 = y[o + rows[g + 3]];
          const x4 = y[o + rows[g + 4]];
          const x5 = y[o + rows[g + 5]];
          const x6 = y[o + rows[g + 6]];
          const x7 = y[o + rows[g + 7]];
          for (let c = 0; c < nc; c++) {
            y[f + c] -= lx[a0 + c] * x0 + lx[a1 + c] * x1 + lx[a2 + c] * x2 + lx[a3 + c] * x3 + (lx[a4 + c] * x4 + lx[a5 + c] * x5 + lx[a6 + c] * x6 + lx[a7 + c] * x7);
          }
        }
        for (; i < nr; i++) {
          const a0 = base + i * nc;
          const x0 = y[o + rows[r0 + i]];
          for (let c = 0; c < nc; c++) y[f + c] -= lx[a0 + c] * x0;
        }
        // Diagonal block: unit upper triangular solve with Lᵀ, four rows of L at a time: finish
        // the four unknowns of the block, then apply them to the entries above in one pass.
        let j = nc - 1;
        for (; j >= 3; j -= 4) {
          const a3 = base + j * nc;
          const a2 = a3 - nc;
          const a1 = a2 - nc;
          const a0 = a1 - nc;
          const top = j - 3;
          const x3 = y[f + j];
          const x2 = y[f + j - 1] - lx[a3 + j - 1] * x3;
          const x1 = y[f + j - 2] - lx[a3 + j - 2] * x3 - lx[a2 + j - 2] * x2;
          const x0 = y[f + j - 3] - lx[a3 + j - 3] * x3 - lx[a2 + j - 3] * x2 - lx[a1 + j - 3] * x1;
          y[f + j - 1] = x2;
          y[f + j - 2] = x1;
          y[f + j - 3] = x0;
          for (let c = 0; c < top; c++) y[f + c] -= lx[a0 + c] * x0 + lx[a1 + c] * x1 + lx[a2 + c] * x2 + lx[a3 + c] * x3;
        }
        for (; j > 0; j--) {
          const rj = base + j * nc;
          const xj = y[f + j];
          for (let c = 0; c < j; c++) y[f + c] -= lx[rj + c] * xj;
        }
      }
    }
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
  const { n, perm, superStart, superOf, rowPtr, rows, lxPtr, lxPos, diagPos } = sym;
  const ns = sym.supernodes;

  // --- Scatter A into the supernode blocks ------------------------------------------------
  const lx = storage !== undefined && storage.length === lxPtr[ns] ? storage.fill(0) : new Float64Array(lxPtr[ns]);
  const nz = sym.patternNnz;
  for (let p = 0; p < nz; p++) {
    const v = values[p];
    if (!Number.isFinite(v)) throw new ArgumentError(`value ${v} is not finite; the matrix must hold finite numbers`, `values[${p}]`);
    lx[lxPos[p]] = v;
  }
  let maxDiag = 0;
  for (let j = 0; j < n; j++) if (diagPos[j] >= 0) maxDiag = Math.max(maxDiag, Math.abs(values[diagPos[j]]));
  const tol = tolerance * maxDiag;

  // --- Workspaces, sized by analyse --------------------------------------------------------
  const d = new Float64Array(n);
  const rel = new Int32Array(n);
  const linkHead = new Int32Array(ns).fill(-1);
  const linkNext = new Int32Array(ns);
  const nextPos = new Int32Array(ns);
  const scratch = new Float64Array(sym.maxBlock);
  // Scaled copy of L_d's rows that hit the target (q × ncd, q ≤ rows below d's block) or of a
  // panel's rows (PANEL × columns on its left).
  let scaledSize = Math.min(PANEL, sym.maxCols) * sym.maxCols;
  for (let s = 0; s < ns; s++) {
    const nc = superStart[s + 1] - superStart[s];
    scaledSize = Math.max(scaledSize, nc * Math.min(rowPtr[s + 1] - rowPtr[s] - nc, sym.maxCols));
  }
  const scaled = new Float64Array(scaledSize);
  const colLocal = new Int32Array(sym.maxCols);
  const wd = new Float64Array(PANEL * PANEL);
  const inv = new Float64Array(PANEL);
  let negative = 0;
  let minRatio = Infinity;

  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const l = f + nc - 1;
    const r0 = rowPtr[s];
    const nr = rowPtr[s + 1] - r0;
    const base = lxPtr[s];
    for (let t = 0; t < nr; t++) rel[rows[r0 + t]] = t;

    // --- Updates from descendants: L_s −= L_d(rows ≥ f) · D_d · L_d(rows in [f, l])ᵀ ------
    let dn = linkHead[s];
    linkHead[s] = -1;
    while (dn !== -1) {
      const nextD = linkNext[dn];
      const fd = superStart[dn];
      const ncd = superStart[dn + 1] - fd;
      const rd0 = rowPtr[dn];
      const nrd = rowPtr[dn + 1] - rd0;
      const based = lxPtr[dn];
      const p1 = nextPos[dn];
      let p2 = p1;
      while (p2 < nrd && rows[rd0 + p2] <= l) p2++;
      const m = nrd - p1;
      const q = p2 - p1;
      for (let j = 0; j < q; j++) {
        const src = based + (p1 + j) * ncd;
        const dst = j * ncd;
        for (let c = 0; c < ncd; c++) scaled[dst + c] = lx[src + c] * d[fd + c];
        colLocal[j] = rows[rd0 + p1 + j] - f;
      }
      scratch.fill(0, 0, m * q);
      gemmSubNT(m, q, ncd, lx, based + p1 * ncd, ncd, scaled, 0, ncd, scratch, 0, q, 0);
      for (let i = 0; i < m; i++) {
        const ri = base + rel[rows[rd0 + p1 + i]] * nc;
        const jmax = i < q ? i + 1 : q;
        const ui = i * q;
        for (let j = 0; j < jmax; j++) lx[ri + colLocal[j]] += scratch[ui + j];
      }
      nextPos[dn] = p2;
      if (p2 < nrd) {
        const t = superOf[rows[rd0 + p2]];
        linkNext[dn] = linkHead[t];
        linkHead[t] = dn;
      }
      dn = nextD;
    }

    // --- Factor the supernode's block, panel by panel ---------------------------------------
    for (let j0 = 0; j0 < nc; j0 += PANEL) {
      const j1 = Math.min(nc, j0 + PANEL);
      const w = j1 - j0;
      if (j0 > 0) {
        // Panel update from the columns on its left: L(j0:, j0:j1) −= L(j0:, :j0) D L(j0:j1, :j0)ᵀ
        for (let j = 0; j < w; j++) {
          const src = base + (j0 + j) * nc;
          const dst = j * j0;
          for (let c = 0; c < j0; c++) scaled[dst + c] = lx[src + c] * d[f + c];
        }
        gemmSubNT(nr - j0, w, j0, lx, base + j0 * nc, nc, scaled, 0, j0, lx, base + j0 * nc + j0, nc, 0);
      }
      // Diagonal block of the panel: unblocked LDLᵀ in dot-product form; wd(j, c) = L(j, c)·d_c
      // is kept (row-major, stride PANEL) for the rows below.
      for (let j = j0; j < j1; j++) {
        const rj = base + j * nc;
        const wj = (j - j0) * PANEL - j0;
        let dj = lx[rj + j];
        for (let c = j0; c < j; c++) {
          const t = lx[rj + c] * d[f + c];
          wd[wj + c] = t;
          dj -= t * lx[rj + c];
        }
        if (!(Math.abs(dj) > tol)) {
          const row = perm[f + j];
          throw new FactorizationError(
            `${matrixName} is singular at row ${row} (pivot ${dj.toExponential(2)}, tolerance ${tol.toExponential(2)} = pivotTolerance × max|A_jj|); the structure may be a mechanism there, or the shift sits on an eigenvalue — add a support or spring, or move the shift`,
            `row ${row}`,
          );
        }
        d[f + j] = dj;
        inv[j - j0] = 1 / dj;
        if (dj < 0) negative++;
        const ratio = Math.abs(dj) / maxDiag;
        if (ratio < minRatio) minRatio = ratio;
        for (let i = j + 1; i < j1; i++) {
          const ri = base + i * nc;
          let t = lx[ri + j];
          for (let c = j0; c < j; c++) t -= lx[ri + c] * wd[wj + c];
          lx[ri + j] = t / dj;
        }
      }
      // Rows below the panel's diagonal block: L(i, j) = (A(i, j) − Σ_c L(i, c)·wd(j, c)) / d_j,
      // a triangular solve done four rows at a time so that each wd load serves four rows.
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
    // This supernode now updates its ancestors: link it to the supernode of its first row below.
    if (nc < nr) {
      nextPos[s] = nc;
      const t = superOf[rows[r0 + nc]];
      linkNext[s] = linkHead[t];
      linkHead[t] = s;
    }
  }
  return new SupernodalFactor(sym, lx, d, negative, n === 0 ? Infinity : minRatio);
}
