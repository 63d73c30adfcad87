// @web/test-runner plugin: the server command `tauline-demo-screenshot` opens a page (in a new
// tab of the test browser), waits until the steering schedule shows command rows, and saves
// a full-page PNG under .ci-out/ for people to look at. Used by test/browser/demo.test.ts.
import { mkdirSync } from 'node:fs';
import { dirname, join, resolve, sep } from 'node:path';

const OUT_DIR = resolve('.ci-out');

/**
 * `tauline-demo-views`: opens the demo at a phone-sized viewport, and for each view (the page top and
 * each section the nav links to) scrolls it into view, measures the page's scrollWidth against
 * innerWidth, lists elements wider than the viewport, and saves a viewport screenshot
 * `.ci-out/demo-<width>-<view>.png`.
 */
async function demoViews(
  {
    path = '/demo/index.html',
    width = 390,
    height = 844,
    views = ['top', 'schedule', 'budget', 'stability', 'review'],
  },
  session,
) {
  if (session.browser.type !== 'puppeteer') throw new Error('tauline-demo-views needs the Chrome (puppeteer) launcher');
  const testPage = session.browser.getPage(session.id);
  const page = await testPage.browser().newPage();
  try {
    await page.setViewport({ width, height });
    await page.goto(new URL(String(path), testPage.url()).href);
    await page.waitForFunction(
      () =>
        (document.querySelector('tauline-steering-schedule')?.shadowRoot?.querySelectorAll('tbody tr[part~="row"]')
          .length ?? 0) > 0,
      { timeout: 30000 },
    );
    await new Promise((r) => setTimeout(r, 300));
    mkdirSync(OUT_DIR, { recursive: true });
    const out = [];
    for (const view of views) {
      const measured = await page.evaluate((v) => {
        if (v === 'top') window.scrollTo(0, 0);
        else document.getElementById(v)?.scrollIntoView({ block: 'start' });
        const wide = [...document.querySelectorAll('body *')]
          .filter((el) => el.getBoundingClientRect().right > window.innerWidth + 0.5)
          .slice(0, 5)
          .map(
            (el) =>
              `${el.localName}${el.id ? `#${el.id}` : ''}.${[...el.classList].join('.')} right=${Math.round(el.getBoundingClientRect().right)}`,
          );
        return { view: v, scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth, wide };
      }, view);
      await new Promise((r) => setTimeout(r, 100));
      const file = join(OUT_DIR, `demo-${width}-${view}.png`);
      await page.screenshot({ path: file });
      out.push({ ...measured, file });
    }
    return out;
  } finally {
    await page.close();
  }
}

export function demoScreenshotPlugin() {
  return {
    name: 'tauline-demo-screenshot',
    async executeCommand({ command, payload, session }) {
      if (command === 'tauline-demo-views') return demoViews(payload ?? {}, session);
      if (command !== 'tauline-demo-screenshot') return undefined;
      if (session.browser.type !== 'puppeteer')
        throw new Error('tauline-demo-screenshot needs the Chrome (puppeteer) launcher');
      const { path, out, width = 1440, height = 1000 } = payload ?? {};
      const target = resolve(String(out));
      if (!target.startsWith(OUT_DIR + sep)) throw new Error(`screenshots go under .ci-out/; received ${out}`);
      const testPage = session.browser.getPage(session.id);
      const page = await testPage.browser().newPage();
      try {
        await page.setViewport({ width, height });
        await page.goto(new URL(String(path), testPage.url()).href);
        await page.waitForFunction(
          () => {
            const el = document.querySelector('tauline-steering-schedule');
            return (el?.shadowRoot?.querySelectorAll('tbody tr[part~="row"]').length ?? 0) > 0;
          },
          { timeout: 30000 },
        );
        mkdirSync(dirname(target), { recursive: true });
        await page.screenshot({ path: target, fullPage: true });
        return target;
      } finally {
        await page.close();
      }
    },
  };
}
