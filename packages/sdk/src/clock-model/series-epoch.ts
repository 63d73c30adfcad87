/**
 * The absolute epoch a clock series must carry where it enters the clock-model API: `t` (or k·τ0) are
 * seconds since it, and results carry it back.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { type Instant, requireInstant } from '../time/instant.js';

/** How to give the epoch, for the error of a series without one. */
const EPOCH_HINT =
  "Give the instant of t = 0, e.g. epoch: createTimeScales(BUNDLED_LEAP_SECONDS).parseIso('2027-02-08T06:00:00', 'GPS') " +
  '(@tauline/sdk/time); the series of readRinexClockSeries carry it as `epoch`';

/**
 * The series' `epoch` (an {@link Instant}); a missing one is an `InvalidArgumentError` naming `argument`
 * with a hint, anything else not an `Instant` the usual one.
 */
export function requireSeriesEpoch(argument: string, value: unknown): Instant {
  if (value === undefined) {
    throw new InvalidArgumentError(argument, value, 'an Instant, the absolute epoch of t = 0 (required)', EPOCH_HINT);
  }
  return requireInstant(argument, value);
}
