/**
 * Progress on a terminal for long runs (Monte Carlo, long integrations, big files): one line on
 * standard error, redrawn in place, and nothing at all when standard error is not a terminal (a pipe,
 * a file, a CI log), so that redirected output stays clean.
 */
import type { Io } from './framework.js';

/** A progress indicator: `update(done, total)` as work advances, `finish()` once at the end (clears the line). */
export interface Progress {
  update(done: number, total: number): void;
  finish(): void;
}

/** Bars drawn and not yet finished, per output (so that an error can clear them first: {@link clearProgress}). */
const drawn = new WeakMap<Io, Set<Progress>>();

/** A one-line progress bar on stderr, redrawn in place when the whole percentage changes. Draws whatever `io` is: see {@link startProgress}. */
export function progressBar(io: Io, label: string): Progress {
  let last = -1;
  const bar: Progress = {
    update(done, total) {
      const pct = Math.min(100, Math.floor((100 * done) / total));
      if (pct === last) return;
      last = pct;
      const filled = Math.round(pct / 4);
      io.err(`\r${label} [${'#'.repeat(filled)}${'.'.repeat(25 - filled)}] ${String(pct).padStart(3)} %`);
      let bars = drawn.get(io);
      if (bars === undefined) drawn.set(io, (bars = new Set()));
      bars.add(bar);
    },
    finish() {
      io.err(`\r${' '.repeat(label.length + 35)}\r`);
      drawn.get(io)?.delete(bar);
    },
  };
  return bar;
}

/** Clears every bar still drawn on `io` (a command that failed mid-run), so that the error line starts clean. */
export function clearProgress(io: Io): void {
  for (const bar of [...(drawn.get(io) ?? [])]) bar.finish();
}

const SILENT: Progress = { update() {}, finish() {} };

/**
 * The progress of one long run: a bar on stderr when stderr is a terminal (`io.isTty`) and the run is
 * long (`long`, each command's own measure, e.g. draws × spacecraft above a threshold); otherwise an
 * indicator that prints nothing.
 */
export function startProgress(io: Io, label: string, long: boolean): Progress {
  return io.isTty && long ? progressBar(io, label) : SILENT;
}

/** Runs `body` and finishes `progress` (clearing its line) whether the body returns or throws. */
export function withProgress<T>(progress: Progress, body: () => T): T {
  try {
    return body();
  } finally {
    progress.finish();
  }
}
