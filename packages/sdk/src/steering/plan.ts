/**
 * `planSteering`: scenario in, steering schedule out.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import type { Instant } from '../time/instant.js';
import type { Dimensionless, Seconds } from '../units.js';
import { describeDuration, executionIntervals, feedForwardManeuvers, isoAt, ns } from './constraints.js';
import { expectedCost } from './cost.js';
import { type PlannerResult, planDeadband } from './deadband.js';
import { planOptimal } from './optimal.js';
import {
  checkTolerance,
  gridTimes,
  type InternalCommand,
  phaseSigmaAt,
  predictedSeries,
  stateJumps,
} from './predict.js';
import { type NormalizedScenario, validateScenario } from './scenario.js';
import type { TimeScaleOptions } from './utc-stamps.js';

/** The caution every steering plan carries. */
export const STEERING_CAUTION =
  "Caution: this schedule is a planning aid. Verify every command against the mission's own interface specification " +
  '(actuator units, sign convention, time-tag format) and have it confirmed by its responsible engineering authority ' +
  'before uplink. The predicted σ is an open-loop prediction from the epoch estimate; it is not a guarantee.';

/** The planning methods. `none` leaves the clock unsteered (a baseline). */
export type SteeringMethod = 'deadband' | 'optimal' | 'none';

/**
 * One command of a plan. Its times are {@link Instant}s (split precision, ≈ 1e-15 s); the JSON form
 * (`SteeringCommandJson`, from `steeringPlanToJson`) prints them as ISO 8601 UTC.
 */
export interface SteeringCommand {
  /** When the command is sent (inside a contact window). */
  uplinkAt: Instant;
  /** When the satellite executes it (≥ uplinkAt, ≤ uplinkAt + maxTimeTagSeconds). */
  executeAt: Instant;
  kind: 'frequency' | 'phase';
  /** Fractional frequency step (dimensionless), for `frequency` commands. */
  fractionalFrequencyStep?: Dimensionless;
  /** Phase step, in seconds, for `phase` commands. */
  phaseStepSeconds?: Seconds;
  /** The step as an integer number of actuator resolution steps. */
  actuatorSteps: number;
  /** Why the command is there, in plain language. */
  reason: string;
}

/** Predicted mean and 1σ of the clock offset on the grid. */
export interface PredictedSeries {
  /** Mean offset (onboard clock − system time), in seconds. */
  phaseSeconds: number[];
  /** 1σ of the offset, in seconds (open-loop from the epoch). */
  sigmaSeconds: number[];
}

/**
 * Why a plan is infeasible, as a code:
 * - `uncertainty`: z·σ alone reaches the tolerance (no schedule can help; re-plan from a fresh estimate);
 * - `outside-at-epoch`: the clock is already outside the tolerance at the epoch;
 * - `no-contact-in-time`: no command can execute before the offset leaves the tolerance;
 * - `actuator-limit`: a step, range or phase-step limit cut a command the planner needed;
 * - `unsteered`: the `none` method leaves the clock outside;
 * - `planner`: the contacts and actuator could not hold it with this planner (try the other one).
 */
export type InfeasibilityCode =
  | 'uncertainty'
  | 'outside-at-epoch'
  | 'no-contact-in-time'
  | 'actuator-limit'
  | 'unsteered'
  | 'planner';

/**
 * A steering plan. Absolute times are {@link Instant}s; relative times (`predicted.t`,
 * `metrics.settledAfterSeconds`) are elapsed SI seconds since `epoch`. Print or send it with
 * `steeringPlanToJson` (ISO 8601 UTC stamps, the CLI's and the elements' form).
 */
export interface SteeringPlan {
  /** The scenario epoch: the origin of every relative time of the plan. */
  epoch: Instant;
  /**
   * True when the per-epoch probability P(|offset| ≤ tolerance) ≥ tolerance.probability at every
   * checked epoch of the horizon (the grid and just before each phase step).
   */
  feasible: boolean;
  /** Why the plan is infeasible (present only when `feasible` is false). */
  reason?: string;
  /** The kind of `reason` (present only when `feasible` is false). */
  reasonCode?: InfeasibilityCode;
  commands: SteeringCommand[];
  predicted: {
    /** Grid, in elapsed SI seconds since `epoch`. */
    t: number[];
    steered: PredictedSeries;
    unsteered: PredictedSeries;
  };
  metrics: SteeringMetrics;
  /** The caution to verify the schedule before it enters a flight configuration. */
  caution: string;
}

export interface SteeringMetrics {
  /** Largest |mean steered offset| on the grid, in seconds. */
  worstPredictedOffsetSeconds: Seconds;
  /**
   * Largest |mean| + z·σ on the grid and at phase steps, in seconds. ≤ tolerance is a sufficient
   * margin for the criterion (stricter than it when the mean is not zero), not the criterion.
   */
  worstOffsetBoundSeconds: Seconds;
  /**
   * Smallest per-epoch probability that |offset| ≤ tolerance, Φ((b−m)/σ) − Φ((−b−m)/σ), over the
   * grid and just before phase steps: the number `feasible` compares with tolerance.probability.
   * Per epoch, not for the whole horizon at once (see `simulatePlan` for that).
   */
  probabilityInTolerance: number;
  /**
   * Elapsed SI seconds after `epoch` from which every checked epoch to the end of the horizon meets the
   * criterion (0 when the whole plan does); null when the last epoch fails. Tells a plan that
   * is infeasible only while it steers a large initial error out from one that never settles.
   */
  settledAfterSeconds: Seconds | null;
  /** Number of commands. */
  commandCount: number;
  /** Σ |fractional frequency steps| (dimensionless). */
  totalFrequencySteering: Dimensionless;
  /** Σ |phase steps|, in seconds. */
  totalPhaseSteeringSeconds: Seconds;
  /** Expected steering cost J (dimensionless; see `steeringCost`). */
  expectedCost: number;
}

export interface PlanOptions extends TimeScaleOptions {
  /** Overrides the scenario's `strategy.method`. */
  strategy?: SteeringMethod;
}

/** Runs the chosen planner; returns internal commands and actuator limits hit. */
export function runPlanner(norm: NormalizedScenario, method: SteeringMethod): PlannerResult & { notes: string[] } {
  if (method === 'none') return { commands: [], limits: [], notes: [] };
  const ff = feedForwardManeuvers(norm);
  const result = method === 'deadband' ? planDeadband(norm, ff.commands) : planOptimal(norm, ff.commands);
  return { commands: result.commands, limits: [...ff.limits, ...result.limits], notes: ff.notes };
}

function diagnose(
  norm: NormalizedScenario,
  method: SteeringMethod,
  commands: readonly InternalCommand[],
  limits: readonly string[],
  violation: { t: number; mean: number; sigma: number; probability: number },
): { code: InfeasibilityCode; text: string } {
  const bound = norm.bound;
  const pct = `${Number((norm.probability * 100).toPrecision(6))} %`;
  // 1. Uncertainty alone: no schedule can help once z·σ ≥ b.
  const times = gridTimes(norm);
  const sigmas = phaseSigmaAt(norm, times);
  for (const [i, t] of times.entries()) {
    const sigma = at(sigmas, i, 'sigmas');
    if (norm.z * sigma >= bound) {
      return {
        code: 'uncertainty',
        text:
          `σ alone exceeds the tolerance after ${describeDuration(t)} (at ${isoAt(norm, t)}): ` +
          `z·σ = ${norm.z.toFixed(3)} × ${ns(sigma)} ≥ ±${ns(bound)} at ${pct}, whatever the commands. ` +
          'The prediction from the epoch estimate cannot promise the tolerance that far ahead: re-plan from a fresh clock ' +
          'estimate before then, shorten horizonSeconds, or relax the tolerance.',
      };
    }
  }
  const where =
    `the probability of |offset| ≤ ±${ns(bound)} is ${violation.probability.toFixed(4)} < ${norm.probability} ` +
    `(mean ${ns(violation.mean)}, σ ${ns(violation.sigma)}) at ${isoAt(norm, violation.t)} (${describeDuration(violation.t)} after the epoch)`;
  if (violation.t === 0)
    return { code: 'outside-at-epoch', text: `the clock is already outside the tolerance at the epoch: ${where}.` };
  const intervals = executionIntervals(norm);
  if (!intervals.some((iv) => iv.from <= violation.t)) {
    return {
      code: 'no-contact-in-time',
      text: `no contact lets a command execute before the offset leaves the tolerance: ${where}.`,
    };
  }
  if (limits.length > 0)
    return { code: 'actuator-limit', text: `the tolerance cannot be held with this actuator: ${limits[0]}; ${where}.` };
  if (method === 'none') return { code: 'unsteered', text: `unsteered, ${where}.` };
  const lastCommand = [...commands].reverse().find((c) => c.executeAt <= violation.t);
  const gap = lastCommand ? ` (last command executes at ${isoAt(norm, lastCommand.executeAt)})` : '';
  return {
    code: 'planner',
    text:
      `the tolerance cannot be held with these contacts and this actuator by the ${method} planner: ${where}${gap}` +
      (method === 'deadband' ? '; try the optimal planner.' : '.'),
  };
}

function toPublic(norm: NormalizedScenario, c: InternalCommand): SteeringCommand {
  return {
    uplinkAt: norm.epoch.plus(c.uplinkAt),
    executeAt: norm.epoch.plus(c.executeAt),
    kind: c.kind,
    ...(c.kind === 'frequency' ? { fractionalFrequencyStep: c.amount } : { phaseStepSeconds: c.amount }),
    actuatorSteps: c.steps,
    reason: c.reason,
  };
}

/** Builds the public plan from validated input and internal commands. */
export function buildPlan(
  norm: NormalizedScenario,
  method: SteeringMethod,
  result: PlannerResult & { notes: string[] },
): SteeringPlan {
  const commands = result.commands;
  const jumps = stateJumps(norm, commands);
  const check = checkTolerance(norm, jumps);
  const predicted = predictedSeries(norm, jumps);
  let worst = 0;
  // check.minProbability covers every grid epoch (and the epochs just before phase steps).
  predicted.steered.phaseSeconds.forEach((m) => {
    worst = Math.max(worst, Math.abs(m));
  });
  const plan: SteeringPlan = {
    epoch: norm.epoch,
    feasible: check.ok,
    commands: commands.map((c) => toPublic(norm, c)),
    predicted,
    metrics: {
      worstPredictedOffsetSeconds: worst,
      worstOffsetBoundSeconds: check.worstBound,
      probabilityInTolerance: check.minProbability,
      commandCount: commands.length,
      totalFrequencySteering: commands
        .filter((c) => c.kind === 'frequency')
        .reduce((s, c) => s + Math.abs(c.amount), 0),
      totalPhaseSteeringSeconds: commands.filter((c) => c.kind === 'phase').reduce((s, c) => s + Math.abs(c.amount), 0),
      expectedCost: expectedCost(norm, commands).total,
      settledAfterSeconds: check.settledFrom ?? null,
    },
    caution: STEERING_CAUTION,
  };
  if (!check.ok) {
    if (!check.firstViolation) throw new RangeError('internal: an infeasible check without its first violation');
    const why = diagnose(norm, method, commands, result.limits, check.firstViolation);
    const settled =
      check.settledFrom !== undefined && method !== 'none'
        ? ` The plan holds the tolerance from ${isoAt(norm, check.settledFrom)} (${describeDuration(check.settledFrom)} after the epoch) to the end of the horizon.`
        : '';
    plan.reason = why.text + settled + (result.notes.length ? ` Note: ${result.notes.join('; ')}.` : '');
    plan.reasonCode = why.code;
  }
  return plan;
}

/**
 * Plans when and by how much to steer an onboard clock so that its offset from system time
 * stays inside the tolerance at the stated probability, using only the scenario's contacts
 * and actuator, and compensating the relativistic rate change of planned manoeuvres.
 *
 * Feasibility rule (per epoch): P(|offset(t)| ≤ b) = Φ((b − m)/σ) − Φ((−b − m)/σ) ≥ p, m the
 * predicted mean steered offset and σ its open-loop standard deviation from the epoch covariance
 * and the 3-state process noise (Zucca & Tavella 2005), checked on the grid and just before each
 * phase step; `metrics.probabilityInTolerance` is the smallest such P. It is a per-epoch rule; it
 * does not bound the probability of staying inside over the whole horizon at once (estimate
 * that with `simulatePlan` or `simulateClosedLoop`).
 *
 * Strategies: `deadband` (see planDeadband), `optimal` (LQ cost-to-go minimised over the
 * admissible quantised steps, see planOptimal; Koppang & Leland 1999 as the published
 * background), `none` (unsteered baseline). Both planners choose every frequency step among the
 * steps from which an exact braking manoeuvre still stops the clock without overshooting the
 * opposite tolerance bound, so a saturated actuator slews and brakes instead of ringing.
 *
 * Times: UTC stamps are read and printed with `options.timeScales` (default: the bundled
 * leap-second table, valid until 2027-06-28); intervals are elapsed SI seconds, so a leap second
 * inside the horizon is counted.
 *
 * @param scenario  A scenario object (see `SteeringScenario` and schema/scenario.schema.json).
 * @param options   `strategy` overrides the scenario's method; `timeScales` gives the leap-second table.
 * @returns The plan (`epoch` and command times as Instants; `steeringPlanToJson` gives its JSON form);
 *   `feasible: false` with a `reason` rather than a violating plan.
 * @throws {InvalidArgumentError} naming the field path for any invalid scenario field.
 * @throws {OutOfDomainError} for a stamp or horizon beyond the leap-second table; the message says how to pass a current table.
 * @see P. Koppang & R. Leland, IEEE Trans. UFFC 46(3) 517–522 (1999) [V2]; Metrologia 56 025007 (2019) [V2].
 */
export function planSteering(scenario: unknown, options: PlanOptions = {}): SteeringPlan {
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError('options', options, 'an object { strategy?, timeScales? }');
  const norm = validateScenario(scenario, options);
  const method = resolveMethod(norm, options.strategy);
  return buildPlan(norm, method, runPlanner(norm, method));
}

/** The method to use: the option if given, else the scenario's. */
export function resolveMethod(norm: NormalizedScenario, override: unknown): SteeringMethod {
  if (override === undefined) return norm.strategy.method;
  if (override !== 'deadband' && override !== 'optimal' && override !== 'none') {
    throw new InvalidArgumentError('options.strategy', override, '"deadband", "optimal" or "none"');
  }
  return override;
}
