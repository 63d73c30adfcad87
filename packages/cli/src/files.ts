/**
 * Reading input files for `tauline` commands: one place that turns the ways a file can be unusable
 * (missing, a directory, unreadable, empty, malformed JSON) into one clear line with exit status 2.
 */
import { readFile, stat } from 'node:fs/promises';
import { ParseError } from '@tauline/sdk/errors';
import { UsageError } from './framework.js';

/**
 * Offset of the first JSON syntax error in `text` (RFC 8259 grammar), or undefined when the
 * text is valid JSON. Independent of the engine's JSON.parse message, whose wording and
 * position report differ between Node versions.
 */
export function jsonErrorOffset(text: string): number | undefined {
  let i = 0;
  const ws = (): void => { while (i < text.length && ' \t\n\r'.includes(text[i]!)) i++; };
  const fail = (): never => { throw i; };
  const literal = (word: string): void => {
    for (const ch of word) {
      if (text[i] !== ch) fail();
      i++;
    }
  };
  const str = (): void => {
    i++;
    while (i < text.length && text[i] !== '"') {
      if (text.charCodeAt(i) < 0x20) fail();
      if (text[i] === '\\') {
        i++;
        const esc = text[i];
        if (esc === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 1, i + 5))) fail();
          i += 4;
        } else if (esc === undefined || !'"\\/bfnrt'.includes(esc)) fail();
      }
      i++;
    }
    if (i >= text.length) fail();
    i++;
  };
  const num = (): void => {
    const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(text.slice(i, i + 400));
    if (!m) fail();
    i += m![0].length;
  };
  const value = (): void => {
    ws();
    const c = text[i];
    if (c === '{') {
      i++; ws();
      if (text[i] === '}') { i++; return; }
      for (;;) {
        ws(); if (text[i] !== '"') fail(); str(); ws();
        if (text[i] !== ':') fail(); i++; value(); ws();
        if (text[i] === ',') { i++; continue; }
        if (text[i] === '}') { i++; return; }
        fail();
      }
    } else if (c === '[') {
      i++; ws();
      if (text[i] === ']') { i++; return; }
      for (;;) {
        value(); ws();
        if (text[i] === ',') { i++; continue; }
        if (text[i] === ']') { i++; return; }
        fail();
      }
    } else if (c === '"') str();
    else if (c === 't') literal('true');
    else if (c === 'f') literal('false');
    else if (c === 'n') literal('null');
    else num();
  };
  try {
    value(); ws();
    return i < text.length ? i : undefined;
  } catch (at) {
    return typeof at === 'number' ? at : undefined;
  }
}

/** 1-based line and column of a character offset in `text`. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  const before = text.slice(0, offset);
  const lastNewline = before.lastIndexOf('\n');
  return { line: before.split('\n').length, column: offset - lastNewline };
}

/**
 * Reads a file as UTF-8 text, refusing (as a one-line usage error) a path that is a directory
 * or not a regular file. A missing file keeps its ENOENT error (reported as "no such file").
 * @param path  The file path as the user typed it.
 * @param what  What the file should be, for the message (e.g. "a steering scenario (JSON)").
 */
export async function readTextFile(path: string, what: string): Promise<string> {
  await requireRegularFile(path, what);
  return readFile(path, 'utf8');
}

/**
 * Checks, before a file is streamed, that `path` names a regular file (or a named pipe such as
 * `/dev/stdin`, which streams well): a directory is a one-line usage error naming what was expected.
 * A missing file keeps its ENOENT error.
 */
export async function requireRegularFile(path: string, what: string): Promise<void> {
  const info = await stat(path);
  if (info.isDirectory()) throw new UsageError(`${JSON.stringify(path)} is a directory; expected ${what}`);
  if (!info.isFile() && !info.isFIFO() && !info.isCharacterDevice()) throw new UsageError(`${JSON.stringify(path)} is not a regular file; expected ${what}`);
}

/**
 * Reads and parses a JSON file. An empty file or a syntax error becomes a ParseError naming the
 * file, line and column of the first error and the text found there.
 * @param path  The file path.
 * @param what  What the document should be, e.g. "a steering scenario" (used in messages).
 * @throws {ParseError} for an empty file or malformed JSON.
 * @throws {UsageError} for a directory or non-regular file.
 */
export async function readJsonFile(path: string, what = 'a JSON document'): Promise<unknown> {
  const text = await readTextFile(path, `${what} (JSON)`);
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') throw new ParseError(path, 1, 1, `${what} (JSON)`, 'an empty file');
  try {
    return JSON.parse(body) as unknown;
  } catch (error) {
    const offset = jsonErrorOffset(body)
      ?? (/position (\d+)/.exec(error instanceof Error ? error.message : '') ? Number(/position (\d+)/.exec((error as Error).message)![1]) : 0);
    const { line, column } = lineColumn(body, offset);
    const found = offset >= body.length ? 'the end of the file (truncated?)' : body.slice(offset, offset + 24).split(/\r?\n/)[0]!;
    throw new ParseError(path, line, column, `valid JSON (${what})`, found);
  }
}
