import { fixture, html, expect } from '@open-wc/testing';
import '../src/steering-schedule/steering-schedule.define.js';
import type { TaulineSteeringSchedule } from '../src/steering-schedule/steering-schedule.js';
import { readRevisions } from '../src/steering-schedule/revisions-layer.js';
import { EPOCH, captureWarnings, makePlan, makeScenario } from './fixtures.js';

type Internals = {
  _scales: { sx: { map(v: number): number }; sy: { map(v: number): number } };
  _revisionMarks: { superseded: Array<{ x: number; y: number }>; estimates: Array<{ x: number; y: number; yLow: number; yHigh: number }> };
};

const ESTIMATES = [
  { tSeconds: 20_000, phaseSeconds: 1.2e-9, sigmaSeconds: 3e-10 },
  { tSeconds: 60_000, phaseSeconds: -0.8e-9, sigmaSeconds: 3e-10 },
];

async function render(): Promise<TaulineSteeringSchedule> {
  const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`);
  const plan = makePlan();
  el.plan = plan;
  el.scenario = makeScenario();
  el.superseded = plan.commands.slice(1);
  el.estimates = ESTIMATES;
  await el.updateComplete;
  return el;
}

describe('tauline-steering-schedule revisions', () => {
  it('readRevisions(superseded, estimates, epoch) reads ISO execution times and estimates and counts unreadable entries', () => {
    const r = readRevisions(makePlan().commands.slice(1), [...ESTIMATES, { tSeconds: 'soon', phaseSeconds: 0, sigmaSeconds: 1e-10 }], EPOCH);
    expect(r.superseded).to.deep.equal([{ executeAt: 110000, kind: 'frequency' }, { executeAt: 190000, kind: 'phase' }]);
    expect(r.estimates).to.deep.equal([{ t: 20000, phase: 1.2e-9, sigma: 3e-10 }, { t: 60000, phase: -0.8e-9, sigma: 3e-10 }]);
    expect(r.dropped).to.equal(1);
  });

  it('<tauline-steering-schedule> draws superseded commands at their execution times and each estimate with a ±1σ bar', async () => {
    const el = await render();
    const i = el as unknown as Internals;
    const { sx, sy } = i._scales;
    expect(i._revisionMarks.superseded.map((m) => Math.round(m.x))).to.deep.equal([110000, 190000].map((t) => Math.round(sx.map(t))));
    expect(i._revisionMarks.estimates).to.have.length(2);
    const e = i._revisionMarks.estimates[0]!;
    expect(e.x).to.be.closeTo(sx.map(20_000), 1e-9);
    expect(e.yLow).to.be.closeTo(sy.map(1.2e-9 - 3e-10), 1e-9);
    expect(e.yHigh).to.be.closeTo(sy.map(1.2e-9 + 3e-10), 1e-9);
    // The estimate's dot is painted on the data canvas.
    const canvas = el.shadowRoot!.querySelector('canvas.data') as HTMLCanvasElement;
    const ratio = canvas.width / canvas.getBoundingClientRect().width;
    const pixel = canvas.getContext('2d')!.getImageData(Math.round(e.x * ratio), Math.round(e.y * ratio), 1, 1).data;
    expect(pixel[3]).to.be.greaterThan(0);
  });

  it('<tauline-steering-schedule> stays accessible with revisions, and clearing them removes the marks', async () => {
    const el = await render();
    await expect(el).to.be.accessible();
    el.superseded = undefined;
    el.estimates = undefined;
    await el.updateComplete;
    const i = el as unknown as Internals;
    expect(i._revisionMarks.superseded).to.have.length(0);
    expect(i._revisionMarks.estimates).to.have.length(0);
  });

  it('<tauline-steering-schedule> warns once (revision-entries-dropped) for an unreadable estimate and never throws', async () => {
    const w = await captureWarnings();
    try {
      const el = await render();
      el.estimates = [...ESTIMATES, { tSeconds: Number.NaN }];
      await el.updateComplete;
      expect(w.list.map((x) => x.code)).to.deep.equal(['revision-entries-dropped']);
      expect((el as unknown as Internals)._revisionMarks.estimates).to.have.length(2);
    } finally {
      w.restore();
    }
  });
});
