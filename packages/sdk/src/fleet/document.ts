/**
 * The fleet document (our own format; JSON Schema in `schema/fleet.schema.json`) and its
 * validation. A fleet is several satellite clocks steered through shared ground stations: each
 * satellite carries what a steering scenario carries except the epoch, horizon and contacts, and
 * its `passes` say when each station sees it. `validateFleet` checks every field once and throws
 * an {@link InvalidArgumentError} whose `argument` is the dotted field path
 * (e.g. `satellites[1].passes[0].end`).
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requireNonNegative, requirePositive, requireRecord } from '../internal/validate.js';
import {
  type ActuatorSpec,
  type ClockSpec,
  type CostWeights,
  type ManeuverSpec,
  type NormalizedScenario,
  rejectUnknownKeys,
  type SteeringScenario,
  type StrategySpec,
  type ToleranceSpec,
  validateScenario,
} from '../steering/scenario.js';
import { parseUtcStamp, resolveTimeScales, type TimeScaleOptions } from '../steering/utc-stamps.js';
import type { Instant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import type { Seconds } from '../units.js';
import {
  computeFleetPasses,
  type FleetOrbit,
  type FleetStationPosition,
  type NormalizedComputedPass,
  type StationSite,
  validateFleetOrbit,
  validateStationSite,
} from './computed-passes.js';

/** A ground station shared by the fleet. */
export interface FleetStation {
  /** Identifier, unique in the fleet. */
  id: string;
  /** Least time between the end of one support and the start of the next at this station, in seconds (≥ 0). */
  setupSeconds: Seconds;
  /** Duration of one support (one satellite served), in seconds (> 0). */
  supportSeconds: Seconds;
  /** Geodetic position on WGS 84; needed (with `elevationMaskRadians`) when some satellite gives an `orbit`. */
  position?: FleetStationPosition;
  /** Lowest usable elevation for computed passes, in radians, in [0, π/2); given with `position`. */
  elevationMaskRadians?: number;
}

/** When a station sees a satellite (ISO 8601 UTC stamps with a zone). */
export interface FleetPass {
  /** Id of one of the fleet's stations. */
  station: string;
  start: string;
  end: string;
}

/** One satellite of a fleet: a steering scenario without epoch, horizon, contacts and strategy, plus its passes. */
export interface FleetSatellite {
  /** Identifier, unique in the fleet. */
  id: string;
  name?: string;
  clock: ClockSpec;
  tolerance: ToleranceSpec;
  actuator: ActuatorSpec;
  maneuvers?: ManeuverSpec[];
  costWeights?: CostWeights;
  /** Constant-set name for the manoeuvre rate changes (default `iers-2010`). */
  constants?: string;
  /** When each station sees the satellite; give either `passes` or `orbit`, not both. */
  passes?: FleetPass[];
  /** Mean orbital elements from which the passes over every station are computed (instead of `passes`). */
  orbit?: FleetOrbit;
}

/** A fleet document as written in a fleet file. */
export interface FleetDocument {
  name?: string;
  description?: string;
  /** Epoch of every clock state and start of the horizon (ISO 8601 UTC). */
  epoch: string;
  horizonSeconds: Seconds;
  /** Spacing of the prediction grid, in seconds; default 900 (or the horizon if shorter). */
  gridSeconds?: Seconds;
  stations: FleetStation[];
  satellites: FleetSatellite[];
  /** The single-satellite planner used for every satellite. */
  strategy: StrategySpec;
}

/** A validated pass: station index and times in seconds since the epoch. */
export interface NormalizedPass {
  /** Index into `stations`. */
  station: number;
  start: Seconds;
  end: Seconds;
  /** Index of the pass in the satellite's `passes` array as written. */
  index: number;
}

/** A validated satellite: its single-satellite scenario (contacts empty) and its passes sorted by start. */
export interface NormalizedFleetSatellite {
  id: string;
  /** The satellite as a steering scenario with the fleet's epoch, horizon, grid and strategy and no contacts. */
  scenario: SteeringScenario;
  /** `scenario` validated. */
  norm: NormalizedScenario;
  /** The passes planned with: as given, or the usable computed ones. */
  passes: NormalizedPass[];
  /** Every pass computed from the satellite's `orbit` (usable or not); absent when the passes were given. */
  computedPasses?: NormalizedComputedPass[];
}

/** The fleet after validation: times in seconds since the epoch. */
export interface NormalizedFleet {
  source: FleetDocument;
  epoch: Instant;
  timeScales: TimeScales;
  horizon: Seconds;
  grid: Seconds;
  stations: { id: string; setup: Seconds; support: Seconds }[];
  satellites: NormalizedFleetSatellite[];
  strategy: StrategySpec;
}

function requireNonEmptyArray(field: string, value: unknown, what: string): unknown[] {
  if (!Array.isArray(value) || value.length === 0)
    throw new InvalidArgumentError(field, value, `a non-empty array of ${what}`);
  return value;
}

function requireId(field: string, value: unknown, seen: Set<string>, what: string): string {
  if (typeof value !== 'string' || value.length === 0)
    throw new InvalidArgumentError(field, value, 'a non-empty string');
  if (seen.has(value)) throw new InvalidArgumentError(field, value, `an id used by no other ${what}`);
  seen.add(value);
  return value;
}

const SATELLITE_FIELDS = [
  'id',
  'name',
  'clock',
  'tolerance',
  'actuator',
  'maneuvers',
  'costWeights',
  'constants',
  'passes',
  'orbit',
] as const;

/** Validates one satellite as a scenario (errors re-thrown with the `satellites[i].` prefix). */
function validateSatelliteScenario(
  root: Record<string, unknown>,
  sat: Record<string, unknown>,
  i: number,
  options: TimeScaleOptions,
): { scenario: SteeringScenario; norm: NormalizedScenario } {
  const scenario: Record<string, unknown> = {
    epoch: root.epoch,
    horizonSeconds: root.horizonSeconds,
    contacts: [],
    strategy: root.strategy,
  };
  if (root.gridSeconds !== undefined) scenario.gridSeconds = root.gridSeconds;
  for (const key of ['name', 'clock', 'tolerance', 'actuator', 'maneuvers', 'costWeights', 'constants'] as const) {
    if (sat[key] !== undefined || key === 'clock' || key === 'tolerance' || key === 'actuator')
      scenario[key] = sat[key];
  }
  try {
    return { scenario: scenario as unknown as SteeringScenario, norm: validateScenario(scenario, options) };
  } catch (e) {
    // Fleet-level fields (epoch, horizon, grid, strategy) keep their own path; satellite fields get the satellite's.
    if (!(e instanceof InvalidArgumentError) || /^(epoch|horizonSeconds|gridSeconds|strategy)\b/.test(e.argument))
      throw e;
    throw new InvalidArgumentError(`satellites[${i}].${e.argument}`, e.received, e.expected, e.hint);
  }
}

/** Validates a satellite's given `passes` (field paths `satellites[i].passes[j].<key>`). */
function validateGivenPasses(
  rawPasses: unknown,
  i: number,
  stations: readonly { id: string; support: Seconds }[],
  timeScales: TimeScales,
  epoch: Instant,
  epochText: string,
  horizon: Seconds,
): NormalizedPass[] {
  if (!Array.isArray(rawPasses)) {
    throw new InvalidArgumentError(
      `satellites[${i}].passes`,
      rawPasses,
      'an array of passes (or an orbit to compute them from)',
    );
  }
  return rawPasses.map((p, j): NormalizedPass => {
    const field = `satellites[${i}].passes[${j}]`;
    const o = requireRecord(field, p);
    rejectUnknownKeys(field, o, ['station', 'start', 'end']);
    const station = stations.findIndex((s) => s.id === o.station);
    const stationEntry = stations[station];
    if (stationEntry === undefined)
      throw new InvalidArgumentError(
        `${field}.station`,
        o.station,
        `one of the station ids ${stations.map((s) => s.id).join(', ')}`,
      );
    const start = parseUtcStamp(timeScales, `${field}.start`, o.start).secondsSince(epoch);
    const end = parseUtcStamp(timeScales, `${field}.end`, o.end).secondsSince(epoch);
    if (start < 0) throw new InvalidArgumentError(`${field}.start`, o.start, `at or after the epoch ${epochText}`);
    if (!(end > start))
      throw new InvalidArgumentError(`${field}.end`, o.end, `after ${field}.start (${String(o.start)})`);
    if (end > horizon)
      throw new InvalidArgumentError(
        `${field}.end`,
        o.end,
        `at or before the end of the horizon (epoch + ${horizon} s)`,
      );
    const support = stationEntry.support;
    if (end - start < support) {
      throw new InvalidArgumentError(
        `${field}.end`,
        o.end,
        `at least stations[${station}].supportSeconds (${support} s) after ${field}.start: a shorter pass cannot hold a support`,
      );
    }
    return { station, start, end, index: j };
  });
}

/**
 * Validates a fleet document and returns its normalised form.
 *
 * Checks: everything `validateScenario` checks for each satellite (epoch, horizon, grid and
 * strategy are the fleet's; errors name `satellites[i].<field>`); at least one station and one
 * satellite, ids non-empty and unique; `setupSeconds` ≥ 0 and `supportSeconds` > 0; every pass
 * names a known station, has start < end, lies inside [epoch, epoch + horizon] and is at least
 * its station's `supportSeconds` long (a shorter pass could never hold a support, and is
 * reported rather than silently unused). Passes may be written in any order.
 *
 * Computed passes: a satellite may give `orbit` (mean elements at their epoch) instead of `passes`
 * (giving both is refused). Its passes over every station are then predicted over the horizon with
 * `predictPasses` (secular J2, UT1 = UTC; see orbit/visibility.ts for the accuracy), which needs
 * every station's `position` and `elevationMaskRadians`. Computed passes are rounded inwards to the
 * millisecond; those shorter than their station's `supportSeconds` are kept in `computedPasses`
 * with `usable: false` and not planned with.
 *
 * @param input    The parsed fleet file (unknown JSON).
 * @param options  `timeScales`: the time scales (leap-second table) for the UTC stamps.
 * @throws {InvalidArgumentError} naming the dotted field path, the value and the expected range.
 * @throws {OutOfDomainError} for a stamp or horizon end outside the leap-second table.
 */
export function validateFleet(input: unknown, options: TimeScaleOptions = {}): NormalizedFleet {
  const timeScales = resolveTimeScales(options);
  const root = requireRecord('fleet', input);
  rejectUnknownKeys('', root, [
    '$schema',
    'name',
    'description',
    'epoch',
    'horizonSeconds',
    'gridSeconds',
    'stations',
    'satellites',
    'strategy',
  ]);
  for (const key of ['$schema', 'name', 'description'] as const) {
    if (root[key] !== undefined && typeof root[key] !== 'string')
      throw new InvalidArgumentError(key, root[key], 'a string');
  }
  const epoch = parseUtcStamp(timeScales, 'epoch', root.epoch);
  const stationIds = new Set<string>();
  const stations = requireNonEmptyArray('stations', root.stations, 'stations').map((value, k) => {
    const s = requireRecord(`stations[${k}]`, value);
    rejectUnknownKeys(`stations[${k}]`, s, [
      'id',
      'setupSeconds',
      'supportSeconds',
      'position',
      'elevationMaskRadians',
    ]);
    return {
      id: requireId(`stations[${k}].id`, s.id, stationIds, 'station'),
      setup: requireNonNegative(`stations[${k}].setupSeconds`, s.setupSeconds, 's'),
      support: requirePositive(`stations[${k}].supportSeconds`, s.supportSeconds, 's'),
      site: validateStationSite(`stations[${k}]`, s),
    };
  });
  const satIds = new Set<string>();
  const rawSats = requireNonEmptyArray('satellites', root.satellites, 'satellites');
  const satellites = rawSats.map((value, i): NormalizedFleetSatellite => {
    const sat = requireRecord(`satellites[${i}]`, value);
    rejectUnknownKeys(`satellites[${i}]`, sat, SATELLITE_FIELDS);
    const id = requireId(`satellites[${i}].id`, sat.id, satIds, 'satellite');
    const { scenario, norm } = validateSatelliteScenario(root, sat, i, options);
    if (sat.orbit !== undefined) {
      if (sat.passes !== undefined) {
        throw new InvalidArgumentError(
          `satellites[${i}].passes`,
          sat.passes,
          'absent when the satellite gives an orbit (passes are either given or computed, not both)',
        );
      }
      const orbit = validateFleetOrbit(`satellites[${i}].orbit`, sat.orbit, timeScales, epoch, norm.horizon);
      const sites = stations.map((s, k): StationSite => {
        if (!s.site) {
          throw new InvalidArgumentError(
            `stations[${k}].position`,
            undefined,
            `a position and elevationMaskRadians: satellites[${i}] (${id}) gives an orbit, so its passes over every station ` +
              'are computed',
          );
        }
        return s.site;
      });
      const computed = computeFleetPasses(
        orbit,
        sites,
        stations.map((s) => s.support),
        epoch,
        norm.horizon,
        timeScales,
      );
      const passes = computed
        .filter((p) => p.usable)
        .map((p, index): NormalizedPass => ({ station: p.station, start: p.start, end: p.end, index }));
      return { id, scenario, norm, passes, computedPasses: computed };
    }
    const passes = validateGivenPasses(sat.passes, i, stations, timeScales, epoch, String(root.epoch), norm.horizon);
    passes.sort((a, b) => a.start - b.start || a.station - b.station || a.index - b.index);
    return { id, scenario, norm, passes };
  });
  const first = at(satellites, 0, 'satellites').norm;
  return {
    source: input as FleetDocument,
    epoch,
    timeScales,
    horizon: first.horizon,
    grid: first.grid,
    stations: stations.map(({ id, setup, support }) => ({ id, setup, support })),
    satellites,
    strategy: first.strategy,
  };
}
