import { describe, expect, it } from 'vitest';
import { at, last } from '../../src/internal/checked.js';

describe('checked reads', () => {
  it('at(values, index) returns the element when the index is inside the array', () => {
    expect(at([3, 4, 5], 2)).toBe(5);
    expect(at(new Float64Array([1.5, -2]), 1)).toBe(-2);
    expect(at([0], 0)).toBe(0);
  });

  it('at(values, index, name) throws a RangeError naming the array, the index and the length outside it', () => {
    expect(() => at([1, 2], 2, 'sampleTimes')).toThrow(RangeError);
    expect(() => at([1, 2], 2, 'sampleTimes')).toThrow('sampleTimes[2] is outside its 2 element(s)');
    expect(() => at(new Float64Array(3), -1)).toThrow('values[-1] is outside its 3 element(s)');
  });

  it('last(values) returns the final element and throws on an empty array', () => {
    expect(last([7, 8, 9])).toBe(9);
    expect(() => last([], 'passes')).toThrow('passes[-1] is outside its 0 element(s)');
  });
});
