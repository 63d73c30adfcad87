/**
 * Thin run-time guard of the steering data contract: the element's `plan` and `scenario` are typed
 * with the SDK's own types (the plan's JSON form `SteeringPlanJson` from `steeringPlanToJson`, which a
 * dashboard receives from its server; `SteeringScenario`, `SteeringCommandJson`, `ClockOffsetEstimate`;
 * `import type`, so no SDK code is bundled for them), and this guard checks at
 * run time only the fields the element reads, stopping at the first wrong one and naming it
 * (dotted path, the value received, what was expected). Each field name appears once here, so a
 * rename in the SDK is a one-line change. Pure, no DOM; never throws out of {@link guardPlan}.
 *
 * @module
 */
import type {
  ClockOffsetEstimate,
  SteeringCommandJson,
  SteeringPlanJson,
  SteeringScenario,
} from '@tauline/sdk/steering';

/** A column of numbers: the SDK's `number[]`, or a typed array (used without copying, for large series). */
export type NumberColumn = readonly number[] | Float64Array;

/** `predicted.steered` / `predicted.unsteered` with columns that may be typed arrays. */
export interface PredictedColumns {
  readonly phaseSeconds: NumberColumn;
  readonly sigmaSeconds: NumberColumn;
}

/**
 * What `plan` accepts: the SDK's {@link SteeringPlanJson} (`steeringPlanToJson(planSteering(...))`), whose prediction columns may also be
 * `Float64Array`s (a 10^6-point prediction is then drawn without a copy).
 */
export type SteeringPlanInput =
  | SteeringPlanJson
  | (Omit<SteeringPlanJson, 'predicted'> & {
      readonly predicted: {
        readonly t: NumberColumn;
        readonly steered: PredictedColumns;
        readonly unsteered: PredictedColumns;
      };
    });

/** The first field that breaks the contract. */
export interface ContractFailure {
  /** Dotted path from the property, e.g. `plan.commands[2].executeAt`. */
  readonly path: string;
  /** The value found there. */
  readonly received: unknown;
  /** What the SDK contract expects there. */
  readonly expected: string;
}

/** One line naming the field, the value and the expectation. */
export function describeFailure(f: ContractFailure): string {
  return `${f.path} must be ${f.expected}; received ${show(f.received)}`;
}

function show(v: unknown): string {
  if (typeof v === 'string') return JSON.stringify(v.length > 60 ? `${v.slice(0, 57)}...` : v);
  if (typeof v === 'number' || typeof v === 'boolean' || v === null || v === undefined) return String(v);
  if (Array.isArray(v)) return `an array of ${v.length}`;
  if (ArrayBuffer.isView(v)) return `a ${v.constructor.name}`;
  return typeof v;
}

/** Thrown inside the guard only; turned into a {@link ContractFailure} by the callers below. */
class Mismatch {
  readonly failure: ContractFailure;
  constructor(failure: ContractFailure) {
    this.failure = failure;
  }
}

type Obj = Readonly<Record<string, unknown>>;

function fail(path: string, received: unknown, expected: string): never {
  throw new Mismatch({ path, received, expected });
}

function object(v: unknown, path: string, expected = 'an object'): Obj {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) fail(path, v, expected);
  return v as Obj;
}

function string(v: unknown, path: string): string {
  if (typeof v !== 'string') fail(path, v, 'a string');
  return v;
}

/** An ISO 8601 stamp of the JSON form; an object there is most likely the plan object's Instant, so the message says how to convert. */
function stampText(v: unknown, path: string): string {
  if (typeof v !== 'string')
    fail(
      path,
      v,
      typeof v === 'object' && v !== null
        ? 'a string (pass steeringPlanToJson(plan), not the plan object)'
        : 'a string',
    );
  return v;
}

function number(v: unknown, path: string, unit: string): number {
  if (typeof v !== 'number') fail(path, v, `a number (${unit})`);
  return v;
}

function array(v: unknown, path: string): readonly unknown[] {
  if (!Array.isArray(v)) fail(path, v, 'an array');
  return v;
}

/** A column as Float64Array (typed arrays as they are; plain arrays converted once) of length `n` when given. */
function column(v: unknown, path: string, n?: number): Float64Array {
  const col = v instanceof Float64Array ? v : Array.isArray(v) ? Float64Array.from(v, Number) : null;
  if (!col) fail(path, v, 'an array of numbers (seconds)');
  if (n !== undefined && col.length !== n) fail(path, v, `${n} values (as many as plan.predicted.t)`);
  return col;
}

function command(v: unknown, path: string): SteeringCommandJson {
  const c = object(v, path, 'a SteeringCommandJson object');
  stampText(c.uplinkAt, `${path}.uplinkAt`);
  stampText(c.executeAt, `${path}.executeAt`);
  const kind = c.kind;
  if (kind !== 'frequency' && kind !== 'phase') fail(`${path}.kind`, kind, '"frequency" or "phase"');
  if (kind === 'frequency') number(c.fractionalFrequencyStep, `${path}.fractionalFrequencyStep`, 'dimensionless');
  else number(c.phaseStepSeconds, `${path}.phaseStepSeconds`, 's');
  number(c.actuatorSteps, `${path}.actuatorSteps`, 'actuator steps');
  string(c.reason, `${path}.reason`);
  return c as unknown as SteeringCommandJson;
}

/** The plan's columns, checked for type and length (values may still be non-finite: see `invalid`). */
export interface PlanColumns {
  t: Float64Array;
  steered: Float64Array;
  steeredSigma: Float64Array;
  unsteered: Float64Array;
  unsteeredSigma: Float64Array;
}

/** The guarded plan and scenario: the SDK objects, with the columns as Float64Array. */
export interface GuardedSteering {
  plan: SteeringPlanInput;
  scenario: SteeringScenario;
  columns: PlanColumns;
  commands: readonly SteeringCommandJson[];
}

/** Checks `plan` (a `steeringPlanToJson(planSteering())` result) and `scenario` (its input) field by field, up to the first wrong one. */
export function guardPlan(
  plan: unknown,
  scenario: unknown,
): { ok: true; value: GuardedSteering } | { ok: false; failure: ContractFailure } {
  try {
    const p = object(plan, 'plan', 'the SteeringPlanJson of steeringPlanToJson(planSteering())');
    if (typeof p.feasible !== 'boolean') fail('plan.feasible', p.feasible, 'true or false');
    if (p.reason !== undefined) string(p.reason, 'plan.reason');
    // Plans printed before the JSON named its epoch have none; the scenario's then stands alone.
    if (p.epoch !== undefined) stampText(p.epoch, 'plan.epoch');
    const commands = array(p.commands, 'plan.commands').map((c, k) => command(c, `plan.commands[${k}]`));
    const predicted = object(p.predicted, 'plan.predicted', '{ t, steered, unsteered }');
    const t = column(predicted.t, 'plan.predicted.t');
    const steered = object(predicted.steered, 'plan.predicted.steered', '{ phaseSeconds, sigmaSeconds }');
    const unsteered = object(predicted.unsteered, 'plan.predicted.unsteered', '{ phaseSeconds, sigmaSeconds }');
    const columns: PlanColumns = {
      t,
      steered: column(steered.phaseSeconds, 'plan.predicted.steered.phaseSeconds', t.length),
      steeredSigma: column(steered.sigmaSeconds, 'plan.predicted.steered.sigmaSeconds', t.length),
      unsteered: column(unsteered.phaseSeconds, 'plan.predicted.unsteered.phaseSeconds', t.length),
      unsteeredSigma: column(unsteered.sigmaSeconds, 'plan.predicted.unsteered.sigmaSeconds', t.length),
    };
    object(p.metrics, 'plan.metrics', 'the SteeringMetrics object');
    string(p.caution, 'plan.caution');
    const s = object(scenario, 'scenario', 'the SteeringScenario the plan was made for');
    string(s.epoch, 'scenario.epoch');
    number(object(s.tolerance, 'scenario.tolerance').phaseSeconds, 'scenario.tolerance.phaseSeconds', 's');
    array(s.contacts, 'scenario.contacts').forEach((w, k) => {
      const window = object(w, `scenario.contacts[${k}]`, '{ start, end }');
      string(window.start, `scenario.contacts[${k}].start`);
      string(window.end, `scenario.contacts[${k}].end`);
    });
    if (s.maneuvers !== undefined) {
      array(s.maneuvers, 'scenario.maneuvers').forEach((m, k) => {
        const maneuver = object(m, `scenario.maneuvers[${k}]`, '{ at, semiMajorAxisBefore, semiMajorAxisAfter }');
        string(maneuver.at, `scenario.maneuvers[${k}].at`);
        number(maneuver.semiMajorAxisBefore, `scenario.maneuvers[${k}].semiMajorAxisBefore`, 'm');
        number(maneuver.semiMajorAxisAfter, `scenario.maneuvers[${k}].semiMajorAxisAfter`, 'm');
      });
    }
    // Every field the element reads is checked above; the casts only name the checked objects' SDK types.
    const value: GuardedSteering = {
      plan: p as unknown as SteeringPlanInput,
      scenario: s as unknown as SteeringScenario,
      columns,
      commands,
    };
    return { ok: true, value };
  } catch (error) {
    if (error instanceof Mismatch) return { ok: false, failure: error.failure };
    throw error;
  }
}

/** Checks `superseded` (the SDK's `revision.superseded`) and `estimates` (as given to a re-plan). */
export function guardRevisions(
  superseded: unknown,
  estimates: unknown,
):
  | { ok: true; superseded: readonly SteeringCommandJson[]; estimates: readonly ClockOffsetEstimate[] }
  | { ok: false; failure: ContractFailure } {
  try {
    const commands =
      superseded === undefined || superseded === null
        ? []
        : array(superseded, 'superseded').map((c, k) => command(c, `superseded[${k}]`));
    const list =
      estimates === undefined || estimates === null
        ? []
        : array(estimates, 'estimates').map((e, k) => {
            const o = object(e, `estimates[${k}]`, '{ tSeconds, phaseSeconds, sigmaSeconds }');
            number(o.tSeconds, `estimates[${k}].tSeconds`, 's since the scenario epoch');
            number(o.phaseSeconds, `estimates[${k}].phaseSeconds`, 's');
            number(o.sigmaSeconds, `estimates[${k}].sigmaSeconds`, 's');
            return o as unknown as ClockOffsetEstimate;
          });
    return { ok: true, superseded: commands, estimates: list };
  } catch (error) {
    if (error instanceof Mismatch) return { ok: false, failure: error.failure };
    throw error;
  }
}
