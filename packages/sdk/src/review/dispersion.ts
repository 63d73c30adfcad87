/**
 * What the orbit-injection dispersion leaves for steering to absorb: the residual rate of the configured
 * clock across the dispersion of the semi-major axis.
 *
 * @internal
 */
import { type ConstantSet, SECONDS_PER_DAY } from '../constants.js';
import { at } from '../internal/checked.js';
import { createRandom } from '../internal/random.js';
import { normalCdf } from '../internal/special-functions.js';
import { meanRateSensitivity, offsetClockRate, type ReferenceClock } from '../relativity/rate.js';
import { rateFor } from './mistakes.js';
import type { DispersionAnalysis } from './types.js';

/** The dispersion percentiles sit at a0 + kσ for these k (±1σ, ±2σ, ±3σ and the median). */
const SIGMA_MULTIPLES = [-3, -2, -1, 0, 1, 2, 3];

/** Percentile 100·Φ(k) of a standard normal, rounded to 3 decimals as reported (Φ by the SDK's normalCdf [C]). */
function percentileAt(k: number): number {
  return Math.round(100_000 * normalCdf(k)) / 1000;
}

/** What {@link analyseDispersion} needs: the planned orbit, its 1σ dispersion, the configured offset and the limits. */
export interface DispersionCase {
  /** Planned semi-major axis and its 1σ injection dispersion, in metres. */
  readonly a0: number;
  readonly sigma: number;
  readonly set: ConstantSet;
  readonly reference: ReferenceClock;
  /**
   * Secular J2 part of the rate at a0 (j2SecularClockRate's j2Correction; 0 when the kind of a is not stated), the
   * term the expected offset includes. It scales as a⁻³ at fixed e, i and u (U_J2 and ⟨U_J2⟩ ∝ a⁻³ in its formula).
   */
  readonly j2Rate: number;
  /** Configured fractional offset. */
  readonly configured: number;
  readonly actuatorRange: number | null;
  readonly phaseTolerance: number | null;
  /** Monte Carlo draws and seed of the sampling cross-check. */
  readonly runs: number;
  readonly seed: number;
  readonly onProgress?: ((done: number) => void) | undefined;
}

/**
 * Residual rate of the configured clock across the injection dispersion: at ±3σ, the closed-form percentiles and
 * their seeded Monte Carlo cross-check, the unsteered walk-off time and whether the actuator covers it.
 */
export function analyseDispersion(c: DispersionCase): DispersionAnalysis {
  const { a0, sigma, set, reference, j2Rate, configured, actuatorRange, phaseTolerance, runs, seed, onProgress } = c;
  // In orbit the configured oscillator runs at (1 + c)(1 + r(a)) − 1 against the reference (product of the two
  // rates), evaluated without cancellation by rate.ts's offsetClockRate: the product form lost everything below ~1e-16.
  // r(a) is the rate the expected offset compensates: the mean rate plus the J2 term when it is applied.
  const rate = (a: number) => rateFor(a, set.gm, set.lG, reference) + j2Rate * (a0 / a) ** 3;
  const residual = (a: number) => offsetClockRate(configured, rate(a));
  // Unsteered phase walk-off |x(t)| = |r|·t reaches the tolerance after tol/|r| (elementary, common practice, no source).
  const days = (r: number) =>
    phaseTolerance === null
      ? null
      : r === 0
        ? Number.POSITIVE_INFINITY
        : phaseTolerance / Math.abs(r) / SECONDS_PER_DAY;
  const minus = residual(a0 - 3 * sigma);
  const nominal = residual(a0);
  const plus = residual(a0 + 3 * sigma);
  const worst = Math.max(Math.abs(minus), Math.abs(plus), Math.abs(nominal));
  // Closed form: a ~ N(a0, σ²) and residual(a) is strictly increasing in a (d/da ≈ meanRateSensitivity·(1 + c) > 0; the
  // J2 term's −3·j2Rate/a is ~1e-4 of it),
  // so the p-quantile of the residual is residual(a0 + z_p σ) (quantile of a monotone function = function of
  // the quantile; elementary probability, common practice, no source).
  const percentiles = SIGMA_MULTIPLES.map((k) => {
    const a = a0 + k * sigma;
    const r = residual(a);
    return { percentile: percentileAt(k), semiMajorAxis: a, residualFractionalRate: r, daysToPhaseTolerance: days(r) };
  });
  // Sampling cross-check of the same percentiles (one Gaussian input: it adds no information to the closed
  // form; kept so that reports keep their seeded sample and runs/seed options, and tested to agree).
  const random = createRandom(seed);
  const draws = new Float64Array(runs);
  const every = Math.max(1, Math.ceil(runs / 200));
  for (let i = 0; i < runs; i++) {
    draws[i] = a0 + sigma * random.normal();
    if (onProgress && ((i + 1) % every === 0 || i + 1 === runs)) onProgress(i + 1);
  }
  draws.sort();
  const sampled = percentiles.map(({ percentile }) => {
    const a = at(draws, Math.min(runs - 1, Math.max(0, Math.round((percentile / 100) * (runs - 1)))), 'draws');
    const r = residual(a);
    return { percentile, semiMajorAxis: a, residualFractionalRate: r, daysToPhaseTolerance: days(r) };
  });
  return {
    semiMajorAxisSigma: sigma,
    rateSensitivityPerMetre: meanRateSensitivity(a0, set.gm),
    residualAtMinus3Sigma: minus,
    residualNominal: nominal,
    residualAtPlus3Sigma: plus,
    worstResidual: worst,
    phaseToleranceSeconds: phaseTolerance,
    daysToPhaseToleranceWorst: days(worst),
    actuatorCovers: actuatorRange === null ? null : worst <= actuatorRange,
    percentiles,
    monteCarlo: { runs, seed, percentiles: sampled },
  };
}
