import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { moonPositionLowPrecision } from '../../src/orbit/ephemeris.js';
import { boundStateCheck } from '../../src/relativity/bound-state.js';
import { MOON_MEAN_RADIUS } from '../../src/relativity/reference-clocks.js';
import { instantFromTtSecondsSinceJ2000 } from '../../src/time/j2000.js';

/** 2023-01-01 00:00 TT, seconds since J2000.0. */
const EPOCH_2023 = 725_803_200;

/** Geocentric state of a polar lunar orbiter 100 km above the mean radius, `speed` relative to the Moon. */
function lunarOrbiter(speed: number): { position: [number, number, number]; velocity: [number, number, number] } {
  const at = instantFromTtSecondsSinceJ2000(EPOCH_2023);
  const m = moonPositionLowPrecision(at);
  const mp = moonPositionLowPrecision(at.plus(1));
  const mm = moonPositionLowPrecision(at.plus(-1));
  return {
    position: [m[0], m[1], m[2] + MOON_MEAN_RADIUS + 100e3],
    velocity: [(mp[0] - mm[0]) / 2 + speed, (mp[1] - mm[1]) / 2, (mp[2] - mm[2]) / 2],
  };
}

describe('boundStateCheck', () => {
  it('boundStateCheck(GPS-like state) is bound to the Earth with escape speed √(2GM/r) = 5478.603 m/s at r = 26 560 km (GM 3.986004418e14, IERS 2010; Python [C])', () => {
    const c = boundStateCheck({ position: [26_560_000, 0, 0], velocity: [0, 3874, 100] });
    expect(c).toMatchObject({ body: 'earth', bound: true, distance: 26_560_000 });
    expect(c.escapeSpeed).toBeCloseTo(5478.603244, 5);
    expect(c.hillRadius).toBeUndefined();
  });

  it('boundStateCheck(state at 6 km/s at GPS radius) is not bound', () => {
    expect(boundStateCheck({ position: [26_560_000, 0, 0], velocity: [0, 6000, 0] }).bound).toBe(false);
  });

  it('boundStateCheck(lunar orbiter, full, 2023-01-01) judges it against the Moon: escape speed 2310.124 m/s at 1837.4 km (GM_M 4.902800066e12 [M]; Python [C]); 1900 m/s bound, 2400 m/s not', () => {
    const epoch = instantFromTtSecondsSinceJ2000(EPOCH_2023);
    const slow = boundStateCheck(lunarOrbiter(1900), { model: 'full', epoch });
    expect(slow).toMatchObject({ body: 'moon', bound: true });
    expect(slow.escapeSpeed).toBeCloseTo(2310.1237, 3);
    expect(slow.speed).toBeCloseTo(1900, 6);
    // Hill sphere ≈ 61 500 km (d·(GM_M/(3GM_E))^(1/3) with d ≈ 3.6e8–4.1e8 m).
    expect(slow.hillRadius).toBeGreaterThan(5.5e7);
    expect(slow.hillRadius).toBeLessThan(6.6e7);
    expect(boundStateCheck(lunarOrbiter(2400), { model: 'full', epoch })).toMatchObject({ body: 'moon', bound: false });
  });

  it('boundStateCheck(lunar orbiter) under the Earth-only j2 model is judged against the Earth and not bound', () => {
    expect(boundStateCheck(lunarOrbiter(1900))).toMatchObject({ body: 'earth', bound: false });
  });

  it('boundStateCheck refuses an epoch that is not an Instant and an unknown model', () => {
    expect(() => boundStateCheck(lunarOrbiter(1900), { model: 'full', epoch: EPOCH_2023 as never })).toThrow(
      InvalidArgumentError,
    );
    // A bare number of TT seconds since J2000.0 gets the hint saying how to make the Instant.
    expect(() => boundStateCheck(lunarOrbiter(1900), { model: 'full', epoch: EPOCH_2023 as never })).toThrow(
      /options\.epoch must be an Instant, not a number of seconds.*instantFromTtSecondsSinceJ2000\(seconds\)/,
    );
    expect(() => boundStateCheck(lunarOrbiter(1900), { model: 'egm' as never })).toThrow(/options\.model/);
  });
});
