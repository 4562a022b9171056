/**
 * The exact values of the reference catalogue against independent statements of the same
 * theories: constants recalled from the literature (marked "from memory"), and the boundary-value
 * problem of each case written out as a determinant of its general solution, whose sign changes
 * are counted on a fine grid (so no root is missed and none is spurious).
 */
import { describe, expect, it } from 'vitest';
import { determinant, Matrix } from 'ml-matrix';
import { referenceCase, referenceCases } from '../src/reference/catalogue';
import { beamRoots, bucklingFactors, tipMassRoots } from '../src/reference/theory';
import { bisect, findRoots } from '../src/reference/roots';
import { ArgumentError } from '../src/errors';
import type { ReferenceCase } from '../src/reference/types';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

function param(c: ReferenceCase, name: string): number {
  const p = c.parameters.find((q) => q.name === name);
  if (!p) throw new Error(`${c.id} has no parameter ${name}`);
  return p.value;
}

/** β of each frequency of an Euler–Bernoulli beam case: β = L √(2πf) (ρA/EI)^¼. */
function betas(c: ReferenceCase, values: number[], I = param(c, 'I'), A = param(c, 'A'), L = param(c, 'L')): number[] {
  const E = param(c, 'E');
  const rho = param(c, 'density');
  return values.map((f) => L * Math.sqrt(2 * Math.PI * f) * ((rho * A) / (E * I)) ** 0.25);
}

// Rows of w, w'/β, w''/β², w'''/β³ at ξ for the basis cos βξ, sin βξ, cosh βξ, sinh βξ of
// w'''' = β⁴ w (ξ = x/L); scaled by cosh β where large so that determinants stay finite.
function beamRows(beta: number, xi: number): number[][] {
  const c = Math.cos(beta * xi);
  const s = Math.sin(beta * xi);
  const ch = Math.cosh(beta * xi);
  const sh = Math.sinh(beta * xi);
  return [
    [c, s, ch, sh],
    [-s, c, sh, ch],
    [-c, -s, ch, sh],
    [s, -c, sh, ch],
  ];
}

const END: Record<string, number[]> = { clamped: [0, 1], pinned: [0, 2], free: [2, 3] };

/** Boundary-value determinant of a single-span beam with end conditions a (ξ = 0) and b (ξ = 1). */
function spanDeterminant(a: string, b: string, mu = 0): (beta: number) => number {
  return (beta) => {
    const r0 = beamRows(beta, 0);
    const r1 = beamRows(beta, 1);
    const rows = [...END[a].map((k) => r0[k]), ...END[b].map((k) => r1[k])];
    if (mu > 0) {
      // Tip mass at ξ = 1: w'' = 0 and w''' = −μβ⁴ w, i.e. row3 + μβ·row0 = 0 in scaled rows.
      rows[3] = r1[3].map((v, k) => v + mu * beta * r1[0][k]);
    }
    return determinant(new Matrix(rows)) / Math.cosh(beta) ** 2;
  };
}

/** Sign changes of f on (a, b) in steps h: the roots it has there. */
function signChanges(f: (x: number) => number, a: number, b: number, h: number): number[] {
  const out: number[] = [];
  let fa = f(a);
  for (let x = a + h; x <= b; x += h) {
    const fb = f(x);
    if (Math.sign(fa) !== Math.sign(fb) && fb !== 0) out.push(bisect(f, x - h, x));
    fa = fb;
  }
  return out;
}

/** Checks that `roots` are exactly the roots of det on (lo, roots[last] + margin). */
function sameRoots(det: (x: number) => number, roots: number[], lo: number, h = 0.002): void {
  const found = signChanges(det, lo, roots[roots.length - 1] + 0.5, h);
  expect(found.length).toBe(roots.length);
  found.forEach((x, k) => expect(rel(x, roots[k])).toBeLessThan(1e-9));
}

describe('catalogue', () => {
  it('has at least 12 cases with unique kebab-case ids and complete metadata', () => {
    const cases = referenceCases();
    expect(cases.length).toBeGreaterThanOrEqual(12);
    expect(new Set(cases.map((c) => c.id)).size).toBe(cases.length);
    for (const c of cases) {
      expect(c.id).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
      expect(c.description.length).toBeGreaterThan(10);
      expect(c.source.length).toBeGreaterThan(30);
      expect(Number.isInteger(c.mesh) && c.mesh >= 1).toBe(true);
      expect(c.tolerance).toBeGreaterThan(0);
      expect(c.count).toBeGreaterThanOrEqual(3);
      const v = c.exact(c.count);
      expect(v).toHaveLength(c.count);
      for (let k = 1; k < v.length; k++) expect(v[k]).toBeGreaterThanOrEqual(v[k - 1]);
      expect(c.exact(0)).toEqual([]);
      expect(c.quantity === 'buckling').toBe(c.loads !== undefined);
    }
  });

  it('builds models at any mesh, with the element count and node ids the mesh implies', () => {
    const c = referenceCase('beam-cantilever');
    const m = c.build(7);
    expect(m.format).toBe('eigenframe-model/1');
    expect(m.elements).toHaveLength(7);
    expect(m.nodes).toHaveLength(8);
    expect(m.nodes[7].x).toBe(param(c, 'L'));
    expect(referenceCase('beam-two-span').build(3).elements).toHaveLength(6);
    expect(referenceCase('buckling-fixed-free').loads!(5)).toEqual([{ node: 'n5', dof: 'uy', force: -param(referenceCase('buckling-fixed-free'), 'PE') }]);
  });

  it('rejects an unknown id, listing the ids, and a bad mesh or count, naming them', () => {
    try {
      referenceCase('beam-cantilevr');
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('beam-cantilevr');
      expect((e as ArgumentError).message).toContain('beam-cantilever,');
    }
    for (const bad of [0, 2.5, -1, NaN]) {
      expect(() => referenceCase('beam-cantilever').build(bad)).toThrow(ArgumentError);
      try {
        referenceCase('bar-axial-fixed-free').build(bad);
      } catch (e) {
        expect((e as ArgumentError).path).toBe('mesh');
      }
    }
    try {
      referenceCase('beam-simply-supported').exact(-1);
    } catch (e) {
      expect((e as ArgumentError).path).toBe('count');
    }
  });
});

describe('root finder', () => {
  it('bisects to 1e-14 and skips the poles of tan x − x', () => {
    // Source: tan x = x has first positive roots 4.493409458, 7.725251837 (from memory).
    const r = findRoots((x) => Math.tan(x) - x, 1, 2);
    expect(rel(r[0], 4.493409458)).toBeLessThan(1e-9);
    expect(rel(r[1], 7.725251837)).toBeLessThan(1e-9);
    expect(Math.abs(Math.tan(r[0]) - r[0])).toBeLessThan(1e-10);
    expect(bisect((x) => x * x - 2, 0, 2)).toBeCloseTo(Math.SQRT2, 14);
    expect(() => bisect((x) => x * x + 1, -1, 1)).toThrow(ArgumentError);
  });
});

describe('Euler–Bernoulli beams', () => {
  it('cantilever roots match 1.87510407, 4.69409113, 7.85475744, 10.99554073 (from memory)', () => {
    const c = referenceCase('beam-cantilever');
    const b = betas(c, c.exact(6));
    [1.87510407, 4.69409113, 7.85475744, 10.99554073].forEach((x, k) => expect(rel(b[k], x)).toBeLessThan(1e-8));
    // Higher roots approach (2n − 1)π/2 (asymptotic form, from memory).
    expect(rel(b[5], (11 * Math.PI) / 2)).toBeLessThan(1e-6);
    sameRoots(spanDeterminant('clamped', 'free'), beamRoots('clamped-free', 6), 0.5);
  });

  it('cantilever first frequency equals 1.87510407²/(2πL²)·√(EI/ρA)', () => {
    const c = referenceCase('beam-cantilever');
    const [E, I, rho, A, L] = ['E', 'I', 'density', 'A', 'L'].map((n) => param(c, n));
    const f1 = (1.87510407 ** 2 / (2 * Math.PI * L * L)) * Math.sqrt((E * I) / (rho * A)); // from memory
    expect(rel(c.exact(1)[0], f1)).toBeLessThan(1e-8);
  });

  it('simply supported roots are nπ', () => {
    const c = referenceCase('beam-simply-supported');
    betas(c, c.exact(6)).forEach((b, k) => expect(rel(b, (k + 1) * Math.PI)).toBeLessThan(1e-12));
    sameRoots(spanDeterminant('pinned', 'pinned'), beamRoots('pinned-pinned', 6), 0.5);
  });

  it('clamped-clamped roots match 4.73004074, 7.85320462, 10.99560784 (from memory)', () => {
    const c = referenceCase('beam-clamped-clamped');
    const b = betas(c, c.exact(6));
    [4.73004074, 7.85320462, 10.99560784].forEach((x, k) => expect(rel(b[k], x)).toBeLessThan(1e-8));
    expect(rel(b[5], (13 * Math.PI) / 2)).toBeLessThan(1e-6); // (2n + 1)π/2 asymptote
    sameRoots(spanDeterminant('clamped', 'clamped'), beamRoots('clamped-clamped', 6), 0.5);
  });

  it('clamped-pinned roots match 3.92660231, 7.06858275, 10.21017612 (from memory)', () => {
    const c = referenceCase('beam-clamped-pinned');
    const b = betas(c, c.exact(6));
    [3.92660231, 7.06858275, 10.21017612].forEach((x, k) => expect(rel(b[k], x)).toBeLessThan(1e-8));
    expect(rel(b[5], (25 * Math.PI) / 4)).toBeLessThan(1e-6); // (4n + 1)π/4 asymptote
    sameRoots(spanDeterminant('clamped', 'pinned'), beamRoots('clamped-pinned', 6), 0.5);
  });

  it('free-free: two rigid-body modes, then the clamped-clamped roots', () => {
    const c = referenceCase('beam-free-free');
    const v = c.exact(6);
    expect(v.slice(0, 2)).toEqual([0, 0]);
    const b = betas(c, v.slice(2));
    [4.73004074, 7.85320462, 10.99560784].forEach((x, k) => expect(rel(b[k], x)).toBeLessThan(1e-8));
    sameRoots(spanDeterminant('free', 'free'), beamRoots('free-free', 4), 0.5);
    expect(c.exact(1)).toEqual([0]);
  });

  it('cantilever with a tip mass: boundary-value roots, the μ → 0 limit, and the Rayleigh estimate', () => {
    const c = referenceCase('beam-cantilever-tip-mass');
    const mu = param(c, 'mu');
    expect(rel(mu, param(c, 'mTip') / (param(c, 'density') * param(c, 'A') * param(c, 'L')))).toBeLessThan(1e-12);
    const roots = betas(c, c.exact(6));
    sameRoots(spanDeterminant('clamped', 'free', mu), roots, 0.3, 0.001);
    // μ = 0 gives the bare cantilever (from memory).
    expect(rel(tipMassRoots(0, 1)[0], 1.87510407)).toBeLessThan(1e-8);
    // Rayleigh with the static tip-load shape: k = 3EI/L³, m_eff = m_tip + (33/140)ρAL
    // (common practice; accurate to well under 1 % for the first mode).
    const [E, I, L, rho, A] = ['E', 'I', 'L', 'density', 'A'].map((n) => param(c, n));
    const fR = Math.sqrt((3 * E * I) / L ** 3 / (param(c, 'mTip') + (33 / 140) * rho * A * L)) / (2 * Math.PI);
    expect(rel(c.exact(1)[0], fR)).toBeLessThan(5e-3);
    expect(c.exact(1)[0]).toBeLessThan(referenceCase('beam-cantilever').exact(1)[0]);
  });

  it('two equal spans: boundary-value determinant of the whole beam, clustered pairs', () => {
    const c = referenceCase('beam-two-span');
    const v = c.exact(6);
    const b = betas(c, v);
    // Unknowns: 4 per span; supports at ξ = 0, 1 of span 1 and ξ = 1 of span 2 (span 2's ξ = 0
    // is span 1's ξ = 1); slope and moment continuous over the middle support.
    const det = (beta: number) => {
      const a0 = beamRows(beta, 0);
      const a1 = beamRows(beta, 1);
      const z = [0, 0, 0, 0];
      const neg = (r: number[]) => r.map((x) => -x);
      const rows = [
        [...a0[0], ...z],
        [...a0[2], ...z],
        [...a1[0], ...z],
        [...z, ...a0[0]],
        [...a1[1], ...neg(a0[1])],
        [...a1[2], ...neg(a0[2])],
        [...z, ...a1[0]],
        [...z, ...a1[2]],
      ];
      return determinant(new Matrix(rows)) / Math.cosh(beta) ** 4;
    };
    sameRoots(det, b, 0.5);
    // Pairs: π with 3.9266, 2π with 7.0686, 3π with 10.2102 (from memory).
    [Math.PI, 3.92660231, 2 * Math.PI, 7.06858275, 3 * Math.PI, 10.21017612].forEach((x, k) => expect(rel(b[k], x)).toBeLessThan(1e-8));
  });
});

describe('Timoshenko beam, simply supported, L/h = 5', () => {
  const c = referenceCase('timoshenko-simply-supported');
  const [E, G, rho, A, I, kappa, L] = ['E', 'G', 'density', 'A', 'I', 'kappa', 'L'].map((n) => param(c, n));

  it('each value makes the 2 × 2 determinant of the Timoshenko equations vanish for some n', () => {
    // ρA ẅ = κGA(w'' − ψ'), ρI ψ̈ = EI ψ'' + κGA(w' − ψ) with w = W sin kx, ψ = Ψ cos kx.
    for (const f of c.exact(8)) {
      const w2 = (2 * Math.PI * f) ** 2;
      const det = (k: number) => {
        const a11 = kappa * G * A * k * k - rho * A * w2;
        const a12 = -kappa * G * A * k;
        const a22 = E * I * k * k + kappa * G * A - rho * I * w2;
        return (a11 * a22 - a12 * a12) / (kappa * G * A * (kappa * G * A + E * I * k * k));
      };
      const best = Math.min(...Array.from({ length: 12 }, (_, n) => Math.abs(det((n * Math.PI) / L))));
      expect(best).toBeLessThan(1e-9);
    }
  });

  it('lies below Euler–Bernoulli, close to the first-order shear and rotary-inertia correction', () => {
    const v = c.exact(4);
    for (let n = 1; n <= 4; n++) {
      const k = (n * Math.PI) / L;
      const fEB = ((k * k) / (2 * Math.PI)) * Math.sqrt((E * I) / (rho * A));
      expect(v[n - 1]).toBeLessThan(fEB);
      if (n === 1) {
        // ω ≈ ω_EB [1 − ½ (k r)² (1 + E/(κG))], r² = I/A (Timoshenko's correction, from memory);
        // first order in (kr)² ≈ 0.033 here, so agreement to about 1 %.
        const approx = fEB * (1 - 0.5 * k * k * (I / A) * (1 + E / (kappa * G)));
        expect(rel(v[0], approx)).toBeLessThan(1.5e-2);
      }
    }
  });
});

describe('rods and shafts', () => {
  it('axial bar fixed-free: (2n − 1)c/4L, c = √(E/ρ) ≈ 5172 m/s for steel (from memory)', () => {
    const c = referenceCase('bar-axial-fixed-free');
    const v = c.exact(5);
    const L = param(c, 'L');
    expect(rel((v[0] * 4 * L), 5172)).toBeLessThan(1e-3);
    v.forEach((f, k) => expect(rel(f, ((2 * k + 1) * v[0]))).toBeLessThan(1e-12));
  });

  it('axial bar free-free: rigid mode, then n·c/2L = twice the fixed-free fundamental per n', () => {
    const v = referenceCase('bar-axial-free-free').exact(4);
    const ff = referenceCase('bar-axial-fixed-free').exact(1)[0];
    expect(v[0]).toBe(0);
    [1, 2, 3].forEach((n) => expect(rel(v[n], 2 * n * ff)).toBeLessThan(1e-12));
  });

  it('shaft in torsion: (2n − 1)/(4L)·√(G/ρ) for a circle, √(G/ρ) ≈ 3212 m/s for steel (from memory)', () => {
    const c = referenceCase('shaft-torsion-fixed-free');
    const v = c.exact(3);
    expect(rel(v[0] * 4 * param(c, 'L'), 3212)).toBeLessThan(1e-3);
    expect(rel(v[0], Math.sqrt(param(c, 'G') / param(c, 'density')) / (4 * param(c, 'L')))).toBeLessThan(1e-12);
    expect(rel(v[2], 5 * v[0])).toBeLessThan(1e-12);
  });

  it('mast: bending pairs, torsion and axial modes merged in order', () => {
    const c = referenceCase('mast-space-cantilever');
    const v = c.exact(10);
    const [E, G, rho, A, I, J, Ip, L] = ['E', 'G', 'density', 'A', 'I', 'J', 'Ip', 'L'].map((n) => param(c, n));
    const fb = (beta: number) => (beta * beta) / (2 * Math.PI * L * L) * Math.sqrt((E * I) / (rho * A));
    const ft = Math.sqrt((G * J) / (rho * Ip)) / (4 * L);
    const fa = Math.sqrt(E / rho) / (4 * L);
    // Cantilever roots from memory.
    const expected = [fb(1.87510407), fb(1.87510407), fb(4.69409113), fb(4.69409113), fb(7.85475744), fb(7.85475744), ft, fb(10.99554073), fb(10.99554073), fa];
    expected.forEach((f, k) => expect(rel(v[k], f)).toBeLessThan(1e-8));
    expect(rel(Ip, 2 * I)).toBeLessThan(1e-12);
  });
});

describe('Euler buckling', () => {
  // Rows of w, w', w'', w''' at ξ for the basis 1, ξ, cos kξ, sin kξ of w'''' + k² w'' = 0.
  const rows = (k: number, xi: number) => [
    [1, xi, Math.cos(k * xi), Math.sin(k * xi)],
    [0, 1, -k * Math.sin(k * xi), k * Math.cos(k * xi)],
    [0, 0, -k * k * Math.cos(k * xi), -k * k * Math.sin(k * xi)],
    [0, 0, k ** 3 * Math.sin(k * xi), -(k ** 3) * Math.cos(k * xi)],
  ];
  // Free top under a load that stays vertical: M = 0 (w'' = 0) and V = 0 (w''' + k² w' = 0).
  const end = (kind: string, k: number, xi: number): number[][] => {
    const r = rows(k, xi);
    if (kind === 'fixed') return [r[0], r[1]];
    if (kind === 'pinned') return [r[0], r[2]];
    return [r[2], r[3].map((v, j) => v + k * k * r[1][j])];
  };

  it.each([
    ['fixed-free', 2],
    ['pinned-pinned', 1],
    ['fixed-pinned', 0.699],
    ['fixed-fixed', 0.5],
  ])('%s: first factor 1/K² with K = %s, and the boundary-value roots', (supports, K) => {
    const c = referenceCase(`buckling-${supports}`);
    const v = c.exact(4);
    // K = 0.699 is the rounded 1/(4.4934/π) (from memory); the others are exact.
    expect(rel(v[0], 1 / (K * K))).toBeLessThan(K === 0.699 ? 1e-3 : 1e-12);
    const [a, b] = supports.split('-');
    const det = (k: number) => determinant(new Matrix([...end(a, k, 0), ...end(b, k, 1)])) / (1 + k ** 6);
    sameRoots(det, v.map((f) => Math.PI * Math.sqrt(f)), 0.3);
    expect(param(c, 'PE')).toBeCloseTo((Math.PI ** 2 * param(c, 'E') * param(c, 'I')) / param(c, 'L') ** 2, 6);
  });

  it('fixed-pinned root 4.4934 and fixed-fixed antisymmetric factor 8.18 (from memory)', () => {
    expect(rel(Math.PI * Math.sqrt(bucklingFactors('fixed-pinned', 1)[0]), 4.4934)).toBeLessThan(1e-4);
    expect(rel(bucklingFactors('fixed-fixed', 2)[1], 8.183)).toBeLessThan(1e-3);
  });
});
