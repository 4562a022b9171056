/**
 * The shape of a closed-form reference case: a model that can be built at any mesh, the exact
 * answer of the theory it discretises, and the mesh at which eigenframe's own discretisation
 * reaches a stated tolerance.
 */
import type { DofName, Model } from '../model/types';

/** What `exact` returns: natural frequencies in Hz, or buckling load factors (dimensionless). */
export type ReferenceQuantity = 'frequency' | 'buckling';

/** One input of a case, with its unit. */
export interface ReferenceParameter {
  /** Symbol, e.g. `E`, `L`, `mTip`. */
  readonly name: string;
  /** Value in SI units. */
  readonly value: number;
  /** Unit, e.g. `Pa`, `m`, `kg`, `-` for dimensionless. */
  readonly unit: string;
  /** What it is, one phrase. */
  readonly description: string;
}

/**
 * A nodal force of the reference load pattern of a buckling case, in global axes.
 * The buckling load factors are multiples of this pattern (the critical load is factor × force).
 */
export interface ReferenceLoad {
  /** Node id in the model built by `build`. */
  readonly node: string;
  /** Global direction (a translation). */
  readonly dof: DofName;
  /** Force along `dof`, N (negative: against the axis). */
  readonly force: number;
}

/** A closed-form reference case. */
export interface ReferenceCase {
  /** Kebab-case identifier, e.g. `beam-cantilever`. */
  readonly id: string;
  /** One line: what the structure is and what is compared. */
  readonly description: string;
  /** The published theory or source of the exact values, and how they are computed here. */
  readonly source: string;
  /** Frequencies (Hz) or buckling load factors. */
  readonly quantity: ReferenceQuantity;
  /** The inputs of the case, SI units. */
  readonly parameters: readonly ReferenceParameter[];
  /** What `mesh` counts, e.g. `elements along the beam`. */
  readonly meshUnit: string;
  /** Mesh at which eigenframe's discretisation reaches `tolerance` on the first `count` values. */
  readonly mesh: number;
  /** Largest relative error of the first `count` values at `mesh` (see compareValues). */
  readonly tolerance: number;
  /** How many of the lowest values the stated tolerance covers. */
  readonly count: number;
  /**
   * Buckling cases: the reference load pattern the factors multiply, for the model built at
   * `mesh` (node ids depend on it); absent for frequency cases.
   */
  loads?(mesh: number): ReferenceLoad[];
  /**
   * The model at a given mesh (eigenframe-model/1).
   * @param mesh - whole number ≥ 1, in `meshUnit`
   * @throws ArgumentError (path `mesh`) on a mesh that is not a whole number ≥ 1
   */
  build(mesh: number): Model;
  /**
   * The lowest `count` exact values, ascending: frequencies in Hz (0 for rigid-body modes) or
   * buckling load factors.
   * @throws ArgumentError (path `count`) on a count that is not a whole number ≥ 0
   */
  exact(count: number): number[];
}
