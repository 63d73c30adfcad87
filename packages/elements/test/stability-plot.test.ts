import { fixture, html, expect } from '@open-wc/testing';
import '../src/stability-plot/stability-plot.define.js';
import type { TaulineStabilityPlot } from '../src/stability-plot/stability-plot.js';
import { normaliseStability } from '../src/stability-plot/stability-data.js';
import { captureWarnings } from './fixtures.js';

// 1000-point set of W. J. Riley, NIST SP 1065 pp. 107–108, as tabulated in physics-refs §10 [V2; reproduced C]:
// OADEV at τ = 1, 10, 100 and the 68.27 % WFM intervals of the check value at τ = 1 and 10 ([C]).
const OADEV = {
  statistic: 'oadev',
  tau: Float64Array.of(1, 10, 100),
  deviation: Float64Array.of(2.922319e-1, 9.159953e-2, 3.241343e-2),
  low: Float64Array.of(2.845420e-1, 8.668102e-2, 2.5e-2),
  high: Float64Array.of(3.005809e-1, 9.746298e-2, 4.2e-2),
  n: Float64Array.of(998, 980, 800),
};
const MDEV = { statistic: 'mdev', tau: Float64Array.of(1, 10, 100), deviation: Float64Array.of(2.922319e-1, 6.172376e-2, 2.170921e-2) };

describe('tauline-stability-plot', () => {
  it('<tauline-stability-plot> is accessible (axe-core) with data', async () => {
    const el = await fixture<TaulineStabilityPlot>(html`<tauline-stability-plot .series=${[OADEV, MDEV]}></tauline-stability-plot>`);
    await expect(el).to.be.accessible();
  });

  it('renders one table row per point with the NIST SP 1065 values, and a legend entry per statistic', async () => {
    const el = await fixture<TaulineStabilityPlot>(html`<tauline-stability-plot .series=${[OADEV, MDEV]}></tauline-stability-plot>`);
    const rows = el.shadowRoot!.querySelectorAll('tbody tr');
    expect(rows.length).to.equal(6);
    expect(rows[1]!.querySelectorAll('td')[1]!.textContent).to.equal('9.1600e−2');
    expect(rows[1]!.querySelectorAll('td')[2]!.textContent).to.equal('8.668e−2');
    expect(el.shadowRoot!.querySelectorAll('[part="legend"] li').length).to.equal(2);
  });

  it('the canvas gets an accessible name computed from the data', async () => {
    const el = await fixture<TaulineStabilityPlot>(html`<tauline-stability-plot .series=${[OADEV]}></tauline-stability-plot>`);
    const label = el.shadowRoot!.querySelector('canvas.data')!.getAttribute('aria-label')!;
    expect(label).to.contain('Overlapping ADEV');
    expect(label).to.contain('1 s to 1.67 min');
    expect(label).to.contain('3.24e−2 to 2.92e−1');
  });

  it('accepts the SDK row form (one StabilityRow per τ)', async () => {
    const rows = [
      { tau: 1, m: 1, noise: 'WFM', statistics: { oadev: { tau: 1, deviation: 0.29, low: 0.28, high: 0.3, n: 998 } } },
      { tau: 10, m: 10, noise: 'WFM', statistics: { oadev: { tau: 10, deviation: 0.09, low: 0.086, high: 0.097, n: 980 } } },
    ];
    const set = normaliseStability(rows);
    expect(set.problems).to.deep.equal([]);
    expect(Array.from(set.series[0]!.tau)).to.deep.equal([1, 10]);
    expect(set.series[0]!.noise).to.deep.equal(['WFM', 'WFM']);
  });

  it('hover over a point shows a read-out with τ and the deviation', async () => {
    const el = await fixture<TaulineStabilityPlot>(html`<tauline-stability-plot style="width:600px" .series=${[OADEV]}></tauline-stability-plot>`);
    const box = el.shadowRoot!.querySelector<HTMLElement>('.plot-box')!;
    const canvas = el.shadowRoot!.querySelector('canvas.data')!;
    // Find the marker of τ = 10 through the plot's own scales: the middle of the log axis.
    const r = canvas.getBoundingClientRect();
    const scales = (el as unknown as { _scales: { sx: { map(v: number): number }; sy: { map(v: number): number } } })._scales;
    box.dispatchEvent(new PointerEvent('pointermove', { clientX: r.left + scales.sx.map(10), clientY: r.top + scales.sy.map(9.159953e-2), bubbles: true }));
    await el.updateComplete;
    const tip = el.shadowRoot!.querySelector('[part="tooltip"]')!;
    expect(tip.textContent).to.contain('10 s');
    expect(tip.textContent).to.contain('9.160e−2');
  });

  it('non-positive points are dropped with one warning; all-bad data shows an error state', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineStabilityPlot>(html`<tauline-stability-plot .series=${[{ statistic: 'adev', tau: [1, 2], deviation: [0, -1] }]}></tauline-stability-plot>`);
      expect(el.shadowRoot!.querySelector('.state.error')).to.exist;
      el.series = 'nonsense' as unknown as [];
      await el.updateComplete;
      expect(el.shadowRoot!.querySelector('.state.error')!.textContent).to.contain('series must be an array');
      expect(w.list.length).to.equal(1);
    } finally { w.restore(); }
  });

  it('no-table hides the table visually but keeps it for assistive technology', async () => {
    const el = await fixture<TaulineStabilityPlot>(html`<tauline-stability-plot no-table .series=${[OADEV]}></tauline-stability-plot>`);
    const wrap = el.shadowRoot!.querySelector<HTMLElement>('.table-wrap')!;
    expect(wrap.getBoundingClientRect().height).to.be.at.most(1);
    expect(el.shadowRoot!.querySelector('table')).to.exist;
  });
});
