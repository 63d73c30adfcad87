import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { BEIDOU_ICD, GALILEO_ICD, GPS_ICD, SPEED_OF_LIGHT } from '../../src/constants.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { parseRinexNav } from '../../src/io/rinex-nav.js';
import {
  evaluateBroadcastEphemeris,
  isBeidouGeostationary,
  type KeplerianBroadcastEphemeris,
  SYSTEM_TIME_SCALE,
  selectEphemeris,
  systemConstants,
  weekCrossover,
} from '../../src/orbit/broadcast.js';
import * as orbitModule from '../../src/orbit/index.js';
import { propagateKeplerState } from '../../src/orbit/propagate.js';
import { scaleSecondsFromInstant } from '../../src/time/file-epochs.js';
import type { Instant } from '../../src/time/instant.js';
import { instantFromWeekSeconds } from '../../src/time/weeks.js';

/** Start of GPS week 2296, 2024-01-07T00:00:00 GPST (GST reads the same; IS-GPS-200 week count, common practice). */
const WEEK_2296 = instantFromWeekSeconds('GPS', 2296, 0);
const NAV = parseRinexNav(
  readFileSync(new URL('../../../../test/fixtures/rinex-nav/mixed-v305.rnx', import.meta.url), 'utf8'),
);
const record = (sat: string, k = 0) => NAV.ephemerides.filter((e) => e.satellite === sat)[k]!;

/** A GPS record with no perturbation terms: the user algorithm reduces to a two-body orbit. */
function twoBody(overrides: Partial<KeplerianBroadcastEphemeris> = {}): KeplerianBroadcastEphemeris {
  return {
    satellite: 'G01',
    system: 'G',
    message: 'LNAV',
    toc: WEEK_2296.plus(7200),
    toe: WEEK_2296.plus(7200),
    af0: 0,
    af1: 0,
    af2: 0,
    issueOfData: 1,
    sqrtA: 5153.79589081,
    eccentricity: 0.0123456789,
    m0: 0.7,
    deltaN: 0,
    omega0: 1.3,
    i0: 0.96,
    argumentOfPerigee: -0.4,
    omegaDot: 0,
    idot: 0,
    cuc: 0,
    cus: 0,
    cic: 0,
    cis: 0,
    crc: 0,
    crs: 0,
    health: 0,
    fitIntervalSeconds: 14400,
    ...overrides,
  };
}

const dot = (a: readonly number[], b: readonly number[]) => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
const dist = (a: readonly number[], b: readonly number[]) => Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!);

describe('evaluateBroadcastEphemeris: independent checks of the interface-spec algorithm (IS-GPS-200 Table 20-IV [M])', () => {
  it('evaluateBroadcastEphemeris(two-body record, t) equals a two-body propagation in an inertial frame rotated by Ω_E·(t_oe + t_k) (independent computation [C])', () => {
    const eph = twoBody();
    const toeOfWeek = 7200;
    for (const tk of [-7200, -1800, 0, 950, 7200]) {
      const got = evaluateBroadcastEphemeris(eph, eph.toe.plus(tk)).state;
      // Inertial frame = Earth-fixed frame at the start of the week: node Ω0, then rotate by θ = Ω_E (t_oe + t_k).
      const inertial = propagateKeplerState(
        {
          semiMajorAxis: eph.sqrtA ** 2,
          eccentricity: eph.eccentricity,
          inclination: eph.i0,
          raan: eph.omega0,
          argumentOfPerigee: eph.argumentOfPerigee,
          meanAnomaly: eph.m0,
        },
        tk,
        GPS_ICD.gm,
      );
      const theta = GPS_ICD.earthRotationRate * (toeOfWeek + tk);
      const c = Math.cos(theta);
      const s = Math.sin(theta);
      const [x, y, z] = inertial.position;
      const [vx, vy, vz] = inertial.velocity;
      const r = [c * x + s * y, -s * x + c * y, z];
      const w = GPS_ICD.earthRotationRate;
      // v_fixed = R v_inertial − ω × r_fixed.
      const v = [c * vx + s * vy + w * r[1]!, -s * vx + c * vy - w * r[0]!, vz];
      expect(dist(got.position, r)).toBeLessThan(1e-4);
      expect(dist(got.velocity, v)).toBeLessThan(1e-7);
    }
  });

  it('evaluateBroadcastEphemeris(record, t).state.velocity matches a central difference of positions (all harmonic terms on)', () => {
    for (const eph of [record('G05'), record('E11'), record('C08'), record('C03'), record('C21')]) {
      for (const tk of [-5000, 0, 3333]) {
        const t = eph.toe.plus(tk);
        const h = 0.5;
        const p = (dt: number) => evaluateBroadcastEphemeris(eph, t.plus(dt)).state.position;
        const fd = [0, 1, 2].map((k) => (-p(2 * h)[k]! + 8 * p(h)[k]! - 8 * p(-h)[k]! + p(-2 * h)[k]!) / (12 * h));
        expect(dist(evaluateBroadcastEphemeris(eph, t).state.velocity, fd)).toBeLessThan(2e-5);
      }
    }
  });

  it('evaluateBroadcastEphemeris(two-body record, t) gives −2 r·v/c² (Earth-fixed) = F e √A sin E_k (IERS 2010 eqs. 10.10–10.11 [V1]; ECEF r·v = inertial r·v, physics-refs §13.3)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -7200, max: 7200, noNaN: true }),
        fc.double({ min: 0, max: 0.2, noNaN: true }),
        (tk, e) => {
          const eph = twoBody({ eccentricity: e });
          const ev = evaluateBroadcastEphemeris(eph, eph.toe.plus(tk));
          const fromState = (-2 * dot(ev.state.position, ev.state.velocity)) / SPEED_OF_LIGHT ** 2;
          expect(Math.abs(fromState - ev.relativisticSeconds)).toBeLessThan(2e-17);
        },
      ),
      { seed: 20261202, numRuns: 200 },
    );
  });

  it('evaluateBroadcastEphemeris(record, t) with harmonic corrections keeps −2 r·v/c² within 0.05 ns of F e √A sin E_k (the corrections shift r·v by ~0.01 ns)', () => {
    let worst = 0;
    for (const eph of [record('G05'), record('G07'), record('E11'), record('C08'), record('C03'), record('C21')]) {
      for (let tk = -7200; tk <= 7200; tk += 900) {
        const ev = evaluateBroadcastEphemeris(eph, eph.toe.plus(tk));
        worst = Math.max(
          worst,
          Math.abs((-2 * dot(ev.state.position, ev.state.velocity)) / SPEED_OF_LIGHT ** 2 - ev.relativisticSeconds),
        );
      }
    }
    expect(worst).toBeLessThan(5e-11);
    expect(worst).toBeGreaterThan(1e-13);
  });

  it('evaluateBroadcastEphemeris(record, t) keeps |r| equal to the corrected radius A(1 − e cos E_k) + δr (rotations preserve length), including the BeiDou GEO rotation', () => {
    for (const eph of [record('G05'), record('C03')]) {
      const ev = evaluateBroadcastEphemeris(eph, eph.toe.plus(1234));
      const A = eph.sqrtA ** 2;
      const E = ev.eccentricAnomaly;
      const e = eph.eccentricity;
      const nu = Math.atan2(Math.sqrt(1 - e * e) * Math.sin(E), Math.cos(E) - e);
      const phi = nu + eph.argumentOfPerigee;
      const r = A * (1 - e * Math.cos(E)) + eph.crs * Math.sin(2 * phi) + eph.crc * Math.cos(2 * phi);
      expect(Math.abs(Math.hypot(...ev.state.position) - r)).toBeLessThan(1e-6);
    }
  });

  it('evaluateBroadcastEphemeris(BeiDou GEO record, t) stays near the geostationary radius with small Earth-fixed speed (BDS-SIS-ICD §5.2.4.12 GEO algorithm [M])', () => {
    const geo = record('C03');
    expect(geo.message).toBe('D2');
    for (const tk of [0, 3600, 7200]) {
      const ev = evaluateBroadcastEphemeris(geo, geo.toe.plus(tk));
      expect(Math.hypot(...ev.state.position)).toBeGreaterThan(42.1e6);
      expect(Math.hypot(...ev.state.position)).toBeLessThan(42.2e6);
      expect(Math.hypot(...ev.state.velocity)).toBeLessThan(300);
    }
  });

  it('evaluateBroadcastEphemeris(record, t) is continuous between consecutive records of the same orbit (G05 at 01:00 from t_oe 00:00 and 02:00)', () => {
    const t = WEEK_2296.plus(3600);
    const a = evaluateBroadcastEphemeris(record('G05', 0), t);
    const b = evaluateBroadcastEphemeris(record('G05', 1), t);
    expect(dist(a.state.position, b.state.position)).toBeLessThan(1e-2);
    expect(Math.abs(a.relativisticSeconds - b.relativisticSeconds)).toBeLessThan(1e-16);
  });

  it('evaluateBroadcastEphemeris(record of the previous week, t after midnight) uses t_k across the week boundary: t_k = weekCrossover(sow(t) − t_oe)', () => {
    const g11 = record('G11');
    const t = WEEK_2296.plus(1800);
    const ev = evaluateBroadcastEphemeris(g11, t);
    expect(ev.timeFromEphemeris).toBe(9000);
    expect(weekCrossover(1800 - g11.toeSecondsOfWeek)).toBe(9000);
  });

  it("evaluateBroadcastEphemeris(record, t) uses each system's F: GPS −4.442807633e-10, Galileo/BeiDou −4.442807309e-10 s/√m (physics-refs §3, §6, §13.1 [C])", () => {
    expect(systemConstants('G')).toBe(GPS_ICD);
    expect(systemConstants('E')).toBe(GALILEO_ICD);
    expect(systemConstants('C')).toBe(BEIDOU_ICD);
    const g = twoBody();
    const e = twoBody({ system: 'E', satellite: 'E01', message: 'INAV' });
    const rg = evaluateBroadcastEphemeris(g, g.toe).relativisticSeconds;
    const E = evaluateBroadcastEphemeris(g, g.toe).eccentricAnomaly;
    expect(rg).toBeCloseTo(-4.442807633393e-10 * g.eccentricity * g.sqrtA * Math.sin(E), 20);
    const Ee = evaluateBroadcastEphemeris(e, e.toe).eccentricAnomaly;
    expect(evaluateBroadcastEphemeris(e, e.toe).relativisticSeconds).toBeCloseTo(
      -4.442807309044e-10 * e.eccentricity * e.sqrtA * Math.sin(Ee),
      20,
    );
  });

  it('evaluateBroadcastEphemeris(ephemeris, t) rejects e ≥ 1, √A given with A in km, a NaN field, an unknown system and epochs that are not Instants', () => {
    const eph = twoBody();
    expect(() => evaluateBroadcastEphemeris({ ...eph, toe: 1.388e9 as unknown as Instant }, eph.toe)).toThrow(
      /ephemeris\.toe must be an Instant/,
    );
    expect(() => evaluateBroadcastEphemeris({ ...eph, toc: undefined as unknown as Instant }, eph.toe)).toThrow(
      /ephemeris\.toc must be an Instant/,
    );
    expect(() => evaluateBroadcastEphemeris({ ...eph, transmission: 0 as unknown as Instant }, eph.toe)).toThrow(
      /ephemeris\.transmission must be an Instant/,
    );
    expect(() => evaluateBroadcastEphemeris(twoBody({ eccentricity: 1 }), eph.toe)).toThrow(
      /eccentricity must be in \[0, 1\)/,
    );
    expect(() => evaluateBroadcastEphemeris(twoBody({ eccentricity: -0.1 }), eph.toe)).toThrow(/eccentricity/);
    expect(() => evaluateBroadcastEphemeris(twoBody({ sqrtA: 162.97 }), eph.toe)).toThrow(
      /did you give √A with A in kilometres/,
    );
    expect(() => evaluateBroadcastEphemeris(twoBody({ cuc: Number.NaN }), eph.toe)).toThrow(/ephemeris\.cuc/);
    expect(() => evaluateBroadcastEphemeris(twoBody({ system: 'R' as 'G' }), eph.toe)).toThrow(/one of 'G'/);
    expect(() => evaluateBroadcastEphemeris(null as unknown as KeplerianBroadcastEphemeris, eph.toe)).toThrow(
      /broadcast ephemeris record/,
    );
  });
});

describe('evaluateBroadcastEphemeris, selectEphemeris: absolute times are Instants only', () => {
  it('evaluateBroadcastEphemeris(record, seconds) refuses a bare number naming `time`, with a hint how to build an Instant', () => {
    const eph = twoBody();
    for (const bad of [2296 * 604800 + 7200, Number.NaN, '2024-01-07T02:00:00', undefined]) {
      const error = (() => {
        try {
          evaluateBroadcastEphemeris(eph, bad as unknown as Instant);
        } catch (e) {
          return e;
        }
      })();
      expect(error).toBeInstanceOf(InvalidArgumentError);
      expect((error as InvalidArgumentError).argument).toBe('time');
      expect((error as InvalidArgumentError).hint).toMatch(/parseIso\('2024-01-07T01:00:00', 'GPS'\)/);
    }
  });

  it('selectEphemeris(records, seconds) refuses a bare number the same way', () => {
    const g05 = NAV.ephemerides.filter((e) => e.satellite === 'G05');
    expect(() => selectEphemeris(g05, (2296 * 604800) as unknown as Instant)).toThrow(
      /time must be an Instant .*parseIso/,
    );
  });

  it('@tauline/sdk/orbit exports no float count of seconds since 1980 (ADR 31: it lives in time/ only as scaleSecondsFromInstant)', () => {
    expect('orbitTimeSeconds' in orbitModule).toBe(false);
  });

  it('scaleSecondsFromInstant(start of GPS week 2296, SYSTEM_TIME_SCALE[system]) is 2296 × 604800 s on GPST and GST and 14 s less on BDT (BDT = GPST − 14 s, physics-refs; common practice)', () => {
    expect(scaleSecondsFromInstant(WEEK_2296, SYSTEM_TIME_SCALE.G)).toBe(2296 * 604800);
    expect(scaleSecondsFromInstant(WEEK_2296, SYSTEM_TIME_SCALE.E)).toBe(2296 * 604800);
    expect(scaleSecondsFromInstant(WEEK_2296, SYSTEM_TIME_SCALE.C)).toBe(2296 * 604800 - 14);
  });

  it('evaluateBroadcastEphemeris(record with t_oe before its system week 0, t) names ephemeris.toe', () => {
    const beidou = twoBody({
      system: 'C',
      satellite: 'C08',
      message: 'D1',
      toe: instantFromWeekSeconds('GPS', 1300, 0),
    });
    expect(() => evaluateBroadcastEphemeris(beidou, beidou.toe)).toThrow(
      /ephemeris\.toe must be an instant at or after the start of the system's week 0 \(2006-01-01T00:00:00 BDT\)/,
    );
  });

  it('evaluateBroadcastEphemeris(record, t) takes t − t_oe and t − t_oc exactly for a t between the float count steps (independent exact arithmetic [C])', () => {
    // t = t_oe + 1234 s + 0.1 s (0.1 as its double). The exact t_k is 1234 + fl(0.1), whose nearest double is
    // fl(1234 + 0.1) (one rounding of an exact sum). The float count of seconds since 1980 (≈ 1.3887e9 s) steps
    // by 2^-22 s ≈ 2.4e-7 s, so the former t_k = count(t) − count(t_oe) was off by up to 2^-23 s ≈ 1.2e-7 s.
    const eph = twoBody({ af0: 1e-4, af1: 1e-11, af2: 1e-18, toc: WEEK_2296.plus(3600) });
    const t = eph.toe.plus(1234).plus(0.1);
    const ev = evaluateBroadcastEphemeris(eph, t);
    expect(ev.timeFromEphemeris).toBe(1234 + 0.1);
    const formerTk = scaleSecondsFromInstant(t, 'GPS') - scaleSecondsFromInstant(eph.toe, 'GPS'); // both exact subtractions
    expect(Math.abs(formerTk - (1234 + 0.1))).toBeGreaterThan(1e-8);
    expect(Math.abs(formerTk - (1234 + 0.1))).toBeLessThanOrEqual(2 ** -23);
    // t − t_oc = 4834.1 s: the clock polynomial on the exact span (IS-GPS-200 §20.3.3.3.3.1 [M]).
    const dtc = 4834 + 0.1;
    expect(ev.polynomialSeconds).toBe(1e-4 + 1e-11 * dtc + 1e-18 * dtc * dtc);
  });
});

describe('weekCrossover, isBeidouGeostationary', () => {
  it('weekCrossover(dt) folds a seconds-of-week difference into [−302400, 302400] (IS-GPS-200 §20.3.3.3.3.1 [M])', () => {
    expect(weekCrossover(-595800)).toBe(9000);
    expect(weekCrossover(595800)).toBe(-9000);
    expect(weekCrossover(302400)).toBe(302400);
    expect(weekCrossover(-302401)).toBe(302399);
    expect(weekCrossover(0)).toBe(0);
    expect(weekCrossover(-302400)).toBe(-302400);
    expect(Math.abs(weekCrossover(1e300))).toBeLessThanOrEqual(302400);
    expect(() => weekCrossover(Number.POSITIVE_INFINITY)).toThrow(InvalidArgumentError);
  });
  it('isBeidouGeostationary(id) is true for C01–C05 and C59–C63 only', () => {
    expect(['C01', 'C05', 'C59', 'C63'].every(isBeidouGeostationary)).toBe(true);
    expect(['C06', 'C58', 'C64', 'G01', 'C1'].some(isBeidouGeostationary)).toBe(false);
  });
});

describe('selectEphemeris: nearest valid t_oe within the fit interval (common practice, no source)', () => {
  const g05 = NAV.ephemerides.filter((e) => e.satellite === 'G05');
  it('selectEphemeris(records, t) picks the nearest t_oe and prefers t_oe ≤ t on a tie', () => {
    expect(selectEphemeris(g05, WEEK_2296.plus(1000))!.toe.secondsSince(WEEK_2296)).toBe(0);
    expect(selectEphemeris(g05, WEEK_2296.plus(5000))!.toe.secondsSince(WEEK_2296)).toBe(7200);
    expect(selectEphemeris(g05, WEEK_2296.plus(3600))!.toe.secondsSince(WEEK_2296)).toBe(0);
  });
  it('selectEphemeris(records, t) returns undefined outside every fit interval', () => {
    expect(selectEphemeris(g05, WEEK_2296.plus(-7201))).toBeUndefined();
    expect(selectEphemeris(g05, WEEK_2296.plus(7200 + 7201))).toBeUndefined();
    expect(selectEphemeris(g05, WEEK_2296.plus(7200 + 7200))).toBeDefined();
  });
  it('selectEphemeris(records, t) skips unhealthy records unless includeUnhealthy', () => {
    const g13 = NAV.ephemerides.filter((e) => e.satellite === 'G13');
    expect(selectEphemeris(g13, WEEK_2296)).toBeUndefined();
    expect(selectEphemeris(g13, WEEK_2296, { includeUnhealthy: true })!.health).toBe(63);
  });
  it('selectEphemeris(records, t) prefers Galileo I/NAV by default, F/NAV on request, and falls back to the other kind', () => {
    const e11 = NAV.ephemerides.filter((e) => e.satellite === 'E11');
    expect(selectEphemeris(e11, WEEK_2296)!.message).toBe('INAV');
    expect(selectEphemeris(e11, WEEK_2296, { galileoMessage: 'FNAV' })!.message).toBe('FNAV');
    expect(
      selectEphemeris(
        e11.filter((e) => e.message === 'FNAV'),
        WEEK_2296,
      )!.message,
    ).toBe('FNAV');
  });
  it('selectEphemeris(records, t) prefers the later transmission, then the higher issue of data, for equal t_oe', () => {
    const a = { ...g05[0]!, transmission: WEEK_2296.plus(-100), issueOfData: 1 };
    const b = { ...g05[0]!, transmission: WEEK_2296.plus(-50), issueOfData: 2 };
    const c = { ...g05[0]!, transmission: WEEK_2296.plus(-50), issueOfData: 3 };
    expect(selectEphemeris([a, b], WEEK_2296)).toBe(b);
    expect(selectEphemeris([b, c, a], WEEK_2296)).toBe(c);
    expect(selectEphemeris([a, { ...b, transmission: undefined }], WEEK_2296)).toBe(a);
  });
});
