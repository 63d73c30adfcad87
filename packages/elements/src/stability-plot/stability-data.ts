/**
 * Input adapter of `<tauline-stability-plot>`: accepts the columnar form (one entry per
 * statistic) or the SDK's row form (one `StabilityRow` per τ with a `statistics` map) and
 * returns validated columns. Pure, no DOM.
 *
 * @module
 */

/** One statistic as columns; all arrays have the same length, τ ascending. */
export interface StabilityColumns {
  /** Statistic name, e.g. `oadev`, `mdev`, `tdev`. */
  readonly statistic: string;
  /** Averaging times τ, seconds, ascending and positive. */
  readonly tau: ArrayLike<number>;
  /** Deviation at each τ: dimensionless (TDEV: seconds). */
  readonly deviation: ArrayLike<number>;
  /** Lower confidence bound at each τ (optional). */
  readonly low?: ArrayLike<number>;
  /** Upper confidence bound at each τ (optional). */
  readonly high?: ArrayLike<number>;
  /** Number of terms at each τ (optional). */
  readonly n?: ArrayLike<number>;
  /** Noise type at each τ, e.g. `WFM` (optional). */
  readonly noise?: ArrayLike<string>;
}

/** Validated columns plus what was dropped. */
export interface StabilitySet {
  series: Array<{ statistic: string; tau: Float64Array; deviation: Float64Array; low: Float64Array | null; high: Float64Array | null; n: Float64Array | null; noise: string[] | null }>;
  /** Human-readable problems (empty when the input is clean). */
  problems: string[];
}

function isArrayLike(v: unknown): v is ArrayLike<unknown> {
  return v !== null && typeof v === 'object' && typeof (v as { length?: unknown }).length === 'number';
}

function rowsToColumns(rows: readonly Record<string, unknown>[]): StabilityColumns[] {
  const by = new Map<string, { tau: number[]; deviation: number[]; low: number[]; high: number[]; n: number[]; noise: string[] }>();
  for (const row of rows) {
    const stats = row['statistics'] as Record<string, Record<string, unknown> | undefined>;
    for (const [name, est] of Object.entries(stats ?? {})) {
      if (!est) continue;
      let col = by.get(name);
      if (!col) by.set(name, (col = { tau: [], deviation: [], low: [], high: [], n: [], noise: [] }));
      col.tau.push(Number(est['tau'] ?? row['tau']));
      col.deviation.push(Number(est['deviation']));
      col.low.push(Number(est['low'] ?? Number.NaN));
      col.high.push(Number(est['high'] ?? Number.NaN));
      col.n.push(Number(est['n'] ?? Number.NaN));
      col.noise.push(String(row['noise'] ?? ''));
    }
  }
  return [...by].map(([statistic, c]) => ({ statistic, ...c }));
}

/**
 * Normalises the `series` property. Never throws: bad entries are left out and described in
 * `problems`. Points with a non-positive or non-finite τ or deviation cannot sit on a log-log
 * plot and are dropped (reported); a non-finite interval bound just hides that bound.
 */
export function normaliseStability(input: unknown): StabilitySet {
  const problems: string[] = [];
  const out: StabilitySet['series'] = [];
  if (input === undefined || input === null) return { series: out, problems };
  if (!Array.isArray(input)) return { series: out, problems: [`series must be an array; received ${typeof input}`] };
  const columns: unknown[] = input.length > 0 && input[0] && typeof input[0] === 'object' && 'statistics' in input[0]
    ? rowsToColumns(input as Record<string, unknown>[])
    : input;
  columns.forEach((entry, k) => {
    if (!entry || typeof entry !== 'object') { problems.push(`series[${k}] is not an object`); return; }
    const e = entry as Record<string, unknown>;
    const name = typeof e['statistic'] === 'string' && e['statistic'] ? e['statistic'] : `series ${k + 1}`;
    if (!isArrayLike(e['tau']) || !isArrayLike(e['deviation'])) { problems.push(`series[${k}] (${name}) needs tau and deviation arrays`); return; }
    const tau = e['tau'] as ArrayLike<number>, dev = e['deviation'] as ArrayLike<number>;
    if (tau.length !== dev.length) { problems.push(`series[${k}] (${name}): tau has ${tau.length} values, deviation ${dev.length}`); return; }
    const opt = (key: string): ArrayLike<number> | null => {
      const v = e[key];
      if (v === undefined || v === null) return null;
      if (!isArrayLike(v) || v.length !== tau.length) { problems.push(`series[${k}] (${name}).${key} must have ${tau.length} values`); return null; }
      return v as ArrayLike<number>;
    };
    const low = opt('low'), high = opt('high'), n = opt('n');
    const noiseRaw = e['noise'];
    const noise = isArrayLike(noiseRaw) && noiseRaw.length === tau.length ? Array.from(noiseRaw as ArrayLike<unknown>, String) : null;
    const keep: number[] = [];
    let dropped = 0;
    for (let i = 0; i < tau.length; i++) {
      const t = Number(tau[i]), d = Number(dev[i]);
      if (t > 0 && d > 0 && Number.isFinite(t) && Number.isFinite(d)) keep.push(i);
      else dropped += 1;
    }
    if (dropped > 0) problems.push(`series[${k}] (${name}): ${dropped} point(s) with non-positive or non-finite tau/deviation cannot be drawn on log axes`);
    const pick = (src: ArrayLike<number> | null): Float64Array | null => (src ? Float64Array.from(keep, (i) => Number(src[i])) : null);
    const order = keep.map((_, j) => j).sort((a, b) => Number(tau[keep[a]!]) - Number(tau[keep[b]!]));
    const sorted = (arr: Float64Array | null): Float64Array | null => (arr ? Float64Array.from(order, (j) => arr[j]!) : null);
    out.push({
      statistic: name,
      tau: sorted(pick(tau))!, deviation: sorted(pick(dev))!,
      low: sorted(pick(low)), high: sorted(pick(high)), n: sorted(pick(n)),
      noise: noise ? order.map((j) => noise[keep[j]!]!) : null,
    });
  });
  return { series: out, problems };
}
