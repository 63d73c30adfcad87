/**
 * @tauline/elements — embeddable web components for clock steering schedules, rate budgets,
 * stability plots, launch-review findings and fleet timelines. Importing this entry registers every element;
 * import `@tauline/elements/<name>` (classes only, no side effects) or
 * `@tauline/elements/<name>.define` (one element) to decide yourself.
 *
 * @module
 */

export type { CommandSelectDetail, SpacecraftSelectDetail, TaulineEventMap, ViewChangeDetail } from './events.js';
export type {
  FleetCommandView,
  FleetView,
  SatelliteView,
  StationView,
  SupportView,
} from './fleet-timeline/fleet-data.js';
export type { SatelliteSelectDetail, SupportSelectDetail } from './fleet-timeline/fleet-events.js';
export { TaulineFleetTimeline } from './fleet-timeline/fleet-timeline.define.js';
export { setWarningHandler, type WarningHandler } from './internal/warn.js';
export { TaulineRateBudget } from './rate-budget/rate-budget.define.js';
export type { RateBudgetData } from './rate-budget/rate-budget.js';
export { TaulineReviewFindings } from './review-findings/review-findings.define.js';
export type {
  ReviewDiagnosisView,
  ReviewFindingView,
  ReviewReportView,
  ReviewVerdict,
} from './review-findings/review-findings.js';
export type { StabilityColumns } from './stability-plot/stability-data.js';
export { TaulineStabilityPlot } from './stability-plot/stability-plot.define.js';
export type { PlanView, SteeringCommandView } from './steering-schedule/plan-data.js';
export { TaulineSteeringSchedule } from './steering-schedule/steering-schedule.define.js';
