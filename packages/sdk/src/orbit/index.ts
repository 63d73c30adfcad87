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
  isBeidouGeostationary, evaluateBroadcastEphemeris, selectEphemeris,
} from './broadcast.js';
