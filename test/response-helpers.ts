/**
 * Helpers of the response and screening tests: small hand-built models (one mass on a spring,
 * a shear building) turned into modal analyses, and dense complex solves with ml-matrix.
 */
import { Matrix, solve } from 'ml-matrix';
import { modalAnalysis } from '../src/modal/analysis';
import type { ModalAnalysis } from '../src/modal/analysis-types';
import type { AssembledModel, Model } from '../src/model/types';
import { handModel, sym } from './modal-dense';

/** One mass m (kg) on a grounded spring k (N/m), moving along ux of node "a". */
export function sdofModel(k: number, m: number): AssembledModel {
  return handModel('plane', [['a', 0, 0, 0]], [[0, 'ux']], sym([[k]]), sym([[m]]));
}

/**
 * A shear building: storey masses m[i] (kg) on storeys of lateral stiffness k[i] (N/m), storey i
 * at height 3(i+1) m, DOF ux of node `f<i+1>`. K is the usual tridiagonal storey-stiffness matrix
 * (Chopra, Dynamics of Structures, §9.2).
 */
export function shearBuilding(k: number[], m: number[]): AssembledModel {
  const n = k.length;
  const K = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    K[i][i] += k[i];
    if (i + 1 < n) {
      K[i][i] += k[i + 1];
      K[i][i + 1] -= k[i + 1];
      K[i + 1][i] -= k[i + 1];
    }
  }
  const M = K.map((row, i) => row.map((_, j) => (i === j ? m[i] : 0)));
  const nodes: Array<[string, number, number, number]> = m.map((_, i) => [`f${i + 1}`, 0, 3 * (i + 1), 0]);
  return handModel('plane', nodes, m.map((_, i) => [i, 'ux']), sym(K), sym(M));
}

/** Every mode of a small assembled model (dense solver). */
export function allModes(a: AssembledModel): ModalAnalysis {
  return modalAnalysis(a, { count: a.dofs.length });
}

/**
 * Solves (A + iB) (x + iy) = f + 0i for real n × n A, B through the real 2n × 2n system
 * [[A, −B], [B, A]] [x; y] = [f; 0] (ml-matrix LU solve).
 */
export function complexSolve(A: Matrix, B: Matrix, f: ArrayLike<number>): { re: number[]; im: number[] } {
  const n = A.rows;
  const big = new Matrix(2 * n, 2 * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      big.set(i, j, A.get(i, j));
      big.set(i, j + n, -B.get(i, j));
      big.set(i + n, j, B.get(i, j));
      big.set(i + n, j + n, A.get(i, j));
    }
  }
  const rhs = Matrix.columnVector([...Array.from(f), ...new Array<number>(n).fill(0)]);
  const x = solve(big, rhs).getColumn(0);
  return { re: x.slice(0, n), im: x.slice(n) };
}

/**
 * A plane portal frame (invented demo data): two 4 m steel columns fixed at the base, a 6 m
 * beam, each member split in `parts` beam elements; the beam carries 500 kg point masses.
 */
export function portalFrameModel(parts = 2): Model {
  const nodes: Model['nodes'] = [];
  const elements: Model['elements'] = [];
  const line = (name: string, x0: number, y0: number, x1: number, y1: number, first: string, last: string): void => {
    let prev = first;
    for (let k = 1; k <= parts; k++) {
      const id = k === parts ? last : `${name}${k}`;
      if (k < parts) nodes.push({ id, x: x0 + ((x1 - x0) * k) / parts, y: y0 + ((y1 - y0) * k) / parts });
      elements.push({ id: `${name}e${k}`, kind: 'beam', nodes: [prev, id], material: 'steel', section: name === 'b' ? 'beam' : 'column' });
      prev = id;
    }
  };
  nodes.push({ id: 'A', x: 0, y: 0 }, { id: 'B', x: 0, y: 4 }, { id: 'C', x: 6, y: 4 }, { id: 'D', x: 6, y: 0 });
  line('l', 0, 0, 0, 4, 'A', 'B');
  line('b', 0, 4, 6, 4, 'B', 'C');
  line('r', 6, 0, 6, 4, 'D', 'C');
  return {
    format: 'eigenframe-model/1',
    space: 'plane',
    mass: 'consistent',
    materials: { steel: { E: 2.1e11, density: 7850 } },
    sections: { column: { A: 5.4e-3, Iz: 5.7e-5 }, beam: { A: 7.0e-3, Iz: 1.2e-4 } },
    nodes,
    elements,
    supports: [
      { node: 'A', fixed: ['ux', 'uy', 'rz'] },
      { node: 'D', fixed: ['ux', 'uy', 'rz'] },
    ],
    masses: [
      { node: 'B', mass: 500 },
      { node: 'C', mass: 500 },
    ],
  };
}
