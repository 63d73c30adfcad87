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
      const field = createGravityField(model, { epochTtSecondsSinceJ2000: 7.5e8 });
      const p: [number, number, number] = [1.2e7, -1.9e7, 1.4e7];
      const acc = new Float64Array(3);
      field.accelerate(100, p[0], p[1], p[2], acc, 0);
      const g = gradient((x, y, z) => field.potential(100, x, y, z), p, 10);
      for (let i = 0; i < 3; i++) expect(Math.abs(acc[i]! - g[i]!)).toBeLessThan(1e-9 * Math.hypot(...acc));
    });
  }

  it('createGravityField rejects an unknown model and non-finite options', () => {
    expect(() => createGravityField('egm96' as never)).toThrow(/model must be one of/);
    expect(() => createGravityField('full', { epochTtSecondsSinceJ2000: Number.NaN })).toThrow(
      /epochTtSecondsSinceJ2000/,
    );
    expect(() => createGravityField('full', { moonGm: -1 })).toThrow(/moonGm/);
    expect(() => createGravityField('full', { sunGm: 0 })).toThrow(/sunGm/);
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
    const moon = moonPositionLowPrecision(7.5e8);
    const sun = sunPositionLowPrecision(7.5e8);
    const unit = moon.map((x) => x / Math.hypot(...moon)) as unknown as [number, number, number];
    const towardMoon: [number, number, number] = [unit[0] * 26_561_750, unit[1] * 26_561_750, unit[2] * 26_561_750];
    const vMoon = thirdBodyTidalPotential(towardMoon, moon, GM_MOON) / SPEED_OF_LIGHT_SQUARED;
    const vSun = thirdBodyTidalPotential(towardMoon, sun, 1.32712442099e20) / SPEED_OF_LIGHT_SQUARED;
    expect(vMoon).toBeGreaterThan(1e-16);
    expect(vMoon).toBeLessThan(1e-15);
    expect(Math.abs(vSun)).toBeLessThan(1e-15);
  });

  it('thirdBodyAcceleration is the gradient of thirdBodyTidalPotential', () => {
    const moon = moonPositionLowPrecision(0);
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
