import { expect, fixture, html, oneEvent } from '@open-wc/testing';
import { sendKeys } from '@web/test-runner-commands';
import '../../src/steering-schedule/steering-schedule.define.js';
import { decimateLine, visibleRange } from '../../src/internal/decimate.js';
import { commandShape } from '../../src/steering-schedule/schedule-draw.js';
import type { TaulineSteeringSchedule } from '../../src/steering-schedule/steering-schedule.js';
import { captureWarnings, halcyrPhasePlan, orinPlan, secondsFrom, tableStamp } from '../fixtures.js';
import { pixelAt, publicLayout } from './public-layout.js';

// ORIN-3 (packages/sdk/examples/steering/orin-3-meo.json, SOURCE.md): 7 days from 2027-02-08T00:00:00Z.
const SPAN = 7 * 86_400;

/** The element's number style: typographic minus (U+2212) for signs and exponents. */
const typographic = (text: string): string => text.replace(/-/g, '−');

async function render(attrs = '', source = orinPlan): Promise<TaulineSteeringSchedule> {
  const el = await fixture<TaulineSteeringSchedule>(
    html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`,
  );
  if (attrs)
    for (const a of attrs.split(' ')) {
      const [k, v] = a.split('=');
      el.setAttribute(k!, v ?? '');
    }
  const { plan, scenario } = await source();
  el.plan = plan;
  el.scenario = scenario;
  await el.updateComplete;
  return el;
}

const shadow = (el: Element): ShadowRoot => el.shadowRoot!;
const cells = (row: Element): string[] => [...row.querySelectorAll('td')].map((td) => td.textContent!.trim());

describe('tauline-steering-schedule', () => {
  it('<tauline-steering-schedule> is accessible (axe-core) with the ORIN-3 plan of the SDK', async () => {
    const el = await render();
    await expect(el).to.be.accessible();
  });

  it('<tauline-steering-schedule> lists every command of the SDK plan in its table, stamps in UTC, steps with units', async () => {
    const el = await render();
    const { plan } = await orinPlan();
    const rows = shadow(el).querySelectorAll('tbody tr');
    expect(rows.length).to.equal(plan.commands.length);
    // Uplink before Executes, in the order the CLI prints them.
    const head = [...shadow(el).querySelectorAll('thead th')].map((th) => th.textContent!.trim());
    expect(head.slice(1, 3)).to.deep.equal(['Uplink', 'Executes']);
    plan.commands.forEach((c, k) => {
      const [uplink, executes, kind, step] = cells(rows[k]!);
      expect([uplink, executes, kind]).to.deep.equal([tableStamp(c.uplinkAt), tableStamp(c.executeAt), 'frequency']);
      expect(step).to.equal(
        typographic(`${c.fractionalFrequencyStep! >= 0 ? '+' : ''}${c.fractionalFrequencyStep!.toExponential(3)}`),
      );
    });
  });

  it('<tauline-steering-schedule> shows a phase step in nanoseconds with a diamond marker (HALCYR-G1 started 40 ns off)', async () => {
    const el = await render('', halcyrPhasePlan);
    const { plan } = await halcyrPhasePlan();
    const first = plan.commands[0]!;
    expect(first.kind).to.equal('phase');
    const [, , kind, step] = cells(shadow(el).querySelectorAll('tbody tr')[0]!);
    expect(kind).to.equal('phase');
    expect(step).to.equal(typographic(`${Number((first.phaseStepSeconds! * 1e9).toPrecision(4))} ns`));
    expect(shadow(el).querySelector('[part="legend"]')!.textContent).to.contain('Phase step');
  });

  it('the canvas gets an accessible name computed from the data', async () => {
    const el = await render();
    const label = shadow(el).querySelector('canvas.data')!.getAttribute('aria-label')!;
    expect(label).to.contain('2027-02-08 00:00 UTC to 2027-02-15 00:00 UTC');
    expect(label).to.contain('3 commands (3 frequency, 0 phase)');
    expect(label).to.contain('tolerance of ±30 ns');
    expect(label).to.contain('plan feasible');
  });

  it('commandShape(c) is a triangle pointing the way of a frequency step and a diamond for a phase step; markers are painted', async () => {
    expect(commandShape({ kind: 'frequency', step: -1e-14 })).to.equal('triangle-down');
    expect(commandShape({ kind: 'frequency', step: 1e-14 })).to.equal('triangle-up');
    expect(commandShape({ kind: 'phase', step: 1e-9 })).to.equal('diamond');
    const el = await render();
    const { markers } = publicLayout(el);
    expect(markers.length).to.equal(3);
    for (const m of markers) expect(pixelAt(el, m.x, m.y)[3], `marker ${m.c}`).to.be.greaterThan(0);
  });

  it('clicking a marker fires tauline-command-select (bubbling, composed) and highlights the row', async () => {
    const el = await render();
    const { plan, scenario } = await orinPlan();
    const { markers, rect, box } = publicLayout(el);
    const m = markers[1]!;
    const init = { clientX: rect.left + m.x, clientY: rect.top + m.y, bubbles: true, pointerId: 1, button: 0 };
    setTimeout(() => {
      box.dispatchEvent(new PointerEvent('pointerdown', init));
      box.dispatchEvent(new PointerEvent('pointerup', init));
    });
    const ev = await oneEvent(document, 'tauline-command-select');
    expect(ev.detail.index).to.equal(1);
    expect(ev.detail.executeAtSeconds).to.equal(secondsFrom(scenario.epoch, plan.commands[1]!.executeAt));
    expect(ev.detail.command.reason).to.equal(plan.commands[1]!.reason);
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

  it('setting plan, scenario, selectedIndex or the view from the host fires no event', async () => {
    let fired = 0;
    const count = (): void => {
      fired++;
    };
    document.addEventListener('tauline-command-select', count);
    document.addEventListener('tauline-view-change', count);
    try {
      const el = await render();
      el.selectedIndex = 1;
      el.setView(10000, 50000);
      el.plan = (await orinPlan()).plan;
      await el.updateComplete;
      el.resetView();
      expect(fired).to.equal(0);
      expect(el.view).to.deep.equal({ startSeconds: 0, endSeconds: SPAN });
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
    expect(zoomed.endSeconds - zoomed.startSeconds).to.be.closeTo(0.8 * SPAN, 1e-6);
    await sendKeys({ down: 'Shift' });
    await sendKeys({ press: 'ArrowRight' });
    await sendKeys({ up: 'Shift' });
    expect(views[1]!.startSeconds).to.be.greaterThan(zoomed.startSeconds);
    await sendKeys({ press: 'Home' });
    expect(el.view).to.deep.equal({ startSeconds: 0, endSeconds: SPAN });
  });

  it('mouse: the wheel zooms around the cursor and a drag pans, each firing tauline-view-change', async () => {
    const el = await render();
    const { layout, rect, box } = publicLayout(el);
    const { frame, sx } = layout.scales;
    const cx = rect.left + frame.left + frame.width / 2,
      cy = rect.top + frame.top + 20;
    const anchor = sx.invert(cx - rect.left);
    setTimeout(() =>
      box.dispatchEvent(
        new WheelEvent('wheel', { deltaY: -200, clientX: cx, clientY: cy, bubbles: true, cancelable: true }),
      ),
    );
    const z = await oneEvent(el, 'tauline-view-change');
    expect(z.detail.endSeconds - z.detail.startSeconds).to.be.lessThan(SPAN);
    expect(z.detail.startSeconds).to.be.lessThan(anchor);
    expect(z.detail.endSeconds).to.be.greaterThan(anchor);
    await el.updateComplete;
    const before = el.view!.startSeconds;
    setTimeout(() => {
      box.dispatchEvent(new PointerEvent('pointerdown', { clientX: cx, clientY: cy, pointerId: 7, bubbles: true }));
      box.dispatchEvent(
        new PointerEvent('pointermove', { clientX: cx - 100, clientY: cy, pointerId: 7, bubbles: true }),
      );
      box.dispatchEvent(new PointerEvent('pointerup', { clientX: cx - 100, clientY: cy, pointerId: 7, bubbles: true }));
    });
    const p = await oneEvent(el, 'tauline-view-change');
    expect(p.detail.startSeconds).to.be.greaterThan(before);
  });

  it('touch: a two-finger pinch zooms', async () => {
    const el = await render();
    const box = shadow(el).querySelector<HTMLElement>('.plot-box')!;
    const r = box.getBoundingClientRect();
    const y = r.top + 100,
      mid = r.left + 380;
    const pe = (type: string, id: number, x: number) =>
      new PointerEvent(type, { clientX: x, clientY: y, pointerId: id, pointerType: 'touch', bubbles: true });
    box.dispatchEvent(pe('pointerdown', 1, mid - 50));
    box.dispatchEvent(pe('pointerdown', 2, mid + 50));
    box.dispatchEvent(pe('pointermove', 1, mid - 150));
    box.dispatchEvent(pe('pointermove', 2, mid + 150));
    const done = oneEvent(el, 'tauline-view-change');
    box.dispatchEvent(pe('pointerup', 1, mid - 150));
    box.dispatchEvent(pe('pointerup', 2, mid + 150));
    const ev = await done;
    expect(ev.detail.endSeconds - ev.detail.startSeconds).to.be.closeTo(SPAN / 3, SPAN * 0.01);
  });

  it('hover shows a read-out with UTC time and the offset in the axis unit', async () => {
    const el = await render('y-unit=ns');
    const { plan } = await orinPlan();
    const { layout, rect, box } = publicLayout(el);
    box.dispatchEvent(
      new PointerEvent('pointermove', {
        clientX: rect.left + layout.scales.sx.map(0) + 0.2,
        clientY: rect.top + layout.scales.frame.top + 5,
        bubbles: true,
      }),
    );
    await el.updateComplete;
    const tip = shadow(el).querySelector('[part="tooltip"]')!.textContent!;
    expect(tip).to.contain('2027-02-08 00:00:00 UTC');
    const steeredNs = Number((plan.predicted.steered.phaseSeconds[0]! * 1e9).toPrecision(4));
    expect(tip).to.match(new RegExp(`Steered\\s*${typographic(String(steeredNs))} ns`));
    expect(tip).to.contain('±30 ns');
  });

  it('y-unit, sigma-multiple and no-table attributes map to properties', async () => {
    const el = await render('y-unit=us sigma-multiple=3 no-table');
    expect(el.yUnit).to.equal('us');
    expect(el.sigmaMultiple).to.equal(3);
    expect(el.noTable).to.equal(true);
    expect(shadow(el).querySelector('[part="legend"]')!.textContent).to.contain('±3σ uncertainty');
  });

  it('theming: --tauline-color-steered set on the page colours the steered line on the canvas', async () => {
    const wrap = await fixture<HTMLDivElement>(
      html`<div style="--tauline-color-steered: rgb(255, 0, 0); --tauline-color-uncertainty: rgb(0, 0, 255)"><tauline-steering-schedule style="width: 600px"></tauline-steering-schedule></div>`,
    );
    const el = wrap.querySelector('tauline-steering-schedule')!;
    const { plan, scenario } = await orinPlan();
    plan.predicted.steered.phaseSeconds.fill(0);
    el.plan = plan;
    el.scenario = scenario;
    await el.updateComplete;
    const { layout } = publicLayout(el);
    // Between the first two contact windows (05:10 and 17:40 UTC), so no shading lies under the line.
    expect(pixelAt(el, layout.scales.sx.map(8 * 3600), layout.scales.sy.map(0)).slice(0, 3)).to.deep.equal([255, 0, 0]);
  });

  it('10^6 samples (the ORIN-3 prediction interpolated) render through decimation: far fewer path vertices than samples', async () => {
    const el = await fixture<TaulineSteeringSchedule>(
      html`<tauline-steering-schedule style="width: 800px"></tauline-steering-schedule>`,
    );
    const { plan, scenario } = await orinPlan();
    const n = 1_000_000;
    const t = Float64Array.from({ length: n }, (_, i) => (SPAN * i) / (n - 1));
    const at = (col: readonly number[]) =>
      Float64Array.from(t, (s) => {
        const k = Math.min(col.length - 2, Math.floor(s / 900));
        return col[k]! + ((col[k + 1]! - col[k]!) * (s - 900 * k)) / 900;
      });
    const { steered, unsteered } = plan.predicted;
    el.plan = {
      ...plan,
      predicted: {
        t,
        steered: { phaseSeconds: at(steered.phaseSeconds), sigmaSeconds: at(steered.sigmaSeconds) },
        unsteered: { phaseSeconds: at(unsteered.phaseSeconds), sigmaSeconds: at(unsteered.sigmaSeconds) },
      },
    };
    el.scenario = scenario;
    await el.updateComplete;
    expect(shadow(el).querySelector('canvas.data')!.getAttribute('aria-label')).to.contain('3 commands');
    const { view } = publicLayout(el);
    const [a, b] = visibleRange(view.t, 0, SPAN);
    expect(decimateLine(view.t, view.steered, a, b, 0, SPAN, 700).length).to.be.lessThan(3000);
  });

  it('error states: no plan, a field breaking the SDK contract, an unreadable epoch; each names the field and warns once', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule></tauline-steering-schedule>`);
      expect(shadow(el).querySelector('.state')!.textContent).to.contain('No steering plan');
      const { plan, scenario } = await orinPlan();
      el.plan = {
        ...plan,
        predicted: { ...plan.predicted, steered: { ...plan.predicted.steered, phaseSeconds: [0] } },
      };
      el.scenario = scenario;
      await el.updateComplete;
      expect(shadow(el).querySelector('.state.error')!.textContent).to.contain(
        `plan.predicted.steered.phaseSeconds must be ${plan.predicted.t.length} values (as many as plan.predicted.t); received an array of 1`,
      );
      el.plan = plan;
      el.scenario = { ...scenario, epoch: 'yesterday' };
      await el.updateComplete;
      expect(shadow(el).querySelector('.state.error')!.textContent).to.contain('scenario.epoch');
      el.plan = { ...plan, predicted: { ...plan.predicted, t: plan.predicted.t.map(() => 0) } };
      el.scenario = scenario;
      await el.updateComplete;
      expect(shadow(el).querySelector('.state.error')!.textContent).to.contain('strictly ascending');
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-plan']);
    } finally {
      w.restore();
    }
  });

  it('a scenario epoch after the bundled leap-second table shows an error naming scenario.epoch (no leap-free guess), and the plan shows again once the scenario is fixed', async () => {
    const w = await captureWarnings();
    try {
      const el = await render();
      const { plan, scenario } = await orinPlan();
      el.scenario = { ...scenario, epoch: '2031-02-08T00:00:00Z' };
      await el.updateComplete;
      expect(shadow(el).querySelector('.state.error')!.textContent).to.contain('scenario.epoch');
      el.plan = plan;
      el.scenario = scenario;
      await el.updateComplete;
      expect(shadow(el).querySelector('.state.error')).to.equal(null);
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-plan']);
    } finally {
      w.restore();
    }
  });

  it("the SDK plan's caution is shown next to the table (flight-configuration outputs carry it)", async () => {
    const el = await render();
    const { plan } = await orinPlan();
    expect(plan.caution).to.match(/^Caution: /);
    expect(shadow(el).querySelector('.caution')!.textContent).to.equal(plan.caution);
  });

  it('a plan with NaN or Infinity in its series shows an alert and an invalid-data badge, never "feasible", and warns once', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineSteeringSchedule>(
        html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`,
      );
      const { plan, scenario } = await orinPlan();
      plan.predicted.steered.phaseSeconds[10] = Number.NaN;
      plan.predicted.unsteered.sigmaSeconds[3] = Infinity;
      el.plan = plan;
      el.scenario = scenario;
      await el.updateComplete;
      const alert = shadow(el).querySelector('[role="alert"]')!;
      expect(alert.textContent).to.contain(
        'plan.predicted.steered.phaseSeconds holds 1 non-finite value (first at index 10: NaN)',
      );
      expect(alert.textContent).to.contain(
        'plan.predicted.unsteered.sigmaSeconds holds 1 non-finite value (first at index 3: Infinity)',
      );
      const badge = shadow(el).querySelector('.badge')!.textContent!;
      expect(badge).to.contain('invalid data');
      expect(badge).to.not.contain('feasible');
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-plan-values']);
    } finally {
      w.restore();
    }
  });

  it('a scenario with a NaN tolerance shows an alert naming scenario.tolerance.phaseSeconds instead of a "feasible" badge', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineSteeringSchedule>(
        html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`,
      );
      const { plan, scenario } = await orinPlan();
      el.plan = plan;
      el.scenario = { ...scenario, tolerance: { phaseSeconds: Number.NaN, probability: 0.95 } };
      await el.updateComplete;
      expect(shadow(el).querySelector('[role="alert"]')!.textContent).to.contain(
        'scenario.tolerance.phaseSeconds must be a positive number of seconds; received NaN',
      );
      expect(shadow(el).querySelector('.badge')!.textContent).to.not.contain('feasible');
      expect(w.list.length).to.equal(1);
    } finally {
      w.restore();
    }
  });

  it('an infeasible SDK plan (ORIN-3 held to ±2 ns) shows its reason and a not-feasible badge (text and symbol)', async () => {
    const el = await fixture<TaulineSteeringSchedule>(html`<tauline-steering-schedule></tauline-steering-schedule>`);
    const { examplePlan } = await import('../fixtures.js');
    const { plan, scenario } = await examplePlan('orin-3-meo', {
      key: 'tolerance-2ns',
      apply: (s) => {
        s.tolerance.phaseSeconds = 2e-9;
      },
    });
    expect(plan.feasible).to.equal(false);
    el.plan = plan;
    el.scenario = scenario;
    await el.updateComplete;
    expect(shadow(el).querySelector('.badge')!.textContent).to.contain('✕ not feasible');
    expect(shadow(el).querySelector('.summary[role="note"]')!.textContent).to.contain('σ alone exceeds the tolerance');
  });
});

describe('tauline-steering-schedule metrics', () => {
  it('<tauline-steering-schedule> shows the SDK metrics: settledAfterSeconds as a duration after the epoch, offsets as offsets', async () => {
    const el = await render();
    const { plan } = await orinPlan();
    const shown = async (metrics: Record<string, number>) => {
      el.plan = { ...plan, metrics: { ...plan.metrics, ...metrics } };
      await el.updateComplete;
      const pairs = [...shadow(el).querySelectorAll('[part~="metrics"] div')].map((d) => [
        d.querySelector('dt')!.textContent,
        d.querySelector('dd')!.textContent,
      ]);
      return Object.fromEntries(pairs) as Record<string, string>;
    };
    expect((await shown({}))['settled after']).to.match(/^0(\.0+)? h$/);
    expect((await shown({ settledAfterSeconds: 97_200 }))['settled after']).to.match(/^27(\.0+)? h$/);
    expect((await shown({ settledAfterSeconds: 3.5 * 86400 }))['settled after']).to.match(/^3\.50? d$/);
    const all = await shown({});
    expect(all['worst predicted offset']).to.equal(
      `${Number((plan.metrics.worstPredictedOffsetSeconds * 1e9).toPrecision(3))} ns`,
    );
    expect(all['command count']).to.equal(String(plan.commands.length));
  });
});
