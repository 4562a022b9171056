/**
 * SVG chart of a steady harmonic response: the amplitude of one DOF against the excitation
 * frequency, with excitation bands shaded behind the curve, the natural frequencies as dashed
 * guides, an optional limit line (e.g. a comfort limit the user gives), and the peak marked.
 */
import { ArgumentError } from '../errors';
import type { ExcitationBand } from '../modal/bands';
import type { HarmonicResult } from '../modal/harmonic';
import { escapeXml, FONT, label, PALETTE, px } from './svg-common';

/** Amplitude drawn. */
export type ResponseQuantity = 'displacement' | 'velocity' | 'acceleration';

/** Options of {@link frequencyResponseSvg}. */
export interface FrequencyResponseSvgOptions {
  /** Which response of the result (index into `result.responses`). @defaultValue 0 */
  response?: number;
  /** Amplitude drawn. @defaultValue 'acceleration' */
  quantity?: ResponseQuantity;
  /** Vertical scale. @defaultValue 'log' (peaks and the floor between them both stay readable) */
  scale?: 'linear' | 'log';
  /** Bands shaded behind the curve (clipped to the frequency range; those outside it are left out). @defaultValue none */
  bands?: readonly ExcitationBand[];
  /** Natural frequencies drawn as dashed guides, Hz (those outside the range are left out). @defaultValue none */
  naturalFrequencies?: ArrayLike<number>;
  /** A horizontal limit line in the unit of the quantity (e.g. a comfort limit in m/s²). @defaultValue none */
  limit?: number;
  /** Picture width, px. @defaultValue 640 */
  width?: number;
  /** Picture height, px. @defaultValue 340 */
  height?: number;
  /** Title above the chart (plain text). @defaultValue 'Frequency response' plus the node and DOF */
  title?: string;
}

/** Defaults of {@link FrequencyResponseSvgOptions} with a fixed value. */
export const FREQUENCY_RESPONSE_SVG_DEFAULTS = { response: 0, quantity: 'acceleration', scale: 'log', width: 640, height: 340 } as const;

const BAND_FILL = '#e8b04a';

/** Ticks at 1, 2, 5 × 10^k covering [lo, hi] (about `count` of them). */
function niceTicks(lo: number, hi: number, count: number): number[] {
  const span = hi - lo;
  if (!(span > 0)) return [lo];
  const raw = span / Math.max(count, 1);
  const p = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((s) => s * p).find((s) => s >= raw) ?? 10 * p;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + 1e-9 * step; v += step) out.push(Math.abs(v) < 1e-12 * step ? 0 : v);
  return out;
}

/** Tick label: the shortest plain form of the number (2, 0.5, 0.001, 1e-7). */
function tickLabel(v: number): string {
  return String(Number(v.toPrecision(6)));
}

/** The title cut to fit `width` px at 14 px type (about 7.2 px per character). */
function fitTitle(title: string, width: number): string {
  const max = Math.max(8, Math.floor(width / 7.2));
  return title.length <= max ? title : `${title.slice(0, max - 1)}…`;
}

function unitOf(quantity: ResponseQuantity, rotation: boolean): string {
  const base = rotation ? 'rad' : 'm';
  return quantity === 'displacement' ? base : quantity === 'velocity' ? `${base}/s` : `${base}/s²`;
}

/**
 * The chart as one `<svg>` element string. Machine-readable marks: the plot area is
 * `<rect class="plot">`; the curve is `<polyline class="curve">` with one point per frequency of
 * the result; the peak is `<circle class="peak">` with `data-frequency` (Hz) and `data-value`;
 * each band is `<rect class="band">` with `data-band`, `data-f-low` and `data-f-high` (Hz, as
 * given); each natural frequency is `<line class="natural">` with `data-frequency`.
 * @param result - a harmonic response (at least two frequencies)
 * @param options - see {@link FrequencyResponseSvgOptions}
 * @throws ArgumentError (path `response`, `quantity`, `scale`, `limit`, `width`, `height`) for an
 *   index outside the result, an unknown quantity or scale, or an out-of-range size or limit
 */
export function frequencyResponseSvg(result: HarmonicResult, options: FrequencyResponseSvgOptions = {}): string {
  const o = { ...FREQUENCY_RESPONSE_SVG_DEFAULTS, ...options };
  const { width: W, height: H } = o;
  if (!(Number.isFinite(W) && W >= 240)) throw new ArgumentError(`width is ${W}; give at least 240 px`, 'width');
  if (!(Number.isFinite(H) && H >= 160)) throw new ArgumentError(`height is ${H}; give at least 160 px`, 'height');
  if (!Number.isInteger(o.response) || o.response < 0 || o.response >= result.responses.length) {
    throw new ArgumentError(`response ${o.response} is not in 0..${result.responses.length - 1}; pick one of the result's responses`, 'response');
  }
  if (!['displacement', 'velocity', 'acceleration'].includes(o.quantity)) throw new ArgumentError(`"${String(o.quantity)}" is not a quantity; use displacement, velocity or acceleration`, 'quantity');
  if (o.scale !== 'linear' && o.scale !== 'log') throw new ArgumentError(`"${String(o.scale)}" is not a scale; use linear or log`, 'scale');
  if (o.limit !== undefined && !(o.limit > 0 && Number.isFinite(o.limit))) throw new ArgumentError(`limit is ${o.limit}; give a positive amplitude`, 'limit');
  const f = result.frequencies;
  const nf = f.length;
  if (nf < 2) throw new ArgumentError(`the result has ${nf} frequency; a chart needs at least two`, 'response');
  const r = result.responses[o.response];
  const y = r[o.quantity];
  const rotation = r.name.startsWith('r');
  const unit = unitOf(o.quantity, rotation);
  const title = o.title ?? `Frequency response, ${o.quantity} at node ${r.node} ${r.name}`;

  // ---- ranges ----
  const fMin = f[0];
  const fMax = f[nf - 1];
  let peak = 0;
  let yMax = 0;
  let yMinPos = Infinity;
  for (let k = 0; k < nf; k++) {
    if (y[k] > yMax) {
      yMax = y[k];
      peak = k;
    }
    if (y[k] > 0 && y[k] < yMinPos) yMinPos = y[k];
  }
  if (o.limit !== undefined) yMax = Math.max(yMax, o.limit);
  if (!(yMax > 0)) yMax = 1;
  let yLo: number, yHi: number;
  if (o.scale === 'log') {
    yHi = 10 ** Math.ceil(Math.log10(yMax) + 1e-12);
    const floor = Number.isFinite(yMinPos) ? Math.min(yMinPos, o.limit ?? Infinity) : yMax / 1000;
    yLo = 10 ** Math.floor(Math.log10(floor));
    if (yHi / yLo > 1e8) yLo = yHi / 1e8; // keep eight decades at most
    if (yHi <= yLo) yLo = yHi / 10;
  } else {
    yLo = 0;
    const t = niceTicks(0, yMax, 5);
    yHi = t[t.length - 1] >= yMax ? t[t.length - 1] : yMax * 1.05;
  }

  const left = 70, right = 16, top = 34, bottom = 52;
  const pw = W - left - right;
  const ph = H - top - bottom;
  const xOf = (fr: number) => left + (pw * (fr - fMin)) / (fMax - fMin);
  const yOf = (v: number) => {
    const t = o.scale === 'log' ? (Math.log10(Math.max(v, yLo)) - Math.log10(yLo)) / (Math.log10(yHi) - Math.log10(yLo)) : (v - yLo) / (yHi - yLo);
    return top + ph * (1 - Math.min(Math.max(t, 0), 1));
  };

  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${px(W)}" height="${px(H)}" viewBox="0 0 ${px(W)} ${px(H)}" role="img" aria-label="${escapeXml(title)}" font-family="${escapeXml(FONT)}">`);
  out.push(`<title>${escapeXml(title)}</title>`);
  out.push(`<rect x="0" y="0" width="${px(W)}" height="${px(H)}" fill="#ffffff"/>`);
  out.push(`<text x="${px(left)}" y="20" font-size="14" fill="${PALETTE.ink}">${escapeXml(fitTitle(title, W - left - 8))}</text>`);
  out.push(`<rect class="plot" x="${px(left)}" y="${px(top)}" width="${px(pw)}" height="${px(ph)}" fill="none" stroke="#888888" stroke-width="1"/>`);

  // ---- bands (behind everything else) ----
  const bands = (o.bands ?? []).filter((b) => b.fHigh > fMin && b.fLow < fMax);
  if (bands.length > 0) {
    out.push(`<g class="bands" fill="${BAND_FILL}" fill-opacity="0.22" font-size="10" >`);
    bands.forEach((b, i) => {
      const x1 = xOf(Math.max(b.fLow, fMin));
      const x2 = xOf(Math.min(b.fHigh, fMax));
      out.push(`<rect class="band" data-band="${escapeXml(b.name)}" data-f-low="${b.fLow}" data-f-high="${b.fHigh}" x="${px(x1)}" y="${px(top)}" width="${px(Math.max(x2 - x1, 0.5))}" height="${px(ph)}"><title>${escapeXml(`${b.name}: ${b.fLow}–${b.fHigh} Hz`)}</title></rect>`);
      out.push(`<text x="${px(x1 + 3)}" y="${px(top + 12 + 11 * (i % 3))}" fill="#7a5a10" fill-opacity="1">${escapeXml(b.name)}</text>`);
    });
    out.push('</g>');
  }

  // ---- grid and axes ----
  const xt = niceTicks(fMin, fMax, Math.max(2, Math.floor(pw / 80)));
  const yt: number[] = [];
  if (o.scale === 'log') for (let e = Math.round(Math.log10(yLo)); e <= Math.round(Math.log10(yHi)); e++) yt.push(10 ** e);
  else yt.push(...niceTicks(yLo, yHi, 5));
  out.push(`<g class="grid" stroke="${PALETTE.grid}" stroke-width="1">`);
  for (const v of yt) out.push(`<line x1="${px(left)}" y1="${px(yOf(v))}" x2="${px(left + pw)}" y2="${px(yOf(v))}"/>`);
  for (const v of xt) out.push(`<line x1="${px(xOf(v))}" y1="${px(top)}" x2="${px(xOf(v))}" y2="${px(top + ph)}"/>`);
  out.push('</g>');
  out.push(`<g class="axis" font-size="11" fill="#555555">`);
  for (const v of yt) out.push(`<text x="${px(left - 6)}" y="${px(yOf(v) + 4)}" text-anchor="end">${escapeXml(tickLabel(v))}</text>`);
  for (const v of xt) out.push(`<text x="${px(xOf(v))}" y="${px(top + ph + 15)}" text-anchor="middle">${escapeXml(tickLabel(v))}</text>`);
  out.push(`<text x="${px(left + pw / 2)}" y="${px(top + ph + 34)}" text-anchor="middle">excitation frequency, Hz</text>`);
  out.push(`<text x="14" y="${px(top + ph / 2)}" text-anchor="middle" transform="rotate(-90 14 ${px(top + ph / 2)})">${escapeXml(`${o.quantity}, ${unit}`)}</text>`);
  out.push('</g>');

  // ---- natural frequencies ----
  const nat = Array.from(o.naturalFrequencies ?? []).filter((v) => v >= fMin && v <= fMax);
  if (nat.length > 0) {
    out.push(`<g class="naturals" stroke="#777777" stroke-width="1" stroke-dasharray="3 3">`);
    for (const v of nat) out.push(`<line class="natural" data-frequency="${v}" x1="${px(xOf(v))}" y1="${px(top)}" x2="${px(xOf(v))}" y2="${px(top + ph)}"/>`);
    out.push('</g>');
  }

  // ---- limit ----
  if (o.limit !== undefined) {
    out.push(`<line class="limit" data-value="${o.limit}" x1="${px(left)}" y1="${px(yOf(o.limit))}" x2="${px(left + pw)}" y2="${px(yOf(o.limit))}" stroke="#b00020" stroke-width="1.2" stroke-dasharray="6 3"/>`);
    out.push(`<text x="${px(left + pw - 3)}" y="${px(yOf(o.limit) - 4)}" font-size="10" fill="#b00020" text-anchor="end">${escapeXml(`limit ${label(o.limit, 3)} ${unit}`)}</text>`);
  }

  // ---- curve and peak ----
  const pts: string[] = [];
  for (let k = 0; k < nf; k++) pts.push(`${px(xOf(f[k]))},${px(yOf(y[k]))}`);
  out.push(`<polyline class="curve" points="${pts.join(' ')}" fill="none" stroke="${PALETTE.ux}" stroke-width="1.8" stroke-linejoin="round"/>`);
  out.push(`<circle class="peak" data-frequency="${f[peak]}" data-value="${y[peak]}" cx="${px(xOf(f[peak]))}" cy="${px(yOf(y[peak]))}" r="3.5" fill="${PALETTE.uy}"/>`);
  const anchor = xOf(f[peak]) > left + pw * 0.7 ? 'end' : 'start';
  const dx = anchor === 'end' ? -6 : 6;
  out.push(`<text x="${px(xOf(f[peak]) + dx)}" y="${px(Math.max(yOf(y[peak]) - 6, top + 10))}" font-size="10" fill="${PALETTE.ink}" text-anchor="${anchor}">${escapeXml(`peak ${label(y[peak], 3)} ${unit} at ${label(f[peak], 4)} Hz`)}</text>`);
  out.push('</svg>');
  return out.join('\n');
}
