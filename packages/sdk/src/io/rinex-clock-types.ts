/**
 * Types of the RINEX clock reader (see `rinex-clock.ts` for the format sources and column layouts).
 *
 * @module
 */
import type { Instant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import type { Seconds } from '../units.js';
import type { EpochFields } from './line-reader.js';

/** Header fields the reader interprets. */
export interface RinexClockHeader {
  /** Format version, e.g. 3.04. */
  readonly version: number;
  /** Name field width of the data records: `A4` (2.00–3.02) or `A9` (3.04 and later). */
  readonly layout: 'A4' | 'A9';
  /** Satellite-system letter (G, R, E, C, J, I, S, M) or undefined when blank. */
  readonly satelliteSystem: string | undefined;
  /** `TIME SYSTEM ID` (e.g. GPS, GAL, UTC) when present; the epochs are in this scale. */
  readonly timeSystem: string | undefined;
  /**
   * The time system the epochs are read on: `timeSystem`, or `GPS` when the header has no
   * `TIME SYSTEM ID` line (GPS time is the format's default, RINEX clock 3.02 [M]).
   */
  readonly epochTimeSystem: string;
  /** True when the header names no time system and GPS time is assumed. */
  readonly timeSystemAssumed: boolean;
  /** Number of header lines, `END OF HEADER` included. */
  readonly lines: number;
}

/** One `AS` or `AR` clock-data record. */
export interface RinexClockRecord {
  readonly type: 'AS' | 'AR';
  /** Satellite (e.g. `G05`) or receiver/station name as written (trailing blanks removed). */
  readonly name: string;
  /** The epoch as an absolute instant: the record's calendar fields read on the header's time system, exact. */
  readonly epoch: Instant;
  /** The epoch's calendar fields as written (file's time system), for messages. */
  readonly time: EpochFields;
  /** Clock bias (s). */
  readonly bias: Seconds;
  /** Bias sigma (s), when given. */
  readonly biasSigma: Seconds | undefined;
  /** Clock rate (dimensionless, s/s), when given. */
  readonly rate: number | undefined;
  /** Rate sigma (s/s), when given. */
  readonly rateSigma: number | undefined;
  /** Clock acceleration (1/s), when given. */
  readonly acceleration: number | undefined;
  /** Acceleration sigma (1/s), when given. */
  readonly accelerationSigma: number | undefined;
  /** Line number of the record line. */
  readonly line: number;
}

/** One item of a RINEX clock file, in file order. */
export type RinexClockEvent =
  | { readonly kind: 'header'; readonly header: RinexClockHeader }
  | { readonly kind: 'record'; readonly record: RinexClockRecord }
  /** A `CR`, `DR` or `MS` record: read and checked like the others, not modelled. */
  | { readonly kind: 'other'; readonly recordType: 'CR' | 'DR' | 'MS'; readonly name: string; readonly line: number };

/** Options of the RINEX clock readers. */
export interface RinexClockReadOptions {
  /** Name used in error messages (default `rinex-clock`). */
  readonly sourceName?: string;
  /** Leap-second table for UTC and GLONASS-time files (default: the bundled table, valid until 2027-06-28). */
  readonly timeScales?: TimeScales;
}

/** A parsed RINEX clock file (whole file in memory; see {@link readRinexClock} for streaming). */
export interface RinexClockFile {
  readonly sourceName: string;
  readonly header: RinexClockHeader;
  readonly records: readonly RinexClockRecord[];
  /** How many records of each other type (CR, DR, MS) were present and not returned. */
  readonly otherRecords: Readonly<Record<string, number>>;
}
