/**
 * Eigenvalue λ (rad²/s²) → angular frequency ω (rad/s), frequency f (Hz) and period T (s).
 *
 * A rigid-body mode has λ = 0, which round-off may turn into a tiny negative number; ω is then
 * √max(λ, 0) = 0 and f = 0, numbers, never NaN (DESIGN.md, command line contract). Its period is
 * infinite: the library returns `Infinity` (a number, and the physical truth T = 1/0), and the
 * JSON report writes `null` for it, because JSON has no infinity (src/io/report-json.ts).
 */
import { ArgumentError } from '../errors';

/** Per-mode frequencies, each of length m, aligned with the eigenvalues. */
export interface Frequencies {
  /** ω = √max(λ, 0), rad/s. */
  readonly angular: Float64Array;
  /** f = ω / 2π, Hz; 0 for a rigid-body mode. */
  readonly frequency: Float64Array;
  /** T = 1 / f, s; Infinity for a rigid-body mode (f = 0). */
  readonly period: Float64Array;
}

function check(lambda: number, path: string): void {
  if (Number.isNaN(lambda) || lambda === Infinity || lambda === -Infinity) {
    throw new ArgumentError(`eigenvalue ${lambda} is not a finite number; pass the finite eigenvalues of the modes (infinite ones belong to massless DOFs and are not modes)`, path);
  }
}

/**
 * Frequency f in Hz of eigenvalue λ in rad²/s²: √max(λ, 0) / 2π.
 * @throws ArgumentError (path `eigenvalue`) when λ is NaN or infinite
 */
export function eigenvalueToFrequency(lambda: number): number {
  check(lambda, 'eigenvalue');
  return Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI);
}

/**
 * Eigenvalue λ = (2πf)² in rad²/s² of a frequency f in Hz (f ≥ 0), e.g. to turn a frequency
 * band into a shift range.
 * @throws ArgumentError (path `frequency`) when f is negative, NaN or infinite
 */
export function frequencyToEigenvalue(frequency: number): number {
  if (!(frequency >= 0) || frequency === Infinity) {
    throw new ArgumentError(`frequency ${frequency} Hz is not a finite number ≥ 0; pass a frequency in Hz`, 'frequency');
  }
  const w = 2 * Math.PI * frequency;
  return w * w;
}

/**
 * Angular frequency, frequency and period of each eigenvalue.
 * @param eigenvalues - λ in rad²/s², length m (any order; the output follows it)
 * @returns three arrays of length m
 * @throws ArgumentError (path `eigenvalues[j]`) for a NaN or infinite eigenvalue
 */
export function naturalFrequencies(eigenvalues: ArrayLike<number>): Frequencies {
  const m = eigenvalues.length;
  const angular = new Float64Array(m);
  const frequency = new Float64Array(m);
  const period = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const lambda = eigenvalues[j];
    check(lambda, `eigenvalues[${j}]`);
    const w = Math.sqrt(Math.max(lambda, 0));
    angular[j] = w;
    frequency[j] = w / (2 * Math.PI);
    period[j] = frequency[j] > 0 ? 1 / frequency[j] : Infinity;
  }
  return { angular, frequency, period };
}
