import { expect, fixture, html, oneEvent } from '@open-wc/testing';
import '../../src/review-findings/review-findings.define.js';
import type { ReviewReport } from '@tauline/sdk/review';
import type { TaulineReviewFindings } from '../../src/review-findings/review-findings.js';
import { captureWarnings, exampleReview } from '../fixtures.js';

// reviewOffsets() on the bundled Kestrel examples (fictional constellation, packages/sdk/examples/review/): one passing
// spacecraft of Block A, then KESTREL-11 (offset with the sign flipped: fail) and KESTREL-19 (marginal) of Block B.
let REVIEW: ReviewReport;
before(async () => {
  const [a, b] = await Promise.all([exampleReview('kestrel-block-a'), exampleReview('kestrel-block-b-mistakes')]);
  const pick = (id: string) => b.spacecraft.find((f) => f.id === id)!;
  REVIEW = { ...b, spacecraft: [a.spacecraft[0]!, pick('KESTREL-11'), pick('KESTREL-19')] };
});

describe('tauline-review-findings', () => {
  it('<tauline-review-findings> is accessible (axe-core) with data', async () => {
    const el = await fixture<TaulineReviewFindings>(
      html`<tauline-review-findings .review=${REVIEW}></tauline-review-findings>`,
    );
    await expect(el).to.be.accessible();
  });

  it('lists failing spacecraft first, each verdict with its own icon shape and text', async () => {
    const el = await fixture<TaulineReviewFindings>(
      html`<tauline-review-findings .review=${REVIEW}></tauline-review-findings>`,
    );
    const ids = [...el.shadowRoot!.querySelectorAll('.sc-id')].map((x) => x.textContent);
    expect(ids).to.deep.equal(['KESTREL-11', 'KESTREL-19', 'KESTREL-01']);
    const shapes = [...el.shadowRoot!.querySelectorAll('details .verdict svg')].map(
      (s) => s.firstElementChild!.localName,
    );
    expect(shapes).to.deep.equal(['rect', 'path', 'circle']);
    expect(el.shadowRoot!.querySelector('.title')!.textContent).to.equal(REVIEW.title);
  });

  it('hide-passing leaves passing spacecraft out of the list', async () => {
    const el = await fixture<TaulineReviewFindings>(
      html`<tauline-review-findings hide-passing .review=${REVIEW}></tauline-review-findings>`,
    );
    expect(el.shadowRoot!.querySelectorAll('details').length).to.equal(2);
  });

  it('opening an entry fires tauline-spacecraft-select (bubbling, composed); setting data fires nothing', async () => {
    let fired = 0;
    const host = await fixture<HTMLDivElement>(
      html`<div @tauline-spacecraft-select=${() => fired++}><tauline-review-findings .review=${REVIEW}></tauline-review-findings></div>`,
    );
    const el = host.querySelector('tauline-review-findings')!;
    el.review = { ...REVIEW };
    await el.updateComplete;
    expect(fired).to.equal(0);
    const summary = el.shadowRoot!.querySelector<HTMLElement>('summary')!;
    setTimeout(() => summary.click());
    const ev = await oneEvent(host, 'tauline-spacecraft-select');
    expect(ev.detail).to.deep.equal({ id: 'KESTREL-11', verdict: 'fail' });
    expect(ev.composed).to.equal(true);
  });

  it('shows the diagnosis with the value the mistake would have produced', async () => {
    const el = await fixture<TaulineReviewFindings>(
      html`<tauline-review-findings .review=${REVIEW}></tauline-review-findings>`,
    );
    const li = el.shadowRoot!.querySelector('.diagnosis li')!;
    const sign = REVIEW.spacecraft[1]!.diagnosis.find((d) => d.code === 'sign-flipped')!;
    expect(li.textContent).to.contain('sign-flipped');
    // −1 × the expected offset (the SDK's wouldHaveProduced), printed to 5 significant figures.
    expect(li.textContent).to.contain(sign.wouldHaveProduced!.toExponential(4).replace('-', '−'));
    expect(sign.wouldHaveProduced).to.equal(-REVIEW.spacecraft[1]!.expectedFractionalOffset);
  });

  it('a null diagnosis entry shows a visible notice naming it, keeps the readable entries and warns once', async () => {
    const w = await captureWarnings();
    try {
      const bad = {
        ...REVIEW,
        spacecraft: REVIEW.spacecraft.map((f) =>
          f.id === 'KESTREL-11' ? { ...f, diagnosis: [null, ...f.diagnosis] } : f,
        ),
      };
      const el = await fixture<TaulineReviewFindings>(
        html`<tauline-review-findings .review=${bad}></tauline-review-findings>`,
      );
      const notice = el.shadowRoot!.querySelector('.notice[role="alert"]')!;
      expect(notice.textContent).to.contain('spacecraft[1] (KESTREL-11).diagnosis[0] is null');
      expect(el.shadowRoot!.querySelectorAll('details').length).to.equal(3);
      expect(el.shadowRoot!.querySelector('.diagnosis li')!.textContent).to.contain('sign-flipped');
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-diagnosis']);
    } finally {
      w.restore();
    }
  });

  it('bad data shows an error state and warns once', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineReviewFindings>(
        html`<tauline-review-findings .review=${{ spacecraft: 3 }}></tauline-review-findings>`,
      );
      expect(el.shadowRoot!.querySelector('.state.error')).to.exist;
      el.review = { spacecraft: 4 } as never;
      await el.updateComplete;
      expect(w.list.length).to.equal(1);
    } finally {
      w.restore();
    }
  });

  it('theme="dark" switches to the dark palette', async () => {
    const el = await fixture<TaulineReviewFindings>(
      html`<tauline-review-findings theme="dark" .review=${REVIEW}></tauline-review-findings>`,
    );
    const light = await fixture<TaulineReviewFindings>(
      html`<tauline-review-findings theme="light" .review=${REVIEW}></tauline-review-findings>`,
    );
    expect(getComputedStyle(el).backgroundColor).to.not.equal(getComputedStyle(light).backgroundColor);
  });
});
