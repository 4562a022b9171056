/**
 * Participation factors and effective modal masses (Chopra, Dynamics of Structures, §13.2):
 * for a mode φⱼ and an influence vector r,
 *   Lⱼ = φⱼᵀ M r,  Mⱼ = φⱼᵀ M φⱼ,  Γⱼ = Lⱼ / Mⱼ,  m_eff,j = Lⱼ² / Mⱼ.
 * With mass-normalised shapes (Mⱼ = 1) these are Γⱼ = φⱼᵀ M r and m_eff,j = Γⱼ². Over all n
 * modes Σ m_eff,j = rᵀ M r, the total mass of the direction, because Φ Φᵀ = M⁻¹ for
 * M-orthonormal Φ; the cumulative ratio measures how much of it the computed modes capture.
 */
import { ArgumentError } from '../errors';
import { symmetricMultiply, type SymmetricCsc } from '../linalg/sparse/symmetric';
import type { AssembledModel, DofName } from '../model/types';
import { influenceVectors, type InfluenceOptions, type Point3 } from './influence';
import { dot, modeCount, type ModeSet } from './modes';

/** Participation of the modes in one direction; arrays have length m (modes). */
export interface DirectionParticipation {
  /** The direction. */
  readonly direction: DofName;
  /** rᵀ M r: kg for a translation, kg·m² for a rotation about the reference point. */
  readonly totalMass: number;
  /**
   * Γⱼ = φⱼᵀ M r / φⱼᵀ M φⱼ for the shapes as given; with mass-normalised shapes, kg^½
   * (kg^½·m for a rotation).
   */
  readonly participationFactors: Float64Array;
  /** m_eff,j = (φⱼᵀ M r)² / φⱼᵀ M φⱼ, independent of the shapes' scale: kg (kg·m² for a rotation). */
  readonly effectiveMasses: Float64Array;
  /** m_eff,j / rᵀ M r, 0..1 (all 0 when rᵀ M r = 0: the direction carries no mass). */
  readonly ratios: Float64Array;
  /** Σ_{k≤j} ratio_k: the share captured by modes 1..j+1, 0..1 up to round-off. */
  readonly cumulativeRatios: Float64Array;
}

/**
 * Modal masses Mⱼ = φⱼᵀ M φⱼ of each mode (1 for mass-normalised shapes).
 * @param mass - M, n × n symmetric, kg (kg·m² on rotations)
 * @param modes - shapes, column-major n × m
 * @returns length m
 * @throws ArgumentError (path `modes`) when the sizes disagree; (path `modes[j]`) when a
 *   modal mass is not positive
 */
export function modalMasses(mass: SymmetricCsc, modes: ModeSet): Float64Array {
  const n = mass.n;
  const m = modeCount(modes, n);
  const out = new Float64Array(m);
  const w = new Float64Array(n);
  for (let j = 0; j < m; j++) {
    const phi = modes.vectors.subarray(j * n, (j + 1) * n);
    symmetricMultiply(mass, phi, w);
    out[j] = dot(phi, 0, w, 0, n);
    if (!(out[j] > 0) || !Number.isFinite(out[j])) {
      throw new ArgumentError(`modal mass φᵀMφ = ${out[j]} is not positive; the shape is zero or moves only massless DOFs`, `modes[${j}]`);
    }
  }
  return out;
}

/**
 * Participation of every mode along one influence vector.
 * @param mass - M, n × n symmetric, kg (kg·m² on rotations)
 * @param modes - shapes, column-major n × m (mass-normalised or not; see the fields)
 * @param r - influence vector, length n ({@link influenceVector})
 * @param direction - label stored in the result
 * @param masses - modal masses from {@link modalMasses}, computed when omitted
 * @throws ArgumentError (path `r`) when r has the wrong length or a non-finite entry; as
 *   {@link modalMasses}
 */
export function directionParticipation(mass: SymmetricCsc, modes: ModeSet, r: Float64Array, direction: DofName, masses?: Float64Array): DirectionParticipation {
  const n = mass.n;
  const m = modeCount(modes, n);
  if (r.length !== n || !r.every((v) => Number.isFinite(v))) {
    throw new ArgumentError(`influence vector must hold ${n} finite numbers (one per free DOF), got length ${r.length}`, 'r');
  }
  const mu = masses ?? modalMasses(mass, modes);
  const Mr = new Float64Array(n);
  symmetricMultiply(mass, r, Mr);
  const totalMass = dot(r, 0, Mr, 0, n);
  const participationFactors = new Float64Array(m);
  const effectiveMasses = new Float64Array(m);
  const ratios = new Float64Array(m);
  const cumulativeRatios = new Float64Array(m);
  let cum = 0;
  for (let j = 0; j < m; j++) {
    const L = dot(modes.vectors, j * n, Mr, 0, n);
    participationFactors[j] = L / mu[j];
    effectiveMasses[j] = (L * L) / mu[j];
    ratios[j] = totalMass > 0 ? effectiveMasses[j] / totalMass : 0;
    cum += ratios[j];
    cumulativeRatios[j] = cum;
  }
  return { direction, totalMass, participationFactors, effectiveMasses, ratios, cumulativeRatios };
}

/** Options of {@link participation}: those of the influence vectors. */
export type ParticipationOptions = InfluenceOptions;

/** Participation of the modes of a model in each global direction. */
export interface Participation {
  /** Directions, in report order (ux uy rz in the plane; ux uy uz rx ry rz in space). */
  readonly directions: readonly DofName[];
  /** Per direction. */
  readonly byDirection: Readonly<Partial<Record<DofName, DirectionParticipation>>>;
  /** Point the rotations are taken about, m (the centre of mass unless given). */
  readonly referencePoint: Point3;
  /** Modal masses φⱼᵀ M φⱼ, length m (1 for mass-normalised shapes). */
  readonly modalMasses: Float64Array;
}

/**
 * Participation factors, effective masses, ratios and cumulative ratios of the modes of an
 * assembled model in each global direction.
 * @param assembled - the model the modes belong to (M over the free DOFs, DOF map, coordinates)
 * @param modes - its modes, e.g. an `EigenResult` (column-major n × m shapes)
 * @param options - reference point and directions, see {@link InfluenceOptions}
 * @throws ArgumentError as {@link influenceVectors} and {@link modalMasses} do
 */
export function participation(assembled: AssembledModel, modes: ModeSet, options: ParticipationOptions = {}): Participation {
  const inf = influenceVectors(assembled, options);
  const masses = modalMasses(assembled.mass, modes);
  const byDirection: Partial<Record<DofName, DirectionParticipation>> = {};
  for (const d of inf.directions) byDirection[d] = directionParticipation(assembled.mass, modes, inf.vectors[d]!, d, masses);
  return { directions: inf.directions, byDirection, referencePoint: inf.referencePoint, modalMasses: masses };
}
