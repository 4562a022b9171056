/**
 * Numbers in reports and drawings: `digits` significant figures, plain decimals for ordinary
 * magnitudes (1e-3 ≤ |v| < 1e6), exponent form outside them.
 */

/** A finite number to `digits` significant figures (callers choose how to show ±∞ and NaN). */
export function significant(v: number, digits: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-3) return v.toExponential(digits - 1);
  return v.toFixed(Math.max(0, digits - 1 - Math.floor(Math.log10(a))));
}

/** For plain-text reports: {@link significant}, with 'inf' for +∞ and '-' for −∞ and NaN. */
export function sig(v: number, digits = 4): string {
  return Number.isFinite(v) ? significant(v, digits) : v > 0 ? 'inf' : '-';
}
