/**
 * Input adapter of `<tauline-steering-schedule>`: reads the planner's output (`planSteering()`
 * in `@tauline/sdk`) and its scenario into columns in seconds since the scenario epoch, ready
 * for scales and decimation. Pure, no DOM; never throws (problems come back as text).
 *
 * @module
 */

/** A steering command as the element uses it (times in seconds since the scenario epoch). */
export interface SteeringCommandView {
  /** Position in `plan.commands`. */
  index: number;
  kind: 'frequency' | 'phase';
  /** Uplink time, s since epoch (NaN when not given). */
  uplinkAt: number;
  /** Execution time, s since epoch. */
  executeAt: number;
  /** Fractional frequency step (kind `frequency`) or phase step in seconds (kind `phase`). */
  step: number;
  /** Integer number of actuator resolution steps (NaN when not given). */
  actuatorSteps: number;
  reason: string;
  /** The command object exactly as given. */
  source: Readonly<Record<string, unknown>>;
}

/** Everything the chart draws, in seconds since `epochMs`. */
export interface PlanView {
  epochMs: number;
  feasible: boolean;
  reason: string | null;
  t: Float64Array;
  steered: Float64Array;
  steeredSigma: Float64Array | null;
  unsteered: Float64Array | null;
  unsteeredSigma: Float64Array | null;
  commands: SteeringCommandView[];
  /** Phase tolerance, seconds (null when the scenario gives none). */
  tolerance: number | null;
  contacts: Array<{ start: number; end: number }>;
  maneuvers: Array<{ at: number; semiMajorAxisBefore: number; semiMajorAxisAfter: number }>;
  metrics: Readonly<Record<string, unknown>> | null;
  /** The plan's caution text (verify before flight use), shown with the table. */
  caution: string | null;
  /** Non-fatal problems (dropped entries), for a one-time warning. */
  problems: string[];
}

/** The outcome: a view, or a fatal problem to show as the error state. */
export type PlanReadResult = { ok: true; view: PlanView } | { ok: false; error: string };

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => v !== null && typeof v === 'object' && !Array.isArray(v);
const isArrayLike = (v: unknown): v is ArrayLike<unknown> =>
  v !== null && typeof v === 'object' && typeof (v as { length?: unknown }).length === 'number';

/** Column as Float64Array: typed arrays are used as they are (no copy), plain arrays converted once. */
function column(v: unknown): Float64Array | null {
  if (v instanceof Float64Array) return v;
  if (!isArrayLike(v)) return null;
  return Float64Array.from(v as ArrayLike<number>, Number);
}

/** Reads a series `{ phaseSeconds, sigmaSeconds }`, or a bare array of phases. */
function readSeries(v: unknown): { phase: Float64Array | null; sigma: Float64Array | null } {
  if (isArrayLike(v)) return { phase: column(v), sigma: null };
  if (!isObj(v)) return { phase: null, sigma: null };
  const phase = column(v['phaseSeconds'] ?? v['phase'] ?? v['offsetSeconds']);
  const sigma = column(v['sigmaSeconds'] ?? v['sigma']);
  return { phase, sigma };
}

function parseTime(v: unknown, epochMs: number): number {
  if (typeof v === 'number') return v; // already seconds since epoch
  if (typeof v !== 'string') return Number.NaN;
  const ms = Date.parse(v);
  return Number.isFinite(ms) ? (ms - epochMs) / 1000 : Number.NaN;
}

/**
 * Reads `plan` (the planner output) and `scenario` (its input). The scenario gives the epoch,
 * the phase tolerance, the contact windows and the manoeuvres; when absent, `plan.scenario`
 * is tried. The prediction is `plan.predicted = { t, steered: { phaseSeconds, sigmaSeconds },
 * unsteered: { phaseSeconds, sigmaSeconds } }` with t in seconds since the epoch, ascending.
 */
export function readPlan(plan: unknown, scenario: unknown): PlanReadResult {
  if (!isObj(plan)) return { ok: false, error: `plan must be the object returned by planSteering(); received ${plan === null ? 'null' : typeof plan}` };
  const scen = isObj(scenario) ? scenario : isObj(plan['scenario']) ? (plan['scenario'] as Obj) : null;
  const epochText = scen?.['epoch'] ?? plan['epoch'];
  const epochMs = typeof epochText === 'string' ? Date.parse(epochText) : typeof epochText === 'number' ? epochText : Number.NaN;
  if (!Number.isFinite(epochMs)) return { ok: false, error: `scenario.epoch must be an ISO 8601 UTC time; received ${JSON.stringify(epochText ?? null)}` };
  const problems: string[] = [];

  const predicted = isObj(plan['predicted']) ? plan['predicted'] : null;
  if (!predicted) return { ok: false, error: 'plan.predicted is missing: expected { t, steered, unsteered }' };
  const t = column(predicted['t'] ?? predicted['timeSeconds']);
  if (!t) return { ok: false, error: 'plan.predicted.t must be an array of seconds since the epoch' };
  const st = readSeries(predicted['steered']);
  const un = readSeries(predicted['unsteered']);
  if (!st.phase) return { ok: false, error: 'plan.predicted.steered.phaseSeconds must be an array of seconds' };
  const n = t.length;
  for (const [name, arr] of [['steered.phaseSeconds', st.phase], ['steered.sigmaSeconds', st.sigma],
    ['unsteered.phaseSeconds', un.phase], ['unsteered.sigmaSeconds', un.sigma]] as const) {
    if (arr && arr.length !== n) return { ok: false, error: `plan.predicted.${name} has ${arr.length} values but t has ${n}` };
  }
  for (let i = 0; i < n; i++) {
    const v = t[i]!;
    if (!Number.isFinite(v)) return { ok: false, error: `plan.predicted.t[${i}] is not a finite number (${v})` };
    if (i > 0 && !(v > t[i - 1]!)) return { ok: false, error: `plan.predicted.t must be strictly ascending; t[${i}] = ${v} follows ${t[i - 1]}` };
  }

  const commands: SteeringCommandView[] = [];
  const rawCommands = plan['commands'];
  if (rawCommands !== undefined && !Array.isArray(rawCommands)) problems.push('plan.commands is not an array: no commands shown');
  (Array.isArray(rawCommands) ? rawCommands : []).forEach((c: unknown, index) => {
    if (!isObj(c)) { problems.push(`plan.commands[${index}] is not an object`); return; }
    const executeAt = parseTime(c['executeAt'], epochMs);
    if (!Number.isFinite(executeAt)) { problems.push(`plan.commands[${index}].executeAt is not a valid time (${String(c['executeAt'])})`); return; }
    const kind = c['kind'] === 'phase' ? 'phase' : 'frequency';
    const step = Number(kind === 'phase' ? c['phaseStepSeconds'] : c['fractionalFrequencyStep']);
    commands.push({
      index, kind, executeAt, step,
      uplinkAt: parseTime(c['uplinkAt'], epochMs),
      actuatorSteps: typeof c['actuatorSteps'] === 'number' ? c['actuatorSteps'] : Number.NaN,
      reason: typeof c['reason'] === 'string' ? c['reason'] : '',
      source: c,
    });
  });
  commands.sort((a, b) => a.executeAt - b.executeAt);

  const tol = scen && isObj(scen['tolerance']) ? Number((scen['tolerance'] as Obj)['phaseSeconds']) : Number.NaN;
  const contacts: PlanView['contacts'] = [];
  const rawContacts = scen?.['contacts'];
  (Array.isArray(rawContacts) ? rawContacts : []).forEach((w: unknown, k) => {
    const start = isObj(w) ? parseTime(w['start'], epochMs) : Number.NaN;
    const end = isObj(w) ? parseTime(w['end'], epochMs) : Number.NaN;
    if (Number.isFinite(start) && Number.isFinite(end) && end > start) contacts.push({ start, end });
    else problems.push(`scenario.contacts[${k}] needs start < end as ISO times`);
  });
  const maneuvers: PlanView['maneuvers'] = [];
  const rawManeuvers = scen?.['maneuvers'];
  (Array.isArray(rawManeuvers) ? rawManeuvers : []).forEach((m: unknown, k) => {
    const at = isObj(m) ? parseTime(m['at'], epochMs) : Number.NaN;
    if (!Number.isFinite(at)) { problems.push(`scenario.maneuvers[${k}].at is not a valid time`); return; }
    const mo = m as Obj;
    maneuvers.push({ at, semiMajorAxisBefore: Number(mo['semiMajorAxisBefore']), semiMajorAxisAfter: Number(mo['semiMajorAxisAfter']) });
  });

  return {
    ok: true,
    view: {
      epochMs,
      feasible: plan['feasible'] !== false,
      reason: typeof plan['reason'] === 'string' ? plan['reason'] : null,
      t, steered: st.phase, steeredSigma: st.sigma, unsteered: un.phase, unsteeredSigma: un.sigma,
      commands,
      tolerance: Number.isFinite(tol) && tol > 0 ? tol : null,
      contacts, maneuvers,
      metrics: isObj(plan['metrics']) ? plan['metrics'] : null,
      caution: typeof plan['caution'] === 'string' ? plan['caution'] : null,
      problems,
    },
  };
}

/** Linear interpolation of y at x (x ascending); NaN outside the data. */
export function interpolate(x: Float64Array, y: Float64Array, at: number): number {
  const n = x.length;
  if (n === 0 || at < x[0]! || at > x[n - 1]!) return Number.NaN;
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (x[mid]! <= at) lo = mid; else hi = mid;
  }
  const x0 = x[lo]!, x1 = x[hi]!;
  if (x1 === x0) return y[lo]!;
  return y[lo]! + ((y[hi]! - y[lo]!) * (at - x0)) / (x1 - x0);
}
