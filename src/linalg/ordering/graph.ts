import { checkPattern, type SymmetricCsc } from '../sparse/symmetric';
import { Scratch } from './scratch';

/**
 * An undirected graph in compressed adjacency form (the "xadj/adjncy" layout of
 * Karypis & Kumar 1998): the neighbours of vertex v are `adjncy[xadj[v] .. xadj[v+1])`,
 * each edge stored in both directions, no self-loops, no duplicates.
 */
export interface Graph {
  /** Number of vertices. */
  readonly n: number;
  /** Offsets into adjncy, length n + 1. */
  readonly xadj: Int32Array;
  /** Neighbour lists, length 2·(number of edges). */
  readonly adjncy: Int32Array;
}

/**
 * Full adjacency graph of a symmetric pattern stored by its lower triangle: vertex i and j are
 * joined when entry (i, j), i ≠ j, is stored. Values are ignored; the diagonal is dropped.
 * @throws ArgumentError (path `pattern.colPtr` or `pattern.rowIdx[p]`) when the pattern is not
 *   valid lower-triangle CSC (pointer length or monotonicity, a row out of 0..n−1, a row above
 *   the diagonal, or rows not strictly increasing within a column).
 */
export function adjacency(pattern: SymmetricCsc, scratch: Scratch = new Scratch()): Graph {
  const n = pattern.n;
  checkPattern(pattern);
  const xadj = new Int32Array(n + 1);
  countDegrees(pattern, xadj);
  for (let v = 0; v < n; v++) xadj[v + 1] += xadj[v];
  const adjncy = new Int32Array(xadj[n]);
  const m = scratch.mark();
  const next = scratch.take(n);
  next.set(xadj.subarray(0, n));
  scatterEdges(pattern, next, adjncy);
  scratch.release(m);
  return { n, xadj, adjncy };
}

/** deg[v + 1] = number of off-diagonal entries of the pattern in row or column v. */
function countDegrees(pattern: SymmetricCsc, deg: Int32Array): void {
  const { n, colPtr, rowIdx } = pattern;
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      if (i !== j) {
        deg[i + 1]++;
        deg[j + 1]++;
      }
    }
  }
}

/** Writes both directions of every off-diagonal entry, next[v] = where v's next neighbour goes. */
function scatterEdges(pattern: SymmetricCsc, next: Int32Array, adjncy: Int32Array): void {
  const { n, colPtr, rowIdx } = pattern;
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      if (i !== j) {
        adjncy[next[i]++] = j;
        adjncy[next[j]++] = i;
      }
    }
  }
}

/**
 * A graph whose vertices stand for groups of indistinguishable vertices of a finer graph.
 */
export interface CompressedGraph {
  /** The quotient graph; vertex s stands for `members[start[s] .. start[s+1])`. */
  readonly graph: Graph;
  /** Number of original vertices in each compressed vertex, length graph.n. */
  readonly weight: Int32Array;
  /** Offsets into members, length graph.n + 1. */
  readonly start: Int32Array;
  /** Original vertices grouped by compressed vertex, length n (original). */
  readonly members: Int32Array;
}

/**
 * Merges indistinguishable vertices (same closed neighbourhood adj(v) ∪ {v}), found by hashing
 * as in Ashcraft, "Compressed graphs and the minimum degree algorithm", SIAM J. Sci. Comput.
 * 16(6), 1995. Structural matrices with 3 or 6 DOFs per node compress by that factor, and every
 * ordering of the compressed graph, expanded, is an ordering of the original with the same fill
 * behaviour (members of one group are eliminated together).
 */
export function compress(g: Graph, scratch: Scratch = new Scratch()): CompressedGraph {
  const n = g.n;
  const m = scratch.mark();
  const hash = scratch.take(n);
  hashNeighbourhoods(g, hash);
  const cid = scratch.take(n);
  const nc = findIndistinguishable(g, hash, scratch.filled(n, -1), scratch.filled(n, -1), cid);
  // Nothing merged (bar and plane-frame patterns that store no zero couplings): the graph is its
  // own quotient; skip the copy.
  const c = nc === n ? identityQuotient(g) : quotient(g, cid, nc, scratch);
  scratch.release(m);
  return c;
}

/** Hash of the closed neighbourhood of each vertex (sum of indices, wrapped to 32 bits). */
function hashNeighbourhoods(g: Graph, hash: Int32Array): void {
  const { n, xadj, adjncy } = g;
  for (let v = 0; v < n; v++) {
    let h = v;
    for (let p = xadj[v]; p < xadj[v + 1]; p++) h = (h + adjncy[p]) | 0;
    hash[v] = h;
  }
}

/**
 * cid[v] = group of v, groups numbered by their first vertex; rep and mark are workspaces set to
 * −1. @returns the number of groups
 */
function findIndistinguishable(g: Graph, hash: Int32Array, rep: Int32Array, mark: Int32Array, cid: Int32Array): number {
  const { n, xadj, adjncy } = g;
  let nc = 0;
  for (let v = 0; v < n; v++) {
    if (rep[v] !== -1) continue;
    rep[v] = v;
    cid[v] = nc++;
    const dv = xadj[v + 1] - xadj[v];
    let marked = false;
    // Indistinguishable vertices are neighbours of each other, so only v's neighbours qualify.
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      const u = adjncy[p];
      if (u < v || rep[u] !== -1 || hash[u] !== hash[v] || xadj[u + 1] - xadj[u] !== dv) continue;
      if (!marked) {
        mark[v] = v;
        for (let q = xadj[v]; q < xadj[v + 1]; q++) mark[adjncy[q]] = v;
        marked = true;
      }
      if (sameMarks(g, u, mark, v)) {
        rep[u] = v;
        cid[u] = cid[v];
      }
    }
  }
  return nc;
}

/** Whether every neighbour of u carries the mark v. */
function sameMarks(g: Graph, u: number, mark: Int32Array, v: number): boolean {
  const { xadj, adjncy } = g;
  for (let q = xadj[u]; q < xadj[u + 1]; q++) if (mark[adjncy[q]] !== v) return false;
  return true;
}

/** The graph as its own quotient: one vertex per group (start and members share one 0, 1, …, n). */
function identityQuotient(g: Graph): CompressedGraph {
  const n = g.n;
  const start = new Int32Array(n + 1);
  for (let v = 0; v < n; v++) start[v + 1] = v + 1;
  return { graph: g, weight: new Int32Array(n).fill(1), start, members: start.subarray(0, n) };
}

/**
 * Quotient graph of g for the grouping cid (cid[v] = group of v, groups 0..nc−1): group s is
 * joined to group t when some member of s is joined to some member of t.
 */
export function quotient(g: Graph, cid: Int32Array, nc: number, scratch: Scratch = new Scratch()): CompressedGraph {
  const n = g.n;
  const weight = new Int32Array(nc);
  for (let v = 0; v < n; v++) weight[cid[v]]++;
  const start = new Int32Array(nc + 1);
  for (let s = 0; s < nc; s++) start[s + 1] = start[s] + weight[s];
  const members = new Int32Array(n);
  const m = scratch.mark();
  const fillPos = scratch.take(nc);
  fillPos.set(start.subarray(0, nc));
  for (let v = 0; v < n; v++) members[fillPos[cid[v]]++] = v;
  // Quotient adjacency: union of the members' neighbours, mapped and deduplicated.
  const cmark = scratch.filled(nc, -1);
  const cx = new Int32Array(nc + 1);
  const total = quotientDegrees(g, cid, start, members, cmark, cx);
  const cadj = new Int32Array(total);
  cmark.fill(-1);
  quotientEdges(g, cid, start, members, cmark, cadj);
  scratch.release(m);
  return { graph: { n: nc, xadj: cx, adjncy: cadj }, weight, start, members };
}

/** cx[s + 1] = cx[s] + distinct groups adjacent to group s; cmark is −1 on entry. @returns cx[nc] */
function quotientDegrees(g: Graph, cid: Int32Array, start: Int32Array, members: Int32Array, cmark: Int32Array, cx: Int32Array): number {
  const { xadj, adjncy } = g;
  const nc = start.length - 1;
  let total = 0;
  for (let s = 0; s < nc; s++) {
    cmark[s] = s;
    for (let q = start[s]; q < start[s + 1]; q++) {
      const v = members[q];
      for (let p = xadj[v]; p < xadj[v + 1]; p++) {
        const t = cid[adjncy[p]];
        if (cmark[t] !== s) {
          cmark[t] = s;
          total++;
        }
      }
    }
    cx[s + 1] = total;
  }
  return total;
}

/** The neighbour lists counted by quotientDegrees, in the same order; cmark is −1 on entry. */
function quotientEdges(g: Graph, cid: Int32Array, start: Int32Array, members: Int32Array, cmark: Int32Array, cadj: Int32Array): void {
  const { xadj, adjncy } = g;
  const nc = start.length - 1;
  let w = 0;
  for (let s = 0; s < nc; s++) {
    cmark[s] = s;
    for (let q = start[s]; q < start[s + 1]; q++) {
      const v = members[q];
      for (let p = xadj[v]; p < xadj[v + 1]; p++) {
        const t = cid[adjncy[p]];
        if (cmark[t] !== s) {
          cmark[t] = s;
          cadj[w++] = t;
        }
      }
    }
  }
}

/**
 * Groups the unknowns of one structural node when their pattern does not make them exactly
 * indistinguishable (a frame member couples ux only to ux, uy to uy and rz, ... so the DOFs of
 * a node have different, though overlapping, neighbourhoods). Two adjacent vertices i < j with
 * j − i ≤ window (finite-element numberings put the DOFs of a node next to each other) are
 * merged when the Jaccard similarity |N[i] ∩ N[j]| / |N[i] ∪ N[j]| of their closed
 * neighbourhoods is at least `similarity`, groups capped at `maxSize` vertices. Ordering the
 * quotient graph treats each node as one block, as a node-by-node ordering would (common
 * practice in finite-element solvers: order the nodal graph, then expand). The grouping is a
 * heuristic: callers compare its fill with the exact compression's and keep the better.
 */
export function groupNodes(g: Graph, window = 5, similarity = 0.2, maxSize = 6, scratch: Scratch = new Scratch()): CompressedGraph {
  const { n, xadj, adjncy } = g;
  const m0 = scratch.mark();
  const parent = scratch.take(n);
  const size = scratch.filled(n, 1);
  for (let v = 0; v < n; v++) parent[v] = v;
  const find = (v: number): number => {
    while (parent[v] !== v) {
      parent[v] = parent[parent[v]];
      v = parent[v];
    }
    return v;
  };
  const mark = scratch.filled(n, -1);
  for (let i = 0; i < n; i++) {
    const di = xadj[i + 1] - xadj[i] + 1;
    let marked = false;
    for (let p = xadj[i]; p < xadj[i + 1]; p++) {
      const j = adjncy[p];
      if (j <= i || j - i > window) continue;
      if (!marked) {
        mark[i] = i;
        for (let q = xadj[i]; q < xadj[i + 1]; q++) mark[adjncy[q]] = i;
        marked = true;
      }
      let common = mark[j] === i ? 1 : 0;
      for (let q = xadj[j]; q < xadj[j + 1]; q++) if (mark[adjncy[q]] === i) common++;
      const dj = xadj[j + 1] - xadj[j] + 1;
      if (common < similarity * (di + dj - common)) continue;
      const a = find(i);
      const b = find(j);
      if (a === b || size[a] + size[b] > maxSize) continue;
      if (a < b) {
        parent[b] = a;
        size[a] += size[b];
      } else {
        parent[a] = b;
        size[b] += size[a];
      }
    }
  }
  const cid = scratch.filled(n, -1);
  const rootId = scratch.filled(n, -1);
  let nc = 0;
  for (let v = 0; v < n; v++) {
    const r = find(v);
    if (rootId[r] === -1) rootId[r] = nc++;
    cid[v] = rootId[r];
  }
  const c = quotient(g, cid, nc, scratch);
  scratch.release(m0);
  return c;
}

/** Expands an ordering of the compressed vertices into one of the original vertices. */
export function expand(c: CompressedGraph, corder: Int32Array): Int32Array {
  const perm = new Int32Array(c.members.length);
  let k = 0;
  for (let t = 0; t < corder.length; t++) {
    const s = corder[t];
    for (let p = c.start[s]; p < c.start[s + 1]; p++) perm[k++] = c.members[p];
  }
  return perm;
}
