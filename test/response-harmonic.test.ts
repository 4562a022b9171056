import { Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { ArgumentError } from '../src/errors';
import { dampingRatios, rayleighDamping } from '../src/modal/damping';
import { frequencySweep, harmonicResponse, HARMONIC_DEFAULTS } from '../src/modal/harmonic';
import { pedestrianResponse, PEDESTRIAN_DEFAULTS } from '../src/modal/harmonic-pedestrian';
import { assemble } from '../src/model/assemble';
import { toMatrix } from './modal-dense';
import { allModes, complexSolve, portalFrameModel, sdofModel } from './response-helpers';

describe('damping', () => {
  it('Rayleigh coefficients reproduce the two ratios and the equal-ratio closed form', () => {
    // Source: Chopra, Dynamics of Structures, §11.4.1: ζ(ω) = α/(2ω) + βω/2; for ζ at both
    // frequencies, α = 2ζω₁ω₂/(ω₁ + ω₂), β = 2ζ/(ω₁ + ω₂) (equation number from memory).
    const d = rayleighDamping(1.5, 0.02, 12, 0.02);
    const w1 = 2 * Math.PI * 1.5;
    const w2 = 2 * Math.PI * 12;
    expect(d.alpha).toBeCloseTo((2 * 0.02 * w1 * w2) / (w1 + w2), 12);
    expect(d.beta).toBeCloseTo((2 * 0.02) / (w1 + w2), 14);
    const z = dampingRatios(d, [w1, w2, Math.sqrt(w1 * w2)]);
    expect(z[0]).toBeCloseTo(0.02, 14);
    expect(z[1]).toBeCloseTo(0.02, 14);
    // Between the two frequencies the ratio dips below ζ (Chopra §11.4.1, Fig. 11.4.1).
    expect(z[2]).toBeLessThan(0.02);
    const u = rayleighDamping(2, 0.01, 8, 0.03);
    const zu = dampingRatios(u, [4 * Math.PI, 16 * Math.PI]);
    expect(zu[0]).toBeCloseTo(0.01, 14);
    expect(zu[1]).toBeCloseTo(0.03, 14);
  });

  it('rejects bad damping with the offending item in the path', () => {
    expect(() => dampingRatios({ kind: 'constant', ratio: 1.2 }, [1])).toThrow(ArgumentError);
    try {
      dampingRatios({ kind: 'modal', ratios: [0.02, -0.01] }, [1, 2]);
      expect.unreachable();
    } catch (e) {
      expect((e as ArgumentError).path).toBe('damping.ratios[1]');
    }
    try {
      rayleighDamping(2, 0.05, 8, 0.001);
      expect.unreachable();
    } catch (e) {
      expect((e as ArgumentError).path).toBe('zeta2');
    }
  });
});

describe('harmonic response', () => {
  it('one mass on a spring: amplitude and phase follow the dynamic amplification factor', () => {
    // Source: Chopra §3.2 (from memory): u₀ = (p₀/k) R_d, R_d = 1/√((1 − r²)² + (2ζr)²),
    // phase lag φ = atan2(2ζr, 1 − r²), r = Ω/ω.
    const k = 4.0e5;
    const m = 250;
    const zeta = 0.05;
    const a = allModes(sdofModel(k, m));
    const fn = Math.sqrt(k / m) / (2 * Math.PI);
    const ratios = [0, 0.3, 0.9, 1, 1.1, 2.5, 6];
    const p0 = 1000;
    const r = harmonicResponse(a, {
      load: [{ node: 'a', dof: 'ux', value: p0 }],
      at: [{ node: 'a', dof: 'ux' }],
      frequencies: ratios.map((x) => x * fn),
      damping: { kind: 'constant', ratio: zeta },
    });
    const res = r.responses[0];
    ratios.forEach((x, i) => {
      const Rd = 1 / Math.sqrt((1 - x * x) ** 2 + (2 * zeta * x) ** 2);
      const lag = Math.atan2(2 * zeta * x, 1 - x * x);
      expect(res.displacement[i]).toBeCloseTo((p0 / k) * Rd, 14);
      expect(res.phase[i]).toBeCloseTo(-lag, 12);
      const W = 2 * Math.PI * x * fn;
      expect(res.acceleration[i]).toBeCloseTo(W * W * (p0 / k) * Rd, 10);
    });
    // At resonance R_d = 1/(2ζ) = 10 (Chopra §3.2).
    expect(res.displacement[3] / (p0 / k)).toBeCloseTo(10, 12);
  });

  it('all modes of a portal frame agree with a dense solve of (K − Ω²M + iΩC) U = F, Rayleigh C', () => {
    // Source: ml-matrix LU solve of the complex system written as a real 2n × 2n one; with
    // C = αM + βK the modes uncouple exactly (Chopra §11.4.1), so superposition of all n modes
    // must agree to round-off.
    const asm = assemble(portalFrameModel(3));
    const a = allModes(asm);
    const n = asm.dofs.length;
    const damping = rayleighDamping(a.modes[0].frequency, 0.02, a.modes[4].frequency, 0.03);
    const K = toMatrix(asm.stiffness);
    const M = toMatrix(asm.mass);
    const F = new Float64Array(n);
    const iB = asm.dofs.findIndex((d) => d.node === 'B' && d.dof === 'ux');
    const iM = asm.dofs.findIndex((d) => d.node === 'b2' && d.dof === 'uy');
    expect(iB).toBeGreaterThanOrEqual(0);
    expect(iM).toBeGreaterThanOrEqual(0);
    F[iB] = 800;
    F[iM] = -1500;
    const freqs = [0.5 * a.modes[0].frequency, a.modes[0].frequency, a.modes[1].frequency * 1.03, a.modes[3].frequency];
    const all = Array.from({ length: n }, (_, i) => i);
    const r = harmonicResponse(a, { load: F, at: all, frequencies: freqs, damping });
    expect(r.modesUsed).toBe(n);
    freqs.forEach((f, k) => {
      const W = 2 * Math.PI * f;
      const A = K.clone().sub(M.clone().mul(W * W));
      const B = M.clone().mul(damping.alpha).add(K.clone().mul(damping.beta)).mul(W);
      const ref = complexSolve(A, B, F);
      const scale = Math.max(...ref.re.map((v, i) => Math.hypot(v, ref.im[i])));
      for (let i = 0; i < n; i++) {
        expect(Math.abs(r.responses[i].real[k] - ref.re[i]) / scale).toBeLessThan(1e-8);
        expect(Math.abs(r.responses[i].imag[k] - ref.im[i]) / scale).toBeLessThan(1e-8);
      }
    });
  });

  it('sweep merges natural frequencies and validates its range', () => {
    const s = frequencySweep(1, 3, 5, { include: [1.25, 2.2, 7] });
    expect(Array.from(s)).toEqual([1, 1.25, 1.5, 2, 2.2, 2.5, 3]);
    const lg = frequencySweep(1, 100, 3, { spacing: 'log' });
    expect(lg[1]).toBeCloseTo(10, 12);
    try {
      frequencySweep(3, 1, 5);
      expect.unreachable();
    } catch (e) {
      expect((e as ArgumentError).path).toBe('to');
    }
  });

  it('names the bad response DOF and the missing load', () => {
    const a = allModes(sdofModel(1e5, 100));
    try {
      harmonicResponse(a, { load: [{ node: 'a', dof: 'ux', value: 1 }], at: [{ node: 'zz', dof: 'ux' }], frequencies: [1] });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('at[0]');
      expect((e as ArgumentError).message).toContain('"zz"');
    }
    try {
      harmonicResponse(a, { load: [{ node: 'a', dof: 'uy', value: 1 }], at: [0], frequencies: [1] });
      expect.unreachable();
    } catch (e) {
      expect((e as ArgumentError).path).toBe('load[0].dof');
    }
    expect(HARMONIC_DEFAULTS.damping).toEqual({ kind: 'constant', ratio: 0.01 });
  });
});

describe('pedestrian load at an antinode', () => {
  it('one mass on a spring at resonance: a = F/(2ζm), the single-mode estimate', () => {
    // Source: Chopra §3.2 (R_d = 1/(2ζ) at resonance) with F = 700 N × 0.4 = 280 N, the
    // single-walker vertical amplitude of the Sétra 2006 guide (from memory). The model's
    // "vertical" is y in the plane, so the mass moves along uy here.
    const asm = sdofModel(2.0e6, 5000);
    const vertical = { ...asm, dofs: [{ ...asm.dofs[0], dof: 'uy' as const }] };
    const a = allModes(vertical);
    const r = pedestrianResponse(a, { mode: 1, damping: { kind: 'constant', ratio: 0.005 }, comfortLimit: 0.7 });
    expect(r.direction).toBe('vertical');
    expect(r.force).toBeCloseTo(280, 12);
    expect(r.acceleration).toBeCloseTo(280 / (2 * 0.005 * 5000), 10);
    expect(r.singleModeAcceleration).toBeCloseTo(r.acceleration, 10);
    expect(r.verdict).toBe('exceeds-limit'); // 5.6 m/s² against 0.7 m/s²
    expect(PEDESTRIAN_DEFAULTS.weight * PEDESTRIAN_DEFAULTS.dynamicLoadFactor.lateral).toBeCloseTo(35, 12); // Sétra 2006, from memory
  });
});
