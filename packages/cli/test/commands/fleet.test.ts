import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { type CliRun, runCli } from '../run.js';

const VESPER = fileURLToPath(new URL('../../../sdk/examples/fleet/vesper-constellation.json', import.meta.url));
const ASHGROVE = fileURLToPath(new URL('../../../sdk/examples/fleet/ashgrove-orbits.json', import.meta.url));
const run = (...argv: string[]): Promise<CliRun> => runCli(['fleet', ...argv]);

function tempFile(name: string, value: unknown): string {
  const path = join(mkdtempSync(join(tmpdir(), 'tauline-fleet-')), name);
  writeFileSync(path, typeof value === 'string' ? value : JSON.stringify(value));
  return path;
}

/** The example with every satellite given only VESPER-1's first pass (one station, one ten-minute window each). */
function overbooked(): Record<string, any> {
  const doc = JSON.parse(readFileSync(VESPER, 'utf8')) as Record<string, any>;
  const pass = doc.satellites[0].passes[1];
  for (const s of doc.satellites) s.passes = [pass];
  return doc;
}

describe('tauline fleet', () => {
  it("tauline fleet vesper-constellation.json --json prints the issue's shape (feasible, satellites with commands and station, stationSchedule), units and the caution, and exits 0", async () => {
    const r = await run(VESPER, '--json');
    expect(r.err).toBe('');
    expect(r.status).toBe(0);
    const plan = JSON.parse(r.out) as Record<string, any>;
    expect(Object.keys(plan).sort()).toEqual([
      'caution',
      'epoch',
      'feasible',
      'satellites',
      'stationSchedule',
      'units',
    ]);
    expect(plan.feasible).toBe(true);
    expect(plan.caution).toMatch(/responsible engineering authority/);
    for (const s of plan.satellites) {
      expect(Object.keys(s).sort()).toEqual(['commands', 'feasible', 'id', 'metrics', 'predicted']);
      for (const c of s.commands) {
        expect(Object.keys(c).sort()).toEqual([
          'actuatorSteps',
          'executeAt',
          'fractionalFrequencyStep',
          'kind',
          'reason',
          'station',
          'uplinkAt',
        ]);
        expect(
          plan.stationSchedule.some(
            (x: { satellite: string; station: string; start: string; end: string }) =>
              x.satellite === s.id && x.station === c.station && x.start <= c.uplinkAt && c.uplinkAt <= x.end,
          ),
        ).toBe(true);
      }
    }
    for (const x of plan.stationSchedule)
      expect(Object.keys(x).sort()).toEqual(['end', 'satellite', 'start', 'station']);
  });

  it('tauline fleet vesper-constellation.json prints one line per satellite, the station timelines, the supports and the caution', async () => {
    const r = await run(VESPER);
    expect(r.status).toBe(0);
    expect(Math.max(...r.out.split('\n').map((l) => [...l].length))).toBeLessThanOrEqual(100);
    // The header row as one line: --wide (the default table wraps long headers to fit 100 columns).
    expect((await run(VESPER, '--wide')).out).toMatch(
      /satellite\s+feasible\s+worst \|mean\| \+ z·σ\s+tolerance\s+probability\s+in\s+tolerance\s+supports\s+commands\s+stations\s+used/,
    );
    for (const id of ['VESPER-1', 'VESPER-2', 'VESPER-3', 'VESPER-4'])
      expect(r.out).toMatch(new RegExp(`^${id}\\s+yes\\s+[\\d.]+ ns`, 'm'));
    expect(r.out).toMatch(/^HARROWMERE {6}[·A-D*]{84}$/m);
    expect(r.out).toMatch(/^CALLOWAY-RIDGE {2}[·A-D*]{84}$/m);
    expect(r.out).toContain('Legend: A VESPER-1, B VESPER-2, C VESPER-3, D VESPER-4');
    expect(r.out).toMatch(/Caution: this schedule is a planning aid/);
  });

  it('tauline fleet <file> draws supports ending and starting in the leap second 2016-12-31T23:59:60Z in the station timeline, on elapsed SI seconds', async () => {
    // Two supports touching the leap second at the end of 2016 (IERS Bulletin C 52 [M]): VESPER-1 at HARROWMERE
    // 23:40:00–23:59:60 (1200 s, its supportSeconds), VESPER-2 at CALLOWAY-RIDGE 23:59:60–00:14:59 (900 s).
    const doc = JSON.parse(readFileSync(VESPER, 'utf8')) as Record<string, any>;
    const one = doc.satellites[0];
    doc.epoch = '2016-12-31T00:00:00Z';
    doc.horizonSeconds = 201_600; // 84 characters of 2400 s each
    doc.satellites = [
      { ...one, passes: [{ station: 'HARROWMERE', start: '2016-12-31T23:40:00Z', end: '2016-12-31T23:59:60Z' }] },
      {
        ...one,
        id: 'VESPER-2',
        passes: [{ station: 'CALLOWAY-RIDGE', start: '2016-12-31T23:59:60Z', end: '2017-01-01T00:14:59Z' }],
      },
    ];
    const path = tempFile('leap.json', doc);
    const json = JSON.parse((await run(path, '--json')).out) as Record<string, any>;
    expect(json.stationSchedule).toEqual([
      { station: 'HARROWMERE', satellite: 'VESPER-1', start: '2016-12-31T23:40:00Z', end: '2016-12-31T23:59:60Z' },
      { station: 'CALLOWAY-RIDGE', satellite: 'VESPER-2', start: '2016-12-31T23:59:60Z', end: '2017-01-01T00:14:59Z' },
    ]);
    const r = await run(path);
    expect(r.status).toBe(0);
    // Elapsed SI seconds since the epoch, counted by hand: 23:40:00 is 85 200 s, 23:59:60 is 86 400 s (the day had
    // 86 401 s), 00:14:59 is 87 299 s. Cells of 2400 s: [85 200, 86 400) lies in cell 35, [86 400, 87 299) in 36.
    // (POSIX time has no 23:59:60: Date.parse gives NaN and the support was not drawn at all.)
    const lane = (id: string): string => {
      const line = r.out.split('\n').find((l) => l.startsWith(`${id}  `));
      if (line === undefined) throw new Error(`no lane for ${id}`);
      return line.slice(line.length - 84);
    };
    expect(lane('HARROWMERE')).toBe(`${'·'.repeat(35)}A${'·'.repeat(48)}`);
    expect(lane('CALLOWAY-RIDGE')).toBe(`${'·'.repeat(36)}B${'·'.repeat(47)}`);
  });

  it('tauline fleet <file> exits 1 and names the satellites that cannot be held, and why, when one pass is shared by four satellites', async () => {
    const r = await run(tempFile('overbooked.json', overbooked()));
    expect(r.status).toBe(1);
    expect(r.out).toMatch(/Feasible: NO\. \d of 4 satellites cannot be held: /);
    expect(r.out.replace(/\s+/g, ' ')).toMatch(
      /\(station-overbooked\): no free support before .*: station CALLOWAY-RIDGE overbooked 2027-02-01T18:30:00Z–2027-02-01T19:20:00Z \(held by VESPER-/,
    );
    const json = JSON.parse((await run(tempFile('overbooked.json', overbooked()), '--json')).out) as Record<
      string,
      any
    >;
    expect(json.feasible).toBe(false);
    expect(json.stationSchedule.length).toBeGreaterThanOrEqual(1);
  });

  it('tauline fleet <file> exits 2 with a one-line error naming the field for a bad document, a missing file and a missing argument', async () => {
    const doc = JSON.parse(readFileSync(VESPER, 'utf8')) as Record<string, any>;
    doc.satellites[2].passes[3].station = 'NOWHERE';
    const bad = await run(tempFile('bad.json', doc));
    expect(bad.status).toBe(2);
    expect(bad.out).toBe('');
    expect(bad.err).toBe(
      'tauline fleet: invalid input: satellites[2].passes[3].station must be one of the station ids HARROWMERE, CALLOWAY-RIDGE; received "NOWHERE"\n',
    );
    const missing = await run(join(tmpdir(), 'no-such-fleet.json'));
    expect(missing.status).toBe(2);
    expect(missing.err.trim().split('\n')).toHaveLength(1);
    const syntax = await run(tempFile('broken.json', '{ "epoch": '));
    expect(syntax.status).toBe(2);
    expect(syntax.err.trim().split('\n')).toHaveLength(1);
    expect((await run()).status).toBe(2);
  });

  it('tauline fleet --help describes the format, the method and the exit statuses', async () => {
    const r = await run('--help');
    expect(r.status).toBe(0);
    expect(r.out).toContain('packages/sdk/schema/fleet.schema.json');
    expect(r.out).toContain('Exit status: 0 every satellite feasible, 1 some satellite infeasible');
  });

  it('tauline fleet ashgrove-orbits.json --json lists the computed passes of every satellite with their maximum elevation, and exits 0', async () => {
    const r = await run(ASHGROVE, '--json');
    expect(r.err).toBe('');
    expect(r.status).toBe(0);
    const plan = JSON.parse(r.out) as Record<string, any>;
    expect(plan.units.maxElevationRadians).toBe('rad');
    for (const s of plan.satellites) {
      expect(s.computedPasses.length).toBeGreaterThan(5);
      for (const p of s.computedPasses) {
        expect(Object.keys(p).sort()).toEqual([
          'clippedAtEnd',
          'clippedAtStart',
          'end',
          'maxElevationAt',
          'maxElevationRadians',
          'start',
          'station',
          'usable',
        ]);
        expect(p.maxElevationRadians).toBeGreaterThan(0);
      }
    }
    for (const x of plan.stationSchedule) {
      const passes = plan.satellites.find((s: { id: string }) => s.id === x.satellite).computedPasses as {
        station: string;
        start: string;
        end: string;
      }[];
      expect(
        passes.some(
          (p) =>
            p.station === x.station &&
            Date.parse(p.start) <= Date.parse(x.start) &&
            Date.parse(x.end) <= Date.parse(p.end),
        ),
      ).toBe(true);
    }
  });

  it('tauline fleet ashgrove-orbits.json prints the pass counts per satellite and station, marked computed, within 100 columns', async () => {
    const r = await run(ASHGROVE);
    expect(r.status).toBe(0);
    expect(Math.max(...r.out.split('\n').map((l) => [...l].length))).toBeLessThanOrEqual(100);
    expect(r.out).toMatch(/satellite\s+passes\s+ALDERFELL\s+BRACKENSHAW\s+CINDERVALE\s+highest elevation \(deg\)/);
    for (const id of ['ASHGROVE-1', 'ASHGROVE-2', 'ASHGROVE-3', 'ASHGROVE-4'])
      expect(r.out).toMatch(new RegExp(`^${id}\\s+computed(\\s+\\d+){3}\\s+\\d+\\.\\d$`, 'm'));
    expect(r.out).toMatch(/Computed passes: from mean elements \(secular J2\)/);
    // The given-pass example says so in the same table.
    expect((await run(VESPER)).out).toMatch(/^VESPER-1\s+given\s+7\s+7\s+-$/m);
  });

  it('tauline fleet <file> exits 2 with a one-line error for a semi-major axis in kilometres and for a station without a position', async () => {
    const doc = JSON.parse(readFileSync(ASHGROVE, 'utf8')) as Record<string, any>;
    doc.satellites[0].orbit.semiMajorAxisMetres = 28_410;
    const km = await run(tempFile('km.json', doc));
    expect(km.status).toBe(2);
    expect(km.err).toMatch(
      /^tauline fleet: invalid input: satellites\[0\]\.orbit\.semiMajorAxisMetres .*did you mean 28410 km = 28410000 m\?\n$/,
    );
    const noSite = JSON.parse(readFileSync(ASHGROVE, 'utf8')) as Record<string, any>;
    delete noSite.stations[1].position;
    delete noSite.stations[1].elevationMaskRadians;
    const r = await run(tempFile('nosite.json', noSite));
    expect(r.status).toBe(2);
    expect(r.err).toMatch(
      /^tauline fleet: invalid input: stations\[1\]\.position .*satellites\[0\] \(ASHGROVE-1\) gives an orbit.*\n$/,
    );
  });
});
