/**
 * Deadband planner (common operational practice, no single source): at every uplink
 * opportunity, predict the steered offset until the next contact; if it would use more than
 * a fraction θ of the usable band b − z·σ(t), correct now.
 *
 * The correction is a frequency step u = −(y + d·Δ/2) − x/T that cancels the predicted
 * frequency (averaged over the gap Δ to the next contact, so drift is shared out) and removes
 * the phase offset x over the correction time T (proportional steering in the sense of the
 * Metrologia 56 025007 (2019) paper, physics-refs §12 [V2]). When phase steps are allowed and
 * the phase alone is outside θ of the band, a phase step −x comes first.
 *
 * @module
 */

import { at } from '../internal/checked.js';
import { admissibleSteps, boundaries, brakingModel } from './braking.js';
import { phaseVariance } from './clock-math.js';
import {
  cumulativeFrequency,
  describeDuration,
  frac,
  frequencyLimitText,
  isoAt,
  ns,
  quantiseFrequency,
  quantisePhase,
  spacingOk,
  uplinkFor,
} from './constraints.js';
import { type InternalCommand, meanState, type StateJump, stateJumps } from './predict.js';
import type { NormalizedScenario } from './scenario.js';

/** Default fraction of the usable band at which the deadband acts. */
export const DEFAULT_DEADBAND_THRESHOLD = 0.5;
/** Default time over which a phase offset is steered out, in seconds (one day). */
export const DEFAULT_CORRECTION_TIME = 86_400;

/** Start of the reason of every deadband command (the optimal planner replaces it when it keeps the deadband schedule). */
export const DEADBAND_REASON_PREFIX = 'deadband: ';

/** Result of a planner: the commands (fixed ones included) and the actuator limits it hit. */
export interface PlannerResult {
  commands: InternalCommand[];
  limits: string[];
  /** Optimal planner only: the phase-weight scale it settled on and whether it kept the deadband schedule (re-planning reuses both). */
  optimal?: { scale: number; deadbandKept: boolean };
}

/** The deadband planner's own opportunities: grid times inside the windows, at least the minimum spacing apart. */
function deadbandOpportunities(norm: NormalizedScenario): number[] {
  const epochs: number[] = [];
  for (const w of norm.windows) {
    for (let t = w.start; t <= w.end + 1e-9 && t <= norm.horizon; t += norm.grid) {
      const previous = epochs.at(-1);
      if (previous === undefined || t - previous >= norm.actuator.spacing - 1e-6) epochs.push(t);
    }
  }
  return epochs;
}

/**
 * The deadband's phase step at `t`: when phase steps are allowed and the predicted offset x (s) uses more than
 * θ of the usable band (s), appends a phase step removing it (and a limit note if it was clipped); returns
 * whether a step was added.
 */
function addPhaseStep(
  norm: NormalizedScenario,
  commands: InternalCommand[],
  limits: string[],
  t: number,
  x: number,
  theta: number,
  usableNow: number,
): boolean {
  if (!(norm.actuator.phaseAllowed && Math.abs(x) > theta * usableNow)) return false;
  const q = quantisePhase(norm, -x);
  if (q.steps === 0) return false;
  if (q.limitedBy)
    limits.push(
      `the phase step needed at ${isoAt(norm, t)} (${ns(-x)}) exceeds actuator.phaseSteps.maxStep (${ns(norm.actuator.phaseMaxStep)})`,
    );
  commands.push({
    uplinkAt: t,
    executeAt: t,
    kind: 'phase',
    steps: q.steps,
    amount: q.amount,
    planner: 'deadband',
    reason: `${DEADBAND_REASON_PREFIX}predicted offset ${ns(x)} uses more than ${Math.round(theta * 100)} % of the usable band ±${ns(usableNow)}; phase step removes it`,
  });
  return true;
}

/**
 * Runs the deadband planner on top of the `fixed` (feed-forward) commands. Every frequency step
 * is limited to the admissible steps of braking.ts on the deadband's own opportunities, so a
 * saturated correction brakes in time instead of overshooting the opposite bound.
 * `until` (seconds) stops it from placing commands at or after that time, and `notBefore` from
 * placing any before it (re-planning: the spacing from commands already executed).
 */
export function planDeadband(
  norm: NormalizedScenario,
  fixed: readonly InternalCommand[],
  until = Infinity,
  notBefore = -Infinity,
): PlannerResult {
  const spec = norm.strategy.method === 'deadband' ? norm.strategy : { method: 'deadband' as const };
  const theta = spec.thresholdFraction ?? DEFAULT_DEADBAND_THRESHOLD;
  const correctionTime = spec.correctionTimeSeconds ?? DEFAULT_CORRECTION_TIME;
  const commands: InternalCommand[] = [...fixed];
  const limits: string[] = [];
  const sigmaAt = (t: number): number => Math.sqrt(phaseVariance(t, norm.covariance0, norm.noise));
  const usable = (t: number): number => norm.bound - norm.z * sigmaAt(t);
  /** Whether the predicted offset would use more than θ of the usable band between `t` and the next contact (the next chance to act), on the prediction grid. */
  const exceedsBefore = (t: number, nextStart: number, jumps: readonly StateJump[]): boolean => {
    for (let s = t; s <= Math.max(nextStart, t) + 1e-9; s += norm.grid) {
      const tCheck = Math.min(s, norm.horizon);
      if (Math.abs(meanState(norm, jumps, tCheck)[0]) > theta * Math.max(0, usable(tCheck))) return true;
      if (s >= norm.horizon) return false;
    }
    return false;
  };

  const opportunities = deadbandOpportunities(norm);
  const braking = brakingModel(norm, boundaries(norm, fixed, opportunities));
  const boundaryIndex = new Map(braking.bounds.map((b, i) => [b.t, i] as const));
  norm.windows.forEach((w, wi) => {
    if (w.start >= until) return;
    const nextStart = norm.windows[wi + 1]?.start ?? norm.horizon; // the horizon after the last window
    for (let t = w.start; t <= w.end + 1e-9 && t < until; t += norm.grid) {
      if (t < notBefore - 1e-6 || !spacingOk(norm, commands, t)) continue;
      const jumps = stateJumps(norm, commands);
      if (!exceedsBefore(t, nextStart, jumps)) continue;
      const [x, y, d] = meanState(norm, jumps, t);
      const gap = Math.max(nextStart - t, norm.grid);
      const usableNow = Math.max(0, usable(t));
      const phaseDone = addPhaseStep(norm, commands, limits, t, x, theta, usableNow);
      const execAt = phaseDone ? t + norm.actuator.spacing : t;
      const uplink = phaseDone ? uplinkFor(norm, execAt) : t;
      if (
        uplink === undefined ||
        execAt > norm.horizon ||
        execAt < notBefore - 1e-6 ||
        !spacingOk(norm, commands, execAt)
      )
        continue;
      const xAtExec = phaseDone ? meanState(norm, stateJumps(norm, commands), execAt)[0] : x;
      const yAtExec = y + d * (execAt - t);
      const wanted = -(yAtExec + (d * gap) / 2) - (phaseDone ? 0 : xAtExec / correctionTime);
      const cumulative = cumulativeFrequency(norm, commands);
      let q = quantiseFrequency(norm, wanted, cumulative);
      if (q.limitedBy) {
        limits.push(
          `the needed step (${frac(wanted)}) ${q.limitedBy === 'maxStep' ? 'exceeds' : 'would leave'} ${frequencyLimitText(norm, q.limitedBy)}`,
        );
      }
      const boundary = boundaryIndex.get(execAt);
      let braked = false;
      if (boundary !== undefined && at(braking.bounds, boundary, 'bounds').controllable) {
        const adm = admissibleSteps(braking, boundary, [xAtExec, yAtExec, d], cumulative, q.steps);
        if (adm.steps !== q.steps) {
          braked = true;
          q = { steps: adm.steps, amount: adm.steps * norm.actuator.resolution };
        }
      }
      if (q.steps === 0) continue;
      commands.push({
        uplinkAt: uplink,
        executeAt: execAt,
        kind: 'frequency',
        steps: q.steps,
        amount: q.amount,
        planner: 'deadband',
        reason:
          DEADBAND_REASON_PREFIX +
          (phaseDone
            ? `cancels the predicted frequency offset ${frac(yAtExec)} after the phase step`
            : `predicted offset would use more than ${Math.round(theta * 100)} % of the usable band before the next contact; ` +
              `cancels frequency ${frac(yAtExec)} and steers out ${ns(xAtExec)} over ${describeDuration(correctionTime)}`) +
          (braked
            ? '; step reduced so that the clock can still be braked without overshooting the opposite tolerance bound'
            : ''),
      });
    }
  });
  commands.sort((a, b) => a.executeAt - b.executeAt);
  return { commands, limits };
}
