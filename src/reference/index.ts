/** Closed-form reference cases with their published sources, and result comparison. */
export { referenceCases, referenceCase } from './catalogue';
export { compareValues, parseResults, type ModeComparison, type ComparisonResult } from './compare';
export { bisect, findRoots, ROOT_SCAN_DEFAULTS, type RootScanOptions } from './roots';
export { beamRoots, tipMassRoots, beamFrequency, rodFrequencies, timoshenkoSimplySupported, bucklingFactors, type BeamSupports, type ColumnSupports, type TimoshenkoBeam } from './theory';
export type { ReferenceQuantity, ReferenceParameter, ReferenceLoad, ReferenceCase } from './types';
