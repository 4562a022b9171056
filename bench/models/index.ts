/** Benchmark model generators (pure; no Node imports). */
export { buildingFrame, buildingNodeId, BUILDING_DEFAULTS } from './building';
export type { BuildingFrameOptions } from './building';
export { trussFootbridge, footbridgeNodeIds, footbridgeSupportPoints, FOOTBRIDGE_DEFAULTS } from './footbridge';
export type { TrussFootbridgeOptions } from './footbridge';
export { planeFrame, planeFrameNodeId, PLANE_FRAME_DEFAULTS } from './plane-frame';
export type { PlaneFrameOptions } from './plane-frame';
export { circularHollow, squareHollow, iSection, STEEL } from './sections';
export { BUILDING_SIZES, FOOTBRIDGE_SIZES, DENSE_SIZES } from './sizes';
