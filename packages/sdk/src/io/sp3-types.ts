/**
 * Types of the SP3 reader (`sp3.ts`): header, epoch, record and event shapes, SI units at the boundary.
 *
 * @module
 */

import type { Instant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import type { Seconds, Vector3 } from '../units.js';
import type { EpochFields } from './line-reader.js';

/** SP3 time-system identifiers (SP3-c/d `%c` line, columns 10-12 [M]). */
export type Sp3TimeSystem = 'GPS' | 'GLO' | 'GAL' | 'TAI' | 'UTC' | 'BDT' | 'QZS' | 'IRN';

/** SP3 format version letters read. */
export type Sp3Version = 'a' | 'b' | 'c' | 'd';

/** The header of an SP3 file. */
export interface Sp3Header {
  readonly sourceName: string;
  /** Format version letter. */
  readonly version: Sp3Version;
  /** Whether the file declares velocity records (`V` in column 3 of line 1). */
  readonly hasVelocities: boolean;
  /** First epoch as written on line 1 (calendar fields in the file's time system). */
  readonly firstEpoch: EpochFields;
  /** The first epoch as an absolute instant (the line-1 fields read on {@link Sp3Header.timeSystem}). */
  readonly firstInstant: Instant;
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
  /**
   * True when the file states no time system and GPS time is assumed: SP3-a/b files, whose `%c`
   * time-system columns are the placeholder `ccc` (GPS time by definition of those versions [M]).
   */
  readonly timeSystemAssumed: boolean;
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
  /** The epoch as an absolute instant: the epoch line's fields read on the file's time system, exact. */
  readonly epoch: Instant;
  /** The epoch line's calendar fields as written (file's time system), for messages. */
  readonly time: EpochFields;
  readonly line: number;
  readonly records: readonly Sp3SatelliteRecord[];
  /**
   * Satellites listed in the header that have no position record at this epoch, in header order.
   * Empty when every listed satellite has one. (A listed satellite without a record is a data gap,
   * reported here rather than skipped.)
   */
  readonly missingSatellites: readonly string[];
}

/** One item of an SP3 file, in file order. */
export type Sp3Event =
  | { readonly kind: 'header'; readonly header: Sp3Header }
  | { readonly kind: 'epoch'; readonly epoch: Sp3Epoch };

/** Options of the SP3 readers. */
export interface Sp3ReadOptions {
  /** Name used in error messages (default `sp3`). */
  readonly sourceName?: string;
  /** Leap-second table for UTC and GLONASS-time files (default: the bundled table, valid until 2027-06-28). */
  readonly timeScales?: TimeScales;
}

/** A whole SP3 file read into memory by {@link parseSp3}. */
export interface Sp3File {
  readonly header: Sp3Header;
  readonly epochs: readonly Sp3Epoch[];
}
