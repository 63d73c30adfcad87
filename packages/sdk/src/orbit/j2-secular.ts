/**
 * Mean-element propagation under the secular (orbit-averaged) effect of J2: the node, the perigee
 * and the mean anomaly drift at constant rates; a, e and i stay fixed. Short-period terms (of order
 * J2·(R/a)²·a in position: ~1–2 km at MEO, ~5–10 km at LEO [C]) are left out, which is what pass
 * planning needs (see visibility.ts for their effect on pass times).
 *
 * @module
 */

import type { ConstantSet, ConstantsOptions } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { readConstants } from '../internal/options.js';
import { requireFinite, requireOrbitRadius } from '../internal/validate.js';
import type { Metres, RadiansPerSecond, Seconds } from '../units.js';
import { type KeplerianElements, requireKeplerianElements } from './elements.js';

const TWO_PI = 2 * Math.PI;

/** Secular rates of the angles of a mean orbit under J2. */
export interface J2SecularRates {
  /** dΩ/dt, in rad/s. */
  raanRate: RadiansPerSecond;
  /** dω/dt, in rad/s. */
  argumentOfPerigeeRate: RadiansPerSecond;
  /** dM/dt (mean motion including the J2 term), in rad/s. */
  meanAnomalyRate: RadiansPerSecond;
}

/**
 * Validates mean elements for J2 propagation: the elements themselves, a as an orbit radius in metres
 * (kilometres recognised) and a perigee a(1 − e) above the Earth's equatorial radius.
 * @throws {InvalidArgumentError} naming `<argument>.<field>`.
 * @internal
 */
export function requireMeanElements(value: unknown, argument: string, constants: ConstantSet): KeplerianElements {
  const el = requireKeplerianElements(value, argument);
  requireOrbitRadius(`${argument}.semiMajorAxis`, el.semiMajorAxis);
  const perigee: Metres = el.semiMajorAxis * (1 - el.eccentricity);
  if (!(perigee > constants.equatorialRadius)) {
    throw new InvalidArgumentError(
      `${argument}.eccentricity`,
      el.eccentricity,
      `a value keeping the perigee a(1 − e) above the equatorial radius ${constants.equatorialRadius} m`,
      `perigee ${perigee} m`,
    );
  }
  return el;
}

/** The rates without validation (Vallado 4th ed. §9.6 eqs. 9-39 to 9-41 [M]). @internal */
export function j2SecularRatesTrusted(el: KeplerianElements, constants: ConstantSet): J2SecularRates {
  const { semiMajorAxis: a, eccentricity: e, inclination: i } = el;
  const n = Math.sqrt(constants.gm / (a * a * a));
  const oneMinusE2 = (1 - e) * (1 + e);
  const ratio = constants.equatorialRadius / (a * oneMinusE2);
  const k = n * constants.j2 * ratio * ratio;
  const sin2i = Math.sin(i) ** 2;
  return {
    raanRate: -1.5 * k * Math.cos(i),
    argumentOfPerigeeRate: 0.75 * k * (4 - 5 * sin2i),
    meanAnomalyRate: n + 0.75 * k * Math.sqrt(oneMinusE2) * (2 - 3 * sin2i),
  };
}

/**
 * Secular rates of Ω, ω and M under J2 for mean elements, with p = a(1 − e²) and n = √(GM/a³):
 *
 *   dΩ/dt = −(3/2) n J2 (R/p)² cos i
 *   dω/dt =  (3/4) n J2 (R/p)² (4 − 5 sin² i)
 *   dM/dt =  n + (3/4) n J2 (R/p)² √(1 − e²) (2 − 3 sin² i)
 *
 * @param elements   Mean elements (a in metres, angles in radians); only a, e and i are used.
 * @param options    `constants`: GM, equatorial radius R and J2 (default IERS 2010).
 * @returns The three rates, in rad/s.
 * @throws {InvalidArgumentError} for invalid elements, a perigee inside the Earth, a bad constant set, or a set
 *   passed positionally (the old `j2SecularRates(elements, set)`; write `{ constants: set }`).
 * @see D. A. Vallado, Fundamentals of Astrodynamics and Applications, 4th ed. (2013), §9.6, secular J2 rates [M];
 *   the same first-order rates in Kozai (1959) / Brouwer (1959) theory [M].
 */
export function j2SecularRates(elements: KeplerianElements, options?: ConstantsOptions): J2SecularRates {
  const set = readConstants('options', options);
  return j2SecularRatesTrusted(requireMeanElements(elements, 'elements', set), set);
}

/** Reduces an angle to [0, 2π). */
function wrap(angle: number): number {
  const r = angle % TWO_PI;
  const w = r < 0 ? r + TWO_PI : r;
  return w >= TWO_PI ? 0 : w;
}

/**
 * Mean elements after `dt` seconds of secular J2 motion: Ω, ω and M advance at the rates of
 * {@link j2SecularRates} (returned in [0, 2π)); a, e and i are unchanged.
 *
 * @param elements   Mean elements at t0 (a in metres, angles in radians).
 * @param dt         Time step, in seconds (may be negative).
 * @param options    `constants`: GM, R and J2 (default IERS 2010).
 * @returns Mean elements at t0 + dt.
 * @throws {InvalidArgumentError} as {@link j2SecularRates} (a set passed positionally included), or for a
 *   non-finite `dt`.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., §9.6 [M].
 */
export function propagateJ2Secular(
  elements: KeplerianElements,
  dt: Seconds,
  options?: ConstantsOptions,
): KeplerianElements {
  const set = readConstants('options', options);
  const el = requireMeanElements(elements, 'elements', set);
  const step = requireFinite('dt', dt, 'a finite time step in seconds');
  const rates = j2SecularRatesTrusted(el, set);
  return {
    ...el,
    raan: wrap(el.raan + rates.raanRate * step),
    argumentOfPerigee: wrap(el.argumentOfPerigee + rates.argumentOfPerigeeRate * step),
    meanAnomaly: wrap(el.meanAnomaly + rates.meanAnomalyRate * step),
  };
}
