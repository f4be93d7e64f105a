/**
 * Seeded random numbers so that a run can be repeated exactly. mulberry32: small, fast and good
 * enough for sensor noise (not for anything secret).
 */
export type Random = () => number;

export function createRandom(seed: number): Random {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A seed for one named stream (e.g. a device), so adding a device does not change the others' noise. */
export function deriveSeed(seed: number, label: string): number {
  let h = (0x811c9dc5 ^ seed) >>> 0; // FNV-1a over the label, started from the run's seed
  for (let i = 0; i < label.length; i++) {
    h ^= label.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h;
}

/** Standard normal deviate (Box-Muller). */
export function gaussian(random: Random): number {
  const u = 1 - random(); // (0, 1], so the log is finite
  const v = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
