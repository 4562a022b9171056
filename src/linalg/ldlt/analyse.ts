import { ArgumentError } from '../../errors';
import { Scratch, amdScratchLength, enoughFlops, float64Entries, nodeBlocks, orderWith, type BlockElimination, type NodeBlocks } from '../ordering';
import { checkPattern, type SymmetricCsc } from '../sparse/symmetric';
import type { AnalyseOptions, OrderingName, SymbolicFactor } from './types';

/** Defaults of {@link AnalyseOptions}. */
export const ANALYSE_DEFAULTS = { ordering: 'auto' } as const;

/**
 * Orderings that `ordering: 'auto'` compares by their measured fill (flops of the factor), in
 * the order tried: minimum degree first, as it is the cheapest good one and often the winner.
 */
export const AUTO_CANDIDATES = ['amd', 'nd', 'rcm', 'natural'] as const;

// `auto` stops trying candidates once the best factorization so far costs fewer flops than
// AUTO_ENOUGH_FLOPS_PER_ENTRY per stored entry of the pattern, on patterns of at least
// AUTO_ENOUGH_MIN_N columns (the rule and its measurements are in ordering/enough.ts).
export { AUTO_ENOUGH_FLOPS_PER_ENTRY, AUTO_ENOUGH_MIN_N } from '../ordering';

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
  /**
   * Offsets of the dense blocks in the factor's value array, length supernodes + 1 (32-bit:
   * analyse refuses a factor of 2³¹ entries or more, so the solves' index arithmetic stays in
   * integers).
   */
  readonly lxPtr: Int32Array;
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
 * The pattern of C = P A Pᵀ in two forms, for the elimination tree and the column counts: upper
 * triangle by columns (uPtr/uIdx, rows ≤ column) and lower triangle by columns (lPtr/lIdx, rows
 * ≥ column), rows in no particular order (neither use needs them sorted). One counting pass and
 * one scatter, as in a transpose (Davis 2006 §2.5).
 */
function permuteBoth(pattern: SymmetricCsc, pinv: Int32Array) {
  const { n, colPtr, rowIdx } = pattern;
  const nz = colPtr[n];
  const uPtr = new Int32Array(n + 1);
  const lPtr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      if (pi > pj) {
        uPtr[pi + 1]++;
        lPtr[pj + 1]++;
      } else {
        uPtr[pj + 1]++;
        lPtr[pi + 1]++;
      }
    }
  }
  for (let k = 0; k < n; k++) {
    uPtr[k + 1] += uPtr[k];
    lPtr[k + 1] += lPtr[k];
  }
  const uIdx = new Int32Array(nz);
  const lIdx = new Int32Array(nz);
  const uNext = uPtr.slice(0, n);
  const lNext = lPtr.slice(0, n);
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      if (pi > pj) {
        uIdx[uNext[pi]++] = pj;
        lIdx[lNext[pj]++] = pi;
      } else {
        uIdx[uNext[pj]++] = pi;
        lIdx[lNext[pi]++] = pj;
      }
    }
  }
  return { uPtr, uIdx, lPtr, lIdx };
}

/**
 * The lower triangle of C = P A Pᵀ by columns (lPtr/lIdx, rows ≥ column, in no particular
 * order), with lOrig[q] = position in the input of the q-th entry: one counting pass and one
 * scatter, for uses that need neither the upper form nor sorted rows (row structures and value
 * positions of the supernodes).
 */
function permuteLowerUnsorted(pattern: SymmetricCsc, pinv: Int32Array, scratch: Scratch) {
  const { n, colPtr } = pattern;
  const nz = colPtr[n];
  const lPtr = scratch.zeros(n + 1);
  countLower(pattern, pinv, lPtr);
  for (let k = 0; k < n; k++) lPtr[k + 1] += lPtr[k];
  const lIdx = scratch.take(nz);
  const lOrig = scratch.take(nz);
  const m = scratch.mark();
  const next = scratch.take(n);
  next.set(lPtr.subarray(0, n));
  scatterLower(pattern, pinv, next, lIdx, lOrig);
  scratch.release(m);
  return { lPtr, lIdx, lOrig };
}

/** lPtr[k + 1] = entries of column k of the lower triangle of P A Pᵀ; lPtr is 0 on entry. */
function countLower(pattern: SymmetricCsc, pinv: Int32Array, lPtr: Int32Array): void {
  const { n, colPtr, rowIdx } = pattern;
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      lPtr[(pi < pj ? pi : pj) + 1]++;
    }
  }
}

/** The entries counted by countLower, rows and input positions; next[k] = next free slot of column k. */
function scatterLower(pattern: SymmetricCsc, pinv: Int32Array, next: Int32Array, lIdx: Int32Array, lOrig: Int32Array): void {
  const { n, colPtr, rowIdx } = pattern;
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      const w = pi < pj ? next[pi]++ : next[pj]++;
      lIdx[w] = pi < pj ? pj : pi;
      lOrig[w] = p;
    }
  }
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
function postorder(parent: Int32Array, scratch: Scratch = new Scratch()): Int32Array {
  const n = parent.length;
  const post = scratch.take(n);
  const m = scratch.mark();
  const head = scratch.filled(n, -1);
  const next = scratch.take(n);
  const stack = scratch.take(n);
  childLists(parent, head, next);
  depthFirst(parent, head, next, stack, post);
  scratch.release(m);
  return post;
}

/** Children of each node, in increasing order: head[p] = first child, next[c] = following sibling. */
function childLists(parent: Int32Array, head: Int32Array, next: Int32Array): void {
  for (let j = parent.length - 1; j >= 0; j--) {
    const p = parent[j];
    if (p === -1) continue;
    next[j] = head[p];
    head[p] = j;
  }
}

/** post[k] = k-th node of the depth-first postorder from each root in turn (cs_tdfs). */
function depthFirst(parent: Int32Array, head: Int32Array, next: Int32Array, stack: Int32Array, post: Int32Array): void {
  const n = parent.length;
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
  const c = permuteBoth(pattern, pinv);
  const parent = etree(n, c.uPtr, c.uIdx);
  const post = postorder(parent);
  const cc = columnCounts(n, c.lPtr, c.lIdx, parent, post);
  return { perm, parent, post, cc, ...countsToFill(cc) };
}

/**
 * The elimination of a named ordering. Minimum degree on the exact compression comes with the
 * tree and counts of its blocks (NodeBlocks.elimination); they are expanded rather than computed
 * again over the full pattern.
 */
function eliminationNamed(pattern: SymmetricCsc, method: 'amd' | 'nd' | 'rcm' | 'natural', blocks: NodeBlocks | undefined, scratch: Scratch): Elimination {
  const perm = orderWith(pattern, method, blocks);
  if (method === 'amd' && blocks?.elimination) return expandElimination(blocks, blocks.elimination, perm, scratch);
  return eliminationOf(pattern, perm);
}

/**
 * Elimination of the expanded order of blocks of indistinguishable unknowns (blockElimination):
 * the unknowns of a block form a chain of the tree, the last one's parent is the first unknown of
 * the parent block, and column i of a block of weight w counts lastCount + w − 1 − i. When no
 * block merges unknowns the block tree and counts are those of the pattern, used as they are.
 */
function expandElimination(b: NodeBlocks, be: BlockElimination, perm: Int32Array, scratch: Scratch): Elimination {
  const n = perm.length;
  const corder = b.amdOrder;
  let parent = be.parent;
  let cc = be.lastCount;
  if (corder.length !== n) {
    parent = scratch.take(n);
    cc = scratch.take(n);
    const m = scratch.mark();
    expandBlocks(b.blocks.weight, corder, be, parent, cc, scratch.take(corder.length + 1));
    scratch.release(m);
  }
  return { perm, parent, post: postorder(parent, scratch), cc, nnzL: be.nnzL, flops: be.flops };
}

/**
 * Writes the tree and column counts of the unknowns of each block (see expandElimination).
 * @param first - workspace of length corder.length + 1
 */
function expandBlocks(weight: Int32Array, corder: Int32Array, be: BlockElimination, parent: Int32Array, cc: Int32Array, first: Int32Array): void {
  const nb = corder.length;
  first[0] = 0; // then first[k] = first position of block k in the expanded order
  for (let k = 0; k < nb; k++) first[k + 1] = first[k] + weight[corder[k]];
  const { parent: bparent, lastCount } = be;
  for (let k = 0; k < nb; k++) {
    const l = first[k + 1] - 1;
    const c = lastCount[k];
    for (let j = first[k]; j < l; j++) {
      parent[j] = j + 1;
      cc[j] = c + l - j;
    }
    const bp = bparent[k];
    parent[l] = bp === -1 ? -1 : first[bp];
    cc[l] = c;
  }
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

  // --- Ordering, then renumbering by its etree postorder so that every subtree is contiguous;
  // the tree and the column counts are relabelled, not recomputed (Davis 2006, §4.3). ---------
  // Temporaries are carved from one scratch buffer (see scratchLength); parent and cc of the
  // renumbered tree sit at its bottom until the end.
  const diagPos = diagonalPositions(pattern);
  const scratch = Scratch.ofLength(scratchLength(pattern, diagPos, ordering));
  const parent = scratch.take(n);
  const cc = scratch.take(n);
  const m = scratch.mark();
  const choice = chooseOrdering(pattern, ordering, scratch);
  const { name, candidates } = choice;
  const { nnzL, flops } = choice.chosen!;
  const { perm, pinv } = renumber(choice.chosen!, parent, cc, scratch);
  choice.chosen = undefined; // its arrays are garbage from here on
  scratch.release(m);

  // --- Supernodes: fundamental ones, then relaxed amalgamation, then their sizes. ----------
  const superStart = relaxedStarts(fundamentalStarts(parent, cc, scratch), parent, cc, maxColumns, maxZeros, scratch);
  scratch.release(m);
  const ns = superStart.length - 1;
  const superOf = new Int32Array(n);
  const rowPtr = new Int32Array(ns + 1);
  const lxPtr = new Int32Array(ns + 1);
  const max = supernodeSizes(superStart, cc, superOf, rowPtr, lxPtr);
  if (max.entries > 0x7fffffff) {
    throw new ArgumentError(`the factor would hold ${max.entries} entries, more than 2³¹ − 1; use a fill-reducing ordering ('nd' or 'amd') or a smaller model`, 'pattern');
  }

  // --- Row structures and where each input value lands in the factor's blocks. -------------
  const c = permuteLowerUnsorted(pattern, pinv, scratch);
  const mark = scratch.take(n); // workspace of both passes
  const rows = rowStructures(superStart, superOf, parent, rowPtr, c.lPtr, c.lIdx, mark, scratch);
  const lxPos = valuePositions(superStart, rowPtr, rows, lxPtr, c.lPtr, c.lIdx, c.lOrig, mark);

  const sym: SupernodalSymbolic = {
    n,
    perm,
    ordering: name,
    nnzL,
    flops,
    supernodes: ns,
    patternNnz: pattern.colPtr[n],
    kind: 'supernodal',
    pinv,
    superStart,
    superOf,
    rowPtr,
    rows,
    lxPtr,
    lxPos,
    diagPos,
    maxCols: max.cols,
    maxRows: max.rows,
    maxBlock: max.block,
    ...(candidates ? { candidates } : {}),
  };
  return sym;
}

/**
 * Int32 entries of analyse's scratch: the renumbered tree and counts (2n) under the largest of
 * (a) minimum degree and its node grouping (amdScratchLength with every off-diagonal entry, as
 * when no unknowns merge, which bounds every grouping), (b) the expanded elimination (6n), and
 * (c) the later phases: the permuted lower triangle with its input positions (2 nz + n + 1) and
 * a mark (n) beside the supernode child lists (≤ 2n), or the relaxation's prefix sums and flags
 * (float64Entries(n + 1) + n + 1 + 2n).
 */
function scratchLength(pattern: SymmetricCsc, diagPos: Int32Array, ordering: OrderingName | Int32Array): number {
  const n = pattern.n;
  const nz = pattern.colPtr[n];
  let diagonal = 0;
  for (let j = 0; j < n; j++) if (diagPos[j] !== -1) diagonal++;
  const minimumDegree = ordering === 'auto' || ordering === 'amd' ? amdScratchLength(n, 2 * (nz - diagonal), n) : 0;
  const later = Math.max(2 * nz + 4 * n + 1, float64Entries(n + 1) + 3 * n + 1);
  return 2 * n + Math.max(minimumDegree, 6 * n, later);
}

/** The ordering chosen by `analyse`, with its elimination (cleared once relabelled). */
interface OrderingChoice {
  chosen: Elimination | undefined;
  readonly name: string;
  readonly candidates: OrderingCandidate[] | undefined;
}

/**
 * The elimination of the requested ordering; with 'auto', of the candidate with the fewest flops
 * (AUTO_CANDIDATES, until one is good enough: enoughFlops).
 */
function chooseOrdering(pattern: SymmetricCsc, ordering: OrderingName | Int32Array, scratch: Scratch): OrderingChoice {
  const n = pattern.n;
  if (ordering instanceof Int32Array) {
    checkPermutation(ordering, n);
    return { chosen: eliminationOf(pattern, ordering.slice()), name: 'given', candidates: undefined };
  }
  if (ordering === 'auto') {
    // Choose by measured fill, not by habit: etree + column counts of each candidate. The node
    // grouping that amd and nd share is computed once.
    const candidates: OrderingCandidate[] = [];
    let best: Elimination | undefined;
    let name = 'natural';
    let blocks: NodeBlocks | undefined;
    const enough = enoughFlops(pattern);
    for (const cand of AUTO_CANDIDATES) {
      if (best && best.flops < enough) break;
      if ((cand === 'amd' || cand === 'nd') && !blocks) blocks = nodeBlocks(pattern, scratch);
      const e = eliminationNamed(pattern, cand, blocks, scratch);
      candidates.push({ ordering: cand, nnzL: e.nnzL, flops: e.flops });
      if (!best || e.flops < best.flops) {
        best = e;
        name = cand;
      }
    }
    return { chosen: best!, name, candidates };
  }
  if (ordering === 'amd' || ordering === 'nd' || ordering === 'rcm' || ordering === 'natural') {
    return { chosen: eliminationNamed(pattern, ordering, ordering === 'amd' ? nodeBlocks(pattern, scratch) : undefined, scratch), name: ordering, candidates: undefined };
  }
  throw new ArgumentError(`unknown ordering "${String(ordering)}"; use 'auto', 'amd', 'nd', 'rcm', 'natural' or an Int32Array permutation`, 'options.ordering');
}

/**
 * perm and its inverse for an elimination renumbered by its postorder; its tree and column
 * counts, relabelled, are written to parent and cc.
 */
function renumber(e: Elimination, parent: Int32Array, cc: Int32Array, scratch: Scratch): { perm: Int32Array; pinv: Int32Array } {
  const { post } = e;
  const n = post.length;
  const m = scratch.mark();
  const ipost = scratch.take(n);
  for (let k = 0; k < n; k++) ipost[post[k]] = k;
  const perm = new Int32Array(n);
  const pinv = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const j = post[k];
    const v = e.perm[j];
    perm[k] = v;
    pinv[v] = k;
    const pj = e.parent[j];
    parent[k] = pj === -1 ? -1 : ipost[pj];
    cc[k] = e.cc[j];
  }
  scratch.release(m);
  return { perm, pinv };
}

/**
 * Fundamental supernodes (Liu, Ng & Peyton 1993) of a postordered tree: j joins j−1 when j is
 * j−1's parent, j−1 is its only child, and the column structures nest exactly.
 * @returns the first column of each, then n
 */
function fundamentalStarts(parent: Int32Array, cc: Int32Array, scratch: Scratch): Int32Array {
  const n = parent.length;
  const childCount = scratch.zeros(n + 1);
  for (let j = 0; j < n; j++) if (parent[j] !== -1) childCount[parent[j]]++;
  // Written in place behind the reads: starts[m] is written after childCount[j] is read, j ≥ m.
  const starts = childCount;
  let m = 0;
  for (let j = 0; j < n; j++) {
    if (j === 0 || !(parent[j - 1] === j && cc[j - 1] === cc[j] + 1 && childCount[j] === 1)) starts[m++] = j;
  }
  starts[m] = n;
  return starts.subarray(0, m + 1);
}

/**
 * Relaxed amalgamation (Ashcraft & Grimes 1989; RELAX_DEFAULTS), top-down as CHOLMOD does:
 * supernode s merges into the group that starts at s+1 when s+1 holds the parent of s's last
 * column. Zeros of a merged block [a, b] (a trapezoid whose rows below b are those of column b):
 * m(m+1)/2 + m(cc[b]−1) − Σ cc[a..b], with m = b − a + 1.
 * @param fStart - first column of each fundamental supernode, then n
 * @returns first column of each supernode, then n
 */
function relaxedStarts(fStart: Int32Array, parent: Int32Array, cc: Int32Array, maxColumns: number, maxZeros: number, scratch: Scratch): Int32Array {
  const n = parent.length;
  const nfs = fStart.length - 1;
  const m0 = scratch.mark();
  const prefix = scratch.float64Zeros(n + 1);
  let sum = 0;
  for (let j = 0; j < n; j++) prefix[j + 1] = sum += cc[j];
  const groupEnd = scratch.take(nfs);
  const mergedUp = scratch.zeros(nfs);
  if (nfs > 0) groupEnd[nfs - 1] = n - 1;
  for (let s = nfs - 2; s >= 0; s--) {
    const last = fStart[s + 1] - 1;
    groupEnd[s] = last;
    if (parent[last] !== last + 1) continue;
    const a = fStart[s];
    const b = groupEnd[s + 1];
    const m = b - a + 1;
    if (m > maxColumns) continue;
    const total = (m * (m + 1)) / 2 + m * (cc[b] - 1);
    const z = (total - (prefix[b + 1] - prefix[a])) / total;
    if (z <= maxZeros) {
      mergedUp[s] = 1;
      groupEnd[s] = b;
    }
  }
  const starts = groupEnd; // free now
  let ns = 0;
  for (let s = 0; s < nfs; s++) if (s === 0 || !mergedUp[s - 1]) starts[ns++] = fStart[s];
  const superStart = new Int32Array(ns + 1);
  superStart.set(starts.subarray(0, ns));
  superStart[ns] = n;
  scratch.release(m0);
  return superStart;
}

/**
 * Fills superOf (supernode of each column), rowPtr (rows of each supernode: its columns plus
 * the off-diagonal count of its last one) and lxPtr (offsets of the dense blocks; meaningless
 * when the total reaches 2³¹, which the caller refuses).
 * @returns the widest, tallest and largest block, and the factor's total entries
 */
function supernodeSizes(superStart: Int32Array, cc: Int32Array, superOf: Int32Array, rowPtr: Int32Array, lxPtr: Int32Array): { cols: number; rows: number; block: number; entries: number } {
  const ns = superStart.length - 1;
  let entries = 0;
  let cols = 0;
  let rows = 0;
  let block = 0;
  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const l = superStart[s + 1] - 1;
    for (let j = f; j <= l; j++) superOf[j] = s;
    const nc = l - f + 1;
    const nr = nc + cc[l] - 1;
    rowPtr[s + 1] = rowPtr[s] + nr;
    entries += nr * nc;
    lxPtr[s + 1] = entries;
    if (nc > cols) cols = nc;
    if (nr > rows) rows = nr;
    if (nr * nc > block) block = nr * nc;
  }
  return { cols, rows, block, entries };
}

/**
 * Row structure of each supernode: its own columns, then the union of the entries of C below its
 * last column l and of its children's rows below l (Davis 2006 §4.4), sorted.
 * @param mark - workspace of length n
 */
function rowStructures(superStart: Int32Array, superOf: Int32Array, parent: Int32Array, rowPtr: Int32Array, lPtr: Int32Array, lIdx: Int32Array, mark: Int32Array, scratch: Scratch): Int32Array {
  const ns = superStart.length - 1;
  const rows = new Int32Array(rowPtr[ns]);
  mark.fill(-1);
  const m = scratch.mark();
  const childHead = scratch.filled(ns, -1);
  const childNext = scratch.filled(ns, -1);
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
    w = gatherEntries(s, f, l, lPtr, lIdx, mark, rows, w);
    for (let ch = childHead[s]; ch !== -1; ch = childNext[ch]) {
      w = gatherRows(s, l, rowPtr[ch] + superStart[ch + 1] - superStart[ch], rowPtr[ch + 1], mark, rows, w);
    }
    if (w !== rowPtr[s + 1]) throw new Error(`ldlt analyse: supernode ${s} has ${w - rowPtr[s]} rows, column counts say ${rowPtr[s + 1] - rowPtr[s]}`);
    sortRows(rows, below, w);
  }
  scratch.release(m);
  return rows;
}

/** Appends to rows (from w) the rows > l of columns f..l of C not yet marked for supernode s; returns the new end. */
function gatherEntries(s: number, f: number, l: number, lPtr: Int32Array, lIdx: Int32Array, mark: Int32Array, rows: Int32Array, w: number): number {
  for (let p = lPtr[f]; p < lPtr[l + 1]; p++) {
    const i = lIdx[p];
    if (i > l && mark[i] !== s) {
      mark[i] = s;
      rows[w++] = i;
    }
  }
  return w;
}

/** Appends to rows (from w) the rows > l of rows[from .. to) not yet marked for supernode s; returns the new end. */
function gatherRows(s: number, l: number, from: number, to: number, mark: Int32Array, rows: Int32Array, w: number): number {
  for (let p = from; p < to; p++) {
    const i = rows[p];
    if (i > l && mark[i] !== s) {
      mark[i] = s;
      rows[w++] = i;
    }
  }
  return w;
}

/**
 * Sorts rows[from .. to) ascending: insertion sort for the short lists of most supernodes (no
 * view object per supernode), the typed-array sort for long ones.
 */
function sortRows(rows: Int32Array, from: number, to: number): void {
  if (to - from > 32) {
    rows.subarray(from, to).sort();
    return;
  }
  for (let p = from + 1; p < to; p++) {
    const v = rows[p];
    let q = p - 1;
    while (q >= from && rows[q] > v) {
      rows[q + 1] = rows[q];
      q--;
    }
    rows[q + 1] = v;
  }
}

/**
 * lxPos[p] = where the p-th value of the input pattern goes in the factor's value array.
 * @param rel - workspace of length n: rel[i] = local row of row i in the current supernode
 */
function valuePositions(superStart: Int32Array, rowPtr: Int32Array, rows: Int32Array, lxPtr: Int32Array, lPtr: Int32Array, lIdx: Int32Array, lOrig: Int32Array, rel: Int32Array): Int32Array {
  const ns = superStart.length - 1;
  const lxPos = new Int32Array(lOrig.length);
  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const r0 = rowPtr[s];
    for (let p = r0; p < rowPtr[s + 1]; p++) rel[rows[p]] = p - r0;
    const base = lxPtr[s];
    for (let j = f; j < f + nc; j++) {
      for (let p = lPtr[j]; p < lPtr[j + 1]; p++) lxPos[lOrig[p]] = base + rel[lIdx[p]] * nc + (j - f);
    }
  }
  return lxPos;
}

/** diagPos[j] = position of A_jj (original numbering) in the input values, −1 if not stored. */
function diagonalPositions(pattern: SymmetricCsc): Int32Array {
  const { n, colPtr, rowIdx } = pattern;
  const diagPos = new Int32Array(n).fill(-1);
  for (let j = 0; j < n; j++) {
    const p = colPtr[j];
    if (p < colPtr[j + 1] && rowIdx[p] === j) diagPos[j] = p;
  }
  return diagPos;
}
