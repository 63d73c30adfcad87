import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  elevationFromStation,
  type MeanOrbit,
  PASS_TIME_TOLERANCE_SECONDS,
  predictPasses,
  satellitePositionEcef,
} from '../../src/orbit/index.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '../../src/time/index.js';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const epoch = ts.parseIso('2027-03-01T00:00:00Z', 'UTC');
const TWO_PI = 2 * Math.PI;

/** Random orbits from LEO to GEO (mean elements), stations anywhere, masks 0–30°, windows of 0.5–1.5 days. */
const caseArb = fc.record({
  a: fc.double({ min: 6_378_137 + 500e3, max: 42_200_000, noNaN: true }),
  e: fc.double({ min: 0, max: 0.02, noNaN: true }),
  i: fc.double({ min: 0, max: Math.PI, noNaN: true }),
  raan: fc.double({ min: 0, max: TWO_PI, noNaN: true }),
  argp: fc.double({ min: 0, max: TWO_PI, noNaN: true }),
  M: fc.double({ min: 0, max: TWO_PI, noNaN: true }),
  lat: fc.double({ min: -Math.PI / 2, max: Math.PI / 2, noNaN: true }),
  lon: fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }),
  h: fc.double({ min: 0, max: 3000, noNaN: true }),
  mask: fc.double({ min: 0, max: (30 * Math.PI) / 180, noNaN: true }),
  hours: fc.integer({ min: 12, max: 36 }),
});

describe('predictPasses on random orbits and stations (fast-check, seed 20261205)', () => {
  it('predictPasses returns sorted, disjoint passes with elevation ≥ mask inside and < mask just outside', () => {
    fc.assert(
      fc.property(caseArb, (c) => {
        if (c.a * (1 - c.e) < 6_378_137 + 300e3) return;
        const orbit: MeanOrbit = {
          epoch,
          elements: {
            semiMajorAxis: c.a,
            eccentricity: c.e,
            inclination: c.i,
            raan: c.raan,
            argumentOfPerigee: c.argp,
            meanAnomaly: c.M,
          },
        };
        const station = { latitude: c.lat, longitude: c.lon, height: c.h };
        const horizon = c.hours * 3600;
        const passes = predictPasses(orbit, [{ position: station, elevationMask: c.mask }], epoch, horizon, {
          timeScales: ts,
        }).passes[0]!;
        const el = (t: number): number =>
          elevationFromStation(station, satellitePositionEcef(orbit, epoch.plus(t), { timeScales: ts }));
        // The two paths (ERA at the window start + rate·t, or ERA at epoch + t) round differently: 1e-9 rad.
        const slack = 1e-9;
        const outside = 1.01 * PASS_TIME_TOLERANCE_SECONDS;
        for (const [k, p] of passes.entries()) {
          expect(p.start).toBeGreaterThanOrEqual(0);
          expect(p.end).toBeLessThanOrEqual(horizon);
          expect(p.start).toBeLessThanOrEqual(p.end);
          if (k > 0) expect(p.start).toBeGreaterThan(passes[k - 1]!.end);
          expect(p.maxElevationAt).toBeGreaterThanOrEqual(p.start);
          expect(p.maxElevationAt).toBeLessThanOrEqual(p.end);
          for (const f of [0, 0.25, 0.5, 0.75, 1])
            expect(el(p.start + f * (p.end - p.start))).toBeGreaterThanOrEqual(c.mask - slack);
          expect(Math.abs(el(p.maxElevationAt) - p.maxElevation)).toBeLessThan(slack);
          expect(p.clippedAtStart).toBe(p.start === 0 && el(0) >= c.mask - slack);
          if (!p.clippedAtStart) expect(el(p.start - outside)).toBeLessThan(c.mask + slack);
          if (!p.clippedAtEnd) expect(el(p.end + outside)).toBeLessThan(c.mask + slack);
          else expect(p.end).toBe(horizon);
        }
        // Between passes (and outside all of them) the satellite is below the mask at the sampled midpoints.
        const bounds = [0, ...passes.flatMap((p) => [p.start, p.end]), horizon];
        for (let j = 0; j + 1 < bounds.length; j += 2) {
          const [lo, hi] = [bounds[j]!, bounds[j + 1]!];
          if (hi - lo > 2 * outside) expect(el((lo + hi) / 2)).toBeLessThan(c.mask + slack);
        }
      }),
      { seed: 20261205, numRuns: 60 },
    );
  });
});
