/**
 * Reader for SP3 precise orbit files, versions a, b, c and d (the NGS/IGS "Standard Product 3" orbit
 * format). Sources: B. W. Remondi, "Extending the National Geodetic Survey standard GPS orbit
 * formats", NOAA TR NOS 133 NGS 46 (1989), as adopted in 1991 (SP3-a: 22 header lines, GPS only,
 * satellite identifiers I3, records 60 columns wide; layout of lines 1-3 and the 22-line header read
 * in the UNSW copy of the SP3-a description [V2]); W. Gurtner and M. Rothacher, IGEX mail 0042 (1998)
 * (SP3-b: identifiers A1,I2 for GPS and GLONASS, otherwise as SP3-a) [V2, summarised in the SP3-c
 * introduction]; S. Hilla, "The Extended Standard Product 3 Orbit Format (SP3-c)", NGS (2002, rev.
 * 2010): time system in columns 10-12 of the first `%c` line, `%f` bases, columns 61-80 of the
 * records (introduction read [V1], column details [M]); S. Hilla, "SP3-d" (2016): up to 999
 * satellites, unlimited comment lines of up to 80 characters (introduction read [V1]).
 *
 * SP3-a and SP3-b files carry no time system: their epochs are GPS time (the formats predate the
 * `%c` time-system field, whose columns they fill with `ccc`) [M]; the header says so with
 * `timeSystemAssumed: true`.
 *
 * Positions come out in metres, velocities in m/s, clocks in seconds and clock rates in s/s.
 * Bad or absent values (position 0.000000 in all three components, velocity likewise, clock
 * or clock rate 999999.999999) become `undefined`, never zero. Malformed input throws a
 * {@link ParseError}; a file without its `EOF` line, or with fewer epochs than its header
 * declares, is reported as truncated.
 *
 * Streaming: {@link readSp3} yields the header and then one epoch at a time, so memory is
 * bounded by one epoch (a few hundred satellites) whatever the file length.
 *
 * @module
 */
import type { ParseError } from '../errors.js';
import { requireOptions, requireSourceName } from '../internal/validate.js';
import type { Instant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import type { Vector3 } from '../units.js';
import { fileEpochInstant, readerTimeScales } from './epochs.js';
import {
  type EpochFields,
  linesOf,
  readLineBatches,
  requireTextLine,
  type TextLine,
  type TextSource,
} from './line-reader.js';
import { F14_6_LIMIT, type Line1, type Line2, Sp3FieldReader } from './sp3-fields.js';
import type { Sp3Epoch, Sp3Event, Sp3File, Sp3Header, Sp3ReadOptions, Sp3TimeSystem, Sp3Version } from './sp3-types.js';

export type {
  Sp3Epoch,
  Sp3Event,
  Sp3File,
  Sp3Header,
  Sp3ReadOptions,
  Sp3SatelliteRecord,
  Sp3TimeSystem,
  Sp3Version,
} from './sp3-types.js';

/** SP3 bad-clock marker 999999.999999 (µs, or 10⁻⁴ µs/s for rates) [M]: anything at or above 999999 is "bad". */
const BAD_CLOCK = 999999;

/** Header layout of SP3-a/b (Remondi 1989/1991 [V2]): 2 lines, then 5 `+ `, 5 `++`, 2 `%c`, 2 `%f`, 2 `%i`, 4 `/*` = 22 lines. */
const FIXED_HEADER: Readonly<Record<string, number>> = { '+ ': 5, '++': 5, '%c': 2, '%f': 2, '%i': 2, '/*': 4 };

interface MutableRecord {
  satellite: string;
  position: Vector3 | undefined;
  clock: number | undefined;
  velocity: Vector3 | undefined;
  clockRate: number | undefined;
  clockEvent: boolean;
  clockPredicted: boolean;
  maneuver: boolean;
  orbitPredicted: boolean;
  line: number;
}

/**
 * Incremental SP3 parser: feed lines with {@link Sp3Parser.push}, end with {@link Sp3Parser.finish}.
 * Most callers use {@link readSp3} or {@link parseSp3}.
 */
export class Sp3Parser {
  private readonly _source: string;
  private _stage: 'line1' | 'line2' | 'header' | 'body' | 'eof' = 'line1';
  private _lastLine = 0;
  private _line1: Line1 | undefined;
  private _line2: Line2 | undefined;
  /** The header, once the first epoch line has ended it. */
  private _header: Sp3Header | undefined;
  private _h: {
    version?: Sp3Version;
    satelliteCount?: number;
    satellites: string[];
    accuracy: number[];
    fileType?: string;
    timeSystem?: Sp3TimeSystem;
    positionBase?: number;
    clockBase?: number;
    comments: string[];
    percentC: number;
    timeSystemAssumed: boolean;
    /** Header lines seen per tag (`+ `, `++`, `%c`, `%f`, `%i`, `/*`), to check the fixed SP3-a/b layout. */
    tagCounts: Record<string, number>;
  } = { satellites: [], accuracy: [], comments: [], percentC: 0, timeSystemAssumed: false, tagCounts: {} };
  private _satelliteSet = new Set<string>();
  private _epoch:
    | { epoch: Instant; time: EpochFields; line: number; records: MutableRecord[]; seen: Set<string> }
    | undefined;
  private _epochsSeen = 0;
  private _lastEpoch: Instant | undefined;
  private readonly _ts: TimeScales;
  private readonly _f: Sp3FieldReader;

  constructor(options: Sp3ReadOptions = {}) {
    requireOptions('options', options);
    this._source =
      options.sourceName === undefined ? 'sp3' : requireSourceName('options.sourceName', options.sourceName);
    this._ts = readerTimeScales(options.timeScales);
    this._f = new Sp3FieldReader(this._source);
  }

  /** The instant of an epoch line's fields on the file's time system. @throws {ParseError} */
  private _instant(line: TextLine, fields: EpochFields, timeSystem: Sp3TimeSystem): Instant {
    return fileEpochInstant(this._ts, fields, timeSystem, {
      source: this._source,
      line: line.lineNumber,
      column: 4,
      text: line.text.slice(3, 31),
    });
  }

  private _error(line: TextLine, column: number | undefined, expected: string, found?: string): ParseError {
    return this._f.error(line, column, expected, found);
  }

  /** Feeds one line; returns the events it completed. @throws {ParseError} */
  push(line: TextLine): Sp3Event[] {
    requireTextLine(line);
    this._lastLine = line.lineNumber;
    const t = line.text;
    switch (this._stage) {
      case 'line1':
        this._line1 = this._f.line1(line);
        this._h.version = this._line1.version;
        this._stage = 'line2';
        return [];
      case 'line2':
        this._line2 = this._f.line2(line);
        this._stage = 'header';
        return [];
      case 'header':
        if (t.startsWith('*')) {
          const header = this._finishHeader(line);
          this._header = header;
          this._stage = 'body';
          this._startEpoch(line, header);
          return [{ kind: 'header', header }];
        }
        this._headerLine(line);
        return [];
      case 'body':
        return this._body(line);
      case 'eof':
        if (t.trim() !== '') throw this._error(line, 1, "nothing after the 'EOF' line", t);
        return [];
      default:
        return [];
    }
  }

  /** Ends the input. @throws {ParseError} when the file is truncated (no `EOF`, missing epochs). */
  finish(): Sp3Event[] {
    const at: TextLine = { text: '', lineNumber: this._lastLine + 1 };
    if (this._stage === 'line1')
      throw this._error(at, 1, "an SP3 first line starting with '#a', '#b', '#c' or '#d'", '');
    if (this._stage !== 'eof') {
      throw this._error(at, 1, "the closing 'EOF' line (the file ends early: truncated)", '');
    }
    return [];
  }

  private _headerLine(line: TextLine): void {
    const t = line.text;
    const tag = t.slice(0, 2);
    if (tag in FIXED_HEADER) this._h.tagCounts[tag] = (this._h.tagCounts[tag] ?? 0) + 1;
    if (tag === '+ ') {
      if (this._h.satelliteCount === undefined) {
        const n = this._f.int(line, 2, 6, 'number of satellites');
        const max = this._h.version === 'd' ? 999 : 85;
        if (n < 1 || n > max)
          throw this._error(line, 4, `a number of satellites in 1..${max} (SP3-${this._h.version})`, String(n));
        this._h.satelliteCount = n;
      }
      for (let k = 0; k < 17; k++) {
        const id = t.slice(9 + 3 * k, 12 + 3 * k);
        if (id.trim() === '' || /^ *0+$/.test(id) || /^[A-Z] *0+$/.test(id)) continue;
        const sat = this._f.satelliteId(line, id, 10 + 3 * k, this._h.version);
        if (this._h.satellites.length >= this._h.satelliteCount) {
          throw this._error(line, 10 + 3 * k, `no more than the ${this._h.satelliteCount} satellites declared`, id);
        }
        if (this._satelliteSet.has(sat)) throw this._error(line, 10 + 3 * k, 'each satellite listed once', sat);
        this._h.satellites.push(sat);
        this._satelliteSet.add(sat);
      }
      return;
    }
    if (tag === '++') {
      for (let k = 0; k < 17; k++) {
        const s = t.slice(9 + 3 * k, 12 + 3 * k);
        if (s.trim() === '') continue;
        if (!/^ *\d+$/.test(s)) throw this._error(line, 10 + 3 * k, 'an accuracy exponent (I3)', s);
        this._h.accuracy.push(Number(s));
      }
      return;
    }
    if (tag === '%c') {
      if (this._h.percentC === 0) Object.assign(this._h, this._f.timeSystemLine(line, this._h.version));
      this._h.percentC++;
      return;
    }
    if (tag === '%f') {
      if (this._h.positionBase === undefined) {
        const pb = t.slice(3, 13).trim();
        const cb = t.slice(14, 26).trim();
        if (pb !== '' && /^\d+\.?\d*$/.test(pb)) this._h.positionBase = Number(pb);
        if (cb !== '' && /^\d+\.?\d*$/.test(cb)) this._h.clockBase = Number(cb);
      }
      return;
    }
    if (tag === '%i') return;
    if (tag === '/*') {
      this._h.comments.push(t.slice(3).trimEnd());
      return;
    }
    throw this._error(
      line,
      1,
      "a header line starting with '+ ', '++', '%c', '%f', '%i', '/*' or the first epoch line '*  '",
      t.slice(0, 3),
    );
  }

  private _finishHeader(line: TextLine): Sp3Header {
    const h = this._h;
    const first = this._line1;
    const second = this._line2;
    // The stages read lines 1 and 2 before any header line.
    if (first === undefined || second === undefined)
      throw new Error('internal: SP3 header ended before lines 1 and 2 were read');
    if (h.satelliteCount === undefined)
      throw this._error(line, 1, "the satellite list ('+ ' lines) before the first epoch", line.text);
    if (h.satellites.length !== h.satelliteCount) {
      throw this._error(
        line,
        1,
        `${h.satelliteCount} satellite identifiers in the '+ ' lines (found ${h.satellites.length})`,
        line.text,
      );
    }
    if (h.timeSystem === undefined)
      throw this._error(line, 1, "a '%c' line giving the time system before the first epoch", line.text);
    if (h.version === 'a' || h.version === 'b') {
      // SP3-a/b headers have a fixed layout of 22 lines (Remondi 1989/1991 [V2]).
      for (const [tag, n] of Object.entries(FIXED_HEADER)) {
        const found = h.tagCounts[tag] ?? 0;
        if (found !== n) {
          throw this._error(
            line,
            1,
            `the fixed SP3-${h.version} header of 22 lines: ${n} '${tag}' lines (found ${found}) before the first epoch`,
            line.text.slice(0, 3),
          );
        }
      }
    }
    // The first epoch of line 1 is placed only now: the `%c` line names its time system.
    const firstInstant = this._instant(first.line, first.firstEpoch, h.timeSystem);
    const accuracyExponents: Record<string, number> = {};
    for (const [i, s] of h.satellites.entries()) {
      const exponent = h.accuracy[i];
      if (exponent !== undefined) accuracyExponents[s] = exponent;
    }
    return {
      sourceName: this._source,
      version: first.version,
      hasVelocities: first.hasVelocities,
      firstEpoch: first.firstEpoch,
      firstInstant,
      epochCount: first.epochCount,
      dataUsed: first.dataUsed,
      coordinateFrame: first.coordinateFrame,
      orbitType: first.orbitType,
      agency: first.agency,
      gpsWeek: second.gpsWeek,
      secondsOfWeek: second.secondsOfWeek,
      epochInterval: second.epochInterval,
      modifiedJulianDay: second.modifiedJulianDay,
      fractionalDay: second.fractionalDay,
      satellites: h.satellites,
      accuracyExponents,
      fileType: h.fileType ?? '',
      timeSystem: h.timeSystem,
      timeSystemAssumed: h.timeSystemAssumed,
      ...(h.positionBase !== undefined ? { positionBase: h.positionBase } : {}),
      ...(h.clockBase !== undefined ? { clockBase: h.clockBase } : {}),
      comments: h.comments,
      lineCount: line.lineNumber - 1,
    };
  }

  private _startEpoch(line: TextLine, header: Sp3Header): void {
    if (!line.text.startsWith('* '))
      throw this._error(line, 1, "an epoch line starting with '* '", line.text.slice(0, 2));
    const time = this._f.epochFields(line, 'epoch');
    const epoch = this._instant(line, time, header.timeSystem);
    if (this._lastEpoch !== undefined && !epoch.isAfter(this._lastEpoch))
      throw this._error(line, 4, 'epochs in increasing time order', line.text.slice(3, 31));
    this._epochsSeen++;
    if (this._epochsSeen > header.epochCount) {
      throw this._error(line, 1, `no more than the ${header.epochCount} epochs declared on line 1`, line.text);
    }
    this._lastEpoch = epoch;
    this._epoch = { epoch, time, line: line.lineNumber, records: [], seen: new Set() };
  }

  private _emitEpoch(): Sp3Event[] {
    const e = this._epoch;
    this._epoch = undefined;
    if (!e) return [];
    const missingSatellites =
      e.seen.size === this._h.satellites.length ? [] : this._h.satellites.filter((s) => !e.seen.has(s));
    return [
      { kind: 'epoch', epoch: { epoch: e.epoch, time: e.time, line: e.line, records: e.records, missingSatellites } },
    ];
  }

  private _body(line: TextLine): Sp3Event[] {
    const t = line.text;
    const header = this._header;
    // The body stage starts with the header finished.
    if (header === undefined) throw new Error('internal: SP3 body line before the header');
    if (t.startsWith('*')) {
      const events = this._emitEpoch();
      this._startEpoch(line, header);
      return events;
    }
    if (t.startsWith('EOF')) {
      const events = this._emitEpoch();
      if (this._epochsSeen !== header.epochCount) {
        throw this._error(
          line,
          1,
          `${header.epochCount} epochs as declared on line 1 (found ${this._epochsSeen}: truncated?)`,
          t,
        );
      }
      this._stage = 'eof';
      return events;
    }
    const epoch = this._epoch;
    // Every epoch line opens an epoch; none is open only after a refused epoch line.
    if (epoch === undefined) throw this._error(line, 1, "a valid epoch line '*  ' before this record", t.slice(0, 3));
    const legacy = this._h.version === 'a' || this._h.version === 'b';
    if (legacy && (t.startsWith('P') || t.startsWith('V')) && t.length > 60 && t.slice(60).trim() !== '') {
      const at = 61 + (t.slice(60).length - t.slice(60).trimStart().length);
      throw this._error(
        line,
        at,
        `nothing after column 60 (SP3-${this._h.version} records are 60 columns wide)`,
        t.slice(60).trim(),
      );
    }
    if (t.startsWith('P')) {
      const satellite = this._satellite(line);
      if (epoch.seen.has(satellite))
        throw this._error(line, 2, `one position record for ${satellite} per epoch`, satellite);
      epoch.seen.add(satellite);
      const x = this._f.required(line, 4, 18, 'x (km)', F14_6_LIMIT);
      const y = this._f.required(line, 18, 32, 'y (km)', F14_6_LIMIT);
      const z = this._f.required(line, 32, 46, 'z (km)', F14_6_LIMIT);
      const clk = this._f.real(line, 46, 60, 'clock (µs)', true, F14_6_LIMIT);
      const position: Vector3 | undefined = x === 0 && y === 0 && z === 0 ? undefined : [x * 1000, y * 1000, z * 1000];
      epoch.records.push({
        satellite,
        position,
        clock: clk === undefined || Math.abs(clk) >= BAD_CLOCK ? undefined : clk * 1e-6,
        velocity: undefined,
        clockRate: undefined,
        clockEvent: t.charAt(74) === 'E',
        clockPredicted: t.charAt(75) === 'P',
        maneuver: t.charAt(78) === 'M',
        orbitPredicted: t.charAt(79) === 'P',
        line: line.lineNumber,
      });
      return [];
    }
    if (t.startsWith('V')) {
      const satellite = this._satellite(line);
      const rec = epoch.records[epoch.records.length - 1];
      if (!rec || rec.satellite !== satellite) {
        throw this._error(
          line,
          2,
          `a velocity record right after the position record of the same satellite (${rec?.satellite ?? 'none'})`,
          satellite,
        );
      }
      if (rec.velocity !== undefined || rec.clockRate !== undefined)
        throw this._error(line, 1, `one velocity record for ${satellite} per epoch`, satellite);
      const vx = this._f.required(line, 4, 18, 'x velocity (dm/s)', F14_6_LIMIT);
      const vy = this._f.required(line, 18, 32, 'y velocity (dm/s)', F14_6_LIMIT);
      const vz = this._f.required(line, 32, 46, 'z velocity (dm/s)', F14_6_LIMIT);
      const rate = this._f.real(line, 46, 60, 'clock rate (10⁻⁴ µs/s)', true, F14_6_LIMIT);
      // dm/s → m/s; 10⁻⁴ µs/s → s/s (SP3-c §"Velocity record" [M]).
      rec.velocity = vx === 0 && vy === 0 && vz === 0 ? undefined : [vx * 0.1, vy * 0.1, vz * 0.1];
      rec.clockRate = rate === undefined || Math.abs(rate) >= BAD_CLOCK ? undefined : rate * 1e-10;
      return [];
    }
    if (!legacy && (t.startsWith('EP') || t.startsWith('EV'))) return [];
    if (t.trim() === '') return [];
    const kinds = legacy ? "'P', 'V'" : "'P', 'V', 'EP', 'EV'";
    throw this._error(
      line,
      1,
      `a record starting with ${kinds}, '*' or the line 'EOF' (SP3-${this._h.version})`,
      t.slice(0, 3),
    );
  }

  private _satellite(line: TextLine): string {
    const sat = this._f.satelliteId(line, line.text.slice(1, 4), 2, this._h.version);
    if (!this._satelliteSet.has(sat)) throw this._error(line, 2, 'a satellite listed in the header', sat);
    return sat;
  }
}

/**
 * Reads an SP3-a, -b, -c or -d file as a stream: the header first, then one event per epoch.
 *
 * @param source   File text or its chunks (sync or async iterable of strings).
 * @param options  `sourceName` for error messages.
 * @returns An async generator of {@link Sp3Event}.
 * @throws {ParseError} on malformed or truncated input (file, line, column, expected).
 * @see Remondi (1989/1991) SP3-a [V2]; Gurtner & Rothacher (1998) SP3-b [V2]; S. Hilla, The Extended Standard Product 3
 *   Orbit Format (SP3-c), NGS, 2002/2010 [V1 introduction, M columns]; SP3-d, 2016 [V1 introduction].
 */
export async function* readSp3(source: TextSource, options: Sp3ReadOptions = {}): AsyncGenerator<Sp3Event> {
  const parser = new Sp3Parser(options);
  // One asynchronous step per chunk, not per line (an event is yielded only when a line completes one).
  for await (const lines of readLineBatches(source, { sourceName: options.sourceName ?? 'sp3' })) {
    for (const line of lines) for (const event of parser.push(line)) yield event;
  }
  for (const event of parser.finish()) yield event;
}

/**
 * Reads a whole SP3 file held in memory (see {@link readSp3} for streaming).
 * @throws {ParseError} on malformed or truncated input.
 * @see SP3-a (1989/1991) [V2], SP3-b (1998) [V2], SP3-c (2002/2010), SP3-d (2016) [V1 introductions, M columns].
 */
export function parseSp3(source: string | Iterable<string>, options: Sp3ReadOptions = {}): Sp3File {
  const parser = new Sp3Parser(options);
  let header: Sp3Header | undefined;
  const epochs: Sp3Epoch[] = [];
  const take = (events: Sp3Event[]) => {
    for (const ev of events) {
      if (ev.kind === 'header') header = ev.header;
      else epochs.push(ev.epoch);
    }
  };
  for (const line of linesOf(source, { sourceName: options.sourceName ?? 'sp3' })) take(parser.push(line));
  take(parser.finish());
  // finish() refuses a file without its header and EOF line, so a header event has been seen.
  if (header === undefined) throw new Error('internal: SP3 parser finished without a header');
  return { header, epochs };
}
