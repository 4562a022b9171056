/**
 * eigenframe/node: Node-only additions to the library (worker threads for parameter studies).
 * The pure per-variant function `solveVariant` runs anywhere, including browser Web Workers.
 */
export { solveBatch, BATCH_DEFAULTS, type BatchOptions, type ParameterStudy, type VariantResult, type BatchJob, type BatchWorkerData, type BatchWorkerMessage, type BatchItem } from './batch';
export { solveVariant, solveVariantPacked, applyMergePatch, createMergePatch, describeError, patternHash, SymbolicCache, SYMBOLIC_CACHE_DEFAULTS, type VariantOptions, type VariantOutcome, type VariantError } from './variant';
