import { fixture, html, expect, oneEvent } from '@open-wc/testing';
import { sendKeys } from '@web/test-runner-commands';
import '../src/steering-schedule/steering-schedule.define.js';
import type { TaulineSteeringSchedule } from '../src/steering-schedule/steering-schedule.js';
import { chartTimeToUtcMs, elapsedSecondsBetween, readPlan, utcStampMs } from '../src/steering-schedule/plan-data.js';
import { captureWarnings, makePlan, makeScenario } from './fixtures.js';

type Internals = {
  _scales: { sx: { map(v: number): number; invert(p: number): number }; sy: { map(v: number): number }; frame: { left: number; top: number; width: number; height: number } };
  _markers: Array<{ c: number; x: number; y: number }>;
};

async function render(attrs = ''): Promise<TaulineSteeringSchedule> {
  const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`);
  if (attrs) for (const a of attrs.split(' ')) { const [k, v] = a.split('='); el.setAttribute(k!, v ?? ''); }
  el.plan = makePlan();
  el.scenario = makeScenario();
  await el.updateComplete;
  return el;
}

function shadow(el: Element): ShadowRoot {
  return el.shadowRoot!;
}

describe('tauline-steering-schedule', () => {
  it('<tauline-steering-schedule> is accessible (axe-core) with a plan', async () => {
    const el = await render();
    await expect(el).to.be.accessible();
  });

  it('readPlan(plan, scenario) turns ISO times into seconds since the epoch and sorts commands', () => {
    const r = readPlan(makePlan(), makeScenario());
    expect(r.ok).to.equal(true);
    if (!r.ok) return;
    expect(r.view.commands.map((c) => c.executeAt)).to.deep.equal([30000, 110000, 190000]);
    expect(r.view.tolerance).to.equal(5e-9);
    expect(r.view.maneuvers[0]!.at).to.equal(90000);
    expect(r.view.contacts.length).to.equal(3);
  });

  it('renders a command table with a row per command, kinds and steps with units', async () => {
    const el = await render();
    const rows = shadow(el).querySelectorAll('tbody tr');
    expect(rows.length).to.equal(3);
    const first = [...rows[0]!.querySelectorAll('td')].map((td) => td.textContent!.trim());
    // Uplink before Executes, in the order the CLI prints them.
    const head = [...shadow(el).querySelectorAll('thead th')].map((th) => th.textContent!.trim());
    expect(head.slice(1, 3)).to.deep.equal(['Uplink', 'Executes']);
    expect(first[0]).to.equal('2031-04-02 05:33:20 UTC');
    expect(first[1]).to.equal('2031-04-02 08:20:00 UTC');
    expect(first[2]).to.equal('frequency');
    expect(first[3]).to.equal('−6.000e−14');
    const third = [...rows[2]!.querySelectorAll('td')].map((td) => td.textContent!.trim());
    expect(third[3]).to.equal('−1.5 ns');
  });

  it('the canvas gets an accessible name computed from the data', async () => {
    const el = await render();
    const label = shadow(el).querySelector('canvas.data')!.getAttribute('aria-label')!;
    expect(label).to.contain('2031-04-02 00:00 UTC to 2031-04-05 00:00 UTC');
    expect(label).to.contain('3 commands (2 frequency, 1 phase)');
    expect(label).to.contain('tolerance of ±5 ns');
  });

  it('command markers differ by shape: triangles for frequency steps (by sign), a diamond for the phase step', async () => {
    const { commandShape } = await import('../src/steering-schedule/steering-schedule.js');
    expect(commandShape({ kind: 'frequency', step: -1e-14 })).to.equal('triangle-down');
    expect(commandShape({ kind: 'frequency', step: 1e-14 })).to.equal('triangle-up');
    expect(commandShape({ kind: 'phase', step: 1e-9 })).to.equal('diamond');
    const el = await render();
    expect((el as unknown as Internals)._markers.length).to.equal(3);
  });

  it('clicking a marker fires tauline-command-select (bubbling, composed) and highlights the row', async () => {
    const el = await render();
    const m = (el as unknown as Internals)._markers[1]!;
    const box = shadow(el).querySelector<HTMLElement>('.plot-box')!;
    const r = box.getBoundingClientRect();
    const init = { clientX: r.left + m.x, clientY: r.top + m.y, bubbles: true, pointerId: 1, button: 0 };
    setTimeout(() => {
      box.dispatchEvent(new PointerEvent('pointerdown', init));
      box.dispatchEvent(new PointerEvent('pointerup', init));
    });
    const ev = await oneEvent(document, 'tauline-command-select');
    expect(ev.detail.index).to.equal(1);
    expect(ev.detail.executeAtSeconds).to.equal(110000);
    expect(ev.detail.command.reason).to.equal('trim after manoeuvre');
    await el.updateComplete;
    expect(shadow(el).querySelector('tr[aria-current="true"]')!.getAttribute('data-index')).to.equal('1');
  });

  it('clicking a table row selects its command and fires the event', async () => {
    const el = await render();
    const row = shadow(el).querySelectorAll<HTMLElement>('tbody tr')[2]!;
    setTimeout(() => row.click());
    const ev = await oneEvent(el, 'tauline-command-select');
    expect(ev.detail.index).to.equal(2);
    expect(el.selectedIndex).to.equal(2);
  });

  it('setting plan, scenario or selectedIndex from the host fires no event', async () => {
    let fired = 0;
    const count = (): void => { fired++; };
    document.addEventListener('tauline-command-select', count);
    document.addEventListener('tauline-view-change', count);
    try {
      const el = await render();
      el.selectedIndex = 1;
      el.setView(10000, 50000);
      el.plan = makePlan();
      await el.updateComplete;
      expect(fired).to.equal(0);
    } finally {
      document.removeEventListener('tauline-command-select', count);
      document.removeEventListener('tauline-view-change', count);
    }
  });

  it('keyboard: → selects the next command, Shift+→ pans, + zooms, Home resets', async () => {
    const el = await render();
    const box = shadow(el).querySelector<HTMLElement>('.plot-box')!;
    box.focus();
    const selects: number[] = [];
    const views: Array<{ startSeconds: number; endSeconds: number }> = [];
    el.addEventListener('tauline-command-select', (e) => selects.push(e.detail.index));
    el.addEventListener('tauline-view-change', (e) => views.push(e.detail));
    await sendKeys({ press: 'ArrowRight' });
    await sendKeys({ press: 'ArrowRight' });
    await sendKeys({ press: 'ArrowLeft' });
    expect(selects).to.deep.equal([0, 1, 0]);
    await el.updateComplete;
    expect(shadow(el).querySelector('[aria-live]')!.textContent).to.contain('Command 1 of 3');
    await sendKeys({ press: '+' });
    expect(views.length).to.equal(1);
    const zoomed = views[0]!;
    expect(zoomed.endSeconds - zoomed.startSeconds).to.be.closeTo(0.8 * 259200, 1e-6);
    await sendKeys({ down: 'Shift' });
    await sendKeys({ press: 'ArrowRight' });
    await sendKeys({ up: 'Shift' });
    expect(views[1]!.startSeconds).to.be.greaterThan(zoomed.startSeconds);
    await sendKeys({ press: 'Home' });
    expect(el.view).to.deep.equal({ startSeconds: 0, endSeconds: 259200 });
  });

  it('mouse: the wheel zooms around the cursor and a drag pans, each firing tauline-view-change', async () => {
    const el = await render();
    const box = shadow(el).querySelector<HTMLElement>('.plot-box')!;
    const r = box.getBoundingClientRect();
    const sc = (el as unknown as Internals)._scales;
    const cx = r.left + sc.frame.left + sc.frame.width / 2, cy = r.top + sc.frame.top + 20;
    const anchor = sc.sx.invert(cx - r.left);
    setTimeout(() => box.dispatchEvent(new WheelEvent('wheel', { deltaY: -200, clientX: cx, clientY: cy, bubbles: true, cancelable: true })));
    const z = await oneEvent(el, 'tauline-view-change');
    expect(z.detail.endSeconds - z.detail.startSeconds).to.be.lessThan(259200);
    expect(z.detail.startSeconds).to.be.lessThan(anchor);
    expect(z.detail.endSeconds).to.be.greaterThan(anchor);
    await el.updateComplete;
    const before = el.view!.startSeconds;
    setTimeout(() => {
      box.dispatchEvent(new PointerEvent('pointerdown', { clientX: cx, clientY: cy, pointerId: 7, bubbles: true }));
      box.dispatchEvent(new PointerEvent('pointermove', { clientX: cx - 100, clientY: cy, pointerId: 7, bubbles: true }));
      box.dispatchEvent(new PointerEvent('pointerup', { clientX: cx - 100, clientY: cy, pointerId: 7, bubbles: true }));
    });
    const p = await oneEvent(el, 'tauline-view-change');
    expect(p.detail.startSeconds).to.be.greaterThan(before);
  });

  it('touch: a two-finger pinch zooms', async () => {
    const el = await render();
    const box = shadow(el).querySelector<HTMLElement>('.plot-box')!;
    const r = box.getBoundingClientRect();
    const y = r.top + 100, mid = r.left + 380;
    const pe = (type: string, id: number, x: number) => new PointerEvent(type, { clientX: x, clientY: y, pointerId: id, pointerType: 'touch', bubbles: true });
    box.dispatchEvent(pe('pointerdown', 1, mid - 50));
    box.dispatchEvent(pe('pointerdown', 2, mid + 50));
    box.dispatchEvent(pe('pointermove', 1, mid - 150));
    box.dispatchEvent(pe('pointermove', 2, mid + 150));
    const done = oneEvent(el, 'tauline-view-change');
    box.dispatchEvent(pe('pointerup', 1, mid - 150));
    box.dispatchEvent(pe('pointerup', 2, mid + 150));
    const ev = await done;
    expect(ev.detail.endSeconds - ev.detail.startSeconds).to.be.closeTo(259200 / 3, 259200 * 0.01);
  });

  it('hover shows a read-out with UTC time and the offset in the axis unit', async () => {
    const el = await render('y-unit=ns');
    const box = shadow(el).querySelector<HTMLElement>('.plot-box')!;
    const r = box.getBoundingClientRect();
    const sc = (el as unknown as Internals)._scales;
    box.dispatchEvent(new PointerEvent('pointermove', { clientX: r.left + sc.sx.map(0) + 0.2, clientY: r.top + sc.frame.top + 5, bubbles: true }));
    await el.updateComplete;
    const tip = shadow(el).querySelector('[part="tooltip"]')!.textContent!;
    expect(tip).to.contain('2031-04-02 00:00:00 UTC');
    expect(tip).to.match(/Steered\s*2 ns/);
    expect(tip).to.contain('±5 ns');
  });

  it('y-unit, sigma-multiple and no-table attributes map to properties', async () => {
    const el = await render('y-unit=us sigma-multiple=3 no-table');
    expect(el.yUnit).to.equal('us');
    expect(el.sigmaMultiple).to.equal(3);
    expect(el.noTable).to.equal(true);
    expect(shadow(el).querySelector('[part="legend"]')!.textContent).to.contain('±3σ uncertainty');
  });

  it('theming: --tauline-color-steered set on the page colours the steered line on the canvas', async () => {
    const wrap = await fixture<HTMLDivElement>(html`<div style="--tauline-color-steered: rgb(255, 0, 0); --tauline-color-uncertainty: rgb(0, 0, 255)"><tauline-steering-schedule style="width: 600px"></tauline-steering-schedule></div>`);
    const el = wrap.querySelector('tauline-steering-schedule')!;
    const flat = makePlan();
    flat.predicted.steered.phaseSeconds.fill(0);
    el.plan = flat;
    el.scenario = makeScenario();
    await el.updateComplete;
    const canvas = shadow(el).querySelector<HTMLCanvasElement>('canvas.data')!;
    const sc = (el as unknown as Internals)._scales;
    const ratio = canvas.width / canvas.getBoundingClientRect().width;
    const px = canvas.getContext('2d')!.getImageData(Math.round((sc.frame.left + 40) * ratio), Math.round(sc.sy.map(0) * ratio), 1, 1).data;
    expect([px[0], px[1], px[2]]).to.deep.equal([255, 0, 0]);
  });

  it('10^6 samples render through decimation: far fewer path vertices than samples', async () => {
    const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule style="width: 800px"></tauline-steering-schedule>`);
    el.plan = makePlan({ samples: 1_000_000 });
    el.scenario = makeScenario();
    await el.updateComplete;
    expect(shadow(el).querySelector('canvas.data')!.getAttribute('aria-label')).to.contain('3 commands');
    const { decimateLine, visibleRange } = await import('../src/internal/decimate.js');
    const d = (el as unknown as { _data: { t: Float64Array; steered: Float64Array } })._data;
    const [a, b] = visibleRange(d.t, 0, 259200);
    expect(decimateLine(d.t, d.steered, a, b, 0, 259200, 700).length).to.be.lessThan(3000);
  });

  it('error states: no plan, a malformed plan, a plan without epoch; each warns once and never throws', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule></tauline-steering-schedule>`);
      expect(shadow(el).querySelector('.state')!.textContent).to.contain('No steering plan');
      el.plan = { predicted: { t: [0, 1], steered: { phaseSeconds: [0] } } };
      el.scenario = makeScenario();
      await el.updateComplete;
      expect(shadow(el).querySelector('.state.error')!.textContent).to.contain('has 1 values but t has 2');
      el.plan = makePlan();
      el.scenario = { epoch: 'yesterday' };
      await el.updateComplete;
      expect(shadow(el).querySelector('.state.error')!.textContent).to.contain('scenario.epoch');
      el.plan = { predicted: { t: [0, 0], steered: { phaseSeconds: [0, 0] } } };
      el.scenario = makeScenario();
      await el.updateComplete;
      expect(shadow(el).querySelector('.state.error')!.textContent).to.contain('strictly ascending');
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-plan']);
    } finally { w.restore(); }
  });

  it('the plan\'s caution is shown next to the table (flight-configuration outputs carry it)', async () => {
    const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule></tauline-steering-schedule>`);
    el.plan = { ...makePlan(), caution: 'Verify against the mission interface specification.' };
    el.scenario = makeScenario();
    await el.updateComplete;
    expect(shadow(el).querySelector('.caution')!.textContent).to.contain('Verify against');
  });

  it('a plan with NaN or Infinity in its series shows an alert and an invalid-data badge, never "feasible", and warns once', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`);
      const plan = makePlan();
      plan.predicted.steered.phaseSeconds[10] = Number.NaN;
      plan.predicted.unsteered.sigmaSeconds = Float64Array.from(plan.predicted.unsteered.sigmaSeconds, (v, i) => (i === 3 ? Infinity : v));
      el.plan = plan;
      el.scenario = makeScenario();
      await el.updateComplete;
      const alert = shadow(el).querySelector('[role="alert"]')!;
      expect(alert.textContent).to.contain('plan.predicted.steered.phaseSeconds holds 1 non-finite value (first at index 10: NaN)');
      expect(alert.textContent).to.contain('plan.predicted.unsteered.sigmaSeconds holds 1 non-finite value (first at index 3: Infinity)');
      const badge = shadow(el).querySelector('.badge')!.textContent!;
      expect(badge).to.contain('invalid data');
      expect(badge).to.not.contain('feasible');
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-plan-values']);
    } finally { w.restore(); }
  });

  it('a scenario with a NaN tolerance shows an alert naming scenario.tolerance.phaseSeconds instead of a "feasible" badge', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`);
      el.plan = makePlan();
      el.scenario = { ...makeScenario(), tolerance: { phaseSeconds: Number.NaN, probability: 0.95 } };
      await el.updateComplete;
      expect(shadow(el).querySelector('[role="alert"]')!.textContent).to.contain('scenario.tolerance.phaseSeconds must be a positive number of seconds; received NaN');
      expect(shadow(el).querySelector('.badge')!.textContent).to.not.contain('feasible');
      expect(w.list.length).to.equal(1);
    } finally { w.restore(); }
  });

  it('an infeasible plan shows its reason and a not-feasible badge (text and symbol)', async () => {
    const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule></tauline-steering-schedule>`);
    el.plan = { ...makePlan(), feasible: false, reason: 'The actuator range cannot hold the tolerance after the manoeuvre.' };
    el.scenario = makeScenario();
    await el.updateComplete;
    expect(shadow(el).querySelector('.badge')!.textContent).to.contain('✕ not feasible');
    expect(shadow(el).querySelector('[role="note"]')!.textContent).to.contain('actuator range');
  });
});

// Leap second at the end of 2016-12-31 (TAI − UTC 36 s → 37 s from 2017-01-01; IERS Bulletin C 52 [M],
// the same step as in the SDK's bundled table). A plan spanning it: elapsed SI seconds count it.
describe('tauline-steering-schedule across a leap second', () => {
  const epoch = '2016-12-31T12:00:00Z';
  function leapPlan() {
    const n = 97;
    const t = Float64Array.from({ length: n }, (_, i) => i * 900); // 24 h on a 15 min grid, elapsed SI seconds
    const phase = Float64Array.from(t, (s) => 1e-9 + 1e-14 * s);
    return {
      feasible: true,
      commands: [
        { uplinkAt: '2016-12-31T20:00:00Z', executeAt: '2017-01-01T06:00:00Z', kind: 'frequency', fractionalFrequencyStep: -1e-13, actuatorSteps: -10, reason: 'after the leap second' },
        { uplinkAt: '2016-12-31T20:00:00Z', executeAt: '2016-12-31T23:59:60Z', kind: 'phase', phaseStepSeconds: 1e-9, actuatorSteps: 10, reason: 'inside the leap second' },
        { uplinkAt: '2016-12-31T20:00:00Z', executeAt: '2016-12-31T23:59:59Z', kind: 'phase', phaseStepSeconds: 1e-9, actuatorSteps: 10, reason: 'before it' },
      ],
      predicted: { t, steered: { phaseSeconds: phase, sigmaSeconds: phase }, unsteered: { phaseSeconds: phase, sigmaSeconds: phase } },
      metrics: { commandCount: 3 },
    };
  }
  const scenario = {
    epoch, horizonSeconds: 86_401, tolerance: { phaseSeconds: 5e-9, probability: 0.95 },
    contacts: [{ start: '2016-12-31T23:59:30Z', end: '2017-01-01T00:00:30Z' }],
    maneuvers: [],
  };

  it('utcStampMs(text) reads 23:59:60 as the 86 400th second of its day, where Date.parse gives NaN', () => {
    expect(Number.isNaN(Date.parse('2016-12-31T23:59:60Z'))).to.equal(true);
    expect(utcStampMs('2016-12-31T23:59:60Z')).to.equal(Date.UTC(2017, 0, 1));
    expect(utcStampMs('2016-12-31T23:59:60.5Z')).to.equal(Date.UTC(2017, 0, 1) + 500);
    expect(utcStampMs('2017-01-01T01:00:00+01:00')).to.equal(Date.UTC(2017, 0, 1));
    for (const bad of ['2016-12-31T23:58:60Z', '2016-13-01T00:00:00Z', '2017-02-29T00:00:00Z', '2016-12-31T23:59:59', 'noon']) {
      expect(Number.isNaN(utcStampMs(bad)), bad).to.equal(true);
    }
  });

  it('elapsedSecondsBetween(epoch, stamp) counts the leap second (43 200 s to 23:59:60, 43 201 s to midnight), and falls back to the leap-free count outside the bundled table', () => {
    expect(elapsedSecondsBetween(epoch, '2016-12-31T23:59:59Z')).to.equal(43_199);
    expect(elapsedSecondsBetween(epoch, '2016-12-31T23:59:60Z')).to.equal(43_200);
    expect(elapsedSecondsBetween(epoch, '2017-01-01T00:00:00Z')).to.equal(43_201);
    expect(elapsedSecondsBetween(epoch, '2017-01-01T06:00:00Z')).to.equal(64_801);
    // 2031 lies after the bundled table's expiry: leap-free count, no NaN.
    expect(elapsedSecondsBetween('2031-04-02T00:00:00Z', '2031-04-02T01:00:00Z')).to.equal(3600);
    expect(Number.isNaN(elapsedSecondsBetween(epoch, 'noon'))).to.equal(true);
  });

  it('readPlan(plan, scenario) places commands at elapsed SI seconds across the leap second, none dropped', () => {
    const r = readPlan(leapPlan(), scenario);
    expect(r.ok).to.equal(true);
    if (!r.ok) return;
    expect(r.view.problems).to.deep.equal([]);
    expect(r.view.commands.map((c) => c.executeAt)).to.deep.equal([43_199, 43_200, 64_801]);
    expect(r.view.contacts).to.deep.equal([{ start: 43_170, end: 43_231 }]);
    expect(r.view.leapSeconds).to.deep.equal([{ end: 43_201, step: 1 }]);
    // Labels: 06:00:00 UTC after the leap second, not 06:00:01.
    expect(chartTimeToUtcMs(r.view, 64_801)).to.equal(Date.UTC(2017, 0, 1, 6));
    expect(chartTimeToUtcMs(r.view, 43_199)).to.equal(Date.UTC(2016, 11, 31, 23, 59, 59));
  });

  it('<tauline-steering-schedule> shows the command after the leap second at 06:00:00 UTC in its table', async () => {
    const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`);
    el.plan = leapPlan();
    el.scenario = scenario;
    await el.updateComplete;
    const rows = [...shadow(el).querySelectorAll('tbody tr')];
    expect(rows.length).to.equal(3);
    const cells = [...rows[2]!.querySelectorAll('td')].map((td) => td.textContent!.trim());
    expect(cells[1]).to.equal('2017-01-01 06:00:00 UTC');
  });
});
