/**
 * Validation of the clock model against its published variance relations (Zucca & Tavella 2005,
 * physics-refs §11 [M citation; relations verified by simulation, C]) and of the filter's
 * consistency (NIS, Bar-Shalom, Li & Kirubarajan 2001 §5.4.2 [M]). Seeds are fixed, so every run is
 * the same; N is modest so the file runs in a few seconds.
 */
import { describe, expect, it } from 'vitest';
import {
  allanVarianceFromQ,
  hadamardVarianceFromQ,
  runClockFilter,
  simulateClock,
} from '../../src/clock-model/index.js';
import { chiSquareInterval, deviations, equivalentDegreesOfFreedom } from '../../src/stability/index.js';
import { EPOCH } from './test-epoch.js';

const Q3 = { q1: 1e-22, q2: 1e-28, q3: 1e-36 }; // physics-refs §11 check set, τ0 = 1 s
const Q2 = { q1: 1e-22, q2: 1e-28 };

describe('simulated clocks match the Zucca & Tavella variance forms (physics-refs §11)', () => {
  it('simulateClock 2-state (q3 = 0): overlapping AVAR lies inside its 99 % χ² interval (edf: Howe-Allan-Barnes, NIST SP 1065 §5.2.10 [M]) at τ = 1 … 1000 s', () => {
    const n = 65536;
    const sim = simulateClock({ samples: n, tau0: 1, q: Q2, seed: 20261202 });
    const taus = [1, 10, 100, 1000];
    const points = deviations('oadev', { phase: sim.phase, tau0: 1 }, { taus });
    expect(points.map((p) => p.tau)).toEqual(taus);
    for (const p of points) {
      // Mixed WFM + RWFM: take the smaller (more conservative) of the two edf values.
      const edf = Math.min(
        equivalentDegreesOfFreedom('oadev', 'WFM', n, p.m, p.n).edf,
        equivalentDegreesOfFreedom('oadev', 'RWFM', n, p.m, p.n).edf,
      );
      const { low, high } = chiSquareInterval(p.deviation, edf, 0.99);
      const theory = Math.sqrt(allanVarianceFromQ(p.tau, Q2));
      expect(theory).toBeGreaterThanOrEqual(low);
      expect(theory).toBeLessThanOrEqual(high);
    }
  });

  it('simulateClock 3-state: pooled overlapping HVAR of 12 runs lies inside its 99 % χ² interval (edf from the run-to-run spread, 2·mean²/var) at τ = 1 … 20 000 s', () => {
    const runs = 12;
    const n = 65536;
    const taus = [1, 10, 100, 1000, 5000, 20000];
    const withoutQ3: boolean[] = [];
    const est: number[][] = taus.map(() => []);
    for (let r = 0; r < runs; r++) {
      const sim = simulateClock({ samples: n, tau0: 1, q: Q3, seed: 1000 + r });
      const pts = deviations('ohdev', { phase: sim.phase, tau0: 1 }, { taus });
      pts.forEach((p, i) => est[i]!.push(p.deviation ** 2));
    }
    taus.forEach((tau, i) => {
      const v = est[i]!;
      const mean = v.reduce((a, b) => a + b, 0) / runs;
      const variance = v.reduce((a, b) => a + (b - mean) ** 2, 0) / (runs - 1);
      const edf = (runs * 2 * mean * mean) / variance;
      const { low, high } = chiSquareInterval(Math.sqrt(mean), edf, 0.99);
      const theory = Math.sqrt(hadamardVarianceFromQ(tau, Q3));
      expect(theory).toBeGreaterThanOrEqual(low);
      expect(theory).toBeLessThanOrEqual(high);
      const noQ3 = Math.sqrt(hadamardVarianceFromQ(tau, { ...Q3, q3: 0 }));
      withoutQ3.push(noQ3 >= low && noQ3 <= high);
    });
    // The check discriminates: without the q3 term the theory falls outside the interval at 20 000 s.
    expect(withoutQ3[withoutQ3.length - 1]).toBe(false);
  });

  it('simulateClock 3-state: the q3 term dominates HVAR at 20 000 s (so the previous check exercises q3, not only q1, q2) [C]', () => {
    const tau = 20000;
    expect((11 * Q3.q3 * tau ** 3) / 120).toBeGreaterThan(Q3.q1 / tau + (Q3.q2 * tau) / 6);
  });
});

describe('clock Kalman filter consistency', () => {
  const zero3 = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  it('runClockFilter 3-state on a simulated 3-state clock: mean NIS over 20 000 epochs lies within its 99 % χ²(N)/N bounds', () => {
    const sim = simulateClock({ samples: 20000, tau0: 1, q: Q3, seed: 8, measurementNoise: 1e-10 });
    const run = runClockFilter(
      { epoch: EPOCH, phase: sim.phase, variance: 1e-20, tau0: 1 },
      { q: Q3, initial: { t: 0, state: [0, 0, 0], covariance: zero3 }, nisConfidence: 0.99 },
    );
    const s = run.nisSummary;
    expect(s.count).toBe(20000);
    expect(s.mean).toBeGreaterThanOrEqual(s.low);
    expect(s.mean).toBeLessThanOrEqual(s.high);
    expect(run.jumps).toEqual([]);
  });
  it('runClockFilter 2-state on a simulated 2-state clock with τ0 = 60 s: mean NIS within its 99 % bounds, true phase inside ±4σ everywhere', () => {
    const sim = simulateClock({
      samples: 5000,
      tau0: 60,
      q: Q2,
      seed: 11,
      measurementNoise: 3e-10,
      initial: { phase: 1e-6, frequency: 2e-12 },
    });
    const run = runClockFilter(
      { epoch: EPOCH, phase: sim.phase, variance: 9e-20, tau0: 60 },
      {
        q: Q2,
        initial: {
          t: 0,
          state: [1e-6, 2e-12],
          covariance: [
            [0, 0],
            [0, 0],
          ],
        },
        nisConfidence: 0.99,
      },
    );
    expect(run.nisSummary.mean).toBeGreaterThanOrEqual(run.nisSummary.low);
    expect(run.nisSummary.mean).toBeLessThanOrEqual(run.nisSummary.high);
    for (let i = 0; i < 5000; i++)
      expect(Math.abs(run.phase[i]! - sim.truePhase[i]!)).toBeLessThan(4 * run.phaseStd[i]! + 1e-25);
  });
  it('runClockFilter detects a simulated 1 ns phase jump at the right epoch and estimates its size within 4σ', () => {
    const sim = simulateClock({
      samples: 3000,
      tau0: 1,
      q: Q3,
      seed: 1,
      measurementNoise: 1e-10,
      jumps: [{ index: 2000, kind: 'phase', size: 1e-9 }],
    });
    const run = runClockFilter(
      { epoch: EPOCH, phase: sim.phase, variance: 1e-20, tau0: 1 },
      { q: Q3, initial: { t: 0, state: [0, 0, 0], covariance: zero3 } },
    );
    expect(run.jumps).toHaveLength(1);
    const j = run.jumps[0]!;
    expect(j.kind).toBe('phase');
    expect(j.updateIndex).toBe(2000);
    expect(j.epoch).toBe(2000);
    expect(Math.abs(j.size - 1e-9)).toBeLessThan(4 * j.sizeStd);
    // The samples between the jump and its declaration are not lost as outliers: after the declaration
    // the estimate is recomputed from them with the jump in place, so they are all accepted and the
    // phase estimate there follows the true (stepped) phase within 4σ.
    expect(run.rejected.filter((i) => i >= 2000 && i <= j.declaredAtUpdate)).toEqual([]);
    for (let i = 2000; i <= j.declaredAtUpdate; i++) {
      expect(run.status[i]).toBe('accepted');
      expect(Math.abs(run.phase[i]! - sim.truePhase[i]!)).toBeLessThan(4 * run.phaseStd[i]!);
    }
  });
  it('runClockFilter detects a simulated 2e-10 frequency jump within one epoch of where it was injected', () => {
    const sim = simulateClock({
      samples: 3000,
      tau0: 1,
      q: Q3,
      seed: 3,
      measurementNoise: 1e-10,
      jumps: [{ index: 2000, kind: 'frequency', size: 2e-10 }],
    });
    const run = runClockFilter(
      { epoch: EPOCH, phase: sim.phase, variance: 1e-20, tau0: 1 },
      { q: Q3, initial: { t: 0, state: [0, 0, 0], covariance: zero3 } },
    );
    expect(run.jumps).toHaveLength(1);
    const j = run.jumps[0]!;
    expect(j.kind).toBe('frequency');
    expect(Math.abs(j.updateIndex - 2000)).toBeLessThanOrEqual(1);
    expect(Math.abs(j.size - 2e-10)).toBeLessThan(4 * j.sizeStd);
  });
});
