/**
 * A small deterministic generator of numbers in [0, 1) (mulberry32), so that a search, a
 * sample or a test case drawn from a seed repeats exactly.
 *
 * @example const next = seededRandom(7); next() // → 0.2478…
 */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
