/**
 * The one options convention of the functions that use a constant set: the set is the `constants` field of a
 * trailing options object (with `out` for functions that can write into a caller's array), never a positional
 * argument. A set or an output array passed where the options go (the old positional form) is refused with a
 * hint, so it can never be silently replaced by the default.
 *
 * @internal
 */
import { type ConstantSet, type ConstantsOptions, DEFAULT_CONSTANT_SET } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { requireConstantSet, requireOptions } from './validate.js';

const EXPECTED = 'an object of named options such as { constants } (or omitted)';

/** Checks an options argument (see the module comment); `undefined` gives `{}`. */
export function readOptions<T extends object>(argument: string, value: T | undefined): T {
  if (ArrayBuffer.isView(value)) {
    throw new InvalidArgumentError(argument, value, EXPECTED, 'an output array goes in the options: { out: array }');
  }
  const options = requireOptions(argument, value);
  if ('gm' in options && 'relativisticF' in options) {
    throw new InvalidArgumentError(argument, value, EXPECTED, 'a constant set goes in the options: { constants: set }');
  }
  return options;
}

/** The constant set of checked options: `options.constants` validated once, or IERS 2010 when absent. */
export function constantsOf(argument: string, options: ConstantsOptions): ConstantSet {
  const { constants } = options;
  return constants === undefined ? DEFAULT_CONSTANT_SET : requireConstantSet(`${argument}.constants`, constants);
}

/** Both at once: checks the options argument and returns its constant set. */
export function readConstants(argument: string, value: ConstantsOptions | undefined): ConstantSet {
  return constantsOf(argument, readOptions(argument, value));
}
