/**
 * JSON report of a modal analysis (the `--json` output of `eigenframe modes`).
 *
 * Shape: `{ format: "eigenframe-modes/1", title, dofCount, directions, totalMass,
 * referencePoint, modes: [...], verification: {...}, solver: {...}, caution }`; each mode has
 * `mode`, `eigenvalue` (rad²/s²), `frequency` (Hz, always a number), `angularFrequency` (rad/s),
 * `period` (s; null for a rigid-body mode, whose period is infinite), `residual`, and per
 * direction `participationFactor`, `effectiveMass`, `effectiveMassRatio`, `cumulativeRatio`.
 * With `shapes`, each mode also carries `shape`: the mass-normalised vector over the free DOFs,
 * in the order of the top-level `dofs` list.
 */
import type { EigenResult } from '../eigen/types';
import type { ModalAnalysis } from '../modal/analysis-types';
import { ENGINEERING_CAUTION } from './caution';

export interface JsonReportOptions {
  /** Include each mode's shape vector and the DOF map. @defaultValue false */
  shapes?: boolean;
}

/** Verification and solver facts as a plain object. */
export function verificationObject(eigen: EigenResult): Record<string, unknown> {
  return {
    maxResidual: eigen.residuals.reduce((a, b) => Math.max(a, b), 0),
    orthogonalityError: eigen.orthogonalityError,
    sturm: eigen.sturm ? { ...eigen.sturm } : null,
  };
}

/** The JSON object of a modal analysis (serialise with JSON.stringify). */
export function modesJsonObject(result: ModalAnalysis, options: JsonReportOptions = {}): Record<string, unknown> {
  const n = result.assembled.dofs.length;
  const modes = result.modes.map((m, j) => {
    const o: Record<string, unknown> = {
      mode: m.mode,
      eigenvalue: m.eigenvalue,
      frequency: m.frequency,
      angularFrequency: m.angularFrequency,
      period: Number.isFinite(m.period) ? m.period : null,
      residual: m.residual,
      participationFactor: m.participationFactor,
      effectiveMass: m.effectiveMass,
      effectiveMassRatio: m.effectiveMassRatio,
      cumulativeRatio: m.cumulativeRatio,
    };
    if (options.shapes) o.shape = Array.from(result.eigen.vectors.subarray(j * n, (j + 1) * n));
    return o;
  });
  const out: Record<string, unknown> = {
    format: 'eigenframe-modes/1',
    title: result.title,
    dofCount: n,
    directions: result.directions,
    totalMass: result.totalMass,
    referencePoint: result.referencePoint,
    modes,
    verification: verificationObject(result.eigen),
    solver: { method: result.eigen.method, stats: result.eigen.stats },
    caution: ENGINEERING_CAUTION,
  };
  if (options.shapes) out.dofs = result.assembled.dofs.map((d) => ({ node: d.node, dof: d.dof }));
  return out;
}

/** JSON object for a bare K, M pair solved without a model (`modes --stiffness --mass`). */
export function matrixModesJsonObject(eigen: EigenResult): Record<string, unknown> {
  const modes = Array.from(eigen.eigenvalues, (lambda, j) => {
    const omega = Math.sqrt(Math.max(lambda, 0));
    const f = omega / (2 * Math.PI);
    return { mode: j + 1, eigenvalue: lambda, frequency: f, angularFrequency: omega, period: f > 0 ? 1 / f : null, residual: eigen.residuals[j] };
  });
  return {
    format: 'eigenframe-modes/1',
    dofCount: eigen.n,
    modes,
    verification: verificationObject(eigen),
    solver: { method: eigen.method, stats: eigen.stats },
  };
}
