/**
 * Regression tests for subspace iteration (src/eigen/subspace.ts, src/eigen/ritz.ts) on two
 * pencils found by the property tests: a lumped-mass frame whose M has rank below n (B1), and a
 * softly supported beam with a wide spectrum (B2). Every expected value comes from the dense
 * solver (`denseEigen`, Cholesky route on ml-matrix) or from the Lanczos method in the same run.
 */
import { describe, expect, it } from 'vitest';
import { denseEigen } from '../src/eigen/dense/index';
import { SeededRandom } from '../src/eigen/kernels';
import { inverseOperator, matrixOperator } from '../src/eigen/operators';
import { ShiftedPencil } from '../src/eigen/pencil';
import { mGramSchmidt } from '../src/eigen/ritz';
import { subspaceIteration } from '../src/eigen/subspace';
import { symmetricMultiply } from '../src/linalg/sparse/symmetric';
import { solve } from '../src/eigen/solve';
import { assemble } from '../src/model/assemble';
import { validateModel } from '../src/model/read';
import type { AssembledModel } from '../src/model/types';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

/** Plane portal: two clamped columns 2.5 m high, a 2 m girder, lumped mass (n = 6, rank M = 4). */
function portal(): AssembledModel {
  return assemble(
    validateModel({
      format: 'eigenframe-model/1',
      space: 'plane',
      mass: 'lumped',
      materials: { m: { E: 5e10, density: 1000 } },
      sections: { s: { A: 5e-4, Iz: 1e-7 } },
      nodes: [
        { id: 'a', x: 0, y: 0 },
        { id: 'b', x: 0, y: 2.5 },
        { id: 'c', x: 2, y: 2.5 },
        { id: 'd', x: 2, y: 0 },
      ],
      elements: [
        { id: 'c1', kind: 'beam', nodes: ['a', 'b'], material: 'm', section: 's' },
        { id: 'g', kind: 'beam', nodes: ['b', 'c'], material: 'm', section: 's' },
        { id: 'c2', kind: 'beam', nodes: ['c', 'd'], material: 'm', section: 's' },
      ],
      supports: [
        { node: 'a', fixed: ['ux', 'uy', 'rz'] },
        { node: 'd', fixed: ['ux', 'uy', 'rz'] },
      ],
    }),
  );
}

/** Plane beam, 20 elements over 10 m, ux fixed at n0, soft uy springs 48EI/L³/1e4 at both ends, consistent mass (n = 62). */
function softBeam(): AssembledModel {
  const E = 2.1e11;
  const I = 1e-5;
  const L = 10;
  const ne = 20;
  const k = (48 * E * I) / L ** 3 / 1e4;
  return assemble(
    validateModel({
      format: 'eigenframe-model/1',
      space: 'plane',
      mass: 'consistent',
      materials: { steel: { E, density: 7850 } },
      sections: { s: { A: 3e-3, Iz: I } },
      nodes: Array.from({ length: ne + 1 }, (_, i) => ({ id: `n${i}`, x: (L * i) / ne, y: 0 })),
      elements: Array.from({ length: ne }, (_, i) => ({ id: `e${i}`, kind: 'beam' as const, nodes: [`n${i}`, `n${i + 1}`] as [string, string], material: 'steel', section: 's' })),
      supports: [{ node: 'n0', fixed: ['ux'] }],
      springs: [
        { node: 'n0', dof: 'uy', stiffness: k },
        { node: `n${ne}`, dof: 'uy', stiffness: k },
      ],
    }),
  );
}

describe('subspace iteration regressions', () => {
  it('B1: portal with rank M = 4 < n = 6 — subspace agrees with dense Cholesky and Lanczos', () => {
    const asm = portal();
    expect(asm.stiffness.n).toBe(6);
    // Source: dense Cholesky route (denseEigen) and Lanczos, same run. Recorded values from the
    // bug report (dense and Lanczos agreed): 2522.02768050, 8888888.88889, 8893527.44092 rad²/s².
    const ref = denseEigen(asm.stiffness, asm.mass, { count: 3 }).eigenvalues;
    const lz = solve(asm.stiffness, asm.mass, { method: 'lanczos', count: 3 }).eigenvalues;
    const ss = solve(asm.stiffness, asm.mass, { method: 'subspace', count: 3 });
    const reported = [2522.0276805, 8888888.88889, 8893527.44092];
    for (let j = 0; j < 3; j++) {
      expect(rel(ss.eigenvalues[j], ref[j])).toBeLessThan(1e-9);
      expect(rel(lz[j], ref[j])).toBeLessThan(1e-9);
      expect(rel(ref[j], reported[j])).toBeLessThan(1e-9);
    }
    expect(Math.max(...ss.residuals)).toBeLessThan(1e-8);
    expect(ss.orthogonalityError).toBeLessThanOrEqual(1e-10);
  });

  it('B1: asking for every finite mode (count = rank M = 4) by subspace matches dense', () => {
    const asm = portal();
    const ref = denseEigen(asm.stiffness, asm.mass).eigenvalues; // Source: dense Cholesky route
    expect(ref.length).toBe(4);
    const ss = solve(asm.stiffness, asm.mass, { method: 'subspace', count: 4 });
    for (let j = 0; j < 4; j++) expect(rel(ss.eigenvalues[j], ref[j])).toBeLessThan(1e-9);
  });

  it('B2: soft-sprung beam with a wide spectrum — subspace agrees with Lanczos and dense', () => {
    const asm = softBeam();
    expect(asm.stiffness.n).toBe(62);
    // Source: Lanczos in the same run and the dense Cholesky route; recorded Lanczos values from
    // the bug report: 0.0855982476500, 0.256812351440, 4463.98881893 rad²/s².
    const ref = denseEigen(asm.stiffness, asm.mass, { count: 3 }).eigenvalues;
    const lz = solve(asm.stiffness, asm.mass, { method: 'lanczos', count: 3 }).eigenvalues;
    const ss = solve(asm.stiffness, asm.mass, { method: 'subspace', count: 3 });
    const reported = [0.08559824765, 0.25681235144, 4463.98881893];
    for (let j = 0; j < 3; j++) {
      expect(rel(ss.eigenvalues[j], lz[j])).toBeLessThan(1e-8);
      expect(rel(ss.eigenvalues[j], ref[j])).toBeLessThan(1e-7);
      // The recorded values are a regression record, not an exact reference: the dense solver
      // differs from them by ~1.2e-9. DESIGN.md: compare with a per-mode tolerance; correct
      // double-precision solvers differ at round-off on ill-conditioned modes.
      expect(rel(lz[j], reported[j])).toBeLessThan(5e-9);
    }
    expect(Math.max(...ss.residuals)).toBeLessThan(1e-8);
    expect(ss.orthogonalityError).toBeLessThanOrEqual(1e-10);
  });
});

describe('subspaceIteration on its own, block wider than rank M', () => {
  it('portal (n = 6, rank M = 4), count 5: the block shrinks to the 4 finite pairs, converged is false', () => {
    const asm = portal();
    const ref = denseEigen(asm.stiffness, asm.mass).eigenvalues; // Source: dense Cholesky route, all 4 finite modes
    const { factor } = new ShiftedPencil(asm.stiffness, asm.mass).factorAt(0);
    const r = subspaceIteration(inverseOperator(factor), matrixOperator(asm.mass), matrixOperator(asm.stiffness), { count: 5 });
    expect(r.eigenvalues.length).toBe(4);
    expect(r.converged).toBe(false);
    for (let j = 0; j < 4; j++) expect(rel(r.eigenvalues[j], ref[j])).toBeLessThan(1e-9);
    const ok = subspaceIteration(inverseOperator(factor), matrixOperator(asm.mass), matrixOperator(asm.stiffness), { count: 3 });
    expect(ok.converged).toBe(true);
    expect(ok.eigenvalues.length).toBe(3);
    for (let j = 0; j < 3; j++) expect(rel(ok.eigenvalues[j], ref[j])).toBeLessThan(1e-9);
  });
});

describe('mGramSchmidt (rank-revealing M-orthonormalisation)', () => {
  it('drops an exactly dependent column, keeps one independent to 1e-9, and X_new = X_old T is M-orthonormal', () => {
    // M-orthonormality XᵀMX = I is the definition checked (Parlett, §6.9); M is the consistent
    // mass of the soft-sprung beam (n = 62, positive definite).
    const asm = softBeam();
    const M = asm.mass;
    const n = M.n;
    const m = 5;
    const rnd = new SeededRandom(7);
    const x0 = new Float64Array(n * m);
    rnd.fill(x0.subarray(0, 3 * n));
    for (let i = 0; i < n; i++) {
      x0[3 * n + i] = x0[i] + 2 * x0[n + i]; // exactly dependent on columns 0 and 1
      x0[4 * n + i] = x0[2 * n + i] + 1e-9 * (rnd.next() + 0.5 * Math.sin(i)); // independent to ~1e-9
    }
    const x = x0.slice();
    const mx = new Float64Array(n * m);
    const applyM = (src: Float64Array, dst: Float64Array, cols: number) => {
      for (let c = 0; c < cols; c++) symmetricMultiply(M, src.subarray(c * n, (c + 1) * n), dst.subarray(c * n, (c + 1) * n));
    };
    applyM(x, mx, m);
    const t = new Float64Array(m * m);
    const h = new Float64Array(m);
    const r1 = mGramSchmidt(x, mx, n, m, 1e-11, t, h);
    expect(r1.kept).toBe(4);
    expect(r1.minRatio).toBe(0);
    // X_new = X_old T, column by column.
    for (let c = 0; c < 4; c++) {
      for (let i = 0; i < n; i += 7) {
        let s = 0;
        for (let j = 0; j < m; j++) s += x0[j * n + i] * t[c * m + j];
        expect(Math.abs(s - x[c * n + i])).toBeLessThan(1e-6 * (Math.abs(x[c * n + i]) + 1));
      }
    }
    // Second pass on a recomputed M·X: orthonormal to round-off, nothing more dropped.
    applyM(x, mx, 4);
    const r2 = mGramSchmidt(x, mx, n, 4, 1e-11, t, h);
    expect(r2.kept).toBe(4);
    applyM(x, mx, 4);
    for (let a = 0; a < 4; a++) {
      for (let b = 0; b < 4; b++) {
        let s = 0;
        for (let i = 0; i < n; i++) s += x[a * n + i] * mx[b * n + i];
        expect(Math.abs(s - (a === b ? 1 : 0))).toBeLessThan(1e-12);
      }
    }
  });

  it('a column with a non-finite M-norm is a VerificationError at path projection', () => {
    const x = new Float64Array([1, 0, NaN, 1]);
    const mx = x.slice();
    try {
      mGramSchmidt(x, mx, 2, 2, 1e-11, new Float64Array(4), new Float64Array(2));
      expect.unreachable();
    } catch (e) {
      expect((e as { name: string }).name).toBe('VerificationError');
      expect((e as { path: string }).path).toBe('projection');
    }
  });
});
