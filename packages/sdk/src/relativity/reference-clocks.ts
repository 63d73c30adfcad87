/**
 * Rates of reference clocks against TT: TT itself (the geoid), TCG, a clock at a ground station
 * (normal gravity potential of a named reference ellipsoid, rotation included) and a clock at, on or
 * orbiting the Moon.
 *
 * Sign convention: `rateVsTT` = dτ/dTT − 1, positive = the clock runs fast against TT.
 * A clock at rest on the rotating Earth has dτ/dTCG = 1 − W/c², W = gravity potential (gravitational
 * + centrifugal), and dτ/dTT = (1 − W/c²)/(1 − L_G) ≈ 1 + (W₀ − W)/c² with L_G = W₀/c²
 * (IERS Conventions 2010 §10.1–10.2) [V1].
 *
 * @module
 */

import { type ConstantsOptions, SECONDS_PER_DAY, SPEED_OF_LIGHT_SQUARED } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { constantsOf, readConstants, readOptions } from '../internal/options.js';
import { requireInRange } from '../internal/validate.js';
import { GM_MOON } from '../orbit/forces.js';
import type {
  CubicMetresPerSecondSquared,
  Dimensionless,
  Metres,
  Radians,
  RadiansPerSecond,
  SquareMetresPerSecondSquared,
} from '../units.js';

/** A level reference ellipsoid with its normal gravity field (four defining constants). */
export interface ReferenceEllipsoid {
  readonly name: string;
  /** Semi-major axis a, metres. */
  readonly semiMajorAxis: Metres;
  /** Flattening f, dimensionless. */
  readonly flattening: Dimensionless;
  /** GM including the atmosphere, m³/s². */
  readonly gm: CubicMetresPerSecondSquared;
  /** Angular velocity ω, rad/s. */
  readonly rotationRate: RadiansPerSecond;
  /** Normal potential on the ellipsoid U₀ as published, m²/s² (for checks and reports). */
  readonly publishedNormalPotential: SquareMetresPerSecondSquared;
  readonly source: string;
}

/**
 * GRS 80: a = 6 378 137 m, GM = 3.986005e14 m³/s², ω = 7.292115e-5 rad/s (defining), f = 1/298.257222101
 * (derived from the defining J2 = 108 263e-8); U₀ = 62 636 860.850 m²/s².
 */
export const GRS80_ELLIPSOID: ReferenceEllipsoid = Object.freeze({
  name: 'GRS80',
  semiMajorAxis: 6_378_137,
  flattening: 1 / 298.257222101,
  gm: 3.986005e14,
  rotationRate: 7.292115e-5,
  publishedNormalPotential: 62_636_860.85,
  source:
    'H. Moritz, "Geodetic Reference System 1980", Bulletin Géodésique 54 (1980) 395 / J. Geodesy 74 (2000) 128 [M]',
});

/** WGS 84: a = 6 378 137 m, 1/f = 298.257223563, GM = 3.986004418e14 m³/s², ω = 7.292115e-5 rad/s; U₀ = 62 636 851.7146 m²/s². */
export const WGS84_ELLIPSOID: ReferenceEllipsoid = Object.freeze({
  name: 'WGS84',
  semiMajorAxis: 6_378_137,
  flattening: 1 / 298.257223563,
  gm: 3.986004418e14,
  rotationRate: 7.292115e-5,
  publishedNormalPotential: 62_636_851.7146,
  source: 'NIMA TR8350.2, "Department of Defense World Geodetic System 1984", 3rd ed. (2000), Tables 3.1 and 3.4 [M]',
});

/** Ellipsoid parameters derived once: b, linear eccentricity E, q₀. */
function derived(ell: ReferenceEllipsoid): { a: number; b: number; E: number; q0: number } {
  const a = ell.semiMajorAxis;
  const b = a * (1 - ell.flattening);
  const E = Math.sqrt(a * a - b * b);
  return { a, b, E, q0: qOf(b, E) };
}

/** q(u) = ½[(1 + 3u²/E²)·arctan(E/u) − 3u/E] (Heiskanen & Moritz 1967, eq. 2-57) [M]. */
function qOf(u: number, E: number): number {
  return 0.5 * ((1 + (3 * u * u) / (E * E)) * Math.atan(E / u) - (3 * u) / E);
}

function checkEllipsoid(ell: unknown): ReferenceEllipsoid {
  const e = ell as ReferenceEllipsoid;
  if (typeof e !== 'object' || e === null)
    throw new InvalidArgumentError('ellipsoid', ell, 'a ReferenceEllipsoid (e.g. GRS80_ELLIPSOID)');
  requireInRange('ellipsoid.semiMajorAxis', e.semiMajorAxis, 6.3e6, 6.4e6, { unit: 'm' });
  requireInRange('ellipsoid.flattening', e.flattening, 1e-4, 0.01);
  requireInRange('ellipsoid.gm', e.gm, 3.9e14, 4.1e14, { unit: 'm³/s²' });
  requireInRange('ellipsoid.rotationRate', e.rotationRate, 7.0e-5, 7.5e-5, { unit: 'rad/s' });
  return e;
}

/**
 * Normal gravity potential (gravitational + centrifugal) of a level ellipsoid at a point given by
 * geodetic latitude and ellipsoidal height; closed form in ellipsoidal-harmonic coordinates (u, β):
 *   U = (GM/E)·arctan(E/u) + ½ω²a²·(q/q₀)·(sin²β − 1/3) + ½ω²(u² + E²)·cos²β,
 * with u² = ½(r² − E²)(1 + √(1 + 4E²z²/(r² − E²)²)), tan β = z√(u² + E²)/(u·p), p = √(x² + y²).
 *
 * @param latitude Geodetic latitude φ, radians, in [−π/2, π/2].
 * @param height Ellipsoidal height h, metres, in [−11 000, 1e8].
 * @param ellipsoid Default GRS 80.
 * @returns U, m²/s² (equals U₀ on the ellipsoid; decreases by ≈ γ·h above it).
 * Accuracy: exact for the level ellipsoid (rounding ≈ 1e-6 m²/s²); the real potential differs by
 * the disturbing potential T ≈ γ·N (geoid undulation N up to ≈ ±100 m, i.e. ±1e-14 of clock rate).
 * @throws {InvalidArgumentError} for latitude or height outside range, or a malformed ellipsoid.
 * @see W. A. Heiskanen & H. Moritz, Physical Geodesy (1967), §2-7 eq. (2-126) [M]; H. Moritz, GRS 80, J. Geodesy 74 (2000) [M].
 */
export function normalGravityPotential(
  latitude: Radians,
  height: Metres,
  ellipsoid: ReferenceEllipsoid = GRS80_ELLIPSOID,
): SquareMetresPerSecondSquared {
  const phi = requireInRange('latitude', latitude, -Math.PI / 2, Math.PI / 2, { unit: 'rad (did you give degrees?)' });
  const h = requireInRange('height', height, -11_000, 1e8, { unit: 'm' });
  const ell = checkEllipsoid(ellipsoid);
  return normalPotentialUnchecked(phi, h, ell);
}

function normalPotentialUnchecked(phi: number, h: number, ell: ReferenceEllipsoid): number {
  const { a, E, q0 } = derived(ell);
  const e2 = ell.flattening * (2 - ell.flattening);
  const s = Math.sin(phi);
  const N = a / Math.sqrt(1 - e2 * s * s);
  const p = (N + h) * Math.cos(phi);
  const z = (N * (1 - e2) + h) * s;
  const r2 = p * p + z * z;
  const d = r2 - E * E;
  const u2 = 0.5 * d * (1 + Math.sqrt(1 + (4 * E * E * z * z) / (d * d)));
  const u = Math.sqrt(u2);
  const beta = Math.atan2(z * Math.sqrt(u2 + E * E), u * p);
  const sb2 = Math.sin(beta) ** 2;
  const w2 = ell.rotationRate ** 2;
  return (
    (ell.gm / E) * Math.atan(E / u) +
    0.5 * w2 * a * a * (qOf(u, E) / q0) * (sb2 - 1 / 3) +
    0.5 * w2 * (u2 + E * E) * (1 - sb2)
  );
}

/**
 * Normal gravity on the ellipsoid by Somigliana's closed formula,
 *   γ(φ) = (a·γ_e·cos²φ + b·γ_p·sin²φ)/√(a²cos²φ + b²sin²φ),
 * with γ_e, γ_p from the ellipsoid's constants (Heiskanen & Moritz 1967 eqs. 2-141, 2-73) [M].
 *
 * @param latitude Geodetic latitude, radians. @param ellipsoid Default GRS 80.
 * @returns γ, m/s² (GRS 80: 9.7803267715 at the equator, 9.8321863685 at the poles [M]).
 * @throws {InvalidArgumentError} for latitude outside [−π/2, π/2] or a malformed ellipsoid.
 * @see H. Moritz, GRS 80 (2000) [M]; Heiskanen & Moritz (1967) §2-7, §2-8 [M].
 */
export function normalGravity(latitude: Radians, ellipsoid: ReferenceEllipsoid = GRS80_ELLIPSOID): number {
  const phi = requireInRange('latitude', latitude, -Math.PI / 2, Math.PI / 2, { unit: 'rad (did you give degrees?)' });
  const ell = checkEllipsoid(ellipsoid);
  const { a, b, E, q0 } = derived(ell);
  const ep = E / b;
  const m = (ell.rotationRate ** 2 * a * a * b) / ell.gm;
  // q₀′ = 3(1 + 1/e′²)(1 − (1/e′)·arctan e′) − 1 (Heiskanen & Moritz 1967 eq. 2-67) [M].
  const q0p = 3 * (1 + 1 / (ep * ep)) * (1 - Math.atan(ep) / ep) - 1;
  const gammaE = (ell.gm / (a * b)) * (1 - m - (m / 6) * ((ep * q0p) / q0));
  const gammaP = (ell.gm / (a * a)) * (1 + (m / 3) * ((ep * q0p) / q0));
  const c2 = Math.cos(phi) ** 2;
  const s2 = Math.sin(phi) ** 2;
  return (a * gammaE * c2 + b * gammaP * s2) / Math.sqrt(a * a * c2 + b * b * s2);
}

/** Rate of a ground clock against TT and TCG. */
export interface GroundClockRate {
  /** dτ/dTT − 1, dimensionless (positive = faster than TT; ≈ +1.09e-16 per metre of height). */
  rateVsTT: Dimensionless;
  /** dτ/dTCG − 1, dimensionless. */
  rateVsTCG: Dimensionless;
  /** rateVsTT × 86 400 s × 1e9: nanoseconds gained per day against TT. */
  nanosecondsPerDayVsTT: number;
  /** Normal potential U(φ, h) of the ellipsoid at the station, m²/s². */
  normalPotential: SquareMetresPerSecondSquared;
  /** Estimated gravity potential W ≈ U + (W₀ − U₀) + γ·N, m²/s². */
  gravityPotential: SquareMetresPerSecondSquared;
  /** Geoid undulation used, metres (0 when not given: then the ellipsoid stands in for the geoid). */
  geoidUndulation: Metres;
  ellipsoid: string;
  /** Plain-language statement of the accuracy of this estimate. */
  accuracy: string;
}

/**
 * Rate against TT of a clock at rest at a ground station.
 *
 * Formula: rateVsTT = (U₀ − U(φ, h) − γ(φ)·N)/c², where U is the ellipsoid's normal potential (rotation
 * included), U₀ its value on the ellipsoid, N the height of the geoid (W = W₀) above the ellipsoid, and
 * γ Somigliana's normal gravity; this is (W₀ − W)/c² with W ≈ U + (W₀ − U₀) + γN (Bruns).
 * rateVsTCG = (1 + rateVsTT)(1 − L_G) − 1.
 *
 * @param station `{ latitude (rad, geodetic), longitude (rad, validated but unused: the normal field is
 *   axisymmetric), height (m, ellipsoidal), geoidUndulation? (m) }`.
 * @param options `ellipsoid` (default GRS 80), `constants` (L_G; default IERS 2010).
 * @returns {@link GroundClockRate}.
 * Accuracy: with N from a global geoid model, ≈ 1e-17 (a few cm of geoid error; tides and time-variable
 * gravity excluded, up to ≈ 1e-17); without N, up to ≈ 1.2e-14 (|N| ≤ ≈ 110 m). Common practice:
 * ≈ 1.1e-16 per metre of height (no source).
 * @throws {InvalidArgumentError} for latitude outside [−π/2, π/2], longitude outside [−2π, 2π], a height
 *   outside [−11 000 m, 100 000 m], |N| > 150 m or a malformed ellipsoid.
 * @see IERS Conventions (2010) §10.1–10.2 (L_G = W₀/c²) [V1]; Heiskanen & Moritz (1967) eq. 2-126, Bruns' formula eq. 2-144 [M].
 */
export function groundClockRate(
  station: { latitude: Radians; longitude: Radians; height: Metres; geoidUndulation?: Metres },
  options: ConstantsOptions & { ellipsoid?: ReferenceEllipsoid } = {},
): GroundClockRate {
  if (typeof station !== 'object' || station === null) {
    throw new InvalidArgumentError('station', station, 'an object { latitude (rad), longitude (rad), height (m) }');
  }
  const phi = requireInRange('station.latitude', station.latitude, -Math.PI / 2, Math.PI / 2, {
    unit: 'rad (did you give degrees?)',
  });
  requireInRange('station.longitude', station.longitude, -2 * Math.PI, 2 * Math.PI, {
    unit: 'rad (did you give degrees?)',
  });
  const h = requireInRange('station.height', station.height, -11_000, 100_000, { unit: 'm (ellipsoidal height)' });
  const N = requireInRange('station.geoidUndulation', station.geoidUndulation ?? 0, -150, 150, { unit: 'm' });
  readOptions('options', options);
  const ell = checkEllipsoid(options.ellipsoid ?? GRS80_ELLIPSOID);
  const constants = constantsOf('options', options);
  const U = normalPotentialUnchecked(phi, h, ell);
  const U0 = normalPotentialUnchecked(0, 0, ell);
  const gamma = normalGravity(phi, ell);
  const W0 = constants.lG * SPEED_OF_LIGHT_SQUARED;
  const W = U + (W0 - U0) + gamma * N;
  const rateVsTT = (W0 - W) / SPEED_OF_LIGHT_SQUARED;
  return {
    rateVsTT,
    // (1 + rateVsTT)(1 − L_G) − 1, expanded so that no 1 − L_G rounding (≈ 5e-17) enters.
    rateVsTCG: rateVsTT - constants.lG - rateVsTT * constants.lG,
    nanosecondsPerDayVsTT: rateVsTT * SECONDS_PER_DAY * 1e9,
    normalPotential: U,
    gravityPotential: W,
    geoidUndulation: N,
    ellipsoid: ell.name,
    accuracy:
      station.geoidUndulation === undefined
        ? 'geoid undulation not given: the ellipsoid stands in for the geoid; error up to ≈ 1.2e-14 (|N| ≤ ≈ 110 m). Give geoidUndulation for ≈ 1e-17.'
        : 'normal field + Bruns term: ≈ 1e-17 with a good geoid model (tides and time-variable gravity excluded)',
  };
}

/**
 * Rate of TCG against TT: dTCG/dTT − 1 = L_G/(1 − L_G) ≈ 6.969290134e-10 (60.2147 µs/day).
 * @param options `constants`: the L_G source (default IERS 2010).
 * @returns Dimensionless.
 * @see IERS Conventions (2010) §10.1, dTT/dTCG = 1 − L_G [V1].
 */
export function tcgRateVsTT(options?: ConstantsOptions): Dimensionless {
  const constants = readConstants('options', options);
  return constants.lG / (1 - constants.lG);
}

/** Mean semi-major axis of the lunar orbit, 384 748 km (Kepler mean) [M]. */
export const MOON_SEMI_MAJOR_AXIS: Metres = 384_748_000;
/** Mean radius of the Moon, 1737.4 km (IAU WGCCRE) [M]. */
export const MOON_MEAN_RADIUS: Metres = 1_737_400;
/** Sidereal rotation period of the Moon, 27.321661 days [M]. */
export const MOON_SIDEREAL_ROTATION_PERIOD = 27.321661 * 86400;

/** Where the lunar clock is. */
export type LunarClockLocation = 'selenocentre' | 'surface' | 'orbit';

/** Rate of a lunar clock against TT and its parts (all dimensionless, positive = lunar clock faster). */
export interface LunarClockRate {
  location: LunarClockLocation;
  /** dτ/dTT − 1 averaged over a lunar orbit. */
  rateVsTT: Dimensionless;
  microsecondsPerDayVsTT: number;
  breakdown: {
    /** +L_G: TT (the geoid clock) itself runs slow against TCG. */
    geoidClock: Dimensionless;
    /** −⟨GM_E/r⟩/c² = −GM_E/(a c²): Earth's potential at the Moon. */
    earthPotential: Dimensionless;
    /** −⟨v²⟩/(2c²) = −G(M_E + M_M)/(2a c²): the Moon's orbital motion. */
    orbitalKinetic: Dimensionless;
    /** −GM_M/(ρc²): lunar potential at the clock (0 at the selenocentre). */
    lunarSelfPotential: Dimensionless;
    /** −v′²/(2c²) of the clock relative to the Moon: orbiter speed GM_M/ρ, or surface rotation (ω_M ρ cos φ)². */
    localKinetic: Dimensionless;
  };
  /** Each breakdown term in µs/day, same keys. */
  breakdownMicrosecondsPerDay: Record<
    'geoidClock' | 'earthPotential' | 'orbitalKinetic' | 'lunarSelfPotential' | 'localKinetic',
    number
  >;
  accuracy: string;
}

/**
 * Rate against TT of a clock at the selenocentre, on the lunar surface or in a circular lunar orbit,
 * averaged over a Kepler lunar orbit (geocentric frame):
 *   rate = L_G − GM_E/(a c²) − G(M_E + M_M)/(2a c²) − GM_M/(ρ c²) − v′²/(2c²),
 * ρ = distance from the selenocentre (R_M on the surface), v′ = local speed (orbiter √(GM_M/ρ); surface
 * rotation ω_M ρ cos φ).
 *
 * @param clock `{ location, orbitRadius? (m, selenocentric, for 'orbit'), latitude? (rad, selenographic, for 'surface', default 0) }`.
 * @param options `constants` (GM_E, L_G; default IERS 2010), `moonGm`, `moonSemiMajorAxis`, `moonRadius`.
 * @returns {@link LunarClockRate}.
 * Accuracy: ≈ 0.01 µs/day on the secular rate (solar tidal terms ≈ 0.006 µs/day and the Sun's perturbation
 * of the lunar orbit omitted; our own estimate GM_S a²/AU³ [C]); periodic terms (≈ 0.47 µs amplitude, Turyshev et
 * al. 2024 [V2]) are not included.
 * @throws {InvalidArgumentError} for an unknown location, an orbit radius below the lunar radius or above
 *   60 000 km, or a latitude outside [−π/2, π/2].
 * @see N. Ashby & B. Patla, arXiv:2402.11150 (2024): 56.02 µs/day at the lunar equator [V2];
 *   IERS Conventions (2010) §10.1–10.2 [V1]; term-by-term breakdown our own computation [C].
 */
export function lunarClockRate(
  clock: { location: LunarClockLocation; orbitRadius?: Metres; latitude?: Radians },
  options: ConstantsOptions & {
    moonGm?: CubicMetresPerSecondSquared;
    moonSemiMajorAxis?: Metres;
    moonRadius?: Metres;
  } = {},
): LunarClockRate {
  if (typeof clock !== 'object' || clock === null)
    throw new InvalidArgumentError('clock', clock, 'an object { location }');
  const location = clock.location;
  if (location !== 'selenocentre' && location !== 'surface' && location !== 'orbit') {
    throw new InvalidArgumentError('clock.location', location, '"selenocentre", "surface" or "orbit"');
  }
  readOptions('options', options);
  const constants = constantsOf('options', options);
  const gmM = requireInRange('options.moonGm', options.moonGm ?? GM_MOON, 4e12, 6e12, {
    unit: "m³/s² (the Moon's GM is about 4.9028e12)",
  });
  const a = requireInRange('moonSemiMajorAxis', options.moonSemiMajorAxis ?? MOON_SEMI_MAJOR_AXIS, 3.5e8, 4.2e8, {
    unit: 'm',
  });
  const R = requireInRange('moonRadius', options.moonRadius ?? MOON_MEAN_RADIUS, 1.7e6, 1.8e6, { unit: 'm' });
  const c2 = SPEED_OF_LIGHT_SQUARED;
  let rho = 0;
  let local = 0;
  if (location === 'surface') {
    rho = R;
    const lat = requireInRange('clock.latitude', clock.latitude ?? 0, -Math.PI / 2, Math.PI / 2, { unit: 'rad' });
    const v = ((2 * Math.PI) / MOON_SIDEREAL_ROTATION_PERIOD) * R * Math.cos(lat);
    local = -(v * v) / (2 * c2);
  } else if (location === 'orbit') {
    rho = requireInRange('clock.orbitRadius', clock.orbitRadius, R, 6e7, {
      unit: 'm (selenocentric radius, above the lunar surface)',
    });
    if (rho === R) throw new InvalidArgumentError('clock.orbitRadius', rho, `above the lunar radius ${R} m`);
    local = -gmM / (2 * rho * c2);
  }
  const breakdown = {
    geoidClock: constants.lG,
    earthPotential: -constants.gm / (a * c2),
    orbitalKinetic: -(constants.gm + gmM) / (2 * a * c2),
    lunarSelfPotential: rho === 0 ? 0 : -gmM / (rho * c2),
    localKinetic: local,
  };
  const rate =
    breakdown.geoidClock +
    breakdown.earthPotential +
    breakdown.orbitalKinetic +
    breakdown.lunarSelfPotential +
    breakdown.localKinetic;
  const perDay = (x: number): number => x * SECONDS_PER_DAY * 1e6;
  return {
    location,
    rateVsTT: rate,
    microsecondsPerDayVsTT: perDay(rate),
    breakdown,
    breakdownMicrosecondsPerDay: {
      geoidClock: perDay(breakdown.geoidClock),
      earthPotential: perDay(breakdown.earthPotential),
      orbitalKinetic: perDay(breakdown.orbitalKinetic),
      lunarSelfPotential: perDay(breakdown.lunarSelfPotential),
      localKinetic: perDay(breakdown.localKinetic),
    },
    accuracy:
      'secular rate ≈ ±0.01 µs/day (solar tides and solar perturbation of the lunar orbit omitted); periodic terms up to ≈ 0.5 µs not included',
  };
}
