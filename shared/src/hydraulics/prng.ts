/**
 * Seeded pseudo-random numbers, identical on every platform (32-bit integer arithmetic only):
 * SFC32 (Chris Doty-Humphrey's Small Fast Counting generator, from PractRand) seeded through the
 * cyrb128 string hash; normal deviates by the Box-Muller transform. Not for cryptography.
 */
export interface Prng {
  /** uniform on [0, 1) */
  next(): number;
  /** standard normal */
  normal(): number;
}

/** Four 32-bit words from a seed string (cyrb128, public domain, bryc). */
function cyrb128(str: string): [number, number, number, number] {
  let h1 = 1779033703;
  let h2 = 3144134277;
  let h3 = 1013904242;
  let h4 = 2773480762;
  for (let i = 0; i < str.length; i++) {
    const k = str.charCodeAt(i);
    h1 = h2 ^ Math.imul(h1 ^ k, 597399067);
    h2 = h3 ^ Math.imul(h2 ^ k, 2869860233);
    h3 = h4 ^ Math.imul(h3 ^ k, 951274213);
    h4 = h1 ^ Math.imul(h4 ^ k, 2716044179);
  }
  h1 = Math.imul(h3 ^ (h1 >>> 18), 597399067);
  h2 = Math.imul(h4 ^ (h2 >>> 22), 2869860233);
  h3 = Math.imul(h1 ^ (h3 >>> 17), 951274213);
  h4 = Math.imul(h2 ^ (h4 >>> 19), 2716044179);
  return [(h1 ^ h2 ^ h3 ^ h4) >>> 0, (h2 ^ h1) >>> 0, (h3 ^ h1) >>> 0, (h4 ^ h1) >>> 0];
}

export function createPrng(seed: number | string): Prng {
  let [a, b, c, d] = cyrb128(String(seed));
  const next = () => {
    a >>>= 0;
    b >>>= 0;
    c >>>= 0;
    d >>>= 0;
    let t = (a + b) | 0;
    a = b ^ (b >>> 9);
    b = (c + (c << 3)) | 0;
    c = (c << 21) | (c >>> 11);
    d = (d + 1) | 0;
    t = (t + d) | 0;
    c = (c + t) | 0;
    return (t >>> 0) / 4294967296;
  };
  for (let i = 0; i < 15; i++) next(); // discard the first outputs (standard warm-up)
  let spare = NaN;
  return {
    next,
    normal() {
      if (!Number.isNaN(spare)) {
        const s = spare;
        spare = NaN;
        return s;
      }
      let u = next();
      while (u <= 0) u = next();
      const v = next();
      const r = Math.sqrt(-2 * Math.log(u));
      spare = r * Math.sin(2 * Math.PI * v);
      return r * Math.cos(2 * Math.PI * v);
    },
  };
}
