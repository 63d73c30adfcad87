import { expect, fixture, html } from '@open-wc/testing';
import '../../src/steering-schedule/steering-schedule.define.js';
import { readPlan } from '../../src/steering-schedule/plan-data.js';
import { readRevisions } from '../../src/steering-schedule/revisions-layer.js';
import type { TaulineSteeringSchedule } from '../../src/steering-schedule/steering-schedule.js';
import { captureWarnings, ORIN_ESTIMATES, orinRevision, secondsFrom } from '../fixtures.js';
import { pixelAt, publicLayout } from './public-layout.js';

/** The original ORIN-3 plan with the revision's superseded commands and the estimates it used. */
async function render(): Promise<TaulineSteeringSchedule> {
  const el = await fixture<TaulineSteeringSchedule>(
    html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`,
  );
  const { plan, revised, scenario } = await orinRevision();
  el.plan = plan;
  el.scenario = scenario;
  el.superseded = revised.revision.superseded;
  el.estimates = ORIN_ESTIMATES;
  await el.updateComplete;
  return el;
}

describe('tauline-steering-schedule revisions', () => {
  it("readRevisions(superseded, estimates, clock) reads the SDK revision's superseded commands and the estimates, and names an unreadable one", async () => {
    const { plan, revised, scenario } = await orinRevision();
    const r = readPlan(plan, scenario);
    if (!r.ok) throw new Error(r.error);
    const superseded = revised.revision.superseded;
    expect(superseded.length).to.be.greaterThan(0);
    const read = readRevisions(superseded, ORIN_ESTIMATES, r.view);
    expect(read.ok).to.equal(true);
    if (!read.ok) return;
    expect(read.view.superseded).to.deep.equal(
      superseded.map((c) => ({ executeAt: secondsFrom(scenario.epoch, c.executeAt), kind: c.kind })),
    );
    expect(read.view.estimates).to.deep.equal(
      ORIN_ESTIMATES.map((e) => ({ t: e.tSeconds, phase: e.phaseSeconds, sigma: e.sigmaSeconds })),
    );
    const bad = readRevisions(
      superseded,
      [...ORIN_ESTIMATES, { tSeconds: Number.NaN, phaseSeconds: 0, sigmaSeconds: 1e-10 }],
      r.view,
    );
    expect(bad.ok ? 'accepted' : bad.error).to.equal(
      'estimates[2].tSeconds must be a finite number of seconds (σ ≥ 0); received NaN',
    );
    const wrong = readRevisions([{ ...superseded[0]!, executeAt: 5 }], ORIN_ESTIMATES, r.view);
    expect(wrong.ok ? 'accepted' : wrong.error).to.equal('superseded[0].executeAt must be a string; received 5');
  });

  it("<tauline-steering-schedule> paints each estimate's dot and ±1σ bar, and removes them when the revision is cleared", async () => {
    const el = await render();
    const { layout } = publicLayout(el);
    const { sx, sy } = layout.scales;
    // The second estimate (60 000 s) lies between contacts; its dot is painted at (t, phase) and its bar ends at phase ± σ.
    const e = ORIN_ESTIMATES[1]!;
    const x = sx.map(e.tSeconds);
    const dot = pixelAt(el, x, sy.map(e.phaseSeconds));
    const bar = pixelAt(el, x, sy.map(e.phaseSeconds + 0.9 * e.sigmaSeconds));
    await expect(el).to.be.accessible();
    el.superseded = undefined;
    el.estimates = undefined;
    await el.updateComplete;
    expect(pixelAt(el, x, sy.map(e.phaseSeconds)), 'dot').to.not.deep.equal(dot);
    expect(pixelAt(el, x, sy.map(e.phaseSeconds + 0.9 * e.sigmaSeconds)), 'bar').to.not.deep.equal(bar);
  });

  it('<tauline-steering-schedule> warns once (invalid-revisions) naming an unreadable estimate, draws the plan and never throws', async () => {
    const w = await captureWarnings();
    try {
      const el = await render();
      el.estimates = [...ORIN_ESTIMATES, { tSeconds: Number.NaN, phaseSeconds: 0, sigmaSeconds: 0 }];
      await el.updateComplete;
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-revisions']);
      expect(w.list[0]!.message).to.contain('estimates[2].tSeconds');
      expect(el.shadowRoot!.querySelector('.state.error')).to.equal(null);
    } finally {
      w.restore();
    }
  });
});
