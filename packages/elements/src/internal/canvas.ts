/**
 * Canvas 2D helpers shared by the plots: device-pixel sizing, colour resolution from CSS
 * custom properties, gap-aware polylines and bands, marker shapes and axes.
 *
 * @module
 */
import { atNumber } from './checked.js';
import type { BandPolygon, Polyline } from './decimate.js';
import type { Scale } from './scale.js';

/** The plot area inside a canvas, in CSS pixels. */
export interface Frame {
  left: number;
  top: number;
  width: number;
  height: number;
}

/**
 * Sizes `canvas` to `cssWidth × cssHeight` CSS pixels at the device pixel ratio and returns
 * its context with the transform set so drawing uses CSS pixels; null without a 2D context.
 */
export function sizeCanvas(
  canvas: HTMLCanvasElement,
  cssWidth: number,
  cssHeight: number,
): CanvasRenderingContext2D | null {
  const ratio = Math.max(1, globalThis.devicePixelRatio || 1);
  const w = Math.max(1, Math.round(cssWidth * ratio));
  const h = Math.max(1, Math.round(cssHeight * ratio));
  if (canvas.width !== w) canvas.width = w;
  if (canvas.height !== h) canvas.height = h;
  canvas.style.width = `${cssWidth}px`;
  canvas.style.height = `${cssHeight}px`;
  const ctx = canvas.getContext('2d');
  if (!ctx) return null;
  ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
  ctx.clearRect(0, 0, cssWidth, cssHeight);
  return ctx;
}

/**
 * Resolves CSS colour expressions (`var(--line-color)`, `light-dark(...)`) to concrete
 * colours the canvas understands, through a hidden probe element inside the shadow root.
 * Canvas cannot read `var()`, so the plots call this once per theme change.
 */
export function resolveColors<K extends string>(probe: HTMLElement, expressions: Record<K, string>): Record<K, string> {
  const out = {} as Record<K, string>;
  for (const key of Object.keys(expressions) as K[]) {
    probe.style.color = '';
    probe.style.color = expressions[key];
    out[key] = getComputedStyle(probe).color || '#888';
  }
  probe.style.color = '';
  return out;
}

/** Resolves the host's font for canvas text: `<size>px <family>`. */
export function resolveFont(probe: HTMLElement, sizePx?: number): string {
  const cs = getComputedStyle(probe);
  const size = sizePx ?? (Number.parseFloat(cs.fontSize) || 12);
  return `${size}px ${cs.fontFamily || 'sans-serif'}`;
}

/**
 * Strokes a polyline in data units through the two scales; NaN vertices break the line. Per vertex
 * (up to 4 per device-pixel column, on every pan frame): plain index loops with the numeric checked read.
 */
export function strokePolyline(ctx: CanvasRenderingContext2D, line: Polyline, sx: Scale, sy: Scale): void {
  const path = new Path2D();
  let pen = false;
  for (let i = 0; i < line.length; i++) {
    const y = atNumber(line.y, i, 'line.y');
    if (Number.isNaN(y)) {
      pen = false;
      continue;
    }
    const px = sx.map(atNumber(line.x, i, 'line.x')),
      py = sy.map(y);
    if (pen) path.lineTo(px, py);
    else {
      path.moveTo(px, py);
      pen = true;
    }
  }
  ctx.stroke(path);
}

/** Fills a band between its low and high edges; NaN vertices split the band. */
export function fillBand(ctx: CanvasRenderingContext2D, band: BandPolygon, sx: Scale, sy: Scale): void {
  const path = new Path2D();
  let start = 0;
  const close = (from: number, to: number): void => {
    if (to - from < 1) return;
    const px = (i: number): number => sx.map(atNumber(band.x, i, 'band.x'));
    path.moveTo(px(from), sy.map(atNumber(band.high, from, 'band.high')));
    for (let i = from + 1; i < to; i++) path.lineTo(px(i), sy.map(atNumber(band.high, i, 'band.high')));
    for (let i = to - 1; i >= from; i--) path.lineTo(px(i), sy.map(atNumber(band.low, i, 'band.low')));
    path.closePath();
  };
  for (let i = 0; i < band.length; i++) {
    if (Number.isNaN(atNumber(band.low, i, 'band.low'))) {
      close(start, i);
      start = i + 1;
    }
  }
  close(start, band.length);
  ctx.fill(path);
}

/** Marker shapes: they differ by outline, not only by colour. */
export type MarkerShape = 'triangle-up' | 'triangle-down' | 'diamond' | 'circle' | 'square' | 'cross';

/** Adds a marker outline of the given shape centred at (x, y) with half-size r to `path`. */
export function markerPath(shape: MarkerShape, x: number, y: number, r: number): Path2D {
  const p = new Path2D();
  switch (shape) {
    case 'triangle-up':
      p.moveTo(x, y - r);
      p.lineTo(x + r, y + r * 0.8);
      p.lineTo(x - r, y + r * 0.8);
      p.closePath();
      break;
    case 'triangle-down':
      p.moveTo(x, y + r);
      p.lineTo(x + r, y - r * 0.8);
      p.lineTo(x - r, y - r * 0.8);
      p.closePath();
      break;
    case 'diamond':
      p.moveTo(x, y - r);
      p.lineTo(x + r, y);
      p.lineTo(x, y + r);
      p.lineTo(x - r, y);
      p.closePath();
      break;
    case 'square':
      p.rect(x - r * 0.8, y - r * 0.8, r * 1.6, r * 1.6);
      break;
    case 'cross':
      p.moveTo(x - r, y - r);
      p.lineTo(x + r, y + r);
      p.moveTo(x + r, y - r);
      p.lineTo(x - r, y + r);
      break;
    default:
      p.arc(x, y, r * 0.85, 0, Math.PI * 2);
  }
  return p;
}

/** Colours and font for axes. */
export interface AxisStyle {
  text: string;
  muted: string;
  grid: string;
  font: string;
}

/** A tick: position in data units and its label (optional second line). */
export interface Tick {
  value: number;
  label: string;
  sub?: string | null;
}

/** Draws grid lines, the frame and tick labels for both axes, plus optional axis titles. */
export function drawAxes(
  ctx: CanvasRenderingContext2D,
  frame: Frame,
  sx: Scale,
  sy: Scale,
  xTicks: readonly Tick[],
  yTicks: readonly Tick[],
  style: AxisStyle,
  titles: { x?: string; y?: string } = {},
): void {
  const { left, top, width, height } = frame;
  const right = left + width,
    bottom = top + height;
  ctx.save();
  ctx.lineWidth = 1;
  ctx.strokeStyle = style.grid;
  ctx.beginPath();
  for (const t of xTicks) {
    const x = Math.round(sx.map(t.value)) + 0.5;
    if (x < left - 0.5 || x > right + 0.5) continue;
    ctx.moveTo(x, top);
    ctx.lineTo(x, bottom);
  }
  for (const t of yTicks) {
    const y = Math.round(sy.map(t.value)) + 0.5;
    if (y < top - 0.5 || y > bottom + 0.5) continue;
    ctx.moveTo(left, y);
    ctx.lineTo(right, y);
  }
  ctx.stroke();
  ctx.strokeStyle = style.muted;
  ctx.strokeRect(left + 0.5, top + 0.5, width - 1, height - 1);
  ctx.fillStyle = style.muted;
  ctx.font = style.font;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  let lastRight = -Infinity;
  // Canvas width in CSS px: a label near either edge is shifted inwards so it is never clipped.
  const canvasWidth = ctx.canvas.width / (ctx.getTransform().a || 1);
  for (const t of xTicks) {
    const tick = sx.map(t.value);
    if (tick < left - 1 || tick > right + 1) continue;
    const w = Math.max(ctx.measureText(t.label).width, t.sub ? ctx.measureText(t.sub).width : 0);
    const x = Math.max(w / 2 + 1, Math.min(canvasWidth - w / 2 - 1, tick));
    if (x - w / 2 < lastRight + 6) continue; // skip labels that would overlap
    ctx.fillText(t.label, x, bottom + 5);
    if (t.sub) ctx.fillText(t.sub, x, bottom + 19);
    lastRight = x + w / 2;
  }
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const t of yTicks) {
    const y = sy.map(t.value);
    if (y < top - 1 || y > bottom + 1) continue;
    ctx.fillText(t.label, left - 6, y);
  }
  ctx.fillStyle = style.text;
  if (titles.x) {
    ctx.textAlign = 'right';
    ctx.textBaseline = 'top';
    ctx.fillText(titles.x, right, top + height + 33);
  }
  if (titles.y) {
    ctx.translate(12, top + height / 2);
    ctx.rotate(-Math.PI / 2);
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    ctx.fillText(titles.y, 0, 0);
  }
  ctx.restore();
}
