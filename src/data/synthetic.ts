/**
 * Seeded random numbers for invented demo data (examples/, `trendbrief init`) and benchmarks:
 * mulberry32, a public-domain 32-bit generator by Tommy Ettinger, and normal deviates by the Box–Muller
 * transform (Box & Muller 1958, Annals of Mathematical Statistics 29(2), 610–611).
 *
 *   const rand = mulberry32(42); rand() → the same number on every machine
 */
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

/** A standard normal deviate from two uniform draws. */
export function normal(rand: () => number): number {
  const u = 1 - rand();
  const v = rand();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
