import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import { LineSplitter, linesOf, parseFortranReal } from '../../src/io/line-reader.js';
import { parseRinexNav, type RinexNavEvent, readRinexNav } from '../../src/io/rinex-nav.js';
import { formatFileEpoch, instantFromFileEpoch } from '../../src/time/file-epochs.js';
import type { Instant } from '../../src/time/instant.js';
import { BUNDLED_LEAP_SECONDS } from '../../src/time/leap-seconds.js';
import { createTimeScales } from '../../src/time/scales.js';
import { instantFromWeekSeconds } from '../../src/time/weeks.js';
import { expectParseError } from './parse-errors.js';

const FIXTURES = new URL('../../../../test/fixtures/rinex-nav/', import.meta.url);
const read = (name: string) => readFileSync(new URL(name, FIXTURES), 'utf8');
const V3 = read('mixed-v305.rnx');
const V4 = read('mixed-v401.rnx');
/** Week 2296 starts 2024-01-07T00:00:00 GPST (1980-01-06 + 2296 weeks; computed, common practice). */
const WEEK_2296 = instantFromWeekSeconds('GPS', 2296, 0);
/** The same calendar reading on BeiDou time: BDT week 940 (GPS week 2296 − 1356, BDS-SIS-ICD §3.3 [M]). */
const BDT_WEEK_940 = instantFromWeekSeconds('BDT', 940, 0);
const TS = createTimeScales(BUNDLED_LEAP_SECONDS);
/** Seconds from the start of GPS week 2296 to `instant`. */
const sinceWeek = (instant: Instant) => instant.secondsSince(WEEK_2296);

describe('line reader helpers', () => {
  it('LineSplitter.push(chunk) joins a CR LF split across chunks and keeps blank lines numbered', () => {
    const s = new LineSplitter();
    const lines = [...s.push('a\r'), ...s.push('\n\nb'), ...s.push('c\r\n'), ...s.finish()];
    expect(lines).toEqual([
      { text: 'a', lineNumber: 1 },
      { text: '', lineNumber: 2 },
      { text: 'bc', lineNumber: 3 },
    ]);
  });
  it('linesOf(text) delivers a last line that has no line end', () => {
    expect([...linesOf('x\ny')].map((l) => l.text)).toEqual(['x', 'y']);
  });
  it('parseFortranReal(field) reads D and E exponents, leading-dot mantissas, blanks and garbage', () => {
    expect(parseFortranReal(' -.123456789012D-04')).toBe(-0.123456789012e-4);
    expect(parseFortranReal('1.5d+03')).toBe(1500);
    expect(parseFortranReal('  4.2E-1')).toBe(0.42);
    expect(parseFortranReal('      ')).toBeUndefined();
    expect(parseFortranReal('1.2.3')).toBeNaN();
    expect(parseFortranReal('1D999')).toBeNaN();
  });
  it('instantFromFileEpoch(2024-01-07T00:00 GPS) is the start of GPS week 2296 (1980-01-06 epoch; calendar arithmetic, common practice)', () => {
    const fields = { year: 2024, month: 1, day: 7, hour: 0, minute: 0, second: 0 };
    expect(instantFromFileEpoch(TS, fields, 'GPS').equals(WEEK_2296)).toBe(true);
    expect(formatFileEpoch(TS, WEEK_2296.plus(3723.5), 'GPS')).toBe('2024-01-07T01:02:03.5');
    expect(formatFileEpoch(TS, instantFromWeekSeconds('GPS', 0, 0), 'GPS')).toBe('1980-01-06T00:00:00');
  });
});

describe('parseRinexNav: RINEX 3.05 mixed file (RINEX 3.05, IGS/RTCM-SC104 [M])', () => {
  const file = parseRinexNav(V3, { sourceName: 'mixed-v305.rnx' });
  const bySat = (sat: string) => file.ephemerides.filter((e) => e.satellite === sat);

  it('parseRinexNav(text) reads the header: version, type, system, program, leap seconds, comments', () => {
    expect(file.header.version).toBe(3.05);
    expect(file.header.satelliteSystem).toBe('M');
    expect(file.header.programName).toBe('tauline-fixture');
    expect(file.header.leapSeconds).toEqual({ current: 18, future: 18, futureWeek: 2185, futureDay: 7 });
    expect(file.header.comments).toEqual(['Invented values for reader tests; not a real constellation']);
    expect(file.header.otherLines).toEqual([]);
    // IONOSPHERIC CORR (A4,1X,4D12.4) and TIME SYSTEM CORR (A4,1X,D17.10,D16.9,I7,I5), RINEX 3.05 [M]; values as written in the fixture.
    expect(file.header.ionosphere).toEqual([
      { type: 'GPSA', parametersBroadcastUnits: [1.1176e-8, 7.4506e-9, -5.9605e-8, -5.9605e-8], line: 4 },
    ]);
    expect(file.header.timeSystemCorrections).toEqual([
      {
        type: 'GPUT',
        a0: 9.3132257462e-10,
        a1: 1.33226763e-15,
        referenceSecondsOfWeek: 405504,
        referenceWeek: 2296,
        reference: expect.anything(),
        line: 5,
      },
    ]);
    // t_ref on GPS time: week 2296 + 405504 s = 2024-01-11T16:38:24 (Python datetime from 1980-01-06 [C]).
    const reference = file.header.timeSystemCorrections[0]?.reference;
    if (reference === undefined) throw new Error('GPUT has no reference instant');
    expect(formatFileEpoch(createTimeScales(BUNDLED_LEAP_SECONDS), reference, 'GPS')).toBe('2024-01-11T16:38:24');
    expect(file.header.fileType).toBe('N');
    expect(file.header.lineCount).toBe(7);
  });

  it('parseRinexNav(text) reads every GPS LNAV field in SI units with D exponents', () => {
    const [g05] = bySat('G05');
    expect(g05).toMatchObject({
      satellite: 'G05',
      system: 'G',
      message: 'LNAV',
      af0: 1e-4,
      af1: 1e-11,
      af2: 0,
      issueOfData: 17,
      crs: -52.5,
      deltaN: 4.5e-9,
      m0: 1,
      cuc: -2.7e-6,
      eccentricity: 0.0123456789,
      cus: 8.1e-6,
      sqrtA: 5153.79589081,
      toeSecondsOfWeek: 0,
      cic: 1.1e-7,
      omega0: -2.1,
      cis: -6e-8,
      i0: 0.958,
      crc: 210.3125,
      argumentOfPerigee: 0.62,
      omegaDot: -8.1e-9,
      idot: 1.2e-10,
      weekAsWritten: 2296,
      accuracy: 2,
      health: 0,
      issueOfDataClock: 273,
      fitIntervalSeconds: 4 * 3600,
      line: 8,
      sourceName: 'mixed-v305.rnx',
    });
    expect(g05!.groupDelays).toEqual({ TGD: -1e-8 });
    expect(sinceWeek(g05!.toc)).toBe(0);
    expect(sinceWeek(g05!.toe)).toBe(0);
    expect(sinceWeek(g05!.transmission!)).toBe(-18);
    expect(g05!.transmissionSecondsOfWeek).toBe(-18); // as written: sent in the week before t_oe (RINEX 2.11 Table A4 note [V1])
    expect(g05!.tocAsWritten).toEqual({ year: 2024, month: 1, day: 7, hour: 0, minute: 0, second: 0 });
    expect(g05!.notes).toEqual([]);
  });

  it('parseRinexNav(text) reads a week written modulo 1024 as the full week and says so (week rollover)', () => {
    const [g07] = bySat('G07');
    expect(g07!.weekAsWritten).toBe(248);
    expect(sinceWeek(g07!.toe)).toBe(0);
    expect(g07!.notes.join()).toMatch(/week 248 read as GPS week 2296 \(written modulo 1024/);
  });

  it('parseRinexNav(text) places a t_oe whose week field is the previous (transmission) week nearest to t_oc', () => {
    const [g09] = bySat('G09');
    expect(g09!.weekAsWritten).toBe(2295);
    expect(sinceWeek(g09!.toe)).toBe(0);
    expect(g09!.notes.join()).toMatch(/t_oe lies in GPS week 2296, the week field says 2295/);
    // Transmission 604782 s of week 2295 = 18 s before t_oe.
    expect(sinceWeek(g09!.transmission!)).toBe(-18);
  });

  it('parseRinexNav(text) keeps a t_oe late in the previous week in that week (t_oc Saturday 22:00)', () => {
    const [g11] = bySat('G11');
    expect(sinceWeek(g11!.toe)).toBe(-7200);
    expect(g11!.notes).toEqual([]);
  });

  it('parseRinexNav(text) reads E exponents with a leading digit and the health word', () => {
    const [g13] = bySat('G13');
    expect(g13!.health).toBe(63);
    expect(g13!.sqrtA).toBe(5153.79589081);
  });

  it('parseRinexNav(text) tells Galileo I/NAV (data sources 517) from F/NAV (258) and reads both BGDs', () => {
    const e11 = bySat('E11');
    expect(e11.map((e) => e.message)).toEqual(['INAV', 'FNAV']);
    expect(e11.map((e) => e.dataSources)).toEqual([517, 258]);
    expect(e11[0]!.groupDelays).toEqual({ BGD_E5a_E1: 1.2e-9, BGD_E5b_E1: 1.4e-9 });
    expect(e11[0]!.fitIntervalSeconds).toBe(4 * 3600);
  });

  it('parseRinexNav(text) reads BeiDou records in the BDT week count (week 940 = GPS week 2296) and marks GEO records D2', () => {
    const [c08] = bySat('C08');
    const [c03] = bySat('C03');
    expect(c08!.message).toBe('D1');
    expect(c03!.message).toBe('D2');
    expect(c08!.weekAsWritten).toBe(940);
    expect(c08!.toe.secondsSince(BDT_WEEK_940)).toBe(0);
    expect(c08!.toe.secondsSince(WEEK_2296)).toBe(14); // BDT = GPST − 14 s: the BDT reading comes 14 s later
    expect(c08!.groupDelays).toEqual({ TGD1: 2.4e-9, TGD2: -1.3e-9 });
    expect(c08!.issueOfDataClock).toBe(1);
  });

  it('parseRinexNav(text) reports GLONASS, SBAS and QZSS records as skipped with a reason, and reads the records after them', () => {
    expect(file.skipped.map((s) => [s.satellite, s.line, s.lineCount])).toEqual([
      ['R05', 56, 4],
      ['S20', 76, 4],
      ['J02', 104, 8],
    ]);
    expect(file.skipped[0]!.reason).toMatch(/GLONASS.*state-vector/);
    expect(file.skipped[1]!.reason).toMatch(/SBAS/);
    expect(file.ephemerides.map((e) => e.satellite)).toEqual([
      'G05',
      'G05',
      'G07',
      'G09',
      'G11',
      'G13',
      'E11',
      'E11',
      'C08',
      'C03',
      'C21',
    ]);
  });
});

describe('parseRinexNav: RINEX 4.01 mixed file (RINEX 4.01, IGS/RTCM-SC104 [M])', () => {
  const file = parseRinexNav(V4, { sourceName: 'mixed-v401.rnx' });
  it('parseRinexNav(text) reads the version-4 header and the modelled EPH records', () => {
    expect(file.header.version).toBe(4.01);
    expect(file.header.leapSeconds).toEqual({ current: 18 });
    expect(file.ephemerides.map((e) => `${e.satellite} ${e.message}`)).toEqual([
      'G05 LNAV',
      'E11 INAV',
      'E11 FNAV',
      'C08 D1',
      'C03 D2',
    ]);
  });
  it('parseRinexNav(text) gives the same G05 record in versions 3.05 and 4.01', () => {
    const v3 = parseRinexNav(V3).ephemerides[0]!;
    const v4 = file.ephemerides[0]!;
    const strip = ({ line: _l, sourceName: _s, ...rest }: typeof v3) => rest;
    expect(strip(v4)).toEqual(strip(v3));
  });
  it('parseRinexNav(text) recognises CNAV, FDMA, SBAS, STO, EOP and ION records and skips them with reasons', () => {
    expect(file.skipped.map((s) => `${s.recordType} ${s.satellite} ${s.message}`)).toEqual([
      'EPH G05 CNAV',
      'EPH R05 FDMA',
      'EPH S20 SBAS',
      'STO G05 LNAV',
      'EOP G05 CNV2',
      'ION G05 LNAV',
    ]);
    expect(file.skipped.find((s) => s.recordType === 'ION')!.reason).toMatch(/ionosphere/);
    expect(file.skipped.find((s) => s.recordType === 'STO')!.reason).toMatch(/time offset/);
    expect(file.skipped.find((s) => s.recordType === 'EOP')!.reason).toMatch(/Earth orientation/);
    expect(file.skipped[0]!.reason).toMatch(/not modelled/);
  });
});

describe('readRinexNav: streaming', () => {
  it('readRinexNav(chunks) yields the same events from 7-character chunks as from the whole text', async () => {
    const chunks = (async function* () {
      for (let i = 0; i < V3.length; i += 7) yield V3.slice(i, i + 7);
    })();
    const events: RinexNavEvent[] = [];
    for await (const ev of readRinexNav(chunks, { sourceName: 'mixed-v305.rnx' })) events.push(ev);
    const whole = parseRinexNav(V3, { sourceName: 'mixed-v305.rnx' });
    expect(events[0]).toEqual({ kind: 'header', header: whole.header });
    expect(events.filter((e) => e.kind === 'ephemeris').map((e) => (e as { ephemeris: unknown }).ephemeris)).toEqual(
      whole.ephemerides,
    );
    expect(events.filter((e) => e.kind === 'skipped')).toHaveLength(3);
  });
  it('readRinexNav(text) with CR LF line ends reads the same records', async () => {
    const events: RinexNavEvent[] = [];
    for await (const ev of readRinexNav(V4.replace(/\n/g, '\r\n'))) events.push(ev);
    expect(events.filter((e) => e.kind === 'ephemeris')).toHaveLength(5);
  });
});

describe('parseRinexNav: malformed input throws ParseError with file, line and column', () => {
  const lines = V3.split('\n');
  const withLine = (n: number, text: string) => lines.map((l, i) => (i === n - 1 ? text : l)).join('\n');

  it('parseRinexNav(truncated file) reports the record cut short at the end', () => {
    expectParseError(
      () => parseRinexNav(read('truncated-v305.rnx'), { sourceName: 'truncated-v305.rnx' }),
      21,
      1,
      /^truncated-v305\.rnx:21:1: expected 8 lines for the GPS record of G21 starting at line 16 \(found 5: truncated record\)/,
    );
  });
  it('parseRinexNav(text) reports a record cut short by the next record', () => {
    const cut = [...lines.slice(0, 12), ...lines.slice(15)].join('\n');
    expectParseError(() => parseRinexNav(cut), 13, 1, /8 lines for the GPS record of G05 starting at line 8 \(found 5/);
  });
  it('parseRinexNav(empty) and a file ending inside the header are errors', () => {
    expectParseError(() => parseRinexNav(''), 1, 1, /RINEX VERSION \/ TYPE/);
    expectParseError(() => parseRinexNav(`${lines.slice(0, 4).join('\n')}\n`), 5, 1, /END OF HEADER.*truncated/);
  });
  it('parseRinexNav(text) rejects version 2, a non-navigation file type and a first line without its label', () => {
    expectParseError(
      () => parseRinexNav(withLine(1, lines[0]!.replace('3.05', '2.11'))),
      1,
      41,
      /RINEX 2\.11 defines no mixed or Galileo navigation file/,
    );
    expectParseError(() => parseRinexNav(withLine(1, lines[0]!.replace('3.05', '2.12'))), 1, 1, /2\.12 was a draft/);
    expectParseError(
      () => parseRinexNav(withLine(1, lines[0]!.replace('3.05', '2.01'))),
      1,
      1,
      /before 2\.10 are not read/,
    );
    expectParseError(
      () => parseRinexNav(withLine(1, lines[0]!.replace('3.05', '5.00'))),
      1,
      1,
      /version 2\.10, 2\.11, 3\.0x or 4\.0x/,
    );
    expectParseError(() => parseRinexNav(withLine(1, lines[0]!.replace('N: GNSS', 'O: GNSS'))), 1, 21, /file type 'N'/);
    expectParseError(() => parseRinexNav(withLine(1, lines[0]!.slice(0, 60))), 1, 61, /RINEX VERSION \/ TYPE/);
    expectParseError(
      () => parseRinexNav(withLine(1, lines[0]!.replace('M: MIXED', 'X: MIXED'))),
      1,
      41,
      /satellite system/,
    );
  });
  it('parseRinexNav(text) rejects a header line without label, a second version line and bad leap seconds', () => {
    expectParseError(() => parseRinexNav(withLine(3, 'no label here')), 3, 61, /header label/);
    expectParseError(() => parseRinexNav(withLine(3, lines[0]!)), 3, 61, /single RINEX VERSION/);
    expectParseError(() => parseRinexNav(withLine(6, `${'    x8'.padEnd(60)}LEAP SECONDS`)), 6, 1, /integer/);
    expectParseError(
      () => parseRinexNav(withLine(6, `${''.padEnd(60)}LEAP SECONDS`)),
      6,
      1,
      /current number of leap seconds/,
    );
  });
  it('parseRinexNav(text) names the column of a malformed number and of a missing required field', () => {
    const bad = lines[9]!.slice(0, 4 + 19) + '  0.12345X789012D-01'.slice(1) + lines[9]!.slice(42);
    expectParseError(() => parseRinexNav(withLine(10, bad)), 10, 24, /eccentricity e as a Fortran real/);
    const blank = lines[9]!.slice(0, 61) + ' '.repeat(19);
    expectParseError(
      () => parseRinexNav(withLine(10, blank)),
      10,
      62,
      /sqrt\(A\) \(√m\) \(a real number, format D19\.12, columns 62-80\)/,
    );
  });
  it('parseRinexNav(text) rejects an invalid epoch, a bad record start, a misplaced continuation and out-of-range elements', () => {
    expectParseError(
      () => parseRinexNav(withLine(8, lines[7]!.replace('2024 01 07', '2024 13 07'))),
      8,
      5,
      /valid calendar epoch/,
    );
    expectParseError(() => parseRinexNav(withLine(8, lines[7]!.replace('2024 01 07', '2024 0x 07'))), 8, 10, /month/);
    expectParseError(
      () => parseRinexNav(withLine(8, `X05${lines[7]!.slice(3)}`)),
      8,
      1,
      /first line of a navigation record/,
    );
    expectParseError(
      () => parseRinexNav(withLine(9, `G${lines[8]!.slice(1)}`)),
      9,
      1,
      /4 blanks before broadcast orbit line 1/,
    );
    expectParseError(() => parseRinexNav(withLine(9, `xx  ${lines[8]!.slice(4)}`)), 9, 1, /4 blanks/);
    const e = `${lines[9]!.slice(0, 23)}  .150000000000D+01${lines[9]!.slice(42)}`;
    expectParseError(() => parseRinexNav(withLine(10, e)), 10, 24, /eccentricity in \[0, 1\)/);
    const sqrtA = `${lines[9]!.slice(0, 61)}  .515379589081D+02`;
    expectParseError(() => parseRinexNav(withLine(10, sqrtA)), 10, 62, /sqrt\(A\) in \(2500, 100000\)/);
  });
  it('parseRinexNav(text) rejects a line that ends inside a D19.12 field (a cut line would misread its last number)', () => {
    expectParseError(
      () => parseRinexNav(withLine(15, lines[14]!.slice(0, 30))),
      15,
      31,
      /complete D19\.12 field ending at column 42/,
    );
    expectParseError(() => parseRinexNav(withLine(8, lines[7]!.slice(0, 50))), 8, 51, /ending at column 61/);
  });
  it('parseRinexNav(text) reports a skipped GLONASS record cut short (minimum line count)', () => {
    const at = lines.findIndex((l) => l.startsWith('R05'));
    const cut = [...lines.slice(0, at + 2), ...lines.slice(at + 4)].join('\n');
    expectParseError(() => parseRinexNav(cut), at + 3, 1, /at least 4 lines for the GLONASS record of R05/);
  });
  it('parseRinexNav(text) rejects t_oe outside the week, a fractional week and a week far from t_oc', () => {
    const toe = `      .700000000000D+06${lines[10]!.slice(23)}`;
    expectParseError(() => parseRinexNav(withLine(11, toe)), 11, 5, /t_oe in \[0, 604800\)/);
    const week = (w: string) => lines[12]!.slice(0, 42) + w + lines[12]!.slice(61);
    expectParseError(
      () => parseRinexNav(withLine(13, week('  .229650000000D+04'))),
      13,
      43,
      /non-negative integer week/,
    );
    expectParseError(
      () => parseRinexNav(withLine(13, week('  .220000000000D+04'))),
      13,
      43,
      /consistent with the epoch t_oc/,
    );
  });
  it('parseRinexNav(text) rejects a BeiDou t_oc before BDT week 0 (2006-01-01) and a Galileo t_oc before GST week 0 (1999-08-22) at the epoch', () => {
    const c08 = lines.findIndex((l) => l.startsWith('C08'));
    expectParseError(
      () => parseRinexNav(withLine(c08 + 1, lines[c08]!.replace('C08 2024', 'C08 2005'))),
      c08 + 1,
      5,
      /t_oc at or after the start of BDT week 0, 2006-01-01T00:00:00 BDT/,
    );
    const e11 = lines.findIndex((l) => l.startsWith('E11'));
    expectParseError(
      () => parseRinexNav(withLine(e11 + 1, lines[e11]!.replace('E11 2024', 'E11 1999'))),
      e11 + 1,
      5,
      /t_oc at or after the start of GST week 0, 1999-08-22T00:00:00 GST/,
    );
  });
  it('parseRinexNav(text) rejects Galileo data-source bits that name neither or both message kinds', () => {
    const at = lines.findIndex((l) => l.startsWith('E11')) + 5;
    const ds = `${lines[at]!.slice(0, 23)}  .000000000000D+00${lines[at]!.slice(42)}`;
    expectParseError(() => parseRinexNav(withLine(at + 1, ds)), at + 1, 24, /I\/NAV.*F\/NAV/);
    const neg = `${lines[at]!.slice(0, 23)} -.100000000000D+01${lines[at]!.slice(42)}`;
    expectParseError(() => parseRinexNav(withLine(at + 1, neg)), at + 1, 24, /data-source bits/);
  });
  it('parseRinexNav(version 4) rejects unknown record types, bad satellite ids, missing message types, stray lines and extra lines', () => {
    const v4 = V4.split('\n');
    const w4 = (n: number, text: string) => v4.map((l, i) => (i === n - 1 ? text : l)).join('\n');
    expectParseError(() => parseRinexNav(w4(6, '> XYZ G05 LNAV')), 6, 3, /EPH, STO, EOP or ION/);
    expectParseError(() => parseRinexNav(w4(6, '> EPH 5 LNAV')), 6, 7, /satellite identifier/);
    expectParseError(() => parseRinexNav(w4(6, '> EPH G05')), 6, 11, /message type/);
    expectParseError(() => parseRinexNav(w4(6, 'G05 stray')), 6, 1, /record header such as '> EPH G05 LNAV'/);
    expectParseError(() => parseRinexNav(w4(6, '> EPH G07 LNAV')), 7, 1, /satellite G07 as named/);
    const extra = [...v4.slice(0, 14), v4[13]!, ...v4.slice(14)].join('\n');
    expectParseError(() => parseRinexNav(extra), 15, 1, /has 8 lines/);
  });
  it('parseRinexNav(version 4) notes a Galileo record whose data-source bits contradict its header, and a D1 header on a GEO', () => {
    const v4 = V4.replace('> EPH E11 FNAV', '> EPH E11 INAV').replace('> EPH C03 D2', '> EPH C03 D1');
    const file = parseRinexNav(v4);
    expect(file.ephemerides[2]!.notes.join()).toMatch(/indicate FNAV, the record header says INAV/);
    expect(file.ephemerides[4]!.notes.join()).toMatch(/D1 record for a geostationary satellite/);
  });
});

describe('parseRinexNav: fuzzing (fast-check, mutated and truncated files)', () => {
  const alphabet = [' ', 'D', 'E', '-', '+', '.', '0', '9', '\n', '>', 'G', 'X', '\r'];
  const run = (text: string) => {
    try {
      parseRinexNav(text);
    } catch (e) {
      if (!(e instanceof ParseError)) throw e;
    }
  };
  it('parseRinexNav(mutated 3.05 text) returns or throws ParseError, never anything else', () => {
    fc.assert(
      fc.property(fc.nat({ max: V3.length - 1 }), fc.constantFrom(...alphabet), fc.nat({ max: 3 }), (at, ch, del) => {
        run(V3.slice(0, at) + ch + V3.slice(at + del));
      }),
      { seed: 20261202, numRuns: 400 },
    );
  });
  it('parseRinexNav(mutated 4.01 text) returns or throws ParseError, never anything else', () => {
    fc.assert(
      fc.property(fc.nat({ max: V4.length - 1 }), fc.constantFrom(...alphabet), fc.nat({ max: 3 }), (at, ch, del) => {
        run(V4.slice(0, at) + ch + V4.slice(at + del));
      }),
      { seed: 20261202, numRuns: 400 },
    );
  });
  it("parseRinexNav(truncated text) throws ParseError, or returns a prefix of the full file's records (cut on a record or optional-field boundary)", () => {
    const full = parseRinexNav(V3);
    fc.assert(
      fc.property(fc.nat({ max: V3.length - 1 }), (cut) => {
        let f: ReturnType<typeof parseRinexNav>;
        try {
          f = parseRinexNav(V3.slice(0, cut));
        } catch (e) {
          expect(e).toBeInstanceOf(ParseError);
          return;
        }
        const n = f.ephemerides.length;
        expect(f.ephemerides.slice(0, Math.max(0, n - 1))).toEqual(full.ephemerides.slice(0, Math.max(0, n - 1)));
        if (n > 0) {
          // The last record may only have lost the optional fields of its last line (fit interval or AODC,
          // transmission time): RINEX lets a writer drop trailing blank fields, so such a cut is indistinguishable.
          const {
            fitIntervalSeconds: _a,
            transmission: _b,
            transmissionSecondsOfWeek: _i,
            notes: _c,
            issueOfDataClock: _g,
            ...last
          } = f.ephemerides[n - 1]!;
          const {
            fitIntervalSeconds: _d,
            transmission: _e,
            transmissionSecondsOfWeek: _j,
            notes: _f,
            issueOfDataClock: _h,
            ...ref
          } = full.ephemerides[n - 1]!;
          expect(last).toEqual(ref);
        }
        expect(f.skipped).toEqual(full.skipped.slice(0, f.skipped.length));
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });
});

describe('readRinexNav: bounded memory on long inputs', () => {
  it('readRinexNav(chunks) yields each record after pulling only the chunks that hold it (a month of files is never held whole)', async () => {
    const header = V3.slice(0, V3.indexOf('G05 '));
    const record = V3.slice(V3.indexOf('G05 '), V3.indexOf('G05 2024 01 07 02'));
    let pulled = 0;
    function* monthOfRecords(): Generator<string> {
      pulled++;
      yield header;
      for (let k = 0; k < 100_000; k++) {
        pulled++;
        yield record;
      }
    }
    let n = 0;
    for await (const ev of readRinexNav(monthOfRecords())) {
      if (ev.kind !== 'ephemeris') continue;
      n++;
      expect(pulled).toBeLessThanOrEqual(n + 1);
      if (n === 200) break;
    }
    expect(n).toBe(200);
  });
});
