/**
 * Growth exponent of run time with problem size: the slope b of the least-squares line
 * log t = a + b log n (ordinary least squares on log–log data).
 */

/** Least-squares slope of log(y) against log(x); NaN with fewer than two usable points. */
export function growthExponent(x: readonly number[], y: readonly number[]): number {
  const lx: number[] = [];
  const ly: number[] = [];
  for (let i = 0; i < x.length; i++) {
    if (x[i] > 0 && y[i] > 0 && Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      lx.push(Math.log(x[i]));
      ly.push(Math.log(y[i]));
    }
  }
  const n = lx.length;
  if (n < 2) return Number.NaN;
  const mx = lx.reduce((s, v) => s + v, 0) / n;
  const my = ly.reduce((s, v) => s + v, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (lx[i] - mx) * (ly[i] - my);
    sxx += (lx[i] - mx) ** 2;
  }
  return sxx > 0 ? sxy / sxx : Number.NaN;
}
