/**
 * Reference checks for strongly eccentric navigation orbits: the Galileo satellites GSAT0201/0202
 * left in eccentric orbits in 2014 and used for the gravitational-redshift tests of Delva et al.,
 * PRL 121, 231101 (2018) and Herrmann et al., PRL 121, 231102 (2018) [V2 abstracts], and the
 * QZS-1 quasi-zenith orbit (JAXA press release 2010-09-27 [V1]). Orbit values derived from
 * published heights by our own computation (project physics reference sheet, physics-refs.md §6) [C].
 * Tolerances: half a unit in the last printed digit of each value.
 */
import { describe, expect, it } from 'vitest';
import { GALILEO_ICD, IERS_2010 } from '../../packages/sdk/src/constants.js';
import {
  elementsToState,
  meanMotion,
  orbitalPeriod,
  solveKepler,
  stateToElements,
} from '../../packages/sdk/src/orbit/index.js';
import {
  meanClockRate,
  periodicAmplitude,
  periodicCorrectionFromElements,
  periodicCorrectionFromState,
} from '../../packages/sdk/src/relativity/index.js';

const NANOSECOND = 1e-9;
const KM = 1000;
const R_E = 6_378_137; // WGS 84 / GRS 80 equatorial radius [V2], used to turn heights into radii

function orbitFromHeights(perigeeHeight: number, apogeeHeight: number): { a: number; e: number } {
  const rp = R_E + perigeeHeight,
    ra = R_E + apogeeHeight;
  return { a: (rp + ra) / 2, e: (ra - rp) / (ra + rp) };
}

describe('Eccentric Galileo GSAT0201/0202 after recovery: heights 17 180–26 020 km (Sośnica et al. 2021 [V2]) → a = 27 978.1 km, e = 0.1580 [C]', () => {
  const { a, e } = orbitFromHeights(17_180 * KM, 26_020 * KM);

  it('the published heights give a = 27 978.1 km, e = 0.1580 and P = 12.937 h [C]', () => {
    expect(Math.abs(a - 27_978.1 * KM)).toBeLessThanOrEqual(0.05 * KM);
    expect(Math.abs(e - 0.158)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs(orbitalPeriod(a, IERS_2010.gm) / 3600 - 12.937)).toBeLessThanOrEqual(0.0005);
  });

  it('periodicAmplitude(27 978.1 km, 0.158) = 2√(GM a)e/c² = 371.3 ns (physics-refs §6 [C]; Delva et al. 2018 orbit [V2])', () => {
    expect(
      Math.abs(periodicAmplitude(27_978.1 * KM, 0.158, { constants: GALILEO_ICD }) - 371.3 * NANOSECOND),
    ).toBeLessThanOrEqual(0.05 * NANOSECOND);
  });

  it('periodicAmplitude(27 977.6 km, 0.162) = 380.7 ns for the commonly quoted elements (physics-refs §6 [C], elements [M])', () => {
    expect(
      Math.abs(periodicAmplitude(27_977.6 * KM, 0.162, { constants: GALILEO_ICD }) - 380.7 * NANOSECOND),
    ).toBeLessThanOrEqual(0.05 * NANOSECOND);
  });

  it('the fractional-frequency modulation amplitude n·2√(GM a)e/c² is ≈ 5.0e-11 (physics-refs §6 [C])', () => {
    const amplitude = periodicAmplitude(27_978.1 * KM, 0.158) * meanMotion(27_978.1 * KM, IERS_2010.gm);
    expect(Math.abs(amplitude - 5.0e-11)).toBeLessThanOrEqual(0.05e-11);
  });

  it('element and state forms of the periodic term agree to 1e-15 s around the whole eccentric orbit (IERS 2010 eq. 10.11 [V1])', () => {
    let worst = 0;
    for (let k = 0; k < 360; k++) {
      const M = (k * Math.PI) / 180;
      const el = {
        semiMajorAxis: 27_978.1 * KM,
        eccentricity: 0.158,
        inclination: 0.873,
        raan: 1.0,
        argumentOfPerigee: 0.5,
        meanAnomaly: M,
      };
      const E = solveKepler(M, el.eccentricity);
      const fromElements = periodicCorrectionFromElements(el.semiMajorAxis, el.eccentricity, E, {
        constants: GALILEO_ICD,
      });
      const fromState = periodicCorrectionFromState(elementsToState(el, GALILEO_ICD.gm));
      worst = Math.max(worst, Math.abs(fromElements - fromState));
    }
    expect(worst).toBeLessThanOrEqual(1e-15);
  });

  it('the mean rate of the eccentric orbit is that of a circular orbit of the same a: +4.6e-10 vs TT (eccentricity only adds the periodic term)', () => {
    const state = elementsToState(
      {
        semiMajorAxis: 27_978.1 * KM,
        eccentricity: 0.158,
        inclination: 0.873,
        raan: 1,
        argumentOfPerigee: 0.5,
        meanAnomaly: 2,
      },
      IERS_2010.gm,
    );
    const a = stateToElements(state, IERS_2010.gm).semiMajorAxis;
    expect(Math.abs(a / (27_978.1 * KM) - 1)).toBeLessThan(1e-13);
    expect(meanClockRate(a).fractionalRate).toBeCloseTo(meanClockRate(27_978.1 * KM).fractionalRate, 22);
  });
});

describe('Eccentric Galileo initial injection: max altitude ≈ 25 900 km, min ≈ 13 713 km (GPS World / ESA 2014 [V2])', () => {
  it('the heights give a = 26 184.6 km and e = 0.2327 [C]', () => {
    const { a, e } = orbitFromHeights(13_713 * KM, 25_900 * KM);
    expect(Math.abs(a - 26_184.6 * KM)).toBeLessThanOrEqual(0.05 * KM);
    expect(Math.abs(e - 0.2327)).toBeLessThanOrEqual(0.00005);
  });
});

describe('QZS-1 MICHIBIKI: apogee 38 950 km, perigee 32 618 km (JAXA 2010-09-27 [V1])', () => {
  it('the heights give a = 42 162.1 km, e = 0.0751 and a periodic term of 216.6 ns (physics-refs §6 [C])', () => {
    const { a, e } = orbitFromHeights(32_618 * KM, 38_950 * KM);
    expect(Math.abs(a - 42_162.1 * KM)).toBeLessThanOrEqual(0.05 * KM);
    expect(Math.abs(e - 0.0751)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs(periodicAmplitude(a, e) - 216.6 * NANOSECOND)).toBeLessThanOrEqual(0.05 * NANOSECOND);
  });
});
