import { expect, fixture, html, nextFrame } from '@open-wc/testing';
import '../../src/stability-plot/stability-plot.define.js';
import type { TaulineStabilityPlot } from '../../src/stability-plot/stability-plot.js';
import { vestraStabilityRows } from '../fixtures.js';

/** The element's number style: typographic minus (U+2212) for signs and exponents. */
const typographic = (text: string): string => text.replace(/-/g, '−');

describe("tauline-stability-plot with the SDK's analyzeStability rows (VESTRA-4 example)", () => {
  it('<tauline-stability-plot> shows every OADEV and TDEV estimate of the SDK rows with n ≥ 2 in its table, values to 5 figures, TDEV in seconds', async () => {
    const rows = await vestraStabilityRows();
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot style="width:700px" .series=${rows}></tauline-stability-plot>`,
    );
    await nextFrame();
    await el.updateComplete;
    await expect(el).to.be.accessible();
    const shown = (name: 'oadev' | 'tdev') =>
      rows.flatMap((r) => {
        const e = r.statistics[name];
        return e && e.n >= 2 ? [{ tau: r.tau, e }] : [];
      });
    const oadev = shown('oadev'),
      tdev = shown('tdev');
    expect(oadev.length).to.be.greaterThan(5);
    // The table is windowed: its row count is in aria-rowcount (plus the header row).
    const table = el.shadowRoot!.querySelector('[part="table"]')!;
    expect(Number(table.getAttribute('aria-rowcount'))).to.equal(oadev.length + tdev.length + 1);
    const first = [...el.shadowRoot!.querySelectorAll('tbody tr')[0]!.querySelectorAll('td')].map(
      (td) => td.textContent,
    );
    expect(first[0]).to.equal(String(oadev[0]!.tau));
    expect(first[1]).to.equal(typographic(oadev[0]!.e.deviation.toExponential(4)));
    expect(first[4]).to.equal('1');
    expect(el.plotLabel).to.contain('TDEV (time deviation in seconds, right axis)');
  });
});
