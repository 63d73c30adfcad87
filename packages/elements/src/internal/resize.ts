/**
 * A Lit reactive controller that tracks an element's content-box size with a ResizeObserver
 * and asks the host to update when it changes.
 *
 * @module
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';

/**
 * Observes `target()` (an element in the host's shadow root) and keeps `width`/`height` in CSS px.
 * Size changes request a host update; the first measurement is taken synchronously unless the
 * host opts out (then the observer's first callback, delivered after layout and before paint, sets it).
 */
export class ResizeController implements ReactiveController {
  width = 0;
  height = 0;
  private readonly _host: ReactiveControllerHost & HTMLElement;
  private readonly _target: () => Element | null | undefined;
  private _observer: ResizeObserver | undefined;
  private _observed: Element | undefined;

  private readonly _measureSynchronously: () => boolean;

  /**
   * @param measureSynchronously  When it returns true, the first size is read with
   *   `getBoundingClientRect()` as soon as the target exists (a layout read inside the update
   *   cycle); otherwise only the ResizeObserver's callbacks set the size.
   */
  constructor(
    host: ReactiveControllerHost & HTMLElement,
    target: () => Element | null | undefined,
    measureSynchronously: () => boolean = () => true,
  ) {
    this._host = host;
    this._target = target;
    this._measureSynchronously = measureSynchronously;
    host.addController(this);
  }

  hostConnected(): void {
    this._observer = new ResizeObserver((entries) => {
      const box = entries[entries.length - 1]?.contentRect;
      if (!box) return;
      const w = Math.floor(box.width),
        h = Math.floor(box.height);
      if (w !== this.width || h !== this.height) {
        this.width = w;
        this.height = h;
        this._host.requestUpdate();
      }
    });
    this._observed = undefined;
    this._observe();
  }

  hostUpdated(): void {
    this._observe();
  }

  hostDisconnected(): void {
    this._observer?.disconnect();
    this._observer = undefined;
    this._observed = undefined;
  }

  private _observe(): void {
    const el = this._target();
    if (!el || !this._observer || el === this._observed) return;
    if (this._observed) this._observer.unobserve(this._observed);
    this._observer.observe(el);
    this._observed = el;
    if (!this._measureSynchronously()) return;
    // Measure synchronously once (hostUpdated runs before the host's updated(), where it
    // draws), so the first draw has a size without a second update cycle.
    const rect = el.getBoundingClientRect();
    this.width = Math.floor(rect.width);
    this.height = Math.floor(rect.height);
  }
}
