/**
 * Epochs as data files write them: calendar fields read on a file's time system (the three-letter
 * codes of RINEX and SP3 headers: GPS, GAL, BDT, QZS, TAI, UTC, GLO), turned into exact
 * {@link Instant}s and back into text; and the "scale seconds" count of the broadcast orbit
 * algorithms (seconds since 1980-01-06T00:00:00 read on a system's own scale).
 *
 * Readers and CLI commands call these instead of doing calendar arithmetic themselves.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { requireOptions } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import { civilFromDays, daysFromCivil, daysInMonth, pad2 } from './calendar.js';
import { INSTANT_EPOCH_MJD, Instant, instantFromParts, requireInstant } from './instant.js';
import type { TimeScales } from './scales.js';
import { floorDivMod } from './split.js';
import { type TimeScale, type UniformScale, uniformMinusTai } from './uniform.js';

/** Calendar fields of an epoch as written in a file (the `second` may carry a fraction). */
export interface FileEpochFields {
  readonly year: number;
  readonly month: number;
  readonly day: number;
  readonly hour: number;
  readonly minute: number;
  /** Seconds of the minute, in [0, 61) s (60.x only for a UTC leap second, or as a plain count on uniform scales). */
  readonly second: Seconds;
}

/** How a file's time system reads on the SDK's scales: reading(file) = reading(scale) + `hoursAhead` h. */
export interface FileTimeScale {
  /** The file's three-letter code, e.g. `GAL`. */
  readonly code: string;
  /** The SDK scale whose calendar the file's epochs follow. */
  readonly scale: TimeScale;
  /** Whole hours the file's calendar runs ahead of `scale` (3 for GLONASS time, otherwise 0). */
  readonly hoursAhead: number;
}

/**
 * File time-system codes the SDK reads. GPS time, Galileo System Time (GAL → GST), BeiDou Time, TAI
 * and UTC map one to one; QZSS time is aligned with GPS time (QZS → GPS; IS-QZSS as commonly quoted
 * [M]); GLONASS time is UTC(SU) + 3 h (GLONASS ICD [M]), read here as UTC + 3 h. The few-nanosecond
 * realisation differences between system times are data, not part of these conversions.
 */
const FILE_TIME_SCALES: Readonly<Record<string, FileTimeScale>> = Object.freeze({
  GPS: { code: 'GPS', scale: 'GPS', hoursAhead: 0 },
  GAL: { code: 'GAL', scale: 'GST', hoursAhead: 0 },
  BDT: { code: 'BDT', scale: 'BDT', hoursAhead: 0 },
  QZS: { code: 'QZS', scale: 'GPS', hoursAhead: 0 },
  TAI: { code: 'TAI', scale: 'TAI', hoursAhead: 0 },
  UTC: { code: 'UTC', scale: 'UTC', hoursAhead: 0 },
  GLO: { code: 'GLO', scale: 'UTC', hoursAhead: 3 },
});

/** The codes {@link fileTimeScale} knows, for messages. */
export const FILE_TIME_SYSTEM_CODES: readonly string[] = Object.freeze(Object.keys(FILE_TIME_SCALES));

/**
 * The SDK scale of a file's time-system code, or `undefined` for a code the SDK does not read.
 * @param code Three-letter code as written in a RINEX/SP3 header, e.g. `GPS`, `GAL`, `GLO`.
 */
export function fileTimeScale(code: string): FileTimeScale | undefined {
  if (typeof code !== 'string') {
    throw new InvalidArgumentError('code', code, 'a three-letter time-system code such as "GPS"');
  }
  return Object.hasOwn(FILE_TIME_SCALES, code) ? FILE_TIME_SCALES[code] : undefined;
}

/**
 * Throws unless `ts` is a {@link TimeScales} object (from `createTimeScales`).
 * @internal
 */
export function requireTimeScales(argument: string, ts: unknown): TimeScales {
  const t = ts as Partial<TimeScales> | null;
  if (
    typeof t !== 'object' ||
    t === null ||
    typeof t.fromCalendar !== 'function' ||
    typeof t.formatIso !== 'function'
  ) {
    throw new InvalidArgumentError(argument, ts, 'time scales from createTimeScales(table)');
  }
  return t as TimeScales;
}

function unknownCode(code: unknown): InvalidArgumentError {
  const known = FILE_TIME_SYSTEM_CODES.join(', ');
  return new InvalidArgumentError('code', code, `a time-system code the SDK reads: ${known}`);
}

/** MJD of 1970-01-01, the origin of the `daysFromCivil` count (MJD = JD − 2400000.5, by definition). */
const UNIX_EPOCH_MJD = 40_587;

function requireFields(fields: unknown): FileEpochFields {
  const f = fields as FileEpochFields | null;
  const ok =
    typeof f === 'object' &&
    f !== null &&
    [f.year, f.month, f.day, f.hour, f.minute].every(Number.isInteger) &&
    Number.isFinite(f.second) &&
    f.month >= 1 &&
    f.month <= 12 &&
    f.day >= 1 &&
    f.day <= daysInMonth(f.year, f.month) &&
    f.hour >= 0 &&
    f.hour <= 23 &&
    f.minute >= 0 &&
    f.minute <= 59 &&
    f.second >= 0 &&
    f.second < 61 &&
    Math.abs(f.year) <= 9999;
  if (!ok) {
    throw new InvalidArgumentError(
      'fields',
      fields,
      'calendar fields { year, month, day, hour, minute, second } of a real date and time ' +
        '(|year| ≤ 9999, second in [0, 61))',
    );
  }
  return f as FileEpochFields;
}

/**
 * The instant of calendar fields read on `code`'s time system, exact: the whole seconds are counted
 * in integers and the fraction of the second is carried apart, so `12.3456789` s stays
 * 12.3456789 s to ~1e-15 s (a float count of seconds since 1980 resolves only 2.4e-7 s).
 *
 * Uniform scales (GPS, GAL, BDT, QZS, TAI): calendar arithmetic, 86 400 s per day; a second field of
 * 60.x counts on as 60.x s (as the files' fixed-width fields allow). UTC and GLO go through the
 * leap-second table of `ts`: 23:59:60 UTC (02:59:60 GLO) is accepted only on a leap-second day.
 *
 * @param ts     Time scales (leap-second table) for UTC and GLO epochs; unused for the others.
 * @param fields Calendar fields as written.
 * @param code   File time-system code (see {@link fileTimeScale}).
 * @throws {InvalidArgumentError} for an unknown code or fields that are not a date and time;
 *   {@link OutOfDomainError} for UTC/GLO epochs outside the table.
 */
export function instantFromFileEpoch(ts: TimeScales, fields: FileEpochFields, code: string): Instant {
  requireTimeScales('ts', ts);
  const scale = fileTimeScale(code);
  if (!scale) throw unknownCode(code);
  const f = requireFields(fields);
  const whole = Math.floor(f.second);
  const fraction = f.second - whole; // exact: both below 61
  const mjd = daysFromCivil(f.year, f.month, f.day) + UNIX_EPOCH_MJD;
  if (scale.scale !== 'UTC') {
    const reading = (mjd - INSTANT_EPOCH_MJD) * 86_400 + f.hour * 3600 + f.minute * 60 + whole;
    return instantFromParts(reading - uniformMinusTai(scale.scale as UniformScale), fraction);
  }
  // UTC (GLO: shift the calendar reading back by whole hours first; the leap second stays in its minute).
  let day = mjd;
  let hour = f.hour - scale.hoursAhead;
  if (hour < 0) {
    hour += 24;
    day -= 1;
  }
  const date = civilFromDays(day - UNIX_EPOCH_MJD);
  const utc = { year: date.year, month: date.month, day: date.day, hour, minute: f.minute, second: whole };
  const instant = ts.fromCalendar(utc, 'UTC');
  return fraction === 0 ? instant : instant.plus(fraction);
}

/** Options of {@link formatFileEpoch}. */
export interface FormatFileEpochOptions {
  /**
   * Digits after the decimal point, 0..9. Default: as many as needed up to 9 (nanoseconds), none
   * for a whole second, trailing zeros removed.
   */
  readonly fractionDigits?: number;
}

/**
 * ISO 8601 text (no zone designator) of an instant read on a file's time system, e.g.
 * `2024-01-07T00:15:00` or `2024-01-07T00:15:00.0000001`. Inverse of {@link instantFromFileEpoch}.
 * @throws {InvalidArgumentError} for an unknown code or bad options;
 *   {@link OutOfDomainError} for UTC/GLO outside the table.
 */
export function formatFileEpoch(
  ts: TimeScales,
  instant: Instant,
  code: string,
  options: FormatFileEpochOptions = {},
): string {
  requireTimeScales('ts', ts);
  requireInstant('instant', instant);
  requireOptions('options', options);
  const scale = fileTimeScale(code);
  if (!scale) throw unknownCode(code);
  const digits = options.fractionDigits;
  if (digits !== undefined && !(Number.isInteger(digits) && digits >= 0 && digits <= 9)) {
    throw new InvalidArgumentError('options.fractionDigits', digits, 'an integer number of digits in [0, 9]');
  }
  if (scale.scale !== 'UTC') {
    const fast = formatUniform(instant, scale.scale as UniformScale, digits);
    if (fast !== undefined) return fast;
  }
  let text = ts.formatIso(instant, { scale: scale.scale, fractionDigits: digits ?? 9 });
  if (text.endsWith('Z')) text = text.slice(0, -1);
  if (digits === undefined) text = text.replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
  return scale.hoursAhead === 0 ? text : shiftHours(text, scale.hoursAhead);
}

/**
 * The reading of a uniform scale as text, by integer arithmetic (no leap seconds to handle): the fraction
 * rounded half-up to `digits` (default: up to 9, trailing zeros dropped), carrying into the seconds.
 * Undefined outside the years 1..9999 (the caller then lets `formatIso` report it).
 */
function formatUniform(instant: Instant, scale: UniformScale, digits: number | undefined): string | undefined {
  const unit = 10 ** (digits ?? 9);
  let reading = instant.taiSeconds + uniformMinusTai(scale);
  let units = Math.floor(instant.taiFraction * unit + 0.5);
  if (units >= unit) {
    units -= unit;
    reading += 1;
  }
  const [days, secondOfDay] = floorDivMod(reading, 86_400);
  const date = civilFromDays(days + INSTANT_EPOCH_MJD - UNIX_EPOCH_MJD);
  if (date.year < 1 || date.year > 9999) return undefined;
  const hour = Math.floor(secondOfDay / 3600);
  const minute = Math.floor((secondOfDay - hour * 3600) / 60);
  const second = secondOfDay - hour * 3600 - minute * 60;
  let fraction = '';
  if (digits === undefined) {
    if (units !== 0) fraction = `.${String(units).padStart(9, '0').replace(/0+$/, '')}`;
  } else if (digits > 0) {
    fraction = `.${String(units).padStart(digits, '0')}`;
  }
  const day = `${String(date.year).padStart(4, '0')}-${pad2(date.month)}-${pad2(date.day)}`;
  return `${day}T${pad2(hour)}:${pad2(minute)}:${pad2(second)}${fraction}`;
}

/** Calendar text `YYYY-MM-DDThh:…` moved forward by whole hours (the rest of the text kept as is). */
function shiftHours(text: string, hours: number): string {
  const year = Number(text.slice(0, 4));
  const month = Number(text.slice(5, 7));
  const day = Number(text.slice(8, 10));
  let hour = Number(text.slice(11, 13)) + hours;
  let days = daysFromCivil(year, month, day);
  if (hour >= 24) {
    hour -= 24;
    days += 1;
  }
  const d = civilFromDays(days);
  return `${String(d.year).padStart(4, '0')}-${pad2(d.month)}-${pad2(d.day)}T${pad2(hour)}${text.slice(13)}`;
}

/** Seconds between the SDK epoch 2000-01-01 and 1980-01-06 on the same uniform calendar: (51544 − 44244) × 86400. */
const SECONDS_1980_TO_2000 = (INSTANT_EPOCH_MJD - 44_244) * 86_400;

/** The system scales of the broadcast orbit algorithms. */
export type OrbitScale = 'GPS' | 'GST' | 'BDT';

function requireOrbitScale(scale: unknown): OrbitScale {
  if (scale !== 'GPS' && scale !== 'GST' && scale !== 'BDT') {
    throw new InvalidArgumentError('scale', scale, "one of 'GPS', 'GST', 'BDT'");
  }
  return scale;
}

/**
 * "Scale seconds" of an instant: seconds since 1980-01-06T00:00:00 read on a GNSS system's own scale
 * (GPS week × 604 800 + seconds of week for GPS and Galileo time), the continuous count of the interface
 * specifications, for display and interchange (broadcast records carry t_oc and t_oe as Instants). One rounding
 * of the sum to a double (resolution 2.4e-7 s near 1.4e9 s).
 */
export function scaleSecondsFromInstant(instant: Instant, scale: OrbitScale): Seconds {
  requireInstant('instant', instant);
  requireOrbitScale(scale);
  return instant.taiSeconds + uniformMinusTai(scale) + SECONDS_1980_TO_2000 + instant.taiFraction;
}

/**
 * The instant of a scale-seconds count (see {@link scaleSecondsFromInstant}); exact for an integer count.
 * @throws {InvalidArgumentError} for a non-finite count or an unknown scale.
 */
export function instantFromScaleSeconds(seconds: Seconds, scale: OrbitScale): Instant {
  requireOrbitScale(scale);
  if (!Number.isFinite(seconds) || Math.abs(seconds) > 1e12) {
    throw new InvalidArgumentError('seconds', seconds, 'a finite number of seconds since 1980-01-06, |value| ≤ 1e12');
  }
  const whole = Math.floor(seconds);
  return Instant.fromTaiParts(whole - SECONDS_1980_TO_2000 - uniformMinusTai(scale), seconds - whole);
}
