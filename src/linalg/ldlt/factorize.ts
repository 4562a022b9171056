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

  solveMany(b: Float64Array, x: Float64Array, k: number): void {
    const n = this.n;
    if (!(Number.isInteger(k) && k >= 0)) throw new ArgumentError(`k is ${k}; pass the number of right-hand sides, an integer ≥ 0`, 'k');
    if (b.length < n * k || x.length < n * k) {
      throw new ArgumentError(`b has length ${b.length} and x ${x.length}, need n·k = ${n * k}; pass column-major n × k arrays`, b.length < n * k ? 'b' : 'x');
    }
    if (this.work.length < n * k) this.work = new Float64Array(n * k);
    const y = this.work;
    const { perm, d } = this;
    for (let r = 0; r < k; r++) {
      const o = r * n;
      for (let q = 0; q < n; q++) y[o + q] = b[o + perm[q]];
    }
    this.forward(y, k);
    for (let r = 0; r < k; r++) {
      const o = r * n;
      for (let q = 0; q < n; q++) y[o + q] /= d[q];
    }
    this.backward(y, k);
    for (let r = 0; r < k; r++) {
      const o = r * n;
      for (let q = 0; q < n; q++) x[o + perm[q]] = y[o + q];
    }
  }

  /**
   * Y ← L⁻¹ Y (permuted numbering, k columns of length n), supernode by supernode. Each strip of
   * four rows of L is applied to all k columns while it is in cache.
   */
  private forward(y: Float64Array, k: number): void {
    const { n, superStart, rowPtr, rows, lxPtr, lx } = this;
    const ns = superStart.length - 1;
    for (let s = 0; s < ns; s++) {
      const f = superStart[s];
      const nc = superStart[s + 1] - f;
      const r0 = rowPtr[s];
      const nr = rowPtr[s + 1] - r0;
      const base = lxPtr[s];
      // Diagonal block: unit lower triangular solve, four rows at a time (contiguous rows).
      let j = 0;
      for (; j + 4 <= nc; j += 4) {
        const a0 = base + j * nc;
        const a1 = a0 + nc;
        const a2 = a1 + nc;
        const a3 = a2 + nc;
        for (let r = 0; r < k; r++) {
          const o = r * n + f;
          let t0 = y[o + j];
          let t1 = y[o + j + 1];
          let t2 = y[o + j + 2];
          let t3 = y[o + j + 3];
          for (let c = 0; c < j; c++) {
            const yc = y[o + c];
            t0 -= lx[a0 + c] * yc;
            t1 -= lx[a1 + c] * yc;
            t2 -= lx[a2 + c] * yc;
            t3 -= lx[a3 + c] * yc;
          }
          t1 -= lx[a1 + j] * t0;
          t2 -= lx[a2 + j] * t0 + lx[a2 + j + 1] * t1;
          t3 -= lx[a3 + j] * t0 + lx[a3 + j + 1] * t1 + lx[a3 + j + 2] * t2;
          y[o + j] = t0;
          y[o + j + 1] = t1;
          y[o + j + 2] = t2;
          y[o + j + 3] = t3;
        }
      }
      for (; j < nc; j++) {
        const rj = base + j * nc;
        for (let r = 0; r < k; r++) {
          const o = r * n + f;
          let t = y[o + j];
          for (let c = 0; c < j; c++) t -= lx[rj + c] * y[o + c];
          y[o + j] = t;
        }
      }
      // Rows below: y_i −= L(i, :)·y_s, eight rows per pass over y_s (eight sequential streams).
      let i = nc;
      for (; i + 8 <= nr; i += 8) {
        const a0 = base + i * nc;
        const a1 = a0 + nc;
        const a2 = a1 + nc;
        const a3 = a2 + nc;
        const a4 = a3 + nc;
        const a5 = a4 + nc;
        const a6 = a5 + nc;
        const a7 = a6 + nc;
        const g = r0 + i;
        for (let r = 0; r < k; r++) {
          const o = r * n;
          const os = o + f;
          let t0 = 0, t1 = 0, t2 = 0, t3 = 0, t4 = 0, t5 = 0, t6 = 0, t7 = 0;
          for (let c = 0; c < nc; c++) {
            const yc = y[os + c];
            t0 += lx[a0 + c] * yc;
            t1 += lx[a1 + c] * yc;
            t2 += lx[a2 + c] * yc;
            t3 += lx[a3 + c] * yc;
            t4 += lx[a4 + c] * yc;
            t5 += lx[a5 + c] * yc;
            t6 += lx[a6 + c] * yc;
            t7 += lx[a7 + c] * yc;
          }
          y[o + rows[g]] -= t0;
          y[o + rows[g + 1]] -= t1;
          y[o + rows[g + 2]] -= t2;
          y[o + rows[g + 3]] -= t3;
          y[o + rows[g + 4]] -= t4;
          y[o + rows[g + 5]] -= t5;
          y[o + rows[g + 6]] -= t6;
          y[o + rows[g + 7]] -= t7;
        }
      }
      for (; i < nr; i++) {
        const a0 = base + i * nc;
        const g0 = rows[r0 + i];
        for (let r = 0; r < k; r++) {
          const o = r * n;
          const os = o + f;
          let t = 0;
          for (let c = 0; c < nc; c++) t += lx[a0 + c] * y[os + c];
          y[o + g0] -= t;
        }
      }
    }
  }

  /**
   * Y ← L⁻ᵀ Y (permuted numbering, k columns of length n), supernodes in reverse order. Each
   * strip of L (eight rows below the diagonal block, four rows of it) is applied to all k
   * columns while it is in cache.
   */
  private backward(y: Float64Array, k: number): void {
    const { n, superStart, rowPtr, rows, lxPtr, lx } = this;
    const ns = superStart.length - 1;
    for (let s = ns - 1; s >= 0; s--) {
      const f = superStart[s];
      const nc = superStart[s + 1] - f;
      const r0 = rowPtr[s];
      const nr = rowPtr[s + 1] - r0;
      const base = lxPtr[s];
      // y_s −= L(below, :)ᵀ y_below, eight rows of L per pass over y_s (eight sequential streams).
      let i = nc;
      for (; i + 8 <= nr; i += 8) {
        const a0 = base + i * nc;
        const a1 = a0 + nc;
        const a2 = a1 + nc;
        const a3 = a2 + nc;
        const a4 = a3 + nc;
        const a5 = a4 + nc;
        const a6 = a5 + nc;
        const a7 = a6 + nc;
        const g = r0 + i;
        for (let r = 0; r < k; r++) {
          const o = r * n;
          const os = o + f;
          const x0 = y[o + rows[g]];
          const x1 = y[o + rows[g + 1]];
          const x2 = y[o + rows[g + 2]];
          const x3 = y[o + rows[g + 3]];
          const x4 = y[o + rows[g + 4]];
          const x5 = y[o + rows[g + 5]];
          const x6 = y[o + rows[g + 6]];
          const x7 = y[o + rows[g + 7]];
          for (let c = 0; c < nc; c++) {
            y[os + c] -= lx[a0 + c] * x0 + lx[a1 + c] * x1 + lx[a2 + c] * x2 + lx[a3 + c] * x3 + (lx[a4 + c] * x4 + lx[a5 + c] * x5 + lx[a6 + c] * x6 + lx[a7 + c] * x7);
          }
        }
      }
      for (; i < nr; i++) {
        const a0 = base + i * nc;
        const g0 = rows[r0 + i];
        for (let r = 0; r < k; r++) {
          const o = r * n;
          const os = o + f;
          const x0 = y[o + g0];
          for (let c = 0; c < nc; c++) y[os + c] -= lx[a0 + c] * x0;
        }
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
        for (let r = 0; r < k; r++) {
          const o = r * n + f;
          const x3 = y[o + j];
          const x2 = y[o + j - 1] - lx[a3 + j - 1] * x3;
          const x1 = y[o + j - 2] - lx[a3 + j - 2] * x3 - lx[a2 + j - 2] * x2;
          const x0 = y[o + j - 3] - lx[a3 + j - 3] * x3 - lx[a2 + j - 3] * x2 - lx[a1 + j - 3] * x1;
          y[o + j - 1] = x2;
          y[o + j - 2] = x1;
          y[o + j - 3] = x0;
          for (let c = 0; c < top; c++) y[o + c] -= lx[a0 + c] * x0 + lx[a1 + c] * x1 + lx[a2 + c] * x2 + lx[a3 + c] * x3;
        }
      }
      for (; j > 0; j--) {
        const rj = base + j * nc;
        for (let r = 0; r < k; r++) {
          const o = r * n + f;
          const xj = y[o + j];
          for (let c = 0; c < j; c++) y[o + c] -= lx[rj + c] * xj;
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
  const lx = new Float64Array(lxPtr[ns]);
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
