import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import {
  eccentricToTrueAnomaly,
  elementsToState,
  type KeplerianElements,
  type StateVector,
  solveKepler,
  stateToElements,
} from '../../src/orbit/index.js';

const SEED = 20261202;
const GM = 3.986004418e14;

function norm(v: readonly number[]): number {
  return Math.hypot(v[0]!, v[1]!, v[2]!);
}
function maxDiff(a: readonly number[], b: readonly number[]): number {
  return Math.max(...a.map((x, i) => Math.abs(x - b[i]!)));
}
function angleDiff(a: number, b: number): number {
  const d = ((((a - b) % (2 * Math.PI)) + 3 * Math.PI) % (2 * Math.PI)) - Math.PI;
  return Math.abs(d);
}

const elementsArb = fc.record({
  semiMajorAxis: fc.double({ min: 6.6e6, max: 4.5e7, noNaN: true }),
  eccentricity: fc.oneof(fc.double({ min: 0, max: 0.95, noNaN: true }), fc.constantFrom(0, 1e-15, 1e-9, 0.95)),
  inclination: fc.oneof(
    fc.double({ min: 0, max: Math.PI, noNaN: true }),
    fc.constantFrom(0, Math.PI, 1e-15, Math.PI / 2),
  ),
  raan: fc.double({ min: -10, max: 10, noNaN: true }),
  argumentOfPerigee: fc.double({ min: -10, max: 10, noNaN: true }),
  meanAnomaly: fc.double({ min: -10, max: 10, noNaN: true }),
});

describe('elementsToState', () => {
  it('elementsToState(elements, GM) on a circular equatorial orbit gives r = a and v = √(GM/a) at the +x axis for all angles zero', () => {
    const s = elementsToState(
      { semiMajorAxis: 42_164_200, eccentricity: 0, inclination: 0, raan: 0, argumentOfPerigee: 0, meanAnomaly: 0 },
      GM,
    );
    expect(s.position[0]).toBe(42_164_200);
    expect(maxDiff(s.position, [42_164_200, 0, 0])).toBeLessThan(1e-9);
    expect(maxDiff(s.velocity, [0, Math.sqrt(GM / 42_164_200), 0])).toBeLessThan(1e-12);
  });

  it('elementsToState(elements, GM) satisfies the vis-viva equation and r = a(1 − e cos E), h = √(GM a (1 − e²)) (two-body identities, common practice, no source)', () => {
    fc.assert(
      fc.property(elementsArb, (el) => {
        const s = elementsToState(el, GM);
        const r = norm(s.position);
        const v = norm(s.velocity);
        const E = solveKepler(el.meanAnomaly, el.eccentricity);
        const p = s.position,
          u = s.velocity;
        const h = norm([p[1] * u[2] - p[2] * u[1], p[2] * u[0] - p[0] * u[2], p[0] * u[1] - p[1] * u[0]]);
        return (
          Math.abs(v * v - GM * (2 / r - 1 / el.semiMajorAxis)) <= 1e-12 * v * v &&
          Math.abs(r - el.semiMajorAxis * (1 - el.eccentricity * Math.cos(E))) <= 1e-12 * r &&
          Math.abs(h - Math.sqrt(GM * el.semiMajorAxis * (1 - el.eccentricity ** 2))) <= 1e-12 * h
        );
      }),
      { seed: SEED, numRuns: 2000 },
    );
  });

  it('elementsToState(elements, GM) puts the ascending node at RA Ω and the angular momentum at inclination i (geometry check)', () => {
    const el: KeplerianElements = {
      semiMajorAxis: 29_599_800,
      eccentricity: 0.1,
      inclination: 0.977,
      raan: 1.2,
      argumentOfPerigee: 0.4,
      meanAnomaly: 0,
    };
    // At argument of latitude u = ω + ν = 0 the satellite is at the ascending node.
    const nu = -el.argumentOfPerigee;
    const E = 2 * Math.atan(Math.sqrt((1 - el.eccentricity) / (1 + el.eccentricity)) * Math.tan(nu / 2));
    const s = elementsToState({ ...el, meanAnomaly: E - el.eccentricity * Math.sin(E) }, GM);
    expect(Math.abs(s.position[2])).toBeLessThan(1e-6);
    expect(angleDiff(Math.atan2(s.position[1], s.position[0]), el.raan)).toBeLessThan(1e-13);
    expect(s.velocity[2]).toBeGreaterThan(0);
    const p = s.position,
      u = s.velocity;
    const h = [p[1] * u[2] - p[2] * u[1], p[2] * u[0] - p[0] * u[2], p[0] * u[1] - p[1] * u[0]];
    expect(Math.acos(h[2]! / norm(h))).toBeCloseTo(el.inclination, 13);
  });

  it('elementsToState(elements, GM) rejects each invalid field, naming it', () => {
    const good: KeplerianElements = {
      semiMajorAxis: 26_561_750,
      eccentricity: 0.01,
      inclination: 0.96,
      raan: 0,
      argumentOfPerigee: 0,
      meanAnomaly: 0,
    };
    expect(() => elementsToState(null as unknown as KeplerianElements, GM)).toThrow(/elements must be an object/);
    expect(() => elementsToState({ ...good, semiMajorAxis: -1 }, GM)).toThrow(
      /elements\.semiMajorAxis must be in \[1, 10000000000000\] m; received -1/,
    );
    expect(() => elementsToState({ ...good, eccentricity: 1 }, GM)).toThrow(
      /elements\.eccentricity must be in \[0, 1\)/,
    );
    expect(() => elementsToState({ ...good, eccentricity: Number.NaN }, GM)).toThrow(/elements\.eccentricity/);
    expect(() => elementsToState({ ...good, inclination: 4 }, GM)).toThrow(
      /elements\.inclination must be in \[0, 3\.14159\d+\] rad; received 4/,
    );
    expect(() => elementsToState({ ...good, inclination: -0.1 }, GM)).toThrow(/elements\.inclination/);
    expect(() => elementsToState({ ...good, raan: Number.NaN }, GM)).toThrow(/elements\.raan/);
    expect(() => elementsToState({ ...good, argumentOfPerigee: Number.POSITIVE_INFINITY }, GM)).toThrow(
      /elements\.argumentOfPerigee/,
    );
    expect(() => elementsToState({ ...good, meanAnomaly: Number.NaN }, GM)).toThrow(/elements\.meanAnomaly/);
    expect(() => elementsToState(good, 0)).toThrow(/gm must be/);
    expect(() => elementsToState(good, Number.NaN)).toThrow(InvalidArgumentError);
  });
});

describe('stateToElements', () => {
  it('stateToElements(elementsToState(el)) returns the same elements away from degenerate angles (round trip, property)', () => {
    const regular = elementsArb.filter(
      (el) => el.eccentricity > 1e-6 && el.inclination > 1e-6 && el.inclination < Math.PI - 1e-6,
    );
    fc.assert(
      fc.property(regular, (el) => {
        const back = stateToElements(elementsToState(el, GM), GM);
        const angleTol = 1e-9 / Math.min(el.eccentricity, Math.sin(el.inclination)) + 1e-12;
        return (
          Math.abs(back.semiMajorAxis / el.semiMajorAxis - 1) <= 1e-12 &&
          Math.abs(back.eccentricity - el.eccentricity) <= 1e-12 &&
          Math.abs(back.inclination - el.inclination) <= 1e-12 &&
          angleDiff(back.raan, el.raan) <= angleTol &&
          angleDiff(back.argumentOfPerigee, el.argumentOfPerigee) <= angleTol &&
          angleDiff(back.meanAnomaly, el.meanAnomaly) <= angleTol
        );
      }),
      { seed: SEED, numRuns: 2000 },
    );
  });

  it('elementsToState(stateToElements(elementsToState(el))) reproduces the state for every orbit, degenerate ones included (property)', () => {
    fc.assert(
      fc.property(elementsArb, (el) => {
        const s1 = elementsToState(el, GM);
        const back = stateToElements(s1, GM);
        const s2 = elementsToState(back, GM);
        const r = norm(s1.position),
          v = norm(s1.velocity);
        return (
          maxDiff(s1.position, s2.position) <= 1e-11 * r &&
          maxDiff(s1.velocity, s2.velocity) <= 1e-11 * v &&
          back.raan >= 0 &&
          back.raan < 2 * Math.PI &&
          back.argumentOfPerigee >= 0 &&
          back.argumentOfPerigee < 2 * Math.PI &&
          back.meanAnomaly >= 0 &&
          back.meanAnomaly < 2 * Math.PI
        );
      }),
      { seed: SEED, numRuns: 3000 },
    );
  });

  it('stateToElements(state) of a circular inclined orbit puts the perigee at the node: ω = 0 and M = argument of latitude (documented convention)', () => {
    const el = stateToElements(
      elementsToState(
        {
          semiMajorAxis: 26_561_750,
          eccentricity: 0,
          inclination: 0.96,
          raan: 0.5,
          argumentOfPerigee: 0,
          meanAnomaly: 0.3,
        },
        GM,
      ),
      GM,
    );
    expect(el.eccentricity).toBeLessThan(1e-14);
    expect(el.argumentOfPerigee).toBe(0);
    expect(el.raan).toBeCloseTo(0.5, 14);
    expect(el.meanAnomaly).toBeCloseTo(0.3, 13);
  });

  it('stateToElements(state) of an equatorial orbit uses Ω = 0, the node line on +x, prograde and retrograde (documented convention)', () => {
    const pro = stateToElements(
      elementsToState(
        {
          semiMajorAxis: 42_164_200,
          eccentricity: 0.1,
          inclination: 0,
          raan: 1,
          argumentOfPerigee: 0.5,
          meanAnomaly: 0.2,
        },
        GM,
      ),
      GM,
    );
    expect(pro.raan).toBe(0);
    expect(pro.inclination).toBe(0);
    expect(pro.argumentOfPerigee).toBeCloseTo(1.5, 13); // longitude of perigee Ω + ω
    expect(pro.meanAnomaly).toBeCloseTo(0.2, 13);
    const retro = stateToElements(
      elementsToState(
        {
          semiMajorAxis: 42_164_200,
          eccentricity: 0,
          inclination: Math.PI,
          raan: 0,
          argumentOfPerigee: 0,
          meanAnomaly: 1,
        },
        GM,
      ),
      GM,
    );
    expect(retro.raan).toBe(0);
    expect(retro.inclination).toBeCloseTo(Math.PI, 15);
    expect(retro.argumentOfPerigee).toBe(0);
    expect(retro.meanAnomaly).toBeCloseTo(1, 13);
  });

  it('stateToElements(state) returns the true anomaly consistent with eccentricToTrueAnomaly at perigee and apogee', () => {
    const peri = stateToElements(
      elementsToState(
        {
          semiMajorAxis: 27_978_100,
          eccentricity: 0.158,
          inclination: 0.87,
          raan: 0.1,
          argumentOfPerigee: 0.2,
          meanAnomaly: 0,
        },
        GM,
      ),
      GM,
    );
    expect(angleDiff(peri.meanAnomaly, 0)).toBeLessThan(1e-14);
    const apo = stateToElements(
      elementsToState(
        {
          semiMajorAxis: 27_978_100,
          eccentricity: 0.158,
          inclination: 0.87,
          raan: 0.1,
          argumentOfPerigee: 0.2,
          meanAnomaly: Math.PI,
        },
        GM,
      ),
      GM,
    );
    expect(apo.meanAnomaly).toBeCloseTo(Math.PI, 13);
    expect(eccentricToTrueAnomaly(Math.PI, 0.158)).toBeCloseTo(Math.PI, 15);
  });

  it('stateToElements(state) rejects malformed vectors, a zero position, rectilinear motion and unbound states', () => {
    const ok: StateVector = { position: [26_561_750, 0, 0], velocity: [0, 3874, 0] };
    expect(() => stateToElements(undefined as unknown as StateVector, GM)).toThrow(/state must be an object/);
    expect(() =>
      stateToElements({ position: [1, 2] as unknown as StateVector['position'], velocity: ok.velocity }, GM),
    ).toThrow(/state\.position must be an array of three finite numbers in m/);
    expect(() => stateToElements({ position: [Number.NaN, 0, 0], velocity: ok.velocity }, GM)).toThrow(
      /state\.position\[0\]/,
    );
    expect(() => stateToElements({ position: ok.position, velocity: [0, Number.POSITIVE_INFINITY, 0] }, GM)).toThrow(
      /state\.velocity\[1\]/,
    );
    expect(() => stateToElements({ position: [0, 0, 0], velocity: ok.velocity }, GM)).toThrow(
      /\|state\.position\| must be in \[1, 10000000000000\] m; received 0/,
    );
    expect(() => stateToElements({ position: ok.position, velocity: [100, 0, 0] }, GM)).toThrow(
      /rectilinear motion has no orbit plane/,
    );
    expect(() => stateToElements({ position: ok.position, velocity: [0, 6000, 0] }, GM)).toThrow(
      /below escape speed .*parabolic or hyperbolic/,
    );
    expect(() => stateToElements(ok, -GM)).toThrow(/gm must be/);
    // Bound (v² < 2GM/r) but so nearly rectilinear that h² underflows and e rounds to 1.
    expect(() => stateToElements({ position: ok.position, velocity: [1000, 1e-200, 0] }, GM)).toThrow(
      /state must be a state on an elliptical orbit \(e < 1\).*computed e = 1/,
    );
  });
});
