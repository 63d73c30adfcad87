import { characterizeClock, fitClockPolynomial, runClockFilter, simulateClock } from '@tauline/sdk/clock-model';
import { InvalidArgumentError } from '@tauline/sdk/errors';
import { BUNDLED_LEAP_SECONDS, createTimeScales, type Instant } from '@tauline/sdk/time';
import { describe, expect, it } from 'vitest';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
const Q = { q1: 1e-23, q2: 1e-31 };

describe('runClockFilter, characterizeClock and fitClockPolynomial with their required series epoch', () => {
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

  it('runClockFilter({ epoch: Instant, tau0 }) returns the epoch itself and the same estimates for another epoch (the numerics use only the seconds)', () => {
    const later = ts.parseIso('2031-07-01T00:00:00', 'GPS');
    const a = runClockFilter({ phase: sim.phase, tau0: 300, variance: 9e-22, epoch }, { q: Q, states: 2 });
    const b = runClockFilter({ phase: sim.phase, tau0: 300, variance: 9e-22, epoch: later }, { q: Q, states: 2 });
    expect(a.epoch).toBe(epoch);
    expect(b.epoch).toBe(later);
    expect(Array.from(b.phase)).toEqual(Array.from(a.phase));
    expect(Array.from(b.t)).toEqual(Array.from(a.t));
    expect(b.jumps).toEqual(a.jumps);
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

  it('runClockFilter refuses a series without an epoch, naming series.epoch with a parseIso hint', () => {
    const bare = { phase: sim.phase, tau0: 300, variance: 9e-22 } as unknown as Parameters<typeof runClockFilter>[0];
    expect(() => runClockFilter(bare, { q: Q })).toThrow(InvalidArgumentError);
    expect(() => runClockFilter(bare, { q: Q })).toThrow(
      /series\.epoch.*required.*parseIso\('2027-02-08T06:00:00', 'GPS'\)/,
    );
  });

  it('characterizeClock refuses a record without an epoch, naming record.epoch', () => {
    const t = Float64Array.from(sim.phase, (_, k) => k * 300);
    const bare = { phase: sim.phase, t, tau0: 300 } as unknown as Parameters<typeof characterizeClock>[0];
    expect(() => characterizeClock(bare)).toThrow(InvalidArgumentError);
    expect(() => characterizeClock(bare)).toThrow(/record\.epoch.*required/);
  });

  it('characterizeClock returns the epoch and the reference epoch t_oc = epoch + referenceTime as an Instant (hand computation [C]: 2027-02-08T06:00:00 GPS + 86 400 s)', () => {
    const t = Float64Array.from(sim.phase, (_, k) => k * 300);
    const r = characterizeClock({ epoch, phase: sim.phase, t, tau0: 300 }, { referenceTime: 86_400, maxPasses: 1 });
    expect(r.epoch).toBe(epoch);
    expect(r.referenceTime).toBe(86_400);
    expect(ts.formatIso(r.referenceEpoch, { scale: 'GPS', fractionDigits: 0 })).toBe('2027-02-09T06:00:00');
  });

  it('fitClockPolynomial refuses a series without an epoch, naming series.epoch', () => {
    const bare = { t: [0, 1, 2, 3], phase: [0, 1e-9, 2e-9, 4e-9] } as unknown as Parameters<
      typeof fitClockPolynomial
    >[0];
    expect(() => fitClockPolynomial(bare)).toThrow(InvalidArgumentError);
    expect(() => fitClockPolynomial(bare)).toThrow(/series\.epoch.*required/);
  });

  it('fitClockPolynomial returns the epoch and t_oc as an Instant: 2027-02-08T06:00:00 GPS + 3600 s = 07:00:00 (hand computation [C])', () => {
    const fit = fitClockPolynomial(
      { epoch, t: [0, 1800, 3600, 5400], phase: [0, 1e-9, 2e-9, 4e-9] },
      { referenceTime: 3600 },
    );
    expect(fit.epoch).toBe(epoch);
    expect(fit.referenceTime).toBe(3600);
    expect(ts.formatIso(fit.referenceEpoch, { scale: 'GPS', fractionDigits: 0 })).toBe('2027-02-08T07:00:00');
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
