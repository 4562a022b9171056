import type { SymmetricCsc } from '../sparse/symmetric';

/**
 * An ordering whose factorization costs fewer flops than AUTO_ENOUGH_FLOPS_PER_ENTRY per stored
 * entry of the pattern is good enough, on patterns of at least AUTO_ENOUGH_MIN_N columns: another
 * ordering would take longer to compute than any factorization it could save. `analyse` with
 * `ordering: 'auto'` stops trying candidates there, and the node grouping of `amd` and `nd`
 * (chooseBlocks) stops at the exact compression. Measured (Node 20, one core): amd orders a
 * pattern at ≈ 0.4 µs per stored entry and nd at ≈ 1 µs, while the factorization runs at
 * ≈ 3 GFLOP/s, i.e. ≈ 1,200 flops per µs; on an 84,000-DOF truss footbridge (amd: 1e7 flops,
 * 0.07 s to factor) the other three orderings took 1.0–1.8 s. Deterministic: it depends on
 * counts, not on time.
 */
export const AUTO_ENOUGH_FLOPS_PER_ENTRY = 1000;
/**
 * See {@link AUTO_ENOUGH_FLOPS_PER_ENTRY}; patterns of fewer columns always try every candidate
 * (the four orderings together then cost a few milliseconds). Measured (Node 20, one core) on a
 * 1,500-DOF plane frame: amd alone 4 ms warm, all four candidates 20–50 ms warm and ≈ 100 ms in
 * a fresh process, for a factor of 7e5 flops, far below the threshold.
 */
export const AUTO_ENOUGH_MIN_N = 1000;

/**
 * Factorization flops below which an ordering of this pattern is good enough (see
 * {@link AUTO_ENOUGH_FLOPS_PER_ENTRY}); −1 (nothing is) below AUTO_ENOUGH_MIN_N columns.
 */
export function enoughFlops(pattern: SymmetricCsc): number {
  return pattern.n >= AUTO_ENOUGH_MIN_N ? AUTO_ENOUGH_FLOPS_PER_ENTRY * pattern.colPtr[pattern.n] : -1;
}
