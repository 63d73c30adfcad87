/**
 * Reference checks of the time-scale module against published sources. Each check names its
 * source and the provenance tag of the project's physics reference sheet (§8 and §1):
 * [V1] read in the primary text, [V2] secondary source or quotation, [C] computed independently,
 * [M] from memory. Leap-second facts are pinned to the bundled table (valid until 2027-06-28).
 */
import { describe, expect, it } from 'vitest';
import { L_G } from '../../packages/sdk/src/constants.js';
import { OutOfDomainError } from '../../packages/sdk/src/errors.js';
import {
  BUNDLED_LEAP_SECONDS,
  createTimeScales,
  mjdFromCalendarDate,
  parseLeapSecondsList,
  weekSecondsFromInstant,
} from '../../packages/sdk/src/time/index.js';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const utc = (text: string) => ts.parseIso(text);
const NANOSECOND = 1e-9;

describe('IERS Bulletin C leap seconds, as distributed in the IERS/NIST leap-seconds.list (public copies of the file) [V2]', () => {
  /** The 28 data lines of the list (NTP seconds since 1900-01-01, TAI − UTC), verbatim [V2]. */
  const DATA_LINES = `2272060800	10	# 1 Jan 1972
2287785600	11	# 1 Jul 1972
2303683200	12	# 1 Jan 1973
2335219200	13	# 1 Jan 1974
2366755200	14	# 1 Jan 1975
2398291200	15	# 1 Jan 1976
2429913600	16	# 1 Jan 1977
2461449600	17	# 1 Jan 1978
2492985600	18	# 1 Jan 1979
2524521600	19	# 1 Jan 1980
2571782400	20	# 1 Jul 1981
2603318400	21	# 1 Jul 1982
2634854400	22	# 1 Jul 1983
2698012800	23	# 1 Jul 1985
2776982400	24	# 1 Jan 1988
2840140800	25	# 1 Jan 1990
2871676800	26	# 1 Jan 1991
2918937600	27	# 1 Jul 1992
2950473600	28	# 1 Jul 1993
2982009600	29	# 1 Jul 1994
3029443200	30	# 1 Jan 1996
3076704000	31	# 1 Jul 1997
3124137600	32	# 1 Jan 1999
3345062400	33	# 1 Jan 2006
3439756800	34	# 1 Jan 2009
3550089600	35	# 1 Jul 2012
3644697600	36	# 1 Jul 2015
3692217600	37	# 1 Jan 2017`;
  /** Expiry "28 June 2027" of the list updated through Bulletin C 72 (quoted [V2]); NTP value computed [C]. */
  const EXPIRY_LINE = `#@\t${(mjdFromCalendarDate(2027, 6, 28) - 15_020) * 86_400}`;

  it("parseLeapSecondsList(list) reproduces BUNDLED_LEAP_SECONDS entry for entry (MJD = NTP/86400 + 15020, per the list's notes)", () => {
    const parsed = parseLeapSecondsList(`${EXPIRY_LINE}\n${DATA_LINES}\n`, 'leap-seconds.list');
    expect(parsed.entries).toEqual(BUNDLED_LEAP_SECONDS.entries);
    expect(parsed.validUntilMjd).toBe(BUNDLED_LEAP_SECONDS.validUntilMjd);
  });

  it("the list's own example: 30 June 1972 23:59:60 UTC has TAI = UTC + 11 counted from 23:59:59, i.e. 1972-07-01T00:00:10 TAI", () => {
    const leap = utc('1972-06-30T23:59:60Z');
    expect(ts.formatIso(leap, { scale: 'TAI', fractionDigits: 0 })).toBe('1972-07-01T00:00:10');
    expect(ts.formatIso(utc('1972-06-30T23:59:59Z'), { scale: 'TAI', fractionDigits: 0 })).toBe('1972-07-01T00:00:09');
    expect(ts.formatIso(utc('1972-07-01T00:00:00Z'), { scale: 'TAI', fractionDigits: 0 })).toBe('1972-07-01T00:00:11');
  });

  it('every step of the list is +1 s, so each preceding UTC day accepts 23:59:60 and lasts 86 401 s', () => {
    for (const line of DATA_LINES.split('\n').slice(1)) {
      const ntp = Number(line.split('\t')[0]);
      const mjd = ntp / 86_400 + 15_020;
      const start = ts.fromMjd('UTC', mjd - 1);
      expect(ts.fromMjd('UTC', mjd).secondsSince(start)).toBe(86_401);
    }
  });
});

describe('IERS Bulletin C 72 (Paris, 6 July 2026), as quoted in secondary sources [V2]', () => {
  it('"NO leap second will be introduced at the end of December 2026": 2026-12-31T23:59:60Z is rejected', () => {
    expect(() => utc('2026-12-31T23:59:60Z')).toThrow(/no leap second at the end of 2026-12-31/);
  });
  it('"from 2017 January 1, 0h UTC, until further notice: UTC − TAI = −37 s": TAI − UTC = 37 s through 2027-06-27', () => {
    expect(ts.taiMinusUtc(utc('2017-01-01T00:00:00Z'))).toBe(37);
    expect(ts.taiMinusUtc(utc('2026-12-02T00:00:00Z'))).toBe(37);
    expect(ts.taiMinusUtc(utc('2027-06-27T23:59:59Z'))).toBe(37);
  });
  it('the list updated through Bulletin C 72 "expires on 28 June 2027": UTC from 2027-06-28 is out of domain', () => {
    expect(() => utc('2027-06-28T00:00:00Z')).toThrow(OutOfDomainError);
  });
});

describe('IERS Conventions (2010), IERS Technical Note 36, §10.1 [V1]', () => {
  it('TT − TAI = 32.184 s exactly (§10.1 [V1])', () => {
    expect(ts.offset('TT', 'TAI', utc('2024-01-01T00:00:00Z'))).toBe(32.184);
    expect(ts.formatIso(ts.parseIso('2024-01-01T00:00:00', 'TAI'), { scale: 'TT', fractionDigits: 12 })).toBe(
      '2024-01-01T00:00:32.184000000000',
    );
  });

  it('TCG − TT = (L_G/(1 − L_G))·(JD_TT − T₀)·86400 s is 1.014978401 s at JD_TT 2460000.5 (§10.1 [V1]; value [C], physics-refs §8) to 1e-9 s', () => {
    const t = ts.fromJd('TT', 2_460_000.5);
    expect(Math.abs(ts.offset('TCG', 'TT', t) - 1.014978401)).toBeLessThan(1 * NANOSECOND);
  });

  it('T₀ = JD_TT 2443144.5003725 is 1977-01-01T00:00:00 TAI, where TCG = TT (§10.1 [V1])', () => {
    const t0 = ts.fromCalendar({ year: 1977, month: 1, day: 1 }, 'TAI');
    const jd = ts.toJd(t0, 'TT');
    expect(jd.day).toBe(2_443_144);
    expect(Math.abs(jd.fraction - 0.5003725)).toBeLessThan(1e-15);
    expect(Math.abs(ts.offset('TCG', 'TT', t0))).toBeLessThan(1e-15);
  });

  it('TCG − TT ≈ L_G·(MJD − 43144.0)·86400 s (§10.1 approximation, good to 1e-18 in rate [V1]) within 1e-9 s in 2023', () => {
    const t = ts.fromMjd('TAI', 60_000);
    expect(Math.abs(ts.offset('TCG', 'TT', t) - L_G * (60_000 - 43_144) * 86_400)).toBeLessThan(1 * NANOSECOND);
  });

  it('TT = TCG − L_G·(JD_TCG − T₀)·86400 inverts TCG exactly: a TCG reading parses back to the same instant to 1e-12 s', () => {
    const t = utc('2023-02-24T12:00:00.123456789Z');
    const tcgText = ts.formatIso(t, { scale: 'TCG', fractionDigits: 12 });
    expect(ts.parseIso(tcgText, 'TCG').equals(t, 1e-12)).toBe(true);
  });
});

describe('Julian dates: J2000.0 = 2000-01-01T12:00:00 TT = JD 2451545.0 (IAU [M]); MJD = JD − 2400000.5 (definition [M])', () => {
  it('ts.toJd(J2000, TT) = 2451545.0 and ts.toMjd = 51544.5', () => {
    const j2000 = ts.fromCalendar({ year: 2000, month: 1, day: 1, hour: 12 }, 'TT');
    expect(ts.toJd(j2000, 'TT').value).toBe(2_451_545);
    expect(ts.toMjd(j2000, 'TT').value).toBe(51_544.5);
  });
  it('J2000.0 is 2000-01-01T11:58:55.816Z (common practice, no source; 12:00:00 − 32.184 s − 32 s [C])', () => {
    expect(ts.formatIso(ts.fromJd('TT', 2_451_545), { fractionDigits: 3 })).toBe('2000-01-01T11:58:55.816Z');
  });
  it('MJD 0 is 1858-11-17T00:00 (definition of the MJD origin [M]) and MJD 51544 is 2000-01-01', () => {
    expect(ts.formatIso(ts.fromMjd('TAI', 0), { scale: 'TAI', fractionDigits: 0 })).toBe('1858-11-17T00:00:00');
    expect(mjdFromCalendarDate(2000, 1, 1)).toBe(51_544);
  });
});

describe('RFC 3339 §5.8 examples (quoted verbatim in public test suites) [V2]', () => {
  it('"1985-04-12T23:20:50.52Z" parses and prints back', () => {
    expect(ts.formatIso(utc('1985-04-12T23:20:50.52Z'), { fractionDigits: 2 })).toBe('1985-04-12T23:20:50.52Z');
  });
  it('"1996-12-19T16:39:57-08:00" is 1996-12-20T00:39:57Z', () => {
    expect(ts.formatIso(utc('1996-12-19T16:39:57-08:00'), { fractionDigits: 0 })).toBe('1996-12-20T00:39:57Z');
  });
  it('"1990-12-31T23:59:60Z" is a leap second, and "1990-12-31T15:59:60-08:00" is the same instant', () => {
    const leap = utc('1990-12-31T23:59:60Z');
    expect(ts.isLeapSecond(leap)).toBe(true);
    expect(utc('1990-12-31T15:59:60-08:00').equals(leap)).toBe(true);
    expect(ts.taiMinusUtc(utc('1991-01-01T00:00:00Z'))).toBe(26);
  });
  it('"1937-01-01T12:00:27.87+00:20" is valid text but pre-1972 UTC, which is not modelled (OutOfDomainError)', () => {
    expect(() => utc('1937-01-01T12:00:27.87+00:20')).toThrow(OutOfDomainError);
  });
});

describe('GPS time: IS-GPS-200 [M]; BIPM, Lewandowski & Arias, "GPS time is 19 seconds behind TAI" [V2]', () => {
  it('1980-01-06T00:00:00Z is GPS week 0, 0 s of week (GPS = UTC at its epoch)', () => {
    expect(ts.toWeekSeconds(utc('1980-01-06T00:00:00Z'), 'GPS')).toMatchObject({ week: 0, secondsOfWeek: 0 });
  });
  it('GPS − TAI = −19 s, and "until the end of 2007 at least, 14 seconds ahead of UTC" [V2]', () => {
    expect(ts.offset('GPS', 'TAI', utc('2007-06-01T00:00:00Z'))).toBe(-19);
    expect(ts.offset('GPS', 'UTC', utc('2007-06-01T00:00:00Z'))).toBe(14);
  });
  it('10-bit week rollovers: 1999-08-22T00:00:00 GPS starts week 1024, 2019-04-07T00:00:00 GPS starts week 2048 (common practice, no source)', () => {
    expect(ts.toWeekSeconds(ts.parseIso('1999-08-22T00:00:00', 'GPS'), 'GPS')).toMatchObject({
      week: 1024,
      secondsOfWeek: 0,
    });
    expect(ts.toWeekSeconds(ts.parseIso('2019-04-07T00:00:00', 'GPS'), 'GPS')).toMatchObject({
      week: 2048,
      secondsOfWeek: 0,
    });
  });
});

describe('Galileo System Time: Galileo OS SIS ICD §5.1.2 as quoted in public receiver code and galileognss.eu [V2]', () => {
  it('"At the start epoch [22 August 1999], GST shall be ahead of UTC by thirteen (13) leap seconds"', () => {
    expect(ts.offset('GST', 'UTC', utc('1999-08-22T00:00:00Z'))).toBe(13);
  });
  it('"as of 01.01.2006 GST is ahead of UTC by fourteen (14) leap seconds"; "currently ... 16 seconds" (between the 2012 and 2015 leap seconds)', () => {
    expect(ts.offset('GST', 'UTC', utc('2006-01-01T00:00:00Z'))).toBe(14);
    expect(ts.offset('GST', 'UTC', utc('2013-06-01T00:00:00Z'))).toBe(16);
  });
  it('GST week 0 begins with GPS week 1024 (weeks counted on GST, common practice, no source)', () => {
    const t = ts.parseIso('1999-08-22T00:00:00', 'GST');
    expect(ts.toWeekSeconds(t, 'GST')).toMatchObject({ week: 0, secondsOfWeek: 0 });
    expect(weekSecondsFromInstant(t, 'GPS')).toMatchObject({ week: 1024, secondsOfWeek: 0 });
  });
});

describe('BeiDou Time: BDS ICD as quoted in secondary sources; receiver reference guide "BDT started on January 1st, 2006 (GPS week 1356)" [V2]', () => {
  it('BDT week 0 starts at 2006-01-01T00:00:00 UTC, where BDT = UTC, in GPS week 1356', () => {
    const t = utc('2006-01-01T00:00:00Z');
    expect(ts.toWeekSeconds(t, 'BDT')).toMatchObject({ week: 0, secondsOfWeek: 0 });
    expect(ts.offset('BDT', 'UTC', t)).toBe(0);
    expect(ts.toWeekSeconds(t, 'GPS')).toMatchObject({ week: 1356, secondsOfWeek: 14 });
  });
  it('GPST − BDT = 14 s and TAI − BDT = 33 s ("theoretical" differences) [V2]', () => {
    const t = utc('2020-01-01T00:00:00Z');
    expect(ts.offset('GPS', 'BDT', t)).toBe(14);
    expect(ts.offset('TAI', 'BDT', t)).toBe(33);
  });
  it('BDT − UTC is 4 s at the end of 2017 ("至2017年底该差值为4s") [V2]', () => {
    expect(ts.offset('BDT', 'UTC', utc('2017-12-31T00:00:00Z'))).toBe(4);
  });
});
