import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import {
  chiSquareCdf,
  chiSquareQuantile,
  chiSquareSurvival,
  chiSquareUpperQuantile,
  logGamma,
  normalCdf,
  normalQuantile,
  regularizedGammaP,
  regularizedGammaQ,
} from '../../src/internal/special-functions.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe('logGamma', () => {
  it('logGamma(n) equals ln((n−1)!) for n = 1..30 (exact factorials, A&S 6.1.6)', () => {
    let fact = 1;
    for (let n = 1; n <= 30; n++) {
      if (n > 1) fact *= n - 1;
      const expected = Math.log(fact);
      if (n <= 2) expect(Math.abs(logGamma(n))).toBeLessThan(1e-15);
      else expect(rel(logGamma(n), expected)).toBeLessThan(2e-15);
    }
  });
  it('logGamma(½) equals ln √π (A&S 6.1.8) and logGamma(0.1), logGamma(1e6) match mpmath 1.3.0 to 1e-15 [C]', () => {
    expect(rel(logGamma(0.5), 0.5 * Math.log(Math.PI))).toBeLessThan(1e-15);
    expect(rel(logGamma(0.1), 2.252712651734206)).toBeLessThan(1e-15);
    expect(rel(logGamma(1e6), 12815504.569147611)).toBeLessThan(1e-15);
  });
  it('logGamma(x) rejects 0, negatives, NaN and Infinity', () => {
    for (const bad of [0, -1, Number.NaN, Infinity]) expect(() => logGamma(bad)).toThrow(InvalidArgumentError);
  });
});

describe('regularised incomplete gamma', () => {
  it('regularizedGammaP/Q match 40-digit mpmath 1.3.0 values to 1e-13 for a = 0.5..5e5 [C]', () => {
    const cases: [number, number, number, number][] = [
      [0.5, 0.1, 0.34527915398142298, 0.65472084601857702],
      [3.7, 2.0, 0.18627467088905395, 0.81372532911094605],
      [50, 60, 0.91559331890630817, 0.08440668109369183],
      [5e5, 5.001e5, 0.5564139174784543, 0.4435860825215457],
    ];
    for (const [a, x, p, q] of cases) {
      expect(rel(regularizedGammaP(a, x), p)).toBeLessThan(1e-13);
      expect(rel(regularizedGammaQ(a, x), q)).toBeLessThan(1e-13);
    }
  });
  it('regularizedGammaQ(1, x) equals e^−x (A&S 6.5.13 with a = 1) and P(½, x) equals erf(√x) via Φ (A&S 6.5.17)', () => {
    for (const x of [1e-3, 0.5, 1, 3, 20, 200]) expect(rel(regularizedGammaQ(1, x), Math.exp(-x))).toBeLessThan(1e-14);
    expect(regularizedGammaP(0.5, 0.5)).toBeCloseTo(2 * normalCdf(1) - 1, 15);
  });
  it('regularizedGammaP(a, x) handles x = 0 and x = Infinity', () => {
    expect(regularizedGammaP(2, 0)).toBe(0);
    expect(regularizedGammaQ(2, 0)).toBe(1);
    expect(regularizedGammaP(2, Infinity)).toBe(1);
    expect(regularizedGammaQ(2, Infinity)).toBe(0);
  });
  it('regularizedGammaP(a, x) and regularizedGammaQ(a, x) reject a ≤ 0, x < 0 and NaN', () => {
    for (const f of [regularizedGammaP, regularizedGammaQ]) {
      expect(() => f(0, 1)).toThrow(InvalidArgumentError);
      expect(() => f(Number.NaN, 1)).toThrow(InvalidArgumentError);
      expect(() => f(1, -1)).toThrow(InvalidArgumentError);
      expect(() => f(1, Number.NaN)).toThrow(InvalidArgumentError);
    }
  });
  it('regularizedGammaP(a, x) + regularizedGammaQ(a, x) = 1 (property, fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 1e5, noNaN: true }),
        fc.double({ min: 0, max: 2e5, noNaN: true }),
        (a, x) => Math.abs(regularizedGammaP(a, x) + regularizedGammaQ(a, x) - 1) < 1e-12,
      ),
      { seed: 20261202, numRuns: 300 },
    );
  });
});

describe('chi-square distribution', () => {
  // Critical values printed to 3 decimals in the NIST/SEMATECH e-Handbook of Statistical Methods,
  // §1.3.6.7.4 "Critical values of the chi-square distribution", and in Abramowitz & Stegun Table 26.8 [M].
  const upperTable: [number, number, number][] = [
    // [df, upper-tail probability, critical value]
    [1, 0.05, 3.841],
    [2, 0.05, 5.991],
    [5, 0.05, 11.07],
    [10, 0.05, 18.307],
    [30, 0.05, 43.773],
    [100, 0.05, 124.342],
    [1, 0.01, 6.635],
    [10, 0.01, 23.209],
    [100, 0.01, 135.807],
    [10, 0.95, 3.94],
    [100, 0.95, 77.929],
  ];
  it('chiSquareUpperQuantile(q, df) reproduces the NIST/SEMATECH e-Handbook §1.3.6.7.4 table to its 3 decimals [M]', () => {
    for (const [df, q, value] of upperTable)
      expect(Math.abs(chiSquareUpperQuantile(q, df) - value)).toBeLessThanOrEqual(0.0005);
  });
  it('chiSquareQuantile(1 − q, df) reproduces the same table values [M]', () => {
    for (const [df, q, value] of upperTable)
      expect(Math.abs(chiSquareQuantile(1 - q, df) - value)).toBeLessThanOrEqual(0.0005);
  });
  it('chiSquareQuantile(p, 2) equals −2 ln(1 − p) (closed form, A&S 26.4.21 with ν = 2)', () => {
    for (const p of [1e-12, 1e-6, 0.01, 0.5, 0.9, 0.999999])
      expect(rel(chiSquareQuantile(p, 2), -2 * Math.log1p(-p))).toBeLessThan(1e-13);
  });
  it('chiSquareQuantile(p, df) matches 40-digit mpmath 1.3.0 roots for df from 0.5 to 1e6 to 1e-12 [C]', () => {
    const cases: [number, number, number][] = [
      [1e-12, 0.5, 1.3499395786223459e-48],
      [0.025, 0.5, 5.2732025912599936e-7],
      [0.975, 3.7, 10.618055248352459],
      [0.16, 12.5, 7.6561532760432617],
      [0.5, 146.177, 145.51087656168508],
      [0.025, 1e6, 997230.0871432901],
      [0.975, 1e6, 1002773.701467926],
    ];
    for (const [p, df, x] of cases) expect(rel(chiSquareQuantile(p, df), x)).toBeLessThan(1e-12);
  });
  it('chiSquareUpperQuantile(1e-12, df) matches mpmath 1.3.0 for df = 1 and 1e6 [C]', () => {
    expect(rel(chiSquareUpperQuantile(1e-12, 1), 50.844127911818156)).toBeLessThan(1e-12);
    expect(rel(chiSquareUpperQuantile(1e-12, 1e6), 1009980.6085140438)).toBeLessThan(1e-12);
  });
  it('chiSquareCdf(chiSquareQuantile(p, df), df) returns p (round trip, property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-10, max: 0.5, noNaN: true }),
        fc.double({ min: 0.5, max: 1e6, noNaN: true }),
        (p, df) =>
          rel(chiSquareCdf(chiSquareQuantile(p, df), df), p) < 1e-10 &&
          rel(chiSquareSurvival(chiSquareUpperQuantile(p, df), df), p) < 1e-10,
      ),
      { seed: 20261202, numRuns: 200 },
    );
  });
  it('chiSquareCdf(x, df) and chiSquareSurvival(x, df) reject negative x, NaN and df ≤ 0', () => {
    expect(() => chiSquareCdf(-1, 2)).toThrow(InvalidArgumentError);
    expect(() => chiSquareCdf(Number.NaN, 2)).toThrow(InvalidArgumentError);
    expect(() => chiSquareCdf(1, 0)).toThrow(InvalidArgumentError);
    expect(() => chiSquareSurvival(-1, 2)).toThrow(InvalidArgumentError);
    expect(() => chiSquareSurvival(1, -3)).toThrow(InvalidArgumentError);
  });
  it('chiSquareQuantile(p, df) and chiSquareUpperQuantile(q, df) reject probabilities outside (0, 1) and df ≤ 0', () => {
    for (const bad of [0, 1, -0.1, 1.5, Number.NaN]) {
      expect(() => chiSquareQuantile(bad, 3)).toThrow(InvalidArgumentError);
      expect(() => chiSquareUpperQuantile(bad, 3)).toThrow(InvalidArgumentError);
    }
    expect(() => chiSquareQuantile(0.5, 0)).toThrow(InvalidArgumentError);
    expect(() => chiSquareUpperQuantile(0.5, Infinity)).toThrow(InvalidArgumentError);
  });
});

describe('normal distribution', () => {
  it('normalCdf(z) reproduces A&S Table 26.1 values Φ(1) = 0.8413447461, Φ(2) = 0.9772498681, Φ(3) = 0.9986501020 [M]', () => {
    expect(normalCdf(1)).toBeCloseTo(0.8413447461, 10);
    expect(normalCdf(2)).toBeCloseTo(0.9772498681, 10);
    expect(normalCdf(3)).toBeCloseTo(0.998650102, 10);
    expect(normalCdf(0)).toBe(0.5);
  });
  it('normalCdf(z) keeps relative accuracy in the lower tail: Φ(−8) and Φ(−30) match mpmath 1.3.0 to 1e-13 [C]', () => {
    expect(rel(normalCdf(-8), 6.22096057427178e-16)).toBeLessThan(1e-13);
    expect(rel(normalCdf(-30), 4.906713927148187e-198)).toBeLessThan(1e-13);
    expect(normalCdf(-Infinity)).toBe(0);
    expect(normalCdf(Infinity)).toBe(1);
  });
  it('normalQuantile(p) gives 1.959963984540054 at 0.975 and 2.575829303548901 at 0.995 (A&S Table 26.5 [M]; mpmath [C])', () => {
    expect(rel(normalQuantile(0.975), 1.959963984540054)).toBeLessThan(1e-15);
    expect(rel(normalQuantile(0.995), 2.575829303548901)).toBeLessThan(1e-15);
    expect(rel(normalQuantile(1e-12), -7.034483825301132)).toBeLessThan(1e-15);
    expect(normalQuantile(0.5)).toBe(0);
  });
  it('normalCdf(normalQuantile(p)) returns p (round trip, property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-300, max: 0.999999, noNaN: true }),
        (p) => rel(normalCdf(normalQuantile(p)), p) < 1e-12,
      ),
      { seed: 20261202, numRuns: 300 },
    );
  });
  it('normalCdf(z) rejects NaN and normalQuantile(p) rejects p outside (0, 1)', () => {
    expect(() => normalCdf(Number.NaN)).toThrow(InvalidArgumentError);
    for (const bad of [0, 1, 2, Number.NaN]) expect(() => normalQuantile(bad)).toThrow(InvalidArgumentError);
  });
});
