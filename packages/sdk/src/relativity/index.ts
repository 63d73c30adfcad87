/** Relativistic clock terms: constant (factory) rate, instantaneous rate, periodic eccentricity term. */
export { FLIGHT_CONFIGURATION_CAUTION } from '../caution.js';
export {
  type ReferenceClock, type RateOptions, type RateBreakdown, REFERENCE_CLOCKS, requireReferenceClock,
  meanClockRate, instantaneousClockRate, rateChangeForSemiMajorAxisChange, semiMajorAxisForMeanRate,
} from './rate.js';
export {
  type PeriodicCorrection, periodicCorrectionFromElements, periodicCorrectionFromState, periodicAmplitude,
  periodicCorrectionAtMeanAnomaly,
} from './periodic.js';
export {
  type SatelliteState, type StateEpoch, type PreciseCorrectionSample, type PreciseCorrectionGap, type PreciseCorrectionResult, type PreciseCorrectionOptions,
  DEFAULT_LAGRANGE_POINTS, lagrangeDerivativeAtNode, lagrangeInterpolate, PreciseCorrectionStream,
  preciseRelativisticCorrections,
} from './precise.js';
export {
  type ProperTimeOptions, type ProperTimeResult, MAX_PROPER_TIME_SAMPLES, integrateProperTime, properTimeSampleState,
} from './proper-time.js';
export { boundStateCheck, type BoundStateCheck, type BoundStateOptions } from './bound-state.js';
export {
  type J2PeriodicAmplitudes, type SemiMajorAxisKind, type J2RateBreakdown, j2ResidualPeriodicTerm, j2TotalPeriodicTerm,
  j2PeriodicAmplitudes, osculatingMinusMeanSemiMajorAxis, j2SecularClockRate, j2SecularClockRateFromState, J2_ANALYTIC_MIN_PERIGEE_RADIUS, J2_AVERAGING_ORBITS,
} from './j2.js';
export {
  type ReferenceEllipsoid, type GroundClockRate, type LunarClockLocation, type LunarClockRate, GRS80_ELLIPSOID,
  WGS84_ELLIPSOID, MOON_SEMI_MAJOR_AXIS, MOON_MEAN_RADIUS, MOON_SIDEREAL_ROTATION_PERIOD, normalGravityPotential,
  normalGravity, groundClockRate, tcgRateVsTT, lunarClockRate,
} from './reference-clocks.js';
export {
  type BatchOptions, type J2TermKind, periodicCorrectionFromElementsBatch, periodicCorrectionFromStatesBatch, j2PeriodicTermBatch,
  j2PeriodicTermFromStatesBatch,
} from './batch.js';
export {
  type GridOrbit, type TimeGridOptions, type UniformTimeGrid, MAX_GRID_EPOCHS, periodicCorrectionOnTimeGrid,
} from './time-grid.js';
