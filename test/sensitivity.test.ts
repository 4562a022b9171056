/** Eigenvalue sensitivity and what-if redesign (src/modal/sensitivity.ts, src/modal/whatif.ts). */
import { describe, expect, it } from 'vitest';
import { solve } from '../src/eigen/solve';
import { ArgumentError } from '../src/errors';
import { modalAnalysis } from '../src/modal/analysis';
import { eigenvalueSensitivity, groupSensitivity, rankMembers, resolveGroup } from '../src/modal/sensitivity';
import { scaledModel, stiffnessScaleFor, STIFFNESS_TARGET_DEFAULTS, whatIf, whatIfSymbolic } from '../src/modal/whatif';
import { assemble } from '../src/model/assemble';
import { validateModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import { planeBeamModel, relErr } from './model-helpers';
import { pathOf } from './argument-path';

const E = 2.1e11, rho = 7850;

/** A plane portal (two columns, one girder, 4 elements per member) with a point mass: invented demo data. */
function portal(): Model {
  const nodes = [
    { id: 'A', x: 0, y: 0 }, { id: 'a1', x: 0, y: 1 }, { id: 'a2', x: 0, y: 2 }, { id: 'a3', x: 0, y: 3 }, { id: 'B', x: 0, y: 4 },
    { id: 'b1', x: 1.5, y: 4 }, { id: 'b2', x: 3, y: 4 }, { id: 'b3', x: 4.5, y: 4 }, { id: 'C', x: 6, y: 4 },
    { id: 'c1', x: 6, y: 3 }, { id: 'c2', x: 6, y: 2 }, { id: 'c3', x: 6, y: 1 }, { id: 'D', x: 6, y: 0 },
  ];
  const chain = ['A', 'a1', 'a2', 'a3', 'B', 'b1', 'b2', 'b3', 'C', 'c1', 'c2', 'c3', 'D'];
  const elements = chain.slice(0, -1).map((id, i) => ({ id: `e${i + 1}`, kind: 'beam', nodes: [id, chain[i + 1]], material: 'steel', section: i >= 4 && i < 8 ? 'girder' : 'column' }));
  return validateModel({
    format: 'eigenframe-model/1', space: 'plane',
    materials: { steel: { E, density: rho } },
    sections: { column: { A: 5e-3, Iz: 8e-6 }, girder: { A: 6e-3, Iz: 2.5e-5 } },
    nodes, elements,
    supports: [{ node: 'A', fixed: ['ux', 'uy', 'rz'] }, { node: 'D', fixed: ['ux', 'uy'] }],
    masses: [{ node: 'b2', mass: 400 }],
  });
}

describe('eigenvalue derivatives (Fox & Kapoor 1968) against central finite differences', () => {
  const model = portal();
  const base = modalAnalysis(model, { count: 4 });
  const asm = base.assembled;
  const sens = eigenvalueSensitivity(asm, base.eigen);
  const h = 1e-4;
  const fd = (id: string, which: 'stiffnessScale' | 'massScale', mode: number): number => {
    const at = (s: number) => {
      const v = scaledModel(asm, [{ group: { elements: [id] }, [which]: s }]).assembled;
      return solve(v.stiffness, v.mass, { count: 4 }).eigenvalues[mode];
    };
    return (at(1 + h) - at(1 - h)) / (2 * h);
  };
  for (const id of ['e1', 'e6', 'e11']) {
    for (const mode of [0, 2]) {
      it(`element ${id}, mode ${mode + 1}: dλ/dα and dλ/dβ within 1e-6`, () => {
        const e = sens[mode].elements.find((s) => s.element === id)!;
        const lam = base.eigen.eigenvalues[mode];
        // central difference error O(h²) ≈ 1e-8 relative; round-off ≈ 1e-16 λ / h ≈ 1e-12 λ
        expect(Math.abs(fd(id, 'stiffnessScale', mode) - e.stiffness) / lam).toBeLessThan(1e-6);
        expect(Math.abs(fd(id, 'massScale', mode) - e.mass) / lam).toBeLessThan(1e-6);
      });
    }
  }

  it('homogeneity of the Rayleigh quotient: Σ dλ/dα over all members = λ − springs, Σ dλ/dβ = −λ·(member share of φᵀMφ)', () => {
    // λ(αK) = αλ, so Σ_e φ_eᵀk_eφ_e = φᵀKφ = λ (no springs here). The point mass is not a member:
    // Σ_e dλ/dβ_e = −λ (1 − φ_mᵀ m φ_m).
    const m = sens[0];
    const sumK = m.elements.reduce((s, e) => s + e.stiffness, 0);
    expect(relErr(sumK, m.eigenvalue)).toBeLessThan(1e-10);
    const shares = m.elements.reduce((s, e) => s + e.energyShare, 0);
    expect(shares).toBeCloseTo(1, 10);
    const g = asm.dofs.findIndex((d) => d.node === 'b2' && d.dof === 'ux');
    const g2 = asm.dofs.findIndex((d) => d.node === 'b2' && d.dof === 'uy');
    const phi = base.eigen.vectors;
    const pointShare = 400 * (phi[g] ** 2 + phi[g2] ** 2);
    const sumM = m.elements.reduce((s, e) => s + e.mass, 0);
    expect(relErr(sumM, -m.eigenvalue * (1 - pointShare))).toBeLessThan(1e-10);
  });

  it('a group is the sum of its members; groups by section or by ids agree', () => {
    const [bySection, byIds] = groupSensitivity(model, sens[0], [{ section: 'girder' }, { elements: ['e5', 'e6', 'e7', 'e8'], name: 'top' }]);
    const direct = sens[0].elements.filter((e) => e.section === 'girder').reduce((s, e) => s + e.stiffness, 0);
    expect(bySection.stiffness).toBeCloseTo(direct, 6);
    expect(byIds.stiffness).toBe(bySection.stiffness);
    expect(byIds.name).toBe('top');
    expect(bySection.memberMass).toBeCloseTo(rho * 6e-3 * 6, 9);
  });

  it('ranking orders by the chosen measure, best first', () => {
    const r = rankMembers(sens[0].elements, 'stiffness');
    for (let i = 1; i < r.length; i++) expect(r[i - 1].stiffness).toBeGreaterThanOrEqual(r[i].stiffness);
    const q = rankMembers(sens[0].elements, 'efficiency');
    for (let i = 1; i < q.length; i++) expect(q[i - 1].efficiency).toBeGreaterThanOrEqual(q[i].efficiency);
    expect(() => rankMembers(sens[0].elements, 'size' as never)).toThrowError(ArgumentError);
  });
});

describe('strain energy distribution of a simply supported beam', () => {
  it('element shares follow (2/L)∫ sin²(πx/L) dx over each element (mode 1, φ = sin πx/L; closed form)', () => {
    const L = 5, ne = 20;
    const model = validateModel(planeBeamModel({ elements: ne, L, E, density: rho, A: 4e-3, I: 3e-6, left: ['uy'], right: ['uy'] }));
    const base = modalAnalysis(model, { count: 1 });
    const s = eigenvalueSensitivity(base.assembled, base.eigen)[0];
    // curvature ∝ sin(πx/L), so the strain energy share of [a, b] is
    // (b − a)/L − (sin 2πb/L − sin 2πa/L)/(2π) (integrated here)
    for (const e of s.elements) {
      const k = e.index;
      const a = (k * L) / ne, b = ((k + 1) * L) / ne;
      const exact = (b - a) / L - (Math.sin((2 * Math.PI * b) / L) - Math.sin((2 * Math.PI * a) / L)) / (2 * Math.PI);
      expect(Math.abs(e.energyShare - exact)).toBeLessThan(2e-4);
    }
    // the middle elements are the most effective to stiffen
    const best = rankMembers(s.elements, 'stiffness').slice(0, 2).map((e) => e.index).sort((a, b) => a - b);
    expect(best).toEqual([9, 10]);
  });
});

describe('what-if redesign', () => {
  const model = portal();
  const base = modalAnalysis(model, { count: 4 });

  /** The same structure described afresh: the group's members get E·α and density·β. */
  function rebuilt(ids: string[], alpha: number, beta: number): Model {
    const m = JSON.parse(JSON.stringify(model)) as Model;
    m.materials.changed = { E: E * alpha, density: rho * beta };
    for (const e of m.elements) if (ids.includes(e.id)) e.material = 'changed';
    return validateModel(m);
  }

  it('moves mode 1 out of a band, as the sensitivity predicts, and a fresh solve confirms it', () => {
    const f1 = base.modes[0].frequency;
    const band: [number, number] = [0.9 * f1, 1.1 * f1];
    const columns = ['e1', 'e2', 'e3', 'e4', 'e9', 'e10', 'e11', 'e12'];
    const [g] = groupSensitivity(model, eigenvalueSensitivity(base.assembled, base.eigen, { modes: [1] })[0], [{ elements: columns }]);
    // aim at 1.15 f1 with the first-order estimate α = 1 + Δλ / (dλ/dα)
    const target = (2 * Math.PI * 1.15 * f1) ** 2;
    const alpha = 1 + (target - base.modes[0].eigenvalue) / g.stiffness;
    const r = whatIf(base, [{ group: { elements: columns, name: 'columns' }, stiffnessScale: alpha }], { band });
    expect(r.band!.before).toEqual([1]);
    expect(r.band!.after).toEqual([]);
    expect(r.analysis.modes[0].frequency).toBeGreaterThan(band[1]);
    expect(r.comparison[0].matches).toBe(1);
    expect(r.comparison[0].mac).toBeGreaterThan(0.9);
    // first-order prediction is close (the curvature of λ(α) is what remains)
    expect(relErr(r.comparison[0].predicted, 1.15 * f1)).toBeLessThan(1e-9);
    expect(relErr(r.analysis.modes[0].frequency, 1.15 * f1)).toBeLessThan(0.02);
    // fresh model, assembled and solved from scratch
    const fresh = modalAnalysis(rebuilt(columns, alpha, 1), { count: 4 });
    for (let j = 0; j < 4; j++) expect(relErr(r.analysis.modes[j].frequency, fresh.modes[j].frequency)).toBeLessThan(1e-10);
  });

  it('mass scaling equals a density change; the symbolic analysis is reused', () => {
    const sym = whatIfSymbolic(base.assembled);
    const r1 = whatIf(base, [{ group: { section: 'girder' }, massScale: 2, stiffnessScale: 1.5 }], { symbolic: sym });
    expect(r1.symbolic).toBe(sym);
    const fresh = modalAnalysis(rebuilt(['e5', 'e6', 'e7', 'e8'], 1.5, 2), { count: 4 });
    for (let j = 0; j < 4; j++) expect(relErr(r1.analysis.modes[j].frequency, fresh.modes[j].frequency)).toBeLessThan(1e-10);
    // effective masses follow the changed mass matrix: the girder mass doubled
    const total = (fresh.totalMass.ux ?? 0);
    expect(relErr(r1.analysis.totalMass.ux ?? 0, total)).toBeLessThan(1e-12);
  });

  it('reuses the pattern analysis on the sparse path (a 200-DOF beam)', () => {
    const beam = validateModel(planeBeamModel({ elements: 100, L: 20, E, density: rho, A: 4e-3, I: 3e-6, left: ['uy'], right: ['uy'] }));
    const b0 = modalAnalysis(beam, { count: 3 });
    const sym = whatIfSymbolic(b0.assembled);
    const ids = beam.elements.slice(40, 60).map((e) => e.id);
    const r = whatIf(b0, [{ group: { elements: ids }, stiffnessScale: 2 }], { symbolic: sym, method: 'lanczos' });
    expect(r.analysis.eigen.method).toBe('lanczos');
    expect(r.analysis.eigen.stats.analyseMs).toBe(0);
    expect(r.analysis.modes[0].frequency).toBeGreaterThan(b0.modes[0].frequency);
    const m = JSON.parse(JSON.stringify(beam)) as Model;
    m.materials.stiff = { E: 2 * E, density: rho };
    for (const e of m.elements) if (ids.includes(e.id)) e.material = 'stiff';
    const fresh = modalAnalysis(validateModel(m), { count: 3 });
    for (let j = 0; j < 3; j++) expect(relErr(r.analysis.modes[j].frequency, fresh.modes[j].frequency)).toBeLessThan(1e-9);
  });

  it('bad changes are typed errors naming the change', () => {
    const path = pathOf;
    expect(path(() => whatIf(base, []))).toBe('changes');
    expect(path(() => whatIf(base, [{ group: { elements: ['nope'] }, stiffnessScale: 2 }]))).toBe('changes[0].group.elements[0]');
    expect(path(() => whatIf(base, [{ group: { section: 'nope' } }]))).toBe('changes[0].group.section');
    expect(path(() => whatIf(base, [{ group: { section: 'girder', elements: ['e1'] } }]))).toBe('changes[0].group');
    expect(path(() => whatIf(base, [{ group: { section: 'girder' }, stiffnessScale: 0 }]))).toBe('changes[0].stiffnessScale');
    expect(path(() => whatIf(base, [{ group: { section: 'girder' }, massScale: -1 }]))).toBe('changes[0].massScale');
    expect(path(() => whatIf(base, [{ group: { section: 'girder' } }], { band: [5, 1] }))).toBe('band');
    expect(path(() => eigenvalueSensitivity(base.assembled, base.eigen, { modes: [9] }))).toBe('options.modes[0]');
    expect(resolveGroup(model, { section: 'girder' }).elements).toEqual([4, 5, 6, 7]);
  });

  it('finds the stiffness factor that puts a mode on a target, confirmed by a fresh solve', () => {
    expect(STIFFNESS_TARGET_DEFAULTS).toEqual({ massScale: 1, tolerance: 1e-6, maxIterations: 20, maxScale: 1000 });
    const columns = ['e1', 'e2', 'e3', 'e4', 'e9', 'e10', 'e11', 'e12'];
    for (const [mode, factor] of [[1, 1.2], [1, 0.8], [2, 1.1]] as const) {
      const target = factor * base.modes[mode - 1].frequency;
      const r = stiffnessScaleFor(base, { elements: columns }, { mode, frequency: target });
      expect(relErr(r.frequency, target)).toBeLessThan(1e-6);
      expect(r.iterations).toBeLessThan(8); // Newton: quadratic convergence
      const fresh = modalAnalysis(rebuilt(columns, r.stiffnessScale, 1), { count: 4 });
      expect(relErr(fresh.modes[r.mode - 1].frequency, target)).toBeLessThan(1e-6);
    }
  });

  it('a target the group cannot reach is an ArgumentError on frequency', () => {
    // stiffening only the girder cannot raise the sway mode 10-fold: the columns bound it
    try {
      stiffnessScaleFor(base, { section: 'girder' }, { mode: 1, frequency: 10 * base.modes[0].frequency });
      throw new Error('did not throw');
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('frequency');
    }
  });

  it('inputs are not modified', () => {
    const k = base.assembled.stiffness.values.slice();
    const m = base.assembled.mass.values.slice();
    whatIf(base, [{ group: { section: 'column' }, stiffnessScale: 3, massScale: 0.5 }]);
    expect(base.assembled.stiffness.values).toEqual(k);
    expect(base.assembled.mass.values).toEqual(m);
    expect(assemble(model).stiffness.values).toEqual(k);
  });
});
