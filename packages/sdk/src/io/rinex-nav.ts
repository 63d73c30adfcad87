/**
 * Reader for RINEX navigation files, versions 3.0x and 4.0x (IGS / RTCM-SC104 open standard,
 * "RINEX The Receiver Independent Exchange Format", versions 3.05 and 4.01 [M]).
 *
 * Modelled records (Keplerian ephemerides): GPS LNAV, Galileo I/NAV and F/NAV, BeiDou D1/D2.
 * Every other record (GLONASS and SBAS state vectors, QZSS, NavIC, GPS/BeiDou CNAV, and the
 * version-4 STO, EOP and ION records) is recognised and reported as skipped with a reason,
 * never mis-read. Fortran `D` exponents are accepted. Malformed input throws a
 * {@link ParseError} naming the source, line, column and what was expected; a truncated
 * record or header is an error, never a silently accepted partial record.
 *
 * Streaming: {@link readRinexNav} consumes string chunks and yields one event per record, so
 * memory is bounded by one record whatever the file length.
 *
 * @module
 */
import { ParseError } from '../errors.js';
import type { Seconds } from '../units.js';
import type { KeplerianBroadcastEphemeris, KeplerianNavMessage, KeplerianSystem } from '../orbit/broadcast.js';
import { defaultFitIntervalSeconds, isBeidouGeostationary } from '../orbit/broadcast.js';
import { requireOptions, requireSourceName } from '../internal/validate.js';
import {
  type EpochFields, type TextLine, type TextSource, linesOf, parseFortranReal, requireTextLine, readLineBatches, scaleSecondsFromFields,
  validEpochFields,
} from './line-reader.js';

/** One-letter system codes of RINEX 3/4 (G GPS, R GLONASS, E Galileo, C BeiDou, J QZSS, I NavIC, S SBAS). */
export type RinexSystemCode = 'G' | 'R' | 'E' | 'C' | 'J' | 'I' | 'S';

/** Record kinds of RINEX 4 navigation files (version 3 files hold only ephemerides). */
export type RinexNavRecordType = 'EPH' | 'STO' | 'EOP' | 'ION';

/** Leap-second header information (RINEX 3.05 / 4.01 `LEAP SECONDS` [M]). */
export interface RinexLeapSeconds {
  /** Current number of leap seconds (GPS − UTC), in seconds. */
  readonly current: number;
  /** Future or past leap seconds Δt_LSF, in seconds, when given. */
  readonly future?: number;
  /** Week number WN_LSF of the change, when given. */
  readonly futureWeek?: number;
  /** Day number DN of the change, when given. */
  readonly futureDay?: number;
  /** Time-system identifier of the week number (`GPS` when blank, `BDS` for BeiDou), when given. */
  readonly timeSystem?: string;
}

/** The header of a RINEX navigation file. */
export interface RinexNavHeader {
  readonly sourceName: string;
  /** Format version, e.g. 3.05 or 4.01. */
  readonly version: number;
  /** Satellite system of the file (`M` mixed, or one system code). */
  readonly satelliteSystem: string;
  readonly programName?: string;
  readonly runBy?: string;
  readonly creationDate?: string;
  readonly leapSeconds?: RinexLeapSeconds;
  readonly comments: readonly string[];
  /** Other header lines, by label, kept verbatim (columns 1–60). */
  readonly otherLines: readonly { readonly label: string; readonly text: string; readonly line: number }[];
  /** Number of header lines, including `END OF HEADER`. */
  readonly lineCount: number;
}

/** A modelled ephemeris record as read, with the raw fields that the computation does not need. */
export interface RinexNavEphemeris extends KeplerianBroadcastEphemeris {
  /** Clock reference epoch t_oc as written, in the system's own time scale. */
  readonly toc: EpochFields;
  /** Week number as written in the record (GPS, Galileo-aligned-to-GPS or BDT week). */
  readonly weekAsWritten: number;
  /** t_oe as written, in seconds of week. */
  readonly toeSecondsOfWeek: Seconds;
  /** SV accuracy / SISA, in metres, when given. */
  readonly accuracy?: number;
  /** Group delays, in seconds: GPS `TGD`; Galileo `BGD_E5a_E1`, `BGD_E5b_E1`; BeiDou `TGD1`, `TGD2`. */
  readonly groupDelays: Readonly<Record<string, number>>;
  /** Galileo data-source bits, when given. */
  readonly dataSources?: number;
  /** GPS IODC or BeiDou AODC, when given. */
  readonly issueOfDataClock?: number;
  /** File name (or label) and 1-based line of the record's first line. */
  readonly sourceName: string;
  readonly line: number;
  /** Interpretation notes (week rollover, week of t_oe differing from the week field, defaults used). */
  readonly notes: readonly string[];
}

/** A record recognised and deliberately not modelled. */
export interface SkippedNavRecord {
  readonly line: number;
  readonly lineCount: number;
  readonly recordType: RinexNavRecordType;
  /** System code of the record. */
  readonly system: string;
  readonly satellite?: string;
  /** Version-4 message type (e.g. `CNAV`, `FDMA`), when given. */
  readonly message?: string;
  readonly reason: string;
}

/** One item of a navigation file, in file order. */
export type RinexNavEvent =
  | { readonly kind: 'header'; readonly header: RinexNavHeader }
  | { readonly kind: 'ephemeris'; readonly ephemeris: RinexNavEphemeris }
  | { readonly kind: 'skipped'; readonly record: SkippedNavRecord };

/** Options of the navigation readers. */
export interface RinexNavReadOptions {
  /** Name used in error messages and records, e.g. the file name (default `rinex-nav`). */
  readonly sourceName?: string;
}

/** A whole navigation file read into memory by {@link parseRinexNav}. */
export interface RinexNavFile {
  readonly header: RinexNavHeader;
  readonly ephemerides: readonly RinexNavEphemeris[];
  readonly skipped: readonly SkippedNavRecord[];
}

const SYSTEM_CODES = 'GRECJIS';
const SECONDS_PER_WEEK = 604_800;
const SYSTEM_NAMES: Record<string, string> = {
  G: 'GPS', R: 'GLONASS', E: 'Galileo', C: 'BeiDou', J: 'QZSS', I: 'NavIC/IRNSS', S: 'SBAS',
};
/** Weeks between 1980-01-06 (GPS week 0) and 2006-01-01 (BDT week 0) [M, BDS-SIS-ICD §3.3]. */
const BDT_WEEK_OFFSET = 1356;
/**
 * Minimum line counts of records that are skipped but whose length is known, so that a file cut
 * inside one is still reported: GLONASS and SBAS epoch + 3 orbit lines, QZSS and NavIC epoch + 7
 * (RINEX 3.05 Tables A10, A12, A16, A18 [M]).
 */
const MINIMUM_SKIPPED_LINES: Readonly<Record<string, number>> = { R: 4, S: 4, J: 8, I: 8 };
/** Lines of a modelled Keplerian record: epoch line + 7 broadcast-orbit lines (RINEX 3.05 Tables A4, A8, A14 [M]). */
const KEPLER_RECORD_LINES = 8;

interface PendingRecord {
  readonly start: TextLine;
  readonly lines: TextLine[];
  /** Version-4 record header, when the file is version 4. */
  readonly v4?: { readonly type: RinexNavRecordType; readonly satellite: string; readonly message: string; readonly line: TextLine };
}

/**
 * Incremental RINEX navigation parser: feed lines with {@link RinexNavParser.push} and end
 * with {@link RinexNavParser.finish}; each returns the events completed. Most callers use
 * {@link readRinexNav} or {@link parseRinexNav} instead.
 */
export class RinexNavParser {
  private readonly _source: string;
  private _state: 'first' | 'header' | 'body' = 'first';
  private _version = 0;
  private _system = '';
  private _header: {
    programName?: string; runBy?: string; creationDate?: string; leapSeconds?: RinexLeapSeconds;
    comments: string[]; otherLines: { label: string; text: string; line: number }[];
  } = { comments: [], otherLines: [] };
  private _pending: PendingRecord | undefined;
  private _lastLine = 0;

  constructor(options: RinexNavReadOptions = {}) {
    requireOptions('options', options);
    this._source = options.sourceName === undefined ? 'rinex-nav' : requireSourceName('options.sourceName', options.sourceName);
  }

  /** Feeds one line; returns the events it completed. @throws {ParseError} */
  push(line: TextLine): RinexNavEvent[] {
    requireTextLine(line);
    this._lastLine = line.lineNumber;
    if (this._state === 'first') {
      this._readVersionLine(line);
      this._state = 'header';
      return [];
    }
    if (this._state === 'header') return this._readHeaderLine(line);
    return this._version >= 4 ? this._bodyV4(line) : this._bodyV3(line);
  }

  /** Ends the input; returns the last events. @throws {ParseError} for a truncated header or record. */
  finish(): RinexNavEvent[] {
    if (this._state === 'first') {
      throw new ParseError(this._source, 1, 1, "a RINEX header line ending with label 'RINEX VERSION / TYPE'", '');
    }
    if (this._state === 'header') {
      throw new ParseError(this._source, this._lastLine + 1, 1,
        "the header line 'END OF HEADER' (the file ends inside the header: truncated?)", '');
    }
    const pending = this._pending;
    this._pending = undefined;
    return pending ? this._finishRecord(pending, undefined) : [];
  }

  private _error(line: TextLine, column: number | undefined, expected: string, found?: string): ParseError {
    return new ParseError(this._source, line.lineNumber, column, expected, found);
  }

  private _readVersionLine(line: TextLine): void {
    const label = line.text.slice(60).trim();
    if (label !== 'RINEX VERSION / TYPE') {
      throw this._error(line, 61, "the first header line, labelled 'RINEX VERSION / TYPE' in columns 61-80", line.text);
    }
    const versionText = line.text.slice(0, 9).trim();
    const version = /^\d+(\.\d+)?$/.test(versionText) ? Number(versionText) : Number.NaN;
    if (!(version >= 3 && version < 3.1) && !(version >= 4 && version < 4.1)) {
      throw this._error(line, 1, 'RINEX version 3.0x or 4.0x in columns 1-9 (version 2 navigation files are not read)', versionText);
    }
    const type = line.text.charAt(20);
    if (type !== 'N') throw this._error(line, 21, "file type 'N' (navigation data) in column 21", type);
    const system = line.text.charAt(40).trim();
    if (system !== '' && !SYSTEM_CODES.includes(system) && system !== 'M') {
      throw this._error(line, 41, "satellite system G, R, E, C, J, I, S or M (mixed) in column 41", system);
    }
    if (system === '' && version < 4) throw this._error(line, 41, 'satellite system code in column 41', system);
    this._version = version;
    this._system = system || 'M';
  }

  private _readHeaderLine(line: TextLine): RinexNavEvent[] {
    const label = line.text.slice(60).trim();
    const body = line.text.slice(0, 60);
    if (label === '') throw this._error(line, 61, 'a header label in columns 61-80', line.text);
    switch (label) {
      case 'END OF HEADER': {
        this._state = 'body';
        const h = this._header;
        const header: RinexNavHeader = {
          sourceName: this._source, version: this._version, satelliteSystem: this._system,
          ...(h.programName !== undefined ? { programName: h.programName } : {}),
          ...(h.runBy !== undefined ? { runBy: h.runBy } : {}),
          ...(h.creationDate !== undefined ? { creationDate: h.creationDate } : {}),
          ...(h.leapSeconds ? { leapSeconds: h.leapSeconds } : {}),
          comments: h.comments, otherLines: h.otherLines, lineCount: line.lineNumber,
        };
        return [{ kind: 'header', header }];
      }
      case 'COMMENT':
        this._header.comments.push(body.trimEnd());
        return [];
      case 'PGM / RUN BY / DATE':
        this._header.programName = body.slice(0, 20).trim();
        this._header.runBy = body.slice(20, 40).trim();
        this._header.creationDate = body.slice(40, 60).trim();
        return [];
      case 'LEAP SECONDS':
        this._header.leapSeconds = this._readLeapSeconds(line);
        return [];
      case 'RINEX VERSION / TYPE':
        throw this._error(line, 61, 'a single RINEX VERSION / TYPE line (found a second one: two files concatenated?)', label);
      default:
        this._header.otherLines.push({ label, text: body.trimEnd(), line: line.lineNumber });
        return [];
    }
  }

  private _readLeapSeconds(line: TextLine): RinexLeapSeconds {
    const ints: (number | undefined)[] = [];
    for (let k = 0; k < 4; k++) {
      const t = line.text.slice(6 * k, 6 * k + 6).trim();
      if (t === '') {
        ints.push(undefined);
        continue;
      }
      if (!/^[+-]?\d+$/.test(t)) throw this._error(line, 6 * k + 1, 'an integer (format I6)', t);
      ints.push(Number(t));
    }
    if (ints[0] === undefined) throw this._error(line, 1, 'the current number of leap seconds (I6, columns 1-6)', '');
    const ts = line.text.slice(24, 27).trim();
    return {
      current: ints[0],
      ...(ints[1] !== undefined ? { future: ints[1] } : {}),
      ...(ints[2] !== undefined ? { futureWeek: ints[2] } : {}),
      ...(ints[3] !== undefined ? { futureDay: ints[3] } : {}),
      ...(ts !== '' ? { timeSystem: ts } : {}),
    };
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
      throw this._error(line, 1, "the first line of a navigation record: system letter and 2-digit PRN (e.g. 'G05 2024 01 07 ...')", line.text);
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
        throw this._error(line, 7, 'a satellite identifier (system letter and 2-digit number, e.g. G05) in columns 7-9', satellite);
      }
      const message = tokens[2] ?? '';
      if (message === '') throw this._error(line, 11, 'a message type (e.g. LNAV, INAV, FNAV, D1, D2, CNAV, FDMA) in columns 11-14', '');
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

  private _finishRecord(rec: PendingRecord, next: TextLine | undefined): RinexNavEvent[] {
    const v4 = rec.v4;
    if (v4) {
      // Trailing blank lines of a version-4 record are not part of it.
      while (rec.lines.length > 0 && rec.lines[rec.lines.length - 1]!.text.trim() === '') rec.lines.pop();
    }
    const first = rec.lines[0];
    const system = v4 ? v4.satellite.charAt(0) : rec.start.text.charAt(0);
    const satellite = v4 ? v4.satellite : normaliseSatellite(rec.start.text.slice(0, 3));
    const recordType: RinexNavRecordType = v4 ? v4.type : 'EPH';
    const message = v4?.message;
    const modelled = recordType === 'EPH' && modelledMessage(system, message) !== undefined;
    if (recordType === 'EPH') {
      rec.lines.forEach((l, k) => this._checkFieldAlignment(l, k === 0));
      const minimum = MINIMUM_SKIPPED_LINES[system];
      if (!modelled && minimum !== undefined && rec.lines.length < minimum) {
        const at = next ?? { text: '', lineNumber: this._lastLine + 1 };
        throw this._error(at, 1, `at least ${minimum} lines for the ${SYSTEM_NAMES[system]} record of ${satellite} starting at line ${rec.start.lineNumber} ` +
          `(found ${rec.lines.length}: truncated record)`, at.text);
      }
    }
    if (!modelled) {
      return [{
        kind: 'skipped',
        record: {
          line: rec.start.lineNumber, lineCount: rec.lines.length + (v4 ? 1 : 0), recordType, system, satellite,
          ...(message !== undefined ? { message } : {}),
          reason: skipReason(recordType, system, message),
        },
      }];
    }
    if (rec.lines.length < KEPLER_RECORD_LINES) {
      const at = next ?? { text: '', lineNumber: this._lastLine + 1 };
      throw this._error(at, 1,
        `${KEPLER_RECORD_LINES} lines for the ${SYSTEM_NAMES[system]} record of ${satellite} starting at line ${rec.start.lineNumber} ` +
        `(found ${rec.lines.length}: truncated record)`, at.text);
    }
    if (rec.lines.length > KEPLER_RECORD_LINES) {
      const extra = rec.lines[KEPLER_RECORD_LINES]!;
      throw this._error(extra, 1, `the next record header ('> ...'): the ${SYSTEM_NAMES[system]} record starting at line ${rec.start.lineNumber} has ${KEPLER_RECORD_LINES} lines`, extra.text);
    }
    if (v4 && first && normaliseSatellite(first.text.slice(0, 3)) !== v4.satellite) {
      throw this._error(first, 1, `satellite ${v4.satellite} as named in the record header on line ${v4.line.lineNumber}`, first.text.slice(0, 3));
    }
    return [{ kind: 'ephemeris', ephemeris: this._parseKepler(rec.lines, system as KeplerianSystem, message) }];
  }

  /**
   * Fields are right-aligned in D19.12 columns, so a line (trailing blanks removed) must end on a
   * field boundary: column 23 + 19k for the epoch line, 4 + 19k for orbit lines. A line that ends
   * inside a field was cut (a truncated file), and its last number would be misread.
   */
  private _checkFieldAlignment(line: TextLine, epochLine: boolean): void {
    const start = epochLine ? 23 : 4;
    const length = line.text.trimEnd().length;
    if (length > start && (length - start) % 19 !== 0) {
      const end = start + 19 * Math.ceil((length - start) / 19);
      throw this._error(line, length + 1, `a complete D19.12 field ending at column ${end} (the line ends inside a field: truncated?)`, line.text.slice(end - 19));
    }
  }

  private _number(line: TextLine, start: number, name: string, required: true): number;
  private _number(line: TextLine, start: number, name: string, required: false): number | undefined;
  private _number(line: TextLine, start: number, name: string, required: boolean): number | undefined {
    const raw = line.text.slice(start, start + 19);
    const v = parseFortranReal(raw);
    if (v === undefined) {
      if (required) throw this._error(line, start + 1, `${name} (a real number, format D19.12, columns ${start + 1}-${start + 19})`, raw);
      return undefined;
    }
    if (Number.isNaN(v)) throw this._error(line, start + 1, `${name} as a Fortran real (e.g. -1.234567890123D-05)`, raw.trim());
    return v;
  }

  private _parseKepler(lines: TextLine[], system: KeplerianSystem, v4Message: string | undefined): RinexNavEphemeris {
    const l0 = lines[0]!;
    const text = l0.text;
    const satellite = normaliseSatellite(text.slice(0, 3));
    const ints: number[] = [];
    const spans: [number, number, string][] = [[4, 8, 'year (I4)'], [9, 11, 'month'], [12, 14, 'day'], [15, 17, 'hour'], [18, 20, 'minute'], [21, 23, 'second']];
    for (const [a, b, what] of spans) {
      const t = text.slice(a, b);
      if (!/^ *\d+$/.test(t)) throw this._error(l0, a + 1, `the epoch ${what} in columns ${a + 1}-${b}`, t);
      ints.push(Number(t));
    }
    const toc: EpochFields = { year: ints[0]!, month: ints[1]!, day: ints[2]!, hour: ints[3]!, minute: ints[4]!, second: ints[5]! };
    if (!validEpochFields(toc) || toc.second >= 60) throw this._error(l0, 5, 'a valid calendar epoch (year month day hour minute second)', text.slice(4, 23));
    const af0 = this._number(l0, 23, 'clock bias a_f0 (s)', true);
    const af1 = this._number(l0, 42, 'clock drift a_f1 (s/s)', true);
    const af2 = this._number(l0, 61, 'clock drift rate a_f2 (s/s²)', true);
    const o = (k: number) => lines[k]!;
    for (let k = 1; k < KEPLER_RECORD_LINES; k++) {
      if (o(k).text.slice(0, 4).trim() !== '') {
        throw this._error(o(k), 1, `4 blanks before broadcast orbit line ${k} (format 4X,4D19.12)`, o(k).text.slice(0, 4));
      }
    }
    const col = (j: number) => 4 + 19 * j;
    const issueOfData = this._number(o(1), col(0), system === 'E' ? 'IODnav' : system === 'C' ? 'AODE' : 'IODE', true);
    const crs = this._number(o(1), col(1), 'C_rs (m)', true);
    const deltaN = this._number(o(1), col(2), 'Δn (rad/s)', true);
    const m0 = this._number(o(1), col(3), 'M0 (rad)', true);
    const cuc = this._number(o(2), col(0), 'C_uc (rad)', true);
    const eccentricity = this._number(o(2), col(1), 'eccentricity e', true);
    const cus = this._number(o(2), col(2), 'C_us (rad)', true);
    const sqrtA = this._number(o(2), col(3), 'sqrt(A) (√m)', true);
    const toe = this._number(o(3), col(0), 't_oe (seconds of week)', true);
    const cic = this._number(o(3), col(1), 'C_ic (rad)', true);
    const omega0 = this._number(o(3), col(2), 'Ω0 (rad)', true);
    const cis = this._number(o(3), col(3), 'C_is (rad)', true);
    const i0 = this._number(o(4), col(0), 'i0 (rad)', true);
    const crc = this._number(o(4), col(1), 'C_rc (m)', true);
    const argumentOfPerigee = this._number(o(4), col(2), 'ω (rad)', true);
    const omegaDot = this._number(o(4), col(3), 'Ω̇ (rad/s)', true);
    const idot = this._number(o(5), col(0), 'IDOT (rad/s)', true);
    const field5b = this._number(o(5), col(1), system === 'E' ? 'data sources' : 'spare / L2 codes', false);
    const week = this._number(o(5), col(2), system === 'C' ? 'BDT week' : system === 'E' ? 'GAL week' : 'GPS week', true);
    const accuracy = this._number(o(6), col(0), 'SV accuracy (m)', false);
    const health = this._number(o(6), col(1), system === 'C' ? 'SatH1' : 'SV health', true);
    const gd1 = this._number(o(6), col(2), 'group delay (s)', false);
    const gd2 = this._number(o(6), col(3), 'group delay / IODC', false);
    const transmission = this._number(o(7), col(0), 'transmission time of message (seconds of week)', false);
    const field7b = this._number(o(7), col(1), system === 'G' ? 'fit interval (hours)' : 'spare / AODC', false);

    if (eccentricity < 0 || eccentricity >= 1) throw this._error(o(2), col(1) + 1, 'eccentricity in [0, 1)', String(eccentricity));
    if (!(sqrtA > 2500 && sqrtA < 1e5)) throw this._error(o(2), col(3) + 1, 'sqrt(A) in (2500, 100000) √m', String(sqrtA));
    if (!(toe >= 0 && toe < SECONDS_PER_WEEK)) throw this._error(o(3), col(0) + 1, 't_oe in [0, 604800) seconds of week', String(toe));
    if (!Number.isInteger(week) || week < 0 || week > 100000) throw this._error(o(5), col(2) + 1, 'a non-negative integer week number', String(week));

    const notes: string[] = [];
    let message: KeplerianNavMessage;
    let dataSources: number | undefined;
    if (system === 'E') {
      dataSources = field5b;
      if (dataSources === undefined || !Number.isInteger(dataSources) || dataSources < 0) {
        throw this._error(o(5), col(1) + 1, 'Galileo data-source bits (a non-negative integer)', String(dataSources ?? ''));
      }
      const inav = (dataSources & 0b101) !== 0 || (dataSources & 512) !== 0;
      const fnav = (dataSources & 0b10) !== 0 || (dataSources & 256) !== 0;
      const fromBits: KeplerianNavMessage | undefined = inav && !fnav ? 'INAV' : fnav && !inav ? 'FNAV' : undefined;
      if (v4Message !== undefined) {
        message = v4Message as KeplerianNavMessage;
        if (fromBits !== undefined && fromBits !== message) notes.push(`data-source bits ${dataSources} indicate ${fromBits}, the record header says ${message}; header used`);
      } else if (fromBits === undefined) {
        throw this._error(o(5), col(1) + 1, 'Galileo data-source bits naming either I/NAV (bits 0, 2, 9) or F/NAV (bits 1, 8) (RINEX 3.05 Galileo table [M])', String(dataSources));
      } else {
        message = fromBits;
      }
    } else if (system === 'C') {
      const geo = isBeidouGeostationary(satellite);
      if (v4Message !== undefined) {
        message = v4Message as KeplerianNavMessage;
        if ((message === 'D2') !== geo) notes.push(`${message} record for a ${geo ? 'geostationary' : 'non-geostationary'} satellite; the ${geo ? 'GEO' : 'MEO/IGSO'} orbit algorithm is used (by PRN)`);
      } else {
        message = geo ? 'D2' : 'D1';
      }
    } else {
      message = 'LNAV';
    }

    // Week resolution: the week whose t_oe lies nearest to t_oc (common practice, no source).
    const tocSeconds = scaleSecondsFromFields(toc);
    const tocWeek = Math.floor(tocSeconds / SECONDS_PER_WEEK);
    let bestWeek = tocWeek;
    for (const w of [tocWeek - 1, tocWeek + 1]) {
      if (Math.abs(w * SECONDS_PER_WEEK + toe - tocSeconds) < Math.abs(bestWeek * SECONDS_PER_WEEK + toe - tocSeconds)) bestWeek = w;
    }
    const writtenGpsWeek = system === 'C' ? week + BDT_WEEK_OFFSET : week;
    const diff = bestWeek - writtenGpsWeek;
    const weekName = system === 'C' ? 'BDT' : system === 'E' ? 'GAL' : 'GPS';
    const resolvedWritten = system === 'C' ? bestWeek - BDT_WEEK_OFFSET : bestWeek;
    if (diff !== 0) {
      const mod = ((diff % 1024) + 1024) % 1024;
      if (mod === 0) {
        notes.push(`week ${week} read as ${weekName} week ${resolvedWritten} (written modulo 1024: week-number rollover)`);
      } else if (mod === 1 || mod === 1023) {
        const rolled = Math.abs(diff) > 1 ? ' after a modulo-1024 rollover correction' : '';
        notes.push(`t_oe lies in ${weekName} week ${resolvedWritten}, the week field says ${week}${rolled} (t_oe placed nearest to t_oc)`);
      } else {
        throw this._error(o(5), col(2) + 1, `a ${weekName} week consistent with the epoch t_oc (${resolvedWritten}, or that modulo 1024)`, String(week));
      }
    }
    const toeSeconds = bestWeek * SECONDS_PER_WEEK + toe;
    if (Math.abs(toeSeconds - tocSeconds) > 0.5 * SECONDS_PER_WEEK) {
      throw this._error(o(3), col(0) + 1, 't_oe within half a week of t_oc', String(toe));
    }

    let transmissionSeconds: number | undefined;
    if (transmission !== undefined && Math.abs(transmission) < 0.9e9) {
      let tt = bestWeek * SECONDS_PER_WEEK + transmission;
      if (tt - toeSeconds > SECONDS_PER_WEEK / 2) tt -= SECONDS_PER_WEEK;
      else if (tt - toeSeconds < -SECONDS_PER_WEEK / 2) tt += SECONDS_PER_WEEK;
      transmissionSeconds = tt;
    }

    let fitIntervalSeconds = defaultFitIntervalSeconds();
    if (system === 'G') {
      if (field7b !== undefined && field7b > 0) fitIntervalSeconds = field7b * 3600;
      else notes.push('fit interval not given (0 or blank): 4 hours assumed (IS-GPS-200 §20.3.4.4 [M])');
    }

    const groupDelays: Record<string, number> = {};
    let issueOfDataClock: number | undefined;
    if (system === 'G') {
      if (gd1 !== undefined) groupDelays['TGD'] = gd1;
      issueOfDataClock = gd2;
    } else if (system === 'E') {
      if (gd1 !== undefined) groupDelays['BGD_E5a_E1'] = gd1;
      if (gd2 !== undefined) groupDelays['BGD_E5b_E1'] = gd2;
    } else {
      if (gd1 !== undefined) groupDelays['TGD1'] = gd1;
      if (gd2 !== undefined) groupDelays['TGD2'] = gd2;
      issueOfDataClock = field7b;
    }

    return {
      satellite, system, message, tocSeconds, toeSeconds, af0, af1, af2, issueOfData, sqrtA, eccentricity, m0, deltaN,
      omega0, i0, argumentOfPerigee, omegaDot, idot, cuc, cus, cic, cis, crc, crs, health, fitIntervalSeconds,
      ...(transmissionSeconds !== undefined ? { transmissionSeconds } : {}),
      toc, weekAsWritten: week, toeSecondsOfWeek: toe,
      ...(accuracy !== undefined ? { accuracy } : {}),
      groupDelays,
      ...(dataSources !== undefined ? { dataSources } : {}),
      ...(issueOfDataClock !== undefined ? { issueOfDataClock } : {}),
      sourceName: this._source, line: l0.lineNumber, notes,
    };
  }
}

function normaliseSatellite(id: string): string {
  return `${id.charAt(0)}${id.slice(1, 3).trim().padStart(2, '0')}`;
}

function modelledMessage(system: string, message: string | undefined): KeplerianNavMessage | undefined {
  if (message === undefined) return system === 'G' ? 'LNAV' : system === 'E' ? 'INAV' : system === 'C' ? 'D1' : undefined;
  if (system === 'G' && message === 'LNAV') return 'LNAV';
  if (system === 'E' && (message === 'INAV' || message === 'FNAV')) return message;
  if (system === 'C' && (message === 'D1' || message === 'D2')) return message;
  return undefined;
}

function skipReason(type: RinexNavRecordType, system: string, message: string | undefined): string {
  const name = SYSTEM_NAMES[system] ?? system;
  switch (type) {
    case 'STO': return `system time offset record (${name}${message ? ` ${message}` : ''}): not used for satellite clock corrections`;
    case 'EOP': return `Earth orientation parameter record (${name}${message ? ` ${message}` : ''}): not used for satellite clock corrections`;
    case 'ION': return `ionosphere model record (${name}${message ? ` ${message}` : ''}): not used for satellite clock corrections`;
    default: break;
  }
  if (system === 'R') return 'GLONASS ephemeris: a state-vector record (no Keplerian elements; relativistic term already in its clock data), not modelled';
  if (system === 'S') return 'SBAS ephemeris: a state-vector record, not modelled';
  if (system === 'J' || system === 'I') return `${name} ephemeris: system not modelled`;
  return `${name} ${message ?? ''} ephemeris: message type not modelled (modelled: GPS LNAV, Galileo INAV/FNAV, BeiDou D1/D2)`.replace('  ', ' ');
}

/**
 * Reads a RINEX 3.0x / 4.0x navigation file as a stream of events: the header first, then one
 * event per record in file order (modelled ephemerides, and skipped records with their reason).
 *
 * @param source   The file text, or its chunks (sync or async iterable of strings).
 * @param options  `sourceName` for error messages.
 * @returns An async generator of {@link RinexNavEvent}.
 * @throws {ParseError} on the first malformed, truncated or unsupported line (file, line, column, expected).
 * @see RINEX 3.05 (IGS/RTCM-SC104, 2020) §5.4 and Appendix Tables A4–A16; RINEX 4.01 (2023) navigation
 *   message record types [M].
 */
export async function* readRinexNav(source: TextSource, options: RinexNavReadOptions = {}): AsyncGenerator<RinexNavEvent> {
  const parser = new RinexNavParser(options);
  // One asynchronous step per chunk, not per line (an event is yielded only when a line completes one).
  for await (const lines of readLineBatches(source)) {
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
 * @see RINEX 3.05 and 4.01 [M].
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
  for (const line of linesOf(source)) take(parser.push(line));
  take(parser.finish());
  return { header: header!, ephemerides, skipped };
}
