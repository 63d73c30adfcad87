/**
 * Sagnac correction of a one-way signal between a satellite and a receiver, computed in an
 * Earth-fixed frame: the receiver moves with the Earth during the flight, so the flight time
 * computed from Earth-fixed positions at a single epoch must be corrected by
 *   Δt_Sagnac = (Ω_E/c²)·(x_s·y_r − y_s·x_r) = 2·Ω_E·A_z/c²   (standard form [M]; Ashby 2003 §2 text [V2]),
 * A_z = equatorial projection of the area swept by the geocentre–satellite–receiver triangle.
 *
 * @module
 */

import { DEFAULT_CONSTANT_SET, SPEED_OF_LIGHT_SQUARED } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { requireFinite, requirePositive, requireVector3 } from '../internal/validate.js';
import type { Metres, RadiansPerSecond, Seconds, Vector3 } from '../units.js';

function rotationRate(value: unknown): number {
  const w = requirePositive('earthRotationRate', value, 'rad/s');
  if (w < 7.0e-5 || w > 7.5e-5)
    throw new InvalidArgumentError('earthRotationRate', w, "in [7.0e-5, 7.5e-5] rad/s (the Earth's rotation rate)");
  return w;
}

/**
 * Sagnac correction for a one-way transit from a satellite to a receiver, Earth-fixed computation:
 *   Δt = (Ω_E/c²)·(x_s·y_r − y_s·x_r)   (add to |r_s − r_r|/c to get the flight time).
 *
 * @param satellitePositionEcef Satellite position at transmit time in the Earth-fixed frame, metres.
 * @param receiverPositionEcef Receiver position at receive time in the Earth-fixed frame, metres.
 * @param earthRotationRate Ω_E, rad/s (default IERS 2010 7.292115e-5; GPS uses 7.2921151467e-5).
 * @returns Δt, seconds (negative when the receiver moves toward the satellite during the flight).
 * Accuracy: first order in Ω_E·τ; the neglected terms are ≈ (Ω_E τ)²·r/c ≈ 1e-12 s for GNSS.
 * Check: receiver (6 378 137, 0, 0) m, satellite (15 600, 21 500, 0) km → −111.2614 ns (independent computation [C]).
 * @throws {InvalidArgumentError} for non-finite vectors or an implausible rotation rate.
 * @see N. Ashby, Living Rev. Relativity 6 (2003) §2 [V2 text]; N. Ashby, "The Sagnac effect in the GPS" (2004) [V2].
 */
export function sagnacCorrection(
  satellitePositionEcef: Vector3,
  receiverPositionEcef: Vector3,
  earthRotationRate: RadiansPerSecond = DEFAULT_CONSTANT_SET.earthRotationRate,
): Seconds {
  const s = requireVector3('satellitePositionEcef', satellitePositionEcef, 'metres');
  const r = requireVector3('receiverPositionEcef', receiverPositionEcef, 'metres');
  const w = rotationRate(earthRotationRate);
  return (w * (s[0] * r[1] - s[1] * r[0])) / SPEED_OF_LIGHT_SQUARED;
}

/**
 * Sagnac time for a closed path (or a one-way path closed through the geocentre) from the area
 * its projection on the equatorial plane encloses: Δt = 2·Ω_E·A_z/c².
 *
 * @param projectedArea A_z, m² (positive for an eastward, counter-clockwise path seen from the north).
 * @param earthRotationRate Ω_E, rad/s (default IERS 2010).
 * @returns Seconds (equatorial circumnavigation, A = πR²: 207.39 ns, independent computation [C]; Ashby: "207.4 ns" [V2]).
 * @throws {InvalidArgumentError} for a non-finite area or an implausible rotation rate.
 * @see N. Ashby, Living Rev. Relativity 6 (2003) §2 [V2 text].
 */
export function sagnacDelayForArea(
  projectedArea: number,
  earthRotationRate: RadiansPerSecond = DEFAULT_CONSTANT_SET.earthRotationRate,
): Seconds {
  const A = requireFinite('projectedArea', projectedArea, 'a finite area in m²');
  return (2 * rotationRate(earthRotationRate) * A) / SPEED_OF_LIGHT_SQUARED;
}

/**
 * Largest Sagnac correction for an equatorial receiver of radius R and an equatorial satellite of radius
 * r_s seen at the horizon: Ω_E·R·r_s·sin θ/c² with cos θ = R/r_s.
 * @param receiverRadius R, metres. @param satelliteRadius r_s, metres (> R).
 * @param earthRotationRate Ω_E, rad/s.
 * @returns Seconds (GPS: 133.43 ns, independent computation [C]).
 * @throws {InvalidArgumentError} for non-positive radii or r_s ≤ R.
 * @see Geometry of the horizon, our own derivation [C]; Ashby (2003) §2 ("up to ≈ 133 ns") [M].
 */
export function maximumSagnacCorrection(
  receiverRadius: Metres,
  satelliteRadius: Metres,
  earthRotationRate: RadiansPerSecond = DEFAULT_CONSTANT_SET.earthRotationRate,
): Seconds {
  const R = requirePositive('receiverRadius', receiverRadius, 'm');
  const rs = requirePositive('satelliteRadius', satelliteRadius, 'm');
  if (!(rs > R)) throw new InvalidArgumentError('satelliteRadius', rs, `greater than receiverRadius (${R} m)`);
  const sinTheta = Math.sqrt(1 - (R / rs) ** 2);
  return (rotationRate(earthRotationRate) * R * rs * sinTheta) / SPEED_OF_LIGHT_SQUARED;
}
