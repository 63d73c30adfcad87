/**
 * Types of the launch-review input and its findings. The input format is our own and is
 * described by `schema/review.schema.json` in this package.
 *
 * @module
 */

import type { ReferenceClock } from '../relativity/rate.js';
import type { Dimensionless, Hertz, Metres, Radians, Seconds } from '../units.js';

/** How the oscillator offset was configured, exactly one of three forms. */
export type ConfiguredOffset =
  /** The configured output frequency itself, in Hz (e.g. 10 229 999.9954326). */
  | { readonly offsetFrequencyHz: Hertz }
  /** The configured difference from nominal, f_configured − f_nominal, in Hz (e.g. −4.5674e-3). */
  | { readonly offsetHz: Hertz }
  /** The configured fractional frequency offset Δf/f (e.g. −4.4647e-10). */
  | { readonly fractionalOffset: Dimensionless }
  /** A direct-digital-synthesizer tuning word: f_out = word · clockHz / 2^bits. */
  | { readonly tuningWord: { readonly word: string | number; readonly clockHz: Hertz; readonly bits: number } };

/** Planned orbit of one spacecraft. */
export interface ReviewOrbit {
  /** Semi-major axis, in metres. */
  readonly semiMajorAxis: Metres;
  /** Eccentricity, 0 ≤ e < 1 (default 0). */
  readonly eccentricity?: Dimensionless;
  /** Inclination, in radians (default 0). */
  readonly inclination?: Radians;
  /**
   * Which semi-major axis `semiMajorAxis` is under J2: `mean` (orbit average) or `osculating` (then
   * `argumentOfLatitude` says where it was taken). When stated, the expected offset includes the J2
   * secular term; when not, the point-mass value is used and the report states the ambiguity.
   */
  readonly semiMajorAxisKind?: 'mean' | 'osculating';
  /** Argument of latitude where an osculating a was taken, in radians. */
  readonly argumentOfLatitude?: Radians;
}

/** Limits that apply to a spacecraft (top-level values are defaults for every spacecraft). */
export interface ReviewLimits {
  /** Acceptance tolerance on |configured − expected| as a fractional frequency. */
  readonly tolerance?: { readonly fractional: Dimensionless };
  /** Constant-set name (default `iers-2010`). */
  readonly constants?: string;
  /** Reference clock the oscillator must keep pace with (default `tt`). */
  readonly reference?: ReferenceClock;
  /** Steering actuator: the total fractional frequency range it can apply, ± this value. */
  readonly actuator?: { readonly rangeFractional: Dimensionless };
  /** Phase tolerance against system time used for "days until out of tolerance", in seconds. */
  readonly phaseToleranceSeconds?: Seconds;
}

/** One spacecraft of a review file. */
export interface ReviewSpacecraft extends ReviewLimits {
  readonly id: string;
  /** Nominal oscillator frequency, in Hz. */
  readonly nominalFrequencyHz: Hertz;
  readonly configured: ConfiguredOffset;
  readonly orbit: ReviewOrbit;
  /** Orbit-injection dispersion (1σ). */
  readonly dispersion?: { readonly semiMajorAxisSigma: Metres };
  /** Free-form fields are allowed and kept (e.g. `bus`, `clockSerial`). */
  readonly [extra: string]: unknown;
}

/** A whole review file. */
export interface ReviewInput extends ReviewLimits {
  readonly title?: string;
  readonly nominalFrequencyHz?: Hertz;
  readonly spacecraft: readonly ReviewSpacecraft[];
  readonly [extra: string]: unknown;
}

export type Verdict = 'pass' | 'marginal' | 'fail';

/** Codes of recognised mistakes. */
export type DiagnosisCode =
  | 'sign-flipped'
  | 'kilometres-for-metres'
  | 'metres-for-kilometres'
  | 'wrong-gm-set'
  | 'tcg-reference'
  | 'other-orbit'
  | 'copied-from-spacecraft'
  | 'gravitational-term-only'
  | 'velocity-term-only'
  | 'quantisation'
  | 'actuator-range'
  | 'semi-major-axis-kind';

export interface Diagnosis {
  readonly code: DiagnosisCode;
  /** Plain-language explanation a reviewer can act on. */
  readonly message: string;
  /** Fractional offset the mistake would have produced (compare with the configured value). */
  readonly wouldHaveProduced: Dimensionless | null;
  /** True when the configured value matches this hypothesis (within the tolerance); false for advisory notes. */
  readonly matches: boolean;
}

/** Percentile row of the dispersion (closed form, or the Monte Carlo cross-check). */
export interface DispersionPercentile {
  /** Percentile in percent, 100·Φ(k) for a0 + kσ (3 decimals). */
  readonly percentile: number;
  /** Semi-major axis at that percentile (closed form a0 + kσ; Monte Carlo: the order statistic drawn), in metres. */
  readonly semiMajorAxis: Metres;
  /** Residual fractional rate of the configured clock in that orbit (positive = runs fast). */
  readonly residualFractionalRate: Dimensionless;
  /** Days until the unsteered clock leaves the phase tolerance (Infinity if never; null without a phase tolerance). */
  readonly daysToPhaseTolerance: number | null;
}

export interface DispersionAnalysis {
  readonly semiMajorAxisSigma: Metres;
  /** d(rate)/da at the planned orbit, fractional per metre. */
  readonly rateSensitivityPerMetre: number;
  /**
   * Residual fractional rate (1 + c)(1 + r(a)) − 1 of the configured offset c at a − 3σ, a, a + 3σ, r the rate the
   * expected offset compensates (with the J2 term when the kind of a is stated); at a it is difference × (1 + r).
   */
  readonly residualAtMinus3Sigma: Dimensionless;
  readonly residualNominal: Dimensionless;
  readonly residualAtPlus3Sigma: Dimensionless;
  /** Largest |residual| over ±3σ. */
  readonly worstResidual: Dimensionless;
  /** Phase tolerance used, in seconds (null when the file gives none). */
  readonly phaseToleranceSeconds: Seconds | null;
  /** Days to leave the phase tolerance at the worst ±3σ residual, unsteered (null without a phase tolerance). */
  readonly daysToPhaseToleranceWorst: number | null;
  /** Whether the actuator range covers the worst residual (null when no actuator range given). */
  readonly actuatorCovers: boolean | null;
  /**
   * Percentiles at a0 + kσ, k = −3 … 3, in closed form: the residual is monotone in a, so its quantile is the
   * residual at the quantile of a.
   */
  readonly percentiles: readonly DispersionPercentile[];
  /** Seeded Monte Carlo of the same percentiles: a sampling cross-check of `percentiles` (agrees within sampling error). */
  readonly monteCarlo: {
    readonly runs: number;
    readonly seed: number;
    readonly percentiles: readonly DispersionPercentile[];
  };
}

/** Findings for one spacecraft. */
export interface SpacecraftFinding {
  readonly id: string;
  readonly verdict: Verdict;
  readonly constants: string;
  readonly reference: ReferenceClock;
  readonly nominalFrequencyHz: Hertz;
  readonly semiMajorAxis: Metres;
  /** Fractional offset that should be configured for the planned orbit. */
  readonly expectedFractionalOffset: Dimensionless;
  /** Expected output frequency, in Hz. */
  readonly expectedFrequencyHz: Hertz;
  /** Configured fractional offset, as read from the file. */
  readonly configuredFractionalOffset: Dimensionless;
  readonly configuredFrequencyHz: Hertz;
  /** configured − expected, fractional. */
  readonly differenceFractional: Dimensionless;
  /** configured − expected, in Hz at the nominal frequency. */
  readonly differenceHz: Hertz;
  /** configured − expected, as accumulated time error, ns/day. */
  readonly differenceNanosecondsPerDay: number;
  readonly toleranceFractional: Dimensionless;
  /** Parts of the expected rate (fractional): gravitational, velocity, J2, and the J2 caveat size. */
  readonly budget: {
    readonly gravitational: Dimensionless;
    readonly velocity: Dimensionless;
    /** Secular J2 change of the rate for the stated kind of a (for a mean a when the kind is not stated). */
    readonly j2: Dimensionless;
    /** Whether `j2` is included in `fractionalRate` and in the expected offset (only when the kind of a is stated). */
    readonly j2Included: boolean;
    /** Total rate the expected offset compensates. */
    readonly fractionalRate: Dimensionless;
    /** Size of the osculating-vs-mean semi-major-axis ambiguity under J2 (fractional), for the caveat. */
    readonly j2Ambiguity: Dimensionless;
  };
  /** Quantisation of the configured form: step size (fractional) or null when exact. */
  readonly quantisationStepFractional: Dimensionless | null;
  readonly diagnosis: readonly Diagnosis[];
  readonly dispersion: DispersionAnalysis | null;
  /** Short human summary of the verdict. */
  readonly summary: string;
}

export interface ReviewReport {
  readonly title: string;
  readonly generatedBy: string;
  readonly caution: string;
  readonly spacecraft: readonly SpacecraftFinding[];
  readonly counts: { readonly pass: number; readonly marginal: number; readonly fail: number };
}
