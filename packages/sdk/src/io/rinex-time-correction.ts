/**
 * The reference time t_ref of a RINEX navigation header's time-system correction as an {@link Instant}, on the week
 * system its correction type names.
 *
 * Source: RINEX 3.04 / 3.05 format description, header record TIME SYSTEM CORR: "T: reference time for polynomial
 * (seconds into GPS/GAL/BDS/IRN week)", "W: reference week number (GPS/GAL/BDS/IRN week, continuous number)",
 * "T and W are zero for GLONASS" [M]; RINEX 2.11 Table A3 DELTA-UTC: A0,A1,T,W, W "continuous number since
 * 6-Jan-1980", i.e. a GPS week [V1].
 *
 * @module
 */

import type { Instant } from '../time/instant.js';
import { instantFromWeekSeconds, type WeekSystem } from '../time/weeks.js';

/**
 * The week system of t_ref for each correction type whose week the format pins down:
 * - `GPUT` (GPS → UTC; RINEX 2 DELTA-UTC is stored as GPUT): GPS week, GPS time.
 * - `QZGP`, `QZUT` (QZSS → GPS, → UTC): QZSS counts GPS weeks; placed on GPS time, as the readers place QZS epochs
 *   (ADR 13) [M].
 * - `BDUT` (BDS → UTC): BDT week, BDT (week 0 from 2006-01-01) [M].
 * Left out, so `reference` stays undefined (never guessed): `GAUT` and `GPGA` (RINEX numbers Galileo weeks
 * "aligned to GPS week" in records while the broadcast W0 is a GST week: which one a header holds is ambiguous),
 * `SBUT` (SBAS network time), `GLUT`/`GLGP` (T and W are zero for GLONASS), `IRUT`/`IRGP` (IRNSS time: the SDK
 * places no IRN epoch) and any other type.
 */
export const REFERENCE_WEEK_SYSTEM: Readonly<Record<string, WeekSystem>> = Object.freeze({
  GPUT: 'GPS',
  QZGP: 'GPS',
  QZUT: 'GPS',
  BDUT: 'BDT',
});

/**
 * t_ref = start of week W on the type's week system + T seconds (RINEX 3.05 TIME SYSTEM CORR [M]); undefined for a
 * type not in {@link REFERENCE_WEEK_SYSTEM}, or when W or T as written lie outside a week reading (W < 0,
 * T ∉ [0, 604800)): the fields as written stay on the correction.
 */
export function correctionReference(type: string, week: number, secondsOfWeek: number): Instant | undefined {
  const system = REFERENCE_WEEK_SYSTEM[type];
  if (system === undefined) return undefined;
  if (!(Number.isInteger(week) && week >= 0 && secondsOfWeek >= 0 && secondsOfWeek < 604_800)) return undefined;
  return instantFromWeekSeconds(system, week, secondsOfWeek);
}
