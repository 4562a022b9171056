/**
 * Property-based tests of `modalAnalysis` on random valid models (test/arbitraries.ts): plane
 * and space frames and trusses on perturbed grids, random clamped trees of skew members,
 * consistent and lumped mass.
 *
 * Sources of the invariants:
 * - accuracy targets (residual ≤ 1e-8, M-orthonormality ≤ 1e-10, Sturm count) are the product's
 *   acceptance rule (DESIGN.md, "Accuracy");
 * - Σ over all modes of the effective mass Γ² = rᵀ M r: with Φ M-orthonormal and complete over
 *   the massive DOFs, ΦᵀMΦ = I gives M Φ Φᵀ M = M, so Σ (φᵀ M r)² = rᵀ M r (Chopra, Dynamics of
 *   Structures, §13.2, sum of effective modal masses equals the total mass; from memory);
 * - frequencies depend on the structure, not on where it stands or how it is numbered: a rigid
 *   rotation R maps K to TᵀKT and M to TᵀMT with T orthogonal (the same element matrices in new
 *   global axes), and a renumbering is a permutation similarity; both leave det(K − λM) = 0
 *   unchanged (matrix structural analysis, Przemieniecki 1968, ch. 6; from memory).
 */
import fc from 'fast-check';
// Runs are seeded (42) and sized for a loaded 2-core machine; FC_SEED / FC_RUNS override them
// for a longer exploratory run.
import { describe, expect, it } from 'vitest';
import { modalAnalysis } from '../src/modal/analysis';
import { assemble } from '../src/model/assemble';
import { validateModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import { modelArb, planeFrameArb, planeTrussArb, psdRank, rel, renumberModel, rotateModel, rotationMatrix, spaceFrameArb, spaceTrussArb, treeArb, type GeneratedModel } from './arbitraries';

/** Number of finite eigenvalues: n for consistent mass, rank M for lumped (ml-matrix). */
function finiteCount(model: Model): number {
  const asm = assemble(model);
  return model.mass === 'lumped' ? psdRank(asm.mass) : asm.stiffness.n;
}

/** The lowest `count` frequencies of a model, Hz. */
function frequencies(model: Model, count: number): number[] {
  return modalAnalysis(model, { count }).modes.map((m) => m.frequency);
}

describe('modalAnalysis on random valid models', () => {
  it('generated models pass validation unchanged in meaning (validateModel accepts them)', () => {
    fc.assert(
      fc.property(modelArb(), ({ model }) => {
        const v = validateModel(JSON.parse(JSON.stringify(model)));
        expect(v.nodes.length).toBe(model.nodes.length);
        expect(v.elements.length).toBe(model.elements.length);
      }),
      { seed: Number(process.env.FC_SEED ?? 42), numRuns: Number(process.env.FC_RUNS ?? 40) },
    );
  });

  it('all modes: residual ≤ 1e-8, M-orthonormality ≤ 1e-10, Sturm check passed, Σ effective mass = rᵀMr', () => {
    fc.assert(
      fc.property(modelArb(), ({ family, model }: GeneratedModel) => {
        const count = finiteCount(model);
        const r = modalAnalysis(model, { count });
        expect(r.modes.length).toBe(count);
        for (let k = 0; k < count; k++) expect(r.eigen.residuals[k], `${family} mode ${k + 1}`).toBeLessThanOrEqual(1e-8);
        expect(r.eigen.orthogonalityError).toBeLessThanOrEqual(1e-10);
        expect(r.eigen.sturm?.passed).toBe(true);
        for (let k = 1; k < count; k++) expect(r.modes[k].eigenvalue).toBeGreaterThanOrEqual(r.modes[k - 1].eigenvalue);
        expect(r.modes[0].eigenvalue).toBeGreaterThan(0); // supported: no rigid-body mode
        for (const d of r.directions) {
          const total = r.totalMass[d]!;
          const sum = r.modes.reduce((s, m) => s + m.effectiveMass[d]!, 0);
          const scale = Math.max(...r.directions.map((q) => Math.abs(r.totalMass[q]!)));
          // Rounding: each Γ² carries ~n·ε relative error; 1e-9 of the largest total is ample.
          expect(Math.abs(sum - total), `${family} ${model.mass} direction ${d}: Σ ${sum} vs ${total}`).toBeLessThanOrEqual(1e-9 * scale);
          if (total > 1e-6 * scale) expect(r.modes[count - 1].cumulativeRatio[d]!).toBeCloseTo(1, 9);
        }
      }),
      { seed: Number(process.env.FC_SEED ?? 42), numRuns: Number(process.env.FC_RUNS ?? 30) },
    );
  });

  it('frequencies are invariant under a rigid rotation of the whole model (plane)', () => {
    fc.assert(
      fc.property(fc.oneof(planeFrameArb(), planeTrussArb(), treeArb('plane')), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), ({ model }, angle) => {
        const count = Math.min(8, finiteCount(model));
        const a = frequencies(model, count);
        const b = frequencies(rotateModel(model, angle, []), count);
        // Two dense solves of congruent pencils: agreement to round-off (κ-scaled), 1e-8 relative.
        for (let k = 0; k < count; k++) expect(rel(b[k], a[k]), `mode ${k + 1}: ${b[k]} vs ${a[k]} Hz`).toBeLessThan(1e-8);
      }),
      { seed: Number(process.env.FC_SEED ?? 42), numRuns: Number(process.env.FC_RUNS ?? 25) },
    );
  });

  it('frequencies are invariant under a rigid rotation of the whole model (space, orientation vectors rotated along)', () => {
    fc.assert(
      fc.property(fc.oneof(spaceFrameArb(), spaceTrussArb(), treeArb('space')), fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 4, maxLength: 4 }), ({ model }, q) => {
        fc.pre(Math.hypot(...q) > 0.1);
        const count = Math.min(8, finiteCount(model));
        const a = frequencies(model, count);
        const b = frequencies(rotateModel(model, 0, rotationMatrix(q)), count);
        for (let k = 0; k < count; k++) expect(rel(b[k], a[k]), `mode ${k + 1}: ${b[k]} vs ${a[k]} Hz`).toBeLessThan(1e-8);
      }),
      { seed: Number(process.env.FC_SEED ?? 42), numRuns: Number(process.env.FC_RUNS ?? 20) },
    );
  });

  it('frequencies are invariant under renumbering of nodes, elements and supports, and reversed element ends', () => {
    fc.assert(
      fc.property(modelArb(), fc.array(fc.double({ min: 0, max: 0.999999, noNaN: true }), { minLength: 31, maxLength: 31 }), ({ model }, r) => {
        const count = Math.min(8, finiteCount(model));
        const a = frequencies(model, count);
        const b = frequencies(renumberModel(model, r), count);
        for (let k = 0; k < count; k++) expect(rel(b[k], a[k]), `mode ${k + 1}: ${b[k]} vs ${a[k]} Hz`).toBeLessThan(1e-8);
      }),
      { seed: Number(process.env.FC_SEED ?? 42), numRuns: Number(process.env.FC_RUNS ?? 25) },
    );
  });

  it('lowest modes by lanczos and subspace agree with the dense route on the same model (relative 1e-8)', () => {
    fc.assert(
      fc.property(modelArb(), ({ family, model }) => {
        const asm = assemble(model);
        const count = Math.min(6, finiteCount(model));
        const ref = modalAnalysis(asm, { count, method: 'dense' }).modes.map((m) => m.eigenvalue);
        // Subspace iteration runs on the trusses only: on frames (rotations, spectra spread
        // over many decades) and whenever its block exceeds rank M it can fail with "the
        // projected mass matrix is not positive definite" (reported to its owner).
        const methods = family.endsWith('truss') ? (['lanczos', 'subspace'] as const) : (['lanczos'] as const);
        for (const method of methods) {
          const r = modalAnalysis(asm, { count, method });
          expect(r.eigen.sturm?.passed).toBe(true);
          for (let k = 0; k < count; k++) expect(rel(r.modes[k].eigenvalue, ref[k]), `${family} ${model.mass} ${method} mode ${k + 1}`).toBeLessThan(1e-8);
        }
      }),
      { seed: Number(process.env.FC_SEED ?? 42), numRuns: Number(process.env.FC_RUNS ?? 25) },
    );
  });

  it('the default local-axes rule is rotation invariant about the vertical axis (no orientation vectors)', () => {
    // The default rule takes local y horizontal (Z × x) for non-vertical members and global +Y
    // for vertical ones; a turn about Z keeps "horizontal" horizontal, and for a vertical member
    // a turn of y about the member axis only swaps which bending plane is which, with the same
    // section both ways only when Iy = Iz. So: turn about Z, with Iy = Iz in every section.
    fc.assert(
      fc.property(spaceFrameArb('consistent', false), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), ({ model }, t) => {
        for (const s of Object.values(model.sections)) s.Iy = s.Iz;
        const count = Math.min(6, finiteCount(model));
        const a = frequencies(model, count);
        const R = [Math.cos(t), -Math.sin(t), 0, Math.sin(t), Math.cos(t), 0, 0, 0, 1];
        const b = frequencies(rotateModel(model, 0, R), count);
        for (let k = 0; k < count; k++) expect(rel(b[k], a[k]), `mode ${k + 1}: ${b[k]} vs ${a[k]} Hz`).toBeLessThan(1e-8);
      }),
      { seed: Number(process.env.FC_SEED ?? 42), numRuns: Number(process.env.FC_RUNS ?? 10) },
    );
  });
});
