/**
 * The model sizes the benchmark runs: each family's largest member is the headline case, the
 * smaller ones give the growth exponent. Pure data (tests import it).
 */
import type { BuildingFrameOptions } from './building';
import type { TrussFootbridgeOptions } from './footbridge';
import type { PlaneFrameOptions } from './plane-frame';

/** Building frames, 6 (bx+1)(by+1)s free DOFs: 1,500 · 4,704 · 11,664 · 23,232 · 40,560. */
export const BUILDING_SIZES: readonly BuildingFrameOptions[] = [
  { baysX: 4, baysY: 4, storeys: 10 },
  { baysX: 6, baysY: 6, storeys: 16 },
  { baysX: 8, baysY: 8, storeys: 24 },
  { baysX: 10, baysY: 10, storeys: 32 },
  { baysX: 12, baysY: 12, storeys: 40 },
];

/** Footbridges (spans of 20 panels): 5,196 · 10,444 · 20,948 · 41,892 · 83,784 free DOFs. */
export const FOOTBRIDGE_SIZES: readonly TrussFootbridgeOptions[] = [
  { panels: 440 },
  { panels: 885 },
  { panels: 1775 },
  { panels: 3550 },
  { panels: 7100 },
];

/** Plane frames for the dense baselines, 3 (b+1)s free DOFs: exactly 300 · 600 · 1,200 · 1,500. */
export const DENSE_SIZES: readonly PlaneFrameOptions[] = [
  { bays: 4, storeys: 20 },
  { bays: 9, storeys: 20 },
  { bays: 9, storeys: 40 },
  { bays: 9, storeys: 50 },
];
