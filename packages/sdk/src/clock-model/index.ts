/**
 * Clock models: the stochastic [phase, frequency, drift] model (transition, process noise,
 * q ↔ h ↔ Allan/Hadamard relations, fit of q to measured stability), a weighted polynomial
 * (af0/af1/af2) fit, a 2-/3-state clock Kalman filter with outlier and jump detection, and a
 * seeded clock simulator, and the fit of q to the rows of a stability analysis.
 *
 * @module
 */

export {
  type ClockCharacterization,
  type ClockCharacterizationOptions,
  type ClockMeasurementNoise,
  type ClockPassEvents,
  type ClockPhaseRecord,
  type CorrectedPhaseSeries,
  characterizeClock,
  clockMeasurementNoise,
  correctPhaseJumps,
  type DeclaredClockEvents,
  type RejectedClockSample,
} from './characterize.js';
export {
  type DiffusionFit,
  type DiffusionFitOptions,
  fitDiffusion,
  type MeasuredStabilityPoint,
} from './fit-diffusion.js';
export {
  type DiffusionInterval,
  type DiffusionStatistic,
  diffusionFromStabilityRows,
  type ExcludedStabilityRow,
  type MeasurementNoiseEstimate,
  measurementNoiseFromPhase,
  type StabilityRowFitPoint,
  type StabilityRowsFit,
  type StabilityRowsFitOptions,
} from './from-stability.js';
export { type ClockDetectionSettings, ClockKalmanFilter } from './kalman.js';
export {
  type ClockFilterRun,
  type ClockFilterRunOptions,
  type ClockFilterSeries,
  runClockFilter,
} from './kalman-run.js';
export {
  applyClockStep,
  type ClockEstimate,
  type ClockForecast,
  type ClockKalmanOptions,
  type ClockStep,
  type ClockUpdate,
  type DetectedJump,
  type DetectedOutlier,
  forecastClock,
  type JumpDetectionOptions,
} from './kalman-types.js';
export type { Matrix } from './linalg.js';
export {
  allanVarianceFromQ,
  type ClockDiffusion,
  type ClockStates,
  clockProcessNoise,
  clockTransitionMatrix,
  diffusionFromStabilitySpec,
  hadamardVarianceFromQ,
  hFromQ,
  type PowerLawCoefficients,
  qFromH,
  type StabilitySpecPoint,
} from './noise.js';
export {
  type ClockPhaseSeries,
  type ClockPolynomial,
  type ClockPolynomialOptions,
  fitClockPolynomial,
} from './polynomial.js';
export {
  type ClockSampleTimes,
  type PolynomialNoiseCovariance,
  type PolynomialNoiseOptions,
  polynomialNoiseCovariance,
} from './polynomial-noise.js';
export { type ClockJump, type ClockSimulation, type ClockSimulationOptions, simulateClock } from './simulate.js';
