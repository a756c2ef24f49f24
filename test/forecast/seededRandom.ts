/**
 * Seeded generators for the synthetic series of behaviour tests (never for check values).
 * mulberry32: a 32-bit generator with a 2^32 period, plenty for test data.
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

/** Standard normal draws by the Box-Muller transform from a seeded uniform generator. */
export function seededNormal(seed: number): () => number {
  const u = seededRandom(seed);
  return () => {
    const u1 = Math.max(u(), 1e-300);
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u());
  };
}
