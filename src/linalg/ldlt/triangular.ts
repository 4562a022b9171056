/**
 * Supernodal triangular solves with the blocks of an LDLᵀ factor (Davis 2006, §8.3; Ng & Peyton
 * 1993): L⁻¹ forward, then L⁻ᵀ D⁻¹ backward, k right-hand sides of length n stored one after
 * another, in the permuted numbering. Supernode s owns columns superStart[s] .. superStart[s+1]−1
 * and the rows rows[rowPtr[s] .. rowPtr[s+1]) (its own columns first); its block is dense
 * row-major, nr × nc, at lx[lxPtr[s] ..).
 *
 * Supernodes of one to six columns, the bulk of a bar or frame factor, keep the supernode's
 * unknowns in locals and stream the rows below once (measured on a bar footbridge's factor:
 * forward −20 %, backward −25 % against the blocked loops for three to six columns), two rows
 * per loop pass: the engine's optimized code re-checks every typed array it reads once per pass
 * (a whole solve on that factor −5 to −8 %, same bits, since each sum keeps its order); wider
 * ones go four (forward) or eight (backward) rows at a time. Each width is a function of its
 * own: the JavaScript engine then compiles each small loop to optimized code within the first
 * solve, where one function holding every case took longer to compile than the solve took to
 * run. The order of every sum is fixed, so every path gives the same bits. No allocation.
 */

/** Y ← L⁻¹ Y, supernode by supernode. */
export function forwardSolve(y: Float64Array, k: number, n: number, superStart: Int32Array, rowPtr: Int32Array, rows: Int32Array, lxPtr: Int32Array, lx: Float64Array): void {
  const ns = superStart.length - 1;
  const end = k * n;
  for (let s = 0; s < ns; s++) {
    const fs = superStart[s];
    const nc = superStart[s + 1] - fs;
    const r0 = rowPtr[s];
    const nr = rowPtr[s + 1] - r0;
    const base = lxPtr[s];
    for (let o = 0; o < end; o += n) {
      if (nc === 1) forward1(y, o, o + fs, rows, r0, nr, lx, base);
      else if (nc === 2) forward2(y, o, o + fs, rows, r0, nr, lx, base);
      else if (nc === 3) forward3(y, o, o + fs, rows, r0, nr, lx, base);
      else if (nc === 4) forward4(y, o, o + fs, rows, r0, nr, lx, base);
      else if (nc === 5) forward5(y, o, o + fs, rows, r0, nr, lx, base);
      else if (nc === 6) forward6(y, o, o + fs, rows, r0, nr, lx, base);
      else forwardWide(y, o, o + fs, nc, rows, r0, nr, lx, base);
    }
  }
}

function forward1(y: Float64Array, o: number, f: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number): void {
  const y0 = y[f];
  if (y0 === 0) return;
  let i = 1;
  let a = base + 1;
  for (; i + 1 < nr; i += 2, a += 2) {
    const p = o + rows[r0 + i];
    const q = o + rows[r0 + i + 1];
    y[p] -= lx[a] * y0;
    y[q] -= lx[a + 1] * y0;
  }
  if (i < nr) y[o + rows[r0 + i]] -= lx[a] * y0;
}

function forward2(y: Float64Array, o: number, f: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number): void {
  const y0 = y[f];
  const y1 = y[f + 1] - lx[base + 2] * y0;
  y[f + 1] = y1;
  let i = 2;
  let a = base + 4;
  for (; i + 1 < nr; i += 2, a += 4) {
    const p = o + rows[r0 + i];
    const q = o + rows[r0 + i + 1];
    y[p] -= lx[a] * y0 + lx[a + 1] * y1;
    y[q] -= lx[a + 2] * y0 + lx[a + 3] * y1;
  }
  if (i < nr) y[o + rows[r0 + i]] -= lx[a] * y0 + lx[a + 1] * y1;
}

function forward3(y: Float64Array, o: number, f: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number): void {
  const y0 = y[f];
  const y1 = y[f + 1] - lx[base + 3] * y0;
  const y2 = y[f + 2] - lx[base + 6] * y0 - lx[base + 7] * y1;
  y[f + 1] = y1;
  y[f + 2] = y2;
  let i = 3;
  let a = base + 9;
  for (; i + 1 < nr; i += 2, a += 6) {
    const p = o + rows[r0 + i];
    const q = o + rows[r0 + i + 1];
    y[p] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2;
    y[q] -= lx[a + 3] * y0 + lx[a + 4] * y1 + lx[a + 5] * y2;
  }
  if (i < nr) y[o + rows[r0 + i]] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2;
}

function forward4(y: Float64Array, o: number, f: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number): void {
  const y0 = y[f];
  const y1 = y[f + 1] - lx[base + 4] * y0;
  const y2 = y[f + 2] - (lx[base + 8] * y0 + lx[base + 9] * y1);
  const y3 = y[f + 3] - (lx[base + 12] * y0 + lx[base + 13] * y1 + lx[base + 14] * y2);
  y[f + 1] = y1;
  y[f + 2] = y2;
  y[f + 3] = y3;
  let i = 4;
  let a = base + 16;
  for (; i + 1 < nr; i += 2, a += 8) {
    const p = o + rows[r0 + i];
    const q = o + rows[r0 + i + 1];
    y[p] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2 + lx[a + 3] * y3;
    y[q] -= lx[a + 4] * y0 + lx[a + 5] * y1 + lx[a + 6] * y2 + lx[a + 7] * y3;
  }
  if (i < nr) y[o + rows[r0 + i]] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2 + lx[a + 3] * y3;
}

function forward5(y: Float64Array, o: number, f: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number): void {
  // Diagonal block: L(j, c) at base + 5j + c for c < j.
  const y0 = y[f];
  const y1 = y[f + 1] - lx[base + 5] * y0;
  const y2 = y[f + 2] - (lx[base + 10] * y0 + lx[base + 11] * y1);
  const y3 = y[f + 3] - (lx[base + 15] * y0 + lx[base + 16] * y1 + lx[base + 17] * y2);
  const y4 = y[f + 4] - (lx[base + 20] * y0 + lx[base + 21] * y1 + lx[base + 22] * y2 + lx[base + 23] * y3);
  y[f + 1] = y1;
  y[f + 2] = y2;
  y[f + 3] = y3;
  y[f + 4] = y4;
  let i = 5;
  let a = base + 25;
  for (; i + 1 < nr; i += 2, a += 10) {
    const p = o + rows[r0 + i];
    const q = o + rows[r0 + i + 1];
    y[p] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2 + lx[a + 3] * y3 + lx[a + 4] * y4;
    y[q] -= lx[a + 5] * y0 + lx[a + 6] * y1 + lx[a + 7] * y2 + lx[a + 8] * y3 + lx[a + 9] * y4;
  }
  if (i < nr) y[o + rows[r0 + i]] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2 + lx[a + 3] * y3 + lx[a + 4] * y4;
}

function forward6(y: Float64Array, o: number, f: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number): void {
  // Diagonal block: L(j, c) at base + 6j + c for c < j.
  const y0 = y[f];
  const y1 = y[f + 1] - lx[base + 6] * y0;
  const y2 = y[f + 2] - (lx[base + 12] * y0 + lx[base + 13] * y1);
  const y3 = y[f + 3] - (lx[base + 18] * y0 + lx[base + 19] * y1 + lx[base + 20] * y2);
  const y4 = y[f + 4] - (lx[base + 24] * y0 + lx[base + 25] * y1 + lx[base + 26] * y2 + lx[base + 27] * y3);
  const y5 = y[f + 5] - (lx[base + 30] * y0 + lx[base + 31] * y1 + lx[base + 32] * y2 + lx[base + 33] * y3 + lx[base + 34] * y4);
  y[f + 1] = y1;
  y[f + 2] = y2;
  y[f + 3] = y3;
  y[f + 4] = y4;
  y[f + 5] = y5;
  let i = 6;
  let a = base + 36;
  for (; i + 1 < nr; i += 2, a += 12) {
    const p = o + rows[r0 + i];
    const q = o + rows[r0 + i + 1];
    y[p] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2 + lx[a + 3] * y3 + lx[a + 4] * y4 + lx[a + 5] * y5;
    y[q] -= lx[a + 6] * y0 + lx[a + 7] * y1 + lx[a + 8] * y2 + lx[a + 9] * y3 + lx[a + 10] * y4 + lx[a + 11] * y5;
  }
  if (i < nr) y[o + rows[r0 + i]] -= lx[a] * y0 + lx[a + 1] * y1 + lx[a + 2] * y2 + lx[a + 3] * y3 + lx[a + 4] * y4 + lx[a + 5] * y5;
}

function forwardWide(y: Float64Array, o: number, f: number, nc: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number): void {
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

/**
 * Y ← L⁻ᵀ D⁻¹ Y, supernodes in reverse order: the supernode's unknowns are divided by D,
 * updated from the (final) unknowns below, eight rows of L at a time, then solved with the
 * transposed diagonal block.
 */
export function backwardSolve(
  y: Float64Array,
  k: number,
  n: number,
  superStart: Int32Array,
  rowPtr: Int32Array,
  rows: Int32Array,
  lxPtr: Int32Array,
  lx: Float64Array,
  d: Float64Array,
): void {
  const ns = superStart.length - 1;
  const end = k * n;
  for (let s = ns - 1; s >= 0; s--) {
    const fs = superStart[s];
    const nc = superStart[s + 1] - fs;
    const r0 = rowPtr[s];
    const nr = rowPtr[s + 1] - r0;
    const base = lxPtr[s];
    for (let o = 0; o < end; o += n) {
      if (nc === 1) backward1(y, o, o + fs, fs, rows, r0, nr, lx, base, d);
      else if (nc === 2) backward2(y, o, o + fs, fs, rows, r0, nr, lx, base, d);
      else if (nc === 3) backward3(y, o, o + fs, fs, rows, r0, nr, lx, base, d);
      else if (nc === 4) backward4(y, o, o + fs, fs, rows, r0, nr, lx, base, d);
      else if (nc === 5) backward5(y, o, o + fs, fs, rows, r0, nr, lx, base, d);
      else if (nc === 6) backward6(y, o, o + fs, fs, rows, r0, nr, lx, base, d);
      else backwardWide(y, o, o + fs, fs, nc, rows, r0, nr, lx, base, d);
    }
  }
}

function backward1(y: Float64Array, o: number, f: number, fs: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number, d: Float64Array): void {
  const nr8 = 1 + ((nr - 1) & ~7);
  let t0 = y[f] / d[fs];
  for (let i = 1; i < nr8; i += 8) {
    const g = r0 + i;
    const a = base + i;
    t0 -= lx[a] * y[o + rows[g]] + lx[a + 1] * y[o + rows[g + 1]] + lx[a + 2] * y[o + rows[g + 2]] + lx[a + 3] * y[o + rows[g + 3]] + (lx[a + 4] * y[o + rows[g + 4]] + lx[a + 5] * y[o + rows[g + 5]] + lx[a + 6] * y[o + rows[g + 6]] + lx[a + 7] * y[o + rows[g + 7]]);
  }
  for (let i = nr8; i < nr; i++) t0 -= lx[base + i] * y[o + rows[r0 + i]];
  y[f] = t0;
}

function backward2(y: Float64Array, o: number, f: number, fs: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number, d: Float64Array): void {
  const nr8 = 2 + ((nr - 2) & ~7);
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
}

function backward3(y: Float64Array, o: number, f: number, fs: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number, d: Float64Array): void {
  let t0 = y[f] / d[fs];
  let t1 = y[f + 1] / d[fs + 1];
  let t2 = y[f + 2] / d[fs + 2];
  let i = 3;
  let a = base + 9;
  for (; i + 1 < nr; i += 2, a += 6) {
    const x = y[o + rows[r0 + i]];
    const x1 = y[o + rows[r0 + i + 1]];
    t0 -= lx[a] * x;
    t0 -= lx[a + 3] * x1;
    t1 -= lx[a + 1] * x;
    t1 -= lx[a + 4] * x1;
    t2 -= lx[a + 2] * x;
    t2 -= lx[a + 5] * x1;
  }
  if (i < nr) {
    const x = y[o + rows[r0 + i]];
    t0 -= lx[a] * x;
    t1 -= lx[a + 1] * x;
    t2 -= lx[a + 2] * x;
  }
  // Diagonal block, transposed: L(j, c) at base + 3j + c for c < j.
  t1 -= lx[base + 7] * t2;
  t0 -= lx[base + 6] * t2 + lx[base + 3] * t1;
  y[f] = t0;
  y[f + 1] = t1;
  y[f + 2] = t2;
}

function backward4(y: Float64Array, o: number, f: number, fs: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number, d: Float64Array): void {
  let t0 = y[f] / d[fs];
  let t1 = y[f + 1] / d[fs + 1];
  let t2 = y[f + 2] / d[fs + 2];
  let t3 = y[f + 3] / d[fs + 3];
  let i = 4;
  let a = base + 16;
  for (; i + 1 < nr; i += 2, a += 8) {
    const x = y[o + rows[r0 + i]];
    const x1 = y[o + rows[r0 + i + 1]];
    t0 -= lx[a] * x;
    t0 -= lx[a + 4] * x1;
    t1 -= lx[a + 1] * x;
    t1 -= lx[a + 5] * x1;
    t2 -= lx[a + 2] * x;
    t2 -= lx[a + 6] * x1;
    t3 -= lx[a + 3] * x;
    t3 -= lx[a + 7] * x1;
  }
  if (i < nr) {
    const x = y[o + rows[r0 + i]];
    t0 -= lx[a] * x;
    t1 -= lx[a + 1] * x;
    t2 -= lx[a + 2] * x;
    t3 -= lx[a + 3] * x;
  }
  // Diagonal block, transposed: L(j, c) at base + 4j + c for c < j.
  t2 -= lx[base + 14] * t3;
  t1 -= lx[base + 13] * t3 + lx[base + 9] * t2;
  t0 -= lx[base + 12] * t3 + lx[base + 8] * t2 + lx[base + 4] * t1;
  y[f] = t0;
  y[f + 1] = t1;
  y[f + 2] = t2;
  y[f + 3] = t3;
}

function backward5(y: Float64Array, o: number, f: number, fs: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number, d: Float64Array): void {
  let t0 = y[f] / d[fs];
  let t1 = y[f + 1] / d[fs + 1];
  let t2 = y[f + 2] / d[fs + 2];
  let t3 = y[f + 3] / d[fs + 3];
  let t4 = y[f + 4] / d[fs + 4];
  let i = 5;
  let a = base + 25;
  for (; i + 1 < nr; i += 2, a += 10) {
    const x = y[o + rows[r0 + i]];
    const x1 = y[o + rows[r0 + i + 1]];
    t0 -= lx[a] * x;
    t0 -= lx[a + 5] * x1;
    t1 -= lx[a + 1] * x;
    t1 -= lx[a + 6] * x1;
    t2 -= lx[a + 2] * x;
    t2 -= lx[a + 7] * x1;
    t3 -= lx[a + 3] * x;
    t3 -= lx[a + 8] * x1;
    t4 -= lx[a + 4] * x;
    t4 -= lx[a + 9] * x1;
  }
  if (i < nr) {
    const x = y[o + rows[r0 + i]];
    t0 -= lx[a] * x;
    t1 -= lx[a + 1] * x;
    t2 -= lx[a + 2] * x;
    t3 -= lx[a + 3] * x;
    t4 -= lx[a + 4] * x;
  }
  // Diagonal block, transposed: L(j, c) at base + 5j + c for c < j.
  t3 -= lx[base + 23] * t4;
  t2 -= lx[base + 22] * t4 + lx[base + 17] * t3;
  t1 -= lx[base + 21] * t4 + lx[base + 16] * t3 + lx[base + 11] * t2;
  t0 -= lx[base + 20] * t4 + lx[base + 15] * t3 + lx[base + 10] * t2 + lx[base + 5] * t1;
  y[f] = t0;
  y[f + 1] = t1;
  y[f + 2] = t2;
  y[f + 3] = t3;
  y[f + 4] = t4;
}

function backward6(y: Float64Array, o: number, f: number, fs: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number, d: Float64Array): void {
  let t0 = y[f] / d[fs];
  let t1 = y[f + 1] / d[fs + 1];
  let t2 = y[f + 2] / d[fs + 2];
  let t3 = y[f + 3] / d[fs + 3];
  let t4 = y[f + 4] / d[fs + 4];
  let t5 = y[f + 5] / d[fs + 5];
  let i = 6;
  let a = base + 36;
  for (; i + 1 < nr; i += 2, a += 12) {
    const x = y[o + rows[r0 + i]];
    const x1 = y[o + rows[r0 + i + 1]];
    t0 -= lx[a] * x;
    t0 -= lx[a + 6] * x1;
    t1 -= lx[a + 1] * x;
    t1 -= lx[a + 7] * x1;
    t2 -= lx[a + 2] * x;
    t2 -= lx[a + 8] * x1;
    t3 -= lx[a + 3] * x;
    t3 -= lx[a + 9] * x1;
    t4 -= lx[a + 4] * x;
    t4 -= lx[a + 10] * x1;
    t5 -= lx[a + 5] * x;
    t5 -= lx[a + 11] * x1;
  }
  if (i < nr) {
    const x = y[o + rows[r0 + i]];
    t0 -= lx[a] * x;
    t1 -= lx[a + 1] * x;
    t2 -= lx[a + 2] * x;
    t3 -= lx[a + 3] * x;
    t4 -= lx[a + 4] * x;
    t5 -= lx[a + 5] * x;
  }
  // Diagonal block, transposed: L(j, c) at base + 6j + c for c < j.
  t4 -= lx[base + 34] * t5;
  t3 -= lx[base + 33] * t5 + lx[base + 27] * t4;
  t2 -= lx[base + 32] * t5 + lx[base + 26] * t4 + lx[base + 20] * t3;
  t1 -= lx[base + 31] * t5 + lx[base + 25] * t4 + lx[base + 19] * t3 + lx[base + 13] * t2;
  t0 -= lx[base + 30] * t5 + lx[base + 24] * t4 + lx[base + 18] * t3 + lx[base + 12] * t2 + lx[base + 6] * t1;
  y[f] = t0;
  y[f + 1] = t1;
  y[f + 2] = t2;
  y[f + 3] = t3;
  y[f + 4] = t4;
  y[f + 5] = t5;
}

function backwardWide(y: Float64Array, o: number, f: number, fs: number, nc: number, rows: Int32Array, r0: number, nr: number, lx: Float64Array, base: number, d: Float64Array): void {
  const nr8 = nc + ((nr - nc) & ~7);
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
  // Diagonal block: unit upper triangular solve with Lᵀ, four rows of L at a time: finish the
  // four unknowns of the block, then apply them to the entries above in one pass.
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
