/**
 * Layout, drawing and hit testing of `<tauline-fleet-timeline>`: one row per satellite (passes,
 * margin strip, uplinks) and one lane per station (supports, setup gaps) on one canvas. Pure
 * functions of the view, the layout and the scale; the element owns state and events.
 *
 * @module
 */

import type { CalendarTick } from '../internal/calendar-axis.js';
import { type MarkerShape, markerPath } from '../internal/canvas.js';
import { at } from '../internal/checked.js';
import type { Scale } from '../internal/scale.js';
import type { FleetCommandView, FleetView, SatelliteView, SupportView } from './fleet-data.js';

/** Resolved colours and font. */
export interface FleetColors {
  text: string;
  muted: string;
  grid: string;
  surface: string;
  accent: string;
  margin: string;
  risk: string;
  support: string;
  setup: string;
  pass: string;
  frequency: string;
  phase: string;
  font: string;
}

/** Pixel geometry of the timeline. */
export interface FleetLayout {
  width: number;
  height: number;
  /** Left edge of the time area (labels to its left). */
  left: number;
  right: number;
  /** Top of the first satellite row. */
  top: number;
  rowHeight: number;
  /** Top of the "Stations" heading, and of the first lane. */
  stationsHeading: number;
  laneTop: number;
  laneHeight: number;
  rows: number;
  lanes: number;
}

const AXIS_HEIGHT = 34;
const ROW_HEIGHT = 20;
const LANE_HEIGHT = 24;
const SECTION_GAP = 20;

/** The layout for `rows` satellites and `lanes` stations at a width (CSS px); its height follows from the counts. */
export function fleetLayout(width: number, rows: number, lanes: number): FleetLayout {
  const left = Math.round(Math.min(128, Math.max(112, width * 0.22)));
  const top = AXIS_HEIGHT;
  const stationsHeading = top + rows * ROW_HEIGHT + 4;
  const laneTop = stationsHeading + SECTION_GAP - 4;
  return {
    width,
    height: laneTop + lanes * LANE_HEIGHT + 6,
    left,
    right: width - 10,
    top,
    rowHeight: ROW_HEIGHT,
    stationsHeading,
    laneTop,
    laneHeight: LANE_HEIGHT,
    rows,
    lanes,
  };
}

/** The height the timeline needs for its rows and lanes, CSS px. */
export function fleetHeight(rows: number, lanes: number): number {
  return fleetLayout(400, rows, lanes).height;
}

/** Marker of a command: triangles for frequency steps pointing the way of the step, a diamond for a phase step. */
export function commandShape(c: Pick<FleetCommandView, 'kind' | 'step'>): MarkerShape {
  if (c.kind === 'phase') return 'diamond';
  return c.step < 0 ? 'triangle-down' : 'triangle-up';
}

/** A diagonal hatch pattern in `color` (risk and setup fills: they differ by texture, not only by colour). */
export function hatch(ctx: CanvasRenderingContext2D, color: string, spacing = 6): CanvasPattern | string {
  const tile = document.createElement('canvas');
  tile.width = tile.height = spacing;
  const t = tile.getContext('2d');
  if (!t) return color;
  t.strokeStyle = color;
  t.lineWidth = 1.5;
  t.beginPath();
  t.moveTo(-1, spacing + 1);
  t.lineTo(spacing + 1, -1);
  t.moveTo(-1, 1);
  t.lineTo(1, -1);
  t.moveTo(spacing - 1, spacing + 1);
  t.lineTo(spacing + 1, spacing - 1);
  t.stroke();
  return ctx.createPattern(tile, 'repeat') ?? color;
}

/**
 * Per-pixel-column smallest margin fraction (margin / tolerance) over [x0, x1) of the scale; NaN where no sample.
 * Sample i covers [t[i], t[i + 1]] (the last one only its own instant). Hot (every grid sample of every row,
 * on each pan): plain index loops; t[i] and margin[i] are bounded by i < t.length = margin.length (checked on
 * entry), out[c] by c ≤ b < cols.
 */
export function columnMinima(
  t: Float64Array,
  margin: Float64Array,
  tolerance: number,
  sx: Scale,
  layout: FleetLayout,
): Float64Array {
  const cols = Math.max(0, Math.ceil(layout.right - layout.left));
  const out = new Float64Array(cols).fill(Number.NaN);
  if (margin.length !== t.length) {
    throw new RangeError(`margin has ${margin.length} element(s) for ${t.length} grid time(s)`);
  }
  const [d0, d1] = sx.domain;
  for (let i = 0; i < t.length; i++) {
    const ta = t[i]!,
      tb = t[i + 1] ?? ta; // the last sample has no next one
    if (tb < d0 || ta > d1) continue;
    const a = Math.max(0, Math.floor(sx.map(ta) - layout.left));
    const b = Math.min(cols - 1, Math.max(a, Math.ceil(sx.map(tb) - layout.left) - 1));
    const f = margin[i]! / tolerance;
    for (let c = a; c <= b; c++) {
      const cur = out[c]!;
      if (!(cur <= f)) out[c] = f;
    }
  }
  return out;
}

interface DrawInput {
  view: FleetView;
  layout: FleetLayout;
  sx: Scale;
  ticks: readonly CalendarTick[];
  colors: FleetColors;
  atRisk: readonly boolean[];
  riskFraction: number;
}

function drawAxis(ctx: CanvasRenderingContext2D, { layout, sx, ticks, colors }: DrawInput): void {
  const bottom = layout.height - 4;
  ctx.strokeStyle = colors.grid;
  ctx.lineWidth = 1;
  ctx.beginPath();
  for (const tick of ticks) {
    const x = Math.round(sx.map(tick.value)) + 0.5;
    ctx.moveTo(x, layout.top - 4);
    ctx.lineTo(x, bottom);
  }
  ctx.stroke();
  ctx.fillStyle = colors.muted;
  ctx.font = colors.font;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'bottom';
  let lastRight = -Infinity;
  for (const tick of ticks) {
    const x = sx.map(tick.value);
    const w = Math.max(ctx.measureText(tick.label).width, tick.sub ? ctx.measureText(tick.sub).width : 0);
    const cx = Math.max(layout.left + w / 2, Math.min(layout.width - w / 2 - 1, x));
    if (cx - w / 2 < lastRight + 6) continue;
    ctx.fillText(tick.label, cx, layout.top - 6);
    if (tick.sub) ctx.fillText(tick.sub, cx, layout.top - 19);
    lastRight = cx + w / 2;
  }
}

function drawLabels(ctx: CanvasRenderingContext2D, { view, layout, colors, atRisk }: DrawInput): void {
  ctx.font = colors.font;
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  const clipLabel = (text: string, room: number): string => {
    let s = text;
    while (s.length > 3 && ctx.measureText(s).width > room) s = s.slice(0, -1);
    return s === text ? s : `${s.slice(0, -1)}…`;
  };
  // The ⚠ of an at-risk satellite sits at the left edge, so the id keeps its room.
  const icon = ctx.measureText('⚠ ').width;
  view.satellites.forEach((s, i) => {
    const y = layout.top + i * layout.rowHeight + layout.rowHeight / 2;
    ctx.fillStyle = atRisk[i] ? colors.risk : colors.text;
    ctx.textAlign = 'right';
    ctx.fillText(clipLabel(s.id, layout.left - 8 - (atRisk[i] ? icon : 0)), layout.left - 6, y);
    if (atRisk[i]) {
      ctx.textAlign = 'left';
      ctx.fillText('⚠', 2, y);
    }
  });
  ctx.textAlign = 'left';
  ctx.fillStyle = colors.muted;
  ctx.fillText('Stations', 4, layout.stationsHeading + 6);
  ctx.textAlign = 'right';
  ctx.fillStyle = colors.text;
  view.stations.forEach((st, k) => {
    ctx.fillText(clipLabel(st.id, layout.left - 10), layout.left - 6, layout.laneTop + (k + 0.5) * layout.laneHeight);
  });
}

type Fill = CanvasPattern | string;

function drawMarginStrip(
  ctx: CanvasRenderingContext2D,
  input: DrawInput,
  [i, s]: [number, SatelliteView],
  riskPattern: Fill,
): void {
  const { layout, sx, colors, riskFraction } = input;
  const y0 = layout.top + i * layout.rowHeight + 3,
    h = layout.rowHeight - 9;
  const cols = columnMinima(s.t, s.margin, s.tolerance, sx, layout);
  const ok = new Path2D(),
    low = new Path2D(),
    out = new Path2D();
  for (const [c, f] of cols.entries()) {
    if (Number.isNaN(f)) continue;
    const x = layout.left + c;
    if (f < 0) out.rect(x, y0, 1, h);
    else if (f < riskFraction) low.rect(x, y0 + h - Math.max(2, h * f), 1, Math.max(2, h * f));
    else ok.rect(x, y0 + h - h * Math.min(1, f), 1, h * Math.min(1, f));
  }
  ctx.fillStyle = colors.margin;
  ctx.globalAlpha = 0.75;
  ctx.fill(ok);
  ctx.globalAlpha = 1;
  ctx.fillStyle = colors.risk;
  ctx.fill(low);
  ctx.fillStyle = riskPattern;
  ctx.fill(out);
  // The tolerance edge: margin zero is the strip's floor, a full strip is |offset| bound at zero.
  ctx.strokeStyle = colors.grid;
  ctx.beginPath();
  ctx.moveTo(layout.left, y0 + h + 0.5);
  ctx.lineTo(layout.right, y0 + h + 0.5);
  ctx.stroke();
}

function drawSatelliteRow(
  ctx: CanvasRenderingContext2D,
  input: DrawInput,
  [i, s]: [number, SatelliteView],
  riskPattern: Fill,
): void {
  const { layout, sx, colors, atRisk } = input;
  const y = layout.top + i * layout.rowHeight;
  const [d0, d1] = sx.domain;
  if (atRisk[i]) {
    ctx.globalAlpha = 0.18;
    ctx.fillStyle = riskPattern;
    ctx.fillRect(layout.left, y, layout.right - layout.left, layout.rowHeight);
    ctx.globalAlpha = 1;
  }
  // Passes: a thin bar along the row's foot.
  ctx.fillStyle = colors.pass;
  ctx.globalAlpha = 0.55;
  for (const p of s.passes) {
    if (p.end < d0 || p.start > d1) continue;
    const a = sx.map(p.start),
      b = sx.map(p.end);
    ctx.fillRect(a, y + layout.rowHeight - 4, Math.max(1, b - a), 2);
  }
  ctx.globalAlpha = 1;
  drawMarginStrip(ctx, input, [i, s], riskPattern);
  // Uplinks: a tick at the uplink joined to the command's marker at its execution.
  const mid = y + (layout.rowHeight - 6) / 2 + 1;
  ctx.lineWidth = 1;
  for (const c of s.commands) {
    if (c.executeAt < d0 || c.uplinkAt > d1) continue;
    const color = c.kind === 'phase' ? colors.phase : colors.frequency;
    const xu = sx.map(c.uplinkAt),
      xe = sx.map(c.executeAt);
    ctx.strokeStyle = color;
    ctx.beginPath();
    ctx.moveTo(xu, y + 2);
    ctx.lineTo(xu, mid);
    ctx.lineTo(xe, mid);
    ctx.stroke();
    const p = markerPath(commandShape(c), xe, mid, 4.5);
    ctx.fillStyle = color;
    ctx.fill(p);
    ctx.strokeStyle = colors.surface;
    ctx.stroke(p);
  }
}

/** Rectangle of a support in its lane, CSS px. */
export function supportRect(
  layout: FleetLayout,
  sx: Scale,
  s: Pick<SupportView, 'station' | 'start' | 'end'>,
): { x: number; y: number; w: number; h: number } {
  const x = sx.map(s.start);
  const y = layout.laneTop + s.station * layout.laneHeight + 3;
  return { x, y, w: Math.max(3, sx.map(s.end) - x), h: layout.laneHeight - 6 };
}

function drawLanes(ctx: CanvasRenderingContext2D, input: DrawInput, riskPattern: Fill, setupPattern: Fill): void {
  const { view, layout, sx, colors, atRisk } = input;
  const [d0, d1] = sx.domain;
  ctx.font = colors.font;
  ctx.textBaseline = 'middle';
  ctx.textAlign = 'center';
  for (const [k, st] of view.stations.entries()) {
    const y = layout.laneTop + k * layout.laneHeight;
    ctx.strokeStyle = colors.grid;
    ctx.beginPath();
    ctx.moveTo(layout.left, y + 0.5);
    ctx.lineTo(layout.right, y + 0.5);
    ctx.stroke();
    for (const sup of st.supports) {
      if (sup.end + st.setup < d0 || sup.start > d1) continue;
      const r = supportRect(layout, sx, sup);
      // Setup after the support: the station cannot serve again before its end.
      const sEnd = sx.map(sup.end + st.setup);
      ctx.fillStyle = setupPattern;
      ctx.fillRect(r.x + r.w, r.y + 4, Math.max(1, sEnd - r.x - r.w), r.h - 8);
      ctx.fillStyle = colors.support;
      ctx.fillRect(r.x, r.y, r.w, r.h);
      if (atRisk[sup.satellite]) {
        ctx.fillStyle = riskPattern;
        ctx.fillRect(r.x, r.y + r.h - 4, r.w, 4);
      }
      const { id } = at(view.satellites, sup.satellite, 'satellites');
      if (ctx.measureText(id).width + 4 <= r.w) {
        ctx.fillStyle = colors.surface;
        ctx.fillText(id, r.x + r.w / 2, r.y + r.h / 2);
      }
    }
  }
}

/** Draws the axis, labels, satellite rows and station lanes on a sized, cleared canvas. */
export function drawFleet(ctx: CanvasRenderingContext2D, input: DrawInput): void {
  const { layout, colors } = input;
  const riskPattern = hatch(ctx, input.colors.risk);
  const setupPattern = hatch(ctx, input.colors.setup, 4);
  drawAxis(ctx, input);
  drawLabels(ctx, input);
  ctx.save();
  ctx.beginPath();
  ctx.rect(layout.left, 0, layout.right - layout.left, layout.height);
  ctx.clip();
  for (const row of input.view.satellites.entries()) drawSatelliteRow(ctx, input, row, riskPattern);
  drawLanes(ctx, input, riskPattern, setupPattern);
  ctx.restore();
  ctx.strokeStyle = colors.muted;
  ctx.lineWidth = 1;
  const width = layout.right - layout.left - 1;
  ctx.strokeRect(layout.left + 0.5, layout.top - 0.5, width, layout.rows * layout.rowHeight + 1);
  ctx.strokeRect(layout.left + 0.5, layout.laneTop + 0.5, width, layout.lanes * layout.laneHeight - 1);
}

/** What is under a point: a satellite row (with the nearest command within 7 px), a support, or a lane. */
export type FleetHit =
  | { kind: 'satellite'; satellite: number; command: number; t: number }
  | { kind: 'support'; station: number; support: number; t: number }
  | { kind: 'lane'; station: number; t: number };

/** Hit test at (x, y) CSS px. */
export function hitTest(view: FleetView, layout: FleetLayout, sx: Scale, x: number, y: number): FleetHit | null {
  if (x < layout.left || x > layout.right) return null;
  const t = sx.invert(x);
  const row = Math.floor((y - layout.top) / layout.rowHeight);
  if (y >= layout.top && row >= 0 && row < layout.rows) {
    const s = at(view.satellites, row, 'satellites');
    let command = -1,
      best = 7;
    for (const [k, c] of s.commands.entries()) {
      const d = Math.abs(sx.map(c.executeAt) - x);
      if (d <= best) {
        best = d;
        command = k;
      }
    }
    return { kind: 'satellite', satellite: row, command, t };
  }
  const lane = Math.floor((y - layout.laneTop) / layout.laneHeight);
  if (y < layout.laneTop || lane < 0 || lane >= layout.lanes) return null;
  const { supports } = at(view.stations, lane, 'stations');
  let support = -1,
    best = 3;
  for (const [k, s] of supports.entries()) {
    const r = supportRect(layout, sx, s);
    const d = x < r.x ? r.x - x : x > r.x + r.w ? x - r.x - r.w : 0;
    if (d <= best) {
      best = d;
      support = k;
    }
  }
  return support >= 0 ? { kind: 'support', station: lane, support, t } : { kind: 'lane', station: lane, t };
}
