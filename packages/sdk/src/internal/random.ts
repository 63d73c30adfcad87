/**
 * Seeded, portable random numbers for simulations and Monte Carlo analyses, so that every
 * result the SDK reports is reproducible from its seed on any JavaScript engine.
 *
 * @internal
 */

import { at } from './checked.js';

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
 * How normal draws are made from the uniform stream:
 * - `polar`: Marsaglia's polar method (two uniforms, a logarithm and a square root per pair; the
 *   stream that clock simulations and their committed fixtures were made with);
 * - `ziggurat`: Marsaglia & Tsang's ziggurat (one 32-bit draw and a table look-up 98.8 % of the
 *   time; about three times faster), for Monte Carlo loops.
 * The two give different sequences for the same seed; each is reproducible.
 */
export type NormalMethod = 'polar' | 'ziggurat';

/** Layers of the ziggurat and its tables (Marsaglia & Tsang 2000, procedure zigset, 128 layers). */
const ZIG_LAYERS = 128;
const ZIG_R = 3.442619855899; // right edge of the base layer
const ZIG_KN = new Int32Array(ZIG_LAYERS);
const ZIG_WN = new Float64Array(ZIG_LAYERS);
const ZIG_FN = new Float64Array(ZIG_LAYERS);
{
  // Tables exactly as zigset builds them; m1 = 2^31 scales a signed 32-bit draw to (−1, 1).
  const m1 = 2147483648;
  const vn = 9.91256303526217e-3; // area of each layer
  let dn = ZIG_R;
  let tn = dn;
  const q = vn / Math.exp(-0.5 * dn * dn);
  ZIG_KN[0] = Math.trunc((dn / q) * m1);
  ZIG_KN[1] = 0;
  ZIG_WN[0] = q / m1;
  ZIG_WN[ZIG_LAYERS - 1] = dn / m1;
  ZIG_FN[0] = 1;
  ZIG_FN[ZIG_LAYERS - 1] = Math.exp(-0.5 * dn * dn);
  for (let i = ZIG_LAYERS - 2; i >= 1; i--) {
    dn = Math.sqrt(-2 * Math.log(vn / dn + Math.exp(-0.5 * dn * dn)));
    ZIG_KN[i + 1] = Math.trunc((dn / tn) * m1);
    tn = dn;
    ZIG_FN[i] = Math.exp(-0.5 * dn * dn);
    ZIG_WN[i] = dn / m1;
  }
}

/**
 * xoshiro128** 1.1 (D. Blackman & S. Vigna, "Scrambled linear pseudorandom number generators",
 * ACM TOMS 47(4), 2021), state seeded through a splitmix32-style mixer; uniforms use 32 bits,
 * (k + 0.5)/2^32 so that 0 and 1 never occur. Normals by Marsaglia's polar method (G. Marsaglia &
 * T. A. Bray, SIAM Review 6(3):260–264, 1964) or by the ziggurat (G. Marsaglia & W. W. Tsang, "The
 * Ziggurat Method for Generating Random Variables", J. Statistical Software 5(8), 2000, procedures
 * RNOR/nfix/zigset, 128 layers; its 32-bit integers come from xoshiro128** here instead of SHR3,
 * whose weakness in that role was reported by Leong, Zhang, Lee, Luk & Villasenor, J. Statistical
 * Software 12(7), 2005). Citations from memory [M]; both generators are checked by the SDK's own
 * statistical tests (moments, Kolmogorov–Smirnov, tail frequencies) [C].
 *
 * @param seed    Any finite number; its low 32 bits (after truncation) select the stream.
 * @param method  How normals are drawn (default `polar`, the stream of the committed fixtures).
 */
export function createRandom(seed: number, method: NormalMethod = 'polar'): Random {
  let x = Math.trunc(seed) >>> 0;
  const splitmix = (): number => {
    x = (x + 0x9e3779b9) >>> 0;
    return fmix32(x);
  };
  const r = createReseedableRandom(method);
  r.setState(splitmix(), splitmix(), splitmix(), splitmix());
  return r;
}

/** MurmurHash3's 32-bit finalizer fmix32 (A. Appleby, MurmurHash3, public domain; from memory [M]): a bijection of the 32-bit integers with full avalanche. */
export function fmix32(z: number): number {
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
  return (z ^ (z >>> 16)) >>> 0;
}

/** A random source whose xoshiro128** state can be set again, so one generator (and its closures) serves many streams. */
export interface ReseedableRandom extends Random {
  /** Sets the four 32-bit state words (an all-zero state becomes s0 = 1) and forgets any spare polar draw. */
  setState(s0: number, s1: number, s2: number, s3: number): void;
  /** Selects the stream of run `index` of `seed` (see `streamState`). */
  setStream(seed: number, index: number): void;
}

/**
 * The xoshiro128** state of stream `index` (0 … 2^32 − 1) of `seed` (unsigned 32-bit), written into `out`:
 * a = fmix32(seed ⊕ 0x9e3779b9); s0 = fmix32(a + 0x6a09e667); s1 = fmix32((index ⊕ a) + 0xbb67ae85);
 * s2 = fmix32(s1 ⊕ (a + 0x3c6ef372)); s3 = fmix32(s0 ⊕ s1 ⊕ 0xa54ff53a) (additions mod 2^32; the
 * constants are the golden-ratio and SHA-256 initial words, chosen only as "nothing up the sleeve").
 * Since fmix32 is a bijection, s1 differs for every index of one seed, so no two runs of a seed share a
 * state; every word passes through fmix32, so neighbouring indices give unrelated states. A run's
 * stream depends only on (seed, index): any range of runs can be flown apart from the others.
 * Common practice (counter-based seeding through an avalanche mixer), no source for this exact layout.
 */
export function streamState(seed: number, index: number, out: Uint32Array): void {
  const a = fmix32((seed ^ 0x9e3779b9) >>> 0);
  const s0 = fmix32((a + 0x6a09e667) >>> 0);
  const s1 = fmix32((((index ^ a) >>> 0) + 0xbb67ae85) >>> 0);
  out[0] = s0;
  out[1] = s1;
  out[2] = fmix32((s1 ^ ((a + 0x3c6ef372) >>> 0)) >>> 0);
  out[3] = fmix32((s0 ^ s1 ^ 0xa54ff53a) >>> 0);
}

/**
 * A generator over stream `index` of `seed` (see `streamState`), drawing normals by `method`.
 * @param seed    Unsigned 32-bit seed.
 * @param index   Stream (run) index, unsigned 32-bit.
 */
export function createRandomStream(seed: number, index: number, method: NormalMethod = 'ziggurat'): ReseedableRandom {
  const r = createReseedableRandom(method);
  r.setStream(seed, index);
  return r;
}

/**
 * xoshiro128** 1.1 with a settable state (see `createRandom` for the generator and the normal methods).
 * @param method  How normals are drawn.
 */
export function createReseedableRandom(method: NormalMethod): ReseedableRandom {
  // The state lives in four local integers (not an array): this loop is the hot path of every Monte Carlo.
  let s0 = 1,
    s1 = 0,
    s2 = 0,
    s3 = 0;
  const words = new Uint32Array(4);
  /** Next 32-bit output as a signed integer (the same bits as the unsigned output). */
  const nextInt = (): number => {
    const m = Math.imul(s1, 5);
    const result = Math.imul((m << 7) | (m >>> 25), 9);
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = (s3 << 11) | (s3 >>> 21);
    return result;
  };
  const uniform = (): number => ((nextInt() >>> 0) + 0.5) / 4294967296;
  let spare: number | undefined;
  const setState = (a: number, b: number, c: number, d: number): void => {
    s0 = a | 0;
    s1 = b | 0;
    s2 = c | 0;
    s3 = d | 0;
    if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
    spare = undefined;
  };
  const setStream = (seed: number, index: number): void => {
    streamState(seed, index, words);
    const [a = 0, b = 0, c = 0, d = 0] = words;
    setState(a, b, c, d);
  };
  if (method === 'ziggurat') return { uniform, normal: zigguratNormal(nextInt, uniform), setState, setStream };
  return {
    uniform,
    setState,
    setStream,
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

/**
 * RNOR of Marsaglia & Tsang (2000) over a signed 32-bit source; `nfix` handles the 1.2 % of draws outside the boxes.
 * Hot: the layer index iz = hz & (ZIG_LAYERS − 1) lies in [0, ZIG_LAYERS), the tables' length, so the fast path
 * reads them with `!`; the rare wedge test reads checked.
 */
function zigguratNormal(nextInt: () => number, uniform: () => number): () => number {
  return (): number => {
    for (;;) {
      const hz = nextInt();
      const iz = hz & (ZIG_LAYERS - 1);
      const wn = ZIG_WN[iz]!;
      if (Math.abs(hz) < ZIG_KN[iz]!) return hz * wn;
      // nfix: the base strip's tail by Marsaglia's exponential method, or a wedge by rejection.
      const x = hz * wn;
      if (iz === 0) {
        let tx: number;
        let ty: number;
        do {
          tx = -Math.log(uniform()) / ZIG_R;
          ty = -Math.log(uniform());
        } while (ty + ty < tx * tx);
        return hz > 0 ? ZIG_R + tx : -ZIG_R - tx;
      }
      const fn = at(ZIG_FN, iz, 'ZIG_FN');
      if (fn + uniform() * (at(ZIG_FN, iz - 1, 'ZIG_FN') - fn) < Math.exp(-0.5 * x * x)) return x;
    }
  };
}
