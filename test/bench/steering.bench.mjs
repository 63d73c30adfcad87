// Steering planner speed on the bundled ORIN-3 example (7-day horizon, 15-minute grid), per
// strategy, against the unsteered prediction as a baseline measured in the same run; the open-loop
// Monte Carlo at 1000 runs; one re-plan (7-day horizon); and the closed-loop Monte Carlo of 1000
// runs × 30 days with a re-plan at each of two daily contacts. Imports the built SDK
// (packages/sdk/dist). Prints times and the targets; asserts nothing.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { availableParallelism, cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  createReplanner,
  planSteering,
  replanSteering,
  simulateClosedLoop,
  simulatePlan,
} from '../../packages/sdk/dist/steering/index.js';
import { growthExponent } from './baselines/native.mjs';

const scenario = JSON.parse(
  readFileSync(new URL('../../packages/sdk/examples/steering/orin-3-meo.json', import.meta.url), 'utf8'),
);

function time(label, fn, repeat) {
  // Warm-up runs so the JIT has compiled the path (the first calls are several times slower).
  for (let i = 0; i < Math.min(repeat, 10); i++) fn();
  const t0 = performance.now();
  for (let i = 0; i < repeat; i++) fn();
  const ms = (performance.now() - t0) / repeat;
  return { label, ms };
}

/** ORIN-3 stretched to 30 days: the same two contacts a day, no manoeuvre. */
function month() {
  return stretched(30);
}

/** ORIN-3 stretched to `days` days: the same two contacts a day, no manoeuvre. */
function stretched(days) {
  const s = structuredClone(scenario);
  const epochMs = Date.parse(s.epoch);
  const iso = (t) => new Date(epochMs + t * 1000).toISOString().replace('.000Z', 'Z');
  s.horizonSeconds = days * 86_400;
  s.contacts = [];
  for (let d = 0; d < days; d++) {
    s.contacts.push({ start: iso(d * 86_400 + 18_600), end: iso(d * 86_400 + 21_300) });
    s.contacts.push({ start: iso(d * 86_400 + 63_600), end: iso(d * 86_400 + 66_000) });
  }
  delete s.maneuvers;
  return s;
}

export default function run() {
  const base = time('none (prediction only)', () => planSteering(scenario, { strategy: 'none' }), 20);
  const rows = [
    base,
    time('deadband', () => planSteering(scenario, { strategy: 'deadband' }), 10),
    time('optimal (constrained LQ)', () => planSteering(scenario, { strategy: 'optimal' }), 10),
  ];
  const plan = planSteering(scenario);
  rows.push(time('simulatePlan, 1000 runs', () => simulatePlan(scenario, plan, { runs: 1000, seed: 1 }), 2));
  // One re-plan at the first contact (05:10 on day 1) from 20 estimates, to the end of the 7-day horizon.
  const now = 18_600;
  const estimates = Array.from({ length: 16 }, (_, k) => ({
    tSeconds: 900 * (k + 1),
    phaseSeconds: 3e-9,
    sigmaSeconds: 3e-10,
  }));
  // One re-plan = a prepared scenario's replan (filter, forward pass, revised plan with its prediction and
  // verdict); replanSteering also prepares the scenario (validation, phase-weight choice, Riccati pass).
  const replanner = createReplanner(scenario);
  rows.push(time('one re-plan, 7 days (target ≤ 5 ms)', () => replanner.replan(plan, estimates, now), 50));
  rows.push(time('replanSteering (prepare + re-plan)', () => replanSteering(scenario, plan, estimates, now), 10));
  for (const r of rows) {
    process.stdout.write(
      `${r.label.padEnd(44)} ${r.ms.toFixed(1).padStart(9)} ms   ×${(r.ms / base.ms).toFixed(1)} of prediction only\n`,
    );
  }
  // Closed loop: 1000 runs × 30 days, optimal planner, re-plan at 60 contacts per run; baseline: the
  // open-loop Monte Carlo of the same 30-day scenario and the same number of runs, in this run.
  const s = month();
  const monthPlan = planSteering(s);
  const open = time(
    'open-loop simulatePlan, 1000 runs × 30 days',
    () => simulatePlan(s, monthPlan, { runs: 1000, seed: 1 }),
    1,
  );
  const t0 = performance.now();
  simulateClosedLoop(s, { runs: 1000, seed: 1, strategies: ['optimal'] });
  const closed = {
    label: 'simulateClosedLoop optimal, 1000 runs × 30 days (target ≤ 60 s)',
    ms: performance.now() - t0,
  };
  for (const r of [open, closed]) {
    process.stdout.write(
      `${r.label.padEnd(66)} ${(r.ms / 1000).toFixed(2).padStart(8)} s   ×${(r.ms / open.ms).toFixed(1)} of the open-loop Monte Carlo\n`,
    );
  }
  growth();
  cliPool(s);
}

/**
 * Growth exponents (least-squares slope of log time against log size; 1 = linear): the planners over 7, 14
 * and 28 days, the open-loop Monte Carlo over 250, 500 and 1000 runs, the closed loop over 25, 50 and 100 runs
 * of 30 days.
 */
function growth() {
  process.stdout.write('\nGrowth exponents over three sizes (1 = linear)\n');
  const report = (label, sizes, unit, times) =>
    process.stdout.write(
      `  ${label.padEnd(40)} ${times.map((t, k) => `${sizes[k]} ${unit}: ${t.toFixed(1)} ms`).join(', ')}` +
        `  → exponent ${growthExponent(sizes, times).toFixed(2)}\n`,
    );
  const days = [7, 14, 28];
  for (const strategy of ['deadband', 'optimal']) {
    const times = days.map((d) => {
      const sc = stretched(d);
      return time('', () => planSteering(sc, { strategy }), 8).ms;
    });
    report(`planSteering ${strategy}`, days, 'd', times);
  }
  const s = month();
  const p = planSteering(s);
  const runs = [250, 500, 1000];
  report(
    'simulatePlan, 30 days',
    runs,
    'runs',
    runs.map((r) => time('', () => simulatePlan(s, p, { runs: r, seed: 1 }), 1).ms),
  );
  const loops = [25, 50, 100];
  report(
    'simulateClosedLoop optimal, 30 days',
    loops,
    'runs',
    loops.map((r) => time('', () => simulateClosedLoop(s, { runs: r, seed: 1, strategies: ['optimal'] }), 1).ms),
  );
}

/**
 * `tauline simulate --runs 10000`, 30 days on a 300 s grid (8641 epochs), all three strategies, through
 * the built binary: --workers 1 (in-process, the baseline) against one worker per core and the automatic
 * choice (one per free core), wall time of the whole command; the outputs must be identical.
 */
function cliPool(monthScenario) {
  const s = structuredClone(monthScenario);
  s.gridSeconds = 300;
  const path = join(mkdtempSync(join(tmpdir(), 'tauline-bench-')), 'month-300s.json');
  writeFileSync(path, JSON.stringify(s));
  const bin = fileURLToPath(new URL('../../packages/cli/bin/tauline.js', import.meta.url));
  const wall = (extra) => {
    const t0 = performance.now();
    const out = execFileSync(
      process.execPath,
      [bin, 'simulate', path, '--runs', '10000', '--seed', '1', '--json', ...extra],
      { encoding: 'utf8' },
    );
    return { ms: performance.now() - t0, out };
  };
  const one = wall(['--workers', '1']);
  const pool = wall(['--workers', String(availableParallelism())]);
  const auto = wall([]);
  const same = pool.out === one.out && auto.out === one.out ? 'identical' : 'DIFFERENT';
  process.stdout.write(
    `cores: availableParallelism ${availableParallelism()}, cpus ${cpus().length}; 1-minute load average ${loadavg()[0].toFixed(2)}\n`,
  );
  process.stdout.write(
    `${'tauline simulate --runs 10000, 30 d at 300 s, all strategies, --workers 1'.padEnd(78)} ${(one.ms / 1000).toFixed(2).padStart(7)} s\n`,
  );
  process.stdout.write(
    `${`  the same, --workers ${availableParallelism()} (target < 10 s)`.padEnd(78)} ${(pool.ms / 1000).toFixed(2).padStart(7)} s   ×${(one.ms / pool.ms).toFixed(2)} faster\n`,
  );
  process.stdout.write(
    `${'  the same, automatic (one worker per free core)'.padEnd(78)} ${(auto.ms / 1000).toFixed(2).padStart(7)} s   ×${(one.ms / auto.ms).toFixed(2)} faster; outputs ${same}\n`,
  );
}
