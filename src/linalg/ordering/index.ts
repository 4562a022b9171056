/**
 * Fill-reducing orderings of symmetric sparse patterns: approximate minimum degree, nested
 * dissection, reverse Cuthill–McKee, and the symbolic fill count used to compare them.
 */
import { ArgumentError } from '../../errors';
import type { SymmetricCsc } from '../sparse/symmetric';
import { amdGraph } from './amd';
import { enoughFlops } from './enough';
import { blockElimination } from './fill';
import type { BlockElimination } from './fill';
import { adjacency, compress, expand, groupNodes } from './graph';
import type { CompressedGraph } from './graph';
import { ndGraph, resolveNdOptions } from './nd';
import type { NestedDissectionOptions } from './nd';
import { rcmGraph } from './rcm';
import { Scratch } from './scratch';

export { AUTO_ENOUGH_FLOPS_PER_ENTRY, AUTO_ENOUGH_MIN_N, enoughFlops } from './enough';
export { symbolicFill } from './fill';
export type { BlockElimination } from './fill';
export { amdScratchLength } from './amd';
export { Scratch, float64Entries } from './scratch';
export { ND_DEFAULTS } from './nd';
export type { NestedDissectionOptions } from './nd';

/** Names of the orderings `order` understands. */
export type OrderingMethod = 'amd' | 'nd' | 'rcm' | 'natural';

/**
 * Fill-reducing ordering of a symmetric pattern by name.
 * @param pattern - n × n symmetric pattern stored by its lower triangle (values ignored)
 * @returns perm[k] = original index eliminated k-th; a permutation of 0..n−1
 * @throws ArgumentError (path `method`) for an unknown name; (path `pattern.*`) for an invalid pattern
 */
export function order(pattern: SymmetricCsc, method: OrderingMethod): Int32Array {
  return orderWith(pattern, method);
}

/**
 * `order`, with the node grouping of `amd` and `nd` given (from {@link nodeBlocks} of the same
 * pattern) so that a caller trying both computes it once. Internal to the linalg layer.
 */
export function orderWith(pattern: SymmetricCsc, method: OrderingMethod, blocks?: NodeBlocks): Int32Array {
  switch (method) {
    case 'amd': {
      const b = blocks ?? nodeBlocks(pattern);
      return expand(b.blocks, b.amdOrder);
    }
    case 'nd': {
      const b = blocks ?? nodeBlocks(pattern);
      return expand(b.blocks, ndGraph(b.blocks.graph, b.blocks.weight, resolveNdOptions(undefined)));
    }
    case 'rcm':
      return rcm(pattern);
    case 'natural': {
      adjacency(pattern); // validates
      const p = new Int32Array(pattern.n);
      for (let i = 0; i < p.length; i++) p[i] = i;
      return p;
    }
    default:
      throw new ArgumentError(`unknown ordering "${String(method)}"; use 'amd', 'nd', 'rcm' or 'natural'`, 'method');
  }
}

/**
 * Approximate minimum degree ordering (Amestoy, Davis & Duff 1996), run on the graph with
 * the unknowns of one node merged first: indistinguishable vertices always, and the DOFs of a
 * structural node when that gives less fill (see chooseBlocks).
 * @param pattern - n × n symmetric pattern stored by its lower triangle (values ignored)
 * @returns perm[k] = original index eliminated k-th; a permutation of 0..n−1
 * @throws ArgumentError (path `pattern.*`) for an invalid pattern
 */
export function amd(pattern: SymmetricCsc): Int32Array {
  return orderWith(pattern, 'amd');
}

/** The vertex grouping `amd` and `nd` order, with its AMD order (see chooseBlocks). */
export interface NodeBlocks {
  readonly blocks: CompressedGraph;
  readonly amdOrder: Int32Array;
  /**
   * Elimination tree and column counts of amdOrder on the blocks, when the blocks are the exact
   * compression (indistinguishable vertices): then they are those of the expanded order, and a
   * caller needs no second symbolic pass over the full pattern (see blockElimination).
   */
  readonly elimination?: BlockElimination;
}

/**
 * The vertex grouping of a pattern that `amd` and `nd` order (see chooseBlocks), with the AMD
 * order of its quotient graph.
 * @param scratch - where temporaries are carved (given back on return); enough for every step
 *   with {@link amdScratchLength}(n, 2 × off-diagonal entries, n) entries
 * @throws ArgumentError (path `pattern.*`) for an invalid pattern
 */
export function nodeBlocks(pattern: SymmetricCsc, scratch?: Scratch): NodeBlocks {
  return chooseBlocks(pattern, scratch);
}

/**
 * Picks the vertex grouping to order: the exact compression (indistinguishable vertices) or one
 * of two node groupings (see groupNodes: up to 6 DOFs of a frame node within index distance 5,
 * or up to 3 DOFs of a bar node within distance 2). Each candidate is ordered by AMD and the one
 * with the least block fill wins; ties keep the exact compression. The groupings are not tried
 * when the exact compression's order already factors in fewer flops than {@link enoughFlops}
 * (the rule `analyse` applies to its candidates): a grouping would cost more to compute than it
 * could save.
 */
function chooseBlocks(pattern: SymmetricCsc, scratch: Scratch = new Scratch()): NodeBlocks {
  const g = adjacency(pattern, scratch);
  const exact = compress(g, scratch);
  const exactOrder = amdGraph(exact.graph, exact.weight, undefined, scratch);
  const elimination = blockElimination(exact.graph, exact.weight, exactOrder, scratch);
  let best: NodeBlocks = { blocks: exact, amdOrder: exactOrder, elimination };
  if (elimination.flops < enoughFlops(pattern)) return best;
  let bestFill = elimination.nnzL;
  for (const [window, maxSize] of GROUPINGS) {
    const c = groupNodes(g, window, 0.2, maxSize, scratch);
    if (c.graph.n >= exact.graph.n) continue; // nothing merged beyond the exact compression
    const o = amdGraph(c.graph, c.weight, undefined, scratch);
    const f = blockElimination(c.graph, c.weight, o, scratch).nnzL;
    if (f < bestFill) {
      bestFill = f;
      best = { blocks: c, amdOrder: o };
    }
  }
  return best;
}

/** Node groupings tried by chooseBlocks: [index window, maximum group size]. */
const GROUPINGS: ReadonlyArray<readonly [number, number]> = [
  [5, 6],
  [2, 3],
];

/**
 * Reverse Cuthill–McKee ordering (bandwidth/profile reduction) of every connected component
 * from a George–Liu pseudo-peripheral vertex, on the graph with indistinguishable vertices merged.
 * @param pattern - n × n symmetric pattern stored by its lower triangle (values ignored)
 * @returns perm[k] = original index eliminated k-th; a permutation of 0..n−1
 * @throws ArgumentError (path `pattern.*`) for an invalid pattern
 */
export function rcm(pattern: SymmetricCsc): Int32Array {
  const c = compress(adjacency(pattern));
  return expand(c, rcmGraph(c.graph));
}

/**
 * Nested-dissection ordering by multilevel recursive bisection (Karypis & Kumar 1998) with
 * separators ordered last and parts ordered by constrained approximate minimum degree;
 * deterministic for a given seed. Runs on the same node grouping as `amd`.
 * @param pattern - n × n symmetric pattern stored by its lower triangle (values ignored)
 * @param options - see {@link NestedDissectionOptions}; defaults in `ND_DEFAULTS`
 * @returns perm[k] = original index eliminated k-th; a permutation of 0..n−1
 * @throws ArgumentError (path `options.*`) for invalid options; (path `pattern.*`) for an invalid pattern
 */
export function nestedDissection(pattern: SymmetricCsc, options?: NestedDissectionOptions): Int32Array {
  const opt = resolveNdOptions(options);
  const { blocks } = chooseBlocks(pattern);
  return expand(blocks, ndGraph(blocks.graph, blocks.weight, opt));
}
