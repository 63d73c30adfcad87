import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli as run } from '../run.js';

const ROOT = fileURLToPath(new URL('../../../../', import.meta.url));
const FIX = join(ROOT, 'test/fixtures');

const tmp = mkdtempSync(join(tmpdir(), 'tauline-stability-'));
/** NBS14 frequency data (NIST SP 1065 §12) [V2]. */
const nbs14Frequency = join(tmp, 'nbs14-frequency.txt');
writeFileSync(nbs14Frequency, '# NBS14 frequency, tau0 = 1 s\n892\n809\n823\n798\n671\n644\n883\n903\n677\n');

describe('tauline stability', () => {
  it('tauline stability --phase nbs14 --tau0 1 --json gives the NIST SP 1065 NBS14 values (OADEV 91.22945 / 85.95287, MDEV 74.78849, TDEV 86.35831, OHDEV 85.61487) [V2]', async () => {
    const r = await run(['stability', '--phase', join(FIX, 'stability/nbs14-phase.txt'), '--tau0', '1', '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.statistics).toEqual(['oadev', 'mdev', 'tdev', 'ohdev']);
    const [r1, r2] = j.rows;
    expect(r1.tau).toBe(1);
    expect(r1.oadev).toBeCloseTo(91.22945, 3);
    expect(r2.oadev).toBeCloseTo(85.95287, 3);
    expect(r2.mdev).toBeCloseTo(74.78849, 3);
    expect(r2.tdev).toBeCloseTo(86.35831, 3);
    expect(r2.ohdev).toBeCloseTo(85.61487, 3);
    expect(r2.oadevN).toBe(6);
    expect(r2.oadevLow).toBeLessThan(r2.oadev);
    expect(r2.oadevHigh).toBeGreaterThan(r2.oadev);
    expect(r1.noiseSource).toBe('default-wfm');
    expect(j.input).toMatchObject({ kind: 'phase', samples: 10, missing: 0, tau0: 1, gaps: [] });
  });
  it('tauline stability --frequency nbs14 --statistics adev,hdev,totdev --taus 1,2 gives ADEV 115.8082, HDEV 116.7980, TOTDEV 93.90379 at τ = 2 [V2]', async () => {
    const r = await run([
      'stability',
      '--frequency',
      nbs14Frequency,
      '--tau0',
      '1',
      '--statistics',
      'adev,hdev,totdev',
      '--taus',
      '1,2',
      '--json',
    ]);
    expect(r.status).toBe(0);
    const row = JSON.parse(r.out).rows[1];
    expect(row.adev).toBeCloseTo(115.8082, 3);
    expect(row.hdev).toBeCloseTo(116.798, 3);
    expect(row.totdev).toBeCloseTo(93.90379, 4);
    expect(row.totdevN).toBe(8);
  });
  it('tauline stability --phase <two-column file> reports the gap in its table and JSON and uses the file spacing', async () => {
    const file = join(FIX, 'stability/phase-two-column.txt');
    const t = await run(['stability', '--phase', file]);
    expect(t.status).toBe(0);
    expect(t.out.replace(/\n(?! )/g, ' ')).toMatch(/12 samples, τ0 = 30 s, 2 missing in 1 gap/); // the line may wrap at 100 columns
    expect(t.out).toMatch(/gap: 2 missing sample\(s\) from index 5 \(t = 150 s\), line 8/);
    expect(t.out).toMatch(/oadev interval/);
    const j = JSON.parse((await run(['stability', '--phase', file, '--json', '--noise', 'wpm'])).out);
    expect(j.input.gaps).toEqual([{ index: 5, missing: 2, line: 8, time: 150 }]);
    expect(j.rows[0].noiseSource).toBe('stated');
    expect(j.rows[0].oadevN).toBe(6);
  });
  it('tauline stability --phase <two-column file> --json names what gaps[].time counts from, and with --epoch reports input.epoch and the gap stamps', async () => {
    const file = join(FIX, 'stability/phase-two-column.txt');
    const json = async (...extra: string[]) => {
      const r = await run(['stability', '--phase', file, '--noise', 'wpm', '--json', ...extra]);
      expect(r.err).toBe('');
      expect(r.status).toBe(0);
      return JSON.parse(r.out) as Record<string, any>;
    };
    const plain = await json();
    expect(plain.input.epoch).toBeUndefined();
    expect(plain.units.gapTime).toBe(
      "s on the record's time column (its origin not named: give --epoch <ISO 8601> to place it)",
    );
    // The fixture's header: seconds since 2026-01-04T00:00:00 GPST; the gap starts at 150 s = 00:02:30 (by hand).
    const gps = await json('--epoch', '2026-01-04T00:00:00');
    expect(gps.input.epoch).toEqual({ iso: '2026-01-04T00:00:00', scale: 'GPS' });
    expect(gps.input.gaps).toEqual([
      { index: 5, missing: 2, line: 8, time: 150, timeStamp: { iso: '2026-01-04T00:02:30', scale: 'GPS' } },
    ]);
    expect(gps.units.gapTime).toBe(
      "s on the record's time column, since input.epoch (--epoch: where the column reads 0 s)",
    );
    expect(gps.rows).toEqual(plain.rows);
    // On UTC across the leap second 2016-12-31T23:59:60Z (IERS Bulletin C 52 [M]): 150 elapsed SI seconds after
    // 23:59:00 are 23:59:60 + 90 s = 2017-01-01T00:01:29 (by hand).
    const utc = await json('--epoch', '2016-12-31T23:59:00Z');
    expect(utc.input.epoch).toEqual({ iso: '2016-12-31T23:59:00', scale: 'UTC' });
    expect(utc.input.gaps[0].timeStamp).toEqual({ iso: '2017-01-01T00:01:29', scale: 'UTC' });
    const table = await run(['stability', '--phase', file, '--epoch', '2016-12-31T23:59:00Z']);
    expect(table.out).toMatch(/gap: 2 missing sample\(s\) from index 5 \(t = 2017-01-01T00:01:29 UTC\), line 8/);
  });
  it('tauline stability --epoch is refused with a RINEX clock file, as a count of seconds and as text that is no date (exit 2, one line)', async () => {
    const file = join(FIX, 'stability/phase-two-column.txt');
    const cases: [string[], RegExp][] = [
      [
        [
          '--rinex-clock',
          join(FIX, 'rinex-clock/fictional-304.clk'),
          '--clock',
          'G05',
          '--epoch',
          '2026-02-02T00:00:00',
        ],
        /--epoch is for a text record; a RINEX clock file places its epochs itself/,
      ],
      [['--phase', file, '--epoch', '750000'], /--epoch 750000: an epoch is given as ISO 8601/],
      [['--phase', file, '--epoch', 'yesterday'], /--epoch/],
    ];
    for (const [argv, pattern] of cases) {
      const r = await run(['stability', ...argv]);
      expect(r.status).toBe(2);
      expect(r.err).toMatch(pattern);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    }
  });
  it('tauline stability --rinex-clock <file> --clock G05: the missing epoch leaves no complete OADEV term, so every τ is dropped and the request is refused (exit 2, one line naming the gap and the dropped τ)', async () => {
    const r = await run([
      'stability',
      '--rinex-clock',
      join(FIX, 'rinex-clock/fictional-304.clk'),
      '--clock',
      'G05',
      '--statistics',
      'oadev',
      '--json',
    ]);
    expect(r.status).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trimEnd().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/--rinex-clock must be a request in which at least one τ has a complete \(gap-free\) term/);
    expect(r.err).toMatch(/1 missing in 1 gap\(s\).*dropped τ: 30, 60 s/);
  });
  it('tauline stability rejects a τ that is not a multiple of τ0, an unknown statistic or noise, two inputs, no τ0 and a missing clock (exit 2)', async () => {
    const phase = join(FIX, 'stability/nbs14-phase.txt');
    const cases: [string[], RegExp][] = [
      [['--phase', phase, '--tau0', '1', '--taus', '1.5'], /whole multiple/],
      [['--phase', phase, '--tau0', '1', '--statistics', 'xdev'], /unknown statistic/],
      [['--phase', phase, '--tau0', '1', '--noise', 'pink'], /--noise must be/],
      [['--phase', phase, '--frequency', phase, '--tau0', '1'], /exactly one input/],
      [['--phase', phase], /--tau0/],
      [['--rinex-clock', join(FIX, 'rinex-clock/fictional-304.clk')], /--clock/],
      [['--phase', phase, '--tau0', 'ten'], /--tau0/],
      [['--phase', phase, '--tau0', '1', '--statistics', ' , '], /comma-separated/],
      [['--phase', phase, '--tau0', '1', '--confidence', '2'], /confidence/],
    ];
    for (const [argv, pattern] of cases) {
      const r = await run(['stability', ...argv]);
      expect(r.status).toBe(2);
      expect(r.err).toMatch(pattern);
    }
  });
  it('tauline stability reports a malformed file with its name and line, and a missing file (exit 2)', async () => {
    const bad = join(tmp, 'bad.txt');
    writeFileSync(bad, '1\n2\nthree\n');
    const r = await run(['stability', '--phase', bad, '--tau0', '1']);
    expect(r.status).toBe(2);
    expect(r.err).toContain(`${bad}:3:1`);
    const trunc = await run([
      'stability',
      '--rinex-clock',
      join(FIX, 'rinex-clock/truncated-304.clk'),
      '--clock',
      'G05',
    ]);
    expect(trunc.status).toBe(2);
    expect(trunc.err).toMatch(/truncated-304\.clk:\d+/);
    const missing = await run(['stability', '--phase', join(tmp, 'nope.txt'), '--tau0', '1']);
    expect(missing.status).toBe(2);
    expect(missing.err).toMatch(/no such file/);
  });
  it('the built binary `tauline stability --phase nbs14 --tau0 1 --json` prints the same rows (needs npm run build)', () => {
    const bin = join(ROOT, 'packages/cli/bin/tauline.js');
    if (!existsSync(join(ROOT, 'packages/cli/dist/main.js')))
      throw new Error('run `npm run build` first: packages/cli/dist/main.js is missing');
    const r = spawnSync(
      process.execPath,
      [bin, 'stability', '--phase', join(FIX, 'stability/nbs14-phase.txt'), '--tau0', '1', '--json'],
      { encoding: 'utf8' },
    );
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).rows[1].oadev).toBeCloseTo(85.95287, 3);
  });
});
