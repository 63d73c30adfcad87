/**
 * The accessible equivalent of `<tauline-fleet-timeline>`'s canvas: a table of the satellites
 * (status, smallest margin, uplinks, stations, why) and one of the stations (supports, who, how
 * busy), plus the text descriptions the element announces. Lit templates and pure text.
 *
 * @module
 */
import { html, nothing, type TemplateResult } from 'lit';
import { formatChartUtc } from '../internal/calendar-axis.js';
import { at } from '../internal/checked.js';
import {
  formatDuration,
  formatFraction,
  formatNumber,
  formatOffsetAuto,
  typographicMinus,
} from '../internal/format.js';
import type { FleetCommandView, FleetView, SatelliteView, SupportView } from './fleet-data.js';
import type { FleetHit } from './fleet-draw.js';

/** A command's step with its unit: a phase step in seconds, a frequency step as a fraction. */
export function stepText(c: Pick<FleetCommandView, 'kind' | 'step'>): string {
  return c.kind === 'phase' ? formatOffsetAuto(c.step, 3) : formatFraction(c.step, 3);
}

/** Status words of a satellite: never by colour alone. */
export function statusText(s: SatelliteView, atRisk: boolean): string {
  if (!s.feasible) return 'not held';
  return atRisk ? 'at risk (low margin)' : 'held';
}

/** Margin as text with its share of the tolerance: `+12.3 ns (35 % of ±35 ns)`. */
export function marginText(s: Pick<SatelliteView, 'minMargin' | 'tolerance'>): string {
  if (!Number.isFinite(s.minMargin)) return '—';
  const sign = s.minMargin >= 0 ? '+' : '';
  const share = formatNumber((100 * s.minMargin) / s.tolerance, 3);
  return `${sign}${formatOffsetAuto(s.minMargin, 3)} (${share} % of ±${formatOffsetAuto(s.tolerance, 3)})`;
}

/** One sentence about a satellite, for the live region and the tooltip. */
export function describeSatellite(view: FleetView, s: SatelliteView, atRisk: boolean): string {
  const why = s.reason ? ` ${typographicMinus(s.reason)}` : '';
  return (
    `${s.id}: ${statusText(s, atRisk)}; smallest margin ${typographicMinus(marginText(s))} at ` +
    `${formatChartUtc(view, s.minMarginAt)}; ${s.commands.length} uplink${s.commands.length === 1 ? '' : 's'}` +
    `${s.stationsUsed.length ? ` via ${s.stationsUsed.join(', ')}` : ''}.${why}`
  );
}

/** One sentence about a support. */
export function describeSupport(view: FleetView, sup: SupportView): string {
  const st = at(view.stations, sup.station, 'stations');
  return (
    `${st.id} holds ${at(view.satellites, sup.satellite, 'satellites').id} from ${formatChartUtc(view, sup.start)} to ` +
    `${formatChartUtc(view, sup.end)}; setup ${formatDuration(st.setup)} after it.`
  );
}

/** The canvas's accessible name: what the picture shows, in one paragraph. */
export function fleetLabel(view: FleetView, atRisk: readonly boolean[]): string {
  const notHeld = view.satellites.filter((s) => !s.feasible).map((s) => s.id);
  const risky = view.satellites.filter((s, i) => s.feasible && atRisk[i]).map((s) => s.id);
  const supports = view.stations.reduce((n, s) => n + s.supports.length, 0);
  return (
    `Fleet timeline from ${formatChartUtc(view, 0)} to ${formatChartUtc(view, view.horizon)}: ` +
    `${view.satellites.length} satellites, ${view.stations.length} stations, ${supports} supports. ` +
    `${notHeld.length ? `Not held: ${notHeld.join(', ')}. ` : 'Every satellite held. '}` +
    `${risky.length ? `Low margin: ${risky.join(', ')}.` : ''}`.trim()
  );
}

interface TableInput {
  view: FleetView;
  atRisk: readonly boolean[];
  selected: string;
  onSelect: (index: number) => void;
}

/** The satellite table (part `table`, rows part `row`, the selected one also `selected`, at-risk ones `at-risk`). */
export function satelliteTable({ view, atRisk, selected, onSelect }: TableInput): TemplateResult {
  return html`<table part="table">
    <caption>${view.satellites.length} satellites; margin: tolerance minus the smallest bound the predicted offset
      keeps at the tolerance probability, smallest over the horizon</caption>
    <thead><tr>
      <th scope="col">Satellite</th><th scope="col">Status</th><th scope="col">Smallest margin</th>
      <th scope="col">Uplinks</th><th scope="col">Supports</th><th scope="col">Stations</th><th scope="col">Why</th>
    </tr></thead>
    <tbody>${view.satellites.map((s, i) => {
      const isSel = s.id === selected;
      const parts = ['row', isSel ? 'selected' : '', atRisk[i] ? 'at-risk' : ''].filter(Boolean).join(' ');
      const why = s.reason ? typographicMinus(s.reason) : null;
      return html`<tr part=${parts} aria-current=${isSel ? 'true' : 'false'} data-id=${s.id}
        @click=${() => onSelect(i)}>
        <th scope="row"><button type="button" class="row-button" aria-label=${`Select ${s.id}`}
          @click=${(e: Event) => {
            e.stopPropagation();
            onSelect(i);
          }}>${s.id}</button></th>
        <td class=${atRisk[i] ? 'risk' : ''}>${atRisk[i] ? '⚠ ' : '✓ '}${statusText(s, atRisk[i] ?? false)}</td>
        <td>${typographicMinus(marginText(s))}</td>
        <td>${s.commands.length}</td>
        <td>${s.supportCount}</td>
        <td>${s.stationsUsed.join(', ') || '—'}</td>
        <td class="reason" title=${why ?? nothing}>${why ? html`<span>${why}</span>` : nothing}</td>
      </tr>`;
    })}</tbody>
  </table>`;
}

/** The station table: supports, satellites served and the share of the horizon held. */
export function stationTable(view: FleetView): TemplateResult {
  return html`<table part="station-table">
    <caption>${view.stations.length} stations: supports over the horizon</caption>
    <thead><tr><th scope="col">Station</th><th scope="col">Supports</th><th scope="col">Satellites</th>
      <th scope="col">Held</th><th scope="col">Setup</th></tr></thead>
    <tbody>${view.stations.map((st) => {
      const held = st.supports.reduce((n, s) => n + (s.end - s.start), 0);
      const who = [...new Set(st.supports.map((s) => at(view.satellites, s.satellite, 'satellites').id))];
      return html`<tr><th scope="row">${st.id}</th><td>${st.supports.length}</td>
        <td>${who.length}</td><td>${formatNumber((100 * held) / view.horizon, 3)} %</td>
        <td>${formatDuration(st.setup)}</td></tr>`;
    })}</tbody>
  </table>`;
}

/** Grid index nearest to time x (binary search over ascending t; mid is bounded by lo < mid < hi < t.length). */
function nearestIndex(t: Float64Array, x: number): number {
  let lo = 0,
    hi = t.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid]! <= x) lo = mid;
    else hi = mid;
  }
  return Math.abs((t[hi] ?? Infinity) - x) < Math.abs((t[lo] ?? Infinity) - x) ? hi : lo;
}

/** The hover read-out (part `tooltip`) for what is under the pointer. */
export function tooltip(d: FleetView, hit: FleetHit, atRisk: readonly boolean[], style: string): TemplateResult {
  if (hit.kind === 'support') {
    const st = at(d.stations, hit.station, 'stations');
    const sup = at(st.supports, hit.support, 'supports');
    return html`<div part="tooltip" style=${style}><strong>${st.id}</strong>
      <div class="note">${describeSupport(d, sup)}</div></div>`;
  }
  if (hit.kind === 'lane') {
    return html`<div part="tooltip" style=${style}><strong>${at(d.stations, hit.station, 'stations').id}</strong>
      <div class="note">Free at ${formatChartUtc(d, hit.t)}</div></div>`;
  }
  const s = at(d.satellites, hit.satellite, 'satellites');
  const c = s.commands[hit.command];
  const k = nearestIndex(s.t, hit.t);
  const status = statusText(s, atRisk[hit.satellite] ?? false);
  return html`<div part="tooltip" style=${style}><strong>${s.id} · ${status}</strong>
    <dl>
      <dt>Time</dt><dd>${formatChartUtc(d, s.t[k] ?? Number.NaN)}</dd>
      <dt>Margin</dt><dd>${typographicMinus(formatOffsetAuto(s.margin[k] ?? Number.NaN, 3))}</dd>
      <dt>Tolerance</dt><dd>±${formatOffsetAuto(s.tolerance, 3)} at ${s.probability}</dd>
      <dt>Smallest</dt><dd>${typographicMinus(marginText(s))}</dd>
      ${
        c
          ? html`<dt>Uplink</dt><dd>${formatChartUtc(d, c.uplinkAt)} via ${c.station}</dd>
        <dt>Executes</dt><dd>${formatChartUtc(d, c.executeAt)}</dd>
        <dt>Step</dt><dd>${stepText(c)}</dd>`
          : nothing
      }
    </dl></div>`;
}

/** The timeline's legend; `riskFraction`: the share of the tolerance under which a margin counts as low. */
export function fleetLegend(riskFraction: number): TemplateResult {
  const legend = (cls: string, style: string, text: string): TemplateResult =>
    html`<li><span class="swatch ${cls}" style=${style} aria-hidden="true"></span>${text}</li>`;
  return html`<ul part="legend" aria-label="Legend">
    ${legend('', 'background:var(--margin-color)', 'Margin to tolerance (full strip: offset bound at zero; empty: at the tolerance)')}
    ${legend('hatch', '', `Low or lost margin (< ${Math.round(riskFraction * 100)} % of tolerance), ⚠ at risk`)}
    ${legend('', 'background:var(--pass-color);height:3px', 'Pass')}
    ${legend('', 'background:var(--support-color)', 'Support')}
    ${legend('setup', '', 'Station setup')}
    <li>▲▼ frequency step, ◆ phase step (tick: uplink)</li>
  </ul>`;
}
