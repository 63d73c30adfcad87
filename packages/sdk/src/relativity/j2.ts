/**
 * Clock terms caused by the Earth's oblateness (J2), for near-circular orbits, to first order in J2.
 *
 * Starting point (our own derivation [C] from IERS Conventions 2010 §10.2 eq. 10.9 [V1]; consistent with
 * Kouba 2004 [V2 abstract]): with U = GM/r + U_J2 and the energy ε = v²/2 − U conserved in the axisymmetric field,
 *   τ − t = L_G·t + (3ε/c²)·t − 2 r·v/c² − (4/c²)·∫ U_J2 dt.
 * The conventional correction −2 r·v/c² (IERS eq. 10.11) removes the second term; the last term
 * leaves a 6-hour residual (Kouba 2004) and a constant rate.
 *
 * Which semi-major axis: the point-mass rate L_G − 3GM/(2ac²) is only right for the right a. Under J2
 * the osculating a (from vis-viva at one epoch) oscillates by (3/2)·J2·(a_e²/a)·sin²i·cos 2u (≈ ±1.7 km at
 * GPS altitude), i.e. ±1.6e-14 of rate (±1.3 ns/day) [C]. {@link j2SecularClockRate} therefore asks which a
 * it is given.
 *
 * @module
 */

import { type ConstantSet, type ConstantsOptions, SECONDS_PER_DAY, SPEED_OF_LIGHT_SQUARED } from '../constants.js';
import { InvalidArgumentError, OutOfDomainError } from '../errors.js';
import { at } from '../internal/checked.js';
import { readConstants } from '../internal/options.js';
import { requireEccentricity, requireFinite, requireInRange, requireOrbitRadius } from '../internal/validate.js';
import { requireStateVector, type StateVector } from '../orbit/elements.js';
import { integrateDop853 } from '../orbit/integrator.js';
import type { Dimensionless, Metres, Radians, Seconds } from '../units.js';

function checkInclination(inclination: unknown): number {
  return requireInRange('inclination', inclination, 0, Math.PI, { unit: 'rad (did you give degrees?)' });
}

/** J2·(a_e²/c²)·√(GM/a³)·sin²i·sin 2u, the shape shared by both periodic J2 terms below, with their input checks. */
function j2SinTwoUTerm(
  semiMajorAxis: Metres,
  inclination: Radians,
  argumentOfLatitude: Radians,
  constants: ConstantSet,
): Seconds {
  const a = requireOrbitRadius('semiMajorAxis', semiMajorAxis);
  const i = checkInclination(inclination);
  const u = requireFinite('argumentOfLatitude', argumentOfLatitude, 'a finite angle in radians');
  return j2Scale(a, constants) * Math.sin(i) ** 2 * Math.sin(2 * u);
}

/**
 * Kouba's J2 periodic residual: what remains of the J2 clock effect after the conventional
 * correction −2 r·v/c² is applied,
 *   Δτ_J2,res = −(3/2)·J2·(a_e²/c²)·√(GM/a³)·sin²i·sin 2u   (period: half the orbital period, ≈ 6 h for GNSS).
 *
 * @param semiMajorAxis       a, metres (mean or osculating; the amplitude changes by < 1e-4 relative).
 * @param inclination         i, radians, in [0, π].
 * @param argumentOfLatitude  u = ω + ν, radians.
 * @param options             `constants`: GM, J2, a_e (default IERS 2010).
 * @returns Δτ_J2,res in seconds: the periodic part that τ − t still contains after −2 r·v/c² is removed.
 * Accuracy: first order in J2, e ≈ 0 (terms in e·J2 omitted, < 1 % of the amplitude for e < 0.01);
 * reproduces a numerical integration to 5 digits for GPS (our own independent integration [C]; SDK reference tests).
 * @throws {InvalidArgumentError} for a non-plausible a, i outside [0, π] or a non-finite u.
 * @see J. Kouba, GPS Solutions 8(3):170–180 (2004) [V2 abstract; formula M, verified numerically C];
 *   IERS Conventions (2010) §10.2 ("6-h term due to J2") [V1].
 */
export function j2ResidualPeriodicTerm(
  semiMajorAxis: Metres,
  inclination: Radians,
  argumentOfLatitude: Radians,
  options?: ConstantsOptions,
): Seconds {
  const constants = readConstants('options', options);
  return -1.5 * j2SinTwoUTerm(semiMajorAxis, inclination, argumentOfLatitude, constants);
}

/**
 * The total periodic J2 clock term, without the −2 r·v/c² convention (what a clock on a
 * near-circular orbit shows relative to a uniform rate, from the J2 part of the potential and the
 * J2-forced radial motion δr = (J2 a_e²/(4a))·sin²i·cos 2u):
 *   Δτ_J2,tot ≈ −(1/2)·J2·(a_e²/c²)·√(GM/a³)·sin²i·sin 2u.
 *
 * @param semiMajorAxis       a (mean), metres.
 * @param inclination         i, radians.
 * @param argumentOfLatitude  u, radians.
 * @param options             `constants`: GM, J2, a_e (default IERS 2010).
 * @returns Seconds.
 * Accuracy: first order in J2, e ≈ 0, and only for an orbit without free (initial-condition)
 * eccentricity; an orbit started from an osculating circular state shows a sin 2u term up to ≈ 10 %
 * different (our own numerical integration [C]).
 * @throws {InvalidArgumentError} as {@link j2ResidualPeriodicTerm}.
 * @see N. Ashby, PTTI 33 (2001) 509–524, abstract: amplitude 0.695e-14 in frequency [V2]; our own derivation [C]
 *   (δr from D. Brouwer, Astron. J. 64 (1959) 378, short-period terms [M]).
 */
export function j2TotalPeriodicTerm(
  semiMajorAxis: Metres,
  inclination: Radians,
  argumentOfLatitude: Radians,
  options?: ConstantsOptions,
): Seconds {
  const constants = readConstants('options', options);
  return -0.5 * j2SinTwoUTerm(semiMajorAxis, inclination, argumentOfLatitude, constants);
}

/** Amplitudes and period of the J2 periodic clock terms. */
export interface J2PeriodicAmplitudes {
  /** Amplitude of {@link j2ResidualPeriodicTerm}, (3/2)·J2·a_e²·n·sin²i/c², seconds. */
  residualAmplitude: Seconds;
  /** Amplitude of {@link j2TotalPeriodicTerm}, (1/2)·J2·a_e²·n·sin²i/c², seconds. */
  totalAmplitude: Seconds;
  /** Fractional-frequency amplitude of the total term, J2·a_e²·n²·sin²i/c², dimensionless (Ashby 2001: 0.695e-14 for GPS). */
  totalFrequencyAmplitude: Dimensionless;
  /** Period of the sin 2u terms, π/n, seconds (≈ 6 h for GNSS MEO). */
  period: Seconds;
}

/**
 * Amplitudes of the J2 periodic clock terms for a near-circular orbit.
 * @param semiMajorAxis a, metres. @param inclination i, radians. @param options `constants` (default IERS 2010).
 * @returns See {@link J2PeriodicAmplitudes}.
 * @throws {InvalidArgumentError} for a non-plausible a or i outside [0, π].
 * @see Kouba (2004) [V2]; Ashby, PTTI 33 (2001), abstract [V2]; amplitudes recomputed independently [C].
 */
export function j2PeriodicAmplitudes(
  semiMajorAxis: Metres,
  inclination: Radians,
  options?: ConstantsOptions,
): J2PeriodicAmplitudes {
  const constants = readConstants('options', options);
  const a = requireOrbitRadius('semiMajorAxis', semiMajorAxis);
  const i = checkInclination(inclination);
  const s2 = Math.sin(i) ** 2;
  const k = j2Scale(a, constants);
  const n = Math.sqrt(constants.gm / a ** 3);
  return {
    residualAmplitude: 1.5 * k * s2,
    totalAmplitude: 0.5 * k * s2,
    totalFrequencyAmplitude: k * n * s2,
    period: Math.PI / n,
  };
}

/** J2·(a_e²/c²)·√(GM/a³), seconds: the common scale of the Kouba residual and total term (our own derivation [C]). */
function j2Scale(a: number, c: ConstantSet): number {
  return (c.j2 * c.equatorialRadius ** 2 * Math.sqrt(c.gm / a ** 3)) / SPEED_OF_LIGHT_SQUARED;
}

/**
 * Osculating minus mean semi-major axis under J2 for a near-circular orbit (short-period term):
 *   a_osc − ā = (3/2)·J2·(a_e²/ā)·sin²i·cos 2u,
 * where ā is the orbit average of the osculating a (vis-viva a = 1/(2/r − v²/GM)).
 *
 * @param meanSemiMajorAxis ā, metres. @param inclination i, radians. @param argumentOfLatitude u, radians.
 * @param options `constants` (default IERS 2010).
 * @returns a_osc − ā, metres (≈ +1.67 km at the node for GPS, 55°).
 * Accuracy: first order in J2 and e; consistent with energy conservation (the cos 2u parts of
 * −GM/(2a_osc) and −U_J2 cancel) [C].
 * @throws {InvalidArgumentError} for a non-plausible a, i outside [0, π] or a non-finite u.
 * @see D. Brouwer, Astron. J. 64 (1959) 378 (short-period terms, e → 0) [M]; checked by energy conservation [C].
 */
export function osculatingMinusMeanSemiMajorAxis(
  meanSemiMajorAxis: Metres,
  inclination: Radians,
  argumentOfLatitude: Radians,
  options?: ConstantsOptions,
): Metres {
  const constants = readConstants('options', options);
  const a = requireOrbitRadius('meanSemiMajorAxis', meanSemiMajorAxis);
  const i = checkInclination(inclination);
  const u = requireFinite('argumentOfLatitude', argumentOfLatitude, 'a finite angle in radians');
  return 1.5 * constants.j2 * (constants.equatorialRadius ** 2 / a) * Math.sin(i) ** 2 * Math.cos(2 * u);
}

/** Which semi-major axis a J2 rate is computed from. */
export type SemiMajorAxisKind = 'mean' | 'osculating';

/** Secular (mean) clock rate under J2 and its parts. */
export interface J2RateBreakdown {
  /** dτ/dTT − 1 averaged over the orbit, dimensionless (positive = clock fast vs TT). */
  fractionalRate: Dimensionless;
  /** L_G − 3GM/(2ac²) with the a given (the point-mass formula), dimensionless. */
  pointMassRate: Dimensionless;
  /** fractionalRate − pointMassRate: what J2 adds for that choice of a, dimensionless. */
  j2Correction: Dimensionless;
  /** fractionalRate × 86 400 s × 1e6, µs per day. */
  microsecondsPerDay: number;
  /** The semi-major axis used and which kind it is. */
  semiMajorAxis: Metres;
  semiMajorAxisKind: SemiMajorAxisKind;
  /** Orbit-averaged J2 potential ⟨U_J2⟩, m²/s². */
  meanJ2Potential: number;
  /** Name of the constant set. */
  constants: string;
}

/** ⟨U_J2⟩ = −(GM J2 a_e²/(2a³))·(1 − e²)^(−3/2)·((3/2) sin²i − 1) (time average; ⟨sin²u/r³⟩ = ⟨1/r³⟩/2 exactly) [C]. */
function meanJ2Potential(a: number, e: number, i: number, c: ConstantSet): number {
  return (-(c.gm * c.j2 * c.equatorialRadius ** 2) / (2 * a ** 3)) * (1 - e * e) ** -1.5 * (1.5 * Math.sin(i) ** 2 - 1);
}

/**
 * Smallest perigee radius a(1 − e) for which {@link j2SecularClockRate} is documented, 25 000 km: above it the
 * first-order formula agrees with the integrated proper time to < 1e-17 (test/reference/j2-secular-rate); below it
 * the error reaches 1.0e-17 at 20 100 km (98.2°), 7.6e-16 (LEO, 51.6°), 2.5e-15 (sun-synchronous) and 2.2e-15 (Molniya) [C].
 */
export const J2_ANALYTIC_MIN_PERIGEE_RADIUS: Metres = 25_000_000;

/**
 * Secular clock rate vs TT under J2 from a stated kind of semi-major axis.
 *
 * Formula [C] (first order in J2): rate = L_G + 3ε/c² − 4⟨U_J2⟩/c², with ε the conserved energy.
 * - `mean` (ā = orbit average of the osculating a): ε = −GM/(2ā) − ⟨U_J2⟩, so
 *   rate = L_G − 3GM/(2āc²) − 7⟨U_J2⟩/c².
 * - `osculating` (a from vis-viva at an epoch where the argument of latitude is u, near-circular):
 *   ε = −GM/(2a) − U_J2(a, u), U_J2(a, u) = −(GM J2 a_e²/(2a³))(3 sin²i sin²u − 1), so
 *   rate = L_G − 3GM/(2ac²) − 3U_J2(a, u)/c² − 4⟨U_J2⟩/c²  (for GPS at the node: −1.55e-14 vs the point-mass formula,
 *   ≈ 1.3 ns/day, our own numerical integration [C]). Prefer {@link j2SecularClockRateFromState} when you have the state.
 *
 * @param orbit `{ semiMajorAxis (m), eccentricity, inclination (rad), semiMajorAxisKind, argumentOfLatitude (rad, required for osculating) }`.
 * @param options `constants` (default IERS 2010).
 * @returns {@link J2RateBreakdown}.
 * Domain: perigee radius a(1 − e) ≥ {@link J2_ANALYTIC_MIN_PERIGEE_RADIUS} (25 000 km: GNSS MEO, IGSO, GEO).
 * Accuracy there: first order in J2; `mean` (with time-averaged osculating a, e, i) agrees with the long-run slope of the
 * integrated proper time to < 1e-17 (measured ≈ 1e-18 for GNSS MEO and GEO, test/reference/j2-secular-rate);
 * `osculating` assumes e ≈ 0. Below 25 000 km (LEO, HEO perigees) the first-order averaging errs by up to a few
 * 1e-15 and the function refuses: use {@link j2SecularClockRateFromState}.
 * @throws {InvalidArgumentError} for a non-plausible a, e outside [0, 1), i outside [0, π], an unknown kind, or a missing u.
 * @throws {OutOfDomainError} for a perigee radius below 25 000 km.
 * @see IERS Conventions (2010) §10.2 [V1]; Kouba (2004) abstract ("up to 0.2 ns/day") [V2]; our own derivation [C].
 */
export function j2SecularClockRate(
  orbit: {
    semiMajorAxis: Metres;
    eccentricity: Dimensionless;
    inclination: Radians;
    semiMajorAxisKind: SemiMajorAxisKind;
    argumentOfLatitude?: Radians;
  },
  options?: ConstantsOptions,
): J2RateBreakdown {
  const constants = readConstants('options', options);
  if (typeof orbit !== 'object' || orbit === null)
    throw new InvalidArgumentError(
      'orbit',
      orbit,
      'an object { semiMajorAxis, eccentricity, inclination, semiMajorAxisKind }',
    );
  const a = requireOrbitRadius('orbit.semiMajorAxis', orbit.semiMajorAxis);
  const e = requireEccentricity('orbit.eccentricity', orbit.eccentricity);
  const i = requireInRange('orbit.inclination', orbit.inclination, 0, Math.PI, { unit: 'rad (did you give degrees?)' });
  const kind = orbit.semiMajorAxisKind;
  if (kind !== 'mean' && kind !== 'osculating') {
    throw new InvalidArgumentError(
      'orbit.semiMajorAxisKind',
      kind,
      '"mean" or "osculating"',
      'the rate differs by up to ≈ 1.6e-14 (1.3 ns/day at GPS altitude) between the two',
    );
  }
  const perigee = a * (1 - e);
  if (perigee < J2_ANALYTIC_MIN_PERIGEE_RADIUS) {
    throw new OutOfDomainError(
      'orbit.semiMajorAxis × (1 − orbit.eccentricity)',
      perigee,
      `${J2_ANALYTIC_MIN_PERIGEE_RADIUS} m`,
      '∞',
      'the first-order averaged formula errs by up to a few 1e-15 of rate at LEO and for HEO perigees; ' +
        "use j2SecularClockRateFromState with the orbit's state vector there",
    );
  }
  const c2 = SPEED_OF_LIGHT_SQUARED;
  const meanU = meanJ2Potential(a, e, i, constants);
  const pointMassRate = constants.lG - (1.5 * constants.gm) / (a * c2);
  let rate: number;
  if (kind === 'mean') {
    rate = pointMassRate - (7 * meanU) / c2;
  } else {
    const u = requireFinite(
      'orbit.argumentOfLatitude',
      orbit.argumentOfLatitude,
      'a finite angle in radians (the osculating a depends on where on the orbit it was taken)',
    );
    const uJ2 =
      (-(constants.gm * constants.j2 * constants.equatorialRadius ** 2) / (2 * a ** 3)) *
      (3 * Math.sin(i) ** 2 * Math.sin(u) ** 2 - 1);
    rate = pointMassRate - (3 * uJ2) / c2 - (4 * meanU) / c2;
  }
  return {
    fractionalRate: rate,
    pointMassRate,
    j2Correction: rate - pointMassRate,
    microsecondsPerDay: rate * SECONDS_PER_DAY * 1e6,
    semiMajorAxis: a,
    semiMajorAxisKind: kind,
    meanJ2Potential: meanU,
    constants: constants.name,
  };
}

/** Number of Kepler periods of the averaging window of {@link j2SecularClockRateFromState}. */
export const J2_AVERAGING_ORBITS = 8;

/**
 * Time average ⟨U_J2⟩ (m²/s²) along the J2 orbit from a state, by numerical propagation (our own method [C]):
 *   ⟨U_J2⟩ ≈ ∫ w(t)·U_J2(r(t)) dt / ∫ w(t) dt,  w(t) = sin⁴(πt/W),  W = 8 Kepler periods,
 * with U_J2 = −(GM J2 a_e²/(2r³))(3z²/r² − 1) (IERS Conventions 2010 §10.2 form [V1]) and the orbit from
 * {@link integrateDop853} under point mass + J2. The sin⁴ (Hann²) window's leakage falls as f⁻⁵
 * (F. J. Harris, Proc. IEEE 66 (1978) 51–83, cosᵅ windows [M]), so the 1/rev and 2/rev terms of U_J2 leave
 * < 1e-18 of rate; ∫w dt = 3W/8.
 */
function windowedMeanJ2Potential(
  p: readonly [number, number, number],
  v: readonly [number, number, number],
  period: number,
  constants: ConstantSet,
): number {
  const gm = constants.gm;
  const k = gm * constants.j2 * constants.equatorialRadius ** 2;
  const rMin = constants.equatorialRadius;
  const window = J2_AVERAGING_ORBITS * period;
  const w = Math.PI / window;
  const uJ2 = (x: number, y: number, z: number): number => {
    const r2 = x * x + y * y + z * z;
    return (-k / (2 * r2 * Math.sqrt(r2))) * ((3 * z * z) / r2 - 1);
  };
  // Hot (every stage of every step): y is the 7-component state (position, velocity, weighted integral) of y0 below.
  const rhs = (t: number, y: Float64Array, dy: Float64Array): void => {
    const x = y[0]!;
    const yy = y[1]!;
    const z = y[2]!;
    const r2 = x * x + yy * yy + z * z;
    const r = Math.sqrt(r2);
    const r3 = r2 * r;
    // ∇(GM/r + U_J2), as createGravityField('j2') (Montenbruck & Gill 2000 §3.2, zonal n = 2 [M]).
    const s = (-1.5 * k) / (r3 * r2);
    const q = (5 * z * z) / r2;
    dy[0] = y[3]!;
    dy[1] = y[4]!;
    dy[2] = y[5]!;
    dy[3] = (-gm * x) / r3 + s * x * (1 - q);
    dy[4] = (-gm * yy) / r3 + s * yy * (1 - q);
    dy[5] = (-gm * z) / r3 + s * z * (3 - q);
    dy[6] = Math.sin(w * t) ** 4 * uJ2(x, yy, z);
  };
  const scale = Math.abs(k) / rMin ** 3;
  const rtol = 1e-12;
  const result = integrateDop853(rhs, 0, [...p, ...v, 0], window, {
    relativeTolerance: rtol,
    absoluteTolerance: [rtol, rtol, rtol, rtol * 1e-3, rtol * 1e-3, rtol * 1e-3, rtol * scale * period],
    sampleTimes: [window],
    onStep(t, y) {
      const r = Math.hypot(at(y, 0, 'y'), at(y, 1, 'y'), at(y, 2, 'y'));
      if (r <= rMin) {
        throw new OutOfDomainError(
          'trajectory radius',
          r,
          `${rMin} m (the Earth's equatorial radius)`,
          '∞',
          `the orbit from this state enters the Earth by t = ${t} s; check the state (units m and m/s)`,
        );
      }
    },
  });
  return at(result.samples, 6, 'samples') / ((3 * window) / 8); // the 7th component: the weighted integral
}

/**
 * Secular clock rate vs TT under J2 from an osculating state (exact energy, no choice of a to get wrong):
 *   rate = L_G + 3ε/c² − 4⟨U_J2⟩/c²,  ε = v²/2 − GM/r − U_J2(r)  (conserved),
 * where ⟨U_J2⟩ is the long-run time average of U_J2 along the actual J2 orbit. The formula is exact in the
 * axisymmetric field: with U = GM/r + U_J2, the virial identity ⟨d(r·v)/dt⟩ = 0 gives ⟨v²⟩ = ⟨GM/r⟩ + 3⟨U_J2⟩
 * (U_J2 is homogeneous of degree −3), so ⟨U + v²/2⟩ = −3ε + 4⟨U_J2⟩ [C]. ⟨U_J2⟩ is computed by propagating the
 * orbit over {@link J2_AVERAGING_ORBITS} Kepler periods with a smooth window (not from osculating elements,
 * whose first-order averaging formula is off by ≈ 1e-15 of rate at LEO).
 *
 * @param state Geocentric inertial position (m) and velocity (m/s), z along the rotation axis.
 * @param options `constants` (default IERS 2010).
 * @returns {@link J2RateBreakdown} with `semiMajorAxisKind: 'osculating'` and a = −GM/(2(v²/2 − GM/r));
 *   `meanJ2Potential` is the propagated ⟨U_J2⟩.
 * Accuracy: agrees with the long-run slope of {@link integrateProperTime} (model `j2`, whole-orbit sampling over
 * 20–40 orbits) to < 2e-17 for LEO (7000 km, 51.6°), sun-synchronous (7078 km, 98.2°), GNSS MEO, GEO and Molniya
 * (e = 0.74, 63.4°) orbits (test/reference/j2-terms). Long-period terms (ω precession of an eccentric orbit) are
 * averaged only over the 8-orbit window: the rate is the mean over the next 8 orbits.
 * Cost: one propagation of 8 orbits (≈ 1–2 thousand integrator steps).
 * @throws {InvalidArgumentError} for a non-finite state, a position inside the Earth or an unbound orbit.
 * @throws {OutOfDomainError} if the orbit from the state enters the Earth within the averaging window.
 * @see IERS Conventions (2010) §10.2 eq. 10.9 [V1]; our own derivation and method [C] (see the module comment).
 */
export function j2SecularClockRateFromState(state: StateVector, options?: ConstantsOptions): J2RateBreakdown {
  const constants = readConstants('options', options);
  const { position: p, velocity: v } = requireStateVector(state);
  const r = requireOrbitRadius('|state.position|', Math.hypot(p[0], p[1], p[2]));
  if (r <= constants.equatorialRadius)
    throw new InvalidArgumentError(
      '|state.position|',
      r,
      `above the Earth's equatorial radius (${constants.equatorialRadius} m)`,
    );
  const gm = constants.gm;
  const c2 = SPEED_OF_LIGHT_SQUARED;
  const v2 = v[0] ** 2 + v[1] ** 2 + v[2] ** 2;
  const keplerEnergy = v2 / 2 - gm / r;
  if (!(keplerEnergy < 0))
    throw new InvalidArgumentError(
      'state.velocity',
      v,
      `below escape speed (${Math.sqrt((2 * gm) / r)} m/s at this radius)`,
    );
  const a = -gm / (2 * keplerEnergy);
  const uJ2 = (-(gm * constants.j2 * constants.equatorialRadius ** 2) / (2 * r ** 3)) * ((3 * p[2] ** 2) / r ** 2 - 1);
  const energy = keplerEnergy - uJ2;
  const period = 2 * Math.PI * Math.sqrt(a ** 3 / gm);
  const meanU = windowedMeanJ2Potential(p, v, period, constants);
  const rate = constants.lG + (3 * energy) / c2 - (4 * meanU) / c2;
  const pointMassRate = constants.lG - (1.5 * gm) / (a * c2);
  return {
    fractionalRate: rate,
    pointMassRate,
    j2Correction: rate - pointMassRate,
    microsecondsPerDay: rate * SECONDS_PER_DAY * 1e6,
    semiMajorAxis: a,
    semiMajorAxisKind: 'osculating',
    meanJ2Potential: meanU,
    constants: constants.name,
  };
}

/**
 * Inclination and argument of latitude of a state (internal helper shared with the batch APIs).
 * Returns [i, u]; for an equatorial orbit (sin i = 0) u is the true longitude.
 */
export function inclinationAndArgumentOfLatitude(
  x: number,
  y: number,
  z: number,
  vx: number,
  vy: number,
  vz: number,
): [number, number] {
  const hx = y * vz - z * vy;
  const hy = z * vx - x * vz;
  const hz = x * vy - y * vx;
  const hn = Math.hypot(hx, hy, hz);
  const i = Math.acos(Math.max(-1, Math.min(1, hz / hn)));
  const nx = -hy;
  const ny = hx;
  const nn = Math.hypot(nx, ny);
  if (nn === 0 || nn / hn < 1e-14) return [i, Math.atan2(y, x)];
  // u from the node direction N̂ = ẑ × ĥ and ĥ × N̂ (both in the orbit plane); standard geometry, common practice, no source.
  const cosU = (x * nx + y * ny) / nn;
  const px = (hy * 0 - hz * ny) / (hn * nn);
  const py = (hz * nx - hx * 0) / (hn * nn);
  const pz = (hx * ny - hy * nx) / (hn * nn);
  const sinU = x * px + y * py + z * pz;
  return [i, Math.atan2(sinU, cosU)];
}
