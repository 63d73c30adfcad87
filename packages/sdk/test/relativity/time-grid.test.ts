import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type ConstantSet, GPS_ICD, IERS_2010 } from '../../src/constants.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { solveKepler } from '../../src/orbit/index.js';
import { MAX_GRID_EPOCHS, periodicCorrectionOnTimeGrid } from '../../src/relativity/index.js';

const SEED = 20261203;

/** The same series the slow way: a converged Kepler solve per epoch, then F·e·√a·sin E. */
function direct(
  a: number,
  e: number,
  M0: number,
  h: number,
  count: number,
  set: ConstantSet = IERS_2010,
): Float64Array {
  const n = Math.sqrt(set.gm / a ** 3);
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++)
    out[k] = set.relativisticF * e * Math.sqrt(a) * Math.sin(solveKepler(M0 + n * k * h, e));
  return out;
}

function maxAbsDifference(x: Float64Array, y: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < x.length; i++) worst = Math.max(worst, Math.abs(x[i]! - y[i]!));
  return worst;
}

describe('periodicCorrectionOnTimeGrid(orbit, grid, { constants })', () => {
  it('periodicCorrectionOnTimeGrid starts at the IS-GPS-200 check value Δt_r = −2.378695477618e-08 s (physics-refs §3, √A = 5153.79589081, e = 0.0123456789, E = 1 rad [C])', () => {
    const e = 0.0123456789;
    const a = 5153.79589081 ** 2;
    const out = periodicCorrectionOnTimeGrid(
      { semiMajorAxis: a, eccentricity: e, meanAnomalyAtStart: 1 - e * Math.sin(1) },
      { stepSeconds: 30, count: 3 },
      { constants: GPS_ICD },
    );
    expect(Math.abs(out[0]! - -2.378695477618e-8)).toBeLessThan(5e-21);
  });

  const cases: Array<[string, number, number, number, number]> = [
    // name, a (m), e, step (s), count
    ['GNSS MEO, e = 0.01, 1 s for 2 days', 26_561_750, 0.01, 1, 172_800],
    ['GNSS MEO, e = 0, 1 s', 26_561_750, 0, 1, 20_000],
    ['eccentric Galileo, e = 0.16, 1 s for a day', 27_977_000, 0.16, 1, 86_400],
    ['Molniya-like, e = 0.74, 1 s for a day', 26_600_000, 0.74, 1, 86_400],
    ['HEO, e = 0.9, 10 s for 5 days', 60_000_000, 0.9, 10, 43_200],
    ['LEO, e = 0.001, 0.1 s', 7_000_000, 0.001, 0.1, 60_000],
    ['coarse grid: GNSS at 900 s for 30 days', 26_561_750, 0.02, 900, 2880],
  ];
  it.each(cases)(
    'periodicCorrectionOnTimeGrid agrees with a converged Kepler solve at every epoch within 1e-17 s: %s',
    (_name, a, e, h, count) => {
      const M0 = 0.3;
      const fast = periodicCorrectionOnTimeGrid(
        { semiMajorAxis: a, eccentricity: e, meanAnomalyAtStart: M0 },
        { stepSeconds: h, count },
      );
      const slow = direct(a, e, M0, h, count);
      expect(fast.length).toBe(count);
      expect(maxAbsDifference(fast, slow)).toBeLessThan(1e-17);
    },
  );

  it('periodicCorrectionOnTimeGrid agrees with the per-epoch solve within 1e-17 s on random orbits and grids (property, e ≤ 0.9)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6.6e6, max: 6e7, noNaN: true }),
        fc.double({ min: 0, max: 0.9, noNaN: true }),
        fc.double({ min: -50, max: 50, noNaN: true }),
        fc.double({ min: 0.05, max: 2000, noNaN: true }),
        (a, e, M0, h) => {
          const fast = periodicCorrectionOnTimeGrid(
            { semiMajorAxis: a, eccentricity: e, meanAnomalyAtStart: M0 },
            { stepSeconds: h, count: 500 },
          );
          return maxAbsDifference(fast, direct(a, e, M0, h, 500)) < 1e-17;
        },
      ),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('periodicCorrectionOnTimeGrid returns an empty array for count 0 and uses the constant set given', () => {
    const orbit = { semiMajorAxis: 26_561_750, eccentricity: 0.01, meanAnomalyAtStart: 0 };
    expect(periodicCorrectionOnTimeGrid(orbit, { stepSeconds: 1, count: 0 }).length).toBe(0);
    const gps = periodicCorrectionOnTimeGrid(orbit, { stepSeconds: 60, count: 100 }, { constants: GPS_ICD });
    expect(maxAbsDifference(gps, direct(26_561_750, 0.01, 0, 60, 100, GPS_ICD))).toBeLessThan(1e-17);
  });

  it('periodicCorrectionOnTimeGrid refuses a missing orbit or grid, kilometres for metres, e ≥ 1, a bad step and a bad count', () => {
    const orbit = { semiMajorAxis: 26_561_750, eccentricity: 0.01, meanAnomalyAtStart: 0 };
    const grid = { stepSeconds: 1, count: 10 };
    const bad: Array<[unknown, unknown, RegExp]> = [
      [null, grid, /orbit/],
      [orbit, null, /grid/],
      [{ ...orbit, semiMajorAxis: 26_561.75 }, grid, /km/],
      [{ ...orbit, eccentricity: 1 }, grid, /eccentricity/],
      [{ ...orbit, meanAnomalyAtStart: Number.NaN }, grid, /meanAnomalyAtStart/],
      [orbit, { stepSeconds: 0, count: 10 }, /stepSeconds/],
      [orbit, { stepSeconds: 1, count: 1.5 }, /count/],
      [orbit, { stepSeconds: 1, count: MAX_GRID_EPOCHS + 1 }, /count/],
    ];
    for (const [o, g, message] of bad) {
      const call = () => periodicCorrectionOnTimeGrid(o as never, g as never);
      expect(call).toThrow(InvalidArgumentError);
      expect(call).toThrow(message);
    }
  });
});

describe('periodicCorrectionOnTimeGrid(orbit, grid, { constants, out })', () => {
  it('periodicCorrectionOnTimeGrid writes into the array given and returns it; a short or wrong array is refused', () => {
    const orbit = { semiMajorAxis: 26_561_750, eccentricity: 0.01, meanAnomalyAtStart: 0.2 };
    const out = new Float64Array(120).fill(Number.NaN);
    const result = periodicCorrectionOnTimeGrid(orbit, { stepSeconds: 30, count: 100 }, { constants: IERS_2010, out });
    expect(result).toBe(out);
    expect(maxAbsDifference(out.subarray(0, 100), direct(26_561_750, 0.01, 0.2, 30, 100))).toBeLessThan(1e-17);
    expect(Number.isNaN(out[100])).toBe(true);
    expect(() =>
      periodicCorrectionOnTimeGrid(
        orbit,
        { stepSeconds: 30, count: 100 },
        { constants: IERS_2010, out: new Float64Array(99) },
      ),
    ).toThrow(/out/);
    expect(() =>
      periodicCorrectionOnTimeGrid(orbit, { stepSeconds: 30, count: 1 }, { constants: IERS_2010, out: [0] as never }),
    ).toThrow(InvalidArgumentError);
  });
});
