/**
 * Search for the intervals where a sampled function stays at or above a threshold (the passes of
 * a satellite above an elevation mask), with crossings refined by bisection and hidden extrema by
 * golden-section search.
 *
 * @internal
 */
import { at } from '../internal/checked.js';
import type { Radians, Seconds } from '../units.js';
import type { PredictedPass } from './visibility.js';

/** 1/φ, the golden-section ratio (Kiefer 1953; Press et al., Numerical Recipes, 3rd ed., §10.2 [M]). */
const INV_PHI = (Math.sqrt(5) - 1) / 2;

type Fn = (t: Seconds) => number;

/**
 * Bisection on a bracket [lo, hi] where `f(lo) ≥ level` differs from `f(hi) ≥ level`, until
 * hi − lo ≤ tol; returns the end of the final bracket on the `≥ level` side (so it is inside).
 * @see Bisection method, e.g. Press et al., Numerical Recipes, 3rd ed., §9.1 [M].
 */
function crossing(f: Fn, lo: Seconds, hi: Seconds, level: number, tol: Seconds): Seconds {
  const loAbove = f(lo) >= level;
  let a = lo,
    b = hi;
  while (b - a > tol) {
    const m = 0.5 * (a + b);
    if (f(m) >= level === loAbove) a = m;
    else b = m;
  }
  return loAbove ? a : b;
}

/**
 * Golden-section search for the extremum of `sign·f` on [lo, hi] (sign 1: maximum, −1: minimum), to `tol`.
 * @see Press et al., Numerical Recipes, 3rd ed., §10.2 (golden section search) [M].
 */
function extremum(f: Fn, lo: Seconds, hi: Seconds, sign: 1 | -1, tol: Seconds): { t: Seconds; value: number } {
  let a = lo,
    b = hi;
  let c = b - INV_PHI * (b - a),
    d = a + INV_PHI * (b - a);
  let fc = sign * f(c),
    fd = sign * f(d);
  while (b - a > tol) {
    if (fc > fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - INV_PHI * (b - a);
      fc = sign * f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + INV_PHI * (b - a);
      fd = sign * f(d);
    }
  }
  const t = fc > fd ? c : d;
  return { t, value: f(t) };
}

/** First index k with times[k] > t (binary search; times increasing). */
function firstAfter(times: Float64Array, t: Seconds): number {
  let lo = 0,
    hi = times.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (at(times, mid, 'times') > t) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** Highest value of f inside [start, end]: best sample, refined by golden section around it. */
function peak(
  f: Fn,
  times: Float64Array,
  values: Float64Array,
  start: Seconds,
  end: Seconds,
  tol: Seconds,
): { t: Seconds; value: number } {
  let best = { t: start, value: f(start) };
  const atEnd = f(end);
  if (atEnd > best.value) best = { t: end, value: atEnd };
  let k = -1;
  for (let j = firstAfter(times, start), tj = times[j]; tj !== undefined && tj < end; tj = times[++j]) {
    const value = at(values, j, 'values');
    if (value > best.value) {
      best = { t: tj, value };
      k = j;
    }
  }
  if (k < 0) {
    const refined = extremum(f, start, end, 1, tol);
    return refined.value > best.value ? refined : best;
  }
  const refined = extremum(f, Math.max(start, times[k - 1] ?? start), Math.min(end, times[k + 1] ?? end), 1, tol);
  return refined.value > best.value ? refined : best;
}

/**
 * The passes of a function sampled at `times` (`values[k] = f(times[k])`, times increasing from 0 to the
 * horizon): maximal intervals with f ≥ level, with starts and ends inside and within `tol` of the crossing.
 * A NaN sample stands for one known to be below the level with [t(k−2), t(k+2)] below too: it counts as below and,
 * since every comparison with NaN is false, starts no three-sample search (none could find a pass there).
 */
export function findPasses(
  times: Float64Array,
  values: Float64Array,
  f: Fn,
  level: Radians,
  tol: Seconds,
): PredictedPass[] {
  const out: PredictedPass[] = [];
  let t0 = at(times, 0, 'times');
  let prev = at(values, 0, 'values');
  let open: { start: Seconds; clipped: boolean } | undefined = prev >= level ? { start: t0, clipped: true } : undefined;
  const close = (end: Seconds, clippedAtEnd: boolean): void => {
    if (!open) return;
    const top = peak(f, times, values, open.start, end, tol);
    out.push({
      start: open.start,
      end,
      maxElevation: top.value,
      maxElevationAt: top.t,
      clippedAtStart: open.clipped,
      clippedAtEnd,
    });
    open = undefined;
  };
  // A window of three samples (t0, prev), (t1, here), (t2, next) slides along; `next` is absent at the last sample.
  for (let k = 1; k < times.length; k++) {
    const t1 = at(times, k, 'times');
    const here = at(values, k, 'values');
    const wasAbove = prev >= level;
    const isAbove = here >= level;
    if (!wasAbove && isAbove) open = { start: crossing(f, t0, t1, level, tol), clipped: false };
    else if (wasAbove && !isAbove) close(crossing(f, t0, t1, level, tol), false);
    const t2 = times[k + 1];
    const next = values[k + 1];
    if (t2 !== undefined && next !== undefined) {
      const nextAbove = next >= level;
      if (!wasAbove && !isAbove && !nextAbove && here > prev && here >= next) {
        // A short pass may peak above the level between three samples below it.
        const top = extremum(f, t0, t2, 1, tol);
        if (top.value >= level) {
          open = { start: crossing(f, t0, top.t, level, tol), clipped: false };
          close(crossing(f, top.t, t2, level, tol), false);
        }
      } else if (wasAbove && isAbove && nextAbove && here < prev && here <= next) {
        // Two passes may be joined by a dip below the level between three samples above it.
        const low = extremum(f, t0, t2, -1, tol);
        if (low.value < level) {
          close(crossing(f, t0, low.t, level, tol), false);
          open = { start: crossing(f, low.t, t2, level, tol), clipped: false };
        }
      }
    }
    t0 = t1;
    prev = here;
  }
  close(t0, true);
  return out;
}
