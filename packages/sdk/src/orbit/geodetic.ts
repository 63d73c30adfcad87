/**
 * Ground positions on the WGS 84 ellipsoid: geodetic latitude, longitude and height to Earth-fixed
 * Cartesian coordinates, the local vertical (ellipsoid normal), and the elevation of a point above
 * a station's horizon.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { requireFinite, requireInRange, requireObject, requireVector3 } from '../internal/validate.js';
import type { Metres, Radians, Vector3 } from '../units.js';

/**
 * WGS 84 semi-major axis (m) and flattening: a = 6 378 137 m, 1/f = 298.257223563 (NIMA TR8350.2, 3rd ed. 2000,
 * Table 3.1 [M]). The same values as relativity's `WGS84_ELLIPSOID` (a test checks it), kept here so that
 * orbit/ does not import relativity/ (which imports orbit/).
 */
const WGS84 = Object.freeze({ equatorialRadius: 6_378_137, flattening: 1 / 298.257223563 });

/** A point given by geodetic coordinates on the WGS 84 ellipsoid. */
export interface GeodeticPosition {
  /** Geodetic latitude φ (angle of the ellipsoid normal to the equator), in radians, in [−π/2, π/2]. */
  latitude: Radians;
  /** Longitude λ, east positive, in radians, in [−2π, 2π]. */
  longitude: Radians;
  /** Height above the ellipsoid (not above the geoid), in metres, in [−12 000, 1e7]. */
  height: Metres;
}

/** Lowest and highest ellipsoidal heights accepted, in metres (below the deepest trench; up to 10 000 km). */
const HEIGHT_RANGE = { min: -12_000, max: 1e7 } as const;

/**
 * Validates a geodetic position (field names `<argument>.latitude` etc.).
 * @throws {InvalidArgumentError} naming the first bad field, with a hint when a latitude looks like degrees.
 */
export function requireGeodeticPosition(value: unknown, argument = 'position'): GeodeticPosition {
  const expected = 'an object { latitude, longitude, height } in radians and metres';
  const p = requireObject(argument, value as object, expected) as Record<string, unknown>;
  const lat = requireFinite(`${argument}.latitude`, p.latitude, 'a finite angle in radians, in [−π/2, π/2]');
  if (Math.abs(lat) > Math.PI / 2) {
    throw new InvalidArgumentError(
      `${argument}.latitude`,
      lat,
      'in [−π/2, π/2] rad',
      Math.abs(lat) <= 90 ? `${lat} looks like degrees; ${lat}° = ${(lat * Math.PI) / 180} rad` : undefined,
    );
  }
  const lon = requireFinite(`${argument}.longitude`, p.longitude, 'a finite angle in radians, in [−2π, 2π]');
  if (Math.abs(lon) > 2 * Math.PI) {
    throw new InvalidArgumentError(
      `${argument}.longitude`,
      lon,
      'in [−2π, 2π] rad',
      Math.abs(lon) <= 360 ? `${lon} looks like degrees; ${lon}° = ${(lon * Math.PI) / 180} rad` : undefined,
    );
  }
  const height = requireInRange(`${argument}.height`, p.height, HEIGHT_RANGE.min, HEIGHT_RANGE.max, {
    unit: 'm above the ellipsoid',
  });
  return { latitude: lat, longitude: lon, height };
}

/**
 * Earth-fixed Cartesian coordinates of a geodetic position on WGS 84.
 *
 *   N = a / √(1 − e² sin²φ),  e² = f(2 − f),
 *   X = (N + h) cos φ cos λ,  Y = (N + h) cos φ sin λ,  Z = (N(1 − e²) + h) sin φ
 *
 * @param position  Geodetic latitude and longitude (rad) and ellipsoidal height (m).
 * @returns [X, Y, Z] in the WGS 84 Earth-fixed frame, in metres.
 * @throws {InvalidArgumentError} for a field out of range (see {@link requireGeodeticPosition}).
 * @see NIMA TR8350.2, "Department of Defense World Geodetic System 1984", 3rd ed. (2000), eq. (4-14) [M].
 */
export function geodeticToEcef(position: GeodeticPosition): Vector3 {
  const { latitude, longitude, height } = requireGeodeticPosition(position);
  return geodeticToEcefTrusted(latitude, longitude, height);
}

/** {@link geodeticToEcef} without validation (NIMA TR8350.2 eq. 4-14 [M]). @internal */
export function geodeticToEcefTrusted(latitude: Radians, longitude: Radians, height: Metres): Vector3 {
  const { equatorialRadius: a, flattening: f } = WGS84;
  const e2 = f * (2 - f);
  const sinPhi = Math.sin(latitude);
  const cosPhi = Math.cos(latitude);
  const N = a / Math.sqrt(1 - e2 * sinPhi * sinPhi);
  const rho = (N + height) * cosPhi;
  return [rho * Math.cos(longitude), rho * Math.sin(longitude), (N * (1 - e2) + height) * sinPhi];
}

/**
 * Unit vector of the local vertical (outward ellipsoid normal) at a geodetic latitude and longitude:
 * (cos φ cos λ, cos φ sin λ, sin φ), the "up" axis of the local east-north-up frame.
 * @see NIMA TR8350.2 (2000) §4 (geodetic latitude is the angle of the ellipsoid normal) [M].
 * @internal
 */
export function localUp(latitude: Radians, longitude: Radians): Vector3 {
  const c = Math.cos(latitude);
  return [c * Math.cos(longitude), c * Math.sin(longitude), Math.sin(latitude)];
}

/**
 * Elevation of a point above the horizon plane of a station (the plane normal to the ellipsoid
 * normal at the station): el = asin(ρ·û / |ρ|), ρ = point − station, û the local vertical.
 * No refraction: the geometric elevation.
 *
 * @param station  Geodetic position of the station (rad, m).
 * @param pointEcef  Earth-fixed position of the target (e.g. a satellite), in metres.
 * @returns Elevation in radians, in [−π/2, π/2].
 * @throws {InvalidArgumentError} for an invalid station, a non-finite point or a point at the station.
 * @see Local east-north-up topocentric frame, e.g. Vallado, Fundamentals of Astrodynamics and Applications,
 *   4th ed., §4.4 (SEZ frame, elevation from the up component) [M].
 */
export function elevationFromStation(station: GeodeticPosition, pointEcef: Vector3): Radians {
  const s = requireGeodeticPosition(station, 'station');
  const p = requireVector3('pointEcef', pointEcef, 'metres');
  const r = geodeticToEcefTrusted(s.latitude, s.longitude, s.height);
  const up = localUp(s.latitude, s.longitude);
  const dx = p[0] - r[0],
    dy = p[1] - r[1],
    dz = p[2] - r[2];
  const range = Math.hypot(dx, dy, dz);
  if (!(range > 0)) {
    throw new InvalidArgumentError('pointEcef', pointEcef, 'a point other than the station (elevation undefined)');
  }
  return Math.asin(Math.max(-1, Math.min(1, (dx * up[0] + dy * up[1] + dz * up[2]) / range)));
}
