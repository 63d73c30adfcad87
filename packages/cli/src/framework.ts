/**
 * The small command framework shared by every `tauline` command: flag parsing with
 * typed validation, one-line errors, and human tables vs `--json` output.
 */
import { writeFile } from 'node:fs/promises';
import { type ParseArgsConfig, parseArgs } from 'node:util';
import { formatReceived, InvalidArgumentError, TaulineError } from '@tauline/sdk/errors';
import { FLIGHT_CONFIGURATION_CAUTION } from '@tauline/sdk/relativity';
import { MAX_SEED } from '@tauline/sdk/steering';
import { fitTable, TABLE_WIDTH, wrapText } from './layout.js';
import { escapeControlCharacters } from './text-safety.js';

export { escapeControlCharacters };

import { didYouMean } from './suggest.js';

/** Exit status: 0 success, 1 a finding (e.g. a review fail), 2 unusable input. */
export const EXIT_OK = 0;
export const EXIT_FINDING = 1;
export const EXIT_USAGE = 2;

/** Where a command writes; tests pass buffers, the binary passes process streams. */
export interface Io {
  out: (text: string) => void;
  err: (text: string) => void;
  /** True when stderr is an interactive terminal (progress bars only then). */
  isTty: boolean;
  /** What a file named `-` reads: the binary passes process.stdin; without it, `-` reads nothing (an empty input). */
  stdin?: () => AsyncIterable<Uint8Array | string>;
}

export interface FlagSpec {
  type: 'string' | 'boolean';
  /** One-line help, with units. */
  description: string;
  /** Placeholder shown in help, e.g. `<m>`. */
  value?: string;
  multiple?: boolean;
  short?: string;
}

export interface Command {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** Usage line after `tauline <name>`, e.g. `--semi-major-axis <m> [--json]`. */
  usage: string;
  /** Longer help text (formulas, sources, examples). */
  details?: string;
  flags: Record<string, FlagSpec>;
  /** Whether positional arguments (files) are accepted. */
  allowPositionals?: boolean;
  /** Flags of earlier releases, no longer accepted: name (without `--`) → what to give instead. */
  retiredFlags?: Readonly<Record<string, string>>;
  run(args: ParsedArgs, io: Io): Promise<number> | number;
}

export interface ParsedArgs {
  values: Record<string, string | boolean | string[] | undefined>;
  positionals: string[];
  /** The command the arguments were parsed for (lets messages quote the flag's help). */
  command?: Command;
}

/** A usage error: printed as one line, exit status 2. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/**
 * A file the command was asked to write could not be written (`--output`): printed as
 * `cannot write <path>: <reason>`, exit status 2.
 */
export class OutputError extends Error {
  readonly path: string;
  readonly reason: string;
  constructor(path: string, reason: string) {
    super(`cannot write ${formatReceived(path)}: ${reason}`);
    this.name = 'OutputError';
    this.path = path;
    this.reason = reason;
  }
}

export function parseCommandArgs(command: Command, argv: string[]): ParsedArgs {
  // --help and --wide (tables and text in their long form, not fitted to 100 columns) are flags of every command.
  const options: NonNullable<ParseArgsConfig['options']> = {
    help: { type: 'boolean', short: 'h' },
    wide: { type: 'boolean' },
  };
  for (const [name, spec] of Object.entries(command.flags)) {
    options[name] = { type: spec.type, multiple: spec.multiple ?? false, ...(spec.short ? { short: spec.short } : {}) };
  }
  // node's parser reads "-1" after a flag as an option; a string flag followed by a negative
  // number (or a comma list starting with one, e.g. --state -1.2e7,...) takes it as its value.
  const args: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const token = argv[i];
    if (token === undefined) break;
    const next = argv[i + 1];
    const name = token.startsWith('--') ? token.slice(2) : undefined;
    if (
      name !== undefined &&
      !name.includes('=') &&
      command.flags[name]?.type === 'string' &&
      next !== undefined &&
      /^-(\d|\.\d)/.test(next)
    ) {
      args.push(`${token}=${next}`);
      i++;
    } else args.push(token);
  }
  let parsed: ReturnType<
    typeof parseArgs<{ args: string[]; options: typeof options; allowPositionals: boolean; strict: true; tokens: true }>
  >;
  try {
    parsed = parseArgs({
      args,
      options,
      allowPositionals: command.allowPositionals ?? false,
      strict: true,
      tokens: true,
    });
  } catch (e) {
    const message =
      e instanceof Error
        ? e.message.replace(/\. To specify a positional.*$/s, '').replace(/\s*\n\s*/g, ' ')
        : String(e);
    const unknown = /^Unknown option '--?([^'=]+)/.exec(message)?.[1];
    const instead = unknown === undefined ? undefined : command.retiredFlags?.[unknown];
    if (instead !== undefined)
      throw new UsageError(`--${unknown} is no longer accepted: ${instead} (see \`tauline ${command.name} --help\`)`);
    const hint =
      unknown !== undefined ? didYouMean(unknown, [...Object.keys(command.flags), 'help', 'wide'], '--') : '';
    throw new UsageError(`${message}${hint} (see \`tauline ${command.name} --help\`)`);
  }
  // A flag given twice would silently keep the last value: refuse it unless the flag takes several.
  const seen = new Map<string, string | undefined>();
  for (const token of parsed.tokens) {
    if (token.kind !== 'option' || options[token.name]?.multiple) continue;
    if (seen.has(token.name)) {
      const values = [seen.get(token.name), token.value].filter((v) => v !== undefined).map((v) => JSON.stringify(v));
      throw new UsageError(
        `--${token.name} is given more than once${values.length ? ` (${values.join(' and ')})` : ''}; give it once (see \`tauline ${command.name} --help\`)`,
      );
    }
    seen.set(token.name, token.value);
  }
  return { values: parsed.values as ParsedArgs['values'], positionals: parsed.positionals, command };
}

/**
 * The one positional argument of a command that reads one file; none or several is a usage error.
 * @param what  What the file is, for the message (e.g. "scenario file").
 */
export function onePositional(args: ParsedArgs, what: string): string {
  const [only, ...more] = args.positionals;
  if (only === undefined || more.length > 0)
    throw new UsageError(`give exactly one ${what} (see \`tauline ${args.command?.name ?? '<command>'} --help\`)`);
  return only;
}

/**
 * Runs `body`, renaming the argument of an SDK InvalidArgumentError to the command-line flag it came
 * from (e.g. `semiMajorAxis` → `--semi-major-axis`), so the one-line error names what the user typed.
 * @param flags  Argument → flag, or a function giving the flag of an argument (undefined: keep it).
 */
export function withFlagNames<T>(
  flags: Readonly<Record<string, string>> | ((argument: string) => string | undefined),
  body: () => T,
): T {
  try {
    return body();
  } catch (error) {
    if (error instanceof InvalidArgumentError) {
      const flag =
        typeof flags === 'function'
          ? flags(error.argument)
          : Object.hasOwn(flags, error.argument)
            ? flags[error.argument]
            : undefined;
      if (flag !== undefined) throw new InvalidArgumentError(flag, error.received, error.expected, error.hint);
    }
    throw error;
  }
}

/** Reads a required string flag; a missing or empty one is a usage error quoting the flag's help. */
export function requireFlag(args: ParsedArgs, flag: string): string {
  const v = args.values[flag];
  if (v === undefined || v === '' || typeof v === 'boolean') {
    const spec = args.command?.flags[flag];
    const what = spec ? `: ${spec.value ? `${spec.value}, ` : ''}${spec.description.replace(/\.$/, '')}` : '';
    throw new UsageError(`--${flag} is required${v === '' ? ' (it was given empty)' : ''}${what}`);
  }
  // A flag given several times (only those declared `multiple`) reads as its last value; node's parser never gives [].
  return Array.isArray(v) ? (v.at(-1) ?? '') : v;
}

/** Reads an optional string flag. */
export function optionalFlag(args: ParsedArgs, flag: string): string | undefined {
  const v = args.values[flag];
  if (v === undefined || typeof v === 'boolean') return undefined;
  return Array.isArray(v) ? v[v.length - 1] : v;
}

/**
 * Parses a number flag strictly: the whole text must be a finite decimal number
 * (no trailing units, no empty string). Range checks belong to the SDK.
 */
export function numberFlag(args: ParsedArgs, flag: string, required: true): number;
export function numberFlag(args: ParsedArgs, flag: string, required?: false): number | undefined;
export function numberFlag(args: ParsedArgs, flag: string, required = false): number | undefined {
  const text = required ? requireFlag(args, flag) : optionalFlag(args, flag);
  if (text === undefined) return undefined;
  return parseNumber(`--${flag}`, text);
}

/** Strict decimal parse; throws an InvalidArgumentError naming the field. */
export function parseNumber(field: string, text: string): number {
  const trimmed = text.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(trimmed)) {
    throw new InvalidArgumentError(field, text, 'a decimal number in SI units (e.g. 26561750 or 2.656175e7)');
  }
  const v = Number(trimmed);
  if (!Number.isFinite(v)) throw new InvalidArgumentError(field, text, 'a finite number');
  return v;
}

/**
 * Reads an integer flag in [min, max]; `what` describes it (e.g. "simulated clocks per strategy").
 * @throws {InvalidArgumentError} naming the flag, the value and the range.
 */
export function integerFlag(
  args: ParsedArgs,
  flag: string,
  min: number,
  max: number,
  what: string,
  required: true,
): number;
export function integerFlag(
  args: ParsedArgs,
  flag: string,
  min: number,
  max: number,
  what: string,
  required?: false,
): number | undefined;
export function integerFlag(
  args: ParsedArgs,
  flag: string,
  min: number,
  max: number,
  what: string,
  required = false,
): number | undefined {
  const v = required ? numberFlag(args, flag, true) : numberFlag(args, flag);
  if (v === undefined) return undefined;
  if (!Number.isInteger(v) || v < min || v > max)
    throw new InvalidArgumentError(`--${flag}`, v, `an integer in [${min}, ${max}] (${what})`);
  return v;
}

/**
 * Reads a flag naming one of `choices` (case-insensitive; `fallback` when absent).
 * @throws {InvalidArgumentError} naming the flag, the text given and the choices.
 */
export function choiceFlag<C extends string>(args: ParsedArgs, flag: string, choices: readonly C[], fallback: C): C {
  const text = optionalFlag(args, flag);
  const lower = (text ?? fallback).toLowerCase();
  if ((choices as readonly string[]).includes(lower)) return lower as C;
  throw new InvalidArgumentError(`--${flag}`, text, `one of ${choices.join(', ')}`);
}

/** Largest seed accepted by the SDK's random generators (unsigned 32-bit). */
export { MAX_SEED };

/**
 * Reads `--seed`: an integer in [0, 2³² − 1], the same range for every command (the SDK's
 * generators reduce a seed to 32 bits, so a wider value would silently alias another seed).
 */
export function seedFlag(args: ParsedArgs): number | undefined {
  return integerFlag(args, 'seed', 0, MAX_SEED, 'seed of the random generator; same seed, same numbers');
}

/** The `--seed` flag spec; `of` names the generator, `purpose` ends the sentence (e.g. "; same seed, same numbers"). */
export function seedFlagSpec(of: string, purpose: string): FlagSpec {
  return { type: 'string', value: '<n>', description: `Seed of ${of}, 0 … ${MAX_SEED} (default 1)${purpose}.` };
}

/** The two formats of commands printing one result: an aligned table (default) or JSON. */
export const TABLE_OR_JSON = ['table', 'json'] as const;
/** Formats of commands printing a long list of rows. */
export const TABLE_JSON_CSV = ['table', 'json', 'csv'] as const;

/** The `--format` flag spec, for commands offering more than one output format. */
export function formatFlagSpec(formats: readonly string[], defaultFormat = 'table'): FlagSpec {
  return {
    type: 'string',
    value: formats.join('|'),
    description: `Output format: ${formats.join(', ')} (default ${defaultFormat}).`,
  };
}

/** Help of `--json` on commands whose default output is one table. */
export const JSON_INSTEAD_OF_TABLE = 'Print one JSON object instead of a table (same as --format json).';

/**
 * The output-format flags of a command: the boolean shorthands (`json`, `csv`, …, each named like one
 * of `formats`, with its help) and then `--format`. Read them with {@link formatFlag}.
 */
export function formatFlags(
  formats: readonly string[],
  shorthands: Readonly<Record<string, string>> = { json: JSON_INSTEAD_OF_TABLE },
): Record<string, FlagSpec> {
  const flags: Record<string, FlagSpec> = {};
  for (const [name, description] of Object.entries(shorthands)) flags[name] = { type: 'boolean', description };
  flags.format = formatFlagSpec(formats);
  return flags;
}

/**
 * Reads the output format from `--format <name>` and its shorthands (`--json`, `--csv`, …: any
 * boolean flag named like an accepted format). Conflicting choices are a usage error.
 */
export function formatFlag<F extends string>(args: ParsedArgs, formats: readonly F[], defaultFormat: F): F {
  const chosen = new Map<string, string>(); // format → how it was asked for
  const text = optionalFlag(args, 'format');
  if (text !== undefined) {
    const lower = text.toLowerCase();
    if (!(formats as readonly string[]).includes(lower))
      throw new InvalidArgumentError('--format', text, `one of ${formats.join(', ')}`);
    chosen.set(lower, `--format ${lower}`);
  }
  for (const f of formats) if (args.values[f] === true && !chosen.has(f)) chosen.set(f, `--${f}`);
  if (chosen.size > 1)
    throw new UsageError(`${[...chosen.values()].join(' and ')} cannot be combined: choose one output format`);
  return (chosen.keys().next().value as F | undefined) ?? defaultFormat;
}

/** Renders rows as an aligned text table, unlimited in width. Numbers are right-aligned (also in a column holding "—"). */
export function table(headers: string[], rows: (string | number)[][]): string {
  return fitTable(headers, rows, { width: undefined });
}

/** Two-column key/value table for a single result. */
export function keyValueTable(rows: [string, string][], width?: number): string {
  const w = Math.max(...rows.map(([k]) => k.length));
  // With a width, a long value wraps under itself (hanging indent past the key column).
  return `${rows
    .map(([k, v]) => wrapText(`${k.padEnd(w)}  ${escapeControlCharacters(v)}`, width, ' '.repeat(w + 2)).join('\n'))
    .join('\n')}\n`;
}

/** Formats a number with `digits` significant digits, keeping exponent form for tiny values. */
export function sig(value: number, digits = 10): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const abs = Math.abs(value);
  return abs >= 1e-3 && abs < 1e7 ? String(Number(value.toPrecision(digits))) : value.toExponential(digits - 1);
}

/** JSON with a trailing newline; bigint values become decimal strings. */
export function toJson(value: unknown): string {
  return `${JSON.stringify(value, (_k, v) => (typeof v === 'bigint' ? v.toString() : v), 2)}\n`;
}

/** The progress bar lives in its own module; re-exported here for the commands that import it from the framework. */
export { progressBar } from './progress.js';

/** The line printed for flight-configuration outputs: the SDK's flight-configuration caution, so the CLI and the SDK say the same words. */
export const FLIGHT_CAUTION = FLIGHT_CONFIGURATION_CAUTION;

/** File-system errors that mean the user named an unusable file, with the reason printed. */
const FILE_ERRORS: Record<string, string> = {
  ENOENT: 'no such file',
  EISDIR: 'it is a directory, not a file',
  ENOTDIR: 'a part of the path is not a directory',
  EACCES: 'permission denied',
  EPERM: 'operation not permitted',
  ELOOP: 'too many symbolic links',
  ENAMETOOLONG: 'the name is too long',
  EROFS: 'read-only file system',
  ENOSPC: 'no space left on the device',
  EDQUOT: 'disk quota exceeded',
  EFBIG: 'the file is too large',
  EIO: 'input/output error',
  ENXIO: 'no such device or address',
  ENODEV: 'no such device',
  EBUSY: 'the file is busy',
  ETXTBSY: 'the file is busy',
  EMFILE: 'too many open files',
  ENFILE: 'too many open files',
};

/** The one-line reason of a file-system error (`code`), or undefined when it is not one. */
export function fileErrorReason(error: unknown): string | undefined {
  const code = error instanceof Error && 'code' in error ? (error as NodeJS.ErrnoException).code : undefined;
  return typeof code === 'string' ? FILE_ERRORS[code] : undefined;
}

/**
 * Writes `text` to the file named by `--output`, turning a file-system failure into an
 * {@link OutputError} ("cannot write …", exit 2) rather than a read error or an internal error.
 */
export async function writeOutputFile(path: string, text: string): Promise<void> {
  try {
    await writeFile(path, text, 'utf8');
  } catch (error) {
    const reason =
      fileErrorReason(error) ??
      (error instanceof Error && 'code' in error ? String((error as NodeJS.ErrnoException).code) : undefined);
    if (reason !== undefined) throw new OutputError(path, reason);
    throw error;
  }
}

/** Turns any thrown value into one line for stderr and an exit status. */
export function describeFailure(error: unknown): { line: string; status: number } {
  if (error instanceof UsageError || error instanceof OutputError) return { line: error.message, status: EXIT_USAGE };
  if (error instanceof InvalidArgumentError) return { line: `invalid input: ${error.message}`, status: EXIT_USAGE };
  if (error instanceof TaulineError) return { line: `${error.code}: ${error.message}`, status: EXIT_USAGE };
  const e = error instanceof Error && 'code' in error ? (error as NodeJS.ErrnoException) : undefined;
  if (e !== undefined && typeof e.code === 'string') {
    const reason = FILE_ERRORS[e.code];
    if (reason && e.syscall === 'write')
      return {
        line: `cannot write ${e.path === undefined ? 'standard output' : formatReceived(e.path)}: ${reason}`,
        status: EXIT_USAGE,
      };
    if (reason)
      return {
        line: `cannot read ${e.path === undefined ? 'the input' : formatReceived(e.path)}: ${reason}`,
        status: EXIT_USAGE,
      };
  }
  const message = error instanceof Error ? error.message : String(error);
  return { line: `internal error: ${message} (please report this with the command line that caused it)`, status: 3 };
}

export function commandHelp(command: Command): string {
  // The usage line wraps between its [optional parts], never inside one (no-break spaces while wrapping).
  const usage = command.usage.replace(/\[[^\]]*\]/g, (part) => part.replace(/ /g, '\u00a0'));
  const usageLines = wrapText(`tauline ${command.name} ${usage}`, TABLE_WIDTH, ' '.repeat(command.name.length + 9)).map(
    (l) => l.replace(/\u00a0/g, ' '),
  );
  const lines = [...usageLines, '', command.summary, ''];
  const flags = Object.entries(command.flags);
  const labelled = flags.map(([n, spec]) => ({ label: `--${n}${spec.value ? ` ${spec.value}` : ''}`, spec }));
  const w = Math.max(...labelled.map(({ label }) => label.length), 10);
  // Flag help wraps at 100 columns under its description column (the details below are laid out by hand).
  for (const { label, spec } of labelled)
    lines.push(...wrapText(`  ${label.padEnd(w)}  ${spec.description}`, TABLE_WIDTH, ' '.repeat(w + 4)));
  lines.push(`  ${'--wide'.padEnd(w)}  Tables and text in their long form, not fitted to 100 columns.`);
  lines.push(`  ${'--help'.padEnd(w)}  Show this help.`);
  const readsFiles =
    command.allowPositionals === true || flags.some(([n, spec]) => spec.value === '<file>' && n !== 'output');
  if (readsFiles)
    lines.push(
      '',
      'Input files: - reads standard input; a directory, pipe, device or binary file is refused (exit 2).',
    );
  if (command.details) lines.push('', command.details.trim());
  return `${lines.join('\n')}\n`;
}
