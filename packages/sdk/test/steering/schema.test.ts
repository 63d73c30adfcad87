import { readFileSync } from 'node:fs';
import Ajv from 'ajv';
import { describe, expect, it } from 'vitest';
import { validateScenario } from '../../src/steering/index.js';
import { baseScenario, example } from './helpers.js';

const schema = JSON.parse(
  readFileSync(new URL('../../schema/scenario.schema.json', import.meta.url), 'utf8'),
) as object;
// The schema's own `pattern` checks the stamps; `format: date-time` is declared as known (and not
// re-checked) so ajv does not log "unknown format" (a test must not log).
const ajv = new Ajv({ allErrors: true, strict: false, formats: { 'date-time': true } });
const check = ajv.compile(schema);

describe('schema/scenario.schema.json (JSON Schema draft-07, checked with ajv)', () => {
  for (const name of ['orin-3-meo', 'halcyr-g1-geo'] as const) {
    it(`the bundled example ${name} validates against the schema and with validateScenario`, () => {
      const s = example(name);
      expect(check(s), JSON.stringify(check.errors)).toBe(true);
      expect(() => validateScenario(s)).not.toThrow();
    });
  }

  it('the schema rejects what validateScenario rejects field by field: negative tolerance, resolution 0, an unknown strategy, a misspelt field', () => {
    const bad: ((s: Record<string, any>) => void)[] = [
      (s) => {
        s.tolerance.phaseSeconds = -1;
      },
      (s) => {
        s.actuator.frequencyResolution = 0;
      },
      (s) => {
        s.strategy = { method: 'magic' };
      },
      (s) => {
        s.tolerance.phase = 1;
      },
      (s) => {
        s.maneuvers = [{ at: '2027-01-01T10:00:00Z', semiMajorAxisBefore: 6e6, semiMajorAxisAfter: 2.7e7 }];
      },
      (s) => {
        s.actuator.phaseSteps = { allowed: true };
      },
      (s) => {
        s.operations = { estimateIntervalSeconds: 0, estimateNoiseSeconds: 1e-10 };
      },
      (s) => {
        s.operations = { estimateIntervalSeconds: 900, estimateNoiseSeconds: 1e-10, replan: 'daily' };
      },
      (s) => {
        s.operations = { estimateIntervalSeconds: 900 };
      },
    ];
    for (const edit of bad) {
      const s = structuredClone(baseScenario()) as Record<string, any>;
      edit(s);
      expect(check(s)).toBe(false);
      expect(() => validateScenario(s)).toThrow();
    }
  });
});
