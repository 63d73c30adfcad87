import { describe, expect, it } from 'vitest';
import { validateScenario } from '../../src/steering/index.js';
import { actuatorLimitMessages, planOptimal } from '../../src/steering/optimal.js';
import type { InternalCommand } from '../../src/steering/predict.js';
import { baseScenario } from './helpers.js';

/** A clock 15 ns off with phase steps allowed but limited to 2 ns each (common practice, no source). */
function phaseLimitedScenario() {
  const s = baseScenario({ clock: { phaseSeconds: 1.5e-8, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 0, q2: 0, q3: 0 } } });
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
    const command = (extra: Partial<InternalCommand>): InternalCommand =>
      ({ uplinkAt: 3600, executeAt: 3600, kind: 'frequency', steps: 1, amount: 1e-15, reason: '', ...extra });
    expect(actuatorLimitMessages(norm, [
      command({ limitedBy: 'maxFrequencyStep' }), command({ limitedBy: 'maxFrequencyStep' }),
      command({ limitedBy: 'cumulativeFrequencyRange' }), command({ kind: 'phase', amount: 2e-9, limitedBy: 'maxPhaseStep' }),
    ])).toEqual([
      'the needed step exceeds maxFrequencyStep (1.00e-12)',
      'the cumulative range [-1.00e-10, 1.00e-10] is exhausted',
      'the needed phase step exceeds actuator.phaseSteps.maxStep (2 ns)',
    ]);
    expect(actuatorLimitMessages(norm, [command({ reason: 'optimal (quantised LQ): ... (limited by the maximum step)' })])).toEqual([]);
  });
});
