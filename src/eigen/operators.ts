/**
 * Operator adapters for the generalized symmetric problem K x = λ M x (after Spectra's operator
 * classes): M·x (or K·x) from lower-stored sparse storage, A⁻¹·x from an LDLᵀ factor of A = K − σM, and the
 * shift-invert operator (K − σM)⁻¹ M that Lanczos and subspace iteration iterate with
 * (Ericsson & Ruhe 1980, "The spectral transformation Lanczos method", Math. Comp. 35).
 *
 * Every adapter counts its applications (`applications`, one per vector) and allocates its
 * work buffers once, at construction.
 */
import type { Operator } from '../linalg/operator';
import type { LdltFactor } from '../linalg/ldlt/types';
import { symmetricMultiply, symmetricMultiplyMany, type SymmetricCsc } from '../linalg/sparse/symmetric';

/** An operator that can also act on k vectors at once, column-major n × k. */
export interface BlockOperator extends Operator {
  /** Y ← A·X for k vectors, column-major n × k; X and Y must not alias. */
  applyMany(x: Float64Array, y: Float64Array, k: number): void;
  /** Vectors the operator has been applied to so far. */
  applications: number;
}

/**
 * y ← A·x for a symmetric lower-stored sparse matrix: M·x (mass, kg and kg·m²) or K·x (stiffness).
 * @param m - A, n × n symmetric, lower-triangle CSC
 */
export function matrixOperator(m: SymmetricCsc): BlockOperator {
  const n = m.n;
  const op: BlockOperator = {
    n,
    applications: 0,
    apply(x: Float64Array, y: Float64Array): void {
      symmetricMultiply(m, x, y);
      op.applications++;
    },
    applyMany(x: Float64Array, y: Float64Array, k: number): void {
      symmetricMultiplyMany(m, x, y, k);
      op.applications += k;
    },
  };
  return op;
}

/**
 * y ← A⁻¹·x through an LDLᵀ factor of A (A = K − σM for shift-invert).
 * @param factor - numeric factor of A, n × n
 */
export function inverseOperator(factor: LdltFactor): BlockOperator {
  const op: BlockOperator = {
    n: factor.n,
    applications: 0,
    apply(x: Float64Array, y: Float64Array): void {
      factor.solve(x, y);
      op.applications++;
    },
    applyMany(x: Float64Array, y: Float64Array, k: number): void {
      factor.solveMany(x, y, k);
      op.applications += k;
    },
  };
  return op;
}

/**
 * Shift-invert operator y ← (K − σM)⁻¹ M x. Its eigenvalues are θ = 1/(λ − σ) with the
 * eigenvectors of K x = λ M x, and it is self-adjoint in the M-inner product
 * (Ericsson & Ruhe 1980, §2). One M-product buffer of length n is allocated here; `applyMany`
 * grows a block buffer on first use with a larger k and then reuses it.
 * @param factor - LDLᵀ factor of K − σM, n × n
 * @param m - mass matrix M, n × n symmetric, lower-triangle CSC
 */
export function shiftInvertOperator(factor: LdltFactor, m: SymmetricCsc): BlockOperator {
  const n = m.n;
  const mx = new Float64Array(n);
  let block = new Float64Array(0);
  const op: BlockOperator = {
    n,
    applications: 0,
    apply(x: Float64Array, y: Float64Array): void {
      symmetricMultiply(m, x, mx);
      factor.solve(mx, y);
      op.applications++;
    },
    applyMany(x: Float64Array, y: Float64Array, k: number): void {
      if (block.length < n * k) block = new Float64Array(n * k);
      symmetricMultiplyMany(m, x, block, k);
      factor.solveMany(block.subarray(0, n * k), y.subarray(0, n * k), k);
      op.applications += k;
    },
  };
  return op;
}
