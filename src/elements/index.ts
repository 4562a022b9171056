/** Element matrices: flat row-major Float64Arrays, SI units (see each function's doc). */
export { transform, transformSymmetric3, memberLength } from './transform';
export {
  barStiffnessLocal, barConsistentMassLocal, barLumpedMassLocal,
  barStiffnessPlane, barConsistentMassPlane, barLumpedMassPlane,
  barStiffnessSpace, barConsistentMassSpace, barLumpedMassSpace,
} from './bar';
export { beamStiffness, beamConsistentMass, beamLumpedMass } from './beam';
export { timoshenkoShearParameter, timoshenkoStiffness, timoshenkoConsistentMass, timoshenkoLumpedMass } from './timoshenko';
export { planeFrameStiffnessLocal, planeFrameConsistentMassLocal, planeFrameLumpedMass, planeFrameStiffness, planeFrameConsistentMass } from './planeFrame';
export {
  VERTICAL_TOLERANCE, PARALLEL_TOLERANCE, memberAxes,
  spaceFrameStiffnessLocal, spaceFrameConsistentMassLocal, spaceFrameLumpedMassLocal,
  spaceFrameStiffness, spaceFrameConsistentMass, spaceFrameLumpedMass,
} from './spaceFrame';
export { beamGeometricStiffness, barGeometricStiffnessPlane, barGeometricStiffnessSpace, planeFrameGeometricStiffness, spaceFrameGeometricStiffness } from './geometric';
export { pointMassDiagonal } from './pointMass';
export { groundedSpringStiffness, twoNodeSpringStiffness } from './spring';
export type { BeamTheory, PlaneFrameProps, SpaceFrameProps } from './types';
