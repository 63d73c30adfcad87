/**
 * Exact rational arithmetic for checking split-precision time: a double is converted to a
 * BigInt count of 2⁻¹²⁰ s (exact for every double ≥ 2⁻⁶⁸ in magnitude, and within 2⁻¹²⁰ s
 * otherwise). An independent check of the SDK's compensated arithmetic.
 */
import type { Instant } from '../../src/time/index.js';

const SHIFT = 120n;
const TWO_60 = 2 ** 60;

/** `x` as an integer count of 2⁻¹²⁰ s (truncated below that unit). */
export function exactUnits(x: number): bigint {
  const negative = x < 0;
  const a = Math.abs(x);
  const whole = Math.trunc(a);
  const fraction = a - whole; // exact
  const hi = Math.floor(fraction * TWO_60); // exact: power-of-two scaling
  const lo = Math.floor((fraction * TWO_60 - hi) * TWO_60);
  const units = (BigInt(whole) << SHIFT) + (BigInt(hi) << 60n) + BigInt(lo);
  return negative ? -units : units;
}

/** An instant as an exact count of 2⁻¹²⁰ s since the SDK epoch. */
export function instantUnits(t: Instant): bigint {
  return (BigInt(t.taiSeconds) << SHIFT) + exactUnits(t.taiFraction);
}

/** A count of 2⁻¹²⁰ s back to seconds (as a double, for tolerance comparisons of small values). */
export function unitsToSeconds(units: bigint): number {
  const whole = units >> SHIFT;
  const rest = units - (whole << SHIFT);
  return Number(whole) + Number(rest) / 2 ** 120;
}
