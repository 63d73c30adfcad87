/**
 * The SDK's error hierarchy. Every error is an `Error` subclass with a stable `code`, so
 * callers can branch with `instanceof` or on `code`, and tools can print one clear line.
 *
 * @module
 */

/** Base class of every error the SDK throws on purpose. */
export class TaulineError extends Error {
  /** Stable machine-readable code, e.g. `invalid-argument`. */
  readonly code: string;
  constructor(code: string, message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = new.target.name;
    this.code = code;
  }
}

/**
 * An input value is outside what the function accepts. `argument` names the field (a
 * dotted path for nested input, e.g. `orbit.semiMajorAxis`), `received` is the value as
 * given and `expected` says the accepted range in words, with units.
 */
export class InvalidArgumentError extends TaulineError {
  readonly argument: string;
  readonly received: unknown;
  readonly expected: string;
  /** An optional hint about the likely mistake (e.g. kilometres given for metres). */
  readonly hint: string | undefined;
  constructor(argument: string, received: unknown, expected: string, hint?: string) {
    super(
      'invalid-argument',
      `${label(argument)} must be ${expected}; received ${formatReceived(received)}${hint ? `. ${hint}` : ''}`,
    );
    this.argument = argument;
    this.received = received;
    this.expected = expected;
    this.hint = hint;
  }
}

/** A request falls outside the validity span of a table or model (e.g. a leap-second table). */
export class OutOfDomainError extends TaulineError {
  readonly argument: string;
  readonly received: unknown;
  readonly validFrom: string;
  readonly validTo: string;
  constructor(argument: string, received: unknown, validFrom: string, validTo: string, detail = '') {
    super(
      'out-of-domain',
      `${label(argument)} = ${formatReceived(received)} is outside the valid span ${validFrom} .. ${validTo}${detail ? `: ${detail}` : ''}`,
    );
    this.argument = argument;
    this.received = received;
    this.validFrom = validFrom;
    this.validTo = validTo;
  }
}

/** An iterative method did not reach its tolerance. */
export class ConvergenceError extends TaulineError {
  readonly iterations: number;
  readonly residual: number;
  constructor(what: string, iterations: number, residual: number) {
    super('no-convergence', `${what} did not converge after ${iterations} iterations (residual ${residual})`);
    this.iterations = iterations;
    this.residual = residual;
  }
}

/** Malformed input text. `sourceName` is the file name (or a label), `line` and `column` are 1-based. */
export class ParseError extends TaulineError {
  readonly sourceName: string;
  readonly line: number;
  readonly column: number | undefined;
  readonly expected: string;
  constructor(sourceName: string, line: number, column: number | undefined, expected: string, found?: string) {
    super(
      'parse-error',
      `${label(sourceName)}:${line}${column !== undefined ? `:${column}` : ''}: expected ${expected}` +
        (found !== undefined
          ? `; found ${JSON.stringify(found.length > 60 ? `${found.slice(0, 57)}...` : found)}`
          : ''),
    );
    this.sourceName = sourceName;
    this.line = line;
    this.column = column;
    this.expected = expected;
  }
}

/** A field or source name as text; a caller's non-string label is rendered, never allowed to throw. */
function label(name: unknown): string {
  return typeof name === 'string' ? name : formatReceived(name);
}

/** Renders a received value for an error message without losing NaN/Infinity/undefined. */
export function formatReceived(value: unknown): string {
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (typeof value === 'string') return JSON.stringify(value);
  if (value === undefined) return 'nothing (the field is missing)';
  if (typeof value === 'bigint') return `${value}n`;
  try {
    const json = JSON.stringify(value, (_key, v: unknown) => (typeof v === 'bigint' ? `${v}n` : v));
    return json === undefined ? String(value) : json.length > 80 ? `${json.slice(0, 77)}...` : json;
  } catch {
    // Cyclic or hostile objects (a throwing toJSON, a null prototype): never throw while reporting an error.
    try {
      return String(value);
    } catch {
      return Object.prototype.toString.call(value);
    }
  }
}
