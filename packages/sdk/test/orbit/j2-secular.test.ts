/**
 * j2SecularRates and propagateJ2Secular on the options convention ({ constants } in the trailing options, never
 * positional). Reference values from j2-secular-rates.py beside this file (mpmath, 40 digits) [C], evaluating the
 * secular rates of D. A. Vallado, Fundamentals of Astrodynamics and Applications, 4th ed. (2013), §9.6 [M] with the
 * GM and R of each constant set. The two sets differ by 1.5e-7 in GM and 6e-8 in R, so a check to 1e-12 relative
 * tells which set a call used.
 */
import { describe, expect, it } from 'vitest';
import { GPS_ICD, IERS_2010 } from '../../src/constants.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { j2SecularRates, propagateJ2Secular } from '../../src/orbit/j2-secular.js';

const MEAN = {
  semiMajorAxis: 26_560_000,
  eccentricity: 0.01,
  inclination: 0.96,
  raan: 1,
  argumentOfPerigee: 0.5,
  meanAnomaly: 2,
};

/** mpmath values of j2-secular-rates.py, rad/s [C]. */
const REFERENCE = {
  'gps-icd': {
    raanRate: -7.835513484696448e-9,
    argumentOfPerigeeRate: 4.4034862221557581e-9,
    meanAnomalyRate: 1.4585675410738953e-4,
  },
  'iers-2010': {
    raanRate: -7.8355119298650056e-9,
    argumentOfPerigeeRate: 4.4034853483548454e-9,
    meanAnomalyRate: 1.4585674345906575e-4,
  },
};

function expectRates(actual: Record<keyof (typeof REFERENCE)['gps-icd'], number>, set: keyof typeof REFERENCE): void {
  for (const [field, value] of Object.entries(REFERENCE[set])) {
    const got = actual[field as keyof typeof actual];
    expect(Math.abs(got / value - 1), `${set} ${field}`).toBeLessThan(1e-12);
  }
}

describe('j2SecularRates(elements, { constants }) against mpmath (j2-secular-rates.py [C])', () => {
  it('j2SecularRates(elements, { constants: GPS_ICD }) gives the IS-GPS-200 set rates to 1e-12 relative (dΩ/dt = −0.0388°/day)', () => {
    expectRates(j2SecularRates(MEAN, { constants: GPS_ICD }), 'gps-icd');
  });

  it('j2SecularRates(elements) and (elements, {}) use IERS 2010, the same as { constants: IERS_2010 }', () => {
    expectRates(j2SecularRates(MEAN), 'iers-2010');
    expect(j2SecularRates(MEAN, {})).toEqual(j2SecularRates(MEAN, { constants: IERS_2010 }));
  });

  it('propagateJ2Secular(elements, dt, { constants: GPS_ICD }) advances Ω, ω and M by the GPS-set rates × dt', () => {
    const dt = 86_400;
    const p = propagateJ2Secular(MEAN, dt, { constants: GPS_ICD });
    const ref = REFERENCE['gps-icd'];
    const turn = (x: number): number => ((x % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
    // Angles of a few rad reduced mod 2π: the double rounding of rate·dt (M advances ≈ 12.6 rad) is ≈ 1e-15 rad.
    expect(Math.abs(p.raan - turn(MEAN.raan + ref.raanRate * dt))).toBeLessThan(1e-13);
    expect(Math.abs(p.argumentOfPerigee - turn(MEAN.argumentOfPerigee + ref.argumentOfPerigeeRate * dt))).toBeLessThan(
      1e-13,
    );
    expect(Math.abs(p.meanAnomaly - turn(MEAN.meanAnomaly + ref.meanAnomalyRate * dt))).toBeLessThan(1e-13);
  });
});

describe('j2SecularRates and propagateJ2Secular refuse the old positional constant set', () => {
  it('j2SecularRates(elements, GPS_ICD) and propagateJ2Secular(elements, dt, GPS_ICD) throw naming options, with the { constants: set } hint', () => {
    for (const call of [
      () => j2SecularRates(MEAN, GPS_ICD as never),
      () => propagateJ2Secular(MEAN, 3600, GPS_ICD as never),
    ]) {
      let error: unknown;
      try {
        call();
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(InvalidArgumentError);
      expect((error as InvalidArgumentError).argument).toBe('options');
      expect((error as InvalidArgumentError).hint).toBe('a constant set goes in the options: { constants: set }');
    }
  });

  it('j2SecularRates(elements, { constants: { ...GPS_ICD, gm: NaN } }) names options.constants.gm (requireConstantSet)', () => {
    expect(() => j2SecularRates(MEAN, { constants: { ...GPS_ICD, gm: Number.NaN } })).toThrow(/options\.constants\.gm/);
    expect(() => propagateJ2Secular(MEAN, 60, { constants: {} as never })).toThrow(/options\.constants\.name/);
  });
});
