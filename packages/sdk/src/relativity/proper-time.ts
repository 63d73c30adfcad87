/**
 * Numerical proper time of an orbiting clock: the orbit and τ − TT integrated together,
 *   d(τ − TT)/dTT = L_G − (U + v²/2)/c²
 * (IERS Conventions 2010 §10.2, eq. 10.9 form, with U from a selectable gravity model), in a
 * geocentric non-rotating frame with z along the Earth's rotation axis.
 *
 * The orbit's time argument is taken as TT. Strictly the geocentric equations of motion run in
 * TCG; the difference (a rate of L_G ≈ 7e-10 on the time axis) changes τ − TT by < 1e-18 s per day
 * of the periodic terms and is ignored.
 *
 * @module
 */

import { type ConstantSet, DEFAULT_CONSTANT_SET, SPEED_OF_LIGHT_SQUARED } from '../constants.js';
import { InvalidArgumentError, OutOfDomainError } from '../errors.js';
import { at } from '../internal/checked.js';
import {
  requireConstantSet,
  requireInRange,
  requireObject,
  requireOptions,
  requireOrbitRadius,
  requirePositive,
  requireVector3,
} from '../internal/validate.js';
import { requireStateVector, type StateVector } from '../orbit/elements.js';
import { LOW_PRECISION_EPHEMERIS_NAME, moonPositionAt } from '../orbit/ephemeris.js';
import { createGravityField, GRAVITY_MODELS, type GravityModel } from '../orbit/forces.js';
import { integrateDop853 } from '../orbit/integrator.js';
import type { Instant } from '../time/instant.js';
import { J2000_EPOCH, requireEpochInstant, ttSecondsSinceJ2000 } from '../time/j2000.js';
import type { Seconds, Vector3 } from '../units.js';
import { MOON_MEAN_RADIUS } from './reference-clocks.js';

/** Largest number of output samples one call may return. */
export const MAX_PROPER_TIME_SAMPLES = 10_000_000;

/** Options of {@link integrateProperTime}. */
export interface ProperTimeOptions {
  /** Force and clock-potential model (default `j2`). */
  model?: GravityModel;
  /** Earth constants (GM, J2, a_e, L_G); default IERS 2010. */
  constants?: ConstantSet;
  /**
   * The instant of t = 0 (default {@link J2000_EPOCH}, 2000-01-01T12:00:00 TT): the Sun/Moon positions of the
   * `full` model are taken at TT = epoch + t. Build it with `createTimeScales(table).parseIso(text, 'TT')` or
   * `instantFromTtSecondsSinceJ2000(seconds)`.
   */
  epoch?: Instant;
  /**
   * Relative tolerance of the integrator (default 1e-12). Absolute tolerances are derived from it:
   * rtol × 1 m, rtol × 1e-3 m/s and rtol × 1e-4 s for position, velocity and τ − TT.
   */
  relativeTolerance?: number;
  /** Called after each accepted integrator step with the time reached and the duration, both in seconds (e.g. for a progress bar). */
  onProgress?: (reachedSeconds: Seconds, durationSeconds: Seconds) => void;
}

/** Result of {@link integrateProperTime}. */
export interface ProperTimeResult {
  /** Sample times, seconds since the start (0, step, 2·step, …, and the duration itself). */
  readonly t: Float64Array;
  /** τ − TT at each sample, seconds, 0 at t = 0. */
  readonly tauMinusTT: Float64Array;
  /** Position and velocity at each sample, 6 values per sample (m, m/s), same frame as the input state. */
  readonly states: Float64Array;
  readonly model: GravityModel;
  /** Name of the constant set used. */
  readonly constants: string;
  /** The instant of t = 0 (matters only for `full`). */
  readonly epoch: Instant;
  /** Ephemeris used for `full` (empty otherwise). */
  readonly ephemeris: string;
  readonly relativeTolerance: number;
  readonly acceptedSteps: number;
  readonly rejectedSteps: number;
}

/** Longest integration accepted, in seconds (about 317 years; our own bound, far beyond any clock analysis). */
const MAX_PROPER_TIME_DURATION = 1e10;

/** Output epochs (s from the start): every `step` up to `duration`, plus `duration` itself when off the grid. */
function sampleTimes(duration: number, step: number): Float64Array {
  const whole = Math.floor(duration / step + 1e-9);
  const endsOnGrid = Math.abs(whole * step - duration) <= 1e-9 * duration;
  const count = whole + 1 + (endsOnGrid ? 0 : 1);
  if (count > MAX_PROPER_TIME_SAMPLES) {
    throw new InvalidArgumentError(
      'step',
      step,
      `large enough for at most ${MAX_PROPER_TIME_SAMPLES} samples over ${duration} s`,
    );
  }
  const times = new Float64Array(count);
  for (let k = 0; k <= whole; k++) times[k] = Math.min(k * step, duration);
  times[count - 1] = duration;
  return times;
}

/** Throws when the trajectory at `t` (s after the start, TT axis from `epoch`) is inside the Moon. */
function requireOutsideMoon(epoch: number, t: number, y: Float64Array): void {
  // A lunar orbiter that decays: the Moon's mean radius (IAU WGCCRE [M]) bounds its trajectory.
  const m = moonPositionAt(epoch, t, true);
  const rho = Math.hypot(at(y, 0, 'y') - m[0], at(y, 1, 'y') - m[1], at(y, 2, 'y') - m[2]);
  if (rho <= MOON_MEAN_RADIUS) {
    throw new OutOfDomainError(
      "distance from the Moon's centre",
      rho,
      `${MOON_MEAN_RADIUS} m (the Moon's mean radius)`,
      '∞',
      `the orbit hits the Moon by t = ${t} s after the start; check the state and the epoch`,
    );
  }
}

/**
 * Integrates an orbit together with its clock's proper time τ − TT.
 *
 * Equations: r̈ = ∇U (model `point-mass`, `j2` or `full`, see createGravityField), and
 * d(τ − TT)/dt = L_G − (U(r, t) + v²/2)/c², with τ − TT = 0 at t = 0.
 * Integrator: Dormand–Prince 8(5,3) with 7th-order dense output for the samples.
 *
 * Accuracy: with the default tolerance (1e-12), τ − TT agrees with a converged solution (tolerance
 * 1e-14) to < 1 ps over one day for LEO, MEO, GEO and e ≈ 0.16 orbits (SDK tests); the physical
 * model error is larger: `point-mass` omits J2 (≈ 1e-13 s periodic at GNSS altitude, more at LEO),
 * `j2` omits tides (< 1e-15 of frequency up to GNSS altitude, IERS 2010 §10.2) and higher harmonics,
 * `full` is limited by its low-precision ephemeris (tidal potential < 1e-17 of frequency error).
 *
 * @param state    Initial position (m) and velocity (m/s), geocentric, non-rotating, z along the rotation axis.
 * @param duration Span to integrate, seconds (> 0).
 * @param step     Output sample spacing, seconds (0 < step ≤ duration).
 * @param options  Model, constants, epoch (an Instant), tolerance.
 * @returns Samples of τ − TT and the state.
 * @throws {InvalidArgumentError} for a non-finite state, a position inside the Earth (with a km hint),
 *   duration ≤ 0, step ≤ 0 or larger than the duration, too many samples, or an unknown model.
 * @throws {OutOfDomainError} if the trajectory enters the Earth (or, for `full`, the Moon) during the integration.
 * @throws {ConvergenceError} if the integrator cannot meet the tolerance.
 * @see IERS Conventions (2010), IERS TN 36, §10.2 eqs. 10.6–10.9 [V1]; Hairer, Nørsett & Wanner (1993) §II.5–II.6 [M].
 */
export function integrateProperTime(
  state: StateVector,
  duration: Seconds,
  step: Seconds,
  options: ProperTimeOptions = {},
): ProperTimeResult {
  const { position: p, velocity: v } = requireStateVector(state);
  requireOptions('options', options);
  const constants =
    options.constants === undefined ? DEFAULT_CONSTANT_SET : requireConstantSet('options.constants', options.constants);
  const r0 = Math.hypot(p[0], p[1], p[2]);
  requireOrbitRadius('|state.position|', r0);
  const rMin = constants.equatorialRadius;
  if (r0 <= rMin)
    throw new InvalidArgumentError('|state.position|', r0, `above the Earth's equatorial radius (${rMin} m)`);
  requireInRange('duration', duration, 0, MAX_PROPER_TIME_DURATION, { minExclusive: true, unit: 's' });
  requirePositive('step', step, 's');
  if (step > duration)
    throw new InvalidArgumentError(
      'step',
      step,
      `at most the duration (${duration} s)`,
      'the step is the spacing of the output samples',
    );
  const model = options.model ?? 'j2';
  if (!GRAVITY_MODELS.includes(model))
    throw new InvalidArgumentError('model', model, `one of ${GRAVITY_MODELS.join(', ')}`);
  const epochInstant = options.epoch === undefined ? J2000_EPOCH : requireEpochInstant('options.epoch', options.epoch);
  // The Moon check takes TT seconds since J2000.0 as one float (the ephemeris' internal time axis).
  const epoch = ttSecondsSinceJ2000(epochInstant);
  const rtol = requirePositive('relativeTolerance', options.relativeTolerance ?? 1e-12);
  if (rtol < 1e-15 || rtol > 1e-6) throw new InvalidArgumentError('relativeTolerance', rtol, 'in [1e-15, 1e-6]');

  const times = sampleTimes(duration, step);
  const count = times.length;

  const field = createGravityField(model, { constants, epoch: epochInstant });
  const lG = constants.lG;
  const c2 = SPEED_OF_LIGHT_SQUARED;
  // Hot (every stage of every step): y is the 7-component state (position, velocity, τ − TT) of y0 below.
  const rhs = (t: number, y: Float64Array, dy: Float64Array): void => {
    const x = y[0]!;
    const yy = y[1]!;
    const z = y[2]!;
    const vx = y[3]!;
    const vy = y[4]!;
    const vz = y[5]!;
    dy[0] = vx;
    dy[1] = vy;
    dy[2] = vz;
    field.accelerate(t, x, yy, z, dy, 3);
    const v2 = vx * vx + vy * vy + vz * vz;
    // IERS Conventions 2010 eq. 10.9: d(τ − TT)/dTT = L_G − (U + v²/2)/c².
    dy[6] = lG - (field.potential(t, x, yy, z) + v2 / 2) / c2;
  };
  const y0 = [p[0], p[1], p[2], v[0], v[1], v[2], 0];
  const atol = [rtol, rtol, rtol, rtol * 1e-3, rtol * 1e-3, rtol * 1e-3, rtol * 1e-4];
  const result = integrateDop853(rhs, 0, y0, duration, {
    relativeTolerance: rtol,
    absoluteTolerance: atol,
    sampleTimes: times,
    onStep(t, y) {
      const r = Math.hypot(at(y, 0, 'y'), at(y, 1, 'y'), at(y, 2, 'y'));
      if (r <= rMin) {
        throw new OutOfDomainError(
          'trajectory radius',
          r,
          `${rMin} m (the Earth's equatorial radius)`,
          '∞',
          `the orbit enters the Earth by t = ${t} s after the start; check the state (units m and m/s)`,
        );
      }
      options.onProgress?.(t, duration);
      if (model === 'full') requireOutsideMoon(epoch, t, y);
    },
  });
  const states = new Float64Array(count * 6);
  const tau = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    states.set(result.samples.subarray(k * 7, k * 7 + 6), k * 6);
    tau[k] = at(result.samples, k * 7 + 6, 'samples');
  }
  tau[0] = 0;
  return {
    t: times,
    tauMinusTT: tau,
    states,
    model,
    constants: constants.name,
    epoch: epochInstant,
    ephemeris: model === 'full' ? LOW_PRECISION_EPHEMERIS_NAME : '',
    relativeTolerance: rtol,
    acceptedSteps: result.acceptedSteps,
    rejectedSteps: result.rejectedSteps,
  };
}

/** Reads sample k of a result's states as a {@link StateVector}. */
export function properTimeSampleState(result: ProperTimeResult, k: number): StateVector {
  requireObject('result', result, 'a result of integrateProperTime');
  if (
    !(result.t instanceof Float64Array) ||
    !(result.states instanceof Float64Array) ||
    result.states.length !== 6 * result.t.length
  ) {
    throw new InvalidArgumentError(
      'result',
      result,
      'a result of integrateProperTime (t and states Float64Arrays, 6 state values per sample)',
    );
  }
  if (!Number.isInteger(k) || k < 0 || k >= result.t.length) {
    throw new InvalidArgumentError('k', k, `an integer sample index in [0, ${result.t.length - 1}]`);
  }
  const s = result.states;
  const position: Vector3 = requireVector3(`result.states[${k}].position`, s.subarray(6 * k, 6 * k + 3), 'm');
  const velocity: Vector3 = requireVector3(`result.states[${k}].velocity`, s.subarray(6 * k + 3, 6 * k + 6), 'm/s');
  return { position, velocity };
}
