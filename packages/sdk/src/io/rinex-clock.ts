/**
 * Streaming reader for the RINEX clock format, versions 2.00 to 3.05 ("RINEX Extensions to Handle Clock
 * Information", J. Ray and W. Gurtner, version 2.00 (1999) and 3.02 (2010), IGS; version 3.04 with
 * M. J. Coleman (2017)). The 3.02 document's change list was read [V1]; column layouts are from memory
 * [M], checked against the 3.04 example file distributed with the format and real IGS 2.00/3.04 files
 * (stored copies) [V2]. No clock document numbered 3.05 was found; a file saying 3.05 is read with the
 * 3.04 layout (stated in the header as `layout: 'A9'`).
 *
 * Layout of a data record (record line, then one continuation line when it declares more than two
 * values), fixed columns:
 *
 * | field | 2.00–3.02 (`A4` names) | 3.04–3.05 (`A9` names) |
 * |---|---|---|
 * | type `AS`/`AR`/`CR`/`DR`/`MS` | 1-2 | 1-2 |
 * | name (satellite `G05`, station) | 4-7 | 4-12 |
 * | epoch `I4,4I3,F10.6` | 9-34 | 14-39 |
 * | number of values `I3` (1-6) | 35-37 | 40-42 |
 * | values `E19.12` on the record line (bias, bias sigma) | end in 59, 79 | end in 64, 85 |
 * | values on the continuation line (rate, its sigma, acceleration, its sigma) | end in 19, 39, 59, 79 | end in 22, 43, 64, 85 |
 *
 * Each value must be a complete exponent-form number (`-0.123456789012E-03`, `D` allowed) ending in its
 * field's last column (one column earlier is accepted: real 3.04 files end the second value in 84). A
 * record cut inside a value therefore never reads as a different number: any cut loses the exponent or
 * the field's end. Header labels start in column 61 (66 in 3.04 files; either is accepted).
 *
 * Streaming: {@link readRinexClock} yields the header, then one event per record, so memory is bounded by
 * one record whatever the file length; callers keep what they need (see `readRinexClockSeries`).
 *
 * @module
 */
import { InvalidArgumentError, ParseError } from '../errors.js';
import { requireOptions, requireSourceName } from '../internal/validate.js';
import type { Instant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import { EpochPlacer, isReadableTimeSystem, READABLE_TIME_SYSTEMS, readerTimeScales } from './epochs.js';
import {
  type EpochFields,
  linesOf,
  readLineBatches,
  requireTextLine,
  type TextLine,
  type TextSource,
  validEpochFields,
} from './line-reader.js';
import { E_FORMAT, plainEpoch, SECOND, unsignedField, VALUE_ENDS, VALUE_NAMES } from './rinex-clock-fields.js';
import type {
  RinexClockEvent,
  RinexClockFile,
  RinexClockHeader,
  RinexClockReadOptions,
  RinexClockRecord,
} from './rinex-clock-types.js';

export type {
  RinexClockEvent,
  RinexClockFile,
  RinexClockHeader,
  RinexClockReadOptions,
  RinexClockRecord,
} from './rinex-clock-types.js';

const RECORD_TYPES: readonly string[] = ['AS', 'AR', 'CR', 'DR', 'MS'];
interface Pending {
  type: string;
  name: string;
  epoch: Instant;
  time: EpochFields;
  count: number;
  values: number[];
  line: number;
}

/**
 * Incremental RINEX clock parser: feed lines with {@link RinexClockParser.push}, end with
 * {@link RinexClockParser.finish}. Most callers use {@link readRinexClock} or {@link parseRinexClock}.
 */
export class RinexClockParser {
  private readonly _source: string;
  private _headerDone = false;
  private _version: number | undefined;
  private _layout: 'A4' | 'A9' = 'A4';
  private _system: string | undefined;
  private _timeSystem: string | undefined;
  private _lastLine = 0;
  private _pending: Pending | undefined;
  private readonly _ts: TimeScales;
  /** Places the records' epochs on the header's time system (built at the first record). */
  private _placer: EpochPlacer | undefined;

  constructor(options: RinexClockReadOptions = {}) {
    requireOptions('options', options);
    this._source =
      options.sourceName === undefined ? 'rinex-clock' : requireSourceName('options.sourceName', options.sourceName);
    this._ts = readerTimeScales(options.timeScales);
  }

  private _error(line: number, column: number | undefined, expected: string, found?: string): ParseError {
    return new ParseError(this._source, line, column, expected, found);
  }

  /** Feeds one line; returns the events it completed. @throws {ParseError} */
  push(line: TextLine): RinexClockEvent[] {
    requireTextLine(line);
    this._lastLine = line.lineNumber;
    const cr = line.text.indexOf('\r');
    if (cr >= 0) {
      // A lone CR would hide the next record inside this line (e.g. after END OF HEADER): never read past it.
      throw this._error(
        line.lineNumber,
        cr + 1,
        'a line end of LF or CR LF (a lone CR inside a line would merge two lines)',
        JSON.stringify(line.text.slice(Math.max(0, cr - 10), cr + 10)),
      );
    }
    if (!this._headerDone) return this._header(line);
    if (this._pending) return this._continuation(line, this._pending);
    if (line.text.trim() === '') return [];
    return this._record(line);
  }

  /** Ends the input. @throws {ParseError} when the header is incomplete or the last record is cut. */
  finish(): RinexClockEvent[] {
    const next = this._lastLine + 1;
    if (this._version === undefined)
      throw this._error(Math.max(1, this._lastLine), undefined, '"RINEX VERSION / TYPE" header line', '');
    if (!this._headerDone) throw this._error(next, undefined, '"END OF HEADER" before the end of the file');
    if (this._pending) {
      throw this._error(
        next,
        undefined,
        `the continuation line of the record on line ${this._pending.line} (it declares ${this._pending.count} values; the file ends after ${this._pending.values.length})`,
      );
    }
    return [];
  }

  private _header(line: TextLine): RinexClockEvent[] {
    const text = line.text;
    // Labels start in column 61 (2.00–3.02) or 66 (3.04): found by text there, never elsewhere in the line.
    const labelAt = (label: string): number => {
      for (const i of [60, 65]) if (text.startsWith(label, i)) return i;
      return -1;
    };
    if (this._version === undefined) {
      const at = labelAt('RINEX VERSION / TYPE');
      if (at < 0)
        throw this._error(
          line.lineNumber,
          61,
          '"RINEX VERSION / TYPE" header line (label in column 61, or 66 in version 3.04)',
          text,
        );
      const m = /^\s*(\S+)(\s+)(\S?)/.exec(text.slice(0, at));
      const [whole = '', versionText = '', blanks = '', fileType = ''] = m ?? [];
      const version = m ? Number(versionText) : Number.NaN;
      const versionColumn = m ? whole.indexOf(versionText) + 1 : 1;
      if (!(version >= 2 && version < 2.995) && !(version >= 3 && version <= 3.05 + 1e-9)) {
        throw this._error(
          line.lineNumber,
          versionColumn,
          'a RINEX clock format version from 2.00 to 3.05',
          versionText,
        );
      }
      const typeColumn = fileType !== '' ? versionColumn + versionText.length + blanks.length : 21;
      if (fileType !== 'C') throw this._error(line.lineNumber, typeColumn, 'file type "C" (clock data)', fileType);
      this._version = version;
      this._layout = version >= 3.04 - 1e-9 ? 'A9' : 'A4';
      // Satellite system: column 41 (up to 3.02) or 43 (3.04, whose fields are wider); blank in 2.00.
      const sys = text.charAt(at === 65 ? 42 : 40).trim();
      this._system = /^[GRECJISM]$/.test(sys) ? sys : undefined;
      return [];
    }
    const tsAt = labelAt('TIME SYSTEM ID');
    if (tsAt >= 0) {
      const t = text.slice(0, tsAt).trim();
      if (!/^[A-Z]{3}$/.test(t))
        throw this._error(
          line.lineNumber,
          4,
          'a time system identifier (e.g. GPS) in columns 4-6',
          text.slice(0, tsAt),
        );
      if (!isReadableTimeSystem(t)) {
        throw this._error(
          line.lineNumber,
          4,
          `a time system the SDK can place on its scales (${READABLE_TIME_SYSTEMS}) in columns 4-6`,
          t,
        );
      }
      this._timeSystem = t;
      return [];
    }
    const endAt = labelAt('END OF HEADER');
    if (endAt < 0) {
      // Every header line carries its label (COMMENT, PGM / RUN BY / DATE, ...); a line without one is not a header line.
      if (text.slice(60).trim() === '')
        throw this._error(
          line.lineNumber,
          61,
          'a header label from column 61 (66 in version 3.04), or "END OF HEADER"',
          text,
        );
      return [];
    }
    this._headerDone = true;
    return [
      {
        kind: 'header',
        header: {
          version: this._version,
          layout: this._layout,
          satelliteSystem: this._system,
          timeSystem: this._timeSystem,
          epochTimeSystem: this._timeSystem ?? 'GPS',
          timeSystemAssumed: this._timeSystem === undefined,
          lines: line.lineNumber,
        },
      },
    ];
  }

  /** Integer field of columns a+1..b (blank-padded, I format). */
  private _int(line: TextLine, a: number, b: number, what: string): number {
    const v = unsignedField(line.text, a, b);
    if (v !== v)
      throw this._error(line.lineNumber, a + 1, `${what} (an integer in columns ${a + 1}-${b})`, line.text.slice(a, b));
    return v;
  }

  private _record(line: TextLine): RinexClockEvent[] {
    const t = line.text;
    const type = t.slice(0, 2);
    if (!RECORD_TYPES.includes(type) || (t.length > 2 && t.charAt(2) !== ' ')) {
      throw this._error(
        line.lineNumber,
        1,
        'a clock data record type AS, AR, CR, DR or MS in columns 1-2 followed by a blank',
        t.slice(0, 3),
      );
    }
    const width = this._layout === 'A9' ? 9 : 4;
    const name = t.slice(3, 3 + width).trimEnd();
    if (name.trim() === '' || name.startsWith(' ') || t.charAt(3 + width) !== ' ') {
      throw this._error(
        line.lineNumber,
        4,
        `a receiver or satellite name in columns 4-${3 + width} (A${width}, RINEX clock ${this._version?.toFixed(2) ?? ''}) followed by a blank`,
        t.slice(3, 4 + width),
      );
    }
    const s = 4 + width; // 0-based start of the epoch (column 9 or 14)
    const time: EpochFields = {
      year: this._int(line, s, s + 4, 'epoch year'),
      month: this._int(line, s + 4, s + 7, 'epoch month'),
      day: this._int(line, s + 7, s + 10, 'epoch day'),
      hour: this._int(line, s + 10, s + 13, 'epoch hour'),
      minute: this._int(line, s + 13, s + 16, 'epoch minute'),
      second: this._second(line, s + 16, s + 26),
    };
    if (!plainEpoch(time) && !validEpochFields(time)) {
      throw this._error(
        line.lineNumber,
        s + 1,
        `a valid epoch "yyyy mm dd hh mm ss.ssssss" in columns ${s + 1}-${s + 26}`,
        t.slice(s, s + 26),
      );
    }
    this._placer ??= new EpochPlacer(this._ts, this._timeSystem ?? 'GPS');
    const epoch = this._placer.place(time, {
      source: this._source,
      line: line.lineNumber,
      column: s + 1,
      text: t.slice(s, s + 26),
    });
    const count = this._int(line, s + 26, s + 29, 'number of data values');
    if (count < 1 || count > 6)
      throw this._error(
        line.lineNumber,
        s + 27,
        `a number of data values from 1 to 6 in columns ${s + 27}-${s + 29}`,
        String(count),
      );
    const onLine = Math.min(2, count);
    const values = this._values(line, s + 29, VALUE_ENDS[this._layout].record.slice(0, onLine), 0, count);
    const pending: Pending = { type, name, epoch, time, count, values, line: line.lineNumber };
    this._pending = pending;
    return count === onLine ? this._complete(pending) : [];
  }

  private _second(line: TextLine, a: number, b: number): number {
    const s = line.text.slice(a, b);
    if (!SECOND.test(s)) throw this._error(line.lineNumber, a + 1, `epoch second (F10.6 in columns ${a + 1}-${b})`, s);
    return Number(s);
  }

  private _continuation(line: TextLine, p: Pending): RinexClockEvent[] {
    const need = p.count - p.values.length;
    p.values.push(
      ...this._values(line, 0, VALUE_ENDS[this._layout].continuation.slice(0, need), p.values.length, p.count, p.line),
    );
    return this._complete(p);
  }

  /**
   * Reads the value fields of one line, starting after 0-based column `from`: one exponent-form number per
   * field, ending in the field's last column (or the one before), nothing else on the line.
   */
  private _values(
    line: TextLine,
    from: number,
    ends: readonly number[],
    first: number,
    count: number,
    recordLine?: number,
  ): number[] {
    const t = line.text;
    const n = t.length;
    const out: number[] = [];
    const what = (k: number, end: number) =>
      `${VALUE_NAMES[first + k]} (value ${first + k + 1} of ${count}, E19.12 in columns ${end - 18}-${end})` +
      (recordLine === undefined ? '' : ` (continuation of the record on line ${recordLine})`);
    let pos = from;
    for (const [k, end] of ends.entries()) {
      while (pos < n && t.charCodeAt(pos) === 32) pos++;
      if (pos >= n)
        throw this._error(
          line.lineNumber,
          t.trimEnd().length + 1,
          `${what(k, end)}: the line ends before it (record cut)`,
          t.slice(Math.max(0, end - 19)),
        );
      let stop = pos;
      while (stop < n && t.charCodeAt(stop) !== 32) stop++;
      const tok = t.slice(pos, stop);
      if (tok.length > 19 || !E_FORMAT.test(tok)) {
        throw this._error(
          line.lineNumber,
          pos + 1,
          `${what(k, end)}: a complete number in exponent form such as -0.123456789012E-03`,
          tok,
        );
      }
      if (stop !== end && stop !== end - 1) {
        throw this._error(
          line.lineNumber,
          pos + 1,
          `${what(k, end)}: a field ending in column ${end}; it ends in column ${stop}`,
          tok,
        );
      }
      const v = Number(tok.includes('D') || tok.includes('d') ? tok.replace(/[Dd]/, 'E') : tok);
      if (!Number.isFinite(v)) throw this._error(line.lineNumber, pos + 1, `${what(k, end)}: a finite number`, tok);
      out.push(v);
      pos = stop;
    }
    while (pos < n && t.charCodeAt(pos) === 32) pos++;
    if (pos < n) {
      let stop = pos;
      while (stop < n && t.charCodeAt(stop) !== 32) stop++;
      const where = recordLine === undefined ? '' : ` (continuation of the record on line ${recordLine})`;
      throw this._error(
        line.lineNumber,
        pos + 1,
        `no more than ${ends.length} value(s) on this line (the record declares ${count})${where}`,
        t.slice(pos, stop),
      );
    }
    return out;
  }

  private _complete(p: Pending): RinexClockEvent[] {
    this._pending = undefined;
    if (p.type === 'AS' || p.type === 'AR') {
      const v = p.values;
      return [
        {
          kind: 'record',
          record: {
            type: p.type,
            name: p.name,
            epoch: p.epoch,
            time: p.time,
            bias: v[0] ?? Number.NaN,
            biasSigma: v[1],
            rate: v[2],
            rateSigma: v[3],
            acceleration: v[4],
            accelerationSigma: v[5],
            line: p.line,
          },
        },
      ];
    }
    return [{ kind: 'other', recordType: p.type as 'CR' | 'DR' | 'MS', name: p.name, line: p.line }];
  }
}

/**
 * The reader options. The string form of earlier releases (the source name alone) is refused with a
 * typed error saying what to write instead: every reader takes `{ sourceName }`.
 */
function readOptions(options: RinexClockReadOptions | undefined): RinexClockReadOptions {
  if (typeof options === 'string') {
    throw new InvalidArgumentError(
      'options',
      options,
      'an options object { sourceName }',
      `the source name alone is no longer accepted: write { sourceName: ${JSON.stringify(options)} }`,
    );
  }
  return requireOptions('options', options ?? {});
}

/**
 * Reads a RINEX clock file (versions 2.00–3.05) as a stream: the header first, then one event per data
 * record (`record` for AS/AR, `other` for CR/DR/MS).
 *
 * @param source   File text or its chunks (sync or async iterable of strings).
 * @param options  `sourceName` for error messages; `timeScales` for UTC/GLONASS-time files.
 * @returns An async generator of {@link RinexClockEvent}.
 * @throws {ParseError} (file, line, column) on a missing or wrong version line, a missing `END OF HEADER`, a lone
 *   CR inside a line, an unknown record type, a field outside its columns, a bad epoch, a value count outside 1–6,
 *   a value cut short or not in exponent form, or a record truncated by the end of the file.
 * @see J. Ray, W. Gurtner, RINEX Extensions to Handle Clock Information, 2.00 (1999), 3.02 (2010) [V1 change list, M
 *   columns]; 3.04 with M. J. Coleman (2017) [M, example file V2].
 */
export async function* readRinexClock(
  source: TextSource,
  options?: RinexClockReadOptions,
): AsyncGenerator<RinexClockEvent> {
  const opts = readOptions(options);
  const parser = new RinexClockParser(opts);
  for await (const lines of readLineBatches(source, { sourceName: opts.sourceName ?? 'rinex-clock' })) {
    for (const line of lines) for (const event of parser.push(line)) yield event;
  }
  for (const event of parser.finish()) yield event;
}

/**
 * Reads a whole RINEX clock file held in memory (see {@link readRinexClock} for streaming).
 * @param options  `sourceName` for error messages (default `rinex-clock`); `timeScales` for UTC/GLONASS-time files.
 * @returns Header, AS/AR records in file order, and counts of the other record types.
 * @throws {ParseError} as {@link readRinexClock}.
 * @see RINEX clock 2.00–3.04 (Ray, Gurtner, Coleman) [M].
 */
export function parseRinexClock(source: string | Iterable<string>, options?: RinexClockReadOptions): RinexClockFile {
  const opts = readOptions(options);
  const parser = new RinexClockParser(opts);
  let header: RinexClockHeader | undefined;
  const records: RinexClockRecord[] = [];
  const other: Record<string, number> = {};
  const take = (events: RinexClockEvent[]) => {
    for (const ev of events) {
      if (ev.kind === 'header') header = ev.header;
      else if (ev.kind === 'record') records.push(ev.record);
      else other[ev.recordType] = (other[ev.recordType] ?? 0) + 1;
    }
  };
  for (const line of linesOf(source, { sourceName: opts.sourceName ?? 'rinex-clock' })) take(parser.push(line));
  take(parser.finish());
  // finish() refuses a file without a complete header, so a header event has been seen.
  if (header === undefined) throw new Error('internal: RINEX clock parser finished without a header');
  return { sourceName: opts.sourceName ?? 'rinex-clock', header, records, otherRecords: other };
}
