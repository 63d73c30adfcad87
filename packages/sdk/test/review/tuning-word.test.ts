import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { reviewOffsets } from '../../src/review/index.js';
import { nearestTuningWord } from '../../src/review/tuning-word.js';

/**
 * Reference values from tuning-word.py beside this file (Python fractions, exact) [C]: the word nearest to
 * W = 2^N·f_nominal·(1 + offset)/f_clk (DDS relation; common practice, no source) and nearest − W in words.
 */
const CASES = [
  {
    offset: -4.4860717450235345e-10,
    nominal: 10_230_000,
    clock: 100e6,
    bits: 64,
    word: 1887101917893919671n,
    error: 0.44733973903656005,
  },
  {
    offset: -4.4860717450235345e-10,
    nominal: 10_230_000,
    clock: 100e6,
    bits: 48,
    word: 28794890104583n,
    error: 0.4854957174642797,
  },
  { offset: -4.4647e-10, nominal: 10_230_000, clock: 40e6, bits: 32, word: 1098437885n, error: -0.46158043705901053 },
  {
    offset: -4.4647e-10,
    nominal: 10_230_000,
    clock: 122.88e6,
    bits: 56,
    word: 5998935438467511n,
    error: -0.29359160961030284,
  },
  {
    offset: 3.1e-11,
    nominal: 5e6,
    clock: 33.333333333333336e6,
    bits: 60,
    word: 172938225696388119n,
    error: 0.48848004947514223,
  },
];

describe('nearestTuningWord(offset, nominalHz, clockHz, bits) against exact rational arithmetic (tuning-word.py)', () => {
  for (const { offset, nominal, clock, bits, word, error } of CASES) {
    it(`nearestTuningWord(${offset}, ${nominal}, ${clock}, ${bits}) is ${word} exactly, nearest − W to 1e-15 words`, () => {
      const nearest = nearestTuningWord(offset, nominal, clock, bits);
      expect(nearest.word).toBe(word);
      // The error is formed as an exact remainder scaled by 2^60, then one division: ≤ 2^-60 + 1 ulp.
      expect(Math.abs(nearest.errorSteps - error)).toBeLessThanOrEqual(1e-15);
    });
  }

  it('reviewOffsets(doc) names the exact nearest 64-bit word and its error (a double word was 73 counts off, "error 0")', () => {
    const doc = {
      nominalFrequencyHz: 10_230_000,
      tolerance: { fractional: 5e-13 },
      spacecraft: [
        {
          id: 'KESTREL-64',
          configured: { tuningWord: { word: '1887000000000000000', clockHz: 100_000_000, bits: 64 } },
          orbit: { semiMajorAxis: 26_790_000 },
        },
      ],
    };
    const finding = reviewOffsets(doc, { monteCarloRuns: 100 }).spacecraft[0];
    const note = finding?.diagnosis.find((d) => d.code === 'quantisation');
    expect(finding?.expectedFractionalOffset).toBe(-4.4860717450235345e-10);
    // Step 2^-64·f_clk/f_nominal; error 0.44734 steps of it (tuning-word.py).
    const step = 100e6 / 2 ** 64 / 10_230_000;
    expect(note?.message).toBe(
      `The nearest 64-bit word is 1887101917893919671 (error ${(0.44733973903656005 * step).toExponential(5)}); the configured word is -101917893919671 steps away from it.`,
    );
  });

  it('reviewOffsets(kestrel-block-b) gives KESTREL-15 (32-bit word) the offset its nearest word produces to 2e-25 of the exact value', () => {
    const doc: unknown = JSON.parse(
      readFileSync(new URL('../../examples/review/kestrel-block-b-mistakes.review.json', import.meta.url), 'utf8'),
    );
    const finding = reviewOffsets(doc, { monteCarloRuns: 100 }).spacecraft.find((f) => f.id === 'KESTREL-15');
    const note = finding?.diagnosis.find((d) => d.code === 'quantisation');
    expect(finding?.expectedFractionalOffset).toBe(-4.4860717450235345e-10);
    // tuning-word.py: −8.666853284789203e-10 (the double-word form gave −8.666853673996267e-10, 3.9e-17 off).
    // Budget: errorSteps·step (≤ 1e-16 relative of 4.2e-10) and the sum (1 ulp of 8.7e-10 ≈ 1e-25).
    expect(Math.abs((note?.wouldHaveProduced ?? Number.NaN) - -8.666853284789203e-10)).toBeLessThanOrEqual(2e-25);
  });
});
