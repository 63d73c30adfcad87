import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError, OutOfDomainError } from '../../src/errors.js';
import {
  planSteering,
  predictSteering,
  type SteeringScenario,
  simulatePlan,
  steeringCommandsFromJson,
  steeringCost,
  steeringPlanToJson,
  validateScenario,
} from '../../src/steering/index.js';
import { createTimeScales, parseLeapSecondsList } from '../../src/time/index.js';
import { baseScenario, example } from './helpers.js';

const FIXTURE = new URL('../../../../test/fixtures/time/leap-seconds-test.list', import.meta.url);
/** Test table: the published steps with an invented expiry 2036-06-28 (test/fixtures/time/SOURCE.md). */
const testScales = createTimeScales(parseLeapSecondsList(readFileSync(FIXTURE, 'utf8'), 'leap-seconds-test.list'));

/** Elapsed seconds as POSIX arithmetic gives them (leap seconds ignored): the naive reference. */
const naiveSeconds = (from: string, to: string): number => (Date.parse(to) - Date.parse(from)) / 1000;

/** A two-day scenario across the leap second at the end of 2016-12-31 (TAI − UTC 36 → 37 s). */
function leapScenario(): SteeringScenario {
  return baseScenario({
    epoch: '2016-12-31T12:00:00Z',
    contacts: [
      { start: '2016-12-31T18:00:00Z', end: '2016-12-31T18:30:00Z' },
      { start: '2016-12-31T23:59:60Z', end: '2017-01-01T00:30:00Z' },
      { start: '2017-01-01T06:00:00Z', end: '2017-01-01T06:30:00Z' },
      { start: '2017-01-01T12:00:00Z', end: '2017-01-01T12:30:00Z' },
      { start: '2017-01-02T11:00:00Z', end: '2017-01-02T11:59:59Z' },
    ],
  });
}

/** A bundled example moved to 2031, after the bundled table's validity (2027-06-28). */
function exampleIn2031(): SteeringScenario {
  return JSON.parse(JSON.stringify(example('orin-3-meo')).replace(/2027-02-/g, '2031-04-')) as SteeringScenario;
}

function thrown(f: () => unknown): unknown {
  try {
    f();
  } catch (e) {
    return e;
  }
  throw new Error('expected a throw');
}

describe('steering times across a leap second (IERS Bulletin C 52: positive leap second at the end of 2016-12-31, TAI − UTC 36 → 37 s; as in the IERS/NIST leap-seconds.list [V2])', () => {
  it('validateScenario(scenario) places a contact after the leap second 1 s later than POSIX arithmetic does', () => {
    const s = leapScenario();
    const n = validateScenario(s);
    const stamp = s.contacts[2]!.start;
    expect(naiveSeconds(s.epoch, stamp)).toBe(64_800);
    expect(n.windows[2]!.start).toBe(64_801);
    expect(n.windows[2]!.start - naiveSeconds(s.epoch, stamp)).toBe(1);
  });

  it('validateScenario(scenario) accepts 23:59:60Z inside the leap second, 1 s after 23:59:59Z', () => {
    const n = validateScenario(leapScenario());
    expect(n.windows[1]!.start).toBe(43_200);
    expect(n.windows[0]!.end).toBe(23_400);
  });

  it('validateScenario(scenario) lets the horizon end at 2017-01-02T11:59:59Z: 172 800 elapsed seconds include the leap second', () => {
    const n = validateScenario(leapScenario());
    expect(n.windows[4]!.end).toBe(2 * 86_400);
    const s = leapScenario();
    s.contacts[4]!.end = '2017-01-02T12:00:00Z';
    expect((thrown(() => validateScenario(s)) as InvalidArgumentError).argument).toBe('contacts[4].end');
  });

  it('planSteering(scenario) prints a command executing inside the leap second as 23:59:60Z and one after it at the manoeuvre stamp', () => {
    const s = leapScenario();
    s.maneuvers = [
      { at: '2016-12-31T23:59:60Z', semiMajorAxisBefore: 26_561_750, semiMajorAxisAfter: 26_571_750 },
      { at: '2017-01-01T06:10:00Z', semiMajorAxisBefore: 26_571_750, semiMajorAxisAfter: 26_561_750 },
    ];
    const plan = planSteering(s);
    const json = steeringPlanToJson(plan);
    for (const m of s.maneuvers)
      expect(
        json.commands.some((c) => c.executeAt === m.at),
        m.at,
      ).toBe(true);
    // The stamps round-trip: re-reading the plan's JSON commands gives the same prediction.
    expect(predictSteering(s, steeringCommandsFromJson(json.commands)).steered.phaseSeconds).toEqual(
      plan.predicted.steered.phaseSeconds,
    );
  });

  it('planSteering(scenario, {strategy: "none"}) walks off y0·t with t counted in elapsed seconds across the leap second (physics-refs §12 walk-off [C])', () => {
    const s = leapScenario();
    s.clock = { phaseSeconds: 0, fractionalFrequency: 1e-13, driftPerSecond: 0, noise: { q1: 0, q2: 0, q3: 0 } };
    const plan = planSteering(s, { strategy: 'none' });
    const end = plan.predicted.t.length - 1;
    expect(plan.predicted.t[end]).toBe(172_800);
    expect(plan.predicted.unsteered.phaseSeconds[end]).toBeCloseTo(1e-13 * 172_800, 22);
  });
});

describe('steering stamps and the leap-second table', () => {
  it('planSteering(scenario) dated after the bundled table (2027-06-28) throws OutOfDomainError naming the field and how to pass a current table', () => {
    const e = thrown(() => planSteering(exampleIn2031()));
    expect(e).toBeInstanceOf(OutOfDomainError);
    expect((e as OutOfDomainError).argument).toBe('epoch');
    expect((e as OutOfDomainError).validTo).toMatch(/^2027-06-28/);
    expect((e as Error).message).toMatch(/only known complete until 2027-06-28/);
    expect((e as Error).message).toMatch(/timeScales: createTimeScales\(parseLeapSecondsList\(text\)\)/);
    expect((e as Error).message).toMatch(/--leap-seconds <file>/);
  });

  it('planSteering(scenario, {timeScales}) plans a 2031 scenario with a table that covers it, printing 2031 stamps', () => {
    const s = exampleIn2031();
    const plan = planSteering(s, { timeScales: testScales });
    expect(plan.feasible).toBe(true);
    expect(plan.commands.length).toBeGreaterThan(0);
    for (const c of steeringPlanToJson(plan, { timeScales: testScales }).commands)
      expect(c.executeAt).toMatch(/^2031-04-\d\dT\d\d:\d\d:\d\d(\.\d{3})?Z$/);
    // Same elapsed times as the 2027 original (no leap second in either week), so the same schedule shape.
    const original = planSteering(example('orin-3-meo'));
    expect(plan.commands.map((c) => c.actuatorSteps)).toEqual(original.commands.map((c) => c.actuatorSteps));
  });

  it('simulatePlan, steeringCost and predictSteering take the same timeScales option and throw OutOfDomainError without it', () => {
    const s = exampleIn2031();
    const plan = planSteering(s, { timeScales: testScales });
    expect(steeringCost(s, plan, { timeScales: testScales }).total).toBeCloseTo(plan.metrics.expectedCost, 12);
    expect(predictSteering(s, plan.commands, { timeScales: testScales }).withinTolerance).toBe(true);
    expect(simulatePlan(s, plan, { runs: 5, seed: 1, timeScales: testScales }).runs).toBe(5);
    expect(() => steeringCost(s, plan)).toThrow(OutOfDomainError);
    expect(() => predictSteering(s, plan.commands)).toThrow(OutOfDomainError);
    expect(() => simulatePlan(s, plan, { runs: 5 })).toThrow(OutOfDomainError);
    expect(() => validateScenario(s)).toThrow(OutOfDomainError);
  });

  it('validateScenario(scenario) throws OutOfDomainError on horizonSeconds when the horizon runs past the table', () => {
    const s = baseScenario({ epoch: '2027-06-20T00:00:00Z', horizonSeconds: 10 * 86_400, contacts: [] });
    const e = thrown(() => validateScenario(s)) as OutOfDomainError;
    expect(e).toBeInstanceOf(OutOfDomainError);
    expect(e.argument).toBe('horizonSeconds');
    expect(e.message).toMatch(/the end of the horizon \(epoch \+ 864000 s\) falls after it; .*parseLeapSecondsList/);
    expect(() => validateScenario(s, { timeScales: testScales })).not.toThrow();
  });

  it('validateScenario(scenario) throws OutOfDomainError naming a contact stamp beyond the table', () => {
    const s = baseScenario({
      epoch: '2027-06-26T00:00:00Z',
      horizonSeconds: 86_400,
      contacts: [{ start: '2027-06-29T00:00:00Z', end: '2027-06-29T01:00:00Z' }],
    });
    const e = thrown(() => validateScenario(s)) as OutOfDomainError;
    expect(e).toBeInstanceOf(OutOfDomainError);
    expect(e.argument).toBe('contacts[0].start');
  });

  it('validateScenario(scenario) throws OutOfDomainError for an epoch before UTC with whole leap seconds (1972-01-01, ITU-R TF.460 [M])', () => {
    const e = thrown(() =>
      validateScenario(baseScenario({ epoch: '1969-07-20T20:17:00Z', contacts: [] })),
    ) as OutOfDomainError;
    expect(e).toBeInstanceOf(OutOfDomainError);
    expect(e.argument).toBe('epoch');
    expect(e.validFrom).toMatch(/^1972-01-01/);
    expect(e.message).toMatch(/whole leap seconds/);
  });

  it('validateScenario(scenario) rejects 23:59:60 where no leap second exists, naming the field', () => {
    const s = baseScenario();
    s.contacts[0]!.start = '2027-01-01T00:59:60Z';
    const e = thrown(() => validateScenario(s)) as InvalidArgumentError;
    expect(e).toBeInstanceOf(InvalidArgumentError);
    expect(e.argument).toBe('contacts[0].start');
    s.contacts[0]!.start = '2026-12-31T23:59:60Z';
    expect((thrown(() => validateScenario(s)) as InvalidArgumentError).argument).toBe('contacts[0].start');
  });

  it('validateScenario(scenario) reads the reduced form hh:mm, zone offsets and fractional seconds (ISO 8601)', () => {
    const s = baseScenario();
    s.contacts[0] = { start: '2027-01-01T01:00Z', end: '2027-01-01T03:30:00.250+02:00' };
    const n = validateScenario(s);
    expect(n.windows[0]).toEqual({ start: 3600, end: 5400.25 });
  });

  it('validateScenario(scenario, options) rejects options that are not an object and a timeScales that is not one', () => {
    expect((thrown(() => validateScenario(baseScenario(), null as never)) as InvalidArgumentError).argument).toBe(
      'options',
    );
    expect(
      (thrown(() => validateScenario(baseScenario(), { timeScales: {} as never })) as InvalidArgumentError).argument,
    ).toBe('options.timeScales');
    expect((thrown(() => planSteering(baseScenario(), 'fast' as never)) as InvalidArgumentError).argument).toBe(
      'options',
    );
    expect(
      (
        thrown(() =>
          simulatePlan(baseScenario(), { commands: [] }, { runs: 5, timeScales: 1 as never }),
        ) as InvalidArgumentError
      ).argument,
    ).toBe('options.timeScales');
  });
});
