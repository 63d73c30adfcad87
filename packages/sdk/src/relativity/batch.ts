/**
 * Batch evaluation of the periodic relativistic clock terms over many epochs, on `Float64Array`s
 * (ground services evaluate whole days for a constellation). Each function validates its inputs once,
 * loops without allocating, and writes into `out` when given (length must match). The loops are hot and keep
 * indexed reads (a for-of over `entries()` measured 3× slower here): bounded by the array's own length, or
 * s[6k .. 6k + 5] for k < n = s.length / 6 (a length checked to be a multiple of 6).
 *
 * @module
 */

import { type ConstantsOptions, SPEED_OF_LIGHT_SQUARED } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { constantsOf, readOptions } from '../internal/options.js';
import { requireEccentricity, requireInRange, requireOrbitRadius } from '../internal/validate.js';
import type { Metres, Radians } from '../units.js';
import { inclinationAndArgumentOfLatitude } from './j2.js';

/** Smallest accepted orbit radius, in metres: the WGS 84 equatorial radius (a position inside the Earth is refused). */
const MIN_RADIUS = 6_378_137;
const MIN_RADIUS_SQUARED = MIN_RADIUS * MIN_RADIUS;

function requireArray(argument: string, value: unknown, multiple = 1): Float64Array {
  if (!(value instanceof Float64Array)) throw new InvalidArgumentError(argument, value, 'a Float64Array');
  if (value.length % multiple !== 0)
    throw new InvalidArgumentError(`${argument}.length`, value.length, `a multiple of ${multiple}`);
  for (let k = 0; k < value.length; k++) {
    if (!Number.isFinite(value[k])) throw new InvalidArgumentError(`${argument}[${k}]`, value[k], 'a finite number');
  }
  return value;
}

/** Options of the batch functions: the constant set and an output array to write into (reused across calls). */
export interface BatchOptions extends ConstantsOptions {
  /** Output of the result's length; a new array is allocated when omitted. */
  readonly out?: Float64Array;
}

function output(out: Float64Array | undefined, n: number): Float64Array {
  if (out === undefined) return new Float64Array(n);
  if (!(out instanceof Float64Array) || out.length !== n)
    throw new InvalidArgumentError('options.out', out, `a Float64Array of length ${n}`);
  return out;
}

/**
 * Periodic eccentricity correction Δt_r = F·e·√a·sin E = −(2/c²)·√(GM a)·e·sin E for many eccentric anomalies.
 * @param semiMajorAxis a, metres. @param eccentricity e, 0 ≤ e < 1.
 * @param eccentricAnomalies E_k, radians.
 * @param options `constants`: F from GM (default IERS 2010); `out`: optional output of the same length.
 * @returns Δt_r,k, seconds.
 * @throws {InvalidArgumentError} for a bad a or e, a non-finite E_k, or an `out` of the wrong length.
 * @see IERS Conventions (2010) §10.2 eq. 10.10 [V1]; IS-GPS-200 §20.3.3.3.3.1 [M].
 */
export function periodicCorrectionFromElementsBatch(
  semiMajorAxis: Metres,
  eccentricity: number,
  eccentricAnomalies: Float64Array,
  options?: BatchOptions,
): Float64Array {
  const a = requireOrbitRadius('semiMajorAxis', semiMajorAxis);
  const e = requireEccentricity('eccentricity', eccentricity);
  const E = requireArray('eccentricAnomalies', eccentricAnomalies);
  const opts = readOptions('options', options);
  const constants = constantsOf('options', opts);
  const res = output(opts.out, E.length);
  const k = constants.relativisticF * e * Math.sqrt(a);
  for (let i = 0; i < E.length; i++) res[i] = k * Math.sin(E[i]!);
  return res;
}

/**
 * Periodic correction Δt_r = −2 r·v/c² for many states packed as [x, y, z, vx, vy, vz] per epoch.
 * @param states Float64Array of length 6N (m, m/s; inertial or Earth-fixed).
 * @param options `out`: optional output of length N.
 * @returns Δt_r,k, seconds.
 * @throws {InvalidArgumentError} for a length not a multiple of 6, a non-finite value, a position inside the Earth, or a bad `out`.
 * @see IERS Conventions (2010) §10.2 eq. 10.11 [V1].
 */
export function periodicCorrectionFromStatesBatch(
  states: Float64Array,
  options?: Pick<BatchOptions, 'out'>,
): Float64Array {
  const s = requireArray('states', states, 6);
  const n = s.length / 6;
  const res = output(readOptions('options', options).out, n);
  for (let k = 0; k < n; k++) {
    const o = 6 * k;
    const x = s[o]!,
      y = s[o + 1]!,
      z = s[o + 2]!;
    // Squared radius against R² (Math.hypot costs ~35 ns a call); the exact |r| only for the error message.
    if (!(x * x + y * y + z * z > MIN_RADIUS_SQUARED))
      requireOrbitRadius(`|states[${k}].position|`, Math.hypot(x, y, z));
    res[k] = (-2 * (x * s[o + 3]! + y * s[o + 4]! + z * s[o + 5]!)) / SPEED_OF_LIGHT_SQUARED;
  }
  return res;
}

/** Which J2 periodic term: Kouba's residual after −2 r·v/c² (−3/2 factor) or the total term (−1/2). */
export type J2TermKind = 'residual' | 'total';

/**
 * J2 periodic clock term −k·J2·(a_e²/c²)·√(GM/a³)·sin²i·sin 2u_j (k = 3/2 residual, 1/2 total) for many arguments of latitude.
 * @param semiMajorAxis a, metres. @param inclination i, radians.
 * @param argumentsOfLatitude u_j, radians. @param kind `residual` or `total`.
 * @param options `constants` (default IERS 2010); `out`: optional output of the same length.
 * @returns Seconds per epoch.
 * @throws {InvalidArgumentError} for bad a or i, an unknown kind, non-finite u_j or a bad `out`.
 * @see J. Kouba, GPS Solutions 8 (2004) [V2 abstract; formula M, verified numerically C]; total term our own derivation [C].
 */
export function j2PeriodicTermBatch(
  semiMajorAxis: Metres,
  inclination: Radians,
  argumentsOfLatitude: Float64Array,
  kind: J2TermKind = 'residual',
  options?: BatchOptions,
): Float64Array {
  const a = requireOrbitRadius('semiMajorAxis', semiMajorAxis);
  const i = requireInRange('inclination', inclination, 0, Math.PI, { unit: 'rad (did you give degrees?)' });
  if (kind !== 'residual' && kind !== 'total') throw new InvalidArgumentError('kind', kind, '"residual" or "total"');
  const u = requireArray('argumentsOfLatitude', argumentsOfLatitude);
  const opts = readOptions('options', options);
  const constants = constantsOf('options', opts);
  const res = output(opts.out, u.length);
  const amp =
    (((kind === 'residual' ? -1.5 : -0.5) *
      (constants.j2 * constants.equatorialRadius ** 2 * Math.sqrt(constants.gm / a ** 3))) /
      SPEED_OF_LIGHT_SQUARED) *
    Math.sin(i) ** 2;
  for (let k = 0; k < u.length; k++) res[k] = amp * Math.sin(2 * u[k]!);
  return res;
}

/**
 * J2 periodic clock term from states [x, y, z, vx, vy, vz] per epoch (inertial, z along the rotation axis):
 * i and u from the angular momentum and node, a from vis-viva (osculating; the amplitude changes by < 1e-4).
 * @param states Float64Array of length 6N. @param kind `residual` (default) or `total`.
 * @param options `constants` (default IERS 2010); `out`: optional output of length N.
 * @returns Seconds per epoch.
 * @throws {InvalidArgumentError} for a bad length, non-finite values, a position inside the Earth, an unbound state, or a bad `out`.
 * @see Kouba (2004) [V2 abstract; formula M, verified numerically C]; vis-viva a = 1/(2/r − v²/GM) (common practice, no source).
 */
export function j2PeriodicTermFromStatesBatch(
  states: Float64Array,
  kind: J2TermKind = 'residual',
  options?: BatchOptions,
): Float64Array {
  if (kind !== 'residual' && kind !== 'total') throw new InvalidArgumentError('kind', kind, '"residual" or "total"');
  const s = requireArray('states', states, 6);
  const opts = readOptions('options', options);
  const constants = constantsOf('options', opts);
  const n = s.length / 6;
  const res = output(opts.out, n);
  const factor =
    ((kind === 'residual' ? -1.5 : -0.5) * constants.j2 * constants.equatorialRadius ** 2) / SPEED_OF_LIGHT_SQUARED;
  const gm = constants.gm;
  for (let k = 0; k < n; k++) {
    const o = 6 * k;
    const x = s[o]!,
      y = s[o + 1]!,
      z = s[o + 2]!,
      vx = s[o + 3]!,
      vy = s[o + 4]!,
      vz = s[o + 5]!;
    const r2 = x * x + y * y + z * z;
    // √(x² + y² + z²) unless the squares overflow (then Math.hypot, which is ~35 ns a call).
    const r = r2 < Infinity ? Math.sqrt(r2) : Math.hypot(x, y, z);
    if (!(r > MIN_RADIUS)) requireOrbitRadius(`|states[${k}].position|`, r);
    const inv = 2 / r - (vx * vx + vy * vy + vz * vz) / gm;
    if (!(inv > 0))
      throw new InvalidArgumentError(`states[${k}].velocity`, [vx, vy, vz], 'below escape speed (a bound orbit)');
    const a = 1 / inv;
    const [i, u] = inclinationAndArgumentOfLatitude(x, y, z, vx, vy, vz);
    res[k] = factor * Math.sqrt(gm / (a * a * a)) * Math.sin(i) ** 2 * Math.sin(2 * u);
  }
  return res;
}
