/**
 * Records the navigation readers recognise but do not model: why each is skipped, and how many
 * lines it has, so that a record cut short is refused even when it is skipped.
 *
 * @module
 */
import type { RinexNavRecordType } from './rinex-nav-types.js';

/** System names by RINEX letter. */
export const SYSTEM_NAMES: Readonly<Record<string, string>> = {
  G: 'GPS',
  R: 'GLONASS',
  E: 'Galileo',
  C: 'BeiDou',
  J: 'QZSS',
  I: 'NavIC/IRNSS',
  S: 'SBAS',
};

/**
 * Minimum line counts of skipped version-3 records, by system: GLONASS and SBAS epoch + 3 orbit lines,
 * QZSS and NavIC epoch + 7 (RINEX 3.05 Tables A10, A12, A16, A18 [M]).
 */
export const MINIMUM_SKIPPED_LINES_V3: Readonly<Record<string, number>> = { R: 4, S: 4, J: 8, I: 8 };

/**
 * Lines of each RINEX 4.0x record after its `>` header line, by record type, system and message type
 * (RINEX 4.01 navigation record tables [M]; not re-opened while writing this table). EPH: GPS/QZSS LNAV 8,
 * CNAV 9, CNV2 10; Galileo INAV/FNAV 8; BeiDou D1/D2 8, CNV1/CNV2 10, CNV3 9; NavIC LNAV 8; GLONASS FDMA 5
 * (version 4 added a fourth orbit line); SBAS 4. STO 2, EOP 3. ION: Klobuchar (GPS/QZSS LNAV, BeiDou D1D2) 3,
 * NeQuick-G (Galileo IFNV) 2, BDGIM (BeiDou CNVX) 4. A record with fewer lines is a truncated record.
 */
const V4_RECORD_LINES: Readonly<Record<string, number>> = {
  'EPH G LNAV': 8,
  'EPH G CNAV': 9,
  'EPH G CNV2': 10,
  'EPH J LNAV': 8,
  'EPH J CNAV': 9,
  'EPH J CNV2': 10,
  'EPH E INAV': 8,
  'EPH E FNAV': 8,
  'EPH C D1': 8,
  'EPH C D2': 8,
  'EPH C CNV1': 10,
  'EPH C CNV2': 10,
  'EPH C CNV3': 9,
  'EPH I LNAV': 8,
  'EPH R FDMA': 5,
  'EPH S SBAS': 4,
  'ION G LNAV': 3,
  'ION J LNAV': 3,
  'ION C D1D2': 3,
  'ION E IFNV': 2,
  'ION C CNVX': 4,
};

/** Lines a RINEX 4 record needs after its `>` line, or `undefined` when its message type is not in the table. */
export function v4RecordLines(type: RinexNavRecordType, system: string, message: string): number | undefined {
  if (type === 'STO') return 2;
  if (type === 'EOP') return 3;
  return V4_RECORD_LINES[`${type} ${system} ${message}`];
}

/** The reason a recognised record is not modelled. */
export function skipReason(type: RinexNavRecordType, system: string, message: string | undefined): string {
  const name = SYSTEM_NAMES[system] ?? system;
  switch (type) {
    case 'STO':
      return `system time offset record (${name}${message ? ` ${message}` : ''}): not used for satellite clock corrections`;
    case 'EOP':
      return `Earth orientation parameter record (${name}${message ? ` ${message}` : ''}): not used for satellite clock corrections`;
    case 'ION':
      return `ionosphere model record (${name}${message ? ` ${message}` : ''}): not used for satellite clock corrections`;
    default:
      break;
  }
  if (system === 'R')
    return 'GLONASS ephemeris: a state-vector record (no Keplerian elements; relativistic term already in its clock data), not modelled';
  if (system === 'S') return 'SBAS ephemeris: a state-vector record, not modelled';
  if (system === 'J' || system === 'I') return `${name} ephemeris: system not modelled`;
  return `${name} ${message ?? ''} ephemeris: message type not modelled (modelled: GPS LNAV, Galileo INAV/FNAV, BeiDou D1/D2)`.replace(
    '  ',
    ' ',
  );
}
