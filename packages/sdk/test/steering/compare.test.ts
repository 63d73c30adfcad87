import { describe, expect, it } from 'vitest';
import { planSteering, simulatePlan, steeringCost } from '../../src/steering/index.js';
import { baseScenario, example } from './helpers.js';

const EXAMPLES = ['orin-3-meo', 'halcyr-g1-geo'] as const;

describe('strategy comparison on the bundled examples (invented satellites and stations)', () => {
  for (const name of EXAMPLES) {
    it(`planSteering(${name}): the optimal planner's expected cost J is never above the deadband planner's, and both beat no steering`, () => {
      const s = example(name);
      const none = planSteering(s, { strategy: 'none' });
      const deadband = planSteering(s, { strategy: 'deadband' });
      const optimal = planSteering(s, { strategy: 'optimal' });
      expect(optimal.metrics.expectedCost).toBeLessThanOrEqual(deadband.metrics.expectedCost);
      expect(deadband.metrics.expectedCost).toBeLessThan(none.metrics.expectedCost);
      expect(optimal.feasible).toBe(true);
      // The LQ schedule wins on its own here (the deadband fallback is not what makes it pass).
      expect(optimal.commands.every((c) => !c.reason.includes('deadband schedule kept'))).toBe(true);
      expect(steeringCost(s, optimal).total).toBeCloseTo(optimal.metrics.expectedCost, 12);
    });
  }

  it('planSteering(scenario): optimal is never worse than deadband on J across a sweep of contact patterns and offsets', () => {
    for (const gap of [3, 6, 12]) {
      for (const y0 of [-3e-13, 5e-14, 4e-13]) {
        const s = baseScenario({
          clock: {
            phaseSeconds: 4e-9,
            fractionalFrequency: y0,
            driftPerSecond: 1e-19,
            noise: { q1: 1e-24, q2: 1e-34, q3: 0 },
          },
        });
        s.contacts = s.contacts.filter((_, i) => i % (gap / 3) === 0);
        const d = planSteering(s, { strategy: 'deadband' }).metrics.expectedCost;
        const o = planSteering(s, { strategy: 'optimal' }).metrics.expectedCost;
        expect(o, `gap ${gap} h, y0 ${y0}`).toBeLessThanOrEqual(d);
      }
    }
  });
});

describe('simulatePlan (seeded Monte Carlo)', () => {
  it('simulatePlan(scenario, plan, {runs, seed}) is deterministic for a seed and reports progress', () => {
    const s = example('orin-3-meo');
    const plan = planSteering(s);
    const calls: number[] = [];
    const a = simulatePlan(s, plan, { runs: 50, seed: 7, onProgress: (done) => calls.push(done) });
    const b = simulatePlan(s, plan, { runs: 50, seed: 7 });
    expect(a).toEqual(b);
    expect(calls).toHaveLength(50);
    expect(calls[49]).toBe(50);
    expect(a.commandCount).toBe(plan.commands.length);
  });

  it('simulatePlan(scenario, none) reproduces the open-loop variance q1 t + q2 t³/3 at the horizon within its sampling error (Zucca & Tavella 2005 Q11; independent simulation)', () => {
    const s = baseScenario({
      clock: { phaseSeconds: 0, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 1e-24, q2: 1e-34, q3: 0 } },
    });
    // With tolerance b, P(|x| ≤ b) at the horizon for x ~ N(0, σ²) is 2Φ(b/σ) − 1; choose b = σ(H) so P = 0.6827.
    const h = s.horizonSeconds;
    const sigma = Math.sqrt(1e-24 * h + (1e-34 * h ** 3) / 3);
    s.tolerance.phaseSeconds = sigma;
    const r = simulatePlan(s, { commands: [] }, { runs: 4000, seed: 11 });
    // Binomial sampling error of a fraction near 0.683 with 4000 runs: 0.0074; 4 standard errors.
    expect(Math.abs(r.minEpochProbability - 0.6827)).toBeLessThan(4 * 0.0074);
  });

  for (const name of EXAMPLES) {
    it(`simulatePlan(${name}, optimal plan) keeps every epoch's in-tolerance fraction at or above the stated probability (within sampling error)`, () => {
      const s = example(name);
      const plan = planSteering(s);
      const r = simulatePlan(s, plan, { runs: 1000, seed: 20261202 });
      const p = s.tolerance.probability;
      const se = Math.sqrt((p * (1 - p)) / 1000);
      expect(r.minEpochProbability).toBeGreaterThanOrEqual(p - 4 * se);
      expect(r.timeInTolerance).toBeGreaterThan(r.minEpochProbability - 1e-12);
      expect(r.wholeHorizonProbability).toBeLessThanOrEqual(r.minEpochProbability);
      expect(r.worstExcursionP95Seconds).toBeLessThanOrEqual(r.worstExcursionSeconds);
    });
  }

  it('simulatePlan(scenario, plan, options) rejects runs 0, a fractional seed and a missing options object', () => {
    const s = baseScenario();
    expect(() => simulatePlan(s, { commands: [] }, { runs: 0 })).toThrow(/options.runs/);
    expect(() => simulatePlan(s, { commands: [] }, { runs: 5, seed: 1.5 })).toThrow(/options.seed/);
    expect(() => simulatePlan(s, { commands: [] }, null as never)).toThrow(/options/);
  });
});
