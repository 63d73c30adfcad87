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
import { phaseVariance } from './clock-math.js';
import {
  cumulativeFrequency, describeDuration, frac, isoAt, ns, quantiseFrequency, quantisePhase, spacingOk, uplinkFor,
} from './constraints.js';
import { meanState, stateJumps, type InternalCommand } from './predict.js';
import type { NormalizedScenario } from './scenario.js';

/** Default fraction of the usable band at which the deadband acts. */
export const DEFAULT_DEADBAND_THRESHOLD = 0.5;
/** Default time over which a phase offset is steered out, in seconds (one day). */
export const DEFAULT_CORRECTION_TIME = 86_400;

/** Result of a planner: the commands (fixed ones included) and the actuator limits it hit. */
export interface PlannerResult {
  commands: InternalCommand[];
  limits: string[];
}

/** Runs the deadband planner on top of the `fixed` (feed-forward) commands. */
export function planDeadband(norm: NormalizedScenario, fixed: readonly InternalCommand[]): PlannerResult {
  const spec = norm.strategy.method === 'deadband' ? norm.strategy : { method: 'deadband' as const };
  const theta = spec.thresholdFraction ?? DEFAULT_DEADBAND_THRESHOLD;
  const correctionTime = spec.correctionTimeSeconds ?? DEFAULT_CORRECTION_TIME;
  const commands: InternalCommand[] = [...fixed];
  const limits: string[] = [];
  const sigmaAt = (t: number): number => Math.sqrt(phaseVariance(t, norm.covariance0, norm.noise));
  const usable = (t: number): number => norm.bound - norm.z * sigmaAt(t);

  norm.windows.forEach((w, wi) => {
    const nextStart = wi + 1 < norm.windows.length ? norm.windows[wi + 1]!.start : norm.horizon;
    for (let t = w.start; t <= w.end + 1e-9; t += norm.grid) {
      if (!spacingOk(norm, commands, t)) continue;
      const jumps = stateJumps(norm, commands);
      // Look ahead to the next contact (the next chance to act) on the prediction grid.
      let exceeds = false;
      for (let s = t; s <= Math.max(nextStart, t) + 1e-9; s += norm.grid) {
        const m = meanState(norm, jumps, Math.min(s, norm.horizon))[0];
        if (Math.abs(m) > theta * Math.max(0, usable(Math.min(s, norm.horizon)))) {
          exceeds = true;
          break;
        }
        if (s >= norm.horizon) break;
      }
      if (!exceeds) continue;
      const [x, y, d] = meanState(norm, jumps, t);
      const gap = Math.max(nextStart - t, norm.grid);
      const usableNow = Math.max(0, usable(t));
      let phaseDone = false;
      if (norm.actuator.phaseAllowed && Math.abs(x) > theta * usableNow) {
        const q = quantisePhase(norm, -x);
        if (q.steps !== 0) {
          if (q.limitedBy) limits.push(`the phase step needed at ${isoAt(norm, t)} (${ns(-x)}) exceeds actuator.phaseSteps.maxStep (${ns(norm.actuator.phaseMaxStep)})`);
          commands.push({
            uplinkAt: t, executeAt: t, kind: 'phase', steps: q.steps, amount: q.amount,
            reason: `deadband: predicted offset ${ns(x)} uses more than ${Math.round(theta * 100)} % of the usable band ±${ns(usableNow)}; phase step removes it`,
          });
          phaseDone = true;
        }
      }
      const execAt = phaseDone ? t + norm.actuator.spacing : t;
      const uplink = phaseDone ? uplinkFor(norm, execAt) : t;
      if (uplink === undefined || execAt > norm.horizon || !spacingOk(norm, commands, execAt)) continue;
      const xAtExec = phaseDone ? meanState(norm, stateJumps(norm, commands), execAt)[0] : x;
      const yAtExec = y + d * (execAt - t);
      const wanted = -(yAtExec + (d * gap) / 2) - (phaseDone ? 0 : xAtExec / correctionTime);
      const q = quantiseFrequency(norm, wanted, cumulativeFrequency(norm, commands));
      if (q.limitedBy) {
        limits.push(q.limitedBy === 'maxStep'
          ? `the needed step (${frac(wanted)}) exceeds maxFrequencyStep (${frac(norm.actuator.maxStep)})`
          : `the needed step (${frac(wanted)}) would leave the cumulative range [${frac(norm.actuator.rangeMin)}, ${frac(norm.actuator.rangeMax)}]`);
      }
      if (q.steps === 0) continue;
      commands.push({
        uplinkAt: uplink, executeAt: execAt, kind: 'frequency', steps: q.steps, amount: q.amount,
        reason: phaseDone
          ? `deadband: cancels the predicted frequency offset ${frac(yAtExec)} after the phase step`
          : `deadband: predicted offset would use more than ${Math.round(theta * 100)} % of the usable band before the next contact; ` +
            `cancels frequency ${frac(yAtExec)} and steers out ${ns(xAtExec)} over ${describeDuration(correctionTime)}`,
      });
    }
  });
  commands.sort((a, b) => a.executeAt - b.executeAt);
  return { commands, limits };
}
