import { describe, expect, it } from 'vitest';
import { simulateClock } from '../../src/clock-model/index.js';
import { InvalidArgumentError } from '../../src/errors.js';

describe('simulateClock', () => {
  it('simulateClock with q = 0 follows the deterministic polynomial x0 + y0·t + d·t²/2 exactly (physics-refs §11 model)', () => {
    const s = simulateClock({
      samples: 5,
      tau0: 10,
      q: { q1: 0, q2: 0, q3: 0 },
      seed: 1,
      initial: { phase: 1e-9, frequency: 1e-12, drift: 1e-18 },
    });
    for (let k = 0; k < 5; k++) {
      const t = 10 * k;
      // Agreement to rounding (the simulator accumulates the steps; relative 1e-14).
      expect(Math.abs(s.truePhase[k]! / (1e-9 + 1e-12 * t + (1e-18 * t * t) / 2) - 1)).toBeLessThan(1e-14);
      expect(Math.abs(s.frequency[k]! / (1e-12 + 1e-18 * t) - 1)).toBeLessThan(1e-14);
      expect(s.drift[k]).toBe(1e-18);
    }
    expect(s.phase).toEqual(s.truePhase);
  });
  it('simulateClock is reproducible from its seed and changes with it', () => {
    const o = { samples: 50, tau0: 1, q: { q1: 1e-22, q2: 1e-28, q3: 1e-36 }, measurementNoise: 1e-10 };
    expect(simulateClock({ ...o, seed: 9 }).phase).toEqual(simulateClock({ ...o, seed: 9 }).phase);
    expect(simulateClock({ ...o, seed: 9 }).phase).not.toEqual(simulateClock({ ...o, seed: 10 }).phase);
  });
  it('simulateClock injects phase and frequency jumps at the given index', () => {
    const s = simulateClock({
      samples: 6,
      tau0: 2,
      q: { q1: 0, q2: 0 },
      seed: 1,
      jumps: [
        { index: 2, kind: 'phase', size: 5e-9 },
        { index: 3, kind: 'frequency', size: 1e-10 },
      ],
    });
    expect(Array.from(s.truePhase)).toEqual([0, 0, 5e-9, 5e-9, 5e-9 + 2e-10, 5e-9 + 4e-10]);
    expect(s.frequency[2]).toBe(0);
    expect(s.frequency[3]).toBe(1e-10);
  });
  it('simulateClock white phase noise has the requested standard deviation (sample variance within its 99.9 % χ² range, N = 20 000)', () => {
    const s = simulateClock({ samples: 20000, tau0: 1, q: { q1: 0, q2: 0 }, seed: 3, measurementNoise: 2e-10 });
    let sum = 0;
    for (let k = 0; k < 20000; k++) sum += (s.phase[k]! - s.truePhase[k]!) ** 2;
    const ratio = sum / 20000 / 4e-20;
    // χ²(20000)/20000 99.9 % range ≈ [0.9675, 1.0332] (normal approximation, 3.29·√(2/N)).
    expect(ratio).toBeGreaterThan(0.9671);
    expect(ratio).toBeLessThan(1.0329);
  });
  it('simulateClock(options) rejects bad options', () => {
    const o = { samples: 10, tau0: 1, q: { q1: 1e-22, q2: 0 }, seed: 1 };
    expect(() => simulateClock(null as never)).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, samples: 1 })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, tau0: 0 })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, q: { q1: -1, q2: 0 } })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, seed: 1.5 })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, measurementNoise: -1 })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, initial: { phase: Number.NaN } })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, initial: { frequency: Infinity } })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, initial: { drift: Number.NaN } })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, jumps: [null as never] })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, jumps: [{ index: 0, kind: 'phase', size: 1 }] })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, jumps: [{ index: 10, kind: 'phase', size: 1 }] })).toThrow(InvalidArgumentError);
    expect(() => simulateClock({ ...o, jumps: [{ index: 2, kind: 'phase', size: Number.NaN }] })).toThrow(
      InvalidArgumentError,
    );
    expect(() => simulateClock({ ...o, jumps: [{ index: 2, kind: 'drift' as never, size: 1 }] })).toThrow(
      InvalidArgumentError,
    );
  });
});
