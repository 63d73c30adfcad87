/**
 * Events of `<tauline-fleet-timeline>`, added to the elements' event map (`TaulineEventMap`), so
 * `emit()` and `addEventListener` are typed for them too.
 *
 * @module
 */
import type { FleetSatellitePlanJson, StationSupportJson } from '@tauline/sdk/fleet';

/** Detail of `tauline-satellite-select`: the user picked a satellite row (row, table or keyboard). */
export interface SatelliteSelectDetail {
  /** The satellite id. */
  id: string;
  /** Its index in `plan.satellites`. */
  index: number;
  feasible: boolean;
  /** Not feasible, or its smallest margin below `risk-margin` × its tolerance. */
  atRisk: boolean;
  /** The satellite's plan object as given. */
  satellite: FleetSatellitePlanJson;
}

/** Detail of `tauline-support-select`: the user picked a support in a station lane. */
export interface SupportSelectDetail {
  /** Index of the support in `plan.stationSchedule`. */
  index: number;
  station: string;
  satellite: string;
  /** The support as given (ISO 8601 UTC start and end). */
  support: StationSupportJson;
}

declare module '../events.js' {
  interface TaulineEventMap {
    'tauline-satellite-select': CustomEvent<SatelliteSelectDetail>;
    'tauline-support-select': CustomEvent<SupportSelectDetail>;
  }
}
