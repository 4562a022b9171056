/**
 * Dense kernels over a column-major basis (n rows, column c at [c·n, (c+1)·n)), used by the
 * Lanczos reorthogonalization and the Rayleigh–Ritz steps. Four columns are processed per
 * pass so that each load of the vector serves four dot products or updates (a level-2 BLAS
 * blocking, as in GEMV). None of these allocates.
 */

/**
 * h[c − c0] ← V[:, c]ᵀ w for c in [c0, c1).
 * @param v - basis, column-major n × (≥ c1)
 * @param n - rows
 * @param w - vector, length n
 * @param h - output, length ≥ c1 − c0
 */
export function dotColumns(v: Float64Array, n: number, c0: number, c1: number, w: Float64Array, h: Float64Array): void {
  let c = c0;
  for (; c + 4 <= c1; c += 4) {
    const o0 = c * n;
    const o1 = o0 + n;
    const o2 = o1 + n;
    const o3 = o2 + n;
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let i = 0; i < n; i++) {
      const wi = w[i];
      s0 += v[o0 + i] * wi;
      s1 += v[o1 + i] * wi;
      s2 += v[o2 + i] * wi;
      s3 += v[o3 + i] * wi;
    }
    h[c - c0] = s0;
    h[c - c0 + 1] = s1;
    h[c - c0 + 2] = s2;
    h[c - c0 + 3] = s3;
  }
  for (; c < c1; c++) {
    const o = c * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += v[o + i] * w[i];
    h[c - c0] = s;
  }
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
  for (; c + 4 <= c1; c += 4) {
    const o0 = c * n;
    const o1 = o0 + n;
    const o2 = o1 + n;
    const o3 = o2 + n;
    const h0 = h[c - c0];
    const h1 = h[c - c0 + 1];
    const h2 = h[c - c0 + 2];
    const h3 = h[c - c0 + 3];
    for (let i = 0; i < n; i++) {
      w[i] -= v[o0 + i] * h0 + v[o1 + i] * h1 + v[o2 + i] * h2 + v[o3 + i] * h3;
    }
  }
  for (; c < c1; c++) {
    const o = c * n;
    const hc = h[c - c0];
    if (hc === 0) continue;
    for (let i = 0; i < n; i++) w[i] -= v[o + i] * hc;
  }
}

/**
 * In place: V[:, c0 .. c0+k) ← V[:, c0 .. c0+m) · S, S an m × k column-major matrix (leading
 * dimension ldS), k ≤ m. Rows are processed in blocks copied to `tmp` first, so the result may
 * overwrite its own input.
 * @param v - basis, column-major n × (≥ c0 + m)
 * @param tmp - work buffer of length ≥ m · rowBlock (rowBlock = ⌊tmp.length / m⌋, at least 1)
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
    const r1 = Math.min(n, r0 + rb);
    const b = r1 - r0;
    // Gather the row block of the m input columns, column-major b × m.
    for (let i = 0; i < m; i++) {
      const src = (c0 + i) * n + r0;
      const dst = i * b;
      for (let r = 0; r < b; r++) tmp[dst + r] = v[src + r];
    }
    for (let c = 0; c < k; c++) {
      const out = (c0 + c) * n + r0;
      const sc = c * ldS;
      // Four input columns per pass: one load/store of the output serves four multiply-adds.
      let i = 0;
      if (m >= 4) {
        const s0 = s[sc];
        const s1 = s[sc + 1];
        const s2 = s[sc + 2];
        const s3 = s[sc + 3];
        for (let r = 0; r < b; r++) v[out + r] = tmp[r] * s0 + tmp[b + r] * s1 + tmp[2 * b + r] * s2 + tmp[3 * b + r] * s3;
        i = 4;
      } else {
        for (let r = 0; r < b; r++) v[out + r] = 0;
      }
      for (; i + 4 <= m; i += 4) {
        const s0 = s[sc + i];
        const s1 = s[sc + i + 1];
        const s2 = s[sc + i + 2];
        const s3 = s[sc + i + 3];
        const t0 = i * b;
        const t1 = t0 + b;
        const t2 = t1 + b;
        const t3 = t2 + b;
        for (let r = 0; r < b; r++) v[out + r] += tmp[t0 + r] * s0 + tmp[t1 + r] * s1 + tmp[t2 + r] * s2 + tmp[t3 + r] * s3;
      }
      for (; i < m; i++) {
        const si = s[sc + i];
        const t0 = i * b;
        for (let r = 0; r < b; r++) v[out + r] += tmp[t0 + r] * si;
      }
    }
  }
}

/**
 * G ← Xᵀ Y for column-major X (n × p) and Y (n × q); G is p × q column-major.
 */
export function gram(x: Float64Array, y: Float64Array, n: number, p: number, q: number, g: Float64Array): void {
  for (let j = 0; j < q; j++) dotColumns(x, n, 0, p, y.subarray(j * n, (j + 1) * n), g.subarray(j * p, (j + 1) * p));
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
