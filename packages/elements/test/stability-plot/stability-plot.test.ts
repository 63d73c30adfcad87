import { expect, html, nextFrame, fixture as openFixture } from '@open-wc/testing';
import { simulateClock } from '@tauline/sdk/clock-model';
import { analyzeStability, type StabilityRow } from '@tauline/sdk/stability';
import type { LitElement, TemplateResult } from 'lit';
import '../../src/stability-plot/stability-plot.define.js';
import { DEFAULT_MIN_TERMS, normaliseStability } from '../../src/stability-plot/stability-data.js';
import { decimateLogTau } from '../../src/stability-plot/stability-draw.js';
import { type StabilityScales, scaleOf, stabilityScales } from '../../src/stability-plot/stability-layout.js';
import type { TaulineStabilityPlot } from '../../src/stability-plot/stability-plot.js';
import { captureWarnings } from '../fixtures.js';

// 1000-point set of W. J. Riley, NIST SP 1065 pp. 107–108, as tabulated in physics-refs §10 [V2; reproduced C]:
// OADEV at τ = 1, 10, 100 and the 68.27 % WFM intervals of the check value at τ = 1 and 10 ([C]).
const OADEV = {
  statistic: 'oadev',
  tau: Float64Array.of(1, 10, 100),
  deviation: Float64Array.of(2.922319e-1, 9.159953e-2, 3.241343e-2),
  low: Float64Array.of(2.84542e-1, 8.668102e-2, 2.5e-2),
  high: Float64Array.of(3.005809e-1, 9.746298e-2, 4.2e-2),
  n: Float64Array.of(998, 980, 800),
};
const MDEV = {
  statistic: 'mdev',
  tau: Float64Array.of(1, 10, 100),
  deviation: Float64Array.of(2.922319e-1, 6.172376e-2, 2.170921e-2),
};
// TDEV of the same set, physics-refs §10 [V2]: a time deviation in seconds (τ0 = 1 s), not a fraction.
const TDEV = {
  statistic: 'tdev',
  tau: Float64Array.of(1, 10, 100),
  deviation: Float64Array.of(1.687202e-1, 3.563623e-1, 1.253382),
};

/**
 * The plot's scales recomputed from its public surface: its `series` and `min-terms`, the legend's pressed
 * buttons (shown statistics), `no-intervals` and the plot box's size, through the pure layout it draws with.
 */
function publicScales(el: TaulineStabilityPlot): StabilityScales | null {
  const minTerms = Number.isFinite(el.minTerms) && el.minTerms >= 1 ? el.minTerms : DEFAULT_MIN_TERMS;
  const data = normaliseStability(el.series, minTerms).series;
  const pressed = Array.from(
    el.shadowRoot!.querySelectorAll('[part~="legend"] button'),
    (b) => b.getAttribute('aria-pressed') === 'true',
  );
  const shown = data.filter((s, k) => s.tau.length > 0 && pressed[k] !== false);
  const r = el.shadowRoot!.querySelector('[part="plot"]')!.getBoundingClientRect();
  return stabilityScales(shown, !el.noIntervals, Math.floor(r.width), Math.floor(r.height));
}

/** Plot-box position of point i of statistic k (index in `series`), through {@link publicScales}. */
function pointPosition(el: TaulineStabilityPlot, k: number, i: number): { x: number; y: number } {
  const sc = publicScales(el)!;
  const s = normaliseStability(el.series, el.minTerms).series[k]!;
  const sy = scaleOf(sc, s.statistic)!;
  return { x: sc.sx.map(s.tau[i]!), y: sy.map(s.deviation[i]!) };
}

/**
 * Renders like open-wc's fixture, then lets the ResizeObserver report the plot's size (the plot
 * reads no layout during an update, so it draws after the observer's first callback) and waits for
 * that update.
 */
async function fixture<T extends LitElement>(template: TemplateResult): Promise<T> {
  const el = await openFixture<T>(template);
  await nextFrame();
  await nextFrame();
  await el.updateComplete;
  return el;
}

/** Moves the pointer onto point i of series k (through the plot's own scales) and waits for the read-out. */
async function hoverPoint(el: TaulineStabilityPlot, k: number, i: number): Promise<Element> {
  const box = el.shadowRoot!.querySelector<HTMLElement>('canvas.overlay')!;
  const r = el.shadowRoot!.querySelector('canvas.data')!.getBoundingClientRect();
  const pos = pointPosition(el, k, i);
  box.dispatchEvent(
    new PointerEvent('pointermove', { clientX: r.left + pos.x, clientY: r.top + pos.y, bubbles: true }),
  );
  await el.updateComplete;
  return el.shadowRoot!.querySelector('[part="tooltip"]')!;
}

/** Counts non-transparent canvas pixels right of the plot frame (where a right-hand axis draws), between its top and bottom. */
function inkRightOfFrame(el: TaulineStabilityPlot): number {
  const canvas = el.shadowRoot!.querySelector<HTMLCanvasElement>('canvas.data')!;
  const f = publicScales(el)!.frame;
  const ratio = canvas.width / canvas.getBoundingClientRect().width;
  const x0 = Math.ceil((f.left + f.width + 3) * ratio);
  const img = canvas
    .getContext('2d')!
    .getImageData(x0, Math.floor(f.top * ratio), canvas.width - x0, Math.floor(f.height * ratio));
  let ink = 0;
  for (let j = 3; j < img.data.length; j += 4) if (img.data[j]! > 0) ink += 1;
  return ink;
}

describe('tauline-stability-plot', () => {
  it('<tauline-stability-plot> is accessible (axe-core) with data', async () => {
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot .series=${[OADEV, MDEV]}></tauline-stability-plot>`,
    );
    await expect(el).to.be.accessible();
  });

  it('renders one table row per point with the NIST SP 1065 values, and a legend entry per statistic', async () => {
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot .series=${[OADEV, MDEV]}></tauline-stability-plot>`,
    );
    const rows = el.shadowRoot!.querySelectorAll('tbody tr');
    expect(rows.length).to.equal(6);
    expect(rows[1]!.querySelectorAll('td')[1]!.textContent).to.equal('9.1600e−2');
    expect(rows[1]!.querySelectorAll('td')[2]!.textContent).to.equal('8.668e−2');
    expect(rows[1]!.querySelectorAll('td')[4]!.textContent).to.equal('1');
    expect(el.shadowRoot!.querySelectorAll('[part="legend"] li').length).to.equal(2);
  });

  it('the canvas gets an accessible name computed from the data', async () => {
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot .series=${[OADEV]}></tauline-stability-plot>`,
    );
    const label = el.shadowRoot!.querySelector('canvas.data')!.getAttribute('aria-label')!;
    expect(label).to.contain('Overlapping ADEV');
    expect(label).to.contain('1 s to 1.67 min');
    expect(label).to.contain('3.24e−2 to 2.92e−1');
    expect(label).to.contain('dimensionless');
  });

  it("normaliseStability(rows) takes the SDK's own rows (analyzeStability of a seeded simulated clock) column by column, estimates with n < 2 as a note", () => {
    // White FM (q1 = 1e-22 s) plus white PM, 2000 samples at 1 s, seeded: the rows carry every field the SDK emits
    // (m, noise, alpha, noiseSource, noiseEstimate, per-statistic low/high/n/edf/edfModel).
    const clock = simulateClock({
      samples: 2000,
      tau0: 1,
      q: { q1: 1e-22, q2: 0 },
      seed: 20261204,
      measurementNoise: 1e-11,
    });
    const rows: readonly StabilityRow[] = analyzeStability(
      { phase: clock.phase, tau0: clock.tau0 },
      { statistics: ['oadev', 'mdev'] },
    ).rows;
    const set = normaliseStability(rows);
    expect(set.problems).to.deep.equal([]);
    expect(set.series.map((s) => s.statistic)).to.deep.equal(['oadev', 'mdev']);
    for (const s of set.series) {
      const name = s.statistic as 'oadev' | 'mdev';
      const all = rows.flatMap((r) => {
        const e = r.statistics[name];
        return e ? [{ row: r, e }] : [];
      });
      const kept = all.filter(({ e }) => e.n >= DEFAULT_MIN_TERMS);
      expect(kept.length).to.be.greaterThan(5);
      expect(Array.from(s.tau)).to.deep.equal(kept.map(({ row }) => row.tau));
      expect(Array.from(s.deviation)).to.deep.equal(kept.map(({ e }) => e.deviation));
      expect(Array.from(s.low!)).to.deep.equal(kept.map(({ e }) => e.low));
      expect(Array.from(s.high!)).to.deep.equal(kept.map(({ e }) => e.high));
      expect(Array.from(s.n!)).to.deep.equal(kept.map(({ e }) => e.n));
      expect(s.noise).to.deep.equal(kept.map(({ row }) => row.noise));
      const few = all.filter(({ e }) => e.n < DEFAULT_MIN_TERMS).map(({ row }) => row.tau);
      const note = set.fewTerms.find((f) => f.statistic === name);
      expect(note?.taus ?? []).to.deep.equal(few);
    }
  });

  it('hover over a point shows a read-out with τ and the deviation', async () => {
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot style="width:600px" .series=${[OADEV]}></tauline-stability-plot>`,
    );
    const tip = await hoverPoint(el, 0, 1);
    expect(tip.textContent).to.contain('10 s');
    expect(tip.textContent).to.contain('9.160e−2');
    expect(tip.textContent).to.contain('(dimensionless)');
  });

  it('non-positive points are dropped with one warning; all-bad data shows an error state', async () => {
    const w = await captureWarnings();
    try {
      const el = await fixture<TaulineStabilityPlot>(
        html`<tauline-stability-plot .series=${[{ statistic: 'adev', tau: [1, 2], deviation: [0, -1] }]}></tauline-stability-plot>`,
      );
      expect(el.shadowRoot!.querySelector('.state.error')).to.exist;
      el.series = 'nonsense' as unknown as [];
      await el.updateComplete;
      expect(el.shadowRoot!.querySelector('.state.error')!.textContent).to.contain('series must be an array');
      expect(w.list.length).to.equal(1);
    } finally {
      w.restore();
    }
  });

  it('no-table leaves the table out (nothing hidden is built); the plot keeps its accessible name', async () => {
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot no-table .series=${[OADEV]}></tauline-stability-plot>`,
    );
    expect(el.shadowRoot!.querySelector('table')).to.equal(null);
    expect(el.shadowRoot!.querySelector('canvas.data')!.getAttribute('aria-label')).to.contain('Overlapping ADEV');
  });

  it("decimateLogTau(τ, dev, lx0, lx1, cols) keeps every log-τ column's first, lowest, highest and last deviation (brute-force scan in the test; common practice, no source)", () => {
    // Seeded (Park–Miller) τ over six decades, jittered deviations: 200 000 points into 300 columns.
    let seed = 12345;
    const rnd = (): number => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const n = 200_000,
      cols = 300;
    const tau = Float64Array.from({ length: n }, (_, i) => 10 ** ((6 * (i + 0.5 * rnd())) / n));
    const dev = Float64Array.from(tau, (t) => (1e-11 / Math.sqrt(t)) * (1 + 0.3 * (rnd() - 0.5)));
    const lx0 = Math.log10(tau[0]!),
      lx1 = Math.log10(tau[n - 1]!) + 1e-9;
    const line = decimateLogTau(tau, dev, lx0, lx1, cols);
    expect(line.length).to.be.at.most(4 * cols);
    const kept = new Set(Array.from(line.y.subarray(0, line.length)));
    const byCol = new Map<number, number[]>();
    tau.forEach((t, i) => {
      const c = Math.floor((Math.log10(t) - lx0) * (cols / (lx1 - lx0)));
      const col = byCol.get(c) ?? [];
      col.push(dev[i]!);
      byCol.set(c, col);
    });
    let missing = 0;
    for (const values of byCol.values()) {
      for (const v of [values[0]!, Math.min(...values), Math.max(...values), values[values.length - 1]!])
        if (!kept.has(v)) missing += 1;
    }
    expect(missing).to.equal(0);
    for (let i = 1; i < line.length; i++) expect(line.x[i]!).to.be.at.least(line.x[i - 1]!);
  });

  it('decimateLogTau(τ, dev, ...) throws a RangeError when the deviation column does not match τ in length', () => {
    const tau = Float64Array.of(1, 2, 4),
      dev = Float64Array.of(1e-11, 8e-12);
    expect(() => decimateLogTau(tau, dev, 0, 1, 10)).to.throw(
      RangeError,
      'deviation has 2 element(s) for 3 τ value(s)',
    );
  });

  it('the table is windowed: 10^5 points put at most 30 rows in the DOM, aria-rowcount gives the full count, scrolling moves the window', async () => {
    const n = 100_000;
    const big = {
      statistic: 'oadev',
      tau: Float64Array.from({ length: n }, (_, i) => i + 1),
      deviation: Float64Array.from({ length: n }, (_, i) => 1e-11 / Math.sqrt(i + 1)),
    };
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot style="width:700px" .series=${[big]}></tauline-stability-plot>`,
    );
    const rows = () => el.shadowRoot!.querySelectorAll('tbody tr[part~="row"]');
    expect(rows().length).to.be.at.most(30);
    expect(el.shadowRoot!.querySelector('table')!.getAttribute('aria-rowcount')).to.equal(String(n + 1));
    const wrap = el.shadowRoot!.querySelector<HTMLElement>('.table-wrap')!;
    wrap.scrollTop = 24 * 50_000;
    wrap.dispatchEvent(new Event('scroll'));
    await el.updateComplete;
    const first = Number(rows()[0]!.getAttribute('aria-rowindex'));
    expect(first).to.be.within(49_980, 50_002);
    expect(rows().length).to.be.at.most(30);
  });

  it('an update reads no layout: setting 10^4 points and hovering call getBoundingClientRect on nothing', async () => {
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot style="width:700px" .series=${[OADEV]}></tauline-stability-plot>`,
    );
    const original = Element.prototype.getBoundingClientRect;
    let reads = 0;
    Element.prototype.getBoundingClientRect = function (this: Element) {
      reads += 1;
      return original.call(this);
    };
    try {
      const n = 10_000;
      el.series = [
        {
          statistic: 'oadev',
          tau: Float64Array.from({ length: n }, (_, i) => i + 1),
          deviation: Float64Array.from({ length: n }, (_, i) => 1e-11 / Math.sqrt(i + 1)),
        },
      ];
      await el.updateComplete;
      await nextFrame();
      await el.updateComplete;
      const overlay = el.shadowRoot!.querySelector('canvas.overlay')!;
      overlay.dispatchEvent(new PointerEvent('pointermove', { clientX: 200, clientY: 100, bubbles: true }));
      await el.updateComplete;
    } finally {
      Element.prototype.getBoundingClientRect = original;
    }
    expect(reads).to.equal(0);
    // It drew all the same: the data canvas has ink.
    const data = el.shadowRoot!.querySelector<HTMLCanvasElement>('canvas.data')!;
    const ink = data
      .getContext('2d')!
      .getImageData(0, 0, data.width, data.height)
      .data.some((v, j) => j % 4 === 3 && v > 0);
    expect(ink).to.equal(true);
  });

  it('a τ with fewer than min-terms terms (default 2, NIST SP 1065 §5.3 [M]) is left off and named in a note; min-terms="1" shows it', async () => {
    const withLast = {
      ...OADEV,
      tau: Float64Array.of(1, 10, 100, 500),
      deviation: Float64Array.of(2.922319e-1, 9.159953e-2, 3.241343e-2, 2e-2),
      low: Float64Array.of(2.84542e-1, 8.668102e-2, 2.5e-2, 1e-3),
      high: Float64Array.of(3.005809e-1, 9.746298e-2, 4.2e-2, 9),
      n: Float64Array.of(998, 980, 800, 1),
    };
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot style="width:600px" .series=${[withLast]}></tauline-stability-plot>`,
    );
    expect(el.shadowRoot!.querySelectorAll('tbody tr[part~="row"]').length).to.equal(3);
    expect(el.shadowRoot!.querySelector('[part~="note"]')!.textContent).to.contain('OADEV at τ = 8.33 min');
    expect(publicScales(el)!.sx.domain[1]).to.be.below(500);
    el.minTerms = 1;
    await el.updateComplete;
    expect(el.shadowRoot!.querySelectorAll('tbody tr[part~="row"]').length).to.equal(4);
    expect(el.shadowRoot!.querySelector('[part~="note"]')).to.equal(null);
  });

  it('legend buttons (aria-pressed) hide and show a statistic: it leaves the plot, its accessible name and the table', async () => {
    const el = await fixture<TaulineStabilityPlot>(
      html`<tauline-stability-plot style="width:600px" .series=${[OADEV, MDEV]}></tauline-stability-plot>`,
    );
    const buttons = el.shadowRoot!.querySelectorAll<HTMLButtonElement>('[part~="legend"] button');
    expect(buttons.length).to.equal(2);
    expect(buttons[0]!.getAttribute('aria-pressed')).to.equal('true');
    buttons[0]!.click();
    await el.updateComplete;
    expect(buttons[0]!.getAttribute('aria-pressed')).to.equal('false');
    expect(el.plotLabel).not.to.contain('Overlapping ADEV');
    expect(el.plotLabel).to.contain('MDEV');
    expect(el.shadowRoot!.querySelectorAll('tbody tr[part~="row"]').length).to.equal(3);
    buttons[0]!.click();
    await el.updateComplete;
    expect(el.plotLabel).to.contain('Overlapping ADEV');
    await expect(el).to.be.accessible();
  });

  describe('units: TDEV (seconds) apart from the dimensionless σ_y statistics (common practice, no source: one axis per unit)', () => {
    it('<tauline-stability-plot> with OADEV, MDEV and TDEV is accessible (axe-core)', async () => {
      const el = await fixture<TaulineStabilityPlot>(
        html`<tauline-stability-plot .series=${[OADEV, MDEV, TDEV]}></tauline-stability-plot>`,
      );
      await expect(el).to.be.accessible();
    });

    it('with only TDEV the single left axis is the time axis: no σ_y scale, no right-hand axis, table unit s', async () => {
      const el = await fixture<TaulineStabilityPlot>(
        html`<tauline-stability-plot style="width:600px" .series=${[TDEV]}></tauline-stability-plot>`,
      );
      const sc = publicScales(el)!;
      expect(sc.syFrequency).to.equal(null);
      expect(sc.syTime!.domain[0]).to.be.below(1.687202e-1);
      expect(sc.syTime!.domain[1]).to.be.above(1.253382);
      expect(inkRightOfFrame(el)).to.equal(0);
      const label = el.shadowRoot!.querySelector('canvas.data')!.getAttribute('aria-label')!;
      expect(label).to.contain('TDEV (time deviation in seconds) from 1.69e−1 s to 1.25e0 s');
      expect(label).not.to.contain('dimensionless');
      expect(el.shadowRoot!.querySelector('[part="legend"] li')!.textContent!.trim()).to.equal('TDEV (s)');
      const cells = el.shadowRoot!.querySelectorAll('tbody tr')[2]!.querySelectorAll('td');
      expect(cells[1]!.textContent).to.equal('1.2534e0');
      expect(cells[4]!.textContent).to.equal('s');
    });

    it('with only dimensionless statistics there is no time scale and nothing right of the frame', async () => {
      const el = await fixture<TaulineStabilityPlot>(
        html`<tauline-stability-plot style="width:600px" .series=${[OADEV, MDEV]}></tauline-stability-plot>`,
      );
      const sc = publicScales(el)!;
      expect(sc.syTime).to.equal(null);
      expect(sc.syFrequency).not.to.equal(null);
      expect(inkRightOfFrame(el)).to.equal(0);
      expect(el.shadowRoot!.querySelector('canvas.data')!.getAttribute('aria-label')).not.to.contain('seconds');
    });

    it('with both, TDEV gets its own scale on a right-hand axis and the σ_y scale does not stretch to seconds', async () => {
      const el = await fixture<TaulineStabilityPlot>(
        html`<tauline-stability-plot style="width:600px" .series=${[OADEV, MDEV, TDEV]}></tauline-stability-plot>`,
      );
      const sc = publicScales(el)!;
      // σ_y spans 2.17e−2 … 3.01e−1 (with the interval): the 1.25 s TDEV value must not widen it.
      expect(sc.syFrequency!.domain[1]).to.be.below(0.5);
      expect(sc.syTime!.domain[1]).to.be.above(1.253382);
      expect(inkRightOfFrame(el)).to.be.above(50);
      const top = sc.frame.top,
        bottom = sc.frame.top + sc.frame.height;
      for (let i = 0; i < 3; i++) {
        const p = pointPosition(el, 2, i);
        expect(p.y).to.be.within(top, bottom);
      }
      const legend = Array.from(el.shadowRoot!.querySelectorAll('[part="legend"] li'), (li) => li.textContent!.trim());
      expect(legend).to.deep.equal(['Overlapping ADEV', 'MDEV', 'TDEV (s, right axis)']);
      const units = Array.from(
        el.shadowRoot!.querySelectorAll('tbody tr'),
        (tr) => tr.querySelectorAll('td')[4]!.textContent,
      );
      expect(units).to.deep.equal(['1', '1', '1', '1', '1', '1', 's', 's', 's']);
    });

    it('the accessible name names both quantities with their units when both are drawn', async () => {
      const el = await fixture<TaulineStabilityPlot>(
        html`<tauline-stability-plot .series=${[OADEV, TDEV]}></tauline-stability-plot>`,
      );
      const label = el.plotLabel;
      expect(el.shadowRoot!.querySelector('canvas.data')!.getAttribute('aria-label')).to.equal(label);
      expect(label).to.contain('Overlapping ADEV (fractional frequency, dimensionless) from 3.24e−2 to 2.92e−1');
      expect(label).to.contain('TDEV (time deviation in seconds, right axis) from 1.69e−1 s to 1.25e0 s');
      expect(label).to.contain('τ from 1 s to 1.67 min');
    });

    it('hover over a TDEV point reads out the time deviation in seconds; an OADEV point stays dimensionless', async () => {
      const el = await fixture<TaulineStabilityPlot>(
        html`<tauline-stability-plot style="width:600px" .series=${[OADEV, TDEV]}></tauline-stability-plot>`,
      );
      const tip = await hoverPoint(el, 1, 2);
      expect(tip.textContent).to.contain('TDEV (s, right axis)');
      expect(tip.textContent).to.contain('Time deviation');
      expect(tip.textContent).to.contain('1.253e0 s');
      expect(tip.textContent).not.to.contain('dimensionless');
      const tip2 = await hoverPoint(el, 0, 0);
      expect(tip2.textContent).to.contain('2.922e−1 (dimensionless)');
      expect(tip2.textContent).not.to.contain('e−1 s');
    });

    it('keyboard: ←/→ step through points and ↓ switches to TDEV, announcing the value with its unit', async () => {
      const el = await fixture<TaulineStabilityPlot>(
        html`<tauline-stability-plot style="width:600px" .series=${[OADEV, TDEV]}></tauline-stability-plot>`,
      );
      const box = el.shadowRoot!.querySelector<HTMLElement>('.plot-box')!;
      const live = el.shadowRoot!.querySelector('[aria-live="polite"]')!;
      const key = async (k: string): Promise<void> => {
        box.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true }));
        await el.updateComplete;
      };
      await key('ArrowRight');
      expect(live.textContent).to.equal('Overlapping ADEV at τ = 1 s: 2.922e−1 (dimensionless)');
      await key('ArrowRight');
      await key('ArrowDown');
      expect(live.textContent).to.equal('TDEV at τ = 10 s: 3.564e−1 s');
      expect(el.shadowRoot!.querySelector('[part="tooltip"]')!.textContent).to.contain('3.564e−1 s');
      await key('Escape');
      expect(el.shadowRoot!.querySelector('[part="tooltip"]')).to.equal(null);
    });

    it('bad TDEV points are dropped with one warning and never throw; the σ_y statistics still draw on one axis', async () => {
      const w = await captureWarnings();
      try {
        const bad = { statistic: 'tdev', tau: [1, 10], deviation: [Number.NaN, -1e-9] };
        const el = await fixture<TaulineStabilityPlot>(
          html`<tauline-stability-plot style="width:600px" .series=${[OADEV, bad]}></tauline-stability-plot>`,
        );
        const sc = publicScales(el)!;
        expect(sc.syTime).to.equal(null);
        expect(sc.syFrequency).not.to.equal(null);
        expect(el.plotLabel).not.to.contain('TDEV');
        expect(w.list.length).to.equal(1);
        expect(w.list[0]!.message).to.contain('(tdev): 2 point(s)');
      } finally {
        w.restore();
      }
    });
  });
});
