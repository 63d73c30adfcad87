/**
 * Reader for the clock-data records of the RINEX clock format ("RINEX Extensions to Handle Clock
 * Information", J. Ray, W. Gurtner, M. J. Coleman; versions 2.00 … 3.04, IGS). Header: version,
 * file type `C`, satellite system, `TIME SYSTEM ID`, `END OF HEADER`. Data: `AS` (satellite) and
 * `AR` (receiver) records with their values; other record types (`CR`, `DR`, `MS`) are counted,
 * not returned.
 *
 * Data records are read field by field separated by blanks rather than by fixed columns, so the
 * 4-character names of versions 2.00–3.02 and the 9-character names of 3.04 are both accepted.
 * Record layout (all versions): type A2, name, epoch year month day hour minute second, number of
 * values (1–6), then the values: clock bias (s), bias sigma (s), rate (s/s), rate sigma (s/s),
 * acceleration (1/s), acceleration sigma (1/s). Up to two values on the record line, the rest on
 * one continuation line of up to four values. Fortran `D` exponents are accepted.
 *
 * @module
 */
import { InvalidArgumentError, ParseError } from '../errors.js';
import type { Seconds } from '../units.js';
import {
  linesOf, parseFortranReal, readLineBatches, scaleSecondsFromFields, validEpochFields, type EpochFields, type TextLine, type TextSource,
} from './line-reader.js';
import { regularizeSeries, type SampleGap } from './phase-text.js';
import { requireSourceName } from '../internal/validate.js';

/** Header fields the reader interprets. */
export interface RinexClockHeader {
  /** Format version, e.g. 3.04. */
  readonly version: number;
  /** Satellite-system letter (G, R, E, C, J, I, S, M) or undefined when blank. */
  readonly satelliteSystem: string | undefined;
  /** `TIME SYSTEM ID` (e.g. GPS, GAL, UTC) when present; the epochs are in this scale. */
  readonly timeSystem: string | undefined;
  /** Number of header lines, `END OF HEADER` included. */
  readonly lines: number;
}

/** One `AS` or `AR` clock-data record. */
export interface RinexClockRecord {
  readonly type: 'AS' | 'AR';
  /** Satellite (e.g. `G05`) or receiver/station name as written. */
  readonly name: string;
  /** Epoch as written, in the file's time system. */
  readonly epoch: EpochFields;
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

/** A parsed RINEX clock file. */
export interface RinexClockFile {
  readonly sourceName: string;
  readonly header: RinexClockHeader;
  readonly records: readonly RinexClockRecord[];
  /** How many records of each other type (CR, DR, MS) were present and not returned. */
  readonly otherRecords: Readonly<Record<string, number>>;
}

interface Token {
  text: string;
  column: number;
}

function tokenize(text: string): Token[] {
  const out: Token[] = [];
  const re = /\S+/g;
  for (let m = re.exec(text); m !== null; m = re.exec(text)) out.push({ text: m[0], column: m.index + 1 });
  return out;
}

const RECORD_TYPES = new Set(['AS', 'AR', 'CR', 'DR', 'MS']);

/** Line-by-line state machine shared by the sync and async readers. */
class RinexClockBuilder {
  private readonly _name: string;
  private _headerDone = false;
  private _version: number | undefined;
  private _system: string | undefined;
  private _timeSystem: string | undefined;
  private _headerLines = 0;
  private readonly _records: RinexClockRecord[] = [];
  private readonly _other: Record<string, number> = {};
  private _pending: { type: string; name: string; epoch: EpochFields; count: number; values: number[]; line: number } | undefined;

  constructor(sourceName: string) {
    this._name = requireSourceName('sourceName', sourceName);
  }

  add(line: TextLine): void {
    if (!this._headerDone) {
      this._header(line);
      return;
    }
    if (this._pending) {
      this._continuation(line);
      return;
    }
    if (line.text.trim() === '') return;
    this._record(line);
  }

  private _header(line: TextLine): void {
    this._headerLines = line.lineNumber;
    const text = line.text;
    const labelAt = (label: string) => {
      const i = text.indexOf(label);
      return i >= 60 ? i : -1;
    };
    if (this._version === undefined) {
      const at = labelAt('RINEX VERSION / TYPE');
      if (at < 0) throw new ParseError(this._name, line.lineNumber, 61, '"RINEX VERSION / TYPE" header line (label from column 61)', text);
      const tokens = tokenize(text.slice(0, at));
      const version = tokens[0] ? Number(tokens[0].text) : Number.NaN;
      if (!Number.isFinite(version) || version < 2 || version >= 4) {
        throw new ParseError(this._name, line.lineNumber, tokens[0]?.column ?? 1, 'a RINEX clock format version 2.xx or 3.xx', tokens[0]?.text ?? '');
      }
      if (!tokens[1] || tokens[1].text[0] !== 'C') {
        throw new ParseError(this._name, line.lineNumber, tokens[1]?.column ?? 21, 'file type "C" (clock data)', tokens[1]?.text ?? '');
      }
      this._version = version;
      // Satellite system from column 41 (3.xx); blank in 2.xx.
      const sys = text.slice(40, Math.min(41, at)).trim();
      this._system = /^[GRECJISM]$/.test(sys) ? sys : undefined;
      return;
    }
    if (labelAt('TIME SYSTEM ID') >= 0) {
      const t = text.slice(0, labelAt('TIME SYSTEM ID')).trim();
      if (t === '') throw new ParseError(this._name, line.lineNumber, 4, 'a time system identifier (e.g. GPS) in columns 4-6', text);
      this._timeSystem = t;
      return;
    }
    if (labelAt('END OF HEADER') >= 0) this._headerDone = true;
  }

  private _record(line: TextLine): void {
    const tokens = tokenize(line.text);
    const type = tokens[0]!;
    if (!RECORD_TYPES.has(type.text)) {
      throw new ParseError(this._name, line.lineNumber, type.column, 'a clock data record type AS, AR, CR, DR or MS', type.text);
    }
    if (tokens.length < 9) {
      throw new ParseError(this._name, line.lineNumber, undefined,
        'type, name, epoch (year month day hour minute second) and number of values', line.text);
    }
    const ints = tokens.slice(2, 7).map((t) => (/^\d+$/.test(t.text) ? Number(t.text) : Number.NaN));
    const second = /^\d+(\.\d*)?$/.test(tokens[7]!.text) ? Number(tokens[7]!.text) : Number.NaN;
    const epoch: EpochFields = { year: ints[0]!, month: ints[1]!, day: ints[2]!, hour: ints[3]!, minute: ints[4]!, second };
    if (!validEpochFields(epoch)) {
      throw new ParseError(this._name, line.lineNumber, tokens[2]!.column, 'a valid epoch "yyyy mm dd hh mm ss.ssssss"', tokens.slice(2, 8).map((t) => t.text).join(' '));
    }
    const countToken = tokens[8]!;
    const count = /^\d+$/.test(countToken.text) ? Number(countToken.text) : Number.NaN;
    if (!(count >= 1 && count <= 6)) {
      throw new ParseError(this._name, line.lineNumber, countToken.column, 'a number of data values from 1 to 6', countToken.text);
    }
    const valueTokens = tokens.slice(9);
    if (valueTokens.length > Math.min(2, count)) {
      const t = valueTokens[Math.min(2, count)]!;
      throw new ParseError(this._name, line.lineNumber, t.column, `at most ${Math.min(2, count)} value(s) on the record line`, t.text);
    }
    if (valueTokens.length < Math.min(2, count)) {
      throw new ParseError(this._name, line.lineNumber, line.text.length + 1, `${Math.min(2, count)} value(s) on the record line (the record declares ${count})`, line.text);
    }
    const values = valueTokens.map((t) => this._value(line.lineNumber, t));
    this._pending = { type: type.text, name: tokens[1]!.text, epoch, count, values, line: line.lineNumber };
    if (values.length === count) this._complete();
  }

  private _continuation(line: TextLine): void {
    const p = this._pending!;
    const tokens = tokenize(line.text);
    const need = p.count - p.values.length;
    if (tokens.length !== need) {
      throw new ParseError(this._name, line.lineNumber, tokens[need]?.column,
        `a continuation line with the remaining ${need} value(s) of the record on line ${p.line}`, line.text);
    }
    for (const t of tokens) p.values.push(this._value(line.lineNumber, t));
    this._complete();
  }

  private _value(lineNumber: number, token: Token): number {
    const v = parseFortranReal(token.text);
    if (v === undefined || Number.isNaN(v)) {
      throw new ParseError(this._name, lineNumber, token.column, 'a number such as -0.123456789012E-04 (D exponent allowed)', token.text);
    }
    return v;
  }

  private _complete(): void {
    const p = this._pending!;
    this._pending = undefined;
    if (p.type === 'AS' || p.type === 'AR') {
      const v = p.values;
      this._records.push({
        type: p.type, name: p.name, epoch: p.epoch, bias: v[0]!, biasSigma: v[1], rate: v[2], rateSigma: v[3],
        acceleration: v[4], accelerationSigma: v[5], line: p.line,
      });
    } else {
      this._other[p.type] = (this._other[p.type] ?? 0) + 1;
    }
  }

  finish(lastLine: number): RinexClockFile {
    if (this._version === undefined) throw new ParseError(this._name, Math.max(1, lastLine), undefined, '"RINEX VERSION / TYPE" header line', '');
    if (!this._headerDone) throw new ParseError(this._name, lastLine + 1, undefined, '"END OF HEADER" before the end of the file');
    if (this._pending) {
      throw new ParseError(this._name, lastLine + 1, undefined,
        `the continuation line of the record on line ${this._pending.line} (it declares ${this._pending.count} values; the file ends after ${this._pending.values.length})`);
    }
    return {
      sourceName: this._name,
      header: { version: this._version, satelliteSystem: this._system, timeSystem: this._timeSystem, lines: this._headerLines },
      records: this._records,
      otherRecords: { ...this._other },
    };
  }
}

/**
 * Parses a RINEX clock file (versions 2.00–3.04) into its header and `AS`/`AR` records.
 *
 * @param source      The text (string or iterable of chunks).
 * @param sourceName  File name for error messages. Default `rinex-clock`.
 * @returns Header, records in file order, and counts of the other record types.
 * @throws {ParseError} (file, line, column) on a missing or wrong version line, missing
 *   `END OF HEADER`, an unknown record type, a bad epoch, a value count outside 1–6, a
 *   malformed number, or a record truncated by the end of the file.
 * @see J. Ray, W. Gurtner, M. J. Coleman, "RINEX Extensions to Handle Clock Information", version 3.04 (IGS, 2017) [M].
 */
export function parseRinexClock(source: string | Iterable<string>, sourceName = 'rinex-clock'): RinexClockFile {
  const b = new RinexClockBuilder(sourceName);
  let last = 0;
  for (const line of linesOf(source)) {
    b.add(line);
    last = line.lineNumber;
  }
  return b.finish(last);
}

/** Like {@link parseRinexClock} for any text source, including an async iterable of chunks. */
export async function readRinexClock(source: TextSource, sourceName = 'rinex-clock'): Promise<RinexClockFile> {
  const b = new RinexClockBuilder(sourceName);
  let last = 0;
  for await (const lines of readLineBatches(source)) {
    for (const line of lines) {
      b.add(line);
      last = line.lineNumber;
    }
  }
  return b.finish(last);
}

/** The bias series of one clock, on a uniform grid. */
export interface RinexClockSeries {
  readonly name: string;
  readonly type: 'AS' | 'AR';
  /** Phase (clock bias) in seconds; NaN for every missing epoch. */
  readonly phase: Float64Array;
  /** Epoch of each sample in seconds since 1980-01-06T00:00:00 of the file's time system (no leap seconds). */
  readonly times: Float64Array;
  /** Sample spacing, seconds (smallest step, or as given). */
  readonly tau0: Seconds | undefined;
  readonly gaps: readonly SampleGap[];
  readonly missing: number;
  readonly timeSystem: string | undefined;
}

/** Throws unless `file` has the shape {@link parseRinexClock} returns (a hand-made or damaged file is refused, naming the field). */
function requireClockFile(file: unknown): void {
  const f = file as Partial<RinexClockFile> | null;
  if (typeof f !== 'object' || f === null || typeof f.sourceName !== 'string' || typeof f.header !== 'object' || f.header === null
    || !Array.isArray(f.records)) {
    throw new InvalidArgumentError('file', file, 'a parsed RINEX clock file (the result of parseRinexClock)');
  }
  f.records.forEach((r: Partial<RinexClockRecord> | null, i) => {
    if (typeof r !== 'object' || r === null || typeof r.name !== 'string' || !Number.isFinite(r.bias) || !Number.isInteger(r.line)
      || typeof r.epoch !== 'object' || r.epoch === null || !validEpochFields(r.epoch)) {
      throw new InvalidArgumentError(`file.records[${i}]`, r, 'a record { name, type, epoch, bias (s), line } as parseRinexClock returns');
    }
  });
}

/**
 * Extracts one clock's bias as a uniformly sampled phase series for the stability statistics.
 * Missing epochs become NaN samples listed in `gaps` (never interpolated).
 *
 * @param file   A parsed file.
 * @param name   Satellite or receiver name, e.g. `G05`.
 * @param options `type` to choose AS or AR when a name has both; `tau0` (s) to impose the spacing.
 * @throws {ParseError} if the clock has no records, epochs repeat or go backwards, or a step is not
 *   a whole multiple of τ0 (line of the offending record).
 */
export function rinexClockSeries(file: RinexClockFile, name: string, options: { type?: 'AS' | 'AR'; tau0?: Seconds } = {}): RinexClockSeries {
  requireClockFile(file);
  if (typeof name !== 'string') throw new InvalidArgumentError('name', name, 'a satellite or receiver name, e.g. "G05"');
  if (typeof options !== 'object' || options === null) throw new InvalidArgumentError('options', options, 'an object { type?, tau0? } (or omitted)');
  const recs = file.records.filter((r) => r.name === name && (options.type === undefined || r.type === options.type));
  if (recs.length === 0) {
    const names = [...new Set(file.records.map((r) => r.name))].slice(0, 20).join(', ');
    throw new ParseError(file.sourceName, file.header.lines, undefined, `records for clock ${JSON.stringify(name)} (clocks present: ${names || 'none'})`);
  }
  const types = new Set(recs.map((r) => r.type));
  if (types.size > 1) {
    throw new ParseError(file.sourceName, recs[0]!.line, 1, `one record type for ${name}: it has both AS and AR records; choose one with options.type`);
  }
  const times = new Float64Array(recs.length);
  const values = new Float64Array(recs.length);
  recs.forEach((r, i) => {
    times[i] = scaleSecondsFromFields(r.epoch);
    values[i] = r.bias;
    if (i > 0 && !(times[i]! > times[i - 1]!)) {
      throw new ParseError(file.sourceName, r.line, 4, `an epoch later than the previous ${name} record (line ${recs[i - 1]!.line})`);
    }
  });
  const reg = regularizeSeries(file.sourceName, times, values, (i) => recs[i]!.line, options.tau0);
  return { name, type: recs[0]!.type, ...reg, timeSystem: file.header.timeSystem };
}
