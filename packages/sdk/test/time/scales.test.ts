import { describe, expect, it } from 'vitest';
import { InvalidArgumentError, OutOfDomainError } from '../../src/errors.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales, Instant, TIME_SCALES, type TimeScale } from '../../src/time/index.js';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const utc = (text: string): Instant => ts.parseIso(text);

describe('createTimeScales(table): scale offsets', () => {
  it('ts.taiMinusUtc(t) is 10 s in 1972, 25 s in mid-1990, 32 s on 2000-01-01, 37 s in 2024 (IERS list [V2])', () => {
    expect(ts.taiMinusUtc(utc('1972-01-01T00:00:00Z'))).toBe(10);
    expect(ts.taiMinusUtc(utc('1990-06-01T12:00:00Z'))).toBe(25);
    expect(ts.taiMinusUtc(utc('2000-01-01T00:00:00Z'))).toBe(32);
    expect(ts.taiMinusUtc(utc('2024-06-01T00:00:00Z'))).toBe(37);
  });

  it('ts.offset(scale, reference, t) gives TT − UTC = 69.184 s, GPS − UTC = 18 s, GST − UTC = 18 s, BDT − UTC = 4 s in 2024', () => {
    const t = utc('2024-03-01T00:00:00Z');
    expect(ts.offset('TT', 'UTC', t)).toBeCloseTo(69.184, 12);
    expect(ts.offset('GPS', 'UTC', t)).toBe(18);
    expect(ts.offset('GST', 'UTC', t)).toBe(18);
    expect(ts.offset('BDT', 'UTC', t)).toBe(4);
    expect(ts.offset('UTC', 'TAI', t)).toBe(-37);
  });

  it('ts.offset gives the constant offsets at any date: TT − TAI = 32.184, GPS − TAI = −19, BDT − GPS = −14, GST − GPS = 0', () => {
    for (const t of [utc('1985-01-01T00:00:00Z'), Instant.fromTaiParts(3e9, 0.5)]) {
      expect(ts.offset('TT', 'TAI', t)).toBe(32.184);
      expect(ts.offset('GPS', 'TAI', t)).toBe(-19);
      expect(ts.offset('BDT', 'GPS', t)).toBe(-14);
      expect(ts.offset('GST', 'GPS', t)).toBe(0);
      expect(ts.offset('TAI', 'TAI', t)).toBe(0);
    }
  });

  it('ts.offset(TCG, TT, t) is 0 at 1977-01-01T00:00:00 TAI and grows by L_G/(1−L_G)·86400 = 60.2147 µs per day', () => {
    const t0 = ts.fromCalendar({ year: 1977, month: 1, day: 1 }, 'TAI');
    expect(Math.abs(ts.offset('TCG', 'TT', t0))).toBeLessThan(1e-15);
    const perDay = ts.offset('TCG', 'TT', t0.plus(86_400));
    expect(perDay * 1e6).toBeCloseTo(60.2147, 4);
    expect(ts.offset('TCG', 'TAI', t0)).toBe(32.184);
  });

  it('ts.formatIso(t, { scale }) reads one instant on every scale', () => {
    const t = utc('2024-03-01T00:00:00Z');
    const read = (scale: TimeScale) => ts.formatIso(t, { scale, fractionDigits: 3 });
    expect(TIME_SCALES.map(read)).toEqual([
      '2024-03-01T00:00:37.000',
      '2024-03-01T00:01:09.184',
      '2024-03-01T00:00:00.000Z',
      '2024-03-01T00:00:18.000',
      '2024-03-01T00:00:18.000',
      '2024-03-01T00:00:04.000',
      expect.stringMatching(/^2024-03-01T00:01:10\.\d{3}$/),
    ]);
  });
});

describe('createTimeScales(table): the leap second 2016-12-31T23:59:60Z', () => {
  it('ts.parseIso accepts 23:59:60 and TAI − UTC is 36 s through it and 37 s after', () => {
    expect(ts.taiMinusUtc(utc('2016-12-31T23:59:59Z'))).toBe(36);
    expect(ts.taiMinusUtc(utc('2016-12-31T23:59:60Z'))).toBe(36);
    expect(ts.taiMinusUtc(utc('2016-12-31T23:59:60.999999999Z'))).toBe(36);
    expect(ts.taiMinusUtc(utc('2017-01-01T00:00:00Z'))).toBe(37);
  });

  it('the UTC minute 23:59 of 2016-12-31 lasts 61 SI seconds, and 23:59:59 → 00:00:00 spans 2 s', () => {
    expect(utc('2017-01-01T00:00:00Z').secondsSince(utc('2016-12-31T23:59:00Z'))).toBe(61);
    expect(utc('2017-01-01T00:00:00Z').secondsSince(utc('2016-12-31T23:59:59Z'))).toBe(2);
    expect(utc('2016-12-31T23:59:60Z').toString()).toBe('2017-01-01T00:00:36.000000000000 TAI');
  });

  it('ts.isLeapSecond(t) is true only inside 23:59:60', () => {
    expect(ts.isLeapSecond(utc('2016-12-31T23:59:60.5Z'))).toBe(true);
    expect(ts.isLeapSecond(utc('2016-12-31T23:59:59.5Z'))).toBe(false);
    expect(ts.isLeapSecond(utc('2017-01-01T00:00:00Z'))).toBe(false);
  });

  it('ts.toCalendar(t, UTC) reads second 60.25 inside the leap second; ts.fromCalendar inverts it', () => {
    const t = utc('2016-12-31T23:59:60.25Z');
    const fields = ts.toCalendar(t, 'UTC');
    expect(fields).toEqual({ year: 2016, month: 12, day: 31, hour: 23, minute: 59, second: 60.25 });
    expect(ts.fromCalendar(fields, 'UTC').equals(t)).toBe(true);
  });

  it('ts.formatIso rounds 23:59:59.9999999999 up into 23:59:60 and 23:59:60.9999999999 up into the next day', () => {
    expect(ts.formatIso(utc('2016-12-31T23:59:59.9999999999Z'))).toBe('2016-12-31T23:59:60.000000000Z');
    expect(ts.formatIso(utc('2016-12-31T23:59:60.9999999999Z'))).toBe('2017-01-01T00:00:00.000000000Z');
    expect(ts.formatIso(utc('2016-12-30T23:59:59.9999999999Z'))).toBe('2016-12-31T00:00:00.000000000Z');
  });

  it('ts.parseIso accepts the leap second in local time with an offset (2017-01-01T08:59:60+09:00)', () => {
    expect(ts.parseIso('2017-01-01T08:59:60.5+09:00').equals(utc('2016-12-31T23:59:60.5Z'))).toBe(true);
    expect(ts.parseIso('2016-12-31T18:29:60-0530').equals(utc('2016-12-31T23:59:60Z'))).toBe(true);
  });

  it('ts.toMjd(t, UTC) uses an 86 401 s day on a leap-second day (quasi-MJD convention [M])', () => {
    const mjd = ts.toMjd(utc('2016-12-31T23:59:60.5Z'), 'UTC');
    expect(mjd.day).toBe(57_753);
    expect(mjd.fraction).toBeCloseTo(86_400.5 / 86_401, 15);
    expect(ts.fromMjd('UTC', mjd.day, mjd.fraction).equals(utc('2016-12-31T23:59:60.5Z'), 1e-10)).toBe(true);
    expect(ts.toMjd(utc('2016-12-31T12:00:00Z'), 'UTC').fraction).toBeCloseTo(43_200 / 86_401, 15);
    expect(ts.toMjd(utc('2016-12-30T12:00:00Z'), 'UTC').fraction).toBe(0.5);
  });
});

describe('createTimeScales(table): MJD and JD', () => {
  it('ts.toJd(t, TT) of 2000-01-01T12:00:00 TT is 2451545.0 (J2000.0) and ts.toMjd is 51544.5', () => {
    const j2000 = ts.fromCalendar({ year: 2000, month: 1, day: 1, hour: 12 }, 'TT');
    expect(ts.toJd(j2000, 'TT')).toEqual({ day: 2_451_545, fraction: 0, value: 2_451_545 });
    expect(ts.toMjd(j2000, 'TT')).toEqual({ day: 51_544, fraction: 0.5, value: 51_544.5 });
    expect(ts.fromJd('TT', 2_451_545).equals(j2000)).toBe(true);
    expect(ts.fromMjd('TT', 51_544, 0.5).equals(j2000)).toBe(true);
  });

  it('ts.fromJd(scale, day, fraction) keeps 1e-11 s precision that a single float JD (40 µs) cannot', () => {
    const a = ts.fromJd('TAI', 2_460_000, 0.5 + 1e-12); // 1e-12 day = 86.4 ns
    const b = ts.fromJd('TAI', 2_460_000.5);
    // A fraction of day in one double resolves 2⁻⁵³ day ≈ 1e-11 s: that is the limit here.
    expect(Math.abs(a.secondsSince(b) - 86.4e-9)).toBeLessThan(1e-11);
    const mjd = ts.toMjd(a, 'TAI');
    expect(mjd.day).toBe(60_000);
    expect(Math.abs(mjd.fraction - 1e-12)).toBeLessThan(2e-16);
  });

  it('ts.fromMjd carries whole days from the fraction, and fractions that round to a full day become the next midnight', () => {
    expect(ts.fromMjd('GPS', 60_000, 1.25).equals(ts.fromMjd('GPS', 60_001.25))).toBe(true);
    expect(ts.fromMjd('GPS', 60_000, 1 - 1e-17).equals(ts.fromMjd('GPS', 60_001))).toBe(true);
    expect(ts.fromMjd('GPS', 60_000, -0.5).equals(ts.fromMjd('GPS', 59_999.5))).toBe(true);
  });
});

describe('createTimeScales(table): ISO 8601 text', () => {
  it('ts.parseIso accepts fraction digits beyond 1e-9 s and a comma decimal sign', () => {
    const a = utc('2020-02-29T12:34:56.123456789012Z');
    const b = utc('2020-02-29T12:34:56Z');
    expect(a.secondsSince(b)).toBeCloseTo(0.123456789012, 15);
    expect(utc('2020-02-29T12:34:56,5Z').secondsSince(b)).toBe(0.5);
  });

  it('ts.parseIso applies ±hh:mm, ±hhmm and ±hh offsets (local = UTC + offset), crossing midnight', () => {
    const ref = utc('2020-03-01T01:30:00Z');
    for (const text of [
      '2020-03-01T03:30:00+02:00',
      '2020-03-01T03:30:00+0200',
      '2020-03-01T03:30:00+02',
      '2020-02-29T20:30:00-05:00',
    ]) {
      expect(ts.parseIso(text).equals(ref)).toBe(true);
    }
  });

  it('ts.parseIso(text, scale) reads a GPS / TT / TCG reading without a designator', () => {
    const t = ts.parseIso('2024-03-01T00:00:18', 'GPS');
    expect(ts.formatIso(t)).toBe('2024-03-01T00:00:00.000000000Z');
    expect(ts.parseIso('2000-01-01T12:00:00', 'TT').equals(ts.fromJd('TT', 2_451_545))).toBe(true);
    const tcg = ts.parseIso('2023-02-24T12:00:00', 'TCG');
    expect(ts.formatIso(tcg, { scale: 'TCG', fractionDigits: 12 })).toBe('2023-02-24T12:00:00.000000000000');
  });

  it('ts.formatIso(t, { fractionDigits }) prints 0..12 digits, rounding half up', () => {
    const t = utc('2020-01-01T00:00:00.1234567894999Z');
    expect(ts.formatIso(t, { fractionDigits: 0 })).toBe('2020-01-01T00:00:00Z');
    expect(ts.formatIso(t, { fractionDigits: 3 })).toBe('2020-01-01T00:00:00.123Z');
    expect(ts.formatIso(t)).toBe('2020-01-01T00:00:00.123456789Z');
    expect(ts.formatIso(t, { fractionDigits: 12 })).toBe('2020-01-01T00:00:00.123456789500Z');
  });

  it('ts.toCalendar(t, scale) never rounds a fraction just below 1 s up into second 60', () => {
    const t = Instant.fromTaiParts(59, 1 - 2 ** -53);
    const fields = ts.toCalendar(t, 'TAI');
    expect(fields.second).toBeLessThan(60);
    expect(fields.minute).toBe(0);
    expect(ts.fromCalendar(fields, 'TAI').equals(t, 1e-14)).toBe(true);
  });

  it('ts.toCalendar(t, TAI) and ts.fromCalendar(fields, TAI) work for dates far outside the leap-second table', () => {
    const t = ts.fromCalendar({ year: 1900, month: 3, day: 1, hour: 6, minute: 7, second: 8.5 }, 'TAI');
    expect(ts.toCalendar(t, 'TAI')).toEqual({ year: 1900, month: 3, day: 1, hour: 6, minute: 7, second: 8.5 });
    expect(
      ts.formatIso(ts.fromCalendar({ year: 2150, month: 1, day: 1 }, 'GPS'), { scale: 'GPS', fractionDigits: 0 }),
    ).toBe('2150-01-01T00:00:00');
  });
});

describe('createTimeScales(table): validity of the leap-second table', () => {
  it("ts.parseIso throws OutOfDomainError from 2027-06-28T00:00:00Z, the bundled table's validity end, and works just before", () => {
    expect(() => utc('2027-06-28T00:00:00Z')).toThrow(OutOfDomainError);
    expect(() => utc('2027-06-28T00:00:00Z')).toThrow(/only known complete until 2027-06-28; pass a current table/);
    expect(ts.taiMinusUtc(utc('2027-06-27T23:59:59.999999999Z'))).toBe(37);
  });

  it('ts.formatIso / taiMinusUtc throw OutOfDomainError at ts.utcValidUntil, and work 1 ns before', () => {
    expect(ts.utcValidUntil.toString()).toBe('2027-06-28T00:00:37.000000000000 TAI');
    expect(() => ts.formatIso(ts.utcValidUntil)).toThrow(OutOfDomainError);
    expect(() => ts.taiMinusUtc(ts.utcValidUntil)).toThrow(OutOfDomainError);
    expect(ts.formatIso(ts.utcValidUntil.plus(-1e-9))).toBe('2027-06-27T23:59:59.999999999Z');
    // TAI, TT and GNSS readings need no table.
    expect(ts.formatIso(ts.utcValidUntil, { scale: 'GPS', fractionDigits: 0 })).toBe('2027-06-28T00:00:18');
  });

  it('the OutOfDomainError names the span and the argument', () => {
    try {
      utc('2030-01-01T00:00:00Z');
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(OutOfDomainError);
      const e = error as OutOfDomainError;
      expect([e.argument, e.validFrom, e.validTo]).toEqual([
        'text',
        '1972-01-01T00:00:00Z',
        '2027-06-28T00:00:00Z (exclusive)',
      ]);
    }
  });

  it('UTC before 1972 is rejected with OutOfDomainError (rubber seconds not modelled), in both directions', () => {
    expect(() => utc('1971-12-31T23:59:59Z')).toThrow(/rubber seconds/);
    expect(() => ts.formatIso(ts.utcValidFrom.plus(-1e-9))).toThrow(OutOfDomainError);
    expect(ts.formatIso(ts.utcValidFrom)).toBe('1972-01-01T00:00:00.000000000Z');
    expect(() => ts.fromMjd('UTC', 41_316.5)).toThrow(OutOfDomainError);
  });
});

describe('createTimeScales(table): throw paths', () => {
  it('createTimeScales rejects a table that is not valid', () => {
    expect(() => createTimeScales({ entries: [], validUntilMjd: 0, source: 'x' })).toThrow(InvalidArgumentError);
  });

  it('every method rejects an unknown scale and a non-Instant', () => {
    const t = utc('2020-01-01T00:00:00Z');
    const bad = 'UT1' as TimeScale;
    expect(() => ts.offset(bad, 'TAI', t)).toThrow(
      /scale must be one of 'TAI', 'TT', 'UTC', 'GPS', 'GST', 'BDT', 'TCG'/,
    );
    expect(() => ts.offset('TAI', bad, t)).toThrow(/reference must be one of/);
    expect(() => ts.offset('TAI', 'TT', 5 as unknown as Instant)).toThrow(/instant must be an Instant/);
    expect(() => ts.toCalendar(t, bad)).toThrow(/scale/);
    expect(() => ts.toCalendar(null as unknown as Instant, 'TAI')).toThrow(/instant/);
    expect(() => ts.fromCalendar({ year: 2020, month: 1, day: 1 }, bad)).toThrow(/scale/);
    expect(() => ts.parseIso('2020-01-01T00:00:00Z', bad)).toThrow(/scale/);
    expect(() => ts.formatIso(t, { scale: bad })).toThrow(/options\.scale/);
    expect(() => ts.formatIso('2020' as unknown as Instant)).toThrow(/instant/);
    expect(() => ts.toMjd(t, bad)).toThrow(/scale/);
    expect(() => ts.toMjd({} as Instant, 'TT')).toThrow(/instant/);
    expect(() => ts.fromMjd(bad, 0)).toThrow(/scale/);
    expect(() => ts.fromJd(bad, 0)).toThrow(/scale/);
    expect(() => ts.taiMinusUtc(1 as unknown as Instant)).toThrow(/instant/);
    expect(() => ts.isLeapSecond(1 as unknown as Instant)).toThrow(/instant/);
  });

  it('ts.fromCalendar names the field: 31 February, 29 February 2019, month 13, hour 24, minute 60, NaN second, second 61', () => {
    const f =
      (fields: Record<string, number>, scale: TimeScale = 'UTC') =>
      () =>
        ts.fromCalendar(fields as unknown as { year: number; month: number; day: number }, scale);
    expect(f({ year: 2017, month: 2, day: 31 })).toThrow(
      /fields\.day must be an integer in \[1, 28\] for 2017-02; received 31/,
    );
    expect(f({ year: 2019, month: 2, day: 29 })).toThrow(/2019 is not a leap year/);
    expect(f({ year: 2017, month: 13, day: 1 })).toThrow(/fields\.month/);
    expect(f({ year: 10_000, month: 1, day: 1 }, 'TAI')).toThrow(/fields\.year/);
    expect(f({ year: 2017, month: 1, day: 1, hour: 24 })).toThrow(
      /fields\.hour must be an integer in \[0, 23\]; received 24. write 24:00:00 as 00:00:00/,
    );
    expect(f({ year: 2017, month: 1, day: 1, hour: 1.5 })).toThrow(/fields\.hour/);
    expect(f({ year: 2017, month: 1, day: 1, minute: 60 })).toThrow(/fields\.minute/);
    expect(f({ year: 2017, month: 1, day: 1, second: Number.NaN })).toThrow(/fields\.second must be a finite number/);
    expect(f({ year: 2017, month: 1, day: 1, second: -1 })).toThrow(/fields\.second/);
    expect(f({ year: 2016, month: 12, day: 31, hour: 23, minute: 59, second: 61 })).toThrow(/fields\.second/);
    expect(() => ts.fromCalendar(null as unknown as { year: number; month: number; day: number }, 'UTC')).toThrow(
      /fields must be an object/,
    );
  });

  it("second 60 is rejected outside UTC, away from 23:59 UTC, on a day without a leap second, and on the table's last day (out of domain)", () => {
    expect(() => ts.fromCalendar({ year: 2016, month: 12, day: 31, hour: 23, minute: 59, second: 60 }, 'TAI')).toThrow(
      /second 60 exists only in UTC, during a leap second; TAI has none/,
    );
    expect(() => utc('2016-12-31T22:59:60Z')).toThrow(/text\.second must be less than 60 except at 23:59 UTC/);
    expect(() => utc('2016-12-31T23:59:60+01:00')).toThrow(/this local time is 22:59 UTC/);
    expect(() => utc('2016-12-30T23:59:60Z')).toThrow(
      /no leap second at the end of 2016-12-30; its last ones end 2012-06-30, 2015-06-30, 2016-12-31/,
    );
    expect(() => utc('2027-06-27T23:59:60Z')).toThrow(OutOfDomainError);
    expect(() => utc('1971-12-31T23:59:60Z')).toThrow(OutOfDomainError);
  });

  it('ts.parseIso rejects malformed text, naming the field and the expected form', () => {
    expect(() => ts.parseIso(20200101 as unknown as string)).toThrow(/text must be an ISO 8601 string/);
    expect(() => utc('20-01-01T00:00:00Z')).toThrow(/text\.year must be 4 digits YYYY/);
    expect(() => utc('2020/01/01T00:00:00Z')).toThrow(/text must be '-' after the year \(found '\/'/);
    expect(() => utc('2020-1-01T00:00:00Z')).toThrow(/text\.month must be 2 digits MM/);
    expect(() => utc('2020-13-01T00:00:00Z')).toThrow(/text\.month must be an integer in \[1, 12\]/);
    expect(() => utc('2020-01-32T00:00:00Z')).toThrow(/text\.day must be an integer in \[1, 31\]/);
    expect(() => utc('2020-01-01')).toThrow(/date-only text is ambiguous/);
    expect(() => utc('2020-01-01 00:00:00Z')).toThrow(/upper-case 'T'/);
    expect(() => utc('2020-01-01X00:00:00Z')).toThrow(/'T' after the day/);
    expect(() => utc('2020-01-01T24:00:00Z')).toThrow(/text\.hour .* write 24:00:00 as 00:00:00 of the next day/);
    expect(() => utc('2020-01-01T00:60:00Z')).toThrow(/text\.minute/);
    expect(() => utc('2020-01-01T00:00Z')).toThrow(/text must be ':' after the minute/);
    expect(() => utc('2020-01-01T00:00:0Z')).toThrow(/text\.second must be 2 digits ss/);
    expect(() => utc('2020-01-01T00:00:00.Z')).toThrow(/text\.fraction must be one or more digits/);
    expect(() => utc('2020-01-01T00:00:00z')).toThrow(/upper-case 'Z'/);
    expect(() => utc('2020-01-01T00:00:00 UTC')).toThrow(/text\.zone must be Z, ±hh:mm or the end of the text/);
    expect(() => utc('2020-01-01T00:00:00+24:00')).toThrow(/text\.zone must be a UTC offset ±hh:mm with hh ≤ 23/);
    expect(() => utc('2020-01-01T00:00:00+01:60')).toThrow(/text\.zone/);
    expect(() => utc('2020-01-01T00:00:00+1')).toThrow(/text\.zone must be 2 digits hh of the UTC offset/);
    expect(() => utc('2020-01-01T00:00:00Zjunk')).toThrow(/the end of the text after the zone designator/);
    expect(() => utc('2020-01-01T00:00:00')).toThrow(/text\.zone must be a zone designator .*append Z for UTC/);
    expect(() => ts.parseIso('2020-01-01T00:00:00Z', 'GPS')).toThrow(/no zone designator for a GPS reading/);
    expect(() => utc('0000-01-01T00:00:00Z')).toThrow(/text\.year/);
  });

  it('ts.parseIso rejects a time that an offset moves outside the four-digit calendar (OutOfDomainError)', () => {
    expect(() => ts.parseIso('0001-01-01T00:30:00+01:00')).toThrow(/outside the four-digit calendar/);
  });

  it('ts.toCalendar / formatIso reject instants outside years 1..9999', () => {
    const far = Instant.fromTaiParts(9e11);
    expect(() => ts.toCalendar(far, 'TAI')).toThrow(OutOfDomainError);
    expect(() => ts.formatIso(far, { scale: 'TAI' })).toThrow(/four-digit calendar/);
  });

  it('ts.formatIso rejects bad options', () => {
    const t = utc('2020-01-01T00:00:00Z');
    expect(() => ts.formatIso(t, 'TT' as unknown as object)).toThrow(/options must be an object/);
    expect(() => ts.formatIso(t, { fractionDigits: 13 })).toThrow(/options\.fractionDigits/);
    expect(() => ts.formatIso(t, { fractionDigits: 2.5 })).toThrow(/options\.fractionDigits/);
  });

  it('ts.fromMjd / fromJd reject NaN, far dates and dates outside the calendar', () => {
    expect(() => ts.fromMjd('TT', Number.NaN)).toThrow(/mjd must be a finite Modified Julian Date/);
    expect(() => ts.fromMjd('TT', 0, Number.POSITIVE_INFINITY)).toThrow(/fraction/);
    expect(() => ts.fromMjd('TT', 2e7)).toThrow(/\|MJD\| < 1e7/);
    expect(() => ts.fromMjd('TT', -700_000)).toThrow(OutOfDomainError);
    expect(() => ts.fromJd('TT', Number.NaN)).toThrow(/jd must be a finite Julian Date/);
    expect(() => ts.fromJd('TT', 0, Number.NaN)).toThrow(/fraction/);
    expect(() => ts.fromJd('TT', 1e9)).toThrow(/jd must be a date within years 1\.\.9999/);
    expect(() => ts.fromJd('UTC', 2_500_000.5)).toThrow(OutOfDomainError);
  });
});
