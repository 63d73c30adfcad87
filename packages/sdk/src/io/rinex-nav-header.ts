/**
 * Header of RINEX navigation files, versions 2.10/2.11 (GPS `N`, GLONASS `G`, GEO `H` files), 3.0x
 * and 4.0x: the version line, labels in columns 61–80, leap seconds, and the broadcast ionosphere and
 * time-system (e.g. GPS → UTC) parameters.
 *
 * Sources: RINEX 2.11 (W. Gurtner, L. Estey, IGS/RTCM, 10 Dec 2007, rev. 26 June 2012) Tables A3, A10,
 * A15 and §4, §5.1, §6.5, read in a full-text transcription of the IGS document `rinex211.txt` [V1];
 * RINEX 2.10 shares them: 2.11 §10 says its modifications make "no changes in the actual formats" [V1]
 * (the 2.10 text itself not opened); RINEX 3.05 / 4.01 header records [M].
 *
 * @module
 */
import { ParseError } from '../errors.js';
import { parseFortranReal, type TextLine } from './line-reader.js';
import type {
  RinexIonosphereParameters,
  RinexLeapSeconds,
  RinexNavHeader,
  RinexTimeSystemCorrection,
} from './rinex-nav-types.js';
import { correctionReference } from './rinex-time-correction.js';

const SYSTEM_CODES = 'GRECJIS';

/** A time-system correction with its fields as written and, where its type names the week system, t_ref as an Instant. */
function correction(
  type: string,
  a0: number,
  a1: number,
  referenceSecondsOfWeek: number,
  referenceWeek: number,
  line: number,
): RinexTimeSystemCorrection {
  const reference = correctionReference(type, referenceWeek, referenceSecondsOfWeek);
  return { type, a0, a1, referenceSecondsOfWeek, referenceWeek, ...(reference ? { reference } : {}), line };
}

/** What the first header line says. */
export interface NavVersionLine {
  readonly version: number;
  /** Version-2 file type letter (N, G, H); `N` for versions 3 and 4. */
  readonly fileType: string;
  /** System of the file: a system code or `M`. */
  readonly system: string;
}

/** The system each version-2 file type holds (RINEX 2.11 §4, Tables A3, A10, A15 [V1]). */
const V2_FILE_TYPES: Readonly<Record<string, string>> = { N: 'G', G: 'R', H: 'S' };

/**
 * Reads the `RINEX VERSION / TYPE` line.
 * @throws {ParseError} for a version or file type not read, naming the column.
 */
export function readNavVersionLine(source: string, line: TextLine): NavVersionLine {
  const err = (column: number, expected: string, found: string) =>
    new ParseError(source, line.lineNumber, column, expected, found);
  const label = line.text.slice(60).trim();
  if (label !== 'RINEX VERSION / TYPE')
    throw err(61, "the first header line, labelled 'RINEX VERSION / TYPE' in columns 61-80", line.text);
  const versionText = line.text.slice(0, 9).trim();
  const version = /^\d+(\.\d+)?$/.test(versionText) ? Number(versionText) : Number.NaN;
  const type = line.text.charAt(20);
  const system = line.text.charAt(40).trim();
  if (version >= 2 && version < 3) {
    if (version === 2.12) {
      throw err(
        1,
        'RINEX version 2.10, 2.11, 3.0x or 4.0x in columns 1-9 (2.12 was a draft, never adopted: its layouts are not read)',
        versionText,
      );
    }
    if (version !== 2.1 && version !== 2.11) {
      throw err(
        1,
        'RINEX version 2.10, 2.11, 3.0x or 4.0x in columns 1-9 (navigation files before 2.10 are not read)',
        versionText,
      );
    }
    if (type === 'L') {
      throw err(
        21,
        "file type N (GPS), G (GLONASS) or H (GEO) in column 21: RINEX 2.11 reserves 'L' for a future Galileo navigation file and defines no layout for it (§4); convert the file to RINEX 3",
        type,
      );
    }
    const fileSystem = V2_FILE_TYPES[type];
    if (fileSystem === undefined)
      throw err(21, 'file type N (GPS navigation), G (GLONASS) or H (GEO) in column 21', type);
    // Column 41 lies in a blank field of the version-2 navigation header (Table A3: A1,19X): a system letter there
    // other than the file's own marks a mixed or Galileo file, a layout RINEX 2.11 does not define.
    if (system !== '' && system !== fileSystem) {
      throw err(
        41,
        `column 41 blank (or ${fileSystem}) in a RINEX 2 '${type}' file: RINEX 2.11 defines no mixed or Galileo navigation file layout (Tables A3, A10, A15); convert the file to RINEX 3`,
        system,
      );
    }
    return { version, fileType: type, system: fileSystem };
  }
  if (!(version >= 3 && version < 3.1) && !(version >= 4 && version < 4.1)) {
    throw err(1, 'RINEX version 2.10, 2.11, 3.0x or 4.0x in columns 1-9', versionText);
  }
  if (type !== 'N') throw err(21, "file type 'N' (navigation data) in column 21", type);
  if (system !== '' && !SYSTEM_CODES.includes(system) && system !== 'M') {
    throw err(41, 'satellite system G, R, E, C, J, I, S or M (mixed) in column 41', system);
  }
  if (system === '' && version < 4) throw err(41, 'satellite system code in column 41', system);
  return { version, fileType: 'N', system: system || 'M' };
}

/** Accumulates header lines after the version line; {@link NavHeaderReader.push} returns the header at `END OF HEADER`. */
export class NavHeaderReader {
  private readonly _source: string;
  private readonly _first: NavVersionLine;
  private _programName?: string;
  private _runBy?: string;
  private _creationDate?: string;
  private _leapSeconds?: RinexLeapSeconds;
  private readonly _ionosphere: RinexIonosphereParameters[] = [];
  private readonly _corrections: RinexTimeSystemCorrection[] = [];
  private readonly _comments: string[] = [];
  private readonly _other: { label: string; text: string; line: number }[] = [];

  constructor(source: string, first: NavVersionLine) {
    this._source = source;
    this._first = first;
  }

  /** Reads one header line; returns the header when the line is `END OF HEADER`. @throws {ParseError} */
  push(line: TextLine): RinexNavHeader | undefined {
    const label = line.text.slice(60).trim();
    const body = line.text.slice(0, 60);
    const v2 = this._first.version < 3;
    if (label === '')
      throw new ParseError(this._source, line.lineNumber, 61, 'a header label in columns 61-80', line.text);
    switch (label) {
      case 'END OF HEADER':
        return this._header(line.lineNumber);
      case 'COMMENT':
        this._comments.push(body.trimEnd());
        return undefined;
      case 'PGM / RUN BY / DATE':
        this._programName = body.slice(0, 20).trim();
        this._runBy = body.slice(20, 40).trim();
        this._creationDate = body.slice(40, 60).trim();
        return undefined;
      case 'LEAP SECONDS':
        this._leapSeconds = this._readLeapSeconds(line);
        return undefined;
      case 'RINEX VERSION / TYPE':
        throw new ParseError(
          this._source,
          line.lineNumber,
          61,
          'a single RINEX VERSION / TYPE line (found a second one: two files concatenated?)',
          label,
        );
      default:
        break;
    }
    if (v2 && (label === 'ION ALPHA' || label === 'ION BETA')) {
      // RINEX 2.11 Table A3: 2X,4D12.4 [V1].
      this._ionosphere.push({
        type: label === 'ION ALPHA' ? 'GPSA' : 'GPSB',
        parametersBroadcastUnits: this._reals(line, 2, 12, 4, label),
        line: line.lineNumber,
      });
    } else if (v2 && label === 'DELTA-UTC: A0,A1,T,W') {
      // RINEX 2.11 Table A3: 3X,2D19.12,2I9; W a continuous week number [V1].
      const a0 = this._real(line, 3, 19, `${label} parameter 1`);
      const a1 = this._real(line, 22, 19, `${label} parameter 2`);
      const referenceSecondsOfWeek = this._int(line, 41, 9, 'T, reference time of UTC data (I9, seconds of week)');
      const referenceWeek = this._int(line, 50, 9, 'W, UTC reference week (I9, continuous)');
      this._corrections.push(correction('GPUT', a0, a1, referenceSecondsOfWeek, referenceWeek, line.lineNumber));
    } else if (!v2 && label === 'IONOSPHERIC CORR') {
      // RINEX 3.05: A4,1X,4D12.4 [M].
      this._ionosphere.push({
        type: this._type(line),
        parametersBroadcastUnits: this._reals(line, 5, 12, 4, label),
        line: line.lineNumber,
      });
    } else if (!v2 && label === 'TIME SYSTEM CORR') {
      // RINEX 3.05: A4,1X,D17.10,D16.9,I7,I5 [M].
      const type = this._type(line);
      const a0 = this._real(line, 5, 17, `${label} a0 (s)`);
      const a1 = this._real(line, 22, 16, `${label} a1 (s/s)`);
      const referenceSecondsOfWeek = this._int(line, 38, 7, 'T, reference time (I7, seconds of week)');
      const referenceWeek = this._int(line, 45, 5, 'W, reference week (I5)');
      this._corrections.push(correction(type, a0, a1, referenceSecondsOfWeek, referenceWeek, line.lineNumber));
    } else {
      this._other.push({ label, text: body.trimEnd(), line: line.lineNumber });
    }
    return undefined;
  }

  private _header(lineCount: number): RinexNavHeader {
    return {
      sourceName: this._source,
      version: this._first.version,
      satelliteSystem: this._first.system,
      fileType: this._first.fileType,
      ...(this._programName !== undefined ? { programName: this._programName } : {}),
      ...(this._runBy !== undefined ? { runBy: this._runBy } : {}),
      ...(this._creationDate !== undefined ? { creationDate: this._creationDate } : {}),
      ...(this._leapSeconds ? { leapSeconds: this._leapSeconds } : {}),
      ionosphere: this._ionosphere,
      timeSystemCorrections: this._corrections,
      comments: this._comments,
      otherLines: this._other,
      lineCount,
    };
  }

  private _type(line: TextLine): string {
    const t = line.text.slice(0, 4).trim();
    if (!/^[A-Z]{3,4}$/.test(t))
      throw new ParseError(
        this._source,
        line.lineNumber,
        1,
        'a correction type (e.g. GPSA, GAL, GPUT) in columns 1-4',
        t,
      );
    return t;
  }

  /** One real of `width` columns at 0-based `start`. @throws {ParseError} when blank or not a number. */
  private _real(line: TextLine, start: number, width: number, name: string): number {
    const raw = line.text.slice(start, start + width);
    const v = parseFortranReal(raw);
    if (v === undefined || Number.isNaN(v)) {
      throw new ParseError(
        this._source,
        line.lineNumber,
        start + 1,
        `${name} as a real number in columns ${start + 1}-${start + width}`,
        raw,
      );
    }
    return v;
  }

  /** `count` reals of `width` columns from 0-based `start`; blank ones are null unless `required`. */
  private _reals(
    line: TextLine,
    start: number,
    width: number,
    count: number,
    label: string,
    required = false,
  ): (number | null)[] {
    const out: (number | null)[] = [];
    for (let k = 0; k < count; k++) {
      const s = start + k * width;
      const raw = line.text.slice(s, s + width);
      if (!required && raw.trim() === '') out.push(null);
      else out.push(this._real(line, s, width, `${label} parameter ${k + 1}`));
    }
    return out;
  }

  private _int(line: TextLine, start: number, width: number, name: string): number {
    const t = line.text.slice(start, start + width).trim();
    if (!/^[+-]?\d+$/.test(t))
      throw new ParseError(
        this._source,
        line.lineNumber,
        start + 1,
        `${name} as an integer in columns ${start + 1}-${start + width}`,
        t,
      );
    return Number(t);
  }

  private _readLeapSeconds(line: TextLine): RinexLeapSeconds {
    const ints: (number | undefined)[] = [];
    for (let k = 0; k < 4; k++) {
      const t = line.text.slice(6 * k, 6 * k + 6).trim();
      if (t === '') {
        ints.push(undefined);
        continue;
      }
      if (!/^[+-]?\d+$/.test(t))
        throw new ParseError(this._source, line.lineNumber, 6 * k + 1, 'an integer (format I6)', t);
      ints.push(Number(t));
    }
    if (ints[0] === undefined)
      throw new ParseError(
        this._source,
        line.lineNumber,
        1,
        'the current number of leap seconds (I6, columns 1-6)',
        '',
      );
    const ts = line.text.slice(24, 27).trim();
    return {
      current: ints[0],
      ...(ints[1] !== undefined ? { future: ints[1] } : {}),
      ...(ints[2] !== undefined ? { futureWeek: ints[2] } : {}),
      ...(ints[3] !== undefined ? { futureDay: ints[3] } : {}),
      ...(ts !== '' ? { timeSystem: ts } : {}),
    };
  }
}
