import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  BUNDLED_LEAP_SECONDS,
  calendarDateFromMjd,
  createTimeScales,
  daysInMonth,
  Instant,
  TIME_SCALES,
  type TimeScale,
} from '../../src/time/index.js';

const SEED = 20261202;
const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/** Leap-second days of the bundled table (MJD of the day that ends with 23:59:60). */
const leapDays = BUNDLED_LEAP_SECONDS.entries.slice(1).map((e) => e.mjd - 1);

/** Valid UTC ISO text with 9 fraction digits, 1972-01-01 .. 2027-06-27, including every leap second. */
const utcIsoArb = fc.oneof(
  fc
    .record({
      year: fc.integer({ min: 1972, max: 2026 }),
      month: fc.integer({ min: 1, max: 12 }),
      day: fc.integer({ min: 1, max: 31 }),
      hour: fc.integer({ min: 0, max: 23 }),
      minute: fc.integer({ min: 0, max: 59 }),
      second: fc.integer({ min: 0, max: 59 }),
      nanos: fc.integer({ min: 0, max: 999_999_999 }),
    })
    .map(
      (f) =>
        `${f.year}-${pad(f.month)}-${pad(Math.min(f.day, daysInMonth(f.year, f.month)))}T${pad(f.hour)}:${pad(f.minute)}:` +
        `${pad(f.second)}.${pad(f.nanos, 9)}Z`,
    ),
  fc
    .record({ mjd: fc.constantFrom(...leapDays), nanos: fc.integer({ min: 0, max: 999_999_999 }) })
    .map(({ mjd, nanos }) => {
      const d = calendarDateFromMjd(mjd);
      return `${d.year}-${pad(d.month)}-${pad(d.day)}T23:59:60.${pad(nanos, 9)}Z`;
    }),
);

/** Instants inside the bundled table's UTC validity, with arbitrary fractions. */
const utcInstantArb = fc
  .record({
    whole: fc.integer({ min: ts.utcValidFrom.taiSeconds, max: ts.utcValidUntil.taiSeconds - 1 }),
    fraction: fc.double({ min: 0, max: 1, maxExcluded: true, noNaN: true }),
  })
  .map(({ whole, fraction }) => Instant.fromTaiParts(whole, fraction));

describe('time-scale properties (fast-check, seed 20261202)', () => {
  it('ts.formatIso(ts.parseIso(text)) returns the UTC text unchanged (9 digits, leap seconds included)', () => {
    fc.assert(
      fc.property(utcIsoArb, (text) => ts.formatIso(ts.parseIso(text)) === text),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it('ts.parseIso(local text with ±hh:mm) equals the UTC text found independently with Date.UTC arithmetic', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: Date.UTC(1972, 0, 2) / 1000, max: Date.UTC(2027, 5, 26) / 1000 }),
        fc.integer({ min: -14 * 60, max: 14 * 60 }),
        (unixSeconds, offsetMinutes) => {
          const utcText = `${new Date(unixSeconds * 1000).toISOString().slice(0, 19)}Z`;
          const local = new Date((unixSeconds + offsetMinutes * 60) * 1000).toISOString().slice(0, 19);
          const sign = offsetMinutes < 0 ? '-' : '+';
          const abs = Math.abs(offsetMinutes);
          const localText = `${local}${sign}${pad(Math.floor(abs / 60))}:${pad(abs % 60)}`;
          return ts.parseIso(localText).equals(ts.parseIso(utcText));
        },
      ),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('TAI → UTC → TAI: ts.fromCalendar(ts.toCalendar(t, UTC), UTC) returns t to 1e-14 s, and via 12-digit ISO text to 5e-13 s', () => {
    fc.assert(
      fc.property(utcInstantArb, (t) => {
        const viaFields = ts.fromCalendar(ts.toCalendar(t, 'UTC'), 'UTC');
        const viaText = ts.parseIso(ts.formatIso(t, { fractionDigits: 12 }));
        return viaFields.equals(t, 1e-14) && viaText.equals(t, 5e-13);
      }),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it('every scale: calendar round trip to 1e-13 s, MJD and JD round trips to 3e-11 s (the resolution of a fraction of day)', () => {
    fc.assert(
      fc.property(utcInstantArb, fc.constantFrom<TimeScale>(...TIME_SCALES), (t, scale) => {
        const calendar = ts.fromCalendar(ts.toCalendar(t, scale), scale);
        const mjd = ts.toMjd(t, scale);
        const jd = ts.toJd(t, scale);
        return (
          calendar.equals(t, 1e-13) &&
          ts.fromMjd(scale, mjd.day, mjd.fraction).equals(t, 3e-11) &&
          ts.fromJd(scale, jd.day, jd.fraction).equals(t, 3e-11) &&
          mjd.fraction >= 0 &&
          mjd.fraction < 1 &&
          jd.fraction >= 0 &&
          jd.fraction < 1
        );
      }),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it('monotonicity across every leap second: later instants never print earlier UTC text or a smaller UTC MJD', () => {
    const leapInstants = leapDays.map((mjd) => {
      const d = calendarDateFromMjd(mjd);
      return ts.fromCalendar({ year: d.year, month: d.month, day: d.day, hour: 23, minute: 59, second: 60 }, 'UTC');
    });
    fc.assert(
      fc.property(
        fc.constantFrom(...leapInstants),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: -3, max: 3, noNaN: true }),
        (leap, da, db) => {
          const [a, b] = [leap.plus(Math.min(da, db)), leap.plus(Math.max(da, db))];
          const [ta, tb] = [ts.formatIso(a, { fractionDigits: 12 }), ts.formatIso(b, { fractionDigits: 12 })];
          const [ma, mb] = [ts.toMjd(a, 'UTC'), ts.toMjd(b, 'UTC')];
          return ta <= tb && (ma.day < mb.day || (ma.day === mb.day && ma.fraction <= mb.fraction));
        },
      ),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it('every leap second in the bundled table makes its UTC day 86 401 s long', () => {
    for (const mjd of leapDays) {
      const d = calendarDateFromMjd(mjd);
      const start = ts.fromCalendar({ year: d.year, month: d.month, day: d.day }, 'UTC');
      const next = calendarDateFromMjd(mjd + 1);
      const end = ts.fromCalendar({ year: next.year, month: next.month, day: next.day }, 'UTC');
      expect(end.secondsSince(start)).toBe(86_401);
    }
  });
});
