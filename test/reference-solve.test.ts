/**
 * The whole reference catalogue through eigenframe: each case's model at its stated mesh is
 * validated, assembled and solved, and its lowest `count` values must lie within the stated
 * tolerance of the closed-form answers (sources: each case's `source`, checked in
 * reference-cases.test.ts).
 *
 * Buckling: the library's bucklingAnalysis is checked against the closed forms, and against an
 * independent geometric stiffness that this file builds: the
 * consistent geometric stiffness of a plane beam under axial compression P,
 * P/(30L)·[36 3L −36 3L; 3L 4L² −3L −L²; −36 −3L 36 −3L; 3L −L² −3L 4L²] over (v1, θ1, v2, θ2)
 * (Przemieniecki, Theory of Matrix Structural Analysis (1968), stability chapter, from memory), with P the case's
 * reference load, and solves K φ = λ K_G φ with eigenframe's `solve`.
 */
import { describe, expect, it } from 'vitest';
import { referenceCases } from '../src/reference/catalogue';
import { compareValues } from '../src/reference/compare';
import { validateModel } from '../src/model/read';
import { assemble } from '../src/model/assemble';
import { bucklingAnalysis } from '../src/modal/buckling';
import { solve } from '../src/eigen/solve';
import { CooBuilder, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import type { AssembledModel, Model } from '../src/model/types';

const frequencyCases = referenceCases().filter((c) => c.quantity === 'frequency');
const bucklingCases = referenceCases().filter((c) => c.quantity === 'buckling');

function hz(lambda: number): number {
  return Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI);
}

/** Geometric stiffness of a column along y under compression P (N) in every element. */
function geometricStiffness(model: Model, asm: AssembledModel, P: number): SymmetricCsc {
  const n = asm.dofs.length;
  const G = new CooBuilder(n, 10 * model.elements.length + n);
  const index = new Map(model.nodes.map((node, i) => [node.id, i]));
  // Local v = −ux for a member along +y (plane-frame local y at +90° from local x); θ = rz.
  const sign = [-1, 1, -1, 1];
  for (const e of model.elements) {
    const a = index.get(e.nodes[0])!;
    const b = index.get(e.nodes[1])!;
    const L = Math.hypot(model.nodes[b].x - model.nodes[a].x, model.nodes[b].y - model.nodes[a].y);
    const c = P / (30 * L);
    const k = [36, 3 * L, -36, 3 * L, 3 * L, 4 * L * L, -3 * L, -L * L, -36, -3 * L, 36, -3 * L, 3 * L, -L * L, -3 * L, 4 * L * L];
    const map = [asm.dofMap![6 * a], asm.dofMap![6 * a + 5], asm.dofMap![6 * b], asm.dofMap![6 * b + 5]];
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        const gi = map[i];
        const gj = map[j];
        if (gi < 0 || gj < 0 || gi < gj) continue;
        G.add(gi, gj, c * k[4 * i + j] * sign[i] * sign[j]);
      }
    }
  }
  for (let i = 0; i < n; i++) G.add(i, i, 0);
  return G.toCsc();
}

describe('reference catalogue through assemble + solve, at the stated meshes', () => {
  it.each(frequencyCases.map((c) => [c.id, c] as const))('%s meets its stated tolerance (auto and Lanczos)', (_id, c) => {
    const model = validateModel(JSON.parse(JSON.stringify(c.build(c.mesh))));
    const asm = assemble(model);
    const exact = c.exact(c.count);
    for (const method of ['auto', 'lanczos'] as const) {
      const r = solve(asm.stiffness, asm.mass, { count: c.count, method });
      const cmp = compareValues(exact, Array.from(r.eigenvalues, hz), c.tolerance);
      expect(cmp.missing).toBe(0);
      expect(cmp.maxRelativeError, `${c.id} ${method}`).toBeLessThanOrEqual(c.tolerance);
      expect(cmp.passed).toBe(true);
    }
  });

  it.each(bucklingCases.map((c) => [c.id, c] as const))('%s meets its stated tolerance (library linear buckling)', (_id, c) => {
    const model = validateModel(JSON.parse(JSON.stringify(c.build(c.mesh))));
    const loads = c.loads!(c.mesh).map((l) => ({ node: l.node, dof: l.dof, value: l.force }));
    const r = bucklingAnalysis(model, loads, { count: c.count });
    const cmp = compareValues(c.exact(c.count), Array.from(r.loadFactors), c.tolerance);
    expect(cmp.maxRelativeError, c.id).toBeLessThanOrEqual(c.tolerance);
    expect(cmp.passed).toBe(true);
  });

  it.each(bucklingCases.map((c) => [c.id, c] as const))('%s: library buckling agrees with the consistent geometric stiffness built here', (_id, c) => {
    const model = validateModel(JSON.parse(JSON.stringify(c.build(c.mesh))));
    const asm = assemble(model);
    const [load] = c.loads!(c.mesh);
    expect(load.node).toBe(model.nodes[model.nodes.length - 1].id);
    const KG = geometricStiffness(model, asm, -load.force);
    const r = solve(asm.stiffness, KG, { count: c.count, method: 'dense' });
    const lib = bucklingAnalysis(asm, [{ node: load.node, dof: load.dof, value: load.force }], { count: c.count });
    for (let k = 0; k < c.count; k++) expect(lib.loadFactors[k] / r.eigenvalues[k]).toBeCloseTo(1, 8);
  });

  it('a coarser mesh misses the tolerance (the stated mesh is not needlessly loose)', () => {
    // Not a law, an observation of these cases: halving the mesh at least doubles the error.
    for (const c of frequencyCases.filter((x) => x.mesh >= 4)) {
      const asm = assemble(validateModel(JSON.parse(JSON.stringify(c.build(Math.floor(c.mesh / 2))))));
      const r = solve(asm.stiffness, asm.mass, { count: c.count, method: 'dense' });
      const cmp = compareValues(c.exact(c.count), Array.from(r.eigenvalues, hz), c.tolerance);
      expect(cmp.passed, c.id).toBe(false);
    }
  });
});
