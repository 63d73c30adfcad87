import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import {
  planSteering,
  predictSteering,
  steeringCost,
  steeringPlanToJson,
  validateScenario,
} from '../../src/steering/index.js';
import { bundledTimeScales } from '../../src/time/utc-text.js';
import { baseScenario, example } from './helpers.js';

const DAY = 86_400;

describe('planSteering', () => {
  it('planSteering(scenario, {strategy: "none"}) predicts the walk-off 8.640 ns/day for y0 = 1e-13 (physics-refs §12 walk-off check [C])', () => {
    const s = baseScenario({
      clock: { phaseSeconds: 0, fractionalFrequency: 1e-13, driftPerSecond: 0, noise: { q1: 0, q2: 0, q3: 0 } },
    });
    const plan = planSteering(s, { strategy: 'none' });
    const i = plan.predicted.t.indexOf(DAY);
    expect(plan.predicted.unsteered.phaseSeconds[i]).toBeCloseTo(8.64e-9, 18);
    expect(plan.commands).toEqual([]);
  });

  it('planSteering(scenario) predicts pure drift D = 1e-13/day reaching 10 ns after 1.315e5 s (physics-refs §12 [C])', () => {
    const s = baseScenario({
      gridSeconds: 60,
      clock: { phaseSeconds: 0, fractionalFrequency: 0, driftPerSecond: 1e-13 / DAY, noise: { q1: 0, q2: 0, q3: 0 } },
    });
    const plan = planSteering(s, { strategy: 'none' });
    const k = plan.predicted.unsteered.phaseSeconds.findIndex((x) => x >= 1e-8);
    expect(plan.predicted.t[k]! / 1.315e5).toBeCloseTo(1, 3);
  });

  it('planSteering(scenario) gives σ(t)² = q1 t + q2 t³/3 for the 2-state model (Zucca & Tavella 2005, Q11 [M]; physics-refs §11)', () => {
    const plan = planSteering(baseScenario(), { strategy: 'none' });
    const t = plan.predicted.t[100]!;
    expect(plan.predicted.steered.sigmaSeconds[100]! ** 2).toBeCloseTo(1e-24 * t + (1e-34 * t ** 3) / 3, 30);
  });

  it('planSteering(orin-3-meo) returns a feasible optimal plan whose commands obey the actuator and contact rules', () => {
    const scenario = example('orin-3-meo');
    const plan = planSteering(scenario);
    expect(plan.feasible).toBe(true);
    expect(plan.reason).toBeUndefined();
    const n = validateScenario(scenario);
    // Stamps read back from the JSON form with Date.parse (independent of the SDK's calendar; no leap second here).
    for (const c of steeringPlanToJson(plan).commands) {
      expect(Number.isInteger(c.actuatorSteps)).toBe(true);
      expect(c.fractionalFrequencyStep).toBeCloseTo(c.actuatorSteps * n.actuator.resolution, 30);
      const up = Date.parse(c.uplinkAt);
      const ex = Date.parse(c.executeAt);
      expect(scenario.contacts.some((w) => Date.parse(w.start) <= up && up <= Date.parse(w.end))).toBe(true);
      expect(ex - up).toBeGreaterThanOrEqual(0);
      expect(ex - up).toBeLessThanOrEqual(scenario.actuator.maxTimeTagSeconds * 1000);
    }
    expect(plan.metrics.worstOffsetBoundSeconds).toBeLessThanOrEqual(scenario.tolerance.phaseSeconds);
    expect(plan.metrics.probabilityInTolerance).toBeGreaterThanOrEqual(0.95);
    expect(plan.caution).toMatch(/interface specification.*responsible engineering authority/);
  });

  it('planSteering(orin-3-meo) cancels the day-4 manoeuvre with a time-tagged step of round(−Δrate/resolution) executing at the manoeuvre', () => {
    const scenario = example('orin-3-meo');
    const n = validateScenario(scenario);
    const plan = planSteering(scenario);
    const m = scenario.maneuvers![0]!;
    const c = steeringPlanToJson(plan).commands.find((k) => k.executeAt === m.at);
    expect(c).toBeDefined();
    expect(c!.actuatorSteps).toBe(Math.round(-n.maneuvers[0]!.rateChange / n.actuator.resolution));
    expect(Date.parse(c!.uplinkAt)).toBeLessThan(Date.parse(c!.executeAt));
    expect(c!.reason).toMatch(/manoeuvre/);
  });

  it('planSteering(scenario) is deterministic and JSON-serialisable', () => {
    const a = planSteering(example('halcyr-g1-geo'), { strategy: 'optimal' });
    const b = planSteering(example('halcyr-g1-geo'), { strategy: 'optimal' });
    expect(JSON.stringify(steeringPlanToJson(a))).toBe(JSON.stringify(steeringPlanToJson(b)));
    expect(JSON.parse(JSON.stringify(a))).toEqual(a);
    expect(a.predicted.t.length).toBe(a.predicted.steered.phaseSeconds.length);
    expect(a.predicted.t.length).toBe(a.predicted.unsteered.sigmaSeconds.length);
  });

  it('planSteering(scenario) says infeasible when σ alone exceeds the tolerance, naming when', () => {
    const s = baseScenario({
      clock: { phaseSeconds: 0, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 1e-20, q2: 0, q3: 0 } },
    });
    const plan = planSteering(s);
    expect(plan.feasible).toBe(false);
    expect(plan.reason).toMatch(/^σ alone exceeds the tolerance after [\d.]+ h/);
  });

  it('planSteering(scenario) says infeasible when the needed step exceeds maxFrequencyStep', () => {
    const s = baseScenario({
      clock: { phaseSeconds: 0, fractionalFrequency: 5e-12, driftPerSecond: 0, noise: { q1: 1e-26, q2: 0, q3: 0 } },
    });
    s.actuator.maxFrequencyStep = 1e-14;
    s.actuator.minCommandSpacingSeconds = 3 * 3600;
    const plan = planSteering(s, { strategy: 'deadband' });
    expect(plan.feasible).toBe(false);
    expect(plan.reason).toMatch(/maxFrequencyStep/);
  });

  it('planSteering(scenario) says infeasible when no contact comes before the offset leaves the tolerance', () => {
    const s = baseScenario({
      clock: { phaseSeconds: 0, fractionalFrequency: 1e-12, driftPerSecond: 0, noise: { q1: 0, q2: 0, q3: 0 } },
    });
    s.contacts = [{ start: '2027-01-02T12:00:00Z', end: '2027-01-02T13:00:00Z' }];
    const plan = planSteering(s);
    expect(plan.feasible).toBe(false);
    expect(plan.reason).toMatch(/no contact lets a command execute before/);
  });

  it('planSteering(scenario) says infeasible when the clock starts outside the tolerance', () => {
    const s = baseScenario({
      clock: { phaseSeconds: 1e-7, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 0, q2: 0, q3: 0 } },
    });
    expect(planSteering(s).reason).toMatch(/already outside the tolerance at the epoch/);
  });

  it('planSteering(scenario) uses a phase step when allowed and the offset is large', () => {
    const s = baseScenario({
      clock: { phaseSeconds: 1.5e-8, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 0, q2: 0, q3: 0 } },
    });
    s.actuator.phaseSteps = { allowed: true, resolution: 1e-10 };
    for (const strategy of ['deadband', 'optimal'] as const) {
      const plan = planSteering(s, { strategy });
      const phase = plan.commands.find((c) => c.kind === 'phase');
      expect(phase, strategy).toBeDefined();
      expect(phase!.phaseStepSeconds).toBeCloseTo(phase!.actuatorSteps * 1e-10, 20);
      expect(plan.feasible).toBe(true);
    }
  });

  it('planSteering(scenario, {strategy}) rejects an unknown strategy', () => {
    expect(() => planSteering(baseScenario(), { strategy: 'fast' as never })).toThrow(InvalidArgumentError);
  });
});

describe('steeringCost and predictSteering', () => {
  it('steeringCost(scenario, plan) equals the plan metric, and predictSteering reproduces the plan prediction', () => {
    const scenario = example('orin-3-meo');
    const plan = planSteering(scenario);
    expect(steeringCost(scenario, plan).total).toBeCloseTo(plan.metrics.expectedCost, 12);
    const p = predictSteering(scenario, plan.commands);
    expect(p.steered.phaseSeconds).toEqual(plan.predicted.steered.phaseSeconds);
    expect(p.withinTolerance).toBe(true);
  });

  it('steeringCost(scenario, {commands: []}) has the variance term (1/(b²H))(q1H²/2 + q2H⁴/12) for a 2-state clock (integral of Q11, Zucca & Tavella 2005)', () => {
    const s = baseScenario({
      clock: { phaseSeconds: 0, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 1e-24, q2: 1e-34, q3: 0 } },
    });
    const h = s.horizonSeconds;
    const b = s.tolerance.phaseSeconds;
    const cost = steeringCost(s, { commands: [] });
    expect(cost.variance).toBeCloseTo(((1e-24 * h * h) / 2 + (1e-34 * h ** 4) / 12) / (b * b * h), 12);
    expect(cost.meanSquare).toBe(0);
  });

  it('steeringCost(scenario, plan) rejects a command with a non-integer actuatorSteps or a bad kind', () => {
    const s = baseScenario();
    const at = bundledTimeScales().parseIso('2027-01-01T01:00:00Z', 'UTC');
    const c = {
      uplinkAt: at,
      executeAt: at,
      kind: 'frequency' as const,
      fractionalFrequencyStep: 1e-15,
      actuatorSteps: 1.5,
      reason: '',
    };
    expect(() => steeringCost(s, { commands: [c] })).toThrow(/plan.commands\[0\].actuatorSteps/);
    expect(() => steeringCost(s, { commands: [{ ...c, actuatorSteps: 1, kind: 'warp' as never }] })).toThrow(
      /plan.commands\[0\].kind/,
    );
    expect(() => predictSteering(s, [{ ...c, actuatorSteps: 1, executeAt: 'soon' as never }])).toThrow(
      /commands\[0\].executeAt/,
    );
  });
});
