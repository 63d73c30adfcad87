import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { noiseToDiffusion, type SteeringScenario, validateScenario } from '../../src/steering/index.js';
import { baseScenario } from './helpers.js';

/** Applies `edit` to a deep copy of the base scenario and returns the error thrown by validateScenario. */
function errorFor(edit: (s: Record<string, any>) => void): InvalidArgumentError {
  const s = structuredClone(baseScenario()) as Record<string, any>;
  edit(s);
  try {
    validateScenario(s);
  } catch (e) {
    expect(e).toBeInstanceOf(InvalidArgumentError);
    return e as InvalidArgumentError;
  }
  throw new Error('validateScenario accepted the scenario');
}

describe('validateScenario', () => {
  it('validateScenario(base) returns times in seconds since the epoch and z = 1.959964 for p = 0.95 (normal table, common practice)', () => {
    const n = validateScenario(baseScenario());
    expect(n.windows[0]).toEqual({ start: 3600, end: 5400 });
    expect(n.z).toBeCloseTo(1.959964, 6);
    expect(n.grid).toBe(900);
  });

  const cases: [string, (s: Record<string, any>) => void, string][] = [
    [
      'unsorted windows',
      (s) => {
        [s.contacts[1], s.contacts[2]] = [s.contacts[2], s.contacts[1]];
      },
      'contacts[2].start',
    ],
    [
      'overlapping windows',
      (s) => {
        s.contacts[1].start = '2027-01-01T01:15:00Z';
      },
      'contacts[1].start',
    ],
    [
      'a window ending before it starts',
      (s) => {
        s.contacts[0].end = '2027-01-01T00:30:00Z';
      },
      'contacts[0].end',
    ],
    [
      'a contact after the horizon',
      (s) => {
        s.contacts.push({ start: '2027-01-05T00:00:00Z', end: '2027-01-05T01:00:00Z' });
      },
      'contacts[8].end',
    ],
    [
      'a contact before the epoch',
      (s) => {
        s.contacts[0].start = '2026-12-31T23:00:00Z';
      },
      'contacts[0].start',
    ],
    [
      'a timestamp without zone',
      (s) => {
        s.contacts[3].end = '2027-01-01T19:30:00';
      },
      'contacts[3].end',
    ],
    [
      'an impossible date',
      (s) => {
        s.epoch = '2027-02-30T00:00:00Z';
      },
      'epoch',
    ],
    [
      'negative tolerance',
      (s) => {
        s.tolerance.phaseSeconds = -1e-8;
      },
      'tolerance.phaseSeconds',
    ],
    [
      'probability given in percent',
      (s) => {
        s.tolerance.probability = 95;
      },
      'tolerance.probability',
    ],
    [
      'resolution 0',
      (s) => {
        s.actuator.frequencyResolution = 0;
      },
      'actuator.frequencyResolution',
    ],
    [
      'negative resolution',
      (s) => {
        s.actuator.frequencyResolution = -1e-15;
      },
      'actuator.frequencyResolution',
    ],
    [
      'max step below resolution',
      (s) => {
        s.actuator.maxFrequencyStep = 1e-16;
      },
      'actuator.maxFrequencyStep',
    ],
    [
      'range min above 0',
      (s) => {
        s.actuator.cumulativeFrequencyRange.min = 1e-12;
      },
      'actuator.cumulativeFrequencyRange.min',
    ],
    [
      'range max below 0',
      (s) => {
        s.actuator.cumulativeFrequencyRange.max = -1e-12;
      },
      'actuator.cumulativeFrequencyRange.max',
    ],
    [
      'initial steering outside the range',
      (s) => {
        s.actuator.initialFrequencySteering = 1;
      },
      'actuator.initialFrequencySteering',
    ],
    [
      'phase steps allowed without resolution',
      (s) => {
        s.actuator.phaseSteps = { allowed: true };
      },
      'actuator.phaseSteps.resolution',
    ],
    [
      'phase steps allowed not boolean',
      (s) => {
        s.actuator.phaseSteps = { allowed: 'yes' };
      },
      'actuator.phaseSteps.allowed',
    ],
    [
      'phase max step below resolution',
      (s) => {
        s.actuator.phaseSteps = { allowed: true, resolution: 1e-9, maxStep: 1e-10 };
      },
      'actuator.phaseSteps.maxStep',
    ],
    [
      'negative spacing',
      (s) => {
        s.actuator.minCommandSpacingSeconds = -1;
      },
      'actuator.minCommandSpacingSeconds',
    ],
    [
      'negative latency',
      (s) => {
        s.actuator.maxTimeTagSeconds = -1;
      },
      'actuator.maxTimeTagSeconds',
    ],
    [
      'a manoeuvre into the Earth',
      (s) => {
        s.maneuvers = [{ at: '2027-01-01T10:00:00Z', semiMajorAxisBefore: 26_561_750, semiMajorAxisAfter: 6_000_000 }];
      },
      'maneuvers[0].semiMajorAxisAfter',
    ],
    [
      'a manoeuvre in kilometres',
      (s) => {
        s.maneuvers = [{ at: '2027-01-01T10:00:00Z', semiMajorAxisBefore: 26_561.75, semiMajorAxisAfter: 26_561_750 }];
      },
      'maneuvers[0].semiMajorAxisBefore',
    ],
    [
      'a manoeuvre outside the horizon',
      (s) => {
        s.maneuvers = [{ at: '2027-02-01T10:00:00Z', semiMajorAxisBefore: 26_561_750, semiMajorAxisAfter: 26_562_750 }];
      },
      'maneuvers[0].at',
    ],
    [
      'horizon 0',
      (s) => {
        s.horizonSeconds = 0;
      },
      'horizonSeconds',
    ],
    [
      'horizon over a year',
      (s) => {
        s.horizonSeconds = 400 * 86_400;
      },
      'horizonSeconds',
    ],
    [
      'grid longer than the horizon',
      (s) => {
        s.gridSeconds = 3 * 86_400;
      },
      'gridSeconds',
    ],
    [
      'grid too fine',
      (s) => {
        s.gridSeconds = 0.1;
      },
      'gridSeconds',
    ],
    [
      'frequency in hertz',
      (s) => {
        s.clock.fractionalFrequency = 0.01;
      },
      'clock.fractionalFrequency',
    ],
    [
      'NaN phase',
      (s) => {
        s.clock.phaseSeconds = Number.NaN;
      },
      'clock.phaseSeconds',
    ],
    [
      'negative q1',
      (s) => {
        s.clock.noise.q1 = -1;
      },
      'clock.noise.q1',
    ],
    [
      'empty stability spec',
      (s) => {
        s.clock.noise = { stability: {} };
      },
      'clock.noise.stability',
    ],
    [
      'stability tau 0',
      (s) => {
        s.clock.noise = { stability: { whiteFrequency: { tau: 0, deviation: 1e-12 } } };
      },
      'clock.noise.stability.whiteFrequency.tau',
    ],
    [
      'asymmetric covariance',
      (s) => {
        s.clock.covariance = [
          [1e-18, 1e-24, 0],
          [0, 1e-28, 0],
          [0, 0, 0],
        ];
      },
      'clock.covariance[1][0]',
    ],
    [
      'covariance breaking Cauchy–Schwarz',
      (s) => {
        s.clock.covariance = [
          [1e-18, 1e-20, 0],
          [1e-20, 1e-28, 0],
          [0, 0, 0],
        ];
      },
      'clock.covariance[1][0]',
    ],
    [
      'negative variance',
      (s) => {
        s.clock.covariance = [
          [-1e-18, 0, 0],
          [0, 0, 0],
          [0, 0, 0],
        ];
      },
      'clock.covariance[0][0]',
    ],
    [
      'a 2×2 covariance',
      (s) => {
        s.clock.covariance = [
          [1, 0],
          [0, 1],
        ];
      },
      'clock.covariance',
    ],
    [
      'a short covariance row',
      (s) => {
        s.clock.covariance = [
          [1, 0],
          [0, 1, 0],
          [0, 0, 1],
        ];
      },
      'clock.covariance[0]',
    ],
    [
      'unknown strategy',
      (s) => {
        s.strategy = { method: 'magic' };
      },
      'strategy.method',
    ],
    [
      'deadband threshold above 1',
      (s) => {
        s.strategy = { method: 'deadband', thresholdFraction: 2 };
      },
      'strategy.thresholdFraction',
    ],
    [
      'deadband correction time 0',
      (s) => {
        s.strategy = { method: 'deadband', correctionTimeSeconds: 0 };
      },
      'strategy.correctionTimeSeconds',
    ],
    [
      'optimal decision interval negative',
      (s) => {
        s.strategy = { method: 'optimal', decisionIntervalSeconds: -5 };
      },
      'strategy.decisionIntervalSeconds',
    ],
    [
      'a misspelt field',
      (s) => {
        s.tolerance.phase = 1e-8;
      },
      'tolerance.phase',
    ],
    [
      'contacts not an array',
      (s) => {
        s.contacts = {};
      },
      'contacts',
    ],
    [
      'clock missing',
      (s) => {
        delete s.clock;
      },
      'clock',
    ],
    [
      'name not a string',
      (s) => {
        s.name = 3;
      },
      'name',
    ],
    [
      'negative cost weight',
      (s) => {
        s.costWeights = { command: -1 };
      },
      'costWeights.command',
    ],
  ];
  for (const [what, edit, field] of cases) {
    it(`validateScenario(scenario) rejects ${what} with an InvalidArgumentError naming ${field}`, () => {
      expect(errorFor(edit).argument).toBe(field);
    });
  }

  it('validateScenario(scenario) names the Earth and suggests kilometres in the hint', () => {
    const e = errorFor((s) => {
      s.maneuvers = [{ at: '2027-01-01T10:00:00Z', semiMajorAxisBefore: 26_561.75, semiMajorAxisAfter: 26_561_750 }];
    });
    expect(e.message).toMatch(/inside the Earth.*did you mean/);
  });

  it('validateScenario(scenario) computes the manoeuvre rate change 3GM/(2c²)(1/a0 − 1/a1) ≈ 9.4292e-18 per metre at a = 26 561 750 m (Ashby, PTTI 33, 2001 [V2]; physics-refs §2 [C])', () => {
    const n = validateScenario(
      baseScenario({
        maneuvers: [{ at: '2027-01-01T10:00:00Z', semiMajorAxisBefore: 26_561_750, semiMajorAxisAfter: 26_562_750 }],
      }),
    );
    expect(n.maneuvers[0]!.rateChange / 1000).toBeCloseTo(9.4292e-18, 21);
  });

  it('validateScenario(scenario) uses the scenario constant set for manoeuvres: the GPS interface-spec GM changes the rate by the GM ratio (IS-GPS-200 μ [M] vs IERS 2010 [V2])', () => {
    const maneuvers = [{ at: '2027-01-01T10:00:00Z', semiMajorAxisBefore: 26_561_750, semiMajorAxisAfter: 26_562_750 }];
    const iers = validateScenario(baseScenario({ maneuvers })).maneuvers[0]!.rateChange;
    const gps = validateScenario(baseScenario({ maneuvers, constants: 'gps-icd' })).maneuvers[0]!.rateChange;
    expect(gps / iers).toBeCloseTo(3.986005e14 / 3.986004418e14, 12);
    expect(() => validateScenario(baseScenario({ maneuvers, constants: 'wgs72' }))).toThrow(
      /constants must be one of iers-2010/,
    );
  });
});

describe('noiseToDiffusion', () => {
  it('noiseToDiffusion({stability}) gives q1 = 1e-24 s for σ_y = 1e-12 τ^-½ and q2 = 3.472e-33 /s for RWFM σ_y(1 d) = 1e-14 (physics-refs §11 check values [C])', () => {
    const q = noiseToDiffusion({
      stability: {
        whiteFrequency: { tau: 100, deviation: 1e-13 },
        randomWalkFrequency: { tau: 86_400, deviation: 1e-14 },
      },
    });
    expect(q.q1).toBeCloseTo(1e-24, 36);
    expect(q.q2 / 3.472e-33).toBeCloseTo(1, 3);
    expect(q.q3).toBe(0);
  });

  it('noiseToDiffusion({stability}) inverts HVAR = 11 q3 τ³/120 for the drift noise (Zucca & Tavella 2005 [M], physics-refs §11)', () => {
    const q = noiseToDiffusion({ stability: { randomWalkDrift: { tau: 1000, deviation: 1e-14 } } });
    expect((11 * q.q3 * 1000 ** 3) / 120).toBeCloseTo(1e-28, 40);
  });

  it('noiseToDiffusion(q) rejects a stability point with an unknown field', () => {
    expect(() =>
      noiseToDiffusion({ stability: { whiteFrequency: { tau: 1, deviation: 1e-12, unit: 'x' } } } as never),
    ).toThrow(InvalidArgumentError);
  });
});

export type { SteeringScenario };

describe('validateScenario operations block', () => {
  const ops = {
    estimateIntervalSeconds: 900,
    estimateNoiseSeconds: 3e-10,
    estimateLatencySeconds: 3600,
    replan: 'each-contact',
  };

  it('validateScenario(scenario with operations) keeps interval, noise and latency in seconds, latency 0 and replan each-contact by default', () => {
    expect(validateScenario(baseScenario({ operations: ops as never })).operations).toEqual({
      interval: 900,
      noise: 3e-10,
      latency: 3600,
      replan: 'each-contact',
    });
    expect(
      validateScenario(baseScenario({ operations: { estimateIntervalSeconds: 600, estimateNoiseSeconds: 0 } }))
        .operations,
    ).toEqual({ interval: 600, noise: 0, latency: 0, replan: 'each-contact' });
    expect(validateScenario(baseScenario()).operations).toBeUndefined();
  });

  const bad: [string, Record<string, unknown>, string][] = [
    ['interval 0', { ...ops, estimateIntervalSeconds: 0 }, 'operations.estimateIntervalSeconds'],
    [
      'interval beyond the horizon',
      { ...ops, estimateIntervalSeconds: 3 * 86_400 },
      'operations.estimateIntervalSeconds',
    ],
    ['negative noise', { ...ops, estimateNoiseSeconds: -1e-10 }, 'operations.estimateNoiseSeconds'],
    ['missing noise', { estimateIntervalSeconds: 900 }, 'operations.estimateNoiseSeconds'],
    ['negative latency', { ...ops, estimateLatencySeconds: -1 }, 'operations.estimateLatencySeconds'],
    ['an unknown policy', { ...ops, replan: 'daily' }, 'operations.replan'],
    ['a misspelt field', { ...ops, estimateLatency: 5 }, 'operations.estimateLatency'],
  ];
  for (const [what, value, field] of bad) {
    it(`validateScenario rejects operations with ${what}, naming ${field} in one line`, () => {
      const e = errorFor((s) => {
        s.operations = value;
      });
      expect(e.argument).toBe(field);
      expect(e.message.split('\n')).toHaveLength(1);
    });
  }
});
