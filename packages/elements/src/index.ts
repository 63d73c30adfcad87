/**
 * @tauline/elements — embeddable web components for clock steering schedules, rate budgets,
 * stability plots, launch-review findings and fleet timelines. Importing this entry registers every element;
 * import `@tauline/elements/<name>` (classes only, no side effects) or
 * `@tauline/elements/<name>.define` (one element) to decide yourself.
 *
 * @module
 */
export { TaulineSteeringSchedule } from './steering-schedule/steering-schedule.define.js';
export { TaulineRateBudget } from './rate-budget/rate-budget.define.js';
export { TaulineStabilityPlot } from './stability-plot/stability-plot.define.js';
export { TaulineReviewFindings } from './review-findings/review-findings.define.js';
export { TaulineFleetTimeline } from './fleet-timeline/fleet-timeline.define.js';
export type { RateBudgetData } from './rate-budget/rate-budget.js';
export type { StabilityColumns } from './stability-plot/stability-data.js';
export type { SteeringCommandView, PlanView } from './steering-schedule/plan-data.js';
export type { ReviewReportView, ReviewFindingView, ReviewDiagnosisView, ReviewVerdict } from './review-findings/review-findings.js';
export type { FleetView, SatelliteView, SupportView, StationView, FleetCommandView } from './fleet-timeline/fleet-data.js';
export type { SatelliteSelectDetail, SupportSelectDetail } from './fleet-timeline/fleet-events.js';
export type { CommandSelectDetail, ViewChangeDetail, SpacecraftSelectDetail, TaulineEventMap } from './events.js';
export { setWarningHandler, type WarningHandler } from './internal/warn.js';
