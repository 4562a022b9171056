/**
 * Modal analysis of a structural model, end to end: assemble K and M, refuse mechanisms, solve
 * for the requested modes (verified), and summarise frequencies and participation.
 */
import { solve, type SolveOptions } from '../eigen/solve';
import { assemble } from '../model/assemble';
import { assertNoMechanism } from '../model/mechanisms';
import type { AssembledModel, Model } from '../model/types';
import type { ModalAnalysis } from './analysis-types';
import type { ParticipationOptions } from './participation';
import { summariseModes } from './summary';

/** Options of {@link modalAnalysis}: the solver's request and the participation settings. */
export interface ModalAnalysisOptions extends Omit<SolveOptions, 'count'>, ParticipationOptions {
  /** Lowest N modes (or, with `near`, the N nearest the target). @defaultValue 12 */
  count?: number;
}

/** Defaults of {@link ModalAnalysisOptions} that differ from the solver's. */
export const MODAL_ANALYSIS_DEFAULTS = { count: 12 } as const;

/**
 * Natural frequencies, mass-normalised mode shapes, participation factors and effective mass
 * of a model.
 * @param input - a validated model (`parseModel`/`validateModel`) or one already assembled
 * @param options - count / range / near (eigenvalues in rad²/s²), solver method and controls,
 *   reference point of rotations; defaults in {@link MODAL_ANALYSIS_DEFAULTS} and SOLVE_DEFAULTS
 * @returns the modes lowest first, with frequencies (Hz), periods (s), participation per
 *   direction and the solver's verification figures
 * @throws ModelError naming the node and DOF of a mechanism; ArgumentError for bad options
 *   (e.g. a count above the number of free DOFs); VerificationError when the result fails its
 *   own checks
 */
export function modalAnalysis(input: Model | AssembledModel, options: ModalAnalysisOptions = {}): ModalAnalysis {
  const assembled = 'stiffness' in input ? input : assemble(input);
  assertNoMechanism(assembled);
  const { referencePoint, directions, ...solverOptions } = { ...MODAL_ANALYSIS_DEFAULTS, ...options };
  // An assembled M is semidefinite by construction (element and point masses): the cheap checks
  // suffice unless the caller asks for the complete one.
  const eigen = solve(assembled.stiffness, assembled.mass, { massCheck: 'minors', ...solverOptions });
  return summariseModes(assembled, eigen, { referencePoint, directions });
}
