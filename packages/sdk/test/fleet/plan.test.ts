import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { type FleetDocument, type FleetPlanJson, fleetPlanToJson, planFleet } from '../../src/fleet/index.js';
import { planSteering, STEERING_CAUTION } from '../../src/steering/index.js';
import { exampleFleet, satellite, secondsOf, smallFleet } from './helpers.js';

/** Each satellite's verdict recomputed with planSteering, its supports from the schedule as its contacts. */
function recomputed(doc: FleetDocument, plan: FleetPlanJson): boolean[] {
  return doc.satellites.map((s) => {
    const contacts = plan.stationSchedule
      .filter((x) => x.satellite === s.id)
      .map(({ start, end }) => ({ start, end }))
      .sort((a, b) => a.start.localeCompare(b.start));
    const { id: _id, passes: _passes, ...rest } = s;
    return planSteering({
      ...rest,
      epoch: doc.epoch,
      horizonSeconds: doc.horizonSeconds,
      gridSeconds: doc.gridSeconds,
      strategy: doc.strategy,
      contacts,
    }).feasible;
  });
}

// A clock 2e-13 fast leaves ±20 ns after 1e5 s (≈ 27.8 h): it needs one support on the first day.
describe('planFleet on hand-made fleets', () => {
  it('planFleet(example) holds the four invented VESPER clocks through two shared stations, with the steering caution', () => {
    const doc = exampleFleet();
    const plan = fleetPlanToJson(planFleet(doc)); // stamps read back as text
    expect(plan.feasible).toBe(true);
    expect(plan.reason).toBeUndefined();
    expect(plan.caution).toBe(STEERING_CAUTION);
    expect(plan.satellites.map((s) => s.id)).toEqual(['VESPER-1', 'VESPER-2', 'VESPER-3', 'VESPER-4']);
    expect(plan.satellites.every((s) => s.commands.length > 0)).toBe(true);
    expect(recomputed(doc, plan)).toEqual([true, true, true, true]);
    expect(Object.keys(plan.satellites[0]!.commands[0]!).sort()).toEqual([
      'actuatorSteps',
      'executeAt',
      'fractionalFrequencyStep',
      'kind',
      'reason',
      'station',
      'uplinkAt',
    ]);
  });

  it('planFleet(doc) gives two satellites that see one station at the same time supports far enough apart (setup included)', () => {
    const doc = smallFleet([satellite('SAT-A', [['ST-A', 3600, 9000]]), satellite('SAT-B', [['ST-A', 3600, 9000]])]);
    const plan = fleetPlanToJson(planFleet(doc)); // stamps read back as text
    expect(plan.feasible).toBe(true);
    const [x, y] = plan.stationSchedule.map((s) => [secondsOf(s.start), secondsOf(s.end)] as const);
    expect(plan.stationSchedule.map((s) => s.satellite).sort()).toEqual(['SAT-A', 'SAT-B']);
    expect(x![1] - x![0]).toBe(600);
    expect(Math.abs(y![0] - x![0])).toBeGreaterThanOrEqual(600 + 600);
  });

  it('planFleet(doc) reports a satellite whose only pass another satellite needs as station-overbooked, naming the station and the holder, and still holds the other', () => {
    const doc = smallFleet([
      satellite('SAT-A', [['ST-A', 3600, 4200]]),
      satellite('SAT-B', [['ST-A', 3600, 4200]], { fractionalFrequency: 3e-13 }),
    ]);
    const plan = fleetPlanToJson(planFleet(doc)); // stamps read back as text
    expect(plan.feasible).toBe(false);
    const [a, b] = plan.satellites;
    // SAT-B drifts faster, so it leaves its band first and gets the support.
    expect(b!.feasible).toBe(true);
    expect(a!.feasible).toBe(false);
    expect(a!.reasonCode).toBe('station-overbooked');
    expect(a!.reason).toContain('station ST-A overbooked 2027-03-01T01:00:00Z–2027-03-01T01:10:00Z (held by SAT-B');
    expect(plan.reason).toBe(
      '1 of 2 satellites cannot be held: SAT-A (station-overbooked); the schedule holds the others as well as it can.',
    );
    expect(plan.stationSchedule).toEqual([
      { station: 'ST-A', satellite: 'SAT-B', start: '2027-03-01T01:00:00Z', end: '2027-03-01T01:10:00Z' },
    ]);
  });

  it('planFleet(doc) reports a satellite with no pass before its offset leaves the band as too-few-passes', () => {
    const doc = smallFleet([satellite('SAT-A', [['ST-B', 150_000, 160_000]])]);
    const plan = fleetPlanToJson(planFleet(doc)); // stamps read back as text
    expect(plan.satellites[0]!.reasonCode).toBe('too-few-passes');
    expect(plan.satellites[0]!.reason).toMatch(/^too few passes: no pass starts before 2027-03-0[12]T/);
    expect(plan.stationSchedule).toEqual([]);
  });

  it("planFleet(doc) reports an actuator that cannot hold the clock (max step below what the drift needs) with the planner's actuator reason", () => {
    const sat = satellite(
      'SAT-A',
      [
        ['ST-A', 3600, 4200],
        ['ST-B', 30_000, 31_000],
        ['ST-A', 60_000, 61_000],
      ],
      { fractionalFrequency: 1e-12 },
    );
    sat.actuator.maxFrequencyStep = 2e-15;
    sat.actuator.cumulativeFrequencyRange = { min: -2e-15, max: 2e-15 };
    const plan = fleetPlanToJson(planFleet(smallFleet([sat]))); // stamps read back as text
    expect(plan.satellites[0]!.feasible).toBe(false);
    expect(['actuator-limit', 'planner', 'no-contact-in-time']).toContain(plan.satellites[0]!.reasonCode);
    expect(
      plan.satellites[0]!.commands.every((c) => Math.abs(c.fractionalFrequencyStep ?? 0) <= 2e-15 * (1 + 1e-12)),
    ).toBe(true);
  });

  it('planFleet(doc) uses no station for a satellite that stays inside its band unsteered', () => {
    const plan = fleetPlanToJson(
      planFleet(smallFleet([satellite('SAT-A', [['ST-A', 3600, 4200]], { fractionalFrequency: 0 })])),
    ); // stamps read back as text
    expect(plan.feasible).toBe(true);
    expect(plan.stationSchedule).toEqual([]);
    expect(plan.satellites[0]!.commands).toEqual([]);
  });

  it('planFleet(doc, options) rejects options that are not an object and bad documents with the field', () => {
    expect(() => planFleet(exampleFleet(), null as unknown as object)).toThrow(InvalidArgumentError);
    expect(() => planFleet({ ...exampleFleet(), gridSeconds: -1 })).toThrow(/gridSeconds/);
  });
});
