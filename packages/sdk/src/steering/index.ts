/**
 * Clock steering: scenario format, planners (deadband, constrained LQ), prediction, Monte
 * Carlo evaluation, re-planning from fresh estimates and closed-loop simulation.
 *
 * @module
 */
export {
  validateScenario, noiseToDiffusion,
  type SteeringScenario, type ContactWindow, type ClockSpec, type NoiseSpec, type StabilitySpec, type StabilityPoint,
  type ToleranceSpec, type ActuatorSpec, type PhaseStepSpec, type ManeuverSpec, type StrategySpec,
  type DeadbandStrategySpec, type OptimalStrategySpec, type CostWeights, type NormalizedScenario, type OperationsSpec,
} from './scenario.js';
export {
  planSteering, STEERING_CAUTION,
  type SteeringPlan, type InfeasibilityCode, type SteeringCommand, type SteeringMetrics, type PredictedSeries, type PlanOptions, type SteeringMethod,
} from './plan.js';
export { steeringCost, predictSteering, type SteeringPrediction } from './evaluate.js';
export { type CostBreakdown } from './cost.js';
export { type DiffusionCoefficients } from './clock-math.js';
export {
  combineMonteCarloParts, simulatePlan, simulatePlanRuns, type MonteCarloPart, type SimulationOptions, type SimulationRangeOptions, type SimulationSummary,
} from './monte-carlo.js';
export {
  replanSteering, createReplanner, type SteeringReplanner, type ClockOffsetEstimate, type PlanRevision, type RevisedSteeringPlan,
} from './replan.js';
export {
  simulateClosedLoop, type ClosedLoopOptions, type ClosedLoopSummary, type ClosedLoopStrategySummary,
} from './closed-loop.js';
export { type TimeScaleOptions } from './utc-stamps.js';
export { MAX_SEED } from '../internal/random.js';
