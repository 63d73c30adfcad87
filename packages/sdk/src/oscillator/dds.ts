/**
 * Direct digital synthesis (DDS) tuning words: the phase-accumulator increment that brings
 * an N-bit DDS closest to a target frequency, computed exactly in integer arithmetic.
 *
 * @module
 */

import { FLIGHT_CONFIGURATION_CAUTION } from '../caution.js';
import { SECONDS_PER_DAY } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { requireFrequency, requireInteger, requirePositive } from '../internal/validate.js';
import type { Dimensionless, Hertz } from '../units.js';

/** Smallest and largest supported accumulator widths, in bits. */
export const DDS_MIN_BITS = 8;
export const DDS_MAX_BITS = 64;

/** Result of {@link nearestTuningWord}. */
export interface TuningWord {
  /** Tuning word W (phase increment per clock cycle), 0 < W ≤ 2^(N−1). */
  word: bigint;
  /** W·f_clk/2^N, in hertz (correctly rounded from the exact value). */
  achievedFrequencyHz: Hertz;
  /** (achieved − target)/target, dimensionless, from the exact values. */
  quantisationErrorFractional: Dimensionless;
  /** quantisationErrorFractional × 86 400 s × 1e9: nanoseconds of time error gained per day. */
  quantisationErrorNanosecondsPerDay: number;
  /** f_clk/2^N, in hertz: the frequency step of one least-significant bit. */
  resolutionHz: Hertz;
  /** The tuning word feeds a flight configuration: {@link FLIGHT_CONFIGURATION_CAUTION}. */
  caution: string;
}

/** Exact binary decomposition of a positive finite double: x = mantissa·2^exponent. */
function decompose(x: number): { mantissa: bigint; exponent: number } {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigUint64(0);
  const biased = Number((bits >> 52n) & 0x7ffn);
  const fraction = bits & 0xfffffffffffffn;
  return biased === 0
    ? { mantissa: fraction, exponent: -1074 }
    : { mantissa: fraction | 0x10000000000000n, exponent: biased - 1075 };
}

/** x·2^k without intermediate overflow or underflow of the power of two. */
function scaleByPowerOfTwo(x: number, k: number): number {
  let result = x;
  let remaining = k;
  while (remaining > 1000) {
    result *= 2 ** 1000;
    remaining -= 1000;
  }
  while (remaining < -1000) {
    result *= 2 ** -1000;
    remaining += 1000;
  }
  return result * 2 ** remaining;
}

/** 2^k as a BigInt (k ≥ 0). */
function pow2(k: number): bigint {
  return 1n << BigInt(k);
}

function requireBits(bits: unknown): number {
  return requireInteger('bits', bits, DDS_MIN_BITS, DDS_MAX_BITS);
}

/**
 * Validates a tuning word for an N-bit accumulator: a bigint in [0, 2^N).
 * @throws {InvalidArgumentError} otherwise.
 */
function requireWord(word: unknown, bits: number): bigint {
  const expected = `a bigint in [0, 2^${bits}) for a ${bits}-bit accumulator`;
  if (typeof word !== 'bigint' || word < 0n || word >= pow2(bits))
    throw new InvalidArgumentError('word', word, expected);
  return word;
}

/**
 * Output frequency of an N-bit DDS for a tuning word: f_out = W·f_clk/2^N, correctly rounded.
 *
 * @param word            Tuning word W, a bigint in [0, 2^N).
 * @param clockFrequency  f_clk, in hertz (> 0).
 * @param bits            Accumulator width N, an integer in [8, 64].
 * @returns f_out, in hertz.
 * @throws {InvalidArgumentError} for a word outside [0, 2^N), f_clk outside 1 Hz..1 THz or N outside [8, 64].
 * @see Phase-accumulator synthesis, J. Tierney, C. Rader & B. Gold, IEEE Trans. Audio Electroacoust. 19 (1971) 48–57 [M].
 */
export function tuningWordFrequency(word: bigint, clockFrequency: Hertz, bits: number): Hertz {
  const f = requireFrequency('clockFrequency', clockFrequency);
  const n = requireBits(bits);
  const w = requireWord(word, n);
  const clock = decompose(f);
  return scaleByPowerOfTwo(Number(w * clock.mantissa), clock.exponent - n);
}

/**
 * Frequency resolution of an N-bit DDS relative to a frequency: (f_clk/2^N)/f, dimensionless.
 *
 * @param clockFrequency    f_clk, in hertz (> 0).
 * @param bits              Accumulator width N, an integer in [8, 64].
 * @param relativeTo        Frequency to refer the step to, in hertz (> 0); usually the output frequency.
 * @returns The fractional frequency step of one least-significant bit.
 * @throws {InvalidArgumentError} for a frequency outside 1 Hz..1 THz or N outside [8, 64].
 * @see Phase-accumulator synthesis, f_out = W·f_clk/2^N (Tierney, Rader & Gold 1971) [M].
 */
export function fractionalResolution(clockFrequency: Hertz, bits: number, relativeTo: Hertz): Dimensionless {
  const f = requireFrequency('clockFrequency', clockFrequency);
  const n = requireBits(bits);
  const ref = requireFrequency('relativeTo', relativeTo);
  return scaleByPowerOfTwo(f, -n) / ref;
}

/**
 * The tuning word of an N-bit DDS (f_out = W·f_clk/2^N) nearest to a target frequency.
 *
 *   W = round(f_target·2^N / f_clk)
 *
 * The division and rounding are done exactly in BigInt arithmetic on the binary values of
 * the two doubles, so the result is exact for every N in [8, 64]; ties round half to even.
 * The quantisation error is also computed from the exact values (no cancellation).
 *
 * @param request.targetFrequency  Wanted output frequency, in hertz; 0 < f_target ≤ f_clk/2 (Nyquist).
 * @param request.clockFrequency   DDS reference clock f_clk, in hertz (> 0).
 * @param request.bits             Accumulator width N, an integer in [8, 64].
 * @returns `{ word, achievedFrequencyHz, quantisationErrorFractional, quantisationErrorNanosecondsPerDay, resolutionHz }`.
 * @throws {InvalidArgumentError} for f_clk outside 1 Hz..1 THz, a non-positive target, a target above f_clk/2,
 *   a target that rounds to word 0 (below half the resolution) or N outside [8, 64].
 * @see Phase-accumulator synthesis, Tierney, Rader & Gold, IEEE Trans. Audio Electroacoust. 19 (1971) 48–57 [M].
 */
export function nearestTuningWord(request: {
  targetFrequency: Hertz;
  clockFrequency: Hertz;
  bits: number;
}): TuningWord {
  if (typeof request !== 'object' || request === null) {
    throw new InvalidArgumentError('request', request, 'an object { targetFrequency, clockFrequency, bits }');
  }
  const clockHz = requireFrequency('clockFrequency', request.clockFrequency);
  const n = requireBits(request.bits);
  const targetHz = requirePositive('targetFrequency', request.targetFrequency, 'Hz');
  if (targetHz > clockHz / 2) {
    throw new InvalidArgumentError(
      'targetFrequency',
      targetHz,
      `at most f_clk/2 = ${clockHz / 2} Hz (Nyquist limit of the DDS)`,
    );
  }
  const t = decompose(targetHz);
  const c = decompose(clockHz);
  // W = round(mt·2^(et+N) / (mc·2^ec)) = round(num/den).
  const shift = t.exponent + n - c.exponent;
  const num = t.mantissa * (shift > 0 ? pow2(shift) : 1n);
  const den = c.mantissa * (shift < 0 ? pow2(-shift) : 1n);
  let word = num / den;
  const twiceRemainder = 2n * (num % den);
  if (twiceRemainder > den || (twiceRemainder === den && (word & 1n) === 1n)) word += 1n;
  const resolutionHz = scaleByPowerOfTwo(clockHz, -n);
  if (word === 0n) {
    throw new InvalidArgumentError(
      'targetFrequency',
      targetHz,
      `at least half the DDS resolution f_clk/2^N = ${resolutionHz} Hz (it rounds to tuning word 0)`,
    );
  }
  // Exact error: (W·mc·2^ec − mt·2^(et+N)) / (mt·2^(et+N)), all scaled by 2^−base.
  const base = Math.min(c.exponent, t.exponent + n);
  const achievedScaled = word * c.mantissa * pow2(c.exponent - base);
  const targetScaled = t.mantissa * pow2(t.exponent + n - base);
  const quantisationErrorFractional = Number(achievedScaled - targetScaled) / Number(targetScaled);
  return {
    word,
    achievedFrequencyHz: scaleByPowerOfTwo(Number(word * c.mantissa), c.exponent - n),
    quantisationErrorFractional,
    quantisationErrorNanosecondsPerDay: quantisationErrorFractional * SECONDS_PER_DAY * 1e9,
    resolutionHz,
    caution: FLIGHT_CONFIGURATION_CAUTION,
  };
}
