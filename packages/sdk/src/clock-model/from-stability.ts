/**
 * Bridge from a measured stability analysis to the clock model: the diffusion coefficients
 * q1, q2, q3 fitted to the Allan or Hadamard rows of {@link analyzeStability} (with their
 * equivalent degrees of freedom), and an estimate of the white phase (measurement) noise of a
 * phase record, which those rows must be corrected for.
 *
 * @module
 */
import { ConvergenceError, InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { chiSquareQuantile, chiSquareSurvival, chiSquareUpperQuantile } from '../internal/special-functions.js';
import { requireInRange, requireInteger, requireNonNegative, requirePositive } from '../internal/validate.js';
import type { StabilityRow } from '../stability/types.js';
import { type DiffusionFit, fitDiffusion } from './fit-diffusion.js';
import type {
  DiffusionInterval,
  DiffusionStatistic,
  ExcludedStabilityRow,
  StabilityRowFitPoint,
  StabilityRowsFit,
  StabilityRowsFitOptions,
} from './from-stability-types.js';
import { element, inverseSpd, type Matrix } from './linalg.js';
import { type ClockDiffusion, type ClockStates, hFromQ } from './noise.js';

export type {
  DiffusionInterval,
  DiffusionStatistic,
  ExcludedStabilityRow,
  StabilityRowFitPoint,
  StabilityRowsFit,
  StabilityRowsFitOptions,
} from './from-stability-types.js';

const STATISTICS: readonly DiffusionStatistic[] = ['oadev', 'ohdev'];

/** Difference filters of the overlapping statistics, taps at x_i, x_{i+m}, x_{i+2m}(, x_{i+3m}) (NIST SP 1065 §5.2.4, §5.2.8 [M section]). */
const FILTERS: Readonly<Record<DiffusionStatistic, readonly number[]>> = { oadev: [1, -2, 1], ohdev: [-1, 3, -3, 1] };

/** Normalisation of the squared term: σ² = mean(term²)/(c·τ²), c = 2 (Allan), 6 (Hadamard) (NIST SP 1065 §5.2 [M section; reproduced against its test data, C]). */
const NORMS: Readonly<Record<DiffusionStatistic, number>> = { oadev: 2, ohdev: 6 };

/** Probability inside ±1σ of a normal distribution, erf(1/√2) (computed [C]). */
const ONE_SIGMA = 0.6826894921370859;

/**
 * Expected variance that white phase noise of variance σ² (independent samples) adds to one row:
 * Allan 3σ²/τ² (E[(x_{i+2m} − 2x_{i+m} + x_i)²] = 6σ²), Hadamard 10σ²/(3τ²) (E[(Δ³x)²] = 20σ²).
 * Agrees with the WPM Allan form 3 f_h h₂/(4π²τ²) (IEEE Std 1139 / NIST SP 1065 [M]) for f_h = 1/(2τ0) and h₂ = 8π²σ²τ0 [C].
 */
function whitePhaseContribution(statistic: DiffusionStatistic, tau: number, variance: number): number {
  return ((statistic === 'oadev' ? 3 : 10 / 3) * variance) / (tau * tau);
}

/** Clock-only variance model row: coefficients of q (Zucca & Tavella 2005 [M citation]; verified by simulation [C]). */
function designRow(statistic: DiffusionStatistic, tau: number, states: ClockStates): number[] {
  const row = statistic === 'oadev' ? [1 / tau, tau / 3, 0] : [1 / tau, tau / 6, (11 * tau ** 3) / 120];
  return row.slice(0, states);
}

/**
 * Table of the generalised autocovariance of the sampled model phase, G(t) for t = 0 … size − 1 samples:
 *   G(t) = −q1τ0|t|/2 + q2(τ0|t|)³/12 − q3(τ0|t|)⁵/240 + σ_v²·[t = 0]
 * (x = W1 + ∫W2 + ∫∫W3 with independent Wiener processes of diffusion q1, q2, q3, Zucca & Tavella 2005,
 * plus white measurement noise). Checked [C]: the Allan filter gives E[(Δ²x)²] = 2τ²(q1/τ + q2τ/3) and
 * the Hadamard filter 6τ²(q1/τ + q2τ/6 + 11q3τ³/120), the Zucca & Tavella forms [M citation].
 */
function generalizedCovarianceTable(size: number, tau0: number, q: Required<ClockDiffusion>, rv: number): Float64Array {
  const g = new Float64Array(size);
  for (let t = 0; t < size; t++) {
    const s = t * tau0;
    g[t] = (-q.q1 * s) / 2 + (q.q2 * s ** 3) / 12 - (q.q3 * s ** 5) / 240;
  }
  g[0] = at(g, 0) + rv;
  return g;
}

/**
 * Cov(σ̂²_a, σ̂²_b) of two overlapping estimates from the same record, Gaussian model:
 * σ̂² = Σ_i D(i)²/(c τ² n) with D(i) = Σ_k f_k x_{i+km}; Cov(D_a(i)², D_b(j)²) = 2 C(j − i)² (Isserlis),
 * C(L) = Σ_k Σ_l f_k f_l G(L + l m_b − k m_a), which vanishes outside −K m_b < L < K m_a because each
 * filter annihilates the polynomials G is built from. Terms are taken as contiguous (i = 0 … n − 1).
 */
function estimateCovariance(
  f: readonly number[],
  norm: number,
  a: { m: number; n: number; tau: number },
  b: { m: number; n: number; tau: number },
  g: Float64Array,
): number {
  const K = f.length - 1;
  let sum = 0;
  for (let lag = -K * b.m + 1; lag < K * a.m; lag++) {
    const count = Math.min(a.n - 1, b.n - 1 - lag) - Math.max(0, -lag) + 1;
    if (count <= 0) continue;
    let c = 0;
    // The hot kernel: k and l are bounded by K = f.length − 1, and g has 2·K·max(m) + 1 entries, enough for
    // every |lag + l·m_b − k·m_a| of this lag range (see rowCovariance).
    for (let k = 0; k <= K; k++) {
      for (let l = 0; l <= K; l++) c += f[k]! * f[l]! * g[Math.abs(lag + l * b.m - k * a.m)]!;
    }
    sum += count * c * c;
  }
  return (2 * sum) / (norm * a.tau * a.tau * a.n * norm * b.tau * b.tau * b.n);
}

/** Inverse of a small symmetric positive-definite matrix after scaling to unit diagonal; undefined when singular. */
function scaledInverse(a: Matrix): Matrix | undefined {
  const d = a.map((row, i) => Math.sqrt(at(row, i)));
  if (d.some((v) => !(v > 0))) return undefined;
  const inv = inverseSpd(a.map((row, i) => row.map((v, j) => v / (at(d, i) * at(d, j)))));
  return inv?.map((row, i) => row.map((v, j) => v / (at(d, i) * at(d, j))));
}

/**
 * Fits the diffusion coefficients of the clock model to the rows of a stability analysis.
 *
 * Estimate: each row's overlapping deviation s (with its edf) becomes one point of {@link fitDiffusion}
 * (weighted least squares on variances, weights edf/(2σ⁴), q ≥ 0) for the model
 *
 *   oadev: σ²(τ) = q1/τ + q2τ/3 + 3σ_v²/τ²
 *   ohdev: σ²(τ) = q1/τ + q2τ/6 + 11q3τ³/120 + 10σ_v²/(3τ²)
 *
 * with σ_v² the given measurement-noise variance, subtracted from s² first (the point's edf becomes
 * edf·(s² − cσ_v²/τ²)²/s⁴, since the subtraction leaves the variance of the estimate unchanged).
 *
 * Uncertainty: overlapping estimates at neighbouring τ share data, so the edf-weighted covariance of
 * fitDiffusion (rows independent) is too small (about 1.8× in σ for white FM at octave spacing, by
 * simulation). Here the covariance V of the row variances is computed exactly for Gaussian noise under
 * the fitted model (Isserlis' theorem on the quadratic forms, see `estimateCovariance`), and the
 * covariance of the estimator is the sandwich (AᵀWA)⁻¹AᵀW V WA(AᵀWA)⁻¹ over the free coefficients; the
 * generalised χ² = rᵀV⁻¹r tests the fit. The plug-in V uses the fitted q, so for coefficients fixed by
 * a few low-edf rows (e.g. q2, q3 from the longest τ) the Gaussian ±1σ interval is approximate; the
 * coverage measured by simulation is in test/clock-model/from-stability.test.ts.
 *
 * When σ_v² is an estimate with standard deviation `measurementVarianceStd`, (∂q/∂σ_v²)² times its
 * variance is added (its correlation with the rows is neglected).
 *
 * Rows without the statistic, outside [minTau, maxTau], or where the measurement-noise term reaches the
 * measured variance are left out and listed in `excluded`. With gaps, terms are taken as contiguous
 * (the covariance is then approximate).
 *
 * @param rows     Rows of {@link analyzeStability} (its `statistics` must include the chosen statistic), τ in s.
 * @param options  States, statistic, measurement variance (s²), τ range (s); see {@link StabilityRowsFitOptions}.
 * @returns {@link StabilityRowsFit}: q1 (s), q2 (1/s), q3 (1/s³) with covariance and 1σ, the equivalent h
 *          coefficients, χ² with its probability, per-row residuals and excluded rows.
 * @throws {InvalidArgumentError} for rows that are not an array or a malformed row, states not 2/3, an unknown
 *         statistic, `oadev` in a 3-state fit, a negative measurement variance, a bad τ range, or fewer usable
 *         rows than coefficients.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation] (variance relations, verified by simulation [C]);
 *      W. J. Riley, NIST SP 1065 (2008) §5.2, §5.3 (statistics, edf) [M section]; L. Isserlis, Biometrika 12, 134–139 (1918) [M]
 *      (fourth moments of Gaussian variables).
 */
export function diffusionFromStabilityRows(
  rows: readonly StabilityRow[],
  options: StabilityRowsFitOptions = {},
): StabilityRowsFit {
  if (!Array.isArray(rows)) throw new InvalidArgumentError('rows', rows, 'the rows array of analyzeStability(...)');
  const settings = readFitSettings(options);
  const { states, statistic, rv, confidence } = settings;
  const { used, excluded, tau0 } = selectRows(rows, settings);
  const kind = statistic === 'oadev' ? 'allan' : 'hadamard';
  const weightedFit = fitDiffusion(
    used.map((u) => ({
      tau: u.tau,
      deviation: Math.sqrt(u.clockVariance),
      kind,
      edf: u.edf * (u.clockVariance / (u.deviation * u.deviation)) ** 2,
    })),
    { states },
  );
  const q = weightedFit.q;
  const v = rowCovariance(used, statistic, tau0, q, rv);
  const { covariance, free } = sandwichCovariance(used, weightedFit, settings, v);
  const sd = (i: number): number => (i < states ? Math.sqrt(Math.max(element(covariance, i, i), 0)) : 0);
  const qStd = { q1: sd(0), q2: sd(1), q3: sd(2) };

  const residuals = used.map((u, i) => u.clockVariance - at(weightedFit.modelVariance, i));
  const vInv = scaledInverse(v);
  let chiSquare = Number.NaN;
  if (vInv) {
    chiSquare = 0;
    for (const [i, vi] of vInv.entries())
      for (const [j, vij] of vi.entries()) chiSquare += at(residuals, i) * vij * at(residuals, j);
  }
  const dof = used.length - free.length;
  const pi2 = Math.PI * Math.PI;
  const interval = (c: 0 | 1 | 2): DiffusionInterval =>
    diffusionInterval(q[DIFFUSION_NAMES[c]], element(covariance, c, c), free.includes(c), 1 - confidence);
  const intervals =
    states === 3 ? { q1: interval(0), q2: interval(1), q3: interval(2) } : { q1: interval(0), q2: interval(1) };
  const points = used.map((u, i): StabilityRowFitPoint => {
    const varianceStd = Math.sqrt(element(v, i, i));
    return {
      tau: u.tau,
      m: u.m,
      n: u.n,
      deviation: u.deviation,
      edf: u.edf,
      noise: u.row.noise,
      clockDeviation: Math.sqrt(u.clockVariance),
      modelDeviation: Math.sqrt(Math.max(at(weightedFit.modelVariance, i) + u.wpm, 0)),
      varianceStd,
      normalizedResidual: at(residuals, i) / varianceStd,
    };
  });
  return {
    q,
    states,
    statistic,
    covariance,
    qStd,
    atZero: weightedFit.atZero,
    confidence,
    intervals,
    h: hFromQ(q),
    hStd: { h0: 2 * qStd.q1, hMinus2: qStd.q2 / (2 * pi2), hMinus4: qStd.q3 / (8 * pi2 * pi2) },
    chiSquare,
    dof,
    chiSquareProbability: dof > 0 && Number.isFinite(chiSquare) ? chiSquareSurvival(chiSquare, dof) : Number.NaN,
    points,
    excluded,
    measurementVariance: rv,
    weightedFit,
  };
}

const DIFFUSION_NAMES = ['q1', 'q2', 'q3'] as const;

/** The validated options of {@link diffusionFromStabilityRows}. */
interface FitSettings {
  readonly states: ClockStates;
  readonly statistic: DiffusionStatistic;
  /** Measurement-noise variance σ_v² and its standard deviation, in s². */
  readonly rv: number;
  readonly rvStd: number;
  readonly minTau: number;
  readonly maxTau: number;
  readonly confidence: number;
}

function readFitSettings(options: StabilityRowsFitOptions): FitSettings {
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError(
      'options',
      options,
      'an options object { states?, statistic?, measurementVariance?, minTau?, maxTau? }',
    );
  const states = options.states === undefined ? 2 : options.states;
  if (states !== 2 && states !== 3)
    throw new InvalidArgumentError('options.states', states, '2 (phase, frequency) or 3 (phase, frequency, drift)');
  const statistic = options.statistic === undefined ? (states === 3 ? 'ohdev' : 'oadev') : options.statistic;
  if (!STATISTICS.includes(statistic))
    throw new InvalidArgumentError('options.statistic', statistic, `one of ${STATISTICS.join(', ')}`);
  if (states === 3 && statistic === 'oadev') {
    throw new InvalidArgumentError(
      'options.statistic',
      statistic,
      "'ohdev' for a 3-state fit",
      'with random-walk drift noise the Allan variance is not stationary; fit q3 from Hadamard deviations',
    );
  }
  const rv =
    options.measurementVariance === undefined
      ? 0
      : requireNonNegative('options.measurementVariance', options.measurementVariance, 's²');
  const rvStd =
    options.measurementVarianceStd === undefined
      ? 0
      : requireNonNegative('options.measurementVarianceStd', options.measurementVarianceStd, 's²');
  const minTau = options.minTau === undefined ? 0 : requirePositive('options.minTau', options.minTau, 's');
  const maxTau = options.maxTau === undefined ? Infinity : requirePositive('options.maxTau', options.maxTau, 's');
  if (maxTau < minTau) throw new InvalidArgumentError('options.maxTau', maxTau, `≥ options.minTau = ${minTau} s`);
  const confidence =
    options.confidence === undefined
      ? ONE_SIGMA
      : requireInRange('options.confidence', options.confidence, 1e-6, 1 - 1e-9);
  return { states, statistic, rv, rvStd, minTau, maxTau, confidence };
}

/** A row that enters the fit: its τ (s), m, term count, deviation, edf, clock-only variance and white-phase part (s²). */
interface UsedRow {
  readonly tau: number;
  readonly m: number;
  readonly n: number;
  readonly row: StabilityRow;
  readonly deviation: number;
  readonly edf: number;
  readonly clockVariance: number;
  readonly wpm: number;
}

/** The rows that enter the fit, the ones left out (with why), and the common τ0 (s). */
function selectRows(
  rows: readonly StabilityRow[],
  settings: FitSettings,
): { used: UsedRow[]; excluded: ExcludedStabilityRow[]; tau0: number } {
  const { statistic, rv, minTau, maxTau, states } = settings;
  const used: UsedRow[] = [];
  const excluded: ExcludedStabilityRow[] = [];
  let tau0: number | undefined;
  rows.forEach((row, i) => {
    if (typeof row !== 'object' || row === null)
      throw new InvalidArgumentError(`rows[${i}]`, row, 'a row of analyzeStability(...)');
    const tau = requirePositive(`rows[${i}].tau`, row.tau, 's');
    const est = row.statistics?.[statistic];
    if (!est || !(est.deviation > 0)) {
      excluded.push({ tau, reason: 'no-estimate' });
      return;
    }
    if (tau < minTau || tau > maxTau) {
      excluded.push({ tau, reason: 'outside-tau-range' });
      return;
    }
    const m = requireInteger(`rows[${i}].m`, row.m, 1);
    const n = requireInteger(`rows[${i}].statistics.${statistic}.n`, est.n, 1);
    const rowTau0 = tau / m;
    if (tau0 === undefined) tau0 = rowTau0;
    else if (Math.abs(rowTau0 - tau0) > 1e-9 * tau0)
      throw new InvalidArgumentError(
        `rows[${i}].tau`,
        tau,
        `m·τ0 with the τ0 = ${tau0} s of the other rows (rows of one analysis)`,
      );
    const measured = est.deviation * est.deviation;
    const wpm = whitePhaseContribution(statistic, tau, rv);
    const clockVariance = measured - wpm;
    // A row whose measured variance is all (or less than) measurement noise carries no clock information.
    if (!(clockVariance > 0)) {
      excluded.push({ tau, reason: 'measurement-noise-dominates' });
      return;
    }
    const edf = requirePositive(`rows[${i}].statistics.${statistic}.edf`, est.edf);
    used.push({ tau, m, n, row, deviation: est.deviation, edf, clockVariance, wpm });
  });
  if (used.length < states || tau0 === undefined) {
    throw new InvalidArgumentError(
      'rows',
      `${used.length} usable ${statistic} rows`,
      `at least ${states} for a ${states}-state fit`,
      excluded.length > 0 ? `left out: ${excluded.map((e) => `τ = ${e.tau} s (${e.reason})`).join(', ')}` : undefined,
    );
  }
  return { used, excluded, tau0 };
}

/** Exact covariance V of the row variances under the fitted model (see `estimateCovariance`). */
function rowCovariance(
  used: readonly UsedRow[],
  statistic: DiffusionStatistic,
  tau0: number,
  q: Required<ClockDiffusion>,
  rv: number,
): Matrix {
  const f = FILTERS[statistic];
  const K = f.length - 1;
  const maxM = Math.max(...used.map((u) => u.m));
  const g = generalizedCovarianceTable(2 * K * maxM + 1, tau0, q, rv);
  const v: Matrix = used.map(() => new Array<number>(used.length).fill(0));
  for (const [i, ui] of used.entries()) {
    for (const [j, uj] of used.entries()) {
      if (j < i) continue;
      const c = estimateCovariance(f, NORMS[statistic], ui, uj, g);
      at(v, i)[j] = c;
      at(v, j)[i] = c;
    }
  }
  return v;
}

/**
 * Sandwich covariance (AᵀWA)⁻¹AᵀW V WA(AᵀWA)⁻¹ of the weighted estimator over the free coefficients, plus
 * (∂q̂/∂σ_v²)²·Var(σ_v²) when the measurement variance is itself an estimate.
 */
function sandwichCovariance(
  used: readonly UsedRow[],
  weightedFit: DiffusionFit,
  settings: FitSettings,
  v: Matrix,
): { covariance: Matrix; free: number[] } {
  const { states, statistic, rvStd } = settings;
  const free = [0, 1, 2].slice(0, states).filter((c) => !weightedFit.atZero.includes(at(DIFFUSION_NAMES, c)));
  const a = used.map((u) => designRow(statistic, u.tau, states));
  const w = weightedFit.modelVariance.map((mv, i) => {
    const u = at(used, i);
    const edf = u.edf * (u.clockVariance / (u.deviation * u.deviation)) ** 2;
    const ref = mv > 0 ? mv : u.clockVariance;
    return edf / (2 * ref * ref);
  });
  const covariance: Matrix = Array.from({ length: states }, () => new Array<number>(states).fill(0));
  const normal: Matrix = free.map((c) => free.map((d) => a.reduce((s, r, i) => s + at(w, i) * at(r, c) * at(r, d), 0)));
  const normalInv = scaledInverse(normal);
  if (!normalInv) return { covariance, free };
  const nUsed = used.length;
  // L = (AᵀWA)⁻¹AᵀW (p × n); Cov = L V Lᵀ.
  const l = free.map((_, p) =>
    a.map((r, i) => free.reduce((s, d, k) => s + element(normalInv, p, k) * at(r, d), 0) * at(w, i)),
  );
  free.forEach((c, p) => {
    free.forEach((d, k) => {
      const lp = at(l, p);
      const lk = at(l, k);
      let s = 0;
      for (let i = 0; i < nUsed; i++) for (let j = 0; j < nUsed; j++) s += at(lp, i) * element(v, i, j) * at(lk, j);
      at(covariance, c)[d] = s;
    });
  });
  if (rvStd > 0) {
    // q̂ = L(s² − σ_v²·u), u_i = c/τ_i²: ∂q̂/∂σ_v² = −L u.
    const jac = l.map(
      (lp) => -used.reduce((acc, u, i) => acc + at(lp, i) * whitePhaseContribution(statistic, u.tau, 1), 0),
    );
    free.forEach((c, p) => {
      free.forEach((d, k) => {
        at(covariance, c)[d] = element(covariance, c, d) + at(jac, p) * at(jac, k) * rvStd * rvStd;
      });
    });
  }
  return { covariance, free };
}

/**
 * χ² interval of one coefficient q̂ with variance Var(q̂) at two-sided level 1 − α: Satterthwaite (1946),
 * Biometrics Bull. 2(6):110–114 [M]: ν = 2q̂²/Var for a linear combination of χ² variables; [νq̂/χ²_{1−α/2}(ν), νq̂/χ²_{α/2}(ν)].
 */
function diffusionInterval(value: number, variance: number, isFree: boolean, alpha: number): DiffusionInterval {
  if (!isFree || !(value > 0) || !(variance > 0)) return { low: Number.NaN, high: Number.NaN, edf: Number.NaN };
  const edf = (2 * value * value) / variance;
  let lowerQuantile = 0;
  try {
    lowerQuantile = chiSquareQuantile(alpha / 2, edf);
  } catch (e) {
    // For ν ≪ 1 the lower χ² quantile underflows: the coefficient is not resolved and the bound is unlimited.
    if (!(e instanceof ConvergenceError)) throw e;
  }
  const high = lowerQuantile > 0 ? (edf * value) / lowerQuantile : Infinity;
  // ν < 1: the coefficient is within its own uncertainty of zero and the χ² lower bound can even exceed q̂;
  // the interval then starts at 0 (not resolved).
  return { low: edf < 1 ? 0 : (edf * value) / chiSquareUpperQuantile(alpha / 2, edf), high, edf };
}

export { type MeasurementNoiseEstimate, measurementNoiseFromPhase } from './measurement-noise.js';
