/**
 * Seeded Monte Carlo evaluation of a steering plan: the plan's commands are flown, unchanged,
 * against simulated clocks drawn from the 3-state model (initial state from the epoch mean and
 * covariance, then exact discrete process noise Q(τ) of Zucca & Tavella 2005 between events).
 *
 * @module
 */
import { requireInteger, requireObject } from '../internal/validate.js';
import { MAX_SEED } from '../internal/random.js';
import { choleskyPsd3, processNoise, type Matrix3 } from './clock-math.js';
import { commandsToInternal } from './evaluate.js';
import type { SteeringPlan } from './plan.js';
import { gridTimes, stateJumps } from './predict.js';
import { createRandom } from '../internal/random.js';
import { validateScenario } from './scenario.js';
import { resolveTimeScales, type TimeScaleOptions } from './utc-stamps.js';

export interface SimulationOptions extends TimeScaleOptions {
  /** Number of simulated clocks (1 … 1 000 000). */
  runs: number;
  /** Seed of the random generator (unsigned 32-bit integer); default 1. Same seed, same result. */
  seed?: number;
  /** Called after each run with (runs done, runs total). */
  onProgress?: (done: number, total: number) => void;
}

export interface SimulationSummary {
  runs: number;
  seed: number;
  commandCount: number;
  /** Fraction of all (run, grid epoch) pairs with |offset| ≤ tolerance. */
  timeInTolerance: number;
  /** Fraction of runs that stayed inside the tolerance at every grid epoch of the horizon. */
  wholeHorizonProbability: number;
  /** Smallest, over grid epochs, fraction of runs inside the tolerance (compare with the plan's per-epoch probability). */
  minEpochProbability: number;
  /** Largest |offset| seen in any run, in seconds. */
  worstExcursionSeconds: number;
  /** 95th percentile over runs of each run's largest |offset|, in seconds. */
  worstExcursionP95Seconds: number;
}

/**
 * Flies a plan against `runs` simulated clocks and reports time in tolerance, the probability
 * of staying inside over the whole horizon, and the worst excursion.
 *
 * Noise model: s(0) ~ N(mean0, P0); s(t+τ) = Φ(τ)s(t) + w, w ~ N(0, Q(τ)) with Q from q1, q2, q3
 * (Zucca & Tavella, IEEE Trans. UFFC 52(2) 289–296, 2005; physics-refs §11); manoeuvre rate
 * changes and the plan's commands are applied exactly at their epochs. Offsets are checked on
 * the scenario grid (after any jump at that epoch).
 *
 * @param scenario  The scenario the plan was made for.
 * @param plan      The plan (its `commands` are used).
 * @param options   `runs`, `seed`, `onProgress`, and `timeScales` (the leap-second table for the UTC
 *   stamps; default the bundled table, valid until 2027-06-28).
 * @throws {InvalidArgumentError} for invalid scenario, command, runs, seed or timeScales.
 * @throws {OutOfDomainError} for stamps outside the leap-second table (see `validateScenario`).
 */
export function simulatePlan(scenario: unknown, plan: Pick<SteeringPlan, 'commands'>, options: SimulationOptions): SimulationSummary {
  requireObject('options', options, 'an object with runs');
  const norm = validateScenario(scenario, { timeScales: resolveTimeScales(options) });
  const runs = requireInteger('options.runs', options.runs, 1, 1_000_000);
  const seed = options.seed === undefined ? 1 : requireInteger('options.seed', options.seed, 0, MAX_SEED);
  requireObject('plan', plan as object, 'a plan object { commands }');
  const commands = commandsToInternal(norm, plan.commands, 'plan.commands');
  const jumps = stateJumps(norm, commands);
  const grid = gridTimes(norm);
  const gridSet = new Set(grid);
  const timeline = [...new Set([...grid, ...jumps.map((j) => j.t).filter((t) => t >= 0 && t <= norm.horizon)])].sort((a, b) => a - b);
  const steps = timeline.map((t, i) => {
    const here = jumps.filter((j) => j.t === t);
    return {
      delta: i === 0 ? 0 : t - timeline[i - 1]!, onGrid: gridSet.has(t),
      jumpDx: here.reduce((s, j) => s + j.dx, 0), jumpDy: here.reduce((s, j) => s + j.dy, 0),
    };
  });
  const cholCache = new Map<number, Matrix3>();
  const cholFor = (delta: number): Matrix3 => {
    let l = cholCache.get(delta);
    if (!l) {
      l = choleskyPsd3(processNoise(delta, norm.noise));
      cholCache.set(delta, l);
    }
    return l;
  };
  const l0 = choleskyPsd3(norm.covariance0);
  const rng = createRandom(seed, 'ziggurat');
  const inside = new Float64Array(grid.length);
  const perRunWorst = new Float64Array(runs);
  let insideTotal = 0;
  let alwaysInside = 0;
  let worst = 0;
  const b = norm.bound;
  for (let r = 0; r < runs; r++) {
    const n0 = rng.normal();
    const n1 = rng.normal();
    const n2 = rng.normal();
    let x = norm.state0[0] + l0[0][0] * n0;
    let y = norm.state0[1] + l0[1][0] * n0 + l0[1][1] * n1;
    let d = norm.state0[2] + l0[2][0] * n0 + l0[2][1] * n1 + l0[2][2] * n2;
    let runWorst = 0;
    let ok = true;
    let g = 0;
    for (const st of steps) {
      if (st.delta > 0) {
        const tau = st.delta;
        const l = cholFor(tau);
        const w0 = rng.normal();
        const w1 = rng.normal();
        const w2 = rng.normal();
        x = x + y * tau + (d * tau * tau) / 2 + l[0][0] * w0;
        y = y + d * tau + l[1][0] * w0 + l[1][1] * w1;
        d = d + l[2][0] * w0 + l[2][1] * w1 + l[2][2] * w2;
      }
      x += st.jumpDx;
      y += st.jumpDy;
      if (st.onGrid) {
        const ax = Math.abs(x);
        if (ax <= b) {
          inside[g] = inside[g]! + 1;
          insideTotal++;
        } else ok = false;
        if (ax > runWorst) runWorst = ax;
        g++;
      }
    }
    if (ok) alwaysInside++;
    perRunWorst[r] = runWorst;
    if (runWorst > worst) worst = runWorst;
    options.onProgress?.(r + 1, runs);
  }
  const sorted = Array.from(perRunWorst).sort((a, c) => a - c);
  let minEpoch = 1;
  for (let i = 0; i < grid.length; i++) minEpoch = Math.min(minEpoch, inside[i]! / runs);
  return {
    runs, seed, commandCount: commands.length,
    timeInTolerance: insideTotal / (runs * grid.length),
    wholeHorizonProbability: alwaysInside / runs,
    minEpochProbability: minEpoch,
    worstExcursionSeconds: worst,
    worstExcursionP95Seconds: sorted[Math.min(runs - 1, Math.ceil(0.95 * runs) - 1)]!,
  };
}
