/**
 * The steering planner's clock closed forms agree with the clock-model module they mirror
 * (Zucca & Tavella, IEEE Trans. UFFC 52(2) 289–296 (2005) [M citation]; physics-refs §11).
 * phaseVariance stays a scalar closed form because the planner calls it on every grid point;
 * these checks keep it equal to the general Φ P Φᵀ + Q(t) of clock-model.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { clockProcessNoise, clockTransitionMatrix, diffusionFromStabilitySpec } from '../../src/clock-model/index.js';
import {
  add3,
  choleskyPsd3,
  frobenius3,
  type Matrix3,
  mul3,
  mulVec3,
  phaseVariance,
  processNoise,
  quadForm3,
  transpose3,
} from '../../src/steering/clock-math.js';
import { noiseToDiffusion } from '../../src/steering/scenario.js';

describe('steering clock-math against clock-model', () => {
  it('phaseVariance(t, P0, q) equals [Φ(t) P0 Φ(t)ᵀ + clockProcessNoise(t, q, 3)]₁₁ to 1e-14 relative (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e7, noNaN: true }),
        fc.double({ min: 0, max: 1e-20, noNaN: true }),
        fc.double({ min: 0, max: 1e-30, noNaN: true }),
        fc.double({ min: 0, max: 1e-40, noNaN: true }),
        fc.double({ min: 0, max: 1e-16, noNaN: true }),
        fc.double({ min: 0, max: 1e-24, noNaN: true }),
        fc.double({ min: 0, max: 1e-34, noNaN: true }),
        (t, q1, q2, q3, pxx, pyy, pdd) => {
          const p0: Matrix3 = [
            [pxx, 0, 0],
            [0, pyy, 0],
            [0, 0, pdd],
          ];
          const phi = clockTransitionMatrix(t, 3)[0] as number[];
          let propagated = 0;
          for (let i = 0; i < 3; i++)
            for (let j = 0; j < 3; j++) propagated += (phi[i] as number) * p0[i]![j]! * (phi[j] as number);
          const expected = propagated + ((clockProcessNoise(t, { q1, q2, q3 }, 3)[0] as number[])[0] as number);
          const got = phaseVariance(t, p0, { q1, q2, q3 });
          expect(Math.abs(got - expected)).toBeLessThanOrEqual(1e-14 * Math.abs(expected) + 1e-300);
        },
      ),
      { seed: 20261202, numRuns: 300 },
    );
  });

  it('noiseToDiffusion({ stability }) returns exactly diffusionFromStabilitySpec(stability) (property)', () => {
    const point = fc.record({
      tau: fc.double({ min: 1e-3, max: 1e7, noNaN: true }),
      deviation: fc.double({ min: 0, max: 1e-9, noNaN: true }),
    });
    fc.assert(
      fc.property(
        fc.record(
          { whiteFrequency: point, randomWalkFrequency: point, randomWalkDrift: point },
          { requiredKeys: ['whiteFrequency'] },
        ),
        (spec) => {
          expect(noiseToDiffusion({ stability: spec })).toEqual(diffusionFromStabilitySpec(spec));
        },
      ),
      { seed: 20261202, numRuns: 200 },
    );
  });

  it('noiseToDiffusion names the scenario path in errors raised by diffusionFromStabilitySpec', () => {
    expect(() =>
      noiseToDiffusion({ stability: { randomWalkFrequency: { tau: -5, deviation: 1e-14 } } }, 'clock.noise'),
    ).toThrow(/^clock\.noise\.stability\.randomWalkFrequency\.tau must be/);
    expect(() =>
      noiseToDiffusion({ stability: { randomWalkDrift: { tau: 10, deviation: -1 } } }, 'clock.noise'),
    ).toThrow(/^clock\.noise\.stability\.randomWalkDrift\.deviation must be/);
    expect(() => noiseToDiffusion({ stability: {} }, 'clock.noise')).toThrow(
      /^clock\.noise\.stability must be at least one of/,
    );
  });
});

/** A 3×3 matrix of doubles spanning many magnitudes and both signs (zeros included). */
const matrix3 = (): fc.Arbitrary<Matrix3> => {
  const x = fc.oneof(fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.constant(0), fc.constant(-0));
  const row = fc.tuple(x, x, x);
  return fc.tuple(row, row, row);
};

describe('steering clock-math written out for 3×3 (bit for bit against the loops they replace)', () => {
  // The reference side is the textbook definition as a loop summed from 0 (common practice, no source):
  // the written-out forms must keep that order of rounding, so plans are reproduced to the last bit.
  it('mul3, add3, mulVec3, quadForm3 and frobenius3 equal their defining loops exactly (property)', () => {
    fc.assert(
      fc.property(matrix3(), matrix3(), fc.double({ min: -10, max: 10, noNaN: true }), (a, b, k) => {
        const product = mul3(a, b);
        const sum = add3(a, b, k);
        const v = b[0];
        const mv = mulVec3(a, v);
        let quad = 0;
        let inner = 0;
        for (let i = 0; i < 3; i++) {
          let row = 0;
          for (let j = 0; j < 3; j++) {
            let s = 0;
            for (let m = 0; m < 3; m++) s += a[i]![m]! * b[m]![j]!;
            expect(Object.is(product[i]![j], s)).toBe(true);
            expect(Object.is(sum[i]![j], a[i]![j]! + k * b[i]![j]!)).toBe(true);
            row = j === 0 ? a[i]![j]! * v[j]! : row + a[i]![j]! * v[j]!;
            quad += v[i]! * a[i]![j]! * v[j]!;
            inner += a[i]![j]! * b[i]![j]!;
          }
          expect(Object.is(mv[i], row)).toBe(true);
        }
        expect(Object.is(quadForm3(v, a), quad)).toBe(true);
        expect(Object.is(frobenius3(a, b), inner)).toBe(true);
      }),
      { seed: 20261203, numRuns: 300 },
    );
  });

  it('choleskyPsd3(A) returns a lower-triangular L with L Lᵀ = A for positive definite and singular A (property)', () => {
    // L Lᵀ = A is the definition of the Cholesky factor (Golub & Van Loan, Matrix Computations, 4th ed., §4.2 [M]);
    // A = B Bᵀ is positive semi-definite for any B, singular when a column of B is zero.
    fc.assert(
      fc.property(matrix3(), fc.integer({ min: -1, max: 2 }), (b, zeroColumn) => {
        const bb: Matrix3 = [
          [b[0][0], b[0][1], b[0][2]],
          [b[1][0], b[1][1], b[1][2]],
          [b[2][0], b[2][1], b[2][2]],
        ];
        if (zeroColumn >= 0) for (const r of bb) r[zeroColumn] = 0;
        const a = mul3(bb, transpose3(bb));
        const l = choleskyPsd3(a);
        expect([l[0][1], l[0][2], l[1][2]]).toEqual([0, 0, 0]);
        const back = mul3(l, transpose3(l));
        const scale = Math.max(a[0][0], a[1][1], a[2][2], 1e-300);
        for (let i = 0; i < 3; i++)
          for (let j = 0; j < 3; j++) expect(Math.abs(back[i]![j]! - a[i]![j]!)).toBeLessThanOrEqual(1e-9 * scale);
      }),
      { seed: 20261204, numRuns: 300 },
    );
  });

  it('choleskyPsd3(Q(τ)) with q3 = 0 gives a zero last column and reproduces Q(τ) (the singular process noise)', () => {
    const q = processNoise(900, { q1: 9e-24, q2: 3e-34, q3: 0 });
    const l = choleskyPsd3(q);
    expect([l[2][2], l[0][1], l[0][2], l[1][2]]).toEqual([0, 0, 0, 0]);
    const back = mul3(l, transpose3(l));
    for (let i = 0; i < 2; i++)
      for (let j = 0; j < 2; j++)
        expect(Math.abs(back[i]![j]! - q[i]![j]!)).toBeLessThanOrEqual(1e-12 * Math.abs(q[i]![i]! * q[j]![j]!) ** 0.5);
  });
});
