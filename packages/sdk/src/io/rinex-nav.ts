/**
 * Reader for RINEX navigation files, versions 2.10 / 2.11, 3.0x and 4.0x (IGS / RTCM-SC104 open
 * standard, "RINEX The Receiver Independent Exchange Format": 2.11 read in a full-text transcription of
 * the IGS document [V1]; 3.05 and 4.01 [M]).
 *
 * Modelled records (Keplerian ephemerides): GPS LNAV (RINEX 2 `N` files and versions 3/4), Galileo
 * I/NAV and F/NAV, BeiDou D1/D2. Every other record (GLONASS and SBAS/GEO state vectors, including
 * RINEX 2 `G` and `H` files, QZSS, NavIC, GPS/BeiDou CNAV, and the version-4 STO, EOP and ION records)
 * is recognised and reported as skipped with a reason, never mis-read; a skipped record cut short is
 * refused like a modelled one. RINEX 2.11 defines no Galileo or mixed navigation file, so such version-2
 * files are refused (convert them to RINEX 3). Fortran `D` exponents are accepted. Malformed input throws a
 * {@link ParseError} naming the source, line, column and what was expected; a truncated record or header
 * is an error, never a silently accepted partial record.
 *
 * Streaming: {@link readRinexNav} consumes string chunks and yields one event per record, so
 * memory is bounded by one record whatever the file length. Record layouts: `rinex-nav-v2.ts`
 * (version 2), `rinex-nav-kepler.ts` (the Keplerian fields of every version).
 *
 * @module
 */
import { ParseError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requireOptions, requireSourceName } from '../internal/validate.js';
import type { KeplerianSystem } from '../orbit/broadcast.js';
import {
  type EpochFields,
  linesOf,
  readLineBatches,
  requireTextLine,
  type TextLine,
  type TextSource,
  validEpochFields,
} from './line-reader.js';
import { NavHeaderReader, type NavVersionLine, readNavVersionLine } from './rinex-nav-header.js';
import { checkFieldAlignment, decodeKeplerRecord, KEPLER_RECORD_LINES, RINEX3_LAYOUT } from './rinex-nav-kepler.js';
import { MINIMUM_SKIPPED_LINES_V3, SYSTEM_NAMES, skipReason, v4RecordLines } from './rinex-nav-skip.js';
import type {
  RinexNavEphemeris,
  RinexNavEvent,
  RinexNavFile,
  RinexNavHeader,
  RinexNavReadOptions,
  RinexNavRecordType,
  SkippedNavRecord,
} from './rinex-nav-types.js';
import { NavV2Body } from './rinex-nav-v2.js';

export type {
  RinexIonosphereParameters,
  RinexLeapSeconds,
  RinexNavEphemeris,
  RinexNavEvent,
  RinexNavFile,
  RinexNavHeader,
  RinexNavReadOptions,
  RinexNavRecordType,
  RinexSystemCode,
  RinexTimeSystemCorrection,
  SkippedNavRecord,
} from './rinex-nav-types.js';
export { fullYearFromTwoDigits } from './rinex-nav-v2.js';

const SYSTEM_CODES = 'GRECJIS';

interface PendingRecord {
  readonly start: TextLine;
  readonly lines: TextLine[];
  /** Version-4 record header, when the file is version 4. */
  readonly v4?: {
    readonly type: RinexNavRecordType;
    readonly satellite: string;
    readonly message: string;
    readonly line: TextLine;
  };
}

/**
 * Incremental RINEX navigation parser: feed lines with {@link RinexNavParser.push} and end
 * with {@link RinexNavParser.finish}; each returns the events completed. Most callers use
 * {@link readRinexNav} or {@link parseRinexNav} instead.
 */
export class RinexNavParser {
  private readonly _source: string;
  private _state: 'first' | 'header' | 'body' = 'first';
  private _first: NavVersionLine | undefined;
  private _header: NavHeaderReader | undefined;
  private _v2: NavV2Body | undefined;
  private _pending: PendingRecord | undefined;
  private _lastLine = 0;

  constructor(options: RinexNavReadOptions = {}) {
    requireOptions('options', options);
    this._source =
      options.sourceName === undefined ? 'rinex-nav' : requireSourceName('options.sourceName', options.sourceName);
  }

  /** Feeds one line; returns the events it completed. @throws {ParseError} */
  push(line: TextLine): RinexNavEvent[] {
    requireTextLine(line);
    this._lastLine = line.lineNumber;
    if (this._state === 'first') {
      this._first = readNavVersionLine(this._source, line);
      this._header = new NavHeaderReader(this._source, this._first);
      this._state = 'header';
      return [];
    }
    if (this._state === 'header') {
      const header = this._header!.push(line);
      if (!header) return [];
      this._state = 'body';
      if (this._first!.version < 3) this._v2 = new NavV2Body(this._source, this._first!.fileType);
      return [{ kind: 'header', header }];
    }
    if (this._v2) return this._v2.push(line);
    return this._first!.version >= 4 ? this._bodyV4(line) : this._bodyV3(line);
  }

  /** Ends the input; returns the last events. @throws {ParseError} for a truncated header or record. */
  finish(): RinexNavEvent[] {
    if (this._state === 'first') {
      throw new ParseError(this._source, 1, 1, "a RINEX header line ending with label 'RINEX VERSION / TYPE'", '');
    }
    if (this._state === 'header') {
      throw new ParseError(
        this._source,
        this._lastLine + 1,
        1,
        "the header line 'END OF HEADER' (the file ends inside the header: truncated?)",
        '',
      );
    }
    if (this._v2) return this._v2.finish(this._lastLine);
    const pending = this._pending;
    this._pending = undefined;
    return pending ? this._finishRecord(pending, undefined) : [];
  }

  private _error(line: TextLine, column: number | undefined, expected: string, found?: string): ParseError {
    return new ParseError(this._source, line.lineNumber, column, expected, found);
  }

  private _isRecordStart(text: string): boolean {
    return text.length >= 3 && SYSTEM_CODES.includes(text.charAt(0)) && /^[ \d]\d$/.test(text.slice(1, 3));
  }

  private _bodyV3(line: TextLine): RinexNavEvent[] {
    const blank = line.text.trim() === '';
    if (!blank && this._isRecordStart(line.text)) {
      const events = this._pending ? this._finishRecord(this._pending, line) : [];
      this._pending = { start: line, lines: [line] };
      return events;
    }
    if (!this._pending) {
      if (blank) return [];
      throw this._error(
        line,
        1,
        "the first line of a navigation record: system letter and 2-digit PRN (e.g. 'G05 2024 01 07 ...')",
        line.text,
      );
    }
    this._pending.lines.push(line);
    const sys = this._pending.start.text.charAt(0);
    if ((sys === 'G' || sys === 'E' || sys === 'C') && this._pending.lines.length === KEPLER_RECORD_LINES) {
      const done = this._pending;
      this._pending = undefined;
      return this._finishRecord(done, undefined);
    }
    return [];
  }

  private _bodyV4(line: TextLine): RinexNavEvent[] {
    if (line.text.startsWith('>')) {
      const events = this._pending ? this._finishRecord(this._pending, line) : [];
      const tokens = line.text.slice(1).trim().split(/\s+/);
      const type = tokens[0] ?? '';
      if (type !== 'EPH' && type !== 'STO' && type !== 'EOP' && type !== 'ION') {
        throw this._error(line, 3, "a record type EPH, STO, EOP or ION after '>'", type);
      }
      const satellite = tokens[1] ?? '';
      if (!/^[GRECJIS]\d\d$/.test(satellite)) {
        throw this._error(
          line,
          7,
          'a satellite identifier (system letter and 2-digit number, e.g. G05) in columns 7-9',
          satellite,
        );
      }
      const message = tokens[2] ?? '';
      if (message === '')
        throw this._error(line, 11, 'a message type (e.g. LNAV, INAV, FNAV, D1, D2, CNAV, FDMA) in columns 11-14', '');
      this._pending = { start: line, lines: [], v4: { type, satellite, message, line } };
      return events;
    }
    if (!this._pending) {
      if (line.text.trim() === '') return [];
      throw this._error(line, 1, "a version-4 record header such as '> EPH G05 LNAV'", line.text);
    }
    this._pending.lines.push(line);
    return [];
  }

  /** Refuses a record with fewer lines than its kind needs (modelled or not), at the line that ended it. */
  private _requireLines(
    rec: PendingRecord,
    next: TextLine | undefined,
    needed: number,
    what: string,
    satellite: string,
  ): void {
    if (rec.lines.length >= needed) return;
    const at = next ?? { text: '', lineNumber: this._lastLine + 1 };
    throw this._error(
      at,
      1,
      `${what} for the ${rec.v4 ? `${rec.v4.type} ${rec.v4.message} ` : ''}${SYSTEM_NAMES[satellite.charAt(0)]} record of ${satellite} ` +
        `starting at line ${rec.start.lineNumber} (found ${rec.lines.length}: truncated record)`,
      at.text,
    );
  }

  private _finishRecord(rec: PendingRecord, next: TextLine | undefined): RinexNavEvent[] {
    const v4 = rec.v4;
    if (v4) {
      // Trailing blank lines of a version-4 record are not part of it.
      while (rec.lines.at(-1)?.text.trim() === '') rec.lines.pop();
    }
    const first = rec.lines[0];
    const system = v4 ? v4.satellite.charAt(0) : rec.start.text.charAt(0);
    const satellite = v4 ? v4.satellite : normaliseSatellite(rec.start.text.slice(0, 3));
    const recordType: RinexNavRecordType = v4 ? v4.type : 'EPH';
    const message = v4?.message;
    const modelled = recordType === 'EPH' && modelledMessage(system, message) !== undefined;
    if (recordType === 'EPH')
      rec.lines.forEach((l, k) => {
        checkFieldAlignment(this._source, l, k === 0, RINEX3_LAYOUT);
      });
    if (!modelled) {
      // A record cut short is refused even when it is skipped: its length is known by kind.
      const needed = v4 ? v4RecordLines(v4.type, system, v4.message) : MINIMUM_SKIPPED_LINES_V3[system];
      if (needed !== undefined)
        this._requireLines(rec, next, needed, `${v4 ? '' : 'at least '}${needed} lines`, satellite);
      const unknownLength =
        v4 && needed === undefined
          ? " (message type not in the reader's table of record lengths: length not checked)"
          : '';
      return [
        {
          kind: 'skipped',
          record: {
            line: rec.start.lineNumber,
            lineCount: rec.lines.length + (v4 ? 1 : 0),
            recordType,
            system,
            satellite,
            ...(message !== undefined ? { message } : {}),
            reason: skipReason(recordType, system, message) + unknownLength,
          },
        },
      ];
    }
    this._requireLines(rec, next, KEPLER_RECORD_LINES, `${KEPLER_RECORD_LINES} lines`, satellite);
    if (rec.lines.length > KEPLER_RECORD_LINES) {
      const extra = at(rec.lines, KEPLER_RECORD_LINES, 'record lines');
      throw this._error(
        extra,
        1,
        `the next record header ('> ...'): the ${SYSTEM_NAMES[system]} record starting at line ${rec.start.lineNumber} has ${KEPLER_RECORD_LINES} lines`,
        extra.text,
      );
    }
    if (v4 && first && normaliseSatellite(first.text.slice(0, 3)) !== v4.satellite) {
      throw this._error(
        first,
        1,
        `satellite ${v4.satellite} as named in the record header on line ${v4.line.lineNumber}`,
        first.text.slice(0, 3),
      );
    }
    const start = { satellite: normaliseSatellite(first!.text.slice(0, 3)), toc: this._epochV3(first!) };
    const ephemeris: RinexNavEphemeris = decodeKeplerRecord(
      this._source,
      rec.lines,
      system as KeplerianSystem,
      message,
      start,
      RINEX3_LAYOUT,
    );
    return [{ kind: 'ephemeris', ephemeris }];
  }

  /** The epoch of a version-3/4 record's first line (`A1,I2.2,1X,I4,5(1X,I2.2)`). @throws {ParseError} */
  private _epochV3(l0: TextLine): EpochFields {
    const text = l0.text;
    const ints: number[] = [];
    const spans: [number, number, string][] = [
      [4, 8, 'year (I4)'],
      [9, 11, 'month'],
      [12, 14, 'day'],
      [15, 17, 'hour'],
      [18, 20, 'minute'],
      [21, 23, 'second'],
    ];
    for (const [a, b, what] of spans) {
      const t = text.slice(a, b);
      if (!/^ *\d+$/.test(t)) throw this._error(l0, a + 1, `the epoch ${what} in columns ${a + 1}-${b}`, t);
      ints.push(Number(t));
    }
    const [
      year = Number.NaN,
      month = Number.NaN,
      day = Number.NaN,
      hour = Number.NaN,
      minute = Number.NaN,
      second = Number.NaN,
    ] = ints;
    const toc: EpochFields = { year, month, day, hour, minute, second };
    if (!validEpochFields(toc) || toc.second >= 60)
      throw this._error(l0, 5, 'a valid calendar epoch (year month day hour minute second)', text.slice(4, 23));
    return toc;
  }
}

function normaliseSatellite(id: string): string {
  return `${id.charAt(0)}${id.slice(1, 3).trim().padStart(2, '0')}`;
}

function modelledMessage(system: string, message: string | undefined): KeplerianSystem | undefined {
  if (message === undefined) return system === 'G' || system === 'E' || system === 'C' ? system : undefined;
  if (system === 'G' && message === 'LNAV') return 'G';
  if (system === 'E' && (message === 'INAV' || message === 'FNAV')) return 'E';
  if (system === 'C' && (message === 'D1' || message === 'D2')) return 'C';
  return undefined;
}

/**
 * Reads a RINEX 2.10/2.11, 3.0x or 4.0x navigation file as a stream of events: the header first, then
 * one event per record in file order (modelled ephemerides, and skipped records with their reason).
 *
 * @param source   The file text, or its chunks (sync or async iterable of strings).
 * @param options  `sourceName` for error messages.
 * @returns An async generator of {@link RinexNavEvent}.
 * @throws {ParseError} on the first malformed, truncated or unsupported line (file, line, column, expected).
 * @see RINEX 2.11 (IGS/RTCM, 2007/2012) Tables A3, A4, A10, A11, A15, A16 [V1]; RINEX 3.05 (IGS/RTCM-SC104, 2020)
 *   §5.4 and Appendix Tables A4–A16; RINEX 4.01 (2023) navigation message record types [M].
 */
export async function* readRinexNav(
  source: TextSource,
  options: RinexNavReadOptions = {},
): AsyncGenerator<RinexNavEvent> {
  const parser = new RinexNavParser(options);
  // One asynchronous step per chunk, not per line (an event is yielded only when a line completes one).
  for await (const lines of readLineBatches(source, { sourceName: options.sourceName ?? 'rinex-nav' })) {
    for (const line of lines) for (const event of parser.push(line)) yield event;
  }
  for (const event of parser.finish()) yield event;
}

/**
 * Reads a whole RINEX navigation file held in memory (see {@link readRinexNav} for streaming).
 *
 * @param source   The file text, or a sync iterable of chunks.
 * @param options  `sourceName` for error messages.
 * @returns Header, modelled ephemerides and skipped records, in file order.
 * @throws {ParseError} on malformed, truncated or unsupported input.
 * @see RINEX 2.11 [V1], 3.05 and 4.01 [M].
 */
export function parseRinexNav(source: string | Iterable<string>, options: RinexNavReadOptions = {}): RinexNavFile {
  const parser = new RinexNavParser(options);
  let header: RinexNavHeader | undefined;
  const ephemerides: RinexNavEphemeris[] = [];
  const skipped: SkippedNavRecord[] = [];
  const take = (events: RinexNavEvent[]) => {
    for (const ev of events) {
      if (ev.kind === 'header') header = ev.header;
      else if (ev.kind === 'ephemeris') ephemerides.push(ev.ephemeris);
      else skipped.push(ev.record);
    }
  };
  for (const line of linesOf(source, { sourceName: options.sourceName ?? 'rinex-nav' })) take(parser.push(line));
  take(parser.finish());
  // finish() refuses a file without a complete header, so a header event has been seen.
  if (header === undefined) throw new Error('internal: RINEX navigation parser finished without a header');
  return { header, ephemerides, skipped };
}
