import { html, nothing, type PropertyValues, type TemplateResult, type PropertyDeclarations } from 'lit';
import { PlotElement } from '../internal/plot-element.js';
import { baseStyles, plotStyles } from '../internal/styles.js';
import { stabilityPlotStyles } from './stability-plot.styles.js';
import { normaliseStability, type StabilityColumns, type StabilitySet } from './stability-data.js';
import { drawAxes, markerPath, sizeCanvas, type Frame, type MarkerShape } from '../internal/canvas.js';
import { logScale, logTicks, type Scale } from '../internal/scale.js';
import { formatDuration, formatFraction, formatNumber } from '../internal/format.js';
import { warnOnce } from '../internal/warn.js';

export type { StabilityColumns };

const SHAPES: readonly MarkerShape[] = ['circle', 'square', 'diamond', 'triangle-up', 'triangle-down', 'cross'];
const COLOR_EXPR = {
  text: 'var(--text)', muted: 'var(--muted)', grid: 'var(--grid)', surface: 'var(--surface)', accent: 'var(--accent)',
  s1: 'var(--series-1)', s2: 'var(--series-2)', s3: 'var(--series-3)', s4: 'var(--series-4)', s5: 'var(--series-5)', s6: 'var(--series-6)',
} as const;

const LABELS: Record<string, string> = {
  adev: 'ADEV', oadev: 'Overlapping ADEV', mdev: 'MDEV', tdev: 'TDEV (s)', hdev: 'HDEV', ohdev: 'Overlapping HDEV', totdev: 'TOTDEV',
};

function statLabel(name: string): string {
  return LABELS[name] ?? name;
}

/** Short name for table rows: `OADEV`, `TDEV`, or the name as given. */
function statCode(name: string): string {
  return LABELS[name] ? name.toUpperCase() : name;
}

/**
 * A log–log plot of frequency-stability statistics versus averaging time τ, with confidence
 * intervals as error bars, one marker shape per statistic, a hover read-out, and a table that
 * is the plot's accessible equivalent. The element draws what the SDK computed; it does no
 * statistics itself.
 *
 * Data are immutable: assign a new `series` array to re-render.
 *
 * @summary Deviation-versus-τ plot with confidence intervals.
 *
 * @csspart base - The outer wrapper.
 * @csspart plot - The box holding the canvases.
 * @csspart legend - The list of statistics with their marker shapes.
 * @csspart tooltip - The hover read-out.
 * @csspart table - The data table (accessible equivalent of the plot).
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
  };

  /**
   * One entry per statistic in columnar form `{ statistic, tau, deviation, low?, high?, n?, noise? }`
   * (typed arrays welcome), or the SDK's rows (`StabilityRow[]`, one per τ with `statistics`).
   */
  series?: readonly StabilityColumns[] | readonly unknown[] | null;

  /** Heading shown above the plot. */
  label = 'Frequency stability';

  /** Hide the data table visually (it stays available to assistive technology). */
  noTable = false;

  /** Hide the confidence-interval error bars. */
  noIntervals = false;

  private _hover: { s: number; i: number } | null = null;

  private _data: StabilitySet = { series: [], problems: [] };
  private _scales: { sx: Scale; sy: Scale; frame: Frame } | null = null;

  protected override willUpdate(changed: PropertyValues<this>): void {
    super.willUpdate(changed);
    if (changed.has('series')) {
      this._data = normaliseStability(this.series);
      this._hover = null;
      if (this._data.problems.length > 0) warnOnce(this, 'invalid-series', this._data.problems.join('; '));
    }
  }

  /** Accessible name of the plot, computed from the data. */
  get plotLabel(): string {
    const s = this._data.series.filter((x) => x.tau.length > 0);
    if (s.length === 0) return 'Stability plot: no data';
    let t0 = Infinity, t1 = -Infinity, d0 = Infinity, d1 = -Infinity;
    for (const x of s) {
      t0 = Math.min(t0, x.tau[0]!); t1 = Math.max(t1, x.tau[x.tau.length - 1]!);
      for (const d of x.deviation) { d0 = Math.min(d0, d); d1 = Math.max(d1, d); }
    }
    return `Stability plot, log–log: ${s.map((x) => statLabel(x.statistic)).join(', ')} for τ from ${formatDuration(t0)} to ${formatDuration(t1)}; deviation from ${formatFraction(d0, 3)} to ${formatFraction(d1, 3)}`;
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
            <div class="plot-box" part="plot" @pointermove=${this._onPointerMove} @pointerleave=${this._onPointerLeave}>
              <canvas class="data" role="img" aria-label=${this.plotLabel}></canvas>
              <canvas class="overlay" aria-hidden="true"></canvas>
              ${this._renderTooltip()}
            </div>
            <div class="table-wrap">${this._renderTable()}</div>`}
      <span class="probe" aria-hidden="true"></span>
    </div>`;
  }

  private _renderLegend(): TemplateResult {
    return html`<ul part="legend" aria-label="Statistics">
      ${this._data.series.map((s, k) => html`<li>
        <span class="swatch" aria-hidden="true"><svg width="18" height="10" viewBox="-9 -5 18 10">
          <line x1="-9" x2="9" y1="0" y2="0" stroke="var(--series-${(k % 6) + 1})" stroke-width="1.5"></line>
          ${this._svgMarker(SHAPES[k % SHAPES.length]!, `var(--series-${(k % 6) + 1})`)}
        </svg></span>${statLabel(s.statistic)}</li>`)}
    </ul>`;
  }

  private _svgMarker(shape: MarkerShape, color: string): TemplateResult {
    const r = 3.6;
    const d = new Map<MarkerShape, string>([
      ['circle', ''], ['square', `M${-r * 0.8} ${-r * 0.8}h${r * 1.6}v${r * 1.6}h${-r * 1.6}z`],
      ['diamond', `M0 ${-r}L${r} 0L0 ${r}L${-r} 0z`], ['triangle-up', `M0 ${-r}L${r} ${r * 0.8}L${-r} ${r * 0.8}z`],
      ['triangle-down', `M0 ${r}L${r} ${-r * 0.8}L${-r} ${-r * 0.8}z`], ['cross', `M${-r} ${-r}L${r} ${r}M${r} ${-r}L${-r} ${r}`],
    ]);
    return shape === 'circle'
      ? html`<svg><circle r=${r * 0.85} fill="var(--surface)" stroke=${color} stroke-width="1.5"></circle></svg>`
      : html`<svg><path d=${d.get(shape)!} fill=${shape === 'cross' ? 'none' : 'var(--surface)'} stroke=${color} stroke-width="1.5"></path></svg>`;
  }

  private _renderTooltip(): TemplateResult | typeof nothing {
    const h = this._hover;
    const sc = this._scales;
    if (!h || !sc) return nothing;
    const s = this._data.series[h.s]!;
    const x = sc.sx.map(s.tau[h.i]!), y = sc.sy.map(s.deviation[h.i]!);
    const boxW = this._size.width;
    const left = x > boxW / 2 ? Math.max(0, x - 200) : x + 14;
    const unit = s.statistic === 'tdev' ? ' s' : '';
    return html`<div part="tooltip" role="status" style="left:${left}px;top:${Math.max(0, y - 60)}px">
      <strong>${statLabel(s.statistic)}</strong>
      <dl>
        <dt>τ</dt><dd>${formatNumber(s.tau[h.i]!, 5)} s (${formatDuration(s.tau[h.i]!)})</dd>
        <dt>Deviation</dt><dd>${formatFraction(s.deviation[h.i]!, 4)}${unit}</dd>
        ${s.low && s.high ? html`<dt>Interval</dt><dd>${formatFraction(s.low[h.i]!, 3)} … ${formatFraction(s.high[h.i]!, 3)}${unit}</dd>` : nothing}
        ${s.n ? html`<dt>Terms n</dt><dd>${formatNumber(s.n[h.i]!, 6)}</dd>` : nothing}
        ${s.noise && s.noise[h.i] ? html`<dt>Noise</dt><dd>${s.noise[h.i]}</dd>` : nothing}
      </dl>
    </div>`;
  }

  private _renderTable(): TemplateResult {
    return html`<table part="table">
      <caption>Deviation by averaging time τ${this.noIntervals ? '' : ', with confidence interval where given'}</caption>
      <thead><tr>
        <th scope="col">Statistic</th><th scope="col">τ (s)</th><th scope="col">Deviation</th>
        <th scope="col">Interval low</th><th scope="col">Interval high</th><th scope="col">n</th><th scope="col">Noise</th>
      </tr></thead>
      <tbody>
        ${this._data.series.map((s) => Array.from(s.tau, (t, i) => html`<tr part="row">
          <th scope="row">${statCode(s.statistic)}</th>
          <td>${formatNumber(t, 6)}</td>
          <td>${formatFraction(s.deviation[i]!, 5)}</td>
          <td>${s.low ? formatFraction(s.low[i]!, 4) : '—'}</td>
          <td>${s.high ? formatFraction(s.high[i]!, 4) : '—'}</td>
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
    const frame: Frame = { left: 62, top: 8, width: Math.max(10, w - 74), height: Math.max(10, h - 60) };
    let t0 = Infinity, t1 = -Infinity, d0 = Infinity, d1 = -Infinity;
    for (const s of this._data.series) {
      for (let i = 0; i < s.tau.length; i++) {
        t0 = Math.min(t0, s.tau[i]!); t1 = Math.max(t1, s.tau[i]!);
        const lo = !this.noIntervals && s.low && s.low[i]! > 0 ? s.low[i]! : s.deviation[i]!;
        const hi = !this.noIntervals && s.high && Number.isFinite(s.high[i]!) ? s.high[i]! : s.deviation[i]!;
        d0 = Math.min(d0, lo, s.deviation[i]!); d1 = Math.max(d1, hi, s.deviation[i]!);
      }
    }
    if (!(t1 > t0)) { t0 /= 3; t1 *= 3; }
    if (!(d1 > d0)) { d0 /= 3; d1 *= 3; }
    const padX = (Math.log10(t1) - Math.log10(t0)) * 0.06, padY = (Math.log10(d1) - Math.log10(d0)) * 0.08;
    const sx = logScale(t0 / 10 ** padX, t1 * 10 ** padX, frame.left, frame.left + frame.width);
    const sy = logScale(d0 / 10 ** padY, d1 * 10 ** padY, frame.top + frame.height, frame.top);
    this._scales = { sx, sy, frame };
    const xt = logTicks(sx.domain[0], sx.domain[1]);
    const yt = logTicks(sy.domain[0], sy.domain[1]);
    const xTicks = (xt.length >= 2 ? xt : [t0, t1]).map((v) => ({ value: v, label: `${formatNumber(v, 3)} s` }));
    const yTicks = (yt.length >= 2 ? yt : [d0, d1]).map((v) => ({ value: v, label: formatFraction(v, yt.length >= 2 ? 1 : 3) }));
    drawAxes(ctx, frame, sx, sy, xTicks, yTicks, { text: colors.text, muted: colors.muted, grid: colors.grid, font: colors.font },
      { x: 'Averaging time τ', y: 'Deviation' });
    ctx.save();
    ctx.beginPath();
    ctx.rect(frame.left, frame.top, frame.width, frame.height);
    ctx.clip();
    const palette = [colors.s1, colors.s2, colors.s3, colors.s4, colors.s5, colors.s6];
    this._data.series.forEach((s, k) => {
      const color = palette[k % palette.length]!;
      ctx.strokeStyle = color;
      ctx.lineWidth = 1.5;
      ctx.beginPath();
      for (let i = 0; i < s.tau.length; i++) {
        const x = sx.map(s.tau[i]!), y = sy.map(s.deviation[i]!);
        if (i === 0) ctx.moveTo(x, y); else ctx.lineTo(x, y);
      }
      ctx.stroke();
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
        const p = markerPath(shape, sx.map(s.tau[i]!), sy.map(s.deviation[i]!), 4);
        if (shape !== 'cross') ctx.fill(p);
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
    const hv = this._hover, sc = this._scales;
    if (!ctx || !hv || !sc) return;
    const s = this._data.series[hv.s]!;
    const colors = this._resolveColors(COLOR_EXPR);
    ctx.strokeStyle = colors.accent;
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.arc(sc.sx.map(s.tau[hv.i]!), sc.sy.map(s.deviation[hv.i]!), 8, 0, Math.PI * 2);
    ctx.stroke();
  }

  private readonly _onPointerMove = (event: PointerEvent): void => {
    const sc = this._scales;
    const box = this._box;
    if (!sc || !box) return;
    const rect = box.getBoundingClientRect();
    const px = event.clientX - rect.left, py = event.clientY - rect.top;
    let best: { s: number; i: number } | null = null;
    let bestD = 24 * 24;
    this._data.series.forEach((s, k) => {
      for (let i = 0; i < s.tau.length; i++) {
        const dx = sc.sx.map(s.tau[i]!) - px, dy = sc.sy.map(s.deviation[i]!) - py;
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
}
