/**
 * Public types of the stability-row fit ({@link diffusionFromStabilityRows} in `from-stability.ts`):
 * its options, its result and the per-row records.
 *
 * @module
 */
import type { StabilityRow } from '../stability/types.js';
import type { Seconds } from '../units.js';
import type { DiffusionFit } from './fit-diffusion.js';
import type { Matrix } from './linalg.js';
import type { ClockDiffusion, ClockStates, PowerLawCoefficients } from './noise.js';

/** Overlapping statistics whose expectation the clock model gives: Allan (`oadev`) and Hadamard (`ohdev`). */
export type DiffusionStatistic = 'oadev' | 'ohdev';

/** Options of {@link diffusionFromStabilityRows}. */
export interface StabilityRowsFitOptions {
  /** 2: fit q1, q2 (q3 = 0); 3: fit q1, q2, q3. Default 2. */
  readonly states?: ClockStates;
  /**
   * Statistic read from each row. Default `oadev` for 2 states, `ohdev` for 3 states. A 3-state fit
   * needs `ohdev` (the Allan variance is not stationary with drift noise).
   */
  readonly statistic?: DiffusionStatistic;
  /**
   * Variance of white phase (measurement) noise in the record, in s² (default 0). Its exact
   * contribution to each row (3σ²/τ² Allan, 10σ²/(3τ²) Hadamard) is removed before the fit and
   * included in the covariance of the estimates.
   */
  readonly measurementVariance?: number;
  /**
   * Standard deviation of `measurementVariance` when it is itself an estimate, in s² (default 0). Its
   * effect on q (∂q/∂σ_v² through the subtracted terms) is added to the covariance.
   */
  readonly measurementVarianceStd?: number;
  /** Shortest averaging time used, in seconds (default: every row). */
  readonly minTau?: Seconds;
  /** Longest averaging time used, in seconds (default: every row). */
  readonly maxTau?: Seconds;
  /** Two-sided confidence level of the q intervals, in (0, 1) (default 0.6827, ±1σ). */
  readonly confidence?: number;
}

/** A χ² confidence interval of one diffusion coefficient. */
export interface DiffusionInterval {
  /**
   * Lower and upper bound, in the coefficient's unit (s, 1/s or 1/s³). NaN when the coefficient is held
   * at 0. When ν < 1 (not resolved) `low` is 0; `high` is Infinity when ν is so small that the χ² quantile underflows.
   */
  readonly low: number;
  readonly high: number;
  /** Satterthwaite equivalent degrees of freedom 2q̂²/var(q̂) (NaN when held at 0). */
  readonly edf: number;
}

/** One row as the fit saw it. */
export interface StabilityRowFitPoint {
  /** Averaging time, in seconds. */
  readonly tau: Seconds;
  /** Averaging factor τ/τ0. */
  readonly m: number;
  /** Number of terms of the estimate. */
  readonly n: number;
  /** Measured deviation of the chosen statistic (dimensionless). */
  readonly deviation: number;
  /** Its equivalent degrees of freedom as given by the stability analysis (used for the weights). */
  readonly edf: number;
  /** Noise type the stability analysis used for that edf. */
  readonly noise: StabilityRow['noise'];
  /** Deviation after removing the measurement-noise variance (equal to `deviation` without it). */
  readonly clockDeviation: number;
  /** Deviation of the fitted clock model plus the measurement-noise term at τ. */
  readonly modelDeviation: number;
  /** Standard deviation of the measured variance under the fitted model (exact Gaussian second moments), dimensionless. */
  readonly varianceStd: number;
  /** (measured − model variance)/varianceStd; ≈ N(0, 1) when the model fits (neighbouring rows are correlated). */
  readonly normalizedResidual: number;
}

/** A row left out of the fit, with the reason. */
export interface ExcludedStabilityRow {
  readonly tau: Seconds;
  readonly reason: 'no-estimate' | 'outside-tau-range' | 'measurement-noise-dominates';
}

/** Result of {@link diffusionFromStabilityRows}. */
export interface StabilityRowsFit {
  /** Fitted coefficients, each ≥ 0: q1 (s), q2 (1/s), q3 (1/s³; 0 for a 2-state fit). */
  readonly q: Required<ClockDiffusion>;
  /** States of the model fitted. */
  readonly states: ClockStates;
  /** Statistic used. */
  readonly statistic: DiffusionStatistic;
  /**
   * Covariance of [q1, q2(, q3)] of the estimator, with the correlation between rows taken into
   * account (rows and columns of coefficients held at 0 are zero). See {@link diffusionFromStabilityRows}.
   */
  readonly covariance: Matrix;
  /** 1σ of q1 (s), q2 (1/s), q3 (1/s³) from `covariance` (0 for a coefficient held at 0 or not fitted). */
  readonly qStd: Required<ClockDiffusion>;
  /** Coefficients the non-negativity constraint held at zero. */
  readonly atZero: readonly ('q1' | 'q2' | 'q3')[];
  /** Confidence level of `intervals`. */
  readonly confidence: number;
  /**
   * χ² intervals of q1, q2, q3 (q3 only for 3 states): q̂ is a linear combination of variance
   * estimates, so q̂·ν/q ~ χ²(ν) approximately with ν = 2q̂²/var(q̂) (Satterthwaite); the interval is
   * [νq̂/χ²_{1−α/2}(ν), νq̂/χ²_{α/2}(ν)], as for a deviation in NIST SP 1065 §5.3. Skewed like the
   * estimate itself, it keeps its coverage where a ±σ interval does not (few-edf coefficients).
   */
  readonly intervals: {
    readonly q1: DiffusionInterval;
    readonly q2: DiffusionInterval;
    readonly q3?: DiffusionInterval;
  };
  /** Equivalent power-law coefficients h0 (s), h₋₂ (1/s), h₋₄ (1/s³) (h0 = 2q1, h₋₂ = q2/(2π²), h₋₄ = q3/(8π⁴)). */
  readonly h: Required<PowerLawCoefficients>;
  /** 1σ of the h coefficients (the same linear map applied to qStd). */
  readonly hStd: Required<PowerLawCoefficients>;
  /** Generalised χ² = rᵀV⁻¹r of the variance residuals r with their full covariance V (NaN if V is singular). */
  readonly chiSquare: number;
  /** Rows used minus free coefficients. */
  readonly dof: number;
  /** Probability of a χ² at least this large if the model is right (NaN when dof = 0). */
  readonly chiSquareProbability: number;
  /** Rows used, in order of τ, with the fit's residuals. */
  readonly points: readonly StabilityRowFitPoint[];
  /** Rows not used, with the reason. */
  readonly excluded: readonly ExcludedStabilityRow[];
  /** Measurement-noise variance removed, in s². */
  readonly measurementVariance: number;
  /** The underlying {@link fitDiffusion} result (edf weights; its covariance treats the rows as independent). */
  readonly weightedFit: DiffusionFit;
}
