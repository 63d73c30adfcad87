/**
 * diffusionFromStabilityRows and measurementNoiseFromPhase against simulated clocks with known
 * q1, q2, q3 (simulateClock, exact discretisation of the Zucca & Tavella model, physics-refs §11
 * [M citation; relations verified by simulation, C]). Coverage is counted over fixed seeds and
 * compared with the nominal probability within three binomial standard deviations
 * (common practice, no source). Measured when written (seeds below): 2-state N = 4096, 300 runs:
 * q1 68 %/95 % intervals 0.69/0.97, q2 0.71/0.95; the edf-weighted covariance of fitDiffusion alone
 * (rows treated as independent) covered q1 only ≈ 0.52 at ±1σ at N = 16384 — the reason for the
 * correlation-aware covariance.
 */
import { describe, expect, it } from 'vitest';
import {
  type ClockDiffusion,
  diffusionFromStabilityRows,
  measurementNoiseFromPhase,
  simulateClock,
} from '../../src/clock-model/index.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { analyzeStability } from '../../src/stability/index.js';

const ONE_SIGMA = 0.6826894921370859;
const TWO_SIGMA = 0.9544997361036416;

/** |observed − nominal| ≤ 3 binomial standard deviations of a coverage over `runs` trials. */
function expectCoverage(hits: number, runs: number, nominal: number): void {
  const sd = Math.sqrt((nominal * (1 - nominal)) / runs);
  expect(Math.abs(hits / runs - nominal)).toBeLessThanOrEqual(3 * sd);
}

function coverage(
  states: 2 | 3,
  q: Required<ClockDiffusion>,
  samples: number,
  runs: number,
  seed0: number,
  measurementNoise = 0,
) {
  const names = (['q1', 'q2', 'q3'] as const).slice(0, states);
  const hits = {
    one: { q1: 0, q2: 0, q3: 0 },
    two: { q1: 0, q2: 0, q3: 0 },
    sigma: { q1: 0, q2: 0, q3: 0 },
    naive: { q1: 0, q2: 0, q3: 0 },
  };
  for (let r = 0; r < runs; r++) {
    const sim = simulateClock({ samples, tau0: 1, q, seed: seed0 + r, measurementNoise });
    const rows = analyzeStability(
      { phase: sim.phase, tau0: 1 },
      { statistics: [states === 2 ? 'oadev' : 'ohdev'] },
    ).rows;
    const opts = { states, measurementVariance: measurementNoise ** 2 };
    const one = diffusionFromStabilityRows(rows, opts);
    const two = diffusionFromStabilityRows(rows, { ...opts, confidence: TWO_SIGMA });
    names.forEach((n, c) => {
      const i1 = one.intervals[n]!;
      const i2 = two.intervals[n]!;
      if (i1.low <= q[n] && q[n] <= i1.high) hits.one[n]++;
      if (i2.low <= q[n] && q[n] <= i2.high) hits.two[n]++;
      if (Math.abs(one.q[n] - q[n]) <= one.qStd[n]) hits.sigma[n]++;
      const naiveStd = Math.sqrt(Math.max((one.weightedFit.covariance[c] as number[])[c] as number, 0));
      if (Math.abs(one.q[n] - q[n]) <= naiveStd) hits.naive[n]++;
    });
  }
  return hits;
}

describe('diffusionFromStabilityRows: coverage on simulated clocks (fixed seeds)', () => {
  it('diffusionFromStabilityRows(oadev rows, { states: 2 }) brackets the true q1 = 1e-22 s, q2 = 1e-26 1/s with nominal 68.27 % and 95.45 % coverage over 300 seeded clocks (Zucca & Tavella 2005 [M]; χ² intervals NIST SP 1065 §5.3 [M])', () => {
    const q = { q1: 1e-22, q2: 1e-26, q3: 0 };
    const runs = 300;
    const hits = coverage(2, q, 4096, runs, 7000);
    for (const n of ['q1', 'q2'] as const) {
      expectCoverage(hits.one[n], runs, ONE_SIGMA);
      expectCoverage(hits.two[n], runs, TWO_SIGMA);
    }
    // q1 is fixed by many well-resolved rows: the symmetric ±1σ from the covariance is honest too.
    expectCoverage(hits.sigma.q1, runs, ONE_SIGMA);
  });

  it('diffusionFromStabilityRows(ohdev rows, { states: 3 }) brackets q1, q2, q3 with nominal coverage over 100 seeded 3-state clocks', () => {
    const q = { q1: 1e-22, q2: 1e-26, q3: 2e-32 };
    const runs = 100;
    const hits = coverage(3, q, 16384, runs, 7000);
    for (const n of ['q1', 'q2', 'q3'] as const) {
      expectCoverage(hits.one[n], runs, ONE_SIGMA);
      expectCoverage(hits.two[n], runs, TWO_SIGMA);
    }
  });

  it('diffusionFromStabilityRows with measurementVariance removes white phase noise (σ_v = 3 ps) and keeps nominal coverage of q1, q2', () => {
    const q = { q1: 1e-22, q2: 1e-26, q3: 0 };
    const runs = 150;
    const hits = coverage(2, q, 4096, runs, 9100, 3e-12);
    for (const n of ['q1', 'q2'] as const) {
      expectCoverage(hits.one[n], runs, ONE_SIGMA);
      expectCoverage(hits.two[n], runs, TWO_SIGMA);
    }
  });
});

describe('diffusionFromStabilityRows: result', () => {
  const q = { q1: 1e-22, q2: 1e-26, q3: 0 };
  const sim = simulateClock({ samples: 4096, tau0: 1, q, seed: 20261202 });
  const analysis = analyzeStability({ phase: sim.phase, tau0: 1 }, { statistics: ['oadev', 'ohdev'] });

  it('diffusionFromStabilityRows(rows) reports h = (2q1, q2/(2π²), 0), per-row residuals, a χ² probability in (0, 1) and the rows it left out', () => {
    const fit = diffusionFromStabilityRows(analysis.rows, { minTau: 2 });
    expect(fit.statistic).toBe('oadev');
    expect(fit.h.h0).toBeCloseTo(2 * fit.q.q1, 30);
    expect(fit.h.hMinus2 / (fit.q.q2 / (2 * Math.PI ** 2))).toBeCloseTo(1, 12);
    expect(fit.hStd.h0).toBe(2 * fit.qStd.q1);
    expect(fit.points.map((p) => p.tau)).toEqual(analysis.rows.filter((r) => r.tau >= 2).map((r) => r.tau));
    expect(fit.excluded).toEqual([{ tau: 1, reason: 'outside-tau-range' }]);
    expect(fit.dof).toBe(fit.points.length - 2);
    expect(fit.chiSquareProbability).toBeGreaterThan(0);
    expect(fit.chiSquareProbability).toBeLessThan(1);
    for (const p of fit.points) {
      expect(p.normalizedResidual).toBeCloseTo((p.deviation ** 2 - p.modelDeviation ** 2) / p.varianceStd, 6);
    }
    expect(fit.intervals.q3).toBeUndefined();
  });

  it('diffusionFromStabilityRows(rows, { states: 3 }) defaults to ohdev; a row without the statistic is listed as no-estimate', () => {
    const taus = [1, 2, 4, 8, 16, 32, 64, 128, 256, 512, 1024, 1800];
    const rows = analyzeStability({ phase: sim.phase, tau0: 1 }, { statistics: ['oadev', 'ohdev'], taus }).rows;
    const fit = diffusionFromStabilityRows(rows, { states: 3 });
    expect(fit.statistic).toBe('ohdev');
    const last = rows[rows.length - 1]!;
    expect(last.tau).toBe(1800);
    // OADEV reaches (N−1)/2, OHDEV only (N−1)/3: the longest OADEV τ has no OHDEV estimate.
    expect(last.statistics.ohdev).toBeUndefined();
    expect(fit.excluded).toContainEqual({ tau: last.tau, reason: 'no-estimate' });
  });

  it('diffusionFromStabilityRows excludes rows dominated by the stated measurement noise', () => {
    const fit = diffusionFromStabilityRows(analysis.rows, { measurementVariance: 1e-20 });
    expect(fit.excluded.some((e) => e.reason === 'measurement-noise-dominates')).toBe(true);
    expect(fit.measurementVariance).toBe(1e-20);
  });

  it('diffusionFromStabilityRows rejects non-arrays, bad states/statistic/variance/τ range/confidence, oadev with 3 states and too few rows', () => {
    const bad: [unknown, unknown][] = [
      ['rows', {}],
      [analysis.rows, { states: 4 }],
      [analysis.rows, { statistic: 'mdev' }],
      [analysis.rows, { states: 3, statistic: 'oadev' }],
      [analysis.rows, { measurementVariance: -1 }],
      [analysis.rows, { minTau: 100, maxTau: 10 }],
      [analysis.rows, { confidence: 1 }],
      [analysis.rows.slice(0, 1), {}],
      [[null], {}],
      [analysis.rows, null],
    ];
    for (const [rows, options] of bad) {
      expect(() => diffusionFromStabilityRows(rows as never, options as never)).toThrow(InvalidArgumentError);
    }
    expect(() => diffusionFromStabilityRows(analysis.rows, { states: 3, statistic: 'oadev' })).toThrow(
      /not stationary/,
    );
    expect(() => diffusionFromStabilityRows(analysis.rows.slice(0, 1), {})).toThrow(/at least 2/);
  });
});

describe('measurementNoiseFromPhase', () => {
  it("measurementNoiseFromPhase(phase) recovers σ_v² within ±2 standard errors in about 95 % of 200 seeded clocks (Bartlett's formula, Brockwell & Davis §7.2 [M]; Cov(s_k, s_{k+2}) = σ_v² derived [C])", () => {
    const runs = 200;
    const sv = 20e-12;
    let hits = 0;
    for (let r = 0; r < runs; r++) {
      const sim = simulateClock({
        samples: 2048,
        tau0: 30,
        q: { q1: 1e-23, q2: 1e-32 },
        seed: 3000 + r,
        measurementNoise: sv,
      });
      const e = measurementNoiseFromPhase(sim.phase);
      if (Math.abs(e.variance - sv * sv) <= 2 * e.standardError) hits++;
    }
    expectCoverage(hits, runs, TWO_SIGMA);
  });

  it('measurementNoiseFromPhase(phase) is unresolved for a clock without measurement noise and skips NaN samples', () => {
    const sim = simulateClock({ samples: 2048, tau0: 30, q: { q1: 1e-23, q2: 1e-32 }, seed: 11 });
    const phase = Float64Array.from(sim.phase);
    phase[100] = Number.NaN;
    const e = measurementNoiseFromPhase(phase);
    expect(e.resolved).toBe(false);
    expect(Math.abs(e.variance)).toBeLessThan(3 * e.standardError);
    expect(e.terms).toBe(2048 - 4 - 5);
  });

  it('measurementNoiseFromPhase rejects non-arrays, ±Infinity and records too short for 8 lag-2 pairs', () => {
    expect(() => measurementNoiseFromPhase(5 as never)).toThrow(InvalidArgumentError);
    expect(() => measurementNoiseFromPhase([0, 1, Infinity, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11])).toThrow(/phase\[2\]/);
    expect(() => measurementNoiseFromPhase([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10])).toThrow(/at least 8/);
  });
});
