/**
 * Kepler's equation and the relations between the mean, eccentric and true anomalies of
 * an elliptical two-body orbit.
 *
 * @module
 */

import { ConvergenceError } from '../errors.js';
import { requireEccentricity, requireFinite, requireInRange } from '../internal/validate.js';
import type {
  CubicMetresPerSecondSquared,
  Dimensionless,
  Metres,
  Radians,
  RadiansPerSecond,
  Seconds,
} from '../units.js';

/** Absolute tolerance on the residual E − e·sin E − M for |M| ≤ π, in radians. */
export const KEPLER_RESIDUAL_TOLERANCE: Radians = 1e-15;

const TWO_PI = 2 * Math.PI;
const MAX_ITERATIONS = 100;

/** Residual of Kepler's equation, evaluated exactly as a caller would check it. */
function keplerResidual(E: number, e: number, M: number): number {
  return E - e * Math.sin(E) - M;
}

/** The next double above (`direction` = +1) or below (−1) `x`. */
function adjacentDouble(x: number, direction: 1 | -1): number {
  if (x === 0) return direction * Number.MIN_VALUE;
  // One shared view of the IEEE 754 bits: the next double away from (or toward) zero is the
  // 64-bit pattern plus (or minus) one, done on the two 32-bit halves with a carry.
  BITS_F64[0] = x;
  // Both halves always exist (the views are two words long); ?? 0 only satisfies the index check.
  let low = BITS_U32[LOW_WORD] ?? 0;
  let high = BITS_U32[HIGH_WORD] ?? 0;
  if (x > 0 === direction > 0) {
    if (low === 0xffffffff) {
      low = 0;
      high += 1;
    } else low += 1;
  } else if (low === 0) {
    low = 0xffffffff;
    high -= 1;
  } else low -= 1;
  BITS_U32[LOW_WORD] = low;
  BITS_U32[HIGH_WORD] = high;
  return BITS_F64[0] ?? Number.NaN;
}

const BITS_F64 = new Float64Array(1);
const BITS_U32 = new Uint32Array(BITS_F64.buffer);
/** Index of the low 32-bit word of a double on this platform (0 on little-endian engines). */
const LOW_WORD = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 0 : 1;
const HIGH_WORD = 1 - LOW_WORD;

/** Spacing of doubles at `x` (unit in the last place). */
function ulp(x: number): number {
  const a = Math.abs(x);
  return adjacentDouble(a, 1) - a;
}

/**
 * Residual bound guaranteed by {@link solveKepler} for mean anomaly `M`, in radians: 1e-15 for
 * |M| ≤ π; beyond one half-revolution the doubles near M are spaced wider, so the bound is
 * max(1e-15, 4·ulp(M)) (e.g. 3.6e-15 for M ≈ 2π, 5.7e-14 for M ≈ 100 rad).
 */
export function keplerTolerance(meanAnomaly: Radians): Radians {
  requireFinite('meanAnomaly', meanAnomaly, 'a finite angle in radians');
  return Math.abs(meanAnomaly) <= Math.PI
    ? KEPLER_RESIDUAL_TOLERANCE
    : Math.max(KEPLER_RESIDUAL_TOLERANCE, 4 * ulp(meanAnomaly));
}

/**
 * Solves Kepler's equation on the half-revolution m ∈ [0, π] by Newton's method safeguarded
 * with bisection. f(E) = E − e sin E − m is increasing and convex on [0, π], and the root
 * lies in [m, min(m + e, π)] because f(m) = −e sin m ≤ 0 and f(m + e) = e(1 − sin(m + e)) ≥ 0.
 */
function solveHalfRevolution(m: number, e: number): { E: number; iterations: number } {
  if (m === 0 || e === 0) return { E: m, iterations: 0 };
  let lo = m;
  let hi = Math.min(m + e, Math.PI);
  // Starter: the cubic root of 6m near the parabolic corner (e → 1, m → 0), where the
  // series E − e sin E ≈ (1 − e)E + E³/6 makes the linear guess m/(1 − e) far off
  // (Danby, Fundamentals of Celestial Mechanics, 2nd ed., §6.6 [M]); otherwise m + e·sin m.
  let E = e > 0.8 && m < 0.5 ? Math.cbrt(6 * m) : m + e * Math.sin(m);
  if (!(E > lo && E < hi)) E = 0.5 * (lo + hi);
  for (let k = 1; k <= MAX_ITERATIONS; k++) {
    const f = keplerResidual(E, e, m);
    if (f === 0) return { E, iterations: k };
    if (f > 0) hi = E;
    else lo = E;
    const step = f / (1 - e * Math.cos(E));
    let next = E - step;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (next === E || Math.abs(next - E) <= 2 * ulp(E)) return { E: next, iterations: k };
    E = next;
  }
  return { E, iterations: MAX_ITERATIONS };
}

/**
 * Among `E` and its nearest doubles, returns the one whose residual (as evaluated in
 * double precision) is smallest in magnitude. Newton's step is limited by rounding, so
 * this final search makes the residual bound hold as checked by callers.
 */
function polish(E: number, e: number, M: number): number {
  let best = E;
  let bestAbs = Math.abs(keplerResidual(E, e, M));
  for (const direction of [1, -1] as const) {
    let candidate = E;
    for (let k = 0; k < 4; k++) {
      candidate = adjacentDouble(candidate, direction);
      const r = Math.abs(keplerResidual(candidate, e, M));
      if (r < bestAbs) {
        best = candidate;
        bestAbs = r;
      }
    }
  }
  return best;
}

/**
 * Solves Kepler's equation M = E − e·sin E for the eccentric anomaly E of an elliptical orbit.
 *
 * Method: the mean anomaly is reduced to m ∈ [−π, π] (E is odd in M and E − M is
 * 2π-periodic), the half-revolution [0, π] is solved by Newton's method inside a bisection
 * bracket that always contains the root, one Newton step is taken against the unreduced M,
 * and, only when the residual is still above the bound, the nearest doubles are searched for the
 * smallest residual.
 *
 * Accuracy: |E − e·sin E − M| ≤ 1e-15 rad (as evaluated in double precision) for every
 * 0 ≤ e < 1 and |M| ≤ π, including e → 1 with M near 0 and M near ±π. For |M| > π the bound is
 * max(1e-15, 4·ulp(M)) (see {@link keplerTolerance}), because doubles near M are spaced wider.
 * E is in the same revolution as M: E − M lies in [−e, e] and sign(E − 2πk) = sign(M − 2πk).
 *
 * @param meanAnomaly   M, in radians (any finite value).
 * @param eccentricity  e, dimensionless, 0 ≤ e < 1.
 * @returns The eccentric anomaly E, in radians.
 * @throws {InvalidArgumentError} if M is not finite or e is outside [0, 1) or NaN.
 * @throws {ConvergenceError} if the residual bound is not met (not expected for valid input).
 * @see Kepler's equation, e.g. Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., §2.2 [M];
 *   IS-GPS-200 Table 20-IV "M_k = E_k − e sin E_k" [M].
 */
export function solveKepler(meanAnomaly: Radians, eccentricity: Dimensionless): Radians {
  const M = requireFinite('meanAnomaly', meanAnomaly, 'a finite angle in radians');
  const e = requireEccentricity('eccentricity', eccentricity);
  let revolutions = 0;
  let m = M;
  if (Math.abs(M) > Math.PI) {
    revolutions = Math.round(M / TWO_PI);
    m = M - revolutions * TWO_PI;
    // Rounding of 2π·k can leave m a hair outside [−π, π]; fold it back.
    if (m > Math.PI) m = Math.PI;
    else if (m < -Math.PI) m = -Math.PI;
  }
  const sign = m < 0 ? -1 : 1;
  const half = solveHalfRevolution(Math.abs(m), e);
  let E = sign * half.E + revolutions * TWO_PI;
  if (revolutions !== 0) {
    // The reduced problem is exact only up to the rounding of 2π·k; one Newton step against M fixes it.
    E -= keplerResidual(E, e, M) / (1 - e * Math.cos(E));
  }
  // The search among neighbouring doubles costs eight more sines; it is needed only when Newton's
  // last step, limited by rounding, left the residual above the bound.
  const tolerance = keplerTolerance(M);
  let residual = keplerResidual(E, e, M);
  if (!(Math.abs(residual) <= tolerance)) {
    E = polish(E, e, M);
    residual = keplerResidual(E, e, M);
  }
  if (!(Math.abs(residual) <= tolerance)) {
    throw new ConvergenceError(`solveKepler(M = ${M}, e = ${e})`, half.iterations, residual);
  }
  return E;
}

/**
 * Auxiliary β = e / (1 + √(1 − e²)) of the anomaly relations (Broucke & Cefola 1973 [M]).
 * Written with 1 − e² = (1 − e)(1 + e) so that e → 1 loses no digits.
 */
function beta(e: number): number {
  return e / (1 + Math.sqrt((1 - e) * (1 + e)));
}

/**
 * True anomaly from eccentric anomaly, in the same revolution.
 *
 *   ν = E + 2·atan(β sin E / (1 − β cos E)),   β = e / (1 + √(1 − e²))
 *
 * (equivalent to tan(ν/2) = √((1+e)/(1−e))·tan(E/2), but continuous across E = ±π and
 * keeping the revolution count of E).
 *
 * @param eccentricAnomaly  E, in radians.
 * @param eccentricity      e, dimensionless, 0 ≤ e < 1.
 * @returns ν, in radians, with ν − E ∈ (−π, π).
 * @throws {InvalidArgumentError} if E is not finite or e is outside [0, 1).
 * @see R. A. Broucke & P. J. Cefola, "A note on the relations between true and eccentric anomalies
 *   in the two-body problem", Celestial Mechanics 7 (1973) 388–389 [M].
 */
export function eccentricToTrueAnomaly(eccentricAnomaly: Radians, eccentricity: Dimensionless): Radians {
  const E = requireFinite('eccentricAnomaly', eccentricAnomaly, 'a finite angle in radians');
  const e = requireEccentricity('eccentricity', eccentricity);
  const b = beta(e);
  return E + 2 * Math.atan((b * Math.sin(E)) / (1 - b * Math.cos(E)));
}

/**
 * Eccentric anomaly from true anomaly, in the same revolution.
 *
 *   E = ν − 2·atan(β sin ν / (1 + β cos ν)),   β = e / (1 + √(1 − e²))
 *
 * @param trueAnomaly   ν, in radians.
 * @param eccentricity  e, dimensionless, 0 ≤ e < 1.
 * @returns E, in radians, with E − ν ∈ (−π, π).
 * @throws {InvalidArgumentError} if ν is not finite or e is outside [0, 1).
 * @see Broucke & Cefola, Celestial Mechanics 7 (1973) 388–389 [M].
 */
export function trueToEccentricAnomaly(trueAnomaly: Radians, eccentricity: Dimensionless): Radians {
  const nu = requireFinite('trueAnomaly', trueAnomaly, 'a finite angle in radians');
  const e = requireEccentricity('eccentricity', eccentricity);
  const b = beta(e);
  return nu - 2 * Math.atan((b * Math.sin(nu)) / (1 + b * Math.cos(nu)));
}

/**
 * Mean anomaly from eccentric anomaly (Kepler's equation): M = E − e·sin E.
 *
 * @param eccentricAnomaly  E, in radians.
 * @param eccentricity      e, dimensionless, 0 ≤ e < 1.
 * @returns M, in radians (same revolution as E).
 * @throws {InvalidArgumentError} if E is not finite or e is outside [0, 1).
 * @see Kepler's equation (common practice, no source); IS-GPS-200 Table 20-IV [M].
 */
export function eccentricToMeanAnomaly(eccentricAnomaly: Radians, eccentricity: Dimensionless): Radians {
  const E = requireFinite('eccentricAnomaly', eccentricAnomaly, 'a finite angle in radians');
  const e = requireEccentricity('eccentricity', eccentricity);
  return E - e * Math.sin(E);
}

/**
 * Mean motion of a two-body orbit: n = √(GM / a³).
 *
 * @param semiMajorAxis  a, in metres, 1 m to 1e13 m (body-agnostic, so a below the Earth's radius is allowed).
 * @param gm             GM of the central body, in m³/s², in (0, 1e21] (the Sun's is 1.3e20).
 * @returns n, in rad/s.
 * @throws {InvalidArgumentError} if a or GM is not a finite positive number.
 * @see Kepler's third law (common practice, no source); IS-GPS-200 Table 20-IV "n0 = √(μ/A³)" [M].
 */
export function meanMotion(semiMajorAxis: Metres, gm: CubicMetresPerSecondSquared): RadiansPerSecond {
  const a = requireInRange('semiMajorAxis', semiMajorAxis, 1, 1e13, { unit: 'm (1 m up to beyond the planets)' });
  const mu = requireInRange('gm', gm, 0, 1e21, { minExclusive: true, unit: "m³/s² (the Sun's is 1.3e20)" });
  return Math.sqrt(mu / a) / a;
}

/**
 * Orbital period of a two-body orbit: P = 2π·√(a³ / GM).
 *
 * @param semiMajorAxis  a, in metres (> 0).
 * @param gm             GM of the central body, in m³/s² (> 0).
 * @returns P, in seconds.
 * @throws {InvalidArgumentError} if a or GM is not a finite positive number.
 * @see Kepler's third law (common practice, no source).
 */
export function orbitalPeriod(semiMajorAxis: Metres, gm: CubicMetresPerSecondSquared): Seconds {
  return TWO_PI / meanMotion(semiMajorAxis, gm);
}
