import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseRinexNav } from '@tauline/sdk/io';
import { evaluateBroadcastEphemeris, selectEphemeris } from '@tauline/sdk/orbit';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '@tauline/sdk/time';
import { describe, expect, it } from 'vitest';
import { runCli as run } from '../run.js';

const ROOT = fileURLToPath(new URL('../../../../', import.meta.url));
const NAV3 = join(ROOT, 'test/fixtures/rinex-nav/mixed-v305.rnx');
const NAV4 = join(ROOT, 'test/fixtures/rinex-nav/mixed-v401.rnx');

describe('tauline broadcast', () => {
  it('tauline broadcast <v3.05> --json gives one sample per step from --from to --to inclusive, with the chosen record', async () => {
    const r = await run([
      'broadcast',
      NAV3,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T02:00:00',
      '--step',
      '1800',
      '--satellite',
      'G05,E11,C08',
      '--json',
    ]);
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    const j = JSON.parse(r.out);
    expect(j.satellites.map((s: { id: string }) => s.id)).toEqual(['C08', 'E11', 'G05']);
    const g05 = j.satellites.find((s: { id: string }) => s.id === 'G05');
    expect(g05.timeScale).toBe('GPST');
    expect(g05.samples.map((s: { t: string }) => s.t)).toEqual([
      '2024-01-07T00:00:00',
      '2024-01-07T00:30:00',
      '2024-01-07T01:00:00',
      '2024-01-07T01:30:00',
      '2024-01-07T02:00:00',
    ]);
    // 01:30 is nearer the 02:00 record (IODE 18); 01:00 is a tie and goes to the record with t_oe ≤ t.
    expect(g05.samples.map((s: { issueOfData: number }) => s.issueOfData)).toEqual([17, 17, 17, 18, 18]);
    expect(g05.samples[0].relativisticSeconds).toBeLessThan(0);
    expect(g05.samples[0].clockCorrectionSeconds).toBeCloseTo(1e-4 + g05.samples[0].relativisticSeconds, 15);
    expect(j.satellites[0].timeScale).toBe('BDT');
    expect(j.satellites[1].samples[0].message).toBe('INAV');
    expect(j.caution).toMatch(/interface specification/);
    // Skipped records are counted only for the satellites asked for; without a filter, GLONASS, SBAS and QZSS appear.
    expect(j.skipped).toEqual([]);
    const all = JSON.parse(
      (
        await run([
          'broadcast',
          NAV3,
          '--from',
          '2024-01-07T00:00:00',
          '--to',
          '2024-01-07T00:00:00',
          '--step',
          '1',
          '--json',
        ])
      ).out,
    );
    expect(all.skipped.map((s: { reason: string }) => s.reason.split(' ')[0])).toEqual(['GLONASS', 'SBAS', 'QZSS']);
    expect(all.satellites.map((s: { id: string }) => s.id)).toEqual([
      'C03',
      'C08',
      'C21',
      'E11',
      'G05',
      'G07',
      'G09',
      'G11',
      'G13',
    ]);
  });

  it('tauline broadcast reproduces the physics-refs §3 check orbit: G05 (√A = 5153.79589081, e = 0.0123456789) matches the SDK value at t_oe', async () => {
    const r = await run([
      'broadcast',
      NAV3,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T00:00:00',
      '--step',
      '60',
      '--satellite',
      'G05',
      '--json',
    ]);
    const s = JSON.parse(r.out).satellites[0].samples[0];
    // E_k at t_oe solves M0 = 1 = E − e sin E; Δt_r = F e √A sin E with F = −4.442807633e-10 (physics-refs §3 [C]).
    let E = 1;
    for (let k = 0; k < 30; k++) E -= (E - 0.0123456789 * Math.sin(E) - 1) / (1 - 0.0123456789 * Math.cos(E));
    expect(
      Math.abs(s.relativisticSeconds - -4.442807633393e-10 * 0.0123456789 * 5153.79589081 * Math.sin(E)),
    ).toBeLessThan(1e-19);
  });

  it('tauline broadcast --step 0.1 samples at exact instants from --from: labels 00:00:00.1, .2, .3 and values equal to the SDK at those readings (no float count since 1980, whose steps of 2.4e-7 s printed .099999905)', async () => {
    const r = await run([
      'broadcast',
      NAV3,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T00:00:00.3',
      '--step',
      '0.1',
      '--satellite',
      'C08,G05',
      '--json',
    ]);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
    const nav = parseRinexNav(readFileSync(NAV3, 'utf8'));
    for (const [index, id, scale] of [
      [0, 'C08', 'BDT'],
      [1, 'G05', 'GPS'],
    ] as const) {
      const samples = j.satellites[index].samples as { t: string; clockCorrectionSeconds: number }[];
      expect(samples.map((s) => s.t)).toEqual([
        '2024-01-07T00:00:00',
        '2024-01-07T00:00:00.1',
        '2024-01-07T00:00:00.2',
        '2024-01-07T00:00:00.3',
      ]);
      const records = nav.ephemerides.filter((e) => e.satellite === id);
      for (const s of samples) {
        // The label read on the satellite's own scale by the time module (independent of the CLI's sample grid).
        const at = ts.parseIso(s.t, scale);
        const expected = evaluateBroadcastEphemeris(selectEphemeris(records, at)!, at).clockCorrectionSeconds;
        // k·0.1 and the decimal reading differ by < 1e-16 s; a_f1 ≈ 1e-11 makes that < 1e-26 s of clock correction.
        expect(Math.abs(s.clockCorrectionSeconds - expected)).toBeLessThan(1e-20);
      }
    }
  });

  it('tauline broadcast marks samples outside every fit interval with null and a reason, and skips unhealthy records unless asked', async () => {
    const r = await run([
      'broadcast',
      NAV3,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T12:00:00',
      '--step',
      '21600',
      '--satellite',
      'G13,G05,G99',
      '--json',
    ]);
    const j = JSON.parse(r.out);
    const g13 = j.satellites.find((s: { id: string }) => s.id === 'G13');
    expect(g13.samples[0]).toMatchObject({
      relativisticSeconds: null,
      clockCorrectionSeconds: null,
      reason: expect.stringMatching(/healthy/),
    });
    const g05 = j.satellites.find((s: { id: string }) => s.id === 'G05');
    expect(g05.samples[2]).toMatchObject({ relativisticSeconds: null, reason: expect.stringMatching(/fit interval/) });
    expect(j.satellites.find((s: { id: string }) => s.id === 'G99').samples[0].reason).toMatch(
      /no record of this satellite/,
    );
    const u = JSON.parse(
      (
        await run([
          'broadcast',
          NAV3,
          '--from',
          '2024-01-07T00:00:00',
          '--to',
          '2024-01-07T00:00:00',
          '--step',
          '1',
          '--satellite',
          'G13',
          '--include-unhealthy',
          '--json',
        ])
      ).out,
    );
    expect(u.satellites[0].samples[0].relativisticSeconds).not.toBeNull();
  });

  it('tauline broadcast crosses the week boundary with a record of the previous week and reports week notes', async () => {
    const r = await run([
      'broadcast',
      NAV3,
      '--from',
      '2024-01-06T23:00:00',
      '--to',
      '2024-01-07T00:00:00',
      '--step',
      '1800',
      '--satellite',
      'G11,G07,G09',
      '--json',
    ]);
    const j = JSON.parse(r.out);
    const g11 = j.satellites.find((s: { id: string }) => s.id === 'G11');
    expect(g11.samples.every((s: { toe: string }) => s.toe === '2024-01-06T22:00:00')).toBe(true);
    expect(j.notes.join('\n')).toMatch(/G07: week 248 read as GPS week 2296/);
    expect(j.notes.join('\n')).toMatch(/G09: t_oe lies in GPS week 2296/);
  });

  it('tauline broadcast --time-scale utc reads times with Z and shifts GPST by the 18 leap seconds (BDT by 4 s)', async () => {
    const sys = JSON.parse(
      (
        await run([
          'broadcast',
          NAV3,
          '--from',
          '2024-01-07T00:00:18',
          '--to',
          '2024-01-07T00:00:18',
          '--step',
          '1',
          '--satellite',
          'G05',
          '--json',
        ])
      ).out,
    );
    const utc = JSON.parse(
      (
        await run([
          'broadcast',
          NAV3,
          '--from',
          '2024-01-07T00:00:00Z',
          '--to',
          '2024-01-07T00:00:00Z',
          '--step',
          '1',
          '--satellite',
          'G05,C08',
          '--time-scale',
          'utc',
          '--json',
        ])
      ).out,
    );
    expect(utc.satellites[1].samples[0].t).toBe('2024-01-07T00:00:00Z');
    expect(utc.satellites[1].timeScale).toBe('UTC');
    expect(utc.satellites[1].samples[0].relativisticSeconds).toBe(sys.satellites[0].samples[0].relativisticSeconds);
    const bdt = JSON.parse(
      (
        await run([
          'broadcast',
          NAV3,
          '--from',
          '2024-01-07T00:00:04',
          '--to',
          '2024-01-07T00:00:04',
          '--step',
          '1',
          '--satellite',
          'C08',
          '--json',
        ])
      ).out,
    );
    expect(utc.satellites[0].samples[0].relativisticSeconds).toBe(bdt.satellites[0].samples[0].relativisticSeconds);
    // t is on UTC, t_oe stays on each system's own scale and says which: the same record's t_oe as without the flag.
    expect(utc.satellites.map((s: { toeScale: string }) => s.toeScale)).toEqual(['BDT', 'GPST']);
    expect(bdt.satellites[0].toeScale).toBe('BDT');
    expect(utc.satellites[0].samples[0].toe).toBe(bdt.satellites[0].samples[0].toe);
    expect(utc.satellites[0].samples[0].toe).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d$/);
    expect(utc.units.toe).toBe("ISO 8601 in the satellite's toeScale (its system's own scale: GPST, GST or BDT)");
  });

  it('tauline broadcast --time-scale utc with an unmodelled satellite (R01) gives it null samples and a note, and still evaluates the others', async () => {
    const r = await run([
      'broadcast',
      NAV3,
      '--from',
      '2024-01-07T00:00:00Z',
      '--to',
      '2024-01-07T00:10:00Z',
      '--step',
      '600',
      '--satellite',
      'R01,G05',
      '--time-scale',
      'utc',
      '--json',
    ]);
    expect(r.status).toBe(0);
    const json = JSON.parse(r.out);
    expect(json.satellites.map((s: { id: string }) => s.id)).toEqual(['G05', 'R01']);
    expect(
      json.satellites[1].samples.map((x: { relativisticSeconds: number | null }) => x.relativisticSeconds),
    ).toEqual([null, null]);
    expect(
      json.satellites[0].samples.every(
        (x: { relativisticSeconds: number | null }) => typeof x.relativisticSeconds === 'number',
      ),
    ).toBe(true);
    expect(json.samplesWithoutRecord).toBe(2);
    expect(json.notes).toContain('R01: system not modelled (GPS, Galileo and BeiDou only)');
    // No record, no t_oe: its scale is null, not a guess.
    expect(
      json.satellites.map((s: { timeScale: string; toeScale: string | null }) => [s.timeScale, s.toeScale]),
    ).toEqual([
      ['UTC', 'GPST'],
      ['UTC', null],
    ]);
    expect(json.satellites[1].samples.some((x: Record<string, unknown>) => 'toe' in x)).toBe(false);
    // The CSV rows name the same scales: t on UTC, t_oe on GPST; no t_oe, no scale.
    const csvArgs = ['broadcast', NAV3, '--from', '2024-01-07T00:00:00Z', '--to', '2024-01-07T00:00:00Z'];
    const csv = (await run([...csvArgs, '--step', '600', '--satellite', 'R01,G05', '--time-scale', 'utc', '--csv'])).out
      .trim()
      .split('\n');
    expect(csv.map((row) => row.split(',')).map((c) => [c[0], c[1], c[2], c[6]])).toEqual([
      ['id', 't', 'timeScale', 'toeScale'],
      ['G05', '2024-01-07T00:00:00Z', 'UTC', 'GPST'],
      ['R01', '2024-01-07T00:00:00Z', 'UTC', ''],
    ]);
  });

  it('tauline broadcast <v4.01> --galileo fnav uses the F/NAV record; the table and CSV outputs carry the same rows', async () => {
    const args = [
      'broadcast',
      NAV4,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T00:10:00',
      '--step',
      '600',
      '--satellite',
      'E11',
      '--galileo',
      'fnav',
    ];
    const j = JSON.parse((await run([...args, '--json'])).out);
    expect(j.satellites[0].samples.map((s: { message: string }) => s.message)).toEqual(['FNAV', 'FNAV']);
    const csv = (await run([...args, '--csv'])).out.trim().split('\n');
    expect(csv[0]).toBe('id,t,timeScale,relativisticSeconds,clockCorrectionSeconds,toe,toeScale,issueOfData,message');
    expect(csv[1]).toBe(
      `E11,2024-01-07T00:00:00,GST,${j.satellites[0].samples[0].relativisticSeconds},${j.satellites[0].samples[0].clockCorrectionSeconds},2024-01-07T00:00:00,GST,88,FNAV`,
    );
    const text = (await run(args)).out;
    expect(text).toMatch(/Δt_r \(ns\)/);
    expect(text).toMatch(/E11\s+2024-01-07T00:10:00/);
    expect(text).toMatch(/Caution: verify/);
  });

  it('tauline broadcast rejects bad flags and names the file, line and column of a malformed file', async () => {
    const base = ['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T01:00:00', '--step', '600'];
    expect((await run(['broadcast', '--from', 'x', '--to', 'y', '--step', '1'])).err).toMatch(
      /RINEX navigation file is required/,
    );
    expect((await run([...base.slice(0, 6), '--step', '0'])).err).toMatch(/--step must be a positive number/);
    expect((await run([...base, '--satellite', 'GPS1'])).err).toMatch(/--satellite must be satellite identifiers/);
    expect((await run([...base, '--satellite', ','])).err).toMatch(/at least one satellite/);
    expect((await run([...base, '--time-scale', 'tai'])).err).toMatch(/--time-scale/);
    expect((await run([...base, '--galileo', 'cnav'])).err).toMatch(/--galileo/);
    expect((await run([...base, '--json', '--csv'])).err).toMatch(/cannot be combined/);
    expect(
      (await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00Z', '--to', '2024-01-07T01:00:00', '--step', '600']))
        .err,
    ).toMatch(/--from must be an ISO 8601 date-time read in each system's own time scale/);
    expect(
      (
        await run([
          'broadcast',
          NAV3,
          '--from',
          '2024-01-07T00:00:00',
          '--to',
          '2024-01-07T01:00:00',
          '--step',
          '600',
          '--time-scale',
          'utc',
        ])
      ).err,
    ).toMatch(/--from must be an ISO 8601 UTC date-time/);
    expect(
      (await run(['broadcast', NAV3, '--from', '2024-01-07T02:00:00', '--to', '2024-01-07T01:00:00', '--step', '600']))
        .err,
    ).toMatch(/--to must be a time not before --from/);
    expect((await run([...base.slice(0, 6), '--step', '0.0001'])).err).toMatch(/at most 5000000 samples/);
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-broadcast-'));
    const bad = join(tmp, 'bad.rnx');
    writeFileSync(bad, readFileSync(NAV3, 'utf8').replace('  .123456789000D-01', '  .1234X6789000D-01'));
    const r = await run([
      'broadcast',
      bad,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T00:00:00',
      '--step',
      '1',
    ]);
    expect(r.status).toBe(2);
    expect(r.err).toBe(
      `tauline broadcast: parse-error: ${bad}:10:24: expected eccentricity e as a Fortran real (e.g. -1.234567890123D-05); found ".1234X6789000D-01"\n`,
    );
    const missing = await run([
      'broadcast',
      join(tmp, 'none.rnx'),
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T00:00:00',
      '--step',
      '1',
    ]);
    expect(missing.status).toBe(2);
    expect(missing.err).toMatch(/no such file/);
  });

  it('tauline broadcast on a terminal draws a progress bar on stderr for a long input, and none for a short one', async () => {
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-broadcast-'));
    const big = join(tmp, 'big.rnx');
    const text = readFileSync(NAV3, 'utf8');
    const [head, body] = [text.slice(0, text.indexOf('G05 ')), text.slice(text.indexOf('G05 '))];
    writeFileSync(big, head + body.repeat(Math.ceil((4.5 * 1024 * 1024) / body.length)));
    const r = await run(
      [
        'broadcast',
        big,
        '--from',
        '2024-01-07T00:00:00',
        '--to',
        '2024-01-07T00:00:00',
        '--step',
        '1',
        '--satellite',
        'G05',
        '--json',
      ],
      true,
    );
    expect(r.status).toBe(0);
    expect(r.err).toMatch(/reading navigation data \[#+\.*\] +100 %/);
    const small = await run(
      ['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '1', '--json'],
      true,
    );
    expect(small.err).toBe('');
  });

  it('node packages/cli/bin/tauline.js broadcast ... --csv runs the built binary (after npm run build)', () => {
    const bin = join(ROOT, 'packages/cli/bin/tauline.js');
    if (!existsSync(join(ROOT, 'packages/cli/dist/main.js'))) throw new Error('run `npm run build` first');
    const p = spawnSync(
      process.execPath,
      [
        bin,
        'broadcast',
        NAV4,
        '--from',
        '2024-01-07T00:00:00',
        '--to',
        '2024-01-07T00:00:00',
        '--step',
        '1',
        '--satellite',
        'C03',
        '--csv',
      ],
      { encoding: 'utf8' },
    );
    expect(p.status).toBe(0);
    expect(p.stdout.split('\n')[1]).toMatch(/^C03,2024-01-07T00:00:00,BDT,-?\d/);
  });
});

describe('tauline broadcast --signal (single-frequency clock correction: IS-GPS-200 §20.3.3.3.3.2, Galileo OS SIS ICD §5.1.5, BDS-SIS-ICD [M])', () => {
  const at00 = ['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '60'];
  type Sample = {
    clockCorrectionSeconds: number;
    clockCorrectionSignalSeconds: number | null;
    groupDelaySeconds: number | null;
    groupDelayField: string | null;
  };
  const samplesOf = async (args: string[]) => {
    const r = await run([...args, '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    return { j, by: (id: string) => j.satellites.find((s: { id: string }) => s.id === id).samples[0] as Sample };
  };

  it('tauline broadcast without --signal keeps the documented sample fields and CSV columns (iono-free Δt_sv alone)', async () => {
    const { j } = await samplesOf([...at00, '--satellite', 'G05']);
    expect(Object.keys(j.satellites[0].samples[0])).toEqual([
      't',
      'relativisticSeconds',
      'clockCorrectionSeconds',
      'toe',
      'issueOfData',
      'message',
    ]);
    expect(j.signal).toBeUndefined();
    expect((await run([...at00, '--satellite', 'G05', '--csv'])).out.split('\n')[0]).toBe(
      'id,t,timeScale,relativisticSeconds,clockCorrectionSeconds,toe,toeScale,issueOfData,message',
    );
  });

  it('tauline broadcast --signal L1CA | l1p | L2P gives Δt_sv − T_GD and Δt_sv − (77/60)²·T_GD with T_GD = −1e-8 s from the G05 record', async () => {
    for (const [signal, factor] of [
      ['L1CA', 1],
      ['l1p', 1],
      ['L2P', 5929 / 3600],
    ] as const) {
      const { j, by } = await samplesOf([...at00, '--satellite', 'G05', '--signal', signal]);
      const s = by('G05');
      expect(s.groupDelaySeconds).toBe(-1e-8);
      expect(s.groupDelayField).toBe('TGD');
      expect(Math.abs(s.clockCorrectionSignalSeconds! - (s.clockCorrectionSeconds + factor * 1e-8))).toBeLessThan(
        1e-19,
      );
      expect(j.signal).toBe(signal.toUpperCase());
      expect(j.signalSource).toMatch(/IS-GPS-200 §20\.3\.3\.3\.3\.2 \[M\]/);
      expect(j.units.clockCorrectionSignalSeconds).toBe('s');
    }
  });

  it('tauline broadcast --signal E1 uses BGD(E1,E5b) = 1.4 ns from I/NAV and BGD(E1,E5a) = 1.2 ns with --galileo fnav; E5a and E5b scale by (154/115)² and (154/118)²', async () => {
    const inav = (await samplesOf([...at00, '--satellite', 'E11', '--signal', 'E1'])).by('E11');
    expect(inav).toMatchObject({ groupDelaySeconds: 1.4e-9, groupDelayField: 'BGD_E5b_E1' });
    expect(Math.abs(inav.clockCorrectionSignalSeconds! - (inav.clockCorrectionSeconds - 1.4e-9))).toBeLessThan(1e-19);
    const fnav = (await samplesOf([...at00, '--satellite', 'E11', '--signal', 'E1', '--galileo', 'fnav'])).by('E11');
    expect(fnav).toMatchObject({ groupDelaySeconds: 1.2e-9, groupDelayField: 'BGD_E5a_E1' });
    const e5a = (await samplesOf([...at00, '--satellite', 'E11', '--signal', 'e5a'])).by('E11');
    expect(
      Math.abs(e5a.clockCorrectionSignalSeconds! - (e5a.clockCorrectionSeconds - (1575.42 / 1176.45) ** 2 * 1.2e-9)),
    ).toBeLessThan(1e-19);
    const e5b = (await samplesOf([...at00, '--satellite', 'E11', '--signal', 'E5b'])).by('E11');
    expect(
      Math.abs(e5b.clockCorrectionSignalSeconds! - (e5b.clockCorrectionSeconds - (1575.42 / 1207.14) ** 2 * 1.4e-9)),
    ).toBeLessThan(1e-19);
  });

  it('tauline broadcast --signal B1I | B2I subtracts TGD1 = 2.4 ns | TGD2 = −1.3 ns; iono-free gives Δt_sv with a B3I note for BeiDou', async () => {
    const b1 = (await samplesOf([...at00, '--satellite', 'C08', '--signal', 'B1I'])).by('C08');
    expect(b1.groupDelayField).toBe('TGD1');
    expect(Math.abs(b1.clockCorrectionSignalSeconds! - (b1.clockCorrectionSeconds - 2.4e-9))).toBeLessThan(1e-19);
    const b2 = (await samplesOf([...at00, '--satellite', 'C08', '--signal', 'B2I'])).by('C08');
    expect(Math.abs(b2.clockCorrectionSignalSeconds! - (b2.clockCorrectionSeconds + 1.3e-9))).toBeLessThan(1e-19);
    const free = await samplesOf([...at00, '--satellite', 'C08,G05', '--signal', 'iono-free']);
    for (const id of ['C08', 'G05']) {
      expect(free.by(id).clockCorrectionSignalSeconds).toBe(free.by(id).clockCorrectionSeconds);
      expect(free.by(id).groupDelaySeconds).toBeNull();
    }
    expect(free.j.notes.join('\n')).toMatch(/C08: BeiDou D1\/D2 clock parameters refer to B3I/);
  });

  it('tauline broadcast --signal L1CA gives null with a note for Galileo and BeiDou satellites, and null for samples without a record', async () => {
    const r = await samplesOf([...at00, '--satellite', 'E11,G05,G13', '--signal', 'L1CA']);
    expect(r.by('E11').clockCorrectionSignalSeconds).toBeNull();
    expect(r.by('G13')).toMatchObject({
      clockCorrectionSignalSeconds: null,
      groupDelaySeconds: null,
      groupDelayField: null,
    });
    expect(r.j.notes).toContain(
      'Galileo satellites: L1CA is not one of their signals (E1, E5a, E5b, iono-free): clockCorrectionSignalSeconds is null',
    );
  });

  it('tauline broadcast --signal adds CSV columns and table columns with the same values as JSON', async () => {
    const args = [...at00, '--satellite', 'G05', '--signal', 'L2P'];
    const s = (await samplesOf(args)).by('G05');
    const csv = (await run([...args, '--csv'])).out.trim().split('\n');
    expect(csv[0]).toBe(
      'id,t,timeScale,relativisticSeconds,clockCorrectionSeconds,toe,toeScale,issueOfData,message,clockCorrectionSignalSeconds,groupDelaySeconds,groupDelayField',
    );
    expect(csv[1]!.endsWith(`,LNAV,${s.clockCorrectionSignalSeconds},-1e-8,TGD`)).toBe(true);
    const text = (await run(args)).out;
    expect(text).toMatch(/Δt_sv L2P \(s\)\s+group delay \(ns\)/);
    expect(text).toContain(s.clockCorrectionSignalSeconds!.toExponential(12));
    expect(text).toContain('-10.0000 TGD');
  });

  it('tauline broadcast --signal rejects an unknown signal, E5b from an F/NAV record and a record without T_GD (naming file, line and field)', async () => {
    const bad = await run([...at00, '--signal', 'L5']);
    expect(bad.status).toBe(2);
    expect(bad.err).toMatch(
      /--signal must be one of L1CA, L1P, L2P, E1, E5a, E5b, B1I, B2I, B3I, iono-free; received "L5"/,
    );
    const fnav = await run([...at00, '--satellite', 'E11', '--galileo', 'fnav', '--signal', 'E5b']);
    expect(fnav.status).toBe(2);
    expect(fnav.err).toMatch(
      /mixed-v305\.rnx:\d+: E11 groupDelays\.BGD_E5b_E1 must be a BGD\(E1,E5b\) from an I\/NAV record/,
    );
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-broadcast-'));
    const noTgd = join(tmp, 'no-tgd.rnx');
    const lines = readFileSync(NAV3, 'utf8').split('\n');
    // Line 14 is the first G05 record's sixth orbit line: SV accuracy, health, T_GD, IODC; blank T_GD.
    lines[13] = lines[13]!.replace('-.100000000000D-07', ' '.repeat(18));
    writeFileSync(noTgd, lines.join('\n'));
    const missing = await run([
      'broadcast',
      noTgd,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T00:00:00',
      '--step',
      '60',
      '--satellite',
      'G05',
      '--signal',
      'L1CA',
    ]);
    expect(missing.status).toBe(2);
    expect(missing.err).toContain(
      `${noTgd}:8: G05 groupDelays.TGD must be the broadcast TGD in seconds (needed for L1CA); received nothing (the field is missing). --signal L1CA`,
    );
    // The same file without --signal still works: the group delay is needed only for a signal.
    expect(
      (
        await run([
          'broadcast',
          noTgd,
          '--from',
          '2024-01-07T00:00:00',
          '--to',
          '2024-01-07T00:00:00',
          '--step',
          '60',
          '--satellite',
          'G05',
        ])
      ).status,
    ).toBe(0);
  });

  it('tauline broadcast --help documents --signal, the formulas and the added fields', async () => {
    const help = (await run(['broadcast', '--help'])).out;
    expect(help).toMatch(/--signal <name>/);
    expect(help).toMatch(/L2P: Δt_sv − γ T_GD, γ = \(77\/60\)²/);
    expect(help).toMatch(/clockCorrectionSignalSeconds/);
    expect(help).toMatch(/iono-free: Δt_sv with no group delay/);
  });
});
