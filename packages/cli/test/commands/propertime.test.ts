import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { IERS_2010, L_G, SPEED_OF_LIGHT_SQUARED } from '@tauline/sdk/constants';
import { moonPositionLowPrecision } from '@tauline/sdk/orbit';
import { instantFromTtSecondsSinceJ2000 } from '@tauline/sdk/time';
import { describe, expect, it } from 'vitest';
import { type CliRun, runCli } from '../run.js';

const run = (...argv: string[]): Promise<CliRun> => runCli(['propertime', ...argv]);

/** A circular GPS-like orbit, a = 26 561 750 m, i = 55°, at the ascending node. */
const V = Math.sqrt(IERS_2010.gm / 26_561_750);
const GPS_STATE = `26561750,0,0,0,${V * Math.cos((55 * Math.PI) / 180)},${V * Math.sin((55 * Math.PI) / 180)}`;

describe('tauline propertime', () => {
  it('--json prints samples [{ t, tauMinusTT }] with τ − TT = 0 at t = 0 and the point-mass rate L_G − 3GM/(2ac²) (IERS 2010 eq. 10.9 [V1])', async () => {
    const r = await run(
      '--state',
      GPS_STATE,
      '--duration',
      '7200',
      '--step',
      '1800',
      '--model',
      'point-mass',
      '--json',
    );
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    const doc = JSON.parse(r.out);
    expect(doc.samples).toHaveLength(5);
    expect(doc.samples[0]).toEqual({ t: 0, tauMinusTT: 0 });
    expect(doc.samples[4].t).toBe(7200);
    const rate = L_G - (1.5 * IERS_2010.gm) / (26_561_750 * SPEED_OF_LIGHT_SQUARED);
    // circular orbit: no periodic term, so τ − TT = rate·t to integration error
    expect(Math.abs(doc.samples[4].tauMinusTT - rate * 7200)).toBeLessThan(1e-15);
    expect(doc.model).toBe('point-mass');
    expect(doc.constants).toBe('iers-2010');
    expect(typeof doc.acceptedSteps).toBe('number');
  });

  it('prints a table by default and names the ephemeris for --model full', async () => {
    const r = await run(
      '--state',
      GPS_STATE,
      '--duration',
      '3600',
      '--step',
      '1200',
      '--model',
      'full',
      '--epoch',
      '2025-05-08T18:13:20',
    );
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/model full/);
    expect(r.out).toMatch(/epoch 2025-05-08T18:13:20 TT/);
    expect(r.out.replace(/\s+/g, ' ')).toMatch(/Montenbruck & Gill/); // the title may wrap at 100 columns
    expect(r.out).toMatch(/τ − TT \(ns\)/);
    expect(r.out).toMatch(/mean rate over the span/);
  });

  it('accepts a state starting with a minus sign as --state=-…', async () => {
    const r = await run(
      `--state=-${GPS_STATE}`.replace('=-26561750,0,0,0,', '=-26561750,0,0,0,-'),
      '--duration',
      '600',
      '--step',
      '600',
      '--json',
    );
    expect(r.status).toBe(0);
    expect(JSON.parse(r.out).samples).toHaveLength(2);
  });

  it('rejects a state in kilometres, a short state, bad numbers, a step larger than the duration and an unknown model (exit 2, one line)', async () => {
    const km = await run('--state', '26561.75,0,0,0,2.2,3.2', '--duration', '600', '--step', '60');
    expect(km.status).toBe(2);
    expect(km.err).toMatch(/did you mean 26561\.75 km/);
    expect(km.err.trim().split('\n')).toHaveLength(1);
    expect((await run('--state', '26561750,0,0', '--duration', '600', '--step', '60')).err).toMatch(
      /only three values: the velocity is missing/,
    );
    expect((await run('--state', '26561750,0,0,0,abc,0' /* vy */, '--duration', '600', '--step', '60')).err).toMatch(
      /--state vy/,
    );
    expect((await run('--state', GPS_STATE, '--duration', '600', '--step', '900')).err).toMatch(
      /--step must be at most the duration/,
    );
    expect((await run('--state', GPS_STATE, '--duration', '0', '--step', '1')).err).toMatch(
      /--duration must be in \(0, 10000000000\] s; received 0/,
    );
    expect((await run('--state', GPS_STATE, '--duration', '600', '--step', '60', '--model', 'egm')).err).toMatch(
      /--model must be one of point-mass, j2, full/,
    );
    expect((await run('--state', GPS_STATE, '--duration', '600', '--step', '60', '--tolerance', '1')).err).toMatch(
      /--tolerance/,
    );
    expect((await run('--duration', '600', '--step', '60')).err).toMatch(/--state is required/);
    const nan = await run('--state', '26561750,0,0,0,NaN,0', '--duration', '600', '--step', '60');
    expect(nan.status).toBe(2);
  });

  it('the built binary runs `tauline propertime --json` (needs `npm run build`)', () => {
    const bin = fileURLToPath(new URL('../../bin/tauline.js', import.meta.url));
    const dist = fileURLToPath(new URL('../../dist/commands/propertime.js', import.meta.url));
    if (!existsSync(dist)) return; // not built in this checkout; the in-process tests above cover the command
    const out = execFileSync(
      process.execPath,
      [bin, 'propertime', '--state', GPS_STATE, '--duration', '1200', '--step', '600', '--json'],
      { encoding: 'utf8' },
    );
    const doc = JSON.parse(out);
    expect(doc.samples.map((s: { t: number }) => s.t)).toEqual([0, 600, 1200]);
  });

  it('--epoch is read on TT (UTC with Z) and printed in JSON as { iso, scale: TT }; 2023-01-01T00:00:00Z is 69.184 s later on TT (TAI − UTC = 37 s from 2017, IERS Bulletin C [M]; TT − TAI = 32.184 s)', async () => {
    const args = ['--state', GPS_STATE, '--duration', '600', '--step', '600', '--json'];
    const tt = JSON.parse((await run(...args, '--epoch', '2023-01-01T00:00:00')).out);
    expect(tt.epoch).toEqual({ iso: '2023-01-01T00:00:00', scale: 'TT' });
    expect(tt.units.epoch).toMatch(/TT/);
    expect(tt.epochTtSecondsSinceJ2000).toBeUndefined();
    const utc = JSON.parse((await run(...args, '--epoch', '2023-01-01T00:00:00Z')).out);
    expect(utc.epoch).toEqual({ iso: '2023-01-01T00:01:09.184', scale: 'TT' });
    const none = JSON.parse((await run(...args)).out);
    expect(none.epoch).toEqual({ iso: '2000-01-01T12:00:00', scale: 'TT' });
    // A time-system code after the stamp, as tauline clock reads it: TT = GPS + 19 s + 32.184 s (IS-GPS-200 [M]).
    const gps = JSON.parse((await run(...args, '--epoch', '2023-01-01T00:00:00 GPS')).out);
    expect(gps.epoch).toEqual({ iso: '2023-01-01T00:00:51.184', scale: 'TT' });
    const count = await run(...args, '--epoch', '725803200');
    expect(count.status).toBe(2);
    expect(count.err).toMatch(/--epoch 725803200: an epoch is given as ISO 8601 \(e\.g\. 2027-02-08T06:00:00 on TT/);
  });

  it('--epoch-tt-j2000 (an earlier release) is refused with the --epoch form to give instead (exit 2)', async () => {
    const r = await run('--state', GPS_STATE, '--duration', '600', '--step', '600', '--epoch-tt-j2000', '725803200');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(
      /--epoch-tt-j2000 is no longer accepted: give the instant of t = 0 as --epoch <ISO 8601> on TT/,
    );
    const bad = await run('--state', GPS_STATE, '--duration', '600', '--step', '600', '--epoch', '2023-13-01T00:00:00');
    expect(bad.status).toBe(2);
    expect(bad.err).toMatch(/--epoch/);
  });

  describe('lunar orbiters', () => {
    // A polar lunar orbiter 100 km above the mean radius (1737.4 km, IAU WGCCRE [M]) at 2023-01-01 00:00 TT (725 803 200 s after J2000.0), given
    // geocentrically (mean equator and equinox of date) from the SDK's own low-precision Moon; lunar GM 4.902800066e12
    // m³/s² (JPL DE-series value [M]). Lunar escape speed there √(2GM_M/ρ) = 2310.1 m/s [C].
    const epoch = 725_803_200;
    /** The same instant as --epoch text: J2000.0 is 2000-01-01T12:00:00 TT and TT has no leap seconds [C]. */
    const EPOCH_TT = '2023-01-01T00:00:00';
    const lunarState = (speed: number): string => {
      const at = instantFromTtSecondsSinceJ2000(epoch);
      const m = moonPositionLowPrecision(at);
      const mp = moonPositionLowPrecision(at.plus(1));
      const mm = moonPositionLowPrecision(at.plus(-1));
      const v = [0, 1, 2].map((k) => (mp[k]! - mm[k]!) / 2);
      return [m[0], m[1], m[2] + 1_837_400, v[0]! + speed, v[1]!, v[2]!].join(',');
    };

    it('tauline propertime --model full integrates a Moon-bound polar orbiter at 1900 m/s relative to the Moon at tolerance 1e-14', async () => {
      const r = await run(
        `--state=${lunarState(1900)}`,
        '--duration',
        '86400',
        '--step',
        '43200',
        '--model',
        'full',
        '--epoch',
        EPOCH_TT,
        '--tolerance',
        '1e-14',
        '--json',
      );
      expect(r.err).toBe('');
      expect(r.status).toBe(0);
      const doc = JSON.parse(r.out);
      // a lunar clock runs ≈ 56 µs/day fast against TT (lunarClockRate; Ashby & Patla 2024: 56.02 µs/day at the surface [V2])
      expect(doc.meanRate * 86400e6).toBeGreaterThan(55);
      expect(doc.meanRate * 86400e6).toBeLessThan(58);
      expect(doc.acceptedSteps).toBeLessThan(2000);
    });

    it('tauline propertime refuses the same state under the Earth-only j2 model with a hint to use --model full (exit 2)', async () => {
      const r = await run(`--state=${lunarState(1900)}`, '--duration', '86400', '--step', '43200');
      expect(r.status).toBe(2);
      expect(r.err).toMatch(/escape speed √\(2GM\/r\).*for a lunar orbiter use --model full/);
    });

    it("tauline propertime --model full refuses a state inside the Moon's Hill sphere above the lunar escape speed 2310.1 m/s (exit 2)", async () => {
      const r = await run(
        `--state=${lunarState(2400)}`,
        '--duration',
        '86400',
        '--step',
        '43200',
        '--model',
        'full',
        '--epoch',
        EPOCH_TT,
      );
      expect(r.status).toBe(2);
      expect(r.err).toMatch(/lunar escape speed √\(2GM_M\/ρ\) = 2310\.1 m\/s/);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    });

    it('tauline propertime --model full stops with exit 2 when the lunar orbit hits the Moon', async () => {
      const r = await run(
        `--state=${lunarState(500)}`,
        '--duration',
        '86400',
        '--step',
        '43200',
        '--model',
        'full',
        '--epoch',
        EPOCH_TT,
      );
      expect(r.status).toBe(2);
      expect(r.err).toMatch(/hits the Moon/);
    });
  });
});
