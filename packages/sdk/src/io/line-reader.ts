/**
 * Streaming line splitter shared by the text-format readers. Input is a whole string, an
 * iterable of string chunks, or an async iterable of string chunks (e.g. a decoded file
 * stream opened by the caller); output is one line at a time with its 1-based number, so
 * memory stays bounded by the longest line, not by the file.
 *
 * Line ends: LF, CR LF and a lone CR (old Mac style) each end one line; a CR LF split across two
 * chunks is still one line end. A final line without a line end is still delivered. Line numbers
 * count every line, blank ones too. A byte-order mark (U+FEFF) at the very start is dropped.
 * A line longer than {@link MAX_LINE_CHARACTERS} is refused with a ParseError as soon as the limit
 * is passed, so an endless line (`/dev/zero`, a file without line ends) costs at most the limit in memory.
 *
 * @module
 */
import { InvalidArgumentError, ParseError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requireOptions, requireSourceName } from '../internal/validate.js';
import { daysInMonth } from '../time/calendar.js';
import { MAX_LINE_CHARACTERS } from './limits.js';

/** One line of text without its line terminator. */
export interface TextLine {
  /** The line's characters, without CR/LF. */
  readonly text: string;
  /** 1-based line number in the source. */
  readonly lineNumber: number;
}

/** Text input accepted by the readers: a whole string, or string chunks (sync or async). */
export type TextSource = string | Iterable<string> | AsyncIterable<string>;

/** Options of {@link LineSplitter} and the line iterators. */
export interface LineSplitterOptions {
  /** Name used in error messages (file name). Default `text`. */
  readonly sourceName?: string;
  /** Longest line accepted, in characters: an integer in [1, {@link MAX_LINE_CHARACTERS}] (the default). */
  readonly maxLineCharacters?: number;
}

function isAsyncIterable(value: unknown): value is AsyncIterable<string> {
  return typeof value === 'object' && value !== null && Symbol.asyncIterator in value;
}

const LF = 10;

/**
 * Splits chunked text into lines without holding more than one partial line in memory.
 * Use `push(chunk)` for each chunk and `finish()` at the end; both return the lines completed.
 */
export class LineSplitter {
  /** Pieces of the line not yet ended, kept apart so that a long line fed in many chunks is joined once (linear time). */
  private _pending: string[] = [];
  /** Characters held in `_pending`. */
  private _pendingLength = 0;
  private _lineNumber = 0;
  /** The previous chunk ended with a CR: an LF at the start of the next one belongs to it. */
  private _afterCr = false;
  /** Nothing has been read yet (a leading byte-order mark is dropped). */
  private _atStart = true;
  private readonly _sourceName: string;
  private readonly _max: number;

  constructor(options: LineSplitterOptions = {}) {
    requireOptions('options', options);
    this._sourceName =
      options.sourceName === undefined ? 'text' : requireSourceName('options.sourceName', options.sourceName);
    const max = options.maxLineCharacters ?? MAX_LINE_CHARACTERS;
    if (!Number.isInteger(max) || max < 1 || max > MAX_LINE_CHARACTERS) {
      throw new InvalidArgumentError(
        'maxLineCharacters',
        max,
        `an integer number of characters in [1, ${MAX_LINE_CHARACTERS}] (MAX_LINE_CHARACTERS)`,
      );
    }
    this._max = max;
  }

  /** Refuses the line being read: it has passed the limit. */
  private _tooLong(sample: string): never {
    throw new ParseError(
      this._sourceName,
      this._lineNumber + 1,
      this._max + 1,
      `a line of at most ${this._max} characters (the readers' line limit, MAX_LINE_CHARACTERS; is this a text file of the expected format?)`,
      sample.slice(0, 40),
    );
  }

  /** Feeds one chunk; returns the lines it completed. */
  push(chunk: string): TextLine[] {
    if (typeof chunk !== 'string') throw new InvalidArgumentError('chunk', chunk, 'a string of text');
    const lines: TextLine[] = [];
    let start = 0;
    if (this._atStart && chunk.length > 0) {
      this._atStart = false;
      if (chunk.charCodeAt(0) === 0xfeff) start = 1;
    }
    if (this._afterCr && start < chunk.length) {
      this._afterCr = false;
      if (chunk.charCodeAt(start) === LF) start++;
    }
    let nl = chunk.indexOf('\n', start);
    let cr = chunk.indexOf('\r', start);
    while (nl >= 0 || cr >= 0) {
      const end = nl < 0 ? cr : cr < 0 ? nl : Math.min(nl, cr);
      let text = chunk.slice(start, end);
      if (this._pending.length > 0) {
        if (this._pendingLength + text.length > this._max) this._tooLong(at(this._pending, 0, 'pending'));
        text = this._pending.join('') + text;
        this._pending = [];
        this._pendingLength = 0;
      } else if (text.length > this._max) this._tooLong(text);
      lines.push({ text, lineNumber: ++this._lineNumber });
      start = end + 1;
      if (end === cr) {
        // CR LF is one line end; a CR at the end of the chunk may have its LF in the next chunk.
        if (start < chunk.length) {
          if (chunk.charCodeAt(start) === LF) start++;
        } else this._afterCr = true;
      }
      if (nl >= 0 && nl < start) nl = chunk.indexOf('\n', start);
      if (cr >= 0 && cr < start) cr = chunk.indexOf('\r', start);
    }
    if (start < chunk.length) {
      const rest = start === 0 ? chunk : chunk.slice(start);
      if (this._pendingLength + rest.length > this._max) this._tooLong(this._pending[0] ?? rest);
      this._pending.push(rest);
      this._pendingLength += rest.length;
    }
    return lines;
  }

  /** Ends the input; returns the last line when the text did not end with a line end. */
  finish(): TextLine[] {
    const text = this._pending.join('');
    this._pending = [];
    this._pendingLength = 0;
    if (text === '') return [];
    return [{ text, lineNumber: ++this._lineNumber }];
  }

  /** Number of lines delivered so far. */
  get lineCount(): number {
    return this._lineNumber;
  }
}

/**
 * Characters of a whole-string source handed to the splitter at a time, so that only one piece's
 * lines exist as objects at once (splitting a 40 MB string in one go would create every line first).
 */
const STRING_PIECE = 65_536;

/** The chunks of a sync source: a whole string cut into {@link STRING_PIECE} pieces, or the iterable's chunks. */
function* piecesOf(source: string | Iterable<string>): Generator<string> {
  if (typeof source === 'string') {
    for (let i = 0; i < source.length; i += STRING_PIECE) yield source.slice(i, i + STRING_PIECE);
  } else {
    if (
      typeof source !== 'object' ||
      source === null ||
      typeof (source as Partial<Iterable<string>>)[Symbol.iterator] !== 'function'
    ) {
      throw new InvalidArgumentError('source', source, 'a string or an iterable of text chunks');
    }
    for (const chunk of source) yield chunkText(chunk);
  }
}

/** Throws unless `line` is a {@link TextLine} (the parsers' push methods take lines from this module's splitter). */
export function requireTextLine(line: unknown): TextLine {
  const l = line as Partial<TextLine> | null;
  if (
    typeof l !== 'object' ||
    l === null ||
    typeof l.text !== 'string' ||
    typeof l.lineNumber !== 'number' ||
    !Number.isSafeInteger(l.lineNumber) ||
    l.lineNumber < 1
  ) {
    throw new InvalidArgumentError('line', line, 'a line { text, lineNumber ≥ 1 } as linesOf/readLines yield');
  }
  return l as TextLine;
}

/** A chunk as text; a value that cannot be turned into text is refused (typed), never a TypeError. */
function chunkText(chunk: unknown): string {
  if (typeof chunk === 'string') return chunk;
  try {
    return String(chunk);
  } catch {
    throw new InvalidArgumentError('source chunk', chunk, 'text');
  }
}

/**
 * Iterates the lines of a text source, synchronously. Accepts a string or a sync iterable of chunks.
 * @param options  `sourceName` for the over-long-line error, and the line limit.
 * @throws {ParseError} for a line longer than the limit ({@link MAX_LINE_CHARACTERS} by default).
 */
export function* linesOf(source: string | Iterable<string>, options: LineSplitterOptions = {}): Generator<TextLine> {
  const splitter = new LineSplitter(options);
  for (const piece of piecesOf(source)) yield* splitter.push(piece);
  yield* splitter.finish();
}

/**
 * Iterates the lines of any text source as batches: the lines completed by each chunk (empty batches
 * are not yielded). Readers loop over a batch synchronously, so a streamed file costs one asynchronous
 * step per chunk rather than one per line (about twice the throughput of {@link readLines} on a day
 * of 30-s SP3, `npm run bench -- io`). A whole string is cut into 64 Ki-character pieces.
 *
 * @param source  A string, or a sync or async iterable of string chunks.
 * @param options  `sourceName` for the over-long-line error, and the line limit.
 * @returns An async generator of non-empty arrays of lines, numbered from 1 across the whole source.
 * @throws {ParseError} for a line longer than the limit ({@link MAX_LINE_CHARACTERS} by default).
 */
export async function* readLineBatches(
  source: TextSource,
  options: LineSplitterOptions = {},
): AsyncGenerator<readonly TextLine[]> {
  const splitter = new LineSplitter(options);
  if (isAsyncIterable(source)) {
    for await (const chunk of source) {
      const lines = splitter.push(chunkText(chunk));
      if (lines.length > 0) yield lines;
    }
  } else {
    for (const piece of piecesOf(source)) {
      const lines = splitter.push(piece);
      if (lines.length > 0) yield lines;
    }
  }
  const last = splitter.finish();
  if (last.length > 0) yield last;
}

/**
 * Iterates the lines of any text source (string, iterable or async iterable of chunks). One
 * asynchronous step per line: readers of large files use {@link readLineBatches}.
 */
export async function* readLines(source: TextSource, options: LineSplitterOptions = {}): AsyncGenerator<TextLine> {
  for await (const lines of readLineBatches(source, options)) yield* lines;
}

/** Calendar date and time of day as written in a file, in that file's own time scale. */
export interface EpochFields {
  readonly year: number;
  readonly month: number;
  readonly day: number;
  readonly hour: number;
  readonly minute: number;
  /** Seconds of the minute, may be fractional. */
  readonly second: number;
}

/** Whether the calendar fields name a real date and time (second in [0, 61) to admit a leap second). */
export function validEpochFields(f: EpochFields): boolean {
  if (![f.year, f.month, f.day, f.hour, f.minute].every(Number.isInteger) || !Number.isFinite(f.second)) return false;
  if (f.month < 1 || f.month > 12 || f.day < 1 || f.hour < 0 || f.hour > 23 || f.minute < 0 || f.minute > 59)
    return false;
  if (f.second < 0 || f.second >= 61) return false;
  return f.day <= daysInMonth(f.year, f.month);
}

const FORTRAN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([EeDd][+-]?\d+)?$/;

/**
 * Parses a Fortran-style real (`-.123456789012D-04`, `1.5E+03`, `42`) or returns
 * `undefined` for a blank field, `NaN` for text that is not a number.
 */
export function parseFortranReal(field: string): number | undefined {
  if (typeof field !== 'string')
    throw new InvalidArgumentError('field', field, 'the text of a fixed-width numeric field');
  const t = field.trim();
  if (t === '') return undefined;
  if (!FORTRAN_NUMBER.test(t)) return Number.NaN;
  const v = Number(t.replace(/[Dd]/, 'E'));
  return Number.isFinite(v) ? v : Number.NaN;
}
