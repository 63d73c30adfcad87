/**
 * {@link characterizeClock}: a clock's phase record in; its polynomial model (af0/af1/af2) with
 * uncertainties under its own noise, its diffusion coefficients q1/q2(/q3) from the stability of the
 * residuals, and a Kalman pass with declared outliers and jumps out. Declared jumps are taken out of
 * the record ({@link correctPhaseJumps}) and the characterisation repeated, up to `maxPasses` times.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at, last } from '../internal/checked.js';
import {
  MAX_ABS_PHASE_SECONDS,
  MEASUREMENT_VARIANCE_RANGE,
  requireInRange,
  requireInteger,
  requireObject,
  requireOptions,
  requirePhaseSample,
  requirePositive,
} from '../internal/validate.js';
import { analyzeStability } from '../stability/analyze.js';
import type { Instant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import {
  diffusionFromStabilityRows,
  type MeasurementNoiseEstimate,
  measurementNoiseFromPhase,
  type StabilityRowsFit,
} from './from-stability.js';
import type { ClockDetectionSettings } from './kalman.js';
import { runClockFilter } from './kalman-run.js';
import type { DetectedJump } from './kalman-types.js';
import type { ClockStates } from './noise.js';
import { type ClockPhaseSeries, type ClockPolynomial, fitClockPolynomial } from './polynomial.js';
import { type PolynomialNoiseCovariance, polynomialNoiseCovariance } from './polynomial-noise.js';
import { requireSeriesEpoch } from './series-epoch.js';

/** A phase record: samples at `t` seconds after `epoch`. */
export interface ClockPhaseRecord {
  /** Measured phase (clock − reference), in seconds; NaN marks a missing sample. */
  readonly phase: ArrayLike<number>;
  /** Sample epochs, in seconds since `epoch`, strictly increasing. */
  readonly t: ArrayLike<number>;
  /** Nominal sample spacing τ0, in seconds (the averaging-time unit of the stability analysis). */
  readonly tau0: Seconds;
  /** The instant of t = 0 (required); `t`, the reference epoch and predictions are seconds since it. */
  readonly epoch: Instant;
}

/** Options of {@link characterizeClock}. */
export interface ClockCharacterizationOptions {
  /** Polynomial degree: 1 (af0, af1) or 2 (af0, af1, af2); default 2. */
  readonly degree?: 1 | 2;
  /** Reference epoch t_oc of the coefficients, in the record's seconds; default the first valid sample's epoch. */
  readonly referenceTime?: Seconds;
  /** Noise model: 2 (q1, q2 from OADEV) or 3 (q1, q2, q3 from OHDEV); default 2. */
  readonly states?: ClockStates;
  /** White measurement noise 1σ of the phase, in seconds (> 0); default estimated from the record. */
  readonly measurementSigma?: Seconds;
  /** Epochs (record seconds, each ≥ the last sample epoch) at which to predict the phase with its 1σ. */
  readonly predict?: readonly Seconds[];
  /** Most characterisation passes (1..10, default 3): a pass that declares no jump or outlier ends the loop. */
  readonly maxPasses?: number;
  /** Called after each pass with its number (1-based), e.g. for a progress bar. */
  readonly onPass?: (pass: number) => void;
}

/** The measurement-noise variances used, in s², and where they come from. */
export interface ClockMeasurementNoise {
  /** Variance assumed by the noise fit and the polynomial uncertainty, in s². */
  readonly varianceInNoiseFit: number;
  /** Standard error of `varianceInNoiseFit`, in s² (0 when given or unresolved). */
  readonly varianceInNoiseFitStd: number;
  /** Variance R of the Kalman filter's measurements, in s². */
  readonly filterVariance: number;
  /** `given`, `estimated`, or `unresolved (…)` (the fit then assumes 0 and the filter the 2σ upper bound). */
  readonly source: string;
  /** The lag-2 estimate (absent when σ was given). */
  readonly estimate?: MeasurementNoiseEstimate;
}

/** A sample declared an outlier by the Kalman pass. */
export interface RejectedClockSample {
  /** Sample index in the record. */
  readonly index: number;
  /** Its epoch, in the record's seconds. */
  readonly t: Seconds;
  /** Its innovation, in seconds. */
  readonly innovation: Seconds;
  /** Its normalised innovation squared. */
  readonly nis: number;
}

/** What one pass declared. */
export interface ClockPassEvents {
  /** Pass number, 1-based. */
  readonly pass: number;
  readonly jumps: readonly DetectedJump[];
  readonly rejected: readonly RejectedClockSample[];
}

/** Result of {@link characterizeClock}; the model, noise and filter are those of the last pass. */
export interface ClockCharacterization {
  /** The record's epoch: the instant of t = 0. */
  readonly epoch: Instant;
  /** Reference epoch t_oc of the polynomial, in seconds since `epoch`. */
  readonly referenceTime: Seconds;
  /** Reference epoch t_oc of the polynomial as an instant: `epoch.plus(referenceTime)`. */
  readonly referenceEpoch: Instant;
  readonly measurementNoise: ClockMeasurementNoise;
  /** The least-squares polynomial of the last pass. */
  readonly polynomial: ClockPolynomial;
  /** Its coefficient and prediction uncertainties under the fitted clock noise plus measurement noise. */
  readonly polynomialNoise: PolynomialNoiseCovariance;
  /** q1, q2(, q3) fitted to the OADEV (OHDEV for 3 states) of the residuals. */
  readonly noise: StabilityRowsFit;
  /** The Kalman pass of the last pass. */
  readonly filter: {
    readonly states: ClockStates;
    readonly jumps: readonly DetectedJump[];
    readonly rejected: readonly RejectedClockSample[];
    readonly nisSummary: {
      readonly mean: number;
      readonly count: number;
      readonly low: number;
      readonly high: number;
      readonly confidence: number;
    };
    readonly detection: ClockDetectionSettings;
  };
  /** Samples used by the polynomial fit of the last pass (present and not rejected). */
  readonly samplesUsed: number;
  /** Jumps and outliers declared by every pass, in order. */
  readonly passes: readonly ClockPassEvents[];
}

/**
 * The measurement-noise variances, in s²: given σ → σ² for both the noise fit and the filter; an
 * estimate significantly above zero → the estimate for both; otherwise the fit assumes 0 and the filter
 * takes the 2σ upper bound max(σ̂², 0) + 2·SE (common practice, no source).
 */
export function clockMeasurementNoise(
  sigma: Seconds | undefined,
  estimate: MeasurementNoiseEstimate | undefined,
): ClockMeasurementNoise {
  if (sigma !== undefined) {
    // σ² must be a measurement variance the filter accepts.
    const sd = requireInRange(
      'sigma',
      sigma,
      Math.sqrt(MEASUREMENT_VARIANCE_RANGE.min),
      Math.sqrt(MEASUREMENT_VARIANCE_RANGE.max),
      { unit: 's' },
    );
    return { varianceInNoiseFit: sd ** 2, varianceInNoiseFitStd: 0, filterVariance: sd ** 2, source: 'given' };
  }
  if (estimate === undefined)
    throw new InvalidArgumentError(
      'estimate',
      estimate,
      'a measurement-noise estimate (measurementNoiseFromPhase) when no σ is given',
    );
  requireObject('estimate', estimate, 'a measurement-noise estimate (measurementNoiseFromPhase)');
  requireInRange(
    'estimate.variance',
    estimate.variance,
    -MEASUREMENT_VARIANCE_RANGE.max,
    MEASUREMENT_VARIANCE_RANGE.max,
    { unit: 's²' },
  );
  requireInRange('estimate.standardError', estimate.standardError, 0, MEASUREMENT_VARIANCE_RANGE.max, { unit: 's²' });
  if (typeof estimate.resolved !== 'boolean')
    throw new InvalidArgumentError('estimate.resolved', estimate.resolved, 'true or false');
  if (estimate.resolved) {
    return {
      varianceInNoiseFit: estimate.variance,
      varianceInNoiseFitStd: estimate.standardError,
      filterVariance: estimate.variance,
      source: 'estimated',
      estimate,
    };
  }
  return {
    varianceInNoiseFit: 0,
    varianceInNoiseFitStd: 0,
    filterVariance: Math.max(estimate.variance, 0) + 2 * estimate.standardError,
    source: 'unresolved (filter uses the 2σ upper bound; noise fit assumes 0)',
    estimate,
  };
}

/** The events {@link correctPhaseJumps} takes out of a record, as a filter pass declared them. */
export interface DeclaredClockEvents {
  /** Declared jumps (`updateIndex` a sample index of the record, `epoch` in the record's seconds). */
  readonly jumps: readonly DetectedJump[];
  /** Indices of samples declared outliers. */
  readonly rejected: readonly number[];
}

/** A phase series on its epoch, as {@link correctPhaseJumps} returns it. */
export interface CorrectedPhaseSeries {
  /** The instant of t = 0 (the input's). */
  readonly epoch: Instant;
  /** Epochs, in seconds since `epoch` (the input's values, copied). */
  readonly t: Float64Array;
  /** Corrected phase, in seconds; NaN missing or rejected. */
  readonly phase: Float64Array;
}

/**
 * A phase record with declared events taken out: from each jump's update sample on, a phase jump ν̂
 * is subtracted (x − ν̂) and a frequency jump as the ramp ν̂·(t − θ) from its epoch θ (the GLR jump
 * models of Willsky & Jones, IEEE TAC 21(1) 1976 [V2]); rejected samples become NaN (missing).
 * @param series   `epoch` (Instant of t = 0), `t` (seconds since it, the jumps' `epoch` axis) and `phase`
 *                 (seconds, NaN missing), one per epoch.
 * @param events   Declared jumps and rejected sample indices.
 * @returns A new series on the same epoch; the input is not changed.
 * @throws {InvalidArgumentError} naming the field for a missing epoch, mismatched lengths, a bad sample,
 *   or a jump or rejected index outside the record.
 */
export function correctPhaseJumps(series: ClockPhaseSeries, events: DeclaredClockEvents): CorrectedPhaseSeries {
  if (typeof series !== 'object' || series === null)
    throw new InvalidArgumentError('series', series, 'an object { epoch, t, phase }');
  const epoch = requireSeriesEpoch('series.epoch', series.epoch);
  requireObject('events', events, 'an object { jumps, rejected }');
  const { phase, t } = series;
  if (!phase || typeof phase.length !== 'number')
    throw new InvalidArgumentError('series.phase', phase, 'an array of phases in seconds (NaN missing)');
  if (!t || t.length !== phase.length)
    throw new InvalidArgumentError('series.t', t, `${phase.length} epochs in seconds (one per phase sample)`);
  const { jumps, rejected } = events;
  if (!Array.isArray(jumps)) throw new InvalidArgumentError('events.jumps', jumps, 'an array of detected jumps');
  if (!Array.isArray(rejected))
    throw new InvalidArgumentError('events.rejected', rejected, 'an array of sample indices');
  const out = new Float64Array(phase.length);
  const times = new Float64Array(phase.length);
  for (let k = 0; k < out.length; k++) {
    out[k] = requirePhaseSample(`series.phase[${k}]`, phase[k], true);
    times[k] = requirePhaseSample(`series.t[${k}]`, t[k], false);
  }
  for (const [i, j] of jumps.entries()) {
    const name = `events.jumps[${i}]`;
    requireObject(name, j, 'a detected jump { kind, size, epoch, updateIndex }');
    if (j.kind !== 'phase' && j.kind !== 'frequency')
      throw new InvalidArgumentError(`${name}.kind`, j.kind, '"phase" or "frequency"');
    requireInteger(`${name}.updateIndex`, j.updateIndex, 0, out.length - 1);
    requireInRange(`${name}.size`, j.size, -MAX_ABS_PHASE_SECONDS, MAX_ABS_PHASE_SECONDS, {
      unit: j.kind === 'phase' ? 's' : '(fractional frequency)',
    });
    requirePhaseSample(`${name}.epoch`, j.epoch, false);
    const after = out.subarray(j.updateIndex);
    const afterTimes = times.subarray(j.updateIndex);
    for (const [k, x] of after.entries()) {
      after[k] = x - (j.kind === 'phase' ? j.size : j.size * (at(afterTimes, k, 't') - j.epoch));
    }
  }
  for (const [i, k] of rejected.entries())
    out[requireInteger(`events.rejected[${i}]`, k, 0, out.length - 1)] = Number.NaN;
  return { epoch, t: times, phase: out };
}

interface PassSettings {
  readonly degree: 1 | 2;
  readonly referenceTime: Seconds;
  readonly states: ClockStates;
  readonly noise: ClockMeasurementNoise;
  readonly predict: readonly Seconds[];
}

/** The present samples and their epochs. */
function presentSamples(phase: ArrayLike<number>, t: ArrayLike<number>): { tv: Float64Array; zv: Float64Array } {
  let used = 0;
  for (let k = 0; k < phase.length; k++) if (phase[k] === phase[k]) used += 1;
  const tv = new Float64Array(used);
  const zv = new Float64Array(used);
  for (let k = 0, i = 0; k < phase.length; k++) {
    const z = phase[k]!;
    if (z !== z) continue;
    tv[i] = t[k]!;
    zv[i++] = z;
  }
  return { tv, zv };
}

/** One characterisation pass on a (corrected) phase series. */
function characterizePass(
  phase: ArrayLike<number>,
  t: ArrayLike<number>,
  tau0: Seconds,
  epoch: Instant,
  s: PassSettings,
) {
  const { tv, zv } = presentSamples(phase, t);
  const polynomial = fitClockPolynomial(
    { epoch, t: tv, phase: zv },
    { degree: s.degree, referenceTime: s.referenceTime },
  );
  const residual = new Float64Array(phase.length).fill(Number.NaN);
  for (let k = 0, i = 0; k < phase.length; k++)
    if (phase[k] === phase[k]) residual[k] = at(polynomial.residuals, i++, 'polynomial.residuals');
  const statistic = s.states === 3 ? 'ohdev' : 'oadev';
  const analysis = analyzeStability({ phase: residual, tau0 }, { statistics: [statistic] });
  const noise = diffusionFromStabilityRows(analysis.rows, {
    states: s.states,
    measurementVariance: s.noise.varianceInNoiseFit,
    measurementVarianceStd: s.noise.varianceInNoiseFitStd,
  });
  const polynomialNoise = polynomialNoiseCovariance(
    { epoch, t: tv },
    {
      degree: s.degree,
      referenceTime: s.referenceTime,
      q: noise.q,
      measurementVariance: s.noise.varianceInNoiseFit,
      predict: s.predict,
    },
  );
  const run = runClockFilter({ epoch, phase, t, variance: s.noise.filterVariance }, { q: noise.q, states: s.states });
  if (run.detection === undefined) throw new RangeError('runClockFilter reports its detection settings');
  // Keep only what is reported, so that a pass's per-epoch arrays are freed before the next pass.
  const filter = {
    states: run.states,
    jumps: run.jumps,
    nisSummary: run.nisSummary,
    detection: run.detection,
    rejected: run.rejected.map((k) => ({
      index: k,
      t: at(t, k, 't'),
      innovation: at(run.innovation, k, 'innovation'),
      nis: at(run.nis, k, 'nis'),
    })),
  };
  return { polynomial, noise, polynomialNoise, filter, samplesUsed: tv.length };
}

/**
 * Characterises a clock from its phase record, each step a published method:
 * 1. measurement noise σ_v: `measurementSigma`, or the lag-2 autocovariance of the second differences
 *    ({@link measurementNoiseFromPhase}; see {@link clockMeasurementNoise} when it is not resolved);
 * 2. least-squares polynomial ({@link fitClockPolynomial}) → OADEV/OHDEV of the residuals (NIST SP 1065)
 *    → q1, q2(, q3) ({@link diffusionFromStabilityRows}, Zucca & Tavella 2005 variance forms) → polynomial
 *    uncertainties under that noise ({@link polynomialNoiseCovariance}) → Kalman pass with GLR outlier and
 *    jump detection ({@link runClockFilter}, Willsky & Jones 1976);
 * 3. while a pass declares jumps or outliers (and fewer than `maxPasses` ran): the record is corrected by
 *    them ({@link correctPhaseJumps}) and step 2 repeated. The reported model is the last pass's.
 *
 * @param record  Epoch (Instant of t = 0), phase (s, NaN missing), epochs (s since it), τ0 (s).
 * @param options Degree, reference epoch, states, measurement σ, prediction epochs, passes.
 * @throws {InvalidArgumentError} naming the field for a bad record or option (e.g. `phase` for a record too
 *   short for the noise estimate, `predict[i]` for an epoch before the last sample).
 * @see D. W. Allan et al., NIST SP 1065 (2008) [V2]; G. Zucca & P. Tavella, IEEE TUFFC 52(2) (2005) [V2].
 */
export function characterizeClock(
  record: ClockPhaseRecord,
  options: ClockCharacterizationOptions = {},
): ClockCharacterization {
  requireOptions('options', options);
  if (typeof record !== 'object' || record === null)
    throw new InvalidArgumentError('record', record, 'an object { epoch, phase, t, tau0 }');
  const { phase, t } = record;
  if (!phase || typeof phase.length !== 'number')
    throw new InvalidArgumentError('record.phase', phase, 'an array of phases in seconds');
  if (!t || t.length !== phase.length)
    throw new InvalidArgumentError('record.t', t, `${phase.length} epochs in seconds (one per phase sample)`);
  const epoch = requireSeriesEpoch('record.epoch', record.epoch);
  const tau0 = requirePositive('record.tau0', record.tau0, 's');
  // Every sample is checked here, before the first pass reads it (NaN marks a missing one).
  for (const [i, v] of Array.from(phase).entries()) {
    if (typeof v !== 'number' || !(Math.abs(v) <= MAX_ABS_PHASE_SECONDS || v !== v))
      requirePhaseSample(`record.phase[${i}]`, v, true);
  }
  const firstValid = Array.from(phase).findIndex((v) => !Number.isNaN(v));
  if (firstValid < 0)
    throw new InvalidArgumentError('record.phase', phase, 'at least one phase sample that is not NaN');
  const referenceTime = options.referenceTime ?? at(t, firstValid, 'record.t');
  const predict = options.predict ?? [];
  const lastT = last(t, 'record.t');
  for (const [j, p] of predict.entries()) {
    if (!(p >= lastT))
      throw new InvalidArgumentError(`predict[${j}]`, p, `an epoch at or after the last sample epoch ${lastT} s`);
  }
  const maxPasses = requireInteger('options.maxPasses', options.maxPasses ?? 3, 1, 10);
  if (options.measurementSigma !== undefined) {
    requireInRange(
      'options.measurementSigma',
      options.measurementSigma,
      Math.sqrt(MEASUREMENT_VARIANCE_RANGE.min),
      Math.sqrt(MEASUREMENT_VARIANCE_RANGE.max),
      { unit: 's' },
    );
  }
  const estimate = options.measurementSigma === undefined ? measurementNoiseFromPhase(phase) : undefined;
  const noise = clockMeasurementNoise(options.measurementSigma, estimate);
  const settings: PassSettings = {
    degree: options.degree ?? 2,
    referenceTime,
    states: options.states ?? 2,
    noise,
    predict,
  };
  const passes: ClockPassEvents[] = [];
  let current: ArrayLike<number> = phase;
  let result = characterizePass(current, t, tau0, epoch, settings);
  for (let pass = 1; pass <= maxPasses; pass++) {
    options.onPass?.(pass);
    const f = result.filter;
    // Only declared events are corrected: jumps at the stated false-alarm rate, declared outliers.
    passes.push({ pass, jumps: [...f.jumps], rejected: f.rejected });
    if ((f.jumps.length === 0 && f.rejected.length === 0) || pass === maxPasses) break;
    current = correctPhaseJumps(
      { epoch, t, phase: current },
      { jumps: f.jumps, rejected: f.rejected.map((r) => r.index) },
    ).phase;
    result = characterizePass(current, t, tau0, epoch, settings);
  }
  return {
    epoch,
    referenceTime,
    referenceEpoch: epoch.plus(referenceTime),
    measurementNoise: noise,
    polynomial: result.polynomial,
    polynomialNoise: result.polynomialNoise,
    noise: result.noise,
    filter: result.filter,
    samplesUsed: result.samplesUsed,
    passes,
  };
}
