import { ArgumentError } from '../../errors';
import { amdGraph } from './amd';
import type { Graph } from './graph';
import { mulberry32 } from '../random';

/** Options of nested dissection. */
export interface NestedDissectionOptions {
  /**
   * A part whose weight (number of unknowns) is at most this is not split further; it is
   * ordered by constrained approximate minimum degree. Larger leaves gave less fill on every
   * pattern measured (frames, trusses, 2D grids), smaller ones give more dissection levels.
   * @defaultValue 4000
   */
  leafSize?: number;
  /**
   * Allowed imbalance of a bisection: each side may weigh up to (1 + imbalance)/2 of the
   * part. @defaultValue 0.2
   */
  imbalance?: number;
  /** Number of initial partitions tried on the coarsest graph; the best is kept. @defaultValue 8 */
  initialTries?: number;
  /** Seed of the pseudo-random choices (matching order, initial seeds). @defaultValue 1 */
  seed?: number;
}

/** Defaults of {@link NestedDissectionOptions}. */
export const ND_DEFAULTS = { leafSize: 4000, imbalance: 0.2, initialTries: 8, seed: 1 } as const;

/** Resolves and validates nested-dissection options. */
export function resolveNdOptions(options: NestedDissectionOptions = {}): Required<NestedDissectionOptions> {
  const o = { ...ND_DEFAULTS, ...options };
  if (!(Number.isInteger(o.leafSize) && o.leafSize >= 1)) throw new ArgumentError(`leafSize ${o.leafSize} is not a positive integer; pass e.g. 200`, 'options.leafSize');
  if (!(o.imbalance >= 0 && o.imbalance < 1)) throw new ArgumentError(`imbalance ${o.imbalance} is outside [0, 1); pass e.g. 0.2`, 'options.imbalance');
  if (!(Number.isInteger(o.initialTries) && o.initialTries >= 1)) throw new ArgumentError(`initialTries ${o.initialTries} is not a positive integer; pass e.g. 8`, 'options.initialTries');
  if (!Number.isInteger(o.seed)) throw new ArgumentError(`seed ${o.seed} is not an integer; pass any integer`, 'options.seed');
  return o;
}

/** A graph with vertex and edge weights (Karypis & Kumar 1998 layout). */
interface WGraph {
  n: number;
  xadj: Int32Array;
  adjncy: Int32Array;
  vwgt: Int32Array;
  adjwgt: Int32Array;
  /** Sum of vwgt. */
  total: number;
}


/**
 * Nested-dissection ordering of a graph whose vertex v stands for `weight[v]` unknowns.
 *
 * Multilevel recursive bisection in the style of Karypis & Kumar, "A fast and high quality
 * multilevel scheme for partitioning irregular graphs", SIAM J. Sci. Comput. 20(1), 1998:
 * heavy-edge matching coarsening (§3), greedy graph growing initial bisection (§4), boundary
 * Kernighan–Lin/Fiduccia–Mattheyses refinement while uncoarsening (§5), then a vertex separator
 * as a minimum vertex cover of the cut edges (König's theorem, via maximum bipartite matching),
 * improved by moving separator vertices that touch one side only. Separators are ordered after
 * the parts they separate (George, "Nested dissection of a regular finite element mesh", SIAM
 * J. Numer. Anal. 10(2), 1973). Parts at most `leafSize` heavy are not split further; the
 * final order is one constrained minimum-degree pass (amdGraph with constraint sets) in which
 * every leaf part and every separator is a set, taken in dissection order.
 *
 * @returns perm of length g.n: perm[k] = vertex eliminated k-th.
 */
export function ndGraph(g: Graph, weight: Int32Array | undefined, options: NestedDissectionOptions = {}): Int32Array {
  const opt = resolveNdOptions(options);
  const n = g.n;
  const out = new Int32Array(n);
  if (n === 0) return out;
  const vwgt = new Int32Array(n);
  let total = 0;
  for (let v = 0; v < n; v++) {
    vwgt[v] = weight ? weight[v] : 1;
    total += vwgt[v];
  }
  const adjwgt = new Int32Array(g.adjncy.length).fill(1);
  const root: WGraph = { n, xadj: g.xadj, adjncy: g.adjncy, vwgt, adjwgt, total };
  const ids = new Int32Array(n);
  for (let v = 0; v < n; v++) ids[v] = v;
  const state: NdState = { pos: 0, nsets: 0, rng: mulberry32(opt.seed), opt };
  dissect(root, ids, out, state);
  // `out` is the plain dissection order; the sets it was built from become constraint sets of
  // one minimum-degree pass over the whole graph (constrained minimum degree, as CAMD on the
  // separator tree), so each part is ordered knowing which vertices touch later separators.
  return amdGraph(root, vwgt, state.cset);
}

interface NdState {
  pos: number;
  /** Constraint set of each vertex (a leaf part or a separator), in elimination order. */
  cset?: Int32Array;
  nsets: number;
  rng: () => number;
  opt: Required<NestedDissectionOptions>;
}

/** Orders g (whose vertex v is ids[v] of the root graph) into out[state.pos ..]. */
function dissect(g: WGraph, ids: Int32Array, out: Int32Array, state: NdState): void {
  const n = g.n;
  if (g.total <= state.opt.leafSize || n <= 3) {
    orderLeaf(g, ids, out, state);
    return;
  }
  // --- Connected components are ordered independently ---------------------------------------
  const comp = new Int32Array(n);
  const ncomp = components(g, comp);
  if (ncomp > 1) {
    // Bucket the vertices by component (counting sort), then extract each component from its
    // own vertex list: linear in n however many components there are.
    const cptr = new Int32Array(ncomp + 1);
    for (let v = 0; v < n; v++) cptr[comp[v] + 1]++;
    for (let c = 0; c < ncomp; c++) cptr[c + 1] += cptr[c];
    const byComp = new Int32Array(n);
    const at = cptr.slice(0, ncomp);
    for (let v = 0; v < n; v++) byComp[at[comp[v]]++] = v;
    const local = new Int32Array(n).fill(-1);
    for (let c = 0; c < ncomp; c++) {
      const sub = extractList(g, byComp.subarray(cptr[c], cptr[c + 1]), local);
      const subIds = new Int32Array(sub.n);
      for (let t = 0; t < sub.n; t++) subIds[t] = ids[byComp[cptr[c] + t]];
      dissect(sub, subIds, out, state);
    }
    return;
  }
  // --- Bisect, then turn the edge cut into a vertex separator -------------------------------
  const where = bisect(g, state);
  separatorFromCut(g, where);
  refineSeparator(g, where);
  let w0 = 0;
  let w1 = 0;
  for (let v = 0; v < n; v++) {
    if (where[v] === 0) w0++;
    else if (where[v] === 1) w1++;
  }
  if (w0 === 0 || w1 === 0) {
    // no useful separator (e.g. a near-clique): minimum degree does as well
    orderLeaf(g, ids, out, state);
    return;
  }
  for (let side = 0; side < 2; side++) {
    const sub = extract(g, where, side);
    const subIds = new Int32Array(sub.verts.length);
    for (let t = 0; t < subIds.length; t++) subIds[t] = ids[sub.verts[t]];
    dissect(sub.graph, subIds, out, state);
  }
  // The separator: one constraint set, after both parts it separates.
  const sep = extract(g, where, 2);
  const sepIds = new Int32Array(sep.verts.length);
  for (let t = 0; t < sepIds.length; t++) sepIds[t] = ids[sep.verts[t]];
  orderLeaf(sep.graph, sepIds, out, state);
}

/** Appends the vertices of g as one constraint set. */
function orderLeaf(g: WGraph, ids: Int32Array, out: Int32Array, state: NdState): void {
  if (!state.cset) state.cset = new Int32Array(out.length);
  const s = state.nsets++;
  for (let k = 0; k < g.n; k++) {
    out[state.pos++] = ids[k];
    state.cset[ids[k]] = s;
  }
}

/** Labels connected components in comp; returns their number. */
function components(g: WGraph, comp: Int32Array): number {
  const { n, xadj, adjncy } = g;
  comp.fill(-1);
  const stack = new Int32Array(n);
  let nc = 0;
  for (let s = 0; s < n; s++) {
    if (comp[s] !== -1) continue;
    let top = 0;
    stack[top++] = s;
    comp[s] = nc;
    while (top > 0) {
      const v = stack[--top];
      for (let p = xadj[v]; p < xadj[v + 1]; p++) {
        const u = adjncy[p];
        if (comp[u] === -1) {
          comp[u] = nc;
          stack[top++] = u;
        }
      }
    }
    nc++;
  }
  return nc;
}

/** Subgraph induced by the vertices v with label[v] === which. */
function extract(g: WGraph, label: Int32Array, which: number): { graph: WGraph; verts: Int32Array } {
  const { n, xadj, adjncy, vwgt, adjwgt } = g;
  const local = new Int32Array(n);
  let m = 0;
  let ne = 0;
  for (let v = 0; v < n; v++) {
    if (label[v] === which) {
      local[v] = m++;
      for (let p = xadj[v]; p < xadj[v + 1]; p++) if (label[adjncy[p]] === which) ne++;
    } else local[v] = -1;
  }
  const verts = new Int32Array(m);
  const sx = new Int32Array(m + 1);
  const sa = new Int32Array(ne);
  const sw = new Int32Array(ne);
  const sv = new Int32Array(m);
  let total = 0;
  let e = 0;
  for (let v = 0; v < n; v++) {
    const lv = local[v];
    if (lv < 0) continue;
    verts[lv] = v;
    sv[lv] = vwgt[v];
    total += vwgt[v];
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      const u = adjncy[p];
      if (local[u] >= 0) {
        sa[e] = local[u];
        sw[e++] = adjwgt[p];
      }
    }
    sx[lv + 1] = e;
  }
  return { graph: { n: m, xadj: sx, adjncy: sa, vwgt: sv, adjwgt: sw, total }, verts };
}

/**
 * Subgraph induced by the vertex list verts (in that order); `local` is an all −1 scratch map
 * of length g.n, left all −1 again on return.
 */
function extractList(g: WGraph, verts: Int32Array, local: Int32Array): WGraph {
  const { xadj, adjncy, vwgt, adjwgt } = g;
  const m = verts.length;
  for (let t = 0; t < m; t++) local[verts[t]] = t;
  let ne = 0;
  for (let t = 0; t < m; t++) ne += xadj[verts[t] + 1] - xadj[verts[t]]; // a component keeps all its edges
  const sx = new Int32Array(m + 1);
  const sa = new Int32Array(ne);
  const sw = new Int32Array(ne);
  const sv = new Int32Array(m);
  let total = 0;
  let e = 0;
  for (let t = 0; t < m; t++) {
    const v = verts[t];
    sv[t] = vwgt[v];
    total += vwgt[v];
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      const u = local[adjncy[p]];
      if (u >= 0) {
        sa[e] = u;
        sw[e++] = adjwgt[p];
      }
    }
    sx[t + 1] = e;
  }
  for (let t = 0; t < m; t++) local[verts[t]] = -1;
  return { n: m, xadj: sx, adjncy: sa.subarray(0, e), vwgt: sv, adjwgt: sw.subarray(0, e), total };
}

// ==========================================================================================
// Multilevel edge bisection
// ==========================================================================================

/** Returns where[v] ∈ {0, 1} for a connected graph g. */
function bisect(g: WGraph, state: NdState): Int32Array {
  const levels: WGraph[] = [g];
  const maps: Int32Array[] = [];
  let cur = g;
  // --- Coarsening by heavy-edge matching (Karypis & Kumar 1998, §3.1) ------------------------
  while (cur.n > 80) {
    const { coarse, cmap } = coarsen(cur, state.rng);
    if (coarse.n > 0.9 * cur.n) break;
    levels.push(coarse);
    maps.push(cmap);
    cur = coarse;
  }
  // --- Initial bisection of the coarsest graph (§4, greedy graph growing) --------------------
  const maxw = Math.floor(((1 + state.opt.imbalance) / 2) * g.total);
  const work = new FmWork(g.n); // sized for the finest level, reused by every level
  let where = initialBisection(cur, state, maxw, work);
  // --- Uncoarsen and refine (§5, boundary FM) --------------------------------------------------
  for (let l = levels.length - 2; l >= 0; l--) {
    const fine = levels[l];
    const cmap = maps[l];
    const fw = new Int32Array(fine.n);
    for (let v = 0; v < fine.n; v++) fw[v] = where[cmap[v]];
    where = fw;
    fmRefine(fine, where, maxw, 4, work);
  }
  return where;
}

/** One level of heavy-edge matching; returns the contracted graph and the fine→coarse map. */
function coarsen(g: WGraph, rng: () => number): { coarse: WGraph; cmap: Int32Array } {
  const { n, xadj, adjncy, vwgt, adjwgt } = g;
  // Visit order: shuffled within runs of 64 consecutive vertices, random enough to vary the
  // matching, local enough to keep memory access cache-friendly.
  const order = new Int32Array(n);
  for (let v = 0; v < n; v++) order[v] = v;
  for (let b = 0; b < n; b += 64) {
    const e = Math.min(n, b + 64);
    for (let i = e - 1; i > b; i--) {
      const j = b + Math.floor(rng() * (i - b + 1));
      const t = order[i];
      order[i] = order[j];
      order[j] = t;
    }
  }
  const match = new Int32Array(n).fill(-1);
  const cmap = new Int32Array(n);
  // keep coarse vertices from growing past a fraction of the whole (balance stays reachable)
  const maxvw = Math.max(1, Math.floor(g.total / 40));
  let nc = 0;
  for (let t = 0; t < n; t++) {
    const v = order[t];
    if (match[v] !== -1) continue;
    let best = -1;
    let bw = -1;
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      const u = adjncy[p];
      if (match[u] !== -1 || vwgt[u] + vwgt[v] > maxvw) continue;
      if (adjwgt[p] > bw || (adjwgt[p] === bw && vwgt[u] < vwgt[best])) {
        best = u;
        bw = adjwgt[p];
      }
    }
    if (best === -1) match[v] = v;
    else {
      match[v] = best;
      match[best] = v;
    }
  }
  // number coarse vertices in the order of their first member (locality again)
  cmap.fill(-1);
  for (let v = 0; v < n; v++) if (cmap[v] === -1) cmap[v] = cmap[match[v]] = nc++;
  // contract: the adjacency of coarse vertex c is the union of its members', weights summed
  const cx = new Int32Array(nc + 1);
  const ca = new Int32Array(xadj[n]);
  const cw = new Int32Array(xadj[n]);
  const cv = new Int32Array(nc);
  const slot = new Int32Array(nc).fill(-1);
  let e = 0;
  // build per coarse vertex by walking its (one or two) members
  const first = new Int32Array(nc).fill(-1);
  for (let v = 0; v < n; v++) if (first[cmap[v]] === -1) first[cmap[v]] = v;
  for (let c = 0; c < nc; c++) {
    const a = first[c];
    const b = match[a];
    const start = e;
    cv[c] = vwgt[a] + (b !== a ? vwgt[b] : 0);
    for (let k = 0; k < 2; k++) {
      const v = k === 0 ? a : b;
      if (k === 1 && b === a) break;
      for (let p = xadj[v]; p < xadj[v + 1]; p++) {
        const cu = cmap[adjncy[p]];
        if (cu === c) continue;
        const s = slot[cu];
        if (s >= start) cw[s] += adjwgt[p];
        else {
          slot[cu] = e;
          ca[e] = cu;
          cw[e++] = adjwgt[p];
        }
      }
    }
    cx[c + 1] = e;
  }
  return {
    coarse: { n: nc, xadj: cx, adjncy: ca.subarray(0, e), vwgt: cv, adjwgt: cw.subarray(0, e), total: g.total },
    cmap,
  };
}

/** Best of several greedy-graph-growing bisections, each refined by FM. */
function initialBisection(g: WGraph, state: NdState, maxw: number, work: FmWork): Int32Array {
  const { n } = g;
  let best: Int32Array | null = null;
  let bestCut = Infinity;
  let bestImb = Infinity;
  const where = new Int32Array(n);
  const gain = new Int32Array(n);
  const heap = new MaxHeap(n);
  const half = g.total / 2;
  for (let tr = 0; tr < state.opt.initialTries; tr++) {
    // Grow side 0 from a seed, always adding the frontier vertex that most reduces the cut.
    where.fill(1);
    heap.clear();
    const seed = Math.floor(state.rng() * n);
    let w0 = 0;
    heap.push(seed, 0);
    gain.fill(0);
    const inHeapOrDone = new Uint8Array(n);
    inHeapOrDone[seed] = 1;
    while (heap.size > 0 && w0 < half) {
      const v = heap.pop();
      if (w0 + g.vwgt[v] > maxw) continue;
      where[v] = 0;
      w0 += g.vwgt[v];
      for (let p = g.xadj[v]; p < g.xadj[v + 1]; p++) {
        const u = g.adjncy[p];
        if (where[u] === 0) continue;
        gain[u] += 2 * g.adjwgt[p];
        if (!inHeapOrDone[u]) {
          inHeapOrDone[u] = 1;
          let d = 0;
          for (let q = g.xadj[u]; q < g.xadj[u + 1]; q++) d += g.adjwgt[q];
          gain[u] -= d;
          heap.push(u, gain[u]);
        } else if (heap.contains(u)) heap.update(u, gain[u]);
      }
    }
    fmRefine(g, where, maxw, 4, work);
    const cut = edgeCut(g, where);
    let wa = 0;
    for (let v = 0; v < n; v++) if (where[v] === 0) wa += g.vwgt[v];
    const imb = Math.abs(wa - half);
    if (cut < bestCut || (cut === bestCut && imb < bestImb)) {
      bestCut = cut;
      bestImb = imb;
      best = where.slice();
    }
  }
  return best as Int32Array;
}

function edgeCut(g: WGraph, where: Int32Array): number {
  let cut = 0;
  for (let v = 0; v < g.n; v++) {
    for (let p = g.xadj[v]; p < g.xadj[v + 1]; p++) if (where[g.adjncy[p]] !== where[v]) cut += g.adjwgt[p];
  }
  return cut / 2;
}

/**
 * Boundary Fiduccia–Mattheyses refinement of a two-way edge cut (Karypis & Kumar 1998, §5.2):
 * each pass moves the boundary vertex of largest gain that keeps both sides ≤ maxw, locks it,
 * and rolls back to the best cut seen; stops after a pass without improvement.
 */
function fmRefine(g: WGraph, where: Int32Array, maxw: number, passes: number, work: FmWork): void {
  const { n, xadj, adjncy, adjwgt, vwgt } = g;
  const { id, ed, locked, moved, heaps } = work;
  const pw = [0, 0];
  for (let v = 0; v < n; v++) pw[where[v]] += vwgt[v];
  const limit = Math.max(25, Math.min(150, Math.floor(n / 20)));
  for (let pass = 0; pass < passes; pass++) {
    let cut = 0;
    heaps[0].clear();
    heaps[1].clear();
    for (let v = 0; v < n; v++) {
      let a = 0;
      let b = 0;
      const wv = where[v];
      for (let p = xadj[v]; p < xadj[v + 1]; p++) {
        if (where[adjncy[p]] === wv) a += adjwgt[p];
        else b += adjwgt[p];
      }
      id[v] = a;
      ed[v] = b;
      cut += b;
      locked[v] = 0;
      if (b > 0) heaps[wv].push(v, b - a);
    }
    cut /= 2;
    const startCut = cut;
    let bestCut = cut;
    let bestImb = Math.abs(pw[0] - pw[1]);
    let bestIdx = 0;
    let nmoves = 0;
    for (;;) {
      // candidate from each side whose move keeps the destination within maxw
      let from = -1;
      let bestGain = 0;
      for (let s = 0; s < 2; s++) {
        const h = heaps[s];
        if (h.size === 0) continue;
        const v = h.peek();
        if (pw[1 - s] + vwgt[v] > maxw && pw[s] <= maxw) continue;
        const gn = h.peekKey();
        if (from === -1 || gn > bestGain || (gn === bestGain && pw[s] > pw[from])) {
          bestGain = gn;
          from = s;
        }
      }
      if (from === -1) break;
      const v = heaps[from].pop();
      const to = 1 - from;
      cut -= ed[v] - id[v];
      where[v] = to;
      pw[from] -= vwgt[v];
      pw[to] += vwgt[v];
      locked[v] = 1;
      moved[nmoves++] = v;
      const t = id[v];
      id[v] = ed[v];
      ed[v] = t;
      for (let p = xadj[v]; p < xadj[v + 1]; p++) {
        const u = adjncy[p];
        const w = adjwgt[p];
        if (where[u] === to) {
          id[u] += w;
          ed[u] -= w;
        } else {
          id[u] -= w;
          ed[u] += w;
        }
        if (locked[u]) continue;
        const h = heaps[where[u]];
        if (ed[u] > 0) {
          if (h.contains(u)) h.update(u, ed[u] - id[u]);
          else h.push(u, ed[u] - id[u]);
        } else if (h.contains(u)) h.remove(u);
      }
      const imb = Math.abs(pw[0] - pw[1]);
      const balanced = pw[0] <= maxw && pw[1] <= maxw;
      if (balanced && (cut < bestCut || (cut === bestCut && imb < bestImb))) {
        bestCut = cut;
        bestImb = imb;
        bestIdx = nmoves;
      } else if (nmoves - bestIdx > limit) break;
    }
    // roll back the moves after the best point
    for (let k = nmoves - 1; k >= bestIdx; k--) {
      const v = moved[k];
      const f = where[v];
      where[v] = 1 - f;
      pw[f] -= vwgt[v];
      pw[1 - f] += vwgt[v];
    }
    if (bestCut >= startCut) break;
  }
}

// ==========================================================================================
// Vertex separators
// ==========================================================================================

/**
 * Replaces the edge cut by a vertex separator (label 2): a minimum vertex cover of the
 * bipartite graph of cut edges, by maximum matching and König's theorem (alternating
 * reachability from unmatched side-0 boundary vertices; cover = unreached side-0 ∪ reached
 * side-1). Ashcraft & Liu, "Applications of the Dulmage–Mendelsohn decomposition and network
 * flow to graph bisection improvement", SIAM J. Matrix Anal. Appl. 19(2), 1998, use the same idea.
 */
function separatorFromCut(g: WGraph, where: Int32Array): void {
  const { n, xadj, adjncy } = g;
  const mate = new Int32Array(n).fill(-1);
  const seen = new Int32Array(n).fill(-1);
  // side-0 vertices with a neighbour on side 1
  const b0 = new Int32Array(n);
  let nb0 = 0;
  for (let v = 0; v < n; v++) {
    if (where[v] !== 0) continue;
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      if (where[adjncy[p]] === 1) {
        b0[nb0++] = v;
        break;
      }
    }
  }
  // --- Maximum matching by augmenting paths (iterative DFS) ----------------------------------
  const stackV = new Int32Array(n);
  const stackP = new Int32Array(n);
  const parentU = new Int32Array(n);
  for (let r = 0; r < nb0; r++) {
    const root = b0[r];
    // quick greedy match first
    let done = false;
    for (let p = xadj[root]; p < xadj[root + 1]; p++) {
      const u = adjncy[p];
      if (where[u] === 1 && mate[u] === -1) {
        mate[u] = root;
        mate[root] = u;
        done = true;
        break;
      }
    }
    if (done) continue;
    let top = 0;
    stackV[0] = root;
    stackP[0] = xadj[root];
    seen[root] = r;
    let found = -1;
    while (top >= 0 && found === -1) {
      const v = stackV[top];
      if (stackP[top] >= xadj[v + 1]) {
        top--;
        continue;
      }
      const u = adjncy[stackP[top]++];
      if (where[u] !== 1 || seen[u] === r) continue;
      seen[u] = r;
      parentU[u] = v;
      if (mate[u] === -1) {
        found = u;
        break;
      }
      const w = mate[u];
      seen[w] = r;
      stackV[++top] = w;
      stackP[top] = xadj[w];
    }
    // augment along the path
    let u = found;
    while (u !== -1) {
      const v = parentU[u];
      const prev = mate[v];
      mate[u] = v;
      mate[v] = u;
      u = v === root ? -1 : prev;
    }
  }
  // --- König: alternating reachability from unmatched side-0 boundary vertices ------------------
  const reach = new Uint8Array(n);
  const queue = new Int32Array(n);
  let qh = 0;
  let qt = 0;
  for (let t = 0; t < nb0; t++) {
    const v = b0[t];
    if (mate[v] === -1) {
      reach[v] = 1;
      queue[qt++] = v;
    }
  }
  while (qh < qt) {
    const v = queue[qh++];
    for (let p = xadj[v]; p < xadj[v + 1]; p++) {
      const u = adjncy[p];
      if (where[u] !== 1 || reach[u]) continue;
      reach[u] = 1;
      const w = mate[u];
      if (w !== -1 && !reach[w]) {
        reach[w] = 1;
        queue[qt++] = w;
      }
    }
  }
  // cover = unreached side-0 boundary ∪ reached side-1 vertices
  for (let v = 0; v < n; v++) if (where[v] === 1 && reach[v]) where[v] = 2;
  for (let t = 0; t < nb0; t++) if (!reach[b0[t]]) where[b0[t]] = 2;
}

/**
 * Greedy improvement of a vertex separator: a separator vertex with no neighbour on one side
 * can join the other side (it separates nothing), lightest side first. Repeats until no
 * vertex moves.
 */
function refineSeparator(g: WGraph, where: Int32Array): void {
  const { n, xadj, adjncy, vwgt } = g;
  const pw = [0, 0, 0];
  for (let v = 0; v < n; v++) pw[where[v]] += vwgt[v];
  let changed = true;
  while (changed) {
    changed = false;
    for (let v = 0; v < n; v++) {
      if (where[v] !== 2) continue;
      let has0 = false;
      let has1 = false;
      for (let p = xadj[v]; p < xadj[v + 1]; p++) {
        const s = where[adjncy[p]];
        if (s === 0) has0 = true;
        else if (s === 1) has1 = true;
      }
      if (has0 && has1) continue;
      const to = has0 ? 0 : has1 ? 1 : pw[0] <= pw[1] ? 0 : 1;
      where[v] = to;
      pw[2] -= vwgt[v];
      pw[to] += vwgt[v];
      changed = true;
    }
  }
}

/** Scratch arrays of fmRefine, allocated once per bisection for its finest graph. */
class FmWork {
  readonly id: Int32Array;
  readonly ed: Int32Array;
  readonly locked: Uint8Array;
  readonly moved: Int32Array;
  readonly heaps: [MaxHeap, MaxHeap];
  constructor(n: number) {
    this.id = new Int32Array(n);
    this.ed = new Int32Array(n);
    this.locked = new Uint8Array(n);
    this.moved = new Int32Array(n);
    this.heaps = [new MaxHeap(n), new MaxHeap(n)];
  }
}

/** Indexed binary max-heap of vertices keyed by integer gains. */
class MaxHeap {
  size = 0;
  private readonly heap: Int32Array;
  private readonly key: Int32Array;
  private readonly pos: Int32Array;
  constructor(n: number) {
    this.heap = new Int32Array(n);
    this.key = new Int32Array(n);
    this.pos = new Int32Array(n).fill(-1);
  }
  clear(): void {
    for (let i = 0; i < this.size; i++) this.pos[this.heap[i]] = -1;
    this.size = 0;
  }
  contains(v: number): boolean {
    return this.pos[v] !== -1;
  }
  peek(): number {
    return this.heap[0];
  }
  peekKey(): number {
    return this.key[this.heap[0]];
  }
  push(v: number, k: number): void {
    this.key[v] = k;
    const i = this.size++;
    this.heap[i] = v;
    this.pos[v] = i;
    this.up(i);
  }
  update(v: number, k: number): void {
    const old = this.key[v];
    this.key[v] = k;
    if (k > old) this.up(this.pos[v]);
    else this.down(this.pos[v]);
  }
  pop(): number {
    const v = this.heap[0];
    this.remove(v);
    return v;
  }
  remove(v: number): void {
    const i = this.pos[v];
    const last = this.heap[--this.size];
    this.pos[v] = -1;
    if (i === this.size) return;
    this.heap[i] = last;
    this.pos[last] = i;
    this.up(i);
    this.down(this.pos[last]);
  }
  private up(i: number): void {
    const { heap, key, pos } = this;
    const v = heap[i];
    const k = key[v];
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (key[heap[p]] >= k) break;
      heap[i] = heap[p];
      pos[heap[i]] = i;
      i = p;
    }
    heap[i] = v;
    pos[v] = i;
  }
  private down(i: number): void {
    const { heap, key, pos } = this;
    const n = this.size;
    const v = heap[i];
    const k = key[v];
    for (;;) {
      let c = 2 * i + 1;
      if (c >= n) break;
      if (c + 1 < n && key[heap[c + 1]] > key[heap[c]]) c++;
      if (key[heap[c]] <= k) break;
      heap[i] = heap[c];
      pos[heap[i]] = i;
      i = c;
    }
    heap[i] = v;
    pos[v] = i;
  }
}
