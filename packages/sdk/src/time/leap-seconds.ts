/**
 * Leap-second tables: the steps of TAI − UTC since 1972, with the date until which a table
 * is known to be complete. A table is a value passed to `createTimeScales(table)`, never a
 * global. Leap seconds are announced by the IERS in Bulletin C about six months ahead, so a
 * table goes stale: pass a current one (see {@link parseLeapSecondsList}).
 *
 * @module
 */

import { InvalidArgumentError, ParseError } from '../errors.js';
import { at, last as lastOf } from '../internal/checked.js';
import type { Seconds } from '../units.js';
import { calendarDateFromMjd, isoDateOfMjd, mjdFromCalendarDate } from './calendar.js';

/** MJD of 1972-01-01, the start of UTC with integral TAI − UTC (ITU-R TF.460 [M]; first line of the IERS/NIST list [V2]). */
export const UTC_LEAP_SECOND_ERA_START_MJD = 41_317;

/** One step of TAI − UTC, effective from 00:00:00 UTC of day `mjd`. */
export interface LeapSecondEntry {
  /** MJD (UTC) of the first day with this offset; always the first day of a month. */
  readonly mjd: number;
  /** TAI − UTC from that day on, in seconds (an integer). */
  readonly taiMinusUtc: Seconds;
}

/** A validated leap-second table. Build with {@link defineLeapSecondTable} or {@link parseLeapSecondsList}. */
export interface LeapSecondTable {
  /** Steps in increasing date order; each differs from the previous by ±1 s. */
  readonly entries: readonly LeapSecondEntry[];
  /**
   * MJD (UTC) of the first day the table does NOT vouch for: every UTC instant before
   * 00:00:00 UTC of this day is covered; conversions at or after it throw OutOfDomainError.
   */
  readonly validUntilMjd: number;
  /** Where the table comes from and how current it is (free text, shown in errors). */
  readonly source: string;
}

/** Input of {@link defineLeapSecondTable}. */
export interface LeapSecondTableSpec {
  readonly entries: readonly LeapSecondEntry[];
  readonly validUntilMjd: number;
  readonly source: string;
}

/**
 * Validates and freezes a leap-second table.
 *
 * Checks: at least one entry; the first entry on or after 1972-01-01 (MJD 41317; earlier UTC
 * had fractional offsets and frequency steps, which the SDK does not model); every `mjd` an
 * integer on the first day of a month, strictly increasing; every `taiMinusUtc` an integer,
 * each step ±1 s from the previous; `validUntilMjd` an integer after the last entry.
 *
 * @throws {InvalidArgumentError} naming the offending field (e.g. `entries[3].taiMinusUtc`).
 */
export function defineLeapSecondTable(spec: LeapSecondTableSpec): LeapSecondTable {
  if (typeof spec !== 'object' || spec === null) {
    throw new InvalidArgumentError('table', spec, 'an object { entries, validUntilMjd, source }');
  }
  const { entries, validUntilMjd, source } = spec;
  if (!Array.isArray(entries) || entries.length === 0) {
    throw new InvalidArgumentError('entries', entries, 'a non-empty array of { mjd, taiMinusUtc }');
  }
  const checked: LeapSecondEntry[] = [];
  entries.forEach((entry: unknown, i: number) => {
    const field = `entries[${i}]`;
    if (typeof entry !== 'object' || entry === null)
      throw new InvalidArgumentError(field, entry, 'an object { mjd, taiMinusUtc }');
    const { mjd, taiMinusUtc } = entry as Record<string, unknown>;
    if (typeof mjd !== 'number' || !Number.isInteger(mjd) || mjd < UTC_LEAP_SECOND_ERA_START_MJD || mjd > 2_973_483) {
      throw new InvalidArgumentError(
        `${field}.mjd`,
        mjd,
        `an integer MJD ≥ ${UTC_LEAP_SECOND_ERA_START_MJD} (1972-01-01)`,
        typeof mjd === 'number' && mjd < UTC_LEAP_SECOND_ERA_START_MJD
          ? 'UTC before 1972 had fractional offsets and rate steps, which are not modelled'
          : undefined,
      );
    }
    if (calendarDateFromMjd(mjd).day !== 1) {
      throw new InvalidArgumentError(
        `${field}.mjd`,
        mjd,
        'the MJD of the first day of a month (a leap second ends a month)',
        `MJD ${mjd} is ${isoDateOfMjd(mjd)}`,
      );
    }
    if (typeof taiMinusUtc !== 'number' || !Number.isInteger(taiMinusUtc) || Math.abs(taiMinusUtc) > 1000) {
      throw new InvalidArgumentError(`${field}.taiMinusUtc`, taiMinusUtc, 'an integer number of seconds');
    }
    const previous = checked[i - 1];
    if (previous) {
      if (mjd <= previous.mjd)
        throw new InvalidArgumentError(`${field}.mjd`, mjd, `an MJD after entries[${i - 1}].mjd = ${previous.mjd}`);
      if (Math.abs(taiMinusUtc - previous.taiMinusUtc) !== 1) {
        throw new InvalidArgumentError(
          `${field}.taiMinusUtc`,
          taiMinusUtc,
          `${previous.taiMinusUtc + 1} or ${previous.taiMinusUtc - 1} (one leap second from entries[${i - 1}])`,
        );
      }
    }
    checked.push(Object.freeze({ mjd, taiMinusUtc }));
  });
  const last = lastOf(checked, 'entries');
  if (
    typeof validUntilMjd !== 'number' ||
    !Number.isInteger(validUntilMjd) ||
    validUntilMjd <= last.mjd ||
    validUntilMjd > 2_973_483
  ) {
    throw new InvalidArgumentError(
      'validUntilMjd',
      validUntilMjd,
      `an integer MJD after the last entry (${last.mjd}, ${isoDateOfMjd(last.mjd)})`,
    );
  }
  if (typeof source !== 'string' || source.trim() === '') {
    throw new InvalidArgumentError('source', source, 'a non-empty description of where the table comes from');
  }
  return Object.freeze({ entries: Object.freeze(checked), validUntilMjd, source });
}

/** [year, month, TAI − UTC from the 1st of that month] for every step since 1972. */
const BUNDLED_STEPS: ReadonlyArray<readonly [number, number, number]> = [
  [1972, 1, 10],
  [1972, 7, 11],
  [1973, 1, 12],
  [1974, 1, 13],
  [1975, 1, 14],
  [1976, 1, 15],
  [1977, 1, 16],
  [1978, 1, 17],
  [1979, 1, 18],
  [1980, 1, 19],
  [1981, 7, 20],
  [1982, 7, 21],
  [1983, 7, 22],
  [1985, 7, 23],
  [1988, 1, 24],
  [1990, 1, 25],
  [1991, 1, 26],
  [1992, 7, 27],
  [1993, 7, 28],
  [1994, 7, 29],
  [1996, 1, 30],
  [1997, 7, 31],
  [1999, 1, 32],
  [2006, 1, 33],
  [2009, 1, 34],
  [2012, 7, 35],
  [2015, 7, 36],
  [2017, 1, 37],
];

/**
 * The leap-second table bundled with this release: TAI − UTC = 10 s from 1972-01-01 to
 * 37 s from 2017-01-01 (28 entries), valid until 2027-06-28 (MJD 61584, exclusive).
 *
 * Sources: the steps are those of the IERS/NIST `leap-seconds.list` (IERS Bulletin C), read in
 * public copies of that file [V2]. Validity: IERS Bulletin C 72 (Paris, 6 July 2026) says no
 * leap second at the end of December 2026 and TAI − UTC = 37 s "until further notice", and
 * the list updated through Bulletin C 72 "expires on 28 June 2027" — both read only in
 * quotations [V2]; the next possible step is at the end of June 2027 (leap seconds may in
 * principle end any month, first preference June/December, ITU-R TF.460 [M]), announced in
 * Bulletin C 73 (January 2027). After 2027-06-28 this table throws: pass a current table
 * (e.g. `parseLeapSecondsList(text)` of the current list) to `createTimeScales`.
 */
export const BUNDLED_LEAP_SECONDS: LeapSecondTable = defineLeapSecondTable({
  entries: BUNDLED_STEPS.map(([year, month, taiMinusUtc]) => ({
    mjd: mjdFromCalendarDate(year, month, 1),
    taiMinusUtc,
  })),
  validUntilMjd: mjdFromCalendarDate(2027, 6, 28),
  source:
    'bundled: IERS Bulletin C leap seconds 1972-2017; complete through IERS Bulletin C 72 (July 2026), list expiry 2027-06-28',
});

/** MJD of the NTP epoch 1900-01-01 (MJD = NTP seconds / 86400 + 15020, per the list's own notes) [V2]. */
const NTP_EPOCH_MJD = 15_020;

/**
 * Parses the IERS/NIST `leap-seconds.list` text format (the file distributed with time-zone
 * data): data lines `NTP-seconds  TAI−UTC  # comment`, the expiry line `#@ NTP-seconds`, and
 * comment lines starting with `#`. NTP seconds count from 1900-01-01T00:00:00; MJD = NTP/86400
 * + 15020. The table's `validUntilMjd` is the file's expiry day.
 *
 * @param text       Whole file contents.
 * @param sourceName File name or label, used in errors and in `source`.
 * @returns A validated table.
 * @throws {ParseError} (with line and column) for a malformed line, a missing `#@` expiry line,
 *   or an NTP time that is not a whole day.
 * @throws {InvalidArgumentError} if the parsed entries fail {@link defineLeapSecondTable}'s checks.
 * @see IERS Bulletin C [V2, via public copies of the list]; the format is described in the comment header of the list itself [V2].
 */
export function parseLeapSecondsList(text: string, sourceName = 'leap-seconds.list'): LeapSecondTable {
  if (typeof text !== 'string') throw new InvalidArgumentError('text', text, 'the text of a leap-seconds.list file');
  if (typeof sourceName !== 'string') throw new InvalidArgumentError('sourceName', sourceName, 'a file name or label');
  const entries: LeapSecondEntry[] = [];
  let expiryMjd: number | undefined;
  // Line ends LF, CR LF or a lone CR, as in the io readers; a leading byte-order mark is dropped.
  const lines = (text.charCodeAt(0) === 0xfeff ? text.slice(1) : text).split(/\r\n|\r|\n/);
  const ntpDay = (value: string, line: number, column: number): number => {
    const seconds = Number(value);
    if (!Number.isSafeInteger(seconds) || seconds % 86_400 !== 0) {
      throw new ParseError(sourceName, line, column, 'NTP seconds of 00:00:00 of a day (a multiple of 86400)', value);
    }
    return seconds / 86_400 + NTP_EPOCH_MJD;
  };
  lines.forEach((raw, index) => {
    const line = index + 1;
    if (raw.startsWith('#@')) {
      const match = /^#@\s*(\d+)\s*$/.exec(raw);
      if (!match) throw new ParseError(sourceName, line, 3, 'an expiry line "#@ <NTP seconds>"', raw);
      const seconds = at(match, 1, 'expiry line match');
      expiryMjd = ntpDay(seconds, line, raw.indexOf(seconds) + 1);
      return;
    }
    if (raw.startsWith('#') || raw.trim() === '') return;
    const match = /^\s*(\d+)\s+(\d+)\s*(#.*)?$/.exec(raw);
    if (!match)
      throw new ParseError(sourceName, line, 1, 'a data line "<NTP seconds> <TAI-UTC seconds> # <date>"', raw);
    const seconds = at(match, 1, 'data line match');
    entries.push({ mjd: ntpDay(seconds, line, raw.indexOf(seconds) + 1), taiMinusUtc: Number(match[2]) });
  });
  if (expiryMjd === undefined) {
    throw new ParseError(
      sourceName,
      lines.length,
      undefined,
      'an expiry line "#@ <NTP seconds>" (without it the table\'s validity is unknown)',
    );
  }
  return defineLeapSecondTable({
    entries,
    validUntilMjd: expiryMjd,
    source: `${sourceName} (expires ${isoDateOfMjd(expiryMjd)})`,
  });
}
