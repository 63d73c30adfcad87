/**
 * Reader for SP3-c and SP3-d precise orbit files (the NGS/IGS "Extended Standard Product 3"
 * orbit format: S. Hilla, "The Extended Standard Product 3 Orbit Format (SP3-c)", 2002; and
 * "SP3-d", 2016 [M]).
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
import { ParseError } from '../errors.js';
import type { Seconds, Vector3 } from '../units.js';
import { requireOptions, requireSourceName } from '../internal/validate.js';
import {
  type EpochFields, type TextLine, type TextSource, linesOf, readLineBatches, requireTextLine, scaleSecondsFromFields, validEpochFields,
} from './line-reader.js';

/** SP3 time-system identifiers (SP3-c/d `%c` line, columns 10-12 [M]). */
export type Sp3TimeSystem = 'GPS' | 'GLO' | 'GAL' | 'TAI' | 'UTC' | 'BDT' | 'QZS' | 'IRN';

const TIME_SYSTEMS: readonly string[] = ['GPS', 'GLO', 'GAL', 'TAI', 'UTC', 'BDT', 'QZS', 'IRN'];

/** The header of an SP3 file. */
export interface Sp3Header {
  readonly sourceName: string;
  /** Format version letter. */
  readonly version: 'c' | 'd';
  /** Whether the file declares velocity records (`V` in column 3 of line 1). */
  readonly hasVelocities: boolean;
  /** First epoch, in the file's time system. */
  readonly firstEpoch: EpochFields;
  /** Number of epochs declared on line 1. */
  readonly epochCount: number;
  readonly dataUsed: string;
  /** Coordinate frame, e.g. `IGS20`, `ITRF2014`. */
  readonly coordinateFrame: string;
  /** Orbit type, e.g. `FIT`, `HLM`, `BCT`. */
  readonly orbitType: string;
  readonly agency: string;
  readonly gpsWeek: number;
  readonly secondsOfWeek: Seconds;
  /** Epoch interval, in seconds. */
  readonly epochInterval: Seconds;
  readonly modifiedJulianDay: number;
  readonly fractionalDay: number;
  /** Satellite identifiers in header order, e.g. `G01`. */
  readonly satellites: readonly string[];
  /** Orbit accuracy exponents by satellite (accuracy = 2^exp mm; 0 = unknown). */
  readonly accuracyExponents: Readonly<Record<string, number>>;
  /** File type from the first `%c` line (`G`, `M`, `R`, `E`, `C`, `J`, `L`). */
  readonly fileType: string;
  readonly timeSystem: Sp3TimeSystem;
  /** Floating-point bases for position/velocity and clock/rate standard deviations (`%f` line), when given. */
  readonly positionBase?: number;
  readonly clockBase?: number;
  readonly comments: readonly string[];
  readonly lineCount: number;
}

/** One satellite's data at one epoch. */
export interface Sp3SatelliteRecord {
  readonly satellite: string;
  /** Position, in metres, Earth-fixed frame of the file; `undefined` when bad/absent. */
  readonly position: Vector3 | undefined;
  /** Clock offset, in seconds; `undefined` when bad/absent. */
  readonly clock: Seconds | undefined;
  /** Velocity, in m/s; `undefined` when absent from the file or bad. */
  readonly velocity: Vector3 | undefined;
  /** Clock rate, in s/s; `undefined` when absent or bad. */
  readonly clockRate: number | undefined;
  readonly clockEvent: boolean;
  readonly clockPredicted: boolean;
  readonly maneuver: boolean;
  readonly orbitPredicted: boolean;
  /** Line of the position record. */
  readonly line: number;
}

/** One epoch block. */
export interface Sp3Epoch {
  /** Epoch, in the file's time system. */
  readonly time: EpochFields;
  /** Seconds since 1980-01-06T00:00:00 of the file's time scale (calendar count, no leap seconds). */
  readonly scaleSeconds: Seconds;
  readonly line: number;
  readonly records: readonly Sp3SatelliteRecord[];
}

/** One item of an SP3 file, in file order. */
export type Sp3Event =
  | { readonly kind: 'header'; readonly header: Sp3Header }
  | { readonly kind: 'epoch'; readonly epoch: Sp3Epoch };

/** Options of the SP3 readers. */
export interface Sp3ReadOptions {
  /** Name used in error messages (default `sp3`). */
  readonly sourceName?: string;
}

/** A whole SP3 file read into memory by {@link parseSp3}. */
export interface Sp3File {
  readonly header: Sp3Header;
  readonly epochs: readonly Sp3Epoch[];
}

/** SP3 bad-clock marker 999999.999999 (µs, or 10⁻⁴ µs/s for rates) [M]: anything at or above 999999 is "bad". */
const BAD_CLOCK = 999999;

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
  private _h: {
    version?: 'c' | 'd'; hasVelocities?: boolean; firstEpoch?: EpochFields; epochCount?: number; dataUsed?: string;
    coordinateFrame?: string; orbitType?: string; agency?: string; gpsWeek?: number; secondsOfWeek?: number;
    epochInterval?: number; modifiedJulianDay?: number; fractionalDay?: number; satelliteCount?: number;
    satellites: string[]; accuracy: number[]; fileType?: string; timeSystem?: Sp3TimeSystem; positionBase?: number;
    clockBase?: number; comments: string[]; percentC: number;
  } = { satellites: [], accuracy: [], comments: [], percentC: 0 };
  private _satelliteSet = new Set<string>();
  private _epoch: { time: EpochFields; scaleSeconds: number; line: number; records: MutableRecord[]; seen: Set<string> } | undefined;
  private _epochsSeen = 0;
  private _lastScaleSeconds = -Infinity;

  constructor(options: Sp3ReadOptions = {}) {
    requireOptions('options', options);
    this._source = options.sourceName === undefined ? 'sp3' : requireSourceName('options.sourceName', options.sourceName);
  }

  private _error(line: TextLine, column: number | undefined, expected: string, found?: string): ParseError {
    return new ParseError(this._source, line.lineNumber, column, expected, found);
  }

  /** Feeds one line; returns the events it completed. @throws {ParseError} */
  push(line: TextLine): Sp3Event[] {
    requireTextLine(line);
    this._lastLine = line.lineNumber;
    const t = line.text;
    switch (this._stage) {
      case 'line1': this._line1(line); this._stage = 'line2'; return [];
      case 'line2': this._line2(line); this._stage = 'header'; return [];
      case 'header':
        if (t.startsWith('*')) {
          const header = this._finishHeader(line);
          this._stage = 'body';
          this._startEpoch(line);
          return [{ kind: 'header', header }];
        }
        this._headerLine(line);
        return [];
      case 'body': return this._body(line);
      case 'eof':
        if (t.trim() !== '') throw this._error(line, 1, "nothing after the 'EOF' line", t);
        return [];
      default: return [];
    }
  }

  /** Ends the input. @throws {ParseError} when the file is truncated (no `EOF`, missing epochs). */
  finish(): Sp3Event[] {
    const at: TextLine = { text: '', lineNumber: this._lastLine + 1 };
    if (this._stage === 'line1') throw this._error(at, 1, "an SP3 first line starting with '#c' or '#d'", '');
    if (this._stage !== 'eof') {
      throw this._error(at, 1, "the closing 'EOF' line (the file ends early: truncated)", '');
    }
    return [];
  }

  private _int(line: TextLine, a: number, b: number, what: string): number {
    const s = line.text.slice(a, b);
    if (!/^\s*[+-]?\d+\s*$/.test(s)) throw this._error(line, a + 1, `${what} (an integer in columns ${a + 1}-${b})`, s);
    return Number(s);
  }

  private _real(line: TextLine, a: number, b: number, what: string, optional = false): number | undefined {
    const s = line.text.slice(a, b);
    const trimmed = s.trim();
    if (trimmed === '' && optional) return undefined;
    if (!/^[+-]?(\d+\.?\d*|\.\d+)([Ee][+-]?\d+)?$/.test(trimmed)) {
      throw this._error(line, a + 1, `${what} (a number in columns ${a + 1}-${b})`, s);
    }
    return Number(trimmed);
  }

  private _epochFields(line: TextLine, what: string): EpochFields {
    const f: EpochFields = {
      year: this._int(line, 3, 7, `${what} year`),
      month: this._int(line, 8, 10, `${what} month`),
      day: this._int(line, 11, 13, `${what} day`),
      hour: this._int(line, 14, 16, `${what} hour`),
      minute: this._int(line, 17, 19, `${what} minute`),
      second: this._real(line, 20, 31, `${what} second`)!,
    };
    if (!validEpochFields(f) || f.second >= 60) throw this._error(line, 4, `a valid calendar ${what}`, line.text.slice(3, 31));
    return f;
  }

  private _line1(line: TextLine): void {
    const t = line.text;
    if (t.charAt(0) !== '#' || t.charAt(1) === '#') throw this._error(line, 1, "an SP3 first line starting with '#c' or '#d'", t.slice(0, 2));
    const v = t.charAt(1);
    if (v !== 'c' && v !== 'd') throw this._error(line, 2, "SP3 version 'c' or 'd' in column 2 (versions a and b are not read)", v);
    const pv = t.charAt(2);
    if (pv !== 'P' && pv !== 'V') throw this._error(line, 3, "position/velocity flag 'P' or 'V' in column 3", pv);
    this._h.version = v;
    this._h.hasVelocities = pv === 'V';
    this._h.firstEpoch = this._epochFields(line, 'first epoch');
    const n = this._int(line, 32, 39, 'number of epochs');
    if (n < 1) throw this._error(line, 33, 'a positive number of epochs in columns 33-39', String(n));
    this._h.epochCount = n;
    this._h.dataUsed = t.slice(40, 45).trim();
    this._h.coordinateFrame = t.slice(46, 51).trim();
    this._h.orbitType = t.slice(52, 55).trim();
    this._h.agency = t.slice(56, 60).trim();
  }

  private _line2(line: TextLine): void {
    if (!line.text.startsWith('##')) throw this._error(line, 1, "the second header line starting with '##'", line.text.slice(0, 2));
    this._h.gpsWeek = this._int(line, 3, 7, 'GPS week');
    this._h.secondsOfWeek = this._real(line, 8, 23, 'seconds of week')!;
    const interval = this._real(line, 24, 38, 'epoch interval (s)')!;
    if (!(interval > 0)) throw this._error(line, 25, 'a positive epoch interval in seconds', String(interval));
    this._h.epochInterval = interval;
    this._h.modifiedJulianDay = this._int(line, 39, 44, 'modified Julian day');
    this._h.fractionalDay = this._real(line, 45, 60, 'fractional day')!;
  }

  private _headerLine(line: TextLine): void {
    const t = line.text;
    const tag = t.slice(0, 2);
    if (tag === '+ ') {
      if (this._h.satelliteCount === undefined) {
        const n = this._int(line, 2, 6, 'number of satellites');
        if (n < 1 || n > 999) throw this._error(line, 4, 'a number of satellites in 1..999', String(n));
        this._h.satelliteCount = n;
      }
      for (let k = 0; k < 17; k++) {
        const id = t.slice(9 + 3 * k, 12 + 3 * k);
        if (id.trim() === '' || /^ *0+$/.test(id) || /^[A-Z] *0+$/.test(id)) continue;
        if (!/^[A-Z][ \d]\d$/.test(id)) throw this._error(line, 10 + 3 * k, 'a satellite identifier such as G01', id);
        if (this._h.satellites.length >= this._h.satelliteCount) {
          throw this._error(line, 10 + 3 * k, `no more than the ${this._h.satelliteCount} satellites declared`, id);
        }
        const sat = `${id.charAt(0)}${id.slice(1).trim().padStart(2, '0')}`;
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
      if (this._h.percentC === 0) {
        this._h.fileType = t.slice(3, 5).trim();
        const ts = t.slice(9, 12);
        if (!TIME_SYSTEMS.includes(ts)) throw this._error(line, 10, `a time system (${TIME_SYSTEMS.join(', ')}) in columns 10-12`, ts);
        this._h.timeSystem = ts as Sp3TimeSystem;
      }
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
    throw this._error(line, 1, "a header line starting with '+ ', '++', '%c', '%f', '%i', '/*' or the first epoch line '*  '", t.slice(0, 3));
  }

  private _finishHeader(line: TextLine): Sp3Header {
    const h = this._h;
    if (h.satelliteCount === undefined) throw this._error(line, 1, "the satellite list ('+ ' lines) before the first epoch", line.text);
    if (h.satellites.length !== h.satelliteCount) {
      throw this._error(line, 1, `${h.satelliteCount} satellite identifiers in the '+ ' lines (found ${h.satellites.length})`, line.text);
    }
    if (h.timeSystem === undefined) throw this._error(line, 1, "a '%c' line giving the time system before the first epoch", line.text);
    const accuracyExponents: Record<string, number> = {};
    h.satellites.forEach((s, i) => { if (h.accuracy[i] !== undefined) accuracyExponents[s] = h.accuracy[i]!; });
    return {
      sourceName: this._source, version: h.version!, hasVelocities: h.hasVelocities!, firstEpoch: h.firstEpoch!,
      epochCount: h.epochCount!, dataUsed: h.dataUsed!, coordinateFrame: h.coordinateFrame!, orbitType: h.orbitType!,
      agency: h.agency!, gpsWeek: h.gpsWeek!, secondsOfWeek: h.secondsOfWeek!, epochInterval: h.epochInterval!,
      modifiedJulianDay: h.modifiedJulianDay!, fractionalDay: h.fractionalDay!, satellites: h.satellites,
      accuracyExponents, fileType: h.fileType ?? '', timeSystem: h.timeSystem,
      ...(h.positionBase !== undefined ? { positionBase: h.positionBase } : {}),
      ...(h.clockBase !== undefined ? { clockBase: h.clockBase } : {}),
      comments: h.comments, lineCount: line.lineNumber - 1,
    };
  }

  private _startEpoch(line: TextLine): void {
    if (!line.text.startsWith('* ')) throw this._error(line, 1, "an epoch line starting with '* '", line.text.slice(0, 2));
    const time = this._epochFields(line, 'epoch');
    const scaleSeconds = scaleSecondsFromFields(time);
    if (!(scaleSeconds > this._lastScaleSeconds)) throw this._error(line, 4, 'epochs in increasing time order', line.text.slice(3, 31));
    this._epochsSeen++;
    if (this._epochsSeen > this._h.epochCount!) {
      throw this._error(line, 1, `no more than the ${this._h.epochCount} epochs declared on line 1`, line.text);
    }
    this._lastScaleSeconds = scaleSeconds;
    this._epoch = { time, scaleSeconds, line: line.lineNumber, records: [], seen: new Set() };
  }

  private _emitEpoch(): Sp3Event[] {
    const e = this._epoch;
    this._epoch = undefined;
    if (!e) return [];
    return [{ kind: 'epoch', epoch: { time: e.time, scaleSeconds: e.scaleSeconds, line: e.line, records: e.records } }];
  }

  private _body(line: TextLine): Sp3Event[] {
    const t = line.text;
    if (t.startsWith('*')) {
      const events = this._emitEpoch();
      this._startEpoch(line);
      return events;
    }
    if (t.startsWith('EOF')) {
      const events = this._emitEpoch();
      if (this._epochsSeen !== this._h.epochCount) {
        throw this._error(line, 1, `${this._h.epochCount} epochs as declared on line 1 (found ${this._epochsSeen}: truncated?)`, t);
      }
      this._stage = 'eof';
      return events;
    }
    const epoch = this._epoch!;
    if (t.startsWith('P')) {
      const satellite = this._satellite(line);
      if (epoch.seen.has(satellite)) throw this._error(line, 2, `one position record for ${satellite} per epoch`, satellite);
      epoch.seen.add(satellite);
      const x = this._real(line, 4, 18, 'x (km)')!;
      const y = this._real(line, 18, 32, 'y (km)')!;
      const z = this._real(line, 32, 46, 'z (km)')!;
      const clk = this._real(line, 46, 60, 'clock (µs)', true);
      const position: Vector3 | undefined = x === 0 && y === 0 && z === 0 ? undefined : [x * 1000, y * 1000, z * 1000];
      epoch.records.push({
        satellite, position, clock: clk === undefined || Math.abs(clk) >= BAD_CLOCK ? undefined : clk * 1e-6,
        velocity: undefined, clockRate: undefined,
        clockEvent: t.charAt(74) === 'E', clockPredicted: t.charAt(75) === 'P', maneuver: t.charAt(78) === 'M',
        orbitPredicted: t.charAt(79) === 'P', line: line.lineNumber,
      });
      return [];
    }
    if (t.startsWith('V')) {
      const satellite = this._satellite(line);
      const rec = epoch.records[epoch.records.length - 1];
      if (!rec || rec.satellite !== satellite) {
        throw this._error(line, 2, `a velocity record right after the position record of the same satellite (${rec?.satellite ?? 'none'})`, satellite);
      }
      if (rec.velocity !== undefined || rec.clockRate !== undefined) throw this._error(line, 1, `one velocity record for ${satellite} per epoch`, satellite);
      const vx = this._real(line, 4, 18, 'x velocity (dm/s)')!;
      const vy = this._real(line, 18, 32, 'y velocity (dm/s)')!;
      const vz = this._real(line, 32, 46, 'z velocity (dm/s)')!;
      const rate = this._real(line, 46, 60, 'clock rate (10⁻⁴ µs/s)', true);
      // dm/s → m/s; 10⁻⁴ µs/s → s/s (SP3-c §"Velocity record" [M]).
      rec.velocity = vx === 0 && vy === 0 && vz === 0 ? undefined : [vx * 0.1, vy * 0.1, vz * 0.1];
      rec.clockRate = rate === undefined || Math.abs(rate) >= BAD_CLOCK ? undefined : rate * 1e-10;
      return [];
    }
    if (t.startsWith('EP') || t.startsWith('EV')) return [];
    if (t.trim() === '') return [];
    throw this._error(line, 1, "a record starting with 'P', 'V', 'EP', 'EV', '*' or the line 'EOF'", t.slice(0, 3));
  }

  private _satellite(line: TextLine): string {
    const id = line.text.slice(1, 4);
    if (!/^[A-Z][ \d]\d$/.test(id)) throw this._error(line, 2, 'a satellite identifier such as G01 in columns 2-4', id);
    const sat = `${id.charAt(0)}${id.slice(1).trim().padStart(2, '0')}`;
    if (!this._satelliteSet.has(sat)) throw this._error(line, 2, 'a satellite listed in the header', sat);
    return sat;
  }
}

/**
 * Reads an SP3-c / SP3-d file as a stream: the header first, then one event per epoch.
 *
 * @param source   File text or its chunks (sync or async iterable of strings).
 * @param options  `sourceName` for error messages.
 * @returns An async generator of {@link Sp3Event}.
 * @throws {ParseError} on malformed or truncated input (file, line, column, expected).
 * @see S. Hilla, The Extended Standard Product 3 Orbit Format (SP3-c), NGS, 2002; SP3-d, IGS, 2016 [M].
 */
export async function* readSp3(source: TextSource, options: Sp3ReadOptions = {}): AsyncGenerator<Sp3Event> {
  const parser = new Sp3Parser(options);
  // One asynchronous step per chunk, not per line (an event is yielded only when a line completes one).
  for await (const lines of readLineBatches(source)) {
    for (const line of lines) for (const event of parser.push(line)) yield event;
  }
  for (const event of parser.finish()) yield event;
}

/**
 * Reads a whole SP3 file held in memory (see {@link readSp3} for streaming).
 * @throws {ParseError} on malformed or truncated input.
 * @see SP3-c (2002), SP3-d (2016) [M].
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
  for (const line of linesOf(source)) take(parser.push(line));
  take(parser.finish());
  return { header: header!, epochs };
}
