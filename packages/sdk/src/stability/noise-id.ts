/**
 * Power-law noise identification: B1 ratio, R(n) and lag-1 autocorrelation (NIST SP 1065 §5.6).
 *
 * @module
 */

import { requireFinite } from '../internal/validate.js';
import { autocovariance, filterVariance } from './edf.js';
import { ModifiedWorkspace, modifiedSum, secondDifferenceSum } from './kernels.js';
import { NOISE_ALPHA, type NoiseEstimate, type NoiseType, type PhaseSeries } from './types.js';

/** Fewest decimated points for which the method is attempted (Riley & Greenhall suggest ≳ 30) [M]. */
export const NOISE_ID_MIN_POINTS = 32;

/** Noise type for a rounded α in 2 … −2. */
export function noiseForAlpha(alpha: number): NoiseType {
  requireFinite('alpha', alpha, 'a finite power-law exponent α (2 … −2)');
  const entry = (Object.entries(NOISE_ALPHA) as [NoiseType, number][]).find(([, a]) => a === alpha);
  return entry ? entry[0] : alpha > 2 ? 'WPM' : 'RWFM';
}

/**
 * Lag-1 autocorrelation of the finite values, pairs counted only within one segment. Hot loops
 * (indexed, not for-of: for-of over a Float64Array measured ~4× slower on Node 20): indices
 * bounded by i < z.length.
 */
function lag1(z: Float64Array, seg: Int32Array | null): { r1: number; pairs: number } {
  let mean = 0;
  let count = 0;
  for (let i = 0; i < z.length; i++) {
    const v = z[i]!;
    if (v === v) {
      mean += v;
      count++;
    }
  }
  mean /= count;
  let num = 0;
  let den = 0;
  let pairs = 0;
  // Each pair (z[i − 1], z[i]) is taken at its second element, with the previous deviation carried.
  let previous = Number.NaN; // z[i − 1] − mean; NaN before the first sample
  for (let i = 0; i < z.length; i++) {
    const b = z[i]! - mean;
    if (b === b) {
      den += b * b;
      if (previous === previous && (seg === null || seg[i - 1] === seg[i])) {
        num += previous * b;
        pairs++;
      }
    }
    previous = b;
  }
  if (pairs === 0 || den === 0) return { r1: 0, pairs };
  return { r1: num / pairs / (den / count), pairs };
}

/** Raw result of the lag-1 autocorrelation procedure at one factor. */
interface Lag1Result {
  readonly alphaEstimate: number;
  readonly r1: number;
  readonly differences: number;
  readonly points: number;
}

/**
 * The lag-1 autocorrelation procedure of W. J. Riley & C. A. Greenhall, "Power law noise
 * identification using the lag 1 autocorrelation", Proc. 18th European Frequency and Time Forum,
 * 2004 [M] (also NIST SP 1065 §5.6 [M section]):
 *
 *   z = phase decimated by m (equivalently frequency averaged over m); d = 0
 *   repeat: r1 = lag-1 autocorrelation of z (mean removed); δ = r1/(1 + r1)
 *           if δ < 0.25 or d = dmax: stop; else z ← first difference of z, d ← d + 1
 *   α = 2 − 2(δ + d)   (phase spectrum S_x ∝ f^(α−2))
 *
 * dmax = 2. Missing samples and segment breaks remove the pairs they touch. Undefined with fewer
 * than 16 usable pairs.
 */
function lag1Procedure(series: PhaseSeries, seg: Int32Array | null, m: number, count: number): Lag1Result | undefined {
  const x = series.phase;
  let z = new Float64Array(count);
  let s: Int32Array | null = seg === null ? null : new Int32Array(count);
  for (let k = 0; k < count; k++) {
    z[k] = x[k * m]!;
    if (s !== null && seg !== null) s[k] = seg[k * m]!;
  }
  const dmax = 2;
  let d = 0;
  let r1 = 0;
  let delta = 0;
  let points = count;
  for (;;) {
    const r = lag1(z, s);
    if (r.pairs < 16) return undefined;
    r1 = r.r1;
    points = r.pairs + 1;
    delta = r1 / (1 + r1);
    if (delta < 0.25 || d >= dmax) break;
    // First differences next[i − 1] = z[i] − z[i − 1], NaN across a segment break.
    const next = new Float64Array(z.length - 1);
    let before = Number.NaN;
    for (let i = 0; i < z.length; i++) {
      const v = z[i]!;
      if (i > 0) next[i - 1] = s !== null && s[i - 1] !== s[i] ? Number.NaN : v - before;
      before = v;
    }
    z = next;
    if (s !== null) s = s.subarray(0, next.length);
    d++;
  }
  return { alphaEstimate: 2 - 2 * (delta + d), r1, differences: d, points };
}

/** Rounds an α estimate to the nearest of the five supported exponents 2 … −2. */
function roundAlpha(alphaEstimate: number): number {
  return Math.max(-2, Math.min(2, Math.round(alphaEstimate))) + 0; // + 0 turns −0 into 0
}

/**
 * Identifies the dominant power-law noise at averaging factor m from phase data by combining the
 * three methods of NIST SP 1065 (Riley 2008) §5.6 [M section]:
 *
 * 1. Barnes' B1 ratio ({@link measuredB1}, {@link barnesB1}) sets μ of σ²_y(τ) ∝ τ^μ: −2 (PM),
 *    −1 (WFM), 0 (FFM), 1 (RWFM); the μ whose B1(N, μ) is nearest on a log scale wins.
 * 2. For μ = −2, white and flicker PM (which B1 cannot tell apart) are separated by
 *    R(m) = Mod σ²/σ² ({@link measuredModifiedRatio}) against its expected value for each
 *    ({@link expectedModifiedRatio}; boundary at their geometric mean), for m ≥ 2.
 * 3. The lag-1 autocorrelation ({@link lag1Procedure}) separates WPM from FPM at m = 1, where
 *    R(1) ≡ 1 carries no information; elsewhere its α estimate is reported but does not decide,
 *    because on decimated phase it is biased for flicker noise (FPM aliases towards white as m
 *    grows; the sample lag-1 correlation of FFM converges slowly), which made it call FPM "WPM"
 *    at m ≥ 100 and FFM "RWFM" at m ≈ 100. The coverage test in test/stability/coverage.test.ts
 *    measures the combination on Kasdin–Walter noise.
 *
 * All three need enough points: the method runs only with at least {@link NOISE_ID_MIN_POINTS}
 * decimated points (about 30 frequency averages, the minimum SP 1065 §5.6 gives for the lag-1
 * method [M]; B1 is also unreliable below it: 61–82 % correct at 16 averages in our simulation [C]).
 * Returns undefined below that or when one of the ratios cannot be formed (gaps, constant data).
 *
 * @param series  Phase series (seconds, NaN for missing).
 * @param seg     Segment index per sample, or null.
 * @param m       Averaging factor τ/τ0 (≥ 1).
 */
export function identifyNoiseAt(series: PhaseSeries, seg: Int32Array | null, m: number): NoiseEstimate | undefined {
  const x = series.phase;
  const count = Math.floor((x.length - 1) / m) + 1;
  if (count < NOISE_ID_MIN_POINTS) return undefined;
  const lag = lag1Procedure(series, seg, m, count);
  const b1 = measuredB1(x, seg, m);
  if (lag === undefined || b1 === undefined) return undefined;
  const mu = muFromB1(b1.ratio, b1.averages);
  let modifiedRatio: number | undefined;
  let alpha: number;
  if (mu > -2) {
    alpha = -1 - mu; // μ = −α − 1 for −3 < α < 1 (SP 1065 Table of power-law exponents [M])
  } else if (m >= 2) {
    modifiedRatio = measuredModifiedRatio(x, seg, m);
    if (modifiedRatio === undefined) return undefined;
    const boundary = Math.sqrt(expectedModifiedRatio('WPM', m) * expectedModifiedRatio('FPM', m));
    alpha = modifiedRatio < boundary ? 2 : 1;
  } else {
    alpha = roundAlpha(lag.alphaEstimate) >= 2 ? 2 : 1;
  }
  return {
    tau: m * series.tau0,
    m,
    alphaEstimate: lag.alphaEstimate,
    alpha,
    noise: noiseForAlpha(alpha),
    r1: lag.r1,
    differences: lag.differences,
    points: lag.points,
    lag1Noise: noiseForAlpha(roundAlpha(lag.alphaEstimate)),
    b1Ratio: b1.ratio,
    b1Averages: b1.averages,
    modifiedRatio,
  };
}

/**
 * Barnes' bias function B1(N, μ) = ⟨σ²(N, τ)⟩/⟨σ²(2, τ)⟩ of the N-sample variance of N
 * frequency averages to the two-sample (Allan) variance, for σ²_y(τ) ∝ τ^μ:
 *
 *   B1(N, μ) = N(1 − N^μ) / [2(N − 1)(1 − 2^μ)]   (μ ≠ 0);   B1(N, 0) = N ln N / [2(N − 1) ln 2]
 *
 * μ = −2 (WPM and FPM), −1 (WFM), 0 (FFM), 1 (RWFM).
 *
 * @see J. A. Barnes, "Tables of bias functions, B1 and B2, for variances based on finite samples of
 *   processes with power law spectral densities", NBS Technical Note 375 (1969) [M]; NIST SP 1065
 *   (2008) §5.6 (B1 noise identification) [M section].
 */
export function barnesB1(n: number, mu: number): number {
  if (mu === 0) return (n * Math.log(n)) / (2 * (n - 1) * Math.LN2);
  return (n * (1 - n ** mu)) / (2 * (n - 1) * (1 - 2 ** mu));
}

/** μ of σ²_y(τ) ∝ τ^μ for the B1 classes, in the order they are tested. */
const B1_MU = [-2, -1, 0, 1] as const;

/**
 * Measured B1 ratio at factor m: the N-sample (classical) variance of the non-overlapping frequency
 * averages ȳ_k = (x_{(k+1)m} − x_{km})/τ over the non-overlapping Allan variance of the same ȳ_k
 * (NIST SP 1065 §5.6 [M section]). Averages touching a missing sample or a segment break are left
 * out (the Allan pairs then use adjacent valid averages only). Undefined below 8 averages.
 */
export function measuredB1(
  x: Float64Array,
  seg: Int32Array | null,
  m: number,
): { ratio: number; averages: number } | undefined {
  const count = Math.floor((x.length - 1) / m);
  const y = new Float64Array(count);
  let mean = 0;
  let valid = 0;
  for (let k = 0; k < count; k++) {
    const v = x[(k + 1) * m]! - x[k * m]!;
    const ok = v === v && (seg === null || seg[k * m] === seg[(k + 1) * m]);
    y[k] = ok ? v : Number.NaN;
    if (ok) {
      mean += v;
      valid++;
    }
  }
  if (valid < 8) return undefined;
  mean /= valid;
  let classical = 0;
  let allan = 0;
  let pairs = 0;
  let previous = Number.NaN; // y[k − 1]; NaN before the first average or when it is missing
  for (let k = 0; k < count; k++) {
    const v = y[k]!; // bounded by k < count = y.length
    if (v === v) {
      classical += (v - mean) ** 2;
      if (previous === previous) {
        allan += (v - previous) ** 2;
        pairs++;
      }
    }
    previous = v;
  }
  if (pairs === 0 || allan === 0) return undefined;
  return { ratio: classical / (valid - 1) / (allan / (2 * pairs)), averages: valid };
}

/** The μ whose B1(N, μ) lies nearest the measured ratio on a log scale (boundaries at geometric means). */
export function muFromB1(ratio: number, averages: number): number {
  let best: number = B1_MU[0];
  let bestDistance = Infinity;
  for (const mu of B1_MU) {
    const d = Math.abs(Math.log(ratio / barnesB1(averages, mu)));
    if (d < bestDistance) {
      bestDistance = d;
      best = mu;
    }
  }
  return best;
}

const expectedRCache = new Map<string, number>();

/**
 * Expected R(m) = Mod σ²_y(τ)/σ²_y(τ) for a power-law noise at factor m, computed from the
 * generalised autocovariance of {@link autocovariance} (WPM gives exactly 1/m, WFM 1/2, the values
 * NIST SP 1065 §5.6 lists for R(n) [M section]; FPM with the band limit f_h = 1/(2τ0)). Our own
 * computation [C]; O(m²), cached.
 */
export function expectedModifiedRatio(noise: NoiseType, m: number): number {
  const key = `${noise}:${m}`;
  const hit = expectedRCache.get(key);
  if (hit !== undefined) return hit;
  const len = 3 * m;
  const c = new Float64Array(len);
  for (let k = 0; k < len; k++) c[k] = k < m ? 1 : k < 2 * m ? -2 : 1;
  let modified = 0;
  // Indices bounded by k + t < len = c.length.
  for (let t = 0; t < len; t++) {
    let a = 0;
    for (let k = 0; k + t < len; k++) a += c[k]! * c[k + t]!;
    modified += (t === 0 ? 1 : 2) * a * autocovariance(noise, t);
  }
  const allan = filterVariance(noise, [0, m, 2 * m], [1, -2, 1]);
  const r = modified / (m * m * allan);
  expectedRCache.set(key, r);
  return r;
}

/**
 * Measured R(m) = Mod σ²_y(τ)/σ²_y(τ) (modified over overlapping Allan variance, NIST SP 1065 §5.6
 * [M section]) at factor m ≥ 2, or undefined without enough complete terms (fewer than 8).
 */
export function measuredModifiedRatio(x: Float64Array, seg: Int32Array | null, m: number): number | undefined {
  if (m < 2) return undefined;
  const allan = secondDifferenceSum(x, seg, m, 1);
  const gaps = seg !== null || x.some((v) => !(v === v));
  const modified = modifiedSum(x, seg, m, new ModifiedWorkspace(x.length, gaps));
  if (allan.n < 8 || modified.n < 8 || allan.sum === 0) return undefined;
  return modified.sum / modified.n / (m * m) / (allan.sum / allan.n);
}
