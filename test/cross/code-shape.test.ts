/**
 * The shape of the sources, checked mechanically (DEVELOPERS.md, "Decision records": code shape).
 * Biome formats and lints (`npm test` runs `biome ci`; its function-length rule is a warning);
 * this test holds the limits that must not regress: no source file over 500 lines, no function
 * over 100 lines, and no more non-null (`x[i]!`) or `as number` casts than today.
 *
 * The lists of known exceptions only shrink: when you split a file or a function, remove it from
 * the list (the test says so); a new file or function over the limit fails.
 * Regenerate the numbers with `SHAPE_PRINT=1 npx vitest run test/cross/code-shape.test.ts`.
 */
import { readdirSync, readFileSync } from 'node:fs';
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
const MAX_NON_NULL_INDEX_CASTS = 239;
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
