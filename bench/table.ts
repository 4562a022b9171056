/** Plain-text table and number formatting for the benchmark report. */

/** Right-aligned columns (left-aligned first column), a rule under the header. */
export function renderTable(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = header.map((h, j) => Math.max(h.length, ...rows.map((r) => (r[j] ?? '').length)));
  const line = (cells: readonly string[]): string =>
    cells.map((c, j) => (j === 0 ? c.padEnd(widths[j]) : c.padStart(widths[j]))).join('  ').trimEnd();
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

/** Seconds with three significant digits ("–" when not measured). */
export function fmtSeconds(v: number): string {
  if (!Number.isFinite(v)) return '–';
  if (v >= 100) return v.toFixed(0);
  if (v >= 10) return v.toFixed(1);
  if (v >= 1) return v.toFixed(2);
  if (v >= 0.001) return v.toFixed(3);
  return v.toExponential(1);
}

/** Integer count with thousands separators. */
export function fmtCount(v: number): string {
  if (!Number.isFinite(v)) return '–';
  return Math.round(v).toLocaleString('en-US');
}

/** Memory in MiB, no decimals. */
export function fmtMiB(v: number): string {
  return Number.isFinite(v) ? v.toFixed(0) : '–';
}

/** A ratio: two decimals below 10, then fewer. */
export function fmtRatio(v: number): string {
  if (!Number.isFinite(v)) return '–';
  if (v >= 100) return v.toFixed(0);
  if (v >= 10) return v.toFixed(1);
  return v.toFixed(2);
}

/** A small relative number in exponent form. */
export function fmtSci(v: number): string {
  return Number.isFinite(v) ? v.toExponential(1) : '–';
}

/** Largest |a_i − b_i| / |b_i| over the common length; NaN when either is empty. */
export function maxRelativeDifference(a: readonly number[], b: readonly number[]): number {
  const n = Math.min(a.length, b.length);
  if (n === 0) return Number.NaN;
  let worst = 0;
  for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]) / Math.max(Math.abs(b[i]), Number.MIN_VALUE));
  return worst;
}
