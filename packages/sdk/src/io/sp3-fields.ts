/**
 * Field readers of the SP3 reader (see `sp3.ts` for the format sources): fixed-column integers and reals,
 * epoch fields, lines 1 and 2 and satellite identifiers, each refusing malformed input with a
 * {@link ParseError} naming the source, line and column.
 *
 * @module
 */
import { ParseError } from '../errors.js';
import { isReadableTimeSystem } from './epochs.js';
import { type EpochFields, type TextLine, validEpochFields } from './line-reader.js';
import type { Sp3TimeSystem, Sp3Version } from './sp3-types.js';

/**
 * Largest magnitude an F14.6 data field can hold (14 characters with the sign and six decimals leave
 * at most 7 integer digits): a larger value (only writable in exponent form, e.g. `1e400` or `1e300`)
 * is not an SP3 value and is refused (common practice, no source).
 */
export const F14_6_LIMIT = 1e8;

/** SP3 time-system identifiers (SP3-c/d `%c` line, columns 10-12 [M]). */
const TIME_SYSTEMS: readonly string[] = ['GPS', 'GLO', 'GAL', 'TAI', 'UTC', 'BDT', 'QZS', 'IRN'];

/** What the first `%c` line says. */
export interface SystemLine {
  readonly fileType: string;
  readonly timeSystem: Sp3TimeSystem;
  readonly timeSystemAssumed: boolean;
}

/** What line 1 says (the line itself is kept to place its first epoch once the time system is known). */
export interface Line1 {
  readonly line: TextLine;
  readonly version: Sp3Version;
  readonly hasVelocities: boolean;
  readonly firstEpoch: EpochFields;
  readonly epochCount: number;
  readonly dataUsed: string;
  readonly coordinateFrame: string;
  readonly orbitType: string;
  readonly agency: string;
}

/** What line 2 says. */
export interface Line2 {
  readonly gpsWeek: number;
  readonly secondsOfWeek: number;
  readonly epochInterval: number;
  readonly modifiedJulianDay: number;
  readonly fractionalDay: number;
}

/** Reads the fields of SP3 lines for one source (its name goes into every error). */
export class Sp3FieldReader {
  constructor(private readonly _source: string) {}

  error(line: TextLine, column: number | undefined, expected: string, found?: string): ParseError {
    return new ParseError(this._source, line.lineNumber, column, expected, found);
  }

  int(line: TextLine, a: number, b: number, what: string): number {
    const s = line.text.slice(a, b);
    if (!/^\s*[+-]?\d+\s*$/.test(s)) throw this.error(line, a + 1, `${what} (an integer in columns ${a + 1}-${b})`, s);
    return Number(s);
  }

  /**
   * The real number in columns a+1..b. Non-finite values (`1e400`) are refused; with `limit`, so is any
   * magnitude of `limit` or more (a data field holds at most what its F14.6 width can write).
   */
  real(line: TextLine, a: number, b: number, what: string, optional = false, limit = Infinity): number | undefined {
    const s = line.text.slice(a, b);
    const trimmed = s.trim();
    if (trimmed === '' && optional) return undefined;
    if (!/^[+-]?(\d+\.?\d*|\.\d+)([Ee][+-]?\d+)?$/.test(trimmed)) {
      throw this.error(line, a + 1, `${what} (a number in columns ${a + 1}-${b})`, s);
    }
    const v = Number(trimmed);
    if (!Number.isFinite(v) || Math.abs(v) >= limit) {
      const range = Number.isFinite(limit) ? `a finite number of magnitude below ${limit}` : 'a finite number';
      throw this.error(line, a + 1, `${what} (${range} in columns ${a + 1}-${b})`, s);
    }
    return v;
  }

  /** A required real number (see {@link Sp3FieldReader.real}): a blank field is refused. */
  required(line: TextLine, a: number, b: number, what: string, limit = Infinity): number {
    const v = this.real(line, a, b, what, false, limit);
    if (v === undefined)
      throw this.error(line, a + 1, `${what} (a number in columns ${a + 1}-${b})`, line.text.slice(a, b));
    return v;
  }

  epochFields(line: TextLine, what: string): EpochFields {
    const f: EpochFields = {
      year: this.int(line, 3, 7, `${what} year`),
      month: this.int(line, 8, 10, `${what} month`),
      day: this.int(line, 11, 13, `${what} day`),
      hour: this.int(line, 14, 16, `${what} hour`),
      minute: this.int(line, 17, 19, `${what} minute`),
      second: this.required(line, 20, 31, `${what} second`),
    };
    if (!validEpochFields(f) || f.second >= 60)
      throw this.error(line, 4, `a valid calendar ${what}`, line.text.slice(3, 31));
    return f;
  }

  line1(line: TextLine): Line1 {
    const t = line.text;
    if (t.charAt(0) !== '#' || t.charAt(1) === '#')
      throw this.error(line, 1, "an SP3 first line starting with '#a', '#b', '#c' or '#d'", t.slice(0, 2));
    const v = t.charAt(1);
    if (v !== 'a' && v !== 'b' && v !== 'c' && v !== 'd')
      throw this.error(line, 2, "SP3 version 'a', 'b', 'c' or 'd' in column 2", v);
    const pv = t.charAt(2);
    if (pv !== 'P' && pv !== 'V') throw this.error(line, 3, "position/velocity flag 'P' or 'V' in column 3", pv);
    const firstEpoch = this.epochFields(line, 'first epoch');
    const n = this.int(line, 32, 39, 'number of epochs');
    if (n < 1) throw this.error(line, 33, 'a positive number of epochs in columns 33-39', String(n));
    return {
      line,
      version: v,
      hasVelocities: pv === 'V',
      firstEpoch,
      epochCount: n,
      dataUsed: t.slice(40, 45).trim(),
      coordinateFrame: t.slice(46, 51).trim(),
      orbitType: t.slice(52, 55).trim(),
      agency: t.slice(56, 60).trim(),
    };
  }

  line2(line: TextLine): Line2 {
    if (!line.text.startsWith('##'))
      throw this.error(line, 1, "the second header line starting with '##'", line.text.slice(0, 2));
    const gpsWeek = this.int(line, 3, 7, 'GPS week');
    const secondsOfWeek = this.required(line, 8, 23, 'seconds of week');
    const interval = this.required(line, 24, 38, 'epoch interval (s)');
    if (!(interval > 0)) throw this.error(line, 25, 'a positive epoch interval in seconds', String(interval));
    return {
      gpsWeek,
      secondsOfWeek,
      epochInterval: interval,
      modifiedJulianDay: this.int(line, 39, 44, 'modified Julian day'),
      fractionalDay: this.required(line, 45, 60, 'fractional day'),
    };
  }

  /**
   * A satellite identifier as written in the header or a record: SP3-a `I3` PRN (GPS), SP3-b `A1,I2`
   * with a blank system letter meaning GPS, SP3-c/d `A1,I2`. Returned as letter + two digits (`G05`).
   */
  satelliteId(line: TextLine, id: string, column: number, v: Sp3Version | undefined): string {
    if (v === 'a') {
      if (!/^ *\d{1,2}$/.test(id)) throw this.error(line, column, 'an SP3-a satellite number (I3, a GPS PRN 1-99)', id);
      return `G${id.trim().padStart(2, '0')}`;
    }
    const pattern = v === 'b' ? /^[A-Z ][ \d]\d$/ : /^[A-Z][ \d]\d$/;
    if (!pattern.test(id))
      throw this.error(
        line,
        column,
        `a satellite identifier such as G01${v === 'b' ? ' (blank letter: GPS)' : ''}`,
        id,
      );
    const letter = id.charAt(0) === ' ' ? 'G' : id.charAt(0);
    return `${letter}${id.slice(1).trim().padStart(2, '0')}`;
  }

  /**
   * First `%c` line: file type (columns 4-5) and time system (columns 10-12). SP3-a/b leave both as
   * the placeholders `cc`/`ccc` (GPS time assumed); a real code is read in any version.
   */
  timeSystemLine(line: TextLine, version: Sp3Version | undefined): SystemLine {
    const t = line.text;
    const legacy = version === 'a' || version === 'b';
    const type = t.slice(3, 5).trim();
    const fileType = legacy && (type === 'cc' || type === '') ? (version === 'a' ? 'G' : '') : type;
    const ts = t.slice(9, 12);
    if (legacy && (ts === 'ccc' || ts.trim() === '')) {
      return { fileType, timeSystem: 'GPS', timeSystemAssumed: true };
    }
    if (!TIME_SYSTEMS.includes(ts)) {
      const also = legacy ? " (or the SP3-a/b placeholder 'ccc': GPS time)" : '';
      throw this.error(line, 10, `a time system (${TIME_SYSTEMS.join(', ')}) in columns 10-12${also}`, ts);
    }
    if (!isReadableTimeSystem(ts)) {
      throw this.error(
        line,
        10,
        `a time system the SDK can place on its scales (${TIME_SYSTEMS.filter(isReadableTimeSystem).join(', ')}) in columns 10-12`,
        ts,
      );
    }
    return { fileType, timeSystem: ts as Sp3TimeSystem, timeSystemAssumed: false };
  }
}
