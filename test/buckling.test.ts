/** Linear buckling (src/modal/buckling.ts): Euler columns, a sway portal, routes, Sturm count, errors. */
import { describe, expect, it } from 'vitest';
import { ArgumentError, ModelError } from '../src/errors';
import { symmetricMultiply, toDenseArray } from '../src/linalg/sparse/symmetric';
import { axialForces, bucklingAnalysis, BUCKLING_DEFAULTS } from '../src/modal/buckling';
import { nodalLoadVector } from '../src/model/loads';
import { assemble } from '../src/model/assemble';
import { parseModel, validateModel } from '../src/model/read';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Model } from '../src/model/types';
import { bisect, denseEigenvalues, relErr } from './model-helpers';

const E = 2.1e11, rho = 7850;
const A = 4e-3, I = 2e-6; // a stocky steel section (invented, demo values)

/** A vertical plane column of `ne` beam elements along y, base n0, top n{ne}. */
function column(L: number, ne: number, base: string[], top: string[]): Model {
  const nodes = Array.from({ length: ne + 1 }, (_, i) => ({ id: `n${i}`, x: 0, y: (L * i) / ne }));
  const elements = Array.from({ length: ne }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'steel', section: 'col' }));
  const supports = [{ node: 'n0', fixed: base }, ...(top.length ? [{ node: `n${ne}`, fixed: top }] : [])];
  return validateModel({ format: 'eigenframe-model/1', space: 'plane', materials: { steel: { E, density: rho } }, sections: { col: { A, Iz: I } }, nodes, elements, supports });
}

describe('Euler columns: P = π²EI/(K L)², 20 elements', () => {
  const L = 3, P = 1000, ne = 20;
  // Effective length factors K (Euler 1744; Timoshenko & Gere, Theory of Elastic Stability, §2.1–2.3,
  // from memory): pinned-pinned 1, fixed-free 2, fixed-fixed 0.5; fixed-pinned π/x₁ with x₁ the
  // first positive root of tan x = x, solved here by bisection (≈ 4.4934, K ≈ 0.699, from memory).
  const x1 = bisect((x) => Math.tan(x) - x, Math.PI + 0.1, 1.5 * Math.PI - 1e-6);
  const cases: [string, string[], string[], number][] = [
    ['pinned-pinned (K = 1)', ['ux', 'uy'], ['ux'], 1],
    ['fixed-free (K = 2)', ['ux', 'uy', 'rz'], [], 2],
    ['fixed-pinned (K = π/x₁ ≈ 0.699)', ['ux', 'uy', 'rz'], ['ux'], Math.PI / x1],
    ['fixed-fixed (K = 0.5)', ['ux', 'uy', 'rz'], ['ux', 'rz'], 0.5],
  ];
  it('x₁ is the root ≈ 4.4934 (from memory)', () => expect(x1).toBeCloseTo(4.4934, 4));
  for (const [name, base, top, Keff] of cases) {
    it(name, () => {
      const r = bucklingAnalysis(column(L, ne, base, top), [{ node: `n${ne}`, dof: 'uy', value: -P }], { count: 2 });
      const Pcr = (Math.PI ** 2 * E * I) / (Keff * L) ** 2;
      expect(r.method).toBe('dense');
      // cubic elements with the consistent K_G converge as h⁴ (measured: 2.1e-4, 1.3e-5, 8.4e-7 for
      // fixed-fixed with 10, 20, 40 elements); fixed-fixed, the shortest wave, is the worst case
      expect(relErr(r.loadFactors[0] * P, Pcr)).toBeLessThan(2e-5);
      expect(r.sturm?.passed).toBe(true);
      expect(Math.max(...r.residuals)).toBeLessThan(1e-8);
      // every member carries the load as compression: N = −P (statics)
      for (const N of r.axialForce) expect(relErr(N, -P)).toBeLessThan(1e-9);
    });
  }

  it('the Lanczos route agrees with the dense route and with an ml-matrix dense reference', () => {
    const model = column(L, ne, ['ux', 'uy', 'rz'], ['ux']);
    const load = [{ node: `n${ne}`, dof: 'uy' as const, value: -P }];
    const dense = bucklingAnalysis(model, load, { count: 4, method: 'dense' });
    const sparse = bucklingAnalysis(model, load, { count: 4, method: 'lanczos' });
    expect(sparse.method).toBe('lanczos');
    // Reference: ml-matrix EigenvalueDecomposition of K φ = μ (−K_G) φ restricted to the DOFs
    // −K_G touches is awkward (−K_G is singular), so solve −K_G φ = ν K φ with K as the SPD matrix.
    const n = dense.assembled.stiffness.n;
    const nu = denseEigenvalues(toDenseArray(dense.geometricStiffness).map((v) => -v), toDenseArray(dense.assembled.stiffness), n);
    const ref = nu.filter((v) => v > 0).map((v) => 1 / v).sort((a, b) => a - b);
    for (let j = 0; j < 4; j++) {
      expect(relErr(dense.loadFactors[j], ref[j])).toBeLessThan(1e-9);
      expect(relErr(sparse.loadFactors[j], ref[j])).toBeLessThan(1e-9);
    }
    expect(sparse.sturm?.countBelow).toBe(4);
  });

  it('a 60-element column (180 DOFs) takes the Lanczos route by default', () => {
    const ne2 = 60;
    const r = bucklingAnalysis(column(L, ne2, ['ux', 'uy'], ['ux']), [{ node: `n${ne2}`, dof: 'uy', value: -P }], { count: 3 });
    expect(r.method).toBe('lanczos');
    // pinned-pinned: μ_k P = k² π²EI/L² (Euler's higher modes, from memory)
    for (let k = 1; k <= 3; k++) expect(relErr(r.loadFactors[k - 1] * P, (k * k * Math.PI ** 2 * E * I) / L ** 2)).toBeLessThan(1e-6);
  });
});

describe('sway portal frame with fixed bases', () => {
  // Each column (EI_c, height h) is held at its top by the beam (EI_b, span L), which in the
  // antisymmetric sway mode bends in double curvature: a rotational spring 6EI_b/L. From the
  // beam-column equation EI v'''' + P v'' = 0 with v(0) = v'(0) = 0, zero top shear and
  // EI v''(h) + (6EI_b/L) v'(h) = 0 the sway buckling condition is (derived here)
  //   tan u = −u · (I_c/h) / (6 I_b/L),  u = h √(P/EI_c),
  // which is the sway-frame alignment-chart equation with G_base = 0 and G_top = (I_c/h)/(I_b/L)
  // (Julian & Lawrence; AISC commentary, from memory); for G_top = 1 it gives K = π/u ≈ 1.16
  // (alignment chart, from memory).
  const h = 4, span = 4, Ic = 2e-6, Ib = 2e-6, Abig = 1e-2, P = 1000;
  function portal(ne: number): Model {
    const nodes: { id: string; x: number; y: number }[] = [];
    const elements: { id: string; kind: string; nodes: [string, string]; material: string; section: string }[] = [];
    const line = (name: string, x0: number, y0: number, x1: number, y1: number, start: string, end: string, sec: string) => {
      let prev = start;
      for (let i = 1; i <= ne; i++) {
        const id = i === ne ? end : `${name}${i}`;
        if (i < ne) nodes.push({ id, x: x0 + ((x1 - x0) * i) / ne, y: y0 + ((y1 - y0) * i) / ne });
        elements.push({ id: `${name}e${i}`, kind: 'beam', nodes: [prev, id], material: 'steel', section: sec });
        prev = id;
      }
    };
    nodes.push({ id: 'A', x: 0, y: 0 }, { id: 'B', x: 0, y: h }, { id: 'C', x: span, y: h }, { id: 'D', x: span, y: 0 });
    line('left', 0, 0, 0, h, 'A', 'B', 'column');
    line('beam', 0, h, span, h, 'B', 'C', 'girder');
    line('right', span, h, span, 0, 'C', 'D', 'column');
    return validateModel({
      format: 'eigenframe-model/1', space: 'plane',
      materials: { steel: { E, density: rho } },
      sections: { column: { A: Abig, Iz: Ic }, girder: { A: Abig, Iz: Ib } },
      nodes, elements,
      supports: [{ node: 'A', fixed: ['ux', 'uy', 'rz'] }, { node: 'D', fixed: ['ux', 'uy', 'rz'] }],
    });
  }
  const G = (Ic / h) / (Ib / span);
  const u = bisect((x) => Math.tan(x) + (x * G) / 6, Math.PI / 2 + 1e-6, Math.PI - 1e-9);

  it('the condition gives K ≈ 1.16 for G_top = 1 (alignment chart, from memory)', () => {
    expect(G).toBe(1);
    expect(Math.PI / u).toBeCloseTo(1.16, 2);
  });

  it('lifted portal: columns in tension, girder force only round-off: no buckling, an error on loads', () => {
    const r = () => bucklingAnalysis(portal(4), [{ node: 'B', dof: 'uy', value: P }, { node: 'C', dof: 'uy', value: P }]);
    expect(r).toThrowError(ArgumentError);
    expect(r).toThrowError(/no member is in compression/);
  });

  for (const method of ['dense', 'lanczos'] as const) {
    it(`lowest load factor matches the stability equation within 1e-4 (${method}, 12 elements per member)`, () => {
      const r = bucklingAnalysis(portal(12), [{ node: 'B', dof: 'uy', value: -P }, { node: 'C', dof: 'uy', value: -P }], { count: 2, method });
      const Pcr = (u * u * E * Ic) / (h * h);
      // the columns' axial shortening (ignored by the equation) is the remaining difference
      expect(relErr(r.loadFactors[0] * P, Pcr)).toBeLessThan(1e-4);
      // the sway mode: both tops move sideways together
      const asm = r.assembled;
      const idx = (node: string, dof: string) => asm.dofs.findIndex((d) => d.node === node && d.dof === dof);
      const s = r.shapes;
      expect(Math.abs(s[idx('B', 'ux')])).toBeGreaterThan(0.99);
      expect(relErr(s[idx('C', 'ux')], s[idx('B', 'ux')])).toBeLessThan(1e-3);
      // statics: the girder carries no axial force, each column carries P
      const els = asm.model.elements;
      els.forEach((e, k) => {
        if (e.section === 'column') expect(relErr(r.axialForce[k], -P)).toBeLessThan(1e-9);
        else expect(Math.abs(r.axialForce[k])).toBeLessThan(1e-9 * P);
      });
      expect(r.sturm?.passed).toBe(true);
    });
  }
});

describe('space column', () => {
  it('pinned-pinned column along Z buckles at π²EI/L² about both axes (Euler, from memory), dense and Lanczos', () => {
    const ne = 24, L = 4, Iy = 8e-6, Iz = 2e-6, G = 8.1e10, P = 1000;
    const nodes = Array.from({ length: ne + 1 }, (_, i) => ({ id: `n${i}`, x: 0, y: 0, z: (L * i) / ne }));
    const elements = Array.from({ length: ne }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
    // base: pinned (translations and twist held); top: held sideways and in twist, free to shorten
    const supports = [{ node: 'n0', fixed: ['ux', 'uy', 'uz', 'rz'] }, { node: `n${ne}`, fixed: ['ux', 'uy', 'rz'] }];
    const model = validateModel({ format: 'eigenframe-model/1', space: 'space', materials: { m: { E, G, density: rho } }, sections: { s: { A: 3e-3, Iy, Iz, J: 1e-6 } }, nodes, elements, supports });
    const load = [{ node: `n${ne}`, dof: 'uz' as const, value: -P }];
    for (const method of ['dense', 'lanczos'] as const) {
      const r = bucklingAnalysis(model, load, { count: 3, method });
      const expected = [Iz, Iy, 4 * Iz].map((Ii) => (Math.PI ** 2 * E * Ii) / L ** 2).sort((a, b) => a - b);
      for (let k = 0; k < 3; k++) expect(relErr(r.loadFactors[k] * P, expected[k])).toBeLessThan(1e-5);
      expect(r.sturm?.passed).toBe(true);
    }
  });
});

describe('repeated load factors (a doubly symmetric column, Iy = Iz)', () => {
  it('the Lanczos route finds both copies of each factor; the Sturm count proves none is missing', () => {
    const ne = 40, L = 4, I2 = 5e-6, G = 8.1e10, P = 1000;
    const nodes = Array.from({ length: ne + 1 }, (_, i) => ({ id: `n${i}`, x: 0, y: 0, z: (L * i) / ne }));
    const elements = Array.from({ length: ne }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
    const supports = [{ node: 'n0', fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] }];
    const model = validateModel({ format: 'eigenframe-model/1', space: 'space', materials: { m: { E, G, density: rho } }, sections: { s: { A: 3e-3, Iy: I2, Iz: I2, J: 1e-5 } }, nodes, elements, supports });
    const r = bucklingAnalysis(model, [{ node: `n${ne}`, dof: 'uz', value: -P }], { count: 4, method: 'lanczos' });
    // fixed-free: P = π²EI/(2L)², then 9× that (Euler, from memory); each twice (bending about y and z)
    const p1 = (Math.PI ** 2 * E * I2) / (4 * L * L);
    const expected = [p1, p1, 9 * p1, 9 * p1];
    for (let k = 0; k < 4; k++) expect(relErr(r.loadFactors[k] * P, expected[k])).toBeLessThan(1e-5);
    expect(r.sturm?.passed).toBe(true);
    expect(r.sturm?.countBelow).toBe(4);
    // the two shapes of a pair are K-orthogonal (different bending planes or combinations of them)
    const n = r.assembled.stiffness.n;
    const kx = new Float64Array(n);
    const a = r.shapes.subarray(0, n), b = r.shapes.subarray(n, 2 * n);
    symmetricMultiply(r.assembled.stiffness, b, kx);
    let ab = 0, aa = 0, bb = 0;
    const ka = new Float64Array(n);
    symmetricMultiply(r.assembled.stiffness, a, ka);
    for (let i = 0; i < n; i++) { ab += a[i] * kx[i]; aa += a[i] * ka[i]; bb += b[i] * kx[i]; }
    expect(Math.abs(ab) / Math.sqrt(aa * bb)).toBeLessThan(1e-8);
  });
});

describe('a truss footbridge with members in tension and in compression (examples/footbridge.json, demo data)', () => {
  it('Lanczos (with locked reruns past the negative factors) agrees with the dense route', () => {
    const model = parseModel(readFileSync(join(__dirname, '..', 'examples', 'footbridge.json'), 'utf8'));
    const loads = ['nt3', 'nt9', 'st3', 'st9'].map((node) => ({ node, dof: 'uz' as const, value: -1e4 }));
    const dense = bucklingAnalysis(model, loads, { count: 6, method: 'dense' });
    const sparse = bucklingAnalysis(model, loads, { count: 6, method: 'lanczos' });
    expect(dense.axialForce.some((N) => N > 0) && dense.axialForce.some((N) => N < 0)).toBe(true);
    for (let k = 0; k < 6; k++) expect(relErr(sparse.loadFactors[k], dense.loadFactors[k])).toBeLessThan(1e-10);
    expect(sparse.stats.rounds).toBeGreaterThan(1); // the first run met negative factors first
    expect(sparse.sturm?.passed).toBe(true);
    expect(dense.sturm?.passed).toBe(true);
  });
});

describe('load case and options', () => {
  const model = column(3, 8, ['ux', 'uy', 'rz'], []);
  const asm = assemble(model);

  it('defaults are documented', () => {
    expect(BUCKLING_DEFAULTS).toEqual({ count: 4, method: 'auto', tolerance: 1e-12, seed: 1, ordering: 'auto', verify: true });
  });

  it('loads on the same DOF add up; axial forces follow the static solve', () => {
    const f = nodalLoadVector(asm, [{ node: 'n8', dof: 'uy', value: -600 }, { node: 'n8', dof: 'uy', value: -400 }]);
    const g = asm.dofs.findIndex((d) => d.node === 'n8' && d.dof === 'uy');
    expect(f[g]).toBe(-1000);
    // a uniform shortening of 1 mm over 3 m: N = EA · (−1e-3/3) in every element
    const uvec = new Float64Array(asm.stiffness.n);
    asm.dofs.forEach((d, i) => { if (d.dof === 'uy') uvec[i] = (-1e-3 * Number(d.node.slice(1))) / 8; });
    for (const N of axialForces(asm, uvec)) expect(relErr(N, (-E * A * 1e-3) / 3)).toBeLessThan(1e-12);
  });

  it('typed errors name the offending load', () => {
    const bad = (loads: unknown, path: string) => {
      try {
        bucklingAnalysis(model, loads as never);
        throw new Error('did not throw');
      } catch (e) {
        expect(e).toBeInstanceOf(ArgumentError);
        expect((e as ArgumentError).path).toBe(path);
      }
    };
    bad([], 'loads');
    bad([{ node: 'zz', dof: 'uy', value: -1 }], 'loads[0].node');
    bad([{ node: 'n8', dof: 'uz', value: -1 }], 'loads[0].dof');
    bad([{ node: 'n0', dof: 'uy', value: -1 }], 'loads[0].dof'); // supported
    bad([{ node: 'n8', dof: 'uy', value: Number.NaN }], 'loads[0].value');
    bad([{ node: 'n8', dof: 'uy', value: 0 }], 'loads');
    bad([{ node: 'n8', dof: 'uy', value: +1000 }], 'loads'); // tension only
  });

  it('asking for more load factors than exist is an error on count', () => {
    // a 2-element cantilever has 4 bending DOFs, so at most 4 positive load factors
    const small = column(3, 2, ['ux', 'uy', 'rz'], []);
    expect(() => bucklingAnalysis(small, [{ node: 'n2', dof: 'uy', value: -1 }], { count: 5 })).toThrowError(ArgumentError);
    try {
      bucklingAnalysis(small, [{ node: 'n2', dof: 'uy', value: -1 }], { count: 5 });
    } catch (e) {
      expect((e as ArgumentError).path).toBe('count');
    }
    expect(() => bucklingAnalysis(model, [{ node: 'n8', dof: 'uy', value: -1 }], { count: 0 })).toThrowError(/count/);
  });

  it('a mechanism is refused with a ModelError naming a node', () => {
    const loose = column(3, 4, ['ux', 'uy'], []); // pinned base, free top: a sway mechanism
    try {
      bucklingAnalysis(loose, [{ node: 'n4', dof: 'uy', value: -1 }]);
      throw new Error('did not throw');
    } catch (e) {
      expect(e).toBeInstanceOf(ModelError);
      expect((e as ModelError).path).toMatch(/^nodes\[\d\]$/);
      expect((e as ModelError).message).toMatch(/mechanism/);
    }
  });
});
