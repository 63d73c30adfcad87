/**
 * Frequency-stability analysis: Allan, modified Allan, time, Hadamard and total deviations with
 * confidence intervals and power-law noise identification (NIST SP 1065).
 *
 * @module
 */
export type {
  StatisticName, NoiseType, StabilityData, PhaseSeries, DeviationPoint, EdfModel, NoiseSource, NoiseEstimate,
  StatisticEstimate, StabilityRow, StabilityInputSummary, StabilityAnalysis,
} from './types.js';
export { STATISTIC_NAMES, NOISE_ALPHA, NOISE_NAMES } from './types.js';
export { phaseFromFrequency, frequencyFromPhase, toPhaseSeries, octaveFactors, factorsForTaus } from './series.js';
export { overlappingAllanEdf, equivalentDegreesOfFreedom, chiSquareInterval, type EdfResult } from './edf.js';
export { NOISE_ID_MIN_POINTS, noiseForAlpha } from './noise-id.js';
export {
  deviations, identifyNoise, analyzeStability, maxAveragingFactor, DEFAULT_STATISTICS, ONE_SIGMA_CONFIDENCE,
  type DeviationOptions, type StabilityOptions,
} from './analyze.js';
