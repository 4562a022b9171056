/**
 * Dense kernels of the supernodal LDLᵀ, over flat Float64Arrays in row-major panels (row i of a
 * panel holds its entries for consecutive columns, so every inner loop runs over contiguous
 * memory). Written for JS engines: 4×4 register blocks of accumulators in local variables
 * (the micro-kernel idea of Goto & van de Geijn, "Anatomy of high-performance matrix
 * multiplication", ACM TOMS 34(3), 2008), no allocation.
 */

/** Cache blocking of {@link gemmSubNT}: a KC-long slice of QC rows of B stays in L1/L2. */
const KC = 256;
const QC = 32;

/** `lower` value of {@link gemmSubNT} for a full product. */
export const FULL = 0x3fffffff;

/**
 * C ← C − A·Bᵀ: C is m × q (row stride ldc), A is m × k (row stride lda), B is q × k (row
 * stride ldb); every matrix starts at its offset in its array. Only the entries (i, j) with
 * j ≤ i + lower are needed (pass {@link FULL} for all, 0 for the lower trapezoid of an update
 * whose first q rows face its q columns); whole 4×4 blocks above that line are skipped, so a
 * few entries above it may be written. Blocked over k and q so that the slice of B in use
 * stays in cache (Goto & van de Geijn 2008, §4).
 */
export function gemmSubNT(
  m: number,
  q: number,
  k: number,
  A: Float64Array,
  aOff: number,
  lda: number,
  B: Float64Array,
  bOff: number,
  ldb: number,
  C: Float64Array,
  cOff: number,
  ldc: number,
  lower: number,
): void {
  if (k <= KC && q <= QC) {
    gemmKernel(m, q, k, A, aOff, lda, B, bOff, ldb, C, cOff, ldc, lower);
    return;
  }
  for (let j0 = 0; j0 < q; j0 += QC) {
    const qq = q - j0 < QC ? q - j0 : QC;
    // Rows i with i + lower < j0 need nothing from this column block.
    const shift = lower - j0;
    const i0 = shift < 0 ? -shift : 0;
    if (i0 >= m) break;
    for (let k0 = 0; k0 < k; k0 += KC) {
      const kk = k - k0 < KC ? k - k0 : KC;
      gemmKernel(m - i0, qq, kk, A, aOff + i0 * lda + k0, lda, B, bOff + j0 * ldb + k0, ldb, C, cOff + i0 * ldc + j0, ldc, shift + i0);
    }
  }
}

/**
 * Unblocked {@link gemmSubNT}: 4×4 register blocks, then the 4×2, 4×1, 1×4 and 1×1 edges; row i
 * computes the columns j ≤ i + lower (within a 4-row block, up to its last row's limit).
 */
function gemmKernel(
  m: number,
  q: number,
  k: number,
  A: Float64Array,
  aOff: number,
  lda: number,
  B: Float64Array,
  bOff: number,
  ldb: number,
  C: Float64Array,
  cOff: number,
  ldc: number,
  lower: number,
): void {
  const m4 = m - (m % 4);
  let i = 0;
  for (; i < m4; i += 4) {
    const qEnd = i + 4 + lower < q ? i + 4 + lower : q;
    const q4 = qEnd - (qEnd % 4);
    const a0 = aOff + i * lda;
    const a1 = a0 + lda;
    const a2 = a1 + lda;
    const a3 = a2 + lda;
    let j = 0;
    for (; j < q4; j += 4) {
      const b0 = bOff + j * ldb;
      const b1 = b0 + ldb;
      const b2 = b1 + ldb;
      const b3 = b2 + ldb;
      let c00 = 0, c01 = 0, c02 = 0, c03 = 0;
      let c10 = 0, c11 = 0, c12 = 0, c13 = 0;
      let c20 = 0, c21 = 0, c22 = 0, c23 = 0;
      let c30 = 0, c31 = 0, c32 = 0, c33 = 0;
      for (let c = 0; c < k; c++) {
        const x0 = A[a0 + c];
        const x1 = A[a1 + c];
        const x2 = A[a2 + c];
        const x3 = A[a3 + c];
        const y0 = B[b0 + c];
        const y1 = B[b1 + c];
        const y2 = B[b2 + c];
        const y3 = B[b3 + c];
        c00 += x0 * y0; c01 += x0 * y1; c02 += x0 * y2; c03 += x0 * y3;
        c10 += x1 * y0; c11 += x1 * y1; c12 += x1 * y2; c13 += x1 * y3;
        c20 += x2 * y0; c21 += x2 * y1; c22 += x2 * y2; c23 += x2 * y3;
        c30 += x3 * y0; c31 += x3 * y1; c32 += x3 * y2; c33 += x3 * y3;
      }
      let o = cOff + i * ldc + j;
      C[o] -= c00; C[o + 1] -= c01; C[o + 2] -= c02; C[o + 3] -= c03;
      o += ldc;
      C[o] -= c10; C[o + 1] -= c11; C[o + 2] -= c12; C[o + 3] -= c13;
      o += ldc;
      C[o] -= c20; C[o + 1] -= c21; C[o + 2] -= c22; C[o + 3] -= c23;
      o += ldc;
      C[o] -= c30; C[o + 1] -= c31; C[o + 2] -= c32; C[o + 3] -= c33;
    }
    if (j + 2 <= qEnd) {
      const b0 = bOff + j * ldb;
      const b1 = b0 + ldb;
      let c00 = 0, c01 = 0, c10 = 0, c11 = 0, c20 = 0, c21 = 0, c30 = 0, c31 = 0;
      for (let c = 0; c < k; c++) {
        const y0 = B[b0 + c];
        const y1 = B[b1 + c];
        const x0 = A[a0 + c];
        const x1 = A[a1 + c];
        const x2 = A[a2 + c];
        const x3 = A[a3 + c];
        c00 += x0 * y0; c01 += x0 * y1;
        c10 += x1 * y0; c11 += x1 * y1;
        c20 += x2 * y0; c21 += x2 * y1;
        c30 += x3 * y0; c31 += x3 * y1;
      }
      let o = cOff + i * ldc + j;
      C[o] -= c00; C[o + 1] -= c01;
      o += ldc;
      C[o] -= c10; C[o + 1] -= c11;
      o += ldc;
      C[o] -= c20; C[o + 1] -= c21;
      o += ldc;
      C[o] -= c30; C[o + 1] -= c31;
      j += 2;
    }
    for (; j < qEnd; j++) {
      const b0 = bOff + j * ldb;
      let c0 = 0, c1 = 0, c2 = 0, c3 = 0;
      for (let c = 0; c < k; c++) {
        const y = B[b0 + c];
        c0 += A[a0 + c] * y;
        c1 += A[a1 + c] * y;
        c2 += A[a2 + c] * y;
        c3 += A[a3 + c] * y;
      }
      const o = cOff + i * ldc + j;
      C[o] -= c0;
      C[o + ldc] -= c1;
      C[o + 2 * ldc] -= c2;
      C[o + 3 * ldc] -= c3;
    }
  }
  for (; i < m; i++) {
    const qEnd = i + 1 + lower < q ? i + 1 + lower : q;
    const q4 = qEnd - (qEnd % 4);
    const a0 = aOff + i * lda;
    let j = 0;
    for (; j < q4; j += 4) {
      const b0 = bOff + j * ldb;
      const b1 = b0 + ldb;
      const b2 = b1 + ldb;
      const b3 = b2 + ldb;
      let c0 = 0, c1 = 0, c2 = 0, c3 = 0;
      for (let c = 0; c < k; c++) {
        const x = A[a0 + c];
        c0 += x * B[b0 + c];
        c1 += x * B[b1 + c];
        c2 += x * B[b2 + c];
        c3 += x * B[b3 + c];
      }
      const o = cOff + i * ldc + j;
      C[o] -= c0;
      C[o + 1] -= c1;
      C[o + 2] -= c2;
      C[o + 3] -= c3;
    }
    for (; j < qEnd; j++) {
      const b0 = bOff + j * ldb;
      let s = 0;
      for (let c = 0; c < k; c++) s += A[a0 + c] * B[b0 + c];
      C[cOff + i * ldc + j] -= s;
    }
  }
}
