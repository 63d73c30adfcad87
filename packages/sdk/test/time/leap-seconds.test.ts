import { describe, expect, it } from 'vitest';
import { InvalidArgumentError, OutOfDomainError, ParseError } from '../../src/errors.js';
import {
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  defineLeapSecondTable,
  mjdFromCalendarDate,
  parseLeapSecondsList,
} from '../../src/time/index.js';

/** An invented table: one extra (fictional) leap second at the end of 2030, valid to 2031-07-01. */
const fictional = defineLeapSecondTable({
  entries: [...BUNDLED_LEAP_SECONDS.entries, { mjd: mjdFromCalendarDate(2031, 1, 1), taiMinusUtc: 38 }],
  validUntilMjd: mjdFromCalendarDate(2031, 7, 1),
  source: 'invented for tests: fictional leap second 2030-12-31',
});

describe('leap-second tables', () => {
  it('BUNDLED_LEAP_SECONDS runs from 10 s (1972-01-01) to 37 s (2017-01-01) in 28 steps of +1 s, valid until 2027-06-28', () => {
    const { entries, validUntilMjd } = BUNDLED_LEAP_SECONDS;
    expect(entries.length).toBe(28);
    expect(entries[0]).toEqual({ mjd: 41_317, taiMinusUtc: 10 });
    expect(entries[27]).toEqual({ mjd: 57_754, taiMinusUtc: 37 });
    expect(validUntilMjd).toBe(mjdFromCalendarDate(2027, 6, 28));
    expect(Object.isFrozen(BUNDLED_LEAP_SECONDS) && Object.isFrozen(entries)).toBe(true);
  });

  it('createTimeScales(table) with a user table applies its extra (fictional) leap second and its own validity', () => {
    const ts = createTimeScales(fictional);
    expect(ts.taiMinusUtc(ts.parseIso('2030-12-31T23:59:60.5Z'))).toBe(37);
    expect(ts.taiMinusUtc(ts.parseIso('2031-01-01T00:00:00Z'))).toBe(38);
    expect(ts.parseIso('2031-01-01T00:00:00Z').secondsSince(ts.parseIso('2030-12-31T23:59:59Z'))).toBe(2);
    expect(() => ts.parseIso('2031-07-01T00:00:00Z')).toThrow(OutOfDomainError);
    // The bundled table does not cover 2030 at all.
    expect(() => createTimeScales(BUNDLED_LEAP_SECONDS).parseIso('2030-12-31T00:00:00Z')).toThrow(OutOfDomainError);
  });

  it('defineLeapSecondTable accepts a negative leap second (never used so far) and the day then has 86 399 s', () => {
    const table = defineLeapSecondTable({
      entries: [...BUNDLED_LEAP_SECONDS.entries, { mjd: mjdFromCalendarDate(2030, 7, 1), taiMinusUtc: 36 }],
      validUntilMjd: mjdFromCalendarDate(2031, 1, 1),
      source: 'invented for tests: fictional negative leap second 2030-06-30',
    });
    const ts = createTimeScales(table);
    expect(ts.parseIso('2030-07-01T00:00:00Z').secondsSince(ts.parseIso('2030-06-30T23:59:58Z'))).toBe(1);
    expect(ts.formatIso(ts.parseIso('2030-06-30T23:59:58.5Z').plus(0.5))).toBe('2030-07-01T00:00:00.000000000Z');
    expect(() => ts.parseIso('2030-06-30T23:59:59Z')).toThrow(
      /removes the last second of 2030-06-30 \(a negative leap second\)/,
    );
  });

  it('parseLeapSecondsList(text) reads the NTP-second format with its #@ expiry line', () => {
    const text = [
      '# comment',
      '#@\t4023129600',
      '2272060800\t10\t# 1 Jan 1972',
      '2287785600\t11\t# 1 Jul 1972',
      '',
      '3692217600\t37\t# 1 Jan 2017',
    ].join('\n');
    // 37 − 11 is not one step, so this excerpt must fail validation ...
    expect(() => parseLeapSecondsList(text)).toThrow(/entries\[2\]\.taiMinusUtc/);
    // ... and with consecutive lines it parses.
    const table = parseLeapSecondsList(text.replace('3692217600\t37', '2303683200\t12'), 'excerpt.list');
    expect(table.entries.map((e) => [e.mjd, e.taiMinusUtc])).toEqual([
      [41_317, 10],
      [41_499, 11],
      [41_683, 12],
    ]);
    expect(table.validUntilMjd).toBe(mjdFromCalendarDate(2027, 6, 28));
    expect(table.source).toBe('excerpt.list (expires 2027-06-28)');
  });

  describe('throw paths', () => {
    const good = { entries: [{ mjd: 41_317, taiMinusUtc: 10 }], validUntilMjd: 41_400, source: 'test' };
    it('defineLeapSecondTable rejects a non-object and an empty entry list', () => {
      expect(() => defineLeapSecondTable(null as unknown as typeof good)).toThrow(/table must be an object/);
      expect(() => defineLeapSecondTable({ ...good, entries: [] })).toThrow(/entries must be a non-empty array/);
      expect(() =>
        defineLeapSecondTable({ ...good, entries: [5 as unknown as { mjd: number; taiMinusUtc: number }] }),
      ).toThrow(/entries\[0\] must be an object/);
    });
    it('defineLeapSecondTable rejects an entry before 1972 (rubber seconds), one not on the 1st of a month, and a fractional offset', () => {
      expect(() => defineLeapSecondTable({ ...good, entries: [{ mjd: 41_000, taiMinusUtc: 10 }] })).toThrow(
        /not modelled/,
      );
      expect(() => defineLeapSecondTable({ ...good, entries: [{ mjd: 41_318, taiMinusUtc: 10 }] })).toThrow(
        /first day of a month.*1972-01-02/,
      );
      expect(() => defineLeapSecondTable({ ...good, entries: [{ mjd: 41_317, taiMinusUtc: 10.5 }] })).toThrow(
        /entries\[0\]\.taiMinusUtc/,
      );
    });
    it('defineLeapSecondTable rejects entries out of order and steps other than ±1 s', () => {
      expect(() =>
        defineLeapSecondTable({
          ...good,
          entries: [
            { mjd: 41_499, taiMinusUtc: 11 },
            { mjd: 41_317, taiMinusUtc: 10 },
          ],
        }),
      ).toThrow(/entries\[1\]\.mjd must be an MJD after/);
      expect(() =>
        defineLeapSecondTable({
          ...good,
          entries: [
            { mjd: 41_317, taiMinusUtc: 10 },
            { mjd: 41_499, taiMinusUtc: 12 },
          ],
        }),
      ).toThrow(/entries\[1\]\.taiMinusUtc must be 11 or 9/);
    });
    it('defineLeapSecondTable rejects a validity end not after the last entry and an empty source', () => {
      expect(() => defineLeapSecondTable({ ...good, validUntilMjd: 41_317 })).toThrow(/validUntilMjd/);
      expect(() => defineLeapSecondTable({ ...good, source: ' ' })).toThrow(/source/);
    });
    it('parseLeapSecondsList rejects non-text, a bad expiry line, a time that is not midnight, a malformed data line and a missing expiry', () => {
      expect(() => parseLeapSecondsList(42 as unknown as string)).toThrow(InvalidArgumentError);
      expect(() => parseLeapSecondsList('#@ soon\n')).toThrow(ParseError);
      expect(() => parseLeapSecondsList('#@ soon\n')).toThrow(/leap-seconds\.list:1:3: expected an expiry line/);
      expect(() => parseLeapSecondsList('#@ 4023129600\n2272060801 10 # 1 Jan 1972', 'x.list')).toThrow(
        /x\.list:2:1: expected NTP seconds of 00:00:00/,
      );
      expect(() => parseLeapSecondsList('#@ 4023129600\n2272060800 ten\n')).toThrow(/:2:1: expected a data line/);
      expect(() => parseLeapSecondsList('2272060800 10 # 1 Jan 1972\n')).toThrow(/expiry line/);
    });
  });
});
