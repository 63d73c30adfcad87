import { describe, expect, it } from 'vitest';
import { feedForwardManeuvers } from '../../src/steering/constraints.js';
import { DEADBAND_REASON_PREFIX, planDeadband } from '../../src/steering/deadband.js';
import { planSteering, validateScenario } from '../../src/steering/index.js';
import { actuatorLimitMessages, planOptimal } from '../../src/steering/optimal.js';
import type { InternalCommand } from '../../src/steering/predict.js';
import { baseScenario } from './helpers.js';

/** A clock 15 ns off with phase steps allowed but limited to 2 ns each (common practice, no source). */
function phaseLimitedScenario() {
  const s = baseScenario({
    clock: { phaseSeconds: 1.5e-8, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 0, q2: 0, q3: 0 } },
  });
  s.actuator.phaseSteps = { allowed: true, resolution: 1e-10, maxStep: 2e-9 };
  return s;
}

describe('planOptimal actuator limits', () => {
  it('planOptimal(norm) flags a phase step cut by phaseSteps.maxStep as maxPhaseStep and reports that limit, not maxFrequencyStep', () => {
    const norm = validateScenario(phaseLimitedScenario());
    const result = planOptimal(norm, []);
    const limited = result.commands.filter((c) => c.limitedBy !== undefined);
    expect(limited.length).toBeGreaterThan(0);
    for (const c of limited) {
      expect(c.kind).toBe('phase');
      expect(c.limitedBy).toBe('maxPhaseStep');
      expect(Math.abs(c.amount)).toBeLessThanOrEqual(2e-9 * (1 + 1e-12));
      expect(c.reason).toMatch(/\(limited by actuator\.phaseSteps\.maxStep\)$/);
    }
    expect(result.limits).toEqual(['the needed phase step exceeds actuator.phaseSteps.maxStep (2 ns)']);
    expect(result.limits.join(' ')).not.toMatch(/maxFrequencyStep/);
  });

  it('actuatorLimitMessages(norm, commands) reads the limitedBy flags, one message per limit, and ignores the reason text', () => {
    const norm = validateScenario(phaseLimitedScenario());
    const command = (extra: Partial<InternalCommand>): InternalCommand => ({
      uplinkAt: 3600,
      executeAt: 3600,
      kind: 'frequency',
      steps: 1,
      amount: 1e-15,
      reason: '',
      ...extra,
    });
    expect(
      actuatorLimitMessages(norm, [
        command({ limitedBy: 'maxFrequencyStep' }),
        command({ limitedBy: 'maxFrequencyStep' }),
        command({ limitedBy: 'cumulativeFrequencyRange' }),
        command({ kind: 'phase', amount: 2e-9, limitedBy: 'maxPhaseStep' }),
      ]),
    ).toEqual([
      'the needed step exceeds maxFrequencyStep (1.00e-12)',
      'the cumulative range [-1.00e-10, 1.00e-10] is exhausted',
      'the needed phase step exceeds actuator.phaseSteps.maxStep (2 ns)',
    ]);
    expect(
      actuatorLimitMessages(norm, [command({ reason: 'optimal (quantised LQ): ... (limited by the maximum step)' })]),
    ).toEqual([]);
  });
});

describe('planOptimal deadband safeguard', () => {
  /** A clock 1e-13 fast, ±5 ns at 95 %, and a manoeuvre compensated feed-forward: here the deadband schedule costs less. */
  function deadbandWinsScenario() {
    return baseScenario({
      clock: { phaseSeconds: 0, fractionalFrequency: 1e-13, driftPerSecond: 0, noise: { q1: 1e-24, q2: 1e-34, q3: 0 } },
      tolerance: { phaseSeconds: 5e-9, probability: 0.95 },
      maneuvers: [{ at: '2027-01-01T13:00:00Z', semiMajorAxisBefore: 26_560_000, semiMajorAxisAfter: 26_570_000 }],
    });
  }

  it("planOptimal(norm, fixed) keeping the deadband schedule relabels the deadband planner's commands (planner field) and leaves feed-forward ones as they are", () => {
    const norm = validateScenario(deadbandWinsScenario());
    const fixed = feedForwardManeuvers(norm).commands;
    expect(fixed).toHaveLength(1);
    const deadband = planDeadband(norm, fixed).commands;
    const optimal = planOptimal(norm, fixed).commands;
    expect(optimal).toHaveLength(deadband.length);
    expect(deadband.some((c) => c.planner === 'deadband')).toBe(true);
    deadband.forEach((c, i) => {
      const kept = optimal[i]!;
      expect({ ...kept, reason: '' }).toEqual({ ...c, reason: '' });
      if (c.planner === 'deadband') {
        expect(c.reason.startsWith(DEADBAND_REASON_PREFIX)).toBe(true);
        expect(kept.reason).toBe(
          `optimal (deadband schedule kept: lower expected cost than the LQ schedule): ${c.reason.slice(DEADBAND_REASON_PREFIX.length)}`,
        );
      } else {
        expect(c.planner).toBeUndefined();
        expect(kept.reason).toBe(c.reason);
        expect(kept.reason).toMatch(/^cancels the relativistic rate change of manoeuvre maneuvers\[0\]/);
      }
    });
  });

  it('planSteering(scenario, {strategy: "optimal"}) plans a grid of 144 001 epochs (more than a spread argument list holds) without overflowing the call stack', () => {
    const s = baseScenario({
      gridSeconds: 1.2,
      contacts: [{ start: '2027-01-02T23:00:00Z', end: '2027-01-02T23:01:00Z' }],
      clock: { phaseSeconds: 2e-9, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 1e-24, q2: 1e-34, q3: 0 } },
    });
    const plan = planSteering(s, { strategy: 'optimal' });
    expect(plan.predicted.t.length).toBe(144_001);
    expect(plan.feasible).toBe(true);
  });
});
