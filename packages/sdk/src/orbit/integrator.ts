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
import { at } from '../internal/checked.js';
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
  let previous = Number.NEGATIVE_INFINITY;
  for (let k = 0; k < given.length; k++) {
    const s = requireFinite(`sampleTimes[${k}]`, given[k]);
    if (s < t0 || s > tEnd) throw new InvalidArgumentError(`sampleTimes[${k}]`, s, `within [${t0}, ${tEnd}]`);
    if (!(s > previous)) {
      throw new InvalidArgumentError(
        `sampleTimes[${k}]`,
        s,
        `greater than sampleTimes[${k - 1}] (strictly increasing)`,
      );
    }
    sampleTimes[k] = s;
    previous = s;
  }
  return { n, y, rtol, atol, maxStep, maxSteps, sampleTimes, keep: options.keepDenseOutput ?? false };
}

/**
 * Stage K_s = f(t + c_s h, y + h Σ_j a_sj K_j): its node, the weights a_sj of the earlier stages (the tableau row as
 * a Float64Array, zero weights kept) and its own vector (a view into the stage block).
 */
interface StagePlan {
  readonly c: number;
  readonly weights: Float64Array;
  readonly k: Float64Array;
}

/**
 * acc_i = Σ_j w_j K_j,i for j ascending, K the stage block (stage j at K[j·n .. j·n + n − 1]): the same additions in
 * the same order as the published inner sum, so bit-identical to it. Hot: indices bounded by the loop conditions,
 * m = weights.length ≤ 16 stages and n = acc.length, with K holding 16 stages of n.
 */
function accumulate(weights: Float64Array, K: Float64Array, acc: Float64Array): void {
  const n = acc.length;
  const m = weights.length;
  for (let i = 0; i < n; i++) {
    let sum = 0;
    for (let j = 0; j < m; j++) sum += weights[j]! * K[j * n + i]!;
    acc[i] = sum;
  }
}

/**
 * The stage storage and arithmetic of one DOP853 step on an n-component state. The tableau (C, A, B, E3, E5, D) is
 * paired with the stage vectors once, here; the per-component loops index arrays of length n (bounded by n).
 */
class Dop853Stages {
  /** K_1: f at the step's start (set to f at the new point when a step is accepted). */
  readonly f0: Float64Array;
  readonly yNew: Float64Array;
  readonly fNew: Float64Array;
  /** Dense-output coefficients F0..F6 of the last accepted step, n each. */
  readonly F: Float64Array;
  functionEvaluations = 0;
  private readonly yStage: Float64Array;
  /** K_13: f at the trial point, which the error estimators weigh. */
  private readonly kNew: Float64Array;
  /** Stages 2..12 of the 8th-order step. */
  private readonly trialStages: readonly StagePlan[];
  /** Stages 14..16 of the dense output. */
  private readonly denseStages: readonly StagePlan[];
  /** The 16 stage vectors K_1..K_16, n each, one block. */
  private readonly K: Float64Array;
  /** Weights B (8th-order solution), E5 and E3 (error estimators). */
  private readonly solution: Float64Array;
  private readonly error5: Float64Array;
  private readonly error3: Float64Array;
  private readonly e5: Float64Array;
  private readonly e3: Float64Array;
  /** Rows D_0..D_3 of the dense-output matrix with the coefficient rows F3..F6 they give. */
  private readonly denseRows: readonly { readonly weights: Float64Array; readonly row: Float64Array }[];

  constructor(
    private readonly f: OdeRightHandSide,
    private readonly n: number,
  ) {
    const K = new Float64Array(16 * n);
    const stage = (s: number): Float64Array => K.subarray(s * n, (s + 1) * n);
    const plan = (s: number): StagePlan => ({
      c: at(C, s, 'C'),
      weights: Float64Array.from(at(A, s, 'A')),
      k: stage(s),
    });
    this.K = K;
    this.f0 = stage(0);
    this.kNew = stage(N_STAGES);
    this.trialStages = Array.from({ length: N_STAGES - 1 }, (_, s) => plan(s + 1));
    this.denseStages = Array.from({ length: 3 }, (_, s) => plan(s + N_STAGES + 1));
    this.solution = Float64Array.from(B);
    this.error5 = Float64Array.from(E5);
    this.error3 = Float64Array.from(E3);
    this.yStage = new Float64Array(n);
    this.yNew = new Float64Array(n);
    this.fNew = new Float64Array(n);
    this.e5 = new Float64Array(n);
    this.e3 = new Float64Array(n);
    this.F = new Float64Array(7 * n);
    this.denseRows = D.map((d, r) => ({
      weights: Float64Array.from(d),
      row: this.F.subarray((3 + r) * n, (4 + r) * n),
    }));
  }

  call(t: number, state: Float64Array, out: Float64Array): void {
    this.f(t, state, out);
    this.functionEvaluations++;
  }

  /** Runge–Kutta stage s: K_s = f(t + c_s h, y + h Σ_{j<s} a_sj K_j) (Hairer, Nørsett & Wanner 1993, §II.1 [M]). */
  private evaluateStage({ c, weights, k }: StagePlan, t: number, h: number, y: Float64Array): void {
    const { yStage, n } = this;
    accumulate(weights, this.K, yStage);
    for (let i = 0; i < n; i++) yStage[i] = y[i]! + h * yStage[i]!;
    this.call(t + c * h, yStage, k);
  }

  /**
   * The 8th-order trial step from (t, y) to tNew = t + h (yNew, fNew) and its error measure
   * err = |h|·‖e5‖²/√(n·(‖e5‖² + 0.01‖e3‖²)) (Hairer et al. 1993, §II.10, DOP853 "err5/err3" norm);
   * NaN when the trial point is not finite.
   */
  trialStep(t: number, h: number, tNew: number, y: Float64Array, atol: Float64Array, rtol: number): number {
    const { yNew, fNew, e5, e3, n } = this;
    for (const stage of this.trialStages) this.evaluateStage(stage, t, h, y);
    accumulate(this.solution, this.K, yNew);
    for (let i = 0; i < n; i++) yNew[i] = y[i]! + h * yNew[i]!;
    this.call(tNew, yNew, fNew);
    this.kNew.set(fNew);
    accumulate(this.error5, this.K, e5);
    accumulate(this.error3, this.K, e3);
    let e5sq = 0;
    let e3sq = 0;
    let finite = true;
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(yNew[i]) || !Number.isFinite(fNew[i])) finite = false;
      const sc = atol[i]! + rtol * Math.max(Math.abs(y[i]!), Math.abs(yNew[i]!));
      const e5i = e5[i]! / sc;
      const e3i = e3[i]! / sc;
      e5sq += e5i * e5i;
      e3sq += e3i * e3i;
    }
    let err = 0;
    if (e5sq > 0 || e3sq > 0) err = (h * e5sq) / Math.sqrt(n * (e5sq + 0.01 * e3sq));
    return finite && Number.isFinite(err) ? err : Number.NaN;
  }

  /** Dense output of the accepted step from (t, y) (Hairer et al. 1993, §II.6): three extra stages, then F0..F6. */
  denseCoefficients(t: number, h: number, y: Float64Array): void {
    const { f0, yNew, fNew, F, n } = this;
    for (const stage of this.denseStages) this.evaluateStage(stage, t, h, y);
    for (let i = 0; i < n; i++) {
      const dy = yNew[i]! - y[i]!;
      F[i] = dy;
      F[n + i] = h * f0[i]! - dy;
      F[2 * n + i] = 2 * dy - h * (fNew[i]! + f0[i]!);
    }
    for (const { weights, row } of this.denseRows) {
      accumulate(weights, this.K, row);
      for (let i = 0; i < n; i++) row[i] = h * row[i]!;
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
      if (at(segments, mid, 'segments').t0 <= time) lo = mid;
      else hi = mid - 1;
    }
    const seg = at(segments, lo, 'segments');
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
  const { f0, yNew, fNew, F } = stages;
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
  while (sampleTimes[nextSample] === t0) {
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
    let sample = sampleTimes[nextSample];
    if (keep || (sample !== undefined && sample <= tNew)) {
      stages.denseCoefficients(t, h, y);
      for (; sample !== undefined && sample <= tNew; sample = sampleTimes[nextSample]) {
        denseEvaluate(y, F, (sample - t) / h, n, samples, nextSample * n);
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

/**
 * DOP853 continuous extension: y(t0 + x·h) = y0 + x(F0 + (1−x)(F1 + x(F2 + (1−x)(F3 + x(F4 + (1−x)(F5 + x·F6))))))
 * (Hairer et al. 1993, §II.6). Hot loop: indices bounded by n = y0.length, F holds the 7 rows of n.
 */
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
  const scale = Float64Array.from(y, (yi, i) => at(atol, i, 'atol') + rtol * Math.abs(yi));
  let d0 = 0;
  let d1 = 0;
  for (const [i, sc] of scale.entries()) {
    d0 += (at(y, i, 'y') / sc) ** 2;
    d1 += (at(f0, i, 'f0') / sc) ** 2;
  }
  d0 = Math.sqrt(d0 / n);
  d1 = Math.sqrt(d1 / n);
  let h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : 0.01 * (d0 / d1);
  h0 = Math.min(h0, span);
  const y1 = Float64Array.from(y, (yi, i) => yi + h0 * at(f0, i, 'f0'));
  const f1 = new Float64Array(n);
  call(t + h0, y1, f1);
  let d2 = 0;
  for (const [i, sc] of scale.entries()) d2 += ((at(f1, i, 'f1') - at(f0, i, 'f0')) / sc) ** 2;
  d2 = Math.sqrt(d2 / n) / h0;
  const h1 = Math.max(d1, d2) <= 1e-15 ? Math.max(1e-6, h0 * 1e-3) : (0.01 / Math.max(d1, d2)) ** ERROR_EXPONENT;
  return Math.min(100 * h0, h1);
}

function checkFinite(v: Float64Array, t: number, what: string): void {
  for (const [i, value] of v.entries()) {
    if (!Number.isFinite(value))
      throw new InvalidArgumentError(
        `${what}[${i}]`,
        value,
        `finite at t = ${t} (the right-hand side returned a non-finite value)`,
      );
  }
}
