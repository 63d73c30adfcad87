/**
 * Input adapter of `<tauline-fleet-timeline>`: checks the joint plan's JSON form
 * (`fleetPlanToJson(planFleet())` of `@tauline/sdk/fleet`) against the fleet document it was made for and turns both into columns in
 * seconds since the fleet epoch. Both are typed with the SDK's types (`import type`: no SDK code is
 * bundled for them) and checked by thin guards that read only the fields the element uses and name
 * the first one that is wrong (the document's in fleet-doc.ts). Pure, no DOM; never throws (problems
 * come back as text).
 *
 * @module
 */
import type {
  FleetCommandJson,
  FleetDocument,
  FleetPlanJson,
  FleetSatellitePlanJson,
  StationSupportJson,
} from '@tauline/sdk/fleet';
import type { Instant, TimeScales } from '@tauline/sdk/time';
import { at, atNumber } from '../internal/checked.js';
import {
  arr,
  bundledTimeScales,
  type FleetDoc,
  fail,
  GuardError,
  obj,
  type PassView,
  readFleetDoc,
  type Stamp,
  stampReader,
  str,
} from './fleet-doc.js';
import { marginSeries } from './fleet-margin.js';

/** A command of one satellite, times in seconds since the fleet epoch. */
export interface FleetCommandView {
  /** Position in the satellite's `commands`. */
  index: number;
  kind: 'frequency' | 'phase';
  uplinkAt: number;
  executeAt: number;
  /** Fractional frequency step (kind `frequency`) or phase step in seconds (kind `phase`). */
  step: number;
  station: string;
  reason: string;
  source: FleetCommandJson;
}

/** One satellite row. */
export interface SatelliteView {
  /** Position in `plan.satellites`. */
  index: number;
  id: string;
  feasible: boolean;
  reason: string | null;
  reasonCode: string | null;
  /** Tolerance bound b on |offset|, in seconds. */
  tolerance: number;
  /** Tolerance probability p. */
  probability: number;
  /** Two-sided normal quantile z = Φ⁻¹((1 + p)/2). */
  z: number;
  /** Grid, seconds since the epoch. */
  t: Float64Array;
  /**
   * Margin to tolerance on the grid, in seconds: b − b_p, where b_p is the smallest bound with
   * P(|offset| ≤ b_p) = p at that epoch (the planner's per-epoch criterion); negative where it fails.
   */
  margin: Float64Array;
  /** Smallest margin over the grid, seconds, and where it occurs (seconds since the epoch). */
  minMargin: number;
  minMarginAt: number;
  commands: FleetCommandView[];
  /** The satellite's passes (station index, seconds since the epoch): as given, or the plan's usable computed ones. */
  passes: PassView[];
  /** Ids of the stations that uplink its commands or hold its supports, in station order. */
  stationsUsed: string[];
  supportCount: number;
  source: FleetSatellitePlanJson;
}

/** One support of the station schedule, times in seconds since the epoch. */
export interface SupportView {
  /** Position in `plan.stationSchedule`. */
  index: number;
  station: number;
  /** Index of the satellite in `satellites`. */
  satellite: number;
  start: number;
  end: number;
  source: StationSupportJson;
}

/** One station lane. */
export interface StationView {
  id: string;
  /** Least gap between two supports, seconds (the station's `setupSeconds`). */
  setup: number;
  /** Its supports, sorted by start. */
  supports: SupportView[];
}

/** Everything the timeline draws. */
export interface FleetView {
  /** The fleet document as the guard read it (kept to skip reading it again). */
  fleet: FleetDoc;
  epoch: Instant;
  timeScales: TimeScales;
  /** Horizon length, seconds. */
  horizon: number;
  feasible: boolean;
  reason: string | null;
  caution: string | null;
  satellites: SatelliteView[];
  stations: StationView[];
}

/** The result of reading: a view, or the first problem found, naming the field. */
export type FleetReadResult = { ok: true; view: FleetView } | { ok: false; error: string };

function numbers(field: string, v: unknown, length: number): ArrayLike<number> {
  const a = v instanceof Float64Array ? v : arr(field, v);
  if (a.length !== length) fail(`${field}.length`, `${length} (the length of predicted.t)`, a.length);
  for (let i = 0; i < a.length; i++) {
    if (typeof a[i] !== 'number' || !Number.isFinite(a[i])) fail(`${field}[${i}]`, 'a finite number', a[i]);
  }
  return a as ArrayLike<number>;
}

function readCommand(field: string, raw: unknown, index: number, stamp: Stamp): FleetCommandView {
  const c = obj(field, raw);
  const kind = c.kind;
  if (kind !== 'frequency' && kind !== 'phase') fail(`${field}.kind`, '"frequency" or "phase"', kind);
  const stepKey = kind === 'phase' ? 'phaseStepSeconds' : 'fractionalFrequencyStep';
  const step = c[stepKey];
  if (typeof step !== 'number' || !Number.isFinite(step)) fail(`${field}.${stepKey}`, 'a finite number', step);
  return {
    index,
    kind,
    step,
    uplinkAt: stamp(`${field}.uplinkAt`, c.uplinkAt),
    executeAt: stamp(`${field}.executeAt`, c.executeAt),
    station: str(`${field}.station`, c.station),
    reason: typeof c.reason === 'string' ? c.reason : '',
    source: raw as FleetCommandJson,
  };
}

/** What a plan's satellite entry gives; the rest of a SatelliteView comes from the fleet document. */
type PlanKeys = 'index' | 'id' | 'feasible' | 'reason' | 'reasonCode' | 't' | 'commands' | 'source';
type PlanSatellite = Pick<SatelliteView, PlanKeys> & {
  steered: ArrayLike<number>;
  sigma: ArrayLike<number>;
};

function readSatellite(field: string, raw: unknown, index: number, stamp: Stamp): PlanSatellite {
  const s = obj(field, raw);
  const id = str(`${field}.id`, s.id);
  if (typeof s.feasible !== 'boolean') fail(`${field}.feasible`, 'true or false', s.feasible);
  const predicted = obj(`${field}.predicted`, s.predicted);
  const tRaw = predicted.t instanceof Float64Array ? predicted.t : arr(`${field}.predicted.t`, predicted.t);
  const t = Float64Array.from(numbers(`${field}.predicted.t`, tRaw, tRaw.length));
  let previous = Number.NaN;
  for (const [i, ti] of t.entries()) {
    if (i > 0 && !(ti > previous)) fail(`${field}.predicted.t[${i}]`, `greater than t[${i - 1}] (${previous})`, ti);
    previous = ti;
  }
  const steered = obj(`${field}.predicted.steered`, predicted.steered);
  const commands = arr(`${field}.commands`, s.commands).map((c, k) =>
    readCommand(`${field}.commands[${k}]`, c, k, stamp),
  );
  commands.sort((a, b) => a.executeAt - b.executeAt || a.index - b.index);
  return {
    index,
    id,
    feasible: s.feasible,
    t,
    commands,
    reason: typeof s.reason === 'string' ? s.reason : null,
    reasonCode: typeof s.reasonCode === 'string' ? s.reasonCode : null,
    steered: numbers(`${field}.predicted.steered.phaseSeconds`, steered.phaseSeconds, t.length),
    sigma: numbers(`${field}.predicted.steered.sigmaSeconds`, steered.sigmaSeconds, t.length),
    source: raw as FleetSatellitePlanJson,
  };
}

function readStations(
  plan: Record<string, unknown>,
  fleet: FleetDoc,
  ids: Map<string, number>,
  stamp: Stamp,
): StationView[] {
  const stations: StationView[] = fleet.stations.map((s) => ({ id: s.id, setup: s.setup, supports: [] }));
  arr('plan.stationSchedule', plan.stationSchedule).forEach((raw, k) => {
    const field = `plan.stationSchedule[${k}]`;
    const o = obj(field, raw);
    const stationId = str(`${field}.station`, o.station);
    const station = stations.findIndex((s) => s.id === stationId);
    const known = stations.map((q) => q.id).join(', ');
    if (station < 0) fail(`${field}.station`, `a station of the fleet (${known})`, stationId);
    const satellite = ids.get(str(`${field}.satellite`, o.satellite));
    if (satellite === undefined) fail(`${field}.satellite`, 'a satellite of the plan', o.satellite);
    const start = stamp(`${field}.start`, o.start),
      end = stamp(`${field}.end`, o.end);
    if (!(end > start)) fail(`${field}.end`, `after its start (${String(o.start)})`, o.end);
    at(stations, station, 'stations').supports.push({
      index: k,
      station,
      satellite,
      start,
      end,
      source: raw as StationSupportJson,
    });
  });
  for (const s of stations) s.supports.sort((a, b) => a.start - b.start);
  return stations;
}

/** The usable passes the planner computed from a satellite's orbit (`computedPasses` of its plan entry). */
function computedPasses(field: string, raw: unknown, fleet: FleetDoc, stamp: Stamp): PassView[] {
  const list = arr(`${field}.computedPasses`, obj(field, raw).computedPasses);
  const passes: PassView[] = [];
  for (const [j, q] of list.entries()) {
    const o = obj(`${field}.computedPasses[${j}]`, q);
    if (o.usable === false) continue;
    const id = str(`${field}.computedPasses[${j}].station`, o.station);
    const station = fleet.stations.findIndex((x) => x.id === id);
    if (station < 0) fail(`${field}.computedPasses[${j}].station`, 'a station of the fleet', id);
    passes.push({
      station,
      start: stamp(`${field}.computedPasses[${j}].start`, o.start),
      end: stamp(`${field}.computedPasses[${j}].end`, o.end),
    });
  }
  return passes.sort((a, b) => a.start - b.start || a.station - b.station);
}

function readUnchecked(plan: unknown, fleetDoc: unknown, kept: FleetDoc | undefined, scales: TimeScales): FleetView {
  const p = obj('plan', plan);
  const same = kept && kept.source === fleetDoc && kept.timeScales === scales;
  const fleet = same ? kept : readFleetDoc(fleetDoc, scales);
  const { timeScales, epoch } = fleet;
  const stamp = stampReader(timeScales, epoch);
  if (typeof p.feasible !== 'boolean') fail('plan.feasible', 'true or false', p.feasible);
  // Plans printed before the JSON named its epoch have none; the fleet document's then stands alone.
  if (p.epoch !== undefined && stamp('plan.epoch', p.epoch) !== 0)
    fail(
      'plan.epoch',
      `fleet.epoch ${JSON.stringify((fleet.source as { epoch?: unknown }).epoch)} (the plan was made for another fleet)`,
      p.epoch,
    );
  const raw = arr('plan.satellites', p.satellites).map((s, i) => readSatellite(`plan.satellites[${i}]`, s, i, stamp));
  const count = fleet.satellites.length;
  if (raw.length !== count) fail('plan.satellites.length', `${count} (the satellites of the fleet)`, raw.length);
  const ids = new Map<string, number>();
  const satellites = raw.map(({ steered, sigma, ...s }, i): SatelliteView => {
    const doc = at(fleet.satellites, i, 'fleet.satellites');
    if (doc.id !== s.id) fail(`plan.satellites[${i}].id`, `"${doc.id}" (satellites[${i}] of the fleet)`, s.id);
    ids.set(s.id, i);
    const margin = marginSeries(steered, sigma, doc.bound, doc.probability, doc.z);
    let minMargin = Infinity,
      minMarginAt = Number.NaN;
    for (const [k, m] of margin.entries())
      if (m < minMargin) {
        minMargin = m;
        minMarginAt = atNumber(s.t, k, `plan.satellites[${i}].predicted.t`);
      }
    return {
      ...s,
      tolerance: doc.bound,
      probability: doc.probability,
      z: doc.z,
      margin,
      minMargin,
      minMarginAt,
      passes: doc.passes ?? computedPasses(`plan.satellites[${i}]`, s.source, fleet, stamp),
      stationsUsed: [],
      supportCount: 0,
    };
  });
  const stations = readStations(p, fleet, ids, stamp);
  for (const st of stations) {
    for (const sup of st.supports) {
      const sat = at(satellites, sup.satellite, 'satellites');
      sat.supportCount += 1;
      if (!sat.stationsUsed.includes(st.id)) sat.stationsUsed.push(st.id);
    }
  }
  const order = new Map(stations.map((s, k) => [s.id, k]));
  for (const sat of satellites) sat.stationsUsed.sort((a, b) => (order.get(a) ?? 0) - (order.get(b) ?? 0));
  return {
    fleet,
    epoch,
    timeScales,
    horizon: fleet.horizon,
    feasible: p.feasible,
    satellites,
    stations,
    reason: typeof p.reason === 'string' ? p.reason : null,
    caution: typeof p.caution === 'string' ? p.caution : null,
  };
}

/**
 * Reads a fleet plan and its fleet document. Returns the view, or the first problem found: the
 * field path (`plan.satellites[2].predicted.t`, `fleet.satellites[1].tolerance.phaseSeconds`)
 * and what it must be. `kept`, the `view.fleet` of an earlier read of this same document (the element
 * keeps it while only the plan changes), saves reading it again. Every stamp is read on `timeScales` (default:
 * the SDK's bundled table, as the planner's default).
 */
export function readFleetPlan(
  plan: FleetPlanJson | unknown,
  fleet: FleetDocument | unknown,
  kept?: FleetDoc,
  timeScales: TimeScales = bundledTimeScales(),
): FleetReadResult {
  if (fleet === undefined || fleet === null) {
    const error =
      'fleet is not set: give the fleet document the plan was made for ' + '(epoch, tolerances, stations, passes)';
    return { ok: false, error };
  }
  try {
    return { ok: true, view: readUnchecked(plan, fleet, kept, timeScales) };
  } catch (e) {
    if (e instanceof GuardError) return { ok: false, error: e.message };
    return { ok: false, error: `cannot read the plan: ${e instanceof Error ? e.message : String(e)}` };
  }
}

/** Whether a satellite is at risk: not feasible, or its smallest margin below `riskFraction` × its tolerance. */
export function isAtRisk(
  s: Pick<SatelliteView, 'feasible' | 'minMargin' | 'tolerance'>,
  riskFraction: number,
): boolean {
  return !s.feasible || s.minMargin < riskFraction * s.tolerance;
}
