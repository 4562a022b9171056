/**
 * SVG chart of effective modal mass: for each translational direction, the share each mode
 * carries (thin bars) and the cumulative share over modes 1..j (a line with markers), with the
 * 90 % level that seismic checks commonly ask the retained modes to reach (common practice).
 */
import { ArgumentError } from '../errors';
import type { Direction, ModalAnalysis } from '../modal/analysis-types';
import { escapeXml, FONT, PALETTE, px } from './svg-common';

/** Options of {@link effectiveMassChartSvg}. */
export interface MassChartOptions {
  /** Picture width, px. @defaultValue 640 */
  width?: number;
  /** Picture height, px. @defaultValue 320 */
  height?: number;
  /** Directions drawn. @defaultValue the translations of the analysis (ux uy in the plane, ux uy uz in space) */
  directions?: readonly Direction[];
  /** Level drawn as a dashed guide, 0..1. @defaultValue 0.9 (common practice) */
  target?: number;
  /** Title above the chart (plain text). @defaultValue 'Cumulative effective mass' */
  title?: string;
}

/** Defaults of {@link MassChartOptions} with a fixed value. */
export const MASS_CHART_DEFAULTS = { width: 640, height: 320, target: 0.9, title: 'Cumulative effective mass' } as const;

/**
 * The chart as one `<svg>` element string. Markers carry `data-direction`, `data-mode` and
 * `data-value` (the cumulative ratio, 0..1) for machine reading.
 * @param analysis - the modal analysis (modes with effectiveMassRatio and cumulativeRatio)
 * @param options - see {@link MassChartOptions}
 * @throws ArgumentError (path `directions[i]`, `width`, `height`, `target`) for a direction the
 *   analysis does not report or an out-of-range size or target
 */
export function effectiveMassChartSvg(analysis: ModalAnalysis, options: MassChartOptions = {}): string {
  const W = options.width ?? MASS_CHART_DEFAULTS.width;
  const H = options.height ?? MASS_CHART_DEFAULTS.height;
  const target = options.target ?? MASS_CHART_DEFAULTS.target;
  const title = options.title ?? MASS_CHART_DEFAULTS.title;
  if (!(Number.isFinite(W) && W >= 200)) throw new ArgumentError(`width is ${W}; give at least 200 px`, 'width');
  if (!(Number.isFinite(H) && H >= 150)) throw new ArgumentError(`height is ${H}; give at least 150 px`, 'height');
  if (!(target >= 0 && target <= 1)) throw new ArgumentError(`target is ${target}; give a share from 0 to 1`, 'target');
  const dirs = options.directions ?? analysis.directions.filter((d) => d === 'ux' || d === 'uy' || d === 'uz');
  dirs.forEach((d, i) => {
    if (!analysis.directions.includes(d)) throw new ArgumentError(`direction "${d}" is not reported by this analysis; use one of ${analysis.directions.join(', ')}`, `directions[${i}]`);
  });
  const modes = analysis.modes;
  const m = modes.length;
  const left = 52, right = 16, top = 34, bottom = 58;
  const pw = W - left - right;
  const ph = H - top - bottom;
  const slot = m > 0 ? pw / m : pw;
  const xOf = (j: number) => left + slot * (j + 0.5); // j: 0-based mode index
  const yOf = (r: number) => top + ph * (1 - Math.min(Math.max(r, 0), 1));
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${px(W)}" height="${px(H)}" viewBox="0 0 ${px(W)} ${px(H)}" role="img" aria-label="${escapeXml(title)}" font-family="${escapeXml(FONT)}">`);
  out.push(`<title>${escapeXml(title)}</title>`);
  out.push(`<rect x="0" y="0" width="${px(W)}" height="${px(H)}" fill="#ffffff"/>`);
  out.push(`<text x="${px(left)}" y="20" font-size="14" fill="${PALETTE.ink}">${escapeXml(title)}</text>`);
  // ---- grid and axes ----
  out.push(`<g class="grid" stroke="${PALETTE.grid}" stroke-width="1">`);
  for (const r of [0, 0.25, 0.5, 0.75, 1]) out.push(`<line x1="${px(left)}" y1="${px(yOf(r))}" x2="${px(left + pw)}" y2="${px(yOf(r))}"/>`);
  out.push('</g>');
  out.push(`<g class="axis" font-size="11" fill="#555555" text-anchor="end">`);
  for (const r of [0, 0.25, 0.5, 0.75, 1]) out.push(`<text x="${px(left - 6)}" y="${px(yOf(r) + 4)}">${Math.round(100 * r)} %</text>`);
  out.push('</g>');
  const every = Math.max(1, Math.ceil(m / Math.max(1, Math.floor(pw / 28))));
  out.push(`<g class="modes" font-size="11" fill="#555555" text-anchor="middle">`);
  for (let j = 0; j < m; j++) if (j % every === 0 || j === m - 1) out.push(`<text x="${px(xOf(j))}" y="${px(top + ph + 15)}">${modes[j].mode}</text>`);
  out.push(`<text x="${px(left + pw / 2)}" y="${px(top + ph + 32)}">mode</text>`);
  out.push('</g>');
  out.push(`<line x1="${px(left)}" y1="${px(top + ph)}" x2="${px(left + pw)}" y2="${px(top + ph)}" stroke="#888888" stroke-width="1"/>`);
  // ---- target level ----
  out.push(`<line class="target" x1="${px(left)}" y1="${px(yOf(target))}" x2="${px(left + pw)}" y2="${px(yOf(target))}" stroke="#888888" stroke-width="1" stroke-dasharray="5 4"/>`);
  out.push(`<text x="${px(left + pw - 2)}" y="${px(yOf(target) - 4)}" font-size="10" fill="#666666" text-anchor="end">${Math.round(100 * target)} %</text>`);
  // ---- per-mode bars, then cumulative lines ----
  const nd = Math.max(dirs.length, 1);
  const bw = Math.min(10, (0.7 * slot) / nd);
  dirs.forEach((d, k) => {
    const colour = PALETTE[d];
    out.push(`<g class="share" data-direction="${d}" fill="${colour}" fill-opacity="0.28">`);
    for (let j = 0; j < m; j++) {
      const r = modes[j].effectiveMassRatio[d] ?? 0;
      const x = xOf(j) - (nd * bw) / 2 + k * bw;
      const y = yOf(r);
      out.push(`<rect data-mode="${modes[j].mode}" data-value="${r}" x="${px(x)}" y="${px(y)}" width="${px(bw)}" height="${px(top + ph - y)}"/>`);
    }
    out.push('</g>');
  });
  dirs.forEach((d) => {
    const colour = PALETTE[d];
    const pts = modes.map((md, j) => `${px(xOf(j))},${px(yOf(md.cumulativeRatio[d] ?? 0))}`);
    out.push(`<g class="cumulative" data-direction="${d}" stroke="${colour}" fill="${colour}">`);
    if (m > 0) out.push(`<polyline points="${pts.join(' ')}" fill="none" stroke-width="2"/>`);
    modes.forEach((md, j) => {
      const r = md.cumulativeRatio[d] ?? 0;
      out.push(`<circle data-direction="${d}" data-mode="${md.mode}" data-value="${r}" cx="${px(xOf(j))}" cy="${px(yOf(r))}" r="3" stroke="none"/>`);
    });
    out.push('</g>');
  });
  // ---- legend ----
  out.push(`<g class="legend" font-size="11" fill="#333333">`);
  let lx = left;
  const ly = H - 10;
  for (const d of dirs) {
    const last = m > 0 ? modes[m - 1].cumulativeRatio[d] ?? 0 : 0;
    const text = `${d}: ${(100 * last).toFixed(1)} % after ${m} mode${m === 1 ? '' : 's'}`;
    out.push(`<rect x="${px(lx)}" y="${px(ly - 9)}" width="10" height="10" fill="${PALETTE[d]}"/>`);
    out.push(`<text x="${px(lx + 14)}" y="${px(ly)}">${escapeXml(text)}</text>`);
    lx += 14 + 6.2 * text.length + 18;
  }
  out.push('</g>');
  out.push('</svg>');
  return out.join('\n');
}
