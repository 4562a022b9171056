/** Property bundles of the frame elements (SI units). Build one per (material, section, kind). */

/** Bending theory of a frame member. */
export type BeamTheory = 'euler-bernoulli' | 'timoshenko';

/** Plane frame member: axial + bending in the x–y plane. */
export interface PlaneFrameProps {
  /** Young's modulus, Pa. */
  readonly E: number;
  /** Area, m². */
  readonly A: number;
  /** Second moment of area for bending in the x–y plane, m⁴. */
  readonly I: number;
  /** Density, kg/m³. */
  readonly density: number;
  /** Bending theory. */
  readonly theory: BeamTheory;
  /** Shear modulus, Pa (Timoshenko only). */
  readonly G?: number;
  /** Shear correction factor κ (Timoshenko only). */
  readonly kappa?: number;
}

/** Space frame member: axial, torsion, and bending in the local x–y and x–z planes. */
export interface SpaceFrameProps {
  /** Young's modulus, Pa. */
  readonly E: number;
  /** Shear modulus, Pa. */
  readonly G: number;
  /** Area, m². */
  readonly A: number;
  /** Second moment about local z (bending in the local x–y plane, DOFs v, θz), m⁴. */
  readonly Iz: number;
  /** Second moment about local y (bending in the local x–z plane, DOFs w, θy), m⁴. */
  readonly Iy: number;
  /** Torsion constant (St Venant), m⁴. */
  readonly J: number;
  /** Polar moment for torsional inertia, m⁴. @defaultValue Iy + Iz */
  readonly Ip?: number;
  /** Density, kg/m³. */
  readonly density: number;
  /** Bending theory. */
  readonly theory: BeamTheory;
  /** Shear correction factor κ, the same for both bending planes (Timoshenko only). */
  readonly kappa?: number;
}
