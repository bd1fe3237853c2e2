/**
 * Small pseudo-random generator (mulberry32, public domain) started from a
 * fixed state, so that searches are reproducible. Returns a function
 * yielding floats in [0, 1).
 */
export function createRandom(state: number): () => number {
  let a = (Math.floor(state) >>> 0) || 0x9e3779b9;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviate from a uniform generator (Box–Muller). */
export function gaussian(rand: () => number): number {
  let u = 0;
  while (u === 0) u = rand();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand());
}
