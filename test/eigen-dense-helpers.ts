/** Seeded random symmetric pairs for the dense eigensolver tests (invented data, seeded). */

/** mulberry32: small seeded generator, uniform in [0, 1). */
export function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Random SPD matrix B Bᵀ + shift·I, row-major n × n. */
export function randomSpd(n: number, rand: () => number, shift: number): Float64Array {
  const b = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) b[i] = rand() * 2 - 1;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let p = 0; p < n; p++) s += b[i * n + p] * b[j * n + p];
      a[i * n + j] = s;
      a[j * n + i] = s;
    }
    a[i * n + i] += shift;
  }
  return a;
}

/** max |a − b| / max |b|. */
export function maxRelDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let d = 0;
  let s = 0;
  for (let i = 0; i < b.length; i++) {
    d = Math.max(d, Math.abs(a[i] - b[i]));
    s = Math.max(s, Math.abs(b[i]));
  }
  return s > 0 ? d / s : d;
}
