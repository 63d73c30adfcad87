/**
 * Text the navigation commands print about what they read: the header parameters of each file
 * (version, leap seconds, broadcast ionosphere and time-system corrections), and why a sample has
 * no usable record (never extrapolated past a fit interval).
 */
import { REFERENCE_WEEK_SYSTEM, type RinexNavEphemeris, type RinexNavHeader } from '@tauline/sdk/io';
import type { Instant } from '@tauline/sdk/time';
import { type Stamp, stampOf } from './epochs.js';

/** The header parameters of one navigation file, as printed (JSON `files[]`). */
export interface NavFileSummary {
  readonly file: string;
  readonly version: number;
  /** RINEX 2 file type (N, G, H); N for versions 3 and 4. */
  readonly fileType: string;
  readonly satelliteSystem: string;
  /** GPS − UTC leap seconds from the header, in seconds, or null when absent. */
  readonly leapSeconds: number | null;
  readonly ionosphere: readonly {
    readonly type: string;
    readonly parametersBroadcastUnits: readonly (number | null)[];
  }[];
  readonly timeSystemCorrections: readonly {
    readonly type: string;
    readonly a0: number;
    readonly a1: number;
    readonly referenceSecondsOfWeek: number;
    readonly referenceWeek: number;
    /** t_ref on the week system the type names; null where the SDK leaves it undefined (ambiguous or no week). */
    readonly reference: Stamp | null;
  }[];
}

/** File time-system code of each week system, for the stamp of t_ref (GST is `GAL` in RINEX). */
const WEEK_SYSTEM_CODE = { GPS: 'GPS', GST: 'GAL', BDT: 'BDT' } as const;

/** t_ref as a stamp on the week system its type names (REFERENCE_WEEK_SYSTEM), or null when the SDK places none. */
function referenceStamp(type: string, reference: Instant | undefined): Stamp | null {
  const system = REFERENCE_WEEK_SYSTEM[type];
  return reference === undefined || system === undefined ? null : stampOf(reference, WEEK_SYSTEM_CODE[system]);
}

/** The summary of a header (line numbers dropped: they describe the file, not the parameters). */
export function summariseNavHeader(file: string, h: RinexNavHeader): NavFileSummary {
  return {
    file,
    version: h.version,
    fileType: h.fileType,
    satelliteSystem: h.satelliteSystem,
    leapSeconds: h.leapSeconds?.current ?? null,
    ionosphere: h.ionosphere.map((p) => ({ type: p.type, parametersBroadcastUnits: p.parametersBroadcastUnits })),
    timeSystemCorrections: h.timeSystemCorrections.map((c) => ({
      type: c.type,
      a0: c.a0,
      a1: c.a1,
      referenceSecondsOfWeek: c.referenceSecondsOfWeek,
      referenceWeek: c.referenceWeek,
      reference: referenceStamp(c.type, c.reference),
    })),
  };
}

/** Units of the `files[]` fields, for the JSON `units` object. */
export const NAV_FILE_UNITS = {
  leapSeconds: 's',
  parametersBroadcastUnits:
    'as broadcast: Klobuchar α_n and β_n in s/semicircle^n (GPSA, GPSB, QZSA, BDSA, ...), Galileo a_i in sfu, sfu/degree, sfu/degree²',
  a0: 's',
  a1: 's/s',
  referenceSecondsOfWeek: 's',
  referenceWeek:
    "week number as written: GPS week for GPUT, QZGP, QZUT and RINEX 2 DELTA-UTC, BDT week for BDUT; other types' week system as the file's producer counts it",
  reference:
    "t_ref = referenceWeek + referenceSecondsOfWeek as { iso: ISO 8601 without zone, scale: GPS or BDT, the week's system }; null where the type's week system is ambiguous or absent (GAUT, GPGA, SBUT, GLONASS, IRNSS, others)",
} as const;

/** Human lines describing the header parameters, one block per file. */
export function navHeaderLines(files: readonly NavFileSummary[]): string[] {
  const out: string[] = [];
  for (const f of files) {
    const parts = [`RINEX ${f.version.toFixed(2)} ${f.fileType}`, `leap seconds ${f.leapSeconds ?? 'not given'}`];
    for (const p of f.ionosphere)
      parts.push(
        `ionosphere ${p.type} ${p.parametersBroadcastUnits.map((v) => (v === null ? 'blank' : v.toExponential(4))).join(' ')}`,
      );
    for (const c of f.timeSystemCorrections) {
      parts.push(
        `${c.type} a0 ${c.a0.toExponential(10)} s, a1 ${c.a1.toExponential(9)} s/s, t_ref ${c.referenceSecondsOfWeek} s of week ${c.referenceWeek}`,
      );
    }
    out.push(`  ${f.file}: ${parts.join('; ')}`);
  }
  return out;
}

/**
 * Why no record serves `time`: none in the files, only unhealthy ones, or `time` before the start / after the end
 * of the nearest record's fit interval (Instant arithmetic; `stamp` prints an instant, e.g. on the satellite's own
 * scale through the SDK's `formatFileEpoch`). `outsideWindow` counts the satellite's records dropped because their
 * fit interval misses the whole window. `reason` is the full sentence (JSON), `short` fits a table column.
 */
export function noRecordReason(
  records: readonly RinexNavEphemeris[],
  time: Instant,
  includeUnhealthy: boolean,
  stamp: (instant: Instant) => string,
  outsideWindow = 0,
): { reason: string; short: string } {
  if (records.length === 0 && outsideWindow > 0) {
    return {
      reason: `no record of this satellite near the requested window (${outsideWindow} record(s) in the files have fit intervals entirely outside it)`,
      short: 'no record near the window',
    };
  }
  if (records.length === 0)
    return { reason: 'no record of this satellite in the files', short: 'no record in the files' };
  const usable = includeUnhealthy ? records : records.filter((r) => r.health === 0);
  if (usable.length === 0) {
    return {
      reason:
        'no healthy record (every record of this satellite has a non-zero health word; --include-unhealthy uses them)',
      short: 'no healthy record',
    };
  }
  // The first record closest to the time (usable is not empty here).
  const distance = (r: RinexNavEphemeris) => Math.abs(time.secondsSince(r.toe));
  const nearest = usable.reduce((best, r) => (distance(r) < distance(best) ? r : best));
  const half = nearest.fitIntervalSeconds / 2;
  const start = nearest.toe.plus(-half);
  const end = nearest.toe.plus(half);
  const what = `the fit interval of the nearest healthy record (t_oe ${stamp(nearest.toe)}, fit ${nearest.fitIntervalSeconds / 3600} h`;
  if (time.isAfter(end)) {
    return {
      reason: `after the end of ${what}, valid to ${stamp(end)}): not extrapolated`,
      short: `fit interval ended ${stamp(end)}`,
    };
  }
  if (time.isBefore(start)) {
    return {
      reason: `before the start of ${what}, valid from ${stamp(start)}): not extrapolated`,
      short: `fit interval starts ${stamp(start)}`,
    };
  }
  return { reason: 'no healthy record whose fit interval covers this time', short: 'no healthy record covers t' };
}
