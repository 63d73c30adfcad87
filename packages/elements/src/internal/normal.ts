/**
 * The standard normal distribution as the elements need it: Φ, its complementary error function and
 * its quantiles, to about 1e-7. The SDK keeps a more accurate Φ in its internal special functions;
 * it is not exported (that would grow the SDK's API), so the elements keep this one copy, shared by
 * every element that needs it. Pure, no DOM.
 *
 * @module
 */

/**
 * Complementary error function, fractional error < 1.2e-7 everywhere: the Chebyshev fit `erfcc`
 * of Press, Teukolsky, Vetterling & Flannery, Numerical Recipes in C, 2nd ed. (1992), §6.2
 * (coefficients [M], from memory; checked against scipy.special.erfc in the tests [C]).
 */
export function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const poly =
    1.00002368 +
    t *
      (0.37409196 +
        t *
          (0.09678418 +
            t *
              (-0.18628806 +
                t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))));
  const ans = t * Math.exp(-z * z - 1.26551223 + t * poly);
  return x >= 0 ? ans : 2 - ans;
}

/** Standard normal CDF Φ(x) = ½ erfc(−x/√2) (Abramowitz & Stegun 26.2.29 with 7.1.2) [V2]. */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

/** 1/√(2π), the standard normal density at 0. */
export const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

/** The one-sided quantile z₁ = Φ⁻¹(p) for p in (0.5, 1), by Newton's method on {@link normalCdf} from 1. */
export function oneSidedQuantile(p: number): number {
  let x = 1;
  for (let k = 0; k < 60; k++) {
    const step = (normalCdf(x) - p) / (Math.exp(-0.5 * x * x) * INV_SQRT_2PI);
    x -= step;
    if (Math.abs(step) < 1e-13) break;
  }
  return x;
}

/** The two-sided quantile z = Φ⁻¹((1 + p)/2) for p in (0, 1): P(|X| ≤ zσ) = p for X ~ N(0, σ²) [V2]. */
export function twoSidedQuantile(p: number): number {
  return oneSidedQuantile((1 + p) / 2);
}
