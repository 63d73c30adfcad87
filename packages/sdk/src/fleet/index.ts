/**
 * Fleet steering: several satellite clocks planned jointly through shared ground stations.
 *
 * @module
 */
export {
  validateFleet,
  type FleetDocument, type FleetStation, type FleetPass, type FleetSatellite, type NormalizedFleet, type NormalizedFleetSatellite, type NormalizedPass,
} from './document.js';
export type { FleetOrbit, FleetStationPosition, NormalizedComputedPass } from './computed-passes.js';
export {
  planFleet,
  type FleetPlan, type FleetPlanOptions, type ComputedPassReport, type FleetSatellitePlan, type FleetCommand, type StationSupport, type FleetInfeasibilityCode,
} from './plan.js';
export { EXACT_SEARCH_LIMIT } from './exact.js';
