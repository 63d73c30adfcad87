/**
 * The periodic relativistic clock correction on a uniform time grid, for long series (a day of a
 * constellation at 1 s, a year of one orbit): one Kepler orbit, epochs t_k = k·h.
 *
 * Method: on a uniform grid the eccentric anomaly moves smoothly, so each epoch's E is found from
 * the previous one. With E_k = E_{k−1} + δ, sin E_k and cos E_k follow from the addition formulas
 * with sin δ and cos δ − 1 from their Taylor series (|δ| ≤ {@link MAX_STEP_ANGLE}); Newton's method
 * on f(δ) = E_{k−1} + δ − e·sin(E_{k−1} + δ) − M_k, started from the first-order step
 * ΔM/(1 − e cos E_{k−1}), converges in one or two polynomial iterations. Every
 * {@link ANCHOR_INTERVAL} epochs sin E and cos E come from the library, so rounding in the recurrence
 * cannot accumulate; whenever a step is larger than {@link MAX_STEP_ANGLE} (a coarse grid, or perigee
 * of a very eccentric orbit) E comes from a full Kepler solve.
 *
 * @module
 */

import type { ConstantsOptions } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { constantsOf, readOptions } from '../internal/options.js';
import {
  requireEccentricity,
  requireFinite,
  requireOrbitRadius,
  requirePositive,
  requireRecord,
} from '../internal/validate.js';
import { solveKepler } from '../orbit/kepler.js';
import type { Dimensionless, Metres, Radians, Seconds } from '../units.js';

/** A Kepler orbit for {@link periodicCorrectionOnTimeGrid}. */
export interface GridOrbit {
  /** a, in metres. */
  readonly semiMajorAxis: Metres;
  /** e, dimensionless, 0 ≤ e < 1. */
  readonly eccentricity: Dimensionless;
  /** M at the grid's first epoch (k = 0), in radians. */
  readonly meanAnomalyAtStart: Radians;
}

/** A uniform time grid t_k = k·stepSeconds, k = 0 … count − 1. */
export interface UniformTimeGrid {
  /** h, in seconds (> 0). */
  readonly stepSeconds: Seconds;
  /** Number of epochs, an integer from 0 to {@link MAX_GRID_EPOCHS}. */
  readonly count: number;
}

/** Largest grid accepted: 10^8 epochs (800 MB of output), e.g. 3.2 years at 1 s. */
export const MAX_GRID_EPOCHS = 100_000_000;

/** Epochs between evaluations of sin E and cos E by the library, which re-anchor the recurrence. */
const ANCHOR_INTERVAL = 64;

/** Largest step of E taken with the series for sin δ and cos δ − 1 (their truncation is < 1e-20 here). */
const MAX_STEP_ANGLE = 0.02;

const TWO_PI = 2 * Math.PI;

/** M reduced to [−π, π]. */
function reduceAngle(M: number): number {
  return M - TWO_PI * Math.round(M / TWO_PI);
}

/** Options of {@link periodicCorrectionOnTimeGrid}: the constant set and an output array to write into. */
export interface TimeGridOptions extends ConstantsOptions {
  /** Array of at least `grid.count` elements to write into; a new one is allocated when omitted. */
  readonly out?: Float64Array;
}

/**
 * Periodic relativistic correction Δt_r = F·e·√a·sin E_k at every epoch of a uniform grid,
 * with M_k = M_0 + n·k·h and n = √(GM/a³), E_k from Kepler's equation M_k = E_k − e·sin E_k.
 *
 * Accuracy: within 1e-17 s of {@link solveKepler} followed by the element formula at every epoch,
 * for 0 ≤ e ≤ 0.9 and any step (tested on LEO to HEO grids; the difference that remains, ~1e-18 s,
 * is the rounding of M_k near 10³ rad, where both sides reduce M differently). The result is the same
 * quantity, with the same sign convention, as `periodicCorrectionAtMeanAnomaly`.
 *
 * @param orbit      `{ semiMajorAxis (m), eccentricity, meanAnomalyAtStart (rad) }`.
 * @param grid       `{ stepSeconds (s, > 0), count }`.
 * @param options    `constants`: the set giving GM and F (default IERS 2010); `out`: an optional array of at
 *   least `count` elements to write into (reused across calls,
 *   it saves allocating and first touching a large array); a new one is allocated otherwise.
 * @returns Δt_r at each epoch, in seconds (added to Δt_sv): `out` (its first `count` elements), or a
 *   new Float64Array of `count` values.
 * @throws {InvalidArgumentError} for a missing or malformed orbit or grid, a semi-major axis that is
 *   not a plausible orbit radius in metres (kilometres are recognised and named), e outside [0, 1),
 *   a non-finite M_0, a non-positive step, a count outside 0 … {@link MAX_GRID_EPOCHS} or an `out`
 *   that is not a Float64Array of at least `count` elements.
 * @see IERS Conventions (2010) §10.2 eq. 10.10 [V1] (Δt_r = F·e·√a·sin E); IS-GPS-200 Table 20-IV
 *   (n = √(μ/A³), M_k = M_0 + n·t_k, Kepler's equation) [M].
 */
export function periodicCorrectionOnTimeGrid(
  orbit: GridOrbit,
  grid: UniformTimeGrid,
  options?: TimeGridOptions,
): Float64Array {
  const o = requireRecord('orbit', orbit, 'an object { semiMajorAxis (m), eccentricity, meanAnomalyAtStart (rad) }');
  const g = requireRecord('grid', grid, 'an object { stepSeconds (s), count }');
  const opts = readOptions('options', options);
  const c = constantsOf('options', opts);
  const out = opts.out;
  const a = requireOrbitRadius('orbit.semiMajorAxis', o.semiMajorAxis);
  const e = requireEccentricity('orbit.eccentricity', o.eccentricity);
  const M0 = requireFinite('orbit.meanAnomalyAtStart', o.meanAnomalyAtStart, 'a finite angle in radians');
  const h = requirePositive('grid.stepSeconds', g.stepSeconds, 's');
  const count = g.count;
  if (typeof count !== 'number' || !Number.isInteger(count) || count < 0 || count > MAX_GRID_EPOCHS) {
    throw new InvalidArgumentError('grid.count', count, `an integer number of epochs from 0 to ${MAX_GRID_EPOCHS}`);
  }
  const gm = c.gm;
  const F = c.relativisticF;
  if (out !== undefined && (!(out instanceof Float64Array) || out.length < count)) {
    throw new InvalidArgumentError('options.out', out, `a Float64Array of at least grid.count = ${count} elements`);
  }
  const target = out ?? new Float64Array(count);
  if (count === 0) return target;
  const amplitude = F * e * Math.sqrt(a);
  const stepAngle = Math.sqrt(gm / (a * a * a)) * h; // n·h, rad
  fillGrid(target, count, e, M0, stepAngle, amplitude);
  return target;
}

/** sin δ from its series to the δ⁷ term (truncation < δ⁹/9! < 1.5e-21 for |δ| ≤ 0.02). */
function sinSmall(d: number, d2: number): number {
  // Multiplications by the reciprocals: a division by a constant is not turned into one by the engine.
  return d * (1 - d2 * INV_6 * (1 - d2 * INV_20 * (1 - d2 * INV_42)));
}

/** cos δ − 1 from its series to the δ⁸ term (truncation < δ¹⁰/10! < 3e-24 for |δ| ≤ 0.02). */
function cosMinusOneSmall(d2: number): number {
  return -0.5 * d2 * (1 - d2 * INV_12 * (1 - d2 * INV_30 * (1 - d2 * INV_56)));
}

const INV_6 = 1 / 6,
  INV_12 = 1 / 12,
  INV_20 = 1 / 20,
  INV_30 = 1 / 30,
  INV_42 = 1 / 42,
  INV_56 = 1 / 56;

/**
 * The recurrence of {@link periodicCorrectionOnTimeGrid}; inputs are validated.
 *
 * Output: Δt_r = F·e·√a·sin E_k. Newton's step from the first-order predictor leaves an error of
 * about K·step² with K = e|sin E|/(2(1 − e cos E)) ≤ 4.5 for e ≤ 0.9, so a step below 1e-9 rad ends
 * the iteration with E good to ~5e-18 rad.
 */
function fillGrid(out: Float64Array, count: number, e: number, M0: number, stepAngle: number, amplitude: number): void {
  let m = reduceAngle(M0);
  let revolutions = Math.round(M0 / TWO_PI);
  let E = solveKepler(m, e);
  let S = Math.sin(E);
  let C = Math.cos(E);
  out[0] = amplitude * S;
  let sinceAnchor = 0;
  for (let k = 1; k < count; k++) {
    // M_k from k directly (no accumulated sum), less whole revolutions counted as they pass.
    let mk = M0 + k * stepAngle - revolutions * TWO_PI;
    while (mk > Math.PI) {
      mk -= TWO_PI;
      revolutions++;
      E -= TWO_PI;
    }
    while (mk < -Math.PI) {
      mk += TWO_PI;
      revolutions--;
      E += TWO_PI;
    }
    const base = E - mk;
    let delta = (mk - m) / (1 - e * C);
    let converged = false;
    let sd = 0;
    let cm1 = 0;
    for (let it = 0; it < 4 && Math.abs(delta) <= MAX_STEP_ANGLE; it++) {
      const d2 = delta * delta;
      sd = sinSmall(delta, d2);
      cm1 = cosMinusOneSmall(d2);
      const step = (base + delta - e * (S + (S * cm1 + C * sd))) / (1 - e * (C + (C * cm1 - S * sd)));
      delta -= step;
      if (Math.abs(step) <= 1e-9) {
        // sin and cos − 1 at the corrected δ to first order in the step (the next term is < 5e-19).
        const sdNext = sd - step * (1 + cm1);
        cm1 += step * sd;
        sd = sdNext;
        converged = Math.abs(delta) <= MAX_STEP_ANGLE;
        break;
      }
    }
    if (converged) {
      E += delta;
      if (++sinceAnchor >= ANCHOR_INTERVAL) {
        // Re-anchor sin E and cos E so that rounding in the recurrence cannot accumulate.
        S = Math.sin(E);
        C = Math.cos(E);
        sinceAnchor = 0;
      } else {
        const sNext = S + (S * cm1 + C * sd);
        C += C * cm1 - S * sd;
        S = sNext;
      }
    } else {
      E = solveKepler(mk, e);
      S = Math.sin(E);
      C = Math.cos(E);
      sinceAnchor = 0;
    }
    m = mk;
    out[k] = amplitude * S;
  }
}
