/**
 * Input adapter of `<tauline-steering-schedule>`: reads the planner's output (`planSteering()`
 * in `@tauline/sdk`) and its scenario into columns in seconds since the scenario epoch, ready
 * for scales and decimation. Pure, no DOM; never throws (problems come back as text).
 *
 * @module
 */
import { BUNDLED_LEAP_SECONDS, createTimeScales, type TimeScales } from '@tauline/sdk/time';

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
  /** The scenario epoch as milliseconds of the leap-free UTC count (`Date` milliseconds), for labels. */
  epochMs: number;
  /**
   * Chart times (elapsed SI seconds since the epoch) at which a leap second inside the plotted
   * span ends, with its sign (+1 inserted, −1 removed); used by {@link chartTimeToUtcMs}.
   */
  leapSeconds: Array<{ end: number; step: number }>;
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
  /**
   * Data problems that make the drawn plan untrustworthy (non-finite predicted values, a tolerance
   * that is not a positive number): shown as a visible alert in place of the feasibility badge.
   */
  invalid: string[];
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

let timeScales: TimeScales | undefined;
/** The SDK time scales with the bundled leap-second table, built on first use. */
function scales(): TimeScales {
  return (timeScales ??= createTimeScales(BUNDLED_LEAP_SECONDS));
}

const STAMP = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(\.\d+)?(Z|[+-]\d{2}:\d{2})$/;

/**
 * Milliseconds of the leap-free UTC count (the `Date` count) of an ISO 8601 stamp with a zone,
 * read field by field: `23:59:60` is the 86 400th second of its day (the same count as the next
 * midnight), which `Date.parse` refuses. NaN for text that is not such a stamp or has a field
 * out of range. Common practice, no source (ISO 8601 allows second 60 only in a leap second).
 */
export function utcStampMs(text: string): number {
  const m = STAMP.exec(text);
  if (!m) return Number.NaN;
  const [y, mo, d, h, mi, s] = [m[1], m[2], m[3], m[4], m[5], m[6]].map(Number) as [number, number, number, number, number, number];
  if (mo < 1 || mo > 12 || d < 1 || d > new Date(Date.UTC(y, mo, 0)).getUTCDate() || h > 23 || mi > 59 || s > 60) return Number.NaN;
  if (s === 60 && (h !== 23 || mi !== 59) && m[8] === 'Z') return Number.NaN;
  const zone = m[8] === 'Z' ? 0 : (m[8]!.startsWith('-') ? -1 : 1) * (Number(m[8]!.slice(1, 3)) * 60 + Number(m[8]!.slice(4, 6)));
  const fraction = m[7] ? Number(m[7]) : 0;
  return Date.UTC(y, mo - 1, d, h, mi, 0) + s * 1000 + fraction * 1000 - zone * 60_000;
}

/**
 * Elapsed SI seconds from the UTC stamp `epochText` to `text`, leap seconds between them counted
 * (as the planner counts them): through the SDK time module and its bundled leap-second table
 * (`createTimeScales(BUNDLED_LEAP_SECONDS).parseIso`). Outside that table's span, or for text it
 * refuses, falls back to the leap-free count of {@link utcStampMs} (then a leap second after the
 * table's end is not counted: at most 1 s per unknown leap second). NaN for an unreadable stamp.
 */
export function elapsedSecondsBetween(epochText: string, text: string): number {
  try {
    const ts = scales();
    return ts.parseIso(text, 'UTC').secondsSince(ts.parseIso(epochText, 'UTC'));
  } catch {
    const a = utcStampMs(epochText);
    const b = utcStampMs(text);
    return Number.isFinite(a) && Number.isFinite(b) ? (b - a) / 1000 : Number.NaN;
  }
}

/**
 * Leap seconds of the bundled table whose end (00:00:00 UTC of the entry's day) lies in
 * (0, horizon] chart seconds after the epoch; `step` is the change of TAI − UTC (+1 inserted).
 */
function leapSecondsInSpan(epochText: string, horizon: number): Array<{ end: number; step: number }> {
  const out: Array<{ end: number; step: number }> = [];
  const entries = BUNDLED_LEAP_SECONDS.entries;
  for (let k = 1; k < entries.length; k++) {
    const e = entries[k]!;
    const ms = (e.mjd - 40_587) * 86_400_000; // MJD 40587 = 1970-01-01
    const end = elapsedSecondsBetween(epochText, new Date(ms).toISOString().replace('.000Z', 'Z'));
    if (end > 0 && end <= horizon) out.push({ end, step: e.taiMinusUtc - entries[k - 1]!.taiMinusUtc });
  }
  return out;
}

/**
 * Converts a chart time (elapsed SI seconds since the epoch) to `Date` milliseconds for labels:
 * the epoch plus the elapsed time minus the leap seconds already inserted. Inside an inserted
 * leap second the label reads 23:59:59.x (a `Date` cannot show 23:59:60).
 */
export function chartTimeToUtcMs(view: Pick<PlanView, 'epochMs' | 'leapSeconds'>, t: number): number {
  let shift = 0;
  for (const leap of view.leapSeconds) if (t >= leap.end - Math.max(0, leap.step)) shift += leap.step;
  return view.epochMs + (t - shift) * 1000;
}

function parseTime(v: unknown, epochText: string): number {
  if (typeof v === 'number') return v; // already seconds since epoch
  if (typeof v !== 'string') return Number.NaN;
  return elapsedSecondsBetween(epochText, v);
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
  const epochMs = typeof epochText === 'string' ? utcStampMs(epochText) : typeof epochText === 'number' ? epochText : Number.NaN;
  if (!Number.isFinite(epochMs)) return { ok: false, error: `scenario.epoch must be an ISO 8601 UTC time; received ${JSON.stringify(epochText ?? null)}` };
  // Stamps are read against the epoch's own text (leap seconds counted); a numeric epoch (ms) is rendered as a stamp.
  const epochStamp = typeof epochText === 'string' ? epochText : new Date(epochMs).toISOString();
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
    const executeAt = parseTime(c['executeAt'], epochStamp);
    if (!Number.isFinite(executeAt)) { problems.push(`plan.commands[${index}].executeAt is not a valid time (${String(c['executeAt'])})`); return; }
    const kind = c['kind'] === 'phase' ? 'phase' : 'frequency';
    const step = Number(kind === 'phase' ? c['phaseStepSeconds'] : c['fractionalFrequencyStep']);
    commands.push({
      index, kind, executeAt, step,
      uplinkAt: parseTime(c['uplinkAt'], epochStamp),
      actuatorSteps: typeof c['actuatorSteps'] === 'number' ? c['actuatorSteps'] : Number.NaN,
      reason: typeof c['reason'] === 'string' ? c['reason'] : '',
      source: c,
    });
  });
  commands.sort((a, b) => a.executeAt - b.executeAt);

  const invalid: string[] = [];
  for (const [name, arr] of [['steered.phaseSeconds', st.phase], ['steered.sigmaSeconds', st.sigma],
    ['unsteered.phaseSeconds', un.phase], ['unsteered.sigmaSeconds', un.sigma]] as const) {
    const bad = arr ? countNonFinite(arr) : null;
    if (bad) invalid.push(`plan.predicted.${name} holds ${bad.count} non-finite value${bad.count === 1 ? '' : 's'} (first at index ${bad.first}: ${bad.value})`);
  }
  const rawTol = scen && isObj(scen['tolerance']) ? (scen['tolerance'] as Obj)['phaseSeconds'] : undefined;
  const tol = rawTol === undefined ? Number.NaN : Number(rawTol);
  if (rawTol !== undefined && !(Number.isFinite(tol) && tol > 0)) {
    invalid.push(`scenario.tolerance.phaseSeconds must be a positive number of seconds; received ${String(rawTol)}`);
  }
  const contacts: PlanView['contacts'] = [];
  const rawContacts = scen?.['contacts'];
  (Array.isArray(rawContacts) ? rawContacts : []).forEach((w: unknown, k) => {
    const start = isObj(w) ? parseTime(w['start'], epochStamp) : Number.NaN;
    const end = isObj(w) ? parseTime(w['end'], epochStamp) : Number.NaN;
    if (Number.isFinite(start) && Number.isFinite(end) && end > start) contacts.push({ start, end });
    else problems.push(`scenario.contacts[${k}] needs start < end as ISO times`);
  });
  const maneuvers: PlanView['maneuvers'] = [];
  const rawManeuvers = scen?.['maneuvers'];
  (Array.isArray(rawManeuvers) ? rawManeuvers : []).forEach((m: unknown, k) => {
    const at = isObj(m) ? parseTime(m['at'], epochStamp) : Number.NaN;
    if (!Number.isFinite(at)) { problems.push(`scenario.maneuvers[${k}].at is not a valid time`); return; }
    const mo = m as Obj;
    maneuvers.push({ at, semiMajorAxisBefore: Number(mo['semiMajorAxisBefore']), semiMajorAxisAfter: Number(mo['semiMajorAxisAfter']) });
  });

  return {
    ok: true,
    view: {
      epochMs,
      leapSeconds: n > 0 ? leapSecondsInSpan(epochStamp, t[n - 1]!) : [],
      feasible: plan['feasible'] !== false,
      reason: typeof plan['reason'] === 'string' ? plan['reason'] : null,
      t, steered: st.phase, steeredSigma: st.sigma, unsteered: un.phase, unsteeredSigma: un.sigma,
      commands,
      tolerance: Number.isFinite(tol) && tol > 0 ? tol : null,
      contacts, maneuvers,
      metrics: isObj(plan['metrics']) ? plan['metrics'] : null,
      caution: typeof plan['caution'] === 'string' ? plan['caution'] : null,
      problems,
      invalid,
    },
  };
}

/** Count and first position of the non-finite values of a column; null when all are finite. */
function countNonFinite(arr: Float64Array): { count: number; first: number; value: number } | null {
  let count = 0, first = -1;
  for (let i = 0; i < arr.length; i++) {
    const v = arr[i]!;
    if (v - v !== 0) { if (count === 0) first = i; count += 1; }
  }
  return count === 0 ? null : { count, first, value: arr[first]! };
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
