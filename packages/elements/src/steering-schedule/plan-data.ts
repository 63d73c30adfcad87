/**
 * Input adapter of `<tauline-steering-schedule>`: reads the plan's JSON form (`steeringPlanToJson(planSteering())`
 * in `@tauline/sdk`) and its scenario, after the contract guard (plan-guard.ts), into columns in
 * seconds since the scenario epoch, ready for scales and decimation. Every UTC stamp is read by the
 * SDK time module (`TimeScales.parseIso`, `Instant.secondsSince`, `TimeScales.toCalendar`): no
 * calendar or leap-second logic lives in the elements. Pure, no DOM; never throws (problems come
 * back as text).
 *
 * @module
 */

import type { SteeringCommandJson, SteeringMetrics } from '@tauline/sdk/steering';
import { BUNDLED_LEAP_SECONDS, createTimeScales, type Instant, type TimeScales } from '@tauline/sdk/time';
import { describeFailure, guardPlan } from './plan-guard.js';

/** A steering command as the element uses it (times in seconds since the scenario epoch). */
export interface SteeringCommandView {
  /** Position in `plan.commands`. */
  index: number;
  kind: 'frequency' | 'phase';
  /** Uplink time, s since epoch. */
  uplinkAt: number;
  /** Execution time, s since epoch. */
  executeAt: number;
  /** Fractional frequency step (kind `frequency`) or phase step in seconds (kind `phase`). */
  step: number;
  /** Integer number of actuator resolution steps. */
  actuatorSteps: number;
  reason: string;
  /** The command object exactly as given. */
  source: SteeringCommandJson;
}

/** The scenario epoch on the SDK's time scales: chart times are elapsed SI seconds from it. */
export interface PlanClock {
  /** The scenario epoch. */
  epoch: Instant;
  /** The time scales (leap-second table) the plan's UTC stamps are read with. */
  timeScales: TimeScales;
}

/** Everything the chart draws, in seconds since the scenario epoch. */
export interface PlanView extends PlanClock {
  /** The epoch as `Date` milliseconds (kept for embedders; the time axis reads `epoch` through `timeScales`). */
  epochMs: number;
  feasible: boolean;
  reason: string | null;
  t: Float64Array;
  steered: Float64Array;
  steeredSigma: Float64Array;
  unsteered: Float64Array;
  unsteeredSigma: Float64Array;
  commands: SteeringCommandView[];
  /** Phase tolerance, seconds (null when it is not a positive number: then `invalid` says so). */
  tolerance: number | null;
  contacts: Array<{ start: number; end: number }>;
  maneuvers: Array<{ at: number; semiMajorAxisBefore: number; semiMajorAxisAfter: number }>;
  metrics: SteeringMetrics;
  /** The plan's caution text (verify before flight use), shown with the table. */
  caution: string;
  /**
   * Data problems that make the drawn plan untrustworthy (non-finite predicted values, a tolerance
   * that is not a positive number): shown as a visible alert in place of the feasibility badge.
   */
  invalid: string[];
}

/** The outcome: a view, or a fatal problem to show as the error state. */
export type PlanReadResult = { ok: true; view: PlanView } | { ok: false; error: string };

let bundled: TimeScales | undefined;
/** The SDK time scales with its bundled leap-second table (the planner's default), built on first use. */
export function bundledTimeScales(): TimeScales {
  return (bundled ??= createTimeScales(BUNDLED_LEAP_SECONDS));
}

/** Thrown by {@link elapsed} for a stamp the time scales refuse; caught in {@link readPlan}. */
export class StampError {
  readonly message: string;
  constructor(message: string) {
    this.message = message;
  }
}

/** Elapsed SI seconds from the epoch to the UTC stamp `text` (leap seconds counted, as the planner counts them). */
export function elapsed(clock: PlanClock, text: string, path: string): number {
  try {
    return clock.timeScales.parseIso(text, 'UTC').secondsSince(clock.epoch);
  } catch (error) {
    const why = error instanceof Error ? error.message : String(error);
    throw new StampError(`${path} ${JSON.stringify(text)} cannot be read: ${why}`);
  }
}

/**
 * Elapsed SI seconds from the UTC stamp `epochText` to `text` on `timeScales` (default: the
 * SDK's bundled table); NaN for a stamp the SDK refuses (malformed, or outside the table).
 */
export function elapsedSecondsBetween(
  epochText: string,
  text: string,
  timeScales: TimeScales = bundledTimeScales(),
): number {
  try {
    return timeScales.parseIso(text, 'UTC').secondsSince(timeScales.parseIso(epochText, 'UTC'));
  } catch {
    return Number.NaN;
  }
}

/**
 * Converts a chart time (elapsed SI seconds since the epoch) to `Date` milliseconds (for `PlanView.epochMs`; the
 * element's own labels use `formatChartUtc`), from the SDK's UTC calendar reading of that instant. A `Date` cannot show second 60: inside an
 * inserted leap second the label reads 23:59:59.x. NaN outside the time scales' table.
 */
export function chartTimeToUtcMs(clock: PlanClock, t: number): number {
  try {
    const c = clock.timeScales.toCalendar(clock.epoch.plus(t), 'UTC');
    const second = c.second >= 60 ? c.second - 1 : c.second;
    return Date.UTC(c.year, c.month - 1, c.day, c.hour, c.minute) + second * 1000;
  } catch {
    return Number.NaN;
  }
}

function readCommands(clock: PlanClock, commands: readonly SteeringCommandJson[]): SteeringCommandView[] {
  const out = commands.map(
    (c, index): SteeringCommandView => ({
      index,
      kind: c.kind,
      executeAt: elapsed(clock, c.executeAt, `plan.commands[${index}].executeAt`),
      uplinkAt: elapsed(clock, c.uplinkAt, `plan.commands[${index}].uplinkAt`),
      step: (c.kind === 'phase' ? c.phaseStepSeconds : c.fractionalFrequencyStep) ?? Number.NaN,
      actuatorSteps: c.actuatorSteps,
      reason: c.reason,
      source: c,
    }),
  );
  return out.sort((a, b) => a.executeAt - b.executeAt);
}

/** First index where `t` is not finite or not strictly ascending, as an error; null when it is fine. */
function checkTime(t: Float64Array): string | null {
  let previous = Number.NEGATIVE_INFINITY;
  for (const [i, v] of t.entries()) {
    if (!Number.isFinite(v)) return `plan.predicted.t[${i}] is not a finite number (${v})`;
    if (!(v > previous)) return `plan.predicted.t must be strictly ascending; t[${i}] = ${v} follows ${previous}`;
    previous = v;
  }
  return null;
}

/**
 * Reads `plan` (the planner output) and `scenario` (its input) on `timeScales` (default: the
 * SDK's bundled leap-second table, as the planner's default). The scenario gives the epoch, the
 * phase tolerance, the contact windows and the manoeuvres; `plan.predicted.t` is in seconds since
 * the epoch, ascending.
 */
export function readPlan(
  plan: unknown,
  scenario: unknown,
  timeScales: TimeScales = bundledTimeScales(),
): PlanReadResult {
  const guarded = guardPlan(plan, scenario);
  if (!guarded.ok) return { ok: false, error: describeFailure(guarded.failure) };
  const { plan: p, scenario: s, columns } = guarded.value;
  const timeError = checkTime(columns.t);
  if (timeError) return { ok: false, error: timeError };
  try {
    let epoch: Instant;
    try {
      epoch = timeScales.parseIso(s.epoch, 'UTC');
    } catch (error) {
      return {
        ok: false,
        error:
          'scenario.epoch must be an ISO 8601 UTC time the time scales can read; ' +
          `received ${JSON.stringify(s.epoch)} ` +
          `(${error instanceof Error ? error.message : String(error)})`,
      };
    }
    const clock: PlanClock = { epoch, timeScales };
    if (p.epoch !== undefined && elapsed(clock, p.epoch, 'plan.epoch') !== 0) {
      return {
        ok: false,
        error:
          `plan.epoch ${JSON.stringify(p.epoch)} is not scenario.epoch ${JSON.stringify(s.epoch)}: ` +
          'the plan was made for another scenario (its times count from its own epoch)',
      };
    }
    const tol = s.tolerance.phaseSeconds;
    const invalid = nonFiniteColumns(columns);
    if (!(Number.isFinite(tol) && tol > 0)) {
      invalid.push(`scenario.tolerance.phaseSeconds must be a positive number of seconds; received ${String(tol)}`);
    }
    const contacts = s.contacts.map((w, k) => ({
      start: elapsed(clock, w.start, `scenario.contacts[${k}].start`),
      end: elapsed(clock, w.end, `scenario.contacts[${k}].end`),
    }));
    const maneuvers = (s.maneuvers ?? []).map((m, k) => ({
      at: elapsed(clock, m.at, `scenario.maneuvers[${k}].at`),
      semiMajorAxisBefore: m.semiMajorAxisBefore,
      semiMajorAxisAfter: m.semiMajorAxisAfter,
    }));
    const view: PlanView = {
      ...clock,
      epochMs: chartTimeToUtcMs(clock, 0),
      feasible: p.feasible,
      reason: p.reason ?? null,
      ...columns,
      commands: readCommands(clock, guarded.value.commands),
      tolerance: Number.isFinite(tol) && tol > 0 ? tol : null,
      contacts,
      maneuvers,
      metrics: p.metrics,
      caution: p.caution,
      invalid,
    };
    return { ok: true, view };
  } catch (error) {
    if (error instanceof StampError) return { ok: false, error: error.message };
    throw error;
  }
}

/** One line per column holding non-finite values: count and first position. */
function nonFiniteColumns(c: Pick<PlanView, 'steered' | 'steeredSigma' | 'unsteered' | 'unsteeredSigma'>): string[] {
  const out: string[] = [];
  for (const [name, arr] of [
    ['steered.phaseSeconds', c.steered],
    ['steered.sigmaSeconds', c.steeredSigma],
    ['unsteered.phaseSeconds', c.unsteered],
    ['unsteered.sigmaSeconds', c.unsteeredSigma],
  ] as const) {
    let count = 0,
      first = -1;
    for (let i = 0; i < arr.length; i++) {
      const v = arr[i]!;
      if (v - v !== 0) {
        if (count === 0) first = i;
        count += 1;
      }
    }
    if (count === 0) continue;
    const values = `${count} non-finite value${count === 1 ? '' : 's'}`;
    out.push(`plan.predicted.${name} holds ${values} (first at index ${first}: ${arr[first]})`);
  }
  return out;
}

/** Linear interpolation of y at x (x ascending); NaN outside the data. */
export function interpolate(x: Float64Array, y: Float64Array, at: number): number {
  const n = x.length;
  const first = x[0],
    last = x[n - 1];
  if (first === undefined || last === undefined || at < first || at > last) return Number.NaN;
  let lo = 0,
    hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (x[mid]! <= at) lo = mid;
    else hi = mid;
  }
  const x0 = x[lo]!,
    x1 = x[hi]!,
    y0 = y[lo]!,
    y1 = y[hi]!;
  if (x1 === x0) return y0;
  return y0 + ((y1 - y0) * (at - x0)) / (x1 - x0);
}
