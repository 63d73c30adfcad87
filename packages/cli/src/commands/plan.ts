/**
 * `tauline plan <scenario.json>`: when and by how much to steer an onboard clock so that its
 * offset stays inside the tolerance, from a steering scenario file.
 */
import {
  planSteering,
  type SteeringMethod,
  type SteeringPlanJson,
  type SteeringScenario,
  steeringPlanToJson,
} from '@tauline/sdk/steering';
import { LEAP_SECONDS_FLAG, LEAP_SECONDS_HELP, leapSecondsFlag, readScenarioFile, strategyFlag } from '../flags.js';
import {
  type Command,
  EXIT_FINDING,
  EXIT_OK,
  formatFlag,
  formatFlags,
  keyValueTable,
  onePositional,
  optionalFlag,
  TABLE_OR_JSON,
  table,
  toJson,
} from '../framework.js';
import { fitTable, outputWidth, wrapLines } from '../layout.js';
import { nsText, PLAN_UNITS } from '../steering-output.js';

/** A command's step with its sign: fractional for a frequency step, ns for a phase step (the SDK sets the field of the kind). */
function stepText(c: SteeringPlanJson['commands'][number]): string {
  const { fractionalFrequencyStep: frequency, phaseStepSeconds: phase } = c;
  if (c.kind === 'frequency' && frequency !== undefined)
    return `${frequency >= 0 ? '+' : ''}${frequency.toExponential(3)}`;
  if (c.kind === 'phase' && phase !== undefined) return `${phase >= 0 ? '+' : ''}${nsText(phase)}`;
  return '—';
}

/**
 * The human-readable schedule of a plan's JSON form (its stamps as printed), fitted to `width` display columns (undefined: the long form of `--wide`):
 * the command reasons then go under their rows.
 */
export function planToText(
  scenario: SteeringScenario,
  method: string,
  plan: SteeringPlanJson,
  width: number | undefined,
): string {
  const out: string[] = [];
  const tol = scenario.tolerance;
  out.push(
    `${scenario.name ?? 'Steering plan'}: ${method} planner, ${scenario.epoch} + ${(scenario.horizonSeconds / 86_400).toFixed(2)} days`,
  );
  out.push(`Tolerance ±${nsText(tol.phaseSeconds)} at ${tol.probability * 100} % per epoch`);
  const m = plan.metrics;
  const verdict = `smallest per-epoch probability in tolerance ${m.probabilityInTolerance.toFixed(4)} ${plan.feasible ? '≥' : '<'} ${tol.probability}`;
  // The SDK's reason is a clause; as the sentence after the verdict it starts with a capital.
  const reason = (plan.reason ?? '').replace(/^[a-z]/, (c) => c.toUpperCase()); // a leading symbol (σ) stays as it is
  out.push(plan.feasible ? `Feasible: yes (${verdict})` : `Feasible: NO (${verdict}). ${reason}`, '');
  if (plan.commands.length === 0) out.push('No commands.');
  else {
    out.push(
      fitTable(
        ['#', 'uplink (UTC)', 'execute (UTC)', 'kind', 'step (fractional or ns)', 'actuator steps', 'reason'],
        plan.commands.map((c, i) => [i + 1, c.uplinkAt, c.executeAt, c.kind, stepText(c), c.actuatorSteps, c.reason]),
        { width, below: [6], unlabelled: [6] },
      ).trimEnd(),
    );
  }
  out.push(
    '',
    keyValueTable([
      ['worst predicted |mean offset|', nsText(m.worstPredictedOffsetSeconds)],
      [
        'worst |mean| + z·σ',
        `${nsText(m.worstOffsetBoundSeconds)} (tolerance ±${nsText(tol.phaseSeconds)}; a sufficient margin, stricter than the criterion)`,
      ],
      [
        'probability in tolerance',
        `${m.probabilityInTolerance.toFixed(4)} (smallest per-epoch value; the feasibility criterion is ≥ ${tol.probability})`,
      ],
      [
        'holds the tolerance from',
        m.settledAfterSeconds === null
          ? 'never (the last epoch fails)'
          : `${(m.settledAfterSeconds / 86_400).toFixed(2)} days after the epoch`,
      ],
      ['commands', String(m.commandCount)],
      ['total frequency steering', `${m.totalFrequencySteering.toExponential(3)} (fractional)`],
      ['total phase steering', nsText(m.totalPhaseSteeringSeconds)],
      ['expected cost J', m.expectedCost.toFixed(5)],
    ]).trimEnd(),
  );
  const { t, steered, unsteered } = plan.predicted;
  const [t0 = 0, t1 = t0] = t;
  const every = Math.max(1, Math.round(21_600 / (t1 - t0)));
  const ns = (seconds: number | undefined): string => (seconds === undefined ? '—' : (seconds * 1e9).toFixed(3));
  const rows: (string | number)[][] = [];
  for (const [i, ti] of t.entries()) {
    if (i % every !== 0) continue;
    rows.push([
      (ti / 86_400).toFixed(2),
      ns(steered.phaseSeconds[i]),
      ns(steered.sigmaSeconds[i]),
      ns(unsteered.phaseSeconds[i]),
    ]);
  }
  out.push(
    '',
    'Prediction (every 6 h):',
    table(['t (days)', 'steered mean (ns)', '1σ (ns)', 'unsteered mean (ns)'], rows).trimEnd(),
  );
  out.push('', plan.caution, '');
  return wrapLines(out.join('\n'), width);
}

export const planCommand: Command = {
  name: 'plan',
  summary: 'Plan clock-steering commands that keep an onboard clock inside its tolerance.',
  usage: '<scenario.json> [--strategy deadband|optimal|none] [--leap-seconds <file>] [--json | --format table|json]',
  allowPositionals: true,
  flags: {
    strategy: {
      type: 'string',
      value: '<name>',
      description: "Override the scenario's strategy: deadband, optimal (constrained LQ) or none.",
    },
    'leap-seconds': LEAP_SECONDS_FLAG,
    ...formatFlags(TABLE_OR_JSON, {
      json: 'Print the plan as JSON (feasible, epoch, commands, predicted, metrics, caution, reason, units); same as --format json.',
    }),
  },
  details: `
Scenario format: packages/sdk/schema/scenario.schema.json (JSON Schema); times ISO 8601 UTC, quantities SI.
Feasible means the probability that |offset| ≤ tolerance is at least tolerance.probability at every
grid epoch (the "probability in tolerance" printed is the smallest of these per-epoch values), with the
offset normal, its mean predicted from the commands and σ the open-loop prediction from the epoch
covariance and the 3-state clock noise (Zucca & Tavella 2005). "worst |mean| + z·σ" ≤ tolerance,
z = Φ⁻¹((1 + p)/2), is a stricter margin, shown for reference. JSON: reasonCode names the kind of
failure (uncertainty, outside-at-epoch, no-contact-in-time, actuator-limit, unsteered, planner).
Optimal planner: finite-horizon linear-quadratic steering (after Koppang & Leland, IEEE Trans. UFFC
46(3) 1999) whose every step is chosen among the whole actuator steps, inside the step and range
limits, from which a braking manoeuvre still stops the clock without overshooting the opposite
tolerance bound; so a large frequency error is slewed out at the step limit and braked, not rung.
Deadband: act when the predicted offset would use more than a fraction of the usable band before the
next contact (steps limited the same way).
${LEAP_SECONDS_HELP}
Exit status: 0 feasible plan, 1 infeasible (the reason is printed), 2 unusable input.`,
  async run(args, io) {
    const path = onePositional(args, 'scenario file');
    const format = formatFlag(args, TABLE_OR_JSON, 'table');
    const strategy = strategyFlag(optionalFlag(args, 'strategy'), false) as SteeringMethod | undefined;
    const timeScales = await leapSecondsFlag(args);
    const scenario = await readScenarioFile(path);
    const scales = timeScales ? { timeScales } : {};
    const plan = steeringPlanToJson(planSteering(scenario, { ...(strategy ? { strategy } : {}), ...scales }), scales);
    const s = scenario as SteeringScenario;
    if (format === 'json') io.out(toJson({ ...plan, units: PLAN_UNITS }));
    else io.out(planToText(s, strategy ?? s.strategy.method, plan, outputWidth(args)));
    return plan.feasible ? EXIT_OK : EXIT_FINDING;
  },
};
