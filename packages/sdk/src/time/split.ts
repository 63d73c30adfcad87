/**
 * Error-free transformations for split (whole + fraction) time arithmetic. Not exported
 * from the package: the public types in `instant.ts` are the only way in.
 *
 * @internal
 * @module
 */

/**
 * Knuth's TwoSum: returns `[s, e]` with `s = fl(a + b)` and `a + b = s + e` exactly
 * (D. E. Knuth, The Art of Computer Programming vol. 2, §4.2.2, Theorem B [M]).
 */
export function twoSum(a: number, b: number): [number, number] {
  const s = a + b;
  const bb = s - a;
  const e = a - (s - bb) + (b - bb);
  return [s, e];
}

/** A value `whole + fraction`, `whole` an integer, `fraction` in [0, 1). */
export interface WholeAndFraction {
  readonly whole: number;
  readonly fraction: number;
}

/**
 * Renormalises `whole + fraction` (whole an integer, fraction any finite number of modest
 * size) so that the fraction lies in [0, 1). The only rounding is in `fraction − floor(fraction)`
 * when `fraction` is in (−1, 0): at most 2⁻⁵⁴ s.
 */
export function normalize(whole: number, fraction: number): WholeAndFraction {
  const carry = Math.floor(fraction);
  let f = fraction - carry;
  let w = whole + carry;
  // A tiny negative fraction plus 1 can round up to exactly 1.
  if (f >= 1) {
    f -= 1;
    w += 1;
  }
  return { whole: w, fraction: f };
}

/**
 * Adds a float `x` to `whole + fraction`. `x` is split exactly into its integer part and
 * its fractional part (the fractional part of a double is itself representable), so the
 * only rounding is one addition of two numbers below 1 in magnitude: ≤ 1.1e-16.
 */
export function addFloat(whole: number, fraction: number, x: number): WholeAndFraction {
  const xWhole = Math.trunc(x);
  const xFraction = x - xWhole;
  return normalize(whole + xWhole, fraction + xFraction);
}

/** Floor division for integers: `[q, r]` with `a = q·b + r`, `0 ≤ r < b` (b > 0). */
export function floorDivMod(a: number, b: number): [number, number] {
  const q = Math.floor(a / b);
  return [q, a - q * b];
}
