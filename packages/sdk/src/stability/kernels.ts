/**
 * The O(N)-per-τ sums behind every statistic. Phase is a Float64Array in seconds with NaN for a
 * missing sample; `seg` (or null) gives each sample's continuity segment (see PhaseSeries).
 * A term is used only when every phase sample it reads is present and all lie in one segment;
 * the returned `n` counts the terms used.
 *
 * @internal
 */

/** Sum of squared terms and how many terms went in. */
export interface TermSum {
  sum: number;
  n: number;
}

/** Per-sample segment index from the segment start list, or null when the series is continuous. */
export function segmentIndex(length: number, segmentStarts: readonly number[]): Int32Array | null {
  if (segmentStarts.length === 0) return null;
  const seg = new Int32Array(length);
  let s = 0;
  let k = 0;
  const starts = [...segmentStarts].sort((a, b) => a - b);
  let next = starts[0];
  for (let i = 0; i < length; i++) {
    for (; next !== undefined && next <= i; next = starts[++k]) s++;
    seg[i] = s;
  }
  return seg;
}

/** Whether any phase sample is missing. */
export function hasMissing(x: Float64Array): boolean {
  for (let i = 0; i < x.length; i++) if (x[i] !== x[i]) return true;
  return false;
}

/**
 * Second differences x_{i+2m} − 2x_{i+m} + x_i for i = 0, step, 2·step, … (step = 1: overlapping
 * Allan, NIST SP 1065 §5.2.4; step = m: non-overlapping Allan, §5.2.2; section numbers [M], sums reproduced against
 * the SP 1065 test data [C]). Hot loop: indices bounded by i ≤ last = N − 1 − 2m.
 */
export function secondDifferenceSum(x: Float64Array, seg: Int32Array | null, m: number, step: number): TermSum {
  const last = x.length - 1 - 2 * m;
  let sum = 0;
  let n = 0;
  for (let i = 0; i <= last; i += step) {
    const v = x[i + 2 * m]! - 2 * x[i + m]! + x[i]!;
    // NaN fails v === v, so a term with a missing sample is skipped and not counted.
    if (v === v && (seg === null || seg[i] === seg[i + 2 * m])) {
      sum += v * v;
      n++;
    }
  }
  return { sum, n };
}

/**
 * Third differences x_{i+3m} − 3x_{i+2m} + 3x_{i+m} − x_i for i = 0, step, … (Hadamard variance,
 * NIST SP 1065 §5.2.8 overlapping with step = 1, §5.2.7 non-overlapping with step = m). Hot loop:
 * indices bounded by i ≤ last = N − 1 − 3m.
 */
export function thirdDifferenceSum(x: Float64Array, seg: Int32Array | null, m: number, step: number): TermSum {
  const last = x.length - 1 - 3 * m;
  let sum = 0;
  let n = 0;
  for (let i = 0; i <= last; i += step) {
    const v = x[i + 3 * m]! - 3 * x[i + 2 * m]! + 3 * x[i + m]! - x[i]!;
    if (v === v && (seg === null || seg[i] === seg[i + 3 * m])) {
      sum += v * v;
      n++;
    }
  }
  return { sum, n };
}

/** Reusable scratch arrays for the modified-Allan sums (allocated once per series). */
export class ModifiedWorkspace {
  readonly hi: Float64Array;
  readonly lo: Float64Array;
  /** Prefix count of incomplete second differences; only allocated when the series has gaps. */
  readonly bad: Int32Array | null;
  constructor(length: number, withGaps: boolean) {
    this.hi = new Float64Array(length + 1);
    this.lo = new Float64Array(length + 1);
    this.bad = withGaps ? new Int32Array(length + 1) : null;
  }
}

/**
 * Σ_j [Σ_{i=j}^{j+m−1} (x_{i+2m} − 2x_{i+m} + x_i)]² over j = 0 … N − 3m (modified Allan,
 * NIST SP 1065 §5.2.5) in O(N): the inner sums are differences of a Kahan-compensated prefix
 * sum of the second differences d_i (prefix sums of d rather than of x, so that a large
 * frequency offset or drift does not cancel catastrophically). A term is complete when all
 * d_i in its window are (prefix count of incomplete d_i). Hot loops: indices bounded by
 * i < nd = N − 2m, and j + m ≤ nd for j < terms = nd − m + 1 (hi, lo, bad hold N + 1 slots).
 */
export function modifiedSum(x: Float64Array, seg: Int32Array | null, m: number, ws: ModifiedWorkspace): TermSum {
  const nd = x.length - 2 * m;
  const terms = x.length - 3 * m + 1;
  if (terms < 1) return { sum: 0, n: 0 };
  const { hi, lo, bad } = ws;
  let s = 0;
  let c = 0;
  let b = 0;
  hi[0] = 0;
  lo[0] = 0;
  if (bad !== null) bad[0] = 0;
  for (let i = 0; i < nd; i++) {
    let v = x[i + 2 * m]! - 2 * x[i + m]! + x[i]!;
    if (bad !== null && (!(v === v) || (seg !== null && seg[i] !== seg[i + 2 * m]))) {
      v = 0;
      b++;
    }
    // Kahan compensated summation (Kahan 1965, CACM 8(1):40 [M]): branch-free; the d_i are small
    // against the running sum, the case Kahan's scheme handles.
    const yk = v - c;
    const t = s + yk;
    c = t - s - yk;
    s = t;
    hi[i + 1] = s;
    lo[i + 1] = c;
    if (bad !== null) bad[i + 1] = b;
  }
  let sum = 0;
  let n = 0;
  for (let j = 0; j < terms; j++) {
    if (bad !== null && bad[j + m] !== bad[j]) continue;
    const w = hi[j + m]! - hi[j]! - (lo[j + m]! - lo[j]!);
    sum += w * w;
    n++;
  }
  return { sum, n };
}

/**
 * Σ_{i=2}^{N−1} (x*_{i−m} − 2x*_i + x*_{i+m})² with x* the phase extended by reflection at both
 * ends, x*_{1−j} = 2x_1 − x_{1+j}, x*_{N+j} = 2x_N − x_{N−j} (1-based; total variance, NIST SP 1065
 * §5.2.11). Requires a gap-free series and m ≤ N − 1; returns n = N − 2. Hot loops: indices bounded
 * by 1 ≤ i ≤ N − 2, the interior loop by m < i < N − 1 − m, and reflected indices by m ≤ N − 1.
 */
export function totalSum(x: Float64Array, m: number): TermSum {
  const N = x.length;
  const x0 = x[0] ?? Number.NaN;
  const xl = x.at(-1) ?? Number.NaN;
  const at = (k: number): number => (k < 0 ? 2 * x0 - x[-k]! : k > N - 1 ? 2 * xl - x[2 * (N - 1) - k]! : x[k]!);
  let sum = 0;
  // Interior terms need no reflection; only the first and last m terms call `at`.
  const lo = Math.min(N - 2, m);
  const hiStart = Math.max(lo + 1, N - 1 - m);
  for (let i = 1; i < lo + 1 && i <= N - 2; i++) {
    const v = at(i - m) - 2 * x[i]! + at(i + m);
    sum += v * v;
  }
  for (let i = lo + 1; i < hiStart; i++) {
    const v = x[i - m]! - 2 * x[i]! + x[i + m]!;
    sum += v * v;
  }
  for (let i = Math.max(hiStart, lo + 1); i <= N - 2; i++) {
    const v = at(i - m) - 2 * x[i]! + at(i + m);
    sum += v * v;
  }
  return { sum, n: N - 2 };
}
