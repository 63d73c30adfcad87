/**
 * Drawing of `<tauline-steering-schedule>` as pure functions (data + scales + context → draw):
 * {@link layoutSchedule} decimates the visible span and builds the scales, {@link commandMarkers}
 * places the command markers, {@link drawSchedule} paints the data canvas and
 * {@link drawScheduleOverlay} the hover/selection overlay. No element state: testable on any canvas.
 *
 * @module
 */

import { calendarTicks } from '../internal/calendar-axis.js';
import {
  drawAxes,
  type Frame,
  fillBand,
  type MarkerShape,
  markerPath,
  strokePolyline,
  type Tick,
} from '../internal/canvas.js';
import { type BandPolygon, decimateBand, decimateLine, type Polyline, visibleRange } from '../internal/decimate.js';
import { formatNumber, parseTimeUnit, pickTimeUnit, type TimeUnit } from '../internal/format.js';
import { linearScale, linearTicks, padDomain, type Scale } from '../internal/scale.js';
import { interpolate, type PlanClock, type PlanView, type SteeringCommandView } from './plan-data.js';
import { drawRevisions, type RevisionMarks, type RevisionView } from './revisions-layer.js';

type Ctx = CanvasRenderingContext2D;

/** Plot margins inside the plot box, CSS px. */
export const MARGIN = { left: 66, right: 14, top: 24, bottom: 50 } as const;

/** Canvas colours (resolved from the element's custom properties) and the font. */
export interface ScheduleColors {
  text: string;
  muted: string;
  grid: string;
  surface: string;
  accent: string;
  steered: string;
  unsteered: string;
  uncertainty: string;
  tolerance: string;
  contact: string;
  maneuver: string;
  frequency: string;
  phase: string;
  font: string;
}

/** The scales of a drawn view: time (s since the epoch) → x, offset (s) → y, the frame and the axis unit. */
export interface ScheduleScales {
  sx: Scale;
  sy: Scale;
  frame: Frame;
  unit: { unit: TimeUnit; seconds: number };
}

/** What {@link layoutSchedule} computes for one view: scales and the decimated series. */
export interface ScheduleLayout {
  scales: ScheduleScales;
  steered: Polyline;
  band: BandPolygon | null;
  unsteered: Polyline;
}

/** Layout options: the `y-unit` attribute, `fit-all`, and the device pixel ratio. */
export interface LayoutOptions {
  yUnit: string;
  fitAll: boolean;
  devicePixelRatio: number;
}

/** A drawn command marker: its position in the element's sorted command list and its centre, CSS px. */
export interface CommandMarker {
  c: number;
  x: number;
  y: number;
}

/** The marker shape of a command: frequency steps are triangles pointing the way of the step, phase steps diamonds. */
export function commandShape(c: Pick<SteeringCommandView, 'kind' | 'step'>): MarkerShape {
  if (c.kind === 'phase') return 'diamond';
  return c.step < 0 ? 'triangle-down' : 'triangle-up';
}

/** The plot frame inside a box of `width` × `height` CSS px. */
export function scheduleFrame(width: number, height: number): Frame {
  return {
    left: MARGIN.left,
    top: MARGIN.top,
    width: width - MARGIN.left - MARGIN.right,
    height: height - MARGIN.top - MARGIN.bottom,
  };
}

/**
 * Decimates the visible span [x0, x1] to the frame's device-pixel columns and fits the offset axis
 * to the steered prediction, its band and the tolerance (and the unsteered one with `fitAll`).
 */
export function layoutSchedule(
  d: PlanView,
  band: { low: Float64Array; high: Float64Array } | null,
  view: readonly [number, number],
  size: { width: number; height: number },
  options: LayoutOptions,
): ScheduleLayout {
  const frame = scheduleFrame(size.width, size.height);
  const [x0, x1] = view;
  const sx = linearScale(x0, x1, frame.left, frame.left + frame.width);
  const columns = Math.max(1, Math.round(frame.width * Math.max(1, options.devicePixelRatio || 1)));
  const [i0, i1] = visibleRange(d.t, x0, x1);
  const steered = decimateLine(d.t, d.steered, i0, i1, x0, x1, columns);
  const bandPolygon = band ? decimateBand(d.t, band.low, band.high, i0, i1, x0, x1, columns) : null;
  const unsteered = decimateLine(d.t, d.unsteered, i0, i1, x0, x1, columns);
  let lo = Infinity,
    hi = -Infinity;
  const take = (arr: Float64Array, n: number): void => {
    for (const v of arr.subarray(0, n)) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  };
  take(steered.y, steered.length);
  if (bandPolygon) {
    take(bandPolygon.low, bandPolygon.length);
    take(bandPolygon.high, bandPolygon.length);
  }
  if (options.fitAll) take(unsteered.y, unsteered.length);
  if (d.tolerance !== null) {
    lo = Math.min(lo, -d.tolerance);
    hi = Math.max(hi, d.tolerance);
  }
  const [y0, y1] = padDomain(lo, hi, 0.08);
  const sy = linearScale(y0, y1, frame.top + frame.height, frame.top);
  const unit = parseTimeUnit(options.yUnit) ?? pickTimeUnit(Math.max(Math.abs(y0), Math.abs(y1)));
  return { scales: { sx, sy, frame, unit }, steered, band: bandPolygon, unsteered };
}

/** Positions of the markers of the commands executing inside the view, on the steered line (kept inside the frame). */
export function commandMarkers(d: PlanView, scales: ScheduleScales): CommandMarker[] {
  const { sx, sy, frame } = scales;
  const [x0, x1] = sx.domain;
  const out: CommandMarker[] = [];
  for (const [k, c] of d.commands.entries()) {
    if (c.executeAt < x0 || c.executeAt > x1) continue;
    let yv = interpolate(d.t, d.steered, c.executeAt);
    if (!Number.isFinite(yv)) yv = 0;
    const y = Math.min(frame.top + frame.height - 7, Math.max(frame.top + 7, sy.map(yv)));
    out.push({ c: k, x: sx.map(c.executeAt), y });
  }
  return out;
}

/**
 * The time-axis ticks of a view: UTC clock times and dates read through the plan's time scales (the SDK's), so
 * they agree with the command table across a leap second. About one label per 70 px, at least four intervals,
 * so a phone-width plot still shows a few dates.
 */
export function scheduleTimeTicks(d: PlanClock, { sx, frame }: ScheduleScales): Tick[] {
  const [x0, x1] = sx.domain;
  return calendarTicks(d, x0, x1, Math.max(4, Math.floor(frame.width / 70)));
}

function drawTimeAxes(ctx: Ctx, d: PlanView, scales: ScheduleScales, colors: ScheduleColors): void {
  const { sx, sy, frame, unit } = scales;
  const [y0, y1] = sy.domain;
  const xTicks = scheduleTimeTicks(d, scales);
  const yTicks: Tick[] = linearTicks(
    Math.min(y0, y1),
    Math.max(y0, y1),
    Math.max(2, Math.floor(frame.height / 44)),
  ).map((v) => ({ value: v, label: formatNumber(v / unit.seconds, 4) }));
  const style = { text: colors.text, muted: colors.muted, grid: colors.grid, font: colors.font };
  drawAxes(ctx, frame, sx, sy, xTicks, yTicks, style, { x: 'UTC', y: `Clock offset (${unit.unit})` });
}

function drawContacts(ctx: Ctx, d: PlanView, { sx, frame }: ScheduleScales, colors: ScheduleColors): void {
  const [x0, x1] = sx.domain;
  ctx.fillStyle = colors.contact;
  const layers = [
    [0.14, frame.top, frame.height],
    [0.55, frame.top + frame.height - 4, 4],
  ] as const;
  for (const [alpha, top, height] of layers) {
    ctx.globalAlpha = alpha;
    for (const c of d.contacts) {
      if (c.end < x0 || c.start > x1) continue;
      const a = sx.map(c.start),
        b = sx.map(c.end);
      ctx.fillRect(a, top, Math.max(1, b - a), height);
    }
  }
}

function drawTolerance(ctx: Ctx, tolerance: number, { sy, frame }: ScheduleScales, colors: ScheduleColors): void {
  const ya = sy.map(tolerance),
    yb = sy.map(-tolerance);
  ctx.globalAlpha = 0.1;
  ctx.fillStyle = colors.tolerance;
  ctx.fillRect(frame.left, ya, frame.width, yb - ya);
  ctx.globalAlpha = 0.9;
  ctx.strokeStyle = colors.tolerance;
  ctx.lineWidth = 1;
  ctx.setLineDash([6, 4]);
  ctx.beginPath();
  ctx.moveTo(frame.left, Math.round(ya) + 0.5);
  ctx.lineTo(frame.left + frame.width, Math.round(ya) + 0.5);
  ctx.moveTo(frame.left, Math.round(yb) + 0.5);
  ctx.lineTo(frame.left + frame.width, Math.round(yb) + 0.5);
  ctx.stroke();
  ctx.setLineDash([]);
}

function drawLines(ctx: Ctx, layout: ScheduleLayout, colors: ScheduleColors): void {
  const { sx, sy } = layout.scales;
  if (layout.band) {
    ctx.globalAlpha = 0.2;
    ctx.fillStyle = colors.uncertainty;
    fillBand(ctx, layout.band, sx, sy);
  }
  ctx.globalAlpha = 1;
  ctx.lineJoin = 'round';
  ctx.strokeStyle = colors.unsteered;
  ctx.lineWidth = 1.5;
  ctx.setLineDash([7, 4]);
  strokePolyline(ctx, layout.unsteered, sx, sy);
  ctx.setLineDash([]);
  ctx.strokeStyle = colors.steered;
  ctx.lineWidth = 2;
  strokePolyline(ctx, layout.steered, sx, sy);
}

/** Manoeuvres: dashed vertical line with a flag at the top. */
function drawManeuvers(ctx: Ctx, d: PlanView, { sx, frame }: ScheduleScales, colors: ScheduleColors): void {
  const [x0, x1] = sx.domain;
  ctx.strokeStyle = colors.maneuver;
  ctx.fillStyle = colors.maneuver;
  ctx.lineWidth = 1.5;
  for (const m of d.maneuvers) {
    if (m.at < x0 || m.at > x1) continue;
    const x = Math.round(sx.map(m.at)) + 0.5;
    ctx.setLineDash([3, 3]);
    ctx.beginPath();
    ctx.moveTo(x, frame.top);
    ctx.lineTo(x, frame.top + frame.height);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.beginPath();
    ctx.moveTo(x - 5, frame.top);
    ctx.lineTo(x + 5, frame.top);
    ctx.lineTo(x, frame.top + 6);
    ctx.closePath();
    ctx.fill();
  }
}

/** Manoeuvre labels (Δa in metres) above the frame. */
function drawManeuverLabels(ctx: Ctx, d: PlanView, { sx, frame }: ScheduleScales, colors: ScheduleColors): void {
  const [x0, x1] = sx.domain;
  ctx.save();
  ctx.font = colors.font;
  ctx.fillStyle = colors.maneuver;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'bottom';
  for (const m of d.maneuvers) {
    if (m.at < x0 || m.at > x1) continue;
    const da = m.semiMajorAxisAfter - m.semiMajorAxisBefore;
    const text = Number.isFinite(da) ? `Δa ${da >= 0 ? '+' : '−'}${formatNumber(Math.abs(da), 3)} m` : 'manoeuvre';
    ctx.fillText(text, Math.min(frame.left + frame.width - 30, Math.max(frame.left + 30, sx.map(m.at))), frame.top - 3);
  }
  ctx.restore();
}

function drawMarkers(ctx: Ctx, d: PlanView, markers: readonly CommandMarker[], colors: ScheduleColors): void {
  ctx.lineWidth = 1.5;
  ctx.strokeStyle = colors.surface;
  for (const m of markers) {
    const c = d.commands[m.c];
    if (!c) continue;
    const p = markerPath(commandShape(c), m.x, m.y, 6);
    ctx.fillStyle = c.kind === 'phase' ? colors.phase : colors.frequency;
    ctx.fill(p);
    ctx.stroke(p);
  }
}

/**
 * Paints the data canvas: axes, contact windows, tolerance band, uncertainty band, unsteered and
 * steered lines, manoeuvres, command markers and the revision layer; returns what was placed.
 */
export function drawSchedule(
  ctx: Ctx,
  d: PlanView,
  layout: ScheduleLayout,
  colors: ScheduleColors,
  revisions: RevisionView | null,
): { markers: CommandMarker[]; revisionMarks: RevisionMarks } {
  const { scales } = layout;
  const { frame, sx, sy } = scales;
  drawTimeAxes(ctx, d, scales, colors);
  ctx.save();
  ctx.beginPath();
  ctx.rect(frame.left, frame.top, frame.width, frame.height);
  ctx.clip();
  drawContacts(ctx, d, scales, colors);
  if (d.tolerance !== null) drawTolerance(ctx, d.tolerance, scales, colors);
  drawLines(ctx, layout, colors);
  drawManeuvers(ctx, d, scales, colors);
  const markers = commandMarkers(d, scales);
  drawMarkers(ctx, d, markers, colors);
  const [x0, x1] = sx.domain;
  const revisionMarks = revisions
    ? drawRevisions(ctx, frame, sx, sy, [x0, x1], { t: d.t, y: d.steered }, revisions, {
        command: colors.frequency,
        estimate: colors.text,
      })
    : { superseded: [], estimates: [] };
  ctx.restore();
  drawManeuverLabels(ctx, d, scales, colors);
  return { markers, revisionMarks };
}

/** A hovered sample (index into the prediction) or command (position in the sorted command list). */
export type ScheduleHover = { kind: 'sample'; i: number; px: number } | { kind: 'command'; c: number; px: number };

/** Paints the overlay: the hovered sample's cursor and dot, rings around the selected and hovered command markers. */
export function drawScheduleOverlay(
  ctx: Ctx,
  d: PlanView,
  scales: ScheduleScales,
  hover: ScheduleHover | null,
  markers: readonly CommandMarker[],
  selected: number,
  colors: Pick<ScheduleColors, 'muted' | 'steered' | 'accent'>,
): void {
  const { frame, sx, sy } = scales;
  const t = hover?.kind === 'sample' ? d.t[hover.i] : undefined;
  const y = hover?.kind === 'sample' ? d.steered[hover.i] : undefined;
  if (t !== undefined && y !== undefined) {
    const x = Math.round(sx.map(t)) + 0.5;
    ctx.strokeStyle = colors.muted;
    ctx.lineWidth = 1;
    ctx.setLineDash([2, 3]);
    ctx.beginPath();
    ctx.moveTo(x, frame.top);
    ctx.lineTo(x, frame.top + frame.height);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.fillStyle = colors.steered;
    ctx.beginPath();
    ctx.arc(sx.map(t), sy.map(y), 3.5, 0, Math.PI * 2);
    ctx.fill();
  }
  for (const m of markers) {
    if (m.c !== selected && !(hover?.kind === 'command' && hover.c === m.c)) continue;
    ctx.strokeStyle = m.c === selected ? colors.accent : colors.muted;
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.arc(m.x, m.y, 10, 0, Math.PI * 2);
    ctx.stroke();
  }
}

/** The uncertainty band steered ± k·σ (k standard deviations), as two columns. */
export function uncertaintyBand(
  d: Pick<PlanView, 'steered' | 'steeredSigma'>,
  k: number,
): { low: Float64Array; high: Float64Array } {
  const n = d.steered.length;
  if (d.steeredSigma.length !== n) {
    throw new RangeError(`steeredSigma has ${d.steeredSigma.length} element(s) for ${n} steered value(s)`);
  }
  const low = new Float64Array(n),
    high = new Float64Array(n);
  // Hot over 10^6 samples: i < n, the length of both columns (checked above).
  for (let i = 0; i < n; i++) {
    const c = d.steered[i]!,
      s = d.steeredSigma[i]! * k;
    low[i] = c - s;
    high[i] = c + s;
  }
  return { low, high };
}

/** Largest |value| of a column (0 for an empty one). */
export function worstAbs(values: Float64Array): number {
  let worst = 0;
  for (const v of values) {
    const a = Math.abs(v);
    if (a > worst) worst = a;
  }
  return worst;
}
