/**
 * Reading RINEX navigation files for the commands that evaluate broadcast orbits and clocks
 * (`broadcast`, `precise --nav`): streamed, bounded by a window, with a byte progress bar on a terminal.
 */
import { statSync } from 'node:fs';
import { type RinexNavEphemeris, readRinexNav } from '@tauline/sdk/io';
import { type KeplerianSystem, SYSTEM_TIME_SCALE } from '@tauline/sdk/orbit';
import type { Instant, TimeScale } from '@tauline/sdk/time';
import { MAX_NAVIGATION_BYTES, requireRegularFile, STANDARD_INPUT, sourceLabel, textChunks } from './files.js';
import { type Io, progressBar, UsageError } from './framework.js';
import { type NavFileSummary, summariseNavHeader } from './nav-summary.js';

/** Input size above which a progress bar is drawn on a terminal, in bytes. */
export const PROGRESS_BYTES = 4 * 1024 * 1024;

/** A progress bar over the bytes read, drawn only on a terminal and for inputs above {@link PROGRESS_BYTES}. */
export function progress(io: Io, label: string, totalBytes: number): { add: (n: number) => void; finish: () => void } {
  const bar = io.isTty && totalBytes > PROGRESS_BYTES ? progressBar(io, label) : undefined;
  let done = 0;
  return {
    add(n) {
      if (!bar) return;
      done += n;
      bar.update(done, totalBytes);
    },
    finish() {
      bar?.finish();
    },
  };
}

/**
 * Streams a file (or standard input for `-`) as UTF-8 chunks, reporting each chunk's size to `onChunk`;
 * a pipe, device, directory, binary content or more than `maxBytes` is refused (see `textChunks`).
 */
export function fileChunks(
  path: string,
  what: string,
  onChunk: (bytes: number) => void,
  maxBytes?: number,
): AsyncGenerator<string> {
  return textChunks(path, what, { onChunk, ...(maxBytes !== undefined ? { maxBytes } : {}) });
}

/** Total size of the files, in bytes (standard input counts as 0: its size is unknown). */
export function totalSize(paths: readonly string[]): number {
  return paths.reduce((sum, p) => sum + (p === STANDARD_INPUT ? 0 : statSync(p).size), 0);
}

/** Name of each system's own time scale as printed. */
export const SYSTEM_SCALE_LABEL: Record<KeplerianSystem, string> = { G: 'GPST', E: 'GST', C: 'BDT' };
/** The file time-system code of each system's scale, for the SDK's `formatFileEpoch` (GST is `GAL` in RINEX). */
export const SYSTEM_FILE_CODE: Readonly<Record<KeplerianSystem, string>> = { G: 'GPS', E: 'GAL', C: 'BDT' };
/** The SDK time-scale id of each system's scale (the SDK's own table). */
export const SYSTEM_SCALE: Readonly<Record<KeplerianSystem, TimeScale>> = SYSTEM_TIME_SCALE;

/** Whether the SDK models a system's broadcast orbit and clock (GPS, Galileo, BeiDou), by its RINEX letter. */
export function isModelledSystem(system: string): system is KeplerianSystem {
  return system === 'G' || system === 'E' || system === 'C';
}

/** Result of {@link loadNavigation}. */
export interface LoadedNavigation {
  /** Kept records by satellite. */
  readonly records: Map<string, RinexNavEphemeris[]>;
  /** Skipped records, counted by reason. */
  readonly skipped: Map<string, number>;
  /** Records of modelled systems not kept because their fit interval lies outside the window. */
  readonly outsideWindow: number;
  /** The same, by satellite. */
  readonly outsideWindowBySatellite: ReadonlyMap<string, number>;
  readonly leapSeconds: number | undefined;
  /** Header parameters of each file, in the order read. */
  readonly files: readonly NavFileSummary[];
}

/** The instants a command needs records for, per system (a reading of each system's own scale may differ). */
export type NavigationWindow = (system: KeplerianSystem) => { readonly from: Instant; readonly to: Instant };

/**
 * Streams navigation files and keeps only the records a window needs: satellites in `filter`
 * (all when undefined) whose fit interval [t_oe − fit/2, t_oe + fit/2] overlaps [from, to] (instants).
 * Memory is bounded by the window, not by the files.
 */
export async function loadNavigation(
  paths: readonly string[],
  io: Io,
  window: NavigationWindow,
  filter: ReadonlySet<string> | undefined,
): Promise<LoadedNavigation> {
  const records = new Map<string, RinexNavEphemeris[]>();
  const skipped = new Map<string, number>();
  let outsideWindow = 0;
  const outsideWindowBySatellite = new Map<string, number>();
  let leapSeconds: number | undefined;
  const files: NavFileSummary[] = [];
  for (const path of paths) await requireRegularFile(path, 'a RINEX navigation file', MAX_NAVIGATION_BYTES);
  if (paths.filter((p) => p === STANDARD_INPUT).length > 1)
    throw new UsageError('- (standard input) can be read once only; give it once');
  const bar = progress(io, 'reading navigation data', totalSize(paths));
  try {
    for (const path of paths) {
      for await (const ev of readRinexNav(fileChunks(path, 'a RINEX navigation file', bar.add, MAX_NAVIGATION_BYTES), {
        sourceName: sourceLabel(path),
      })) {
        if (ev.kind === 'header') {
          leapSeconds ??= ev.header.leapSeconds?.current;
          files.push(summariseNavHeader(path, ev.header));
        } else if (ev.kind === 'skipped') {
          if (filter && ev.record.satellite && !filter.has(ev.record.satellite)) continue;
          skipped.set(ev.record.reason, (skipped.get(ev.record.reason) ?? 0) + 1);
        } else {
          const eph = ev.ephemeris;
          if (filter && !filter.has(eph.satellite)) continue;
          const w = window(eph.system);
          const half = eph.fitIntervalSeconds / 2;
          if (eph.toe.plus(half).isBefore(w.from) || eph.toe.plus(-half).isAfter(w.to)) {
            outsideWindow++;
            outsideWindowBySatellite.set(eph.satellite, (outsideWindowBySatellite.get(eph.satellite) ?? 0) + 1);
            continue;
          }
          let list = records.get(eph.satellite);
          if (!list) records.set(eph.satellite, (list = []));
          list.push(eph);
        }
      }
    }
  } finally {
    bar.finish();
  }
  return { records, skipped, outsideWindow, outsideWindowBySatellite, leapSeconds, files };
}
