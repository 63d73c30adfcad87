import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { GrowableColumn } from '../../src/io/growable.js';
import { regularizeSeries } from '../../src/io/phase-text.js';
import { NavV2Body } from '../../src/io/rinex-nav-v2.js';

// Internal index and length checks of the readers: programming conventions (common practice, no
// source); the expected values are the pushed values themselves.

describe('reader internals: checked reads', () => {
  it('GrowableColumn.get(i) returns the i-th pushed value across a growth, and throws a RangeError past the pushed length', () => {
    const column = new GrowableColumn();
    for (let i = 0; i < 3000; i++) column.push(i * 0.5);
    expect(column.get(0)).toBe(0);
    expect(column.get(2999)).toBe(1499.5);
    expect(column.toArray().length).toBe(3000);
    // 3000 values sit in a 4096-value buffer: the spare capacity is not a value.
    expect(() => column.get(3000)).toThrow(RangeError);
    expect(() => column.get(3000)).toThrow('column[3000] is outside its 3000 element(s)');
    expect(() => column.get(-1)).toThrow(RangeError);
  });

  it('regularizeSeries(...) throws a RangeError when the value and time columns differ in length', () => {
    expect(() => regularizeSeries('x.txt', Float64Array.of(0, 1), Float64Array.of(5), (i) => i + 1, 1)).toThrow(
      '1 value(s) for 2 time(s)',
    );
  });

  it('new NavV2Body(source, fileType) throws an InvalidArgumentError for a file type other than N, G or H', () => {
    expect(() => new NavV2Body('nav.rnx', 'L')).toThrow(InvalidArgumentError);
    expect(() => new NavV2Body('nav.rnx', 'L')).toThrow('N, G or H');
    expect(new NavV2Body('nav.rnx', 'G').finish(10)).toEqual([]);
  });
});
