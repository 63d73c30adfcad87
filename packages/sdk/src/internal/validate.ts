/**
 * Boundary validation helpers. Public functions validate once, here; internals trust
 * their callers. Every failure is an {@link InvalidArgumentError} naming the field.
 *
 * @internal
 */
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
export function requireInRange(argument: string, value: unknown, min: number, max: number,
  { minExclusive = false, maxExclusive = false, unit = '' } = {}): number {
  const expected = `in ${minExclusive ? '(' : '['}${min}, ${max}${maxExclusive ? ')' : ']'}${unit ? ` ${unit}` : ''}`;
  const v = requireFinite(argument, value, expected);
  if ((minExclusive ? v <= min : v < min) || (maxExclusive ? v >= max : v > max)) throw new InvalidArgumentError(argument, value, expected);
  return v;
}

/** Throws unless `value` is an integer in [min, max]. */
export function requireInteger(argument: string, value: unknown, min = Number.MIN_SAFE_INTEGER,
  max = Number.MAX_SAFE_INTEGER): number {
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
    const hint = v >= 1 ? 'e ≥ 1 is a parabolic or hyperbolic trajectory, which has no periodic clock term'
      : 'eccentricity cannot be negative';
    throw new InvalidArgumentError(argument, value, expected, hint);
  }
  return v;
}

/** Throws unless `value` is an array of three finite numbers. */
export function requireVector3(argument: string, value: unknown, unit: string): [number, number, number] {
  const expected = `an array of three finite numbers in ${unit}`;
  if (!Array.isArray(value) && !(value instanceof Float64Array)) throw new InvalidArgumentError(argument, value, expected);
  const arr = value as ArrayLike<unknown>;
  if (arr.length !== 3) throw new InvalidArgumentError(argument, value, expected);
  for (let i = 0; i < 3; i++) requireFinite(`${argument}[${i}]`, arr[i], `a finite number in ${unit}`);
  return [arr[0] as number, arr[1] as number, arr[2] as number];
}
