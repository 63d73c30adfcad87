import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitClockPolynomial } from '../../src/clock-model/index.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { EPOCH } from './test-epoch.js';

describe('fitClockPolynomial', () => {
  it('fitClockPolynomial({ epoch: EPOCH, t: t, phase: x }) recovers af0/af1/af2 of an exact quadratic about t0 (IS-GPS-200 §20.3.3.3.3.1 form [M])', () => {
    const t = Array.from({ length: 97 }, (_, i) => 4.0e5 + 900 * i);
    const t0 = 4.3e5;
    const a = [2.5e-4, -3.1e-11, 4.0e-19];
    const x = t.map((ti) => a[0]! + a[1]! * (ti - t0) + a[2]! * (ti - t0) ** 2);
    const fit = fitClockPolynomial({ epoch: EPOCH, t: t, phase: x }, { referenceTime: t0, variance: 1e-18 });
    expect(Math.abs(fit.coefficients[0] - a[0]!)).toBeLessThan(1e-17);
    expect(Math.abs(fit.coefficients[1] - a[1]!)).toBeLessThan(1e-22);
    expect(Math.abs(fit.coefficients[2] - a[2]!) / a[2]!).toBeLessThan(1e-8);
    expect(fit.dof).toBe(94);
    expect(fit.covarianceScaled).toBe(false);
    expect(fit.predict(5e5)).toBeCloseTo(a[0]! + a[1]! * 7e4 + a[2]! * 4.9e9, 15);
  });
  it('fitClockPolynomial degree 1 with equal weights gives the textbook straight-line slope and its variance σ²/Σ(t − t̄)² (Numerical Recipes §15.2)', () => {
    const t = [0, 1, 2, 3, 4, 5, 6, 7];
    const x = [0.1, 1.9, 4.2, 5.8, 8.1, 9.9, 12.2, 13.8].map((v) => v * 1e-9);
    const fit = fitClockPolynomial(
      { epoch: EPOCH, t: t, phase: x },
      { degree: 1, variance: 1e-20, referenceTime: 3.5 },
    );
    const tm = 3.5;
    const sxx = t.reduce((s, ti) => s + (ti - tm) ** 2, 0);
    const slope = t.reduce((s, ti, i) => s + (ti - tm) * x[i]!, 0) / sxx;
    expect(fit.coefficients[1]).toBeCloseTo(slope, 22);
    expect(fit.coefficients[2]).toBe(0);
    expect(fit.covariance[1]![1]).toBeCloseTo(1e-20 / sxx, 30);
    expect(fit.covariance[0]![0]).toBeCloseTo(1e-20 / 8, 30);
    expect(fit.predictStd(3.5)).toBeCloseTo(Math.sqrt(1e-20 / 8), 20);
  });
  it('fitClockPolynomial without variances scales the covariance by the residual variance; with scaleByReducedChiSquare it scales on request', () => {
    const t = [0, 10, 20, 30, 40, 50];
    const x = [0, 1.1e-9, 1.9e-9, 3.2e-9, 3.9e-9, 5.1e-9];
    const unweighted = fitClockPolynomial({ epoch: EPOCH, t: t, phase: x }, { degree: 1 });
    expect(unweighted.covarianceScaled).toBe(true);
    const weighted = fitClockPolynomial(
      { epoch: EPOCH, t: t, phase: x },
      { degree: 1, variance: 1e-20, scaleByReducedChiSquare: true },
    );
    expect(weighted.covarianceScaled).toBe(true);
    expect(weighted.covariance[1]![1]! / unweighted.covariance[1]![1]!).toBeCloseTo(1, 10);
    const exact = fitClockPolynomial({ epoch: EPOCH, t: [0, 1], phase: [0, 1e-9] }, { degree: 1 });
    expect(exact.dof).toBe(0);
    expect(Number.isNaN(exact.reducedChiSquare)).toBe(true);
    expect(exact.covarianceScaled).toBe(false);
  });
  it('fitClockPolynomial recovers any exact polynomial of degree ≤ 2 (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e-3, max: 1e-3, noNaN: true }),
        fc.double({ min: -1e-9, max: 1e-9, noNaN: true }),
        fc.double({ min: -1e-16, max: 1e-16, noNaN: true }),
        fc.integer({ min: 3, max: 60 }),
        fc.double({ min: 1, max: 1e4, noNaN: true }),
        (a0, a1, a2, n, dt) => {
          const t = Array.from({ length: n }, (_, i) => 1e6 + i * dt);
          const x = t.map((ti) => a0 + a1 * (ti - 1e6) + a2 * (ti - 1e6) ** 2);
          const fit = fitClockPolynomial({ epoch: EPOCH, t: t, phase: x }, { referenceTime: 1e6 });
          const scale = Math.abs(a0) + Math.abs(a1) * n * dt + Math.abs(a2) * (n * dt) ** 2 + 1e-30;
          return t.every((ti, i) => Math.abs(fit.predict(ti) - x[i]!) <= 1e-12 * scale);
        },
      ),
      { seed: 20261202, numRuns: 200 },
    );
  });
  it('fitClockPolynomial predictStd grows with distance from the data (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e5, noNaN: true }), (h) => {
        const t = Array.from({ length: 20 }, (_, i) => i * 60);
        const fit = fitClockPolynomial(
          { epoch: EPOCH, t: t, phase: t.map((ti) => 1e-9 * Math.sin(ti)) },
          { variance: 1e-20 },
        );
        return fit.predictStd(1140 + h) < fit.predictStd(1140 + 2 * h);
      }),
      { seed: 20261202, numRuns: 100 },
    );
  });
  it('fitClockPolynomial({ epoch: EPOCH, t: t, phase: x }, options) rejects bad input', () => {
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: null as never, phase: [] })).toThrow(InvalidArgumentError);
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, 1] })).toThrow(InvalidArgumentError);
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, 1, 2] }, null as never)).toThrow(
      InvalidArgumentError,
    );
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, 1, 2] }, { degree: 3 as 2 })).toThrow(
      InvalidArgumentError,
    );
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, 1], phase: [0, 1] })).toThrow(/at least 3 samples/);
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, 0, 1], phase: [0, 1, 2] })).toThrow(/distinct epochs/);
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, Number.NaN, 1], phase: [0, 1, 2] })).toThrow(
      InvalidArgumentError,
    );
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, Infinity, 2] })).toThrow(
      InvalidArgumentError,
    );
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, 1, 2] }, { variance: 0 })).toThrow(
      InvalidArgumentError,
    );
    expect(() => fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, 1, 2] }, { variance: [1, 1] })).toThrow(
      InvalidArgumentError,
    );
    expect(() =>
      fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, 1, 2] }, { variance: [1, -1, 1] }),
    ).toThrow(InvalidArgumentError);
    expect(() =>
      fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, 1, 2] }, { referenceTime: Number.NaN }),
    ).toThrow(InvalidArgumentError);
    const fit = fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2], phase: [0, 1, 2] });
    expect(() => fit.predict(Number.NaN)).toThrow(InvalidArgumentError);
    expect(() => fit.predictStd(Infinity)).toThrow(InvalidArgumentError);
  });
});
