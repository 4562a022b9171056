/**
 * Result types shared by every generalized symmetric eigensolver K x = λ M x.
 * Storage: mode shapes are column-major n × m Float64Arrays, mode j at [j·n, (j+1)·n).
 */

/** Names of the methods `solve` can use. */
export type EigenMethod = 'jacobi' | 'cholesky' | 'lanczos' | 'subspace';

/** Sturm-sequence verification of a result (Sylvester's law of inertia on K − σM). */
export interface SturmCheck {
  /** Shift σ (rad²/s²) at which K − σM was factorized, just above the highest returned eigenvalue. */
  readonly shift: number;
  /** Number of negative pivots of K − σM = number of eigenvalues below σ. */
  readonly countBelow: number;
  /** Number of returned eigenvalues below σ. */
  readonly returnedBelow: number;
  /** True when the counts agree (no mode was missed). */
  readonly passed: boolean;
  /**
   * Lower end of the checked interval, when the check covered a window [lowerShift, shift)
   * (modes near a target, or in a range) rather than everything below `shift`. Counts then
   * refer to that window: countBelow − countBelowLower eigenvalues lie in it.
   */
  readonly lowerShift?: number;
  /** Negative pivots of K − lowerShift·M (eigenvalues below the window). */
  readonly countBelowLower?: number;
  /**
   * Eigenvalues the solver computed and verified inside the checked interval but does not
   * return (e.g. the second copy of a pair split by `count`); passed means
   * countBelow − (countBelowLower ?? 0) = returnedBelow + (extraBelow ?? 0).
   */
  readonly extraBelow?: number;
}

/** Outcome of a generalized symmetric eigen solve. */
export interface EigenResult {
  /** Dimension n. */
  readonly n: number;
  /** Eigenvalues λ in rad²/s², ascending, length m. Infinite eigenvalues are never included. */
  readonly eigenvalues: Float64Array;
  /**
   * Mode shapes, column-major n × m, M-orthonormal (φᵢᵀ M φⱼ = δᵢⱼ). May be a view of a larger
   * buffer (the sparse iteration's): copy it (`slice()`) before transferring `vectors.buffer`.
   */
  readonly vectors: Float64Array;
  /** Per mode: ‖Kx − λMx‖ / (‖K‖ ‖x‖), ‖K‖ the 1-norm estimate used by the solver. */
  readonly residuals: Float64Array;
  /** max |ΦᵀMΦ − I| over all entries. */
  readonly orthogonalityError: number;
  /** Sturm verification, when the method performed one. */
  readonly sturm?: SturmCheck;
  /** Method that produced the result. */
  readonly method: EigenMethod;
  /** Numerical facts: iterations, operator applications, factorizations, time per phase (ms). */
  readonly stats: Readonly<Record<string, number>>;
}
