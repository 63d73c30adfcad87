/**
 * Clock steering: scenario format, planners (deadband, constrained LQ), prediction, Monte
 * Carlo evaluation, re-planning from fresh estimates and closed-loop simulation.
 *
 * @module
 */

export { MAX_SEED } from '../internal/random.js';
export type { DiffusionCoefficients } from './clock-math.js';
export {
  type ClosedLoopOptions,
  type ClosedLoopStrategySummary,
  type ClosedLoopSummary,
  simulateClosedLoop,
} from './closed-loop.js';
export type { CostBreakdown } from './cost.js';
export { predictSteering, type SteeringPrediction, steeringCost } from './evaluate.js';
export {
  combineMonteCarloParts,
  type MonteCarloPart,
  type SimulationOptions,
  type SimulationRangeOptions,
  type SimulationSummary,
  simulatePlan,
  simulatePlanRuns,
} from './monte-carlo.js';
export {
  type InfeasibilityCode,
  type PlanOptions,
  type PredictedSeries,
  planSteering,
  STEERING_CAUTION,
  type SteeringCommand,
  type SteeringMethod,
  type SteeringMetrics,
  type SteeringPlan,
} from './plan.js';
export {
  type CommandsFromJsonOptions,
  type PlanRevisionJson,
  type RevisedSteeringPlanJson,
  type SteeringCommandJson,
  type SteeringPlanJson,
  steeringCommandsFromJson,
  steeringPlanToJson,
} from './plan-json.js';
export {
  type ClockOffsetEstimate,
  createReplanner,
  type PlanRevision,
  type RevisedSteeringPlan,
  replanSteering,
  type SteeringReplanner,
} from './replan.js';
export {
  type ActuatorSpec,
  type ClockSpec,
  type ContactWindow,
  type CostWeights,
  type DeadbandStrategySpec,
  type ManeuverSpec,
  type NoiseSpec,
  type NormalizedScenario,
  noiseToDiffusion,
  type OperationsSpec,
  type OptimalStrategySpec,
  type PhaseStepSpec,
  type StabilityPoint,
  type StabilitySpec,
  type SteeringScenario,
  type StrategySpec,
  type ToleranceSpec,
  validateScenario,
} from './scenario.js';
export type { TimeScaleOptions } from './utc-stamps.js';
