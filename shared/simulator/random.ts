// Seeded randomness for the simulator: the same seed gives the same ride, the
// same meter readings and the same FIT bytes on every machine and in the browser.

export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform in [min, max). */
  uniform(min: number, max: number): number;
  /** Integer uniform in [min, max], both ends included. */
  integer(min: number, max: number): number;
  /** Standard normal deviate (mean 0, SD 1). */
  normal(): number;
  /** Poisson deviate with the given mean. */
  poisson(mean: number): number;
  /** True with probability p. */
  chance(p: number): boolean;
}

/**
 * mulberry32 (Tommy Ettinger's public-domain 32-bit generator): tiny, fast and
 * good enough for simulation; not for anything secret.
 */
export function createRandom(seed: number): Random {
  let state = seed >>> 0;
  let spareNormal: number | null = null;

  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };

  // Box–Muller (Box & Muller, Ann. Math. Statist. 1958); keeps the second deviate.
  const normal = (): number => {
    if (spareNormal !== null) {
      const value = spareNormal;
      spareNormal = null;
      return value;
    }
    const u = 1 - next(); // (0, 1]: log(0) is not allowed
    const v = next();
    const radius = Math.sqrt(-2 * Math.log(u));
    spareNormal = radius * Math.sin(2 * Math.PI * v);
    return radius * Math.cos(2 * Math.PI * v);
  };

  // Knuth's multiplication method; the means used here are small (a few per ride).
  const poisson = (mean: number): number => {
    if (mean <= 0) return 0;
    if (mean > 50) return Math.max(0, Math.round(mean + Math.sqrt(mean) * normal()));
    const limit = Math.exp(-mean);
    let count = 0;
    let product = next();
    while (product > limit) {
      count += 1;
      product *= next();
    }
    return count;
  };

  return {
    next,
    uniform: (min, max) => min + (max - min) * next(),
    integer: (min, max) => min + Math.floor(next() * (max - min + 1)),
    normal,
    poisson,
    chance: (p) => next() < p,
  };
}

/**
 * An independent stream for one part of a simulation (the ride, meter A, meter B),
 * so that changing one meter's options does not change the other's readings.
 * FNV-1a over the label, mixed with the seed.
 */
export function deriveSeed(seed: number, label: string): number {
  let hash = 0x811c9dc5 ^ (seed >>> 0);
  for (let i = 0; i < label.length; i += 1) {
    hash ^= label.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193);
  }
  hash ^= hash >>> 16;
  hash = Math.imul(hash, 0x7feb352d);
  hash ^= hash >>> 15;
  return hash >>> 0;
}
