import { readFileSync } from 'node:fs';
import Ajv from 'ajv';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { fleetPlanToJson, planFleet, validateFleet } from '../../src/fleet/index.js';
import { predictPasses } from '../../src/orbit/index.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '../../src/time/index.js';

const schema = JSON.parse(readFileSync(new URL('../../schema/fleet.schema.json', import.meta.url), 'utf8')) as object;
const check = new Ajv({ allErrors: true, strict: false, formats: { 'date-time': true } }).compile(schema);
type Doc = Record<string, any>;
const example = (): Doc =>
  JSON.parse(readFileSync(new URL('../../examples/fleet/ashgrove-orbits.json', import.meta.url), 'utf8')) as Doc;
/** The example cut to one day and two satellites, to keep the tests quick. */
const small = (): Doc => {
  const d = example();
  d.horizonSeconds = 86_400;
  d.satellites = d.satellites.slice(0, 2);
  return d;
};

function rejected(doc: unknown): InvalidArgumentError | undefined {
  try {
    validateFleet(doc);
    return undefined;
  } catch (e) {
    if (!(e instanceof InvalidArgumentError)) throw e;
    return e;
  }
}

/** Edits that both the schema and validateFleet reject, with the field validateFleet must name. */
const BOTH_REJECT: [string, (d: Doc) => void, RegExp?][] = [
  [
    'satellites[0].orbit.semiMajorAxisMetres',
    (d) => {
      d.satellites[0].orbit.semiMajorAxisMetres = 28_410;
    },
    /did you mean 28410 km/,
  ],
  [
    'satellites[1].passes',
    (d) => {
      d.satellites[1].passes = [];
    },
  ],
  [
    'satellites[0].orbit.inclinationRadians',
    (d) => {
      d.satellites[0].orbit.inclinationRadians = 58.5;
    },
    /looks like degrees/,
  ],
  [
    'satellites[0].orbit.raanRadians',
    (d) => {
      d.satellites[0].orbit.raanRadians = 160;
    },
    /looks like degrees/,
  ],
  [
    'satellites[0].orbit.eccentricity',
    (d) => {
      d.satellites[0].orbit.eccentricity = 1;
    },
  ],
  [
    'satellites[0].orbit.meanAnomalyDeg',
    (d) => {
      d.satellites[0].orbit.meanAnomalyDeg = 10;
    },
  ],
  [
    'satellites[1].orbit.epoch',
    (d) => {
      d.satellites[1].orbit.epoch = 'yesterday';
    },
  ],
  [
    'stations[0].position.latitudeRadians',
    (d) => {
      d.stations[0].position.latitudeRadians = 41.83;
    },
    /looks like degrees/,
  ],
  [
    'stations[2].position.heightMetres',
    (d) => {
      d.stations[2].position.heightMetres = -20_000;
    },
  ],
  [
    'stations[1].elevationMaskRadians',
    (d) => {
      delete d.stations[1].elevationMaskRadians;
    },
  ],
  [
    'stations[1].position',
    (d) => {
      delete d.stations[1].position;
    },
  ],
  [
    'stations[0].elevationMaskRadians',
    (d) => {
      d.stations[0].elevationMaskRadians = Math.PI / 2;
    },
  ],
];

/** Edits only validateFleet can see. */
const VALIDATOR_ONLY: [string, (d: Doc) => void][] = [
  [
    'stations[2].position',
    (d) => {
      delete d.stations[2].position;
      delete d.stations[2].elevationMaskRadians;
    },
  ],
  [
    'satellites[0].orbit.epoch',
    (d) => {
      d.satellites[0].orbit.epoch = '2026-01-01T00:00:00Z';
    },
  ],
  [
    'satellites[1].orbit.eccentricity',
    (d) => {
      d.satellites[1].orbit.semiMajorAxisMetres = 7_000_000;
      d.satellites[1].orbit.eccentricity = 0.2;
    },
  ],
];

describe('fleet documents with computed passes (orbit + station positions)', () => {
  it('validateFleet(ashgrove-orbits.json) accepts the invented example, which the schema also accepts, and computes its passes', () => {
    const d = example();
    expect(check(d), JSON.stringify(check.errors)).toBe(true);
    const fleet = validateFleet(d);
    for (const s of fleet.satellites) {
      expect(s.computedPasses!.length).toBeGreaterThan(5);
      expect(s.passes.map((p) => [p.station, p.start, p.end])).toEqual(
        s.computedPasses!.filter((p) => p.usable).map((p) => [p.station, p.start, p.end]),
      );
    }
  });

  it('validateFleet(doc) gives the passes of predictPasses over the horizon, rounded inwards to the millisecond', () => {
    const d = small();
    const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
    const o = d.satellites[0].orbit;
    const direct = predictPasses(
      {
        epoch: ts.parseIso(o.epoch, 'UTC'),
        elements: {
          semiMajorAxis: o.semiMajorAxisMetres,
          eccentricity: o.eccentricity,
          inclination: o.inclinationRadians,
          raan: o.raanRadians,
          argumentOfPerigee: o.argumentOfPerigeeRadians,
          meanAnomaly: o.meanAnomalyRadians,
        },
      },
      d.stations.map((s: Doc) => ({
        position: {
          latitude: s.position.latitudeRadians,
          longitude: s.position.longitudeRadians,
          height: s.position.heightMetres,
        },
        elevationMask: s.elevationMaskRadians,
      })),
      ts.parseIso(d.epoch, 'UTC'),
      d.horizonSeconds,
      { timeScales: ts },
    );
    const flat = direct.passes
      .flatMap((ps, station) => ps.map((p) => ({ station, ...p })))
      .sort((x, y) => x.start - y.start || x.station - y.station);
    const computed = validateFleet(d).satellites[0]!.computedPasses!;
    expect(computed.length).toBe(flat.length);
    for (const [k, p] of computed.entries()) {
      const q = flat[k]!;
      expect(p.station).toBe(q.station);
      expect(p.start - q.start).toBeGreaterThanOrEqual(0);
      expect(p.start - q.start).toBeLessThan(1e-3);
      expect(q.end - p.end).toBeGreaterThanOrEqual(0);
      expect(q.end - p.end).toBeLessThan(1e-3);
    }
  });

  it("validateFleet(doc) keeps a computed pass shorter than its station's support as unusable and does not plan with it", () => {
    const d = small();
    // A support between the shortest and the longest pass duration at station 2 leaves some passes too short.
    const lengths = validateFleet(d)
      .satellites.flatMap((s) => s.computedPasses!)
      .filter((p) => p.station === 2 && !p.clippedAtStart && !p.clippedAtEnd)
      .map((p) => p.end - p.start);
    d.stations[2].supportSeconds = Math.round((Math.min(...lengths) + Math.max(...lengths)) / 2);
    const fleet = validateFleet(d);
    const all = fleet.satellites.flatMap((s) => s.computedPasses!);
    const short = all.filter((p) => !p.usable);
    expect(short.length).toBeGreaterThan(0);
    for (const p of short) expect(p.end - p.start).toBeLessThan(fleet.stations[p.station]!.support);
    for (const s of fleet.satellites) expect(s.passes.length).toBe(s.computedPasses!.filter((p) => p.usable).length);
  });

  for (const [field, edit, hint] of BOTH_REJECT) {
    it(`validateFleet(doc) and the schema both reject a bad ${field}, the error naming ${field}`, () => {
      const d = small();
      edit(d);
      expect(check(d)).toBe(false);
      const e = rejected(d);
      expect(e?.argument).toBe(field);
      if (hint) expect(e!.message).toMatch(hint);
    });
  }

  for (const [field, edit] of VALIDATOR_ONLY) {
    it(`validateFleet(doc) rejects ${field} (a rule the schema cannot express), naming the field`, () => {
      const d = small();
      edit(d);
      expect(check(d)).toBe(true);
      expect(rejected(d)?.argument).toBe(field);
    });
  }

  it('planFleet(ashgrove-orbits.json) reports every computed pass with its maximum elevation and books supports only inside usable ones', () => {
    const d = example();
    const plan = fleetPlanToJson(planFleet(d)); // stamps read back as text
    expect(plan.feasible).toBe(true);
    for (const s of plan.satellites) {
      expect(s.computedPasses!.length).toBeGreaterThan(5);
      for (const p of s.computedPasses!) {
        expect(p.maxElevationRadians).toBeGreaterThanOrEqual(
          d.stations.find((x: Doc) => x.id === p.station).elevationMaskRadians,
        );
        expect(p.maxElevationRadians).toBeLessThanOrEqual(Math.PI / 2);
        expect(Date.parse(p.maxElevationAt)).toBeGreaterThanOrEqual(Date.parse(p.start));
        expect(Date.parse(p.maxElevationAt)).toBeLessThanOrEqual(Date.parse(p.end));
      }
    }
    for (const x of plan.stationSchedule) {
      const passes = plan.satellites.find((s) => s.id === x.satellite)!.computedPasses!;
      expect(
        passes.some(
          (p) =>
            p.usable &&
            p.station === x.station &&
            Date.parse(p.start) <= Date.parse(x.start) &&
            Date.parse(x.end) <= Date.parse(p.end),
        ),
      ).toBe(true);
    }
  });
});
