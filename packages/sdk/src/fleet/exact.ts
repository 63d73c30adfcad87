/**
 * Exact search over support choices for small fleets: each pass of each satellite holds no
 * support, one at the start of the pass, or one at its end.
 *
 * @internal
 */

import { at } from '../internal/checked.js';
import {
  compatible,
  type SatellitePlanner,
  type Support,
  satelliteConflict,
  stationConflict,
  supportAt,
  toMillisecond,
} from './allocate.js';
import type { NormalizedFleet, NormalizedPass } from './document.js';

/** Largest total number of per-satellite choices the exact search enumerates. */
export const EXACT_SEARCH_LIMIT = 4096;

/** The support positions tried in a pass: its start, and its end minus the support duration. */
function positions(fleet: NormalizedFleet, sat: number, pass: number, p: NormalizedPass): Support[] {
  const support = at(fleet.stations, p.station, 'stations').support;
  const early = supportAt(fleet, sat, pass, toMillisecond(p.start));
  const lateStart = Math.floor((p.end - support) * 1000 + 1e-6) / 1000;
  const out = early.end <= p.end + 1e-9 ? [early] : [];
  if (lateStart > early.start && lateStart >= p.start) out.push(supportAt(fleet, sat, pass, lateStart));
  return out;
}

/** Every choice of supports for one satellite (no overlap between its own supports). */
function choices(fleet: NormalizedFleet, sat: number, passes: readonly NormalizedPass[]): Support[][] {
  const out: Support[][] = [];
  const walk = (k: number, chosen: Support[]): void => {
    const pass = passes[k];
    if (pass === undefined) {
      out.push([...chosen]);
      return;
    }
    walk(k + 1, chosen);
    for (const s of positions(fleet, sat, k, pass)) {
      if (chosen.some((c) => satelliteConflict(c, s) || stationConflict(fleet, c, s))) continue;
      chosen.push(s);
      walk(k + 1, chosen);
      chosen.pop();
    }
  };
  walk(0, []);
  return out;
}

/**
 * A support set that holds every satellite (the per-satellite feasible choices, fewest supports
 * first, combined by backtracking under the station constraints), or undefined when none
 * exists among these choices or the fleet is too large for the search.
 */
export function exactAllocation(fleet: NormalizedFleet, planner: SatellitePlanner): Support[] | undefined {
  let total = 0;
  for (const [i, { passes }] of fleet.satellites.entries()) {
    let count = 1;
    for (const [k, pass] of passes.entries()) count *= 1 + positions(fleet, i, k, pass).length;
    total += count;
    if (total > EXACT_SEARCH_LIMIT) return undefined;
  }
  const options: Support[][][] = [];
  for (const [i, { passes }] of fleet.satellites.entries()) {
    const feasible = choices(fleet, i, passes)
      .filter((c) => planner.plan(i, c).feasible)
      .sort((x, y) => x.length - y.length);
    if (feasible.length === 0) return undefined;
    options.push(feasible);
  }
  const chosen: Support[] = [];
  const search = (i: number): boolean => {
    const satelliteOptions = options[i];
    if (satelliteOptions === undefined) return true;
    for (const option of satelliteOptions) {
      if (!option.every((s) => compatible(fleet, s, chosen))) continue;
      chosen.push(...option);
      if (search(i + 1)) return true;
      chosen.splice(chosen.length - option.length, option.length);
    }
    return false;
  };
  return search(0) ? chosen : undefined;
}
