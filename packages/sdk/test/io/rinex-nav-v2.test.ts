import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError, TaulineError } from '../../src/errors.js';
import { fullYearFromTwoDigits, parseRinexNav, type RinexNavEvent, readRinexNav } from '../../src/io/rinex-nav.js';
import { formatFileEpoch } from '../../src/time/file-epochs.js';
import { BUNDLED_LEAP_SECONDS } from '../../src/time/leap-seconds.js';
import { createTimeScales } from '../../src/time/scales.js';
import { instantFromWeekSeconds } from '../../src/time/weeks.js';
import { expectParseError } from './parse-errors.js';

const FIXTURES = new URL('../../../../test/fixtures/rinex-nav/', import.meta.url);
const read = (name: string) => readFileSync(new URL(name, FIXTURES), 'utf8');
const V211 = read('gps-v211.rnx');
const V210 = read('gps-v210.rnx');
const GLO = read('glonass-v211.rnx');
const GEO = read('geo-v211.rnx');
/** GPS week 2296 starts 2024-01-07T00:00:00 GPST (1980-01-06 + 2296 weeks; calendar arithmetic, common practice). */
const WEEK_2296 = instantFromWeekSeconds('GPS', 2296, 0);
/** GPS week 1043 starts 2000-01-02T00:00:00 GPST (same arithmetic). */
const WEEK_1043 = instantFromWeekSeconds('GPS', 1043, 0);
const lines = (text: string) => text.split('\n');
const withLine = (text: string, n: number, line: string) =>
  lines(text)
    .map((l, i) => (i === n - 1 ? line : l))
    .join('\n');

describe('fullYearFromTwoDigits: RINEX 2.11 §6.5 [V1] (80–99 → 1980–1999, 00–79 → 2000–2079)', () => {
  it('fullYearFromTwoDigits(yy) maps 80, 99, 00 and 79 to 1980, 1999, 2000 and 2079', () => {
    expect([80, 99, 0, 79, 24].map(fullYearFromTwoDigits)).toEqual([1980, 1999, 2000, 2079, 2024]);
  });
  it('fullYearFromTwoDigits(yy) rejects a value that is not an integer 0–99 with InvalidArgumentError', () => {
    for (const bad of [100, -1, 2.5, Number.NaN])
      expect(() => fullYearFromTwoDigits(bad)).toThrow(InvalidArgumentError);
    expect(() => fullYearFromTwoDigits('7' as unknown as number)).toThrow(/yy/);
  });
});

describe('parseRinexNav: RINEX 2.11 GPS navigation file (Tables A3, A4 [V1])', () => {
  const file = parseRinexNav(V211, { sourceName: 'gps-v211.rnx' });
  it('parseRinexNav(2.11 text) reads the header: version, file type, ION ALPHA / ION BETA, DELTA-UTC and LEAP SECONDS (values as written in the fixture)', () => {
    expect(file.header).toMatchObject({
      version: 2.11,
      fileType: 'N',
      satelliteSystem: 'G',
      programName: 'tauline-fixture',
      leapSeconds: { current: 18 },
      lineCount: 8,
    });
    expect(file.header.ionosphere).toEqual([
      { type: 'GPSA', parametersBroadcastUnits: [1.118e-8, 7.451e-9, -5.961e-8, -5.961e-8], line: 4 },
      { type: 'GPSB', parametersBroadcastUnits: [9.011e4, 1.638e4, -1.966e5, -6.554e4], line: 5 },
    ]);
    expect(file.header.timeSystemCorrections).toEqual([
      {
        type: 'GPUT',
        a0: 1.862645149e-9,
        a1: 1.776356839e-15,
        referenceSecondsOfWeek: 405504,
        referenceWeek: 2295,
        reference: expect.anything(),
        line: 6,
      },
    ]);
    // t_ref on GPS time: week 2295 + 405504 s = 2024-01-04T16:38:24 (Python datetime from 1980-01-06 [C]).
    const reference = file.header.timeSystemCorrections[0]?.reference;
    if (reference === undefined) throw new Error('GPUT has no reference instant');
    expect(formatFileEpoch(createTimeScales(BUNDLED_LEAP_SECONDS), reference, 'GPS')).toBe('2024-01-04T16:38:24');
    expect(file.header.otherLines).toEqual([]);
  });
  it('parseRinexNav(2.11 text) reads every field of a record at the RINEX 2 columns (3X indentation, F5.1 seconds)', () => {
    const g14 = file.ephemerides[0]!;
    expect(g14).toMatchObject({
      satellite: 'G14',
      system: 'G',
      message: 'LNAV',
      af0: 3.51245820522e-4,
      af1: -6.82121026329e-12,
      af2: 0,
      issueOfData: 61,
      crs: -41.53125,
      deltaN: 4.61733519e-9,
      m0: -1.23456789012,
      cuc: -2.08616256714e-6,
      eccentricity: 0.00972349131,
      cus: 7.93486833572e-6,
      sqrtA: 5153.62819481,
      toeSecondsOfWeek: 597600,
      cic: 1.26659870148e-7,
      omega0: -2.73681237354,
      cis: -4.09781932831e-8,
      i0: 0.962451230912,
      crc: 231.28125,
      argumentOfPerigee: 0.711534218512,
      omegaDot: -8.02247703215e-9,
      idot: 2.41438943296e-10,
      weekAsWritten: 2295,
      accuracy: 2,
      health: 0,
      issueOfDataClock: 61,
      fitIntervalSeconds: 6 * 3600,
      line: 9,
      sourceName: 'gps-v211.rnx',
      notes: [],
    });
    expect(g14.groupDelays).toEqual({ TGD: -1.11758708954e-8 });
    expect(g14.tocAsWritten).toEqual({ year: 2024, month: 1, day: 6, hour: 22, minute: 0, second: 0 });
    expect(g14.toe.secondsSince(WEEK_2296)).toBe(-7200);
    expect(g14.toc.secondsSince(WEEK_2296)).toBe(-7200);
  });
  it('parseRinexNav(2.11 text) places a t_oc with tenths of a second (F5.1) exactly, where a float count since 1980 steps by 2.4e-7 s (independent exact arithmetic [C])', () => {
    const text = withLine(V211, 9, lines(V211)[8]!.replace(' 22  0  0.0', ' 22  0 12.3'));
    const g14 = parseRinexNav(text).ephemerides[0]!;
    expect(g14.tocAsWritten.second).toBe(12.3);
    // 22:00:12.3 = start of week 2296 − 7200 s + 12.3 s; 12.3 − 12 is exact in doubles, so the exact span is fl(12.3) − 7200.
    expect(g14.toc.secondsSince(WEEK_2296.plus(-7200))).toBe(12.3);
    expect(g14.toc.taiFraction).toBe(12.3 - 12);
    // The former count (2296 × 604800 − 7200 + 12.3, one double near 1.3886e9 s) rounds to a multiple of 2^-22 s.
    const formerCount = 2296 * 604800 - 7200 + 12.3;
    expect(Math.abs(formerCount - (2296 * 604800 - 7200) - 12.3)).toBeGreaterThan(1e-8);
  });
  it('parseRinexNav(2.11 text) places a negative transmission time (§6.8) before the week of t_oe, and reads 0.-mantissa E exponents', () => {
    const g03 = file.ephemerides[2]!;
    expect(g03.satellite).toBe('G03');
    expect(g03.af0).toBe(-4.21544909477e-5);
    expect(g03.transmission!.secondsSince(WEEK_2296)).toBe(-18);
    expect(g03.transmissionSecondsOfWeek).toBe(-18);
  });
});

describe('parseRinexNav: RINEX 2.10 GPS file across 1999/2000', () => {
  const file = parseRinexNav(V210);
  it('parseRinexNav(2.10 text) reads years 99 and 00 as 1999 and 2000 (§6.5) and resolves the weeks', () => {
    expect(file.header.version).toBe(2.1);
    expect(file.header.ionosphere).toEqual([]);
    expect(file.header.timeSystemCorrections).toEqual([]);
    expect(file.header.leapSeconds).toEqual({ current: 13 });
    expect(file.ephemerides.map((e) => e.tocAsWritten.year)).toEqual([1999, 2000, 2000]);
    expect(file.ephemerides[0]!.toe.secondsSince(WEEK_1043)).toBe(-604800 + 511200);
  });
  it('parseRinexNav(2.10 text) reads a week written modulo 1024 and a fit interval of 0 with notes, never silently', () => {
    const g21 = file.ephemerides[2]!;
    expect(g21.toe.secondsSince(WEEK_1043)).toBe(0);
    expect(g21.fitIntervalSeconds).toBe(4 * 3600);
    expect(g21.notes).toEqual([
      'week 19 read as GPS week 1043 (written modulo 1024: week-number rollover)',
      'fit interval not given (0 or blank): 4 hours assumed (IS-GPS-200 §20.3.4.4 [M])',
    ]);
    expect(g21.transmission!.secondsSince(WEEK_1043)).toBe(-30);
  });
});

describe('parseRinexNav: RINEX 2.11 GLONASS (G) and GEO (H) files (Tables A10–A12, A15–A18 [V1])', () => {
  it('parseRinexNav(GLONASS text) reports every record as skipped with its slot, line and length', () => {
    const file = parseRinexNav(GLO);
    expect(file.header).toMatchObject({ fileType: 'G', satelliteSystem: 'R', leapSeconds: { current: 18 } });
    expect(file.header.otherLines.map((l) => l.label)).toEqual(['CORR TO SYSTEM TIME']);
    expect(file.ephemerides).toEqual([]);
    expect(file.skipped.map((s) => [s.satellite, s.line, s.lineCount])).toEqual([
      ['R04', 7, 4],
      ['R17', 11, 4],
    ]);
    expect(file.skipped[0]!.reason).toMatch(/GLONASS ephemeris: a state-vector record/);
  });
  it('parseRinexNav(GEO text) reports the record as skipped (PRN 120 → S20)', () => {
    const file = parseRinexNav(GEO);
    expect(file.header).toMatchObject({ fileType: 'H', satelliteSystem: 'S' });
    expect(file.skipped.map((s) => [s.satellite, s.line, s.lineCount, s.reason])).toEqual([
      ['S20', 7, 4, 'SBAS ephemeris: a state-vector record, not modelled'],
    ]);
  });
});

describe('parseRinexNav: RINEX 2 files the standard does not define are refused, never misread', () => {
  const first = lines(V211)[0]!;
  it('parseRinexNav(text) refuses a Galileo L file, a mixed or Galileo system letter in column 41, and an unknown file type', () => {
    expectParseError(
      () => parseRinexNav(withLine(V211, 1, first.replace('N: GPS NAV DATA', 'L: GALILEO NAV  '))),
      1,
      21,
      /reserves 'L' for a future Galileo navigation file/,
    );
    for (const letter of ['M', 'E', 'R']) {
      expectParseError(
        () => parseRinexNav(withLine(V211, 1, first.slice(0, 40) + letter + first.slice(41))),
        1,
        41,
        /defines no mixed or Galileo navigation file layout/,
      );
    }
    expectParseError(
      () => parseRinexNav(withLine(V211, 1, first.replace('N: GPS', 'O: GPS'))),
      1,
      21,
      /file type N \(GPS navigation\), G \(GLONASS\) or H \(GEO\)/,
    );
  });
  it('parseRinexNav(text) refuses a record with a system letter (a RINEX 3 record in a version-2 file) at column 1', () => {
    const l9 = lines(V211)[8]!;
    expectParseError(
      () => parseRinexNav(withLine(V211, 9, `G${l9.slice(1)}`)),
      9,
      1,
      /satellite number 1-99 in columns 1-2 \(format I2/,
    );
  });
});

describe('parseRinexNav: malformed RINEX 2 input throws ParseError with file, line and column', () => {
  const l = lines(V211);
  it('parseRinexNav(text) reports a record cut short by the end of the file and by the next record', () => {
    expectParseError(
      () => parseRinexNav(`${l.slice(0, 13).join('\n')}\n`, { sourceName: 'cut.rnx' }),
      14,
      1,
      /^cut\.rnx:14:1: expected 8 lines for the GPS record of G14 starting at line 9 \(found 5: truncated record\)/,
    );
    const cut = [...l.slice(0, 12), ...l.slice(16)].join('\n');
    expectParseError(() => parseRinexNav(cut), 13, 1, /8 lines for the GPS record of G14 starting at line 9 \(found 4/);
    const glo = lines(GLO);
    expectParseError(
      () => parseRinexNav([...glo.slice(0, 9), ...glo.slice(10)].join('\n')),
      10,
      1,
      /4 lines for the GLONASS record of R04 starting at line 7 \(found 3/,
    );
  });
  it('parseRinexNav(text) rejects bad epoch fields: separators, month, seconds, PRN 0 and an impossible date', () => {
    const e = l[8]!;
    expectParseError(
      () => parseRinexNav(withLine(V211, 9, `${e.slice(0, 5)}x${e.slice(6)}`)),
      9,
      6,
      /blank before the epoch month/,
    );
    expectParseError(() => parseRinexNav(withLine(V211, 9, `${e.slice(0, 6)}x1${e.slice(8)}`)), 9, 7, /epoch month/);
    expectParseError(
      () => parseRinexNav(withLine(V211, 9, `${e.slice(0, 17)} 0:00${e.slice(22)}`)),
      9,
      18,
      /epoch second in columns 18-22 \(format F5\.1\)/,
    );
    expectParseError(() => parseRinexNav(withLine(V211, 9, ` 0${e.slice(2)}`)), 9, 1, /satellite number 1-99/);
    expectParseError(
      () => parseRinexNav(withLine(V211, 9, `${e.slice(0, 6)}13${e.slice(8)}`)),
      9,
      4,
      /valid calendar epoch/,
    );
    expectParseError(
      () => parseRinexNav(withLine(V211, 9, `${e.slice(0, 17)} 60.0${e.slice(22)}`)),
      9,
      4,
      /valid calendar epoch/,
    );
  });
  it('parseRinexNav(text) rejects a continuation line without its 3 blanks, a stray line, a cut field and a bad number', () => {
    expectParseError(
      () => parseRinexNav(withLine(V211, 10, `x${l[9]!.slice(1)}`)),
      10,
      1,
      /8 lines for the GPS record of G14/,
    );
    expectParseError(
      () => parseRinexNav(withLine(V211, 10, `  x${l[9]!.slice(3)}`)),
      10,
      1,
      /8 lines for the GPS record of G14/,
    );
    expectParseError(
      () => parseRinexNav(V211.replace(/END OF HEADER\n/, 'END OF HEADER\n     .1D+01\n')),
      9,
      1,
      /first line of a navigation record/,
    );
    expectParseError(
      () => parseRinexNav(withLine(V211, 11, l[10]!.slice(0, 30))),
      11,
      31,
      /complete D19\.12 field ending at column 41/,
    );
    expectParseError(
      () => parseRinexNav(withLine(V211, 9, `${l[8]!.slice(0, 22)}  .35124582052XD-03${l[8]!.slice(41)}`)),
      9,
      23,
      /clock bias a_f0 \(s\) as a Fortran real/,
    );
    const glo = lines(GLO);
    expectParseError(
      () => parseRinexNav(withLine(GLO, 8, `x${glo[7]!.slice(1)}`)),
      8,
      1,
      /4 lines for the GLONASS record of R04/,
    );
  });
  it('parseRinexNav(text) rejects malformed ION ALPHA, DELTA-UTC and LEAP SECONDS header lines, naming the column', () => {
    expectParseError(
      () => parseRinexNav(withLine(V211, 4, `${l[3]!.slice(0, 14)}   .74X1D-08${l[3]!.slice(26)}`)),
      4,
      15,
      /ION ALPHA parameter 2 as a real number in columns 15-26/,
    );
    expectParseError(
      () => parseRinexNav(withLine(V211, 6, `${l[5]!.slice(0, 41)}   40550x${l[5]!.slice(50)}`)),
      6,
      42,
      /T, reference time of UTC data/,
    );
    expectParseError(
      () => parseRinexNav(withLine(V211, 6, `${' '.repeat(60)}DELTA-UTC: A0,A1,T,W`)),
      6,
      4,
      /DELTA-UTC: A0,A1,T,W parameter 1/,
    );
    expectParseError(
      () => parseRinexNav(withLine(V211, 7, `${'    1x'.padEnd(60)}LEAP SECONDS`)),
      7,
      1,
      /integer \(format I6\)/,
    );
  });
  it('parseRinexNav(text) keeps a blank ION BETA field as null (missing, never zero)', () => {
    const f = parseRinexNav(withLine(V211, 5, l[4]!.slice(0, 38) + ' '.repeat(12) + l[4]!.slice(50)));
    expect(f.header.ionosphere[1]!.parametersBroadcastUnits).toEqual([9.011e4, 1.638e4, -1.966e5, null]);
  });
});

describe('readRinexNav: RINEX 2 streaming', () => {
  it('readRinexNav(chunks) yields the same events from 5-character chunks (CR LF line ends) as parseRinexNav from the whole text', async () => {
    const text = V211.replace(/\n/g, '\r\n');
    const chunks = (async function* () {
      for (let i = 0; i < text.length; i += 5) yield text.slice(i, i + 5);
    })();
    const events: RinexNavEvent[] = [];
    for await (const ev of readRinexNav(chunks)) events.push(ev);
    const whole = parseRinexNav(V211);
    expect(events[0]).toEqual({ kind: 'header', header: whole.header });
    expect(events.slice(1).map((e) => (e as { ephemeris: unknown }).ephemeris)).toEqual(whole.ephemerides);
  });
});

describe('parseRinexNav: RINEX 4 records cut short are refused even when not modelled (RINEX 4.01 record lengths [M])', () => {
  const V4 = lines(read('mixed-v401.rnx'));
  const drop = (header: string, keep: number) => {
    const at = V4.indexOf(header);
    let end = at + 1;
    while (end < V4.length && !V4[end]!.startsWith('>') && V4[end] !== '') end++;
    return {
      text: [...V4.slice(0, at + 1 + keep), ...V4.slice(end)].join('\n'),
      next: at + 1 + keep + 1,
      header: at + 1,
    };
  };
  it.each([
    ['> EPH G05 CNAV', 6, 'EPH CNAV GPS record of G05', 9],
    ['> EPH R05 FDMA', 4, 'EPH FDMA GLONASS record of R05', 5],
    ['> EPH S20 SBAS', 3, 'EPH SBAS SBAS record of S20', 4],
    ['> STO G05 LNAV', 1, 'STO LNAV GPS record of G05', 2],
    ['> EOP G05 CNV2', 2, 'EOP CNV2 GPS record of G05', 3],
    ['> ION G05 LNAV', 2, 'ION LNAV GPS record of G05', 3],
  ])(
    'parseRinexNav(text with %s cut to %i lines) names the file, the line and the record',
    (header, keep, what, needed) => {
      const { text, next, header: at } = drop(header, keep);
      expectParseError(
        () => parseRinexNav(text, { sourceName: 'v4.rnx' }),
        next,
        1,
        new RegExp(
          `^v4\\.rnx:${next}:1: expected ${needed} lines for the ${what} starting at line ${at} \\(found ${keep}: truncated record\\)`,
        ),
      );
    },
  );
  it('parseRinexNav(text) still skips a complete record of a message type outside the length table, saying its length was not checked', () => {
    const text = V4.join('\n').replace('> EPH G05 CNAV', '> EPH G05 XNAV');
    const f = parseRinexNav(text);
    expect(f.skipped[0]).toMatchObject({ message: 'XNAV', lineCount: 10 });
    expect(f.skipped[0]!.reason).toMatch(/length not checked/);
  });
});

describe('parseRinexNav: seeded mutation test of the RINEX 2 path', () => {
  /** Every number in an accepted result must be finite (a reader never hands on NaN or Infinity). */
  const allFinite = (value: unknown): boolean => {
    if (typeof value === 'number') return Number.isFinite(value);
    if (value === null || typeof value !== 'object') return true;
    return Object.values(value).every(allFinite);
  };
  const sources = [V211, V210, GLO, GEO];
  const alphabet = [' ', 'D', 'E', 'd', '-', '+', '.', '0', '9', '\n', '\r', 'G', 'N', 'L', 'M', 'x', '\t', '\u00a0'];
  it('parseRinexNav(mutated 2.10/2.11 text) returns finite records or throws a Tauline error, over 2400 seeded mutations', () => {
    let accepted = 0;
    fc.assert(
      fc.property(
        fc.nat({ max: sources.length - 1 }),
        fc.array(fc.tuple(fc.nat(), fc.constantFrom(...alphabet), fc.nat({ max: 40 }), fc.nat({ max: 3 })), {
          minLength: 1,
          maxLength: 3,
        }),
        (which, edits) => {
          let text = sources[which]!;
          for (const [pos, ch, del, kind] of edits) {
            const at = pos % text.length;
            if (kind === 0) text = text.slice(0, at) + ch + text.slice(at + 1);
            else if (kind === 1) text = text.slice(0, at) + text.slice(at + del);
            else if (kind === 2) text = text.slice(0, at);
            else text = text.slice(0, at) + text.slice(at, at + del) + text.slice(at);
          }
          try {
            const f = parseRinexNav(text);
            accepted++;
            expect(allFinite(f)).toBe(true);
          } catch (e) {
            if (!(e instanceof TaulineError)) throw e;
          }
        },
      ),
      { seed: 20261203, numRuns: 2400 },
    );
    // Some mutations (blanks in blank fields, a cut after a record) leave a valid file: the test saw both outcomes.
    expect(accepted).toBeGreaterThan(0);
  });
});
