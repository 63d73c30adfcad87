/**
 * Clock Kalman filter (2-state [x, y] or 3-state [x, y, d]) on phase measurements, with
 * innovation-based outlier rejection, generalised-likelihood-ratio detection of phase and
 * frequency jumps, and prediction with covariance over a horizon.
 *
 * State units: x phase (time error) in s, y fractional frequency (dimensionless), d drift in 1/s.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import type { Dimensionless, Seconds } from '../units.js';
import { chiSquareQuantile, chiSquareUpperQuantile } from '../internal/special-functions.js';
import {
  requireFinite, requireInRange, requireInteger, requireMeasurementVariance, requireNonNegative, requirePhaseSample, requirePositive,
} from '../internal/validate.js';
import { add, cholesky, congruence, copyMatrix, multiplyVector, type Matrix } from './linalg.js';
import { clockProcessNoise, clockTransitionMatrix, requireDiffusion, type ClockDiffusion, type ClockStates } from './noise.js';

/** A clock-state estimate: mean and covariance at a time. */
export interface ClockEstimate {
  /** Epoch of the estimate, in seconds (any fixed origin, the same for every call). */
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

function requireEstimate(argument: string, e: unknown): { t: number; state: number[]; covariance: Matrix; states: ClockStates } {
  if (typeof e !== 'object' || e === null) throw new InvalidArgumentError(argument, e, 'an estimate { t (s), state [x, y(, d)], covariance }');
  const r = e as Record<string, unknown>;
  const t = requireFinite(`${argument}.t`, r['t'], 'a finite time in seconds');
  const s = r['state'];
  if (!Array.isArray(s) || (s.length !== 2 && s.length !== 3)) {
    throw new InvalidArgumentError(`${argument}.state`, s, 'an array [x (s), y] or [x (s), y, d (1/s)]');
  }
  const n = s.length as ClockStates;
  const state = s.map((v: unknown, i: number) => requireFinite(`${argument}.state[${i}]`, v));
  const c = r['covariance'];
  const expected = `a symmetric positive semi-definite ${n}×${n} matrix (array of rows)`;
  if (!Array.isArray(c) || c.length !== n) throw new InvalidArgumentError(`${argument}.covariance`, c, expected);
  const covariance = c.map((row: unknown, i: number) => {
    if (!Array.isArray(row) || row.length !== n) throw new InvalidArgumentError(`${argument}.covariance[${i}]`, row, `a row of ${n} numbers`);
    return row.map((v: unknown, j: number) => requireFinite(`${argument}.covariance[${i}][${j}]`, v));
  });
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const a = (covariance[i] as number[])[j] as number;
      const b = (covariance[j] as number[])[i] as number;
      if (Math.abs(a - b) > 1e-9 * Math.sqrt(Math.abs(((covariance[i] as number[])[i] as number) * ((covariance[j] as number[])[j] as number)))) {
        throw new InvalidArgumentError(`${argument}.covariance`, c, expected, `element [${i}][${j}] differs from [${j}][${i}]`);
      }
    }
  }
  if (!cholesky(scaledForTest(covariance), true)) throw new InvalidArgumentError(`${argument}.covariance`, c, expected, 'the matrix is not positive semi-definite');
  return { t, state, covariance, states: n };
}

/** Scales a covariance to unit diagonal (zero rows stay zero) so the definiteness test is scale-free. */
function scaledForTest(p: Matrix): Matrix {
  const d = p.map((row, i) => Math.sqrt(Math.max(row[i] as number, 0)));
  return p.map((row, i) => row.map((v, j) => ((d[i] as number) > 0 && (d[j] as number) > 0 ? v / ((d[i] as number) * (d[j] as number)) : v === 0 ? 0 : v)));
}

/** Mean and covariance propagated by τ: s' = Φs, P' = ΦPΦᵀ + Q(τ) (Kalman 1960 time update). */
function propagate(state: readonly number[], p: Matrix, tau: number, q: Required<ClockDiffusion>, states: ClockStates)
  : { state: number[]; covariance: Matrix } {
  const phi = clockTransitionMatrix(tau, states);
  return { state: multiplyVector(phi, state), covariance: add(congruence(phi, p), clockProcessNoise(tau, q, states)) };
}

function checkQForStates(q: Required<ClockDiffusion>, states: ClockStates, argument: string): void {
  if (states === 2 && q.q3 !== 0) {
    throw new InvalidArgumentError(`${argument}.q3`, q.q3, '0 for a 2-state estimate', 'give a 3-element state [x, y, d] to model drift noise');
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
export function forecastClock(estimate: ClockEstimate, q: ClockDiffusion, horizons: readonly Seconds[]): ClockForecast[] {
  const e = requireEstimate('estimate', estimate);
  const qq = requireDiffusion('q', q);
  checkQForStates(qq, e.states, 'q');
  if (!Array.isArray(horizons)) throw new InvalidArgumentError('horizons', horizons, 'an array of horizons ≥ 0 in seconds');
  return horizons.map((h, i) => {
    const tau = requireNonNegative(`horizons[${i}]`, h, 's');
    const p = propagate(e.state, e.covariance, tau, qq, e.states);
    return {
      t: e.t + tau, horizon: tau, state: p.state, covariance: p.covariance,
      phaseStd: Math.sqrt((p.covariance[0] as number[])[0] as number),
      frequencyStd: Math.sqrt((p.covariance[1] as number[])[1] as number),
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
  const state = e.state.slice();
  state[0] = (state[0] as number) + s[0];
  state[1] = (state[1] as number) + s[1];
  if (e.states === 3) state[2] = (state[2] as number) + s[2];
  return { t: e.t, state, covariance: e.covariance };
}

function requireStep(step: unknown, states: ClockStates): [number, number, number] {
  if (typeof step !== 'object' || step === null) throw new InvalidArgumentError('step', step, 'an object { phase?, frequency?, drift? }');
  const r = step as Record<string, unknown>;
  const phase = r['phase'] === undefined ? 0 : requireFinite('step.phase', r['phase'], 'a finite phase step in seconds');
  const frequency = r['frequency'] === undefined ? 0 : requireFinite('step.frequency', r['frequency'], 'a finite fractional-frequency step');
  const drift = r['drift'] === undefined ? 0 : requireFinite('step.drift', r['drift'], 'a finite drift step in 1/s');
  if (states === 2 && drift !== 0) throw new InvalidArgumentError('step.drift', drift, '0 for a 2-state model');
  return [phase, frequency, drift];
}

/** A detected jump. */
export interface DetectedJump {
  /** `phase` (a step in x, size in s) or `frequency` (a step in y, dimensionless). */
  readonly kind: 'phase' | 'frequency';
  /** Epoch (time of the measurement update) at which the step had taken effect, in seconds. */
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
}

/** Options of the jump detector. */
export interface JumpDetectionOptions {
  /** Number of recent epochs at which a jump may have started, integer in [2, 10000] (default 20). */
  readonly window?: number;
  /** Measurements from the jump epoch on needed before a jump is declared, integer in [2, window] (default 3). */
  readonly minEpochs?: number;
  /** False-alarm probability per hypothesis for the GLR statistic, χ²(1) upper tail (default 1e-6). */
  readonly falseAlarmProbability?: number;
}

/** Options of {@link ClockKalmanFilter}. */
export interface ClockKalmanOptions {
  /** Diffusion coefficients q1 (s), q2 (1/s), q3 (1/s³; 0 for 2 states). */
  readonly q: ClockDiffusion;
  /** Initial estimate; its state length (2 or 3) selects the model. */
  readonly initial: ClockEstimate;
  /**
   * Probability that a good measurement is rejected: a measurement is rejected when its NIS exceeds
   * the χ²(1) quantile at 1 − this value (default 1e-4 → gate 15.1). `false` disables rejection.
   */
  readonly outlierProbability?: number | false;
  /** Jump detection settings, or `false` to disable (default on). */
  readonly jumpDetection?: JumpDetectionOptions | false;
}

/** Result of one measurement update. */
export interface ClockUpdate {
  /** Update epoch, in seconds. */
  readonly t: Seconds;
  /** Index of this update (0 for the first). */
  readonly updateIndex: number;
  /** `accepted` (state updated) or `rejected` (NIS above the gate; state kept at the prediction). */
  readonly status: 'accepted' | 'rejected';
  /** Innovation z − x̂⁻, in seconds. */
  readonly innovation: Seconds;
  /** Innovation variance S = P⁻₁₁ + R, in s². */
  readonly innovationVariance: number;
  /** Normalised innovation squared ν²/S (χ²(1) for a consistent filter). */
  readonly nis: number;
  /** NIS gate used (Infinity when rejection is off). */
  readonly gate: number;
  /** A jump declared at this update (the returned estimate already includes its correction). */
  readonly jump: DetectedJump | undefined;
  /** Estimate after the update (and after any jump correction). */
  readonly estimate: ClockEstimate;
}

/** Required lead of the winning jump kind in the GLR statistic: 2 ln 100 (odds 100:1); our own choice. */
const KIND_MARGIN = 2 * Math.log(100);

interface JumpHypothesis {
  kind: 'phase' | 'frequency';
  epoch: number;
  updateIndex: number;
  /** Effect of a unit jump on the current estimation error (prior before update, posterior after). */
  b: number[];
  sumGS: number; // Σ G γ / S
  sumGG: number; // Σ G² / S
  sumNis: number; // Σ γ² / S
  count: number;
}

/**
 * Kalman filter for a clock with phase measurements.
 *
 * Time update: s⁻ = Φ(τ)s, P⁻ = ΦPΦᵀ + Q(τ) (Q from q1, q2, q3; Zucca & Tavella 2005 [M citation]; Kalman 1960 [M]).
 * Measurement update (H = [1, 0(, 0)], scalar z with variance R): ν = z − x̂⁻, S = P⁻₁₁ + R,
 * K = P⁻Hᵀ/S, s = s⁻ + Kν, P = (I − KH)P⁻(I − KH)ᵀ + KRKᵀ (Joseph form, for numerical safety;
 * Bucy & Joseph 1968 [M]). NIS = ν²/S (Bar-Shalom, Li & Kirubarajan 2001 §5.4 [M]).
 *
 * Outliers: a measurement with NIS above the χ²(1) gate is rejected (no state change) and reported.
 * Jumps: the generalised likelihood ratio of Willsky & Jones, "A generalized likelihood ratio
 * approach to the detection and estimation of jumps in linear systems", IEEE Trans. Autom. Control
 * 21(1), 108–112 (1976) [M]: for each candidate epoch θ in a window and each kind (phase: unit step of x;
 * frequency: unit step of y) the innovation signature G_k = H b_k is tracked, b propagating as
 * b ← Φ b and b ← (I − K H) b with the gains actually applied (0 when rejected). With
 * d = Σ G γ/S and C = Σ G²/S, ν̂ = d/C and l = d²/C. A jump is declared when, for the best
 * hypothesis, l exceeds the χ²(1) quantile at 1 − falseAlarmProbability, at least `minEpochs`
 * measurements have been seen since θ, and the residual Σγ²/S − l is consistent with χ²(count − 1)
 * at 1e-3 (so that a single outlier is not taken for a jump), and the best hypothesis of the other
 * kind trails by at least 2 ln 100 in l and no younger hypothesis of the same kind fits better
 * (these tests are our own additions). The state is then corrected: s += ν̂ b, P += b bᵀ/C, and the hypotheses are cleared.
 */
export class ClockKalmanFilter {
  private readonly _q: Required<ClockDiffusion>;
  private readonly _states: ClockStates;
  private _t: number;
  private _state: number[];
  private _p: Matrix;
  private readonly _gate: number;
  private readonly _jumpOn: boolean;
  private readonly _window: number;
  private readonly _minEpochs: number;
  private readonly _jumpThreshold: number;
  private _hyps: JumpHypothesis[] = [];
  private _updates = 0;

  /**
   * @param options  See {@link ClockKalmanOptions}.
   * @throws {InvalidArgumentError} for a malformed initial estimate, negative q, q3 > 0 with a 2-state
   *         estimate, outlierProbability outside [1e-15, 0.5], or detector settings out of range
   *         (window integer in [2, 10000], minEpochs integer in [2, window], falseAlarmProbability in [1e-15, 0.5]).
   */
  constructor(options: ClockKalmanOptions) {
    if (typeof options !== 'object' || options === null) throw new InvalidArgumentError('options', options, 'filter options { q, initial, ... }');
    const e = requireEstimate('initial', options.initial);
    this._q = requireDiffusion('q', options.q);
    checkQForStates(this._q, e.states, 'q');
    this._states = e.states;
    this._t = e.t;
    this._state = e.state;
    this._p = e.covariance;
    const op = options.outlierProbability === undefined ? 1e-4 : options.outlierProbability;
    this._gate = op === false ? Infinity : chiSquareUpperQuantile(requireInRange('outlierProbability', op, 1e-15, 0.5), 1);
    const jd = options.jumpDetection === undefined ? {} : options.jumpDetection;
    this._jumpOn = jd !== false;
    const j = jd === false ? {} : jd;
    if (typeof j !== 'object' || j === null) throw new InvalidArgumentError('jumpDetection', j, 'an options object or false');
    this._window = j.window === undefined ? 20 : requireInteger('jumpDetection.window', j.window, 2, 10000);
    this._minEpochs = j.minEpochs === undefined ? Math.min(3, this._window)
      : requireInteger('jumpDetection.minEpochs', j.minEpochs, 2, this._window);
    const pfa = j.falseAlarmProbability === undefined ? 1e-6 : requireInRange('jumpDetection.falseAlarmProbability', j.falseAlarmProbability, 1e-15, 0.5);
    this._jumpThreshold = chiSquareUpperQuantile(pfa, 1);
  }

  /** Number of states (2 or 3). */
  get states(): ClockStates {
    return this._states;
  }

  /** Current estimate (a copy). */
  get estimate(): ClockEstimate {
    return { t: this._t, state: this._state.slice(), covariance: copyMatrix(this._p) };
  }

  /** NIS gate in use (χ²(1) quantile; Infinity when rejection is off). */
  get gate(): number {
    return this._gate;
  }

  /**
   * Advances the filter to time `t` (time update only).
   *
   * @param t  New epoch, in seconds, ≥ the current epoch.
   * @returns The predicted estimate.
   * @throws {InvalidArgumentError} if t is not finite or is before the current epoch.
   */
  predict(t: Seconds): ClockEstimate {
    requireFinite('t', t, 'a finite time in seconds');
    if (t < this._t) throw new InvalidArgumentError('t', t, `a time ≥ the filter epoch ${this._t} s (the filter does not run backwards)`);
    const tau = t - this._t;
    if (tau > 0) {
      const p = propagate(this._state, this._p, tau, this._q, this._states);
      this._state = p.state;
      this._p = p.covariance;
      const phi = clockTransitionMatrix(tau, this._states);
      for (const h of this._hyps) h.b = multiplyVector(phi, h.b);
      this._t = t;
    }
    return this.estimate;
  }

  /**
   * Measurement update with a phase measurement at the current epoch.
   *
   * @param phase     Measured phase (time error), in seconds.
   * @param variance  Its variance R, in s², > 0.
   * @returns {@link ClockUpdate}: status, innovation, its variance, NIS, any declared jump, new estimate.
   * @throws {InvalidArgumentError} if phase is not finite or variance ≤ 0.
   */
  update(phase: Seconds, variance: number): ClockUpdate {
    const z = requireFinite('phase', phase, 'a finite phase in seconds (use predict() to skip a missing sample)');
    const r = requirePositive('variance', variance, 's²');
    const n = this._states;
    const index = this._updates++;
    const p = this._p;
    const s = ((p[0] as number[])[0] as number) + r;
    const nu = z - (this._state[0] as number);
    const nis = (nu * nu) / s;
    const accepted = nis <= this._gate;
    const k = accepted ? p.map((row) => (row[0] as number) / s) : new Array<number>(n).fill(0);
    if (accepted) {
      this._state = this._state.map((v, i) => v + (k[i] as number) * nu);
      // Joseph form (I − KH) P (I − KH)ᵀ + K R Kᵀ
      const ikh: Matrix = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0) - (j === 0 ? (k[i] as number) : 0)));
      const pj = congruence(ikh, p);
      this._p = pj.map((row, i) => row.map((v, j) => v + (k[i] as number) * r * (k[j] as number)));
    }
    let jump: DetectedJump | undefined;
    if (this._jumpOn) jump = this.runDetector(index, nu, s, k);
    return {
      t: this._t, updateIndex: index, status: accepted ? 'accepted' : 'rejected', innovation: nu, innovationVariance: s, nis,
      gate: this._gate, jump, estimate: this.estimate,
    };
  }

  /**
   * Time update to `t` followed by a measurement update.
   *
   * @param t         Measurement epoch, in seconds, ≥ the current epoch.
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
   * @returns One {@link ClockForecast} per horizon.
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
    this._state[0] = (this._state[0] as number) + s[0];
    this._state[1] = (this._state[1] as number) + s[1];
    if (this._states === 3) this._state[2] = (this._state[2] as number) + s[2];
    return this.estimate;
  }

  private runDetector(index: number, nu: number, s: number, k: number[]): DetectedJump | undefined {
    const n = this._states;
    const unit = (i: number): number[] => Array.from({ length: n }, (_, j) => (j === i ? 1 : 0));
    this._hyps.push(
      { kind: 'phase', epoch: this._t, updateIndex: index, b: unit(0), sumGS: 0, sumGG: 0, sumNis: 0, count: 0 },
      { kind: 'frequency', epoch: this._t, updateIndex: index, b: unit(1), sumGS: 0, sumGG: 0, sumNis: 0, count: 0 },
    );
    while (this._hyps.length > 2 * this._window) this._hyps.shift();
    let best: JumpHypothesis | undefined;
    let bestL = -Infinity;
    const bestByKind = { phase: -Infinity, frequency: -Infinity };
    for (const h of this._hyps) {
      const g = h.b[0] as number;
      h.sumGS += (g * nu) / s;
      h.sumGG += (g * g) / s;
      h.sumNis += (nu * nu) / s;
      h.count += 1;
      // Posterior effect: b ← (I − K H) b
      h.b = h.b.map((v, i) => v - (k[i] as number) * g);
      if (!(h.sumGG > 0)) continue;
      const l = (h.sumGS * h.sumGS) / h.sumGG;
      const rest = Math.max(h.sumNis - l, 0);
      if (h.count > 1 && rest > chiSquareQuantile(1 - 1e-3, h.count - 1)) continue;
      // Every consistent hypothesis competes for the kind, even one too young to be declared.
      bestByKind[h.kind] = Math.max(bestByKind[h.kind], l);
      if (h.count < this._minEpochs || l <= this._jumpThreshold) continue;
      if (l > bestL) {
        bestL = l;
        best = h;
      }
    }
    if (!best) return undefined;
    // Phase and frequency steps look alike over the first few epochs: wait until the likelihood ratio
    // favours one kind by KIND_MARGIN.
    const other = bestByKind[best.kind === 'phase' ? 'frequency' : 'phase'];
    if (bestByKind[best.kind] > bestL) return undefined; // a younger hypothesis of the same kind fits better: wait
    if (bestL - other < KIND_MARGIN) return undefined;
    const size = best.sumGS / best.sumGG;
    const b = best.b;
    this._state = this._state.map((v, i) => v + size * (b[i] as number));
    this._p = this._p.map((row, i) => row.map((v, j) => v + ((b[i] as number) * (b[j] as number)) / best.sumGG));
    this._hyps = [];
    return {
      kind: best.kind, epoch: best.epoch, updateIndex: best.updateIndex, size, sizeStd: 1 / Math.sqrt(best.sumGG),
      statistic: bestL, declaredAtUpdate: index,
    };
  }
}

/** Input series for {@link runClockFilter}. */
export interface ClockFilterSeries {
  /** Measured phase, in seconds; NaN marks a missing sample (prediction only, reported as `missing`). */
  readonly phase: ArrayLike<number>;
  /** Measurement variance, in s²: one value for all samples or one per sample. */
  readonly variance: number | ArrayLike<number>;
  /** Epochs, in seconds, strictly increasing; or give `tau0` for uniform sampling from t = 0. */
  readonly t?: ArrayLike<number>;
  /** Uniform sample spacing, in seconds (used when `t` is absent). */
  readonly tau0?: Seconds;
}

/** Options of {@link runClockFilter}. */
export interface ClockFilterRunOptions extends Omit<ClockKalmanOptions, 'initial'> {
  /**
   * Initial estimate at the first epoch. Default: state [z₀, 0(, 0)] from the first valid sample,
   * covariance diag(R₀, initialFrequencyStd²(, initialDriftStd²)).
   */
  readonly initial?: ClockEstimate;
  /** States when `initial` is absent (default 3 if q3 > 0, else 2). */
  readonly states?: ClockStates;
  /** Prior σ of the fractional frequency when `initial` is absent (default 1e-9). */
  readonly initialFrequencyStd?: Dimensionless;
  /** Prior σ of the drift, in 1/s, when `initial` is absent (default 1e-15 1/s ≈ 8.6e-11 per day). */
  readonly initialDriftStd?: number;
  /** Confidence of the mean-NIS bounds (default 0.95). */
  readonly nisConfidence?: number;
}

/** Per-epoch output of {@link runClockFilter}. */
export interface ClockFilterRun {
  readonly states: ClockStates;
  /** Epochs, in seconds. */
  readonly t: Float64Array;
  /** Posterior phase estimate, s. */
  readonly phase: Float64Array;
  /** Posterior fractional frequency estimate. */
  readonly frequency: Float64Array;
  /** Posterior drift estimate, 1/s (zeros for 2 states). */
  readonly drift: Float64Array;
  /** Posterior standard deviations of phase (s), frequency, drift (1/s). */
  readonly phaseStd: Float64Array;
  readonly frequencyStd: Float64Array;
  readonly driftStd: Float64Array;
  /** Innovation (s), its variance (s²) and NIS; NaN where the sample is missing. */
  readonly innovation: Float64Array;
  readonly innovationVariance: Float64Array;
  readonly nis: Float64Array;
  /** Per-epoch status. */
  readonly status: readonly ('accepted' | 'rejected' | 'missing')[];
  /** Indices of rejected samples. */
  readonly rejected: readonly number[];
  /** Declared jumps (`updateIndex` and `declaredAtUpdate` are sample indices here). */
  readonly jumps: readonly DetectedJump[];
  /**
   * Consistency: mean NIS over all epochs with a measurement (rejected ones included) and its
   * two-sided χ² bounds [χ²_{α/2}(N)/N, χ²_{1−α/2}(N)/N] for a consistent filter (Bar-Shalom, Li &
   * Kirubarajan, "Estimation with Applications to Tracking and Navigation", Wiley 2001, §5.4.2 [M]).
   */
  readonly nisSummary: { readonly mean: number; readonly count: number; readonly low: number; readonly high: number; readonly confidence: number };
  /** Final estimate. */
  readonly final: ClockEstimate;
}

/**
 * Runs {@link ClockKalmanFilter} over a whole phase series and returns per-epoch estimates,
 * innovations, NIS, flags, declared jumps and a mean-NIS consistency summary.
 *
 * @param series   Phase (s), variance (s²), and epochs `t` (s) or spacing `tau0` (s).
 * @param options  Filter options; see {@link ClockFilterRunOptions}.
 * @returns {@link ClockFilterRun}.
 * @throws {InvalidArgumentError} for empty or all-missing phase, non-increasing or non-finite epochs,
 *         a variance array of the wrong length, variance ≤ 0, or any filter option error.
 */
export function runClockFilter(series: ClockFilterSeries, options: ClockFilterRunOptions): ClockFilterRun {
  if (typeof series !== 'object' || series === null) throw new InvalidArgumentError('series', series, 'an object { phase, variance, t | tau0 }');
  if (typeof options !== 'object' || options === null) throw new InvalidArgumentError('options', options, 'filter options { q, ... }');
  const z = series.phase;
  if (!z || typeof z.length !== 'number' || z.length === 0) throw new InvalidArgumentError('series.phase', z, 'a non-empty array of phases in seconds');
  const n = z.length;
  const t = new Float64Array(n);
  if (series.t !== undefined) {
    if (typeof series.t.length !== 'number' || series.t.length !== n) {
      throw new InvalidArgumentError('series.t', series.t, `an array of ${n} epochs in seconds (one per phase sample)`);
    }
    for (let i = 0; i < n; i++) {
      t[i] = requirePhaseSample(`series.t[${i}]`, series.t[i], false);
      if (i > 0 && !((t[i] as number) > (t[i - 1] as number))) {
        throw new InvalidArgumentError(`series.t[${i}]`, t[i], `greater than series.t[${i - 1}] = ${t[i - 1]} (strictly increasing epochs)`);
      }
    }
  } else {
    const tau0 = requireInRange('series.tau0', series.tau0, 1e-9, 1e9, { unit: 's (sample spacing)' });
    for (let i = 0; i < n; i++) t[i] = i * tau0;
  }
  const v = series.variance;
  const varianceAt = (i: number): number => {
    if (typeof v === 'number') return requireMeasurementVariance('series.variance', v);
    return requireMeasurementVariance(`series.variance[${i}]`, v[i]);
  };
  if (typeof v !== 'number' && (!v || typeof v.length !== 'number' || v.length !== n)) {
    throw new InvalidArgumentError('series.variance', v, `a variance in s² or an array of ${n} variances`);
  }
  for (let i = 0; i < n; i++) {
    requirePhaseSample(`series.phase[${i}]`, z[i], true);
  }
  const first = Array.prototype.findIndex.call(z, (x: number) => !Number.isNaN(x));
  if (first < 0) throw new InvalidArgumentError('series.phase', 'all NaN', 'at least one valid phase sample');
  const q = requireDiffusion('options.q', options.q);
  let initial = options.initial;
  if (initial === undefined) {
    const states = options.states === undefined ? (q.q3 > 0 ? 3 : 2) : options.states;
    if (states !== 2 && states !== 3) throw new InvalidArgumentError('options.states', states, '2 or 3');
    const fs = options.initialFrequencyStd === undefined ? 1e-9 : requirePositive('options.initialFrequencyStd', options.initialFrequencyStd);
    const ds = options.initialDriftStd === undefined ? 1e-15 : requirePositive('options.initialDriftStd', options.initialDriftStd, '1/s');
    const r0 = varianceAt(first);
    initial = states === 2
      ? { t: t[first] as number, state: [z[first] as number, 0], covariance: [[r0, 0], [0, fs * fs]] }
      : { t: t[first] as number, state: [z[first] as number, 0, 0], covariance: [[r0, 0, 0], [0, fs * fs, 0], [0, 0, ds * ds]] };
  }
  const confidence = options.nisConfidence === undefined ? 0.95 : requireInRange('options.nisConfidence', options.nisConfidence, 1e-6, 1 - 1e-12);
  const filter = new ClockKalmanFilter({ ...options, initial });
  const out = {
    phase: new Float64Array(n), frequency: new Float64Array(n), drift: new Float64Array(n),
    phaseStd: new Float64Array(n), frequencyStd: new Float64Array(n), driftStd: new Float64Array(n),
    innovation: new Float64Array(n).fill(Number.NaN), innovationVariance: new Float64Array(n).fill(Number.NaN),
    nis: new Float64Array(n).fill(Number.NaN),
  };
  const status: ('accepted' | 'rejected' | 'missing')[] = [];
  const rejected: number[] = [];
  const jumps: DetectedJump[] = [];
  const updateToSample: number[] = [];
  let nisSum = 0;
  let nisCount = 0;
  const useDefaultInitial = options.initial === undefined;
  for (let i = 0; i < n; i++) {
    const ti = t[i] as number;
    if (ti < filter.estimate.t) {
      // Epochs before a user-given initial estimate cannot be filtered.
      throw new InvalidArgumentError(`series.t[${i}]`, ti, `≥ the initial estimate epoch ${filter.estimate.t} s`);
    }
    let e: ClockEstimate;
    const zi = z[i] as number;
    if (Number.isNaN(zi) || (useDefaultInitial && i === first)) {
      // Missing sample, or the sample that initialised the state (used once, not twice).
      e = filter.predict(ti);
      status.push(Number.isNaN(zi) ? 'missing' : 'accepted');
    } else {
      filter.predict(ti);
      const u = filter.update(zi, varianceAt(i));
      updateToSample.push(i);
      out.innovation[i] = u.innovation;
      out.innovationVariance[i] = u.innovationVariance;
      out.nis[i] = u.nis;
      nisSum += u.nis;
      nisCount += 1;
      status.push(u.status);
      if (u.status === 'rejected') rejected.push(i);
      if (u.jump) {
        jumps.push({
          ...u.jump,
          updateIndex: updateToSample[u.jump.updateIndex] as number,
          declaredAtUpdate: i,
        });
      }
      e = u.estimate;
    }
    const c = e.covariance;
    out.phase[i] = e.state[0] as number;
    out.frequency[i] = e.state[1] as number;
    out.drift[i] = filter.states === 3 ? (e.state[2] as number) : 0;
    out.phaseStd[i] = Math.sqrt((c[0] as number[])[0] as number);
    out.frequencyStd[i] = Math.sqrt((c[1] as number[])[1] as number);
    out.driftStd[i] = filter.states === 3 ? Math.sqrt((c[2] as number[])[2] as number) : 0;
  }
  const alpha = 1 - confidence;
  const nisSummary = nisCount === 0
    ? { mean: Number.NaN, count: 0, low: Number.NaN, high: Number.NaN, confidence }
    : {
      mean: nisSum / nisCount, count: nisCount, confidence,
      low: chiSquareQuantile(alpha / 2, nisCount) / nisCount,
      high: chiSquareUpperQuantile(alpha / 2, nisCount) / nisCount,
    };
  return {
    states: filter.states, t, ...out, status, rejected, jumps, nisSummary, final: filter.estimate,
  };
}
