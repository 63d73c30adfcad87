import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import { MAX_LINE_CHARACTERS, MAX_SERIES_SAMPLES, parsePhaseText, readPhaseTextSeries } from '../../src/io/index.js';
import { parseError } from './parse-errors.js';

const fixture = (name: string) =>
  readFileSync(new URL(`../../../../test/fixtures/stability/${name}`, import.meta.url), 'utf8');

describe('parsePhaseText (plain text / CSV phase records; common practice, no source)', () => {
  it('parsePhaseText(one column with comments and blank lines) returns every value in order', () => {
    const s = parsePhaseText(fixture('nbs14-phase.txt'), { tau0: 1 });
    expect(s.columns).toBe(1);
    expect(s.phase.length).toBe(10);
    expect(s.phase[1]).toBe(103.11111);
    expect(s.tau0).toBe(1);
    expect(s.gaps).toEqual([]);
  });
  it('parsePhaseText(two columns with a CSV header and skipped epochs) inserts NaN for each missing epoch and reports the gap', () => {
    const s = parsePhaseText(fixture('phase-two-column.txt'), { sourceName: 'phase-two-column.txt' });
    expect(s.header).toEqual(['time', 'phase']);
    expect(s.tau0).toBe(30);
    expect(s.phase.length).toBe(12);
    expect(Number.isNaN(s.phase[5]!) && Number.isNaN(s.phase[6]!)).toBe(true);
    expect(s.gaps).toEqual([{ index: 5, missing: 2, line: 8, time: 150 }]);
    expect(s.missing).toBe(2);
    expect(s.times![11]).toBe(330);
  });
  it('parsePhaseText accepts whitespace, comma and semicolon separators, trailing comments and explicit NaN markers', () => {
    const s = parsePhaseText('0 1e-9\n1;2e-9 # note\n2,NaN\n3\t4e-9\n');
    expect(s.phase.length).toBe(4);
    expect(s.gaps).toEqual([{ index: 2, missing: 1, line: 3, time: 2 }]);
    const one = parsePhaseText('1\nnan\nNaN\n4\n');
    expect(one.gaps).toEqual([{ index: 1, missing: 2, line: 2, time: undefined }]);
  });
  it('parsePhaseText with a given tau0 finds gaps even when no two listed epochs are adjacent', () => {
    const s = parsePhaseText('0 1\n20 2\n40 3\n', { tau0: 10 });
    expect(s.phase.length).toBe(5);
    expect(s.missing).toBe(2);
  });
  it('parsePhaseText rejects a non-numeric value with file, line and column', () => {
    const e = parseError(() => parsePhaseText('1\n2\n3x\n', { sourceName: 'a.txt' }));
    expect([e.sourceName, e.line, e.column]).toEqual(['a.txt', 3, 1]);
  });
  it('parsePhaseText rejects a changing column count, more than two columns, infinite values and empty input', () => {
    expect(parseError(() => parsePhaseText('0 1\n1\n')).line).toBe(2);
    expect(parseError(() => parsePhaseText('0 1 2\n')).column).toBe(5);
    expect(parseError(() => parsePhaseText('a b c\n')).line).toBe(1);
    expect(parseError(() => parsePhaseText('1e999\n')).line).toBe(1);
    expect(parseError(() => parsePhaseText('# only a comment\n\n')).expected).toMatch(/at least one/);
    expect(parseError(() => parsePhaseText('0 NaN\nNaN 1\n')).line).toBe(2);
  });
  it('parsePhaseText rejects non-increasing times and a step that is not a multiple of τ0', () => {
    expect(parseError(() => parsePhaseText('0 1\n10 2\n10 3\n')).line).toBe(3);
    expect(parseError(() => parsePhaseText('0 1\n10 2\n25 3\n')).line).toBe(3);
    expect(parseError(() => parsePhaseText('0 1\n10 2\n', { tau0: -1 })).line).toBe(1);
  });
  it('readPhaseTextSeries(async chunks) gives the same series as parsePhaseText(string), whatever the chunk boundaries', async () => {
    const text = fixture('phase-two-column.txt');
    async function* chunks() {
      for (let i = 0; i < text.length; i += 7) yield text.slice(i, i + 7);
    }
    const a = await readPhaseTextSeries(chunks());
    expect([...a.phase].map(String)).toEqual([...parsePhaseText(text).phase].map(String));
  });
  it('parsePhaseText(mutated or truncated input) throws only ParseError and never hangs (fast-check fuzz)', () => {
    const base = fixture('phase-two-column.txt');
    fc.assert(
      fc.property(fc.nat(base.length), fc.string({ maxLength: 4 }), fc.nat(base.length), (at, insert, cut) => {
        const text = (base.slice(0, at) + insert + base.slice(at)).slice(0, Math.max(cut, 1));
        try {
          parsePhaseText(text);
        } catch (e) {
          expect(e).toBeInstanceOf(ParseError);
        }
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });
});

describe('parsePhaseText: bounded memory on hostile input (limits are design choices, common practice, no source)', () => {
  it('parsePhaseText("0 0\\n1 0\\n1e12 0") refuses the 10^12-sample gap before allocating, naming file, line, the gap and MAX_SERIES_SAMPLES', () => {
    const err = parseError(() => parsePhaseText('0 0\n1 0\n1e12 0\n', { sourceName: 'gap.txt' }));
    expect(err.sourceName).toBe('gap.txt');
    expect(err.line).toBe(3);
    expect(err.message).toContain(`at most ${MAX_SERIES_SAMPLES} samples`);
    expect(err.message).toContain('gap of 999999999999 s after line 2');
    expect(err.message).toContain('1000000000001 samples');
  });

  it('parsePhaseText refuses a gap making MAX_SERIES_SAMPLES + 1 samples and accepts the same span at a coarser tau0', () => {
    // The accepted side is kept small (101 samples): a test never allocates the full 5·10^7-sample series.
    const span = MAX_SERIES_SAMPLES; // first sample + span steps of 1 s = MAX_SERIES_SAMPLES + 1 samples
    expect(() => parsePhaseText(`0 0\n${span} 0\n`, { tau0: 1 })).toThrow(/making 50000001 samples/);
    expect(parsePhaseText(`0 0\n${span} 0\n`, { tau0: span / 100 }).phase.length).toBe(101);
  });

  it('parsePhaseText with an imposed tau0 far below the spacing refuses the implied series instead of allocating it', () => {
    expect(() => parsePhaseText('0 0\n86400 1e-9\n', { sourceName: 'day.txt', tau0: 1e-9 })).toThrow(
      /^day\.txt:2:1: expected a uniform series of at most/,
    );
  });

  it('parsePhaseText reads CR-only line ends as line ends (never two rows merged into one) and ignores a leading byte-order mark', () => {
    const s = parsePhaseText('\ufefftime,phase\r0,1e-9\r1,2e-9\r2,3e-9\r');
    expect(s.columns).toBe(2);
    expect(Array.from(s.phase)).toEqual([1e-9, 2e-9, 3e-9]);
  });

  it('parsePhaseText refuses an over-long line naming the source, line and MAX_LINE_CHARACTERS', () => {
    const err = parseError(() =>
      parsePhaseText(`1e-9\n${'1'.repeat(MAX_LINE_CHARACTERS + 5)}\n`, { sourceName: 'long.txt' }),
    );
    expect(err.line).toBe(2);
    expect(err.message).toMatch(/^long\.txt:2:1048577: expected a line of at most 1048576 characters/);
  });
});
