/**
 * The JSON form of a fleet plan: every {@link Instant} printed as ISO 8601 UTC text (to the
 * millisecond, `:60` inside a leap second), the fleet epoch among them as `epoch`. It is the `tauline fleet --json`
 * output and what the fleet timeline element takes; its field names and order are a contract.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { requireArray, requireFinite, requireRecord } from '../internal/validate.js';
import {
  commandToJson,
  type JsonWriter,
  jsonWriter,
  metricsToJson,
  predictedToJson,
  type SteeringCommandJson,
  type SteeringPlanJson,
  text,
  verdictOf,
} from '../steering/plan-json.js';
import type { TimeScaleOptions } from '../steering/utc-stamps.js';
import type { ComputedPassReport, FleetInfeasibilityCode, FleetPlan, StationSupport } from './plan.js';

/** A fleet command in JSON: a {@link SteeringCommandJson} with the uplinking station before its reason. */
export interface FleetCommandJson extends SteeringCommandJson {
  /** Id of the station that uplinks the command. */
  station: string;
}

/** A computed pass in JSON: as {@link ComputedPassReport}, its instants ISO 8601 UTC text. */
export interface ComputedPassReportJson extends Omit<ComputedPassReport, 'start' | 'end' | 'maxElevationAt'> {
  start: string;
  end: string;
  maxElevationAt: string;
}

/** One satellite's plan in JSON (fields in this order). */
export interface FleetSatellitePlanJson {
  id: string;
  feasible: boolean;
  commands: FleetCommandJson[];
  predicted: SteeringPlanJson['predicted'];
  metrics: SteeringPlanJson['metrics'];
  computedPasses?: ComputedPassReportJson[];
  reason?: string;
  reasonCode?: FleetInfeasibilityCode;
}

/** A support in JSON: as {@link StationSupport}, start and end ISO 8601 UTC text. */
export interface StationSupportJson extends Omit<StationSupport, 'start' | 'end'> {
  start: string;
  end: string;
}

/** A fleet plan in JSON (fields in this order): as {@link FleetPlan}, `epoch` as ISO 8601 UTC text. */
export interface FleetPlanJson {
  feasible: boolean;
  /** The fleet epoch, ISO 8601 UTC: each satellite's `predicted.t` and `settledAfterSeconds` count from it. */
  epoch: string;
  satellites: FleetSatellitePlanJson[];
  stationSchedule: StationSupportJson[];
  caution: string;
  reason?: string;
}

function passToJson(w: JsonWriter, field: string, value: unknown): ComputedPassReportJson {
  const p = requireRecord(field, value);
  const flag = (name: string): boolean => {
    const v = p[name];
    if (typeof v !== 'boolean') throw new InvalidArgumentError(`${field}.${name}`, v, 'true or false');
    return v;
  };
  return {
    station: text(`${field}.station`, p.station),
    start: w.stamp(`${field}.start`, p.start),
    end: w.stamp(`${field}.end`, p.end),
    maxElevationRadians: requireFinite(`${field}.maxElevationRadians`, p.maxElevationRadians),
    maxElevationAt: w.stamp(`${field}.maxElevationAt`, p.maxElevationAt),
    clippedAtStart: flag('clippedAtStart'),
    clippedAtEnd: flag('clippedAtEnd'),
    usable: flag('usable'),
  };
}

function fleetCommandToJson(w: JsonWriter, field: string, value: unknown): FleetCommandJson {
  const { reason, ...rest } = commandToJson(w, field, value);
  return { ...rest, station: text(`${field}.station`, requireRecord(field, value).station), reason };
}

function satelliteToJson(w: JsonWriter, field: string, value: unknown): FleetSatellitePlanJson {
  const s = requireRecord(field, value);
  const id = text(`${field}.id`, s.id);
  const { feasible, reason } = verdictOf(field, s);
  const passes = s.computedPasses;
  return {
    id,
    feasible,
    commands: requireArray(`${field}.commands`, s.commands).map((c, i) =>
      fleetCommandToJson(w, `${field}.commands[${i}]`, c),
    ),
    predicted: predictedToJson(`${field}.predicted`, s.predicted),
    metrics: metricsToJson(`${field}.metrics`, s.metrics),
    ...(passes !== undefined
      ? {
          computedPasses: requireArray(`${field}.computedPasses`, passes).map((p, i) =>
            passToJson(w, `${field}.computedPasses[${i}]`, p),
          ),
        }
      : {}),
    ...(reason !== undefined ? { reason } : {}),
    ...(s.reasonCode !== undefined
      ? { reasonCode: text(`${field}.reasonCode`, s.reasonCode) as FleetInfeasibilityCode }
      : {}),
  };
}

function supportToJson(w: JsonWriter, field: string, value: unknown): StationSupportJson {
  const x = requireRecord(field, value);
  return {
    station: text(`${field}.station`, x.station),
    satellite: text(`${field}.satellite`, x.satellite),
    start: w.stamp(`${field}.start`, x.start),
    end: w.stamp(`${field}.end`, x.end),
  };
}

/**
 * The JSON form of a fleet plan: every Instant as ISO 8601 UTC text through the time module,
 * the epoch included, fields in the contract's order. Every field is checked on the way (a plan from the
 * SDK always passes).
 *
 * @param plan     A plan from `planFleet`.
 * @param options  `timeScales`: the leap-second table the plan was made with (default: bundled,
 *   valid until 2027-06-28).
 * @throws {InvalidArgumentError} naming the field (e.g. `plan.stationSchedule[3].start`) of a damaged plan, or a bad `options.timeScales`.
 * @throws {OutOfDomainError} for an instant outside the table.
 */
export function fleetPlanToJson(plan: FleetPlan, options: TimeScaleOptions = {}): FleetPlanJson {
  const w = jsonWriter(options);
  const p = requireRecord('plan', plan);
  const { feasible, reason } = verdictOf('plan', p);
  return {
    feasible,
    epoch: w.stamp('plan.epoch', p.epoch),
    satellites: requireArray('plan.satellites', p.satellites).map((s, i) =>
      satelliteToJson(w, `plan.satellites[${i}]`, s),
    ),
    stationSchedule: requireArray('plan.stationSchedule', p.stationSchedule).map((x, i) =>
      supportToJson(w, `plan.stationSchedule[${i}]`, x),
    ),
    caution: text('plan.caution', p.caution),
    ...(reason !== undefined ? { reason } : {}),
  };
}
