/** Seeded pseudo-random numbers for noise studies in tests and benchmarks (invented noise, never a reference). */

/** mulberry32: a small 32-bit generator, deterministic for a given seed; uniform in [0, 1). */
export function uniformGenerator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by the Box-Muller transform of `uniformGenerator(seed)`. */
export function normalGenerator(seed: number): () => number {
  const u = uniformGenerator(seed);
  return () => {
    const u1 = 1 - u();
    const u2 = u();
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  };
}
