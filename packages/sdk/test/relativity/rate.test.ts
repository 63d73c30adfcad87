import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { GPS_ICD, IERS_2010, L_G, SPEED_OF_LIGHT } from '../../src/constants.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { elementsToState, orbitalPeriod, propagateKeplerState, type StateVector } from '../../src/orbit/index.js';
import {
  instantaneousClockRate,
  meanClockRate,
  rateChangeForSemiMajorAxisChange,
  requireReferenceClock,
  semiMajorAxisForMeanRate,
} from '../../src/relativity/index.js';

const SEED = 20261202;
const C2 = SPEED_OF_LIGHT ** 2;

describe('meanClockRate', () => {
  it('meanClockRate(a) parts sum to fractionalRate and factoryOffset = 1/(1 + rate) − 1 exactly in value (property, both references)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6.5e6, max: 1e9, noNaN: true }),
        fc.constantFrom('tt' as const, 'tcg' as const),
        (a, reference) => {
          const r = meanClockRate(a, { reference });
          const direct = 1 / (1 + r.fractionalRate) - 1;
          // The direct form 1/(1 + x) − 1 itself loses digits to cancellation (≈ 1.1e-16 absolute), hence its tolerance.
          return (
            Math.abs(r.gravitational + r.velocity - r.fractionalRate) <= 1e-24 &&
            Math.abs(r.factoryOffset - direct) <= 2.3e-16 &&
            // (1 + rate)(1 + offset) = 1, i.e. rate + offset + rate·offset = 0, to a few ulp of the rate
            Math.abs(r.fractionalRate + r.factoryOffset + r.fractionalRate * r.factoryOffset) <= 1e-24
          );
        },
      ),
      { seed: SEED, numRuns: 2000 },
    );
  });

  it('meanClockRate(a, { reference: "tt" }) − meanClockRate(a, { reference: "tcg" }) = L_G (IERS 2010 eqs. 10.7/10.9 [V1])', () => {
    const tt = meanClockRate(26_561_750);
    const tcg = meanClockRate(26_561_750, { reference: 'tcg' });
    expect(tt.fractionalRate - tcg.fractionalRate).toBeCloseTo(L_G, 22);
    expect(tt.velocity).toBe(tcg.velocity);
    expect(tt.reference).toBe('tt');
    expect(tt.constants).toBe('iers-2010');
    expect(tt.semiMajorAxis).toBe(26_561_750);
  });

  it('meanClockRate(a) equals the orbit average of instantaneousClockRate over an eccentric Kepler orbit (independent numerical average)', () => {
    // Average over equal time steps of one period; the trapezoid rule on a periodic function converges spectrally.
    const el = {
      semiMajorAxis: 27_978_100,
      eccentricity: 0.158,
      inclination: 0.87,
      raan: 0.2,
      argumentOfPerigee: 0.9,
      meanAnomaly: 0,
    };
    const P = orbitalPeriod(el.semiMajorAxis, IERS_2010.gm);
    const N = 2000;
    for (const reference of ['tt', 'tcg'] as const) {
      let sum = 0;
      for (let k = 0; k < N; k++)
        sum += instantaneousClockRate(propagateKeplerState(el, (k * P) / N, IERS_2010.gm), { reference });
      expect(Math.abs(sum / N - meanClockRate(el.semiMajorAxis, { reference }).fractionalRate)).toBeLessThan(1e-21);
    }
  });

  it('meanClockRate(a) grows with a: a higher orbit runs faster (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6.5e6, max: 1e8, noNaN: true }),
        fc.double({ min: 1, max: 1e6, noNaN: true }),
        (a, da) => meanClockRate(a + da).fractionalRate > meanClockRate(a).fractionalRate,
      ),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('meanClockRate(a) rejects kilometres, NaN, negative and absurd axes, an unknown reference and a malformed constant set', () => {
    expect(() => meanClockRate(26_561.75)).toThrow(
      /semiMajorAxis must be .*received 26561\.75\. 26561\.75 m is inside the Earth; did you mean 26561\.75 km = 26561750 m\?/,
    );
    expect(() => meanClockRate(Number.NaN)).toThrow(/semiMajorAxis .*received NaN/);
    expect(() => meanClockRate(-26_561_750)).toThrow(InvalidArgumentError);
    expect(() => meanClockRate(1e11)).toThrow(/below 1e10 m/);
    expect(() => meanClockRate('26561750' as unknown as number)).toThrow(/semiMajorAxis/);
    expect(() => meanClockRate(26_561_750, { reference: 'tai' as 'tt' })).toThrow(
      /options\.reference must be one of tt, tcg; received "tai"/,
    );
    expect(() => meanClockRate(26_561_750, { reference: 'TT' as 'tt' })).toThrow(/use lower case: tt/);
    expect(() => meanClockRate(26_561_750, { constants: {} as typeof IERS_2010 })).toThrow(
      /options\.constants\.name must be a string naming the set \(a ConstantSet/,
    );
  });
});

describe('instantaneousClockRate', () => {
  it('instantaneousClockRate(state) = L_G − (v²/2 + GM/r)/c² vs TT and −(v²/2 + GM/r)/c² vs TCG (IERS 2010 eqs. 10.9, 10.7 [V1])', () => {
    const s: StateVector = { position: [26_561_750, 0, 0], velocity: [0, 3873.9, 0] };
    const expected = (3873.9 ** 2 / 2 + IERS_2010.gm / 26_561_750) / C2;
    expect(instantaneousClockRate(s)).toBeCloseTo(L_G - expected, 24);
    expect(instantaneousClockRate(s, { reference: 'tcg' })).toBeCloseTo(-expected, 24);
    expect(instantaneousClockRate(s, { constants: GPS_ICD, reference: 'tcg' })).toBeCloseTo(
      -(3873.9 ** 2 / 2 + GPS_ICD.gm / 26_561_750) / C2,
      24,
    );
  });

  it('instantaneousClockRate(state) on a circular orbit equals meanClockRate(a) (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6.6e6, max: 5e7, noNaN: true }),
        fc.double({ min: 0, max: 6, noNaN: true }),
        (a, M) => {
          const s = elementsToState(
            { semiMajorAxis: a, eccentricity: 0, inclination: 1, raan: 0.3, argumentOfPerigee: 0, meanAnomaly: M },
            IERS_2010.gm,
          );
          return Math.abs(instantaneousClockRate(s) - meanClockRate(a).fractionalRate) <= 1e-24;
        },
      ),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('instantaneousClockRate(state) rejects malformed vectors, a position inside the Earth and an unknown reference', () => {
    expect(() => instantaneousClockRate({ position: [1, 2, 3], velocity: [0, 0, 0] })).toThrow(
      /\|state\.position\| must be a geocentric distance in metres, from 6300000 m/,
    );
    expect(() => instantaneousClockRate({ position: [6378.137, 0, 0], velocity: [0, 0, 0] })).toThrow(
      /inside the Earth; were the coordinates given in km \(6378\.137 km = 6378137 m\)\?/,
    );
    expect(() => instantaneousClockRate({ position: [2e10, 0, 0], velocity: [0, 0, 0] })).toThrow(
      /\|state\.position\|.*received 20000000000/,
    );
    // A clock on the ground at the pole (r = 6 356 752 m) is accepted.
    expect(instantaneousClockRate({ position: [0, 0, 6_356_752], velocity: [0, 0, 0] })).toBeCloseTo(
      L_G - IERS_2010.gm / 6_356_752 / C2,
      24,
    );
    expect(() => instantaneousClockRate({ position: [Number.NaN, 0, 0], velocity: [0, 0, 0] })).toThrow(
      /state\.position\[0\]/,
    );
    expect(() => instantaneousClockRate({ position: [7e6, 0, 0] } as unknown as StateVector)).toThrow(
      /state\.velocity must be an array/,
    );
    expect(() =>
      instantaneousClockRate({ position: [7e6, 0, 0], velocity: [0, 7e3, 0] }, { reference: 'x' as 'tt' }),
    ).toThrow(/options\.reference/);
  });
});

describe('rateChangeForSemiMajorAxisChange', () => {
  it('rateChangeForSemiMajorAxisChange(a0, a1) equals the difference of mean rates and is antisymmetric (property)', () => {
    const step = fc.double({ min: -1e5, max: 1e5, noNaN: true }).filter((x) => Math.abs(x) >= 1e-3);
    fc.assert(
      fc.property(fc.double({ min: 7e6, max: 5e7, noNaN: true }), step, (a0, da) => {
        const d = rateChangeForSemiMajorAxisChange(a0, a0 + da);
        const diff = meanClockRate(a0 + da).fractionalRate - meanClockRate(a0).fractionalRate;
        return (
          Math.abs(d - diff) <= 1e-24 &&
          d === -rateChangeForSemiMajorAxisChange(a0 + da, a0) &&
          Math.sign(d) === Math.sign(da)
        );
      }),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it('rateChangeForSemiMajorAxisChange(a, a) is exactly 0 and stays precise for 1 mm (no cancellation)', () => {
    expect(rateChangeForSemiMajorAxisChange(26_561_750, 26_561_750)).toBe(0);
    const a1 = 26_561_750.001;
    const d = rateChangeForSemiMajorAxisChange(26_561_750, a1);
    // First-order form 3GM/(2a²c²)·Δa with the exact double Δa = a1 − a0 (Sterbenz); the second-order term is Δa/a = 3.8e-11 relative.
    const expected = ((1.5 * IERS_2010.gm) / C2 / 26_561_750 ** 2) * (a1 - 26_561_750);
    expect(Math.abs(d / expected - 1 + (a1 - 26_561_750) / 26_561_750)).toBeLessThan(1e-14);
  });

  it('rateChangeForSemiMajorAxisChange rejects either axis when it is not a plausible radius in metres', () => {
    expect(() => rateChangeForSemiMajorAxisChange(26_561.75, 26_561_750)).toThrow(/aBefore must be .*did you mean/);
    expect(() => rateChangeForSemiMajorAxisChange(26_561_750, Number.NaN)).toThrow(/aAfter/);
    expect(() => rateChangeForSemiMajorAxisChange(26_561_750, 26_561_751, { reference: 'x' as 'tt' })).toThrow(
      /options\.reference/,
    );
  });
});

describe('semiMajorAxisForMeanRate', () => {
  it('semiMajorAxisForMeanRate(meanClockRate(a).fractionalRate) returns a (property, both references)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6.5e6, max: 1e9, noNaN: true }),
        fc.constantFrom('tt' as const, 'tcg' as const),
        (a, reference) => {
          const rate = meanClockRate(a, { reference }).fractionalRate;
          return Math.abs(semiMajorAxisForMeanRate(rate, { reference }) / a - 1) <= 1e-9;
        },
      ),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it('semiMajorAxisForMeanRate rejects rates no orbit has: ≥ L_G vs TT, ≥ 0 vs TCG, NaN, and ones below the Earth surface', () => {
    expect(() => semiMajorAxisForMeanRate(7e-10)).toThrow(
      /fractionalRate must be a finite number below 6\.969290134e-10 \(L_G\)/,
    );
    expect(() => semiMajorAxisForMeanRate(0, { reference: 'tcg' })).toThrow(/below 0 \(0\)/);
    expect(() => semiMajorAxisForMeanRate(Number.NaN)).toThrow(/fractionalRate/);
    expect(() => semiMajorAxisForMeanRate(-1e-8)).toThrow(/semiMajorAxis \(from fractionalRate\)/);
  });

  it('requireReferenceClock accepts tt and tcg only', () => {
    expect(requireReferenceClock('r', 'tt')).toBe('tt');
    expect(requireReferenceClock('r', 'tcg')).toBe('tcg');
    expect(() => requireReferenceClock('r', 5)).toThrow(/r must be one of tt, tcg; received 5/);
  });
});
