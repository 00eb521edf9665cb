/** A seeded pseudo-random generator (mulberry32) and Gaussian noise (Box–Muller), for reproducible noisy series. */
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

export function gaussian(rand: () => number): () => number {
  return () => {
    const u = Math.max(rand(), 1e-12);
    const v = rand();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}

/** x(t) = x∞ + (x0 − x∞)·e^(−t/τ) at the given times, optionally with Gaussian noise of standard deviation sigma. */
export function firstOrderSeries(t: number[], x0: number, xInf: number, tau: number, sigma = 0, seed = 1): number[] {
  const g = gaussian(seededRandom(seed));
  return t.map((ti) => xInf + (x0 - xInf) * Math.exp(-ti / tau) + (sigma ? sigma * g() : 0));
}
