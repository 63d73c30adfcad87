/**
 * The periodic relativistic clock correction of an eccentric orbit (the Δt_r of GNSS
 * interface specifications, Δτ^per of the IERS Conventions).
 *
 * Sign: the returned correction is the quantity Δt_r that a user ADDS to the broadcast clock
 * offset Δt_sv (t = t_sv − Δt_sv); F = −2√GM/c² < 0, so Δt_r < 0 on the way out from perigee
 * (0 < E < π), where the satellite clock has run slow relative to its orbit-mean rate.
 *
 * @module
 */

import { type ConstantsOptions, SPEED_OF_LIGHT_SQUARED } from '../constants.js';
import { readConstants } from '../internal/options.js';
import { requireEccentricity, requireFinite, requireOrbitRadius } from '../internal/validate.js';
import { requireStateVector, type StateVector } from '../orbit/elements.js';
import { solveKepler } from '../orbit/kepler.js';
import type { Dimensionless, Metres, Radians, Seconds } from '../units.js';

/**
 * Periodic relativistic correction from orbital elements:
 *   Δt_r = F·e·√a·sin E,   F = −2√GM/c²   (= −(2/c²)·√(GM a)·e·sin E)
 *
 * Use the osculating (or broadcast) a and e and the eccentric anomaly E at the epoch.
 * For GPS (e ≤ 0.02) the magnitude is at most ≈ 46 ns (IERS 2010 §10.2 text [V1]).
 *
 * @param semiMajorAxis     a, in metres.
 * @param eccentricity      e, dimensionless, 0 ≤ e < 1.
 * @param eccentricAnomaly  E, in radians.
 * @param options           `constants`: the set giving F (default IERS 2010; `{ constants: GPS_ICD }` for IS-GPS-200 conformance).
 * @returns Δt_r, in seconds (added to Δt_sv).
 * @throws {InvalidArgumentError} for a semi-major axis that is not a plausible orbit radius in metres,
 *   e outside [0, 1), a non-finite E or a malformed constant set.
 * @see IS-GPS-200 §20.3.3.3.3.1 [M]; IERS Conventions (2010) §10.2 eq. 10.10 [V1].
 */
export function periodicCorrectionFromElements(
  semiMajorAxis: Metres,
  eccentricity: Dimensionless,
  eccentricAnomaly: Radians,
  options?: ConstantsOptions,
): Seconds {
  const a = requireOrbitRadius('semiMajorAxis', semiMajorAxis);
  const e = requireEccentricity('eccentricity', eccentricity);
  const E = requireFinite('eccentricAnomaly', eccentricAnomaly, 'a finite angle in radians');
  const set = readConstants('options', options);
  return set.relativisticF * e * Math.sqrt(a) * Math.sin(E);
}

/**
 * Periodic relativistic correction from an instantaneous state vector:
 *   Δt_r = −2·(r·v)/c²
 * Exactly equivalent to the element form on a Kepler orbit (r·v = √(GM a)·e·sin E); it may be
 * evaluated in an Earth-fixed or an inertial frame, since (ω × r)·r = 0.
 *
 * @param state  Position (m) and velocity (m/s), geocentric, inertial or Earth-fixed.
 * @returns Δt_r, in seconds (added to Δt_sv).
 * @throws {InvalidArgumentError} for non-finite components or a position inside the Earth.
 * @see IERS Conventions (2010) §10.2 eq. 10.11 [V1]; IS-GPS-200 §20.3.3.3.3.1 "equivalent expression" [V2].
 */
export function periodicCorrectionFromState(state: StateVector): Seconds {
  const { position: p, velocity: v } = requireStateVector(state);
  requireOrbitRadius('|state.position|', Math.hypot(p[0], p[1], p[2]));
  return (-2 * (p[0] * v[0] + p[1] * v[1] + p[2] * v[2])) / SPEED_OF_LIGHT_SQUARED;
}

/**
 * Amplitude of the periodic correction: 2·√(GM a)·e/c² (= |F|·e·√a), positive.
 * IERS 2010: "about 2.29 µs × e" at GPS altitude [V1].
 *
 * @param semiMajorAxis  a, in metres.
 * @param eccentricity   e, dimensionless, 0 ≤ e < 1.
 * @param options        `constants`: the set giving GM (default IERS 2010).
 * @returns The amplitude, in seconds.
 * @throws {InvalidArgumentError} for an implausible a, e outside [0, 1) or a malformed constant set.
 * @see IERS Conventions (2010) §10.2 eq. 10.10 and text [V1].
 */
export function periodicAmplitude(
  semiMajorAxis: Metres,
  eccentricity: Dimensionless,
  options?: ConstantsOptions,
): Seconds {
  const a = requireOrbitRadius('semiMajorAxis', semiMajorAxis);
  const e = requireEccentricity('eccentricity', eccentricity);
  const set = readConstants('options', options);
  return -set.relativisticF * e * Math.sqrt(a);
}

/** Result of {@link periodicCorrectionAtMeanAnomaly}. */
export interface PeriodicCorrection {
  /** Δt_r, in seconds (added to Δt_sv). */
  correctionSeconds: Seconds;
  /** 2√(GM a)e/c², in seconds. */
  amplitudeSeconds: Seconds;
  /** E solved from Kepler's equation, in radians. */
  eccentricAnomaly: Radians;
}

/**
 * Periodic correction at a mean anomaly: solves M = E − e sin E, then Δt_r = F·e·√a·sin E.
 *
 * @param semiMajorAxis  a, in metres.
 * @param eccentricity   e, dimensionless, 0 ≤ e < 1.
 * @param meanAnomaly    M, in radians.
 * @param options        `constants`: the set giving F (default IERS 2010).
 * @returns `{ correctionSeconds, amplitudeSeconds, eccentricAnomaly }`.
 * @throws {InvalidArgumentError} as {@link periodicCorrectionFromElements}, or for a non-finite M.
 * @see IS-GPS-200 §20.3.3.3.3.1 and Table 20-IV [M]; IERS Conventions (2010) eq. 10.10 [V1].
 */
export function periodicCorrectionAtMeanAnomaly(
  semiMajorAxis: Metres,
  eccentricity: Dimensionless,
  meanAnomaly: Radians,
  options?: ConstantsOptions,
): PeriodicCorrection {
  const a = requireOrbitRadius('semiMajorAxis', semiMajorAxis);
  const e = requireEccentricity('eccentricity', eccentricity);
  const constants = readConstants('options', options);
  const eccentricAnomaly = solveKepler(meanAnomaly, e);
  return {
    correctionSeconds: periodicCorrectionFromElements(a, e, eccentricAnomaly, { constants }),
    amplitudeSeconds: periodicAmplitude(a, e, { constants }),
    eccentricAnomaly,
  };
}
