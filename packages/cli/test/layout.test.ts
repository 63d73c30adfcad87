import { describe, expect, it } from 'vitest';
import type { Io } from '../src/framework.js';
import { displayWidth, fitTable, TABLE_WIDTH, wrapLines, wrapText } from '../src/layout.js';
import { clearProgress, progressBar, startProgress, withProgress } from '../src/progress.js';
import { closestNames, didYouMean, editDistance } from '../src/suggest.js';

describe('terminal layout', () => {
  // East Asian Width classes from Unicode Standard Annex #11 (from memory [M]): 漢 (U+6F22) and the
  // fullwidth Ａ (U+FF21) are W/F, two columns; é written as e + U+0301 COMBINING ACUTE ACCENT is one column;
  // Greek, the minus sign U+2212 and box drawing are narrow.
  it('displayWidth(text) counts wide characters as 2, combining marks as 0 and other characters as 1', () => {
    expect(displayWidth('abc')).toBe(3);
    expect(displayWidth('漢字')).toBe(4);
    expect(displayWidth('Ａ1')).toBe(3);
    expect(displayWidth('e\u0301')).toBe(1);
    expect(displayWidth('τ − TT ─')).toBe(8);
    expect(displayWidth('🛰')).toBe(1); // U+1F6F0 SATELLITE has text presentation by default (no Emoji_Presentation)
    expect(displayWidth('🚀')).toBe(2);
  });

  it('wrapText(text, width, indent) breaks at spaces only, keeps the spacing inside a line and never cuts a word', () => {
    expect(wrapText('key    value one two three', 16, '       ')).toEqual(['key    value one', '       two three']);
    expect(wrapText('a verylongword b', 5)).toEqual(['a', 'verylongword', 'b']);
    expect(wrapText('short', undefined)).toEqual(['short']);
    expect(wrapLines('  • one two three four\nx', 12)).toBe('  • one two\n    three\n    four\nx');
  });

  it('fitTable(headers, rows) right-aligns a column of numbers that also holds "—"', () => {
    expect(
      fitTable(
        ['sat', 'Δt_r (ns)'],
        [
          ['G05', '-23.9454'],
          ['G07', '—'],
        ],
      ),
    ).toBe('sat  Δt_r (ns)\n───  ─────────\nG05   -23.9454\nG07          —\n');
  });

  it('fitTable(headers, rows, { width }) wraps the header that overhangs its column most, then stops', () => {
    const out = fitTable(['strategy', 'time in tolerance', 'n'], [['none', '0.1931', '3']], { width: 20 });
    expect(out).toBe('            time in\nstrategy  tolerance  n\n────────  ─────────  ─\nnone         0.1931  3\n');
    expect(fitTable(['strategy', 'time in tolerance', 'n'], [['none', '0.1931', '3']], { width: undefined })).toContain(
      'time in tolerance',
    );
  });

  it('fitTable(headers, rows, { width, below, notes }) moves the below columns under their row and prints notes on their own line', () => {
    const rows = [
      [1, 'frequency', 'a long reason that would widen the table a lot'],
      [2, 'phase', ''],
    ];
    const out = fitTable(['#', 'kind', 'reason'], rows, {
      width: 30,
      below: [2],
      unlabelled: [2],
      notes: [undefined, 'no record covers this time'],
    });
    expect(out).toBe(
      '#  kind\n─  ─────────\n1  frequency\n   a long reason that would\n     widen the table a lot\n2  phase\n   no record covers this time\n',
    );
    for (const line of out.split('\n')) expect(displayWidth(line)).toBeLessThanOrEqual(30);
  });

  it('fitTable(headers, rows, { width, panels }) splits a table too wide for the width into panels that repeat the key column', () => {
    const out = fitTable(['τ', 'a', 'b', 'c'], [['1', 'x'.repeat(12), 'y'.repeat(12), 'z'.repeat(12)]], {
      width: 30,
      panels: { keys: 1, groups: [[1], [2], [3]] },
    });
    const panels = out.split('\n\n');
    expect(panels).toHaveLength(2);
    expect(panels[0]).toMatch(/^τ {2}a +b\n/);
    expect(panels[1]).toMatch(/^τ {2}c\n/);
  });

  it('TABLE_WIDTH is 100 columns', () => {
    expect(TABLE_WIDTH).toBe(100);
  });
});

describe('did you mean', () => {
  // Reference distances (from memory [M]): Levenshtein("kitten", "sitting") = 3, the classic example;
  // optimal string alignment("ca", "abc") = 3 (true Damerau–Levenshtein gives 2), the usual example of the difference.
  it('editDistance(a, b) is the optimal-string-alignment distance', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3);
    expect(editDistance('ca', 'abc')).toBe(3);
    expect(editDistance('plna', 'plan')).toBe(1); // one adjacent transposition
    expect(editDistance('', 'rate')).toBe(4);
  });

  it('closestNames(typed, known) returns the nearest names within a small threshold, else the names it starts', () => {
    expect(closestNames('ratez', ['rate', 'review', 'plan'])).toEqual(['rate']);
    expect(closestNames('semi-major', ['semi-major-axis', 'eccentricity'])).toEqual(['semi-major-axis']);
    expect(closestNames('xyz', ['rate', 'plan'])).toEqual([]);
    expect(didYouMean('mean-anomoly', ['mean-anomaly', 'eccentricity'], '--')).toBe('; did you mean --mean-anomaly?');
  });
});

describe('progress on a terminal', () => {
  const fakeIo = (isTty: boolean): Io & { written: string[] } => {
    const written: string[] = [];
    return {
      out: () => {},
      err: (t) => {
        written.push(t);
      },
      isTty,
      written,
    };
  };

  it('startProgress(io, label, long) draws on a terminal only, and only for a long run', () => {
    for (const [isTty, long, drawn] of [
      [true, true, true],
      [false, true, false],
      [true, false, false],
    ] as const) {
      const io = fakeIo(isTty);
      const p = startProgress(io, 'x', long);
      p.update(50, 100);
      p.finish();
      expect(io.written.length > 0, `isTty ${isTty}, long ${long}`).toBe(drawn);
    }
  });

  it('clearProgress(io) clears the bars still drawn on that output, once', () => {
    const io = fakeIo(true);
    const bar = progressBar(io, 'x');
    bar.update(1, 2);
    clearProgress(io);
    clearProgress(io);
    expect(io.written).toEqual(['\rx [#############............]  50 %', `\r${' '.repeat(36)}\r`]);
  });

  it('withProgress(progress, body) clears the bar when the body throws', () => {
    const io = fakeIo(true);
    const bar = progressBar(io, 'x');
    expect(() =>
      withProgress(bar, () => {
        bar.update(1, 2);
        throw new Error('bad');
      }),
    ).toThrow('bad');
    expect(io.written.at(-1)).toBe(`\r${' '.repeat(36)}\r`);
  });
});
