/**
 * `planFleet`: steering a constellation through shared ground stations.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { ns } from '../steering/constraints.js';
import {
  type InfeasibilityCode,
  STEERING_CAUTION,
  type SteeringCommand,
  type SteeringMetrics,
  type SteeringPlan,
} from '../steering/plan.js';
import type { TimeScaleOptions } from '../steering/utc-stamps.js';
import type { Instant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import {
  firstViolation,
  fleetIso,
  freeStarts,
  SatellitePlanner,
  type Support,
  stationConflict,
  supportAt,
} from './allocate.js';
import { type NormalizedFleet, validateFleet } from './document.js';
import { exactAllocation } from './exact.js';

/** One command of a satellite, with the station that uplinks it (inside a support of this satellite there). */
export interface FleetCommand extends SteeringCommand {
  /** Id of the station that uplinks the command. */
  station: string;
}

/**
 * Why a satellite cannot be held: the single-satellite codes of `planSteering`, plus
 * `too-few-passes` (no pass before its offset leaves the tolerance) and `station-overbooked`
 * (passes exist but other satellites' supports hold the stations then).
 */
export type FleetInfeasibilityCode = InfeasibilityCode | 'too-few-passes' | 'station-overbooked';

/** A pass computed from a satellite's orbit (the JSON form prints its instants to the millisecond). */
export interface ComputedPassReport {
  station: string;
  /** When the satellite rises above the station's mask (or the epoch, when clipped at the start). */
  start: Instant;
  /** When it sets below the mask (or the end of the horizon, when clipped at the end). */
  end: Instant;
  /** Highest elevation above the station's horizon during the pass, in radians. */
  maxElevationRadians: number;
  /** When the highest elevation occurs. */
  maxElevationAt: Instant;
  /** True when the pass began before the epoch (cut by the horizon start). */
  clippedAtStart: boolean;
  /** True when the pass goes on after the end of the horizon. */
  clippedAtEnd: boolean;
  /** False when the pass is shorter than the station's supportSeconds: it was not planned with. */
  usable: boolean;
}

/** The plan of one satellite of the fleet. */
export interface FleetSatellitePlan {
  id: string;
  /** True when its predicted offset stays inside its tolerance at its probability (the `planSteering` rule). */
  feasible: boolean;
  reason?: string;
  reasonCode?: FleetInfeasibilityCode;
  commands: FleetCommand[];
  /** As in a steering plan: grid (elapsed SI seconds since the fleet plan's `epoch`), steered and unsteered mean and 1σ. */
  predicted: SteeringPlan['predicted'];
  metrics: SteeringMetrics;
  /**
   * Present when the passes were computed from the satellite's `orbit` (secular J2 mean elements,
   * UT1 = UTC; pass times good to seconds, see orbit/visibility.ts): every computed pass, usable or not.
   */
  computedPasses?: ComputedPassReport[];
}

/** One support in the station schedule. */
export interface StationSupport {
  station: string;
  satellite: string;
  /** When the support starts (a whole millisecond of UTC after the epoch). */
  start: Instant;
  /** When it ends (start + the station's supportSeconds). */
  end: Instant;
}

/**
 * The joint plan. Absolute times are {@link Instant}s; each satellite's relative times are elapsed
 * SI seconds since `epoch`. Print or send it with `fleetPlanToJson` (ISO 8601 UTC stamps).
 */
export interface FleetPlan {
  /** The fleet epoch: the origin of every relative time of the plan (every satellite's grid). */
  epoch: Instant;
  /** True when every satellite is feasible. */
  feasible: boolean;
  /** Which satellites cannot be held (present only when `feasible` is false). */
  reason?: string;
  satellites: FleetSatellitePlan[];
  /** Every support, sorted by station (as listed) then start. */
  stationSchedule: StationSupport[];
  caution: string;
}

interface Blocked {
  code: FleetInfeasibilityCode;
  text: string;
}

/** State of the greedy allocation. */
interface Allocation {
  supports: Support[];
  plans: SteeringPlan[];
  need: Seconds[];
  blocked: (Blocked | undefined)[];
}

function evaluate(fleet: NormalizedFleet, planner: SatellitePlanner, a: Allocation, sat: number): void {
  const plan = planner.plan(sat, a.supports);
  a.plans[sat] = plan;
  a.need[sat] = firstViolation(fleet, sat, plan);
}

/** The latest admissible support of `sat` starting before `need` (ending before it when possible). */
function bestSlot(
  fleet: NormalizedFleet,
  sat: number,
  need: Seconds,
  supports: readonly Support[],
): Support | undefined {
  let best: Support | undefined;
  const passes = at(fleet.satellites, sat, 'satellites').passes;
  for (const [p, pass] of passes.entries()) {
    if (pass.start >= need) break;
    const support = at(fleet.stations, pass.station, 'stations').support;
    for (const iv of freeStarts(fleet, sat, p, supports)) {
      if (iv.lo >= need) continue;
      const start = Math.min(iv.hi, Math.max(iv.lo, Math.floor((need - support) * 1000) / 1000));
      if (!best || start > best.start) best = supportAt(fleet, sat, p, start);
    }
  }
  return best;
}

/**
 * Local repair when `sat` has no free slot before `need`: take the supports of satellites already
 * found unholdable, or move one blocking support of a holdable satellite to another position of
 * its own pass, provided that satellite's first violation comes no earlier than before.
 */
function repair(
  fleet: NormalizedFleet,
  planner: SatellitePlanner,
  a: Allocation,
  sat: number,
  need: Seconds,
): Support | undefined {
  const passes = at(fleet.satellites, sat, 'satellites').passes;
  for (const [p, pass] of passes.entries()) {
    if (pass.start >= need) break;
    if (a.supports.some((s) => s.sat === sat && s.pass === p)) continue;
    const probe = supportAt(fleet, sat, p, pass.start);
    const widened = { ...probe, end: Math.min(pass.end, need) };
    const blockers = a.supports.filter((o) => o.sat !== sat && stationConflict(fleet, widened, o));
    const fromBlocked = blockers.filter((o) => a.blocked[o.sat]);
    if (fromBlocked.length > 0) {
      const rest = a.supports.filter((o) => !fromBlocked.includes(o));
      const slot = bestSlot(fleet, sat, Math.min(need, pass.end + 1e-3), rest);
      if (slot && slot.pass === p) {
        a.supports = rest;
        for (const j of new Set(fromBlocked.map((o) => o.sat))) evaluate(fleet, planner, a, j);
        return slot;
      }
    }
    for (const b of blockers) {
      if (a.blocked[b.sat]) continue;
      const rest = a.supports.filter((o) => o !== b);
      for (const iv of freeStarts(fleet, b.sat, b.pass, rest)) {
        for (const start of [iv.lo, iv.hi]) {
          const moved = supportAt(fleet, b.sat, b.pass, start);
          const trial = [...rest, moved];
          const slot = bestSlot(fleet, sat, need, trial);
          if (!slot || slot.pass !== p) continue;
          const before = at(a.need, b.sat, 'need');
          const after = firstViolation(fleet, b.sat, planner.plan(b.sat, trial));
          if (after < before) continue;
          a.supports = trial;
          evaluate(fleet, planner, a, b.sat);
          return slot;
        }
      }
    }
  }
  return undefined;
}

/** Says why `sat` cannot get a support before `need`. */
function explain(fleet: NormalizedFleet, a: Allocation, sat: number, need: Seconds): Blocked {
  const s = at(fleet.satellites, sat, 'satellites');
  const plan = at(a.plans, sat, 'plans');
  const when = `${fleetIso(fleet, need)}, when its predicted offset leaves ±${ns(s.norm.bound)} at ${s.norm.probability}`;
  const before = s.passes.map((p, k) => ({ p, k })).filter(({ p }) => p.start < need);
  if (before.length === 0) {
    return { code: 'too-few-passes', text: `too few passes: no pass starts before ${when}` };
  }
  const unused = before.filter(({ k }) => !a.supports.some((o) => o.sat === sat && o.pass === k));
  if (unused.length === 0) {
    return {
      code: plan.reasonCode ?? 'planner',
      text: `all ${before.length} passes before ${when} hold a support and still ${plan.reason ?? 'the tolerance is not held'}`,
    };
  }
  const busy = unused.map(({ p }) => {
    const station = at(fleet.stations, p.station, 'stations');
    const holders = a.supports
      .filter(
        (o) =>
          o.station === p.station &&
          o.sat !== sat &&
          o.end + station.setup > p.start &&
          o.start - station.setup < p.end,
      )
      .map(
        (o) => `${at(fleet.satellites, o.sat, 'satellites').id} ${fleetIso(fleet, o.start)}–${fleetIso(fleet, o.end)}`,
      );
    return `station ${station.id} overbooked ${fleetIso(fleet, p.start)}–${fleetIso(fleet, p.end)} (held by ${holders.join(', ') || 'its own other supports'})`;
  });
  return { code: 'station-overbooked', text: `no free support before ${when}: ${busy.join('; ')}` };
}

/** Priority by time-to-violation with local repair (see planFleet). */
function greedy(fleet: NormalizedFleet, planner: SatellitePlanner): Allocation {
  const n = fleet.satellites.length;
  const a: Allocation = { supports: [], plans: new Array(n), need: new Array(n), blocked: new Array(n) };
  for (let i = 0; i < n; i++) evaluate(fleet, planner, a, i);
  if (fleet.strategy.method === 'none') return a;
  for (;;) {
    let sat = -1;
    let need = Infinity;
    for (const [i, t] of a.need.entries()) {
      if (!a.blocked[i] && Number.isFinite(t) && (sat < 0 || t < need)) {
        sat = i;
        need = t;
      }
    }
    if (sat < 0) return a;
    const { reasonCode: code, reason } = at(a.plans, sat, 'plans');
    if (code === 'uncertainty' || code === 'outside-at-epoch') {
      a.blocked[sat] = { code, text: reason ?? code };
      continue;
    }
    const slot = bestSlot(fleet, sat, need, a.supports) ?? repair(fleet, planner, a, sat, need);
    if (!slot) {
      a.blocked[sat] = explain(fleet, a, sat, need);
      continue;
    }
    a.supports.push(slot);
    evaluate(fleet, planner, a, sat);
  }
}

/** The id of station `index` (a checked read: the index comes from a support or a pass). */
function stationId(fleet: NormalizedFleet, index: number): string {
  return at(fleet.stations, index, 'stations').id;
}

/** The public plan from an allocation. */
function toFleetPlan(fleet: NormalizedFleet, a: Allocation): FleetPlan {
  const satellites = fleet.satellites.map((s, i): FleetSatellitePlan => {
    const plan = at(a.plans, i, 'plans');
    const own = a.supports.filter((o) => o.sat === i);
    const commands = plan.commands.map((c): FleetCommand => {
      const t = c.uplinkAt.secondsSince(fleet.epoch);
      const support = own.find((o) => t >= o.start - 1e-3 && t <= o.end + 1e-3);
      if (!support) throw new Error(`internal: command of ${s.id} at ${fleetIso(fleet, t)} outside its supports`);
      const { reason, ...rest } = c;
      return { ...rest, station: stationId(fleet, support.station), reason };
    });
    const out: FleetSatellitePlan = {
      id: s.id,
      feasible: plan.feasible,
      commands,
      predicted: plan.predicted,
      metrics: plan.metrics,
    };
    if (s.computedPasses) {
      out.computedPasses = s.computedPasses.map(
        (p): ComputedPassReport => ({
          station: stationId(fleet, p.station),
          start: fleet.epoch.plus(p.start),
          end: fleet.epoch.plus(p.end),
          maxElevationRadians: p.maxElevation,
          maxElevationAt: fleet.epoch.plus(p.maxElevationAt),
          clippedAtStart: p.clippedAtStart,
          clippedAtEnd: p.clippedAtEnd,
          usable: p.usable,
        }),
      );
    }
    if (!plan.feasible) {
      const why = a.blocked[i];
      const detail = plan.reason ? `${plan.reason.charAt(0).toUpperCase()}${plan.reason.slice(1)}` : '';
      out.reason =
        why && why.code !== plan.reasonCode
          ? `${why.text}. ${detail}`.trim()
          : (plan.reason ?? why?.text ?? 'infeasible');
      out.reasonCode = why?.code ?? plan.reasonCode ?? 'planner';
    }
    return out;
  });
  const stationSchedule = [...a.supports]
    .sort((x, y) => x.station - y.station || x.start - y.start)
    .map(
      (o): StationSupport => ({
        station: stationId(fleet, o.station),
        satellite: at(fleet.satellites, o.sat, 'satellites').id,
        start: fleet.epoch.plus(o.start),
        end: fleet.epoch.plus(o.end),
      }),
    );
  const bad = satellites.filter((s) => !s.feasible);
  const plan: FleetPlan = {
    epoch: fleet.epoch,
    feasible: bad.length === 0,
    satellites,
    stationSchedule,
    caution: STEERING_CAUTION,
  };
  if (bad.length > 0) {
    plan.reason =
      `${bad.length} of ${satellites.length} satellites cannot be held: ` +
      bad.map((s) => `${s.id} (${s.reasonCode})`).join(', ') +
      '; the schedule holds the others as well as it can.';
  }
  return plan;
}

/** Options of planFleet. */
export type FleetPlanOptions = TimeScaleOptions;

/**
 * Plans the steering of every satellite of a fleet through the fleet's shared stations.
 *
 * Method. 1) Each satellite is first planned with no contact; its time-to-violation is the first
 * grid epoch where its per-epoch probability P(|offset| ≤ b) falls below its tolerance
 * probability (the `planSteering` rule). 2) Repeatedly, the satellite that leaves its band
 * soonest gets one support: the latest admissible position (inside one of its passes, one
 * support per pass, clear of its own supports and of every other support at that station by the
 * station's setup time) starting before that time; the satellite is then re-planned with the
 * single-satellite planner (`planSteering`, the fleet's strategy) with its supports as its only
 * contacts, which gives its new time-to-violation. 3) When no position is free, local repair takes
 * the supports of satellites already found unholdable, or moves one blocking support within its
 * own pass if that does not bring its owner's violation earlier. 4) A satellite with no pass left
 * before its violation, or whose violation no support can cure (z·σ ≥ b, outside at the epoch),
 * is marked unholdable with the reason. 5) If some satellite is still unholdable and the fleet is
 * small (the per-satellite choices of "no support / support at the start / at the end of each
 * pass" number at most 4096 in total), an exact search over those choices replaces the greedy
 * result whenever it holds every satellite.
 *
 * Guarantees. Always (by construction, and tested on random fleets): supports lie inside passes,
 * last `supportSeconds`, never overlap or come closer than `setupSeconds` at a station, a
 * satellite has at most one support at a time and per pass; every command is uplinked inside a
 * support of its satellite, at the station reported; every command obeys its satellite's actuator
 * (the single-satellite planner's guarantee); `feasible` for a satellite is exactly
 * `planSteering`'s verdict with its supports as contacts. On small fleets (step 5): if some
 * choice of supports placed at the start or end of passes holds every satellite, planFleet
 * finds the fleet feasible.
 * Not guaranteed: optimality (fewest supports, least cost), finding a feasible allocation on
 * larger fleets when one exists (the greedy is a heuristic), or supports at positions other
 * than those the greedy and the exact search try. The per-satellite verdict is the per-epoch
 * open-loop rule of `planSteering`, not a probability for the whole horizon.
 *
 * @param doc      A fleet document (see `FleetDocument` and schema/fleet.schema.json).
 * @param options  `timeScales`: the leap-second table for the UTC stamps.
 * @returns The plan (Instants for absolute times; `fleetPlanToJson` gives its JSON form); `feasible: false`
 *   names the satellites that cannot be held and why.
 * @throws {InvalidArgumentError} naming the dotted field path of any invalid field.
 * @throws {OutOfDomainError} for a stamp or horizon beyond the leap-second table.
 */
export function planFleet(doc: unknown, options: FleetPlanOptions = {}): FleetPlan {
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError('options', options, 'an object { timeScales? }');
  const fleet = validateFleet(doc, options);
  const planner = new SatellitePlanner(fleet);
  let a = greedy(fleet, planner);
  if (a.plans.some((p) => !p.feasible) && fleet.strategy.method !== 'none') {
    const exact = exactAllocation(fleet, planner);
    if (exact) {
      a = { supports: exact, plans: [], need: [], blocked: new Array(fleet.satellites.length) };
      for (let i = 0; i < fleet.satellites.length; i++) evaluate(fleet, planner, a, i);
    }
  }
  return toFleetPlan(fleet, a);
}
