/**
 * Public entry points of the stability module: single statistics, noise identification and
 * the full analysis with confidence intervals.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { requireInRange, requireInteger, requireOptions } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import { chiSquareInterval, equivalentDegreesOfFreedom } from './edf.js';
import {
  hasMissing,
  ModifiedWorkspace,
  modifiedSum,
  secondDifferenceSum,
  segmentIndex,
  type TermSum,
  thirdDifferenceSum,
  totalSum,
} from './kernels.js';
import { identifyNoiseAt } from './noise-id.js';
import { factorsForTaus, octaveFactors, phaseSeriesForReading } from './series.js';
import {
  type DeviationPoint,
  NOISE_ALPHA,
  type NoiseEstimate,
  type NoiseSource,
  type NoiseType,
  type PhaseSeries,
  STATISTIC_NAMES,
  type StabilityAnalysis,
  type StabilityData,
  type StabilityRow,
  type StatisticEstimate,
  type StatisticName,
} from './types.js';

/**
 * Largest averaging factor with at least one term for a statistic on N phase points:
 * adev (N−1)/2, oadev (N−1)/2, mdev/tdev N/3, hdev/ohdev (N−1)/3, totdev (N−1)/2 (τ ≤ T/2).
 */
export function maxAveragingFactor(statistic: StatisticName, phasePoints: number): number {
  requireStatistic('statistic', statistic);
  const N = requireInteger('phasePoints', phasePoints, 0);
  switch (statistic) {
    case 'adev':
    case 'oadev':
    case 'totdev':
      return Math.floor((N - 1) / 2);
    case 'mdev':
    case 'tdev':
      return Math.floor(N / 3);
    case 'hdev':
    case 'ohdev':
      return Math.floor((N - 1) / 3);
  }
}

function requireStatistic(argument: string, value: unknown): StatisticName {
  if (!STATISTIC_NAMES.includes(value as StatisticName)) {
    throw new InvalidArgumentError(argument, value, `one of ${STATISTIC_NAMES.join(', ')}`);
  }
  return value as StatisticName;
}

/** Per-series state shared by the statistics at every τ. */
class Prepared {
  readonly series: PhaseSeries;
  readonly seg: Int32Array | null;
  readonly gaps: boolean;
  private _ws: ModifiedWorkspace | undefined;
  constructor(series: PhaseSeries) {
    this.series = series;
    this.seg = segmentIndex(series.phase.length, series.segmentStarts);
    this.gaps = this.seg !== null || hasMissing(series.phase);
  }
  private _lastModified: { m: number; r: TermSum } | undefined;
  /** Modified-Allan sum at m, cached for the last m so that mdev and tdev share one pass. */
  modified(m: number): TermSum {
    if (this._lastModified?.m !== m) {
      this._ws ??= new ModifiedWorkspace(this.series.phase.length, this.gaps);
      this._lastModified = { m, r: modifiedSum(this.series.phase, this.seg, m, this._ws) };
    }
    return this._lastModified.r;
  }
}

/** One statistic at one m, or undefined when no complete term exists. */
function computeAt(p: Prepared, statistic: StatisticName, m: number): DeviationPoint | undefined {
  const x = p.series.phase;
  const N = x.length;
  if (m > maxAveragingFactor(statistic, N)) return undefined;
  const tau = m * p.series.tau0;
  let variance: number;
  let n: number;
  switch (statistic) {
    case 'adev':
    case 'oadev': {
      // NIST SP 1065 §5.2.2 (non-overlapping) / §5.2.4 (overlapping): σ² = Σ(Δ²x)²/(2τ²n) [M section; reproduced against SP 1065 test data, C].
      const r = secondDifferenceSum(x, p.seg, m, statistic === 'adev' ? m : 1);
      n = r.n;
      variance = r.sum / (2 * tau * tau * n);
      break;
    }
    case 'mdev':
    case 'tdev': {
      // NIST SP 1065 §5.2.5: Mod σ² = Σ_j [Σ_i Δ²x]² / (2 m² τ² n); §5.2.6: σ_x = (τ/√3)·Mod σ_y [M section; reproduced against SP 1065 test data, C].
      const r = p.modified(m);
      n = r.n;
      variance = r.sum / (2 * m * m * tau * tau * n);
      if (statistic === 'tdev') variance *= (tau * tau) / 3;
      break;
    }
    case 'hdev':
    case 'ohdev': {
      // NIST SP 1065 §5.2.7 / §5.2.8: Hσ² = Σ(Δ³x)²/(6τ²n) [M section; reproduced against SP 1065 test data, C].
      const r = thirdDifferenceSum(x, p.seg, m, statistic === 'hdev' ? m : 1);
      n = r.n;
      variance = r.sum / (6 * tau * tau * n);
      break;
    }
    case 'totdev': {
      if (p.gaps) {
        throw new InvalidArgumentError(
          'data',
          'a series with missing samples',
          'gap-free for totdev (its reflected extension is built from the whole record)',
          'use oadev/mdev/ohdev, which use complete terms only, or analyse the gap-free stretches separately',
        );
      }
      // NIST SP 1065 §5.2.11: Tot σ² = Σ (x*_{i−m} − 2x*_i + x*_{i+m})² / (2τ²(N−2)) [M section; reproduced against SP 1065 test data, C].
      const r = totalSum(x, m);
      n = r.n;
      variance = r.sum / (2 * tau * tau * n);
      break;
    }
  }
  if (n < 1) return undefined;
  return { tau, m, deviation: Math.sqrt(variance), n };
}

function resolveFactors(
  series: PhaseSeries,
  statistics: readonly StatisticName[],
  taus: readonly Seconds[] | undefined,
): number[] {
  if (taus !== undefined) return factorsForTaus(taus, series.tau0);
  const maxM = Math.max(...statistics.map((s) => maxAveragingFactor(s, series.phase.length)));
  return maxM >= 1 ? octaveFactors(maxM) : [];
}

/** Options of {@link deviations}. */
export interface DeviationOptions {
  /** Averaging times in seconds, each a whole multiple of τ0. Default: octaves τ0·2^k while a term exists. */
  readonly taus?: readonly Seconds[];
}

/**
 * One stability statistic at several averaging times, without confidence intervals.
 *
 * Statistics (x phase in s, τ = m·τ0, sums over complete terms, n = number of terms; NIST SP 1065 §5.2 [M section; reproduced against SP 1065 test data, C]):
 * - adev:  σ² = Σ (x_{k+2m} − 2x_{k+m} + x_k)² / (2τ²n), k = 0, m, 2m, … (non-overlapping)
 * - oadev: same sum over every k (overlapping)
 * - mdev:  σ² = Σ_j [Σ_{i=j}^{j+m−1} (x_{i+2m} − 2x_{i+m} + x_i)]² / (2m²τ²n)
 * - tdev:  σ_x = (τ/√3)·mdev, in seconds
 * - hdev:  σ² = Σ (x_{k+3m} − 3x_{k+2m} + 3x_{k+m} − x_k)² / (6τ²n), k = 0, m, … ; ohdev: every k
 * - totdev: σ² = Σ_{i=2}^{N−1} (x*_{i−m} − 2x*_i + x*_{i+m})² / (2τ²(N−2)), x* reflected at both ends
 *
 * Gaps (NaN samples, or breaks from missing frequency values): adev, oadev, mdev, tdev, hdev and
 * ohdev use complete terms only and report the reduced n; totdev rejects data with gaps. A τ
 * with no complete term (or beyond the statistic's largest m, see {@link maxAveragingFactor})
 * is dropped from the result. Cost O(N) per τ (mdev/tdev through prefix sums).
 *
 * @param statistic  Which statistic.
 * @param data       `{ phase, tau0 }` (s) or `{ frequency, tau0 }` (dimensionless), NaN = missing.
 * @param options    Optional τ list.
 * @returns One point per usable τ: `{ tau, m, deviation, n }` (deviation dimensionless; seconds for tdev).
 * @throws {InvalidArgumentError} for a bad statistic name, bad data, a τ that is not m·τ0, or totdev with gaps.
 * @see W. J. Riley, Handbook of Frequency Stability Analysis, NIST SP 1065 (2008), §5.2 [M section; formulas reproduced against the SP 1065 test data, C].
 */
export function deviations(
  statistic: StatisticName,
  data: StabilityData,
  options: DeviationOptions = {},
): DeviationPoint[] {
  requireStatistic('statistic', statistic);
  requireOptions('options', options);
  const p = new Prepared(phaseSeriesForReading(data));
  const out: DeviationPoint[] = [];
  for (const m of resolveFactors(p.series, [statistic], options.taus)) {
    const point = computeAt(p, statistic, m);
    if (point) out.push(point);
  }
  return out;
}

/**
 * Power-law noise identification at several averaging times by B1, R(n) and the lag-1
 * autocorrelation (see {@link identifyNoiseAt} for the combination). τ with too few points are omitted.
 *
 * @param data     `{ phase, tau0 }` or `{ frequency, tau0 }`, NaN = missing.
 * @param options  Optional τ list (default octaves up to (N − 1)/2).
 * @returns One estimate per τ where the method applies.
 * @throws {InvalidArgumentError} for bad data or a τ that is not m·τ0.
 * @see W. J. Riley, NIST SP 1065 (2008) §5.6 [M section]; W. J. Riley & C. A. Greenhall, "Power law noise identification using the lag 1 autocorrelation", 18th EFTF (2004) [M].
 */
export function identifyNoise(data: StabilityData, options: DeviationOptions = {}): NoiseEstimate[] {
  requireOptions('options', options);
  const p = new Prepared(phaseSeriesForReading(data));
  const out: NoiseEstimate[] = [];
  for (const m of resolveFactors(p.series, ['oadev'], options.taus)) {
    const e = identifyNoiseAt(p.series, p.seg, m);
    if (e) out.push(e);
  }
  return out;
}

/** Options of {@link analyzeStability}. */
export interface StabilityOptions extends DeviationOptions {
  /** Statistics to compute. Default `['oadev', 'mdev', 'tdev', 'ohdev']`. */
  readonly statistics?: readonly StatisticName[];
  /** Two-sided confidence level of the intervals, in (0, 1). Default {@link ONE_SIGMA_CONFIDENCE} (±1σ). */
  readonly confidence?: number;
  /** Stated noise type for every τ; when absent it is identified per τ (B1, R(n), lag-1; see {@link identifyNoiseAt}). */
  readonly noise?: NoiseType;
}

/** Probability inside ±1σ of a normal distribution, erf(1/√2) ≈ 0.6827 (computed [C]): the default confidence level. */
export const ONE_SIGMA_CONFIDENCE = 0.6826894921370859;

/** Default statistics of {@link analyzeStability} and the CLI. */
export const DEFAULT_STATISTICS: readonly StatisticName[] = ['oadev', 'mdev', 'tdev', 'ohdev'];

/**
 * Stability analysis: the requested statistics at every τ, each with its number of terms,
 * equivalent degrees of freedom and chi-square confidence interval, and the noise type used.
 *
 * Noise per τ: the stated `noise` if given (source `stated`); else the identification at that τ
 * by B1, R(n) and the lag-1 autocorrelation ({@link identifyNoiseAt}, NIST SP 1065 §5.6; `identified`); where too few points remain for it, the type identified
 * at the nearest shorter τ (`carried-from-shorter-tau`); when no τ could be identified at all
 * (series shorter than 32 points), white FM (`default-wfm`). The edf model of each statistic is
 * described at {@link equivalentDegreesOfFreedom}; intervals by {@link chiSquareInterval}.
 *
 * Rows: one per τ (default octaves while any requested statistic has a term); a statistic
 * without complete terms at a τ is absent from that row; a τ with no statistic at all is listed
 * in `droppedTaus`. Gaps: see {@link deviations}.
 *
 * @param data     `{ phase, tau0 }` (s) or `{ frequency, tau0 }` (dimensionless), NaN = missing.
 * @param options  Statistics, τ list, confidence level, stated noise type.
 * @returns The analysis (τ in seconds; deviations dimensionless, tdev in seconds).
 * @throws {InvalidArgumentError} for bad data, an unknown statistic or noise type, a τ that is not
 *   m·τ0, confidence outside (0, 1), or totdev requested on data with gaps.
 * @see W. J. Riley, NIST SP 1065 (2008), §5.2 (statistics) and §5.3 (confidence intervals) [M section].
 */
export function analyzeStability(data: StabilityData, options: StabilityOptions = {}): StabilityAnalysis {
  requireOptions('options', options);
  const series = phaseSeriesForReading(data);
  const statistics = options.statistics ?? DEFAULT_STATISTICS;
  if (!Array.isArray(statistics) || statistics.length === 0) {
    throw new InvalidArgumentError(
      'options.statistics',
      statistics,
      `a non-empty list of ${STATISTIC_NAMES.join(', ')}`,
    );
  }
  statistics.forEach((s, i) => {
    requireStatistic(`options.statistics[${i}]`, s);
  });
  const stats = STATISTIC_NAMES.filter((s) => statistics.includes(s));
  const confidence = options.confidence ?? ONE_SIGMA_CONFIDENCE;
  requireInRange('options.confidence', confidence, 0, 1, { minExclusive: true, maxExclusive: true });
  if (confidence === 0)
    throw new InvalidArgumentError('options.confidence', confidence, 'in (0, 1), e.g. 0.6827 or 0.95');
  if (
    options.noise !== undefined &&
    !(typeof options.noise === 'string' && Object.hasOwn(NOISE_ALPHA, options.noise))
  ) {
    throw new InvalidArgumentError('options.noise', options.noise, 'one of WPM, FPM, WFM, FFM, RWFM');
  }
  const isFrequency = 'frequency' in data && (data as { frequency?: unknown }).frequency !== undefined;
  const p = new Prepared(series);
  if (stats.includes('totdev') && p.gaps) computeAt(p, 'totdev', 1); // throws the documented error up front
  const N = series.phase.length;
  let missing = 0;
  for (let i = 0; i < N; i++) if (series.phase[i] !== series.phase[i]) missing++;
  missing += series.segmentStarts.length;

  const rows: StabilityRow[] = [];
  const droppedTaus: Seconds[] = [];
  let lastIdentified: NoiseEstimate | undefined;
  for (const m of resolveFactors(series, stats, options.taus)) {
    const points = new Map<StatisticName, DeviationPoint>();
    for (const s of stats) {
      const point = computeAt(p, s, m);
      if (point) points.set(s, point);
    }
    if (points.size === 0) {
      droppedTaus.push(m * series.tau0);
      continue;
    }
    let noise: NoiseType;
    let noiseSource: NoiseSource;
    let noiseEstimate: NoiseEstimate | undefined;
    if (options.noise !== undefined) {
      noise = options.noise;
      noiseSource = 'stated';
    } else {
      noiseEstimate = identifyNoiseAt(series, p.seg, m);
      if (noiseEstimate) {
        lastIdentified = noiseEstimate;
        noise = noiseEstimate.noise;
        noiseSource = 'identified';
      } else if (lastIdentified) {
        noise = lastIdentified.noise;
        noiseSource = 'carried-from-shorter-tau';
      } else {
        noise = 'WFM';
        noiseSource = 'default-wfm';
      }
    }
    const estimates: Partial<Record<StatisticName, StatisticEstimate>> = {};
    for (const [s, point] of points) {
      const { edf, model } = equivalentDegreesOfFreedom(s, noise, N, m, point.n);
      const { low, high } = chiSquareInterval(point.deviation, edf, confidence);
      estimates[s] = { ...point, edf, edfModel: model, low, high };
    }
    rows.push({
      tau: m * series.tau0,
      m,
      noise,
      alpha: NOISE_ALPHA[noise],
      noiseSource,
      noiseEstimate,
      statistics: estimates,
    });
  }
  return {
    input: {
      kind: isFrequency ? 'frequency' : 'phase',
      samples: isFrequency ? N - 1 : N,
      phasePoints: N,
      missing,
      tau0: series.tau0,
      unitNote: 'deviations are dimensionless fractional frequency; tdev is in seconds',
    },
    confidence,
    statistics: stats,
    rows,
    droppedTaus,
  };
}
