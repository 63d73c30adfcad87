/**
 * Two-body (Kepler) propagation of osculating elements.
 *
 * @module
 */

import { requireFinite, requirePositive } from '../internal/validate.js';
import type { CubicMetresPerSecondSquared, Seconds } from '../units.js';
import { elementsToState, type KeplerianElements, requireKeplerianElements, type StateVector } from './elements.js';
import { meanMotion } from './kepler.js';

const TWO_PI = 2 * Math.PI;

/**
 * Elements after `dt` seconds of unperturbed two-body motion: only the mean anomaly
 * changes, M(t0 + dt) = M(t0) + n·dt with n = √(GM/a³), returned reduced to [0, 2π).
 *
 * Accuracy: two-body only (no J2, drag, third bodies). The mean anomaly carries the rounding
 * of n·dt, about 1e-16·|n·dt| rad (≈ 1.4e-14 rad after 100 days at GPS altitude).
 *
 * @param elements  Elements at t0 (a in metres, angles in radians).
 * @param dt        Time step, in seconds (may be negative).
 * @param gm        GM of the central body, in m³/s².
 * @returns Elements at t0 + dt, with the mean anomaly in [0, 2π).
 * @throws {InvalidArgumentError} for invalid elements, a non-finite `dt` or GM ≤ 0.
 * @see Kepler's equation and third law, e.g. Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., Alg. 7 [M].
 */
export function propagateKepler(
  elements: KeplerianElements,
  dt: Seconds,
  gm: CubicMetresPerSecondSquared,
): KeplerianElements {
  const el = requireKeplerianElements(elements);
  const step = requireFinite('dt', dt, 'a finite time step in seconds');
  const mu = requirePositive('gm', gm, 'm³/s²');
  const n = meanMotion(el.semiMajorAxis, mu);
  let M = (el.meanAnomaly + n * step) % TWO_PI;
  if (M < 0) M += TWO_PI;
  if (M >= TWO_PI) M = 0;
  return { ...el, meanAnomaly: M };
}

/**
 * Inertial state after `dt` seconds of two-body motion: {@link propagateKepler} followed by
 * {@link elementsToState}.
 *
 * @param elements  Elements at t0 (a in metres, angles in radians).
 * @param dt        Time step, in seconds.
 * @param gm        GM of the central body, in m³/s².
 * @returns Position (m) and velocity (m/s) at t0 + dt.
 * @throws {InvalidArgumentError} as {@link propagateKepler}.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., Alg. 7 and 10 [M].
 */
export function propagateKeplerState(
  elements: KeplerianElements,
  dt: Seconds,
  gm: CubicMetresPerSecondSquared,
): StateVector {
  return elementsToState(propagateKepler(elements, dt, gm), gm);
}
