/** Sparse symmetric storage, orderings and the supernodal LDLᵀ with inertia. */
export type { Operator } from './operator';
export {
  CooBuilder, symmetricMultiply, symmetricMultiplyMany, nnz, diagonal, toDenseArray, fromDenseArray, DENSE_SYMMETRY_TOLERANCE, unionPattern, combineOnUnion,
  type SymmetricCsc, type UnionPattern,
} from './sparse/symmetric';
export type { OrderingName, AnalyseOptions, SymbolicFactor, FactorizeOptions, LdltFactor } from './ldlt/types';
export { analyse, ANALYSE_DEFAULTS, AUTO_CANDIDATES, AUTO_ENOUGH_FLOPS_PER_ENTRY, AUTO_ENOUGH_MIN_N, type OrderingCandidate } from './ldlt/analyse';
export { factorize, FACTORIZE_DEFAULTS } from './ldlt/factorize';
export { solveStatic } from './ldlt/static';
export { order, amd, rcm, nestedDissection, type OrderingMethod, type NestedDissectionOptions } from './ordering/index';
export { symbolicFill } from './ordering/fill';
