/**
 * Clock Kalman filter (2-state [x, y] or 3-state [x, y, d]) on phase measurements, with GLR
 * detection of outliers and of phase and frequency jumps, and prediction with covariance over a horizon.
 *
 * State units: x phase (time error) in s, y fractional frequency (dimensionless), d drift in 1/s.
 * Times are SI seconds since the filter's `epoch` (an {@link Instant}, the instant of t = 0).
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { chiSquareUpperQuantile } from '../internal/special-functions.js';
import {
  MAX_ABS_PHASE_SECONDS,
  requireInRange,
  requireInteger,
  requireMeasurementVariance,
  requirePhaseSample,
} from '../internal/validate.js';
import type { Instant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import { type CoreEvents, FilterCore } from './kalman-core.js';
import { estimateOf } from './kalman-estimate.js';
import { FREQUENCY, type GlrDecision, GlrDetector } from './kalman-glr.js';
import {
  type ClockEstimate,
  type ClockForecast,
  type ClockKalmanOptions,
  type ClockStep,
  type ClockUpdate,
  checkQForStates,
  type DetectedJump,
  type DetectedOutlier,
  forecastClock,
  requireEstimate,
  requireStep,
} from './kalman-types.js';
import { type ClockDiffusion, type ClockStates, requireDiffusion } from './noise.js';
import { requireSeriesEpoch } from './series-epoch.js';

/** Most stringent NIS hold-out: a measurement is held at once only when NIS exceeds χ²(1) at 1e-9 (or at outlierProbability if smaller). */
const HOLD_PROBABILITY = 1e-9;

/** The detector settings in force, as reported by {@link ClockKalmanFilter.detection}. */
export interface ClockDetectionSettings {
  /** Declared per-update false-alarm probability of a jump (upper bound), or 0 when jump detection is off. */
  readonly falseAlarmProbability: number;
  /** Tests per update the false-alarm probability is split over: 2·(window − minEpochs + 1). */
  readonly testsPerUpdate: number;
  /** Threshold on the GLR statistic l for a jump: χ²(1) upper quantile at falseAlarmProbability / testsPerUpdate. */
  readonly jumpThreshold: number;
  /** Probability that a good measurement is declared an outlier, or 0 when outlier handling is off. */
  readonly outlierProbability: number;
  /** Threshold on the impulse statistic for an outlier (χ²(1) upper quantile at outlierProbability). */
  readonly outlierThreshold: number;
  /** NIS above which a measurement is held out at once, pending its outlier decision. */
  readonly holdGate: number;
  readonly window: number;
  readonly minEpochs: number;
}

/** Builds the detector and the hold-out gate from validated options. @internal */
export function detectionFrom(options: Pick<ClockKalmanOptions, 'outlierProbability' | 'jumpDetection'>): {
  settings: ClockDetectionSettings;
  detector: GlrDetector | undefined;
} {
  const op = options.outlierProbability === undefined ? 1e-4 : options.outlierProbability;
  const outlierProbability = op === false ? 0 : requireInRange('outlierProbability', op, 1e-15, 0.5);
  const jd = options.jumpDetection === undefined ? {} : options.jumpDetection;
  const j = jd === false ? {} : jd;
  if (typeof j !== 'object' || j === null)
    throw new InvalidArgumentError('jumpDetection', j, 'an options object or false');
  const window = j.window === undefined ? 20 : requireInteger('jumpDetection.window', j.window, 2, 10000);
  const minEpochs =
    j.minEpochs === undefined ? Math.min(3, window) : requireInteger('jumpDetection.minEpochs', j.minEpochs, 2, window);
  const pfa =
    j.falseAlarmProbability === undefined
      ? 1e-6
      : requireInRange('jumpDetection.falseAlarmProbability', j.falseAlarmProbability, 1e-15, 0.5);
  const jumps = jd !== false;
  const outliers = op !== false;
  const testsPerUpdate = 2 * (window - minEpochs + 1);
  const jumpThreshold = jumps ? chiSquareUpperQuantile(pfa / testsPerUpdate, 1) : Infinity;
  const outlierThreshold = outliers ? chiSquareUpperQuantile(outlierProbability, 1) : Infinity;
  const holdGate = outliers ? chiSquareUpperQuantile(Math.min(outlierProbability, HOLD_PROBABILITY), 1) : Infinity;
  const settings = {
    falseAlarmProbability: jumps ? pfa : 0,
    testsPerUpdate,
    jumpThreshold,
    outlierProbability,
    outlierThreshold,
    holdGate,
    window,
    minEpochs,
  };
  const detector =
    jumps || outliers
      ? new GlrDetector(window, minEpochs, jumps, outliers, jumpThreshold, outlierThreshold)
      : undefined;
  return { settings, detector };
}

/** Converts a detector decision to the public jump record. */
export function toJump(d: GlrDecision, declaredAt: number, threshold: number): DetectedJump {
  return {
    kind: d.kind === FREQUENCY ? 'frequency' : 'phase',
    epoch: d.epoch,
    updateIndex: d.updateIndex,
    size: d.size,
    sizeStd: d.sizeStd,
    statistic: d.statistic,
    declaredAtUpdate: declaredAt,
    threshold,
  };
}

/** Converts a detector decision to the public outlier record. */
export function toOutlier(d: GlrDecision, declaredAt: number): DetectedOutlier {
  return {
    epoch: d.epoch,
    updateIndex: d.updateIndex,
    size: d.size,
    sizeStd: d.sizeStd,
    statistic: d.statistic,
    declaredAtUpdate: declaredAt,
  };
}

/**
 * Kalman filter for a clock with phase measurements.
 *
 * Time update: s⁻ = Φ(τ)s, P⁻ = ΦPΦᵀ + Q(τ) (Q from q1, q2, q3; Zucca & Tavella 2005 [M citation];
 * Brown & Hwang, Introduction to Random Signals and Applied Kalman Filtering, 4th ed., 2012 [M]; Kalman 1960 [M]).
 * Measurement update (H = [1, 0(, 0)], scalar z with variance R): ν = z − x̂⁻, S = P⁻₁₁ + R,
 * K = P⁻Hᵀ/S, s = s⁻ + Kν, P = (I − KH)P⁻(I − KH)ᵀ + KRKᵀ (Joseph form, for numerical safety;
 * Bucy & Joseph 1968 [M]). NIS = ν²/S (Bar-Shalom, Li & Kirubarajan 2001 §5.4 [M]). Once the prior
 * covariance repeats to 1e-12 (relative to √(PᵢᵢPⱼⱼ)) between consecutive steps of equal τ and R, the
 * Riccati recursion is at its fixed point and the gain and covariances are reused (steady state; it
 * exists when q2 > 0 for 2 states or q3 > 0 for 3 states; Anderson & Moore, Optimal Filtering, 1979, §4.4 [M]).
 *
 * Outliers and jumps: every measurement is used, so the innovations are white under "nothing happened"
 * and the generalised likelihood ratio of Willsky & Jones, IEEE Trans. Autom. Control 21(1), 108–112
 * (1976) [M] applies exactly: for each of the last `window` epochs θ and each kind (phase step, frequency
 * step, single-measurement impulse) l = d²/C is χ²(1) (see kalman-glr.ts). A measurement is declared an
 * outlier `minEpochs − 1` updates after it when its impulse l exceeds the χ²(1) quantile at
 * outlierProbability and neither step at the same epoch fits better. A jump is declared when the best
 * step hypothesis with ≥ minEpochs innovations exceeds the χ²(1) quantile at falseAlarmProbability /
 * (2·(window − minEpochs + 1)) — so, by the union bound, a jump is declared at a given update of jump-free
 * data with probability ≤ falseAlarmProbability — no hypothesis fits better, and the other step kind
 * trails by 2 ln 100 (our own rule). After a declaration the estimate is recomputed from the stored
 * measurements: the outlier left out, or the jump added at θ with a practically flat prior on its size.
 * Only a measurement with NIS above the χ²(1) quantile at min(outlierProbability, 1e-9) is held out at
 * once, pending its decision.
 *
 * Time: the filter is constructed on an `epoch` (an {@link Instant}, the instant of t = 0). Every `t` it
 * takes or reports — `initial.t`, `predict(t)`, `step(t, …)`, `estimate.t`, `ClockUpdate.t`, forecast `t`,
 * jump and outlier `epoch` — is SI seconds since that epoch; the absolute instant is `filter.epoch.plus(t)`.
 * The filter runs on the seconds only: the same seconds give the same numbers whatever the epoch.
 */
export class ClockKalmanFilter {
  private readonly _epoch: Instant;
  private readonly _q: Required<ClockDiffusion>;
  private readonly _states: ClockStates;
  private readonly _core: FilterCore;
  private readonly _settings: ClockDetectionSettings;

  /**
   * @param options  See {@link ClockKalmanOptions}; `epoch` (an Instant, the instant of t = 0) is required.
   * @throws {InvalidArgumentError} for a missing `epoch` (with a hint) or one that is not an Instant, a malformed initial estimate, negative q, q3 > 0 with a 2-state
   *         estimate, outlierProbability outside [1e-15, 0.5], or detector settings out of range
   *         (window integer in [2, 10000], minEpochs integer in [2, window], falseAlarmProbability in [1e-15, 0.5]).
   */
  constructor(options: ClockKalmanOptions) {
    if (typeof options !== 'object' || options === null)
      throw new InvalidArgumentError('options', options, 'filter options { epoch, q, initial, ... }');
    this._epoch = requireSeriesEpoch('epoch', options.epoch);
    const e = requireEstimate('initial', options.initial);
    this._q = requireDiffusion('q', options.q);
    checkQForStates(this._q, e.states, 'q');
    this._states = e.states;
    const { settings, detector } = detectionFrom(options);
    this._settings = settings;
    this._core = new FilterCore(this._q, e.t, e.mean, e.upper, settings.holdGate, detector);
  }

  /** The instant of t = 0: every `t` the filter takes or reports is SI seconds since it. */
  get epoch(): Instant {
    return this._epoch;
  }

  /** Number of states (2 or 3). */
  get states(): ClockStates {
    return this._states;
  }

  /** Current estimate (a copy); its `t` is in seconds since {@link ClockKalmanFilter.epoch}. */
  get estimate(): ClockEstimate {
    return estimateOf(this._core, this._states);
  }

  /** Threshold of the outlier decision (χ²(1) quantile at outlierProbability; Infinity when outlier handling is off). */
  get gate(): number {
    return this._settings.outlierThreshold;
  }

  /** Detector settings in force: false-alarm probability, thresholds, hold-out gate. */
  get detection(): ClockDetectionSettings {
    return this._settings;
  }

  /**
   * Advances the filter to time `t` (time update only).
   *
   * @param t  New time, in SI seconds since {@link ClockKalmanFilter.epoch}, ≥ the current time.
   * @returns The predicted estimate.
   * @throws {InvalidArgumentError} if |t| > 1e12 s (MAX_ABS_PHASE_SECONDS), t is not a number, or t is before the current time.
   */
  predict(t: Seconds): ClockEstimate {
    requireInRange('t', t, -MAX_ABS_PHASE_SECONDS, MAX_ABS_PHASE_SECONDS, { unit: 's (an epoch)' });
    if (t < this._core.t)
      throw new InvalidArgumentError(
        't',
        t,
        `a time ≥ the filter's current time ${this._core.t} s since its epoch (the filter does not run backwards)`,
      );
    this._core.predictTo(t);
    return this.estimate;
  }

  /**
   * Measurement update with a phase measurement at the current epoch, then the detector's decisions.
   *
   * @param phase     Measured phase (time error), in seconds.
   * @param variance  Its variance R, in s², > 0.
   * @returns {@link ClockUpdate}: time (s since `epoch`), status, innovation, its variance, NIS, any jump or
   *          outlier declared, new estimate.
   * @throws {InvalidArgumentError} if |phase| > 1e12 s or is not a number, or variance is outside [1e-40, 1e24] s².
   */
  update(phase: Seconds, variance: number): ClockUpdate {
    // A missing sample is skipped with predict(), never passed as NaN.
    const z = requirePhaseSample('phase', phase, false);
    const r = requireMeasurementVariance('variance', variance);
    const c = this._core;
    const index = c.updates;
    const events: CoreEvents = { jumps: [], outliers: [] };
    const t = c.t;
    const leftOut = c.update(z, r, events);
    const innovation = c.liveNu;
    const s = c.liveS;
    const lastJump = events.jumps.at(-1);
    const lastOutlier = events.outliers.at(-1);
    const jump = lastJump === undefined ? undefined : toJump(lastJump, index, this._settings.jumpThreshold);
    const out = lastOutlier === undefined ? undefined : toOutlier(lastOutlier, index);
    return {
      t,
      updateIndex: index,
      status: leftOut ? 'rejected' : 'accepted',
      innovation,
      innovationVariance: s,
      nis: (innovation * innovation) / s,
      gate: this._settings.outlierThreshold,
      jump,
      outlier: out,
      estimate: this.estimate,
    };
  }

  /**
   * Time update to `t` followed by a measurement update.
   *
   * @param t         Measurement time, in SI seconds since {@link ClockKalmanFilter.epoch}, ≥ the current time.
   * @param phase     Measured phase, in seconds.
   * @param variance  Measurement variance, in s², > 0.
   * @returns {@link ClockUpdate}.
   * @throws {InvalidArgumentError} as {@link ClockKalmanFilter.predict} and {@link ClockKalmanFilter.update}.
   */
  step(t: Seconds, phase: Seconds, variance: number): ClockUpdate {
    this.predict(t);
    return this.update(phase, variance);
  }

  /**
   * Predictions from the current estimate at several horizons (the filter is not changed).
   *
   * @param horizons  Horizons ≥ 0, in seconds.
   * @returns One {@link ClockForecast} per horizon; its `t` is in seconds since {@link ClockKalmanFilter.epoch}.
   * @throws {InvalidArgumentError} for a negative or NaN horizon.
   */
  forecast(horizons: readonly Seconds[]): ClockForecast[] {
    return forecastClock(this.estimate, this._q, horizons);
  }

  /**
   * Applies a known step (e.g. an executed steering command) to the state mean at the current epoch.
   *
   * @param step  Phase (s), frequency (dimensionless), drift (1/s, 3-state only).
   * @returns The new estimate.
   * @throws {InvalidArgumentError} for a malformed step or a drift step on the 2-state model.
   */
  applyStep(step: ClockStep): ClockEstimate {
    const s = requireStep(step, this._states);
    this._core.addStep(s[0], s[1], s[2]);
    return this.estimate;
  }
}
