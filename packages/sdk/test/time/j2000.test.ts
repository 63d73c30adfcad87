import { InvalidArgumentError } from '@tauline/sdk/errors';
import {
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  type Instant,
  instantFromTtSecondsSinceJ2000,
  J2000_EPOCH,
  ttSecondsSinceJ2000,
} from '@tauline/sdk/time';
import { describe, expect, it } from 'vitest';
import { requireEpochInstant } from '../../src/time/j2000.js';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);

describe('J2000_EPOCH', () => {
  it('J2000_EPOCH is 2000-01-01T12:00:00 TT = JD 2451545.0 TT = 2000-01-01T11:59:27.816 TAI (IAU 1976 definition of J2000.0; TT − TAI = 32.184 s, IERS Conventions 2010 §1.2 [M])', () => {
    expect(ts.formatIso(J2000_EPOCH, { scale: 'TT', fractionDigits: 12 })).toBe('2000-01-01T12:00:00.000000000000');
    expect(ts.formatIso(J2000_EPOCH, { scale: 'TAI', fractionDigits: 12 })).toBe('2000-01-01T11:59:27.816000000000');
    const jd = ts.toJd(J2000_EPOCH, 'TT');
    expect(jd.day).toBe(2_451_545);
    expect(jd.fraction).toBeLessThan(1e-15);
    expect(J2000_EPOCH.equals(ts.parseIso('2000-01-01T12:00:00', 'TT'))).toBe(true);
  });
});

describe('ttSecondsSinceJ2000', () => {
  it('ttSecondsSinceJ2000(2025-05-08T18:13:20 TT) is 8e8 s (800 000 000 s = 9259 d 6 h 13 min 20 s after 2000-01-01T12:00:00 TT, Python datetime [C])', () => {
    expect(ttSecondsSinceJ2000(ts.parseIso('2025-05-08T18:13:20', 'TT'))).toBe(8e8);
    expect(ttSecondsSinceJ2000(J2000_EPOCH)).toBe(0);
  });

  it('ttSecondsSinceJ2000(instantFromTtSecondsSinceJ2000(s)) returns s for whole and fractional seconds across ±1e10 s', () => {
    for (const s of [0, 8e8, -4.5e8, 725_803_200, 8.1e8 + 0.3, 1e10, -123.456]) {
      expect(ttSecondsSinceJ2000(instantFromTtSecondsSinceJ2000(s))).toBe(s);
    }
  });

  it('ttSecondsSinceJ2000 refuses what is not an Instant, and instantFromTtSecondsSinceJ2000 a non-finite number', () => {
    expect(() => ttSecondsSinceJ2000(8e8 as unknown as Instant)).toThrow(InvalidArgumentError);
    expect(() => instantFromTtSecondsSinceJ2000(Number.NaN)).toThrow(InvalidArgumentError);
  });
});

describe('requireEpochInstant (internal: the epoch check of the orbit and relativity entry points)', () => {
  it('requireEpochInstant(argument, instant) returns the same Instant', () => {
    const at = ts.parseIso('2027-03-01T00:00:00', 'TT');
    expect(requireEpochInstant('epoch', at)).toBe(at);
  });

  it('requireEpochInstant refuses a number and an omitted epoch naming the argument, with the hint how to build one', () => {
    for (const [value, expected] of [
      [8.1e8, 'an Instant, not a number of seconds'],
      [undefined, 'an Instant (required)'],
    ] as const) {
      let error: unknown;
      try {
        requireEpochInstant('options.epoch', value);
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(InvalidArgumentError);
      const e = error as InvalidArgumentError;
      expect(e.argument).toBe('options.epoch');
      expect(e.expected).toBe(expected);
      expect(e.hint).toContain('instantFromTtSecondsSinceJ2000(seconds)');
    }
  });

  it('requireEpochInstant refuses an ISO string or a plain object with the generic Instant message', () => {
    expect(() => requireEpochInstant('epoch', '2027-03-01T00:00:00')).toThrow(/epoch must be an Instant \(build one/);
    expect(() => requireEpochInstant('epoch', { taiSeconds: 8e8, taiFraction: 0 })).toThrow(InvalidArgumentError);
  });

  it("the hint's own recipe works: parseIso('2027-03-01T00:00:00', 'TT') is 857 131 200 s after J2000.0 (9920.5 d, Python datetime [C])", () => {
    expect(ttSecondsSinceJ2000(ts.parseIso('2027-03-01T00:00:00', 'TT'))).toBe(857_131_200);
  });
});
