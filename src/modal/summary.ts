/**
 * Turns an eigen result of an assembled model into the `ModalAnalysis` the reports consume
 * (analysis-types.ts): frequencies, participation per direction, the solver's verification.
 * No solving here, so a `modalAnalysis(model, options)` is `summariseModes(assemble(model),
 * solve(K, M, options), options)`.
 */
import type { EigenResult } from '../eigen/types';
import type { AssembledModel, DofName } from '../model/types';
import type { ModalAnalysis, ModeSummary } from './analysis-types';
import { naturalFrequencies } from './frequencies';
import { orientModes } from './normalise';
import { participation, type ParticipationOptions } from './participation';

/**
 * Summary of each mode of an assembled model.
 * The shapes are turned to the sign convention of {@link orientModes} (largest component
 * positive), which changes neither residuals nor M-orthonormality; the returned `eigen` carries
 * the turned copy, the argument is not modified.
 * @param assembled - the model (free DOFs, K, M, coordinates)
 * @param eigen - its modes, M-orthonormal, eigenvalues ascending (rad²/s²)
 * @param options - reference point (default the centre of mass) and directions (default all
 *   of the model's space)
 * @throws ArgumentError as `participation` and `naturalFrequencies` do (sizes, NaN eigenvalues)
 */
export function summariseModes(assembled: AssembledModel, eigen: EigenResult, options: ParticipationOptions = {}): ModalAnalysis {
  const vectors = Float64Array.from(eigen.vectors);
  orientModes(vectors, eigen.n);
  const oriented: EigenResult = { ...eigen, vectors };
  const f = naturalFrequencies(eigen.eigenvalues);
  const p = participation(assembled, oriented, options);
  const totalMass: Partial<Record<DofName, number>> = {};
  for (const d of p.directions) totalMass[d] = p.byDirection[d]!.totalMass;
  const modes: ModeSummary[] = [];
  for (let j = 0; j < eigen.eigenvalues.length; j++) {
    const participationFactor: Partial<Record<DofName, number>> = {};
    const effectiveMass: Partial<Record<DofName, number>> = {};
    const effectiveMassRatio: Partial<Record<DofName, number>> = {};
    const cumulativeRatio: Partial<Record<DofName, number>> = {};
    for (const d of p.directions) {
      const dp = p.byDirection[d]!;
      participationFactor[d] = dp.participationFactors[j];
      effectiveMass[d] = dp.effectiveMasses[j];
      effectiveMassRatio[d] = dp.ratios[j];
      cumulativeRatio[d] = dp.cumulativeRatios[j];
    }
    modes.push({
      mode: j + 1,
      eigenvalue: eigen.eigenvalues[j],
      angularFrequency: f.angular[j],
      frequency: f.frequency[j],
      period: f.period[j],
      residual: eigen.residuals[j],
      participationFactor,
      effectiveMass,
      effectiveMassRatio,
      cumulativeRatio,
    });
  }
  return {
    title: assembled.model.title ?? '',
    assembled,
    directions: p.directions,
    totalMass,
    referencePoint: p.referencePoint,
    modes,
    eigen: oriented,
  };
}
