/**
 * Checked reads for indices the element's own logic computes (a hit-test neighbour, a decimated
 * column's extremes, a row of a table): a bug shows as an error naming the array, the index and the
 * length, never as an `undefined` drawn as `NaN`. The elements do not import SDK internals, so this
 * is the elements' own copy of the SDK's `internal/checked.ts`.
 *
 * @module
 */

/** `values[index]`, or a `RangeError` naming `name`, the index and the length when there is no element there. */
export function at<T>(values: ArrayLike<T>, index: number, name = 'values'): T {
  const value = values[index];
  if (value === undefined) outside(name, index, values.length);
  return value;
}

/**
 * {@link at} for numeric columns (typed arrays, number arrays). A separate function so that its
 * inline cache only ever sees numeric arrays and stays fast inside per-vertex drawing loops; `at`,
 * shared with arrays of records, goes megamorphic (measured ≈ 40× slower per read in V8).
 */
export function atNumber(values: ArrayLike<number>, index: number, name = 'values'): number {
  const value = values[index];
  if (value === undefined) outside(name, index, values.length);
  return value;
}

/** The error of {@link at} and {@link atNumber}, out of line so that `at` stays small enough to inline in the decimation loops. */
function outside(name: string, index: number, length: number): never {
  throw new RangeError(`${name}[${index}] is outside its ${length} element(s) (internal index error)`);
}

/** The last element of `values`, or a `RangeError` naming `name` when it is empty. */
export function last<T>(values: ArrayLike<T>, name = 'values'): T {
  return at(values, values.length - 1, name);
}
