import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { simulateClock } from '@tauline/sdk/clock-model';
import { describe, expect, it } from 'vitest';
import { runCli as run } from '../run.js';

const ROOT = fileURLToPath(new URL('../../../../', import.meta.url));
const EXAMPLE = join(ROOT, 'packages/sdk/examples/clock/vestra-4-rafs.txt');
const BIN = join(ROOT, 'packages/cli/bin/tauline.js');

/** True values of the generated example (packages/sdk/examples/clock/SOURCE.md). */
const TRUTH = { af0: 1.5e-7, af1: 3.2e-11, af2: 5e-19, q1: 1e-23, q2: 1e-31, jumpEpoch: 750000, jumpSize: 2e-9 };

describe('tauline clock', () => {
  it('tauline clock --phase <VESTRA-4 example> --json recovers the true af1, the jump epoch and size, and q1, q2 within the stated uncertainties (generator values in SOURCE.md; model Zucca & Tavella 2005 [M])', async () => {
    const r = await run([
      'clock',
      '--phase',
      EXAMPLE,
      '--epoch',
      '2027-02-08T06:00:00',
      '--predict',
      '2027-02-23T06:00:00',
      '--scenario-noise',
      '--json',
    ]);
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    const j = JSON.parse(r.out);
    const [af0, af1, af2] = j.polynomial.coefficients;
    expect(af1.name).toBe('af1');
    // 2σ bounds: one draw per coefficient, 95.45 % each.
    expect(Math.abs(af1.value - TRUTH.af1)).toBeLessThan(2 * af1.std);
    expect(Math.abs(af0.value - TRUTH.af0)).toBeLessThan(2 * af0.std);
    expect(Math.abs(af2.value - TRUTH.af2)).toBeLessThan(2 * af2.std);
    expect(j.filter.jumps).toHaveLength(1);
    const jump = j.filter.jumps[0];
    expect(jump).toMatchObject({ kind: 'phase', epoch: TRUTH.jumpEpoch, index: 2500, pass: 1 });
    expect(Math.abs(jump.size - TRUTH.jumpSize)).toBeLessThan(2 * jump.sizeStd);
    expect(j.filter.rejected).toEqual([]);
    expect(j.filter.detection).toMatchObject({
      falseAlarmProbabilityPerSample: 1e-6,
      testsPerSample: 36,
      outlierProbability: 1e-4,
    });
    expect(j.filter.detection.jumpThreshold).toBeCloseTo(30.856864804329376, 6); // scipy.stats.chi2.isf(1e-6/36, 1) [C]
    // q intervals at the reported 68.27 % level (χ², diffusionFromStabilityRows).
    for (const n of ['q1', 'q2'] as const) {
      const iv = j.noise.intervals[n];
      expect(iv.low).toBeLessThanOrEqual(TRUTH[n]);
      expect(iv.high).toBeGreaterThanOrEqual(TRUTH[n]);
    }
    expect(j.noise.h.h0).toBeCloseTo(2 * j.noise.q.q1, 35);
    expect(j.scenarioNoise).toEqual(j.noise.q);
    expect(j.filter.nis.mean).toBeGreaterThan(j.filter.nis.low);
    expect(j.filter.nis.mean).toBeLessThan(j.filter.nis.high);
    expect(j.polynomial.caution).toMatch(/responsible engineering authority/);
    expect(j.polynomial.predictions[0].std).toBeGreaterThan(0);
    // 2027-02-23T06:00:00 GPS is 15 days = 1 296 000 s after --epoch 2027-02-08T06:00:00 GPS (hand computation [C]).
    expect(j.polynomial.predictions[0]).toMatchObject({
      t: 1296000,
      tStamp: { iso: '2027-02-23T06:00:00', scale: 'GPS' },
    });
    // 750 000 s after the epoch is 8 d 16 h 20 min later: 2027-02-16T22:20:00 GPS (hand computation [C]).
    expect(jump.epochStamp).toEqual({ iso: '2027-02-16T22:20:00', scale: 'GPS' });
  });

  it('tauline clock --phase --epoch <GPS reading> --reference-epoch 07:00:00 --json gives input.epoch and polynomial.referenceEpoch as ISO 8601 with their scale and t_oc 3600 s after the epoch (hand computation [C])', async () => {
    const r = await run([
      'clock',
      '--phase',
      EXAMPLE,
      '--epoch',
      '2027-02-08T06:00:00',
      '--degree',
      '1',
      '--reference-epoch',
      '2027-02-08T07:00:00',
      '--json',
    ]);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.input.epoch).toEqual({ iso: '2027-02-08T06:00:00', scale: 'GPS' });
    expect(j.polynomial.referenceTime).toBe(3600);
    expect(j.polynomial.referenceEpoch).toEqual({ iso: '2027-02-08T07:00:00', scale: 'GPS' });
  });

  it('tauline clock --epoch <UTC with Z> --json reports the epoch and t_oc read on UTC, the scale it was given in', async () => {
    const r = await run(['clock', '--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00Z', '--degree', '1', '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.input.epoch).toEqual({ iso: '2027-02-08T06:00:00', scale: 'UTC' });
    expect(j.polynomial.referenceEpoch).toEqual({ iso: '2027-02-08T06:00:00', scale: 'UTC' });
  });

  it('tauline clock --epoch 2027-06-20T00:00:00Z --reference-epoch 2027-07-03T21:20:18 (GPS) --json gives a t_oc past the leap-second table (2027-06-28) on GPS time, 1 200 000 s after the epoch: UTC + 18 s + 1 200 000 s (GPS − UTC = 18 s since 2017, IERS Bulletin C [M]; hand computation [C])', async () => {
    const r = await run([
      'clock',
      '--phase',
      EXAMPLE,
      '--epoch',
      '2027-06-20T00:00:00Z',
      '--degree',
      '1',
      '--reference-epoch',
      '2027-07-03T21:20:18',
      '--json',
    ]);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.input.epoch).toEqual({ iso: '2027-06-20T00:00:00', scale: 'UTC' });
    expect(j.polynomial.referenceTime).toBe(1200000);
    expect(j.polynomial.referenceEpoch).toEqual({ iso: '2027-07-03T21:20:18', scale: 'GPS' });
  });

  it('tauline clock (table) names units, prints the flight caution, the jump and the scenario-noise snippet', async () => {
    const r = await run([
      'clock',
      '--phase',
      EXAMPLE,
      '--epoch',
      '2027-02-08T06:00:00',
      '--degree',
      '1',
      '--states',
      '2',
      '--measurement-sigma',
      '3e-11',
      '--scenario-noise',
    ]);
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/af1 .* dimensionless/);
    expect(r.out.replace(/\n/g, ' ')).toMatch(
      /x\(t\) = af0 \+ af1·\(t − t_oc\), t_oc = 2027-02-08T06:00:00 GPS \(0 s on the time column\), degree 1/,
    );
    expect(r.out).not.toMatch(/^af2/m);
    expect(r.out).toMatch(/Caution: verify these values/);
    expect(r.out).toMatch(/phase +750000 +2500/);
    // What a declared jump means: the per-sample false-alarm probability and the GLR threshold
    // (scipy.stats.chi2.isf(1e-6/36, 1) = 30.857; isf(1e-4, 1) = 15.137 [C]).
    expect(r.out.replace(/\s+/g, ' ')).toMatch(
      /jump detection: GLR statistic l > 30\.86 \(χ²\(1\) at 1\.00e-6\/36\); on a jump-free record a false jump is declared with probability ≤ 1\.00e-6 per sample/,
    );
    expect(r.out).toMatch(
      /outliers: impulse statistic l > 15\.14, i\.e\. a good sample is rejected with probability 1\.00e-4/,
    );
    expect(r.out).toMatch(/measurement noise σ_v = 3\.00e-11 s \(given\)/);
    const snippet = r.out.trim().split('\n').pop()!;
    expect(Object.keys(JSON.parse(snippet))).toEqual(['q1', 'q2', 'q3']);
  });

  it('tauline clock --states 3 fits q3 from OHDEV and reports h₋₄', async () => {
    const r = await run(['clock', '--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00', '--states', '3', '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.noise.statistic).toBe('ohdev');
    expect(j.noise.h).toHaveProperty('hMinus4');
    expect(j.filter.states).toBe(3);
  });

  it('tauline clock rejects bad input with one line and exit 2', async () => {
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-clock-'));
    const one = join(tmp, 'one-column.txt');
    writeFileSync(one, `${Array.from({ length: 40 }, (_, k) => `${k * 1e-10}`).join('\n')}\n`);
    const cases: [string[], RegExp][] = [
      [['--phase', EXAMPLE, '--degree', '3'], /--degree must be 1 or 2/],
      [['--phase', EXAMPLE, '--states', '4'], /--states must be 2 or 3/],
      [['--phase', EXAMPLE, '--measurement-sigma', '0'], /--measurement-sigma must be > 0 s/],
      [['--phase', EXAMPLE, '--measurement-sigma', '1ns'], /--measurement-sigma must be a decimal number/],
      [
        ['--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00', '--predict', '2027-02-08T06:01:40'],
        // The last sample, 1 209 300 s after the epoch, is 2027-02-22T05:55:00 GPS (hand computation [C]).
        /--predict: 2027-02-08T06:01:40 is before the last sample epoch 2027-02-22T05:55:00 GPS \(1209300 s on the time column\)/,
      ],
      [
        ['--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00', '--predict', '1296000'],
        /--predict 1296000: an epoch is given as ISO 8601 .*not as a count of seconds/,
      ],
      [
        ['--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00', '--reference-epoch', '2027-02-08T06:00:00 GLO'],
        /--reference-epoch "2027-02-08T06:00:00 GLO": a stamp is read on GPS time, on UTC with Z, or on one of GPS, GAL, BDT, QZS, TAI, UTC/,
      ],
      [
        ['--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00', '--reference-epoch', '2027-02-30T00:00:00'],
        /--reference-epoch/,
      ],
      [
        ['--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00', '--reference-time', '0'],
        /--reference-time is no longer accepted: give t_oc as --reference-epoch <ISO 8601>/,
      ],
      [['--phase', EXAMPLE], /--phase .*vestra-4-rafs\.txt has no calendar: give --epoch <ISO 8601>/],
      [['--phase', EXAMPLE, '--epoch', '2027-02-30T00:00:00'], /--epoch/],
      [['--phase', EXAMPLE, '--epoch', 'yesterday'], /--epoch/],
      [
        [
          '--rinex-clock',
          join(ROOT, 'test/fixtures/rinex-clock/long-304.clk'),
          '--clock',
          'G37',
          '--epoch',
          '2027-02-08T06:00:00',
        ],
        /--epoch is for a text record/,
      ],
      [['--phase', one], /--tau0/],
      [[], /exactly one input/],
      [['--rinex-clock', EXAMPLE], /--clock/],
      [['--phase', join(tmp, 'missing.txt')], /cannot read/],
    ];
    for (const [argv, pattern] of cases) {
      const r = await run(['clock', ...argv]);
      expect(r.status).toBe(2);
      expect(r.err).toMatch(pattern);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    }
  });

  it.skipIf(!existsSync(BIN))(
    'the built binary `tauline clock --phase <example> --json` prints the same result as the in-process call',
    async () => {
      const b = spawnSync(
        process.execPath,
        [BIN, 'clock', '--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00', '--json'],
        { encoding: 'utf8' },
      );
      const inProcess = await run(['clock', '--phase', EXAMPLE, '--epoch', '2027-02-08T06:00:00', '--json']);
      if (b.stderr.includes('unknown command')) return; // binary built before this command existed
      expect(b.status).toBe(0);
      expect(JSON.parse(b.stdout).filter.jumps).toEqual(JSON.parse(inProcess.out).filter.jumps);
    },
  );
});

describe('tauline clock on a record too short to characterise', () => {
  it('exits 2 naming the flag, the file, the sample count and the minimum', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tauline-clock-'));
    const file = join(dir, 'short.txt');
    writeFileSync(file, `${Array.from({ length: 9 }, (_, k) => `${k * 1e-9}`).join('\n')}\n`);
    const r = await run(['clock', '--phase', file, '--tau0', '1']);
    expect(r.status).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/--phase .*short\.txt has 9 phase samples; the clock model needs at least 12/);
  });
});

describe('tauline clock --rinex-clock <file> --clock <name>', () => {
  const LONG = join(ROOT, 'test/fixtures/rinex-clock/long-304.clk');
  /** True values of long-304.clk (test/fixtures/rinex-clock/SOURCE.md and generate-long.mjs). */
  const LONG_TRUTH = {
    af0: 2.345e-5,
    af1: -3.7e-12,
    q1: 1e-23,
    q2: 1e-31,
    measurementNoise: 30e-12,
    seed: 20261202,
    epochs: 400,
    tau0: 300,
    missingIndex: 150,
  };
  /** GPS seconds since 1980-01-06T00:00:00 by calendar arithmetic (GPS time has no leap seconds; IS-GPS-200 §3.3.4 [M]). */
  const gpsSeconds = (iso: string): number => (Date.parse(`${iso}Z`) - Date.parse('1980-01-06T00:00:00Z')) / 1000;

  it('long-304.clk holds the G37 biases of simulateClock with the stated seed and true values, to the 12 digits written, without sample 150 (generator check, SOURCE.md)', () => {
    const sim = simulateClock({
      samples: LONG_TRUTH.epochs,
      tau0: LONG_TRUTH.tau0,
      q: { q1: LONG_TRUTH.q1, q2: LONG_TRUTH.q2 },
      seed: LONG_TRUTH.seed,
      measurementNoise: LONG_TRUTH.measurementNoise,
      initial: { phase: LONG_TRUTH.af0, frequency: LONG_TRUTH.af1 },
    });
    const rows = readFileSync(LONG, 'utf8')
      .split('\n')
      .filter((l) => l.startsWith('AS G37 '));
    expect(rows).toHaveLength(LONG_TRUTH.epochs - 1);
    const start = gpsSeconds('2026-02-02T00:00:00');
    for (const row of rows) {
      const f = row.trim().split(/\s+/);
      const t = gpsSeconds(`${f[2]}-${f[3]}-${f[4]}T${f[5]}:${f[6]}:00`) + Number(f[7]);
      const k = (t - start) / LONG_TRUTH.tau0;
      expect(k).not.toBe(LONG_TRUTH.missingIndex);
      expect(Math.abs(Number(f[9]) - (sim.phase[k] as number))).toBeLessThanOrEqual(
        5e-12 * Math.abs(sim.phase[k] as number),
      );
    }
  });

  it('tauline clock --rinex-clock long-304.clk --clock G37 --tau0 300 --json recovers the true af1 within 3× its stated 1σ, names the clock and reports the missing epoch (true values: SOURCE.md)', async () => {
    const r = await run(['clock', '--rinex-clock', LONG, '--clock', 'G37', '--tau0', '300', '--json']);
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    const j = JSON.parse(r.out);
    // The record's t = 0 is its first epoch, 2026-02-02T00:00:00 GPS; the last is 2026-02-03T09:15:00 (SOURCE.md).
    const since = (iso: string) => gpsSeconds(iso) - gpsSeconds('2026-02-02T00:00:00');
    const gps = (iso: string) => ({ iso, scale: 'GPS' });
    expect(j.input).toMatchObject({
      file: LONG,
      clock: 'G37',
      timeSystem: 'GPS',
      samples: 400,
      tau0: 300,
      epoch: gps('2026-02-02T00:00:00'),
      firstEpoch: 0,
      lastEpoch: since('2026-02-03T09:15:00'),
      firstEpochStamp: gps('2026-02-02T00:00:00'),
      lastEpochStamp: gps('2026-02-03T09:15:00'),
    });
    expect(j.input.lastEpoch).toBe(119700); // 399 steps of 300 s
    expect(j.input.gaps).toEqual([
      { index: 150, missing: 1, line: 162, time: since('2026-02-02T12:30:00'), timeStamp: gps('2026-02-02T12:30:00') },
    ]);
    expect(j.polynomial.referenceEpoch).toEqual(gps('2026-02-02T00:00:00'));
    expect(j.polynomial.samplesUsed).toBe(399);
    expect(j.polynomial.referenceTime).toBe(0);
    // No count of seconds since 1980 anywhere: every seconds field is within the record's 1.4 days.
    const numbers = JSON.stringify(j).match(/-?\d+(\.\d+)?(e[+-]?\d+)?/gi) ?? [];
    expect(numbers.filter((v) => Math.abs(Number(v)) > 1e6)).toEqual([]);
    expect(r.out).not.toMatch(/1980-01-06|since 1980/);
    const af1 = j.polynomial.coefficients[1];
    expect(af1.name).toBe('af1');
    expect(Math.abs(af1.value - LONG_TRUTH.af1)).toBeLessThan(3 * af1.std);
    const af0 = j.polynomial.coefficients[0];
    expect(Math.abs(af0.value - LONG_TRUTH.af0)).toBeLessThan(3 * af0.std);
    // The missing epoch is a skipped update, not an outlier or a jump.
    expect(j.filter.jumps).toEqual([]);
    expect(j.filter.rejected).toEqual([]);
    expect(j.filter.detection).toMatchObject({
      falseAlarmProbabilityPerSample: 1e-6,
      testsPerSample: 36,
      outlierProbability: 1e-4,
    });
    expect(j.filter.detection.jumpThreshold).toBeCloseTo(30.856864804329376, 6); // scipy.stats.chi2.isf(1e-6/36, 1) [C]
  });

  it('tauline clock --rinex-clock long-304.clk --clock G37 (table) names the clock and prints the gap with its index, calendar epoch in GPS time and line', async () => {
    const r = await run(['clock', '--rinex-clock', LONG, '--clock', 'G37']);
    expect(r.status).toBe(0);
    // The record's epochs as written in the file (SOURCE.md): 2026-02-02 00:00 to 2026-02-03 09:15 GPS time, 300 s apart.
    expect(r.out.replace(/\n(?! )/g, ' ')).toMatch(
      /^clock record .*long-304\.clk \(clock G37, GPS time\): 400 samples, τ0 = 300 s, epochs 2026-02-02T00:00:00 GPS … 2026-02-03T09:15:00 GPS, 1 missing in 1 gap\(s\)/m,
    );
    expect(r.out).toMatch(/^ {2}gap: 1 missing sample\(s\) from index 150 \(t = 2026-02-02T12:30:00 GPS\), line 162$/m);
    expect(r.out).toMatch(/t_oc = 2026-02-02T00:00:00 GPS/);
    expect(r.out).not.toMatch(/\d\.\d+e\+9/);
  });

  it('tauline clock --rinex-clock with an unknown --clock exits 2 with one line listing the clocks in the file', async () => {
    const r = await run(['clock', '--rinex-clock', LONG, '--clock', 'G99']);
    expect(r.status).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/long-304\.clk.*"G99".*clocks present: ORVA00XYZ, G37/);
  });

  it('tauline clock and tauline stability read RINEX clock 2.00, 3.02 and 3.05 files (A4 and A9 layouts)', async () => {
    const FIX = join(ROOT, 'test/fixtures/rinex-clock');
    const v302 = JSON.parse(
      (await run(['clock', '--rinex-clock', join(FIX, 'fictional-302.clk'), '--clock', 'E14', '--json'])).out,
    );
    expect(v302.input).toMatchObject({ clock: 'E14', tau0: 60, samples: 16, timeSystem: 'GPS' });
    const v305 = await run([
      'stability',
      '--rinex-clock',
      join(FIX, 'fictional-305.clk'),
      '--clock',
      'E27',
      '--statistics',
      'oadev',
      '--json',
    ]);
    expect(v305.status).toBe(0);
    expect(JSON.parse(v305.out).input).toMatchObject({ clock: 'E27', tau0: 30, samples: 8, timeSystem: 'GAL' });
    const v200 = await run(['clock', '--rinex-clock', join(FIX, 'fictional-200.clk'), '--clock', 'G12']);
    expect(v200.status).toBe(0);
    expect(v200.out).toMatch(/clock G12/);
  });

  it('tauline clock --rinex-clock refuses a year-9999 record before allocating (exit 2, one line naming file, line, gap and limit) and a record cut inside a value', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tauline-clk-'));
    const lines = readFileSync(LONG, 'utf8').split('\n');
    const far = join(dir, 'far.clk');
    const last = lines.map((l, i) => (l.startsWith('AS G37') ? i : -1)).filter((i) => i >= 0);
    const [prev, final] = last.slice(-2) as [number, number];
    writeFileSync(far, lines.map((l, i) => (i === final ? l.replace(/2026 02 0\d/, '9999 12 31') : l)).join('\n'));
    const r = await run(['clock', '--rinex-clock', far, '--clock', 'G37']);
    expect(r.status).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toContain(
      `far.clk:${final + 1}:1: expected a uniform series of at most 50000000 samples (MAX_SERIES_SAMPLES): the gap of `,
    );
    expect(r.err).toContain(` s after line ${prev + 1} is `);
    const cut = join(dir, 'cut.clk');
    writeFileSync(cut, [...lines.slice(0, 10), lines[10]!.slice(0, 51), ...lines.slice(11)].join('\n'));
    const c = await run(['clock', '--rinex-clock', cut, '--clock', 'G37']);
    expect(c.status).toBe(2);
    expect(c.err).toMatch(
      /cut\.clk:11:47: expected clock bias \(s\) \(value 1 of 2, E19\.12 in columns 46-64\): a complete number in exponent form/,
    );
  });

  it('tauline clock --rinex-clock without --clock exits 2 with one line asking for --clock', async () => {
    const r = await run(['clock', '--rinex-clock', LONG, '--tau0', '300']);
    expect(r.status).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/--rinex-clock needs --clock <name>/);
  });

  it('tauline clock and tauline stability refuse --clock without --rinex-clock (exit 2, one line) instead of ignoring it', async () => {
    for (const command of ['clock', 'stability']) {
      const r = await run([command, '--phase', EXAMPLE, '--clock', 'G37']);
      expect(r.status).toBe(2);
      expect(r.out).toBe('');
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(/--clock names a clock of a RINEX clock file: give it with --rinex-clock <file>/);
    }
  });
});

describe('an imposed --tau0 finer than the record spacing', () => {
  it('exits 2 with one line pointing at --tau0, for clock and stability alike', async () => {
    const file = join(ROOT, 'test/fixtures/rinex-clock/long-304.clk');
    for (const command of ['clock', 'stability']) {
      const r = await run([command, '--rinex-clock', file, '--clock', 'G37', '--tau0', '150']);
      expect(r.status, command).toBe(2);
      expect(r.err.trim().split('\n'), command).toHaveLength(1);
      expect(r.err, command).toMatch(
        /--tau0 150 s leaves 400 of 799 epochs .* empty: is it smaller than the record's sample spacing/,
      );
    }
  });
});
