/**
 * `tauline broadcast`: reads RINEX navigation files and prints, per satellite and epoch, the
 * relativistic correction Δt_r = F e √A sin E_k and the full broadcast clock correction.
 */
import { InvalidArgumentError } from '@tauline/sdk/errors';
import type { RinexNavEphemeris } from '@tauline/sdk/io';
import {
  BROADCAST_SIGNALS,
  type BroadcastSignal,
  evaluateBroadcastEphemeris,
  type KeplerianSystem,
  selectEphemeris,
  signalClockCorrection,
  signalsOf,
} from '@tauline/sdk/orbit';
import {
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  formatFileEpoch,
  type Instant,
  type TimeScales,
} from '@tauline/sdk/time';
import {
  type BroadcastRequest,
  type BroadcastResult,
  printBroadcastCsv,
  printBroadcastJson,
  printBroadcastTable,
  type SampleOut,
} from '../broadcast-output.js';
import { outputFormat, satelliteFlag } from '../flags.js';
import {
  type Command,
  EXIT_FINDING,
  EXIT_OK,
  formatFlags,
  numberFlag,
  optionalFlag,
  type ParsedArgs,
  requireFlag,
  TABLE_JSON_CSV,
  UsageError,
} from '../framework.js';
import { noRecordReason } from '../nav-summary.js';
import {
  isModelledSystem,
  type LoadedNavigation,
  loadNavigation,
  type NavigationWindow,
  SYSTEM_FILE_CODE,
  SYSTEM_SCALE_LABEL,
} from '../navigation.js';

/** Samples per run above which the request is refused (keeps memory bounded). */
const MAX_SAMPLES = 5_000_000;

/** `--from` or `--to` as read: the instant of each system's samples, and the one its printed labels count from. */
interface TimeFlag {
  /** The flag's instant for a system: the same UTC instant for all, or the reading on the system's own scale. */
  readonly at: Readonly<Record<KeplerianSystem, Instant>>;
  /** The UTC instant, or the reading on GPS time (labels print its reading; every system's scale reads alike). */
  readonly label: Instant;
}

/**
 * Parses ISO 8601 text for `--from`/`--to`: an instant on UTC (designator required), or a reading of each
 * system's own scale (none allowed), placed on GPST, GST and BDT by the SDK's time scales.
 */
function parseTimeFlag(ts: TimeScales, flag: string, text: string, utc: boolean): TimeFlag {
  try {
    if (utc) {
      const instant = ts.parseIso(text, 'UTC');
      return { at: { G: instant, E: instant, C: instant }, label: instant };
    }
    const at = { G: ts.parseIso(text, 'GPS'), E: ts.parseIso(text, 'GST'), C: ts.parseIso(text, 'BDT') };
    return { at, label: at.G };
  } catch (error) {
    if (error instanceof InvalidArgumentError) {
      throw new InvalidArgumentError(
        `--${flag}`,
        text,
        utc
          ? 'an ISO 8601 UTC date-time with a zone designator, e.g. 2024-01-07T00:00:00Z'
          : "an ISO 8601 date-time read in each system's own time scale, without zone designator, e.g. 2024-01-07T00:00:00 (use --time-scale utc for UTC)",
        // The SDK's reason without its own "received …" (the value is already quoted once).
        `${error.argument.replace(/^text\.?/, '') || 'text'}: ${error.expected}${error.hint ? `; ${error.hint}` : ''}`,
      );
    }
    throw error;
  }
}

/** Reads `--signal <name>` (case-insensitive), or undefined when not given (the iono-free Δt_sv alone, as before). */
export function signalFlag(args: ParsedArgs): BroadcastSignal | undefined {
  const text = optionalFlag(args, 'signal');
  if (text === undefined) return undefined;
  const found = BROADCAST_SIGNALS.find((s) => s.toLowerCase() === text.trim().toLowerCase());
  if (!found) throw new InvalidArgumentError('--signal', text, `one of ${BROADCAST_SIGNALS.join(', ')}`);
  return found;
}

const SYSTEM_NAME: Record<KeplerianSystem, string> = { G: 'GPS', E: 'Galileo', C: 'BeiDou' };

export const broadcastCommand: Command = {
  name: 'broadcast',
  summary:
    'Relativistic correction F·e·√A·sin E_k and full clock correction from RINEX 2.10/2.11, 3.0x and 4.0x navigation files (GPS, Galileo, BeiDou).',
  usage:
    '<rinex-nav-file>... --from <ISO 8601> --to <ISO 8601> --step <s> [--satellite G01,...] [--signal <name>] [--time-scale system|utc] [--galileo inav|fnav] [--include-unhealthy] [--json | --csv | --format table|json|csv]',
  allowPositionals: true,
  flags: {
    from: {
      type: 'string',
      value: '<ISO 8601>',
      description: "First sample time, e.g. 2024-01-07T00:00:00 (each system's own scale unless --time-scale utc).",
    },
    to: { type: 'string', value: '<ISO 8601>', description: 'Last sample time (inclusive when on the step grid).' },
    step: { type: 'string', value: '<s>', description: 'Sample spacing, in seconds (> 0).' },
    satellite: {
      type: 'string',
      value: '<ids>',
      description: 'Comma-separated satellites, e.g. G05,E11,C08 (default: every modelled satellite in the files).',
    },
    'time-scale': {
      type: 'string',
      value: '<scale>',
      description:
        'system (default: GPST for GPS, GST for Galileo, BDT for BeiDou) or utc (times with Z; converted with the bundled leap-second table).',
    },
    galileo: { type: 'string', value: '<msg>', description: 'Galileo message to prefer: inav (default) or fnav.' },
    signal: {
      type: 'string',
      value: '<name>',
      description: `Also give the single-frequency clock correction of one signal: ${BROADCAST_SIGNALS.join(', ')} (case-insensitive; default: iono-free, Δt_sv alone, no extra fields).`,
    },
    'include-unhealthy': { type: 'boolean', description: 'Also use records whose health word is non-zero.' },
    ...formatFlags(TABLE_JSON_CSV, {
      json: 'Print one JSON object (same as --format json).',
      csv: 'Print CSV rows (id,t,timeScale,relativisticSeconds,clockCorrectionSeconds,toe,toeScale,issueOfData,message; with --signal also clockCorrectionSignalSeconds,groupDelaySeconds,groupDelayField); the caution goes to stderr.',
    }),
  },
  details: `
Reads RINEX 2.10 / 2.11, 3.0x and 4.0x navigation files (streamed; several files, e.g. a month of daily files, may
be given). Modelled: GPS LNAV (RINEX 2 'N' files, two-digit years read 80-99 → 19xx, 00-79 → 20xx), Galileo I/NAV
and F/NAV, BeiDou D1/D2; other records (RINEX 2 GLONASS 'G' and GEO 'H' files included) are counted as skipped with
a reason. RINEX 2 Galileo ('L') and mixed navigation files are not defined by RINEX 2.11 and are refused (exit 2).
Each file's header parameters are shown: leap seconds, broadcast ionosphere (RINEX 2 ION ALPHA / ION BETA as GPSA /
GPSB, RINEX 3 IONOSPHERIC CORR) and time-system corrections (RINEX 2 DELTA-UTC: A0,A1,T,W as GPUT, RINEX 3 TIME
SYSTEM CORR), as broadcast.
For each satellite and sample time t the record is chosen by the usual rule (common practice, no source): healthy
records whose fit interval covers t (GPS: from the record, 0 → 4 h; Galileo, BeiDou: 4 h), nearest t_oe, ties to
t_oe ≤ t, then the latest transmission, then the highest issue of data. Then (IS-GPS-200 §20.3.3.3.3.1 and
Table 20-IV [M]; Galileo OS SIS ICD; BDS-SIS-ICD, each with its own GM, Ω_E and F):
  Δt_r = F e √A sin E_k,   Δt_sv = a_f0 + a_f1 (t − t_oc) + a_f2 (t − t_oc)² + Δt_r   (group delays not applied).
Times are read in each system's own scale (GPST, GST, BDT) unless --time-scale utc. A sample with no valid record
has null values and a reason (past the end or before the start of the nearest record's fit interval: never
extrapolated). JSON: { files: [{ file, version, fileType, satelliteSystem, leapSeconds, ionosphere: [{ type,
parametersBroadcastUnits }], timeSystemCorrections: [{ type, a0, a1, referenceSecondsOfWeek, referenceWeek,
reference }] }] (reference: t_ref as { iso, scale } on the week system the type names, GPS for GPUT/QZGP/QZUT, BDT
for BDUT; null where the format leaves it ambiguous: GAUT, GPGA, SBUT, GLONASS, IRNSS),
satellites: [{ id, timeScale, toeScale, samples: [{ t, relativisticSeconds, clockCorrectionSeconds, toe, issueOfData,
message }] }], skipped, notes, units, caution }: t is on timeScale, toe on toeScale (the system's own scale, also with
--time-scale utc; null for a system not modelled). Seconds are SI seconds.
--signal <name> adds, per sample, clockCorrectionSignalSeconds, groupDelaySeconds (as broadcast) and groupDelayField
(JSON: also signal and signalSource at the top; CSV: three columns at the end; table: two columns):
  GPS (IS-GPS-200 §20.3.3.3.3.2 [M]):  L1CA, L1P: Δt_sv − T_GD;  L2P: Δt_sv − γ T_GD, γ = (77/60)².
  Galileo (OS SIS ICD §5.1.5 [M]):     E1: Δt − BGD(E1,E5b) from I/NAV records, Δt − BGD(E1,E5a) from F/NAV records;
                                       E5a: Δt − (f_E1/f_E5a)² BGD(E1,E5a);  E5b: Δt − (f_E1/f_E5b)² BGD(E1,E5b) (I/NAV only).
  BeiDou (BDS-SIS-ICD [M]):            B1I: Δt − TGD1;  B2I: Δt − TGD2;  B3I: Δt (the clock's reference signal).
  iono-free: Δt_sv with no group delay, the dual-frequency user's value (GPS L1/L2 P(Y), Galileo I/NAV E1/E5b,
  F/NAV E1/E5a). BeiDou's Δt_sv refers to B3I, so for BeiDou this is the B3I value, not an ionosphere-free one.
A signal of another system than the satellite's gives null with a note; a record without the group delay needed
is an error naming the file, line and field.
Exit status: 0 success (also when some samples have no record), 1 no sample at all has a valid record (the output
is still printed, every value null), 2 invalid input or a malformed file.`,
  async run(args, io) {
    const request = broadcastRequest(args);
    const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
    const grid = sampleGrid(ts, args, request);
    const nav = await loadNavigation(request.files, io, grid.window, request.filter);
    const satellites = [...new Set([...(request.filter ?? []), ...nav.records.keys()])].sort();
    if (satellites.length * grid.count > MAX_SAMPLES) {
      throw new InvalidArgumentError(
        '--step',
        request.step,
        `a step giving at most ${MAX_SAMPLES} samples in all (${satellites.length} satellites × ${grid.count} epochs requested)`,
      );
    }
    const result = evaluateSatellites(ts, request, grid, nav, satellites);
    // Nothing usable at all (no satellite has a record covering any sample) is a finding, not a success.
    const status = result.samplesWithoutRecord === satellites.length * grid.count ? EXIT_FINDING : EXIT_OK;
    if (status === EXIT_FINDING) {
      const which = request.filter ? `record of ${[...request.filter].join(', ')}` : 'GPS, Galileo or BeiDou record';
      io.err(
        `tauline broadcast: no sample has a valid record: no ${which} covers the requested window in these files\n`,
      );
    }
    if (request.format === 'json') printBroadcastJson(io, request, nav, result);
    else if (request.format === 'csv') printBroadcastCsv(io, request, result);
    else printBroadcastTable(io, args, request, nav, result);
    return status;
  },
};

/**
 * The --signal fields of one sample: the SDK's single-frequency correction, or null with a note when the
 * signal belongs to another system. A record without the group delay needed is an error naming file and line.
 */
function signalFields(
  rec: RinexNavEphemeris,
  clockCorrectionSeconds: number,
  signal: BroadcastSignal,
  notes: Set<string>,
): Pick<SampleOut, 'clockCorrectionSignalSeconds' | 'groupDelaySeconds' | 'groupDelayField'> {
  if (!signalsOf(rec.system).includes(signal)) {
    notes.add(
      `${SYSTEM_NAME[rec.system]} satellites: ${signal} is not one of their signals (${signalsOf(rec.system).join(', ')}): clockCorrectionSignalSeconds is null`,
    );
    return { clockCorrectionSignalSeconds: null, groupDelaySeconds: null, groupDelayField: null };
  }
  try {
    const r = signalClockCorrection(rec, clockCorrectionSeconds, signal);
    if (r.note) notes.add(`${rec.satellite}: ${r.note}`);
    return {
      clockCorrectionSignalSeconds: r.clockCorrectionSeconds,
      groupDelaySeconds: r.groupDelaySeconds,
      groupDelayField: r.groupDelayField,
    };
  } catch (error) {
    if (error instanceof InvalidArgumentError) {
      throw new InvalidArgumentError(
        `${rec.sourceName}:${rec.line}: ${rec.satellite} ${error.argument.replace(/^ephemeris\./, '')}`,
        error.received,
        error.expected,
        `--signal ${signal}${error.hint ? `; ${error.hint}` : ''}`,
      );
    }
    throw error;
  }
}

function broadcastRequest(args: ParsedArgs): BroadcastRequest {
  const files = args.positionals;
  if (files.length === 0)
    throw new UsageError('a RINEX navigation file is required (tauline broadcast <rinex-nav-file> ...)');
  const format = outputFormat(args);
  const step = numberFlag(args, 'step', true);
  if (!(step > 0)) throw new InvalidArgumentError('--step', step, 'a positive number of seconds');
  const scaleText = (optionalFlag(args, 'time-scale') ?? 'system').toLowerCase();
  if (scaleText !== 'system' && scaleText !== 'utc')
    throw new InvalidArgumentError('--time-scale', scaleText, "'system' or 'utc'");
  const galileoText = (optionalFlag(args, 'galileo') ?? 'inav').toLowerCase();
  if (galileoText !== 'inav' && galileoText !== 'fnav')
    throw new InvalidArgumentError('--galileo', galileoText, "'inav' or 'fnav'");
  const includeUnhealthy = Boolean(args.values['include-unhealthy']);
  const filter = satelliteFlag(args);
  const signal = signalFlag(args);
  return {
    files,
    format,
    step,
    utc: scaleText === 'utc',
    galileoMessage: galileoText === 'inav' ? 'INAV' : 'FNAV',
    includeUnhealthy,
    filter,
    signal,
  };
}

/** The sample times: their count, each sample's instant on a system, its printed label and each system's window. */
interface SampleGrid {
  readonly count: number;
  /** Sample k as an instant, for a system (a reading of the system's own scale unless --time-scale utc). */
  instantAt(k: number, system: KeplerianSystem): Instant;
  /** Sample k as printed (UTC with Z, or the reading without designator). */
  label(k: number): string;
  /** First and last sample of a system, as instants (the window of the navigation records kept). */
  readonly window: NavigationWindow;
}

function sampleGrid(ts: TimeScales, args: ParsedArgs, request: BroadcastRequest): SampleGrid {
  const { step, utc } = request;
  const from = parseTimeFlag(ts, 'from', requireFlag(args, 'from'), utc);
  const to = parseTimeFlag(ts, 'to', requireFlag(args, 'to'), utc);
  const span = to.label.secondsSince(from.label);
  if (!(span >= 0)) throw new InvalidArgumentError('--to', requireFlag(args, 'to'), 'a time not before --from');
  const count = Math.floor(span / step + 1e-9) + 1;
  const fractional = !Number.isInteger(step);
  // Sample k is from + k·step: one product and one addition to an instant (no float count of seconds since 1980).
  const instantAt = (k: number, system: KeplerianSystem): Instant => from.at[system].plus(k * step);
  const label = (k: number): string =>
    utc
      ? ts.formatIso(from.label.plus(k * step), { fractionDigits: fractional ? 6 : 0 })
      : formatFileEpoch(ts, from.label.plus(k * step), 'GPS');
  return {
    count,
    instantAt,
    label,
    window: (system) => ({ from: instantAt(0, system), to: instantAt(count - 1, system) }),
  };
}

function evaluateSatellites(
  ts: TimeScales,
  request: BroadcastRequest,
  grid: SampleGrid,
  nav: LoadedNavigation,
  satellites: readonly string[],
): BroadcastResult {
  const { includeUnhealthy, galileoMessage, signal } = request;
  const notes = new Set<string>();
  const out: BroadcastResult['out'] = [];
  let samplesWithoutRecord = 0;
  for (const id of satellites) {
    const system = id.charAt(0);
    const modelled = isModelledSystem(system);
    if (!modelled) notes.add(`${id}: system not modelled (GPS, Galileo and BeiDou only)`);
    const records = nav.records.get(id) ?? [];
    const samples: SampleOut[] = [];
    for (let k = 0; k < grid.count; k++) {
      // An unmodelled system has no scale of its own to read the sample time on (and no record to use).
      if (!modelled) {
        samplesWithoutRecord++;
        samples.push({
          t: grid.label(k),
          relativisticSeconds: null,
          clockCorrectionSeconds: null,
          reason: 'no record of this satellite in the files',
          short: 'no record in the files',
        });
        continue;
      }
      const at = grid.instantAt(k, system);
      const rec = selectEphemeris(records, at, { includeUnhealthy, galileoMessage });
      if (!rec) {
        samplesWithoutRecord++;
        const stamp = (i: Instant) =>
          `${formatFileEpoch(ts, i, SYSTEM_FILE_CODE[system])} ${SYSTEM_SCALE_LABEL[system]}`;
        samples.push({
          t: grid.label(k),
          relativisticSeconds: null,
          clockCorrectionSeconds: null,
          ...noRecordReason(records, at, includeUnhealthy, stamp, nav.outsideWindowBySatellite.get(id) ?? 0),
        });
        continue;
      }
      for (const n of rec.notes ?? []) notes.add(`${rec.sourceName}:${rec.line}: ${id}: ${n}`);
      const ev = evaluateBroadcastEphemeris(rec, at);
      samples.push({
        t: grid.label(k),
        relativisticSeconds: ev.relativisticSeconds,
        clockCorrectionSeconds: ev.clockCorrectionSeconds,
        ...(signal ? signalFields(rec, ev.clockCorrectionSeconds, signal, notes) : {}),
        toe: formatFileEpoch(ts, rec.toe, SYSTEM_FILE_CODE[system]),
        issueOfData: rec.issueOfData,
        message: rec.message,
      });
    }
    if (signal) {
      // Samples without a record carry the signal fields too (null), so every sample has the same keys.
      for (const x of samples) {
        if (x.clockCorrectionSignalSeconds === undefined)
          Object.assign(x, { clockCorrectionSignalSeconds: null, groupDelaySeconds: null, groupDelayField: null });
      }
    }
    const own = modelled ? SYSTEM_SCALE_LABEL[system] : null;
    out.push({ id, timeScale: request.utc ? 'UTC' : (own ?? 'unknown'), toeScale: own, samples });
  }
  return { out, notes, samplesWithoutRecord };
}
