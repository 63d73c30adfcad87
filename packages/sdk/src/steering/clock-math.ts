/**
 * Small closed forms the steering planner needs on every grid point: the phase variance of the
 * 3-state model and the integral of the squared phase used by the quadratic cost. The transition
 * matrix and the process-noise covariance come from the clock-model module (`clockTransitionMatrix`,
 * `clockProcessNoise`), typed here as 3×3 tuples.
 *
 * @internal
 */
import { clockProcessNoise, clockTransitionMatrix } from '../clock-model/noise.js';

/**
 * The 3-state clock state [x, y, d]: phase (s), fractional frequency, drift (1/s). A tuple, so each
 * component is a `number` to the compiler without an index check.
 */
export type ClockState = [number, number, number];

/** A row (or any 3-vector) of a {@link Matrix3}. */
export type Vec3 = [number, number, number];

/** 3×3 matrix as nested arrays (row-major). */
export type Matrix3 = [Vec3, Vec3, Vec3];

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

/**
 * vᵀ M v for a 3-vector and a 3×3 matrix, summed term by term row by row (i, then j) from 0, the
 * order of the double loop it replaces, so results are unchanged to the last bit.
 */
export function quadForm3(v: Readonly<Vec3>, m: Readonly<Matrix3>): number {
  const [v0, v1, v2] = v;
  const [m0, m1, m2] = m;
  return (
    0 +
    v0 * m0[0] * v0 +
    v0 * m0[1] * v1 +
    v0 * m0[2] * v2 +
    v1 * m1[0] * v0 +
    v1 * m1[1] * v1 +
    v1 * m1[2] * v2 +
    v2 * m2[0] * v0 +
    v2 * m2[1] * v1 +
    v2 * m2[2] * v2
  );
}

/**
 * The noise-free state [x, y, d] after Δ seconds, Φ(Δ)·s = [x + yΔ + dΔ²/2, y + dΔ, d]
 * (physics-refs §11), written out: `mulVec3(transition(Δ), s)` would round dΔ²/2 in another
 * order and change plans in the last bit.
 */
export function propagateMean(s: Readonly<ClockState>, delta: number): ClockState {
  return [s[0] + s[1] * delta + (s[2] * delta * delta) / 2, s[1] + s[2] * delta, s[2]];
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
  return matrix3(clockTransitionMatrix(delta, 3), 'clockTransitionMatrix(delta, 3)');
}

/**
 * The rows of a 3×3 matrix from the clock-model module as a {@link Matrix3}, checked: a `RangeError`
 * naming `name` and the shape found when it is not 3×3 (an internal error, never an input problem).
 */
function matrix3(rows: readonly (readonly number[])[], name: string): Matrix3 {
  const [r0, r1, r2] = rows;
  if (rows.length !== 3 || !isVec3(r0) || !isVec3(r1) || !isVec3(r2)) {
    const shape = rows.map((r) => r.length).join(', ');
    throw new RangeError(`${name} has rows of [${shape}] element(s), expected 3×3 (internal shape error)`);
  }
  return [[...r0], [...r1], [...r2]];
}

function isVec3(row: readonly number[] | undefined): row is Vec3 {
  return row !== undefined && row.length === 3;
}

/**
 * Σᵢⱼ Aᵢⱼ Bᵢⱼ (the Frobenius inner product, = tr(AᵀB)), summed from 0 row by row, the order of the
 * double loop it replaces.
 */
export function frobenius3(a: Readonly<Matrix3>, b: Readonly<Matrix3>): number {
  const [a0, a1, a2] = a;
  const [b0, b1, b2] = b;
  return (
    0 +
    a0[0] * b0[0] +
    a0[1] * b0[1] +
    a0[2] * b0[2] +
    a1[0] * b1[0] +
    a1[1] * b1[1] +
    a1[2] * b1[2] +
    a2[0] * b2[0] +
    a2[1] * b2[1] +
    a2[2] * b2[2]
  );
}

export function zeros3(): Matrix3 {
  return [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
}

/**
 * A·B for 3×3 matrices: each element summed from 0 over k = 0, 1, 2 (the order of the triple loop
 * it replaces, so products are unchanged to the last bit).
 */
export function mul3(a: Readonly<Matrix3>, b: Readonly<Matrix3>): Matrix3 {
  return [rowTimes3(a[0], b), rowTimes3(a[1], b), rowTimes3(a[2], b)];
}

/** The row vector r·B. */
function rowTimes3(r: Readonly<Vec3>, b: Readonly<Matrix3>): Vec3 {
  const [b0, b1, b2] = b;
  return [
    0 + r[0] * b0[0] + r[1] * b1[0] + r[2] * b2[0],
    0 + r[0] * b0[1] + r[1] * b1[1] + r[2] * b2[1],
    0 + r[0] * b0[2] + r[1] * b1[2] + r[2] * b2[2],
  ];
}

export function transpose3(a: Readonly<Matrix3>): Matrix3 {
  return [
    [a[0][0], a[1][0], a[2][0]],
    [a[0][1], a[1][1], a[2][1]],
    [a[0][2], a[1][2], a[2][2]],
  ];
}

/** A + scaleB·B for 3×3 matrices. */
export function add3(a: Readonly<Matrix3>, b: Readonly<Matrix3>, scaleB = 1): Matrix3 {
  const row = (x: Readonly<Vec3>, y: Readonly<Vec3>): Vec3 => [
    x[0] + scaleB * y[0],
    x[1] + scaleB * y[1],
    x[2] + scaleB * y[2],
  ];
  return [row(a[0], b[0]), row(a[1], b[1]), row(a[2], b[2])];
}

export function mulVec3(a: Readonly<Matrix3>, v: Readonly<Vec3>): Vec3 {
  return [
    a[0][0] * v[0] + a[0][1] * v[1] + a[0][2] * v[2],
    a[1][0] * v[0] + a[1][1] * v[1] + a[1][2] * v[2],
    a[2][0] * v[0] + a[2][1] * v[1] + a[2][2] * v[2],
  ];
}

/**
 * Lower-triangular L with L Lᵀ = A for a symmetric positive semi-definite 3×3 matrix (the
 * Cholesky–Banachiewicz recurrence written out for n = 3; Golub & Van Loan, Matrix Computations,
 * 4th ed., §4.2 [M]). Zero (or round-off negative) pivots give a zero column instead of NaN, so a
 * singular covariance (e.g. q3 = 0) still yields draws with the right covariance.
 */
export function choleskyPsd3(a: Readonly<Matrix3>): Matrix3 {
  const [[a00], [a10, a11], [a20, a21, a22]] = a;
  const l00 = psdPivot(a00, a00);
  const l10 = l00 === 0 ? 0 : a10 / l00;
  const l20 = l00 === 0 ? 0 : a20 / l00;
  const l11 = psdPivot(a11 - l10 * l10, a11);
  const l21 = l11 === 0 ? 0 : (a21 - l20 * l10) / l11;
  const l22 = psdPivot(a22 - l20 * l20 - l21 * l21, a22);
  return [
    [l00, 0, 0],
    [l10, l11, 0],
    [l20, l21, l22],
  ];
}

/** √d for a pivot d of the diagonal element `diagonal`, or 0 when d ≤ 1e-13·|diagonal| (a singular direction). */
function psdPivot(d: number, diagonal: number): number {
  const scale = Math.abs(diagonal) || 1;
  return d <= 1e-13 * scale ? 0 : Math.sqrt(d);
}

/**
 * Process-noise covariance Q(τ) of the 3-state model (Zucca & Tavella 2005, physics-refs §11):
 * Q11 = q1τ + q2τ³/3 + q3τ⁵/20, Q12 = q2τ²/2 + q3τ⁴/8, Q13 = q3τ³/6, Q22 = q2τ + q3τ³/3,
 * Q23 = q3τ²/2, Q33 = q3τ; from `clockProcessNoise`; τ ≥ 0.
 */
export function processNoise(tau: number, q: DiffusionCoefficients): Matrix3 {
  return matrix3(clockProcessNoise(tau, q, 3), 'clockProcessNoise(tau, q, 3)');
}
