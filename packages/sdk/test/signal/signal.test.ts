import { describe, expect, it } from 'vitest';
import { GPS_ICD, SPEED_OF_LIGHT } from '../../src/constants.js';
import { ConvergenceError, InvalidArgumentError } from '../../src/errors.js';
import {
  maximumSagnacCorrection,
  sagnacCorrection,
  sagnacDelayForArea,
  shapiroDelay,
  shapiroDelayBetween,
  solveLightTimeEarthFixed,
  solveLightTimeInertial,
} from '../../src/signal/index.js';
import type { Vector3 } from '../../src/units.js';

const W = GPS_ICD.earthRotationRate;
const R = 6_378_137;
const A = 26_561_750;
const N = Math.sqrt(GPS_ICD.gm / A ** 3);

/** Inertial circular orbit, inclined 55°. */
function satelliteInertial(t: number): Vector3 {
  const u = 0.8 + N * t;
  const ci = Math.cos(0.96),
    si = Math.sin(0.96);
  return [A * Math.cos(u), A * Math.sin(u) * ci, A * Math.sin(u) * si];
}
/** The same satellite in an Earth-fixed frame with θ = W·t. */
function satelliteEcef(t: number): Vector3 {
  const p = satelliteInertial(t);
  const c = Math.cos(W * t),
    s = Math.sin(W * t);
  return [c * p[0] + s * p[1], -s * p[0] + c * p[1], p[2]];
}
const receiverEcef: Vector3 = [R * Math.cos(0.7) * Math.cos(0.3), R * Math.cos(0.7) * Math.sin(0.3), R * Math.sin(0.7)];

describe('Sagnac and Shapiro terms (formulas)', () => {
  it('sagnacCorrection is antisymmetric in the two positions and zero for a satellite straight above on the same meridian', () => {
    const s: Vector3 = [1.5e7, 2.1e7, 5e6];
    expect(sagnacCorrection(s, receiverEcef, W)).toBeCloseTo(-sagnacCorrection(receiverEcef, s, W), 22);
    expect(sagnacCorrection([3 * R, 0, 1e7], [R, 0, 0], W)).toBe(0);
  });
  it('sagnacDelayForArea is 2ΩA/c² and maximumSagnacCorrection uses the horizon geometry', () => {
    expect(sagnacDelayForArea(1e12, W)).toBeCloseTo((2 * W * 1e12) / SPEED_OF_LIGHT ** 2, 22);
    const m = maximumSagnacCorrection(R, A, W);
    const theta = Math.acos(R / A);
    // satellite west of the receiver on the horizon: the receiver moves away from it, positive correction
    expect(m).toBeCloseTo(sagnacCorrection([A * Math.cos(theta), -A * Math.sin(theta), 0], [R, 0, 0], W), 22);
  });
  it('shapiroDelayBetween equals shapiroDelay with the distances it implies', () => {
    const x1: Vector3 = [A, 0, 0];
    const x2: Vector3 = [R * Math.cos(0.5), R * Math.sin(0.5), 0];
    const rho = Math.hypot(x1[0] - x2[0], x1[1] - x2[1]);
    expect(shapiroDelayBetween(x1, x2)).toBeCloseTo(shapiroDelay(A, R, rho), 25);
  });
  it('signal terms reject non-finite vectors, implausible rotation rates and impossible geometry', () => {
    expect(() => sagnacCorrection([Number.NaN, 0, 0], receiverEcef)).toThrow(/satellitePositionEcef\[0\]/);
    expect(() => sagnacCorrection([1, 0, 0], receiverEcef, 7.29)).toThrow(/earthRotationRate/);
    expect(() => sagnacDelayForArea(Infinity)).toThrow(/projectedArea/);
    expect(() => maximumSagnacCorrection(A, R)).toThrow(/satelliteRadius/);
    expect(() => shapiroDelay(A, R, A + R)).toThrow(/triangle inequality/);
    expect(() => shapiroDelay(0, R, 1)).toThrow(/r1/);
    expect(() => shapiroDelayBetween([R, 0, 0], [R, 0, 0])).toThrow(/distinct/);
  });
});

describe('light-time iteration', () => {
  it('solveLightTimeInertial and solveLightTimeEarthFixed give the same transmit time to 1e-15 s (frame independence)', () => {
    const tr = 5000;
    const fixed = solveLightTimeEarthFixed(tr, receiverEcef, satelliteEcef, { earthRotationRate: W });
    const c = Math.cos(W * tr),
      s = Math.sin(W * tr);
    const receiverInertial: Vector3 = [
      c * receiverEcef[0] - s * receiverEcef[1],
      s * receiverEcef[0] + c * receiverEcef[1],
      receiverEcef[2],
    ];
    const inertial = solveLightTimeInertial(tr, receiverInertial, satelliteInertial);
    expect(Math.abs(fixed.transmitTime - inertial.transmitTime)).toBeLessThan(1e-15 * 1e4);
    expect(Math.abs(fixed.flightTime - inertial.flightTime)).toBeLessThan(1e-15);
    expect(fixed.iterations).toBeLessThanOrEqual(5);
    // the residual of the light-time equation is below the tolerance
    const x = satelliteInertial(inertial.transmitTime);
    const range = Math.hypot(x[0] - receiverInertial[0], x[1] - receiverInertial[1], x[2] - receiverInertial[2]);
    expect(Math.abs(range / SPEED_OF_LIGHT + inertial.shapiroDelay - inertial.flightTime)).toBeLessThan(1e-15);
  });
  it('solveLightTimeEarthFixed: the Earth-rotation effect on the flight time equals the first-order Sagnac formula to 5 ps', () => {
    const fixed = solveLightTimeEarthFixed(5000, receiverEcef, satelliteEcef, {
      earthRotationRate: W,
      includeShapiro: false,
    });
    const p = fixed.satellitePositionAtTransmitEcef;
    const unrotated =
      Math.hypot(p[0] - receiverEcef[0], p[1] - receiverEcef[1], p[2] - receiverEcef[2]) / SPEED_OF_LIGHT;
    expect(Math.abs(fixed.flightTime - unrotated - fixed.sagnacCorrection)).toBeLessThan(5e-12);
    expect(fixed.shapiroDelay).toBe(0);
  });
  it('solveLightTime* throw ConvergenceError when the iteration limit is too small, and reject bad input', () => {
    expect(() => solveLightTimeInertial(0, receiverEcef, satelliteInertial, { maxIterations: 1 })).toThrow(
      ConvergenceError,
    );
    expect(() => solveLightTimeInertial(Number.NaN, receiverEcef, satelliteInertial)).toThrow(/receiveTime/);
    expect(() => solveLightTimeInertial(0, receiverEcef, 'sat' as never)).toThrow(
      /satellitePosition must be a function/,
    );
    expect(() => solveLightTimeInertial(0, receiverEcef, () => [Number.NaN, 0, 0])).toThrow(InvalidArgumentError);
    expect(() => solveLightTimeInertial(0, receiverEcef, satelliteInertial, { tolerance: 0 })).toThrow(/tolerance/);
    expect(() =>
      solveLightTimeInertial(0, receiverEcef, satelliteInertial, { includeShapiro: 'yes' as never }),
    ).toThrow(/includeShapiro/);
    expect(() => solveLightTimeEarthFixed(0, receiverEcef, satelliteEcef, { earthRotationRate: 1 })).toThrow(
      /earthRotationRate/,
    );
    expect(() => solveLightTimeEarthFixed(0, receiverEcef, null as never)).toThrow(
      /satellitePositionEcef must be a function/,
    );
  });
});
