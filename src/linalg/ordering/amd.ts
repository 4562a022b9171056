import type { Graph } from './graph';
import { Scratch } from './scratch';

/**
 * Approximate minimum degree ordering of a graph whose vertex v stands for `weight[v]`
 * indistinguishable unknowns (1 each when omitted).
 *
 * Follows the published AMD algorithm: Amestoy, Davis & Duff, "An approximate minimum degree
 * ordering algorithm", SIAM J. Matrix Anal. Appl. 17(4), 1996, in the form of Davis, "Direct
 * Methods for Sparse Linear Systems", SIAM 2006, §7.1 (cs_amd): quotient graph held in one
 * Int32Array with elbow room and garbage collection, element absorption, mass elimination,
 * aggressive absorption, supervariable detection by hashing, approximate external degrees, dense
 * rows (degree > max(16, 10√n)) ordered last, and a final postorder of the assembly tree.
 * Locals use the names of that reference. Each phase of one pivot step is its own small
 * function over one workspace, so the JIT compiles (and, on a branch first met late,
 * recompiles) small pieces rather than one long loop.
 *
 * With `cset` (constraint sets, as in CAMD: Davis et al., SuiteSparse CAMD user guide), every
 * vertex of set s is pivoted before any vertex of set s + 1; within a set the pivot is still the
 * vertex of least approximate degree counted over the whole graph. Nested dissection uses this
 * to order each part knowing which of its vertices touch separators eliminated later. Dense
 * rows are not set aside then, and supervariables and mass elimination never cross sets.
 * The returned order is the postorder of the assembly tree, which has the same fill.
 *
 * @param weight - optional number of unknowns of each vertex, ≥ 1
 * @param cset - optional constraint set of each vertex, non-negative integers
 * @param scratch - where the workspace is carved ({@link amdScratchLength} entries), given back
 *   on return
 * @returns perm of length g.n: perm[k] = vertex eliminated k-th.
 */
export function amdGraph(g: Graph, weight?: Int32Array, cset?: Int32Array, scratch: Scratch = new Scratch()): Int32Array {
  if (g.n === 0) return new Int32Array(0);
  const m = scratch.mark();
  const order = amdRun(new AmdWork(g, weight, cset, scratch));
  scratch.release(m);
  return order;
}

/**
 * Int32 entries of the workspace amdGraph takes from its scratch for a graph of n vertices with
 * `adjacent` entries in its neighbour lists (2 per edge) and total weight N.
 */
export function amdScratchLength(n: number, adjacent: number, N: number): number {
  return adjacent + Math.floor(adjacent / 5) + 2 * n + 1 + 10 * (n + 1) + N + 1;
}

/** The pivot loop of amdGraph. */
function amdRun(ws: AmdWork): Int32Array {
  while (ws.nel < ws.N) {
    if (ws.constrained) advanceSet(ws);
    const k = selectPivot(ws);
    if (ws.elen[k] > 0 && ws.cnz + ws.mindeg >= ws.nzmax) collectGarbage(ws);
    constructElement(ws, k);
    setDifferences(ws);
    updateDegrees(ws, k);
    ws.degree[k] = ws.dk;
    ws.lemax = Math.max(ws.lemax, ws.dk);
    ws.mark = wclear(ws.mark + ws.lemax, ws.lemax, ws.w, ws.n);
    detectSupervariables(ws);
    finaliseElement(ws, k);
  }
  return postorder(ws);
}

const flip = (i: number): number => -i - 2;

/** Workspace of one AMD run: the quotient graph and the degree lists (cs_amd's arrays). */
class AmdWork {
  readonly n: number;
  /** Total number of unknowns (sum of weights); degrees and counts are in these units. */
  readonly N: number;
  readonly nzmax: number;
  readonly Ci: Int32Array;
  readonly Cp: Int32Array;
  readonly len: Int32Array;
  readonly nv: Int32Array;
  readonly next: Int32Array;
  readonly last: Int32Array;
  readonly head: Int32Array;
  readonly elen: Int32Array;
  readonly degree: Int32Array;
  readonly w: Int32Array;
  readonly hhead: Int32Array;
  readonly inList: Int32Array;
  readonly constrained: boolean;
  readonly cset: Int32Array;
  readonly setPtr: Int32Array;
  readonly setMembers: Int32Array;
  readonly remaining: Float64Array;
  curSet = -1;
  cnz: number;
  mark = 0;
  nel = 0;
  mindeg = 0;
  lemax = 0;
  // state of the current pivot step
  elenk = 0;
  nvk = 0;
  dk = 0;
  pk1 = 0;
  pk2 = 0;

  constructor(g: Graph, weight: Int32Array | undefined, cset: Int32Array | undefined, scratch: Scratch) {
    const n = g.n;
    this.n = n;
    const N = weight ? sum(weight, n) : n;
    this.N = N;
    const cnz0 = g.xadj[n];
    this.nzmax = cnz0 + Math.floor(cnz0 / 5) + 2 * n + 1;
    // One stretch, carved: the quotient graph, ten vectors over the variables (and the
    // placeholder n), and the degree lists (degrees run to N). Every part is initialised below
    // (the elbow room of Ci is written before it is read).
    const buf = scratch.take(amdScratchLength(n, cnz0, N));
    let at = 0;
    const take = (len: number): Int32Array => buf.subarray(at, (at += len));
    this.Ci = take(this.nzmax);
    this.Cp = take(n + 1);
    this.len = take(n + 1);
    this.nv = take(n + 1);
    this.next = take(n + 1);
    this.last = take(n + 1);
    this.elen = take(n + 1);
    this.degree = take(n + 1);
    this.w = take(n + 1);
    this.hhead = take(n + 1);
    this.inList = take(n + 1);
    this.head = take(N + 1);
    this.cnz = cnz0;
    this.constrained = cset !== undefined;
    this.cset = cset ?? new Int32Array(0);
    const nsets = cset ? maxOf(cset) + 1 : 0;
    this.setPtr = new Int32Array(nsets + 1);
    this.setMembers = new Int32Array(cset ? n : 0);
    this.remaining = new Float64Array(nsets);
    if (cset) groupSets(cset, this.setPtr, this.setMembers);
    initGraph(this, g, weight);
    this.mark = 2; // as cs_wclear(0, 0, w, n) leaves it: every w is 1 here
    initLists(this, cset);
  }
}

/** Σ of the first n entries of an array. */
function sum(a: Int32Array, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += a[i];
  return s;
}

/** Largest entry of a non-empty array. */
function maxOf(a: Int32Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) if (a[i] > m) m = a[i];
  return m;
}

/** Members of each constraint set, by a counting sort: set s holds members[ptr[s] .. ptr[s+1]). */
function groupSets(cset: Int32Array, ptr: Int32Array, members: Int32Array): void {
  const nsets = ptr.length - 1;
  for (let i = 0; i < cset.length; i++) ptr[cset[i] + 1]++;
  for (let s = 0; s < nsets; s++) ptr[s + 1] += ptr[s];
  const at = ptr.slice(0, nsets);
  for (let i = 0; i < cset.length; i++) members[at[cset[i]]++] = i;
}

/** Quotient graph = the graph; weights; degrees; every list empty (cs_amd's initialisation). */
function initGraph(ws: AmdWork, g: Graph, weight: Int32Array | undefined): void {
  const { n, Ci, Cp, len, nv, next, last, head, hhead, w, degree } = ws;
  const { xadj, adjncy } = g;
  Ci.set(adjncy.subarray(0, xadj[n]));
  Cp.set(xadj.subarray(0, n + 1));
  for (let k = 0; k < n; k++) len[k] = Cp[k + 1] - Cp[k];
  if (weight) nv.set(weight.subarray(0, n));
  else nv.fill(1, 0, n);
  len[n] = 0;
  ws.elen.fill(0);
  ws.inList.fill(0);
  degree[n] = 0;
  next.fill(-1);
  last.fill(-1);
  head.fill(-1);
  hhead.fill(-1);
  w.fill(1);
  // Degree = total weight of the neighbours; with unit weights (N = n) that is the list length.
  if (ws.N === n) degree.set(len.subarray(0, n));
  else weightedDegrees(n, Cp, adjncy, nv, degree);
}

/** degree[i] = Σ nv over the neighbours of i. */
function weightedDegrees(n: number, Cp: Int32Array, adjncy: Int32Array, nv: Int32Array, degree: Int32Array): void {
  for (let i = 0; i < n; i++) {
    let d = 0;
    for (let p = Cp[i]; p < Cp[i + 1]; p++) d += nv[adjncy[p]];
    degree[i] = d;
  }
}

/**
 * Puts every variable in the degree list of its degree, except empty rows (eliminated at once),
 * dense rows (absorbed into the placeholder n, ordered last) and, with constraint sets, the
 * variables whose set has not come up yet.
 */
function initLists(ws: AmdWork, cset: Int32Array | undefined): void {
  const { n, N, Cp, len, nv, next, last, head, elen, degree, w, inList } = ws;
  elen[n] = -2;
  Cp[n] = -1;
  w[n] = 0;
  nv[n] = 0;
  const dense = cset ? N : Math.min(N - 2, Math.max(16, 10 * Math.sqrt(N)));
  for (let i = 0; i < n; i++) {
    const d = degree[i];
    if (len[i] === 0) {
      // empty row: eliminated at once
      elen[i] = -2;
      ws.nel += nv[i];
      Cp[i] = -1;
      w[i] = 0;
    } else if (cset) {
      ws.remaining[cset[i]] += nv[i]; // enters the degree lists when its set comes up
    } else if (d > dense) {
      // dense row: absorbed into the placeholder element n, ordered last
      ws.nel += nv[i];
      nv[n] += nv[i];
      nv[i] = 0;
      elen[i] = -1;
      Cp[i] = flip(n);
    } else {
      if (head[d] !== -1) last[head[d]] = i;
      next[i] = head[d];
      head[d] = i;
      inList[i] = 1;
    }
  }
}

/** Moves to the next constraint set once the current one is fully eliminated. */
function advanceSet(ws: AmdWork): void {
  const { remaining, setPtr, setMembers, nv, elen, degree, head, next, last, inList } = ws;
  while (ws.curSet < 0 || remaining[ws.curSet] === 0) {
    const s = ++ws.curSet;
    for (let q = setPtr[s]; q < setPtr[s + 1]; q++) {
      const i = setMembers[q];
      if (nv[i] <= 0 || elen[i] < 0) continue;
      const d = degree[i];
      if (head[d] !== -1) last[head[d]] = i;
      next[i] = head[d];
      last[i] = -1;
      head[d] = i;
      inList[i] = 1;
      if (d < ws.mindeg) ws.mindeg = d;
    }
  }
}

/** Removes and returns a variable of least approximate degree. */
function selectPivot(ws: AmdWork): number {
  const { head, next, last, nv } = ws;
  let k = -1;
  let mindeg = ws.mindeg;
  for (; mindeg < ws.N && (k = head[mindeg]) === -1; mindeg++);
  ws.mindeg = mindeg;
  if (next[k] !== -1) last[next[k]] = -1;
  head[mindeg] = next[k];
  ws.inList[k] = 0;
  if (ws.constrained) ws.remaining[ws.cset[k]] -= nv[k];
  ws.elenk = ws.elen[k];
  ws.nvk = nv[k];
  ws.nel += nv[k];
  return k;
}

/** Compacts the live lists of Ci to its front (cs_amd's garbage collection). */
function collectGarbage(ws: AmdWork): void {
  const { Ci, Cp, len, n } = ws;
  for (let j = 0; j < n; j++) {
    const p = Cp[j];
    if (p >= 0) {
      Cp[j] = Ci[p];
      Ci[p] = flip(j);
    }
  }
  let q = 0;
  for (let p = 0; p < ws.cnz; ) {
    const j = flip(Ci[p++]);
    if (j >= 0) {
      Ci[q] = Cp[j];
      Cp[j] = q++;
      for (let k3 = 0; k3 < len[j] - 1; k3++) Ci[q++] = Ci[p++];
    }
  }
  ws.cnz = q;
}

/** Builds the new element Lk from the pivot's elements and variables; absorbs those elements. */
function constructElement(ws: AmdWork, k: number): void {
  const { Ci, Cp, len, nv, next, last, head, degree, w, inList } = ws;
  const elenk = ws.elenk;
  let dk = 0;
  nv[k] = -ws.nvk;
  let p = Cp[k];
  const pk1 = elenk === 0 ? p : ws.cnz;
  let pk2 = pk1;
  for (let k1 = 1; k1 <= elenk + 1; k1++) {
    let e: number;
    let pj: number;
    let ln: number;
    if (k1 > elenk) {
      e = k;
      pj = p;
      ln = len[k] - elenk;
    } else {
      e = Ci[p++];
      pj = Cp[e];
      ln = len[e];
    }
    for (let k2 = 1; k2 <= ln; k2++) {
      const i = Ci[pj++];
      const nvi = nv[i];
      if (nvi <= 0) continue;
      dk += nvi;
      nv[i] = -nvi;
      Ci[pk2++] = i;
      if (!inList[i]) continue;
      inList[i] = 0;
      if (next[i] !== -1) last[next[i]] = last[i];
      if (last[i] !== -1) next[last[i]] = next[i];
      else head[degree[i]] = next[i];
    }
    if (e !== k) {
      Cp[e] = flip(k); // element absorption
      w[e] = 0;
    }
  }
  if (elenk !== 0) ws.cnz = pk2;
  degree[k] = dk;
  Cp[k] = pk1;
  len[k] = pk2 - pk1;
  ws.elen[k] = -2;
  ws.dk = dk;
  ws.pk1 = pk1;
  ws.pk2 = pk2;
}

/** w[e] − mark = |Le \ Lk| for every element e adjacent to a variable of Lk. */
function setDifferences(ws: AmdWork): void {
  const { Ci, Cp, nv, elen, degree, w } = ws;
  const mark = (ws.mark = wclear(ws.mark, ws.lemax, w, ws.n));
  for (let pk = ws.pk1; pk < ws.pk2; pk++) {
    const i = Ci[pk];
    const eln = elen[i];
    if (eln <= 0) continue;
    const nvi = -nv[i];
    const wnvi = mark - nvi;
    for (let q = Cp[i]; q <= Cp[i] + eln - 1; q++) {
      const e = Ci[q];
      if (w[e] >= mark) w[e] -= nvi;
      else if (w[e] !== 0) w[e] = degree[e] + wnvi;
    }
  }
}

/** Approximate degrees of the variables of Lk, aggressive absorption, mass elimination. */
function updateDegrees(ws: AmdWork, k: number): void {
  const { Ci, Cp, len, nv, next, last, elen, degree, w, hhead, n, cset, constrained } = ws;
  const mark = ws.mark;
  for (let pk = ws.pk1; pk < ws.pk2; pk++) {
    const i = Ci[pk];
    const p1 = Cp[i];
    const p2 = p1 + elen[i] - 1;
    let pn = p1;
    let h = 0;
    let d = 0;
    for (let q = p1; q <= p2; q++) {
      const e = Ci[q];
      if (w[e] !== 0) {
        const dext = w[e] - mark;
        if (dext > 0) {
          d += dext;
          Ci[pn++] = e;
          h += e;
        } else {
          Cp[e] = flip(k); // aggressive absorption
          w[e] = 0;
        }
      }
    }
    elen[i] = pn - p1 + 1;
    const p3 = pn;
    const p4 = p1 + len[i];
    for (let q = p2 + 1; q < p4; q++) {
      const j = Ci[q];
      const nvj = nv[j];
      if (nvj <= 0) continue;
      d += nvj;
      Ci[pn++] = j;
      h += j;
    }
    if (d === 0 && (!constrained || cset[i] === cset[k])) {
      // mass elimination: i is adjacent to Lk only
      Cp[i] = flip(k);
      const nvi = -nv[i];
      if (constrained) ws.remaining[cset[i]] -= nvi;
      ws.dk -= nvi;
      ws.nvk += nvi;
      ws.nel += nvi;
      nv[i] = 0;
      elen[i] = -1;
    } else {
      degree[i] = Math.min(degree[i], d);
      Ci[pn] = Ci[p3];
      Ci[p3] = Ci[p1];
      Ci[p1] = k;
      len[i] = pn - p1 + 1;
      h %= n;
      next[i] = hhead[h];
      hhead[h] = i;
      last[i] = h;
    }
  }
}

/** Merges variables of Lk with identical element and variable lists (hash buckets). */
function detectSupervariables(ws: AmdWork): void {
  const { Ci, Cp, len, nv, next, last, elen, w, hhead, cset, constrained } = ws;
  for (let pk = ws.pk1; pk < ws.pk2; pk++) {
    let i = Ci[pk];
    if (nv[i] >= 0) continue;
    const h = last[i];
    i = hhead[h];
    hhead[h] = -1;
    for (; i !== -1 && next[i] !== -1; i = next[i], ws.mark++) {
      const mark = ws.mark;
      const ln = len[i];
      const eln = elen[i];
      for (let q = Cp[i] + 1; q <= Cp[i] + ln - 1; q++) w[Ci[q]] = mark;
      let jlast = i;
      for (let j = next[i]; j !== -1; ) {
        let ok = len[j] === ln && elen[j] === eln && (!constrained || cset[j] === cset[i]);
        for (let q = Cp[j] + 1; ok && q <= Cp[j] + ln - 1; q++) if (w[Ci[q]] !== mark) ok = false;
        if (ok) {
          Cp[j] = flip(i); // j is absorbed into supervariable i
          nv[i] += nv[j];
          nv[j] = 0;
          elen[j] = -1;
          j = next[j];
          next[jlast] = j;
        } else {
          jlast = j;
          j = next[j];
        }
      }
    }
  }
}

/** Final degrees of the variables of Lk, back into the degree lists; Lk keeps its variables. */
function finaliseElement(ws: AmdWork, k: number): void {
  const { Ci, Cp, len, nv, next, last, head, degree, w, inList, cset, constrained } = ws;
  const dk = ws.dk;
  const pk1 = ws.pk1;
  let p = pk1;
  for (let pk = pk1; pk < ws.pk2; pk++) {
    const i = Ci[pk];
    const nvi = 0 - nv[i]; // not −nv[i]: an absorbed variable (nv 0) would give −0
    if (nvi <= 0) continue;
    nv[i] = nvi;
    let d = degree[i] + dk - nvi;
    d = Math.max(0, Math.min(d, ws.N - ws.nel - nvi));
    degree[i] = d;
    Ci[p++] = i;
    if (constrained && cset[i] !== ws.curSet) continue; // waits for its set
    if (head[d] !== -1) last[head[d]] = i;
    next[i] = head[d];
    last[i] = -1;
    head[d] = i;
    inList[i] = 1;
    if (d < ws.mindeg) ws.mindeg = d;
  }
  nv[k] = ws.nvk;
  len[k] = p - pk1;
  if (len[k] === 0) {
    Cp[k] = -1;
    w[k] = 0;
  }
  if (ws.elenk !== 0) ws.cnz = p;
}

/** Postorder of the assembly tree (Davis 2006, §7.1 and cs_tdfs); returns the ordering. */
function postorder(ws: AmdWork): Int32Array {
  const { n, Cp, nv, next } = ws;
  const thead = ws.hhead; // reused: child lists of the assembly tree, length n + 1
  thead.fill(-1);
  // Cp[j] becomes the parent of j (−1 at a root); absorbed variables are listed under their
  // parent, then the elements on top of them.
  for (let j = n - 1; j >= 0; j--) {
    const p = flip(Cp[j]);
    Cp[j] = p;
    if (nv[j] > 0) continue;
    next[j] = thead[p];
    thead[p] = j;
  }
  for (let e = n; e >= 0; e--) {
    if (nv[e] <= 0) continue;
    if (Cp[e] !== -1) {
      next[e] = thead[Cp[e]];
      thead[Cp[e]] = e;
    }
  }
  const post = ws.last; // free by now
  treeDepthFirst(n, Cp, thead, next, ws.w, post);
  // The placeholder n is a root visited last, so it sits at post[n].
  return post.slice(0, n);
}

/** post = the nodes 0..n in depth-first postorder from each root (parent[i] = −1) in turn (cs_tdfs). */
function treeDepthFirst(n: number, parent: Int32Array, head: Int32Array, next: Int32Array, stack: Int32Array, post: Int32Array): void {
  let kk = 0;
  for (let i = 0; i <= n; i++) {
    if (parent[i] !== -1) continue;
    let top = 0;
    stack[0] = i;
    while (top >= 0) {
      const q = stack[top];
      const c = head[q];
      if (c === -1) {
        top--;
        post[kk++] = q;
      } else {
        head[q] = next[c];
        stack[++top] = c;
      }
    }
  }
}

/** Resets the marker array w when mark would overflow (cs_wclear). */
function wclear(mark: number, lemax: number, w: Int32Array, n: number): number {
  if (mark < 2 || mark + lemax > 0x3fffffff) {
    for (let k = 0; k < n; k++) if (w[k] !== 0) w[k] = 1;
    mark = 2;
  }
  return mark;
}
