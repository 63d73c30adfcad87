/**
 * {@link measurementNoiseFromPhase}: the white measurement-noise variance of a phase record from the lag-2
 * autocovariance of its second differences.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requirePhaseSample } from '../internal/validate.js';

/** Result of {@link measurementNoiseFromPhase}. */
export interface MeasurementNoiseEstimate {
  /** Estimated white-phase-noise variance σ_v², in s² (may be ≤ 0 when unresolved; see `resolved`). */
  readonly variance: number;
  /** Standard error of `variance`, in s² (Bartlett's formula). */
  readonly standardError: number;
  /** True when variance > 2·standardError (significantly above zero). */
  readonly resolved: boolean;
  /** Number of lag-2 products used. */
  readonly terms: number;
}

/**
 * Estimates the variance of white phase (measurement) noise in a phase record from the lag-2
 * autocovariance of its second differences s_k = x_{k+1} − 2x_k + x_{k−1}.
 *
 * For x = clock phase (2-state model: white FM q1, random-walk FM q2) plus independent noise v of
 * variance σ_v², s_k and s_{k+2} share only the sample x_{k+1} (coefficient 1·1), while the clock
 * part of s_k depends on the noise inside [t_{k−1}, t_{k+1}] only; so Cov(s_k, s_{k+2}) = σ_v²
 * exactly [C]. Random-walk drift noise (q3) adds q3τ0⁵/120-order terms, negligible for clocks
 * whose drift noise is invisible at τ0. Estimator: ĉ₂ = mean of (s_k − s̄)(s_{k+2} − s̄) over complete
 * pairs (NaN samples break terms; nothing is interpolated). Standard error by Bartlett's formula
 * with the sample autocovariances up to lag 4: var(ĉ₂) ≈ (1/n) Σ_{j=−4}^{4} (ĉ_j² + ĉ_{j+2} ĉ_{j−2})
 * (ĉ_h = 0 beyond lag 4).
 *
 * @param phase  Phase samples in seconds, uniformly spaced; NaN = missing.
 * @returns {@link MeasurementNoiseEstimate} (s², s²).
 * @throws {InvalidArgumentError} if phase is not an array, has ±Infinity, or has fewer than 8 complete second-difference pairs.
 * @see M. S. Bartlett (1946) via P. J. Brockwell & R. A. Davis, Time Series: Theory and Methods, 2nd ed. (1991), §7.2,
 *      Theorem 7.2.1 [M] (variance of sample autocovariances).
 */
export function measurementNoiseFromPhase(phase: ArrayLike<number>): MeasurementNoiseEstimate {
  if (!phase || typeof phase.length !== 'number')
    throw new InvalidArgumentError('phase', phase, 'an array of phases in seconds');
  const n = phase.length;
  const s = new Float64Array(Math.max(n - 2, 0));
  for (let i = 0; i < n; i++) requirePhaseSample(`phase[${i}]`, phase[i], true);
  // Indices bounded by n = phase.length and s.length = n − 2.
  for (let k = 1; k < n - 1; k++) s[k - 1] = phase[k + 1]! - 2 * phase[k]! + phase[k - 1]!;
  let sum = 0;
  let count = 0;
  for (const v of s)
    if (v === v) {
      sum += v;
      count++;
    }
  const mean = count > 0 ? sum / count : 0;
  const acov = (lag: number): { value: number; terms: number } => {
    let acc = 0;
    let terms = 0;
    for (let k = 0; k + lag < s.length; k++) {
      const a = s[k]!;
      const b = s[k + lag]!;
      if (a === a && b === b) {
        acc += (a - mean) * (b - mean);
        terms++;
      }
    }
    return { value: terms > 0 ? acc / terms : Number.NaN, terms };
  };
  const lags = [0, 1, 2, 3, 4].map(acov);
  const c2 = at(lags, 2, 'lags');
  if (c2.terms < 8)
    throw new InvalidArgumentError(
      'phase',
      `${c2.terms} complete lag-2 pairs of second differences`,
      'at least 8 (about 12 consecutive samples)',
    );
  const g = (h: number): number => (Math.abs(h) <= 4 ? at(lags, Math.abs(h), 'lags').value : 0);
  let bartlett = 0;
  for (let j = -4; j <= 4; j++) bartlett += g(j) ** 2 + g(j + 2) * g(j - 2);
  const standardError = Math.sqrt(Math.max(bartlett, 0) / c2.terms);
  return { variance: c2.value, standardError, resolved: c2.value > 2 * standardError, terms: c2.terms };
}
