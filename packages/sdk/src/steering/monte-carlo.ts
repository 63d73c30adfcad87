/**
 * Seeded Monte Carlo evaluation of a steering plan: the plan's commands are flown, unchanged,
 * against simulated clocks drawn from the 3-state model (initial state from the epoch mean and
 * covariance, then exact discrete process noise Q(τ) of Zucca & Tavella 2005 between events).
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { createReseedableRandom, MAX_SEED } from '../internal/random.js';
import { requireInteger, requireObject } from '../internal/validate.js';
import { choleskyPsd3, type Matrix3, processNoise } from './clock-math.js';
import { commandsToInternal } from './evaluate.js';
import type { SteeringPlan } from './plan.js';
import { gridTimes, stateJumps } from './predict.js';
import type { NormalizedScenario } from './scenario.js';
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

/** Options of `simulatePlanRuns`: a contiguous range of the runs of one seed. */
export interface SimulationRangeOptions extends TimeScaleOptions {
  /** Seed of the random generator (unsigned 32-bit integer); default 1. */
  seed?: number;
  /** Index of the first run of the range (0 … 999 999). */
  firstRun: number;
  /** Number of runs in the range (1 … 1 000 000 − firstRun). */
  runCount: number;
  /** Called after each run with (runs of the range done, runCount). */
  onProgress?: (done: number, total: number) => void;
}

/**
 * The per-run results of a range of runs, everything `combineMonteCarloParts` needs. Plain data
 * (numbers and typed arrays), so it can cross a worker boundary by structured clone.
 */
export interface MonteCarloPart {
  seed: number;
  firstRun: number;
  runCount: number;
  commandCount: number;
  /** Per grid epoch, how many runs of the range were inside the tolerance (integers). */
  insideByEpoch: Float64Array;
  /** Per run of the range, 1 if it stayed inside at every grid epoch, else 0. */
  alwaysInsideByRun: Uint8Array;
  /** Per run of the range, its largest |offset| on the grid, in seconds. */
  worstByRunSeconds: Float64Array;
}

/**
 * Flies a plan against `runs` simulated clocks and reports time in tolerance, the probability
 * of staying inside over the whole horizon, and the worst excursion.
 *
 * Noise model: s(0) ~ N(mean0, P0); s(t+τ) = Φ(τ)s(t) + w, w ~ N(0, Q(τ)) with Q from q1, q2, q3
 * (Zucca & Tavella, IEEE Trans. UFFC 52(2) 289–296, 2005; physics-refs §11); manoeuvre rate
 * changes and the plan's commands are applied exactly at their epochs. Offsets are checked on
 * the scenario grid (after any jump at that epoch). Run r draws from its own random stream,
 * selected by (seed, r) (see `simulatePlanRuns`), so the result equals the combination of any
 * split of the runs into contiguous ranges.
 *
 * @param scenario  The scenario the plan was made for.
 * @param plan      The plan (its `commands` are used).
 * @param options   `runs`, `seed`, `onProgress`, and `timeScales` (the leap-second table for the UTC
 *   stamps; default the bundled table, valid until 2027-06-28).
 * @throws {InvalidArgumentError} for invalid scenario, command, runs, seed or timeScales.
 * @throws {OutOfDomainError} for stamps outside the leap-second table (see `validateScenario`).
 */
export function simulatePlan(
  scenario: unknown,
  plan: Pick<SteeringPlan, 'commands'>,
  options: SimulationOptions,
): SimulationSummary {
  requireObject('options', options, 'an object with runs');
  const runs = requireInteger('options.runs', options.runs, 1, 1_000_000);
  const { onProgress, runs: _runs, ...rest } = options;
  void _runs;
  const part = simulatePlanRuns(scenario, plan, {
    ...rest,
    firstRun: 0,
    runCount: runs,
    ...(onProgress ? { onProgress } : {}),
  });
  return combineMonteCarloParts([part]);
}

/**
 * Flies runs firstRun … firstRun + runCount − 1 of `simulatePlan` and returns their per-run results.
 * Run r draws from the xoshiro128** stream selected by (seed, r) (`streamState` in
 * internal/random.ts: every state word passes through MurmurHash3's fmix32; distinct runs of a seed
 * get distinct states), with ziggurat normals; so a range gives the same numbers whichever other
 * ranges are flown, where, or in which order. Combine the parts with `combineMonteCarloParts`.
 *
 * @param scenario  The scenario the plan was made for.
 * @param plan      The plan (its `commands` are used).
 * @param options   `seed`, `firstRun`, `runCount`, `onProgress`, `timeScales`.
 * @throws {InvalidArgumentError} for invalid scenario, command, range, seed or timeScales.
 * @throws {OutOfDomainError} for stamps outside the leap-second table.
 */
export function simulatePlanRuns(
  scenario: unknown,
  plan: Pick<SteeringPlan, 'commands'>,
  options: SimulationRangeOptions,
): MonteCarloPart {
  requireObject('options', options, 'an object with firstRun and runCount');
  const norm = validateScenario(scenario, { timeScales: resolveTimeScales(options) });
  const firstRun = requireInteger('options.firstRun', options.firstRun, 0, 999_999);
  const runCount = requireInteger('options.runCount', options.runCount, 1, 1_000_000 - firstRun);
  const seed = options.seed === undefined ? 1 : requireInteger('options.seed', options.seed, 0, MAX_SEED);
  requireObject('plan', plan as object, 'a plan object { commands }');
  const commands = commandsToInternal(norm, plan.commands, 'plan.commands');
  const steps = stepTable(norm, commands);
  const part: MonteCarloPart = {
    seed,
    firstRun,
    runCount,
    commandCount: commands.length,
    insideByEpoch: new Float64Array(steps.gridCount),
    alwaysInsideByRun: new Uint8Array(runCount),
    worstByRunSeconds: new Float64Array(runCount),
  };
  flyRuns(norm, steps, part, options.onProgress);
  return part;
}

/** The event timeline as typed arrays: step length, grid flag, jumps, and the Cholesky factor of Q(step). */
interface StepTable {
  count: number;
  gridCount: number;
  delta: Float64Array;
  onGrid: Uint8Array;
  jumpDx: Float64Array;
  jumpDy: Float64Array;
  /** Lower-triangular factor entries l00, l10, l11, l20, l21, l22 of each step, 6 per step. */
  chol: Float64Array;
}

function stepTable(norm: NormalizedScenario, commands: ReturnType<typeof commandsToInternal>): StepTable {
  const jumps = stateJumps(norm, commands);
  const grid = gridTimes(norm);
  const gridSet = new Set(grid);
  const timeline = [...new Set([...grid, ...jumps.map((j) => j.t).filter((t) => t >= 0 && t <= norm.horizon)])].sort(
    (a, b) => a - b,
  );
  const count = timeline.length;
  const table: StepTable = {
    count,
    gridCount: grid.length,
    delta: new Float64Array(count),
    onGrid: new Uint8Array(count),
    jumpDx: new Float64Array(count),
    jumpDy: new Float64Array(count),
    chol: new Float64Array(6 * count),
  };
  const cholCache = new Map<number, Matrix3>();
  for (const j of jumps) {
    // Jumps outside [0, horizon] have no step (as before: only timeline epochs are flown).
    const i = binarySearch(timeline, j.t);
    if (i < 0) continue;
    table.jumpDx[i] = at(table.jumpDx, i, 'jumpDx') + j.dx;
    table.jumpDy[i] = at(table.jumpDy, i, 'jumpDy') + j.dy;
  }
  let previous: number | undefined;
  for (const [i, t] of timeline.entries()) {
    const delta = previous === undefined ? 0 : t - previous;
    previous = t;
    table.delta[i] = delta;
    table.onGrid[i] = gridSet.has(t) ? 1 : 0;
    if (delta > 0) {
      let l = cholCache.get(delta);
      if (!l) {
        l = choleskyPsd3(processNoise(delta, norm.noise));
        cholCache.set(delta, l);
      }
      table.chol.set([l[0][0], l[1][0], l[1][1], l[2][0], l[2][1], l[2][2]], 6 * i);
    }
  }
  return table;
}

/** Index of `t` in the ascending array `a`, or −1. */
function binarySearch(a: readonly number[], t: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const v = at(a, mid, 'timeline');
    if (v === t) return mid;
    if (v < t) lo = mid + 1;
    else hi = mid - 1;
  }
  return -1;
}

/**
 * The hot loop: flies the part's runs through the step table, one reused generator, no allocation per run or step.
 * Indices bounded by count = st.count (every array of the table has count or 6·count entries) and the grid count.
 */
function flyRuns(
  norm: NormalizedScenario,
  st: StepTable,
  part: MonteCarloPart,
  onProgress?: (done: number, total: number) => void,
): void {
  const l0 = choleskyPsd3(norm.covariance0);
  const l00 = l0[0][0],
    l10 = l0[1][0],
    l11 = l0[1][1],
    l20 = l0[2][0],
    l21 = l0[2][1],
    l22 = l0[2][2];
  const [m0, m1, m2] = norm.state0;
  const rng = createReseedableRandom('ziggurat');
  const { delta, onGrid, jumpDx, jumpDy, chol, count } = st;
  const inside = part.insideByEpoch;
  const b = norm.bound;
  for (let k = 0; k < part.runCount; k++) {
    rng.setStream(part.seed, part.firstRun + k);
    const n0 = rng.normal();
    const n1 = rng.normal();
    const n2 = rng.normal();
    let x = m0 + l00 * n0;
    let y = m1 + l10 * n0 + l11 * n1;
    let d = m2 + l20 * n0 + l21 * n1 + l22 * n2;
    let runWorst = 0;
    let ok = 1;
    let g = 0;
    for (let i = 0; i < count; i++) {
      const tau = delta[i]!;
      if (tau > 0) {
        const c = 6 * i;
        const w0 = rng.normal();
        const w1 = rng.normal();
        const w2 = rng.normal();
        x = x + y * tau + (d * tau * tau) / 2 + chol[c]! * w0;
        y = y + d * tau + chol[c + 1]! * w0 + chol[c + 2]! * w1;
        d = d + chol[c + 3]! * w0 + chol[c + 4]! * w1 + chol[c + 5]! * w2;
      }
      x += jumpDx[i]!;
      y += jumpDy[i]!;
      if (onGrid[i] === 1) {
        const ax = Math.abs(x);
        if (ax <= b) inside[g] = inside[g]! + 1;
        else ok = 0;
        if (ax > runWorst) runWorst = ax;
        g++;
      }
    }
    part.alwaysInsideByRun[k] = ok;
    part.worstByRunSeconds[k] = runWorst;
    onProgress?.(k + 1, part.runCount);
  }
}

/**
 * Combines the parts of one simulation (same seed and plan, contiguous ranges from run 0, in any
 * order) into the summary `simulatePlan` returns for all their runs; the result is identical to a
 * single pass (counts are integers, the worst excursions are concatenated in run order).
 * @param parts  Results of `simulatePlanRuns`.
 * @throws {InvalidArgumentError} for no parts, mixed seeds, command counts or grids, or ranges that
 *   do not tile 0 … runs − 1.
 */
export function combineMonteCarloParts(parts: readonly MonteCarloPart[]): SimulationSummary {
  if (!Array.isArray(parts) || parts.length === 0)
    throw new InvalidArgumentError('parts', parts, 'a non-empty array of simulatePlanRuns results');
  parts.forEach((p, i) => {
    requireMonteCarloPart(`parts[${i}]`, p);
  });
  const sorted = [...parts].sort((a, c) => a.firstRun - c.firstRun);
  const first = at(sorted, 0, 'parts');
  const gridCount = first.insideByEpoch.length;
  let runs = 0;
  for (const [i, p] of sorted.entries()) {
    if (p.seed !== first.seed || p.commandCount !== first.commandCount || p.insideByEpoch.length !== gridCount) {
      throw new InvalidArgumentError(
        `parts[${i}]`,
        `seed ${p.seed}, ${p.commandCount} commands, ${p.insideByEpoch.length} epochs`,
        `the seed, command count and grid of the first part (seed ${first.seed}, ${first.commandCount} commands, ${gridCount} epochs)`,
      );
    }
    if (p.firstRun !== runs)
      throw new InvalidArgumentError(
        `parts[${i}].firstRun`,
        p.firstRun,
        `${runs} (the ranges must tile the runs from 0 without gap or overlap)`,
      );
    runs += p.runCount;
  }
  const inside = new Float64Array(gridCount);
  const worstByRun = new Float64Array(runs);
  let alwaysInside = 0;
  let worst = 0;
  for (const p of sorted) {
    // Every part's insideByEpoch has gridCount entries (checked above).
    for (const [g, count] of p.insideByEpoch.entries()) inside[g] = at(inside, g, 'inside') + count;
    worstByRun.set(p.worstByRunSeconds, p.firstRun);
    for (const flag of p.alwaysInsideByRun) alwaysInside += flag;
  }
  let insideTotal = 0;
  let minEpoch = 1;
  for (const count of inside) {
    insideTotal += count;
    minEpoch = Math.min(minEpoch, count / runs);
  }
  for (const w of worstByRun) if (w > worst) worst = w;
  worstByRun.sort();
  return {
    runs,
    seed: first.seed,
    commandCount: first.commandCount,
    timeInTolerance: insideTotal / (runs * gridCount),
    wholeHorizonProbability: alwaysInside / runs,
    minEpochProbability: minEpoch,
    worstExcursionSeconds: worst,
    worstExcursionP95Seconds: at(worstByRun, Math.min(runs - 1, Math.ceil(0.95 * runs) - 1), 'worstByRun'),
  };
}

/** Throws unless `value` has the shape `simulatePlanRuns` returns, with counts that fit its run range. */
function requireMonteCarloPart(argument: string, value: unknown): void {
  const expected =
    'a simulatePlanRuns result { seed, firstRun, runCount, commandCount, insideByEpoch, alwaysInsideByRun, worstByRunSeconds }';
  const p = value as Partial<MonteCarloPart> | null;
  if (typeof p !== 'object' || p === null || Array.isArray(p))
    throw new InvalidArgumentError(argument, value, expected);
  requireInteger(`${argument}.seed`, p.seed, 0, MAX_SEED);
  const firstRun = requireInteger(`${argument}.firstRun`, p.firstRun, 0, 1_000_000);
  const runCount = requireInteger(`${argument}.runCount`, p.runCount, 1, 1_000_000 - firstRun);
  requireInteger(`${argument}.commandCount`, p.commandCount, 0, Number.MAX_SAFE_INTEGER);
  const inside = p.insideByEpoch;
  if (
    !(inside instanceof Float64Array) ||
    inside.length === 0 ||
    inside.some((v) => !Number.isInteger(v) || v < 0 || v > runCount)
  ) {
    throw new InvalidArgumentError(
      `${argument}.insideByEpoch`,
      inside,
      `a Float64Array of per-epoch counts, integers from 0 to runCount = ${runCount}`,
    );
  }
  const always = p.alwaysInsideByRun;
  if (!(always instanceof Uint8Array) || always.length !== runCount || always.some((v) => v > 1)) {
    throw new InvalidArgumentError(
      `${argument}.alwaysInsideByRun`,
      always,
      `a Uint8Array of ${runCount} flags (0 or 1)`,
    );
  }
  const worst = p.worstByRunSeconds;
  if (!(worst instanceof Float64Array) || worst.length !== runCount || worst.some((v) => !(v >= 0 && v < Infinity))) {
    throw new InvalidArgumentError(
      `${argument}.worstByRunSeconds`,
      worst,
      `a Float64Array of ${runCount} finite offsets ≥ 0 s`,
    );
  }
}
