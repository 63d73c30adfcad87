/**
 * Prediction of the steered and unsteered clock offset: mean by exact propagation of the
 * 3-state model with manoeuvre rate changes and commands applied, and the open-loop phase
 * uncertainty σ(t) from the epoch covariance plus process noise.
 *
 * Commands are deterministic (they are fixed amounts once uplinked), so they move the mean and
 * leave σ unchanged: σ is the uncertainty of a prediction made at the epoch with no newer clock
 * estimate. Re-planning at a later contact with a fresh estimate would shrink it.
 *
 * @module
 */
import { at, last } from '../internal/checked.js';
import { normalCdf } from '../internal/special-functions.js';
import type { Seconds } from '../units.js';
import { phaseVariance } from './clock-math.js';
import type { PredictedSeries } from './plan.js';
import type { NormalizedScenario } from './scenario.js';

/** The actuator limit that cut a command short of the wanted step. */
export type ActuatorLimit = 'maxFrequencyStep' | 'cumulativeFrequencyRange' | 'maxPhaseStep';

/** A command in scenario time (seconds since the epoch). */
export interface InternalCommand {
  uplinkAt: Seconds;
  executeAt: Seconds;
  kind: 'frequency' | 'phase';
  /** Integer number of actuator resolution steps. */
  steps: number;
  /** steps × resolution: fractional frequency, or seconds for a phase step. */
  amount: number;
  reason: string;
  /** The feedback planner that made the command; absent for feed-forward and given commands. */
  planner?: 'deadband' | 'optimal';
  /** Set when an actuator limit cut the step short of what the planner wanted. */
  limitedBy?: ActuatorLimit;
}

/** A jump of the clock state at time t: dy in frequency (fractional), dx in phase (s). */
export interface StateJump {
  t: Seconds;
  dy: number;
  dx: number;
}

/** Jumps caused by the scenario's manoeuvres and the commands, sorted by time. */
export function stateJumps(norm: NormalizedScenario, commands: readonly InternalCommand[]): StateJump[] {
  const jumps: StateJump[] = norm.maneuvers.map((m) => ({ t: m.t, dy: m.rateChange, dx: 0 }));
  for (const c of commands) {
    jumps.push(
      c.kind === 'frequency' ? { t: c.executeAt, dy: c.amount, dx: 0 } : { t: c.executeAt, dy: 0, dx: c.amount },
    );
  }
  return jumps.sort((a, b) => a.t - b.t);
}

/**
 * Mean state [x (s), y, d (1/s)] at time t: the noise-free 3-state propagation
 * x(t) = x0 + y0 t + d0 t²/2 + Σ dy_j (t − t_j) + Σ dx_j over jumps before t (physics-refs §11).
 * `side` 'before' excludes jumps exactly at t, 'after' includes them.
 */
export function meanState(
  norm: NormalizedScenario,
  jumps: readonly StateJump[],
  t: Seconds,
  side: 'before' | 'after' = 'after',
): [number, number, number] {
  const [x0, y0, d0] = norm.state0;
  let x = x0 + y0 * t + (d0 * t * t) / 2;
  let y = y0 + d0 * t;
  for (const j of jumps) {
    if (j.t > t || (side === 'before' && j.t === t)) break;
    x += j.dy * (t - j.t) + j.dx;
    y += j.dy;
  }
  return [x, y, d0];
}

/** A list of times (s): an array or a typed array. */
export type Times = Iterable<number> & ArrayLike<number>;

/** Mean phase at sorted times (after any jump at that exact time), in O(times + jumps). */
export function meanPhaseAt(norm: NormalizedScenario, jumps: readonly StateJump[], times: Times): Float64Array {
  const [x0, y0, d0] = norm.state0;
  const out = new Float64Array(times.length);
  let k = 0;
  let next = jumps[0];
  let sumDy = 0;
  let sumOffset = 0; // Σ (dx_j − dy_j t_j)
  let i = 0;
  for (const t of times) {
    for (; next !== undefined && next.t <= t; next = jumps[++k]) {
      sumDy += next.dy;
      sumOffset += next.dx - next.dy * next.t;
    }
    out[i++] = x0 + y0 * t + (d0 * t * t) / 2 + sumDy * t + sumOffset;
  }
  return out;
}

/** Open-loop phase standard deviation σ(t) at each time, in seconds (see {@link phaseVariance}). */
export function phaseSigmaAt(norm: NormalizedScenario, times: Times): Float64Array {
  const out = new Float64Array(times.length);
  let i = 0;
  for (const t of times) out[i++] = Math.sqrt(phaseVariance(t, norm.covariance0, norm.noise));
  return out;
}

/**
 * The predicted offset on the grid, as plans and `predictSteering` report it: the mean with `jumps`
 * applied (steered) and with the manoeuvres only (unsteered), each beside the open-loop σ (the same
 * for both: commands do not change σ).
 */
export function predictedSeries(
  norm: NormalizedScenario,
  jumps: readonly StateJump[],
): { t: number[]; steered: PredictedSeries; unsteered: PredictedSeries } {
  const t = gridTimes(norm);
  const sigma = Array.from(phaseSigmaAt(norm, t));
  return {
    t,
    steered: { phaseSeconds: Array.from(meanPhaseAt(norm, jumps, t)), sigmaSeconds: sigma },
    unsteered: { phaseSeconds: Array.from(meanPhaseAt(norm, stateJumps(norm, []), t)), sigmaSeconds: [...sigma] },
  };
}

/** The regular prediction grid 0, grid, 2·grid, ... and the horizon end. */
export function gridTimes(norm: NormalizedScenario): number[] {
  const n = Math.floor(norm.horizon / norm.grid + 1e-9);
  const times: number[] = [];
  for (let i = 0; i <= n; i++) times.push(i * norm.grid);
  if (norm.horizon - last(times, 'grid times') > 1e-6) times.push(norm.horizon);
  return times;
}

/**
 * Two-sided probability that a normal offset N(m, σ²) lies in [−b, b]:
 * P = Φ((b − m)/σ) − Φ((−b − m)/σ) (standard normal algebra, common practice, no source).
 */
export function probabilityWithin(mean: number, sigma: number, bound: number): number {
  if (!(sigma > 0)) return Math.abs(mean) <= bound ? 1 : 0;
  return Math.max(0, tailSafeCdf((bound - mean) / sigma) - tailSafeCdf((-bound - mean) / sigma));
}

/** Φ(z), short-cut beyond |z| = 40 where Φ is 0 or 1 to double precision (and z² may overflow). */
function tailSafeCdf(z: number): number {
  if (z > 40) return 1;
  if (z < -40) return 0;
  return normalCdf(z);
}

/** Outcome of checking a schedule against the tolerance, per epoch. */
export interface ToleranceCheck {
  /** True when the per-epoch probability P(|offset| ≤ b) ≥ p at every checked epoch. */
  ok: boolean;
  /** First checked epoch where that probability is below p, with its values. */
  firstViolation?: { t: Seconds; mean: Seconds; sigma: Seconds; probability: number };
  /** Largest |m(t)|, in seconds. */
  worstAbsMean: Seconds;
  /** Largest |m(t)| + z σ(t), in seconds (≤ b is sufficient for the criterion, not necessary). */
  worstBound: Seconds;
  /** Smallest per-epoch probability of |offset| ≤ b. */
  minProbability: number;
  /** Earliest checked epoch from which every later checked epoch meets the criterion (undefined: the last one fails). */
  settledFrom?: Seconds;
}

/** Slack on the probability comparison, so that a plan exactly at p is not refused for a rounding error. */
const PROBABILITY_SLACK = 1e-12;

/**
 * Checks the per-epoch probability P = Φ((b − m)/σ) − Φ((−b − m)/σ) ≥ p on the grid and just
 * before every phase step. The margin |m(t)| + z·σ(t) ≤ b, z = Φ⁻¹((1 + p)/2), is reported as
 * `worstBound`: it implies the criterion but is stricter for m ≠ 0, so it is not the verdict.
 */
export function checkTolerance(norm: NormalizedScenario, jumps: readonly StateJump[]): ToleranceCheck {
  const checks: { t: number; side: 'before' | 'after' }[] = gridTimes(norm).map((t) => ({ t, side: 'after' as const }));
  for (const j of jumps) if (j.dx !== 0) checks.push({ t: j.t, side: 'before' });
  checks.sort((a, b) => a.t - b.t || (a.side === b.side ? 0 : a.side === 'before' ? -1 : 1));
  const result: ToleranceCheck = { ok: true, worstAbsMean: 0, worstBound: 0, minProbability: 1 };
  let lastFailure = -1;
  // Mean phase by running sums over the sorted jumps (as meanPhaseAt), with the 'before' side
  // leaving out the jumps exactly at t.
  const [x0, y0, d0] = norm.state0;
  let k = 0;
  let next = jumps[0];
  let sumDy = 0;
  let sumOffset = 0; // Σ (dx_j − dy_j t_j)
  checks.forEach((c, i) => {
    for (; next !== undefined && (next.t < c.t || (c.side === 'after' && next.t === c.t)); next = jumps[++k]) {
      sumDy += next.dy;
      sumOffset += next.dx - next.dy * next.t;
    }
    const mean = x0 + y0 * c.t + (d0 * c.t * c.t) / 2 + sumDy * c.t + sumOffset;
    const sigma = Math.sqrt(phaseVariance(c.t, norm.covariance0, norm.noise));
    const probability = probabilityWithin(mean, sigma, norm.bound);
    result.worstAbsMean = Math.max(result.worstAbsMean, Math.abs(mean));
    result.worstBound = Math.max(result.worstBound, Math.abs(mean) + norm.z * sigma);
    result.minProbability = Math.min(result.minProbability, probability);
    if (probability < norm.probability - PROBABILITY_SLACK) {
      lastFailure = i;
      if (result.ok) {
        result.ok = false;
        result.firstViolation = { t: c.t, mean, sigma, probability };
      }
    }
  });
  if (lastFailure < checks.length - 1) result.settledFrom = at(checks, lastFailure + 1, 'checks').t;
  return result;
}
