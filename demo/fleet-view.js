// Fleet view of the demo console: the four invented Corvane satellites planned jointly through the two
// invented stations with planFleet (in this page), shown in <tauline-fleet-timeline>, with a summary
// (held? who is at risk and why) and the details of the satellite the user selects.
import { fleetPlanToJson, planFleet } from '@tauline/sdk/fleet';
import { FLEET_STATIONS, fleetDocument, SATELLITES } from './constellation.js';

/** Residual rates of the fleet view (invented): CORVANE-B2 runs fast and has no pass on the first day. */
const FLEET_RESIDUALS = [1.2e-13, -0.8e-13, 0.5e-13, 2.6e-13];

const $ = (id) => document.getElementById(id);
/** Numbers' signs as the typographic minus U+2212 (as the elements print them); hyphens in dates stay. */
const minus = (text) =>
  String(text)
    .replace(/(^|[\s(=±Δ:[,;/])-(?=\.?\d)/g, '$1\u2212')
    .replace(/(\d[eE])-(?=\d)/g, '$1\u2212');
const ns = (seconds) => `${minus((seconds * 1e9).toFixed(1))} ns`;
const utc = (iso) => iso.replace('T', ' ').replace(/:00Z$|Z$/, ' UTC');

function text(tag, content, className) {
  const el = document.createElement(tag);
  el.textContent = content;
  if (className) el.className = className;
  return el;
}

/** The summary: held or not, who cannot be held and why, who has little margin. */
function showSummary(plan, timeline, ms) {
  const out = $('fleet-summary');
  const notHeld = plan.satellites.filter((s) => !s.feasible);
  const low = timeline.atRisk.filter((id) => !notHeld.some((s) => s.id === id));
  const items = [];
  items.push(
    text(
      'p',
      plan.feasible
        ? `✓ Every satellite is held inside its tolerance through ${FLEET_STATIONS.length} shared stations ` +
            `(planned in ${ms.toFixed(0)} ms).`
        : `✕ Not feasible: ${notHeld.length} of ${plan.satellites.length} satellites cannot be held ` +
            `(planned in ${ms.toFixed(0)} ms).`,
      plan.feasible ? 'ok' : 'bad',
    ),
  );
  if (notHeld.length > 0 || low.length > 0) {
    const list = document.createElement('ul');
    for (const s of notHeld) list.append(text('li', `⚠ ${s.id}: ${minus(s.reason ?? s.reasonCode ?? 'not held')}`));
    const share = Math.round(timeline.riskMargin * 100);
    for (const id of low)
      list.append(text('li', `⚠ ${id}: held, but its smallest margin is under ${share} % of its tolerance.`));
    items.push(list);
  }
  out.replaceChildren(...items);
}

/** Details of one satellite: status, margins, supports and its uplinks. */
function showDetails(plan, id) {
  const out = $('fleet-detail');
  const s = plan.satellites.find((x) => x.id === id);
  const sat = SATELLITES.find((x) => x.id === id);
  if (!s || !sat) {
    out.replaceChildren(text('p', 'Select a satellite (row, table or keyboard) for its details.', 'hint'));
    return;
  }
  const supports = plan.stationSchedule.filter((x) => x.satellite === id);
  const dl = document.createElement('dl');
  const add = (k, v) => dl.append(text('dt', k), text('dd', v));
  add('Clock', sat.clock);
  add('Status', s.feasible ? 'held' : `not held (${s.reasonCode})`);
  add('Worst bound', `${ns(s.metrics.worstOffsetBoundSeconds)} (|offset| + z·σ)`);
  add('In tolerance', `${(100 * s.metrics.probabilityInTolerance).toFixed(2)} % (lowest epoch)`);
  add('Supports', supports.length ? supports.map((x) => `${x.station} ${utc(x.start)}`).join('; ') : 'none');
  const parts = [text('h3', `${id} · ${s.commands.length} uplink${s.commands.length === 1 ? '' : 's'}`), dl];
  if (s.commands.length > 0) {
    const table = document.createElement('table');
    table.append(text('caption', `Uplinks of ${id} (UTC)`));
    const head = document.createElement('tr');
    for (const h of ['Uplink', 'Station', 'Executes', 'Step']) {
      const th = text('th', h);
      th.scope = 'col';
      head.append(th);
    }
    table.createTHead().append(head);
    const body = table.createTBody();
    for (const c of s.commands) {
      const tr = document.createElement('tr');
      const step = c.kind === 'phase' ? ns(c.phaseStepSeconds) : minus(c.fractionalFrequencyStep.toExponential(2));
      tr.append(text('td', utc(c.uplinkAt)), text('td', c.station), text('td', utc(c.executeAt)), text('td', step));
      body.append(tr);
    }
    parts.push(table);
  }
  if (s.reason) parts.push(text('p', minus(s.reason), 'why'));
  out.replaceChildren(...parts);
}

/** Plans the fleet and shows it; `log` writes to the console's event log. */
export function loadFleet(log) {
  const timeline = document.querySelector('tauline-fleet-timeline');
  let plan = null;
  try {
    const fleet = fleetDocument(FLEET_RESIDUALS);
    const t0 = performance.now();
    // The element and the summary read the plan's JSON form (ISO 8601 stamps), as a server would send it.
    plan = fleetPlanToJson(planFleet(fleet));
    const ms = performance.now() - t0;
    timeline.fleet = fleet;
    timeline.plan = plan;
    timeline.updateComplete.then(() => showSummary(plan, timeline, ms));
    showDetails(plan, '');
  } catch (error) {
    const why = error instanceof Error ? error.message : String(error);
    $('fleet-summary').replaceChildren(text('p', `Cannot plan the fleet: ${why}`, 'bad'));
  }
  timeline.addEventListener('tauline-satellite-select', (e) => {
    log(`fleet: selected ${e.detail.id}${e.detail.atRisk ? ' (at risk)' : ''}`);
    if (plan) showDetails(plan, e.detail.id);
  });
  timeline.addEventListener('tauline-support-select', (e) => {
    log(`fleet: ${e.detail.station} holds ${e.detail.satellite} from ${utc(e.detail.support.start)}`);
  });
  return timeline;
}
