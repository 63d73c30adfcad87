/**
 * polynomialNoiseCovariance against Monte Carlo: seeded simulateClock runs (exact discretisation of the
 * Zucca & Tavella model, physics-refs §11 [M citation; C]) fitted with fitClockPolynomial; the empirical
 * spread of the coefficients and of the prediction error must match the computed 1σ within the sampling
 * error of a standard deviation over `runs` trials (σ̂/σ ≈ 1 ± 3/√(2·runs); common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { fitClockPolynomial, polynomialNoiseCovariance, simulateClock } from '../../src/clock-model/index.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { EPOCH } from './test-epoch.js';

describe('polynomialNoiseCovariance', () => {
  it('polynomialNoiseCovariance({ epoch, t }, { degree: 2, q, R }) gives the Monte-Carlo spread of a0, a1, a2 and of a 1-day prediction (400 seeded clocks)', () => {
    const runs = 400;
    const n = 500;
    const tau0 = 300;
    const q = { q1: 1e-23, q2: 1e-31, q3: 1e-40 };
    const sv = 50e-12;
    const t = Float64Array.from({ length: n }, (_, k) => k * tau0);
    const T = (n - 1) * tau0 + 86400;
    const model = polynomialNoiseCovariance(
      { epoch: EPOCH, t },
      {
        degree: 2,
        referenceTime: 0,
        q,
        measurementVariance: sv * sv,
        predict: [T],
      },
    );
    const err: number[][] = [[], [], [], []];
    for (let r = 0; r < runs; r++) {
      const sim = simulateClock({
        samples: n + 288,
        tau0,
        q,
        seed: 40000 + r,
        measurementNoise: sv,
        initial: { phase: 1e-6, frequency: 2e-11, drift: 1e-18 },
      });
      const fit = fitClockPolynomial(
        { epoch: EPOCH, t: t, phase: sim.phase.subarray(0, n) },
        { degree: 2, referenceTime: 0 },
      );
      err[0]!.push(fit.coefficients[0] - 1e-6);
      err[1]!.push(fit.coefficients[1] - 2e-11);
      err[2]!.push(fit.coefficients[2] - 1e-18 / 2);
      err[3]!.push(fit.predict(T) - sim.truePhase[n - 1 + 288]!);
    }
    const expected = [...model.std, model.predictStd[0]!];
    err.forEach((e, i) => {
      const rms = Math.sqrt(e.reduce((a, b) => a + b * b, 0) / runs);
      expect(Math.abs(rms / expected[i]! - 1)).toBeLessThan(3 / Math.sqrt(2 * runs));
    });
  });

  it('polynomialNoiseCovariance with q = 0 reduces to the white-noise least-squares covariance R(AᵀA)⁻¹ of fitClockPolynomial', () => {
    const t = Float64Array.from({ length: 50 }, (_, k) => k * 10);
    const fit = fitClockPolynomial(
      { epoch: EPOCH, t: t, phase: t.map((v) => 1e-9 + 1e-12 * v) },
      { degree: 1, variance: 4e-20, referenceTime: 100 },
    );
    const model = polynomialNoiseCovariance(
      { epoch: EPOCH, t },
      {
        degree: 1,
        referenceTime: 100,
        q: { q1: 0, q2: 0 },
        measurementVariance: 4e-20,
      },
    );
    for (let i = 0; i < 2; i++)
      for (let j = 0; j < 2; j++) expect(model.covariance[i]![j]! / fit.covariance[i]![j]!).toBeCloseTo(1, 9);
    expect(model.epoch).toBe(EPOCH);
    expect(model.referenceEpoch.secondsSince(EPOCH)).toBe(100);
    expect(model.referenceEpoch.secondsSince(fit.referenceEpoch)).toBe(0);
  });

  it('polynomialNoiseCovariance rejects bad epochs, degree, q, variance and predictions inside the record', () => {
    const q = { q1: 1e-23, q2: 0 };
    expect(() => polynomialNoiseCovariance({ epoch: EPOCH, t: [0, 1] }, { degree: 2, referenceTime: 0, q })).toThrow(
      InvalidArgumentError,
    );
    expect(() => polynomialNoiseCovariance({ epoch: EPOCH, t: [0, 2, 1] }, { degree: 1, referenceTime: 0, q })).toThrow(
      /series\.t\[2\].*strictly increasing/s,
    );
    expect(() =>
      polynomialNoiseCovariance({ epoch: EPOCH, t: [0, 1, 2] }, { degree: 3 as never, referenceTime: 0, q }),
    ).toThrow(/degree/);
    expect(() =>
      polynomialNoiseCovariance({ epoch: EPOCH, t: [0, 1, 2] }, { degree: 1, referenceTime: 0, q: { q1: -1, q2: 0 } }),
    ).toThrow(/q1/);
    expect(() =>
      polynomialNoiseCovariance(
        { epoch: EPOCH, t: [0, 1, 2] },
        { degree: 1, referenceTime: 0, q, measurementVariance: -1 },
      ),
    ).toThrow(/measurementVariance/);
    expect(() =>
      polynomialNoiseCovariance({ epoch: EPOCH, t: [0, 1, 2] }, { degree: 1, referenceTime: 0, q, predict: [1] }),
    ).toThrow(/last sample epoch/);
    expect(() =>
      polynomialNoiseCovariance({ epoch: EPOCH, t: 7 as never }, { degree: 1, referenceTime: 0, q }),
    ).toThrow(/series\.t/);
    expect(() => polynomialNoiseCovariance({ t: [0, 1, 2] } as never, { degree: 1, referenceTime: 0, q })).toThrow(
      /series\.epoch.*parseIso/s,
    );
    expect(() => polynomialNoiseCovariance(7 as never, { degree: 1, referenceTime: 0, q })).toThrow(
      InvalidArgumentError,
    );
  });
});
