/**
 * A seeded stream of uniform numbers for the scenario paths: the same seed gives the same numbers on
 * every machine (no Math.random, no clock). Generator: Marsaglia's xorshift32 (G. Marsaglia (2003),
 * Xorshift RNGs, J. Stat. Softw. 8(14), doi:10.18637/jss.v008.i14), its state started from the seed by
 * the 32-bit finaliser of MurmurHash3 (A. Appleby, public domain), so that nearby seeds give unrelated
 * streams. Plenty for choosing template days and breaking ties; not for cryptography.
 */
export class SeededStream {
  private state: number;

  /** @param seed any integer (taken modulo 2^32) */
  constructor(seed: number) {
    let h = (Math.trunc(seed) ^ 0x9e3779b9) >>> 0;
    h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
    h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
    h = (h ^ (h >>> 16)) >>> 0;
    this.state = h === 0 ? 0x6d2b79f5 : h;
  }

  /** Next 32-bit unsigned output. */
  uint32(): number {
    let x = this.state;
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    this.state = x >>> 0;
    return this.state;
  }

  /** Uniform integer in 0 .. n - 1 (n >= 1), by rejection, so without modulo bias. */
  below(n: number): number {
    const limit = Math.floor(4294967296 / n) * n;
    for (;;) {
      const u = this.uint32();
      if (u < limit) return u % n;
    }
  }

  /** A random permutation of 0 .. n - 1 (Fisher-Yates; Knuth 1997, TAOCP vol. 2, Algorithm 3.4.2P). */
  permutation(n: number): Int32Array {
    const out = Int32Array.from({ length: n }, (_, i) => i);
    for (let i = n - 1; i > 0; i--) {
      const j = this.below(i + 1);
      const t = out[i] as number;
      out[i] = out[j] as number;
      out[j] = t;
    }
    return out;
  }
}

/** A seed for one delivery day from a run's seed and the day's number: each day its own stream. */
export function daySeed(seed: number, dayNumber: number): number {
  let h = (Math.trunc(seed) >>> 0) ^ Math.imul(dayNumber | 0, 0x9e3779b1);
  h = Math.imul(h ^ (h >>> 15), 0x2c1b3c6d);
  h = Math.imul(h ^ (h >>> 12), 0x297a2d39);
  return (h ^ (h >>> 15)) >>> 0;
}
