/**
 * Hard but valid cases: free-free structures, repeated and clustered frequencies, stiffness
 * ratios of 1e8, massless rotations under lumped mass (singular M), shifts exactly on an
 * eigenvalue, a one-DOF model, a 2,000-element chain, and mechanisms. Each expected value names
 * its source beside it. Models are invented test data (steel-like properties).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../src/cli/run';
import { EigenframeError, ModelError } from '../src/errors';
import { solve } from '../src/eigen/solve';
import { CooBuilder, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { modalAnalysis } from '../src/modal/analysis';
import { assemble } from '../src/model/assemble';
import { assertNoMechanism, findMechanisms } from '../src/model/mechanisms';
import { validateModel } from '../src/model/read';
import type { ElementSpec, Model, NodeSpec } from '../src/model/types';
import { psdRank, rel } from './arbitraries';
import { bisect, planeBeamModel } from './model-helpers';

const E = 2.1e11; // Pa, steel (common practice)
const G = 8.1e10; // Pa
const RHO = 7850; // kg/m³

/** Every returned mode meets the product's acceptance rule (DESIGN.md, "Accuracy"). */
function accepted(r: ReturnType<typeof solve>): void {
  for (const v of r.residuals) expect(v).toBeLessThanOrEqual(1e-8);
  expect(r.orthogonalityError).toBeLessThanOrEqual(1e-10);
  if (r.sturm) expect(r.sturm.passed).toBe(true);
}

/** A straight space member chain from `origin` along the unit vector `dir`, `elements` beam elements. */
function spaceLine(elements: number, L: number, dir: [number, number, number], prefix = '', origin: [number, number, number] = [0, 0, 0]): { nodes: NodeSpec[]; elements: ElementSpec[] } {
  const nodes = Array.from({ length: elements + 1 }, (_, i) => ({ id: `${prefix}n${i}`, x: origin[0] + (dir[0] * L * i) / elements, y: origin[1] + (dir[1] * L * i) / elements, z: origin[2] + (dir[2] * L * i) / elements }));
  const els = Array.from({ length: elements }, (_, i) => ({ id: `${prefix}e${i}`, kind: 'beam' as const, nodes: [`${prefix}n${i}`, `${prefix}n${i + 1}`] as [string, string], material: 'steel', section: 'sec' }));
  return { nodes, elements: els };
}

function spaceModel(parts: Array<{ nodes: NodeSpec[]; elements: ElementSpec[] }>, sec: { A: number; Iz: number; Iy: number; J: number }, supports: Model['supports'], mass: 'consistent' | 'lumped' = 'consistent'): Model {
  return validateModel({
    format: 'eigenframe-model/1',
    space: 'space',
    mass,
    materials: { steel: { E, G, density: RHO } },
    sections: { sec },
    nodes: parts.flatMap((p) => p.nodes),
    elements: parts.flatMap((p) => p.elements),
    supports,
  });
}

// Euler–Bernoulli roots (Blevins, Formulas for Natural Frequency and Mode Shape, table 8-1;
// values from memory, solved here): cantilever 1 + cos x cosh x = 0 (x₁ ≈ 1.875104),
// free-free 1 − cos x cosh x = 0 (x₁ ≈ 4.730041).
const X_CANTILEVER = bisect((x) => 1 + Math.cos(x) * Math.cosh(x), 1, 3);
const X_FREE_FREE = bisect((x) => 1 - Math.cos(x) * Math.cosh(x), 4, 5.5);
const beamHz = (x: number, L: number, EI: number, rhoA: number) => ((x / L) ** 2 * Math.sqrt(EI / rhoA)) / (2 * Math.PI);

describe('free-free structures', () => {
  it('plane: three rigid-body modes at ≈ 0, then the free-free bending mode (dense and lanczos)', () => {
    // An unsupported plane body has 3 rigid-body motions (2 translations, 1 rotation).
    const A = 4e-3;
    const I = 2e-5;
    const L = 6;
    const model = planeBeamModel({ elements: 60, L, E, density: RHO, A, I, left: [], right: [] });
    model.supports = []; // no ux restraint either: fully free (183 DOFs)
    const f1 = beamHz(X_FREE_FREE, L, E * I, RHO * A);
    for (const method of ['dense', 'lanczos'] as const) {
      const r = modalAnalysis(model, { count: 5, method });
      accepted(r.eigen);
      const lam = r.modes.map((m) => m.eigenvalue);
      for (let k = 0; k < 3; k++) expect(Math.abs(lam[k]), `${method} rigid mode ${k + 1}`).toBeLessThan(1e-6 * lam[3]);
      expect(r.modes.slice(0, 3).every((m) => Number.isFinite(m.frequency) && m.frequency >= 0)).toBe(true);
      expect(rel(r.modes[3].frequency, f1), `${method} first elastic mode`).toBeLessThan(1e-4); // 60 elements
      // The rigid-body modes span the translations: they carry the whole mass in ux and uy
      // (r itself is a rigid-body mode, so it lies in their span).
      for (const d of ['ux', 'uy'] as const) {
        const rigid = r.modes.slice(0, 3).reduce((s, m) => s + m.effectiveMass[d]!, 0);
        expect(rel(rigid, r.totalMass[d]!), `${method} rigid mass ${d}`).toBeLessThan(1e-8);
      }
    }
  });

  it('space: six rigid-body modes at ≈ 0 (dense and lanczos)', () => {
    // An unsupported body in space has 6 rigid-body motions. An L-shaped pair of members
    // (not collinear, so the torsion of one is the bending of the other: no mechanism).
    const sec = { A: 3e-3, Iz: 1e-5, Iy: 6e-6, J: 8e-6 };
    const a = spaceLine(14, 4, [1, 0, 0], 'a');
    const b = spaceLine(14, 3, [0, 1, 0], 'b', [4, 0, 0]);
    b.nodes.shift(); // b starts at a's last node
    b.elements[0].nodes[0] = 'an14';
    const model = spaceModel([a, b], sec, []);
    expect(assemble(model).stiffness.n).toBe(6 * 29); // 174 DOFs: above the dense crossover
    for (const method of ['dense', 'lanczos', 'subspace'] as const) {
      const r = modalAnalysis(model, { count: 8, method });
      accepted(r.eigen);
      const lam = r.modes.map((m) => m.eigenvalue);
      for (let k = 0; k < 6; k++) expect(Math.abs(lam[k]), `${method} rigid mode ${k + 1}`).toBeLessThan(1e-6 * lam[6]);
      expect(lam[6]).toBeGreaterThan(1);
    }
  });
});

describe('repeated and clustered frequencies', () => {
  it('square mast (Iy = Iz): bending pairs come out as equal pairs at the cantilever closed form', () => {
    // A vertical cantilever with a doubly symmetric section bends alike in x and in y, so each
    // bending frequency is double (symmetry). 30 elements, 180 DOFs: the sparse path.
    const sec = { A: 4e-3, Iz: 2.5e-5, Iy: 2.5e-5, J: 4e-5 };
    const L = 12;
    const mast = spaceLine(30, L, [0, 0, 1]);
    const model = spaceModel([mast], sec, [{ node: 'n0', fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] }]);
    const f1 = beamHz(X_CANTILEVER, L, E * sec.Iz, RHO * sec.A);
    for (const method of ['lanczos', 'subspace', 'dense'] as const) {
      const r = modalAnalysis(model, { count: 4, method });
      accepted(r.eigen);
      const f = r.modes.map((m) => m.frequency);
      expect(rel(f[0], f1), `${method} f1`).toBeLessThan(1e-5);
      expect(rel(f[1], f[0]), `${method} pair 1`).toBeLessThan(1e-10);
      expect(rel(f[3], f[2]), `${method} pair 2`).toBeLessThan(1e-10);
      expect(f[2] / f[0]).toBeGreaterThan(5); // second bending pair ≈ 6.27 × f1 (Blevins, from memory)
    }
  });

  it('two identical uncoupled substructures: every eigenvalue twice (lanczos, subspace, dense)', () => {
    // Two disjoint identical cantilevers: K and M are block-diagonal with equal blocks, so the
    // spectrum is the single cantilever's, each eigenvalue with multiplicity 2.
    const single = planeBeamModel({ elements: 40, L: 5, E, density: RHO, A: 3e-3, I: 1e-5, left: ['uy', 'rz'], right: [] });
    const twin: Model = {
      ...single,
      nodes: [...single.nodes, ...single.nodes.map((n) => ({ ...n, id: `t${n.id}`, y: 1 }))],
      elements: [...single.elements, ...single.elements.map((e) => ({ ...e, id: `t${e.id}`, nodes: [`t${e.nodes[0]}`, `t${e.nodes[1]}`] as [string, string] }))],
      supports: [...single.supports!, ...single.supports!.map((s) => ({ ...s, node: `t${s.node}` }))],
    };
    const ref = modalAnalysis(single, { count: 5, method: 'dense' }).modes.map((m) => m.eigenvalue);
    for (const method of ['lanczos', 'subspace', 'dense'] as const) {
      const r = modalAnalysis(twin, { count: 10, method });
      accepted(r.eigen);
      for (let k = 0; k < 5; k++) {
        expect(rel(r.modes[2 * k].eigenvalue, ref[k]), `${method} copy 1 of mode ${k + 1}`).toBeLessThan(1e-9);
        expect(rel(r.modes[2 * k + 1].eigenvalue, ref[k]), `${method} copy 2 of mode ${k + 1}`).toBeLessThan(1e-9);
      }
    }
  });

  it('tightly clustered pair (relative gap 1e-9): both found, in order, Sturm check passed', () => {
    // The twin again, one copy's E raised by 2e-9 relative: λ scales with E, so each pair
    // splits by exactly that factor (λ ∝ E for fixed geometry and mass).
    const a = planeBeamModel({ elements: 40, L: 5, E, density: RHO, A: 3e-3, I: 1e-5, left: ['uy', 'rz'], right: [] });
    const b = planeBeamModel({ elements: 40, L: 5, E: E * (1 + 2e-9), density: RHO, A: 3e-3, I: 1e-5, left: ['uy', 'rz'], right: [] });
    const model: Model = {
      ...a,
      materials: { m: a.materials.m, m2: b.materials.m },
      nodes: [...a.nodes, ...b.nodes.map((n) => ({ ...n, id: `t${n.id}`, y: 1 }))],
      elements: [...a.elements, ...b.elements.map((e) => ({ ...e, id: `t${e.id}`, material: 'm2', nodes: [`t${e.nodes[0]}`, `t${e.nodes[1]}`] as [string, string] }))],
      supports: [...a.supports!, ...a.supports!.map((s) => ({ ...s, node: `t${s.node}` }))],
    };
    const ref = modalAnalysis(a, { count: 3, method: 'dense' }).modes.map((m) => m.eigenvalue);
    for (const method of ['lanczos', 'subspace', 'dense'] as const) {
      const r = modalAnalysis(model, { count: 6, method });
      accepted(r.eigen);
      for (let k = 0; k < 3; k++) {
        expect(rel(r.modes[2 * k].eigenvalue, ref[k]), `${method} lower of pair ${k + 1}`).toBeLessThan(1e-9);
        expect(rel(r.modes[2 * k + 1].eigenvalue, ref[k] * (1 + 2e-9)), `${method} upper of pair ${k + 1}`).toBeLessThan(1e-9);
      }
    }
  });
});

describe('stiffness ratio 1e8', () => {
  it('soft spring + nearly rigid link: the 2-DOF closed form', () => {
    // Wall —(k = EA/L₁)— m₁ —(K = 1e8·k)— m₂, axial bars along x with lumped mass and point
    // masses. det(K − λM) = 0: m₁m₂λ² − (m₁K + m₂(k + K))λ + kK = 0 (2 × 2 determinant, derived
    // here), solved with the cancellation-free form of the quadratic formula.
    const A = 1e-3;
    const L = 2;
    const model = validateModel({
      format: 'eigenframe-model/1',
      space: 'plane',
      mass: 'lumped',
      materials: { soft: { E, density: RHO }, stiff: { E: E * 1e8, density: RHO } },
      sections: { rod: { A } },
      nodes: [{ id: 'w', x: 0, y: 0 }, { id: 'p', x: L, y: 0 }, { id: 'q', x: 2 * L, y: 0 }],
      elements: [
        { id: 'soft', kind: 'bar', nodes: ['w', 'p'], material: 'soft', section: 'rod' },
        { id: 'link', kind: 'bar', nodes: ['p', 'q'], material: 'stiff', section: 'rod' },
      ],
      supports: [{ node: 'w', fixed: ['ux', 'uy'] }, { node: 'p', fixed: ['uy'] }, { node: 'q', fixed: ['uy'] }],
      masses: [{ node: 'p', mass: 50 }, { node: 'q', mass: 80 }],
    });
    const k = (E * A) / L;
    const K = 1e8 * k;
    const m1 = 50 + RHO * A * L; // half of each bar lumped at p
    const m2 = 80 + (RHO * A * L) / 2;
    const b = m1 * K + m2 * (k + K);
    const disc = Math.sqrt(b * b - 4 * m1 * m2 * k * K);
    const hi = (b + disc) / (2 * m1 * m2);
    const lo = (k * K) / (m1 * m2 * hi); // product of roots = kK/(m₁m₂)
    // The data itself limits the low mode: K's entry k + K is stored with an absolute error
    // ε·K = 1e8·ε·k, i.e. ~2e-8 relative on λ_low; 1e-7 allows for that, 1e-12 on λ_high.
    for (const method of ['dense', 'jacobi', 'lanczos', 'subspace'] as const) {
      const r = modalAnalysis(model, { count: 2, method });
      accepted(r.eigen);
      expect(rel(r.modes[0].eigenvalue, lo), `${method} low`).toBeLessThan(1e-7);
      expect(rel(r.modes[1].eigenvalue, hi), `${method} high`).toBeLessThan(1e-12);
    }
  });

  it('stiff beam on soft end springs (beam stiffness 48EI/L³ = 1e8 × spring): rigid bounce and pitch', () => {
    // A beam 1e8 times stiffer than its supports moves as a rigid body on them. Rigid-body
    // modes on two springs k at the ends (Chopra, Dynamics of Structures, rigid-body systems;
    // derived here): bounce ω² = 2k/m, pitch ω² = 2k(L/2)² / (mL²/12) = 6k/m, m = ρAL (the
    // consistent cubic beam mass reproduces rigid translation and rotation exactly). Beam
    // flexibility lowers them by a relative ~1/ratio = 1e-8. The tolerance is numerical: with
    // λ_max/λ_1 ≈ 1e14 these low modes are ill-conditioned (DESIGN.md: correct solvers may
    // differ by ~1e-5 there); 1e-4 keeps a margin of ten over that.
    const A = 3e-3;
    const I = 1e-5;
    const L = 10;
    const k = (48 * E * I) / L ** 3 / 1e8; // N/m
    const model = planeBeamModel({ elements: 20, L, E, density: RHO, A, I, left: [], right: [] });
    model.supports = [{ node: 'n0', fixed: ['ux'] }]; // axial restraint only
    model.springs = [
      { node: 'n0', dof: 'uy', stiffness: k },
      { node: 'n20', dof: 'uy', stiffness: k },
    ];
    const m = RHO * A * L;
    for (const method of ['dense', 'jacobi', 'lanczos', 'subspace'] as const) {
      const r = modalAnalysis(model, { count: 3, method });
      accepted(r.eigen);
      expect(rel(r.modes[0].eigenvalue, (2 * k) / m), `${method} bounce`).toBeLessThan(1e-4);
      expect(rel(r.modes[1].eigenvalue, (6 * k) / m), `${method} pitch`).toBeLessThan(1e-4);
      expect(r.modes[2].eigenvalue / r.modes[1].eigenvalue).toBeGreaterThan(1e6); // then the beam itself
    }
  });
});

describe('massless rotational DOFs under lumped mass (singular M)', () => {
  it('lumped cantilever: dense and lanczos agree, and approach the Euler–Bernoulli closed form', () => {
    // Lumped Euler–Bernoulli elements carry no rotary inertia: the 80 rotations are massless,
    // their eigenvalues infinite (never listed). 80 elements, 160 DOFs: dense and sparse paths.
    const A = 3e-3;
    const I = 1e-5;
    const L = 4;
    const model = planeBeamModel({ elements: 80, L, E, density: RHO, A, I, left: ['uy', 'rz'], right: [], mass: 'lumped' });
    const f = [1, 2, 3].map((_, k) => beamHz(bisect((x) => 1 + Math.cos(x) * Math.cosh(x), [1, 4, 7][k], [3, 6, 9][k]), L, E * I, RHO * A));
    const dense = modalAnalysis(model, { count: 3, method: 'dense' });
    const lanczos = modalAnalysis(model, { count: 3, method: 'lanczos' });
    accepted(dense.eigen);
    accepted(lanczos.eigen);
    for (let k = 0; k < 3; k++) {
      // λ_max/λ_1 ≈ 1e9 here: per-mode agreement to 1e-8 (DESIGN.md, ill-conditioned low modes).
      expect(rel(lanczos.modes[k].eigenvalue, dense.modes[k].eigenvalue)).toBeLessThan(1e-8);
      expect(rel(dense.modes[k].frequency, f[k]), `mode ${k + 1} vs closed form`).toBeLessThan(2e-3); // lumped: O(h²)
    }
    // Only the 80 massive DOFs have finite eigenvalues.
    expect(() => solve(assemble(model).stiffness, assemble(model).mass, { method: 'lanczos', count: 81 })).toThrow(EigenframeError);
    expect(modalAnalysis(model, { count: 80, method: 'dense' }).modes).toHaveLength(80);
  });

  it('skew space cantilever, lumped: M singular without zero rows; dense and lanczos agree with the closed form (found by this suite)', () => {
    // Regression: the lumped torsional inertia of a skew member is ρIₚL/2 · x xᵀ on the three
    // rotations (rank 1, no zero row), so M had null directions that were not DOFs, and the
    // dense route failed with "M is not positive definite". Each free node carries 3
    // translational masses and 1 torsional inertia: rank M = 4 per node.
    const ne = 30;
    const L = 6;
    const u = [1, 0.7, 0.4].map((c, _, a) => c / Math.hypot(...a));
    const nodes = Array.from({ length: ne + 1 }, (_, i) => ({ id: `n${i}`, x: (u[0] * L * i) / ne, y: (u[1] * L * i) / ne, z: (u[2] * L * i) / ne }));
    const elements = Array.from({ length: ne }, (_, i) => ({ id: `e${i}`, kind: 'beam' as const, nodes: [`n${i}`, `n${i + 1}`] as [string, string], material: 'steel', section: 'sec' }));
    const sec = { A: 3e-3, Iz: 1e-5, Iy: 4e-6, J: 1.2e-5 };
    const model = spaceModel([{ nodes, elements }], sec, [{ node: 'n0', fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] }], 'lumped');
    const weak = beamHz(X_CANTILEVER, L, E * sec.Iy, RHO * sec.A); // bending about the weaker axis
    const dense = modalAnalysis(model, { count: 3, method: 'dense' });
    const lanczos = modalAnalysis(model, { count: 3, method: 'lanczos' });
    accepted(dense.eigen);
    accepted(lanczos.eigen);
    for (let k = 0; k < 3; k++) expect(rel(dense.modes[k].eigenvalue, lanczos.modes[k].eigenvalue)).toBeLessThan(1e-9);
    expect(rel(dense.modes[0].frequency, weak)).toBeLessThan(3e-3); // lumped mass, 30 elements: O(h²)
    const asm = assemble(model);
    expect(psdRank(asm.mass)).toBe(4 * ne); // ml-matrix
    expect(modalAnalysis(asm, { count: 4 * ne, method: 'dense' }).modes).toHaveLength(4 * ne);
    expect(() => modalAnalysis(asm, { count: 4 * ne + 1, method: 'dense' })).toThrow(/count/);
  });

  it('M singular without zero rows, 3 × 3: finite eigenvalues 1/2 and 1 by every method', () => {
    // K = I, M = [1 1 0; 1 1 0; 0 0 1] = 2uuᵀ ⊕ [1], u = (1, 1)/√2: the direction (1, −1, 0) has
    // no mass; on u, λ = uᵀKu / 2 = 1/2; on e₃, λ = 1 (derived here).
    const K = new CooBuilder(3, 3);
    const M = new CooBuilder(3, 4);
    for (let i = 0; i < 3; i++) {
      K.add(i, i, 1);
      M.add(i, i, 1);
    }
    M.add(1, 0, 1);
    const [k, m] = [K.toCsc(), M.toCsc()];
    for (const method of ['cholesky', 'jacobi', 'lanczos'] as const) {
      const r = solve(k, m, { method, count: 2 });
      accepted(r);
      expect(Array.from(r.eigenvalues).map((v) => Math.round(v * 1e12) / 1e12), method).toEqual([0.5, 1]);
    }
    expect(() => solve(k, m, { method: 'cholesky', count: 3 })).toThrow(/count/);
  });

  it('a zero diagonal mass beside an underflowed coupling (5e-324) is massless, not indefinite (found by property tests)', () => {
    // A member off an axis by 2.5e-323 m gets x_z² = 0 but x_y·x_z = −2.5e-323 in its global
    // lumped torsional inertia. Here: M = diag(2, 0) with M(1, 0) = 5e-324, K = diag(8, 3):
    // the massless DOF is condensed out and the one eigenvalue is 8 / 2 = 4.
    const K = new CooBuilder(2, 2);
    K.add(0, 0, 8);
    K.add(1, 1, 3);
    const M = new CooBuilder(2, 3);
    M.add(0, 0, 2);
    M.add(1, 0, 5e-324);
    M.add(1, 1, 0);
    for (const method of ['cholesky', 'jacobi'] as const) {
      const r = solve(K.toCsc(), M.toCsc(), { method, count: 1 });
      expect(r.eigenvalues[0]).toBe(4);
    }
  });

  it('lumped space frame with small torsional inertias: cholesky, jacobi and lanczos agree to 1e-10 (found by property tests)', () => {
    // Regression: the Cholesky reduction gave the lowest eigenvalue with a relative error of
    // ~2e-8 here (absolute error ~ ε·λ_max with λ_max ~ 1e11 from the tiny rotary inertias),
    // while Jacobi and Lanczos agreed to 1e-12. Fixed by Rayleigh quotients (eigen/dense).
    const nodes: NodeSpec[] = [];
    const elements: ElementSpec[] = [];
    for (let k = 0; k <= 2; k++) for (let j = 0; j <= 2; j++) for (let i = 0; i <= 1; i++) nodes.push({ id: `n${i}${j}${k}`, x: 2 * i, y: 2 * j, z: 2.5 * k });
    const add = (id: string, a: string, b: string, sec: string, o: [number, number, number]) => elements.push({ id, kind: 'beam', nodes: [a, b], material: 'm', section: sec, orientation: o });
    for (let k = 0; k < 2; k++) for (let j = 0; j <= 2; j++) for (let i = 0; i <= 1; i++) add(`c${i}${j}${k}`, `n${i}${j}${k}`, `n${i}${j}${k + 1}`, 'col', [1, 0, 0]);
    for (let k = 1; k <= 2; k++) {
      for (let j = 0; j <= 2; j++) add(`x${j}${k}`, `n0${j}${k}`, `n1${j}${k}`, 'beam', [0, 0, 1]);
      for (let j = 0; j < 2; j++) for (let i = 0; i <= 1; i++) add(`y${i}${j}${k}`, `n${i}${j}${k}`, `n${i}${j + 1}${k}`, 'beam', [1, 0, 0]);
    }
    const model = validateModel({
      format: 'eigenframe-model/1',
      space: 'space',
      mass: 'lumped',
      materials: { m: { E: 5e10, G: 1.923e10, density: 1000 } },
      sections: { col: { A: 5e-4, Iz: 8.8e-5, Iy: 1e-7, J: 1.5e-6 }, beam: { A: 1.8e-3, Iz: 1.1e-7, Iy: 1e-7, J: 1e-7 } },
      nodes,
      elements,
      supports: nodes.filter((n) => n.z === 0).map((n) => ({ node: n.id, fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] })),
    });
    const asm = assemble(model);
    const lan = solve(asm.stiffness, asm.mass, { method: 'lanczos', count: 4 });
    for (const method of ['cholesky', 'jacobi'] as const) {
      const r = solve(asm.stiffness, asm.mass, { method, count: 4 });
      accepted(r);
      for (let k = 0; k < 4; k++) expect(rel(r.eigenvalues[k], lan.eigenvalues[k]), `${method} mode ${k + 1}`).toBeLessThan(1e-10);
    }
  });
});

/** 100 uncoupled 2 × 2 blocks c·[2 −1; −1 2] with unit mass, c = 1..100: λ ∈ {c, 3c}, exact integers. */
function integerBlocks(): { K: SymmetricCsc; M: SymmetricCsc; spectrum: number[] } {
  const K = new CooBuilder(200, 300);
  const M = new CooBuilder(200, 200);
  const spectrum: number[] = [];
  for (let c = 1; c <= 100; c++) {
    const i = 2 * (c - 1);
    K.add(i, i, 2 * c);
    K.add(i + 1, i + 1, 2 * c);
    K.add(i + 1, i, -c);
    M.add(i, i, 1);
    M.add(i + 1, i + 1, 1);
    // Eigenvalues of [2 −1; −1 2] are 1 and 3 (trace 4, determinant 3).
    spectrum.push(c, 3 * c);
  }
  spectrum.sort((a, b) => a - b);
  return { K: K.toCsc(), M: M.toCsc(), spectrum };
}

describe('a shift exactly on an eigenvalue', () => {
  const { K, M, spectrum } = integerBlocks();
  // Lowest: 1, 2, 3, 3, 4, 5, 6, 6 (3 = 3·1 = 3 and 6 = 3·2 = 6 are double).

  it('shift = λ (a double one): the lowest modes, Sturm-verified (lanczos and subspace)', () => {
    for (const method of ['lanczos', 'subspace'] as const) {
      for (const shift of [3, 6, 1]) {
        const r = solve(K, M, { method, shift, count: 8 });
        accepted(r);
        expect(Array.from(r.eigenvalues).map((v) => Math.round(v * 1e9) / 1e9), `${method} shift ${shift}`).toEqual(spectrum.slice(0, 8));
      }
    }
  });

  it('near = λ exactly: the modes at the target first, both copies of a double one', () => {
    for (const method of ['lanczos', 'subspace', 'dense'] as const) {
      const r = solve(K, M, { method, near: 6, count: 2 });
      accepted(r);
      for (const v of r.eigenvalues) expect(Math.abs(v - 6), method).toBeLessThan(1e-9);
      const three = solve(K, M, { method, near: 12, count: 3 }); // 12 (= 12·1 and 3·4) twice, then 11 or 13
      accepted(three);
      expect(three.eigenvalues.filter((v) => Math.abs(v - 12) < 1e-9).length, method).toBe(2);
    }
  });

  it('on a model: shift and near equal to a computed eigenvalue (K − σM numerically singular)', () => {
    // The dense route's λ₃ is an eigenvalue of the stored K, M to round-off, so K − λ₃M has a
    // pivot near zero; the result must still be the dense one.
    const model = planeBeamModel({ elements: 60, L: 5, E, density: RHO, A: 3e-3, I: 1e-5, left: ['uy', 'rz'], right: ['uy'] });
    const asm = assemble(model);
    const ref = modalAnalysis(asm, { count: 6, method: 'dense' }).modes.map((m) => m.eigenvalue);
    for (const method of ['lanczos', 'subspace'] as const) {
      const r = modalAnalysis(asm, { count: 6, method, shift: ref[2] });
      accepted(r.eigen);
      for (let k = 0; k < 6; k++) expect(rel(r.modes[k].eigenvalue, ref[k]), `${method} shift=λ3 mode ${k + 1}`).toBeLessThan(1e-9);
      const near = modalAnalysis(asm, { count: 1, method, near: ref[2] });
      accepted(near.eigen);
      expect(rel(near.modes[0].eigenvalue, ref[2]), `${method} near=λ3`).toBeLessThan(1e-9);
    }
  });

  it('range ends exactly on eigenvalues: every mode in [3, 9] (both ends included)', () => {
    const want = spectrum.filter((v) => v >= 3 && v <= 9); // 3 3 4 5 6 6 7 8 9 9
    for (const method of ['lanczos', 'subspace', 'dense'] as const) {
      const r = solve(K, M, { method, range: [3, 9] });
      accepted(r);
      expect(Array.from(r.eigenvalues).map((v) => Math.round(v * 1e9) / 1e9), method).toEqual(want);
    }
  });
});

describe('small and long extremes', () => {
  it('one-DOF model: λ = k/m by every method', () => {
    // A bar along x, fixed at w; at p only ux is free (uy supported). Consistent bar mass
    // ρAL/6·[2 1; 1 2] (Przemieniecki 1968, from memory) leaves ρAL/3 on ux at p.
    const A = 2e-3;
    const L = 1.5;
    const model = validateModel({
      format: 'eigenframe-model/1',
      space: 'plane',
      materials: { steel: { E, density: RHO } },
      sections: { rod: { A } },
      nodes: [{ id: 'w', x: 0, y: 0 }, { id: 'p', x: L, y: 0 }],
      elements: [{ id: 'bar', kind: 'bar', nodes: ['w', 'p'], material: 'steel', section: 'rod' }],
      supports: [{ node: 'w', fixed: ['ux', 'uy'] }, { node: 'p', fixed: ['uy'] }],
      masses: [{ node: 'p', mass: 20 }],
    });
    const lambda = (E * A) / L / ((RHO * A * L) / 3 + 20);
    for (const method of ['dense', 'jacobi', 'cholesky', 'lanczos', 'subspace'] as const) {
      const r = modalAnalysis(model, { count: 1, method });
      expect(r.modes).toHaveLength(1);
      accepted(r.eigen);
      expect(rel(r.modes[0].eigenvalue, lambda), method).toBeLessThan(1e-12);
      // One DOF: its mode carries all the mass (Σ effective mass = rᵀMr).
      expect(rel(r.modes[0].effectiveMass.ux!, r.totalMass.ux!)).toBeLessThan(1e-12);
    }
  });

  it('2,000 bar elements in a line: fixed-free rod f_n = (2n − 1)/(4L)·√(E/ρ), with the known dispersion error of linear elements', () => {
    // Axial vibration of a fixed-free uniform rod (Timoshenko & Young, Vibration Problems in
    // Engineering; closed form from memory).
    const n = 2000;
    const L = 100;
    const nodes = Array.from({ length: n + 1 }, (_, i) => ({ id: `n${i}`, x: (L * i) / n, y: 0 }));
    const elements = Array.from({ length: n }, (_, i) => ({ id: `e${i}`, kind: 'bar', nodes: [`n${i}`, `n${i + 1}`], material: 'steel', section: 'rod' }));
    const supports = nodes.map((nd, i) => ({ node: nd.id, fixed: i === 0 ? ['ux', 'uy'] : ['uy'] }));
    const model = validateModel({ format: 'eigenframe-model/1', space: 'plane', materials: { steel: { E, density: RHO } }, sections: { rod: { A: 1e-3 } }, nodes, elements, supports });
    const c = Math.sqrt(E / RHO);
    const h = L / n;
    for (const method of ['auto', 'subspace'] as const) {
      const r = modalAnalysis(model, { count: 5, method });
      accepted(r.eigen);
      expect(r.eigen.method).toBe(method === 'auto' ? 'lanczos' : 'subspace');
      for (let k = 1; k <= 5; k++) {
        const exact = ((2 * k - 1) / (4 * L)) * c;
        // Linear elements with consistent mass overestimate ω by (κh)²/24 + O((κh)⁴), κ the
        // wavenumber (Hughes, The Finite Element Method, ch. 9 dispersion analysis; from memory).
        const kh = ((2 * k - 1) * Math.PI * h) / (2 * L);
        const err = r.modes[k - 1].frequency / exact - 1;
        expect(Math.abs(err - kh ** 2 / 24), `${method} mode ${k}: error ${err}`).toBeLessThan(0.02 * (kh ** 2 / 24) + 1e-9);
      }
    }
  });
});

describe('mechanisms', () => {
  const base = {
    format: 'eigenframe-model/1',
    space: 'plane',
    materials: { steel: { E, density: RHO } },
    sections: { rod: { A: 1e-3 } },
  };

  it('a node held by collinear bars only: ModelError naming the node and its transverse DOF', () => {
    // Statics: collinear bars give no first-order stiffness across their line.
    const model = validateModel({
      ...base,
      nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'mid', x: 2, y: 0 }, { id: 'b', x: 4, y: 0 }],
      elements: [
        { id: 'l', kind: 'bar', nodes: ['a', 'mid'], material: 'steel', section: 'rod' },
        { id: 'r', kind: 'bar', nodes: ['mid', 'b'], material: 'steel', section: 'rod' },
      ],
      supports: [{ node: 'a', fixed: ['ux', 'uy'] }, { node: 'b', fixed: ['ux', 'uy'] }],
    });
    const asm = assemble(model);
    expect(findMechanisms(asm).map((m) => `${m.node} ${m.dof}`)).toEqual(['mid uy']);
    let err: unknown;
    try {
      modalAnalysis(model, { count: 1 });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ModelError);
    expect((err as ModelError).path).toBe('nodes[1]');
    expect((err as ModelError).detail).toMatch(/node "mid" dof uy/);
  });

  it('a point mass on an unconnected node: both translations reported, no zero modes returned', () => {
    const model = validateModel({
      ...base,
      nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'b', x: 3, y: 0 }, { id: 'c', x: 0, y: 3 }, { id: 'loose', x: 5, y: 5 }],
      elements: [
        { id: 'ab', kind: 'bar', nodes: ['a', 'b'], material: 'steel', section: 'rod' },
        { id: 'bc', kind: 'bar', nodes: ['b', 'c'], material: 'steel', section: 'rod' },
      ],
      supports: [{ node: 'a', fixed: ['ux', 'uy'] }, { node: 'c', fixed: ['ux', 'uy'] }],
      masses: [{ node: 'loose', mass: 10 }],
    });
    expect(findMechanisms(assemble(model)).map((m) => `${m.node} ${m.dof}`)).toEqual(['loose ux', 'loose uy']);
    expect(() => assertNoMechanism(assemble(model))).toThrow(/node "loose" dof ux, node "loose" dof uy are not stiffened/);
    expect(() => modalAnalysis(model, { count: 1 })).toThrow(ModelError);
  });

  it('through the CLI: status 1 and one stderr line naming the node and DOF, no modes printed', () => {
    const dir = mkdtempSync(join(tmpdir(), 'eigenframe-hard-'));
    try {
      const file = join(dir, 'mechanism.json');
      writeFileSync(
        file,
        JSON.stringify({
          ...base,
          nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'mid', x: 2, y: 0 }, { id: 'b', x: 4, y: 0 }],
          elements: [
            { id: 'l', kind: 'bar', nodes: ['a', 'mid'], material: 'steel', section: 'rod' },
            { id: 'r', kind: 'bar', nodes: ['mid', 'b'], material: 'steel', section: 'rod' },
          ],
          supports: [{ node: 'a', fixed: ['ux', 'uy'] }, { node: 'b', fixed: ['ux', 'uy'] }],
        }),
      );
      const r = runCli(['modes', file, '--json']);
      expect(r.status).toBe(1);
      expect(r.stdout).toBe('');
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(/nodes\[1\].*node "mid" dof uy/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
