// Steering planner speed on the bundled ORIN-3 example (7-day horizon, 15-minute grid), per
// strategy, against the unsteered prediction as a baseline measured in the same run; and the
// Monte Carlo at 1000 runs. Imports the built SDK (packages/sdk/dist). Prints times; asserts nothing.
import { readFileSync } from 'node:fs';
import { planSteering, simulatePlan } from '../../packages/sdk/dist/steering/index.js';

const scenario = JSON.parse(readFileSync(new URL('../../packages/sdk/examples/steering/orin-3-meo.json', import.meta.url), 'utf8'));

function time(label, fn, repeat) {
  fn();
  const t0 = performance.now();
  for (let i = 0; i < repeat; i++) fn();
  const ms = (performance.now() - t0) / repeat;
  return { label, ms };
}

export default function run() {
  const base = time('none (prediction only)', () => planSteering(scenario, { strategy: 'none' }), 20);
  const rows = [base,
    time('deadband', () => planSteering(scenario, { strategy: 'deadband' }), 10),
    time('optimal (quantised LQ)', () => planSteering(scenario, { strategy: 'optimal' }), 10)];
  const plan = planSteering(scenario);
  rows.push(time('simulatePlan, 1000 runs', () => simulatePlan(scenario, plan, { runs: 1000, seed: 1 }), 2));
  for (const r of rows) {
    process.stdout.write(`${r.label.padEnd(28)} ${r.ms.toFixed(1).padStart(8)} ms   ×${(r.ms / base.ms).toFixed(1)} of prediction only\n`);
  }
}
