import { expect, fixture, html } from '@open-wc/testing';
import '../../src/steering-schedule/steering-schedule.define.js';
import { planSteering } from '@tauline/sdk/steering';
import { BUNDLED_LEAP_SECONDS, createTimeScales, defineLeapSecondTable } from '@tauline/sdk/time';
import { chartTimeToUtcMs, elapsedSecondsBetween, readPlan } from '../../src/steering-schedule/plan-data.js';
import { describeFailure, guardPlan } from '../../src/steering-schedule/plan-guard.js';
import { layoutSchedule, scheduleTimeTicks, uncertaintyBand } from '../../src/steering-schedule/schedule-draw.js';
import type { TaulineSteeringSchedule } from '../../src/steering-schedule/steering-schedule.js';
import { examplePlan, orinPlan, secondsFrom, tableStamp } from '../fixtures.js';

describe('guardPlan(plan, scenario) (the SDK steering contract)', () => {
  it('guardPlan(plan, scenario) accepts what planSteering() returns for the bundled examples', async () => {
    for (const source of [orinPlan(), examplePlan('halcyr-g1-geo')]) {
      const { plan, scenario } = await source;
      const g = guardPlan(plan, scenario);
      expect(g.ok, g.ok ? '' : describeFailure(g.failure)).to.equal(true);
    }
  });

  it('guardPlan(plan object, scenario) tells a caller who passes planSteering() itself (Instant stamps) to pass its JSON form', async () => {
    const { scenario } = await orinPlan();
    const g = guardPlan(planSteering(scenario), scenario);
    expect(g.ok ? 'accepted' : describeFailure(g.failure)).to.equal(
      'plan.epoch must be a string (pass steeringPlanToJson(plan), not the plan object); received object',
    );
  });

  it('guardPlan(plan, scenario) names the first wrong field with its path, the value received and the expectation', async () => {
    const { plan, scenario } = await orinPlan();
    const failure = (p: unknown, s: unknown = scenario): string => {
      const g = guardPlan(p, s);
      return g.ok ? 'accepted' : describeFailure(g.failure);
    };
    expect(failure(null)).to.equal(
      'plan must be the SteeringPlanJson of steeringPlanToJson(planSteering()); received null',
    );
    expect(failure({ ...plan, feasible: 'yes' })).to.equal('plan.feasible must be true or false; received "yes"');
    const commands = plan.commands.map((c, k) => (k === 1 ? { ...c, executeAt: 299_400 } : c));
    expect(failure({ ...plan, commands })).to.equal('plan.commands[1].executeAt must be a string; received 299400');
    const kinds = plan.commands.map((c, k) => (k === 2 ? { ...c, kind: 'time' } : c));
    expect(failure({ ...plan, commands: kinds })).to.equal(
      'plan.commands[2].kind must be "frequency" or "phase"; received "time"',
    );
    const { metrics: _metrics, ...noMetrics } = plan;
    expect(failure(noMetrics)).to.equal('plan.metrics must be the SteeringMetrics object; received undefined');
    const { caution: _caution, ...noCaution } = plan;
    expect(failure(noCaution)).to.equal('plan.caution must be a string; received undefined');
    const contacts = scenario.contacts.map((w, k) => (k === 2 ? { start: w.start } : w));
    expect(failure(plan, { ...scenario, contacts })).to.equal(
      'scenario.contacts[2].end must be a string; received undefined',
    );
    expect(failure(plan, null)).to.equal('scenario must be the SteeringScenario the plan was made for; received null');
  });
});

describe('readPlan(plan, scenario) on the ORIN-3 plan', () => {
  it('readPlan(plan, scenario) puts commands, contacts and the manoeuvre at their elapsed seconds since the epoch (Date.parse differences, no leap second in 2027-02 [C])', async () => {
    const { plan, scenario } = await orinPlan();
    const r = readPlan(plan, scenario);
    expect(r.ok).to.equal(true);
    if (!r.ok) return;
    const at = (stamp: string): number => secondsFrom(scenario.epoch, stamp);
    expect(r.view.commands.map((c) => c.executeAt)).to.deep.equal(
      plan.commands.map((c) => at(c.executeAt)).sort((a, b) => a - b),
    );
    expect(r.view.commands.map((c) => c.uplinkAt)).to.deep.equal(plan.commands.map((c) => at(c.uplinkAt)));
    expect(r.view.tolerance).to.equal(scenario.tolerance.phaseSeconds);
    expect(r.view.maneuvers.map((m) => m.at)).to.deep.equal(scenario.maneuvers!.map((m) => at(m.at)));
    expect(r.view.contacts).to.deep.equal(scenario.contacts.map((w) => ({ start: at(w.start), end: at(w.end) })));
    expect(r.view.caution).to.equal(plan.caution);
  });

  it('readPlan(plan, scenario) refuses a plan whose epoch is not the scenario epoch (made for another scenario), and reads one printed without an epoch', async () => {
    const { plan, scenario } = await orinPlan();
    expect(plan.epoch).to.equal(scenario.epoch);
    const other = readPlan({ ...plan, epoch: '2027-02-08T06:00:01Z' }, scenario);
    expect(other.ok ? 'accepted' : other.error).to.equal(
      `plan.epoch "2027-02-08T06:00:01Z" is not scenario.epoch ${JSON.stringify(scenario.epoch)}: ` +
        'the plan was made for another scenario (its times count from its own epoch)',
    );
    const { epoch: _, ...older } = plan;
    expect(readPlan(older, scenario).ok).to.equal(true);
    const bad = readPlan({ ...plan, epoch: 42 }, scenario);
    expect(bad.ok ? 'accepted' : bad.error).to.contain('plan.epoch must be a string; received 42');
  });
});

// Leap second at the end of 2016-12-31: TAI − UTC 36 s → 37 s from 2017-01-01 (IERS Bulletin C 52 [M]; the same step
// as in the SDK's bundled table). HALCYR-G1 moved to 2016-12-31T12:00:00Z for one day, 40 ns off, with a contact across
// the leap second: the SDK plans a phase step at 23:59:30 and, 1800 s of spacing later, a frequency step at 00:29:29.
describe('readPlan(plan, scenario) across a leap second', () => {
  const epoch = '2016-12-31T12:00:00Z';
  const leapPlan = () =>
    examplePlan('halcyr-g1-geo', {
      key: 'leap-2016',
      apply: (s) => {
        s.epoch = epoch;
        s.horizonSeconds = 86_400;
        s.clock.phaseSeconds = 40e-9;
        s.contacts = [
          { start: '2016-12-31T23:59:30Z', end: '2017-01-01T00:00:30Z' },
          { start: '2017-01-01T06:00:00Z', end: '2017-01-01T07:00:00Z' },
        ];
      },
    });

  it('elapsedSecondsBetween(epoch, stamp) counts the leap second (43 200 s to 23:59:60, 43 201 s to midnight) and refuses stamps after the table', () => {
    expect(elapsedSecondsBetween(epoch, '2016-12-31T23:59:59Z')).to.equal(43_199);
    expect(elapsedSecondsBetween(epoch, '2016-12-31T23:59:60Z')).to.equal(43_200);
    expect(elapsedSecondsBetween(epoch, '2017-01-01T00:00:00Z')).to.equal(43_201);
    expect(elapsedSecondsBetween(epoch, '2017-01-01T06:00:00Z')).to.equal(64_801);
    // 2031 lies after the bundled table's validity: no leap-free guess.
    expect(Number.isNaN(elapsedSecondsBetween('2031-04-02T00:00:00Z', '2031-04-02T01:00:00Z'))).to.equal(true);
    expect(Number.isNaN(elapsedSecondsBetween(epoch, 'noon'))).to.equal(true);
  });

  it("readPlan(plan, scenario) places the SDK plan's contacts and commands at elapsed SI seconds, the leap second counted", async () => {
    const { plan, scenario } = await leapPlan();
    const r = readPlan(plan, scenario);
    expect(r.ok).to.equal(true);
    if (!r.ok) return;
    // 11 h 59 min 30 s = 43 170 s to the contact's start; 30 s + the leap second + 30 s to its end [C].
    expect(r.view.contacts[0]).to.deep.equal({ start: 43_170, end: 43_231 });
    // Each command: the leap-free Date.parse difference plus the one leap second when it lies after midnight [C].
    const leap = Date.parse('2017-01-01T00:00:00Z');
    expect(r.view.commands.map((c) => c.executeAt)).to.deep.equal(
      plan.commands.map((c) => secondsFrom(epoch, c.executeAt) + (Date.parse(c.executeAt) >= leap ? 1 : 0)),
    );
    expect(plan.commands.map((c) => c.executeAt)).to.deep.equal(['2016-12-31T23:59:30Z', '2017-01-01T00:29:29Z']);
    // Labels: 06:00:00 UTC after the leap second (64 801 s), not 06:00:01; 23:59:59 before it.
    expect(chartTimeToUtcMs(r.view, 64_801)).to.equal(Date.UTC(2017, 0, 1, 6));
    expect(chartTimeToUtcMs(r.view, 43_199)).to.equal(Date.UTC(2016, 11, 31, 23, 59, 59));
  });

  it('scheduleTimeTicks(view, scales) puts the midnight tick at the chart time of 2017-01-01T00:00:00Z (43 201 s after the noon epoch) and every later tick one leap second later, as the command table reads them', async () => {
    const { plan, scenario } = await leapPlan();
    const r = readPlan(plan, scenario);
    if (!r.ok) throw new Error(r.error);
    const options = { yUnit: 'auto', fitAll: false, devicePixelRatio: 1 };
    const layout = layoutSchedule(
      r.view,
      uncertaintyBand(r.view, 2),
      [0, 86_400],
      { width: 800, height: 340 },
      options,
    );
    // 720 px of frame → 10 labels → 8 640 s per interval → the 3 h step; 43 201 = 12 h + the leap second [C].
    const ticks = scheduleTimeTicks(r.view, layout.scales);
    expect(ticks.map((t) => t.value)).to.deep.equal([0, 10_800, 21_600, 32_400, 43_201, 54_001, 64_801, 75_601]);
    expect(ticks.map((t) => `${t.label}${t.sub ? ` ${t.sub}` : ''}`)).to.deep.equal([
      '12:00',
      '15:00',
      '18:00',
      '21:00',
      '00:00 2017-01-01',
      '03:00',
      '06:00',
      '09:00',
    ]);
    expect(elapsedSecondsBetween(epoch, '2017-01-01T00:00:00Z')).to.equal(43_201);
    // The same instants through the path of the command table (chartTimeToUtcMs): whole hours, no 1 s drift.
    for (const t of ticks) expect(chartTimeToUtcMs(r.view, t.value) % 3_600_000).to.equal(0);
  });

  it("<tauline-steering-schedule> prints the SDK's stamps on both sides of the leap second in its table", async () => {
    const el = await fixture<TaulineSteeringSchedule>(
      html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`,
    );
    const { plan, scenario } = await leapPlan();
    el.plan = plan;
    el.scenario = scenario;
    await el.updateComplete;
    const rows = [...el.shadowRoot!.querySelectorAll('tbody tr')].map((row) =>
      [...row.querySelectorAll('td')].map((td) => td.textContent!.trim()),
    );
    expect(rows.map((cells) => cells[1])).to.deep.equal(plan.commands.map((c) => tableStamp(c.executeAt)));
  });

  it('<tauline-steering-schedule> reads stamps with its timeScales property: the horizon ends 86 400 SI s later, 11:59:59 UTC, or 12:00 on a table without that leap second', async () => {
    const el = await fixture<TaulineSteeringSchedule>(
      html`<tauline-steering-schedule style="width: 760px"></tauline-steering-schedule>`,
    );
    const { plan, scenario } = await leapPlan();
    el.plan = plan;
    el.scenario = scenario;
    await el.updateComplete;
    expect(el.plotLabel).to.contain('from 2016-12-31 12:00 UTC to 2017-01-01 11:59:59 UTC');
    // The bundled table cut before MJD 57 754 (2017-01-01): a table too old to know that leap second.
    const entries = BUNDLED_LEAP_SECONDS.entries.filter((e) => e.mjd < 57_754);
    el.timeScales = createTimeScales(
      defineLeapSecondTable({ entries, validUntilMjd: 57_754 + 200, source: 'test: without 2017-01-01' }),
    );
    await el.updateComplete;
    expect(el.plotLabel).to.contain('from 2016-12-31 12:00 UTC to 2017-01-01 12:00 UTC');
  });
});
