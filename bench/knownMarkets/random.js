// Seeded random streams of the known-distribution markets (bench/knownMarkets/): one independent-looking
// stream per (setting, process) name, so that changing one process leaves the others' draws unchanged.
//
// Uniforms: the Small Fast Counting generator sfc32 (C. Doty-Humphrey, PractRand 0.94, 2014; passes
// PractRand and BigCrush), seeded by SplitMix32 steps over the FNV-1a hash of the stream name (G. Fowler,
// L. C. Noll, K.-P. Vo; IETF draft-eastlake-fnv). Normals: Marsaglia and Bray's polar method (G. Marsaglia
// and T. A. Bray (1964), A convenient method for generating normal variables, SIAM Review 6(3), 260-264),
// the second deviate of a pair kept for the next call.

/** FNV-1a 32-bit hash of a string. */
function fnv1a(text) {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** One SplitMix32 output from a state, and the next state. */
function splitMix32(state) {
  const next = (state + 0x9e3779b9) | 0;
  let z = next;
  z = Math.imul(z ^ (z >>> 16), 0x21f0aaad);
  z = Math.imul(z ^ (z >>> 15), 0x735a2d97);
  return { value: (z ^ (z >>> 15)) >>> 0, next };
}

export class Stream {
  /** @param {string} name the stream's name, e.g. `convex-hetero/wind` */
  constructor(name) {
    let state = fnv1a(name);
    const words = [];
    for (let i = 0; i < 4; i++) {
      const step = splitMix32(state);
      words.push(step.value);
      state = step.next;
    }
    [this.a, this.b, this.c, this.d] = words;
    this.spare = null;
    for (let i = 0; i < 12; i++) this.uint32();
  }

  /** Next 32-bit output of sfc32. */
  uint32() {
    const t = (((this.a + this.b) | 0) + this.d) | 0;
    this.d = (this.d + 1) | 0;
    this.a = this.b ^ (this.b >>> 9);
    this.b = (this.c + (this.c << 3)) | 0;
    this.c = (this.c << 21) | (this.c >>> 11);
    this.c = (this.c + t) | 0;
    return t >>> 0;
  }

  /** Uniform in the open interval (0, 1). */
  uniform() {
    return (this.uint32() + 0.5) / 4294967296;
  }

  /** Standard normal deviate (polar method). */
  normal() {
    if (this.spare !== null) {
      const s = this.spare;
      this.spare = null;
      return s;
    }
    for (;;) {
      const u = 2 * this.uniform() - 1;
      const v = 2 * this.uniform() - 1;
      const s = u * u + v * v;
      if (s > 0 && s < 1) {
        const f = Math.sqrt((-2 * Math.log(s)) / s);
        this.spare = v * f;
        return u * f;
      }
    }
  }
}
