// Line splitting of the text readers. Line ends LF, CR LF and a lone CR: common practice, no source.

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import { MAX_LINE_CHARACTERS } from '../../src/io/limits.js';
import { LineSplitter, linesOf, readLineBatches, readLines, type TextLine } from '../../src/io/line-reader.js';

async function* asyncChunks(chunks: readonly string[]): AsyncGenerator<string> {
  for (const c of chunks) yield c;
}

async function collect<T>(it: AsyncIterable<T>): Promise<T[]> {
  const out: T[] = [];
  for await (const x of it) out.push(x);
  return out;
}

/** Independent split: String.prototype.split on CR LF, CR or LF; no empty last line after a final line end. */
function splitReference(text: string): TextLine[] {
  const parts = text.split(/\r\n|\r|\n/);
  if (parts.at(-1) === '') parts.pop();
  return parts.map((p, i) => ({ text: p, lineNumber: i + 1 }));
}

describe('readLineBatches: one batch per chunk', () => {
  it('readLineBatches(chunks) yields the lines each chunk completes and skips a chunk that completes none', async () => {
    const batches = await collect(readLineBatches(asyncChunks(['a\nb', 'c', 'd\r', '\ne\n', 'f'])));
    // The CR ending chunk 3 completes "bcd" there; the LF starting chunk 4 belongs to it (one CR LF line end).
    expect(batches).toEqual([
      [{ text: 'a', lineNumber: 1 }],
      [{ text: 'bcd', lineNumber: 2 }],
      [{ text: 'e', lineNumber: 3 }],
      [{ text: 'f', lineNumber: 4 }],
    ]);
  });

  it('readLineBatches("") yields nothing', async () => {
    expect(await collect(readLineBatches(''))).toEqual([]);
  });

  it('readLineBatches(syncChunks) and readLines(asyncChunks) deliver the same lines as a plain split', async () => {
    const text = 'x1\r\nx2\n\nx4\r\n';
    const viaBatches = (await collect(readLineBatches(['x1\r', '\nx2\n', '\nx4', '\r\n']))).flat();
    expect(viaBatches).toEqual(splitReference(text));
    expect(await collect(readLines(asyncChunks(['x1\r', '\nx2\n', '\nx4', '\r\n'])))).toEqual(splitReference(text));
  });
});

describe('linesOf: a long string is split in pieces without changing the lines', () => {
  it('linesOf(text) keeps a CR LF that straddles the 65 536-character piece boundary as one line end', () => {
    const first = 'a'.repeat(65_535); // its CR is character 65 536 (the last of the first piece), its LF the first of the next
    const text = `${first}\r\nsecond\r\nthird`;
    const lines = [...linesOf(text)];
    expect(lines).toEqual([
      { text: first, lineNumber: 1 },
      { text: 'second', lineNumber: 2 },
      { text: 'third', lineNumber: 3 },
    ]);
  });

  it('linesOf(text) equals a plain split for long random texts of short and long lines, LF or CR LF', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            length: fc.oneof(fc.integer({ min: 0, max: 40 }), fc.integer({ min: 60_000, max: 140_000 })),
            crlf: fc.boolean(),
          }),
          { minLength: 1, maxLength: 6 },
        ),
        fc.boolean(),
        (spec, finalEnd) => {
          const text =
            spec
              .map((s, i) => `${String.fromCharCode(97 + (i % 26)).repeat(s.length)}${s.crlf ? '\r\n' : '\n'}`)
              .join('') + (finalEnd ? '' : 'tail');
          expect([...linesOf(text)]).toEqual(splitReference(text));
        },
      ),
      { seed: 20261202, numRuns: 40 },
    );
  });
});

describe('LineSplitter: any chunking gives the same lines', () => {
  it('LineSplitter.push(chunks) delivers a line fed in 1 000 chunks as one line, its CR LF split across two chunks', () => {
    const sp = new LineSplitter();
    const got: TextLine[] = [];
    for (let k = 0; k < 1000; k++) got.push(...sp.push('ab'));
    got.push(...sp.push('\r'), ...sp.push('\nnext'), ...sp.finish());
    expect(got).toEqual([
      { text: 'ab'.repeat(1000), lineNumber: 1 },
      { text: 'next', lineNumber: 2 },
    ]);
    expect(sp.lineCount).toBe(2);
  });

  it('LineSplitter.push(chunks) equals a plain split of the joined text for random texts cut at random places', () => {
    fc.assert(
      fc.property(
        fc.array(fc.constantFrom('a', 'b', '\r', '\n', '\r\n', 'xyz'), { maxLength: 60 }),
        fc.array(fc.integer({ min: 0, max: 200 }), { maxLength: 12 }),
        (parts, cuts) => {
          const text = parts.join('');
          const at = [...new Set(cuts.map((c) => Math.min(c, text.length)))].sort((x, y) => x - y);
          const sp = new LineSplitter();
          const got: TextLine[] = [];
          let from = 0;
          for (const c of [...at, text.length]) {
            got.push(...sp.push(text.slice(from, c)));
            from = c;
          }
          got.push(...sp.finish());
          // A lone CR is a line end like LF; CR LF is one line end even when the cut falls between them.
          const expected = splitReference(text);
          expect(got).toEqual(expected);
        },
      ),
      { seed: 20261202, numRuns: 300 },
    );
  });
});

describe('LineSplitter: lone CR line ends, byte-order mark, over-long lines', () => {
  it('linesOf(text) reads a lone CR as a line end, CR LF as one, and never merges CR-separated lines', () => {
    expect([...linesOf('0 1e-9\r1 2e-9\r\r3 4e-9')]).toEqual([
      { text: '0 1e-9', lineNumber: 1 },
      { text: '1 2e-9', lineNumber: 2 },
      { text: '', lineNumber: 3 },
      { text: '3 4e-9', lineNumber: 4 },
    ]);
    expect([...linesOf('a\r\n\r\nb\n\rc')].map((l) => l.text)).toEqual(['a', '', 'b', '', 'c']);
  });

  it('LineSplitter.push(chunks) keeps a CR at the end of one chunk and an LF at the start of the next as one line end, and a CR then a non-LF chunk as a line end', () => {
    const sp = new LineSplitter();
    const got = [
      ...sp.push('a\r'),
      ...sp.push('\nb\r'),
      ...sp.push('c'),
      ...sp.push('\r'),
      ...sp.push(''),
      ...sp.push('\n'),
      ...sp.finish(),
    ];
    expect(got).toEqual([
      { text: 'a', lineNumber: 1 },
      { text: 'b', lineNumber: 2 },
      { text: 'c', lineNumber: 3 },
    ]);
  });

  it('linesOf(text) drops a byte-order mark at the very start only', () => {
    expect([...linesOf('\ufeff1\n\ufeff2')].map((l) => l.text)).toEqual(['1', '\ufeff2']);
    expect([...linesOf('\ufeff')]).toEqual([]);
    const sp = new LineSplitter();
    expect([...sp.push(''), ...sp.push('\ufeffx\n')]).toEqual([{ text: 'x', lineNumber: 1 }]);
  });

  it('LineSplitter.push(chunks) refuses a line longer than the limit as soon as it is passed, naming source, line and limit', () => {
    const sp = new LineSplitter({ sourceName: 'endless.txt', maxLineCharacters: 100 });
    expect(sp.push('ok\n')).toHaveLength(1);
    let pushed = 0;
    let caught: unknown;
    try {
      for (let k = 0; k < 1000; k++) {
        sp.push('x'.repeat(30));
        pushed++;
      }
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ParseError);
    expect(pushed).toBe(3); // 3 × 30 = 90 characters held, the 4th chunk passes 100: refused there, not at the end
    const err = caught as ParseError;
    expect(err.sourceName).toBe('endless.txt');
    expect(err.line).toBe(2);
    expect(err.column).toBe(101);
    expect(err.message).toMatch(/^endless\.txt:2:101: expected a line of at most 100 characters/);
  });

  it('new LineSplitter({ maxLineCharacters }) refuses a limit that is not an integer in [1, MAX_LINE_CHARACTERS] instead of clamping it', () => {
    for (const bad of [0, 1.5, MAX_LINE_CHARACTERS + 1, Number.NaN]) {
      expect(() => new LineSplitter({ maxLineCharacters: bad })).toThrow(
        /^maxLineCharacters must be an integer number of characters in \[1, 1048576\]/,
      );
    }
    expect(() => new LineSplitter({ maxLineCharacters: MAX_LINE_CHARACTERS })).not.toThrow();
  });

  it('linesOf(text) refuses a complete line over the default MAX_LINE_CHARACTERS (1 MiB) and accepts one of exactly that length', () => {
    const exact = 'y'.repeat(MAX_LINE_CHARACTERS);
    expect([...linesOf(`${exact}\nz`)].map((l) => l.text.length)).toEqual([MAX_LINE_CHARACTERS, 1]);
    expect(() => [...linesOf(`a\n${exact}y\n`, { sourceName: 'big.txt' })]).toThrow(
      /^big\.txt:2:1048577: expected a line of at most 1048576 characters/,
    );
  });

  it('readLineBatches(async chunks) refuses an endless line fed in 64 KiB chunks after about 1 MiB, without reading the rest', async () => {
    let produced = 0;
    async function* endless(): AsyncGenerator<string> {
      for (;;) {
        produced++;
        yield '\u0000'.repeat(65_536);
      }
    }
    await expect(collect(readLineBatches(endless(), { sourceName: '/dev/zero' }))).rejects.toThrow(
      /^\/dev\/zero:1:1048577: expected a line of at most/,
    );
    expect(produced).toBe(17); // 16 chunks fill exactly 1 MiB; the 17th passes it
  });
});
