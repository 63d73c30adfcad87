// @web/test-runner plugin: the server command `tauline-static-page` serves the repository with a
// plain node:http static file server (no module resolution, no import-map injection, no
// transforms: files go out byte for byte, as any static host would send them), opens the page in a
// new tab of the test browser at the given viewport, waits until the page's Tauline elements have
// rendered, and returns what they show plus every console error and page error. Optionally saves a
// full-page screenshot under .ci-out/. Used by packages/elements/test/embedding.test.ts.

import { createReadStream, mkdirSync, statSync } from 'node:fs';
import { createServer } from 'node:http';
import { dirname, extname, join, resolve, sep } from 'node:path';

const ROOT = resolve('.');
const OUT_DIR = resolve('.ci-out');
const TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
};

/** A static file server on the loopback interface; resolves to its port. Paths outside the repository are 404. */
function startStaticServer() {
  const server = createServer((req, res) => {
    let file;
    try {
      const path = decodeURIComponent(new URL(req.url ?? '/', 'http://localhost').pathname);
      file = resolve(join(ROOT, path));
      if (req.method !== 'GET' || !file.startsWith(ROOT + sep) || !statSync(file).isFile())
        throw new Error('not a file');
    } catch {
      res.writeHead(404, { 'content-type': 'text/plain' }).end('not found');
      return;
    }
    res.writeHead(200, {
      'content-type': TYPES[extname(file)] ?? 'application/octet-stream',
      'cache-control': 'no-store',
    });
    createReadStream(file).pipe(res);
  });
  return new Promise((ok) => server.listen(0, '127.0.0.1', () => ok({ server, port: server.address().port })));
}

/** Runs in the page: what each Tauline element shows (counts of rendered data, alerts). */
function probe() {
  const root = (tag) => document.querySelector(tag)?.shadowRoot ?? null;
  const count = (tag, selector) => root(tag)?.querySelectorAll(selector).length ?? -1;
  return {
    importMap: document.querySelector('script[type="importmap"]') !== null,
    defined: [
      'tauline-steering-schedule',
      'tauline-rate-budget',
      'tauline-stability-plot',
      'tauline-review-findings',
    ].filter((t) => customElements.get(t)),
    budgetRows: count('tauline-rate-budget', 'tbody tr'),
    budgetTotal: root('tauline-rate-budget')?.querySelector('tr.total td')?.textContent ?? null,
    budgetCaution: root('tauline-rate-budget')?.querySelector('[part~="caution"]')?.textContent ?? null,
    scheduleRows: count('tauline-steering-schedule', 'tbody tr[part~="row"]'),
    scheduleLabel: root('tauline-steering-schedule')?.querySelector('canvas.data')?.getAttribute('aria-label') ?? null,
    stabilityLabel: root('tauline-stability-plot')?.querySelector('canvas.data')?.getAttribute('aria-label') ?? null,
    reviewEntries: count('tauline-review-findings', 'details'),
    alerts: [
      'tauline-steering-schedule',
      'tauline-rate-budget',
      'tauline-stability-plot',
      'tauline-review-findings',
    ].flatMap((t) => [...(root(t)?.querySelectorAll('[role="alert"]') ?? [])].map((a) => `${t}: ${a.textContent}`)),
  };
}

export function staticPagePlugin() {
  let running = null;
  return {
    name: 'tauline-static-page',
    async serverStop() {
      if (running) (await running).server.close();
    },
    async executeCommand({ command, payload, session }) {
      if (command !== 'tauline-static-page') return undefined;
      if (session.browser.type !== 'puppeteer')
        throw new Error('tauline-static-page needs the Chrome (puppeteer) launcher');
      const { path, width = 1000, height = 900, screenshot } = payload ?? {};
      running ??= startStaticServer();
      const { port } = await running;
      const testPage = session.browser.getPage(session.id);
      const page = await testPage.browser().newPage();
      const errors = [];
      page.on('console', (m) => {
        if (m.type() === 'error') errors.push(m.text());
      });
      page.on('pageerror', (e) => errors.push(String(e.message ?? e)));
      page.on('requestfailed', (r) => errors.push(`request failed: ${r.url()}`));
      page.on('response', (r) => {
        if (r.status() >= 400) errors.push(`HTTP ${r.status()}: ${r.url()}`);
      });
      try {
        await page.setViewport({ width, height });
        await page.goto(`http://127.0.0.1:${port}${path}`);
        // Every Tauline element on the page shows data: table rows, a drawn plot or review entries.
        await page
          .waitForFunction(
            () => {
              const shows = {
                'tauline-steering-schedule': 'tbody tr[part~="row"]',
                'tauline-rate-budget': 'tbody tr',
                'tauline-stability-plot': 'canvas.data',
                'tauline-review-findings': 'details',
              };
              const els = [...document.querySelectorAll(Object.keys(shows).join(', '))];
              return els.length > 0 && els.every((el) => el.shadowRoot?.querySelector(shows[el.localName]));
            },
            { timeout: 30000 },
          )
          .catch(() => {
            errors.push('timed out waiting for every element to show data');
          });
        await new Promise((r) => setTimeout(r, 200));
        const shown = await page.evaluate(probe);
        if (screenshot) {
          const target = resolve(String(screenshot));
          if (!target.startsWith(OUT_DIR + sep))
            throw new Error(`screenshots go under .ci-out/; received ${screenshot}`);
          mkdirSync(dirname(target), { recursive: true });
          await page.screenshot({ path: target, fullPage: true });
        }
        return { ...shown, errors, url: page.url() };
      } finally {
        await page.close();
      }
    },
  };
}
