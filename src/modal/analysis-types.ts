/**
 * The result of a modal analysis of a structural model: frequencies, participation and the
 * solver's own verification figures. Produced by `modalAnalysis`, consumed by the reports.
 */
import type { EigenResult } from '../eigen/types';
import type { AssembledModel, DofName } from '../model/types';

/** A global direction of excitation: translations along, or rotations about, the global axes. */
export type Direction = DofName;

/** One mode, with the quantities engineers report. */
export interface ModeSummary {
  /** Mode number, 1 = lowest. */
  readonly mode: number;
  /** λ = ω², rad²/s²; a rigid-body mode may come out as a tiny negative number. */
  readonly eigenvalue: number;
  /** ω = √max(λ, 0), rad/s. */
  readonly angularFrequency: number;
  /** f = ω / 2π, Hz; always a number (0 for a rigid-body mode). */
  readonly frequency: number;
  /** T = 1 / f, s; Infinity for a rigid-body mode (f = 0). */
  readonly period: number;
  /** Relative residual ‖Kφ − λMφ‖ / (‖K‖‖φ‖). */
  readonly residual: number;
  /** Participation factor Γ = φᵀ M r per direction (φ mass-normalised), kg^½ (kg^½·m on rotations). */
  readonly participationFactor: Readonly<Partial<Record<Direction, number>>>;
  /** Effective modal mass Γ² per direction, kg (kg·m² on rotations). */
  readonly effectiveMass: Readonly<Partial<Record<Direction, number>>>;
  /** Effective mass as a share of the total rᵀ M r, 0..1. */
  readonly effectiveMassRatio: Readonly<Partial<Record<Direction, number>>>;
  /** Cumulative share over modes 1..mode, 0..1. */
  readonly cumulativeRatio: Readonly<Partial<Record<Direction, number>>>;
}

/** Everything a modal analysis of a model returns. */
export interface ModalAnalysis {
  /** Model title (empty when the model has none). */
  readonly title: string;
  /** The assembled system the modes belong to (free DOFs, K, M, DOF map). */
  readonly assembled: AssembledModel;
  /** Directions reported: ux uy rz in the plane, all six in space. */
  readonly directions: readonly Direction[];
  /** Total mass rᵀ M r per direction (kg; kg·m² for rotations about the reference point). */
  readonly totalMass: Readonly<Partial<Record<Direction, number>>>;
  /** Point the rotations are taken about, m (the centre of mass unless given). */
  readonly referencePoint: readonly [number, number, number];
  /** The modes, lowest first. */
  readonly modes: readonly ModeSummary[];
  /** The solver's result: eigenvalues, mass-normalised shapes, verification, stats. */
  readonly eigen: EigenResult;
}
