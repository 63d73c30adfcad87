import { describe, expect, it } from 'vitest';
import {
  BEIDOU_ICD,
  CONSTANT_SETS,
  constantSet,
  defineConstantSet,
  GALILEO_ICD,
  GPS_ICD,
  IERS_2010,
  L_G,
  SPEED_OF_LIGHT,
} from '../src/constants.js';
import { InvalidArgumentError } from '../src/errors.js';

describe('constant sets', () => {
  it('relativisticF for the GPS interface-spec GM is −4.442807633e-10 s/√m (IS-GPS-200 printed value [M]; recomputed [C])', () => {
    expect(GPS_ICD.relativisticF).toBeCloseTo(-4.442807633393e-10, 21);
  });
  it('relativisticF for GM 3.986004418e14 is −4.442807309e-10 s/√m (Galileo/BeiDou ICD value [M]; recomputed [C])', () => {
    expect(GALILEO_ICD.relativisticF).toBeCloseTo(-4.442807309044e-10, 21);
    expect(BEIDOU_ICD.relativisticF).toBe(GALILEO_ICD.relativisticF);
  });
  it('L_G·c² equals the IERS 2010 geoid potential W0 = 62 636 856.0 m²/s² to 1 mm²/s² (IERS Conventions 2010 §10.1 [V1], Table 1.1 [V2])', () => {
    expect(Math.abs(L_G * SPEED_OF_LIGHT ** 2 - 62_636_856.0)).toBeLessThan(1e-3);
  });
  it('L_G × 86400 s = 60.2147 µs/day (IERS Conventions 2010 §10.1 [V1], product [C])', () => {
    expect(L_G * 86400 * 1e6).toBeCloseTo(60.2147, 4);
  });
  it('constantSet(name) finds every built-in set and names them when unknown', () => {
    for (const name of Object.keys(CONSTANT_SETS)) expect(constantSet(name).name).toBe(name);
    expect(constantSet('IERS-2010')).toBe(IERS_2010);
    expect(() => constantSet('wgs72')).toThrow(InvalidArgumentError);
    expect(() => constantSet('wgs72')).toThrow(/iers-2010, gps-icd, galileo-icd, beidou-icd/);
  });
  it('defineConstantSet(overrides) recomputes F from GM and records missing sources', () => {
    const set = defineConstantSet({ name: 'mission-x', gm: 3.986005e14 });
    expect(set.relativisticF).toBe(GPS_ICD.relativisticF);
    expect(set.sources.gm).toBe('user-supplied, no source');
    expect(set.kind).toBe('user');
  });
  it('defineConstantSet(overrides, { base }) takes the omitted fields and their sources from the base set', () => {
    const set = defineConstantSet({ name: 'mission-g', j2: 1.0826e-3 }, { base: GALILEO_ICD });
    expect(set.gm).toBe(GALILEO_ICD.gm);
    expect(set.relativisticF).toBe(GALILEO_ICD.relativisticF);
    expect(set.equatorialRadius).toBe(GALILEO_ICD.equatorialRadius);
    expect(set.j2).toBe(1.0826e-3);
    expect(set.sources.gm).toBe(GALILEO_ICD.sources.gm);
    expect(set.description).toBe(`user-defined set based on ${GALILEO_ICD.name}`);
  });
  it('defineConstantSet(overrides) rejects GM given in km³/s² and a missing name', () => {
    expect(() => defineConstantSet({ name: 'x', gm: 398600.4418 })).toThrow(
      /gm must be in \[390000000000000, 410000000000000\] m³\/s²/,
    );
    expect(() => defineConstantSet({ name: '' })).toThrow(InvalidArgumentError);
    expect(() => defineConstantSet({ name: 'x', earthRotationRate: Number.NaN })).toThrow(/earthRotationRate/);
    expect(() => defineConstantSet({ name: 'x', equatorialRadius: 6378.137 })).toThrow(/equatorialRadius/);
    expect(() => defineConstantSet({ name: 'x', j2: -1 })).toThrow(/j2/);
    expect(() => defineConstantSet({ name: 'x', flattening: 0.5 })).toThrow(/flattening/);
    expect(() => defineConstantSet({ name: 'x', lG: 6.96e-9 })).toThrow(/lG/);
    expect(() => defineConstantSet({ name: 'x', pi: Number.POSITIVE_INFINITY })).toThrow(/pi/);
  });
});
