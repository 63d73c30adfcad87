/**
 * Constant ("factory") and instantaneous rate of an orbiting clock relative to TT or TCG.
 *
 * Sign convention used throughout: a rate is dτ/dt − 1, where τ is the satellite clock's
 * proper time and t the reference scale. Positive means the satellite clock runs FAST.
 *
 * @module
 */

import { FLIGHT_CONFIGURATION_CAUTION } from '../caution.js';
import { type ConstantSet, type ConstantsOptions, SECONDS_PER_DAY, SPEED_OF_LIGHT_SQUARED } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { constantsOf, readOptions } from '../internal/options.js';
import { requireFinite, requireOrbitRadius } from '../internal/validate.js';
import { requireStateVector, type StateVector } from '../orbit/elements.js';
import type { Dimensionless, Metres } from '../units.js';

/** The coordinate time a rate refers to: TT (clocks on the geoid) or TCG (geocentric coordinate time). */
export type ReferenceClock = 'tt' | 'tcg';

/** The reference clocks accepted by the rate functions. */
export const REFERENCE_CLOCKS: readonly ReferenceClock[] = ['tt', 'tcg'];

/** Options shared by the rate functions. */
export interface RateOptions extends ConstantsOptions {
  /** Reference time scale; default `'tt'`. */
  reference?: ReferenceClock;
}

/** Mean rate of an orbiting clock and its split into gravitational and velocity parts. */
export interface RateBreakdown {
  /**
   * Satellite clock rate relative to the reference, minus 1 (dτ/dt − 1), dimensionless.
   * Positive = the satellite clock runs fast.
   */
  fractionalRate: Dimensionless;
  /** Gravitational (potential-difference) part of `fractionalRate`, dimensionless. */
  gravitational: Dimensionless;
  /** Velocity (second-order Doppler) part of `fractionalRate`, dimensionless. */
  velocity: Dimensionless;
  /** `fractionalRate` × 86 400 s × 1e6: microseconds gained per day. */
  microsecondsPerDay: number;
  /**
   * Fractional frequency offset to build into the oscillator on the ground so that in orbit
   * it keeps the reference rate: 1/(1 + fractionalRate) − 1, dimensionless (negative for GNSS orbits).
   */
  factoryOffset: Dimensionless;
  /** Reference time scale of the rate. */
  reference: ReferenceClock;
  /** Name of the constant set used. */
  constants: string;
  /** Semi-major axis the rate was computed for, in metres. */
  semiMajorAxis: Metres;
  /** The factory offset feeds a flight configuration: {@link FLIGHT_CONFIGURATION_CAUTION}. */
  caution: string;
}

/**
 * Validates a reference-clock name.
 * @throws {InvalidArgumentError} naming the accepted values.
 */
export function requireReferenceClock(argument: string, value: unknown): ReferenceClock {
  if (value === 'tt' || value === 'tcg') return value;
  throw new InvalidArgumentError(
    argument,
    value,
    `one of ${REFERENCE_CLOCKS.join(', ')}`,
    typeof value === 'string' && (value.toLowerCase() === 'tt' || value.toLowerCase() === 'tcg')
      ? `use lower case: ${value.toLowerCase()}`
      : undefined,
  );
}

function resolveOptions(value: RateOptions | undefined): { constants: ConstantSet; reference: ReferenceClock } {
  const options = readOptions('options', value);
  const constants = constantsOf('options', options);
  const reference =
    options.reference === undefined ? 'tt' : requireReferenceClock('options.reference', options.reference);
  return { constants, reference };
}

/** Lowest geocentric distance accepted for a clock position, in metres: below the polar radius (6 356 752 m) with margin. */
const MIN_CLOCK_RADIUS = 6_300_000;

/**
 * Validates the geocentric distance of a clock, which may be on the ground (unlike an orbit's
 * semi-major axis): 6.3e6 m ≤ r ≤ 1e10 m, with the kilometre hint for values that fit in km.
 */
function requireClockRadius(argument: string, value: number): number {
  const expected = `a geocentric distance in metres, from ${MIN_CLOCK_RADIUS} m (below the Earth's polar radius) to 1e10 m`;
  const r = requireFinite(argument, value, expected);
  if (r < MIN_CLOCK_RADIUS || r > 1e10) {
    const hint =
      r > 0 && r < MIN_CLOCK_RADIUS && r * 1000 >= MIN_CLOCK_RADIUS && r * 1000 <= 1e10
        ? `${r} m is inside the Earth; were the coordinates given in km (${r} km = ${r * 1000} m)?`
        : undefined;
    throw new InvalidArgumentError(argument, value, expected, hint);
  }
  return r;
}

/**
 * −x/(1 + x) = 1/(1 + x) − 1 without the cancellation of the direct form (algebraic identity): the factory
 * offset for a rate x, and equally the rate that a factory offset x compensates (the map is its own inverse).
 * @internal Shared with the review module; not exported from the package.
 */
export function reciprocalOffset(x: number): number {
  return -x / (1 + x);
}

/**
 * Rate of a clock with its own fractional offset c running on a platform whose rate is r: (1 + c)(1 + r) − 1,
 * evaluated as (c + r) + c·r (algebraic identity). With c ≈ −r (an offset that compensates the rate) c + r is exact
 * (Sterbenz's lemma), where the product form rounds 1 + c to a multiple of 2^-52 and loses everything below ~1e-16.
 * @internal Shared with the review module; not exported from the package.
 */
export function offsetClockRate(offset: Dimensionless, rate: Dimensionless): Dimensionless {
  return offset + rate + offset * rate;
}

/**
 * Sensitivity of the mean clock rate to the semi-major axis, d(L_G − 3GM/(2ac²))/da = 3GM/(2a²c²) per metre, the
 * same vs TT and TCG (derivative of IERS Conventions 2010 eq. 10.9 averaged [V1]; 9.429e-18 per metre near GPS
 * altitude, Ashby, PTTI 33 (2001) abstract [V2]; physics-refs §2 [C]). Unchecked, for any a and GM.
 * @internal Callers validate; not exported from the package.
 */
export function meanRateSensitivity(a: Metres, gm: number): number {
  return (3 * gm) / (2 * a * a * SPEED_OF_LIGHT_SQUARED);
}

/** The parts of a mean clock rate, dimensionless (see {@link meanClockRate}). @internal */
export interface MeanRateParts {
  fractionalRate: Dimensionless;
  gravitational: Dimensionless;
  velocity: Dimensionless;
}

/**
 * Mean rate of a Kepler-orbit clock for any a, GM and L_G, unchecked: fractionalRate = L_G − 3GM/(2ac²) vs TT,
 * −3GM/(2ac²) vs TCG (IERS Conventions 2010 eq. 10.9 averaged over the orbit [V1]; Ashby 2003 §5 [V1 text]).
 * The one formula behind {@link meanClockRate} and the review's what-if values (which evaluate deliberately
 * wrong a and GM that the public function would refuse).
 * @internal Callers validate; not exported from the package.
 */
export function meanRateParts(a: Metres, gm: number, lG: Dimensionless, reference: ReferenceClock): MeanRateParts {
  const potential = gm / (a * SPEED_OF_LIGHT_SQUARED);
  const geoid = reference === 'tt' ? lG : 0;
  return { fractionalRate: geoid - 1.5 * potential, gravitational: geoid - potential, velocity: -potential / 2 };
}

/**
 * Mean (orbit-averaged) rate of a clock on a Kepler orbit of semi-major axis a.
 *
 * From dτ/dTT = 1 + L_G − (v²/2 + U)/c² (IERS 2010 eq. 10.9) with v²/2 + GM/r = 2GM/r − GM/(2a):
 *   vs TT:  fractionalRate = L_G − 3GM/(2ac²);  gravitational = L_G − GM/(ac²);  velocity = −GM/(2ac²)
 *   vs TCG: fractionalRate = −3GM/(2ac²);       gravitational = −GM/(ac²);       velocity = −GM/(2ac²)
 * (vs TT the gravitational part is the potential difference W₀ − GM/a to the geoid, W₀ = L_G c²).
 * factoryOffset = 1/(1 + fractionalRate) − 1.
 *
 * Accuracy: point-mass Earth, no tidal terms. The eccentricity does not change the mean rate;
 * its periodic term is in `periodicCorrection*`. J2 changes the rate by ~1e-14 (Ashby 2003 §5 [V1 text]),
 * and individual satellites differ from the conventional value by up to 1e-13 (IERS 2010 §10.2 [V1]).
 * For GPS (a = 26 561 750 m, IERS constants): +4.464733e-10, 38.5753 µs/day (our own computation [C]).
 *
 * @param semiMajorAxis  a, in metres (above the Earth's radius; "26561.75" gets a kilometre hint).
 * @param options        `constants` (default IERS 2010), `reference` (`'tt'` default, or `'tcg'`).
 * @returns The {@link RateBreakdown}.
 * @throws {InvalidArgumentError} for a semi-major axis that is not a plausible orbit radius in metres,
 *   an unknown reference or a malformed constant set.
 * @see IERS Conventions (2010) §10.2 eqs. 10.7, 10.9 [V1]; N. Ashby, Living Rev. Relativity 6 (2003) §5 eqs. 28–34 [V1 text].
 */
export function meanClockRate(semiMajorAxis: Metres, options?: RateOptions): RateBreakdown {
  const a = requireOrbitRadius('semiMajorAxis', semiMajorAxis);
  const { constants, reference } = resolveOptions(options);
  const { fractionalRate, gravitational, velocity } = meanRateParts(a, constants.gm, constants.lG, reference);
  return {
    fractionalRate,
    gravitational,
    velocity,
    microsecondsPerDay: fractionalRate * SECONDS_PER_DAY * 1e6,
    factoryOffset: reciprocalOffset(fractionalRate),
    reference,
    constants: constants.name,
    semiMajorAxis: a,
    caution: FLIGHT_CONFIGURATION_CAUTION,
  };
}

/**
 * Instantaneous rate of a clock at a given inertial state (point-mass Earth), in orbit or on the ground:
 *   vs TT:  dτ/dTT − 1  = L_G − (v²/2 + GM/r)/c²   (IERS 2010 eq. 10.9)
 *   vs TCG: dτ/dTCG − 1 = −(v²/2 + GM/r)/c²        (IERS 2010 eq. 10.7)
 *
 * Accuracy: tidal terms (< 1e-15 up to GPS altitude, IERS 2010 §10.2) and J2 are omitted.
 *
 * @param state    Geocentric inertial position (m) and velocity (m/s).
 * @param options  `constants` (default IERS 2010), `reference` (`'tt'` default, or `'tcg'`).
 * @returns dτ/dt − 1, dimensionless (positive = clock runs fast).
 * @throws {InvalidArgumentError} for non-finite components, |position| below 6.3e6 m (inside the Earth) or
 *   above 1e10 m, or an unknown reference.
 * @see IERS Conventions (2010) §10.2 eqs. 10.7 and 10.9 [V1].
 */
export function instantaneousClockRate(state: StateVector, options?: RateOptions): Dimensionless {
  const { position: p, velocity: v } = requireStateVector(state);
  const r = requireClockRadius('|state.position|', Math.hypot(p[0], p[1], p[2]));
  const { constants, reference } = resolveOptions(options);
  const v2 = v[0] * v[0] + v[1] * v[1] + v[2] * v[2];
  return (reference === 'tt' ? constants.lG : 0) - (v2 / 2 + constants.gm / r) / SPEED_OF_LIGHT_SQUARED;
}

/**
 * Change of the mean clock rate when the semi-major axis changes from aBefore to aAfter:
 *   Δ = (3GM/(2c²))·(1/aBefore − 1/aAfter) = (3GM/(2c²))·(aAfter − aBefore)/(aBefore·aAfter)
 * (the same for TT and TCG, L_G cancels). Positive when the orbit is raised: the clock then runs faster.
 * Near GPS altitude dΔ/da ≈ 3GM/(2a²c²) = 9.429e-18 per metre (Ashby 2001 abstract [V2]; recomputed [C]).
 *
 * @param aBefore  Semi-major axis before the manoeuvre, in metres.
 * @param aAfter   Semi-major axis after the manoeuvre, in metres.
 * @param options  `constants` (default IERS 2010); `reference` is accepted for symmetry and does not change the result.
 * @returns Δ(dτ/dt − 1), dimensionless.
 * @throws {InvalidArgumentError} for semi-major axes that are not plausible orbit radii in metres.
 * @see N. Ashby, "Relativistic effects on SV clocks due to orbit changes, and due to Earth's oblateness",
 *   PTTI 33 (2001) 509–524 [V2 abstract]; derived from IERS Conventions (2010) eq. 10.9 [V1].
 */
export function rateChangeForSemiMajorAxisChange(
  aBefore: Metres,
  aAfter: Metres,
  options?: RateOptions,
): Dimensionless {
  const a0 = requireOrbitRadius('aBefore', aBefore);
  const a1 = requireOrbitRadius('aAfter', aAfter);
  const { constants } = resolveOptions(options);
  return ((1.5 * constants.gm) / SPEED_OF_LIGHT_SQUARED) * ((a1 - a0) / (a0 * a1));
}

/**
 * Semi-major axis whose mean rate vs TT equals `fractionalRate` (inverse of {@link meanClockRate}):
 *   a = 3GM / (2c²(L_G − fractionalRate)).
 * E.g. the conventional 4.4647e-10 of IS-GPS-200 [V2] corresponds to a = 26 561 400.1 m (IERS constants; our computation [C]).
 *
 * @param fractionalRate  Mean rate vs TT, dimensionless, below L_G.
 * @param options         `constants` (default IERS 2010); `reference` `'tcg'` uses L_G = 0.
 * @returns a, in metres.
 * @throws {InvalidArgumentError} if no orbit above the Earth's surface has that rate.
 * @see IERS Conventions (2010) eq. 10.9 [V1]; J. Kouba, GPS Solutions 8 (2004) 170–180, abstract [V2].
 */
export function semiMajorAxisForMeanRate(fractionalRate: Dimensionless, options?: RateOptions): Metres {
  const { constants, reference } = resolveOptions(options);
  const lG = reference === 'tt' ? constants.lG : 0;
  if (typeof fractionalRate !== 'number' || !Number.isFinite(fractionalRate) || !(fractionalRate < lG)) {
    throw new InvalidArgumentError(
      'fractionalRate',
      fractionalRate,
      `a finite number below ${lG} (${reference === 'tt' ? 'L_G' : '0'}), the rate of a clock at infinity`,
    );
  }
  const a = (1.5 * constants.gm) / (SPEED_OF_LIGHT_SQUARED * (lG - fractionalRate));
  return requireOrbitRadius('semiMajorAxis (from fractionalRate)', a);
}
