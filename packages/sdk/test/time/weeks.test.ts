import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError, OutOfDomainError } from '../../src/errors.js';
import {
  BROADCAST_WEEK_BITS,
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  type Instant,
  instantFromWeekSeconds,
  resolveBroadcastWeek,
  resolveBroadcastWeekNear,
  type WeekSystem,
  weekSecondsFromInstant,
} from '../../src/time/index.js';

const SEED = 20261202;
const ts = createTimeScales(BUNDLED_LEAP_SECONDS);

describe('GNSS weeks', () => {
  it('weekSecondsFromInstant(1980-01-06T00:00:00Z, GPS) is week 0, 0 s (GPS epoch; IS-GPS-200 [M], common practice)', () => {
    expect(weekSecondsFromInstant(ts.parseIso('1980-01-06T00:00:00Z'), 'GPS')).toEqual({
      week: 0,
      secondsOfWeek: 0,
      wholeSecondsOfWeek: 0,
      fractionOfSecond: 0,
    });
  });

  it('weekSecondsFromInstant(2016-12-31T23:59:60Z, GPS) is week 1930, 17 s (GPS − UTC was 17 s in the leap second)', () => {
    // 2017-01-01 is a Sunday, so the GPS week starts at 2017-01-01T00:00:00 GPS = 2016-12-31T23:59:43 UTC.
    expect(ts.toWeekSeconds(ts.parseIso('2016-12-31T23:59:60Z'), 'GPS').secondsOfWeek).toBe(17);
    expect(ts.toWeekSeconds(ts.parseIso('2017-01-01T00:00:00Z'), 'GPS')).toMatchObject({
      week: 1930,
      secondsOfWeek: 18,
    });
  });

  it('weekSecondsFromInstant gives GST week = GPS week − 1024 and BDT week = GPS week − 1356 with BDT seconds 14 s behind', () => {
    const t = ts.parseIso('2024-03-06T12:00:00.25Z');
    const gps = weekSecondsFromInstant(t, 'GPS');
    const gst = weekSecondsFromInstant(t, 'GST');
    const bdt = weekSecondsFromInstant(t, 'BDT');
    expect(gst).toEqual({ ...gps, week: gps.week - 1024 });
    expect(bdt.week).toBe(gps.week - 1356);
    expect(bdt.secondsOfWeek).toBe(gps.secondsOfWeek - 14);
    expect(gps.fractionOfSecond).toBe(0.25);
  });

  it('instantFromWeekSeconds(system, week, sow, fractionOfSecond) adds the split fraction exactly', () => {
    const a = instantFromWeekSeconds('GPS', 2300, 345_600, 1e-12);
    const b = instantFromWeekSeconds('GPS', 2300, 345_600);
    expect(a.secondsSince(b)).toBeCloseTo(1e-12, 25);
  });

  it('instantFromWeekSeconds ∘ weekSecondsFromInstant is the identity (property, all three systems)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom<WeekSystem>('GPS', 'GST', 'BDT'),
        fc.integer({ min: 0, max: 4000 }),
        fc.integer({ min: 0, max: 604_799 }),
        fc.double({ min: 0, max: 1, maxExcluded: true, noNaN: true }),
        (system, week, whole, fraction) => {
          const t = instantFromWeekSeconds(system, week, whole, fraction);
          const back = weekSecondsFromInstant(t, system);
          return back.week === week && back.wholeSecondsOfWeek === whole && back.fractionOfSecond === fraction;
        },
      ),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('resolveBroadcastWeek resolves 10-bit GPS weeks across the 1999 and 2019 rollovers', () => {
    expect(resolveBroadcastWeek(0, 10, 1023)).toBe(1024);
    expect(resolveBroadcastWeek(1023, 10, 1024)).toBe(1023);
    expect(resolveBroadcastWeek(0, 10, 2040)).toBe(2048);
    expect(resolveBroadcastWeek(5, 10, 0)).toBe(5);
    expect(resolveBroadcastWeek(1020, 10, 0)).toBe(1020); // no negative weeks: the later candidate is taken
    expect(resolveBroadcastWeek(512, 10, 0)).toBe(512); // tie (half a period) takes the later week
  });

  it('resolveBroadcastWeek(w mod 2^bits, bits, ref) returns w whenever |w − ref| < 2^(bits−1) (property)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(8, 10, 12, 13),
        fc.integer({ min: 0, max: 20_000 }),
        fc.double({ min: -0.499, max: 0.499, noNaN: true }),
        (bits, week, relative) => {
          const modulus = 2 ** bits;
          const reference = Math.max(0, week + Math.trunc(relative * modulus));
          return resolveBroadcastWeek(week % modulus, bits, reference) === week;
        },
      ),
      { seed: SEED, numRuns: 500 },
    );
  });

  it("resolveBroadcastWeekNear(system, week, bits, reference) uses the reference instant's week; ts.resolveBroadcastWeek is the same", () => {
    const reference = ts.parseIso('2019-04-01T00:00:00Z');
    expect(resolveBroadcastWeekNear('GPS', 3, BROADCAST_WEEK_BITS.gpsLnav, reference)).toBe(2051);
    expect(ts.resolveBroadcastWeek('GST', 1000, BROADCAST_WEEK_BITS.galileo, reference)).toBe(1000);
  });

  describe('throw paths', () => {
    it('weekSecondsFromInstant rejects an unknown system, a non-Instant and a time before week 0', () => {
      const t = ts.parseIso('2020-01-01T00:00:00Z');
      expect(() => weekSecondsFromInstant(t, 'GLO' as WeekSystem)).toThrow(/system must be one of 'GPS', 'GST', 'BDT'/);
      expect(() => weekSecondsFromInstant({} as Instant, 'GPS')).toThrow(/instant must be an Instant/);
      expect(() => weekSecondsFromInstant(ts.parseIso('2005-12-31T23:59:59Z'), 'BDT')).toThrow(OutOfDomainError);
      expect(() => weekSecondsFromInstant(ts.parseIso('1980-01-05T23:59:59Z'), 'GPS')).toThrow(
        /GPS weeks are counted from that epoch/,
      );
    });
    it('instantFromWeekSeconds rejects negative or fractional weeks, seconds of week ≥ 604800 (with a hint), negative or NaN seconds, and a bad fraction', () => {
      expect(() => instantFromWeekSeconds('GPS', -1, 0)).toThrow(/week must be an integer in \[0, 1000000\]/);
      expect(() => instantFromWeekSeconds('GPS', 1.5, 0)).toThrow(/week/);
      expect(() => instantFromWeekSeconds('GPS', 1, 604_800)).toThrow(
        /secondsOfWeek must be in \[0, 604800\) s; received 604800. carry whole weeks/,
      );
      expect(() => instantFromWeekSeconds('GPS', 1, -0.5)).toThrow(/secondsOfWeek/);
      expect(() => instantFromWeekSeconds('GPS', 1, Number.NaN)).toThrow(/secondsOfWeek must be a finite number/);
      expect(() => instantFromWeekSeconds('GPS', 1, 0, 1)).toThrow(/fractionOfSecond/);
      expect(() => instantFromWeekSeconds('GPS', 1, 0, Number.NaN)).toThrow(/fractionOfSecond/);
      expect(() => instantFromWeekSeconds('QZS' as WeekSystem, 1, 0)).toThrow(InvalidArgumentError);
    });
    it('resolveBroadcastWeek rejects a broadcast week outside [0, 2^bits), bad bits and a negative reference', () => {
      expect(() => resolveBroadcastWeek(1024, 10, 2000)).toThrow(/broadcastWeek must be an integer in \[0, 1023\]/);
      expect(() => resolveBroadcastWeek(-1, 10, 2000)).toThrow(/broadcastWeek/);
      expect(() => resolveBroadcastWeek(1, 0, 2000)).toThrow(/bits/);
      expect(() => resolveBroadcastWeek(1, 10.5, 2000)).toThrow(/bits/);
      expect(() => resolveBroadcastWeek(1, 10, -5)).toThrow(/referenceWeek/);
    });
  });
});
