/**
 * Thin run-time guard of the fleet document for `<tauline-fleet-timeline>`: the document is typed
 * with the SDK's `FleetDocument` (`import type`, so no SDK validation code is bundled), and this
 * guard checks only the fields the element reads (epoch, horizon, station ids and setup times,
 * satellite ids, tolerances, given passes), stopping at the first wrong one and naming it. Fields the
 * element does not read (clock, actuator, strategy, orbit elements) are the planner's business:
 * `planFleet` validated them when it made the plan. Pure, no DOM; throws only {@link GuardError}.
 *
 * @module
 */
import type { FleetDocument } from '@tauline/sdk/fleet';
import { BUNDLED_LEAP_SECONDS, createTimeScales, type Instant, type TimeScales } from '@tauline/sdk/time';
import { twoSidedQuantile } from '../internal/normal.js';

/** The first wrong field, as a sentence (`<path> must be <expected>; received <value>`). */
export class GuardError extends Error {}

/** Throws a {@link GuardError} naming the field, what it must be and the value received. */
export function fail(field: string, expected: string, value: unknown): never {
  let shown: string;
  try {
    shown = value === undefined ? 'undefined' : (JSON.stringify(value) ?? String(value));
  } catch {
    shown = String(value);
  }
  if (shown.length > 60) shown = `${shown.slice(0, 57)}…`;
  throw new GuardError(`${field} must be ${expected}; received ${shown}`);
}

export function obj(field: string, v: unknown): Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) fail(field, 'an object', v);
  return v as Record<string, unknown>;
}

export function arr(field: string, v: unknown): readonly unknown[] {
  if (!Array.isArray(v)) fail(field, 'an array', v);
  return v;
}

export function str(field: string, v: unknown): string {
  if (typeof v !== 'string') fail(field, 'a string', v);
  return v;
}

function positive(field: string, v: unknown): number {
  if (typeof v !== 'number' || !(v > 0) || !Number.isFinite(v)) fail(field, 'a finite number > 0', v);
  return v;
}

/** Reads an ISO 8601 UTC stamp as seconds since `epoch`. */
export type Stamp = (field: string, text: unknown) => number;

let bundled: TimeScales | undefined;

/** The SDK's bundled leap-second table as time scales (made once): the planner's default. */
export function bundledTimeScales(): TimeScales {
  return (bundled ??= createTimeScales(BUNDLED_LEAP_SECONDS));
}

/** A reader of ISO 8601 UTC stamps as seconds since `epoch`, on `timeScales`. */
export function stampReader(timeScales: TimeScales, epoch: Instant): Stamp {
  return (field, text) => {
    if (typeof text !== 'string') fail(field, 'an ISO 8601 UTC stamp', text);
    try {
      return timeScales.parseIso(text, 'UTC').secondsSince(epoch);
    } catch (e) {
      return unplaced(field, e, 'an ISO 8601 UTC stamp with a zone, e.g. 2027-02-01T06:00:00Z', text);
    }
  };
}

/**
 * The {@link GuardError} of a stamp the time scales refused: outside their leap-second table (the SDK's
 * `OutOfDomainError`, whose text names the table's span) or not ISO 8601 (`expected`).
 */
function unplaced(field: string, e: unknown, expected: string, text: unknown): never {
  if (e instanceof GuardError) throw e;
  if (e instanceof Error && e.name === 'OutOfDomainError')
    fail(field, `inside the leap-second table of the element's timeScales (${e.message})`, text);
  return fail(field, expected, text);
}

/** A pass, station index and times in seconds since the epoch. */
export interface PassView {
  station: number;
  start: number;
  end: number;
}

/** One satellite of the document as the element reads it. */
export interface FleetDocSatellite {
  id: string;
  /** Tolerance bound b on |offset|, in seconds. */
  bound: number;
  /** Tolerance probability p. */
  probability: number;
  /** Two-sided normal quantile z = Φ⁻¹((1 + p)/2). */
  z: number;
  /** Its given passes sorted by start, or null when they are computed from its orbit (read from the plan). */
  passes: PassView[] | null;
}

/** The fleet document as the element reads it: times in seconds since the epoch. */
export interface FleetDoc {
  /** The document read (kept to skip reading it again while only the plan changes). */
  source: unknown;
  epoch: Instant;
  timeScales: TimeScales;
  /** Horizon length, seconds. */
  horizon: number;
  stations: Array<{ id: string; setup: number }>;
  satellites: FleetDocSatellite[];
}

function readPasses(field: string, raw: unknown, stations: FleetDoc['stations'], stamp: Stamp): PassView[] {
  const passes = arr(field, raw).map((p, j): PassView => {
    const o = obj(`${field}[${j}]`, p);
    const id = str(`${field}[${j}].station`, o.station);
    const station = stations.findIndex((s) => s.id === id);
    if (station < 0)
      fail(`${field}[${j}].station`, `one of the station ids ${stations.map((s) => s.id).join(', ')}`, id);
    const start = stamp(`${field}[${j}].start`, o.start);
    const end = stamp(`${field}[${j}].end`, o.end);
    if (!(end > start)) fail(`${field}[${j}].end`, `after its start (${String(o.start)})`, o.end);
    return { station, start, end };
  });
  return passes.sort((a, b) => a.start - b.start || a.station - b.station);
}

function readSatellite(field: string, raw: unknown, stations: FleetDoc['stations'], stamp: Stamp): FleetDocSatellite {
  const s = obj(field, raw);
  const id = str(`${field}.id`, s.id);
  const tol = obj(`${field}.tolerance`, s.tolerance);
  const bound = positive(`${field}.tolerance.phaseSeconds`, tol.phaseSeconds);
  const probability = tol.probability;
  if (typeof probability !== 'number' || !(probability > 0 && probability < 1))
    fail(`${field}.tolerance.probability`, 'a number in (0, 1)', probability);
  const computed = s.passes === undefined && s.orbit !== undefined;
  const passes = computed ? null : readPasses(`${field}.passes`, s.passes, stations, stamp);
  return { id, bound, probability, z: twoSidedQuantile(probability), passes };
}

/**
 * Reads the fields of a fleet document that the element uses, every stamp on `timeScales` (default: the SDK's
 * bundled table); throws a {@link GuardError} naming the first wrong one (`fleet.satellites[0].tolerance.phaseSeconds
 * must be …`; a stamp after the table's end is refused like any unreadable stamp).
 */
export function readFleetDoc(doc: FleetDocument | unknown, timeScales: TimeScales = bundledTimeScales()): FleetDoc {
  const root = obj('fleet', doc);
  let epoch: Instant;
  try {
    epoch = timeScales.parseIso(str('fleet.epoch', root.epoch), 'UTC');
  } catch (e) {
    return unplaced('fleet.epoch', e, 'an ISO 8601 UTC stamp with a zone, e.g. 2027-02-01T00:00:00Z', root.epoch);
  }
  const horizon = positive('fleet.horizonSeconds', root.horizonSeconds);
  const stations = arr('fleet.stations', root.stations).map((raw, k) => {
    const o = obj(`fleet.stations[${k}]`, raw);
    const setup = o.setupSeconds;
    if (typeof setup !== 'number' || !(setup >= 0) || !Number.isFinite(setup))
      fail(`fleet.stations[${k}].setupSeconds`, 'a finite number ≥ 0', setup);
    return { id: str(`fleet.stations[${k}].id`, o.id), setup };
  });
  const stamp = stampReader(timeScales, epoch);
  const satellites = arr('fleet.satellites', root.satellites).map((raw, i) =>
    readSatellite(`fleet.satellites[${i}]`, raw, stations, stamp),
  );
  return { source: doc, epoch, timeScales, horizon, stations, satellites };
}
