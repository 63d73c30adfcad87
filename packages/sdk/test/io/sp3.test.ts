import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import { parseSp3, readSp3, type Sp3Event } from '../../src/io/sp3.js';
import { expectParseError } from './parse-errors.js';

const FIXTURES = new URL('../../../../test/fixtures/sp3/', import.meta.url);
const read = (name: string) => readFileSync(new URL(name, FIXTURES), 'utf8');
const PV = read('orbit-c-pv.sp3');
const P = read('orbit-d-p.sp3');

describe('parseSp3: SP3-c with velocities (SP3-c, Hilla 2002 [M])', () => {
  const file = parseSp3(PV, { sourceName: 'orbit-c-pv.sp3' });
  it('parseSp3(text) reads the header: version, P/V flag, epochs, frame, agency, time system, satellites', () => {
    expect(file.header).toMatchObject({
      version: 'c',
      hasVelocities: true,
      epochCount: 4,
      dataUsed: 'ORBIT',
      coordinateFrame: 'IGS20',
      orbitType: 'FIT',
      agency: 'TLN',
      gpsWeek: 2296,
      secondsOfWeek: 0,
      epochInterval: 900,
      modifiedJulianDay: 60316,
      fractionalDay: 0,
      satellites: ['G05', 'E11', 'C08'],
      fileType: 'M',
      timeSystem: 'GPS',
      positionBase: 1.25,
      clockBase: 1.025,
      lineCount: 22,
    });
    expect(file.header.firstEpoch).toEqual({ year: 2024, month: 1, day: 7, hour: 0, minute: 0, second: 0 });
    expect(file.header.accuracyExponents).toEqual({ G05: 5, E11: 5, C08: 5 });
    expect(file.header.comments).toHaveLength(4);
  });
  it('parseSp3(text) converts positions km → m, velocities dm/s → m/s, clocks µs → s and rates 10⁻⁴ µs/s → s/s', () => {
    const g05 = file.epochs[0]!.records[0]!;
    expect(g05.satellite).toBe('G05');
    expect(g05.position![0]).toBeCloseTo(14002291.203, 6);
    expect(g05.position![2]).toBeCloseTo(21532704.054, 6);
    expect(g05.velocity![0]).toBeCloseTo(1408.6207714, 9);
    expect(g05.clock).toBeCloseTo(100e-6, 18);
    expect(g05.clockRate).toBeCloseTo(0.1e-10, 24);
    expect(file.epochs.map((e) => e.epoch.secondsSince(file.epochs[0]!.epoch))).toEqual([0, 900, 1800, 2700]);
  });
  it('parseSp3(text) treats position 0.000000 and clock 999999.999999 as missing, never as zero', () => {
    const e11 = file.epochs[2]!.records.find((r) => r.satellite === 'E11')!;
    expect(e11.position).toBeUndefined();
    expect(e11.velocity).toBeUndefined();
    expect(e11.clock).toBeCloseTo(100.02e-6, 18);
    const c08 = file.epochs[1]!.records.find((r) => r.satellite === 'C08')!;
    expect(c08.clock).toBeUndefined();
    expect(c08.clockRate).toBeUndefined();
    expect(c08.position).toBeDefined();
  });
});

describe('parseSp3: SP3-d positions only (SP3-d, Hilla 2016 [M])', () => {
  const file = parseSp3(P, { sourceName: 'orbit-d-p.sp3' });
  it('parseSp3(text) reads an SP3-d file without velocity records and a comment longer than 60 characters', () => {
    expect(file.header.version).toBe('d');
    expect(file.header.hasVelocities).toBe(false);
    expect(file.header.comments[0]!.length).toBeGreaterThan(60);
    expect(file.epochs).toHaveLength(13);
    expect(file.epochs.every((e) => e.records.every((r) => r.velocity === undefined))).toBe(true);
  });
  it('parseSp3(text) reads the standard-deviation and flag columns', () => {
    const g30 = file.epochs[0]!.records[0]!;
    expect(g30).toMatchObject({
      satellite: 'G30',
      clockEvent: false,
      clockPredicted: false,
      maneuver: false,
      orbitPredicted: false,
    });
    const withFlags = parseSp3(P.replace(/^PG30.*$/m, (line) => `${line.padEnd(74)}EP  MP`));
    expect(withFlags.epochs[0]!.records[0]).toMatchObject({
      clockEvent: true,
      clockPredicted: true,
      maneuver: true,
      orbitPredicted: true,
    });
  });
  it('readSp3(chunks) streams the same epochs as parseSp3(text)', async () => {
    const events: Sp3Event[] = [];
    const chunks = (async function* () {
      for (let i = 0; i < P.length; i += 13) yield P.slice(i, i + 13);
    })();
    for await (const ev of readSp3(chunks, { sourceName: 'orbit-d-p.sp3' })) events.push(ev);
    expect(events[0]).toEqual({ kind: 'header', header: file.header });
    expect(events.slice(1).map((e) => (e as { epoch: unknown }).epoch)).toEqual(file.epochs);
  });
});

describe('parseSp3: malformed and truncated input throws ParseError with file, line and column', () => {
  const lines = P.split('\n');
  const withLine = (n: number, text: string) => lines.map((l, i) => (i === n - 1 ? text : l)).join('\n');

  it('parseSp3(truncated file) reports the cut line, and a file without EOF is truncated', () => {
    expectParseError(
      () => parseSp3(read('truncated.sp3'), { sourceName: 'truncated.sp3' }),
      58,
      19,
      /^truncated\.sp3:58:19: expected y \(km\)/,
    );
    expectParseError(() => parseSp3(P.replace('EOF\n', '')), lines.length - 1, 1, /closing 'EOF' line.*truncated/);
    expectParseError(() => parseSp3(''), 1, 1, /'#c' or '#d'/);
  });
  it('parseSp3(text) reports fewer epochs than declared and more epochs than declared', () => {
    const cut = P.replace(/\* {2}2024 {2}1 {2}7 {2}3 {2}0[\s\S]*EOF/, 'EOF');
    expectParseError(() => parseSp3(cut), 57, 1, /13 epochs as declared on line 1 \(found 12/);
    expectParseError(
      () => parseSp3(withLine(1, lines[0]!.replace('      13', '      12'))),
      57,
      1,
      /no more than the 12 epochs/,
    );
  });
  it('parseSp3(text) rejects an unknown version, a bad P/V flag, a bad line 2 and a bad epoch count', () => {
    expectParseError(() => parseSp3(withLine(1, `#x${lines[0]!.slice(2)}`)), 1, 2, /version 'a', 'b', 'c' or 'd'/);
    expectParseError(() => parseSp3(withLine(1, `#dX${lines[0]!.slice(3)}`)), 1, 3, /flag 'P' or 'V'/);
    expectParseError(() => parseSp3(withLine(1, `##${lines[0]!.slice(2)}`)), 1, 1, /first line/);
    expectParseError(
      () => parseSp3(withLine(1, lines[0]!.replace('      13', '       0'))),
      1,
      33,
      /positive number of epochs/,
    );
    expectParseError(
      () => parseSp3(withLine(1, lines[0]!.replace('2024  1  7', '2024 13  7'))),
      1,
      4,
      /valid calendar first epoch/,
    );
    expectParseError(() => parseSp3(withLine(2, `# ${lines[1]!.slice(2)}`)), 2, 1, /'##'/);
    expectParseError(
      () => parseSp3(withLine(2, lines[1]!.replace('900.00000000', '  0.00000000'))),
      2,
      25,
      /positive epoch interval/,
    );
    expectParseError(() => parseSp3(withLine(2, lines[1]!.replace('2296', '22x6'))), 2, 4, /GPS week/);
  });
  it('parseSp3(text) rejects bad satellite lists, time systems and unknown header lines', () => {
    expectParseError(() => parseSp3(withLine(3, lines[2]!.replace('G30', 'G3x'))), 3, 10, /satellite identifier/);
    expectParseError(
      () => parseSp3(withLine(3, lines[2]!.replace('    2   ', '    3   '))),
      21,
      1,
      /3 satellite identifiers/,
    );
    expectParseError(
      () => parseSp3(withLine(3, lines[2]!.replace('    2   ', '    1   '))),
      3,
      13,
      /no more than the 1 satellites/,
    );
    expectParseError(() => parseSp3(withLine(13, lines[12]!.replace('GPS', 'XYZ'))), 13, 10, /time system/);
    expectParseError(
      () => parseSp3(lines.map((l, i) => (i === 12 || i === 13 ? '/* no %c' : l)).join('\n')),
      21,
      1,
      /'%c' line giving the time system/,
    );
    expectParseError(() => parseSp3(withLine(8, `++       ${'  x'.repeat(17)}`)), 8, 10, /accuracy exponent/);
    expectParseError(() => parseSp3(withLine(20, '## stray')), 20, 1, /header line starting with/);
  });
  it('parseSp3(text) rejects bad records: unknown satellite, duplicate, bad number, misplaced velocity, out-of-order epochs', () => {
    expectParseError(
      () => parseSp3(withLine(22, lines[21]!.replace('PG30', 'PG29'))),
      22,
      2,
      /satellite listed in the header/,
    );
    expectParseError(() => parseSp3(withLine(23, lines[21]!)), 23, 2, /one position record for G30/);
    expectParseError(
      () => parseSp3(withLine(22, lines[21]!.replace('12801.695325', '12801.6953x5'))),
      22,
      5,
      /x \(km\)/,
    );
    expectParseError(
      () => parseSp3(withLine(23, `VG31${lines[22]!.slice(4)}`)),
      23,
      2,
      /velocity record right after the position record of the same satellite/,
    );
    expectParseError(() => parseSp3(withLine(24, lines[20]!)), 24, 4, /increasing time order/);
    expectParseError(
      () => parseSp3(withLine(22, `XG30${lines[21]!.slice(4)}`)),
      22,
      1,
      /record starting with 'P', 'V'/,
    );
    expectParseError(() => parseSp3(withLine(24, '*2024')), 24, 1, /epoch line starting with/);
    expectParseError(() => parseSp3(`${P}PG30\n`), lines.length, 1, /nothing after the 'EOF' line/);
  });
  it('parseSp3(text) rejects a second velocity record for the same satellite', () => {
    const pvLines = PV.split('\n');
    const dup = [...pvLines.slice(0, 25), pvLines[24], ...pvLines.slice(25)].join('\n');
    expectParseError(() => parseSp3(dup), 26, 1, /one velocity record for G05 per epoch/);
  });
});

describe('parseSp3: fuzzing (fast-check, mutated and truncated files)', () => {
  const alphabet = [' ', '0', '9', '.', '-', '*', 'P', 'V', 'E', '\n', '#', '+'];
  it('parseSp3(mutated text) returns or throws ParseError, never anything else', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(PV, P),
        fc.nat({ max: 4000 }),
        fc.constantFrom(...alphabet),
        fc.nat({ max: 3 }),
        (text, pos, ch, del) => {
          const at = pos % text.length;
          try {
            parseSp3(text.slice(0, at) + ch + text.slice(at + del));
          } catch (e) {
            if (!(e instanceof ParseError)) throw e;
          }
        },
      ),
      { seed: 20261202, numRuns: 500 },
    );
  });
  it('parseSp3(truncated text) always throws ParseError (no EOF line)', () => {
    fc.assert(
      fc.property(fc.constantFrom(PV, P), fc.nat({ max: 4000 }), (text, pos) => {
        const cut = pos % (text.length - 5);
        expect(() => parseSp3(text.slice(0, cut))).toThrow(ParseError);
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });
});

describe('readSp3: bounded memory on a day of multi-system 30-s data', () => {
  /** A lazily generated SP3-d file: 2880 epochs × 120 satellites (a full multi-GNSS day at 30 s), one chunk per epoch. */
  function* dayFile(pulled: { chunks: number }): Generator<string> {
    const sats = Array.from(
      { length: 120 },
      (_, k) => `${'GREC'.charAt(k % 4)}${String(1 + Math.floor(k / 4)).padStart(2, '0')}`,
    );
    const plus = [];
    for (let k = 0; k < sats.length; k += 17)
      plus.push(
        `${k === 0 ? `+  ${String(sats.length).padStart(3)}   ` : '+        '}${sats
          .slice(k, k + 17)
          .join('')
          .padEnd(51, ' ')}`,
      );
    pulled.chunks++;
    yield [
      '#dP2024  1  7  0  0  0.00000000    2880 ORBIT IGS20 FIT  TLN',
      '## 2296      0.00000000    30.00000000 60316 0.0000000000000',
      ...plus,
      '%c M  cc GPS ccc cccc cccc cccc cccc ccccc ccccc ccccc ccccc',
      '/* generated',
      '',
    ].join('\n');
    for (let e = 0; e < 2880; e++) {
      const h = Math.floor(e / 120);
      const m = Math.floor((e % 120) / 2);
      const s = (e % 2) * 30;
      const lines = [
        `*  2024  1  7 ${String(h).padStart(2)} ${String(m).padStart(2)} ${String(s).padStart(2)}.00000000`,
      ];
      for (const sat of sats) lines.push(`P${sat}  15000.000000  15000.000000  15000.000000    100.000000`);
      pulled.chunks++;
      yield `${lines.join('\n')}\n`;
    }
    pulled.chunks++;
    yield 'EOF\n';
  }

  it('readSp3(chunks) yields the first epochs after pulling only the chunks that hold them (the file is never held whole)', async () => {
    const pulled = { chunks: 0 };
    let epochs = 0;
    for await (const ev of readSp3(dayFile(pulled))) {
      if (ev.kind !== 'epoch') continue;
      epochs++;
      expect(ev.epoch.records).toHaveLength(120);
      // Epoch k is complete once the chunk of epoch k + 1 has been read: header + (k + 2) chunks.
      expect(pulled.chunks).toBeLessThanOrEqual(epochs + 2);
      if (epochs === 50) break;
    }
    expect(epochs).toBe(50);
  });
});
