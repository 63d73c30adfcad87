import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { quadraticFormEdf } from '../../src/stability/edf.js';
import {
  analyzeStability,
  chiSquareInterval,
  deviations,
  equivalentDegreesOfFreedom,
  factorsForTaus,
  frequencyFromPhase,
  identifyNoise,
  overlappingAllanEdf,
  phaseFromFrequency,
  type StatisticName,
  toPhaseSeries,
} from '../../src/stability/index.js';

/** Tiny seeded generator for tests: 32-bit LCG (Numerical Recipes constants) + Box–Muller; common practice, no source needed for correctness. */
function gaussian(seed: number): () => number {
  let s = seed >>> 0;
  const u = () => {
    s = (Math.imul(1664525, s) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

/** Brute-force statistics straight from the NIST SP 1065 §5.2 definitions, over complete terms (independent of the kernels). */
function bruteForce(stat: StatisticName, x: number[], m: number, tau0: number): { dev: number; n: number } {
  const N = x.length;
  const tau = m * tau0;
  let sum = 0;
  let n = 0;
  const add = (v: number) => {
    if (Number.isFinite(v)) {
      sum += v * v;
      n++;
    }
  };
  if (stat === 'adev' || stat === 'oadev') {
    const step = stat === 'adev' ? m : 1;
    for (let i = 0; i + 2 * m < N; i += step) add(x[i + 2 * m]! - 2 * x[i + m]! + x[i]!);
    return { dev: Math.sqrt(sum / (2 * tau * tau * n)), n };
  }
  if (stat === 'hdev' || stat === 'ohdev') {
    const step = stat === 'hdev' ? m : 1;
    for (let i = 0; i + 3 * m < N; i += step) add(x[i + 3 * m]! - 3 * x[i + 2 * m]! + 3 * x[i + m]! - x[i]!);
    return { dev: Math.sqrt(sum / (6 * tau * tau * n)), n };
  }
  for (let j = 0; j + 3 * m - 1 < N; j++) {
    let inner = 0;
    for (let i = j; i < j + m; i++) inner += x[i + 2 * m]! - 2 * x[i + m]! + x[i]!;
    add(inner);
  }
  const mdev = Math.sqrt(sum / (2 * m * m * tau * tau * n));
  return { dev: stat === 'tdev' ? (tau / Math.sqrt(3)) * mdev : mdev, n };
}

describe('phase ↔ frequency conversion', () => {
  it('phaseFromFrequency(y, τ0) integrates x_{i+1} = x_i + y_i τ0 from x_0 = 0 (NIST SP 1065 §4 [M])', () => {
    const s = phaseFromFrequency([1e-9, 2e-9, -1e-9], 10);
    [0, 1e-8, 3e-8, 2e-8].forEach((v, i) => expect(s.phase[i]).toBeCloseTo(v, 22));
    expect(s.segmentStarts).toEqual([]);
  });
  it('phaseFromFrequency(y, τ0) turns a missing y_i into a segment break at i + 1, never into a zero or an interpolated value', () => {
    const s = phaseFromFrequency([1, Number.NaN, 2, 3], 1);
    expect(s.segmentStarts).toEqual([2]);
    const back = frequencyFromPhase(s);
    expect(Number.isNaN(back[1]!)).toBe(true);
    expect([back[0], back[2], back[3]]).toEqual([1, 2, 3]);
  });
  it('frequencyFromPhase(x, τ0) gives two missing frequency values around one missing phase point', () => {
    const y = frequencyFromPhase([0, 1, Number.NaN, 3, 4], 1);
    expect(y.length).toBe(4);
    expect([Number.isNaN(y[0]!), Number.isNaN(y[1]!), Number.isNaN(y[2]!), Number.isNaN(y[3]!)]).toEqual([
      false,
      true,
      true,
      false,
    ]);
  });
  it('frequencyFromPhase(x) rejects a missing tau0 and ±Infinity samples', () => {
    expect(() => frequencyFromPhase([0, 1])).toThrow(InvalidArgumentError);
    expect(() => frequencyFromPhase([0, Infinity], 1)).toThrow(InvalidArgumentError);
    expect(() => phaseFromFrequency([1, 2], 0)).toThrow(InvalidArgumentError);
    expect(() => phaseFromFrequency('12' as unknown as number[], 1)).toThrow(InvalidArgumentError);
    expect(() => phaseFromFrequency(['1'] as unknown as number[], 1)).toThrow(InvalidArgumentError);
  });
  it('toPhaseSeries(data) requires exactly one of phase or frequency and a positive tau0', () => {
    expect(() => toPhaseSeries({ phase: [1, 2], frequency: [1], tau0: 1 } as never)).toThrow(InvalidArgumentError);
    expect(() => toPhaseSeries({ tau0: 1 } as never)).toThrow(InvalidArgumentError);
    expect(() => toPhaseSeries(null as never)).toThrow(InvalidArgumentError);
    expect(() => toPhaseSeries({ phase: [1, 2], tau0: -1 })).toThrow(InvalidArgumentError);
  });
});

describe('averaging times', () => {
  it('factorsForTaus(taus, τ0) maps whole multiples to m and rejects τ that is not m·τ0', () => {
    expect(factorsForTaus([30, 10, 10, 60], 10)).toEqual([1, 3, 6]);
    expect(() => factorsForTaus([15], 10)).toThrow(/whole multiple/);
    expect(() => factorsForTaus([5], 10)).toThrow(InvalidArgumentError);
    expect(() => factorsForTaus([-10], 10)).toThrow(InvalidArgumentError);
    expect(() => factorsForTaus('10' as never, 10)).toThrow(InvalidArgumentError);
  });
  it('deviations(stat, data) defaults to octave τ and drops τ without a term (oadev on 10 points: m = 1, 2, 4)', () => {
    const x = [0, 1, 3, 2, 5, 4, 7, 6, 9, 8];
    expect(deviations('oadev', { phase: x, tau0: 2 }).map((p) => p.tau)).toEqual([2, 4, 8]);
    expect(deviations('mdev', { phase: x, tau0: 2 }).map((p) => p.m)).toEqual([1, 2]);
    expect(deviations('ohdev', { phase: x, tau0: 2 }).map((p) => p.m)).toEqual([1, 2]);
    expect(deviations('oadev', { phase: x, tau0: 2 }, { taus: [2, 100] }).map((p) => p.m)).toEqual([1]);
  });
  it('deviations(stat, data) rejects an unknown statistic name', () => {
    expect(() => deviations('xdev' as StatisticName, { phase: [1, 2, 3], tau0: 1 })).toThrow(InvalidArgumentError);
  });
});

describe('gaps', () => {
  const rnd = gaussian(7);
  const x: number[] = [];
  let acc = 0;
  for (let i = 0; i < 400; i++) {
    acc += rnd();
    x.push(acc + rnd());
  }
  for (const k of [17, 18, 100, 251]) x[k] = Number.NaN;
  for (const stat of ['adev', 'oadev', 'mdev', 'tdev', 'hdev', 'ohdev'] as StatisticName[]) {
    it(`deviations('${stat}', phase with NaN samples) uses complete terms only and matches a brute-force sum over them`, () => {
      const points = deviations(stat, { phase: x, tau0: 1 }, { taus: [1, 2, 3, 8, 16] });
      for (const p of points) {
        const ref = bruteForce(stat, x, p.m, 1);
        expect(p.n).toBe(ref.n);
        expect(Math.abs(p.deviation - ref.dev) / ref.dev).toBeLessThan(1e-12);
      }
      // Fewer terms than the gap-free count: the reduced n is reported.
      const full = bruteForce(
        stat,
        x.map((v) => (Number.isNaN(v) ? 0 : v)),
        1,
        1,
      );
      expect(points[0]!.n).toBeLessThan(full.n);
    });
  }
  it('deviations(oadev, frequency with a missing value) excludes every term spanning it (checked against frequency-domain averages)', () => {
    const rnd2 = gaussian(11);
    const y = Array.from({ length: 200 }, () => rnd2());
    y[50] = Number.NaN;
    for (const m of [1, 4, 10]) {
      const [p] = deviations('oadev', { frequency: y, tau0: 1 }, { taus: [m] });
      // σ² = ½⟨(ȳ_{k+m} − ȳ_k)²⟩ over windows of 2m frequency values that are all present.
      let sum = 0;
      let n = 0;
      for (let i = 0; i + 2 * m <= y.length; i++) {
        const win = y.slice(i, i + 2 * m);
        if (win.some(Number.isNaN)) continue;
        const a = win.slice(0, m).reduce((s, v) => s + v, 0) / m;
        const b = win.slice(m).reduce((s, v) => s + v, 0) / m;
        sum += (b - a) ** 2;
        n++;
      }
      expect(p!.n).toBe(n);
      expect(p!.deviation).toBeCloseTo(Math.sqrt(sum / (2 * n)), 12);
    }
  });
  it('deviations(totdev, data with gaps) rejects the input instead of reflecting across a gap', () => {
    expect(() => deviations('totdev', { phase: x, tau0: 1 })).toThrow(/gap-free/);
    expect(() =>
      analyzeStability({ frequency: [1, Number.NaN, 2, 3, 4], tau0: 1 }, { statistics: ['totdev'] }),
    ).toThrow(InvalidArgumentError);
  });
  it('analyzeStability(data with gaps) counts the missing samples in its input summary', () => {
    const a = analyzeStability({ phase: x, tau0: 1 });
    expect(a.input.missing).toBe(4);
    expect(a.input.samples).toBe(400);
  });
});

describe('numerical robustness', () => {
  it('deviations(mdev, phase with a large frequency offset and drift) matches the O(N·m) definition to 1e-9 (prefix sums of second differences)', () => {
    const rnd = gaussian(3);
    const x = Array.from({ length: 20000 }, (_, i) => 1e-3 * i + 1e-9 * i * i + 1e-12 * rnd());
    for (const p of deviations('mdev', { phase: x, tau0: 1 }, { taus: [1, 16, 256, 2048] })) {
      const ref = bruteForce('mdev', x, p.m, 1);
      expect(Math.abs(p.deviation - ref.dev) / ref.dev).toBeLessThan(1e-9);
    }
  });
});

describe('equivalent degrees of freedom and intervals', () => {
  it('overlappingAllanEdf(WFM, 1001, 10) = 146.177 and (WFM, 1001, 1) = 665.780 (Howe–Allan–Barnes [M], values [C])', () => {
    expect(overlappingAllanEdf('WFM', 1001, 10)).toBeCloseTo(146.177, 3);
    expect(overlappingAllanEdf('WFM', 1001, 1)).toBeCloseTo(665.78, 2);
  });
  it('overlappingAllanEdf covers every noise type with a positive edf and rejects bad input', () => {
    for (const noise of ['WPM', 'FPM', 'WFM', 'FFM', 'RWFM'] as const) {
      for (const m of [1, 2, 10, 100, 500]) expect(overlappingAllanEdf(noise, 1001, m)).toBeGreaterThan(0);
    }
    expect(() => overlappingAllanEdf('XX' as never, 1001, 1)).toThrow(InvalidArgumentError);
    expect(() => overlappingAllanEdf('WFM', 1001, 501)).toThrow(InvalidArgumentError);
  });
  it('quadraticFormEdf for overlapping ADEV of WFM at m = 1 equals the closed form 4n²/(6n − 2) (terms y_{i+1} − y_i, ρ(1) = −½) [C]', () => {
    const n = 999;
    expect(quadraticFormEdf('WFM', [0, 1, 2], [1, -2, 1], 1, n)).toBeCloseTo((4 * n * n) / (6 * n - 2), 9);
  });
  it('quadraticFormEdf for overlapping ADEV, N = 1001, agrees with the Monte-Carlo edf of the reference sheet §10 within 5 % [C]', () => {
    // Reference sheet §10: MC (4000 trials) WFM m = 1/10/100 → 660.8/143.1/12.9; WPM 503/514/455; RWFM 999.7/91.9/8.0.
    const cases: ['WFM' | 'WPM' | 'RWFM', number, number][] = [
      ['WFM', 1, 660.8],
      ['WFM', 10, 143.1],
      ['WFM', 100, 12.9],
      ['WPM', 1, 503],
      ['WPM', 10, 514],
      ['WPM', 100, 455],
      ['RWFM', 1, 999.7],
      ['RWFM', 10, 91.9],
      ['RWFM', 100, 8.0],
    ];
    for (const [noise, m, mc] of cases) {
      const edf = quadraticFormEdf(noise, [0, m, 2 * m], [1, -2, 1], 1, 1001 - 2 * m);
      expect(Math.abs(edf - mc) / mc).toBeLessThan(0.05);
    }
  });
  it('equivalentDegreesOfFreedom names its model per statistic and grows with the number of terms', () => {
    expect(equivalentDegreesOfFreedom('oadev', 'WFM', 1001, 10, 981).model).toBe('howe-allan-barnes');
    for (const s of ['adev', 'mdev', 'tdev', 'hdev', 'ohdev'] as const) {
      const small = equivalentDegreesOfFreedom(s, 'FFM', 1001, 4, 100);
      const large = equivalentDegreesOfFreedom(s, 'FFM', 1001, 4, 900);
      expect(small.model).toBe('gaussian-quadratic-form');
      expect(large.edf).toBeGreaterThan(small.edf);
    }
    expect(equivalentDegreesOfFreedom('totdev', 'WFM', 1001, 10, 999)).toEqual({ edf: 150, model: 'totvar-b-c' });
    expect(equivalentDegreesOfFreedom('totdev', 'WPM', 1001, 10, 999).model).toBe('howe-allan-barnes');
    expect(equivalentDegreesOfFreedom('mdev', 'FPM', 100001, 1000, 97000).edf).toBeGreaterThan(0);
    expect(() => equivalentDegreesOfFreedom('xdev' as never, 'WFM', 100, 1, 10)).toThrow(InvalidArgumentError);
    expect(() => equivalentDegreesOfFreedom('adev', 'WFM', 100, 1, 0)).toThrow(InvalidArgumentError);
  });
  it('chiSquareInterval(s, edf, confidence) brackets s and rejects bad arguments', () => {
    const { low, high } = chiSquareInterval(1e-12, 20, 0.95);
    expect(low).toBeLessThan(1e-12);
    expect(high).toBeGreaterThan(1e-12);
    expect(() => chiSquareInterval(1, 0, 0.9)).toThrow(InvalidArgumentError);
    expect(() => chiSquareInterval(-1, 5, 0.9)).toThrow(InvalidArgumentError);
    expect(() => chiSquareInterval(1, 5, 1)).toThrow(InvalidArgumentError);
    expect(() => chiSquareInterval(1, 5, 0)).toThrow(InvalidArgumentError);
  });
});

describe('noise identification (lag-1 autocorrelation, Riley & Greenhall 2004 [M])', () => {
  const N = 4096;
  const rnd = gaussian(20261202);
  const white = Array.from({ length: N }, () => rnd());
  const walk: number[] = [];
  const walk2: number[] = [];
  let a = 0;
  let b = 0;
  for (const w of white) {
    a += w;
    b += a;
    walk.push(a);
    walk2.push(b);
  }
  it('identifyNoise(white phase) reports WPM (α = 2) at short and long τ', () => {
    const est = identifyNoise({ phase: white, tau0: 1 }, { taus: [1, 16] });
    expect(est.map((e) => e.noise)).toEqual(['WPM', 'WPM']);
  });
  it('identifyNoise(random-walk phase) reports WFM (α = 0)', () => {
    expect(identifyNoise({ phase: walk, tau0: 1 }, { taus: [1, 8] }).map((e) => e.alpha)).toEqual([0, 0]);
  });
  it('identifyNoise(integrated random-walk phase) reports RWFM (α = −2)', () => {
    expect(identifyNoise({ phase: walk2, tau0: 1 }, { taus: [1, 8] }).map((e) => e.noise)).toEqual(['RWFM', 'RWFM']);
  });
  it('identifyNoise(data) omits τ with fewer than 32 decimated points', () => {
    expect(identifyNoise({ phase: white.slice(0, 100), tau0: 1 }).map((e) => e.m)).toEqual([1, 2]);
  });
  it('analyzeStability(data) labels the noise source per τ: identified, carried-from-shorter-tau, stated, default-wfm', () => {
    const a = analyzeStability({ phase: walk.slice(0, 200), tau0: 1 });
    expect(a.rows[0]!.noiseSource).toBe('identified');
    expect(a.rows.at(-1)!.noiseSource).toBe('carried-from-shorter-tau');
    expect(analyzeStability({ phase: walk.slice(0, 20), tau0: 1 }).rows[0]!.noiseSource).toBe('default-wfm');
    expect(analyzeStability({ phase: walk.slice(0, 20), tau0: 1 }, { noise: 'RWFM' }).rows[0]!.noiseSource).toBe(
      'stated',
    );
  });
});

describe('analyzeStability options', () => {
  const x = Array.from({ length: 64 }, (_, i) => Math.sin(i) * 1e-9);
  it('analyzeStability(data, { taus }) lists τ with no term in droppedTaus', () => {
    const a = analyzeStability({ phase: x, tau0: 1 }, { taus: [1, 40] });
    expect(a.rows.map((r) => r.tau)).toEqual([1]);
    expect(a.droppedTaus).toEqual([40]);
    expect(a.rows[0]!.statistics.oadev!.low).toBeLessThan(a.rows[0]!.statistics.oadev!.deviation);
  });
  it('analyzeStability rejects an empty or unknown statistics list, a bad confidence and an unknown noise type', () => {
    expect(() => analyzeStability({ phase: x, tau0: 1 }, { statistics: [] })).toThrow(InvalidArgumentError);
    expect(() => analyzeStability({ phase: x, tau0: 1 }, { statistics: ['foo' as never] })).toThrow(
      InvalidArgumentError,
    );
    expect(() => analyzeStability({ phase: x, tau0: 1 }, { confidence: 1.5 })).toThrow(InvalidArgumentError);
    expect(() => analyzeStability({ phase: x, tau0: 1 }, { confidence: 0 })).toThrow(InvalidArgumentError);
    expect(() => analyzeStability({ phase: x, tau0: 1 }, { noise: 'PINK' as never })).toThrow(InvalidArgumentError);
  });
});
