/** DOF numbering, assembly and mechanism detection. */
import { describe, expect, it } from 'vitest';
import { ModelError } from '../src/errors';
import { barStiffnessPlane } from '../src/elements/bar';
import { assemble } from '../src/model/assemble';
import { numberDofs } from '../src/model/dofs';
import { assertNoMechanism, findMechanisms, MECHANISM_DEFAULTS } from '../src/model/mechanisms';
import { validateModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import { toDenseArray } from '../src/linalg/sparse/symmetric';
import { relErr, sparseEigenvalues } from './model-helpers';

const steel = { E: 2e11, G: 8e10, density: 8000 };

// Two-bar plane truss (invented): a at the origin, b at (4, 0), apex c at (2, 1.5); a and b pinned.
const truss = (): Model =>
  validateModel({
    format: 'eigenframe-model/1', space: 'plane',
    materials: { steel }, sections: { rod: { A: 1e-3 } },
    nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'b', x: 4, y: 0 }, { id: 'c', x: 2, y: 1.5 }],
    elements: [
      { id: 'ac', kind: 'bar', nodes: ['a', 'c'], material: 'steel', section: 'rod' },
      { id: 'bc', kind: 'bar', nodes: ['b', 'c'], material: 'steel', section: 'rod' },
    ],
    supports: [{ node: 'a', fixed: ['ux', 'uy'] }, { node: 'b', fixed: ['ux', 'uy'] }],
    masses: [{ node: 'c', mass: 100, inertia: 7 }],
  });

describe('DOF numbering', () => {
  it('a truss node gets translations only; supports remove DOFs; node order then DOF order', () => {
    const { dofs, dofMap } = numberDofs(truss());
    expect(dofs.map((d) => `${d.node}.${d.dof}`)).toEqual(['c.ux', 'c.uy']);
    expect(Array.from(dofMap.subarray(12, 18))).toEqual([0, 1, -1, -1, -1, -1]);
  });
  it('a space node of beams gets six DOFs, a space truss node three', () => {
    const m = validateModel({
      format: 'eigenframe-model/1', space: 'space', materials: { steel }, sections: { s: { A: 1e-3, Iy: 1e-6, Iz: 1e-6, J: 2e-6 } },
      nodes: [{ id: 'a', x: 0, y: 0, z: 0 }, { id: 'b', x: 1, y: 0, z: 0 }, { id: 'c', x: 1, y: 1, z: 0 }],
      elements: [{ id: 'e', kind: 'beam', nodes: ['a', 'b'], material: 'steel', section: 's' }, { id: 'f', kind: 'bar', nodes: ['b', 'c'], material: 'steel', section: 's' }],
    });
    const names = numberDofs(m).dofs.map((d) => `${d.node}.${d.dof}`);
    expect(names).toEqual(['a.ux', 'a.uy', 'a.uz', 'a.rx', 'a.ry', 'a.rz', 'b.ux', 'b.uy', 'b.uz', 'b.rx', 'b.ry', 'b.rz', 'c.ux', 'c.uy', 'c.uz']);
  });
});

describe('assemble', () => {
  it('two-bar truss: K is the sum of the two bar matrices at the apex; M adds the point mass', () => {
    const asm = assemble(truss());
    expect(asm.stiffness.n).toBe(2);
    const K = toDenseArray(asm.stiffness);
    // Direct stiffness method (hand): apex block of each bar is the 2×2 EA/L·ccᵀ.
    const k1 = barStiffnessPlane(2e11, 1e-3, 2, 1.5);
    const k2 = barStiffnessPlane(2e11, 1e-3, -2, 1.5);
    expect(K[0]).toBeCloseTo(k1[10] + k2[10], 0);
    expect(K[1]).toBeCloseTo(k1[11] + k2[11], 0);
    expect(K[3]).toBeCloseTo(k1[15] + k2[15], 0);
    // Symmetric truss: ux stiffness 2·EA/L·cos²θ with cos θ = 0.8, L = 2.5 (statics by hand).
    expect(relErr(K[0], (2 * 2e11 * 1e-3 * 0.64) / 2.5)).toBeLessThan(1e-12);
    const M = toDenseArray(asm.mass);
    // Consistent bar mass: apex diagonal gets ρAL/3 from each bar, plus 100 kg; the rotary inertia
    // has no DOF to act on (documented) and is dropped.
    expect(M[0]).toBeCloseTo(100 + 2 * (8000 * 1e-3 * 2.5) / 3, 10);
    expect(asm.coordinates[7]).toBe(1.5);
    expect(asm.dofMap?.length).toBe(18);
  });

  it('a two-node spring between coincident nodes transmits the DOF it names', () => {
    // Two masses m on springs k (ground–a) and k (a–b): ω² = (3 ∓ √5)/2 · k/m (two-DOF chain,
    // e.g. Rao, Mechanical Vibrations, two-DOF systems; from memory, checked: roots of ω⁴ − 3(k/m)ω² + (k/m)² = 0).
    const k = 1000, m = 2;
    const model = validateModel({
      format: 'eigenframe-model/1', space: 'plane', materials: {}, sections: {},
      nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'b', x: 0, y: 0 }],
      elements: [],
      supports: [{ node: 'a', fixed: ['ux'] }, { node: 'b', fixed: ['ux'] }],
      springs: [{ node: 'a', dof: 'uy', stiffness: k }, { node: 'a', to: 'b', dof: 'uy', stiffness: k }],
      masses: [{ node: 'a', mass: m }, { node: 'b', mass: m }],
    });
    const asm = assemble(model);
    const lam = sparseEigenvalues(asm.stiffness, asm.mass);
    expect(relErr(lam[0], ((3 - Math.sqrt(5)) / 2) * (k / m))).toBeLessThan(1e-12);
    expect(relErr(lam[1], ((3 + Math.sqrt(5)) / 2) * (k / m))).toBeLessThan(1e-12);
  });

  it('lumped mass of an Euler-Bernoulli frame has zero rotational diagonal and stores every diagonal', () => {
    const m = validateModel({
      format: 'eigenframe-model/1', space: 'plane', mass: 'lumped', materials: { steel }, sections: { s: { A: 1e-3, Iz: 1e-6 } },
      nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'b', x: 2, y: 0 }],
      elements: [{ id: 'e', kind: 'beam', nodes: ['a', 'b'], material: 'steel', section: 's' }],
      supports: [{ node: 'a', fixed: ['ux', 'uy', 'rz'] }],
    });
    const asm = assemble(m);
    const M = toDenseArray(asm.mass);
    expect([M[0], M[4], M[8]]).toEqual([8, 8, 0]); // ρAL/2 = 8000·1e-3·2/2
    expect(asm.mass.colPtr[3] - asm.mass.colPtr[2]).toBeGreaterThanOrEqual(1);
  });
});

describe('mechanisms', () => {
  it('default tolerance is 1e-9', () => expect(MECHANISM_DEFAULTS.tolerance).toBe(1e-9));

  it('a well-supported truss has none', () => {
    expect(findMechanisms(assemble(truss()))).toEqual([]);
    expect(() => assertNoMechanism(assemble(truss()))).not.toThrow();
  });

  it('a node held by two collinear bars moves freely across them', () => {
    const m = validateModel({
      format: 'eigenframe-model/1', space: 'plane', materials: { steel }, sections: { rod: { A: 1e-3 } },
      nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'n4', x: 2, y: 0 }, { id: 'b', x: 4, y: 0 }],
      elements: [
        { id: 'e1', kind: 'bar', nodes: ['a', 'n4'], material: 'steel', section: 'rod' },
        { id: 'e2', kind: 'bar', nodes: ['n4', 'b'], material: 'steel', section: 'rod' },
      ],
      supports: [{ node: 'a', fixed: ['ux', 'uy'] }, { node: 'b', fixed: ['ux', 'uy'] }],
    });
    const asm = assemble(m);
    expect(findMechanisms(asm).map((f) => `${f.node}.${f.dof}`)).toEqual(['n4.uy']);
    try {
      assertNoMechanism(asm);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ModelError);
      expect((e as ModelError).path).toBe('nodes[1]');
      expect((e as ModelError).message).toContain('node "n4" dof uy is not stiffened by any element or spring (a mechanism); fix it in "supports" or connect it');
    }
  });

  it('a collinear bar in a skew direction: the transverse mechanism is found whatever the axes', () => {
    const c = Math.cos(0.3), s = Math.sin(0.3);
    const m = validateModel({
      format: 'eigenframe-model/1', space: 'space', materials: { steel }, sections: { rod: { A: 1e-3 } },
      nodes: [{ id: 'a', x: 0, y: 0, z: 0 }, { id: 'm', x: c, y: s, z: 0.2 }, { id: 'b', x: 2 * c, y: 2 * s, z: 0.4 }],
      elements: [
        { id: 'e1', kind: 'bar', nodes: ['a', 'm'], material: 'steel', section: 'rod' },
        { id: 'e2', kind: 'bar', nodes: ['m', 'b'], material: 'steel', section: 'rod' },
      ],
      supports: [{ node: 'a', fixed: ['ux', 'uy', 'uz'] }, { node: 'b', fixed: ['ux', 'uy', 'uz'] }],
    });
    expect(findMechanisms(assemble(m))).toHaveLength(2);
  });

  it('a point mass on an unconnected node, and a plane beam node with a free rotation only', () => {
    const m = validateModel({
      format: 'eigenframe-model/1', space: 'plane', materials: { steel }, sections: { s: { A: 1e-3, Iz: 1e-6 } },
      nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'b', x: 2, y: 0 }, { id: 'loose', x: 5, y: 5 }],
      elements: [{ id: 'e', kind: 'beam', nodes: ['a', 'b'], material: 'steel', section: 's' }],
      supports: [{ node: 'a', fixed: ['ux', 'uy', 'rz'] }],
      masses: [{ node: 'loose', mass: 3 }],
    });
    expect(findMechanisms(assemble(m)).map((f) => `${f.node}.${f.dof}`)).toEqual(['loose.ux', 'loose.uy']);
  });
});
