/**
 * Classical Keplerian elements and their conversion to and from inertial state vectors.
 *
 * @module
 */

import { SPEED_OF_LIGHT } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import {
  CONSTANT_SET_RANGES,
  requireEccentricity,
  requireFinite,
  requireInRange,
  requireOrbitRadius,
  requireVector3,
} from '../internal/validate.js';
import type { CubicMetresPerSecondSquared, Dimensionless, Metres, Radians, Vector3 } from '../units.js';
import { solveKepler, trueToEccentricAnomaly } from './kepler.js';

/**
 * Osculating Keplerian elements of an elliptical orbit, in an inertial geocentric frame
 * (the frame of the state vectors they are converted to or from).
 */
export interface KeplerianElements {
  /** a, in metres. */
  semiMajorAxis: Metres;
  /** e, dimensionless, 0 ≤ e < 1. */
  eccentricity: Dimensionless;
  /** i, in radians, 0 ≤ i ≤ π (i > π/2 is retrograde). */
  inclination: Radians;
  /** Right ascension of the ascending node Ω, in radians. */
  raan: Radians;
  /** Argument of perigee ω, in radians. */
  argumentOfPerigee: Radians;
  /** Mean anomaly M, in radians. */
  meanAnomaly: Radians;
}

/** Position and velocity in an inertial geocentric frame, in metres and metres per second. */
export interface StateVector {
  /** Position, in metres. */
  position: Vector3;
  /** Velocity, in metres per second. */
  velocity: Vector3;
}

/**
 * Below this eccentricity the orbit is treated as circular by {@link stateToElements}:
 * the perigee is placed at the ascending node. Dimensionless.
 */
export const CIRCULAR_ECCENTRICITY_THRESHOLD: Dimensionless = 1e-14;
/**
 * Below this sin i the orbit is treated as equatorial by {@link stateToElements}: the node
 * line is placed on the +x axis. Dimensionless.
 */
export const EQUATORIAL_SIN_INCLINATION_THRESHOLD: Dimensionless = 1e-14;

const TWO_PI = 2 * Math.PI;

/** Reduces an angle to [0, 2π). */
function wrapTwoPi(angle: number): number {
  const r = angle % TWO_PI;
  const w = r < 0 ? r + TWO_PI : r;
  return w >= TWO_PI ? 0 : w;
}

/** Largest semi-major axis or distance accepted, in metres (beyond the planets; keeps products of a finite). */
const MAX_DISTANCE = 1e13;

/** Throws unless the field label a caller passes for error messages is a string. */
function requireLabel(argument: unknown): void {
  if (typeof argument !== 'string')
    throw new InvalidArgumentError('argument', argument, 'a string naming the field in error messages');
}

/** True when `gm` is the Earth's (any constant set's value): the orbit must then clear the Earth, see requireOrbitRadius. */
function isEarthGm(gm: number): boolean {
  return gm >= CONSTANT_SET_RANGES.gm.min && gm <= CONSTANT_SET_RANGES.gm.max;
}

/**
 * Validates a set of elements field by field (field names `elements.<field>`).
 * @throws {InvalidArgumentError} naming the first bad field.
 */
export function requireKeplerianElements(elements: unknown, argument = 'elements'): KeplerianElements {
  requireLabel(argument);
  if (typeof elements !== 'object' || elements === null) {
    throw new InvalidArgumentError(
      argument,
      elements,
      'an object { semiMajorAxis, eccentricity, inclination, raan, argumentOfPerigee, meanAnomaly } in metres and radians',
    );
  }
  const el = elements as Record<string, unknown>;
  return {
    semiMajorAxis: requireInRange(`${argument}.semiMajorAxis`, el.semiMajorAxis, 1, MAX_DISTANCE, { unit: 'm' }),
    eccentricity: requireEccentricity(`${argument}.eccentricity`, el.eccentricity),
    inclination: requireInRange(`${argument}.inclination`, el.inclination, 0, Math.PI, { unit: 'rad' }),
    raan: requireFinite(`${argument}.raan`, el.raan, 'a finite angle in radians'),
    argumentOfPerigee: requireFinite(
      `${argument}.argumentOfPerigee`,
      el.argumentOfPerigee,
      'a finite angle in radians',
    ),
    meanAnomaly: requireFinite(`${argument}.meanAnomaly`, el.meanAnomaly, 'a finite angle in radians'),
  };
}

/**
 * Validates a state vector (field names `state.position[i]`, `state.velocity[i]`).
 * @throws {InvalidArgumentError} naming the first bad field.
 */
export function requireStateVector(state: unknown, argument = 'state'): StateVector {
  requireLabel(argument);
  if (typeof state !== 'object' || state === null) {
    throw new InvalidArgumentError(argument, state, 'an object { position, velocity } of 3-vectors in m and m/s');
  }
  const s = state as Record<string, unknown>;
  return {
    position: requireVector3(`${argument}.position`, s.position, 'm'),
    velocity: requireVector3(`${argument}.velocity`, s.velocity, 'm/s'),
  };
}

/**
 * Inertial position and velocity from Keplerian elements (two-body).
 *
 * In the perifocal frame, with E from Kepler's equation and r = a(1 − e cos E):
 *   x = a(cos E − e),  y = a√(1 − e²) sin E,
 *   ẋ = −√(GM a) sin E / r,  ẏ = √(GM a) √(1 − e²) cos E / r,
 * rotated to the inertial frame by R3(−Ω)·R1(−i)·R3(−ω).
 *
 * @param elements  Keplerian elements (a in metres, angles in radians).
 * @param gm        GM of the central body, in m³/s².
 * @returns Position in metres and velocity in m/s, in the inertial frame of the elements.
 * @throws {InvalidArgumentError} for a ≤ 0, e outside [0, 1), i outside [0, π], a non-finite angle, or GM ≤ 0.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., Alg. 10 "COE2RV" [M];
 *   IS-GPS-200 Table 20-IV (same rotation sequence) [M].
 */
export function elementsToState(elements: KeplerianElements, gm: CubicMetresPerSecondSquared): StateVector {
  const el = requireKeplerianElements(elements);
  const mu = requireInRange('gm', gm, 0, 1e21, { minExclusive: true, unit: "m³/s² (the Sun's is 1.3e20)" });
  // With the Earth's GM, a semi-major axis inside the Earth is refused with the kilometre hint of meanClockRate.
  if (isEarthGm(mu)) requireOrbitRadius('elements.semiMajorAxis', el.semiMajorAxis);
  const { semiMajorAxis: a, eccentricity: e, inclination: i, raan, argumentOfPerigee: w } = el;
  const E = solveKepler(el.meanAnomaly, e);
  const cosE = Math.cos(E);
  const sinE = Math.sin(E);
  const rootOneMinusE2 = Math.sqrt((1 - e) * (1 + e));
  const r = a * (1 - e * cosE);
  const xPf = a * (cosE - e);
  const yPf = a * rootOneMinusE2 * sinE;
  const speedScale = Math.sqrt(mu * a) / r;
  const vxPf = -speedScale * sinE;
  const vyPf = speedScale * rootOneMinusE2 * cosE;
  const cO = Math.cos(raan),
    sO = Math.sin(raan);
  const cw = Math.cos(w),
    sw = Math.sin(w);
  const ci = Math.cos(i),
    si = Math.sin(i);
  // Columns P (towards perigee) and Q (90° ahead in the orbit plane) of R3(−Ω)R1(−i)R3(−ω).
  const P = [cO * cw - sO * sw * ci, sO * cw + cO * sw * ci, sw * si] as const;
  const Q = [-cO * sw - sO * cw * ci, -sO * sw + cO * cw * ci, cw * si] as const;
  return {
    position: [xPf * P[0] + yPf * Q[0], xPf * P[1] + yPf * Q[1], xPf * P[2] + yPf * Q[2]],
    velocity: [vxPf * P[0] + vyPf * Q[0], vxPf * P[1] + vyPf * Q[1], vxPf * P[2] + vyPf * Q[2]],
  };
}

/**
 * Osculating Keplerian elements from an inertial state vector (two-body).
 *
 *   h = r × v,  a = −GM / (2ε) with ε = v²/2 − GM/r,
 *   e cos ν = h²/(GM r) − 1,  e sin ν = (r·v) h/(GM r),  i = atan2(√(h_x² + h_y²), h_z),
 *   Ω = atan2(h_x, −h_y),  u = argument of latitude measured from the node,  ω = u − ν.
 *
 * Conventions for the degenerate cases (the returned elements always reproduce the state
 * through {@link elementsToState} to rounding; only the split between angles is conventional):
 * - equatorial (sin i < 1e-14, prograde or retrograde): Ω = 0, the node line is the +x axis,
 *   so ω (or ω + ν for circular) is measured from +x in the direction of motion;
 * - circular (e < 1e-14): ω = 0, the perigee is put at the node, so the mean anomaly is the
 *   argument of latitude; e is returned as computed (not forced to 0).
 * Ω, ω and M are returned in [0, 2π).
 *
 * @param state  Inertial position in metres and velocity in m/s.
 * @param gm     GM of the central body, in m³/s².
 * @returns The osculating elements (a in metres, angles in radians).
 * @throws {InvalidArgumentError} for non-finite components, a zero position, rectilinear
 *   motion (r × v = 0) or a state that is not bound (v² ≥ 2GM/r, parabolic or hyperbolic).
 * @see Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., Alg. 9 "RV2COE" [M].
 */
export function stateToElements(state: StateVector, gm: CubicMetresPerSecondSquared): KeplerianElements {
  const { position: p, velocity: v } = requireStateVector(state);
  const mu = requireInRange('gm', gm, 0, 1e21, { minExclusive: true, unit: "m³/s² (the Sun's is 1.3e20)" });
  const r = Math.hypot(p[0], p[1], p[2]);
  requireInRange('|state.position|', r, 1, MAX_DISTANCE, { unit: 'm' });
  requireInRange('|state.velocity|', Math.hypot(v[0], v[1], v[2]), 0, SPEED_OF_LIGHT, {
    unit: 'm/s (below the speed of light)',
  });
  const hx = p[1] * v[2] - p[2] * v[1];
  const hy = p[2] * v[0] - p[0] * v[2];
  const hz = p[0] * v[1] - p[1] * v[0];
  const hxy = Math.hypot(hx, hy);
  const h = Math.hypot(hxy, hz);
  if (!(h > 0)) {
    throw new InvalidArgumentError(
      'state.velocity',
      v,
      'a velocity not parallel to the position (r × v ≠ 0)',
      'rectilinear motion has no orbit plane',
    );
  }
  const v2 = v[0] * v[0] + v[1] * v[1] + v[2] * v[2];
  const energy = v2 / 2 - mu / r;
  if (!(energy < 0)) {
    throw new InvalidArgumentError(
      'state.velocity',
      v,
      `a speed below escape speed √(2GM/r) = ${Math.sqrt((2 * mu) / r)} m/s for a bound (elliptical) orbit`,
      `speed ${Math.sqrt(v2)} m/s gives a parabolic or hyperbolic trajectory`,
    );
  }
  const a = -mu / (2 * energy);
  const rv = p[0] * v[0] + p[1] * v[1] + p[2] * v[2];
  const eCosNu = (h * h) / (mu * r) - 1;
  const eSinNu = (rv * h) / (mu * r);
  const e = Math.hypot(eCosNu, eSinNu);
  if (!(e < 1)) {
    throw new InvalidArgumentError('state', state, 'a state on an elliptical orbit (e < 1)', `computed e = ${e}`);
  }
  const inclination = Math.atan2(hxy, hz);
  const equatorial = hxy / h < EQUATORIAL_SIN_INCLINATION_THRESHOLD;
  const raan = equatorial ? 0 : Math.atan2(hx, -hy);
  // Node unit vector n̂ and the in-plane direction p̂ = ŵ × n̂ 90° ahead of it.
  const nx = Math.cos(raan),
    ny = Math.sin(raan);
  const wx = hx / h,
    wy = hy / h,
    wz = hz / h;
  const px = -wz * ny,
    py = wz * nx,
    pz = wx * ny - wy * nx;
  const u = Math.atan2(p[0] * px + p[1] * py + p[2] * pz, p[0] * nx + p[1] * ny);
  const circular = e < CIRCULAR_ECCENTRICITY_THRESHOLD;
  const nu = circular ? u : Math.atan2(eSinNu, eCosNu);
  const argumentOfPerigee = circular ? 0 : wrapTwoPi(u - nu);
  const E = trueToEccentricAnomaly(nu, e);
  const meanAnomaly = wrapTwoPi(E - e * Math.sin(E));
  return { semiMajorAxis: a, eccentricity: e, inclination, raan: wrapTwoPi(raan), argumentOfPerigee, meanAnomaly };
}
