/**
 * Shapiro (gravitational) delay of a signal between two points near the Earth.
 *
 * @module
 */

import { DEFAULT_CONSTANT_SET, SPEED_OF_LIGHT } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { requirePositive, requireVector3 } from '../internal/validate.js';
import type { CubicMetresPerSecondSquared, Metres, Seconds, Vector3 } from '../units.js';

/**
 * Shapiro delay of one body for a signal from distance r₁ to distance r₂ (from the body's centre)
 * over a straight-line range ρ:
 *   Δt = (2GM/c³)·ln[(r₁ + r₂ + ρ)/(r₁ + r₂ − ρ)].
 * "For near-Earth satellites (e.g. SLR or GNSS) … the only body to be considered is the Earth."
 *
 * @param r1 Emitter distance from the geocentre, metres.
 * @param r2 Receiver distance from the geocentre, metres.
 * @param range ρ = |x₂ − x₁|, metres (0 < ρ < r₁ + r₂).
 * @param gm GM of the body, m³/s² (default IERS 2010 Earth).
 * @returns Δt, seconds (GPS zenith 42.242 ps, horizon 62.316 ps; independent computation [C]).
 * Accuracy: post-Newtonian, first order in GM/c² (the next order is < 1e-16 s near the Earth).
 * @throws {InvalidArgumentError} for non-positive inputs or a range not below r₁ + r₂ (the triangle inequality).
 * @see IERS Conventions (2010) §11.2, eq. 11.17 [V1].
 */
export function shapiroDelay(
  r1: Metres,
  r2: Metres,
  range: Metres,
  gm: CubicMetresPerSecondSquared = DEFAULT_CONSTANT_SET.gm,
): Seconds {
  const a = requirePositive('r1', r1, 'm');
  const b = requirePositive('r2', r2, 'm');
  const rho = requirePositive('range', range, 'm');
  requirePositive('gm', gm, 'm³/s²');
  if (!(rho < a + b)) throw new InvalidArgumentError('range', rho, `below r1 + r2 = ${a + b} m (triangle inequality)`);
  return ((2 * gm) / SPEED_OF_LIGHT ** 3) * Math.log((a + b + rho) / (a + b - rho));
}

/**
 * Shapiro delay between two geocentric positions (emitter at transmit time, receiver at receive time),
 * the same formula as {@link shapiroDelay} with r₁ = |x₁|, r₂ = |x₂|, ρ = |x₂ − x₁|.
 * @param emitterPosition metres. @param receiverPosition metres. @param gm m³/s² (default IERS 2010).
 * @returns Seconds.
 * @throws {InvalidArgumentError} for non-finite vectors, a point at the geocentre, or coincident points.
 * @see IERS Conventions (2010) §11.2, eq. 11.17 [V1].
 */
export function shapiroDelayBetween(
  emitterPosition: Vector3,
  receiverPosition: Vector3,
  gm: CubicMetresPerSecondSquared = DEFAULT_CONSTANT_SET.gm,
): Seconds {
  const x1 = requireVector3('emitterPosition', emitterPosition, 'metres');
  const x2 = requireVector3('receiverPosition', receiverPosition, 'metres');
  const rho = Math.hypot(x2[0] - x1[0], x2[1] - x1[1], x2[2] - x1[2]);
  if (!(rho > 0)) throw new InvalidArgumentError('receiverPosition', x2, 'a point distinct from emitterPosition');
  return shapiroDelay(Math.hypot(...x1), Math.hypot(...x2), rho, gm);
}
