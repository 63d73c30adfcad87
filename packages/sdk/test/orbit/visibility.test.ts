import { describe, expect, it } from 'vitest';
import { IERS_2010 } from '../../src/constants.js';
import { InvalidArgumentError } from '../../src/errors.js';
import {
  EARTH_ROTATION_ANGLE_RATE,
  earthRotationAngle,
  elevationFromStation,
  geodeticToEcef,
  j2SecularRates,
  type KeplerianElements,
  type MeanOrbit,
  predictPasses,
  propagateJ2Secular,
  satellitePositionEcef,
} from '../../src/orbit/index.js';
import { WGS84_ELLIPSOID } from '../../src/relativity/index.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '../../src/time/index.js';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const rad = (deg: number): number => (deg * Math.PI) / 180;
const MEO: KeplerianElements = {
  semiMajorAxis: 28_410_000,
  eccentricity: 0.0021,
  inclination: rad(58.5),
  raan: rad(40),
  argumentOfPerigee: rad(75),
  meanAnomaly: rad(10),
};

describe('geodeticToEcef (WGS 84)', () => {
  it('geodeticToEcef(37.7749° N, 122.4194° W, 16 m) matches the worked example of the brahe documentation within 1 mm', () => {
    // brahe documentation, "Geodetic transformations" (duncaneddy.github.io/brahe) [V2]:
    // x = −2706181.627 m, y = −4261070.165 m, z = 3885735.291 m (printed to the millimetre).
    const [x, y, z] = geodeticToEcef({ latitude: rad(37.7749), longitude: rad(-122.4194), height: 16 });
    expect(Math.abs(x - -2706181.627)).toBeLessThan(1e-3);
    expect(Math.abs(y - -4261070.165)).toBeLessThan(1e-3);
    expect(Math.abs(z - 3885735.291)).toBeLessThan(1e-3);
  });

  it('geodeticToEcef puts the equator at a and the pole at b = a(1 − f) = 6 356 752.3142 m of the WGS 84 ellipsoid', () => {
    // NIMA TR8350.2 (2000) Table 3.3, b = 6 356 752.3142 m [M]; the same a and f as relativity's WGS84_ELLIPSOID.
    expect(geodeticToEcef({ latitude: 0, longitude: 0, height: 0 })).toEqual([WGS84_ELLIPSOID.semiMajorAxis, 0, 0]);
    const pole = geodeticToEcef({ latitude: Math.PI / 2, longitude: 0, height: 0 });
    expect(Math.abs(pole[2] - WGS84_ELLIPSOID.semiMajorAxis * (1 - WGS84_ELLIPSOID.flattening))).toBeLessThan(1e-6);
    expect(Math.abs(pole[2] - 6_356_752.3142)).toBeLessThan(1e-4);
  });

  it('geodeticToEcef refuses a latitude in degrees, naming the field and the conversion', () => {
    expect(() => geodeticToEcef({ latitude: 47.3, longitude: 0, height: 0 })).toThrow(
      /position\.latitude.*looks like degrees/s,
    );
    expect(() => geodeticToEcef({ latitude: 0, longitude: 0, height: Number.NaN })).toThrow(InvalidArgumentError);
  });
});

describe('elevationFromStation', () => {
  const station = { latitude: rad(41.83), longitude: rad(23.05), height: 620 };
  const r = geodeticToEcef(station);
  const up = [
    Math.cos(station.latitude) * Math.cos(station.longitude),
    Math.cos(station.latitude) * Math.sin(station.longitude),
    Math.sin(station.latitude),
  ];

  it('elevationFromStation(station, point along the ellipsoid normal) is 90°, and 0 along the local east', () => {
    // The geodetic normal (cos φ cos λ, cos φ sin λ, sin φ) is the local vertical (NIMA TR8350.2 §4 [M]).
    const above: [number, number, number] = [r[0] + 2e7 * up[0]!, r[1] + 2e7 * up[1]!, r[2] + 2e7 * up[2]!];
    expect(Math.abs(elevationFromStation(station, above) - Math.PI / 2)).toBeLessThan(1e-7);
    const east = [-Math.sin(station.longitude), Math.cos(station.longitude), 0];
    const side: [number, number, number] = [r[0] + 1e6 * east[0]!, r[1] + 1e6 * east[1]!, r[2] + 1e6 * east[2]!];
    expect(Math.abs(elevationFromStation(station, side))).toBeLessThan(1e-12);
  });

  it('elevationFromStation(station at the sub-satellite point of an equatorial orbit) is 90° at that instant', () => {
    const orbit: MeanOrbit = {
      epoch: ts.parseIso('2027-03-01T00:00:00Z', 'UTC'),
      elements: {
        semiMajorAxis: 29_000_000,
        eccentricity: 0,
        inclination: 0,
        raan: 0,
        argumentOfPerigee: 0,
        meanAnomaly: 1,
      },
    };
    const at = ts.parseIso('2027-03-01T05:17:00Z', 'UTC');
    const p = satellitePositionEcef(orbit, at, { timeScales: ts });
    expect(Math.abs(p[2])).toBeLessThan(1e-6);
    const sub = { latitude: 0, longitude: Math.atan2(p[1], p[0]), height: 0 };
    expect(Math.abs(elevationFromStation(sub, p) - Math.PI / 2)).toBeLessThan(1e-7);
  });

  it('elevationFromStation refuses the station itself as the target', () => {
    expect(() => elevationFromStation(station, r)).toThrow(/pointEcef/);
  });
});

describe('earthRotationAngle (IERS Conventions 2010 eq. 5.15 [M])', () => {
  it('earthRotationAngle(2000-01-01T12:00:00 UTC) is 2π·0.7790572732640 rad (J2000.0, UT1 taken as UTC)', () => {
    expect(
      Math.abs(earthRotationAngle(ts.parseIso('2000-01-01T12:00:00Z', 'UTC'), ts) - 2 * Math.PI * 0.779057273264),
    ).toBeLessThan(1e-12);
  });

  it('earthRotationAngle advances 2π·0.00273781191135448 rad per UT1 day and EARTH_ROTATION_ANGLE_RATE matches it', () => {
    const a = earthRotationAngle(ts.parseIso('2027-03-01T00:00:00Z', 'UTC'), ts);
    const b = earthRotationAngle(ts.parseIso('2027-03-02T00:00:00Z', 'UTC'), ts);
    const step = (b - a + 2 * Math.PI) % (2 * Math.PI);
    expect(Math.abs(step - 2 * Math.PI * 0.00273781191135448)).toBeLessThan(1e-10);
    expect(Math.abs(EARTH_ROTATION_ANGLE_RATE * 86_400 - 2 * Math.PI * 1.00273781191135448)).toBeLessThan(1e-12);
    // The rate it implies, 7.2921151467e-5 rad/s, is the nominal ω = 7.292115e-5 rad/s of IERS 2010 to the half unit of its
    // last printed digit (5e-12) and the WGS 84 G873 value 7.2921151467e-5 of physics-refs §1 to 1e-15.
    expect(Math.abs(EARTH_ROTATION_ANGLE_RATE - IERS_2010.earthRotationRate)).toBeLessThanOrEqual(5e-12);
    expect(Math.abs(EARTH_ROTATION_ANGLE_RATE - 7.2921151467e-5)).toBeLessThan(1e-15);
  });
});

describe('j2SecularRates and propagateJ2Secular', () => {
  it('j2SecularRates gives dω/dt = 0 at the critical inclination acos(1/√5) = 63.4349°', () => {
    // Critical inclination: 4 − 5 sin²i = 0 (Vallado 4th ed. §9.6 [M]; common practice, e.g. Molniya orbits).
    const r = j2SecularRates({ ...MEO, inclination: Math.acos(1 / Math.sqrt(5)) });
    expect(Math.abs(r.argumentOfPerigeeRate)).toBeLessThan(1e-22);
  });

  it('j2SecularRates gives the Sun-synchronous node rate (360° per tropical year) at i ≈ 98.60° for a circular 800 km orbit', () => {
    // Common practice: Sun-synchronous orbits near 800 km altitude fly at i ≈ 98.6° [M]; 98.603° from a scipy root of
    // the same formula with IERS 2010 constants [C].
    const r = j2SecularRates({
      semiMajorAxis: 6_378_137 + 800e3,
      eccentricity: 0,
      inclination: rad(98.603),
      raan: 0,
      argumentOfPerigee: 0,
      meanAnomaly: 0,
    });
    const target = (2 * Math.PI) / (365.2422 * 86_400);
    expect(Math.abs(r.raanRate - target) / target).toBeLessThan(1e-4);
  });

  it('propagateJ2Secular(elements, dt) keeps a, e and i and advances Ω, ω and M by rate·dt', () => {
    const dt = 3 * 86_400;
    const r = j2SecularRates(MEO);
    const p = propagateJ2Secular(MEO, dt);
    expect([p.semiMajorAxis, p.eccentricity, p.inclination]).toEqual([
      MEO.semiMajorAxis,
      MEO.eccentricity,
      MEO.inclination,
    ]);
    const turn = (x: number): number => ((x % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
    expect(Math.abs(p.raan - turn(MEO.raan + r.raanRate * dt))).toBeLessThan(1e-12);
    expect(Math.abs(p.meanAnomaly - turn(MEO.meanAnomaly + r.meanAnomalyRate * dt))).toBeLessThan(1e-9);
  });

  it('j2SecularRates recognises a semi-major axis given in kilometres', () => {
    expect(() => j2SecularRates({ ...MEO, semiMajorAxis: 28_410 })).toThrow(
      /elements\.semiMajorAxis.*did you mean 28410 km/s,
    );
    expect(() => j2SecularRates({ ...MEO, semiMajorAxis: 6_500_000, eccentricity: 0.1 })).toThrow(/perigee/);
  });
});

describe('predictPasses', () => {
  const epoch = ts.parseIso('2027-03-01T00:00:00Z', 'UTC');
  const orbit: MeanOrbit = { epoch, elements: MEO };
  const site = { position: { latitude: rad(41.83), longitude: rad(23.05), height: 620 }, elevationMask: rad(10) };

  it('predictPasses flags a pass cut by the start or the end of the window and clips it there', () => {
    const full = predictPasses(orbit, [site], epoch, 2 * 86_400, { timeScales: ts }).passes[0]!;
    const inner = full.find((p) => !p.clippedAtStart && !p.clippedAtEnd)!;
    const mid = (inner.start + inner.end) / 2;
    const cut = predictPasses(orbit, [site], epoch.plus(mid), 86_400, { timeScales: ts }).passes[0]!;
    expect(cut[0]!.clippedAtStart).toBe(true);
    expect(cut[0]!.start).toBe(0);
    expect(Math.abs(cut[0]!.end - (inner.end - mid))).toBeLessThan(0.02);
    const tail = predictPasses(orbit, [site], epoch, mid, { timeScales: ts }).passes[0]!;
    expect(tail.at(-1)!.clippedAtEnd).toBe(true);
    expect(tail.at(-1)!.end).toBe(mid);
  });

  it('predictPasses over three stations gives each station exactly the passes it gets alone', () => {
    // Positions are computed on demand and shared by the stations, and each station skips the samples it provably
    // cannot see: the order and mix of stations must not change any station's passes.
    const sites = [
      site,
      { position: { latitude: rad(-29.41), longitude: rad(141.12), height: 150 }, elevationMask: rad(5) },
      { position: { latitude: rad(64.91), longitude: rad(-18.33), height: 310 }, elevationMask: rad(10) },
    ];
    const together = predictPasses(orbit, sites, epoch, 3 * 86_400, { timeScales: ts }).passes;
    for (const [k, s] of sites.entries()) {
      expect(predictPasses(orbit, [s], epoch, 3 * 86_400, { timeScales: ts }).passes[0]).toEqual(together[k]);
    }
    const reversed = predictPasses(orbit, [...sites].reverse(), epoch, 3 * 86_400, { timeScales: ts }).passes;
    expect(reversed.reverse()).toEqual(together);
  });

  it('predictPasses refuses elements more than 366 days from the window and a mask outside [0, π/2)', () => {
    const old: MeanOrbit = { epoch: ts.parseIso('2025-01-01T00:00:00Z', 'UTC'), elements: MEO };
    expect(() => predictPasses(old, [site], epoch, 86_400, { timeScales: ts })).toThrow(/orbit\.epoch/);
    expect(() => predictPasses(orbit, [{ ...site, elevationMask: 10 }], epoch, 86_400)).toThrow(
      /sites\[0\]\.elevationMask/,
    );
    expect(() => predictPasses(orbit, [site], epoch, 86_400, { stepSeconds: 0 })).toThrow(/options\.stepSeconds/);
  });
});
