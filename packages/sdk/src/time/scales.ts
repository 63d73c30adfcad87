/**
 * `createTimeScales(table)`: every conversion between time scales, calendar text, MJD/JD and
 * GNSS weeks, bound to one explicit leap-second table (never a global).
 *
 * @module
 */
import type { Seconds } from '../units.js';
import { TT_MINUS_TAI } from '../constants.js';
import { InvalidArgumentError, OutOfDomainError } from '../errors.js';
import { requireFinite, requireInteger } from '../internal/validate.js';
import {
  civilFromDays, daysFromCivil, daysInMonth, isoDateOfMjd, MAX_CALENDAR_YEAR, MAX_MJD, MIN_CALENDAR_YEAR, MIN_MJD, pad2,
} from './calendar.js';
import { Instant, INSTANT_EPOCH_MJD, requireInstant } from './instant.js';
import { defineLeapSecondTable, type LeapSecondTable } from './leap-seconds.js';
import { floorDivMod, normalize } from './split.js';
import {
  instantFromUniformOrTcgLabel, isUniformScale, type Label, labelOnUniformOrTcg, tcgMinusTtAt, TIME_SCALES, type TimeScale,
  uniformMinusTai,
} from './uniform.js';
import {
  instantFromWeekSeconds, resolveBroadcastWeekNear, weekSecondsFromInstant, type WeekSeconds, type WeekSystem,
} from './weeks.js';

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
 * Every time-scale conversion, bound to one leap-second table. Build with {@link createTimeScales}.
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

const ISO_FORM = 'YYYY-MM-DDThh:mm:ss[.fff…] followed by Z or ±hh:mm (UTC), or no designator (other scales)';

function requireScale(argument: string, scale: unknown): TimeScale {
  if (typeof scale !== 'string' || !(TIME_SCALES as readonly string[]).includes(scale)) {
    throw new InvalidArgumentError(argument, scale, `one of ${TIME_SCALES.map((s) => `'${s}'`).join(', ')}`);
  }
  return scale as TimeScale;
}

/** Local date-time fields after syntax checks, before range checks. */
interface RawFields {
  year: unknown;
  month: unknown;
  day: unknown;
  hour: unknown;
  minute: unknown;
  /** Whole seconds (0..60). */
  secondWhole: unknown;
  /** Fraction of second, [0, 1). */
  secondFraction: number;
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
 */
export function createTimeScales(table: LeapSecondTable): TimeScales {
  const leapSeconds = defineLeapSecondTable(table);
  const entries = leapSeconds.entries;
  const firstMjd = entries[0]!.mjd;
  const validUntilMjd = leapSeconds.validUntilMjd;
  const lastOffset = entries[entries.length - 1]!.taiMinusUtc;
  /** TAI seconds (SDK epoch) at which each entry takes effect. */
  const entryStartTai = entries.map((e) => (e.mjd - INSTANT_EPOCH_MJD) * 86_400 + e.taiMinusUtc);
  const validFromTai = entryStartTai[0]!;
  const validUntilTai = (validUntilMjd - INSTANT_EPOCH_MJD) * 86_400 + lastOffset;
  const utcValidFrom = Instant.fromNormalized(validFromTai, 0);
  const utcValidUntil = Instant.fromNormalized(validUntilTai, 0);
  const validFromText = `${isoDateOfMjd(firstMjd)}T00:00:00Z`;
  const validToText = `${isoDateOfMjd(validUntilMjd)}T00:00:00Z (exclusive)`;

  const outOfDomain = (argument: string, received: unknown, early: boolean): OutOfDomainError =>
    new OutOfDomainError(argument, received, validFromText, validToText, early
      ? 'UTC before 1972 had fractional TAI − UTC offsets and frequency steps ("rubber seconds"), which are not modelled; use TAI, TT or a GNSS scale'
      : `the leap-second table "${leapSeconds.source}" is only known complete until ${isoDateOfMjd(validUntilMjd)}; ` +
        'pass a current table: createTimeScales(parseLeapSecondsList(text)) or defineLeapSecondTable({...})');

  /** Index of the entry in force on UTC day `mjd` (caller checked the range). */
  const entryIndexOnDay = (mjd: number): number => {
    let i = entries.length - 1;
    while (i > 0 && entries[i]!.mjd > mjd) i--;
    return i;
  };
  /** Length in seconds of UTC day `mjd`: 86400 ± 1 when the next day starts a new table entry. */
  const utcDayLength = (mjd: number): number => {
    const i = entryIndexOnDay(mjd);
    const next = entries[i + 1];
    return next && next.mjd === mjd + 1 ? 86_400 + next.taiMinusUtc - entries[i]!.taiMinusUtc : 86_400;
  };
  const requireUtcDay = (argument: string, received: unknown, mjd: number): void => {
    if (mjd < firstMjd) throw outOfDomain(argument, received, true);
    if (mjd >= validUntilMjd) throw outOfDomain(argument, received, false);
  };
  /** Entry index in force at a TAI instant, with the UTC validity check. */
  const entryIndexAtInstant = (instant: Instant): number => {
    if (instant.taiSeconds < validFromTai) throw outOfDomain('instant', instant.toString(), true);
    if (instant.taiSeconds >= validUntilTai) throw outOfDomain('instant', instant.toString(), false);
    let i = entries.length - 1;
    while (i > 0 && entryStartTai[i]! > instant.taiSeconds) i--;
    return i;
  };

  /** UTC = TAI − (TAI − UTC), the table value in force (IERS Bulletin C; ITU-R TF.460 [M]); 23:59:60 labels an inserted second. */
  const utcLabel = (instant: Instant): Label => {
    const i = entryIndexAtInstant(instant);
    const naive = instant.taiSeconds - entries[i]!.taiMinusUtc;
    const next = entries[i + 1];
    if (next) {
      const nextDayStart = (next.mjd - INSTANT_EPOCH_MJD) * 86_400;
      // Inside an inserted second: UTC reads 23:59:60 of the day before the step.
      if (naive >= nextDayStart) return { day: next.mjd - 1, secondOfDay: 86_400 + (naive - nextDayStart), fraction: instant.taiFraction };
    }
    const [days, secondOfDay] = floorDivMod(naive, 86_400);
    return { day: days + INSTANT_EPOCH_MJD, secondOfDay, fraction: instant.taiFraction };
  };

  const labelOf = (instant: Instant, scale: TimeScale): Label =>
    scale === 'UTC' ? utcLabel(instant) : labelOnUniformOrTcg(instant, scale);

  /** Instant of a label; `secondOfDay` must already be checked against the day length. */
  const instantOfLabel = (scale: TimeScale, label: Label, argument: string, received: unknown): Instant => {
    if (label.day < MIN_MJD || label.day > MAX_MJD) {
      throw new OutOfDomainError(argument, received, '0001-01-01', '9999-12-31', 'outside the four-digit calendar');
    }
    if (scale !== 'UTC') return instantFromUniformOrTcgLabel(scale, label.day, label.secondOfDay, label.fraction);
    requireUtcDay(argument, received, label.day);
    // TAI = UTC + (TAI − UTC) of the UTC day; second 86400 of a leap day lands 1 s before the next midnight's TAI.
    const offset = entries[entryIndexOnDay(label.day)]!.taiMinusUtc;
    return Instant.fromNormalized((label.day - INSTANT_EPOCH_MJD) * 86_400 + label.secondOfDay + offset, label.fraction);
  };

  const dayLengthOn = (scale: TimeScale, mjd: number): number => (scale === 'UTC' ? utcDayLength(mjd) : 86_400);

  /**
   * Range-checks local calendar fields (argument names `${prefix}.field`), applies a UTC offset
   * in minutes and returns the instant. Second 60 is checked after the offset is applied.
   */
  const instantOfFields = (scale: TimeScale, raw: RawFields, offsetMinutes: number, prefix: string, received: unknown): Instant => {
    const year = requireInteger(`${prefix}.year`, raw.year, MIN_CALENDAR_YEAR, MAX_CALENDAR_YEAR);
    const month = requireInteger(`${prefix}.month`, raw.month, 1, 12);
    const length = daysInMonth(year, month);
    if (typeof raw.day !== 'number' || !Number.isInteger(raw.day) || raw.day < 1 || raw.day > length) {
      throw new InvalidArgumentError(`${prefix}.day`, raw.day, `an integer in [1, ${length}] for ${String(year).padStart(4, '0')}-${pad2(month)}`,
        month === 2 && raw.day === 29 ? `${year} is not a leap year` : undefined);
    }
    const day = raw.day;
    if (raw.hour === 24) {
      throw new InvalidArgumentError(`${prefix}.hour`, 24, 'an integer in [0, 23]', 'write 24:00:00 as 00:00:00 of the next day');
    }
    const hour = requireInteger(`${prefix}.hour`, raw.hour, 0, 23);
    const minute = requireInteger(`${prefix}.minute`, raw.minute, 0, 59);
    const secondWhole = requireInteger(`${prefix}.second`, raw.secondWhole, 0, 60);
    const minuteOfDay = hour * 60 + minute - offsetMinutes;
    const [dayShift, utcMinuteOfDay] = floorDivMod(minuteOfDay, 1440);
    const mjd = daysFromCivil(year, month, day) + 40_587 + dayShift;
    if (secondWhole === 60) {
      if (scale !== 'UTC') {
        throw new InvalidArgumentError(`${prefix}.second`, 60, 'less than 60', `second 60 exists only in UTC, during a leap second; ${scale} has none`);
      }
      if (utcMinuteOfDay !== 1439) {
        throw new InvalidArgumentError(`${prefix}.second`, 60, 'less than 60 except at 23:59 UTC on a day that ends with a leap second',
          offsetMinutes !== 0 ? `this local time is ${pad2(Math.floor(utcMinuteOfDay / 60))}:${pad2(utcMinuteOfDay % 60)} UTC` : undefined);
      }
      requireUtcDay(prefix, received, mjd);
      if (utcDayLength(mjd) !== 86_401) {
        if (mjd + 1 >= validUntilMjd) throw outOfDomain(prefix, received, false);
        const leapDays = entries.slice(1).filter((e, i) => e.taiMinusUtc > entries[i]!.taiMinusUtc).map((e) => isoDateOfMjd(e.mjd - 1));
        throw new InvalidArgumentError(`${prefix}.second`, 60, 'less than 60 (no leap second ends this UTC day)',
          `the table "${leapSeconds.source}" has no leap second at the end of ${isoDateOfMjd(mjd)}; its last ones end ${leapDays.slice(-3).join(', ')}`);
      }
    }
    const label: Label = { day: mjd, secondOfDay: utcMinuteOfDay * 60 + secondWhole, fraction: raw.secondFraction };
    if (scale === 'UTC' && label.secondOfDay >= 86_399 && mjd >= firstMjd && mjd < validUntilMjd && label.secondOfDay >= utcDayLength(mjd)) {
      throw new InvalidArgumentError(`${prefix}.second`, secondWhole, 'a second that exists on this UTC day',
        `the table "${leapSeconds.source}" removes the last second of ${isoDateOfMjd(mjd)} (a negative leap second)`);
    }
    return instantOfLabel(scale, label, prefix, received);
  };

  const fromCalendar = (fields: CalendarDateTimeInput, scale: TimeScale): Instant => {
    requireScale('scale', scale);
    if (typeof fields !== 'object' || fields === null) {
      throw new InvalidArgumentError('fields', fields, 'an object { year, month, day, hour?, minute?, second? }');
    }
    const second = requireFinite('fields.second', fields.second ?? 0, 'a finite number of seconds in [0, 60), or [60, 61) in a UTC leap second');
    if (second < 0 || second >= 61) {
      throw new InvalidArgumentError('fields.second', fields.second, 'a number of seconds in [0, 60), or [60, 61) in a UTC leap second');
    }
    const secondWhole = Math.floor(second);
    return instantOfFields(scale, {
      year: fields.year, month: fields.month, day: fields.day, hour: fields.hour ?? 0, minute: fields.minute ?? 0,
      secondWhole, secondFraction: second - secondWhole,
    }, 0, 'fields', fields);
  };

  const toCalendar = (instant: Instant, scale: TimeScale): CalendarDateTime => {
    requireInstant('instant', instant);
    requireScale('scale', scale);
    return fieldsOfLabel(checkedCalendarLabel(labelOf(instant, scale), instant));
  };

  const parseIso = (text: string, scale: TimeScale = 'UTC'): Instant => {
    requireScale('scale', scale);
    const parsed = scanIso(text);
    if (scale === 'UTC' && parsed.offsetMinutes === undefined) {
      throw new InvalidArgumentError('text.zone', text, `a zone designator (Z or ±hh:mm) at the end: ${ISO_FORM}`,
        'text without a designator is local time; append Z for UTC, or pass the scale the reading belongs to');
    }
    if (scale !== 'UTC' && parsed.offsetMinutes !== undefined) {
      throw new InvalidArgumentError('text.zone', text, `no zone designator for a ${scale} reading: ${ISO_FORM}`,
        `a designator (Z, ±hh:mm) marks UTC civil time; omit it for ${scale}, or parse the text as 'UTC'`);
    }
    return instantOfFields(scale, parsed.fields, parsed.offsetMinutes ?? 0, 'text', text);
  };

  const formatIso = (instant: Instant, options: FormatIsoOptions = {}): string => {
    requireInstant('instant', instant);
    if (typeof options !== 'object' || options === null) throw new InvalidArgumentError('options', options, 'an object { scale?, fractionDigits? }');
    const scale = requireScale('options.scale', options.scale ?? 'UTC');
    const digits = requireInteger('options.fractionDigits', options.fractionDigits ?? 9, 0, 12);
    const label = labelOf(instant, scale);
    const unit = 10 ** digits;
    let units = Math.floor(label.fraction * unit + 0.5);
    let { day, secondOfDay } = label;
    if (units >= unit) {
      units -= unit;
      secondOfDay += 1;
      if (secondOfDay >= dayLengthOn(scale, day)) {
        day += 1;
        secondOfDay = 0;
      }
    }
    const fields = fieldsOfLabel(checkedCalendarLabel({ day, secondOfDay, fraction: 0 }, instant));
    const fractionText = digits > 0 ? `.${String(units).padStart(digits, '0')}` : '';
    return `${String(fields.year).padStart(4, '0')}-${pad2(fields.month)}-${pad2(fields.day)}T${pad2(fields.hour)}:${pad2(fields.minute)}:` +
      `${pad2(fields.second)}${fractionText}${scale === 'UTC' ? 'Z' : ''}`;
  };

  const toMjd = (instant: Instant, scale: TimeScale): SplitDays => {
    requireInstant('instant', instant);
    requireScale('scale', scale);
    const label = labelOf(instant, scale);
    // MJD = day + (seconds of day)/(length of day) (MJD = JD − 2400000.5, definition [M]).
    const fraction = (label.secondOfDay + label.fraction) / dayLengthOn(scale, label.day);
    return splitDays(label.day, fraction);
  };

  const fromMjd = (scale: TimeScale, mjd: number, fraction = 0): Instant => {
    requireScale('scale', scale);
    const days = requireFinite('mjd', mjd, 'a finite Modified Julian Date (days)');
    const extra = requireFinite('fraction', fraction, 'a finite number of days');
    if (Math.abs(days) > 1e7 || Math.abs(extra) > 1e7) throw new InvalidArgumentError('mjd', mjd, 'a date within years 1..9999 (|MJD| < 1e7)');
    return instantOfSplitMjd(scale, Math.floor(days), (days - Math.floor(days)) + extra, { mjd, fraction });
  };

  const instantOfSplitMjd = (scale: TimeScale, day: number, dayFraction: number, received: unknown): Instant => {
    const split = normalize(day, dayFraction);
    if (split.whole < MIN_MJD || split.whole > MAX_MJD) {
      throw new OutOfDomainError('mjd', received, '0001-01-01', '9999-12-31', 'outside the four-digit calendar');
    }
    if (scale === 'UTC') requireUtcDay('mjd', received, split.whole);
    const length = dayLengthOn(scale, split.whole);
    const seconds = split.fraction * length;
    const whole = Math.floor(seconds);
    // Rounding can give exactly the day length; that is 00:00:00 of the next day.
    if (whole >= length) return instantOfLabel(scale, { day: split.whole + 1, secondOfDay: 0, fraction: 0 }, 'mjd', received);
    return instantOfLabel(scale, { day: split.whole, secondOfDay: whole, fraction: seconds - whole }, 'mjd', received);
  };

  const toJd = (instant: Instant, scale: TimeScale): SplitDays => {
    const mjd = toMjd(instant, scale);
    // JD = MJD + 2400000.5 (definition of the MJD [M]).
    return splitDays(mjd.day + 2_400_000, mjd.fraction + 0.5);
  };

  const fromJd = (scale: TimeScale, jd: number, fraction = 0): Instant => {
    requireScale('scale', scale);
    const days = requireFinite('jd', jd, 'a finite Julian Date (days)');
    const extra = requireFinite('fraction', fraction, 'a finite number of days');
    if (Math.abs(days - 2_400_000) > 1e7 || Math.abs(extra) > 1e7) throw new InvalidArgumentError('jd', jd, 'a date within years 1..9999');
    // MJD = JD − 2400000.5 = (⌊JD⌋ − 2400001) + (JD − ⌊JD⌋ + 0.5)
    const whole = Math.floor(days);
    return instantOfSplitMjd(scale, whole - 2_400_001, (days - whole) + 0.5 + extra, { jd, fraction });
  };

  const taiMinusUtc = (instant: Instant): Seconds => {
    requireInstant('instant', instant);
    return entries[entryIndexAtInstant(instant)]!.taiMinusUtc;
  };

  /** Reading − TAI split into a constant and a varying part, so TCG − TT loses nothing to 32.184. */
  const readingMinusTai = (scale: TimeScale, instant: Instant): [number, number] => {
    if (scale === 'UTC') return [0, -taiMinusUtc(instant)];
    if (scale === 'TCG') return [TT_MINUS_TAI, tcgMinusTtAt(instant)];
    return [uniformMinusTai(scale), 0];
  };

  const offset = (scale: TimeScale, reference: TimeScale, instant: Instant): Seconds => {
    requireScale('scale', scale);
    requireScale('reference', reference);
    requireInstant('instant', instant);
    const [constA, varA] = readingMinusTai(scale, instant);
    const [constB, varB] = readingMinusTai(reference, instant);
    return (constA - constB) + (varA - varB);
  };

  const isLeapSecond = (instant: Instant): boolean => {
    requireInstant('instant', instant);
    return utcLabel(instant).secondOfDay >= 86_400;
  };

  return Object.freeze({
    leapSeconds,
    utcValidFrom,
    utcValidUntil,
    taiMinusUtc,
    offset,
    isLeapSecond,
    fromCalendar,
    toCalendar,
    parseIso,
    formatIso,
    toMjd,
    fromMjd,
    toJd,
    fromJd,
    toWeekSeconds: weekSecondsFromInstant,
    fromWeekSeconds: instantFromWeekSeconds,
    resolveBroadcastWeek: resolveBroadcastWeekNear,
  });
}

/** Throws unless a label's day lies in years 1..9999. */
function checkedCalendarLabel(label: Label, instant: Instant): Label {
  if (label.day < MIN_MJD || label.day > MAX_MJD) {
    throw new OutOfDomainError('instant', instant.toString(), '0001-01-01', '9999-12-31', 'outside the four-digit calendar');
  }
  return label;
}

function fieldsOfLabel(label: Label): CalendarDateTime {
  const { year, month, day } = civilFromDays(label.day - 40_587);
  let hour: number;
  let minute: number;
  let second: number;
  if (label.secondOfDay >= 86_400) {
    hour = 23;
    minute = 59;
    second = 60 + (label.secondOfDay - 86_400);
  } else {
    hour = Math.floor(label.secondOfDay / 3600);
    minute = Math.floor((label.secondOfDay - hour * 3600) / 60);
    second = label.secondOfDay - hour * 3600 - minute * 60;
  }
  // The double sum can round 59 + 0.999999999999999 up to 60; keep it below the next whole second.
  let secondWithFraction = second + label.fraction;
  if (secondWithFraction >= second + 1) secondWithFraction = (second + 1) * (1 - Number.EPSILON / 2);
  return Object.freeze({ year, month, day, hour, minute, second: secondWithFraction });
}

function splitDays(day: number, fraction: number): SplitDays {
  const split = normalize(day, fraction);
  return Object.freeze({ day: split.whole, fraction: split.fraction, value: split.whole + split.fraction });
}

/** Syntax scan of ISO 8601 extended date-time text; ranges are checked afterwards. */
function scanIso(text: unknown): { fields: RawFields; offsetMinutes: number | undefined } {
  if (typeof text !== 'string') throw new InvalidArgumentError('text', text, `an ISO 8601 string ${ISO_FORM}`);
  let pos = 0;
  const where = () => `at character ${pos + 1} of ${JSON.stringify(text)}`;
  const digits = (field: string, count: number, form: string): number => {
    const piece = text.slice(pos, pos + count);
    if (piece.length !== count || !/^\d+$/.test(piece)) {
      throw new InvalidArgumentError(`text.${field}`, text.slice(pos, pos + count + 2) || '(end of text)',
        `${count} digits ${form} ${where()}; the form is ${ISO_FORM}`);
    }
    pos += count;
    return Number(piece);
  };
  const literal = (char: string, after: string): void => {
    if (text[pos] !== char) {
      const found = pos < text.length ? `'${text[pos]}'` : 'the end of the text';
      const hint = after === 'day' && pos >= text.length ? 'date-only text is ambiguous: add a time of day, e.g. T00:00:00 (then Z for UTC; no designator for GPS, GST, BDT, TAI, TT or TCG readings)'
        : after === 'day' && (text[pos] === ' ' || text[pos] === 't') ? "ISO 8601 separates date and time with an upper-case 'T'" : undefined;
      throw new InvalidArgumentError('text', text, `'${char}' after the ${after} (found ${found} ${where()}); the form is ${ISO_FORM}`, hint);
    }
    pos += 1;
  };
  const year = digits('year', 4, 'YYYY (0001..9999)');
  literal('-', 'year');
  const month = digits('month', 2, 'MM (01..12)');
  literal('-', 'month');
  const day = digits('day', 2, 'DD (01..31)');
  literal('T', 'day');
  const hour = digits('hour', 2, 'hh (00..23)');
  literal(':', 'hour');
  const minute = digits('minute', 2, 'mm (00..59)');
  literal(':', 'minute');
  const secondWhole = digits('second', 2, 'ss (00..59, 60 in a leap second)');
  let secondFraction = 0;
  if (text[pos] === '.' || text[pos] === ',') {
    pos += 1;
    const match = /^\d+/.exec(text.slice(pos));
    if (!match) throw new InvalidArgumentError('text.fraction', text.slice(pos) || '(end of text)', `one or more digits after the decimal sign ${where()}`);
    secondFraction = Number(`0.${match[0]}`);
    pos += match[0].length;
  }
  let offsetMinutes: number | undefined;
  if (pos < text.length) {
    const sign = text[pos];
    if (sign === 'Z') {
      offsetMinutes = 0;
      pos += 1;
    } else if (sign === '+' || sign === '-') {
      pos += 1;
      const offsetHours = digits('zone', 2, 'hh of the UTC offset ±hh:mm');
      let offsetMins = 0;
      if (pos < text.length) {
        if (text[pos] === ':') pos += 1;
        offsetMins = digits('zone', 2, 'mm of the UTC offset ±hh:mm');
      }
      if (offsetHours > 23 || offsetMins > 59) {
        throw new InvalidArgumentError('text.zone', text, `a UTC offset ±hh:mm with hh ≤ 23 and mm ≤ 59; the form is ${ISO_FORM}`);
      }
      offsetMinutes = (sign === '-' ? -1 : 1) * (offsetHours * 60 + offsetMins);
    } else {
      throw new InvalidArgumentError('text.zone', text, `Z, ±hh:mm or the end of the text ${where()}; the form is ${ISO_FORM}`,
        sign === 'z' ? "write the UTC designator as upper-case 'Z'" : undefined);
    }
    if (pos < text.length) {
      throw new InvalidArgumentError('text', text, `the end of the text after the zone designator ${where()}; the form is ${ISO_FORM}`);
    }
  }
  return { fields: { year, month, day, hour, minute, secondWhole, secondFraction }, offsetMinutes };
}
