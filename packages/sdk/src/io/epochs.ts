/**
 * The readers' one way to turn an epoch as written into an {@link Instant}: the file's calendar
 * fields on the time system its header names, through the time module (never calendar arithmetic
 * of the reader's own). A failure becomes a ParseError at the epoch's line and column.
 *
 * @module
 */
import { InvalidArgumentError, OutOfDomainError, ParseError } from '../errors.js';
import { FILE_TIME_SYSTEM_CODES, fileTimeScale, instantFromFileEpoch, requireTimeScales } from '../time/file-epochs.js';
import type { Instant } from '../time/instant.js';
import { BUNDLED_LEAP_SECONDS } from '../time/leap-seconds.js';
import { createTimeScales, type TimeScales } from '../time/scales.js';
import type { EpochFields } from './line-reader.js';

let bundled: TimeScales | undefined;

/**
 * The time scales a reader uses for UTC and GLONASS-time epochs: `given` (the `timeScales` option),
 * or the bundled leap-second table (valid until 2027-06-28).
 * @throws {InvalidArgumentError} when `given` is not a TimeScales object.
 */
export function readerTimeScales(given: unknown): TimeScales {
  if (given === undefined) return (bundled ??= createTimeScales(BUNDLED_LEAP_SECONDS));
  return requireTimeScales('options.timeScales', given);
}

/** Whether the SDK can place epochs written on `code` (see `fileTimeScale`). */
export function isReadableTimeSystem(code: string): boolean {
  return fileTimeScale(code) !== undefined;
}

/** The readable time-system codes, for messages. */
export const READABLE_TIME_SYSTEMS = FILE_TIME_SYSTEM_CODES.join(', ');

/** Where an epoch is written, for the ParseError when it cannot be placed. */
export interface EpochLocation {
  readonly source: string;
  readonly line: number;
  readonly column: number;
  /** The epoch's text as written. */
  readonly text: string;
}

/**
 * Places one file's epochs: {@link fileEpochInstant} with a one-entry memory, since consecutive records
 * usually share their epoch (a RINEX clock file lists every clock at each epoch).
 */
export class EpochPlacer {
  private readonly _ts: TimeScales;
  private readonly _code: string;
  private _last: EpochFields | undefined;
  private _lastInstant: Instant | undefined;

  constructor(ts: TimeScales, code: string) {
    this._ts = ts;
    this._code = code;
  }

  /** The instant of `fields` (see {@link fileEpochInstant}). @throws {ParseError} at `where`. */
  place(fields: EpochFields, where: EpochLocation): Instant {
    const last = this._last;
    if (
      last !== undefined &&
      this._lastInstant !== undefined &&
      last.second === fields.second &&
      last.minute === fields.minute &&
      last.hour === fields.hour &&
      last.day === fields.day &&
      last.month === fields.month &&
      last.year === fields.year
    ) {
      return this._lastInstant;
    }
    const instant = fileEpochInstant(this._ts, fields, this._code, where);
    this._last = fields;
    this._lastInstant = instant;
    return instant;
  }
}

/**
 * The instant of an epoch as written (fields already checked to be a calendar date and time).
 * @throws {ParseError} at `line`/`column` when the epoch cannot be placed (a UTC date the
 *   leap-second table does not cover, 23:59:60 outside a leap second).
 */
export function fileEpochInstant(ts: TimeScales, fields: EpochFields, code: string, where: EpochLocation): Instant {
  try {
    return instantFromFileEpoch(ts, fields, code);
  } catch (error) {
    if (error instanceof OutOfDomainError || error instanceof InvalidArgumentError) {
      const reason =
        error instanceof OutOfDomainError
          ? `an epoch the leap-second table covers (${error.message}; pass options.timeScales built from a current table)`
          : `an epoch that exists on the ${code} time scale (${error.message})`;
      throw new ParseError(where.source, where.line, where.column, reason, where.text);
    }
    throw error;
  }
}
