/**
 * Coordinate transformation of element matrices: k_global = Tᵀ k_local T, where T is block
 * diagonal with one b × b rotation block R repeated (R's rows are the local axes written in
 * global components, so u_local = R u_global). Written with typed arrays and a module-level
 * scratch buffer: no allocation per call once `out` is given.
 */
import { ArgumentError } from '../errors';

let scratch = new Float64Array(144);

/**
 * out ← Tᵀ k T with T = blockdiag(R, …, R).
 * @param k - local matrix, n × n row-major, n = b · blocks
 * @param r - rotation block, b × b row-major (rows = local axes in global components)
 * @param b - block size (2 or 3)
 * @param blocks - number of blocks (nodes × rotation groups)
 * @param out - n × n row-major result (allocated when omitted); must not alias k
 * @returns out
 */
export function transform(k: Float64Array, r: ArrayLike<number>, b: number, blocks: number, out?: Float64Array): Float64Array {
  const n = b * blocks;
  if (k.length < n * n) throw new ArgumentError(`matrix has ${k.length} entries, fewer than ${n}×${n}; pass a full row-major matrix`, 'k');
  const o = out ?? new Float64Array(n * n);
  if (scratch.length < n * n) scratch = new Float64Array(n * n);
  const w = scratch;
  // Phase 1: w ← k T (each column block J of k times R).
  for (let i = 0; i < n; i++) {
    const row = i * n;
    for (let J = 0; J < blocks; J++) {
      const c0 = J * b;
      for (let q = 0; q < b; q++) {
        let s = 0;
        for (let p = 0; p < b; p++) s += k[row + c0 + p] * r[p * b + q];
        w[row + c0 + q] = s;
      }
    }
  }
  // Phase 2: out ← Tᵀ w (each row block I of w premultiplied by Rᵀ).
  for (let I = 0; I < blocks; I++) {
    const r0 = I * b;
    for (let q = 0; q < b; q++) {
      const orow = (r0 + q) * n;
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let p = 0; p < b; p++) s += r[p * b + q] * w[(r0 + p) * n + j];
        o[orow + j] = s;
      }
    }
  }
  return o;
}

/** Length of the vector (dx, dy, dz), m; throws ArgumentError when it is zero or not finite. */
export function memberLength(dx: number, dy: number, dz: number): number {
  const L = Math.sqrt(dx * dx + dy * dy + dz * dz);
  if (!(L > 0) || !Number.isFinite(L)) {
    throw new ArgumentError(`member vector (${dx}, ${dy}, ${dz}) has length ${L}; give two distinct nodes`, 'length');
  }
  return L;
}

/** Throws ArgumentError unless v is a finite number ≥ 0; returns v (a massless member has density 0). */
export function nonNegative(v: number, name: string): number {
  if (!(v >= 0) || !Number.isFinite(v)) throw new ArgumentError(`${name} is ${v}; it must be a finite number ≥ 0`, name);
  return v;
}

/** Throws ArgumentError unless v is a finite number > 0; returns v. */
export function positive(v: number, name: string): number {
  if (!(v > 0) || !Number.isFinite(v)) throw new ArgumentError(`${name} is ${v}; it must be a finite number > 0`, name);
  return v;
}

/**
 * out ← Tᵀ k T for a symmetric k with T = blockdiag(R, …, R) of 3 × 3 blocks: the same result
 * as `transform(k, r, 3, blocks, out)`, computing only the blocks on and below the diagonal
 * (about 60 % of the work) and mirroring the rest.
 * @param k - symmetric local matrix, n × n row-major, n = 3 · blocks
 * @param r - rotation, 3 × 3 row-major (rows = local axes in global components)
 * @param out - result, n × n row-major (allocated when omitted); must not alias k
 */
export function transformSymmetric3(k: Float64Array, r: Float64Array, blocks: number, out?: Float64Array): Float64Array {
  const n = 3 * blocks;
  const o = out ?? new Float64Array(n * n);
  const r0 = r[0], r1 = r[1], r2 = r[2], r3 = r[3], r4 = r[4], r5 = r[5], r6 = r[6], r7 = r[7], r8 = r[8];
  for (let I = 0; I < blocks; I++) {
    for (let J = 0; J <= I; J++) {
      // t = k_IJ R, row by row (p), then o = Rᵀ t.
      let t00 = 0, t01 = 0, t02 = 0, t10 = 0, t11 = 0, t12 = 0, t20 = 0, t21 = 0, t22 = 0;
      for (let p = 0; p < 3; p++) {
        const base = (3 * I + p) * n + 3 * J;
        const a = k[base], b = k[base + 1], c = k[base + 2];
        const q0 = a * r0 + b * r3 + c * r6;
        const q1 = a * r1 + b * r4 + c * r7;
        const q2 = a * r2 + b * r5 + c * r8;
        if (p === 0) { t00 = q0; t01 = q1; t02 = q2; } else if (p === 1) { t10 = q0; t11 = q1; t12 = q2; } else { t20 = q0; t21 = q1; t22 = q2; }
      }
      // o[a][q] = Σ_p r[p][a] t[p][q]
      const o00 = r0 * t00 + r3 * t10 + r6 * t20, o01 = r0 * t01 + r3 * t11 + r6 * t21, o02 = r0 * t02 + r3 * t12 + r6 * t22;
      const o10 = r1 * t00 + r4 * t10 + r7 * t20, o11 = r1 * t01 + r4 * t11 + r7 * t21, o12 = r1 * t02 + r4 * t12 + r7 * t22;
      const o20 = r2 * t00 + r5 * t10 + r8 * t20, o21 = r2 * t01 + r5 * t11 + r8 * t21, o22 = r2 * t02 + r5 * t12 + r8 * t22;
      const ri = 3 * I, cj = 3 * J;
      o[ri * n + cj] = o00; o[ri * n + cj + 1] = o01; o[ri * n + cj + 2] = o02;
      o[(ri + 1) * n + cj] = o10; o[(ri + 1) * n + cj + 1] = o11; o[(ri + 1) * n + cj + 2] = o12;
      o[(ri + 2) * n + cj] = o20; o[(ri + 2) * n + cj + 1] = o21; o[(ri + 2) * n + cj + 2] = o22;
      if (I !== J) {
        o[cj * n + ri] = o00; o[(cj + 1) * n + ri] = o01; o[(cj + 2) * n + ri] = o02;
        o[cj * n + ri + 1] = o10; o[(cj + 1) * n + ri + 1] = o11; o[(cj + 2) * n + ri + 1] = o12;
        o[cj * n + ri + 2] = o20; o[(cj + 1) * n + ri + 2] = o21; o[(cj + 2) * n + ri + 2] = o22;
      }
    }
  }
  return o;
}
