/**
 * Time scales that need no leap-second table: TAI, TT, the GNSS system times (GPS, Galileo,
 * BeiDou) and TCG. Each reading is TAI plus a fixed offset (TCG: plus a fixed rate).
 *
 * A *label* is the reading of a scale as (MJD day on that scale, whole seconds of day,
 * fraction of second); the calendar, ISO 8601 text, MJD/JD and week counts are all built
 * from labels.
 *
 * @module
 */

import { L_G, TT_MINUS_TAI } from '../constants.js';
import type { Dimensionless, Seconds } from '../units.js';
import { INSTANT_EPOCH_MJD, Instant } from './instant.js';
import { addFloat, floorDivMod, normalize } from './split.js';

/**
 * The time scales the SDK converts between.
 * - `TAI`: International Atomic Time.
 * - `TT`: Terrestrial Time, TAI + 32.184 s.
 * - `UTC`: Coordinated Universal Time, TAI − (leap-second table value); needs a table.
 * - `GPS`: GPS system time, TAI − 19 s.
 * - `GST`: Galileo System Time, aligned to GPS time: TAI − 19 s.
 * - `BDT`: BeiDou Time, TAI − 33 s.
 * - `TCG`: Geocentric Coordinate Time, TT + L_G/(1 − L_G)·(TT − T₀).
 *
 * The GNSS scales here are the nominal (defining) offsets; the few-nanosecond realisation
 * differences between system times (e.g. the GPS–Galileo offset broadcast by the satellites)
 * are data, not part of these conversions.
 */
export type TimeScale = 'TAI' | 'TT' | 'UTC' | 'GPS' | 'GST' | 'BDT' | 'TCG';

/** Every {@link TimeScale}, in a stable order. */
export const TIME_SCALES: readonly TimeScale[] = Object.freeze([
  'TAI',
  'TT',
  'UTC',
  'GPS',
  'GST',
  'BDT',
  'TCG',
] as const);

/** The scales that differ from TAI by a constant. */
export type UniformScale = 'TAI' | 'TT' | 'GPS' | 'GST' | 'BDT';

/**
 * GPS time − TAI = −19 s, exact by construction: GPS time equalled UTC at 1980-01-06T00:00:00
 * UTC, when TAI − UTC was 19 s (BIPM, Lewandowski & Arias, "GPS time is 19 seconds behind TAI" [V2];
 * TAI − UTC = 19 s from 1980-01-01, IERS leap-second list [V2]).
 */
export const GPS_MINUS_TAI: Seconds = -19;

/**
 * Galileo System Time − TAI = −19 s, the same whole-second offset as GPS time. Galileo OS SIS
 * ICD §5.1.2, as quoted: "At the start epoch, GST shall be ahead of UTC by thirteen (13) leap
 * seconds" [V2]; at that epoch (1999-08-22) TAI − UTC was 32 s (IERS list [V2]), so
 * GST − TAI = 13 − 32 = −19 s [C].
 */
export const GST_MINUS_TAI: Seconds = -19;

/**
 * BeiDou Time − TAI = −33 s: BDT equalled UTC at 2006-01-01T00:00:00 UTC (BDS ICD as quoted in
 * secondary sources [V2]), when TAI − UTC was 33 s (IERS leap-second list [V2]).
 */
export const BDT_MINUS_TAI: Seconds = -33;

/** L_G/(1 − L_G), the rate of TCG relative to TT (IERS Conventions 2010 §10.1 [V1]) [C]. */
export const TCG_RATE_VS_TT: Dimensionless = L_G / (1 - L_G);

/**
 * MJD (on TAI) of T₀ = 1977-01-01T00:00:00 TAI, where TCG = TT = TAI + 32.184 s;
 * JD_TT(T₀) = 2443144.5003725 (IERS Conventions 2010 §10.1 [V1]).
 */
export const TCG_EPOCH_MJD_TAI = 43_144;

/** Constant offsets as exact whole + decimal parts (32.184 is not a binary fraction, so keep 32 + 0.184). */
const UNIFORM_OFFSET: Readonly<Record<UniformScale, readonly [number, number]>> = {
  TAI: [0, 0],
  TT: [Math.trunc(TT_MINUS_TAI), 0.184],
  GPS: [GPS_MINUS_TAI, 0],
  GST: [GST_MINUS_TAI, 0],
  BDT: [BDT_MINUS_TAI, 0],
};

/** TAI seconds (since the SDK epoch) of T₀ = 1977-01-01T00:00:00 TAI. */
const TCG_EPOCH_TAI_SECONDS = (TCG_EPOCH_MJD_TAI - INSTANT_EPOCH_MJD) * 86_400;

/** Reading of a scale: MJD day (on that scale), whole seconds of day, fraction of second. @internal */
export interface Label {
  readonly day: number;
  readonly secondOfDay: number;
  readonly fraction: number;
}

/** True for the scales with a constant offset from TAI. @internal */
export function isUniformScale(scale: TimeScale): scale is UniformScale {
  return scale !== 'UTC' && scale !== 'TCG';
}

/** Reading − TAI, in seconds, of a uniform scale. @internal */
export function uniformMinusTai(scale: UniformScale): Seconds {
  return scale === 'TT' ? TT_MINUS_TAI : UNIFORM_OFFSET[scale][0];
}

/**
 * TCG − TT at an instant, in seconds: (L_G/(1 − L_G))·(JD_TT − T₀)·86400, where
 * (JD_TT − T₀)·86400 equals the TAI seconds elapsed since 1977-01-01T00:00:00 TAI because
 * TT − TAI is constant (IERS Conventions 2010 §10.1 text [V1]; the equation number 10.1 is from memory [M]).
 * @internal
 */
export function tcgMinusTtAt(instant: Instant): Seconds {
  const sinceT0 = instant.taiSeconds - TCG_EPOCH_TAI_SECONDS + instant.taiFraction;
  return TCG_RATE_VS_TT * sinceT0;
}

/** Splits a reading in seconds since the scale's 2000-01-01T00:00:00 into a label. @internal */
export function labelFromReading(whole: number, fraction: number): Label {
  const [days, secondOfDay] = floorDivMod(whole, 86_400);
  return { day: days + INSTANT_EPOCH_MJD, secondOfDay, fraction };
}

/** Label of an instant on a uniform scale or TCG. @internal */
export function labelOnUniformOrTcg(instant: Instant, scale: Exclude<TimeScale, 'UTC'>): Label {
  if (scale === 'TCG') {
    const tt = addFloat(instant.taiSeconds + 32, instant.taiFraction + 0.184, 0);
    const reading = addFloat(tt.whole, tt.fraction, tcgMinusTtAt(instant));
    return labelFromReading(reading.whole, reading.fraction);
  }
  const [whole, fraction] = UNIFORM_OFFSET[scale];
  const reading = normalize(instant.taiSeconds + whole, instant.taiFraction + fraction);
  return labelFromReading(reading.whole, reading.fraction);
}

/**
 * Instant of a label on a uniform scale or TCG. TCG → TT uses the exact inverse
 * TT = TCG − L_G·(JD_TCG − T₀)·86400 (IERS Conventions 2010 §10.1 text [V1]; the equation number 10.2 is from memory [M]).
 * @internal
 */
export function instantFromUniformOrTcgLabel(
  scale: Exclude<TimeScale, 'UTC'>,
  day: number,
  secondOfDay: number,
  fraction: number,
): Instant {
  const readingWhole = (day - INSTANT_EPOCH_MJD) * 86_400 + secondOfDay;
  if (scale === 'TCG') {
    // TCG reading of T₀ is its TT reading (TCG = TT there): T₀ + 32.184 s.
    const sinceT0 = readingWhole - TCG_EPOCH_TAI_SECONDS - 32 + (fraction - 0.184);
    const tt = addFloat(readingWhole, fraction, -L_G * sinceT0);
    const tai = normalize(tt.whole - 32, tt.fraction - 0.184);
    return Instant.fromNormalized(tai.whole, tai.fraction);
  }
  const [whole, frac] = UNIFORM_OFFSET[scale];
  const tai = normalize(readingWhole - whole, fraction - frac);
  return Instant.fromNormalized(tai.whole, tai.fraction);
}
