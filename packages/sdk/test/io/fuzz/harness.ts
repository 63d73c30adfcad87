/**
 * A small seeded fuzzing harness for the text readers: mutators that damage real fixture files the way
 * transfers, editors and attackers do (byte flips, truncation, duplicated or deleted lines, changed digits,
 * huge numbers, NaN/Inf text, CR-only line ends, a byte-order mark, NUL bytes), and a runner that feeds the
 * mutants to a reader and collects every outcome the readers promise never to produce: an error that is not a
 * Tauline error, a call taking over 2 s, or a non-finite number in an accepted result.
 *
 * Adding a reader is one `fuzzReader({...})` call (see readers.fuzz.test.ts). Fixtures are found by file-name
 * pattern under test/fixtures and packages/sdk/examples, so fixtures added later are fuzzed automatically.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { TaulineError } from '../../../src/errors.js';

export const REPOSITORY = fileURLToPath(new URL('../../../../../', import.meta.url));
const FIXTURE_ROOTS = ['test/fixtures', 'packages/sdk/examples'];

/** One fixture: its path relative to the repository and its text. */
export interface Fixture {
  readonly path: string;
  readonly text: string;
}

/** Every fixture file (recursively under the fixture roots) whose name matches `pattern`, sorted by path. */
export function fixturesMatching(pattern: RegExp): Fixture[] {
  const out: Fixture[] = [];
  for (const root of FIXTURE_ROOTS) {
    const base = join(REPOSITORY, root);
    for (const entry of readdirSync(base, { recursive: true, withFileTypes: true })) {
      if (!entry.isFile() || !pattern.test(entry.name)) continue;
      const full = join(entry.parentPath ?? (entry as unknown as { path: string }).path, entry.name);
      out.push({ path: relative(REPOSITORY, full), text: readFileSync(full, 'utf8') });
    }
  }
  return out.sort((a, b) => a.path.localeCompare(b.path));
}

/** Seeded generator (mulberry32, T. Ettinger 2017; public domain): same seed, same mutants. */
export class Random {
  private _state: number;
  constructor(seed: number) {
    this._state = seed >>> 0;
  }
  /** Uniform in [0, 1). */
  next(): number {
    let t = (this._state = (this._state + 0x6d2b79f5) >>> 0);
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }
  /** Integer in [0, n). */
  int(n: number): number {
    return Math.floor(this.next() * n);
  }
  pick<T>(items: readonly T[]): T {
    return items[this.int(items.length)]!;
  }
}

/** Characters a flipped byte becomes: format punctuation, digits, blanks, line ends and hostile characters. */
const FLIP_CHARACTERS = [
  ' ',
  '0',
  '1',
  '9',
  '.',
  '-',
  '+',
  'e',
  'E',
  'D',
  'G',
  'X',
  '*',
  '>',
  '#',
  ',',
  '\n',
  '\r',
  '\t',
  '\u0000',
  '\ufeff',
  '\ufffd',
  'é',
];
/** Replacements for a number token. */
const HOSTILE_NUMBERS = [
  '1e400',
  '-1e400',
  '9e307',
  '1e12',
  '-1e12',
  '999999999999',
  '4294967296',
  '0',
  '-0',
  '1e-400',
  '0.0000000000000000001',
  'NaN',
  'nan',
  'Inf',
  '-Inf',
  'Infinity',
  '-infinity',
  '1.#INF',
  '9999',
  '1D+999',
  '.',
  '-',
  '1e',
  '0x10',
];

type Mutator = (text: string, rng: Random) => string;

const lines = (text: string): string[] => text.split('\n');

/** The mutators by name (each returns a new text). */
export const MUTATORS: Readonly<Record<string, Mutator>> = {
  flipCharacter: (t, r) => {
    if (t.length === 0) return t;
    const at = r.int(t.length);
    return t.slice(0, at) + r.pick(FLIP_CHARACTERS) + t.slice(at + 1);
  },
  insertCharacters: (t, r) => {
    const at = r.int(t.length + 1);
    return t.slice(0, at) + Array.from({ length: 1 + r.int(3) }, () => r.pick(FLIP_CHARACTERS)).join('') + t.slice(at);
  },
  deleteCharacters: (t, r) => {
    const at = r.int(t.length + 1);
    return t.slice(0, at) + t.slice(at + 1 + r.int(8));
  },
  truncate: (t, r) => t.slice(0, r.int(t.length + 1)),
  duplicateLine: (t, r) => {
    const ls = lines(t);
    const i = r.int(ls.length);
    ls.splice(i, 0, ls[i]!);
    return ls.join('\n');
  },
  deleteLine: (t, r) => {
    const ls = lines(t);
    ls.splice(r.int(ls.length), 1 + r.int(2));
    return ls.join('\n');
  },
  swapLines: (t, r) => {
    const ls = lines(t);
    const i = r.int(ls.length);
    const j = r.int(ls.length);
    [ls[i], ls[j]] = [ls[j]!, ls[i]!];
    return ls.join('\n');
  },
  changeDigit: (t, r) => {
    const digits = [...t.matchAll(/\d/g)];
    if (digits.length === 0) return t;
    const at = r.pick(digits).index!;
    return t.slice(0, at) + String(r.int(10)) + t.slice(at + 1);
  },
  hostileNumber: (t, r) => {
    const numbers = [...t.matchAll(/[-+]?\d*\.?\d+(?:[eEdD][-+]?\d+)?/g)];
    if (numbers.length === 0) return t;
    const m = r.pick(numbers);
    const replacement = r.pick(HOSTILE_NUMBERS);
    // Half the time keep the field width (fixed-column formats), half the time not.
    const text =
      r.next() < 0.5
        ? replacement.padStart(m[0].length).slice(-Math.max(m[0].length, replacement.length))
        : replacement;
    return t.slice(0, m.index!) + text + t.slice(m.index! + m[0].length);
  },
  crOnlyLineEnds: (t) => t.replace(/\r?\n/g, '\r'),
  crlfLineEnds: (t) => t.replace(/\r?\n/g, '\r\n'),
  byteOrderMark: (t) => `\ufeff${t}`,
  loneCrInLine: (t, r) => {
    const ls = lines(t);
    const i = r.int(ls.length);
    const at = r.int(ls[i]!.length + 1);
    ls[i] = `${ls[i]!.slice(0, at)}\r${ls[i]!.slice(at)}`;
    return ls.join('\n');
  },
  blankLine: (t, r) => {
    const ls = lines(t);
    ls[r.int(ls.length)] = r.pick(['', ' ', '   \t']);
    return ls.join('\n');
  },
  padLine: (t, r) => {
    const ls = lines(t);
    const i = r.int(ls.length);
    ls[i] = ls[i]! + ' '.repeat(1 + r.int(100)) + r.pick(['', 'x', '0']);
    return ls.join('\n');
  },
};

const MUTATOR_NAMES = Object.keys(MUTATORS);

/** Inputs above this size are cut to a window (header kept) so that 10^4 mutants stay fast. */
const WINDOW_CHARACTERS = 6_000;

/**
 * A line-aligned window of a large fixture: its header (the lines up to and including the first line
 * matching `headerEnd`, when given and found) and a random run of the following lines.
 */
export function windowOf(text: string, rng: Random, headerEnd?: (line: string) => boolean): string {
  if (text.length <= WINDOW_CHARACTERS) return text;
  const ls = lines(text);
  let bodyStart = 0;
  if (headerEnd) {
    const end = ls.findIndex(headerEnd);
    if (end >= 0) bodyStart = end + 1;
  }
  const head = ls.slice(0, bodyStart);
  let size = head.join('\n').length;
  const start = bodyStart + rng.int(Math.max(1, ls.length - bodyStart - 20));
  const body: string[] = [];
  for (let i = start; i < ls.length && size < WINDOW_CHARACTERS; i++) {
    body.push(ls[i]!);
    size += ls[i]!.length + 1;
  }
  return `${[...head, ...body].join('\n')}\n`;
}

/** A reader under fuzzing. */
export interface ReaderUnderFuzz<T> {
  /** The reader's name in reports. */
  readonly name: string;
  /** Fixture file names it reads. */
  readonly fixtures: RegExp;
  /** The last header line (windows of large fixtures keep the header). */
  readonly headerEnd?: (line: string) => boolean;
  /** Reads a text. */
  readonly parse: (text: string) => T;
  /** Paths (dotted, `[]` for array items) where NaN is a documented value (a missing sample); ±Infinity is never allowed. */
  readonly nanAllowedAt?: readonly RegExp[];
  /** Further checks of an accepted result; throw to report it. */
  readonly check?: (result: T, input: string) => void;
}

/** Something a reader must never do, with what reproduces it. */
export interface FuzzFailure {
  readonly reader: string;
  readonly fixture: string;
  readonly run: number;
  readonly mutators: readonly string[];
  readonly problem: string;
  /** The start of the mutated input, for the report. */
  readonly inputHead: string;
}

/** Outcome counts and failures of a fuzz run. */
export interface FuzzReport {
  readonly runs: number;
  readonly accepted: number;
  readonly refused: number;
  readonly failures: readonly FuzzFailure[];
}

/** Longest time one call may take before it counts as a hang, in milliseconds (the requirement, not a speed target). */
export const HANG_MILLISECONDS = 2000;

/**
 * The first number in `value` (walked recursively: objects, arrays, typed arrays) that is ±Infinity, or
 * NaN outside `nanAllowedAt`; returns its path, or undefined when every number is finite.
 */
export function firstNonFinite(
  value: unknown,
  nanAllowedAt: readonly RegExp[] = [],
  path = '',
  seen = new Set<unknown>(),
): string | undefined {
  if (typeof value === 'number') {
    if (value === Infinity || value === -Infinity) return `${path} = ${value}`;
    if (value !== value && !nanAllowedAt.some((p) => p.test(path))) return `${path} = NaN`;
    return undefined;
  }
  if (typeof value !== 'object' || value === null || seen.has(value)) return undefined;
  seen.add(value);
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    const items = value as unknown as ArrayLike<number>;
    for (let i = 0; i < items.length; i++) {
      const bad = firstNonFinite(items[i], nanAllowedAt, `${path}[]`, seen);
      if (bad) return bad.replace('[]', `[${i}]`);
    }
    return undefined;
  }
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const bad = firstNonFinite(value[i], nanAllowedAt, `${path}[]`, seen);
      if (bad) return bad.replace(`${path}[]`, `${path}[${i}]`);
    }
    return undefined;
  }
  for (const [k, v] of Object.entries(value)) {
    const bad = firstNonFinite(v, nanAllowedAt, path === '' ? k : `${path}.${k}`, seen);
    if (bad) return bad;
  }
  return undefined;
}

/**
 * Runs one input through a reader and returns the problem, if any: an untyped error, a call over
 * {@link HANG_MILLISECONDS}, a non-finite number in the result or a failed `check`.
 */
export function probe<T>(
  reader: ReaderUnderFuzz<T>,
  input: string,
): { problem: string | undefined; accepted: boolean } {
  const started = performance.now();
  let result: T;
  try {
    result = reader.parse(input);
  } catch (error) {
    const elapsed = performance.now() - started;
    if (!(error instanceof TaulineError)) {
      return {
        problem: `untyped error ${error instanceof Error ? `${error.name}: ${error.message}` : String(error)}`,
        accepted: false,
      };
    }
    return {
      problem: elapsed > HANG_MILLISECONDS ? `refusal took ${Math.round(elapsed)} ms` : undefined,
      accepted: false,
    };
  }
  const elapsed = performance.now() - started;
  if (elapsed > HANG_MILLISECONDS) return { problem: `acceptance took ${Math.round(elapsed)} ms`, accepted: true };
  const bad = firstNonFinite(result, reader.nanAllowedAt);
  if (bad) return { problem: `accepted with a non-finite value: ${bad}`, accepted: true };
  try {
    reader.check?.(result, input);
  } catch (error) {
    return { problem: `accepted, but ${error instanceof Error ? error.message : String(error)}`, accepted: true };
  }
  return { problem: undefined, accepted: true };
}

/**
 * Feeds `runs` mutants of the reader's fixtures to it: each run picks a fixture (a window of a large one),
 * applies 1–3 random mutators, and probes the reader. Deterministic for a given seed.
 * @param known  Known failures to leave out of `failures` (each names a bug reported to the reader's owner):
 *   a predicate over the failure.
 */
export function fuzzReader<T>(
  reader: ReaderUnderFuzz<T>,
  seed: number,
  runs: number,
  known: (failure: FuzzFailure) => boolean = () => false,
): FuzzReport & { knownFailures: readonly FuzzFailure[] } {
  const fixtures = fixturesMatching(reader.fixtures);
  if (fixtures.length === 0) throw new Error(`no fixture matches ${reader.fixtures} for ${reader.name}`);
  const rng = new Random(seed);
  const failures: FuzzFailure[] = [];
  const knownFailures: FuzzFailure[] = [];
  let accepted = 0;
  let refused = 0;
  for (let run = 0; run < runs; run++) {
    const fixture = fixtures[run % fixtures.length]!;
    let text = windowOf(fixture.text, rng, reader.headerEnd);
    const applied: string[] = [];
    const count = 1 + rng.int(3);
    for (let k = 0; k < count; k++) {
      const name = rng.pick(MUTATOR_NAMES);
      applied.push(name);
      text = MUTATORS[name]!(text, rng);
    }
    const outcome = probe(reader, text);
    if (outcome.accepted) accepted++;
    else refused++;
    if (outcome.problem !== undefined) {
      const failure = {
        reader: reader.name,
        fixture: fixture.path,
        run,
        mutators: applied,
        problem: outcome.problem,
        inputHead: text.slice(0, 300),
      };
      (known(failure) ? knownFailures : failures).push(failure);
    }
  }
  return { runs, accepted, refused, failures, knownFailures };
}

/** The special inputs every reader must refuse with a typed error or accept with finite values: empty, BOM only, CR-only, over-long line, NUL. */
export function specialInputs(
  headerOf: (fixture: string) => string,
  fixtures: readonly Fixture[],
  maxLine: number,
): { name: string; text: string }[] {
  const first = fixtures[0]!.text;
  return [
    { name: 'empty', text: '' },
    { name: 'BOM only', text: '\ufeff' },
    { name: 'line ends only', text: '\n\n\r\n\r' },
    { name: 'header only', text: headerOf(first) },
    { name: 'BOM + whole fixture', text: `\ufeff${first}` },
    { name: 'CR-only line ends', text: first.replace(/\r?\n/g, '\r') },
    { name: 'over-long line', text: `${first.split('\n')[0]}\n${'9'.repeat(maxLine + 1)}\n` },
    { name: 'NUL bytes', text: '\u0000'.repeat(4096) },
    { name: 'invalid UTF-8 decoded', text: `${'\ufffd'.repeat(200)}\n` },
  ];
}
