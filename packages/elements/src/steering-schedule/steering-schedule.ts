import { html, nothing, svg, type PropertyValues, type SVGTemplateResult, type TemplateResult, type PropertyDeclarations } from 'lit';
import { PlotElement } from '../internal/plot-element.js';
import { baseStyles, plotStyles } from '../internal/styles.js';
import { steeringScheduleStyles } from './steering-schedule.styles.js';
import { chartTimeToUtcMs, interpolate, readPlan, type PlanView, type SteeringCommandView } from './plan-data.js';
import { closestIndex, decimateBand, decimateLine, visibleRange } from '../internal/decimate.js';
import { drawAxes, fillBand, markerPath, sizeCanvas, strokePolyline, type Frame, type MarkerShape, type Tick } from '../internal/canvas.js';
import { linearScale, linearTicks, padDomain, timeTicks, type Scale } from '../internal/scale.js';
import {
  formatFraction, formatNumber, formatOffset, formatOffsetAuto, formatTimeTick, formatUtc, parseTimeUnit, pickTimeUnit, typographicMinus, type TimeUnit,
} from '../internal/format.js';
import { warnOnce } from '../internal/warn.js';
import { drawRevisions, readRevisions, type RevisionMarks, type RevisionView } from './revisions-layer.js';
import { emit } from '../events.js';

export type { PlanView, SteeringCommandView };

const COLOR_EXPR = {
  text: 'var(--text)', muted: 'var(--muted)', grid: 'var(--grid)', surface: 'var(--surface)', accent: 'var(--accent)',
  steered: 'var(--steered-color)', unsteered: 'var(--unsteered-color)', uncertainty: 'var(--uncertainty-color)',
  tolerance: 'var(--tolerance-color)', contact: 'var(--contact-color)', maneuver: 'var(--maneuver-color)',
  frequency: 'var(--frequency-command-color)', phase: 'var(--phase-command-color)',
} as const;

const MARGIN = { left: 66, right: 14, top: 24, bottom: 50 };

/** The marker shape of a command: frequency steps are triangles pointing the way of the step, phase steps diamonds. */
export function commandShape(c: Pick<SteeringCommandView, 'kind' | 'step'>): MarkerShape {
  if (c.kind === 'phase') return 'diamond';
  return c.step < 0 ? 'triangle-down' : 'triangle-up';
}

function describeStep(c: SteeringCommandView): string {
  if (c.kind === 'phase') return `phase step ${c.step >= 0 ? '+' : ''}${formatOffsetAuto(c.step, 3)}`;
  return `frequency step ${c.step >= 0 ? '+' : ''}${formatFraction(c.step, 3)}`;
}

interface Scales { sx: Scale; sy: Scale; frame: Frame; unit: { unit: TimeUnit; seconds: number } }
type Hover = { kind: 'sample'; i: number; px: number } | { kind: 'command'; c: number; px: number };

/**
 * A steering schedule: the predicted clock offset over time with the tolerance band, the
 * uncertainty band, the unsteered prediction, command markers (triangles for frequency steps,
 * pointing the way of the step; diamonds for phase steps), shaded contact windows and manoeuvre
 * marks, with a synchronised table of the commands. Zoom and pan with the mouse wheel and drag,
 * touch (drag, pinch) or the keyboard; hover for a read-out with units.
 *
 * Takes the planner's output (`planSteering()` of `@tauline/sdk`) as `plan` and its input as
 * `scenario`. Data are immutable: assign new objects to re-render. Series are drawn through
 * per-pixel min/max decimation, so 10^6-point predictions stay fast. A revised plan's history can
 * be shown with `superseded` (commands the re-plan replaced, faded hollow markers) and `estimates`
 * (the clock-offset estimates it used, points with ±1σ bars).
 *
 * Keyboard (plot focused): ← / → previous / next command; Shift+← / Shift+→ or PageUp / PageDown pan;
 * + / − zoom; Home shows everything; Escape hides the read-out.
 *
 * @summary Clock-offset prediction with tolerance, uncertainty, commands, contacts and manoeuvres.
 *
 * @fires tauline-command-select - The user selected a command (marker click, table row, arrow keys). Detail: `{ index, command, executeAtSeconds }`.
 * @fires tauline-view-change - The user zoomed or panned. Detail: `{ startSeconds, endSeconds }` since the scenario epoch.
 *
 * @csspart base - The outer wrapper.
 * @csspart plot - The focusable plot box holding the canvases.
 * @csspart legend - The legend list.
 * @csspart metrics - The plan metrics list.
 * @csspart tooltip - The hover read-out.
 * @csspart table - The command table (the accessible equivalent of the plot).
 * @csspart row - Each command row; the selected one also has part `selected`.
 *
 * @cssproperty --steered-color - Steered prediction line (token `--tauline-color-steered`).
 * @cssproperty --unsteered-color - Unsteered prediction line (token `--tauline-color-unsteered`).
 * @cssproperty --uncertainty-color - Uncertainty band fill, drawn at 20 % opacity (token `--tauline-color-uncertainty`).
 * @cssproperty --tolerance-color - Tolerance band, edges and fill (token `--tauline-color-tolerance`).
 * @cssproperty --contact-color - Contact-window shading (token `--tauline-color-contact`).
 * @cssproperty --maneuver-color - Manoeuvre marks (token `--tauline-color-maneuver`).
 * @cssproperty --frequency-command-color - Frequency-step markers (token `--tauline-color-command-frequency`).
 * @cssproperty --phase-command-color - Phase-step markers (token `--tauline-color-command-phase`).
 * @cssproperty --plot-height - Height of the plot box (default 340px).
 * @cssproperty --table-max-height - Height after which the command table scrolls (default 440px).
 */
export class TaulineSteeringSchedule extends PlotElement {
  static override styles = [baseStyles, plotStyles, steeringScheduleStyles];

  static override properties: PropertyDeclarations = {
    plan: { attribute: false },
    scenario: { attribute: false },
    superseded: { attribute: false },
    estimates: { attribute: false },
    label: {},
    yUnit: { attribute: 'y-unit' },
    sigmaMultiple: { type: Number, attribute: 'sigma-multiple' },
    fitAll: { type: Boolean, attribute: 'fit-all' },
    noTable: { type: Boolean, reflect: true, attribute: 'no-table' },
    selectedIndex: { type: Number, attribute: 'selected-index' },
    _hover: { state: true, attribute: false },
    _announcement: { state: true, attribute: false },
  };

  /** The planner output: `{ feasible, reason?, commands, predicted: { t, steered, unsteered }, metrics }`. */
  plan?: unknown;

  /** The scenario the plan was made for: epoch, `tolerance.phaseSeconds`, `contacts`, `maneuvers`. */
  scenario?: unknown;

  /** Commands a re-plan superseded (SteeringCommand objects, e.g. the SDK's `revision.superseded`), drawn faded on the steered line. */
  superseded?: unknown;

  /** Clock-offset estimates `{ tSeconds, phaseSeconds, sigmaSeconds }` (as given to a re-plan), drawn as points with ±1σ bars. */
  estimates?: unknown;

  /** Heading shown above the plot. */
  label = 'Steering schedule';

  /** Unit of the offset axis: `auto` (default), `s`, `ms`, `us`, `ns` or `ps`. */
  yUnit = 'auto';

  /** Half-width of the uncertainty band in standard deviations (default 2). */
  sigmaMultiple = 2;

  /** Fit the offset axis to everything, including the unsteered prediction (default: fit the steered one and the tolerance). */
  fitAll = false;

  /** Hide the command table visually (it stays available to assistive technology). */
  noTable = false;

  /** Index in `plan.commands` of the selected command, or −1. Setting it fires no event. */
  selectedIndex = -1;

  private _hover: Hover | null = null;
  private _announcement = '';

  private _result: ReturnType<typeof readPlan> | null = null;
  private _revisions: RevisionView | null = null;
  private _revisionMarks: RevisionMarks = { superseded: [], estimates: [] };
  private _bandLow: Float64Array | null = null;
  private _bandHigh: Float64Array | null = null;
  private _dataVersion = 0;
  private _worst = 0;
  private _worstKey = -1;
  private _view: [number, number] | null = null;
  private _scales: Scales | null = null;
  private _lastDataKey = '';
  private _markers: Array<{ c: number; x: number; y: number }> = [];
  private readonly _pointers = new Map<number, { x: number; y: number }>();
  private _gesture: { x0: number; x1: number; px: number; moved: boolean; dist?: number; center?: number } | null = null;

  /** The parsed plan, or null before data / on error. */
  private get _data(): PlanView | null {
    return this._result?.ok ? this._result.view : null;
  }

  /** The visible time span in seconds since the scenario epoch, or null without data. */
  get view(): { startSeconds: number; endSeconds: number } | null {
    return this._view ? { startSeconds: this._view[0], endSeconds: this._view[1] } : null;
  }

  /** Shows the span [startSeconds, endSeconds] (seconds since the epoch), clamped to the data. Fires no event. */
  setView(startSeconds: number, endSeconds: number): void {
    if (!Number.isFinite(startSeconds) || !Number.isFinite(endSeconds)) return;
    this._setView(startSeconds, endSeconds, false);
  }

  /** Shows the whole prediction. Fires no event. */
  resetView(): void {
    const d = this._data;
    if (d && d.t.length > 0) this._setView(d.t[0]!, d.t[d.t.length - 1]!, false);
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    super.willUpdate(changed);
    if (changed.has('plan') || changed.has('scenario')) {
      if (this.plan === undefined || this.plan === null) this._result = null;
      else {
        this._result = readPlan(this.plan, this.scenario);
        if (!this._result.ok) warnOnce(this, 'invalid-plan', this._result.error);
        else {
          if (this._result.view.problems.length > 0) warnOnce(this, 'plan-entries-dropped', this._result.view.problems.join('; '));
          if (this._result.view.invalid.length > 0) warnOnce(this, 'invalid-plan-values', this._result.view.invalid.join('; '));
        }
      }
      this._dataVersion += 1;
      this._hover = null;
      const d = this._data;
      const full: [number, number] | null = d && d.t.length > 0 ? [d.t[0]!, d.t[d.t.length - 1]!] : null;
      // Keep the user's zoom across data updates when it still lies inside the new data.
      if (!full) this._view = null;
      else if (!this._view || this._view[0] < full[0] || this._view[1] > full[1]) this._view = full;
    }
    if (changed.has('plan') || changed.has('scenario') || changed.has('sigmaMultiple')) this._computeBand();
    if (changed.has('superseded') || changed.has('estimates') || changed.has('scenario')) this._readRevisions();
    if (changed.has('sigmaMultiple') && !(Number.isFinite(this.sigmaMultiple) && this.sigmaMultiple >= 0)) {
      warnOnce(this, 'invalid-sigma-multiple', `sigma-multiple must be a non-negative number; received ${String(this.sigmaMultiple)}; using 2`);
    }
    if (changed.has('yUnit') && this.yUnit !== 'auto' && !parseTimeUnit(this.yUnit)) {
      warnOnce(this, 'invalid-y-unit', `y-unit must be auto, s, ms, us, ns or ps; received ${JSON.stringify(this.yUnit)}; using auto`);
    }
  }

  private get _k(): number {
    return Number.isFinite(this.sigmaMultiple) && this.sigmaMultiple >= 0 ? this.sigmaMultiple : 2;
  }

  private _computeBand(): void {
    const d = this._data;
    this._bandLow = this._bandHigh = null;
    if (!d || !d.steeredSigma) return;
    const n = d.t.length, k = this._k;
    const lo = new Float64Array(n), hi = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const c = d.steered[i]!, s = d.steeredSigma[i]! * k;
      lo[i] = c - s;
      hi[i] = c + s;
    }
    this._bandLow = lo;
    this._bandHigh = hi;
  }

  /** Accessible name of the plot, computed from the data. */
  get plotLabel(): string {
    const d = this._data;
    if (!d || d.t.length === 0) return 'Steering schedule plot: no data';
    if (this._worstKey !== this._dataVersion) {
      let worst = 0;
      for (let i = 0; i < d.steered.length; i++) { const a = Math.abs(d.steered[i]!); if (a > worst) worst = a; }
      this._worst = worst;
      this._worstKey = this._dataVersion;
    }
    const worst = this._worst;
    const freq = d.commands.filter((c) => c.kind === 'frequency').length;
    const phase = d.commands.length - freq;
    const span = `${formatUtc(chartTimeToUtcMs(d, d.t[0]!))} to ${formatUtc(chartTimeToUtcMs(d, d.t[d.t.length - 1]!))}`;
    const tol = d.tolerance !== null ? ` against a tolerance of ±${formatOffsetAuto(d.tolerance, 3)}` : '';
    return `Predicted clock offset from ${span}; ${d.commands.length} command${d.commands.length === 1 ? '' : 's'} ` +
      `(${freq} frequency, ${phase} phase); largest steered |offset| ${formatOffsetAuto(worst, 3)}${tol}; ` +
      `plan ${d.feasible ? 'feasible' : 'not feasible'}`;
  }

  protected override render(): TemplateResult {
    const r = this._result;
    let body: TemplateResult;
    if (!r) body = html`<div class="state">No steering plan yet.</div>`;
    else if (!r.ok) body = html`<div class="state error" role="alert">Cannot show the steering plan: ${r.error}</div>`;
    else if (r.view.t.length === 0) body = html`<div class="state">The plan holds no predicted samples.</div>`;
    else body = this._renderChart(r.view);
    return html`<div part="base">
      <div class="head">
        <h3 class="title">${this.label}</h3>
        ${r?.ok ? this._renderBadge(r.view) : nothing}
      </div>
      ${r?.ok && r.view.invalid.length > 0
        ? html`<div class="state error invalid-data" role="alert">The plan's data are not valid, so its feasibility cannot be trusted: ${r.view.invalid.join('; ')}.</div>`
        : nothing}
      ${body}
      <span class="probe" aria-hidden="true"></span>
    </div>`;
  }

  /** Feasibility badge; a plan with invalid values never shows "feasible". */
  private _renderBadge(d: PlanView): TemplateResult {
    if (d.invalid.length > 0) return html`<span class="badge bad">⚠ invalid data</span>`;
    return html`<span class="badge ${d.feasible ? 'ok' : 'bad'}">${d.feasible ? '✓ feasible' : '✕ not feasible'}</span>`;
  }

  private _renderChart(d: PlanView): TemplateResult {
    return html`
      ${!d.feasible && d.reason ? html`<p class="summary" role="note">${typographicMinus(d.reason)}</p>` : nothing}
      ${this._renderMetrics(d)}
      ${this._renderLegend(d)}
      <div class="plot-box" part="plot" tabindex="0" role="group"
        aria-roledescription="interactive plot" aria-label="Steering schedule plot" aria-describedby="keys"
        @pointerdown=${this._onPointerDown} @pointermove=${this._onPointerMove} @pointerup=${this._onPointerUp}
        @pointercancel=${this._onPointerCancel} @pointerleave=${this._onPointerLeave}
        @wheel=${this._onWheel} @keydown=${this._onKeyDown} @dblclick=${this._onDoubleClick}>
        <canvas class="data" role="img" aria-label=${this.plotLabel}></canvas>
        <canvas class="overlay" aria-hidden="true"></canvas>
        ${this._renderTooltip(d)}
      </div>
      <div class="tools">
        <span class="hint" id="keys">Drag or Shift+←/→ to pan, wheel or +/− to zoom, ←/→ to step through commands, Home to reset.</span>
        <button type="button" @click=${this._onResetClick}>Show all</button>
      </div>
      <div class="sr-only" aria-live="polite">${this._announcement}</div>
      <div class="table-wrap">${this._renderTable(d)}</div>
      ${d.caution ? html`<p class="caution" role="note">${d.caution}</p>` : nothing}`;
  }

  private _renderMetrics(d: PlanView): TemplateResult | typeof nothing {
    const m = d.metrics;
    if (!m) return nothing;
    const items = Object.entries(m).filter(([, v]) => typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean');
    if (items.length === 0) return nothing;
    const nice = (k: string): string => k.replace(/([a-z])([A-Z])/g, '$1 $2').replace(/Seconds$| Seconds$/, '').toLowerCase();
    const value = (k: string, v: unknown): string => {
      if (typeof v !== 'number') return String(v);
      if (/seconds$/i.test(k)) return formatOffsetAuto(v, 3);
      if (/probability/i.test(k)) return `${formatNumber(v * 100, 4)} %`;
      if (/fractional|frequency/i.test(k)) return formatFraction(v, 3);
      return formatNumber(v, 4);
    };
    return html`<dl part="metrics">${items.map(([k, v]) => html`<div><dt>${nice(k)}</dt><dd>${value(k, v)}</dd></div>`)}</dl>`;
  }

  private _legendItem(content: SVGTemplateResult, label: string): TemplateResult {
    return html`<li><span class="swatch" aria-hidden="true"><svg width="18" height="10" viewBox="0 0 18 10">${content}</svg></span>${label}</li>`;
  }

  private _renderLegend(d: PlanView): TemplateResult {
    const tri = (color: string, down: boolean): SVGTemplateResult => down
      ? svg`<path d="M9 9L14 2L4 2z" fill=${color} stroke="var(--surface)"></path>`
      : svg`<path d="M9 1L14 8L4 8z" fill=${color} stroke="var(--surface)"></path>`;
    return html`<ul part="legend" aria-label="Legend">
      ${this._legendItem(svg`<line x1="0" x2="18" y1="5" y2="5" stroke="var(--steered-color)" stroke-width="2"></line>`, 'Steered prediction')}
      ${d.steeredSigma ? this._legendItem(svg`<rect x="0" y="1" width="18" height="8" fill="var(--uncertainty-color)" opacity="0.25"></rect>`, `±${formatNumber(this._k, 3)}σ uncertainty`) : nothing}
      ${d.unsteered ? this._legendItem(svg`<line x1="0" x2="18" y1="5" y2="5" stroke="var(--unsteered-color)" stroke-width="1.5" stroke-dasharray="4 3"></line>`, 'Unsteered prediction') : nothing}
      ${d.tolerance !== null ? this._legendItem(svg`<rect x="0" y="1" width="18" height="8" fill="var(--tolerance-color)" opacity="0.18"></rect><line x1="0" x2="18" y1="1" y2="1" stroke="var(--tolerance-color)" stroke-dasharray="3 2"></line><line x1="0" x2="18" y1="9" y2="9" stroke="var(--tolerance-color)" stroke-dasharray="3 2"></line>`, `Tolerance ±${formatOffsetAuto(d.tolerance, 3)}`) : nothing}
      ${d.contacts.length ? this._legendItem(svg`<rect x="0" y="0" width="18" height="10" fill="var(--contact-color)" opacity="0.22"></rect>`, 'Contact window') : nothing}
      ${d.maneuvers.length ? this._legendItem(svg`<line x1="9" x2="9" y1="0" y2="10" stroke="var(--maneuver-color)" stroke-width="1.5" stroke-dasharray="2 2"></line><path d="M5 0L13 0L9 4z" fill="var(--maneuver-color)"></path>`, 'Manoeuvre') : nothing}
      ${this._legendItem(svg`${tri('var(--frequency-command-color)', false)}`, 'Frequency step (▲ up, ▼ down)')}
      ${d.commands.some((c) => c.kind === 'phase') ? this._legendItem(svg`<path d="M9 0L14 5L9 10L4 5z" fill="var(--phase-command-color)" stroke="var(--surface)"></path>`, 'Phase step') : nothing}
    </ul>`;
  }

  private _kindGlyph(c: SteeringCommandView): TemplateResult {
    const shape = commandShape(c);
    const color = c.kind === 'phase' ? 'var(--phase-command-color)' : 'var(--frequency-command-color)';
    const d = shape === 'diamond' ? 'M6 0L12 6L6 12L0 6z' : shape === 'triangle-down' ? 'M6 11L12 2L0 2z' : 'M6 1L12 10L0 10z';
    return html`<svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true"><path d=${d} fill=${color}></path></svg>`;
  }

  private _renderTable(d: PlanView): TemplateResult {
    const ms = (s: number): number => chartTimeToUtcMs(d, s);
    return html`<table part="table">
      <caption>${d.commands.length} command${d.commands.length === 1 ? '' : 's'}, times in UTC</caption>
      <thead><tr>
        <th scope="col">#</th><th scope="col">Uplink</th><th scope="col">Executes</th><th scope="col">Kind</th>
        <th scope="col">Step</th><th scope="col">Actuator steps</th><th scope="col">Reason</th>
      </tr></thead>
      <tbody>
        ${d.commands.length === 0
          ? html`<tr><td colspan="7">No commands: the plan needs no steering in this span.</td></tr>`
          : d.commands.map((c, k) => {
            const selected = c.index === this.selectedIndex;
            return html`<tr part=${selected ? 'row selected' : 'row'} aria-current=${selected ? 'true' : 'false'} data-index=${c.index}
              @click=${() => this._selectByUser(k, 'table')}>
              <th scope="row"><button type="button" class="row-button" aria-label=${`Select command ${k + 1}`}
                @click=${(e: Event) => { e.stopPropagation(); this._selectByUser(k, 'table'); }}>${k + 1}</button></th>
              <td>${Number.isFinite(c.uplinkAt) ? formatUtc(ms(c.uplinkAt), true) : '—'}</td>
              <td>${formatUtc(ms(c.executeAt), true)}</td>
              <td><span class="kind">${this._kindGlyph(c)}${c.kind}</span></td>
              <td>${c.kind === 'phase' ? `${c.step >= 0 ? '+' : ''}${formatOffsetAuto(c.step, 4)}` : `${c.step >= 0 ? '+' : ''}${formatFraction(c.step, 4)}`}</td>
              <td>${Number.isFinite(c.actuatorSteps) ? formatNumber(c.actuatorSteps, 16) : '—'}</td>
              <td class="reason" title=${typographicMinus(c.reason)}><span>${typographicMinus(c.reason)}</span></td>
            </tr>`;
          })}
      </tbody>
    </table>`;
  }

  private _renderTooltip(d: PlanView): TemplateResult | typeof nothing {
    const h = this._hover, sc = this._scales;
    if (!h || !sc) return nothing;
    const left = h.px > this._size.width / 2 ? Math.max(0, h.px - 250) : h.px + 16;
    const style = `left:${left}px;top:${MARGIN.top + 6}px`;
    const u = sc.unit;
    if (h.kind === 'command') {
      const c = d.commands[h.c]!;
      return html`<div part="tooltip" style=${style}>
        <strong>Command ${h.c + 1} of ${d.commands.length}</strong>
        <dl>
          <dt>Kind</dt><dd>${c.kind}</dd>
          <dt>Step</dt><dd>${c.kind === 'phase' ? formatOffsetAuto(c.step, 4) : formatFraction(c.step, 4)}</dd>
          ${Number.isFinite(c.actuatorSteps) ? html`<dt>Actuator steps</dt><dd>${formatNumber(c.actuatorSteps, 16)}</dd>` : nothing}
          ${Number.isFinite(c.uplinkAt) ? html`<dt>Uplink</dt><dd>${formatUtc(chartTimeToUtcMs(d, c.uplinkAt), true)}</dd>` : nothing}
          <dt>Executes</dt><dd>${formatUtc(chartTimeToUtcMs(d, c.executeAt), true)}</dd>
        </dl>
        ${c.reason ? html`<div class="note">${typographicMinus(c.reason)}</div>` : nothing}
      </div>`;
    }
    const i = h.i;
    const k = this._k;
    return html`<div part="tooltip" style=${style}>
      <strong>${formatUtc(chartTimeToUtcMs(d, d.t[i]!), true)}</strong>
      <dl>
        <dt>Steered</dt><dd>${formatOffset(d.steered[i]!, u)}</dd>
        ${d.steeredSigma ? html`<dt>±${formatNumber(k, 3)}σ</dt><dd>${formatOffset(d.steeredSigma[i]! * k, u)}</dd>` : nothing}
        ${d.unsteered ? html`<dt>Unsteered</dt><dd>${formatOffset(d.unsteered[i]!, u)}</dd>` : nothing}
        ${d.tolerance !== null ? html`<dt>Tolerance</dt><dd>±${formatOffset(d.tolerance, u)}</dd>` : nothing}
      </dl>
    </div>`;
  }

  protected override updated(changed: PropertyValues<this>): void {
    this._drawData();
    this._drawOverlay();
    if (changed.has('selectedIndex')) this._scrollRowIntoView();
  }

  /** Reads `superseded` and `estimates` against the scenario epoch (revision layer, revisions-layer.ts). */
  private _readRevisions(): void {
    const epoch = (this.scenario as { epoch?: unknown } | null | undefined)?.epoch;
    const any = (this.superseded !== undefined && this.superseded !== null) || (this.estimates !== undefined && this.estimates !== null);
    this._revisions = any && typeof epoch === 'string' ? readRevisions(this.superseded, this.estimates, epoch) : null;
    if (this._revisions && this._revisions.dropped > 0) {
      warnOnce(this, 'revision-entries-dropped', `${this._revisions.dropped} superseded command(s) or estimate(s) could not be read and are not drawn`);
    }
    this._dataVersion += 1;
  }

  private _drawData(): void {
    const d = this._data;
    const canvas = this._dataCanvas;
    const w = this._size.width, h = this._size.height;
    if (!d || !canvas || !this._view || w < 60 || h < 60) { this._scales = null; return; }
    const colors = this._resolveColors(COLOR_EXPR);
    const key = `${this._dataVersion}|${this._view[0]}|${this._view[1]}|${w}|${h}|${colors.steered}|${colors.text}|${this.yUnit}|${this._k}|${this.fitAll}|${globalThis.devicePixelRatio}`;
    if (key === this._lastDataKey && this._scales) return;
    this._lastDataKey = key;
    const ctx = sizeCanvas(canvas, w, h);
    if (!ctx) return;
    const frame: Frame = { left: MARGIN.left, top: MARGIN.top, width: w - MARGIN.left - MARGIN.right, height: h - MARGIN.top - MARGIN.bottom };
    const [x0, x1] = this._view;
    const sx = linearScale(x0, x1, frame.left, frame.left + frame.width);
    const columns = Math.max(1, Math.round(frame.width * Math.max(1, globalThis.devicePixelRatio || 1)));
    const [i0, i1] = visibleRange(d.t, x0, x1);
    const steered = decimateLine(d.t, d.steered, i0, i1, x0, x1, columns);
    const band = this._bandLow && this._bandHigh ? decimateBand(d.t, this._bandLow, this._bandHigh, i0, i1, x0, x1, columns) : null;
    const unsteered = d.unsteered ? decimateLine(d.t, d.unsteered, i0, i1, x0, x1, columns) : null;

    // Offset axis: fit the steered prediction, its band and the tolerance (or everything).
    let lo = Infinity, hi = -Infinity;
    const take = (arr: Float64Array, n: number): void => {
      for (let i = 0; i < n; i++) { const v = arr[i]!; if (v < lo) lo = v; if (v > hi) hi = v; }
    };
    take(steered.y, steered.length);
    if (band) { take(band.low, band.length); take(band.high, band.length); }
    if (unsteered && this.fitAll) take(unsteered.y, unsteered.length);
    if (d.tolerance !== null) { lo = Math.min(lo, -d.tolerance); hi = Math.max(hi, d.tolerance); }
    const [y0, y1] = padDomain(lo, hi, 0.08);
    const sy = linearScale(y0, y1, frame.top + frame.height, frame.top);
    const unit = parseTimeUnit(this.yUnit) ?? pickTimeUnit(Math.max(Math.abs(y0), Math.abs(y1)));
    this._scales = { sx, sy, frame, unit };

    // About one label per 70 px, at least four intervals, so a phone-width plot still shows a few dates.
    const tt = timeTicks(x0, x1, Math.max(4, Math.floor(frame.width / 70)), d.epochMs);
    const xTicks: Tick[] = tt.values.map((v) => {
      const f = formatTimeTick(d.epochMs + v * 1000, tt.step);
      return { value: v, label: f.main, sub: f.sub };
    });
    const yTicks: Tick[] = linearTicks(y0, y1, Math.max(2, Math.floor(frame.height / 44)))
      .map((v) => ({ value: v, label: formatNumber(v / unit.seconds, 4) }));
    drawAxes(ctx, frame, sx, sy, xTicks, yTicks, { text: colors.text, muted: colors.muted, grid: colors.grid, font: colors.font },
      { x: 'UTC', y: `Clock offset (${unit.unit})` });

    ctx.save();
    ctx.beginPath();
    ctx.rect(frame.left, frame.top, frame.width, frame.height);
    ctx.clip();
    // Contact windows.
    ctx.fillStyle = colors.contact;
    ctx.globalAlpha = 0.14;
    for (const c of d.contacts) {
      if (c.end < x0 || c.start > x1) continue;
      const a = sx.map(c.start), b = sx.map(c.end);
      ctx.fillRect(a, frame.top, Math.max(1, b - a), frame.height);
    }
    ctx.globalAlpha = 0.55;
    for (const c of d.contacts) {
      if (c.end < x0 || c.start > x1) continue;
      const a = sx.map(c.start), b = sx.map(c.end);
      ctx.fillRect(a, frame.top + frame.height - 4, Math.max(1, b - a), 4);
    }
    // Tolerance band.
    if (d.tolerance !== null) {
      const ya = sy.map(d.tolerance), yb = sy.map(-d.tolerance);
      ctx.globalAlpha = 0.1;
      ctx.fillStyle = colors.tolerance;
      ctx.fillRect(frame.left, ya, frame.width, yb - ya);
      ctx.globalAlpha = 0.9;
      ctx.strokeStyle = colors.tolerance;
      ctx.lineWidth = 1;
      ctx.setLineDash([6, 4]);
      ctx.beginPath();
      ctx.moveTo(frame.left, Math.round(ya) + 0.5); ctx.lineTo(frame.left + frame.width, Math.round(ya) + 0.5);
      ctx.moveTo(frame.left, Math.round(yb) + 0.5); ctx.lineTo(frame.left + frame.width, Math.round(yb) + 0.5);
      ctx.stroke();
      ctx.setLineDash([]);
    }
    // Uncertainty band.
    if (band) {
      ctx.globalAlpha = 0.2;
      ctx.fillStyle = colors.uncertainty;
      fillBand(ctx, band, sx, sy);
    }
    ctx.globalAlpha = 1;
    ctx.lineJoin = 'round';
    if (unsteered) {
      ctx.strokeStyle = colors.unsteered;
      ctx.lineWidth = 1.5;
      ctx.setLineDash([7, 4]);
      strokePolyline(ctx, unsteered, sx, sy);
      ctx.setLineDash([]);
    }
    ctx.strokeStyle = colors.steered;
    ctx.lineWidth = 2;
    strokePolyline(ctx, steered, sx, sy);
    // Manoeuvres: dashed vertical line with a flag at the top.
    ctx.strokeStyle = colors.maneuver;
    ctx.fillStyle = colors.maneuver;
    ctx.lineWidth = 1.5;
    for (const m of d.maneuvers) {
      if (m.at < x0 || m.at > x1) continue;
      const x = Math.round(sx.map(m.at)) + 0.5;
      ctx.setLineDash([3, 3]);
      ctx.beginPath(); ctx.moveTo(x, frame.top); ctx.lineTo(x, frame.top + frame.height); ctx.stroke();
      ctx.setLineDash([]);
      ctx.beginPath(); ctx.moveTo(x - 5, frame.top); ctx.lineTo(x + 5, frame.top); ctx.lineTo(x, frame.top + 6); ctx.closePath(); ctx.fill();
    }
    // Command markers on the steered line.
    this._markers = [];
    d.commands.forEach((c, k) => {
      if (c.executeAt < x0 || c.executeAt > x1) return;
      let yv = interpolate(d.t, d.steered, c.executeAt);
      if (!Number.isFinite(yv)) yv = 0;
      const x = sx.map(c.executeAt), y = Math.min(frame.top + frame.height - 7, Math.max(frame.top + 7, sy.map(yv)));
      this._markers.push({ c: k, x, y });
    });
    ctx.lineWidth = 1.5;
    ctx.strokeStyle = colors.surface;
    for (const m of this._markers) {
      const c = d.commands[m.c]!;
      const p = markerPath(commandShape(c), m.x, m.y, 6);
      ctx.fillStyle = c.kind === 'phase' ? colors.phase : colors.frequency;
      ctx.fill(p);
      ctx.stroke(p);
    }
    this._revisionMarks = this._revisions
      ? drawRevisions(ctx, frame, sx, sy, [x0, x1], { t: d.t, y: d.steered }, this._revisions, { command: colors.frequency, estimate: colors.text })
      : { superseded: [], estimates: [] };
    ctx.restore();
    // Manoeuvre labels above the frame.
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

  private _drawOverlay(): void {
    const canvas = this._overlayCanvas;
    const w = this._size.width, h = this._size.height;
    const d = this._data, sc = this._scales;
    if (!canvas || w < 60 || h < 60) return;
    const ctx = sizeCanvas(canvas, w, h);
    if (!ctx || !d || !sc) return;
    const colors = this._resolveColors(COLOR_EXPR);
    const { frame, sx, sy } = sc;
    const hv = this._hover;
    if (hv?.kind === 'sample') {
      const x = Math.round(sx.map(d.t[hv.i]!)) + 0.5;
      ctx.strokeStyle = colors.muted;
      ctx.lineWidth = 1;
      ctx.setLineDash([2, 3]);
      ctx.beginPath(); ctx.moveTo(x, frame.top); ctx.lineTo(x, frame.top + frame.height); ctx.stroke();
      ctx.setLineDash([]);
      ctx.fillStyle = colors.steered;
      ctx.beginPath(); ctx.arc(sx.map(d.t[hv.i]!), sy.map(d.steered[hv.i]!), 3.5, 0, Math.PI * 2); ctx.fill();
    }
    const selected = d.commands.findIndex((c) => c.index === this.selectedIndex);
    for (const m of this._markers) {
      if (m.c !== selected && !(hv?.kind === 'command' && hv.c === m.c)) continue;
      ctx.strokeStyle = m.c === selected ? colors.accent : colors.muted;
      ctx.lineWidth = 2;
      ctx.beginPath(); ctx.arc(m.x, m.y, 10, 0, Math.PI * 2); ctx.stroke();
    }
  }

  // ---- view changes ----------------------------------------------------------------------

  private _setView(a: number, b: number, byUser: boolean): void {
    const d = this._data;
    if (!d || d.t.length === 0) return;
    const lo = d.t[0]!, hi = d.t[d.t.length - 1]!;
    const full = Math.max(hi - lo, 1e-9);
    const minSpan = Math.min(full, Math.max(full * 1e-5, 1));
    let span = Math.min(full, Math.max(minSpan, b - a));
    let start = (a + b) / 2 - span / 2;
    if (b - a >= minSpan && b - a <= full) { start = a; span = b - a; }
    start = Math.min(Math.max(start, lo), hi - span);
    const next: [number, number] = [start, start + span];
    if (this._view && next[0] === this._view[0] && next[1] === this._view[1]) return;
    this._view = next;
    this.requestUpdate();
    if (byUser) emit(this, 'tauline-view-change', { startSeconds: next[0], endSeconds: next[1] });
  }

  private _zoom(factor: number, anchor: number, byUser: boolean): void {
    if (!this._view) return;
    const [a, b] = this._view;
    this._setView(anchor - (anchor - a) * factor, anchor + (b - anchor) * factor, byUser);
  }

  private _pan(fraction: number): void {
    if (!this._view) return;
    const [a, b] = this._view;
    const shift = (b - a) * fraction;
    this._setView(a + shift, b + shift, true);
  }

  // ---- selection ---------------------------------------------------------------------------

  private _selectByUser(position: number, source: 'plot' | 'table' | 'keyboard'): void {
    const d = this._data;
    const c = d?.commands[position];
    if (!d || !c) return;
    this.selectedIndex = c.index;
    this._announcement = `Command ${position + 1} of ${d.commands.length}: ${describeStep(c)}, executes ${formatUtc(chartTimeToUtcMs(d, c.executeAt), true)}. ${typographicMinus(c.reason)}`;
    if (source !== 'plot' && this._view && (c.executeAt < this._view[0] || c.executeAt > this._view[1])) {
      const span = this._view[1] - this._view[0];
      this._setView(c.executeAt - span / 2, c.executeAt + span / 2, true);
    }
    emit(this, 'tauline-command-select', { index: c.index, command: c.source, executeAtSeconds: c.executeAt });
  }

  private _scrollRowIntoView(): void {
    const wrap = this.renderRoot.querySelector<HTMLElement>('.table-wrap');
    const row = this.renderRoot.querySelector<HTMLElement>(`tr[aria-current='true']`);
    if (!wrap || !row || this.noTable) return;
    const head = this.renderRoot.querySelector<HTMLElement>('thead')?.offsetHeight ?? 0;
    const top = row.offsetTop, bottom = top + row.offsetHeight;
    if (top - head < wrap.scrollTop) wrap.scrollTop = top - head;
    else if (bottom > wrap.scrollTop + wrap.clientHeight) wrap.scrollTop = bottom - wrap.clientHeight;
  }

  // ---- pointer, wheel, keyboard ------------------------------------------------------------

  private _localX(event: { clientX: number; clientY: number }): { x: number; y: number } {
    const rect = this._box!.getBoundingClientRect();
    return { x: event.clientX - rect.left, y: event.clientY - rect.top };
  }

  private _hitMarker(x: number, y: number): number {
    let best = -1, bestD = 11 * 11;
    for (const m of this._markers) {
      const dd = (m.x - x) ** 2 + (m.y - y) ** 2;
      if (dd < bestD) { bestD = dd; best = m.c; }
    }
    return best;
  }

  private readonly _onPointerDown = (event: PointerEvent): void => {
    if (!this._scales || !this._view || event.button > 0) return;
    const p = this._localX(event);
    this._pointers.set(event.pointerId, p);
    // Capture keeps a drag going outside the box; synthetic pointers (tests) have none to capture.
    try { (event.currentTarget as HTMLElement).setPointerCapture(event.pointerId); } catch { /* not an active pointer */ }
    if (this._pointers.size === 1) this._gesture = { x0: this._view[0], x1: this._view[1], px: p.x, moved: false };
    else if (this._pointers.size === 2) {
      const [a, b] = [...this._pointers.values()];
      this._gesture = { x0: this._view[0], x1: this._view[1], px: (a!.x + b!.x) / 2, moved: true, dist: Math.max(10, Math.abs(a!.x - b!.x)), center: (a!.x + b!.x) / 2 };
    }
  };

  private readonly _onPointerMove = (event: PointerEvent): void => {
    const sc = this._scales, d = this._data;
    if (!sc || !d) return;
    const p = this._localX(event);
    const g = this._gesture;
    if (this._pointers.has(event.pointerId) && g) {
      this._pointers.set(event.pointerId, p);
      const perPixel = (g.x1 - g.x0) / sc.frame.width;
      if (this._pointers.size >= 2 && g.dist !== undefined && g.center !== undefined) {
        const [a, b] = [...this._pointers.values()];
        const dist = Math.max(10, Math.abs(a!.x - b!.x)), center = (a!.x + b!.x) / 2;
        const span = (g.x1 - g.x0) * (g.dist / dist);
        const anchor = g.x0 + (g.center - sc.frame.left) * perPixel; // data value under the initial centre
        const start = anchor - (center - sc.frame.left) * (span / sc.frame.width);
        this._setView(start, start + span, false);
      } else {
        const dx = p.x - g.px;
        if (Math.abs(dx) > 3) g.moved = true;
        if (g.moved) {
          this._box?.classList.add('dragging');
          this._setView(g.x0 - dx * perPixel, g.x1 - dx * perPixel, false);
        }
      }
      this._hover = null;
      return;
    }
    this._updateHover(p.x, p.y, d, sc);
  };

  private _updateHover(x: number, y: number, d: PlanView, sc: Scales): void {
    const inside = x >= sc.frame.left && x <= sc.frame.left + sc.frame.width && y >= sc.frame.top && y <= sc.frame.top + sc.frame.height;
    if (!inside) { if (this._hover) this._hover = null; return; }
    const c = this._hitMarker(x, y);
    if (c >= 0) {
      if (this._hover?.kind !== 'command' || this._hover.c !== c) this._hover = { kind: 'command', c, px: x };
      return;
    }
    const i = closestIndex(d.t, sc.sx.invert(x));
    if (i < 0) return;
    if (this._hover?.kind !== 'sample' || this._hover.i !== i) this._hover = { kind: 'sample', i, px: sc.sx.map(d.t[i]!) };
  }

  private readonly _onPointerUp = (event: PointerEvent): void => {
    const g = this._gesture;
    const wasPointer = this._pointers.delete(event.pointerId);
    this._box?.classList.remove('dragging');
    if (!wasPointer || !g) return;
    if (this._pointers.size > 0) return; // the pinch goes on with the remaining finger ignored until release
    this._gesture = null;
    if (g.moved) {
      if (this._view) emit(this, 'tauline-view-change', { startSeconds: this._view[0], endSeconds: this._view[1] });
      return;
    }
    const p = this._localX(event);
    const c = this._hitMarker(p.x, p.y);
    if (c >= 0) this._selectByUser(c, 'plot');
  };

  private readonly _onPointerCancel = (event: PointerEvent): void => {
    this._pointers.delete(event.pointerId);
    if (this._pointers.size === 0) this._gesture = null;
    this._box?.classList.remove('dragging');
  };

  private readonly _onPointerLeave = (): void => {
    if (this._pointers.size === 0 && this._hover) this._hover = null;
  };

  private readonly _onWheel = (event: WheelEvent): void => {
    const sc = this._scales;
    if (!sc || !this._view) return;
    event.preventDefault();
    const p = this._localX(event);
    if (Math.abs(event.deltaX) > Math.abs(event.deltaY)) {
      this._pan(event.deltaX / sc.frame.width);
      return;
    }
    const factor = Math.exp(Math.max(-1, Math.min(1, event.deltaY * 0.0015)));
    this._zoom(factor, sc.sx.invert(Math.min(Math.max(p.x, sc.frame.left), sc.frame.left + sc.frame.width)), true);
  };

  private readonly _onDoubleClick = (): void => {
    const d = this._data;
    if (d && d.t.length > 0) this._setView(d.t[0]!, d.t[d.t.length - 1]!, true);
  };

  private readonly _onResetClick = (): void => {
    this._onDoubleClick();
  };

  private readonly _onKeyDown = (event: KeyboardEvent): void => {
    const d = this._data;
    if (!d || !this._view) return;
    const center = (this._view[0] + this._view[1]) / 2;
    let handled = true;
    switch (event.key) {
      case 'ArrowRight':
      case 'ArrowLeft': {
        const dir = event.key === 'ArrowRight' ? 1 : -1;
        if (event.shiftKey) { this._pan(0.1 * dir); break; }
        if (d.commands.length === 0) break;
        const cur = d.commands.findIndex((c) => c.index === this.selectedIndex);
        const next = cur < 0 ? (dir > 0 ? 0 : d.commands.length - 1) : Math.min(d.commands.length - 1, Math.max(0, cur + dir));
        if (next !== cur) this._selectByUser(next, 'keyboard');
        break;
      }
      case 'PageUp': this._pan(-0.9); break;
      case 'PageDown': this._pan(0.9); break;
      case '+': case '=': this._zoom(0.8, center, true); break;
      case '-': case '_': this._zoom(1.25, center, true); break;
      case 'Home': this._setView(d.t[0]!, d.t[d.t.length - 1]!, true); break;
      case 'Escape': this._hover = null; break;
      default: handled = false;
    }
    if (handled) event.preventDefault();
  };
}
