/**
 * Seeded random numbers for the steering Monte Carlo (to be replaced by the shared
 * internal/random.ts once it lands).
 *
 * @internal
 */

/** A seeded source of uniform and standard-normal draws. */
export interface NormalSource {
  uniform(): number;
  normal(): number;
}

/**
 * xoshiro128** (Blackman & Vigna, "Scrambled linear pseudorandom number generators", ACM TOMS
 * 47(4), 2021) seeded through splitmix32; normals by Marsaglia's polar method (Marsaglia & Bray,
 * SIAM Review 6(3) 260–264, 1964).
 */
export function seededNormalSource(seed: number): NormalSource {
  let x = seed >>> 0;
  const splitmix = (): number => {
    x = (x + 0x9e3779b9) >>> 0;
    let z = x;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
  const s = [splitmix(), splitmix(), splitmix(), splitmix()];
  if ((s[0]! | s[1]! | s[2]! | s[3]!) === 0) s[0] = 1;
  const next = (): number => {
    const result = Math.imul(((Math.imul(s[1]!, 5) << 7) | (Math.imul(s[1]!, 5) >>> 25)) >>> 0, 9) >>> 0;
    const t = (s[1]! << 9) >>> 0;
    s[2] = (s[2]! ^ s[0]!) >>> 0;
    s[3] = (s[3]! ^ s[1]!) >>> 0;
    s[1] = (s[1]! ^ s[2]!) >>> 0;
    s[0] = (s[0]! ^ s[3]!) >>> 0;
    s[2] = (s[2]! ^ t) >>> 0;
    s[3] = ((s[3]! << 11) | (s[3]! >>> 21)) >>> 0;
    return result;
  };
  let spare: number | undefined;
  const uniform = (): number => (next() + 0.5) / 4294967296;
  return {
    uniform,
    normal(): number {
      if (spare !== undefined) {
        const v = spare;
        spare = undefined;
        return v;
      }
      for (;;) {
        const u = 2 * uniform() - 1;
        const v = 2 * uniform() - 1;
        const r = u * u + v * v;
        if (r > 0 && r < 1) {
          const f = Math.sqrt((-2 * Math.log(r)) / r);
          spare = v * f;
          return u * f;
        }
      }
    },
  };
}
