import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { characterizeClock, clockMeasurementNoise, correctPhaseJumps, simulateClock } from '@tauline/sdk/clock-model';
import { InvalidArgumentError } from '@tauline/sdk/errors';
import { Instant } from '@tauline/sdk/time';
import { describe, expect, it } from 'vitest';
import { EPOCH } from './test-epoch.js';

const ROOT = fileURLToPath(new URL('../../../..', import.meta.url));

/** The invented VESTRA-4 record: two columns, time (s) and phase (s), every 300 s. */
function vestra4(): { t: Float64Array; phase: Float64Array } {
  const rows = readFileSync(join(ROOT, 'packages/sdk/examples/clock/vestra-4-rafs.txt'), 'utf8')
    .split('\n')
    .filter((l) => /^\s*\d/.test(l))
    .map((l) => l.trim().split(/\s+/).map(Number));
  return {
    t: Float64Array.from(rows, (r) => r[0] ?? Number.NaN),
    phase: Float64Array.from(rows, (r) => r[1] ?? Number.NaN),
  };
}

// Generator values of the example (packages/sdk/examples/clock/SOURCE.md): the truth the characterisation must recover.
const TRUTH = { af0: 1.5e-7, af1: 3.2e-11, af2: 5e-19, q1: 1e-23, q2: 1e-31, jumpEpoch: 750_000, jumpSize: 2e-9 };

describe('characterizeClock', () => {
  it('characterizeClock(record) recovers the generator af0/af1/af2 within 2σ, the +2 ns jump at t = 750 000 s, and q1, q2 inside their intervals (SOURCE.md generator values; Zucca & Tavella 2005 model [M])', () => {
    const { t, phase } = vestra4();
    const r = characterizeClock({ epoch: EPOCH, phase, t, tau0: 300 }, { predict: [1_296_000] });
    const [af0, af1, af2] = r.polynomial.coefficients;
    const [s0, s1, s2] = r.polynomialNoise.std;
    expect(Math.abs(af0 - TRUTH.af0)).toBeLessThan(2 * (s0 ?? 0));
    expect(Math.abs(af1 - TRUTH.af1)).toBeLessThan(2 * (s1 ?? 0));
    expect(Math.abs(af2 - TRUTH.af2)).toBeLessThan(2 * (s2 ?? 0));
    expect(r.passes.map((p) => p.jumps.length)).toEqual([1, 0]);
    const jump = r.passes[0]?.jumps[0];
    expect(jump).toMatchObject({ kind: 'phase', epoch: TRUTH.jumpEpoch, updateIndex: 2500 });
    expect(Math.abs((jump?.size ?? 0) - TRUTH.jumpSize)).toBeLessThan(2 * (jump?.sizeStd ?? 0));
    for (const n of ['q1', 'q2'] as const) {
      expect(r.noise.intervals[n]?.low).toBeLessThanOrEqual(TRUTH[n]);
      expect(r.noise.intervals[n]?.high).toBeGreaterThanOrEqual(TRUTH[n]);
    }
    expect(r.referenceTime).toBe(0);
    expect(r.samplesUsed).toBe(4032);
    expect(r.measurementNoise.source).toBe('estimated');
    expect(r.polynomialNoise.predictStd).toHaveLength(1);
  });

  it('characterizeClock(record) returns the same numbers for another epoch Instant and carries its epoch', () => {
    const { t, phase } = vestra4();
    const epoch = Instant.fromTaiParts(855_000_037, 0.25);
    const options = { degree: 1 as const, measurementSigma: 3e-11 };
    const other = characterizeClock({ epoch: EPOCH, phase, t, tau0: 300 }, options);
    const withEpoch = characterizeClock({ phase, t, tau0: 300, epoch }, options);
    expect(withEpoch.epoch).toBe(epoch);
    expect(other.epoch).toBe(EPOCH);
    expect(withEpoch.polynomial.coefficients).toEqual(other.polynomial.coefficients);
    expect(withEpoch.noise.q).toEqual(other.noise.q);
    expect(withEpoch.passes).toEqual(other.passes);
  });

  it('characterizeClock(simulated record with a frequency jump) declares it, corrects it and ends after a pass with no event', () => {
    // Seeded simulation (seed 7): a fractional-frequency step of 5e-13 at sample 1200 of 2400 (τ0 = 60 s).
    const sim = simulateClock({
      samples: 2400,
      tau0: 60,
      q: { q1: 1e-24, q2: 1e-33 },
      seed: 7,
      measurementNoise: 1e-11,
      jumps: [{ index: 1200, kind: 'frequency', size: 5e-13 }],
    });
    const t = Float64Array.from(sim.phase, (_v, k) => k * 60);
    const passes: number[] = [];
    const r = characterizeClock({ epoch: EPOCH, phase: sim.phase, t, tau0: 60 }, { onPass: (p) => passes.push(p) });
    const declared = r.passes[0]?.jumps.find((j) => j.kind === 'frequency');
    expect(declared).toBeDefined();
    expect(Math.abs((declared?.size ?? 0) - 5e-13)).toBeLessThan(3 * (declared?.sizeStd ?? 0));
    expect(r.passes.at(-1)?.jumps).toEqual([]);
    expect(passes).toEqual(r.passes.map((p) => p.pass));
  });

  it('characterizeClock(record, { maxPasses: 1 }) stops after one pass even when it declared events', () => {
    const { t, phase } = vestra4();
    const r = characterizeClock({ epoch: EPOCH, phase, t, tau0: 300 }, { maxPasses: 1 });
    expect(r.passes).toHaveLength(1);
    expect(r.passes[0]?.jumps).toHaveLength(1);
  });

  it('characterizeClock refuses a bad record or option naming the field', () => {
    const { t, phase } = vestra4();
    expect(() => characterizeClock({ epoch: EPOCH, phase, t: t.subarray(1), tau0: 300 })).toThrow(/record\.t/);
    expect(() => characterizeClock({ epoch: EPOCH, phase, t, tau0: 0 })).toThrow(/record\.tau0/);
    expect(() => characterizeClock({ epoch: EPOCH, phase, t, tau0: 300 }, { predict: [1000] })).toThrow(/predict\[0\]/);
    expect(() => characterizeClock({ epoch: EPOCH, phase, t, tau0: 300 }, { maxPasses: 0 })).toThrow(
      /options\.maxPasses/,
    );
    // A sample that is not a number reached the polynomial fit's Float64Array as a TypeError before it was checked.
    const damaged = [...phase] as unknown[];
    damaged[7] = {};
    expect(() =>
      characterizeClock({ epoch: EPOCH, phase: damaged as number[], t, tau0: 300 }, { measurementSigma: 3e-11 }),
    ).toThrow(/record\.phase\[7\]/);
    expect(() => characterizeClock({ phase, t, tau0: 300, epoch: 5 as unknown as Instant })).toThrow(
      InvalidArgumentError,
    );
  });
});

describe('correctPhaseJumps', () => {
  it('correctPhaseJumps({ epoch, t, phase }, { jumps, rejected }) subtracts a phase step from its sample on and a frequency step as ν·(t − θ), and blanks rejected samples (hand computation [C])', () => {
    const phase = [0, 0, 0, 0, 0];
    const t = [0, 10, 20, 30, 40];
    const jumps = [
      {
        kind: 'phase' as const,
        size: 2,
        updateIndex: 1,
        epoch: 10,
        declaredAtUpdate: 3,
        sizeStd: 0.1,
        statistic: 50,
        threshold: 30,
      },
      {
        kind: 'frequency' as const,
        size: 0.5,
        updateIndex: 3,
        epoch: 25,
        declaredAtUpdate: 4,
        sizeStd: 0.1,
        statistic: 50,
        threshold: 30,
      },
    ];
    const out = correctPhaseJumps({ epoch: EPOCH, t, phase }, { jumps, rejected: [2] });
    // k = 3: −2 − 0.5·(30 − 25) = −4.5; k = 4: −2 − 0.5·(40 − 25) = −9.5.
    expect(Array.from(out.phase)).toEqual([0, -2, Number.NaN, -4.5, -9.5]);
    expect(Array.from(out.t)).toEqual(t);
    expect(out.epoch).toBe(EPOCH);
    expect(phase).toEqual([0, 0, 0, 0, 0]);
  });

  it('correctPhaseJumps refuses a series without its epoch, and a jump or rejected index outside the record', () => {
    const jump = {
      kind: 'phase' as const,
      size: 1,
      updateIndex: 9,
      epoch: 0,
      declaredAtUpdate: 9,
      sizeStd: 0,
      statistic: 0,
      threshold: 30,
    };
    const series = { epoch: EPOCH, t: [0, 1], phase: [0, 0] };
    expect(() => correctPhaseJumps(series, { jumps: [jump], rejected: [] })).toThrow(/events\.jumps\[0\]\.updateIndex/);
    expect(() => correctPhaseJumps(series, { jumps: [], rejected: [2] })).toThrow(/events\.rejected\[0\]/);
    expect(() => correctPhaseJumps({ t: [0, 1], phase: [0, 0] } as never, { jumps: [], rejected: [] })).toThrow(
      /series\.epoch.*parseIso/s,
    );
    expect(() => correctPhaseJumps({ ...series, t: [0] }, { jumps: [], rejected: [] })).toThrow(/series\.t/);
  });
});

describe('clockMeasurementNoise', () => {
  it('clockMeasurementNoise(σ, estimate) uses σ², a resolved estimate, or 0 for the fit and the 2σ upper bound for the filter', () => {
    expect(clockMeasurementNoise(2e-11, undefined)).toMatchObject({
      varianceInNoiseFit: 2e-11 ** 2,
      filterVariance: 2e-11 ** 2,
      source: 'given',
    });
    const resolved = { variance: 9e-22, standardError: 1e-22, resolved: true, terms: 100 };
    expect(clockMeasurementNoise(undefined, resolved)).toMatchObject({
      varianceInNoiseFit: 9e-22,
      varianceInNoiseFitStd: 1e-22,
      filterVariance: 9e-22,
    });
    const unresolved = { variance: -1e-22, standardError: 3e-22, resolved: false, terms: 100 };
    const u = clockMeasurementNoise(undefined, unresolved);
    expect(u.varianceInNoiseFit).toBe(0);
    expect(u.filterVariance).toBeCloseTo(6e-22, 35);
    expect(u.source).toMatch(/^unresolved/);
  });
});
