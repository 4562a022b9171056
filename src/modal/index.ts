/** What modes are for: normalisation, participation, effective mass, reconstruction, statics. */
export { modalAnalysis, MODAL_ANALYSIS_DEFAULTS, type ModalAnalysisOptions } from './analysis';
export type { Direction, ModeSummary, ModalAnalysis } from './analysis-types';
export { summariseModes } from './summary';
export { eigenvalueToFrequency, frequencyToEigenvalue, naturalFrequencies, type Frequencies } from './frequencies';
export { influenceVector, influenceVectors, centreOfMass, directionsOf, PLANE_DIRECTIONS, SPACE_DIRECTIONS, type InfluenceOptions, type InfluenceVectors, type Point3 } from './influence';
export { participation, directionParticipation, modalMasses, type Participation, type DirectionParticipation, type ParticipationOptions } from './participation';
export { massNormalise, orientModes, MASS_NORMALISE_DEFAULTS, type MassNormaliseOptions } from './normalise';
export { spectralStiffness, truncationError, TRUNCATION_DEFAULTS, type TruncationOptions, type TruncationMethod } from './reconstruction';
export { modalStatic, type ModalStaticOptions, type ModalStaticResult } from './static';
export type { ModeSet } from './modes';
