// Element fixtures built by calling the SDK on its bundled examples (packages/sdk/examples/*: steering scenarios,
// review documents, a clock phase record; invented satellites, see their SOURCE.md), so the elements are tested
// against what the SDK really produces.

import { parsePhaseText } from '@tauline/sdk/io';
import { parseReviewInput, type ReviewReport, reviewOffsets } from '@tauline/sdk/review';
import { analyzeStability, type StabilityRow } from '@tauline/sdk/stability';
import {
  type ClockOffsetEstimate,
  planSteering,
  type RevisedSteeringPlanJson,
  replanSteering,
  type SteeringPlanJson,
  type SteeringScenario,
  steeringPlanToJson,
} from '@tauline/sdk/steering';

export type ExampleName = 'orin-3-meo' | 'halcyr-g1-geo';

const scenarios = new Map<ExampleName, Promise<SteeringScenario>>();

/** The bundled example scenario `name` (a fresh copy each call). */
export async function exampleScenario(name: ExampleName): Promise<SteeringScenario> {
  let pending = scenarios.get(name);
  if (!pending) {
    pending = fetch(new URL(`../../sdk/examples/steering/${name}.json`, import.meta.url)).then(async (r) => {
      if (!r.ok) throw new Error(`cannot load the ${name} example: HTTP ${r.status}`);
      return (await r.json()) as SteeringScenario;
    });
    scenarios.set(name, pending);
  }
  return structuredClone(await pending);
}

const plans = new Map<string, { plan: SteeringPlanJson; scenario: SteeringScenario }>();

/**
 * `steeringPlanToJson(planSteering(scenario))` (the JSON form the element takes) on the bundled example
 * `name`, after `edit` (a variant of the example, e.g. a larger initial phase offset); a fresh deep copy
 * each call, so a test may change it.
 */
export async function examplePlan(
  name: ExampleName,
  edit?: { key: string; apply: (s: SteeringScenario) => void },
): Promise<{ plan: SteeringPlanJson; scenario: SteeringScenario }> {
  const key = `${name}|${edit?.key ?? ''}`;
  let hit = plans.get(key);
  if (!hit) {
    const scenario = await exampleScenario(name);
    edit?.apply(scenario);
    hit = { plan: steeringPlanToJson(planSteering(scenario)), scenario };
    plans.set(key, hit);
  }
  return structuredClone(hit);
}

/** ORIN-3 (optimal planner): three frequency steps, the third one cancelling the day-4 manoeuvre. */
export function orinPlan(): Promise<{ plan: SteeringPlanJson; scenario: SteeringScenario }> {
  return examplePlan('orin-3-meo');
}

/**
 * HALCYR-G1 (deadband, phase steps allowed) started 40 ns off: the planner removes the offset with a
 * phase step, then cancels the frequency offset, so the plan holds both command kinds.
 */
export function halcyrPhasePlan(): Promise<{ plan: SteeringPlanJson; scenario: SteeringScenario }> {
  return examplePlan('halcyr-g1-geo', {
    key: 'phase-40ns',
    apply: (s) => {
      s.clock.phaseSeconds = 40e-9;
    },
  });
}

/** Two invented ground estimates of ORIN-3's offset (seconds since the epoch, seconds, seconds). */
export const ORIN_ESTIMATES: readonly ClockOffsetEstimate[] = [
  { tSeconds: 20_000, phaseSeconds: 4e-9, sigmaSeconds: 3e-10 },
  { tSeconds: 60_000, phaseSeconds: 5e-9, sigmaSeconds: 3e-10 },
];

/** ORIN-3's plan revised by `replanSteering` at 61 200 s (17:00 UTC on day 1) with {@link ORIN_ESTIMATES}, in JSON form. */
export async function orinRevision(): Promise<{
  plan: SteeringPlanJson;
  revised: RevisedSteeringPlanJson;
  scenario: SteeringScenario;
}> {
  const scenario = await exampleScenario('orin-3-meo');
  const plan = planSteering(scenario);
  const revised = replanSteering(scenario, plan, ORIN_ESTIMATES, 61_200);
  return { plan: steeringPlanToJson(plan), scenario, revised: steeringPlanToJson(revised) };
}

/** Elapsed seconds from `epoch` to `stamp` by `Date.parse` (independent of the elements; no leap second between them). */
export function secondsFrom(epoch: string, stamp: string): number {
  return (Date.parse(stamp) - Date.parse(epoch)) / 1000;
}

/** A plan stamp as the element's table prints it: `2027-02-08T05:10:00Z` → `2027-02-08 05:10:00 UTC`. */
export function tableStamp(stamp: string): string {
  return stamp.replace('T', ' ').replace(/(\.\d+)?Z$/, ' UTC');
}

/** Collects warnings instead of logging them (tests must not log). */
export async function captureWarnings(): Promise<{
  list: Array<{ code: string; message: string }>;
  restore: () => void;
}> {
  const { setWarningHandler } = await import('../src/internal/warn.js');
  const list: Array<{ code: string; message: string }> = [];
  const previous = setWarningHandler((code, message) => list.push({ code, message }));
  return { list, restore: () => setWarningHandler(previous) };
}

/** `reviewOffsets(parseReviewInput(document))` on the bundled review example `name` (packages/sdk/examples/review/). */
export async function exampleReview(name: 'kestrel-block-a' | 'kestrel-block-b-mistakes'): Promise<ReviewReport> {
  const r = await fetch(new URL(`../../sdk/examples/review/${name}.review.json`, import.meta.url));
  if (!r.ok) throw new Error(`cannot load the ${name} review example: HTTP ${r.status}`);
  return reviewOffsets(parseReviewInput(await r.json()));
}

/**
 * `analyzeStability` (OADEV and TDEV) of the bundled VESTRA-4 phase record (packages/sdk/examples/clock/, 4032 samples
 * every 300 s, read with `parsePhaseText`): the SDK's rows, as the stability plot receives them.
 */
export async function vestraStabilityRows(): Promise<readonly StabilityRow[]> {
  const r = await fetch(new URL('../../sdk/examples/clock/vestra-4-rafs.txt', import.meta.url));
  if (!r.ok) throw new Error(`cannot load the VESTRA-4 example: HTTP ${r.status}`);
  const series = parsePhaseText(await r.text(), { sourceName: 'vestra-4-rafs.txt' });
  return analyzeStability({ phase: series.phase, tau0: series.tau0 ?? 300 }, { statistics: ['oadev', 'tdev'] }).rows;
}
