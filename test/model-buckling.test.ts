/** Geometric stiffness (elements/geometric.ts, model/geometric.ts): buckling and a taut string. */
import { describe, expect, it } from 'vitest';
import { ArgumentError } from '../src/errors';
import { beamGeometricStiffness, spaceFrameGeometricStiffness } from '../src/elements/geometric';
import { toDenseArray } from '../src/linalg/sparse/symmetric';
import { assemble } from '../src/model/assemble';
import { assembleGeometric } from '../src/model/geometric';
import { validateModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import { denseEigenvalues, planeBeamModel, relErr } from './model-helpers';

const E = 2.1e11, G = 8.1e10, rho = 7850;

/** Load factors μ of K φ = μ (−K_G) φ for a unit compression in every element. */
function bucklingFactors(model: Model): number[] {
  const asm = assemble(validateModel(model));
  const KG = assembleGeometric(asm, new Float64Array(model.elements.length).fill(-1));
  const minusKG = toDenseArray(KG).map((v) => -v);
  return denseEigenvalues(toDenseArray(asm.stiffness), minusKG, asm.stiffness.n);
}

describe('element geometric stiffness', () => {
  it('Euler-Bernoulli form equals N/(30L)·[36 3L −36 3L; 3L 4L² −3L −L²; …] (Przemieniecki 1968, ch. 15, from memory)', () => {
    const N = 1234, L = 1.7;
    const ref = [36, 3 * L, -36, 3 * L, 3 * L, 4 * L * L, -3 * L, -L * L, -36, -3 * L, 36, -3 * L, 3 * L, -L * L, -3 * L, 4 * L * L].map((v) => (v * N) / (30 * L));
    beamGeometricStiffness(N, L).forEach((v, i) => expect(v).toBeCloseTo(ref[i], 9));
  });
  it('a rigid-body motion of a space member stores no geometric energy in translation', () => {
    const p = { E, G, A: 0.01, Iy: 8e-5, Iz: 2e-5, J: 3e-5, density: rho, theory: 'euler-bernoulli' as const };
    const k = spaceFrameGeometricStiffness(p, 1000, 1, 2, -0.5);
    const u = [0.3, -0.2, 0.7, 0, 0, 0, 0.3, -0.2, 0.7, 0, 0, 0];
    const ku = Array.from({ length: 12 }, (_, i) => u.reduce((s, x, j) => s + k[i * 12 + j] * x, 0));
    expect(Math.max(...ku.map(Math.abs))).toBeLessThan(1e-9);
  });
});

describe('Euler buckling of a plane column, 20 elements, within 1e-4', () => {
  const L = 3, b = 0.05, h = 0.1, A = b * h, I = (b * h ** 3) / 12;
  const PE = (Math.PI ** 2 * E * I) / L ** 2;
  // Euler (1744): P_cr = π²EI/(K L)², K = 1 pinned-pinned, 2 fixed-free, 0.5 fixed-fixed (from memory).
  const cases: [string, string[], string[], number][] = [
    ['pinned-pinned', ['uy'], ['uy'], PE],
    ['fixed-free', ['uy', 'rz'], [], PE / 4],
    ['fixed-fixed', ['uy', 'rz'], ['uy', 'rz'], 4 * PE],
  ];
  for (const [name, left, right, Pcr] of cases) {
    it(name, () => {
      const mu = bucklingFactors(planeBeamModel({ elements: 20, L, E, density: rho, A, I, left, right }));
      expect(relErr(mu[0], Pcr)).toBeLessThan(1e-4);
    });
  }

  it('thick pinned-pinned Timoshenko column: Engesser P = P_E / (1 + P_E/(κGA))', () => {
    // From the energy ½∫EIθ′² + ½∫κGA(v′ − θ)² − ½P∫v′², whose Euler-Lagrange equations give
    // EI(1 − P/κGA)v'''' + P v'' = 0, i.e. Engesser's formula (derived here).
    const Lt = 0.6, kappa = 5 / 6;
    const PEt = (Math.PI ** 2 * E * I) / Lt ** 2;
    const mu = bucklingFactors(planeBeamModel({ elements: 40, L: Lt, E, G, kappa, density: rho, A, I, left: ['uy'], right: ['uy'], kind: 'timoshenko' }));
    const engesser = PEt / (1 + PEt / (kappa * G * A));
    expect(relErr(mu[0], engesser)).toBeLessThan(1e-3);
    expect(relErr(engesser, PEt)).toBeGreaterThan(1e-2); // shear matters here
  });
});

describe('space column', () => {
  it('pinned-pinned column along Z buckles at π²EIy/L² and π²EIz/L² (both bending planes)', () => {
    const n = 20, L = 4, Iy = 8e-6, Iz = 2e-6;
    const nodes = Array.from({ length: n + 1 }, (_, i) => ({ id: `n${i}`, x: 0, y: 0, z: (L * i) / n }));
    const elements = Array.from({ length: n }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
    const supports = nodes.map((nd, i) => ({ node: nd.id, fixed: i === 0 || i === n ? ['ux', 'uy', 'uz', 'rz'] : ['uz', 'rz'] }));
    const mu = bucklingFactors({ format: 'eigenframe-model/1', space: 'space', materials: { m: { E, G, density: rho } }, sections: { s: { A: 0.003, Iy, Iz, J: 1e-6 } }, nodes, elements, supports } as never);
    const expected = [Iz, Iy].map((I) => (Math.PI ** 2 * E * I) / L ** 2);
    expect(relErr(mu[0], expected[0])).toBeLessThan(1e-4);
    expect(relErr(mu[1], expected[1])).toBeLessThan(1e-4);
  });
});

describe('taut string of bars', () => {
  it('transverse frequencies of a beaded string: ω_k² = 4N/(m h) · sin²(kπ/(2n)) (Lagrange; from memory, n segments, masses m at the n − 1 inner nodes)', () => {
    const n = 12, Lr = 6, h = Lr / n, N = 5000, A = 1e-4;
    const nodes = Array.from({ length: n + 1 }, (_, i) => ({ id: `n${i}`, x: i * h, y: 0 }));
    const elements = Array.from({ length: n }, (_, i) => ({ id: `b${i}`, kind: 'bar', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
    const supports = nodes.map((nd, i) => ({ node: nd.id, fixed: i === 0 || i === n ? ['ux', 'uy'] : ['ux'] }));
    const model = validateModel({ format: 'eigenframe-model/1', space: 'plane', mass: 'lumped', materials: { m: { E, density: rho } }, sections: { s: { A } }, nodes, elements, supports });
    const asm = assemble(model);
    const KG = assembleGeometric(asm, new Float64Array(n).fill(N));
    const K = toDenseArray(asm.stiffness).map((v, i) => v + toDenseArray(KG)[i]);
    const lam = denseEigenvalues(K, toDenseArray(asm.mass), asm.stiffness.n);
    const m = rho * A * h;
    for (let k = 1; k <= 4; k++) expect(relErr(lam[k - 1], ((4 * N) / (m * h)) * Math.sin((k * Math.PI) / (2 * n)) ** 2)).toBeLessThan(1e-12);
  });

  it('rejects a force list of the wrong length or with NaN (ArgumentError with the path)', () => {
    const asm = assemble(validateModel(planeBeamModel({ elements: 2, L: 1, E, density: rho, A: 1e-3, I: 1e-6, left: ['uy', 'rz'], right: [] })));
    expect(() => assembleGeometric(asm, [1])).toThrow(ArgumentError);
    try {
      assembleGeometric(asm, [1, NaN]);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('axialForce[1]');
    }
  });
});
