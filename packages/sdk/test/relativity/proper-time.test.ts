import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { IERS_2010, L_G, SPEED_OF_LIGHT_SQUARED } from '../../src/constants.js';
import { InvalidArgumentError, OutOfDomainError } from '../../src/errors.js';
import { elementsToState, type StateVector } from '../../src/orbit/elements.js';
import { integrateProperTime, properTimeSampleState } from '../../src/relativity/proper-time.js';
import type { Instant } from '../../src/time/instant.js';
import { instantFromTtSecondsSinceJ2000, J2000_EPOCH, ttSecondsSinceJ2000 } from '../../src/time/j2000.js';
import { BUNDLED_LEAP_SECONDS } from '../../src/time/leap-seconds.js';
import { createTimeScales } from '../../src/time/scales.js';

const DEG = Math.PI / 180;
const GM = IERS_2010.gm;

function orbit(a: number, e: number, incDeg: number): StateVector {
  return elementsToState(
    {
      semiMajorAxis: a,
      eccentricity: e,
      inclination: incDeg * DEG,
      raan: 1.0,
      argumentOfPerigee: 0.5,
      meanAnomaly: 0.3,
    },
    GM,
  );
}

/** τ − TT on a Kepler orbit: (L_G − 3GM/(2ac²))·t − 2(r·v − r₀·v₀)/c² (IERS 2010 eqs. 10.9–10.11, Kepler integral [V1]). */
function closedFormDifference(state: StateVector, duration: number, step: number): number {
  const r = integrateProperTime(state, duration, step, { model: 'point-mass' });
  const p = state.position,
    v = state.velocity;
  const a = 1 / (2 / Math.hypot(...p) - (v[0] ** 2 + v[1] ** 2 + v[2] ** 2) / GM);
  const rate = L_G - (1.5 * GM) / (a * SPEED_OF_LIGHT_SQUARED);
  const rv0 = p[0] * v[0] + p[1] * v[1] + p[2] * v[2];
  let worst = 0;
  for (let k = 0; k < r.t.length; k++) {
    const s = r.states.subarray(6 * k, 6 * k + 6);
    const rv = s[0]! * s[3]! + s[1]! * s[4]! + s[2]! * s[5]!;
    const expected = rate * r.t[k]! - (2 * (rv - rv0)) / SPEED_OF_LIGHT_SQUARED;
    worst = Math.max(worst, Math.abs(expected - r.tauMinusTT[k]!));
  }
  return worst;
}

describe('integrateProperTime: closed-form agreement (IERS Conventions 2010 §10.2 eqs. 10.9–10.11 [V1])', () => {
  it('integrateProperTime(state, 1 day, 300 s, point-mass) equals constant rate × t plus the periodic term to < 1e-15 s for GPS-like e = 0.02', () => {
    expect(closedFormDifference(orbit(26_561_750, 0.02, 55), 86_400, 300)).toBeLessThan(1e-15);
  });

  it('integrateProperTime point-mass agrees with the closed form for random bound orbits (property, fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 7.0e6, max: 4.3e7, noNaN: true }),
        fc.double({ min: 0, max: 0.3, noNaN: true }),
        fc.double({ min: 0, max: 180, noNaN: true }),
        (a, e, inc) => {
          fc.pre(a * (1 - e) > 6.6e6);
          return closedFormDifference(orbit(a, e, inc), 21_600, 900) < 1e-15;
        },
      ),
      { seed: 20261202, numRuns: 12 },
    );
  });
});

describe('integrateProperTime: convergence by halving tolerances (τ − TT within 1 ps/day of a converged solution)', () => {
  const cases: [string, StateVector][] = [
    ['MEO (a = 26 561.75 km, e = 0.01, i = 55°)', orbit(26_561_750, 0.01, 55)],
    ['GEO (a = 42 164.2 km, e = 3e-4, i = 0.05°)', orbit(42_164_200, 3e-4, 0.05)],
    ['eccentric (a = 27 977.6 km, e = 0.162, i = 49.8°)', orbit(27_977_600, 0.162, 49.8)],
    ['LEO (550 km, e = 1e-3, i = 97.6°)', orbit(6_378_137 + 550_000, 1e-3, 97.6)],
  ];
  for (const [name, state] of cases) {
    it(`integrateProperTime(j2) for ${name}: errors halve with the tolerance and stay < 1 ps over 1 day`, () => {
      const converged = integrateProperTime(state, 86_400, 600, { model: 'j2', relativeTolerance: 1e-14 });
      const errors = [4e-12, 2e-12, 1e-12].map((tol) => {
        const r = integrateProperTime(state, 86_400, 600, { model: 'j2', relativeTolerance: tol });
        let worst = 0;
        for (let k = 0; k < r.t.length; k++)
          worst = Math.max(worst, Math.abs(r.tauMinusTT[k]! - converged.tauMinusTT[k]!));
        return worst;
      });
      expect(errors[1]!).toBeLessThan(errors[0]!);
      expect(errors[2]!).toBeLessThan(errors[1]!);
      for (const e of errors) expect(e).toBeLessThan(1e-12);
    });
  }
});

describe('integrateProperTime: sampling, models and results', () => {
  it('integrateProperTime returns τ − TT = 0 at t = 0, samples at multiples of the step and a last sample at the duration', () => {
    const r = integrateProperTime(orbit(26_561_750, 0.01, 55), 1000, 300);
    expect(Array.from(r.t)).toEqual([0, 300, 600, 900, 1000]);
    expect(r.tauMinusTT[0]).toBe(0);
    expect(r.model).toBe('j2');
    expect(r.constants).toBe('iers-2010');
    expect(r.ephemeris).toBe('');
    // the GPS clock gains ≈ 4.46e-10 s per second against TT (IERS 2010 §10.2 [V1])
    expect(r.tauMinusTT[4]! / 1000).toBeGreaterThan(4.3e-10);
    expect(r.tauMinusTT[4]! / 1000).toBeLessThan(4.6e-10);
  });

  it('integrateProperTime(full) names its ephemeris and stays within tens of ps of the J2 model at GPS altitude over 6 h', () => {
    const s = orbit(26_561_750, 0.01, 55);
    const full = integrateProperTime(s, 21_600, 3600, { model: 'full', epoch: instantFromTtSecondsSinceJ2000(8e8) });
    const j2 = integrateProperTime(s, 21_600, 3600, { model: 'j2' });
    expect(full.ephemeris).toMatch(/Montenbruck & Gill/);
    expect(ttSecondsSinceJ2000(full.epoch)).toBe(8e8);
    const diff = Math.abs(full.tauMinusTT[6]! - j2.tauMinusTT[6]!);
    expect(diff).toBeGreaterThan(0);
    expect(diff).toBeLessThan(1e-10);
  });

  it('properTimeSampleState(result, k) returns the k-th state and rejects a bad index', () => {
    const s = orbit(26_561_750, 0.01, 55);
    const r = integrateProperTime(s, 600, 300, { model: 'point-mass' });
    expect(properTimeSampleState(r, 0).position[0]).toBeCloseTo(s.position[0], 6);
    expect(() => properTimeSampleState(r, 3)).toThrow(InvalidArgumentError);
    expect(() => properTimeSampleState(r, 0.5)).toThrow(/integer sample index/);
  });
});

describe('integrateProperTime: bad input', () => {
  const good = orbit(26_561_750, 0.01, 55);
  it('integrateProperTime rejects a state given in kilometres with a "did you mean km?" hint', () => {
    const km: StateVector = { position: [26_561.75, 0, 0], velocity: [0, 3.87, 0] };
    expect(() => integrateProperTime(km, 100, 10)).toThrow(/did you mean 26561\.75 km/);
  });
  it('integrateProperTime rejects non-finite states, naming the component', () => {
    expect(() => integrateProperTime({ position: [Number.NaN, 0, 0], velocity: [0, 1, 0] }, 100, 10)).toThrow(
      /state\.position\[0\]/,
    );
    expect(() => integrateProperTime({ position: [2.6e7, 0, 0], velocity: [0, Infinity, 0] }, 100, 10)).toThrow(
      /state\.velocity\[1\]/,
    );
    expect(() => integrateProperTime(null as unknown as StateVector, 100, 10)).toThrow(InvalidArgumentError);
  });
  it('integrateProperTime rejects duration ≤ 0, step ≤ 0 and a step larger than the duration', () => {
    expect(() => integrateProperTime(good, 0, 10)).toThrow(/duration must be in \(0, 10000000000\] s; received 0/);
    expect(() => integrateProperTime(good, -5, 10)).toThrow(/duration/);
    expect(() => integrateProperTime(good, 100, 0)).toThrow(/step must be a finite number greater than 0/);
    expect(() => integrateProperTime(good, 100, 200)).toThrow(/step must be at most the duration \(100 s\)/);
    expect(() => integrateProperTime(good, 1e9, 1e-3)).toThrow(/at most 10000000 samples/);
  });
  it('integrateProperTime rejects an unknown model, a bad tolerance and an epoch that is not an Instant', () => {
    expect(() => integrateProperTime(good, 100, 10, { model: 'egm2008' as never })).toThrow(
      /model must be one of point-mass, j2, full/,
    );
    expect(() => integrateProperTime(good, 100, 10, { relativeTolerance: 1e-3 })).toThrow(/relativeTolerance/);
    expect(() => integrateProperTime(good, 100, 10, { epoch: 8e8 as unknown as Instant })).toThrow(
      /options\.epoch.*an Instant/,
    );
  });
  it('integrateProperTime throws OutOfDomainError when the trajectory enters the Earth', () => {
    // Released at 7000 km with 1 km/s tangential speed: falls into the Earth within minutes.
    const falling: StateVector = { position: [7.0e6, 0, 0], velocity: [0, 1000, 0] };
    expect(() => integrateProperTime(falling, 7200, 60, { model: 'point-mass' })).toThrow(OutOfDomainError);
    expect(() => integrateProperTime(falling, 7200, 60, { model: 'point-mass' })).toThrow(/enters the Earth/);
  });
});

describe('integrateProperTime(state, duration, step, { onProgress })', () => {
  it('reports increasing times up to the duration and leaves the result unchanged', () => {
    const state = orbit(26_561_750, 0.01, 55);
    const reached: number[] = [];
    const r = integrateProperTime(state, 86_400, 21_600, {
      model: 'point-mass',
      onProgress: (t, d) => {
        expect(d).toBe(86_400);
        reached.push(t);
      },
    });
    expect(reached.length).toBe(r.acceptedSteps);
    expect(reached.every((t, k) => k === 0 || t > reached[k - 1]!)).toBe(true);
    expect(reached.at(-1)).toBe(86_400);
    expect(Array.from(r.tauMinusTT)).toEqual(
      Array.from(integrateProperTime(state, 86_400, 21_600, { model: 'point-mass' }).tauMinusTT),
    );
  });
});

describe('integrateProperTime at an Instant epoch', () => {
  const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
  const state = orbit(26_561_750, 0.01, 55);

  it('integrateProperTime(full, { epoch: 2025-05-08T18:13:20 TT }) gives exactly the samples of the epoch 8e8 TT seconds after J2000.0 (the same instant, Python datetime [C])', () => {
    const fromText = integrateProperTime(state, 21_600, 3600, {
      model: 'full',
      epoch: ts.parseIso('2025-05-08T18:13:20', 'TT'),
    });
    const fromSeconds = integrateProperTime(state, 21_600, 3600, {
      model: 'full',
      epoch: instantFromTtSecondsSinceJ2000(8e8),
    });
    expect(Array.from(fromText.tauMinusTT)).toEqual(Array.from(fromSeconds.tauMinusTT));
    expect(Array.from(fromText.states)).toEqual(Array.from(fromSeconds.states));
    expect(fromText.epoch.equals(fromSeconds.epoch)).toBe(true);
  });

  it('integrateProperTime without an epoch starts at J2000_EPOCH (2000-01-01T12:00:00 TT) and returns it', () => {
    const byDefault = integrateProperTime(state, 7200, 3600, { model: 'full' });
    const explicit = integrateProperTime(state, 7200, 3600, { model: 'full', epoch: J2000_EPOCH });
    expect(byDefault.epoch).toBe(J2000_EPOCH);
    expect(Array.from(byDefault.tauMinusTT)).toEqual(Array.from(explicit.tauMinusTT));
  });
});
