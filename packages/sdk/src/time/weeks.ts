/**
 * GNSS week numbers and seconds of week (GPS, Galileo, BeiDou), and the resolution of the
 * truncated week numbers that navigation messages broadcast. No leap-second table is needed:
 * the system times are TAI minus a constant.
 *
 * @module
 */

import { InvalidArgumentError, OutOfDomainError } from '../errors.js';
import { requireFinite, requireInteger } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import { isoDateOfMjd } from './calendar.js';
import { type Instant, requireInstant } from './instant.js';
import { addFloat, floorDivMod } from './split.js';
import { instantFromUniformOrTcgLabel, labelOnUniformOrTcg } from './uniform.js';

/** Scales that count weeks: GPS time, Galileo System Time, BeiDou Time. */
export type WeekSystem = 'GPS' | 'GST' | 'BDT';

/** Seconds in a week, 7 × 86400 (not re-exported: `orbit` exports the same constant). */
const SECONDS_PER_WEEK: Seconds = 604_800;

/**
 * MJD, on each system's own scale, of 00:00:00 starting week 0.
 * - GPS: 1980-01-06 (MJD 44244), when GPS time = UTC (IS-GPS-200 §3.3.4 [M]; common practice).
 * - GST: 1999-08-22 (MJD 51412) 00:00:00 GST, the start of GPS week 1024, so that GST week =
 *   GPS week − 1024 and the seconds of week agree (start epoch "00:00 UT on Sunday 22nd August
 *   1999", Galileo OS SIS ICD §5.1.2 as quoted [V2]; counting weeks on GST rather than UTC
 *   is common practice, no source).
 * - BDT: 2006-01-01 (MJD 53736) 00:00:00 BDT = 00:00:00 UTC, "GPS week 1356" (BDS ICD as quoted
 *   in secondary sources [V2]).
 */
export const WEEK_EPOCH_MJD: Readonly<Record<WeekSystem, number>> = Object.freeze({
  GPS: 44_244,
  GST: 51_412,
  BDT: 53_736,
});

/**
 * Week-number field widths of common navigation messages, in bits [M]: GPS LNAV 10 (rollover
 * every 1024 weeks, 1999-08-22 and 2019-04-07), GPS CNAV 13, Galileo I/NAV and F/NAV 12
 * (galileognss.eu quoting the OS SIS ICD: "12 bits counter" [V2]), BeiDou D1/D2 13.
 * Verify against the interface specification of the message you decode.
 */
export const BROADCAST_WEEK_BITS = Object.freeze({ gpsLnav: 10, gpsCnav: 13, galileo: 12, beidou: 13 } as const);

/** A reading on a week-counting scale. */
export interface WeekSeconds {
  /** Full (unambiguous) week number since the system's week 0, ≥ 0. */
  readonly week: number;
  /**
   * Seconds since the start of the week, in [0, 604800) s, as one double (resolution
   * ≈ 1.2e-10 s near the end of the week; use the two fields below for more).
   */
  readonly secondsOfWeek: Seconds;
  /** Whole seconds of the week, an integer in [0, 604799]. */
  readonly wholeSecondsOfWeek: number;
  /** Fraction of the current second, in [0, 1) s. */
  readonly fractionOfSecond: Seconds;
}

function requireWeekSystem(argument: string, system: unknown): WeekSystem {
  if (system !== 'GPS' && system !== 'GST' && system !== 'BDT') {
    throw new InvalidArgumentError(argument, system, "one of 'GPS', 'GST', 'BDT'");
  }
  return system;
}

/**
 * Week number and seconds of week of an instant on GPS, Galileo or BeiDou time.
 *
 *   reading = TAI + (system − TAI);  week = ⌊(reading − week-0 start)/604800⌋;  secondsOfWeek = remainder
 *
 * @param instant The moment.
 * @param system  `'GPS'`, `'GST'` or `'BDT'`.
 * @returns `{ week, secondsOfWeek, wholeSecondsOfWeek, fractionOfSecond }`; exact (no rounding
 *   beyond the double `secondsOfWeek` convenience field).
 * @throws {InvalidArgumentError} for an unknown system or a non-Instant.
 * @throws {OutOfDomainError} before the system's week 0.
 * @see {@link WEEK_EPOCH_MJD} for the week-0 epochs and their sources.
 */
export function weekSecondsFromInstant(instant: Instant, system: WeekSystem): WeekSeconds {
  requireInstant('instant', instant);
  requireWeekSystem('system', system);
  const label = labelOnUniformOrTcg(instant, system);
  const secondsSinceWeekZero = (label.day - WEEK_EPOCH_MJD[system]) * 86_400 + label.secondOfDay;
  if (secondsSinceWeekZero < 0) {
    throw new OutOfDomainError(
      'instant',
      instant.toString(),
      `${isoDateOfMjd(WEEK_EPOCH_MJD[system])}T00:00:00 ${system}`,
      'no limit',
      `${system} weeks are counted from that epoch`,
    );
  }
  const [week, wholeSecondsOfWeek] = floorDivMod(secondsSinceWeekZero, SECONDS_PER_WEEK);
  return Object.freeze({
    week,
    secondsOfWeek: wholeSecondsOfWeek + label.fraction,
    wholeSecondsOfWeek,
    fractionOfSecond: label.fraction,
  });
}

/**
 * The instant of a full week number and seconds of week on GPS, Galileo or BeiDou time
 * (inverse of {@link weekSecondsFromInstant}).
 *
 * @param system           `'GPS'`, `'GST'` or `'BDT'`.
 * @param week             Full week number (integer ≥ 0; resolve a broadcast week with {@link resolveBroadcastWeek} first).
 * @param secondsOfWeek    Seconds of week, in [0, 604800) s.
 * @param fractionOfSecond Optional extra seconds added to `secondsOfWeek` (for split input; |·| < 1 s), default 0.
 * @throws {InvalidArgumentError} naming the field: unknown system, negative or non-integer week,
 *   secondsOfWeek outside [0, 604800) or NaN.
 */
export function instantFromWeekSeconds(
  system: WeekSystem,
  week: number,
  secondsOfWeek: Seconds,
  fractionOfSecond: Seconds = 0,
): Instant {
  requireWeekSystem('system', system);
  requireInteger('week', week, 0, 1_000_000);
  const sow = requireFinite('secondsOfWeek', secondsOfWeek, 'a finite number of seconds in [0, 604800)');
  if (sow < 0 || sow >= SECONDS_PER_WEEK) {
    throw new InvalidArgumentError(
      'secondsOfWeek',
      secondsOfWeek,
      'in [0, 604800) s',
      sow >= SECONDS_PER_WEEK ? 'carry whole weeks into `week`' : undefined,
    );
  }
  const extra = requireFinite('fractionOfSecond', fractionOfSecond, 'a finite number of seconds in (−1, 1)');
  if (Math.abs(extra) >= 1)
    throw new InvalidArgumentError('fractionOfSecond', fractionOfSecond, 'a finite number of seconds in (−1, 1)');
  const reading = addFloat(week * SECONDS_PER_WEEK, 0, sow);
  const total = addFloat(reading.whole, reading.fraction, extra);
  const [days, secondOfDay] = floorDivMod(total.whole, 86_400);
  return instantFromUniformOrTcgLabel(system, WEEK_EPOCH_MJD[system] + days, secondOfDay, total.fraction);
}

/**
 * Resolves a truncated (broadcast) week number to the full week nearest a reference week.
 *
 *   full = the w ≥ 0 with w ≡ broadcastWeek (mod 2^bits) minimising |w − referenceWeek|
 *   (a tie, |w − ref| = 2^(bits−1), takes the later week)
 *
 * Correct when the reference is within half a rollover period of the truth (±512 weeks,
 * ≈ 9.8 years, for a 10-bit GPS LNAV week).
 *
 * @param broadcastWeek Week number as broadcast, an integer in [0, 2^bits).
 * @param bits          Width of the broadcast field in bits, integer 1..20 (see {@link BROADCAST_WEEK_BITS}).
 * @param referenceWeek Full week number believed close to the truth (e.g. from the receiver clock or file date), integer ≥ 0.
 * @returns The full week number.
 * @throws {InvalidArgumentError} naming the field for a non-integer or out-of-range value.
 */
export function resolveBroadcastWeek(broadcastWeek: number, bits: number, referenceWeek: number): number {
  requireInteger('bits', bits, 1, 20);
  const modulus = 2 ** bits;
  requireInteger('broadcastWeek', broadcastWeek, 0, modulus - 1);
  requireInteger('referenceWeek', referenceWeek, 0, 1_000_000);
  let delta = (((broadcastWeek - referenceWeek) % modulus) + modulus) % modulus;
  if (delta > modulus / 2) delta -= modulus;
  let full = referenceWeek + delta;
  if (full < 0) full += modulus;
  return full;
}

/**
 * {@link resolveBroadcastWeek} with the reference given as an instant (its full week on `system`).
 * @throws {InvalidArgumentError} as {@link resolveBroadcastWeek}, or for a non-Instant reference.
 * @throws {OutOfDomainError} if the reference is before the system's week 0.
 */
export function resolveBroadcastWeekNear(
  system: WeekSystem,
  broadcastWeek: number,
  bits: number,
  reference: Instant,
): number {
  return resolveBroadcastWeek(broadcastWeek, bits, weekSecondsFromInstant(reference, system).week);
}
