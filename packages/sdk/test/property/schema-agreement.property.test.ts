import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { validateFleet } from '../../src/fleet/index.js';
import { parseReviewInput } from '../../src/review/index.js';
import { validateScenario } from '../../src/steering/index.js';
import { type AgreementResult, findSchemaDisagreements, type ValidatorOnlyRule } from './schema-agreement.js';

const json = (path: string): unknown => JSON.parse(readFileSync(new URL(`../../${path}`, import.meta.url), 'utf8'));

/** Refusals about stamps that a pattern cannot make: the calendar, leap seconds and the table's span. */
const STAMP_RULES: ValidatorOnlyRule[] = [
  {
    path: /./,
    message: /must be an ISO 8601 UTC date-time/,
    why: 'day of month past its end (e.g. 02-30), or :60 where the table has no leap second',
  },
  {
    path: /./,
    message: /^OutOfDomainError: .*outside the valid span/,
    why: 'a stamp or the horizon end outside the leap-second table in use',
  },
];

/** Cross-field rules of a steering scenario (and of each fleet satellite), stated in the schema's descriptions. */
const SCENARIO_RULES: ValidatorOnlyRule[] = [
  ...STAMP_RULES,
  {
    path: /clock\.covariance\[\d\]\[\d\]$/,
    message: /a covariance is (symmetric|positive semi-definite)|a variance ≥ 0/,
    why: 'symmetry, Cauchy–Schwarz and the diagonal relate the matrix entries',
  },
  {
    path: /(^|\.)contacts\[\d+\]\.(start|end)$/,
    message: /windows must (be sorted|not overlap)|after contacts\[\d+\]\.start|at or (before the end|after the epoch)/,
    why: 'windows against each other and against epoch + horizon',
  },
  { path: /^gridSeconds$/, message: /horizonSeconds/, why: 'grid against the horizon' },
  {
    path: /actuator\.maxFrequencyStep$/,
    message: /at least actuator\.frequencyResolution/,
    why: 'step against resolution',
  },
  {
    path: /actuator\.phaseSteps\.maxStep$/,
    message: /at least actuator\.phaseSteps\.resolution/,
    why: 'step against resolution',
  },
  {
    path: /actuator\.initialFrequencySteering$/,
    message: /inside actuator\.cumulativeFrequencyRange/,
    why: 'value against the range',
  },
  {
    path: /^operations\.estimateIntervalSeconds$/,
    message: /at most horizonSeconds/,
    why: 'interval against the horizon',
  },
  { path: /maneuvers\[\d+\]\.at$/, message: /inside the horizon/, why: 'stamp against epoch + horizon' },
];

const FLEET_RULES: ValidatorOnlyRule[] = [
  ...SCENARIO_RULES,
  {
    path: /^satellites\[\d+\]\.passes\[\d+\]\.station$/,
    message: /one of the station ids/,
    why: 'a reference to another array',
  },
  {
    path: /^(satellites|stations)\[\d+\]\.id$/,
    message: /an id used by no other/,
    why: 'uniqueness of one field across items',
  },
  {
    path: /^satellites\[\d+\]\.passes\[\d+\]\.(start|end)$/,
    message: /after satellites|at or before the end of the horizon|at or after the epoch|supportSeconds/,
    why: 'pass against its start, the horizon and its station',
  },
];

const REVIEW_RULES: ValidatorOnlyRule[] = [
  {
    path: /^spacecraft\[\d+\]\.configured\.(offsetFrequencyHz|offsetHz)$/,
    message: /0\.1 % of|smaller than 0\.1 %/,
    why: 'offset against the nominal frequency',
  },
  {
    path: /^spacecraft\[\d+\]\.configured\.tuningWord\.word$/,
    message: /an integer in \[0, 2\^\d+\)/,
    why: 'word against its bit count',
  },
  {
    path: /^spacecraft\[\d+\]\.id$/,
    message: /not used by another spacecraft/,
    why: 'uniqueness of one field across items',
  },
];

/** Documents per format: at least 1000 each (the brief of issue 16). */
const RUNS = 1200;

function expectAgreement(result: AgreementResult): void {
  expect(result.documents).toBeGreaterThanOrEqual(1000);
  // Both outcomes are exercised, so agreement is not won by refusing (or accepting) everything.
  expect(result.bothAccept).toBeGreaterThan(result.documents / 10);
  expect(result.bothReject).toBeGreaterThan(result.documents / 10);
  expect(result.disagreements.slice(0, 5)).toEqual([]);
}

describe('schemas and SDK validators accept the same documents (generated mutations at every path, ajv vs the SDK)', () => {
  it('schema/scenario.schema.json and validateScenario(doc) agree on 1200 random mutants of the two examples and every path of them once per mutation kind (seed 16001)', () => {
    expectAgreement(
      findSchemaDisagreements({
        name: 'scenario',
        schema: json('schema/scenario.schema.json') as object,
        validate: (d) => validateScenario(d),
        seeds: [json('examples/steering/orin-3-meo.json'), json('examples/steering/halcyr-g1-geo.json')],
        validatorOnly: SCENARIO_RULES,
        runs: RUNS,
        seed: 16001,
      }),
    );
  });

  it('schema/review.schema.json and parseReviewInput(doc) agree on 1200 random mutants of the two examples and every path of them once per mutation kind (seed 16002)', () => {
    expectAgreement(
      findSchemaDisagreements({
        name: 'review',
        schema: json('schema/review.schema.json') as object,
        validate: (d) => parseReviewInput(d),
        seeds: [
          json('examples/review/kestrel-block-a.review.json'),
          json('examples/review/kestrel-block-b-mistakes.review.json'),
        ],
        validatorOnly: REVIEW_RULES,
        runs: RUNS,
        seed: 16002,
      }),
    );
  });

  it('schema/fleet.schema.json and validateFleet(doc) agree on 1200 random mutants of the example fleet and every path of it once per mutation kind (seed 16003)', () => {
    expectAgreement(
      findSchemaDisagreements({
        name: 'fleet',
        schema: json('schema/fleet.schema.json') as object,
        validate: (d) => validateFleet(d),
        seeds: [json('examples/fleet/vesper-constellation.json')],
        validatorOnly: FLEET_RULES,
        runs: RUNS,
        seed: 16003,
      }),
    );
  });
});

describe('disagreements the generated documents found, fixed (each side named in the commit)', () => {
  const compileDraft07 = async (path: string) => {
    const { default: Ajv } = await import('ajv');
    return new Ajv({ strict: false, formats: { 'date-time': true } }).compile(json(path) as object);
  };

  it('validateScenario(doc) and validateFleet(doc) refuse a "$schema" that is not a string, as the schemas do (the validators ignored it)', () => {
    const scenario = json('examples/steering/orin-3-meo.json') as Record<string, unknown>;
    expect(() => validateScenario({ ...scenario, $schema: 7 })).toThrow(/\$schema must be a string/);
    const fleet = json('examples/fleet/vesper-constellation.json') as Record<string, unknown>;
    expect(() => validateFleet({ ...fleet, $schema: null })).toThrow(/\$schema must be a string/);
  });

  it('parseReviewInput(doc) refuses an unknown key beside the configured form, naming it, as the schema does (it was ignored)', () => {
    const doc = json('examples/review/kestrel-block-a.review.json') as { spacecraft: Record<string, unknown>[] };
    const sc = doc.spacecraft[0]!;
    sc.configured = { fractionalOffset: -4.486072e-10, bits: 32 };
    expect(() => parseReviewInput(doc)).toThrow(/spacecraft\[0\]\.configured\.bits must be absent/);
  });

  it('the scenario and fleet schemas accept every constant-set name in any letter case, as the validators and constantSet(name) do', async () => {
    const { CONSTANT_SETS } = await import('../../src/constants.js');
    for (const path of ['schema/scenario.schema.json', 'schema/fleet.schema.json']) {
      const check = await compileDraft07(path);
      const fleet = path === 'schema/fleet.schema.json';
      const base = json(fleet ? 'examples/fleet/vesper-constellation.json' : 'examples/steering/orin-3-meo.json');
      for (const name of Object.keys(CONSTANT_SETS)) {
        for (const spelt of [name, name.toUpperCase()]) {
          const doc = structuredClone(base) as Record<string, any>;
          if (path === 'schema/fleet.schema.json') doc.satellites[0].constants = spelt;
          else doc.constants = spelt;
          expect(check(doc), `${path} ${spelt}`).toBe(true);
        }
      }
      const doc = structuredClone(base) as Record<string, any>;
      if (path === 'schema/fleet.schema.json') doc.satellites[0].constants = 'wgs-84';
      else doc.constants = 'wgs-84';
      expect(check(doc)).toBe(false);
    }
  });
});
