/**
 * Proleptic Gregorian calendar arithmetic on Modified Julian Day numbers. Pure integer
 * arithmetic; no time scale is involved (a calendar date labels a day on whatever scale
 * the caller means).
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requireInteger } from '../internal/validate.js';

/** MJD of 1970-01-01 (the POSIX epoch day): MJD = JD − 2400000.5 with JD(1970-01-01T00:00) = 2440587.5 [C]. */
const MJD_OF_1970_01_01 = 40_587;

/** Earliest calendar year accepted by the SDK's calendar functions. */
export const MIN_CALENDAR_YEAR = 1;
/** Latest calendar year accepted by the SDK's calendar functions (four-digit ISO 8601 years). */
export const MAX_CALENDAR_YEAR = 9999;

/** A calendar date: year, month 1..12, day 1..31. */
export interface CalendarDate {
  readonly year: number;
  readonly month: number;
  readonly day: number;
}

/** True when `year` is a leap year of the Gregorian calendar (divisible by 4, except centuries not divisible by 400). */
export function isGregorianLeapYear(year: number): boolean {
  requireInteger('year', year);
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

const MONTH_LENGTHS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const;

/**
 * Number of days in a month of the Gregorian calendar.
 * @param year  Calendar year (integer).
 * @param month Month, 1..12.
 * @returns 28, 29, 30 or 31.
 * @throws {InvalidArgumentError} if `year` is not an integer or `month` is not in 1..12.
 */
export function daysInMonth(year: number, month: number): number {
  requireInteger('year', year);
  requireInteger('month', month, 1, 12);
  return month === 2 && isGregorianLeapYear(year) ? 29 : at(MONTH_LENGTHS, month - 1, 'MONTH_LENGTHS');
}

/**
 * Modified Julian Day number of a Gregorian calendar date (the MJD at 00:00 of that day).
 *
 * Algorithm: days-from-civil on a March-based year in 400-year eras (H. Hinnant,
 * "chrono-Compatible Low-Level Date Algorithms", days_from_civil [M]); MJD = days since
 * 1970-01-01 + 40587. Checked against ECMAScript `Date.UTC` and against MJD 51544 =
 * 2000-01-01 in the tests.
 *
 * @param year  Calendar year, 1..9999.
 * @param month Month, 1..12.
 * @param day   Day of month, 1..28/29/30/31.
 * @returns The MJD (an integer) of 00:00 on that date.
 * @throws {InvalidArgumentError} naming the field for a year, month or day that does not exist
 *   (e.g. 31 February, 29 February of a common year).
 */
export function mjdFromCalendarDate(year: number, month: number, day: number): number {
  requireInteger('year', year, MIN_CALENDAR_YEAR, MAX_CALENDAR_YEAR);
  requireInteger('month', month, 1, 12);
  const length = daysInMonth(year, month);
  if (typeof day !== 'number' || !Number.isInteger(day) || day < 1 || day > length) {
    const hint = month === 2 && day === 29 ? `${year} is not a leap year` : undefined;
    throw new InvalidArgumentError('day', day, `an integer in [1, ${length}] for ${year}-${pad2(month)}`, hint);
  }
  return daysFromCivil(year, month, day) + MJD_OF_1970_01_01;
}

/**
 * Gregorian calendar date of a Modified Julian Day number (inverse of {@link mjdFromCalendarDate}).
 * Algorithm: civil-from-days (H. Hinnant, "chrono-Compatible Low-Level Date Algorithms" [M]).
 * @param mjd Integer MJD, within years 1..9999 (−678575 ≤ mjd ≤ 2973483).
 * @returns The calendar date.
 * @throws {InvalidArgumentError} if `mjd` is not an integer in that span.
 */
export function calendarDateFromMjd(mjd: number): CalendarDate {
  requireInteger('mjd', mjd, MIN_MJD, MAX_MJD);
  return civilFromDays(mjd - MJD_OF_1970_01_01);
}

/** MJD of 0001-01-01 [C]. */
export const MIN_MJD = -678_575;
/** MJD of 9999-12-31 [C]. */
export const MAX_MJD = 2_973_483;

/** Days since 1970-01-01 of a valid proleptic Gregorian date, no validation (H. Hinnant, "chrono-compatible low-level date algorithms", days_from_civil [M]). */
export function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yearOfEra = y - era * 400;
  const dayOfYear = Math.floor((153 * (month > 2 ? month - 3 : month + 9) + 2) / 5) + day - 1;
  const dayOfEra = yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
  return era * 146_097 + dayOfEra - 719_468;
}

/** Calendar date of a day count since 1970-01-01, no validation (H. Hinnant, civil_from_days [M]). */
export function civilFromDays(days: number): CalendarDate {
  const z = days + 719_468;
  const era = Math.floor(z / 146_097);
  const dayOfEra = z - era * 146_097;
  const yearOfEra = Math.floor(
    (dayOfEra - Math.floor(dayOfEra / 1460) + Math.floor(dayOfEra / 36_524) - Math.floor(dayOfEra / 146_096)) / 365,
  );
  const dayOfYear = dayOfEra - (365 * yearOfEra + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100));
  const mp = Math.floor((5 * dayOfYear + 2) / 153);
  const day = dayOfYear - Math.floor((153 * mp + 2) / 5) + 1;
  const month = mp < 10 ? mp + 3 : mp - 9;
  const year = yearOfEra + era * 400 + (month <= 2 ? 1 : 0);
  return { year, month, day };
}

/** Two-digit zero-padded integer. */
export function pad2(n: number): string {
  return n < 10 ? `0${n}` : String(n);
}

/** `YYYY-MM-DD` of an MJD (no validation). */
export function isoDateOfMjd(mjd: number): string {
  const { year, month, day } = civilFromDays(mjd - MJD_OF_1970_01_01);
  return `${String(year).padStart(4, '0')}-${pad2(month)}-${pad2(day)}`;
}
