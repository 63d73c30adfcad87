import type { FleetDocument, FleetPlanJson } from '@tauline/sdk/fleet';
import type { TimeScales } from '@tauline/sdk/time';
import { html, nothing, type PropertyDeclarations, type PropertyValues, type TemplateResult } from 'lit';
import { emit } from '../events.js';
import { calendarTicks, FLEET_STEPS_SECONDS, formatChartUtc } from '../internal/calendar-axis.js';
import { sizeCanvas } from '../internal/canvas.js';
import { at } from '../internal/checked.js';
import { typographicMinus } from '../internal/format.js';
import { PlotElement } from '../internal/plot-element.js';
import { linearScale, type Scale } from '../internal/scale.js';
import { baseStyles, plotStyles } from '../internal/styles.js';
import { warnOnce } from '../internal/warn.js';
import { type FleetReadResult, type FleetView, isAtRisk, readFleetPlan } from './fleet-data.js';
import { drawFleet, type FleetHit, type FleetLayout, fleetHeight, fleetLayout, hitTest } from './fleet-draw.js';
import { type Cursor, drawFleetOverlay, nextCursor } from './fleet-overlay.js';
import {
  describeSatellite,
  describeSupport,
  fleetLabel,
  fleetLegend,
  satelliteTable,
  stationTable,
  stepText,
  tooltip,
} from './fleet-table.js';
import { FLEET_COLOR_EXPR, fleetTimelineStyles } from './fleet-timeline.styles.js';
import './fleet-events.js';

interface Hover {
  hit: FleetHit;
  x: number;
  y: number;
}

/**
 * A constellation's joint steering plan on one time axis: one row per satellite (its passes along
 * the foot, its margin to tolerance as a strip that is full when the offset's bound at the tolerance
 * probability is zero and empty when that bound reaches the tolerance, its uplinks as a tick at the
 * uplink joined to a marker at execution: ▲/▼ frequency steps, ◆ phase steps) and one lane per
 * station (which satellite holds it when, and the setup time after each support, hatched).
 * Satellites that are not held, or whose smallest margin falls below `risk-margin` × their
 * tolerance, get a ⚠ before their name, a hatched row and a hatched margin where it is low, and
 * say so in the table.
 *
 * Takes the JSON form of `planFleet()`'s output (`fleetPlanToJson`, `@tauline/sdk/fleet`) as `plan` and the fleet document it was made
 * for as `fleet` (epoch, tolerances, stations, passes; read by a thin guard of the fields it uses). Every UTC
 * stamp is read through the SDK on `timeScales` (the leap-second table the plan was made with).
 *
 * Keyboard (timeline focused): ↑ / ↓ move between satellites and station lanes; ← / → move
 * between the supports of a lane (or the uplinks of a satellite); Home / End go to the first /
 * last satellite (in a lane: first / last support); Enter or Space selects; Shift+← / Shift+→ pan;
 * + / − zoom; 0 shows everything; Escape hides the read-out. Pointer: hover for a read-out, click to
 * select, drag to pan, wheel to zoom.
 *
 * @summary Fleet steering timeline: satellites' margins and uplinks, stations' supports.
 *
 * @fires tauline-satellite-select - The user selected a satellite (row, table or keyboard).
 *   Detail: `{ id, index, feasible, atRisk, satellite }`.
 * @fires tauline-support-select - The user selected a support in a station lane.
 *   Detail: `{ index, station, satellite, support }`.
 * @fires tauline-view-change - The user zoomed or panned. Detail: `{ startSeconds, endSeconds }` since the fleet epoch.
 *
 * @csspart base - The outer wrapper.
 * @csspart summary - The one-paragraph summary under the title.
 * @csspart legend - The legend list.
 * @csspart plot - The focusable timeline box holding the canvases.
 * @csspart tooltip - The hover read-out.
 * @csspart table - The satellite table (the accessible equivalent of the rows).
 * @csspart row - Each satellite row of the table; also `selected` and `at-risk` where they apply.
 * @csspart station-table - The station table.
 *
 * @cssproperty --margin-color - Margin strip where the margin is comfortable (token `--tauline-color-steered`).
 * @cssproperty --risk-color - Low or lost margin, at-risk marks (token `--tauline-color-fail`).
 * @cssproperty --support-color - Supports in the station lanes (token `--tauline-color-contact`).
 * @cssproperty --setup-color - Setup hatching after each support (token `--tauline-color-muted`).
 * @cssproperty --pass-color - Passes along each satellite row (token `--tauline-color-contact`).
 * @cssproperty --frequency-command-color - Frequency-step uplinks (token `--tauline-color-command-frequency`).
 * @cssproperty --phase-command-color - Phase-step uplinks (token `--tauline-color-command-phase`).
 * @cssproperty --table-max-height - Height after which the satellite table scrolls (default 320px).
 */
export class TaulineFleetTimeline extends PlotElement {
  static override styles = [baseStyles, plotStyles, fleetTimelineStyles];

  /** No layout read in the update cycle: the first draw waits for the ResizeObserver (before the first paint). */
  protected static override readonly measureOnFirstUpdate: boolean = false;

  static override properties: PropertyDeclarations = {
    plan: { attribute: false },
    fleet: { attribute: false },
    timeScales: { attribute: false },
    label: {},
    riskMargin: { type: Number, attribute: 'risk-margin' },
    selected: { reflect: true },
    noTable: { type: Boolean, reflect: true, attribute: 'no-table' },
    _hover: { state: true, attribute: false },
    _announcement: { state: true, attribute: false },
  };

  /** The joint plan's JSON form, `fleetPlanToJson(planFleet())` (as a server sends it). */
  plan?: FleetPlanJson | null;

  /** The fleet document the plan was made for. */
  fleet?: FleetDocument | null;

  /**
   * The time scales (leap-second table) the plan's and the fleet's UTC stamps are read with: the one the plan was
   * made with (`FleetPlanOptions.timeScales`). Default: the SDK's bundled table, as the planner's default.
   */
  timeScales?: TimeScales;

  /** Heading shown above the timeline. */
  label = 'Fleet timeline';

  /** A satellite whose smallest margin is below this fraction of its tolerance is at risk (default 0.1). */
  riskMargin = 0.1;

  /** Id of the selected satellite, or empty. Setting it fires no event. */
  selected = '';

  /** Hide the tables visually (they stay available to assistive technology). */
  noTable = false;

  private _hover: Hover | null = null;
  private _announcement = '';
  private _result: FleetReadResult | null = null;
  private _atRisk: boolean[] = [];
  private _view: [number, number] | null = null;
  private _cursor: Cursor | null = null;
  private _drawnKey = '';
  private _dataVersion = 0;
  private _gesture: { x0: number; x1: number; px: number; moved: boolean; id: number } | null = null;

  private get _data(): FleetView | null {
    return this._result?.ok ? this._result.view : null;
  }

  /** The visible span in seconds since the fleet epoch, or null without data. */
  get view(): { startSeconds: number; endSeconds: number } | null {
    return this._view ? { startSeconds: this._view[0], endSeconds: this._view[1] } : null;
  }

  /** Shows [startSeconds, endSeconds] (seconds since the epoch), kept inside the horizon. Fires no event. */
  setView(startSeconds: number, endSeconds: number): void {
    if (Number.isFinite(startSeconds) && Number.isFinite(endSeconds)) this._setView(startSeconds, endSeconds, false);
  }

  /** The satellites at risk (not held, or margin below `riskMargin` × tolerance), by id. */
  get atRisk(): string[] {
    return this._data?.satellites.filter((_, i) => this._atRisk[i]).map((s) => s.id) ?? [];
  }

  private get _risk(): number {
    return Number.isFinite(this.riskMargin) && this.riskMargin >= 0 && this.riskMargin <= 1 ? this.riskMargin : 0.1;
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    super.willUpdate(changed);
    if (changed.has('plan') || changed.has('fleet') || changed.has('timeScales')) {
      // The fleet document is read again only when it or the time scales change (a re-plan of the same fleet keeps it).
      const kept = this._result?.ok ? this._result.view.fleet : undefined;
      const { plan, fleet, timeScales } = this;
      this._result = plan === undefined || plan === null ? null : readFleetPlan(plan, fleet, kept, timeScales);
      if (this._result && !this._result.ok) warnOnce(this, 'invalid-fleet-plan', this._result.error);
      this._dataVersion += 1;
      this._hover = null;
      this._cursor = null;
      const d = this._data;
      if (!d) this._view = null;
      else if (!this._view || this._view[0] < 0 || this._view[1] > d.horizon) this._view = [0, d.horizon];
    }
    if (changed.has('riskMargin') && this._risk !== this.riskMargin) {
      warnOnce(
        this,
        'invalid-risk-margin',
        `risk-margin must be a fraction in [0, 1]; received ${String(this.riskMargin)}; using 0.1`,
      );
    }
    const d = this._data;
    this._atRisk = d ? d.satellites.map((s) => isAtRisk(s, this._risk)) : [];
  }

  protected override render(): TemplateResult {
    const r = this._result;
    let body: TemplateResult;
    if (!r) body = html`<div class="state">No fleet plan yet.</div>`;
    else if (!r.ok) body = html`<div class="state error" role="alert">Cannot show the fleet plan: ${r.error}</div>`;
    else body = this._renderTimeline(r.view);
    return html`<div part="base">
      <div class="head"><h3 class="title">${this.label}</h3>${r?.ok ? this._renderBadges(r.view) : nothing}</div>
      ${body}
      <span class="probe" aria-hidden="true"></span>
    </div>`;
  }

  private _renderBadges(d: FleetView): TemplateResult {
    const notHeld = d.satellites.filter((s) => !s.feasible).length;
    const risky = this._atRisk.filter(Boolean).length;
    const held = d.feasible ? '✓ every satellite held' : `✕ ${notHeld} not held`;
    return html`<span class="badge ${d.feasible ? 'ok' : 'bad'}">${held}</span>
      ${risky > 0 ? html`<span class="badge bad">⚠ ${risky} at risk</span>` : nothing}`;
  }

  private _renderTimeline(d: FleetView): TemplateResult {
    const height = fleetHeight(d.satellites.length, d.stations.length);
    return html`
      <p part="summary">${
        d.reason
          ? typographicMinus(d.reason)
          : `All ${d.satellites.length} satellites are held inside their tolerances.`
      }</p>
      ${fleetLegend(this._risk)}
      <div class="plot-box" part="plot" tabindex="0" role="group" style=${`height:${height}px`}
        aria-roledescription="interactive timeline" aria-label="Fleet timeline" aria-describedby="keys"
        @pointerdown=${this._onPointerDown} @pointermove=${this._onPointerMove} @pointerup=${this._onPointerUp}
        @pointercancel=${this._onPointerCancel} @pointerleave=${this._onPointerLeave}
        @wheel=${this._onWheel} @keydown=${this._onKeyDown} @dblclick=${this._showAll}>
        <canvas class="data" role="img" aria-label=${fleetLabel(d, this._atRisk)}></canvas>
        <canvas class="overlay" aria-hidden="true"></canvas>
        ${this._renderTooltip(d)}
      </div>
      <div class="tools">
        <span class="hint" id="keys">↑/↓ satellites and stations, ←/→ supports or uplinks, Enter selects;
          drag or Shift+←/→ to pan, wheel or +/− to zoom.</span>
        <button type="button" @click=${this._showAll}>Show all</button>
      </div>
      <div class="sr-only" aria-live="polite">${this._announcement}</div>
      <div class="table-wrap">
        ${satelliteTable({
          view: d,
          atRisk: this._atRisk,
          selected: this.selected,
          onSelect: (i) => this._selectSatellite(i),
        })}
      </div>
      <div class="table-wrap stations">${stationTable(d)}</div>
      ${d.caution ? html`<p class="caution" role="note">${d.caution}</p>` : nothing}`;
  }

  private _renderTooltip(d: FleetView): TemplateResult | typeof nothing {
    const h = this._hover;
    if (!h) return nothing;
    const left = h.x > this._size.width / 2 ? Math.max(0, h.x - 300) : h.x + 16;
    return tooltip(d, h.hit, this._atRisk, `left:${left}px;top:${h.y + 14}px`);
  }

  private _geometry(): { layout: FleetLayout; sx: Scale } | null {
    const d = this._data,
      v = this._view;
    const w = this._size.width;
    if (!d || !v || w < 120) return null;
    const layout = fleetLayout(w, d.satellites.length, d.stations.length);
    return { layout, sx: linearScale(v[0], v[1], layout.left, layout.right) };
  }

  protected override updated(): void {
    const g = this._geometry(),
      d = this._data;
    if (!g || !d) return;
    const colors = this._resolveColors(FLEET_COLOR_EXPR);
    const key = `${this._dataVersion}|${this._view?.join()}|${g.layout.width}|${this._risk}|${Object.values(colors).join()}`;
    const data = this._dataCanvas,
      overlay = this._overlayCanvas;
    if (key !== this._drawnKey && data) {
      const ctx = sizeCanvas(data, g.layout.width, g.layout.height);
      if (ctx) {
        const count = Math.max(3, Math.floor((g.layout.right - g.layout.left) / 80));
        const ticks = calendarTicks(d, ...g.sx.domain, count, FLEET_STEPS_SECONDS);
        const { layout, sx } = g;
        drawFleet(ctx, { view: d, layout, sx, ticks, colors, atRisk: this._atRisk, riskFraction: this._risk });
        this._drawnKey = key;
      }
    }
    const ctx = overlay ? sizeCanvas(overlay, g.layout.width, g.layout.height) : null;
    if (!ctx) return;
    const { layout, sx } = g;
    const selected = d.satellites.findIndex((s) => s.id === this.selected);
    drawFleetOverlay(ctx, {
      view: d,
      layout,
      sx,
      colors,
      selected,
      cursor: this._cursor,
      hover: this._hover?.hit ?? null,
    });
  }

  private _setView(a: number, b: number, byUser: boolean): void {
    const d = this._data;
    if (!d) return;
    const full = d.horizon,
      minSpan = Math.min(full, 3600);
    const span = Math.min(full, Math.max(minSpan, b - a));
    const start = Math.min(Math.max((a + b) / 2 - span / 2, 0), full - span);
    if (this._view && this._view[0] === start && this._view[1] === start + span) return;
    this._view = [start, start + span];
    this.requestUpdate();
    if (byUser) emit(this, 'tauline-view-change', { startSeconds: start, endSeconds: start + span });
  }

  private _zoom(factor: number, anchor: number): void {
    if (!this._view) return;
    const [a, b] = this._view;
    this._setView(anchor - (anchor - a) * factor, anchor + (b - anchor) * factor, true);
  }

  private _pan(fraction: number): void {
    if (!this._view) return;
    const shift = (this._view[1] - this._view[0]) * fraction;
    this._setView(this._view[0] + shift, this._view[1] + shift, true);
  }

  private readonly _showAll = (): void => {
    if (this._data) this._setView(0, this._data.horizon, true);
  };

  private _selectSatellite(i: number): void {
    const d = this._data,
      s = d?.satellites[i];
    if (!d || !s) return;
    this.selected = s.id;
    const cur = this._cursor;
    const command = cur?.kind === 'satellite' && cur.satellite === i ? cur.command : -1;
    this._cursor = { kind: 'satellite', satellite: i, command };
    this._announcement = describeSatellite(d, s, this._atRisk[i] ?? false);
    const atRisk = this._atRisk[i] ?? false;
    emit(this, 'tauline-satellite-select', { id: s.id, index: i, feasible: s.feasible, atRisk, satellite: s.source });
  }

  private _selectSupport(station: number, k: number): void {
    const d = this._data,
      st = d?.stations[station],
      sup = st?.supports[k];
    if (!d || !st || !sup) return;
    this._cursor = { kind: 'support', station, support: k };
    this._announcement = describeSupport(d, sup);
    emit(this, 'tauline-support-select', {
      index: sup.index,
      station: st.id,
      satellite: at(d.satellites, sup.satellite, 'satellites').id,
      support: sup.source,
    });
  }

  /** Moves the keyboard cursor and announces where it is; keeps a support inside the view. */
  private _moveCursor(next: Cursor): void {
    const d = this._data;
    if (!d) return;
    this._cursor = next;
    if (next.kind === 'satellite') {
      const s = at(d.satellites, next.satellite, 'satellites');
      this._announcement = describeSatellite(d, s, this._atRisk[next.satellite] ?? false);
    } else {
      const st = at(d.stations, next.station, 'stations');
      const sup = st.supports[next.support];
      if (!sup) {
        this._announcement = `${st.id}: no supports.`;
        return;
      }
      this._announcement = describeSupport(d, sup);
      if (this._view && (sup.start < this._view[0] || sup.end > this._view[1])) {
        const span = this._view[1] - this._view[0];
        this._setView(sup.start - span / 2, sup.start + span / 2, true);
      }
    }
    this.requestUpdate();
  }

  private _local(event: { clientX: number; clientY: number }): { x: number; y: number } {
    const rect = this._box!.getBoundingClientRect();
    return { x: event.clientX - rect.left, y: event.clientY - rect.top };
  }

  private readonly _onPointerDown = (event: PointerEvent): void => {
    if (!this._view || event.button > 0) return;
    const p = this._local(event);
    try {
      (event.currentTarget as HTMLElement).setPointerCapture(event.pointerId);
    } catch {
      /* synthetic pointer */
    }
    this._gesture = { x0: this._view[0], x1: this._view[1], px: p.x, moved: false, id: event.pointerId };
  };

  private readonly _onPointerMove = (event: PointerEvent): void => {
    const g = this._geometry(),
      d = this._data;
    if (!g || !d) return;
    const p = this._local(event);
    const gesture = this._gesture;
    if (gesture && gesture.id === event.pointerId) {
      const dx = p.x - gesture.px;
      if (Math.abs(dx) > 3) gesture.moved = true;
      if (gesture.moved) {
        const perPixel = (gesture.x1 - gesture.x0) / (g.layout.right - g.layout.left);
        this._box?.classList.add('dragging');
        this._setView(gesture.x0 - dx * perPixel, gesture.x1 - dx * perPixel, false);
        this._hover = null;
        return;
      }
    }
    const hit = hitTest(d, g.layout, g.sx, p.x, p.y);
    this._hover = hit ? { hit, x: p.x, y: p.y } : null;
  };

  private readonly _onPointerUp = (event: PointerEvent): void => {
    const gesture = this._gesture,
      g = this._geometry(),
      d = this._data;
    this._gesture = null;
    this._box?.classList.remove('dragging');
    if (!gesture || gesture.id !== event.pointerId || !g || !d) return;
    if (gesture.moved) {
      if (this._view) emit(this, 'tauline-view-change', { startSeconds: this._view[0], endSeconds: this._view[1] });
      return;
    }
    const p = this._local(event);
    const hit = hitTest(d, g.layout, g.sx, p.x, p.y);
    if (hit?.kind === 'satellite') this._selectSatellite(hit.satellite);
    else if (hit?.kind === 'support') this._selectSupport(hit.station, hit.support);
  };

  private readonly _onPointerCancel = (): void => {
    this._gesture = null;
    this._box?.classList.remove('dragging');
  };

  private readonly _onPointerLeave = (): void => {
    if (!this._gesture && this._hover) this._hover = null;
  };

  private readonly _onWheel = (event: WheelEvent): void => {
    const g = this._geometry();
    if (!g) return;
    event.preventDefault();
    const p = this._local(event);
    if (Math.abs(event.deltaX) > Math.abs(event.deltaY)) {
      this._pan(event.deltaX / (g.layout.right - g.layout.left));
      return;
    }
    const x = Math.min(Math.max(p.x, g.layout.left), g.layout.right);
    this._zoom(Math.exp(Math.max(-1, Math.min(1, event.deltaY * 0.0015))), g.sx.invert(x));
  };

  private readonly _onKeyDown = (event: KeyboardEvent): void => {
    const d = this._data;
    if (!d || !this._view) return;
    const center = (this._view[0] + this._view[1]) / 2;
    let handled = true;
    const c = this._cursor;
    const horizontal = event.key === 'ArrowLeft' || event.key === 'ArrowRight';
    const dir = event.key === 'ArrowRight' ? 1 : -1;
    if (event.shiftKey && horizontal) this._pan(0.1 * dir);
    else if (c?.kind === 'satellite' && horizontal) this._stepUplink(d, c.satellite, dir);
    else if (event.key === 'Enter' || event.key === ' ') {
      if (c?.kind === 'satellite') this._selectSatellite(c.satellite);
      else if (c?.kind === 'support') this._selectSupport(c.station, c.support);
      else handled = false;
    } else if (event.key === '+' || event.key === '=') this._zoom(0.8, center);
    else if (event.key === '-' || event.key === '_') this._zoom(1.25, center);
    else if (event.key === '0') this._showAll();
    else if (event.key === 'PageUp' || event.key === 'PageDown') this._pan(event.key === 'PageDown' ? 0.9 : -0.9);
    else if (event.key === 'Escape') this._hover = null;
    else {
      const next = nextCursor(event.key, d, this._cursor, this._view[0]);
      if (next) this._moveCursor(next);
      else handled = false;
    }
    if (handled) event.preventDefault();
  };

  /** Moves to the next / previous uplink of a satellite (first: the first in view); centres and announces it. */
  private _stepUplink(d: FleetView, i: number, dir: 1 | -1): void {
    const s = at(d.satellites, i, 'satellites');
    const cur = this._cursor?.kind === 'satellite' ? this._cursor.command : -1;
    if (!this._view || s.commands.length === 0) {
      this._announcement = `${s.id}: no uplinks.`;
      return;
    }
    const firstInView = Math.max(
      0,
      s.commands.findIndex((c) => c.executeAt >= this._view![0]),
    );
    const k = cur < 0 ? firstInView : Math.min(s.commands.length - 1, Math.max(0, cur + dir));
    const c = at(s.commands, k, 'commands');
    this._cursor = { kind: 'satellite', satellite: i, command: k };
    if (c.executeAt < this._view[0] || c.uplinkAt > this._view[1]) {
      const span = this._view[1] - this._view[0];
      this._setView(c.executeAt - span / 2, c.executeAt + span / 2, true);
    }
    this._announcement =
      `${s.id} uplink ${k + 1} of ${s.commands.length}: ${c.kind} step ${stepText(c)} uplinked ` +
      `${formatChartUtc(d, c.uplinkAt)} via ${c.station}, executes ${formatChartUtc(d, c.executeAt)}.`;
  }
}
