/**
 * Optimal planner: finite-horizon linear-quadratic steering with quantised, rate-limited
 * actuation ("quantised LQ rollout", our own design on published foundations).
 *
 * 1. Foundation: linear-quadratic-Gaussian steering (Koppang & Leland, "Linear quadratic
 *    stochastic control of atomic hydrogen masers", IEEE Trans. UFFC 46(3) 517–522, 1999;
 *    see also "The effects of proportional steering strategies on the behavior of controlled
 *    clocks", Metrologia 56 025007, 2019; physics-refs §12 [V2 abstracts]). By certainty
 *    equivalence the LQG control is the LQ control applied to the state estimate; planned from
 *    the epoch, the estimate of every future state is the predicted mean, so the plan is the LQ
 *    control along the predicted mean.
 * 2. A backward Riccati recursion over the candidate execution epochs (every uplink-reachable
 *    epoch, spaced by at least the minimum command spacing) on the 3-state model
 *    [phase, frequency, drift], with the exact integral of the squared phase between epochs as
 *    the state cost, the manoeuvre rate changes and feed-forward commands as known jumps
 *    (affine value function), and a quadratic charge on each frequency step. Derivation: standard
 *    discrete-time LQ dynamic programming, done here independently [C].
 * 3. A forward pass that, at each epoch, compares "no command", the floor and ceiling of the
 *    LQ step in whole actuator steps (limited to maxFrequencyStep and the cumulative range) and,
 *    when phase steps are allowed, the same for a phase step, using the LQ cost-to-go plus a
 *    per-command charge, and keeps the cheapest (one-step look-ahead with the LQ value function).
 * 4. If the schedule breaks the tolerance margin |m| + zσ ≤ b, the phase weight is raised ten-fold
 *    (up to four times) and the passes are repeated.
 * 5. Safeguard at the root: the deadband schedule is computed too, and kept (relabelled) when it
 *    holds the tolerance and the LQ schedule does not, or when it has the lower expected cost
 *    (`expectedCost`). So the optimal planner is never worse than the deadband one on that cost,
 *    by construction; the tests also report how often the LQ schedule wins on its own.
 *
 * @module
 */

import { at, last } from '../internal/checked.js';
import {
  admissibleSteps,
  type Boundary,
  type BrakingModel,
  boundaries,
  brakingModel,
  restViolation,
} from './braking.js';
import {
  add3,
  type ClockState,
  type Matrix3,
  mul3,
  mulVec3,
  phaseSquareIntegral,
  propagateMean,
  quadForm3,
  transition,
  transpose3,
  type Vec3,
  zeros3,
} from './clock-math.js';
import {
  cumulativeFrequency,
  executionIntervals,
  frac,
  frequencyLimitText,
  ns,
  type QuantisedStep,
  quantiseFrequency,
  quantisePhase,
  uplinkFor,
} from './constraints.js';
import { expectedCost } from './cost.js';
import { DEADBAND_REASON_PREFIX, type PlannerResult, planDeadband } from './deadband.js';
import {
  type ActuatorLimit,
  checkTolerance,
  gridTimes,
  type InternalCommand,
  phaseSigmaAt,
  stateJumps,
} from './predict.js';
import type { NormalizedScenario } from './scenario.js';

/** Candidate execution epochs: uplink-reachable, ≥ spacing apart and away from fixed commands. */
export function decisionEpochs(norm: NormalizedScenario, fixed: readonly InternalCommand[], cadence: number): number[] {
  const step = Math.max(cadence, norm.actuator.spacing, 1e-3);
  const epochs: number[] = [];
  for (const iv of executionIntervals(norm)) {
    let t = Math.max(iv.from, epochs.length ? last(epochs, 'epochs') + step : iv.from);
    let guard = 0;
    while (t <= iv.to + 1e-9 && guard++ < 1_000_000) {
      const conflict = fixed.find((c) => Math.abs(c.executeAt - t) < norm.actuator.spacing - 1e-6);
      if (conflict) {
        t = conflict.executeAt + norm.actuator.spacing;
        continue;
      }
      if (uplinkFor(norm, t) !== undefined) epochs.push(t);
      t += step;
    }
  }
  return epochs;
}

/** How each actuator limit is named in reasons: the scenario field that sets it. */
const LIMIT_NAMES: Readonly<Record<ActuatorLimit, string>> = {
  maxFrequencyStep: 'actuator.maxFrequencyStep',
  cumulativeFrequencyRange: 'actuator.cumulativeFrequencyRange',
  maxPhaseStep: 'actuator.phaseSteps.maxStep',
};

/** The limit that cut a quantised step of the given kind, if any. */
function actuatorLimitOf(kind: 'frequency' | 'phase', step: QuantisedStep): ActuatorLimit | undefined {
  if (step.limitedBy === undefined) return undefined;
  if (kind === 'phase') return 'maxPhaseStep';
  return step.limitedBy === 'maxStep' ? 'maxFrequencyStep' : 'cumulativeFrequencyRange';
}

/**
 * One sentence per actuator limit that cut a command of `commands` short (from the commands'
 * `limitedBy` flags, in the order maxFrequencyStep, cumulative range, phase step), for the
 * infeasibility diagnosis.
 */
export function actuatorLimitMessages(norm: NormalizedScenario, commands: readonly InternalCommand[]): string[] {
  const hit = new Set(commands.map((c) => c.limitedBy).filter((l): l is ActuatorLimit => l !== undefined));
  const messages: string[] = [];
  if (hit.has('maxFrequencyStep')) messages.push(`the needed step exceeds ${frequencyLimitText(norm, 'maxStep')}`);
  if (hit.has('cumulativeFrequencyRange')) messages.push(`${frequencyLimitText(norm, 'range')} is exhausted`);
  if (hit.has('maxPhaseStep'))
    messages.push(`the needed phase step exceeds actuator.phaseSteps.maxStep (${ns(norm.actuator.phaseMaxStep)})`);
  return messages;
}

/** The backward (Riccati) pass of one phase-weight scale: the LQ value function at every boundary. */
export interface OptimalModel {
  norm: NormalizedScenario;
  bounds: Boundary[];
  stageS: Matrix3[];
  stageG: Vec3[];
  rF: number;
  rP: number;
  braking: BrakingModel;
  /** The phase-weight multiplier the model was built with. */
  scale: number;
}

/** Builds the boundaries and runs the backward pass with the phase weight multiplied by `scale`. */
export function optimalModel(norm: NormalizedScenario, fixed: readonly InternalCommand[], scale: number): OptimalModel {
  const cadence =
    norm.strategy.method === 'optimal' && norm.strategy.decisionIntervalSeconds !== undefined
      ? norm.strategy.decisionIntervalSeconds
      : Math.max(norm.grid, norm.actuator.spacing);
  const bounds = boundaries(norm, fixed, decisionEpochs(norm, fixed, cadence));
  const k = bounds.length - 1;
  const w = scale / (norm.bound * norm.bound * norm.horizon);
  const rF = norm.weights.frequencyStep / (norm.actuator.maxStep * norm.actuator.maxStep);
  const rP = norm.weights.phaseStep / (norm.bound * norm.bound);
  const stageS: Matrix3[] = new Array<Matrix3>(k);
  const stageG: Vec3[] = new Array<Vec3>(k);
  let pNext: Matrix3 = zeros3();
  let vNext: Vec3 = [0, 0, 0];
  let later = last(bounds, 'bounds');
  for (let i = k - 1; i >= 0; i--) {
    const b = at(bounds, i, 'bounds');
    const delta = later.t - b.t;
    const phi = transition(delta);
    const phiT = transpose3(phi);
    const costM = phaseSquareIntegral(delta);
    const s = add3(mul3(phiT, mul3(pNext, phi)), costM, w);
    const g = mulVec3(phiT, vNext);
    stageS[i] = s;
    stageG[i] = g;
    let p: Matrix3 = s;
    let v: Vec3 = g;
    if (b.controllable) {
      // Minimising over a frequency step u (input direction e2): u* = −(S₂·z + g₂)/(S₂₂ + r);
      // P = S − S₍·,₂₎S₍₂,·₎/(S₂₂ + r), v = g − S₍·,₂₎g₂/(S₂₂ + r), row by row.
      const den = s[1][1] + rF;
      const s1 = s[1];
      const eliminate = (r: Readonly<Vec3>): Vec3 => [
        r[0] - (r[1] * s1[0]) / den,
        r[1] - (r[1] * s1[1]) / den,
        r[2] - (r[1] * s1[2]) / den,
      ];
      p = [eliminate(s[0]), eliminate(s[1]), eliminate(s[2])];
      v = [g[0] - (s[0][1] * g[1]) / den, g[1] - (s[1][1] * g[1]) / den, g[2] - (s[2][1] * g[1]) / den];
    }
    // Known jump j at this boundary: V(s⁻) = V(s⁻ + j) ⇒ linear term gains P·j.
    const pj = mulVec3(p, [b.dx, b.dy, 0]);
    vNext = [v[0] + pj[0], v[1] + pj[1], v[2] + pj[2]];
    pNext = p;
    later = b;
  }
  return { norm, bounds, stageS, stageG, rF, rP, braking: brakingModel(norm, bounds), scale };
}

/** Where a forward pass starts: the first boundary at or after `t`, the mean state at `t` (before jumps at `t`), and the cumulative steering. */
export interface ForwardStart {
  t: number;
  state: Readonly<ClockState>;
  /** Cumulative frequency steering of every command already decided (fixed ones included). */
  cumulative: number;
}

interface Candidate {
  cost: number;
  kind: 'none' | 'frequency' | 'phase';
  step: QuantisedStep;
  violation: number;
}

/**
 * The forward pass: at each controllable boundary from `start.t` until `until` (exclusive), the
 * command minimising the LQ cost-to-go over the admissible steps (see braking.ts), after
 * rounding to whole actuator steps; later steps are chosen from the rounded state, so they
 * re-optimise what rounding left. Returns only the new commands. `explain` false skips the
 * reason texts (Monte Carlo).
 */
export function forwardOptimal(
  model: OptimalModel,
  start: ForwardStart,
  until = Infinity,
  explain = true,
): InternalCommand[] {
  const { norm, bounds, stageS, stageG, rF, rP } = model;
  const made: InternalCommand[] = [];
  let i = 0;
  while (i < bounds.length - 1 && at(bounds, i, 'bounds').t < start.t) i++;
  let state: ClockState = propagateMean(start.state, at(bounds, i, 'bounds').t - start.t);
  let cumulative = start.cumulative;
  for (; i < bounds.length - 1; i++) {
    const b = at(bounds, i, 'bounds');
    if (b.t >= until) break;
    state[0] += b.dx;
    state[1] += b.dy;
    if (b.controllable) {
      const best = chooseCommand(model, i, state, cumulative, at(stageS, i, 'stageS'), at(stageG, i, 'stageG'), rF, rP);
      if (best.kind !== 'none') {
        const uplink = uplinkFor(norm, b.t)!;
        const limitedBy = actuatorLimitOf(best.kind, best.step);
        const reason = explain
          ? `optimal (constrained LQ): predicted offset ${ns(state[0])} and frequency ${frac(state[1])} before the step; ` +
            `this ${best.kind} step minimises the expected offset cost to the end of the horizon among the steps that let the clock be braked ` +
            'without overshooting the opposite tolerance bound' +
            (limitedBy ? ` (limited by ${LIMIT_NAMES[limitedBy]})` : '') +
            (best.violation > 0
              ? `; no step avoids an overshoot of ${ns(best.violation)}: this one brakes hardest`
              : '')
          : '';
        made.push({
          uplinkAt: uplink,
          executeAt: b.t,
          kind: best.kind,
          steps: best.step.steps,
          amount: best.step.amount,
          planner: 'optimal',
          reason,
          ...(limitedBy ? { limitedBy } : {}),
        });
        if (best.kind === 'frequency') {
          state[1] += best.step.amount;
          cumulative += best.step.amount;
        } else state[0] += best.step.amount;
      }
    }
    state = propagateMean(state, at(bounds, i + 1, 'bounds').t - b.t);
  }
  return made;
}

/** The cheapest admissible command at controllable boundary i (see forwardOptimal). */
function chooseCommand(
  model: OptimalModel,
  i: number,
  state: Readonly<ClockState>,
  cumulative: number,
  s: Readonly<Matrix3>,
  g: Readonly<Vec3>,
  rF: number,
  rP: number,
): Candidate {
  const { norm, braking } = model;
  const q = (dx: number, dy: number, charge: number): number => {
    const z: Vec3 = [state[0] + dx, state[1] + dy, state[2]];
    return quadForm3(z, s) + 2 * (g[0] * z[0] + g[1] * z[1] + g[2] * z[2]) + charge;
  };
  const violation = (dx: number, du: number): number =>
    restViolation(braking, i, state[0], [state[0] + dx, state[1] + du, state[2]], cumulative + du);
  const none: Candidate = { cost: q(0, 0, 0), kind: 'none', step: { steps: 0, amount: 0 }, violation: violation(0, 0) };
  const candidates: Candidate[] = [none];
  const res = norm.actuator.resolution;
  const uStar = -(s[1][0] * state[0] + s[1][1] * state[1] + s[1][2] * state[2] + g[1]) / (s[1][1] + rF);
  const tried = new Set<number>();
  for (const rounding of ['floor', 'ceil'] as const) {
    const wanted = quantiseFrequency(norm, uStar, cumulative, rounding);
    const adm = admissibleSteps(braking, i, state, cumulative, wanted.steps);
    if (adm.steps === 0 || tried.has(adm.steps)) continue;
    tried.add(adm.steps);
    const amount = adm.steps * res;
    const step: QuantisedStep = adm.steps === wanted.steps ? wanted : { steps: adm.steps, amount };
    candidates.push({
      cost: q(0, amount, rF * amount * amount + norm.weights.command),
      kind: 'frequency',
      step,
      violation: adm.violation,
    });
  }
  if (norm.actuator.phaseAllowed) {
    const pStar = -(s[0][0] * state[0] + s[0][1] * state[1] + s[0][2] * state[2] + g[0]) / (s[0][0] + rP);
    for (const rounding of ['floor', 'ceil'] as const) {
      const qs = quantisePhase(norm, pStar, rounding);
      if (qs.steps === 0) continue;
      candidates.push({
        cost: q(qs.amount, 0, rP * qs.amount * qs.amount + norm.weights.command),
        kind: 'phase',
        step: qs,
        violation: violation(qs.amount, 0),
      });
    }
  }
  // Admissible candidates first (smallest violation), then the lowest cost.
  let best = none;
  for (const c of candidates)
    if (c.violation < best.violation || (c.violation === best.violation && c.cost < best.cost)) best = c;
  return best;
}

/** Runs the optimal planner on top of the `fixed` (feed-forward) commands. */
export function planOptimal(norm: NormalizedScenario, fixed: readonly InternalCommand[]): PlannerResult {
  // Raising the phase weight cannot help when z·σ alone exceeds the tolerance somewhere.
  // (A loop, not Math.max(...σ): a spread of more than ~125 000 grid points overflows the call stack.)
  let sigmaMax = 0;
  for (const sigma of phaseSigmaAt(norm, gridTimes(norm))) sigmaMax = Math.max(sigmaMax, sigma);
  const sigmaBound = sigmaMax * norm.z;
  const attempts = sigmaBound >= norm.bound ? 1 : 5;
  // The phase weight is a tuning knob (the one-step look-ahead over whole steps with a per-command
  // charge does not minimise J exactly): plans for weights 1, 10, … 10⁴ are compared and the one
  // kept is the feasible one with the lowest expected cost J at the scenario's own weights or,
  // when none is feasible, the one with the lowest J, so an unavoidable violation never buys an
  // over-aggressive gain.
  const start: ForwardStart = { t: 0, state: norm.state0, cumulative: cumulativeFrequency(norm, fixed) };
  let commands: InternalCommand[] = [];
  let ok = false;
  let scale = 1;
  let bestCost = Infinity;
  for (let attempt = 0, trial = 1; attempt < attempts; attempt++, trial *= 10) {
    const planned = [...fixed, ...forwardOptimal(optimalModel(norm, fixed, trial), start)].sort(
      (a, b) => a.executeAt - b.executeAt,
    );
    const feasible = checkTolerance(norm, stateJumps(norm, planned)).ok;
    if (ok && !feasible) continue;
    const cost = expectedCost(norm, planned).total;
    if ((feasible && !ok) || cost < bestCost) {
      bestCost = cost;
      commands = planned;
      scale = trial;
      ok = feasible;
    }
  }
  // Root-level safeguard: keep the deadband schedule when it is feasible and the LQ one is not,
  // or when both have the same feasibility and the deadband schedule has the lower expected cost.
  const deadband = planDeadband(norm, fixed);
  const deadbandOk = checkTolerance(norm, stateJumps(norm, deadband.commands)).ok;
  if (
    (deadbandOk && !ok) ||
    (deadbandOk === ok && expectedCost(norm, deadband.commands).total < expectedCost(norm, commands).total)
  ) {
    const why =
      deadbandOk && !ok
        ? 'it holds the tolerance and the LQ schedule does not'
        : 'lower expected cost than the LQ schedule';
    return {
      // Feed-forward commands keep their reason; the deadband planner's own say why the optimal planner kept them.
      commands: deadband.commands.map((c) =>
        c.planner === 'deadband'
          ? {
              ...c,
              reason: `optimal (deadband schedule kept: ${why}): ${c.reason.slice(DEADBAND_REASON_PREFIX.length)}`,
            }
          : c,
      ),
      limits: deadband.limits,
      optimal: { scale, deadbandKept: true },
    };
  }
  // Only the LQ commands carry `limitedBy`; the feed-forward ones report their limits separately.
  return { commands, limits: actuatorLimitMessages(norm, commands), optimal: { scale, deadbandKept: false } };
}
