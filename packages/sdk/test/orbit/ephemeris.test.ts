import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import {
  moonPositionAt,
  moonPositionLowPrecision,
  sunPositionAt,
  sunPositionLowPrecision,
} from '../../src/orbit/ephemeris.js';
import { instantFromTtSecondsSinceJ2000 } from '../../src/time/j2000.js';
import { BUNDLED_LEAP_SECONDS } from '../../src/time/leap-seconds.js';
import { createTimeScales } from '../../src/time/scales.js';

const ts = createTimeScales(BUNDLED_LEAP_SECONDS);

const DEG = Math.PI / 180;
/** Equatorial-of-date vector → ecliptic-of-date longitude (deg), latitude (deg), distance (m). */
function ecliptic(v: readonly number[], T: number): [number, number, number] {
  const eps = (23.43929111 - (46.815 / 3600) * T) * DEG;
  const x = v[0]!,
    y = Math.cos(eps) * v[1]! + Math.sin(eps) * v[2]!,
    z = -Math.sin(eps) * v[1]! + Math.cos(eps) * v[2]!;
  const r = Math.hypot(x, y, z);
  return [(Math.atan2(y, x) / DEG + 360) % 360, Math.asin(z / r) / DEG, r];
}
/** The instant of a Julian date on TT (the worked examples give their dates as JD on TD = TT). */
const tt = (jd: number) => ts.fromJd('TT', jd);

describe('low-precision Sun/Moon (Montenbruck & Gill 2000 §3.3.2 [M]) against worked examples of Meeus, Astronomical Algorithms (1998) [M]', () => {
  it('moonPositionLowPrecision at 1992-04-12 0h TT is within 0.01° and 100 km of Meeus Example 47.a (λ 133.162655°, β −3.229126°, 368 409.7 km)', () => {
    const jd = 2448724.5;
    const [lon, lat, r] = ecliptic(moonPositionLowPrecision(tt(jd)), (jd - 2451545) / 36525);
    expect(Math.abs(lon - 133.162655)).toBeLessThan(0.01);
    expect(Math.abs(lat + 3.229126)).toBeLessThan(0.01);
    expect(Math.abs(r - 368_409_700)).toBeLessThan(100_000);
  });

  it('sunPositionLowPrecision at 1992-10-13 0h TT is within 0.03° and 1e-5 relative of Meeus Example 25.a (λ 199.90988°, R 0.99766 au)', () => {
    const jd = 2448908.5;
    const [lon, lat, r] = ecliptic(sunPositionLowPrecision(tt(jd)), (jd - 2451545) / 36525);
    expect(Math.abs(lon - 199.90988)).toBeLessThan(0.03);
    expect(Math.abs(lat)).toBeLessThan(1e-9);
    expect(Math.abs(r / (0.99766 * 149_597_870_700) - 1)).toBeLessThan(1e-5);
  });

  it('the eme2000 frame differs from mean-of-date by the precession 1.3972°·T in longitude (Montenbruck & Gill eq. 3.47)', () => {
    const t = tt(2451545 + 36525 * 0.25);
    const a = ecliptic(sunPositionLowPrecision(t, 'eme2000'), 0);
    const b = ecliptic(sunPositionLowPrecision(t, 'mean-of-date'), 0.25);
    expect(b[0] - a[0]).toBeCloseTo(1.3972 * 0.25, 6);
    expect(b[2]).toBeCloseTo(a[2], 0);
  });

  it('the Moon stays between 356 000 and 407 000 km over a year (perigee/apogee extremes, common practice, no source)', () => {
    for (let d = 0; d < 365; d += 1.5) {
      const r = Math.hypot(...moonPositionLowPrecision(tt(2460676.5 + d)));
      expect(r).toBeGreaterThan(3.56e8);
      expect(r).toBeLessThan(4.07e8);
    }
  });

  it('moonPositionLowPrecision and sunPositionLowPrecision reject an epoch that is not an Instant and an unknown frame', () => {
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, '2027-03-01T00:00:00', null, {}]) {
      for (const call of [moonPositionLowPrecision, sunPositionLowPrecision]) {
        const error = (() => {
          try {
            call(bad as never);
          } catch (e) {
            return e;
          }
          return undefined;
        })();
        expect(error).toBeInstanceOf(InvalidArgumentError);
        expect((error as InvalidArgumentError).argument).toBe('epoch');
      }
    }
    expect(() => sunPositionLowPrecision(tt(2451545), 'icrf' as never)).toThrow(/"mean-of-date" or "eme2000"/);
  });

  it('moonPositionLowPrecision(7.5e8) (the former bare TT seconds since J2000.0) is refused naming epoch, with the instantFromTtSecondsSinceJ2000 hint', () => {
    expect(() => moonPositionLowPrecision(7.5e8 as never)).toThrow(
      /epoch must be an Instant, not a number of seconds; received 750000000\. .*instantFromTtSecondsSinceJ2000\(seconds\)/,
    );
    expect(() => sunPositionLowPrecision(undefined as never)).toThrow(/epoch must be an Instant \(required\)/);
  });

  it('moonPositionLowPrecision(instant) and sunPositionLowPrecision(instant) give bit for bit the series at TT seconds since J2000.0 of the instant (the call shape changed, not the numbers)', () => {
    for (const seconds of [-243_691_200, 0, 1234.5, 725_803_200.5, 8.1e8, 1_277_856_000.5]) {
      const instant = instantFromTtSecondsSinceJ2000(seconds);
      expect(moonPositionLowPrecision(instant)).toEqual(moonPositionAt(seconds, 0, true));
      expect(sunPositionLowPrecision(instant)).toEqual(sunPositionAt(seconds, 0, true));
      expect(moonPositionLowPrecision(instant, 'eme2000')).toEqual(moonPositionAt(seconds, 0, false));
      expect(sunPositionLowPrecision(instant, 'eme2000')).toEqual(sunPositionAt(seconds, 0, false));
    }
  });
});

describe('low-precision Moon at recent epochs: argument reduction keeps the series smooth', () => {
  /** Largest |Δ⁴x| over one day of 60 s samples from `start` (TT seconds since J2000; exact multiples of 0.5 s, so the sum start + k·60 is exact). */
  function worstFourthDifference(start: number): number {
    const h = 60;
    const p = Array.from({ length: 1445 }, (_, k) =>
      moonPositionLowPrecision(instantFromTtSecondsSinceJ2000(start + k * h)),
    );
    let worst = 0;
    for (let k = 0; k + 4 < p.length; k++) {
      for (let c = 0; c < 3; c++) {
        const d4 = p[k]![c]! - 4 * p[k + 1]![c]! + 6 * p[k + 2]![c]! - 4 * p[k + 3]![c]! + p[k + 4]![c]!;
        worst = Math.max(worst, Math.abs(d4));
      }
    }
    return worst;
  }

  // Criterion (ours): the fourth differences of a smooth 60 s series of the lunar position are ≈ (ωh)⁴·r ≈ 3e-7 m plus
  // the float64 rounding of a 4e8 m coordinate (ulp 6e-8 m, amplified ≤ 16×); we require < 2e-5 m, i.e. rounding noise
  // below 5e-14 of the Earth–Moon distance. Before the reduction, angles of ≈ 10⁵° at 2023 left ≈ 3e-4 m of noise.
  for (const [label, start] of [
    ['2000-01-01', 1234.5],
    ['2023-01-01', 725_803_200.5],
    ['2040-07-01', 1_277_856_000.5],
  ] as const) {
    it(`moonPositionLowPrecision near ${label} has fourth differences (h = 60 s, one day) below 2e-5 m (smooth to 5e-14 relative)`, () => {
      expect(worstFourthDifference(start)).toBeLessThan(2e-5);
    });
  }
});
