/**
 * `tauline clock` on the record's real epoch: a RINEX clock file's time axis starts at its first sample (it used to
 * start at 1980-01-06T00:00:00 of the file's time system), and the flags naming an absolute epoch take ISO 8601.
 * The polynomial fit is translation-invariant in t, so moving t = 0 may change the numbers only by rounding.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { characterizeClock } from '@tauline/sdk/clock-model';
import { readRinexClockSeries } from '@tauline/sdk/io';
import { describe, expect, it } from 'vitest';
import { runCli as run } from '../run.js';

const ROOT = fileURLToPath(new URL('../../../../', import.meta.url));
const FIX = join(ROOT, 'test/fixtures/rinex-clock');
const LONG = join(FIX, 'long-304.clk');
const gps = (iso: string) => ({ iso, scale: 'GPS' });

/** GPS seconds since 1980-01-06T00:00:00 by calendar arithmetic (GPS time has no leap seconds; IS-GPS-200 §3.3.4 [M]). */
const gpsSeconds = (iso: string): number => (Date.parse(`${iso}Z`) - Date.parse('1980-01-06T00:00:00Z')) / 1000;

/**
 * Relative agreement required between the two time axes. The fit subtracts t_oc from each t, exact on both axes
 * (multiples of 300 s below 2^53); the noise fit and the filter see the absolute t and differ by ≈ 2e-12 relative
 * (measured). 1e-9 is below the 10 significant digits the table prints, and far above that rounding.
 */
const SAME_TO = 1e-9;
const close = (a: number, b: number) => Math.abs(a - b) <= SAME_TO * Math.max(Math.abs(a), Math.abs(b));

describe('tauline clock on the first epoch of a RINEX clock file', () => {
  it('tauline clock --rinex-clock long-304.clk --reference-epoch 2026-02-02T16:40:00 --predict … --json gives the af0/af1/af2, σ and predictions of the previous release (t on the 1980 count) to 1e-9 relative', async () => {
    // Output of `tauline clock --rinex-clock long-304.clk --clock G37 --json --reference-time 1454085600
    // --predict 1454150000,1454200000` before this change (branch point 2dfbe92): the same instants as seconds
    // since 1980-01-06 GPS. 1454085600 s is 2026-02-02T16:40:00 GPS, 1454150000 s 2026-02-03T10:33:20 and
    // 1454200000 s 2026-02-04T00:26:40 (checked below by calendar arithmetic).
    const previous = {
      coefficients: [
        [2.3229025462223076e-5, 4.1838336767702095e-9],
        [-3.642948062280486e-12, 1.0473959977990191e-13],
        [2.8765346332361107e-19, 8.629183634216858e-19],
      ],
      predictions: [
        [1454150000, 2.2995612609479864e-5, 1.2192016914068183e-9],
        [1454200000, 2.2816036828327954e-5, 7.658716585795145e-9],
      ],
      q: { q1: 6.712842511636272e-24, q2: 2.446416478009339e-31 },
    };
    expect(gpsSeconds('2026-02-02T16:40:00')).toBe(1454085600);
    expect(gpsSeconds('2026-02-03T10:33:20')).toBe(1454150000);
    expect(gpsSeconds('2026-02-04T00:26:40')).toBe(1454200000);
    const r = await run([
      'clock',
      '--rinex-clock',
      LONG,
      '--clock',
      'G37',
      '--reference-epoch',
      '2026-02-02T16:40:00',
      '--predict',
      '2026-02-03T10:33:20,2026-02-04T00:26:40',
      '--json',
    ]);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.input.epoch).toEqual(gps('2026-02-02T00:00:00'));
    // 16:40:00 is 60 000 s after the first epoch 00:00:00 (hand computation [C]).
    expect(j.polynomial.referenceTime).toBe(60000);
    expect(j.polynomial.referenceEpoch).toEqual(gps('2026-02-02T16:40:00'));
    for (const [i, [value, std]] of previous.coefficients.entries()) {
      const c = j.polynomial.coefficients[i];
      expect(close(c.value, value ?? Number.NaN), `${c.name} ${c.value} vs ${value}`).toBe(true);
      expect(close(c.std, std ?? Number.NaN), `${c.name} σ ${c.std} vs ${std}`).toBe(true);
    }
    for (const [i, [t1980, phase, std]] of previous.predictions.entries()) {
      const p = j.polynomial.predictions[i];
      expect(p.t).toBe((t1980 ?? Number.NaN) - gpsSeconds('2026-02-02T00:00:00'));
      expect(close(p.phase, phase ?? Number.NaN)).toBe(true);
      expect(close(p.std, std ?? Number.NaN)).toBe(true);
    }
    expect(j.polynomial.predictions.map((p: { tStamp: unknown }) => p.tStamp)).toEqual([
      gps('2026-02-03T10:33:20'),
      gps('2026-02-04T00:26:40'),
    ]);
    expect(close(j.noise.q.q1, previous.q.q1) && close(j.noise.q.q2, previous.q.q2)).toBe(true);
  });

  it('characterizeClock(series on its first epoch) and characterizeClock(the same series on the 1980 count) agree at the same reference instant to 1e-9 relative (translation invariance of the fit)', async () => {
    const s = await readRinexClockSeries([readFileSync(LONG, 'utf8')], 'G37', { sourceName: 'long-304.clk' });
    if (s.tau0 === undefined) throw new Error('long-304.clk has 400 epochs');
    // The old axis: seconds since 1980-01-06T00:00:00 GPS, counted here by calendar arithmetic, not by the SDK.
    const origin = gpsSeconds('2026-02-02T00:00:00');
    const t1980 = s.t.map((t) => t + origin);
    const reference = 6 * 3600;
    const onFirst = characterizeClock(
      { epoch: s.epoch, t: s.t, phase: s.phase, tau0: s.tau0 },
      { referenceTime: reference },
    );
    const on1980 = characterizeClock(
      { epoch: s.epoch.plus(-origin), t: t1980, phase: s.phase, tau0: s.tau0 },
      { referenceTime: reference + origin },
    );
    expect(onFirst.referenceEpoch.secondsSince(on1980.referenceEpoch)).toBe(0);
    for (const [i, c] of onFirst.polynomial.coefficients.entries()) {
      expect(close(c, on1980.polynomial.coefficients[i] ?? Number.NaN), `coefficient ${i}`).toBe(true);
      expect(close(onFirst.polynomialNoise.std[i] ?? 0, on1980.polynomialNoise.std[i] ?? Number.NaN)).toBe(true);
    }
    expect(close(onFirst.noise.q.q1, on1980.noise.q.q1) && close(onFirst.noise.q.q2, on1980.noise.q.q2)).toBe(true);
  });

  it('tauline clock --reference-epoch reads GPS time, UTC with Z, or the time system named after the stamp (GPS = UTC + 18 s since 2017, IERS Bulletin C [M]; BDT = GPS − 14 s, BDS ICD [M])', async () => {
    const referenceTime = async (stamp: string) => {
      const r = await run(['clock', '--rinex-clock', LONG, '--clock', 'G37', '--reference-epoch', stamp, '--json']);
      expect(r.status, r.err).toBe(0);
      return JSON.parse(r.out).polynomial.referenceTime;
    };
    expect(await referenceTime('2026-02-02T01:00:00')).toBe(3600);
    expect(await referenceTime('2026-02-02T01:00:00 GPS')).toBe(3600);
    expect(await referenceTime('2026-02-02T01:00:00Z')).toBe(3618);
    expect(await referenceTime('2026-02-02T01:00:00 UTC')).toBe(3618);
    expect(await referenceTime('2026-02-02T01:00:00 BDT')).toBe(3614);
  });

  it('tauline clock --phase --epoch <GPS> --predict <stamp> (table) prints the prediction epoch as a stamp and on the time column: 15 days after the epoch is 1 296 000 s (hand computation [C])', async () => {
    const example = join(ROOT, 'packages/sdk/examples/clock/vestra-4-rafs.txt');
    const r = await run([
      'clock',
      '--phase',
      example,
      '--epoch',
      '2027-02-08T06:00:00',
      '--predict',
      '2027-02-23T06:00:00',
    ]);
    expect(r.status).toBe(0);
    expect(r.out.replace(/\n/g, ' ')).toMatch(
      /prediction at t = 2027-02-23T06:00:00 GPS \(1296000 s on the time column\): x = \S+ ± \S+ s/,
    );
  });

  it('tauline clock --rinex-clock <a file naming no time system> reads its epochs on GPS time and says so (timeSystemAssumed)', async () => {
    const r = await run(['clock', '--rinex-clock', join(FIX, 'fictional-200.clk'), '--clock', 'G12', '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.input.timeSystemAssumed).toBe(true);
    expect(j.input).not.toHaveProperty('timeSystem');
    // fictional-200.clk: 14 AS records of G12 every 300 s from 2026-01-04 00:00:00 as written (SOURCE.md).
    expect(j.input.epoch).toEqual(gps('2026-01-04T00:00:00'));
    expect(j.input.epoch).toEqual(j.input.firstEpochStamp);
    expect(j.input.firstEpoch).toBe(0);
  });

  it('tauline stability --rinex-clock --json gives input.epoch (the first sample) and gap times since it with their stamps, in the file time system (GAL for fictional-305.clk)', async () => {
    const r = await run([
      'stability',
      '--rinex-clock',
      join(FIX, 'fictional-305.clk'),
      '--clock',
      'E27',
      '--statistics',
      'oadev',
      '--json',
    ]);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    // fictional-305.clk: E27 every 30 s from 2026-06-30 23:58:00 GAL (SOURCE.md).
    expect(j.input.epoch).toEqual({ iso: '2026-06-30T23:58:00', scale: 'GAL' });
    expect(j.input.gaps).toEqual([]);
  });
});
