import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import { parseError } from './parse-errors.js';
import { parseRinexClock, readRinexClock, rinexClockSeries } from '../../src/io/index.js';

const fixture = (name: string) => readFileSync(new URL(`../../../../test/fixtures/rinex-clock/${name}`, import.meta.url), 'utf8');


const HEADER = [
  '     3.04           C                   G                   RINEX VERSION / TYPE',
  '                                                            END OF HEADER',
].join('\n');

describe('parseRinexClock (RINEX clock format 2.00–3.04, Ray, Gurtner & Coleman, IGS)', () => {
  it('parseRinexClock(3.04 file) reads version, system, TIME SYSTEM ID and the AS/AR records with all their values', () => {
    const f = parseRinexClock(fixture('fictional-304.clk'), 'fictional-304.clk');
    expect(f.header).toEqual({ version: 3.04, satelliteSystem: 'G', timeSystem: 'GPS', lines: 6 });
    expect(f.records.length).toBe(5);
    expect(f.otherRecords).toEqual({ CR: 1 });
    const ar = f.records[1]!;
    expect(ar).toMatchObject({ type: 'AR', name: 'KLMN00XYZ', bias: 0.512e-6, biasSigma: 0.2e-10, rate: 0.1e-12, rateSigma: 0.3e-14,
      acceleration: -0.1e-17, accelerationSigma: 0.1e-18, line: 8 });
    expect(f.records[2]).toMatchObject({ type: 'AS', name: 'G05', bias: -0.123456789e-3, biasSigma: undefined, line: 10 });
    expect(f.records[2]!.epoch).toEqual({ year: 2026, month: 1, day: 4, hour: 0, minute: 0, second: 30 });
  });
  it('parseRinexClock(2.00 file) reads 4-character names and a 4-value record', () => {
    const f = parseRinexClock(fixture('fictional-200.clk'));
    expect(f.header.version).toBe(2);
    expect(f.header.timeSystem).toBeUndefined();
    expect(f.records.map((r) => [r.name, r.rate])).toEqual([['QRST', undefined], ['QRST', 0.1e-12]]);
  });
  it('parseRinexClock(truncated record) is a ParseError naming the record line, not a partial record', () => {
    const e = parseError(() => parseRinexClock(fixture('truncated-304.clk'), 'truncated-304.clk'));
    expect(e.sourceName).toBe('truncated-304.clk');
    expect(e.message).toMatch(/record on line 12/);
  });
  it('rinexClockSeries(file, G05) returns the bias as phase with NaN at the missing epoch and reports the gap', () => {
    const s = rinexClockSeries(parseRinexClock(fixture('fictional-304.clk')), 'G05');
    expect(s.tau0).toBe(30);
    expect(s.phase.length).toBe(5);
    expect(Number.isNaN(s.phase[2]!)).toBe(true);
    expect(s.gaps).toEqual([{ index: 2, missing: 1, line: 12, time: s.times[2] }]);
    expect(s.timeSystem).toBe('GPS');
  });
  it('rinexClockSeries rejects an unknown clock name', () => {
    expect(parseError(() => rinexClockSeries(parseRinexClock(fixture('fictional-304.clk')), 'E11')).message).toMatch(/G05/);
  });
  it('rinexClockSeries rejects repeated epochs and a name with both AS and AR records', () => {
    const rec = 'AS G01 2026 01 04 00 00  0.000000  1   -0.1E-03';
    expect(parseError(() => rinexClockSeries(parseRinexClock(`${HEADER}\n${rec}\n${rec}\n`), 'G01')).line).toBe(4);
    const both = `${HEADER}\n${rec}\nAR G01 2026 01 04 00 00 30.000000  1   -0.1E-03\n`;
    expect(parseError(() => rinexClockSeries(parseRinexClock(both), 'G01')).message).toMatch(/both AS and AR/);
  });
  it('parseRinexClock rejects a file without a version line, a wrong file type or version, and a missing END OF HEADER', () => {
    expect(parseError(() => parseRinexClock('hello\n')).line).toBe(1);
    expect(parseError(() => parseRinexClock('')).line).toBe(1);
    expect(parseError(() => parseRinexClock('     3.04           O                   G                   RINEX VERSION / TYPE\n')).column).toBe(21);
    expect(parseError(() => parseRinexClock('     9.00           C                   G                   RINEX VERSION / TYPE\n')).column).toBe(6);
    expect(parseError(() => parseRinexClock('     3.04           C                   G                   RINEX VERSION / TYPE\n')).expected).toMatch(/END OF HEADER/);
    expect(parseError(() => parseRinexClock('     3.04           C                   G                   RINEX VERSION / TYPE\n' +
      '                                                            TIME SYSTEM ID\n')).line).toBe(2);
  });
  it('parseRinexClock rejects bad data records with line and column: type, short record, epoch, count, number, extra values, bad continuation', () => {
    const bad = (rec: string) => parseError(() => parseRinexClock(`${HEADER}\n${rec}\n`));
    expect(bad('XX G01 2026 01 04 00 00  0.000000  1   -0.1E-03').column).toBe(1);
    expect(bad('AS G01 2026 01 04').line).toBe(3);
    expect(bad('AS G01 2026 13 04 00 00  0.000000  1   -0.1E-03').column).toBe(8);
    expect(bad('AS G01 2026 01 04 00 00  0.000000  7   -0.1E-03').column).toBe(36);
    expect(bad('AS G01 2026 01 04 00 00  0.000000  1   -0.1Q-03').column).toBe(40);
    expect(bad('AS G01 2026 01 04 00 00  0.000000  1   -0.1E-03 0.1E-10').column).toBe(49);
    expect(bad('AS G01 2026 01 04 00 00  0.000000  2   -0.1E-03').expected).toMatch(/2 value/);
    const cont = parseError(() => parseRinexClock(`${HEADER}\nAS G01 2026 01 04 00 00  0.000000  3   -0.1E-03 0.1E-10\n 0.1E-12 0.2E-12\n`));
    expect([cont.line, cont.column]).toEqual([4, 10]);
  });
  it('readRinexClock(async chunks) equals parseRinexClock(string)', async () => {
    const text = fixture('fictional-304.clk');
    async function* chunks() {
      for (let i = 0; i < text.length; i += 13) yield text.slice(i, i + 13);
    }
    expect(await readRinexClock(chunks(), 'x')).toEqual(parseRinexClock(text, 'x'));
  });
  it('parseRinexClock(mutated or truncated input) throws only ParseError and never hangs (fast-check fuzz)', () => {
    const base = fixture('fictional-304.clk');
    fc.assert(fc.property(fc.nat(base.length), fc.string({ maxLength: 3 }), fc.nat(base.length), (at, insert, cut) => {
      const text = (base.slice(0, at) + insert + base.slice(at + insert.length)).slice(0, Math.max(cut, 1));
      try {
        parseRinexClock(text);
      } catch (e) {
        expect(e).toBeInstanceOf(ParseError);
      }
    }), { seed: 20261202, numRuns: 400 });
  });
});
