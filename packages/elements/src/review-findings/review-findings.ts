import type { Diagnosis, ReviewReport, SpacecraftFinding, Verdict } from '@tauline/sdk/review';
import { html, LitElement, nothing, type PropertyDeclarations, type PropertyValues, type TemplateResult } from 'lit';
import { emit } from '../events.js';
import { formatFraction, formatHertz, formatNumber, typographicMinus } from '../internal/format.js';
import { baseStyles } from '../internal/styles.js';
import { warnOnce } from '../internal/warn.js';
import { reviewFindingsStyles } from './review-findings.styles.js';

/** Verdict of one spacecraft (the SDK's `Verdict`). */
export type ReviewVerdict = Verdict;

/**
 * One diagnosis entry of a finding: the SDK's `Diagnosis` (`code`, `message`; `wouldHaveProduced`, the
 * fractional offset the recognised mistake would have produced, and `matches` may be left out).
 */
export type ReviewDiagnosisView = Pick<Diagnosis, 'code' | 'message'> &
  Partial<Pick<Diagnosis, 'wouldHaveProduced' | 'matches'>>;

/**
 * One spacecraft finding: the fields of the SDK's `SpacecraftFinding` the element shows (`id`, `verdict`;
 * the fractional offsets, differences in Hz and ns/day, `summary` and `diagnosis` may be left out;
 * other fields are ignored).
 */
export type ReviewFindingView = Pick<SpacecraftFinding, 'id' | 'verdict'> &
  Partial<
    Pick<
      SpacecraftFinding,
      | 'expectedFractionalOffset'
      | 'configuredFractionalOffset'
      | 'differenceFractional'
      | 'differenceHz'
      | 'differenceNanosecondsPerDay'
      | 'summary'
    >
  > & {
    readonly diagnosis?: readonly ReviewDiagnosisView[];
  };

/** The launch-review output (the SDK's `ReviewReport` from `reviewOffsets()`): `spacecraft`, optionally `title` and `caution`. */
export type ReviewReportView = Partial<Pick<ReviewReport, 'title' | 'caution'>> & {
  readonly spacecraft: readonly ReviewFindingView[];
};

/** True for a diagnosis entry the element can show: an object with a text message. */
function isDiagnosis(d: unknown): d is ReviewDiagnosisView {
  return d !== null && typeof d === 'object' && typeof (d as { message?: unknown }).message === 'string';
}

/** What cannot be shown of a finding's diagnosis: a non-array, or entries that are not `{ code, message }` objects. */
function diagnosisProblems(f: Partial<ReviewFindingView>, k: number): string[] {
  const list = (f as { diagnosis?: unknown }).diagnosis;
  if (list === undefined || list === null) return [];
  if (!Array.isArray(list)) return [`spacecraft[${k}] (${f.id}).diagnosis is not a list`];
  const out: string[] = [];
  list.forEach((d: unknown, j) => {
    if (!isDiagnosis(d))
      out.push(`spacecraft[${k}] (${f.id}).diagnosis[${j}] is ${d === null ? 'null' : 'not an entry with a message'}`);
  });
  return out;
}

const VERDICT_TEXT: Record<ReviewVerdict, string> = { pass: 'Pass', marginal: 'Marginal', fail: 'Fail' };
const VERDICT_ORDER: Record<ReviewVerdict, number> = { fail: 0, marginal: 1, pass: 2 };

/**
 * Findings of a launch review of configured clock offsets: a verdict per spacecraft (icon shape
 * and text, not colour alone), the difference from the expected offset, and the diagnosis of
 * recognised mistakes. Failing spacecraft come first.
 *
 * Data are immutable: assign a new `review` object to re-render.
 *
 * @summary Launch-review verdicts and diagnoses, one expandable entry per spacecraft.
 *
 * @fires tauline-spacecraft-select - The user opened a spacecraft's entry. Detail: `{ id, verdict }`.
 *
 * @csspart base - The outer wrapper.
 * @csspart finding - Each spacecraft entry (a `<details>` element).
 * @csspart table - The numbers table inside an entry.
 *
 * @cssproperty --pass-color - Colour of a pass verdict (token `--tauline-color-pass`).
 * @cssproperty --marginal-color - Colour of a marginal verdict (token `--tauline-color-marginal`).
 * @cssproperty --fail-color - Colour of a fail verdict (token `--tauline-color-fail`).
 */
export class TaulineReviewFindings extends LitElement {
  static override styles = [baseStyles, reviewFindingsStyles];

  static override properties: PropertyDeclarations = {
    review: { attribute: false },
    label: {},
    hidePassing: { type: Boolean, reflect: true, attribute: 'hide-passing' },
    theme: { reflect: true },
  };

  /** The review report: `{ spacecraft: [{ id, verdict, expectedFractionalOffset, differenceFractional, diagnosis, ... }] }`. */
  review?: ReviewReportView | null;

  /** Heading shown above the list (the report's own `title` wins when present). */
  label = 'Launch review findings';

  /** Leave passing spacecraft out of the list (they stay counted). */
  hidePassing = false;

  /** Colour scheme: `light`, `dark`, or unset to inherit the page's `color-scheme`. */
  theme?: 'light' | 'dark';

  private _findings: ReviewFindingView[] = [];
  private _problem: string | null = null;
  /** Entries that could not be shown (dropped spacecraft, unreadable diagnosis entries): listed visibly. */
  private _notices: string[] = [];

  protected override willUpdate(changed: PropertyValues<this>): void {
    if (!changed.has('review')) return;
    this._problem = null;
    this._findings = [];
    this._notices = [];
    const r = this.review as unknown;
    if (r === undefined || r === null) return;
    if (typeof r !== 'object' || !Array.isArray((r as { spacecraft?: unknown }).spacecraft)) {
      this._problem = 'review must be an object with a spacecraft array';
      warnOnce(this, 'invalid-review', this._problem);
      return;
    }
    const dropped: string[] = [];
    (r as { spacecraft: unknown[] }).spacecraft.forEach((s, k) => {
      const f = s as Partial<ReviewFindingView> | null;
      if (
        !f ||
        typeof f !== 'object' ||
        typeof f.id !== 'string' ||
        !(f.verdict === 'pass' || f.verdict === 'marginal' || f.verdict === 'fail')
      ) {
        dropped.push(`spacecraft[${k}] needs an id and a verdict of pass, marginal or fail`);
        return;
      }
      this._findings.push(f as ReviewFindingView);
      this._notices.push(...diagnosisProblems(f, k));
    });
    this._findings.sort((a, b) => VERDICT_ORDER[a.verdict] - VERDICT_ORDER[b.verdict]);
    if (dropped.length > 0) warnOnce(this, 'review-entries-dropped', dropped.join('; '));
    this._notices.unshift(...dropped);
    if (this._notices.length > dropped.length)
      warnOnce(this, 'invalid-diagnosis', this._notices.slice(dropped.length).join('; '));
    const [firstDropped] = dropped;
    if (firstDropped !== undefined && this._findings.length === 0) this._problem = firstDropped;
  }

  private _icon(verdict: ReviewVerdict): TemplateResult {
    // Three shapes: a check in a circle, an exclamation in a triangle, a cross in a square.
    if (verdict === 'pass') {
      return html`<svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true"><circle cx="7" cy="7" r="6" fill="none" stroke="currentColor" stroke-width="1.6"></circle><path d="M4 7.2l2 2 4-4.4" fill="none" stroke="currentColor" stroke-width="1.8"></path></svg>`;
    }
    if (verdict === 'marginal') {
      return html`<svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true"><path d="M7 1L13.5 13H0.5z" fill="none" stroke="currentColor" stroke-width="1.5"></path><path d="M7 5.2v3.8M7 10.4v1.2" stroke="currentColor" stroke-width="1.7"></path></svg>`;
    }
    return html`<svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true"><rect x="1" y="1" width="12" height="12" fill="none" stroke="currentColor" stroke-width="1.6"></rect><path d="M4.3 4.3l5.4 5.4M9.7 4.3l-5.4 5.4" stroke="currentColor" stroke-width="1.8"></path></svg>`;
  }

  private _verdict(v: ReviewVerdict): TemplateResult {
    return html`<span class="verdict ${v}">${this._icon(v)}${VERDICT_TEXT[v]}</span>`;
  }

  protected override render(): TemplateResult {
    const r = this.review;
    const title = (r && typeof r === 'object' && typeof r.title === 'string' && r.title) || this.label;
    return html`<div part="base">
      <h3 class="title">${title}</h3>
      ${
        this._problem
          ? html`<div class="state error" role="alert">Cannot show the review: ${this._problem}</div>`
          : !r
            ? html`<div class="state">No review yet.</div>`
            : this._renderReport(r)
      }
    </div>`;
  }

  private _renderReport(r: ReviewReportView): TemplateResult {
    const counts = { pass: 0, marginal: 0, fail: 0 };
    for (const f of this._findings) counts[f.verdict] += 1;
    const shown = this.hidePassing ? this._findings.filter((f) => f.verdict !== 'pass') : this._findings;
    return html`
      <ul class="counts" aria-label="Verdict counts">
        ${(['fail', 'marginal', 'pass'] as const).map((v) => html`<li>${this._verdict(v)} ${counts[v]}</li>`)}
      </ul>
      ${r.caution ? html`<p class="caution" role="note">${r.caution}</p>` : nothing}
      ${
        this._notices.length > 0
          ? html`<div class="notice" role="alert">Part of this review could not be shown: ${this._notices.join('; ')}.</div>`
          : nothing
      }
      <div class="list">
        ${shown.length === 0 ? html`<div class="state">${this._findings.length === 0 ? 'The review lists no spacecraft.' : 'Every spacecraft passed.'}</div>` : nothing}
        ${shown.map((f) => this._renderFinding(f))}
      </div>`;
  }

  private _renderFinding(f: ReviewFindingView): TemplateResult {
    const num = (v: unknown): number => (typeof v === 'number' ? v : Number.NaN);
    const diff = num(f.differenceFractional);
    return html`<details part="finding" data-verdict=${f.verdict} data-id=${f.id}>
      <summary @click=${() => this._onSummaryClick(f)}>
        ${this._verdict(f.verdict)}
        <span class="sc-id">${f.id}</span>
        <span class="diff">Δ ${formatFraction(diff, 3)}</span>
      </summary>
      <div class="body">
        ${f.summary ? html`<p>${typographicMinus(f.summary)}</p>` : nothing}
        <table part="table">
          <caption>Offsets for ${f.id} (fractional; negative: set low)</caption>
          <tbody>
            <tr><th scope="row">Expected</th><td>${formatFraction(num(f.expectedFractionalOffset))}</td></tr>
            <tr><th scope="row">Configured</th><td>${formatFraction(num(f.configuredFractionalOffset))}</td></tr>
            <tr><th scope="row">Difference</th><td>${formatFraction(diff)}</td></tr>
            ${Number.isFinite(num(f.differenceHz)) ? html`<tr><th scope="row">Difference at nominal frequency</th><td>${formatHertz(num(f.differenceHz))}</td></tr>` : nothing}
            ${Number.isFinite(num(f.differenceNanosecondsPerDay)) ? html`<tr><th scope="row">Time error it builds</th><td>${formatNumber(num(f.differenceNanosecondsPerDay), 4)} ns/day</td></tr>` : nothing}
          </tbody>
        </table>
        ${
          Array.isArray(f.diagnosis) && f.diagnosis.length > 0
            ? html`<div><strong>Diagnosis</strong><ul class="diagnosis">
              ${f.diagnosis.filter(isDiagnosis).map(
                (d) => html`<li>
                ${d.matches ? html`<span class="match">Matches:</span> ` : nothing}${typographicMinus(d.message)}
                <code>${d.code}</code>${typeof d.wouldHaveProduced === 'number' ? html` — would have produced ${formatFraction(d.wouldHaveProduced, 5)}` : nothing}
              </li>`,
              )}
            </ul></div>`
            : nothing
        }
      </div>
    </details>`;
  }

  private _onSummaryClick(f: ReviewFindingView): void {
    const details = this.renderRoot.querySelector<HTMLDetailsElement>(`details[data-id="${CSS.escape(f.id)}"]`);
    // The click toggles after this handler: an entry that is closed now is being opened.
    if (details && !details.open) emit(this, 'tauline-spacecraft-select', { id: f.id, verdict: f.verdict });
  }
}
