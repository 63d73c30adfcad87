import { describe, expect, it } from 'vitest';
import { IERS_2010 } from '../../src/constants.js';
import { ConvergenceError, InvalidArgumentError } from '../../src/errors.js';
import { elementsToState } from '../../src/orbit/elements.js';
import { integrateDop853 } from '../../src/orbit/integrator.js';

const decay = (_t: number, y: Float64Array, dy: Float64Array): void => {
  dy[0] = -y[0]!;
};
const oscillator = (_t: number, y: Float64Array, dy: Float64Array): void => {
  dy[0] = y[1]!;
  dy[1] = -y[0]!;
};

describe('integrateDop853 (Dormand–Prince 8(5,3), Hairer, Nørsett & Wanner 1993 §II.5–II.6)', () => {
  it('integrateDop853(f, t0, y0, tEnd) solves y′ = −y to 1e-12 relative (exact solution e^−t, independent closed form)', () => {
    const r = integrateDop853(decay, 0, [1], 10, { relativeTolerance: 1e-13, absoluteTolerance: 1e-20 });
    expect(Math.abs(r.finalState[0]! / Math.exp(-10) - 1)).toBeLessThan(1e-12);
    expect(r.acceptedSteps).toBeGreaterThan(0);
    expect(r.functionEvaluations).toBeGreaterThan(12 * r.acceptedSteps);
  });

  it('integrateDop853 dense output matches the exact harmonic oscillator between steps to 1e-11 (7th-order interpolant)', () => {
    const times = Float64Array.from({ length: 1001 }, (_, k) => (k * 20 * Math.PI) / 1000);
    const r = integrateDop853(oscillator, 0, [1, 0], 20 * Math.PI, {
      relativeTolerance: 1e-13,
      absoluteTolerance: 1e-15,
      sampleTimes: times,
    });
    let worst = 0;
    for (let k = 0; k < times.length; k++) {
      worst = Math.max(
        worst,
        Math.abs(r.samples[2 * k]! - Math.cos(times[k]!)),
        Math.abs(r.samples[2 * k + 1]! + Math.sin(times[k]!)),
      );
    }
    expect(worst).toBeLessThan(1e-11);
    // the steps are much longer than the sample spacing, so most samples come from the interpolant
    expect(r.acceptedSteps).toBeLessThan(times.length);
  });

  it('integrateDop853 global error falls as the tolerance is tightened (error roughly proportional to the tolerance)', () => {
    const err = [1e-6, 1e-8, 1e-10, 1e-12].map((tol) => {
      const r = integrateDop853(oscillator, 0, [1, 0], 10 * Math.PI, {
        relativeTolerance: tol,
        absoluteTolerance: tol,
      });
      return Math.abs(r.finalState[0]! - 1); // cos(10π) = 1
    });
    for (let k = 1; k < err.length; k++) expect(err[k]!).toBeLessThan(err[k - 1]!);
    expect(err[3]!).toBeLessThan(1e-11);
  });

  it('integrateDop853 returns a two-body orbit to its start after one period to 1 mm (Kepler closed form)', () => {
    const gm = IERS_2010.gm;
    const a = 26_561_750;
    const s0 = elementsToState(
      { semiMajorAxis: a, eccentricity: 0.1, inclination: 0.96, raan: 0.3, argumentOfPerigee: 1.1, meanAnomaly: 0.4 },
      gm,
    );
    const period = 2 * Math.PI * Math.sqrt(a ** 3 / gm);
    const f = (_t: number, y: Float64Array, dy: Float64Array): void => {
      const r3 = Math.hypot(y[0]!, y[1]!, y[2]!) ** 3;
      dy[0] = y[3]!;
      dy[1] = y[4]!;
      dy[2] = y[5]!;
      dy[3] = (-gm * y[0]!) / r3;
      dy[4] = (-gm * y[1]!) / r3;
      dy[5] = (-gm * y[2]!) / r3;
    };
    const r = integrateDop853(f, 0, [...s0.position, ...s0.velocity], period, {
      relativeTolerance: 1e-13,
      absoluteTolerance: 1e-9,
    });
    const dr = Math.hypot(
      r.finalState[0]! - s0.position[0],
      r.finalState[1]! - s0.position[1],
      r.finalState[2]! - s0.position[2],
    );
    expect(dr).toBeLessThan(1e-3);
  });

  it('integrateDop853 with keepDenseOutput evaluates anywhere in the span and agrees with the samples', () => {
    const times = [0, 0.5, 1.7, 3];
    const r = integrateDop853(oscillator, 0, [1, 0], 3, { sampleTimes: times, keepDenseOutput: true });
    for (let k = 0; k < times.length; k++) expect(r.evaluate(times[k]!)[0]).toBeCloseTo(r.samples[2 * k]!, 14);
    expect(r.evaluate(2.2)[0]).toBeCloseTo(Math.cos(2.2), 10);
    expect(() => r.evaluate(3.5)).toThrow(InvalidArgumentError);
    const noDense = integrateDop853(oscillator, 0, [1, 0], 3);
    expect(() => noDense.evaluate(1)).toThrow(/keepDenseOutput/);
  });

  it('integrateDop853 calls onStep after each accepted step and stops when it throws', () => {
    let calls = 0;
    integrateDop853(decay, 0, [1], 1, {
      onStep: () => {
        calls++;
      },
    });
    expect(calls).toBeGreaterThan(0);
    expect(() =>
      integrateDop853(decay, 0, [1], 1, {
        onStep: () => {
          throw new RangeError('stop');
        },
      }),
    ).toThrow(RangeError);
  });

  it('integrateDop853 rejects tEnd ≤ t0, non-finite y0, bad tolerances and bad sample times with InvalidArgumentError', () => {
    expect(() => integrateDop853(decay, 1, [1], 1)).toThrow(/tEnd must be greater than t0/);
    expect(() => integrateDop853(decay, 0, [Number.NaN], 1)).toThrow(/y0\[0\]/);
    expect(() => integrateDop853(decay, 0, [], 1)).toThrow(InvalidArgumentError);
    expect(() => integrateDop853(decay, Number.NaN, [1], 1)).toThrow(/t0/);
    expect(() => integrateDop853(decay, 0, [1], 1, { relativeTolerance: 0 })).toThrow(/relativeTolerance/);
    expect(() => integrateDop853(decay, 0, [1], 1, { relativeTolerance: 1e-17 })).toThrow(/rounding/);
    expect(() => integrateDop853(decay, 0, [1], 1, { absoluteTolerance: -1 })).toThrow(/absoluteTolerance/);
    expect(() => integrateDop853(decay, 0, [1], 1, { absoluteTolerance: [1e-9, 1e-9] })).toThrow(
      /one value per state component/,
    );
    expect(() => integrateDop853(decay, 0, [1], 1, { absoluteTolerance: [0] })).toThrow(/absoluteTolerance\[0\]/);
    expect(() => integrateDop853(decay, 0, [1], 1, { sampleTimes: [0.5, 0.4] })).toThrow(/strictly increasing/);
    expect(() => integrateDop853(decay, 0, [1], 1, { sampleTimes: [2] })).toThrow(/within \[0, 1\]/);
    expect(() => integrateDop853(decay, 0, [1], 1, { maxSteps: 0 })).toThrow(/maxSteps/);
    expect(() => integrateDop853(decay, 0, [1], 1, { initialStep: -1 })).toThrow(/initialStep/);
    expect(() => integrateDop853(decay, 0, [1], 1, { maxStep: 0 })).toThrow(/maxStep/);
  });

  it('integrateDop853 throws ConvergenceError when maxSteps is exceeded or the solution blows up', () => {
    expect(() => integrateDop853(oscillator, 0, [1, 0], 1000, { maxSteps: 3 })).toThrow(ConvergenceError);
    // y′ = y², y(0) = 1 has a pole at t = 1.
    const blowUp = (_t: number, y: Float64Array, dy: Float64Array): void => {
      dy[0] = y[0]! * y[0]!;
    };
    expect(() => integrateDop853(blowUp, 0, [1], 2)).toThrow(ConvergenceError);
    const bad = (_t: number, _y: Float64Array, dy: Float64Array): void => {
      dy[0] = Number.NaN;
    };
    expect(() => integrateDop853(bad, 0, [1], 1)).toThrow(/non-finite/);
  });
});
