/**
 * The DOM parts of `<tauline-steering-schedule>` as pure template functions: metrics list,
 * legend, command table (the plot's accessible equivalent) and hover read-out.
 *
 * @module
 */

import { html, nothing, type SVGTemplateResult, svg, type TemplateResult } from 'lit';
import { formatChartUtc } from '../internal/calendar-axis.js';
import { formatFraction, formatNumber, formatOffset, formatOffsetAuto, typographicMinus } from '../internal/format.js';
import type { PlanView, SteeringCommandView } from './plan-data.js';
import { commandShape, MARGIN, type ScheduleHover, type ScheduleScales } from './schedule-draw.js';

/** A command's step in words with its unit, for the live region. */
export function describeStep(c: SteeringCommandView): string {
  if (c.kind === 'phase') return `phase step ${c.step >= 0 ? '+' : ''}${formatOffsetAuto(c.step, 3)}`;
  return `frequency step ${c.step >= 0 ? '+' : ''}${formatFraction(c.step, 3)}`;
}

function metricName(k: string): string {
  return k
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .replace(/Seconds$| Seconds$/, '')
    .toLowerCase();
}

function metricValue(k: string, v: unknown): string {
  if (typeof v !== 'number') return String(v);
  // A time after the epoch (e.g. settledAfterSeconds) is a duration, not a clock offset.
  if (/afterseconds$/i.test(k))
    return v < 2 * 86400 ? `${formatNumber(v / 3600, 3)} h` : `${formatNumber(v / 86400, 3)} d`;
  if (/seconds$/i.test(k)) return formatOffsetAuto(v, 3);
  if (/probability/i.test(k)) return `${formatNumber(v * 100, 4)} %`;
  if (/fractional|frequency/i.test(k)) return formatFraction(v, 3);
  return formatNumber(v, 4);
}

/** The plan metrics as a description list (numbers with units; null and object entries left out). */
export function renderMetrics(d: PlanView): TemplateResult | typeof nothing {
  const items = Object.entries(d.metrics).filter(
    ([, v]) => typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean',
  );
  if (items.length === 0) return nothing;
  return html`<dl part="metrics">${items.map(([k, v]) => html`<div><dt>${metricName(k)}</dt><dd>${metricValue(k, v)}</dd></div>`)}</dl>`;
}

function legendItem(content: SVGTemplateResult, label: string): TemplateResult {
  return html`<li><span class="swatch" aria-hidden="true"><svg width="18" height="10" viewBox="0 0 18 10">${content}</svg></span>${label}</li>`;
}

/** The legend; `sigmaMultiple` is the band's half-width in σ. */
export function renderLegend(d: PlanView, sigmaMultiple: number): TemplateResult {
  const up = svg`<path d="M9 1L14 8L4 8z" fill="var(--frequency-command-color)" stroke="var(--surface)"></path>`;
  const tolerance = svg`<rect x="0" y="1" width="18" height="8" fill="var(--tolerance-color)" opacity="0.18"></rect><line x1="0" x2="18" y1="1" y2="1" stroke="var(--tolerance-color)" stroke-dasharray="3 2"></line><line x1="0" x2="18" y1="9" y2="9" stroke="var(--tolerance-color)" stroke-dasharray="3 2"></line>`;
  return html`<ul part="legend" aria-label="Legend">
    ${legendItem(svg`<line x1="0" x2="18" y1="5" y2="5" stroke="var(--steered-color)" stroke-width="2"></line>`, 'Steered prediction')}
    ${legendItem(svg`<rect x="0" y="1" width="18" height="8" fill="var(--uncertainty-color)" opacity="0.25"></rect>`, `±${formatNumber(sigmaMultiple, 3)}σ uncertainty`)}
    ${legendItem(svg`<line x1="0" x2="18" y1="5" y2="5" stroke="var(--unsteered-color)" stroke-width="1.5" stroke-dasharray="4 3"></line>`, 'Unsteered prediction')}
    ${d.tolerance !== null ? legendItem(tolerance, `Tolerance ±${formatOffsetAuto(d.tolerance, 3)}`) : nothing}
    ${d.contacts.length ? legendItem(svg`<rect x="0" y="0" width="18" height="10" fill="var(--contact-color)" opacity="0.22"></rect>`, 'Contact window') : nothing}
    ${d.maneuvers.length ? legendItem(svg`<line x1="9" x2="9" y1="0" y2="10" stroke="var(--maneuver-color)" stroke-width="1.5" stroke-dasharray="2 2"></line><path d="M5 0L13 0L9 4z" fill="var(--maneuver-color)"></path>`, 'Manoeuvre') : nothing}
    ${legendItem(up, 'Frequency step (▲ up, ▼ down)')}
    ${d.commands.some((c) => c.kind === 'phase') ? legendItem(svg`<path d="M9 0L14 5L9 10L4 5z" fill="var(--phase-command-color)" stroke="var(--surface)"></path>`, 'Phase step') : nothing}
  </ul>`;
}

function kindGlyph(c: SteeringCommandView): TemplateResult {
  const shape = commandShape(c);
  const color = c.kind === 'phase' ? 'var(--phase-command-color)' : 'var(--frequency-command-color)';
  const d =
    shape === 'diamond' ? 'M6 0L12 6L6 12L0 6z' : shape === 'triangle-down' ? 'M6 11L12 2L0 2z' : 'M6 1L12 10L0 10z';
  return html`<svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true"><path d=${d} fill=${color}></path></svg>`;
}

function stepText(c: SteeringCommandView): string {
  const sign = c.step >= 0 ? '+' : '';
  return c.kind === 'phase' ? `${sign}${formatOffsetAuto(c.step, 4)}` : `${sign}${formatFraction(c.step, 4)}`;
}

/** The command table; `select(position)` runs when the user picks a row (position in the sorted list). */
export function renderTable(d: PlanView, selectedIndex: number, select: (position: number) => void): TemplateResult {
  const rows = d.commands.map((c, k) => {
    const selected = c.index === selectedIndex;
    return html`<tr part=${selected ? 'row selected' : 'row'} aria-current=${selected ? 'true' : 'false'} data-index=${c.index}
      @click=${() => select(k)}>
      <th scope="row"><button type="button" class="row-button" aria-label=${`Select command ${k + 1}`}
        @click=${(e: Event) => {
          e.stopPropagation();
          select(k);
        }}>${k + 1}</button></th>
      <td>${Number.isFinite(c.uplinkAt) ? formatChartUtc(d, c.uplinkAt, true) : '—'}</td>
      <td>${formatChartUtc(d, c.executeAt, true)}</td>
      <td><span class="kind">${kindGlyph(c)}${c.kind}</span></td>
      <td>${stepText(c)}</td>
      <td>${Number.isFinite(c.actuatorSteps) ? formatNumber(c.actuatorSteps, 16) : '—'}</td>
      <td class="reason" title=${typographicMinus(c.reason)}><span>${typographicMinus(c.reason)}</span></td>
    </tr>`;
  });
  return html`<table part="table">
    <caption>${d.commands.length} command${d.commands.length === 1 ? '' : 's'}, times in UTC</caption>
    <thead><tr>
      <th scope="col">#</th><th scope="col">Uplink</th><th scope="col">Executes</th><th scope="col">Kind</th>
      <th scope="col">Step</th><th scope="col">Actuator steps</th><th scope="col">Reason</th>
    </tr></thead>
    <tbody>
      ${d.commands.length === 0 ? html`<tr><td colspan="7">No commands: the plan needs no steering in this span.</td></tr>` : rows}
    </tbody>
  </table>`;
}

function commandTooltip(d: PlanView, position: number, style: string): TemplateResult | typeof nothing {
  const c = d.commands[position];
  if (!c) return nothing;
  return html`<div part="tooltip" style=${style}>
    <strong>Command ${position + 1} of ${d.commands.length}</strong>
    <dl>
      <dt>Kind</dt><dd>${c.kind}</dd>
      <dt>Step</dt><dd>${c.kind === 'phase' ? formatOffsetAuto(c.step, 4) : formatFraction(c.step, 4)}</dd>
      ${Number.isFinite(c.actuatorSteps) ? html`<dt>Actuator steps</dt><dd>${formatNumber(c.actuatorSteps, 16)}</dd>` : nothing}
      ${Number.isFinite(c.uplinkAt) ? html`<dt>Uplink</dt><dd>${formatChartUtc(d, c.uplinkAt, true)}</dd>` : nothing}
      <dt>Executes</dt><dd>${formatChartUtc(d, c.executeAt, true)}</dd>
    </dl>
    ${c.reason ? html`<div class="note">${typographicMinus(c.reason)}</div>` : nothing}
  </div>`;
}

/** The hover read-out at the hovered sample or command; `k` is the band's half-width in σ, `width` the plot box width. */
export function renderTooltip(
  d: PlanView,
  hover: ScheduleHover | null,
  scales: ScheduleScales | null,
  k: number,
  width: number,
): TemplateResult | typeof nothing {
  if (!hover || !scales) return nothing;
  const left = hover.px > width / 2 ? Math.max(0, hover.px - 250) : hover.px + 16;
  const style = `left:${left}px;top:${MARGIN.top + 6}px`;
  if (hover.kind === 'command') return commandTooltip(d, hover.c, style);
  const i = hover.i,
    u = scales.unit;
  const t = d.t[i],
    steered = d.steered[i],
    sigma = d.steeredSigma[i],
    unsteered = d.unsteered[i];
  if (t === undefined || steered === undefined || sigma === undefined || unsteered === undefined) return nothing;
  return html`<div part="tooltip" style=${style}>
    <strong>${formatChartUtc(d, t, true)}</strong>
    <dl>
      <dt>Steered</dt><dd>${formatOffset(steered, u)}</dd>
      <dt>±${formatNumber(k, 3)}σ</dt><dd>${formatOffset(sigma * k, u)}</dd>
      <dt>Unsteered</dt><dd>${formatOffset(unsteered, u)}</dd>
      ${d.tolerance !== null ? html`<dt>Tolerance</dt><dd>±${formatOffset(d.tolerance, u)}</dd>` : nothing}
    </dl>
  </div>`;
}

/** Feasibility badge; a plan with invalid values never shows "feasible". */
export function renderBadge(d: PlanView): TemplateResult {
  if (d.invalid.length > 0) return html`<span class="badge bad">⚠ invalid data</span>`;
  return html`<span class="badge ${d.feasible ? 'ok' : 'bad'}">${d.feasible ? '✓ feasible' : '✕ not feasible'}</span>`;
}
