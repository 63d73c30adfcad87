import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { createRandomStream, fmix32, streamState } from '../../src/internal/random.js';
import { combineMonteCarloParts, planSteering, simulatePlan, simulatePlanRuns } from '../../src/steering/index.js';
import { example } from './helpers.js';

describe('simulatePlanRuns and combineMonteCarloParts (runs split into ranges)', () => {
  it("combineMonteCarloParts(simulatePlanRuns ranges) gives exactly simulatePlan's summary, whatever the split and the order of the parts", () => {
    const s = example('orin-3-meo');
    const plan = planSteering(s);
    const whole = simulatePlan(s, plan, { runs: 120, seed: 9 });
    for (const cuts of [
      [0, 120],
      [0, 1, 120],
      [0, 37, 50, 119, 120],
      [0, 40, 80, 120],
    ]) {
      const parts = cuts
        .slice(1)
        .map((end, i) => simulatePlanRuns(s, plan, { seed: 9, firstRun: cuts[i]!, runCount: end - cuts[i]! }));
      expect(combineMonteCarloParts(parts), `cuts ${cuts.join(',')}`).toEqual(whole);
      expect(combineMonteCarloParts([...parts].reverse())).toEqual(whole);
    }
  });

  it('simulatePlanRuns(range) gives per-run results that depend only on (seed, run index)', () => {
    const s = example('orin-3-meo');
    const plan = planSteering(s, { strategy: 'deadband' });
    const all = simulatePlanRuns(s, plan, { seed: 4, firstRun: 0, runCount: 30 });
    const tail = simulatePlanRuns(s, plan, { seed: 4, firstRun: 17, runCount: 13 });
    expect(Array.from(tail.worstByRunSeconds)).toEqual(Array.from(all.worstByRunSeconds.subarray(17)));
    expect(Array.from(tail.alwaysInsideByRun)).toEqual(Array.from(all.alwaysInsideByRun.subarray(17)));
    const other = simulatePlanRuns(s, plan, { seed: 5, firstRun: 17, runCount: 13 });
    expect(Array.from(other.worstByRunSeconds)).not.toEqual(Array.from(tail.worstByRunSeconds));
  });

  it('combineMonteCarloParts(parts) refuses a gap, an overlap, mixed seeds and no parts with an InvalidArgumentError naming the part', () => {
    const s = example('orin-3-meo');
    const plan = planSteering(s);
    const a = simulatePlanRuns(s, plan, { seed: 2, firstRun: 0, runCount: 5 });
    const gap = simulatePlanRuns(s, plan, { seed: 2, firstRun: 6, runCount: 5 });
    const overlap = simulatePlanRuns(s, plan, { seed: 2, firstRun: 4, runCount: 5 });
    const seed3 = simulatePlanRuns(s, plan, { seed: 3, firstRun: 5, runCount: 5 });
    expect(() => combineMonteCarloParts([a, gap])).toThrow(/parts\[1\]\.firstRun/);
    expect(() => combineMonteCarloParts([a, overlap])).toThrow(/parts\[1\]\.firstRun/);
    expect(() => combineMonteCarloParts([a, seed3])).toThrow(/parts\[1\]/);
    expect(() => combineMonteCarloParts([])).toThrow(InvalidArgumentError);
    expect(() => simulatePlanRuns(s, plan, { seed: 2, firstRun: 999_999, runCount: 2 })).toThrow(/options\.runCount/);
  });
});

describe('streamState(seed, index) (per-run random streams)', () => {
  it('fmix32(z) matches MurmurHash3 fmix32 values computed independently in Python ([C], python3 integer arithmetic)', () => {
    // python3: def f(z): z^=z>>16; z=z*0x85ebca6b&0xffffffff; z^=z>>13; z=z*0xc2b2ae35&0xffffffff; return z^(z>>16)
    expect(fmix32(0)).toBe(0);
    expect(fmix32(1)).toBe(0x514e28b7);
    expect(fmix32(0xffffffff)).toBe(0x81f16f39);
  });

  it("streamState(seed, index) gives 200 000 distinct states for one seed, and the streams' first normals are N(0, 1) and uncorrelated from run to run", () => {
    const out = new Uint32Array(4);
    const seen = new Set<string>();
    for (let i = 0; i < 200_000; i++) {
      streamState(7, i, out);
      seen.add(`${out[0]},${out[1]},${out[2]},${out[3]}`);
    }
    expect(seen.size).toBe(200_000);
    // Moments of 100 000 first draws (one per stream): standard errors of mean, variance and lag-1
    // correlation are 1/√n, √(2/n), 1/√n = 0.0032, 0.0045, 0.0032 (normal theory); 5 standard errors.
    const n = 100_000;
    const z = new Float64Array(n);
    for (let i = 0; i < n; i++) z[i] = createRandomStream(7, i).normal();
    let m = 0;
    for (const v of z) m += v / n;
    let v2 = 0;
    let c1 = 0;
    for (let i = 0; i < n; i++) {
      v2 += (z[i]! - m) ** 2 / n;
      if (i > 0) c1 += ((z[i]! - m) * (z[i - 1]! - m)) / (n - 1);
    }
    expect(Math.abs(m)).toBeLessThan(5 * 0.0032);
    expect(Math.abs(v2 - 1)).toBeLessThan(5 * 0.0045);
    expect(Math.abs(c1 / v2)).toBeLessThan(5 * 0.0032);
  });
});
