/**
 * Spectral reconstruction of the stiffness from the modes. For M-orthonormal Φ with
 * K Φ = M Φ Λ (all n modes), Φ⁻¹ = Φᵀ M, hence K = M Φ Λ Φᵀ M (the spectral
 * decomposition of the generalized problem; Bathe, Finite Element Procedures, 1996, ch. 10,
 * from memory). Over the first m modes, K_m = M Φ_m Λ_m Φ_mᵀ M; K − K_m is what the omitted
 * (high) modes carry, which for a stiffness is most of it: the truncation error shows why few
 * modes represent the dynamics but not the stiffness.
 */
import { ArgumentError } from '../errors';
import type { Operator } from '../linalg/operator';
import { symmetricMultiply, type SymmetricCsc } from '../linalg/sparse/symmetric';
import { dot, modeCount, resolveCount, type ModeSet } from './modes';

/**
 * The operator y ← M Φ_m Λ_m Φ_mᵀ M x, applied without forming an n × n matrix: two products
 * with M and 2·m dot products/updates of length n per application, no allocation.
 * @param mass - M, n × n symmetric, kg (kg·m² on rotations)
 * @param modes - M-orthonormal shapes, column-major n × m, eigenvalues λ in rad²/s²
 * @param options - `count`: modes used, the first ones @defaultValue all m
 * @returns an operator of dimension n; equals K (N/m) when all n modes are used
 * @throws ArgumentError (path `modes`, `count`) for inconsistent sizes or a bad count
 */
export function spectralStiffness(mass: SymmetricCsc, modes: ModeSet, options: { count?: number } = {}): Operator {
  const n = mass.n;
  const m = resolveCount(options.count, modeCount(modes, n));
  const phi = modes.vectors;
  const lambda = modes.eigenvalues;
  const t = new Float64Array(n);
  const s = new Float64Array(n);
  return {
    n,
    apply(x: Float64Array, y: Float64Array): void {
      symmetricMultiply(mass, x, t);
      s.fill(0);
      for (let j = 0; j < m; j++) {
        const o = j * n;
        const c = lambda[j] * dot(phi, o, t, 0, n);
        for (let i = 0; i < n; i++) s[i] += c * phi[o + i];
      }
      symmetricMultiply(mass, s, y);
    },
  };
}

/** How {@link truncationError} evaluates ‖K − K_m‖_F. */
export type TruncationMethod = 'auto' | 'columns' | 'trace';

/** Options of {@link truncationError}. */
export interface TruncationOptions {
  /** Modes kept, the first ones. @defaultValue all m */
  count?: number;
  /**
   * `columns`: forms K − K_m one column at a time, O(n²·m) work, O(n) extra memory, accurate
   * to round-off. `trace`: ‖K − K_m‖² = ‖K‖² − 2 Σⱼ λⱼ bⱼᵀ K bⱼ + Σⱼₖ λⱼ λₖ (bⱼᵀ bₖ)² with
   * B = M Φ_m, O(nnz·m + n·m²) work, but its subtraction loses accuracy below a relative error
   * of about 1e-7. `auto`: `columns` when n²·m ≤ {@link TRUNCATION_COLUMNS_BUDGET}.
   * @defaultValue 'auto'
   */
  method?: TruncationMethod;
}

/** Defaults of {@link TruncationOptions} (count: all modes). */
export const TRUNCATION_DEFAULTS = { method: 'auto' } as const;

/** Largest n²·m for which `auto` uses the column-by-column method. */
export const TRUNCATION_COLUMNS_BUDGET = 2e8;

/**
 * Relative Frobenius error ‖K − M Φ_m Λ_m Φ_mᵀ M‖_F / ‖K‖_F of the spectral reconstruction
 * over the first m modes. Dimensionless; 0 (to round-off) with all n modes.
 * @param stiffness - K, n × n symmetric, N/m (N·m/rad on rotations)
 * @param mass - M, n × n symmetric, kg (kg·m² on rotations)
 * @param modes - M-orthonormal shapes, column-major n × m, eigenvalues in rad²/s²
 * @throws ArgumentError (path `mass`) when K and M differ in size; (path `method`) for an
 *   unknown method; as {@link spectralStiffness}
 */
export function truncationError(stiffness: SymmetricCsc, mass: SymmetricCsc, modes: ModeSet, options: TruncationOptions = {}): number {
  const opts = { ...TRUNCATION_DEFAULTS, ...options };
  const n = stiffness.n;
  if (mass.n !== n) throw new ArgumentError(`M is ${mass.n} × ${mass.n} but K is ${n} × ${n}; pass K and M of one model`, 'mass');
  const m = resolveCount(opts.count, modeCount(modes, n));
  if (opts.method !== 'auto' && opts.method !== 'columns' && opts.method !== 'trace') {
    throw new ArgumentError(`method "${String(opts.method)}" is unknown; use "auto", "columns" or "trace"`, 'method');
  }
  const method = opts.method === 'auto' ? (n * n * m <= TRUNCATION_COLUMNS_BUDGET ? 'columns' : 'trace') : opts.method;
  const { colPtr, rowIdx, values } = stiffness;
  let k2 = 0;
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) k2 += (rowIdx[p] === j ? 1 : 2) * values[p] * values[p];
  }
  if (k2 === 0) return 0;
  // B = M Φ_m, column-major n × m.
  const B = new Float64Array(n * m);
  for (let j = 0; j < m; j++) symmetricMultiply(mass, modes.vectors.subarray(j * n, (j + 1) * n), B.subarray(j * n, (j + 1) * n));
  const lambda = modes.eigenvalues;
  let e2: number;
  if (method === 'columns') {
    // Upper part of each column = lower rows of the same index: transpose the lower storage.
    const tPtr = new Int32Array(n + 1);
    for (let p = 0; p < colPtr[n]; p++) tPtr[rowIdx[p] + 1]++;
    for (let i = 0; i < n; i++) tPtr[i + 1] += tPtr[i];
    const tCol = new Int32Array(colPtr[n]);
    const tVal = new Float64Array(colPtr[n]);
    const next = tPtr.slice(0, n);
    for (let j = 0; j < n; j++) {
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        const q = next[rowIdx[p]]++;
        tCol[q] = j;
        tVal[q] = values[p];
      }
    }
    const d = new Float64Array(n);
    const w = new Float64Array(m);
    e2 = 0;
    for (let c = 0; c < n; c++) {
      // d = K e_c (full column c) − B Λ (row c of B)ᵀ
      for (let p = colPtr[c]; p < colPtr[c + 1]; p++) d[rowIdx[p]] = values[p];
      for (let p = tPtr[c]; p < tPtr[c + 1]; p++) if (tCol[p] !== c) d[tCol[p]] = tVal[p];
      for (let j = 0; j < m; j++) w[j] = lambda[j] * B[j * n + c];
      for (let j = 0; j < m; j++) {
        const wj = w[j];
        const o = j * n;
        for (let i = 0; i < n; i++) d[i] -= wj * B[o + i];
      }
      for (let i = 0; i < n; i++) {
        e2 += d[i] * d[i];
        d[i] = 0;
      }
    }
  } else {
    const kb = new Float64Array(n);
    let cross = 0;
    for (let j = 0; j < m; j++) {
      const bj = B.subarray(j * n, (j + 1) * n);
      symmetricMultiply(stiffness, bj, kb);
      cross += lambda[j] * dot(bj, 0, kb, 0, n);
    }
    let km2 = 0;
    for (let j = 0; j < m; j++) {
      for (let k = 0; k < m; k++) {
        const g = dot(B, j * n, B, k * n, n);
        km2 += lambda[j] * lambda[k] * g * g;
      }
    }
    e2 = Math.max(0, k2 - 2 * cross + km2);
  }
  return Math.sqrt(e2 / k2);
}
