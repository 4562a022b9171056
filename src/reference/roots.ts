/**
 * A small root finder for the characteristic equations of the reference cases: scan an
 * interval in fixed steps for sign changes, then bisect each bracket to 1e-14 (relative).
 * Bisection is slow but cannot fail on a bracket, which is what a reference value needs
 * (any text on numerical analysis, e.g. Press et al., Numerical Recipes, 3rd ed., ch. 9, from memory).
 *
 * Functions with poles (tan x − x) produce a sign change across each pole too; the scan
 * rejects a bracket whose midpoint value is not small compared with its ends' (a pole grows,
 * a root shrinks), so callers may pass such functions directly.
 */
import { ArgumentError } from '../errors';

/** Options of `findRoots`. */
export interface RootScanOptions {
  /** Scan step (same unit as x). @defaultValue 0.01 */
  step?: number;
  /** Bisection stops when the bracket is narrower than this times max(1, |x|). @defaultValue 1e-14 */
  tolerance?: number;
}

/** Defaults of `findRoots`. */
export const ROOT_SCAN_DEFAULTS = { step: 0.01, tolerance: 1e-14 } as const;

/**
 * Bisection of f on [a, b], where f(a) and f(b) have opposite signs (or one is zero).
 * @returns x with f changing sign within tolerance·max(1, |x|) of it
 * @throws ArgumentError when [a, b] is not a bracket
 */
export function bisect(f: (x: number) => number, a: number, b: number, tolerance: number = ROOT_SCAN_DEFAULTS.tolerance): number {
  let fa = f(a);
  const fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (!(Math.sign(fa) !== Math.sign(fb)) || !Number.isFinite(fa) || !Number.isFinite(fb)) {
    throw new ArgumentError(`f(${a}) = ${fa} and f(${b}) = ${fb} do not change sign; give an interval that brackets a root`, 'bracket');
  }
  let lo = a;
  let hi = b;
  // 200 halvings reduce any double interval below one ulp; the tolerance test ends sooner.
  for (let it = 0; it < 200; it++) {
    const mid = 0.5 * (lo + hi);
    if (hi - lo <= tolerance * Math.max(1, Math.abs(mid)) || mid === lo || mid === hi) return mid;
    const fm = f(mid);
    if (fm === 0) return mid;
    if (Math.sign(fm) === Math.sign(fa)) {
      lo = mid;
      fa = fm;
    } else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * The first `count` roots of f above `start`, ascending, found by scanning in steps of
 * `options.step` and bisecting each sign change. Sign changes at poles are skipped (see the
 * file comment). The step must be smaller than the gap between neighbouring roots.
 * @param start - where the scan begins (exclusive of a root exactly there)
 * @throws ArgumentError on a bad count or step, or when fewer roots exist in 1e6 steps
 */
export function findRoots(f: (x: number) => number, start: number, count: number, options: RootScanOptions = {}): number[] {
  const { step, tolerance } = { ...ROOT_SCAN_DEFAULTS, ...options };
  if (!Number.isInteger(count) || count < 0) throw new ArgumentError(`count is ${count}; give a whole number ≥ 0`, 'count');
  if (!(step > 0) || !Number.isFinite(step)) throw new ArgumentError(`step is ${step}; give a finite step > 0`, 'step');
  const roots: number[] = [];
  let a = start;
  let fa = f(a);
  for (let k = 1; roots.length < count && k <= 1_000_000; k++) {
    const b = start + k * step;
    const fb = f(b);
    if (fa === 0 && a !== start) roots.push(a);
    else if (fb !== 0 && Math.sign(fa) !== Math.sign(fb) && fa !== 0) {
      const x = bisect(f, a, b, tolerance);
      // A pole: |f| near x is large, not small, compared with the bracket ends.
      if (Math.abs(f(x)) <= Math.max(Math.abs(fa), Math.abs(fb))) roots.push(x);
    }
    a = b;
    fa = fb;
  }
  if (roots.length < count) {
    throw new ArgumentError(`found ${roots.length} of ${count} roots in 1e6 steps of ${step}; use a larger step or fewer roots`, 'count');
  }
  return roots;
}
