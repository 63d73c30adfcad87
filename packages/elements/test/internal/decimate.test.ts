import { expect } from '@open-wc/testing';
import fc from 'fast-check';
import {
  closestIndex,
  decimateBand,
  decimateLine,
  lowerBound,
  shouldDecimate,
  upperBound,
  visibleRange,
} from '../../src/internal/decimate.js';

// Min/max-per-pixel-column decimation: common practice in time-series plotting, no source.
// The reference here is a brute-force per-column scan written independently in the test.

function bruteColumns(x: ArrayLike<number>, y: ArrayLike<number>, x0: number, x1: number, cols: number) {
  const out = new Map<number, { min: number; max: number; first: number; last: number }>();
  for (let i = 0; i < x.length; i++) {
    if (x[i]! < x0 || x[i]! > x1 || !Number.isFinite(y[i]!)) continue;
    // Same binning rule as the decimator: column = floor((x − x0) · cols/(x1 − x0)).
    const c = Math.floor((x[i]! - x0) * (cols / (x1 - x0)));
    const e = out.get(c);
    if (!e) out.set(c, { min: y[i]!, max: y[i]!, first: y[i]!, last: y[i]! });
    else {
      e.min = Math.min(e.min, y[i]!);
      e.max = Math.max(e.max, y[i]!);
      e.last = y[i]!;
    }
  }
  return out;
}

describe('internal/decimate', () => {
  it('lowerBound(x, v) and upperBound(x, v) find the insertion points of v', () => {
    const x = [0, 1, 1, 2, 5];
    expect(lowerBound(x, 1)).to.equal(1);
    expect(upperBound(x, 1)).to.equal(3);
    expect(lowerBound(x, -1)).to.equal(0);
    expect(upperBound(x, 9)).to.equal(5);
  });

  it('visibleRange(x, x0, x1) includes one neighbour on each side and stays in bounds', () => {
    const x = [0, 10, 20, 30, 40];
    expect(visibleRange(x, 12, 28)).to.deep.equal([1, 4]);
    expect(visibleRange(x, -5, 100)).to.deep.equal([0, 5]);
    expect(visibleRange([], 0, 1)).to.deep.equal([0, 0]);
  });

  it('closestIndex(x, v) returns the nearest sample, -1 for an empty array', () => {
    expect(closestIndex([0, 10, 20], 14)).to.equal(1);
    expect(closestIndex([0, 10, 20], 16)).to.equal(2);
    expect(closestIndex([0, 10, 20], -3)).to.equal(0);
    expect(closestIndex([], 1)).to.equal(-1);
  });

  it('shouldDecimate(n, columns) switches on at 4 points per column', () => {
    expect(shouldDecimate(399, 100)).to.equal(false);
    expect(shouldDecimate(400, 100)).to.equal(true);
  });

  it('decimateLine and decimateBand throw a RangeError naming the column when [start, end) is outside it', () => {
    const x = [0, 1, 2, 3],
      y = [1, 2, 3];
    expect(() => decimateLine(x, y, 0, 4, 0, 3, 100)).to.throw(
      RangeError,
      "index range [0, 4) is outside y's 3 element(s)",
    );
    expect(() => decimateLine(x, x, 0, 5, 0, 3, 1)).to.throw(RangeError, "outside x's 4 element(s)");
    expect(() => decimateBand(x, x, y, 1, 4, 0, 3, 100)).to.throw(RangeError, "outside high's 3 element(s)");
    expect(decimateLine(x, y, 2, 2, 0, 3, 100).length).to.equal(0);
  });

  it('decimateLine copies the points unchanged below the threshold', () => {
    const x = [0, 1, 2],
      y = [3, Number.POSITIVE_INFINITY, 5];
    const out = decimateLine(x, y, 0, 3, 0, 2, 100);
    expect(out.length).to.equal(3);
    expect(Array.from(out.x)).to.deep.equal([0, 1, 2]);
    expect(out.y[0]).to.equal(3);
    expect(Number.isNaN(out.y[1]!)).to.equal(true);
  });

  it('decimateLine keeps at most 4 vertices per column and the column extremes of a 10^6-point series', () => {
    const n = 1_000_000;
    const x = new Float64Array(n),
      y = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      x[i] = i;
      y[i] = Math.sin(i / 5000) + (i === 123_457 ? 50 : 0);
    }
    const out = decimateLine(x, y, 0, n, 0, n - 1, 800);
    expect(out.length).to.be.at.most(4 * 801);
    let max = -Infinity;
    for (let i = 0; i < out.length; i++) max = Math.max(max, out.y[i]!);
    expect(max).to.equal(y[123_457]); // the one-sample spike survives
  });

  it('decimateLine breaks the line at NaN samples', () => {
    const n = 4000;
    const x = Float64Array.from({ length: n }, (_, i) => i);
    const y = Float64Array.from({ length: n }, (_, i) => (i >= 2000 && i < 2100 ? Number.NaN : 1));
    const out = decimateLine(x, y, 0, n, 0, n - 1, 100);
    let gaps = 0;
    for (let i = 0; i < out.length; i++) if (Number.isNaN(out.y[i]!)) gaps++;
    expect(gaps).to.be.greaterThan(0);
  });

  it("decimateLine keeps every pixel column's min, max, first and last value (property, seed 20261202)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 50, maxLength: 3000 }),
        fc.integer({ min: 1, max: 40 }),
        (values, cols) => {
          const x = values.map((_, i) => i);
          const out = decimateLine(x, values, 0, values.length, 0, values.length - 1, cols);
          if (!shouldDecimate(values.length, cols)) return out.length === values.length;
          const ref = bruteColumns(x, values, 0, values.length - 1, cols);
          const got = bruteColumns(
            out.x.subarray(0, out.length),
            out.y.subarray(0, out.length),
            0,
            values.length - 1,
            cols,
          );
          if (ref.size !== got.size) return false;
          for (const [c, e] of ref) {
            const g = got.get(c)!;
            if (!g || g.min !== e.min || g.max !== e.max || g.first !== e.first || g.last !== e.last) return false;
          }
          // Vertices stay in x order.
          for (let i = 1; i < out.length; i++) if (out.x[i]! < out.x[i - 1]!) return false;
          return out.length <= 4 * (cols + 1);
        },
      ),
      { seed: 20261202, numRuns: 200 },
    );
  });

  it("decimateBand keeps each column's lowest low and highest high (property, seed 20261202)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -10, max: 10, noNaN: true }), fc.double({ min: 0, max: 5, noNaN: true })), {
          minLength: 100,
          maxLength: 2000,
        }),
        fc.integer({ min: 1, max: 20 }),
        (pairs, cols) => {
          const x = pairs.map((_, i) => i);
          const low = pairs.map(([c, w]) => c - w),
            high = pairs.map(([c, w]) => c + w);
          const out = decimateBand(x, low, high, 0, x.length, 0, x.length - 1, cols);
          if (!shouldDecimate(x.length, cols)) return out.length === x.length;
          const refLo = bruteColumns(x, low, 0, x.length - 1, cols),
            refHi = bruteColumns(x, high, 0, x.length - 1, cols);
          const gotLo = bruteColumns(
            out.x.subarray(0, out.length),
            out.low.subarray(0, out.length),
            0,
            x.length - 1,
            cols,
          );
          const gotHi = bruteColumns(
            out.x.subarray(0, out.length),
            out.high.subarray(0, out.length),
            0,
            x.length - 1,
            cols,
          );
          for (const [c, e] of refLo) if (gotLo.get(c)?.min !== e.min) return false;
          for (const [c, e] of refHi) if (gotHi.get(c)?.max !== e.max) return false;
          return true;
        },
      ),
      { seed: 20261202, numRuns: 150 },
    );
  });
});
