/**
 * One clock's bias series from a RINEX clock file, on a uniform grid, for the stability statistics.
 * {@link readRinexClockSeries} streams the file and keeps only the chosen clock's records, so memory grows
 * with that clock's series, not with the file; {@link rinexClockSeries} does the same from a parsed file.
 *
 * @module
 */
import { InvalidArgumentError, ParseError } from '../errors.js';
import { requireOptions, requireSourceName } from '../internal/validate.js';
import { Instant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import { GrowableColumn } from './growable.js';
import { MAX_SERIES_SAMPLES } from './limits.js';
import { type TextSource, validEpochFields } from './line-reader.js';
import { regularizeSeries, type SampleGap } from './phase-text.js';
import {
  type RinexClockFile,
  type RinexClockHeader,
  type RinexClockReadOptions,
  type RinexClockRecord,
  readRinexClock,
} from './rinex-clock.js';

/** A run of missing samples of a {@link RinexClockSeries}: a {@link SampleGap} placed on the series' own axis. */
export interface RinexClockGap extends SampleGap {
  /** Time of the first missing sample, in seconds since {@link RinexClockSeries.epoch} (on the series' `t` axis). */
  readonly time: Seconds;
  /** The first missing sample's instant: `series.epoch.plus(time)`. */
  readonly epoch: Instant;
}

/** The bias series of one clock, on a uniform grid. */
export interface RinexClockSeries {
  readonly name: string;
  readonly type: 'AS' | 'AR';
  /** The first sample's epoch, an absolute instant (exact). */
  readonly epoch: Instant;
  /** Each sample's time in seconds since {@link RinexClockSeries.epoch} (gaps included). */
  readonly t: Float64Array;
  /** Phase (clock bias) in seconds; NaN for every missing epoch. */
  readonly phase: Float64Array;
  /** Sample spacing, seconds (smallest step, or as given). */
  readonly tau0: Seconds | undefined;
  /** Runs of missing samples, each at its time on the `t` axis (seconds since `epoch`) and its instant. */
  readonly gaps: readonly RinexClockGap[];
  readonly missing: number;
  readonly timeSystem: string | undefined;
}

/** Options of the series functions. */
export interface RinexClockSeriesOptions {
  /** `AS` or `AR`, to choose when a name has both. */
  readonly type?: 'AS' | 'AR';
  /** Sample spacing to impose, in seconds (default: the smallest step between the clock's epochs). */
  readonly tau0?: Seconds;
}

/** How many distinct clock names an error message lists. */
const NAMES_LISTED = 20;

/**
 * Collects the records of one clock (name, and type when given) out of a stream of records, then builds
 * its uniform series. Records of other clocks are only counted by name (at most 20 names kept).
 */
export class RinexClockSeriesCollector {
  private readonly _source: string;
  private readonly _name: string;
  private readonly _options: RinexClockSeriesOptions;
  private readonly _times = new GrowableColumn();
  private readonly _values = new GrowableColumn();
  private readonly _lines = new GrowableColumn();
  private _type: 'AS' | 'AR' | undefined;
  private readonly _names = new Set<string>();
  /** First kept record: its instant (the origin of the kept times) and its line, for messages. */
  private _first: { epoch: Instant; line: number } | undefined;
  private _last: Instant | undefined;

  constructor(sourceName: string, name: string, options: RinexClockSeriesOptions = {}) {
    this._source = requireSourceName('sourceName', sourceName);
    if (typeof name !== 'string')
      throw new InvalidArgumentError('name', name, 'a satellite or receiver name, e.g. "G05"');
    this._name = name;
    this._options = requireOptions('options', options);
  }

  /** Takes one record; keeps it when it belongs to the chosen clock. @throws {ParseError} on a repeated or earlier epoch. */
  add(r: RinexClockRecord): void {
    requireClockRecord('record', r);
    if (r.name !== this._name || (this._options.type !== undefined && r.type !== this._options.type)) {
      if (this._names.size < NAMES_LISTED) this._names.add(r.name);
      return;
    }
    if (this._type === undefined) this._type = r.type;
    else if (this._type !== r.type) {
      throw new ParseError(
        this._source,
        r.line,
        1,
        `one record type for ${this._name}: it has both AS and AR records; choose one with options.type`,
      );
    }
    const n = this._times.length;
    if (this._last !== undefined && !r.epoch.isAfter(this._last)) {
      throw new ParseError(
        this._source,
        r.line,
        4,
        `an epoch later than the previous ${this._name} record (line ${this._lines.get(n - 1)})`,
      );
    }
    this._first ??= { epoch: r.epoch, line: r.line };
    this._last = r.epoch;
    this._times.push(r.epoch.secondsSince(this._first.epoch));
    this._values.push(r.bias);
    this._lines.push(r.line);
  }

  /**
   * Builds the series. Refuses, before allocating it, a series longer than {@link MAX_SERIES_SAMPLES}
   * (a far epoch such as year 9999 would otherwise ask for billions of samples).
   * @throws {InvalidArgumentError} no record for the clock (naming it and listing the clocks present).
   * @throws {ParseError} a step not a whole multiple of τ0, or a series over the limit.
   */
  finish(header: RinexClockHeader): RinexClockSeries {
    const h = header as Partial<RinexClockHeader> | null;
    if (
      typeof h !== 'object' ||
      h === null ||
      typeof h.lines !== 'number' ||
      !Number.isSafeInteger(h.lines) ||
      h.lines < 1 ||
      (h.timeSystem !== undefined && typeof h.timeSystem !== 'string')
    ) {
      throw new InvalidArgumentError(
        'header',
        header,
        'the header of the file the records came from ({ lines ≥ 1, timeSystem }, as the reader yields it)',
      );
    }
    const first = this._first;
    const type = this._type;
    if (first === undefined || type === undefined) {
      // Asking for a clock the file does not hold is an argument error (the file itself is fine).
      const names = [...this._names].join(', ');
      throw new InvalidArgumentError(
        'name',
        this._name,
        `a clock that the file ${this._source} holds${this._options.type ? ` as ${this._options.type} records` : ''}`,
        `The clocks present: ${names || 'none'}`,
      );
    }
    const lineOf = (i: number) => this._lines.get(i);
    // Times are exact offsets from the first record; messages name them so (the line locates the record).
    const timeText = (t: Seconds) => `${t} s after the epoch of line ${first.line}`;
    const reg = regularizeSeries(
      this._source,
      this._times.toArray(),
      this._values.toArray(),
      lineOf,
      this._options.tau0,
      timeText,
    );
    return {
      name: this._name,
      type,
      epoch: first.epoch,
      t: reg.times,
      phase: reg.phase,
      tau0: reg.tau0,
      gaps: reg.gaps.map((g) => gapOnAxis(g, first.epoch)),
      missing: reg.missing,
      timeSystem: header.timeSystem,
    };
  }
}

/** A gap of the regularised series (its `time` in seconds since `epoch`) with its instant beside it. */
function gapOnAxis(gap: SampleGap, epoch: Instant): RinexClockGap {
  const { time } = gap;
  // Every gap of a series with a time axis has a time (only one-column phase text has none).
  if (time === undefined) throw new Error('internal: a RINEX clock series gap without its time');
  return { index: gap.index, missing: gap.missing, line: gap.line, time, epoch: epoch.plus(time) };
}

/** Throws unless `r` is a record as {@link parseRinexClock} returns (a hand-made or damaged record is refused, naming the field). */
function requireClockRecord(argument: string, r: unknown): void {
  const rec = r as Partial<RinexClockRecord> | null;
  if (
    typeof rec !== 'object' ||
    rec === null ||
    typeof rec.name !== 'string' ||
    !Number.isFinite(rec.bias) ||
    !Number.isInteger(rec.line) ||
    !(rec.epoch instanceof Instant) ||
    typeof rec.time !== 'object' ||
    rec.time === null ||
    !validEpochFields(rec.time)
  ) {
    throw new InvalidArgumentError(
      argument,
      r,
      'a record { name, type, epoch: Instant, time, bias (s), line } as parseRinexClock returns',
    );
  }
}

/** Throws unless `file` has the shape {@link parseRinexClock} returns (records are checked as they are collected). */
function requireClockFile(file: unknown): void {
  const f = file as Partial<RinexClockFile> | null;
  if (
    typeof f !== 'object' ||
    f === null ||
    typeof f.sourceName !== 'string' ||
    typeof f.header !== 'object' ||
    f.header === null ||
    !Array.isArray(f.records)
  ) {
    throw new InvalidArgumentError('file', file, 'a parsed RINEX clock file (the result of parseRinexClock)');
  }
}

/**
 * Extracts one clock's bias as a uniformly sampled phase series from a parsed file. Missing epochs become
 * NaN samples listed in `gaps` (never interpolated).
 *
 * @param file     A parsed file ({@link parseRinexClock}).
 * @param name     Satellite or receiver name, e.g. `G05`.
 * @param options  `type` to choose AS or AR when a name has both; `tau0` (s) to impose the spacing.
 * @throws {InvalidArgumentError} if the file holds no record of the clock (the message lists the clocks present).
 * @throws {ParseError} if epochs repeat or go backwards, a step is not a whole multiple of τ0, or the series
 *   would exceed MAX_SERIES_SAMPLES (line of the offending record).
 */
export function rinexClockSeries(
  file: RinexClockFile,
  name: string,
  options: RinexClockSeriesOptions = {},
): RinexClockSeries {
  requireClockFile(file);
  const c = new RinexClockSeriesCollector(file.sourceName, name, options);
  for (const r of file.records) c.add(r);
  return c.finish(file.header);
}

/**
 * Streams a RINEX clock file and returns one clock's series, keeping only that clock's records in memory.
 *
 * @param source   File text or its chunks (sync or async iterable of strings).
 * @param name     Satellite or receiver name, e.g. `G05`.
 * @param options  `sourceName` for messages, `type` (AS/AR) and `tau0` (s) as in {@link rinexClockSeries}.
 * @throws {ParseError} from the reader (file, line, column) or as {@link rinexClockSeries};
 *   {@link InvalidArgumentError} when the file holds no record of the clock.
 */
export async function readRinexClockSeries(
  source: TextSource,
  name: string,
  options: RinexClockReadOptions & RinexClockSeriesOptions = {},
): Promise<RinexClockSeries> {
  requireOptions('options', options);
  const c = new RinexClockSeriesCollector(options.sourceName ?? 'rinex-clock', name, options);
  let header: RinexClockHeader | undefined;
  for await (const ev of readRinexClock(source, options)) {
    if (ev.kind === 'header') header = ev.header;
    else if (ev.kind === 'record') c.add(ev.record);
  }
  // The reader refuses a file without a complete header, so a header event has been seen.
  if (header === undefined) throw new Error('internal: RINEX clock reader ended without a header');
  return c.finish(header);
}
