// Shared assertions for the reader tests: the call must throw our ParseError (never anything else).
import { expect } from 'vitest';
import { ParseError } from '../../src/errors.js';

/** Runs `fn` and returns the ParseError it throws; rethrows any other error; fails if nothing is thrown. */
export function parseError(fn: () => unknown): ParseError {
  try {
    fn();
  } catch (e) {
    if (e instanceof ParseError) return e;
    throw e;
  }
  throw new Error('expected a ParseError');
}

/** Asserts `fn` throws a ParseError at `line` (and `column` when given) whose message matches `pattern`. */
export function expectParseError(
  fn: () => unknown,
  line: number,
  column: number | undefined,
  pattern: RegExp,
): ParseError {
  let caught: unknown;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(ParseError);
  const err = caught as ParseError;
  expect(err.line).toBe(line);
  if (column !== undefined) expect(err.column).toBe(column);
  expect(err.message).toMatch(pattern);
  return err;
}
