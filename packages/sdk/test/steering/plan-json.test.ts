import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { type FleetDocument, fleetPlanToJson, planFleet } from '../../src/fleet/index.js';
import {
  planSteering,
  predictSteering,
  replanSteering,
  type SteeringMethod,
  type SteeringScenario,
  steeringCommandsFromJson,
  steeringPlanToJson,
  validateScenario,
} from '../../src/steering/index.js';
import { bundledTimeScales } from '../../src/time/utc-text.js';
import { baseScenario, example } from './helpers.js';

/**
 * Regression pins [C]: byte length and SHA-256 of JSON.stringify of each plan as the SDK returned it before the plan
 * object carried Instants (commit fb35a1e, when the plan object was its JSON form), computed with node:crypto on that
 * build. The JSON form must keep these bytes: it is the CLI's and the elements' contract. The one field added since,
 * `epoch` (second, after `feasible`), is taken out before hashing and checked on its own.
 */
const BEFORE: Readonly<Record<string, { bytes: number; sha256: string }>> = {
  'orin-3-meo optimal': { bytes: 62401, sha256: '3b75442ece332d811283f00090b66969e477cc3d29ea2d2d2cf58b4c4e7df6a8' },
  'orin-3-meo deadband': { bytes: 62163, sha256: '46bfc4ab883558c069d6030be2b6669a5fb37db1cc03eb9fed703336e2d8643d' },
  'orin-3-meo none': { bytes: 59489, sha256: '91bc06c18c881cea36816dd97406d05ff26794444b65ab2771bd61b833bd68ee' },
  'halcyr-g1-geo optimal': { bytes: 44931, sha256: '04955c0712f3ae50bfc86cafafcda6bb82a1350591f8c622a1ec37cb0cec664a' },
  'halcyr-g1-geo deadband': {
    bytes: 42620,
    sha256: 'ae1af008c3a61bbbcda49a55e21fe0c1633a82879ad1721ea76d0014e4d5f535',
  },
  'halcyr-g1-geo none': { bytes: 37440, sha256: 'db8b9b53ae29dfffed85e54c8e9d0d04b33dd9cad154df5afde4fb524e60a583' },
  'vesper-constellation': { bytes: 248837, sha256: '073638372cc1fd70fe0639adf83cacfda58a615da6aaa2b6eee3daf36ad9f630' },
  'ashgrove-orbits': { bytes: 125962, sha256: '1004a641f00965c40d8f1f94546e65f7439ef145ad0ea980d3949bbedf7b75b1' },
};

const pin = (text: string) => ({
  bytes: Buffer.byteLength(text),
  sha256: createHash('sha256').update(text).digest('hex'),
});

const fleetExample = (name: string): FleetDocument =>
  JSON.parse(readFileSync(new URL(`../../examples/fleet/${name}.json`, import.meta.url), 'utf8')) as FleetDocument;

const UTC = bundledTimeScales();
const utc = (text: string) => UTC.parseIso(text, 'UTC');

/**
 * A scenario across the leap second at the end of 2016 (IERS Bulletin C 52 [M]): a contact opens at 23:59:60 and a
 * manoeuvre inside the leap second gets a time-tagged command there (as in time.test.ts).
 */
function leapScenario(): SteeringScenario {
  const s = baseScenario({
    epoch: '2016-12-31T12:00:00Z',
    contacts: [
      { start: '2016-12-31T18:00:00Z', end: '2016-12-31T18:30:00Z' },
      { start: '2016-12-31T23:59:60Z', end: '2017-01-01T00:30:00Z' },
      { start: '2017-01-01T06:00:00Z', end: '2017-01-01T06:30:00Z' },
      { start: '2017-01-01T12:00:00Z', end: '2017-01-01T12:30:00Z' },
      { start: '2017-01-02T11:00:00Z', end: '2017-01-02T11:59:59Z' },
    ],
  });
  s.maneuvers = [{ at: '2016-12-31T23:59:60Z', semiMajorAxisBefore: 26_561_750, semiMajorAxisAfter: 26_571_750 }];
  return s;
}

describe('steeringPlanToJson and fleetPlanToJson', () => {
  for (const name of ['orin-3-meo', 'halcyr-g1-geo'] as const) {
    for (const strategy of ['optimal', 'deadband', 'none'] as SteeringMethod[]) {
      it(`steeringPlanToJson(planSteering(${name}, ${strategy})) prints the scenario epoch, then the bytes the plan printed before it carried Instants`, () => {
        const scenario = example(name);
        const { epoch, ...rest } = steeringPlanToJson(planSteering(scenario, { strategy }));
        expect(utc(epoch).equals(utc(scenario.epoch))).toBe(true);
        expect(epoch).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(\.\d{3})?Z$/);
        expect(pin(JSON.stringify(rest))).toEqual(BEFORE[`${name} ${strategy}`]);
      });
    }
  }

  for (const name of ['vesper-constellation', 'ashgrove-orbits']) {
    it(`fleetPlanToJson(planFleet(${name})) prints the fleet epoch, then the bytes the fleet plan printed before it carried Instants`, () => {
      const document = fleetExample(name);
      const { epoch, ...rest } = fleetPlanToJson(planFleet(document));
      expect(utc(epoch).equals(utc(document.epoch))).toBe(true);
      expect(pin(JSON.stringify(rest))).toEqual(BEFORE[name]);
    });
  }

  it('planSteering(orin-3-meo) carries the scenario epoch and command Instants equal to epoch + their seconds (1e-15 s)', () => {
    const scenario = example('orin-3-meo');
    const plan = planSteering(scenario);
    expect(plan.epoch.equals(utc(scenario.epoch))).toBe(true);
    const json = steeringPlanToJson(plan);
    // The manoeuvre-cancelling command executes exactly at the manoeuvre stamp (a whole second of UTC).
    const maneuver = utc(scenario.maneuvers![0]!.at);
    expect(plan.commands.some((c) => c.executeAt.equals(maneuver, 1e-15))).toBe(true);
    for (const [i, c] of plan.commands.entries()) {
      const printed = json.commands[i]!;
      // Seconds since the epoch by Date.parse of the printed stamp (no leap second in this week): within its 0.5 ms rounding.
      const seconds = (Date.parse(printed.executeAt) - Date.parse(scenario.epoch)) / 1000;
      expect(Math.abs(c.executeAt.secondsSince(plan.epoch) - seconds)).toBeLessThanOrEqual(5e-4);
      expect(c.executeAt.equals(plan.epoch.plus(c.executeAt.secondsSince(plan.epoch)), 1e-15)).toBe(true);
    }
  });

  it('steeringPlanToJson(plan) prints a command inside the leap second as 23:59:60Z, and steeringCommandsFromJson reads it back to the same Instant', () => {
    const s = leapScenario();
    const plan = planSteering(s);
    const json = steeringPlanToJson(plan);
    const inLeap = json.commands.findIndex((c) => c.executeAt === '2016-12-31T23:59:60Z');
    expect(inLeap).toBeGreaterThanOrEqual(0);
    const instant = plan.commands[inLeap]!.executeAt;
    // 23:59:60 is one SI second after 23:59:59 and one before 00:00:00 (the 2016 leap second, IERS Bulletin C 52 [M]).
    expect(instant.secondsSince(utc('2016-12-31T23:59:59Z'))).toBe(1);
    expect(utc('2017-01-01T00:00:00Z').secondsSince(instant)).toBe(1);
    // 12:00:00 → 23:59:59 is 43 199 s; the leap second makes 23:59:60 43 200 elapsed seconds after the epoch.
    expect(instant.secondsSince(plan.epoch)).toBe(43_200);
    const read = steeringCommandsFromJson(json.commands);
    expect(read[inLeap]!.executeAt.equals(instant, 1e-15)).toBe(true);
    expect(predictSteering(s, read).steered.phaseSeconds).toEqual(plan.predicted.steered.phaseSeconds);
  });

  it('steeringPlanToJson(revised plan) keeps the revision after the plan fields, its commands as ISO 8601 text', () => {
    const s = example('orin-3-meo');
    const plan = planSteering(s);
    const revised = replanSteering(s, plan, [{ tSeconds: 20_000, phaseSeconds: 4e-9, sigmaSeconds: 3e-10 }], 61_200);
    expect(revised.epoch.equals(plan.epoch)).toBe(true);
    // Relative times count from the plan's epoch: the grid starts at now, and so does the settled-after time at the latest.
    expect(revised.predicted.t[0]).toBe(61_200);
    expect(revised.metrics.settledAfterSeconds).not.toBeNull();
    expect(revised.metrics.settledAfterSeconds!).toBeGreaterThanOrEqual(61_200);
    const json = steeringPlanToJson(revised);
    expect(Object.keys(json).slice(0, 6)).toEqual(['feasible', 'epoch', 'commands', 'predicted', 'metrics', 'caution']);
    expect(Object.keys(json).at(-1)).toBe('revision');
    expect(Object.keys(json.revision)).toEqual(['nowSeconds', 'estimatesUsed', 'state', 'executed', 'superseded']);
    const all = [...json.revision.executed, ...json.revision.superseded];
    expect(all.map((c) => c.executeAt).sort()).toEqual(
      steeringPlanToJson(plan)
        .commands.map((c) => c.executeAt)
        .sort(),
    );
  });

  it('fleetPlanToJson(planFleet(doc)) prints supports at the Instants of the plan, whose epoch is the fleet epoch', () => {
    const doc = fleetExample('vesper-constellation');
    const plan = planFleet(doc);
    expect(plan.epoch.equals(utc(doc.epoch))).toBe(true);
    const json = fleetPlanToJson(plan);
    for (const [i, x] of plan.stationSchedule.entries()) {
      const printed = json.stationSchedule[i]!;
      // Supports start on a whole millisecond, so the printed stamp reads back to the same instant.
      expect(utc(printed.start).equals(x.start, 1e-6)).toBe(true);
      const station = doc.stations.find((st) => st.id === x.station)!;
      expect(x.end.secondsSince(x.start)).toBeCloseTo(station.supportSeconds, 9);
    }
  });

  it('steeringPlanToJson(damaged plan) names the field, the value and the expected form', () => {
    const plan = planSteering(example('orin-3-meo'));
    const damaged = { ...plan, commands: [{ ...plan.commands[0]!, executeAt: '2027-02-08T05:10:00Z' as never }] };
    const e = (() => {
      try {
        steeringPlanToJson(damaged);
      } catch (error) {
        return error;
      }
      return undefined;
    })();
    expect(e).toBeInstanceOf(InvalidArgumentError);
    expect((e as InvalidArgumentError).argument).toBe('plan.commands[0].executeAt');
    expect((e as Error).message).toMatch(/an Instant/);
    expect(() => steeringPlanToJson({ ...plan, metrics: { ...plan.metrics, expectedCost: Number.NaN } })).toThrow(
      /plan\.metrics\.expectedCost/,
    );
    expect(() => steeringPlanToJson(null as never)).toThrow(InvalidArgumentError);
    expect(() =>
      fleetPlanToJson({ ...planFleet(fleetExample('vesper-constellation')), stationSchedule: [1] } as never),
    ).toThrow(/plan\.stationSchedule\[0\]/);
  });

  it('steeringCommandsFromJson(json) rejects a bad stamp, kind or step naming the field, and reads leap-free stamps to the millisecond', () => {
    const good = {
      uplinkAt: '2027-01-01T01:00:00Z',
      executeAt: '2027-01-01T01:00:00.250Z',
      kind: 'frequency',
      fractionalFrequencyStep: 1e-15,
      actuatorSteps: 1,
      reason: 'test',
    };
    const [c] = steeringCommandsFromJson([good]);
    expect(c!.executeAt.secondsSince(c!.uplinkAt)).toBeCloseTo(0.25, 12);
    expect(c!.executeAt.equals(validateScenario(baseScenario()).epoch.plus(3600.25), 1e-12)).toBe(true);
    const argument = (json: unknown, field?: string): string => {
      try {
        steeringCommandsFromJson(json, field ? { field } : {});
      } catch (error) {
        if (error instanceof InvalidArgumentError) return error.argument;
        throw error;
      }
      return 'no error';
    };
    expect(argument({})).toBe('commands');
    expect(argument([{ ...good, executeAt: 'soon' }])).toBe('commands[0].executeAt');
    expect(argument([good, { ...good, kind: 'warp' }])).toBe('commands[1].kind');
    expect(argument([{ ...good, fractionalFrequencyStep: undefined }])).toBe('commands[0].fractionalFrequencyStep');
    expect(argument([{ ...good, kind: 'phase' }])).toBe('commands[0].phaseStepSeconds');
    expect(argument([{ ...good, actuatorSteps: 1.5 }], 'plan.commands')).toBe('plan.commands[0].actuatorSteps');
  });
});
