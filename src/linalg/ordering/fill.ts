import { ArgumentError } from '../../errors';
import type { SymmetricCsc } from '../sparse/symmetric';
import { adjacency } from './graph';
import type { Graph } from './graph';
import { Scratch } from './scratch';

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
  checkedInverse(perm, g.n); // validates perm
  // Each unknown a block of its own (weight 1): the block elimination is the plain one.
  const { nnzL, flops } = blockElimination(g, new Int32Array(g.n).fill(1), perm);
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
 * Elimination tree and column counts of a block graph eliminated in a given order, where each
 * vertex s stands for a dense block of weight[s] unknowns eliminated together (see
 * {@link blockElimination}). Positions are those of the order: block k is corder[k].
 */
export interface BlockElimination {
  /** parent[k] = position of the parent of block k in the block elimination tree, −1 for a root. */
  readonly parent: Int32Array;
  /**
   * lastCount[k] = nonzeros in the last column of block k of L, diagonal included: 1 + the
   * unknowns of the blocks in struct(L(:,k)). Column i (0-based) of a block of weight w holds
   * lastCount[k] + w − 1 − i.
   */
  readonly lastCount: Int32Array;
  /** Σ over columns of the nonzeros strictly below the diagonal. */
  readonly nnzL: number;
  /** Σ over columns of c(c + 2), c = nonzeros strictly below the diagonal (as symbolicFill). */
  readonly flops: number;
}

/**
 * Elimination tree and column counts of the block graph g (block s of weight[s] unknowns)
 * eliminated in the order corder: Liu's algorithm with path compression, then the row subtrees of
 * the tree (Davis 2006 §4.1 cs_etree, §4.2–4.4), on the block graph. The counts are exact when
 * the blocks are indistinguishable vertices (compress): the unknowns of one block then share
 * their structure, so the expanded order has a chain per block in its elimination tree and the
 * column counts given by lastCount. For a looser grouping they are an upper bound.
 */
export function blockElimination(g: Graph, weight: Int32Array, corder: Int32Array, scratch: Scratch = new Scratch()): BlockElimination {
  const n = g.n;
  const m = scratch.mark();
  const pinv = scratch.take(n);
  for (let k = 0; k < n; k++) pinv[corder[k]] = k;
  const parent = new Int32Array(n);
  const work = scratch.take(n); // ancestors, then marks
  blockTree(g, corder, pinv, parent, work);
  const lastCount = new Int32Array(n);
  blockCounts(g, weight, corder, pinv, parent, work, lastCount);
  scratch.release(m);
  let nnzL = 0;
  let flops = 0;
  for (let k = 0; k < n; k++) {
    const w = weight[corder[k]];
    const below = lastCount[k] - 1;
    nnzL += (w * (w - 1)) / 2 + w * below;
    flops += blockFlops(below, w);
  }
  return { parent, lastCount, nnzL, flops };
}

/** Σ c(c + 2) over the columns of a block of w unknowns with `below` unknowns below it: c = below .. below + w − 1. */
function blockFlops(below: number, w: number): number {
  let f = 0;
  for (let c = below; c < below + w; c++) f += c * (c + 2);
  return f;
}

/** Elimination tree of the ordered block graph (Liu's algorithm, cs_etree); ancestor is workspace. */
function blockTree(g: Graph, corder: Int32Array, pinv: Int32Array, parent: Int32Array, ancestor: Int32Array): void {
  const { n, xadj, adjncy } = g;
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
}

/**
 * count[j] = 1 + weighted rows below block j, by the row subtrees: row block k has a nonzero in
 * block column j for every j on the tree paths from the entries of row k up to k (Davis 2006,
 * Theorem 4.5). mark is workspace.
 */
function blockCounts(g: Graph, weight: Int32Array, corder: Int32Array, pinv: Int32Array, parent: Int32Array, mark: Int32Array, count: Int32Array): void {
  const { n, xadj, adjncy } = g;
  mark.fill(-1);
  count.fill(1);
  for (let k = 0; k < n; k++) {
    mark[k] = k;
    const v = corder[k];
    const wk = weight[v];
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      let j = pinv[adjncy[p]];
      if (j >= k) continue;
      while (mark[j] !== k) {
        count[j] += wk;
        mark[j] = k;
        j = parent[j];
      }
    }
  }
}
