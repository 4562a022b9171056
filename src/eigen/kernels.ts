/**
 * Dense kernels over a column-major basis (n rows, column c at [c·n, (c+1)·n)), used by the
 * Lanczos reorthogonalization and the Rayleigh–Ritz steps. Eight or four columns are processed
 * per pass so that each load of the vector serves several dot products or updates (a level-2
 * BLAS blocking, as in GEMV). None of these allocates.
 *
 * Cold start: the loops of the Lanczos path (products, subtractions, the restart's combination,
 * the residual sums) each sit in a function of their own that ends with that loop (each column
 * width or block shape its own function). V8 compiles a loop that is still running on its own
 * (on-stack replacement); code after it that had not yet run has no type feedback, so the
 * compiled loop is dropped when it reaches that code, and the next calls re-enter the same
 * compiled loop and drop it again. Measured on the 83,784-DOF footbridge's first solve in a
 * process: 26 such exits in the restart's combination and 25 in the factor's solve, whose
 * remaining rows then ran in the interpreter; with the loops split out, none, and the Gram–
 * Schmidt products and subtractions of the first ten Lanczos steps took 25–27 ms instead of
 * 62–67 (two fresh processes each; 8–9 ms once the code is compiled).
 */

/**
 * xᵀ y over the first n entries.
 */
export function dot(x: Float64Array, y: Float64Array, n: number): number {
  let s0 = 0;
  let s1 = 0;
  let i = 0;
  for (; i + 2 <= n; i += 2) {
    s0 += x[i] * y[i];
    s1 += x[i + 1] * y[i + 1];
  }
  if (i < n) s0 += x[i] * y[i];
  return s0 + s1;
}

/**
 * y ← y + a·x over the first n entries.
 */
export function axpy(y: Float64Array, x: Float64Array, a: number, n: number): void {
  for (let i = 0; i < n; i++) y[i] += a * x[i];
}

/**
 * y ← y + a1·x1 + a2·x2 over the first n entries (one pass: the three-term step of Lanczos).
 */
export function axpy2(y: Float64Array, x1: Float64Array, a1: number, x2: Float64Array, a2: number, n: number): void {
  for (let i = 0; i < n; i++) y[i] += a1 * x1[i] + a2 * x2[i];
}

/**
 * x ← a·x and y ← a·y over the first n entries, in one pass.
 */
export function scaleBoth(x: Float64Array, y: Float64Array, a: number, n: number): void {
  for (let i = 0; i < n; i++) {
    x[i] *= a;
    y[i] *= a;
  }
}

/**
 * y ← a·x over the first n entries (y may be x).
 */
export function scaleInto(y: Float64Array, x: Float64Array, a: number, n: number): void {
  for (let i = 0; i < n; i++) y[i] = a * x[i];
}

/**
 * sums[0] ← ‖a − λ·b‖², sums[1] ← ‖x‖² over the first n entries, in one pass (a mode's residual
 * K x − λ M x, or an operator residual y − θ x with b = x).
 */
export function residualSquares(a: Float64Array, b: Float64Array, x: Float64Array, lam: number, n: number, sums: Float64Array): void {
  let r2 = 0;
  let x2 = 0;
  for (let i = 0; i < n; i++) {
    const r = a[i] - lam * b[i];
    r2 += r * r;
    x2 += x[i] * x[i];
  }
  sums[0] = r2;
  sums[1] = x2;
}

/**
 * h[c − c0] ← V[:, c]ᵀ w for c in [c0, c1).
 * @param v - basis, column-major n × (≥ c1)
 * @param n - rows
 * @param w - vector, length n
 * @param h - output, length ≥ c1 − c0
 */
export function dotColumns(v: Float64Array, n: number, c0: number, c1: number, w: Float64Array, h: Float64Array): void {
  let c = c0;
  // Eight columns per pass over w, then four, then one: the basis is read once either way, w
  // fewer times (measured 14 % faster at n ≈ 84,000 and 32 columns). Each width is a function
  // of its own (see the cold-start note above).
  for (; c + 8 <= c1; c += 8) dot8(v, n, c * n, w, h, c - c0);
  for (; c + 4 <= c1; c += 4) dot4(v, n, c * n, w, h, c - c0);
  for (; c < c1; c++) h[c - c0] = dot1(v, n, c * n, w);
}

/** h[q .. q+8) ← the products of w with the eight columns of v from offset o, one pass over w. */
function dot8(v: Float64Array, n: number, o: number, w: Float64Array, h: Float64Array, q: number): void {
  const o1 = o + n;
  const o2 = o1 + n;
  const o3 = o2 + n;
  const o4 = o3 + n;
  const o5 = o4 + n;
  const o6 = o5 + n;
  const o7 = o6 + n;
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  let s5 = 0;
  let s6 = 0;
  let s7 = 0;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    s0 += v[o + i] * wi;
    s1 += v[o1 + i] * wi;
    s2 += v[o2 + i] * wi;
    s3 += v[o3 + i] * wi;
    s4 += v[o4 + i] * wi;
    s5 += v[o5 + i] * wi;
    s6 += v[o6 + i] * wi;
    s7 += v[o7 + i] * wi;
  }
  h[q] = s0;
  h[q + 1] = s1;
  h[q + 2] = s2;
  h[q + 3] = s3;
  h[q + 4] = s4;
  h[q + 5] = s5;
  h[q + 6] = s6;
  h[q + 7] = s7;
}

/** h[q .. q+4) ← the products of w with the four columns of v from offset o, one pass over w. */
function dot4(v: Float64Array, n: number, o: number, w: Float64Array, h: Float64Array, q: number): void {
  const o1 = o + n;
  const o2 = o1 + n;
  const o3 = o2 + n;
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    s0 += v[o + i] * wi;
    s1 += v[o1 + i] * wi;
    s2 += v[o2 + i] * wi;
    s3 += v[o3 + i] * wi;
  }
  h[q] = s0;
  h[q + 1] = s1;
  h[q + 2] = s2;
  h[q + 3] = s3;
}

/** The product of w with the column of v from offset o. */
function dot1(v: Float64Array, n: number, o: number, w: Float64Array): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += v[o + i] * w[i];
  return s;
}

/**
 * w ← w − Σ_c V[:, c] · h[c − c0] for c in [c0, c1).
 * @param v - basis, column-major n × (≥ c1)
 * @param n - rows
 * @param h - coefficients, length ≥ c1 − c0
 * @param w - vector updated in place, length n
 */
export function subtractColumns(v: Float64Array, n: number, c0: number, c1: number, h: Float64Array, w: Float64Array): void {
  let c = c0;
  // Eight columns per pass over w, then four, then one (see dotColumns).
  for (; c + 8 <= c1; c += 8) subtract8(v, n, c * n, h, c - c0, w);
  for (; c + 4 <= c1; c += 4) subtract4(v, n, c * n, h, c - c0, w);
  for (; c < c1; c++) {
    const hc = h[c - c0];
    if (hc !== 0) subtract1(v, n, c * n, hc, w);
  }
}

/** w ← w − Σ_{p<8} V[:, p] · h[q + p] over the eight columns of v from offset o, one pass. */
function subtract8(v: Float64Array, n: number, o: number, h: Float64Array, q: number, w: Float64Array): void {
  const o1 = o + n;
  const o2 = o1 + n;
  const o3 = o2 + n;
  const o4 = o3 + n;
  const o5 = o4 + n;
  const o6 = o5 + n;
  const o7 = o6 + n;
  const h0 = h[q];
  const h1 = h[q + 1];
  const h2 = h[q + 2];
  const h3 = h[q + 3];
  const h4 = h[q + 4];
  const h5 = h[q + 5];
  const h6 = h[q + 6];
  const h7 = h[q + 7];
  for (let i = 0; i < n; i++) {
    w[i] -= v[o + i] * h0 + v[o1 + i] * h1 + v[o2 + i] * h2 + v[o3 + i] * h3 + (v[o4 + i] * h4 + v[o5 + i] * h5 + v[o6 + i] * h6 + v[o7 + i] * h7);
  }
}

/** w ← w − Σ_{p<4} V[:, p] · h[q + p] over the four columns of v from offset o, one pass. */
function subtract4(v: Float64Array, n: number, o: number, h: Float64Array, q: number, w: Float64Array): void {
  const o1 = o + n;
  const o2 = o1 + n;
  const o3 = o2 + n;
  const h0 = h[q];
  const h1 = h[q + 1];
  const h2 = h[q + 2];
  const h3 = h[q + 3];
  for (let i = 0; i < n; i++) {
    w[i] -= v[o + i] * h0 + v[o1 + i] * h1 + v[o2 + i] * h2 + v[o3 + i] * h3;
  }
}

/** w ← w − a · (the column of v from offset o). */
function subtract1(v: Float64Array, n: number, o: number, a: number, w: Float64Array): void {
  for (let i = 0; i < n; i++) w[i] -= v[o + i] * a;
}

/**
 * In place: V[:, c0 .. c0+k) ← V[:, c0 .. c0+m) · S, S an m × k column-major matrix (leading
 * dimension ldS), k ≤ m. Rows are processed in blocks copied (transposed, row-major) to `tmp`
 * first, so the result may overwrite its own input; each block is then written by 3 × 3 register
 * blocks (nine sums and six loaded values fit the sixteen floating-point registers of x86-64,
 * where a 4 × 4 block spills: measured up to 25 % faster than the factor's product for n ≈ 84,000,
 * m = 41, k = 30). Every output is one sequential sum over the m inputs.
 * @param v - basis, column-major n × (≥ c0 + m)
 * @param tmp - work buffer of length ≥ m · rowBlock (rowBlock = ⌊tmp.length / m⌋, at least 1;
 *   256 rows measured fastest at n ≈ 84,000, m = 41)
 */
export function combineColumnsInPlace(
  v: Float64Array,
  n: number,
  c0: number,
  m: number,
  s: Float64Array,
  ldS: number,
  k: number,
  tmp: Float64Array,
): void {
  const rb = Math.max(1, Math.floor(tmp.length / m));
  for (let r0 = 0; r0 < n; r0 += rb) {
    const b = Math.min(n, r0 + rb) - r0;
    gatherRowBlock(v, n, c0, m, r0, b, tmp);
    combineBlock(v, c0 * n + r0, n, b, m, s, ldS, k, tmp);
  }
}

/** t ← rows r0 .. r0+b of the m columns of v from column c0, row-major b × m. */
function gatherRowBlock(v: Float64Array, n: number, c0: number, m: number, r0: number, b: number, t: Float64Array): void {
  for (let i = 0; i < m; i++) {
    const src = (c0 + i) * n + r0;
    for (let r = 0; r < b; r++) t[r * m + i] = v[src + r];
  }
}

/** out[c·n + r] ← Σₚ t[r·m + p] · S[c·ldS + p] for r < b, c < k (out from offset o). */
function combineBlock(out: Float64Array, o: number, n: number, b: number, m: number, s: Float64Array, ldS: number, k: number, t: Float64Array): void {
  // Three output columns at a time, then one; each shape is a function of its own (see the
  // cold-start note above).
  const b3 = b - (b % 3);
  let c = 0;
  for (; c + 3 <= k; c += 3) {
    combineThree(out, o + c * n, n, b3, m, s, c * ldS, ldS, t);
    for (let r = b3; r < b; r++) combineThreeRow(out, o + c * n, n, r, m, s, c * ldS, ldS, t);
  }
  for (; c < k; c++) combineOne(out, o + c * n, b, m, s, c * ldS, t);
}

/**
 * Columns o, o + n, o + 2n of out ← rows [0, b3) of t times S's columns from s0 (stride ldS),
 * b3 a multiple of 3.
 */
function combineThree(out: Float64Array, o0: number, n: number, b3: number, m: number, s: Float64Array, s0: number, ldS: number, t: Float64Array): void {
  const s1 = s0 + ldS;
  const s2 = s1 + ldS;
  const o1 = o0 + n;
  const o2 = o1 + n;
  for (let r = 0; r < b3; r += 3) {
    const t0 = r * m;
    const t1 = t0 + m;
    const t2 = t1 + m;
    let a00 = 0, a10 = 0, a20 = 0;
    let a01 = 0, a11 = 0, a21 = 0;
    let a02 = 0, a12 = 0, a22 = 0;
    for (let p = 0; p < m; p++) {
      const x0 = s[s0 + p];
      const x1 = s[s1 + p];
      const x2 = s[s2 + p];
      const y0 = t[t0 + p];
      const y1 = t[t1 + p];
      const y2 = t[t2 + p];
      a00 += y0 * x0; a10 += y1 * x0; a20 += y2 * x0;
      a01 += y0 * x1; a11 += y1 * x1; a21 += y2 * x1;
      a02 += y0 * x2; a12 += y1 * x2; a22 += y2 * x2;
    }
    out[o0 + r] = a00; out[o0 + r + 1] = a10; out[o0 + r + 2] = a20;
    out[o1 + r] = a01; out[o1 + r + 1] = a11; out[o1 + r + 2] = a21;
    out[o2 + r] = a02; out[o2 + r + 1] = a12; out[o2 + r + 2] = a22;
  }
}

/** Row r of combineThree's three output columns. */
function combineThreeRow(out: Float64Array, o0: number, n: number, r: number, m: number, s: Float64Array, s0: number, ldS: number, t: Float64Array): void {
  const s1 = s0 + ldS;
  const s2 = s1 + ldS;
  const t0 = r * m;
  let a0 = 0, a1 = 0, a2 = 0;
  for (let p = 0; p < m; p++) {
    const y = t[t0 + p];
    a0 += y * s[s0 + p];
    a1 += y * s[s1 + p];
    a2 += y * s[s2 + p];
  }
  out[o0 + r] = a0;
  out[o0 + n + r] = a1;
  out[o0 + 2 * n + r] = a2;
}

/** Column o of out ← rows [0, b) of t times S's column from s0. */
function combineOne(out: Float64Array, o0: number, b: number, m: number, s: Float64Array, s0: number, t: Float64Array): void {
  for (let r = 0; r < b; r++) {
    const t0 = r * m;
    let a = 0;
    for (let p = 0; p < m; p++) a += t[t0 + p] * s[s0 + p];
    out[o0 + r] = a;
  }
}

/**
 * G ← Xᵀ Y for column-major X (n × p) and Y (n × q); G is p × q column-major.
 */
export function gram(x: Float64Array, y: Float64Array, n: number, p: number, q: number, g: Float64Array): void {
  // 4 × 2 register blocks: each pass reads six columns for eight entries of G (dotColumns reads
  // five for four). Every entry is still one sequential sum over the rows, so the bits equal
  // those of dotColumns column by column.
  let j = 0;
  for (; j + 2 <= q; j += 2) {
    const y0 = j * n;
    const y1 = y0 + n;
    let i = 0;
    for (; i + 4 <= p; i += 4) {
      const x0 = i * n;
      const x1 = x0 + n;
      const x2 = x1 + n;
      const x3 = x2 + n;
      let s00 = 0, s10 = 0, s20 = 0, s30 = 0;
      let s01 = 0, s11 = 0, s21 = 0, s31 = 0;
      for (let r = 0; r < n; r++) {
        const a = y[y0 + r];
        const b = y[y1 + r];
        const v0 = x[x0 + r];
        const v1 = x[x1 + r];
        const v2 = x[x2 + r];
        const v3 = x[x3 + r];
        s00 += v0 * a;
        s10 += v1 * a;
        s20 += v2 * a;
        s30 += v3 * a;
        s01 += v0 * b;
        s11 += v1 * b;
        s21 += v2 * b;
        s31 += v3 * b;
      }
      const g0 = j * p + i;
      const g1 = g0 + p;
      g[g0] = s00;
      g[g0 + 1] = s10;
      g[g0 + 2] = s20;
      g[g0 + 3] = s30;
      g[g1] = s01;
      g[g1 + 1] = s11;
      g[g1 + 2] = s21;
      g[g1 + 3] = s31;
    }
    for (; i < p; i++) {
      const x0 = i * n;
      let s0 = 0;
      let s1 = 0;
      for (let r = 0; r < n; r++) {
        s0 += x[x0 + r] * y[y0 + r];
        s1 += x[x0 + r] * y[y1 + r];
      }
      g[j * p + i] = s0;
      g[(j + 1) * p + i] = s1;
    }
  }
  for (; j < q; j++) dotColumns(x, n, 0, p, y.subarray(j * n, (j + 1) * n), g.subarray(j * p, (j + 1) * p));
}

/**
 * Seeded generator of uniform doubles in [−0.5, 0.5): splitmix32, a Weyl sequence with the
 * murmur3 finalizer (after Steele, Lea & Flood 2014, "Fast splittable pseudorandom number
 * generators", OOPSLA). Same seed, same sequence, on every platform.
 */
export class SeededRandom {
  private state: number;
  constructor(seed: number) {
    this.state = (Math.trunc(seed) ^ 0x5bd1e995) | 0;
  }
  /** Next value in [−0.5, 0.5), 32 random bits. */
  next(): number {
    this.state = (this.state + 0x9e3779b9) | 0;
    let z = this.state;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    z ^= z >>> 16;
    return (z >>> 0) / 4294967296 - 0.5;
  }
  /** Fills v with values in [−0.5, 0.5). */
  fill(v: Float64Array): void {
    for (let i = 0; i < v.length; i++) v[i] = this.next();
  }
}
