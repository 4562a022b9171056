import { describe, expect, it } from 'vitest';
import { ArgumentError } from '../src/errors';
import { combineModal, cqcCorrelation } from '../src/modal/spectrum-combination';
import { designSpectrum, responseSpectrum, spectralAcceleration, STANDARD_GRAVITY, RESPONSE_SPECTRUM_DEFAULTS } from '../src/modal/spectrum';
import { allModes, sdofModel, shearBuilding } from './response-helpers';

describe('modal combination', () => {
  it('Der Kiureghian correlation: equal-damping form, ρ = 1 at equal frequencies, symmetric', () => {
    // Source: Der Kiureghian (1981), EESD 9:419–435; equal-damping form as in Chopra,
    // Dynamics of Structures, §13.7.3 (from memory): ρ = 8ζ²(1+r)r^{3/2} / ((1−r²)² + 4ζ²r(1+r)²).
    const z = 0.05;
    for (const r of [0.3, 0.8, 0.95, 1, 1.1, 2]) {
      const eq = (8 * z * z * (1 + r) * r ** 1.5) / ((1 - r * r) ** 2 + 4 * z * z * r * (1 + r) ** 2);
      expect(cqcCorrelation(10, 10 * r, z, z)).toBeCloseTo(eq, 14);
    }
    expect(cqcCorrelation(7, 7, 0.02, 0.02)).toBeCloseTo(1, 14);
    expect(cqcCorrelation(7, 9, 0.02, 0.05)).toBeCloseTo(cqcCorrelation(9, 7, 0.05, 0.02), 14);
    // Closely spaced modes are strongly correlated, well-separated ones hardly at all.
    expect(cqcCorrelation(10, 10.5, 0.05, 0.05)).toBeGreaterThan(0.8);
    expect(cqcCorrelation(10, 30, 0.05, 0.05)).toBeLessThan(0.01);
  });

  it('CQC = SRSS for well-separated frequencies; CQC = absolute sum for identical ones', () => {
    // Properties that follow from ρ → 0 and ρ = 1 (not a worked example from the literature).
    const v = [3, -2, 1.5];
    const srss = Math.sqrt(9 + 4 + 2.25);
    expect(combineModal(v, 'srss', [1, 2, 3], [0.05, 0.05, 0.05])).toBeCloseTo(srss, 14);
    const sep = combineModal(v, 'cqc', [1, 10, 100], [0.02, 0.02, 0.02]);
    expect(Math.abs(sep - srss) / srss).toBeLessThan(1e-3);
    expect(combineModal([2, 2, 2], 'cqc', [5, 5, 5], [0.05, 0.05, 0.05])).toBeCloseTo(6, 12);
    // Opposite signs at equal frequencies cancel.
    expect(combineModal([2, -2], 'cqc', [5, 5], [0.05, 0.05])).toBeCloseTo(0, 7);
  });
});

describe('design spectrum', () => {
  it('interpolates linearly, holds the ends, converts g', () => {
    const s = designSpectrum(
      [
        { period: 0, acceleration: 0.2 },
        { period: 0.1, acceleration: 0.5 },
        { period: 0.5, acceleration: 0.5 },
        { period: 2, acceleration: 0.125 },
      ],
      { unit: 'g' },
    );
    expect(spectralAcceleration(s, 0.05)).toBeCloseTo(0.35 * STANDARD_GRAVITY, 12);
    expect(spectralAcceleration(s, 1.25)).toBeCloseTo(0.3125 * STANDARD_GRAVITY, 12);
    expect(spectralAcceleration(s, 5)).toBeCloseTo(0.125 * STANDARD_GRAVITY, 12);
    const strict = designSpectrum([{ period: 0.1, acceleration: 1 }, { period: 1, acceleration: 1 }], { beyond: 'error' });
    expect(() => spectralAcceleration(strict, 2)).toThrow(ArgumentError);
    try {
      designSpectrum([{ period: 0.5, acceleration: 1 }, { period: 0.2, acceleration: 1 }]);
      expect.unreachable();
    } catch (e) {
      expect((e as ArgumentError).path).toBe('spectrum[1].period');
    }
  });
});

describe('response spectrum analysis', () => {
  const flat = designSpectrum([{ period: 0, acceleration: 3 }, { period: 10, acceleration: 3 }]);

  it('one mass on a spring: base shear m·A and peak displacement A/ω²', () => {
    // Source: Chopra §6.6 (from memory): V_b = m A, u₀ = D = A/ω² for a single-DOF system.
    const r = responseSpectrum(allModes(sdofModel(2e6, 3000)), flat, { direction: 'ux', at: [{ node: 'a', dof: 'ux' }] });
    expect(r.baseShear.ux).toBeCloseTo(3000 * 3, 9);
    expect(r.at[0].displacement).toBeCloseTo(3 / (2e6 / 3000), 12);
    expect(r.massCaptured).toBeCloseTo(1, 12);
  });

  it('all modes: modal base shears add up to total mass × A and SRSS/CQC bound it', () => {
    // Source: Chopra §13.2: Σ m_eff,j = total mass, so with a flat spectrum the algebraic
    // sum of the modal base shears is M_total · A; every combined value is ≤ the absolute sum.
    const a = allModes(shearBuilding([4e7, 3e7, 2e7, 1e7, 1e7], [3e4, 3e4, 2.5e4, 2.5e4, 2e4]));
    const total = 3e4 + 3e4 + 2.5e4 + 2.5e4 + 2e4;
    for (const rule of ['srss', 'cqc'] as const) {
      const r = responseSpectrum(a, flat, { direction: 'ux', rule });
      const sum = r.modal.reduce((s, md) => s + (md.baseShear.ux ?? 0), 0);
      expect(sum / (total * 3)).toBeCloseTo(1, 10);
      const abs = r.modal.reduce((s, md) => s + Math.abs(md.baseShear.ux ?? 0), 0);
      expect(r.baseShear.ux).toBeLessThanOrEqual(abs);
      expect(r.baseShear.ux).toBeGreaterThan(Math.abs(r.modal[0].baseShear.ux ?? 0) * 0.999);
      expect(r.massCaptured).toBeCloseTo(1, 10);
      expect(r.totalMass).toBeCloseTo(total, 6);
    }
    const two = responseSpectrum(a, flat, { direction: 'ux', count: 2 });
    expect(two.massCaptured).toBeCloseTo((a.modes[1].cumulativeRatio.ux ?? 0), 12);
    expect(RESPONSE_SPECTRUM_DEFAULTS.rule).toBe('cqc');
  });

  it('rejects a rotation as the ground-motion direction', () => {
    try {
      responseSpectrum(allModes(sdofModel(1, 1)), flat, { direction: 'rz' });
      expect.unreachable();
    } catch (e) {
      expect((e as ArgumentError).path).toBe('direction');
    }
  });
});
