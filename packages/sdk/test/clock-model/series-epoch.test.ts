import { runClockFilter, simulateClock } from '@tauline/sdk/clock-model';
import { InvalidArgumentError } from '@tauline/sdk/errors';
import { BUNDLED_LEAP_SECONDS, createTimeScales, type Instant } from '@tauline/sdk/time';
import { describe, expect, it } from 'vitest';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const Q = { q1: 1e-23, q2: 1e-31 };

describe('runClockFilter with a series epoch', () => {
  // Seeded simulation (seed 11): 600 samples every 300 s with a 2 ns phase jump at sample 400.
  const sim = simulateClock({
    samples: 600,
    tau0: 300,
    q: Q,
    seed: 11,
    measurementNoise: 3e-11,
    jumps: [{ index: 400, kind: 'phase', size: 2e-9 }],
  });
  const epoch = ts.parseIso('2027-02-08T06:00:00', 'GPS');

  it('runClockFilter({ epoch: Instant, tau0 }) returns the same estimates and jumps as without an epoch, and the epoch itself', () => {
    const plain = runClockFilter({ phase: sim.phase, tau0: 300, variance: 9e-22 }, { q: Q, states: 2 });
    const withEpoch = runClockFilter({ phase: sim.phase, tau0: 300, variance: 9e-22, epoch }, { q: Q, states: 2 });
    expect(withEpoch.epoch).toBe(epoch);
    expect(plain.epoch).toBeUndefined();
    expect(Array.from(withEpoch.phase)).toEqual(Array.from(plain.phase));
    expect(Array.from(withEpoch.t)).toEqual(Array.from(plain.t));
    expect(withEpoch.jumps).toEqual(plain.jumps);
  });

  it('epoch.plus(jump.epoch) reads 2027-02-08T06:00:00 GPS + 400 × 300 s = 2027-02-09T15:20:00 GPS for the jump at sample 400 (hand computation [C])', () => {
    const run = runClockFilter({ phase: sim.phase, tau0: 300, variance: 9e-22, epoch }, { q: Q, states: 2 });
    const jump = run.jumps.find((j) => j.kind === 'phase');
    expect(jump?.updateIndex).toBe(400);
    expect(run.epoch).toBe(epoch);
    expect(ts.formatIso(epoch.plus(jump?.epoch ?? Number.NaN), { scale: 'GPS', fractionDigits: 0 })).toBe(
      '2027-02-09T15:20:00',
    );
  });

  it('runClockFilter refuses an epoch that is not an Instant, naming series.epoch', () => {
    expect(() =>
      runClockFilter({ phase: sim.phase, tau0: 300, variance: 9e-22, epoch: 0 as unknown as Instant }, { q: Q }),
    ).toThrow(InvalidArgumentError);
    expect(() =>
      runClockFilter({ phase: sim.phase, tau0: 300, variance: 9e-22, epoch: 0 as unknown as Instant }, { q: Q }),
    ).toThrow(/series\.epoch/);
  });
});
