import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { Instant, MAX_ABS_TAI_SECONDS } from '../../src/time/index.js';
import { exactUnits, instantUnits, unitsToSeconds } from './exact.js';

const SEED = 20261202;
const YEAR = 365.25 * 86_400;

/** Instants between 1972 and 2100 with any fraction (TAI seconds since 2000). */
const instantArb = fc
  .record({
    whole: fc.integer({ min: -28 * 366 * 86_400, max: 100 * 366 * 86_400 }),
    fraction: fc.double({ min: 0, max: 1, maxExcluded: true, noNaN: true }),
  })
  .map(({ whole, fraction }) => Instant.fromTaiParts(whole, fraction));

describe('Instant', () => {
  it('Instant.fromTaiParts(w, f) normalises the fraction into [0, 1) and carries whole seconds', () => {
    const t = Instant.fromTaiParts(10, 1.5);
    expect([t.taiSeconds, t.taiFraction]).toEqual([11, 0.5]);
    const u = Instant.fromTaiParts(10, -0.25);
    expect([u.taiSeconds, u.taiFraction]).toEqual([9, 0.75]);
    const v = Instant.fromTaiParts(-0.5);
    expect([v.taiSeconds, v.taiFraction]).toEqual([-1, 0.5]);
  });

  it('Instant.fromTaiParts(w, f) keeps a tiny negative fraction inside [0, 1) (rounding to 1 carries)', () => {
    const t = Instant.fromTaiParts(5, -1e-20);
    expect(t.taiFraction).toBeGreaterThanOrEqual(0);
    expect(t.taiFraction).toBeLessThan(1);
    expect(t.taiSeconds + t.taiFraction).toBe(5);
  });

  it('Instant.fromTaiSeconds(x) equals fromTaiParts(x, 0)', () => {
    expect(Instant.fromTaiSeconds(123.25).equals(Instant.fromTaiParts(123, 0.25))).toBe(true);
  });

  it('Instant is frozen (immutable)', () => {
    const t = Instant.fromTaiParts(1, 0.5);
    expect(Object.isFrozen(t)).toBe(true);
    expect(() => {
      (t as { taiSeconds: number }).taiSeconds = 3;
    }).toThrow(TypeError);
  });

  it('instant.plus(s) resolves 1e-12 s at year 2100 (split precision; one float of seconds would resolve 1.2e-7 s)', () => {
    const t = Instant.fromTaiParts(100 * YEAR, 0);
    const u = t.plus(1e-12);
    expect(u.secondsSince(t)).toBeCloseTo(1e-12, 24);
    expect(u.compare(t)).toBe(1);
  });

  it('instant.plus(s) and secondsSince round-trip a 3-year span to 1e-12 s via preciseSecondsSince', () => {
    const a = Instant.fromTaiParts(536_500_800, 0.123_456_789_012_3);
    const span = 3 * YEAR + 0.987_654_321_098_7;
    const b = a.plus(span);
    const { hi, lo } = b.preciseSecondsSince(a);
    expect(Math.abs(hi - span + lo)).toBeLessThan(1e-12);
  });

  it('instant.preciseSecondsSince(earlier) matches an exact rational difference to 1e-15 s for spans up to 100 years', () => {
    fc.assert(
      fc.property(instantArb, instantArb, (a, b) => {
        const exact = instantUnits(a) - instantUnits(b);
        const { hi, lo } = a.preciseSecondsSince(b);
        const got = exactUnits(hi) + exactUnits(lo);
        return Math.abs(unitsToSeconds(got - exact)) <= 1e-15;
      }),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('instant.secondsSince(earlier) is the double nearest the exact span (relative error ≤ 1.2e-16)', () => {
    fc.assert(
      fc.property(instantArb, instantArb, (a, b) => {
        const exact = unitsToSeconds(instantUnits(a) - instantUnits(b));
        const got = a.secondsSince(b);
        return Math.abs(got - exact) <= Math.abs(exact) * 1.2e-16 + 1e-16;
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('instant.plusPrecise(later.preciseSecondsSince(instant)) returns later to 1e-12 s (property, spans up to 100 years)', () => {
    fc.assert(
      fc.property(instantArb, instantArb, (a, b) => {
        const back = a.plusPrecise(b.preciseSecondsSince(a));
        return Math.abs(unitsToSeconds(instantUnits(back) - instantUnits(b))) <= 1e-12;
      }),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('instant.plus(s).preciseSecondsSince(instant) returns s to 1e-12 s (property, |s| up to 10 years)', () => {
    fc.assert(
      fc.property(instantArb, fc.double({ min: -10 * YEAR, max: 10 * YEAR, noNaN: true }), (a, s) => {
        const { hi, lo } = a.plus(s).preciseSecondsSince(a);
        return Math.abs(hi - s + lo) <= 1e-12;
      }),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('instant.compare / isBefore / isAfter / Instant.compare order by TAI, fraction included', () => {
    const a = Instant.fromTaiParts(100, 0.25);
    const b = Instant.fromTaiParts(100, 0.5);
    const c = Instant.fromTaiParts(101, 0);
    expect([a.compare(b), b.compare(a), a.compare(a), b.compare(c)]).toEqual([-1, 1, 0, -1]);
    expect(a.isBefore(b) && b.isAfter(a) && !a.isBefore(a)).toBe(true);
    expect([c, a, b].sort(Instant.compare)).toEqual([a, b, c]);
  });

  it('instant.equals(other, tolerance) is exact by default and tolerant when asked', () => {
    const a = Instant.fromTaiParts(100, 0.25);
    const b = a.plus(1e-13);
    expect(a.equals(Instant.fromTaiParts(100, 0.25))).toBe(true);
    expect(a.equals(b)).toBe(false);
    expect(a.equals(b, 1e-12)).toBe(true);
  });

  it('instant.toString() prints TAI calendar text and toJSON() the two parts', () => {
    const t = Instant.fromTaiParts(536_544_037, 0.5);
    expect(t.toString()).toBe('2017-01-01T00:00:37.500000000000 TAI');
    expect(JSON.parse(JSON.stringify(t))).toEqual({ taiSeconds: 536_544_037, taiFraction: 0.5 });
    expect(Instant.fromTaiParts(-1, 0).toString()).toBe('1999-12-31T23:59:59.000000000000 TAI');
  });

  describe('throw paths', () => {
    it('Instant.fromTaiParts rejects NaN, Infinity and times beyond ±1e12 s', () => {
      expect(() => Instant.fromTaiParts(Number.NaN)).toThrow(InvalidArgumentError);
      expect(() => Instant.fromTaiParts(0, Number.POSITIVE_INFINITY)).toThrow(/taiFraction/);
      expect(() => Instant.fromTaiParts(MAX_ABS_TAI_SECONDS * 2)).toThrow(/taiSeconds/);
      expect(() => Instant.fromTaiParts(MAX_ABS_TAI_SECONDS, 5)).toThrow(/instant must be a time within/);
    });
    it('Instant.fromNormalized rejects a non-integer whole part or a fraction outside [0, 1)', () => {
      expect(() => Instant.fromNormalized(1.5, 0)).toThrow(/integer whole part/);
      expect(() => Instant.fromNormalized(1, 1)).toThrow(InvalidArgumentError);
      expect(() => Instant.fromNormalized(1, -0.1)).toThrow(InvalidArgumentError);
    });
    it('instant.plus rejects NaN and results outside the span', () => {
      const t = Instant.fromTaiParts(0);
      expect(() => t.plus(Number.NaN)).toThrow(/seconds must be a finite number/);
      expect(() => Instant.fromTaiParts(MAX_ABS_TAI_SECONDS).plus(1)).toThrow(InvalidArgumentError);
    });
    it('instant.plusPrecise rejects a missing span or non-finite parts', () => {
      const t = Instant.fromTaiParts(0);
      expect(() => t.plusPrecise(null as unknown as { hi: number; lo: number })).toThrow(/span must be an object/);
      expect(() => t.plusPrecise({ hi: 1, lo: Number.NaN })).toThrow(/span\.lo/);
      expect(() => t.plusPrecise({ hi: Number.NaN, lo: 0 })).toThrow(/span\.hi/);
    });
    it('instant.secondsSince / compare / equals reject a non-Instant', () => {
      const t = Instant.fromTaiParts(0);
      expect(() => t.secondsSince(5 as unknown as Instant)).toThrow(/earlier must be an Instant/);
      expect(() => t.compare({ taiSeconds: 0, taiFraction: 0 } as unknown as Instant)).toThrow(
        /other must be an Instant/,
      );
      expect(() => t.equals(undefined as unknown as Instant)).toThrow(InvalidArgumentError);
    });
    it('instant.equals rejects a negative or NaN tolerance', () => {
      const t = Instant.fromTaiParts(0);
      expect(() => t.equals(t, -1)).toThrow(/toleranceSeconds/);
      expect(() => t.equals(t, Number.NaN)).toThrow(/toleranceSeconds/);
    });
  });
});
