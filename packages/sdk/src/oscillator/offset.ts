/**
 * Oscillator frequency offsets (the "factory offset" built into a satellite frequency standard).
 *
 * @module
 */

import { FLIGHT_CONFIGURATION_CAUTION } from '../caution.js';
import { InvalidArgumentError } from '../errors.js';
import { requireFinite, requireFrequency } from '../internal/validate.js';
import type { Dimensionless, Hertz } from '../units.js';

/** Result of {@link offsetFrequency}. */
export interface OffsetFrequency {
  /** f0·(1 + y), in hertz: the frequency to set on the ground. */
  offsetFrequencyHz: Hertz;
  /** f0·y, in hertz: the offset itself, computed directly (no cancellation). */
  offsetHz: Hertz;
  /** The frequency feeds a flight configuration: {@link FLIGHT_CONFIGURATION_CAUTION}. */
  caution: string;
}

/**
 * Validates a fractional frequency offset y = Δf/f: finite and −1 < y < 1.
 * @throws {InvalidArgumentError} otherwise.
 */
export function requireFractionalOffset(argument: string, value: unknown): Dimensionless {
  const expected = 'a finite fractional frequency offset Δf/f in (−1, 1), dimensionless (e.g. −4.4647e-10)';
  const y = requireFinite(argument, value, expected);
  if (!(y > -1 && y < 1)) throw new InvalidArgumentError(argument, value, expected);
  return y;
}

/**
 * Frequency of an oscillator offset by a fractional amount y:
 *   f = f0·(1 + y),   Δf = f0·y
 * Δf is computed directly as f0·y so it keeps full relative precision; f is f0 + Δf.
 * Example (IS-GPS-200E §3.3.1.1): 10.23 MHz with y = −4.4647e-10 → 10.2299999954326 MHz, Δf = −4.5674e-3 Hz.
 *
 * @param nominalFrequency  f0, in hertz (> 0).
 * @param fractionalOffset  y = Δf/f, dimensionless, in (−1, 1).
 * @returns `{ offsetFrequencyHz, offsetHz }`, in hertz.
 * @throws {InvalidArgumentError} for f0 outside 1 Hz..1 THz, or y outside (−1, 1).
 * @see IS-GPS-200E §3.3.1.1 [V2]; definition of fractional frequency, e.g. IEEE Std 1139 [M].
 */
export function offsetFrequency(nominalFrequency: Hertz, fractionalOffset: Dimensionless): OffsetFrequency {
  const f0 = requireFrequency('nominalFrequency', nominalFrequency);
  const y = requireFractionalOffset('fractionalOffset', fractionalOffset);
  const offsetHz = f0 * y;
  return { offsetFrequencyHz: f0 + offsetHz, offsetHz, caution: FLIGHT_CONFIGURATION_CAUTION };
}
