import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli as run } from '../run.js';

const ROOT = fileURLToPath(new URL('../../../../', import.meta.url));
const nav = (name: string) => join(ROOT, 'test/fixtures/rinex-nav', name);
const V211 = nav('gps-v211.rnx');
const V304 = nav('gps-v304-equivalent.rnx');
const SPAN = ['--from', '2024-01-06T23:00:00', '--to', '2024-01-07T04:30:00', '--step', '1800'];

/** The JSON output without what names the file itself (path, version, file type). */
function withoutFileIdentity(text: string): unknown {
  const j = JSON.parse(text);
  j.files = j.files.map(({ file: _f, version: _v, fileType: _t, ...rest }: Record<string, unknown>) => rest);
  j.notes = j.notes.map((n: string) => n.replace(/^[^:]+:\d+: /, ''));
  return j;
}

describe('tauline broadcast on RINEX 2 files', () => {
  it('tauline broadcast <2.11 file> --json equals the output for its RINEX 3.04 twin, header parameters included (same invented records)', async () => {
    const a = await run(['broadcast', V211, ...SPAN, '--json']);
    const b = await run(['broadcast', V304, ...SPAN, '--json']);
    expect(a.status).toBe(0);
    expect(a.err).toBe('');
    expect(withoutFileIdentity(a.out)).toEqual(withoutFileIdentity(b.out));
    const j = JSON.parse(a.out);
    expect(j.files).toEqual([
      {
        file: V211,
        version: 2.11,
        fileType: 'N',
        satelliteSystem: 'G',
        leapSeconds: 18,
        ionosphere: [
          { type: 'GPSA', parametersBroadcastUnits: [1.118e-8, 7.451e-9, -5.961e-8, -5.961e-8] },
          { type: 'GPSB', parametersBroadcastUnits: [9.011e4, 1.638e4, -1.966e5, -6.554e4] },
        ],
        timeSystemCorrections: [
          {
            type: 'GPUT',
            a0: 1.862645149e-9,
            a1: 1.776356839e-15,
            referenceSecondsOfWeek: 405504,
            referenceWeek: 2295,
            // GPS week 2295 + 405504 s: datetime(1980,1,6) + timedelta(weeks=2295, seconds=405504) [C].
            reference: { iso: '2024-01-04T16:38:24', scale: 'GPS' },
          },
        ],
      },
    ]);
    expect(j.units.files.a0).toBe('s');
    expect(j.units.files.referenceWeek).toMatch(/^week number as written: GPS week for GPUT/);
    expect(j.units.files.reference).toMatch(/null where the type's week system is ambiguous/);
  });

  it('tauline broadcast <2.11 file> --csv and the table give the same rows as for the RINEX 3.04 twin', async () => {
    // --wide: the fitted table wraps the header-parameter line where the file names (of different lengths) put it.
    for (const format of [['--csv'], ['--format=table', '--wide']]) {
      const a = await run(['broadcast', V211, ...SPAN, ...format]);
      const b = await run(['broadcast', V304, ...SPAN, ...format]);
      const strip = (t: string) => t.replace(/^ +\S+\.rnx: RINEX \S+ N; /m, '  FILE: ');
      expect(strip(a.out)).toBe(strip(b.out));
      expect(a.status).toBe(0);
    }
  });

  it('tauline broadcast reports, never extrapolates, the samples past the end of a fit interval inside the span (G27: 04:00; G14: 01:00 across the week)', async () => {
    const j = JSON.parse((await run(['broadcast', V211, ...SPAN, '--satellite', 'G27,G14', '--json'])).out);
    const g27 = j.satellites.find((s: { id: string }) => s.id === 'G27');
    expect(g27.samples.at(-1)).toEqual({
      t: '2024-01-07T04:30:00',
      relativisticSeconds: null,
      clockCorrectionSeconds: null,
      reason:
        'after the end of the fit interval of the nearest healthy record (t_oe 2024-01-07T02:00:00 GPST, fit 4 h, valid to 2024-01-07T04:00:00 GPST): not extrapolated',
    });
    expect(g27.samples[0].reason).toMatch(
      /^before the start of the fit interval .* valid from 2024-01-07T00:00:00 GPST\): not extrapolated$/,
    );
    // 04:00 is the last covered sample: the value the mpmath script gives (reference_clock_v2.py [C]; checked to 1e-18 s in test/reference).
    expect(g27.samples.at(-2).clockCorrectionSeconds).toBeCloseTo(-1.872113960402862e-4, 16);
    const g14 = j.satellites.find((s: { id: string }) => s.id === 'G14');
    expect(
      g14.samples.map((s: { clockCorrectionSeconds: number | null }) => s.clockCorrectionSeconds !== null),
    ).toEqual([true, true, true, true, true, false, false, false, false, false, false, false]);
    expect(g14.samples[4].toe).toBe('2024-01-06T22:00:00');
    expect(j.samplesWithoutRecord).toBe(7 + 3); // G14: 01:30–04:30; G27: 23:00, 23:30 and 04:30
    const table = (await run(['broadcast', V211, ...SPAN, '--satellite', 'G27'])).out;
    expect(table.replace(/\s+/g, ' ')).toContain('valid to 2024-01-07T04:00:00 GPST): not extrapolated');
  });

  it('tauline broadcast <2.10 file> reads years 99/00 and notes the week written modulo 1024 and the unknown fit interval', async () => {
    const r = await run([
      'broadcast',
      nav('gps-v210.rnx'),
      '--from',
      '2000-01-01T23:00:00',
      '--to',
      '2000-01-01T23:00:00',
      '--step',
      '1',
      '--satellite',
      'G21',
      '--json',
    ]);
    const j = JSON.parse(r.out);
    expect(r.status).toBe(0);
    expect(j.satellites[0].samples[0].clockCorrectionSeconds).toBeCloseTo(-6.068610355913088e-6, 17); // reference_clock_v2.py [C]
    expect(j.notes.join('\n')).toMatch(/week 19 read as GPS week 1043/);
    expect(j.notes.join('\n')).toMatch(/fit interval not given/);
    expect(j.files[0]).toMatchObject({ version: 2.1, leapSeconds: 13, ionosphere: [], timeSystemCorrections: [] });
  });

  it('tauline broadcast <GLONASS and GEO 2.11 files> counts their records as skipped, with the GPS file alongside', async () => {
    const j = JSON.parse(
      (await run(['broadcast', V211, nav('glonass-v211.rnx'), nav('geo-v211.rnx'), ...SPAN, '--json'])).out,
    );
    expect(j.skipped.map((s: { reason: string; count: number }) => [s.reason.split(' ')[0], s.count])).toEqual([
      ['GLONASS', 2],
      ['SBAS', 1],
    ]);
    expect(j.files.map((f: { fileType: string }) => f.fileType)).toEqual(['N', 'G', 'H']);
  });

  it('tauline broadcast <RINEX 2 mixed file> exits 2 with one located line saying the layout is not defined', async () => {
    const { mkdtempSync, readFileSync, writeFileSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const dir = mkdtempSync(join(tmpdir(), 'tauline-v2-'));
    const text = readFileSync(V211, 'utf8').split('\n');
    text[0] = `${text[0]!.slice(0, 40)}M${text[0]!.slice(41)}`;
    writeFileSync(join(dir, 'mixed.11n'), text.join('\n'));
    const r = await run(['broadcast', join(dir, 'mixed.11n'), ...SPAN]);
    expect(r.status).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(
      /mixed\.11n:1:41: expected column 41 blank \(or G\) in a RINEX 2 'N' file: RINEX 2\.11 defines no mixed or Galileo navigation file layout/,
    );
  });
});
