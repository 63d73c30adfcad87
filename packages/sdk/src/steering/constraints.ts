/**
 * Shared rules of every planner: when a command can execute (uplink inside a contact window,
 * execution within the time-tag latency), how a wanted step becomes an integer number of
 * actuator steps inside the step and range limits, command spacing, and the feed-forward
 * compensation of manoeuvres.
 *
 * @internal
 */
import { at } from '../internal/checked.js';
import type { Seconds } from '../units.js';
import type { InternalCommand } from './predict.js';
import type { NormalizedScenario } from './scenario.js';
import { formatUtcStamp } from './utc-stamps.js';

const EPS = 1e-6;

/** Execution-feasible intervals [start of window, end of window + latency], cut at the horizon and merged. */
export function executionIntervals(norm: NormalizedScenario): { from: Seconds; to: Seconds }[] {
  const raw = norm.windows.map((w) => ({ from: w.start, to: Math.min(norm.horizon, w.end + norm.actuator.latency) }));
  const merged: { from: number; to: number }[] = [];
  for (const r of raw) {
    const last = merged[merged.length - 1];
    if (last && r.from <= last.to) last.to = Math.max(last.to, r.to);
    else merged.push({ ...r });
  }
  return merged;
}

/**
 * The latest uplink time for a command executing at `exec`: inside the latest window that
 * starts at or before `exec`, no later than `exec`, and no earlier than `exec − latency`.
 * Undefined when no window allows it.
 */
export function uplinkFor(norm: NormalizedScenario, exec: Seconds): Seconds | undefined {
  for (let i = norm.windows.length - 1; i >= 0; i--) {
    const w = at(norm.windows, i, 'windows');
    if (w.start > exec + EPS) continue;
    const uplink = Math.min(exec, w.end);
    return exec - uplink <= norm.actuator.latency + EPS ? uplink : undefined;
  }
  return undefined;
}

/** True when `t` is at least the minimum spacing away from every command's execution. */
export function spacingOk(norm: NormalizedScenario, commands: readonly InternalCommand[], t: Seconds): boolean {
  return commands.every((c) => Math.abs(c.executeAt - t) >= norm.actuator.spacing - EPS);
}

/** Cumulative frequency steering after the given commands (initial setting included). */
export function cumulativeFrequency(
  norm: NormalizedScenario,
  commands: readonly InternalCommand[],
  before = Infinity,
): number {
  let total = norm.actuator.initial;
  for (const c of commands) if (c.kind === 'frequency' && c.executeAt < before) total += c.amount;
  return total;
}

/** A wanted step turned into actuator steps, with the limit that cut it, if any. */
export interface QuantisedStep {
  steps: number;
  amount: number;
  limitedBy?: 'maxStep' | 'range';
}

/** How a wanted step is rounded to whole actuator steps. */
export type Rounding = 'nearest' | 'floor' | 'ceil';

/** `ratio` rounded to a whole number of steps, cut to ±maxSteps (limitedBy 'maxStep' when cut). */
function wholeSteps(ratio: number, rounding: Rounding, maxSteps: number): { steps: number; limitedBy?: 'maxStep' } {
  const steps = rounding === 'floor' ? Math.floor(ratio) : rounding === 'ceil' ? Math.ceil(ratio) : Math.round(ratio);
  return Math.abs(steps) > maxSteps ? { steps: Math.sign(steps) * maxSteps, limitedBy: 'maxStep' } : { steps };
}

/** The scenario's name for a frequency limit, with its value: "maxFrequencyStep (1.00e-12)" or "the cumulative range [min, max]". */
export function frequencyLimitText(norm: NormalizedScenario, limit: 'maxStep' | 'range'): string {
  return limit === 'maxStep'
    ? `maxFrequencyStep (${frac(norm.actuator.maxStep)})`
    : `the cumulative range [${frac(norm.actuator.rangeMin)}, ${frac(norm.actuator.rangeMax)}]`;
}

/**
 * Rounds a wanted frequency step to the nearest integer number of resolution steps, then
 * limits it to ±maxFrequencyStep and to the cumulative range (never rounding outwards).
 */
export function quantiseFrequency(
  norm: NormalizedScenario,
  wanted: number,
  cumulative: number,
  rounding: Rounding = 'nearest',
): QuantisedStep {
  const { resolution, maxStep, rangeMin, rangeMax } = norm.actuator;
  const whole = wholeSteps(wanted / resolution, rounding, Math.floor(maxStep / resolution + 1e-9));
  let steps = whole.steps;
  let limitedBy: QuantisedStep['limitedBy'] = whole.limitedBy;
  const upper = Math.floor((rangeMax - cumulative) / resolution + 1e-9);
  const lower = Math.ceil((rangeMin - cumulative) / resolution - 1e-9);
  if (steps > upper) {
    steps = Math.max(0, upper);
    limitedBy = 'range';
  } else if (steps < lower) {
    steps = Math.min(0, lower);
    limitedBy = 'range';
  }
  steps = steps === 0 ? 0 : steps; // no −0
  return { steps, amount: steps * resolution, ...(limitedBy ? { limitedBy } : {}) };
}

/** Rounds a wanted phase step to whole phase-resolution steps within ±maxStep. */
export function quantisePhase(norm: NormalizedScenario, wanted: number, rounding: Rounding = 'nearest'): QuantisedStep {
  const { phaseResolution, phaseMaxStep } = norm.actuator;
  const maxSteps = Number.isFinite(phaseMaxStep) ? Math.floor(phaseMaxStep / phaseResolution + 1e-9) : Infinity;
  const { steps: whole, limitedBy } = wholeSteps(wanted / phaseResolution, rounding, maxSteps);
  const steps = whole === 0 ? 0 : whole; // no −0
  return { steps, amount: steps * phaseResolution, ...(limitedBy ? { limitedBy } : {}) };
}

/** Formats `t` seconds (elapsed, SI) after the epoch as ISO 8601 UTC, to the millisecond (leap seconds counted). */
export function isoAt(norm: NormalizedScenario, t: Seconds): string {
  return formatUtcStamp(norm.timeScales, norm.epoch.plus(t));
}

/** Human-readable duration, e.g. "3.2 days" or "5.0 h". */
export function describeDuration(seconds: Seconds): string {
  return seconds >= 2 * 86_400 ? `${(seconds / 86_400).toFixed(1)} days` : `${(seconds / 3600).toFixed(1)} h`;
}

/** Nanoseconds with 3 significant digits for reasons and messages (display only). */
export function ns(seconds: Seconds): string {
  return `${Number((seconds * 1e9).toPrecision(3))} ns`;
}

/** Fractional frequency in exponent form for reasons (display only). */
export function frac(value: number): string {
  return value === 0 ? '0' : value.toExponential(2);
}

/**
 * Feed-forward compensation of the manoeuvres: for each one, a frequency command of
 * −Δrate (quantised) executing at the manoeuvre epoch, time-tagged from the latest contact
 * that can reach it. Manoeuvres that cannot be compensated this way are left to the feedback
 * planner and listed in `notes`.
 */
export function feedForwardManeuvers(norm: NormalizedScenario): {
  commands: InternalCommand[];
  notes: string[];
  limits: string[];
} {
  const commands: InternalCommand[] = [];
  const notes: string[] = [];
  const limits: string[] = [];
  for (const m of norm.maneuvers) {
    const label = `manoeuvre maneuvers[${m.index}] at ${isoAt(norm, m.t)} (a ${m.aBefore} m → ${m.aAfter} m, relativistic rate change ${frac(m.rateChange)})`;
    const uplink = uplinkFor(norm, m.t);
    if (uplink === undefined) {
      notes.push(
        `${label}: no contact can time-tag a command to execute at that epoch; the feedback planner compensates it afterwards`,
      );
      continue;
    }
    if (!spacingOk(norm, commands, m.t)) {
      notes.push(
        `${label}: too close to the previous manoeuvre's command for the minimum spacing; compensated afterwards`,
      );
      continue;
    }
    const q = quantiseFrequency(norm, -m.rateChange, cumulativeFrequency(norm, commands));
    if (q.steps === 0) {
      notes.push(
        `${label}: the rate change is smaller than half the frequency resolution; left to the feedback planner`,
      );
      continue;
    }
    if (q.limitedBy)
      limits.push(
        `the step needed to cancel ${label} is ${frac(-m.rateChange)}, beyond ${frequencyLimitText(norm, q.limitedBy)}`,
      );
    commands.push({
      uplinkAt: uplink,
      executeAt: m.t,
      kind: 'frequency',
      steps: q.steps,
      amount: q.amount,
      reason:
        `cancels the relativistic rate change of ${label}${q.limitedBy ? ' (partly: limited by the actuator)' : ''}; ` +
        (m.t > uplink ? `time-tagged ${describeDuration(m.t - uplink)} ahead` : 'executed on uplink'),
    });
  }
  return { commands, notes, limits };
}
