/**
 * The types of `createTimeScales`: the {@link TimeScales} interface, calendar fields, split
 * day counts and ISO formatting options.
 *
 * @module
 */
import type { Seconds } from '../units.js';
import type { Instant } from './instant.js';
import type { LeapSecondTable } from './leap-seconds.js';
import type { TimeScale } from './uniform.js';
import type { WeekSeconds, WeekSystem } from './weeks.js';

/** Calendar date and time of day on some scale. */
export interface CalendarDateTime {
  /** Year, 1..9999 (proleptic Gregorian). */
  readonly year: number;
  /** Month, 1..12. */
  readonly month: number;
  /** Day of month, 1..31. */
  readonly day: number;
  /** Hour, 0..23. */
  readonly hour: number;
  /** Minute, 0..59. */
  readonly minute: number;
  /**
   * Seconds of the minute including the fraction, in [0, 60) s; in [60, 61) s only for UTC
   * during a leap second (23:59:60). Resolution of this double: 7e-15 s; a reading is never
   * rounded up into the next whole second (59.999999999999999 reads as the double below 60).
   */
  readonly second: Seconds;
}

/** Input of {@link TimeScales.fromCalendar}: hour, minute and second default to 0. */
export interface CalendarDateTimeInput {
  readonly year: number;
  readonly month: number;
  readonly day: number;
  readonly hour?: number;
  readonly minute?: number;
  readonly second?: Seconds;
}

/** A day count split into an integer day and a fraction of day, with the sum as one double. */
export interface SplitDays {
  /** Integer part (the day number), e.g. the MJD of the date. */
  readonly day: number;
  /** Fraction of the day, in [0, 1); resolution 2⁻⁵³ day ≈ 1e-11 s. */
  readonly fraction: number;
  /**
   * `day + fraction` as one double, for convenience: resolution ≈ 1e-11 day (≈ 0.6 µs) for an
   * MJD, 4.7e-10 day (≈ 40 µs) for a JD. Use `day` and `fraction` for precise work.
   */
  readonly value: number;
}

/** Options of {@link TimeScales.formatIso}. */
export interface FormatIsoOptions {
  /** Scale of the printed reading; default `'UTC'` (printed with `Z`; other scales print no zone designator). */
  readonly scale?: TimeScale;
  /** Digits after the decimal point, 0..12 (rounded half-up, carrying into minutes, days and leap seconds); default 9. */
  readonly fractionDigits?: number;
}

/**
 * Every time-scale conversion, bound to one leap-second table. Build with `createTimeScales(table)`.
 * An {@link Instant} is a moment (kept on TAI); "converting between scales" means reading the
 * same instant on another scale. Only UTC readings need the table; the other scales work for
 * any date.
 */
export interface TimeScales {
  /** The leap-second table these conversions use. */
  readonly leapSeconds: LeapSecondTable;
  /** First instant with a UTC reading: 1972-01-01T00:00:00 UTC (or the table's first entry). */
  readonly utcValidFrom: Instant;
  /** First instant the table does not cover (exclusive end of UTC readings). */
  readonly utcValidUntil: Instant;

  /**
   * TAI − UTC at an instant, in seconds (an integer). During an inserted leap second
   * (23:59:60) it is still the value before the step, e.g. 36 s during 2016-12-31T23:59:60Z.
   * @throws {OutOfDomainError} before 1972-01-01 UTC or from `utcValidUntil` on.
   */
  taiMinusUtc(instant: Instant): Seconds;

  /**
   * Reading of `scale` minus reading of `reference` at the same instant, in seconds, e.g.
   * `offset('TT', 'UTC', t)` = 69.184 s in 2017..2026, `offset('TCG', 'TT', t)` = TCG − TT.
   * UTC readings count 23:59:60 as the 86 401st second of its day.
   * @throws {InvalidArgumentError} for an unknown scale; {@link OutOfDomainError} for UTC outside the table.
   */
  offset(scale: TimeScale, reference: TimeScale, instant: Instant): Seconds;

  /** True when the instant falls inside an inserted UTC leap second (23:59:60.x). @throws {OutOfDomainError} as {@link TimeScales.taiMinusUtc}. */
  isLeapSecond(instant: Instant): boolean;

  /**
   * The instant of a calendar date and time read on `scale`.
   * @throws {InvalidArgumentError} naming the field (`fields.month`, `fields.day` for 31 February,
   *   `fields.hour` for 24, `fields.second` for 60 outside a leap second, NaN anywhere...).
   * @throws {OutOfDomainError} for UTC before 1972 or after the table's validity.
   */
  fromCalendar(fields: CalendarDateTimeInput, scale: TimeScale): Instant;

  /** The calendar reading of an instant on `scale`. @throws {OutOfDomainError} for UTC outside the table or years outside 1..9999. */
  toCalendar(instant: Instant, scale: TimeScale): CalendarDateTime;

  /**
   * Parses ISO 8601 extended date-time text `YYYY-MM-DDThh:mm:ss[.f…]` plus a zone designator.
   * For `scale = 'UTC'` (default) a designator is required: `Z` or a numeric offset `±hh:mm`,
   * `±hhmm` or `±hh` (local = UTC + offset). For the other scales the text is a reading of that
   * scale and must have no designator. Any number of fraction digits (resolution of the result
   * ≈ 1e-16 s). `23:59:60` is accepted only in UTC where the table has a leap second (after
   * applying the offset).
   * @throws {InvalidArgumentError} for malformed text, naming the field (`text.month`, ...) and the expected form.
   * @throws {OutOfDomainError} for UTC before 1972 or after the table's validity.
   */
  parseIso(text: string, scale?: TimeScale): Instant;

  /**
   * Formats an instant as ISO 8601 text on `options.scale` (default UTC, with `Z`), e.g.
   * `2016-12-31T23:59:60.500000000Z`. Rounds half-up to `fractionDigits` (default 9).
   * @throws {InvalidArgumentError} for bad options; {@link OutOfDomainError} for UTC outside the table.
   */
  formatIso(instant: Instant, options?: FormatIsoOptions): string;

  /**
   * Modified Julian Date of an instant read on `scale`: MJD = JD − 2400000.5 (by definition).
   * For UTC, a day with a leap second has 86 401 s and its fraction is (seconds of day)/86401
   * (the usual quasi-MJD convention for UTC, [M]); other scales use 86 400 s days.
   */
  toMjd(instant: Instant, scale: TimeScale): SplitDays;

  /**
   * The instant of an MJD read on `scale`; `mjd + fraction` is the date (either may carry a fraction).
   * @param mjd      Modified Julian Date (days).
   * @param fraction Extra days (for split input), default 0.
   * @throws {InvalidArgumentError} for non-finite input; {@link OutOfDomainError} for UTC outside the table.
   */
  fromMjd(scale: TimeScale, mjd: number, fraction?: number): Instant;

  /** Julian Date of an instant read on `scale` (JD = MJD + 2400000.5); the split day starts at noon. */
  toJd(instant: Instant, scale: TimeScale): SplitDays;

  /** The instant of a Julian Date read on `scale`; `jd + fraction` is the date. @throws as {@link TimeScales.fromMjd}. */
  fromJd(scale: TimeScale, jd: number, fraction?: number): Instant;

  /** GNSS week and seconds of week (same as the standalone `weekSecondsFromInstant`). */
  toWeekSeconds(instant: Instant, system: WeekSystem): WeekSeconds;

  /** Instant of a full GNSS week and seconds of week (same as the standalone `instantFromWeekSeconds`). */
  fromWeekSeconds(system: WeekSystem, week: number, secondsOfWeek: Seconds, fractionOfSecond?: Seconds): Instant;

  /** Full week of a truncated broadcast week, nearest the reference instant (same as `resolveBroadcastWeekNear`). */
  resolveBroadcastWeek(system: WeekSystem, broadcastWeek: number, bits: number, reference: Instant): number;
}
