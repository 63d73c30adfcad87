import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  applyClockStep,
  ClockKalmanFilter,
  type ClockKalmanOptions,
  type ClockUpdate,
  clockProcessNoise,
  fitClockPolynomial,
  forecastClock,
  runClockFilter,
  simulateClock,
} from '../../src/clock-model/index.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales, type Instant } from '../../src/time/index.js';
import { EPOCH } from './test-epoch.js';

const Q3 = { q1: 1e-22, q2: 1e-28, q3: 1e-36 };
const zero3 = [
  [0, 0, 0],
  [0, 0, 0],
  [0, 0, 0],
];

describe('forecastClock and applyClockStep', () => {
  it('forecastClock(estimate, q, [τ]) from a zero-covariance state gives mean Φ(τ)s and covariance Q(τ) (Zucca & Tavella 2005 [M])', () => {
    const [f] = forecastClock({ t: 100, state: [1e-9, 1e-12, 1e-18], covariance: zero3 }, Q3, [3600]);
    expect(f!.t).toBe(3700);
    expect(f!.state[0]).toBeCloseTo(1e-9 + 1e-12 * 3600 + (1e-18 * 3600 ** 2) / 2, 22);
    expect(f!.state[1]).toBeCloseTo(1e-12 + 1e-18 * 3600, 26);
    const q = clockProcessNoise(3600, Q3, 3);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(f!.covariance[i]![j]).toBeCloseTo(q[i]![j]!, 40);
    expect(f!.phaseStd).toBeCloseTo(Math.sqrt(q[0]![0]!), 22);
  });
  it('forecastClock phase variance grows with the horizon (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e6, noNaN: true }), (h) => {
        const [a, b] = forecastClock(
          {
            t: 0,
            state: [0, 0],
            covariance: [
              [1e-20, 0],
              [0, 1e-26],
            ],
          },
          { q1: 1e-22, q2: 1e-30 },
          [h, 2 * h],
        );
        return a!.phaseStd < b!.phaseStd;
      }),
      { seed: 20261202, numRuns: 100 },
    );
  });
  it('applyClockStep(estimate, step) shifts the mean only', () => {
    const e = applyClockStep(
      { t: 5, state: [1e-9, 1e-12, 0], covariance: zero3 },
      { phase: -1e-9, frequency: -1e-12, drift: 1e-20 },
    );
    expect(e.state).toEqual([0, 0, 1e-20]);
    expect(e.covariance).toEqual(zero3);
    expect(
      applyClockStep(
        {
          t: 0,
          state: [0, 0],
          covariance: [
            [0, 0],
            [0, 0],
          ],
        },
        { frequency: 1e-13 },
      ).state,
    ).toEqual([0, 1e-13]);
  });
  it('forecastClock and applyClockStep reject malformed estimates, steps and horizons', () => {
    const good = { t: 0, state: [0, 0, 0], covariance: zero3 };
    expect(() => forecastClock(null as never, Q3, [1])).toThrow(InvalidArgumentError);
    expect(() => forecastClock({ ...good, t: Number.NaN }, Q3, [1])).toThrow(InvalidArgumentError);
    expect(() => forecastClock({ ...good, state: [0] }, Q3, [1])).toThrow(InvalidArgumentError);
    expect(() => forecastClock({ ...good, state: [0, Number.NaN, 0] }, Q3, [1])).toThrow(InvalidArgumentError);
    expect(() =>
      forecastClock(
        {
          ...good,
          covariance: [
            [0, 0],
            [0, 0],
          ],
        },
        Q3,
        [1],
      ),
    ).toThrow(InvalidArgumentError);
    expect(() =>
      forecastClock(
        {
          ...good,
          covariance: [
            [0, 0, 0],
            [0, 0],
            [0, 0, 0],
          ],
        },
        Q3,
        [1],
      ),
    ).toThrow(InvalidArgumentError);
    expect(() =>
      forecastClock(
        {
          ...good,
          covariance: [
            [1, 0.5, 0],
            [0, 1, 0],
            [0, 0, 1],
          ],
        },
        Q3,
        [1],
      ),
    ).toThrow(/differs/);
    expect(() =>
      forecastClock(
        {
          ...good,
          covariance: [
            [1, 2, 0],
            [2, 1, 0],
            [0, 0, 1],
          ],
        },
        Q3,
        [1],
      ),
    ).toThrow(/not positive semi-definite/);
    expect(() =>
      forecastClock(
        {
          ...good,
          covariance: [
            [1, 0, 0],
            [0, Number.NaN, 0],
            [0, 0, 1],
          ],
        },
        Q3,
        [1],
      ),
    ).toThrow(InvalidArgumentError);
    expect(() =>
      forecastClock(
        {
          t: 0,
          state: [0, 0],
          covariance: [
            [0, 0],
            [0, 0],
          ],
        },
        Q3,
        [1],
      ),
    ).toThrow(/3-element state/);
    expect(() => forecastClock(good, Q3, [-1])).toThrow(InvalidArgumentError);
    expect(() => forecastClock(good, Q3, 5 as never)).toThrow(InvalidArgumentError);
    expect(() => applyClockStep(good, null as never)).toThrow(InvalidArgumentError);
    expect(() => applyClockStep(good, { phase: Number.NaN })).toThrow(InvalidArgumentError);
    expect(() => applyClockStep(good, { frequency: Infinity })).toThrow(InvalidArgumentError);
    expect(() => applyClockStep(good, { drift: Number.NaN })).toThrow(InvalidArgumentError);
    expect(() =>
      applyClockStep(
        {
          t: 0,
          state: [0, 0],
          covariance: [
            [0, 0],
            [0, 0],
          ],
        },
        { drift: 1e-20 },
      ),
    ).toThrow(InvalidArgumentError);
  });
});

describe('ClockKalmanFilter', () => {
  it('ClockKalmanFilter with q = 0 and a wide prior reproduces the weighted straight-line fit (fitClockPolynomial, QR; independent method)', () => {
    const t = Array.from({ length: 30 }, (_, i) => i * 10);
    const x = t.map((ti, i) => 3e-9 + 2e-12 * ti + ((i % 3) - 1) * 1e-10);
    const f = new ClockKalmanFilter({
      epoch: EPOCH,
      q: { q1: 0, q2: 0 },
      initial: {
        t: 0,
        state: [0, 0],
        covariance: [
          [1e-8, 0],
          [0, 1e-12],
        ],
      },
    });
    t.forEach((ti, i) => f.step(ti, x[i]!, 1e-20));
    const fit = fitClockPolynomial(
      { epoch: EPOCH, t: t, phase: x },
      { degree: 1, variance: 1e-20, referenceTime: 290 },
    );
    const e = f.estimate;
    expect(Math.abs(e.state[0]! - fit.coefficients[0]) / Math.sqrt(fit.covariance[0]![0]!)).toBeLessThan(1e-4);
    expect(Math.abs(e.state[1]! - fit.coefficients[1]) / Math.sqrt(fit.covariance[1]![1]!)).toBeLessThan(1e-4);
    expect(e.covariance[0]![0]! / fit.covariance[0]![0]!).toBeCloseTo(1, 4);
  });
  it('ClockKalmanFilter.update reports innovation, its variance P⁻₁₁ + R and NIS = ν²/S (Kalman 1960)', () => {
    const f = new ClockKalmanFilter({
      epoch: EPOCH,
      q: Q3,
      initial: {
        t: 0,
        state: [0, 0, 0],
        covariance: [
          [4e-20, 0, 0],
          [0, 1e-24, 0],
          [0, 0, 1e-36],
        ],
      },
    });
    const u = f.update(3e-10, 5e-20);
    expect(u.innovation).toBe(3e-10);
    expect(u.innovationVariance).toBeCloseTo(9e-20, 34);
    expect(u.nis).toBeCloseTo(1, 12);
    expect(u.status).toBe('accepted');
    expect(u.estimate.state[0]).toBeCloseTo((4 / 9) * 3e-10, 24);
    expect(u.updateIndex).toBe(0);
    expect(f.states).toBe(3);
  });
  it('ClockKalmanFilter rejects a measurement above the χ²(1) gate, reports it and keeps the prediction', () => {
    const f = new ClockKalmanFilter({
      epoch: EPOCH,
      q: Q3,
      initial: { t: 0, state: [0, 0, 0], covariance: zero3 },
      outlierProbability: 1e-3,
    });
    expect(f.gate).toBeCloseTo(10.827566170662733, 9); // χ²(1) upper 0.001 (NIST/SEMATECH §1.3.6.7.4: 10.828 [M])
    const before = f.predict(1);
    const u = f.update(1e-8, 1e-20);
    expect(u.status).toBe('rejected');
    expect(u.estimate.state).toEqual(before.state);
    const off = new ClockKalmanFilter({
      epoch: EPOCH,
      q: Q3,
      initial: { t: 0, state: [0, 0, 0], covariance: zero3 },
      outlierProbability: false,
      jumpDetection: false,
    });
    expect(off.gate).toBe(Infinity);
    expect(off.step(1, 1e-8, 1e-20).status).toBe('accepted');
  });
  it('ClockKalmanFilter.applyStep and forecast serve a planner: a known frequency step moves the forecast phase by step × horizon', () => {
    const f = new ClockKalmanFilter({
      epoch: EPOCH,
      q: Q3,
      initial: { t: 0, state: [1e-9, 1e-13, 0], covariance: zero3 },
    });
    const a = f.forecast([86400])[0]!;
    f.applyStep({ frequency: -1e-13, phase: -1e-9 });
    const b = f.forecast([86400])[0]!;
    expect(a.state[0]! - b.state[0]!).toBeCloseTo(1e-9 + 1e-13 * 86400, 20);
    expect(b.phaseStd).toBe(a.phaseStd);
    expect(() => f.applyStep({ drift: Number.NaN })).toThrow(InvalidArgumentError);
  });
  it('ClockKalmanFilter rejects bad options and calls', () => {
    const initial = { t: 0, state: [0, 0, 0], covariance: zero3 };
    expect(() => new ClockKalmanFilter(null as never)).toThrow(InvalidArgumentError);
    expect(() => new ClockKalmanFilter({ epoch: EPOCH, q: { q1: -1, q2: 0 }, initial })).toThrow(InvalidArgumentError);
    expect(
      () =>
        new ClockKalmanFilter({
          epoch: EPOCH,
          q: Q3,
          initial: {
            t: 0,
            state: [0, 0],
            covariance: [
              [0, 0],
              [0, 0],
            ],
          },
        }),
    ).toThrow(InvalidArgumentError);
    expect(() => new ClockKalmanFilter({ epoch: EPOCH, q: Q3, initial, outlierProbability: 0.9 })).toThrow(
      InvalidArgumentError,
    );
    expect(() => new ClockKalmanFilter({ epoch: EPOCH, q: Q3, initial, jumpDetection: { window: 1 } })).toThrow(
      InvalidArgumentError,
    );
    expect(
      () => new ClockKalmanFilter({ epoch: EPOCH, q: Q3, initial, jumpDetection: { window: 5, minEpochs: 6 } }),
    ).toThrow(InvalidArgumentError);
    expect(
      () => new ClockKalmanFilter({ epoch: EPOCH, q: Q3, initial, jumpDetection: { falseAlarmProbability: 0 } }),
    ).toThrow(InvalidArgumentError);
    expect(() => new ClockKalmanFilter({ epoch: EPOCH, q: Q3, initial, jumpDetection: 3 as never })).toThrow(
      InvalidArgumentError,
    );
    const f = new ClockKalmanFilter({ epoch: EPOCH, q: Q3, initial: { ...initial, t: 10 } });
    expect(() => f.predict(5)).toThrow(/does not run backwards/);
    expect(() => f.predict(Number.NaN)).toThrow(InvalidArgumentError);
    expect(() => f.update(Number.NaN, 1e-20)).toThrow(InvalidArgumentError);
    expect(() => f.update(0, 0)).toThrow(InvalidArgumentError);
    expect(() => f.forecast([-1])).toThrow(InvalidArgumentError);
  });
});

describe('ClockKalmanFilter on its epoch', () => {
  const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
  const initial = {
    t: 0,
    state: [1e-9, 1e-12, 0],
    covariance: [
      [1e-18, 0, 0],
      [0, 1e-24, 0],
      [0, 0, 1e-36],
    ],
  };
  const run = (epoch: Instant): { filter: ClockKalmanFilter; updates: ClockUpdate[] } => {
    const filter = new ClockKalmanFilter({ epoch, q: Q3, initial });
    const updates = [300, 600, 900, 1200].map((t, k) => filter.step(t, 1e-9 + 3e-10 * k, 1e-20));
    return { filter, updates };
  };

  it('new ClockKalmanFilter({ epoch }) exposes the Instant itself as filter.epoch', () => {
    const { filter } = run(EPOCH);
    expect(filter.epoch).toBe(EPOCH);
  });

  it('ClockKalmanFilter gives the same numbers for any epoch: it runs on the seconds since it (Object.is on every field)', () => {
    const a = run(EPOCH);
    const b = run(ts.parseIso('2031-07-01T00:00:00', 'GPS'));
    expect(b.updates).toEqual(a.updates);
    expect(b.filter.estimate).toEqual(a.filter.estimate);
    expect(b.filter.forecast([3600, 86_400])).toEqual(a.filter.forecast([3600, 86_400]));
  });

  it('filter.epoch.plus(update.t) reads 2027-02-08T06:00:00 GPS + 1200 s = 06:20:00 GPS (hand computation [C])', () => {
    const { filter, updates } = run(EPOCH);
    const last = updates.at(-1);
    expect(last?.t).toBe(1200);
    expect(ts.formatIso(filter.epoch.plus(last?.t ?? Number.NaN), { scale: 'GPS', fractionDigits: 0 })).toBe(
      '2027-02-08T06:20:00',
    );
    const [forecast] = filter.forecast([3600]);
    expect(ts.formatIso(filter.epoch.plus(forecast?.t ?? Number.NaN), { scale: 'GPS', fractionDigits: 0 })).toBe(
      '2027-02-08T07:20:00',
    );
  });

  it('new ClockKalmanFilter without an epoch throws InvalidArgumentError naming epoch, with the parseIso hint of the batch functions', () => {
    const bare = { q: Q3, initial } as unknown as ClockKalmanOptions;
    expect(() => new ClockKalmanFilter(bare)).toThrow(InvalidArgumentError);
    try {
      new ClockKalmanFilter(bare);
    } catch (error) {
      expect((error as InvalidArgumentError).argument).toBe('epoch');
      expect((error as InvalidArgumentError).message).toMatch(/required.*parseIso\('2027-02-08T06:00:00', 'GPS'\)/);
    }
  });

  it('new ClockKalmanFilter({ epoch: 0 }) and ({ epoch: ISO text }) throw InvalidArgumentError naming epoch', () => {
    for (const bad of [0, '2027-02-08T06:00:00Z', null, {}]) {
      const options = { epoch: bad, q: Q3, initial } as unknown as ClockKalmanOptions;
      expect(() => new ClockKalmanFilter(options)).toThrow(InvalidArgumentError);
      expect(() => new ClockKalmanFilter(options)).toThrow(/epoch/);
    }
  });
});

describe('runClockFilter', () => {
  it('runClockFilter(series) reports NaN samples as missing and predicts across them', () => {
    const sim = simulateClock({ samples: 200, tau0: 1, q: Q3, seed: 4, measurementNoise: 1e-10 });
    const phase = Array.from(sim.phase);
    phase[50] = Number.NaN;
    const run = runClockFilter(
      { epoch: EPOCH, phase, variance: 1e-20, tau0: 1 },
      { q: Q3, states: 3, initialFrequencyStd: 1e-11, initialDriftStd: 1e-17 },
    );
    expect(run.status[50]).toBe('missing');
    expect(Number.isNaN(run.nis[50]!)).toBe(true);
    expect(run.nisSummary.count).toBe(198); // first sample initialises the state, sample 50 missing
    expect(run.states).toBe(3);
    expect(run.final.t).toBe(199);
  });
  it('runClockFilter accepts explicit epochs and per-sample variances; 2-state by default when q3 = 0', () => {
    const run = runClockFilter(
      { epoch: EPOCH, phase: [0, 1e-9, 2e-9, 3.1e-9], variance: [1e-20, 1e-20, 4e-20, 1e-20], t: [0, 1, 2, 3] },
      { q: { q1: 1e-22, q2: 1e-28 } },
    );
    expect(run.states).toBe(2);
    expect(run.drift[3]).toBe(0);
    expect(run.t[3]).toBe(3);
  });
  it('runClockFilter(series, options) rejects bad series', () => {
    const q = { q1: 1e-22, q2: 1e-28 };
    expect(() => runClockFilter(null as never, { q })).toThrow(InvalidArgumentError);
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0], variance: 1, tau0: 1 }, null as never)).toThrow(
      InvalidArgumentError,
    );
    expect(() => runClockFilter({ epoch: EPOCH, phase: [], variance: 1, tau0: 1 }, { q })).toThrow(
      InvalidArgumentError,
    );
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: 1, t: [0] }, { q })).toThrow(
      InvalidArgumentError,
    );
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: 1, t: [0, 0] }, { q })).toThrow(
      /strictly increasing/,
    );
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: 1, t: [0, Number.NaN] }, { q })).toThrow(
      InvalidArgumentError,
    );
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: 1 }, { q })).toThrow(InvalidArgumentError);
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: [1], tau0: 1 }, { q })).toThrow(
      InvalidArgumentError,
    );
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: [1, 0], tau0: 1 }, { q })).toThrow(
      InvalidArgumentError,
    );
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: -1, tau0: 1 }, { q })).toThrow(
      InvalidArgumentError,
    );
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, Infinity], variance: 1, tau0: 1 }, { q })).toThrow(
      InvalidArgumentError,
    );
    expect(() =>
      runClockFilter({ epoch: EPOCH, phase: [Number.NaN, Number.NaN], variance: 1, tau0: 1 }, { q }),
    ).toThrow(/at least one valid/);
    expect(() => runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: 1, tau0: 1 }, { q, states: 4 as 2 })).toThrow(
      InvalidArgumentError,
    );
    expect(() =>
      runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: 1, tau0: 1 }, { q, initialFrequencyStd: 0 }),
    ).toThrow(InvalidArgumentError);
    expect(() =>
      runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: 1, tau0: 1 }, { q, states: 3, initialDriftStd: -1 }),
    ).toThrow(InvalidArgumentError);
    expect(() =>
      runClockFilter({ epoch: EPOCH, phase: [0, 1], variance: 1, tau0: 1 }, { q, nisConfidence: 1 }),
    ).toThrow(InvalidArgumentError);
    expect(() =>
      runClockFilter(
        { epoch: EPOCH, phase: [0, 1], variance: 1, tau0: 1 },
        {
          q,
          initial: {
            t: 5,
            state: [0, 0],
            covariance: [
              [0, 0],
              [0, 0],
            ],
          },
        },
      ),
    ).toThrow(/initial estimate epoch/);
  });
});
