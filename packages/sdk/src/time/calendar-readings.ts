/**
 * Calendar fields and ISO 8601 text ↔ instants on any scale, through one leap-second table: the
 * `fromCalendar`, `toCalendar`, `parseIso` and `formatIso` members of `createTimeScales(table)`.
 *
 * @internal
 */
import { InvalidArgumentError } from '../errors.js';
import { requireFinite, requireInteger } from '../internal/validate.js';
import { daysFromCivil, daysInMonth, isoDateOfMjd, MAX_CALENDAR_YEAR, MIN_CALENDAR_YEAR, pad2 } from './calendar.js';
import { type Instant, requireInstant } from './instant.js';
import { ISO_FORM, type RawFields, requireScale, scanIso } from './iso-text.js';
import type { CalendarDateTime, CalendarDateTimeInput, FormatIsoOptions } from './scales-types.js';
import { floorDivMod } from './split.js';
import type { Label, TimeScale } from './uniform.js';
import { checkedCalendarLabel, fieldsOfLabel, type UtcTable } from './utc-table.js';

/** Local calendar fields after their range checks (the second split into whole and fraction). */
interface CheckedFields {
  readonly year: number;
  readonly month: number;
  readonly day: number;
  readonly hour: number;
  readonly minute: number;
  readonly secondWhole: number;
  readonly secondFraction: number;
}

/** Range-checks local calendar fields, naming each as `${prefix}.field`. */
function checkFields(raw: RawFields, prefix: string): CheckedFields {
  const year = requireInteger(`${prefix}.year`, raw.year, MIN_CALENDAR_YEAR, MAX_CALENDAR_YEAR);
  const month = requireInteger(`${prefix}.month`, raw.month, 1, 12);
  const length = daysInMonth(year, month);
  if (typeof raw.day !== 'number' || !Number.isInteger(raw.day) || raw.day < 1 || raw.day > length) {
    throw new InvalidArgumentError(
      `${prefix}.day`,
      raw.day,
      `an integer in [1, ${length}] for ${String(year).padStart(4, '0')}-${pad2(month)}`,
      month === 2 && raw.day === 29 ? `${year} is not a leap year` : undefined,
    );
  }
  const day = raw.day;
  if (raw.hour === 24) {
    throw new InvalidArgumentError(
      `${prefix}.hour`,
      24,
      'an integer in [0, 23]',
      'write 24:00:00 as 00:00:00 of the next day',
    );
  }
  const hour = requireInteger(`${prefix}.hour`, raw.hour, 0, 23);
  const minute = requireInteger(`${prefix}.minute`, raw.minute, 0, 59);
  const secondWhole = requireInteger(`${prefix}.second`, raw.secondWhole, 0, 60);
  return { year, month, day, hour, minute, secondWhole, secondFraction: raw.secondFraction };
}

/** Throws unless second 60 of UTC minute `utcMinuteOfDay` on day `mjd` is a leap second of the table. */
function requireLeapSecond(
  utc: UtcTable,
  scale: TimeScale,
  mjd: number,
  utcMinuteOfDay: number,
  offsetMinutes: number,
  prefix: string,
  received: unknown,
): void {
  if (scale !== 'UTC') {
    throw new InvalidArgumentError(
      `${prefix}.second`,
      60,
      'less than 60',
      `second 60 exists only in UTC, during a leap second; ${scale} has none`,
    );
  }
  if (utcMinuteOfDay !== 1439) {
    throw new InvalidArgumentError(
      `${prefix}.second`,
      60,
      'less than 60 except at 23:59 UTC on a day that ends with a leap second',
      offsetMinutes !== 0
        ? `this local time is ${pad2(Math.floor(utcMinuteOfDay / 60))}:${pad2(utcMinuteOfDay % 60)} UTC`
        : undefined,
    );
  }
  utc.requireUtcDay(prefix, received, mjd);
  if (utc.utcDayLength(mjd) !== 86_401) {
    if (mjd + 1 >= utc.validUntilMjd) throw utc.outOfDomain(prefix, received, false);
    throw new InvalidArgumentError(
      `${prefix}.second`,
      60,
      'less than 60 (no leap second ends this UTC day)',
      `the table "${utc.leapSeconds.source}" has no leap second at the end of ${isoDateOfMjd(mjd)}; ` +
        `its last ones end ${utc.leapSecondDays().slice(-3).join(', ')}`,
    );
  }
}

/**
 * Range-checks local calendar fields (argument names `${prefix}.field`), applies a UTC offset
 * in minutes and returns the instant. Second 60 is checked after the offset is applied.
 */
function instantOfFields(
  utc: UtcTable,
  scale: TimeScale,
  raw: RawFields,
  offsetMinutes: number,
  prefix: string,
  received: unknown,
): Instant {
  const f = checkFields(raw, prefix);
  const minuteOfDay = f.hour * 60 + f.minute - offsetMinutes;
  const [dayShift, utcMinuteOfDay] = floorDivMod(minuteOfDay, 1440);
  const mjd = daysFromCivil(f.year, f.month, f.day) + 40_587 + dayShift;
  if (f.secondWhole === 60) requireLeapSecond(utc, scale, mjd, utcMinuteOfDay, offsetMinutes, prefix, received);
  const label: Label = { day: mjd, secondOfDay: utcMinuteOfDay * 60 + f.secondWhole, fraction: f.secondFraction };
  if (
    scale === 'UTC' &&
    label.secondOfDay >= 86_399 &&
    mjd >= utc.firstMjd &&
    mjd < utc.validUntilMjd &&
    label.secondOfDay >= utc.utcDayLength(mjd)
  ) {
    throw new InvalidArgumentError(
      `${prefix}.second`,
      f.secondWhole,
      'a second that exists on this UTC day',
      `the table "${utc.leapSeconds.source}" removes the last second of ${isoDateOfMjd(mjd)} (a negative leap second)`,
    );
  }
  return utc.instantOfLabel(scale, label, prefix, received);
}

/** `TimeScales.fromCalendar`: the instant of calendar fields read on `scale`. */
export function fromCalendar(utc: UtcTable, fields: CalendarDateTimeInput, scale: TimeScale): Instant {
  requireScale('scale', scale);
  if (typeof fields !== 'object' || fields === null) {
    throw new InvalidArgumentError('fields', fields, 'an object { year, month, day, hour?, minute?, second? }');
  }
  const second = requireFinite(
    'fields.second',
    fields.second ?? 0,
    'a finite number of seconds in [0, 60), or [60, 61) in a UTC leap second',
  );
  if (second < 0 || second >= 61) {
    throw new InvalidArgumentError(
      'fields.second',
      fields.second,
      'a number of seconds in [0, 60), or [60, 61) in a UTC leap second',
    );
  }
  const secondWhole = Math.floor(second);
  return instantOfFields(
    utc,
    scale,
    {
      year: fields.year,
      month: fields.month,
      day: fields.day,
      hour: fields.hour ?? 0,
      minute: fields.minute ?? 0,
      secondWhole,
      secondFraction: second - secondWhole,
    },
    0,
    'fields',
    fields,
  );
}

/** `TimeScales.toCalendar`: the calendar reading of an instant on `scale`. */
export function toCalendar(utc: UtcTable, instant: Instant, scale: TimeScale): CalendarDateTime {
  requireInstant('instant', instant);
  requireScale('scale', scale);
  return fieldsOfLabel(checkedCalendarLabel(utc.labelOf(instant, scale), instant));
}

/** `TimeScales.parseIso`: ISO 8601 text read on `scale` (UTC needs a zone designator, other scales none). */
export function parseIso(utc: UtcTable, text: string, scale: TimeScale = 'UTC'): Instant {
  requireScale('scale', scale);
  const parsed = scanIso(text);
  if (scale === 'UTC' && parsed.offsetMinutes === undefined) {
    throw new InvalidArgumentError(
      'text.zone',
      text,
      `a zone designator (Z or ±hh:mm) at the end: ${ISO_FORM}`,
      'text without a designator is local time; append Z for UTC, or pass the scale the reading belongs to',
    );
  }
  if (scale !== 'UTC' && parsed.offsetMinutes !== undefined) {
    throw new InvalidArgumentError(
      'text.zone',
      text,
      `no zone designator for a ${scale} reading: ${ISO_FORM}`,
      `a designator (Z, ±hh:mm) marks UTC civil time; omit it for ${scale}, or parse the text as 'UTC'`,
    );
  }
  return instantOfFields(utc, scale, parsed.fields, parsed.offsetMinutes ?? 0, 'text', text);
}

/** `TimeScales.formatIso`: ISO 8601 text of an instant on `options.scale`, rounded half-up. */
export function formatIso(utc: UtcTable, instant: Instant, options: FormatIsoOptions = {}): string {
  requireInstant('instant', instant);
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError('options', options, 'an object { scale?, fractionDigits? }');
  const scale = requireScale('options.scale', options.scale ?? 'UTC');
  const digits = requireInteger('options.fractionDigits', options.fractionDigits ?? 9, 0, 12);
  const label = utc.labelOf(instant, scale);
  const unit = 10 ** digits;
  let units = Math.floor(label.fraction * unit + 0.5);
  let { day, secondOfDay } = label;
  if (units >= unit) {
    units -= unit;
    secondOfDay += 1;
    if (secondOfDay >= utc.dayLengthOn(scale, day)) {
      day += 1;
      secondOfDay = 0;
    }
  }
  const fields = fieldsOfLabel(checkedCalendarLabel({ day, secondOfDay, fraction: 0 }, instant));
  const fractionText = digits > 0 ? `.${String(units).padStart(digits, '0')}` : '';
  return (
    `${String(fields.year).padStart(4, '0')}-${pad2(fields.month)}-${pad2(fields.day)}T${pad2(fields.hour)}:${pad2(fields.minute)}:` +
    `${pad2(fields.second)}${fractionText}${scale === 'UTC' ? 'Z' : ''}`
  );
}
