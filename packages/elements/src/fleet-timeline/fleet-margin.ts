/**
 * Margin to tolerance of a predicted clock offset, by the planner's own per-epoch criterion:
 * P(|offset| ≤ b) ≥ p for a normal offset of mean m and standard deviation σ (planSteering's rule,
 * `SteeringMetrics.probabilityInTolerance`). The margin is b − b_p, where b_p is the smallest bound
 * that meets the criterion at that epoch; it is ≥ 0 exactly where the epoch meets it. Pure, no DOM.
 *
 * @module
 */
import { atNumber } from '../internal/checked.js';
import { INV_SQRT_2PI, normalCdf, oneSidedQuantile } from '../internal/normal.js';

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
    const s = atNumber(sigma, i, 'sigma'),
      a = Math.abs(atNumber(mean, i, 'mean'));
    const b = requiredBound(a, s, p, z, k, z1);
    if (s > 0) k = (b - a) / s;
    out[i] = bound - b;
  }
  return out;
}
