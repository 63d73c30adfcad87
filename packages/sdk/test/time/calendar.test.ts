import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import {
  calendarDateFromMjd,
  daysInMonth,
  isGregorianLeapYear,
  MAX_MJD,
  MIN_MJD,
  mjdFromCalendarDate,
} from '../../src/time/index.js';

const SEED = 20261202;

describe('calendar', () => {
  it('mjdFromCalendarDate(y, m, d) agrees with ECMAScript Date.UTC day counts (independent implementation [C]) for years 1..9999', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 9999 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 31 }),
        (year, month, dayRaw) => {
          const day = Math.min(dayRaw, daysInMonth(year, month));
          const date = new Date(0);
          date.setUTCFullYear(year, month - 1, day);
          const viaDate = date.getTime() / 86_400_000 + 40_587;
          return (
            mjdFromCalendarDate(year, month, day) === viaDate &&
            JSON.stringify(calendarDateFromMjd(viaDate)) === JSON.stringify({ year, month, day })
          );
        },
      ),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it('calendarDateFromMjd(mjd) inverts mjdFromCalendarDate at the calendar limits', () => {
    expect(calendarDateFromMjd(MIN_MJD)).toEqual({ year: 1, month: 1, day: 1 });
    expect(calendarDateFromMjd(MAX_MJD)).toEqual({ year: 9999, month: 12, day: 31 });
    expect(mjdFromCalendarDate(1, 1, 1)).toBe(MIN_MJD);
  });

  it('isGregorianLeapYear(y) follows the 4/100/400 rule', () => {
    expect([1900, 2000, 2016, 2019, 2100].map(isGregorianLeapYear)).toEqual([false, true, true, false, false]);
    expect([daysInMonth(2016, 2), daysInMonth(2100, 2), daysInMonth(2017, 4), daysInMonth(2017, 12)]).toEqual([
      29, 28, 30, 31,
    ]);
  });

  describe('throw paths', () => {
    it('mjdFromCalendarDate rejects 31 February, 29 February of a common year (with a hint), month 13 and year 0', () => {
      expect(() => mjdFromCalendarDate(2017, 2, 31)).toThrow(
        /day must be an integer in \[1, 28\] for 2017-02; received 31/,
      );
      expect(() => mjdFromCalendarDate(2100, 2, 29)).toThrow(/2100 is not a leap year/);
      expect(() => mjdFromCalendarDate(2017, 13, 1)).toThrow(/month/);
      expect(() => mjdFromCalendarDate(0, 1, 1)).toThrow(/year/);
      expect(() => mjdFromCalendarDate(2017, 1, Number.NaN)).toThrow(InvalidArgumentError);
    });
    it('daysInMonth rejects a non-integer year or a month outside 1..12', () => {
      expect(() => daysInMonth(2017.5, 1)).toThrow(/year/);
      expect(() => daysInMonth(2017, 0)).toThrow(/month/);
    });
    it('calendarDateFromMjd rejects a non-integer MJD or one outside years 1..9999', () => {
      expect(() => calendarDateFromMjd(51544.5)).toThrow(/mjd/);
      expect(() => calendarDateFromMjd(MAX_MJD + 1)).toThrow(InvalidArgumentError);
    });
  });
});
