/**
 * Pass prediction: when a ground station sees a satellite above an elevation mask, from the
 * satellite's mean elements (secular J2 propagation, j2-secular.ts), the Earth rotation angle
 * (earth-rotation.ts) and the station's WGS 84 position (geodetic.ts).
 *
 * Accuracy for planning. Pass times are refined by bisection to `toleranceSeconds` (default 0.01 s)
 * of the model. The model itself leaves out the short-period J2 terms (position errors of order
 * J2·(R/a)²·a, ~1–2 km at MEO, ~5–10 km at LEO [C]), UT1 − UTC (≤ 0.9 s, shifts every time alike),
 * precession–nutation of the elements' frame (see earth-rotation.ts), drag, third bodies and refraction.
 * The test against an independent full-J2 integration (test/fixtures/passes) bounds the resulting
 * pass-time error per pass by (position error / range) / elevation rate: a few seconds at MEO,
 * up to tens of seconds at LEO where the elevation changes slowly near the mask.
 *
 * @module
 */

import { type ConstantSet, DEFAULT_CONSTANT_SET } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { at as checkedAt } from '../internal/checked.js';
import {
  requireConstantSet,
  requireInRange,
  requireObject,
  requireOptions,
  requirePositive,
} from '../internal/validate.js';
import { type Instant, requireInstant } from '../time/instant.js';
import { BUNDLED_LEAP_SECONDS } from '../time/leap-seconds.js';
import { createTimeScales, type TimeScales } from '../time/scales.js';
import type { Radians, Seconds, Vector3 } from '../units.js';
import { EARTH_ROTATION_ANGLE_RATE, earthRotationAngle, requireTimeScales } from './earth-rotation.js';
import type { KeplerianElements } from './elements.js';
import { type GeodeticPosition, geodeticToEcefTrusted, localUp, requireGeodeticPosition } from './geodetic.js';
import { j2SecularRatesTrusted, requireMeanElements } from './j2-secular.js';
import { KEPLER_RESIDUAL_TOLERANCE, solveKepler } from './kepler.js';
import { findPasses } from './pass-search.js';

/** Mean elements at their own epoch. */
export interface MeanOrbit {
  /** Mean elements (a in metres, angles in radians) in the inertial frame of date (see earth-rotation.ts). */
  elements: KeplerianElements;
  /** Epoch of the elements. */
  epoch: Instant;
}

/** A station that sees satellites above an elevation mask. */
export interface GroundSite {
  /** Geodetic position on WGS 84 (rad, m). */
  position: GeodeticPosition;
  /** Lowest usable elevation, in radians, in [0, π/2). */
  elevationMask: Radians;
}

/** One predicted pass; times in seconds since the prediction's epoch. */
export interface PredictedPass {
  /** First time with elevation ≥ mask (within the tolerance), or 0 when clipped at the start. */
  start: Seconds;
  /** Last time with elevation ≥ mask (within the tolerance), or the horizon when clipped at the end. */
  end: Seconds;
  /** Highest elevation during the pass, in radians. */
  maxElevation: Radians;
  /** When the highest elevation occurs, in seconds since the epoch. */
  maxElevationAt: Seconds;
  /** True when the satellite was already above the mask at the epoch (the pass began earlier). */
  clippedAtStart: boolean;
  /** True when the satellite is still above the mask at the end of the horizon. */
  clippedAtEnd: boolean;
}

/** Passes of one satellite over several stations: `passes[k]` are station k's, sorted by start and disjoint. */
export interface PassPrediction {
  epoch: Instant;
  /** Length of the prediction window, in seconds. */
  horizon: Seconds;
  passes: PredictedPass[][];
}

/** Options of {@link predictPasses} and {@link satellitePositionEcef}. */
export interface PassPredictionOptions {
  /** Leap-second table for UTC (taken as UT1); default the bundled table. */
  timeScales?: TimeScales;
  /** GM, equatorial radius and J2 of the propagation; default IERS 2010. */
  constants?: ConstantSet;
  /** Sampling step of the elevation search, in seconds, in (0, 3600]; default min(60 s, period/200). */
  stepSeconds?: Seconds;
  /** Bisection tolerance on pass start and end times, in seconds, in [1e-6, stepSeconds]; default 0.01 s. */
  toleranceSeconds?: Seconds;
}

/** Default tolerance of the pass start and end times, in seconds. */
export const PASS_TIME_TOLERANCE_SECONDS: Seconds = 0.01;
/** Longest propagation from the elements' epoch accepted, in seconds (366 days): secular J2 only, no drag. */
export const MAX_PASS_PROPAGATION_SECONDS: Seconds = 366 * 86_400;

let bundled: TimeScales | undefined;
const TWO_PI = 2 * Math.PI;

/** Writes the satellite's Earth-fixed position (m) at t seconds after the prediction epoch into `out[at..at+2]`. */
type EcefAt = (t: Seconds, out: Float64Array, at: number) => void;

/** Builds the Earth-fixed position function: secular J2 elements → inertial position → R3(ERA). */
function ecefEvaluator(orbit: MeanOrbit, epoch: Instant, horizon: Seconds, ts: TimeScales, set: ConstantSet): EcefAt {
  const o = requireObject('orbit', orbit as object, 'an object { elements, epoch }') as Record<string, unknown>;
  const el = requireMeanElements(o.elements, 'orbit.elements', set);
  const elEpoch = requireInstant('orbit.epoch', o.epoch);
  const offset = epoch.secondsSince(elEpoch);
  const far = Math.max(Math.abs(offset), Math.abs(offset + horizon));
  if (far > MAX_PASS_PROPAGATION_SECONDS) {
    throw new InvalidArgumentError(
      'orbit.epoch',
      elEpoch.toString(),
      `within ${MAX_PASS_PROPAGATION_SECONDS} s (366 days) of the whole prediction window`,
      `the window reaches ${far} s from it`,
    );
  }
  const rates = j2SecularRatesTrusted(el, set);
  const theta0 = earthRotationAngle(epoch, ts);
  const { semiMajorAxis: a, eccentricity: e, inclination: i } = el;
  const ci = Math.cos(i),
    si = Math.sin(i);
  const b = a * Math.sqrt((1 - e) * (1 + e));
  // sin E and cos E of the last Kepler solve (written by eccentricAnomaly, read right after it).
  const trig = { sin: 0, cos: 0 };
  return (t: Seconds, out: Float64Array, at: number): void => {
    const dt = offset + t;
    const w = el.argumentOfPerigee + rates.argumentOfPerigeeRate * dt;
    eccentricAnomaly((el.meanAnomaly + rates.meanAnomalyRate * dt) % TWO_PI, e, trig);
    // Perifocal x = a(cos E − e), y = b sin E, rotated by R3(−Ω)R1(−i)R3(−ω) (as elementsToState, Vallado Alg. 10 [M]).
    const xp = a * (trig.cos - e),
      yp = b * trig.sin;
    const cw = Math.cos(w),
      sw = Math.sin(w);
    // In the orbit plane, turned by ω; then tilted by i (R1(−i)).
    const x1 = xp * cw - yp * sw,
      y1 = xp * sw + yp * cw;
    const y2 = y1 * ci;
    // r_ECEF = R3(θ)·r: [GCRS] = Q·R·W [ITRS] with R = R3(−ERA), Q = W = identity (IERS Conventions 2010 eq. 5.1 [M]);
    // R3(θ)·R3(−Ω) = R3(θ − Ω), one rotation by the node's angle east of the Earth-fixed x axis.
    const lambda = theta0 + EARTH_ROTATION_ANGLE_RATE * t - (el.raan + rates.raanRate * dt);
    const c = Math.cos(lambda),
      s = Math.sin(lambda);
    out[at] = c * x1 + s * y2;
    out[at + 1] = -s * x1 + c * y2;
    out[at + 2] = y1 * si;
  };
}

/**
 * Eccentric anomaly for mean anomaly M ∈ (−2π, 2π), writing [sin E, cos E] into `trig`: M is folded into [−π, π]
 * (exact subtraction of 2π, Sterbenz), Newton's method from E0 = M + e·sin M is stopped once the residual
 * |E − e sin E − M| ≤ KEPLER_RESIDUAL_TOLERANCE, the bound solveKepler guarantees on [−π, π]; when six steps do not
 * reach it (e near 1), solveKepler itself answers. No allocation.
 * @see Kepler's equation and Newton's method, Vallado, Fundamentals of Astrodynamics and Applications, 4th ed.,
 *   §2.2, Alg. 2 [M].
 */
function eccentricAnomaly(meanAnomaly: Radians, e: number, trig: { sin: number; cos: number }): void {
  let m = meanAnomaly;
  if (m > Math.PI) m -= TWO_PI;
  else if (m < -Math.PI) m += TWO_PI;
  let E = m + e * Math.sin(m);
  for (let k = 0; k < 6; k++) {
    const sE = Math.sin(E),
      cE = Math.cos(E);
    const f = E - e * sE - m;
    if (Math.abs(f) <= KEPLER_RESIDUAL_TOLERANCE) {
      trig.sin = sE;
      trig.cos = cE;
      return;
    }
    E -= f / (1 - e * cE);
  }
  E = solveKepler(m, e);
  trig.sin = Math.sin(E);
  trig.cos = Math.cos(E);
}

/**
 * Elevation (rad) from a site of the satellite position p[at..at+2] (Vallado 4th ed. §4.4, up component [M]).
 * Hot (once per sample): the callers pass a 3-vector scratch at 0 or the sample table at 3k with k < count.
 */
function elevationOf(site: { r: Vector3; up: Vector3 }, p: Float64Array, at: number): Radians {
  const dx = p[at]! - site.r[0],
    dy = p[at + 1]! - site.r[1],
    dz = p[at + 2]! - site.r[2];
  const height = dx * site.up[0] + dy * site.up[1] + dz * site.up[2];
  let sine = height / Math.sqrt(dx * dx + dy * dy + dz * dz);
  // Near the zenith asin magnifies the last bit of the range (d asin/dx = 1/√(1 − x²)): there the correctly
  // rounded hypot, as elevationFromStation uses; elsewhere the plain square root differs by an ulp at most.
  if (sine > 0.9) sine = height / Math.hypot(dx, dy, dz);
  return Math.asin(Math.max(-1, Math.min(1, sine)));
}

function resolveOptions(options: PassPredictionOptions | undefined): {
  ts: TimeScales;
  set: ConstantSet;
  opts: PassPredictionOptions;
} {
  const opts = requireOptions('options', options);
  const ts =
    opts.timeScales === undefined
      ? (bundled ??= createTimeScales(BUNDLED_LEAP_SECONDS))
      : requireTimeScales('options.timeScales', opts.timeScales);
  const set = requireConstantSet('options.constants', opts.constants ?? DEFAULT_CONSTANT_SET);
  return { ts, set, opts };
}

/**
 * Earth-fixed position of a satellite at an instant from its mean elements: secular J2 propagation
 * (Vallado §9.6 [M]), Kepler's equation, then rotation by the Earth rotation angle with UT1 = UTC
 * (IERS Conventions 2010 eq. 5.15 [M]). Short-period J2 terms are not included (see the module note).
 *
 * @param orbit    Mean elements and their epoch.
 * @param at       The instant.
 * @param options  `timeScales`, `constants` (see {@link PassPredictionOptions}).
 * @returns [X, Y, Z] Earth-fixed, in metres.
 * @throws {InvalidArgumentError} for invalid elements, instants, options, or `at` more than 366 days from the
 *   elements' epoch.
 */
export function satellitePositionEcef(orbit: MeanOrbit, at: Instant, options?: PassPredictionOptions): Vector3 {
  const { ts, set } = resolveOptions(options);
  const out = new Float64Array(3);
  ecefEvaluator(orbit, requireInstant('at', at), 0, ts, set)(0, out, 0);
  return [checkedAt(out, 0, 'position'), checkedAt(out, 1, 'position'), checkedAt(out, 2, 'position')];
}

/** Validates the stations (fields `sites[k].position.*`, `sites[k].elevationMask`). */
function requireSites(sites: unknown): { r: Vector3; up: Vector3; mask: Radians }[] {
  if (!Array.isArray(sites)) throw new InvalidArgumentError('sites', sites, 'an array of { position, elevationMask }');
  return sites.map((value: unknown, k) => {
    const s = requireObject(`sites[${k}]`, value as object, 'an object { position, elevationMask }') as Record<
      string,
      unknown
    >;
    const p = requireGeodeticPosition(s.position, `sites[${k}].position`);
    const mask = requireInRange(`sites[${k}].elevationMask`, s.elevationMask, 0, Math.PI / 2, {
      maxExclusive: true,
      unit: 'rad',
    });
    return { r: geodeticToEcefTrusted(p.latitude, p.longitude, p.height), up: localUp(p.latitude, p.longitude), mask };
  });
}

/**
 * Predicts the passes of one satellite over several stations in [epoch, epoch + horizon].
 *
 * Method: the elevation el(t) = asin(ρ·û/|ρ|) of the satellite (see {@link satellitePositionEcef})
 * above each station's geodetic horizon is sampled every `stepSeconds`; each crossing of the mask
 * is refined by bisection on el(t) − mask to `toleranceSeconds`, so `start` and `end` lie inside
 * the pass (el ≥ mask) and within the tolerance of the crossing. A local maximum below the mask
 * between samples (a short pass) or a local minimum above it (two passes) is searched by golden
 * section. A pass shorter than one step at the very start or end of the window can be missed.
 * Passes cut by the window are returned clipped, with `clippedAtStart` / `clippedAtEnd` set.
 *
 * @param orbit    Mean elements and their epoch (at most 366 days from any time of the window).
 * @param sites    Stations: WGS 84 geodetic position (rad, m) and elevation mask (rad).
 * @param epoch    Start of the window.
 * @param horizon  Length of the window, in seconds (> 0, ≤ 366 days).
 * @param options  See {@link PassPredictionOptions}.
 * @returns The window and, per station in order, its passes sorted by start.
 * @throws {InvalidArgumentError} naming the bad field.
 * @throws {OutOfDomainError} for an epoch outside the leap-second table.
 * @see IERS Conventions (2010) eq. 5.15 (ERA) [M]; Vallado, Fundamentals of Astrodynamics and Applications,
 *   4th ed., §9.6 (secular J2) and §4.4 (topocentric elevation) [M]; NIMA TR8350.2 (WGS 84) [M].
 */
export function predictPasses(
  orbit: MeanOrbit,
  sites: readonly GroundSite[],
  epoch: Instant,
  horizon: Seconds,
  options?: PassPredictionOptions,
): PassPrediction {
  const { ts, set, opts } = resolveOptions(options);
  const start = requireInstant('epoch', epoch);
  const span = requireInRange('horizon', horizon, 0, MAX_PASS_PROPAGATION_SECONDS, { minExclusive: true, unit: 's' });
  const checked = requireSites(sites);
  const ecef = ecefEvaluator(orbit, start, span, ts, set);
  const a = (orbit as MeanOrbit).elements.semiMajorAxis;
  const period = 2 * Math.PI * Math.sqrt((a * a * a) / set.gm);
  const step =
    opts.stepSeconds === undefined
      ? Math.min(60, period / 200)
      : requireInRange('options.stepSeconds', opts.stepSeconds, 0, 3600, { minExclusive: true, unit: 's' });
  const tol =
    opts.toleranceSeconds === undefined
      ? Math.min(PASS_TIME_TOLERANCE_SECONDS, step)
      : requireInRange('options.toleranceSeconds', opts.toleranceSeconds, 1e-6, step, {
          unit: `s (at most stepSeconds = ${step})`,
        });
  requirePositive('options.stepSeconds', step, 's');
  const count = Math.ceil(span / step);
  const times = new Float64Array(count + 1);
  const timeOf = (k: number): Seconds => Math.min(k * step, span);
  for (let k = 0; k <= count; k++) times[k] = timeOf(k);
  const elements = (orbit as MeanOrbit).elements;
  const samples = {
    timeOf,
    count: count + 1,
    positions: new Float64Array(3 * (count + 1)),
    ready: new Uint8Array(count + 1),
    minRadius: elements.semiMajorAxis * (1 - elements.eccentricity),
  };
  const speed = maxEarthFixedSpeed(elements, set);
  const scratch = new Float64Array(3);
  const passes = checked.map((site) => {
    const elevation = (t: Seconds): Radians => {
      ecef(t, scratch, 0);
      return elevationOf(site, scratch, 0);
    };
    const sampled = sampleElevations(site, ecef, samples, speed);
    return findPasses(times, sampled, elevation, site.mask, tol);
  });
  return { epoch: start, horizon: span, passes };
}

/**
 * Upper bound of the Earth-fixed speed (m/s) of the secular-J2 position function of `ecefEvaluator`, whose
 * position is R3(θ − Ω)·R1(−i)·R3(−ω)·r_pf(M): |ṙ| ≤ |Ṁ|·max|dr_pf/dM| + (|ω̇| + |θ̇ − Ω̇|)·a(1 + e), with
 * |dr_pf/dM| = a·√(1 − e²cos²E)/(1 − e cos E) ≤ a·√((1 + e)/(1 − e)) (its value at perigee) [C].
 */
function maxEarthFixedSpeed(el: KeplerianElements, set: ConstantSet): number {
  const rates = j2SecularRatesTrusted(el, set);
  const { semiMajorAxis: a, eccentricity: e } = el;
  const turning = Math.abs(rates.argumentOfPerigeeRate) + Math.abs(EARTH_ROTATION_ANGLE_RATE - rates.raanRate);
  return Math.abs(rates.meanAnomalyRate) * a * Math.sqrt((1 + e) / (1 - e)) + turning * a * (1 + e);
}

/**
 * The elevations of one site at the sample times, positions computed once per sample and shared by the sites.
 * Samples far below the mask are skipped: the elevation changes no faster than the angular rate of the line of
 * sight, |ρ̇|/|ρ| ≤ (max speed)/(a(1 − e) − |r_site|) (kinematics of a unit vector, common practice, no source;
 * taken 0.1 % larger, with 1e-9 rad of margin), so after a sample at el < mask the satellite stays below the mask
 * for (mask − el)/rate seconds. A sample k is skipped (NaN) only when [t(k−2), t(k+2)] lies in such a stretch:
 * then every three-sample search of findPasses touching it would be moot, and findPasses gives the same passes as
 * with every sample computed.
 */
function sampleElevations(
  site: { r: Vector3; up: Vector3; mask: Radians },
  ecef: EcefAt,
  samples: {
    timeOf: (k: number) => Seconds;
    count: number;
    positions: Float64Array;
    ready: Uint8Array;
    minRadius: number;
  },
  speed: number,
): Float64Array {
  const { timeOf, positions, ready } = samples;
  const n = samples.count;
  const nearest = samples.minRadius - Math.hypot(site.r[0], site.r[1], site.r[2]);
  const rate = nearest > 0 ? (1.001 * speed) / nearest : Number.POSITIVE_INFINITY;
  const sampled = new Float64Array(n);
  // The current stretch [from, until) proven below the mask.
  let from = Number.POSITIVE_INFINITY,
    until = Number.NEGATIVE_INFINITY;
  for (let k = 0; k < n; k++) {
    if (k >= 2 && k + 2 < n && timeOf(k - 2) >= from && timeOf(k + 2) < until) {
      sampled[k] = Number.NaN;
      continue;
    }
    const t = timeOf(k);
    if (ready[k] === 0) {
      ecef(t, positions, 3 * k);
      ready[k] = 1;
    }
    const el = elevationOf(site, positions, 3 * k);
    sampled[k] = el;
    const below = t + (site.mask - el - 1e-9) / rate;
    if (!(below > t)) continue;
    if (!(t >= from && t < until)) from = t;
    until = Math.max(until, below);
  }
  return sampled;
}
