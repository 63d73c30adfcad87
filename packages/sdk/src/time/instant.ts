/**
 * The SDK's moment in time: an immutable {@link Instant} on International Atomic Time (TAI),
 * kept as whole seconds plus a fraction so that it resolves far below a nanosecond.
 *
 * Why not one float: a double resolves 1.2e-7 s at 8e8 s (seconds since J2000) and 4e-5 s
 * for a Julian date in days. Clock work needs nanoseconds or better.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { requireFinite } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import { isoDateOfMjd, pad2 } from './calendar.js';
import { addFloat, floorDivMod, normalize, twoSum } from './split.js';

/** MJD (on TAI) of the SDK epoch 2000-01-01T00:00:00 TAI, the origin of {@link Instant.taiSeconds}. */
export const INSTANT_EPOCH_MJD = 51_544;

/**
 * Largest |taiSeconds| accepted, in seconds (≈ 31 700 years). Keeps every integer sum exact
 * in a double (far below 2⁵³) while covering the whole four-digit calendar.
 */
export const MAX_ABS_TAI_SECONDS: Seconds = 1e12;

/**
 * A time interval as the unevaluated sum `hi + lo` of two doubles (|lo| ≤ ulp(hi)/2), in seconds.
 * A single double cannot hold a span of years to better than ~1e-8 s; `hi + lo` holds it
 * to ~1e-16 s. Pass it back to {@link Instant.plusPrecise}.
 */
export interface PreciseSeconds {
  /** The span rounded to the nearest double, in seconds. */
  readonly hi: Seconds;
  /** The rounding error of `hi`: the exact span is `hi + lo`, in seconds. */
  readonly lo: Seconds;
}

/**
 * An immutable moment on the TAI scale: `taiSeconds` whole SI seconds since the SDK epoch
 * 2000-01-01T00:00:00 TAI plus `taiFraction` in [0, 1) s.
 *
 * Representation (why whole seconds + fraction, not days + seconds-of-day): integer seconds
 * add and subtract exactly, and every scale used here differs from TAI by a constant whole
 * or decimal number of seconds (TT +32.184, GPS −19, BDT −33, UTC by whole leap seconds),
 * so conversions touch only the fraction. The fraction is a double in [0, 1): its resolution
 * is 1.1e-16 s everywhere in the calendar, far below the 1e-10 s the SDK promises.
 * Arithmetic on instants is exact except for one rounding of the fraction per operation
 * (≤ 1.1e-16 s).
 *
 * Build instants from calendar text or other scales through a {@link TimeScales} object
 * (`createTimeScales(table)`), which holds the leap-second table; build them here only from
 * TAI seconds.
 *
 * @example
 * const t0 = Instant.fromTaiParts(536_500_800, 0.25);
 * const t1 = t0.plus(86_400.000_000_001);
 * t1.secondsSince(t0); // 86400.000000001
 */
export class Instant {
  /** Whole SI seconds since 2000-01-01T00:00:00 TAI (an integer; negative before the epoch). */
  readonly taiSeconds: number;
  /** Fraction of a second, in [0, 1) s. */
  readonly taiFraction: Seconds;

  private constructor(taiSeconds: number, taiFraction: Seconds) {
    this.taiSeconds = taiSeconds;
    this.taiFraction = taiFraction;
    Object.freeze(this);
  }

  /**
   * Builds an instant from TAI seconds since 2000-01-01T00:00:00 TAI given as two parts whose
   * sum is the time; neither needs to be normalised (`fromTaiParts(10, 1.5)` is 11.5 s). The
   * split is exact when `taiSeconds` is an integer.
   * @param taiSeconds  Seconds since the SDK epoch (usually the whole part), |·| ≤ 1e12 s.
   * @param taiFraction Seconds to add (usually the fraction), |·| ≤ 1e12 s; default 0.
   * @throws {InvalidArgumentError} for a non-finite part or a time more than 1e12 s from the epoch.
   */
  static fromTaiParts(taiSeconds: Seconds, taiFraction: Seconds = 0): Instant {
    requireSpan('taiSeconds', taiSeconds);
    requireSpan('taiFraction', taiFraction);
    const first = addFloat(0, 0, taiSeconds);
    const sum = addFloat(first.whole, first.fraction, taiFraction);
    return Instant.fromNormalized(sum.whole, sum.fraction);
  }

  /**
   * Builds an instant from one float of TAI seconds since 2000-01-01T00:00:00 TAI. Note the
   * float's own resolution: 1.2e-7 s at 8e8 s. Use {@link Instant.fromTaiParts} for precise input.
   * @throws {InvalidArgumentError} for a non-finite value or |seconds| > 1e12.
   */
  static fromTaiSeconds(seconds: Seconds): Instant {
    return Instant.fromTaiParts(seconds, 0);
  }

  /**
   * Internal factory for already-normalised parts (`whole` integer, `fraction` in [0, 1)).
   * @internal
   */
  static fromNormalized(whole: number, fraction: number): Instant {
    if (!Number.isInteger(whole) || !(fraction >= 0 && fraction < 1)) {
      throw new InvalidArgumentError('instant', { whole, fraction }, 'an integer whole part and a fraction in [0, 1)');
    }
    if (!(Math.abs(whole) <= MAX_ABS_TAI_SECONDS)) {
      throw new InvalidArgumentError(
        'instant',
        whole,
        `a time within ±${MAX_ABS_TAI_SECONDS} s of 2000-01-01T00:00:00 TAI`,
      );
    }
    return new Instant(whole, fraction);
  }

  /** Orders two instants: −1 if `a` is earlier, 1 if later, 0 if equal (for `Array.prototype.sort`). */
  static compare(a: Instant, b: Instant): -1 | 0 | 1 {
    if (!(a instanceof Instant)) throw new InvalidArgumentError('a', a, 'an Instant');
    return a.compare(b);
  }

  /**
   * The instant `seconds` later (earlier if negative). Exact except for one rounding of the
   * fraction (≤ 1.1e-16 s); `seconds` itself is a double, so a span of years carries the
   * double's own resolution (use {@link Instant.plusPrecise} for a split span).
   * @param seconds Interval to add, in seconds (finite, |·| ≤ 1e12).
   * @throws {InvalidArgumentError} for a non-finite interval or a result outside ±1e12 s.
   */
  plus(seconds: Seconds): Instant {
    requireSpan('seconds', seconds);
    const sum = addFloat(this.taiSeconds, this.taiFraction, seconds);
    return Instant.fromNormalized(sum.whole, sum.fraction);
  }

  /**
   * The instant `span.hi + span.lo` seconds later, e.g. the span returned by
   * {@link Instant.preciseSecondsSince}. Error ≤ 2.2e-16 s.
   * @throws {InvalidArgumentError} for non-finite parts or a result outside ±1e12 s.
   */
  plusPrecise(span: PreciseSeconds): Instant {
    if (typeof span !== 'object' || span === null) {
      throw new InvalidArgumentError('span', span, 'an object { hi, lo } of seconds');
    }
    requireSpan('span.hi', span.hi);
    requireSpan('span.lo', span.lo);
    const first = addFloat(this.taiSeconds, this.taiFraction, span.hi);
    const sum = addFloat(first.whole, first.fraction, span.lo);
    return Instant.fromNormalized(sum.whole, sum.fraction);
  }

  /**
   * `this − earlier` in seconds, rounded once to the nearest double: relative error ≤ 1.1e-16,
   * so ≤ 1e-12 s for spans up to ~9000 s and ~1e-8 s for a span of 3 years (a limit of the
   * double, not of the instants). Use {@link Instant.preciseSecondsSince} for long spans.
   * @param earlier The other instant (need not be earlier; the result is then negative).
   * @returns The interval, in seconds.
   */
  secondsSince(earlier: Instant): Seconds {
    return this.preciseSecondsSince(earlier).hi;
  }

  /**
   * `this − earlier` as a double-double `{ hi, lo }` in seconds, found by compensated
   * summation (TwoSum, Knuth TAOCP vol. 2 §4.2.2 [M]): the whole-second difference is exact,
   * the fraction difference rounds at most once (≤ 5.6e-17 s), and `hi + lo` carries the
   * sum without further loss. Accurate to ~1e-16 s for any span the instants cover.
   * @throws {InvalidArgumentError} if `earlier` is not an Instant.
   */
  preciseSecondsSince(earlier: Instant): PreciseSeconds {
    requireInstant('earlier', earlier);
    const [hi, lo] = twoSum(this.taiSeconds - earlier.taiSeconds, this.taiFraction - earlier.taiFraction);
    return { hi, lo };
  }

  /** −1 if this is before `other`, 1 if after, 0 if the same instant (exact comparison). */
  compare(other: Instant): -1 | 0 | 1 {
    requireInstant('other', other);
    if (this.taiSeconds !== other.taiSeconds) return this.taiSeconds < other.taiSeconds ? -1 : 1;
    if (this.taiFraction !== other.taiFraction) return this.taiFraction < other.taiFraction ? -1 : 1;
    return 0;
  }

  /**
   * True when the two instants are the same, or within `toleranceSeconds` of each other.
   * @param toleranceSeconds Largest |difference| still counted as equal, in seconds (≥ 0; default 0: exact).
   * @throws {InvalidArgumentError} for a negative or non-finite tolerance.
   */
  equals(other: Instant, toleranceSeconds: Seconds = 0): boolean {
    requireInstant('other', other);
    const tolerance = requireFinite('toleranceSeconds', toleranceSeconds, 'a finite number ≥ 0 s');
    if (tolerance < 0) throw new InvalidArgumentError('toleranceSeconds', toleranceSeconds, 'a finite number ≥ 0 s');
    if (tolerance === 0) return this.compare(other) === 0;
    const { hi, lo } = this.preciseSecondsSince(other);
    return Math.abs(hi + lo) <= tolerance;
  }

  /** True when this instant is strictly before `other`. */
  isBefore(other: Instant): boolean {
    return this.compare(other) < 0;
  }

  /** True when this instant is strictly after `other`. */
  isAfter(other: Instant): boolean {
    return this.compare(other) > 0;
  }

  /**
   * The instant as TAI calendar text with 12 fraction digits, e.g.
   * `2017-01-01T00:00:37.000000000000 TAI` (for logs and test messages; use
   * `TimeScales.formatIso` for other scales and rounding control).
   */
  toString(): string {
    const [days, secondOfDay] = floorDivMod(this.taiSeconds, 86_400);
    const hours = Math.floor(secondOfDay / 3600);
    const minutes = Math.floor((secondOfDay - hours * 3600) / 60);
    const seconds = secondOfDay - hours * 3600 - minutes * 60;
    const fractionDigits = Math.floor(this.taiFraction * 1e12)
      .toString()
      .padStart(12, '0');
    const date =
      Math.abs(days + INSTANT_EPOCH_MJD) < 3e6
        ? isoDateOfMjd(days + INSTANT_EPOCH_MJD)
        : `MJD ${days + INSTANT_EPOCH_MJD}`;
    return `${date}T${pad2(hours)}:${pad2(minutes)}:${pad2(seconds)}.${fractionDigits} TAI`;
  }

  /** JSON form `{ taiSeconds, taiFraction }`; rebuild with {@link Instant.fromTaiParts}. */
  toJSON(): { taiSeconds: number; taiFraction: number } {
    return { taiSeconds: this.taiSeconds, taiFraction: this.taiFraction };
  }
}

/**
 * Throws unless `value` is an {@link Instant}.
 * @internal
 */
export function requireInstant(argument: string, value: unknown): Instant {
  if (!(value instanceof Instant)) {
    throw new InvalidArgumentError(
      argument,
      value,
      'an Instant (build one with createTimeScales(table).parseIso(...) or Instant.fromTaiParts(...))',
    );
  }
  return value;
}

function requireSpan(argument: string, value: unknown): number {
  const expected = `a finite number of seconds with |value| ≤ ${MAX_ABS_TAI_SECONDS}`;
  const v = requireFinite(argument, value, expected);
  if (Math.abs(v) > MAX_ABS_TAI_SECONDS) throw new InvalidArgumentError(argument, value, expected);
  return v;
}

/**
 * An instant from an integer count and a fraction that may be outside [0, 1).
 * @internal
 */
export function instantFromParts(whole: number, fraction: number): Instant {
  const n = normalize(whole, fraction);
  return Instant.fromNormalized(n.whole, n.fraction);
}
