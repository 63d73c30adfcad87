/**
 * Reference checks of the lunar clock rate against: N. Ashby & B. Patla, "A Relativistic Framework to
 * Establish Coordinate Time on the Moon and Beyond", arXiv:2402.11150 (2024), abstract [V2] ("accumulating
 * an extra 56.02 microseconds per day"); S. Turyshev et al., arXiv:2406.16147 (2024), abstract [V2]
 * (TL − TT 56.0256 µs/day); a 2024 mailing-list summary of Kopeikin & Kaplan [V2] (−56.0005 µs/day at the mean
 * surface, −58.7 µs/day at the selenocentre); and the independent term-by-term computation of the reference
 * sheet (physics-refs.md) §9 [C] (inputs from memory [M]: a = 384 748 km, GM_Moon = 4.9028e12 m³/s² (the SDK uses
 * the DE value 4.902800066e12 [M], 1.3e-8 relative apart), R_Moon = 1737.4 km).
 * Tolerances: toBeCloseTo(x, 4) is |Δ| < 5e-5 µs/day, half a unit in the last printed digit.
 */
import { describe, expect, it } from 'vitest';
import { lunarClockRate } from '../../packages/sdk/src/relativity/reference-clocks.js';

describe('lunar clock rate against TT (reference sheet §9 breakdown [C])', () => {
  const surface = lunarClockRate({ location: 'surface' });
  const centre = lunarClockRate({ location: 'selenocentre' });

  it('lunarClockRate breakdown: L_G +60.2147, Earth potential −0.9959, orbital kinetic −0.5041, lunar self-potential −2.7128 µs/day', () => {
    const b = surface.breakdownMicrosecondsPerDay;
    expect(b.geoidClock).toBeCloseTo(60.2147, 4);
    expect(b.earthPotential).toBeCloseTo(-0.9959, 4);
    expect(b.orbitalKinetic).toBeCloseTo(-0.5041, 4);
    expect(b.lunarSelfPotential).toBeCloseTo(-2.7128, 4);
  });

  it('lunarClockRate totals: selenocentre +58.7146 µs/day (6.79567e-10), surface +56.0018 µs/day (6.48169e-10)', () => {
    expect(centre.microsecondsPerDayVsTT).toBeCloseTo(58.7146, 4);
    expect(centre.rateVsTT).toBeCloseTo(6.79567e-10, 15);
    // the surface total includes the lunar rotation term (−1.0e-5 µs/day), below the 1e-4 resolution of the sheet
    expect(surface.microsecondsPerDayVsTT).toBeCloseTo(56.0018, 4);
    expect(surface.rateVsTT).toBeCloseTo(6.48169e-10, 15);
  });

  it("lunarClockRate(surface) lies within the spread of the published surface values 56.0005 … 56.0256 µs/day [V2], within 0.025 µs/day of Ashby & Patla's 56.02", () => {
    expect(surface.microsecondsPerDayVsTT).toBeGreaterThanOrEqual(56.0005);
    expect(surface.microsecondsPerDayVsTT).toBeLessThanOrEqual(56.0256);
    expect(Math.abs(surface.microsecondsPerDayVsTT - 56.02)).toBeLessThan(0.025);
  });

  it('lunarClockRate(selenocentre) rounds to the published 58.7 µs/day [V2]', () => {
    expect(Math.abs(centre.microsecondsPerDayVsTT - 58.7)).toBeLessThan(0.05);
  });
});
