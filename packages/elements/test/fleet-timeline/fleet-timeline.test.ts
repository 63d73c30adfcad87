import { expect, fixture, html, oneEvent } from '@open-wc/testing';
import { type FleetDocument, fleetPlanToJson, planFleet, validateFleet } from '@tauline/sdk/fleet';
import { sendKeys } from '@web/test-runner-commands';
import '../../src/fleet-timeline/fleet-timeline.define.js';
import { readFleetPlan } from '../../src/fleet-timeline/fleet-data.js';
import { columnMinima, fleetLayout } from '../../src/fleet-timeline/fleet-draw.js';
import { marginSeries, requiredBound } from '../../src/fleet-timeline/fleet-margin.js';
import type { TaulineFleetTimeline } from '../../src/fleet-timeline/fleet-timeline.js';
import { erfc, oneSidedQuantile } from '../../src/internal/normal.js';
import { linearScale } from '../../src/internal/scale.js';
import { captureWarnings } from '../fixtures.js';
import { heldFleet, laterFleet, strandedFleet } from './fleet-fixtures.js';

const WIDTH = 900;

/** Waits until the element has drawn (the first size comes from the ResizeObserver, before the first paint). */
async function drawn(el: TaulineFleetTimeline): Promise<void> {
  for (let k = 0; k < 10; k++) {
    await new Promise((ok) => requestAnimationFrame(ok));
    await el.updateComplete;
    // sizeCanvas() sets the CSS size when it draws.
    if (el.shadowRoot!.querySelector<HTMLCanvasElement>('canvas.data')?.style.height) return;
  }
}

async function render(data: Awaited<ReturnType<typeof heldFleet>>, attrs = ''): Promise<TaulineFleetTimeline> {
  const el = await fixture<TaulineFleetTimeline>(
    html`<tauline-fleet-timeline style=${`width: ${WIDTH}px`}></tauline-fleet-timeline>`,
  );
  for (const a of attrs.split(' ').filter(Boolean)) {
    const [k, v] = a.split('=');
    el.setAttribute(k!, v ?? '');
  }
  el.fleet = data.fleet;
  el.plan = data.plan;
  await drawn(el);
  return el;
}

const root = (el: Element): ShadowRoot => el.shadowRoot!;
const rows = (el: Element): HTMLTableRowElement[] => [
  ...root(el).querySelectorAll<HTMLTableRowElement>('tbody tr[part~="row"]'),
];

/** Pointer at chart time t (s since the epoch) on satellite row i (or station lane k when lane is set). */
function pointAt(
  el: TaulineFleetTimeline,
  t: number,
  horizon: number,
  row: number,
  lane = false,
): { clientX: number; clientY: number } {
  const box = root(el).querySelector<HTMLElement>('.plot-box')!;
  const r = box.getBoundingClientRect();
  const layout = fleetLayout(Math.floor(r.width), 4, 2);
  const x = layout.left + (t / horizon) * (layout.right - layout.left);
  const y = lane ? layout.laneTop + (row + 0.5) * layout.laneHeight : layout.top + (row + 0.5) * layout.rowHeight;
  return { clientX: r.left + x, clientY: r.top + y };
}

describe('tauline-fleet-timeline', () => {
  it('<tauline-fleet-timeline> is accessible (axe-core) with a plan made by planFleet', async () => {
    const el = await render(await strandedFleet());
    await expect(el).to.be.accessible();
  });

  it('readFleetPlan(plan, fleet) gives a row per satellite and a lane per station with every support of the schedule', async () => {
    const { fleet, plan } = await heldFleet();
    const r = readFleetPlan(plan, fleet);
    expect(r.ok).to.equal(true);
    if (!r.ok) return;
    expect(r.view.satellites.map((s) => s.id)).to.deep.equal(['VESPER-1', 'VESPER-2', 'VESPER-3', 'VESPER-4']);
    expect(r.view.stations.map((s) => s.id)).to.deep.equal(['HARROWMERE', 'CALLOWAY-RIDGE']);
    expect(r.view.stations.reduce((n, s) => n + s.supports.length, 0)).to.equal(plan.stationSchedule.length);
    expect(r.view.horizon).to.equal(604800);
    // Every uplink lies inside a support of its satellite at the station it names (planFleet's guarantee, through the view).
    for (const s of r.view.satellites) {
      for (const c of s.commands) {
        const st = r.view.stations.find((x) => x.id === c.station)!;
        const inside = st.supports.some(
          (q) => q.satellite === s.index && c.uplinkAt >= q.start - 1e-3 && c.uplinkAt <= q.end + 1e-3,
        );
        expect(inside, `${s.id} uplink`).to.equal(true);
      }
    }
  });

  it('readFleetPlan(plan, fleet) refuses a plan whose epoch is not the fleet epoch, and reads one printed without an epoch', async () => {
    const { fleet, plan } = await heldFleet();
    expect(plan.epoch).to.equal(fleet.epoch);
    const later = new Date(Date.parse(fleet.epoch) + 1000).toISOString().replace('.000Z', 'Z');
    const other = readFleetPlan({ ...plan, epoch: later }, fleet);
    expect(other.ok ? 'accepted' : other.error).to.equal(
      `plan.epoch must be fleet.epoch "${fleet.epoch}" (the plan was made for another fleet); received "${later}"`,
    );
    const { epoch: _, ...older } = plan;
    expect(readFleetPlan(older, fleet).ok).to.equal(true);
  });

  it('erfc(x) and requiredBound(m, σ, p, z) agree with scipy (packages/elements/test/fleet-timeline/fleet_margin_reference.py) [C]', () => {
    // [x, scipy.special.erfc(x)], scipy 1.17.1 [C]; Numerical Recipes' erfcc: fractional error < 1.2e-7.
    const erfcCases: Array<[number, number]> = [
      [-1.5, 1.9661051464753108],
      [-0.3, 1.3286267594591274],
      [0, 1],
      [0.7, 0.3221988061625817],
      [2, 0.004677734981047266],
      [4.5, 1.9661604415428878e-10],
    ];
    for (const [x, ref] of erfcCases) expect(Math.abs(erfc(x) - ref) / ref, `erfc(${x})`).to.be.below(1.2e-7);
    // [m, σ, p, z = Φ⁻¹((1+p)/2), b with P(|X| ≤ b) = p] from scipy.stats.norm and brentq [C]. Tolerance 1e-5 σ
    // (the CDF's 1.2e-7 error moves b by about that much over φ at the tail).
    const cases: Array<[number, number, number, number, number]> = [
      [0, 1, 0.95, 1.959963984540054, 1.9599639845400543],
      [3, 1, 0.95, 1.959963984540054, 4.644853626951574],
      [1e-8, 5e-9, 0.95, 1.959963984540054, 1.8224268535496077e-8],
      [2.5e-8, 4e-9, 0.9973, 2.9999769927034015, 3.612860181513839e-8],
      [-1.2e-8, 8e-9, 0.68, 0.9944578832097535, 1.574744700173807e-8],
      [1e-8, 1e-9, 0.95, 1.959963984540054, 1.1644853626951472e-8],
    ];
    for (const [m, s, p, z, b] of cases) {
      expect(Math.abs(requiredBound(m, s, p, z) - b), `m=${m} σ=${s} p=${p}`).to.be.below(1e-5 * s);
      // The far-tail shortcut (|m| ≥ 8σ) and the series (warm starts) give the same bound.
      const shortcut = requiredBound(m, s, p, z, z, oneSidedQuantile(p));
      expect(Math.abs(shortcut - b), `m=${m} σ=${s} p=${p}, z1`).to.be.below(1e-5 * s);
      const series = marginSeries([m, m], [s, s], 0.1 + b, p, z)[1]!;
      expect(Math.abs(0.1 - series), `series m=${m} σ=${s}`).to.be.below(1e-5 * s);
    }
    // [p, scipy.stats.norm.ppf(p)] [C].
    const quantiles = [
      [0.68, 0.4676987991145084],
      [0.95, 1.6448536269514722],
      [0.9973, 2.7821504537846025],
    ] as const;
    for (const [p, z1] of quantiles) {
      expect(Math.abs(oneSidedQuantile(p) - z1), `z1(${p})`).to.be.below(1e-5);
    }
  });

  it('marginSeries(mean, σ, ...) and columnMinima(t, margin, ...) throw a RangeError naming a column shorter than the grid', () => {
    expect(() => marginSeries([1e-9, 2e-9], [1e-10], 1e-7, 0.99, 3)).to.throw(
      RangeError,
      'sigma[1] is outside its 1 element(s)',
    );
    const sx = linearScale(0, 10, 100, 500);
    expect(() =>
      columnMinima(Float64Array.of(0, 5, 10), Float64Array.of(1e-8, 2e-8), 1e-7, sx, fleetLayout(600, 1, 1)),
    ).to.throw(RangeError, 'margin has 2 element(s) for 3 grid time(s)');
  });

  it('readFleetPlan margins agree with the planner: every held satellite has margin ≥ 0 at every epoch, the stranded one goes below 0', async () => {
    const held = await heldFleet();
    const r = readFleetPlan(held.plan, held.fleet);
    if (!r.ok) throw new Error(r.error);
    for (const s of r.view.satellites) {
      // planSteering's rule is the same per-epoch criterion; 1e-15 s covers the CDF approximation near zero margin.
      expect(s.minMargin, s.id).to.be.greaterThan(-1e-15);
      // The exact margin is never smaller than the plan's sufficient one, b − (|m| + zσ) [worstOffsetBoundSeconds].
      const sat = held.plan.satellites[s.index]!;
      expect(s.minMargin).to.be.at.least(s.tolerance - sat.metrics.worstOffsetBoundSeconds - 1e-15);
    }
    const stranded = await strandedFleet();
    const r2 = readFleetPlan(stranded.plan, stranded.fleet);
    if (!r2.ok) throw new Error(r2.error);
    const v3 = r2.view.satellites[2]!;
    expect(v3.feasible).to.equal(false);
    expect(v3.minMargin).to.be.below(0);
  });

  it('readFleetPlan reads the fleet document as the SDK validateFleet does: tolerances, z, setups and passes, given or computed', async () => {
    // The element's thin guard against the SDK's full validation of the same documents (the invented examples).
    const ashgrove = (await (await fetch('/packages/sdk/examples/fleet/ashgrove-orbits.json')).json()) as FleetDocument;
    for (const [name, fleet] of [
      ['vesper', (await heldFleet()).fleet],
      ['ashgrove', ashgrove],
    ] as const) {
      const r = readFleetPlan(fleetPlanToJson(planFleet(fleet)), fleet);
      if (!r.ok) throw new Error(r.error);
      const norm = validateFleet(fleet);
      expect(r.view.horizon, name).to.equal(norm.horizon);
      expect(r.view.stations.map((s) => [s.id, s.setup])).to.deep.equal(norm.stations.map((s) => [s.id, s.setup]));
      for (const [i, sat] of r.view.satellites.entries()) {
        const doc = norm.satellites[i]!;
        expect([sat.id, sat.tolerance, sat.probability]).to.deep.equal([doc.id, doc.norm.bound, doc.norm.probability]);
        // z from the elements' own Φ (fractional error < 1.2e-7) against the SDK's normalQuantile.
        expect(Math.abs(sat.z - doc.norm.z), `${sat.id} z`).to.be.below(1e-6);
        // `+ 0`: a computed pass clipped at the epoch starts at −0 s in the SDK and at 0 s read back from its ISO stamp.
        const expected = doc.passes.map((q) => ({ station: q.station, start: q.start + 0, end: q.end + 0 }));
        expect(expected.length, `${sat.id} passes`).to.be.greaterThan(0);
        expect(sat.passes, `${sat.id} passes`).to.deep.equal(expected);
      }
    }
  });

  it('renders one table row per satellite and one station row per station, and names the picture from the data', async () => {
    const el = await render(await heldFleet());
    expect(rows(el).map((r) => r.dataset.id)).to.deep.equal(['VESPER-1', 'VESPER-2', 'VESPER-3', 'VESPER-4']);
    expect(root(el).querySelectorAll('[part~="station-table"] tbody tr').length).to.equal(2);
    const label = root(el).querySelector('canvas.data')!.getAttribute('aria-label')!;
    expect(label).to.contain('2027-02-01 00:00 UTC to 2027-02-08 00:00 UTC');
    expect(label).to.contain('4 satellites, 2 stations');
    expect(label).to.contain('Every satellite held');
    expect(root(el).querySelector('.badge')!.textContent).to.contain('every satellite held');
    const canvas = root(el).querySelector<HTMLCanvasElement>('canvas.data')!;
    expect(canvas.style.height).to.equal(`${fleetLayout(WIDTH, 4, 2).height}px`);
  });

  it('marks a satellite the plan cannot hold with ⚠, the words "not held", part at-risk and the reason, not by colour alone', async () => {
    // risk-margin 0: only a satellite the plan does not hold is at risk.
    const el = await render(await strandedFleet(), 'risk-margin=0');
    const r = rows(el);
    const v3 = r[2]!;
    expect(v3.getAttribute('part')).to.contain('at-risk');
    expect(v3.textContent).to.contain('⚠');
    expect(v3.textContent).to.contain('not held');
    expect(v3.querySelector('td.reason')!.textContent).to.contain('too few passes');
    expect(r[0]!.getAttribute('part')).not.to.contain('at-risk');
    expect(el.atRisk).to.deep.equal(['VESPER-3']);
    expect(root(el).querySelector('[part~="summary"]')!.textContent).to.contain('VESPER-3 (too-few-passes)');
    expect(root(el).querySelector('canvas.data')!.getAttribute('aria-label')).to.contain('Not held: VESPER-3');
  });

  it('risk-margin marks held satellites whose smallest margin is below that share of their tolerance as at risk', async () => {
    const data = await heldFleet();
    const el = await render(data, 'risk-margin=0.99');
    const view = readFleetPlan(data.plan, data.fleet);
    if (!view.ok) throw new Error(view.error);
    const expected = view.view.satellites.filter((s) => s.minMargin < 0.99 * s.tolerance).map((s) => s.id);
    expect(expected.length).to.be.greaterThan(0);
    expect(el.atRisk).to.deep.equal(expected);
    const marked = rows(el)
      .filter((r) => r.getAttribute('part')!.includes('at-risk'))
      .map((r) => r.dataset.id);
    expect(marked).to.deep.equal(expected);
    expect(rows(el).find((r) => r.dataset.id === expected[0])!.textContent).to.contain('at risk (low margin)');
  });

  it('keyboard: ↓ moves through satellites, Enter fires tauline-satellite-select (bubbling, composed), Home/End jump', async () => {
    const el = await render(await heldFleet());
    root(el).querySelector<HTMLElement>('.plot-box')!.focus();
    await sendKeys({ press: 'ArrowDown' });
    await sendKeys({ press: 'ArrowDown' });
    await el.updateComplete;
    expect(root(el).querySelector('[aria-live]')!.textContent).to.match(/^VESPER-2: (held|at risk)/);
    const got = oneEvent(document, 'tauline-satellite-select');
    await sendKeys({ press: 'Enter' });
    const ev = await got;
    expect(ev.detail.id).to.equal('VESPER-2');
    expect(ev.detail.index).to.equal(1);
    expect(ev.composed && ev.bubbles).to.equal(true);
    expect(el.selected).to.equal('VESPER-2');
    expect(el.getAttribute('selected')).to.equal('VESPER-2');
    expect(rows(el)[1]!.getAttribute('aria-current')).to.equal('true');
    await sendKeys({ press: 'End' });
    await el.updateComplete;
    expect(root(el).querySelector('[aria-live]')!.textContent).to.contain('VESPER-4');
    await sendKeys({ press: 'Home' });
    await el.updateComplete;
    expect(root(el).querySelector('[aria-live]')!.textContent).to.contain('VESPER-1');
  });

  it('keyboard: → on a satellite steps through its uplinks in time order and announces each with its station', async () => {
    const data = await heldFleet();
    const el = await render(data);
    root(el).querySelector<HTMLElement>('.plot-box')!.focus();
    await sendKeys({ press: 'ArrowDown' });
    await sendKeys({ press: 'ArrowRight' });
    await el.updateComplete;
    const live = (): string => root(el).querySelector('[aria-live]')!.textContent!;
    const sat = data.plan.satellites[0]!;
    expect(live()).to.match(
      new RegExp(`^VESPER-1 uplink 1 of ${sat.commands.length}: frequency step .* via ${sat.commands[0]!.station}`),
    );
    await sendKeys({ press: 'ArrowRight' });
    await el.updateComplete;
    expect(live()).to.match(/^VESPER-1 uplink 2 of /);
  });

  it('keyboard: ↓ past the satellites reaches the station lanes, → steps through supports and Enter fires tauline-support-select', async () => {
    const data = await heldFleet();
    const el = await render(data);
    root(el).querySelector<HTMLElement>('.plot-box')!.focus();
    for (let k = 0; k < 6; k++) await sendKeys({ press: 'ArrowDown' });
    await el.updateComplete;
    const live = (): string => root(el).querySelector('[aria-live]')!.textContent!;
    expect(live()).to.match(/^CALLOWAY-RIDGE holds VESPER-\d/);
    await sendKeys({ press: 'ArrowRight' });
    await el.updateComplete;
    const got = oneEvent(el, 'tauline-support-select');
    await sendKeys({ press: ' ' });
    const ev = await got;
    const calloway = data.plan.stationSchedule.filter((s) => s.station === 'CALLOWAY-RIDGE');
    expect(ev.detail.support).to.deep.equal(calloway[1]);
    expect(ev.detail.station).to.equal('CALLOWAY-RIDGE');
    expect(data.plan.stationSchedule[ev.detail.index]).to.deep.equal(calloway[1]);
    expect(live()).to.contain(`holds ${calloway[1]!.satellite}`);
  });

  it('pointer: hovering a satellite row shows a read-out with its margin, a click selects it', async () => {
    const data = await heldFleet();
    const el = await render(data);
    const box = root(el).querySelector<HTMLElement>('.plot-box')!;
    const p = pointAt(el, 3 * 86400, 604800, 3);
    box.dispatchEvent(new PointerEvent('pointermove', { ...p, bubbles: true, pointerId: 1 }));
    await el.updateComplete;
    const tip = root(el).querySelector('[part~="tooltip"]')!;
    expect(tip.textContent).to.contain('VESPER-4');
    expect(tip.textContent).to.contain('Margin');
    expect(tip.textContent).to.contain('2027-02-04 00:00 UTC');
    const got = oneEvent(el, 'tauline-satellite-select');
    box.dispatchEvent(new PointerEvent('pointerdown', { ...p, bubbles: true, pointerId: 1, button: 0 }));
    box.dispatchEvent(new PointerEvent('pointerup', { ...p, bubbles: true, pointerId: 1, button: 0 }));
    expect((await got).detail.id).to.equal('VESPER-4');
  });

  it('pointer: clicking a support in a station lane fires tauline-support-select for it', async () => {
    const data = await heldFleet();
    const el = await render(data);
    const box = root(el).querySelector<HTMLElement>('.plot-box')!;
    const sup = data.plan.stationSchedule.find((s) => s.station === 'HARROWMERE')!;
    const ms = Date.parse(sup.start) - Date.parse(data.fleet.epoch) + (Date.parse(sup.end) - Date.parse(sup.start)) / 2;
    const p = pointAt(el, ms / 1000, 604800, 0, true);
    const got = oneEvent(el, 'tauline-support-select');
    box.dispatchEvent(new PointerEvent('pointerdown', { ...p, bubbles: true, pointerId: 2, button: 0 }));
    box.dispatchEvent(new PointerEvent('pointerup', { ...p, bubbles: true, pointerId: 2, button: 0 }));
    expect((await got).detail.support).to.deep.equal(sup);
  });

  it('the wheel zooms the time axis and fires tauline-view-change; setView() fires none', async () => {
    const el = await render(await heldFleet());
    let events = 0;
    el.addEventListener('tauline-view-change', () => {
      events += 1;
    });
    el.setView(86400, 2 * 86400);
    expect(el.view).to.deep.equal({ startSeconds: 86400, endSeconds: 172800 });
    expect(events).to.equal(0);
    const box = root(el).querySelector<HTMLElement>('.plot-box')!;
    const got = oneEvent(el, 'tauline-view-change');
    const at = pointAt(el, 1.5 * 86400, 604800, 0);
    box.dispatchEvent(new WheelEvent('wheel', { ...at, deltaY: -200, bubbles: true, cancelable: true }));
    const ev = await got;
    expect(ev.detail.endSeconds - ev.detail.startSeconds).to.be.below(86400);
  });

  it('theming: parts are exposed and component properties fall back to the page-level tokens', async () => {
    const el = await render(await strandedFleet());
    for (const part of ['base', 'summary', 'legend', 'plot', 'table', 'row', 'station-table']) {
      expect(root(el).querySelector(`[part~="${part}"]`), part).to.not.equal(null);
    }
    el.style.setProperty('--tauline-color-fail', 'rgb(1, 2, 3)');
    const cell = root(el).querySelector('td.risk')!;
    expect(getComputedStyle(cell).color).to.equal('rgb(1, 2, 3)');
    el.style.setProperty('--risk-color', 'rgb(4, 5, 6)');
    expect(getComputedStyle(cell).color).to.equal('rgb(4, 5, 6)');
  });

  it('names what is wrong: a missing fleet, a plan field, a fleet field, another fleet — with one warning each', async () => {
    const w = await captureWarnings();
    try {
      const data = await heldFleet();
      const el = await fixture<TaulineFleetTimeline>(html`<tauline-fleet-timeline></tauline-fleet-timeline>`);
      el.plan = data.plan;
      await el.updateComplete;
      expect(root(el).querySelector('[role="alert"]')!.textContent).to.contain('fleet is not set');
      const broken = structuredClone(data.plan);
      (broken.satellites[1]!.predicted as { t: unknown }).t = 'soon';
      el.fleet = data.fleet;
      el.plan = broken;
      await el.updateComplete;
      const alert = (): string => root(el).querySelector('[role="alert"]')!.textContent!;
      expect(alert()).to.contain('plan.satellites[1].predicted.t must be an array; received "soon"');
      const badFleet = structuredClone(data.fleet);
      badFleet.satellites[0]!.tolerance.phaseSeconds = -1;
      el.fleet = badFleet;
      el.plan = data.plan;
      await el.updateComplete;
      // The element's own guard of the fleet document (no longer the SDK's validateFleet) names the field.
      expect(alert()).to.contain('fleet.satellites[0].tolerance.phaseSeconds must be a finite number > 0; received -1');
      const other = structuredClone(data.fleet);
      other.satellites[3]!.id = 'VESPER-9';
      el.fleet = other;
      await el.updateComplete;
      expect(alert()).to.contain('plan.satellites[3].id must be "VESPER-9"');
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-fleet-plan']);
    } finally {
      w.restore();
    }
  });

  it('readFleetPlan(plan, fleet) names the first predicted time that does not increase, with both values', async () => {
    const { plan, fleet } = await heldFleet();
    const broken = structuredClone(plan);
    const t = Array.from(broken.satellites[2]!.predicted.t);
    const [t0 = Number.NaN, t1 = Number.NaN] = t;
    t[2] = t1;
    broken.satellites[2]!.predicted.t = t;
    const r = readFleetPlan(broken, fleet);
    expect(r.ok ? 'accepted' : r.error).to.equal(
      `plan.satellites[2].predicted.t[2] must be greater than t[1] (${t1}); received ${t1}`,
    );
    expect(t0 < t1).to.equal(true);
  });

  it('<tauline-fleet-timeline> reads every stamp with its timeScales property: a fleet after the bundled table (2028-02-01) is refused by default and drawn with a table that covers it', async () => {
    const { fleet, plan, timeScales } = await laterFleet();
    expect(fleet.epoch).to.equal('2028-02-01T00:00:00Z');
    const w = await captureWarnings();
    try {
      const el = await render({ fleet, plan });
      const alert = (): string | undefined => root(el).querySelector('[role="alert"]')?.textContent ?? undefined;
      // The SDK's bundled table is complete only until 2027-06-28 (its own source text): no leap-free guess.
      expect(alert()).to.contain("fleet.epoch must be inside the leap-second table of the element's timeScales");
      expect(alert()).to.contain('2027-06-28');
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-fleet-plan']);
      el.timeScales = timeScales;
      await drawn(el);
      expect(alert()).to.equal(undefined);
      // 604 800 s horizon, no leap second in the test table: one week later to the minute [C].
      const summary = root(el).querySelector('canvas.data')!.getAttribute('aria-label')!;
      expect(summary).to.contain('Fleet timeline from 2028-02-01 00:00 UTC to 2028-02-08 00:00 UTC');
      const view = readFleetPlan(plan, fleet, undefined, timeScales);
      expect(view.ok && view.view.satellites.map((s) => s.feasible)).to.deep.equal(
        plan.satellites.map((s) => s.feasible),
      );
    } finally {
      w.restore();
    }
  });
});
