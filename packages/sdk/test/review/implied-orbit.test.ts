import { describe, expect, it } from 'vitest';
import { reciprocalOffset } from '../../src/relativity/rate.js';
import { reviewOffsets } from '../../src/review/index.js';

/**
 * Reference values from implied-orbit.py beside this file (mpmath, 50 digits) [C]: for the double c that each
 * JSON text parses to, the rate r = 1/(1 + c) − 1 it compensates (exact) and the circular orbit
 * a = 3GM/(2c²(L_G − r)) that needs it (IERS Conventions 2010 eq. 10.9 averaged [V1]; IERS 2010 GM and L_G).
 */
const CASES = [
  {
    text: '-4.53e-10',
    rate: 4.5300000020520898674e-10,
    semiMajorAxis: 27_272_450.995257697,
    naiveRate: 4.5300008189030905e-10,
  },
  {
    text: '-5.3e-10',
    rate: 5.3000000028090003109e-10,
    semiMajorAxis: 39_852_521.346484400647,
    naiveRate: 5.300000438523966e-10,
  },
  {
    text: '-1e-15',
    rate: 1.0000000000000010777e-15,
    semiMajorAxis: 9_545_522.5371437280115,
    naiveRate: 1.1102230246251565e-15,
  },
];

describe('the rate a factory offset compensates, −c/(1 + c), against mpmath (implied-orbit.py)', () => {
  for (const { text, rate, naiveRate } of CASES) {
    it(`reciprocalOffset(${text}) agrees with the 50-digit 1/(1 + c) − 1 to 1e-15 relative, where the direct double form misses by more than 5e-8`, () => {
      const c = Number(text);
      expect(Math.abs(reciprocalOffset(c) - rate)).toBeLessThanOrEqual(1e-15 * rate);
      // The cancellation-prone form the review used before: 1 + c rounds to 2^-52, so ~7 digits (or all) are lost.
      const direct = 1 / (1 + c) - 1;
      expect(direct).toBe(naiveRate);
      expect(Math.abs(direct - rate)).toBeGreaterThan(5e-8 * rate);
    });
  }

  it('reviewOffsets(doc) names the orbit a configured −4.53e-10 would need, 27 272 451 m, to the metre (the direct form said 27 272 460 m)', () => {
    const doc = {
      nominalFrequencyHz: 10_230_000,
      tolerance: { fractional: 1e-12 },
      spacecraft: [
        { id: 'PELLAN-7', configured: { fractionalOffset: Number('-4.53e-10') }, orbit: { semiMajorAxis: 26_561_750 } },
      ],
    };
    const finding = reviewOffsets(doc, { monteCarloRuns: 100 }).spacecraft[0]!;
    expect(finding.verdict).toBe('fail');
    const message = finding.diagnosis.find((d) => d.code === 'other-orbit')?.message ?? '';
    const implied = Number(/a clock at a = (\d+) m/.exec(message)?.[1]);
    expect(Math.abs(implied - CASES[0]!.semiMajorAxis)).toBeLessThanOrEqual(0.5);
  });
});
