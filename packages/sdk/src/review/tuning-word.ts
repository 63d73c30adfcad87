/**
 * Exact tuning-word arithmetic of the review: a direct digital synthesizer's output f_out = word·f_clk/2^N (DDS
 * relation; common practice, no source), with words up to 64 bits, which a double cannot hold exactly.
 *
 * @internal
 */
import { fmt } from './mistakes.js';
import type { Diagnosis, ReviewSpacecraft } from './types.js';

/** Splits a finite double into an exact BigInt mantissa and a power-of-two exponent: x = m·2^e. */
export function dyadic(x: number): { m: bigint; e: number } {
  if (x === 0) return { m: 0n, e: 0 };
  let e = 0;
  let v = x;
  while (!Number.isInteger(v)) {
    v *= 2;
    e--;
  }
  return { m: BigInt(v), e };
}

/**
 * The word nearest to the exact W = 2^N·f_nominal·(1 + offset)/f_clk (DDS relation, solved for the word), formed in
 * exact BigInt rational arithmetic from the doubles given, and `errorSteps` = nearest − W in words (|·| ≤ 1/2,
 * to ~2^-60). A double W would be off by up to 2^(N − 53) words for N > 53 bits.
 */
export function nearestTuningWord(
  offset: number,
  nominalHz: number,
  clockHz: number,
  bits: number,
): { word: bigint; errorSteps: number } {
  const n = dyadic(nominalHz);
  const c = dyadic(clockHz);
  const o = dyadic(offset);
  // 1 + offset = (2^-e_o + m_o)·2^e_o (e_o ≤ 0 for |offset| < 1), so W = m_n·(2^-e_o + m_o)·2^k / m_c.
  const onePlus = (1n << BigInt(-o.e)) + o.m;
  const k = n.e + o.e + bits - c.e;
  const numerator = n.m * onePlus * (k >= 0 ? 1n << BigInt(k) : 1n);
  const denominator = c.m * (k < 0 ? 1n << BigInt(-k) : 1n);
  const word = (2n * numerator + denominator) / (2n * denominator); // round half up; numerator, denominator > 0
  const errorSteps = Number(((word * denominator - numerator) << 60n) / denominator) / 2 ** 60;
  return { word, errorSteps };
}

/**
 * Quantisation of the tuning-word form: can the hardware represent the expected value within tolerance?
 * `fails` when even the nearest word misses it; a note when only the configured word does.
 */
export function quantisationDiagnosis(
  sc: ReviewSpacecraft,
  expected: number,
  difference: number,
  step: number | null,
  tolerance: number,
): { diagnosis: Diagnosis; fails: boolean } | undefined {
  if (!('tuningWord' in sc.configured) || step === null) return undefined;
  const { clockHz, bits } = sc.configured.tuningWord;
  const nearest = nearestTuningWord(expected, sc.nominalFrequencyHz, clockHz, bits);
  const bestError = Math.abs(nearest.errorSteps) * step;
  const wouldHaveProduced = expected + nearest.errorSteps * step;
  if (bestError > tolerance) {
    return {
      fails: true,
      diagnosis: {
        code: 'quantisation',
        matches: true,
        wouldHaveProduced,
        message: `A ${bits}-bit word at ${clockHz} Hz has steps of ${fmt(step)} (fractional); even the nearest word misses the expected offset by ${fmt(bestError)}, more than the tolerance ${fmt(tolerance)}.`,
      },
    };
  }
  if (Math.abs(difference) <= tolerance) return undefined;
  return {
    fails: false,
    diagnosis: {
      code: 'quantisation',
      matches: false,
      wouldHaveProduced,
      message: `The nearest ${bits}-bit word is ${nearest.word.toString()} (error ${fmt(bestError)}); the configured word is ${Math.round(difference / step)} steps away from it.`,
    },
  };
}
