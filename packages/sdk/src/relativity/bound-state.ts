/**
 * {@link boundStateCheck}: whether an initial state for `integrateProperTime` is bound, and to which
 * body (the Earth, or for the `full` model the Moon inside its Hill sphere), with the numbers a
 * message needs.
 *
 * @module
 */

import { type ConstantSet, DEFAULT_CONSTANT_SET } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { requireConstantSet, requireOptions, requireOrbitRadius } from '../internal/validate.js';
import { requireStateVector, type StateVector } from '../orbit/elements.js';
import { moonPositionAt } from '../orbit/ephemeris.js';
import { GM_MOON, GRAVITY_MODELS, type GravityModel } from '../orbit/forces.js';
import type { Instant } from '../time/instant.js';
import { J2000_EPOCH, requireEpochInstant, ttSecondsSinceJ2000 } from '../time/j2000.js';
import type { Metres, MetresPerSecond } from '../units.js';

/** Options of {@link boundStateCheck}. */
export interface BoundStateOptions {
  /** Force model the state will be integrated with (default `j2`); only `full` considers the Moon. */
  readonly model?: GravityModel;
  /** Earth constants (GM); default IERS 2010. */
  readonly constants?: ConstantSet;
  /** The instant of the state (default J2000.0), for the Moon's position under `full`. */
  readonly epoch?: Instant;
}

/** Result of {@link boundStateCheck}. */
export interface BoundStateCheck {
  /** The body the state is judged against. */
  readonly body: 'earth' | 'moon';
  /** True when the two-body energy relative to `body` is negative (speed below the escape speed). */
  readonly bound: boolean;
  /** Distance from the body's centre, in m. */
  readonly distance: Metres;
  /** Speed relative to the body, in m/s. */
  readonly speed: MetresPerSecond;
  /** Escape speed √(2GM/r) at `distance`, in m/s. */
  readonly escapeSpeed: MetresPerSecond;
  /** For `full`: radius of the Moon's Hill sphere at the epoch, in m. */
  readonly hillRadius?: Metres;
}

/**
 * Judges whether a geocentric state is bound:
 * - `point-mass` and `j2` (Earth only): specific orbital energy v²/2 − GM/r < 0, i.e. v below the escape
 *   speed √(2GM/r) (N. Ashby, Living Rev. Relativity 6 (2003) §5, eq. 33 [V2]). J2 changes the energy by
 *   ~1e-3 relative, far less than any escape margin that matters here.
 * - `full`: inside the Moon's Hill sphere r_H = d·(GM_M/(3GM_E))^(1/3) (≈ 61 500 km; G. W. Hill 1878 [M]) the
 *   state is judged against the Moon (w²/2 − GM_M/ρ < 0, w and ρ relative to the Moon, whose velocity is a ±1 s
 *   central difference of the low-precision series, Montenbruck & Gill 2000 §3.3.2 [M]; error ≈ 1e-6 m/s);
 *   outside it, against the Earth as above.
 *
 * @param state   Geocentric position (m) and velocity (m/s), non-rotating, mean equator and equinox of date.
 * @param options Model, constants, epoch.
 * @throws {InvalidArgumentError} for a bad state, model, constant set or epoch.
 */
export function boundStateCheck(state: StateVector, options: BoundStateOptions = {}): BoundStateCheck {
  const { position, velocity } = requireStateVector(state);
  requireOptions('options', options);
  const model = options.model ?? 'j2';
  if (!GRAVITY_MODELS.includes(model))
    throw new InvalidArgumentError('options.model', model, `one of ${GRAVITY_MODELS.join(', ')}`);
  const constants =
    options.constants === undefined ? DEFAULT_CONSTANT_SET : requireConstantSet('options.constants', options.constants);
  const epoch = options.epoch === undefined ? J2000_EPOCH : requireEpochInstant('options.epoch', options.epoch);
  requireOrbitRadius('|state.position|', Math.hypot(...position));
  if (model === 'full') {
    // The series' own time axis (TT seconds since J2000.0, one float); ±1 s as before, so the numbers are unchanged.
    const e = ttSecondsSinceJ2000(epoch);
    const m = moonPositionAt(e, 0, true);
    const mPlus = moonPositionAt(e + 1, 0, true);
    const mMinus = moonPositionAt(e - 1, 0, true);
    const rho = Math.hypot(position[0] - m[0], position[1] - m[1], position[2] - m[2]);
    const w = Math.hypot(
      velocity[0] - (mPlus[0] - mMinus[0]) / 2,
      velocity[1] - (mPlus[1] - mMinus[1]) / 2,
      velocity[2] - (mPlus[2] - mMinus[2]) / 2,
    );
    if (!(rho > 0))
      throw new InvalidArgumentError('state.position', position, "a position other than the Moon's centre");
    const hillRadius = Math.hypot(m[0], m[1], m[2]) * Math.cbrt(GM_MOON / (3 * constants.gm));
    if (rho < hillRadius) {
      const escapeSpeed = Math.sqrt((2 * GM_MOON) / rho);
      return { body: 'moon', bound: w < escapeSpeed, distance: rho, speed: w, escapeSpeed, hillRadius };
    }
    const earth = earthCheck(position, velocity, constants);
    return { ...earth, hillRadius };
  }
  return earthCheck(position, velocity, constants);
}

function earthCheck(position: readonly number[], velocity: readonly number[], constants: ConstantSet): BoundStateCheck {
  const r = Math.hypot(...position);
  const v = Math.hypot(...velocity);
  const escapeSpeed = Math.sqrt((2 * constants.gm) / r);
  return { body: 'earth', bound: v < escapeSpeed, distance: r, speed: v, escapeSpeed };
}
