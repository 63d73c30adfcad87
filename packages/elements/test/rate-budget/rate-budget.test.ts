import { expect, fixture, html } from '@open-wc/testing';
import { FLIGHT_CONFIGURATION_CAUTION, meanClockRate } from '@tauline/sdk/relativity';
import '../../src/rate-budget/rate-budget.define.js';
import type { TaulineRateBudget } from '../../src/rate-budget/rate-budget.js';
import { captureWarnings } from '../fixtures.js';

const cells = (el: TaulineRateBudget, rowClass: string): string[] =>
  [...el.shadowRoot!.querySelectorAll(`tr.${rowClass} td`)].map((td) => td.textContent!.trim());

describe('tauline-rate-budget', () => {
  it('<tauline-rate-budget> is accessible (axe-core) with data', async () => {
    const el = await fixture<TaulineRateBudget>(
      html`<tauline-rate-budget .budget=${meanClockRate(26_561_750)}></tauline-rate-budget>`,
    );
    await expect(el).to.be.accessible();
  });

  it('budget = meanClockRate(26 561 750 m) shows +45.7884 and −7.2131 µs/day and 38.5753 µs/day net (physics-refs §2 split vs geoid [C])', async () => {
    const el = await fixture<TaulineRateBudget>(
      html`<tauline-rate-budget .budget=${meanClockRate(26_561_750)}></tauline-rate-budget>`,
    );
    const num = (text: string): number => Number(text.replace('−', '-'));
    // Published to 4 decimals: agree within half a unit of the last digit.
    expect(num(cells(el, 'gravitational')[0]!)).to.be.closeTo(45.7884, 5e-5);
    expect(num(cells(el, 'velocity')[0]!)).to.be.closeTo(-7.2131, 5e-5);
    expect(num(cells(el, 'total')[0]!)).to.be.closeTo(38.5753, 5e-5);
  });

  it('the factory offset at a = 26 561 400 m reads −4.4647e−10 and −4.567 mHz at 10.23 MHz (IS-GPS-200E §3.3.1.1 via physics-refs §3 [V2])', async () => {
    const el = await fixture<TaulineRateBudget>(
      html`<tauline-rate-budget .budget=${meanClockRate(26_561_400.1)}></tauline-rate-budget>`,
    );
    const total = cells(el, 'total');
    expect(total[2]).to.equal('−4.4647e−10');
    expect(total[3]).to.equal('−4.567 mHz');
  });

  it("the factory offsets and hertz values carry the SDK's FLIGHT_CONFIGURATION_CAUTION, and the bar column has a visible header", async () => {
    const el = await fixture<TaulineRateBudget>(
      html`<tauline-rate-budget .budget=${meanClockRate(26_561_750)}></tauline-rate-budget>`,
    );
    const caution = el.shadowRoot!.querySelector('[part~="caution"]')!;
    expect(caution.getAttribute('role')).to.equal('note');
    expect(caution.textContent!.trim()).to.equal(FLIGHT_CONFIGURATION_CAUTION);
    const bar = el.shadowRoot!.querySelector('th.bar-col')! as HTMLElement;
    // biome-ignore lint/performance/useDomNodeTextContent: innerText is the rendered (visible) text, which this checks.
    expect(bar.innerText.trim()).to.match(/^Size and sign/);
  });

  it('nominal-frequency attribute changes the hertz column (10.23 MHz × 2 doubles the shift)', async () => {
    const el = await fixture<TaulineRateBudget>(
      html`<tauline-rate-budget nominal-frequency="20460000" .budget=${meanClockRate(26_561_400.1)}></tauline-rate-budget>`,
    );
    expect(el.nominalFrequency).to.equal(20.46e6);
    expect(cells(el, 'total')[3]).to.equal('−9.135 mHz');
  });

  it('j2Rate adds a J2 row and enters the net rate', async () => {
    const b = meanClockRate(26_561_750);
    const el = await fixture<TaulineRateBudget>(
      html`<tauline-rate-budget .budget=${b} .j2Rate=${-3.76e-13}></tauline-rate-budget>`,
    );
    // Each part's share of the factory offset is −part/(1 + net rate): the J2 share is +3.7600e−13.
    expect(cells(el, 'j2')[2]).to.equal('3.7600e−13');
    const net = b.fractionalRate - 3.76e-13;
    expect(cells(el, 'total')[2]).to.equal((-net / (1 + net)).toExponential(4).replace('-', '−').replace('e-', 'e−'));
    expect(cells(el, 'total')[0]).to.equal((net * 86400e6).toFixed(4));
  });

  it('without data it shows an empty state', async () => {
    const el = await fixture<TaulineRateBudget>(html`<tauline-rate-budget></tauline-rate-budget>`);
    expect(el.shadowRoot!.querySelector('.state')!.textContent).to.contain('No rate budget');
  });

  it('bad data shows an error state and warns once, never throws', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineRateBudget>(
        html`<tauline-rate-budget .budget=${{ fractionalRate: 'x' }}></tauline-rate-budget>`,
      );
      expect(el.shadowRoot!.querySelector('.state.error')!.textContent).to.contain('budget.fractionalRate');
      el.budget = { fractionalRate: Number.NaN, gravitational: 0, velocity: 0 };
      await el.updateComplete;
      expect(w.list.map((x) => x.code)).to.deep.equal(['invalid-budget']);
    } finally {
      w.restore();
    }
  });

  it('theming: --tauline-color-gain on the page colours the gain bars', async () => {
    const wrap = await fixture<HTMLDivElement>(
      html`<div style="--tauline-color-gain: rgb(1, 2, 3)"><tauline-rate-budget .budget=${meanClockRate(26_561_750)}></tauline-rate-budget></div>`,
    );
    const el = wrap.querySelector('tauline-rate-budget')!;
    await el.updateComplete;
    const bar = el.shadowRoot!.querySelector('tr.gravitational .bar')!;
    expect(getComputedStyle(bar).backgroundColor).to.equal('rgb(1, 2, 3)');
  });

  it('styles do not leak: a page <table> keeps its own look', async () => {
    const wrap = await fixture<HTMLDivElement>(
      html`<div><table><tr><td>x</td></tr></table><tauline-rate-budget .budget=${meanClockRate(26_561_750)}></tauline-rate-budget></div>`,
    );
    expect(getComputedStyle(wrap.querySelector('td')!).borderBottomStyle).to.equal('none');
  });
});
