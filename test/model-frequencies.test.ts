/**
 * Frequencies of small models assembled by src/model and solved with a dense ml-matrix reference
 * (test/model-helpers.ts), against closed forms and characteristic equations.
 */
import { inverse, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { toDenseArray } from '../src/linalg/sparse/symmetric';
import { assemble } from '../src/model/assemble';
import { validateModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import { denseEigenvalues, planeBeamModel, relErr, roots, sparseEigenvalues, type PlaneBeamOptions } from './model-helpers';

// Steel-like properties of a slender rectangular bar 0.05 × 0.1 m (invented for tests).
const E = 2.1e11, G = 8.1e10, rho = 7850, b = 0.05, h = 0.1;
const A = b * h, I = (b * h ** 3) / 12, L = 4;

const omegas = (m: Model): number[] => {
  const asm = assemble(validateModel(m));
  return sparseEigenvalues(asm.stiffness, asm.mass).map((l) => Math.sqrt(Math.max(l, 0)));
};
/** Euler-Bernoulli ω = (βL)² √(EI/(ρA L⁴)) (e.g. Blevins, Formulas for Natural Frequency and Mode Shape, table 8-1). */
const ebOmega = (betaL: number, len = L, EI = E * I, mu = rho * A) => betaL ** 2 * Math.sqrt(EI / (mu * len ** 4));
const beam = (o: Partial<PlaneBeamOptions>) => planeBeamModel({ elements: 20, L, E, density: rho, A, I, left: [], right: [], ...o });

describe('Euler-Bernoulli beam frequency parameters βL, 20 consistent-mass elements, first four modes within 0.1 %', () => {
  const cases: { name: string; left: string[]; right: string[]; eq: (x: number) => number; memory: number[]; rigid?: number }[] = [
    // Characteristic equations of Euler-Bernoulli beams (Blevins 1979, table 8-1); the
    // roots listed beside each are from memory and are checked against the bisection roots.
    { name: 'cantilever: 1 + cos x cosh x = 0', left: ['uy', 'rz'], right: [], eq: (x) => 1 + Math.cos(x) * Math.cosh(x), memory: [1.8751, 4.6941, 7.8548, 10.9955] },
    { name: 'simply supported: sin x = 0', left: ['uy'], right: ['uy'], eq: (x) => Math.sin(x), memory: [Math.PI, 2 * Math.PI, 3 * Math.PI, 4 * Math.PI] },
    { name: 'clamped-clamped: 1 − cos x cosh x = 0', left: ['uy', 'rz'], right: ['uy', 'rz'], eq: (x) => 1 - Math.cos(x) * Math.cosh(x), memory: [4.73, 7.8532, 10.9956, 14.1372] },
    { name: 'clamped-pinned: tan x = tanh x', left: ['uy', 'rz'], right: ['uy'], eq: (x) => Math.sin(x) * Math.cosh(x) - Math.cos(x) * Math.sinh(x), memory: [3.9266, 7.0686, 10.2102, 13.3518] },
    { name: 'free-free: 1 − cos x cosh x = 0, plus two rigid-body modes', left: [], right: [], eq: (x) => 1 - Math.cos(x) * Math.cosh(x), memory: [4.73, 7.8532, 10.9956, 14.1372], rigid: 2 },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const betas = roots(c.eq, 4, 0.5);
      betas.forEach((x, i) => expect(relErr(x, c.memory[i])).toBeLessThan(1e-4));
      const w = omegas(beam({ left: c.left, right: c.right }));
      const rigid = c.rigid ?? 0;
      for (let i = 0; i < rigid; i++) expect(w[i]).toBeLessThan(1e-5 * w[rigid]);
      for (let i = 0; i < 4; i++) expect(relErr(w[rigid + i], ebOmega(betas[i]))).toBeLessThan(1e-3);
    });
  }

  it('h-refinement: consistent-mass frequency error falls as h⁴ (Strang & Fix, An Analysis of the FEM, ch. 6, from memory: eigenvalue error O(h^{2(k+1−m)}) = h⁴ for cubics, m = 2)', () => {
    const exact = ebOmega(roots((x) => 1 + Math.cos(x) * Math.cosh(x), 2, 0.5)[1]);
    const errs = [2, 4, 8].map((n) => relErr(omegas(beam({ elements: n, left: ['uy', 'rz'] }))[1], exact));
    const orders = [Math.log2(errs[0] / errs[1]), Math.log2(errs[1] / errs[2])];
    console.log(`cantilever mode 2, relative error with 2/4/8 elements: ${errs.map((e) => e.toExponential(2)).join(' / ')}; observed orders ${orders.map((o) => o.toFixed(2)).join(', ')}`);
    expect(orders[1]).toBeGreaterThan(3.7);
    expect(orders[1]).toBeLessThan(4.3);
    // Rayleigh-Ritz with a consistent mass bounds frequencies from above.
    expect(Math.min(...errs)).toBeGreaterThan(0);
  });
});

describe('axial and torsional rods', () => {
  it('fixed-free bar: f_n = (2n−1)/(4L)·√(E/ρ) (wave equation u_tt = (E/ρ) u_xx with u(0) = 0, u_x(L) = 0); consistent above, lumped below', () => {
    const n = 100;
    const nodes = Array.from({ length: n + 1 }, (_, i) => ({ id: `n${i}`, x: (L * i) / n, y: 0 }));
    const elements = Array.from({ length: n }, (_, i) => ({ id: `b${i}`, kind: 'bar', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
    const supports = nodes.map((nd, i) => ({ node: nd.id, fixed: i === 0 ? ['ux', 'uy'] : ['uy'] }));
    const base = { format: 'eigenframe-model/1', space: 'plane', materials: { m: { E, density: rho } }, sections: { s: { A } }, nodes, elements, supports };
    const consistent = omegas({ ...base, mass: 'consistent' } as never);
    const lumped = omegas({ ...base, mass: 'lumped' } as never);
    for (let k = 1; k <= 3; k++) {
      const exact = (((2 * k - 1) * Math.PI) / (2 * L)) * Math.sqrt(E / rho);
      expect(relErr(consistent[k - 1], exact)).toBeLessThan(1e-3);
      expect(relErr(lumped[k - 1], exact)).toBeLessThan(1e-3);
      expect(consistent[k - 1]).toBeGreaterThan(exact);
      expect(lumped[k - 1]).toBeLessThan(exact);
    }
  });

  it('fixed-free circular shaft in torsion: f_n = (2n−1)/(4L)·√(G/ρ), Ip = Iy + Iz = J (same wave equation with G/ρ)', () => {
    const R = 0.03, n = 40;
    const J = (Math.PI * R ** 4) / 2;
    const nodes = Array.from({ length: n + 1 }, (_, i) => ({ id: `n${i}`, x: (L * i) / n, y: 0, z: 0 }));
    const elements = Array.from({ length: n }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
    const supports = nodes.map((nd, i) => ({ node: nd.id, fixed: i === 0 ? ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] : ['ux', 'uy', 'uz', 'ry', 'rz'] }));
    const w = omegas({ format: 'eigenframe-model/1', space: 'space', materials: { m: { E, G, density: rho } }, sections: { s: { A: Math.PI * R * R, Iy: J / 2, Iz: J / 2, J } }, nodes, elements, supports } as never);
    for (let k = 1; k <= 3; k++) expect(relErr(w[k - 1], (((2 * k - 1) * Math.PI) / (2 * L)) * Math.sqrt(G / rho))).toBeLessThan(2e-3);
  });
});

describe('Timoshenko beam', () => {
  it('thick simply supported beam (L/h = 5) matches the exact Timoshenko frequencies; the Euler-Bernoulli element misses them by more', () => {
    // Exact SS Timoshenko beam, mode n with k = nπ/L: (ρ²I/κG) ω⁴ − [ρA + ρI k²(1 + E/κG)] ω² + EI k⁴ = 0,
    // lower root (Timoshenko 1921; Han, Benaroya & Wei, J. Sound Vib. 225 (1999) 935–988, SS case).
    const Lt = 0.5, kappa = 5 / 6;
    const exact = [1, 2, 3].map((n) => {
      const k = (n * Math.PI) / Lt;
      const a = (rho * rho * I) / (kappa * G);
      const bq = rho * A + rho * I * k * k * (1 + E / (kappa * G));
      const c = E * I * k ** 4;
      return Math.sqrt((bq - Math.sqrt(bq * bq - 4 * a * c)) / (2 * a));
    });
    const common = { L: Lt, G, kappa, left: ['uy'], right: ['uy'], elements: 40 };
    const wt = omegas(beam({ ...common, kind: 'timoshenko' }));
    const wb = omegas(beam({ ...common, kind: 'beam' }));
    for (let i = 0; i < 3; i++) {
      const et = relErr(wt[i], exact[i]);
      expect(et).toBeLessThan(1e-3);
      expect(relErr(wb[i], exact[i])).toBeGreaterThan(10 * et);
    }
  });
});

describe('lumped mass', () => {
  it('simply supported Euler-Bernoulli beam, lumped (massless rotations condensed out): within 0.5 % of nπ on modes 1–3, from below', () => {
    // Guyan condensation of the massless rotations is exact for a lumped mass (no inertia is
    // lost): K* = Ktt − Ktr Krr⁻¹ Krt (Guyan, AIAA J. 3 (1965) 380).
    const asm = assemble(validateModel(beam({ left: ['uy'], right: ['uy'], mass: 'lumped' })));
    const Kd = toDenseArray(asm.stiffness);
    const Md = toDenseArray(asm.mass);
    const n = asm.stiffness.n;
    const t = asm.dofs.map((d, i) => (d.dof === 'uy' ? i : -1)).filter((i) => i >= 0);
    const r = asm.dofs.map((d, i) => (d.dof === 'rz' ? i : -1)).filter((i) => i >= 0);
    const sub = (rows: number[], cols: number[]) => new Matrix(rows.map((i) => cols.map((j) => Kd[i * n + j])));
    const Ks = sub(t, t).sub(sub(t, r).mmul(inverse(sub(r, r))).mmul(sub(r, t)));
    const Ms = t.flatMap((i) => t.map((j) => Md[i * n + j]));
    const w = denseEigenvalues(Ks.to1DArray(), Ms, t.length).map(Math.sqrt);
    for (let k = 1; k <= 3; k++) {
      const exact = ebOmega(k * Math.PI);
      expect(relErr(w[k - 1], exact)).toBeLessThan(5e-3);
      expect(w[k - 1]).toBeLessThan(exact);
    }
  });

  it('thick simply supported Timoshenko beam, lumped (with rotary inertia): within 1 % of the exact frequencies', () => {
    const Lt = 0.5, kappa = 5 / 6;
    const w = omegas(beam({ L: Lt, G, kappa, left: ['uy'], right: ['uy'], elements: 40, kind: 'timoshenko', mass: 'lumped' }));
    for (let k = 1; k <= 3; k++) {
      const q = (k * Math.PI) / Lt;
      const a = (rho * rho * I) / (kappa * G);
      const bq = rho * A + rho * I * q * q * (1 + E / (kappa * G));
      const exact = Math.sqrt((bq - Math.sqrt(bq * bq - 4 * a * E * I * q ** 4)) / (2 * a));
      expect(relErr(w[k - 1], exact)).toBeLessThan(1e-2);
    }
  });
});

describe('Timoshenko beam in space', () => {
  it('bending in the local x–z plane (Iy, θy = −dw/dx) matches the exact SS Timoshenko frequencies', () => {
    // Same closed form as above, with I = Iy; the member runs along X, so local z = global Z.
    const Lt = 0.5, kappa = 5 / 6, n = 40, Iy = I, Iz = 7 * I;
    const nodes = Array.from({ length: n + 1 }, (_, i) => ({ id: `n${i}`, x: (Lt * i) / n, y: 0, z: 0 }));
    const elements = Array.from({ length: n }, (_, i) => ({ id: `e${i}`, kind: 'timoshenko', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
    const supports = nodes.map((nd, i) => ({ node: nd.id, fixed: i === 0 || i === n ? ['ux', 'uy', 'uz', 'rx', 'rz'] : ['ux', 'uy', 'rx', 'rz'] }));
    const w = omegas({ format: 'eigenframe-model/1', space: 'space', materials: { m: { E, G, density: rho } }, sections: { s: { A, Iy, Iz, J: I, kappa } }, nodes, elements, supports } as never);
    for (let k = 1; k <= 3; k++) {
      const q = (k * Math.PI) / Lt;
      const a = (rho * rho * Iy) / (kappa * G);
      const bq = rho * A + rho * Iy * q * q * (1 + E / (kappa * G));
      const exact = Math.sqrt((bq - Math.sqrt(bq * bq - 4 * a * E * Iy * q ** 4)) / (2 * a));
      expect(relErr(w[k - 1], exact)).toBeLessThan(1e-3);
    }
  });
});

describe('cantilever with a heavy tip mass', () => {
  it('matches (1 + cos x cosh x) + (M/ρAL)·x·(cos x sinh x − sin x cosh x) = 0', () => {
    // Source: clamped-free Euler-Bernoulli beam with a tip mass M, e.g. Laura, Pombo & Susemihl,
    // J. Sound Vib. 37 (1974) 161–168 (form from memory; checked here by its limits: M → 0 gives
    // the cantilever equation, small x gives ω² → 3EI/(ML³) for a heavy mass).
    const ratio = 5;
    const Mtip = ratio * rho * A * L;
    const eq = (x: number) => 1 + Math.cos(x) * Math.cosh(x) + ratio * x * (Math.cos(x) * Math.sinh(x) - Math.sin(x) * Math.cosh(x));
    const betas = roots(eq, 4, 0.05, 0.005);
    expect(relErr(ebOmega(betas[0]) ** 2, (3 * E * I) / (Mtip * L ** 3))).toBeLessThan(0.1);
    const m = beam({ left: ['uy', 'rz'] });
    m.masses = [{ node: 'n20', mass: Mtip }];
    const w = omegas(m);
    for (let i = 0; i < 4; i++) expect(relErr(w[i], ebOmega(betas[i]))).toBeLessThan(1e-3);
  });
});

// A space frame with unequal Iy and Iz, explicit orientation vectors, and members in all
// directions (invented geometry).
// With `lean`, the top is shifted sideways so no member is vertical.
function spaceFrame(rotate: (v: number[]) => number[], withOrientation: boolean, lean = 0): Model {
  const pts: Record<string, number[]> = { a: [0, 0, 0], b: [3, 0, 0], c: [3, 2, 0], d: [0, 2, 0], e: [lean, 0.5 * lean, 3], f: [3 + lean, 0.5 * lean, 3], g: [3 + lean, 2 + 0.5 * lean, 3], h: [lean, 2 + 0.5 * lean, 3], k: [1.5, 1, 4] };
  const nodes = Object.entries(pts).map(([id, p]) => {
    const [x, y, z] = rotate(p);
    return { id, x, y, z };
  });
  const bars = [['a', 'e'], ['b', 'f'], ['c', 'g'], ['d', 'h'], ['e', 'f'], ['f', 'g'], ['g', 'h'], ['h', 'e'], ['e', 'k'], ['g', 'k'], ['a', 'f']];
  const elements = bars.map(([p, q], i) => {
    const el: Record<string, unknown> = { id: `m${i}`, kind: i % 3 === 0 ? 'timoshenko' : 'beam', nodes: [p, q], material: 'steel', section: 'rect' };
    if (withOrientation) {
      // A vector not along the member: the member direction's cross product with a fixed axis.
      const d = pts[q].map((v, k) => v - pts[p][k]);
      const o = Math.abs(d[2]) > Math.abs(d[0]) ? [1, 0.3, 0] : [0, 0.2, 1];
      el.orientation = rotate(o);
    }
    return el;
  });
  return {
    format: 'eigenframe-model/1', space: 'space',
    materials: { steel: { E, G, density: rho } },
    sections: { rect: { A: 0.01, Iy: 8e-5, Iz: 2e-5, J: 3e-5, kappa: 0.85 } },
    nodes, elements: elements as never,
    supports: ['a', 'b', 'c', 'd'].map((n) => ({ node: n, fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] })) as never,
    masses: [{ node: 'k', mass: 50, inertia: 2 }],
  } as Model;
}

describe('space frames', () => {
  it('square-section mast (Iy = Iz): both equal bending frequencies come back and match the cantilever βL = 1.8751', () => {
    const n = 16, H = 6, a = 0.2;
    const Ia = a ** 4 / 12;
    const nodes = Array.from({ length: n + 1 }, (_, i) => ({ id: `n${i}`, x: 0, y: 0, z: (H * i) / n }));
    const elements = Array.from({ length: n }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
    const w = omegas({ format: 'eigenframe-model/1', space: 'space', materials: { m: { E, G, density: rho } }, sections: { s: { A: a * a, Iy: Ia, Iz: Ia, J: 0.1406 * a ** 4 } }, nodes, elements, supports: [{ node: 'n0', fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] }] } as never);
    expect(relErr(w[1], w[0])).toBeLessThan(1e-9);
    const beta = roots((x) => 1 + Math.cos(x) * Math.cosh(x), 1, 0.5)[0];
    expect(relErr(w[0], ebOmega(beta, H, E * Ia, rho * a * a))).toBeLessThan(1e-4);
    expect(relErr(w[2], w[1])).toBeGreaterThan(1e-3); // the next mode is a different one
  });

  it('frequencies are invariant under a rigid rotation of the whole model (orientation vectors rotated too)', () => {
    const c1 = Math.cos(0.7), s1 = Math.sin(0.7), c2 = Math.cos(-1.2), s2 = Math.sin(-1.2);
    // Rotation about X by 0.7 rad, then about Z by −1.2 rad.
    const rot = (v: number[]) => {
      const y = c1 * v[1] - s1 * v[2], z = s1 * v[1] + c1 * v[2];
      return [c2 * v[0] - s2 * y, s2 * v[0] + c2 * y, z];
    };
    const w0 = omegas(spaceFrame((v) => v, true));
    const w1 = omegas(spaceFrame(rot, true));
    expect(w0.length).toBe(w1.length);
    for (let i = 0; i < 12; i++) expect(relErr(w1[i], w0[i])).toBeLessThan(1e-9);
  });

  it('with the default axes rule, frequencies of a frame without vertical members are invariant under a rotation about the vertical axis', () => {
    // (A vertical member takes local y = global Y, which does not turn with the model.)
    const c = Math.cos(0.9), s = Math.sin(0.9);
    const w0 = omegas(spaceFrame((v) => v, false, 0.4));
    const w1 = omegas(spaceFrame((v) => [c * v[0] - s * v[1], s * v[0] + c * v[1], v[2]], false, 0.4));
    for (let i = 0; i < 12; i++) expect(relErr(w1[i], w0[i])).toBeLessThan(1e-9);
  });
});
