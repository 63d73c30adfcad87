/**
 * Earth rotation angle (ERA) for turning inertial positions into Earth-fixed ones, with UT1 taken
 * as UTC.
 *
 * Neglected, and why it is enough for pass planning: UT1 − UTC (kept within ±0.9 s by the IERS
 * leap-second rule [M]) shifts every pass time by the same < 0.9 s; the change of the length of day
 * over a horizon (a few ms per day [M]) is ignored by advancing ERA at its nominal rate in SI seconds;
 * polar motion (< 0.5″ [M], ~15 m at the surface) is ignored. The inertial frame of the orbit is the
 * one ERA refers to (the Celestial Intermediate Reference System, equator and origin of date); elements
 * given in a J2000 frame would also need precession–nutation (≈ 0.37° of precession in 2027 [M],
 * i.e. pass times shifted by up to ~90 s), which this module does not apply.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { type Instant, requireInstant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import type { Radians, RadiansPerSecond } from '../units.js';

const TWO_PI = 2 * Math.PI;

/** Turns of ERA per UT1 day beyond one: 1.00273781191135448 − 1 (IERS Conventions 2010 eq. 5.15 [M]). */
const ERA_EXTRA_TURNS_PER_DAY = 0.00273781191135448;
/** ERA at J2000.0 (JD 2451545.0 UT1), in turns (IERS Conventions 2010 eq. 5.15 [M]). */
const ERA_AT_J2000_TURNS = 0.779057273264;

/**
 * Rate of the Earth rotation angle, in rad per SI second: 2π·1.00273781191135448/86400
 * (IERS Conventions 2010 eq. 5.15 [M]).
 */
export const EARTH_ROTATION_ANGLE_RATE: RadiansPerSecond = (TWO_PI * 1.00273781191135448) / 86_400;

/** Throws unless `value` looks like a TimeScales object (the methods this module calls). */
export function requireTimeScales(argument: string, value: unknown): TimeScales {
  const ts = value as Partial<TimeScales> | null;
  if (typeof ts !== 'object' || ts === null || typeof ts.toJd !== 'function' || typeof ts.parseIso !== 'function') {
    throw new InvalidArgumentError(argument, value, 'a TimeScales object from createTimeScales(table)');
  }
  return value as TimeScales;
}

/**
 * Earth rotation angle at an instant, with UT1 taken as UTC (see the module note on the ≤ 0.9 s neglect).
 *
 *   θ(Tu) = 2π (0.7790572732640 + 1.00273781191135448 Tu),  Tu = JD(UT1) − 2451545.0
 *
 * evaluated from the split Julian Date so that whole days drop out exactly.
 *
 * @param instant     The moment.
 * @param timeScales  Time scales holding the leap-second table (UTC must be defined at `instant`).
 * @returns θ in radians, in [0, 2π).
 * @throws {InvalidArgumentError} for a non-Instant or bad timeScales; {@link OutOfDomainError} outside the table.
 * @see IERS Conventions (2010), IERS Technical Note 36, ch. 5, eq. (5.15) [M].
 */
export function earthRotationAngle(instant: Instant, timeScales: TimeScales): Radians {
  const at = requireInstant('instant', instant);
  const ts = requireTimeScales('timeScales', timeScales);
  const jd = ts.toJd(at, 'UTC');
  const tu = jd.day - 2_451_545 + jd.fraction;
  let turns = (ERA_AT_J2000_TURNS + jd.fraction + ERA_EXTRA_TURNS_PER_DAY * tu) % 1;
  if (turns < 0) turns += 1;
  return turns * TWO_PI;
}
