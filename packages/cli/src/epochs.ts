/**
 * How the epochs of a clock record print and how absolute epochs are read from flags. A RINEX clock file's
 * record is a series on its first epoch (`t` in seconds since it); its epochs print as calendar times in the
 * file's time system, through the SDK's time module (no calendar arithmetic here). A text record's time
 * column has no calendar: its epochs print as seconds.
 */
import { OutOfDomainError } from '@tauline/sdk/errors';
import {
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  FILE_TIME_SYSTEM_CODES,
  fileTimeScale,
  formatFileEpoch,
  type Instant,
  type TimeScales,
} from '@tauline/sdk/time';
import { optionalFlag, type ParsedArgs, sig, UsageError, withFlagNames } from './framework.js';
import type { ClockRecord } from './records.js';

/** Printing of one record's epochs, each given as seconds on the record's time axis. */
export interface EpochFormat {
  /** An epoch for a table or a sentence, e.g. `2026-02-02T00:55:00 GPS` or `750000 s`. */
  text(t: number): string;
  /** An epoch in a column headed {@link EpochFormat.column}: the text without its scale or unit. */
  cell(t: number): string;
  /** Header of an epoch column, e.g. `epoch (GPS)` or `epoch (s)`. */
  column: string;
}

/**
 * The epoch printing of `record`: calendar in the file's time system for RINEX clock files (`t` in seconds since
 * `record.epoch`, its first sample), seconds otherwise.
 */
export function epochFormat(record: Pick<ClockRecord, 'epoch' | 'timeSystem'>): EpochFormat {
  const { epoch, timeSystem } = record;
  if (epoch === undefined) {
    return { text: (t) => `${sig(t, 12)} s`, cell: (t) => sig(t, 12), column: 'epoch (s)' };
  }
  // A file without a TIME SYSTEM ID line is read on GPS time (as the reader places it); say that it is not named.
  const stamp = (t: number): Stamp => stampOf(epoch.plus(t), timeSystem ?? 'GPS');
  const label = (s: Stamp): string => (timeSystem === undefined ? '(time system not stated)' : s.scale);
  return {
    text: (t) => {
      const s = stamp(t);
      return `${s.iso} ${label(s)}`;
    },
    cell: (t) => {
      const s = stamp(t);
      // A stamp given on GPS time in place of the file's scale (see stampOf) names its scale in the cell.
      return timeSystem === undefined || s.scale === timeSystem ? s.iso : `${s.iso} ${s.scale}`;
    },
    column: `epoch (${timeSystem ?? 'file time'})`,
  };
}

/** An absolute epoch for JSON: ISO 8601 text (no zone designator) read on `scale`, a time-system code (GPS, UTC, …). */
export interface Stamp {
  readonly iso: string;
  readonly scale: string;
}

let bundled: TimeScales | undefined;

function bundledScales(): TimeScales {
  bundled ??= createTimeScales(BUNDLED_LEAP_SECONDS);
  return bundled;
}

/**
 * `instant` read on the time system `scale` (GPS, GAL, BDT, QZS, TAI, UTC, GLO), through the SDK's time helpers.
 * A UTC-based reading (UTC, GLO) outside the leap-second table is given on GPS time instead, and says so in `scale`
 * (the seconds fields beside it need no table; failing the command over a stamp would lose them).
 */
export function stampOf(instant: Instant, scale: string): Stamp {
  try {
    return { iso: formatFileEpoch(bundledScales(), instant, scale), scale };
  } catch (error) {
    if (!(error instanceof OutOfDomainError)) throw error;
    return { iso: formatFileEpoch(bundledScales(), instant, 'GPS'), scale: 'GPS' };
  }
}

/** The codes a stamp may name after its time (those on the SDK's scales without an hour offset; not GLO). */
const STAMP_CODES = FILE_TIME_SYSTEM_CODES.filter((code) => fileTimeScale(code)?.hoursAhead === 0);

/** How an absolute-epoch flag is read, for help texts. */
export const STAMP_HELP =
  'ISO 8601, read on GPS time, on UTC with a zone designator (Z), or on the time system named after it ' +
  `(${STAMP_CODES.join(', ')}), e.g. 2027-02-08T06:00:00, 2027-02-08T06:00:00Z or "2027-02-08T06:00:00 BDT"`;

/**
 * The instant of an absolute epoch given on the command line, and the time system it was read on: ISO 8601 read
 * on `plain` (GPS time unless the command says otherwise, e.g. TT for proper time); with a zone designator (`Z`,
 * `+01:00`) on UTC; with a time-system code after it (as the tables print stamps, e.g. `2026-02-02T12:30:00 BDT`)
 * on that system.
 * @throws {UsageError} for a code the SDK cannot read a stamp on; the SDK's InvalidArgumentError (renamed to
 *   `flag`) for text that is not a date and time.
 */
export function parseStampFlag(
  flag: string,
  text: string,
  plain: 'GPS' | 'TT' = 'GPS',
): { instant: Instant; scale: string } {
  const plainName = plain === 'GPS' ? 'GPS time' : plain;
  if (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text.trim())) {
    throw new UsageError(
      `${flag} ${text}: an epoch is given as ISO 8601 (e.g. 2027-02-08T06:00:00 on ${plainName}, or with Z on UTC), not as a count of seconds`,
    );
  }
  const named = /^(\S+)\s+([A-Za-z]{3})$/.exec(text.trim());
  let iso = text;
  let scale: string = /(Z|[+-]\d\d:?\d\d)$/i.test(text) ? 'UTC' : plain;
  if (named) {
    const [, isoPart = '', code = ''] = named;
    if (!STAMP_CODES.includes(code)) {
      throw new UsageError(
        `${flag} ${JSON.stringify(text)}: a stamp is read on ${plainName}, on UTC with Z, or on one of ${STAMP_CODES.join(', ')} named after it`,
      );
    }
    // A UTC reading named by its code is read as if written with Z (parseIso asks UTC text for its designator).
    iso = code === 'UTC' && !/(Z|[+-]\d\d:?\d\d)$/i.test(isoPart) ? `${isoPart}Z` : isoPart;
    scale = code;
  }
  const onScale = scale === 'TT' ? 'TT' : (fileTimeScale(scale)?.scale ?? 'GPS');
  const instant = withFlagNames(
    () => flag,
    () => bundledScales().parseIso(iso, onScale),
  );
  return { instant, scale };
}

/** The instant of t = 0 of a record's time axis and the time system its stamps are printed in. */
export interface RecordEpoch {
  readonly instant: Instant;
  /** A RINEX clock file's time system (GPS when the header names none, as the reader assumes); for `--epoch`, the one it was read on. */
  readonly scale: string;
}

/**
 * The instant of t = 0 of a record's time axis: a RINEX clock file's first sample, or `--epoch` for a text record,
 * whose time column has no calendar; undefined for a text record without `--epoch`.
 * @throws {UsageError} for `--epoch` given with a RINEX clock file (which places its epochs itself).
 */
export function recordEpochFlag(args: ParsedArgs, rec: ClockRecord): RecordEpoch | undefined {
  const text = optionalFlag(args, 'epoch');
  if (rec.epoch !== undefined) {
    if (text !== undefined)
      throw new UsageError('--epoch is for a text record; a RINEX clock file places its epochs itself: leave it out');
    return { instant: rec.epoch, scale: rec.timeSystem ?? 'GPS' };
  }
  return text === undefined ? undefined : parseStampFlag('--epoch', text);
}

/** A gap of a record as JSON: its place in the series, and its time on the record's axis with its stamp. */
export interface GapJson {
  readonly index: number;
  readonly missing: number;
  readonly line: number;
  /** Seconds on the record's time axis (since the record's epoch, when it has one); absent for one-column text. */
  readonly time?: number;
  /** The first missing sample's epoch, when the record is placed on an absolute epoch. */
  readonly timeStamp?: Stamp;
}

/**
 * The gaps of a record for JSON, field by field (an SDK gap's `Instant` is not copied: the stamp gives it).
 * @param stamp  Seconds on the record's axis → stamp; omitted for a record without an absolute epoch.
 */
export function gapsJson(gaps: ClockRecord['gaps'], stamp?: (t: number) => Stamp): GapJson[] {
  return gaps.map(({ index, missing, line, time }) => ({
    index,
    missing,
    line,
    ...(time === undefined ? {} : { time, ...(stamp ? { timeStamp: stamp(time) } : {}) }),
  }));
}

/**
 * A record's time system for JSON: `{ timeSystem }` as a RINEX clock file names it, `{ timeSystemAssumed: true }`
 * when it names none (its stamps are then read on GPS time, as the reader places its epochs), nothing for text.
 */
export function timeSystemJson(
  record: Pick<ClockRecord, 'epoch' | 'timeSystem'>,
): { timeSystem: string } | { timeSystemAssumed: true } | Record<string, never> {
  if (record.timeSystem !== undefined) return { timeSystem: record.timeSystem };
  return record.epoch === undefined ? {} : { timeSystemAssumed: true };
}
