/**
 * Gravity models for orbit + clock integration: acceleration and the Newtonian potential U
 * (positive sign convention, U ≈ GM/r) that enters the clock rate
 * dτ/dTT = 1 + L_G − (U + v²/2)/c² (IERS Conventions 2010 §10.2, eqs. 10.6–10.9).
 *
 * Frame: geocentric, non-rotating, z along the Earth's (mean) rotation axis of date. Precession
 * and nutation of that axis are ignored over the integration span (≈ 0.1″ per day).
 *
 * Models:
 * - `point-mass`: U = GM/r.
 * - `j2`: adds the zonal J2 term U_J2 = −(GM J2 a_e²/(2 r³))·(3 z²/r² − 1) (axisymmetric).
 * - `full`: J2 plus the lunar and solar tidal potential
 *   V_tid = GM_b·(1/|r_b − r| − 1/|r_b| − r·r_b/|r_b|³) and its gradient, the third-body
 *   acceleration GM_b·((r_b − r)/|r_b − r|³ − r_b/|r_b|³) (IERS Conventions 2010 eq. 10.6's
 *   V(X_A) − V(X_E) − x^i ∂_i V(X_E)), with Sun and Moon from the low-precision series of
 *   Montenbruck & Gill (2000) §3.3.2.
 *
 * @module
 */

import { type ConstantSet, type ConstantsOptions, DEFAULT_CONSTANT_SET } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { constantsOf, readConstants, readOptions } from '../internal/options.js';
import { requireInRange, requirePositive, requireVector3 } from '../internal/validate.js';
import type { Instant } from '../time/instant.js';
import { J2000_EPOCH, requireEpochInstant, ttSecondsSinceJ2000 } from '../time/j2000.js';
import type { CubicMetresPerSecondSquared, Metres, Seconds, SquareMetresPerSecondSquared, Vector3 } from '../units.js';
import { moonPositionAt, sunPositionAt } from './ephemeris.js';

/** Gravitational parameter of the Moon, 4.902800066e12 m³/s² (JPL DE-series value) [M]. */
export const GM_MOON: CubicMetresPerSecondSquared = 4.902800066e12;
/** Heliocentric gravitational constant, 1.32712442099e20 m³/s² (IERS Conventions 2010 Table 1.1, TCB-compatible) [M]. */
export const GM_SUN: CubicMetresPerSecondSquared = 1.32712442099e20;

/** Which force and clock-potential model to use. */
export type GravityModel = 'point-mass' | 'j2' | 'full';

/** The gravity models, for validation and help text. */
export const GRAVITY_MODELS: readonly GravityModel[] = ['point-mass', 'j2', 'full'];

/** Options of {@link createGravityField}. */
export interface GravityFieldOptions {
  /** Earth constants (GM, J2, equatorial radius); default IERS 2010. */
  constants?: ConstantSet;
  /**
   * For `full`: the instant of t = 0 (default {@link J2000_EPOCH}, 2000-01-01T12:00:00 TT); the Sun and the Moon
   * are taken at TT = epoch + t. Build it with `parseIso(text, 'TT')` or `instantFromTtSecondsSinceJ2000(seconds)`
   * of `@tauline/sdk/time`. (The former `epochTtSecondsSinceJ2000` number is refused with a hint.)
   */
  epoch?: Instant;
  /** For `full`: lunar GM (default {@link GM_MOON}). */
  moonGm?: CubicMetresPerSecondSquared;
  /** For `full`: solar GM (default {@link GM_SUN}). */
  sunGm?: CubicMetresPerSecondSquared;
}

/** A gravity field with its acceleration and clock potential, evaluated at time t (s since the epoch). */
export interface GravityField {
  readonly model: GravityModel;
  /** Writes the acceleration (m/s²) at position (x, y, z) (m) into `out[offset..offset+2]`. */
  accelerate(t: Seconds, x: number, y: number, z: number, out: Float64Array, offset: number): void;
  /** Newtonian potential U (m²/s², positive convention) including tidal terms for `full`. */
  potential(t: Seconds, x: number, y: number, z: number): SquareMetresPerSecondSquared;
}

/**
 * Builds a gravity field for orbit + clock integration.
 *
 * @param model `point-mass`, `j2` or `full` (see the module comment for the formulas).
 * @param options Constants and, for `full`, the epoch of t = 0.
 * @returns A field whose `accelerate` and `potential` are the gradient pair (∇U = acceleration).
 * Validity: `j2` ignores higher harmonics (J3 ≈ −2.5e-6, tesserals): clock-potential error at GNSS
 * altitude ≲ 1e-17 of frequency, at LEO ≲ 1e-15 (our own order-of-magnitude estimate GM·J3·a_e³/(r⁴c²) [C]). `full` inherits the
 * ephemeris accuracy of Montenbruck & Gill §3.3.2 (tidal potential error < 1e-17 of frequency at GNSS altitude [C]).
 * @throws {InvalidArgumentError} for an unknown model, non-finite/negative options, an `epoch` that is not an
 *   Instant, or the former `epochTtSecondsSinceJ2000` option (write `{ epoch: instantFromTtSecondsSinceJ2000(s) }`).
 * @see IERS Conventions (2010), IERS TN 36, §10.2 eqs. 10.6–10.9 [V1].
 */
export function createGravityField(model: GravityModel, options: GravityFieldOptions = {}): GravityField {
  if (!GRAVITY_MODELS.includes(model))
    throw new InvalidArgumentError('model', model, `one of ${GRAVITY_MODELS.join(', ')}`);
  const constants = constantsOf('options', readOptions('options', options));
  const gm = constants.gm;
  const k = model === 'point-mass' ? 0 : gm * constants.j2 * constants.equatorialRadius ** 2;
  // The Sun/Moon series take TT seconds since J2000.0 as one float (internal time axis, see ephemeris.ts).
  const epoch = ttSecondsSinceJ2000(readEpoch(options));
  const gmMoon = requirePositive('moonGm', options.moonGm ?? GM_MOON, 'm³/s²');
  const gmSun = requirePositive('sunGm', options.sunGm ?? GM_SUN, 'm³/s²');
  const full = model === 'full';

  // Third-body positions are cached per t (a DOP853 step evaluates several stages at distinct t only).
  let cacheT = Number.NaN;
  let moon: Vector3 = [0, 0, 0];
  let sun: Vector3 = [0, 0, 0];
  const bodies = (t: number): void => {
    if (t === cacheT) return;
    // Split time: the epoch stays separate from t so that the positions are smooth in t at any epoch.
    moon = moonPositionAt(epoch, t, true);
    sun = sunPositionAt(epoch, t, true);
    cacheT = t;
  };

  return {
    model,
    accelerate(t, x, y, z, out, offset) {
      const r2 = x * x + y * y + z * z;
      const r = Math.sqrt(r2);
      const r3 = r2 * r;
      // Point mass: −GM r/r³.
      let ax = (-gm * x) / r3;
      let ay = (-gm * y) / r3;
      let az = (-gm * z) / r3;
      if (k !== 0) {
        // ∇U_J2 (e.g. Montenbruck & Gill 2000 §3.2, zonal term n = 2): −(3/2) GM J2 a_e² r⁻⁵ (x(1−5z²/r²), y(1−5z²/r²), z(3−5z²/r²)).
        const s = (-1.5 * k) / (r3 * r2);
        const w = (5 * z * z) / r2;
        ax += s * x * (1 - w);
        ay += s * y * (1 - w);
        az += s * z * (3 - w);
      }
      if (full) {
        bodies(t);
        const m = thirdBody(gmMoon, moon, x, y, z);
        const sn = thirdBody(gmSun, sun, x, y, z);
        ax += m[0] + sn[0];
        ay += m[1] + sn[1];
        az += m[2] + sn[2];
      }
      out[offset] = ax;
      out[offset + 1] = ay;
      out[offset + 2] = az;
    },
    potential(t, x, y, z) {
      const r2 = x * x + y * y + z * z;
      const r = Math.sqrt(r2);
      let u = gm / r;
      if (k !== 0) u += (-k / (2 * r2 * r)) * ((3 * z * z) / r2 - 1);
      if (full) {
        bodies(t);
        u += tidal(gmMoon, moon, x, y, z) + tidal(gmSun, sun, x, y, z);
      }
      return u;
    },
  };
}

/**
 * The `epoch` option of {@link createGravityField} (default J2000.0). The former option, a number of TT seconds
 * since J2000.0, is refused with a typed error naming the new one, never silently ignored.
 */
function readEpoch(options: GravityFieldOptions): Instant {
  if ('epochTtSecondsSinceJ2000' in options) {
    const { epochTtSecondsSinceJ2000: old } = options as { epochTtSecondsSinceJ2000?: unknown };
    throw new InvalidArgumentError(
      'options.epochTtSecondsSinceJ2000',
      old,
      'absent: the option is now `epoch`, an Instant',
      `write { epoch: instantFromTtSecondsSinceJ2000(${typeof old === 'number' ? old : 'seconds'}) } (@tauline/sdk/time)`,
    );
  }
  return options.epoch === undefined ? J2000_EPOCH : requireEpochInstant('options.epoch', options.epoch);
}

/** Third-body (indirect + direct) acceleration GM_b((r_b − r)/|r_b − r|³ − r_b/|r_b|³) (Montenbruck & Gill 2000 eq. 3.37) [M]. */
function thirdBody(gmB: number, b: Vector3, x: number, y: number, z: number): Vector3 {
  const dx = b[0] - x;
  const dy = b[1] - y;
  const dz = b[2] - z;
  const d3 = (dx * dx + dy * dy + dz * dz) ** 1.5;
  const rb3 = (b[0] * b[0] + b[1] * b[1] + b[2] * b[2]) ** 1.5;
  return [gmB * (dx / d3 - b[0] / rb3), gmB * (dy / d3 - b[1] / rb3), gmB * (dz / d3 - b[2] / rb3)];
}

/**
 * Tidal potential GM_b(1/|r_b − r| − 1/|r_b| − r·r_b/|r_b|³) (IERS Conventions 2010 eq. 10.6 tidal terms) [V1].
 * Written as a difference that stays accurate when |r| ≪ |r_b|: 1/d − 1/R = (R² − d²)/(d R (d + R)).
 */
function tidal(gmB: number, b: Vector3, x: number, y: number, z: number): number {
  const dx = b[0] - x;
  const dy = b[1] - y;
  const dz = b[2] - z;
  const d2 = dx * dx + dy * dy + dz * dz;
  const R2 = b[0] * b[0] + b[1] * b[1] + b[2] * b[2];
  const d = Math.sqrt(d2);
  const R = Math.sqrt(R2);
  const rb = x * b[0] + y * b[1] + z * b[2];
  const r2 = x * x + y * y + z * z;
  // R² − d² = 2 r·r_b − r²
  const inv = (2 * rb - r2) / (d * R * (d + R));
  return gmB * (inv - rb / (R2 * R));
}

/**
 * Point-mass potential U = GM/r, in m²/s².
 * @param position Geocentric position, metres.
 * @param gm Gravitational parameter, m³/s².
 * @throws {InvalidArgumentError} for a non-finite position, |r| outside [1, 1e13] m, or GM outside (0, 1e21] m³/s².
 * @see IERS Conventions (2010) §10.2 (U_E, positive convention) [V1].
 */
export function pointMassPotential(
  position: Vector3,
  gm: CubicMetresPerSecondSquared = DEFAULT_CONSTANT_SET.gm,
): SquareMetresPerSecondSquared {
  const [x, y, z] = requireVector3('position', position, 'metres');
  requireInRange('gm', gm, 0, 1e21, { minExclusive: true, unit: "m³/s² (the Sun's is 1.3e20)" });
  const r = nonZero(x, y, z);
  return gm / r;
}

/**
 * The J2 part of the Earth's potential, U_J2 = −(GM J2 a_e²/(2 r³))(3 sin²φ − 1), sin φ = z/r, in m²/s².
 * @param position Geocentric position in a frame with z along the rotation axis, metres.
 * @param options `constants`: GM, J2 and a_e (default IERS 2010).
 * @throws {InvalidArgumentError} for a non-finite position, |r| outside [1, 1e13] m, a malformed constant set, or a
 *   set passed positionally (the old `j2Potential(position, set)`; write `{ constants: set }`).
 * @see W. A. Heiskanen & H. Moritz, Physical Geodesy (1967), §2-9 zonal harmonics [M]; sign convention of IERS 2010 §10.2 [V1].
 */
export function j2Potential(position: Vector3, options?: ConstantsOptions): SquareMetresPerSecondSquared {
  const [x, y, z] = requireVector3('position', position, 'metres');
  const constants = readConstants('options', options);
  const r = nonZero(x, y, z);
  return (
    (-(constants.gm * constants.j2 * constants.equatorialRadius ** 2) / (2 * r ** 3)) * ((3 * z * z) / (r * r) - 1)
  );
}

/**
 * Tidal potential of a third body at a geocentric position, GM_b(1/|r_b − r| − 1/|r_b| − r·r_b/|r_b|³), in m²/s².
 * @param position Geocentric position of the clock, metres.
 * @param bodyPosition Geocentric position of the body, metres.
 * @param gmBody Gravitational parameter of the body, m³/s².
 * @throws {InvalidArgumentError} for non-finite vectors, distances outside [1, 1e13] m, the body within 1 m of the position, or GM outside (0, 1e21] m³/s².
 * @see IERS Conventions (2010) §10.2 eq. 10.6 (tidal terms V(X_A) − V(X_E) − x^i ∂_i V(X_E)) [V1].
 */
export function thirdBodyTidalPotential(
  position: Vector3,
  bodyPosition: Vector3,
  gmBody: CubicMetresPerSecondSquared,
): SquareMetresPerSecondSquared {
  const [x, y, z] = requireVector3('position', position, 'metres');
  const b = requireVector3('bodyPosition', bodyPosition, 'metres');
  requireInRange('gmBody', gmBody, 0, 1e21, { minExclusive: true, unit: "m³/s² (the Sun's is 1.3e20)" });
  nonZero(x, y, z);
  nonZero(b[0], b[1], b[2], 'bodyPosition');
  separated(x, y, z, b);
  return tidal(gmBody, b, x, y, z);
}

/**
 * Third-body perturbing acceleration GM_b((r_b − r)/|r_b − r|³ − r_b/|r_b|³), in m/s².
 * @param position Geocentric position of the satellite, metres.
 * @param bodyPosition Geocentric position of the body, metres.
 * @param gmBody Gravitational parameter of the body, m³/s².
 * @throws {InvalidArgumentError} for non-finite vectors, distances outside [1, 1e13] m, the body within 1 m of the position, or GM outside (0, 1e21] m³/s².
 * @see O. Montenbruck & E. Gill, Satellite Orbits (2000), eq. (3.37) [M].
 */
export function thirdBodyAcceleration(
  position: Vector3,
  bodyPosition: Vector3,
  gmBody: CubicMetresPerSecondSquared,
): Vector3 {
  const [x, y, z] = requireVector3('position', position, 'metres');
  const b = requireVector3('bodyPosition', bodyPosition, 'metres');
  requireInRange('gmBody', gmBody, 0, 1e21, { minExclusive: true, unit: "m³/s² (the Sun's is 1.3e20)" });
  nonZero(x, y, z);
  nonZero(b[0], b[1], b[2], 'bodyPosition');
  separated(x, y, z, b);
  return thirdBody(gmBody, b, x, y, z);
}

/** Distances these formulas accept, in metres: from 1 m (the potential is singular at r = 0) to 1e13 m (beyond the planets). */
const MIN_DISTANCE = 1;
const MAX_DISTANCE = 1e13;

function nonZero(x: number, y: number, z: number, argument = 'position'): Metres {
  const r = Math.hypot(x, y, z);
  if (!(r >= MIN_DISTANCE && r <= MAX_DISTANCE)) {
    throw new InvalidArgumentError(
      argument,
      [x, y, z],
      `a vector of length in [${MIN_DISTANCE}, ${MAX_DISTANCE}] m (the potential is singular at the origin)`,
    );
  }
  return r;
}

/** Throws unless the clock and the third body are at least 1 m apart (the tidal terms are singular where they meet). */
function separated(x: number, y: number, z: number, b: Vector3): void {
  const d = Math.hypot(b[0] - x, b[1] - y, b[2] - z);
  if (!(d >= MIN_DISTANCE)) {
    throw new InvalidArgumentError(
      'bodyPosition',
      b,
      `a point at least ${MIN_DISTANCE} m from position [${x}, ${y}, ${z}] m`,
    );
  }
}
