/**
 * Combination of peak modal responses: SRSS and CQC.
 *
 * SRSS: r ≈ √(Σⱼ rⱼ²) (Chopra, Dynamics of Structures, §13.7.2), good when the frequencies are
 * well separated. CQC: r ≈ √(Σᵢ Σⱼ ρᵢⱼ rᵢ rⱼ) with the correlation coefficient of
 * A. Der Kiureghian, "A response spectrum method for random vibration analysis of MDF systems",
 * Earthquake Engineering and Structural Dynamics 9 (1981) 419–435, for r = ωⱼ/ωᵢ:
 *   ρᵢⱼ = 8 √(ζᵢζⱼ) (ζᵢ + r ζⱼ) r^{3/2} / ((1 − r²)² + 4ζᵢζⱼ r (1 + r²) + 4(ζᵢ² + ζⱼ²) r²),
 * which for ζᵢ = ζⱼ = ζ is 8ζ²(1 + r) r^{3/2} / ((1 − r²)² + 4ζ² r (1 + r)²) (Chopra §13.7.3,
 * equation numbers not recalled). ρ = 1 for equal frequencies, ρ → 0 as they separate; the
 * signs of the modal responses are kept, so closely spaced modes of opposite sign cancel.
 */
import { ArgumentError } from '../errors';

/** Combination rule. */
export type CombinationRule = 'srss' | 'cqc';

/**
 * Der Kiureghian's (1981) correlation coefficient of two modes.
 * @param wi - ωᵢ, rad/s, > 0
 * @param wj - ωⱼ, rad/s, > 0
 * @param zi - ζᵢ, ≥ 0
 * @param zj - ζⱼ, ≥ 0
 * @returns ρᵢⱼ in [0, 1]; 1 when ωᵢ = ωⱼ and ζᵢ = ζⱼ; 0 when both ratios are 0 and ωᵢ ≠ ωⱼ
 */
export function cqcCorrelation(wi: number, wj: number, zi: number, zj: number): number {
  const r = wj / wi;
  if (zi === 0 && zj === 0) return r === 1 ? 1 : 0;
  const num = 8 * Math.sqrt(zi * zj) * (zi + r * zj) * r ** 1.5;
  const den = (1 - r * r) ** 2 + 4 * zi * zj * r * (1 + r * r) + 4 * (zi * zi + zj * zj) * r * r;
  return num / den;
}

/**
 * Combines the peak modal values of one response quantity.
 * @param values - rⱼ, signed peak value of each mode (any unit), length m
 * @param rule - `srss` or `cqc`
 * @param angular - ωⱼ, rad/s, length m (used by CQC)
 * @param zeta - ζⱼ, length m (used by CQC)
 * @returns the combined peak, same unit, ≥ 0
 * @throws ArgumentError (path `rule`) for an unknown rule
 */
export function combineModal(values: ArrayLike<number>, rule: CombinationRule, angular: ArrayLike<number>, zeta: ArrayLike<number>): number {
  const m = values.length;
  let s = 0;
  if (rule === 'srss') {
    for (let j = 0; j < m; j++) s += values[j] * values[j];
  } else if (rule === 'cqc') {
    for (let i = 0; i < m; i++) {
      s += values[i] * values[i];
      for (let j = i + 1; j < m; j++) s += 2 * cqcCorrelation(angular[i], angular[j], zeta[i], zeta[j]) * values[i] * values[j];
    }
  } else {
    throw new ArgumentError(`"${String(rule)}" is not a combination rule; use srss or cqc`, 'rule');
  }
  // CQC's quadratic form is positive semidefinite; round-off may leave a tiny negative.
  return Math.sqrt(Math.max(s, 0));
}

/**
 * The m × m correlation matrix (row-major), for combining many quantities with one set of
 * modes without recomputing ρ.
 */
export function correlationMatrix(rule: CombinationRule, angular: ArrayLike<number>, zeta: ArrayLike<number>): Float64Array {
  const m = angular.length;
  const rho = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    rho[i * m + i] = 1;
    if (rule === 'cqc') {
      for (let j = i + 1; j < m; j++) rho[i * m + j] = rho[j * m + i] = cqcCorrelation(angular[i], angular[j], zeta[i], zeta[j]);
    }
  }
  return rho;
}
