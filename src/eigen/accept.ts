/**
 * Acceptance of an eigen result against the accuracy targets of DESIGN.md: per-mode relative
 * residual, M-orthonormality and the Sturm count.
 */
import { VerificationError } from '../errors';
import type { SturmCheck } from './types';

/** Largest accepted relative residual ‖Kx − λMx‖ / (‖K‖₁‖x‖) (DESIGN.md, Accuracy). */
export const RESIDUAL_LIMIT = 1e-8;
/** Largest accepted max |ΦᵀMΦ − I| (DESIGN.md, Accuracy). */
export const ORTHOGONALITY_LIMIT = 1e-10;

/**
 * Throws VerificationError unless every residual is ≤ RESIDUAL_LIMIT (path `modes[k]`, the
 * first failing mode), the orthogonality error ≤ ORTHOGONALITY_LIMIT (path `modes`) and the
 * Sturm check, when given, passed (path `modes[k]`, k the first index the count says is missing).
 * @param eigenvalues - rad²/s², ascending, length m
 * @param residuals - relative residuals, length m
 * @param orthogonalityError - max |ΦᵀMΦ − I|
 * @param sturm - the Sturm check of the result, if one was made
 */
export function assertAccepted(eigenvalues: Float64Array, residuals: Float64Array, orthogonalityError: number, sturm?: SturmCheck): void {
  for (let k = 0; k < residuals.length; k++) {
    if (!(residuals[k] <= RESIDUAL_LIMIT)) {
      throw new VerificationError(
        `relative residual ${residuals[k].toExponential(3)} of eigenvalue ${eigenvalues[k]} rad²/s² exceeds ${RESIDUAL_LIMIT}; the pencil may be ill-conditioned — try method 'subspace' or 'lanczos' with another shift, or check K and M`,
        `modes[${k}]`,
      );
    }
  }
  if (!(orthogonalityError <= ORTHOGONALITY_LIMIT)) {
    throw new VerificationError(
      `M-orthonormality error ${orthogonalityError.toExponential(3)} exceeds ${ORTHOGONALITY_LIMIT}; M may be nearly singular or the modes nearly repeated — check M's conditioning`,
      'modes',
    );
  }
  if (sturm && !sturm.passed) {
    const inWindow = sturm.countBelow - (sturm.countBelowLower ?? 0);
    const found = sturm.returnedBelow + (sturm.extraBelow ?? 0);
    const k = Math.min(found, Math.max(eigenvalues.length - 1, 0));
    throw new VerificationError(
      `the Sturm count finds ${inWindow} eigenvalue(s) ${sturm.lowerShift !== undefined ? `between ${sturm.lowerShift} and ` : 'below '}${sturm.shift} rad²/s², but the solver found ${found}; ${inWindow > found ? 'a mode was missed' : 'a mode was found twice'} — try another seed or method`,
      `modes[${k}]`,
    );
  }
}
