/**
 * Types shared by the frequency-stability module.
 *
 * @module
 */
import type { Dimensionless, Seconds } from '../units.js';

/**
 * The statistics this module computes (NIST SP 1065, Riley 2008, §5.2 [M section; formulas reproduced against the SP 1065 test data, C]):
 * `adev` non-overlapping Allan, `oadev` overlapping Allan, `mdev` modified Allan, `tdev` time
 * deviation, `hdev` non-overlapping Hadamard, `ohdev` overlapping Hadamard, `totdev` total deviation.
 */
export type StatisticName = 'adev' | 'oadev' | 'mdev' | 'tdev' | 'hdev' | 'ohdev' | 'totdev';

/** Every statistic name, in the order tables print them. */
export const STATISTIC_NAMES: readonly StatisticName[] = ['adev', 'oadev', 'mdev', 'tdev', 'hdev', 'ohdev', 'totdev'];

/**
 * Power-law noise types by the exponent α of the fractional-frequency spectrum S_y(f) ∝ f^α
 * (IEEE Std 1139 convention): WPM α = 2, FPM 1, WFM 0, FFM −1, RWFM −2.
 */
export type NoiseType = 'WPM' | 'FPM' | 'WFM' | 'FFM' | 'RWFM';

/** α of S_y(f) ∝ f^α for each noise type. */
export const NOISE_ALPHA: Readonly<Record<NoiseType, number>> = { WPM: 2, FPM: 1, WFM: 0, FFM: -1, RWFM: -2 };

/** Long names of the noise types. */
export const NOISE_NAMES: Readonly<Record<NoiseType, string>> = {
  WPM: 'white phase modulation',
  FPM: 'flicker phase modulation',
  WFM: 'white frequency modulation',
  FFM: 'flicker frequency modulation',
  RWFM: 'random-walk frequency modulation',
};

/**
 * Stability input: phase (time error x, seconds) or fractional frequency y (dimensionless),
 * uniformly sampled every `tau0` seconds. A missing sample is `NaN` (never 0); ±Infinity is rejected.
 */
export type StabilityData =
  | { readonly phase: ArrayLike<number>; readonly tau0: Seconds }
  | { readonly frequency: ArrayLike<number>; readonly tau0: Seconds };

/**
 * Phase data prepared for the estimators. `phase` is in seconds with `NaN` for a missing
 * sample. `segmentStarts` lists the indices k where the phase lost continuity with sample
 * k − 1 (a missing frequency value between them): the phase after such an index carries an
 * unknown constant offset, so no term may combine samples from both sides.
 */
export interface PhaseSeries {
  readonly phase: Float64Array;
  readonly tau0: Seconds;
  readonly segmentStarts: readonly number[];
}

/** One deviation estimate at one averaging time, without confidence interval. */
export interface DeviationPoint {
  /** Averaging time τ = m·τ0, in seconds. */
  readonly tau: Seconds;
  /** Averaging factor m = τ/τ0. */
  readonly m: number;
  /** The deviation: dimensionless for the frequency statistics, seconds for `tdev`. */
  readonly deviation: number;
  /** Number of squared terms in the sum (complete terms only when the data have gaps). */
  readonly n: number;
}

/** How the equivalent degrees of freedom of an interval were obtained. */
export type EdfModel =
  /** Howe, Allan & Barnes (1981) overlapping-Allan edf formulas as tabulated in NIST SP 1065 §5.2.10. */
  | 'howe-allan-barnes'
  /** edf = 2E²/Var of the estimator computed exactly for Gaussian power-law noise (Greenhall & Riley 2003 approach). */
  | 'gaussian-quadratic-form'
  /** Total-variance edf = b·(T/τ) − c of Howe (NIST SP 1065 §5.2.11 table). */
  | 'totvar-b-c'
  /** Fallback when no noise model applies: chi-square with edf = number of terms. */
  | 'terms';

/** Where a row's noise type came from. */
export type NoiseSource = 'stated' | 'identified' | 'carried-from-shorter-tau' | 'default-wfm';

/** Result of the noise identification (B1, R(n), lag-1 autocorrelation; NIST SP 1065 §5.6) at one averaging factor. */
export interface NoiseEstimate {
  readonly tau: Seconds;
  readonly m: number;
  /** Lag-1 autocorrelation estimate of α (real, before rounding) of S_y(f) ∝ f^α. */
  readonly alphaEstimate: number;
  /** α of the identified noise type (2, 1, 0, −1 or −2), from the combined methods. */
  readonly alpha: number;
  /** The identified noise type. */
  readonly noise: NoiseType;
  /** Noise type the lag-1 estimate alone rounds to (reported for comparison; it decides only WPM/FPM at m = 1). */
  readonly lag1Noise: NoiseType;
  /** Measured B1 ratio (N-sample over Allan variance of the frequency averages at τ). */
  readonly b1Ratio: number;
  /** Number of frequency averages N the B1 ratio used. */
  readonly b1Averages: number;
  /** Measured R(m) = Mod σ²/σ², when it was used to separate WPM from FPM (m ≥ 2, μ = −2). */
  readonly modifiedRatio: number | undefined;
  /** Lag-1 autocorrelation of the (differenced) series that ended the lag-1 procedure. */
  readonly r1: number;
  /** Number of differencing operations the lag-1 procedure applied. */
  readonly differences: number;
  /** Number of points the lag-1 estimate used. */
  readonly points: number;
}

/** One statistic at one τ, with its confidence interval. */
export interface StatisticEstimate extends DeviationPoint {
  /** Equivalent degrees of freedom used for the interval. */
  readonly edf: number;
  readonly edfModel: EdfModel;
  /** Lower and upper bound of the interval, same unit as `deviation`. */
  readonly low: number;
  readonly high: number;
}

/** One averaging time with every requested statistic; a statistic with no term at this τ is absent. */
export interface StabilityRow {
  readonly tau: Seconds;
  readonly m: number;
  /** Noise type used for the intervals and how it was obtained. */
  readonly noise: NoiseType;
  readonly alpha: number;
  readonly noiseSource: NoiseSource;
  /** Identification detail when the identification ran at this τ. */
  readonly noiseEstimate: NoiseEstimate | undefined;
  readonly statistics: Partial<Record<StatisticName, StatisticEstimate>>;
}

/** Summary of what went into an analysis. */
export interface StabilityInputSummary {
  readonly kind: 'phase' | 'frequency';
  /** Number of input samples (phase points or frequency values), gaps included. */
  readonly samples: number;
  /** Number of phase points after conversion (frequency input: samples + 1). */
  readonly phasePoints: number;
  /** Number of missing (NaN) input samples. */
  readonly missing: number;
  readonly tau0: Seconds;
  /** Dimensionless fractional frequency is the unit of every deviation except `tdev` (seconds). */
  readonly unitNote: string;
}

/** Full result of {@link analyzeStability}. */
export interface StabilityAnalysis {
  readonly input: StabilityInputSummary;
  readonly confidence: Dimensionless;
  readonly statistics: readonly StatisticName[];
  readonly rows: readonly StabilityRow[];
  /** Averaging times requested but dropped for every statistic (no complete term), in seconds. */
  readonly droppedTaus: readonly Seconds[];
}
