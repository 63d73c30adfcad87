import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  elementsToState,
  type KeplerianElements,
  orbitalPeriod,
  propagateKepler,
  propagateKeplerState,
} from '../../src/orbit/index.js';

const SEED = 20261202;
const GM = 3.986004418e14;
const GALILEO_ECCENTRIC: KeplerianElements = {
  semiMajorAxis: 27_978_100,
  eccentricity: 0.158,
  inclination: 0.873,
  raan: 0.3,
  argumentOfPerigee: 1.1,
  meanAnomaly: 0.4,
};

describe('propagateKepler', () => {
  it('propagateKepler(el, P, GM) after one orbital period returns the same state (two-body periodicity)', () => {
    const P = orbitalPeriod(GALILEO_ECCENTRIC.semiMajorAxis, GM);
    const s0 = elementsToState(GALILEO_ECCENTRIC, GM);
    const s1 = propagateKeplerState(GALILEO_ECCENTRIC, P, GM);
    for (let i = 0; i < 3; i++) {
      expect(Math.abs(s1.position[i]! - s0.position[i]!)).toBeLessThan(1e-6);
      expect(Math.abs(s1.velocity[i]! - s0.velocity[i]!)).toBeLessThan(1e-9);
    }
  });

  it('propagateKepler(el, dt, GM) changes only the mean anomaly, keeps it in [0, 2π) and composes: dt1 then dt2 = dt1 + dt2 (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        (dt1, dt2) => {
          const a = propagateKepler(propagateKepler(GALILEO_ECCENTRIC, dt1, GM), dt2, GM);
          const b = propagateKepler(GALILEO_ECCENTRIC, dt1 + dt2, GM);
          const d = Math.abs(a.meanAnomaly - b.meanAnomaly);
          return (
            Math.min(d, 2 * Math.PI - d) < 1e-9 &&
            a.meanAnomaly >= 0 &&
            a.meanAnomaly < 2 * Math.PI &&
            a.semiMajorAxis === GALILEO_ECCENTRIC.semiMajorAxis &&
            a.argumentOfPerigee === GALILEO_ECCENTRIC.argumentOfPerigee
          );
        },
      ),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('propagateKeplerState conserves the orbital energy v²/2 − GM/r = −GM/(2a) over 30 days (two-body invariant)', () => {
    for (let k = 0; k <= 30; k++) {
      const s = propagateKeplerState(GALILEO_ECCENTRIC, k * 86_400, GM);
      const r = Math.hypot(...s.position),
        v = Math.hypot(...s.velocity);
      expect(Math.abs((v * v) / 2 - GM / r + GM / (2 * GALILEO_ECCENTRIC.semiMajorAxis))).toBeLessThan(1e-6);
    }
  });

  it('propagateKepler(el, dt, GM) rejects a non-finite dt, bad elements and GM ≤ 0', () => {
    expect(() => propagateKepler(GALILEO_ECCENTRIC, Number.NaN, GM)).toThrow(
      /dt must be a finite time step in seconds; received NaN/,
    );
    expect(() => propagateKepler({ ...GALILEO_ECCENTRIC, eccentricity: 1.1 }, 0, GM)).toThrow(/elements\.eccentricity/);
    expect(() => propagateKepler(GALILEO_ECCENTRIC, 0, 0)).toThrow(/gm must be/);
    expect(() => propagateKeplerState(GALILEO_ECCENTRIC, Number.POSITIVE_INFINITY, GM)).toThrow(/dt/);
  });
});
