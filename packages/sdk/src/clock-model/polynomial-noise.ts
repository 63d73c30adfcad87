/**
 * Uncertainty of a least-squares clock polynomial (af0/af1/af2) when the residuals are the clock's
 * own correlated noise (q1, q2, q3) plus white measurement noise, and of its predictions.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at, last } from '../internal/checked.js';
import { requireFinite, requireNonNegative } from '../internal/validate.js';
import type { Instant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import { element, inverseSpd, type Matrix, quadraticForm } from './linalg.js';
import { type ClockDiffusion, type ClockStates, clockProcessNoise, requireDiffusion } from './noise.js';
import { requireSeriesEpoch } from './series-epoch.js';

/** The sample epochs of a fit: `t` seconds after `epoch`. */
export interface ClockSampleTimes {
  /** The instant of t = 0 (required); `t`, `referenceTime` and prediction epochs are seconds since it. */
  readonly epoch: Instant;
  /** Epochs of the samples used in the fit, in seconds since `epoch`, strictly increasing. */
  readonly t: ArrayLike<number>;
}

/** Options of {@link polynomialNoiseCovariance}. */
export interface PolynomialNoiseOptions {
  /** Degree of the (unweighted) fit, 1 or 2. */
  readonly degree: 1 | 2;
  /** Reference epoch t0 of the coefficients, in seconds since the series' `epoch`. */
  readonly referenceTime: Seconds;
  /** Diffusion coefficients of the clock noise: q1 (s), q2 (1/s), q3 (1/s³). */
  readonly q: ClockDiffusion;
  /** Variance of white measurement noise, in s² (default 0). */
  readonly measurementVariance?: number;
  /** Epochs (seconds since the series' `epoch`), each ≥ the last sample epoch, at which the prediction error is wanted. */
  readonly predict?: readonly Seconds[];
}

/** Result of {@link polynomialNoiseCovariance}. */
export interface PolynomialNoiseCovariance {
  /** The series' epoch: the instant of t = 0. */
  readonly epoch: Instant;
  /** Reference epoch t0 of the coefficients as an instant: `epoch.plus(referenceTime)`. */
  readonly referenceEpoch: Instant;
  /** Covariance of [a0 (s), a1, a2 (1/s)] at the reference epoch ((degree + 1) square). */
  readonly covariance: Matrix;
  /** √diag(covariance): 1σ of a0 (s), a1 (dimensionless), a2 (1/s). */
  readonly std: readonly number[];
  /** 1σ of the prediction error polynomial(T) − x(T) at each `predict` epoch, in seconds. */
  readonly predictStd: readonly number[];
}

/**
 * Covariance of the unweighted least-squares polynomial coefficients when the phase is
 * z_k = P(t_k) + x_k + v_k: P the deterministic polynomial (the clock's state at the first epoch
 * propagated without noise), x the clock noise started at zero at the first epoch
 * (x_k = Σ_{i ≤ k} [Φ(t_k − t_i) w_i]₀, w_i ~ N(0, Q(t_i − t_{i−1})), Zucca & Tavella 2005) and v white
 * measurement noise of variance R. For a linear functional ℓ of the data,
 *
 *   Var(ℓᵀz) = Σ_i g_iᵀ Q(t_i − t_{i−1}) g_i + R Σ_k ℓ_k²,   g_i = Σ_{k ≥ i} ℓ_k [1, t_k − t_i, (t_k − t_i)²/2],
 *
 * evaluated exactly in O(N) by a backward recursion of g (origin shifted step by step, no large-t
 * cancellation). Coefficients are ℓ = rows of (AᵀA)⁻¹Aᵀ; a prediction at T ≥ t_N has error
 * a(T)ᵀβ̂ − x(T), i.e. g_i − [1, T − t_i, (T − t_i)²/2] per step, plus Q₁₁(T − t_N) for the noise after
 * the last sample. The white-noise formula (AᵀA)⁻¹σ² ignores the correlation of x and understates
 * these uncertainties for a clock with random-walk noise.
 *
 * @param series   `epoch` (Instant of t = 0) and `t`, the epochs of the samples used in the fit, in seconds since
 *                 it, strictly increasing (at least degree + 1).
 * @param options  Degree, reference epoch (s since `epoch`), q, measurement variance (s²), prediction epochs (s).
 * @returns {@link PolynomialNoiseCovariance}.
 * @throws {InvalidArgumentError} for a missing epoch, too few or non-increasing epochs, degree not 1/2, a bad q or variance,
 *         or a prediction epoch before the last sample.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation] (Φ, Q; verified by simulation [C]); covariance of a
 *      linear estimator ℓᵀz is ℓᵀΣℓ (standard linear algebra).
 */
export function polynomialNoiseCovariance(
  series: ClockSampleTimes,
  options: PolynomialNoiseOptions,
): PolynomialNoiseCovariance {
  if (typeof series !== 'object' || series === null)
    throw new InvalidArgumentError('series', series, 'an object { epoch, t }');
  const epoch = requireSeriesEpoch('series.epoch', series.epoch);
  const { tt, degree, t0, q, states, r, predict } = readInputs(series.t, options);
  const p = degree + 1;
  const n = tt.length;
  // Centred, scaled basis u = (t − c)/s, as in fitClockPolynomial.
  let sum = 0;
  for (const v of tt) sum += v;
  const c = sum / n;
  const s = (last(tt, 't') - at(tt, 0, 't')) / 2 || 1;
  const all = functionals(tt, { c, s, degree }, predict);
  const cov = clockNoiseCovariance(tt, all, p, predict, q, states);
  for (const [a, fa] of all.entries()) {
    const covA = at(cov, a, 'cov');
    for (const [b, fb] of all.entries()) {
      if (b < a) continue;
      covA[b] = at(covA, b, 'cov[a]') + r * dot(fa, fb);
      at(cov, b, 'cov')[a] = at(covA, b, 'cov[a]');
    }
  }
  // Map the u-basis coefficient covariance to the t0 basis (as fitClockPolynomial does).
  const delta0 = (t0 - c) / s;
  const tm: Matrix =
    degree === 2
      ? [
          [1, delta0, delta0 * delta0],
          [0, 1 / s, (2 * delta0) / s],
          [0, 0, 1 / (s * s)],
        ]
      : [
          [1, delta0],
          [0, 1 / s],
        ];
  // The coefficient block is cov's first p rows and columns.
  const coefficientBlock = cov.slice(0, p).map((row) => row.slice(0, p));
  const covariance: Matrix = tm.map((ri) => tm.map((rj) => quadraticForm(ri, coefficientBlock, rj)));
  const predictStd = predict.map((T, j) => {
    const after = element(clockProcessNoise(T - last(tt, 't'), q, states), 0, 0);
    return Math.sqrt(Math.max(element(cov, p + j, p + j) + after, 0));
  });
  return {
    epoch,
    referenceEpoch: epoch.plus(t0),
    covariance,
    std: covariance.map((row, i) => Math.sqrt(Math.max(at(row, i, 'covariance'), 0))),
    predictStd,
  };
}

/** Validated inputs of {@link polynomialNoiseCovariance}. */
function readInputs(t: ArrayLike<number>, options: PolynomialNoiseOptions) {
  if (!t || typeof t.length !== 'number')
    throw new InvalidArgumentError('series.t', t, 'an array of epochs in seconds since series.epoch');
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError('options', options, 'an options object { degree, referenceTime, q, ... }');
  const degree = options.degree;
  if (degree !== 1 && degree !== 2) throw new InvalidArgumentError('options.degree', degree, '1 or 2');
  const p = degree + 1;
  const n = t.length;
  if (n < p) throw new InvalidArgumentError('series.t', n, `at least ${p} epochs for a degree-${degree} fit`);
  const tt = new Float64Array(n);
  let previous = Number.NaN;
  for (let k = 0; k < n; k++) {
    const tk = requireFinite(`series.t[${k}]`, t[k], 'a finite epoch in seconds');
    if (k > 0 && !(tk > previous))
      throw new InvalidArgumentError(
        `series.t[${k}]`,
        tk,
        `greater than series.t[${k - 1}] = ${previous} (strictly increasing epochs)`,
      );
    tt[k] = tk;
    previous = tk;
  }
  const t0 = requireFinite('options.referenceTime', options.referenceTime, 'a finite epoch in seconds');
  const q = requireDiffusion('options.q', options.q);
  const states: ClockStates = q.q3 > 0 ? 3 : 2;
  const r =
    options.measurementVariance === undefined
      ? 0
      : requireNonNegative('options.measurementVariance', options.measurementVariance, 's²');
  const lastEpoch = last(tt, 't');
  const predict = (options.predict ?? []).map((v, i) => {
    const T = requireFinite(`options.predict[${i}]`, v, 'a finite epoch in seconds');
    if (T < lastEpoch)
      throw new InvalidArgumentError(
        `options.predict[${i}]`,
        T,
        `≥ the last sample epoch ${lastEpoch} s (predictions after the record)`,
      );
    return T;
  });
  return { tt, degree, t0, q, states, r, predict };
}

/**
 * The linear functionals ℓ of the data: the p coefficient rows (AᵀA)⁻¹Aᵀ in the u basis, then one row
 * basis(T)ᵀ(AᵀA)⁻¹Aᵀ per prediction epoch T.
 */
function functionals(
  tt: Float64Array,
  scaling: { readonly c: number; readonly s: number; readonly degree: 1 | 2 },
  predict: readonly number[],
): Float64Array[] {
  const { c, s, degree } = scaling;
  const quadratic = degree === 2;
  const p = degree + 1;
  const n = tt.length;
  // AᵀA of the basis [1, u, u²] (u = (t − c)/s), each element summed over the epochs in order.
  let n01 = 0;
  let n02 = 0;
  let n11 = 0;
  let n12 = 0;
  let n22 = 0;
  let n00 = 0;
  for (const tk of tt) {
    const u = (tk - c) / s;
    const u2 = u * u;
    n00 += 1 * 1;
    n01 += 1 * u;
    n11 += u * u;
    if (quadratic) {
      n02 += 1 * u2;
      n12 += u * u2;
      n22 += u2 * u2;
    }
  }
  const normal: Matrix = quadratic
    ? [
        [n00, n01, n02],
        [n01, n11, n12],
        [n02, n12, n22],
      ]
    : [
        [n00, n01],
        [n01, n11],
      ];
  const ninv = inverseSpd(normal);
  if (!ninv)
    throw new InvalidArgumentError(
      'series.t',
      `${n} epochs`,
      `at least ${p} distinct epochs for a degree-${p - 1} fit`,
    );
  // Row i of (AᵀA)⁻¹Aᵀ at epoch k: Σ_j (AᵀA)⁻¹_ij·basis_j(t_k), summed over j in order.
  const rows = ninv.map((ni) => {
    const c0 = at(ni, 0, 'ninv[i]');
    const c1 = at(ni, 1, 'ninv[i]');
    const c2 = quadratic ? at(ni, 2, 'ninv[i]') : 0;
    const row = new Float64Array(n);
    for (const [k, tk] of tt.entries()) {
      const u = (tk - c) / s;
      let v = 0;
      v += c0 * 1;
      v += c1 * u;
      if (quadratic) v += c2 * (u * u);
      row[k] = v;
    }
    return row;
  });
  const predictRows = predict.map((T) => {
    const u = (T - c) / s;
    const b = quadratic ? [1, u, u * u] : [1, u];
    const row = new Float64Array(n);
    for (const [i, rowI] of rows.entries()) {
      const bi = at(b, i, 'basis');
      // Indices bounded by n, the length of every row.
      for (let k = 0; k < n; k++) row[k] = (i === 0 ? 0 : row[k]!) + bi * rowI[k]!;
    }
    return row;
  });
  return [...rows, ...predictRows];
}

/** Σ_k x_k·y_k over two arrays of the same length, in index order. */
function dot(x: Float64Array, y: Float64Array): number {
  let v = 0;
  // Indices bounded by x.length = y.length (every functional has one element per epoch).
  for (let k = 0; k < x.length; k++) v += x[k]! * y[k]!;
  return v;
}

/**
 * Σ_i g_aᵀ Q(t_i − t_{i−1}) g_b over the samples for every pair of functionals, by the backward recursion of
 * g_i = Σ_{k ≥ i} ℓ_k [1, t_k − t_i, (t_k − t_i)²/2] (a prediction functional subtracts [1, T − t_i, (T − t_i)²/2]).
 * Upper triangle only; the caller completes it.
 */
function clockNoiseCovariance(
  tt: Float64Array,
  all: readonly Float64Array[],
  p: number,
  predict: readonly number[],
  q: Required<ClockDiffusion>,
  states: ClockStates,
): Matrix {
  const n = tt.length;
  const m = all.length;
  const g = all.map((): [number, number, number] => [0, 0, 0]);
  const cov: Matrix = Array.from({ length: m }, () => new Array<number>(m).fill(0));
  // [1, T − t_i, (T − t_i)²/2] at the current i, one per prediction epoch.
  const targets = predict.map((): readonly [number, number, number] => [0, 0, 0]);
  // The numeric kernel: k is bounded by n = tt.length (every functional's length), i and j by `states`
  // (the order of qk and of every eff row), a and b by m = all.length.
  let next = Number.NaN;
  for (let k = n - 1; k >= 1; k--) {
    const tk = tt[k]!;
    // Move the origin of g from t_{k+1} to t_k and add sample k.
    const delta = k < n - 1 ? next - tk : 0;
    next = tk;
    for (const [a, ga] of g.entries()) {
      const [g0, g1, g2] = ga;
      ga[2] = g2 + delta * g1 + (delta * delta * g0) / 2;
      ga[1] = g1 + delta * g0;
      ga[0] = g0 + all[a]![k]!;
    }
    predict.forEach((T, j) => {
      const d = T - tk;
      targets[j] = [1, d, (d * d) / 2];
    });
    const qk = clockProcessNoise(tk - tt[k - 1]!, q, states);
    const eff = g.map((ga, a) => {
      const head = ga.slice(0, states);
      if (a < p) return head;
      const tg = at(targets, a - p, 'targets');
      return head.map((v, i) => v - at(tg, i, 'target'));
    });
    for (let a = 0; a < m; a++) {
      const ea = eff[a]!;
      for (let b = a; b < m; b++) {
        const eb = eff[b]!;
        let v = 0;
        for (let i = 0; i < states; i++) for (let j = 0; j < states; j++) v += ea[i]! * qk[i]![j]! * eb[j]!;
        cov[a]![b] = cov[a]![b]! + v;
      }
    }
  }
  return cov;
}
