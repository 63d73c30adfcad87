/**
 * `tauline fleet <fleet.json>`: one steering plan for several satellite clocks that share a few
 * ground stations.
 */
import { type FleetDocument, type FleetPlan, type FleetPlanJson, fleetPlanToJson, planFleet } from '@tauline/sdk/fleet';
import { readJsonFile } from '../files.js';
import { LEAP_SECONDS_FLAG, LEAP_SECONDS_HELP, leapSecondsFlag } from '../flags.js';
import {
  type Command,
  EXIT_FINDING,
  EXIT_OK,
  formatFlag,
  formatFlags,
  onePositional,
  TABLE_OR_JSON,
  table,
  toJson,
} from '../framework.js';
import { fitTable, outputWidth, wrapLines } from '../layout.js';
import { nsText, PLAN_UNITS } from '../steering-output.js';

/** Units of the fleet plan's JSON fields (`units` in `tauline fleet --json`). */
export const FLEET_UNITS = {
  ...PLAN_UNITS,
  start: 'ISO 8601 UTC',
  end: 'ISO 8601 UTC',
  maxElevationRadians: 'rad',
  maxElevationAt: 'ISO 8601 UTC',
} as const;

/** Characters of a station lane in the text timeline. */
const LANE_WIDTH = 84;

/** Marker of satellite i in the timeline: A–Z, then a–z, then digits. */
function marker(i: number): string {
  const all = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';
  return all.charAt(i % all.length);
}

/**
 * One lane per station: each character covers horizon/LANE_WIDTH; a satellite's marker where it holds the station, `*` for two in one cell.
 * Cells count elapsed SI seconds since `plan.epoch` (Instant differences), so a support starting or ending in a
 * leap second (23:59:60 UTC) is drawn where it falls.
 */
export function stationLanes(doc: FleetDocument, plan: FleetPlan): string[] {
  const cell = doc.horizonSeconds / LANE_WIDTH;
  const index = new Map(doc.satellites.map((s, i) => [s.id, i]));
  const days = doc.horizonSeconds / 86_400;
  const ruler = Array.from({ length: LANE_WIDTH }, (_, k) =>
    Math.floor((k * cell) / 86_400) !== Math.floor(((k - 1) * cell) / 86_400) || k === 0 ? '|' : ' ',
  ).join('');
  const width = Math.max(...doc.stations.map((s) => s.id.length));
  const out = [
    `Station timeline (one character ≈ ${(cell / 3600).toFixed(2)} h, '|' marks each day from the epoch, ${days.toFixed(2)} days):`,
    `${' '.repeat(width)}  ${ruler}`.trimEnd(),
  ];
  for (const station of doc.stations) {
    const lane = Array.from({ length: LANE_WIDTH }, () => '·');
    for (const s of plan.stationSchedule.filter((x) => x.station === station.id)) {
      const satellite = index.get(s.satellite);
      if (satellite === undefined) throw new Error(`internal: support for ${s.satellite}, not in the document`);
      const from = Math.floor(s.start.secondsSince(plan.epoch) / cell);
      // The end is exclusive: a support ending on a cell boundary does not mark the next cell (1 ms before it).
      const to = Math.min(LANE_WIDTH - 1, Math.floor((s.end.secondsSince(plan.epoch) - 0.001) / cell));
      for (let k = Math.max(0, from); k <= Math.max(from, to); k++) lane[k] = lane[k] === '·' ? marker(satellite) : '*';
    }
    out.push(`${station.id.padEnd(width)}  ${lane.join('')}`);
  }
  out.push(
    `Legend: ${doc.satellites.map((s, i) => `${marker(i)} ${s.id}`).join(', ')}; · free; * several supports in one character.`,
  );
  return out;
}

/** Pass counts per satellite and station: usable passes, "+n short" for computed passes too short for a support. */
function passCounts(doc: FleetDocument, plan: FleetPlanJson, width: number | undefined): string[] {
  const rows = zipSatellites(doc, plan).map(([sat, s]) => {
    const cells = doc.stations.map((st) => {
      if (!s.computedPasses) return String((sat.passes ?? []).filter((p) => p.station === st.id).length);
      const here = s.computedPasses.filter((p) => p.station === st.id);
      const short = here.filter((p) => !p.usable).length;
      return `${here.length - short}${short > 0 ? ` +${short} short` : ''}`;
    });
    const top =
      s.computedPasses && s.computedPasses.length > 0
        ? `${((Math.max(...s.computedPasses.map((p) => p.maxElevationRadians)) * 180) / Math.PI).toFixed(1)}`
        : '-';
    return [s.id, s.computedPasses ? 'computed' : 'given', ...cells, top];
  });
  const headers = ['satellite', 'passes', ...doc.stations.map((st) => st.id), 'highest elevation (deg)'];
  const out = [fitTable(headers, rows, { width }).trimEnd()];
  if (plan.satellites.some((s) => s.computedPasses)) {
    out.push(
      'Computed passes: from mean elements (secular J2), Earth rotation with UT1 taken as UTC; times good to ' +
        "seconds (short: shorter than the station's support, not planned with). --json lists each pass with its " +
        'maximum elevation.',
    );
  }
  return out;
}

/** Each satellite of the document beside its plan (the plan lists them in the document's order). */
function zipSatellites(
  doc: FleetDocument,
  plan: FleetPlanJson,
): [FleetDocument['satellites'][number], FleetPlanJson['satellites'][number]][] {
  return plan.satellites.map((s, i) => {
    const sat = doc.satellites[i];
    if (sat?.id !== s.id) throw new Error(`internal: plan satellite ${i} (${s.id}) is not the document's`);
    return [sat, s];
  });
}

/**
 * The human-readable fleet plan: stamps from its JSON form (as printed), the timeline from the plan's Instants.
 * `width`: display columns to fit (TABLE_WIDTH by default in the CLI); undefined for the unlimited `--wide` form.
 */
export function fleetToText(
  doc: FleetDocument,
  { instants, plan }: { instants: FleetPlan; plan: FleetPlanJson },
  width: number | undefined,
): string {
  const out: string[] = [];
  out.push(
    `${doc.name ?? 'Fleet plan'}: ${doc.strategy.method} planner, ${doc.satellites.length} satellites, ${doc.stations.length} stations, ` +
      `${doc.epoch} + ${(doc.horizonSeconds / 86_400).toFixed(2)} days`,
  );
  out.push(
    plan.feasible
      ? 'Feasible: yes (every satellite holds its tolerance at its probability per epoch)'
      : `Feasible: NO. ${plan.reason ?? ''}`,
    '',
  );
  const rows = zipSatellites(doc, plan).map(([sat, s]) => {
    const stations = [...new Set(plan.stationSchedule.filter((x) => x.satellite === s.id).map((x) => x.station))];
    const supports = plan.stationSchedule.filter((x) => x.satellite === s.id).length;
    return [
      s.id,
      s.feasible ? 'yes' : 'NO',
      nsText(s.metrics.worstOffsetBoundSeconds),
      `±${nsText(sat.tolerance.phaseSeconds)} at ${sat.tolerance.probability * 100} %`,
      s.metrics.probabilityInTolerance.toFixed(4),
      supports,
      s.commands.length,
      stations.join(', ') || '-',
    ];
  });
  // "supports": station passes booked for uplink; "commands": commands uplinked in them (several per support).
  out.push(
    fitTable(
      [
        'satellite',
        'feasible',
        'worst |mean| + z·σ',
        'tolerance',
        'probability in tolerance',
        'supports',
        'commands',
        'stations used',
      ],
      rows,
      { width },
    ).trimEnd(),
  );
  out.push(
    '(worst |mean| + z·σ is a sufficient margin, stricter than the per-epoch probability criterion that decides feasibility.)',
  );
  for (const s of plan.satellites.filter((x) => !x.feasible)) out.push(`  ${s.id} (${s.reasonCode}): ${s.reason}`);
  out.push('', 'Passes per station:', ...passCounts(doc, plan, width));
  out.push('', ...stationLanes(doc, instants), '');
  if (plan.stationSchedule.length === 0) out.push('No supports needed.');
  else
    out.push(
      table(
        ['station', 'satellite', 'support start (UTC)', 'support end (UTC)'],
        plan.stationSchedule.map((x) => [x.station, x.satellite, x.start, x.end]),
      ).trimEnd(),
    );
  out.push(
    '',
    'Commands: tauline fleet <file> --json lists every command with its uplink station.',
    '',
    plan.caution,
    '',
  );
  return wrapLines(out.join('\n'), width);
}

export const fleetCommand: Command = {
  name: 'fleet',
  summary: 'Plan the steering of several satellite clocks that share ground stations.',
  usage: '<fleet.json> [--leap-seconds <file>] [--json | --format table|json]',
  allowPositionals: true,
  flags: {
    'leap-seconds': LEAP_SECONDS_FLAG,
    ...formatFlags(TABLE_OR_JSON, {
      json:
        'Print the fleet plan as JSON (feasible, reason, satellites with commands and station and any ' +
        'computedPasses, stationSchedule, units, caution); same as --format json.',
    }),
  },
  details: `
Fleet format: packages/sdk/schema/fleet.schema.json (JSON Schema); times ISO 8601 UTC, quantities SI.
Each satellite carries what a steering scenario carries except epoch, horizon, contacts and strategy,
plus its passes over the stations, given as a list or computed from its mean orbital elements (orbit:
semiMajorAxisMetres, eccentricity, inclinationRadians, raanRadians, argumentOfPerigeeRadians,
meanAnomalyRadians at an epoch) and each station's position (latitudeRadians, longitudeRadians,
heightMetres on WGS 84) and elevationMaskRadians: secular J2 propagation, UT1 taken as UTC, pass
times good to seconds. A station supports one satellite at a time for supportSeconds,
with at least setupSeconds between two supports. Supports go first to the satellite whose predicted
offset leaves its band soonest; each satellite is then planned by the single-satellite planner with
its supports as its only contacts (see tauline plan --help for the feasibility rule). An infeasible
satellite's reasonCode is too-few-passes, station-overbooked, or one of the plan command's codes.
The table shows one line per satellite (worst |mean| + z·σ, supports booked, commands uplinked, stations used) and a text
timeline per station.
${LEAP_SECONDS_HELP}
Exit status: 0 every satellite feasible, 1 some satellite infeasible (the reasons are printed), 2 unusable input.`,
  async run(args, io) {
    const path = onePositional(args, 'fleet file');
    const format = formatFlag(args, TABLE_OR_JSON, 'table');
    const timeScales = await leapSecondsFlag(args);
    const doc = await readJsonFile(path, 'a fleet document');
    const scales = timeScales ? { timeScales } : {};
    const instants = planFleet(doc, scales);
    const plan = fleetPlanToJson(instants, scales);
    if (format === 'json') io.out(toJson({ ...plan, units: FLEET_UNITS }));
    else io.out(fleetToText(doc as FleetDocument, { instants, plan }, outputWidth(args)));
    return plan.feasible ? EXIT_OK : EXIT_FINDING;
  },
};
