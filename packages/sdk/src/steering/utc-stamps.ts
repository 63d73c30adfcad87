/**
 * UTC stamps of steering scenarios and plans, through the SDK time module (the calendar work is
 * `time/utc-text.ts`; this file names the scenario field in errors and says how to pass a newer table): stamps are parsed
 * to {@link Instant}s with `TimeScales.parseIso`, intervals are `Instant.secondsSince` (so a
 * leap second inside the horizon counts as the SI second it is), and output instants are
 * printed with `TimeScales.formatIso`. The leap-second table is an explicit `TimeScales`
 * value; by default the table bundled with the SDK.
 *
 * @internal
 */
import { InvalidArgumentError, OutOfDomainError } from '../errors.js';
import { isoDateOfMjd } from '../time/calendar.js';
import type { Instant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import { bundledTimeScales, formatUtcMilliseconds, parseUtcText } from '../time/utc-text.js';

/** Options shared by every steering entry point that reads UTC stamps. */
export interface TimeScaleOptions {
  /**
   * The time scales (and so the leap-second table) used for the scenario's UTC stamps; default
   * `createTimeScales(BUNDLED_LEAP_SECONDS)` (valid until 2027-06-28). Pass
   * `createTimeScales(parseLeapSecondsList(text))` with a current IERS/NIST `leap-seconds.list`
   * for later dates.
   */
  timeScales?: TimeScales;
}

/**
 * The `timeScales` option, or the bundled table's.
 * @throws {InvalidArgumentError} if `options` is not an object or `options.timeScales` is not a TimeScales object.
 */
export function resolveTimeScales(options: unknown, field = 'options'): TimeScales {
  if (options === undefined) return bundledTimeScales();
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError(field, options, 'an object (or nothing)');
  const value = (options as { timeScales?: unknown }).timeScales;
  if (value === undefined) return bundledTimeScales();
  const ts = value as Partial<TimeScales> | null;
  if (
    typeof ts !== 'object' ||
    ts === null ||
    typeof ts.parseIso !== 'function' ||
    typeof ts.formatIso !== 'function' ||
    typeof ts.leapSeconds !== 'object' ||
    typeof ts.utcValidUntil !== 'object'
  ) {
    throw new InvalidArgumentError(`${field}.timeScales`, value, 'a TimeScales object from createTimeScales(table)');
  }
  return value as TimeScales;
}

/** How a user passes a newer leap-second table, for error messages. */
export function currentTableHint(ts: TimeScales): string {
  return (
    `the leap-second table "${ts.leapSeconds.source}" is only known complete until ${isoDateOfMjd(ts.leapSeconds.validUntilMjd)} ` +
    '(a leap second may follow); pass a current table built from the IERS/NIST leap-seconds.list: ' +
    '{ timeScales: createTimeScales(parseLeapSecondsList(text)) } in the options (CLI: --leap-seconds <file>)'
  );
}

/**
 * Parses an ISO 8601 UTC stamp with a zone designator (`Z` or `±hh:mm`) into an Instant.
 * `23:59:60` is accepted where the table has a leap second.
 *
 * @param field Field path used in errors (e.g. `contacts[2].end`).
 * @throws {InvalidArgumentError} for text that is not such a stamp (naming `field`).
 * @throws {OutOfDomainError} for a stamp outside the leap-second table, naming `field` and how to pass a current table.
 */
export function parseUtcStamp(ts: TimeScales, field: string, text: unknown): Instant {
  const expected = 'an ISO 8601 UTC date-time with a zone, e.g. "2027-02-08T06:00:00Z"';
  if (typeof text !== 'string') throw new InvalidArgumentError(field, text, expected);
  try {
    return parseUtcText(ts, text);
  } catch (error) {
    if (error instanceof InvalidArgumentError) throw new InvalidArgumentError(field, text, expected, error.message);
    if (error instanceof OutOfDomainError) {
      // The stamp's own date decides the side: the table's span is years long, a zone offset under a day.
      const late = text.slice(0, 10) > error.validFrom.slice(0, 10);
      throw new OutOfDomainError(
        field,
        text,
        error.validFrom,
        error.validTo,
        late
          ? currentTableHint(ts)
          : "a steering scenario needs UTC with whole leap seconds, which starts with the table's first entry (1972-01-01 at the earliest)",
      );
    }
    throw error;
  }
}

/**
 * Throws unless `instant` lies before the end of the table's validity (so it can be printed in UTC).
 * @param what Says what `instant` is, for the message (e.g. "the end of the horizon").
 * @throws {OutOfDomainError} naming `field`, with how to pass a current table.
 */
export function requireInsideTable(
  ts: TimeScales,
  field: string,
  received: unknown,
  instant: Instant,
  what: string,
): void {
  if (instant.compare(ts.utcValidUntil) >= 0) {
    throw new OutOfDomainError(
      field,
      received,
      ts.formatIso(ts.utcValidFrom, { fractionDigits: 0 }),
      `${isoDateOfMjd(ts.leapSeconds.validUntilMjd)}T00:00:00Z (exclusive)`,
      `${what} falls after it; ${currentTableHint(ts)}`,
    );
  }
}

/**
 * Formats an instant as ISO 8601 UTC: whole seconds (`2027-02-08T05:10:00Z`) when it is a whole
 * second after rounding to the millisecond, otherwise with milliseconds (`...:00.250Z`).
 */
export function formatUtcStamp(ts: TimeScales, instant: Instant): string {
  return formatUtcMilliseconds(ts, instant);
}
