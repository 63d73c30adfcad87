import { expect } from '@open-wc/testing';
import { readPlan } from '../../src/steering-schedule/plan-data.js';
import {
  commandMarkers,
  drawSchedule,
  layoutSchedule,
  type ScheduleColors,
  scheduleFrame,
  uncertaintyBand,
  worstAbs,
} from '../../src/steering-schedule/schedule-draw.js';
import { halcyrPhasePlan, orinPlan } from '../fixtures.js';

const COLORS: ScheduleColors = {
  text: 'rgb(20, 20, 20)',
  muted: 'rgb(120, 120, 120)',
  grid: 'rgb(230, 230, 230)',
  surface: 'rgb(255, 255, 255)',
  accent: 'rgb(0, 90, 200)',
  steered: 'rgb(255, 0, 0)',
  unsteered: 'rgb(0, 160, 0)',
  uncertainty: 'rgb(0, 0, 255)',
  tolerance: 'rgb(200, 120, 0)',
  contact: 'rgb(100, 0, 160)',
  maneuver: 'rgb(160, 0, 100)',
  frequency: 'rgb(0, 120, 120)',
  phase: 'rgb(120, 120, 0)',
  font: '11px sans-serif',
};

/** A bare 2-D context of `width` × `height` CSS px at device pixel ratio 1 (no element involved). */
function context(width: number, height: number): CanvasRenderingContext2D {
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  return canvas.getContext('2d')!;
}

async function orinView() {
  const { plan, scenario } = await orinPlan();
  const r = readPlan(plan, scenario);
  if (!r.ok) throw new Error(r.error);
  return { plan, scenario, view: r.view };
}

describe('schedule-draw (pure drawing of the steering schedule)', () => {
  it('layoutSchedule(d, band, view, size, options) fits the offset axis to the steered band and the tolerance, and picks the axis unit', async () => {
    const { view, scenario } = await orinView();
    const band = uncertaintyBand(view, 2);
    const layout = layoutSchedule(
      view,
      band,
      [0, 604_800],
      { width: 800, height: 340 },
      { yUnit: 'auto', fitAll: false, devicePixelRatio: 1 },
    );
    const { sx, sy, frame, unit } = layout.scales;
    expect(frame).to.deep.equal(scheduleFrame(800, 340));
    expect(sx.map(0)).to.equal(frame.left);
    expect(sx.map(604_800)).to.be.closeTo(frame.left + frame.width, 1e-9);
    const tol = scenario.tolerance.phaseSeconds;
    const [y0, y1] = sy.domain;
    expect(y0).to.be.at.most(Math.min(-tol, ...band.low));
    expect(y1).to.be.at.least(Math.max(tol, ...band.high));
    expect(unit.unit).to.equal('ns');
    expect(
      layoutSchedule(
        view,
        band,
        [0, 604_800],
        { width: 800, height: 340 },
        { yUnit: 'us', fitAll: false, devicePixelRatio: 1 },
      ).scales.unit.unit,
    ).to.equal('µs');
  });

  it('uncertaintyBand(d, k) is steered ± k·σ and worstAbs(column) the largest |value| (checked against the SDK prediction)', async () => {
    const { plan, view } = await orinView();
    const band = uncertaintyBand(view, 3);
    const i = 100;
    const m = plan.predicted.steered.phaseSeconds[i]!,
      s = plan.predicted.steered.sigmaSeconds[i]!;
    expect(band.low[i]).to.be.closeTo(m - 3 * s, 1e-24);
    expect(band.high[i]).to.be.closeTo(m + 3 * s, 1e-24);
    // The SDK's own metric: the largest |mean steered offset| on the grid.
    expect(worstAbs(view.steered)).to.be.closeTo(plan.metrics.worstPredictedOffsetSeconds, 1e-18);
  });

  it('uncertaintyBand(d, k) throws a RangeError when σ and the steered prediction differ in length', () => {
    const d = { steered: Float64Array.of(1e-9, 2e-9), steeredSigma: Float64Array.of(1e-10) };
    expect(() => uncertaintyBand(d, 2)).to.throw(RangeError, 'steeredSigma has 1 element(s) for 2 steered value(s)');
  });

  it('drawSchedule(ctx, d, layout, colors, null) paints the steered line in its colour and returns one marker per command in view', async () => {
    const { view } = await orinView();
    const flat = { ...view, steered: new Float64Array(view.steered.length) };
    const layout = layoutSchedule(
      flat,
      null,
      [0, 604_800],
      { width: 800, height: 340 },
      { yUnit: 'auto', fitAll: false, devicePixelRatio: 1 },
    );
    const ctx = context(800, 340);
    const { markers, revisionMarks } = drawSchedule(ctx, flat, layout, COLORS, null);
    expect(markers.map((m) => m.c)).to.deep.equal(view.commands.map((_, k) => k));
    expect(revisionMarks).to.deep.equal({ superseded: [], estimates: [] });
    const { sx, sy } = layout.scales;
    // 08:00 on day 1 lies between the first two contact windows: nothing but the line there.
    const px = ctx.getImageData(Math.round(sx.map(8 * 3600)), Math.round(sy.map(0)), 1, 1).data;
    expect([...px]).to.deep.equal([255, 0, 0, 255]);
    // Half of the view: only the commands inside it get markers.
    const half = layoutSchedule(
      flat,
      null,
      [0, 302_400],
      { width: 800, height: 340 },
      { yUnit: 'auto', fitAll: false, devicePixelRatio: 1 },
    );
    expect(commandMarkers(flat, half.scales).length).to.equal(
      view.commands.filter((c) => c.executeAt <= 302_400).length,
    );
  });

  it('drawSchedule(...) colours a phase-step marker with the phase colour (HALCYR-G1 started 40 ns off)', async () => {
    const { plan, scenario } = await halcyrPhasePlan();
    const r = readPlan(plan, scenario);
    if (!r.ok) throw new Error(r.error);
    // 07:00 to 11:00 on day 1: the phase step (09:00) and the frequency step 30 min later are ~100 px apart.
    const layout = layoutSchedule(
      r.view,
      null,
      [7 * 3600, 11 * 3600],
      { width: 900, height: 340 },
      { yUnit: 'auto', fitAll: false, devicePixelRatio: 1 },
    );
    const ctx = context(900, 340);
    const { markers } = drawSchedule(ctx, r.view, layout, COLORS, null);
    const kinds = markers.map((m) => r.view.commands[m.c]!.kind);
    expect(kinds).to.deep.equal(['phase', 'frequency']);
    const colour = (k: number) =>
      [...ctx.getImageData(Math.round(markers[k]!.x), Math.round(markers[k]!.y), 1, 1).data].slice(0, 3);
    expect(colour(0)).to.deep.equal([120, 120, 0]);
    expect(colour(1)).to.deep.equal([0, 120, 120]);
  });
});
