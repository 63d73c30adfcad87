/**
 * The data table of `<tauline-stability-plot>`, windowed: one row per (statistic, τ) exists in the
 * data, but only the rows in and near the scroll box's view are in the DOM, between two spacer
 * rows of the right height, so 10^6 points cost about 30 rows. Rows have a fixed height.
 *
 * @module
 */
import { html, nothing, type TemplateResult } from 'lit';
import { formatFraction, formatNumber } from '../internal/format.js';
import { pointOf, type StabilitySeries } from './stability-data.js';

/** Height of one body row, CSS px (the styles fix it). */
export const ROW_HEIGHT_PX = 24;
/** Rows rendered above and below the visible ones. */
const OVERSCAN_ROWS = 8;
/** Visible rows of the scroll box (its max-height is ROW_HEIGHT_PX × this + the header). */
export const VISIBLE_ROWS = 11;

/** Cumulative row offsets of the shown series: row r belongs to the series j with starts[j] ≤ r < starts[j + 1]. */
export function rowStarts(series: readonly StabilitySeries[]): Int32Array {
  const starts = new Int32Array(series.length + 1);
  let total = 0;
  for (const [j, s] of series.entries()) {
    total += s.tau.length;
    starts[j + 1] = total;
  }
  return starts;
}

/** The window [first, last) of rows to render for a scroll offset in px. */
export function rowWindow(scrollTop: number, total: number): [number, number] {
  const first = Math.max(0, Math.floor(scrollTop / ROW_HEIGHT_PX) - OVERSCAN_ROWS);
  return [first, Math.min(total, first + VISIBLE_ROWS + 2 * OVERSCAN_ROWS)];
}

export interface TableView {
  series: readonly StabilitySeries[];
  starts: Int32Array;
  window: [number, number];
  noIntervals: boolean;
  code: (statistic: string) => string;
  isTime: (statistic: string) => boolean;
}

function spacer(height: number): TemplateResult | typeof nothing {
  return height > 0
    ? html`<tr class="spacer" aria-hidden="true"><td colspan="8" style="height:${height}px"></td></tr>`
    : nothing;
}

/**
 * What the table's columns mean; shown above its scroll box (so a narrow screen never cuts it) and
 * tied to the table with `aria-describedby`.
 */
export function renderTableUnits(noIntervals: boolean): TemplateResult {
  return html`<p class="table-units" id="table-units">${noIntervals ? '' : 'Confidence interval where given. '}Unit s = seconds (time deviation), 1 = dimensionless (fractional frequency).</p>`;
}

/** The table with only the window's rows; `aria-rowcount`/`aria-rowindex` give the full extent. */
export function renderStabilityTable(v: TableView): TemplateResult {
  const total = v.starts[v.starts.length - 1] ?? 0;
  const [first, last] = v.window;
  const rows: TemplateResult[] = [];
  let j = 0;
  for (let r = first; r < last; r++) {
    while (r >= (v.starts[j + 1] ?? Infinity)) j++;
    const s = v.series[j],
      p = s ? pointOf(s, r - (v.starts[j] ?? 0)) : null;
    if (!s || !p) continue;
    rows.push(html`<tr part="row" aria-rowindex=${r + 2}>
      <th scope="row">${v.code(s.statistic)}</th>
      <td>${formatNumber(p.tau, 6)}</td>
      <td>${formatFraction(p.deviation, 5)}</td>
      <td>${p.low !== null ? formatFraction(p.low, 4) : '—'}</td>
      <td>${p.high !== null ? formatFraction(p.high, 4) : '—'}</td>
      <td>${v.isTime(s.statistic) ? 's' : '1'}</td>
      <td>${p.n !== null ? formatNumber(p.n, 8) : '—'}</td>
      <td>${p.noise || '—'}</td>
    </tr>`);
  }
  return html`<table part="table" aria-rowcount=${total + 1} aria-describedby="table-units">
    <caption>Deviation by averaging time τ</caption>
    <thead><tr aria-rowindex="1">
      <th scope="col">Statistic</th><th scope="col">τ (s)</th><th scope="col">Deviation</th>
      <th scope="col">Interval low</th><th scope="col">Interval high</th><th scope="col">Unit</th><th scope="col">n</th><th scope="col">Noise</th>
    </tr></thead>
    <tbody>
      ${spacer(first * ROW_HEIGHT_PX)}${rows}${spacer((total - last) * ROW_HEIGHT_PX)}
    </tbody>
  </table>`;
}
