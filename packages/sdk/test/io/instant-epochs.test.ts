// The readers' epochs are exact Instants (issue 16: "records carry Instant"): a 1e-7 s fraction written in a
// RINEX clock or SP3 epoch survives to the nanosecond, where the earlier float "scale seconds since 1980"
// (resolution 2.4e-7 s at 1.45e9 s) did not. Days are counted independently with Date.UTC; GPS time = TAI − 19 s
// (BIPM [V2]); Galileo System Time = TAI − 19 s (Galileo OS SIS ICD §5.1.2 as quoted [V2]).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import {
  parsePhaseText,
  parseRinexClock,
  parseRinexNav,
  parseSp3,
  readRinexClockSeries,
  rinexClockSeries,
} from '../../src/io/index.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales, formatFileEpoch } from '../../src/time/index.js';

const fixture = (path: string) => readFileSync(new URL(`../../../../test/fixtures/${path}`, import.meta.url), 'utf8');
const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const secondsSince2000 = (y: number, m: number, d: number, h = 0, min = 0, s = 0) =>
  (Date.UTC(y, m - 1, d, h, min, s) - Date.UTC(2000, 0, 1)) / 1000;

describe('RINEX clock records carry exact Instant epochs', () => {
  const V304 = fixture('rinex-clock/fictional-304.clk');
  // The F10.6 seconds field has room for seven decimals when its leading blank is used: ' 0.0000001'.
  const fractional = V304.replace(
    '2026 01 04 00 00  0.000000  2   -0.123456789012E-03',
    '2026 01 04 00 00 0.0000001  2   -0.123456789012E-03',
  );
  it('parseRinexClock(an epoch 00:00:00.0000001 GPS) gives an Instant 1e-7 s after midnight to 1e-15 s', () => {
    const file = parseRinexClock(fractional, { sourceName: 'frac.clk' });
    const first = file.records[0]!;
    expect(first.time.second).toBe(0.0000001);
    expect(first.epoch.taiSeconds).toBe(secondsSince2000(2026, 1, 4) + 19);
    expect(Math.abs(first.epoch.taiFraction - 1e-7)).toBeLessThan(1e-15);
    // What the former float count since 1980 lost here is shown in test/time/file-epochs.test.ts.
    expect(formatFileEpoch(ts, first.epoch, file.header.epochTimeSystem)).toBe('2026-01-04T00:00:00.0000001');
  });
  it('rinexClockSeries(...) gives { epoch, t }: the first epoch exact and t in seconds since it, with no count since 1980 beside them', () => {
    const s = rinexClockSeries(parseRinexClock(fixture('rinex-clock/fictional-305.clk')), 'E27');
    expect(s.epoch.toJSON()).toEqual({ taiSeconds: secondsSince2000(2026, 6, 30, 23, 58, 0) + 19, taiFraction: 0 });
    expect(Array.from(s.t)).toEqual([0, 30, 60, 90, 120, 150, 180, 210]);
    expect(s).not.toHaveProperty('times');
  });
  it('rinexClockSeries(a gap after an epoch 00:00:00.0000001 GPS) --tau0 30) places the gap at t = 60 s on the series axis and its Instant 1e-7 s past 00:01:00 to 1e-15 s', () => {
    // fictional-304.clk: G05 at 00:00:00, 00:00:30, then 00:01:30 (00:01:00 missing; SOURCE.md). With the first
    // epoch moved 1e-7 s later and τ0 = 30 s imposed, the steps 30 s − 1e-7 s and 60 s are whole multiples of τ0
    // within the grid's 1e-6 relative tolerance, so the grid is t_k = k·30 s from the first epoch.
    const s = rinexClockSeries(parseRinexClock(fractional, { sourceName: 'frac.clk' }), 'G05', { tau0: 30 });
    const [gap] = s.gaps;
    expect(s.gaps).toHaveLength(1);
    expect(gap).toMatchObject({ index: 2, missing: 1, line: 12 });
    expect(gap?.time).toBe(s.t[2]);
    expect(gap?.epoch.secondsSince(s.epoch)).toBe(gap?.time);
    expect(gap?.epoch.taiSeconds).toBe(secondsSince2000(2026, 1, 4, 0, 1, 0) + 19);
    expect(Math.abs((gap?.epoch.taiFraction ?? 0) - 1e-7)).toBeLessThan(1e-15);
  });
  it('readRinexClockSeries(GPS epochs 30.0000001 s apart) measures τ0 = 30.0000001 s to 1e-12 s from the exact epochs', async () => {
    const H = V304.split('\n').slice(0, 6).join('\n');
    const rec = (s: string) => `AS G05       2026 01 04 00 ${s}  1   -0.123456789012E-03`;
    const text = `${H}\n${rec('00  0.000000')}\n${rec('0030.0000001')}\n${rec('01 0.0000002')}\n`;
    const s = await readRinexClockSeries([text], 'G05', { sourceName: 'step.clk' });
    expect(Math.abs(s.tau0! - 30.0000001)).toBeLessThan(1e-12);
    expect(s.missing).toBe(0);
  });
  it('parseRinexClock(TIME SYSTEM ID IRN) refuses a time system the SDK cannot place, at its line and column', () => {
    const irn = V304.replace('   GPS', '   IRN');
    expect(() => parseRinexClock(irn, { sourceName: 'irn.clk' })).toThrow(ParseError);
    expect(() => parseRinexClock(irn, { sourceName: 'irn.clk' })).toThrow(
      /irn\.clk:\d+:4: .*time system the SDK can place/,
    );
  });
});

describe('SP3 epochs and RINEX navigation t_oc / t_oe carry exact Instants', () => {
  it('parseSp3(an epoch line 00:15:00.00000010 GPS) gives the Instant 900.0000001 s after the first, to 1e-12 s', () => {
    const text = fixture('sp3/orbit-c-pv.sp3').replace(
      '*  2024  1  7  0 15  0.00000000',
      '*  2024  1  7  0 15  0.00000010',
    );
    const file = parseSp3(text);
    expect(file.header.firstInstant.toJSON()).toEqual({
      taiSeconds: secondsSince2000(2024, 1, 7) + 19,
      taiFraction: 0,
    });
    expect(file.epochs[0]!.epoch.equals(file.header.firstInstant)).toBe(true);
    expect(Math.abs(file.epochs[1]!.epoch.secondsSince(file.epochs[0]!.epoch) - 900.0000001)).toBeLessThan(1e-12);
  });
  it("parseRinexNav(3.05) gives each record toc and toe as Instants on its system's scale: t_oc from its calendar fields, t_oe in the week nearest t_oc", () => {
    const nav = parseRinexNav(fixture('rinex-nav/mixed-v305.rnx'));
    expect(nav.ephemerides.length).toBeGreaterThan(0);
    for (const e of nav.ephemerides) {
      const offset = e.system === 'C' ? 33 : 19; // BDT = TAI − 33 s; GPST, GST = TAI − 19 s
      const f = e.tocAsWritten;
      const tocReading = secondsSince2000(f.year, f.month, f.day, f.hour, f.minute, f.second);
      expect(e.toc.taiSeconds).toBe(tocReading + offset);
      expect(e.toc.taiFraction).toBe(0);
      // Seconds of week of t_oc (weeks of all three systems start on a Sunday 00:00 of their own scale).
      const tocOfWeek =
        (((tocReading + (Date.UTC(2000, 0, 1) - Date.UTC(1980, 0, 6)) / 1000) % 604800) + 604800) % 604800;
      let fromToc = e.toeSecondsOfWeek - tocOfWeek; // t_oe − t_oc folded into ±half a week
      if (fromToc > 302400) fromToc -= 604800;
      if (fromToc < -302400) fromToc += 604800;
      expect(e.toe.secondsSince(e.toc)).toBe(fromToc);
    }
  });
});

describe("phase text: the series shape { epoch, t } when the caller places the file's time origin", () => {
  it("parsePhaseText(two columns, { epoch }) gives the first sample's Instant (origin + first time) and t in seconds since it, gaps included", () => {
    const origin = createTimeScales(BUNDLED_LEAP_SECONDS).parseIso('2026-03-01T00:00:00', 'GPS');
    const s = parsePhaseText('100 1e-9\n130 2e-9\n190 4e-9\n', { sourceName: 'p.txt', epoch: origin });
    expect(s.epoch!.secondsSince(origin)).toBe(100);
    expect(Array.from(s.t!)).toEqual([0, 30, 60, 90]);
    expect(s.missing).toBe(1);
    const one = parsePhaseText('1e-9\n2e-9\n', { tau0: 0.5 });
    expect([one.epoch, Array.from(one.t!)]).toEqual([undefined, [0, 0.5]]);
    expect(parsePhaseText('1e-9\n2e-9\n').t).toBeUndefined();
  });
});
