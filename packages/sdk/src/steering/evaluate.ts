/**
 * Evaluating a given schedule: its expected cost and its predicted offset. Both accept the
 * public plan commands (Instant times; read JSON commands with `steeringCommandsFromJson`), so an
 * edited schedule can be re-checked.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { requireFinite, requireInteger, requireObject } from '../internal/validate.js';
import { Instant } from '../time/instant.js';
import type { Seconds } from '../units.js';
import { type CostBreakdown, expectedCost } from './cost.js';
import type { SteeringCommand, SteeringPlan } from './plan.js';
import { checkTolerance, type InternalCommand, predictedSeries, stateJumps } from './predict.js';
import { type NormalizedScenario, validateScenario } from './scenario.js';
import type { TimeScaleOptions } from './utc-stamps.js';

/** Seconds from the scenario epoch to a command time, which must be an Instant. */
function commandTime(norm: NormalizedScenario, field: string, value: unknown): Seconds {
  if (!(value instanceof Instant)) {
    throw new InvalidArgumentError(
      field,
      value,
      'an Instant (a plan command object; read ISO 8601 JSON commands with steeringCommandsFromJson)',
    );
  }
  return value.secondsSince(norm.epoch);
}

/** Converts public commands to seconds since the scenario epoch, checking each field. */
export function commandsToInternal(
  norm: NormalizedScenario,
  commands: readonly SteeringCommand[],
  field = 'commands',
): InternalCommand[] {
  if (!Array.isArray(commands)) throw new InvalidArgumentError(field, commands, 'an array of steering commands');
  return commands.map((c, i) => {
    const f = `${field}[${i}]`;
    if (typeof c !== 'object' || c === null) throw new InvalidArgumentError(f, c, 'a steering command object');
    const uplinkAt = commandTime(norm, `${f}.uplinkAt`, c.uplinkAt);
    const executeAt = commandTime(norm, `${f}.executeAt`, c.executeAt);
    const steps = requireInteger(`${f}.actuatorSteps`, c.actuatorSteps);
    const amountField =
      c.kind === 'frequency' ? 'fractionalFrequencyStep' : c.kind === 'phase' ? 'phaseStepSeconds' : undefined;
    if (amountField === undefined)
      throw new InvalidArgumentError(`${f}.kind`, (c as { kind?: unknown }).kind, '"frequency" or "phase"');
    const amount = requireFinite(`${f}.${amountField}`, c[amountField]);
    return { uplinkAt, executeAt, kind: c.kind, steps, amount, reason: String(c.reason ?? '') };
  });
}

/**
 * Expected steering cost J of a plan's schedule for a scenario:
 * J = (1/(b²H)) ∫ (m² + σ²) dt + Σ w_f (u/u_max)² + Σ w_p (p/b)² + w_c·N (see cost.ts), the
 * finite-horizon quadratic cost of LQG steering (Koppang & Leland 1999 [V2]) with a
 * per-command charge of our own. Dimensionless; lower is better.
 *
 * @param scenario  The scenario (validated here).
 * @param plan      A plan, or just its `commands`.
 * @param options   `timeScales`: the leap-second table for the UTC stamps (default: bundled, valid until 2027-06-28).
 * @throws {InvalidArgumentError} for an invalid scenario or command field.
 * @throws {OutOfDomainError} for stamps outside the leap-second table (see `validateScenario`).
 */
export function steeringCost(
  scenario: unknown,
  plan: Pick<SteeringPlan, 'commands'>,
  options: TimeScaleOptions = {},
): CostBreakdown {
  const norm = validateScenario(scenario, options);
  requireObject('plan', plan as object, 'a plan object { commands }');
  return expectedCost(norm, commandsToInternal(norm, plan.commands, 'plan.commands'));
}

/** Predicted offset of a schedule (see `predictSteering`). */
export interface SteeringPrediction {
  /** Grid, in elapsed SI seconds since the scenario epoch. */
  t: number[];
  steered: { phaseSeconds: number[]; sigmaSeconds: number[] };
  unsteered: { phaseSeconds: number[]; sigmaSeconds: number[] };
  /** Whether |mean| + z·σ ≤ tolerance at every checked epoch. */
  withinTolerance: boolean;
}

/**
 * Predicts the mean and open-loop 1σ of the offset on the scenario grid for a given schedule:
 * m(t) from the noise-free 3-state model with the commands and manoeuvre rate changes applied,
 * σ(t)² = φ(t)P0φ(t)ᵀ + q1 t + q2 t³/3 + q3 t⁵/20 (Zucca & Tavella 2005; physics-refs §11).
 *
 * @param scenario  The scenario (validated here).
 * @param commands  The schedule (command objects with Instant times, as in a plan; JSON commands
 *   through `steeringCommandsFromJson`).
 * @param options   `timeScales`: the leap-second table for the UTC stamps (default: bundled, valid until 2027-06-28).
 * @throws {InvalidArgumentError} for an invalid scenario or command field.
 * @throws {OutOfDomainError} for stamps outside the leap-second table (see `validateScenario`).
 */
export function predictSteering(
  scenario: unknown,
  commands: readonly SteeringCommand[],
  options: TimeScaleOptions = {},
): SteeringPrediction {
  const norm = validateScenario(scenario, options);
  const jumps = stateJumps(norm, commandsToInternal(norm, commands));
  return { ...predictedSeries(norm, jumps), withinTolerance: checkTolerance(norm, jumps).ok };
}
