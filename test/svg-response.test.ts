/** Frequency-response chart (src/io/svg-response.ts): well-formed, curve and marks where the numbers put them. */
import { describe, expect, it } from 'vitest';
import { frequencyResponseSvg } from '../src/io/svg-response';
import { validateBand } from '../src/modal/bands';
import { frequencySweep, harmonicResponse } from '../src/modal/harmonic';
import { allModes, sdofModel } from './response-helpers';
import { findAll, parseXml, type XmlElement } from './svg-helpers';
import { pathOf } from './argument-path';

// One mass on a spring (invented numbers): k = 1e5 N/m, m = 100 kg → ωₙ = 31.62 rad/s, fₙ = 5.033 Hz.
const k = 1e5, m = 100, zeta = 0.02, p0 = 250;
const fn = Math.sqrt(k / m) / (2 * Math.PI);
// Closed forms (Chopra, Dynamics of Structures, §3.2, from memory): the displacement amplitude
// peaks at fₙ√(1 − 2ζ²) with (p₀/k)/(2ζ√(1 − ζ²)); the acceleration amplitude Ω²|U| peaks at
// fₙ/√(1 − 2ζ²) with (p₀/m)/(2ζ√(1 − ζ²)).
const fDisp = fn * Math.sqrt(1 - 2 * zeta * zeta);
const fAcc = fn / Math.sqrt(1 - 2 * zeta * zeta);
const peakDisp = p0 / k / (2 * zeta * Math.sqrt(1 - zeta * zeta));
const peakAcc = p0 / m / (2 * zeta * Math.sqrt(1 - zeta * zeta));

const analysis = allModes(sdofModel(k, m));
const result = harmonicResponse(analysis, {
  load: [{ node: 'a', dof: 'ux', value: p0 }],
  at: [{ node: 'a', dof: 'ux' }],
  frequencies: frequencySweep(1, 10, 400, { include: [fDisp, fAcc, fn] }),
  damping: { kind: 'constant', ratio: zeta },
});
const pump = validateBand({ name: 'pump <A>', fLow: 4.5, fHigh: 5.5, directions: ['any'] });
const low = validateBand({ name: 'walking', fLow: 0.5, fHigh: 2, directions: ['vertical'] });
const far = validateBand({ name: 'far', fLow: 20, fHigh: 25, directions: ['any'] });

const num = (e: XmlElement, a: string): number => Number(e.attrs[a]);
const one = (root: XmlElement, cls: string): XmlElement => {
  const all = findAll(root, (e) => e.attrs.class === cls);
  expect(all).toHaveLength(1);
  return all[0];
};

describe('frequency-response chart', () => {
  it('marks the closed-form peak of acceleration and of displacement', () => {
    const acc = parseXml(frequencyResponseSvg(result));
    const pa = one(acc, 'peak');
    expect(num(pa, 'data-frequency')).toBeCloseTo(fAcc, 12);
    expect(num(pa, 'data-value') / peakAcc).toBeCloseTo(1, 9);
    const dis = parseXml(frequencyResponseSvg(result, { quantity: 'displacement', scale: 'linear' }));
    const pd = one(dis, 'peak');
    expect(num(pd, 'data-frequency')).toBeCloseTo(fDisp, 12);
    expect(num(pd, 'data-value') / peakDisp).toBeCloseTo(1, 9);
  });

  it('places the curve, bands and natural frequencies on the frequency axis', () => {
    const svg = frequencyResponseSvg(result, { bands: [pump, low, far], naturalFrequencies: [fn, 42], limit: 0.5 });
    const root = parseXml(svg);
    expect(root.name).toBe('svg');
    const plot = one(root, 'plot');
    const x0 = num(plot, 'x'), w = num(plot, 'width');
    const y0 = num(plot, 'y'), h = num(plot, 'height');
    const xOf = (f: number) => x0 + (w * (f - 1)) / (10 - 1);
    // One curve point per frequency, left to right, inside the plot area.
    const pts = one(root, 'curve').attrs.points.split(' ').map((p) => p.split(',').map(Number));
    expect(pts).toHaveLength(result.frequencies.length);
    pts.forEach(([x, y], i) => {
      expect(x).toBeCloseTo(xOf(result.frequencies[i]), 1);
      expect(y).toBeGreaterThanOrEqual(y0 - 0.01);
      expect(y).toBeLessThanOrEqual(y0 + h + 0.01);
    });
    // The peak is the highest point of the curve (smallest y on screen).
    const peak = one(root, 'peak');
    expect(num(peak, 'cy')).toBeCloseTo(Math.min(...pts.map((p) => p[1])), 2);
    // Bands: the pump band spans 4.5–5.5 Hz; the walking band is clipped at 1 Hz; "far" is outside.
    const bands = findAll(root, (e) => e.attrs.class === 'band');
    expect(bands.map((b) => b.attrs['data-band'])).toEqual(['pump <A>', 'walking']);
    expect(num(bands[0], 'x')).toBeCloseTo(xOf(4.5), 1);
    expect(num(bands[0], 'width')).toBeCloseTo(xOf(5.5) - xOf(4.5), 1);
    expect(num(bands[1], 'x')).toBeCloseTo(xOf(1), 1);
    expect(num(bands[1], 'x') + num(bands[1], 'width')).toBeCloseTo(xOf(2), 1);
    // The natural frequency inside the range is drawn where it belongs; 42 Hz is not drawn.
    const nat = findAll(root, (e) => e.attrs.class === 'natural');
    expect(nat).toHaveLength(1);
    expect(num(nat[0], 'x1')).toBeCloseTo(xOf(fn), 1);
    expect(one(root, 'limit').attrs['data-value']).toBe('0.5');
    // Text is escaped: the band name with < and > survives the round trip.
    expect(svg).toContain('pump &lt;A&gt;');
  });

  it('names the bad option', () => {
    const path = (o: object): string => pathOf(() => frequencyResponseSvg(result, o));
    expect(path({ response: 1 })).toBe('response');
    expect(path({ quantity: 'force' })).toBe('quantity');
    expect(path({ scale: 'db' })).toBe('scale');
    expect(path({ limit: -1 })).toBe('limit');
    expect(path({ width: 10 })).toBe('width');
  });
});
