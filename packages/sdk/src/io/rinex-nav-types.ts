/**
 * Types of the RINEX navigation readers (`readRinexNav`, `parseRinexNav`), shared by the version-2
 * and version-3/4 record layouts.
 *
 * @module
 */

import type { KeplerianBroadcastEphemeris } from '../orbit/broadcast.js';
import type { Instant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import type { EpochFields } from './line-reader.js';

/** One-letter system codes of RINEX 3/4 (G GPS, R GLONASS, E Galileo, C BeiDou, J QZSS, I NavIC, S SBAS). */
export type RinexSystemCode = 'G' | 'R' | 'E' | 'C' | 'J' | 'I' | 'S';

/** Record kinds of RINEX 4 navigation files (version 2 and 3 files hold only ephemerides). */
export type RinexNavRecordType = 'EPH' | 'STO' | 'EOP' | 'ION';

/** Leap-second header information (RINEX 2.11 Table A3 `LEAP SECONDS` I6 [V1]; RINEX 3.05 / 4.01 adds the future fields [M]). */
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

/**
 * Broadcast ionosphere parameters of the header, as written. RINEX 2 `ION ALPHA` / `ION BETA`
 * (Table A3, 2X,4D12.4 [V1]) are stored as the RINEX 3 types `GPSA` / `GPSB`; RINEX 3 `IONOSPHERIC CORR`
 * lines (A4,1X,4D12.4 [M]) keep their own type (`GPSA`, `GPSB`, `GAL`, `QZSA`, `BDSA`, ...).
 */
export interface RinexIonosphereParameters {
  /** `GPSA`, `GPSB`, `GAL`, `QZSA`, `QZSB`, `BDSA`, `BDSB`, `IRNA`, `IRNB`, ... */
  readonly type: string;
  /**
   * The parameters as broadcast, not converted: GPS/QZSS/BeiDou Klobuchar α0..α3 in s, s/semicircle,
   * s/semicircle², s/semicircle³ and β0..β3 in s, s/semicircle, ... (1 semicircle = π rad); Galileo
   * a_i0..a_i2 in sfu, sfu/degree, sfu/degree². A blank field is `null` (missing, never zero).
   */
  readonly parametersBroadcastUnits: readonly (number | null)[];
  /** 1-based header line. */
  readonly line: number;
}

/**
 * A time-system correction of the header: CORR(t) = a0 + a1·(t − t_ref). RINEX 2 `DELTA-UTC: A0,A1,T,W`
 * (Table A3, 3X,2D19.12,2I9 [V1]) is stored as type `GPUT`; RINEX 3 `TIME SYSTEM CORR`
 * (A4,1X,D17.10,D16.9,I7,I5 [M]) keeps its own type (`GPUT`, `GAUT`, `GPGA`, `BDUT`, ...).
 */
export interface RinexTimeSystemCorrection {
  readonly type: string;
  /** a0, in seconds. */
  readonly a0: Seconds;
  /** a1, in s/s. */
  readonly a1: number;
  /** Reference time t_ref, in seconds of the reference week. */
  readonly referenceSecondsOfWeek: Seconds;
  /** Reference week number as written (RINEX 2: continuous GPS week, not modulo 1024 [V1]). */
  readonly referenceWeek: number;
  /**
   * t_ref as an instant: week `referenceWeek`, `referenceSecondsOfWeek` s, on the week system the `type` names
   * (GPUT, QZGP, QZUT → GPS week on GPS time; BDUT → BDT week on BDT; RINEX 3.05 TIME SYSTEM CORR [M]). Undefined
   * where the format leaves the week system ambiguous or empty (GAUT, GPGA, SBUT, GLONASS and IRNSS types, any
   * other) or the fields lie outside a week reading: never guessed. See `REFERENCE_WEEK_SYSTEM` in
   * `io/rinex-time-correction.ts`.
   */
  readonly reference?: Instant;
  /** 1-based header line. */
  readonly line: number;
}

/** The header of a RINEX navigation file. */
export interface RinexNavHeader {
  readonly sourceName: string;
  /** Format version, e.g. 2.11, 3.05 or 4.01. */
  readonly version: number;
  /**
   * Satellite system of the file (`M` mixed, or one system code). Version 2 files name it by file type:
   * `N` → `G` (GPS), `G` → `R` (GLONASS), `H` → `S` (geostationary payloads).
   */
  readonly satelliteSystem: string;
  /** Version-2 file type letter (`N` GPS, `G` GLONASS, `H` GEO) as written in column 21; `N` for versions 3 and 4. */
  readonly fileType: string;
  readonly programName?: string;
  readonly runBy?: string;
  readonly creationDate?: string;
  readonly leapSeconds?: RinexLeapSeconds;
  /** Ionosphere parameters, in header order (empty when none). */
  readonly ionosphere: readonly RinexIonosphereParameters[];
  /** Time-system corrections (e.g. GPS → UTC), in header order (empty when none). */
  readonly timeSystemCorrections: readonly RinexTimeSystemCorrection[];
  readonly comments: readonly string[];
  /** Other header lines, by label, kept verbatim (columns 1–60). */
  readonly otherLines: readonly { readonly label: string; readonly text: string; readonly line: number }[];
  /** Number of header lines, including `END OF HEADER`. */
  readonly lineCount: number;
}

/**
 * A modelled ephemeris record as read, with the raw fields that the computation does not need. The absolute
 * epochs `toc`, `toe` and `transmission` are `Instant`s placed on the system's own scale (GPST, GST, BDT)
 * by the time module; the broadcast week and seconds-of-week fields stay beside them as written.
 */
export interface RinexNavEphemeris extends KeplerianBroadcastEphemeris {
  /** Clock reference epoch t_oc as written (a RINEX 2 two-digit year already expanded), a reading of the system's own scale. */
  readonly tocAsWritten: EpochFields;
  /** Week number as written in the record (GPS, Galileo-aligned-to-GPS or BDT week). */
  readonly weekAsWritten: number;
  /** t_oe as written, in seconds of week. */
  readonly toeSecondsOfWeek: Seconds;
  /**
   * Transmission time of message as written, in seconds of week, when given (negative when sent in the week
   * before t_oe's, as the format allows; `transmission` places it, see `transmissionTime` in rinex-nav-kepler.ts).
   */
  readonly transmissionSecondsOfWeek?: Seconds;
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

/** A whole navigation file read into memory by `parseRinexNav`. */
export interface RinexNavFile {
  readonly header: RinexNavHeader;
  readonly ephemerides: readonly RinexNavEphemeris[];
  readonly skipped: readonly SkippedNavRecord[];
}
