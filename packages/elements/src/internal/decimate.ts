/**
 * Per-pixel-column min/max decimation for line and band series.
 *
 * A series of N points drawn into W pixel columns only needs, per column, the first, the
 * lowest, the highest and the last point: the drawn polyline then covers exactly the same
 * pixels (every spike survives) while the path holds at most 4·W vertices instead of N.
 * Columns are laid out on the x-domain [x0, x1] split into `columns` equal slices.
 * A non-finite y breaks the line: the output carries a NaN vertex there.
 *
 * Pure functions, no DOM: tested in packages/elements/test/internal/decimate.test.ts.
 *
 * Index reads: the per-point loops (binary searches, column scans) read with `!`, each index
 * bounded by its loop condition and the range [start, end) checked against every column's length on
 * entry (`requireRange`); the per-column reads (a column's first point, its extremes) go through the
 * checked `atNumber()`, a handful per pixel column (A/B over 10^6 points: no change beyond noise).
 *
 * @module
 */

import { atNumber } from './checked.js';

/** A numeric column: typed array or plain array. x must be ascending. */
export type NumericColumn = ArrayLike<number>;

/** Decimated polyline vertices in data units; `length` of the arrays in use. */
export interface Polyline {
  x: Float64Array;
  y: Float64Array;
  length: number;
}

/** Decimated band: per vertex, x and the band's lower and upper edge, in data units. */
export interface BandPolygon {
  x: Float64Array;
  low: Float64Array;
  high: Float64Array;
  length: number;
}

/** First index i with x[i] >= value (x ascending), in [0, x.length]; mid is bounded by lo < hi ≤ x.length. */
export function lowerBound(x: NumericColumn, value: number): number {
  let lo = 0;
  let hi = x.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x[mid]! < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index i with x[i] > value (x ascending), in [0, x.length]; mid is bounded by lo < hi ≤ x.length. */
export function upperBound(x: NumericColumn, value: number): number {
  let lo = 0;
  let hi = x.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x[mid]! <= value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Index range [start, end) of the points to draw for the x-domain [x0, x1]: the visible
 * points plus one neighbour on each side, so the line runs to the plot edges.
 */
export function visibleRange(x: NumericColumn, x0: number, x1: number): [number, number] {
  const start = Math.max(0, lowerBound(x, x0) - 1);
  const end = Math.min(x.length, upperBound(x, x1) + 1);
  return [start, Math.max(start, end)];
}

/** Index of the point whose x is closest to `value` (x ascending, non-empty), or -1 if empty. */
export function closestIndex(x: NumericColumn, value: number): number {
  if (x.length === 0) return -1;
  const i = lowerBound(x, value);
  if (i <= 0) return 0;
  if (i >= x.length) return x.length - 1;
  return value - atNumber(x, i - 1, 'x') <= atNumber(x, i, 'x') - value ? i - 1 : i;
}

/** Whether decimation pays off: at least 4 points per pixel column (uPlot's rule). */
export function shouldDecimate(pointCount: number, columns: number): boolean {
  return pointCount >= 4 * Math.max(1, columns);
}

/**
 * Throws a `RangeError` naming the column when [start, end) is not inside it: a caller's bug, which
 * would otherwise draw `undefined` reads as gaps.
 */
function requireRange(start: number, end: number, columns: Readonly<Record<string, NumericColumn>>): void {
  for (const [name, column] of Object.entries(columns)) {
    if (!(Number.isInteger(start) && Number.isInteger(end) && start >= 0 && end <= column.length)) {
      throw new RangeError(`index range [${start}, ${end}) is outside ${name}'s ${column.length} element(s)`);
    }
  }
}

/**
 * End (exclusive) of the pixel column `col` that starts at index i: the first index in (i, end]
 * whose column floor((x − x0)·scale) differs. Binary search, then exact correction with the
 * same floor rule so points on a boundary land in the same column as a per-point scan puts them.
 * Indices bounded by the loop conditions: i < lo ≤ hi ≤ end ≤ x.length, and i < j ≤ end.
 */
function columnEnd(x: NumericColumn, i: number, end: number, x0: number, scale: number, col: number): number {
  let lo = i + 1,
    hi = end;
  const boundary = x0 + (col + 1) / scale;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x[mid]! < boundary) lo = mid + 1;
    else hi = mid;
  }
  let j = lo;
  while (j < end && Math.floor((x[j]! - x0) * scale) === col) j++;
  while (j > i + 1 && Math.floor((x[j - 1]! - x0) * scale) !== col) j--;
  return j;
}

class Growable {
  x: Float64Array;
  a: Float64Array;
  b: Float64Array;
  length = 0;
  constructor(capacity: number) {
    this.x = new Float64Array(capacity);
    this.a = new Float64Array(capacity);
    this.b = new Float64Array(capacity);
  }
  push(x: number, a: number, b: number): void {
    if (this.length === this.x.length) {
      const grow = (arr: Float64Array) => {
        const next = new Float64Array(arr.length * 2 + 8);
        next.set(arr);
        return next;
      };
      this.x = grow(this.x);
      this.a = grow(this.a);
      this.b = grow(this.b);
    }
    this.x[this.length] = x;
    this.a[this.length] = a;
    this.b[this.length] = b;
    this.length += 1;
  }
}

/**
 * Decimates the line (x, y) over the index range [start, end) into at most four vertices
 * per pixel column of the domain [x0, x1] split into `columns` slices: first, min, max and
 * last, emitted in their original order. Below the 4-per-column threshold the points are
 * copied unchanged. A non-finite y becomes a NaN vertex (a gap in the drawn line).
 */
export function decimateLine(
  x: NumericColumn,
  y: NumericColumn,
  start: number,
  end: number,
  x0: number,
  x1: number,
  columns: number,
): Polyline {
  const count = Math.max(0, end - start);
  if (count > 0) requireRange(start, end, { x, y });
  const cols = Math.max(1, Math.floor(columns));
  if (!shouldDecimate(count, cols) || !(x1 > x0)) {
    // Fewer than 4 points per pixel column: a short copy, read checked.
    const out = { x: new Float64Array(count), y: new Float64Array(count), length: count };
    for (let i = 0; i < count; i++) {
      out.x[i] = atNumber(x, start + i, 'x');
      const v = atNumber(y, start + i, 'y');
      out.y[i] = Number.isFinite(v) ? v : Number.NaN;
    }
    return out;
  }
  const out = new Growable(4 * cols + 16);
  const scale = cols / (x1 - x0);
  const emit = (a: number, b: number, c: number, d: number): void => {
    // The (up to) four indices first ≤ {min, max} ≤ last, in ascending order, without repeats.
    if (b > c) {
      const t = b;
      b = c;
      c = t;
    }
    out.push(atNumber(x, a, 'x'), atNumber(y, a, 'y'), 0);
    if (b !== a) out.push(atNumber(x, b, 'x'), atNumber(y, b, 'y'), 0);
    if (c !== b && c !== a) out.push(atNumber(x, c, 'x'), atNumber(y, c, 'y'), 0);
    if (d !== c && d !== b && d !== a) out.push(atNumber(x, d, 'x'), atNumber(y, d, 'y'), 0);
  };
  let i = start;
  while (i < end) {
    const col = Math.floor((atNumber(x, i, 'x') - x0) * scale);
    const j = columnEnd(x, i, end, x0, scale, col);
    // Tight scan of the column's y values (k < j ≤ end); comparisons skip NaN, which is detected separately.
    let lo = i,
      hi = i,
      yl = atNumber(y, i, 'y'),
      yh = yl,
      finite = yl - yl === 0;
    for (let k = i + 1; k < j; k++) {
      const v = y[k]!;
      if (v < yl) {
        yl = v;
        lo = k;
      } else if (v > yh) {
        yh = v;
        hi = k;
      } else if (v !== v) finite = false;
    }
    if (finite && yl - yl === 0 && yh - yh === 0) emit(i, lo, hi, j - 1);
    else splitAtGaps(i, j);
    i = j;
  }
  /** Slow path for a column holding non-finite values: runs between gaps, NaN vertex per gap (k < to ≤ end). */
  function splitAtGaps(from: number, to: number): void {
    let first = -1,
      lo = -1,
      hi = -1,
      last = -1,
      yl = Number.NaN,
      yh = Number.NaN;
    for (let k = from; k < to; k++) {
      const v = y[k]!;
      if (!Number.isFinite(v)) {
        if (first >= 0) emit(first, lo, hi, last);
        first = -1;
        out.push(atNumber(x, k, 'x'), Number.NaN, 0);
        continue;
      }
      if (first < 0) {
        first = lo = hi = last = k;
        yl = yh = v;
        continue;
      }
      last = k;
      if (v < yl) {
        lo = k;
        yl = v;
      } else if (v > yh) {
        hi = k;
        yh = v;
      }
    }
    if (first >= 0) emit(first, lo, hi, last);
  }
  return { x: out.x, y: out.a, length: out.length };
}

/**
 * Decimates a band (x, low, high) over [start, end): per pixel column one vertex at the
 * column's mean x, holding the column's lowest `low` and highest `high`, so the filled
 * envelope never shrinks. Below the 4-per-column threshold points are copied unchanged.
 * A non-finite edge becomes a NaN vertex (a gap in the band).
 */
export function decimateBand(
  x: NumericColumn,
  low: NumericColumn,
  high: NumericColumn,
  start: number,
  end: number,
  x0: number,
  x1: number,
  columns: number,
): BandPolygon {
  const count = Math.max(0, end - start);
  if (count > 0) requireRange(start, end, { x, low, high });
  const cols = Math.max(1, Math.floor(columns));
  if (!shouldDecimate(count, cols) || !(x1 > x0)) {
    // Fewer than 4 points per pixel column: a short copy, read checked.
    const out = {
      x: new Float64Array(count),
      low: new Float64Array(count),
      high: new Float64Array(count),
      length: count,
    };
    for (let i = 0; i < count; i++) {
      const l = atNumber(low, start + i, 'low'),
        h = atNumber(high, start + i, 'high');
      const ok = Number.isFinite(l) && Number.isFinite(h);
      out.x[i] = atNumber(x, start + i, 'x');
      out.low[i] = ok ? l : Number.NaN;
      out.high[i] = ok ? h : Number.NaN;
    }
    return out;
  }
  const out = new Growable(2 * cols + 16);
  const scale = cols / (x1 - x0);
  const emit = (from: number, to: number, l: number, h: number): void => {
    // Two vertices per column (its first and last x) keep the envelope's width honest.
    out.push(atNumber(x, from, 'x'), l, h);
    if (to - 1 > from) out.push(atNumber(x, to - 1, 'x'), l, h);
  };
  let i = start;
  while (i < end) {
    const col = Math.floor((atNumber(x, i, 'x') - x0) * scale);
    const j = columnEnd(x, i, end, x0, scale, col);
    // Tight scan of the column (k < j ≤ end); comparisons skip NaN, which is detected separately.
    let l = atNumber(low, i, 'low'),
      h = atNumber(high, i, 'high'),
      finite = l - l === 0 && h - h === 0;
    for (let k = i + 1; k < j; k++) {
      const a = low[k]!,
        b = high[k]!;
      if (a < l) l = a;
      else if (a !== a) finite = false;
      if (b > h) h = b;
      else if (b !== b) finite = false;
    }
    if (finite && l - l === 0 && h - h === 0) emit(i, j, l, h);
    else {
      // Slow path: runs between non-finite samples, a NaN vertex per gap.
      let from = -1;
      for (let k = i; k < j; k++) {
        const a = low[k]!,
          b = high[k]!;
        if (!Number.isFinite(a) || !Number.isFinite(b)) {
          if (from >= 0) emit(from, k, l, h);
          from = -1;
          out.push(atNumber(x, k, 'x'), Number.NaN, Number.NaN);
          continue;
        }
        if (from < 0) {
          from = k;
          l = a;
          h = b;
          continue;
        }
        if (a < l) l = a;
        if (b > h) h = b;
      }
      if (from >= 0) emit(from, j, l, h);
    }
    i = j;
  }
  return { x: out.x, low: out.a, high: out.b, length: out.length };
}
