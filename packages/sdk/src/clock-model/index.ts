/**
 * Clock models: the stochastic [phase, frequency, drift] model (transition, process noise,
 * q ↔ h ↔ Allan/Hadamard relations, fit of q to measured stability), a weighted polynomial
 * (af0/af1/af2) fit, a 2-/3-state clock Kalman filter with outlier and jump detection, and a
 * seeded clock simulator, and the fit of q to the rows of a stability analysis.
 *
 * @module
 */
export type { Matrix } from './linalg.js';
export {
  clockTransitionMatrix, clockProcessNoise, qFromH, hFromQ, allanVarianceFromQ, hadamardVarianceFromQ,
  diffusionFromStabilitySpec, fitDiffusion,
  type ClockStates, type ClockDiffusion, type PowerLawCoefficients, type StabilitySpecPoint, type MeasuredStabilityPoint,
  type DiffusionFitOptions, type DiffusionFit,
} from './noise.js';
export { fitClockPolynomial, type ClockPolynomialOptions, type ClockPolynomial } from './polynomial.js';
export {
  forecastClock, applyClockStep,
  type ClockEstimate, type ClockForecast, type ClockStep, type DetectedJump, type DetectedOutlier, type JumpDetectionOptions,
  type ClockKalmanOptions, type ClockUpdate,
} from './kalman-types.js';
export { ClockKalmanFilter, type ClockDetectionSettings } from './kalman.js';
export { runClockFilter, type ClockFilterSeries, type ClockFilterRunOptions, type ClockFilterRun } from './kalman-run.js';
export { simulateClock, type ClockJump, type ClockSimulationOptions, type ClockSimulation } from './simulate.js';
export {
  diffusionFromStabilityRows, measurementNoiseFromPhase,
  type DiffusionStatistic, type StabilityRowsFitOptions, type StabilityRowFitPoint, type ExcludedStabilityRow, type StabilityRowsFit,
  type DiffusionInterval, type MeasurementNoiseEstimate,
} from './from-stability.js';
export { polynomialNoiseCovariance, type PolynomialNoiseOptions, type PolynomialNoiseCovariance } from './polynomial-noise.js';
export {
  characterizeClock, clockMeasurementNoise, correctPhaseJumps,
  type ClockPhaseRecord, type ClockCharacterizationOptions, type ClockCharacterization, type ClockMeasurementNoise,
  type RejectedClockSample, type ClockPassEvents,
} from './characterize.js';
