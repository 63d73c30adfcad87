/**
 * Reference checks of the GPS interface-specification relativity items: the factory frequency
 * offset (IS-GPS-200E §3.3.1.1), the constant F and the periodic correction Δt_r
 * (IS-GPS-200 §20.3.3.3.3.1). Values and provenance tags from the project's physics reference sheet
 * (physics-refs.md) §3, §13. Tolerances: half a unit in the last printed digit unless stated.
 */
import { describe, expect, it } from 'vitest';
import { GPS_ICD, IERS_2010 } from '../../packages/sdk/src/constants.js';
import { elementsToState } from '../../packages/sdk/src/orbit/index.js';
import { offsetFrequency } from '../../packages/sdk/src/oscillator/index.js';
import {
  periodicCorrectionAtMeanAnomaly,
  periodicCorrectionFromElements,
  periodicCorrectionFromState,
} from '../../packages/sdk/src/relativity/index.js';

const HZ = 1;
const SECOND = 1;

describe('IS-GPS-200E §3.3.1.1 factory offset (verbatim quotation, time-nuts list 2010-09-28) [V2]', () => {
  const shifted = offsetFrequency(10.23e6, -4.4647e-10);

  it('offsetFrequency(10.23 MHz, −4.4647e-10) is 10.2299999954326 MHz, as printed to its 15 significant digits [V2]', () => {
    expect(Math.abs(shifted.offsetFrequencyHz - 10_229_999.9954326 * HZ)).toBeLessThanOrEqual(0.5e-7 * HZ);
    expect(Number((shifted.offsetFrequencyHz / 1e6).toPrecision(15))).toBe(10.2299999954326);
  });

  it('offsetFrequency(10.23 MHz, −4.4647e-10).offsetHz is −4.5674e-3 Hz [V2] and −4.567388e-3 Hz to 7 digits [C]', () => {
    expect(Math.abs(shifted.offsetHz - -4.5674e-3 * HZ)).toBeLessThanOrEqual(0.5e-7 * HZ);
    expect(Math.abs(shifted.offsetHz - -4.567388e-3 * HZ)).toBeLessThanOrEqual(0.5e-9 * HZ);
  });

  it('offsetFrequency(1575.42 MHz, −4.4647e-10).offsetHz is −0.703378 Hz on L1 [C]', () => {
    expect(Math.abs(offsetFrequency(1575.42e6, -4.4647e-10).offsetHz - -0.703378 * HZ)).toBeLessThanOrEqual(
      0.5e-6 * HZ,
    );
  });

  it('offsetFrequency does not reproduce the published typo 10.229 999 999 543 MHz (physics-refs §13 pitfall 5)', () => {
    expect(Math.abs(shifted.offsetFrequencyHz - 10_229_999.999543)).toBeGreaterThan(4e-3);
  });
});

describe('IS-GPS-200 §20.3.3.3.3.1 relativistic constant F = −2√μ/c² [M]; recomputed [C]', () => {
  it('GPS_ICD.relativisticF is −4.442807633e-10 s/√m (ICD print [M]) and IERS/Galileo GM gives −4.442807309e-10 (Galileo/BeiDou ICD value [M]; recomputed [C]; physics-refs §13 pitfall 1)', () => {
    expect(Math.abs(GPS_ICD.relativisticF - -4.442807633e-10)).toBeLessThanOrEqual(0.5e-19);
    expect(Math.abs(IERS_2010.relativisticF - -4.442807309e-10)).toBeLessThanOrEqual(0.5e-19);
  });
});

describe('IS-GPS-200 §20.3.3.3.3.1 periodic correction Δt_r = F·e·√A·sin E_k: physics-refs §3 check value [C]', () => {
  const sqrtA = 5153.79589081;
  const e = 0.0123456789;
  const CHECK = -2.378695477618e-8 * SECOND;

  it('periodicCorrectionFromElements(A, e, E = 1 rad, GPS μ) is −2.378695477618e-08 s to all 13 printed digits [C]', () => {
    const dtr = periodicCorrectionFromElements(sqrtA * sqrtA, e, 1, { constants: GPS_ICD });
    expect(Math.abs(dtr - CHECK)).toBeLessThanOrEqual(0.5e-20 * SECOND);
  });

  it('periodicCorrectionAtMeanAnomaly(A, e, M = E − e sin E) solves E = 1 rad and gives the same Δt_r [C]', () => {
    const r = periodicCorrectionAtMeanAnomaly(sqrtA * sqrtA, e, 1 - e * Math.sin(1), { constants: GPS_ICD });
    expect(Math.abs(r.eccentricAnomaly - 1)).toBeLessThan(1e-15);
    expect(Math.abs(r.correctionSeconds - CHECK)).toBeLessThanOrEqual(0.5e-20 * SECOND);
  });

  it('periodicCorrectionFromState(state) = −2 R·V/c² on the same orbit equals the element form to all printed digits (ICD "equivalent expression" [V2]; IERS 2010 eq. 10.11 [V1])', () => {
    // Any orientation: r·v does not depend on i, Ω, ω.
    for (const [i, raan, w] of [
      [0.96, 0.5, 0.3],
      [0, 0, 0],
      [Math.PI / 2, 4, 5],
    ] as const) {
      const state = elementsToState(
        {
          semiMajorAxis: sqrtA * sqrtA,
          eccentricity: e,
          inclination: i,
          raan,
          argumentOfPerigee: w,
          meanAnomaly: 1 - e * Math.sin(1),
        },
        GPS_ICD.gm,
      );
      expect(Math.abs(periodicCorrectionFromState(state) - CHECK)).toBeLessThanOrEqual(0.5e-20 * SECOND);
    }
  });

  it('Δt_r from the IERS GM differs from the ICD value only in the 8th digit (physics-refs §13 pitfall 1)', () => {
    const gps = periodicCorrectionFromElements(sqrtA * sqrtA, e, 1, { constants: GPS_ICD });
    const iers = periodicCorrectionFromElements(sqrtA * sqrtA, e, 1, { constants: IERS_2010 });
    expect(Math.abs(gps / iers - 1)).toBeGreaterThan(5e-8);
    expect(Math.abs(gps / iers - 1)).toBeLessThan(1e-7);
  });
});
