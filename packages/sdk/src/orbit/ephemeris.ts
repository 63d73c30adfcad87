/**
 * Low-precision analytic geocentric positions of the Sun and the Moon, for third-body
 * accelerations and tidal clock potentials (not for pointing or eclipse work).
 *
 * Model: O. Montenbruck & E. Gill, "Satellite Orbits: Models, Methods and Applications",
 * Springer (2000), §3.3.2 "Low Precision Solar and Lunar Coordinates", eqs. (3.43)–(3.49)
 * [M for the equation numbers; the series coefficients were checked against an independent
 * transcription, V2]. The solar series is a Keplerian orbit with the two main equation-of-
 * centre terms; the lunar series keeps the largest terms of Brown's theory (14 in longitude,
 * 8 in latitude, 9 in distance). Montenbruck & Gill quote an accuracy of about 0.1–1 % for
 * both bodies [M]; our own check against two worked examples of J. Meeus, "Astronomical
 * Algorithms" (2nd ed., 1998), Examples 25.a and 47.a [M], gives < 0.03° for the Sun and
 * < 0.01° / < 100 km for the Moon (see the SDK tests). For the tidal clock potential at GNSS
 * altitudes (≈ 1e-15 of frequency) that accuracy gives errors below 1e-17.
 *
 * Time argument: an {@link Instant} at the public functions; inside, TT seconds since J2000.0
 * (2000-01-01 12:00:00 TT, JD 2451545.0) as one float (`ttSecondsSinceJ2000`, time/j2000.ts), whose
 * 1.2e-7 s resolution at 8e8 s is far finer than the series need.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import type { Instant } from '../time/instant.js';
import { requireEpochInstant, ttSecondsSinceJ2000 } from '../time/j2000.js';
import type { Seconds, Vector3 } from '../units.js';

/**
 * Which equatorial frame the positions are expressed in: `mean-of-date` (mean equator and
 * equinox of the epoch, z along the mean rotation axis of date; nutation, < 10″, ignored) or
 * `eme2000` (mean equator and equinox of J2000.0).
 */
export type EphemerisFrame = 'mean-of-date' | 'eme2000';

const DEG = Math.PI / 180;
const ARCSEC = DEG / 3600;
/** Seconds in a Julian century of TT. */
const SECONDS_PER_JULIAN_CENTURY = 36525 * 86400;
/** Obliquity of the J2000 ecliptic, 23.43929111° (IAU 1976 value, as used by Montenbruck & Gill 2000 §3.3.2) [M]. */
const OBLIQUITY_J2000 = 23.43929111 * DEG;
/** Obliquity rate −46.8150″ per Julian century (IAU 1976 precession, Lieske et al. 1977) [M]. */
const OBLIQUITY_RATE = -46.815 * ARCSEC;
/** General precession in longitude, 1.3972° per Julian century (the term Montenbruck & Gill 2000 eq. 3.47 subtracts) [M]. */
const PRECESSION_IN_LONGITUDE = 1.3972 * DEG;

/** The series' time argument at a checked epoch: TT seconds since J2000.0, one float. */
function checkEpoch(epoch: unknown): Seconds {
  return ttSecondsSinceJ2000(requireEpochInstant('epoch', epoch));
}

/** Veltkamp's splitting constant 2^27 + 1 (T. J. Dekker, Numer. Math. 18 (1971) 224–242) [M]. */
const SPLITTER = 134217729;

/**
 * a·b as an unevaluated sum hi + lo with hi = fl(a·b) and lo the exact rounding error
 * (Dekker's product, T. J. Dekker, Numer. Math. 18 (1971) 224–242, "mul12") [M]; exact for |a·b| < 2^996.
 */
function twoProduct(a: number, b: number): [number, number] {
  const hi = a * b;
  let t = SPLITTER * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLITTER * b;
  const bh = t - (t - b);
  const bl = b - bh;
  const lo = al * bl - (hi - ah * bh - al * bh - ah * bl);
  return [hi, lo];
}

/**
 * A mean argument c0 + c1·T of the series, in radians, with argument reduction: T = (epoch + offset)/century,
 * the large product c1/century·epoch is formed exactly (hi + lo) and hi is reduced modulo 360° (an exact
 * operation) before the small terms are added. The result is a smooth function of `offset` at any epoch:
 * without this, angles of ≈ 10⁵° at 2023 carry rounding noise of ≈ 1e-11° (≈ 1e-4 m of lunar position), which
 * an orbit integrator at tight tolerance sees as a rough force. Technique: common practice for long time
 * arguments (split time as in two-part Julian dates, IAU SOFA conventions [M]), no single source.
 * @param c0Deg degrees at J2000. @param c1DegPerCentury degrees per Julian century of TT.
 */
function meanArgument(c0Deg: number, c1DegPerCentury: number, epoch: Seconds, offset: Seconds): number {
  const ratePerSecond = c1DegPerCentury / SECONDS_PER_JULIAN_CENTURY;
  const [hi, lo] = twoProduct(ratePerSecond, epoch);
  const reduced = hi - 360 * Math.floor(hi / 360);
  return (c0Deg + reduced + lo + ratePerSecond * offset) * DEG;
}

/** Julian centuries of TT since J2000 for epoch + offset (only for slowly varying terms: precession, obliquity). */
function centuriesOf(epoch: Seconds, offset: Seconds): number {
  return epoch / SECONDS_PER_JULIAN_CENTURY + offset / SECONDS_PER_JULIAN_CENTURY;
}

function checkFrame(frame: unknown): EphemerisFrame {
  if (frame !== 'mean-of-date' && frame !== 'eme2000')
    throw new InvalidArgumentError('frame', frame, '"mean-of-date" or "eme2000"');
  return frame;
}

/** Ecliptic (λ, β, r) → equatorial Cartesian by a rotation about x through the obliquity ε. */
function eclipticToEquatorial(lon: number, lat: number, r: number, eps: number): Vector3 {
  const cb = Math.cos(lat);
  const x = r * Math.cos(lon) * cb;
  const y = r * Math.sin(lon) * cb;
  const z = r * Math.sin(lat);
  const ce = Math.cos(eps);
  const se = Math.sin(eps);
  return [x, ce * y - se * z, se * y + ce * z];
}

/**
 * Internal, unvalidated: Sun position (m) at TT = J2000 + epoch + offset seconds. Split time: pass a fixed
 * `epoch` and a varying `offset` (e.g. seconds since the start of an integration) for a result that is smooth in `offset`.
 */
export function sunPositionAt(epoch: Seconds, offset: Seconds, ofDate: boolean): Vector3 {
  const T = centuriesOf(epoch, offset);
  // Montenbruck & Gill (2000) eqs. (3.43)–(3.44): mean anomaly, ecliptic longitude (J2000 equinox), distance.
  const M = meanArgument(357.5256, 35999.049, epoch, offset);
  const lon = 282.94 * DEG + M + (6892 * Math.sin(M) + 72 * Math.sin(2 * M)) * ARCSEC;
  const r = (149.619 - 2.499 * Math.cos(M) - 0.021 * Math.cos(2 * M)) * 1e9;
  return ofDate
    ? eclipticToEquatorial(lon + PRECESSION_IN_LONGITUDE * T, 0, r, OBLIQUITY_J2000 + OBLIQUITY_RATE * T)
    : eclipticToEquatorial(lon, 0, r, OBLIQUITY_J2000);
}

/** Internal, unvalidated: Moon position (m) at TT = J2000 + epoch + offset seconds (split time as {@link sunPositionAt}). */
export function moonPositionAt(epoch: Seconds, offset: Seconds, ofDate: boolean): Vector3 {
  const T = centuriesOf(epoch, offset);
  // Montenbruck & Gill (2000) eq. (3.47): mean elements (L0 referred to the J2000 equinox), each reduced mod 360°.
  const L0 = meanArgument(218.31617, 481267.88088 - 1.3972, epoch, offset);
  const l = meanArgument(134.96292, 477198.86753, epoch, offset);
  const lp = meanArgument(357.52543, 35999.04944, epoch, offset);
  const F = meanArgument(93.27283, 483202.01873, epoch, offset);
  const D = meanArgument(297.85027, 445267.11135, epoch, offset);
  // Eq. (3.48): longitude perturbations, in arcseconds.
  const dL =
    22640 * Math.sin(l) +
    769 * Math.sin(2 * l) -
    4586 * Math.sin(l - 2 * D) +
    2370 * Math.sin(2 * D) -
    668 * Math.sin(lp) -
    412 * Math.sin(2 * F) -
    212 * Math.sin(2 * l - 2 * D) -
    206 * Math.sin(l + lp - 2 * D) +
    192 * Math.sin(l + 2 * D) -
    165 * Math.sin(lp - 2 * D) +
    148 * Math.sin(l - lp) -
    125 * Math.sin(D) -
    110 * Math.sin(l + lp) -
    55 * Math.sin(2 * F - 2 * D);
  const lon = L0 + dL * ARCSEC;
  // Eq. (3.48): latitude.
  const S = F + (dL + 412 * Math.sin(2 * F) + 541 * Math.sin(lp)) * ARCSEC;
  const h = F - 2 * D;
  const N =
    -526 * Math.sin(h) +
    44 * Math.sin(l + h) -
    31 * Math.sin(-l + h) -
    23 * Math.sin(lp + h) +
    11 * Math.sin(-lp + h) -
    25 * Math.sin(-2 * l + F) +
    21 * Math.sin(-l + F);
  const lat = (18520 * Math.sin(S) + N) * ARCSEC;
  // Eq. (3.49): distance, in km.
  const rKm =
    385000 -
    20905 * Math.cos(l) -
    3699 * Math.cos(2 * D - l) -
    2956 * Math.cos(2 * D) -
    570 * Math.cos(2 * l) +
    246 * Math.cos(2 * l - 2 * D) -
    205 * Math.cos(lp - 2 * D) -
    171 * Math.cos(l + 2 * D) -
    152 * Math.cos(l + lp - 2 * D);
  return ofDate
    ? eclipticToEquatorial(lon + PRECESSION_IN_LONGITUDE * T, lat, rKm * 1000, OBLIQUITY_J2000 + OBLIQUITY_RATE * T)
    : eclipticToEquatorial(lon, lat, rKm * 1000, OBLIQUITY_J2000);
}

/**
 * Geocentric position of the Sun from the low-precision series of Montenbruck & Gill (2000) §3.3.2.
 *
 * Formula: M = 357.5256° + 35999.049°·T; λ = 282.94° + M + 6892″ sin M + 72″ sin 2M (J2000 equinox);
 * r = (149.619 − 2.499 cos M − 0.021 cos 2M)·10⁹ m; β = 0. For `mean-of-date`, λ is advanced by the
 * general precession 1.3972°·T and rotated by the obliquity of date ε = 23.43929111° − 46.815″·T.
 *
 * @param epoch The instant (the series run on TT; build it with `parseIso(text, 'TT')` or
 *   `instantFromTtSecondsSinceJ2000(seconds)` of `@tauline/sdk/time`).
 * @param frame Output frame (default `mean-of-date`).
 * @returns Position in metres.
 * Validity: a few centuries around 2000; accuracy ≈ 0.03° in direction and ≈ 1e-5 in distance (our check against Meeus Example 25.a [M]).
 * @throws {InvalidArgumentError} for an epoch that is not an Instant (a bare number of seconds included) or an
 *   unknown frame.
 * @see O. Montenbruck & E. Gill, Satellite Orbits (2000), §3.3.2, eqs. (3.43)–(3.44) [M].
 */
export function sunPositionLowPrecision(epoch: Instant, frame: EphemerisFrame = 'mean-of-date'): Vector3 {
  return sunPositionAt(checkEpoch(epoch), 0, checkFrame(frame) === 'mean-of-date');
}

/**
 * Geocentric position of the Moon from the low-precision series of Montenbruck & Gill (2000) §3.3.2
 * (largest terms of Brown's lunar theory).
 *
 * Formula: see eqs. (3.47)–(3.49): mean arguments L0, l, l′, F, D; λ = L0 + Σ (14 terms); β from
 * 18520″ sin S + 7 terms; r = 385000 km − Σ (8 terms). `mean-of-date` as for the Sun.
 *
 * @param epoch The instant (as for {@link sunPositionLowPrecision}).
 * @param frame Output frame (default `mean-of-date`).
 * @returns Position in metres.
 * Validity: a few centuries around 2000; accuracy a few arcminutes and ≈ 100 km (Montenbruck & Gill:
 * "several arcminutes" [M]; our check against Meeus Example 47.a [M] in the tests).
 * @throws {InvalidArgumentError} for an epoch that is not an Instant (a bare number of seconds included) or an
 *   unknown frame.
 * @see O. Montenbruck & E. Gill, Satellite Orbits (2000), §3.3.2, eqs. (3.47)–(3.49) [M].
 */
export function moonPositionLowPrecision(epoch: Instant, frame: EphemerisFrame = 'mean-of-date'): Vector3 {
  return moonPositionAt(checkEpoch(epoch), 0, checkFrame(frame) === 'mean-of-date');
}

/** Name of the ephemeris model, for reports. */
export const LOW_PRECISION_EPHEMERIS_NAME = 'Montenbruck & Gill (2000) §3.3.2 low-precision Sun/Moon series';
