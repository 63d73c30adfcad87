import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli as run } from './run.js';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const NAV3 = join(ROOT, 'test/fixtures/rinex-nav/mixed-v305.rnx');
const NAV4 = join(ROOT, 'test/fixtures/rinex-nav/mixed-v401.rnx');

describe('tauline broadcast', () => {
  it('tauline broadcast <v3.05> --json gives one sample per step from --from to --to inclusive, with the chosen record', async () => {
    const r = await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T02:00:00', '--step', '1800', '--satellite', 'G05,E11,C08', '--json']);
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    const j = JSON.parse(r.out);
    expect(j.satellites.map((s: { id: string }) => s.id)).toEqual(['C08', 'E11', 'G05']);
    const g05 = j.satellites.find((s: { id: string }) => s.id === 'G05');
    expect(g05.timeScale).toBe('GPST');
    expect(g05.samples.map((s: { t: string }) => s.t)).toEqual([
      '2024-01-07T00:00:00', '2024-01-07T00:30:00', '2024-01-07T01:00:00', '2024-01-07T01:30:00', '2024-01-07T02:00:00']);
    // 01:30 is nearer the 02:00 record (IODE 18); 01:00 is a tie and goes to the record with t_oe ≤ t.
    expect(g05.samples.map((s: { issueOfData: number }) => s.issueOfData)).toEqual([17, 17, 17, 18, 18]);
    expect(g05.samples[0].relativisticSeconds).toBeLessThan(0);
    expect(g05.samples[0].clockCorrectionSeconds).toBeCloseTo(1e-4 + g05.samples[0].relativisticSeconds, 15);
    expect(j.satellites[0].timeScale).toBe('BDT');
    expect(j.satellites[1].samples[0].message).toBe('INAV');
    expect(j.caution).toMatch(/interface specification/);
    // Skipped records are counted only for the satellites asked for; without a filter, GLONASS, SBAS and QZSS appear.
    expect(j.skipped).toEqual([]);
    const all = JSON.parse((await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '1', '--json'])).out);
    expect(all.skipped.map((s: { reason: string }) => s.reason.split(' ')[0])).toEqual(['GLONASS', 'SBAS', 'QZSS']);
    expect(all.satellites.map((s: { id: string }) => s.id)).toEqual(['C03', 'C08', 'C21', 'E11', 'G05', 'G07', 'G09', 'G11', 'G13']);
  });

  it('tauline broadcast reproduces the physics-refs §3 check orbit: G05 (√A = 5153.79589081, e = 0.0123456789) matches the SDK value at t_oe', async () => {
    const r = await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '60', '--satellite', 'G05', '--json']);
    const s = JSON.parse(r.out).satellites[0].samples[0];
    // E_k at t_oe solves M0 = 1 = E − e sin E; Δt_r = F e √A sin E with F = −4.442807633e-10 (physics-refs §3 [C]).
    let E = 1;
    for (let k = 0; k < 30; k++) E -= (E - 0.0123456789 * Math.sin(E) - 1) / (1 - 0.0123456789 * Math.cos(E));
    expect(Math.abs(s.relativisticSeconds - -4.442807633393e-10 * 0.0123456789 * 5153.79589081 * Math.sin(E))).toBeLessThan(1e-19);
  });

  it('tauline broadcast marks samples outside every fit interval with null and a reason, and skips unhealthy records unless asked', async () => {
    const r = await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T12:00:00', '--step', '21600', '--satellite', 'G13,G05,G99', '--json']);
    const j = JSON.parse(r.out);
    const g13 = j.satellites.find((s: { id: string }) => s.id === 'G13');
    expect(g13.samples[0]).toMatchObject({ relativisticSeconds: null, clockCorrectionSeconds: null, reason: expect.stringMatching(/healthy/) });
    const g05 = j.satellites.find((s: { id: string }) => s.id === 'G05');
    expect(g05.samples[2]).toMatchObject({ relativisticSeconds: null, reason: expect.stringMatching(/fit interval/) });
    expect(j.satellites.find((s: { id: string }) => s.id === 'G99').samples[0].reason).toMatch(/no record of this satellite/);
    const u = JSON.parse((await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '1', '--satellite', 'G13', '--include-unhealthy', '--json'])).out);
    expect(u.satellites[0].samples[0].relativisticSeconds).not.toBeNull();
  });

  it('tauline broadcast crosses the week boundary with a record of the previous week and reports week notes', async () => {
    const r = await run(['broadcast', NAV3, '--from', '2024-01-06T23:00:00', '--to', '2024-01-07T00:00:00', '--step', '1800', '--satellite', 'G11,G07,G09', '--json']);
    const j = JSON.parse(r.out);
    const g11 = j.satellites.find((s: { id: string }) => s.id === 'G11');
    expect(g11.samples.every((s: { toe: string }) => s.toe === '2024-01-06T22:00:00')).toBe(true);
    expect(j.notes.join('\n')).toMatch(/G07: week 248 read as GPS week 2296/);
    expect(j.notes.join('\n')).toMatch(/G09: t_oe lies in GPS week 2296/);
  });

  it('tauline broadcast --time-scale utc reads times with Z and shifts GPST by the 18 leap seconds (BDT by 4 s)', async () => {
    const sys = JSON.parse((await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:18', '--to', '2024-01-07T00:00:18', '--step', '1', '--satellite', 'G05', '--json'])).out);
    const utc = JSON.parse((await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00Z', '--to', '2024-01-07T00:00:00Z', '--step', '1', '--satellite', 'G05,C08', '--time-scale', 'utc', '--json'])).out);
    expect(utc.satellites[1].samples[0].t).toBe('2024-01-07T00:00:00Z');
    expect(utc.satellites[1].timeScale).toBe('UTC');
    expect(utc.satellites[1].samples[0].relativisticSeconds).toBe(sys.satellites[0].samples[0].relativisticSeconds);
    const bdt = JSON.parse((await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:04', '--to', '2024-01-07T00:00:04', '--step', '1', '--satellite', 'C08', '--json'])).out);
    expect(utc.satellites[0].samples[0].relativisticSeconds).toBe(bdt.satellites[0].samples[0].relativisticSeconds);
  });

  it('tauline broadcast --time-scale utc with an unmodelled satellite (R01) gives it null samples and a note, and still evaluates the others', async () => {
    const r = await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00Z', '--to', '2024-01-07T00:10:00Z', '--step', '600', '--satellite', 'R01,G05', '--time-scale', 'utc', '--json']);
    expect(r.status).toBe(0);
    const json = JSON.parse(r.out);
    expect(json.satellites.map((s: { id: string }) => s.id)).toEqual(['G05', 'R01']);
    expect(json.satellites[1].samples.map((x: { relativisticSeconds: number | null }) => x.relativisticSeconds)).toEqual([null, null]);
    expect(json.satellites[0].samples.every((x: { relativisticSeconds: number | null }) => typeof x.relativisticSeconds === 'number')).toBe(true);
    expect(json.samplesWithoutRecord).toBe(2);
    expect(json.notes).toContain('R01: system not modelled (GPS, Galileo and BeiDou only)');
  });

  it('tauline broadcast <v4.01> --galileo fnav uses the F/NAV record; the table and CSV outputs carry the same rows', async () => {
    const args = ['broadcast', NAV4, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:10:00', '--step', '600', '--satellite', 'E11', '--galileo', 'fnav'];
    const j = JSON.parse((await run([...args, '--json'])).out);
    expect(j.satellites[0].samples.map((s: { message: string }) => s.message)).toEqual(['FNAV', 'FNAV']);
    const csv = (await run([...args, '--csv'])).out.trim().split('\n');
    expect(csv[0]).toBe('id,t,relativisticSeconds,clockCorrectionSeconds,toe,issueOfData,message');
    expect(csv[1]).toBe(`E11,2024-01-07T00:00:00,${j.satellites[0].samples[0].relativisticSeconds},${j.satellites[0].samples[0].clockCorrectionSeconds},2024-01-07T00:00:00,88,FNAV`);
    const text = (await run(args)).out;
    expect(text).toMatch(/Δt_r \(ns\)/);
    expect(text).toMatch(/E11\s+2024-01-07T00:10:00/);
    expect(text).toMatch(/Caution: verify/);
  });

  it('tauline broadcast rejects bad flags and names the file, line and column of a malformed file', async () => {
    const base = ['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T01:00:00', '--step', '600'];
    expect((await run(['broadcast', '--from', 'x', '--to', 'y', '--step', '1'])).err).toMatch(/RINEX navigation file is required/);
    expect((await run([...base.slice(0, 6), '--step', '0'])).err).toMatch(/--step must be a positive number/);
    expect((await run([...base, '--satellite', 'GPS1'])).err).toMatch(/--satellite must be satellite identifiers/);
    expect((await run([...base, '--satellite', ','])).err).toMatch(/at least one satellite/);
    expect((await run([...base, '--time-scale', 'tai'])).err).toMatch(/--time-scale/);
    expect((await run([...base, '--galileo', 'cnav'])).err).toMatch(/--galileo/);
    expect((await run([...base, '--json', '--csv'])).err).toMatch(/cannot be combined/);
    expect((await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00Z', '--to', '2024-01-07T01:00:00', '--step', '600'])).err).toMatch(/--from must be an ISO 8601 date-time read in each system's own time scale/);
    expect((await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T01:00:00', '--step', '600', '--time-scale', 'utc'])).err).toMatch(/--from must be an ISO 8601 UTC date-time/);
    expect((await run(['broadcast', NAV3, '--from', '2024-01-07T02:00:00', '--to', '2024-01-07T01:00:00', '--step', '600'])).err).toMatch(/--to must be a time not before --from/);
    expect((await run([...base.slice(0, 6), '--step', '0.0001'])).err).toMatch(/at most 5000000 samples/);
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-broadcast-'));
    const bad = join(tmp, 'bad.rnx');
    writeFileSync(bad, readFileSync(NAV3, 'utf8').replace('  .123456789000D-01', '  .1234X6789000D-01'));
    const r = await run(['broadcast', bad, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '1']);
    expect(r.status).toBe(2);
    expect(r.err).toBe(`tauline broadcast: parse-error: ${bad}:10:24: expected eccentricity e as a Fortran real (e.g. -1.234567890123D-05); found ".1234X6789000D-01"\n`);
    const missing = await run(['broadcast', join(tmp, 'none.rnx'), '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '1']);
    expect(missing.status).toBe(2);
    expect(missing.err).toMatch(/no such file/);
  });

  it('tauline broadcast on a terminal draws a progress bar on stderr for a long input, and none for a short one', async () => {
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-broadcast-'));
    const big = join(tmp, 'big.rnx');
    const text = readFileSync(NAV3, 'utf8');
    const [head, body] = [text.slice(0, text.indexOf('G05 ')), text.slice(text.indexOf('G05 '))];
    writeFileSync(big, head + body.repeat(Math.ceil((4.5 * 1024 * 1024) / body.length)));
    const r = await run(['broadcast', big, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '1', '--satellite', 'G05', '--json'], true);
    expect(r.status).toBe(0);
    expect(r.err).toMatch(/reading navigation data \[#+\.*\] +100 %/);
    const small = await run(['broadcast', NAV3, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '1', '--json'], true);
    expect(small.err).toBe('');
  });

  it('node packages/cli/bin/tauline.js broadcast ... --csv runs the built binary (after npm run build)', () => {
    const bin = join(ROOT, 'packages/cli/bin/tauline.js');
    if (!existsSync(join(ROOT, 'packages/cli/dist/main.js'))) throw new Error('run `npm run build` first');
    const p = spawnSync(process.execPath, [bin, 'broadcast', NAV4, '--from', '2024-01-07T00:00:00', '--to', '2024-01-07T00:00:00', '--step', '1', '--satellite', 'C03', '--csv'], { encoding: 'utf8' });
    expect(p.status).toBe(0);
    expect(p.stdout.split('\n')[1]).toMatch(/^C03,2024-01-07T00:00:00,-?\d/);
  });
});
