/**
 * Light-time iteration: the transmit time of a signal from its receive time.
 *
 * The flight time τ solves τ = |x_s(t_r − τ) − x_r(t_r)|/c (+ Shapiro delay), iterated from
 * τ₀ = 0 (a contraction: each iteration multiplies the error by ≈ |v_s|/c ≈ 1e-5).
 *
 * @module
 */

import { DEFAULT_CONSTANT_SET, SPEED_OF_LIGHT } from '../constants.js';
import { ConvergenceError, InvalidArgumentError } from '../errors.js';
import { requireFinite, requireInteger, requirePositive, requireVector3 } from '../internal/validate.js';
import type { CubicMetresPerSecondSquared, Metres, RadiansPerSecond, Seconds, Vector3 } from '../units.js';
import { sagnacCorrection } from './sagnac.js';
import { shapiroDelay } from './shapiro.js';

/** Options of the light-time solvers. */
export interface LightTimeOptions {
  /** Add the Earth's Shapiro delay (IERS 2010 eq. 11.17) to the flight time (default true). */
  includeShapiro?: boolean;
  /** GM for the Shapiro delay, m³/s² (default IERS 2010). */
  gm?: CubicMetresPerSecondSquared;
  /** Stop when the flight time changes by less than this, seconds (default 1e-15 s). */
  tolerance?: Seconds;
  /** Iteration limit (default 10). */
  maxIterations?: number;
}

/** Solution of the light-time equation. */
export interface LightTimeSolution {
  /** Transmit time t_t = t_r − τ, same time scale and origin as the receive time, seconds. */
  transmitTime: Seconds;
  /** Flight time τ, seconds (geometric + Shapiro when included). */
  flightTime: Seconds;
  /** Geometric range |x_s(t_t) − x_r(t_r)| in the solver's frame, metres. */
  geometricRange: Metres;
  /** Shapiro delay included in the flight time, seconds (0 when excluded). */
  shapiroDelay: Seconds;
  /** Satellite position at transmit time, in the solver's frame (Earth-fixed at receive time for the Earth-fixed solver), metres. */
  satellitePosition: Vector3;
  /** Iterations used. */
  iterations: number;
}

/** Earth-fixed solution: adds the Sagnac term computed from the unrotated transmit-time position. */
export interface EarthFixedLightTimeSolution extends LightTimeSolution {
  /** Satellite position at transmit time in the Earth-fixed frame of the transmit epoch (not rotated), metres. */
  satellitePositionAtTransmitEcef: Vector3;
  /** First-order Sagnac correction (Ω/c²)(x_s y_r − y_s x_r) for that position, seconds. */
  sagnacCorrection: Seconds;
}

function readOptions(options: LightTimeOptions): { shapiro: boolean; gm: number; tol: number; maxIt: number } {
  const shapiro = options.includeShapiro ?? true;
  if (typeof shapiro !== 'boolean') throw new InvalidArgumentError('includeShapiro', shapiro, 'true or false');
  return {
    shapiro,
    gm: requirePositive('gm', options.gm ?? DEFAULT_CONSTANT_SET.gm, 'm³/s²'),
    tol: requirePositive('tolerance', options.tolerance ?? 1e-15, 's'),
    maxIt: requireInteger('maxIterations', options.maxIterations ?? 10, 1, 1000),
  };
}

function position(fn: (t: Seconds) => Vector3, t: number): [number, number, number] {
  return requireVector3(`satellitePosition(${t})`, fn(t), 'metres');
}

function solve(
  receiveTime: number,
  receiver: [number, number, number],
  at: (tau: number) => [number, number, number],
  opts: { shapiro: boolean; gm: number; tol: number; maxIt: number },
): LightTimeSolution {
  let tau = 0;
  let x = at(0);
  let range = 0;
  let shap = 0;
  for (let k = 1; k <= opts.maxIt; k++) {
    range = Math.hypot(x[0] - receiver[0], x[1] - receiver[1], x[2] - receiver[2]);
    shap = opts.shapiro ? shapiroDelay(Math.hypot(...x), Math.hypot(...receiver), range, opts.gm) : 0;
    const next = range / SPEED_OF_LIGHT + shap;
    const change = Math.abs(next - tau);
    tau = next;
    x = at(tau);
    if (change <= opts.tol) {
      range = Math.hypot(x[0] - receiver[0], x[1] - receiver[1], x[2] - receiver[2]);
      return {
        transmitTime: receiveTime - tau,
        flightTime: tau,
        geometricRange: range,
        shapiroDelay: shap,
        satellitePosition: x,
        iterations: k,
      };
    }
  }
  throw new ConvergenceError('light-time iteration', opts.maxIt, Math.abs(range / SPEED_OF_LIGHT + shap - tau));
}

/**
 * Transmit time from receive time in a non-rotating (inertial) geocentric frame:
 *   τ = |x_s(t_r − τ) − x_r(t_r)|/c + Δt_Shapiro, t_t = t_r − τ.
 * No Sagnac term: it is implicit in using the inertial receiver position at t_r.
 *
 * @param receiveTime t_r, seconds (any origin; passed back to `satellitePosition`).
 * @param receiverPosition Receiver position at t_r, inertial, metres.
 * @param satellitePosition Function giving the satellite's inertial position (m) at a time (s).
 * @param options Shapiro, tolerance (default 1e-15 s), iteration limit (default 10).
 * @returns {@link LightTimeSolution}.
 * Accuracy: converges to the tolerance in 3–4 iterations for GNSS; the model ignores atmospheric delays.
 * @throws {InvalidArgumentError} for non-finite input or a position function returning a bad vector.
 * @throws {ConvergenceError} if the iteration limit is reached.
 * @see IERS Conventions (2010) §11.2 (light time with the Shapiro term, eq. 11.17) [V1].
 */
export function solveLightTimeInertial(
  receiveTime: Seconds,
  receiverPosition: Vector3,
  satellitePosition: (t: Seconds) => Vector3,
  options: LightTimeOptions = {},
): LightTimeSolution {
  const tr = requireFinite('receiveTime', receiveTime, 'a finite time in seconds');
  const xr = requireVector3('receiverPosition', receiverPosition, 'metres');
  if (typeof satellitePosition !== 'function')
    throw new InvalidArgumentError(
      'satellitePosition',
      satellitePosition,
      'a function (t: seconds) => [x, y, z] metres',
    );
  return solve(tr, xr, (tau) => position(satellitePosition, tr - tau), readOptions(options));
}

/**
 * Transmit time from receive time with Earth-fixed positions: the satellite's Earth-fixed position at
 * t_t = t_r − τ is rotated into the Earth-fixed frame of t_r by R3(Ω_E·τ) (the Earth turns by Ω_E·τ
 * during the flight), then τ = |R3(Ω_E τ)·x_s(t_t) − x_r|/c + Δt_Shapiro.
 * The result also reports the first-order Sagnac correction, which equals the effect of that rotation to ≈ 1 ps.
 *
 * @param receiveTime t_r, seconds.
 * @param receiverPositionEcef Receiver position, Earth-fixed, metres.
 * @param satellitePositionEcef Function giving the satellite's Earth-fixed position (m) at a time (s).
 * @param options As {@link solveLightTimeInertial}, plus `earthRotationRate` (rad/s, default IERS 2010).
 * @returns {@link EarthFixedLightTimeSolution}.
 * @throws {InvalidArgumentError} for non-finite input, an implausible rotation rate, or a bad position function.
 * @throws {ConvergenceError} if the iteration limit is reached.
 * @see IERS Conventions (2010) §11.2 [V1]; N. Ashby, Living Rev. Relativity 6 (2003) §2 (Sagnac) [V2 text].
 */
export function solveLightTimeEarthFixed(
  receiveTime: Seconds,
  receiverPositionEcef: Vector3,
  satellitePositionEcef: (t: Seconds) => Vector3,
  options: LightTimeOptions & { earthRotationRate?: RadiansPerSecond } = {},
): EarthFixedLightTimeSolution {
  const tr = requireFinite('receiveTime', receiveTime, 'a finite time in seconds');
  const xr = requireVector3('receiverPositionEcef', receiverPositionEcef, 'metres');
  if (typeof satellitePositionEcef !== 'function')
    throw new InvalidArgumentError(
      'satellitePositionEcef',
      satellitePositionEcef,
      'a function (t: seconds) => [x, y, z] metres',
    );
  const w = requirePositive(
    'earthRotationRate',
    options.earthRotationRate ?? DEFAULT_CONSTANT_SET.earthRotationRate,
    'rad/s',
  );
  if (w < 7.0e-5 || w > 7.5e-5) throw new InvalidArgumentError('earthRotationRate', w, 'in [7.0e-5, 7.5e-5] rad/s');
  const rotate = (tau: number): [number, number, number] => {
    const p = position(satellitePositionEcef, tr - tau);
    // R3(θ): the Earth-fixed frame of t_r is the transmit-epoch frame turned by θ = Ω_E·τ about z.
    const c = Math.cos(w * tau);
    const s = Math.sin(w * tau);
    return [c * p[0] + s * p[1], -s * p[0] + c * p[1], p[2]];
  };
  const sol = solve(tr, xr, rotate, readOptions(options));
  const unrotated = position(satellitePositionEcef, sol.transmitTime);
  return { ...sol, satellitePositionAtTransmitEcef: unrotated, sagnacCorrection: sagnacCorrection(unrotated, xr, w) };
}
