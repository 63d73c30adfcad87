// Epochs as files write them (time/file-epochs.ts): calendar fields on a file's time system → Instant → text.
// Independent side: JavaScript's Date.UTC counts the days (proleptic Gregorian, no leap seconds), and the
// scale offsets are the published ones: GPS time = TAI − 19 s and Galileo System Time = TAI − 19 s (BIPM
// "GPS time is 19 seconds behind TAI" [V2]; Galileo OS SIS ICD §5.1.2 as quoted [V2]), BeiDou Time = TAI − 33 s
// (BDS ICD as quoted [V2]), GLONASS time = UTC + 3 h (GLONASS ICD [M]), TAI − UTC = 36 s before and 37 s after
// the leap second 2016-12-31T23:59:60Z (IERS Bulletin C 52 [V2]).
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import {
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  fileTimeScale,
  formatFileEpoch,
  Instant,
  instantFromFileEpoch,
  instantFromScaleSeconds,
  scaleSecondsFromInstant,
} from '../../src/time/index.js';

/** The former float count: seconds since 1980-01-06T00:00:00 of the same uniform scale as one double (Date.UTC days, no leap seconds). */
const floatCountSince1980 = (f: {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}) => (Date.UTC(f.year, f.month - 1, f.day, f.hour, f.minute) - Date.UTC(1980, 0, 6)) / 1000 + f.second;

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
/** Whole seconds from 2000-01-01T00:00:00 to the date, by Date.UTC (independent of the SDK calendar). */
const secondsSince2000 = (y: number, m: number, d: number, h = 0, min = 0, s = 0) =>
  (Date.UTC(y, m - 1, d, h, min, s) - Date.UTC(2000, 0, 1)) / 1000;

describe('instantFromFileEpoch: calendar fields on a file time system, exact', () => {
  it('instantFromFileEpoch(GPS fields with 1e-7 s) keeps the 1e-7 s to 1e-15 s, where the float count since 1980 loses it', () => {
    const at = { year: 2026, month: 1, day: 4, hour: 0, minute: 0, second: 0 };
    const later = { ...at, second: 0.0000001 };
    const t0 = instantFromFileEpoch(ts, at, 'GPS');
    const t1 = instantFromFileEpoch(ts, later, 'GPS');
    expect(t0.toJSON()).toEqual({ taiSeconds: secondsSince2000(2026, 1, 4) + 19, taiFraction: 0 });
    expect(Math.abs(t1.secondsSince(t0) - 1e-7)).toBeLessThan(1e-15);
    // The float form (seconds since 1980 as one double) resolves 2.4e-7 s at 1.45e9 s: 1e-7 s is lost.
    const floatStep = floatCountSince1980(later) - floatCountSince1980(at);
    expect(Math.abs(floatStep - 1e-7)).toBeGreaterThan(1e-8);
    expect(formatFileEpoch(ts, t1, 'GPS')).toBe('2026-01-04T00:00:00.0000001');
  });
  it("instantFromFileEpoch(GAL, BDT, QZS, TAI) applies each scale's published offset from TAI", () => {
    const f = { year: 2024, month: 1, day: 7, hour: 12, minute: 30, second: 15.25 };
    const base = secondsSince2000(2024, 1, 7, 12, 30, 15);
    const tai = (code: string) => {
      const i = instantFromFileEpoch(ts, f, code);
      return [i.taiSeconds, i.taiFraction];
    };
    expect(tai('GAL')).toEqual([base + 19, 0.25]);
    expect(tai('QZS')).toEqual([base + 19, 0.25]);
    expect(tai('BDT')).toEqual([base + 33, 0.25]);
    expect(tai('TAI')).toEqual([base, 0.25]);
  });
  it('instantFromFileEpoch(GLO 2017-01-01 02:59:60) is the UTC leap second 2016-12-31T23:59:60Z, and GLO prints 3 h ahead of UTC', () => {
    const glo = instantFromFileEpoch(ts, { year: 2017, month: 1, day: 1, hour: 2, minute: 59, second: 60 }, 'GLO');
    // 2016-12-31T23:59:60 UTC: TAI − UTC is still 36 s during the inserted second.
    expect(glo.toJSON()).toEqual({ taiSeconds: secondsSince2000(2016, 12, 31, 23, 59, 59) + 1 + 36, taiFraction: 0 });
    expect(formatFileEpoch(ts, glo, 'GLO')).toBe('2017-01-01T02:59:60');
    expect(formatFileEpoch(ts, glo, 'UTC')).toBe('2016-12-31T23:59:60');
    const utcNoon = instantFromFileEpoch(ts, { year: 2020, month: 6, day: 30, hour: 12, minute: 0, second: 0 }, 'UTC');
    expect(utcNoon.taiSeconds).toBe(secondsSince2000(2020, 6, 30, 12) + 37);
    expect(formatFileEpoch(ts, utcNoon, 'GLO')).toBe('2020-06-30T15:00:00');
    expect(
      formatFileEpoch(
        ts,
        instantFromFileEpoch(ts, { year: 2020, month: 6, day: 30, hour: 1, minute: 0, second: 0 }, 'GLO'),
        'UTC',
      ),
    ).toBe('2020-06-29T22:00:00');
  });
  it('instantFromFileEpoch refuses an unknown code, a non-date and a UTC second 60 outside a leap second, naming the field', () => {
    const ok = { year: 2026, month: 1, day: 4, hour: 0, minute: 0, second: 0 };
    expect(() => instantFromFileEpoch(ts, ok, 'IRN')).toThrow(InvalidArgumentError);
    expect(() => instantFromFileEpoch(ts, { ...ok, day: 32 }, 'GPS')).toThrow(/fields/);
    expect(() => instantFromFileEpoch(ts, { ...ok, second: 60 }, 'UTC')).toThrow(InvalidArgumentError);
    expect(fileTimeScale('GAL')).toEqual({ code: 'GAL', scale: 'GST', hoursAhead: 0 });
    expect(fileTimeScale('XYZ')).toBeUndefined();
  });
  it('formatFileEpoch(instant, code, { fractionDigits }) rounds half-up with carries; the default prints up to 1 ns and drops trailing zeros', () => {
    const t = instantFromFileEpoch(
      ts,
      { year: 2025, month: 12, day: 31, hour: 23, minute: 59, second: 59.9999999996 },
      'GPS',
    );
    expect(formatFileEpoch(ts, t, 'GPS')).toBe('2026-01-01T00:00:00');
    expect(formatFileEpoch(ts, t, 'GPS', { fractionDigits: 3 })).toBe('2026-01-01T00:00:00.000');
    // 59.7499999996 s rounds to 59.750000000 at 1 ns, printed without its trailing zeros.
    expect(formatFileEpoch(ts, t.plus(-0.25), 'GPS')).toBe('2025-12-31T23:59:59.75');
    expect(() => formatFileEpoch(ts, t, 'GPS', { fractionDigits: 10 })).toThrow(/fractionDigits/);
  });
});

describe('formatFileEpoch on uniform scales (integer arithmetic) agrees with TimeScales.formatIso', () => {
  it('formatFileEpoch(2000 seeded instants over years 1..9999, GPS/GAL/BDT/TAI) equals formatIso of the same scale, 9 and 3 digits', () => {
    let state = 20261203;
    const next = () => (state = (state * 1103515245 + 12345) % 2147483648) / 2147483648;
    const scaleOf: Record<string, 'GPS' | 'GST' | 'BDT' | 'TAI'> = { GPS: 'GPS', GAL: 'GST', BDT: 'BDT', TAI: 'TAI' };
    for (let k = 0; k < 2000; k++) {
      const instant = Instant.fromTaiParts(Math.floor((next() - 0.5) * 6.2e10), next());
      const code = ['GPS', 'GAL', 'BDT', 'TAI'][k % 4]!;
      const scale = scaleOf[code]!;
      expect(formatFileEpoch(ts, instant, code, { fractionDigits: 9 })).toBe(
        ts.formatIso(instant, { scale, fractionDigits: 9 }),
      );
      expect(formatFileEpoch(ts, instant, code, { fractionDigits: 3 })).toBe(
        ts.formatIso(instant, { scale, fractionDigits: 3 }),
      );
    }
  });
});

describe("scaleSecondsFromInstant / instantFromScaleSeconds: the broadcast algorithms' count since 1980-01-06", () => {
  it('scaleSecondsFromInstant(start of GPS week 2296) is 2296 × 604800 s, and BDT reads 14 s less (BDT = GPST − 14 s)', () => {
    const weekStart = instantFromFileEpoch(ts, { year: 2024, month: 1, day: 7, hour: 0, minute: 0, second: 0 }, 'GPS');
    // Date.UTC days from 1980-01-06 to 2024-01-07: 2296 whole weeks (the week of the SP3 fixture orbit-c-pv.sp3, line 2).
    expect((Date.UTC(2024, 0, 7) - Date.UTC(1980, 0, 6)) / 1000).toBe(2296 * 604_800);
    expect(scaleSecondsFromInstant(weekStart, 'GPS')).toBe(2296 * 604_800);
    expect(scaleSecondsFromInstant(weekStart, 'GST')).toBe(2296 * 604_800);
    expect(scaleSecondsFromInstant(weekStart, 'BDT')).toBe(2296 * 604_800 - 14);
    expect(instantFromScaleSeconds(2296 * 604_800 - 14, 'BDT').equals(weekStart)).toBe(true);
    expect(instantFromScaleSeconds(2296 * 604_800 + 0.5, 'GPS').secondsSince(weekStart)).toBe(0.5);
    expect(() => instantFromScaleSeconds(Number.NaN, 'GPS')).toThrow(InvalidArgumentError);
    expect(() => scaleSecondsFromInstant(Instant.fromTaiParts(0), 'UTC' as 'GPS')).toThrow(InvalidArgumentError);
  });
});
