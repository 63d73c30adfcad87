import { expect } from '@open-wc/testing';
import { at, atNumber, last } from '../../src/internal/checked.js';

// Checked reads: a programming convention (common practice, no source); the expected values are
// the arrays' own elements, written out by hand.

describe('internal/checked', () => {
  it('at(values, index) returns the element when the index is inside the array', () => {
    expect(at([3, 4, 5], 2)).to.equal(5);
    expect(at(new Float64Array([1.5, -2]), 1)).to.equal(-2);
    expect(at([0], 0)).to.equal(0);
    expect(at(['a', 'b'], 0)).to.equal('a');
  });

  it('at(values, index, name) throws a RangeError naming the array, the index and the length outside it', () => {
    expect(() => at([1, 2], 2, 'passes')).to.throw(RangeError, 'passes[2] is outside its 2 element(s)');
    expect(() => at(new Float64Array(3), -1)).to.throw(RangeError, 'values[-1] is outside its 3 element(s)');
    expect(() => at([1, 2], 0.5, 'x')).to.throw(RangeError, 'x[0.5] is outside its 2 element(s)');
  });

  it('atNumber(values, index, name) reads a typed or plain numeric array, NaN included, and throws a RangeError outside it', () => {
    expect(atNumber(new Float64Array([0.25, Number.NaN]), 0)).to.equal(0.25);
    expect(Number.isNaN(atNumber(new Float64Array([0.25, Number.NaN]), 1))).to.equal(true);
    expect(atNumber([7, 8], 1, 'y')).to.equal(8);
    expect(() => atNumber(new Float64Array(2), 2, 'y')).to.throw(RangeError, 'y[2] is outside its 2 element(s)');
  });

  it('last(values) returns the final element and throws a RangeError on an empty array', () => {
    expect(last([7, 8, 9])).to.equal(9);
    expect(() => last([], 'rows')).to.throw(RangeError, 'rows[-1] is outside its 0 element(s)');
  });
});
