import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type ConstantSet, GALILEO_ICD, GPS_ICD, IERS_2010 } from '../../src/constants.js';
import { elementsToState, type StateVector, solveKepler } from '../../src/orbit/index.js';
import {
  periodicAmplitude,
  periodicCorrectionAtMeanAnomaly,
  periodicCorrectionFromElements,
  periodicCorrectionFromState,
} from '../../src/relativity/index.js';

const SEED = 20261202;

const orbitArb = fc
  .record({
    semiMajorAxis: fc.double({ min: 6.6e6, max: 4.5e7, noNaN: true }),
    eccentricity: fc.oneof(fc.double({ min: 0, max: 0.9, noNaN: true }), fc.constantFrom(0, 0.02, 0.158, 0.9)),
    inclination: fc.double({ min: 0, max: Math.PI, noNaN: true }),
    raan: fc.double({ min: 0, max: 6.3, noNaN: true }),
    argumentOfPerigee: fc.double({ min: 0, max: 6.3, noNaN: true }),
    meanAnomaly: fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }),
  })
  .filter((el) => el.semiMajorAxis * (1 - el.eccentricity) > 6.4e6); // perigee above the Earth's surface

describe('periodic correction', () => {
  it('periodicCorrectionFromElements and periodicCorrectionFromState agree to 1e-15 s on any Kepler orbit (IERS 2010 eq. 10.11 "exactly equivalent" [V1]; property)', () => {
    fc.assert(
      fc.property(orbitArb, fc.constantFrom(IERS_2010, GPS_ICD), (el, set: ConstantSet) => {
        const E = solveKepler(el.meanAnomaly, el.eccentricity);
        const fromElements = periodicCorrectionFromElements(el.semiMajorAxis, el.eccentricity, E, { constants: set });
        const fromState = periodicCorrectionFromState(elementsToState(el, set.gm));
        return Math.abs(fromElements - fromState) <= 1e-15;
      }),
      { seed: SEED, numRuns: 3000 },
    );
  });

  it('periodicCorrectionFromState(state) is unchanged by a rotation about the z axis (ECEF and ECI give the same value, physics-refs §13.3)', () => {
    const s = elementsToState(
      {
        semiMajorAxis: 26_561_750,
        eccentricity: 0.02,
        inclination: 0.96,
        raan: 1,
        argumentOfPerigee: 2,
        meanAnomaly: 0.5,
      },
      IERS_2010.gm,
    );
    const theta = 1.234,
      omega = 7.2921151467e-5;
    const rot = (v: readonly number[]): [number, number, number] => [
      Math.cos(theta) * v[0]! + Math.sin(theta) * v[1]!,
      -Math.sin(theta) * v[0]! + Math.cos(theta) * v[1]!,
      v[2]!,
    ];
    const rEcef = rot(s.position);
    // Earth-fixed velocity: rotate, then subtract ω × r_ecef.
    const vRot = rot(s.velocity);
    const vEcef: [number, number, number] = [vRot[0] + omega * rEcef[1], vRot[1] - omega * rEcef[0], vRot[2]];
    expect(
      Math.abs(periodicCorrectionFromState({ position: rEcef, velocity: vEcef }) - periodicCorrectionFromState(s)),
    ).toBeLessThan(1e-20);
  });

  it('periodicCorrectionFromElements is ≤ 0 after perigee (0 < E < π), ≥ 0 before it, zero at perigee/apogee and bounded by periodicAmplitude (property)', () => {
    fc.assert(
      fc.property(orbitArb, (el) => {
        const amp = periodicAmplitude(el.semiMajorAxis, el.eccentricity);
        const E = solveKepler(el.meanAnomaly, el.eccentricity);
        const c = periodicCorrectionFromElements(el.semiMajorAxis, el.eccentricity, E);
        return (
          amp >= 0 && Math.abs(c) <= amp && (E > 0 && E < Math.PI ? c <= 0 : E < 0 && E > -Math.PI ? c >= 0 : true)
        );
      }),
      { seed: SEED, numRuns: 2000 },
    );
    expect(periodicCorrectionFromElements(26_561_750, 0.02, 0) === 0).toBe(true);
    expect(Math.abs(periodicCorrectionFromElements(26_561_750, 0.02, Math.PI))).toBeLessThan(1e-22);
  });

  it('periodicCorrectionAtMeanAnomaly returns the element-form correction at E solved from M, and the amplitude', () => {
    const r = periodicCorrectionAtMeanAnomaly(27_978_100, 0.158, 1, { constants: GALILEO_ICD });
    expect(r.eccentricAnomaly).toBe(solveKepler(1, 0.158));
    expect(r.correctionSeconds).toBe(
      periodicCorrectionFromElements(27_978_100, 0.158, r.eccentricAnomaly, { constants: GALILEO_ICD }),
    );
    expect(r.amplitudeSeconds).toBe(periodicAmplitude(27_978_100, 0.158, { constants: GALILEO_ICD }));
  });

  it('the periodic functions reject bad a, e, E, M, state and constants, naming the field', () => {
    expect(() => periodicCorrectionFromElements(26_561.75, 0.01, 1)).toThrow(
      /semiMajorAxis .*did you mean 26561\.75 km/,
    );
    expect(() => periodicCorrectionFromElements(26_561_750, 1.2, 1)).toThrow(
      /eccentricity must be in \[0, 1\).*hyperbolic/,
    );
    expect(() => periodicCorrectionFromElements(26_561_750, -0.1, 1)).toThrow(/eccentricity cannot be negative/);
    expect(() => periodicCorrectionFromElements(26_561_750, 0.01, Number.NaN)).toThrow(
      /eccentricAnomaly must be a finite angle/,
    );
    expect(() => periodicCorrectionFromElements(26_561_750, 0.01, 1, null as never)).toThrow(
      /options must be an object of named options/,
    );
    expect(() =>
      periodicCorrectionFromElements(26_561_750, 0.01, 1, { constants: null as unknown as ConstantSet }),
    ).toThrow(/options\.constants must be a ConstantSet/);
    expect(() => periodicAmplitude(Number.NaN, 0.01)).toThrow(/semiMajorAxis/);
    expect(() => periodicAmplitude(26_561_750, Number.NaN)).toThrow(/eccentricity/);
    expect(() => periodicAmplitude(26_561_750, 0.01, { constants: {} as ConstantSet })).toThrow(/options\.constants/);
    expect(() => periodicCorrectionAtMeanAnomaly(26_561_750, 0.01, Number.NaN)).toThrow(/meanAnomaly/);
    expect(() => periodicCorrectionAtMeanAnomaly(-1, 0.01, 1)).toThrow(/semiMajorAxis/);
    expect(() => periodicCorrectionAtMeanAnomaly(26_561_750, 1, 1)).toThrow(/eccentricity/);
    expect(() =>
      periodicCorrectionAtMeanAnomaly(26_561_750, 0.1, 1, { constants: 'gps-icd' as unknown as ConstantSet }),
    ).toThrow(/options\.constants/);
    expect(() => periodicCorrectionFromState({ position: [100, 0, 0], velocity: [0, 1, 0] })).toThrow(
      /\|state\.position\| .*inside the Earth/,
    );
    expect(() => periodicCorrectionFromState({ position: [7e6, 0, 0], velocity: [0, Number.NaN, 0] })).toThrow(
      /state\.velocity\[1\]/,
    );
    expect(() => periodicCorrectionFromState(null as unknown as StateVector)).toThrow(/state must be an object/);
  });
});
