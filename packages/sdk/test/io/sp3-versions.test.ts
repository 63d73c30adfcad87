// SP3-a and SP3-b (and what every version refuses): fixtures written by test/fixtures/sp3/generate_ab.py,
// each beside a twin holding the same data in SP3-c layout. Reference values in expected-ab.json are
// computed by that script without Tauline code (SOURCE.md).

import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { TaulineError } from '../../src/errors.js';
import { parseSp3 } from '../../src/io/sp3.js';
import { type PreciseCorrectionResult, PreciseCorrectionStream } from '../../src/relativity/precise.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales, type Instant } from '../../src/time/index.js';
import { expectParseError } from './parse-errors.js';

const FIXTURES = new URL('../../../../test/fixtures/sp3/', import.meta.url);
const read = (name: string) => readFileSync(new URL(name, FIXTURES), 'utf8');
const A = read('orbit-a-pv.sp3');
const A_AS_C = read('orbit-a-as-c.sp3');
const B = read('orbit-b-p.sp3');
const B_AS_C = read('orbit-b-as-c.sp3');
const EXPECTED = JSON.parse(read('expected-ab.json')) as Record<
  string,
  { satellite: string; t: string; relativisticSeconds: number; satellites?: string[] }
>;

/** −2 r·v/c² results of a whole file, in stream order. */
function corrections(text: string): PreciseCorrectionResult[] {
  const file = parseSp3(text);
  const stream = new PreciseCorrectionStream({ epochInterval: file.header.epochInterval });
  return [...file.epochs.flatMap((e) => stream.push(e)), ...stream.finish()];
}

/** ISO text of an epoch on GPS time (both fixtures are GPS time), whole seconds. */
const gpsScales = createTimeScales(BUNDLED_LEAP_SECONDS);
const iso = (e: { epoch: Instant }) => gpsScales.formatIso(e.epoch, { scale: 'GPS', fractionDigits: 0 });

describe('parseSp3: SP3-a (Remondi 1989/1991 [V2]: 22-line header, I3 identifiers, 60-column records, GPS time)', () => {
  const file = parseSp3(A, { sourceName: 'orbit-a-pv.sp3' });
  it('parseSp3(SP3-a text) reads version a, the velocity flag, I3 satellite numbers as G PRNs and assumes GPS time', () => {
    expect(file.header).toMatchObject({
      version: 'a',
      hasVelocities: true,
      epochCount: 4,
      satellites: ['G07', 'G21'],
      timeSystem: 'GPS',
      timeSystemAssumed: true,
      fileType: 'G',
      gpsWeek: 1232,
      modifiedJulianDay: 52868,
      epochInterval: 900,
      lineCount: 22,
    });
    expect(file.header.accuracyExponents).toEqual({ G07: 7, G21: 7 });
    expect(file.epochs).toHaveLength(4);
    expect(file.epochs[0]!.records.map((r) => r.satellite)).toEqual(['G07', 'G21']);
  });
  it('parseSp3(SP3-a text) lists a satellite of the header without a P record at an epoch in missingSatellites (generate_ab.py leaves G21 out at 00:30)', () => {
    const missing = file.epochs.map((e) => e.missingSatellites);
    expect(missing).toEqual([[], [], ['G21'], []]);
    expect(iso(file.epochs[2]!)).toBe(EXPECTED.missing!.t);
    expect(missing[2]).toEqual(EXPECTED.missing!.satellites);
  });
  it('PreciseCorrectionStream(SP3-a epochs) reports G21 at 00:30 as a gap, never skips it', () => {
    const gaps = corrections(A)
      .filter((r) => r.kind === 'gap')
      .map((r) => r.gap);
    expect(gaps).toHaveLength(1);
    expect(gaps[0]).toMatchObject({ satellite: 'G21', reason: 'no record at this epoch' });
    expect(iso(gaps[0]!)).toBe('2003-08-17T00:30:00');
  });
  it('PreciseCorrectionStream(SP3-a) gives the −2 r·v/c² of the same data written as SP3-c, to the last bit', () => {
    expect(corrections(A)).toEqual(corrections(A_AS_C));
  });
  it('PreciseCorrectionStream(SP3-a) matches generate_ab.py: −2 r·v/c² of G07 at 00:15 from the written values within 1e-22 s (IERS 2010 eq. 10.11 [V1], independent Python [C])', () => {
    const ref = EXPECTED['orbit-a-pv.sp3']!;
    const hit = corrections(A).find(
      (r) => r.kind === 'sample' && r.sample.satellite === ref.satellite && iso(r.sample) === ref.t,
    );
    expect(hit?.kind).toBe('sample');
    if (hit?.kind !== 'sample') return;
    expect(Math.abs(hit.sample.relativisticSeconds - ref.relativisticSeconds)).toBeLessThan(1e-22);
  });
});

describe('parseSp3: SP3-b (Gurtner & Rothacher 1998 [V2]: A1,I2 identifiers for GPS and GLONASS, otherwise as SP3-a)', () => {
  const file = parseSp3(B, { sourceName: 'orbit-b-p.sp3' });
  it('parseSp3(SP3-b text) reads version b, positions only, GPS and GLONASS identifiers, GPS time assumed', () => {
    expect(file.header).toMatchObject({
      version: 'b',
      hasVelocities: false,
      satellites: ['G07', 'R04'],
      timeSystem: 'GPS',
      timeSystemAssumed: true,
    });
    expect(file.epochs).toHaveLength(13);
    expect(file.epochs.every((e) => e.missingSatellites.length === 0)).toBe(true);
  });
  it('parseSp3(SP3-b text) reads a blank system letter as GPS (A1,I2 with a blank letter)', () => {
    const blank = parseSp3(B.replace('G07R04', ' 07R04').replace(/^PG07/gm, 'P 07'));
    expect(blank.header.satellites).toEqual(['G07', 'R04']);
    expect(blank.epochs[0]!.records[0]!.satellite).toBe('G07');
  });
  it('PreciseCorrectionStream(SP3-b) gives the −2 r·v/c² of the same data written as SP3-c, to the last bit', () => {
    expect(corrections(B)).toEqual(corrections(B_AS_C));
  });
  it('PreciseCorrectionStream(SP3-b, 9-point Lagrange) matches the two-body −2√(GM a) e sin E/c² of R04 at 01:30 from generate_ab.py within 5e-15 s (centred window; IERS 2010 eq. 10.10 [V1], Python [C])', () => {
    const ref = EXPECTED['orbit-b-p.sp3']!;
    const hit = corrections(B).find(
      (r) => r.kind === 'sample' && r.sample.satellite === ref.satellite && iso(r.sample) === ref.t,
    );
    expect(hit?.kind).toBe('sample');
    if (hit?.kind !== 'sample') return;
    expect(Math.abs(hit.sample.relativisticSeconds - ref.relativisticSeconds)).toBeLessThan(5e-15);
  });
});

describe('parseSp3: refusals with file:line:column (all versions)', () => {
  const aLines = A.split('\n');
  const bLines = B.split('\n');
  const withLine = (lines: string[], n: number, text: string) =>
    lines.map((l, i) => (i === n - 1 ? text : l)).join('\n');
  const src = { sourceName: 'x.sp3' };

  it('parseSp3 refuses a non-finite coordinate (-1e400) or velocity (1e400) at the reader, naming file, line and column', () => {
    expectParseError(
      () =>
        parseSp3(withLine(aLines, 24, aLines[23]!.slice(0, 4) + '-1e400'.padStart(14) + aLines[23]!.slice(18)), src),
      24,
      5,
      /^x\.sp3:24:5: expected x \(km\) \(a finite number of magnitude below 100000000/,
    );
    expectParseError(
      () =>
        parseSp3(withLine(aLines, 25, aLines[24]!.slice(0, 32) + '1e400'.padStart(14) + aLines[24]!.slice(46)), src),
      25,
      33,
      /z velocity \(dm\/s\) \(a finite number/,
    );
    const d = read('orbit-d-p.sp3').split('\n');
    expectParseError(
      () => parseSp3(withLine(d, 22, d[21]!.slice(0, 18) + '-1e400'.padStart(14) + d[21]!.slice(32))),
      22,
      19,
      /y \(km\) \(a finite number/,
    );
  });
  it('parseSp3 refuses a finite value no F14.6 field can hold (1e300 km would overflow r·v later)', () => {
    expectParseError(
      () =>
        parseSp3(withLine(aLines, 24, aLines[23]!.slice(0, 18) + '1e300'.padStart(14) + aLines[23]!.slice(32)), src),
      24,
      19,
      /magnitude below 100000000/,
    );
  });
  it('parseSp3 refuses a non-finite header number (epoch interval 1e400)', () => {
    expectParseError(
      () => parseSp3(withLine(aLines, 2, aLines[1]!.slice(0, 24) + '1e400'.padStart(14) + aLines[1]!.slice(38))),
      2,
      25,
      /epoch interval \(s\) \(a finite number/,
    );
  });
  it('parseSp3 refuses SP3-a/b records wider than 60 columns, EP/EV records and a header that is not the fixed 22 lines', () => {
    expectParseError(
      () => parseSp3(withLine(aLines, 24, `${aLines[23]!}  7  7  7 100`), src),
      24,
      63,
      /nothing after column 60 \(SP3-a records are 60 columns wide\)/,
    );
    expectParseError(
      () => parseSp3(withLine(bLines, 25, 'EP  G07'), src),
      25,
      1,
      /record starting with 'P', 'V', '\*' or the line 'EOF' \(SP3-b\)/,
    );
    const extraComment = [...aLines.slice(0, 22), '/* a fifth comment', ...aLines.slice(22)].join('\n');
    expectParseError(
      () => parseSp3(extraComment, src),
      24,
      1,
      /fixed SP3-a header of 22 lines: 4 '\/\*' lines \(found 5\)/,
    );
  });
  it('parseSp3 refuses an SP3-a identifier that is not I3, an SP3-b time system other than the placeholder or a code, and an unknown version', () => {
    expectParseError(
      () => parseSp3(withLine(aLines, 3, aLines[2]!.replace('  7 21', 'G07 21')), src),
      3,
      10,
      /SP3-a satellite number \(I3/,
    );
    expectParseError(
      () => parseSp3(withLine(aLines, 24, `PG07${aLines[23]!.slice(4)}`), src),
      24,
      2,
      /SP3-a satellite number/,
    );
    expectParseError(
      () => parseSp3(withLine(bLines, 13, bLines[12]!.replace('cc ccc ccc', 'cc XYZ ccc')), src),
      13,
      10,
      /placeholder 'ccc': GPS time/,
    );
    expect(parseSp3(withLine(bLines, 13, bLines[12]!.replace('cc ccc ccc', 'cc UTC ccc'))).header).toMatchObject({
      timeSystem: 'UTC',
      timeSystemAssumed: false,
    });
    expectParseError(
      () => parseSp3(withLine(aLines, 1, `#e${aLines[0]!.slice(2)}`), src),
      1,
      2,
      /version 'a', 'b', 'c' or 'd'/,
    );
  });
  it('parseSp3 refuses a satellite listed twice in the header', () => {
    expectParseError(
      () => parseSp3(withLine(bLines, 3, bLines[2]!.replace('G07R04', 'G07G07')), src),
      3,
      13,
      /each satellite listed once/,
    );
  });
});

describe('parseSp3: seeded mutation guard for SP3-a and SP3-b (2500 inputs each)', () => {
  /** Every number an accepted file yields must be finite (positions, velocities, clocks, rates, epochs). */
  function assertFinite(text: string): void {
    const file = parseSp3(text);
    for (const e of file.epochs) {
      expect(Number.isFinite(e.epoch.taiSeconds) && Number.isFinite(e.epoch.taiFraction)).toBe(true);
      for (const r of e.records) {
        for (const v of [...(r.position ?? []), ...(r.velocity ?? []), r.clock ?? 0, r.clockRate ?? 0])
          expect(Number.isFinite(v)).toBe(true);
      }
    }
    for (const r of corrections(text))
      if (r.kind === 'sample') expect(Number.isFinite(r.sample.relativisticSeconds)).toBe(true);
  }
  const pieces = [
    ' ',
    '0',
    '9',
    '.',
    '-',
    'e',
    'E',
    '400',
    '1e400',
    '-1e400',
    '\n',
    '*',
    'P',
    'V',
    'G',
    'R',
    '#',
    '+',
    'c',
    'EOF',
    '999999.999999',
  ];
  for (const [name, text] of [
    ['SP3-a', A],
    ['SP3-b', B],
  ] as const) {
    it(`parseSp3(mutated ${name}) either returns finite values or throws ParseError, for 2500 seeded mutations`, () => {
      fc.assert(
        fc.property(fc.nat({ max: 1 << 20 }), fc.constantFrom(...pieces), fc.nat({ max: 4 }), (pos, piece, del) => {
          const at = pos % text.length;
          const mutated = text.slice(0, at) + piece + text.slice(at + del);
          try {
            assertFinite(mutated);
          } catch (e) {
            // A typed refusal is the only acceptable failure (ParseError from the reader; InvalidArgumentError
            // from the correction for a velocity no satellite has); any other error fails the guard.
            if (!(e instanceof TaulineError)) throw e;
          }
        }),
        { seed: 20261203, numRuns: 2500 },
      );
    });
  }
});
