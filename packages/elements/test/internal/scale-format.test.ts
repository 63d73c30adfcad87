import { expect } from '@open-wc/testing';
import {
  formatFraction,
  formatHertz,
  formatNumber,
  formatOffsetAuto,
  parseTimeUnit,
  pickTimeUnit,
  typographicMinus,
} from '../../src/internal/format.js';
import { linearScale, linearTicks, logScale, logTicks, niceStep, padDomain } from '../../src/internal/scale.js';

// Scales and ticks: arithmetic checked by hand in each test ([C]); tick steps of 1, 2, 5 × 10^k are
// common practice, no source.
describe('internal/scale', () => {
  it('linearScale(d0, d1, r0, r1) maps and inverts, and a flipped range maps upwards', () => {
    const s = linearScale(0, 10, 100, 0);
    expect(s.map(0)).to.equal(100);
    expect(s.map(2.5)).to.equal(75);
    expect(s.invert(75)).to.equal(2.5);
  });

  it('linearScale with a zero-width domain maps to the range centre', () => {
    expect(linearScale(3, 3, 0, 100).map(3)).to.equal(50);
  });

  it('logScale(1, 1000, 0, 300) puts each decade 100 px apart', () => {
    const s = logScale(1, 1000, 0, 300);
    expect(s.map(10)).to.be.closeTo(100, 1e-9);
    expect(s.invert(200)).to.be.closeTo(100, 1e-9);
  });

  it('niceStep and linearTicks give 1/2/5 × 10^k steps', () => {
    expect(niceStep(0, 10, 5)).to.equal(2);
    expect(niceStep(0, 1e-9, 4)).to.be.closeTo(2e-10, 1e-24);
    expect(linearTicks(-1, 1, 4)).to.deep.equal([-1, -0.5, 0, 0.5, 1]);
  });

  it('logTicks(3e-13, 2e-10) lists the decades inside', () => {
    const t = logTicks(3e-13, 2e-10);
    expect(t.length).to.equal(3);
    expect(t[0]).to.be.closeTo(1e-12, 1e-24);
  });

  it('padDomain widens a zero-width span', () => {
    expect(padDomain(0, 0, 0.1)).to.deep.equal([-1, 1]);
    expect(padDomain(0, 10, 0.1)).to.deep.equal([-1, 11]);
  });
});

describe('internal/format', () => {
  it('typographicMinus(text) turns number signs and exponent signs into U+2212 and leaves dates and word hyphens alone', () => {
    expect(
      typographicMinus(
        'predicted offset -4.52 ns and frequency -7.92e-15 before 2027-03-08T14:30:00Z; set low (-4.4647e-10), time-tagged',
      ),
    ).to.equal(
      'predicted offset −4.52 ns and frequency −7.92e−15 before 2027-03-08T14:30:00Z; set low (−4.4647e−10), time-tagged',
    );
    expect(typographicMinus('-.5 and 1.33e-13')).to.equal('−.5 and 1.33e−13');
  });

  it('pickTimeUnit(3.2e-9) picks ns and parseTimeUnit reads "us" as µs', () => {
    expect(pickTimeUnit(3.2e-9).unit).to.equal('ns');
    expect(pickTimeUnit(0).unit).to.equal('ps');
    expect(parseTimeUnit('us')!.unit).to.equal('µs');
    expect(parseTimeUnit('auto')).to.equal(null);
  });

  it('formatFraction(-4.4647e-10) prints a typographic minus', () => {
    expect(formatFraction(-4.4647e-10)).to.equal('−4.4647e−10');
    expect(formatFraction(Number.NaN)).to.equal('—');
  });

  it('formatHertz(-4.5674e-3) reads −4.567 mHz', () => {
    expect(formatHertz(-4.5674e-3)).to.equal('−4.567 mHz');
  });

  it('formatNumber and formatOffsetAuto choose plain or scientific notation', () => {
    expect(formatNumber(38.57533, 6)).to.equal('38.5753');
    expect(formatNumber(1.5e7, 3)).to.equal('1.50e7');
    expect(formatOffsetAuto(-1.5e-9, 3)).to.equal('−1.5 ns');
  });
});
