import { readFileSync } from 'node:fs';
import type { FleetDocument, FleetSatellite } from '../../src/fleet/index.js';

export const EPOCH_MS = Date.parse('2027-03-01T00:00:00Z');
/** Seconds since 2027-03-01T00:00:00Z as an ISO 8601 UTC stamp (whole seconds). */
export const iso = (s: number): string => new Date(EPOCH_MS + Math.round(s * 1000)).toISOString().replace('.000Z', 'Z');
/** Seconds since 2027-03-01T00:00:00Z of an ISO stamp (no leap second in March 2027). */
export const secondsOf = (stamp: string): number => (Date.parse(stamp) - EPOCH_MS) / 1000;

/** The bundled invented example fleet. */
export function exampleFleet(): FleetDocument {
  return JSON.parse(
    readFileSync(new URL('../../examples/fleet/vesper-constellation.json', import.meta.url), 'utf8'),
  ) as FleetDocument;
}

/** A quiet satellite with an invented clock; passes given as [station, startSeconds, endSeconds]. */
export function satellite(
  id: string,
  passes: [string, number, number][],
  clock: Partial<FleetSatellite['clock']> = {},
): FleetSatellite {
  return {
    id,
    clock: {
      phaseSeconds: 0,
      fractionalFrequency: 2e-13,
      driftPerSecond: 0,
      noise: { q1: 1e-24, q2: 1e-34, q3: 0 },
      ...clock,
    },
    tolerance: { phaseSeconds: 2e-8, probability: 0.95 },
    actuator: {
      frequencyResolution: 1e-15,
      maxFrequencyStep: 1e-12,
      cumulativeFrequencyRange: { min: -1e-10, max: 1e-10 },
      minCommandSpacingSeconds: 1800,
      maxTimeTagSeconds: 7200,
    },
    passes: passes.map(([station, start, end]) => ({ station, start: iso(start), end: iso(end) })),
  };
}

/** A two-day fleet with two invented stations. */
export function smallFleet(satellites: FleetSatellite[], overrides: Partial<FleetDocument> = {}): FleetDocument {
  return {
    epoch: iso(0),
    horizonSeconds: 2 * 86_400,
    gridSeconds: 900,
    stations: [
      { id: 'ST-A', setupSeconds: 600, supportSeconds: 600 },
      { id: 'ST-B', setupSeconds: 300, supportSeconds: 900 },
    ],
    satellites,
    strategy: { method: 'optimal' },
    ...overrides,
  };
}
