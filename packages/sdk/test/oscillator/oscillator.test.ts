import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  fractionalResolution,
  nearestTuningWord,
  offsetFrequency,
  tuningWordFrequency,
} from '../../src/oscillator/index.js';

const SEED = 20261202;

describe('offsetFrequency', () => {
  it('offsetFrequency(f0, y) returns f0(1 + y) and f0·y, with f0·y at full precision for tiny y (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1e10, noNaN: true }),
        fc.double({ min: -1e-6, max: 1e-6, noNaN: true }),
        (f0, y) => {
          const r = offsetFrequency(f0, y);
          return r.offsetHz === f0 * y && Math.abs(r.offsetFrequencyHz - f0 * (1 + y)) <= 2 * Number.EPSILON * f0;
        },
      ),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it('offsetFrequency rejects f0 ≤ 0, NaN and offsets outside (−1, 1)', () => {
    expect(() => offsetFrequency(0, 1e-10)).toThrow(/nominalFrequency must be in \[1, 1000000000000\] Hz; received 0/);
    expect(() => offsetFrequency(Number.NaN, 1e-10)).toThrow(/nominalFrequency/);
    expect(() => offsetFrequency(10.23e6, -1)).toThrow(
      /fractionalOffset must be a finite fractional frequency offset Δf\/f in \(−1, 1\).*received -1/,
    );
    expect(() => offsetFrequency(10.23e6, Number.NaN)).toThrow(/fractionalOffset/);
    expect(() => offsetFrequency(10.23e6, 2)).toThrow(/fractionalOffset/);
  });
});

describe('nearestTuningWord', () => {
  it('nearestTuningWord for 10 MHz from a 100 MHz clock, 32 bits, is 429 496 730 (round(2^32/10), common practice, no source)', () => {
    const r = nearestTuningWord({ targetFrequency: 10e6, clockFrequency: 100e6, bits: 32 });
    expect(r.word).toBe(429_496_730n);
    expect(r.resolutionHz).toBe(100e6 / 2 ** 32);
    expect(r.achievedFrequencyHz).toBe((429_496_730 * 100e6) / 2 ** 32);
    expect(r.quantisationErrorFractional).toBeCloseTo(0.4 / 429_496_729.6, 18);
  });

  it('nearestTuningWord matches an independent exact-rational computation for the GPS offset frequency at 32, 48 and 64 bits (Python fractions [C])', () => {
    const target = 10.23e6 * (1 - 4.4647e-10);
    const cases: [number, number, bigint, number, number][] = [
      [64, 1e9, 188_710_191_789_795_267n, 10229999.995432612, -1.5843550004603828e-18],
      [48, 100e6, 28_794_890_104_644n, 10229999.995432593, -1.8488613711157656e-15],
      [32, 100e6, 439_375_154n, 10229999.99113381, -4.2021529492861297e-10],
    ];
    for (const [bits, clock, word, achieved, fractional] of cases) {
      const r = nearestTuningWord({ targetFrequency: target, clockFrequency: clock, bits });
      expect(r.word).toBe(word);
      expect(r.achievedFrequencyHz).toBe(achieved);
      expect(Math.abs(r.quantisationErrorFractional / fractional - 1)).toBeLessThan(1e-14);
      expect(r.quantisationErrorNanosecondsPerDay).toBeCloseTo(fractional * 86400e9, 9);
    }
  });

  it('nearestTuningWord rounds exact ties half to even (documented)', () => {
    expect(nearestTuningWord({ targetFrequency: 2.5, clockFrequency: 256, bits: 8 }).word).toBe(2n);
    expect(nearestTuningWord({ targetFrequency: 3.5, clockFrequency: 256, bits: 8 }).word).toBe(4n);
    expect(nearestTuningWord({ targetFrequency: 3.5000000001, clockFrequency: 256, bits: 8 }).word).toBe(4n);
    expect(nearestTuningWord({ targetFrequency: 2.5000000001, clockFrequency: 256, bits: 8 }).word).toBe(3n);
  });

  it('nearestTuningWord(word) is nearest: |error| ≤ resolution/2 and the neighbours are no closer, for every width 8..64 (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 8, max: 64 }),
        fc.double({ min: 1e6, max: 2e9, noNaN: true }),
        fc.double({ min: 0.01, max: 0.5, noNaN: true }),
        (bits, clock, ratio) => {
          const target = clock * ratio;
          const r = nearestTuningWord({ targetFrequency: target, clockFrequency: clock, bits });
          if (r.word <= 0n || r.word > 1n << BigInt(bits - 1)) return false;
          expect(tuningWordFrequency(r.word, clock, bits)).toBe(r.achievedFrequencyHz);
          const errHz = r.quantisationErrorFractional * target;
          return (
            Math.abs(errHz) <= r.resolutionHz * (0.5 + 1e-9) &&
            Math.abs(r.resolutionHz / target - fractionalResolution(clock, bits, target)) <=
              (1e-15 * r.resolutionHz) / target
          );
        },
      ),
      { seed: SEED, numRuns: 2000 },
    );
  });

  it('nearestTuningWord rejects bad widths, frequencies above Nyquist, non-positive input and targets that round to word 0', () => {
    expect(() => nearestTuningWord({ targetFrequency: 1e6, clockFrequency: 1e8, bits: 7 })).toThrow(
      /bits must be an integer in \[8, 64\]; received 7/,
    );
    expect(() => nearestTuningWord({ targetFrequency: 1e6, clockFrequency: 1e8, bits: 65 })).toThrow(/bits/);
    expect(() => nearestTuningWord({ targetFrequency: 1e6, clockFrequency: 1e8, bits: 32.5 })).toThrow(/bits/);
    expect(() => nearestTuningWord({ targetFrequency: 6e7, clockFrequency: 1e8, bits: 32 })).toThrow(
      /targetFrequency must be at most f_clk\/2 = 50000000 Hz \(Nyquist/,
    );
    expect(() => nearestTuningWord({ targetFrequency: 0, clockFrequency: 1e8, bits: 32 })).toThrow(
      /targetFrequency must be a finite number greater than 0 Hz/,
    );
    expect(() => nearestTuningWord({ targetFrequency: 1e6, clockFrequency: Number.NaN, bits: 32 })).toThrow(
      /clockFrequency/,
    );
    expect(() => nearestTuningWord({ targetFrequency: 1e-3, clockFrequency: 1e8, bits: 8 })).toThrow(
      /rounds to tuning word 0/,
    );
    expect(() =>
      nearestTuningWord(null as unknown as { targetFrequency: number; clockFrequency: number; bits: number }),
    ).toThrow(/request must be an object/);
  });

  it('tuningWordFrequency and fractionalResolution reject words outside [0, 2^N) and bad frequencies', () => {
    expect(() => tuningWordFrequency(256n, 1e8, 8)).toThrow(
      /word must be a bigint in \[0, 2\^8\) for a 8-bit accumulator; received 256n/,
    );
    expect(() => tuningWordFrequency(-1n, 1e8, 8)).toThrow(/word/);
    expect(() => tuningWordFrequency(5 as unknown as bigint, 1e8, 8)).toThrow(/word/);
    expect(() => tuningWordFrequency(5n, 0, 8)).toThrow(/clockFrequency/);
    expect(() => tuningWordFrequency(5n, 1e8, 100)).toThrow(/bits/);
    expect(tuningWordFrequency(0n, 1e8, 8)).toBe(0);
    expect(() => fractionalResolution(1e8, 48, 0)).toThrow(/relativeTo/);
    expect(() => fractionalResolution(-1, 48, 1e7)).toThrow(/clockFrequency/);
    expect(() => fractionalResolution(1e8, 4, 1e7)).toThrow(/bits/);
  });
});
