import { readFileSync } from 'node:fs';
import { REVIEW_CAUTION, reviewOffsets } from '@tauline/sdk/review';
import { describe, expect, it } from 'vitest';
import { reviewToHtml, reviewToMarkdown, verdictExplanation } from '../../src/render/review.js';

const examples = new URL('../../../sdk/examples/review/', import.meta.url);
const load = (name: string): unknown => JSON.parse(readFileSync(new URL(name, examples), 'utf8'));

describe("reviewToMarkdown(report) / reviewToHtml(report) (the CLI's renderers of an SDK review report)", () => {
  const report = reviewOffsets(load('kestrel-block-b-mistakes.review.json'));
  it('reviewToMarkdown(report) carries the caution, a summary table and each diagnosis code', () => {
    const md = reviewToMarkdown(report);
    expect(md).toContain(REVIEW_CAUTION);
    expect(md).toMatch(/\| KESTREL-11 \| FAIL \|/);
    expect(md).toContain('sign-flipped');
  });
  it('reviewToHtml(report, ranges) is one self-contained page: no scripts, no external resources, accessible plots', () => {
    const html = reviewToHtml(report, { 'KESTREL-18': 2e-12 });
    expect(html.startsWith('<!doctype html>')).toBe(true);
    expect(html).not.toMatch(/<script|<link|src=|url\(http|https?:\/\/(?!tauline\.invalid)/);
    expect(html).toContain('role="img"');
    expect(html).toContain('steering limit');
    expect(html).toContain(REVIEW_CAUTION.replace(/'/g, '&#39;'));
  });
  it('verdictExplanation(finding) explains a MARGINAL verdict that no recognised mistake explains, in the Markdown and HTML too', () => {
    const marginal = report.spacecraft.find((f) => f.verdict === 'marginal' && f.diagnosis.length === 0)!;
    const why = verdictExplanation(marginal)!;
    // 3.5e-13 against ±5e-13 is 70 % of the tolerance (the Block B file configures KESTREL-19 that far off).
    expect(why).toMatch(
      /^No recognised mistake matches\. MARGINAL: the difference 3\.50e-13 is inside the tolerance ±5\.0e-13 but uses 70 % of it/,
    );
    expect(reviewToMarkdown(report)).toContain(why);
    const html = reviewToHtml(report);
    expect(html).toContain(`<p class="explanation">${why.replace(/'/g, '&#39;')}</p>`);
    expect(verdictExplanation(report.spacecraft.find((f) => f.diagnosis.length > 0)!)).toBeUndefined();
    expect(verdictExplanation(reviewOffsets(load('kestrel-block-a.review.json')).spacecraft[0]!)).toBeUndefined();
  });
});
