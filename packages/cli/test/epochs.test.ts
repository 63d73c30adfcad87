/**
 * `src/epochs.ts`: absolute epochs read from flags and printed as stamps. Offsets between scales: GPS = TAI − 19 s
 * (IS-GPS-200 [M]); GPS − UTC = 18 s since 2017-01-01 (IERS Bulletin C [M]); BDT = GPS − 14 s (BDS ICD [M]).
 */
import { readFileSync } from 'node:fs';
import { InvalidArgumentError } from '@tauline/sdk/errors';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '@tauline/sdk/time';
import { describe, expect, it } from 'vitest';
import { epochFormat, gapsJson, parseStampFlag, stampOf, timeSystemJson } from '../src/epochs.js';
import { UsageError } from '../src/framework.js';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const gpsAt = (iso: string) => ts.parseIso(iso, 'GPS');

describe('parseStampFlag', () => {
  it('parseStampFlag(flag, text) reads GPS time by default, UTC with Z, and a code after the stamp', () => {
    const at = gpsAt('2026-02-02T01:00:00');
    expect(parseStampFlag('--x', '2026-02-02T01:00:00')).toEqual({ instant: at, scale: 'GPS' });
    expect(parseStampFlag('--x', '2026-02-02T01:00:00 GPS').instant.secondsSince(at)).toBe(0);
    expect(parseStampFlag('--x', '2026-02-02T00:59:42Z')).toMatchObject({ scale: 'UTC' });
    expect(parseStampFlag('--x', '2026-02-02T00:59:42Z').instant.secondsSince(at)).toBe(0);
    expect(parseStampFlag('--x', '2026-02-02T00:59:42 UTC').instant.secondsSince(at)).toBe(0);
    expect(parseStampFlag('--x', '2026-02-02T00:59:46 BDT')).toMatchObject({ scale: 'BDT' });
    expect(parseStampFlag('--x', '2026-02-02T00:59:46 BDT').instant.secondsSince(at)).toBe(0);
    expect(parseStampFlag('--x', '2026-02-02T01:00:19 TAI').instant.secondsSince(at)).toBe(0);
  });

  it('parseStampFlag refuses a count of seconds, a GLONASS-time stamp and an unknown code with a UsageError naming the flag', () => {
    for (const text of ['1454150000', '-3600', '1.5e9', '2026-02-02T01:00:00 GLO', '2026-02-02T01:00:00 IRN']) {
      expect(() => parseStampFlag('--predict', text), text).toThrow(UsageError);
      expect(() => parseStampFlag('--predict', text), text).toThrow(/^--predict /);
    }
  });

  it('parseStampFlag(flag, a date that does not exist) is the SDK InvalidArgumentError renamed to the flag', () => {
    let caught: unknown;
    try {
      parseStampFlag('--reference-epoch', '2027-02-30T00:00:00');
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InvalidArgumentError);
    expect((caught as InvalidArgumentError).argument).toBe('--reference-epoch');
  });
});

describe('stampOf and epochFormat', () => {
  it('stampOf(instant, scale) reads one instant on GPS, GAL, BDT and UTC; past the leap-second table a UTC stamp is given on GPS time', () => {
    const at = gpsAt('2026-02-02T01:00:00');
    expect(stampOf(at, 'GPS')).toEqual({ iso: '2026-02-02T01:00:00', scale: 'GPS' });
    expect(stampOf(at, 'GAL')).toEqual({ iso: '2026-02-02T01:00:00', scale: 'GAL' });
    expect(stampOf(at, 'BDT')).toEqual({ iso: '2026-02-02T00:59:46', scale: 'BDT' });
    expect(stampOf(at, 'UTC')).toEqual({ iso: '2026-02-02T00:59:42', scale: 'UTC' });
    // The bundled table is valid until 2027-06-28 (packages/sdk/src/time/leap-seconds.ts).
    expect(stampOf(gpsAt('2027-07-03T21:20:18'), 'UTC')).toEqual({ iso: '2027-07-03T21:20:18', scale: 'GPS' });
  });

  it('epochFormat(a RINEX record on its first epoch) prints seconds since it as stamps; a text record prints seconds', () => {
    const epoch = gpsAt('2026-02-02T00:00:00');
    const rinex = epochFormat({ epoch, timeSystem: 'GPS' });
    expect(rinex.text(45000)).toBe('2026-02-02T12:30:00 GPS');
    expect(rinex.cell(45000)).toBe('2026-02-02T12:30:00');
    expect(rinex.column).toBe('epoch (GPS)');
    expect(epochFormat({ epoch, timeSystem: undefined }).text(0)).toBe('2026-02-02T00:00:00 (time system not stated)');
    const text = epochFormat({ epoch: undefined, timeSystem: undefined });
    expect([text.text(750000), text.column]).toEqual(['750000 s', 'epoch (s)']);
  });

  it('gapsJson and timeSystemJson give plain JSON fields (no Instant) and say when a time system is assumed', () => {
    const epoch = gpsAt('2026-02-02T00:00:00');
    const gap = { index: 150, missing: 1, line: 162, time: 45000, epoch: epoch.plus(45000) };
    expect(gapsJson([gap], (t) => stampOf(epoch.plus(t), 'GPS'))).toEqual([
      { index: 150, missing: 1, line: 162, time: 45000, timeStamp: { iso: '2026-02-02T12:30:00', scale: 'GPS' } },
    ]);
    expect(gapsJson([{ index: 3, missing: 2, line: 9, time: undefined }])).toEqual([{ index: 3, missing: 2, line: 9 }]);
    expect(timeSystemJson({ epoch, timeSystem: 'GAL' })).toEqual({ timeSystem: 'GAL' });
    expect(timeSystemJson({ epoch, timeSystem: undefined })).toEqual({ timeSystemAssumed: true });
    expect(timeSystemJson({ epoch: undefined, timeSystem: undefined })).toEqual({});
  });

  it('src/epochs.ts and src/records.ts use the time module, not the deprecated io helpers of the 1980 count', () => {
    for (const file of ['epochs.ts', 'records.ts', 'clock-output.ts', 'commands/clock.ts', 'commands/stability.ts']) {
      const text = readFileSync(new URL(`../src/${file}`, import.meta.url), 'utf8');
      expect(text, file).not.toMatch(/scaleSecondsFromFields|fieldsFromScaleSeconds|formatEpochFields|1980/);
    }
  });
});
