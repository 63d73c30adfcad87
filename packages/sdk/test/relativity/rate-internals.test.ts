import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { GPS_ICD, IERS_2010 } from '../../src/constants.js';
import { meanClockRate } from '../../src/relativity/index.js';
import { meanRateSensitivity, offsetClockRate, reciprocalOffset } from '../../src/relativity/rate.js';

const SEED = 20261204;

/** A double as an exact dyadic rational m·2^e (IEEE 754 binary64 fields read from its bytes). */
interface Dyadic {
  readonly m: bigint;
  readonly e: number;
}

function dyadic(x: number): Dyadic {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const hi = view.getUint32(0);
  const fraction = (BigInt(hi & 0xfffff) << 32n) | BigInt(view.getUint32(4));
  const biased = (hi >>> 20) & 0x7ff;
  const m = biased === 0 ? fraction : fraction | (1n << 52n);
  return { m: hi >>> 31 ? -m : m, e: biased === 0 ? -1074 : biased - 1075 };
}

const add = (x: Dyadic, y: Dyadic): Dyadic => {
  const e = Math.min(x.e, y.e);
  return { m: (x.m << BigInt(x.e - e)) + (y.m << BigInt(y.e - e)), e };
};
const mul = (x: Dyadic, y: Dyadic): Dyadic => ({ m: x.m * y.m, e: x.e + y.e });
const neg = (x: Dyadic): Dyadic => ({ m: -x.m, e: x.e });

/** The nearest double to within a relative 2^-60 (plenty for an error bound). */
function toNumber({ m, e }: Dyadic): number {
  const bits = m < 0n ? (-m).toString(2).length : m.toString(2).length;
  const drop = Math.max(0, bits - 64);
  return Number(m >> BigInt(drop)) * 2 ** (e + drop);
}

describe('offsetClockRate(offset, rate) (internal; the review residual)', () => {
  it('offsetClockRate(c, r) equals (1 + c)(1 + r) − 1 in exact rational arithmetic to 2^-52·(|c + r| + |c·r|), also when c ≈ −r (property)', () => {
    // Error bound: (c + r) rounds once (exact when c ≈ −r, Sterbenz), c·r and the final sum once each (IEEE 754
    // round-to-nearest, unit roundoff 2^-53); elementary floating-point analysis, common practice, no source.
    const rate = fc.double({ min: -2e-9, max: 2e-9, noNaN: true });
    const offset = (r: number) =>
      fc.oneof(
        fc.double({ min: -2e-9, max: 2e-9, noNaN: true }),
        fc.double({ min: -1e-13, max: 1e-13, noNaN: true }).map((d) => reciprocalOffset(r) + d),
      );
    fc.assert(
      fc.property(
        rate.chain((r) => offset(r).map((c) => [c, r] as const)),
        ([c, r]) => {
          const sum = add(dyadic(c), dyadic(r));
          const product = mul(dyadic(c), dyadic(r));
          const exact = add(sum, product);
          const error = toNumber(add(dyadic(offsetClockRate(c, r)), neg(exact)));
          return Math.abs(error) <= 2 ** -52 * (Math.abs(toNumber(sum)) + Math.abs(toNumber(product)));
        },
      ),
      { seed: SEED, numRuns: 3000 },
    );
  });

  it('offsetClockRate(reciprocalOffset(r), r) is zero to 1e-25 where the product form (1 + c)(1 + r) − 1 is off by up to 1.1e-16', () => {
    // Exactly zero in value ((1 + r)/(1 + r) − 1); what remains is the rounding of reciprocalOffset(r), a few ulp of r.
    const r = meanClockRate(26_790_000).fractionalRate;
    const c = reciprocalOffset(r);
    expect(Math.abs(offsetClockRate(c, r))).toBeLessThanOrEqual(1e-25);
    // The product form rounds 1 + c to a multiple of 2^-52 first (the cause of the review's lost residuals).
    expect(Math.abs((1 + c) * (1 + r) - 1)).toBeLessThanOrEqual(2 ** -53 + 1e-24);
  });
});

/**
 * 3GM/(2a²c²) in exact rational arithmetic, rounded once to a double: rate-sensitivity.py beside this file [C]
 * (derivative of IERS Conventions 2010 eq. 10.9 averaged over a Kepler orbit [V1]).
 */
const EXACT_SENSITIVITY = [
  { set: IERS_2010, a: 7_000_000, value: 1.3576616446278583e-16 },
  { set: IERS_2010, a: 26_561_750, value: 9.42918722974741e-18 },
  { set: IERS_2010, a: 26_790_000, value: 9.269198906173877e-18 },
  { set: IERS_2010, a: 42_164_200, value: 3.741966538013776e-18 },
  { set: GPS_ICD, a: 7_000_000, value: 1.3576618428612255e-16 },
  { set: GPS_ICD, a: 26_561_750, value: 9.429188606511305e-18 },
  { set: GPS_ICD, a: 26_790_000, value: 9.269200259577736e-18 },
  { set: GPS_ICD, a: 42_164_200, value: 3.74196708438159e-18 },
];

describe('meanRateSensitivity(a, gm) (internal; the review rate sensitivity d rate / d a)', () => {
  it('meanRateSensitivity(a, gm) equals the exact 3GM/(2a²c²) of rate-sensitivity.py to 1e-15 relative', () => {
    // Five roundings (a·a, ·c² with c² itself rounded, 3·GM, 2·, the division), each ≤ 2^-53 relative.
    for (const { set, a, value } of EXACT_SENSITIVITY) {
      expect(Math.abs(meanRateSensitivity(a, set.gm) - value)).toBeLessThanOrEqual(1e-15 * value);
    }
  });

  it('meanRateSensitivity(26 561 750 m, GM) is 9.4292e-18 per metre (Ashby, PTTI 33 (2001) abstract [V2]; physics-refs §2 [C])', () => {
    expect(Math.abs(meanRateSensitivity(26_561_750, IERS_2010.gm) - 9.4292e-18)).toBeLessThanOrEqual(0.5e-22);
  });

  it('meanRateSensitivity(a, gm) equals the central finite difference of meanClockRate(a).fractionalRate to 1e-9 relative (TT and TCG, both constant sets)', () => {
    // Central difference with h = 1e-5·a: truncation (h/a)² = 1e-10 relative for f = −K/a; rounding of the rates
    // (~1e-25 absolute) over 2h adds < 1e-10 relative at these radii.
    for (const { set, a } of EXACT_SENSITIVITY) {
      for (const reference of ['tt', 'tcg'] as const) {
        const h = 1e-5 * a;
        const rate = (x: number) => meanClockRate(x, { constants: set, reference }).fractionalRate;
        const difference = (rate(a + h) - rate(a - h)) / (2 * h);
        const sensitivity = meanRateSensitivity(a, set.gm);
        expect(Math.abs(difference - sensitivity)).toBeLessThanOrEqual(1e-9 * sensitivity);
      }
    }
  });
});
