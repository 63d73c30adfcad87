/**
 * The small command framework shared by every `tauline` command: flag parsing with
 * typed validation, one-line errors, and human tables vs `--json` output.
 */
import { parseArgs, type ParseArgsConfig } from 'node:util';
import { TaulineError, InvalidArgumentError, formatReceived } from '@tauline/sdk/errors';
import { MAX_SEED } from '@tauline/sdk/steering';
import { FLIGHT_CONFIGURATION_CAUTION } from '@tauline/sdk/relativity';

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

export function parseCommandArgs(command: Command, argv: string[]): ParsedArgs {
  const options: NonNullable<ParseArgsConfig['options']> = { help: { type: 'boolean', short: 'h' } };
  for (const [name, spec] of Object.entries(command.flags)) {
    options[name] = { type: spec.type, multiple: spec.multiple ?? false, ...(spec.short ? { short: spec.short } : {}) };
  }
  // node's parser reads "-1" after a flag as an option; a string flag followed by a negative
  // number (or a comma list starting with one, e.g. --state -1.2e7,...) takes it as its value.
  const args: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const token = argv[i]!;
    const next = argv[i + 1];
    const name = token.startsWith('--') ? token.slice(2) : undefined;
    if (name !== undefined && !name.includes('=') && command.flags[name]?.type === 'string' && next !== undefined && /^-(\d|\.\d)/.test(next)) {
      args.push(`${token}=${next}`);
      i++;
    } else args.push(token);
  }
  let parsed: ReturnType<typeof parseArgs<{ args: string[]; options: typeof options; allowPositionals: boolean; strict: true; tokens: true }>>;
  try {
    parsed = parseArgs({ args, options, allowPositionals: command.allowPositionals ?? false, strict: true, tokens: true });
  } catch (e) {
    const message = e instanceof Error ? e.message.replace(/\. To specify a positional.*$/s, '').replace(/\s*\n\s*/g, ' ') : String(e);
    throw new UsageError(`${message} (see \`tauline ${command.name} --help\`)`);
  }
  // A flag given twice would silently keep the last value: refuse it unless the flag takes several.
  const seen = new Map<string, string | undefined>();
  for (const token of parsed.tokens) {
    if (token.kind !== 'option' || options[token.name]?.multiple) continue;
    if (seen.has(token.name)) {
      const values = [seen.get(token.name), token.value].filter((v) => v !== undefined).map((v) => JSON.stringify(v));
      throw new UsageError(`--${token.name} is given more than once${values.length ? ` (${values.join(' and ')})` : ''}; give it once (see \`tauline ${command.name} --help\`)`);
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
  if (args.positionals.length !== 1) throw new UsageError(`give exactly one ${what} (see \`tauline ${args.command?.name ?? '<command>'} --help\`)`);
  return args.positionals[0]!;
}

/**
 * Runs `body`, renaming the argument of an SDK InvalidArgumentError to the command-line flag it came
 * from (e.g. `semiMajorAxis` → `--semi-major-axis`), so the one-line error names what the user typed.
 * @param flags  Argument → flag, or a function giving the flag of an argument (undefined: keep it).
 */
export function withFlagNames<T>(flags: Readonly<Record<string, string>> | ((argument: string) => string | undefined), body: () => T): T {
  try {
    return body();
  } catch (error) {
    if (error instanceof InvalidArgumentError) {
      const flag = typeof flags === 'function' ? flags(error.argument) : Object.hasOwn(flags, error.argument) ? flags[error.argument] : undefined;
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
  return Array.isArray(v) ? v[v.length - 1]! : v;
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
export function integerFlag(args: ParsedArgs, flag: string, min: number, max: number, what: string): number | undefined {
  const v = numberFlag(args, flag);
  if (v === undefined) return undefined;
  if (!Number.isInteger(v) || v < min || v > max) throw new InvalidArgumentError(`--${flag}`, v, `an integer in [${min}, ${max}] (${what})`);
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
  return { type: 'string', value: formats.join('|'), description: `Output format: ${formats.join(', ')} (default ${defaultFormat}).` };
}

/** Help of `--json` on commands whose default output is one table. */
export const JSON_INSTEAD_OF_TABLE = 'Print one JSON object instead of a table (same as --format json).';

/**
 * The output-format flags of a command: the boolean shorthands (`json`, `csv`, …, each named like one
 * of `formats`, with its help) and then `--format`. Read them with {@link formatFlag}.
 */
export function formatFlags(formats: readonly string[], shorthands: Readonly<Record<string, string>> = { json: JSON_INSTEAD_OF_TABLE }): Record<string, FlagSpec> {
  const flags: Record<string, FlagSpec> = {};
  for (const [name, description] of Object.entries(shorthands)) flags[name] = { type: 'boolean', description };
  flags['format'] = formatFlagSpec(formats);
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
    if (!(formats as readonly string[]).includes(lower)) throw new InvalidArgumentError('--format', text, `one of ${formats.join(', ')}`);
    chosen.set(lower, `--format ${lower}`);
  }
  for (const f of formats) if (args.values[f] === true && !chosen.has(f)) chosen.set(f, `--${f}`);
  if (chosen.size > 1) throw new UsageError(`${[...chosen.values()].join(' and ')} cannot be combined: choose one output format`);
  return (chosen.keys().next().value as F | undefined) ?? defaultFormat;
}

/** Renders rows as an aligned text table. Numbers are right-aligned. */
export function table(headers: string[], rows: (string | number)[][]): string {
  const cells = rows.map((r) => r.map((c) => String(c)));
  // Widths by a loop: spreading a long column into Math.max overflows the call stack (~125 000 rows).
  const widths = headers.map((h) => h.length);
  for (const r of cells) r.forEach((c, i) => { if (i < widths.length && c.length > widths[i]!) widths[i] = c.length; });
  const numeric = headers.map((_, i) => rows.every((r) => typeof r[i] === 'number' || /^[-+]?[\d.]/.test(String(r[i] ?? ''))));
  const fmt = (r: string[]) => r.map((c, i) => (numeric[i] ? c.padStart(widths[i]!) : c.padEnd(widths[i]!))).join('  ').trimEnd();
  return [fmt(headers), widths.map((w) => '─'.repeat(w)).join('  '), ...cells.map(fmt)].join('\n') + '\n';
}

/** Two-column key/value table for a single result. */
export function keyValueTable(rows: [string, string][]): string {
  const w = Math.max(...rows.map(([k]) => k.length));
  return rows.map(([k, v]) => `${k.padEnd(w)}  ${v}`).join('\n') + '\n';
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
  return JSON.stringify(value, (_k, v) => (typeof v === 'bigint' ? v.toString() : v), 2) + '\n';
}

/** A one-line progress bar on stderr, redrawn in place when the whole percentage changes; only for terminals. */
export function progressBar(io: Io, label: string): { update: (done: number, total: number) => void; finish: () => void } {
  let last = -1;
  return {
    update(done, total) {
      const pct = Math.min(100, Math.floor((100 * done) / total));
      if (pct === last) return;
      last = pct;
      const filled = Math.round(pct / 4);
      io.err(`\r${label} [${'#'.repeat(filled)}${'.'.repeat(25 - filled)}] ${String(pct).padStart(3)} %`);
    },
    finish() {
      io.err(`\r${' '.repeat(label.length + 35)}\r`);
    },
  };
}

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
};

/** Turns any thrown value into one line for stderr and an exit status. */
export function describeFailure(error: unknown): { line: string; status: number } {
  if (error instanceof UsageError) return { line: error.message, status: EXIT_USAGE };
  if (error instanceof InvalidArgumentError) return { line: `invalid input: ${error.message}`, status: EXIT_USAGE };
  if (error instanceof TaulineError) return { line: `${error.code}: ${error.message}`, status: EXIT_USAGE };
  if (error instanceof Error && 'code' in error && typeof (error as NodeJS.ErrnoException).code === 'string') {
    const reason = FILE_ERRORS[(error as NodeJS.ErrnoException).code!];
    if (reason) return { line: `cannot read ${formatReceived((error as NodeJS.ErrnoException).path)}: ${reason}`, status: EXIT_USAGE };
  }
  const message = error instanceof Error ? error.message : String(error);
  return { line: `internal error: ${message} (please report this with the command line that caused it)`, status: 3 };
}

export function commandHelp(command: Command): string {
  const lines = [`tauline ${command.name} ${command.usage}`, '', command.summary, ''];
  const names = Object.keys(command.flags);
  const labels = names.map((n) => `--${n}${command.flags[n]!.value ? ` ${command.flags[n]!.value}` : ''}`);
  const w = Math.max(...labels.map((l) => l.length), 10);
  names.forEach((n, i) => lines.push(`  ${labels[i]!.padEnd(w)}  ${command.flags[n]!.description}`));
  lines.push(`  ${'--help'.padEnd(w)}  Show this help.`);
  if (command.details) lines.push('', command.details.trim());
  return lines.join('\n') + '\n';
}
