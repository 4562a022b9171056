/**
 * Test-pattern generators for the sparse LDLᵀ tests: building-frame-like symmetric matrices
 * (invented data for tests and measurements, not a structural model).
 */
import { CooBuilder, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { mulberry32 as rng } from '../src/linalg/random';

/** Seeded uniform generator on [0, 1), so every run sees the same data. */
export { rng };


/** Shape of a building-frame-like grid: bays along x, y and storeys along z. */
export interface FrameGrid {
  bx: number;
  by: number;
  bz: number;
}

/**
 * Building-frame-like stiffness K and mass M: nodes on a (bx+1)(by+1)(bz+1) grid, a 2-node
 * "beam" to each grid neighbour along x, y, z, 6 DOF per node. Each element adds a random SPD
 * 12×12 block (G Gᵀ / 12, G uniform in [−1, 1)) to K and a random SPD block with a dominant
 * diagonal to M; K gets `shift` on its diagonal so it is SPD. Node numbering: x fastest, then y, z.
 */
export function buildingFrame(grid: FrameGrid, seed = 1, shift = 0.1): { K: SymmetricCsc; M: SymmetricCsc } {
  const { bx, by, bz } = grid;
  const nx = bx + 1;
  const ny = by + 1;
  const nz = bz + 1;
  const nodes = nx * ny * nz;
  const n = nodes * 6;
  const elems: Array<[number, number]> = [];
  const id = (i: number, j: number, k: number) => i + nx * (j + ny * k);
  for (let k = 0; k < nz; k++) {
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        if (i + 1 < nx) elems.push([id(i, j, k), id(i + 1, j, k)]);
        if (j + 1 < ny) elems.push([id(i, j, k), id(i, j + 1, k)]);
        if (k + 1 < nz) elems.push([id(i, j, k), id(i, j, k + 1)]);
      }
    }
  }
  const r = rng(seed);
  const kb = new CooBuilder(n, elems.length * 78 + n);
  const mb = new CooBuilder(n, elems.length * 78);
  const g = new Float64Array(144);
  const dofs = new Int32Array(12);
  for (const [a, b] of elems) {
    for (let t = 0; t < 6; t++) {
      dofs[t] = a * 6 + t;
      dofs[t + 6] = b * 6 + t;
    }
    for (let t = 0; t < 144; t++) g[t] = 2 * r() - 1;
    for (let p = 0; p < 12; p++) {
      for (let q = 0; q <= p; q++) {
        let s = 0;
        for (let t = 0; t < 12; t++) s += g[p * 12 + t] * g[q * 12 + t];
        kb.add(dofs[p], dofs[q], s / 12);
        // Mass-like: small random coupling plus a dominant diagonal (diagonally dominant ⇒ SPD).
        mb.add(dofs[p], dofs[q], p === q ? 1 + r() : 0.05 * (r() - 0.5));
      }
    }
  }
  for (let i = 0; i < n; i++) kb.add(i, i, shift);
  return { K: kb.toCsc(), M: mb.toCsc() };
}

/**
 * Random sparse symmetric matrix with about `perRow` off-diagonal entries per row. With
 * `spd`, the diagonal is made strictly dominant (SPD by Gershgorin); otherwise the diagonal is
 * uniform in [−2, 2) plus the row's off-diagonal sum of magnitudes with a random sign, which
 * keeps every leading minor well away from zero for the usual random draw but leaves the matrix
 * indefinite.
 */
export function randomSymmetric(n: number, perRow: number, seed: number, spd: boolean): SymmetricCsc {
  const r = rng(seed);
  const b = new CooBuilder(n, n * (perRow + 1));
  const rowSum = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let t = 0; t < perRow / 2; t++) {
      const j = Math.floor(r() * n);
      if (j === i) continue;
      const v = 2 * r() - 1;
      b.add(i, j, v);
      rowSum[i] += Math.abs(v);
      rowSum[j] += Math.abs(v);
    }
  }
  for (let i = 0; i < n; i++) {
    const dom = rowSum[i] + 0.5 + r();
    b.add(i, i, spd ? dom : r() < 0.3 ? -dom : dom);
  }
  return b.toCsc();
}

/** Dense row-major copy as nested arrays (for ml-matrix references). */
export function toRows(a: SymmetricCsc): number[][] {
  const n = a.n;
  const m: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      m[i][j] += a.values[p];
      if (i !== j) m[j][i] += a.values[p];
    }
  }
  return m;
}
