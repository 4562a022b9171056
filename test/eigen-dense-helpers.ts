/** Seeded random symmetric pairs for the dense eigensolver tests (invented data, seeded). */
import { mulberry32 as seeded } from '../src/linalg/random';

/** Seeded uniform generator on [0, 1) (mulberry32). */
export { seeded };


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
