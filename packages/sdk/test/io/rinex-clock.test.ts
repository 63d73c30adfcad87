// RINEX clock reader, versions 2.00–3.05 (Ray & Gurtner 2.00/3.02, with Coleman 3.04; column layout in
// packages/sdk/src/io/rinex-clock.ts). Fixtures: test/fixtures/rinex-clock/generate_versions.py (SOURCE.md).

import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError, ParseError, TaulineError } from '../../src/errors.js';
import {
  parseRinexClock,
  type RinexClockEvent,
  RinexClockParser,
  readRinexClock,
  readRinexClockSeries,
  rinexClockSeries,
} from '../../src/io/index.js';
import { MAX_SERIES_SAMPLES } from '../../src/io/limits.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales, formatFileEpoch } from '../../src/time/index.js';
import { expectParseError, parseError } from './parse-errors.js';

const fixture = (name: string) =>
  readFileSync(new URL(`../../../../test/fixtures/rinex-clock/${name}`, import.meta.url), 'utf8');
const V200 = fixture('fictional-200.clk');
const V302 = fixture('fictional-302.clk');
const V304 = fixture('fictional-304.clk');
const V305 = fixture('fictional-305.clk');

/** A 3.04 header (labels in column 66) and a 2.00 header (labels in column 61). */
const H304 = V304.split('\n').slice(0, 6).join('\n');
const H200 = V200.split('\n').slice(0, 3).join('\n');
/** Record lines laid out as the fixtures are (3.04: values end in columns 64 and 85; 2.00: 59 and 79). */
const AS304 = 'AS G05       2026 01 04 00 00  0.000000  2   -0.123456789012E-03   0.100000000000E-10';
const AS200 = 'AS G12  2026 01 04 00 05  0.000000  2    0.456700000000E-04  0.100000000000E-10';

async function collect(events: AsyncIterable<RinexClockEvent>): Promise<RinexClockEvent[]> {
  const out: RinexClockEvent[] = [];
  for await (const ev of events) out.push(ev);
  return out;
}

describe('parseRinexClock: the four layouts (RINEX clock 2.00, 3.02, 3.04, 3.05)', () => {
  it('parseRinexClock(3.04 file) reads version, A9 layout, system, TIME SYSTEM ID and the AS/AR records with all their values', () => {
    const f = parseRinexClock(V304, { sourceName: 'fictional-304.clk' });
    expect(f.header).toEqual({
      version: 3.04,
      layout: 'A9',
      satelliteSystem: 'G',
      timeSystem: 'GPS',
      epochTimeSystem: 'GPS',
      timeSystemAssumed: false,
      lines: 6,
    });
    expect(f.records.length).toBe(5);
    expect(f.otherRecords).toEqual({ CR: 1 });
    expect(f.records[1]).toMatchObject({
      type: 'AR',
      name: 'KLMN00XYZ',
      bias: 0.512e-6,
      biasSigma: 0.2e-10,
      rate: 0.1e-12,
      rateSigma: 0.3e-14,
      acceleration: -0.1e-17,
      accelerationSigma: 0.1e-18,
      line: 8,
    });
    expect(f.records[2]).toMatchObject({
      type: 'AS',
      name: 'G05',
      bias: -0.123456789e-3,
      biasSigma: undefined,
      line: 10,
    });
    expect(f.records[2]!.time).toEqual({ year: 2026, month: 1, day: 4, hour: 0, minute: 0, second: 30 });
    // 2026-01-04T00:00:30 GPS = TAI − 19 s (BIPM: GPS time is 19 s behind TAI [V2]); days from 2000-01-01 by the
    // JavaScript Date's own proleptic Gregorian count (independent of the SDK calendar).
    const taiSeconds = (Date.UTC(2026, 0, 4) - Date.UTC(2000, 0, 1)) / 1000 + 30 + 19;
    expect(f.records[2]!.epoch.toJSON()).toEqual({ taiSeconds, taiFraction: 0 });
  });
  it('parseRinexClock(2.00 file) reads A4 names, a 4-value record with its continuation line, and no time system', () => {
    const f = parseRinexClock(V200);
    expect(f.header).toMatchObject({
      version: 2,
      layout: 'A4',
      satelliteSystem: undefined,
      timeSystem: undefined,
      epochTimeSystem: 'GPS',
      timeSystemAssumed: true,
    });
    expect(f.records.slice(0, 3).map((r) => [r.name, r.rate, r.rateSigma])).toEqual([
      ['QRST', undefined, undefined],
      ['QRST', 0.1e-12, 0.3e-14],
      ['G12', undefined, undefined],
    ]);
    expect(rinexClockSeries(f, 'G12')).toMatchObject({ tau0: 300, missing: 0, timeSystem: undefined });
  });
  it('parseRinexClock(3.02 file) reads a mixed-system A4 file with Galileo and BeiDou satellites and continuation lines', () => {
    const f = parseRinexClock(V302);
    expect(f.header).toMatchObject({ version: 3.02, layout: 'A4', satelliteSystem: 'M', timeSystem: 'GPS', lines: 6 });
    expect(f.records).toHaveLength(48);
    expect(f.records[1]).toMatchObject({
      name: 'C21',
      bias: -0.5e-4,
      biasSigma: 0.3e-10,
      rate: -0.333e-12,
      rateSigma: 0.2e-14,
      line: 8,
    });
    expect(f.records[3]).toMatchObject({ name: 'E14', line: 11 });
  });
  it('parseRinexClock(3.05 file) reads it with the 3.04 layout: 6-value records, GAL time, epochs across a month end', () => {
    const f = parseRinexClock(V305);
    expect(f.header).toMatchObject({ version: 3.05, layout: 'A9', satelliteSystem: 'M', timeSystem: 'GAL', lines: 7 });
    const e27 = f.records.filter((r) => r.name === 'E27');
    expect(e27.map((r) => r.accelerationSigma)).toEqual(Array(8).fill(0.1e-19));
    expect(e27[4]!.time).toEqual({ year: 2026, month: 7, day: 1, hour: 0, minute: 0, second: 0 });
    // Galileo System Time − TAI = −19 s (Galileo OS SIS ICD §5.1.2 as quoted [V2]); Date.UTC counts the days.
    expect(e27[4]!.epoch.toJSON()).toEqual({
      taiSeconds: (Date.UTC(2026, 6, 1) - Date.UTC(2000, 0, 1)) / 1000 + 19,
      taiFraction: 0,
    });
    const s = rinexClockSeries(f, 'E27');
    expect([s.tau0, s.phase.length, s.missing, s.timeSystem]).toEqual([30, 8, 0, 'GAL']);
  });
  it('parseRinexClock(text, "name") refuses the source name alone (the form of earlier releases) with a typed error saying what to write', () => {
    const call = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        return e;
      }
      return undefined;
    };
    const e = call(() => parseRinexClock('x\n', 'old-form.clk' as unknown as { sourceName: string }));
    expect(e).toBeInstanceOf(InvalidArgumentError);
    expect((e as InvalidArgumentError).message).toContain('{ sourceName: "old-form.clk" }');
  });
});

describe('readRinexClock / RinexClockParser: the streaming event API (as readSp3, readRinexNav)', () => {
  it('readRinexClock(async chunks) yields the header, then one event per record, and matches parseRinexClock(string)', async () => {
    async function* chunks() {
      for (let i = 0; i < V304.length; i += 13) yield V304.slice(i, i + 13);
    }
    const events = await collect(readRinexClock(chunks(), { sourceName: 'x' }));
    const file = parseRinexClock(V304, { sourceName: 'x' });
    expect(events[0]).toEqual({ kind: 'header', header: file.header });
    expect(events.filter((e) => e.kind === 'record').map((e) => (e as { record: unknown }).record)).toEqual(
      file.records,
    );
    expect(events.filter((e) => e.kind === 'other')).toEqual([
      { kind: 'other', recordType: 'CR', name: 'KLMN00XYZ', line: 11 },
    ]);
  });
  it('RinexClockParser.push(line) returns a record event on the line that completes it (continuation lines included)', () => {
    const p = new RinexClockParser({ sourceName: 'p' });
    const lines = V304.split('\n');
    for (let i = 0; i < 5; i++) expect(p.push({ text: lines[i]!, lineNumber: i + 1 })).toEqual([]);
    expect(p.push({ text: lines[5]!, lineNumber: 6 })[0]!.kind).toBe('header');
    expect(p.push({ text: lines[6]!, lineNumber: 7 })[0]!.kind).toBe('record');
    expect(p.push({ text: lines[7]!, lineNumber: 8 })).toEqual([]);
    expect(p.push({ text: lines[8]!, lineNumber: 9 })[0]).toMatchObject({
      kind: 'record',
      record: { name: 'KLMN00XYZ', line: 8 },
    });
    expect(p.finish()).toEqual([]);
  });
  it('readRinexClockSeries(chunks, name) streams the file, keeps one clock and equals rinexClockSeries(parseRinexClock(text), name)', async () => {
    const streamed = await readRinexClockSeries([V304], 'G05', { sourceName: 'x' });
    expect(streamed).toEqual(rinexClockSeries(parseRinexClock(V304, { sourceName: 'x' }), 'G05'));
    // The gap at 00:01:00 GPS (fictional-304.clk, SOURCE.md) is 60 s after the first epoch 00:00:00.
    expect(streamed.gaps).toEqual([{ index: 2, missing: 1, line: 12, time: 60, epoch: streamed.epoch.plus(60) }]);
    expect(formatFileEpoch(createTimeScales(BUNDLED_LEAP_SECONDS), streamed.gaps[0]!.epoch, 'GPS')).toBe(
      '2026-01-04T00:01:00',
    );
  });
});

describe('parseRinexClock: refusals with file:line:column (fixed columns of the format)', () => {
  const src = { sourceName: 'c.clk' };
  const in304 = (...records: string[]) => parseRinexClock(`${H304}\n${records.join('\n')}\n`, src);
  const in200 = (...records: string[]) => parseRinexClock(`${H200}\n${records.join('\n')}\n`, src);

  it('parseRinexClock refuses a record cut inside the bias value (… 1   -0.1234) instead of reading a different number', () => {
    expectParseError(
      () => in304('AS G05       2026 01 04 00 00  0.000000  1   -0.1234'),
      7,
      46,
      /^c\.clk:7:46: expected clock bias \(s\) \(value 1 of 1, E19\.12 in columns 46-64\): a complete number in exponent form/,
    );
    expectParseError(
      () => in200('AS G12  2026 01 04 00 05  0.000000  1   -0.1234'),
      4,
      41,
      /clock bias \(s\) \(value 1 of 1, E19\.12 in columns 41-59\)/,
    );
    expectParseError(
      () => in304('AS G05       2026 01 04 00 00  0.000000  1   -0.123456789012E-0'),
      7,
      46,
      /exponent form/,
    );
  });
  it('parseRinexClock refuses a record cut inside or before the sigma field', () => {
    expectParseError(
      () => in304(AS304.slice(0, 75)),
      7,
      68,
      /bias sigma \(s\) \(value 2 of 2, E19\.12 in columns 67-85\): a complete number in exponent form/,
    );
    expectParseError(
      () => in304(AS304.slice(0, 64)),
      7,
      65,
      /bias sigma \(s\) \(value 2 of 2.*the line ends before it \(record cut\)/,
    );
    expectParseError(
      () => in200(AS200.slice(0, 70)),
      4,
      62,
      /bias sigma \(s\) \(value 2 of 2, E19\.12 in columns 61-79\)/,
    );
  });
  it('parseRinexClock refuses a value outside its field, more values than declared, and a continuation line cut or misplaced', () => {
    expectParseError(
      () => in304('AS G05       2026 01 04 00 00  0.000000  1     -0.123456789012E-03'),
      7,
      48,
      /a field ending in column 64; it ends in column 66/,
    );
    expectParseError(
      () => in304('AS G05       2026 01 04 00 00  0.000000  1   -0.123456789012E-03   0.100000000000E-10'),
      7,
      68,
      /no more than 1 value\(s\) on this line/,
    );
    const rec3 = 'AS G05       2026 01 04 00 00  0.000000  3   -0.123456789012E-03   0.100000000000E-10';
    expectParseError(
      () => in304(rec3, '    0.1000'),
      8,
      5,
      /clock rate \(value 3 of 3, E19\.12 in columns 4-22\) \(continuation of the record on line 7\)/,
    );
    expectParseError(() => in304(rec3, '0.100000000000E-12'), 8, 1, /it ends in column 18/);
    expectParseError(() => in304(rec3), 8, undefined, /continuation line of the record on line 7/);
  });
  it('parseRinexClock refuses bad fixed fields: record type, name, epoch, number of values', () => {
    expectParseError(() => in304(`XX${AS304.slice(2)}`), 7, 1, /record type AS, AR, CR, DR or MS/);
    expectParseError(
      () => in304('AS G05 2026 01 04 00 00  0.000000  1   -0.1E-03'),
      7,
      4,
      /name in columns 4-12 \(A9, RINEX clock 3\.04\)/,
    );
    expectParseError(
      () => in304(AS304.replace('2026 01', '20x6 01')),
      7,
      14,
      /epoch year \(an integer in columns 14-17\)/,
    );
    expectParseError(
      () => in200('AS G12 2026 01 04 00 05  0.000000  1    0.456700000000E-04'),
      4,
      4,
      /name in columns 4-7 \(A4, RINEX clock 2\.00\) followed by a blank/,
    );
    expectParseError(() => in304(AS304.replace('2026 01 04', '2026 13 04')), 7, 14, /valid epoch/);
    expectParseError(
      () => in304(AS304.replace('  2   -0.1', '  7   -0.1')),
      7,
      40,
      /number of data values from 1 to 6 in columns 40-42/,
    );
    expectParseError(
      () => in304(AS304.replace(' 0.000000', ' 0.0000x0')),
      7,
      30,
      /epoch second \(F10\.6 in columns 30-39\)/,
    );
  });
  it('parseRinexClock never lets a lone CR after END OF HEADER swallow the next record: refused at 6:79, or read as a line end', () => {
    // Which of the two happens depends on the shared LineSplitter (io/line-reader.ts, owned elsewhere): if it ends
    // a line at a lone CR, the record is read in full on line 7; otherwise the reader refuses the CR. Either way the
    // record is not lost.
    const lines = V304.split('\n');
    const merged = [...lines.slice(0, 5), `${lines[5]}\r${lines[6]}`, ...lines.slice(7)].join('\n');
    let file: ReturnType<typeof parseRinexClock> | undefined;
    try {
      file = parseRinexClock(merged, src);
    } catch (e) {
      expect(e).toBeInstanceOf(ParseError);
      expect([(e as ParseError).line, (e as ParseError).column]).toEqual([6, 79]);
      expect((e as ParseError).message).toMatch(
        /a line end of LF or CR LF \(a lone CR inside a line would merge two lines\)/,
      );
    }
    if (file) expect(file.records).toEqual(parseRinexClock(V304, src).records);
  });
  it('RinexClockParser.push refuses a line holding a CR (whatever splitter fed it), with its column', () => {
    const p = new RinexClockParser({ sourceName: 'p' });
    expectParseError(() => p.push({ text: 'AS G05\rAS', lineNumber: 9 }), 9, 7, /lone CR/);
  });
  it('parseRinexClock refuses a bad header: no version line, wrong type or version, a missing END OF HEADER, an empty TIME SYSTEM ID', () => {
    expectParseError(() => parseRinexClock('hello\n', src), 1, 61, /RINEX VERSION \/ TYPE/);
    expect(parseError(() => parseRinexClock('')).line).toBe(1);
    expectParseError(
      () => parseRinexClock('     3.02           O                   G                   RINEX VERSION / TYPE\n', src),
      1,
      21,
      /file type "C"/,
    );
    expectParseError(
      () => parseRinexClock('     4.00           C                   G                   RINEX VERSION / TYPE\n', src),
      1,
      6,
      /version from 2\.00 to 3\.05/,
    );
    expectParseError(() => parseRinexClock(`${H304.split('\n')[0]!}\n`, src), 2, undefined, /END OF HEADER/);
    expectParseError(
      () => parseRinexClock(`${H304.split('\n')[0]}\n${''.padEnd(65)}TIME SYSTEM ID\n`, src),
      2,
      4,
      /time system identifier/,
    );
    expectParseError(
      () => parseRinexClock(`${H304.split('\n')[0]}\nAS G05 stray line\n`, src),
      2,
      61,
      /a header label from column 61/,
    );
  });
});

describe('rinexClockSeries / readRinexClockSeries: one clock on a uniform grid, bounded by MAX_SERIES_SAMPLES', () => {
  const src = { sourceName: 's.clk' };
  it('rinexClockSeries(file, G05) returns the bias as phase with NaN at the missing epoch and reports the gap', () => {
    const s = rinexClockSeries(parseRinexClock(V304), 'G05');
    expect([s.tau0, s.phase.length, s.timeSystem]).toEqual([30, 5, 'GPS']);
    expect(Number.isNaN(s.phase[2]!)).toBe(true);
    expect(s.gaps).toEqual([{ index: 2, missing: 1, line: 12, time: s.t[2], epoch: s.epoch.plus(60) }]);
  });
  it('rinexClockSeries rejects an unknown clock (listing those present), repeated epochs and a name with both AS and AR records', () => {
    const unknownClock = (() => {
      try {
        rinexClockSeries(parseRinexClock(V304), 'E11');
      } catch (e) {
        return e;
      }
      return undefined;
    })();
    // Asking for a clock the file does not hold is an argument error, not a fault of the file.
    expect(unknownClock).toBeInstanceOf(InvalidArgumentError);
    expect((unknownClock as InvalidArgumentError).argument).toBe('name');
    expect((unknownClock as InvalidArgumentError).message).toMatch(
      /rinex-clock holds; received "E11"\. The clocks present: G05, KLMN00XYZ$/,
    );
    const text = `${H304}\n${AS304}\n${AS304}\n`;
    expectParseError(
      () => rinexClockSeries(parseRinexClock(text, src), 'G05'),
      8,
      4,
      /epoch later than the previous G05 record \(line 7\)/,
    );
    const both = `${H304}\n${AS304}\n${AS304.replace('AS', 'AR').replace(' 0.000000', '30.000000')}\n`;
    expectParseError(() => rinexClockSeries(parseRinexClock(both, src), 'G05'), 8, 1, /both AS and AR/);
  });
  it('rinexClockSeries(steps of 30 s then 45 s) refuses the 45 s step at its line, naming the epoch by its seconds after the first epoch, not by a count since 1980', () => {
    const at = (hhmmss: string) => AS304.replace('00 00  0.000000', hhmmss);
    const text = `${H304}\n${at('00 00  0.000000')}\n${at('00 00 30.000000')}\n${at('00 01 15.000000')}\n`;
    const e = expectParseError(() => rinexClockSeries(parseRinexClock(text, src), 'G05'), 9, 1, /whole multiple/);
    // 00:01:15 is 75 s after 00:00:00 (hand computation [C]); the first G05 record is on line 7.
    expect(e.message).toMatch(/; found "75 s after the epoch of line 7"$/);
  });
  it('readRinexClockSeries refuses a year-9999 epoch before allocating the series, naming file, line, the gap and the limit', async () => {
    const far = AS304.replace('2026 01 04 00 00', '9999 12 31 00 00');
    const text = `${H304}\n${AS304}\n${AS304.replace(' 0.000000', '30.000000')}\n${far}\n`;
    const gap = (Date.UTC(9999, 11, 31) - Date.UTC(2026, 0, 4, 0, 0, 30)) / 1000;
    let caught: unknown;
    try {
      await readRinexClockSeries([text], 'G05', src);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ParseError);
    const e = caught as ParseError;
    expect([e.sourceName, e.line]).toEqual(['s.clk', 9]);
    expect(e.message).toContain(
      `at most ${MAX_SERIES_SAMPLES} samples (MAX_SERIES_SAMPLES): the gap of ${gap} s after line 8 is `,
    );
    expect(e.message).toMatch(/steps of tau0 = 30 s/);
    expectParseError(() => rinexClockSeries(parseRinexClock(text, src), 'G05'), 9, 1, /MAX_SERIES_SAMPLES/);
  });
  it('readRinexClockSeries keeps only the chosen clock: a stream of 50 000 records of other clocks leaves one sample (the file is never held whole)', async () => {
    let pulled = 0;
    function* file(): Generator<string> {
      yield `${H304}\n${AS304}\n`;
      for (let k = 0; k < 500; k++) {
        let chunk = '';
        for (let j = 0; j < 100; j++)
          chunk += `${AS304.replace('G05      ', `G${String(10 + (j % 80)).padStart(2, '0')}      `)}\n`;
        pulled++;
        yield chunk;
      }
    }
    const s = await readRinexClockSeries(file(), 'G05');
    expect(pulled).toBe(500);
    expect([s.phase.length, s.tau0]).toEqual([1, undefined]);
  });
});

describe('parseRinexClock: seeded mutation guard per layout (2000 inputs each)', () => {
  const pieces = [' ', '0', '9', '.', '-', 'E', 'D', '+', '\n', '\r', 'AS', 'AR', '1e400', 'E+400', '9999', 'x', '  6'];
  /** Every accepted file must give finite values, and its series (when it has two epochs) finite samples or NaN gaps. */
  function check(text: string): void {
    const f = parseRinexClock(text);
    for (const r of f.records) {
      for (const v of [r.bias, r.biasSigma, r.rate, r.rateSigma, r.acceleration, r.accelerationSigma]) {
        if (v !== undefined) expect(Number.isFinite(v)).toBe(true);
      }
    }
    const first = f.records[0];
    if (first) {
      const s = rinexClockSeries(f, first.name, { type: first.type });
      // A plain loop: a mutated seconds field can make a legal series of millions of samples.
      let finite = true;
      for (let i = 0; i < s.t.length; i++)
        finite &&= Number.isFinite(s.t[i]!) && (s.phase[i] === s.phase[i] ? Number.isFinite(s.phase[i]!) : true);
      expect(finite).toBe(true);
    }
  }
  for (const [name, text] of [
    ['2.00', V200],
    ['3.02', V302],
    ['3.04', V304],
    ['3.05', V305],
  ] as const) {
    it(`parseRinexClock(mutated ${name} file) returns finite values or throws a Tauline error, for 2000 seeded mutations`, () => {
      fc.assert(
        fc.property(fc.nat({ max: 1 << 20 }), fc.constantFrom(...pieces), fc.nat({ max: 4 }), (pos, piece, del) => {
          const at = pos % text.length;
          try {
            check(text.slice(0, at) + piece + text.slice(at + del));
          } catch (e) {
            if (!(e instanceof TaulineError)) throw e;
          }
        }),
        { seed: 20261203, numRuns: 2000 },
      );
    });
  }
});
