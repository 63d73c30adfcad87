import { readFileSync } from 'node:fs';
import Ajv from 'ajv';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { type FleetDocument, validateFleet } from '../../src/fleet/index.js';
import { exampleFleet, iso, satellite, smallFleet } from './helpers.js';

const schema = JSON.parse(readFileSync(new URL('../../schema/fleet.schema.json', import.meta.url), 'utf8')) as object;
// `format: date-time` declared known (the schema's own pattern checks stamps) so ajv does not log.
const ajv = new Ajv({ allErrors: true, strict: false, formats: { 'date-time': true } });
const check = ajv.compile(schema);

type Doc = Record<string, any>;

/** The field path validateFleet names, or undefined when it accepts the document. */
function rejectedField(doc: unknown): string | undefined {
  try {
    validateFleet(doc);
    return undefined;
  } catch (e) {
    if (!(e instanceof InvalidArgumentError)) throw e;
    expect(e.message).not.toContain('\n');
    return e.argument;
  }
}

const valid = (): Doc =>
  smallFleet([
    satellite('SAT-A', [
      ['ST-A', 3600, 7200],
      ['ST-B', 40_000, 42_000],
    ]),
    satellite('SAT-B', [['ST-A', 5000, 9000]]),
  ]) as Doc;

/** Edits that both the schema and validateFleet reject, with the field validateFleet must name. */
const BOTH_REJECT: [string, (d: Doc) => void][] = [
  [
    'stations',
    (d) => {
      d.stations = [];
    },
  ],
  [
    'stations[0].setupSeconds',
    (d) => {
      d.stations[0].setupSeconds = -1;
    },
  ],
  [
    'stations[1].supportSeconds',
    (d) => {
      d.stations[1].supportSeconds = 0;
    },
  ],
  [
    'stations[0].id',
    (d) => {
      d.stations[0].id = '';
    },
  ],
  [
    'stations[0].colour',
    (d) => {
      d.stations[0].colour = 'red';
    },
  ],
  [
    'satellites',
    (d) => {
      d.satellites = [];
    },
  ],
  [
    'satellites[1].id',
    (d) => {
      d.satellites[1].id = 7;
    },
  ],
  [
    'satellites[0].tolerance.phaseSeconds',
    (d) => {
      d.satellites[0].tolerance.phaseSeconds = -1e-9;
    },
  ],
  [
    'satellites[1].actuator.frequencyResolution',
    (d) => {
      d.satellites[1].actuator.frequencyResolution = 0;
    },
  ],
  [
    'satellites[0].contacts',
    (d) => {
      d.satellites[0].contacts = [];
    },
  ],
  [
    'satellites[1].passes',
    (d) => {
      delete d.satellites[1].passes;
    },
  ],
  [
    'satellites[0].passes[1].start',
    (d) => {
      d.satellites[0].passes[1].start = 'tomorrow';
    },
  ],
  [
    'satellites[0].passes[0].antenna',
    (d) => {
      d.satellites[0].passes[0].antenna = 2;
    },
  ],
  [
    'strategy.method',
    (d) => {
      d.strategy = { method: 'magic' };
    },
  ],
  [
    'horizonSeconds',
    (d) => {
      d.horizonSeconds = 0;
    },
  ],
  [
    'contacts',
    (d) => {
      d.contacts = [];
    },
  ],
];

/** Edits only validateFleet can see (references between fields, times against the horizon). */
const VALIDATOR_ONLY: [string, (d: Doc) => void][] = [
  [
    'satellites[1].passes[0].station',
    (d) => {
      d.satellites[1].passes[0].station = 'ST-NOWHERE';
    },
  ],
  [
    'satellites[0].passes[0].end',
    (d) => {
      d.satellites[0].passes[0].end = d.satellites[0].passes[0].start;
    },
  ],
  [
    'satellites[0].passes[1].end',
    (d) => {
      d.satellites[0].passes[1].end = iso(40_000 + 100);
    },
  ],
  [
    'satellites[1].passes[0].end',
    (d) => {
      d.satellites[1].passes[0].end = iso(3 * 86_400);
    },
  ],
  [
    'satellites[1].id',
    (d) => {
      d.satellites[1].id = 'SAT-A';
    },
  ],
  [
    'stations[1].id',
    (d) => {
      d.stations[1].id = 'ST-A';
    },
  ],
];

describe('validateFleet and schema/fleet.schema.json (JSON Schema draft-07, checked with ajv)', () => {
  it('validateFleet(example) accepts the bundled invented fleet, which the schema also accepts', () => {
    const doc = exampleFleet();
    expect(check(doc), JSON.stringify(check.errors)).toBe(true);
    const fleet = validateFleet(doc);
    expect(fleet.satellites.map((s) => s.id)).toEqual(['VESPER-1', 'VESPER-2', 'VESPER-3', 'VESPER-4']);
    expect(fleet.stations.map((s) => s.id)).toEqual(['HARROWMERE', 'CALLOWAY-RIDGE']);
    expect(fleet.horizon).toBe(604_800);
  });

  it('validateFleet(doc) converts passes to seconds since the epoch, sorted by start', () => {
    const d = valid();
    d.satellites[0].passes.reverse();
    const fleet = validateFleet(d);
    expect(fleet.satellites[0]!.passes.map((p) => [p.station, p.start, p.end, p.index])).toEqual([
      [0, 3600, 7200, 1],
      [1, 40_000, 42_000, 0],
    ]);
  });

  for (const [field, edit] of BOTH_REJECT) {
    it(`validateFleet(doc) and the schema both reject a bad ${field}, the error naming ${field}`, () => {
      const d = valid();
      edit(d);
      expect(check(d)).toBe(false);
      expect(rejectedField(d)).toBe(field);
    });
  }

  for (const [field, edit] of VALIDATOR_ONLY) {
    it(`validateFleet(doc) rejects ${field} (a rule the schema cannot express), naming the field`, () => {
      const d = valid();
      edit(d);
      expect(check(d)).toBe(true);
      expect(rejectedField(d)).toBe(field);
    });
  }

  it('validateFleet(doc) agrees with the schema on generated documents: valid ones pass both, one schema-visible fault fails both (fast-check, seed 20261203)', () => {
    const docArb = fc
      .record({
        nSat: fc.integer({ min: 1, max: 4 }),
        nStation: fc.integer({ min: 1, max: 3 }),
        passStarts: fc.array(fc.integer({ min: 0, max: 160_000 }), { minLength: 0, maxLength: 5 }),
        passLength: fc.integer({ min: 900, max: 5400 }),
        setup: fc.integer({ min: 0, max: 1800 }),
        support: fc.integer({ min: 60, max: 900 }),
        fault: fc.option(fc.integer({ min: 0, max: BOTH_REJECT.length - 1 }), { nil: undefined }),
      })
      .map((r) => {
        const stations = Array.from({ length: r.nStation }, (_, k) => ({
          id: `ST-${k}`,
          setupSeconds: r.setup,
          supportSeconds: r.support,
        }));
        const sats = Array.from({ length: r.nSat }, (_, i) =>
          satellite(
            `SAT-${i}`,
            r.passStarts.map((s, j): [string, number, number] => [`ST-${(i + j) % r.nStation}`, s, s + r.passLength]),
          ),
        );
        const d = smallFleet(sats, { stations }) as Doc;
        return { d, fault: r.fault };
      });
    fc.assert(
      fc.property(docArb, ({ d, fault }) => {
        if (fault === undefined) {
          expect(check(d)).toBe(true);
          expect(rejectedField(d)).toBeUndefined();
          return;
        }
        const [field, edit] = BOTH_REJECT[fault]!;
        // The edits index satellites[1] and passes[1]: skip those that do not apply to this document.
        const needs = field.match(/satellites\[(\d)\](?:\.passes\[(\d)\])?/);
        if (
          needs &&
          (Number(needs[1]) >= d.satellites.length ||
            (needs[2] !== undefined && Number(needs[2]) >= d.satellites[Number(needs[1])].passes.length))
        )
          return;
        if (/stations\[1\]/.test(field) && d.stations.length < 2) return;
        edit(d);
        expect(check(d)).toBe(false);
        expect(rejectedField(d)).toBe(field);
      }),
      { seed: 20261203, numRuns: 150 },
    );
  });

  it('validateFleet(doc) names the satellite of a bad clock field and keeps the fleet-level path for the strategy', () => {
    const d = valid();
    d.satellites[1].clock.fractionalFrequency = 5;
    expect(rejectedField(d)).toBe('satellites[1].clock.fractionalFrequency');
    const e = valid();
    e.strategy = { method: 'deadband', thresholdFraction: 2 };
    expect(rejectedField(e)).toBe('strategy.thresholdFraction');
  });

  it('validateFleet(doc) rejects a document that is not an object', () => {
    expect(() => validateFleet(null as unknown as FleetDocument)).toThrow(InvalidArgumentError);
  });
});
