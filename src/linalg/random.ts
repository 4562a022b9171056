/**
 * Seeded pseudo-random numbers: the same seed gives the same sequence on every run and platform
 * (mulberry32, a 32-bit generator by Tommy Ettinger; integer arithmetic only).
 */

/** A generator of uniform numbers in [0, 1) from a 32-bit seed. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
