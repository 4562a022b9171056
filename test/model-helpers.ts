/**
 * Test helpers for the element and model tests: a small dense generalized symmetric eigen
 * solver built on ml-matrix (the reference library), root bracketing by bisection, and
 * builders of small beam models.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { toDenseArray, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import type { Model } from '../src/model/types';

/**
 * Eigenvalues of K x = λ M x, ascending (rad²/s²), for dense symmetric n × n row-major K and M
 * with M positive definite: Cholesky M = L Lᵀ (ml-matrix), then the symmetric eigenvalues of
 * L⁻¹ K L⁻ᵀ (ml-matrix EigenvalueDecomposition).
 */
export function denseEigenvalues(K: ArrayLike<number>, M: ArrayLike<number>, n: number): number[] {
  const chol = new CholeskyDecomposition(new Matrix(toRows(M, n)));
  if (!chol.isPositiveDefinite()) throw new Error('M is not positive definite');
  const L = chol.lowerTriangularMatrix;
  // X = L⁻¹ K (forward substitution per column), then A = L⁻¹ Xᵀ (K symmetric).
  const fwd = (B: number[][]): number[][] => {
    const X = B.map((r) => r.slice());
    for (let c = 0; c < n; c++) {
      for (let i = 0; i < n; i++) {
        let s = X[i][c];
        for (let k = 0; k < i; k++) s -= L.get(i, k) * X[k][c];
        X[i][c] = s / L.get(i, i);
      }
    }
    return X;
  };
  const X = fwd(toRows(K, n));
  const Xt = X[0].map((_, j) => X.map((r) => r[j]));
  const A = fwd(Xt);
  for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) A[i][j] = A[j][i] = 0.5 * (A[i][j] + A[j][i]);
  const e = new EigenvalueDecomposition(new Matrix(A), { assumeSymmetric: true });
  return e.realEigenvalues.slice().sort((a, b) => a - b);
}

function toRows(a: ArrayLike<number>, n: number): number[][] {
  const r: number[][] = [];
  for (let i = 0; i < n; i++) r.push(Array.from({ length: n }, (_, j) => a[i * n + j]));
  return r;
}

/** Eigenvalues of an assembled pair of sparse matrices (dense reference). */
export function sparseEigenvalues(K: SymmetricCsc, M: SymmetricCsc): number[] {
  return denseEigenvalues(toDenseArray(K), toDenseArray(M), K.n);
}

/** Frequencies in Hz from eigenvalues (rad²/s²). */
export const hz = (lambda: number[]): number[] => lambda.map((l) => Math.sqrt(Math.max(l, 0)) / (2 * Math.PI));

/** A root of f in [a, b] by bisection (f(a), f(b) of opposite signs). */
export function bisect(f: (x: number) => number, a: number, b: number): number {
  let fa = f(a);
  if (fa * f(b) > 0) throw new Error(`no sign change in [${a}, ${b}]`);
  for (let k = 0; k < 200; k++) {
    const m = 0.5 * (a + b);
    const fm = f(m);
    if (fm === 0) return m;
    if (fa * fm < 0) b = m;
    else {
      a = m;
      fa = fm;
    }
  }
  return 0.5 * (a + b);
}

/** The first `count` roots of f on (from, …), scanning with step h for sign changes. */
export function roots(f: (x: number) => number, count: number, from = 0.1, h = 0.01): number[] {
  const out: number[] = [];
  let x = from;
  let fx = f(x);
  while (out.length < count) {
    const y = x + h;
    const fy = f(y);
    if (fx * fy < 0) out.push(bisect(f, x, y));
    x = y;
    fx = fy;
  }
  return out;
}

export const relErr = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

export interface PlaneBeamOptions {
  elements: number;
  L: number;
  E: number;
  G?: number;
  density: number;
  A: number;
  I: number;
  kappa?: number;
  kind?: 'beam' | 'timoshenko';
  mass?: 'consistent' | 'lumped';
  /** DOFs fixed at the left (x = 0) and right (x = L) ends. */
  left: string[];
  right: string[];
}

/**
 * A straight plane beam along x with ux fixed everywhere (so only bending remains), made of
 * `elements` equal elements.
 */
export function planeBeamModel(o: PlaneBeamOptions): Model {
  const nodes = Array.from({ length: o.elements + 1 }, (_, i) => ({ id: `n${i}`, x: (o.L * i) / o.elements, y: 0 }));
  const elements = Array.from({ length: o.elements }, (_, i) => ({ id: `e${i}`, kind: o.kind ?? 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'm', section: 's' }));
  const supports = nodes.map((nd, i) => {
    const fixed = new Set(['ux']);
    if (i === 0) o.left.forEach((d) => fixed.add(d));
    if (i === o.elements) o.right.forEach((d) => fixed.add(d));
    return { node: nd.id, fixed: [...fixed] };
  });
  const material: Record<string, number> = { E: o.E, density: o.density };
  if (o.G !== undefined) material.G = o.G;
  const section: Record<string, number> = { A: o.A, Iz: o.I };
  if (o.kappa !== undefined) section.kappa = o.kappa;
  return { format: 'eigenframe-model/1', space: 'plane', mass: o.mass ?? 'consistent', materials: { m: material as never }, sections: { s: section as never }, nodes, elements: elements as never, supports: supports as never };
}
