import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  analyzeStability,
  deviations,
  frequencyFromPhase,
  phaseFromFrequency,
  type StatisticName,
} from '../../src/stability/index.js';

const SETTINGS = { seed: 20261202, numRuns: 60 };
const series = fc
  .array(fc.double({ min: -1e-6, max: 1e-6, noNaN: true }), { minLength: 24, maxLength: 120 })
  .filter((a) => new Set(a).size > 4);
const STATS: StatisticName[] = ['adev', 'oadev', 'mdev', 'tdev', 'hdev', 'ohdev', 'totdev'];

function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);
}

describe('stability invariants (fast-check, seed 20261202)', () => {
  it('deviations(stat, { frequency: k·y }) = |k|·deviations(stat, { frequency: y }) for every statistic (σ is linear in the data, SP 1065 §5.2)', () => {
    fc.assert(
      fc.property(series, fc.double({ min: 0.01, max: 100, noNaN: true }), (y, k) => {
        for (const s of STATS) {
          const a = deviations(s, { frequency: y, tau0: 1 });
          const b = deviations(s, { frequency: y.map((v) => -k * v), tau0: 1 });
          a.forEach((p, i) => expect(rel(b[i]!.deviation, k * p.deviation)).toBeLessThan(1e-9));
        }
      }),
      SETTINGS,
    );
  });
  it('deviations(stat, { phase: x + a + b·t }) = deviations(stat, { phase: x }): a phase offset and a constant frequency offset leave every statistic unchanged', () => {
    fc.assert(
      fc.property(
        series,
        fc.double({ min: -1e-3, max: 1e-3, noNaN: true }),
        fc.double({ min: -1e-9, max: 1e-9, noNaN: true }),
        (x, a, b) => {
          const shifted = x.map((v, i) => v + a + b * i * 10);
          for (const s of STATS) {
            const p = deviations(s, { phase: x, tau0: 10 });
            const q = deviations(s, { phase: shifted, tau0: 10 });
            // Absolute tolerance: rounding of the added offset (1e-3 · 2^-52 per sample).
            p.forEach((pt, i) =>
              expect(Math.abs(q[i]!.deviation - pt.deviation)).toBeLessThan(
                1e-16 * 1e3 * (s === 'tdev' ? pt.tau : 1) + 1e-9 * pt.deviation,
              ),
            );
          }
        },
      ),
      SETTINGS,
    );
  });
  it('deviations(hdev|ohdev, { phase: x + c·t² }) = deviations(hdev|ohdev, { phase: x }): Hadamard statistics ignore linear frequency drift', () => {
    fc.assert(
      fc.property(series, fc.double({ min: -1e-12, max: 1e-12, noNaN: true }), (x, c) => {
        for (const s of ['hdev', 'ohdev'] as const) {
          const p = deviations(s, { phase: x, tau0: 1 });
          const q = deviations(s, { phase: x.map((v, i) => v + c * i * i), tau0: 1 });
          p.forEach((pt, i) =>
            expect(Math.abs(q[i]!.deviation - pt.deviation)).toBeLessThan(1e-12 + 1e-8 * pt.deviation),
          );
        }
      }),
      SETTINGS,
    );
  });
  it('frequencyFromPhase(phaseFromFrequency(y)) returns y, gaps included (round trip)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.double({ min: -1, max: 1, noNaN: true }), fc.constant(Number.NaN)), {
          minLength: 1,
          maxLength: 50,
        }),
        (y) => {
          const back = frequencyFromPhase(phaseFromFrequency(y, 2));
          y.forEach((v, i) =>
            Number.isNaN(v) ? expect(Number.isNaN(back[i]!)).toBe(true) : expect(back[i]!).toBeCloseTo(v, 9),
          );
        },
      ),
      SETTINGS,
    );
  });
  it('deviations(stat, phase) equals deviations(stat, frequency) for the same record', () => {
    fc.assert(
      fc.property(series, (y) => {
        const x = phaseFromFrequency(y, 1).phase;
        for (const s of STATS) {
          const a = deviations(s, { frequency: y, tau0: 1 });
          const b = deviations(s, { phase: x, tau0: 1 });
          a.forEach((p, i) => expect(rel(b[i]!.deviation, p.deviation)).toBeLessThan(1e-9));
        }
      }),
      SETTINGS,
    );
  });
});

describe('white phase noise (seeded simulation)', () => {
  it('analyzeStability(white PM) gives OADEV ∝ τ⁻¹: the theoretical √3·σ_x/τ lies inside the 95 % interval at every octave', () => {
    // WPM: σ_y²(τ) = 3σ_x²/τ² for overlapping Allan (x white with variance σ_x²): σ_y(τ) = √3·σ_x/τ (common practice, SP 1065 Table 7 [M]).
    let s = 12345;
    const u = () => ((s = (Math.imul(1664525, s) + 1013904223) >>> 0) + 0.5) / 4294967296;
    const sigmaX = 1e-9;
    const x = Array.from({ length: 8192 }, () => sigmaX * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u()));
    const a = analyzeStability(
      { phase: x, tau0: 1 },
      { statistics: ['oadev'], confidence: 0.95, taus: [1, 2, 4, 8, 16, 32, 64, 128] },
    );
    for (const row of a.rows) {
      const est = row.statistics.oadev!;
      const theory = (Math.sqrt(3) * sigmaX) / row.tau;
      expect(row.noise).toBe('WPM');
      expect(est.low).toBeLessThan(theory);
      expect(est.high).toBeGreaterThan(theory);
    }
  });
});
