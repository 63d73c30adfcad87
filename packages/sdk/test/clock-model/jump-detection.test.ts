/**
 * False-alarm rate, outlier rate and detection probability of the clock filter's GLR detector, by seeded
 * simulation of the clock model (Zucca & Tavella 2005 [M citation]; simulateClock). Counts are compared
 * with binomial bounds of the declared per-sample probabilities (binomial distribution: common practice,
 * no source; bounds computed exactly below [C]). The innovations of a Kalman filter with the true model
 * are white (Kalman 1960 [M]), so the GLR statistic of each hypothesis is χ²(1) (Willsky & Jones, IEEE
 * TAC 21(1), 1976 [M]); these tests check that the filter keeps that property.
 */
import { describe, expect, it } from 'vitest';
import {
  type ClockDiffusion,
  clockProcessNoise,
  clockTransitionMatrix,
  runClockFilter,
  simulateClock,
} from '../../src/clock-model/index.js';
import { EPOCH } from './test-epoch.js';

/** Smallest k with P(X > k) ≤ tail and largest k with P(X < k) ≤ tail, X ~ Binomial(n, p) [C]. */
function binomialBounds(n: number, p: number, tail: number): { low: number; high: number } {
  let pmf = Math.exp(n * Math.log1p(-p));
  let cdf = 0;
  let low = 0;
  for (let k = 0; k <= n; k++) {
    if (cdf <= tail) low = k; // P(X < k) = cdf before adding pmf(k)
    cdf += pmf;
    if (1 - cdf <= tail) return { low, high: k };
    pmf *= ((n - k) / (k + 1)) * (p / (1 - p));
  }
  return { low, high: n };
}

interface Case {
  name: string;
  q: ClockDiffusion;
  sigma: number;
  tau0: number;
}
const CASES: Case[] = [
  { name: '2-state, τ0 = 1 s', q: { q1: 1e-22, q2: 1e-28 }, sigma: 1e-10, tau0: 1 },
  // τ0 = 30 s, σ_v = 20 ps: the old gate-then-GLR filter declared ~0.3 false jumps of ~0.16 ns per 10 080 samples here [C].
  { name: '2-state, τ0 = 30 s', q: { q1: 3e-23, q2: 1e-29 }, sigma: 2e-11, tau0: 30 },
  { name: '3-state, τ0 = 1 s', q: { q1: 1e-22, q2: 1e-28, q3: 1e-36 }, sigma: 1e-10, tau0: 1 },
];

function countFalse(
  c: Case,
  records: number,
  samples: number,
  falseAlarmProbability?: number,
): { jumps: number; outliers: number } {
  let jumps = 0;
  let outliers = 0;
  for (let r = 0; r < records; r++) {
    const sim = simulateClock({ samples, tau0: c.tau0, q: c.q, seed: 31000 + r, measurementNoise: c.sigma });
    const run = runClockFilter(
      { epoch: EPOCH, phase: sim.phase, variance: c.sigma ** 2, tau0: c.tau0 },
      { q: c.q, ...(falseAlarmProbability ? { jumpDetection: { falseAlarmProbability } } : {}) },
    );
    jumps += run.jumps.length;
    outliers += run.rejected.length;
    expect(run.outliers!.length).toBe(run.rejected.length);
  }
  return { jumps, outliers };
}

describe('runClockFilter GLR detector on jump-free simulated clocks', () => {
  for (const c of CASES) {
    it(`runClockFilter (${c.name}, 24 × 10 080 samples, defaults) declares jumps no more often than falseAlarmProbability = 1e-6 per sample and outliers at outlierProbability = 1e-4 per sample (99.9 % binomial bounds)`, () => {
      const records = 24;
      const n = records * 10080;
      const { jumps, outliers } = countFalse(c, records, 10080);
      expect(jumps).toBeLessThanOrEqual(binomialBounds(n, 1e-6, 1e-3).high);
      const ob = binomialBounds(n, 1e-4, 5e-4);
      expect(outliers).toBeGreaterThanOrEqual(ob.low);
      expect(outliers).toBeLessThanOrEqual(ob.high);
    });
  }
  it('runClockFilter with falseAlarmProbability = 1e-3 declares fewer jumps than the 99.9 % binomial bound of 1e-3 per sample (the threshold is a union bound over the 36 tests per update; realised rate ~4e-5) and reports the threshold', () => {
    const c = CASES[0]!;
    const records = 20;
    const { jumps } = countFalse(c, records, 5000, 1e-3);
    expect(jumps).toBeLessThanOrEqual(binomialBounds(records * 5000, 1e-3, 1e-3).high);
    const run = runClockFilter(
      { epoch: EPOCH, phase: [0, 1e-10, 2e-10], variance: 1e-20, tau0: 1 },
      { q: c.q, jumpDetection: { falseAlarmProbability: 1e-3 } },
    );
    expect(run.detection!.testsPerUpdate).toBe(36);
    // χ²(1) upper quantile at 1e-3/36: scipy.stats.chi2.isf(1e-3/36, 1) = 17.564137886838576 [C].
    expect(run.detection!.jumpThreshold).toBeCloseTo(17.564137886838576, 6);
    // Defaults: isf(1e-6/36, 1) = 30.856864804329376, isf(1e-4, 1) = 15.136705226623397, isf(1e-9, 1) = 37.324893051362324 [C, scipy].
    const d = runClockFilter({ epoch: EPOCH, phase: [0, 1e-10, 2e-10], variance: 1e-20, tau0: 1 }, { q: c.q })
      .detection!;
    expect(d.jumpThreshold).toBeCloseTo(30.856864804329376, 6);
    expect(d.outlierThreshold).toBeCloseTo(15.136705226623397, 6);
    expect(d.holdGate).toBeCloseTo(37.324893051362324, 6);
  });
});

describe('runClockFilter GLR detector: detection probability of injected jumps', () => {
  const q = { q1: 1e-22, q2: 1e-28 };
  const sigma = 1e-10;
  function detected(kind: 'phase' | 'frequency', size: number, records: number): number {
    let found = 0;
    for (let r = 0; r < records; r++) {
      const sim = simulateClock({
        samples: 1100,
        tau0: 1,
        q,
        seed: 9000 + r,
        measurementNoise: sigma,
        jumps: [{ index: 1000, kind, size }],
      });
      const run = runClockFilter({ epoch: EPOCH, phase: sim.phase, variance: sigma ** 2, tau0: 1 }, { q });
      if (run.jumps.some((j) => j.kind === kind && Math.abs(j.updateIndex - 1000) <= 3)) found += 1;
    }
    return found;
  }
  it('runClockFilter finds a phase jump of 4 σ_v at its epoch (±3 samples, right kind) in ≥ 90 % of 50 records (measured 98 % over 100)', () => {
    expect(detected('phase', 4 * sigma, 50)).toBeGreaterThanOrEqual(45);
  });
  it('runClockFilter finds a frequency jump of 0.5 σ_v/τ0 at its epoch (±3 samples, right kind) in ≥ 85 % of 50 records (measured 93 % over 100)', () => {
    expect(detected('frequency', 0.5 * sigma, 50)).toBeGreaterThanOrEqual(43);
  });
  it('runClockFilter rejects and reports injected 20 σ_v outliers, declares no jump for them, and keeps the estimate on the true phase', () => {
    const sim = simulateClock({ samples: 3000, tau0: 1, q, seed: 77, measurementNoise: sigma });
    const phase = Float64Array.from(sim.phase);
    const bad = [500, 1200, 1201, 2999];
    for (const k of bad) phase[k] = (phase[k] as number) + 20 * sigma * (k % 2 ? -1 : 1);
    const run = runClockFilter({ epoch: EPOCH, phase, variance: sigma ** 2, tau0: 1 }, { q });
    for (const k of bad) expect(run.rejected).toContain(k);
    expect(run.outliers!.map((o) => o.updateIndex)).toEqual(expect.arrayContaining(bad));
    expect(run.jumps).toEqual([]);
    for (const k of bad) expect(Math.abs(run.phase[k]! - sim.truePhase[k]!)).toBeLessThan(4 * run.phaseStd[k]!);
  });
});

describe('runClockFilter against a plain Kalman recursion', () => {
  it('runClockFilter without detection equals the textbook recursion (Φ, Q from clockTransitionMatrix/clockProcessNoise; Kalman 1960 [M]) to 1e-9 relative, steady-state shortcut included', () => {
    for (const q of [
      { q1: 1e-22, q2: 1e-28 },
      { q1: 1e-22, q2: 1e-28, q3: 1e-36 },
    ] as ClockDiffusion[]) {
      const states = q.q3 ? 3 : 2;
      const sim = simulateClock({ samples: 4000, tau0: 1, q, seed: 5, measurementNoise: 1e-10 });
      const run = runClockFilter(
        { epoch: EPOCH, phase: sim.phase, variance: 1e-20, tau0: 1 },
        { q, jumpDetection: false, outlierProbability: false },
      );
      const phi = clockTransitionMatrix(1, states);
      const qm = clockProcessNoise(1, q, states);
      let x = states === 3 ? [sim.phase[0]!, 0, 0] : [sim.phase[0]!, 0];
      let p =
        states === 3
          ? [
              [1e-20, 0, 0],
              [0, 1e-18, 0],
              [0, 0, 1e-30],
            ]
          : [
              [1e-20, 0],
              [0, 1e-18],
            ];
      for (let k = 1; k < 4000; k++) {
        x = phi.map((row) => row.reduce((a, v, j) => a + v * x[j]!, 0));
        const fp = phi.map((row) => p[0]!.map((_, j) => row.reduce((a, v, m) => a + v * p[m]![j]!, 0)));
        p = fp.map((row, i) => phi.map((prow, j) => row.reduce((a, v, m) => a + v * prow[m]!, 0) + qm[i]![j]!));
        const s = p[0]![0]! + 1e-20;
        const gain = p.map((row) => row[0]! / s);
        const nu = sim.phase[k]! - x[0]!;
        x = x.map((v, i) => v + gain[i]! * nu);
        p = p.map((row, i) => row.map((v, j) => v - gain[i]! * p[0]![j]!));
        expect(Math.abs(run.phase[k]! - x[0]!)).toBeLessThanOrEqual(
          1e-9 * Math.sqrt(p[0]![0]!) + 1e-9 * Math.abs(x[0]!),
        );
        expect(run.phaseStd[k]! / Math.sqrt(p[0]![0]!)).toBeCloseTo(1, 9);
        expect(run.frequencyStd[k]! / Math.sqrt(p[1]![1]!)).toBeCloseTo(1, 9);
      }
    }
  });
});
