/**
 * The shape of the sources, checked mechanically (DEVELOPERS.md, "Decision records": code shape).
 * Biome formats and lints (`npm test` runs `biome ci`; its function-length rule is a warning);
 * this test holds the limits that must not regress: no source file over 500 lines, no function
 * over 100 lines, and no more non-null (`x[i]!`) or `as number` casts than today.
 *
 * The lists of known exceptions only shrink: when you split a file or a function, remove it from
 * the list (the test says so); a new file or function over the limit fails.
 * Regenerate the numbers with `SHAPE_PRINT=1 npx vitest run test/cross/code-shape.test.ts`.
 *
 * It also holds the test layout (ADR 9, "test folders mirror src/"): every folder under packages/<pkg>/test names a
 * folder (or a `.ts` file) of packages/<pkg>/src at the same path, and every file directly in packages/<pkg>/test is
 * `<module>.test.ts` for a `src/<module>.ts`, except the cross-module suites and shared helpers listed below.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const SOURCE_ROOTS = ['packages/sdk/src', 'packages/cli/src', 'packages/elements/src'];
const MAX_FILE_LINES = 500;
const MAX_FUNCTION_LINES = 100;

/** Files over MAX_FILE_LINES today, with their line counts (may only shrink). */
const LONG_FILES: Readonly<Record<string, number>> = {};
/** Functions over MAX_FUNCTION_LINES today, as `file:name` with their line counts (may only shrink). */
const LONG_FUNCTIONS: Readonly<Record<string, number>> = {};
/** Casts counted over every source file (may only fall). */
const MAX_NON_NULL_INDEX_CASTS = 233;
const MAX_AS_NUMBER_CASTS = 0;

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true })
    .flatMap((e) =>
      e.isDirectory() ? sourceFiles(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : [],
    )
    .sort();
}

interface FileShape {
  readonly file: string;
  readonly lines: number;
  readonly text: string;
}

function shapes(): FileShape[] {
  return SOURCE_ROOTS.flatMap((root) => sourceFiles(join(ROOT, root))).map((path) => {
    const text = readFileSync(path, 'utf8');
    return { file: relative(ROOT, path).split('\\').join('/'), lines: text.split('\n').length - 1, text };
  });
}

function functionName(node: ts.SignatureDeclaration): string {
  if (node.name !== undefined) return node.name.getText();
  const parent = node.parent;
  if (ts.isVariableDeclaration(parent) || ts.isPropertyAssignment(parent) || ts.isPropertyDeclaration(parent)) {
    return parent.name.getText();
  }
  return '(anonymous)';
}

/** Every function-like node with a body longer than the limit, first line to last line inclusive. */
function longFunctions(shape: FileShape): Map<string, number> {
  const source = ts.createSourceFile(shape.file, shape.text, ts.ScriptTarget.Latest, true);
  const found = new Map<string, number>();
  const visit = (node: ts.Node): void => {
    if (ts.isFunctionLike(node) && 'body' in node && node.body !== undefined) {
      const first = source.getLineAndCharacterOfPosition(node.getStart()).line;
      const last = source.getLineAndCharacterOfPosition(node.end).line;
      const lines = last - first + 1;
      if (lines > MAX_FUNCTION_LINES) {
        const key = `${shape.file}:${functionName(node)}`;
        found.set(key, Math.max(found.get(key) ?? 0, lines));
      }
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return found;
}

const count = (text: string, pattern: RegExp): number => text.match(pattern)?.length ?? 0;
const NON_NULL_INDEX = /\]!/g;
const AS_NUMBER = /\bas number\b/g;

describe('code shape (packages/*/src)', () => {
  const all = shapes();

  it('no source file is over 500 lines, except the listed ones, which do not grow', () => {
    const long = Object.fromEntries(all.filter((s) => s.lines > MAX_FILE_LINES).map((s) => [s.file, s.lines]));
    if (process.env.SHAPE_PRINT) process.stdout.write(`LONG_FILES = ${JSON.stringify(long, null, 2)}\n`);
    for (const [file, lines] of Object.entries(long)) {
      expect(lines, `${file} has ${lines} lines (limit ${MAX_FILE_LINES}): split it`).toBeLessThanOrEqual(
        LONG_FILES[file] ?? MAX_FILE_LINES,
      );
    }
    for (const file of Object.keys(LONG_FILES)) {
      expect(long[file], `${file} is now under ${MAX_FILE_LINES} lines: remove it from LONG_FILES`).toBeDefined();
    }
  });

  it('no function is over 100 lines, except the listed ones, which do not grow', () => {
    const long: Record<string, number> = {};
    for (const shape of all) for (const [key, lines] of longFunctions(shape)) long[key] = lines;
    if (process.env.SHAPE_PRINT) process.stdout.write(`LONG_FUNCTIONS = ${JSON.stringify(long, null, 2)}\n`);
    for (const [key, lines] of Object.entries(long)) {
      expect(lines, `${key} has ${lines} lines (limit ${MAX_FUNCTION_LINES}): split it`).toBeLessThanOrEqual(
        LONG_FUNCTIONS[key] ?? MAX_FUNCTION_LINES,
      );
    }
    for (const key of Object.keys(LONG_FUNCTIONS)) {
      expect(long[key], `${key} is now under ${MAX_FUNCTION_LINES} lines: remove it from LONG_FUNCTIONS`).toBeDefined();
    }
  });

  it('the number of `]!` and `as number` casts does not grow', () => {
    const nonNull = all.reduce((n, s) => n + count(s.text, NON_NULL_INDEX), 0);
    const asNumber = all.reduce((n, s) => n + count(s.text, AS_NUMBER), 0);
    if (process.env.SHAPE_PRINT) process.stdout.write(`casts: ${nonNull} ]!, ${asNumber} as number\n`);
    expect(nonNull, 'x[i]! casts: prefer for-of, destructuring, tuples or a checked read').toBeLessThanOrEqual(
      MAX_NON_NULL_INDEX_CASTS,
    );
    expect(asNumber, '`as number` hides an undefined: use a checked read').toBeLessThanOrEqual(MAX_AS_NUMBER_CASTS);
  });
});

const PACKAGES = ['sdk', 'cli', 'elements'];

/** Test folders with no src/ counterpart, and why (may only shrink; a folder under a listed one is covered by it). */
const TEST_FOLDERS_WITHOUT_SOURCE: Readonly<Record<string, string>> = {
  'packages/sdk/test/property': 'cross-module public-API properties and schema agreement (ADR 9, ADR 10)',
  'packages/sdk/test/io/fuzz': 'the seeded fuzz harness run over every reader of src/io/ and its fixtures',
};

/** Files directly in a package's test/ that name no src/ module: cross-module suites and shared helpers. */
const ROOT_TEST_FILES_WITHOUT_SOURCE: Readonly<Record<string, string>> = {
  'packages/cli/test/binary.test.ts': 'commands through the built binary',
  'packages/cli/test/hardening.test.ts': 'bad input across every command',
  'packages/cli/test/hostile-input.test.ts': 'hostile files across every command that reads one',
  'packages/cli/test/terminal.test.ts': "every command's default output at 100 columns",
  'packages/cli/test/run.ts': 'shared helper: the in-process runner of the CLI tests',
  'packages/elements/test/embedding.test.ts': 'the README embedding examples, every element, from a static server',
  'packages/elements/test/fixtures.ts': 'shared helper: element fixtures built by calling the SDK on its examples',
};

/** Every folder under `dir` that holds a file somewhere below it (git keeps no empty folder), relative to ROOT. */
function folders(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true })
    .filter((e) => e.isDirectory())
    .flatMap((e) => {
      const path = join(dir, e.name);
      const below = folders(path);
      const holdsFile = readdirSync(path, { withFileTypes: true }).some((f) => f.isFile());
      return holdsFile || below.length > 0 ? [relative(ROOT, path).split('\\').join('/'), ...below] : [];
    });
}

describe('test layout (packages/*/test mirrors packages/*/src, ADR 9)', () => {
  const isDirectory = (path: string) => existsSync(join(ROOT, path)) && statSync(join(ROOT, path)).isDirectory();
  const isFile = (path: string) => existsSync(join(ROOT, path)) && statSync(join(ROOT, path)).isFile();

  it('every folder under packages/<pkg>/test names a folder or file of packages/<pkg>/src, except the listed ones', () => {
    const strays: string[] = [];
    for (const pkg of PACKAGES) {
      const test = `packages/${pkg}/test`;
      for (const folder of folders(join(ROOT, test))) {
        const listed = Object.keys(TEST_FOLDERS_WITHOUT_SOURCE).some((f) => folder === f || folder.startsWith(`${f}/`));
        const source = `packages/${pkg}/src${folder.slice(test.length)}`;
        if (!listed && !isDirectory(source) && !isFile(`${source}.ts`)) strays.push(`${folder} (no ${source}/)`);
      }
    }
    expect(strays, 'move these tests under the folder of the src/ module they test').toEqual([]);
    for (const folder of Object.keys(TEST_FOLDERS_WITHOUT_SOURCE)) {
      expect(isDirectory(folder), `${folder} is gone: remove it from TEST_FOLDERS_WITHOUT_SOURCE`).toBe(true);
    }
  });

  it('every file directly in packages/<pkg>/test is <module>.test.ts for a src/<module>.ts, except the listed cross-module suites and helpers', () => {
    const strays: string[] = [];
    for (const pkg of PACKAGES) {
      const test = join(ROOT, `packages/${pkg}/test`);
      for (const entry of readdirSync(test, { withFileTypes: true })) {
        if (!entry.isFile()) continue;
        const file = `packages/${pkg}/test/${entry.name}`;
        const module = /^(.+)\.test\.ts$/.exec(entry.name)?.[1];
        const named = module !== undefined && isFile(`packages/${pkg}/src/${module}.ts`);
        if (!named && ROOT_TEST_FILES_WITHOUT_SOURCE[file] === undefined) strays.push(file);
      }
    }
    expect(strays, 'move these under test/<module>/ (mirroring src/), or list a cross-module suite').toEqual([]);
    for (const file of Object.keys(ROOT_TEST_FILES_WITHOUT_SOURCE)) {
      expect(isFile(file), `${file} is gone: remove it from ROOT_TEST_FILES_WITHOUT_SOURCE`).toBe(true);
    }
  });
});
