/**
 * Canvas drawing of `<tauline-stability-plot>`: the right-hand time axis, decade ticks, marker
 * shapes, and the curves themselves through per-pixel-column decimation (the schedule's
 * `internal/decimate.ts`, applied in log10 τ), so 10^6 points cost about as much as a few thousand.
 *
 * @module
 */

import {
  type AxisStyle,
  type Frame,
  type MarkerShape,
  markerPath,
  strokePolyline,
  type Tick,
} from '../internal/canvas.js';
import { atNumber } from '../internal/checked.js';
import { type Polyline, shouldDecimate } from '../internal/decimate.js';
import { formatFraction } from '../internal/format.js';
import { linearScale, logTicks, type Scale } from '../internal/scale.js';
import type { StabilitySeries } from './stability-data.js';

/** Marker shapes by series index; `plus` is drawn here (the shared helper has six shapes). */
export type PlotShape = MarkerShape | 'plus';
export const SHAPES: readonly PlotShape[] = [
  'circle',
  'diamond',
  'square',
  'triangle-up',
  'cross',
  'triangle-down',
  'plus',
];

/** Markers (and error bars) are drawn only while a series has at most one point per this many pixels. */
export const MARKER_SPACING_PX = 6;

/** A marker path: the shared shapes plus a `plus` sign (upright cross, distinct from the diagonal `cross`). */
export function plotMarkerPath(shape: PlotShape, x: number, y: number, r: number): Path2D {
  if (shape !== 'plus') return markerPath(shape, x, y, r);
  const p = new Path2D();
  p.moveTo(x - r, y);
  p.lineTo(x + r, y);
  p.moveTo(x, y - r);
  p.lineTo(x, y + r);
  return p;
}

/** Range of deviations (and interval bounds when shown) over a group of series; null if empty. */
export function deviationExtent(series: readonly StabilitySeries[], withIntervals: boolean): [number, number] | null {
  let d0 = Infinity,
    d1 = -Infinity;
  for (const s of series) {
    // Three independent min/max scans (comparisons skip NaN, so the order of the reads does not matter),
    // each over 10^6 points, each index bounded by its own column's length.
    const { deviation: dev, low, high } = s;
    for (let i = 0; i < dev.length; i++) {
      const d = dev[i]!;
      if (d < d0) d0 = d;
      if (d > d1) d1 = d;
    }
    if (withIntervals && low) {
      for (let i = 0; i < low.length; i++) {
        const v = low[i]!;
        if (v > 0 && v < d0) d0 = v;
      }
    }
    if (withIntervals && high) {
      for (let i = 0; i < high.length; i++) {
        const v = high[i]!;
        if (v < Infinity && v > d1) d1 = v;
      }
    }
  }
  if (!(d0 > 0) || !Number.isFinite(d1)) return null;
  if (!(d1 > d0)) {
    d0 /= 3;
    d1 *= 3;
  }
  return [d0, d1];
}

/**
 * Draws a logarithmic y axis on the right edge of `frame`: tick marks outside the frame, labels
 * and a title rotated to read top-down. Its own scale, no grid (the left axis owns the grid).
 */
export function drawRightAxis(
  ctx: CanvasRenderingContext2D,
  frame: Frame,
  sy: Scale,
  ticks: readonly Tick[],
  style: AxisStyle,
  title: string,
  canvasWidth: number,
): void {
  const right = frame.left + frame.width,
    top = frame.top,
    bottom = frame.top + frame.height;
  ctx.save();
  ctx.strokeStyle = style.muted;
  ctx.lineWidth = 1;
  ctx.beginPath();
  for (const t of ticks) {
    const y = Math.round(sy.map(t.value)) + 0.5;
    if (y < top - 0.5 || y > bottom + 0.5) continue;
    ctx.moveTo(right, y);
    ctx.lineTo(right + 4, y);
  }
  ctx.stroke();
  ctx.fillStyle = style.muted;
  ctx.font = style.font;
  ctx.textAlign = 'left';
  ctx.textBaseline = 'middle';
  for (const t of ticks) {
    const y = sy.map(t.value);
    if (y < top - 1 || y > bottom + 1) continue;
    ctx.fillText(t.label, right + 6, y);
  }
  ctx.fillStyle = style.text;
  ctx.translate(canvasWidth - 9, top + frame.height / 2);
  ctx.rotate(Math.PI / 2);
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  ctx.fillText(title, 0, 0);
  ctx.restore();
}

/** Decade ticks of a log scale labelled in scientific notation (two end ticks if no decade fits). */
export function decadeTicks(sy: Scale, extent: readonly [number, number]): Tick[] {
  const yt = logTicks(sy.domain[0], sy.domain[1]);
  return (yt.length >= 2 ? yt : [extent[0], extent[1]]).map((v) => ({
    value: v,
    label: formatFraction(v, yt.length >= 2 ? 1 : 3),
  }));
}

/** First index in [from, x.length) with x[index] ≥ value (x ascending); mid is bounded by lo < hi ≤ x.length. */
function lowerBoundFrom(x: Float64Array, from: number, value: number): number {
  let lo = from,
    hi = x.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x[mid]! < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Per-pixel-column decimation for a log10 τ axis (the rule of `internal/decimate.ts`: first, min,
 * max and last per column, in index order), without taking the log of every point: each column's
 * end is found by binary search for τ = 10^(lx0 + (c + 1)/scale), so the cost is one pass of
 * comparisons plus O(columns · log n). Returns vertices in (log10 τ, deviation). Deviations are
 * finite here (the data adapter dropped the others). Below 4 points per column it copies.
 */
export function decimateLogTau(
  tau: Float64Array,
  dev: Float64Array,
  lx0: number,
  lx1: number,
  columns: number,
): Polyline {
  const n = tau.length;
  if (dev.length !== n) {
    throw new RangeError(`deviation has ${dev.length} element(s) for ${n} τ value(s) (internal length error)`);
  }
  const cols = Math.max(1, Math.floor(columns));
  if (!shouldDecimate(n, cols) || !(lx1 > lx0)) return { x: Float64Array.from(tau, Math.log10), y: dev, length: n };
  const scale = cols / (lx1 - lx0);
  const x = new Float64Array(4 * cols + 16),
    y = new Float64Array(4 * cols + 16);
  let len = 0;
  const push = (k: number): void => {
    if (len === x.length) return; // cannot happen: at most four vertices per column
    x[len] = Math.log10(atNumber(tau, k, 'tau'));
    y[len] = atNumber(dev, k, 'deviation');
    len += 1;
  };
  let i = 0;
  while (i < n) {
    const col = Math.floor((Math.log10(atNumber(tau, i, 'tau')) - lx0) * scale);
    const j = Math.max(i + 1, lowerBoundFrom(tau, i + 1, 10 ** (lx0 + (col + 1) / scale)));
    // Tight scan of the column: k < j ≤ n = dev.length (checked above).
    let lo = i,
      hi = i,
      yl = atNumber(dev, i, 'deviation'),
      yh = yl;
    for (let k = i + 1; k < j; k++) {
      const v = dev[k]!;
      if (v < yl) {
        yl = v;
        lo = k;
      } else if (v > yh) {
        yh = v;
        hi = k;
      }
    }
    const a = Math.min(lo, hi),
      b = Math.max(lo, hi),
      last = j - 1;
    push(i);
    if (a !== i) push(a);
    if (b !== a && b !== i) push(b);
    if (last !== b && last !== a && last !== i) push(last);
    i = j;
  }
  return { x, y, length: len };
}

/** How one series is drawn. */
export interface SeriesStyle {
  color: string;
  shape: PlotShape;
  dashed: boolean;
  surface: string;
  intervals: boolean;
}

/**
 * Draws one series: the line (decimated per device-pixel column when dense), and, while sparse
 * enough to read, its error bars and open markers (open so a marker under another stays visible).
 */
export function drawSeries(
  ctx: CanvasRenderingContext2D,
  s: StabilitySeries,
  sx: Scale,
  sy: Scale,
  frame: Frame,
  style: SeriesStyle,
): void {
  const n = s.tau.length;
  if (n === 0) return;
  const ratio = Math.max(1, globalThis.devicePixelRatio || 1);
  const columns = Math.max(1, Math.round(frame.width * ratio));
  const lx0 = Math.log10(sx.domain[0]),
    lx1 = Math.log10(sx.domain[1]);
  const sxLog = linearScale(lx0, lx1, sx.range[0], sx.range[1]);
  ctx.strokeStyle = style.color;
  ctx.lineWidth = 1.5;
  ctx.lineJoin = 'round';
  // Time deviations are dashed so the eye does not compare them with σ_y on the other axis.
  ctx.setLineDash(style.dashed ? [5, 3] : []);
  strokePolyline(ctx, decimateLogTau(s.tau, s.deviation, lx0, lx1, columns), sxLog, sy);
  ctx.setLineDash([]);
  if (n * MARKER_SPACING_PX > frame.width) return;
  const lt = Float64Array.from(s.tau, Math.log10);
  const { low, high } = s;
  if (style.intervals && low && high) {
    ctx.lineWidth = 1;
    ctx.beginPath();
    for (const [i, t] of lt.entries()) {
      const lo = atNumber(low, i, 'low'),
        hi = atNumber(high, i, 'high');
      if (!(lo > 0) || !Number.isFinite(hi) || !(hi >= lo)) continue;
      const x = sxLog.map(t),
        y0 = sy.map(lo),
        y1 = sy.map(hi);
      ctx.moveTo(x, y0);
      ctx.lineTo(x, y1);
      ctx.moveTo(x - 3, y0);
      ctx.lineTo(x + 3, y0);
      ctx.moveTo(x - 3, y1);
      ctx.lineTo(x + 3, y1);
    }
    ctx.stroke();
  }
  ctx.lineWidth = 1.5;
  for (const [i, t] of lt.entries()) {
    ctx.stroke(plotMarkerPath(style.shape, sxLog.map(t), sy.map(atNumber(s.deviation, i, 'deviation')), 4.5));
  }
}
