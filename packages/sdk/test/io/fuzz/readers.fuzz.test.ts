/**
 * Seeded fuzzing of every text reader: 10^4 mutants of the real fixtures per reader (see harness.ts), plus the
 * special inputs. A reader must either refuse an input with a Tauline error (ParseError) or accept it with
 * finite numbers (NaN only where it documents a missing sample), and never take over 2 s on one input.
 * The guarantees come from the reader rules of DEVELOPERS.md ("How to add a parser") and issue 11; the
 * limits are design choices (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { TaulineError } from '../../../src/errors.js';
import {
  MAX_LINE_CHARACTERS,
  MAX_SERIES_SAMPLES,
  parsePhaseText,
  parseRinexClock,
  parseRinexNav,
  parseSp3,
  rinexClockSeries,
} from '../../../src/io/index.js';
import { parseLeapSecondsList } from '../../../src/time/index.js';
import {
  type FuzzFailure,
  fixturesMatching,
  fuzzReader,
  probe,
  type ReaderUnderFuzz,
  specialInputs,
} from './harness.js';

/** Mutants per reader (issue 11: at least 10^4). */
const RUNS = 10_000;
const SEED = 20261203;

const header =
  (endMarker: RegExp) =>
  (text: string): string => {
    const ls = text.split('\n');
    const end = ls.findIndex((l) => endMarker.test(l));
    return `${ls.slice(0, end + 1).join('\n')}\n`;
  };

/** Every typed error is fine; anything else is rethrown (used where a reader's result is post-processed). */
function typedOrUndefined<T>(fn: () => T): T | undefined {
  try {
    return fn();
  } catch (error) {
    if (error instanceof TaulineError) return undefined;
    throw error;
  }
}

const phaseText: ReaderUnderFuzz<ReturnType<typeof parsePhaseText>> = {
  name: 'parsePhaseText',
  fixtures: /\.txt$/,
  parse: (text) => parsePhaseText(text, { sourceName: 'fuzz' }),
  nanAllowedAt: [/^phase\[\]$/],
  check: (s) => {
    let nan = 0;
    for (const v of s.phase) if (v !== v) nan++;
    if (nan !== s.missing) throw new Error(`${nan} NaN samples but missing = ${s.missing}`);
    if (s.phase.length > MAX_SERIES_SAMPLES) throw new Error(`${s.phase.length} samples, over MAX_SERIES_SAMPLES`);
    if (s.times)
      for (let i = 1; i < s.times.length; i++)
        if (!(s.times[i]! > s.times[i - 1]!)) throw new Error(`times not increasing at ${i}`);
  },
};

/** A RINEX clock file and the series of each of its clocks (where a long gap would allocate). */
function readClockAndSeries(text: string) {
  const file = parseRinexClock(text, { sourceName: 'fuzz' });
  const names = [...new Set(file.records.map((r) => r.name))].slice(0, 4);
  return { file, series: names.map((n) => typedOrUndefined(() => rinexClockSeries(file, n))) };
}

const rinexClock: ReaderUnderFuzz<ReturnType<typeof readClockAndSeries>> = {
  name: 'parseRinexClock + rinexClockSeries',
  fixtures: /\.clk$|\.\d\dc$/i,
  headerEnd: (l) => l.includes('END OF HEADER'),
  parse: readClockAndSeries,
  nanAllowedAt: [/^series\[\]\.phase\[\]$/],
};

const rinexNav: ReaderUnderFuzz<ReturnType<typeof parseRinexNav>> = {
  name: 'parseRinexNav',
  fixtures: /\.rnx$|\.\d\d[nglhfqip]$/i,
  headerEnd: (l) => l.includes('END OF HEADER'),
  parse: (text) => parseRinexNav(text, { sourceName: 'fuzz' }),
};

const sp3: ReaderUnderFuzz<ReturnType<typeof parseSp3>> = {
  name: 'parseSp3',
  fixtures: /\.sp3$/i,
  headerEnd: (l) => l.startsWith('/*'),
  parse: (text) => parseSp3(text, { sourceName: 'fuzz' }),
};

const leapSeconds: ReaderUnderFuzz<ReturnType<typeof parseLeapSecondsList>> = {
  name: 'parseLeapSecondsList',
  fixtures: /\.list$/,
  parse: (text) => parseLeapSecondsList(text, 'fuzz'),
};

/** One line per failure, enough to replay it (seed, run, fixture, mutators) and see the input. */
function describeFailures(failures: readonly FuzzFailure[]): string {
  return failures
    .slice(0, 8)
    .map(
      (f) =>
        `${f.reader} run ${f.run} (${f.fixture}; ${f.mutators.join(', ')}): ${f.problem}\n  input: ${JSON.stringify(f.inputHead)}`,
    )
    .join('\n');
}

/**
 * Known reader findings owned by another part of the work (listed in the report to the lead): left out of the
 * failure count here so that the suite stays green, and asserted to still be the only ones. Empty when none.
 */
const KNOWN: Record<string, (f: FuzzFailure) => boolean> = {
  // None: the SP3 reader now refuses a non-finite coordinate or velocity (e.g. `1e400`) with file:line:column.
};

describe('readers under seeded fuzzing (10^4 mutants of the real fixtures each; seed 20261203)', () => {
  for (const reader of [phaseText, rinexClock, rinexNav, sp3, leapSeconds] as ReaderUnderFuzz<unknown>[]) {
    it(`${reader.name}(mutated fixtures) throws only Tauline errors, never hangs over 2 s and accepts only finite values`, () => {
      const report = fuzzReader(reader, SEED, RUNS, KNOWN[reader.name]);
      expect(report.runs).toBe(RUNS);
      expect(describeFailures(report.failures)).toBe('');
      // Both outcomes occur: the mutants are neither all trivially refused nor all harmless.
      expect(report.accepted).toBeGreaterThan(RUNS / 50);
      expect(report.refused).toBeGreaterThan(RUNS / 50);
    });

    it(`${reader.name}(special inputs: empty, BOM only, header only, CR-only, over-long line, NUL) refuses with a Tauline error or accepts finite values`, () => {
      const fixtures = fixturesMatching(reader.fixtures);
      for (const input of specialInputs(header(/END OF HEADER|^\/\*/), fixtures, MAX_LINE_CHARACTERS)) {
        expect(probe(reader, input.text).problem, input.name).toBeUndefined();
      }
    });
  }

  it('every reader refuses the over-long line with a ParseError naming the line and MAX_LINE_CHARACTERS', () => {
    const long = `${'1'.repeat(MAX_LINE_CHARACTERS + 1)}\n`;
    for (const read of [
      () => parsePhaseText(long),
      () => parseRinexClock(long),
      () => parseRinexNav(long),
      () => parseSp3(long),
    ]) {
      expect(read).toThrow(/^[\w-]+:1:1048577: expected a line of at most 1048576 characters/);
    }
  });

  it('every reader reads CR-only line ends like LF (the fixtures give the same result either way)', () => {
    const cases: [RegExp, (t: string) => unknown][] = [
      [/\.txt$/, (t) => parsePhaseText(t)],
      [/\.clk$/i, (t) => parseRinexClock(t)],
      [/\.rnx$/i, (t) => parseRinexNav(t)],
      [/\.sp3$/i, (t) => parseSp3(t)],
      [/\.list$/, (t) => parseLeapSecondsList(t)],
    ];
    for (const [pattern, read] of cases) {
      for (const f of fixturesMatching(pattern)) {
        const lf = typedOrUndefined(() => read(f.text));
        if (lf === undefined) continue; // a fixture that is meant to be refused (truncated-*)
        expect(JSON.stringify(read(f.text.replace(/\r?\n/g, '\r'))), f.path).toBe(JSON.stringify(lf));
      }
    }
  });

  it('rinexClockSeries(a record dated 9999) refuses the implied 10^11-sample series through the shared MAX_SERIES_SAMPLES check, naming file and line', () => {
    const text =
      fixturesMatching(/^fictional-304\.clk$/)[0]!.text.trimEnd() +
      '\nAS G05       9999 01 04 00 02  0.000000  2   -0.123456788930E-03  0.100000000000E-10\n';
    const file = parseRinexClock(text, { sourceName: 'year9999.clk' });
    expect(() => rinexClockSeries(file, 'G05')).toThrow(
      /^year9999\.clk:14:1: expected a uniform series of at most 50000000 samples \(MAX_SERIES_SAMPLES\): the gap of \d+ s after line 13/,
    );
  });

  it('parseRinexClock(a lone CR after END OF HEADER) keeps the next record as a record (the line reader ends the line at the CR)', () => {
    const text = fixturesMatching(/^fictional-304\.clk$/)[0]!.text;
    const crAfterHeader = text.replace(/END OF HEADER\r?\n/, 'END OF HEADER\r');
    expect(crAfterHeader).not.toBe(text);
    expect(parseRinexClock(crAfterHeader).records).toEqual(parseRinexClock(text).records);
  });
});
