/**
 * Dense reference for the modal tests: K x = λ M x solved with ml-matrix (Cholesky of M, then
 * the symmetric eigendecomposition of L⁻¹ K L⁻ᵀ), small problems only. Helpers to build test
 * models by hand.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';
import { fromDenseArray, type SymmetricCsc, toDenseArray } from '../src/linalg/sparse/symmetric';
import type { AssembledModel, DofInfo, DofName, Space } from '../src/model/types';
import { mulberry32 as rng } from '../src/linalg/random';

/** Seeded uniform generator on [0, 1) (mulberry32). */
export { rng };

export interface DenseModes {
  n: number;
  eigenvalues: Float64Array;
  vectors: Float64Array;
}

export function toMatrix(a: SymmetricCsc): Matrix {
  const d = toDenseArray(a);
  const m = new Matrix(a.n, a.n);
  for (let i = 0; i < a.n; i++) for (let j = 0; j < a.n; j++) m.set(i, j, d[i * a.n + j]);
  return m;
}

/** All n eigenpairs, ascending, M-orthonormal (ml-matrix Cholesky + EigenvalueDecomposition). */
export function denseModes(K: SymmetricCsc, M: SymmetricCsc): DenseModes {
  const n = K.n;
  const L = new CholeskyDecomposition(toMatrix(M)).lowerTriangularMatrix;
  const Li = inverse(L);
  const A = Li.mmul(toMatrix(K)).mmul(Li.transpose());
  const As = A.add(A.transpose()).mul(0.5);
  const evd = new EigenvalueDecomposition(As, { assumeSymmetric: true });
  const order = evd.realEigenvalues.map((v, i) => [v, i] as const).sort((a, b) => a[0] - b[0]);
  const Y = evd.eigenvectorMatrix;
  const Phi = Li.transpose().mmul(Y);
  const eigenvalues = new Float64Array(n);
  const vectors = new Float64Array(n * n);
  order.forEach(([v, c], j) => {
    eigenvalues[j] = v;
    for (let i = 0; i < n; i++) vectors[j * n + i] = Phi.get(i, c);
  });
  return { n, eigenvalues, vectors };
}

/** SymmetricCsc from a row-major array of arrays. */
export function sym(rows: number[][]): SymmetricCsc {
  const n = rows.length;
  return fromDenseArray(n, rows.flat());
}

/** An AssembledModel by hand: nodes with coordinates, free DOFs, K and M. */
export function handModel(space: Space, nodes: Array<[string, number, number, number]>, dofs: Array<[number, DofName]>, K: SymmetricCsc, M: SymmetricCsc): AssembledModel {
  const coordinates = new Float64Array(3 * nodes.length);
  nodes.forEach(([, x, y, z], k) => coordinates.set([x, y, z], 3 * k));
  const dofInfo: DofInfo[] = dofs.map(([k, dof]) => ({ node: nodes[k][0], nodeIndex: k, dof }));
  return {
    model: {
      format: 'eigenframe-model/1',
      space,
      materials: {},
      sections: {},
      nodes: nodes.map(([id, x, y, z]) => ({ id, x, y, z })),
      elements: [],
    },
    stiffness: K,
    mass: M,
    dofs: dofInfo,
    coordinates,
  };
}


/** A random symmetric positive definite n × n matrix (seeded), as dense row-major arrays. */
export function randomSpd(n: number, seed: number, density = 0.3): number[][] {
  const r = rng(seed);
  const a = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    for (let i = j + 1; i < n; i++) {
      if (r() < density) {
        const v = r() - 0.5;
        a[i][j] = v;
        a[j][i] = v;
      }
    }
  }
  for (let i = 0; i < n; i++) a[i][i] = 1 + r() + a[i].reduce((s, v, k) => (k === i ? s : s + Math.abs(v)), 0);
  return a;
}
