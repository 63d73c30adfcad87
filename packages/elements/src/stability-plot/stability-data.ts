/**
 * Input adapter of `<tauline-stability-plot>`: accepts the columnar form (one entry per
 * statistic) or the SDK's row form (one `StabilityRow` per τ with a `statistics` map) and
 * returns validated columns. Pure, no DOM. Linear in the number of points: typed arrays that are
 * already clean and ascending are used without a copy.
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

/** One validated statistic, τ ascending, every τ and deviation positive and finite. */
export interface StabilitySeries {
  statistic: string;
  tau: Float64Array;
  deviation: Float64Array;
  low: Float64Array | null;
  high: Float64Array | null;
  n: Float64Array | null;
  noise: string[] | null;
}

/** Points left off because their estimate rests on too few terms (see {@link DEFAULT_MIN_TERMS}). */
export interface FewTermsNote {
  statistic: string;
  /** How many τ were left off. */
  count: number;
  /** The τ values left off, seconds. */
  taus: number[];
}

/** Validated columns plus what was dropped. */
export interface StabilitySet {
  series: StabilitySeries[];
  /** Human-readable problems with the input (empty when the input is clean): warned once. */
  problems: string[];
  /** τ left off for having fewer than `minTerms` terms: shown as a note under the plot, not a problem. */
  fewTerms: FewTermsNote[];
}

/**
 * Default smallest number of terms n for a τ to be drawn. A single term (n = 1) is one squared
 * difference: the estimate has at most one degree of freedom and its χ² confidence interval spans
 * decades, so it cannot be read as a measurement (W. J. Riley, NIST SP 1065 (2008), §5.3 on
 * confidence intervals and degrees of freedom [M, from memory]). Points with n below this are left
 * off the plot and the table by default and listed in a note; `min-terms="1"` shows them.
 */
export const DEFAULT_MIN_TERMS = 2;

function isArrayLike(v: unknown): v is ArrayLike<unknown> {
  return v !== null && typeof v === 'object' && typeof (v as { length?: unknown }).length === 'number';
}

function rowsToColumns(rows: readonly Record<string, unknown>[]): StabilityColumns[] {
  const by = new Map<
    string,
    { tau: number[]; deviation: number[]; low: number[]; high: number[]; n: number[]; noise: string[] }
  >();
  for (const row of rows) {
    const stats = (row ? row.statistics : undefined) as Record<string, Record<string, unknown> | undefined> | undefined;
    for (const [name, est] of Object.entries(stats ?? {})) {
      if (!est || typeof est !== 'object') continue;
      let col = by.get(name);
      if (!col) by.set(name, (col = { tau: [], deviation: [], low: [], high: [], n: [], noise: [] }));
      col.tau.push(Number(est.tau ?? row.tau));
      col.deviation.push(Number(est.deviation));
      col.low.push(Number(est.low ?? Number.NaN));
      col.high.push(Number(est.high ?? Number.NaN));
      col.n.push(Number(est.n ?? Number.NaN));
      col.noise.push(String(row.noise ?? ''));
    }
  }
  return [...by].map(([statistic, c]) => ({ statistic, ...c }));
}

/** The column as a Float64Array: used as is when it already is one, else converted once. */
function asFloat64(v: ArrayLike<number>): Float64Array {
  return v instanceof Float64Array ? v : Float64Array.from(v, Number);
}

/** Picks `index` entries of `src` (in that order) into a new Float64Array. */
function pick(src: ArrayLike<number>, index: Int32Array | null): Float64Array {
  if (!index) return asFloat64(src);
  const out = new Float64Array(index.length);
  // Hot (10^6 points): j < index.length bounds the index read. An index outside `src` reads as NaN,
  // as Number(undefined) always has: the validator flags such entries.
  for (let j = 0; j < index.length; j++) out[j] = Number(src[index[j]!]);
  return out;
}

/** Validates one columnar entry; pushes problems and few-term notes. Null when it cannot be used. */
function readEntry(
  entry: unknown,
  k: number,
  minTerms: number,
  problems: string[],
  fewTerms: FewTermsNote[],
): StabilitySeries | null {
  if (!entry || typeof entry !== 'object') {
    problems.push(`series[${k}] is not an object`);
    return null;
  }
  const e = entry as Record<string, unknown>;
  const name = typeof e.statistic === 'string' && e.statistic ? e.statistic : `series ${k + 1}`;
  if (!isArrayLike(e.tau) || !isArrayLike(e.deviation)) {
    problems.push(`series[${k}] (${name}) needs tau and deviation arrays`);
    return null;
  }
  const tau = e.tau as ArrayLike<number>,
    dev = e.deviation as ArrayLike<number>;
  const len = tau.length;
  if (dev.length !== len) {
    problems.push(`series[${k}] (${name}): tau has ${len} values, deviation ${dev.length}`);
    return null;
  }
  const opt = (key: string): ArrayLike<number> | null => {
    const v = e[key];
    if (v === undefined || v === null) return null;
    if (!isArrayLike(v) || v.length !== len) {
      problems.push(`series[${k}] (${name}).${key} must have ${len} values`);
      return null;
    }
    return v as ArrayLike<number>;
  };
  const low = opt('low'),
    high = opt('high'),
    n = opt('n');
  const noiseRaw = e.noise;
  const noise = isArrayLike(noiseRaw) && noiseRaw.length === len ? noiseRaw : null;
  // One pass: which points stay, and whether the kept τ are already ascending.
  let bad = 0,
    few = 0,
    ascending = true,
    last = -Infinity;
  const keep = new Uint8Array(len);
  const fewTaus: number[] = [];
  for (let i = 0; i < len; i++) {
    const t = Number(tau[i]),
      d = Number(dev[i]);
    if (!(t > 0 && d > 0 && t < Infinity && d < Infinity)) {
      bad += 1;
      continue;
    }
    if (n && Number(n[i]) < minTerms) {
      few += 1;
      if (fewTaus.length < 20) fewTaus.push(t);
      continue;
    }
    keep[i] = 1;
    if (t < last) ascending = false;
    last = t;
  }
  if (bad > 0)
    problems.push(
      `series[${k}] (${name}): ${bad} point(s) with non-positive or non-finite tau/deviation cannot be drawn on log axes`,
    );
  if (few > 0) fewTerms.push({ statistic: name, count: few, taus: fewTaus });
  let index: Int32Array | null = null;
  if (bad + few > 0 || !ascending) {
    index = new Int32Array(len - bad - few);
    for (let i = 0, j = 0; i < len; i++) if (keep[i]) index[j++] = i;
    if (!ascending) index.sort((a, b) => Number(tau[a]) - Number(tau[b]));
  }
  return {
    statistic: name,
    tau: pick(tau, index),
    deviation: pick(dev, index),
    low: low ? pick(low, index) : null,
    high: high ? pick(high, index) : null,
    n: n ? pick(n, index) : null,
    noise: noise
      ? Array.from(index ?? { length: len }, (i: number | undefined, j) =>
          String((noise as ArrayLike<unknown>)[i ?? j] ?? ''),
        )
      : null,
  };
}

/**
 * Normalises the `series` property. Never throws: bad entries are left out and described in
 * `problems`. Points with a non-positive or non-finite τ or deviation cannot sit on a log-log
 * plot and are dropped (reported); a non-finite interval bound just hides that bound. Points whose
 * `n` is below `minTerms` are left off and listed in `fewTerms`.
 */
export function normaliseStability(input: unknown, minTerms = DEFAULT_MIN_TERMS): StabilitySet {
  const problems: string[] = [];
  const fewTerms: FewTermsNote[] = [];
  const series: StabilitySeries[] = [];
  if (input === undefined || input === null) return { series, problems, fewTerms };
  if (!Array.isArray(input))
    return { series, problems: [`series must be an array; received ${typeof input}`], fewTerms };
  const columns: unknown[] =
    input.length > 0 && input[0] && typeof input[0] === 'object' && 'statistics' in input[0]
      ? rowsToColumns(input as Record<string, unknown>[])
      : input;
  columns.forEach((entry, k) => {
    const s = readEntry(entry, k, minTerms, problems, fewTerms);
    if (s) series.push(s);
  });
  return { series, problems, fewTerms };
}

/** One point of a statistic, with its optional columns (null where not given). */
export interface StabilityPointView {
  tau: number;
  deviation: number;
  low: number | null;
  high: number | null;
  n: number | null;
  noise: string | null;
}

/** Point i of `s`, or null when i is out of range. */
export function pointOf(s: StabilitySeries, i: number): StabilityPointView | null {
  const tau = s.tau[i],
    deviation = s.deviation[i];
  if (tau === undefined || deviation === undefined) return null;
  return {
    tau,
    deviation,
    low: s.low?.[i] ?? null,
    high: s.high?.[i] ?? null,
    n: s.n?.[i] ?? null,
    noise: s.noise?.[i] ?? null,
  };
}
