/** What modes are for: normalisation, participation, effective mass, reconstruction, statics. */
export { modalAnalysis, MODAL_ANALYSIS_DEFAULTS, type ModalAnalysisOptions } from './analysis';
export type { Direction, ModeSummary, ModalAnalysis } from './analysis-types';
export { summariseModes } from './summary';
export { eigenvalueToFrequency, frequencyToEigenvalue, naturalFrequencies, type Frequencies } from './frequencies';
export { influenceVector, influenceVectors, centreOfMass, directionsOf, PLANE_DIRECTIONS, SPACE_DIRECTIONS, type InfluenceOptions, type InfluenceVectors, type Point3 } from './influence';
export { participation, directionParticipation, modalMasses, type Participation, type DirectionParticipation, type ParticipationOptions } from './participation';
export { massNormalise, orientModes, MASS_NORMALISE_DEFAULTS, type MassNormaliseOptions } from './normalise';
export { spectralStiffness, truncationError, TRUNCATION_DEFAULTS, TRUNCATION_COLUMNS_BUDGET, type TruncationOptions, type TruncationMethod } from './reconstruction';
export { modalStatic, type ModalStaticOptions, type ModalStaticResult } from './static';
export type { ModeSet } from './modes';
export {
  BAND_PRESETS, BAND_PRESET_NAMES, bandPreset, machineBand, MACHINE_BAND_DEFAULTS, validateBand, validateBands, bandExcites, MOTION_DIRECTIONS,
  type MotionDirection, type BandDirection, type BandSpec, type ExcitationBand, type MachineBandOptions,
} from './bands';
export { classifyModes, structureAxes, CLASSIFY_DEFAULTS, type Classification, type ModeClassification, type StructureAxes, type ClassifyOptions } from './classify';
export {
  screenResonance, SCREENING_DEFAULTS,
  type ScreeningResult, type ModeScreening, type BandCheck, type ScreeningVerdict, type ScreeningCoverage, type ScreeningOptions,
} from './screening';
export { dampingRatios, rayleighDamping, type Damping } from './damping';
export { resolveDofs, responseModes, modalLoads, type DofRef, type ResponseModes } from './harmonic-dofs';
export { harmonicResponse, frequencySweep, HARMONIC_DEFAULTS, type HarmonicOptions, type HarmonicResult, type DofHarmonicResponse, type SweepOptions } from './harmonic';
export { pedestrianResponse, PEDESTRIAN_DEFAULTS, type PedestrianOptions, type PedestrianResult } from './harmonic-pedestrian';
export {
  designSpectrum, spectralAcceleration, responseSpectrum, STANDARD_GRAVITY, DESIGN_SPECTRUM_DEFAULTS, RESPONSE_SPECTRUM_DEFAULTS, type DesignSpectrumOptions,
  type SpectrumPoint, type DesignSpectrum, type ResponseSpectrumOptions, type ResponseSpectrumResult, type ModalPeak,
} from './spectrum';
export { cqcCorrelation, combineModal, correlationMatrix, type CombinationRule } from './spectrum-combination';
export {
  transientResponse, historyValue, TRANSIENT_DEFAULTS,
  type TransientOptions, type TransientResult, type TransientLoad, type LoadHistory, type TransientMethod, type DofTransientResponse,
} from './transient';
export {
  bucklingAnalysis, axialForces, BUCKLING_DEFAULTS, BUCKLING_DENSE_LIMIT, BUCKLING_RESIDUAL_LIMIT, BUCKLING_MAX_ROUNDS, AXIAL_NOISE,
  type BucklingOptions, type BucklingResult,
} from './buckling';
export {
  eigenvalueSensitivity, groupSensitivity, rankMembers, resolveGroup, REPEATED_GAP,
  type MemberGroup, type SensitivityFigures, type ElementSensitivity, type ModeSensitivity, type SensitivityOptions, type ResolvedGroup, type GroupSensitivity, type RankBy,
} from './sensitivity';
export {
  whatIf, scaledModel, whatIfSymbolic, stiffnessScaleFor, STIFFNESS_TARGET_DEFAULTS,
  type DesignChange, type ResolvedChange, type WhatIfOptions, type ModeShift, type WhatIfResult, type StiffnessTargetOptions, type StiffnessTargetResult,
} from './whatif';
