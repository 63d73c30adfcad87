/**
 * The JSON form of a steering plan: the same plan with every {@link Instant} printed as ISO 8601
 * UTC text (`...Z`, to the millisecond, whole seconds without a fraction, `:60` inside a leap
 * second), the scenario epoch among them as `epoch`, the origin of every relative time. It is the
 * `tauline plan --json` output and what the elements take; its field names and order are a contract.
 * `steeringCommandsFromJson` reads commands back.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { requireArray, requireFinite, requireInteger, requireRecord } from '../internal/validate.js';
import { requireInstant } from '../time/instant.js';
import type { TimeScales } from '../time/scales-types.js';
import { formatUtcMilliseconds } from '../time/utc-text.js';
import type { Dimensionless, Seconds } from '../units.js';
import type { InfeasibilityCode, SteeringCommand, SteeringMetrics, SteeringPlan } from './plan.js';
import type { PlanRevision, RevisedSteeringPlan } from './replan.js';
import { parseUtcStamp, resolveTimeScales, type TimeScaleOptions } from './utc-stamps.js';

/** A command in JSON: as {@link SteeringCommand}, its times ISO 8601 UTC text. */
export interface SteeringCommandJson {
  /** When the command is sent, ISO 8601 UTC (e.g. `2027-02-08T05:10:00Z`, `...:00.250Z`, `...23:59:60Z`). */
  uplinkAt: string;
  /** When the satellite executes it, ISO 8601 UTC. */
  executeAt: string;
  kind: 'frequency' | 'phase';
  /** Fractional frequency step (dimensionless), for `frequency` commands. */
  fractionalFrequencyStep?: Dimensionless;
  /** Phase step, in seconds, for `phase` commands. */
  phaseStepSeconds?: Seconds;
  /** The step as an integer number of actuator resolution steps. */
  actuatorSteps: number;
  /** Why the command is there, in plain language. */
  reason: string;
}

/**
 * A plan in JSON (fields in this order): as {@link SteeringPlan}, `epoch` as ISO 8601 UTC text (its
 * relative times stay elapsed SI seconds since it), commands as {@link SteeringCommandJson}.
 */
export interface SteeringPlanJson {
  feasible: boolean;
  /** The scenario epoch, ISO 8601 UTC: `predicted.t`, `settledAfterSeconds` and a revision's `nowSeconds` count from it. */
  epoch: string;
  commands: SteeringCommandJson[];
  predicted: SteeringPlan['predicted'];
  metrics: SteeringMetrics;
  caution: string;
  reason?: string;
  reasonCode?: InfeasibilityCode;
}

/** A revision in JSON: as {@link PlanRevision}, its commands as {@link SteeringCommandJson}. */
export interface PlanRevisionJson extends Omit<PlanRevision, 'executed' | 'superseded'> {
  executed: SteeringCommandJson[];
  superseded: SteeringCommandJson[];
}

/** A revised plan in JSON: {@link SteeringPlanJson} then its `revision`. */
export interface RevisedSteeringPlanJson extends SteeringPlanJson {
  revision: PlanRevisionJson;
}

/** The time scales and a field-checked printer of instants, for one conversion. */
export interface JsonWriter {
  ts: TimeScales;
  /** ISO 8601 UTC text of the Instant at `field` (time/utc-text.ts), or a typed error naming the field. */
  stamp(field: string, value: unknown): string;
}

/** A writer for `options.timeScales` (default: the bundled table). */
export function jsonWriter(options: unknown): JsonWriter {
  const ts = resolveTimeScales(options);
  return { ts, stamp: (field, value) => formatUtcMilliseconds(ts, requireInstant(field, value)) };
}

/** A finite number at `field`, for the JSON form. */
const num = (field: string, value: unknown): number => requireFinite(field, value);

/** A string at `field`. */
export function text(field: string, value: unknown): string {
  if (typeof value !== 'string') throw new InvalidArgumentError(field, value, 'a string');
  return value;
}

/** A command in JSON form (field order: uplinkAt, executeAt, kind, step, actuatorSteps, reason), each field checked. */
export function commandToJson(w: JsonWriter, field: string, value: unknown): SteeringCommandJson {
  const c = requireRecord(field, value);
  const kind = c.kind;
  if (kind !== 'frequency' && kind !== 'phase')
    throw new InvalidArgumentError(`${field}.kind`, kind, '"frequency" or "phase"');
  const step =
    kind === 'frequency'
      ? { fractionalFrequencyStep: num(`${field}.fractionalFrequencyStep`, c.fractionalFrequencyStep) }
      : { phaseStepSeconds: num(`${field}.phaseStepSeconds`, c.phaseStepSeconds) };
  return {
    uplinkAt: w.stamp(`${field}.uplinkAt`, c.uplinkAt),
    executeAt: w.stamp(`${field}.executeAt`, c.executeAt),
    kind,
    ...step,
    actuatorSteps: requireInteger(`${field}.actuatorSteps`, c.actuatorSteps),
    reason: text(`${field}.reason`, c.reason),
  };
}

/** An array of finite numbers at `field`, copied. */
function numbers(field: string, value: unknown): number[] {
  return requireArray(field, value).map((v, i) => num(`${field}[${i}]`, v));
}

/** The prediction in JSON (fresh arrays, the same numbers), each column checked. */
export function predictedToJson(field: string, value: unknown): SteeringPlan['predicted'] {
  const p = requireRecord(field, value);
  const series = (name: string) => {
    const s = requireRecord(`${field}.${name}`, p[name]);
    return {
      phaseSeconds: numbers(`${field}.${name}.phaseSeconds`, s.phaseSeconds),
      sigmaSeconds: numbers(`${field}.${name}.sigmaSeconds`, s.sigmaSeconds),
    };
  };
  return { t: numbers(`${field}.t`, p.t), steered: series('steered'), unsteered: series('unsteered') };
}

/** The metrics in JSON, in the contract's field order, each checked. */
export function metricsToJson(field: string, value: unknown): SteeringMetrics {
  const m = requireRecord(field, value);
  const settled = m.settledAfterSeconds;
  return {
    worstPredictedOffsetSeconds: num(`${field}.worstPredictedOffsetSeconds`, m.worstPredictedOffsetSeconds),
    worstOffsetBoundSeconds: num(`${field}.worstOffsetBoundSeconds`, m.worstOffsetBoundSeconds),
    probabilityInTolerance: num(`${field}.probabilityInTolerance`, m.probabilityInTolerance),
    commandCount: requireInteger(`${field}.commandCount`, m.commandCount),
    totalFrequencySteering: num(`${field}.totalFrequencySteering`, m.totalFrequencySteering),
    totalPhaseSteeringSeconds: num(`${field}.totalPhaseSteeringSeconds`, m.totalPhaseSteeringSeconds),
    expectedCost: num(`${field}.expectedCost`, m.expectedCost),
    settledAfterSeconds: settled === null ? null : num(`${field}.settledAfterSeconds`, settled),
  };
}

/** `feasible`, then the optional `reason` / `reasonCode` of a plan record, checked. */
export function verdictOf(field: string, p: Record<string, unknown>): { feasible: boolean; reason?: string } {
  if (typeof p.feasible !== 'boolean') throw new InvalidArgumentError(`${field}.feasible`, p.feasible, 'true or false');
  return { feasible: p.feasible, ...(p.reason !== undefined ? { reason: text(`${field}.reason`, p.reason) } : {}) };
}

function revisionToJson(w: JsonWriter, value: unknown): PlanRevisionJson {
  const r = requireRecord('plan.revision', value);
  const s = requireRecord('plan.revision.state', r.state);
  const commands = (name: string) =>
    requireArray(`plan.revision.${name}`, r[name]).map((c, i) => commandToJson(w, `plan.revision.${name}[${i}]`, c));
  return {
    nowSeconds: num('plan.revision.nowSeconds', r.nowSeconds),
    estimatesUsed: requireInteger('plan.revision.estimatesUsed', r.estimatesUsed, 0),
    state: {
      phaseSeconds: num('plan.revision.state.phaseSeconds', s.phaseSeconds),
      fractionalFrequency: num('plan.revision.state.fractionalFrequency', s.fractionalFrequency),
      driftPerSecond: num('plan.revision.state.driftPerSecond', s.driftPerSecond),
      phaseSigmaSeconds: num('plan.revision.state.phaseSigmaSeconds', s.phaseSigmaSeconds),
      frequencySigma: num('plan.revision.state.frequencySigma', s.frequencySigma),
    },
    executed: commands('executed'),
    superseded: commands('superseded'),
  };
}

/**
 * The JSON form of a plan (or of a revised plan, with its `revision`): every Instant (the epoch
 * included) as ISO 8601 UTC text through the time module, fields in the contract's order. Every field is
 * checked on the way (a plan from the SDK always passes).
 *
 * @param plan     A plan from `planSteering`, `replanSteering` or a replanner.
 * @param options  `timeScales`: the leap-second table the plan was made with (default: bundled,
 *   valid until 2027-06-28); it decides `:60` stamps.
 * @throws {InvalidArgumentError} naming the field (e.g. `plan.commands[1].executeAt`) of a damaged plan, or a bad `options.timeScales`.
 * @throws {OutOfDomainError} for an instant outside the table.
 */
export function steeringPlanToJson(plan: RevisedSteeringPlan, options?: TimeScaleOptions): RevisedSteeringPlanJson;
export function steeringPlanToJson(plan: SteeringPlan, options?: TimeScaleOptions): SteeringPlanJson;
export function steeringPlanToJson(
  plan: SteeringPlan | RevisedSteeringPlan,
  options: TimeScaleOptions = {},
): SteeringPlanJson | RevisedSteeringPlanJson {
  const w = jsonWriter(options);
  const p = requireRecord('plan', plan);
  const { feasible, reason } = verdictOf('plan', p);
  const json: SteeringPlanJson = {
    feasible,
    epoch: w.stamp('plan.epoch', p.epoch),
    commands: requireArray('plan.commands', p.commands).map((c, i) => commandToJson(w, `plan.commands[${i}]`, c)),
    predicted: predictedToJson('plan.predicted', p.predicted),
    metrics: metricsToJson('plan.metrics', p.metrics),
    caution: text('plan.caution', p.caution),
    ...(reason !== undefined ? { reason } : {}),
    ...(p.reasonCode !== undefined ? { reasonCode: text('plan.reasonCode', p.reasonCode) as InfeasibilityCode } : {}),
  };
  return p.revision === undefined ? json : { ...json, revision: revisionToJson(w, p.revision) };
}

/** Options of {@link steeringCommandsFromJson}. */
export interface CommandsFromJsonOptions extends TimeScaleOptions {
  /** Field path of the array, used in errors (default `commands`). */
  field?: string;
}

/** One command read from JSON, each field checked. */
function commandFromJson(ts: TimeScales, f: string, value: unknown): SteeringCommand {
  if (typeof value !== 'object' || value === null || Array.isArray(value))
    throw new InvalidArgumentError(f, value, 'a steering command object { uplinkAt, executeAt, kind, ... }');
  const c = value as Record<string, unknown>;
  const uplinkAt = parseUtcStamp(ts, `${f}.uplinkAt`, c.uplinkAt);
  const executeAt = parseUtcStamp(ts, `${f}.executeAt`, c.executeAt);
  const kind = c.kind;
  if (kind !== 'frequency' && kind !== 'phase')
    throw new InvalidArgumentError(`${f}.kind`, kind, '"frequency" or "phase"');
  const actuatorSteps = requireInteger(`${f}.actuatorSteps`, c.actuatorSteps);
  if (c.reason !== undefined && typeof c.reason !== 'string')
    throw new InvalidArgumentError(`${f}.reason`, c.reason, 'a string (or nothing)');
  const reason = c.reason ?? '';
  if (kind === 'frequency') {
    const step = requireFinite(`${f}.fractionalFrequencyStep`, c.fractionalFrequencyStep, 'a finite fractional step');
    return { uplinkAt, executeAt, kind, fractionalFrequencyStep: step, actuatorSteps, reason };
  }
  const step = requireFinite(`${f}.phaseStepSeconds`, c.phaseStepSeconds, 'a finite phase step in seconds');
  return { uplinkAt, executeAt, kind, phaseStepSeconds: step, actuatorSteps, reason };
}

/**
 * Reads commands in JSON form (as `steeringPlanToJson` prints them, e.g. a plan file's `commands`)
 * into command objects, parsing the stamps with the leap-second table.
 *
 * @param json     An array of {@link SteeringCommandJson}.
 * @param options  `timeScales` (default: bundled table); `field`, the array's path in errors.
 * @throws {InvalidArgumentError} naming the field (e.g. `commands[2].executeAt`), the value and the expected form.
 * @throws {OutOfDomainError} for a stamp outside the leap-second table.
 */
export function steeringCommandsFromJson(json: unknown, options: CommandsFromJsonOptions = {}): SteeringCommand[] {
  const ts = resolveTimeScales(options);
  const field = options.field ?? 'commands';
  if (typeof field !== 'string') throw new InvalidArgumentError('options.field', field, 'a field path string');
  if (!Array.isArray(json)) throw new InvalidArgumentError(field, json, 'an array of steering commands in JSON form');
  return json.map((c: unknown, i) => commandFromJson(ts, `${field}[${i}]`, c));
}
