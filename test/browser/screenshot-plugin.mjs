// @web/test-runner plugin: the server command `tauline-demo-screenshot` opens a page (in a new
// tab of the test browser), waits until the steering schedule shows command rows, and saves
// a full-page PNG under .ci-out/ for people to look at. Used by test/browser/demo.test.ts.
import { mkdirSync } from 'node:fs';
import { dirname, resolve, sep } from 'node:path';

const OUT_DIR = resolve('.ci-out');

export function demoScreenshotPlugin() {
  return {
    name: 'tauline-demo-screenshot',
    async executeCommand({ command, payload, session }) {
      if (command !== 'tauline-demo-screenshot') return undefined;
      if (session.browser.type !== 'puppeteer') throw new Error('tauline-demo-screenshot needs the Chrome (puppeteer) launcher');
      const { path, out, width = 1440, height = 1000 } = payload ?? {};
      const target = resolve(String(out));
      if (!target.startsWith(OUT_DIR + sep)) throw new Error(`screenshots go under .ci-out/; received ${out}`);
      const testPage = session.browser.getPage(session.id);
      const page = await testPage.browser().newPage();
      try {
        await page.setViewport({ width, height });
        await page.goto(new URL(String(path), testPage.url()).href);
        await page.waitForFunction(() => {
          const el = document.querySelector('tauline-steering-schedule');
          return (el?.shadowRoot?.querySelectorAll('tbody tr[part~="row"]').length ?? 0) > 0;
        }, { timeout: 30000 });
        mkdirSync(dirname(target), { recursive: true });
        await page.screenshot({ path: target, fullPage: true });
        return target;
      } finally {
        await page.close();
      }
    },
  };
}
