/**
 * Static deflection by modal summation. For M-orthonormal Φ, K⁻¹ = Φ Λ⁻¹ Φᵀ (all n modes), so
 *   u_m = Σ_{j≤m} φⱼ (φⱼᵀ f) / λⱼ
 * converges to u = K⁻¹ f as m → n (Bathe, Finite Element Procedures, 1996, §9.3, mode superposition,
 * section number from memory; here for a static load). Unlike the stiffness (see reconstruction.ts), the flexibility is
 * dominated by the low modes, so the series converges quickly for smooth loads.
 *
 * Convergence is measured without K⁻¹: the compliance fᵀ u_m = Σ_{j≤m} (φⱼᵀ f)² / λⱼ grows
 * monotonically to fᵀ K⁻¹ f, and the energy norm of the error is exactly
 * ‖u − u_m‖²_K = fᵀ K⁻¹ f − fᵀ u_m (the omitted terms are K-orthogonal to u_m).
 */
import { ArgumentError } from '../errors';
import { dot, modeCount, resolveCount, type ModeSet } from './modes';

/** Options of {@link modalStatic}. */
export interface ModalStaticOptions {
  /** Modes summed, the first ones. @defaultValue all m */
  count?: number;
}

/** Outcome of a modal summation. */
export interface ModalStaticResult {
  /** u_m, length n, m (rad on rotations). */
  readonly displacement: Float64Array;
  /** Modal coordinates qⱼ = φⱼᵀ f / λⱼ, length count, kg^½·m. */
  readonly modalCoordinates: Float64Array;
  /**
   * Cumulative compliance fᵀ u_k for k = 1..count, N·m (J); increases to fᵀ K⁻¹ f, so
   * 1 − compliance[k−1] / (fᵀ K⁻¹ f) is the relative energy error of k modes.
   */
  readonly compliance: Float64Array;
}

/**
 * Static displacement u_m = Σ_{j≤m} φⱼ (φⱼᵀ f) / λⱼ under load f.
 * @param modes - M-orthonormal shapes, column-major n × m, eigenvalues λ > 0 in rad²/s²
 * @param load - f, length n, N (N·m on rotations)
 * @throws ArgumentError (path `load`) for a wrong length or a non-finite entry; (path
 *   `modes[j]`) for λⱼ ≤ 0 (a rigid-body or unstable mode: no static equilibrium, support the
 *   structure); (path `count`) for a bad count
 */
export function modalStatic(modes: ModeSet, load: Float64Array, options: ModalStaticOptions = {}): ModalStaticResult {
  const n = modes.n;
  const count = resolveCount(options.count, modeCount(modes, n));
  if (load.length !== n || !load.every((v) => Number.isFinite(v))) {
    throw new ArgumentError(`load must hold ${n} finite numbers (one per free DOF), got length ${load.length}`, 'load');
  }
  const phi = modes.vectors;
  const lambda = modes.eigenvalues;
  const displacement = new Float64Array(n);
  const modalCoordinates = new Float64Array(count);
  const compliance = new Float64Array(count);
  let c = 0;
  for (let j = 0; j < count; j++) {
    if (!(lambda[j] > 0)) {
      throw new ArgumentError(`eigenvalue ${lambda[j]} rad²/s² is not positive: a rigid-body or unstable mode has no static equilibrium; support the structure or drop the mode`, `modes[${j}]`);
    }
    const o = j * n;
    const g = dot(phi, o, load, 0, n);
    const q = g / lambda[j];
    modalCoordinates[j] = q;
    for (let i = 0; i < n; i++) displacement[i] += q * phi[o + i];
    c += g * q;
    compliance[j] = c;
  }
  return { displacement, modalCoordinates, compliance };
}
