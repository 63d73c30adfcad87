import type { StabilityRow } from '@tauline/sdk/stability';
import { html, nothing, type PropertyDeclarations, type PropertyValues, type TemplateResult } from 'lit';
import { type AxisStyle, drawAxes, sizeCanvas } from '../internal/canvas.js';
import { atNumber } from '../internal/checked.js';
import { lowerBound } from '../internal/decimate.js';
import { formatDuration, formatFraction, formatNumber, formatOffsetAuto } from '../internal/format.js';
import { PlotElement } from '../internal/plot-element.js';
import { logTicks } from '../internal/scale.js';
import { baseStyles, plotStyles } from '../internal/styles.js';
import { warnOnce } from '../internal/warn.js';
import {
  DEFAULT_MIN_TERMS,
  normaliseStability,
  pointOf,
  type StabilityColumns,
  type StabilitySet,
} from './stability-data.js';
import { decadeTicks, drawRightAxis, drawSeries, SHAPES } from './stability-draw.js';
import { isTimeStatistic, type StabilityScales, scaleOf, stabilityScales } from './stability-layout.js';
import { stabilityPlotStyles } from './stability-plot.styles.js';
import { renderStabilityTable, renderTableUnits, rowStarts, rowWindow } from './stability-table.js';
import { STEP_KEYS, stabilityLabel, statCode, statLabel, stepPoint, svgMarker } from './stability-text.js';

export type { StabilityColumns };

/** Axis titles; the time axis title is the one a T&F engineer expects beside seconds. */
const FREQUENCY_AXIS_TITLE = 'Deviation (dimensionless)';
const TIME_AXIS_TITLE = 'Time deviation (s)';
const COLOR_EXPR = {
  text: 'var(--text)',
  muted: 'var(--muted)',
  grid: 'var(--grid)',
  surface: 'var(--surface)',
  accent: 'var(--accent)',
  s1: 'var(--series-1)',
  s2: 'var(--series-2)',
  s3: 'var(--series-3)',
  s4: 'var(--series-4)',
  s5: 'var(--series-5)',
  s6: 'var(--series-6)',
} as const;

/** Hover search looks at most this many points per series near the pointer (dense series are sampled). */
const HOVER_CHECKS = 600;

/**
 * A log–log plot of frequency-stability statistics versus averaging time τ, with confidence
 * intervals as error bars, one marker shape per statistic, a hover and keyboard read-out, and a
 * table that is the plot's accessible equivalent. The element draws what the SDK computed; it
 * does no statistics itself.
 *
 * Units are kept apart: the fractional-frequency statistics (ADEV, OADEV, MDEV, HDEV, OHDEV,
 * TOTDEV, and any unknown name) are dimensionless and use the left axis "Deviation
 * (dimensionless)"; TDEV (and TTOTDEV) are time deviations in seconds and get their own scale on
 * a right-hand axis "Time deviation (s)", drawn dashed and marked "(s, right axis)" in the legend.
 * With only time deviations the single (left) axis is the time axis. The table has a Unit column (`s`, or the SI
 * symbol `1` for dimensionless).
 *
 * Data are immutable: assign a new `series` array to re-render. Large series stay fast: curves
 * are decimated per pixel column, markers are drawn only while they can be told apart, the table
 * renders only the rows in view, and no layout is read during an update.
 *
 * τ whose estimate rests on fewer than `min-terms` terms (default 2: a single term cannot carry a
 * confidence interval; NIST SP 1065 §5.3 [M]) are left off the plot and the table and listed in a
 * note under the plot. The legend's buttons hide and show each statistic.
 *
 * Keyboard: focus the plot, ←/→ step through the points of a statistic, ↑/↓ switch statistic,
 * Escape clears; the read-out is announced politely.
 *
 * @summary Deviation-versus-τ plot with confidence intervals; TDEV (seconds) on its own right-hand axis.
 *
 * @csspart base - The outer wrapper.
 * @csspart plot - The focusable box holding the canvases.
 * @csspart legend - The list of statistics with their marker shapes (and unit/axis for TDEV); each a toggle button.
 * @csspart tooltip - The hover or keyboard read-out (deviation with its unit).
 * @csspart table - The data table (accessible equivalent of the plot), with a unit column.
 * @csspart row - Each body row of the table (only the rows in view are rendered).
 * @csspart note - The note listing τ left off for too few terms.
 *
 * @cssproperty --series-1 - Colour of the first statistic (token `--tauline-color-series-1`; up to `--series-6`).
 * @cssproperty --plot-height - Height of the plot box (default 300px).
 * @cssproperty --grid - Grid line colour (token `--tauline-color-grid`).
 * @cssproperty --text - Text colour (token `--tauline-color-text`).
 * @cssproperty --muted - Axis label colour (token `--tauline-color-muted`).
 */
export class TaulineStabilityPlot extends PlotElement {
  static override styles = [baseStyles, plotStyles, stabilityPlotStyles];

  /** Size comes from the ResizeObserver's callback only: no layout is read during an update. */
  protected static override readonly measureOnFirstUpdate: boolean = false;

  static override properties: PropertyDeclarations = {
    series: { attribute: false },
    label: {},
    noTable: { type: Boolean, reflect: true, attribute: 'no-table' },
    noIntervals: { type: Boolean, reflect: true, attribute: 'no-intervals' },
    minTerms: { type: Number, attribute: 'min-terms' },
    _hover: { state: true, attribute: false },
    _announcement: { state: true, attribute: false },
    _hidden: { state: true, attribute: false },
    _tableWindow: { state: true, attribute: false },
  };

  /**
   * One entry per statistic in columnar form `{ statistic, tau, deviation, low?, high?, n?, noise? }`
   * (typed arrays welcome), or the SDK's rows (`StabilityRow[]`, one per τ with `statistics`).
   * `deviation`, `low` and `high` are dimensionless, except for `tdev`/`ttotdev`: seconds.
   */
  series?: readonly StabilityColumns[] | readonly StabilityRow[] | null;

  /** Heading shown above the plot. */
  label = 'Frequency stability';

  /** Leave the data table out (the plot keeps its accessible name and keyboard read-out). */
  noTable = false;

  /** Hide the confidence-interval error bars. */
  noIntervals = false;

  /** Smallest number of terms `n` for a τ to be shown (default 2; 1 shows every τ). Points without `n` are always shown. */
  minTerms = DEFAULT_MIN_TERMS;

  private _hover: { s: number; i: number } | null = null;
  private _announcement = '';
  /** Statistics the user hid with the legend buttons (by name, so they stay hidden across data updates). */
  private _hidden: ReadonlySet<string> = new Set();
  private _tableWindow: [number, number] = [0, 0];

  private _data: StabilitySet = { series: [], problems: [], fewTerms: [] };
  private _version = 0;
  private _scales: StabilityScales | null = null;
  private _drawKey = '';
  private _labelKey = '';
  private _label = '';

  protected override willUpdate(changed: PropertyValues<this>): void {
    super.willUpdate(changed);
    if (changed.has('series') || changed.has('minTerms')) {
      const minTerms = Number.isFinite(this.minTerms) && this.minTerms >= 1 ? this.minTerms : DEFAULT_MIN_TERMS;
      if (minTerms !== this.minTerms)
        warnOnce(
          this,
          'invalid-min-terms',
          `min-terms must be a number ≥ 1; received ${String(this.minTerms)}; using ${DEFAULT_MIN_TERMS}`,
        );
      this._data = normaliseStability(this.series, minTerms);
      this._version += 1;
      this._hover = null;
      this._announcement = '';
      this._tableWindow = rowWindow(0, this._tableRows());
      if (this._data.problems.length > 0) warnOnce(this, 'invalid-series', this._data.problems.join('; '));
    }
    if ((changed as PropertyValues).has('_hidden')) this._tableWindow = rowWindow(0, this._tableRows());
  }

  /** Series drawn: non-empty and not hidden by the user, with their index in `_data.series` (colour, shape). */
  private get _shown(): Array<{ k: number; s: StabilitySet['series'][number] }> {
    return this._data.series
      .map((s, k) => ({ k, s }))
      .filter((x) => x.s.tau.length > 0 && !this._hidden.has(x.s.statistic));
  }

  private _tableRows(): number {
    let n = 0;
    for (const { s } of this._shown) n += s.tau.length;
    return n;
  }

  /** True when both dimensionless and time-deviation statistics are drawn (time axis on the right). */
  private get _dualAxis(): boolean {
    const drawn = this._shown.map((x) => x.s);
    return drawn.some((s) => isTimeStatistic(s.statistic)) && drawn.some((s) => !isTimeStatistic(s.statistic));
  }

  /** Legend and read-out name with the unit (and axis) of time deviations. */
  private _nameWithUnit(statistic: string): string {
    if (!isTimeStatistic(statistic)) return statLabel(statistic);
    return `${statLabel(statistic)} (s${this._dualAxis ? ', right axis' : ''})`;
  }

  /** Accessible name of the plot, computed from the data (cached per data version and hidden set). */
  get plotLabel(): string {
    const key = `${this._version}|${[...this._hidden].join(',')}`;
    if (key !== this._labelKey) {
      this._label = stabilityLabel(this._shown.map((x) => x.s));
      this._labelKey = key;
    }
    return this._label;
  }

  protected override render(): TemplateResult {
    const drawable = this._data.series.some((s) => s.tau.length > 0);
    const hardError = !drawable && this._data.problems.length > 0;
    return html`<div part="base">
      <h3 class="title">${this.label}</h3>
      ${
        hardError
          ? html`<div class="state error" role="alert">Cannot plot the stability data: ${this._data.problems[0]}</div>`
          : !drawable
            ? html`<div class="state">${this._data.fewTerms.length > 0 ? 'Every τ has too few terms to show.' : 'No stability data yet.'}</div>`
            : html`${this._renderLegend()}
            <div class="plot-box" part="plot" tabindex="0" role="group" aria-roledescription="interactive plot"
              aria-label="Stability plot: ←/→ step through points, ↑/↓ switch statistic"
              @pointermove=${this._onPointerMove} @pointerleave=${this._onPointerLeave} @keydown=${this._onKeyDown}>
              <canvas class="data" role="img" aria-label=${this.plotLabel}></canvas>
              <canvas class="overlay" aria-hidden="true"></canvas>
              ${this._renderTooltip()}
            </div>
            <div class="sr-only" aria-live="polite">${this._announcement}</div>
            ${this.noTable ? nothing : renderTableUnits(this.noIntervals)}
            ${
              this.noTable
                ? nothing
                : html`<div class="table-wrap" tabindex="0" role="region" aria-label="Stability data table"
              @scroll=${this._onTableScroll}>${this._renderTable()}</div>`
            }`
      }
      ${this._renderFewTermsNote()}
      <span class="probe" aria-hidden="true"></span>
    </div>`;
  }

  private _renderTable(): TemplateResult {
    const shown = this._shown.map((x) => x.s);
    return renderStabilityTable({
      series: shown,
      starts: rowStarts(shown),
      window: this._tableWindow,
      noIntervals: this.noIntervals,
      code: statCode,
      isTime: isTimeStatistic,
    });
  }

  private _renderFewTermsNote(): TemplateResult | typeof nothing {
    const few = this._data.fewTerms;
    if (few.length === 0) return nothing;
    const list = few.map(
      (f) =>
        `${statCode(f.statistic)} at τ = ${f.taus.map((t) => formatDuration(t)).join(', ')}${f.count > f.taus.length ? ', …' : ''}`,
    );
    return html`<p class="note" part="note">Not shown: ${list.join('; ')} (fewer than ${this.minTerms >= 1 ? this.minTerms : DEFAULT_MIN_TERMS} terms; too few for a confidence interval, NIST SP 1065 §5.3). Set <code>min-terms="1"</code> to show them.</p>`;
  }

  private _renderLegend(): TemplateResult {
    return html`<ul part="legend" aria-label="Statistics (buttons show or hide each)">
      ${this._data.series.map((s, k) => {
        const on = !this._hidden.has(s.statistic);
        return html`<li><button type="button" class="series-toggle" aria-pressed=${on ? 'true' : 'false'}
          title=${on ? 'Hide this statistic' : 'Show this statistic'} @click=${() => this._toggle(s.statistic)}>
          <span class="swatch" aria-hidden="true"><svg width="18" height="10" viewBox="-9 -5 18 10">
            <line x1="-9" x2="9" y1="0" y2="0" stroke="var(--series-${(k % 6) + 1})" stroke-width="1.5"
              stroke-dasharray=${isTimeStatistic(s.statistic) ? '3 2' : 'none'}></line>
            ${svgMarker(SHAPES[k % SHAPES.length] ?? 'circle', `var(--series-${(k % 6) + 1})`)}
          </svg></span>${this._nameWithUnit(s.statistic)}</button></li>`;
      })}
    </ul>`;
  }

  private _toggle(statistic: string): void {
    const next = new Set(this._hidden);
    if (next.has(statistic)) next.delete(statistic);
    else next.add(statistic);
    this._hidden = next;
    this._hover = null;
  }

  /** Pixel position of point i of series k on the plot's scales (its own y axis); null before drawing. */
  private _pointPosition(k: number, i: number): { x: number; y: number } | null {
    const sc = this._scales,
      s = this._data.series[k];
    if (!sc || !s || this._hidden.has(s.statistic)) return null;
    const sy = scaleOf(sc, s.statistic),
      p = pointOf(s, i);
    return sy && p ? { x: sc.sx.map(p.tau), y: sy.map(p.deviation) } : null;
  }

  /** Plain-text read-out of a point, with the unit of its statistic (for the live region). */
  private _readout(k: number, i: number): string {
    const s = this._data.series[k],
      p = s ? pointOf(s, i) : null;
    if (!s || !p) return '';
    const unit = isTimeStatistic(s.statistic) ? ' s' : ' (dimensionless)';
    return `${statLabel(s.statistic)} at τ = ${formatNumber(p.tau, 5)} s: ${formatFraction(p.deviation, 4)}${unit}`;
  }

  private _renderTooltip(): TemplateResult | typeof nothing {
    const h = this._hover;
    const pos = h ? this._pointPosition(h.s, h.i) : null;
    const s = h ? this._data.series[h.s] : undefined,
      p = h && s ? pointOf(s, h.i) : null;
    if (!pos || !s || !p) return nothing;
    const boxW = this._size.width;
    const left = pos.x > boxW / 2 ? Math.max(0, pos.x - 200) : pos.x + 14;
    const time = isTimeStatistic(s.statistic);
    const unit = time ? ' s' : '';
    return html`<div part="tooltip" role="status" style="left:${left}px;top:${Math.max(0, pos.y - 60)}px">
      <strong>${this._nameWithUnit(s.statistic)}</strong>
      <dl>
        <dt>τ</dt><dd>${formatNumber(p.tau, 5)} s (${formatDuration(p.tau)})</dd>
        <dt>${time ? 'Time deviation' : 'Deviation'}</dt><dd>${formatFraction(p.deviation, 4)}${unit}${time ? ` (${formatOffsetAuto(p.deviation, 4)})` : ' (dimensionless)'}</dd>
        ${p.low !== null && p.high !== null ? html`<dt>Interval</dt><dd>${formatFraction(p.low, 3)} … ${formatFraction(p.high, 3)}${unit}</dd>` : nothing}
        ${p.n !== null ? html`<dt>Terms n</dt><dd>${formatNumber(p.n, 6)}</dd>` : nothing}
        ${p.noise ? html`<dt>Noise</dt><dd>${p.noise}</dd>` : nothing}
      </dl>
    </div>`;
  }

  protected override updated(): void {
    this._draw();
    this._drawOverlay();
  }

  private _draw(): void {
    const canvas = this._dataCanvas;
    const w = this._size.width,
      h = this._size.height;
    if (!canvas || w < 40 || h < 40) {
      this._scales = null;
      this._drawKey = '';
      return;
    }
    const colors = this._resolveColors(COLOR_EXPR);
    const key = `${this._version}|${w}|${h}|${colors.text}|${colors.s1}|${this.noIntervals}|${[...this._hidden].join(',')}|${globalThis.devicePixelRatio}`;
    if (key === this._drawKey && this._scales) return;
    this._drawKey = key;
    const ctx = sizeCanvas(canvas, w, h);
    if (!ctx) return;
    const shown = this._shown;
    const withIntervals = !this.noIntervals;
    const scales = stabilityScales(
      shown.map((x) => x.s),
      withIntervals,
      w,
      h,
    );
    this._scales = scales;
    if (!scales) return;
    const {
      sx,
      syFrequency,
      syTime,
      frame,
      frequencyExtent,
      timeExtent,
      tauRange: [t0, t1],
    } = scales;
    const xt = logTicks(sx.domain[0], sx.domain[1]);
    const xTicks = (xt.length >= 2 ? xt : [t0, t1]).map((v) => ({ value: v, label: `${formatNumber(v, 3)} s` }));
    const style: AxisStyle = { text: colors.text, muted: colors.muted, grid: colors.grid, font: colors.font };
    // The left axis is σ_y when there is any, else the time deviation; a second quantity goes right.
    const left =
      syFrequency && frequencyExtent
        ? { scale: syFrequency, extent: frequencyExtent, title: FREQUENCY_AXIS_TITLE }
        : syTime && timeExtent
          ? { scale: syTime, extent: timeExtent, title: TIME_AXIS_TITLE }
          : null;
    if (!left) return;
    drawAxes(ctx, frame, sx, left.scale, xTicks, decadeTicks(left.scale, left.extent), style, {
      x: 'Averaging time τ',
      y: left.title,
    });
    if (syFrequency && syTime && timeExtent)
      drawRightAxis(ctx, frame, syTime, decadeTicks(syTime, timeExtent), style, TIME_AXIS_TITLE, w);
    ctx.save();
    ctx.beginPath();
    ctx.rect(frame.left, frame.top, frame.width, frame.height);
    ctx.clip();
    const palette = [colors.s1, colors.s2, colors.s3, colors.s4, colors.s5, colors.s6];
    for (const { k, s } of shown) {
      const sy = scaleOf(scales, s.statistic);
      if (!sy) continue;
      drawSeries(ctx, s, sx, sy, frame, {
        color: palette[k % palette.length] ?? colors.s1,
        shape: SHAPES[k % SHAPES.length] ?? 'circle',
        dashed: isTimeStatistic(s.statistic),
        surface: colors.surface,
        intervals: withIntervals,
      });
    }
    ctx.restore();
  }

  private _drawOverlay(): void {
    const canvas = this._overlayCanvas;
    const w = this._size.width,
      h = this._size.height;
    if (!canvas || w < 40 || h < 40) return;
    const ctx = sizeCanvas(canvas, w, h);
    const hv = this._hover;
    const pos = hv ? this._pointPosition(hv.s, hv.i) : null;
    if (!ctx || !pos) return;
    const colors = this._resolveColors(COLOR_EXPR);
    ctx.strokeStyle = colors.accent;
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.arc(pos.x, pos.y, 8, 0, Math.PI * 2);
    ctx.stroke();
  }

  /** The nearest drawn point within 24 px of (px, py), looking only near the pointer's τ. */
  private _nearest(px: number, py: number): { s: number; i: number } | null {
    const sc = this._scales;
    if (!sc) return null;
    let best: { s: number; i: number } | null = null;
    let bestD = 24 * 24;
    const t0 = sc.sx.invert(px - 24),
      t1 = sc.sx.invert(px + 24);
    for (const { k, s } of this._shown) {
      const sy = isTimeStatistic(s.statistic) ? sc.syTime : sc.syFrequency;
      if (!sy) continue;
      const a = lowerBound(s.tau, t0),
        b = lowerBound(s.tau, t1);
      const stride = Math.max(1, Math.ceil((b - a) / HOVER_CHECKS));
      for (let i = a; i < b; i += stride) {
        const dx = sc.sx.map(atNumber(s.tau, i, 'tau')) - px,
          dy = sy.map(atNumber(s.deviation, i, 'deviation')) - py;
        const d = dx * dx + dy * dy;
        if (d < bestD) {
          bestD = d;
          best = { s: k, i };
        }
      }
    }
    return best;
  }

  private readonly _onPointerMove = (event: PointerEvent): void => {
    // offsetX/Y are relative to the canvas under the pointer (both canvases fill the box): no layout read.
    const target = event.target as Element | null;
    if (!this._scales || !(target instanceof HTMLCanvasElement)) return;
    const next = this._nearest(event.offsetX, event.offsetY);
    const cur = this._hover;
    if (cur?.s !== next?.s || cur?.i !== next?.i) this._hover = next;
  };

  private readonly _onPointerLeave = (): void => {
    this._hover = null;
  };

  private readonly _onTableScroll = (event: Event): void => {
    const next = rowWindow((event.currentTarget as HTMLElement).scrollTop, this._tableRows());
    if (next[0] !== this._tableWindow[0] || next[1] !== this._tableWindow[1]) this._tableWindow = next;
  };

  /** ←/→ step through a statistic's points, ↑/↓ switch statistic (same τ index where it exists), Escape clears. */
  private readonly _onKeyDown = (event: KeyboardEvent): void => {
    const drawn = this._shown.map(({ k, s }) => ({ k, n: s.tau.length }));
    if (drawn.length === 0) return;
    if (!STEP_KEYS.has(event.key)) return;
    const next = stepPoint(event.key, drawn, this._hover, (k) => this._data.series[k]?.tau.length ?? 0);
    event.preventDefault();
    this._hover = next;
    this._announcement = next ? this._readout(next.s, next.i) : '';
  };
}
