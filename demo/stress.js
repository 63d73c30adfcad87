// 10^6-point stress page and browser benchmark (test/bench/elements.bench.mjs drives runBench()).
import '@tauline/elements';

const N = 1_000_000;
const SPAN = 7 * 86400;
const EPOCH = '2032-09-14T00:00:00Z';
const EPOCH_MS = Date.parse(EPOCH);
const iso = (s) => new Date(EPOCH_MS + s * 1000).toISOString();

/** Synthetic steered/unsteered prediction with a little high-frequency wobble (so decimation has work). */
export function makeLargePlan(n = N) {
  const t = new Float64Array(n), steered = new Float64Array(n), sigma = new Float64Array(n), unsteered = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = (SPAN * i) / (n - 1);
    t[i] = s;
    steered[i] = 8e-9 * Math.sin(s / 52000) + 6e-10 * Math.sin(s / 37) + 2e-10 * Math.sin(s * 1.7);
    sigma[i] = 1e-9 + 2e-15 * s;
    unsteered[i] = 3e-9 + 1.2e-13 * s;
  }
  const commands = [];
  for (let k = 1; k <= 12; k++) {
    commands.push({ uplinkAt: iso(k * 50000 - 3000), executeAt: iso(k * 50000), kind: k % 4 === 0 ? 'phase' : 'frequency',
      fractionalFrequencyStep: (k % 2 ? -1 : 1) * 3e-14, phaseStepSeconds: -1e-9, actuatorSteps: (k % 2 ? -6 : 6), reason: 'synthetic' });
  }
  return {
    plan: { feasible: true, commands, predicted: { t, steered: { phaseSeconds: steered, sigmaSeconds: sigma }, unsteered: { phaseSeconds: unsteered, sigmaSeconds: sigma } } },
    scenario: { epoch: EPOCH, tolerance: { phaseSeconds: 2e-8 }, contacts: [{ start: iso(40000), end: iso(43000) }, { start: iso(300000), end: iso(304000) }], maneuvers: [{ at: iso(200000), semiMajorAxisBefore: 27_870_000, semiMajorAxisAfter: 27_882_000 }] },
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
  c.width = width * ratio; c.height = height * ratio;
  const ctx = c.getContext('2d');
  ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
  const { t, steered } = { t: data.plan.predicted.t, steered: data.plan.predicted.steered.phaseSeconds };
  const kx = width / SPAN, ky = height / 6e-8;
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
    box.dispatchEvent(new KeyboardEvent('keydown', { key: k % 8 < 4 ? 'ArrowRight' : 'ArrowLeft', shiftKey: true, bubbles: true, composed: true }));
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
  const baselines = [undecimatedDraw(data, rect.width, rect.height), undecimatedDraw(data, rect.width, rect.height), undecimatedDraw(data, rect.width, rect.height)];
  const pan50 = await panTimes(0.5, 24);
  const pan5 = await panTimes(0.05, 24);
  el.resetView();
  await settled();
  return {
    points: N, width: Math.round(rect.width), devicePixelRatio: devicePixelRatio,
    firstRenderMs: firstRender, panHalfSpanMedianMs: median(pan50), panHalfSpanMaxMs: Math.max(...pan50),
    panTwentiethSpanMedianMs: median(pan5), undecimatedDrawMedianMs: median(baselines),
  };
}
window.runBench = runBench;

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
      settled().then(() => { out.textContent = `${first}\nlast redraw after zoom/pan ${(performance.now() - s).toFixed(1)} ms`; });
    });
  });
}
