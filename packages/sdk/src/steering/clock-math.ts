/**
 * Small closed forms the steering planner needs on every grid point: the phase variance of the
 * 3-state model and the integral of the squared phase used by the quadratic cost. The transition
 * matrix and the process-noise covariance come from the clock-model module (`clockTransitionMatrix`,
 * `clockProcessNoise`), typed here as 3×3 tuples.
 *
 * @internal
 */
import { clockProcessNoise, clockTransitionMatrix } from '../clock-model/noise.js';

/** 3×3 matrix as nested arrays (row-major). */
export type Matrix3 = [[number, number, number], [number, number, number], [number, number, number]];

/** Diffusion coefficients of the 3-state clock model (Zucca & Tavella 2005). */
export interface DiffusionCoefficients {
  /** White frequency noise, in seconds (AVAR = q1/τ). */
  q1: number;
  /** Random-walk frequency noise, in 1/s (AVAR = q2·τ/3). */
  q2: number;
  /** Random-walk drift noise, in 1/s³ (HVAR = 11·q3·τ³/120). */
  q3: number;
}

/**
 * Variance of the phase x(t) for the 3-state model started from covariance P0:
 * var x(t) = φ(t) P0 φ(t)ᵀ + q1 t + q2 t³/3 + q3 t⁵/20, φ(t) = [1, t, t²/2].
 * Zucca & Tavella, IEEE Trans. UFFC 52(2) 289–296 (2005), Q11 of the process-noise matrix
 * (physics-refs §11) [M citation; relations verified by simulation, C].
 *
 * Kept as this scalar closed form rather than [Φ P0 Φᵀ + clockProcessNoise(t, q, 3)]₁₁: the planner
 * calls it at every grid point and check (clockProcessNoise validates its inputs and builds a 3×3
 * matrix per call), and clockProcessNoise forms q3·t⁵ with another association of the products,
 * so with q3 > 0 the result could differ in the last bit and plans would no longer be reproduced
 * bit for bit. clock-math.test.ts holds the two equal to 1e-14 relative.
 */
export function phaseVariance(t: number, p0: Matrix3, q: DiffusionCoefficients): number {
  const initial = quadForm3([1, t, (t * t) / 2], p0);
  const t3 = t * t * t;
  return Math.max(0, initial) + q.q1 * t + (q.q2 * t3) / 3 + (q.q3 * t3 * t * t) / 20;
}

/** vᵀ M v for a 3-vector and a 3×3 matrix, summed row by row (i, then j). */
export function quadForm3(v: readonly number[], m: Matrix3): number {
  let s = 0;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) s += v[i]! * m[i]![j]! * v[j]!;
  return s;
}

/**
 * The noise-free state [x, y, d] after Δ seconds, Φ(Δ)·s = [x + yΔ + dΔ²/2, y + dΔ, d]
 * (physics-refs §11), written out: `mulVec3(transition(Δ), s)` would round dΔ²/2 in another
 * order and change plans in the last bit.
 */
export function propagateMean(s: readonly number[], delta: number): [number, number, number] {
  return [s[0]! + s[1]! * delta + (s[2]! * delta * delta) / 2, s[1]! + s[2]! * delta, s[2]!];
}

/**
 * ∫₀^Δ φ(s)ᵀ φ(s) ds with φ(s) = [1, s, s²/2]: the matrix M such that ∫ x(s)² ds = sᵀ M s for a
 * noise-free state s = [x, y, d] evolving by Φ(s) (physics-refs §11 transition matrix; integral by
 * elementary calculus, [C]).
 */
export function phaseSquareIntegral(delta: number): Matrix3 {
  const d2 = delta * delta;
  const d3 = d2 * delta;
  const d4 = d3 * delta;
  const d5 = d4 * delta;
  return [
    [delta, d2 / 2, d3 / 6],
    [d2 / 2, d3 / 3, d4 / 8],
    [d3 / 6, d4 / 8, d5 / 20],
  ];
}

/** Φ(Δ) = [[1, Δ, Δ²/2], [0, 1, Δ], [0, 0, 1]] (Zucca & Tavella 2005; physics-refs §11), from `clockTransitionMatrix`; Δ ≥ 0. */
export function transition(delta: number): Matrix3 {
  return clockTransitionMatrix(delta, 3) as Matrix3;
}

export function zeros3(): Matrix3 {
  return [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
}

/** A·B for 3×3 matrices. */
export function mul3(a: Matrix3, b: Matrix3): Matrix3 {
  const r = zeros3();
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) {
      let s = 0;
      for (let k = 0; k < 3; k++) s += a[i]![k]! * b[k]![j]!;
      r[i]![j] = s;
    }
  return r;
}

export function transpose3(a: Matrix3): Matrix3 {
  return [
    [a[0][0], a[1][0], a[2][0]],
    [a[0][1], a[1][1], a[2][1]],
    [a[0][2], a[1][2], a[2][2]],
  ];
}

export function add3(a: Matrix3, b: Matrix3, scaleB = 1): Matrix3 {
  const r = zeros3();
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) r[i]![j] = a[i]![j]! + scaleB * b[i]![j]!;
  return r;
}

export function mulVec3(a: Matrix3, v: readonly number[]): [number, number, number] {
  return [
    a[0][0] * v[0]! + a[0][1] * v[1]! + a[0][2] * v[2]!,
    a[1][0] * v[0]! + a[1][1] * v[1]! + a[1][2] * v[2]!,
    a[2][0] * v[0]! + a[2][1] * v[1]! + a[2][2] * v[2]!,
  ];
}

/**
 * Lower-triangular L with L Lᵀ = A for a symmetric positive semi-definite 3×3 matrix. Zero (or
 * round-off negative) pivots give a zero column instead of NaN, so a singular covariance (e.g.
 * q3 = 0) still yields draws with the right covariance.
 */
export function choleskyPsd3(a: Matrix3): Matrix3 {
  const l = zeros3();
  for (let j = 0; j < 3; j++) {
    let d = a[j]![j]!;
    for (let k = 0; k < j; k++) d -= l[j]![k]! * l[j]![k]!;
    const scale = Math.abs(a[j]![j]!) || 1;
    if (d <= 1e-13 * scale) {
      l[j]![j] = 0;
      continue;
    }
    const ljj = Math.sqrt(d);
    l[j]![j] = ljj;
    for (let i = j + 1; i < 3; i++) {
      let s = a[i]![j]!;
      for (let k = 0; k < j; k++) s -= l[i]![k]! * l[j]![k]!;
      l[i]![j] = s / ljj;
    }
  }
  return l;
}

/**
 * Process-noise covariance Q(τ) of the 3-state model (Zucca & Tavella 2005, physics-refs §11):
 * Q11 = q1τ + q2τ³/3 + q3τ⁵/20, Q12 = q2τ²/2 + q3τ⁴/8, Q13 = q3τ³/6, Q22 = q2τ + q3τ³/3,
 * Q23 = q3τ²/2, Q33 = q3τ; from `clockProcessNoise`; τ ≥ 0.
 */
export function processNoise(tau: number, q: DiffusionCoefficients): Matrix3 {
  return clockProcessNoise(tau, q, 3) as Matrix3;
}
