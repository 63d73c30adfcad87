import type { ClockOffsetEstimate, SteeringCommandJson, SteeringScenario } from '@tauline/sdk/steering';
import type { TimeScales } from '@tauline/sdk/time';
import { html, nothing, type PropertyDeclarations, type PropertyValues, type TemplateResult } from 'lit';
import { emit } from '../events.js';
import { formatChartUtc } from '../internal/calendar-axis.js';
import { sizeCanvas } from '../internal/canvas.js';
import { parseTimeUnit, typographicMinus } from '../internal/format.js';
import { PlotElement } from '../internal/plot-element.js';
import { baseStyles, plotStyles } from '../internal/styles.js';
import { ViewController } from '../internal/view-controller.js';
import { warnOnce } from '../internal/warn.js';
import { bundledTimeScales, type PlanView, readPlan, type SteeringCommandView } from './plan-data.js';
import type { SteeringPlanInput } from './plan-guard.js';
import { type RevisionView, readRevisions } from './revisions-layer.js';
import {
  type CommandMarker,
  commandShape,
  drawSchedule,
  drawScheduleOverlay,
  layoutSchedule,
  type ScheduleColors,
  type ScheduleHover,
  type ScheduleScales,
  uncertaintyBand,
  worstAbs,
} from './schedule-draw.js';
import { hitMarker, hoverAt, sameHover, scheduleLabel } from './schedule-hit.js';
import {
  describeStep,
  renderBadge,
  renderLegend,
  renderMetrics,
  renderTable,
  renderTooltip,
} from './schedule-templates.js';
import { steeringScheduleStyles } from './steering-schedule.styles.js';

export type { PlanView, SteeringCommandView, SteeringPlanInput };
export { commandShape };

const COLOR_EXPR: Record<Exclude<keyof ScheduleColors, 'font'>, string> = {
  text: 'var(--text)',
  muted: 'var(--muted)',
  grid: 'var(--grid)',
  surface: 'var(--surface)',
  accent: 'var(--accent)',
  steered: 'var(--steered-color)',
  unsteered: 'var(--unsteered-color)',
  uncertainty: 'var(--uncertainty-color)',
  tolerance: 'var(--tolerance-color)',
  contact: 'var(--contact-color)',
  maneuver: 'var(--maneuver-color)',
  frequency: 'var(--frequency-command-color)',
  phase: 'var(--phase-command-color)',
};

/**
 * A steering schedule: the predicted clock offset over time with the tolerance band, the
 * uncertainty band, the unsteered prediction, command markers (triangles for frequency steps,
 * pointing the way of the step; diamonds for phase steps), shaded contact windows and manoeuvre
 * marks, with a synchronised table of the commands. Zoom and pan with the mouse wheel and drag,
 * touch (drag, pinch) or the keyboard; hover for a read-out with units.
 *
 * Takes the plan's JSON form (`steeringPlanToJson(planSteering())` of `@tauline/sdk`) as `plan` and its input as
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
    timeScales: { attribute: false },
    label: {},
    yUnit: { attribute: 'y-unit' },
    sigmaMultiple: { type: Number, attribute: 'sigma-multiple' },
    fitAll: { type: Boolean, attribute: 'fit-all' },
    noTable: { type: Boolean, reflect: true, attribute: 'no-table' },
    selectedIndex: { type: Number, attribute: 'selected-index' },
    _hover: { state: true, attribute: false },
    _announcement: { state: true, attribute: false },
  };

  /** The plan's JSON form (`steeringPlanToJson(planSteering())`, as a server sends it; prediction columns may be `Float64Array`s). */
  plan?: SteeringPlanInput | null;

  /** The scenario the plan was made for (`SteeringScenario`): epoch, `tolerance.phaseSeconds`, `contacts`, `maneuvers`. */
  scenario?: SteeringScenario | null;

  /** Commands a re-plan superseded (the SDK's `revision.superseded`), drawn faded on the steered line. */
  superseded?: readonly SteeringCommandJson[] | null;

  /** Clock-offset estimates (`ClockOffsetEstimate`s, as given to a re-plan), drawn as points with ±1σ bars. */
  estimates?: readonly ClockOffsetEstimate[] | null;

  /**
   * The time scales (leap-second table) the plan's UTC stamps are read with: the one the plan was
   * made with (`PlanOptions.timeScales`). Default: the SDK's bundled table, as the planner's default.
   */
  timeScales?: TimeScales;

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

  private _hover: ScheduleHover | null = null;
  private _announcement = '';

  private _result: ReturnType<typeof readPlan> | null = null;
  private _revisions: RevisionView | null = null;
  private _band: { low: Float64Array; high: Float64Array } | null = null;
  private _dataVersion = 0;
  private _worst = 0;
  private _scales: ScheduleScales | null = null;
  private _lastDataKey = '';
  private _markers: CommandMarker[] = [];
  private readonly _viewController = new ViewController(this, (span, byUser) => {
    if (byUser) emit(this, 'tauline-view-change', { startSeconds: span[0], endSeconds: span[1] });
  });

  /** The parsed plan, or null before data / on error. */
  private get _data(): PlanView | null {
    return this._result?.ok ? this._result.view : null;
  }

  /** The visible time span in seconds since the scenario epoch, or null without data. */
  get view(): { startSeconds: number; endSeconds: number } | null {
    const v = this._viewController.view;
    return v ? { startSeconds: v[0], endSeconds: v[1] } : null;
  }

  /** Shows the span [startSeconds, endSeconds] (seconds since the epoch), clamped to the data. Fires no event. */
  setView(startSeconds: number, endSeconds: number): void {
    if (!Number.isFinite(startSeconds) || !Number.isFinite(endSeconds)) return;
    this._viewController.set(startSeconds, endSeconds, false);
  }

  /** Shows the whole prediction. Fires no event. */
  resetView(): void {
    this._viewController.reset(false);
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    super.willUpdate(changed);
    const planChanged = changed.has('plan') || changed.has('scenario') || changed.has('timeScales');
    if (planChanged) this._readPlan();
    if (planChanged || changed.has('sigmaMultiple')) {
      const d = this._data;
      this._band = d ? uncertaintyBand(d, this._k) : null;
    }
    if (planChanged || changed.has('superseded') || changed.has('estimates')) this._readRevisions();
    if (changed.has('sigmaMultiple') && !(Number.isFinite(this.sigmaMultiple) && this.sigmaMultiple >= 0)) {
      warnOnce(
        this,
        'invalid-sigma-multiple',
        `sigma-multiple must be a non-negative number; received ${String(this.sigmaMultiple)}; using 2`,
      );
    }
    if (changed.has('yUnit') && this.yUnit !== 'auto' && !parseTimeUnit(this.yUnit)) {
      warnOnce(
        this,
        'invalid-y-unit',
        `y-unit must be auto, s, ms, us, ns or ps; received ${JSON.stringify(this.yUnit)}; using auto`,
      );
    }
  }

  private _readPlan(): void {
    if (this.plan === undefined || this.plan === null) this._result = null;
    else {
      this._result = readPlan(this.plan, this.scenario, this.timeScales ?? bundledTimeScales());
      if (!this._result.ok) warnOnce(this, 'invalid-plan', this._result.error);
      else if (this._result.view.invalid.length > 0)
        warnOnce(this, 'invalid-plan-values', this._result.view.invalid.join('; '));
    }
    this._dataVersion += 1;
    this._hover = null;
    const d = this._data;
    const first = d?.t[0],
      last = d?.t[d.t.length - 1];
    // The view controller keeps the user's zoom across data updates when it still lies inside the new data.
    this._viewController.setDomain(first !== undefined && last !== undefined ? [first, last] : null);
    this._worst = d ? worstAbs(d.steered) : 0;
  }

  /** Reads `superseded` and `estimates` against the scenario epoch (revision layer, revisions-layer.ts). */
  private _readRevisions(): void {
    const d = this._data;
    const any =
      (this.superseded !== undefined && this.superseded !== null) ||
      (this.estimates !== undefined && this.estimates !== null);
    const read = any && d ? readRevisions(this.superseded, this.estimates, d) : null;
    if (read && !read.ok) warnOnce(this, 'invalid-revisions', `${read.error}; the revision layer is not drawn`);
    this._revisions = read?.ok ? read.view : null;
    this._dataVersion += 1;
  }

  private get _k(): number {
    return Number.isFinite(this.sigmaMultiple) && this.sigmaMultiple >= 0 ? this.sigmaMultiple : 2;
  }

  /** Accessible name of the plot, computed from the data. */
  get plotLabel(): string {
    return scheduleLabel(this._data, this._worst);
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
        ${r?.ok ? renderBadge(r.view) : nothing}
      </div>
      ${
        r?.ok && r.view.invalid.length > 0
          ? html`<div class="state error invalid-data" role="alert">The plan's data are not valid, so its feasibility cannot be trusted: ${r.view.invalid.join('; ')}.</div>`
          : nothing
      }
      ${body}
      <span class="probe" aria-hidden="true"></span>
    </div>`;
  }

  private _renderChart(d: PlanView): TemplateResult {
    return html`
      ${!d.feasible && d.reason ? html`<p class="summary" role="note">${typographicMinus(d.reason)}</p>` : nothing}
      ${renderMetrics(d)}
      ${renderLegend(d, this._k)}
      <div class="plot-box" part="plot" tabindex="0" role="group"
        aria-roledescription="interactive plot" aria-label="Steering schedule plot" aria-describedby="keys"
        @pointerdown=${this._onPointerDown} @pointermove=${this._onPointerMove} @pointerup=${this._onPointerUp}
        @pointercancel=${this._onPointerCancel} @pointerleave=${this._onPointerLeave}
        @wheel=${this._onWheel} @keydown=${this._onKeyDown} @dblclick=${this._onDoubleClick}>
        <canvas class="data" role="img" aria-label=${this.plotLabel}></canvas>
        <canvas class="overlay" aria-hidden="true"></canvas>
        ${renderTooltip(d, this._hover, this._scales, this._k, this._size.width)}
      </div>
      <div class="tools">
        <span class="hint" id="keys">Drag or Shift+←/→ to pan, wheel or +/− to zoom, ←/→ to step through commands, Home to reset.</span>
        <button type="button" @click=${this._onResetClick}>Show all</button>
      </div>
      <div class="sr-only" aria-live="polite">${this._announcement}</div>
      <div class="table-wrap">${renderTable(d, this.selectedIndex, (k) => this._selectByUser(k, 'table'))}</div>
      ${d.caution ? html`<p class="caution" role="note">${d.caution}</p>` : nothing}`;
  }

  protected override updated(changed: PropertyValues<this>): void {
    this._drawData();
    this._drawOverlay();
    if (changed.has('selectedIndex')) this._scrollRowIntoView();
  }

  private _drawData(): void {
    const d = this._data;
    const canvas = this._dataCanvas;
    const view = this._viewController.view;
    const w = this._size.width,
      h = this._size.height;
    if (!d || !canvas || !view || w < 60 || h < 60) {
      this._scales = null;
      return;
    }
    const colors = this._resolveColors(COLOR_EXPR);
    const dpr = globalThis.devicePixelRatio;
    const key = `${this._dataVersion}|${view[0]}|${view[1]}|${w}|${h}|${colors.steered}|${colors.text}|${this.yUnit}|${this._k}|${this.fitAll}|${dpr}`;
    if (key === this._lastDataKey && this._scales) return;
    this._lastDataKey = key;
    const ctx = sizeCanvas(canvas, w, h);
    if (!ctx) return;
    const layout = layoutSchedule(
      d,
      this._band,
      view,
      { width: w, height: h },
      { yUnit: this.yUnit, fitAll: this.fitAll, devicePixelRatio: dpr },
    );
    this._scales = layout.scales;
    this._markers = drawSchedule(ctx, d, layout, colors, this._revisions).markers;
  }

  private _drawOverlay(): void {
    const canvas = this._overlayCanvas;
    const w = this._size.width,
      h = this._size.height;
    const d = this._data,
      sc = this._scales;
    if (!canvas || w < 60 || h < 60) return;
    const ctx = sizeCanvas(canvas, w, h);
    if (!ctx || !d || !sc) return;
    const selected = d.commands.findIndex((c) => c.index === this.selectedIndex);
    drawScheduleOverlay(ctx, d, sc, this._hover, this._markers, selected, this._resolveColors(COLOR_EXPR));
  }

  // ---- selection ---------------------------------------------------------------------------

  private _selectByUser(position: number, source: 'plot' | 'table' | 'keyboard'): void {
    const d = this._data;
    const c = d?.commands[position];
    const view = this._viewController.view;
    if (!d || !c) return;
    this.selectedIndex = c.index;
    this._announcement = `Command ${position + 1} of ${d.commands.length}: ${describeStep(c)}, executes ${formatChartUtc(d, c.executeAt, true)}. ${typographicMinus(c.reason)}`;
    if (source !== 'plot' && view && (c.executeAt < view[0] || c.executeAt > view[1])) {
      const span = view[1] - view[0];
      this._viewController.set(c.executeAt - span / 2, c.executeAt + span / 2, true);
    }
    emit(this, 'tauline-command-select', { index: c.index, command: c.source, executeAtSeconds: c.executeAt });
  }

  private _scrollRowIntoView(): void {
    const wrap = this.renderRoot.querySelector<HTMLElement>('.table-wrap');
    const row = this.renderRoot.querySelector<HTMLElement>(`tr[aria-current='true']`);
    if (!wrap || !row || this.noTable) return;
    const head = this.renderRoot.querySelector<HTMLElement>('thead')?.offsetHeight ?? 0;
    const top = row.offsetTop,
      bottom = top + row.offsetHeight;
    if (top - head < wrap.scrollTop) wrap.scrollTop = top - head;
    else if (bottom > wrap.scrollTop + wrap.clientHeight) wrap.scrollTop = bottom - wrap.clientHeight;
  }

  // ---- pointer, wheel, keyboard ------------------------------------------------------------

  private _local(event: { clientX: number; clientY: number }): { x: number; y: number } {
    const rect = this._box?.getBoundingClientRect();
    return { x: event.clientX - (rect?.left ?? 0), y: event.clientY - (rect?.top ?? 0) };
  }

  private readonly _onPointerDown = (event: PointerEvent): void => {
    if (!this._scales || !this._viewController.view || event.button > 0) return;
    // Capture keeps a drag going outside the box; synthetic pointers (tests) have none to capture.
    try {
      this._box?.setPointerCapture(event.pointerId);
    } catch {
      /* not an active pointer */
    }
    this._viewController.pointerDown(event.pointerId, this._local(event));
  };

  private readonly _onPointerMove = (event: PointerEvent): void => {
    const sc = this._scales,
      d = this._data;
    if (!sc || !d) return;
    const p = this._local(event);
    if (this._viewController.pointerMove(event.pointerId, p, { frame: sc.frame, invert: sc.sx.invert })) {
      if (this._viewController.dragging) this._box?.classList.add('dragging');
      this._hover = null;
      return;
    }
    this._updateHover(p.x, p.y, d, sc);
  };

  private _updateHover(x: number, y: number, d: PlanView, sc: ScheduleScales): void {
    const next = hoverAt(x, y, d, sc, this._markers);
    if (next !== undefined && !sameHover(this._hover, next)) this._hover = next;
  }

  private readonly _onPointerUp = (event: PointerEvent): void => {
    const outcome = this._viewController.pointerUp(event.pointerId);
    this._box?.classList.remove('dragging');
    const view = this._viewController.view;
    if (outcome === 'drag' && view) emit(this, 'tauline-view-change', { startSeconds: view[0], endSeconds: view[1] });
    if (outcome !== 'click') return;
    const p = this._local(event);
    const c = hitMarker(this._markers, p.x, p.y);
    if (c >= 0) this._selectByUser(c, 'plot');
  };

  private readonly _onPointerCancel = (event: PointerEvent): void => {
    this._viewController.pointerCancel(event.pointerId);
    this._box?.classList.remove('dragging');
  };

  private readonly _onPointerLeave = (): void => {
    if (!this._viewController.pointerDownNow && this._hover) this._hover = null;
  };

  private readonly _onWheel = (event: WheelEvent): void => {
    const sc = this._scales;
    if (!sc || !this._viewController.view) return;
    event.preventDefault();
    this._viewController.wheel(event.deltaX, event.deltaY, this._local(event).x, {
      frame: sc.frame,
      invert: sc.sx.invert,
    });
  };

  private readonly _onDoubleClick = (): void => {
    this._viewController.reset(true);
  };

  private readonly _onResetClick = (): void => {
    this._viewController.reset(true);
  };

  private _stepCommand(dir: 1 | -1): void {
    const d = this._data;
    if (!d || d.commands.length === 0) return;
    const cur = d.commands.findIndex((c) => c.index === this.selectedIndex);
    const next =
      cur < 0 ? (dir > 0 ? 0 : d.commands.length - 1) : Math.min(d.commands.length - 1, Math.max(0, cur + dir));
    if (next !== cur) this._selectByUser(next, 'keyboard');
  }

  private readonly _onKeyDown = (event: KeyboardEvent): void => {
    const vc = this._viewController;
    if (!this._data || !vc.view) return;
    let handled = true;
    switch (event.key) {
      case 'ArrowRight':
      case 'ArrowLeft': {
        const dir = event.key === 'ArrowRight' ? 1 : -1;
        if (event.shiftKey) vc.pan(0.1 * dir);
        else this._stepCommand(dir);
        break;
      }
      case 'PageUp':
        vc.pan(-0.9);
        break;
      case 'PageDown':
        vc.pan(0.9);
        break;
      case '+':
      case '=':
        vc.zoomAtCenter(0.8);
        break;
      case '-':
      case '_':
        vc.zoomAtCenter(1.25);
        break;
      case 'Home':
        vc.reset(true);
        break;
      case 'Escape':
        this._hover = null;
        break;
      default:
        handled = false;
    }
    if (handled) event.preventDefault();
  };
}
