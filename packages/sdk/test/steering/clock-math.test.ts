/**
 * The steering planner's clock closed forms agree with the clock-model module they mirror
 * (Zucca & Tavella, IEEE Trans. UFFC 52(2) 289–296 (2005) [M citation]; physics-refs §11).
 * phaseVariance stays a scalar closed form because the planner calls it on every grid point;
 * these checks keep it equal to the general Φ P Φᵀ + Q(t) of clock-model.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { clockProcessNoise, clockTransitionMatrix, diffusionFromStabilitySpec } from '../../src/clock-model/index.js';
import { type Matrix3, phaseVariance } from '../../src/steering/clock-math.js';
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
