/**
 * Fleet steering: several satellite clocks planned jointly through shared ground stations.
 *
 * @module
 */

export type { FleetOrbit, FleetStationPosition, NormalizedComputedPass } from './computed-passes.js';
export {
  type FleetDocument,
  type FleetPass,
  type FleetSatellite,
  type FleetStation,
  type NormalizedFleet,
  type NormalizedFleetSatellite,
  type NormalizedPass,
  validateFleet,
} from './document.js';
export { EXACT_SEARCH_LIMIT } from './exact.js';
export {
  type ComputedPassReport,
  type FleetCommand,
  type FleetInfeasibilityCode,
  type FleetPlan,
  type FleetPlanOptions,
  type FleetSatellitePlan,
  planFleet,
  type StationSupport,
} from './plan.js';
export {
  type ComputedPassReportJson,
  type FleetCommandJson,
  type FleetPlanJson,
  type FleetSatellitePlanJson,
  fleetPlanToJson,
  type StationSupportJson,
} from './plan-json.js';
