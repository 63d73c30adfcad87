/**
 * An adaptive explicit Runge–Kutta integrator for first-order ODE systems y' = f(t, y) on
 * `Float64Array` states: the Dormand–Prince 8(5,3) pair ("DOP853") with its 7th-order dense
 * output, written for this SDK.
 *
 * Method and coefficients: J. R. Dormand & P. J. Prince, "High order embedded Runge–Kutta
 * formulae", J. Comput. Appl. Math. 7 (1981) 67–75; E. Hairer, S. P. Nørsett & G. Wanner,
 * "Solving Ordinary Differential Equations I", 2nd ed., Springer (1993), §II.5 (the 8(5,3)
 * pair and its error estimator), §II.6 (dense output), §II.4 (step-size control) [M for the
 * section numbers]. The coefficient values are the published ones of that method.
 *
 * @module
 */
import { ConvergenceError, InvalidArgumentError } from '../errors.js';
import { requireFinite, requireInteger, requireOptions, requirePositive } from '../internal/validate.js';
import { A, B, C, D, E3, E5 } from './dop853-tableau.js';

/** Right-hand side of y' = f(t, y): writes dy/dt into `dydt` (same length as `y`); must not keep `y`. */
export type OdeRightHandSide = (t: number, y: Float64Array, dydt: Float64Array) => void;

/** Options of {@link integrateDop853}. */
export interface Dop853Options {
  /** Relative tolerance per component (default 1e-12). */
  relativeTolerance?: number;
  /** Absolute tolerance, one number for all components or one per component (default 1e-12), in the state's units. */
  absoluteTolerance?: number | ArrayLike<number>;
  /** First trial step, in the unit of t; chosen automatically (Hairer's starting-step algorithm) when omitted. */
  initialStep?: number;
  /** Largest step allowed, in the unit of t (default: the whole span). */
  maxStep?: number;
  /** Limit on accepted + rejected steps before a {@link ConvergenceError}, an integer in [1, 1e7] (default 1 000 000). */
  maxSteps?: number;
  /**
   * Times at which to return the state (strictly increasing, within [t0, tEnd]), evaluated by the
   * dense output; the result's `samples` holds them row by row.
   */
  sampleTimes?: ArrayLike<number>;
  /** Keep every step's dense-output polynomial so `result.evaluate(t)` works anywhere (default false). */
  keepDenseOutput?: boolean;
  /** Called after each accepted step with its end time and state; may throw to stop the integration. */
  onStep?: (t: number, y: Float64Array) => void;
}

/** Outcome of {@link integrateDop853}. */
export interface Dop853Result {
  /** State at tEnd. */
  readonly finalState: Float64Array;
  /** `sampleTimes.length × n` states at the requested sample times, row-major (empty when none asked). */
  readonly samples: Float64Array;
  readonly acceptedSteps: number;
  readonly rejectedSteps: number;
  readonly functionEvaluations: number;
  /**
   * Dense-output state at any t in [t0, tEnd] (only with `keepDenseOutput`), 7th-order interpolant.
   * @throws {InvalidArgumentError} if t is outside the integrated span or dense output was not kept.
   */
  evaluate(t: number, out?: Float64Array): Float64Array;
}

/** Number of stages of the 8th-order step (the 13th is f at the new point, reused by the next step). */
const N_STAGES = 12;
/** Order used in the step-size exponent: the error estimate behaves like h⁸ (Hairer et al. 1993, §II.4). */
const ERROR_EXPONENT = 1 / 8;
/** Step-size controller: safety factor 0.9 and step ratio limited to [0.2, 10]; common practice, no source (Hairer et al. discuss such limits in §II.4 [M]). */
const SAFETY = 0.9;
const MIN_FACTOR = 0.2;
const MAX_FACTOR = 10;

interface Segment {
  t0: number;
  h: number;
  y0: Float64Array;
  F: Float64Array;
}

/** Largest `maxSteps` accepted (ten million steps: minutes of work, the bound on any one call). */
const MAX_STEPS_LIMIT = 10_000_000;

/** Validated inputs of {@link integrateDop853}. */
interface Dop853Setup {
  readonly n: number;
  /** Copy of y0, the state integrated in place. */
  readonly y: Float64Array;
  readonly rtol: number;
  readonly atol: Float64Array;
  readonly maxStep: number;
  readonly maxSteps: number;
  readonly sampleTimes: Float64Array;
  readonly keep: boolean;
}

function setupDop853(
  f: OdeRightHandSide,
  t0: number,
  y0: ArrayLike<number>,
  tEnd: number,
  options: Dop853Options,
): Dop853Setup {
  if (typeof f !== 'function')
    throw new InvalidArgumentError('f', f, 'a function (t, y, dydt) writing the derivative into dydt');
  if (!Array.isArray(y0) && !(y0 instanceof Float64Array))
    throw new InvalidArgumentError('y0', y0, 'an array of finite numbers');
  requireOptions('options', options);
  requireFinite('t0', t0);
  requireFinite('tEnd', tEnd);
  if (!(tEnd > t0)) throw new InvalidArgumentError('tEnd', tEnd, `greater than t0 = ${t0}`);
  const n = y0.length;
  if (n === 0) throw new InvalidArgumentError('y0', y0, 'a state with at least one component');
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) y[i] = requireFinite(`y0[${i}]`, y0[i]);
  const rtol = requirePositive('relativeTolerance', options.relativeTolerance ?? 1e-12);
  if (rtol < 1e-15)
    throw new InvalidArgumentError('relativeTolerance', rtol, '≥ 1e-15 (below that, rounding error dominates)');
  const atol = new Float64Array(n);
  const atolIn = options.absoluteTolerance ?? 1e-12;
  if (typeof atolIn === 'number') {
    requirePositive('absoluteTolerance', atolIn);
    atol.fill(atolIn);
  } else {
    if (atolIn.length !== n)
      throw new InvalidArgumentError('absoluteTolerance', atolIn, `one value per state component (${n})`);
    for (let i = 0; i < n; i++) atol[i] = requirePositive(`absoluteTolerance[${i}]`, atolIn[i]);
  }
  const maxStep = options.maxStep === undefined ? tEnd - t0 : requirePositive('maxStep', options.maxStep);
  const maxSteps = requireInteger('maxSteps', options.maxSteps ?? 1_000_000, 1, MAX_STEPS_LIMIT);
  const given = options.sampleTimes ?? [];
  const sampleTimes = new Float64Array(given.length);
  for (let k = 0; k < given.length; k++) {
    const s = requireFinite(`sampleTimes[${k}]`, given[k]);
    if (s < t0 || s > tEnd) throw new InvalidArgumentError(`sampleTimes[${k}]`, s, `within [${t0}, ${tEnd}]`);
    if (k > 0 && !(s > sampleTimes[k - 1]!)) {
      throw new InvalidArgumentError(
        `sampleTimes[${k}]`,
        s,
        `greater than sampleTimes[${k - 1}] (strictly increasing)`,
      );
    }
    sampleTimes[k] = s;
  }
  return { n, y, rtol, atol, maxStep, maxSteps, sampleTimes, keep: options.keepDenseOutput ?? false };
}

/** The stage storage and arithmetic of one DOP853 step on an n-component state. */
class Dop853Stages {
  /** Stages K[0..15]; K[0] is f at the step's start, K[12] f at the new point. */
  readonly K: Float64Array[];
  readonly yNew: Float64Array;
  readonly fNew: Float64Array;
  /** Dense-output coefficients F0..F6 of the last accepted step, n each. */
  readonly F: Float64Array;
  functionEvaluations = 0;
  private readonly yStage: Float64Array;

  constructor(
    private readonly f: OdeRightHandSide,
    private readonly n: number,
  ) {
    this.K = Array.from({ length: 16 }, () => new Float64Array(n));
    this.yStage = new Float64Array(n);
    this.yNew = new Float64Array(n);
    this.fNew = new Float64Array(n);
    this.F = new Float64Array(7 * n);
  }

  call(t: number, state: Float64Array, out: Float64Array): void {
    this.f(t, state, out);
    this.functionEvaluations++;
  }

  /** Runge–Kutta stage s: K_s = f(t + c_s h, y + h Σ_{j<s} a_sj K_j) (Hairer, Nørsett & Wanner 1993, §II.1 [M]). */
  evaluateStage(s: number, t: number, h: number, y: Float64Array): void {
    const { K, yStage, n } = this;
    const a = A[s]!;
    for (let i = 0; i < n; i++) {
      let acc = 0;
      for (let j = 0; j < s; j++) acc += a[j]! * K[j]![i]!;
      yStage[i] = y[i]! + h * acc;
    }
    this.call(t + C[s]! * h, yStage, K[s]!);
  }

  /**
   * The 8th-order trial step from (t, y) to tNew = t + h (yNew, fNew) and its error measure
   * err = |h|·‖e5‖²/√(n·(‖e5‖² + 0.01‖e3‖²)) (Hairer et al. 1993, §II.10, DOP853 "err5/err3" norm);
   * NaN when the trial point is not finite.
   */
  trialStep(t: number, h: number, tNew: number, y: Float64Array, atol: Float64Array, rtol: number): number {
    const { K, yNew, fNew, n } = this;
    // Stages 2..12.
    for (let s = 1; s < N_STAGES; s++) this.evaluateStage(s, t, h, y);
    for (let i = 0; i < n; i++) {
      let acc = 0;
      for (let j = 0; j < N_STAGES; j++) acc += B[j]! * K[j]![i]!;
      yNew[i] = y[i]! + h * acc;
    }
    this.call(tNew, yNew, fNew);
    K[12]!.set(fNew);
    let e5sq = 0;
    let e3sq = 0;
    let finite = true;
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(yNew[i]!) || !Number.isFinite(fNew[i]!)) finite = false;
      const sc = atol[i]! + rtol * Math.max(Math.abs(y[i]!), Math.abs(yNew[i]!));
      let e5 = 0;
      let e3 = 0;
      for (let j = 0; j <= N_STAGES; j++) {
        e5 += E5[j]! * K[j]![i]!;
        e3 += E3[j]! * K[j]![i]!;
      }
      e5 /= sc;
      e3 /= sc;
      e5sq += e5 * e5;
      e3sq += e3 * e3;
    }
    let err = 0;
    if (e5sq > 0 || e3sq > 0) err = (h * e5sq) / Math.sqrt(n * (e5sq + 0.01 * e3sq));
    return finite && Number.isFinite(err) ? err : Number.NaN;
  }

  /** Dense output of the accepted step from (t, y) (Hairer et al. 1993, §II.6): three extra stages, then F0..F6. */
  denseCoefficients(t: number, h: number, y: Float64Array): void {
    const { K, yNew, fNew, F, n } = this;
    for (let s = 13; s < 16; s++) this.evaluateStage(s, t, h, y);
    for (let i = 0; i < n; i++) {
      const dy = yNew[i]! - y[i]!;
      F[i] = dy;
      F[n + i] = h * K[0]![i]! - dy;
      F[2 * n + i] = 2 * dy - h * (fNew[i]! + K[0]![i]!);
      for (let r = 0; r < 4; r++) {
        const d = D[r]!;
        let acc = 0;
        for (let j = 0; j < 16; j++) acc += d[j]! * K[j]![i]!;
        F[(3 + r) * n + i] = h * acc;
      }
    }
  }
}

/** The dense-output evaluator of a result: binary search of the kept segments, then the step's interpolant. */
function denseEvaluator(segments: readonly Segment[], keep: boolean, t0: number, tEnd: number, n: number) {
  return (time: number, out: Float64Array = new Float64Array(n)): Float64Array => {
    if (!keep) throw new InvalidArgumentError('keepDenseOutput', false, 'true to evaluate the solution between steps');
    requireFinite('t', time);
    if (time < t0 || time > tEnd)
      throw new InvalidArgumentError('t', time, `within the integrated span [${t0}, ${tEnd}]`);
    let lo = 0;
    let hi = segments.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (segments[mid]!.t0 <= time) lo = mid;
      else hi = mid - 1;
    }
    const seg = segments[lo]!;
    denseEvaluate(seg.y0, seg.F, (time - seg.t0) / seg.h, n, out, 0);
    return out;
  };
}

/**
 * Integrates y' = f(t, y) from t0 to tEnd (tEnd > t0) with the Dormand–Prince 8(5,3) pair and
 * adaptive step size; the state can be sampled at given times through the 7th-order dense output.
 *
 * Error control (Hairer et al. 1993, §II.10, DOP853): per component the scale is
 * atol_i + rtol·max(|y_i|, |y_new,i|); the step is accepted when the combined 5th/3rd-order
 * estimate err = |h|·‖e5‖²/√(n·(‖e5‖² + 0.01‖e3‖²)) ≤ 1, and the next step is h·clamp(0.9·err^(−1/8), 0.2, 10)
 * (the clamp limits are common practice, no source).
 *
 * Accuracy: the global error is typically a small multiple of the tolerances; verify by halving
 * them (the SDK's own tests do this for orbit + clock integrations).
 *
 * @param f     Right-hand side, writing dy/dt into its third argument.
 * @param t0    Start time (any unit, typically seconds).
 * @param y0    Initial state (not modified).
 * @param tEnd  End time, greater than t0.
 * @param options Tolerances, sampling and step limits.
 * @returns Final state, samples, step statistics and (optionally) a dense-output evaluator.
 * @throws {InvalidArgumentError} for a non-finite y0, tEnd ≤ t0, bad tolerances or sample times.
 * @throws {ConvergenceError} if the step size collapses, the state becomes non-finite, or maxSteps is exceeded.
 * @see E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed. (1993), §II.5, §II.6, §II.10 [M].
 */
export function integrateDop853(
  f: OdeRightHandSide,
  t0: number,
  y0: ArrayLike<number>,
  tEnd: number,
  options: Dop853Options = {},
): Dop853Result {
  const { n, y, rtol, atol, maxStep, maxSteps, sampleTimes, keep } = setupDop853(f, t0, y0, tEnd, options);
  const samples = new Float64Array(sampleTimes.length * n);
  const segments: Segment[] = [];
  const stages = new Dop853Stages(f, n);
  const { K, yNew, fNew, F } = stages;
  const f0 = K[0]!;
  let t = t0;
  stages.call(t, y, f0);
  checkFinite(f0, t, 'dy/dt at the initial state');
  const span = tEnd - t0;
  let h =
    options.initialStep !== undefined
      ? requirePositive('initialStep', options.initialStep)
      : startingStep((time, state, out) => stages.call(time, state, out), t, y, f0, atol, rtol, span, n);
  h = Math.min(h, maxStep, span);
  let accepted = 0;
  let rejected = 0;
  let nextSample = 0;
  // Samples at exactly t0.
  while (nextSample < sampleTimes.length && sampleTimes[nextSample]! === t0) {
    samples.set(y, nextSample * n);
    nextSample++;
  }
  let rejectedLast = false;
  while (t < tEnd) {
    if (accepted + rejected >= maxSteps)
      throw new ConvergenceError(`DOP853 integration to t = ${tEnd}`, accepted + rejected, tEnd - t);
    const minStep = 10 * Math.abs(Math.max(Math.abs(t), Math.abs(tEnd))) * Number.EPSILON;
    if (h < minStep)
      throw new ConvergenceError(
        `DOP853 step size at t = ${t} (step ${h} below the rounding limit)`,
        accepted + rejected,
        h,
      );
    let last = false;
    if (t + h >= tEnd || tEnd - (t + h) < minStep) {
      h = tEnd - t;
      last = true;
    }
    const tNew = last ? tEnd : t + h;
    const err = stages.trialStep(t, h, tNew, y, atol, rtol);
    if (Number.isNaN(err)) {
      // A non-finite trial point: retry with a much smaller step before giving up.
      rejected++;
      rejectedLast = true;
      h *= MIN_FACTOR;
      if (h < minStep)
        throw new ConvergenceError(
          `DOP853 integration at t = ${t}: the state became non-finite`,
          accepted + rejected,
          Number.NaN,
        );
      continue;
    }
    if (err > 1) {
      rejected++;
      rejectedLast = true;
      h *= Math.max(MIN_FACTOR, SAFETY * err ** -ERROR_EXPONENT);
      continue;
    }
    // Accepted. Dense output when a sample falls in the step or the caller keeps it.
    if (keep || (nextSample < sampleTimes.length && sampleTimes[nextSample]! <= tNew)) {
      stages.denseCoefficients(t, h, y);
      while (nextSample < sampleTimes.length && sampleTimes[nextSample]! <= tNew) {
        denseEvaluate(y, F, (sampleTimes[nextSample]! - t) / h, n, samples, nextSample * n);
        nextSample++;
      }
      if (keep) segments.push({ t0: t, h, y0: Float64Array.from(y), F: Float64Array.from(F) });
    }
    t = tNew;
    y.set(yNew);
    f0.set(fNew);
    accepted++;
    options.onStep?.(t, y);
    const factor = Math.min(MAX_FACTOR, Math.max(MIN_FACTOR, SAFETY * (err === 0 ? Infinity : err ** -ERROR_EXPONENT)));
    h = Math.min(maxStep, h * (rejectedLast ? Math.min(1, factor) : factor));
    rejectedLast = false;
  }
  // Samples exactly at tEnd that rounding may have left.
  for (; nextSample < sampleTimes.length; nextSample++) samples.set(y, nextSample * n);
  return {
    finalState: Float64Array.from(y),
    samples,
    acceptedSteps: accepted,
    rejectedSteps: rejected,
    functionEvaluations: stages.functionEvaluations,
    evaluate: denseEvaluator(segments, keep, t0, tEnd, n),
  };
}

/** DOP853 continuous extension: y(t0 + x·h) = y0 + x(F0 + (1−x)(F1 + x(F2 + (1−x)(F3 + x(F4 + (1−x)(F5 + x·F6)))))) (Hairer et al. 1993, §II.6). */
function denseEvaluate(
  y0: Float64Array,
  F: Float64Array,
  x: number,
  n: number,
  out: Float64Array,
  offset: number,
): void {
  const x1 = 1 - x;
  for (let i = 0; i < n; i++) {
    let acc = F[6 * n + i]!;
    acc = F[5 * n + i]! + x * acc;
    acc = F[4 * n + i]! + x1 * acc;
    acc = F[3 * n + i]! + x * acc;
    acc = F[2 * n + i]! + x1 * acc;
    acc = F[n + i]! + x * acc;
    acc = F[i]! + x1 * acc;
    out[offset + i] = y0[i]! + x * acc;
  }
}

/** Starting step size (Hairer, Nørsett & Wanner 1993, §II.4, "Starting step size" algorithm). */
function startingStep(
  call: (t: number, y: Float64Array, out: Float64Array) => void,
  t: number,
  y: Float64Array,
  f0: Float64Array,
  atol: Float64Array,
  rtol: number,
  span: number,
  n: number,
): number {
  let d0 = 0;
  let d1 = 0;
  for (let i = 0; i < n; i++) {
    const sc = atol[i]! + rtol * Math.abs(y[i]!);
    d0 += (y[i]! / sc) ** 2;
    d1 += (f0[i]! / sc) ** 2;
  }
  d0 = Math.sqrt(d0 / n);
  d1 = Math.sqrt(d1 / n);
  let h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : 0.01 * (d0 / d1);
  h0 = Math.min(h0, span);
  const y1 = new Float64Array(n);
  const f1 = new Float64Array(n);
  for (let i = 0; i < n; i++) y1[i] = y[i]! + h0 * f0[i]!;
  call(t + h0, y1, f1);
  let d2 = 0;
  for (let i = 0; i < n; i++) {
    const sc = atol[i]! + rtol * Math.abs(y[i]!);
    d2 += ((f1[i]! - f0[i]!) / sc) ** 2;
  }
  d2 = Math.sqrt(d2 / n) / h0;
  const h1 = Math.max(d1, d2) <= 1e-15 ? Math.max(1e-6, h0 * 1e-3) : (0.01 / Math.max(d1, d2)) ** ERROR_EXPONENT;
  return Math.min(100 * h0, h1);
}

function checkFinite(v: Float64Array, t: number, what: string): void {
  for (let i = 0; i < v.length; i++) {
    if (!Number.isFinite(v[i]!))
      throw new InvalidArgumentError(
        `${what}[${i}]`,
        v[i],
        `finite at t = ${t} (the right-hand side returned a non-finite value)`,
      );
  }
}
