/**
 * Doc tests: the examples in the READMEs run and print what the READMEs say.
 *
 * - Every ```ts block of the READMEs below whose imports are all `@tauline/sdk[/subpath]` (and
 *   `node:` built-ins) is written to `test/cross/.tmp/` and imported here, so vitest resolves
 *   `@tauline/sdk` to the TypeScript sources. A block that cannot run must sit under an
 *   `<!-- doctest: skip (reason) -->` line; any other block that fails to import fails the test.
 * - `// → expected` on a line states what it gives: for a statement with `console.log(...)` every
 *   line it prints (all iterations of a loop; a line holding only `// → ...` continues the stated
 *   output), for `const x = ...` the value of x, for any other expression statement its value.
 *   Every runnable block must state at least one result, and every stated line must run.
 * - Every ```text block whose first line starts with `$ tauline` is run through the BUILT binary
 *   (`node packages/cli/bin/tauline.js`; `npm test` builds first). Its output (stdout, then stderr)
 *   must contain the lines shown; a line that is only `...` elides any output. A following
 *   `$ echo $?` line checks the exit status.
 *
 * Comparison (stated in each README): whitespace runs, line breaks included, count as one space;
 * text must match exactly; a number matches when it differs from the one shown by at most half a
 * unit in the shown last digit (the README rounds, the program does not have to).
 */
import { execFile } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
/** Per-process folder, so that parallel runs never delete each other's files. */
const TMP = join(ROOT, 'test/cross/.tmp', String(process.pid));
const BIN = join(ROOT, 'packages/cli/bin/tauline.js');

/** The documents whose examples are checked. */
const DOCUMENTS = ['README.md', 'packages/sdk/README.md', 'packages/cli/README.md', 'packages/elements/README.md'];

// ---------------------------------------------------------------------------------------------
// Markdown blocks

interface Block {
  file: string;
  /** 1-based line of the opening fence. */
  line: number;
  lang: string;
  body: string[];
  /** Reason given in a preceding `<!-- doctest: skip (reason) -->`, if any. */
  skip: string | undefined;
}

function blocksOf(file: string): Block[] {
  const lines = readFileSync(join(ROOT, file), 'utf8').split(/\r?\n/);
  const blocks: Block[] = [];
  for (let i = 0; i < lines.length; i++) {
    const open = /^```(\S*)\s*$/.exec(lines[i]!);
    if (!open) continue;
    let j = i + 1;
    while (j < lines.length && !/^```\s*$/.test(lines[j]!)) j++;
    let k = i - 1;
    while (k >= 0 && lines[k]!.trim() === '') k--;
    const marker = k >= 0 ? /^<!--\s*doctest:\s*skip\b\s*(.*?)\s*-->$/.exec(lines[k]!.trim()) : null;
    blocks.push({
      file,
      line: i + 1,
      lang: open[1]!,
      body: lines.slice(i + 1, j),
      skip: marker ? marker[1] || 'skipped' : undefined,
    });
    i = j;
  }
  return blocks;
}

// ---------------------------------------------------------------------------------------------
// Comparison of shown and computed text

/** A number as shown: optional sign (ASCII or U+2212), digits, optional fraction and exponent. */
const NUMBER = /[+\-\u2212]?(?:\d+(?:\.\d+)?|\.\d+)(?:[eE][+\-\u2212]?\d+)?/g;

/** Half a unit in the last digit of a number as written, e.g. "4.4647e-10" → 5e-15. */
function halfUnit(text: string): number {
  const m = /^[+\-\u2212]?(\d*)(?:\.(\d+))?(?:[eE]([+\-\u2212]?\d+))?$/.exec(text);
  if (!m) return 0;
  const decimals = m[2]?.length ?? 0;
  const exponent = m[3] ? Number(m[3].replace('\u2212', '-')) : 0;
  return 0.5 * 10 ** (exponent - decimals);
}

function toNumber(text: string): number {
  return Number(text.replace(/\u2212/g, '-'));
}

type Token = { kind: 'text'; text: string } | { kind: 'number'; text: string; value: number };

/** Splits text into words and numbers; whitespace (line breaks included) only separates. */
function tokens(text: string): Token[] {
  const out: Token[] = [];
  for (const word of text.split(/\s+/).filter((w) => w !== '')) {
    let last = 0;
    for (const m of word.matchAll(NUMBER)) {
      if (m.index! > last) out.push({ kind: 'text', text: word.slice(last, m.index) });
      out.push({ kind: 'number', text: m[0], value: toNumber(m[0]) });
      last = m.index! + m[0].length;
    }
    if (last < word.length) out.push({ kind: 'text', text: word.slice(last) });
    out.push({ kind: 'text', text: ' ' });
  }
  return out;
}

function tokenMatches(shown: Token, actual: Token): boolean {
  if (shown.kind === 'text' || actual.kind === 'text') return shown.kind === actual.kind && shown.text === actual.text;
  if (shown.text === actual.text) return true;
  return Math.abs(actual.value - shown.value) <= halfUnit(shown.text) * (1 + 1e-9);
}

function matchAt(shown: Token[], actual: Token[], at: number): boolean {
  if (at + shown.length > actual.length) return false;
  return shown.every((t, k) => tokenMatches(t, actual[at + k]!));
}

/**
 * Whether `actual` shows `shown`: the shown text split at elision lines (`...` or `…` alone on a
 * line) into pieces that must appear in order; the first piece anchors at the start unless the
 * shown text starts with an elision, the last at the end unless it ends with one.
 * Returns undefined on success, else a description of the first piece not found.
 */
function explainMismatch(shown: string, actual: string): string | undefined {
  const lines = shown.split('\n');
  const pieces: string[][] = [[]];
  for (const line of lines) {
    if (/^\s*(\.\.\.|…)\s*$/.test(line)) pieces.push([]);
    else pieces[pieces.length - 1]!.push(line);
  }
  const actualTokens = tokens(actual);
  let at = 0;
  for (let p = 0; p < pieces.length; p++) {
    const piece = tokens(pieces[p]!.join('\n'));
    if (piece.length === 0) continue;
    const anchoredStart = p === 0;
    const anchoredEnd = p === pieces.length - 1;
    let found = -1;
    if (anchoredStart) {
      if (matchAt(piece, actualTokens, 0)) found = 0;
    } else if (anchoredEnd) {
      const s = actualTokens.length - piece.length;
      if (s >= at && matchAt(piece, actualTokens, s)) found = s;
    } else {
      for (let s = at; s + piece.length <= actualTokens.length && found < 0; s++)
        if (matchAt(piece, actualTokens, s)) found = s;
    }
    if (found < 0 || (anchoredEnd && found + piece.length !== actualTokens.length)) {
      return (
        `this part of the shown output was not found${anchoredStart ? ' at the start' : ''}${anchoredEnd ? ' at the end' : ''}:\n` +
        `${pieces[p]!.join('\n')}\n--- actual output ---\n${actual}`
      );
    }
    at = found + piece.length;
  }
  return undefined;
}

// ---------------------------------------------------------------------------------------------
// TypeScript blocks

interface Expectation {
  id: number;
  line: number;
  kind: 'print' | 'value';
  expected: string;
  source: string;
}
interface Outcome {
  printed?: string;
  value?: unknown;
  reached: boolean;
}
interface DoctestHost {
  console: { log: (...args: unknown[]) => void; info: (...args: unknown[]) => void };
  before(id: number): void;
  after(id: number): void;
  value(id: number, v: unknown): void;
}

const ANNOTATION = /^(\s*)(.*?)\s*\/\/\s*→\s*(.*?)\s*$/;
const IMPORT = /\bfrom\s+['"]([^'"]+)['"]|\bimport\s*\(?\s*['"]([^'"]+)['"]/g;

function importsOf(body: string[]): string[] {
  const found: string[] = [];
  for (const m of body.join('\n').matchAll(IMPORT)) found.push((m[1] ?? m[2])!);
  return found;
}

function runnableImport(specifier: string): boolean {
  return /^@tauline\/sdk(\/[a-z-]+)?$/.test(specifier) || specifier.startsWith('node:');
}

/** Rewrites the annotated lines of a block into calls of the doctest host (line count unchanged). */
function instrument(block: Block): { code: string; expectations: Expectation[] } {
  const expectations: Expectation[] = [];
  let previousAnnotated = -2;
  const out = block.body.map((text, k) => {
    const m = ANNOTATION.exec(text);
    if (!m) return text;
    const [, indent, statementWithSemicolon, expected] = m;
    const statement = statementWithSemicolon!.replace(/;\s*$/, '');
    if (statement === '') {
      // A line holding only `// → ...` continues the result stated on the line above.
      const last = expectations[expectations.length - 1];
      if (!last || previousAnnotated !== k - 1)
        throw new Error(`${block.file}:${block.line + 1 + k}: "// →" continuation without a stated line above`);
      last.expected += `\n${expected}`;
      previousAnnotated = k;
      return text;
    }
    previousAnnotated = k;
    const id = expectations.length;
    const line = block.line + 1 + k;
    if (/\bconsole\.(log|info)\(/.test(statement)) {
      expectations.push({ id, line, kind: 'print', expected: expected!, source: statement });
      return `${indent}__dt.before(${id}); ${statement}; __dt.after(${id});`;
    }
    const declaration = /^(const|let|var)\s+([A-Za-z_$][\w$]*)\s*(?::[^=]+)?=/.exec(statement);
    expectations.push({ id, line, kind: 'value', expected: expected!, source: statement });
    if (declaration) return `${indent}${statement}; __dt.value(${id}, ${declaration[2]});`;
    return `${indent}__dt.value(${id}, (${statement}));`;
  });
  const header =
    'const __dt = (globalThis as unknown as { __taulineDoctest: { console: Console; before(id: number): void; ' +
    'after(id: number): void; value(id: number, v: unknown): void } }).__taulineDoctest; const console = __dt.console;';
  return { code: `${header}\n${out.join('\n')}\n`, expectations };
}

/** Checks one `// →` value annotation; returns undefined when it holds. */
function checkValue(expected: string, value: unknown): string | undefined {
  const quoted = /^(['"])(.*)\1/.exec(expected);
  if (quoted)
    return String(value) === quoted[2] ? undefined : `expected the string ${quoted[0]}, got ${JSON.stringify(value)}`;
  const literal = /^(true|false|null|undefined)\b/.exec(expected);
  if (literal) return String(value) === literal[1] ? undefined : `expected ${literal[1]}, got ${String(value)}`;
  // A number, optionally with digit groups separated by (thin) spaces: "10 229 999.99543".
  const num =
    /^[+\-\u2212]?\d{1,3}(?:[ \u2009\u202f]\d{3})+(?:\.\d+)?(?:[eE][+\-\u2212]?\d+)?|^[+\-\u2212]?(?:\d+(?:\.\d+)?|\.\d+)(?:[eE][+\-\u2212]?\d+)?/.exec(
      expected,
    );
  if (num) {
    const shown = num[0].replace(/[ \u2009\u202f]/g, '');
    const v = typeof value === 'bigint' ? Number(value) : value;
    if (typeof v !== 'number') return `expected a number ${num[0]}, got ${typeof value} ${String(value)}`;
    const tol = halfUnit(shown) * (1 + 1e-9);
    return Math.abs(v - toNumber(shown)) <= tol
      ? undefined
      : `expected ${num[0]} (± ${tol.toExponential(1)}), got ${v}`;
  }
  return `unsupported annotation "→ ${expected}": start it with a number, a quoted string, true, false, null or undefined`;
}

async function runBlock(block: Block, index: number): Promise<string[]> {
  const { code, expectations } = instrument(block);
  const outcomes: Outcome[] = expectations.map(() => ({ reached: false }));
  const printed: string[] = [];
  let mark = 0;
  const log = (...args: unknown[]): void => {
    printed.push(
      args
        .map((a) => (typeof a === 'string' ? a : typeof a === 'object' && a !== null ? JSON.stringify(a) : String(a)))
        .join(' '),
    );
  };
  const host: DoctestHost = {
    console: { log, info: log },
    before: () => {
      mark = printed.length;
    },
    after: (id) => {
      const earlier = outcomes[id]!.printed;
      const now = printed.slice(mark).join('\n');
      outcomes[id] = { reached: true, printed: earlier === undefined ? now : `${earlier}\n${now}` };
    },
    value: (id, v) => {
      outcomes[id] = { reached: true, value: v };
    },
  };
  const name = `${block.file.replace(/[^A-Za-z0-9]+/g, '-')}-L${block.line}-${index}.ts`;
  const path = join(TMP, name);
  writeFileSync(path, code);
  (globalThis as Record<string, unknown>).__taulineDoctest = host;
  try {
    await import(pathToFileURL(path).href);
  } finally {
    delete (globalThis as Record<string, unknown>).__taulineDoctest;
  }
  const failures: string[] = [];
  if (expectations.length === 0)
    failures.push(`${block.file}:${block.line}: a runnable block states no result (add "// → ..." to a line)`);
  for (const e of expectations) {
    const o = outcomes[e.id]!;
    const where = `${block.file}:${e.line} (${e.source})`;
    if (!o.reached) {
      failures.push(`${where}: never ran`);
      continue;
    }
    const problem = e.kind === 'print' ? explainMismatch(e.expected, o.printed ?? '') : checkValue(e.expected, o.value);
    if (problem !== undefined) failures.push(`${where}: ${problem}`);
  }
  return failures;
}

// ---------------------------------------------------------------------------------------------
// CLI blocks

interface CliExample {
  block: Block;
  argv: string[];
  shown: string;
  exitStatus: number | undefined;
  line: number;
}

/** Splits a shell command line into words (single and double quotes; no expansion). */
function shellWords(command: string): string[] {
  const words: string[] = [];
  for (const m of command.matchAll(/"([^"]*)"|'([^']*)'|(\S+)/g)) words.push(m[1] ?? m[2] ?? m[3]!);
  return words;
}

function cliExamples(block: Block): CliExample[] {
  const examples: CliExample[] = [];
  let current: CliExample | undefined;
  block.body.forEach((text, k) => {
    const command = /^\$ (.*)$/.exec(text);
    if (command && /^echo \$\?\s*$/.test(command[1]!)) {
      if (!current) throw new Error(`${block.file}:${block.line + 1 + k}: "$ echo $?" without a command before it`);
      const status = block.body[k + 1]?.trim();
      current.exitStatus = Number(status);
      current = undefined;
      return;
    }
    if (command) {
      const words = shellWords(command[1]!);
      if (words[0] !== 'tauline')
        throw new Error(`${block.file}:${block.line + 1 + k}: only "$ tauline ..." commands are checked`);
      current = { block, argv: words.slice(1), shown: '', exitStatus: undefined, line: block.line + 1 + k };
      examples.push(current);
      return;
    }
    if (current) current.shown += `${text}\n`;
  });
  return examples;
}

interface CliRun {
  status: number;
  stdout: string;
  stderr: string;
}

function runCli(argv: string[]): Promise<CliRun> {
  return new Promise((resolve) => {
    execFile(
      process.execPath,
      [BIN, ...argv],
      { cwd: ROOT, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 },
      (error, stdout, stderr) => {
        const status = error ? (typeof error.code === 'number' ? error.code : 1) : 0;
        resolve({ status, stdout, stderr });
      },
    );
  });
}

/** Runs tasks with at most `limit` at a time (the machine is shared). */
function limited<T>(tasks: (() => Promise<T>)[], limit: number): Promise<T>[] {
  const results: Promise<T>[] = [];
  let running = 0;
  const queue: (() => void)[] = [];
  for (const task of tasks) {
    results.push(
      new Promise<T>((resolve, reject) => {
        const start = (): void => {
          running++;
          task()
            .then(resolve, reject)
            .finally(() => {
              running--;
              queue.shift()?.();
            });
        };
        if (running < limit) start();
        else queue.push(start);
      }),
    );
  }
  return results;
}

// ---------------------------------------------------------------------------------------------

const allBlocks = DOCUMENTS.filter((f) => existsSync(join(ROOT, f))).flatMap(blocksOf);
const tsBlocks = allBlocks.filter((b) => b.lang === 'ts' || b.lang === 'typescript');
const cliBlocks = allBlocks.filter((b) => b.lang === 'text' && /^\$ tauline\b/.test(b.body[0] ?? ''));
const examples = cliBlocks.flatMap(cliExamples);

describe('README TypeScript examples run against the SDK sources and give the stated values', () => {
  beforeAll(() => {
    rmSync(TMP, { recursive: true, force: true });
    mkdirSync(TMP, { recursive: true });
  });
  afterAll(() => {
    rmSync(TMP, { recursive: true, force: true });
  });

  it('the documents hold the expected runnable examples (SDK README: one per main job)', () => {
    expect(DOCUMENTS.every((f) => existsSync(join(ROOT, f)))).toBe(true);
    const runnable = tsBlocks.filter((b) => b.skip === undefined && b.file === 'packages/sdk/README.md');
    expect(runnable.length).toBeGreaterThanOrEqual(8);
  });

  it('packages/sdk/README.md lists every "exports" subpath of packages/sdk/package.json', () => {
    const manifest = JSON.parse(readFileSync(join(ROOT, 'packages/sdk/package.json'), 'utf8')) as {
      exports: Record<string, unknown>;
    };
    const readme = readFileSync(join(ROOT, 'packages/sdk/README.md'), 'utf8');
    const missing = Object.keys(manifest.exports)
      .map((k) => `\`@tauline/sdk${k.slice(1)}\``)
      .filter((name) => !readme.includes(`| ${name} |`));
    expect(missing).toEqual([]);
  });

  tsBlocks.forEach((block, index) => {
    const imports = importsOf(block.body);
    const foreign = imports.filter((s) => !runnableImport(s));
    const title = `${block.file}:${block.line} ${imports.length ? `(imports ${imports.join(', ')})` : ''}`;
    if (block.skip !== undefined) {
      it(`${title} is marked "doctest: skip ${block.skip}" and carries a reason`, () => {
        expect(block.skip).not.toBe('skipped');
      });
      return;
    }
    it(`${title} runs and every "// →" line holds`, async () => {
      expect(
        foreign,
        `imports other than @tauline/sdk and node: — mark the block <!-- doctest: skip (reason) -->`,
      ).toEqual([]);
      expect(await runBlock(block, index)).toEqual([]);
    });
  });
});

describe('README CLI examples through the built binary print the lines shown', () => {
  let runs: Promise<CliRun>[] = [];
  beforeAll(() => {
    if (!existsSync(join(ROOT, 'packages/cli/dist/main.js')))
      throw new Error('the CLI is not built: run `npm run build` first');
    runs = limited(
      examples.map((e) => () => runCli(e.argv)),
      4,
    );
  });

  it('the documents hold CLI examples (CLI README: one per command)', () => {
    const commands = new Set(examples.filter((e) => e.block.file === 'packages/cli/README.md').map((e) => e.argv[0]));
    for (const c of [
      'rate',
      'periodic',
      'propertime',
      'broadcast',
      'precise',
      'stability',
      'clock',
      'plan',
      'simulate',
      'review',
    ]) {
      expect(commands, `no example of tauline ${c} in packages/cli/README.md`).toContain(c);
    }
  });

  examples.forEach((example, index) => {
    it(`${example.block.file}:${example.line} $ tauline ${example.argv.join(' ')}`, async () => {
      const run = await runs[index]!;
      const output = `${run.stdout}${run.stdout.endsWith('\n') || run.stdout === '' ? '' : '\n'}${run.stderr}`;
      expect(explainMismatch(example.shown.replace(/\n+$/, ''), output)).toBeUndefined();
      if (example.exitStatus !== undefined) expect(run.status).toBe(example.exitStatus);
    });
  });
});
