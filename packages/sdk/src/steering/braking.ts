/**
 * The braking law and the admissible-step rule shared by both planners.
 *
 * A frequency actuator that may change the rate by at most S per command, with commands at
 * given opportunities, is a double integrator with bounded "acceleration" (rate change per
 * unit time). Its time-optimal control is bang-bang with a single switch on the braking curve
 * x = −y|y|/(2a), a = S/Δ (D. E. Kirk, Optimal Control Theory: An Introduction, Prentice-Hall
 * 1970, §5.4, minimum-time double integrator [M]). Here the braking curve is not used in its
 * continuous form: the braking manoeuvre is simulated exactly on the actual opportunities
 * (quantised steps, step and range limits, manoeuvre jumps, contact gaps), which gives the
 * point where the clock comes to rest if every later opportunity brakes as hard as allowed.
 *
 * Admissible step (our own construction, a one-step receding horizon with a terminal set):
 * a command is admissible when, after it, that braking manoeuvre brings the offset to rest no
 * further out than it is now and not beyond the opposite edge of the usable band
 * B = b − z·σ (clamped at 0). Invariance: if the state after a command is admissible, the
 * braking law's own next step keeps it admissible (its rest point is the same), so an
 * admissible step exists at every later opportunity and the planned offset never overshoots
 * the opposite bound by more than the phase the residual frequency (≤ half a resolution step)
 * accumulates before the next opportunity. This is what keeps plans from ringing when the
 * actuator saturates: the limits are part of the choice, not a clip applied afterwards.
 *
 * @internal
 */
import { at } from '../internal/checked.js';
import { type ClockState, phaseVariance } from './clock-math.js';
import { quantiseFrequency } from './constraints.js';
import { type InternalCommand, stateJumps } from './predict.js';
import type { NormalizedScenario } from './scenario.js';

/** A time at which the state may jump (known jump dx, dy) and/or a command may execute. */
export interface Boundary {
  t: number;
  dx: number;
  dy: number;
  controllable: boolean;
}

/** The sorted boundaries: epoch, horizon, every known jump (manoeuvres, `fixed` commands) and the controllable `epochs`. */
export function boundaries(
  norm: NormalizedScenario,
  fixed: readonly InternalCommand[],
  epochs: readonly number[],
): Boundary[] {
  const map = new Map<number, Boundary>();
  const boundaryAt = (t: number): Boundary => {
    let b = map.get(t);
    if (!b) {
      b = { t, dx: 0, dy: 0, controllable: false };
      map.set(t, b);
    }
    return b;
  };
  boundaryAt(0);
  boundaryAt(norm.horizon);
  for (const j of stateJumps(norm, fixed)) {
    if (j.t >= norm.horizon) continue;
    const b = boundaryAt(j.t);
    b.dx += j.dx;
    b.dy += j.dy;
  }
  for (const t of epochs) if (t < norm.horizon) boundaryAt(t).controllable = true;
  return [...map.values()].sort((a, b) => a.t - b.t);
}

/** The opportunities and known jumps a braking manoeuvre is simulated on. */
export interface BrakingModel {
  norm: NormalizedScenario;
  bounds: readonly Boundary[];
  /** For each boundary: time to the next controllable boundary (or the horizon), in seconds. */
  nextGap: Float64Array;
}

export function brakingModel(norm: NormalizedScenario, bounds: readonly Boundary[]): BrakingModel {
  const nextGap = new Float64Array(bounds.length);
  let next = norm.horizon;
  for (let i = bounds.length - 1; i >= 0; i--) {
    const b = at(bounds, i, 'bounds');
    nextGap[i] = Math.max(0, next - b.t);
    if (b.controllable) next = b.t;
  }
  return { norm, bounds, nextGap };
}

/**
 * The braking law's step at boundary i: cancel the frequency expected over the gap to the next
 * opportunity, u = −(y + d·Δ/2), rounded to whole steps inside the step and range limits.
 */
export function brakingSteps(model: BrakingModel, i: number, state: Readonly<ClockState>, cumulative: number): number {
  return quantiseFrequency(model.norm, -(state[1] + (state[2] * at(model.nextGap, i, 'nextGap')) / 2), cumulative)
    .steps;
}

/**
 * Where the offset comes to rest (x, in seconds) if every controllable boundary after `i`
 * applies the braking law; `state` is the mean just after boundary i (its jump and command).
 * Runs to the horizon when the actuator cannot bring the frequency to rest. Hot path: the
 * indices of the loop are bounded by j < bounds.length = nextGap.length (brakingModel).
 */
export function brakingRest(
  model: BrakingModel,
  i: number,
  state: Readonly<ClockState>,
  cumulative: number,
): { x: number; t: number } {
  const { bounds, norm, nextGap } = model;
  const { resolution, maxStep, rangeMin, rangeMax } = norm.actuator;
  const nMax = Math.floor(maxStep / resolution + 1e-9);
  // Scalars, not propagateMean/quantiseFrequency: this loop runs for every candidate step (hot path);
  // the same arithmetic: x += yΔ + dΔ²/2, y += dΔ, then the braking step rounded as quantiseFrequency does.
  let x = state[0];
  let y = state[1];
  const d = state[2];
  let cum = cumulative;
  let tPrev = at(bounds, i, 'bounds').t;
  for (let j = i + 1; j < bounds.length; j++) {
    const b = bounds[j]!;
    const dt = b.t - tPrev;
    tPrev = b.t;
    x = x + y * dt + (d * dt * dt) / 2 + b.dx;
    y = y + d * dt + b.dy;
    if (!b.controllable) continue;
    let steps = Math.round(-(y + (d * nextGap[j]!) / 2) / resolution);
    if (steps > nMax) steps = nMax;
    else if (steps < -nMax) steps = -nMax;
    const upper = Math.floor((rangeMax - cum) / resolution + 1e-9);
    const lower = Math.ceil((rangeMin - cum) / resolution - 1e-9);
    let byRange = false;
    if (steps > upper) {
      steps = Math.max(0, upper);
      byRange = true;
    } else if (steps < lower) {
      steps = Math.min(0, lower);
      byRange = true;
    }
    if (steps === 0) {
      if (byRange) continue; // range exhausted: the clock cannot be braked here
      return { x, t: b.t };
    }
    y += steps * resolution;
    cum += steps * resolution;
  }
  if (tPrev < norm.horizon) {
    const dt = norm.horizon - tPrev;
    x = x + y * dt + (d * dt * dt) / 2;
  }
  return { x, t: norm.horizon };
}

/** Usable half-width of the band at t: b − z·σ(t), at least 0 (seconds). */
export function usableBand(norm: NormalizedScenario, t: number): number {
  return Math.max(0, norm.bound - norm.z * Math.sqrt(phaseVariance(t, norm.covariance0, norm.noise)));
}

/**
 * How far (seconds, ≥ 0) a command's outcome lies outside the admissible set: the rest point of
 * the braking manoeuvre must lie in [min(−B, x_now), max(B, x_now)]. 0 means admissible.
 */
export function restViolation(
  model: BrakingModel,
  i: number,
  xNow: number,
  after: Readonly<ClockState>,
  cumulative: number,
): number {
  const rest = brakingRest(model, i, after, cumulative);
  const band = usableBand(model.norm, rest.t);
  const lo = Math.min(-band, xNow);
  const hi = Math.max(band, xNow);
  return rest.x < lo ? lo - rest.x : rest.x > hi ? rest.x - hi : 0;
}

/**
 * The admissible number of frequency steps closest to `wanted` (an integer inside the step and
 * range limits), at boundary i with mean `state` (before the command). The rest point is
 * non-decreasing in the step, so the admissible steps form an interval; it is found by
 * bisection between `wanted` and the braking law's step. When no step is admissible (braking
 * started too late or the range is exhausted), the step with the smallest violation among
 * `wanted`, the braking step and the extreme steps is returned, with `violation` > 0.
 */
export function admissibleSteps(
  model: BrakingModel,
  i: number,
  state: Readonly<ClockState>,
  cumulative: number,
  wanted: number,
): { steps: number; violation: number } {
  const res = model.norm.actuator.resolution;
  const violationOf = (n: number): number =>
    restViolation(model, i, state[0], [state[0], state[1] + n * res, state[2]], cumulative + n * res);
  const vw = violationOf(wanted);
  if (vw === 0) return { steps: wanted, violation: 0 };
  const brake = brakingSteps(model, i, state, cumulative);
  const vb = brake === wanted ? vw : violationOf(brake);
  if (vb === 0) {
    // Bisection on the integer interval (admissible end `ok`, inadmissible end `bad`).
    let ok = brake;
    let bad = wanted;
    while (Math.abs(ok - bad) > 1) {
      const mid = Math.trunc((ok + bad) / 2);
      if (violationOf(mid) === 0) ok = mid;
      else bad = mid;
    }
    return { steps: ok, violation: 0 };
  }
  // Nothing admissible along the way: the extreme steps are the remaining candidates.
  const nMax = Math.floor(model.norm.actuator.maxStep / res + 1e-9);
  const hiRange = Math.floor((model.norm.actuator.rangeMax - cumulative) / res + 1e-9);
  const loRange = Math.ceil((model.norm.actuator.rangeMin - cumulative) / res - 1e-9);
  let best = vw <= vb ? { steps: wanted, violation: vw } : { steps: brake, violation: vb };
  for (const n of [Math.min(nMax, Math.max(0, hiRange)), Math.max(-nMax, Math.min(0, loRange))]) {
    if (n === best.steps) continue;
    const v = violationOf(n);
    if (v < best.violation) best = { steps: n, violation: v };
  }
  return best;
}
