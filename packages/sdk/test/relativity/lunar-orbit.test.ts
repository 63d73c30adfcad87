import { describe, expect, it } from 'vitest';
import { OutOfDomainError } from '../../src/errors.js';
import type { StateVector } from '../../src/orbit/elements.js';
import { moonPositionLowPrecision } from '../../src/orbit/ephemeris.js';
import { GM_MOON } from '../../src/orbit/forces.js';
import { integrateProperTime } from '../../src/relativity/proper-time.js';
import { lunarClockRate, MOON_MEAN_RADIUS } from '../../src/relativity/reference-clocks.js';
import { instantFromTtSecondsSinceJ2000 } from '../../src/time/j2000.js';

// Lunar GM 4.902800066e12 m³/s² (JPL DE-series value, also IERS Conventions 2010 Table 1.1 via GM_E/(M_M/M_E) [M]);
// mean lunar radius 1737.4 km (IAU WGCCRE report [M]). Both from memory; the checks below do not depend on their last digits.

/** Geocentric state (mean equator and equinox of date) of a polar lunar orbiter at `altitude` above the mean radius, speed `speed` relative to the Moon. */
function lunarOrbiter(epoch: number, altitude: number, speed: number): StateVector {
  const at = instantFromTtSecondsSinceJ2000(epoch);
  const m = moonPositionLowPrecision(at);
  const mp = moonPositionLowPrecision(at.plus(1));
  const mm = moonPositionLowPrecision(at.plus(-1));
  const vm = [0, 1, 2].map((k) => (mp[k]! - mm[k]!) / 2);
  return {
    position: [m[0], m[1], m[2] + MOON_MEAN_RADIUS + altitude],
    velocity: [vm[0]! + speed, vm[1]!, vm[2]!],
  };
}
const EPOCH_J2000 = 0;
/** 2023-01-01 00:00 TT, seconds since J2000.0 (2000-01-01T12:00 TT + 8400.5 d). */
const EPOCH_2023 = 725_803_200;
const CIRCULAR_100_KM = Math.sqrt(GM_MOON / (MOON_MEAN_RADIUS + 100e3));

describe('integrateProperTime (model full) on a 100 km lunar orbit', () => {
  it('integrateProperTime(lunar orbiter, 1 day, full) at 2023 takes within 1.5× the steps it takes at J2000 (tolerance 1e-13; was 122 240 vs 577 before the argument reduction)', () => {
    const steps = (epoch: number): number =>
      integrateProperTime(lunarOrbiter(epoch, 100e3, CIRCULAR_100_KM), 86_400, 21_600, {
        model: 'full',
        epoch: instantFromTtSecondsSinceJ2000(epoch),
        relativeTolerance: 1e-13,
      }).acceptedSteps;
    const atJ2000 = steps(EPOCH_J2000);
    const at2023 = steps(EPOCH_2023);
    expect(at2023).toBeLessThan(1.5 * atJ2000);
    expect(atJ2000).toBeLessThan(1.5 * at2023);
  });

  it('integrateProperTime(lunar orbiter, 1 day, full) converges at the tightest documented tolerance 1e-14 at 2023 and agrees with the 1e-13 run to 1e-15 s', () => {
    const state = lunarOrbiter(EPOCH_2023, 100e3, CIRCULAR_100_KM);
    const run = (rtol: number): number => {
      const r = integrateProperTime(state, 86_400, 86_400, {
        model: 'full',
        epoch: instantFromTtSecondsSinceJ2000(EPOCH_2023),
        relativeTolerance: rtol,
      });
      return r.tauMinusTT[r.t.length - 1]!;
    };
    expect(Math.abs(run(1e-14) - run(1e-13))).toBeLessThan(1e-15);
  });

  it('integrateProperTime over an anomalistic month reproduces lunarClockRate({ location: "orbit", ρ = R_M + 100 km }) to 0.03 µs/day', () => {
    // lunarClockRate: Kepler-mean lunar orbit, checked against Ashby & Patla 2024 and Turyshev et al. 2024 [V2] in
    // test/reference/lunar-time; its stated accuracy is ≈ 0.01 µs/day (solar tides omitted), and the low-precision
    // ephemeris' mean distance (385 000 km) differs from its 384 748 km by 0.0007 µs/day [C]. Averaging over one
    // anomalistic month (27.5545 days, common practice, no source) removes most of the ±0.1 µs/day monthly term (evection and variation do not
    // cancel exactly over that span). Measured difference 0.021 µs/day [C] at the time of writing.
    const span = 27.5545 * 86_400;
    const r = integrateProperTime(lunarOrbiter(EPOCH_2023, 100e3, CIRCULAR_100_KM), span, span, {
      model: 'full',
      epoch: instantFromTtSecondsSinceJ2000(EPOCH_2023),
    });
    const integrated = (r.tauMinusTT[r.t.length - 1]! / span) * 86_400e6;
    const analytic = lunarClockRate({
      location: 'orbit',
      orbitRadius: MOON_MEAN_RADIUS + 100e3,
    }).microsecondsPerDayVsTT;
    expect(Math.abs(integrated - analytic)).toBeLessThan(0.03);
  });

  it('integrateProperTime(full) throws OutOfDomainError naming the time when a lunar orbit hits the Moon', () => {
    const state = lunarOrbiter(EPOCH_2023, 100e3, 500);
    expect(() =>
      integrateProperTime(state, 86_400, 3_600, { model: 'full', epoch: instantFromTtSecondsSinceJ2000(EPOCH_2023) }),
    ).toThrow(OutOfDomainError);
    expect(() =>
      integrateProperTime(state, 86_400, 3_600, { model: 'full', epoch: instantFromTtSecondsSinceJ2000(EPOCH_2023) }),
    ).toThrow(/hits the Moon by t = \d/);
  });
});
