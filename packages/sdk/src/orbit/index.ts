/** Two-body orbits: Kepler's equation, elements ↔ state vectors, propagation. */
export {
  KEPLER_RESIDUAL_TOLERANCE, keplerTolerance, solveKepler, eccentricToTrueAnomaly, trueToEccentricAnomaly,
  eccentricToMeanAnomaly, meanMotion, orbitalPeriod,
} from './kepler.js';
export {
  type KeplerianElements, type StateVector, CIRCULAR_ECCENTRICITY_THRESHOLD, EQUATORIAL_SIN_INCLINATION_THRESHOLD,
  elementsToState, stateToElements, requireKeplerianElements, requireStateVector,
} from './elements.js';
export { propagateKepler, propagateKeplerState } from './propagate.js';
export {
  type KeplerianSystem, type KeplerianNavMessage, type KeplerianBroadcastEphemeris, type BroadcastEvaluation,
  type EphemerisSelectionOptions, systemConstants, defaultFitIntervalSeconds, weekCrossover,
  isBeidouGeostationary, evaluateBroadcastEphemeris, selectEphemeris, orbitTimeSeconds, SYSTEM_TIME_SCALE,
} from './broadcast.js';
export {
  type BroadcastSignal, type GroupDelayField, type SignalClockCorrection, BROADCAST_SIGNALS, GPS_GAMMA_L1_L2,
  GALILEO_GAMMA_E1_E5A, GALILEO_GAMMA_E1_E5B, isBroadcastSignal, signalClockCorrection, signalClockSource, signalsOf,
} from './signal-clock.js';
export { type OdeRightHandSide, type Dop853Options, type Dop853Result, integrateDop853 } from './integrator.js';
export {
  type GravityModel, type GravityField, type GravityFieldOptions, GRAVITY_MODELS, GM_MOON, GM_SUN, createGravityField,
  pointMassPotential, j2Potential, thirdBodyTidalPotential, thirdBodyAcceleration,
} from './forces.js';
export {
  type EphemerisFrame, LOW_PRECISION_EPHEMERIS_NAME, sunPositionLowPrecision, moonPositionLowPrecision,
} from './ephemeris.js';
export {
  type GeodeticPosition, geodeticToEcef, elevationFromStation,
} from './geodetic.js';
export { EARTH_ROTATION_ANGLE_RATE, earthRotationAngle } from './earth-rotation.js';
export { type J2SecularRates, j2SecularRates, propagateJ2Secular } from './j2-secular.js';
export {
  type MeanOrbit, type GroundSite, type PredictedPass, type PassPrediction, type PassPredictionOptions, PASS_TIME_TOLERANCE_SECONDS,
  MAX_PASS_PROPAGATION_SECONDS, satellitePositionEcef, predictPasses,
} from './visibility.js';
