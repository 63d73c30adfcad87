import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ClockKalmanFilter } from '../../src/clock-model/kalman.js';
import { createRandom } from '../../src/internal/random.js';
import type { ClockState, Matrix3 } from '../../src/steering/clock-math.js';
import { closedLoopFrame, drawTruth, flyClosedLoop } from '../../src/steering/closed-loop.js';
import {
  planSteering,
  replanSteering,
  type SteeringScenario,
  simulateClosedLoop,
  validateScenario,
} from '../../src/steering/index.js';
import { LeanClockFilter } from '../../src/steering/lean-filter.js';
import { runPlanner } from '../../src/steering/plan.js';
import { makeReplanner } from '../../src/steering/replan.js';
import { EPOCH } from '../clock-model/test-epoch.js';
import { baseScenario, example } from './helpers.js';

const EPOCH_MS = Date.parse('2027-03-01T00:00:00Z');
const iso = (s: number): string => new Date(EPOCH_MS + s * 1000).toISOString().replace('.000Z', 'Z');

/** Random noise-free scenarios with an operations block (1–3 days, random contacts, actuator, manoeuvre). */
const quietArb = fc
  .record({
    days: fc.integer({ min: 1, max: 3 }),
    gapHours: fc.integer({ min: 3, max: 14 }),
    minutes: fc.integer({ min: 10, max: 90 }),
    phase: fc.double({ min: -1e-8, max: 1e-8, noNaN: true }),
    freq: fc.double({ min: -3e-12, max: 3e-12, noNaN: true }),
    drift: fc.double({ min: -2e-18, max: 2e-18, noNaN: true }),
    maxStepFactor: fc.integer({ min: 5, max: 200 }),
    spacingMin: fc.integer({ min: 0, max: 120 }),
    latencyHours: fc.integer({ min: 0, max: 20 }),
    estimateLatency: fc.integer({ min: 0, max: 7200 }),
    maneuver: fc.option(fc.integer({ min: -20_000, max: 20_000 }), { nil: undefined }),
    method: fc.constantFrom('deadband' as const, 'optimal' as const),
  })
  .map((r): SteeringScenario => {
    const horizon = r.days * 86_400;
    const contacts = [];
    for (let t = 1800; t + r.minutes * 60 <= horizon; t += r.gapHours * 3600)
      contacts.push({ start: iso(t), end: iso(t + r.minutes * 60) });
    return {
      epoch: iso(0),
      horizonSeconds: horizon,
      gridSeconds: 900,
      clock: {
        phaseSeconds: r.phase,
        fractionalFrequency: r.freq,
        driftPerSecond: r.drift,
        noise: { q1: 0, q2: 0, q3: 0 },
      },
      tolerance: { phaseSeconds: 2e-8, probability: 0.95 },
      contacts,
      actuator: {
        frequencyResolution: 1e-15,
        maxFrequencyStep: 1e-15 * r.maxStepFactor,
        cumulativeFrequencyRange: { min: -1e-10, max: 1e-10 },
        minCommandSpacingSeconds: r.spacingMin * 60,
        maxTimeTagSeconds: r.latencyHours * 3600,
      },
      ...(r.maneuver !== undefined
        ? {
            maneuvers: [
              { at: iso(horizon / 2), semiMajorAxisBefore: 27_000_000, semiMajorAxisAfter: 27_000_000 + r.maneuver },
            ],
          }
        : {}),
      strategy: { method: r.method },
      operations: { estimateIntervalSeconds: 900, estimateNoiseSeconds: 0, estimateLatencySeconds: r.estimateLatency },
    };
  });

describe('closed-loop operations (fast-check, seed 20261203)', () => {
  it('flyClosedLoop(frame, planner, truth) with zero process and estimate noise executes exactly the open-loop plan', () => {
    let commandsSeen = 0;
    fc.assert(
      fc.property(quietArb, (s) => {
        const norm = validateScenario(s);
        const method = norm.strategy.method as 'deadband' | 'optimal';
        const open = runPlanner(norm, method).commands;
        const frame = closedLoopFrame(norm);
        const run = flyClosedLoop(frame, makeReplanner(norm, method), drawTruth(frame, createRandom(1)));
        commandsSeen += open.length;
        expect(run.commands.map((c) => [c.kind, c.steps])).toEqual(open.map((c) => [c.kind, c.steps]));
        run.commands.forEach((c, i) => {
          expect(Math.abs(c.executeAt - open[i]!.executeAt)).toBeLessThan(1e-6);
          expect(Math.abs(c.uplinkAt - open[i]!.uplinkAt)).toBeLessThan(1e-6);
        });
      }),
      { seed: 20261203, numRuns: 40 },
    );
    expect(commandsSeen).toBeGreaterThan(20);
  });

  it('LeanClockFilter gives the estimate of ClockKalmanFilter (same equations) to 1e-9 relative over 200 updates with steps', () => {
    const q = { q1: 9e-24, q2: 3e-34, q3: 1e-45 };
    const initial = {
      t: 0,
      state: [2e-9, 1e-13, 1e-19] satisfies ClockState,
      covariance: [
        [1e-19, 0, 0],
        [0, 1e-27, 0],
        [0, 0, 1e-38],
      ] satisfies Matrix3,
    };
    const full = new ClockKalmanFilter({ epoch: EPOCH, q, initial, outlierProbability: false, jumpDetection: false });
    const lean = new LeanClockFilter(0, initial.state, initial.covariance, q);
    const rng = createRandom(42);
    for (let k = 1; k <= 200; k++) {
      const t = k * 900;
      if (k % 17 === 0) {
        full.predict(t - 300);
        lean.predict(t - 300);
        full.applyStep({ frequency: 5e-14, phase: 0 });
        lean.applyStep(0, 5e-14);
      }
      const z = 3e-9 + 1e-10 * rng.normal();
      full.step(t, z, 1e-20);
      lean.predict(t);
      lean.update(z, 1e-20);
    }
    const f = full.estimate;
    const leanCovariance = lean.covariance();
    for (let i = 0; i < 3; i++) {
      expect(Math.abs(lean.s[i]! - f.state[i]!)).toBeLessThanOrEqual(1e-9 * Math.abs(f.state[i]!) + 1e-30);
      for (let j = 0; j < 3; j++) {
        const ref = (f.covariance[i] as number[])[j]!;
        expect(Math.abs(leanCovariance[i]![j]! - ref)).toBeLessThanOrEqual(
          1e-9 * Math.sqrt(Math.abs((f.covariance[i] as number[])[i]! * (f.covariance[j] as number[])[j]!)),
        );
      }
    }
  });
});

describe('simulateClosedLoop', () => {
  const s = example('orin-3-meo');
  s.horizonSeconds = 3 * 86_400;
  s.contacts = s.contacts.filter((c) => c.start < '2027-02-11');
  delete s.maneuvers;

  it('simulateClosedLoop(scenario, {runs, seed}) is deterministic for a seed, reports progress, and beats no steering', () => {
    const calls: number[] = [];
    const a = simulateClosedLoop(s, { runs: 6, seed: 9, onProgress: (d) => calls.push(d) });
    const b = simulateClosedLoop(s, { runs: 6, seed: 9 });
    expect(JSON.stringify(a)).toBe(JSON.stringify(b));
    expect(calls).toEqual([1, 2, 3, 4, 5, 6]);
    expect(a.strategies.map((x) => x.method)).toEqual(['optimal', 'deadband', 'none']);
    const [optimal, , none] = a.strategies;
    expect(optimal!.timeInTolerance.mean).toBeGreaterThan(none!.timeInTolerance.mean);
    expect(none!.commandsPerDay.mean).toBe(0);
    for (const x of a.strategies) {
      expect(x.timeInTolerance.min).toBeLessThanOrEqual(x.timeInTolerance.p05);
      expect(x.timeInTolerance.p05).toBeLessThanOrEqual(x.timeInTolerance.mean + 1e-15);
      expect(x.maxAbsOffsetSeconds.p50).toBeLessThanOrEqual(x.maxAbsOffsetSeconds.p95);
      expect(x.maxAbsOffsetSeconds.p95).toBeLessThanOrEqual(x.maxAbsOffsetSeconds.max);
    }
  });

  it('simulateClosedLoop(scenario) holds a month-long horizon that the open-loop plan cannot promise (σ from the epoch grows past the tolerance)', () => {
    const long = baseScenario({
      horizonSeconds: 20 * 86_400,
      clock: { phaseSeconds: 0, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 1e-24, q2: 1e-32, q3: 0 } },
      operations: { estimateIntervalSeconds: 1800, estimateNoiseSeconds: 3e-10, estimateLatencySeconds: 3600 },
    });
    long.contacts = [];
    for (let d = 0; d < 20; d++) {
      for (const h of [6, 18])
        long.contacts.push({
          start: iso(d * 86_400 + h * 3600).replace('2027-03', '2027-01'),
          end: iso(d * 86_400 + h * 3600 + 1800).replace('2027-03', '2027-01'),
        });
    }
    expect(planSteering(long).reasonCode).toBe('uncertainty');
    const r = simulateClosedLoop(long, { runs: 4, seed: 2, strategies: ['optimal'] });
    expect(r.strategies[0]!.timeInTolerance.min).toBe(1);
  });

  it('simulateClosedLoop rejects a scenario without operations, runs 0, a bad seed and an unknown strategy, naming the field', () => {
    expect(() => simulateClosedLoop(example('halcyr-g1-geo'), { runs: 2 })).toThrow(/operations/);
    expect(() => simulateClosedLoop(s, { runs: 0 })).toThrow(/options\.runs/);
    expect(() => simulateClosedLoop(s, { runs: 2, seed: -1 })).toThrow(/options\.seed/);
    expect(() => simulateClosedLoop(s, { runs: 2, strategies: ['fast' as never] })).toThrow(/options\.strategies\[0\]/);
  });
});

describe('replanSteering', () => {
  const s = example('orin-3-meo');
  const plan = planSteering(s);
  const now = 3 * 86_400 + 5 * 3600 + 600; // the morning contact of day 4 (05:10 UTC)

  it('replanSteering(scenario, plan, estimates, now) keeps the executed commands, supersedes the others and re-plans from the filter estimate', () => {
    const estimates = [];
    for (let t = 900; t <= now - 3600; t += 900) {
      const i = plan.predicted.t.indexOf(t);
      estimates.push({ tSeconds: t, phaseSeconds: plan.predicted.steered.phaseSeconds[i]!, sigmaSeconds: 3e-10 });
    }
    const revised = replanSteering(s, plan, estimates, now);
    const nowAt = plan.epoch.plus(now);
    expect(revised.epoch.equals(plan.epoch)).toBe(true);
    expect(revised.revision.nowSeconds).toBe(now);
    expect(revised.revision.estimatesUsed).toBe(estimates.length);
    expect(revised.revision.executed.every((c) => c.executeAt.isBefore(nowAt))).toBe(true);
    expect(revised.revision.superseded.every((c) => !c.uplinkAt.isBefore(nowAt))).toBe(true);
    expect(revised.revision.executed.length + revised.revision.superseded.length).toBe(plan.commands.length);
    expect(revised.commands.every((c) => !c.uplinkAt.isBefore(nowAt))).toBe(true);
    expect(revised.predicted.t[0]).toBe(now);
    // With estimates on the predicted mean, the filter's phase at now stays within 3σ (0.9 ns) of the plan's mean at the
    // last grid point before now, plus what |y| ≤ 3e-13 moves it in the 600 s since (0.18 ns).
    const i = plan.predicted.t.indexOf(now - 600);
    expect(Math.abs(revised.revision.state.phaseSeconds - plan.predicted.steered.phaseSeconds[i]!)).toBeLessThan(
      3 * 3e-10 + 1.8e-10,
    );
    expect(revised.revision.state.phaseSigmaSeconds).toBeLessThan(plan.predicted.steered.sigmaSeconds[i]!);
    expect(revised.caution).toMatch(/responsible engineering authority/);
  });

  it('replanSteering rejects an estimate after now, unsorted estimates, σ = 0 and now beyond the horizon, naming the field', () => {
    const e = (t: number, sigma = 1e-10) => ({ tSeconds: t, phaseSeconds: 0, sigmaSeconds: sigma });
    expect(() => replanSteering(s, plan, [e(now + 1)], now)).toThrow(/estimates\[0\]\.tSeconds/);
    expect(() => replanSteering(s, plan, [e(2000), e(1000)], now)).toThrow(/estimates\[1\]\.tSeconds/);
    expect(() => replanSteering(s, plan, [e(1000, 0)], now)).toThrow(/estimates\[0\]\.sigmaSeconds/);
    expect(() => replanSteering(s, plan, [], s.horizonSeconds)).toThrow(/nowSeconds/);
  });
});
