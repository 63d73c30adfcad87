import { readFileSync } from 'node:fs';
import type { SteeringScenario } from '../../src/steering/index.js';

/** Loads a bundled example scenario (invented satellites and stations). */
export function example(name: 'orin-3-meo' | 'halcyr-g1-geo'): SteeringScenario {
  return JSON.parse(
    readFileSync(new URL(`../../examples/steering/${name}.json`, import.meta.url), 'utf8'),
  ) as SteeringScenario;
}

/** A small valid scenario: 2 days, contacts every 6 h, quiet clock. */
export function baseScenario(overrides: Partial<SteeringScenario> = {}): SteeringScenario {
  const contacts = [];
  for (let h = 1; h < 48; h += 6) {
    contacts.push({
      start: `2027-01-0${1 + Math.floor(h / 24)}T${String(h % 24).padStart(2, '0')}:00:00Z`,
      end: `2027-01-0${1 + Math.floor(h / 24)}T${String(h % 24).padStart(2, '0')}:30:00Z`,
    });
  }
  return {
    epoch: '2027-01-01T00:00:00Z',
    horizonSeconds: 2 * 86_400,
    gridSeconds: 900,
    clock: {
      phaseSeconds: 2e-9,
      fractionalFrequency: 1e-13,
      driftPerSecond: 0,
      noise: { q1: 1e-24, q2: 1e-34, q3: 0 },
    },
    tolerance: { phaseSeconds: 2e-8, probability: 0.95 },
    contacts,
    actuator: {
      frequencyResolution: 1e-15,
      maxFrequencyStep: 1e-12,
      cumulativeFrequencyRange: { min: -1e-10, max: 1e-10 },
      minCommandSpacingSeconds: 1800,
      maxTimeTagSeconds: 7200,
    },
    strategy: { method: 'optimal' },
    ...overrides,
  };
}
