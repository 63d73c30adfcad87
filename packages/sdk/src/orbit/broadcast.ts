/**
 * The interface-specification user algorithms for broadcast Keplerian ephemerides (GPS
 * LNAV, Galileo I/NAV and F/NAV, BeiDou D1/D2): satellite position and velocity in the
 * Earth-fixed frame, the relativistic periodic correction Δt_r = F·e·√A·sin E_k and the
 * full satellite clock correction Δt_sv = a_f0 + a_f1(t − t_oc) + a_f2(t − t_oc)² + Δt_r.
 *
 * Times are {@link Instant}s: a record's t_oc, t_oe and transmission time are absolute instants (a
 * reader places them on the record's own system time scale: GPST for GPS, GST for Galileo, BDT for
 * BeiDou, with the week number already resolved), and the evaluation time is an Instant too. The
 * algorithms use only differences of instants (t − t_oe, t − t_oc, exact to ~1e-16 s) and the seconds
 * of week of t_oe, read by the time module; no float count of seconds since 1980 is kept.
 *
 * @module
 */

import type { ConstantSet } from '../constants.js';
import { BEIDOU_ICD, GALILEO_ICD, GPS_ICD } from '../constants.js';
import { InvalidArgumentError, OutOfDomainError } from '../errors.js';
import { requireFinite, requireOptions, requirePositive } from '../internal/validate.js';
import type { OrbitScale } from '../time/file-epochs.js';
import { Instant, requireInstant } from '../time/instant.js';
import { weekSecondsFromInstant } from '../time/weeks.js';
import type { Metres, Radians, RadiansPerSecond, Seconds, Vector3 } from '../units.js';
import type { StateVector } from './elements.js';
import { solveKepler } from './kepler.js';

/** Seconds in one week, 7 × 86 400 (definition). */
const SECONDS_PER_WEEK: Seconds = 604_800;

/** Navigation systems whose Keplerian broadcast ephemerides are modelled here. */
export type KeplerianSystem = 'G' | 'E' | 'C';

/** Broadcast message kinds modelled here: GPS LNAV, Galileo I/NAV and F/NAV, BeiDou D1 (MEO/IGSO) and D2 (GEO). */
export type KeplerianNavMessage = 'LNAV' | 'INAV' | 'FNAV' | 'D1' | 'D2';

/**
 * One broadcast ephemeris and clock record, fields in SI units (radians, not semicircles).
 * Field names follow the interface specifications.
 */
export interface KeplerianBroadcastEphemeris {
  /** Satellite identifier `<system><2-digit PRN>`, e.g. `G05`. */
  readonly satellite: string;
  readonly system: KeplerianSystem;
  readonly message: KeplerianNavMessage;
  /** Clock reference time t_oc, an absolute instant (broadcast as a reading of the system's own scale). */
  readonly toc: Instant;
  /**
   * Ephemeris reference time t_oe, an absolute instant (week resolved; broadcast as seconds of week of the
   * system's own scale, at or after the system's week 0: 1980-01-06 GPST, 1999-08-22 GST, 2006-01-01 BDT).
   */
  readonly toe: Instant;
  /** a_f0 (BeiDou a0), in seconds. */
  readonly af0: Seconds;
  /** a_f1, in s/s. */
  readonly af1: number;
  /** a_f2, in s/s². */
  readonly af2: number;
  /** Issue of data (GPS IODE, Galileo IODnav, BeiDou AODE). */
  readonly issueOfData: number;
  /** √A, in √m. */
  readonly sqrtA: number;
  /** e, dimensionless. */
  readonly eccentricity: number;
  /** M0, in radians. */
  readonly m0: Radians;
  /** Δn, in rad/s. */
  readonly deltaN: RadiansPerSecond;
  /** Ω0, in radians. */
  readonly omega0: Radians;
  /** i0, in radians. */
  readonly i0: Radians;
  /** ω (argument of perigee), in radians. */
  readonly argumentOfPerigee: Radians;
  /** Ω̇, in rad/s. */
  readonly omegaDot: RadiansPerSecond;
  /** IDOT, in rad/s. */
  readonly idot: RadiansPerSecond;
  /** Harmonic corrections: C_uc, C_us, C_ic, C_is in radians; C_rc, C_rs in metres. */
  readonly cuc: Radians;
  readonly cus: Radians;
  readonly cic: Radians;
  readonly cis: Radians;
  readonly crc: Metres;
  readonly crs: Metres;
  /** Health word as broadcast; 0 = healthy for all three systems. */
  readonly health: number;
  /** Curve-fit interval, in seconds (GPS from the record; otherwise the default of {@link defaultFitIntervalSeconds}). */
  readonly fitIntervalSeconds: Seconds;
  /** Transmission time of message, an absolute instant, when known (week resolved; used to break ties in {@link selectEphemeris}). */
  readonly transmission?: Instant;
  /**
   * Broadcast group delays, in seconds, when known (used by `signalClockCorrection`): GPS `TGD`;
   * Galileo `BGD_E5a_E1`, `BGD_E5b_E1`; BeiDou `TGD1`, `TGD2` (the names `readRinexNav` uses).
   */
  readonly groupDelays?: Readonly<Record<string, number>>;
}

/** Result of evaluating one record at one time. */
export interface BroadcastEvaluation {
  /** Earth-fixed position and velocity (WGS 84 / GTRF / CGCS2000 frame of the system), m and m/s. */
  readonly state: StateVector;
  /** t_k = t − t_oe, in seconds. */
  readonly timeFromEphemeris: Seconds;
  /** E_k, in radians. */
  readonly eccentricAnomaly: Radians;
  /** Δt_r = F·e·√A·sin E_k, in seconds. */
  readonly relativisticSeconds: Seconds;
  /** a_f0 + a_f1(t − t_oc) + a_f2(t − t_oc)², in seconds. */
  readonly polynomialSeconds: Seconds;
  /** Δt_sv = polynomial + Δt_r, in seconds (group delays not applied: see `signalClockCorrection`). */
  readonly clockCorrectionSeconds: Seconds;
}

/** Each system's own time scale (GPST, GST, BDT): its records' epochs are broadcast as readings of it. */
export const SYSTEM_TIME_SCALE: Readonly<Record<KeplerianSystem, OrbitScale>> = Object.freeze({
  G: 'GPS',
  E: 'GST',
  C: 'BDT',
});

/** How to give an evaluation time, for the error of anything else (a bare number of seconds included). */
const INSTANT_HINT =
  "Build one with createTimeScales(BUNDLED_LEAP_SECONDS).parseIso('2024-01-07T01:00:00', 'GPS') (@tauline/sdk/time; " +
  "'GST' or 'BDT' for a reading of Galileo or BeiDou time), or from a record's own epoch, e.g. ephemeris.toe.plus(600); " +
  'a float count of seconds since 1980-01-06 is not accepted';

/**
 * The evaluation time, which must be an {@link Instant}.
 * @throws {InvalidArgumentError} naming `argument`, with a hint how to build an Instant.
 */
function requireOrbitTime(argument: string, value: unknown): Instant {
  if (value instanceof Instant) return value;
  throw new InvalidArgumentError(argument, value, 'an Instant (an absolute time)', INSTANT_HINT);
}

/** The constant set each system's user algorithm uses (GM, Ω̇_E, F, π). */
export function systemConstants(system: KeplerianSystem): ConstantSet {
  switch (system) {
    case 'G':
      return GPS_ICD;
    case 'E':
      return GALILEO_ICD;
    case 'C':
      return BEIDOU_ICD;
    default:
      throw new InvalidArgumentError('system', system, "one of 'G' (GPS), 'E' (Galileo), 'C' (BeiDou)");
  }
}

/**
 * Default curve-fit interval when a record carries none: 4 hours, i.e. valid for |t − t_oe| ≤ 2 h.
 * GPS: IS-GPS-200 §20.3.4.4, fit-interval flag 0 → 4 hours [M]. Galileo and BeiDou records carry
 * no fit interval; 4 hours is common practice, no source.
 */
export function defaultFitIntervalSeconds(): Seconds {
  return 4 * 3600;
}

/**
 * Week-crossover correction of a time difference computed from seconds of week:
 * adds or subtracts 604 800 s so that the result lies in [−302 400, 302 400].
 *
 * @param dt  A difference of two seconds-of-week values, in seconds.
 * @returns The difference referred to the nearest week, in seconds.
 * @throws {InvalidArgumentError} if `dt` is not finite.
 * @see IS-GPS-200 §20.3.3.3.3.1 and Table 20-IV note on t_k ("if t_k > 302 400 subtract 604 800 …") [M].
 */
export function weekCrossover(dt: Seconds): Seconds {
  requireFinite('dt', dt, 'a finite time difference in seconds');
  // One subtraction of the nearest whole number of weeks (a loop would never end for huge |dt|).
  const d = dt - Math.round(dt / SECONDS_PER_WEEK) * SECONDS_PER_WEEK;
  // Math.round sends an exact half week up; keep +302 400 as the ICD's closed bound does.
  return d === -SECONDS_PER_WEEK / 2 && dt > 0 ? SECONDS_PER_WEEK / 2 : d;
}

/**
 * Whether a BeiDou satellite is geostationary (its D2 ephemeris needs the GEO rotation):
 * C01–C05 and C59–C63.
 * PRN ranges from memory [M]; no published assignment list was checked (the GEO algorithm itself: BDS-SIS-ICD B1I §5.2.4.12 [M]).
 */
export function isBeidouGeostationary(satellite: string): boolean {
  if (typeof satellite !== 'string')
    throw new InvalidArgumentError('satellite', satellite, 'a satellite identifier such as "C03"');
  const m = /^C(\d\d)$/.exec(satellite);
  if (!m) return false;
  const prn = Number(m[1]);
  return (prn >= 1 && prn <= 5) || (prn >= 59 && prn <= 63);
}

function validateRecord(eph: KeplerianBroadcastEphemeris, name = 'ephemeris'): void {
  if (eph === null || typeof eph !== 'object')
    throw new InvalidArgumentError(name, eph, 'a broadcast ephemeris record');
  systemConstants(eph.system);
  requireInstant(`${name}.toc`, eph.toc);
  requireInstant(`${name}.toe`, eph.toe);
  if (eph.transmission !== undefined) requireInstant(`${name}.transmission`, eph.transmission);
  for (const key of [
    'af0',
    'af1',
    'af2',
    'm0',
    'deltaN',
    'omega0',
    'i0',
    'argumentOfPerigee',
    'omegaDot',
    'idot',
    'cuc',
    'cus',
    'cic',
    'cis',
    'crc',
    'crs',
  ] as const) {
    requireFinite(`${name}.${key}`, eph[key]);
  }
  const sqrtA = requireFinite(`${name}.sqrtA`, eph.sqrtA, 'a finite √A in √m');
  // √A between ~2500 √m (a = 6.3e6 m) and 1e5 √m: anything else is not an Earth orbit (plausibility bound, our own choice).
  if (!(sqrtA > 2500 && sqrtA < 1e5)) {
    throw new InvalidArgumentError(
      `${name}.sqrtA`,
      sqrtA,
      'in (2500, 100000) √m (square root of the semi-major axis in metres)',
      sqrtA > 0 && sqrtA <= 2500 && sqrtA * Math.sqrt(1000) > 2500
        ? 'did you give √A with A in kilometres?'
        : undefined,
    );
  }
  const e = requireFinite(`${name}.eccentricity`, eph.eccentricity, 'in [0, 1)');
  if (e < 0 || e >= 1) throw new InvalidArgumentError(`${name}.eccentricity`, e, 'in [0, 1) for an elliptical orbit');
}

/**
 * t_oe in seconds of week of the record's system scale (the broadcast t_oe field), read by the time module.
 * @throws {InvalidArgumentError} naming `${name}.toe` when t_oe lies before the system's week 0.
 */
function toeSecondsOfWeek(eph: KeplerianBroadcastEphemeris, name: string): Seconds {
  try {
    return weekSecondsFromInstant(eph.toe, SYSTEM_TIME_SCALE[eph.system]).secondsOfWeek;
  } catch (error) {
    if (!(error instanceof OutOfDomainError)) throw error;
    throw new InvalidArgumentError(
      `${name}.toe`,
      eph.toe.toString(),
      `an instant at or after the start of the system's week 0 (${error.validFrom})`,
    );
  }
}

/**
 * BeiDou GEO satellites: position and velocity in the broadcast's inclined frame rotated to Earth-fixed,
 * r = R_Z(Ω̇_E t_k) R_X(−5°) r_GK (source tagged on the first comment line below); `pi` is the system's interface-spec π.
 */
function beidouGeoToEarthFixed(
  [x, y, z]: Vector3,
  [vx, vy, vz]: Vector3,
  omegaE: number,
  tk: number,
  pi: number,
): [Vector3, Vector3] {
  // r = R_Z(Ω̇_E t_k) R_X(−5°) r_GK; R_X(φ) = [[1,0,0],[0,cos φ,sin φ],[0,−sin φ,cos φ]],
  // R_Z(φ) = [[cos φ, sin φ, 0],[−sin φ, cos φ, 0],[0,0,1]] (BDS-SIS-ICD §5.2.4.12 [M]).
  const tilt = (-5 * pi) / 180;
  const cx = Math.cos(tilt);
  const sx = Math.sin(tilt);
  const y1 = cx * y + sx * z;
  const z1 = -sx * y + cx * z;
  const vy1 = cx * vy + sx * vz;
  const vz1 = -sx * vy + cx * vz;
  const ang = omegaE * tk;
  const cz = Math.cos(ang);
  const sz = Math.sin(ang);
  const x2 = cz * x + sz * y1;
  const y2 = -sz * x + cz * y1;
  // d/dt[R_Z(ω t) p] = R_Z(ω t) ṗ + ω·(R_Z'(ω t)) p, with R_Z' p = (−sin·px + cos·py, −cos·px − sin·py, 0).
  const vx2 = cz * vx + sz * vy1 + omegaE * (-sz * x + cz * y1);
  const vy2 = -sz * vx + cz * vy1 + omegaE * (-cz * x - sz * y1);
  return [
    [x2, y2, z1],
    [vx2, vy2, vz1],
  ];
}

/**
 * Evaluates a broadcast record at time t: the interface-specification user algorithm for the
 * Earth-fixed position and velocity, the relativistic correction and the clock correction.
 *
 * Position (IS-GPS-200 Table 20-IV [M]; same algorithm in the Galileo OS SIS ICD §5.1.1 [M] and
 * BDS-SIS-ICD §5.2.4.12 [M]):
 *   A = (√A)², n = √(μ/A³) + Δn, t_k = t − t_oe, M_k = M0 + n t_k, M_k = E_k − e sin E_k,
 *   ν_k = atan2(√(1−e²) sin E_k, cos E_k − e), Φ_k = ν_k + ω,
 *   u_k = Φ_k + C_us sin 2Φ_k + C_uc cos 2Φ_k, r_k = A(1 − e cos E_k) + C_rs sin 2Φ_k + C_rc cos 2Φ_k,
 *   i_k = i0 + IDOT t_k + C_is sin 2Φ_k + C_ic cos 2Φ_k,
 *   Ω_k = Ω0 + (Ω̇ − Ω̇_E) t_k − Ω̇_E t_oe   (t_oe in seconds of week),
 *   x = x' cos Ω_k − y' cos i_k sin Ω_k, y = x' sin Ω_k + y' cos i_k cos Ω_k, z = y' sin i_k.
 * BeiDou GEO (C01–C05, C59–C63): Ω_k = Ω0 + Ω̇ t_k − Ω̇_E t_oe, then
 *   r = R_Z(Ω̇_E t_k) R_X(−5°) r_GK (BDS-SIS-ICD §5.2.4.12 [M]).
 * Velocity: the time derivative of the same expressions (chain rule; written out below and
 * checked against finite differences in the tests).
 * Clock (IS-GPS-200 §20.3.3.3.3.1 [M]): Δt_sv = a_f0 + a_f1(t − t_oc) + a_f2(t − t_oc)² + Δt_r,
 *   Δt_r = F e √A sin E_k, F = −2√μ/c² of the system's constant set.
 *
 * @param ephemeris  The record (SI units; t_oc, t_oe as Instants).
 * @param time       Evaluation time, an Instant (e.g. `ts.parseIso('2024-01-07T01:00:00', 'GPS')`).
 * @returns State (m, m/s, Earth-fixed), t_k (s), E_k (rad), Δt_r (s), polynomial (s), Δt_sv (s).
 * @throws {InvalidArgumentError} if `time` is not an Instant (a number of seconds included: the message says
 *   how to build one), or the record has a non-finite field, t_oc/t_oe that are not Instants, t_oe before
 *   the system's week 0, √A outside (2500, 1e5) √m or e outside [0, 1).
 * @see IS-GPS-200 Table 20-IV and §20.3.3.3.3.1 [M]; Galileo OS SIS ICD §5.1.1, §5.1.4 [M];
 *   BDS-SIS-ICD B1I §5.2.4.10, §5.2.4.12 [M]. Constants: the system's ConstantSet, each field with its source and tag.
 */
export function evaluateBroadcastEphemeris(ephemeris: KeplerianBroadcastEphemeris, time: Instant): BroadcastEvaluation {
  validateRecord(ephemeris);
  const at = requireOrbitTime('time', time);
  const eph = ephemeris;
  const k = systemConstants(eph.system);
  const mu = k.gm;
  const omegaE = k.earthRotationRate;

  const A = eph.sqrtA * eph.sqrtA;
  const n0 = Math.sqrt(mu / (A * A * A));
  const n = n0 + eph.deltaN;
  // t_k = t − t_oe as a difference of instants: exact to ~1e-16 s, no week crossover to correct.
  const tk = at.secondsSince(eph.toe);
  const toeOfWeek = toeSecondsOfWeek(eph, 'ephemeris');
  const e = eph.eccentricity;
  const Mk = eph.m0 + n * tk;
  const Ek = solveKepler(Mk, e);
  const sinE = Math.sin(Ek);
  const cosE = Math.cos(Ek);
  const oneMinusECosE = 1 - e * cosE;
  const sqrt1me2 = Math.sqrt((1 - e) * (1 + e));
  const nu = Math.atan2(sqrt1me2 * sinE, cosE - e);
  const phi = nu + eph.argumentOfPerigee;
  const sin2p = Math.sin(2 * phi);
  const cos2p = Math.cos(2 * phi);
  const du = eph.cus * sin2p + eph.cuc * cos2p;
  const dr = eph.crs * sin2p + eph.crc * cos2p;
  const di = eph.cis * sin2p + eph.cic * cos2p;
  const u = phi + du;
  const r = A * oneMinusECosE + dr;
  const inc = eph.i0 + di + eph.idot * tk;

  // Rates (d/dt of the lines above).
  const EkDot = n / oneMinusECosE;
  const nuDot = (EkDot * sqrt1me2) / oneMinusECosE;
  const uDot = nuDot * (1 + 2 * (eph.cus * cos2p - eph.cuc * sin2p));
  const rDot = A * e * sinE * EkDot + 2 * nuDot * (eph.crs * cos2p - eph.crc * sin2p);
  const iDot = eph.idot + 2 * nuDot * (eph.cis * cos2p - eph.cic * sin2p);

  const cosU = Math.cos(u);
  const sinU = Math.sin(u);
  const xp = r * cosU;
  const yp = r * sinU;
  const xpDot = rDot * cosU - r * uDot * sinU;
  const ypDot = rDot * sinU + r * uDot * cosU;

  const geo = eph.system === 'C' && isBeidouGeostationary(eph.satellite);
  // Node longitude: Earth-fixed for the standard algorithm, inertial-like for BeiDou GEO.
  const omegaRate = geo ? eph.omegaDot : eph.omegaDot - omegaE;
  const Om = eph.omega0 + omegaRate * tk - omegaE * toeOfWeek;
  const cosO = Math.cos(Om);
  const sinO = Math.sin(Om);
  const cosI = Math.cos(inc);
  const sinI = Math.sin(inc);

  let x = xp * cosO - yp * cosI * sinO;
  let y = xp * sinO + yp * cosI * cosO;
  let z = yp * sinI;
  let vx = xpDot * cosO - ypDot * cosI * sinO + yp * sinI * iDot * sinO - omegaRate * y;
  let vy = xpDot * sinO + ypDot * cosI * cosO - yp * sinI * iDot * cosO + omegaRate * x;
  let vz = ypDot * sinI + yp * cosI * iDot;

  if (geo) [[x, y, z], [vx, vy, vz]] = beidouGeoToEarthFixed([x, y, z], [vx, vy, vz], omegaE, tk, k.pi);

  // IS-GPS-200 §20.3.3.3.3.1 [M]: Δt_r = F e √A sin E_k.
  const relativisticSeconds = k.relativisticF * e * eph.sqrtA * sinE;
  const dtc = at.secondsSince(eph.toc);
  // IS-GPS-200 §20.3.3.3.3.1 [M]: a_f0 + a_f1 (t − t_oc) + a_f2 (t − t_oc)².
  const polynomialSeconds = eph.af0 + eph.af1 * dtc + eph.af2 * dtc * dtc;
  const position: Vector3 = [x, y, z];
  const velocity: Vector3 = [vx, vy, vz];
  return {
    state: { position, velocity },
    timeFromEphemeris: tk,
    eccentricAnomaly: Ek,
    relativisticSeconds,
    polynomialSeconds,
    clockCorrectionSeconds: polynomialSeconds + relativisticSeconds,
  };
}

/** Options of {@link selectEphemeris}. */
export interface EphemerisSelectionOptions {
  /** Accept records whose health word is non-zero (default false). */
  readonly includeUnhealthy?: boolean;
  /** Galileo message to prefer when both I/NAV and F/NAV records exist (default `INAV`). */
  readonly galileoMessage?: 'INAV' | 'FNAV';
}

/**
 * Chooses the record for a satellite at time t by the usual rule (common practice, no source):
 * among healthy records (unless `includeUnhealthy`) of the preferred message kind whose
 * curve-fit interval covers t (|t − t_oe| ≤ fit/2), the one with the nearest t_oe; ties go to
 * the record with t_oe ≤ t (already broadcast in real time), then to the latest transmission time
 * (a record without one last), then to the highest issue of data. Galileo falls back to the other
 * message kind only when the preferred one has no valid record.
 *
 * @param records  Records of one satellite (any order).
 * @param time     Time, an Instant (e.g. `ts.parseIso('2024-01-07T01:00:00', 'GPS')`).
 * @returns The chosen record (the caller's own record type), or `undefined` when none is valid at t.
 * @throws {InvalidArgumentError} if `time` is not an Instant (a number of seconds included: the message says
 *   how to build one), or a record is malformed (named by its index).
 */
export function selectEphemeris<R extends KeplerianBroadcastEphemeris>(
  records: readonly R[],
  time: Instant,
  options: EphemerisSelectionOptions = {},
): R | undefined {
  const at = requireOrbitTime('time', time);
  if (!Array.isArray(records))
    throw new InvalidArgumentError('records', records, 'an array of broadcast ephemeris records');
  records.forEach((r, i) => {
    validateRecord(r, `records[${i}]`);
    requireFinite(`records[${i}].issueOfData`, r.issueOfData);
    requireFinite(`records[${i}].health`, r.health);
    requirePositive(`records[${i}].fitIntervalSeconds`, r.fitIntervalSeconds, 's');
  });
  requireOptions('options', options);
  const preferred = options.galileoMessage ?? 'INAV';
  const pick = (filter: (r: R) => boolean) => {
    let best: Candidate<R> | undefined;
    for (const record of records) {
      if (!filter(record)) continue;
      if (!options.includeUnhealthy && record.health !== 0) continue;
      const distance = Math.abs(at.secondsSince(record.toe));
      if (distance > record.fitIntervalSeconds / 2) continue;
      const candidate = { record, distance, toeAfterTime: record.toe.isAfter(at) };
      if (!best || isBetter(candidate, best)) best = candidate;
    }
    return best?.record;
  };
  const first = pick((r) => r.system !== 'E' || r.message === preferred);
  if (first) return first;
  return pick((r) => r.system === 'E' && r.message !== preferred);
}

/** A record valid at the selection time, with what the selection rule orders it by. */
interface Candidate<R extends KeplerianBroadcastEphemeris> {
  readonly record: R;
  /** |t − t_oe|, in seconds. */
  readonly distance: Seconds;
  /** Whether t_oe lies after t (not yet broadcast in real time). */
  readonly toeAfterTime: boolean;
}

/** Whether `a` wins over `b` by the rule of {@link selectEphemeris} (strictly: an equal candidate does not). */
function isBetter<R extends KeplerianBroadcastEphemeris>(a: Candidate<R>, b: Candidate<R>): boolean {
  if (a.distance !== b.distance) return a.distance < b.distance;
  if (a.toeAfterTime !== b.toeAfterTime) return !a.toeAfterTime;
  const ta = a.record.transmission;
  const tb = b.record.transmission;
  if (ta !== undefined && tb !== undefined) {
    const order = ta.compare(tb);
    if (order !== 0) return order > 0;
  } else if (ta !== undefined || tb !== undefined) {
    return ta !== undefined;
  }
  return a.record.issueOfData > b.record.issueOfData;
}
