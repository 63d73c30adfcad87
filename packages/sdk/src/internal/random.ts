/**
 * Seeded, portable random numbers for simulations and Monte Carlo analyses, so that every
 * result the SDK reports is reproducible from its seed on any JavaScript engine.
 *
 * @internal
 */

/** Largest seed: seeds are unsigned 32-bit integers (larger values would alias smaller ones). */
export const MAX_SEED = 4_294_967_295;

/** A seeded source of uniform and standard-normal draws. */
export interface Random {
  /** Uniform draw in the open interval (0, 1). */
  uniform(): number;
  /** Standard normal draw (mean 0, variance 1). */
  normal(): number;
}

/**
 * xoshiro128** 1.1 (D. Blackman & S. Vigna, "Scrambled linear pseudorandom number generators",
 * ACM TOMS 47(4), 2021), state seeded through a splitmix32-style mixer; uniforms use 32 bits,
 * (k + 0.5)/2^32 so that 0 and 1 never occur; normals by Marsaglia's polar method (G. Marsaglia &
 * T. A. Bray, SIAM Review 6(3):260–264, 1964). Citations from memory [M]; the generator is
 * checked by its own statistical tests [C].
 *
 * @param seed  Any finite number; its low 32 bits (after truncation) select the stream.
 */
export function createRandom(seed: number): Random {
  let x = Math.trunc(seed) >>> 0;
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
    const m = Math.imul(s[1]!, 5) >>> 0;
    const result = Math.imul(((m << 7) | (m >>> 25)) >>> 0, 9) >>> 0;
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
