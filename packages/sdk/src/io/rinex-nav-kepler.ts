/**
 * Decoding of one Keplerian navigation record (GPS LNAV, Galileo I/NAV and F/NAV, BeiDou D1/D2):
 * an epoch line with the clock polynomial and seven broadcast-orbit lines of four D19.12 fields.
 * Shared by the RINEX 2 and RINEX 3/4 readers, which differ only in where the fields start
 * ({@link KeplerLayout}); the field order of each system is data ({@link ORBIT_FIELDS}).
 *
 * @module
 */
import { OutOfDomainError, ParseError } from '../errors.js';
import { at } from '../internal/checked.js';
import type { KeplerianNavMessage, KeplerianSystem } from '../orbit/broadcast.js';
import { defaultFitIntervalSeconds, isBeidouGeostationary, SYSTEM_TIME_SCALE } from '../orbit/broadcast.js';
import type { Instant } from '../time/instant.js';
import { instantFromWeekSeconds, WEEK_EPOCH_MJD, weekSecondsFromInstant } from '../time/weeks.js';
import { fileEpochInstant, readerTimeScales } from './epochs.js';
import { type EpochFields, parseFortranReal, type TextLine } from './line-reader.js';
import type { RinexNavEphemeris } from './rinex-nav-types.js';

const SECONDS_PER_WEEK = 604_800;
/** The file time-system code of each system's own scale, on which its records' epochs are written. */
const SYSTEM_FILE_CODE: Readonly<Record<KeplerianSystem, string>> = { G: 'GPS', E: 'GAL', C: 'BDT' };
/**
 * GPS weeks before each system's week 0, from the time module's week-0 epochs: Galileo 1024 (1999-08-22), BeiDou
 * 1356 (2006-01-01; BDS-SIS-ICD §3.3 [M]). RINEX writes GPS and Galileo weeks in the GPS count, BeiDou in its own.
 */
const GPS_WEEKS_BEFORE: Readonly<Record<KeplerianSystem, number>> = {
  G: 0,
  E: (WEEK_EPOCH_MJD.GST - WEEK_EPOCH_MJD.GPS) / 7,
  C: (WEEK_EPOCH_MJD.BDT - WEEK_EPOCH_MJD.GPS) / 7,
};
/** Lines of a Keplerian record: epoch line + 7 broadcast-orbit lines (RINEX 2.11 Table A4 [V1]; RINEX 3.05 Tables A4, A8, A14 [M]). */
export const KEPLER_RECORD_LINES = 8;

/** Where the D19.12 fields of a record start (0-based columns) and how the orbit lines are indented. */
export interface KeplerLayout {
  /** First column of a_f0 on the epoch line: 22 in RINEX 2 (`I2,1X,I2.2,4(1X,I2),F5.1`), 23 in RINEX 3/4. */
  readonly epochFieldStart: number;
  /** First column of the first orbit field: 3 in RINEX 2 (`3X,4D19.12`), 4 in RINEX 3/4 (`4X,4D19.12`). */
  readonly orbitFieldStart: number;
  /** First column of the epoch t_oc on the epoch line: 3 in RINEX 2 (after `I2,1X`), 4 in RINEX 3/4 (after `A1,I2.2,1X`). */
  readonly epochStart: number;
}

/** RINEX 2.10/2.11 GPS navigation record layout (Table A4 [V1]). */
export const RINEX2_LAYOUT: KeplerLayout = { epochFieldStart: 22, orbitFieldStart: 3, epochStart: 3 };
/** RINEX 3.0x / 4.0x record layout (Tables A4, A8, A14 of 3.05 [M]). */
export const RINEX3_LAYOUT: KeplerLayout = { epochFieldStart: 23, orbitFieldStart: 4, epochStart: 4 };

/** Keys of the broadcast-orbit fields read into the record. */
type OrbitKey =
  | 'issueOfData'
  | 'crs'
  | 'deltaN'
  | 'm0'
  | 'cuc'
  | 'eccentricity'
  | 'cus'
  | 'sqrtA'
  | 'toe'
  | 'cic'
  | 'omega0'
  | 'cis'
  | 'i0'
  | 'crc'
  | 'argumentOfPerigee'
  | 'omegaDot'
  | 'idot'
  | 'field5b'
  | 'week'
  | 'accuracy'
  | 'health'
  | 'gd1'
  | 'gd2'
  | 'transmission'
  | 'field7b';

/** One broadcast-orbit field: orbit line (1–7), position on the line (0–3), key, label in messages, required. */
type OrbitField = readonly [line: number, slot: number, key: OrbitKey, label: string, required: boolean];

/** The fields every Keplerian layout shares (lines 1–4 and IDOT). */
function commonFields(issueOfData: string): OrbitField[] {
  return [
    [1, 0, 'issueOfData', issueOfData, true],
    [1, 1, 'crs', 'C_rs (m)', true],
    [1, 2, 'deltaN', 'Δn (rad/s)', true],
    [1, 3, 'm0', 'M0 (rad)', true],
    [2, 0, 'cuc', 'C_uc (rad)', true],
    [2, 1, 'eccentricity', 'eccentricity e', true],
    [2, 2, 'cus', 'C_us (rad)', true],
    [2, 3, 'sqrtA', 'sqrt(A) (√m)', true],
    [3, 0, 'toe', 't_oe (seconds of week)', true],
    [3, 1, 'cic', 'C_ic (rad)', true],
    [3, 2, 'omega0', 'Ω0 (rad)', true],
    [3, 3, 'cis', 'C_is (rad)', true],
    [4, 0, 'i0', 'i0 (rad)', true],
    [4, 1, 'crc', 'C_rc (m)', true],
    [4, 2, 'argumentOfPerigee', 'ω (rad)', true],
    [4, 3, 'omegaDot', 'Ω̇ (rad/s)', true],
    [5, 0, 'idot', 'IDOT (rad/s)', true],
  ];
}

/**
 * Field order of each system's record. GPS: RINEX 2.11 Table A4 [V1] (same in RINEX 3.05 Table A4 [M]):
 * line 5 IDOT, codes on L2, GPS week, L2 P flag; line 6 SV accuracy (m), health, TGD, IODC; line 7
 * transmission time, fit interval (hours, 0 if not known). Galileo: RINEX 3.05 Table A8 [M] (line 5
 * data sources, GAL week; line 6 SISA, health, BGD E5a/E1, BGD E5b/E1). BeiDou: Table A14 [M] (line 6
 * SatH1, TGD1, TGD2; line 7 AODC).
 */
export const ORBIT_FIELDS: Readonly<Record<KeplerianSystem, readonly OrbitField[]>> = {
  G: [
    ...commonFields('IODE'),
    [5, 1, 'field5b', 'spare / L2 codes', false],
    [5, 2, 'week', 'GPS week', true],
    [6, 0, 'accuracy', 'SV accuracy (m)', false],
    [6, 1, 'health', 'SV health', true],
    [6, 2, 'gd1', 'group delay (s)', false],
    [6, 3, 'gd2', 'group delay / IODC', false],
    [7, 0, 'transmission', 'transmission time of message (seconds of week)', false],
    [7, 1, 'field7b', 'fit interval (hours)', false],
  ],
  E: [
    ...commonFields('IODnav'),
    [5, 1, 'field5b', 'data sources', false],
    [5, 2, 'week', 'GAL week', true],
    [6, 0, 'accuracy', 'SV accuracy (m)', false],
    [6, 1, 'health', 'SV health', true],
    [6, 2, 'gd1', 'group delay (s)', false],
    [6, 3, 'gd2', 'group delay / IODC', false],
    [7, 0, 'transmission', 'transmission time of message (seconds of week)', false],
    [7, 1, 'field7b', 'spare / AODC', false],
  ],
  C: [
    ...commonFields('AODE'),
    [5, 1, 'field5b', 'spare / L2 codes', false],
    [5, 2, 'week', 'BDT week', true],
    [6, 0, 'accuracy', 'SV accuracy (m)', false],
    [6, 1, 'health', 'SatH1', true],
    [6, 2, 'gd1', 'group delay (s)', false],
    [6, 3, 'gd2', 'group delay / IODC', false],
    [7, 0, 'transmission', 'transmission time of message (seconds of week)', false],
    [7, 1, 'field7b', 'spare / AODC', false],
  ],
};

/** What a record's first line gave: satellite and t_oc (already parsed by the version's own epoch layout). */
export interface KeplerRecordStart {
  readonly satellite: string;
  readonly toc: EpochFields;
}

/**
 * Fields are right-aligned in D19.12 columns, so a line (trailing blanks removed) must end on a
 * field boundary. A line that ends inside a field was cut (a truncated file), and its last number
 * would be misread.
 * @throws {ParseError}
 */
export function checkFieldAlignment(source: string, line: TextLine, epochLine: boolean, layout: KeplerLayout): void {
  const start = epochLine ? layout.epochFieldStart : layout.orbitFieldStart;
  const length = line.text.trimEnd().length;
  if (length > start && (length - start) % 19 !== 0) {
    const end = start + 19 * Math.ceil((length - start) / 19);
    throw new ParseError(
      source,
      line.lineNumber,
      length + 1,
      `a complete D19.12 field ending at column ${end} (the line ends inside a field: truncated?)`,
      line.text.slice(end - 19),
    );
  }
}

/** Reads one D19.12 field at 0-based column `start`; `undefined` when blank and not required. @throws {ParseError} */
export function readD19(
  source: string,
  line: TextLine,
  start: number,
  name: string,
  required: boolean,
): number | undefined {
  const raw = line.text.slice(start, start + 19);
  const v = parseFortranReal(raw);
  if (v === undefined) {
    if (required)
      throw new ParseError(
        source,
        line.lineNumber,
        start + 1,
        `${name} (a real number, format D19.12, columns ${start + 1}-${start + 19})`,
        raw,
      );
    return undefined;
  }
  if (Number.isNaN(v))
    throw new ParseError(
      source,
      line.lineNumber,
      start + 1,
      `${name} as a Fortran real (e.g. -1.234567890123D-05)`,
      raw.trim(),
    );
  return v;
}

/**
 * Decodes a complete Keplerian record (8 lines, already counted) into SI fields, resolving the week
 * of t_oe and the transmission time against t_oc.
 * @throws {ParseError} naming line and column of the first bad field.
 */
export function decodeKeplerRecord(
  source: string,
  lines: readonly TextLine[],
  system: KeplerianSystem,
  v4Message: string | undefined,
  start: KeplerRecordStart,
  layout: KeplerLayout,
): RinexNavEphemeris {
  const l0 = at(lines, 0, 'record lines');
  const fail = (line: TextLine, column: number, expected: string, found: string) =>
    new ParseError(source, line.lineNumber, column, expected, found);
  const e0 = layout.epochFieldStart;
  const af0 = readD19(source, l0, e0, 'clock bias a_f0 (s)', true)!;
  const af1 = readD19(source, l0, e0 + 19, 'clock drift a_f1 (s/s)', true)!;
  const af2 = readD19(source, l0, e0 + 38, 'clock drift rate a_f2 (s/s²)', true)!;
  const indent = layout.orbitFieldStart;
  checkOrbitIndent(lines, indent, fail);
  const col = (slot: number) => indent + 19 * slot;
  const f: Partial<Record<OrbitKey, number>> = {};
  for (const [ln, slot, key, label, required] of ORBIT_FIELDS[system]) {
    const v = readD19(source, at(lines, ln, 'record lines'), col(slot), label, required);
    if (v !== undefined) f[key] = v;
  }
  const o = (k: number) => at(lines, k, 'record lines');
  const eccentricity = f.eccentricity!;
  const sqrtA = f.sqrtA!;
  const toe = f.toe!;
  const week = f.week!;
  if (eccentricity < 0 || eccentricity >= 1)
    throw fail(o(2), col(1) + 1, 'eccentricity in [0, 1)', String(eccentricity));
  if (!(sqrtA > 2500 && sqrtA < 1e5)) throw fail(o(2), col(3) + 1, 'sqrt(A) in (2500, 100000) √m', String(sqrtA));
  if (!(toe >= 0 && toe < SECONDS_PER_WEEK))
    throw fail(o(3), col(0) + 1, 't_oe in [0, 604800) seconds of week', String(toe));
  if (!Number.isInteger(week) || week < 0 || week > 100000)
    throw fail(o(5), col(2) + 1, 'a non-negative integer week number', String(week));

  const notes: string[] = [];
  const { message, dataSources } = messageOf(system, start.satellite, v4Message, f.field5b, notes, () =>
    fail(o(5), col(1) + 1, dataSourcesExpected(f.field5b), String(f.field5b ?? '')),
  );

  const failAt = (k: number, slot: number, expected: string, found: string) =>
    fail(o(k), col(slot) + 1, expected, found);
  const epochText = l0.text.slice(layout.epochStart, layout.epochFieldStart);
  const where = { source, line: l0.lineNumber, column: layout.epochStart + 1, text: epochText };
  const toc = fileEpochInstant(readerTimeScales(undefined), start.toc, SYSTEM_FILE_CODE[system], where);
  const failEpoch = (expected: string) => fail(l0, layout.epochStart + 1, expected, epochText.trim());
  const placed = resolveWeek(system, toc, week, toe, notes, { failAt, failEpoch });
  const transmission = transmissionTime(f.transmission, placed.weekStart, placed.toe);

  let fitIntervalSeconds = defaultFitIntervalSeconds();
  if (system === 'G') {
    if (f.field7b !== undefined && f.field7b > 0) fitIntervalSeconds = f.field7b * 3600;
    else notes.push('fit interval not given (0 or blank): 4 hours assumed (IS-GPS-200 §20.3.4.4 [M])');
  }

  const { groupDelays, issueOfDataClock } = groupDelaysOf(system, f);

  return {
    satellite: start.satellite,
    system,
    message,
    toc,
    toe: placed.toe,
    ...(transmission !== undefined ? { transmission } : {}),
    af0,
    af1,
    af2,
    issueOfData: f.issueOfData!,
    sqrtA,
    eccentricity,
    m0: f.m0!,
    deltaN: f.deltaN!,
    omega0: f.omega0!,
    i0: f.i0!,
    argumentOfPerigee: f.argumentOfPerigee!,
    omegaDot: f.omegaDot!,
    idot: f.idot!,
    cuc: f.cuc!,
    cus: f.cus!,
    cic: f.cic!,
    cis: f.cis!,
    crc: f.crc!,
    crs: f.crs!,
    health: f.health!,
    fitIntervalSeconds,
    tocAsWritten: start.toc,
    weekAsWritten: week,
    toeSecondsOfWeek: toe,
    ...(transmission !== undefined ? { transmissionSecondsOfWeek: f.transmission } : {}),
    ...(f.accuracy !== undefined ? { accuracy: f.accuracy } : {}),
    groupDelays,
    ...(dataSources !== undefined ? { dataSources } : {}),
    ...(issueOfDataClock !== undefined ? { issueOfDataClock } : {}),
    sourceName: source,
    line: l0.lineNumber,
    notes,
  };
}

/** Every broadcast-orbit line starts with `indent` blanks (format nX,4D19.12). @throws {ParseError} */
function checkOrbitIndent(
  lines: readonly TextLine[],
  indent: number,
  fail: (line: TextLine, column: number, expected: string, found: string) => ParseError,
): void {
  for (let k = 1; k < KEPLER_RECORD_LINES; k++) {
    const o = at(lines, k, 'record lines');
    if (o.text.slice(0, indent).trim() !== '') {
      throw fail(
        o,
        1,
        `${indent} blanks before broadcast orbit line ${k} (format ${indent}X,4D19.12)`,
        o.text.slice(0, indent),
      );
    }
  }
}

/** Raises a parse error at orbit line `k`, field slot `slot`. */
type FailAt = (k: number, slot: number, expected: string, found: string) => ParseError;

/** The parse errors of week resolution: at an orbit field, or at the epoch t_oc. */
interface WeekFailures {
  readonly failAt: FailAt;
  readonly failEpoch: (expected: string) => ParseError;
}

/** t_oc's week in the GPS week count and its seconds of week, read on the system's own scale. @throws {ParseError} */
function tocWeekReading(system: KeplerianSystem, toc: Instant, failEpoch: WeekFailures['failEpoch']) {
  const scale = SYSTEM_TIME_SCALE[system];
  try {
    const reading = weekSecondsFromInstant(toc, scale);
    return { week: reading.week + GPS_WEEKS_BEFORE[system], secondsOfWeek: reading.secondsOfWeek };
  } catch (error) {
    if (!(error instanceof OutOfDomainError)) throw error;
    throw failEpoch(`an epoch t_oc at or after the start of ${scale} week 0, ${error.validFrom})`);
  }
}

/**
 * The week of t_oe resolved against t_oc: t_oe and the start of its week as instants on the system's own
 * scale (the time module's week arithmetic); notes any rollover.
 * @throws {ParseError} for a week field inconsistent with t_oc, or t_oc/t_oe before the system's week 0.
 */
function resolveWeek(
  system: KeplerianSystem,
  toc: Instant,
  week: number,
  toe: number,
  notes: string[],
  { failAt, failEpoch }: WeekFailures,
): { toe: Instant; weekStart: Instant } {
  // Week resolution: the week whose t_oe lies nearest to t_oc (common practice, no source).
  const reading = tocWeekReading(system, toc, failEpoch);
  const tocWeek = reading.week;
  let bestWeek = tocWeek;
  for (const w of [tocWeek - 1, tocWeek + 1]) {
    const distance = (w - tocWeek) * SECONDS_PER_WEEK + toe - reading.secondsOfWeek;
    if (Math.abs(distance) < Math.abs((bestWeek - tocWeek) * SECONDS_PER_WEEK + toe - reading.secondsOfWeek))
      bestWeek = w;
  }
  const offset = system === 'C' ? GPS_WEEKS_BEFORE.C : 0;
  const diff = bestWeek - (week + offset);
  const weekName = system === 'C' ? 'BDT' : system === 'E' ? 'GAL' : 'GPS';
  const resolvedWritten = bestWeek - offset;
  if (diff !== 0) {
    const mod = ((diff % 1024) + 1024) % 1024;
    if (mod === 0) {
      notes.push(
        `week ${week} read as ${weekName} week ${resolvedWritten} (written modulo 1024: week-number rollover)`,
      );
    } else if (mod === 1 || mod === 1023) {
      const rolled = Math.abs(diff) > 1 ? ' after a modulo-1024 rollover correction' : '';
      notes.push(
        `t_oe lies in ${weekName} week ${resolvedWritten}, the week field says ${week}${rolled} (t_oe placed nearest to t_oc)`,
      );
    } else {
      throw failAt(
        5,
        2,
        `a ${weekName} week consistent with the epoch t_oc (${resolvedWritten}, or that modulo 1024)`,
        String(week),
      );
    }
  }
  const systemWeek = bestWeek - GPS_WEEKS_BEFORE[system];
  const scale = SYSTEM_TIME_SCALE[system];
  if (systemWeek < 0) throw failAt(3, 0, `t_oe at or after the start of ${scale} week 0`, String(toe));
  const weekStart = instantFromWeekSeconds(scale, systemWeek, 0);
  const toeInstant = instantFromWeekSeconds(scale, systemWeek, toe);
  if (Math.abs(toeInstant.secondsSince(toc)) > 0.5 * SECONDS_PER_WEEK)
    throw failAt(3, 0, 't_oe within half a week of t_oc', String(toe));
  return { toe: toeInstant, weekStart };
}

/**
 * The transmission time as an instant, or undefined when the field is blank or not a time of week (|t| ≥ 0.9e9 s).
 * Placed in the week nearest t_oe (RINEX 2.11 §6.8 and Table A4 note **: written reduced by 604800 s, i.e.
 * negative, when sent before the week of t_oe [V1]).
 */
function transmissionTime(transmission: number | undefined, weekStart: Instant, toe: Instant): Instant | undefined {
  if (transmission === undefined || !(Math.abs(transmission) < 0.9e9)) return undefined;
  const placed = weekStart.plus(transmission);
  const fromToe = placed.secondsSince(toe);
  if (fromToe > SECONDS_PER_WEEK / 2) return placed.plus(-SECONDS_PER_WEEK);
  if (fromToe < -SECONDS_PER_WEEK / 2) return placed.plus(SECONDS_PER_WEEK);
  return placed;
}

/** Group delays under their per-system names, and the clock issue of data where the system writes one. */
function groupDelaysOf(
  system: KeplerianSystem,
  f: Partial<Record<OrbitKey, number>>,
): { groupDelays: Record<string, number>; issueOfDataClock: number | undefined } {
  const groupDelays: Record<string, number> = {};
  let issueOfDataClock: number | undefined;
  const [firstName, secondName] =
    system === 'G' ? ['TGD', ''] : system === 'E' ? ['BGD_E5a_E1', 'BGD_E5b_E1'] : ['TGD1', 'TGD2'];
  if (f.gd1 !== undefined) groupDelays[firstName] = f.gd1;
  if (system === 'G') issueOfDataClock = f.gd2;
  else if (f.gd2 !== undefined) groupDelays[secondName] = f.gd2;
  if (system === 'C') issueOfDataClock = f.field7b;
  return { groupDelays, issueOfDataClock };
}

function dataSourcesExpected(ds: number | undefined): string {
  return ds === undefined || !Number.isInteger(ds) || ds < 0
    ? 'Galileo data-source bits (a non-negative integer)'
    : 'Galileo data-source bits naming either I/NAV (bits 0, 2, 9) or F/NAV (bits 1, 8) (RINEX 3.05 Galileo table [M])';
}

/** The message kind of a record (Galileo from its data-source bits or the version-4 header; BeiDou from the PRN). */
function messageOf(
  system: KeplerianSystem,
  satellite: string,
  v4Message: string | undefined,
  field5b: number | undefined,
  notes: string[],
  badBits: () => ParseError,
): { message: KeplerianNavMessage; dataSources?: number } {
  if (system === 'E') {
    const dataSources = field5b;
    if (dataSources === undefined || !Number.isInteger(dataSources) || dataSources < 0) throw badBits();
    const inav = (dataSources & 0b101) !== 0 || (dataSources & 512) !== 0;
    const fnav = (dataSources & 0b10) !== 0 || (dataSources & 256) !== 0;
    const fromBits: KeplerianNavMessage | undefined = inav && !fnav ? 'INAV' : fnav && !inav ? 'FNAV' : undefined;
    if (v4Message !== undefined) {
      const message = v4Message as KeplerianNavMessage;
      if (fromBits !== undefined && fromBits !== message)
        notes.push(
          `data-source bits ${dataSources} indicate ${fromBits}, the record header says ${message}; header used`,
        );
      return { message, dataSources };
    }
    if (fromBits === undefined) throw badBits();
    return { message: fromBits, dataSources };
  }
  if (system === 'C') {
    const geo = isBeidouGeostationary(satellite);
    if (v4Message === undefined) return { message: geo ? 'D2' : 'D1' };
    const message = v4Message as KeplerianNavMessage;
    if ((message === 'D2') !== geo)
      notes.push(
        `${message} record for a ${geo ? 'geostationary' : 'non-geostationary'} satellite; the ${geo ? 'GEO' : 'MEO/IGSO'} orbit algorithm is used (by PRN)`,
      );
    return { message };
  }
  return { message: 'LNAV' };
}
