/**
 * Output of `tauline broadcast`: what was asked for, the samples computed, and their JSON, CSV and table forms.
 */
import type { BroadcastSignal } from '@tauline/sdk/orbit';
import { signalClockSource } from '@tauline/sdk/orbit';
import { FLIGHT_CAUTION, type Io, type ParsedArgs, toJson } from './framework.js';
import { fitTable, outputWidth, wrapLines } from './layout.js';
import { NAV_FILE_UNITS, navHeaderLines } from './nav-summary.js';
import type { LoadedNavigation } from './navigation.js';

/** One sample of one satellite as printed. */
export interface SampleOut {
  t: string;
  relativisticSeconds: number | null;
  clockCorrectionSeconds: number | null;
  clockCorrectionSignalSeconds?: number | null;
  groupDelaySeconds?: number | null;
  groupDelayField?: string | null;
  toe?: string;
  issueOfData?: number;
  message?: string;
  reason?: string;
  /** Short form of `reason` for the table (not in JSON or CSV). */
  short?: string;
}

/** What `tauline broadcast` was asked for (flags read and checked, in the order their errors are reported). */
export interface BroadcastRequest {
  readonly files: readonly string[];
  readonly format: 'json' | 'csv' | 'table';
  /** Sample spacing, s. */
  readonly step: number;
  readonly utc: boolean;
  readonly galileoMessage: 'INAV' | 'FNAV';
  readonly includeUnhealthy: boolean;
  readonly filter: Set<string> | undefined;
  readonly signal: BroadcastSignal | undefined;
}

/** Per-satellite samples, the notes gathered and the number of samples without a valid record. */
export interface BroadcastResult {
  /**
   * `timeScale`: the scale of the samples' `t` (UTC with --time-scale utc); `toeScale`: the scale of their `toe`, always
   * the system's own (GPST, GST, BDT), null for a system not modelled (no record, no `toe`).
   */
  readonly out: { id: string; timeScale: string; toeScale: string | null; samples: SampleOut[] }[];
  readonly notes: Set<string>;
  readonly samplesWithoutRecord: number;
}

export function printBroadcastJson(
  io: Io,
  request: BroadcastRequest,
  nav: LoadedNavigation,
  result: BroadcastResult,
): void {
  const { signal } = request;
  io.out(
    toJson({
      timeScale: request.utc ? 'UTC' : 'system',
      step: request.step,
      selection:
        'nearest t_oe among healthy records whose fit interval covers t (ties: t_oe ≤ t, latest transmission, highest issue of data)',
      galileoMessage: request.galileoMessage,
      files: nav.files,
      ...(signal ? { signal, signalSource: signalClockSource(signal) } : {}),
      satellites: result.out.map((s) => ({ ...s, samples: s.samples.map(({ short: _short, ...x }) => x) })),
      samplesWithoutRecord: result.samplesWithoutRecord,
      recordsOutsideWindow: nav.outsideWindow,
      skipped: [...nav.skipped].map(([reason, n]) => ({ reason, count: n })),
      notes: [...result.notes],
      units: {
        step: 's',
        t: 'ISO 8601 in timeScale',
        relativisticSeconds: 's',
        clockCorrectionSeconds: 's',
        toe: "ISO 8601 in the satellite's toeScale (its system's own scale: GPST, GST or BDT)",
        ...(signal ? { clockCorrectionSignalSeconds: 's', groupDelaySeconds: 's' } : {}),
        files: NAV_FILE_UNITS,
      },
      caution: FLIGHT_CAUTION,
    }),
  );
}

export function printBroadcastCsv(io: Io, request: BroadcastRequest, result: BroadcastResult): void {
  const { signal } = request;
  io.out(
    `id,t,timeScale,relativisticSeconds,clockCorrectionSeconds,toe,toeScale,issueOfData,message${signal ? ',clockCorrectionSignalSeconds,groupDelaySeconds,groupDelayField' : ''}\n`,
  );
  for (const s of result.out) {
    // Each row names the scales of its two stamps, as the JSON does per satellite.
    const toeScale = s.toeScale ?? '';
    for (const x of s.samples) {
      io.out(
        `${s.id},${x.t},${s.timeScale},${x.relativisticSeconds ?? ''},${x.clockCorrectionSeconds ?? ''},${x.toe ?? ''},${x.toe === undefined ? '' : toeScale},${x.issueOfData ?? ''},${x.message ?? ''}` +
          (signal
            ? `,${x.clockCorrectionSignalSeconds ?? ''},${x.groupDelaySeconds ?? ''},${x.groupDelayField ?? ''}`
            : '') +
          '\n',
      );
    }
  }
  io.err(`${FLIGHT_CAUTION}\n`);
}

export function printBroadcastTable(
  io: Io,
  args: ParsedArgs,
  request: BroadcastRequest,
  nav: LoadedNavigation,
  result: BroadcastResult,
): void {
  const { signal } = request;
  const width = outputWidth(args);
  io.out(
    wrapLines(
      `Broadcast relativistic and clock corrections (${request.utc ? "t in UTC, t_oe in each system's own scale: GPST, GST, BDT" : "times in each system's own scale: GPST, GST, BDT"})\n\n`,
      width,
    ),
  );
  const rows: (string | number)[][] = [];
  // Fitted to the width, a sample without a record shows "—" for t_oe and its reason on a line of its own.
  const rowNotes: (string | undefined)[] = [];
  for (const s of result.out) {
    for (const x of s.samples) {
      rowNotes.push(width === undefined ? undefined : x.reason);
      const row: (string | number)[] = [
        s.id,
        x.t,
        x.relativisticSeconds === null ? '—' : (x.relativisticSeconds * 1e9).toFixed(4),
        x.clockCorrectionSeconds === null ? '—' : x.clockCorrectionSeconds.toExponential(12),
      ];
      if (signal) {
        row.push(
          x.clockCorrectionSignalSeconds == null ? '—' : x.clockCorrectionSignalSeconds.toExponential(12),
          x.groupDelaySeconds == null ? '—' : `${(x.groupDelaySeconds * 1e9).toFixed(4)} ${x.groupDelayField}`,
        );
      }
      row.push(x.toe ?? (width === undefined ? (x.reason ?? '') : '—'), x.message ?? '');
      rows.push(row);
    }
  }
  const headers = [
    'sat',
    't',
    'Δt_r (ns)',
    'Δt_sv (s)',
    ...(signal ? [`Δt_sv ${signal} (s)`, 'group delay (ns)'] : []),
    't_oe',
    'message',
  ];
  io.out(fitTable(headers, rows, { width, notes: rowNotes, below: [headers.length - 2, headers.length - 1] }));
  const skipped = [...nav.skipped].map(([reason, n]) => ({ reason, count: n }));
  const text: string[] = [];
  if (result.samplesWithoutRecord > 0)
    text.push(`\n${result.samplesWithoutRecord} sample(s) without a valid record (shown as —).\n`);
  text.push(`\nNavigation files (header parameters as broadcast):\n${navHeaderLines(nav.files).join('\n')}\n`);
  if (skipped.length > 0)
    text.push(`\nSkipped records:\n${skipped.map((s) => `  ${s.count} × ${s.reason}`).join('\n')}\n`);
  if (result.notes.size > 0) text.push(`\nNotes:\n${[...result.notes].map((n) => `  ${n}`).join('\n')}\n`);
  text.push(`\n${FLIGHT_CAUTION}\n`);
  io.out(wrapLines(text.join(''), width));
}
