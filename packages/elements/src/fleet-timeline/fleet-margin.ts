/**
 * Margin to tolerance of a predicted clock offset, by the planner's own per-epoch criterion:
 * P(|offset| ≤ b) ≥ p for a normal offset of mean m and standard deviation σ (planSteering's rule,
 * `SteeringMetrics.probabilityInTolerance`). The margin is b − b_p, where b_p is the smallest bound
 * that meets the criterion at that epoch; it is ≥ 0 exactly where the epoch meets it. Pure, no DOM.
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
  const ans = t * Math.exp(-z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418 +
    t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))));
  return x >= 0 ? ans : 2 - ans;
}

/** Standard normal CDF Φ(x) = ½ erfc(−x/√2) (Abramowitz & Stegun 26.2.29 with 7.1.2) [V2]. */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

/**
 * The smallest bound b_p ≥ 0 with P(|X| ≤ b_p) = p for X ~ N(m, σ²), in the unit of m and σ:
 * Φ((b − |m|)/σ) + Φ((b + |m|)/σ) − 1 = p (the two tails of the normal distribution) [M], solved by
 * Newton's method from b = |m| + zσ, which meets the criterion (z = Φ⁻¹((1 + p)/2) two-sided).
 * σ = 0 gives |m|.
 */
export function requiredBound(mean: number, sigma: number, p: number, z: number): number {
  const a = Math.abs(mean);
  if (!(sigma > 0)) return a;
  let b = a + z * sigma;
  for (let k = 0; k < 30; k++) {
    const u = (b - a) / sigma, v = (b + a) / sigma;
    const f = normalCdf(u) + normalCdf(v) - 1 - p;
    const df = (Math.exp(-0.5 * u * u) + Math.exp(-0.5 * v * v)) * INV_SQRT_2PI / sigma;
    if (!(df > 0)) break;
    const next = Math.min(a + z * sigma, Math.max(a, b - f / df));
    if (Math.abs(next - b) <= 1e-10 * sigma) return next;
    b = next;
  }
  return b;
}

/** Margin b − b_p on a grid, in seconds; negative where the epoch fails the criterion. */
export function marginSeries(mean: ArrayLike<number>, sigma: ArrayLike<number>, bound: number, p: number, z: number): Float64Array {
  const out = new Float64Array(mean.length);
  for (let i = 0; i < out.length; i++) out[i] = bound - requiredBound(mean[i]!, sigma[i]!, p, z);
  return out;
}
