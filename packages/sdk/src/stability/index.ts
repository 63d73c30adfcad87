/**
 * Frequency-stability analysis: Allan, modified Allan, time, Hadamard and total deviations with
 * confidence intervals and power-law noise identification (NIST SP 1065).
 *
 * @module
 */

export {
  analyzeStability,
  DEFAULT_STATISTICS,
  type DeviationOptions,
  deviations,
  identifyNoise,
  maxAveragingFactor,
  ONE_SIGMA_CONFIDENCE,
  type StabilityOptions,
} from './analyze.js';
export { chiSquareInterval, type EdfResult, equivalentDegreesOfFreedom, overlappingAllanEdf } from './edf.js';
export { NOISE_ID_MIN_POINTS, noiseForAlpha } from './noise-id.js';
export { factorsForTaus, frequencyFromPhase, octaveFactors, phaseFromFrequency, toPhaseSeries } from './series.js';
export type {
  DeviationPoint,
  EdfModel,
  NoiseEstimate,
  NoiseSource,
  NoiseType,
  PhaseSeries,
  StabilityAnalysis,
  StabilityData,
  StabilityInputSummary,
  StabilityRow,
  StatisticEstimate,
  StatisticName,
} from './types.js';
export { NOISE_ALPHA, NOISE_NAMES, STATISTIC_NAMES } from './types.js';
