/**
 * The worker pool of `tauline simulate`: the runs of each strategy are split into contiguous ranges,
 * one per worker thread (simulate-worker.ts), and the parts combined with `combineMonteCarloParts`.
 * Every run draws from its own random stream selected by (seed, run index), so the output is the
 * same, byte for byte, for any number of workers.
 */
import { existsSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { MonteCarloPart, SteeringCommandJson } from '@tauline/sdk/steering';
import type { LeapSecondTable } from '@tauline/sdk/time';
import type { SimulateTask } from './simulate-worker.js';

/** Simulated (run × grid-epoch) steps per strategy from which the pool is used without --workers (about 0.1 s of work on one core). */
export const AUTO_POOL_STEPS = 5_000_000;

/** Largest --workers. */
export const MAX_WORKERS = 64;

/**
 * The built worker script: next to this module in dist/, or packages/cli/dist/ when this module
 * runs from the sources (the tests); undefined when neither exists (then the runs stay in-process,
 * with the same output).
 */
export function workerScript(): URL | undefined {
  for (const rel of ['./simulate-worker.js', '../dist/simulate-worker.js']) {
    const url = new URL(rel, import.meta.url);
    if (existsSync(fileURLToPath(url))) return url;
  }
  return undefined;
}

/**
 * How many workers to use: `requested` (--workers) when given; otherwise, when the work is at least
 * AUTO_POOL_STEPS, one per free core, free cores being the available cores less the 1-minute load
 * average, rounded (on a machine already busy with other work extra threads only add overhead);
 * else 1 (in-process). Never more workers than runs.
 */
export function workerCount(requested: number | undefined, runs: number, gridEpochs: number): number {
  const [oneMinuteLoad = 0] = loadavg();
  const free = Math.max(1, Math.min(availableParallelism(), Math.round(availableParallelism() - oneMinuteLoad)));
  const n = requested ?? (runs * gridEpochs >= AUTO_POOL_STEPS ? free : 1);
  return Math.min(n, runs);
}

/** What every range of one strategy shares. */
export interface PoolJob {
  scenario: unknown;
  commands: SteeringCommandJson[];
  seed: number;
  runs: number;
  leapSeconds?: LeapSecondTable;
}

type Reply = { id: number; progress?: number; part?: MonteCarloPart; error?: string };

/** A fixed set of worker threads, reused for every strategy of one command; `close()` ends them. */
export class SimulatePool {
  private readonly workers: Worker[];
  private nextId = 0;

  constructor(script: URL, size: number) {
    this.workers = Array.from({ length: size }, () => new Worker(script));
  }

  /**
   * Flies `job.runs` runs split into one contiguous range per worker; resolves with the parts in run order.
   * @param onProgress  Called with (runs done over all workers, job.runs).
   */
  run(job: PoolJob, onProgress?: (done: number, total: number) => void): Promise<MonteCarloPart[]> {
    const n = Math.min(this.workers.length, job.runs);
    let done = 0;
    const tasks = this.workers.slice(0, n).map((worker, w) => {
      const firstRun = Math.floor((w * job.runs) / n);
      const runCount = Math.floor(((w + 1) * job.runs) / n) - firstRun;
      const task: SimulateTask = {
        id: this.nextId++,
        scenario: job.scenario,
        commands: job.commands,
        seed: job.seed,
        firstRun,
        runCount,
        ...(job.leapSeconds ? { leapSeconds: job.leapSeconds } : {}),
      };
      return new Promise<MonteCarloPart>((resolve, reject) => {
        let reported = 0;
        const onError = (error: Error): void => {
          worker.off('message', onMessage);
          reject(error);
        };
        const onMessage = (reply: Reply): void => {
          if (reply.id !== task.id) return;
          if (reply.progress !== undefined) {
            reported += reply.progress;
            done += reply.progress;
            onProgress?.(done, job.runs);
            return;
          }
          worker.off('message', onMessage);
          worker.off('error', onError);
          if (reply.error !== undefined || reply.part === undefined) {
            reject(new Error(`simulation worker: ${reply.error ?? 'a final reply without its part'}`));
            return;
          }
          done += runCount - reported;
          onProgress?.(done, job.runs);
          resolve(reply.part);
        };
        worker.on('message', onMessage);
        worker.once('error', onError);
        worker.postMessage(task);
      });
    });
    return Promise.all(tasks);
  }

  /** Ends the worker threads. */
  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
