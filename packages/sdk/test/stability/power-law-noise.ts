/**
 * Test helper: discrete power-law phase noise by the method of N. J. Kasdin & T. Walter,
 * "Discrete simulation of power law noise", Proc. 1992 IEEE Frequency Control Symposium,
 * pp. 274–283 [M]: white Gaussian noise w_k (variance q) filtered by the fractional integrator
 * (1 − z⁻¹)^(−β/2), whose impulse response is h_0 = 1, h_k = h_{k−1}·(β/2 + k − 1)/k, giving a
 * phase spectrum S_x ∝ f^(−β) with β = 2 − α (α the exponent of S_y ∝ f^α). The convolution is
 * done with a zero-padded FFT, as in the paper; the series starts from rest (w_k = 0 for k < 0).
 *
 * Because x = h ∗ w is linear in w, the expected overlapping Allan variance of the generated
 * series is known exactly ({@link expectedOverlappingAllanVariance}): the "true" deviation
 * against which confidence intervals are scored (our own computation [C]).
 */
import { createRandom } from '../../src/internal/random.js';
import type { NoiseType } from '../../src/stability/types.js';

/** β = 2 − α of the phase spectrum S_x ∝ f^(−β) for each noise type (IEEE Std 1139 convention). */
export const PHASE_BETA: Readonly<Record<NoiseType, number>> = { WPM: 0, FPM: 1, WFM: 2, FFM: 3, RWFM: 4 };

/** Impulse response h_0..h_{n−1} of (1 − z⁻¹)^(−β/2) (Kasdin & Walter 1992, recursion for h_k [M]). */
export function kasdinWalterResponse(beta: number, n: number): Float64Array {
  const h = new Float64Array(n);
  h[0] = 1;
  for (let k = 1; k < n; k++) h[k] = (h[k - 1]! * (beta / 2 + k - 1)) / k;
  return h;
}

/** In-place iterative radix-2 complex FFT (length a power of two); sign −1 forward, +1 inverse (unscaled). */
function fft(re: Float64Array, im: Float64Array, sign: number): void {
  const n = re.length;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      [re[i], re[j]] = [re[j]!, re[i]!];
      [im[i], im[j]] = [im[j]!, im[i]!];
    }
  }
  for (let len = 2; len <= n; len <<= 1) {
    const ang = (sign * 2 * Math.PI) / len;
    const wr = Math.cos(ang);
    const wi = Math.sin(ang);
    for (let i = 0; i < n; i += len) {
      let cr = 1;
      let ci = 0;
      for (let k = 0; k < len / 2; k++) {
        const a = i + k;
        const b = a + len / 2;
        const tr = re[b]! * cr - im[b]! * ci;
        const ti = re[b]! * ci + im[b]! * cr;
        re[b] = re[a]! - tr;
        im[b] = im[a]! - ti;
        re[a] = re[a]! + tr;
        im[a] = im[a]! + ti;
        const nr = cr * wr - ci * wi;
        ci = cr * wi + ci * wr;
        cr = nr;
      }
    }
  }
}

/** A power-law noise generator for one noise type and length, reusing the filter's transform. */
export class PowerLawNoise {
  readonly noise: NoiseType;
  readonly length: number;
  readonly response: Float64Array;
  private readonly size: number;
  private readonly hRe: Float64Array;
  private readonly hIm: Float64Array;
  constructor(noise: NoiseType, length: number) {
    this.noise = noise;
    this.length = length;
    this.response = kasdinWalterResponse(PHASE_BETA[noise], length);
    let size = 1;
    while (size < 2 * length) size <<= 1;
    this.size = size;
    this.hRe = new Float64Array(size);
    this.hIm = new Float64Array(size);
    this.hRe.set(this.response);
    fft(this.hRe, this.hIm, -1);
  }

  /** One realisation of phase x_0..x_{length−1} with white-noise variance 1 (scale afterwards as needed). */
  generate(seed: number): Float64Array {
    const rng = createRandom(seed);
    const re = new Float64Array(this.size);
    const im = new Float64Array(this.size);
    for (let k = 0; k < this.length; k++) re[k] = rng.normal();
    fft(re, im, -1);
    for (let k = 0; k < this.size; k++) {
      const r = re[k]! * this.hRe[k]! - im[k]! * this.hIm[k]!;
      im[k] = re[k]! * this.hIm[k]! + im[k]! * this.hRe[k]!;
      re[k] = r;
    }
    fft(re, im, 1);
    const x = new Float64Array(this.length);
    for (let k = 0; k < this.length; k++) x[k] = re[k]! / this.size;
    return x;
  }

  /**
   * Exact expectation of the overlapping Allan variance estimator (NIST SP 1065 §5.2.4 [M section])
   * at factor m on a generated series of `length` points with τ0 = 1 s and unit white-noise
   * variance: term k (k = 0 … N−2m−1) is Δ²x_k = Σ_i g_i w_{k+2m−i}, g = h − 2h(·−m) + h(·−2m),
   * so E[(Δ²x_k)²] = Σ_{i ≤ k+2m} g_i²; averaged over k and divided by 2τ² [C].
   */
  expectedOverlappingAllanVariance(m: number): number {
    const h = this.response;
    const N = this.length;
    const terms = N - 2 * m;
    let prefix = 0;
    let total = 0;
    // E[term_k] = Σ_{i=0}^{k+2m} g_i²; accumulate the prefix sum as k grows.
    for (let i = 0; i < N; i++) {
      const g = h[i]! - 2 * (i >= m ? h[i - m]! : 0) + (i >= 2 * m ? h[i - 2 * m]! : 0);
      prefix += g * g;
      if (i >= 2 * m) total += prefix;
    }
    return total / terms / (2 * m * m);
  }
}
