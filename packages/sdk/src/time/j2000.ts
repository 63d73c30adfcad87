/**
 * The J2000.0 epoch and TT seconds since it: the time argument of the Sun/Moon series and the
 * force models, which take one float of TT seconds (their own resolution is far coarser than the
 * float's 1.2e-7 s at 8e8 s).
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import type { Seconds } from '../units.js';
import { INSTANT_EPOCH_MJD, Instant, requireInstant } from './instant.js';
import { instantFromUniformOrTcgLabel } from './uniform.js';

/**
 * J2000.0 = 2000-01-01T12:00:00 TT = JD 2451545.0 TT (IAU 1976 resolution, IERS Conventions 2010 §1.2 [M]),
 * i.e. 2000-01-01T11:59:27.816 TAI (TT − TAI = 32.184 s); built as the TT reading, so it equals
 * `parseIso('2000-01-01T12:00:00', 'TT')` exactly.
 */
export const J2000_EPOCH: Instant = instantFromUniformOrTcgLabel('TT', INSTANT_EPOCH_MJD, 43_200, 0);

/**
 * TT seconds elapsed since J2000.0 at an instant, as one float (TT runs at the rate of TAI, so this is
 * `instant − J2000_EPOCH` in SI seconds). Resolution of the result: that of a double, 1.2e-7 s at 8e8 s.
 * @throws {InvalidArgumentError} if `instant` is not an Instant.
 */
export function ttSecondsSinceJ2000(instant: Instant): Seconds {
  requireInstant('instant', instant);
  return instant.secondsSince(J2000_EPOCH);
}

/**
 * The instant `seconds` TT seconds after J2000.0 (inverse of {@link ttSecondsSinceJ2000}).
 * @param seconds TT seconds since 2000-01-01T12:00:00 TT (finite, |·| ≤ 1e12).
 * @throws {InvalidArgumentError} for a non-finite or out-of-range value.
 */
export function instantFromTtSecondsSinceJ2000(seconds: Seconds): Instant {
  return J2000_EPOCH.plus(seconds);
}

/** How to build the epoch, for an epoch given as a bare number or omitted. */
const EPOCH_HINT =
  "build one with createTimeScales(BUNDLED_LEAP_SECONDS).parseIso('2027-03-01T00:00:00', 'TT') or, from TT seconds " +
  'since J2000.0, instantFromTtSecondsSinceJ2000(seconds) (@tauline/sdk/time)';

/**
 * An absolute epoch at an orbit or relativity entry point: `value` must be an {@link Instant}. A bare number
 * (the TT-seconds-since-J2000.0 float these entry points took before) and an omitted epoch are refused naming
 * `argument`, with a hint saying how to build the Instant, so a count of seconds is never read on a guessed scale.
 * @throws {InvalidArgumentError} unless `value` is an Instant.
 * @internal
 */
export function requireEpochInstant(argument: string, value: unknown): Instant {
  if (value instanceof Instant) return value;
  if (typeof value === 'number') {
    throw new InvalidArgumentError(argument, value, 'an Instant, not a number of seconds', EPOCH_HINT);
  }
  if (value === undefined) throw new InvalidArgumentError(argument, value, 'an Instant (required)', EPOCH_HINT);
  return requireInstant(argument, value);
}
