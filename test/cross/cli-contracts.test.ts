/**
 * The documented JSON contracts of every `tauline` command, through the BUILT binary
 * (`node packages/cli/bin/tauline.js`; `npm test` builds first). One run per command on a bundled
 * example or fixture; the documented fields are checked against expectations recomputed here,
 * independently of the SDK, from the formulas and constants of /work/shared/physics-refs.md.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const BIN = join(ROOT, 'packages/cli/bin/tauline.js');
const ORIN = join(ROOT, 'packages/sdk/examples/steering/orin-3-meo.json');
const KESTREL_A = join(ROOT, 'packages/sdk/examples/review/kestrel-block-a.review.json');
const NBS14 = join(ROOT, 'test/fixtures/stability/nbs14-phase.txt');
const NAV = join(ROOT, 'test/fixtures/rinex-nav/mixed-v305.rnx');
const SP3 = join(ROOT, 'test/fixtures/sp3/orbit-d-p.sp3');
const CLK = join(ROOT, 'test/fixtures/rinex-clock/long-304.clk');

// Constants (physics-refs.md §1): c exact (SI); GM and L_G of IERS Conventions (2010) [V2]/[V1]; GPS μ [M/V2].
const C = 299_792_458;
const C2 = C * C;
const GM_IERS = 3.986004418e14;
const GM_GPS = 3.986005e14;
const L_G = 6.969290134e-10;
const CAUTION = /interface specification[\s\S]*responsible engineering authority/;

interface Run {
  status: number | null;
  json: Record<string, any>;
  stderr: string;
}

function tauline(...argv: string[]): Run {
  if (!existsSync(join(ROOT, 'packages/cli/dist/main.js')))
    throw new Error('the CLI is not built: run `npm run build` first');
  const r = spawnSync(process.execPath, [BIN, ...argv], { encoding: 'utf8', cwd: ROOT });
  let json: Record<string, any> = {};
  try {
    json = JSON.parse(r.stdout) as Record<string, any>;
  } catch {
    throw new Error(`tauline ${argv.join(' ')} printed no JSON (exit ${r.status}): ${r.stderr}`);
  }
  return { status: r.status, json, stderr: r.stderr };
}

/** Kepler's equation M = E − e sin E by Newton iteration (independent of the SDK's solver). */
function kepler(M: number, e: number): number {
  let E = M;
  for (let k = 0; k < 50; k++) E -= (E - e * Math.sin(E) - M) / (1 - e * Math.cos(E));
  return E;
}

describe('tauline CLI contracts through the built binary', () => {
  it('rate --semi-major-axis 26561750 --nominal-frequency 10.23e6 --json: fractionalRate = L_G − 3GM/(2ac²), split and offsets recomputed (IERS 2010 §10.2 eq. 10.9; physics-refs §2 [C])', () => {
    const a = 26_561_750,
      f0 = 10.23e6;
    const r = tauline('rate', '--semi-major-axis', String(a), '--nominal-frequency', String(f0), '--json');
    expect(r.status).toBe(0);
    const rate = L_G - (3 * GM_IERS) / (2 * a * C2);
    const factory = -rate / (1 + rate); // = 1/(1 + rate) − 1 without the cancellation of the subtraction
    expect(r.json.fractionalRate).toBeCloseTo(rate, 22);
    expect(r.json.gravitational).toBeCloseTo(L_G - GM_IERS / (a * C2), 22);
    expect(r.json.velocity).toBeCloseTo(-GM_IERS / (2 * a * C2), 22);
    expect(r.json.microsecondsPerDay).toBeCloseTo(rate * 86_400e6, 9);
    expect(r.json.factoryOffset).toBeCloseTo(factory, 22);
    expect(Math.abs(r.json.offsetFrequencyHz - f0 * (1 + factory))).toBeLessThan(2e-9);
    // Published check values: 4.464733e-10 and 38.5753 µs/day (physics-refs §2 [C]).
    expect(Math.abs(r.json.fractionalRate - 4.464733e-10)).toBeLessThanOrEqual(0.5e-16);
    expect(r.json.units.semiMajorAxis).toBe('m');
    expect(r.json.caution).toMatch(CAUTION);
  });

  it('periodic ... --constants gps-icd --json: correctionSeconds = F e √A sin E = −2.378695477618e-08 s and amplitudeSeconds = |F| e √A (IS-GPS-200 §20.3.3.3.3.1; physics-refs §3 [C])', () => {
    const sqrtA = 5153.79589081,
      e = 0.0123456789,
      E = 1.0;
    const r = tauline(
      'periodic',
      '--semi-major-axis',
      String(sqrtA ** 2),
      '--eccentricity',
      String(e),
      '--mean-anomaly',
      String(E - e * Math.sin(E)),
      '--constants',
      'gps-icd',
      '--json',
    );
    expect(r.status).toBe(0);
    const F = (-2 * Math.sqrt(GM_GPS)) / C2;
    expect(Math.abs(r.json.correctionSeconds - -2.378695477618e-8)).toBeLessThanOrEqual(0.5e-20);
    expect(Math.abs(r.json.correctionSeconds - F * e * sqrtA * Math.sin(E))).toBeLessThanOrEqual(1e-21);
    expect(Math.abs(r.json.amplitudeSeconds - Math.abs(F) * e * sqrtA)).toBeLessThanOrEqual(1e-21);
  });

  it('propertime --model point-mass on a circular orbit: samples [{t, tauMinusTT}] follow (L_G − 3GM/(2rc²))·t to 1 ps over a day (IERS 2010 eq. 10.9; circular: r and v constant [C])', () => {
    const r0 = 26_561_750,
      v = Math.sqrt(GM_IERS / r0);
    const run = tauline(
      'propertime',
      '--state',
      `${r0},0,0,0,${v},0`,
      '--duration',
      '86400',
      '--step',
      '43200',
      '--model',
      'point-mass',
      '--json',
    );
    expect(run.status).toBe(0);
    const samples = run.json.samples as { t: number; tauMinusTT: number }[];
    expect(samples.map((s) => s.t)).toEqual([0, 43_200, 86_400]);
    const rate = L_G - (3 * GM_IERS) / (2 * r0 * C2);
    for (const s of samples) expect(Math.abs(s.tauMinusTT - rate * s.t)).toBeLessThan(1e-12);
  });

  it('stability --phase nbs14 --tau0 1 --json: rows with tau, oadev, mdev, tdev, ohdev and bounds match NIST SP 1065 §12 NBS14 (physics-refs stability table [V2])', () => {
    const r = tauline('stability', '--phase', NBS14, '--tau0', '1', '--statistics', 'oadev,mdev,tdev,ohdev', '--json');
    expect(r.status).toBe(0);
    const rows = r.json.rows as Record<string, number>[];
    const at = (tau: number) => rows.find((x) => x.tau === tau)!;
    // Published to 7 significant digits; the fixture's phase is printed to 5 decimals.
    const published: [number, string, number][] = [
      [1, 'oadev', 91.22945],
      [2, 'oadev', 85.95287],
      [1, 'mdev', 91.22945],
      [2, 'mdev', 74.78849],
      [1, 'tdev', 52.67135],
      [2, 'tdev', 86.35831],
      [1, 'ohdev', 70.80607],
      [2, 'ohdev', 85.61487],
    ];
    for (const [tau, stat, value] of published) {
      expect(Math.abs(at(tau)[stat]! - value), `${stat}(${tau})`).toBeLessThanOrEqual(0.5e-5); // half a unit in the published last digit
      expect(at(tau)[`${stat}Low`]!).toBeLessThan(at(tau)[stat]!);
      expect(at(tau)[`${stat}High`]!).toBeGreaterThan(at(tau)[stat]!);
    }
    expect(r.json.units.tau).toBe('s');
  });

  it('plan orin-3-meo.json --json: feasible, commands = actuator steps × 5e-15, and the manoeuvre command cancels (3GM/(2c²))(1/a_before − 1/a_after) to half a step (Ashby 2001 PTTI [V2]; [C])', () => {
    const r = tauline('plan', ORIN, '--json');
    expect(r.status).toBe(0);
    expect(r.json.feasible).toBe(true);
    const resolution = 5e-15;
    for (const c of r.json.commands as Record<string, any>[]) {
      expect(c.kind).toBe('frequency');
      expect(Math.abs(c.fractionalFrequencyStep - c.actuatorSteps * resolution)).toBeLessThan(1e-27);
      expect(c.executeAt >= c.uplinkAt).toBe(true);
    }
    const rateChange = ((3 * GM_IERS) / (2 * C2)) * (1 / 27_412_000 - 1 / 27_427_000);
    const cancel = (r.json.commands as Record<string, any>[]).find((c) => c.executeAt === '2027-02-11T14:30:00Z')!;
    expect(Math.abs(cancel.fractionalFrequencyStep + rateChange)).toBeLessThanOrEqual(resolution / 2);
    expect(r.json.predicted.t.length).toBe(r.json.predicted.steered.phaseSeconds.length);
    expect(r.json.caution).toMatch(CAUTION);
  });

  it('simulate orin-3-meo.json --runs 20 --json: one result per strategy with runs = 20 and fractions in [0, 1] (common practice, no source)', () => {
    const r = tauline('simulate', ORIN, '--runs', '20', '--seed', '7', '--json');
    expect(r.status).toBe(0);
    const results = r.json.results as Record<string, any>[];
    expect(results.map((x) => x.strategy)).toEqual(['none', 'deadband', 'optimal']);
    for (const x of results) {
      expect(x.runs).toBe(20);
      expect(x.seed).toBe(7);
      for (const k of ['timeInTolerance', 'wholeHorizonProbability', 'minEpochProbability'])
        expect(x[k]).toBeGreaterThanOrEqual(0);
      expect(x.wholeHorizonProbability).toBeLessThanOrEqual(x.timeInTolerance);
      expect(x.worstExcursionP95Seconds).toBeLessThanOrEqual(x.worstExcursionSeconds);
    }
    expect(results[0]!.commandCount).toBe(0);
    expect(r.json.caution).toMatch(CAUTION);
  });

  it('review kestrel-block-a --format json: expectedFractionalOffset = 1/(1 + L_G − 3GM/(2ac²)) − 1 per spacecraft without a J2 semi-major-axis kind (IERS 2010 eq. 10.9; Ashby 2003 §5 [C])', () => {
    const r = tauline('review', KESTREL_A, '--format', 'json', '--runs', '200');
    expect(r.status).toBe(0);
    let checked = 0;
    for (const s of r.json.spacecraft as Record<string, any>[]) {
      expect(s.verdict).toBe('pass');
      if (s.constants !== 'iers-2010' || s.reference !== 'tt') continue;
      const rate = L_G - (3 * GM_IERS) / (2 * s.semiMajorAxis * C2);
      // J2 (when the file gives a semi-major-axis kind) adds ~1e-14; without it the point-mass value is exact.
      expect(Math.abs(s.expectedFractionalOffset - -rate / (1 + rate))).toBeLessThan(2e-14);
      checked++;
    }
    expect(checked).toBeGreaterThan(0);
    expect(r.json.caution).toMatch(CAUTION);
  });

  it('broadcast mixed-v305 --satellite G05 --json: at t_oe, relativisticSeconds = F e √A sin E(M0) and clockCorrectionSeconds = a_f0 + Δt_r (IS-GPS-200 §20.3.3.3.3.1; fixture values from generate.py [C])', () => {
    const r = tauline(
      'broadcast',
      NAV,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T00:00:00',
      '--step',
      '60',
      '--satellite',
      'G05',
      '--json',
    );
    expect(r.status).toBe(0);
    const s = r.json.satellites[0].samples[0];
    const F = (-2 * Math.sqrt(GM_GPS)) / C2;
    const e = 0.0123456789,
      sqrtA = 5153.79589081,
      M0 = 1.0,
      af0 = 1.0e-4;
    const dtr = F * e * sqrtA * Math.sin(kepler(M0, e));
    expect(Math.abs(s.relativisticSeconds - dtr)).toBeLessThan(1e-18);
    expect(Math.abs(s.clockCorrectionSeconds - (af0 + dtr))).toBeLessThan(1e-18);
    expect(r.json.caution).toMatch(CAUTION);
    // Every time field names its scale: t on timeScale, t_oe on toeScale (the system's own).
    expect([r.json.satellites[0].timeScale, r.json.satellites[0].toeScale]).toEqual(['GPST', 'GPST']);
    expect(r.json.units.toe).toMatch(/toeScale/);
  });

  it('precise orbit-d-p.sp3 --satellite G30 --json: relativisticSeconds at 01:30 = −2√(GM a) e sin E/c² of the two-body orbit, to 1 ps (IERS 2010 eq. 10.10; SOURCE.md orbit [C])', () => {
    const r = tauline('precise', SP3, '--satellite', 'G30', '--json');
    expect(r.status).toBe(0);
    const a = 26_561_750,
      e = 0.02,
      M0 = -0.3,
      t = 5400;
    const E = kepler(M0 + Math.sqrt(GM_GPS / a ** 3) * t, e);
    const expected = (-2 * Math.sqrt(GM_GPS * a) * e * Math.sin(E)) / C2;
    const sample = (r.json.satellites[0].samples as Record<string, any>[]).find((x) => x.t === '2024-01-07T01:30:00')!;
    expect(Math.abs(sample.relativisticSeconds - expected)).toBeLessThan(1e-12);
    expect(r.json.units.relativisticSeconds).toBe('s');
  });
  it('clock --rinex-clock long-304.clk --clock G37 --reference-epoch <UTC> --json: the axis starts at the first G37 epoch as written, t_oc = UTC + 18 s, af0/af1/af2 = an independent least-squares fit (GPS − UTC = 18 s, IERS Bulletin C [M]; fit [C])', () => {
    const r = tauline(
      'clock',
      '--rinex-clock',
      CLK,
      '--clock',
      'G37',
      '--reference-epoch',
      '2026-02-02T06:00:00Z',
      '--json',
    );
    expect(r.status).toBe(0);
    // The G37 records as written (RINEX clock 3.04 columns: epoch fields, then the bias), read here by splitting.
    const rows = readFileSync(CLK, 'utf8')
      .split('\n')
      .filter((l) => l.startsWith('AS G37 '))
      .map((l) => {
        const f = l.trim().split(/\s+/);
        const [y, mo, d, h, mi, sec, , bias] = f.slice(2).map(Number) as number[];
        return { ms: Date.UTC(y!, mo! - 1, d!, h!, mi!, 0) + sec! * 1000, bias: bias! };
      });
    const first = rows[0]!;
    const last = rows.at(-1)!;
    const iso = (ms: number) => new Date(ms).toISOString().slice(0, 19);
    expect(r.json.input.epoch).toEqual({ iso: iso(first.ms), scale: 'GPS' });
    expect(r.json.input.firstEpoch).toBe(0);
    expect(r.json.input.lastEpoch).toBe((last.ms - first.ms) / 1000);
    expect(r.json.input.lastEpochStamp).toEqual({ iso: iso(last.ms), scale: 'GPS' });
    const toc = (Date.UTC(2026, 1, 2, 6) + 18_000 - first.ms) / 1000;
    expect(r.json.polynomial.referenceTime).toBe(toc);
    expect(r.json.polynomial.referenceEpoch).toEqual({ iso: '2026-02-02T06:00:18', scale: 'GPS' });
    expect(r.json.polynomial.caution).toMatch(CAUTION);
    // Ordinary least squares of a0 + a1 u + a2 u², u = (t − t_oc)/1e4 s for conditioning, by the normal equations.
    const n = [0, 0, 0, 0, 0];
    const b = [0, 0, 0];
    for (const { ms, bias } of rows) {
      const u = ((ms - first.ms) / 1000 - toc) / 1e4;
      for (let k = 0; k < 5; k++) n[k]! += u ** k;
      for (let k = 0; k < 3; k++) b[k]! += bias * u ** k;
    }
    const [s0, s1, s2, s3, s4] = n as [number, number, number, number, number];
    const det3 = (m: number[][]) =>
      m[0]![0]! * (m[1]![1]! * m[2]![2]! - m[1]![2]! * m[2]![1]!) -
      m[0]![1]! * (m[1]![0]! * m[2]![2]! - m[1]![2]! * m[2]![0]!) +
      m[0]![2]! * (m[1]![0]! * m[2]![1]! - m[1]![1]! * m[2]![0]!);
    const N = [
      [s0, s1, s2],
      [s1, s2, s3],
      [s2, s3, s4],
    ];
    const D = det3(N);
    const solved = [0, 1, 2].map((c) => det3(N.map((row, i) => row.map((v, j) => (j === c ? b[i]! : v)))) / D);
    const expected = solved.map((a, k) => a / 1e4 ** k);
    const coefficients = r.json.polynomial.coefficients as { name: string; value: number; std: number }[];
    // Cramer's rule in doubles: agreement to ~1e-9 relative for af0, af1; af2 is 0.3σ from zero, so it is
    // compared against its own σ (well above the rounding of either computation).
    expect(Math.abs(coefficients[0]!.value - expected[0]!)).toBeLessThan(1e-9 * Math.abs(expected[0]!));
    expect(Math.abs(coefficients[1]!.value - expected[1]!)).toBeLessThan(1e-9 * Math.abs(expected[1]!));
    expect(Math.abs(coefficients[2]!.value - expected[2]!)).toBeLessThan(1e-6 * coefficients[2]!.std);
    expect(r.json.filter.jumps).toEqual([]);
  });
});
