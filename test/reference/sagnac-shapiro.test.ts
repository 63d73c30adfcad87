/**
 * Reference checks of the signal-path terms against the reference sheet §7 values computed independently
 * in double precision [C], N. Ashby's published figures (Living Rev. Relativity 6 (2003) §2, quoted [V2]:
 * "the last clock … would lag the first clock by 207.4 ns"; NIST Technical Note 1385, excerpt [V2]:
 * transit times "vary roughly from 67 to 86 ms for a receiver on earth's surface"), and IERS Conventions
 * (2010) §11.2 eq. 11.17 [V1] for the Shapiro delay. The Sagnac formula itself is standard, from memory [M].
 * Tolerances: toBeCloseTo(x, d) is half a unit in the last printed digit of each value.
 */
import { describe, expect, it } from 'vitest';
import { GPS_ICD, SPEED_OF_LIGHT } from '../../packages/sdk/src/constants.js';
import {
  maximumSagnacCorrection,
  sagnacCorrection,
  sagnacDelayForArea,
  shapiroDelay,
  solveLightTimeInertial,
} from '../../packages/sdk/src/signal/index.js';
import type { Vector3 } from '../../packages/sdk/src/units.js';

const W = GPS_ICD.earthRotationRate; // 7.2921151467e-5 rad/s, the value of the sheet's §7 check values
const R = 6_378_137;
const RS = 26_561_750;

describe('Sagnac correction (reference sheet §7 [C]; Ashby 2003 §2 [V2])', () => {
  it('sagnacCorrection for receiver (R, 0, 0) and satellite (15 600, 21 500, 0) km is −111.2614 ns', () => {
    expect(sagnacCorrection([15_600_000, 21_500_000, 0], [R, 0, 0], W) * 1e9).toBeCloseTo(-111.2614, 4);
  });
  it('maximumSagnacCorrection for an equatorial receiver and a GPS satellite on the horizon is 133.43 ns (central angle 76.11°)', () => {
    expect(maximumSagnacCorrection(R, RS, W) * 1e9).toBeCloseTo(133.43, 2);
    expect((Math.acos(R / RS) * 180) / Math.PI).toBeCloseTo(76.11, 2);
  });
  it('sagnacDelayForArea(πR²) for one eastward equatorial circuit is 207.39 ns (Ashby: "207.4 ns" [V2])', () => {
    expect(sagnacDelayForArea(Math.PI * R * R, W) * 1e9).toBeCloseTo(207.39, 2);
    expect(sagnacDelayForArea(Math.PI * R * R, W) * 1e9).toBeCloseTo(207.4, 1);
  });
});

describe('light time for a ground receiver (Ashby, NIST TN 1385 [V2]: 67 to 86 ms)', () => {
  it('solveLightTimeInertial gives 67.3 ms at zenith and 85.9 ms at the horizon for a GPS satellite (67 and 86 ms to the printed precision)', () => {
    const zenith = solveLightTimeInertial(0, [R, 0, 0], (): Vector3 => [RS, 0, 0]);
    const horizonY = Math.sqrt(RS * RS - R * R);
    const horizon = solveLightTimeInertial(0, [R, 0, 0], (): Vector3 => [R, horizonY, 0]);
    // Ashby prints whole milliseconds ("roughly from 67 to 86 ms"): compare rounded to 1 ms.
    expect(Math.round(zenith.flightTime * 1e3)).toBe(67);
    expect(Math.round(horizon.flightTime * 1e3)).toBe(86);
    expect(zenith.flightTime).toBeCloseTo((RS - R) / SPEED_OF_LIGHT + zenith.shapiroDelay, 15);
    // the sheet's 31.2–40.0 m of Earth rotation are for exactly 67 and 86 ms
    expect(W * R * 0.067).toBeCloseTo(31.2, 1);
    expect(W * R * horizon.flightTime).toBeCloseTo(40.0, 1);
  });
});

describe('Shapiro delay, IERS Conventions (2010) eq. 11.17 [V1] (reference sheet §7 [C]: r_s = 26 561.75 km, r_r = 6371 km)', () => {
  it('shapiroDelay at zenith (ρ = 20 190.8 km) is 42.242 ps = 12.664 mm', () => {
    const d = shapiroDelay(RS, 6_371_000, RS - 6_371_000);
    expect(d * 1e12).toBeCloseTo(42.242, 3);
    expect(d * SPEED_OF_LIGHT * 1e3).toBeCloseTo(12.664, 3);
  });
  it('shapiroDelay at the horizon (ρ = 25 786.4 km) is 62.316 ps = 18.682 mm', () => {
    const rho = Math.sqrt(RS * RS - 6_371_000 ** 2);
    expect(rho / 1e3).toBeCloseTo(25_786.4, 1);
    const d = shapiroDelay(RS, 6_371_000, rho);
    expect(d * 1e12).toBeCloseTo(62.316, 3);
    expect(d * SPEED_OF_LIGHT * 1e3).toBeCloseTo(18.682, 3);
  });
});
