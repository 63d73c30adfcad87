import { at } from '../internal/checked.js';

/**
 * A Float64Array that doubles when full: one column of a record being read (epochs, values, line
 * numbers), with no per-value boxing for files of 10^7 lines.
 *
 * @internal
 */
export class GrowableColumn {
  private _data = new Float64Array(1024);
  length = 0;

  push(v: number): void {
    if (this.length === this._data.length) {
      const next = new Float64Array(this._data.length * 2);
      next.set(this._data);
      this._data = next;
    }
    this._data[this.length++] = v;
  }

  /** The value pushed `i`-th; a `RangeError` for an index not yet pushed (the spare capacity holds no value). */
  get(i: number): number {
    if (!(i < this.length))
      throw new RangeError(`column[${i}] is outside its ${this.length} element(s) (internal index error)`);
    return at(this._data, i, 'column');
  }

  toArray(): Float64Array {
    return this._data.slice(0, this.length);
  }
}
