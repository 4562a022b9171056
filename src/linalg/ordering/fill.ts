import { ArgumentError } from '../../errors';
import type { SymmetricCsc } from '../sparse/symmetric';
import { adjacency } from './graph';
import type { Graph } from './graph';

/**
 * Size and cost of the Cholesky/LDLᵀ factor of P A Pᵀ, from the pattern alone.
 *
 * Elimination tree by Liu's algorithm with path compression, then column counts by traversing
 * each row subtree of the tree (Davis, "Direct Methods for Sparse Linear Systems", SIAM 2006,
 * §4.1 cs_etree and §4.2–4.4 row subtrees); O(nnz(L)) time, O(n) extra memory.
 *
 * @param pattern - symmetric n × n pattern stored by its lower triangle (values ignored)
 * @param perm - perm[k] = original index eliminated k-th; a permutation of 0..n−1
 * @returns nnzL: nonzeros of L strictly below the diagonal; flops: floating-point operations of
 *   one numeric factorization, Σⱼ cⱼ(cⱼ + 2) with cⱼ the off-diagonal count of column j
 *   (cⱼ divisions plus cⱼ(cⱼ + 1)/2 multiply-adds counted as 2)
 * @throws ArgumentError (path `perm` or `perm[k]`) when perm is not a permutation of 0..n−1
 */
export function symbolicFill(pattern: SymmetricCsc, perm: Int32Array): { nnzL: number; flops: number } {
  const g = adjacency(pattern);
  const n = g.n;
  const pinv = checkedInverse(perm, n);
  const { xadj, adjncy } = g;
  const parent = new Int32Array(n);
  const ancestor = new Int32Array(n);
  // --- Elimination tree of P A Pᵀ (cs_etree): row k of the permuted matrix is the original
  // row perm[k]; its entries left of the diagonal are the neighbours with pinv < k.
  for (let k = 0; k < n; k++) {
    parent[k] = -1;
    ancestor[k] = -1;
    const v = perm[k];
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      let i = pinv[adjncy[p]];
      if (i >= k) continue;
      while (i !== -1 && i < k) {
        const inext = ancestor[i];
        ancestor[i] = k;
        if (inext === -1) parent[i] = k;
        i = inext;
      }
    }
  }
  // --- Row subtrees: row k of L has a nonzero in column j for every j on the tree paths from
  // the entries of row k of A up to k (Davis 2006, Theorem 4.5).
  const count = new Float64Array(n);
  const mark = ancestor; // reuse
  mark.fill(-1);
  for (let k = 0; k < n; k++) {
    mark[k] = k;
    const v = perm[k];
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      let j = pinv[adjncy[p]];
      if (j >= k) continue;
      while (mark[j] !== k) {
        count[j]++;
        mark[j] = k;
        j = parent[j];
      }
    }
  }
  let nnzL = 0;
  let flops = 0;
  for (let j = 0; j < n; j++) {
    const c = count[j];
    nnzL += c;
    flops += c * (c + 2);
  }
  return { nnzL, flops };
}

/** Inverse of a permutation, validating it. */
export function checkedInverse(perm: Int32Array, n: number): Int32Array {
  if (perm.length !== n) throw new ArgumentError(`permutation has length ${perm.length}, the matrix has n = ${n}; pass one index per row`, 'perm');
  const pinv = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const v = perm[k];
    if (!(v >= 0 && v < n) || pinv[v] !== -1) {
      throw new ArgumentError(`index ${v} is ${v >= 0 && v < n ? 'repeated' : `outside 0..${n - 1}`}; perm must list each of 0..n−1 once`, `perm[${k}]`);
    }
    pinv[v] = k;
  }
  return pinv;
}

/**
 * nnz(L) (strictly below the diagonal) when each vertex s of a graph stands for a dense block of
 * weight[s] unknowns and the blocks are eliminated in the order corder (a permutation of the
 * graph's vertices): Σₛ wₛ(wₛ − 1)/2 + wₛ·Σ_{t ∈ struct(L(:,s))} w_t. Exact for a compressed graph
 * of indistinguishable vertices, an upper bound for a looser grouping. Same row-subtree method as
 * symbolicFill, on the (smaller) block graph.
 */
export function blockFill(g: Graph, weight: Int32Array, corder: Int32Array): number {
  const { n, xadj, adjncy } = g;
  const pinv = new Int32Array(n);
  for (let k = 0; k < n; k++) pinv[corder[k]] = k;
  const parent = new Int32Array(n);
  const ancestor = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    parent[k] = -1;
    ancestor[k] = -1;
    const v = corder[k];
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      let i = pinv[adjncy[p]];
      while (i !== -1 && i < k) {
        const inext = ancestor[i];
        ancestor[i] = k;
        if (inext === -1) parent[i] = k;
        i = inext;
      }
    }
  }
  const below = new Float64Array(n); // weighted count of rows below each block column
  const mark = ancestor;
  mark.fill(-1);
  for (let k = 0; k < n; k++) {
    mark[k] = k;
    const v = corder[k];
    const wk = weight[v];
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      let j = pinv[adjncy[p]];
      if (j >= k) continue;
      while (mark[j] !== k) {
        below[j] += wk;
        mark[j] = k;
        j = parent[j];
      }
    }
  }
  let total = 0;
  for (let k = 0; k < n; k++) {
    const w = weight[corder[k]];
    total += (w * (w - 1)) / 2 + w * below[k];
  }
  return total;
}
