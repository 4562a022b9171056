import { Matrix, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { ArgumentError } from '../src/errors';
import { historyValue, transientResponse, TRANSIENT_DEFAULTS, type TransientMethod } from '../src/modal/transient';
import { assemble } from '../src/model/assemble';
import { toMatrix } from './modal-dense';
import { allModes, portalFrameModel, sdofModel, shearBuilding } from './response-helpers';

const k = 1.0e5; // N/m
const m = 100; // kg
const w = Math.sqrt(k / m); // 31.62 rad/s
const T = (2 * Math.PI) / w;
const p0 = 500; // N

function sdofRun(method: TransientMethod, zeta: number, history: { times: number[]; values: number[] }, dt: number, duration: number) {
  const a = allModes(sdofModel(k, m));
  return transientResponse(a, {
    loads: [{ pattern: [{ node: 'a', dof: 'ux', value: p0 }], history }],
    duration,
    timeStep: dt,
    at: [0],
    method,
    damping: { kind: 'constant', ratio: zeta },
  });
}

describe('transient response of one mass on a spring', () => {
  const duration = 3 * T;
  const dt = T / 40;
  const stepLoad = { times: [0, 10 * duration], values: [1, 1] };

  it('step load, undamped: exact integrator matches u = (p₀/k)(1 − cos ωt)', () => {
    // Source: Chopra, Dynamics of Structures, §4.3 (step force, from memory): Duhamel's
    // integral gives u(t) = (p₀/k)(1 − cos ωt) from rest.
    const r = sdofRun('exact', 0, stepLoad, dt, duration);
    const u = r.responses[0].displacement;
    r.times.forEach((t, i) => expect(Math.abs(u[i] - (p0 / k) * (1 - Math.cos(w * t)))).toBeLessThan(1e-12 * (p0 / k) * 100));
    expect(r.responses[0].peakDisplacement).toBeCloseTo((2 * p0) / k, 10); // dynamic factor 2
  });

  it('step load, 5 % damping: exact and Newmark against the closed form', () => {
    // Source: Chopra §4.3 (from memory): u = (p₀/k)[1 − e^{−ζωt}(cos ω_D t + ζ/√(1−ζ²) sin ω_D t)].
    const zeta = 0.05;
    const wd = w * Math.sqrt(1 - zeta * zeta);
    const ref = (t: number): number => (p0 / k) * (1 - Math.exp(-zeta * w * t) * (Math.cos(wd * t) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * t)));
    const ex = sdofRun('exact', zeta, stepLoad, dt, duration);
    const nm = sdofRun('newmark', zeta, stepLoad, dt, duration);
    let errEx = 0;
    let errNm = 0;
    ex.times.forEach((t, i) => {
      errEx = Math.max(errEx, Math.abs(ex.responses[0].displacement[i] - ref(t)));
      errNm = Math.max(errNm, Math.abs(nm.responses[0].displacement[i] - ref(t)));
    });
    expect(errEx / (p0 / k)).toBeLessThan(1e-10);
    // Newmark average acceleration with Δt = T/40: period error ≈ (ωΔt)²/12 ≈ 0.2 %
    // (Chopra §5.5, from memory), so the phase drifts by a few tenths of a percent of a cycle.
    expect(errNm / (p0 / k)).toBeLessThan(0.05);
    expect(errNm / (p0 / k)).toBeGreaterThan(1e-6); // it is an approximation, not the exact method
    // Acceleration from the equation of motion: at t = 0⁺ it is p₀/m.
    expect(ex.responses[0].acceleration[0]).toBeCloseTo(p0 / m, 10);
  });

  it('ramp load, undamped: u = (p₀/k)(t/t_r − sin ωt/(ω t_r)) for exact, and Newmark converges', () => {
    // Source: Chopra §4.4 (linearly increasing force, from memory).
    const tr = 2 * duration;
    const ramp = { times: [0, tr], values: [0, 1] };
    const ref = (t: number): number => (p0 / k) * (t / tr - Math.sin(w * t) / (w * tr));
    const ex = sdofRun('exact', 0, ramp, dt, duration);
    ex.times.forEach((t, i) => expect(Math.abs(ex.responses[0].displacement[i] - ref(t))).toBeLessThan(1e-12));
    const errs = [dt, dt / 2].map((h) => {
      const nm = sdofRun('newmark', 0, ramp, h, duration);
      return Math.max(...Array.from(nm.times, (t, i) => Math.abs(nm.responses[0].displacement[i] - ref(t))));
    });
    // Second-order accuracy (Chopra §5.4): halving Δt cuts the error about four times.
    expect(errs[0] / errs[1]).toBeGreaterThan(3.5);
    expect(errs[0] / errs[1]).toBeLessThan(4.5);
  });

  it('exact integration does not depend on the step, breakpoints off the grid included', () => {
    // Property of the method (Chopra §5.2): exact for piecewise-linear loads, so two steps
    // agree at their common times. Triangular pulse with its peak at an off-grid time.
    const pulse = { times: [0.013, 0.0517, 0.09], values: [0, 1, 0] };
    const coarse = sdofRun('exact', 0.03, pulse, 0.01, 0.5);
    const fine = sdofRun('exact', 0.03, pulse, 0.001, 0.5);
    coarse.times.forEach((t, i) => {
      expect(Math.abs(coarse.responses[0].displacement[i] - fine.responses[0].displacement[i * 10])).toBeLessThan(1e-14);
    });
  });

  it('history values: linear inside, zero outside, jumps at repeated times', () => {
    const h = { times: [1, 2, 2, 4], values: [1, 3, -1, 0] };
    expect(historyValue(h, 0.5, 1)).toBe(0);
    expect(historyValue(h, 1.5, 1)).toBe(2);
    expect(historyValue(h, 2, -1)).toBe(3);
    expect(historyValue(h, 2, 1)).toBe(-1);
    expect(historyValue(h, 3, 1)).toBe(-0.5);
    expect(historyValue(h, 4, 1)).toBe(0);
  });
});

describe('transient response of several modes', () => {
  it('a slowly applied load settles at the static deflection K⁻¹f (dense solve)', () => {
    // Source: statics, u = K⁻¹ f solved by ml-matrix; a load ramped over many periods and held,
    // with 5 % damping, leaves a free vibration that has decayed by e^{−ζωt}.
    const asm = assemble(portalFrameModel(2));
    const a = allModes(asm);
    const n = asm.dofs.length;
    const f = new Float64Array(n);
    const iB = asm.dofs.findIndex((d) => d.node === 'B' && d.dof === 'ux');
    expect(iB).toBeGreaterThanOrEqual(0);
    f[iB] = 10000;
    const T1 = a.modes[0].period;
    const r = transientResponse(a, {
      loads: [{ pattern: f, history: { times: [0, 10 * T1, 1000 * T1], values: [0, 1, 1] } }],
      duration: 40 * T1,
      timeStep: T1 / 20,
      at: [iB],
      damping: { kind: 'constant', ratio: 0.05 },
      count: n,
    });
    const u = solve(toMatrix(asm.stiffness), Matrix.columnVector(Array.from(f))).get(iB, 0);
    const last = r.responses[0].displacement.length - 1;
    expect(Math.abs(r.responses[0].displacement[last] - u) / Math.abs(u)).toBeLessThan(1e-3);
  });

  it('chooses the fewest modes that capture the mass target', () => {
    // Shear building (Chopra §9.2 layout, invented numbers); the load pushes along ux.
    const a = allModes(shearBuilding([4e6, 3e6, 2e6, 1e6], [2e4, 2e4, 2e4, 1.5e4]));
    const cum = a.modes.map((md) => md.cumulativeRatio.ux ?? 0);
    const expected = cum.findIndex((c) => c >= 0.9) + 1;
    expect(expected).toBeGreaterThan(0);
    const r = transientResponse(a, {
      loads: [{ pattern: [{ node: 'f4', dof: 'ux', value: 1000 }], history: { times: [0, 1], values: [1, 1] } }],
      duration: 1,
      timeStep: 0.01,
      at: [{ node: 'f4', dof: 'ux' }],
    });
    expect(r.massDirection).toBe('ux');
    expect(r.modesUsed).toBe(expected);
    expect(r.massCaptured).toBeGreaterThanOrEqual(0.9);
    expect(r.massTargetReached).toBe(true);
    expect(TRANSIENT_DEFAULTS.massTarget).toBe(0.9);
  });

  it('names the bad option', () => {
    const a = allModes(sdofModel(k, m));
    const base = { loads: [{ pattern: [{ node: 'a', dof: 'ux', value: 1 }], history: { times: [0, 1], values: [1, 1] } }], duration: 1, timeStep: 0.1, at: [0] };
    const path = (o: object): string => {
      try {
        transientResponse(a, { ...base, ...o } as never);
      } catch (e) {
        expect(e).toBeInstanceOf(ArgumentError);
        return (e as ArgumentError).path;
      }
      return 'no error';
    };
    expect(path({ timeStep: 0.3 })).toBe('timeStep');
    expect(path({ loads: [{ pattern: [{ node: 'a', dof: 'ux', value: 1 }], history: { times: [0, 2, 1], values: [0, 1, 0] } }] })).toBe('loads[0].history.times[2]');
    expect(path({ method: 'euler' })).toBe('method');
    expect(path({ at: [{ node: 'q', dof: 'ux' }] })).toBe('at[0]');
  });
});
