import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/main.js';
import { runCli as run } from '../run.js';

const ROOT = fileURLToPath(new URL('../../../../', import.meta.url));
const PV = join(ROOT, 'test/fixtures/sp3/orbit-c-pv.sp3');
const P = join(ROOT, 'test/fixtures/sp3/orbit-d-p.sp3');
const NAV3 = join(ROOT, 'test/fixtures/rinex-nav/mixed-v305.rnx');

describe('tauline precise', () => {
  it('tauline precise <SP3-c with velocities> --json gives −2 r·v/c² at every file epoch from the file velocities, and the bad-value epoch as a gap', async () => {
    const r = await run(['precise', PV, '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j).toMatchObject({
      timeSystem: 'GPS',
      coordinateFrame: 'IGS20',
      agency: 'TLN',
      sp3Version: 'c',
      epochInterval: 900,
      lagrangePoints: 9,
    });
    expect(j.satellites.map((s: { id: string }) => s.id)).toEqual(['G05', 'E11', 'C08']);
    const g05 = j.satellites[0];
    expect(g05.samples.map((s: { t: string }) => s.t)).toEqual([
      '2024-01-07T00:00:00',
      '2024-01-07T00:15:00',
      '2024-01-07T00:30:00',
      '2024-01-07T00:45:00',
    ]);
    expect(g05.samples.every((s: { velocitySource: string }) => s.velocitySource === 'file')).toBe(true);
    expect(j.satellites[1].gaps).toEqual([
      { t: '2024-01-07T00:30:00', reason: 'position missing (bad/absent marker 0.000000)' },
    ]);
    expect(j.satellites[1].samples).toHaveLength(3);
  });

  it('tauline precise <SP3-c> --nav <RINEX 3.05> reports the broadcast Δt_r and a difference below 0.05 ns for the same orbits (cross-check)', async () => {
    const j = JSON.parse((await run(['precise', PV, '--nav', NAV3, '--json'])).out);
    let n = 0;
    for (const sat of j.satellites) {
      for (const s of sat.samples) {
        expect(s.broadcastRelativisticSeconds).not.toBeNull();
        expect(Math.abs(s.differenceSeconds)).toBeLessThan(0.05e-9);
        expect(s.differenceSeconds).toBeCloseTo(s.relativisticSeconds - s.broadcastRelativisticSeconds, 20);
        n++;
      }
    }
    expect(n).toBe(11);
    expect(j.navigationSkipped).toEqual([]);
  });

  it('tauline precise <SP3-d positions only> uses 9-point Lagrange velocities; --lagrange-points and --satellite narrow the run', async () => {
    const j = JSON.parse((await run(['precise', P, '--satellite', 'G30', '--json'])).out);
    expect(j.satellites).toHaveLength(1);
    expect(j.satellites[0].samples).toHaveLength(13);
    expect(j.satellites[0].samples[0].velocitySource).toBe('lagrange');
    const five = JSON.parse((await run(['precise', P, '--satellite', 'G30', '--lagrange-points', '5', '--json'])).out);
    expect(five.lagrangePoints).toBe(5);
    const d = Math.abs(
      five.satellites[0].samples[6].relativisticSeconds - j.satellites[0].samples[6].relativisticSeconds,
    );
    expect(d).toBeGreaterThan(0);
    expect(d).toBeLessThan(3e-11);
  });

  it('tauline precise prints a table with gaps listed, and CSV rows streamed with gaps marked', async () => {
    const text = (await run(['precise', P])).out;
    expect(text).toMatch(/SP3-d, GPS time, frame IGS20, TLN/);
    expect(text).toMatch(/G31\s+2024-01-07T01:30:00: position missing/);
    const csv = (await run(['precise', PV, '--csv', '--nav', NAV3])).out.trim().split('\n');
    expect(csv[0]).toBe('id,t,relativisticSeconds,velocitySource,broadcastRelativisticSeconds,differenceSeconds');
    expect(csv).toHaveLength(1 + 12);
    expect(csv.find((l) => l.startsWith('E11,2024-01-07T00:30:00'))).toBe(
      'E11,2024-01-07T00:30:00,,gap: position missing (bad/absent marker 0.000000),,',
    );
  });

  it('tauline precise --csv writes the same bytes as before rows were collected per epoch (golden files, test/fixtures/precise-csv/SOURCE.md), with one write per epoch at most', async () => {
    const golden = (name: string) => readFileSync(join(ROOT, 'test/fixtures/precise-csv', name), 'utf8');
    const cases: [string, string[], number][] = [
      ['orbit-d-p.csv', [P, '--csv'], 13],
      ['orbit-c-pv-nav.csv', [PV, '--csv', '--nav', NAV3], 4],
      ['orbit-d-p-5-nav.csv', [P, '--csv', '--lagrange-points', '5', '--nav', NAV3], 13],
    ];
    for (const [name, args, epochs] of cases) {
      const writes: string[] = [];
      const status = await main(['precise', ...args], {
        out: (t) => {
          writes.push(t);
        },
        err: () => {},
        isTty: false,
      });
      expect(status).toBe(0);
      expect(writes.join('')).toBe(golden(name));
      // The header, then at most one write per epoch and one for the end of the file.
      expect(writes.length).toBeLessThanOrEqual(1 + epochs + 1);
      expect(writes.every((w) => w.endsWith('\n'))).toBe(true);
    }
  });

  it('tauline precise rejects bad arguments and reports a truncated file with its line', async () => {
    expect((await run(['precise'])).err).toMatch(/exactly one SP3 file/);
    expect((await run(['precise', PV, '--lagrange-points', '1'])).err).toMatch(
      /--lagrange-points must be an integer in \[2, 16\]/,
    );
    expect((await run(['precise', PV, '--satellite', 'X1'])).err).toMatch(/--satellite/);
    const t = await run(['precise', join(ROOT, 'test/fixtures/sp3/truncated.sp3')]);
    expect(t.status).toBe(2);
    expect(t.err).toMatch(/truncated\.sp3:58:19: expected y \(km\)/);
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-precise-'));
    const noEof = join(tmp, 'no-eof.sp3');
    writeFileSync(noEof, readFileSync(P, 'utf8').replace('EOF\n', ''));
    expect((await run(['precise', noEof, '--json'])).err).toMatch(/no-eof\.sp3:60:1: expected the closing 'EOF' line/);
  });

  it('tauline precise <SP3-a> --json reads the file, says GPS time is assumed, lists G21 without a record at 00:30 as a gap, and equals its SP3-c twin', async () => {
    const A = join(ROOT, 'test/fixtures/sp3/orbit-a-pv.sp3');
    const r = await run(['precise', A, '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j).toMatchObject({ sp3Version: 'a', timeSystem: 'GPS', timeSystemAssumed: true });
    expect(j.satellites[1]).toMatchObject({
      id: 'G21',
      gaps: [{ t: '2003-08-17T00:30:00', reason: 'no record at this epoch' }],
    });
    const c = JSON.parse((await run(['precise', join(ROOT, 'test/fixtures/sp3/orbit-a-as-c.sp3'), '--json'])).out);
    expect(j.satellites).toEqual(c.satellites);
    expect(c.timeSystemAssumed).toBe(false);
    const table = (await run(['precise', A])).out;
    expect(table).toMatch(/SP3-a, GPS time assumed: SP3-a states none/);
    expect(table).toMatch(/G21 2003-08-17T00:30:00: no record at this epoch/);
  });

  it('tauline precise <SP3-b positions only> equals its SP3-c twin; a non-finite coordinate is refused with file:line:column and exit 2', async () => {
    const B = join(ROOT, 'test/fixtures/sp3/orbit-b-p.sp3');
    const j = JSON.parse((await run(['precise', B, '--json'])).out);
    const c = JSON.parse((await run(['precise', join(ROOT, 'test/fixtures/sp3/orbit-b-as-c.sp3'), '--json'])).out);
    expect(j.sp3Version).toBe('b');
    expect(j.satellites.map((s: { id: string }) => s.id)).toEqual(['G07', 'R04']);
    expect(j.satellites).toEqual(c.satellites);
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-precise-'));
    const bad = join(tmp, 'bad.sp3');
    const lines = readFileSync(B, 'utf8').split('\n');
    lines[23] = lines[23]!.slice(0, 4) + '-1e400'.padStart(14) + lines[23]!.slice(18);
    writeFileSync(bad, lines.join('\n'));
    const r = await run(['precise', bad]);
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/bad\.sp3:24:5: expected x \(km\) \(a finite number/);
  });

  it('node packages/cli/bin/tauline.js precise ... --json runs the built binary (after npm run build)', () => {
    if (!existsSync(join(ROOT, 'packages/cli/dist/main.js'))) throw new Error('run `npm run build` first');
    const p = spawnSync(
      process.execPath,
      [join(ROOT, 'packages/cli/bin/tauline.js'), 'precise', PV, '--satellite', 'G05', '--json'],
      { encoding: 'utf8' },
    );
    expect(p.status).toBe(0);
    expect(JSON.parse(p.stdout).satellites[0].samples).toHaveLength(4);
  });
});
