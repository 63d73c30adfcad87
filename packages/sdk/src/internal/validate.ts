/**
 * Boundary validation helpers. Public functions validate once, here; internals trust
 * their callers. Every failure is an {@link InvalidArgumentError} naming the field.
 *
 * @internal
 */

import type { ConstantSet } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';

/** Mean equatorial radius used only to recognise "inside the Earth" input, in metres. */
const EARTH_RADIUS_FOR_CHECKS = 6_378_137;

/** Throws unless `value` is a finite number. */
export function requireFinite(argument: string, value: unknown, expected = 'a finite number'): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new InvalidArgumentError(argument, value, expected);
  return value;
}

/** Throws unless `value` is finite and > 0. */
export function requirePositive(argument: string, value: unknown, unit = ''): number {
  const expected = `a finite number greater than 0${unit ? ` ${unit}` : ''}`;
  const v = requireFinite(argument, value, expected);
  if (!(v > 0)) throw new InvalidArgumentError(argument, value, expected);
  return v;
}

/** Throws unless `value` is finite and ≥ 0. */
export function requireNonNegative(argument: string, value: unknown, unit = ''): number {
  const expected = `a finite number ≥ 0${unit ? ` ${unit}` : ''}`;
  const v = requireFinite(argument, value, expected);
  if (!(v >= 0)) throw new InvalidArgumentError(argument, value, expected);
  return v;
}

/** Throws unless `min ≤ value ≤ max`; `minExclusive` / `maxExclusive` make either end open. */
export function requireInRange(
  argument: string,
  value: unknown,
  min: number,
  max: number,
  { minExclusive = false, maxExclusive = false, unit = '' } = {},
): number {
  const expected = `in ${minExclusive ? '(' : '['}${min}, ${max}${maxExclusive ? ')' : ']'}${unit ? ` ${unit}` : ''}`;
  const v = requireFinite(argument, value, expected);
  if ((minExclusive ? v <= min : v < min) || (maxExclusive ? v >= max : v > max))
    throw new InvalidArgumentError(argument, value, expected);
  return v;
}

/** Throws unless `value` is an integer in [min, max]. */
export function requireInteger(
  argument: string,
  value: unknown,
  min = Number.MIN_SAFE_INTEGER,
  max = Number.MAX_SAFE_INTEGER,
): number {
  const expected = `an integer in [${min}, ${max}]`;
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
    throw new InvalidArgumentError(argument, value, expected);
  }
  return value;
}

/**
 * Throws unless `value` is a plausible orbit semi-major axis (or radius) in metres:
 * finite, above the Earth's equatorial radius and below 1e10 m. Values that would be
 * sensible in kilometres get a hint saying so.
 */
export function requireOrbitRadius(argument: string, value: unknown): number {
  const expected = `a distance from the geocentre in metres, above the Earth's equatorial radius (${EARTH_RADIUS_FOR_CHECKS} m) and below 1e10 m`;
  const v = requireFinite(argument, value, expected);
  if (v <= EARTH_RADIUS_FOR_CHECKS || v > 1e10) {
    let hint: string | undefined;
    if (v > 0 && v <= EARTH_RADIUS_FOR_CHECKS) {
      hint = `${v} m is inside the Earth`;
      if (v * 1000 > EARTH_RADIUS_FOR_CHECKS && v * 1000 <= 1e10) hint += `; did you mean ${v} km = ${v * 1000} m?`;
    }
    throw new InvalidArgumentError(argument, value, expected, hint);
  }
  return v;
}

/** Throws unless `value` is an elliptical-orbit eccentricity, 0 ≤ e < 1. */
export function requireEccentricity(argument: string, value: unknown): number {
  const expected = 'in [0, 1) for an elliptical orbit';
  const v = requireFinite(argument, value, expected);
  if (v < 0 || v >= 1) {
    const hint =
      v >= 1
        ? 'e ≥ 1 is a parabolic or hyperbolic trajectory, which has no periodic clock term'
        : 'eccentricity cannot be negative';
    throw new InvalidArgumentError(argument, value, expected, hint);
  }
  return v;
}

/** Throws unless `value` is an array of three finite numbers. */
export function requireVector3(argument: string, value: unknown, unit: string): [number, number, number] {
  const expected = `an array of three finite numbers in ${unit}`;
  if (!Array.isArray(value) && !(value instanceof Float64Array))
    throw new InvalidArgumentError(argument, value, expected);
  const arr = value as ArrayLike<unknown>;
  if (arr.length !== 3) throw new InvalidArgumentError(argument, value, expected);
  const component = (i: number): number => requireFinite(`${argument}[${i}]`, arr[i], `a finite number in ${unit}`);
  return [component(0), component(1), component(2)];
}

/**
 * Plausible range of each numeric field of a constant set (Earth values; units in `unit`). Shared by
 * `defineConstantSet` and {@link requireConstantSet}, so a set that one accepts the other accepts.
 */
export const CONSTANT_SET_RANGES = Object.freeze({
  gm: { min: 3.9e14, max: 4.1e14, unit: 'm³/s² (Earth GM; a value near 398600 is km³/s²)' },
  earthRotationRate: { min: 7.0e-5, max: 7.5e-5, unit: 'rad/s' },
  equatorialRadius: { min: 6.3e6, max: 6.4e6, unit: 'm' },
  j2: { min: 0, max: 2e-3, unit: '(dimensionless)' },
  flattening: { min: 0, max: 0.01, unit: '(dimensionless)' },
  lG: { min: 6.9e-10, max: 7.0e-10, unit: '(dimensionless)' },
  pi: { min: 3.14, max: 3.15, unit: "(the set's fixed value of π)" },
});

/**
 * Throws unless `value` is a constant set: an object with a `name` and every numeric field finite and
 * inside {@link CONSTANT_SET_RANGES} (e.g. `{}` or a set with `gm: NaN` is refused, naming the field).
 * `relativisticF` must agree with `gm` (F = −2√GM/c², IERS Conventions 2010 eq. 10.10 [V1]) to 1e-12 relative.
 */
export function requireConstantSet(argument: string, value: unknown): ConstantSet {
  const expected = 'a ConstantSet (see constantSet(name) or defineConstantSet)';
  if (typeof value !== 'object' || value === null || Array.isArray(value))
    throw new InvalidArgumentError(argument, value, expected);
  const set = value as Record<string, unknown>;
  if (typeof set.name !== 'string')
    throw new InvalidArgumentError(`${argument}.name`, set.name, `a string naming the set (${expected})`);
  for (const [field, range] of Object.entries(CONSTANT_SET_RANGES)) {
    requireInRange(`${argument}.${field}`, set[field], range.min, range.max, { unit: range.unit });
  }
  const f = (-2 * Math.sqrt(Number(set.gm))) / (299_792_458 * 299_792_458); // gm checked finite above
  if (typeof set.relativisticF !== 'number' || !(Math.abs(set.relativisticF - f) <= 1e-12 * Math.abs(f))) {
    throw new InvalidArgumentError(
      `${argument}.relativisticF`,
      set.relativisticF,
      `−2√GM/c² = ${f} s/√m for this set's gm (build sets with defineConstantSet)`,
    );
  }
  return value as ConstantSet;
}

/**
 * Throws unless `value` is an options/container object (not null, not an array); `undefined` (an
 * omitted argument) gives `{}` so callers can read defaults.
 */
export function requireOptions<T extends object>(argument: string, value: T | undefined): T {
  if (value === undefined) return {} as T;
  return requireObject(argument, value, 'an object of named options (or omitted)');
}

/** Throws unless `value` is a container object (not null, not an array, not a primitive). */
export function requireObject<T extends object>(argument: string, value: T, expected = 'an object'): T {
  if (typeof value !== 'object' || value === null || Array.isArray(value))
    throw new InvalidArgumentError(argument, value, expected);
  return value;
}

/**
 * Throws unless `value` is a JSON object (not null, not an array); returns it as a record of its fields.
 * `expected` describes the object in the error (e.g. its fields with units); default "an object".
 */
export function requireRecord(field: string, value: unknown, expected = 'an object'): Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value))
    throw new InvalidArgumentError(field, value, expected);
  return value as Record<string, unknown>;
}

/** Throws unless `value` is an array. */
export function requireArray(field: string, value: unknown): unknown[] {
  if (!Array.isArray(value)) throw new InvalidArgumentError(field, value, 'an array');
  return value;
}

/**
 * Refuses a field that a file format does not define, naming it (a dotted path under `field`) and the known
 * fields, so a misspelt key is an error instead of a silently ignored one.
 */
export function rejectUnknownKeys(field: string, obj: Record<string, unknown>, allowed: readonly string[]): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.includes(key)) {
      throw new InvalidArgumentError(
        `${field ? `${field}.` : ''}${key}`,
        obj[key],
        `absent: it is not a field of this object (known fields: ${allowed.join(', ')})`,
      );
    }
  }
}

/** Frequencies accepted for oscillators, synthesizer clocks and their references, in Hz: 1 Hz to 1 THz (our own bounds). */
export const FREQUENCY_RANGE_HZ = { min: 1, max: 1e12 } as const;

/** Throws unless `value` is a frequency in Hz within {@link FREQUENCY_RANGE_HZ}. */
export function requireFrequency(argument: string, value: unknown): number {
  return requireInRange(argument, value, FREQUENCY_RANGE_HZ.min, FREQUENCY_RANGE_HZ.max, { unit: 'Hz' });
}

/** Throws unless `value` is a file name or label for reader messages (a string). */
export function requireSourceName(argument: string, value: unknown): string {
  if (typeof value !== 'string') throw new InvalidArgumentError(argument, value, 'a file name or label (a string)');
  return value;
}

/**
 * Largest |phase| (time error) accepted in clock data, in seconds (31 700 years; our own bound that
 * keeps sums of squares finite), and the accepted range of a measurement variance, in s².
 */
export const MAX_ABS_PHASE_SECONDS = 1e12;
export const MEASUREMENT_VARIANCE_RANGE = { min: 1e-40, max: 1e24 } as const;

/** Throws unless `value` is a phase sample in seconds, |value| ≤ MAX_ABS_PHASE_SECONDS (NaN allowed as "missing" when `missingAllowed`). */
export function requirePhaseSample(argument: string, value: unknown, missingAllowed: boolean): number {
  if (missingAllowed && typeof value === 'number' && Number.isNaN(value)) return value;
  return requireInRange(argument, value, -MAX_ABS_PHASE_SECONDS, MAX_ABS_PHASE_SECONDS, {
    unit: `s${missingAllowed ? ', or NaN for a missing sample' : ''}`,
  });
}

/** Throws unless `value` is a measurement variance in s² within MEASUREMENT_VARIANCE_RANGE. */
export function requireMeasurementVariance(argument: string, value: unknown): number {
  return requireInRange(argument, value, MEASUREMENT_VARIANCE_RANGE.min, MEASUREMENT_VARIANCE_RANGE.max, {
    unit: 's²',
  });
}
