import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  allanVarianceFromQ,
  clockProcessNoise,
  clockTransitionMatrix,
  diffusionFromStabilitySpec,
  fitDiffusion,
  hadamardVarianceFromQ,
  hFromQ,
  qFromH,
} from '../../src/clock-model/index.js';
import { cholesky } from '../../src/clock-model/linalg.js';
import { InvalidArgumentError } from '../../src/errors.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
const Q = { q1: 1e-22, q2: 1e-28, q3: 1e-36 };

describe('clockTransitionMatrix', () => {
  it('clockTransitionMatrix(τ, 3) is [[1, τ, τ²/2], [0, 1, τ], [0, 0, 1]] (Zucca & Tavella 2005 [M]; physics-refs §11)', () => {
    expect(clockTransitionMatrix(10, 3)).toEqual([
      [1, 10, 50],
      [0, 1, 10],
      [0, 0, 1],
    ]);
    expect(clockTransitionMatrix(10, 2)).toEqual([
      [1, 10],
      [0, 1],
    ]);
    expect(clockTransitionMatrix(0, 3)).toEqual([
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
    ]);
  });
  it('clockTransitionMatrix(τ, states) rejects negative τ, NaN and states other than 2 or 3', () => {
    expect(() => clockTransitionMatrix(-1, 3)).toThrow(InvalidArgumentError);
    expect(() => clockTransitionMatrix(Number.NaN, 3)).toThrow(InvalidArgumentError);
    expect(() => clockTransitionMatrix(1, 4 as 3)).toThrow(InvalidArgumentError);
  });
});

describe('clockProcessNoise', () => {
  it('clockProcessNoise(τ, q, 3) has the Zucca & Tavella entries, e.g. Q11 = q1τ + q2τ³/3 + q3τ⁵/20 (physics-refs §11 [M])', () => {
    const tau = 100;
    const m = clockProcessNoise(tau, Q, 3);
    expect(rel(m[0]![0]!, 1e-22 * tau + (1e-28 * tau ** 3) / 3 + (1e-36 * tau ** 5) / 20)).toBeLessThan(1e-15);
    expect(rel(m[0]![1]!, (1e-28 * tau ** 2) / 2 + (1e-36 * tau ** 4) / 8)).toBeLessThan(1e-15);
    expect(rel(m[0]![2]!, (1e-36 * tau ** 3) / 6)).toBeLessThan(1e-15);
    expect(rel(m[1]![1]!, 1e-28 * tau + (1e-36 * tau ** 3) / 3)).toBeLessThan(1e-15);
    expect(rel(m[1]![2]!, (1e-36 * tau ** 2) / 2)).toBeLessThan(1e-15);
    expect(rel(m[2]![2]!, 1e-36 * tau)).toBeLessThan(1e-15);
    expect(m[1]![0]).toBe(m[0]![1]);
    expect(m[2]![0]).toBe(m[0]![2]);
    expect(m[2]![1]).toBe(m[1]![2]);
  });
  it('clockProcessNoise(τ, q, 3) equals the integral ∫₀^τ Φ(s) diag(q1, q2, q3) Φ(s)ᵀ ds by Simpson quadrature (independent computation [C])', () => {
    const tau = 37;
    const n = 2000;
    const acc = [
      [0, 0, 0],
      [0, 0, 0],
      [0, 0, 0],
    ];
    for (let k = 0; k <= n; k++) {
      const s = (tau * k) / n;
      const w = (k === 0 || k === n ? 1 : k % 2 === 1 ? 4 : 2) * (tau / n / 3);
      const phi = clockTransitionMatrix(s, 3);
      const qd = [Q.q1, Q.q2, Q.q3];
      for (let i = 0; i < 3; i++)
        for (let j = 0; j < 3; j++) {
          let v = 0;
          for (let c = 0; c < 3; c++) v += phi[i]![c]! * qd[c]! * phi[j]![c]!;
          acc[i]![j]! += w * v;
        }
    }
    const m = clockProcessNoise(tau, Q, 3);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(rel(m[i]![j]!, acc[i]![j]!)).toBeLessThan(1e-10);
  });
  it('clockProcessNoise(τ, q, 2) is the upper-left 2×2 block with q3 = 0', () => {
    const m2 = clockProcessNoise(10, { q1: 1e-22, q2: 1e-28 }, 2);
    const m3 = clockProcessNoise(10, { q1: 1e-22, q2: 1e-28, q3: 0 }, 3);
    expect(m2).toEqual([
      [m3[0]![0], m3[0]![1]],
      [m3[1]![0], m3[1]![1]],
    ]);
  });
  it('clockProcessNoise(τ, q, states) is symmetric positive-definite for τ > 0 and q > 0 (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1e6, noNaN: true }),
        fc.double({ min: -30, max: -18, noNaN: true }),
        fc.double({ min: -36, max: -26, noNaN: true }),
        fc.double({ min: -44, max: -34, noNaN: true }),
        (tau, l1, l2, l3) => {
          const m = clockProcessNoise(tau, { q1: 10 ** l1, q2: 10 ** l2, q3: 10 ** l3 }, 3);
          // Scale to unit diagonal so the Cholesky test is about shape, not magnitude.
          const d = m.map((r, i) => Math.sqrt(r[i]!));
          const c = m.map((r, i) => r.map((v, j) => v / (d[i]! * d[j]!)));
          return c[0]![1] === c[1]![0] && c[0]![2] === c[2]![0] && c[1]![2] === c[2]![1] && cholesky(c) !== undefined;
        },
      ),
      { seed: 20261202, numRuns: 200 },
    );
  });
  it('clockProcessNoise(τ, q, states) rejects negative τ, negative or missing q, and q3 > 0 with 2 states', () => {
    expect(() => clockProcessNoise(-1, Q, 3)).toThrow(InvalidArgumentError);
    expect(() => clockProcessNoise(1, { q1: -1, q2: 0 }, 3)).toThrow(InvalidArgumentError);
    expect(() => clockProcessNoise(1, { q1: 0 } as never, 3)).toThrow(InvalidArgumentError);
    expect(() => clockProcessNoise(1, null as never, 3)).toThrow(InvalidArgumentError);
    expect(() => clockProcessNoise(1, { q1: 0, q2: 0, q3: Number.NaN }, 3)).toThrow(InvalidArgumentError);
    expect(() => clockProcessNoise(1, Q, 2)).toThrow(/use states = 3/);
    expect(() => clockProcessNoise(1, Q, 1 as 2)).toThrow(InvalidArgumentError);
  });
});

describe('q ↔ h ↔ variance relations', () => {
  it('qFromH({h0: 2e-24}) gives q1 = 1e-24 s, the physics-refs §11 check for σ_y = 1e-12 τ^−½ [C]', () => {
    expect(qFromH({ h0: 2e-24, hMinus2: 0 }).q1).toBeCloseTo(1e-24, 36);
    expect(allanVarianceFromQ(1, { q1: 1e-24, q2: 0 })).toBeCloseTo(1e-24, 36);
  });
  it('qFromH({hMinus2: 1.759e-34}) gives q2 = 3.472e-33 1/s, and σ_y(1 d) = 1e-14 RWFM gives the same (physics-refs §11 [C])', () => {
    expect(rel(qFromH({ h0: 0, hMinus2: 1.759e-34 }).q2, 3.472e-33)).toBeLessThan(2e-4);
    const q = diffusionFromStabilitySpec({ randomWalkFrequency: { tau: 86400, deviation: 1e-14 } });
    expect(rel(q.q2, 3.472e-33)).toBeLessThan(1e-4);
    expect(rel(hFromQ(q).hMinus2, 1.759e-34)).toBeLessThan(2e-4);
  });
  it('allanVarianceFromQ from qFromH reproduces the IEEE 1139 power-law forms h0/(2τ) and (2π²/3)h₋₂τ (physics-refs §10 [M])', () => {
    const h = { h0: 3e-24, hMinus2: 2e-34 };
    const tau = 500;
    expect(
      rel(allanVarianceFromQ(tau, qFromH(h)), h.h0 / (2 * tau) + ((2 * Math.PI ** 2) / 3) * h.hMinus2 * tau),
    ).toBeLessThan(1e-14);
  });
  it('hFromQ(qFromH(h)) returns h (round trip)', () => {
    const h = { h0: 3e-24, hMinus2: 2e-34, hMinus4: 5e-40 };
    const back = hFromQ(qFromH(h));
    expect(rel(back.h0, h.h0)).toBeLessThan(1e-15);
    expect(rel(back.hMinus2, h.hMinus2)).toBeLessThan(1e-15);
    expect(rel(back.hMinus4, h.hMinus4)).toBeLessThan(1e-15);
  });
  it('hadamardVarianceFromQ(τ, q) is q1/τ + q2τ/6 + 11q3τ³/120 (Zucca & Tavella 2005 [M]; physics-refs §11)', () => {
    expect(rel(hadamardVarianceFromQ(10, Q), 1e-22 / 10 + (1e-28 * 10) / 6 + (11 * 1e-36 * 1000) / 120)).toBeLessThan(
      1e-15,
    );
  });
  it('allanVarianceFromQ(τ, q) refuses q3 > 0 (non-stationary) and bad τ; qFromH, hFromQ, hadamardVarianceFromQ reject bad input', () => {
    expect(() => allanVarianceFromQ(10, Q)).toThrow(/hadamardVarianceFromQ/);
    expect(() => allanVarianceFromQ(0, { q1: 1, q2: 1 })).toThrow(InvalidArgumentError);
    expect(() => hadamardVarianceFromQ(-1, Q)).toThrow(InvalidArgumentError);
    expect(() => qFromH(null as never)).toThrow(InvalidArgumentError);
    expect(() => qFromH({ h0: -1, hMinus2: 0 })).toThrow(InvalidArgumentError);
    expect(() => qFromH({ h0: 1, hMinus2: Number.NaN })).toThrow(InvalidArgumentError);
    expect(() => qFromH({ h0: 1, hMinus2: 0, hMinus4: -1 })).toThrow(InvalidArgumentError);
    expect(() => hFromQ({ q1: 1, q2: -1 })).toThrow(InvalidArgumentError);
  });
  it('diffusionFromStabilitySpec(spec) inverts each single-noise variance form and rejects empty or bad specs', () => {
    const q = diffusionFromStabilitySpec({
      whiteFrequency: { tau: 1, deviation: 1e-12 },
      randomWalkDrift: { tau: 1e4, deviation: 1e-15 },
    });
    expect(rel(q.q1, 1e-24)).toBeLessThan(1e-15);
    expect(q.q2).toBe(0);
    expect(rel(hadamardVarianceFromQ(1e4, { q1: 0, q2: 0, q3: q.q3 }), 1e-30)).toBeLessThan(1e-14);
    expect(() => diffusionFromStabilitySpec({})).toThrow(InvalidArgumentError);
    expect(() => diffusionFromStabilitySpec(null as never)).toThrow(InvalidArgumentError);
    expect(() => diffusionFromStabilitySpec({ whiteFrequency: 3 as never })).toThrow(InvalidArgumentError);
    expect(() => diffusionFromStabilitySpec({ whiteFrequency: { tau: 0, deviation: 1e-12 } })).toThrow(
      InvalidArgumentError,
    );
    expect(() => diffusionFromStabilitySpec({ randomWalkFrequency: { tau: 1, deviation: -1 } })).toThrow(
      InvalidArgumentError,
    );
  });
});

describe('fitDiffusion', () => {
  const taus = [1, 2, 5, 10, 20, 50, 100, 200, 500, 1000, 2000, 5000, 1e4];
  it('fitDiffusion(points) recovers q1, q2, q3 exactly from noise-free Hadamard deviations', () => {
    const points = taus.map((tau) => ({
      tau,
      deviation: Math.sqrt(hadamardVarianceFromQ(tau, Q)),
      kind: 'hadamard' as const,
      edf: 50,
    }));
    const fit = fitDiffusion(points);
    expect(fit.states).toBe(3);
    expect(rel(fit.q.q1, Q.q1)).toBeLessThan(1e-9);
    expect(rel(fit.q.q2, Q.q2)).toBeLessThan(1e-9);
    expect(rel(fit.q.q3, Q.q3)).toBeLessThan(1e-9);
    expect(fit.chiSquare).toBeLessThan(1e-12);
    expect(fit.covarianceScaled).toBe(false);
    expect(fit.dof).toBe(taus.length - 3);
    expect(fit.covariance[0]![0]).toBeGreaterThan(0);
  });
  it('fitDiffusion(points) recovers q1, q2 from noise-free Allan deviations (2-state by default)', () => {
    const q = { q1: 1e-24, q2: 3.472e-33 };
    const fit = fitDiffusion(
      taus.map((tau) => ({ tau, deviation: Math.sqrt(allanVarianceFromQ(tau, q)), kind: 'allan' as const })),
    );
    expect(fit.states).toBe(2);
    expect(rel(fit.q.q1, q.q1)).toBeLessThan(1e-9);
    expect(rel(fit.q.q2, q.q2)).toBeLessThan(1e-9);
    expect(fit.q.q3).toBe(0);
    expect(fit.covarianceScaled).toBe(true);
  });
  it('fitDiffusion(points) holds a coefficient at zero instead of returning a negative value', () => {
    // Pure WFM with a slight downward bend at long τ: unconstrained least squares would give q2 < 0.
    const points = taus.map((tau) => ({
      tau,
      deviation: Math.sqrt(1e-22 / tau) * (tau > 1000 ? 0.8 : 1),
      kind: 'allan' as const,
    }));
    const fit = fitDiffusion(points);
    expect(fit.q.q2).toBe(0);
    expect(fit.atZero).toEqual(['q2']);
    expect(fit.q.q1).toBeGreaterThan(0);
  });
  it('fitDiffusion(points, options) rejects empty lists, too few points, bad fields and Allan points in a 3-state fit', () => {
    expect(() => fitDiffusion([])).toThrow(InvalidArgumentError);
    expect(() => fitDiffusion(null as never)).toThrow(InvalidArgumentError);
    expect(() => fitDiffusion([{ tau: 1, deviation: 1e-12, kind: 'hadamard' }])).toThrow(/at least 3 points/);
    expect(() => fitDiffusion([null as never, null as never])).toThrow(InvalidArgumentError);
    const good = { tau: 1, deviation: 1e-12, kind: 'allan' as const };
    expect(() => fitDiffusion([good, { ...good, tau: -1 }])).toThrow(InvalidArgumentError);
    expect(() => fitDiffusion([good, { ...good, deviation: 0 }])).toThrow(InvalidArgumentError);
    expect(() => fitDiffusion([good, { ...good, kind: 'modified' as never }])).toThrow(InvalidArgumentError);
    expect(() => fitDiffusion([good, { ...good, edf: -2 }])).toThrow(InvalidArgumentError);
    expect(() => fitDiffusion([good, good, good], { states: 3 })).toThrow(/not stationary/);
    expect(() => fitDiffusion([good, good], { states: 5 as 2 })).toThrow(InvalidArgumentError);
  });
});
