/**
 * The block elimination behind `amd` (src/linalg/ordering/fill.ts blockElimination), the rule
 * that skips the node groupings once the exact compression factors cheaply (chooseBlocks with
 * enoughFlops), and the scratch buffer the symbolic phase carves its temporaries from.
 */
import { describe, expect, it } from 'vitest';
import { amdGraph } from '../src/linalg/ordering/amd';
import { blockElimination } from '../src/linalg/ordering/fill';
import { adjacency, compress, expand, groupNodes } from '../src/linalg/ordering/graph';
import { AUTO_ENOUGH_FLOPS_PER_ENTRY, AUTO_ENOUGH_MIN_N, amdScratchLength, enoughFlops, nodeBlocks, symbolicFill } from '../src/linalg/ordering/index';
import { Scratch, float64Entries } from '../src/linalg/ordering/scratch';
import type { SymmetricCsc } from '../src/linalg/sparse/symmetric';
import { buildingPattern, denseSymbolicFill, footbridgePattern, randomPattern, sparseBuildingPattern } from './ordering-helpers';

/** Exact compression of a pattern, its AMD order and the block elimination of that order. */
function exactBlocks(a: SymmetricCsc, scratch?: Scratch) {
  const c = compress(adjacency(a, scratch), scratch);
  const order = amdGraph(c.graph, c.weight, undefined, scratch);
  return { c, order, e: blockElimination(c.graph, c.weight, order, scratch) };
}

describe('blockElimination', () => {
  it('on indistinguishable blocks: the fill of the expanded order, as dense symbolic elimination counts it', () => {
    // Reference: elimination on the dense boolean matrix (Parter 1961 / Rose 1972 graph model),
    // for a frame whose 6 DOFs per node compress to one block, a truss whose pattern compresses
    // in part, and a random pattern that does not compress.
    for (const a of [buildingPattern(2, 2, 3), footbridgePattern(12), randomPattern(150, 4, 7)]) {
      const { c, order, e } = exactBlocks(a);
      const ref = denseSymbolicFill(a, expand(c, order));
      expect(e.nnzL).toBe(ref.nnzL);
      expect(e.flops).toBe(ref.flops);
    }
  });

  it('tree and counts expand to those of the full pattern: a chain per block, counts lastCount + w − 1 − i', () => {
    const a = buildingPattern(3, 3, 4);
    const { c, order, e } = exactBlocks(a);
    expect(c.graph.n).toBe(a.n / 6); // every free node's 6 DOFs are indistinguishable
    // Count over the full pattern of the expanded order (symbolicFill: the same row-subtree
    // routine on the uncompressed graph; the dense reference is the test above).
    const ref = symbolicFill(a, expand(c, order));
    expect(e.nnzL).toBe(ref.nnzL);
    expect(e.flops).toBe(ref.flops);
    let nnzL = 0;
    for (let k = 0; k < order.length; k++) {
      const w = c.weight[order[k]];
      for (let i = 0; i < w; i++) nnzL += e.lastCount[k] + w - 1 - i - 1;
      if (e.parent[k] !== -1) expect(e.parent[k]).toBeGreaterThan(k); // a tree in elimination order
    }
    expect(nnzL).toBe(ref.nnzL);
  });

  it('a node grouping (not indistinguishable) gives an upper bound of the fill', () => {
    const a = sparseBuildingPattern(3, 3, 4);
    const g = adjacency(a);
    const c = groupNodes(g, 5, 0.2, 6);
    expect(c.graph.n).toBeLessThan(a.n);
    const order = amdGraph(c.graph, c.weight);
    expect(blockElimination(c.graph, c.weight, order).nnzL).toBeGreaterThanOrEqual(symbolicFill(a, expand(c, order)).nnzL);
  });
});

describe('node grouping skipped when the exact compression factors cheaply', () => {
  it('a long truss (n ≥ AUTO_ENOUGH_MIN_N, few flops per entry): the exact compression with its elimination', () => {
    const a = footbridgePattern(400);
    expect(a.n).toBeGreaterThanOrEqual(AUTO_ENOUGH_MIN_N);
    const b = nodeBlocks(a);
    const { c, order, e } = exactBlocks(a);
    expect(e.flops).toBeLessThan(AUTO_ENOUGH_FLOPS_PER_ENTRY * a.colPtr[a.n]);
    expect(enoughFlops(a)).toBe(AUTO_ENOUGH_FLOPS_PER_ENTRY * a.colPtr[a.n]);
    expect(b.blocks.graph.n).toBe(c.graph.n);
    expect(Array.from(b.amdOrder)).toEqual(Array.from(order));
    expect(b.elimination?.nnzL).toBe(e.nnzL);
    expect(b.elimination?.flops).toBe(e.flops);
  });

  it('a member-level frame pattern whose exact order is costly still tries the groupings, and one wins', () => {
    const a = sparseBuildingPattern(5, 5, 8);
    const { c, e } = exactBlocks(a);
    expect(e.flops).toBeGreaterThanOrEqual(enoughFlops(a));
    const b = nodeBlocks(a);
    expect(b.blocks.graph.n).toBeLessThan(c.graph.n);
    expect(b.elimination).toBeUndefined(); // a grouping's block counts are only a bound
    expect(symbolicFill(a, expand(b.blocks, b.amdOrder)).nnzL).toBeLessThan(e.nnzL);
  });

  it('below AUTO_ENOUGH_MIN_N columns nothing is cheap enough', () => {
    const a = footbridgePattern(20);
    expect(a.n).toBeLessThan(AUTO_ENOUGH_MIN_N);
    expect(enoughFlops(a)).toBe(-1);
  });
});

describe('Scratch', () => {
  it('takes stretches one after another and gives them back from a mark', () => {
    const s = Scratch.ofLength(10);
    const a = s.take(4);
    const m = s.mark();
    const b = s.filled(3, 7);
    expect(a.buffer).toBe(b.buffer); // one allocation, carved
    expect(b.byteOffset - a.byteOffset).toBe(16);
    expect(Array.from(b)).toEqual([7, 7, 7]);
    s.release(m);
    const c = s.zeros(6);
    expect(c.byteOffset).toBe(b.byteOffset); // reused
    expect(Array.from(c)).toEqual([0, 0, 0, 0, 0, 0]);
  });

  it('a request the buffer cannot hold gets a fresh zeroed array and leaves the buffer as it was', () => {
    const s = Scratch.ofLength(4);
    s.take(3);
    const m = s.mark();
    const big = s.take(5);
    expect(big.length).toBe(5);
    expect(big.byteOffset).toBe(0);
    expect(Array.from(big)).toEqual([0, 0, 0, 0, 0]);
    expect(s.mark()).toBe(m);
    expect(new Scratch().take(3).length).toBe(3); // no buffer: always fresh
  });

  it('Float64 stretches are 8-byte aligned and zeroed, within float64Entries(length) entries', () => {
    const s = Scratch.ofLength(1 + float64Entries(5));
    s.take(1).fill(-1); // leaves the top at a 4-byte offset
    const m = s.mark();
    const f = s.float64Zeros(5);
    expect(f.byteOffset % 8).toBe(0);
    expect(Array.from(f)).toEqual([0, 0, 0, 0, 0]);
    expect(s.mark() - m).toBeLessThanOrEqual(float64Entries(5));
    f[4] = 0.5;
    expect(f[4]).toBe(0.5);
  });

  it('minimum degree on a scratch of amdScratchLength entries: the same order, the scratch given back', () => {
    for (const a of [buildingPattern(3, 3, 3), footbridgePattern(30), randomPattern(300, 5, 3)]) {
      const g = adjacency(a);
      const s = Scratch.ofLength(amdScratchLength(g.n, g.xadj[g.n], g.n));
      const m = s.mark();
      const withScratch = amdGraph(g, undefined, undefined, s);
      expect(s.mark()).toBe(m);
      const again = amdGraph(g, undefined, undefined, s); // stale contents from the first run
      expect(Array.from(withScratch)).toEqual(Array.from(amdGraph(g)));
      expect(Array.from(again)).toEqual(Array.from(withScratch));
    }
  });

  it('nodeBlocks on a used scratch gives what it gives with fresh arrays', () => {
    const a = sparseBuildingPattern(4, 4, 5);
    const length = amdScratchLength(a.n, 2 * a.colPtr[a.n], a.n);
    const s = Scratch.ofLength(length);
    s.take(length).fill(12345); // stale contents everywhere
    s.release(0);
    const b1 = nodeBlocks(a, s);
    const b2 = nodeBlocks(a);
    expect(Array.from(b1.amdOrder)).toEqual(Array.from(b2.amdOrder));
    expect(Array.from(b1.blocks.members)).toEqual(Array.from(b2.blocks.members));
  });
});
