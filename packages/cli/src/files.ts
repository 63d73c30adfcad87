/**
 * Reading input files for `tauline` commands: one place that turns the ways a file can be unusable
 * (missing, a directory, a pipe or device, binary, too large, unreadable, empty, malformed JSON) into
 * one clear line with exit status 2. `-` names standard input wherever a file is read.
 */
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { ParseError } from '@tauline/sdk/errors';
import { UsageError } from './framework.js';

/**
 * Offset of the first JSON syntax error in `text` (RFC 8259 grammar), or undefined when the
 * text is valid JSON. Independent of the engine's JSON.parse message, whose wording and
 * position report differ between Node versions.
 */
export function jsonErrorOffset(text: string): number | undefined {
  const scan = new JsonScanner(text);
  try {
    scan.value();
    scan.ws();
    return scan.i < text.length ? scan.i : undefined;
  } catch (at) {
    return typeof at === 'number' ? at : undefined;
  }
}

/** A recursive-descent pass over RFC 8259 JSON that throws the offset of the first syntax error. */
class JsonScanner {
  i = 0;
  constructor(private readonly text: string) {}

  ws(): void {
    while (this.i < this.text.length && ' \t\n\r'.includes(this.text.charAt(this.i))) this.i++;
  }

  fail(): never {
    throw this.i;
  }

  literal(word: string): void {
    for (const ch of word) {
      if (this.text[this.i] !== ch) this.fail();
      this.i++;
    }
  }

  str(): void {
    const text = this.text;
    this.i++;
    while (this.i < text.length && text[this.i] !== '"') {
      if (text.charCodeAt(this.i) < 0x20) this.fail();
      if (text[this.i] === '\\') {
        this.i++;
        const esc = text[this.i];
        if (esc === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(this.i + 1, this.i + 5))) this.fail();
          this.i += 4;
        } else if (esc === undefined || !'"\\/bfnrt'.includes(esc)) this.fail();
      }
      this.i++;
    }
    if (this.i >= text.length) this.fail();
    this.i++;
  }

  num(): void {
    const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(this.text.slice(this.i, this.i + 400));
    if (!m) this.fail();
    this.i += m[0].length;
  }

  /** The members of an object or the elements of an array, from its opening bracket to its closing one. */
  container(close: '}' | ']'): void {
    this.i++;
    this.ws();
    if (this.text[this.i] === close) {
      this.i++;
      return;
    }
    for (;;) {
      if (close === '}') {
        this.ws();
        if (this.text[this.i] !== '"') this.fail();
        this.str();
        this.ws();
        if (this.text[this.i] !== ':') this.fail();
        this.i++;
      }
      this.value();
      this.ws();
      if (this.text[this.i] === ',') {
        this.i++;
        continue;
      }
      if (this.text[this.i] === close) {
        this.i++;
        return;
      }
      this.fail();
    }
  }

  value(): void {
    this.ws();
    const c = this.text[this.i];
    if (c === '{') this.container('}');
    else if (c === '[') this.container(']');
    else if (c === '"') this.str();
    else if (c === 't') this.literal('true');
    else if (c === 'f') this.literal('false');
    else if (c === 'n') this.literal('null');
    else this.num();
  }
}

/** 1-based line and column of a character offset in `text`. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  const before = text.slice(0, offset);
  const lastNewline = before.lastIndexOf('\n');
  return { line: before.split('\n').length, column: offset - lastNewline };
}

/** The file name that means standard input wherever a command reads a file. */
export const STANDARD_INPUT = '-';

/**
 * Largest document read whole into memory (a JSON scenario or review file, a leap-seconds list), in bytes.
 * A design choice (common practice, no source): the largest real document is a few hundred kB.
 */
export const MAX_DOCUMENT_BYTES = 64 * 1024 * 1024;

/**
 * Largest clock-record file (phase or frequency text, RINEX clock), in bytes: every record is held in
 * memory (a RINEX clock record costs about 4× its text), so the limit keeps a run within a few hundred MB.
 * A day of 30-s RINEX clock data for a whole constellation is well below it. Design choice, no source.
 */
export const MAX_RECORD_BYTES = 128 * 1024 * 1024;

/**
 * Largest RINEX navigation file, in bytes. The reader streams, but the records inside the requested window
 * are kept (about 2 kB of memory each); a month of daily merged multi-system files is about 300 MB.
 * Design choice, no source.
 */
export const MAX_NAVIGATION_BYTES = 512 * 1024 * 1024;

/** Bytes read from a file at a time. */
const CHUNK_BYTES = 256 * 1024;

let standardInput: () => AsyncIterable<Uint8Array | string> = () => process.stdin;

/**
 * Sets what `-` reads (the binary: process.stdin; tests: an in-memory stream). Returns the previous source.
 * @internal used by `main`
 */
export function setStandardInput(
  source: () => AsyncIterable<Uint8Array | string>,
): () => AsyncIterable<Uint8Array | string> {
  const previous = standardInput;
  standardInput = source;
  return previous;
}

/** How a path is named in messages: `standard input` for `-`, otherwise the path quoted. */
export function displayName(path: string): string {
  return path === STANDARD_INPUT ? 'standard input' : JSON.stringify(path);
}

/** The size of `n` bytes in MiB, for messages. */
function mib(n: number): string {
  return `${Math.round(n / 1048576)} MiB`;
}

/**
 * Checks that `path` names a regular file (or is `-`, standard input) before it is read. A directory,
 * a named pipe (FIFO: reading one may wait forever for a writer), a device (`/dev/zero`,
 * `/dev/urandom`: endless) or a socket is a one-line usage error naming what was expected.
 * A missing file keeps its ENOENT error (reported as "no such file").
 * @param maxBytes  When given, a larger regular file is refused up front, naming the limit.
 */
export async function requireRegularFile(path: string, what: string, maxBytes?: number): Promise<void> {
  if (path === STANDARD_INPUT) return;
  const info = await stat(path);
  const name = displayName(path);
  if (info.isDirectory()) throw new UsageError(`${name} is a directory; expected ${what}`);
  if (info.isFIFO())
    throw new UsageError(
      `${name} is a named pipe (FIFO), not a regular file; expected ${what} (give - to read standard input)`,
    );
  if (info.isCharacterDevice() || info.isBlockDevice())
    throw new UsageError(`${name} is a device, not a regular file; expected ${what}`);
  if (!info.isFile()) throw new UsageError(`${name} is not a regular file; expected ${what}`);
  if (maxBytes !== undefined && info.size > maxBytes) {
    throw new UsageError(`${name} is ${info.size} bytes, more than the ${mib(maxBytes)} limit for ${what}`);
  }
}

/** Options of {@link textChunks}. */
export interface TextChunkOptions {
  /** Refuse input longer than this many bytes (checked up front for a regular file, while reading otherwise). */
  readonly maxBytes?: number;
  /** Called with each chunk's size in bytes (progress bars). */
  readonly onChunk?: (bytes: number) => void;
}

/**
 * Streams a file (or standard input for `-`) as UTF-8 text chunks, after {@link requireRegularFile}.
 * Binary input is refused at its first NUL byte (a sparse or binary file, `/dev/zero` piped in), and
 * input beyond `maxBytes` as soon as it is passed, so memory stays bounded by one chunk.
 * Invalid UTF-8 becomes U+FFFD, which the readers then refuse with a line and column.
 * @param what  What the file should be, for messages (e.g. "an SP3 file").
 * @throws {UsageError} for a directory, pipe, device, NUL byte or an input over `maxBytes`.
 */
export async function* textChunks(path: string, what: string, options: TextChunkOptions = {}): AsyncGenerator<string> {
  const { maxBytes, onChunk } = options;
  await requireRegularFile(path, what, maxBytes);
  const source = path === STANDARD_INPUT ? standardInput() : createReadStream(path, { highWaterMark: CHUNK_BYTES });
  const decoder = new TextDecoder('utf-8', { ignoreBOM: true });
  let total = 0;
  for await (const chunk of source) {
    const bytes = typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : chunk;
    const nul = bytes.indexOf(0);
    if (nul >= 0) {
      throw new UsageError(
        `${displayName(path)} is not a text file (a NUL byte at byte ${total + nul + 1}); expected ${what}`,
      );
    }
    total += bytes.length;
    if (maxBytes !== undefined && total > maxBytes) {
      throw new UsageError(`${displayName(path)} is longer than the ${mib(maxBytes)} limit for ${what}`);
    }
    onChunk?.(bytes.length);
    const text = decoder.decode(bytes, { stream: true });
    if (text !== '') yield text;
  }
  const rest = decoder.decode();
  if (rest !== '') yield rest;
}

/**
 * Reads a whole file (or standard input for `-`) as UTF-8 text, refusing a directory, pipe, device,
 * binary content or more than {@link MAX_DOCUMENT_BYTES} (see {@link textChunks}).
 * A missing file keeps its ENOENT error (reported as "no such file").
 * @param path  The file path as the user typed it, or `-`.
 * @param what  What the file should be, for the message (e.g. "a steering scenario (JSON)").
 */
export async function readTextFile(path: string, what: string): Promise<string> {
  const parts: string[] = [];
  for await (const chunk of textChunks(path, what, { maxBytes: MAX_DOCUMENT_BYTES })) parts.push(chunk);
  return parts.join('');
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
  if (body.trim() === '') throw new ParseError(sourceLabel(path), 1, 1, `${what} (JSON)`, 'an empty file');
  try {
    return JSON.parse(body) as unknown;
  } catch (error) {
    const enginePosition = /position (\d+)/.exec(error instanceof Error ? error.message : '')?.[1];
    const offset = jsonErrorOffset(body) ?? (enginePosition !== undefined ? Number(enginePosition) : 0);
    const { line, column } = lineColumn(body, offset);
    const found =
      offset >= body.length
        ? 'the end of the file (truncated?)'
        : (body.slice(offset, offset + 24).split(/\r?\n/, 1)[0] ?? '');
    throw new ParseError(sourceLabel(path), line, column, `valid JSON (${what})`, found);
  }
}

/** The source name given to the readers: the path, or `stdin` for `-`. */
export function sourceLabel(path: string): string {
  return path === STANDARD_INPUT ? 'stdin' : path;
}
