/**
 * `createTimeScales(table)`: every conversion between time scales, calendar text, MJD/JD and
 * GNSS weeks, bound to one explicit leap-second table (never a global). The conversions live in
 * `calendar-readings.ts` (calendar fields, ISO text) and `utc-table.ts` (the table lookups).
 *
 * @module
 */

import { TT_MINUS_TAI } from '../constants.js';
import { InvalidArgumentError, OutOfDomainError } from '../errors.js';
import { requireFinite } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import { MAX_MJD, MIN_MJD } from './calendar.js';
import { formatIso, fromCalendar, parseIso, toCalendar } from './calendar-readings.js';
import { Instant, requireInstant } from './instant.js';
import { requireScale } from './iso-text.js';
import { defineLeapSecondTable, type LeapSecondTable } from './leap-seconds.js';
import type { SplitDays, TimeScales } from './scales-types.js';
import { normalize } from './split.js';
import { type TimeScale, tcgMinusTtAt, uniformMinusTai } from './uniform.js';
import { splitDays, UtcTable } from './utc-table.js';
import { instantFromWeekSeconds, resolveBroadcastWeekNear, weekSecondsFromInstant } from './weeks.js';

export type {
  CalendarDateTime,
  CalendarDateTimeInput,
  FormatIsoOptions,
  SplitDays,
  TimeScales,
} from './scales-types.js';

/** MJD of an instant read on `scale`; the fraction is (seconds of day)/(length of that day). */
function toMjd(utc: UtcTable, instant: Instant, scale: TimeScale): SplitDays {
  requireInstant('instant', instant);
  requireScale('scale', scale);
  const label = utc.labelOf(instant, scale);
  // MJD = day + (seconds of day)/(length of day) (MJD = JD − 2400000.5, definition [M]).
  const fraction = (label.secondOfDay + label.fraction) / utc.dayLengthOn(scale, label.day);
  return splitDays(label.day, fraction);
}

/** The instant of a split MJD (`day` + `dayFraction`, either may carry a fraction) read on `scale`. */
function instantOfSplitMjd(
  utc: UtcTable,
  scale: TimeScale,
  day: number,
  dayFraction: number,
  received: unknown,
): Instant {
  const split = normalize(day, dayFraction);
  if (split.whole < MIN_MJD || split.whole > MAX_MJD) {
    throw new OutOfDomainError('mjd', received, '0001-01-01', '9999-12-31', 'outside the four-digit calendar');
  }
  if (scale === 'UTC') utc.requireUtcDay('mjd', received, split.whole);
  const length = utc.dayLengthOn(scale, split.whole);
  const seconds = split.fraction * length;
  const whole = Math.floor(seconds);
  // Rounding can give exactly the day length; that is 00:00:00 of the next day.
  if (whole >= length)
    return utc.instantOfLabel(scale, { day: split.whole + 1, secondOfDay: 0, fraction: 0 }, 'mjd', received);
  return utc.instantOfLabel(
    scale,
    { day: split.whole, secondOfDay: whole, fraction: seconds - whole },
    'mjd',
    received,
  );
}

function fromMjd(utc: UtcTable, scale: TimeScale, mjd: number, fraction = 0): Instant {
  requireScale('scale', scale);
  const days = requireFinite('mjd', mjd, 'a finite Modified Julian Date (days)');
  const extra = requireFinite('fraction', fraction, 'a finite number of days');
  if (Math.abs(days) > 1e7 || Math.abs(extra) > 1e7)
    throw new InvalidArgumentError('mjd', mjd, 'a date within years 1..9999 (|MJD| < 1e7)');
  return instantOfSplitMjd(utc, scale, Math.floor(days), days - Math.floor(days) + extra, { mjd, fraction });
}

function toJd(utc: UtcTable, instant: Instant, scale: TimeScale): SplitDays {
  const mjd = toMjd(utc, instant, scale);
  // JD = MJD + 2400000.5 (definition of the MJD [M]).
  return splitDays(mjd.day + 2_400_000, mjd.fraction + 0.5);
}

function fromJd(utc: UtcTable, scale: TimeScale, jd: number, fraction = 0): Instant {
  requireScale('scale', scale);
  const days = requireFinite('jd', jd, 'a finite Julian Date (days)');
  const extra = requireFinite('fraction', fraction, 'a finite number of days');
  if (Math.abs(days - 2_400_000) > 1e7 || Math.abs(extra) > 1e7)
    throw new InvalidArgumentError('jd', jd, 'a date within years 1..9999');
  // MJD = JD − 2400000.5 = (⌊JD⌋ − 2400001) + (JD − ⌊JD⌋ + 0.5)
  const whole = Math.floor(days);
  return instantOfSplitMjd(utc, scale, whole - 2_400_001, days - whole + 0.5 + extra, { jd, fraction });
}

/** Reading − TAI split into a constant and a varying part, so TCG − TT loses nothing to 32.184. */
function readingMinusTai(utc: UtcTable, scale: TimeScale, instant: Instant): [number, number] {
  if (scale === 'UTC') return [0, -utc.taiMinusUtc(instant)];
  if (scale === 'TCG') return [TT_MINUS_TAI, tcgMinusTtAt(instant)];
  return [uniformMinusTai(scale), 0];
}

function offset(utc: UtcTable, scale: TimeScale, reference: TimeScale, instant: Instant): Seconds {
  requireScale('scale', scale);
  requireScale('reference', reference);
  requireInstant('instant', instant);
  const [constA, varA] = readingMinusTai(utc, scale, instant);
  const [constB, varB] = readingMinusTai(utc, reference, instant);
  return constA - constB + (varA - varB);
}

/**
 * Builds the {@link TimeScales} for one leap-second table.
 *
 * @param table A table from {@link defineLeapSecondTable}, {@link parseLeapSecondsList} or
 *   `BUNDLED_LEAP_SECONDS` (valid until 2027-06-28; pass a current table for later dates).
 * @returns A frozen object of conversion functions.
 * @throws {InvalidArgumentError} if `table` is not a valid table (it is re-validated).
 * @example
 * const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
 * const t = ts.parseIso('2016-12-31T23:59:60Z');
 * ts.taiMinusUtc(t);                  // 36
 * ts.toWeekSeconds(t, 'GPS');         // { week: 1930, secondsOfWeek: 17, ... }
 * ts.formatIso(t, { scale: 'TT' });   // '2017-01-01T00:01:08.184000000'
 */ export function createTimeScales(table: LeapSecondTable): TimeScales {
  const utc = new UtcTable(defineLeapSecondTable(table));
  const scales: TimeScales = {
    leapSeconds: utc.leapSeconds,
    utcValidFrom: Instant.fromNormalized(utc.validFromTai, 0),
    utcValidUntil: Instant.fromNormalized(utc.validUntilTai, 0),
    taiMinusUtc: (instant: Instant): Seconds => utc.taiMinusUtc(requireInstant('instant', instant)),
    offset: (scale: TimeScale, reference: TimeScale, instant: Instant) => offset(utc, scale, reference, instant),
    isLeapSecond: (instant: Instant): boolean => utc.utcLabel(requireInstant('instant', instant)).secondOfDay >= 86_400,
    fromCalendar: (fields, scale) => fromCalendar(utc, fields, scale),
    toCalendar: (instant, scale) => toCalendar(utc, instant, scale),
    parseIso: (text, scale) => parseIso(utc, text, scale),
    formatIso: (instant, options) => formatIso(utc, instant, options),
    toMjd: (instant, scale) => toMjd(utc, instant, scale),
    fromMjd: (scale, mjd, fraction) => fromMjd(utc, scale, mjd, fraction),
    toJd: (instant, scale) => toJd(utc, instant, scale),
    fromJd: (scale, jd, fraction) => fromJd(utc, scale, jd, fraction),
    toWeekSeconds: weekSecondsFromInstant,
    fromWeekSeconds: instantFromWeekSeconds,
    resolveBroadcastWeek: resolveBroadcastWeekNear,
  };
  return Object.freeze(scales);
}
