/**
 * Support allocation for the fleet planner: free positions of a support inside a pass, the
 * station and satellite conflicts, and the per-satellite plan with a given set of supports.
 *
 * @internal
 */

import { at } from '../internal/checked.js';
import { normalCdf } from '../internal/special-functions.js';
import { planSteering, type SteeringPlan } from '../steering/plan.js';
import { formatUtcStamp } from '../steering/utc-stamps.js';
import type { Seconds } from '../units.js';
import type { NormalizedFleet, NormalizedPass } from './document.js';

/** One support: satellite `sat` served by station `station` over [start, end] (seconds since the epoch). */
export interface Support {
  station: number;
  sat: number;
  /** Index of the pass in the satellite's sorted `passes`. */
  pass: number;
  start: Seconds;
  end: Seconds;
}

/** A closed interval of admissible support starts. */
interface Interval {
  lo: number;
  hi: number;
}

/** Rounds a start up to the millisecond, the precision of the printed stamps. */
export function toMillisecond(t: Seconds): Seconds {
  return Math.ceil(t * 1000 - 1e-6) / 1000;
}

/** True when two supports at the same station are closer than the station's setup time (or overlap). */
export function stationConflict(fleet: NormalizedFleet, a: Support, b: Support): boolean {
  if (a.station !== b.station) return false;
  const setup = at(fleet.stations, a.station, 'stations').setup;
  return !(b.start >= a.end + setup - 1e-9 || a.start >= b.end + setup - 1e-9);
}

/** True when two supports of the same satellite overlap in time (a satellite takes one support at a time). */
export function satelliteConflict(a: Support, b: Support): boolean {
  return a.sat === b.sat && a.start < b.end - 1e-9 && b.start < a.end - 1e-9;
}

/** True when `s` conflicts with none of `others` (station setup included, satellite overlap, one support per pass). */
export function compatible(fleet: NormalizedFleet, s: Support, others: readonly Support[]): boolean {
  return others.every(
    (o) =>
      o === s || (!stationConflict(fleet, s, o) && !satelliteConflict(s, o) && !(o.sat === s.sat && o.pass === s.pass)),
  );
}

/**
 * The admissible start times of a support of satellite `sat` in its pass `pass`, given the
 * other supports: [pass.start, pass.end − support] minus the starts that would violate a
 * station's setup time or overlap another support of the same satellite.
 */
export function freeStarts(fleet: NormalizedFleet, sat: number, pass: number, others: readonly Support[]): Interval[] {
  const p = passOf(fleet, sat, pass);
  const { setup, support } = at(fleet.stations, p.station, 'stations');
  if (others.some((o) => o.sat === sat && o.pass === pass)) return [];
  const forbidden: Interval[] = [];
  for (const o of others) {
    if (o.station === p.station) forbidden.push({ lo: o.start - setup - support, hi: o.end + setup });
    if (o.sat === sat) forbidden.push({ lo: o.start - support, hi: o.end });
  }
  forbidden.sort((a, b) => a.lo - b.lo);
  const free: Interval[] = [];
  let lo = toMillisecond(p.start);
  const last = p.end - support;
  for (const f of forbidden) {
    if (f.hi <= lo || f.lo >= last) {
      if (f.lo >= last) break;
      continue;
    }
    if (f.lo >= lo) free.push({ lo, hi: Math.floor(f.lo * 1000 + 1e-6) / 1000 });
    lo = Math.max(lo, toMillisecond(f.hi));
  }
  if (lo <= last + 1e-9) free.push({ lo, hi: Math.floor(last * 1000 + 1e-6) / 1000 });
  return free.filter((iv) => iv.hi >= iv.lo);
}

/** Pass `pass` of satellite `sat` (checked reads: both indices are computed by the allocation). */
function passOf(fleet: NormalizedFleet, sat: number, pass: number): NormalizedPass {
  return at(at(fleet.satellites, sat, 'satellites').passes, pass, 'passes');
}

/** A support starting at `start` in pass `pass` of satellite `sat`. */
export function supportAt(fleet: NormalizedFleet, sat: number, pass: number, start: Seconds): Support {
  const p = passOf(fleet, sat, pass);
  return { station: p.station, sat, pass, start, end: start + at(fleet.stations, p.station, 'stations').support };
}

/** Prints seconds since the fleet epoch as an ISO 8601 UTC stamp. */
export function fleetIso(fleet: NormalizedFleet, t: Seconds): string {
  return formatUtcStamp(fleet.timeScales, fleet.epoch.plus(t));
}

/** Plans one satellite with the single-satellite planner, its supports as its contacts; memoised per support set. */
export class SatellitePlanner {
  private readonly cache = new Map<string, SteeringPlan>();
  constructor(private readonly fleet: NormalizedFleet) {}

  plan(sat: number, supports: readonly Support[]): SteeringPlan {
    const own = supports.filter((s) => s.sat === sat).sort((a, b) => a.start - b.start);
    const key = `${sat}:${own.map((s) => `${s.station}@${s.start}`).join(',')}`;
    let plan = this.cache.get(key);
    if (!plan) {
      const scenario = {
        ...at(this.fleet.satellites, sat, 'satellites').scenario,
        contacts: own.map((s) => ({ start: fleetIso(this.fleet, s.start), end: fleetIso(this.fleet, s.end) })),
      };
      plan = planSteering(scenario, { timeScales: this.fleet.timeScales });
      this.cache.set(key, plan);
    }
    return plan;
  }
}

/**
 * The first checked grid epoch (seconds since the epoch) at which the plan's per-epoch
 * probability P(|offset| ≤ b) = Φ((b − m)/σ) − Φ((−b − m)/σ) (the planner's own criterion) falls
 * below the tolerance probability; Infinity for a feasible plan.
 */
export function firstViolation(fleet: NormalizedFleet, sat: number, plan: SteeringPlan): Seconds {
  if (plan.feasible) return Infinity;
  const norm = at(fleet.satellites, sat, 'satellites').norm;
  const { t, steered } = plan.predicted;
  for (const [k, tk] of t.entries()) {
    const m = at(steered.phaseSeconds, k, 'phaseSeconds');
    const sigma = at(steered.sigmaSeconds, k, 'sigmaSeconds');
    const p =
      sigma > 0
        ? normalCdf((norm.bound - m) / sigma) - normalCdf((-norm.bound - m) / sigma)
        : Math.abs(m) <= norm.bound
          ? 1
          : 0;
    if (p < norm.probability) return tk;
  }
  // Infeasible only just before a phase step (between grid epochs): the last grid epoch bounds it.
  return t[t.length - 1] ?? fleet.horizon;
}
