/** Two-body orbits: Kepler's equation, elements ↔ state vectors, propagation. */

export {
  type BroadcastEvaluation,
  defaultFitIntervalSeconds,
  type EphemerisSelectionOptions,
  evaluateBroadcastEphemeris,
  isBeidouGeostationary,
  type KeplerianBroadcastEphemeris,
  type KeplerianNavMessage,
  type KeplerianSystem,
  SYSTEM_TIME_SCALE,
  selectEphemeris,
  systemConstants,
  weekCrossover,
} from './broadcast.js';
export { EARTH_ROTATION_ANGLE_RATE, earthRotationAngle } from './earth-rotation.js';
export {
  CIRCULAR_ECCENTRICITY_THRESHOLD,
  EQUATORIAL_SIN_INCLINATION_THRESHOLD,
  elementsToState,
  type KeplerianElements,
  requireKeplerianElements,
  requireStateVector,
  type StateVector,
  stateToElements,
} from './elements.js';
export {
  type EphemerisFrame,
  LOW_PRECISION_EPHEMERIS_NAME,
  moonPositionLowPrecision,
  sunPositionLowPrecision,
} from './ephemeris.js';
export {
  createGravityField,
  GM_MOON,
  GM_SUN,
  GRAVITY_MODELS,
  type GravityField,
  type GravityFieldOptions,
  type GravityModel,
  j2Potential,
  pointMassPotential,
  thirdBodyAcceleration,
  thirdBodyTidalPotential,
} from './forces.js';
export { elevationFromStation, type GeodeticPosition, geodeticToEcef } from './geodetic.js';
export { type Dop853Options, type Dop853Result, integrateDop853, type OdeRightHandSide } from './integrator.js';
export { type J2SecularRates, j2SecularRates, propagateJ2Secular } from './j2-secular.js';
export {
  eccentricToMeanAnomaly,
  eccentricToTrueAnomaly,
  KEPLER_RESIDUAL_TOLERANCE,
  keplerTolerance,
  meanMotion,
  orbitalPeriod,
  solveKepler,
  trueToEccentricAnomaly,
} from './kepler.js';
export { propagateKepler, propagateKeplerState } from './propagate.js';
export {
  BROADCAST_SIGNALS,
  type BroadcastSignal,
  GALILEO_GAMMA_E1_E5A,
  GALILEO_GAMMA_E1_E5B,
  GPS_GAMMA_L1_L2,
  type GroupDelayField,
  isBroadcastSignal,
  type SignalClockCorrection,
  signalClockCorrection,
  signalClockSource,
  signalsOf,
} from './signal-clock.js';
export {
  type GroundSite,
  MAX_PASS_PROPAGATION_SECONDS,
  type MeanOrbit,
  PASS_TIME_TOLERANCE_SECONDS,
  type PassPrediction,
  type PassPredictionOptions,
  type PredictedPass,
  predictPasses,
  satellitePositionEcef,
} from './visibility.js';
