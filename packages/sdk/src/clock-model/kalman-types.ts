/**
 * Types, input validation and the stateless operations (forecast, known step) of the clock Kalman
 * filter. State units: x phase (time error) in s, y fractional frequency (dimensionless), d drift in 1/s.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { MAX_ABS_PHASE_SECONDS, requireFinite, requireInRange, requireNonNegative } from '../internal/validate.js';
import type { Instant } from '../time/instant.js';
import type { Dimensionless, Seconds } from '../units.js';
import { add, cholesky, congruence, type Matrix, multiplyVector } from './linalg.js';
import {
  type ClockDiffusion,
  type ClockStates,
  clockProcessNoise,
  clockTransitionMatrix,
  requireDiffusion,
} from './noise.js';

/** A clock-state estimate: mean and covariance at a time. */
export interface ClockEstimate {
  /**
   * Time of the estimate, in SI seconds since an epoch fixed by the caller and the same for every call:
   * for {@link ClockKalmanFilter} its `epoch`, for `runClockFilter` the series `epoch`.
   */
  readonly t: Seconds;
  /** Mean [x (s), y (dimensionless)(, d (1/s))]; its length (2 or 3) sets the model. */
  readonly state: readonly number[];
  /** Covariance of the state, 2×2 or 3×3, symmetric positive semi-definite. */
  readonly covariance: readonly (readonly number[])[];
}

/** A prediction at one horizon. */
export interface ClockForecast extends ClockEstimate {
  /** Horizon from the estimate it was made from, in seconds. */
  readonly horizon: Seconds;
  /** √covariance[0][0]: standard deviation of the predicted phase, in seconds. */
  readonly phaseStd: Seconds;
  /** √covariance[1][1]: standard deviation of the predicted fractional frequency. */
  readonly frequencyStd: Dimensionless;
}

/** A known deterministic change of the clock (e.g. a steering command that has been applied). */
export interface ClockStep {
  /** Phase step, in seconds (added to x). */
  readonly phase?: Seconds;
  /** Fractional-frequency step (added to y). */
  readonly frequency?: Dimensionless;
  /** Drift step, in 1/s (added to d; 3-state only). */
  readonly drift?: number;
}

/** Validates an estimate (2 or 3 states, symmetric positive semi-definite covariance). */
/** A clock state padded to three: [x (s), y (dimensionless), d (1/s)], d = 0 for a 2-state model. */
export type ClockState3 = readonly [number, number, number];

/** The upper triangle of a clock covariance padded to 3×3 (zeros in the drift row and column for 2 states). */
export interface Covariance3 {
  readonly p00: number;
  readonly p01: number;
  readonly p02: number;
  readonly p11: number;
  readonly p12: number;
  readonly p22: number;
}

/** A validated estimate: as given (`state`, `covariance`) and padded to three states (`mean`, `upper`). */
export interface CheckedEstimate {
  readonly t: number;
  readonly state: number[];
  readonly covariance: Matrix;
  readonly states: ClockStates;
  readonly mean: ClockState3;
  readonly upper: Covariance3;
}

/** `rows[i][j]` of a matrix whose shape was checked. */
function element(rows: Matrix, i: number, j: number): number {
  return at(at(rows, i, 'covariance'), j, `covariance[${i}]`);
}

export function requireEstimate(argument: string, e: unknown): CheckedEstimate {
  if (typeof e !== 'object' || e === null)
    throw new InvalidArgumentError(argument, e, 'an estimate { t (s), state [x, y(, d)], covariance }');
  const r = e as Record<string, unknown>;
  const t = requireInRange(`${argument}.t`, r.t, -MAX_ABS_PHASE_SECONDS, MAX_ABS_PHASE_SECONDS, {
    unit: 's (an epoch)',
  });
  const s = r.state;
  if (!Array.isArray(s) || (s.length !== 2 && s.length !== 3)) {
    throw new InvalidArgumentError(`${argument}.state`, s, 'an array [x (s), y] or [x (s), y, d (1/s)]');
  }
  const n = s.length as ClockStates;
  const state = s.map((v: unknown, i: number) => requireFinite(`${argument}.state[${i}]`, v));
  const c = r.covariance;
  const expected = `a symmetric positive semi-definite ${n}×${n} matrix (array of rows)`;
  if (!Array.isArray(c) || c.length !== n) throw new InvalidArgumentError(`${argument}.covariance`, c, expected);
  const covariance = c.map((row: unknown, i: number) => {
    if (!Array.isArray(row) || row.length !== n)
      throw new InvalidArgumentError(`${argument}.covariance[${i}]`, row, `a row of ${n} numbers`);
    return row.map((v: unknown, j: number) => requireFinite(`${argument}.covariance[${i}][${j}]`, v));
  });
  const diagonal = covariance.map((row, i) => at(row, i, `covariance[${i}]`));
  for (const [i, row] of covariance.entries()) {
    for (const [j, a] of row.slice(0, i).entries()) {
      const b = element(covariance, j, i);
      if (Math.abs(a - b) > 1e-9 * Math.sqrt(Math.abs(at(diagonal, i) * at(diagonal, j)))) {
        throw new InvalidArgumentError(
          `${argument}.covariance`,
          c,
          expected,
          `element [${i}][${j}] differs from [${j}][${i}]`,
        );
      }
    }
  }
  if (!cholesky(scaledForTest(covariance), true))
    throw new InvalidArgumentError(`${argument}.covariance`, c, expected, 'the matrix is not positive semi-definite');
  const three = n === 3;
  const mean: ClockState3 = [at(state, 0), at(state, 1), three ? at(state, 2) : 0];
  const upper: Covariance3 = {
    p00: element(covariance, 0, 0),
    p01: element(covariance, 0, 1),
    p02: three ? element(covariance, 0, 2) : 0,
    p11: element(covariance, 1, 1),
    p12: three ? element(covariance, 1, 2) : 0,
    p22: three ? element(covariance, 2, 2) : 0,
  };
  return { t, state, covariance, states: n, mean, upper };
}

/** Scales a covariance to unit diagonal (zero rows stay zero) so the definiteness test is scale-free. */
function scaledForTest(p: Matrix): Matrix {
  const d = p.map((row, i) => Math.sqrt(Math.max(at(row, i), 0)));
  return p.map((row, i) => {
    const di = at(d, i);
    return row.map((v, j) => {
      const dj = at(d, j);
      return di > 0 && dj > 0 ? v / (di * dj) : v === 0 ? 0 : v;
    });
  });
}

/** Mean and covariance propagated by τ: s' = Φs, P' = ΦPΦᵀ + Q(τ) (Kalman 1960 time update). */
function propagate(
  state: readonly number[],
  p: Matrix,
  tau: number,
  q: Required<ClockDiffusion>,
  states: ClockStates,
): { state: number[]; covariance: Matrix } {
  const phi = clockTransitionMatrix(tau, states);
  return { state: multiplyVector(phi, state), covariance: add(congruence(phi, p), clockProcessNoise(tau, q, states)) };
}

/** A 2-state model has no drift noise: q3 must be 0. */
export function checkQForStates(q: Required<ClockDiffusion>, states: ClockStates, argument: string): void {
  if (states === 2 && q.q3 !== 0) {
    throw new InvalidArgumentError(
      `${argument}.q3`,
      q.q3,
      '0 for a 2-state estimate',
      'give a 3-element state [x, y, d] to model drift noise',
    );
  }
}

/**
 * Predicts a clock estimate over a horizon: mean Φ(τ)s and covariance Φ(τ)PΦ(τ)ᵀ + Q(τ).
 *
 * @param estimate  Estimate to start from (2- or 3-state).
 * @param q         Diffusion coefficients q1 (s), q2 (1/s), q3 (1/s³; must be 0 for a 2-state estimate).
 * @param horizons  Horizons τ ≥ 0 from `estimate.t`, in seconds (one forecast each, in the given order).
 * @returns One {@link ClockForecast} per horizon: time, mean, covariance, phase and frequency σ.
 * @throws {InvalidArgumentError} for a malformed estimate, negative q, q3 > 0 with 2 states, or a negative/NaN horizon.
 * @see R. E. Kalman, J. Basic Eng. 82(1), 35–45 (1960) (time update) [M]; Zucca & Tavella (2005) for Φ and Q [M citation].
 */
export function forecastClock(
  estimate: ClockEstimate,
  q: ClockDiffusion,
  horizons: readonly Seconds[],
): ClockForecast[] {
  const e = requireEstimate('estimate', estimate);
  const qq = requireDiffusion('q', q);
  checkQForStates(qq, e.states, 'q');
  if (!Array.isArray(horizons))
    throw new InvalidArgumentError('horizons', horizons, 'an array of horizons ≥ 0 in seconds');
  return horizons.map((h, i) => {
    const tau = requireNonNegative(`horizons[${i}]`, h, 's');
    const p = propagate(e.state, e.covariance, tau, qq, e.states);
    return {
      t: e.t + tau,
      horizon: tau,
      state: p.state,
      covariance: p.covariance,
      phaseStd: Math.sqrt(element(p.covariance, 0, 0)),
      frequencyStd: Math.sqrt(element(p.covariance, 1, 1)),
    };
  });
}

/**
 * Applies a known deterministic step to an estimate (mean only: a commanded step adds no
 * uncertainty; model actuator error separately). x += phase, y += frequency, d += drift.
 *
 * @param estimate  Estimate before the step.
 * @param step      Phase (s), frequency (dimensionless) and/or drift (1/s) steps.
 * @returns A new estimate at the same time.
 * @throws {InvalidArgumentError} for a malformed estimate or step, or a drift step on a 2-state estimate.
 */
export function applyClockStep(estimate: ClockEstimate, step: ClockStep): ClockEstimate {
  const e = requireEstimate('estimate', estimate);
  const s = requireStep(step, e.states);
  const [x, y, d] = e.mean;
  const state = e.states === 3 ? [x + s[0], y + s[1], d + s[2]] : [x + s[0], y + s[1]];
  return { t: e.t, state, covariance: e.covariance };
}

/** Validates a known step: [phase (s), frequency, drift (1/s)]. */
export function requireStep(step: unknown, states: ClockStates): [number, number, number] {
  if (typeof step !== 'object' || step === null)
    throw new InvalidArgumentError('step', step, 'an object { phase?, frequency?, drift? }');
  const r = step as Record<string, unknown>;
  const phase = r.phase === undefined ? 0 : requireFinite('step.phase', r.phase, 'a finite phase step in seconds');
  const frequency =
    r.frequency === undefined ? 0 : requireFinite('step.frequency', r.frequency, 'a finite fractional-frequency step');
  const drift = r.drift === undefined ? 0 : requireFinite('step.drift', r.drift, 'a finite drift step in 1/s');
  if (states === 2 && drift !== 0) throw new InvalidArgumentError('step.drift', drift, '0 for a 2-state model');
  return [phase, frequency, drift];
}

/** A detected jump. */
export interface DetectedJump {
  /** `phase` (a step in x, size in s) or `frequency` (a step in y, dimensionless). */
  readonly kind: 'phase' | 'frequency';
  /** Time of the measurement update at which the step had taken effect, in SI seconds since the filter's (or series') epoch. */
  readonly epoch: Seconds;
  /** Index of that measurement update (counting every update call, rejected ones included, from 0). */
  readonly updateIndex: number;
  /** Estimated size ν̂ (s or dimensionless). */
  readonly size: number;
  /** Standard deviation of ν̂. */
  readonly sizeStd: number;
  /** GLR statistic l = d²/C (χ²(1) under "no jump"). */
  readonly statistic: number;
  /** Update index at which the jump was declared (the state was corrected then). */
  readonly declaredAtUpdate: number;
  /** Threshold on `statistic` in force (χ²(1) upper quantile at falseAlarmProbability / testsPerUpdate). */
  readonly threshold: number;
}

/** A measurement declared an outlier (removed from the estimate after the fact). */
export interface DetectedOutlier {
  /** Time of the outlying measurement, in SI seconds since the filter's (or series') epoch. */
  readonly epoch: Seconds;
  /** Index of its measurement update. */
  readonly updateIndex: number;
  /** Estimated size of the outlier (measurement minus what the other data say), in s. */
  readonly size: Seconds;
  /** Standard deviation of `size`, in s. */
  readonly sizeStd: Seconds;
  /** GLR statistic l = d²/C of the impulse hypothesis (χ²(1) for a good measurement). */
  readonly statistic: number;
  /** Update index at which it was declared. */
  readonly declaredAtUpdate: number;
}

/** Options of the jump detector. */
export interface JumpDetectionOptions {
  /** Number of recent epochs at which a jump may have started, integer in [2, 10000] (default 20). */
  readonly window?: number;
  /**
   * Measurements from the jump epoch on needed before a jump is declared, integer in [2, window]
   * (default 3); outliers are decided `minEpochs − 1` updates after the measurement.
   */
  readonly minEpochs?: number;
  /**
   * False-alarm probability per measurement update: on jump-free data a jump is declared at a given
   * update with at most this probability (default 1e-6). It is split over the 2·(window − minEpochs + 1)
   * tests made at each update (Bonferroni), so the threshold on l is the χ²(1) upper quantile at
   * falseAlarmProbability / (2·(window − minEpochs + 1)); the realised rate is lower (see runClockFilter).
   */
  readonly falseAlarmProbability?: number;
}

/** Options of {@link ClockKalmanFilter}. */
export interface ClockKalmanOptions {
  /**
   * The instant of t = 0 (required): `initial.t` and every time the filter takes or reports (`predict(t)`,
   * `step(t, …)`, `estimate.t`, `ClockUpdate.t`, forecasts, jump and outlier epochs) are SI seconds since
   * it. Exposed as `filter.epoch`; the filter runs on the seconds, so the numbers do not depend on it.
   */
  readonly epoch: Instant;
  /** Diffusion coefficients q1 (s), q2 (1/s), q3 (1/s³; 0 for 2 states). */
  readonly q: ClockDiffusion;
  /** Initial estimate (its `t` in seconds since `epoch`); its state length (2 or 3) selects the model. */
  readonly initial: ClockEstimate;
  /**
   * Probability that a good measurement is declared an outlier: the GLR statistic of the impulse
   * hypothesis (χ²(1) for a good measurement) is compared, `minEpochs − 1` updates after the
   * measurement, with the χ²(1) upper quantile at this value (default 1e-4 → 15.1). A measurement whose
   * NIS exceeds the χ²(1) upper quantile at min(this value, 1e-9) (default 37.3) is held out at once until
   * that decision. `false` disables outlier handling.
   */
  readonly outlierProbability?: number | false;
  /** Jump detection settings, or `false` to disable (default on). */
  readonly jumpDetection?: JumpDetectionOptions | false;
}

/** Result of one measurement update. */
export interface ClockUpdate {
  /** Time of the update, in SI seconds since the filter's `epoch`. */
  readonly t: Seconds;
  /** Index of this update (0 for the first). */
  readonly updateIndex: number;
  /**
   * `accepted` (state updated) or `rejected` (NIS above the hold-out gate; state kept at the
   * prediction until the outlier decision `minEpochs − 1` updates later, which may still re-admit it).
   */
  readonly status: 'accepted' | 'rejected';
  /** Innovation z − x̂⁻, in seconds. */
  readonly innovation: Seconds;
  /** Innovation variance S = P⁻₁₁ + R, in s². */
  readonly innovationVariance: number;
  /** Normalised innovation squared ν²/S (χ²(1) for a consistent filter). */
  readonly nis: number;
  /** Threshold of the outlier decision (χ²(1) at outlierProbability; Infinity when outlier handling is off). */
  readonly gate: number;
  /** A jump declared at this update (the returned estimate already includes its correction). */
  readonly jump: DetectedJump | undefined;
  /** An earlier measurement declared an outlier at this update (the estimate is recomputed without it). */
  readonly outlier?: DetectedOutlier | undefined;
  /** Estimate after the update (and after any jump correction). */
  readonly estimate: ClockEstimate;
}
