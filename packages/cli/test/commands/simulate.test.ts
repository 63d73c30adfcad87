import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { type CliRun, runCli } from '../run.js';

const ORIN = fileURLToPath(new URL('../../../sdk/examples/steering/orin-3-meo.json', import.meta.url));
/** Test leap-second table in the leap-seconds.list format, invented expiry 2036-06-28 (test/fixtures/time/SOURCE.md). */
const LEAP_LIST = fileURLToPath(new URL('../../../../test/fixtures/time/leap-seconds-test.list', import.meta.url));

/** The ORIN-3 example moved to April 2031, after the bundled leap-second table's validity. */
function orinIn2031(): string {
  const path = join(mkdtempSync(join(tmpdir(), 'tauline-simulate-')), 'orin-2031.json');
  writeFileSync(path, readFileSync(ORIN, 'utf8').replace(/2027-02-/g, '2031-04-'));
  return path;
}

const run = (isTty: boolean, ...argv: string[]): Promise<CliRun> => runCli(['simulate', ...argv], isTty);

describe('tauline simulate', () => {
  it('tauline simulate <orin-3-meo> --runs 40 --json reports each strategy, deterministically for a seed', async () => {
    const a = await run(false, ORIN, '--runs', '40', '--seed', '3', '--json');
    const b = await run(false, ORIN, '--runs', '40', '--seed', '3', '--json');
    expect(a.status).toBe(0);
    expect(a.err).toBe('');
    expect(a.out).toBe(b.out);
    const r = JSON.parse(a.out) as {
      results: { strategy: string; timeInTolerance: number; commandCount: number; worstExcursionSeconds: number }[];
    };
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
    expect(r.out).toMatch(/^ +time in/m); // the header wraps to fit 100 columns
    expect(r.out).toMatch(/ ns /);
    expect((await run(false, ORIN, '--runs', '400', '--strategy', 'optimal', '--wide')).out).toMatch(
      /time in tolerance/,
    );
  });

  it('tauline simulate shows a progress bar on a terminal when the run is long', async () => {
    const r = await run(true, ORIN, '--runs', '400', '--strategy', 'optimal');
    expect(r.status).toBe(0);
    expect(r.err).toMatch(/simulating optimal \[#+/);
    expect(r.err).toMatch(/100 %/);
  });

  it('tauline simulate <2031 scenario> needs --leap-seconds with a table covering 2031 (bundled table valid until 2027-06-28)', async () => {
    const path = orinIn2031();
    const without = await run(false, path, '--runs', '5', '--strategy', 'optimal');
    expect(without.status).toBe(2);
    expect(without.err).toMatch(/out-of-domain: epoch = .*--leap-seconds <file>/);
    const withList = await run(
      false,
      path,
      '--runs',
      '5',
      '--strategy',
      'optimal',
      '--leap-seconds',
      LEAP_LIST,
      '--json',
    );
    expect(withList.err).toBe('');
    expect(withList.status).toBe(0);
    const same = await run(false, ORIN, '--runs', '5', '--strategy', 'optimal', '--json');
    // Same elapsed times four years later (no leap second in either week): the same simulated numbers.
    expect((JSON.parse(withList.out) as { results: unknown[] }).results).toEqual(
      (JSON.parse(same.out) as { results: unknown[] }).results,
    );
  });

  it('tauline simulate --leap-seconds reports a malformed list with file and line', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'tauline-simulate-')), 'no-expiry.list');
    writeFileSync(path, readFileSync(LEAP_LIST, 'utf8').replace(/^#@.*$/m, '#'));
    const r = await run(false, ORIN, '--runs', '5', '--leap-seconds', path);
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/parse-error: .*no-expiry\.list:\d+: expected an expiry line/);
  });

  it('tauline simulate rejects a missing or non-integer --runs and an unknown strategy', async () => {
    expect((await run(false, ORIN)).err).toMatch(/--runs is required/);
    expect((await run(false, ORIN, '--runs', '2.5')).err).toMatch(/--runs must be an integer/);
    expect((await run(false, ORIN, '--runs', '5', '--strategy', 'x')).status).toBe(2);
    expect((await run(false)).status).toBe(2);
  });
});
