/** Relativistic clock terms: constant (factory) rate, instantaneous rate, periodic eccentricity term. */
export {
  type ReferenceClock, type RateOptions, type RateBreakdown, REFERENCE_CLOCKS, requireReferenceClock,
  meanClockRate, instantaneousClockRate, rateChangeForSemiMajorAxisChange, semiMajorAxisForMeanRate,
} from './rate.js';
export {
  type PeriodicCorrection, periodicCorrectionFromElements, periodicCorrectionFromState, periodicAmplitude,
  periodicCorrectionAtMeanAnomaly,
} from './periodic.js';
export {
  type PreciseCorrectionSample, type PreciseCorrectionGap, type PreciseCorrectionResult, type PreciseCorrectionOptions,
  DEFAULT_LAGRANGE_POINTS, lagrangeDerivativeAtNode, lagrangeInterpolate, PreciseCorrectionStream,
  preciseRelativisticCorrections,
} from './precise.js';
