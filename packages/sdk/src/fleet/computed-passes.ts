/**
 * Passes computed instead of given: a fleet satellite may carry its mean orbital elements (`orbit`)
 * and the stations their WGS 84 position and elevation mask; the passes are then predicted with
 * `predictPasses` (orbit/visibility.ts: secular J2, Earth rotation angle with UT1 = UTC) over the
 * fleet's horizon. This module validates those document fields (with their dotted paths) and turns
 * the predicted passes into the fleet's normalised passes.
 *
 * @internal
 */

import { DEFAULT_CONSTANT_SET } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import {
  requireEccentricity,
  requireFinite,
  requireInRange,
  requireOrbitRadius,
  requireRecord,
} from '../internal/validate.js';
import type { KeplerianElements } from '../orbit/elements.js';
import type { GeodeticPosition } from '../orbit/geodetic.js';
import { MAX_PASS_PROPAGATION_SECONDS, type PredictedPass, predictPasses } from '../orbit/visibility.js';
import { rejectUnknownKeys } from '../steering/scenario.js';
import { parseUtcStamp } from '../steering/utc-stamps.js';
import type { Instant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import type { Metres, Radians, Seconds } from '../units.js';

/** A station's geodetic position on WGS 84, as written in a fleet document (SI units named in the keys). */
export interface FleetStationPosition {
  /** Geodetic latitude, in radians, in [−π/2, π/2]. */
  latitudeRadians: Radians;
  /** Longitude (east positive), in radians, in [−2π, 2π]. */
  longitudeRadians: Radians;
  /** Height above the WGS 84 ellipsoid (not the geoid), in metres. */
  heightMetres: Metres;
}

/** A satellite's mean orbital elements at their epoch, as written in a fleet document. */
export interface FleetOrbit {
  /** Epoch of the elements (ISO 8601 UTC), within 366 days of every time of the horizon. */
  epoch: string;
  /** Mean semi-major axis, in metres (a value in kilometres is recognised and refused with a hint). */
  semiMajorAxisMetres: Metres;
  /** Mean eccentricity, in [0, 1); the perigee must clear the Earth. */
  eccentricity: number;
  /** Mean inclination, in radians, in [0, π]. */
  inclinationRadians: Radians;
  /** Right ascension of the ascending node, in radians, in [−2π, 2π] (inertial frame of date). */
  raanRadians: Radians;
  /** Argument of perigee, in radians, in [−2π, 2π]. */
  argumentOfPerigeeRadians: Radians;
  /** Mean anomaly at the epoch, in radians, in [−2π, 2π]. */
  meanAnomalyRadians: Radians;
}

/** A pass computed from an orbit, as reported in the plan (seconds since the fleet epoch). */
export interface NormalizedComputedPass extends PredictedPass {
  /** Index into the fleet's stations. */
  station: number;
  /** False when shorter than its station's `supportSeconds`: it cannot hold a support and is not planned with. */
  usable: boolean;
}

/** A validated station site for pass computation. */
export interface StationSite {
  position: GeodeticPosition;
  elevationMask: Radians;
}

export const ORBIT_FIELDS = [
  'epoch',
  'semiMajorAxisMetres',
  'eccentricity',
  'inclinationRadians',
  'raanRadians',
  'argumentOfPerigeeRadians',
  'meanAnomalyRadians',
] as const;

/** The hint for an angle that looks like degrees. */
function degreesHint(v: number): string {
  return `${v} looks like degrees; ${v}° = ${(v * Math.PI) / 180} rad`;
}

/** An angle in [−max, max] rad; a value that only makes sense in degrees gets a hint. */
function requireAngle(field: string, value: unknown, max: number, maxText: string): number {
  const v = requireFinite(field, value, `a finite angle in radians, in [−${maxText}, ${maxText}]`);
  if (Math.abs(v) > max) {
    const hint = Math.abs(v) <= (max * 180) / Math.PI ? degreesHint(v) : undefined;
    throw new InvalidArgumentError(field, value, `in [−${maxText}, ${maxText}] rad`, hint);
  }
  return v;
}

/**
 * Validates a station's optional `position` and `elevationMaskRadians` (both or neither).
 * @returns The site, or undefined when the station gives neither.
 */
export function validateStationSite(field: string, s: Record<string, unknown>): StationSite | undefined {
  if (s.position === undefined && s.elevationMaskRadians === undefined) return undefined;
  if (s.position === undefined) {
    throw new InvalidArgumentError(
      `${field}.position`,
      undefined,
      'a position { latitudeRadians, longitudeRadians, heightMetres } with elevationMaskRadians',
    );
  }
  const p = requireRecord(`${field}.position`, s.position);
  rejectUnknownKeys(`${field}.position`, p, ['latitudeRadians', 'longitudeRadians', 'heightMetres']);
  const position: GeodeticPosition = {
    latitude: requireAngle(`${field}.position.latitudeRadians`, p.latitudeRadians, Math.PI / 2, 'π/2'),
    longitude: requireAngle(`${field}.position.longitudeRadians`, p.longitudeRadians, 2 * Math.PI, '2π'),
    height: requireInRange(`${field}.position.heightMetres`, p.heightMetres, -12_000, 1e7, {
      unit: 'm above the WGS 84 ellipsoid',
    }),
  };
  if (s.elevationMaskRadians === undefined) {
    throw new InvalidArgumentError(
      `${field}.elevationMaskRadians`,
      undefined,
      'an elevation mask in radians, in [0, π/2), given with the position',
    );
  }
  const mask = requireAngle(`${field}.elevationMaskRadians`, s.elevationMaskRadians, Math.PI / 2, 'π/2');
  if (mask < 0 || mask === Math.PI / 2) {
    throw new InvalidArgumentError(`${field}.elevationMaskRadians`, mask, 'in [0, π/2) rad');
  }
  return { position, elevationMask: mask };
}

/** Validates a satellite's `orbit` (field paths `satellites[i].orbit.<key>`). */
export function validateFleetOrbit(
  field: string,
  value: unknown,
  ts: TimeScales,
  epoch: Instant,
  horizon: Seconds,
): { elements: KeplerianElements; epoch: Instant } {
  const o = requireRecord(field, value);
  rejectUnknownKeys(field, o, ORBIT_FIELDS);
  const elEpoch = parseUtcStamp(ts, `${field}.epoch`, o.epoch);
  const a = requireOrbitRadius(`${field}.semiMajorAxisMetres`, o.semiMajorAxisMetres);
  const e = requireEccentricity(`${field}.eccentricity`, o.eccentricity);
  const perigee = a * (1 - e);
  if (!(perigee > DEFAULT_CONSTANT_SET.equatorialRadius)) {
    throw new InvalidArgumentError(
      `${field}.eccentricity`,
      e,
      `a value keeping the perigee a(1 − e) above the Earth (${DEFAULT_CONSTANT_SET.equatorialRadius} m)`,
      `perigee ${perigee} m`,
    );
  }
  const inclination = requireFinite(
    `${field}.inclinationRadians`,
    o.inclinationRadians,
    'a finite angle in radians, in [0, π]',
  );
  if (inclination < 0 || inclination > Math.PI) {
    throw new InvalidArgumentError(
      `${field}.inclinationRadians`,
      inclination,
      'in [0, π] rad',
      inclination > Math.PI && inclination <= 180 ? degreesHint(inclination) : undefined,
    );
  }
  const offset = epoch.secondsSince(elEpoch);
  if (Math.max(Math.abs(offset), Math.abs(offset + horizon)) > MAX_PASS_PROPAGATION_SECONDS) {
    throw new InvalidArgumentError(
      `${field}.epoch`,
      o.epoch,
      'within 366 days of the whole horizon (secular J2 propagation, no drag)',
    );
  }
  return {
    epoch: elEpoch,
    elements: {
      semiMajorAxis: a,
      eccentricity: e,
      inclination,
      raan: requireAngle(`${field}.raanRadians`, o.raanRadians, 2 * Math.PI, '2π'),
      argumentOfPerigee: requireAngle(
        `${field}.argumentOfPerigeeRadians`,
        o.argumentOfPerigeeRadians,
        2 * Math.PI,
        '2π',
      ),
      meanAnomaly: requireAngle(`${field}.meanAnomalyRadians`, o.meanAnomalyRadians, 2 * Math.PI, '2π'),
    },
  };
}

/**
 * The passes of one satellite over every station, predicted over [epoch, epoch + horizon] and sorted by
 * start then station. A pass shorter than its station's support is kept with `usable: false`.
 */
export function computeFleetPasses(
  orbit: { elements: KeplerianElements; epoch: Instant },
  sites: readonly StationSite[],
  supports: readonly Seconds[],
  epoch: Instant,
  horizon: Seconds,
  timeScales: TimeScales,
): NormalizedComputedPass[] {
  const prediction = predictPasses(orbit, sites, epoch, horizon, { timeScales });
  const out: NormalizedComputedPass[] = [];
  for (const [station, passes] of prediction.passes.entries()) {
    for (const p of passes) {
      // Rounded inwards to the millisecond of the printed stamps: still inside the pass (elevation ≥ mask).
      const start = Math.ceil(p.start * 1000 - 1e-6) / 1000;
      const end = Math.floor(p.end * 1000 + 1e-6) / 1000;
      out.push({ ...p, station, start, end, usable: end - start >= at(supports, station, 'supports') });
    }
  }
  return out.sort((x, y) => x.start - y.start || x.station - y.station);
}
