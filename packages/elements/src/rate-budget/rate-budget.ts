import { FLIGHT_CONFIGURATION_CAUTION, type RateBreakdown } from '@tauline/sdk/relativity';
import { html, LitElement, nothing, type PropertyDeclarations, type PropertyValues, type TemplateResult } from 'lit';
import { formatFraction, formatHertz, formatNumber } from '../internal/format.js';
import { baseStyles } from '../internal/styles.js';
import { warnOnce } from '../internal/warn.js';
import { rateBudgetStyles } from './rate-budget.styles.js';

/**
 * The mean rate breakdown the element shows: the SDK's `meanClockRate(a)` result (`RateBreakdown` of
 * `@tauline/sdk/relativity`), of which `fractionalRate`, `gravitational` and `velocity` are required.
 * Rates are dτ/dt − 1 (positive: the orbiting clock runs fast); `factoryOffset` is the fractional
 * offset to set on the ground so it keeps the reference rate.
 */
export type RateBudgetData = Pick<RateBreakdown, 'fractionalRate' | 'gravitational' | 'velocity'> &
  Partial<RateBreakdown>;

const SECONDS_PER_DAY = 86_400;

/** µs/day with 4 decimals, or 3 significant figures when smaller than 0.001 µs/day. */
function formatMicroseconds(value: number): string {
  if (Math.abs(value) >= 1e-3 || value === 0) return value.toFixed(4).replace(/^-/, '−');
  return formatNumber(value, 3);
}

interface BudgetRow {
  key: 'gravitational' | 'velocity' | 'j2' | 'total';
  label: string;
  rate: number | null;
}

/**
 * A rate budget: the orbiting clock's mean rate broken into its gravitational, velocity and J2
 * parts, each as a fraction, as microseconds per day, and as the factory offset it calls for
 * (fraction and hertz at the nominal frequency). Signed bars show each part's size and sign.
 * The factory offsets and hertz values feed a flight configuration, so the table always carries
 * the SDK's `FLIGHT_CONFIGURATION_CAUTION`.
 *
 * Data are immutable: set a new `budget` object to re-render (changes are detected by identity).
 *
 * @summary Relativistic clock-rate budget as a table with signed bars.
 *
 * @csspart base - The outer wrapper.
 * @csspart table - The budget table (the accessible form of the bars).
 * @csspart row - Each body row of the table.
 * @csspart caution - The flight-configuration caution under the table.
 *
 * @cssproperty --gain-color - Bar colour of a part that makes the clock run fast (default token `--tauline-color-gain`).
 * @cssproperty --loss-color - Bar colour of a part that makes the clock run slow (default token `--tauline-color-loss`).
 * @cssproperty --total-color - Bar colour of the net rate (default token `--tauline-color-total`).
 * @cssproperty --surface - Background (default token `--tauline-color-surface`).
 * @cssproperty --text - Text colour (default token `--tauline-color-text`).
 * @cssproperty --muted - Secondary text (default token `--tauline-color-muted`).
 */
export class TaulineRateBudget extends LitElement {
  static override styles = [baseStyles, rateBudgetStyles];

  static override properties: PropertyDeclarations = {
    budget: { attribute: false },
    j2Rate: { attribute: false },
    nominalFrequency: { type: Number, attribute: 'nominal-frequency' },
    label: {},
    theme: { reflect: true },
  };

  /** The breakdown to show: the result of the SDK's `meanClockRate(a, options)`. */
  budget?: RateBudgetData | null;

  /** J2 (Earth oblateness) part of the mean rate, dimensionless; omitted from the total when unset. */
  j2Rate?: number | null;

  /** Nominal oscillator frequency in hertz, for the "Hz at nominal" column. */
  nominalFrequency = 10.23e6;

  /** Heading shown above the table. */
  label = 'Clock rate budget';

  /** Colour scheme: `light`, `dark`, or unset to inherit the page's `color-scheme`. */
  theme?: 'light' | 'dark';

  private _problem: string | null = null;

  protected override willUpdate(changed: PropertyValues<this>): void {
    if (changed.has('budget') || changed.has('j2Rate') || changed.has('nominalFrequency')) {
      this._problem = this._validate();
      if (this._problem) warnOnce(this, 'invalid-budget', this._problem);
    }
  }

  private _validate(): string | null {
    const b = this.budget as unknown;
    if (b === undefined || b === null) return null;
    if (typeof b !== 'object') return `budget must be an object from meanClockRate(); received ${typeof b}`;
    const r = b as Record<string, unknown>;
    for (const key of ['fractionalRate', 'gravitational', 'velocity'] as const) {
      if (typeof r[key] !== 'number' || !Number.isFinite(r[key]))
        return `budget.${key} must be a finite number; received ${String(r[key])}`;
    }
    if (this.j2Rate !== undefined && this.j2Rate !== null && !Number.isFinite(this.j2Rate)) {
      return `j2Rate must be a finite number or unset; received ${String(this.j2Rate)}`;
    }
    if (!(Number.isFinite(this.nominalFrequency) && this.nominalFrequency > 0)) {
      return `nominal-frequency must be a positive number of hertz; received ${String(this.nominalFrequency)}`;
    }
    return null;
  }

  /** Rows of the budget: each part's rate contribution (null when not given). */
  private _rows(b: RateBudgetData): BudgetRow[] {
    const j2 = this.j2Rate ?? null;
    const total = b.fractionalRate + (j2 ?? 0);
    return [
      { key: 'gravitational', label: 'Gravitational', rate: b.gravitational },
      { key: 'velocity', label: 'Velocity', rate: b.velocity },
      { key: 'j2', label: 'J2 (oblateness)', rate: j2 },
      { key: 'total', label: 'Net rate', rate: total },
    ];
  }

  protected override render(): TemplateResult {
    return html`<div part="base">
      <h3 class="title">${this.label}</h3>
      ${this._renderBody()}
    </div>`;
  }

  private _renderBody(): TemplateResult {
    if (this._problem)
      return html`<div class="state error" role="alert">Cannot show the rate budget: ${this._problem}</div>`;
    const b = this.budget;
    if (!b) return html`<div class="state">No rate budget yet.</div>`;
    const rows = this._rows(b);
    const total = b.fractionalRate + (this.j2Rate ?? 0);
    // The factory offset 1/(1+r) − 1 = −r/(1+r) splits exactly into parts −p/(1+r).
    const toOffset = (rate: number): number => -rate / (1 + total);
    const factory = toOffset(total);
    const maxAbs = Math.max(...rows.map((r) => Math.abs(r.rate ?? 0)), 1e-30);
    const f0 = this.nominalFrequency;
    const ref = b.reference ? b.reference.toUpperCase() : 'the reference';
    const a = b.semiMajorAxis;
    return html`
      <p class="summary">
        ${a !== undefined ? html`At a = <strong>${formatNumber(a / 1000, 8)} km</strong> the` : 'The'}
        orbiting clock ${total >= 0 ? 'runs fast' : 'runs slow'} against ${ref} by
        <strong>${formatNumber(Math.abs(total) * SECONDS_PER_DAY * 1e6, 6)} µs/day</strong>; the factory offset is
        <strong>${formatFraction(factory)}</strong>
        (<strong>${formatHertz(factory * f0)}</strong> at ${formatHertz(f0, 6)}).
      </p>
      <p class="table-note" id="budget-note">Mean rate vs ${ref}${b.constants ? `, constants ${b.constants}` : ''}: positive rate, the clock runs fast; the factory offset, set on the ground, cancels it.</p>
      <div class="table-scroll"><table part="table" aria-describedby="budget-note">
        <caption class="sr-only">Clock rate budget by part</caption>
        <thead>
          <tr>
            <th scope="col">Part</th>
            <th scope="col">Clock rate (µs/day)</th>
            <th scope="col" class="bar-col">Size and sign <span class="axis-note">(− slow | + fast)</span></th>
            <th scope="col">Factory offset (fraction)</th>
            <th scope="col">Offset at ${formatHertz(f0, 6)}</th>
          </tr>
        </thead>
        <tbody>
          ${rows.map((row) => this._renderRow(row, maxAbs, toOffset, f0))}
        </tbody>
      </table></div>
      ${
        this.j2Rate === undefined || this.j2Rate === null
          ? html`<p class="note">J2 part not supplied: the net rate is the point-mass value.</p>`
          : nothing
      }
      <p class="caution" part="caution" role="note">${FLIGHT_CONFIGURATION_CAUTION}</p>`;
  }

  private _renderRow(row: BudgetRow, maxAbs: number, toOffset: (r: number) => number, f0: number): TemplateResult {
    if (row.rate === null) {
      return html`<tr part="row" class=${row.key}>
        <th scope="row">${row.label}</th>
        <td class="na" data-label="Clock rate (µs/day)">not computed</td><td class="bar-cell"></td><td class="na" data-label="Factory offset (fraction)">—</td><td class="na" data-label="Offset (Hz)">—</td>
      </tr>`;
    }
    const rate = row.rate;
    const offset = toOffset(rate);
    const width = (Math.abs(rate) / maxAbs) * 50;
    const left = rate >= 0 ? 50 : 50 - width;
    const kind = row.key === 'total' ? 'total' : rate >= 0 ? 'gain' : 'loss';
    return html`<tr part="row" class=${row.key}>
      <th scope="row">${row.label}</th>
      <td data-label="Clock rate (µs/day)">${formatMicroseconds(rate * SECONDS_PER_DAY * 1e6)}</td>
      <td class="bar-cell" aria-hidden="true"><div class="bar-track"><div class="bar ${kind}" style="left:${left}%;width:${Math.max(width, 0.3)}%"></div></div></td>
      <td data-label="Factory offset (fraction)">${formatFraction(offset)}</td>
      <td data-label=${`Offset at ${formatHertz(f0, 6)}`}>${formatHertz(offset * f0)}</td>
    </tr>`;
  }
}
