/**
 * Test matrices for the sparse eigensolver tests. Random pairs are invented test data (seeded);
 * the spring-mass chains are the textbook systems whose eigenvalues are known in closed form.
 */
import { Matrix } from 'ml-matrix';
import { CooBuilder, toDenseArray, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { mulberry32 as rng } from '../src/linalg/random';

/** Seeded uniform generator on [0, 1), so every run sees the same data. */
export { rng };


/**
 * Spring-mass chain: n equal masses m (kg) joined by springs k (N/m).
 * `fixed-free`: a spring ties mass 0 to the ground, the last mass is free (n springs).
 * `free-free`: no ground spring (n − 1 springs), one rigid-body mode.
 */
export function springChain(n: number, k: number, m: number, ends: 'fixed-free' | 'free-free'): { K: SymmetricCsc; M: SymmetricCsc } {
  const kb = new CooBuilder(n, 3 * n);
  const mb = new CooBuilder(n, n);
  for (let i = 0; i < n; i++) mb.add(i, i, m);
  if (ends === 'fixed-free') kb.add(0, 0, k);
  for (let i = 0; i + 1 < n; i++) {
    kb.add(i, i, k);
    kb.add(i + 1, i + 1, k);
    kb.add(i + 1, i, -k);
  }
  if (n === 1 && ends === 'free-free') kb.add(0, 0, 0);
  return { K: kb.toCsc(), M: mb.toCsc() };
}

/**
 * Random sparse symmetric positive definite pair (invented test data): about `perRow`
 * off-diagonal entries per row at random positions; diagonals dominate so both are SPD.
 * M has its own, sparser random pattern.
 */
export function randomSparsePair(n: number, perRow: number, seed: number): { K: SymmetricCsc; M: SymmetricCsc } {
  const r = rng(seed);
  const kb = new CooBuilder(n, n * (perRow + 1));
  const mb = new CooBuilder(n, n * 3);
  const kd = new Float64Array(n);
  const md = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let t = 0; t < perRow / 2; t++) {
      const j = Math.floor(r() * n);
      if (j === i) continue;
      const v = r() - 0.5;
      kb.add(i, j, v);
      kd[i] += Math.abs(v);
      kd[j] += Math.abs(v);
    }
    if (r() < 0.5) {
      const j = Math.floor(r() * n);
      if (j !== i) {
        const v = 0.1 * (r() - 0.5);
        mb.add(i, j, v);
        md[i] += Math.abs(v);
        md[j] += Math.abs(v);
      }
    }
  }
  for (let i = 0; i < n; i++) {
    kb.add(i, i, kd[i] + 0.01 + r());
    mb.add(i, i, md[i] + 0.5 + r());
  }
  return { K: kb.toCsc(), M: mb.toCsc() };
}

/**
 * Banded SPD pair (invented test data): K has half-bandwidth `bw` with a dominant diagonal that
 * grows along the band (like a tapering member), M is tridiagonal, consistent-mass-like.
 */
export function bandedPair(n: number, bw: number, seed: number): { K: SymmetricCsc; M: SymmetricCsc } {
  const r = rng(seed);
  const kb = new CooBuilder(n, n * (bw + 1));
  const mb = new CooBuilder(n, n * 2);
  const kd = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let d = 1; d <= bw && i + d < n; d++) {
      const v = -(r() + 0.1) / d;
      kb.add(i + d, i, v);
      kd[i] += Math.abs(v);
      kd[i + d] += Math.abs(v);
    }
  }
  for (let i = 0; i < n; i++) {
    kb.add(i, i, kd[i] * (1 + 0.001 * (i + 1)) + 1e-3);
    mb.add(i, i, 4 / 6 + 0.1 * r());
    if (i + 1 < n) mb.add(i + 1, i, 1 / 6);
  }
  return { K: kb.toCsc(), M: mb.toCsc() };
}

/** Block-diagonal pair diag(A, A) of a pair with itself: every eigenvalue appears twice. */
export function twinBlocks(a: { K: SymmetricCsc; M: SymmetricCsc }): { K: SymmetricCsc; M: SymmetricCsc } {
  const n = a.K.n;
  const twice = (s: SymmetricCsc): SymmetricCsc => {
    const b = new CooBuilder(2 * n, 2 * s.colPtr[n]);
    for (let off = 0; off <= n; off += n) {
      for (let j = 0; j < n; j++) for (let p = s.colPtr[j]; p < s.colPtr[j + 1]; p++) b.add(s.rowIdx[p] + off, j + off, s.values[p]);
    }
    return b.toCsc();
  };
  return { K: twice(a.K), M: twice(a.M) };
}

/** ml-matrix Matrix of a SymmetricCsc (for the dense reference route). */
export function toMatrix(a: SymmetricCsc): Matrix {
  const n = a.n;
  const d = toDenseArray(a);
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) rows.push(Array.from(d.subarray(i * n, (i + 1) * n)));
  return new Matrix(rows);
}

/** Largest relative difference |a − b| / max(|b|, floor). */
export function maxRelDiff(a: ArrayLike<number>, b: ArrayLike<number>, floor = 0): number {
  let w = 0;
  for (let i = 0; i < a.length; i++) w = Math.max(w, Math.abs(a[i] - b[i]) / Math.max(Math.abs(b[i]), floor));
  return w;
}
