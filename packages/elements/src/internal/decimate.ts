/**
 * Per-pixel-column min/max decimation for line and band series.
 *
 * A series of N points drawn into W pixel columns only needs, per column, the first, the
 * lowest, the highest and the last point: the drawn polyline then covers exactly the same
 * pixels (every spike survives) while the path holds at most 4·W vertices instead of N.
 * Columns are laid out on the x-domain [x0, x1] split into `columns` equal slices.
 * A non-finite y breaks the line: the output carries a NaN vertex there.
 *
 * Pure functions, no DOM: tested in packages/elements/test/decimate.test.ts.
 *
 * @module
 */

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

/** First index i with x[i] >= value (x ascending), in [0, x.length]. */
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

/** First index i with x[i] > value (x ascending), in [0, x.length]. */
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
  return value - x[i - 1]! <= x[i]! - value ? i - 1 : i;
}

/** Whether decimation pays off: at least 4 points per pixel column (uPlot's rule). */
export function shouldDecimate(pointCount: number, columns: number): boolean {
  return pointCount >= 4 * Math.max(1, columns);
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
  x: NumericColumn, y: NumericColumn, start: number, end: number,
  x0: number, x1: number, columns: number,
): Polyline {
  const count = Math.max(0, end - start);
  const cols = Math.max(1, Math.floor(columns));
  if (!shouldDecimate(count, cols) || !(x1 > x0)) {
    const out = { x: new Float64Array(count), y: new Float64Array(count), length: count };
    for (let i = 0; i < count; i++) {
      out.x[i] = x[start + i]!;
      const v = y[start + i]!;
      out.y[i] = Number.isFinite(v) ? v : Number.NaN;
    }
    return out;
  }
  const out = new Growable(4 * cols + 16);
  const scale = cols / (x1 - x0);
  let column = Number.NaN;
  let first = -1, last = -1, lo = -1, hi = -1;
  const flush = (): void => {
    if (first < 0) return;
    // Emit the (up to) four indices in ascending order, without repeats.
    let a = first, b = lo, c = hi, d = last;
    if (b > c) { const t = b; b = c; c = t; }
    out.push(x[a]!, y[a]!, 0);
    if (b !== a) out.push(x[b]!, y[b]!, 0);
    if (c !== b && c !== a) out.push(x[c]!, y[c]!, 0);
    if (d !== c && d !== b && d !== a) out.push(x[d]!, y[d]!, 0);
    first = -1;
  };
  for (let i = start; i < end; i++) {
    const v = y[i]!;
    if (!Number.isFinite(v)) {
      flush();
      out.push(x[i]!, Number.NaN, 0);
      continue;
    }
    const col = Math.floor((x[i]! - x0) * scale);
    if (col !== column || first < 0) {
      flush();
      column = col;
      first = last = lo = hi = i;
      continue;
    }
    last = i;
    if (v < y[lo]!) lo = i;
    else if (v > y[hi]!) hi = i;
  }
  flush();
  return { x: out.x, y: out.a, length: out.length };
}

/**
 * Decimates a band (x, low, high) over [start, end): per pixel column one vertex at the
 * column's mean x, holding the column's lowest `low` and highest `high`, so the filled
 * envelope never shrinks. Below the 4-per-column threshold points are copied unchanged.
 * A non-finite edge becomes a NaN vertex (a gap in the band).
 */
export function decimateBand(
  x: NumericColumn, low: NumericColumn, high: NumericColumn, start: number, end: number,
  x0: number, x1: number, columns: number,
): BandPolygon {
  const count = Math.max(0, end - start);
  const cols = Math.max(1, Math.floor(columns));
  if (!shouldDecimate(count, cols) || !(x1 > x0)) {
    const out = { x: new Float64Array(count), low: new Float64Array(count), high: new Float64Array(count), length: count };
    for (let i = 0; i < count; i++) {
      const l = low[start + i]!, h = high[start + i]!;
      const ok = Number.isFinite(l) && Number.isFinite(h);
      out.x[i] = x[start + i]!;
      out.low[i] = ok ? l : Number.NaN;
      out.high[i] = ok ? h : Number.NaN;
    }
    return out;
  }
  const out = new Growable(2 * cols + 16);
  const scale = cols / (x1 - x0);
  let column = Number.NaN;
  let n = 0, sumX = 0, minLow = 0, maxHigh = 0, firstX = 0, lastX = 0;
  const flush = (): void => {
    if (n === 0) return;
    // Two vertices per column (its first and last x) keep the envelope's width honest.
    if (n === 1) out.push(sumX, minLow, maxHigh);
    else {
      out.push(firstX, minLow, maxHigh);
      out.push(lastX, minLow, maxHigh);
    }
    n = 0;
  };
  for (let i = start; i < end; i++) {
    const l = low[i]!, h = high[i]!;
    const xi = x[i]!;
    if (!Number.isFinite(l) || !Number.isFinite(h)) {
      flush();
      out.push(xi, Number.NaN, Number.NaN);
      continue;
    }
    const col = Math.floor((xi - x0) * scale);
    if (col !== column || n === 0) {
      flush();
      column = col;
      n = 1; sumX = xi; firstX = xi; lastX = xi; minLow = l; maxHigh = h;
      continue;
    }
    n += 1;
    lastX = xi;
    if (l < minLow) minLow = l;
    if (h > maxHigh) maxHigh = h;
  }
  flush();
  return { x: out.x, low: out.a, high: out.b, length: out.length };
}
