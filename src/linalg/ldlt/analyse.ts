import { ArgumentError } from '../../errors';
import { nodeBlocks, orderWith, type NodeBlocks } from '../ordering';
import { checkPattern, type SymmetricCsc } from '../sparse/symmetric';
import type { AnalyseOptions, OrderingName, SymbolicFactor } from './types';

/** Defaults of {@link AnalyseOptions}. */
export const ANALYSE_DEFAULTS = { ordering: 'auto' } as const;

/**
 * Orderings that `ordering: 'auto'` compares by their measured fill (flops of the factor), in
 * the order tried: minimum degree first, as it is the cheapest good one and often the winner.
 */
export const AUTO_CANDIDATES = ['amd', 'nd', 'rcm', 'natural'] as const;

/**
 * `auto` stops trying candidates once the best factorization so far costs fewer flops than
 * AUTO_ENOUGH_FLOPS_PER_ENTRY per stored entry of the pattern, on patterns of at least
 * AUTO_ENOUGH_MIN_N columns: another ordering would take longer to compute than any
 * factorization it could save. Measured (Node 20, one core): amd orders a pattern at
 * ≈ 0.4 µs per stored entry and nd at ≈ 1 µs, while the factorization runs at ≈ 3 GFLOP/s, i.e.
 * ≈ 1,200 flops per µs; on an 84,000-DOF truss footbridge (amd: 1e7 flops, 0.07 s to factor)
 * the other three orderings took 1.0–1.8 s. Deterministic: it depends on counts, not on time.
 */
export const AUTO_ENOUGH_FLOPS_PER_ENTRY = 1000;
/**
 * See {@link AUTO_ENOUGH_FLOPS_PER_ENTRY}; patterns of fewer columns always try every candidate
 * (the four orderings together then cost a few milliseconds). Measured (Node 20, one core) on a
 * 1,500-DOF plane frame: amd alone 4 ms warm, all four candidates 20–50 ms warm and ≈ 100 ms in
 * a fresh process, for a factor of 7e5 flops, far below the threshold.
 */
export const AUTO_ENOUGH_MIN_N = 1000;

/**
 * Relaxed supernode amalgamation (Ashcraft & Grimes 1989, "The influence of relaxed supernode
 * partitions on the multifrontal method"): a child supernode is merged into its parent when the
 * merged supernode has at most `maxColumns` columns and at most a fraction `maxZeros` of its
 * lower trapezoid is explicit zeros.
 */
export interface RelaxThresholds {
  /** Widest merged supernode, columns, ≥ 1. */
  readonly maxColumns: number;
  /** Largest fraction of explicit zeros in a merged supernode, in [0, 1]. */
  readonly maxZeros: number;
}

/**
 * Merge up to 6 columns with at most half of the block zeros. Measured (Node 20, one core,
 * AMD ordering, in-process interleaved runs, best of 18) on the 83,784-DOF truss footbridge
 * against CHOLMOD's default thresholds (4 columns always, 16 columns below 80 % zeros, 48 below
 * 10 %, any size below 5 %; from memory): one-vector solves 10–22 % faster over three runs, the
 * factorization as fast (22–24 ms against 23–25 ms; 43 ms with no amalgamation), 1.14e6 stored
 * entries of L against 1.53e6. The solves stream every stored entry, zeros included, so a small
 * cap pays: a cap of 4 columns solved as fast as 6, a cap of 8 about 10 % slower. On the 4,704-
 * and 11,664-DOF building frames (6 DOF per node) nothing got slower (factorization within 3 %,
 * solves 2–8 % faster), with 12–17 % fewer stored entries.
 */
export const RELAX_DEFAULTS: RelaxThresholds = { maxColumns: 6, maxZeros: 0.5 };

/** {@link AnalyseOptions} plus the amalgamation of the supernodal factor. */
export interface SupernodalAnalyseOptions extends AnalyseOptions {
  /**
   * Relaxed amalgamation thresholds, or false for fundamental supernodes only (Liu, Ng &
   * Peyton 1993). @defaultValue {@link RELAX_DEFAULTS}
   */
  relax?: RelaxThresholds | false;
}

/**
 * Internal result of the symbolic phase of the supernodal LDLᵀ. Supernode s owns the
 * consecutive columns superStart[s] .. superStart[s+1]−1 of L (permuted numbering) and the
 * rows rows[rowPtr[s] .. rowPtr[s+1]) (its own columns first, then the rows below, ascending).
 * Its numeric block is dense row-major, nrows × ncols, at lx[lxPtr[s] ..).
 */
export interface SupernodalSymbolic extends SymbolicFactor {
  readonly kind: 'supernodal';
  /** pinv[i] = position at which original index i is eliminated (inverse of perm). */
  readonly pinv: Int32Array;
  /** First column of each supernode, length supernodes + 1 (last = n). */
  readonly superStart: Int32Array;
  /** Supernode of each (permuted) column, length n. */
  readonly superOf: Int32Array;
  /** Row-structure pointers, length supernodes + 1. */
  readonly rowPtr: Int32Array;
  /** Row structures (permuted indices), concatenated. */
  readonly rows: Int32Array;
  /** Offsets of the dense blocks in the factor's value array, length supernodes + 1. */
  readonly lxPtr: Float64Array;
  /** lxPos[p] = where the p-th value of the input pattern goes in the factor's value array. */
  readonly lxPos: Int32Array;
  /** diagPos[j] = position of A_jj (original numbering) in the input values, −1 if not stored. */
  readonly diagPos: Int32Array;
  /** Largest supernode width, height, and block size (entries), for workspaces. */
  readonly maxCols: number;
  readonly maxRows: number;
  readonly maxBlock: number;
}

function checkPermutation(perm: Int32Array, n: number): void {
  if (perm.length !== n) throw new ArgumentError(`permutation has length ${perm.length}, expected ${n}; pass one entry per row`, 'options.ordering');
  const seen = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const i = perm[k];
    if (!(i >= 0 && i < n) || seen[i]) {
      throw new ArgumentError(`entry ${k} (${i}) is ${i >= 0 && i < n ? 'repeated' : `outside 0..${n - 1}`}; pass a permutation of 0..${n - 1}`, `options.ordering[${k}]`);
    }
    seen[i] = 1;
  }
}

/**
 * The permuted matrix C = P A Pᵀ in two forms: upper triangle by columns (uPtr/uIdx, rows ≤
 * column, unsorted) and lower triangle by columns (lPtr/lIdx, rows ≥ column, ascending), with
 * lOrig[q] = position in the input of the q-th lower entry. Two counting passes, as in a
 * transpose (Davis 2006 §2.5).
 */
function permuteLower(pattern: SymmetricCsc, pinv: Int32Array) {
  const { n, colPtr, rowIdx } = pattern;
  const nz = colPtr[n];
  const uPtr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      uPtr[(pi > pj ? pi : pj) + 1]++;
    }
  }
  for (let k = 0; k < n; k++) uPtr[k + 1] += uPtr[k];
  const uIdx = new Int32Array(nz);
  const uOrig = new Int32Array(nz);
  const next = uPtr.slice(0, n);
  const lPtr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      const hi = pi > pj ? pi : pj;
      const lo = pi > pj ? pj : pi;
      const q = next[hi]++;
      uIdx[q] = lo;
      uOrig[q] = p;
      lPtr[lo + 1]++;
    }
  }
  for (let k = 0; k < n; k++) lPtr[k + 1] += lPtr[k];
  const lIdx = new Int32Array(nz);
  const lOrig = new Int32Array(nz);
  next.set(lPtr.subarray(0, n));
  for (let k = 0; k < n; k++) {
    for (let q = uPtr[k]; q < uPtr[k + 1]; q++) {
      const w = next[uIdx[q]]++;
      lIdx[w] = k;
      lOrig[w] = uOrig[q];
    }
  }
  return { uPtr, uIdx, lPtr, lIdx, lOrig };
}

/**
 * The lower triangle of C = P A Pᵀ by columns (lPtr/lIdx, rows ≥ column, in no particular
 * order), with lOrig[q] = position in the input of the q-th entry: one counting pass and one
 * scatter, for uses that need neither the upper form nor sorted rows (row structures and value
 * positions of the supernodes).
 */
function permuteLowerUnsorted(pattern: SymmetricCsc, pinv: Int32Array) {
  const { n, colPtr, rowIdx } = pattern;
  const nz = colPtr[n];
  const lPtr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      lPtr[(pi < pj ? pi : pj) + 1]++;
    }
  }
  for (let k = 0; k < n; k++) lPtr[k + 1] += lPtr[k];
  const lIdx = new Int32Array(nz);
  const lOrig = new Int32Array(nz);
  const next = lPtr.slice(0, n);
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      const w = pi < pj ? next[pi]++ : next[pj]++;
      lIdx[w] = pi < pj ? pj : pi;
      lOrig[w] = p;
    }
  }
  return { lPtr, lIdx, lOrig };
}

/** Elimination tree from the upper triangle by columns (Liu's algorithm; Davis 2006 §4.1 cs_etree). */
function etree(n: number, uPtr: Int32Array, uIdx: Int32Array): Int32Array {
  const parent = new Int32Array(n);
  const ancestor = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    parent[k] = -1;
    ancestor[k] = -1;
    for (let p = uPtr[k]; p < uPtr[k + 1]; p++) {
      let i = uIdx[p];
      while (i !== -1 && i < k) {
        const inext = ancestor[i];
        ancestor[i] = k;
        if (inext === -1) parent[i] = k;
        i = inext;
      }
    }
  }
  return parent;
}

/** Postorder of a forest (Davis 2006 §4.3 cs_post): post[k] = k-th node in postorder. */
function postorder(parent: Int32Array): Int32Array {
  const n = parent.length;
  const head = new Int32Array(n).fill(-1);
  const next = new Int32Array(n);
  const stack = new Int32Array(n);
  const post = new Int32Array(n);
  for (let j = n - 1; j >= 0; j--) {
    const p = parent[j];
    if (p === -1) continue;
    next[j] = head[p];
    head[p] = j;
  }
  let k = 0;
  for (let r = 0; r < n; r++) {
    if (parent[r] !== -1) continue;
    let top = 0;
    stack[0] = r;
    while (top >= 0) {
      const p = stack[top];
      const i = head[p];
      if (i === -1) {
        top--;
        post[k++] = p;
      } else {
        head[p] = next[i];
        stack[++top] = i;
      }
    }
  }
  return post;
}

/**
 * Column counts of L (diagonal included) from the lower triangle by columns, the etree and a
 * postorder, in O(nnz(A)·α) time: Gilbert, Ng & Peyton (1994), "An efficient algorithm to
 * compute row and column counts for sparse Cholesky factorization", as in Davis 2006 §4.5
 * cs_counts (skeleton-matrix leaves, least common ancestors by path compression).
 */
function columnCounts(n: number, lPtr: Int32Array, lIdx: Int32Array, parent: Int32Array, post: Int32Array): Int32Array {
  const delta = new Int32Array(n);
  const first = new Int32Array(n).fill(-1);
  const maxfirst = new Int32Array(n).fill(-1);
  const prevleaf = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    let j = post[k];
    delta[j] = first[j] === -1 ? 1 : 0; // j is a leaf of the etree
    for (; j !== -1 && first[j] === -1; j = parent[j]) first[j] = k;
  }
  for (let i = 0; i < n; i++) ancestor[i] = i;
  for (let k = 0; k < n; k++) {
    const j = post[k];
    if (parent[j] !== -1) delta[parent[j]]--; // j is not a root
    for (let p = lPtr[j]; p < lPtr[j + 1]; p++) {
      const i = lIdx[p];
      // cs_leaf: is j a leaf of the i-th row subtree?
      if (i <= j || first[j] <= maxfirst[i]) continue;
      maxfirst[i] = first[j];
      const jprev = prevleaf[i];
      prevleaf[i] = j;
      delta[j]++; // A(i,j) is in the skeleton matrix
      if (jprev !== -1) {
        // subsequent leaf: q = lca(jprev, j), with path compression
        let q = jprev;
        while (q !== ancestor[q]) q = ancestor[q];
        for (let s = jprev; s !== q; ) {
          const sp = ancestor[s];
          ancestor[s] = q;
          s = sp;
        }
        delta[q]--;
      }
    }
    if (parent[j] !== -1) ancestor[j] = parent[j];
  }
  for (let j = 0; j < n; j++) if (parent[j] !== -1) delta[parent[j]] += delta[j];
  return delta;
}

/**
 * Elimination tree, a postorder of it and the column counts of L for one ordering, with the fill
 * they give (Davis 2006, §4.1–4.5). `analyse` renumbers by the postorder afterwards: the
 * postordered matrix has the same L up to that renumbering, so tree and counts carry over.
 */
interface Elimination {
  readonly perm: Int32Array;
  readonly parent: Int32Array;
  readonly post: Int32Array;
  readonly cc: Int32Array;
  readonly nnzL: number;
  readonly flops: number;
}

/** Fill of one ordering: nnz(L) strictly below the diagonal and the factorization flops, with the tree and counts. */
function eliminationOf(pattern: SymmetricCsc, perm: Int32Array): Elimination {
  const n = pattern.n;
  const pinv = new Int32Array(n);
  for (let k = 0; k < n; k++) pinv[perm[k]] = k;
  const c = permuteLower(pattern, pinv);
  const parent = etree(n, c.uPtr, c.uIdx);
  const post = postorder(parent);
  const cc = columnCounts(n, c.lPtr, c.lIdx, parent, post);
  return { perm, parent, post, cc, ...countsToFill(cc) };
}

/** nnz(L) below the diagonal and flops Σ c(c + 2), c = off-diagonal count (c divisions, c(c+1)/2 multiply-adds ×2). */
function countsToFill(cc: Int32Array): { nnzL: number; flops: number } {
  let nnzL = 0;
  let flops = 0;
  for (let j = 0; j < cc.length; j++) {
    const c = cc[j] - 1;
    nnzL += c;
    flops += c * (c + 2);
  }
  return { nnzL, flops };
}

/** Fill and cost of one candidate ordering, as measured by `analyse` with `ordering: 'auto'`. */
export interface OrderingCandidate {
  readonly ordering: string;
  readonly nnzL: number;
  readonly flops: number;
}

/**
 * Symbolic phase of the sparse supernodal LDLᵀ: fill-reducing ordering, elimination tree,
 * postorder, column counts, fundamental supernodes with relaxed amalgamation, supernode row
 * structures, and the size of every buffer the numeric phase needs (Davis, "Direct Methods for
 * Sparse Linear Systems", SIAM 2006, ch. 4; Ng & Peyton 1993). Depends only on the pattern, so it
 * is done once for every shift σ of K − σM.
 * @param pattern - symmetric n × n matrix, lower triangle in CSC (values ignored)
 * @param options - {@link AnalyseOptions}; `ordering` defaults to 'auto': each of
 *   {@link AUTO_CANDIDATES} is computed (until one is cheap enough, {@link AUTO_ENOUGH_FLOPS_PER_ENTRY})
 *   and the one with the fewest factorization flops is kept
 * @throws ArgumentError when the pattern is malformed or the ordering is unknown / not a permutation
 */
export function analyse(pattern: SymmetricCsc, options: SupernodalAnalyseOptions = {}): SymbolicFactor {
  // An option given as undefined takes its default.
  const ordering: OrderingName | Int32Array = options.ordering ?? ANALYSE_DEFAULTS.ordering;
  const relax = options.relax ?? RELAX_DEFAULTS;
  if (relax !== false) {
    if (!(Number.isInteger(relax?.maxColumns) && relax.maxColumns >= 1)) {
      throw new ArgumentError(`maxColumns is ${relax?.maxColumns}; pass an integer ≥ 1 (default ${RELAX_DEFAULTS.maxColumns}), or relax: false`, 'options.relax.maxColumns');
    }
    if (!(relax.maxZeros >= 0 && relax.maxZeros <= 1)) {
      throw new ArgumentError(`maxZeros is ${relax.maxZeros}; pass a fraction in [0, 1] (default ${RELAX_DEFAULTS.maxZeros})`, 'options.relax.maxZeros');
    }
  }
  const maxColumns = relax === false ? 1 : relax.maxColumns;
  const maxZeros = relax === false ? 0 : relax.maxZeros;
  checkPattern(pattern);
  const n = pattern.n;

  // --- Ordering ------------------------------------------------------------------------
  let chosen: Elimination;
  let name: string;
  let candidates: OrderingCandidate[] | undefined;
  if (ordering instanceof Int32Array) {
    checkPermutation(ordering, n);
    chosen = eliminationOf(pattern, ordering.slice());
    name = 'given';
  } else if (ordering === 'auto') {
    // Choose by measured fill, not by habit: etree + column counts of each candidate. The node
    // grouping that amd and nd share is computed once.
    candidates = [];
    let best: Elimination | undefined;
    name = 'natural';
    let blocks: NodeBlocks | undefined;
    const enough = n >= AUTO_ENOUGH_MIN_N ? AUTO_ENOUGH_FLOPS_PER_ENTRY * pattern.colPtr[n] : -1;
    for (const cand of AUTO_CANDIDATES) {
      if (best && best.flops < enough) break;
      if ((cand === 'amd' || cand === 'nd') && !blocks) blocks = nodeBlocks(pattern);
      const e = eliminationOf(pattern, orderWith(pattern, cand, blocks));
      candidates.push({ ordering: cand, nnzL: e.nnzL, flops: e.flops });
      if (!best || e.flops < best.flops) {
        best = e;
        name = cand;
      }
    }
    chosen = best!;
  } else if (ordering === 'amd' || ordering === 'nd' || ordering === 'rcm' || ordering === 'natural') {
    chosen = eliminationOf(pattern, orderWith(pattern, ordering));
    name = ordering;
  } else {
    throw new ArgumentError(`unknown ordering "${String(ordering)}"; use 'auto', 'amd', 'nd', 'rcm', 'natural' or an Int32Array permutation`, 'options.ordering');
  }

  // --- Renumber by the etree postorder so that every subtree is contiguous; the tree and the
  // column counts are relabelled, not recomputed (Davis 2006, §4.3). -----------------------
  const { post } = chosen;
  const ipost = new Int32Array(n);
  for (let k = 0; k < n; k++) ipost[post[k]] = k;
  const perm = new Int32Array(n);
  const parent = new Int32Array(n);
  const cc = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const j = post[k];
    perm[k] = chosen.perm[j];
    const pj = chosen.parent[j];
    parent[k] = pj === -1 ? -1 : ipost[pj];
    cc[k] = chosen.cc[j];
  }
  const pinv = ipost; // reuse
  for (let k = 0; k < n; k++) pinv[perm[k]] = k;
  const c = permuteLowerUnsorted(pattern, pinv);
  const { nnzL, flops } = chosen;

  // --- Fundamental supernodes (Liu, Ng & Peyton 1993): j joins j−1 when j is j−1's parent,
  // j−1 is its only child, and the column structures nest exactly. -------------------------
  const childCount = new Int32Array(n);
  for (let j = 0; j < n; j++) if (parent[j] !== -1) childCount[parent[j]]++;
  const fStartList: number[] = [];
  for (let j = 0; j < n; j++) {
    if (j === 0 || !(parent[j - 1] === j && cc[j - 1] === cc[j] + 1 && childCount[j] === 1)) fStartList.push(j);
  }
  const nfs = fStartList.length;
  fStartList.push(n);

  // --- Relaxed amalgamation (Ashcraft & Grimes 1989; RELAX_DEFAULTS), top-down as CHOLMOD does: merge
  // supernode s into the group that starts at s+1 when s+1 holds the parent of s's last column.
  // Zeros of a merged block [a, b] (a trapezoid whose rows below b are those of column b):
  // m(m+1)/2 + m(cc[b]−1) − Σ cc[a..b], with m = b − a + 1. ------------------------------------
  const prefix = new Float64Array(n + 1);
  for (let j = 0; j < n; j++) prefix[j + 1] = prefix[j] + cc[j];
  const groupEnd = new Int32Array(nfs);
  const mergedUp = new Uint8Array(nfs);
  if (nfs > 0) groupEnd[nfs - 1] = n - 1;
  for (let s = nfs - 2; s >= 0; s--) {
    const last = fStartList[s + 1] - 1;
    groupEnd[s] = last;
    if (parent[last] !== last + 1) continue;
    const a = fStartList[s];
    const b = groupEnd[s + 1];
    const m = b - a + 1;
    const total = (m * (m + 1)) / 2 + m * (cc[b] - 1);
    const z = (total - (prefix[b + 1] - prefix[a])) / total;
    if (m <= maxColumns && z <= maxZeros) {
      mergedUp[s] = 1;
      groupEnd[s] = b;
    }
  }
  const startList: number[] = [];
  for (let s = 0; s < nfs; s++) if (s === 0 || !mergedUp[s - 1]) startList.push(fStartList[s]);
  const ns = startList.length;
  startList.push(n);
  const superStart = Int32Array.from(startList);
  const superOf = new Int32Array(n);
  const rowPtr = new Int32Array(ns + 1);
  const lxPtr = new Float64Array(ns + 1);
  let maxCols = 0;
  let maxRows = 0;
  let maxBlock = 0;
  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const l = superStart[s + 1] - 1;
    for (let j = f; j <= l; j++) superOf[j] = s;
    const nc = l - f + 1;
    const nr = nc + cc[l] - 1;
    rowPtr[s + 1] = rowPtr[s] + nr;
    lxPtr[s + 1] = lxPtr[s] + nr * nc;
    if (nc > maxCols) maxCols = nc;
    if (nr > maxRows) maxRows = nr;
    if (nr * nc > maxBlock) maxBlock = nr * nc;
  }
  if (lxPtr[ns] > 0x7fffffff) {
    throw new ArgumentError(`the factor would hold ${lxPtr[ns]} entries, more than 2³¹ − 1; use a fill-reducing ordering ('nd' or 'amd') or a smaller model`, 'pattern');
  }

  // --- Row structure of each supernode: its own columns, then the union of the entries of C
  // below its last column l and of its children's rows below l (Davis 2006 §4.4), sorted. ----
  const rows = new Int32Array(rowPtr[ns]);
  const mark = new Int32Array(n).fill(-1);
  const childHead = new Int32Array(ns).fill(-1);
  const childNext = new Int32Array(ns).fill(-1);
  for (let s = ns - 1; s >= 0; s--) {
    const l = superStart[s + 1] - 1;
    const ps = parent[l] === -1 ? -1 : superOf[parent[l]];
    if (ps !== -1) {
      childNext[s] = childHead[ps];
      childHead[ps] = s;
    }
  }
  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const l = superStart[s + 1] - 1;
    let w = rowPtr[s];
    for (let j = f; j <= l; j++) rows[w++] = j;
    const below = w;
    for (let j = f; j <= l; j++) {
      for (let p = c.lPtr[j]; p < c.lPtr[j + 1]; p++) {
        const i = c.lIdx[p];
        if (i > l && mark[i] !== s) {
          mark[i] = s;
          rows[w++] = i;
        }
      }
    }
    for (let ch = childHead[s]; ch !== -1; ch = childNext[ch]) {
      const ncc = superStart[ch + 1] - superStart[ch];
      for (let p = rowPtr[ch] + ncc; p < rowPtr[ch + 1]; p++) {
        const i = rows[p];
        if (i > l && mark[i] !== s) {
          mark[i] = s;
          rows[w++] = i;
        }
      }
    }
    if (w !== rowPtr[s + 1]) throw new Error(`ldlt analyse: supernode ${s} has ${w - rowPtr[s]} rows, column counts say ${rowPtr[s + 1] - rowPtr[s]}`);
    // Sort the rows below: insertion sort for the short lists of most supernodes (no view
    // object per supernode), the typed-array sort for long ones.
    if (w - below > 32) rows.subarray(below, w).sort();
    else {
      for (let p = below + 1; p < w; p++) {
        const v = rows[p];
        let q = p - 1;
        while (q >= below && rows[q] > v) {
          rows[q + 1] = rows[q];
          q--;
        }
        rows[q + 1] = v;
      }
    }
  }

  // --- Where each input value lands in the factor's blocks -------------------------------
  const nz = pattern.colPtr[n];
  const lxPos = new Int32Array(nz);
  const rel = mark; // reuse: rel[i] = local row of global row i in the current supernode
  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    for (let p = rowPtr[s]; p < rowPtr[s + 1]; p++) rel[rows[p]] = p - rowPtr[s];
    const base = lxPtr[s];
    for (let j = f; j < f + nc; j++) {
      for (let p = c.lPtr[j]; p < c.lPtr[j + 1]; p++) lxPos[c.lOrig[p]] = base + rel[c.lIdx[p]] * nc + (j - f);
    }
  }
  const diagPos = new Int32Array(n).fill(-1);
  for (let j = 0; j < n; j++) {
    const p = pattern.colPtr[j];
    if (p < pattern.colPtr[j + 1] && pattern.rowIdx[p] === j) diagPos[j] = p;
  }

  const sym: SupernodalSymbolic = {
    n,
    perm,
    ordering: name,
    nnzL,
    flops,
    supernodes: ns,
    patternNnz: nz,
    kind: 'supernodal',
    pinv,
    superStart,
    superOf,
    rowPtr,
    rows,
    lxPtr,
    lxPos,
    diagPos,
    maxCols,
    maxRows,
    maxBlock,
    ...(candidates ? { candidates } : {}),
  };
  return sym;
}
