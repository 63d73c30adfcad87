/**
 * The fleet timeline's keyboard cursor and its hover overlay: where the arrow keys go, and the
 * selection, cursor and hover marks drawn on the overlay canvas. Pure functions of the view, the
 * layout and the cursor (no element state), so the element only wires them up.
 *
 * @module
 */
import type { Scale } from '../internal/scale.js';
import type { FleetView } from './fleet-data.js';
import { type FleetHit, type FleetLayout, supportRect } from './fleet-draw.js';

/** Keyboard cursor: a satellite row (and the uplink reached, −1 for none), or a support of a station lane. */
export type Cursor =
  | { kind: 'satellite'; satellite: number; command: number }
  | { kind: 'support'; station: number; support: number };

/** The first support of a station lane that ends at or after `viewStart` (0 when none does). */
export function firstVisibleSupport(d: FleetView, station: number, viewStart: number): number {
  const supports = d.stations[station]?.supports ?? [];
  return Math.max(
    0,
    supports.findIndex((s) => s.end >= viewStart),
  );
}

/**
 * The cursor after a key (↑/↓ rows then lanes, ←/→ and Home/End inside a lane, Home/End rows),
 * or null when the key does not move it. `viewStart`: start of the view, seconds since the epoch.
 */
export function nextCursor(key: string, d: FleetView, c: Cursor | null, viewStart: number): Cursor | null {
  const rows = d.satellites.length,
    lanes = d.stations.length;
  // Rows in order: satellites 0..rows−1, then lanes rows..rows+lanes−1.
  const row = !c ? -1 : c.kind === 'satellite' ? c.satellite : rows + c.station;
  const toRow = (r: number): Cursor =>
    r < rows
      ? { kind: 'satellite', satellite: r, command: -1 }
      : { kind: 'support', station: r - rows, support: firstVisibleSupport(d, r - rows, viewStart) };
  if (key === 'ArrowDown') return toRow(Math.min(rows + lanes - 1, row + 1));
  if (key === 'ArrowUp') return toRow(Math.max(0, row < 0 ? 0 : row - 1));
  if (c?.kind === 'support') {
    const n = d.stations[c.station]?.supports.length ?? 0;
    if (key === 'ArrowRight') return { ...c, support: Math.min(n - 1, c.support + 1) };
    if (key === 'ArrowLeft') return { ...c, support: Math.max(0, c.support - 1) };
    if (key === 'Home') return { ...c, support: 0 };
    if (key === 'End') return { ...c, support: n - 1 };
  }
  if (key === 'Home') return toRow(0);
  if (key === 'End') return toRow(rows - 1);
  return null;
}

/** What the overlay shows. */
export interface OverlayInput {
  view: FleetView;
  layout: FleetLayout;
  sx: Scale;
  colors: { accent: string; text: string; muted: string };
  /** Index of the selected satellite, −1 for none. */
  selected: number;
  cursor: Cursor | null;
  hover: FleetHit | null;
}

/** Draws the selection outline, the keyboard cursor (row, uplink ring or support) and the hover time line. */
export function drawFleetOverlay(ctx: CanvasRenderingContext2D, o: OverlayInput): void {
  const { view: d, layout, sx, colors, cursor: c } = o;
  const outline = (x: number, y: number, w: number, h: number, color: string, width: number): void => {
    ctx.strokeStyle = color;
    ctx.lineWidth = width;
    ctx.strokeRect(x, y, w, h);
  };
  const ring = (x: number, y: number): void => {
    ctx.strokeStyle = colors.accent;
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.arc(x, y, 8, 0, Math.PI * 2);
    ctx.stroke();
  };
  const rowY = (i: number): number => layout.top + i * layout.rowHeight;
  const width = layout.right - layout.left;
  if (o.selected >= 0)
    outline(layout.left - 1, rowY(o.selected) + 0.5, width + 2, layout.rowHeight - 1, colors.accent, 2);
  if (c?.kind === 'satellite') outline(1, rowY(c.satellite) + 1, layout.right, layout.rowHeight - 2, colors.text, 1);
  // The uplink the arrow keys reached: a ring around its marker (mid-row, as fleet-draw.ts places it).
  const up = c?.kind === 'satellite' ? d.satellites[c.satellite]?.commands[c.command] : undefined;
  if (c?.kind === 'satellite' && up) ring(sx.map(up.executeAt), rowY(c.satellite) + (layout.rowHeight - 6) / 2 + 1);
  if (c?.kind === 'support') {
    const sup = d.stations[c.station]?.supports[c.support];
    const r = sup ? supportRect(layout, sx, sup) : null;
    if (r) outline(r.x - 2, r.y - 2, r.w + 4, r.h + 4, colors.accent, 2);
  }
  const hv = o.hover;
  if (hv && hv.kind !== 'lane') {
    const x = Math.round(sx.map(hv.t)) + 0.5;
    ctx.strokeStyle = colors.muted;
    ctx.lineWidth = 1;
    ctx.setLineDash([2, 3]);
    ctx.beginPath();
    ctx.moveTo(x, layout.top);
    ctx.lineTo(x, layout.height - 4);
    ctx.stroke();
    ctx.setLineDash([]);
  }
}
