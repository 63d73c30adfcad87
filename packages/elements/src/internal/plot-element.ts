/**
 * Shared base of the canvas plots: a sized box holding a data canvas (drawn when data, view or
 * size change) and an overlay canvas (cursor and hover, cheap to redraw), a tooltip node, a
 * hidden probe resolving CSS custom properties to canvas colours, and a ResizeController.
 *
 * @module
 */
import { html, LitElement, type PropertyDeclarations, type PropertyValues, type TemplateResult } from 'lit';
import { resolveColors, resolveFont } from './canvas.js';
import { ResizeController } from './resize.js';

/** Base class for the canvas plots (not registered as an element). */
export abstract class PlotElement extends LitElement {
  static override properties: PropertyDeclarations = {
    theme: { reflect: true },
  };

  /** Colour scheme: `light`, `dark`, or unset to inherit the page's `color-scheme`. */
  theme?: 'light' | 'dark';

  /**
   * Whether the first size is measured synchronously when the plot box first renders (one layout
   * read in the update cycle, so the first update draws). Plots with a large DOM set this false:
   * they then draw when the ResizeObserver first reports, still before the first paint.
   * @internal
   */
  protected static readonly measureOnFirstUpdate: boolean = true;

  /** @internal */
  protected readonly _size = new ResizeController(
    this,
    () => this.renderRoot.querySelector?.('.plot-box'),
    () => (this.constructor as typeof PlotElement).measureOnFirstUpdate,
  );
  private _colorCache: Record<string, string> | null = null;
  private _schemeKey = '';
  private _media: MediaQueryList | undefined;
  private readonly _onScheme = (): void => this.refreshTheme();

  override connectedCallback(): void {
    super.connectedCallback();
    this._media = globalThis.matchMedia?.('(prefers-color-scheme: dark)');
    this._media?.addEventListener('change', this._onScheme);
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this._media?.removeEventListener('change', this._onScheme);
  }

  /**
   * Re-reads the theme's custom properties and redraws. Canvas cannot follow `var()` by
   * itself: call this after changing `--tauline-*` tokens or the page's `color-scheme` at run time.
   * (Changes of the `theme` attribute and of the OS colour scheme are picked up automatically.)
   */
  refreshTheme(): void {
    this._colorCache = null;
    this.requestUpdate();
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    if (changed.has('theme')) this._colorCache = null;
  }

  /** The plot box element, once rendered. @internal */
  protected get _box(): HTMLElement | null {
    return this.renderRoot.querySelector<HTMLElement>('.plot-box');
  }

  /** @internal */
  protected get _dataCanvas(): HTMLCanvasElement | null {
    return this.renderRoot.querySelector<HTMLCanvasElement>('canvas.data');
  }

  /** @internal */
  protected get _overlayCanvas(): HTMLCanvasElement | null {
    return this.renderRoot.querySelector<HTMLCanvasElement>('canvas.overlay');
  }

  /** Resolves the given CSS colour expressions once per theme (cached until `refreshTheme()`). */
  protected _resolveColors<K extends string>(expressions: Record<K, string>): Record<K, string> & { font: string } {
    const probe = this.renderRoot.querySelector<HTMLElement>('.probe');
    if (!probe) return { ...(expressions as Record<K, string>), font: '12px sans-serif' };
    // A cheap key (computed scheme + text colour) catches a theme flip done by the page on its own.
    const cs = getComputedStyle(probe);
    const key = `${cs.colorScheme}|${cs.getPropertyValue('--text')}|${cs.fontFamily}`;
    if (!this._colorCache || key !== this._schemeKey) {
      this._colorCache = { ...resolveColors(probe, expressions), font: resolveFont(probe, 11.5) };
      this._schemeKey = key;
    }
    return this._colorCache as Record<K, string> & { font: string };
  }

  /** The plot box: data canvas (role img, labelled), overlay, tooltip and colour probe. */
  protected _renderPlotBox(
    label: string,
    tooltip: TemplateResult | null,
    extra: Record<string, unknown> = {},
  ): TemplateResult {
    void extra;
    return html`<div class="plot-box" part="plot">
        <canvas class="data" role="img" aria-label=${label}></canvas>
        <canvas class="overlay" aria-hidden="true"></canvas>
        ${tooltip}
      </div>
      <span class="probe" aria-hidden="true"></span>`;
  }
}
