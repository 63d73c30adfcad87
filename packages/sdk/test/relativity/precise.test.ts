import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { GPS_ICD, SPEED_OF_LIGHT } from '../../src/constants.js';
import { InvalidArgumentError } from '../../src/errors.js';
import { parseSp3, readSp3, type Sp3Epoch } from '../../src/io/sp3.js';
import { solveKepler } from '../../src/orbit/kepler.js';
import { periodicCorrectionFromState } from '../../src/relativity/periodic.js';
import {
  lagrangeDerivativeAtNode,
  lagrangeInterpolate,
  type PreciseCorrectionResult,
  PreciseCorrectionStream,
  preciseRelativisticCorrections,
} from '../../src/relativity/precise.js';

const P_TEXT = readFileSync(new URL('../../../../test/fixtures/sp3/orbit-d-p.sp3', import.meta.url), 'utf8');
const PV_TEXT = readFileSync(new URL('../../../../test/fixtures/sp3/orbit-c-pv.sp3', import.meta.url), 'utf8');

/** Elements of the two-body orbits in orbit-d-p.sp3 (test/fixtures/sp3/SOURCE.md). */
const ORBITS: Record<string, { a: number; e: number; m0: number }> = {
  G30: { a: 26_561_750, e: 0.02, m0: -0.3 },
  G31: { a: 26_561_750, e: 0.005, m0: 2.0 },
};
/** −2 r·v/c² = −2√(GM a) e sin E / c² (IERS Conventions 2010 eq. 10.10 [V1]) for the fixture orbits at t seconds after 00:00. */
function analytic(sat: string, t: number): number {
  const { a, e, m0 } = ORBITS[sat]!;
  const E = solveKepler(m0 + Math.sqrt(GPS_ICD.gm / a ** 3) * t, e);
  return (-2 * Math.sqrt(GPS_ICD.gm * a) * e * Math.sin(E)) / SPEED_OF_LIGHT ** 2;
}

function runAll(
  epochs: readonly Sp3Epoch[],
  options: ConstructorParameters<typeof PreciseCorrectionStream>[0],
): PreciseCorrectionResult[] {
  const stream = new PreciseCorrectionStream(options);
  const out: PreciseCorrectionResult[] = [];
  for (const e of epochs) out.push(...stream.push(e));
  out.push(...stream.finish());
  return out;
}

describe('lagrangeDerivativeAtNode, lagrangeInterpolate (Berrut & Trefethen 2004 barycentric form [M])', () => {
  it('lagrangeDerivativeAtNode(times, values, i) is exact for a polynomial of degree n − 1 on uneven nodes', () => {
    const times = [-1800, -900, 0, 600, 900, 2700];
    const poly = (t: number) => 3 + 2e-3 * t - 4e-7 * t ** 2 + 1e-10 * t ** 3 - 2e-14 * t ** 4 + 5e-18 * t ** 5;
    const dpoly = (t: number) => 2e-3 - 8e-7 * t + 3e-10 * t ** 2 - 8e-14 * t ** 3 + 25e-18 * t ** 4;
    times.forEach((t, i) => expect(lagrangeDerivativeAtNode(times, times.map(poly), i)).toBeCloseTo(dpoly(t), 12));
    expect(lagrangeInterpolate(times, times.map(poly), 123.4)).toBeCloseTo(poly(123.4), 10);
    expect(lagrangeInterpolate(times, times.map(poly), 600)).toBe(poly(600));
  });
  it('lagrangeDerivativeAtNode(sin samples) approaches the cosine at the centre node (9 points, h = 900 s, 12-h period)', () => {
    const w = (2 * Math.PI) / 43200;
    const times = Array.from({ length: 9 }, (_, k) => (k - 4) * 900);
    expect(
      Math.abs(
        lagrangeDerivativeAtNode(
          times,
          times.map((t) => Math.sin(w * t + 0.3)),
          4,
        ) -
          w * Math.cos(0.3),
      ),
    ).toBeLessThan(1e-9 * w);
  });
  it('lagrangeDerivativeAtNode / lagrangeInterpolate reject repeated or non-finite nodes, mismatched lengths and a bad index', () => {
    expect(() => lagrangeDerivativeAtNode([0, 0, 1], [1, 2, 3], 0)).toThrow(/distinct node abscissae/);
    expect(() => lagrangeDerivativeAtNode([0, Number.NaN], [1, 2], 0)).toThrow(InvalidArgumentError);
    expect(() => lagrangeDerivativeAtNode([0, 1], [1], 0)).toThrow(InvalidArgumentError);
    expect(() => lagrangeDerivativeAtNode([0], [1], 0)).toThrow(InvalidArgumentError);
    expect(() => lagrangeDerivativeAtNode([0, 1], [1, 2], 2)).toThrow(/index/);
    expect(() => lagrangeInterpolate([], [], 0)).toThrow(InvalidArgumentError);
    expect(() => lagrangeInterpolate([0, 1], [1, 2], Number.NaN)).toThrow(
      /t must be in \[-1000000000000, 1000000000000\] s; received NaN/,
    );
  });
});

describe('PreciseCorrectionStream: SP3 positions only (Lagrange velocities) against the two-body value −2√(GM a) e sin E/c² [C]', () => {
  const file = parseSp3(P_TEXT);
  const t0 = file.epochs[0]!.epoch;
  const results = runAll(file.epochs, { epochInterval: file.header.epochInterval });

  const errors = (res: PreciseCorrectionResult[]) => {
    const centred: number[] = [];
    const ends: number[] = [];
    for (const r of res) {
      if (r.kind !== 'sample') continue;
      const k = r.sample.epoch.secondsSince(t0) / 900;
      const err = Math.abs(
        r.sample.relativisticSeconds - analytic(r.sample.satellite, r.sample.epoch.secondsSince(t0)),
      );
      // Centred: G30 epochs with 4 valid positions on each side (G31 has a hole at k = 6).
      (r.sample.satellite === 'G30' && k >= 4 && k <= 8 ? centred : ends).push(err);
    }
    return { centred: Math.max(...centred), ends: Math.max(...ends, ...centred) };
  };

  it('PreciseCorrectionStream(9-point Lagrange) matches the analytic value within 5e-15 s with a centred window and 5e-13 s anywhere, file ends and data holes included (positions rounded to 1 mm)', () => {
    const samples = results.filter((r) => r.kind === 'sample').map((r) => r.sample);
    expect(samples.filter((s) => s.satellite === 'G30')).toHaveLength(13);
    expect(samples.every((s) => s.velocitySource === 'lagrange')).toBe(true);
    const { centred, ends } = errors(results);
    expect(centred).toBeLessThan(5e-15);
    expect(ends).toBeLessThan(5e-13);
  });
  it('PreciseCorrectionStream(...) gives, to ≤ 1e-18 s (in fact the same double), what lagrangeDerivativeAtNode per coordinate gives on the same 9-node window (one weight row shared by x, y, z)', () => {
    // Independent route: the public one-coordinate derivative, called separately for x, y and z as the stream once did.
    let compared = 0;
    for (const r of results) {
      if (r.kind !== 'sample' || r.sample.satellite !== 'G30') continue;
      const k = Math.round(r.sample.epoch.secondsSince(t0) / 900);
      if (k < 4 || k > 8) continue; // centred windows: nodes k − 4 .. k + 4, all valid for G30
      const window = file.epochs.slice(k - 4, k + 5);
      const times = window.map((e) => e.epoch.secondsSince(r.sample.epoch));
      const pos = window.map((e) => e.records.find((x) => x.satellite === 'G30')!.position!);
      const velocity = [0, 1, 2].map((c) =>
        lagrangeDerivativeAtNode(
          times,
          pos.map((p) => p[c]!),
          4,
        ),
      ) as [number, number, number];
      const expected = periodicCorrectionFromState({ position: pos[4]!, velocity });
      expect(Math.abs(r.sample.relativisticSeconds - expected)).toBeLessThanOrEqual(1e-18);
      expect(r.sample.relativisticSeconds).toBe(expected);
      compared++;
    }
    expect(compared).toBe(5);
  });

  it('PreciseCorrectionStream(...) reports the bad-value position of G31 at 01:30 as a gap, and still serves its neighbours', () => {
    const gaps = results.filter((r) => r.kind === 'gap').map((r) => r.gap);
    expect(gaps).toHaveLength(1);
    expect(gaps[0]).toMatchObject({ satellite: 'G31' });
    expect(gaps[0]!.epoch.secondsSince(t0)).toBe(5400);
    expect(gaps[0]!.reason).toMatch(/bad\/absent marker/);
    expect(results.filter((r) => r.kind === 'sample' && r.sample.satellite === 'G31')).toHaveLength(12);
  });
  it("PreciseCorrectionStream(...) emits each satellite's results in time order", () => {
    for (const sat of ['G30', 'G31']) {
      const times = results
        .map((r) => (r.kind === 'sample' ? r.sample : r.gap))
        .filter((x) => x.satellite === sat)
        .map((x) => x.epoch.secondsSince(t0));
      expect(times).toEqual([...times].sort((a, b) => a - b));
      expect(times).toHaveLength(13);
    }
  });
  it('PreciseCorrectionStream(lagrangePoints 5) is coarser (≤ 3e-11 s centred, ≤ 3e-10 s anywhere); fewer epochs than points give gaps with a reason', () => {
    const { centred, ends } = errors(runAll(file.epochs, { epochInterval: 900, lagrangePoints: 5 }));
    expect(centred).toBeLessThan(3e-11);
    expect(ends).toBeLessThan(3e-10);
    const short = runAll(file.epochs.slice(0, 4), { epochInterval: 900 });
    expect(short.every((r) => r.kind === 'gap')).toBe(true);
    expect(short[0]!.kind === 'gap' && short[0]!.gap.reason).toMatch(/too few valid positions.*9-point Lagrange/);
  });
  it('PreciseCorrectionStream(...) refuses a window that spans a long data gap', () => {
    const holed = file.epochs.map((e, k) =>
      k >= 3 && k <= 8 ? { ...e, records: e.records.filter((r) => r.satellite !== 'G30') } : e,
    );
    const res = runAll(holed, { epochInterval: 900, satellites: new Set(['G30']) });
    const gaps = res.filter((r) => r.kind === 'gap').map((r) => r.gap.reason);
    expect(gaps.filter((g) => /no record at this epoch/.test(g))).toHaveLength(6);
    expect(gaps.filter((g) => /too few valid positions/.test(g)).length).toBeGreaterThan(0);
  });
  it('preciseRelativisticCorrections(readSp3(chunks)) streams the same results as the synchronous stream', async () => {
    const epochs = (async function* () {
      for await (const ev of readSp3(P_TEXT)) if (ev.kind === 'epoch') yield ev.epoch;
    })();
    const streamed: PreciseCorrectionResult[] = [];
    for await (const r of preciseRelativisticCorrections(epochs, { epochInterval: 900 })) streamed.push(r);
    expect(streamed).toEqual(results);
  });
  it('PreciseCorrectionStream(options) rejects a non-positive interval and a point count outside 2..16', () => {
    expect(() => new PreciseCorrectionStream({ epochInterval: 0 })).toThrow(/epochInterval/);
    expect(() => new PreciseCorrectionStream({ epochInterval: 900, lagrangePoints: 17 })).toThrow(/lagrangePoints/);
    expect(() => new PreciseCorrectionStream({ epochInterval: 900, lagrangePoints: 1.5 })).toThrow(
      InvalidArgumentError,
    );
  });
});

describe('PreciseCorrectionStream: SP3 with velocity records', () => {
  const file = parseSp3(PV_TEXT);
  it('PreciseCorrectionStream(...) uses the file velocities, and Lagrange velocities agree with them (4 epochs: all 4 nodes)', () => {
    const fromFile = runAll(file.epochs, { epochInterval: 900 })
      .filter((r) => r.kind === 'sample')
      .map((r) => r.sample);
    expect(fromFile.every((s) => s.velocitySource === 'file')).toBe(true);
    expect(fromFile).toHaveLength(11);
    const interp = runAll(file.epochs, { epochInterval: 900, lagrangePoints: 4, alwaysInterpolate: true });
    const gaps = interp.filter((r) => r.kind === 'gap').map((r) => `${r.gap.satellite} ${r.gap.reason}`);
    // E11 has 3 valid positions only (00:30 is the bad-value marker): no 4-point window.
    expect(gaps.filter((g) => g.startsWith('E11 too few'))).toHaveLength(3);
    for (const r of interp) {
      if (r.kind !== 'sample') continue;
      const ref = fromFile.find((s) => s.satellite === r.sample.satellite && s.epoch.equals(r.sample.epoch))!;
      // 4 nodes over 45 min, one-sided at every epoch: a coarse cubic, agreement within 0.3 ns only.
      expect(Math.abs(r.sample.relativisticSeconds - ref.relativisticSeconds)).toBeLessThan(3e-10);
    }
  });
  it('PreciseCorrectionStream(...) treats a position inside the Earth as a gap, never as a correction', () => {
    const bad = file.epochs.map((e, k) =>
      k === 0
        ? {
            ...e,
            records: e.records.map((r) => (r.satellite === 'G05' ? { ...r, position: [6000, 0, 0] as const } : r)),
          }
        : e,
    );
    const res = runAll(bad, { epochInterval: 900, satellites: new Set(['G05']) });
    expect(res[0]).toMatchObject({
      kind: 'gap',
      gap: { satellite: 'G05', reason: expect.stringMatching(/inside the Earth/) },
    });
  });
  it('PreciseCorrectionStream(...) on shuffled satellite order and random filters never throws and yields one result per satellite and epoch', () => {
    fc.assert(
      fc.property(fc.subarray(['G05', 'E11', 'C08']), (sats) => {
        const res = runAll(file.epochs, { epochInterval: 900, satellites: new Set(sats) });
        expect(res).toHaveLength(sats.length * 4);
      }),
      { seed: 20261202, numRuns: 20 },
    );
  });
});
