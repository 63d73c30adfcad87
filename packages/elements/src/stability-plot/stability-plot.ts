import { html, nothing, type PropertyValues, type TemplateResult, type PropertyDeclarations } from 'lit';
import { PlotElement } from '../internal/plot-element.js';
import { baseStyles, plotStyles } from '../internal/styles.js';
import { stabilityPlotStyles } from './stability-plot.styles.js';
import { normaliseStability, type StabilityColumns, type StabilitySet } from './stability-data.js';
import { drawAxes, markerPath, sizeCanvas, type AxisStyle, type Frame, type MarkerShape, type Tick } from '../internal/canvas.js';
import { logScale, logTicks, type Scale } from '../internal/scale.js';
import { formatDuration, formatFraction, formatNumber, formatOffsetAuto } from '../internal/format.js';
import { warnOnce } from '../internal/warn.js';

export type { StabilityColumns };

/** Marker shapes by series index; `plus` is drawn here (the shared helper has six shapes). */
type PlotShape = MarkerShape | 'plus';
const SHAPES: readonly PlotShape[] = ['circle', 'square', 'diamond', 'triangle-up', 'triangle-down', 'cross', 'plus'];

/**
 * Statistics whose deviation is a time deviation σ_x in seconds (W. J. Riley, NIST SP 1065
 * (2008), TDEV σ_x(τ) = (τ/√3)·MDEV(τ), physics-refs §10 [M for the section]; TTOTDEV is its total
 * variant). Every other statistic is a dimensionless
 * fractional-frequency deviation σ_y.
 */
const TIME_STATISTICS: ReadonlySet<string> = new Set(['tdev', 'ttotdev']);

/** True when `statistic` is a time deviation in seconds rather than a dimensionless σ_y. */
function isTimeStatistic(statistic: string): boolean {
  return TIME_STATISTICS.has(statistic.toLowerCase());
}

/** Axis titles; the time axis title is the one a T&F engineer expects beside seconds. */
const FREQUENCY_AXIS_TITLE = 'Deviation (dimensionless)';
const TIME_AXIS_TITLE = 'Time deviation (s)';
const COLOR_EXPR = {
  text: 'var(--text)', muted: 'var(--muted)', grid: 'var(--grid)', surface: 'var(--surface)', accent: 'var(--accent)',
  s1: 'var(--series-1)', s2: 'var(--series-2)', s3: 'var(--series-3)', s4: 'var(--series-4)', s5: 'var(--series-5)', s6: 'var(--series-6)',
} as const;

const LABELS: Record<string, string> = {
  adev: 'ADEV', oadev: 'Overlapping ADEV', mdev: 'MDEV', tdev: 'TDEV', ttotdev: 'TTOTDEV', hdev: 'HDEV', ohdev: 'Overlapping HDEV', totdev: 'TOTDEV',
};

function statLabel(name: string): string {
  return LABELS[name] ?? name;
}

/** Short name for table rows: `OADEV`, `TDEV`, or the name as given. */
function statCode(name: string): string {
  return LABELS[name] ? name.toUpperCase() : name;
}

/** A marker path: the shared shapes plus a `plus` sign (upright cross, distinct from the diagonal `cross`). */
function plotMarkerPath(shape: PlotShape, x: number, y: number, r: number): Path2D {
  if (shape !== 'plus') return markerPath(shape, x, y, r);
  const p = new Path2D();
  p.moveTo(x - r, y); p.lineTo(x + r, y); p.moveTo(x, y - r); p.lineTo(x, y + r);
  return p;
}

/** Open shapes are stroked only (a fill would hide nothing and thicken them). */
function isOpenShape(shape: PlotShape): boolean {
  return shape === 'cross' || shape === 'plus';
}

/** Range of deviations (and interval bounds when shown) over a group of series; null if empty. */
function deviationExtent(series: StabilitySet['series'], withIntervals: boolean): [number, number] | null {
  let d0 = Infinity, d1 = -Infinity;
  for (const s of series) {
    for (let i = 0; i < s.tau.length; i++) {
      const d = s.deviation[i]!;
      const lo = withIntervals && s.low && s.low[i]! > 0 && Number.isFinite(s.low[i]!) ? s.low[i]! : d;
      const hi = withIntervals && s.high && s.high[i]! > 0 && Number.isFinite(s.high[i]!) ? s.high[i]! : d;
      d0 = Math.min(d0, lo, d); d1 = Math.max(d1, hi, d);
    }
  }
  if (!(d0 > 0) || !Number.isFinite(d1)) return null;
  if (!(d1 > d0)) { d0 /= 3; d1 *= 3; }
  return [d0, d1];
}

/**
 * Draws a logarithmic y axis on the right edge of `frame`: tick marks outside the frame, labels
 * and a title rotated to read top-down. Its own scale, no grid (the left axis owns the grid).
 */
function drawRightAxis(ctx: CanvasRenderingContext2D, frame: Frame, sy: Scale, ticks: readonly Tick[], style: AxisStyle, title: string, canvasWidth: number): void {
  const right = frame.left + frame.width, top = frame.top, bottom = frame.top + frame.height;
  ctx.save();
  ctx.strokeStyle = style.muted;
  ctx.lineWidth = 1;
  ctx.beginPath();
  for (const t of ticks) {
    const y = Math.round(sy.map(t.value)) + 0.5;
    if (y < top - 0.5 || y > bottom + 0.5) continue;
    ctx.moveTo(right, y); ctx.lineTo(right + 4, y);
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
function decadeTicks(sy: Scale, extent: readonly [number, number]): Tick[] {
  const yt = logTicks(sy.domain[0], sy.domain[1]);
  return (yt.length >= 2 ? yt : [extent[0], extent[1]]).map((v) => ({ value: v, label: formatFraction(v, yt.length >= 2 ? 1 : 3) }));
}

/** The plot's scales: τ, one y scale per quantity (null when absent), and where the time axis sits. */
interface StabilityScales {
  sx: Scale;
  /** Dimensionless σ_y axis (left), null when only time deviations are shown. */
  syFrequency: Scale | null;
  /** Time-deviation axis in seconds: right when σ_y is also shown, else left; null without TDEV. */
  syTime: Scale | null;
  frame: Frame;
}

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
 * Data are immutable: assign a new `series` array to re-render.
 *
 * Keyboard: focus the plot, ←/→ step through the points of a statistic, ↑/↓ switch statistic,
 * Escape clears; the read-out is announced politely.
 *
 * @summary Deviation-versus-τ plot with confidence intervals; TDEV (seconds) on its own right-hand axis.
 *
 * @csspart base - The outer wrapper.
 * @csspart plot - The focusable box holding the canvases.
 * @csspart legend - The list of statistics with their marker shapes (and unit/axis for TDEV).
 * @csspart tooltip - The hover or keyboard read-out (deviation with its unit).
 * @csspart table - The data table (accessible equivalent of the plot), with a unit column.
 * @csspart row - Each body row of the table.
 *
 * @cssproperty --series-1 - Colour of the first statistic (token `--tauline-color-series-1`; up to `--series-6`).
 * @cssproperty --plot-height - Height of the plot box (default 300px).
 * @cssproperty --grid - Grid line colour (token `--tauline-color-grid`).
 * @cssproperty --text - Text colour (token `--tauline-color-text`).
 * @cssproperty --muted - Axis label colour (token `--tauline-color-muted`).
 */
export class TaulineStabilityPlot extends PlotElement {
  static override styles = [baseStyles, plotStyles, stabilityPlotStyles];

  static override properties: PropertyDeclarations = {
    series: { attribute: false },
    label: {},
    noTable: { type: Boolean, reflect: true, attribute: 'no-table' },
    noIntervals: { type: Boolean, reflect: true, attribute: 'no-intervals' },
    _hover: { state: true, attribute: false },
    _announcement: { state: true, attribute: false },
  };

  /**
   * One entry per statistic in columnar form `{ statistic, tau, deviation, low?, high?, n?, noise? }`
   * (typed arrays welcome), or the SDK's rows (`StabilityRow[]`, one per τ with `statistics`).
   * `deviation`, `low` and `high` are dimensionless, except for `tdev`/`ttotdev`: seconds.
   */
  series?: readonly StabilityColumns[] | readonly unknown[] | null;

  /** Heading shown above the plot. */
  label = 'Frequency stability';

  /** Hide the data table visually (it stays available to assistive technology). */
  noTable = false;

  /** Hide the confidence-interval error bars. */
  noIntervals = false;

  private _hover: { s: number; i: number } | null = null;
  private _announcement = '';

  private _data: StabilitySet = { series: [], problems: [] };
  private _scales: StabilityScales | null = null;

  protected override willUpdate(changed: PropertyValues<this>): void {
    super.willUpdate(changed);
    if (changed.has('series')) {
      this._data = normaliseStability(this.series);
      this._hover = null;
      this._announcement = '';
      if (this._data.problems.length > 0) warnOnce(this, 'invalid-series', this._data.problems.join('; '));
    }
  }

  /** True when both dimensionless and time-deviation statistics are drawn (time axis on the right). */
  private get _dualAxis(): boolean {
    const drawn = this._data.series.filter((s) => s.tau.length > 0);
    return drawn.some((s) => isTimeStatistic(s.statistic)) && drawn.some((s) => !isTimeStatistic(s.statistic));
  }

  /** Legend and read-out name with the unit (and axis) of time deviations. */
  private _nameWithUnit(statistic: string): string {
    if (!isTimeStatistic(statistic)) return statLabel(statistic);
    return `${statLabel(statistic)} (s${this._dualAxis ? ', right axis' : ''})`;
  }

  /** Accessible name of the plot, computed from the data: each quantity with its unit and range. */
  get plotLabel(): string {
    const s = this._data.series.filter((x) => x.tau.length > 0);
    if (s.length === 0) return 'Stability plot: no data';
    let t0 = Infinity, t1 = -Infinity;
    for (const x of s) { t0 = Math.min(t0, x.tau[0]!); t1 = Math.max(t1, x.tau[x.tau.length - 1]!); }
    const part = (group: typeof s, what: string, unit: string): string => {
      let d0 = Infinity, d1 = -Infinity;
      for (const x of group) for (const d of x.deviation) { d0 = Math.min(d0, d); d1 = Math.max(d1, d); }
      return `${group.map((x) => statLabel(x.statistic)).join(', ')} (${what}) from ${formatFraction(d0, 3)}${unit} to ${formatFraction(d1, 3)}${unit}`;
    };
    const freq = s.filter((x) => !isTimeStatistic(x.statistic)), time = s.filter((x) => isTimeStatistic(x.statistic));
    const parts: string[] = [];
    if (freq.length > 0) parts.push(part(freq, 'fractional frequency, dimensionless', ''));
    if (time.length > 0) parts.push(part(time, `time deviation in seconds${freq.length > 0 ? ', right axis' : ''}`, ' s'));
    return `Stability plot, log–log, τ from ${formatDuration(t0)} to ${formatDuration(t1)}: ${parts.join('; ')}`;
  }

  protected override render(): TemplateResult {
    const drawable = this._data.series.some((s) => s.tau.length > 0);
    const hardError = !drawable && this._data.problems.length > 0;
    return html`<div part="base">
      <h3 class="title">${this.label}</h3>
      ${hardError
        ? html`<div class="state error" role="alert">Cannot plot the stability data: ${this._data.problems[0]}</div>`
        : !drawable
          ? html`<div class="state">No stability data yet.</div>`
          : html`${this._renderLegend()}
            <div class="plot-box" part="plot" tabindex="0" role="group" aria-roledescription="interactive plot"
              aria-label="Stability plot: ←/→ step through points, ↑/↓ switch statistic"
              @pointermove=${this._onPointerMove} @pointerleave=${this._onPointerLeave} @keydown=${this._onKeyDown}>
              <canvas class="data" role="img" aria-label=${this.plotLabel}></canvas>
              <canvas class="overlay" aria-hidden="true"></canvas>
              ${this._renderTooltip()}
            </div>
            <div class="sr-only" aria-live="polite">${this._announcement}</div>
            <div class="table-wrap" tabindex="0" role="region" aria-label="Stability data table">${this._renderTable()}</div>`}
      <span class="probe" aria-hidden="true"></span>
    </div>`;
  }

  private _renderLegend(): TemplateResult {
    return html`<ul part="legend" aria-label="Statistics">
      ${this._data.series.map((s, k) => html`<li>
        <span class="swatch" aria-hidden="true"><svg width="18" height="10" viewBox="-9 -5 18 10">
          <line x1="-9" x2="9" y1="0" y2="0" stroke="var(--series-${(k % 6) + 1})" stroke-width="1.5"
            stroke-dasharray=${isTimeStatistic(s.statistic) ? '3 2' : 'none'}></line>
          ${this._svgMarker(SHAPES[k % SHAPES.length]!, `var(--series-${(k % 6) + 1})`)}
        </svg></span>${this._nameWithUnit(s.statistic)}</li>`)}
    </ul>`;
  }

  private _svgMarker(shape: PlotShape, color: string): TemplateResult {
    const r = 3.6;
    const d = new Map<PlotShape, string>([
      ['circle', ''], ['square', `M${-r * 0.8} ${-r * 0.8}h${r * 1.6}v${r * 1.6}h${-r * 1.6}z`],
      ['diamond', `M0 ${-r}L${r} 0L0 ${r}L${-r} 0z`], ['triangle-up', `M0 ${-r}L${r} ${r * 0.8}L${-r} ${r * 0.8}z`],
      ['triangle-down', `M0 ${r}L${r} ${-r * 0.8}L${-r} ${-r * 0.8}z`], ['cross', `M${-r} ${-r}L${r} ${r}M${r} ${-r}L${-r} ${r}`],
      ['plus', `M${-r} 0H${r}M0 ${-r}V${r}`],
    ]);
    return shape === 'circle'
      ? html`<svg><circle r=${r * 0.85} fill="var(--surface)" stroke=${color} stroke-width="1.5"></circle></svg>`
      : html`<svg><path d=${d.get(shape)!} fill=${isOpenShape(shape) ? 'none' : 'var(--surface)'} stroke=${color} stroke-width="1.5"></path></svg>`;
  }

  /** Pixel position of point i of series k on the plot's scales (its own y axis); null before drawing. */
  private _pointPosition(k: number, i: number): { x: number; y: number } | null {
    const sc = this._scales, s = this._data.series[k];
    if (!sc || !s) return null;
    const sy = isTimeStatistic(s.statistic) ? sc.syTime : sc.syFrequency;
    if (!sy) return null;
    return { x: sc.sx.map(s.tau[i]!), y: sy.map(s.deviation[i]!) };
  }

  /** Plain-text read-out of a point, with the unit of its statistic (for the live region). */
  private _readout(k: number, i: number): string {
    const s = this._data.series[k]!;
    const unit = isTimeStatistic(s.statistic) ? ' s' : ' (dimensionless)';
    return `${statLabel(s.statistic)} at τ = ${formatNumber(s.tau[i]!, 5)} s: ${formatFraction(s.deviation[i]!, 4)}${unit}`;
  }

  private _renderTooltip(): TemplateResult | typeof nothing {
    const h = this._hover;
    const pos = h ? this._pointPosition(h.s, h.i) : null;
    if (!h || !pos) return nothing;
    const s = this._data.series[h.s]!;
    const boxW = this._size.width;
    const left = pos.x > boxW / 2 ? Math.max(0, pos.x - 200) : pos.x + 14;
    const time = isTimeStatistic(s.statistic);
    const unit = time ? ' s' : '';
    return html`<div part="tooltip" role="status" style="left:${left}px;top:${Math.max(0, pos.y - 60)}px">
      <strong>${this._nameWithUnit(s.statistic)}</strong>
      <dl>
        <dt>τ</dt><dd>${formatNumber(s.tau[h.i]!, 5)} s (${formatDuration(s.tau[h.i]!)})</dd>
        <dt>${time ? 'Time deviation' : 'Deviation'}</dt><dd>${formatFraction(s.deviation[h.i]!, 4)}${unit}${time ? ` (${formatOffsetAuto(s.deviation[h.i]!, 4)})` : ' (dimensionless)'}</dd>
        ${s.low && s.high ? html`<dt>Interval</dt><dd>${formatFraction(s.low[h.i]!, 3)} … ${formatFraction(s.high[h.i]!, 3)}${unit}</dd>` : nothing}
        ${s.n ? html`<dt>Terms n</dt><dd>${formatNumber(s.n[h.i]!, 6)}</dd>` : nothing}
        ${s.noise && s.noise[h.i] ? html`<dt>Noise</dt><dd>${s.noise[h.i]}</dd>` : nothing}
      </dl>
    </div>`;
  }

  private _renderTable(): TemplateResult {
    return html`<table part="table">
      <caption>Deviation by averaging time τ${this.noIntervals ? '' : ', with confidence interval where given'}; unit s = seconds (time deviation), 1 = dimensionless (fractional frequency)</caption>
      <thead><tr>
        <th scope="col">Statistic</th><th scope="col">τ (s)</th><th scope="col">Deviation</th>
        <th scope="col">Interval low</th><th scope="col">Interval high</th><th scope="col">Unit</th><th scope="col">n</th><th scope="col">Noise</th>
      </tr></thead>
      <tbody>
        ${this._data.series.map((s) => Array.from(s.tau, (t, i) => html`<tr part="row">
          <th scope="row">${statCode(s.statistic)}</th>
          <td>${formatNumber(t, 6)}</td>
          <td>${formatFraction(s.deviation[i]!, 5)}</td>
          <td>${s.low ? formatFraction(s.low[i]!, 4) : '—'}</td>
          <td>${s.high ? formatFraction(s.high[i]!, 4) : '—'}</td>
          <td>${isTimeStatistic(s.statistic) ? 's' : '1'}</td>
          <td>${s.n ? formatNumber(s.n[i]!, 8) : '—'}</td>
          <td>${s.noise?.[i] || '—'}</td>
        </tr>`))}
      </tbody>
    </table>`;
  }

  protected override updated(): void {
    this._draw();
    this._drawOverlay();
  }

  private _draw(): void {
    const canvas = this._dataCanvas;
    const w = this._size.width, h = this._size.height;
    if (!canvas || w < 40 || h < 40) { this._scales = null; return; }
    const ctx = sizeCanvas(canvas, w, h);
    if (!ctx) return;
    const colors = this._resolveColors(COLOR_EXPR);
    const series = this._data.series.filter((s) => s.tau.length > 0);
    const withIntervals = !this.noIntervals;
    const freqExtent = deviationExtent(series.filter((s) => !isTimeStatistic(s.statistic)), withIntervals);
    const timeExtent = deviationExtent(series.filter((s) => isTimeStatistic(s.statistic)), withIntervals);
    if (!freqExtent && !timeExtent) { this._scales = null; return; }
    const dual = freqExtent !== null && timeExtent !== null;
    const frame: Frame = { left: 62, top: 8, width: Math.max(10, w - (dual ? 132 : 74)), height: Math.max(10, h - 60) };
    let t0 = Infinity, t1 = -Infinity;
    for (const s of series) { t0 = Math.min(t0, s.tau[0]!); t1 = Math.max(t1, s.tau[s.tau.length - 1]!); }
    if (!(t1 > t0)) { t0 /= 3; t1 *= 3; }
    const padX = (Math.log10(t1) - Math.log10(t0)) * 0.06;
    const sx = logScale(t0 / 10 ** padX, t1 * 10 ** padX, frame.left, frame.left + frame.width);
    const yScale = (e: [number, number] | null): Scale | null => {
      if (!e) return null;
      const pad = (Math.log10(e[1]) - Math.log10(e[0])) * 0.08;
      return logScale(e[0] / 10 ** pad, e[1] * 10 ** pad, frame.top + frame.height, frame.top);
    };
    const syFrequency = yScale(freqExtent), syTime = yScale(timeExtent);
    this._scales = { sx, syFrequency, syTime, frame };
    const xt = logTicks(sx.domain[0], sx.domain[1]);
    const xTicks = (xt.length >= 2 ? xt : [t0, t1]).map((v) => ({ value: v, label: `${formatNumber(v, 3)} s` }));
    const style: AxisStyle = { text: colors.text, muted: colors.muted, grid: colors.grid, font: colors.font };
    // The left axis is σ_y when there is any, else the time deviation; a second quantity goes right.
    const leftScale = (syFrequency ?? syTime)!, leftExtent = (freqExtent ?? timeExtent)!;
    drawAxes(ctx, frame, sx, leftScale, xTicks, decadeTicks(leftScale, leftExtent), style,
      { x: 'Averaging time τ', y: syFrequency ? FREQUENCY_AXIS_TITLE : TIME_AXIS_TITLE });
    if (dual) drawRightAxis(ctx, frame, syTime!, decadeTicks(syTime!, timeExtent), style, TIME_AXIS_TITLE, w);
    ctx.save();
    ctx.beginPath();
    ctx.rect(frame.left, frame.top, frame.width, frame.height);
    ctx.clip();
    const palette = [colors.s1, colors.s2, colors.s3, colors.s4, colors.s5, colors.s6];
    this._data.series.forEach((s, k) => {
      const sy = isTimeStatistic(s.statistic) ? syTime : syFrequency;
      if (!sy || s.tau.length === 0) return;
      const color = palette[k % palette.length]!;
      ctx.strokeStyle = color;
      ctx.lineWidth = 1.5;
      // Time deviations are dashed so the eye does not compare them with σ_y on the other axis.
      ctx.setLineDash(isTimeStatistic(s.statistic) ? [5, 3] : []);
      ctx.beginPath();
      for (let i = 0; i < s.tau.length; i++) {
        const x = sx.map(s.tau[i]!), y = sy.map(s.deviation[i]!);
        if (i === 0) ctx.moveTo(x, y); else ctx.lineTo(x, y);
      }
      ctx.stroke();
      ctx.setLineDash([]);
      if (!this.noIntervals && s.low && s.high) {
        ctx.lineWidth = 1;
        ctx.beginPath();
        for (let i = 0; i < s.tau.length; i++) {
          const lo = s.low[i]!, hi = s.high[i]!;
          if (!(lo > 0) || !Number.isFinite(hi) || !(hi >= lo)) continue;
          const x = sx.map(s.tau[i]!);
          const y0 = sy.map(lo), y1 = sy.map(hi);
          ctx.moveTo(x, y0); ctx.lineTo(x, y1);
          ctx.moveTo(x - 3, y0); ctx.lineTo(x + 3, y0);
          ctx.moveTo(x - 3, y1); ctx.lineTo(x + 3, y1);
        }
        ctx.stroke();
      }
      ctx.fillStyle = colors.surface;
      ctx.lineWidth = 1.5;
      const shape = SHAPES[k % SHAPES.length]!;
      for (let i = 0; i < s.tau.length; i++) {
        const p = plotMarkerPath(shape, sx.map(s.tau[i]!), sy.map(s.deviation[i]!), 4);
        if (!isOpenShape(shape)) ctx.fill(p);
        ctx.stroke(p);
      }
    });
    ctx.restore();
  }

  private _drawOverlay(): void {
    const canvas = this._overlayCanvas;
    const w = this._size.width, h = this._size.height;
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

  private readonly _onPointerMove = (event: PointerEvent): void => {
    const box = this._box;
    if (!this._scales || !box) return;
    const rect = box.getBoundingClientRect();
    const px = event.clientX - rect.left, py = event.clientY - rect.top;
    let best: { s: number; i: number } | null = null;
    let bestD = 24 * 24;
    this._data.series.forEach((s, k) => {
      for (let i = 0; i < s.tau.length; i++) {
        const pos = this._pointPosition(k, i);
        if (!pos) break;
        const dx = pos.x - px, dy = pos.y - py;
        const d = dx * dx + dy * dy;
        if (d < bestD) { bestD = d; best = { s: k, i }; }
      }
    });
    const cur = this._hover;
    const next = best as { s: number; i: number } | null;
    if (cur?.s !== next?.s || cur?.i !== next?.i) this._hover = next;
  };

  private readonly _onPointerLeave = (): void => {
    this._hover = null;
  };

  /** ←/→ step through a statistic's points, ↑/↓ switch statistic (same τ index where it exists), Escape clears. */
  private readonly _onKeyDown = (event: KeyboardEvent): void => {
    const drawn = this._data.series.map((s, k) => ({ k, n: s.tau.length })).filter((x) => x.n > 0);
    if (drawn.length === 0) return;
    const cur = this._hover;
    let next: { s: number; i: number } | null = cur;
    switch (event.key) {
      case 'ArrowRight': case 'ArrowLeft': {
        const dir = event.key === 'ArrowRight' ? 1 : -1;
        if (!cur) { const first = drawn[0]!; next = { s: first.k, i: dir > 0 ? 0 : first.n - 1 }; break; }
        const n = this._data.series[cur.s]!.tau.length;
        next = { s: cur.s, i: Math.min(n - 1, Math.max(0, cur.i + dir)) };
        break;
      }
      case 'ArrowDown': case 'ArrowUp': {
        const dir = event.key === 'ArrowDown' ? 1 : -1;
        const at = cur ? drawn.findIndex((x) => x.k === cur.s) : -1;
        const target = drawn[Math.min(drawn.length - 1, Math.max(0, at < 0 ? 0 : at + dir))]!;
        next = { s: target.k, i: Math.min(target.n - 1, cur?.i ?? 0) };
        break;
      }
      case 'Escape': next = null; break;
      default: return;
    }
    event.preventDefault();
    this._hover = next;
    this._announcement = next ? this._readout(next.s, next.i) : '';
  };
}
