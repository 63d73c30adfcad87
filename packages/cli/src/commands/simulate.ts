/**
 * `tauline simulate <scenario.json> --runs N`: flies each strategy's plan against seeded
 * simulated clock noise and reports time in tolerance, worst excursion and command count.
 */

import { InvalidArgumentError } from '@tauline/sdk/errors';
import {
  type ClosedLoopSummary,
  combineMonteCarloParts,
  planSteering,
  type SimulationSummary,
  type SteeringCommandJson,
  type SteeringMethod,
  type SteeringScenario,
  simulateClosedLoop,
  simulatePlan,
  steeringCommandsFromJson,
  steeringPlanToJson,
} from '@tauline/sdk/steering';
import { createTimeScales, type LeapSecondTable } from '@tauline/sdk/time';
import {
  LEAP_SECONDS_FLAG,
  LEAP_SECONDS_HELP,
  leapSecondsFlag,
  leapSecondsTableFlag,
  readScenarioFile,
  strategyFlag,
} from '../flags.js';
import {
  type Command,
  EXIT_OK,
  formatFlag,
  formatFlags,
  type Io,
  integerFlag,
  onePositional,
  optionalFlag,
  type ParsedArgs,
  progressBar,
  seedFlag,
  seedFlagSpec,
  TABLE_OR_JSON,
  toJson,
} from '../framework.js';
import { fitTable, outputWidth, wrapLines } from '../layout.js';
import { AUTO_POOL_STEPS, MAX_WORKERS, SimulatePool, workerCount, workerScript } from '../simulate-pool.js';
import { nsText } from '../steering-output.js';

/** Simulated (run × grid-epoch) steps above which a progress bar is shown on a terminal. */
export const PROGRESS_THRESHOLD = 200_000;

/** The caution printed under the closed-loop table. */
export const CLOSED_LOOP_CAUTION =
  "Caution: a simulation of operations under the scenario's clock and estimate noise models, not a guarantee; verify any schedule against the mission's own interface specification and have it confirmed by its responsible engineering authority before uplink.";

/** The caution printed under the table and carried in the JSON. */
export const SIMULATION_CAUTION =
  "Caution: plans are open-loop from the epoch estimate; verify any schedule against the mission's own interface specification and have it confirmed by its responsible engineering authority before uplink.";

export const simulateCommand: Command = {
  name: 'simulate',
  summary: 'Monte Carlo of steering plans against simulated clock noise, per strategy.',
  usage:
    '<scenario.json> (--runs <n> | --closed-loop [--runs <n>]) [--seed <n>] [--strategy deadband|optimal|none|all] [--workers <n>] [--leap-seconds <file>] [--json | --format table|json]',
  allowPositionals: true,
  flags: {
    runs: {
      type: 'string',
      value: '<n>',
      description: 'Number of simulated clocks per strategy (1 … 1000000; with --closed-loop 1 … 100000, default 100).',
    },
    'closed-loop': {
      type: 'boolean',
      description:
        'Fly the scenario\'s operations block: estimates with noise and latency, re-plan at every contact (needs "operations" in the scenario).',
    },
    seed: seedFlagSpec('the random generator', '; same seed, same numbers'),
    strategy: { type: 'string', value: '<name>', description: 'deadband, optimal, none, or all (default all).' },
    workers: {
      type: 'string',
      value: '<n>',
      description: `Worker threads for the open-loop runs (1 … ${MAX_WORKERS}; 1 = in-process; default: one per free core (cores less the 1-minute load average) when runs × grid epochs ≥ ${AUTO_POOL_STEPS.toLocaleString('en-US')}, else 1). Same output for any number.`,
    },
    'leap-seconds': LEAP_SECONDS_FLAG,
    ...formatFlags(TABLE_OR_JSON, { json: 'Print the results as JSON (same as --format json).' }),
  },
  details: `
Each run draws the epoch state from the scenario's mean and covariance and adds the exact discrete
3-state process noise between events (Zucca & Tavella, IEEE Trans. UFFC 52(2), 2005); the plan's
commands and the manoeuvre rate changes are applied at their epochs. Offsets are checked on the grid.
time in tolerance: fraction of (run, epoch) pairs inside; whole horizon: fraction of runs never outside;
min epoch: the smallest per-epoch fraction (compare with the plan's probability).
Run r draws from its own random stream selected by (seed, r), so the runs can be split between worker
threads (--workers) and the output is byte-identical for any number of workers.
JSON: { scenario, results: [{ strategy, feasible, expectedCost, runs, seed, commandCount, timeInTolerance,
wholeHorizonProbability, minEpochProbability, worstExcursionSeconds (s), worstExcursionP95Seconds (s) }], units, caution }.

--closed-loop: every run flies one truth clock (the scenario's noise model) under each strategy; ground
estimates of the offset arrive every operations.estimateIntervalSeconds with 1σ estimateNoiseSeconds,
estimateLatencySeconds after their epoch; at the start of every contact a Kalman filter takes the
estimates received so far and the strategy re-plans from its estimate; the commands uplinked in that
contact are executed. Per run: time in tolerance (fraction of grid epochs with |offset| ≤ tolerance),
largest |offset|, commands per day, Σ|frequency steps|. JSON (exactly): { closedLoop: true, runs, seed,
strategies: [{ method, timeInTolerance: { mean, p05, min }, maxAbsOffsetSeconds (s): { p50, p95, max },
commandsPerDay: { mean }, totalFrequencySteering: { mean } }] }, methods optimal, deadband, none by
default; percentiles are nearest-rank over runs. Same seed, byte-identical output.
${LEAP_SECONDS_HELP}
Exit status: 0 success, 2 unusable input.`,
  async run(args, io) {
    const path = onePositional(args, 'scenario file');
    const format = formatFlag(args, TABLE_OR_JSON, 'table');
    if (args.values['closed-loop'] === true) return runClosedLoop(args, io, path, format);
    const runs = integerFlag(args, 'runs', 1, 1_000_000, 'simulated clocks per strategy', true);
    const seed = seedFlag(args) ?? 1;
    const choice = strategyFlag(optionalFlag(args, 'strategy'), true) ?? 'all';
    const requestedWorkers = integerFlag(args, 'workers', 1, MAX_WORKERS, 'worker threads; 1 = in-process');
    const leapSeconds = await leapSecondsTableFlag(args);
    const timeScales = leapSeconds ? createTimeScales(leapSeconds) : undefined;
    const scenario = await readScenarioFile(path);
    const methods: SteeringMethod[] = choice === 'all' ? ['none', 'deadband', 'optimal'] : [choice];
    const scales = timeScales ? { timeScales } : {};
    const plans = methods.map((method) => {
      const plan = planSteering(scenario, { strategy: method, ...scales });
      // The schedule flown is the printed one (its JSON stamps, to the millisecond), in-process and in the workers.
      return { method, plan, commands: steeringPlanToJson(plan, scales).commands };
    });
    const script = workerScript();
    // Every strategy's plan is on the scenario's one grid.
    const gridEpochs = Math.max(...plans.map(({ plan }) => plan.predicted.t.length));
    const workers = script ? workerCount(requestedWorkers, runs, gridEpochs) : 1;
    const pool = script && workers > 1 ? new SimulatePool(script, workers) : undefined;
    const results: OpenLoopRow[] = [];
    try {
      for (const { method, plan, commands } of plans) {
        const long = io.isTty && runs * plan.predicted.t.length > PROGRESS_THRESHOLD;
        const bar = long ? progressBar(io, `simulating ${method}`) : undefined;
        const summary = pool
          ? await simulateInPool(
              pool,
              { scenario, commands, seed, runs, ...(leapSeconds ? { leapSeconds } : {}) },
              bar?.update,
            )
          : simulatePlan(
              scenario,
              { commands: steeringCommandsFromJson(commands, scales) },
              {
                runs,
                seed,
                ...(bar ? { onProgress: bar.update } : {}),
                ...(timeScales ? { timeScales } : {}),
              },
            );
        bar?.finish();
        results.push({
          strategy: method,
          feasible: plan.feasible,
          expectedCost: plan.metrics.expectedCost,
          ...summary,
        });
      }
    } finally {
      await pool?.close();
    }
    return printOpenLoop(io, args, format, scenario as SteeringScenario, { runs, seed }, results);
  },
};

/** One strategy's open-loop result as printed. */
type OpenLoopRow = { strategy: SteeringMethod; feasible: boolean; expectedCost: number } & SimulationSummary;

/** Prints the open-loop results as JSON or as a table. */
function printOpenLoop(
  io: Io,
  args: ParsedArgs,
  format: 'table' | 'json',
  scenario: SteeringScenario,
  { runs, seed }: { runs: number; seed: number },
  results: readonly OpenLoopRow[],
): number {
  if (format === 'json') {
    io.out(
      toJson({
        scenario: scenario.name ?? null,
        results,
        units: {
          expectedCost: 'dimensionless',
          timeInTolerance: 'dimensionless (fraction)',
          wholeHorizonProbability: 'dimensionless (fraction)',
          minEpochProbability: 'dimensionless (fraction)',
          worstExcursionSeconds: 's',
          worstExcursionP95Seconds: 's',
        },
        caution: SIMULATION_CAUTION,
      }),
    );
    return EXIT_OK;
  }
  const width = outputWidth(args);
  io.out(
    wrapLines(
      `${scenario.name ?? 'Steering scenario'}: ${runs} simulated clocks per strategy, seed ${seed}; tolerance ±${nsText(scenario.tolerance.phaseSeconds)}\n\n`,
      width,
    ),
  );
  io.out(
    fitTable(
      [
        'strategy',
        'plan feasible',
        'commands',
        'time in tolerance',
        'whole horizon',
        'min epoch',
        'worst excursion',
        '95 % worst',
        'expected cost J',
      ],
      results.map((r) => [
        r.strategy,
        r.feasible ? 'yes' : 'no',
        r.commandCount,
        r.timeInTolerance.toFixed(4),
        r.wholeHorizonProbability.toFixed(4),
        r.minEpochProbability.toFixed(4),
        nsText(r.worstExcursionSeconds),
        nsText(r.worstExcursionP95Seconds),
        r.expectedCost.toFixed(5),
      ]),
      { width },
    ),
  );
  io.out(wrapLines(`\n${SIMULATION_CAUTION}\n`, width));
  return EXIT_OK;
}

/** One strategy's runs flown by the pool and combined: the same summary as `simulatePlan` in-process. */
async function simulateInPool(
  pool: SimulatePool,
  job: {
    scenario: unknown;
    commands: SteeringCommandJson[];
    seed: number;
    runs: number;
    leapSeconds?: LeapSecondTable;
  },
  onProgress?: (done: number, total: number) => void,
): Promise<SimulationSummary> {
  const parts = await pool.run(
    {
      scenario: job.scenario,
      commands: job.commands,
      seed: job.seed,
      runs: job.runs,
      ...(job.leapSeconds ? { leapSeconds: job.leapSeconds } : {}),
    },
    onProgress,
  );
  return combineMonteCarloParts(parts);
}

/** `--closed-loop`: the closed-loop Monte Carlo of every chosen strategy on the same clocks. */
async function runClosedLoop(args: ParsedArgs, io: Io, path: string, format: 'table' | 'json'): Promise<number> {
  if (args.values.workers !== undefined)
    throw new InvalidArgumentError(
      '--workers',
      args.values.workers,
      'no value: --workers applies to the open-loop runs; the closed loop runs in-process',
    );
  const runs = integerFlag(args, 'runs', 1, 100_000, 'simulated clocks') ?? 100;
  const seed = seedFlag(args) ?? 1;
  const choice = strategyFlag(optionalFlag(args, 'strategy'), true) ?? 'all';
  const timeScales = await leapSecondsFlag(args);
  const scenario = await readScenarioFile(path);
  const strategies: SteeringMethod[] = choice === 'all' ? ['optimal', 'deadband', 'none'] : [choice];
  const bar = io.isTty ? progressBar(io, 'closed loop') : undefined;
  const summary = simulateClosedLoop(scenario, {
    runs,
    seed,
    strategies,
    ...(bar ? { onProgress: bar.update } : {}),
    ...(timeScales ? { timeScales } : {}),
  });
  bar?.finish();
  if (format === 'json') {
    io.out(toJson(summary));
    return EXIT_OK;
  }
  io.out(closedLoopText(scenario as SteeringScenario, summary, outputWidth(args)));
  return EXIT_OK;
}

/** The human table of a closed-loop summary, fitted to `width` display columns (undefined: unlimited, `--wide`). */
export function closedLoopText(s: SteeringScenario, r: ClosedLoopSummary, width?: number): string {
  const ops = s.operations;
  if (ops === undefined)
    throw new InvalidArgumentError(
      'scenario.operations',
      undefined,
      'the operations block a closed-loop run simulates',
    );
  const head =
    `${s.name ?? 'Steering scenario'}: closed loop, ${r.runs} simulated clocks, seed ${r.seed}; tolerance ±${nsText(s.tolerance.phaseSeconds)}; ` +
    `estimates every ${ops.estimateIntervalSeconds} s, 1σ ${nsText(ops.estimateNoiseSeconds)}, latency ${ops.estimateLatencySeconds ?? 0} s; re-plan at each contact`;
  const rows = r.strategies.map((x) => [
    x.method,
    x.timeInTolerance.mean.toFixed(4),
    x.timeInTolerance.p05.toFixed(4),
    x.timeInTolerance.min.toFixed(4),
    nsText(x.maxAbsOffsetSeconds.p50),
    nsText(x.maxAbsOffsetSeconds.p95),
    nsText(x.maxAbsOffsetSeconds.max),
    x.commandsPerDay.mean.toFixed(2),
    x.totalFrequencySteering.mean.toExponential(3),
  ]);
  const body = fitTable(
    [
      'strategy',
      'time in tolerance mean',
      'p05',
      'min',
      'max |offset| p50',
      'p95',
      'max',
      'commands/day',
      'Σ|freq steps| mean',
    ],
    rows,
    { width },
  );
  return (
    wrapLines(`${head}\n\n`, width) +
    body +
    wrapLines(
      `\nTime in tolerance: per run, the fraction of grid epochs with |offset| ≤ tolerance. Percentiles are over runs (nearest rank).\n${CLOSED_LOOP_CAUTION}\n`,
      width,
    )
  );
}
