/** Relativistic clock terms: constant (factory) rate, instantaneous rate, periodic eccentricity term. */
export { FLIGHT_CONFIGURATION_CAUTION } from '../caution.js';
export {
  type BatchOptions,
  type J2TermKind,
  j2PeriodicTermBatch,
  j2PeriodicTermFromStatesBatch,
  periodicCorrectionFromElementsBatch,
  periodicCorrectionFromStatesBatch,
} from './batch.js';
export { type BoundStateCheck, type BoundStateOptions, boundStateCheck } from './bound-state.js';
export {
  J2_ANALYTIC_MIN_PERIGEE_RADIUS,
  J2_AVERAGING_ORBITS,
  type J2PeriodicAmplitudes,
  type J2RateBreakdown,
  j2PeriodicAmplitudes,
  j2ResidualPeriodicTerm,
  j2SecularClockRate,
  j2SecularClockRateFromState,
  j2TotalPeriodicTerm,
  osculatingMinusMeanSemiMajorAxis,
  type SemiMajorAxisKind,
} from './j2.js';
export {
  type PeriodicCorrection,
  periodicAmplitude,
  periodicCorrectionAtMeanAnomaly,
  periodicCorrectionFromElements,
  periodicCorrectionFromState,
} from './periodic.js';
export {
  DEFAULT_LAGRANGE_POINTS,
  lagrangeDerivativeAtNode,
  lagrangeInterpolate,
  type PreciseCorrectionGap,
  type PreciseCorrectionOptions,
  type PreciseCorrectionResult,
  type PreciseCorrectionSample,
  PreciseCorrectionStream,
  preciseRelativisticCorrections,
  type SatelliteState,
  type StateEpoch,
} from './precise.js';
export {
  integrateProperTime,
  MAX_PROPER_TIME_SAMPLES,
  type ProperTimeOptions,
  type ProperTimeResult,
  properTimeSampleState,
} from './proper-time.js';
export {
  instantaneousClockRate,
  meanClockRate,
  type RateBreakdown,
  type RateOptions,
  REFERENCE_CLOCKS,
  type ReferenceClock,
  rateChangeForSemiMajorAxisChange,
  requireReferenceClock,
  semiMajorAxisForMeanRate,
} from './rate.js';
export {
  GRS80_ELLIPSOID,
  type GroundClockRate,
  groundClockRate,
  type LunarClockLocation,
  type LunarClockRate,
  lunarClockRate,
  MOON_MEAN_RADIUS,
  MOON_SEMI_MAJOR_AXIS,
  MOON_SIDEREAL_ROTATION_PERIOD,
  normalGravity,
  normalGravityPotential,
  type ReferenceEllipsoid,
  tcgRateVsTT,
  WGS84_ELLIPSOID,
} from './reference-clocks.js';
export {
  type GridOrbit,
  MAX_GRID_EPOCHS,
  periodicCorrectionOnTimeGrid,
  type TimeGridOptions,
  type UniformTimeGrid,
} from './time-grid.js';
