#!/usr/bin/env node
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS } from '../web-test-runner.config.mjs';
// `npm run screenshot [-- <path> <out.png> <width>x<height>]`: serves the demo with its own
// static server (demo/server.mjs) on a free loopback port, opens the page in headless Chromium (playwright-core,
// /usr/bin/chromium or CHROME_PATH), waits for the steering schedule to show commands, and
// writes a full-page PNG (default .ci-out/demo-console.png). Run `npm run build` first.
import { startDemoServer } from './server.mjs';

const [path = '/demo/index.html', out = '.ci-out/demo-console.png', size = '1440x1100'] = process.argv.slice(2);
const [width, height] = size.split('x').map(Number);
mkdirSync(dirname(out), { recursive: true });
const server = await startDemoServer({ port: 0 });
const { port } = server;
const profile = mkdtempSync(join(tmpdir(), 'chromium-profile-'));
const ctx = await chromium.launchPersistentContext(profile, {
  executablePath: process.env.CHROME_PATH || '/usr/bin/chromium',
  headless: true,
  viewport: { width, height },
  args: CHROMIUM_ARGS,
});
try {
  const page = ctx.pages()[0] ?? (await ctx.newPage());
  page.on('console', (m) => {
    if (m.type() === 'error' || m.type() === 'warning') console.log('[browser]', m.type(), m.text());
  });
  page.on('pageerror', (e) => {
    console.error('[pageerror]', e.message);
    process.exitCode = 1;
  });
  await page.goto(`http://127.0.0.1:${port}${path}`);
  // CSS locators pierce open shadow roots.
  await page.locator('tauline-steering-schedule tbody tr[part~="row"]').first().waitFor({ timeout: 30000 });
  await page.waitForTimeout(300);
  await page.screenshot({ path: out, fullPage: true });
  console.log('wrote', out);
} finally {
  await ctx.close();
  await server.close();
  rmSync(profile, { recursive: true, force: true });
}
