/**
 * Reference checks of the numerical proper time and the signal-path terms against IERS Conventions
 * (2010), IERS Technical Note 36, G. Petit & B. Luzum (eds.): Ch. 10 §10.2 eqs. 10.9–10.11 (text read,
 * [V1]) and Ch. 11 §11.2 eq. 11.17 (text read, [V1]); numeric check values recomputed independently in
 * double precision (reference sheet §2, §4, §7, [C]).
 */
import { describe, expect, it } from 'vitest';
import { IERS_2010, L_G, SPEED_OF_LIGHT, SPEED_OF_LIGHT_SQUARED } from '../../packages/sdk/src/constants.js';
import { elementsToState } from '../../packages/sdk/src/orbit/elements.js';
import { createGravityField } from '../../packages/sdk/src/orbit/forces.js';
import { integrateProperTime } from '../../packages/sdk/src/relativity/proper-time.js';
import { shapiroDelay } from '../../packages/sdk/src/signal/index.js';
import { instantFromTtSecondsSinceJ2000 } from '../../packages/sdk/src/time/j2000.js';

const GM = IERS_2010.gm;
const A = 26_561_750;
const state = elementsToState(
  {
    semiMajorAxis: A,
    eccentricity: 0.02,
    inclination: (55 * Math.PI) / 180,
    raan: 0.4,
    argumentOfPerigee: 0.9,
    meanAnomaly: 0,
  },
  GM,
);

describe('IERS Conventions (2010) §10.2: eq. 10.9 integrated along a Kepler orbit (a = 26 561 750 m, e = 0.02, i = 55°, 1 day)', () => {
  const run = integrateProperTime(state, 86_400, 60, { model: 'point-mass', relativeTolerance: 1e-13 });
  const rv = Array.from(run.t, (_, k) => {
    const s = run.states.subarray(6 * k, 6 * k + 6);
    return s[0]! * s[3]! + s[1]! * s[4]! + s[2]! * s[5]!;
  });
  // (τ − TT) − (−2 r·v/c²): linear in t by eqs. 10.10/10.11 (reference sheet §4 [C]: linear to 1.6e-19 s).
  const detrended = Array.from(run.t, (_, k) => run.tauMinusTT[k]! + (2 * rv[k]!) / SPEED_OF_LIGHT_SQUARED);
  const n = run.t.length;
  const slope = (detrended[n - 1]! - detrended[0]!) / 86_400;

  it('integrateProperTime: (τ − TT) + 2 r·v/c² is a straight line to < 1e-17 s (reference sheet §4 [C]: 1.6e-19 s with DOP853 rtol 1e-13)', () => {
    let worst = 0;
    for (let k = 0; k < n; k++) worst = Math.max(worst, Math.abs(detrended[k]! - detrended[0]! - slope * run.t[k]!));
    expect(worst).toBeLessThan(1e-17);
  });

  it('integrateProperTime: the fitted rate minus L_G is −3GM/(2ac²) = −2.5045571390e-10 to 10 digits (reference sheet §4 [C])', () => {
    expect((slope - L_G) / -2.504557139e-10).toBeCloseTo(1, 9);
  });

  it('integrateProperTime: the rate against TT is ≈ 4.4647e-10 ("constant offset of about 4.46 × 10⁻¹⁰", IERS §10.2 [V1]; 4.464733e-10 [C])', () => {
    expect(slope).toBeCloseTo(4.464733e-10, 15);
  });

  it('the periodic term −2 r·v/c² peaks at 45.7948 ns for e = 0.02 ("can reach up to 46 ns", IERS §10.2 [V1]; [C] value)', () => {
    const peak = Math.max(...rv.map((x) => Math.abs((2 * x) / SPEED_OF_LIGHT_SQUARED)));
    expect(peak * 1e9).toBeCloseTo(45.7948, 3);
  });

  it('the tidal potential of Moon and Sun along a GPS orbit stays below 1e-15 of c² ("tidal terms … < 10⁻¹⁵ in frequency … up to GPS orbit", IERS §10.2 [V1])', () => {
    const full = createGravityField('full', { epoch: instantFromTtSecondsSinceJ2000(8.1e8) });
    const j2 = createGravityField('j2');
    const r = integrateProperTime(state, 86_400, 900, { model: 'full', epoch: instantFromTtSecondsSinceJ2000(8.1e8) });
    let worst = 0;
    for (let k = 0; k < r.t.length; k++) {
      const s = r.states.subarray(6 * k, 6 * k + 3);
      const t = r.t[k]!;
      worst = Math.max(
        worst,
        Math.abs(full.potential(t, s[0]!, s[1]!, s[2]!) - j2.potential(t, s[0]!, s[1]!, s[2]!)) /
          SPEED_OF_LIGHT_SQUARED,
      );
    }
    expect(worst).toBeGreaterThan(1e-16);
    expect(worst).toBeLessThan(1e-15);
  });
});

describe('IERS Conventions (2010) §11.2 eq. 11.17: Shapiro delay, "the only body to be considered is the Earth" [V1]', () => {
  it('2GM/c³ = 2.958732e-11 s (8.8701 mm) and shapiroDelay for GPS at zenith is 42.242 ps (reference sheet §7 [C])', () => {
    expect((2 * GM) / SPEED_OF_LIGHT ** 3 / 2.958732e-11).toBeCloseTo(1, 6);
    expect(shapiroDelay(A, 6_371_000, A - 6_371_000) * 1e12).toBeCloseTo(42.242, 3);
  });
});
