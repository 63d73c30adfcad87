import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { workerCount, workerScript } from '../src/simulate-pool.js';
import { type CliRun, runCli } from './run.js';

const ORIN = fileURLToPath(new URL('../../sdk/examples/steering/orin-3-meo.json', import.meta.url));
/** Test leap-second table in the leap-seconds.list format, invented expiry 2036-06-28 (test/fixtures/time/SOURCE.md). */
const LEAP_LIST = fileURLToPath(new URL('../../../test/fixtures/time/leap-seconds-test.list', import.meta.url));
/** The built command (npm run build): the worker thread runs dist/simulate-worker.js. */
const BIN = fileURLToPath(new URL('../bin/tauline.js', import.meta.url));

const run = (isTty: boolean, ...argv: string[]): Promise<CliRun> => runCli(['simulate', ...argv], isTty);

describe('tauline simulate --workers (worker pool)', () => {
  it('workerScript() finds the built worker (run npm run build first), and workerCount never gives more workers than runs', () => {
    expect(workerScript()?.pathname).toMatch(/cli\/dist\/simulate-worker\.js$/);
    expect(workerCount(3, 2, 1000)).toBe(2);
    expect(workerCount(undefined, 10, 10)).toBe(1); // small work stays in-process
  });

  it('tauline simulate --workers 1, 2 and 3 print byte-identical JSON for a seed (in-process runner)', async () => {
    const outs = [];
    for (const n of ['1', '2', '3']) {
      const r = await run(false, ORIN, '--runs', '101', '--seed', '5', '--json', '--workers', n);
      expect(r.err).toBe('');
      expect(r.status).toBe(0);
      outs.push(r.out);
    }
    expect(outs[1]).toBe(outs[0]);
    expect(outs[2]).toBe(outs[0]);
  });

  it('the built binary tauline simulate --workers 1, 2, 3 and the default print byte-identical JSON and tables', () => {
    const bin = (...argv: string[]): string => {
      const r = spawnSync(process.execPath, [BIN, 'simulate', ORIN, '--runs', '64', '--seed', '7', ...argv], {
        encoding: 'utf8',
      });
      expect(r.stderr).toBe('');
      expect(r.status).toBe(0);
      return r.stdout;
    };
    const json = bin('--json', '--workers', '1');
    expect(bin('--json', '--workers', '2')).toBe(json);
    expect(bin('--json', '--workers', '3')).toBe(json);
    expect(bin('--json')).toBe(json);
    expect(bin('--workers', '3')).toBe(bin('--workers', '1'));
  });

  it('tauline simulate --workers 2 --leap-seconds gives the in-process numbers for a scenario after the bundled table', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'tauline-pool-')), 'orin-2031.json');
    writeFileSync(path, readFileSync(ORIN, 'utf8').replace(/2027-02-/g, '2031-04-'));
    const one = await run(
      false,
      path,
      '--runs',
      '20',
      '--strategy',
      'optimal',
      '--leap-seconds',
      LEAP_LIST,
      '--json',
      '--workers',
      '1',
    );
    const two = await run(
      false,
      path,
      '--runs',
      '20',
      '--strategy',
      'optimal',
      '--leap-seconds',
      LEAP_LIST,
      '--json',
      '--workers',
      '2',
    );
    expect(one.status).toBe(0);
    expect(two.out).toBe(one.out);
  });

  it('tauline simulate --workers 2 on a terminal draws one progress bar per strategy, summed over the workers, to 100 %', async () => {
    const r = await run(true, ORIN, '--runs', '400', '--strategy', 'optimal', '--workers', '2');
    expect(r.status).toBe(0);
    expect(r.err).toMatch(/simulating optimal \[#+/);
    expect(r.err).toMatch(/100 %/);
    expect(r.err).not.toMatch(/ 10[1-9] %| 1[1-9]\d %/);
  });

  it('tauline simulate refuses --workers 0, --workers 65 and --workers with --closed-loop (exit 2, one line)', async () => {
    for (const argv of [
      ['--runs', '5', '--workers', '0'],
      ['--runs', '5', '--workers', '65'],
      ['--closed-loop', '--runs', '2', '--workers', '2'],
    ]) {
      const r = await run(false, ORIN, ...argv);
      expect(r.status, argv.join(' ')).toBe(2);
      expect(r.err).toMatch(/--workers/);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    }
  });

  it('tauline simulate --help documents --workers', async () => {
    const r = await run(false, '--help');
    expect(r.out).toMatch(/--workers <n>/);
    expect(r.out).toMatch(/byte-identical/);
  });
});
