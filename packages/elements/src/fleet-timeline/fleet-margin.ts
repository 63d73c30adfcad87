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

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

/**
 * The smallest bound b_p ≥ 0 with P(|X| ≤ b_p) = p for X ~ N(m, σ²), in the unit of m and σ:
 * Φ((b − |m|)/σ) + Φ((b + |m|)/σ) − 1 = p (the two tails of the normal distribution) [M], solved
 * by Newton's method kept inside [|m|, |m| + zσ] (the upper end meets the criterion, z = Φ⁻¹((1 + p)/2)
 * two-sided), from `start` = (b − |m|)/σ when given (a neighbouring epoch's solution), else from z.
 * Where |m| ≥ 8σ the far tail Φ(−(b + |m|)/σ) < 1e-15 is dropped: b_p = |m| + z₁σ, z₁ = Φ⁻¹(p)
 * one-sided (pass it as `z1`; NaN solves). σ = 0 gives |m|.
 */
export function requiredBound(mean: number, sigma: number, p: number, z: number, start = z, z1 = Number.NaN): number {
  const a = Math.abs(mean);
  if (!(sigma > 0)) return a;
  if (a >= 8 * sigma && Number.isFinite(z1)) return a + z1 * sigma;
  let b = a + Math.min(z, Math.max(0, start)) * sigma;
  for (let k = 0; k < 30; k++) {
    const u = (b - a) / sigma,
      v = (b + a) / sigma;
    const f = normalCdf(u) + normalCdf(v) - 1 - p;
    const df = ((Math.exp(-0.5 * u * u) + Math.exp(-0.5 * v * v)) * INV_SQRT_2PI) / sigma;
    if (!(df > 0)) break;
    const next = Math.min(a + z * sigma, Math.max(a, b - f / df));
    if (Math.abs(next - b) <= 1e-9 * sigma) return next;
    b = next;
  }
  return b;
}

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

/**
 * Margin b − b_p on a grid, in seconds; negative where the epoch fails the criterion. Each epoch's
 * solve starts from the previous epoch's (b_p − |m|)/σ, which the smooth prediction changes little.
 */
export function marginSeries(
  mean: ArrayLike<number>,
  sigma: ArrayLike<number>,
  bound: number,
  p: number,
  z: number,
): Float64Array {
  const out = new Float64Array(mean.length);
  const z1 = oneSidedQuantile(p);
  let k = z;
  for (let i = 0; i < out.length; i++) {
    const s = sigma[i]!,
      a = Math.abs(mean[i]!);
    const b = requiredBound(a, s, p, z, k, z1);
    if (s > 0) k = (b - a) / s;
    out[i] = bound - b;
  }
  return out;
}
