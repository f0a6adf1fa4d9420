/**
 * A small seeded pseudo-random generator, so that every simulated spectrum
 * and the whole demo set can be rebuilt bit for bit from one integer seed.
 *
 * mulberry32: a 32-bit state generator (T. Ettinger, public-domain code, 2017;
 * from memory) — fast, passes the common statistical batteries well enough
 * for simulation noise, not for cryptography.
 * Gaussian deviates: Box & Muller (1958, Ann. Math. Stat. 29, 610).
 */

export interface Rng {
  /** Uniform deviate in [0, 1). */
  next(): number;
  /** Standard normal deviate (mean 0, variance 1). */
  gaussian(): number;
  /** Uniform deviate in [lo, hi). */
  uniform(lo: number, hi: number): number;
  /** Deviate uniform in log between lo and hi (both > 0). */
  logUniform(lo: number, hi: number): number;
  /** Integer uniform in [lo, hi] inclusive. */
  int(lo: number, hi: number): number;
  /** True with probability p. */
  chance(p: number): boolean;
  /** One element of a non-empty array. */
  pick<T>(items: readonly T[]): T;
  /** Poisson deviate with the given mean (Knuth's product method; fine for mean < ~50). */
  poisson(mean: number): number;
}

/** The raw mulberry32 step: returns a function yielding uniform [0, 1) deviates. */
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

/**
 * Mix two integers into a new 32-bit seed (a murmur3-style finaliser), so that
 * object i of a batch gets its own stream independent of how many deviates
 * object i-1 used.
 */
export function mixSeed(a: number, b: number): number {
  let h = (Math.imul(a >>> 0, 0x9e3779b1) ^ (b >>> 0)) >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b) >>> 0;
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35) >>> 0;
  return (h ^ (h >>> 16)) >>> 0;
}

export function createRng(seed: number): Rng {
  const u = mulberry32(seed);
  let spare: number | null = null;
  const rng: Rng = {
    next: u,
    gaussian() {
      if (spare !== null) {
        const s = spare;
        spare = null;
        return s;
      }
      // Box-Muller: two uniforms -> two independent normals; 1 - u avoids log(0).
      const u1 = 1 - u();
      const u2 = u();
      const r = Math.sqrt(-2 * Math.log(u1));
      spare = r * Math.sin(2 * Math.PI * u2);
      return r * Math.cos(2 * Math.PI * u2);
    },
    uniform: (lo, hi) => lo + (hi - lo) * u(),
    logUniform: (lo, hi) => Math.exp(Math.log(lo) + (Math.log(hi) - Math.log(lo)) * u()),
    int: (lo, hi) => lo + Math.floor(u() * (hi - lo + 1)),
    chance: (p) => u() < p,
    pick: (items) => items[Math.floor(u() * items.length)],
    poisson(mean) {
      const limit = Math.exp(-mean);
      let k = 0;
      let p = u();
      while (p > limit) {
        k++;
        p *= u();
      }
      return k;
    },
  };
  return rng;
}
