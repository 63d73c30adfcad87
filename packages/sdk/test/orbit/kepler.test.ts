import fc from 'fast-check';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ConvergenceError, InvalidArgumentError } from '../../src/errors.js';
import {
  eccentricToMeanAnomaly,
  eccentricToTrueAnomaly,
  keplerTolerance,
  meanMotion,
  orbitalPeriod,
  solveKepler,
  trueToEccentricAnomaly,
} from '../../src/orbit/index.js';

const SEED = 20261202;
const residual = (E: number, e: number, M: number): number => E - e * Math.sin(E) - M;

/** Eccentricities in [0, 0.999] with the edges (0, tiny, 0.999) drawn often. */
const eccentricity = fc.oneof(
  fc.double({ min: 0, max: 0.999, noNaN: true }),
  fc.constantFrom(0, Number.MIN_VALUE, 1e-300, 1e-12, 0.5, 0.9, 0.99, 0.998, 0.999),
);
/** Mean anomalies in [−π, π] with the edges (0, ±tiny, ±π and its neighbours) drawn often. */
const meanAnomaly = fc.oneof(
  fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }),
  fc.constantFrom(
    0,
    -0,
    1e-300,
    -1e-300,
    1e-12,
    -1e-9,
    Math.PI,
    -Math.PI,
    Math.PI - 1e-15,
    -(Math.PI - 1e-12),
    3.1415926535898 - 1e-13,
  ),
);

describe('solveKepler', () => {
  it('solveKepler(M, e) returns E with |E − e·sin E − M| ≤ 1e-15 over e ∈ [0, 0.999], M ∈ [−π, π] including the edges (property, fixed seed)', () => {
    fc.assert(
      fc.property(meanAnomaly, eccentricity, (M, e) => {
        const E = solveKepler(M, e);
        return Math.abs(residual(E, e, M)) <= 1e-15;
      }),
      { seed: SEED, numRuns: 20000 },
    );
  });

  it('solveKepler(M, e) keeps E in the same revolution as M: |E − M| ≤ e and E has the sign of M (property)', () => {
    fc.assert(
      fc.property(meanAnomaly, eccentricity, (M, e) => {
        const E = solveKepler(M, e);
        return (
          Math.abs(E - M) <= e + 1e-15 && (M === 0 ? E === 0 : Math.sign(E) === Math.sign(M)) && Math.abs(E) <= Math.PI
        );
      }),
      { seed: SEED, numRuns: 5000 },
    );
  });

  it('solveKepler(M, e) is odd in M and 2π-periodic in E − M beyond one revolution (property)', () => {
    fc.assert(
      fc.property(meanAnomaly, eccentricity, fc.integer({ min: -50, max: 50 }), (M, e, k) => {
        const E = solveKepler(M, e);
        expect(solveKepler(-M, e) === -E).toBe(true);
        const Mk = M + 2 * Math.PI * k;
        const Ek = solveKepler(Mk, e);
        // Mk itself carries a rounding of up to ulp(Mk)/2, amplified by dE/dM = 1/(1 − e cos E) ≤ 1/(1 − e).
        const conditioning = (8 * keplerTolerance(Mk)) / (1 - e);
        return (
          Math.abs(residual(Ek, e, Mk)) <= keplerTolerance(Mk) &&
          Math.abs(Ek - 2 * Math.PI * k - E) <= 1e-12 + conditioning
        );
      }),
      { seed: SEED, numRuns: 3000 },
    );
  });

  it('solveKepler(M, 0) returns M exactly and solveKepler(0, e) returns 0', () => {
    expect(solveKepler(1.234, 0)).toBe(1.234);
    expect(solveKepler(0, 0.999)).toBe(0);
    expect(solveKepler(Math.PI, 0.7)).toBe(Math.PI);
  });

  it('solveKepler(M, e) handles the near-parabolic corner e = 0.999, M = 1e-3, where E − e sin E = (1 − e)E + e(E³/3! − E⁵/5! + E⁷/7! − …) (Taylor series, common practice, no source)', () => {
    const e = 0.999,
      M = 1e-3;
    const E = solveKepler(M, e);
    expect(Math.abs(residual(E, e, M))).toBeLessThanOrEqual(1e-15);
    // Root of the series truncated after x⁷ by bisection (an independent method); the neglected x⁹ term shifts the root by ~2e-10 relative here.
    const series = (x: number): number => (1 - e) * x + e * (x ** 3 / 6 - x ** 5 / 120 + x ** 7 / 5040);
    let lo = 0,
      hi = 1;
    for (let k = 0; k < 200; k++) {
      const x = (lo + hi) / 2;
      if (series(x) > M) hi = x;
      else lo = x;
    }
    expect(Math.abs(E / lo - 1)).toBeLessThan(1e-9);
  });

  it('solveKepler(M, e) rejects e outside [0, 1), NaN and a non-finite M', () => {
    expect(() => solveKepler(1, 1)).toThrow(InvalidArgumentError);
    expect(() => solveKepler(1, 1)).toThrow(
      /eccentricity must be in \[0, 1\) for an elliptical orbit; received 1\. e ≥ 1/,
    );
    expect(() => solveKepler(1, -0.1)).toThrow(/eccentricity cannot be negative/);
    expect(() => solveKepler(1, Number.NaN)).toThrow(/eccentricity must be .*received NaN/);
    expect(() => solveKepler(Number.NaN, 0.1)).toThrow(/meanAnomaly must be a finite angle in radians; received NaN/);
    expect(() => solveKepler(Number.POSITIVE_INFINITY, 0.1)).toThrow(/meanAnomaly/);
    expect(() => solveKepler('1' as unknown as number, 0.1)).toThrow(/meanAnomaly/);
  });
});

describe('solveKepler convergence guard', () => {
  afterEach(() => {
    vi.restoreAllMocks();
  });

  it('solveKepler(M, e) throws ConvergenceError naming M, e and the residual when the bound cannot be met (sin made to return NaN)', () => {
    // The guard is unreachable with a correct Math.sin; a broken one is the only way to exercise it.
    vi.spyOn(Math, 'sin').mockReturnValue(Number.NaN);
    expect(() => solveKepler(1, 0.5)).toThrow(ConvergenceError);
    expect(() => solveKepler(1, 0.5)).toThrow(
      /solveKepler\(M = 1, e = 0\.5\) did not converge after \d+ iterations \(residual NaN\)/,
    );
  });
});

describe('anomaly relations', () => {
  it('eccentricToTrueAnomaly(E, e) agrees with tan(ν/2) = √((1+e)/(1−e))·tan(E/2) (textbook half-angle form, e.g. Vallado §2.2 [M]) and keeps the revolution', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -3.1, max: 3.1, noNaN: true }),
        eccentricity,
        fc.integer({ min: -3, max: 3 }),
        (E, e, k) => {
          const nu = eccentricToTrueAnomaly(E, e);
          const halfAngle = 2 * Math.atan(Math.sqrt((1 + e) / (1 - e)) * Math.tan(E / 2));
          const shifted = eccentricToTrueAnomaly(E + 2 * Math.PI * k, e);
          return (
            Math.abs(nu - halfAngle) <= (1e-12 * (1 + Math.abs(halfAngle))) / (1 - e) &&
            Math.abs(shifted - 2 * Math.PI * k - nu) <= 1e-12
          );
        },
      ),
      { seed: SEED, numRuns: 3000 },
    );
  });

  it('trueToEccentricAnomaly(eccentricToTrueAnomaly(E, e), e) returns E (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -10, max: 10, noNaN: true }), eccentricity, (E, e) => {
        return Math.abs(trueToEccentricAnomaly(eccentricToTrueAnomaly(E, e), e) - E) <= 1e-13 / Math.max(1e-3, 1 - e);
      }),
      { seed: SEED, numRuns: 3000 },
    );
  });

  it('eccentricToMeanAnomaly(solveKepler(M, e), e) returns M to 1e-15 (property)', () => {
    fc.assert(
      fc.property(
        meanAnomaly,
        eccentricity,
        (M, e) => Math.abs(eccentricToMeanAnomaly(solveKepler(M, e), e) - M) <= 1e-15,
      ),
      { seed: SEED, numRuns: 3000 },
    );
  });

  it('the anomaly functions reject bad input naming the field', () => {
    expect(() => eccentricToTrueAnomaly(Number.NaN, 0.1)).toThrow(/eccentricAnomaly/);
    expect(() => eccentricToTrueAnomaly(1, 1.5)).toThrow(/eccentricity/);
    expect(() => trueToEccentricAnomaly(Number.NaN, 0.1)).toThrow(/trueAnomaly/);
    expect(() => trueToEccentricAnomaly(1, -1)).toThrow(/eccentricity/);
    expect(() => eccentricToMeanAnomaly(Number.NaN, 0.1)).toThrow(/eccentricAnomaly/);
    expect(() => eccentricToMeanAnomaly(1, 1)).toThrow(/eccentricity/);
  });
});

describe('meanMotion and orbitalPeriod', () => {
  it('orbitalPeriod(26 561 750 m, GM IERS) is 11.967 h (physics-refs §2 per-system table [C])', () => {
    expect(orbitalPeriod(26_561_750, 3.986004418e14) / 3600).toBeCloseTo(11.967, 3);
  });
  it('orbitalPeriod(a, GM) is 2π/meanMotion(a, GM) and meanMotion(a, GM)²·a³ = GM', () => {
    const n = meanMotion(42_164_200, 3.986004418e14);
    expect((n * n * 42_164_200 ** 3) / 3.986004418e14).toBeCloseTo(1, 14);
    expect(orbitalPeriod(42_164_200, 3.986004418e14)).toBeCloseTo((2 * Math.PI) / n, 6);
    expect(orbitalPeriod(42_164_200, 3.986004418e14) / 3600).toBeCloseTo(23.934, 3);
  });
  it('meanMotion(a, GM) and orbitalPeriod(a, GM) reject a ≤ 0, NaN and GM ≤ 0', () => {
    expect(() => meanMotion(0, 3.986e14)).toThrow(
      /semiMajorAxis must be in \[1, 10000000000000\] m \(1 m up to beyond the planets\); received 0/,
    );
    expect(() => meanMotion(Number.NaN, 3.986e14)).toThrow(/semiMajorAxis/);
    expect(() => meanMotion(7e6, -1)).toThrow(
      /gm must be in \(0, 1e\+21\] m³\/s² \(the Sun's is 1\.3e20\); received -1/,
    );
    expect(() => orbitalPeriod(-7e6, 3.986e14)).toThrow(InvalidArgumentError);
  });
});

describe('keplerTolerance(M)', () => {
  it('keplerTolerance(M) is 1e-15 within a half revolution and 4 ulp(M) beyond (ulp(100) = 2^-46, IEEE 754 binary64)', () => {
    expect(keplerTolerance(3)).toBe(1e-15);
    expect(keplerTolerance(100)).toBe(4 * 2 ** -46);
    expect(keplerTolerance(-100)).toBe(4 * 2 ** -46);
    // 2^k exactly: the next double up is 2^k(1 + 2^-52), so ulp = 2^(k-52).
    expect(keplerTolerance(2 ** 10)).toBe(4 * 2 ** -42);
    expect(keplerTolerance(1e6)).toBe(4 * 2 ** (19 - 52));
  });
});
