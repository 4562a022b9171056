/**
 * Contracts of the sparse LDLᵀ factorization (analyse → factorize → solve, as Eigen's
 * SimplicialLDLT phases): the pattern is analysed once and reused for every shift.
 */

/** Fill-reducing orderings. `auto` tries the candidates and keeps the one with least fill. */
export type OrderingName = 'auto' | 'amd' | 'nd' | 'rcm' | 'natural';

export interface AnalyseOptions {
  /**
   * Fill-reducing ordering, by name or as an explicit permutation (perm[k] = original index
   * eliminated k-th). @defaultValue 'auto'
   */
  ordering?: OrderingName | Int32Array;
}

/** Result of the symbolic phase; depends only on the sparsity pattern. */
export interface SymbolicFactor {
  /** Dimension n. */
  readonly n: number;
  /** perm[k] = original index of the k-th eliminated row/column. */
  readonly perm: Int32Array;
  /** Ordering that produced perm. */
  readonly ordering: string;
  /** Number of nonzeros of L, strictly below the diagonal. */
  readonly nnzL: number;
  /** Floating-point operations of one numeric factorization (multiply-adds counted as 2). */
  readonly flops: number;
  /** Number of supernodes (1 per column for a simplicial factor). */
  readonly supernodes: number;
  /** Nonzeros of the pattern this analysis was made for (values passed to factorize must match). */
  readonly patternNnz: number;
  /** With `ordering: 'auto'`: every candidate ordering with its measured nnz(L) and flops. */
  readonly candidates?: ReadonlyArray<{ readonly ordering: string; readonly nnzL: number; readonly flops: number }>;
}

export interface FactorizeOptions {
  /**
   * A pivot d with |d| ≤ pivotTolerance · (max |A_jj| of the matrix) counts as zero: factorize
   * throws FactorizationError naming the row, so that a caller can move its shift.
   * @defaultValue 1e-13
   */
  pivotTolerance?: number;
}

/** Numeric LDLᵀ factor of P A Pᵀ (no pivoting beyond the fill-reducing order). */
export interface LdltFactor {
  /** Dimension n. */
  readonly n: number;
  /** Number of negative entries of D: by Sylvester's law of inertia, A's negative eigenvalues. */
  readonly negativePivots: number;
  /** Smallest |d| / max |A_jj| met, a conditioning hint. */
  readonly minPivotRatio: number;
  /** Bytes held by the factor (values of L and D, the structure it keeps, solve workspace). */
  readonly memoryBytes?: number;
  /** x ← A⁻¹ b; b and x of length n, may alias; no allocation. */
  solve(b: Float64Array, x: Float64Array): void;
  /** X ← A⁻¹ B for k right-hand sides, column-major n × k; may alias. */
  solveMany(b: Float64Array, x: Float64Array, k: number): void;
}
