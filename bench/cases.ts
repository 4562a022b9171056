/**
 * The benchmark cases: building frames and footbridges (sparse path, SciPy reference, growth
 * exponent) and plane frames sized for the dense baselines.
 */
import type { Model } from '../src/model/types';
import { BUILDING_SIZES, DENSE_SIZES, FOOTBRIDGE_SIZES, buildingFrame, planeFrame, trussFootbridge } from './models';

export type Family = 'building' | 'footbridge' | 'dense';

export interface BenchCase {
  /** Unique name, used by `--case`. */
  readonly name: string;
  readonly family: Family;
  /** Run with `--quick`. */
  readonly quick: boolean;
  /**
   * One of the two models the targets are set on (the largest building and footbridge): ours
   * and SciPy run `--rounds` times, alternately, and the medians are reported.
   */
  readonly target: boolean;
  /** Builds the model (deterministic). */
  model(): Model;
}

export const CASES: readonly BenchCase[] = [
  ...BUILDING_SIZES.map((o, i) => ({
    name: `building-${o.baysX}x${o.baysY}x${o.storeys}`,
    family: 'building' as const,
    quick: i < 2,
    target: i === BUILDING_SIZES.length - 1,
    model: () => buildingFrame(o),
  })),
  ...FOOTBRIDGE_SIZES.map((o, i) => ({
    name: `footbridge-${o.panels}`,
    family: 'footbridge' as const,
    quick: i < 2,
    target: i === FOOTBRIDGE_SIZES.length - 1,
    model: () => trussFootbridge(o),
  })),
  ...DENSE_SIZES.map((o, i) => ({
    name: `dense-${3 * (o.bays + 1) * o.storeys}`,
    family: 'dense' as const,
    quick: i < 2,
    target: false,
    model: () => planeFrame(o),
  })),
];

/**
 * Cases selected by the flags: `--case NAME` matches a case name exactly or a family name
 * (`building`, `footbridge`, `dense`); `--quick` keeps the small sizes only.
 */
export function selectCases(names: readonly string[], quick: boolean): BenchCase[] {
  let out = CASES.filter((c) => !quick || c.quick);
  if (names.length > 0) out = out.filter((c) => names.includes(c.name) || names.includes(c.family));
  return out;
}
