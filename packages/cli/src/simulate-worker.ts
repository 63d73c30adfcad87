/**
 * Worker thread of `tauline simulate`: flies one contiguous range of Monte Carlo runs per task
 * (`simulatePlanRuns`) and posts the part back, with progress messages on the way. Started by
 * simulate-pool.ts from the built CLI (dist/simulate-worker.js).
 */
import { parentPort } from 'node:worker_threads';
import { type SteeringCommandJson, simulatePlanRuns, steeringCommandsFromJson } from '@tauline/sdk/steering';
import { createTimeScales, type LeapSecondTable } from '@tauline/sdk/time';

/** One task: the runs firstRun … firstRun + runCount − 1 of a plan, its commands in JSON form (ISO 8601 UTC). */
export interface SimulateTask {
  id: number;
  scenario: unknown;
  commands: SteeringCommandJson[];
  seed: number;
  firstRun: number;
  runCount: number;
  leapSeconds?: LeapSecondTable;
}

/** Runs between two progress messages (a message per run would cost more than the run). */
const PROGRESS_EVERY = 50;

const port = parentPort; // null when this file is not run as a worker: then it does nothing
port?.on('message', (task: SimulateTask) => {
  try {
    const scales = task.leapSeconds ? { timeScales: createTimeScales(task.leapSeconds) } : {};
    const part = simulatePlanRuns(
      task.scenario,
      { commands: steeringCommandsFromJson(task.commands, { ...scales, field: 'plan.commands' }) },
      {
        seed: task.seed,
        firstRun: task.firstRun,
        runCount: task.runCount,
        ...scales,
        onProgress: (done) => {
          if (done % PROGRESS_EVERY === 0) port.postMessage({ id: task.id, progress: PROGRESS_EVERY });
        },
      },
    );
    port.postMessage({ id: task.id, part }, [
      part.insideByEpoch.buffer as ArrayBuffer,
      part.alwaysInsideByRun.buffer as ArrayBuffer,
      part.worstByRunSeconds.buffer as ArrayBuffer,
    ]);
  } catch (error) {
    port.postMessage({
      id: task.id,
      error: error instanceof Error ? `${error.name}: ${error.message}` : String(error),
    });
  }
});
