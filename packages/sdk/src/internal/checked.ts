/**
 * Checked reads for indices the caller's own logic computes (a bisection bracket, a window edge, a
 * table lookup): a bug shows as an error naming the index and the length, never as an `undefined`
 * travelling on as `NaN`.
 *
 * @module
 */

/** `values[index]`, or a `RangeError` naming `name`, the index and the length when there is no element there. */
export function at<T>(values: ArrayLike<T>, index: number, name = 'values'): T {
  const value = values[index];
  if (value === undefined) {
    throw new RangeError(`${name}[${index}] is outside its ${values.length} element(s) (internal index error)`);
  }
  return value;
}

/** The last element of `values`, or a `RangeError` naming `name` when it is empty. */
export function last<T>(values: ArrayLike<T>, name = 'values'): T {
  return at(values, values.length - 1, name);
}
