/** Generalized symmetric eigensolvers K x = λ M x; knows nothing about structures. */
export type { EigenMethod, EigenResult, SturmCheck } from './types';
export { solve, SOLVE_DEFAULTS, DENSE_CROSSOVER, FREE_SHIFT, ZERO_SHIFT_PIVOT_RATIO, MAX_ROUNDS, RANGE_BLOCK, type SolveOptions, type SolveMethod } from './solve';
export { ShiftedPencil, SHIFT_NUDGE, SHIFT_ATTEMPTS, FACTOR_MEMORY_LIMIT, factorBytes, type ShiftedFactor } from './pencil';
export { assertAccepted, RESIDUAL_LIMIT, ORTHOGONALITY_LIMIT } from './accept';
export { denseEigen, DENSE_EIGEN_DEFAULTS, type DenseEigenOptions, type DenseEigenInput, type DenseSymmetric } from './dense/index';
export { lanczos, LANCZOS_DEFAULTS, type LanczosOptions, type LanczosResult, type ProgressCallback } from './lanczos';
export { subspaceIteration, SUBSPACE_DEFAULTS, type SubspaceOptions, type SubspaceResult } from './subspace';
export { sturmCount, sturmCheck, STURM_GAP, STURM_PIVOT_TOLERANCE, type SturmCheckOptions } from './sturm';
export { residuals, orthogonalityError, modeChecks, checkWorkLength, matrixNorm1, type SymmetricOperand } from './verify';
export { matrixOperator, shiftInvertOperator, inverseOperator, type BlockOperator } from './operators';
export { mlMatrixGeneralized, type BaselineResult } from './baseline';
export { checkMassSemidefinite, MASS_CHECK_DEFAULTS, MASS_DEFINITENESS_TOLERANCE, type MassCheck, type MassCheckOptions, type MassCheckResult } from './definiteness';
export { lowestModesShift, FREE_SHIFT_FLOOR, FREE_SHIFT_RESOLUTION, type LowestModesShift } from './shift';
