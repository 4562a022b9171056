/**
 * Relaxed supernode amalgamation in the symbolic phase of the supernodal LDLᵀ (Ashcraft & Grimes
 * 1989): the merged factor solves to round-off, counts the inertia of K − σM as a dense
 * eigen-decomposition does, and has fewer supernodes than the fundamental partition.
 */
import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { trussFootbridge } from '../bench/models';
import { ArgumentError } from '../src/errors';
import { denseEigen } from '../src/eigen/dense/index';
import { RELAX_DEFAULTS, analyse, type RelaxThresholds } from '../src/linalg/ldlt/analyse';
import { factorize } from '../src/linalg/ldlt/factorize';
import { combineOnUnion, symmetricMultiply, unionPattern, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { assemble } from '../src/model/assemble';
import { validateModel } from '../src/model/read';
import { randomSymmetric, rng, toRows } from './ldlt-helpers';

/** ‖b − A x‖∞ / ‖b‖∞. */
function relResidual(a: SymmetricCsc, x: Float64Array, b: Float64Array): number {
  const ax = new Float64Array(a.n);
  symmetricMultiply(a, x, ax);
  let r = 0;
  let nb = 0;
  for (let i = 0; i < a.n; i++) {
    r = Math.max(r, Math.abs(b[i] - ax[i]));
    nb = Math.max(nb, Math.abs(b[i]));
  }
  return r / nb;
}

function seededVector(n: number, seed: number): Float64Array {
  const r = rng(seed);
  const b = new Float64Array(n);
  for (let i = 0; i < n; i++) b[i] = 2 * r() - 1;
  return b;
}

/**
 * A 3-DOF-per-node space truss: the benchmark footbridge with 20 panels (one span, pinned and
 * guided ends), 84 nodes, bars only, lumped deck mass.
 */
function truss() {
  return assemble(validateModel(trussFootbridge({ panels: 20 })));
}

/** Dense eigenvalues of the symmetric matrix A (ml-matrix), the reference for the inertia. */
function denseSpectrum(a: SymmetricCsc): number[] {
  return new EigenvalueDecomposition(new Matrix(toRows(a)), { assumeSymmetric: true }).realEigenvalues;
}

describe('relaxed supernode amalgamation', () => {
  it('defaults: at most 6 columns and half the block zeros per merged supernode', () => {
    expect(RELAX_DEFAULTS).toEqual({ maxColumns: 6, maxZeros: 0.5 });
  });

  const cases: Array<[string, () => SymmetricCsc]> = [
    ['random sparse SPD, n = 400', () => randomSymmetric(400, 6, 7, true)],
    ['truss footbridge stiffness, 3 DOF per node', () => truss().stiffness],
  ];
  for (const [name, make] of cases) {
    it(`${name}: K x = b to a relative residual ≤ 1e-12, fewer supernodes than without amalgamation`, () => {
      const K = make();
      const merged = analyse(K, { ordering: 'amd' });
      const plain = analyse(K, { ordering: 'amd', relax: false });
      expect(merged.supernodes).toBeLessThan(plain.supernodes);
      expect(merged.nnzL).toBe(plain.nnzL); // same L; only its partition into supernodes differs
      const b = seededVector(K.n, 11);
      const x = new Float64Array(K.n);
      const y = new Float64Array(K.n);
      factorize(merged, K.values).solve(b, x);
      factorize(plain, K.values).solve(b, y);
      expect(relResidual(K, x, b)).toBeLessThanOrEqual(1e-12);
      expect(relResidual(K, y, b)).toBeLessThanOrEqual(1e-12);
    });
  }

  it('truss footbridge: negative pivots of K − σM equal the dense count of negative eigenvalues', () => {
    const { stiffness: K, mass: M } = truss();
    // σ midway between the 10th and 11th eigenvalues of the pencil (dense Cholesky route), so
    // that K − σM is well away from singular; Sylvester's law of inertia (M SPD on the free DOFs).
    const lam = denseEigen(K, M, { count: 11 }).eigenvalues;
    const sigma = 0.5 * (lam[9] + lam[10]);
    const u = unionPattern(K, M);
    const values = new Float64Array(u.pattern.rowIdx.length);
    combineOnUnion(u, 1, K, -sigma, M, values);
    const shifted: SymmetricCsc = { ...u.pattern, values };
    const ev = denseSpectrum(shifted);
    const denseNegative = ev.filter((v) => v < 0).length;
    expect(denseNegative).toBe(10);
    for (const relax of [RELAX_DEFAULTS, { maxColumns: 16, maxZeros: 0.8 }, false] as Array<RelaxThresholds | false>) {
      const f = factorize(analyse(u.pattern, { ordering: 'amd', relax }), values);
      expect(f.negativePivots).toBe(denseNegative);
    }
  });

  it('random sparse indefinite matrix: negative pivots equal the dense count', () => {
    const A = randomSymmetric(200, 6, 3, false);
    const denseNegative = denseSpectrum(A).filter((v) => v < 0).length;
    expect(denseNegative).toBeGreaterThan(0);
    const f = factorize(analyse(A, { ordering: 'amd' }), A.values);
    expect(f.negativePivots).toBe(denseNegative);
  });

  it('rejects thresholds out of range, naming the option', () => {
    const K = randomSymmetric(20, 4, 1, true);
    const bad: Array<[RelaxThresholds, string]> = [
      [{ maxColumns: 0, maxZeros: 0.5 }, 'options.relax.maxColumns'],
      [{ maxColumns: 2.5, maxZeros: 0.5 }, 'options.relax.maxColumns'],
      [{ maxColumns: 6, maxZeros: 1.5 }, 'options.relax.maxZeros'],
      [{ maxColumns: 6, maxZeros: Number.NaN }, 'options.relax.maxZeros'],
    ];
    for (const [relax, path] of bad) {
      let err: unknown;
      try {
        analyse(K, { relax });
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(ArgumentError);
      expect((err as ArgumentError).path).toBe(path);
    }
  });
});
