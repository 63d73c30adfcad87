import { describe, expect, it } from 'vitest';
import { moonPositionLowPrecision, sunPositionLowPrecision } from '../../src/orbit/ephemeris.js';
import { InvalidArgumentError } from '../../src/errors.js';

const DEG = Math.PI / 180;
/** Equatorial-of-date vector → ecliptic-of-date longitude (deg), latitude (deg), distance (m). */
function ecliptic(v: readonly number[], T: number): [number, number, number] {
  const eps = (23.43929111 - (46.815 / 3600) * T) * DEG;
  const x = v[0]!, y = Math.cos(eps) * v[1]! + Math.sin(eps) * v[2]!, z = -Math.sin(eps) * v[1]! + Math.cos(eps) * v[2]!;
  const r = Math.hypot(x, y, z);
  return [((Math.atan2(y, x) / DEG) + 360) % 360, Math.asin(z / r) / DEG, r];
}
const seconds = (jd: number): number => (jd - 2451545.0) * 86400;

describe('low-precision Sun/Moon (Montenbruck & Gill 2000 §3.3.2 [M]) against worked examples of Meeus, Astronomical Algorithms (1998) [M]', () => {
  it('moonPositionLowPrecision at 1992-04-12 0h TT is within 0.01° and 100 km of Meeus Example 47.a (λ 133.162655°, β −3.229126°, 368 409.7 km)', () => {
    const jd = 2448724.5;
    const [lon, lat, r] = ecliptic(moonPositionLowPrecision(seconds(jd)), (jd - 2451545) / 36525);
    expect(Math.abs(lon - 133.162655)).toBeLessThan(0.01);
    expect(Math.abs(lat + 3.229126)).toBeLessThan(0.01);
    expect(Math.abs(r - 368_409_700)).toBeLessThan(100_000);
  });

  it('sunPositionLowPrecision at 1992-10-13 0h TT is within 0.03° and 1e-5 relative of Meeus Example 25.a (λ 199.90988°, R 0.99766 au)', () => {
    const jd = 2448908.5;
    const [lon, lat, r] = ecliptic(sunPositionLowPrecision(seconds(jd)), (jd - 2451545) / 36525);
    expect(Math.abs(lon - 199.90988)).toBeLessThan(0.03);
    expect(Math.abs(lat)).toBeLessThan(1e-9);
    expect(Math.abs(r / (0.99766 * 149_597_870_700) - 1)).toBeLessThan(1e-5);
  });

  it('the eme2000 frame differs from mean-of-date by the precession 1.3972°·T in longitude (Montenbruck & Gill eq. 3.47)', () => {
    const t = seconds(2451545 + 36525 * 0.25);
    const a = ecliptic(sunPositionLowPrecision(t, 'eme2000'), 0);
    const b = ecliptic(sunPositionLowPrecision(t, 'mean-of-date'), 0.25);
    expect(b[0] - a[0]).toBeCloseTo(1.3972 * 0.25, 6);
    expect(b[2]).toBeCloseTo(a[2], 0);
  });

  it('the Moon stays between 356 000 and 407 000 km over a year (perigee/apogee extremes, common practice, no source)', () => {
    for (let d = 0; d < 365; d += 1.5) {
      const r = Math.hypot(...moonPositionLowPrecision(seconds(2460676.5 + d)));
      expect(r).toBeGreaterThan(3.56e8);
      expect(r).toBeLessThan(4.07e8);
    }
  });

  it('moonPositionLowPrecision and sunPositionLowPrecision reject a non-finite epoch and an unknown frame', () => {
    expect(() => moonPositionLowPrecision(Number.NaN)).toThrow(/ttSecondsSinceJ2000/);
    expect(() => sunPositionLowPrecision(Infinity)).toThrow(InvalidArgumentError);
    expect(() => sunPositionLowPrecision(0, 'icrf' as never)).toThrow(/"mean-of-date" or "eme2000"/);
  });
});
