/**
 * A linear operator y ← A·x on vectors of length n. Solvers see this interface and never ask
 * how a matrix is stored (after Spectra's operator classes).
 */
export interface Operator {
  /** Dimension n. */
  readonly n: number;
  /** y ← A·x; x and y have length n and must not alias. */
  apply(x: Float64Array, y: Float64Array): void;
}
