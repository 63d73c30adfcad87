// 10^6-point stress page and browser benchmark (test/bench/elements.bench.mjs drives runBench()).
import '@tauline/elements';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '@tauline/sdk/time';

const N = 1_000_000;
const SPAN = 7 * 86400;
const EPOCH = '2026-09-14T00:00:00Z'; // inside the SDK's bundled leap-second table (the element reads stamps with it)
const TIME_SCALES = createTimeScales(BUNDLED_LEAP_SECONDS);
const EPOCH_INSTANT = TIME_SCALES.parseIso(EPOCH, 'UTC');
/** The UTC stamp `s` SI seconds after the epoch, through the SDK's time scales (a leap second counts as one). */
const iso = (s) => TIME_SCALES.formatIso(EPOCH_INSTANT.plus(s), { fractionDigits: 3 });

/** Synthetic steered/unsteered prediction with a little high-frequency wobble (so decimation has work). */
export function makeLargePlan(n = N) {
  const t = new Float64Array(n),
    steered = new Float64Array(n),
    sigma = new Float64Array(n),
    unsteered = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = (SPAN * i) / (n - 1);
    t[i] = s;
    steered[i] = 8e-9 * Math.sin(s / 52000) + 6e-10 * Math.sin(s / 37) + 2e-10 * Math.sin(s * 1.7);
    sigma[i] = 1e-9 + 2e-15 * s;
    unsteered[i] = 3e-9 + 1.2e-13 * s;
  }
  const commands = [];
  for (let k = 1; k <= 12; k++) {
    commands.push({
      uplinkAt: iso(k * 50000 - 3000),
      executeAt: iso(k * 50000),
      kind: k % 4 === 0 ? 'phase' : 'frequency',
      fractionalFrequencyStep: (k % 2 ? -1 : 1) * 3e-14,
      phaseStepSeconds: -1e-9,
      actuatorSteps: k % 2 ? -6 : 6,
      reason: 'synthetic',
    });
  }
  return {
    plan: {
      feasible: true,
      commands,
      metrics: { commandCount: commands.length },
      caution: 'Caution: synthetic stress data, not a plan.',
      predicted: {
        t,
        steered: { phaseSeconds: steered, sigmaSeconds: sigma },
        unsteered: { phaseSeconds: unsteered, sigmaSeconds: sigma },
      },
    },
    scenario: {
      epoch: EPOCH,
      horizonSeconds: SPAN,
      tolerance: { phaseSeconds: 2e-8 },
      contacts: [
        { start: iso(40000), end: iso(43000) },
        { start: iso(300000), end: iso(304000) },
      ],
      maneuvers: [{ at: iso(200000), semiMajorAxisBefore: 27_870_000, semiMajorAxisAfter: 27_882_000 }],
    },
  };
}

const el = document.querySelector('tauline-steering-schedule');
const canvas = () => el.shadowRoot.querySelector('canvas.data');
/** Waits for the element's update (and its draw) and forces the canvas to rasterise. */
async function settled() {
  while (!(await el.updateComplete));
  canvas()?.getContext('2d').getImageData(0, 0, 1, 1);
}

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Draws all points without decimation on a canvas of the same size: the baseline. */
function undecimatedDraw(data, width, height) {
  const c = document.createElement('canvas');
  const ratio = devicePixelRatio || 1;
  c.width = width * ratio;
  c.height = height * ratio;
  const ctx = c.getContext('2d');
  ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
  const { t, steered } = { t: data.plan.predicted.t, steered: data.plan.predicted.steered.phaseSeconds };
  const kx = width / SPAN,
    ky = height / 6e-8;
  const t0 = performance.now();
  ctx.beginPath();
  ctx.moveTo(0, height / 2 - steered[0] * ky);
  for (let i = 1; i < t.length; i++) ctx.lineTo(t[i] * kx, height / 2 - steered[i] * ky);
  ctx.stroke();
  ctx.getImageData(0, 0, 1, 1);
  return performance.now() - t0;
}

async function panTimes(fraction, repeats) {
  const box = el.shadowRoot.querySelector('.plot-box');
  el.setView(0, SPAN * fraction);
  await settled();
  const times = [];
  for (let k = 0; k < repeats; k++) {
    const t0 = performance.now();
    box.dispatchEvent(
      new KeyboardEvent('keydown', {
        key: k % 8 < 4 ? 'ArrowRight' : 'ArrowLeft',
        shiftKey: true,
        bubbles: true,
        composed: true,
      }),
    );
    await settled();
    times.push(performance.now() - t0);
  }
  return times;
}

/** Benchmark: first render, pans at two zoom levels, and the undecimated baseline, in ms. */
export async function runBench() {
  const data = makeLargePlan();
  el.plan = null;
  await settled();
  const t0 = performance.now();
  el.plan = data.plan;
  el.scenario = data.scenario;
  await settled();
  const firstRender = performance.now() - t0;
  const rect = canvas().getBoundingClientRect();
  const baselines = [
    undecimatedDraw(data, rect.width, rect.height),
    undecimatedDraw(data, rect.width, rect.height),
    undecimatedDraw(data, rect.width, rect.height),
  ];
  const pan50 = await panTimes(0.5, 24);
  const pan5 = await panTimes(0.05, 24);
  el.resetView();
  await settled();
  return {
    points: N,
    width: Math.round(rect.width),
    devicePixelRatio: devicePixelRatio,
    firstRenderMs: firstRender,
    panHalfSpanMedianMs: median(pan50),
    panHalfSpanMaxMs: Math.max(...pan50),
    panTwentiethSpanMedianMs: median(pan5),
    undecimatedDrawMedianMs: median(baselines),
  };
}
window.runBench = runBench;

const stability = document.querySelector('tauline-stability-plot');

/** Synthetic stability series: n τ log-spaced over six decades, a white-FM slope, intervals and n. */
export function makeStabilitySeries(n) {
  const tau = new Float64Array(n),
    deviation = new Float64Array(n),
    low = new Float64Array(n),
    high = new Float64Array(n),
    terms = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    tau[i] = 10 ** ((6 * i) / (n - 1));
    deviation[i] = (3e-12 / Math.sqrt(tau[i])) * (1 + 0.05 * Math.sin(i * 0.7));
    low[i] = deviation[i] * 0.9;
    high[i] = deviation[i] * 1.12;
    terms[i] = n - i + 1;
  }
  return [{ statistic: 'oadev', tau, deviation, low, high, n: terms }];
}

/** Waits until the stability plot has drawn for its current data (the ResizeObserver may report first). */
async function stabilityDrawn() {
  for (;;) {
    await stability.updateComplete;
    if (stability._scales && stability._drawKey.startsWith(`${stability._version}|`)) break;
    await new Promise((r) => requestAnimationFrame(r));
  }
  stability.shadowRoot.querySelector('canvas.data').getContext('2d').getImageData(0, 0, 1, 1);
}

/**
 * Stability-plot benchmark, in ms: first render of n points into an empty element (to the drawn
 * frame, so it includes the frame where the ResizeObserver reports the size), a data update on a
 * plotted element, and hover (pointer moves over the plot until the read-out and overlay are drawn).
 */
export async function runStabilityBench(n) {
  stability.series = null;
  await stability.updateComplete;
  const series = makeStabilitySeries(n);
  const t0 = performance.now();
  stability.series = series;
  await stabilityDrawn();
  const firstRender = performance.now() - t0;
  const next = makeStabilitySeries(n);
  const t1 = performance.now();
  stability.series = next;
  await stabilityDrawn();
  const update = performance.now() - t1;
  const overlay = stability.shadowRoot.querySelector('canvas.overlay');
  const w = overlay.clientWidth,
    h = overlay.clientHeight;
  const hovers = [];
  for (let k = 0; k < 30; k++) {
    const x = 80 + ((w - 160) * k) / 29,
      y = h * 0.2 + (h * 0.5 * k) / 29;
    const s = performance.now();
    overlay.dispatchEvent(
      new PointerEvent('pointermove', {
        clientX: overlay.getBoundingClientRect().left + x,
        clientY: overlay.getBoundingClientRect().top + y,
        bubbles: true,
      }),
    );
    await stability.updateComplete;
    hovers.push(performance.now() - s);
  }
  return {
    points: n,
    firstRenderMs: firstRender,
    updateMs: update,
    hoverMedianMs: median(hovers),
    hoverMaxMs: Math.max(...hovers),
    tableRowsInDom: stability.shadowRoot.querySelectorAll('tbody tr[part~="row"]').length,
  };
}
window.runStabilityBench = runStabilityBench;

if (!new URLSearchParams(location.search).has('bench')) {
  const out = document.getElementById('timing');
  const data = makeLargePlan();
  const t0 = performance.now();
  el.plan = data.plan;
  el.scenario = data.scenario;
  settled().then(() => {
    out.textContent = `first render ${(performance.now() - t0).toFixed(1)} ms for ${N.toLocaleString('en')} points`;
    const first = out.textContent;
    el.addEventListener('tauline-view-change', () => {
      const s = performance.now();
      settled().then(() => {
        out.textContent = `${first}\nlast redraw after zoom/pan ${(performance.now() - s).toFixed(1)} ms`;
      });
    });
  });
}

const fleetTimeline = document.querySelector('tauline-fleet-timeline');

/** Waits until the fleet timeline has drawn its current data (the canvas gets its CSS size when drawn). */
async function fleetDrawn() {
  for (let k = 0; k < 20; k++) {
    await fleetTimeline.updateComplete;
    const c = fleetTimeline.shadowRoot.querySelector('canvas.data');
    if (c?.style.height) {
      c.getContext('2d').getImageData(0, 0, 1, 1);
      return;
    }
    await new Promise((r) => requestAnimationFrame(r));
  }
}

/** The baseline: every margin sample of every satellite as its own rectangle on a canvas of the same size. */
function naiveFleetDraw(plan, width, height) {
  const c = document.createElement('canvas');
  const ratio = devicePixelRatio || 1;
  c.width = width * ratio;
  c.height = height * ratio;
  const ctx = c.getContext('2d');
  ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
  const t0 = performance.now();
  const rowHeight = height / (plan.satellites.length + 4);
  plan.satellites.forEach((s, i) => {
    const t = s.predicted.t,
      m = s.predicted.steered.phaseSeconds,
      span = t[t.length - 1] || 1;
    for (let k = 0; k < t.length; k++) {
      ctx.fillStyle = Math.abs(m[k]) > 5e-8 ? '#b3261e' : '#1d6b63';
      ctx.fillRect((t[k] / span) * width, i * rowHeight, Math.max(1, width / t.length), rowHeight * 0.6);
    }
  });
  ctx.getImageData(0, 0, 1, 1);
  return performance.now() - t0;
}

/**
 * Fleet-timeline benchmark, in ms: first render of a planned fleet (`planFleet` output and its
 * document, given by the caller) into an empty element, a new plan of the same fleet, hover over the
 * rows, and the naive baseline.
 */
export async function runFleetBench({ fleet, plan }) {
  fleetTimeline.plan = null;
  await fleetTimeline.updateComplete;
  const t0 = performance.now();
  fleetTimeline.fleet = fleet;
  fleetTimeline.plan = plan;
  await fleetDrawn();
  const firstRender = performance.now() - t0;
  // A new plan of the same fleet (as after a re-plan): the fleet document is not validated again.
  const t1 = performance.now();
  fleetTimeline.plan = { ...plan };
  await fleetDrawn();
  const update = performance.now() - t1;
  const box = fleetTimeline.shadowRoot.querySelector('.plot-box');
  const rect = box.getBoundingClientRect();
  const baselines = [0, 1, 2].map(() => naiveFleetDraw(plan, rect.width, rect.height));
  const hovers = [];
  for (let k = 0; k < 40; k++) {
    const x = rect.left + 140 + ((rect.width - 160) * k) / 39,
      y = rect.top + 40 + ((rect.height - 50) * ((k * 7) % 40)) / 40;
    const s = performance.now();
    box.dispatchEvent(new PointerEvent('pointermove', { clientX: x, clientY: y, bubbles: true }));
    await fleetTimeline.updateComplete;
    hovers.push(performance.now() - s);
  }
  const samples = plan.satellites.reduce((n, s) => n + s.predicted.t.length, 0);
  return {
    satellites: plan.satellites.length,
    stations: plan.stationSchedule.length,
    samples,
    width: Math.round(rect.width),
    height: Math.round(rect.height),
    firstRenderMs: firstRender,
    updateMs: update,
    hoverMedianMs: median(hovers),
    hoverMaxMs: Math.max(...hovers),
    baselineMs: median(baselines),
  };
}
window.runFleetBench = runFleetBench;
