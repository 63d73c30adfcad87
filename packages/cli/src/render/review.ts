/**
 * Renderers of a review report for `tauline review`: Markdown and a self-contained, print-friendly HTML
 * page with inline SVG plots (no scripts, no external resources, works offline). They live in the CLI:
 * the SDK computes the report and draws nothing.
 *
 * @module
 */
import { SECONDS_PER_DAY } from '@tauline/sdk/constants';
import type { ReviewReport, SpacecraftFinding, Verdict } from '@tauline/sdk/review';

const VERDICT_MARK: Record<Verdict, string> = { pass: 'PASS', marginal: 'MARGINAL', fail: 'FAIL' };

function e(x: number | null, digits = 5): string {
  if (x === null) return '—';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : String(x);
  return x.toExponential(digits - 1);
}

function f(x: number | null, digits = 3): string {
  if (x === null) return '—';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : String(x);
  return x.toFixed(digits);
}

const usPerDay = (fraction: number) => fraction * SECONDS_PER_DAY * 1e6;

/**
 * Why a spacecraft that is not a plain pass got its verdict when no recognised mistake explains it
 * (its `diagnosis` is empty); undefined for a pass or when findings explain it. Shared by the text,
 * Markdown and HTML reports, so a MARGINAL or FAIL verdict never stands without a reason.
 */
export function verdictExplanation(s: SpacecraftFinding): string | undefined {
  if (s.verdict === 'pass' || s.diagnosis.length > 0) return undefined;
  const used = (100 * Math.abs(s.differenceFractional)) / s.toleranceFractional;
  if (s.verdict === 'marginal') {
    return (
      `No recognised mistake matches. MARGINAL: the difference ${e(s.differenceFractional, 3)} is inside the tolerance ` +
      `±${e(s.toleranceFractional, 2)} but uses ${used.toFixed(0)} % of it, more than the review's margin allows; ` +
      'recompute the expected offset for this orbit and check how the configured value was derived.'
    );
  }
  return (
    `No recognised mistake matches. FAIL: the difference ${e(s.differenceFractional, 3)} is ${(used / 100).toFixed(1)} times ` +
    `the tolerance ±${e(s.toleranceFractional, 2)}; recompute the expected offset from the orbit and the constants, ` +
    'and check how the configured value was derived.'
  );
}

/** Control characters (C0, DEL, C1), line/paragraph separators and bidirectional overrides. */
const UNSAFE_CHARACTERS = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

/**
 * Text from the review file (title, ids, messages quoting them) as one line of Markdown: control
 * characters and line breaks shown escaped (`\x1B`, `\x0A`) so they can neither act on a terminal nor
 * break the document's structure, and `|` escaped so a table cell stays one cell.
 */
function md(text: string): string {
  return String(text)
    .replace(UNSAFE_CHARACTERS, (c) => {
      const n = c.charCodeAt(0);
      return n < 0x100 ? `\\x${n.toString(16).toUpperCase().padStart(2, '0')}` : `\\u${n.toString(16).toUpperCase()}`;
    })
    .replace(/\|/g, '\\|');
}

/** Markdown rendering: one summary table, then a section per spacecraft. */
export function reviewToMarkdown(report: ReviewReport): string {
  const lines: string[] = [
    `# ${md(report.title)}`,
    '',
    `> ${report.caution}`,
    '',
    `Result: ${report.counts.pass} pass, ${report.counts.marginal} marginal, ${report.counts.fail} fail.`,
    '',
    '| spacecraft | verdict | expected offset | configured offset | difference | difference (ns/day) | tolerance |',
    '|---|---|---:|---:|---:|---:|---:|',
  ];
  for (const s of report.spacecraft) {
    lines.push(
      `| ${md(s.id)} | ${VERDICT_MARK[s.verdict]} | ${e(s.expectedFractionalOffset, 6)} | ${e(s.configuredFractionalOffset, 6)} | ${e(s.differenceFractional, 3)} | ${f(s.differenceNanosecondsPerDay, 3)} | ${e(s.toleranceFractional, 2)} |`,
    );
  }
  for (const s of report.spacecraft) {
    lines.push(
      '',
      `## ${md(s.id)}: ${VERDICT_MARK[s.verdict]}`,
      '',
      md(s.summary),
      '',
      `- Constants: ${md(s.constants)}; reference: ${s.reference.toUpperCase()}; a = ${s.semiMajorAxis} m; nominal ${s.nominalFrequencyHz} Hz`,
      `- Expected output frequency: ${s.expectedFrequencyHz.toFixed(7)} Hz; configured: ${s.configuredFrequencyHz.toFixed(7)} Hz; difference ${e(s.differenceHz, 4)} Hz`,
      `- Rate budget: gravitational ${f(usPerDay(s.budget.gravitational), 4)} µs/day, velocity ${f(usPerDay(s.budget.velocity), 4)} µs/day, J2 ${f(usPerDay(s.budget.j2) * 1e3, 4)} ns/day (${s.budget.j2Included ? 'included' : 'not included: the kind of a is not stated'}), net ${f(usPerDay(s.budget.fractionalRate), 4)} µs/day; J2 osculating/mean-a ambiguity ${e(s.budget.j2Ambiguity, 2)}`,
    );
    if (s.quantisationStepFractional !== null)
      lines.push(`- Tuning-word step: ${e(s.quantisationStepFractional, 3)} (fractional)`);
    const why = verdictExplanation(s);
    if (why) lines.push('', why);
    if (s.diagnosis.length > 0) {
      lines.push('', '| finding | would have produced | explanation |', '|---|---:|---|');
      for (const d of s.diagnosis)
        lines.push(`| ${d.code}${d.matches ? '' : ' (note)'} | ${e(d.wouldHaveProduced, 6)} | ${md(d.message)} |`);
    }
    if (s.dispersion) {
      const d = s.dispersion;
      lines.push(
        '',
        `Injection dispersion σa = ${d.semiMajorAxisSigma} m (rate sensitivity ${e(d.rateSensitivityPerMetre, 4)} per metre): residual rate ${e(d.residualAtMinus3Sigma, 3)} at −3σ, ${e(d.residualNominal, 3)} nominal, ${e(d.residualAtPlus3Sigma, 3)} at +3σ.` +
          (d.phaseToleranceSeconds === null
            ? ' No phase tolerance given, so no walk-off time.'
            : ` Unsteered, the clock leaves ±${d.phaseToleranceSeconds} s after ${f(d.daysToPhaseToleranceWorst, 2)} days at the worst 3σ residual.`) +
          (d.actuatorCovers === null
            ? ''
            : d.actuatorCovers
              ? ' The steering range covers it.'
              : ' The steering range does NOT cover it.'),
        '',
        `Residual across the dispersion (closed form: percentile of a at a0 + kσ; a seeded ${d.monteCarlo.runs}-draw Monte Carlo, seed ${d.monteCarlo.seed}, agrees within sampling error):`,
        '',
        '| percentile | a (m) | residual rate | days to phase tolerance |',
        '|---:|---:|---:|---:|',
      );
      for (const p of d.percentiles)
        lines.push(
          `| ${p.percentile} | ${p.semiMajorAxis.toFixed(1)} | ${e(p.residualFractionalRate, 4)} | ${f(p.daysToPhaseTolerance, 2)} |`,
        );
    }
  }
  return `${lines.join('\n')}\n`;
}

const ESCAPES: Readonly<Record<string, string>> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

function esc(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ESCAPES[c] ?? c);
}

/** Horizontal bar chart of the rate budget in µs/day (gravitational, velocity, net). */
function budgetSvg(s: SpacecraftFinding): string {
  const items = [
    { label: 'gravitational', value: usPerDay(s.budget.gravitational) },
    { label: 'velocity', value: usPerDay(s.budget.velocity) },
    { label: s.budget.j2Included ? 'J2' : 'J2 (not incl.)', value: usPerDay(s.budget.j2) },
    { label: 'net rate', value: usPerDay(s.budget.fractionalRate) },
  ];
  const max = Math.max(...items.map((i) => Math.abs(i.value)), 1e-9);
  const width = 520,
    rowH = 26,
    left = 110,
    mid = left + (width - left - 90) / 2,
    half = (width - left - 90) / 2;
  const rows = items
    .map((item, i) => {
      const len = (Math.abs(item.value) / max) * half;
      const x = item.value >= 0 ? mid : mid - len;
      const y = 10 + i * rowH;
      const pattern = i === items.length - 1 ? 'url(#hatch)' : 'currentColor';
      return (
        `<text x="${left - 8}" y="${y + 14}" text-anchor="end">${item.label}</text>` +
        `<rect x="${x.toFixed(1)}" y="${y + 3}" width="${len.toFixed(1)}" height="16" fill="${pattern}" stroke="currentColor"/>` +
        `<text x="${(item.value >= 0 ? mid + len + 6 : mid - len - 6).toFixed(1)}" y="${y + 15}" text-anchor="${item.value >= 0 ? 'start' : 'end'}">${item.value.toFixed(3)} µs/day</text>`
      );
    })
    .join('');
  return (
    `<svg class="plot" viewBox="0 0 ${width} ${10 + items.length * rowH + 10}" role="img" aria-label="Rate budget of ${esc(s.id)}: ${items.map((i) => `${i.label} ${i.value.toFixed(3)} microseconds per day`).join(', ')}">` +
    '<defs><pattern id="hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="6" stroke="currentColor" stroke-width="2"/></pattern></defs>' +
    `<line x1="${mid}" y1="4" x2="${mid}" y2="${10 + items.length * rowH}" stroke="currentColor" stroke-dasharray="2 2"/>${rows}</svg>`
  );
}

/** Residual rate across the dispersion (percentile curve) with the actuator range when known. */
function dispersionSvg(s: SpacecraftFinding, actuatorRange: number | null): string {
  const d = s.dispersion;
  if (!d) return '';
  const pts = d.percentiles;
  const values = pts.map((p) => p.residualFractionalRate);
  const lo = Math.min(...values, actuatorRange !== null ? -actuatorRange : Infinity, 0);
  const hi = Math.max(...values, actuatorRange !== null ? actuatorRange : -Infinity, 0);
  const span = hi - lo || 1e-15;
  const W = 520,
    H = 180,
    L = 80,
    R = 20,
    T = 10,
    B = 34;
  const x = (i: number) => L + (i / (pts.length - 1)) * (W - L - R);
  const y = (v: number) => T + (1 - (v - lo) / span) * (H - T - B);
  const path = pts
    .map((p, i) => `${i === 0 ? 'M' : 'L'}${x(i).toFixed(1)},${y(p.residualFractionalRate).toFixed(1)}`)
    .join(' ');
  const marks = pts
    .map(
      (p, i) =>
        `<rect x="${(x(i) - 3).toFixed(1)}" y="${(y(p.residualFractionalRate) - 3).toFixed(1)}" width="6" height="6"/>` +
        `<text x="${x(i).toFixed(1)}" y="${H - 18}" text-anchor="middle">${p.percentile}%</text>`,
    )
    .join('');
  const range =
    actuatorRange === null
      ? ''
      : [actuatorRange, -actuatorRange]
          .map(
            (r) =>
              `<line x1="${L}" x2="${W - R}" y1="${y(r).toFixed(1)}" y2="${y(r).toFixed(1)}" stroke="currentColor" stroke-dasharray="6 3"/>` +
              `<text x="${W - R}" y="${(y(r) - 4).toFixed(1)}" text-anchor="end">steering limit ${e(r, 2)}</text>`,
          )
          .join('');
  return (
    `<svg class="plot" viewBox="0 0 ${W} ${H}" role="img" aria-label="Residual rate of ${esc(s.id)} across the injection dispersion, from ${e(values[0] ?? null, 3)} to ${e(values.at(-1) ?? null, 3)}">` +
    `<line x1="${L}" x2="${W - R}" y1="${y(0).toFixed(1)}" y2="${y(0).toFixed(1)}" stroke="currentColor" stroke-width="0.5"/>` +
    `<text x="${L - 6}" y="${(y(hi) + 4).toFixed(1)}" text-anchor="end">${e(hi, 2)}</text><text x="${L - 6}" y="${(y(lo) + 4).toFixed(1)}" text-anchor="end">${e(lo, 2)}</text>` +
    `<path d="${path}" fill="none" stroke="currentColor" stroke-width="1.5"/>${marks}${range}` +
    `<text x="${(L + W - R) / 2}" y="${H - 2}" text-anchor="middle">percentile of semi-major axis (residual fractional rate)</text></svg>`
  );
}

/**
 * A self-contained, print-friendly HTML page of the review (inline CSS and SVG, no scripts,
 * no external resources). `actuatorRanges` maps spacecraft id to its steering range (fractional, > 0), for the plot.
 */
export function reviewToHtml(report: ReviewReport, actuatorRanges: Readonly<Record<string, number>> = {}): string {
  const rows = report.spacecraft
    .map(
      (s) =>
        `<tr class="${s.verdict}"><th scope="row">${esc(s.id)}</th><td><span class="verdict ${s.verdict}">${VERDICT_MARK[s.verdict]}</span></td>` +
        `<td>${e(s.expectedFractionalOffset, 6)}</td><td>${e(s.configuredFractionalOffset, 6)}</td><td>${e(s.differenceFractional, 3)}</td><td>${f(s.differenceNanosecondsPerDay, 3)}</td><td>${e(s.toleranceFractional, 2)}</td></tr>`,
    )
    .join('');
  const sections = report.spacecraft
    .map((s) => {
      const why = verdictExplanation(s);
      const diag =
        s.diagnosis.length === 0
          ? `<p class="explanation">${why === undefined ? 'No findings.' : esc(why)}</p>`
          : `<table><caption>Findings</caption><thead><tr><th scope="col">code</th><th scope="col">would have produced</th><th scope="col">explanation</th></tr></thead><tbody>${s.diagnosis
              .map(
                (d) =>
                  `<tr><td><code>${d.code}</code>${d.matches ? '' : ' <small>(note)</small>'}</td><td>${e(d.wouldHaveProduced, 6)}</td><td class="text">${esc(d.message)}</td></tr>`,
              )
              .join('')}</tbody></table>`;
      const disp = s.dispersion
        ? `<h3>Injection dispersion (σa = ${s.dispersion.semiMajorAxisSigma} m)</h3>${dispersionSvg(s, actuatorRanges[s.id] ?? null)}
<table><caption>Residual across the dispersion (closed form at a0 + kσ; Monte Carlo cross-check: ${s.dispersion.monteCarlo.runs} draws, seed ${s.dispersion.monteCarlo.seed})</caption><thead><tr><th scope="col">percentile</th><th scope="col">a (m)</th><th scope="col">residual rate</th><th scope="col">days to phase tolerance</th></tr></thead><tbody>${s.dispersion.percentiles
            .map(
              (p) =>
                `<tr><td>${p.percentile}</td><td>${p.semiMajorAxis.toFixed(1)}</td><td>${e(p.residualFractionalRate, 4)}</td><td>${f(p.daysToPhaseTolerance, 2)}</td></tr>`,
            )
            .join('')}</tbody></table>`
        : '';
      return `<section><h2>${esc(s.id)} <span class="verdict ${s.verdict}">${VERDICT_MARK[s.verdict]}</span></h2><p>${esc(s.summary)}</p>
<dl><dt>Constants / reference</dt><dd>${esc(s.constants)} / ${s.reference.toUpperCase()}</dd><dt>Semi-major axis</dt><dd>${s.semiMajorAxis} m</dd>
<dt>Expected output frequency</dt><dd>${s.expectedFrequencyHz.toFixed(7)} Hz</dd><dt>Configured output frequency</dt><dd>${s.configuredFrequencyHz.toFixed(7)} Hz</dd>
<dt>Difference</dt><dd>${e(s.differenceHz, 4)} Hz = ${f(s.differenceNanosecondsPerDay, 3)} ns/day</dd></dl>
<h3>Rate budget</h3>${budgetSvg(s)}${diag}${disp}</section>`;
    })
    .join('\n');
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${esc(report.title)}</title>
<style>
body{font:14px/1.45 system-ui,sans-serif;margin:2rem auto;max-width:60rem;color:#1d232b;background:#fff;padding:0 1rem}
h1{font-size:1.5rem;margin-bottom:.25rem}h2{border-top:2px solid #1d232b;padding-top:.75rem;margin-top:2rem}
.caution{border:2px solid #8a5a00;background:#fff8e6;padding:.5rem .75rem;font-weight:600}
table{border-collapse:collapse;margin:.75rem 0;width:100%}th,td{border:1px solid #b9c0c8;padding:.25rem .5rem;text-align:right}
th[scope=row],td:first-child,caption{text-align:left}td.text{text-align:left}caption{font-weight:600;padding:.25rem 0}
.verdict{font-weight:700;padding:0 .4rem;border:2px solid currentColor;border-radius:3px}
.verdict.pass{color:#17663a}.verdict.pass::before{content:"✔ "}.verdict.marginal{color:#8a5a00}.verdict.marginal::before{content:"▲ "}
.verdict.fail{color:#a3162b}.verdict.fail::before{content:"✖ "}
dl{display:grid;grid-template-columns:max-content 1fr;gap:.15rem 1rem}dt{font-weight:600}dd{margin:0}
svg.plot{width:100%;max-width:520px;height:auto;font-size:11px;color:#24405f;fill:currentColor}svg.plot path{fill:none}
@media print{body{margin:0;max-width:none}section{break-inside:avoid}.caution{background:none}}
</style></head><body>
<h1>${esc(report.title)}</h1>
<p class="caution" role="note">${esc(report.caution)}</p>
<p>Result: ${report.counts.pass} pass, ${report.counts.marginal} marginal, ${report.counts.fail} fail. Generated by ${esc(report.generatedBy)}.</p>
<table><caption>Summary</caption><thead><tr><th scope="col">spacecraft</th><th scope="col">verdict</th><th scope="col">expected offset</th><th scope="col">configured offset</th><th scope="col">difference</th><th scope="col">ns/day</th><th scope="col">tolerance</th></tr></thead><tbody>${rows}</tbody></table>
${sections}
</body></html>
`;
}
