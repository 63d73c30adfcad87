import { describe, expect, it } from 'vitest';
import { parseRinexNav } from '../../src/io/rinex-nav.js';
import { correctionReference, REFERENCE_WEEK_SYSTEM } from '../../src/io/rinex-time-correction.js';
import { formatFileEpoch } from '../../src/time/file-epochs.js';
import { BUNDLED_LEAP_SECONDS } from '../../src/time/leap-seconds.js';
import { createTimeScales } from '../../src/time/scales.js';

const TS = createTimeScales(BUNDLED_LEAP_SECONDS);

/** A RINEX 3.05 TIME SYSTEM CORR line: A4,1X,D17.10,D16.9,I7,I5 then the label at column 61 [M]. */
function corrLine(type: string, secondsOfWeek: number, week: number): string {
  const body = `${type.padEnd(4)} 9.3132257462D-10 1.332267630D-15${String(secondsOfWeek).padStart(7)}${String(week).padStart(5)}`;
  return `${body.padEnd(60)}TIME SYSTEM CORR`;
}

function header(lines: string[]): string {
  return [
    `${'     3.05'.padEnd(20)}${'N: GNSS NAV DATA'.padEnd(20)}${'M: MIXED'.padEnd(20)}RINEX VERSION / TYPE`,
    ...lines,
    `${''.padEnd(60)}END OF HEADER`,
    '',
  ].join('\n');
}

describe('RINEX time-system correction reference times', () => {
  it('parseRinexNav(TIME SYSTEM CORR GPUT, QZUT, BDUT) places t_ref on the week system its type names (RINEX 3.05 TIME SYSTEM CORR [M]; dates by Python datetime [C])', () => {
    const file = parseRinexNav(
      header([corrLine('GPUT', 405504, 2296), corrLine('QZUT', 405504, 2296), corrLine('BDUT', 345600, 940)]),
      { sourceName: 'corr.rnx' },
    );
    const stamps = file.header.timeSystemCorrections.map((c) => {
      if (c.reference === undefined) throw new Error(`${c.type} has no reference`);
      return [c.type, formatFileEpoch(TS, c.reference, REFERENCE_WEEK_SYSTEM[c.type] === 'BDT' ? 'BDT' : 'GPS')];
    });
    // datetime(1980,1,6) + timedelta(weeks=2296, seconds=405504) = 2024-01-11 16:38:24;
    // datetime(2006,1,1) + timedelta(weeks=940, seconds=345600) = 2024-01-11 00:00:00.
    expect(stamps).toEqual([
      ['GPUT', '2024-01-11T16:38:24'],
      ['QZUT', '2024-01-11T16:38:24'],
      ['BDUT', '2024-01-11T00:00:00'],
    ]);
    // BDT = GPST − 14 s (BDS-SIS-ICD [M]): BDT week 940 starts 14 s after GPS week 1356 (2006-01-01T00:00:14 GPS).
    const bdut = file.header.timeSystemCorrections[2]?.reference;
    if (bdut === undefined) throw new Error('BDUT has no reference');
    expect(formatFileEpoch(TS, bdut, 'GPS')).toBe('2024-01-11T00:00:14');
  });

  it('parseRinexNav(TIME SYSTEM CORR GAUT, GPGA, GLUT, SBUT, IRUT) leaves reference undefined where the week system is ambiguous or absent, keeping the fields as written', () => {
    const types = ['GAUT', 'GPGA', 'GLUT', 'SBUT', 'IRUT'];
    const file = parseRinexNav(header(types.map((t) => corrLine(t, 405504, 2296))), { sourceName: 'corr.rnx' });
    for (const c of file.header.timeSystemCorrections) {
      expect('reference' in c).toBe(false);
      expect([c.referenceWeek, c.referenceSecondsOfWeek]).toEqual([2296, 405504]);
    }
    expect(file.header.timeSystemCorrections.map((c) => c.type)).toEqual(types);
  });

  it('correctionReference(type, week, T) is undefined for T outside [0, 604800) s or a negative week, never wrapped into another week', () => {
    expect(correctionReference('GPUT', 2296, 604_800)).toBeUndefined();
    expect(correctionReference('GPUT', -1, 0)).toBeUndefined();
    expect(correctionReference('GPUT', 2296, 604_799)).toBeDefined();
  });
});
