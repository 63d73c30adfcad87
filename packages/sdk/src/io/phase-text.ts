/**
 * Reader for plain-text / CSV phase records: one phase value (seconds) per line, or two columns
 * `time phase` (both seconds), separated by whitespace, commas or semicolons; `#` starts a comment.
 * Missing epochs are detected from the time column and returned as NaN samples with a gap list,
 * never dropped or interpolated.
 *
 * @module
 */
import { ParseError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requireOptions, requireSourceName } from '../internal/validate.js';
import { type Instant, requireInstant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import { GrowableColumn } from './growable.js';
import { MAX_SERIES_SAMPLES } from './limits.js';
import { linesOf, readLineBatches, type TextLine, type TextSource } from './line-reader.js';

/** A run of missing samples in a regularised series. */
export interface SampleGap {
  /** Index in the regularised series of the first missing sample. */
  readonly index: number;
  /** Number of consecutive missing samples. */
  readonly missing: number;
  /** Source line of the sample that follows the gap (or of the NaN marker). */
  readonly line: number;
  /** Time of the first missing sample, in seconds (same origin as `times`); undefined for one-column input. */
  readonly time: Seconds | undefined;
}

/** A phase series read from text. */
export interface PhaseTextSeries {
  readonly sourceName: string;
  /** 1 (phase only) or 2 (time, phase). */
  readonly columns: 1 | 2;
  /** Column names from a header line, when the first data line was a header (e.g. `time,phase`). */
  readonly header: readonly string[] | undefined;
  /** Phase in seconds at uniform spacing; NaN marks a missing sample (explicit `NaN` or a missing epoch). */
  readonly phase: Float64Array;
  /** Epoch of every sample (seconds, the file's own origin) for two-column input, gaps included. */
  readonly times: Float64Array | undefined;
  /** Sample spacing τ0 in seconds: from the time column (smallest step) or as given; undefined if unknown. */
  readonly tau0: Seconds | undefined;
  /** Every run of missing samples. */
  readonly gaps: readonly SampleGap[];
  /** Total number of missing samples. */
  readonly missing: number;
  /**
   * The first sample as an absolute instant, when `options.epoch` placed the file's own time origin;
   * otherwise undefined (a text file has no calendar).
   */
  readonly epoch: Instant | undefined;
  /**
   * Each sample's time in seconds since the first sample (the series shape `{ epoch, t }`): from the time
   * column (two columns) or k·τ0 (one column with τ0); undefined for one column without τ0. Computed on first use.
   */
  readonly t: Float64Array | undefined;
}

/** What the reader knows of a phase file once its first data line is read. */
export interface PhaseTextHeader {
  readonly sourceName: string;
  /** 1 (phase only) or 2 (time, phase). */
  readonly columns: 1 | 2;
  /** Column names from a header line (e.g. `time,phase`), or undefined when the file has none. */
  readonly names: readonly string[] | undefined;
}

/** One data line as read (before any regularisation). */
export interface PhaseTextSample {
  /** Time in seconds (the file's own origin) for two-column input; undefined for one column. */
  readonly time: Seconds | undefined;
  /** Phase in seconds; NaN for an explicit `NaN` missing marker. */
  readonly phase: Seconds;
  /** Source line (1-based). */
  readonly line: number;
}

/**
 * An event of {@link readPhaseText}: the header (before the first sample), one event per data line, then,
 * once the whole file is read (τ0 from the time column is the smallest step, known only at the end), one
 * event per run of missing samples in the regularised series and a closing `end` event with τ0.
 */
export type PhaseTextEvent =
  | { readonly kind: 'header'; readonly header: PhaseTextHeader }
  | { readonly kind: 'sample'; readonly sample: PhaseTextSample }
  | { readonly kind: 'gap'; readonly gap: SampleGap }
  | { readonly kind: 'end'; readonly tau0: Seconds | undefined; readonly missing: number };

/** Options of {@link parsePhaseText}, {@link readPhaseText} and {@link readPhaseTextSeries}. */
export interface PhaseTextOptions {
  /** Name used in error messages (file name). Default `phase`. */
  readonly sourceName?: string;
  /**
   * Sample spacing τ0 in seconds. One-column input: stored as given. Two-column input: every time
   * step must be a whole multiple of it; default the smallest step in the file.
   */
  readonly tau0?: Seconds;
  /**
   * The instant at which the file's time column reads 0 s (one-column input: the instant of the first
   * sample). Gives the series its absolute `epoch`; default none.
   */
  readonly epoch?: Instant;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

interface Token {
  text: string;
  column: number;
}

function tokenize(text: string): Token[] {
  const out: Token[] = [];
  const re = /[^\s,;]+/g;
  for (let m = re.exec(text); m !== null; m = re.exec(text)) out.push({ text: m[0], column: m.index + 1 });
  return out;
}

/** Parses a number token; `NaN` (any case) is the explicit missing marker when `allowMissing`. */
function parseValue(sourceName: string, line: number, token: Token, what: string, allowMissing: boolean): number {
  if (allowMissing && token.text.toLowerCase() === 'nan') return Number.NaN;
  if (!NUMBER.test(token.text)) {
    throw new ParseError(
      sourceName,
      line,
      token.column,
      `${what} as a decimal number${allowMissing ? ' (or NaN for a missing sample)' : ''}`,
      token.text,
    );
  }
  const v = Number(token.text);
  if (!Number.isFinite(v)) throw new ParseError(sourceName, line, token.column, `a finite ${what}`, token.text);
  return v;
}

/** Accumulates lines; shared by the sync and async readers. */
class PhaseTextBuilder {
  private readonly _name: string;
  private readonly _options: PhaseTextOptions;
  private _columns: 1 | 2 | undefined;
  private _header: string[] | undefined;
  private _seenData = false;
  private readonly _times = new GrowableColumn();
  private readonly _values = new GrowableColumn();
  private readonly _lines = new GrowableColumn();
  constructor(options: PhaseTextOptions) {
    this._options = requireOptions('options', options);
    if (options.epoch !== undefined) requireInstant('options.epoch', options.epoch);
    this._name =
      options.sourceName === undefined ? 'phase' : requireSourceName('options.sourceName', options.sourceName);
  }

  /** Reads one line; returns the events it completed (none for a comment, blank or header line). */
  add(line: TextLine): PhaseTextEvent[] {
    const hash = line.text.indexOf('#');
    const body = hash >= 0 ? line.text.slice(0, hash) : line.text;
    const tokens = tokenize(body);
    const [first, second, third] = tokens;
    if (first === undefined) return [];
    if (
      !this._seenData &&
      this._header === undefined &&
      tokens.every((t) => !NUMBER.test(t.text) && t.text.toLowerCase() !== 'nan')
    ) {
      if (third)
        throw new ParseError(
          this._name,
          line.lineNumber,
          third.column,
          'at most two columns (time, phase)',
          third.text,
        );
      this._header = tokens.map((t) => t.text);
      this._columns = tokens.length as 1 | 2;
      return [];
    }
    if (this._columns === undefined) {
      if (third)
        throw new ParseError(
          this._name,
          line.lineNumber,
          third.column,
          'one column (phase) or two columns (time, phase)',
          third.text,
        );
      this._columns = tokens.length as 1 | 2;
    }
    if (tokens.length !== this._columns) {
      const extra = tokens[this._columns];
      throw new ParseError(
        this._name,
        line.lineNumber,
        extra?.column,
        `${this._columns} column${this._columns === 2 ? 's (time, phase)' : ' (phase)'} as on the first data line`,
        line.text,
      );
    }
    const events: PhaseTextEvent[] = [];
    if (!this._seenData) {
      events.push({
        kind: 'header',
        header: { sourceName: this._name, columns: this._columns, names: this._header },
      });
    }
    this._seenData = true;
    if (this._values.length >= MAX_SERIES_SAMPLES) {
      throw new ParseError(
        this._name,
        line.lineNumber,
        1,
        `at most ${MAX_SERIES_SAMPLES} samples (MAX_SERIES_SAMPLES, the longest series read)`,
        line.text,
      );
    }
    if (this._columns === 2 && second !== undefined) {
      const time = parseValue(this._name, line.lineNumber, first, 'time in seconds', false);
      if (this._times.length > 0 && !(time > this._times.get(this._times.length - 1))) {
        throw new ParseError(
          this._name,
          line.lineNumber,
          first.column,
          `a time later than the previous line's ${this._times.get(this._times.length - 1)} s (times must increase)`,
          first.text,
        );
      }
      this._times.push(time);
      this._values.push(parseValue(this._name, line.lineNumber, second, 'phase in seconds', true));
    } else {
      this._values.push(parseValue(this._name, line.lineNumber, first, 'phase in seconds', true));
    }
    this._lines.push(line.lineNumber);
    const time = this._columns === 2 ? this._times.get(this._times.length - 1) : undefined;
    events.push({
      kind: 'sample',
      sample: { time, phase: this._values.get(this._values.length - 1), line: line.lineNumber },
    });
    return events;
  }

  finish(lastLine: number): PhaseTextSeries {
    if (this._values.length === 0)
      throw new ParseError(this._name, Math.max(1, lastLine), undefined, 'at least one phase value', '');
    const columns = this._columns ?? 1;
    if (columns === 1) {
      const phase = this._values.toArray();
      const gaps: SampleGap[] = [];
      for (let i = 0; i < phase.length; i++) {
        if (phase[i] !== phase[i]) {
          const start = i;
          while (i + 1 < phase.length && phase[i + 1] !== phase[i + 1]) i++;
          gaps.push({ index: start, missing: i - start + 1, line: this._lines.get(start), time: undefined });
        }
      }
      return withRelativeTimes({
        sourceName: this._name,
        columns,
        header: this._header,
        phase,
        times: undefined,
        tau0: this._options.tau0,
        gaps,
        missing: gaps.reduce((s, g) => s + g.missing, 0),
        epoch: this._options.epoch,
      });
    }
    const reg = regularizeSeries(
      this._name,
      this._times.toArray(),
      this._values.toArray(),
      (i) => this._lines.get(i),
      this._options.tau0,
    );
    const first = reg.times[0] ?? 0;
    return withRelativeTimes({
      sourceName: this._name,
      columns,
      header: this._header,
      ...reg,
      epoch: this._options.epoch?.plus(first),
    });
  }
}

/** Adds `t` (seconds since the first sample) as a property computed on first use (it would double the memory held). */
function withRelativeTimes(series: Omit<PhaseTextSeries, 't'>): PhaseTextSeries {
  let t: Float64Array | undefined;
  return Object.defineProperty(series, 't', {
    enumerable: false,
    get(): Float64Array | undefined {
      if (t !== undefined) return t;
      const { times, tau0, phase } = series;
      if (times !== undefined) {
        const first = times[0] ?? 0;
        t = times.map((x) => x - first);
      } else if (tau0 !== undefined) {
        t = new Float64Array(phase.length);
        for (let k = 0; k < t.length; k++) t[k] = k * tau0;
      }
      return t;
    },
  }) as PhaseTextSeries;
}

/**
 * Places irregularly listed samples on a uniform grid t₀ + k·τ0, inserting NaN for each missing
 * epoch and listing the gaps. τ0 is the given value or the smallest step. Steps must be whole
 * multiples of τ0 (relative tolerance 1e-6); samples that are NaN themselves count as gaps too.
 * The grid's length is checked against {@link MAX_SERIES_SAMPLES} before it is allocated.
 *
 * `times` may be counted from any origin; the returned grid and each gap's `time` are on the same count.
 * `timeText` (default `String`) writes a time of that count in messages, so that a reader working on
 * exact offsets from its first epoch can still say which epoch it means.
 * Hot (one pass per sample of 10^6-line files): the per-sample loops read with `!`, indices bounded by
 * i < times.length = values.length = steps.length (the lengths checked on entry); `entries()` and
 * for-of allocate or run several times slower here (measured: parsePhaseText ×1.2–1.7 on 10^6 lines).
 *
 * @internal shared with the RINEX clock reader
 * @throws {ParseError} at the line of the first sample whose step is not a whole multiple of τ0, or
 *   whose gap makes the series longer than {@link MAX_SERIES_SAMPLES} (naming the gap and the limit).
 */
export function regularizeSeries(
  sourceName: string,
  times: Float64Array,
  values: Float64Array,
  lineOf: (i: number) => number,
  tau0Given: Seconds | undefined,
  timeText: (t: Seconds) => string = String,
): { phase: Float64Array; times: Float64Array; tau0: Seconds | undefined; gaps: SampleGap[]; missing: number } {
  if (values.length !== times.length) {
    throw new RangeError(
      `regularizeSeries: ${values.length} value(s) for ${times.length} time(s) (internal length error)`,
    );
  }
  let tau0 = tau0Given;
  if (tau0 !== undefined && !(tau0 > 0 && Number.isFinite(tau0))) {
    throw new ParseError(sourceName, lineOf(0), undefined, `a sample spacing tau0 > 0 s (given ${tau0})`);
  }
  if (tau0 === undefined && times.length >= 2) {
    tau0 = Infinity;
    for (let i = 1; i < times.length; i++) tau0 = Math.min(tau0, times[i]! - times[i - 1]!);
  }
  if (tau0 === undefined) {
    const first = times[0];
    const gaps = values[0] !== values[0] ? [{ index: 0, missing: 1, line: lineOf(0), time: first }] : [];
    return { phase: values.slice(), times: times.slice(), tau0: undefined, gaps, missing: gaps.length };
  }
  const t0 = at(times, 0, 'times');
  const { steps, total } = stepsOnGrid(sourceName, times, lineOf, tau0, timeText);
  const phase = new Float64Array(total).fill(Number.NaN);
  const grid = new Float64Array(total);
  for (let k = 0; k < total; k++) grid[k] = t0 + k * tau0;
  // Missing epochs between listed samples, and listed samples whose value is NaN, are the gaps.
  const gaps: SampleGap[] = [];
  let idx = 0;
  for (let i = 0; i < steps.length; i++) {
    const k = steps[i]!;
    if (k > 1) gaps.push({ index: idx + 1, missing: k - 1, line: lineOf(i), time: t0 + (idx + 1) * tau0 });
    idx += k;
    const value = values[i]!;
    phase[idx] = value;
    if (value !== value) gaps.push({ index: idx, missing: 1, line: lineOf(i), time: at(grid, idx, 'grid') });
  }
  gaps.sort((a, b) => a.index - b.index);
  let missing = 0;
  for (const g of gaps) missing += g.missing;
  return { phase, times: grid, tau0, gaps, missing };
}

/**
 * The grid steps k_i = (t_i − t_{i−1})/τ0 of each listed sample (k_0 = 0), each checked to be a
 * whole multiple of τ0, and the grid's length 1 + Σ k_i, checked against {@link MAX_SERIES_SAMPLES}
 * as it grows.
 */
function stepsOnGrid(
  sourceName: string,
  times: Float64Array,
  lineOf: (i: number) => number,
  tau0: Seconds,
  timeText: (t: Seconds) => string,
): { steps: Int32Array; total: number } {
  let total = 1;
  const steps = new Int32Array(times.length);
  for (let i = 1; i < times.length; i++) {
    const t = times[i]!;
    const step = t - times[i - 1]!;
    const ratio = step / tau0;
    const k = Math.round(ratio);
    if (k < 1 || Math.abs(ratio - k) > 1e-6 * Math.max(1, k)) {
      throw new ParseError(
        sourceName,
        lineOf(i),
        1,
        `a time step that is a whole multiple of tau0 = ${tau0} s (step ${step} s from the previous sample is ${ratio} tau0)`,
        timeText(t),
      );
    }
    if (total + k > MAX_SERIES_SAMPLES) {
      // Refused before anything of that length is allocated (a gap of 10^12 samples would ask for terabytes).
      throw new ParseError(
        sourceName,
        lineOf(i),
        1,
        `a uniform series of at most ${MAX_SERIES_SAMPLES} samples (MAX_SERIES_SAMPLES): the gap of ${step} s ` +
          `after line ${lineOf(i - 1)} is ${k} steps of tau0 = ${tau0} s, making ${total + k} samples`,
        timeText(t),
      );
    }
    steps[i] = k;
    total += k;
  }
  return { steps, total };
}

/**
 * Reads a phase record from text (synchronously).
 *
 * Format: one phase value x (seconds) per line, or two columns `time phase` (seconds, seconds);
 * separators are whitespace, `,` or `;`; `#` starts a comment (whole line or trailing); blank
 * lines are ignored; one optional header line of column names (e.g. `time,phase`) before the
 * data. `NaN` marks a missing phase value. With two columns, τ0 is the smallest time step (or
 * `options.tau0`); every step must be a whole multiple of τ0 and skipped epochs become NaN
 * samples listed in `gaps`.
 *
 * @param source   The text (string or iterable of chunks).
 * @param options  Source name for messages, τ0.
 * @returns The series with gaps reported.
 * @throws {ParseError} (file, line, column) for a non-numeric or infinite value, a changing column
 *   count, non-increasing times, a step that is not a multiple of τ0, or no data.
 */
export function parsePhaseText(source: string | Iterable<string>, options: PhaseTextOptions = {}): PhaseTextSeries {
  const builder = new PhaseTextBuilder(options);
  let last = 0;
  for (const line of linesOf(source, { sourceName: options.sourceName ?? 'phase' })) {
    builder.add(line);
    last = line.lineNumber;
  }
  return builder.finish(last);
}

/**
 * Reads a phase record from any text source, including an async iterable of chunks (a file stream), as
 * events: `header` before the first sample, one `sample` per data line as read (explicit `NaN` kept), then,
 * at the end of the input, one `gap` per run of missing samples in the regularised series (as in
 * {@link PhaseTextSeries.gaps}) and `end` with τ0. Same format and errors as {@link parsePhaseText}; a
 * malformed line throws when it is reached, after the events of the lines before it. Memory: the time
 * column is kept to place the gaps (τ0 from the file is its smallest step, known only at the end); see
 * {@link readPhaseTextSeries} for the whole series.
 *
 * @param source   The text (string, iterable or async iterable of chunks).
 * @param options  Source name for messages, τ0, epoch.
 * @returns An async generator of {@link PhaseTextEvent}.
 * @throws {ParseError} (file, line, column) as {@link parsePhaseText}.
 */
export async function* readPhaseText(
  source: TextSource,
  options: PhaseTextOptions = {},
): AsyncGenerator<PhaseTextEvent> {
  const builder = new PhaseTextBuilder(options);
  let last = 0;
  for await (const lines of readLineBatches(source, { sourceName: options.sourceName ?? 'phase' })) {
    for (const line of lines) {
      for (const event of builder.add(line)) yield event;
      last = line.lineNumber;
    }
  }
  const series = builder.finish(last);
  for (const gap of series.gaps) yield { kind: 'gap', gap };
  yield { kind: 'end', tau0: series.tau0, missing: series.missing };
}

/**
 * Reads a whole phase record from any text source, including an async iterable of chunks (a file
 * stream): the collecting form of {@link readPhaseText}, giving the same series as {@link parsePhaseText}.
 * @throws {ParseError} (file, line, column) as {@link parsePhaseText}.
 */
export async function readPhaseTextSeries(
  source: TextSource,
  options: PhaseTextOptions = {},
): Promise<PhaseTextSeries> {
  const builder = new PhaseTextBuilder(options);
  let last = 0;
  for await (const lines of readLineBatches(source, { sourceName: options.sourceName ?? 'phase' })) {
    for (const line of lines) {
      builder.add(line);
      last = line.lineNumber;
    }
  }
  return builder.finish(last);
}
