import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { type CliRun, runCli } from '../run.js';

const ORIN = fileURLToPath(new URL('../../../sdk/examples/steering/orin-3-meo.json', import.meta.url));
const HALCYR = fileURLToPath(new URL('../../../sdk/examples/steering/halcyr-g1-geo.json', import.meta.url));

const run = (isTty: boolean, ...argv: string[]): Promise<CliRun> => runCli(['simulate', ...argv], isTty);

/** ORIN-3 cut to two days, so the closed loop runs quickly. */
function shortOrin(): string {
  const s = JSON.parse(readFileSync(ORIN, 'utf8')) as {
    horizonSeconds: number;
    contacts: { start: string }[];
    maneuvers?: unknown;
  };
  s.horizonSeconds = 2 * 86_400;
  s.contacts = s.contacts.filter((c) => c.start < '2027-02-10');
  delete s.maneuvers;
  const path = join(mkdtempSync(join(tmpdir(), 'tauline-closed-loop-')), 'orin-2d.json');
  writeFileSync(path, JSON.stringify(s));
  return path;
}

describe('tauline simulate --closed-loop', () => {
  const path = shortOrin();

  it('tauline simulate <scenario> --closed-loop --runs 3 --seed 5 --json prints exactly { closedLoop, runs, seed, strategies } for optimal, deadband and none, byte-identical for a seed', async () => {
    const a = await run(false, path, '--closed-loop', '--runs', '3', '--seed', '5', '--json');
    const b = await run(false, path, '--closed-loop', '--runs', '3', '--seed', '5', '--json');
    expect(a.status).toBe(0);
    expect(a.err).toBe('');
    expect(a.out).toBe(b.out);
    const r = JSON.parse(a.out) as Record<string, unknown> & { strategies: Record<string, Record<string, number>>[] };
    expect(Object.keys(r)).toEqual(['closedLoop', 'runs', 'seed', 'strategies']);
    expect(r.closedLoop).toBe(true);
    expect(r.runs).toBe(3);
    expect(r.seed).toBe(5);
    expect(r.strategies.map((x) => x.method)).toEqual(['optimal', 'deadband', 'none']);
    for (const x of r.strategies) {
      expect(Object.keys(x)).toEqual([
        'method',
        'timeInTolerance',
        'maxAbsOffsetSeconds',
        'commandsPerDay',
        'totalFrequencySteering',
      ]);
      expect(Object.keys(x.timeInTolerance!)).toEqual(['mean', 'p05', 'min']);
      expect(Object.keys(x.maxAbsOffsetSeconds!)).toEqual(['p50', 'p95', 'max']);
      expect(Object.keys(x.commandsPerDay!)).toEqual(['mean']);
      expect(Object.keys(x.totalFrequencySteering!)).toEqual(['mean']);
    }
    const c = await run(false, path, '--closed-loop', '--runs', '3', '--seed', '6', '--json');
    expect(c.out).not.toBe(a.out);
  });

  it('tauline simulate --closed-loop --strategy optimal prints a table and no progress bar on a pipe, a progress bar on a terminal', async () => {
    const pipe = await run(false, path, '--closed-loop', '--runs', '2', '--strategy', 'optimal');
    expect(pipe.status).toBe(0);
    expect(pipe.err).toBe('');
    expect(pipe.out).toMatch(/closed loop, 2 simulated clocks, seed 1/);
    expect(pipe.out).toMatch(/^optimal /m);
    expect(pipe.out).not.toMatch(/^deadband /m);
    expect(pipe.out).toMatch(/Caution:/);
    const tty = await run(true, path, '--closed-loop', '--runs', '2', '--strategy', 'optimal');
    expect(tty.err).toMatch(/closed loop \[#+/);
    expect(tty.out).toBe(pipe.out);
  });

  it('tauline simulate --closed-loop on a scenario without an operations block exits 2 with one line naming operations', async () => {
    const r = await run(false, HALCYR, '--closed-loop', '--runs', '2');
    expect(r.status).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/operations/);
  });

  it('tauline simulate --closed-loop rejects --runs 0 and --runs 100001 naming --runs', async () => {
    for (const n of ['0', '100001']) {
      const r = await run(false, path, '--closed-loop', '--runs', n);
      expect(r.status).toBe(2);
      expect(r.err).toMatch(/--runs/);
    }
  });

  it('tauline simulate without --closed-loop keeps its output (results per strategy, no closedLoop key)', async () => {
    const r = await run(false, path, '--runs', '5', '--json');
    expect(r.status).toBe(0);
    expect(Object.keys(JSON.parse(r.out) as object)).toEqual(['scenario', 'results', 'units', 'caution']);
  });
});
