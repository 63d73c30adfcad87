// Line splitting of the text readers. Line ends LF and CR LF: common practice, no source.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { LineSplitter, linesOf, readLineBatches, readLines, type TextLine } from '../../src/io/line-reader.js';

async function* asyncChunks(chunks: readonly string[]): AsyncGenerator<string> {
  for (const c of chunks) yield c;
}

async function collect<T>(it: AsyncIterable<T>): Promise<T[]> {
  const out: T[] = [];
  for await (const x of it) out.push(x);
  return out;
}

/** Independent split: String.prototype.split on LF, a trailing CR dropped, no empty last line after a final LF. */
function splitReference(text: string): TextLine[] {
  const parts = text.split('\n');
  if (parts.at(-1) === '') parts.pop();
  return parts.map((p, i) => ({ text: p.endsWith('\r') ? p.slice(0, -1) : p, lineNumber: i + 1 }));
}

describe('readLineBatches: one batch per chunk', () => {
  it('readLineBatches(chunks) yields the lines each chunk completes and skips a chunk that completes none', async () => {
    const batches = await collect(readLineBatches(asyncChunks(['a\nb', 'c', 'd\r', '\ne\n', 'f'])));
    expect(batches).toEqual([
      [{ text: 'a', lineNumber: 1 }],
      [{ text: 'bcd', lineNumber: 2 }, { text: 'e', lineNumber: 3 }],
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
    fc.assert(fc.property(
      fc.array(fc.record({ length: fc.oneof(fc.integer({ min: 0, max: 40 }), fc.integer({ min: 60_000, max: 140_000 })), crlf: fc.boolean() }),
        { minLength: 1, maxLength: 6 }),
      fc.boolean(),
      (spec, finalEnd) => {
        const text = spec.map((s, i) => `${String.fromCharCode(97 + (i % 26)).repeat(s.length)}${s.crlf ? '\r\n' : '\n'}`).join('')
          + (finalEnd ? '' : 'tail');
        expect([...linesOf(text)]).toEqual(splitReference(text));
      },
    ), { seed: 20261202, numRuns: 40 });
  });
});

describe('LineSplitter: any chunking gives the same lines', () => {
  it('LineSplitter.push(chunks) delivers a line fed in 1 000 chunks as one line, its CR LF split across two chunks', () => {
    const sp = new LineSplitter();
    const got: TextLine[] = [];
    for (let k = 0; k < 1000; k++) got.push(...sp.push('ab'));
    got.push(...sp.push('\r'), ...sp.push('\nnext'), ...sp.finish());
    expect(got).toEqual([{ text: 'ab'.repeat(1000), lineNumber: 1 }, { text: 'next', lineNumber: 2 }]);
    expect(sp.lineCount).toBe(2);
  });

  it('LineSplitter.push(chunks) equals a plain split of the joined text for random texts cut at random places', () => {
    fc.assert(fc.property(
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
        // A CR not followed by LF stays in the line text except at the very end of the input (dropped by finish).
        const expected = splitReference(text);
        expect(got).toEqual(expected);
      },
    ), { seed: 20261202, numRuns: 300 });
  });
});
