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
import {
  add3, mul3, mulVec3, phaseSquareIntegral, propagateMean, quadForm3, transition, transpose3, zeros3, type Matrix3,
} from './clock-math.js';
import {
  cumulativeFrequency, executionIntervals, frac, frequencyLimitText, ns, quantiseFrequency, quantisePhase, uplinkFor, type QuantisedStep,
} from './constraints.js';
import { expectedCost } from './cost.js';
import { DEADBAND_REASON_PREFIX, planDeadband, type PlannerResult } from './deadband.js';
import { checkTolerance, gridTimes, phaseSigmaAt, stateJumps, type ActuatorLimit, type InternalCommand } from './predict.js';
import type { NormalizedScenario } from './scenario.js';

interface Boundary {
  t: number;
  dx: number;
  dy: number;
  controllable: boolean;
}

/** Candidate execution epochs: uplink-reachable, ≥ spacing apart and away from fixed commands. */
export function decisionEpochs(norm: NormalizedScenario, fixed: readonly InternalCommand[], cadence: number): number[] {
  const step = Math.max(cadence, norm.actuator.spacing, 1e-3);
  const epochs: number[] = [];
  for (const iv of executionIntervals(norm)) {
    let t = Math.max(iv.from, epochs.length ? epochs[epochs.length - 1]! + step : iv.from);
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

function boundaries(norm: NormalizedScenario, fixed: readonly InternalCommand[], epochs: readonly number[]): Boundary[] {
  const map = new Map<number, Boundary>();
  const at = (t: number): Boundary => {
    let b = map.get(t);
    if (!b) {
      b = { t, dx: 0, dy: 0, controllable: false };
      map.set(t, b);
    }
    return b;
  };
  at(0);
  at(norm.horizon);
  for (const j of stateJumps(norm, fixed)) {
    if (j.t >= norm.horizon) continue;
    const b = at(j.t);
    b.dx += j.dx;
    b.dy += j.dy;
  }
  for (const t of epochs) if (t < norm.horizon) at(t).controllable = true;
  return [...map.values()].sort((a, b) => a.t - b.t);
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
  if (hit.has('maxPhaseStep')) messages.push(`the needed phase step exceeds actuator.phaseSteps.maxStep (${ns(norm.actuator.phaseMaxStep)})`);
  return messages;
}

/** One backward + forward pass with the phase weight multiplied by `scale`. */
function lqPass(norm: NormalizedScenario, fixed: readonly InternalCommand[], bounds: readonly Boundary[], scale: number): InternalCommand[] {
  const k = bounds.length - 1;
  const w = scale / (norm.bound * norm.bound * norm.horizon);
  const rF = norm.weights.frequencyStep / (norm.actuator.maxStep * norm.actuator.maxStep);
  const rP = norm.weights.phaseStep / (norm.bound * norm.bound);
  const stageS: Matrix3[] = new Array<Matrix3>(k);
  const stageG: number[][] = new Array<number[]>(k);
  let pNext: Matrix3 = zeros3();
  let vNext: number[] = [0, 0, 0];
  for (let i = k - 1; i >= 0; i--) {
    const delta = bounds[i + 1]!.t - bounds[i]!.t;
    const phi = transition(delta);
    const phiT = transpose3(phi);
    const costM = phaseSquareIntegral(delta);
    const s = add3(mul3(phiT, mul3(pNext, phi)), costM, w);
    const g = mulVec3(phiT, vNext);
    stageS[i] = s;
    stageG[i] = g;
    let p: Matrix3 = s;
    let v: number[] = g;
    if (bounds[i]!.controllable) {
      // Minimising over a frequency step u (input direction e2): u* = −(S₂·z + g₂)/(S₂₂ + r).
      const den = s[1][1] + rF;
      p = zeros3();
      for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) p[a]![b] = s[a]![b]! - (s[a]![1]! * s[1]![b]!) / den;
      v = [0, 1, 2].map((a) => g[a]! - (s[a]![1]! * g[1]!) / den);
    }
    // Known jump j at this boundary: V(s⁻) = V(s⁻ + j) ⇒ linear term gains P·j.
    const jump = [bounds[i]!.dx, bounds[i]!.dy, 0];
    const pj = mulVec3(p, jump);
    vNext = [v[0]! + pj[0], v[1]! + pj[1], v[2]! + pj[2]];
    pNext = p;
  }

  const commands: InternalCommand[] = [...fixed];
  let state = [...norm.state0];
  for (let i = 0; i < k; i++) {
    const b = bounds[i]!;
    state[0] += b.dx;
    state[1] += b.dy;
    if (b.controllable) {
      const s = stageS[i]!;
      const g = stageG[i]!;
      const q = (dx: number, dy: number, charge: number): number => {
        const z = [state[0]! + dx, state[1]! + dy, state[2]!];
        return quadForm3(z, s) + 2 * (g[0]! * z[0]! + g[1]! * z[1]! + g[2]! * z[2]!) + charge;
      };
      let best = { cost: q(0, 0, 0), kind: 'none' as 'none' | 'frequency' | 'phase', step: { steps: 0, amount: 0 } as QuantisedStep };
      const cumulative = cumulativeFrequency(norm, commands);
      const uStar = -(s[1][0] * state[0]! + s[1][1] * state[1]! + s[1][2] * state[2]! + g[1]!) / (s[1][1] + rF);
      for (const rounding of ['floor', 'ceil'] as const) {
        const qs = quantiseFrequency(norm, uStar, cumulative, rounding);
        if (qs.steps === 0) continue;
        const c = q(0, qs.amount, rF * qs.amount * qs.amount + norm.weights.command);
        if (c < best.cost) best = { cost: c, kind: 'frequency', step: qs };
      }
      if (norm.actuator.phaseAllowed) {
        const pStar = -(s[0][0] * state[0]! + s[0][1] * state[1]! + s[0][2] * state[2]! + g[0]!) / (s[0][0] + rP);
        for (const rounding of ['floor', 'ceil'] as const) {
          const qs = quantisePhase(norm, pStar, rounding);
          if (qs.steps === 0) continue;
          const c = q(qs.amount, 0, rP * qs.amount * qs.amount + norm.weights.command);
          if (c < best.cost) best = { cost: c, kind: 'phase', step: qs };
        }
      }
      if (best.kind !== 'none') {
        const uplink = uplinkFor(norm, b.t)!;
        const before = `predicted offset ${ns(state[0]!)} and frequency ${frac(state[1]!)} before the step`;
        const limitedBy = actuatorLimitOf(best.kind, best.step);
        commands.push({
          uplinkAt: uplink, executeAt: b.t, kind: best.kind, steps: best.step.steps, amount: best.step.amount, planner: 'optimal',
          reason: `optimal (quantised LQ): ${before}; this ${best.kind} step minimises the expected offset cost to the end of the horizon` +
            (limitedBy ? ` (limited by ${LIMIT_NAMES[limitedBy]})` : ''),
          ...(limitedBy ? { limitedBy } : {}),
        });
        if (best.kind === 'frequency') state[1] += best.step.amount;
        else state[0] += best.step.amount;
      }
    }
    const delta = bounds[i + 1]!.t - b.t;
    state = propagateMean(state, delta);
  }
  commands.sort((a, b) => a.executeAt - b.executeAt);
  return commands;
}

/** Runs the optimal planner on top of the `fixed` (feed-forward) commands. */
export function planOptimal(norm: NormalizedScenario, fixed: readonly InternalCommand[]): PlannerResult {
  const cadence = norm.strategy.method === 'optimal' && norm.strategy.decisionIntervalSeconds !== undefined
    ? norm.strategy.decisionIntervalSeconds : Math.max(norm.grid, norm.actuator.spacing);
  const epochs = decisionEpochs(norm, fixed, cadence);
  const bounds = boundaries(norm, fixed, epochs);
  // Raising the phase weight cannot help when z·σ alone exceeds the tolerance somewhere.
  // (A loop, not Math.max(...σ): a spread of more than ~125 000 grid points overflows the call stack.)
  let sigmaMax = 0;
  for (const sigma of phaseSigmaAt(norm, gridTimes(norm))) sigmaMax = Math.max(sigmaMax, sigma);
  const sigmaBound = sigmaMax * norm.z;
  const attempts = sigmaBound >= norm.bound ? 1 : 5;
  let commands: InternalCommand[] = [];
  let ok = false;
  for (let attempt = 0, scale = 1; attempt < attempts; attempt++, scale *= 10) {
    commands = lqPass(norm, fixed, bounds, scale);
    ok = checkTolerance(norm, stateJumps(norm, commands)).ok;
    if (ok) break;
  }
  // Root-level safeguard: keep the deadband schedule when it is feasible and the LQ one is not,
  // or when both have the same feasibility and the deadband schedule has the lower expected cost.
  const deadband = planDeadband(norm, fixed);
  const deadbandOk = checkTolerance(norm, stateJumps(norm, deadband.commands)).ok;
  if ((deadbandOk && !ok) || (deadbandOk === ok && expectedCost(norm, deadband.commands).total < expectedCost(norm, commands).total)) {
    const why = deadbandOk && !ok ? 'it holds the tolerance and the LQ schedule does not' : 'lower expected cost than the LQ schedule';
    return {
      // Feed-forward commands keep their reason; the deadband planner's own say why the optimal planner kept them.
      commands: deadband.commands.map((c) => (c.planner === 'deadband'
        ? { ...c, reason: `optimal (deadband schedule kept: ${why}): ${c.reason.slice(DEADBAND_REASON_PREFIX.length)}` } : c)),
      limits: deadband.limits,
    };
  }
  // Only the LQ commands carry `limitedBy`; the feed-forward ones report their limits separately.
  return { commands, limits: actuatorLimitMessages(norm, commands) };
}
