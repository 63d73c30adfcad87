/**
 * How the epochs of a clock record print. A RINEX clock file's epochs are seconds since
 * 1980-01-06T00:00:00 of its own time system; they print as calendar times in that system
 * (converted by the SDK, no calendar arithmetic here). A text record's time column has no calendar:
 * its epochs stay seconds.
 */
import { OutOfDomainError } from '@tauline/sdk/errors';
import { fieldsFromScaleSeconds, formatEpochFields } from '@tauline/sdk/io';
import {
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  formatFileEpoch,
  type Instant,
  type TimeScales,
} from '@tauline/sdk/time';
import { sig } from './framework.js';
import type { ClockRecord } from './records.js';

/** Printing of one record's epochs. */
export interface EpochFormat {
  /** An epoch for a table or a sentence, e.g. `2026-02-02T00:55:00 GPS` or `750000 s`. */
  text(t: number): string;
  /** ISO 8601 calendar text (no zone designator; read in {@link EpochFormat.scale}) for JSON, or undefined for a text record. */
  iso(t: number): string | undefined;
  /** The time system the calendar text is read in (a RINEX file's, e.g. `GPS`), or undefined for a text record. */
  scale: string | undefined;
  /** An epoch in a column headed {@link EpochFormat.column}: the text without its scale or unit. */
  cell(t: number): string;
  /** Header of an epoch column, e.g. `epoch (GPS)` or `epoch (s)`. */
  column: string;
}

/** The epoch printing of `record`: calendar in the file's time system for RINEX clock files, seconds otherwise. */
export function epochFormat(record: Pick<ClockRecord, 'flag' | 'timeSystem'>): EpochFormat {
  if (record.flag !== '--rinex-clock') {
    return {
      text: (t) => `${sig(t, 12)} s`,
      cell: (t) => sig(t, 12),
      iso: () => undefined,
      scale: undefined,
      column: 'epoch (s)',
    };
  }
  // A file without a TIME SYSTEM ID line: the calendar is the file's own; say that it is not named.
  const scale = record.timeSystem;
  const iso = (t: number): string => formatEpochFields(fieldsFromScaleSeconds(t));
  return {
    text: (t) => `${iso(t)} ${scale ?? '(time system not stated)'}`,
    cell: iso,
    iso,
    scale,
    column: `epoch (${scale ?? 'file time'})`,
  };
}

/** An absolute epoch for JSON: ISO 8601 text (no zone designator) read on `scale`, a time-system code (GPS, UTC, …). */
export interface Stamp {
  readonly iso: string;
  readonly scale: string;
}

let bundled: TimeScales | undefined;

/**
 * `instant` read on the time system `scale` (GPS, GAL, BDT, QZS, TAI, UTC, GLO), through the SDK's time helpers.
 * A UTC-based reading (UTC, GLO) outside the leap-second table is given on GPS time instead, and says so in `scale`
 * (the seconds fields beside it need no table; failing the command over a stamp would lose them).
 */
export function stampOf(instant: Instant, scale: string): Stamp {
  bundled ??= createTimeScales(BUNDLED_LEAP_SECONDS);
  try {
    return { iso: formatFileEpoch(bundled, instant, scale), scale };
  } catch (error) {
    if (!(error instanceof OutOfDomainError)) throw error;
    return { iso: formatFileEpoch(bundled, instant, 'GPS'), scale: 'GPS' };
  }
}
