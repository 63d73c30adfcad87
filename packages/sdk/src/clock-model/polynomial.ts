/**
 * Weighted least-squares polynomial clock model x(t) = a0 + a1(t − t0) + a2(t − t0)², the
 * af0/af1/af2 form of the navigation-message clock correction.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import {
  MAX_ABS_PHASE_SECONDS,
  MEASUREMENT_VARIANCE_RANGE,
  requireFinite,
  requireMeasurementVariance,
  requireOptions,
  requirePhaseSample,
} from '../internal/validate.js';
import type { Instant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import { type Matrix, quadraticForm } from './linalg.js';
import { requireSeriesEpoch } from './series-epoch.js';

/** Options of {@link fitClockPolynomial}. */
export interface ClockPolynomialOptions {
  /** 1 (offset + frequency) or 2 (offset + frequency + drift). Default 2. */
  readonly degree?: 1 | 2;
  /** Reference epoch t0 of the coefficients (t_oc), in seconds. Default: the first epoch. */
  readonly referenceTime?: Seconds;
  /**
   * Per-sample phase variances, in s² (one value for all, or one per sample). When absent, unit
   * weights are used and the covariance is always scaled by the reduced chi-square (the residual
   * variance then estimates the unknown measurement variance).
   */
  readonly variance?: number | ArrayLike<number>;
  /**
   * With variances given: `false` (default) reports the formal covariance (AᵀWA)⁻¹, right when the
   * variances are trusted; `true` multiplies it by χ²/(N − p) (reduced chi-square), the usual choice
   * when the variances are only relative.
   */
  readonly scaleByReducedChiSquare?: boolean;
}

/** A phase series for {@link fitClockPolynomial}: samples at `t` seconds after `epoch`. */
export interface ClockPhaseSeries {
  /** The instant of t = 0 (required); `t`, `referenceTime` and prediction times are seconds since it. */
  readonly epoch: Instant;
  /** Epochs, in seconds since `epoch` (any order, finite; at least degree + 1 distinct values). */
  readonly t: ArrayLike<number>;
  /** Phase (time error) samples, in seconds, one per epoch. */
  readonly phase: ArrayLike<number>;
}

/** A fitted polynomial clock model. */
export interface ClockPolynomial {
  /** Degree of the fit. */
  readonly degree: 1 | 2;
  /** The series' epoch: the instant of t = 0. */
  readonly epoch: Instant;
  /** Reference epoch t0 (t_oc), in seconds since `epoch`. */
  readonly referenceTime: Seconds;
  /** Reference epoch t0 (t_oc) as an instant: `epoch.plus(referenceTime)`. */
  readonly referenceEpoch: Instant;
  /** [a0 (s), a1 (dimensionless, s/s), a2 (1/s, s/s²)]; a2 = 0 for degree 1. a2 = D/2 for a drift D. */
  readonly coefficients: readonly [number, number, number];
  /** Covariance of [a0, a1(, a2)] ((degree + 1) square). */
  readonly covariance: Matrix;
  /** True when the covariance was multiplied by the reduced chi-square. */
  readonly covarianceScaled: boolean;
  /** Residuals z_i − x(t_i), in seconds. */
  readonly residuals: Float64Array;
  /** Σ w_i r_i² (w_i = 1/σ_i², or 1 without variances). */
  readonly chiSquare: number;
  /** Degrees of freedom N − (degree + 1). */
  readonly dof: number;
  /** χ²/dof (NaN when dof = 0). */
  readonly reducedChiSquare: number;
  /** Model phase at t (seconds since `epoch`), in seconds. */
  predict(t: Seconds): Seconds;
  /** Standard deviation of the model phase at t from the coefficient covariance (model only, no new noise), in seconds. */
  predictStd(t: Seconds): Seconds;
}

/**
 * Centre c (mean epoch, s) and half-span s (s) of the fit epochs, which scale the design to u = (t − c)/s;
 * throws unless there are at least degree + 1 distinct epochs.
 */
function centreAndHalfSpan(tt: Float64Array, degree: number): { c: number; s: number } {
  const p = degree + 1;
  const n = tt.length;
  let tMin = Infinity;
  let tMax = -Infinity;
  let tSum = 0;
  for (const ti of tt) {
    tMin = Math.min(tMin, ti);
    tMax = Math.max(tMax, ti);
    tSum += ti;
  }
  const distinct = countDistinctUpTo(tt, p);
  if (distinct < p)
    throw new InvalidArgumentError(
      't',
      `${distinct} distinct epochs`,
      `at least ${p} distinct epochs for a degree-${degree} fit`,
    );
  const c = tSum / n;
  const s = (tMax - tMin) / 2;
  return { c, s };
}

/**
 * Fits x(t) = a0 + a1(t − t0) + a2(t − t0)² to phase samples by weighted least squares.
 *
 * Numerics: the fit is done in a centred and scaled time u = (t − c)/s (c = mean epoch, s = half
 * span), on the √w-scaled design matrix, by Householder QR (Golub & Van Loan, Matrix Computations
 * 4th ed., §5.2 and §5.3 [M]), never by forming the normal equations; the coefficients and their
 * covariance are then mapped exactly to the t0 basis. Prediction variances are computed in u.
 *
 * @param series   `{ epoch, t, phase }`: the instant of t = 0, epochs in seconds since it (any order, finite; at
 *                 least degree + 1 distinct values) and the phase samples in seconds, one per epoch.
 * @param options  Degree, t0, variances and covariance scaling; see {@link ClockPolynomialOptions}.
 * @returns {@link ClockPolynomial} with coefficients, covariance, residuals, χ², predictors and the epochs.
 * @throws {InvalidArgumentError} for a missing or non-Instant `series.epoch`, mismatched lengths, too few samples or distinct epochs, a non-finite
 *         sample, a variance ≤ 0, or degree not 1/2.
 * @see IS-GPS-200, §20.3.3.3.3.1 (SV clock correction polynomial af0, af1, af2) [M].
 */
export function fitClockPolynomial(series: ClockPhaseSeries, options: ClockPolynomialOptions = {}): ClockPolynomial {
  if (typeof series !== 'object' || series === null)
    throw new InvalidArgumentError('series', series, 'an object { epoch, t, phase }');
  const epoch = requireSeriesEpoch('series.epoch', series.epoch);
  const { degree, tt, zz, w, t0 } = readSamples(series.t, series.phase, options);
  const p = degree + 1;
  const n = tt.length;
  const v = options.variance;
  const { c, s } = centreAndHalfSpan(tt, degree);

  // √w-scaled design in u = (t − c)/s, columns [1, u, u²], stored by column.
  const ones = new Float64Array(n);
  const linear = new Float64Array(n);
  const quadratic = degree === 2 ? new Float64Array(n) : undefined;
  const a = quadratic === undefined ? [ones, linear] : [ones, linear, quadratic];
  const b = new Float64Array(n);
  // w and zz have the length n of tt.
  for (const [i, ti] of tt.entries()) {
    const sw = Math.sqrt(w[i]!);
    const u = (ti - c) / s;
    ones[i] = sw;
    linear[i] = sw * u;
    if (quadratic !== undefined) quadratic[i] = sw * u * u;
    b[i] = sw * zz[i]!;
  }
  const { beta, rInv } = householderLeastSquares(a, b, p);
  // Cov_u = R⁻¹ R⁻ᵀ
  const covU: Matrix = rInv.map((ri) =>
    rInv.map((rj) => {
      let sum = 0;
      for (const [k, rik] of ri.entries()) sum += rik * at(rj, k, 'rInv');
      return sum;
    }),
  );
  const b0 = at(beta, 0, 'beta');
  const b1 = at(beta, 1, 'beta');
  const b2 = degree === 2 ? at(beta, 2, 'beta') : 0;
  const evalU = (u: number): number => b0 + b1 * u + (degree === 2 ? b2 * u * u : 0);
  const residuals = new Float64Array(n);
  let chiSquare = 0;
  for (const [i, ti] of tt.entries()) {
    const r = zz[i]! - evalU((ti - c) / s);
    residuals[i] = r;
    chiSquare += w[i]! * r * r;
  }
  const dof = n - p;
  const reducedChiSquare = dof > 0 ? chiSquare / dof : Number.NaN;
  const scaled = (v === undefined || options.scaleByReducedChiSquare === true) && dof > 0;
  const factor = scaled ? reducedChiSquare : 1;
  // Map u-basis coefficients to the t0 basis: u = (t − t0)/s + δ, δ = (t0 − c)/s.
  // x = b0 + b1 u + b2 u² ⇒ a0 = b0 + b1 δ + b2 δ², a1 = (b1 + 2 b2 δ)/s, a2 = b2/s².
  const delta = (t0 - c) / s;
  const tm: Matrix =
    degree === 2
      ? [
          [1, delta, delta * delta],
          [0, 1 / s, (2 * delta) / s],
          [0, 0, 1 / (s * s)],
        ]
      : [
          [1, delta],
          [0, 1 / s],
        ];
  const coef = tm.map((row) => row.reduce((acc, m, j) => acc + m * at(beta, j, 'beta'), 0));
  const covariance: Matrix = tm.map((ri) => tm.map((rj) => quadraticForm(ri, covU, rj) * factor));
  const predict = (time: Seconds): Seconds => evalU((requireFinite('t', time, 'a finite epoch in seconds') - c) / s);
  const predictStd = (time: Seconds): Seconds => {
    const u = (requireFinite('t', time, 'a finite epoch in seconds') - c) / s;
    const g = degree === 2 ? [1, u, u * u] : [1, u];
    return Math.sqrt(Math.max(quadraticForm(g, covU, g) * factor, 0));
  };
  return {
    degree,
    epoch,
    referenceTime: t0,
    referenceEpoch: epoch.plus(t0),
    coefficients: [at(coef, 0, 'coef'), at(coef, 1, 'coef'), degree === 2 ? at(coef, 2, 'coef') : 0],
    covariance,
    covarianceScaled: scaled,
    residuals,
    chiSquare,
    dof,
    reducedChiSquare,
    predict,
    predictStd,
  };
}

/** Validated samples of {@link fitClockPolynomial}: epochs, phases and weights 1/σ² (1 without variances), and t0. */
function readSamples(
  t: ArrayLike<number>,
  phase: ArrayLike<number>,
  options: ClockPolynomialOptions,
): { degree: 1 | 2; tt: Float64Array; zz: Float64Array; w: Float64Array; t0: number } {
  if (!t || typeof t.length !== 'number') throw new InvalidArgumentError('t', t, 'an array of epochs in seconds');
  if (!phase || typeof phase.length !== 'number' || phase.length !== t.length) {
    throw new InvalidArgumentError(
      'phase',
      phase,
      `an array of phases in seconds with the same length as t (${t.length})`,
    );
  }
  requireOptions('options', options);
  const degree = options.degree === undefined ? 2 : options.degree;
  if (degree !== 1 && degree !== 2) throw new InvalidArgumentError('options.degree', degree, '1 or 2');
  const p = degree + 1;
  const n = t.length;
  if (n < p) throw new InvalidArgumentError('t', n, `at least ${p} samples for a degree-${degree} fit`);
  const tt = new Float64Array(n);
  const zz = new Float64Array(n);
  const w = new Float64Array(n);
  const v = options.variance;
  if (v !== undefined && typeof v !== 'number' && (typeof v.length !== 'number' || v.length !== n)) {
    throw new InvalidArgumentError('options.variance', v, `a variance in s² or an array of ${n} variances`);
  }
  const vAll = typeof v === 'number' ? requireMeasurementVariance('options.variance', v) : undefined;
  const vEach = typeof v === 'number' ? undefined : v;
  for (let i = 0; i < n; i++) {
    // The helpers (which build their messages) run only for a bad value.
    const ti = t[i];
    const zi = phase[i];
    tt[i] =
      typeof ti === 'number' && Math.abs(ti) <= MAX_ABS_PHASE_SECONDS ? ti : requirePhaseSample(`t[${i}]`, ti, false);
    zz[i] =
      typeof zi === 'number' && Math.abs(zi) <= MAX_ABS_PHASE_SECONDS
        ? zi
        : requirePhaseSample(`phase[${i}]`, zi, false);
    if (vAll !== undefined) w[i] = 1 / vAll;
    else if (vEach === undefined) w[i] = 1;
    else {
      const vi = vEach[i];
      w[i] =
        1 /
        (typeof vi === 'number' && vi >= MEASUREMENT_VARIANCE_RANGE.min && vi <= MEASUREMENT_VARIANCE_RANGE.max
          ? vi
          : requireMeasurementVariance(`options.variance[${i}]`, vi));
    }
  }
  const t0 =
    options.referenceTime === undefined
      ? at(tt, 0, 't')
      : requireFinite('options.referenceTime', options.referenceTime, 'a finite epoch in seconds');
  return { degree, tt, zz, w, t0 };
}

/** Number of distinct values in `x`, counted up to `limit` (enough to check a rank condition). */
function countDistinctUpTo(x: Float64Array, limit: number): number {
  const seen: number[] = [];
  for (const xi of x) {
    if (seen.length >= limit) break;
    if (!seen.includes(xi)) seen.push(xi);
  }
  return seen.length;
}

/**
 * Least squares min ‖A β − b‖ by Householder QR (Golub & Van Loan §5.1.2, §5.3.3 [M]); returns β and R⁻¹.
 * A is n × p with full column rank (guaranteed by the distinct-epoch check for p ≤ 3), given by columns
 * (overwritten, as is b).
 */
function householderLeastSquares(a: Float64Array[], b: Float64Array, p: number): { beta: number[]; rInv: Matrix } {
  const n = b.length;
  const v = new Float64Array(n);
  // The numeric kernel: row indices bounded by n = b.length, the length of every column.
  for (const [k, ak] of a.entries()) {
    let norm = 0;
    for (let i = k; i < n; i++) norm += ak[i]! ** 2;
    norm = Math.sqrt(norm);
    const akk = ak[k]!;
    const alpha = akk > 0 ? -norm : norm;
    v.fill(0);
    for (let i = k; i < n; i++) v[i] = ak[i]!;
    v[k] = v[k]! - alpha;
    let vv = 0;
    for (let i = k; i < n; i++) vv += v[i]! ** 2;
    if (vv === 0) continue;
    for (const aj of a.slice(k)) {
      let dot = 0;
      for (let i = k; i < n; i++) dot += v[i]! * aj[i]!;
      const f = (2 * dot) / vv;
      for (let i = k; i < n; i++) aj[i] = aj[i]! - f * v[i]!;
    }
    let dot = 0;
    for (let i = k; i < n; i++) dot += v[i]! * b[i]!;
    const f = (2 * dot) / vv;
    for (let i = k; i < n; i++) b[i] = b[i]! - f * v[i]!;
  }
  // Back substitution R β = Qᵀb (first p rows), and R⁻¹ (upper triangular); R[i][j] = a[j][i].
  const r = (i: number, j: number): number => at(at(a, j, 'a'), i, 'a[j]');
  const beta = new Array<number>(p).fill(0);
  for (let i = p - 1; i >= 0; i--) {
    let sum = at(b, i, 'b');
    for (let j = i + 1; j < p; j++) sum -= r(i, j) * at(beta, j, 'beta');
    beta[i] = sum / r(i, i);
  }
  const rInv: Matrix = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const rInvAt = (i: number, j: number): number => at(at(rInv, i, 'rInv'), j, 'rInv[i]');
  for (const [j, rowJ] of rInv.entries()) {
    rowJ[j] = 1 / r(j, j);
    for (let i = j - 1; i >= 0; i--) {
      let sum = 0;
      for (let k = i + 1; k <= j; k++) sum += r(i, k) * rInvAt(k, j);
      at(rInv, i, 'rInv')[j] = -sum / r(i, i);
    }
  }
  return { beta, rInv };
}
