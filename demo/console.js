// Demo console: the host page's own script. It computes everything through @tauline/sdk in
// the browser and hands the results to the @tauline/elements components as properties.
import '@tauline/elements';
import {
  analyzeStability,
  j2SecularClockRate,
  meanClockRate,
  planSteering,
  rateChangeForSemiMajorAxisChange,
  reviewOffsets,
  simulateClosedLoop,
  steeringPlanToJson,
} from '@tauline/sdk';
import { clockRecord, reviewDocument, SATELLITES, scenarioFor } from './constellation.js';
import { loadFleet } from './fleet-view.js';

const $ = (id) => document.getElementById(id);
const schedule = document.querySelector('tauline-steering-schedule');
const budget = document.querySelector('tauline-rate-budget');
const stability = document.querySelector('tauline-stability-plot');
const review = document.querySelector('tauline-review-findings');
const fleetTimeline = document.querySelector('tauline-fleet-timeline');
const status = $('status');

/** Residual rate the factory offset leaves for the design orbit (clock-specific, invented). */
const BASE_RESIDUAL = [1.2e-13, -0.8e-13, 0.5e-13, -0.3e-13];

for (const [i, s] of SATELLITES.entries()) $('sat').add(new Option(`${s.id} · ${s.clock}`, String(i)));

function setSatellite(index) {
  const sat = SATELLITES[index];
  $('sat').value = String(index);
  const km = sat.designSemiMajorAxis / 1000;
  $('sma-range').min = String(km - 60);
  $('sma-range').max = String(km + 60);
  for (const el of [$('sma'), $('sma-range')]) el.value = String(km);
  recomputeStability(index);
  recompute();
}

/** Display text of a number with the typographic minus (U+2212), as the elements print them. */
const minus = (text) => String(text).replace(/-/g, '\u2212');
const grouped = (v) => minus(v.toLocaleString('en', { maximumFractionDigits: 3 }).replace(/,/g, '\u202f'));

/**
 * The what-if fields: unit, accepted range and how to explain a bad value. `check` returns null for a
 * valid number or the message shown next to the field.
 */
const FIELDS = {
  sma: {
    name: 'the semi-major axis',
    unit: 'km',
    min: 20_000,
    max: 45_000,
    // A value that reads as a valid orbit once divided by 1000 was typed in metres.
    hint: (v) =>
      v / 1000 >= 20_000 && v / 1000 <= 45_000
        ? `${grouped(v)} looks like metres: this field takes kilometres (${grouped(v / 1000)} km).`
        : null,
  },
  tol: { name: 'the phase tolerance', unit: 'ns', min: 2, max: 500, hint: () => null },
  dA: { name: 'the manoeuvre Δa', unit: 'm', min: -50_000, max: 50_000, hint: () => null },
};

/** The error message for field `id` holding `input`, or null when its value can be used. */
function fieldError(id, input) {
  const f = FIELDS[id];
  const range = `${grouped(f.min)} to ${grouped(f.max)} ${f.unit}`;
  if (input.validity.badInput) return `Not a number: enter ${f.name} in ${f.unit} (${range}).`;
  if (input.value.trim() === '') return `Empty: enter ${f.name} in ${f.unit} (${range}).`;
  const v = Number(input.value);
  if (v >= f.min && v <= f.max) return null;
  return (
    f.hint(v) ??
    `${grouped(v)} ${f.unit} is ${v < f.min ? 'below the minimum' : 'above the maximum'}: ${f.name} must be ${range}.`
  );
}

/** Shows or clears the field's error next to it (aria-invalid, aria-describedby); true when valid. */
function showFieldError(id) {
  const input = $(id),
    out = $(`${id}-error`);
  const message = fieldError(id, input);
  out.textContent = message ?? '';
  out.hidden = message === null;
  if (message) {
    input.setAttribute('aria-invalid', 'true');
    input.setAttribute('aria-describedby', `${id}-error`);
  } else {
    input.removeAttribute('aria-invalid');
    input.removeAttribute('aria-describedby');
  }
  return message === null;
}

/** Validates every what-if field; when one is invalid, marks the shown results stale and says so. */
function inputsValid() {
  const bad = Object.keys(FIELDS).filter((id) => !showFieldError(id));
  const stale = bad.length > 0;
  for (const panel of [$('schedule'), $('budget')]) panel.toggleAttribute('data-stale', stale);
  if (stale) {
    status.classList.add('error');
    status.textContent = `Not recomputed: fix ${bad.map((id) => FIELDS[id].name).join(' and ')}. The schedule and budget shown are stale (last valid input: ${lastValid}).`;
  }
  return !stale;
}

let lastValid = '';

function readInputs() {
  const index = Number($('sat').value);
  const aKm = Number($('sma').value);
  const tolNs = Number($('tol').value);
  const dA = Number($('dA').value);
  const method = document.querySelector('input[name="method"]:checked').value;
  return { index, a: aKm * 1000, tol: tolNs * 1e-9, dA, method };
}

let pending = 0;
function recompute() {
  cancelAnimationFrame(pending);
  if (!inputsValid()) return;
  pending = requestAnimationFrame(() => {
    const { index, a, tol, dA, method } = readInputs();
    const sat = SATELLITES[index];
    status.classList.remove('error');
    try {
      const t0 = performance.now();
      // The factory offset was set for the design orbit: a different achieved orbit leaves a rate to steer out.
      const residual = BASE_RESIDUAL[index] + rateChangeForSemiMajorAxisChange(sat.designSemiMajorAxis, a);
      const scenario = scenarioFor(index, {
        residualFractionalFrequency: residual,
        tolerancePhaseSeconds: tol,
        method,
        maneuverDeltaA: dA,
      });
      const plan = planSteering(scenario);
      const rate = meanClockRate(a);
      const j2 = j2SecularClockRate({
        semiMajorAxis: a,
        eccentricity: 0,
        inclination: sat.inclination,
        semiMajorAxisKind: 'mean',
      });
      const ms = performance.now() - t0;
      // The element takes the plan's JSON form (ISO 8601 stamps), as a server would send it.
      schedule.plan = steeringPlanToJson(plan);
      schedule.scenario = scenario;
      schedule.label = `Steering schedule · ${sat.id}`;
      budget.budget = rate;
      budget.j2Rate = j2.j2Correction;
      budget.label = `Rate budget · ${sat.id} at ${(a / 1000).toFixed(1)} km`;
      lastValid = `${sat.id}, a = ${grouped(a / 1000)} km, tolerance ${grouped(tol * 1e9)} ns, Δa ${grouped(dA)} m`;
      status.textContent =
        `${sat.id}: residual rate ${minus(residual.toExponential(2))}, ${plan.commands.length} commands, ` +
        `${plan.feasible ? 'feasible' : 'NOT feasible'}. Recomputed in ${ms.toFixed(0)} ms.`;
    } catch (error) {
      status.classList.add('error');
      status.textContent = `Cannot recompute: ${error instanceof Error ? error.message : String(error)}`;
    }
  });
}

/** Simulated clocks per strategy in the closed-loop what-if: enough for a 5 % percentile, quick in a page. */
const LOOP_RUNS = 40;

/** Closed-loop what-if: the chosen planner and no steering fly the same simulated clocks for 30 days. */
function flyClosedLoop() {
  if (!inputsValid()) {
    $('loop-status').textContent = 'Fix the what-if fields first.';
    return;
  }
  const { index, a, tol, dA, method } = readInputs();
  const sat = SATELLITES[index];
  $('loop-run').disabled = true;
  $('loop-status').textContent = `Flying ${sat.id} for 30 days (${LOOP_RUNS} simulated clocks)…`;
  // Let the status paint before the synchronous simulation.
  setTimeout(() => {
    try {
      const t0 = performance.now();
      const residual = BASE_RESIDUAL[index] + rateChangeForSemiMajorAxisChange(sat.designSemiMajorAxis, a);
      const scenario = scenarioFor(index, {
        residualFractionalFrequency: residual,
        tolerancePhaseSeconds: tol,
        method,
        maneuverDeltaA: dA,
        days: 30,
      });
      const summary = simulateClosedLoop(scenario, { runs: LOOP_RUNS, seed: 20270308, strategies: [method, 'none'] });
      const pct = (v) => `${(100 * v).toFixed(1)} %`;
      // One column per strategy, one row per quantity: it reads in the narrow side panel.
      const cell = (tag, text, scope) => {
        const c = document.createElement(tag);
        c.textContent = text;
        if (scope) c.scope = scope;
        return c;
      };
      const head = document.createElement('tr');
      head.append(
        cell('td', ''),
        ...summary.strategies.map((r) =>
          cell(
            'th',
            r.method === 'none' ? 'no steering' : r.method === 'optimal' ? 'constrained LQ' : 'deadband',
            'col',
          ),
        ),
      );
      const quantities = [
        ['In tolerance, mean', (r) => pct(r.timeInTolerance.mean)],
        ['In tolerance, worst 5 %', (r) => pct(r.timeInTolerance.p05)],
        ['Worst |offset|, 95 %', (r) => `${minus((r.maxAbsOffsetSeconds.p95 * 1e9).toFixed(1))} ns`],
        ['Commands per day', (r) => r.commandsPerDay.mean.toFixed(2)],
      ];
      const rows = quantities.map(([label, value]) => {
        const tr = document.createElement('tr');
        tr.append(cell('th', label, 'row'), ...summary.strategies.map((r) => cell('td', value(r))));
        return tr;
      });
      $('loop-table').tHead.replaceChildren(head);
      $('loop-table').tBodies[0].replaceChildren(...rows);
      $('loop-runs').textContent = String(summary.runs);
      $('loop-table').hidden = false;
      $('loop-status').textContent =
        `${sat.id}, tolerance ±${grouped(tol * 1e9)} ns: flown in ${(performance.now() - t0).toFixed(0)} ms. ` +
        'Time in tolerance: share of 15-min epochs with |offset| within the tolerance, per simulated clock.';
    } catch (error) {
      $('loop-status').textContent = `Cannot fly: ${error instanceof Error ? error.message : String(error)}`;
    } finally {
      $('loop-run').disabled = false;
    }
  }, 30);
}

function recomputeStability(index) {
  try {
    const y = clockRecord(index);
    const analysis = analyzeStability({ frequency: y, tau0: 1 }, { statistics: ['oadev', 'mdev', 'ohdev'] });
    stability.series = analysis.rows;
    stability.label = `Clock stability · ${SATELLITES[index].id} (simulated ${y.length.toLocaleString('en')} s record)`;
  } catch (error) {
    stability.series = null;
    status.textContent = `Stability analysis failed: ${error instanceof Error ? error.message : String(error)}`;
  }
}

function loadReview() {
  const expected = SATELLITES.map((s) => meanClockRate(s.designSemiMajorAxis).factoryOffset);
  try {
    review.review = reviewOffsets(reviewDocument(expected));
  } catch (error) {
    review.review = null;
    status.textContent = `Review failed: ${error instanceof Error ? error.message : String(error)}`;
  }
}

// Inputs: number field and slider stay in step; every change recomputes, or shows why it cannot.
$('sma').addEventListener('input', () => {
  if (fieldError('sma', $('sma')) === null) $('sma-range').value = $('sma').value;
  recompute();
});
$('sma-range').addEventListener('input', () => {
  $('sma').value = $('sma-range').value;
  recompute();
});
for (const id of ['tol', 'dA']) $(id).addEventListener('input', recompute);
for (const r of document.querySelectorAll('input[name="method"]')) r.addEventListener('change', recompute);
$('sat').addEventListener('change', () => setSatellite(Number($('sat').value)));
$('whatif').addEventListener('submit', (e) => e.preventDefault());
$('loop-run').addEventListener('click', flyClosedLoop);

// Events from inside the elements' shadow roots reach the page (bubbles + composed).
const log = (text) => {
  const li = document.createElement('li');
  li.textContent = `${new Date().toISOString().slice(11, 19)} ${text}`;
  $('events').prepend(li);
  while ($('events').children.length > 30) $('events').lastElementChild.remove();
};
document.addEventListener('tauline-command-select', (e) => {
  const c = e.detail.command;
  log(
    `command ${e.detail.index + 1}: ${c.kind} step ${minus(c.fractionalFrequencyStep ?? c.phaseStepSeconds)} at ${c.executeAt}`,
  );
});
let viewTimer = 0;
document.addEventListener('tauline-view-change', (e) => {
  clearTimeout(viewTimer);
  viewTimer = setTimeout(
    () =>
      log(
        `view ${minus((e.detail.startSeconds / 3600).toFixed(1))} h – ${minus((e.detail.endSeconds / 3600).toFixed(1))} h`,
      ),
    250,
  );
});
document.addEventListener('tauline-spacecraft-select', (e) => {
  log(`review: opened ${e.detail.id} (${e.detail.verdict})`);
  const i = SATELLITES.findIndex((s) => s.id === e.detail.id);
  if (i >= 0 && i !== Number($('sat').value)) setSatellite(i);
});

// Theme: the page flips its own color-scheme; the canvas plots re-read their colours.
$('theme-toggle').addEventListener('click', () => {
  const light = document.documentElement.classList.toggle('light');
  $('theme-toggle').textContent = light ? 'Day room' : 'Dark room';
  $('theme-toggle').setAttribute('aria-pressed', String(!light));
  for (const el of [schedule, stability, fleetTimeline]) el.refreshTheme();
});
if (new URLSearchParams(location.search).get('theme') === 'light') $('theme-toggle').click();

loadReview();
setSatellite(0);
// The fleet view plans four satellites jointly (a few hundred ms): after the first paint of the rest.
setTimeout(() => loadFleet(log), 0);
