/**
 * The time-axis view of a plot: which span [start, end] of the data's x domain is shown, and the
 * gestures that change it (drag, two-finger pinch, wheel, keyboard pan and zoom, reset). Pure
 * state plus pointer bookkeeping, no drawing: the host passes plot-local pixel positions and the
 * frame, and is told of every change (with whether the user made it, so only user changes fire
 * events).
 *
 * @module
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import type { Frame } from './canvas.js';

/** A span of the x domain, [start, end] with start < end. */
export type Span = readonly [number, number];

/** What the host needs from the view controller's gestures: the frame and the x scale's inverse. */
export interface ViewGeometry {
  frame: Frame;
  /** Pixel (plot-local, CSS px) → x value. */
  invert(px: number): number;
}

interface Gesture {
  x0: number;
  x1: number;
  px: number;
  moved: boolean;
  dist?: number;
  center?: number;
}

/**
 * Holds the visible span of a plot's x axis, clamped to the data's full span, and turns pointer,
 * wheel and key input into span changes. `onChange(span, byUser)` runs after each change.
 */
export class ViewController implements ReactiveController {
  private _full: Span | null = null;
  private _view: Span | null = null;
  private readonly _pointers = new Map<number, { x: number; y: number }>();
  private _gesture: Gesture | null = null;

  private readonly host: ReactiveControllerHost;
  private readonly onChange: (span: Span, byUser: boolean) => void;

  constructor(host: ReactiveControllerHost, onChange: (span: Span, byUser: boolean) => void) {
    this.host = host;
    this.onChange = onChange;
    host.addController(this);
  }

  hostConnected(): void {}

  hostDisconnected(): void {
    this._pointers.clear();
    this._gesture = null;
  }

  /** The visible span, or null without data. */
  get view(): Span | null {
    return this._view;
  }

  /** True while a drag or pinch is in progress. */
  get dragging(): boolean {
    return this._gesture?.moved === true && this._pointers.size > 0;
  }

  /** New data: sets the full span; keeps the current span while it lies inside it (a zoom survives updates). */
  setDomain(full: Span | null): void {
    this._full = full;
    if (!full) this._view = null;
    else if (!this._view || this._view[0] < full[0] || this._view[1] > full[1]) this._view = full;
  }

  /** Shows [a, b], clamped to the full span (at least 1e-5 of it, or 1 unit); no-op without data. */
  set(a: number, b: number, byUser: boolean): void {
    const full = this._full;
    if (!full) return;
    const [lo, hi] = full;
    const width = Math.max(hi - lo, 1e-9);
    const minSpan = Math.min(width, Math.max(width * 1e-5, 1));
    let span = Math.min(width, Math.max(minSpan, b - a));
    let start = (a + b) / 2 - span / 2;
    if (b - a >= minSpan && b - a <= width) {
      start = a;
      span = b - a;
    }
    start = Math.min(Math.max(start, lo), hi - span);
    const next: Span = [start, start + span];
    if (this._view && next[0] === this._view[0] && next[1] === this._view[1]) return;
    this._view = next;
    this.host.requestUpdate();
    this.onChange(next, byUser);
  }

  /** Shows the full span. */
  reset(byUser: boolean): void {
    if (this._full) this.set(this._full[0], this._full[1], byUser);
  }

  /** Scales the span by `factor` around the x value `anchor` (factor < 1 zooms in). */
  zoom(factor: number, anchor: number, byUser: boolean): void {
    if (!this._view) return;
    const [a, b] = this._view;
    this.set(anchor - (anchor - a) * factor, anchor + (b - anchor) * factor, byUser);
  }

  /** Shifts the span by `fraction` of its width (a user action). */
  pan(fraction: number): void {
    if (!this._view) return;
    const [a, b] = this._view;
    const shift = (b - a) * fraction;
    this.set(a + shift, b + shift, true);
  }

  /** Zoom around the centre of the span (a user action). */
  zoomAtCenter(factor: number): void {
    if (this._view) this.zoom(factor, (this._view[0] + this._view[1]) / 2, true);
  }

  /** A pointer went down at plot-local `p`: starts a drag (one pointer) or a pinch (two). */
  pointerDown(id: number, p: { x: number; y: number }): void {
    const v = this._view;
    if (!v) return;
    this._pointers.set(id, p);
    const [a, b] = this._pointers.values();
    if (this._pointers.size === 1) this._gesture = { x0: v[0], x1: v[1], px: p.x, moved: false };
    else if (this._pointers.size === 2 && a && b) {
      const center = (a.x + b.x) / 2;
      this._gesture = { x0: v[0], x1: v[1], px: center, moved: true, dist: Math.max(10, Math.abs(a.x - b.x)), center };
    }
  }

  /**
   * A pointer moved to plot-local `p`. Returns true when it belongs to a drag or pinch (the span
   * follows it; no user event until release), false for a free hover.
   */
  pointerMove(id: number, p: { x: number; y: number }, geometry: ViewGeometry): boolean {
    const g = this._gesture;
    if (!this._pointers.has(id) || !g) return false;
    this._pointers.set(id, p);
    const { frame } = geometry;
    const perPixel = (g.x1 - g.x0) / frame.width;
    const [a, b] = this._pointers.values();
    if (a && b && g.dist !== undefined && g.center !== undefined) {
      const dist = Math.max(10, Math.abs(a.x - b.x)),
        center = (a.x + b.x) / 2;
      const span = (g.x1 - g.x0) * (g.dist / dist);
      const anchor = g.x0 + (g.center - frame.left) * perPixel; // data value under the initial centre
      const start = anchor - (center - frame.left) * (span / frame.width);
      this.set(start, start + span, false);
    } else {
      const dx = p.x - g.px;
      if (Math.abs(dx) > 3) g.moved = true;
      if (g.moved) this.set(g.x0 - dx * perPixel, g.x1 - dx * perPixel, false);
    }
    return true;
  }

  /**
   * A pointer went up. Returns `drag` when it ended a drag or pinch (the host reports the span as
   * a user change), `click` when it was a press without movement, `none` otherwise.
   */
  pointerUp(id: number): 'drag' | 'click' | 'none' {
    const g = this._gesture;
    const wasPointer = this._pointers.delete(id);
    if (!wasPointer || !g) return 'none';
    if (this._pointers.size > 0) return 'none'; // the pinch goes on with the remaining finger ignored until release
    this._gesture = null;
    return g.moved ? 'drag' : 'click';
  }

  /** A pointer was cancelled (e.g. the browser took over the gesture). */
  pointerCancel(id: number): void {
    this._pointers.delete(id);
    if (this._pointers.size === 0) this._gesture = null;
  }

  /** True while any pointer is down. */
  get pointerDownNow(): boolean {
    return this._pointers.size > 0;
  }

  /** Wheel: a mostly horizontal delta pans, a vertical one zooms around the x under the pointer (inside the frame). */
  wheel(deltaX: number, deltaY: number, px: number, geometry: ViewGeometry): void {
    const { frame } = geometry;
    if (Math.abs(deltaX) > Math.abs(deltaY)) {
      this.pan(deltaX / frame.width);
      return;
    }
    const factor = Math.exp(Math.max(-1, Math.min(1, deltaY * 0.0015)));
    this.zoom(factor, geometry.invert(Math.min(Math.max(px, frame.left), frame.left + frame.width)), true);
  }
}
