import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { main } from '../src/main.js';
import type { Io } from '../src/framework.js';

const ORIN = fileURLToPath(new URL('../../sdk/examples/steering/orin-3-meo.json', import.meta.url));

async function run(isTty: boolean, ...argv: string[]): Promise<{ status: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const io: Io = { out: (t) => { out += t; }, err: (t) => { err += t; }, isTty };
  const status = await main(['simulate', ...argv], io);
  return { status, out, err };
}

describe('tauline simulate', () => {
  it('tauline simulate <orin-3-meo> --runs 40 --json reports each strategy, deterministically for a seed', async () => {
    const a = await run(false, ORIN, '--runs', '40', '--seed', '3', '--json');
    const b = await run(false, ORIN, '--runs', '40', '--seed', '3', '--json');
    expect(a.status).toBe(0);
    expect(a.err).toBe('');
    expect(a.out).toBe(b.out);
    const r = JSON.parse(a.out) as { results: { strategy: string; timeInTolerance: number; commandCount: number; worstExcursionSeconds: number }[] };
    expect(r.results.map((x) => x.strategy)).toEqual(['none', 'deadband', 'optimal']);
    const none = r.results[0]!;
    const optimal = r.results[2]!;
    expect(none.commandCount).toBe(0);
    expect(optimal.timeInTolerance).toBeGreaterThan(none.timeInTolerance);
  });

  it('tauline simulate prints a table with units and no progress bar when stderr is not a terminal', async () => {
    const r = await run(false, ORIN, '--runs', '400', '--strategy', 'optimal');
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    expect(r.out).toMatch(/time in tolerance/);
    expect(r.out).toMatch(/ ns /);
  });

  it('tauline simulate shows a progress bar on a terminal when the run is long', async () => {
    const r = await run(true, ORIN, '--runs', '400', '--strategy', 'optimal');
    expect(r.status).toBe(0);
    expect(r.err).toMatch(/simulating optimal \[#+/);
    expect(r.err).toMatch(/100 %/);
  });

  it('tauline simulate rejects a missing or non-integer --runs and an unknown strategy', async () => {
    expect((await run(false, ORIN)).err).toMatch(/--runs is required/);
    expect((await run(false, ORIN, '--runs', '2.5')).err).toMatch(/--runs must be an integer/);
    expect((await run(false, ORIN, '--runs', '5', '--strategy', 'x')).status).toBe(2);
    expect((await run(false)).status).toBe(2);
  });
});
