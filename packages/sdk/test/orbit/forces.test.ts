import { describe, expect, it } from 'vitest';
import { GPS_ICD, IERS_2010, SPEED_OF_LIGHT_SQUARED } from '../../src/constants.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { moonPositionLowPrecision, sunPositionLowPrecision } from '../../src/orbit/ephemeris.js';
import {
  createGravityField,
  GM_MOON,
  j2Potential,
  pointMassPotential,
  thirdBodyAcceleration,
  thirdBodyTidalPotential,
} from '../../src/orbit/forces.js';
import { instantFromTtSecondsSinceJ2000, J2000_EPOCH } from '../../src/time/j2000.js';

/** TT seconds since J2000.0 as an instant (the scenario epochs below are given that way). */
const ttSeconds = instantFromTtSecondsSinceJ2000;

/** Central-difference gradient of the potential (independent check that acceleration = ∇U). */
function gradient(
  f: (x: number, y: number, z: number) => number,
  p: [number, number, number],
  h: number,
): [number, number, number] {
  return [
    (f(p[0] + h, p[1], p[2]) - f(p[0] - h, p[1], p[2])) / (2 * h),
    (f(p[0], p[1] + h, p[2]) - f(p[0], p[1] - h, p[2])) / (2 * h),
    (f(p[0], p[1], p[2] + h) - f(p[0], p[1], p[2] - h)) / (2 * h),
  ];
}

describe('createGravityField(model): acceleration is the gradient of the clock potential', () => {
  for (const model of ['point-mass', 'j2', 'full'] as const) {
    it(`createGravityField('${model}') acceleration equals ∇U to 1e-9 relative (numerical gradient)`, () => {
      const field = createGravityField(model, { epoch: ttSeconds(7.5e8) });
      const p: [number, number, number] = [1.2e7, -1.9e7, 1.4e7];
      const acc = new Float64Array(3);
      field.accelerate(100, p[0], p[1], p[2], acc, 0);
      const g = gradient((x, y, z) => field.potential(100, x, y, z), p, 10);
      for (let i = 0; i < 3; i++) expect(Math.abs(acc[i]! - g[i]!)).toBeLessThan(1e-9 * Math.hypot(...acc));
    });
  }

  it('createGravityField rejects an unknown model, an epoch that is not an Instant and non-finite options', () => {
    expect(() => createGravityField('egm96' as never)).toThrow(/model must be one of/);
    for (const bad of [Number.NaN, 7.5e8, '2027-03-01T00:00:00', null]) {
      expect(() => createGravityField('full', { epoch: bad as never })).toThrow(/options\.epoch must be an Instant/);
    }
    expect(() => createGravityField('full', { moonGm: -1 })).toThrow(/moonGm/);
    expect(() => createGravityField('full', { sunGm: 0 })).toThrow(/sunGm/);
  });
});

describe('createGravityField(model, { epoch }): the instant of t = 0', () => {
  it("createGravityField(model, { epochTtSecondsSinceJ2000 }) (the former option) is refused naming it, with the new option's name, never ignored", () => {
    for (const value of [7.5e8, 0, undefined]) {
      let error: unknown;
      try {
        createGravityField('full', { epochTtSecondsSinceJ2000: value } as never);
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(InvalidArgumentError);
      const e = error as InvalidArgumentError;
      expect(e.argument).toBe('options.epochTtSecondsSinceJ2000');
      expect(e.expected).toBe('absent: the option is now `epoch`, an Instant');
      expect(e.hint).toContain('{ epoch: instantFromTtSecondsSinceJ2000(');
    }
  });

  it('createGravityField(model) without an epoch is the field at J2000.0, { epoch: J2000_EPOCH } exactly', () => {
    const implicit = createGravityField('full');
    const explicit = createGravityField('full', { epoch: J2000_EPOCH });
    expect(implicit.potential(3600, 2e7, 1e7, 5e6)).toBe(explicit.potential(3600, 2e7, 1e7, 5e6));
  });

  it("createGravityField('full', { epoch }) puts the Moon of the low-precision series at TT = epoch + t: the tidal potential follows moonPositionLowPrecision(epoch + t) (IERS 2010 eq. 10.6 tidal terms [V1])", () => {
    const epoch = ttSeconds(8.1e8);
    const t = 7200;
    const p: [number, number, number] = [1.5e7, -1.2e7, 1.8e7];
    const tidal =
      thirdBodyTidalPotential(p, moonPositionLowPrecision(epoch.plus(t)), GM_MOON) +
      thirdBodyTidalPotential(p, sunPositionLowPrecision(epoch.plus(t)), 1.32712442099e20);
    const field = createGravityField('full', { epoch });
    const j2 = createGravityField('j2');
    const fromField = field.potential(t, ...p) - j2.potential(t, ...p);
    // ≈ −26 m²/s² here. The difference of two potentials of ≈ 1.5e7 m²/s² is exact only to their ulp (2^−29 ≈ 1.9e-9
    // m²/s²), and the field evaluates the series in split time (epoch and t apart): agreement to 2e-9 m²/s² (≈ 1e-10
    // relative; Sun and Moon an hour off would move it by ≈ 0.045 m²/s² [C], 2e7 times that).
    expect(Math.abs(tidal)).toBeGreaterThan(1);
    expect(Math.abs(fromField - tidal)).toBeLessThan(2e-9);
  });
});

describe('potential terms', () => {
  it('pointMassPotential at 26 561.75 km is GM/r; j2Potential is +GM J2 a_e²/(2r³) on the equator and −2× that on the axis', () => {
    expect(pointMassPotential([26_561_750, 0, 0])).toBeCloseTo(IERS_2010.gm / 26_561_750, 6);
    const k = (IERS_2010.gm * IERS_2010.j2 * IERS_2010.equatorialRadius ** 2) / (2 * 26_561_750 ** 3);
    expect(j2Potential([26_561_750, 0, 0])).toBeCloseTo(k, 9);
    expect(j2Potential([0, 0, 26_561_750])).toBeCloseTo(-2 * k, 9);
    const kGps = (GPS_ICD.gm * GPS_ICD.j2 * GPS_ICD.equatorialRadius ** 2) / (2 * 26_561_750 ** 3);
    expect(j2Potential([26_561_750, 0, 0], { constants: GPS_ICD })).toBeCloseTo(kGps, 9);
  });

  it('thirdBodyTidalPotential of the Moon at GPS altitude is below 1e-15 of c² (IERS 2010 §10.2: tidal terms < 1e-15 in frequency up to GPS orbit [V1])', () => {
    const moon = moonPositionLowPrecision(ttSeconds(7.5e8));
    const sun = sunPositionLowPrecision(ttSeconds(7.5e8));
    const unit = moon.map((x) => x / Math.hypot(...moon)) as unknown as [number, number, number];
    const towardMoon: [number, number, number] = [unit[0] * 26_561_750, unit[1] * 26_561_750, unit[2] * 26_561_750];
    const vMoon = thirdBodyTidalPotential(towardMoon, moon, GM_MOON) / SPEED_OF_LIGHT_SQUARED;
    const vSun = thirdBodyTidalPotential(towardMoon, sun, 1.32712442099e20) / SPEED_OF_LIGHT_SQUARED;
    expect(vMoon).toBeGreaterThan(1e-16);
    expect(vMoon).toBeLessThan(1e-15);
    expect(Math.abs(vSun)).toBeLessThan(1e-15);
  });

  it('thirdBodyAcceleration is the gradient of thirdBodyTidalPotential', () => {
    const moon = moonPositionLowPrecision(J2000_EPOCH);
    const p: [number, number, number] = [2e7, 5e6, -1e7];
    const a = thirdBodyAcceleration(p, moon, GM_MOON);
    const g = gradient((x, y, z) => thirdBodyTidalPotential([x, y, z], moon, GM_MOON), p, 100);
    for (let i = 0; i < 3; i++) expect(Math.abs(a[i]! - g[i]!)).toBeLessThan(1e-8 * Math.hypot(...a));
  });

  it('potential helpers reject the origin, non-finite vectors and non-positive GM', () => {
    expect(() => pointMassPotential([0, 0, 0])).toThrow(
      /position must be a vector of length in \[1, 10000000000000\] m/,
    );
    expect(() => j2Potential([Number.NaN, 0, 0])).toThrow(InvalidArgumentError);
    expect(() => pointMassPotential([1e7, 0, 0], -1)).toThrow(/gm/);
    expect(() => thirdBodyTidalPotential([1e7, 0, 0], [0, 0, 0], GM_MOON)).toThrow(
      /bodyPosition must be a vector of length in \[1, 10000000000000\] m/,
    );
    expect(() => thirdBodyAcceleration([1e7, 0, 0], [4e8, 0, 0], 0)).toThrow(/gmBody/);
  });
});
