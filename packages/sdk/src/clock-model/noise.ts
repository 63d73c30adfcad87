/**
 * Stochastic clock model: transition matrix, process-noise covariance from the diffusion
 * coefficients q1, q2, q3, their relation to the power-law coefficients h_α and to the Allan
 * and Hadamard variances (the fit of the q's to measured stability is in `fit-diffusion.ts`).
 *
 * State vector [x, y, d]: phase (time error) x in s, fractional frequency y (dimensionless),
 * frequency drift d in 1/s. The 2-state model keeps [x, y].
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { requireInRange, requireNonNegative, requirePositive } from '../internal/validate.js';
import type { Dimensionless, Seconds } from '../units.js';
import type { Matrix } from './linalg.js';

/** Number of clock states: 2 = [phase, frequency], 3 = [phase, frequency, drift]. */
export type ClockStates = 2 | 3;

/**
 * Diffusion coefficients of the clock model (Zucca & Tavella 2005).
 * `q1` white frequency noise (WFM, the phase random walk), in s;
 * `q2` random-walk frequency noise (RWFM), in 1/s;
 * `q3` random-walk drift noise (RWFM of the drift), in 1/s³; absent means 0.
 */
export interface ClockDiffusion {
  readonly q1: number;
  readonly q2: number;
  readonly q3?: number;
}

/**
 * Power-law coefficients of the one-sided fractional-frequency PSD S_y(f) = Σ h_α f^α
 * (IEEE Std 1139 convention): `h0` (WFM) in s, `hMinus2` (RWFM) in 1/s, `hMinus4` in 1/s³.
 */
export interface PowerLawCoefficients {
  readonly h0: number;
  readonly hMinus2: number;
  readonly hMinus4?: number;
}

/**
 * Largest diffusion coefficient accepted, in its own unit (s, 1/s, 1/s³). Real clocks are below
 * 1e-10; the bound only keeps q·τ⁵ and the filter's products finite (our own bound).
 */
export const MAX_DIFFUSION = 1e3;
/** Largest power-law coefficient h accepted (so that q = 8π⁴h stays within {@link MAX_DIFFUSION}; our own bound). */
const MAX_POWER_LAW = 1;
/** Longest model interval τ, in seconds (317 years; keeps τ⁵ finite; our own bound). */
export const MAX_MODEL_INTERVAL: Seconds = 1e10;
/** Shortest averaging time of the variance formulas, in seconds (1 ns; keeps q1/τ finite; our own bound). */
const MIN_AVERAGING_TIME: Seconds = 1e-9;

/** Validates and completes a diffusion record (q3 defaults to 0). */
export function requireDiffusion(argument: string, q: unknown): Required<ClockDiffusion> {
  if (typeof q !== 'object' || q === null) {
    throw new InvalidArgumentError(
      argument,
      q,
      'an object { q1 (s), q2 (1/s), q3? (1/s³) } of non-negative diffusion coefficients',
    );
  }
  const r = q as Record<string, unknown>;
  const coefficient = (key: string, unit: string) =>
    requireInRange(`${argument}.${key}`, r[key], 0, MAX_DIFFUSION, { unit });
  return {
    q1: coefficient('q1', 's'),
    q2: coefficient('q2', '1/s'),
    q3: r.q3 === undefined ? 0 : coefficient('q3', '1/s³'),
  };
}

/** Validates a model interval τ in seconds: [0, MAX_MODEL_INTERVAL], or [MIN_AVERAGING_TIME, MAX_MODEL_INTERVAL] for averaging times. */
function requireInterval(argument: string, tau: unknown, averaging: boolean): number {
  return requireInRange(argument, tau, averaging ? MIN_AVERAGING_TIME : 0, MAX_MODEL_INTERVAL, { unit: 's' });
}

/** Validates the number of clock states (2 or 3). */
export function requireStates(states: unknown): ClockStates {
  if (states !== 2 && states !== 3)
    throw new InvalidArgumentError('states', states, '2 (phase, frequency) or 3 (phase, frequency, drift)');
  return states;
}

/**
 * State-transition matrix Φ(τ) of the clock model over an interval τ.
 *
 * 3-state: Φ = [[1, τ, τ²/2], [0, 1, τ], [0, 0, 1]]; 2-state: [[1, τ], [0, 1]].
 *
 * @param tau     Interval, in seconds (≥ 0; negative τ would propagate backwards and is rejected).
 * @param states  2 or 3.
 * @returns Φ(τ) as rows; units: x row [1, s, s²], y row [–, 1, s], d row [–, –, 1].
 * @throws {InvalidArgumentError} if τ is negative or not finite, or states is not 2 or 3.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation], state equation of the clock model; Φ is the exact solution of ẋ = y, ẏ = d (common practice).
 */
export function clockTransitionMatrix(tau: Seconds, states: ClockStates): Matrix {
  requireInterval('tau', tau, false);
  requireStates(states);
  if (states === 2)
    return [
      [1, tau],
      [0, 1],
    ];
  return [
    [1, tau, (tau * tau) / 2],
    [0, 1, tau],
    [0, 0, 1],
  ];
}

/**
 * Process-noise covariance Q(τ) of the clock model: the covariance that the three independent
 * Wiener processes with diffusion q1, q2, q3 add to [x, y, d] over τ.
 *
 *   Q11 = q1τ + q2τ³/3 + q3τ⁵/20   Q12 = q2τ²/2 + q3τ⁴/8   Q13 = q3τ³/6
 *   Q22 = q2τ + q3τ³/3             Q23 = q3τ²/2            Q33 = q3τ
 *
 * The 2-state model is the upper-left 2×2 block with q3 = 0.
 *
 * @param tau     Interval, in seconds, ≥ 0.
 * @param q       Diffusion coefficients q1 (s), q2 (1/s), q3 (1/s³).
 * @param states  2 or 3. With 2 states a non-zero q3 is an error (it would be dropped).
 * @returns Q(τ) (x in s, y dimensionless, d in 1/s; entries in the products of those units).
 * @throws {InvalidArgumentError} for negative/non-finite τ or q, states not 2/3, or q3 > 0 with 2 states.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation]; entries re-derived as ∫Φ(s)diag(q)Φ(s)ᵀds [C] and checked by simulation [C].
 */
export function clockProcessNoise(tau: Seconds, q: ClockDiffusion, states: ClockStates): Matrix {
  requireInterval('tau', tau, false);
  requireStates(states);
  const { q1, q2, q3 } = requireDiffusion('q', q);
  if (states === 2 && q3 !== 0) {
    throw new InvalidArgumentError(
      'q.q3',
      q3,
      '0 for the 2-state model',
      'use states = 3 to model random-walk drift noise',
    );
  }
  const t2 = tau * tau;
  const t3 = t2 * tau;
  const t4 = t3 * tau;
  const t5 = t4 * tau;
  const q11 = q1 * tau + (q2 * t3) / 3 + (q3 * t5) / 20;
  const q12 = (q2 * t2) / 2 + (q3 * t4) / 8;
  const q22 = q2 * tau + (q3 * t3) / 3;
  if (states === 2)
    return [
      [q11, q12],
      [q12, q22],
    ];
  const q13 = (q3 * t3) / 6;
  const q23 = (q3 * t2) / 2;
  return [
    [q11, q12, q13],
    [q12, q22, q23],
    [q13, q23, q3 * tau],
  ];
}

/**
 * Diffusion coefficients from power-law PSD coefficients (one-sided S_y(f) = Σ h_α f^α).
 *
 *   q1 = h0/2,  q2 = 2π² h₋₂,  q3 = 8π⁴ h₋₄
 *
 * (A Wiener process with diffusion q has two-sided PSD q/(2πf)², i.e. one-sided 2q/(2πf)²;
 * WFM: S_y = h0 = 2q1; RWFM: S_y = 2q2/(2πf)²; drift walk: S_y = 2q3/(2πf)⁴.)
 *
 * @param h  h0 (s), hMinus2 (1/s), hMinus4 (1/s³, optional, default 0); each ≥ 0.
 * @returns { q1 (s), q2 (1/s), q3 (1/s³) }.
 * @throws {InvalidArgumentError} if a coefficient is negative or not finite.
 * @see Our own derivation from the one-sided PSD definitions [C]; IEEE Std 1139 one-sided PSD convention [M].
 */
export function qFromH(h: PowerLawCoefficients): Required<ClockDiffusion> {
  if (typeof h !== 'object' || h === null)
    throw new InvalidArgumentError('h', h, 'an object { h0, hMinus2, hMinus4? }');
  const h0 = requireInRange('h.h0', h.h0, 0, MAX_POWER_LAW, { unit: 's' });
  const hm2 = requireInRange('h.hMinus2', h.hMinus2, 0, MAX_POWER_LAW, { unit: '1/s' });
  const hm4 = h.hMinus4 === undefined ? 0 : requireInRange('h.hMinus4', h.hMinus4, 0, MAX_POWER_LAW, { unit: '1/s³' });
  const pi2 = Math.PI * Math.PI;
  return { q1: h0 / 2, q2: 2 * pi2 * hm2, q3: 8 * pi2 * pi2 * hm4 };
}

/**
 * Power-law PSD coefficients from diffusion coefficients, the inverse of {@link qFromH}:
 * h0 = 2q1, h₋₂ = q2/(2π²), h₋₄ = q3/(8π⁴).
 *
 * @param q  Diffusion coefficients q1 (s), q2 (1/s), q3 (1/s³, optional).
 * @returns { h0 (s), hMinus2 (1/s), hMinus4 (1/s³) }.
 * @throws {InvalidArgumentError} if a coefficient is negative or not finite.
 * @see Inverse of {@link qFromH}, our own derivation [C].
 */
export function hFromQ(q: ClockDiffusion): Required<PowerLawCoefficients> {
  const { q1, q2, q3 } = requireDiffusion('q', q);
  const pi2 = Math.PI * Math.PI;
  return { h0: 2 * q1, hMinus2: q2 / (2 * pi2), hMinus4: q3 / (8 * pi2 * pi2) };
}

/**
 * Allan variance of the 2-state clock model: σ_y²(τ) = q1/τ + q2τ/3.
 *
 * Valid only without drift noise: with q3 > 0 the second difference contains τ²·d(t), a random
 * walk, so the Allan variance is not stationary (our own simulation [C]: 5.6× and 158× the naive form at 1e3 and 1e4 s); use
 * {@link hadamardVarianceFromQ} then.
 *
 * @param tau  Averaging time, in seconds, > 0.
 * @param q    Diffusion coefficients; q3 must be absent or 0.
 * @returns σ_y²(τ), dimensionless.
 * @throws {InvalidArgumentError} if τ ≤ 0, a q is negative, or q3 > 0.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation]; verified by our own Monte Carlo simulation [C]; equals the IEEE Std 1139 WFM/RWFM forms h0/(2τ), (2π²/3)h₋₂τ [M].
 */
export function allanVarianceFromQ(tau: Seconds, q: ClockDiffusion): Dimensionless {
  requireInterval('tau', tau, true);
  const { q1, q2, q3 } = requireDiffusion('q', q);
  if (q3 !== 0) {
    throw new InvalidArgumentError(
      'q.q3',
      q3,
      '0 for the Allan variance',
      'with random-walk drift noise the Allan variance is not stationary; use hadamardVarianceFromQ',
    );
  }
  return q1 / tau + (q2 * tau) / 3;
}

/**
 * Hadamard variance of the 3-state clock model: Hσ_y²(τ) = q1/τ + q2τ/6 + 11q3τ³/120.
 * A deterministic linear drift does not contribute (the third difference removes it).
 *
 * @param tau  Averaging time, in seconds, > 0.
 * @param q    Diffusion coefficients q1 (s), q2 (1/s), q3 (1/s³).
 * @returns Hσ_y²(τ), dimensionless.
 * @throws {InvalidArgumentError} if τ ≤ 0 or a q is negative.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation]; verified by our own Monte Carlo simulation [C].
 */
export function hadamardVarianceFromQ(tau: Seconds, q: ClockDiffusion): Dimensionless {
  requireInterval('tau', tau, true);
  const { q1, q2, q3 } = requireDiffusion('q', q);
  return q1 / tau + (q2 * tau) / 6 + (11 * q3 * tau ** 3) / 120;
}

/** One point of a power-law stability specification: a deviation at an averaging time. */
export interface StabilitySpecPoint {
  /** Averaging time, in seconds. */
  readonly tau: Seconds;
  /** The deviation (ADEV for WFM/RWFM, HDEV for drift walk), dimensionless. */
  readonly deviation: Dimensionless;
}

/**
 * Diffusion coefficients from a stability specification given as one point per noise type,
 * each read as if that noise type alone were present:
 *
 *   WFM:  σ_y²(τ) = q1/τ  ⇒  q1 = σ²τ
 *   RWFM: σ_y²(τ) = q2τ/3  ⇒  q2 = 3σ²/τ
 *   random-walk drift: Hσ_y²(τ) = 11q3τ³/120  ⇒  q3 = 120 Hσ²/(11τ³)
 *
 * Check values (our own computation [C]): σ_y = 1e-12 at 1 s (WFM) gives q1 = 1e-24 s; σ_y(1 d) = 1e-14
 * (RWFM) gives q2 = 3.472e-33 1/s.
 *
 * @param spec  Any of `whiteFrequency` (ADEV point), `randomWalkFrequency` (ADEV point),
 *              `randomWalkDrift` (HDEV point); at least one.
 * @returns { q1 (s), q2 (1/s), q3 (1/s³) }, absent noise types give 0.
 * @throws {InvalidArgumentError} if no point is given, or a τ ≤ 0 or deviation < 0.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation], variance relations; inverted algebraically [C].
 */
export function diffusionFromStabilitySpec(spec: {
  readonly whiteFrequency?: StabilitySpecPoint;
  readonly randomWalkFrequency?: StabilitySpecPoint;
  readonly randomWalkDrift?: StabilitySpecPoint;
}): Required<ClockDiffusion> {
  if (typeof spec !== 'object' || spec === null) {
    throw new InvalidArgumentError(
      'spec',
      spec,
      'an object with whiteFrequency, randomWalkFrequency and/or randomWalkDrift points',
    );
  }
  const read = (name: 'whiteFrequency' | 'randomWalkFrequency' | 'randomWalkDrift'): StabilitySpecPoint | undefined => {
    const p = spec[name];
    if (p === undefined) return undefined;
    if (typeof p !== 'object' || p === null)
      throw new InvalidArgumentError(`spec.${name}`, p, 'an object { tau (s), deviation }');
    return {
      tau: requirePositive(`spec.${name}.tau`, p.tau, 's'),
      deviation: requireNonNegative(`spec.${name}.deviation`, p.deviation),
    };
  };
  const wf = read('whiteFrequency');
  const rwf = read('randomWalkFrequency');
  const rwd = read('randomWalkDrift');
  if (!wf && !rwf && !rwd) {
    throw new InvalidArgumentError(
      'spec',
      spec,
      'at least one of whiteFrequency, randomWalkFrequency, randomWalkDrift',
    );
  }
  return {
    q1: wf ? wf.deviation ** 2 * wf.tau : 0,
    q2: rwf ? (3 * rwf.deviation ** 2) / rwf.tau : 0,
    q3: rwd ? (120 * rwd.deviation ** 2) / (11 * rwd.tau ** 3) : 0,
  };
}
