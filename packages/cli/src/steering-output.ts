/** Display and JSON-unit helpers shared by the steering commands (`plan`, `simulate`, `fleet`). */

/** Units of the plan's JSON fields (`units` in `tauline plan --json`, beside the SDK's `steeringPlanToJson(plan)`). */
export const PLAN_UNITS = {
  epoch: 'ISO 8601 UTC (the scenario epoch, origin of t and settledAfterSeconds)',
  uplinkAt: 'ISO 8601 UTC',
  executeAt: 'ISO 8601 UTC',
  fractionalFrequencyStep: 'dimensionless (Δf/f)',
  phaseStepSeconds: 's',
  actuatorSteps: 'actuator resolution steps',
  t: 's since the scenario epoch (elapsed SI seconds)',
  phaseSeconds: 's',
  sigmaSeconds: 's',
  worstPredictedOffsetSeconds: 's',
  worstOffsetBoundSeconds: 's',
  probabilityInTolerance: 'dimensionless (probability)',
  totalFrequencySteering: 'dimensionless',
  totalPhaseSteeringSeconds: 's',
  expectedCost: 'dimensionless',
  settledAfterSeconds: 's since the scenario epoch (null: never)',
} as const;

/** Nanoseconds with sign and 3 decimals (display only). */
export function nsText(seconds: number): string {
  return `${(seconds * 1e9).toFixed(3)} ns`;
}
