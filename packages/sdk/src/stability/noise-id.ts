/**
 * Power-law noise identification by the lag-1 autocorrelation method.
 *
 * @module
 */
import { NOISE_ALPHA, type NoiseEstimate, type NoiseType, type PhaseSeries } from './types.js';
import { requireFinite } from '../internal/validate.js';

/** Fewest decimated points for which the method is attempted (Riley & Greenhall suggest ≳ 30) [M]. */
export const NOISE_ID_MIN_POINTS = 32;

/** Noise type for a rounded α in 2 … −2. */
export function noiseForAlpha(alpha: number): NoiseType {
  requireFinite('alpha', alpha, 'a finite power-law exponent α (2 … −2)');
  const entry = (Object.entries(NOISE_ALPHA) as [NoiseType, number][]).find(([, a]) => a === alpha);
  return entry ? entry[0] : alpha > 2 ? 'WPM' : 'RWFM';
}

/** Lag-1 autocorrelation of the finite values, pairs counted only within one segment. */
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
  for (let i = 0; i < z.length; i++) {
    const a = z[i]! - mean;
    if (!(a === a)) continue;
    den += a * a;
    if (i + 1 < z.length && (seg === null || seg[i] === seg[i + 1])) {
      const b = z[i + 1]! - mean;
      if (b === b) {
        num += a * b;
        pairs++;
      }
    }
  }
  if (pairs === 0 || den === 0) return { r1: 0, pairs };
  return { r1: (num / pairs) / (den / count), pairs };
}

/**
 * Identifies the dominant power-law noise at averaging factor m from phase data by the lag-1
 * autocorrelation method (W. J. Riley & C. A. Greenhall, "Power law noise identification using
 * the lag 1 autocorrelation", Proc. 18th European Frequency and Time Forum, 2004 [M]):
 *
 *   z = phase decimated by m (equivalently frequency averaged over m); d = 0
 *   repeat: r1 = lag-1 autocorrelation of z (mean removed); δ = r1/(1 + r1)
 *           if δ < 0.25 or d = dmax: stop; else z ← first difference of z, d ← d + 1
 *   α = 2 − 2(δ + d)   (phase spectrum S_x ∝ f^(α−2)); rounded to the nearest of 2 … −2
 *
 * dmax = 2. Missing samples and segment breaks remove the pairs they touch. Returns undefined
 * when fewer than {@link NOISE_ID_MIN_POINTS} decimated points (or fewer than 16 usable pairs) exist.
 * The rounded α is limited to the five supported types; `alphaEstimate` keeps the raw value.
 *
 * @param series  Phase series (seconds, NaN for missing).
 * @param m       Averaging factor τ/τ0 (≥ 1).
 */
export function identifyNoiseAt(series: PhaseSeries, seg: Int32Array | null, m: number): NoiseEstimate | undefined {
  const x = series.phase;
  const count = Math.floor((x.length - 1) / m) + 1;
  if (count < NOISE_ID_MIN_POINTS) return undefined;
  let z = new Float64Array(count);
  let s: Int32Array | null = seg === null ? null : new Int32Array(count);
  for (let k = 0; k < count; k++) {
    z[k] = x[k * m]!;
    if (s !== null) s[k] = seg![k * m]!;
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
    const next = new Float64Array(z.length - 1);
    for (let i = 0; i < next.length; i++) {
      next[i] = s !== null && s[i] !== s[i + 1] ? Number.NaN : z[i + 1]! - z[i]!;
    }
    z = next;
    if (s !== null) s = s.subarray(0, next.length);
    d++;
  }
  const alphaEstimate = 2 - 2 * (delta + d);
  const alpha = Math.max(-2, Math.min(2, Math.round(alphaEstimate))) + 0; // + 0 turns −0 into 0
  return { tau: m * series.tau0, m, alphaEstimate, alpha, noise: noiseForAlpha(alpha), r1, differences: d, points };
}
