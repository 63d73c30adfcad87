// Browser benchmark of @tauline/elements (run by `npm run bench`, or alone with
// `node test/bench/elements.bench.mjs`): loads demo/stress.html in headless Chromium (playwright-core,
// /usr/bin/chromium or CHROME_PATH, the flags of web-test-runner.config.mjs), renders a
// 10^6-point steering prediction, pans it with the keyboard, and compares with drawing the same
// points undecimated on a canvas of the same size in the same run. Reports only; asserts nothing.
// Then renders <tauline-stability-plot> (with its table) at 10^4, 10^5 and 10^6 points and hovers it,
// against the schedule's 10^6 first render measured in the same run.
// Then renders <tauline-fleet-timeline> with an invented 30 satellites × 3 stations × 30 days fleet planned
// by planFleet (in Node, untimed) and hovers it, against drawing every margin sample as its own
// rectangle on a canvas of the same size in the same run.
// Targets (issue): first render < 100 ms, re-render after a pan < 16 ms; stability 10^6 < 100 ms, hover < 16 ms.

import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';
import { startDemoServer } from '../../demo/server.mjs';
import { fleetPlanToJson, planFleet } from '../../packages/sdk/dist/fleet/index.js';
import { CHROMIUM_ARGS } from '../../web-test-runner.config.mjs';
import { syntheticFleet } from './synthetic-fleet.mjs';

const fmt = (ms) => `${ms.toFixed(1).padStart(7)} ms`;

/** An invented fleet: 30 satellites, 3 stations seeing each about twice a day, `days` days. */
function benchFleet(days) {
  return syntheticFleet({
    days,
    seed: 20261204,
    epoch: '2027-05-03T00:00:00Z',
    stationIds: ['UI-BENCH-A', 'UI-BENCH-B', 'UI-BENCH-C'],
    satellitePrefix: 'UIB',
    passHours: [3, 15],
    phaseToleranceSeconds: 1e-7,
  });
}

export default async function benchElements() {
  const server = await startDemoServer({ port: 0 });
  const { port } = server;
  const profile = mkdtempSync(join(tmpdir(), 'chromium-bench-'));
  const ctx = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROME_PATH || '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1100, height: 700 },
    args: CHROMIUM_ARGS,
  });
  try {
    const page = ctx.pages()[0] ?? (await ctx.newPage());
    page.on('pageerror', (e) => {
      console.error('[pageerror]', e.message);
      process.exitCode = 1;
    });
    await page.goto(`http://127.0.0.1:${port}/demo/stress.html?bench`);
    await page.waitForFunction(() => typeof window.runBench === 'function');
    await page.evaluate(() => window.runBench()); // warm-up (JIT, fonts)
    const r = await page.evaluate(() => window.runBench());
    const version = ctx.browser()?.version() ?? 'chromium';
    console.log(
      `headless Chromium ${version}, ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, ${new Date().toISOString()}`,
    );
    console.log(
      `<tauline-steering-schedule>, ${r.points.toLocaleString('en')} points, plot ${r.width} CSS px at devicePixelRatio ${r.devicePixelRatio}`,
    );
    const ratio = (ms) => `${(ms / r.undecimatedDrawMedianMs).toFixed(3)}× baseline`;
    console.log(`  baseline: undecimated line of all points  ${fmt(r.undecimatedDrawMedianMs)}`);
    console.log(
      `  first render (3 series + bands, 10^6)    ${fmt(r.firstRenderMs)}  ${ratio(r.firstRenderMs)}  target < 100 ms: ${r.firstRenderMs < 100 ? 'met' : 'MISSED'}`,
    );
    console.log(
      `  pan at 1/2 span (5e5 visible), median    ${fmt(r.panHalfSpanMedianMs)}  ${ratio(r.panHalfSpanMedianMs)}  target < 16 ms: ${r.panHalfSpanMedianMs < 16 ? 'met' : 'MISSED'} (max ${r.panHalfSpanMaxMs.toFixed(1)} ms)`,
    );
    console.log(
      `  pan at 1/20 span (5e4 visible), median   ${fmt(r.panTwentiethSpanMedianMs)}  ${ratio(r.panTwentiethSpanMedianMs)}`,
    );
    // Stability plot, against the schedule's 10^6 first render above (the strongest in-project baseline, same run).
    console.log(
      `<tauline-stability-plot> with its windowed table; baseline: <tauline-steering-schedule> 10^6 first render ${fmt(r.firstRenderMs)}`,
    );
    const stability = [];
    for (const n of [1e4, 1e5, 1e6]) {
      await page.evaluate((k) => window.runStabilityBench(k), n); // warm-up at this size
      const s = await page.evaluate((k) => window.runStabilityBench(k), n);
      stability.push(s);
      const vs = (ms) => `${(ms / r.firstRenderMs).toFixed(2)}× schedule`;
      console.log(
        `  ${n.toExponential(0).replace('e+', 'e')} pts: first render ${fmt(s.firstRenderMs)} (${vs(s.firstRenderMs)})` +
          `${n === 1e6 ? `  target < 100 ms: ${s.firstRenderMs < 100 ? 'met' : 'MISSED'}` : ''}; data update ${fmt(s.updateMs)}; ` +
          `hover median ${fmt(s.hoverMedianMs)} (max ${s.hoverMaxMs.toFixed(1)} ms)${n === 1e6 ? `  target < 16 ms: ${s.hoverMedianMs < 16 ? 'met' : 'MISSED'}` : ''}; ` +
          `${s.tableRowsInDom} table rows in the DOM`,
      );
    }
    const [a, , c] = stability;
    console.log(
      `  growth exponent of first render over 10^4…10^6: ${(Math.log10(c.firstRenderMs / a.firstRenderMs) / 2).toFixed(2)}`,
    );
    const fleet = benchFleet(30);
    const plan = fleetPlanToJson(planFleet(fleet));
    await page.evaluate((data) => window.runFleetBench(data), { fleet, plan }); // warm-up
    const f = await page.evaluate((data) => window.runFleetBench(data), { fleet, plan });
    const vsBase = (ms) => `${(ms / f.baselineMs).toFixed(2)}× baseline`;
    console.log(
      `<tauline-fleet-timeline>, ${f.satellites} satellites × 3 stations × 30 days (${f.samples.toLocaleString('en')} grid samples, ` +
        `${f.stations} supports), ${f.width}×${f.height} CSS px`,
    );
    console.log(`  baseline: every margin sample as a rectangle ${fmt(f.baselineMs)}`);
    console.log(`  first render (guard, margins, draw)          ${fmt(f.firstRenderMs)}  ${vsBase(f.firstRenderMs)}`);
    console.log(`  new plan of the same fleet                   ${fmt(f.updateMs)}  ${vsBase(f.updateMs)}`);
    console.log(
      `  hover, median                                ${fmt(f.hoverMedianMs)}  ${vsBase(f.hoverMedianMs)}  one frame (16 ms): ${f.hoverMedianMs < 16 ? 'within' : 'OVER'} (max ${f.hoverMaxMs.toFixed(1)} ms)`,
    );
    return { ...r, stability, fleet: f };
  } finally {
    await ctx.close();
    await server.close();
    rmSync(profile, { recursive: true, force: true });
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  process.chdir(fileURLToPath(new URL('../..', import.meta.url)));
  await benchElements();
}
