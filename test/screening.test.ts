import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { modalAnalysis } from '../src/modal/analysis';
import { BAND_PRESETS, machineBand, MACHINE_BAND_DEFAULTS, validateBands, type BandSpec } from '../src/modal/bands';
import { classifyModes, CLASSIFY_DEFAULTS } from '../src/modal/classify';
import { pedestrianResponse } from '../src/modal/harmonic-pedestrian';
import { screenResonance, SCREENING_DEFAULTS } from '../src/modal/screening';
import { formatScreeningText, screeningJsonObject } from '../src/io/report-screening';
import { ENGINEERING_CAUTION } from '../src/io/caution';
import { parseModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import { planeBeamModel } from './model-helpers';
import { portalFrameModel } from './response-helpers';
import { pathOf } from './argument-path';

const footbridge = parseModel(readFileSync(new URL('../examples/footbridge.json', import.meta.url), 'utf8'), 'footbridge.json');

/** The model with E and G scaled by s: K scales by s, M is unchanged, so every f scales by √s. */
function scaled(model: Model, s: number): Model {
  const materials = Object.fromEntries(Object.entries(model.materials).map(([k, m]) => [k, { ...m, E: m.E * s, ...(m.G !== undefined ? { G: m.G * s } : {}) }]));
  return { ...model, materials };
}

describe('excitation bands', () => {
  it('presets are valid, sourced, and flagged as recalled', () => {
    const all = validateBands(Object.values(BAND_PRESETS));
    expect(all.length).toBe(6);
    for (const b of all) {
      expect(b.source.length).toBeGreaterThan(10);
      expect(b.fromMemory).toBe(true);
    }
    // Walking pace 1.6–2.4 Hz (Bachmann & Ammann 1987, from memory); second harmonic doubled.
    expect(BAND_PRESETS['walking-vertical-2'].fLow).toBeCloseTo(2 * BAND_PRESETS['walking-vertical'].fLow, 12);
    expect(BAND_PRESETS['walking-vertical-2'].fHigh).toBeCloseTo(2 * BAND_PRESETS['walking-vertical'].fHigh, 12);
  });

  it('machine band: f = rpm/60 ± tolerance', () => {
    // Source: definition of rotational speed; 1480 rpm = 24.667 Hz.
    const b = machineBand(1480, { tolerancePercent: 10 });
    expect(b.fLow).toBeCloseTo((1480 / 60) * 0.9, 12);
    expect(b.fHigh).toBeCloseTo((1480 / 60) * 1.1, 12);
    expect(b.directions).toEqual(['any']);
    expect(machineBand(1480, { harmonic: 2 }).fHigh).toBeCloseTo((2 * 1480 / 60) * 1.1, 12);
    expect(MACHINE_BAND_DEFAULTS.tolerancePercent).toBe(10);
    expect(pathOf(() => machineBand(-3))).toBe('rpm');
  });

  it('errors name the band', () => {
    const pump = (o: Partial<BandSpec>): BandSpec[] => [{ name: 'pump', fLow: 8, fHigh: 12, directions: ['any'], ...o }];
    expect(pathOf(() => validateBands(pump({ fHigh: 7 })))).toBe('band "pump".fHigh');
    expect(pathOf(() => validateBands(pump({ fLow: -1 })))).toBe('band "pump".fLow');
    expect(pathOf(() => validateBands(pump({ directions: ['upward' as never] })))).toBe('band "pump".directions[0]');
    expect(pathOf(() => validateBands(pump({ directions: [] })))).toBe('band "pump".directions');
    expect(pathOf(() => validateBands([...pump({}), ...pump({})]))).toBe('band "pump".name');
    expect(pathOf(() => validateBands([{ name: '', fLow: 1, fHigh: 2, directions: ['any'] }]))).toBe('bands[0].name');
    expect(pathOf(() => validateBands([]))).toBe('bands');
    try {
      validateBands(pump({ fHigh: 7 }));
    } catch (e) {
      expect((e as Error).message).toContain('7 Hz');
    }
  });
});

describe('classification of modes', () => {
  const analysis = modalAnalysis(footbridge, { count: 8 });
  const cls = classifyModes(analysis);

  it('footbridge: axes, and directions that agree with the effective mass where it is clear', () => {
    expect(cls.axes.torsionAxis).toBe('longitudinal');
    expect(Math.abs(cls.axes.longitudinal[0])).toBeCloseTo(1, 9); // the span runs along x
    let checked = 0;
    cls.modes.forEach((m, j) => {
      const r = analysis.modes[j].effectiveMassRatio;
      const sum = m.shares.vertical + m.shares.lateral + m.shares.longitudinal + m.shares.torsional;
      expect(sum).toBeCloseTo(1, 12);
      // A mode carrying ≥ 60 % of the mass in one global direction moves mainly that way.
      if ((r.uz ?? 0) >= 0.6) {
        expect(m.direction).toBe('vertical');
        checked++;
      }
      if ((r.uy ?? 0) >= 0.6) {
        expect(m.direction).toBe('lateral');
        checked++;
      }
      if ((r.rx ?? 0) >= 0.6) {
        expect(m.direction).toBe('torsional'); // rotation about the span axis
        checked++;
      }
    });
    expect(checked).toBeGreaterThanOrEqual(3); // uz, uy and rx modes all present in the lowest 8
    // The 70 % uz mode of the brief.
    const v = analysis.modes.findIndex((m) => (m.effectiveMassRatio.uz ?? 0) >= 0.7);
    expect(v).toBeGreaterThanOrEqual(0);
    expect(cls.modes[v].direction).toBe('vertical');
    expect(cls.modes[v].massRatios.vertical).toBeGreaterThanOrEqual(0.7);
  });

  it('plane models: a beam bends vertically, a portal frame sways longitudinally', () => {
    const beam = modalAnalysis(planeBeamModel({ elements: 8, L: 10, E: 2.1e11, density: 7850, A: 0.01, I: 1e-4, left: ['uy'], right: ['uy'] }), { count: 3 });
    const cb = classifyModes(beam);
    expect(cb.axes.lateral).toBeNull();
    for (const m of cb.modes) {
      expect(m.direction).toBe('vertical');
      expect(m.shares.vertical).toBeCloseTo(1, 12); // ux is fixed, so all kinetic energy is in uy
    }
    const frame = classifyModes(modalAnalysis(portalFrameModel(2), { count: 2 }));
    expect(frame.modes[0].direction).toBe('longitudinal'); // first mode of a portal: sway along x
    expect(frame.modes[0].shares.longitudinal).toBeGreaterThan(0.9);
    expect(CLASSIFY_DEFAULTS.stationTolerance).toBe(0.01);
  });
});

describe('resonance screening of the demo footbridge', () => {
  it('a vertical mode moved into the second walking harmonic is found, and a stiffness change by the reported factor clears it', () => {
    // Softening E and G by s scales every frequency by √s (K → sK, M unchanged); put the lowest
    // vertical mode at 4.6 Hz, inside 3.2–4.8 Hz (walking-vertical-2, from memory).
    const base = classifyModes(modalAnalysis(footbridge, { count: 8 }));
    const v = base.modes.find((m) => m.direction === 'vertical')!;
    const s = (4.6 / v.frequency) ** 2;
    const soft = modalAnalysis(scaled(footbridge, s), { count: 12 });
    const bands = [BAND_PRESETS['walking-vertical'], BAND_PRESETS['walking-vertical-2']];
    const r = screenResonance(soft, bands);
    expect(r.verdict).toBe('in-band');
    expect(r.coverage.complete).toBe(true);
    const hit = r.modes[v.mode - 1];
    expect(hit.frequency).toBeCloseTo(4.6, 6);
    expect(hit.verdict).toBe('in-band');
    const c = hit.checks.find((k) => k.band === 'walking-vertical-2')!;
    expect(c.status).toBe('inside');
    expect(c.directions).toContain('vertical');
    expect(c.marginHz).toBeCloseTo(-0.2, 6); // 0.2 Hz below the upper edge 4.8 Hz
    // Nearer target: 4.8·1.1 = 5.28 Hz (ratio 1.148) rather than 3.2·0.9 = 2.88 Hz (ratio 1.597).
    expect(c.target).toBeCloseTo(4.8 * (1 + SCREENING_DEFAULTS.clearance), 12);
    expect(c.stiffnessFactor).toBeCloseTo((5.28 / 4.6) ** 2, 6);
    // Stiffen by that factor (and 0.1 % more): the mode moves to the target and the screen clears.
    const stiff = modalAnalysis(scaled(footbridge, s * c.stiffnessFactor * 1.001), { count: 12 });
    const after = screenResonance(stiff, bands);
    expect(after.modes[v.mode - 1].frequency).toBeCloseTo(5.28 * Math.sqrt(1.001), 5);
    expect(after.verdict).toBe('clear');
    expect(after.coverage.complete).toBe(true);
    // Report: findings, sources and the engineering caution.
    const text = formatScreeningText(r);
    expect(text).toContain('inside "walking-vertical-2"');
    expect(text).toContain('(from memory)');
    expect(text).toContain(ENGINEERING_CAUTION);
    const json = JSON.parse(JSON.stringify(screeningJsonObject(r)));
    expect(json.verdict).toBe('in-band');
    expect(json.caution).toBe(ENGINEERING_CAUTION);
  });

  it('a machine band catches modes of any direction; coverage says when modes are missing', () => {
    const a = modalAnalysis(footbridge, { count: 3 });
    const f3 = a.modes[2].frequency;
    const r = screenResonance(a, [machineBand(60 * f3, { tolerancePercent: 5 })]);
    expect(r.modes[2].verdict).toBe('in-band');
    expect(r.modes[2].checks[0].marginHz).toBeCloseTo(-0.05 * f3, 9);
    // Modes up to 1.05·1.1·f3 matter, but only three were computed.
    expect(r.coverage.complete).toBe(false);
    expect(formatScreeningText(r)).toContain('Coverage INCOMPLETE');
    expect(pathOf(() => screenResonance(a, [BAND_PRESETS.jogging], { clearance: 1.5 }))).toBe('clearance');
  });

  it('walker at the antinode of the vertical mode: resonant mode dominates, load frequency flagged', () => {
    // With 1 % damping the resonant mode's amplification is 1/(2ζ) = 50 (Chopra §3.2), so the
    // superposed acceleration stays close to the single-mode estimate F φ²/(2ζ).
    const a = modalAnalysis(footbridge, { count: 12 });
    const v = classifyModes(a).modes.find((m) => m.direction === 'vertical' && m.massRatios.vertical > 0.5)!;
    const r = pedestrianResponse(a, { mode: v.mode, comfortLimit: 0.7 });
    expect(r.dofName).toBe('uz');
    expect(r.force).toBeCloseTo(280, 12);
    expect(r.acceleration / r.singleModeAcceleration!).toBeGreaterThan(0.8);
    expect(r.acceleration / r.singleModeAcceleration!).toBeLessThan(1.25);
    expect(r.warnings.length).toBe(1); // ≈ 9.7 Hz is far above the walking pace band
    expect(pathOf(() => pedestrianResponse(a, { mode: 99 }))).toBe('mode');
    expect(pathOf(() => pedestrianResponse(a, { mode: 1, nodes: ['nope'] }))).toBe('nodes[0]');
  });
});
