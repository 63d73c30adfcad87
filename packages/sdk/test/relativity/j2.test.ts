import { describe, expect, it } from 'vitest';
import { GPS_ICD, IERS_2010, L_G, SPEED_OF_LIGHT_SQUARED } from '../../src/constants.js';
import { InvalidArgumentError, OutOfDomainError } from '../../src/errors.js';
import { elementsToState } from '../../src/orbit/elements.js';
import {
  j2PeriodicTermBatch,
  j2PeriodicTermFromStatesBatch,
  periodicCorrectionFromElementsBatch,
  periodicCorrectionFromStatesBatch,
} from '../../src/relativity/batch.js';
import {
  j2PeriodicAmplitudes,
  j2ResidualPeriodicTerm,
  j2SecularClockRate,
  j2SecularClockRateFromState,
  j2TotalPeriodicTerm,
  osculatingMinusMeanSemiMajorAxis,
} from '../../src/relativity/j2.js';
import { periodicCorrectionFromElements, periodicCorrectionFromState } from '../../src/relativity/periodic.js';

const DEG = Math.PI / 180;
const A_GPS = 26_561_750;
const I_GPS = 55 * DEG;

describe('J2 periodic terms (formulas)', () => {
  it('j2ResidualPeriodicTerm is three times j2TotalPeriodicTerm and both vanish at u = 0 and for an equatorial orbit', () => {
    for (const u of [0.3, 1.1, 2.9]) {
      expect(j2ResidualPeriodicTerm(A_GPS, I_GPS, u)).toBeCloseTo(3 * j2TotalPeriodicTerm(A_GPS, I_GPS, u), 25);
    }
    expect(j2ResidualPeriodicTerm(A_GPS, I_GPS, 0)).toBe(-0);
    expect(j2TotalPeriodicTerm(A_GPS, 0, 0.7)).toBe(-0);
  });

  it('j2ResidualPeriodicTerm peaks at u = 45° with the amplitude of j2PeriodicAmplitudes, negative sign (Kouba 2004 form)', () => {
    const amp = j2PeriodicAmplitudes(A_GPS, I_GPS);
    expect(j2ResidualPeriodicTerm(A_GPS, I_GPS, Math.PI / 4)).toBeCloseTo(-amp.residualAmplitude, 25);
    expect(amp.totalFrequencyAmplitude).toBeCloseTo(amp.totalAmplitude * 2 * Math.sqrt(IERS_2010.gm / A_GPS ** 3), 25);
    // period of the sin 2u term: half the orbital period, ≈ 6 h for GPS (IERS 2010 §10.2 "6-h term" [V1])
    expect(amp.period / 3600).toBeCloseTo(5.98, 2);
  });

  it('osculatingMinusMeanSemiMajorAxis is ≈ +1.67 km at the node and −1.67 km at u = 90° for GPS (reference sheet §5 "~1.6 km" [C])', () => {
    expect(osculatingMinusMeanSemiMajorAxis(A_GPS, I_GPS, 0)).toBeCloseTo(1669, 0);
    expect(osculatingMinusMeanSemiMajorAxis(A_GPS, I_GPS, Math.PI / 2)).toBeCloseTo(-1669, 0);
  });

  it('J2 functions reject a semi-major axis in km, an inclination in degrees and a non-finite u', () => {
    expect(() => j2ResidualPeriodicTerm(26_561.75, I_GPS, 0)).toThrow(/did you mean 26561\.75 km/);
    expect(() => j2TotalPeriodicTerm(A_GPS, 55, 0)).toThrow(/did you give degrees/);
    expect(() => j2ResidualPeriodicTerm(A_GPS, I_GPS, Number.NaN)).toThrow(/argumentOfLatitude/);
    expect(() => j2TotalPeriodicTerm(A_GPS, I_GPS, Infinity)).toThrow(InvalidArgumentError);
    expect(() => j2PeriodicAmplitudes(A_GPS, -0.1)).toThrow(/inclination/);
    expect(() => osculatingMinusMeanSemiMajorAxis(A_GPS, I_GPS, Number.NaN)).toThrow(/argumentOfLatitude/);
  });
});

describe('J2 secular rate: which semi-major axis', () => {
  it('j2SecularClockRate(mean) differs from the point-mass formula by −7⟨U_J2⟩/c² (tiny near 55°, ≈ 2e-16)', () => {
    const r = j2SecularClockRate({
      semiMajorAxis: A_GPS,
      eccentricity: 0,
      inclination: I_GPS,
      semiMajorAxisKind: 'mean',
    });
    expect(r.pointMassRate).toBeCloseTo(L_G - (1.5 * IERS_2010.gm) / (A_GPS * SPEED_OF_LIGHT_SQUARED), 22);
    expect(r.j2Correction).toBeCloseTo((-7 * r.meanJ2Potential) / SPEED_OF_LIGHT_SQUARED, 24);
    expect(Math.abs(r.j2Correction)).toBeLessThan(5e-16);
    expect(r.semiMajorAxisKind).toBe('mean');
    expect(r.microsecondsPerDay).toBeCloseTo(r.fractionalRate * 86400e6, 9);
  });

  it('j2SecularClockRate(osculating at the node) is ≈ −1.55e-14 (≈ −1.34 ns/day) off the point-mass formula (reference sheet §5 [C])', () => {
    const r = j2SecularClockRate({
      semiMajorAxis: A_GPS,
      eccentricity: 0,
      inclination: I_GPS,
      semiMajorAxisKind: 'osculating',
      argumentOfLatitude: 0,
    });
    expect(r.j2Correction).toBeCloseTo(-1.55e-14, 16);
    expect(r.j2Correction * 86400e9).toBeCloseTo(-1.34, 1);
  });

  it('j2SecularClockRateFromState agrees with the osculating-a formula for a circular GPS state at the node to < 1e-17', () => {
    // FromState now averages U_J2 along the propagated orbit; the analytic first-order formula is documented to
    // 1e-17 at GNSS altitude (test/reference/j2-secular-rate), so the two agree to that, not to rounding (they differ by ≈ 8e-19).
    const s = elementsToState(
      { semiMajorAxis: A_GPS, eccentricity: 0, inclination: I_GPS, raan: 0, argumentOfPerigee: 0, meanAnomaly: 0 },
      IERS_2010.gm,
    );
    const a = j2SecularClockRateFromState(s);
    const b = j2SecularClockRate({
      semiMajorAxis: A_GPS,
      eccentricity: 0,
      inclination: I_GPS,
      semiMajorAxisKind: 'osculating',
      argumentOfLatitude: 0,
    });
    expect(Math.abs(a.fractionalRate - b.fractionalRate)).toBeLessThan(1e-17);
    expect(a.semiMajorAxis).toBeCloseTo(A_GPS, 3);
  });

  it('j2SecularClockRate rejects an unstated kind, a missing u for osculating, and bad elements', () => {
    const base = { semiMajorAxis: A_GPS, eccentricity: 0, inclination: I_GPS };
    expect(() => j2SecularClockRate({ ...base, semiMajorAxisKind: 'brouwer' as never })).toThrow(
      /"mean" or "osculating".*1\.3 ns\/day/,
    );
    expect(() => j2SecularClockRate({ ...base, semiMajorAxisKind: 'osculating' })).toThrow(/orbit\.argumentOfLatitude/);
    expect(() => j2SecularClockRate({ ...base, eccentricity: 1.2, semiMajorAxisKind: 'mean' })).toThrow(
      /orbit\.eccentricity/,
    );
    expect(() => j2SecularClockRate(null as never)).toThrow(InvalidArgumentError);
    expect(() => j2SecularClockRateFromState({ position: [A_GPS, 0, 0], velocity: [0, 8000, 0] })).toThrow(
      /below escape speed/,
    );
    expect(() => j2SecularClockRateFromState({ position: [1000, 0, 0], velocity: [0, 1, 0] })).toThrow(
      /inside the Earth/,
    );
    // LEO: outside the analytic formula's documented domain (perigee radius ≥ 25 000 km); FromState covers it.
    expect(() => j2SecularClockRate({ ...base, semiMajorAxis: 7_000_000, semiMajorAxisKind: 'mean' })).toThrow(
      OutOfDomainError,
    );
    expect(() => j2SecularClockRate({ ...base, semiMajorAxis: 7_000_000, semiMajorAxisKind: 'mean' })).toThrow(
      /j2SecularClockRateFromState/,
    );
    expect(() => j2SecularClockRate({ ...base, eccentricity: 0.2, semiMajorAxisKind: 'mean' })).toThrow(
      /orbit\.semiMajorAxis × \(1 − orbit\.eccentricity\) = 21249400/,
    );
    // a state whose orbit dips into the Earth within the averaging window (perigee ≈ 3000 km)
    expect(() => j2SecularClockRateFromState({ position: [A_GPS, 0, 0], velocity: [0, 1500, 0] })).toThrow(
      OutOfDomainError,
    );
  });
});

describe('batch APIs on Float64Array', () => {
  const E = Float64Array.from({ length: 97 }, (_, k) => (k * 2 * Math.PI) / 96);

  it('periodicCorrectionFromElementsBatch equals periodicCorrectionFromElements element by element (IS-GPS-200 F, GPS set)', () => {
    const out = periodicCorrectionFromElementsBatch(A_GPS, 0.0123, E, { constants: GPS_ICD });
    for (let k = 0; k < E.length; k++)
      expect(out[k]).toBe(periodicCorrectionFromElements(A_GPS, 0.0123, E[k]!, { constants: GPS_ICD }));
  });

  it('periodicCorrectionFromStatesBatch equals periodicCorrectionFromState and writes into out', () => {
    const states = new Float64Array(6 * 10);
    for (let k = 0; k < 10; k++) {
      const s = elementsToState(
        {
          semiMajorAxis: A_GPS,
          eccentricity: 0.02,
          inclination: I_GPS,
          raan: 0.2,
          argumentOfPerigee: 0.4,
          meanAnomaly: k * 0.6,
        },
        IERS_2010.gm,
      );
      states.set([...s.position, ...s.velocity], 6 * k);
    }
    const out = new Float64Array(10);
    expect(periodicCorrectionFromStatesBatch(states, { out })).toBe(out);
    for (let k = 0; k < 10; k++) {
      const s = states.subarray(6 * k, 6 * k + 6);
      expect(out[k]).toBeCloseTo(
        periodicCorrectionFromState({ position: [s[0]!, s[1]!, s[2]!], velocity: [s[3]!, s[4]!, s[5]!] }),
        22,
      );
    }
  });

  it('j2PeriodicTermBatch and j2PeriodicTermFromStatesBatch agree with the scalar J2 terms', () => {
    const u = Float64Array.from({ length: 50 }, (_, k) => k * 0.13);
    const res = j2PeriodicTermBatch(A_GPS, I_GPS, u, 'residual');
    const tot = j2PeriodicTermBatch(A_GPS, I_GPS, u, 'total');
    for (let k = 0; k < u.length; k++) {
      expect(res[k]).toBeCloseTo(j2ResidualPeriodicTerm(A_GPS, I_GPS, u[k]!), 24);
      expect(tot[k]).toBeCloseTo(j2TotalPeriodicTerm(A_GPS, I_GPS, u[k]!), 24);
    }
    const states = new Float64Array(6 * 8);
    const us: number[] = [];
    for (let k = 0; k < 8; k++) {
      const uk = 0.1 + k * 0.7;
      us.push(uk);
      const s = elementsToState(
        { semiMajorAxis: A_GPS, eccentricity: 0, inclination: I_GPS, raan: 0.9, argumentOfPerigee: 0, meanAnomaly: uk },
        IERS_2010.gm,
      );
      states.set([...s.position, ...s.velocity], 6 * k);
    }
    const fromStates = j2PeriodicTermFromStatesBatch(states);
    for (let k = 0; k < 8; k++) expect(fromStates[k]).toBeCloseTo(j2ResidualPeriodicTerm(A_GPS, I_GPS, us[k]!), 20);
  });

  it('batch APIs reject plain arrays, wrong lengths, non-finite entries, positions inside the Earth and a bad out', () => {
    expect(() => periodicCorrectionFromElementsBatch(A_GPS, 0.01, [1, 2] as never)).toThrow(/Float64Array/);
    expect(() => periodicCorrectionFromStatesBatch(new Float64Array(7))).toThrow(/multiple of 6/);
    expect(() => periodicCorrectionFromElementsBatch(A_GPS, 0.01, Float64Array.of(0, Number.NaN))).toThrow(
      /eccentricAnomalies\[1\]/,
    );
    expect(() => periodicCorrectionFromStatesBatch(Float64Array.of(1000, 0, 0, 0, 1, 0))).toThrow(/inside the Earth/);
    expect(() =>
      j2PeriodicTermBatch(A_GPS, I_GPS, new Float64Array(3), 'residual', {
        constants: IERS_2010,
        out: new Float64Array(2),
      }),
    ).toThrow(/out must be a Float64Array of length 3/);
    expect(() => j2PeriodicTermBatch(A_GPS, I_GPS, new Float64Array(3), 'half' as never)).toThrow(
      /"residual" or "total"/,
    );
    expect(() => j2PeriodicTermFromStatesBatch(new Float64Array(6), 'x' as never)).toThrow(/"residual" or "total"/);
    expect(() => j2PeriodicTermFromStatesBatch(Float64Array.of(A_GPS, 0, 0, 0, 9000, 0))).toThrow(/escape speed/);
    expect(() => j2PeriodicTermFromStatesBatch(Float64Array.of(10, 0, 0, 0, 9000, 0))).toThrow(/inside the Earth/);
  });
});
