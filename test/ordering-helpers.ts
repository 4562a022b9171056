/**
 * Sparsity patterns for the ordering tests and hand measurements. Values are placeholders
 * (the orderings read the pattern only); the layouts are invented test shapes, not models.
 */
import { CooBuilder } from '../src/linalg/sparse/symmetric';
import type { SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { mulberry32 as rng } from '../src/linalg/random';

/** Seeded uniform generator on [0, 1), so every run sees the same data. */
export { rng };


/**
 * Pattern of a structure whose nodes carry `dof` unknowns each: every node is a dense
 * dof × dof block, every member a dense coupling block between its two nodes. Nodes with
 * `fixed[node]` true are removed (supported), and the remaining DOFs renumbered node by node.
 */
export function nodalPattern(nodes: number, dof: number, members: ArrayLike<number>, fixed?: Uint8Array): SymmetricCsc {
  const first = new Int32Array(nodes).fill(-1);
  let n = 0;
  for (let v = 0; v < nodes; v++) {
    if (fixed && fixed[v]) continue;
    first[v] = n;
    n += dof;
  }
  const b = new CooBuilder(n, n * dof * 4);
  for (let v = 0; v < nodes; v++) {
    const f = first[v];
    if (f < 0) continue;
    for (let a = 0; a < dof; a++) for (let c = 0; c <= a; c++) b.add(f + a, f + c, a === c ? 4 : 1);
  }
  for (let m = 0; m + 1 < members.length; m += 2) {
    const fa = first[members[m]];
    const fb = first[members[m + 1]];
    if (fa < 0 || fb < 0) continue;
    for (let a = 0; a < dof; a++) for (let c = 0; c < dof; c++) b.add(fa + a, fb + c, -1);
  }
  return b.toCsc();
}

/**
 * 3D building frame: nodes on an (nx+1)×(ny+1)×(nz+1) grid, beams and columns between grid
 * neighbours in x, y and z, 6 DOF per node, the base level (z = 0) supported.
 * 12×12×40 bays: 13·13·40 = 6,760 free nodes, 40,560 DOF.
 */
export function buildingPattern(nx: number, ny: number, nz: number): SymmetricCsc {
  const id = (i: number, j: number, k: number): number => (k * (ny + 1) + j) * (nx + 1) + i;
  const nodes = (nx + 1) * (ny + 1) * (nz + 1);
  const members: number[] = [];
  for (let k = 0; k <= nz; k++)
    for (let j = 0; j <= ny; j++)
      for (let i = 0; i <= nx; i++) {
        if (i < nx) members.push(id(i, j, k), id(i + 1, j, k));
        if (j < ny) members.push(id(i, j, k), id(i, j + 1, k));
        if (k < nz) members.push(id(i, j, k), id(i, j, k + 1));
      }
  const fixed = new Uint8Array(nodes);
  for (let j = 0; j <= ny; j++) for (let i = 0; i <= nx; i++) fixed[id(i, j, 0)] = 1;
  return nodalPattern(nodes, 6, members, fixed);
}

/**
 * Long truss footbridge: two parallel Pratt trusses (bottom and top chords, verticals,
 * diagonals), deck cross-beams and deck X-bracing between the bottom chords, top struts and
 * top X-bracing between the top chords; 3 DOF per node (bars), the two end bottom nodes of each
 * truss supported. `panels` = 7,000 gives 28,004 nodes, 84,000 DOF.
 */
export function footbridgePattern(panels: number): SymmetricCsc {
  // node (s, t, x): s = truss 0/1, t = 0 bottom / 1 top, x = 0..panels
  const id = (s: number, t: number, x: number): number => (x * 2 + s) * 2 + t;
  const nodes = (panels + 1) * 4;
  const members: number[] = [];
  for (let x = 0; x <= panels; x++) {
    for (let s = 0; s < 2; s++) {
      members.push(id(s, 0, x), id(s, 1, x)); // vertical
      if (x < panels) {
        members.push(id(s, 0, x), id(s, 0, x + 1)); // bottom chord
        members.push(id(s, 1, x), id(s, 1, x + 1)); // top chord
        // Pratt diagonals slope towards mid-span
        if (x < panels / 2) members.push(id(s, 1, x), id(s, 0, x + 1));
        else members.push(id(s, 0, x), id(s, 1, x + 1));
      }
    }
    members.push(id(0, 0, x), id(1, 0, x)); // deck cross-beam
    members.push(id(0, 1, x), id(1, 1, x)); // top strut
    if (x < panels) {
      members.push(id(0, 0, x), id(1, 0, x + 1), id(1, 0, x), id(0, 0, x + 1)); // deck X-bracing
      members.push(id(0, 1, x), id(1, 1, x + 1), id(1, 1, x), id(0, 1, x + 1)); // top X-bracing
    }
  }
  const fixed = new Uint8Array(nodes);
  for (const s of [0, 1]) {
    fixed[id(s, 0, 0)] = 1;
    fixed[id(s, 0, panels)] = 1;
  }
  return nodalPattern(nodes, 3, members, fixed);
}

/**
 * The same building frame with the entry-level pattern of Euler–Bernoulli space-frame members
 * along the axes (Przemieniecki, "Theory of Matrix Structural Analysis", 1968, §5.3, from
 * memory): a member couples only axial with axial, torsion with torsion, and each bending
 * displacement with the rotation of its own bending plane. DOF slots per node: ux uy uz rx ry rz.
 * The DOFs of one node are then not indistinguishable, though ordered best as one block.
 */
export function sparseBuildingPattern(nx: number, ny: number, nz: number): SymmetricCsc {
  // coupled slot groups of a member along x, y, z
  const groups = [
    [[0], [3], [1, 5], [2, 4]],
    [[1], [4], [0, 5], [2, 3]],
    [[2], [5], [0, 4], [1, 3]],
  ];
  const id = (i: number, j: number, k: number): number => (k * (ny + 1) + j) * (nx + 1) + i;
  const first = new Int32Array((nx + 1) * (ny + 1) * (nz + 1)).fill(-1);
  let n = 0;
  for (let k = 1; k <= nz; k++) for (let j = 0; j <= ny; j++) for (let i = 0; i <= nx; i++) first[id(i, j, k)] = (n += 6) - 6;
  const b = new CooBuilder(n, n * 30);
  for (let v = 0; v < first.length; v++) if (first[v] >= 0) for (let d = 0; d < 6; d++) b.add(first[v] + d, first[v] + d, 4);
  const member = (a: number, c: number, axis: number): void => {
    const ends = [first[a], first[c]].filter((f) => f >= 0);
    for (const g of groups[axis]) {
      const dofs = ends.flatMap((f) => g.map((slot) => f + slot));
      for (let x = 0; x < dofs.length; x++) for (let y = 0; y < x; y++) b.add(dofs[x], dofs[y], -1);
    }
  };
  for (let k = 0; k <= nz; k++)
    for (let j = 0; j <= ny; j++)
      for (let i = 0; i <= nx; i++) {
        if (i < nx) member(id(i, j, k), id(i + 1, j, k), 0);
        if (j < ny) member(id(i, j, k), id(i, j + 1, k), 1);
        if (k < nz) member(id(i, j, k), id(i, j, k + 1), 2);
      }
  return b.toCsc();
}

/** k×k grid, 5-point Laplacian pattern (one unknown per grid point). */
export function grid2dPattern(k: number): SymmetricCsc {
  const members: number[] = [];
  for (let j = 0; j < k; j++)
    for (let i = 0; i < k; i++) {
      if (i + 1 < k) members.push(j * k + i, j * k + i + 1);
      if (j + 1 < k) members.push(j * k + i, (j + 1) * k + i);
    }
  return nodalPattern(k * k, 1, members);
}

/** Random symmetric pattern with about `perRow` off-diagonal entries per row, diagonal full. */
export function randomPattern(n: number, perRow: number, seed: number): SymmetricCsc {
  const r = rng(seed);
  const members: number[] = [];
  for (let e = 0; e < (n * perRow) / 2; e++) {
    const a = Math.floor(r() * n);
    const b = Math.floor(r() * n);
    if (a !== b) members.push(a, b);
  }
  return nodalPattern(n, 1, members);
}

/** Pattern of several disjoint blocks: a path, a star, isolated vertices, a small grid. */
export function disconnectedPattern(): SymmetricCsc {
  const members: number[] = [];
  for (let i = 0; i < 9; i++) members.push(i, i + 1); // path 0..9
  for (let i = 11; i < 20; i++) members.push(10, i); // star 10..19
  // 20..24 isolated
  const base = 25;
  for (let j = 0; j < 6; j++)
    for (let i = 0; i < 6; i++) {
      if (i < 5) members.push(base + j * 6 + i, base + j * 6 + i + 1);
      if (j < 5) members.push(base + j * 6 + i, base + (j + 1) * 6 + i);
    }
  return nodalPattern(base + 36, 1, members);
}

/** Band matrix pattern (|i − j| ≤ b) with rows and columns permuted at random. */
export function permutedBandPattern(n: number, b: number, seed: number): { pattern: SymmetricCsc; shuffle: Int32Array } {
  const r = rng(seed);
  const shuffle = new Int32Array(n);
  for (let i = 0; i < n; i++) shuffle[i] = i;
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    const t = shuffle[i];
    shuffle[i] = shuffle[j];
    shuffle[j] = t;
  }
  const members: number[] = [];
  for (let i = 0; i < n; i++) for (let d = 1; d <= b && i + d < n; d++) members.push(shuffle[i], shuffle[i + d]);
  return { pattern: nodalPattern(n, 1, members), shuffle };
}

/** Half-bandwidth max |pinv[i] − pinv[j]| over the stored entries, after ordering by perm. */
export function bandwidth(pattern: SymmetricCsc, perm: Int32Array): number {
  const pinv = new Int32Array(pattern.n);
  for (let k = 0; k < perm.length; k++) pinv[perm[k]] = k;
  let bw = 0;
  for (let j = 0; j < pattern.n; j++)
    for (let p = pattern.colPtr[j]; p < pattern.colPtr[j + 1]; p++) bw = Math.max(bw, Math.abs(pinv[pattern.rowIdx[p]] - pinv[j]));
  return bw;
}

/** True when perm holds each of 0..n−1 exactly once. */
export function isPermutation(perm: Int32Array, n: number): boolean {
  if (perm.length !== n) return false;
  const seen = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const v = perm[k];
    if (!(v >= 0 && v < n) || seen[v]) return false;
    seen[v] = 1;
  }
  return true;
}

/**
 * Reference fill count by dense symbolic elimination (for small n): eliminate in the order
 * perm on a boolean n × n matrix, joining every pair of later neighbours of each pivot
 * (the graph model of Gaussian elimination, Parter 1961 / Rose 1972).
 */
export function denseSymbolicFill(pattern: SymmetricCsc, perm: Int32Array): { nnzL: number; flops: number } {
  const n = pattern.n;
  const pinv = new Int32Array(n);
  for (let k = 0; k < n; k++) pinv[perm[k]] = k;
  const a = new Uint8Array(n * n);
  for (let j = 0; j < n; j++)
    for (let p = pattern.colPtr[j]; p < pattern.colPtr[j + 1]; p++) {
      const r = pinv[pattern.rowIdx[p]];
      const c = pinv[j];
      a[r * n + c] = a[c * n + r] = 1;
    }
  let nnzL = 0;
  let flops = 0;
  for (let k = 0; k < n; k++) {
    let c = 0;
    for (let i = k + 1; i < n; i++) {
      if (!a[i * n + k]) continue;
      c++;
      for (let j = k + 1; j < n; j++) if (a[j * n + k]) a[i * n + j] = 1;
    }
    nnzL += c;
    flops += c * (c + 2);
  }
  return { nnzL, flops };
}
