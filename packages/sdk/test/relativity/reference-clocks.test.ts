import { describe, expect, it } from 'vitest';
import { IERS_2010, L_G } from '../../src/constants.js';
import { InvalidArgumentError } from '../../src/errors.js';
import {
  GRS80_ELLIPSOID,
  groundClockRate,
  lunarClockRate,
  normalGravity,
  normalGravityPotential,
  tcgRateVsTT,
  WGS84_ELLIPSOID,
} from '../../src/relativity/reference-clocks.js';

const DEG = Math.PI / 180;

describe('normal gravity field of the reference ellipsoids', () => {
  it('normalGravityPotential on the GRS 80 ellipsoid is U₀ = 62 636 860.850 m²/s² at every latitude (Moritz, GRS 80 [M])', () => {
    for (const lat of [0, 30, 60, 90]) expect(normalGravityPotential(lat * DEG, 0)).toBeCloseTo(62_636_860.85, 3);
  });
  it('normalGravityPotential on the WGS 84 ellipsoid is U₀ = 62 636 851.7146 m²/s² (NIMA TR8350.2 [M])', () => {
    expect(normalGravityPotential(0.7, 0, WGS84_ELLIPSOID)).toBeCloseTo(62_636_851.7146, 3);
  });
  it('normalGravity gives GRS 80 γ_e = 9.7803267715 and γ_p = 9.8321863685 m/s² (Moritz, GRS 80 [M])', () => {
    expect(normalGravity(0)).toBeCloseTo(9.7803267715, 9);
    expect(normalGravity(Math.PI / 2)).toBeCloseTo(9.8321863685, 9);
  });
  it("−∂U/∂h from normalGravityPotential equals Somigliana's γ(φ) to 1e-6 m/s² (independent closed forms)", () => {
    for (const lat of [0, 25, 50, 75, 90]) {
      const h = 50;
      const g = -(normalGravityPotential(lat * DEG, h) - normalGravityPotential(lat * DEG, -h)) / (2 * h);
      expect(Math.abs(g - normalGravity(lat * DEG))).toBeLessThan(1e-6);
    }
  });
  it('normalGravityPotential rejects degrees, absurd heights and a malformed ellipsoid', () => {
    expect(() => normalGravityPotential(45, 0)).toThrow(/did you give degrees/);
    expect(() => normalGravityPotential(0, 2e8)).toThrow(/height/);
    expect(() => normalGravityPotential(0, 0, { ...GRS80_ELLIPSOID, semiMajorAxis: 6378.137 })).toThrow(
      /ellipsoid\.semiMajorAxis/,
    );
    expect(() => normalGravity(0, null as never)).toThrow(/ReferenceEllipsoid/);
  });
});

describe('groundClockRate(station)', () => {
  it('groundClockRate at h = 0 and N = 0 is 0 against TT and −L_G against TCG (IERS 2010 §10.1 [V1])', () => {
    const r = groundClockRate({ latitude: 40 * DEG, longitude: -105 * DEG, height: 0 });
    expect(Math.abs(r.rateVsTT)).toBeLessThan(1e-22);
    expect(r.rateVsTCG).toBeCloseTo(-L_G, 22);
    expect(r.ellipsoid).toBe('GRS80');
    expect(r.accuracy).toMatch(/geoid undulation not given/);
  });
  it('groundClockRate is ≈ 1.09e-16 per metre of height (common practice "≈ 1.1e-16/m", no source; γ/c²)', () => {
    const r = groundClockRate({ latitude: 45 * DEG, longitude: 0, height: 1000 });
    expect(r.rateVsTT / 1000).toBeCloseTo(1.09e-16, 18);
    expect(r.nanosecondsPerDayVsTT).toBeCloseTo(r.rateVsTT * 86400e9, 12);
  });
  it('groundClockRate with a geoid undulation N uses the orthometric height h − N (to the free-air gradient of γ over h: < 2e-18 here)', () => {
    const a = groundClockRate({ latitude: 45 * DEG, longitude: 0, height: 1000, geoidUndulation: 30 });
    const b = groundClockRate({ latitude: 45 * DEG, longitude: 0, height: 970 });
    // Bruns' T = γN uses surface γ; U(h) − U(h − N) uses γ at ≈ h, which is smaller by 3.1e-6 s⁻²·h.
    expect(Math.abs(a.rateVsTT - b.rateVsTT)).toBeLessThan(2e-18);
    expect(a.accuracy).toMatch(/Bruns/);
  });
  it('groundClockRate rejects degrees, a height in the wrong unit, |N| > 150 m and a missing station', () => {
    expect(() => groundClockRate({ latitude: 45, longitude: 0, height: 0 })).toThrow(/station\.latitude/);
    expect(() => groundClockRate({ latitude: 0, longitude: 400, height: 0 })).toThrow(/station\.longitude/);
    expect(() => groundClockRate({ latitude: 0, longitude: 0, height: 4e5 })).toThrow(/station\.height/);
    expect(() => groundClockRate({ latitude: 0, longitude: 0, height: 0, geoidUndulation: 300 })).toThrow(
      /geoidUndulation/,
    );
    expect(() => groundClockRate(undefined as never)).toThrow(InvalidArgumentError);
  });
});

describe('TCG and lunar clocks', () => {
  it('tcgRateVsTT is L_G/(1 − L_G): 60.2147 µs/day (IERS 2010 §10.1 [V1])', () => {
    expect(tcgRateVsTT()).toBeCloseTo(L_G / (1 - L_G), 25);
    expect(tcgRateVsTT({ constants: IERS_2010 }) * 86400e6).toBeCloseTo(60.2147, 4);
  });
  it('lunarClockRate(orbit) adds −3GM_M/(2ρc²) to the selenocentre rate and rejects a radius below the surface', () => {
    const centre = lunarClockRate({ location: 'selenocentre' });
    const orb = lunarClockRate({ location: 'orbit', orbitRadius: 1_837_400 });
    expect(orb.rateVsTT - centre.rateVsTT).toBeCloseTo((-1.5 * 4.902800066e12) / (1_837_400 * 299_792_458 ** 2), 22);
    expect(() => lunarClockRate({ location: 'orbit', orbitRadius: 1_000_000 })).toThrow(/clock\.orbitRadius/);
    expect(() => lunarClockRate({ location: 'orbit' })).toThrow(/clock\.orbitRadius/);
  });
  it('lunarClockRate includes the surface rotation term (≈ 1e-5 µs/day at the equator) and rejects bad input', () => {
    const eq = lunarClockRate({ location: 'surface' });
    const pole = lunarClockRate({ location: 'surface', latitude: Math.PI / 2 });
    expect(eq.breakdownMicrosecondsPerDay.localKinetic).toBeCloseTo(-1.03e-5, 7);
    expect(Math.abs(pole.breakdown.localKinetic)).toBeLessThan(1e-30);
    expect(() => lunarClockRate({ location: 'l1' as never })).toThrow(/"selenocentre", "surface" or "orbit"/);
    expect(() => lunarClockRate({ location: 'surface', latitude: 2 })).toThrow(/clock\.latitude/);
    expect(() => lunarClockRate({ location: 'surface' }, { moonSemiMajorAxis: 384_748 })).toThrow(/moonSemiMajorAxis/);
    expect(() => lunarClockRate(null as never)).toThrow(InvalidArgumentError);
  });
});
