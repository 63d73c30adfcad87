import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { planSteering, type SteeringScenario, steeringPlanToJson } from '../../packages/sdk/src/steering/index.js';

const DAY = 86_400;
const EPOCH_MS = Date.parse('2027-03-01T00:00:00Z');
const iso = (s: number): string => new Date(EPOCH_MS + s * 1000).toISOString().replace('.000Z', 'Z');
const at = (stamp: string): number => (Date.parse(stamp) - EPOCH_MS) / 1000;

/** A noise-free clock with one contact over the whole horizon and hourly decisions. */
function scenario(over: {
  horizon: number;
  phase: number;
  resolution: number;
  maxStep: number;
  tolerance: number;
  frequencyStep: number;
}): SteeringScenario {
  return {
    epoch: iso(0),
    horizonSeconds: over.horizon,
    gridSeconds: 3600,
    clock: { phaseSeconds: over.phase, fractionalFrequency: 0, driftPerSecond: 0, noise: { q1: 0, q2: 0, q3: 0 } },
    tolerance: { phaseSeconds: over.tolerance, probability: 0.95 },
    contacts: [{ start: iso(0), end: iso(over.horizon) }],
    actuator: {
      frequencyResolution: over.resolution,
      maxFrequencyStep: over.maxStep,
      cumulativeFrequencyRange: { min: -1e-6, max: 1e-6 },
      minCommandSpacingSeconds: 3600,
      maxTimeTagSeconds: 0,
    },
    strategy: { method: 'optimal' },
    costWeights: { frequencyStep: over.frequencyStep, command: 0 },
  };
}

interface Dare {
  K: number[];
  poles: number[][];
  u0: number;
  phaseAtDecisions: number[];
  D: number;
  b: number;
  H: number;
  wF: number;
  S: number;
}
const dare = JSON.parse(readFileSync(new URL('../fixtures/lq-steering/dare.json', import.meta.url), 'utf8')) as Dare;

describe('Koppang & Leland 1999, LQ clock steering: steady-state gain from the discrete Riccati equation (scipy, test/fixtures/lq-steering [C])', () => {
  // Unconstrained limit: a step limit 500× the first step and a resolution 10⁷× finer than it, no
  // per-command charge; the LQ plan is then the steady-state LQ closed loop s_{k+1} = (A − BK)s_k far
  // from the horizon end (20 days here, time constant ≈ 5 h). P. Koppang & R. Leland, IEEE Trans. UFFC
  // 46(3) 517–522 (1999) [V2 abstract] for LQ steering; gains computed independently by dare.py [C].
  const s = scenario({
    horizon: dare.H,
    phase: 10e-9,
    resolution: 1e-20,
    maxStep: dare.S,
    tolerance: dare.b,
    frequencyStep: dare.wF,
  });
  const plan = steeringPlanToJson(planSteering(s)); // stamps read back with Date.parse

  it('planSteering(unconstrained scenario) makes its first step u0 = −K·s0 of the Riccati gain, within 1e-6 relative', () => {
    const first = plan.commands[0]!;
    expect(at(first.executeAt)).toBe(0);
    const err = Math.abs(first.fractionalFrequencyStep! - dare.u0) / Math.abs(dare.u0);
    expect(err).toBeLessThan(1e-6);
  });

  it('planSteering(unconstrained scenario) follows the closed loop of the Riccati gain for 48 h, within 1e-3 of the initial offset', () => {
    const phase = plan.predicted.steered.phaseSeconds;
    for (let k = 0; k <= 48; k++) {
      // The grid point k·D shows the state after the command at k·D; the closed loop's x_k is before it,
      // and a frequency step does not move the phase at the instant it is applied.
      expect(Math.abs(phase[k]! - dare.phaseAtDecisions[k]!), `hour ${k}`).toBeLessThan(1e-3 * 10e-9);
    }
  });

  it('the Riccati closed-loop poles are a damped pair inside the unit circle (|z| = 0.817, 5 h time constant)', () => {
    const [re, im] = dare.poles[0]!;
    const modulus = Math.hypot(re!, im!);
    expect(modulus).toBeCloseTo(0.8166, 3);
    // Characteristic polynomial z² − (2 − D g_x − g_y) z + (1 − g_y) (physics-refs §12 [C]): product of the poles = 1 − g_y.
    expect(modulus * modulus).toBeCloseTo(1 - dare.K[1]!, 10);
    expect(2 * re!).toBeCloseTo(2 - dare.D * dare.K[0]! - dare.K[1]!, 10);
  });
});

describe('Kirk, Optimal Control Theory (1970) §5.4: minimum-time double integrator, switching curve x = −v|v|/(2a) [M]', () => {
  // Saturated limit: a clock 2 µs off and at rest, steps of S = 1e-13 at most once an hour (a = S/D),
  // resolution 1e-16. The minimum-time transfer from rest to rest accelerates at the limit for half the
  // time and brakes for the other half: T* = 2√(x0/a), switch at T*/2 with x = x0/2, where the state
  // meets the braking curve x = v²/(2a) (Kirk 1970, §5.4, from memory [M]). The plan works in whole
  // hourly steps, so times are compared to within a few decision intervals.
  const x0 = 2e-6;
  const S = 1e-13;
  const D = 3600;
  const a = S / D;
  const b = 10e-9;
  const tStar = 2 * Math.sqrt(x0 / a);
  const s = scenario({
    horizon: 10 * DAY,
    phase: x0,
    resolution: 1e-16,
    maxStep: S,
    tolerance: b,
    frequencyStep: 0.01,
  });
  const plan = steeringPlanToJson(planSteering(s)); // stamps read back with Date.parse
  const freq = plan.commands.filter((c) => c.kind === 'frequency');

  it('planSteering(saturated scenario) accelerates at the step limit and switches to braking at T*/2 (within 2 decision intervals)', () => {
    const firstBrake = freq.findIndex((c) => c.fractionalFrequencyStep! > 0);
    expect(firstBrake).toBeGreaterThan(0);
    for (const c of freq.slice(0, firstBrake - 1)) expect(c.fractionalFrequencyStep).toBeCloseTo(-S, 25);
    expect(Math.abs(at(freq[firstBrake]!.executeAt) - tStar / 2)).toBeLessThanOrEqual(2 * D);
  });

  it('planSteering(saturated scenario) reaches the band at T* − √(2b/a) (the braking curve entering |x| = b), within 3 decision intervals, and never overshoots −b', () => {
    const t = plan.predicted.t;
    const x = plan.predicted.steered.phaseSeconds;
    const enter = t[x.findIndex((v) => Math.abs(v) <= b)]!;
    expect(Math.abs(enter - (tStar - Math.sqrt((2 * b) / a)))).toBeLessThanOrEqual(3 * D);
    // One resolution step's worth of phase over one decision interval: 1e-16 × 3600 s.
    expect(Math.min(...x)).toBeGreaterThanOrEqual(-b - 1e-16 * D);
    expect(plan.metrics.settledAfterSeconds).not.toBeNull();
  });
});
