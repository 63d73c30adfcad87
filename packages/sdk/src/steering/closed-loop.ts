/**
 * Closed-loop Monte Carlo of steering operations: a truth clock flies the scenario's noise model,
 * ground estimates of its offset are produced on the operations grid with white noise and
 * latency, the plan is revised at the start of every contact from the Kalman filter's estimate,
 * and the commands uplinked in each contact are executed.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at, last } from '../internal/checked.js';
import { createRandom, MAX_SEED, type Random } from '../internal/random.js';
import { requireInteger } from '../internal/validate.js';
import { choleskyPsd3, type Matrix3, processNoise } from './clock-math.js';
import { LeanClockFilter } from './lean-filter.js';
import type { SteeringMethod } from './plan.js';
import { gridTimes, type InternalCommand, type StateJump } from './predict.js';
import { makeReplanner, propagateEstimate, type Replanner, replanFrom, type StateEstimate } from './replan.js';
import { type NormalizedScenario, validateScenario } from './scenario.js';
import { resolveTimeScales, type TimeScaleOptions } from './utc-stamps.js';

export interface ClosedLoopOptions extends TimeScaleOptions {
  /** Number of simulated clocks (1 … 100 000); every strategy flies the same clocks. */
  runs: number;
  /** Seed (unsigned 32-bit integer); default 1. Same seed, same result. */
  seed?: number;
  /** Methods to fly, in this order; default optimal, deadband, none. */
  strategies?: readonly SteeringMethod[];
  /** Called after each run with (runs done, runs total). */
  onProgress?: (done: number, total: number) => void;
}

/** Statistics of one method over the runs (nearest-rank percentiles). */
export interface ClosedLoopStrategySummary {
  method: SteeringMethod;
  /** Per run, the fraction of grid epochs with |offset| ≤ tolerance: mean, 5th percentile, minimum. */
  timeInTolerance: { mean: number; p05: number; min: number };
  /** Per run, the largest |offset| on the grid, in seconds: median, 95th percentile, maximum. */
  maxAbsOffsetSeconds: { p50: number; p95: number; max: number };
  /** Commands executed per day (feed-forward included), mean over runs. */
  commandsPerDay: { mean: number };
  /** Σ |fractional frequency steps| per run (dimensionless), mean over runs. */
  totalFrequencySteering: { mean: number };
}

export interface ClosedLoopSummary {
  closedLoop: true;
  runs: number;
  seed: number;
  strategies: ClosedLoopStrategySummary[];
}

/** A free-running truth clock sampled at `times` (no commands, no manoeuvres). */
export interface TruthClock {
  times: Float64Array;
  phase: Float64Array;
  /** Standard-normal draws for the estimate noise, one per estimate epoch. */
  estimateNoise: Float64Array;
}

/** The fixed time bases of a closed-loop simulation. */
export interface ClosedLoopFrame {
  norm: NormalizedScenario;
  grid: number[];
  estimateTimes: number[];
  /** Union of grid and estimate times, sorted; index maps for both. */
  times: Float64Array;
  gridIndex: Int32Array;
  estimateIndex: Int32Array;
  /** Cholesky factor of Q(Δ) for each step of `times`. */
  chol: Matrix3[];
  l0: Matrix3;
}

export function closedLoopFrame(norm: NormalizedScenario): ClosedLoopFrame {
  const ops = norm.operations!;
  const grid = gridTimes(norm);
  const estimateTimes: number[] = [];
  for (let k = 1; k * ops.interval <= norm.horizon + 1e-9; k++) estimateTimes.push(k * ops.interval);
  const all = [...new Set([...grid, ...estimateTimes])].sort((a, b) => a - b);
  const times = Float64Array.from(all);
  const pos = new Map(all.map((t, i) => [t, i] as const));
  const cache = new Map<number, Matrix3>();
  const chol = all.map((t, i) => {
    const dt = i === 0 ? 0 : t - at(all, i - 1, 'times');
    let l = cache.get(dt);
    if (!l) {
      l = choleskyPsd3(processNoise(dt, norm.noise));
      cache.set(dt, l);
    }
    return l;
  });
  return {
    norm,
    grid,
    estimateTimes,
    times,
    chol,
    l0: choleskyPsd3(norm.covariance0),
    gridIndex: Int32Array.from(grid, (t) => pos.get(t)!),
    estimateIndex: Int32Array.from(estimateTimes, (t) => pos.get(t)!),
  };
}

/**
 * Draws one free-running truth clock: s(0) ~ N(mean0, P0), s(t+Δ) = Φ(Δ)s + w, w ~ N(0, Q(Δ)) (Zucca & Tavella 2005).
 * Hot path: indices bounded by i < times.length = chol.length (closedLoopFrame).
 */
export function drawTruth(frame: ClosedLoopFrame, rng: Random): TruthClock {
  const { norm, times, chol, l0 } = frame;
  const n0 = rng.normal();
  const n1 = rng.normal();
  const n2 = rng.normal();
  let x = norm.state0[0] + l0[0][0] * n0;
  let y = norm.state0[1] + l0[1][0] * n0 + l0[1][1] * n1;
  let d = norm.state0[2] + l0[2][0] * n0 + l0[2][1] * n1 + l0[2][2] * n2;
  const phase = new Float64Array(times.length);
  let previous = 0; // the first step runs from 0 to times[0]
  for (let i = 0; i < times.length; i++) {
    const t = times[i]!;
    const tau = t - previous;
    previous = t;
    if (tau > 0) {
      const l = chol[i]!;
      const w0 = rng.normal();
      const w1 = rng.normal();
      const w2 = rng.normal();
      x = x + y * tau + (d * tau * tau) / 2 + l[0][0] * w0;
      y = y + d * tau + l[1][0] * w0 + l[1][1] * w1;
      d = d + l[2][0] * w0 + l[2][1] * w1 + l[2][2] * w2;
    }
    phase[i] = x;
  }
  const estimateNoise = new Float64Array(frame.estimateTimes.length);
  for (let k = 0; k < estimateNoise.length; k++) estimateNoise[k] = rng.normal();
  return { times, phase, estimateNoise };
}

/** Outcome of one closed-loop run. */
export interface ClosedLoopRun {
  /** Every command executed (feed-forward and re-planned), by execution time. */
  commands: InternalCommand[];
  /** Offset on the grid, in seconds (truth with commands and manoeuvres). */
  offset: Float64Array;
}

/**
 * Flies one truth clock with one method: at each contact start the estimates available by then
 * (epoch + latency ≤ now, epoch < now) go through the Kalman filter (LeanClockFilter, the
 * equations of ClockKalmanFilter) with the executed jumps
 * applied as known steps, the estimate is carried to now, and the commands for [now, next
 * contact) are planned and executed.
 */
export function flyClosedLoop(frame: ClosedLoopFrame, rp: Replanner, truth: TruthClock): ClosedLoopRun {
  const { norm } = frame;
  const ops = norm.operations!;
  const variance = Math.max(ops.noise * ops.noise, 1e-40);
  const filter = new LeanClockFilter(0, norm.state0, norm.covariance0, norm.noise);
  const base: StateJump[] = [
    ...norm.maneuvers.map((m) => ({ t: m.t, dy: m.rateChange, dx: 0 })),
    ...rp.feedForward.map((c) => toJump(c)),
  ].sort((a, b) => a.t - b.t);
  const made: InternalCommand[] = [];
  const planned: StateJump[] = [];
  let kb = 0;
  let kp = 0;
  let sumDy = 0;
  let sumOffset = 0; // Σ (dx_j − dy_j t_j)
  const nextJump = (): StateJump | undefined => {
    const a = base[kb];
    const b = planned[kp];
    return a && (!b || a.t <= b.t) ? a : b;
  };
  const consume = (j: StateJump): void => {
    if (j === base[kb]) kb++;
    else kp++;
    sumDy += j.dy;
    sumOffset += j.dx - j.dy * j.t;
    filter.predict(j.t);
    filter.applyStep(j.dx, j.dy);
  };
  let ke = 0;
  let cumulative =
    norm.actuator.initial + rp.feedForward.reduce((s, c) => s + (c.kind === 'frequency' ? c.amount : 0), 0);
  const windows = norm.windows;
  for (const [w, window] of windows.entries()) {
    const now = window.start;
    const until = windows[w + 1]?.start ?? norm.horizon; // the horizon after the last window
    for (
      let e = frame.estimateTimes[ke];
      e !== undefined && e < now && e + ops.latency <= now;
      e = frame.estimateTimes[++ke]
    ) {
      for (let j = nextJump(); j && j.t <= e; j = nextJump()) consume(j);
      const truePhase = at(truth.phase, at(frame.estimateIndex, ke, 'estimateIndex'), 'truth.phase');
      const z = truePhase + sumDy * e + sumOffset + ops.noise * at(truth.estimateNoise, ke, 'estimateNoise');
      filter.predict(e);
      filter.update(z, variance);
    }
    const est = estimateAt(filter, base, kb, planned, kp, now, norm);
    const fixedAfter = rp.feedForward.filter((c) => c.executeAt >= now);
    let lastExecuted = -Infinity;
    for (const c of rp.feedForward) if (c.executeAt < now) lastExecuted = Math.max(lastExecuted, c.executeAt);
    if (made.length > 0) lastExecuted = Math.max(lastExecuted, last(made, 'made').executeAt);
    const fresh = replanFrom(rp, now, until, est, cumulative, fixedAfter, false, lastExecuted);
    for (const c of fresh) {
      made.push(c);
      planned.push(toJump(c));
      if (c.kind === 'frequency') cumulative += c.amount;
    }
  }
  const all = [...base, ...planned].sort((a, b) => a.t - b.t);
  const offset = new Float64Array(frame.grid.length);
  let k = 0;
  let next = all[0];
  let dy = 0;
  let off = 0;
  frame.grid.forEach((t, i) => {
    for (; next !== undefined && next.t <= t; next = all[++k]) {
      dy += next.dy;
      off += next.dx - next.dy * next.t;
    }
    offset[i] = at(truth.phase, at(frame.gridIndex, i, 'gridIndex'), 'truth.phase') + dy * t + off;
  });
  const commands = [...rp.feedForward, ...made].sort((a, b) => a.executeAt - b.executeAt);
  return { commands, offset };
}

function toJump(c: InternalCommand): StateJump {
  return c.kind === 'frequency' ? { t: c.executeAt, dy: c.amount, dx: 0 } : { t: c.executeAt, dy: 0, dx: c.amount };
}

/** The filter's estimate carried to `now` through the jumps not yet consumed that execute before `now`. */
function estimateAt(
  filter: LeanClockFilter,
  base: readonly StateJump[],
  kb: number,
  planned: readonly StateJump[],
  kp: number,
  now: number,
  norm: NormalizedScenario,
): StateEstimate {
  let t = filter.t;
  let est: StateEstimate = { state: [filter.s[0], filter.s[1], filter.s[2]], covariance: filter.covariance() };
  const pending = [...base.slice(kb), ...planned.slice(kp)].filter((j) => j.t < now).sort((a, b) => a.t - b.t);
  for (const j of pending) {
    est = propagateEstimate(est, j.t - t, norm);
    est.state[0] += j.dx;
    est.state[1] += j.dy;
    t = j.t;
  }
  return propagateEstimate(est, now - t, norm);
}

/** Nearest-rank percentile of sorted values (common practice, no source). */
function percentile(sorted: Float64Array, p: number): number {
  return at(sorted, Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1)), 'sorted');
}

/**
 * Closed-loop Monte Carlo (see the module comment) for each method, on the same `runs` truth
 * clocks (drawn from the seed, one after another, before any strategy flies them).
 *
 * Per run and method: time in tolerance (fraction of grid epochs with |offset| ≤ b), largest
 * |offset| on the grid, commands per day and Σ|frequency steps|; summarised over runs (mean,
 * nearest-rank percentiles). Deterministic for a seed.
 *
 * @param scenario  A scenario with an `operations` block.
 * @param options   `runs`, `seed`, `strategies`, `onProgress`, `timeScales`.
 * @throws {InvalidArgumentError} for a bad scenario, a missing `operations` block, runs, seed or strategies.
 */
export function simulateClosedLoop(scenario: unknown, options: ClosedLoopOptions): ClosedLoopSummary {
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError('options', options, 'an object with runs');
  const norm = validateScenario(scenario, { timeScales: resolveTimeScales(options) });
  if (!norm.operations) {
    throw new InvalidArgumentError(
      'operations',
      undefined,
      'an operations block { estimateIntervalSeconds, estimateNoiseSeconds, estimateLatencySeconds?, replan? } for a closed-loop simulation',
    );
  }
  const runs = requireInteger('options.runs', options.runs, 1, 100_000);
  const seed = options.seed === undefined ? 1 : requireInteger('options.seed', options.seed, 0, MAX_SEED);
  const methods = options.strategies ?? (['optimal', 'deadband', 'none'] as const);
  if (!Array.isArray(methods) || methods.length === 0)
    throw new InvalidArgumentError('options.strategies', methods, 'a non-empty array of "optimal", "deadband", "none"');
  methods.forEach((m, i) => {
    if (m !== 'optimal' && m !== 'deadband' && m !== 'none')
      throw new InvalidArgumentError(`options.strategies[${i}]`, m, '"optimal", "deadband" or "none"');
  });
  const frame = closedLoopFrame(norm);
  const rng = createRandom(seed);
  const days = norm.horizon / 86_400;
  // Per method: its re-planner and its statistics over the runs.
  const flights = methods.map((method) => ({
    method,
    rp: makeReplanner(norm, method),
    tit: new Float64Array(runs),
    worst: new Float64Array(runs),
    cmds: 0,
    steer: 0,
  }));
  for (let r = 0; r < runs; r++) {
    const truth = drawTruth(frame, rng);
    for (const s of flights) {
      const run = flyClosedLoop(frame, s.rp, truth);
      let inside = 0;
      let worst = 0;
      for (const x of run.offset) {
        const ax = Math.abs(x);
        if (ax <= norm.bound) inside++;
        if (ax > worst) worst = ax;
      }
      s.tit[r] = inside / run.offset.length;
      s.worst[r] = worst;
      s.cmds += run.commands.length / days;
      s.steer += run.commands.reduce((sum, c) => sum + (c.kind === 'frequency' ? Math.abs(c.amount) : 0), 0);
    }
    options.onProgress?.(r + 1, runs);
  }
  return {
    closedLoop: true,
    runs,
    seed,
    strategies: flights.map((s) => {
      const tit = s.tit.slice().sort();
      const worst = s.worst.slice().sort();
      return {
        method: s.method,
        timeInTolerance: {
          mean: tit.reduce((a, b) => a + b, 0) / runs,
          p05: percentile(tit, 0.05),
          min: at(tit, 0, 'tit'),
        },
        maxAbsOffsetSeconds: { p50: percentile(worst, 0.5), p95: percentile(worst, 0.95), max: last(worst, 'worst') },
        commandsPerDay: { mean: s.cmds / runs },
        totalFrequencySteering: { mean: s.steer / runs },
      };
    }),
  };
}
