/**
 * Body of RINEX 2.10 / 2.11 navigation files: GPS `N` files (Keplerian records, modelled), GLONASS
 * `G` and geostationary-payload `H` files (state-vector records, recognised and reported as skipped).
 *
 * Layouts, RINEX 2.11 (Gurtner & Estey, IGS/RTCM, 2007/2012), read in a full-text transcription of
 * the IGS document `rinex211.txt` [V1]:
 * - Table A4 (GPS): `I2,1X,I2.2,4(1X,I2),F5.1,3D19.12` (PRN only, no system letter; two-digit year),
 *   then 7 lines `3X,4D19.12`; the week is continuous, not modulo 1024 (§0.3); the fit interval is in
 *   hours, 0 if not known (§6.6); a transmission time before the week of t_oe is written negative (§6.8).
 * - Table A11 (GLONASS, epoch in UTC) and Table A16 (GEO, PRN − 100, epoch in GPS time): the same
 *   epoch line, then 3 lines `3X,4D19.12`.
 * - Two-digit years: 80–99 → 1980–1999, 00–79 → 2000–2079 (§6.5, Tables A6, A11).
 * RINEX 2.11 defines no Galileo or mixed navigation file (§4 reserves type `L` for a future Galileo
 * file); the header reader refuses them. RINEX 2.10 shares these layouts: 2.11 §10 says its modifications
 * make "no changes in the actual formats" [V1] (the 2.10 text itself not opened). Files before 2.10 (no fit
 * interval, §0.4) and the 2.12 draft are not read.
 *
 * @module
 */
import { InvalidArgumentError, ParseError } from '../errors.js';
import { requireInteger } from '../internal/validate.js';
import { type EpochFields, type TextLine, validEpochFields } from './line-reader.js';
import { checkFieldAlignment, decodeKeplerRecord, KEPLER_RECORD_LINES, RINEX2_LAYOUT } from './rinex-nav-kepler.js';
import { SYSTEM_NAMES, skipReason } from './rinex-nav-skip.js';
import type { RinexNavEvent } from './rinex-nav-types.js';

/** A record's layout by file type. */
interface RecordKind {
  /** Lines per record: N 8 (Table A4), G 4 (Table A11), H 4 (Table A16) [V1]. */
  readonly lines: number;
  /** System letter of the file type's satellites (§5.1, §9.1 [V1]). */
  readonly system: string;
}
const RECORD_KINDS: Readonly<Record<string, RecordKind>> = {
  N: { lines: KEPLER_RECORD_LINES, system: 'G' },
  G: { lines: 4, system: 'R' },
  H: { lines: 4, system: 'S' },
};

/** A record's lines so far: never empty (a record starts with its first line). */
type RecordLines = [TextLine, ...TextLine[]];

/**
 * A two-digit RINEX 2 year as a full year: 80–99 → 1980–1999, 00–79 → 2000–2079.
 * @param yy  The two-digit year, an integer 0–99.
 * @returns The full year.
 * @throws {InvalidArgumentError} if `yy` is not an integer in [0, 99].
 * @see RINEX 2.11 §6.5 and Tables A6, A11 [V1].
 */
export function fullYearFromTwoDigits(yy: number): number {
  const y = requireInteger('yy', yy, 0, 99);
  return y >= 80 ? 1900 + y : 2000 + y;
}

/** Reads the body of a version-2 navigation file, one line at a time. */
export class NavV2Body {
  private readonly _source: string;
  private readonly _fileType: string;
  private readonly _kind: RecordKind;
  private _pending: RecordLines | undefined;

  /** @throws {InvalidArgumentError} for a file type other than N, G or H (the header reader refuses those first). */
  constructor(source: string, fileType: string) {
    const kind = RECORD_KINDS[fileType];
    if (kind === undefined) {
      throw new InvalidArgumentError('fileType', fileType, 'a RINEX 2 navigation file type: N, G or H');
    }
    this._source = source;
    this._fileType = fileType;
    this._kind = kind;
  }

  /** Feeds one body line; returns the events it completed. @throws {ParseError} */
  push(line: TextLine): RinexNavEvent[] {
    const start = line.text.slice(0, 3).trim() !== '';
    if (start) {
      if (this._pending) throw this._truncated(this._pending, line);
      this._pending = [line];
    } else if (this._pending) {
      this._pending.push(line);
    } else {
      if (line.text.trim() === '') return [];
      throw new ParseError(
        this._source,
        line.lineNumber,
        1,
        "the first line of a navigation record: a 2-digit satellite number in columns 1-2 (RINEX 2.11 Table A4: e.g. ' 6 99  9  2 17 51 44.0 ...')",
        line.text,
      );
    }
    if (this._pending.length < this._kind.lines) return [];
    const done = this._pending;
    this._pending = undefined;
    return [this._record(done)];
  }

  /** Ends the body. @throws {ParseError} for a record cut short by the end of the file. */
  finish(lastLine: number): RinexNavEvent[] {
    if (this._pending) throw this._truncated(this._pending, { text: '', lineNumber: lastLine + 1 });
    return [];
  }

  private _truncated(lines: RecordLines, at: TextLine): ParseError {
    const { lines: needed, system } = this._kind;
    const [first] = lines;
    return new ParseError(
      this._source,
      at.lineNumber,
      1,
      `${needed} lines for the ${SYSTEM_NAMES[system]} record of ${satelliteId(system, first.text)} starting at line ${first.lineNumber} ` +
        `(found ${lines.length}: truncated record)`,
      at.text,
    );
  }

  private _record(lines: RecordLines): RinexNavEvent {
    const { system } = this._kind;
    const [first] = lines;
    lines.forEach((l, k) => {
      checkFieldAlignment(this._source, l, k === 0, RINEX2_LAYOUT);
    });
    const { prn, toc } = this._epochLine(first);
    const satellite = `${system}${String(prn).padStart(2, '0')}`;
    if (system === 'G') {
      return {
        kind: 'ephemeris',
        ephemeris: decodeKeplerRecord(this._source, lines, 'G', undefined, { satellite, toc }, RINEX2_LAYOUT),
      };
    }
    for (const l of lines.slice(1)) {
      if (l.text.slice(0, 3).trim() !== '')
        throw new ParseError(
          this._source,
          l.lineNumber,
          1,
          '3 blanks before a broadcast orbit line (format 3X,4D19.12)',
          l.text.slice(0, 3),
        );
    }
    return {
      kind: 'skipped',
      record: {
        line: first.lineNumber,
        lineCount: lines.length,
        recordType: 'EPH',
        system,
        satellite,
        reason: skipReason('EPH', system, undefined),
      },
    };
  }

  /** Satellite number and epoch of a record's first line (`I2,1X,I2.2,4(1X,I2),F5.1`). @throws {ParseError} */
  private _epochLine(line: TextLine): { prn: number; toc: EpochFields } {
    const text = line.text;
    const err = (column: number, expected: string, found: string) =>
      new ParseError(this._source, line.lineNumber, column, expected, found);
    const prnText = text.slice(0, 2);
    if (!/^ ?\d{1,2}$/.test(prnText) || Number(prnText) === 0) {
      throw err(
        1,
        `a satellite number 1-99 in columns 1-2 (format I2; RINEX 2 ${this._fileType} files carry no system letter)`,
        prnText,
      );
    }
    const ints: number[] = [];
    const spans: [number, number, string][] = [
      [3, 5, 'two-digit year (I2.2)'],
      [6, 8, 'month'],
      [9, 11, 'day'],
      [12, 14, 'hour'],
      [15, 17, 'minute'],
    ];
    for (const [a, b, what] of spans) {
      if (text.charAt(a - 1) !== ' ')
        throw err(a, `a blank before the epoch ${what} (column ${a})`, text.charAt(a - 1));
      const t = text.slice(a, b);
      if (!/^ ?\d{1,2}$/.test(t)) throw err(a + 1, `the epoch ${what} in columns ${a + 1}-${b}`, t);
      ints.push(Number(t));
    }
    const secondText = text.slice(17, 22);
    if (!/^ *\d{1,2}(\.\d*)?$/.test(secondText) && !/^ *\.\d+$/.test(secondText)) {
      throw err(18, 'the epoch second in columns 18-22 (format F5.1)', secondText);
    }
    const [yy = Number.NaN, month = Number.NaN, day = Number.NaN, hour = Number.NaN, minute = Number.NaN] = ints;
    const toc: EpochFields = { year: fullYearFromTwoDigits(yy), month, day, hour, minute, second: Number(secondText) };
    if (!validEpochFields(toc) || toc.second >= 60)
      throw err(4, 'a valid calendar epoch (yy mm dd hh mm ss.s)', text.slice(3, 22));
    return { prn: Number(prnText), toc };
  }
}

function satelliteId(system: string, text: string): string {
  const prn = text.slice(0, 2).trim();
  return `${system}${prn.padStart(2, '0')}`;
}
