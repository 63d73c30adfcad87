/**
 * `tauline precise`: reads an SP3 precise orbit file and prints −2 r·v/c² per satellite and epoch,
 * optionally beside the broadcast value from navigation files (cross-check).
 */
import { InvalidArgumentError } from '@tauline/sdk/errors';
import { readSp3, type Sp3Event, type Sp3Header } from '@tauline/sdk/io';
import { evaluateBroadcastEphemeris, selectEphemeris } from '@tauline/sdk/orbit';
import {
  DEFAULT_LAGRANGE_POINTS,
  type PreciseCorrectionResult,
  type PreciseCorrectionSample,
  PreciseCorrectionStream,
} from '@tauline/sdk/relativity';
import {
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  formatFileEpoch,
  type Instant,
  type TimeScales,
} from '@tauline/sdk/time';
import { MAX_RECORD_BYTES, requireRegularFile, STANDARD_INPUT, sourceLabel } from '../files.js';
import { outputFormat, satelliteFlag } from '../flags.js';
import {
  type Command,
  EXIT_OK,
  formatFlags,
  type Io,
  numberFlag,
  type ParsedArgs,
  TABLE_JSON_CSV,
  toJson,
  UsageError,
} from '../framework.js';
import { fitTable, outputWidth, wrapLines } from '../layout.js';
import {
  fileChunks,
  isModelledSystem,
  type LoadedNavigation,
  loadNavigation,
  progress,
  totalSize,
} from '../navigation.js';

interface PreciseOut {
  t: string;
  relativisticSeconds: number;
  velocitySource: 'file' | 'lagrange';
  broadcastRelativisticSeconds?: number | null;
  differenceSeconds?: number | null;
}

/**
 * Satellites for which the cross-check gave no broadcast value at any epoch, with the reason: a system the
 * SDK does not model, or no record of the satellite in the navigation files over the SP3 span.
 */
function withoutBroadcast(
  order: readonly string[],
  bySat: ReadonlyMap<string, { samples: PreciseOut[] }>,
  records: ReadonlyMap<string, readonly unknown[]>,
): Map<string, string> {
  const out = new Map<string, string>();
  for (const id of order) {
    const samples = bySat.get(id)?.samples ?? [];
    if (samples.length === 0 || samples.some((o) => o.broadcastRelativisticSeconds != null)) continue;
    out.set(
      id,
      !isModelledSystem(id.charAt(0))
        ? 'system not modelled (GPS, Galileo and BeiDou only)'
        : (records.get(id)?.length ?? 0) === 0
          ? 'the navigation file(s) have no record of this satellite over the SP3 span'
          : 'no healthy record whose fit interval covers these epochs',
    );
  }
  return out;
}

export const preciseCommand: Command = {
  name: 'precise',
  summary:
    'Relativistic correction −2 r·v/c² from an SP3 precise orbit file, optionally compared with broadcast values.',
  usage:
    '<sp3-file> [--satellite G01,...] [--lagrange-points <n>] [--nav <rinex-nav-file>]... [--json | --csv | --format table|json|csv]',
  allowPositionals: true,
  flags: {
    satellite: {
      type: 'string',
      value: '<ids>',
      description: 'Comma-separated satellites, e.g. G05,E11 (default: all in the file).',
    },
    'lagrange-points': {
      type: 'string',
      value: '<n>',
      description: `Lagrange nodes for velocities when the file has none, 2..16 (default ${DEFAULT_LAGRANGE_POINTS}: degree ${DEFAULT_LAGRANGE_POINTS - 1}).`,
    },
    nav: {
      type: 'string',
      multiple: true,
      value: '<file>',
      description: 'RINEX navigation file(s) for the cross-check: adds the broadcast Δt_r and the difference.',
    },
    ...formatFlags(TABLE_JSON_CSV, {
      json: 'Print one JSON object (same as --format json).',
      csv: 'Print CSV rows (id,t,relativisticSeconds,velocitySource[,broadcastRelativisticSeconds,differenceSeconds]), streamed.',
    }),
  },
  details: `
Reads an SP3-a, SP3-b, SP3-c or SP3-d file (streamed; SP3-a/b state no time system: GPS time is assumed and
said so) and computes at each epoch Δt_r = −2 r·v/c² (IERS Conventions 2010 §10.2
eq. 10.11 [V1]) in the file's Earth-fixed frame: (ω × r)·r = 0, so r·v is the same as in the inertial frame.
v: the file's velocity records when present; otherwise the derivative of the Lagrange polynomial through the
${DEFAULT_LAGRANGE_POINTS} nearest valid positions (centred; one-sided at the file ends). Bad/absent positions
(0.000000) and satellites of the header without a position record at an epoch are reported as gaps, never used
as zero or skipped. With --nav, the broadcast Δt_r = F e √A sin E_k of the
record valid at the same instant (converted to the system's own scale) and the difference precise − broadcast are
added; the difference includes the share of the broadcast harmonic corrections in r·v (≈ 0.01 ns) and orbit errors.
JSON: { timeSystem, timeSystemAssumed, coordinateFrame, agency, lagrangePoints, satellites: [{ id, samples: [{ t, relativisticSeconds,
velocitySource, broadcastRelativisticSeconds?, differenceSeconds? }], gaps: [{ t, reason }], broadcastNote? }], units }; t is in the
file's time system, the corrections in SI seconds. broadcastNote says why a satellite has no broadcast value at all. A --satellite not listed in the file's header is refused.
Exit status: 0 success, 2 invalid input or a malformed file.`,
  async run(args, io) {
    const request = preciseRequest(args);
    const { path, format } = request;
    const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
    // Table and JSON output hold every sample until the end (about 2.5× the file in memory): larger files need --csv, which streams.
    const what = format === 'csv' ? 'an SP3 file' : `an SP3 file read for ${format} output (--csv streams any size)`;
    const maxBytes = format === 'csv' ? undefined : MAX_RECORD_BYTES;
    await requireRegularFile(path, what, maxBytes);
    if (path === STANDARD_INPUT && request.navFiles.includes(STANDARD_INPUT)) {
      throw new UsageError('- (standard input) can be read once only: give it for the SP3 file or for --nav');
    }
    const bar = progress(io, 'reading precise orbits', totalSize([path]));
    const events = readSp3(fileChunks(path, what, bar.add, maxBytes), {
      sourceName: sourceLabel(path),
      timeScales: ts,
    });
    const first = await events.next();
    if (first.done || first.value.kind !== 'header') throw new UsageError(`${path}: no SP3 header`);
    const header = first.value.header;
    const unknown = request.filter ? [...request.filter].filter((id) => !header.satellites.includes(id)) : [];
    if (unknown.length > 0) {
      throw new InvalidArgumentError(
        '--satellite',
        unknown.join(','),
        `satellites listed in the header of ${path}: ${header.satellites.join(', ')}`,
      );
    }
    const nav = request.navFiles.length > 0 ? await loadCrossCheck(request, header, io) : undefined;
    const collected = await collectCorrections(request, header, events, { ts, nav, io, finish: bar.finish });
    if (format === 'csv') return EXIT_OK;
    const order = header.satellites.filter((s) => collected.has(s));
    const noBroadcast = nav ? withoutBroadcast(order, collected, nav.records) : new Map<string, string>();
    if (format === 'json') printJson(io, request, header, order, collected, noBroadcast, nav);
    else printTable(io, args, header, order, collected, noBroadcast, nav);
    return EXIT_OK;
  },
};

/** What `tauline precise` was asked for. */
interface PreciseRequest {
  readonly path: string;
  readonly format: 'json' | 'csv' | 'table';
  readonly filter: Set<string> | undefined;
  readonly points: number;
  readonly navFiles: readonly string[];
}

function preciseRequest(args: ParsedArgs): PreciseRequest {
  const [path, ...more] = args.positionals;
  if (path === undefined || more.length > 0)
    throw new UsageError('exactly one SP3 file is required (tauline precise <sp3-file>)');
  const format = outputFormat(args);
  const filter = satelliteFlag(args);
  const points = numberFlag(args, 'lagrange-points') ?? DEFAULT_LAGRANGE_POINTS;
  if (!Number.isInteger(points) || points < 2 || points > 16)
    throw new InvalidArgumentError('--lagrange-points', points, 'an integer in [2, 16]');
  const navValue = args.values.nav;
  const navFiles = Array.isArray(navValue)
    ? navValue.filter((v): v is string => typeof v === 'string')
    : typeof navValue === 'string'
      ? [navValue]
      : [];
  return { path, format, filter, points, navFiles };
}

/** Reads the navigation files whose fit intervals overlap the SP3 span (instants, ± 1 h margin; every system alike). */
function loadCrossCheck(request: PreciseRequest, header: Sp3Header, io: Io): Promise<LoadedNavigation> {
  const spanSeconds = header.epochInterval * (header.epochCount - 1);
  return loadNavigation(
    request.navFiles,
    io,
    () => ({ from: header.firstInstant.plus(-3600), to: header.firstInstant.plus(spanSeconds + 3600) }),
    request.filter ?? new Set(header.satellites),
  );
}

/** Samples and gaps of one satellite, held for table and JSON output. */
interface SatelliteOut {
  readonly samples: PreciseOut[];
  readonly gaps: { t: string; reason: string }[];
}

/** The broadcast Δt_r at a precise sample's instant, or null when no valid record covers it. */
function broadcastAt(nav: LoadedNavigation, s: PreciseCorrectionSample): number | null {
  if (!isModelledSystem(s.satellite.charAt(0))) return null;
  const eph = selectEphemeris(nav.records.get(s.satellite) ?? [], s.epoch);
  return eph ? evaluateBroadcastEphemeris(eph, s.epoch).relativisticSeconds : null;
}

/**
 * Runs the SP3 epochs through the correction stream: CSV rows are written as they come (one write per
 * epoch: one per row cost about a quarter of the run time on long files); table and JSON rows are kept.
 */
async function collectCorrections(
  request: PreciseRequest,
  header: Sp3Header,
  events: AsyncGenerator<Sp3Event>,
  context: { ts: TimeScales; nav: LoadedNavigation | undefined; io: Io; finish: () => void },
): Promise<Map<string, SatelliteOut>> {
  const { ts, nav, io } = context;
  const csvOut = request.format === 'csv';
  const stream = new PreciseCorrectionStream({
    epochInterval: header.epochInterval,
    lagrangePoints: request.points,
    ...(request.filter ? { satellites: request.filter } : {}),
  });
  const bySat = new Map<string, SatelliteOut>();
  const entry = (id: string): SatelliteOut => {
    let e = bySat.get(id);
    if (!e) bySat.set(id, (e = { samples: [], gaps: [] }));
    return e;
  };
  // Results of one epoch come together: its text is formatted once.
  let lastEpoch: Instant | undefined;
  let lastText = '';
  const epochText = (epoch: Instant): string => {
    if (lastEpoch === undefined || !epoch.equals(lastEpoch)) {
      lastText = formatFileEpoch(ts, epoch, header.timeSystem);
      lastEpoch = epoch;
    }
    return lastText;
  };
  if (csvOut)
    io.out(`id,t,relativisticSeconds,velocitySource${nav ? ',broadcastRelativisticSeconds,differenceSeconds' : ''}\n`);
  const handle = (results: PreciseCorrectionResult[]) => {
    let csv = '';
    for (const r of results) {
      if (r.kind === 'gap') {
        const g = { t: epochText(r.gap.epoch), reason: r.gap.reason };
        if (csvOut) csv += `${r.gap.satellite},${g.t},,gap: ${g.reason.replace(/,/g, ';')}${nav ? ',,' : ''}\n`;
        else entry(r.gap.satellite).gaps.push(g);
        continue;
      }
      const s = r.sample;
      const o: PreciseOut = {
        t: epochText(s.epoch),
        relativisticSeconds: s.relativisticSeconds,
        velocitySource: s.velocitySource,
      };
      if (nav) {
        const broadcast = broadcastAt(nav, s);
        o.broadcastRelativisticSeconds = broadcast;
        o.differenceSeconds = broadcast === null ? null : s.relativisticSeconds - broadcast;
      }
      if (csvOut) {
        csv +=
          `${s.satellite},${o.t},${o.relativisticSeconds},${o.velocitySource}` +
          (nav ? `,${o.broadcastRelativisticSeconds ?? ''},${o.differenceSeconds ?? ''}` : '') +
          '\n';
      } else {
        entry(s.satellite).samples.push(o);
      }
    }
    if (csv !== '') io.out(csv);
  };
  try {
    for (let next = await events.next(); !next.done; next = await events.next()) {
      if (next.value.kind === 'epoch') handle(stream.push(next.value.epoch));
    }
    handle(stream.finish());
  } finally {
    context.finish();
  }
  return bySat;
}

function printJson(
  io: Io,
  request: PreciseRequest,
  header: Sp3Header,
  order: readonly string[],
  bySat: ReadonlyMap<string, SatelliteOut>,
  noBroadcast: ReadonlyMap<string, string>,
  nav: LoadedNavigation | undefined,
): void {
  io.out(
    toJson({
      timeSystem: header.timeSystem,
      timeSystemAssumed: header.timeSystemAssumed,
      coordinateFrame: header.coordinateFrame,
      agency: header.agency,
      sp3Version: header.version,
      epochInterval: header.epochInterval,
      lagrangePoints: request.points,
      satellites: order.map((id) => ({
        id,
        samples: bySat.get(id)?.samples ?? [],
        gaps: bySat.get(id)?.gaps ?? [],
        ...(noBroadcast.has(id) ? { broadcastNote: noBroadcast.get(id) } : {}),
      })),
      ...(nav ? { navigationSkipped: [...nav.skipped].map(([reason, count]) => ({ reason, count })) } : {}),
      units: {
        epochInterval: 's',
        t: `ISO 8601 in the file's time system (${header.timeSystem})`,
        relativisticSeconds: 's',
        ...(nav ? { broadcastRelativisticSeconds: 's', differenceSeconds: 's' } : {}),
      },
    }),
  );
}

function printTable(
  io: Io,
  args: ParsedArgs,
  header: Sp3Header,
  order: readonly string[],
  bySat: ReadonlyMap<string, SatelliteOut>,
  noBroadcast: ReadonlyMap<string, string>,
  nav: LoadedNavigation | undefined,
): void {
  const width = outputWidth(args);
  const timeNote = header.timeSystemAssumed
    ? `${header.timeSystem} time assumed: SP3-${header.version} states none`
    : `${header.timeSystem} time`;
  io.out(
    wrapLines(
      `Precise-orbit relativistic correction −2 r·v/c² (SP3-${header.version}, ${timeNote}, frame ${header.coordinateFrame}, ${header.agency})\n\n`,
      width,
    ),
  );
  // A satellite the navigation files say nothing about gets empty broadcast cells and one sentence
  // below the table instead of a column of "—"; no such column at all when no satellite has a record.
  const broadcastColumns = nav !== undefined && order.some((id) => !noBroadcast.has(id));
  const rows: (string | number)[][] = [];
  for (const id of order) {
    for (const o of bySat.get(id)?.samples ?? []) {
      const row: (string | number)[] = [id, o.t, (o.relativisticSeconds * 1e9).toFixed(4), o.velocitySource];
      if (broadcastColumns) {
        const none = noBroadcast.has(id) ? '' : '—';
        row.push(
          o.broadcastRelativisticSeconds == null ? none : (o.broadcastRelativisticSeconds * 1e9).toFixed(4),
          o.differenceSeconds == null ? none : (o.differenceSeconds * 1e9).toFixed(4),
        );
      }
      rows.push(row);
    }
  }
  io.out(
    fitTable(
      ['sat', 't', 'Δt_r (ns)', 'v from', ...(broadcastColumns ? ['broadcast (ns)', 'difference (ns)'] : [])],
      rows,
      { width },
    ),
  );
  const text: string[] = [];
  if (noBroadcast.size > 0)
    text.push(`\nNo broadcast cross-check:\n${[...noBroadcast].map(([id, why]) => `  ${id}: ${why}`).join('\n')}\n`);
  const gaps = order.flatMap((id) => (bySat.get(id)?.gaps ?? []).map((g) => `  ${id} ${g.t}: ${g.reason}`));
  if (gaps.length > 0) text.push(`\nEpochs without a correction:\n${gaps.join('\n')}\n`);
  io.out(wrapLines(text.join(''), width));
}
