/**
 * Re-planning from fresh clock estimates: the Kalman filter of the clock-model module is run
 * over the estimates received so far (with every executed command and manoeuvre applied as a
 * known step), its estimate is carried to "now", the commands already uplinked are kept, and
 * the planner is run again from now on the scenario's own time base.
 *
 * @module
 */

import { ClockKalmanFilter } from '../clock-model/kalman.js';
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requireFinite, requireNonNegative, requirePositive } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import { add3, type Matrix3, mul3, processNoise, propagateMean, transition, transpose3 } from './clock-math.js';
import { cumulativeFrequency, feedForwardManeuvers } from './constraints.js';
import { planDeadband } from './deadband.js';
import { commandsToInternal } from './evaluate.js';
import { forwardOptimal, type OptimalModel, optimalModel, planOptimal } from './optimal.js';
import {
  buildPlan,
  type PlanOptions,
  resolveMethod,
  type SteeringCommand,
  type SteeringMethod,
  type SteeringPlan,
} from './plan.js';
import type { InternalCommand, StateJump } from './predict.js';
import { type NormalizedScenario, validateScenario } from './scenario.js';

/** One ground estimate of the clock offset. */
export interface ClockOffsetEstimate {
  /** Epoch of the estimate, in seconds since the scenario epoch (elapsed SI seconds). */
  tSeconds: Seconds;
  /** Estimated offset (onboard clock − system time), in seconds. */
  phaseSeconds: Seconds;
  /** 1σ of the estimate, in seconds (> 0). */
  sigmaSeconds: Seconds;
}

/** What a revised plan says about its revision. */
export interface PlanRevision {
  /** When the plan was revised, in elapsed SI seconds since the plan's `epoch` (the scenario epoch); `predicted.t` starts here. */
  nowSeconds: Seconds;
  /** Number of estimates the filter used. */
  estimatesUsed: number;
  /** The filter's state at `nowSeconds`: offset (s), fractional frequency, drift (1/s), and their 1σ. */
  state: {
    phaseSeconds: Seconds;
    fractionalFrequency: number;
    driftPerSecond: number;
    phaseSigmaSeconds: Seconds;
    frequencySigma: number;
  };
  /** Commands of the previous plan already executed before `nowSeconds` (kept, not in `commands`). */
  executed: SteeringCommand[];
  /** Commands of the previous plan not yet uplinked at `nowSeconds`, replaced by the revision. */
  superseded: SteeringCommand[];
}

/** A plan revised by {@link replanSteering}; its `epoch` is the scenario epoch (JSON: `steeringPlanToJson`). */
export interface RevisedSteeringPlan extends SteeringPlan {
  revision: PlanRevision;
}

/** Mean and covariance of the 3-state clock at a time. */
export interface StateEstimate {
  state: [number, number, number];
  covariance: Matrix3;
}

/** Carries an estimate forward by dt ≥ 0: s' = Φs, P' = ΦPΦᵀ + Q(dt) (Zucca & Tavella 2005; physics-refs §11). */
export function propagateEstimate(e: StateEstimate, dt: number, norm: NormalizedScenario): StateEstimate {
  if (dt <= 0) return e;
  const phi = transition(dt);
  return {
    state: propagateMean(e.state, dt),
    covariance: add3(mul3(phi, mul3(e.covariance, transpose3(phi))), processNoise(dt, norm.noise)),
  };
}

/** The scenario seen from `now`: epoch, state, covariance, windows, manoeuvres and horizon shifted; `initial` the steering already applied. */
export function shiftScenario(
  norm: NormalizedScenario,
  now: Seconds,
  est: StateEstimate,
  initial: number,
  end = norm.horizon,
): NormalizedScenario {
  return {
    ...norm,
    epoch: norm.epoch.plus(now),
    horizon: end - now,
    state0: [...est.state],
    covariance0: est.covariance,
    windows: norm.windows
      .filter((w) => w.end > now && w.start < end)
      .map((w) => ({ start: Math.max(0, w.start - now), end: Math.min(end, w.end) - now })),
    maneuvers: norm.maneuvers.filter((m) => m.t >= now && m.t <= end).map((m) => ({ ...m, t: m.t - now })),
    actuator: { ...norm.actuator, initial },
  };
}

const shift = (c: InternalCommand, dt: number): InternalCommand => ({
  ...c,
  uplinkAt: c.uplinkAt + dt,
  executeAt: c.executeAt + dt,
});

/** How a method re-plans: built once per scenario (open-loop plan decides the optimal planner's weight). */
export interface Replanner {
  method: SteeringMethod;
  norm: NormalizedScenario;
  /** Feed-forward manoeuvre commands (every steering method flies them). */
  feedForward: InternalCommand[];
  /** The optimal planner's model, unless it kept the deadband schedule. */
  model?: OptimalModel;
}

export function makeReplanner(norm: NormalizedScenario, method: SteeringMethod): Replanner {
  if (method === 'none') return { method, norm, feedForward: [] };
  const feedForward = feedForwardManeuvers(norm).commands;
  if (method === 'deadband') return { method, norm, feedForward };
  const open = planOptimal(norm, feedForward);
  return open.optimal && !open.optimal.deadbandKept
    ? { method, norm, feedForward, model: optimalModel(norm, feedForward, open.optimal.scale) }
    : { method, norm, feedForward };
}

/**
 * New commands executing in [now, until) from the estimate at `now` (before any jump at `now`).
 * `cumulative`: initial steering plus every frequency command executed or fixed (feed-forward
 * included); `fixedAfter`: fixed commands executing at or after `now`; `lastExecuted`: the
 * execution time of the latest command before now (for the minimum spacing).
 */
export function replanFrom(
  rp: Replanner,
  now: Seconds,
  until: Seconds,
  est: StateEstimate,
  cumulative: number,
  fixedAfter: readonly InternalCommand[],
  explain: boolean,
  lastExecuted = -Infinity,
): InternalCommand[] {
  if (rp.method === 'none') return [];
  if (rp.model) return forwardOptimal(rp.model, { t: now, state: est.state, cumulative }, until, explain);
  const fixedSum = fixedAfter.reduce((s, c) => s + (c.kind === 'frequency' ? c.amount : 0), 0);
  const shifted = shiftScenario(rp.norm, now, est, cumulative - fixedSum);
  const notBefore = lastExecuted + rp.norm.actuator.spacing - now;
  const planned = planDeadband(
    shifted,
    fixedAfter.map((c) => shift(c, -now)),
    until - now,
    notBefore,
  ).commands;
  return planned.filter((c) => c.planner === 'deadband').map((c) => shift(c, now));
}

function requireEstimates(value: unknown, now: number): ClockOffsetEstimate[] {
  if (!Array.isArray(value))
    throw new InvalidArgumentError('estimates', value, 'an array of { tSeconds, phaseSeconds, sigmaSeconds }');
  let last = -Infinity;
  return value.map((e: unknown, i) => {
    if (typeof e !== 'object' || e === null)
      throw new InvalidArgumentError(`estimates[${i}]`, e, 'an object { tSeconds, phaseSeconds, sigmaSeconds }');
    const r = e as Record<string, unknown>;
    const t = requireNonNegative(`estimates[${i}].tSeconds`, r.tSeconds, 's');
    if (t > now)
      throw new InvalidArgumentError(
        `estimates[${i}].tSeconds`,
        t,
        `at most nowSeconds (${now} s): an estimate cannot come from the future`,
      );
    if (t < last)
      throw new InvalidArgumentError(
        `estimates[${i}].tSeconds`,
        t,
        `at or after estimates[${i - 1}].tSeconds (${last} s): estimates sorted by time`,
      );
    last = t;
    return {
      tSeconds: t,
      phaseSeconds: requireFinite(`estimates[${i}].phaseSeconds`, r.phaseSeconds, 'a finite offset in seconds'),
      sigmaSeconds: requirePositive(`estimates[${i}].sigmaSeconds`, r.sigmaSeconds, 's'),
    };
  });
}

/**
 * Runs the clock Kalman filter from the scenario's epoch estimate over `estimates` (each a phase
 * measurement with its variance), applying `jumps` (executed commands, manoeuvres) as known
 * steps at their epochs, and returns the estimate at `now`, before any jump at `now`. The filter's
 * `epoch` is the scenario epoch: estimate, jump and `now` times are seconds since it.
 */
export function filterTo(
  norm: NormalizedScenario,
  estimates: readonly ClockOffsetEstimate[],
  jumps: readonly StateJump[],
  now: number,
): StateEstimate {
  const filter = new ClockKalmanFilter({
    epoch: norm.epoch,
    q: norm.noise,
    initial: { t: 0, state: norm.state0, covariance: norm.covariance0 },
    outlierProbability: false,
    jumpDetection: false,
  });
  let k = 0;
  const applyUntil = (t: number, inclusive: boolean): void => {
    for (let jump = jumps[k]; jump && (jump.t < t || (inclusive && jump.t === t)); jump = jumps[++k]) {
      filter.predict(jump.t);
      filter.applyStep({ phase: jump.dx, frequency: jump.dy });
    }
  };
  for (const e of estimates) {
    applyUntil(e.tSeconds, true);
    filter.step(e.tSeconds, e.phaseSeconds, e.sigmaSeconds * e.sigmaSeconds);
  }
  applyUntil(now, false);
  const f = filter.estimate;
  const est: StateEstimate = {
    state: [at(f.state, 0, 'state'), at(f.state, 1, 'state'), at(f.state, 2, 'state')],
    covariance: f.covariance.map((r) => [...r]) as Matrix3,
  };
  return propagateEstimate(est, now - f.t, norm);
}

/** A scenario prepared for repeated re-planning (see {@link createReplanner}). */
export interface SteeringReplanner {
  /** The method it re-plans with. */
  readonly method: SteeringMethod;
  /** Revises `plan` at `nowSeconds` from `estimates`; see {@link replanSteering}. */
  replan(
    plan: Pick<SteeringPlan, 'commands'>,
    estimates: readonly ClockOffsetEstimate[],
    nowSeconds: number,
  ): RevisedSteeringPlan;
}

/**
 * Prepares a scenario for re-planning: validates it once, derives the feed-forward manoeuvre
 * commands and, for the optimal planner, picks the phase weight on the open-loop plan and runs
 * the backward (Riccati) pass once. Each `replan` then costs a filter pass over the estimates and
 * a forward pass from now (see `npm run bench -- steering`).
 *
 * @param scenario  The scenario (validated here).
 * @param options   `strategy` and `timeScales` as for planSteering.
 * @throws {InvalidArgumentError} naming the field for a bad scenario or option.
 */
export function createReplanner(scenario: unknown, options: PlanOptions = {}): SteeringReplanner {
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError('options', options, 'an object { strategy?, timeScales? }');
  const norm = validateScenario(scenario, options);
  const method = resolveMethod(norm, options.strategy);
  const rp = makeReplanner(norm, method);
  return { method, replan: (plan, estimates, nowSeconds) => revise(norm, rp, plan, estimates, nowSeconds) };
}

/**
 * Revises a plan at `nowSeconds` from the clock estimates received so far.
 *
 * 1. The commands of `plan` uplinked before now are kept (those executed before now are
 *    reported in `revision.executed`; those still pending stay in the schedule); the others are
 *    superseded.
 * 2. The clock Kalman filter (ClockKalmanFilter: 3-state model of Zucca & Tavella 2005, Kalman
 *    1960 updates) starts from the scenario's epoch mean and covariance, takes each estimate as
 *    a phase measurement with variance σ², and applies the manoeuvre rate changes and the kept
 *    commands as known steps; its estimate is carried to now.
 * 3. The planner (the scenario's method or `options.strategy`) plans from now to the end of the
 *    horizon on the same time base, with the kept commands fixed.
 *
 * The revised plan's `predicted` series starts at now, with σ from the filter's covariance,
 * and its verdict covers [now, end of horizon]. For repeated re-plans of one scenario, use
 * {@link createReplanner} (this call prepares the scenario every time).
 *
 * @param scenario     The scenario (validated here).
 * @param plan         The current plan (its `commands`).
 * @param estimates    Offset estimates received so far, sorted by `tSeconds` ≤ nowSeconds.
 * @param nowSeconds   When the plan is revised, in seconds since the scenario epoch, in [0, horizon).
 * @param options      `strategy` and `timeScales` as for planSteering.
 * @throws {InvalidArgumentError} naming the field for a bad scenario, command, estimate or now.
 */
export function replanSteering(
  scenario: unknown,
  plan: Pick<SteeringPlan, 'commands'>,
  estimates: readonly ClockOffsetEstimate[],
  nowSeconds: number,
  options: PlanOptions = {},
): RevisedSteeringPlan {
  return createReplanner(scenario, options).replan(plan, estimates, nowSeconds);
}

function revise(
  norm: NormalizedScenario,
  rp: Replanner,
  plan: Pick<SteeringPlan, 'commands'>,
  estimates: readonly ClockOffsetEstimate[],
  nowSeconds: number,
): RevisedSteeringPlan {
  const method = rp.method;
  const now = requireNonNegative('nowSeconds', nowSeconds, 's');
  if (now >= norm.horizon)
    throw new InvalidArgumentError('nowSeconds', now, `before the end of the horizon (${norm.horizon} s)`);
  if (typeof plan !== 'object' || plan === null) throw new InvalidArgumentError('plan', plan, 'a plan { commands }');
  const given = commandsToInternal(norm, plan.commands, 'plan.commands');
  const received = requireEstimates(estimates, now);
  const kept = given.map((c, i) => ({ c, i })).filter(({ c }) => c.uplinkAt < now);
  const executed = kept.filter(({ c }) => c.executeAt < now);
  const pending = kept.filter(({ c }) => c.executeAt >= now).map(({ c }) => c);
  const jumps: StateJump[] = [
    ...norm.maneuvers.map((m) => ({ t: m.t, dy: m.rateChange, dx: 0 })),
    ...executed.map(({ c }) =>
      c.kind === 'frequency' ? { t: c.executeAt, dy: c.amount, dx: 0 } : { t: c.executeAt, dy: 0, dx: c.amount },
    ),
  ].sort((a, b) => a.t - b.t);
  const est = filterTo(norm, received, jumps, now);
  // Feed-forward commands not yet uplinked are planned again (unless a kept command already executes there).
  const sameAs = (a: InternalCommand, b: InternalCommand): boolean =>
    a.kind === b.kind && a.steps === b.steps && Math.abs(a.executeAt - b.executeAt) < 1e-3;
  const fixedAfter = [
    ...pending,
    ...rp.feedForward.filter((f) => f.executeAt >= now && f.uplinkAt >= now && !pending.some((p) => sameAs(p, f))),
  ].sort((a, b) => a.executeAt - b.executeAt);
  const cumulative = cumulativeFrequency(norm, [...executed.map(({ c }) => c), ...fixedAfter]);
  const model =
    rp.model && fixedAfter.length !== rp.feedForward.filter((f) => f.executeAt >= now).length
      ? optimalModel(norm, fixedAfter, rp.model.scale)
      : rp.model;
  const lastExecuted = executed.reduce((t, { c }) => Math.max(t, c.executeAt), -Infinity);
  const made = replanFrom(
    { ...rp, ...(model ? { model } : {}) },
    now,
    Infinity,
    est,
    cumulative,
    fixedAfter,
    true,
    lastExecuted,
  );
  const shifted = shiftScenario(
    norm,
    now,
    est,
    norm.actuator.initial + executed.reduce((s, { c }) => s + (c.kind === 'frequency' ? c.amount : 0), 0),
  );
  const commands = [...fixedAfter, ...made].sort((a, b) => a.executeAt - b.executeAt).map((c) => shift(c, -now));
  const revised = buildPlan(shifted, method, { commands, limits: [], notes: [] });
  // The revised plan keeps the scenario's epoch: its relative times (grid, settled-after) are shifted back by now.
  revised.epoch = norm.epoch;
  revised.predicted.t = revised.predicted.t.map((t) => t + now);
  const settled = revised.metrics.settledAfterSeconds;
  revised.metrics.settledAfterSeconds = settled === null ? null : settled + now;
  const [[p00], [, p11]] = est.covariance;
  const sd = (variance: number): number => Math.sqrt(Math.max(0, variance));
  return {
    ...revised,
    revision: {
      nowSeconds: now,
      estimatesUsed: received.length,
      state: {
        phaseSeconds: est.state[0],
        fractionalFrequency: est.state[1],
        driftPerSecond: est.state[2],
        phaseSigmaSeconds: sd(p00),
        frequencySigma: sd(p11),
      },
      executed: executed.map(({ i }) => at(plan.commands, i, 'plan.commands')),
      superseded: plan.commands.filter((_, i) => at(given, i, 'commands').uplinkAt >= now),
    },
  };
}
