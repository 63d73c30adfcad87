/**
 * Reference checks against the IERS Conventions (2010), IERS Technical Note 36, §10.2
 * (eqs. 10.7, 10.9, 10.10, 10.11 and the text on GPS clocks), with the values computed
 * independently in double precision in the project's physics reference sheet (physics-refs.md) §2 and §4 [C].
 * Tolerances: half a unit in the last printed digit of each value, unless stated beside the check.
 */
import { describe, expect, it } from 'vitest';
import { IERS_2010 } from '../../packages/sdk/src/constants.js';
import {
  type KeplerianElements,
  orbitalPeriod,
  propagateKeplerState,
  solveKepler,
} from '../../packages/sdk/src/orbit/index.js';
import {
  instantaneousClockRate,
  meanClockRate,
  periodicAmplitude,
  periodicCorrectionFromElements,
  periodicCorrectionFromState,
  semiMajorAxisForMeanRate,
} from '../../packages/sdk/src/relativity/index.js';

const METRE = 1;
const NANOSECOND = 1e-9;
const MICROSECOND = 1e-6;
const GPS_A = 26_561_750 * METRE;

describe('IERS Conventions (2010) §10.2: conventional GPS hardware offset −4.4647e-10 [V1]', () => {
  it('semiMajorAxisForMeanRate(4.4647e-10) is a = 26 561 400.1 m (physics-refs §2 [C]; Kouba 2004 "about 26,561,400 m" [V2])', () => {
    const a = semiMajorAxisForMeanRate(4.4647e-10);
    expect(Math.abs(a - 26_561_400.1 * METRE)).toBeLessThanOrEqual(0.05 * METRE);
  });

  it('meanClockRate(26 561 400.1 m).factoryOffset is −4.4647e-10 to the 5 printed digits [V1]', () => {
    expect(Math.abs(meanClockRate(26_561_400.1).factoryOffset - -4.4647e-10)).toBeLessThanOrEqual(0.5e-14);
  });

  it('meanClockRate(GPS a) is "about 4.46e-10" and the combined instantaneous shift "about 4.5e-10" in magnitude [V1]', () => {
    const rate = meanClockRate(GPS_A).fractionalRate;
    expect(Math.abs(rate - 4.46e-10)).toBeLessThanOrEqual(0.005e-10);
    // "about 4.5 × 10⁻¹⁰" (IERS §10.2 [V1]) is printed to 2 digits: half a unit is 0.05e-10.
    expect(Math.abs(rate - 4.5e-10)).toBeLessThanOrEqual(0.05e-10);
    expect(Math.abs(rate - 4.464733e-10)).toBeLessThanOrEqual(0.5e-16); // physics-refs §2 [C]
  });

  it('meanClockRate(GPS a) splits into 3GM/(2ac²) = 2.504557e-10 and L_G (physics-refs §2 [C])', () => {
    const tcg = meanClockRate(GPS_A, { reference: 'tcg' }).fractionalRate;
    expect(Math.abs(-tcg - 2.504557e-10)).toBeLessThanOrEqual(0.5e-16);
  });
});

describe('IERS Conventions (2010) §10.2 eqs. 10.10–10.11: periodic term [V1]', () => {
  it('periodicAmplitude(GPS a, e)/e is "about 2.29 µs" (text [V1]) and 2.28974 µs (physics-refs §4 [C])', () => {
    const perE = periodicAmplitude(GPS_A, 0.01) / 0.01;
    expect(Math.abs(perE - 2.29 * MICROSECOND)).toBeLessThanOrEqual(0.005 * MICROSECOND);
    expect(Math.abs(perE - 2.28974 * MICROSECOND)).toBeLessThanOrEqual(0.000005 * MICROSECOND);
  });

  it('periodicAmplitude(GPS a, 0.02) "can reach up to 46 ns" [V1]: 45.7948 ns; e = 0.01 gives 22.8974 ns (physics-refs §4 [C])', () => {
    expect(Math.abs(periodicAmplitude(GPS_A, 0.02) - 45.7948 * NANOSECOND)).toBeLessThanOrEqual(0.00005 * NANOSECOND);
    expect(Math.abs(periodicAmplitude(GPS_A, 0.01) - 22.8974 * NANOSECOND)).toBeLessThanOrEqual(0.00005 * NANOSECOND);
    expect(Math.round(periodicAmplitude(GPS_A, 0.02) / NANOSECOND)).toBe(46);
  });

  it('eq. 10.9 integrated along a Kepler orbit equals the mean rate times t plus the eq. 10.10/10.11 term (independent Simpson quadrature; physics-refs §4 [C])', () => {
    // physics-refs §4 did this with DOP853 in Python: (τ − t) − (−2r·v/c²) linear to 1.6e-19 s, slope −3GM/(2ac²).
    const el: KeplerianElements = {
      semiMajorAxis: GPS_A,
      eccentricity: 0.02,
      inclination: (55 * Math.PI) / 180,
      raan: 0.4,
      argumentOfPerigee: 1.3,
      meanAnomaly: 0.2,
    };
    const gm = IERS_2010.gm;
    const P = orbitalPeriod(GPS_A, gm);
    const mean = meanClockRate(GPS_A, { reference: 'tcg' }).fractionalRate;
    const steps = 4000; // even, for Simpson's rule
    const h = P / steps;
    const f = (t: number) => instantaneousClockRate(propagateKeplerState(el, t, gm), { reference: 'tcg' }) - mean;
    const periodic0 = periodicCorrectionFromState(propagateKeplerState(el, 0, gm));
    let integral = 0;
    let worst = 0;
    let fPrev = f(0);
    for (let k = 0; k < steps; k += 2) {
      const fMid = f((k + 1) * h),
        fEnd = f((k + 2) * h);
      integral += (h / 3) * (fPrev + 4 * fMid + fEnd);
      fPrev = fEnd;
      const t = (k + 2) * h;
      const expected = periodicCorrectionFromState(propagateKeplerState(el, t, gm)) - periodic0;
      worst = Math.max(worst, Math.abs(integral - expected));
    }
    expect(worst).toBeLessThan(1e-15); // 1 fs over one 12-h orbit: a loose bound on the quadrature error of Simpson's rule at h = P/4000
    // Peak |−2 r·v/c²| over the orbit is the amplitude, 45.7948 ns (physics-refs §4 [C]).
    const Epeak = Math.PI / 2;
    expect(Math.abs(periodicCorrectionFromElements(GPS_A, 0.02, Epeak) + 45.7948 * NANOSECOND)).toBeLessThanOrEqual(
      0.00005 * NANOSECOND,
    );
    expect(solveKepler(Epeak - 0.02, 0.02)).toBeCloseTo(Epeak, 15);
  });
});
