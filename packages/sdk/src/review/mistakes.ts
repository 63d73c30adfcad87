/**
 * The classic mistakes behind a wrong factory offset: for each, the value it would have produced for
 * the planned orbit, so a configured offset can be matched against them.
 *
 * @internal
 */
import { CONSTANT_SETS, type ConstantSet } from '../constants.js';
import { meanRateParts, type ReferenceClock, reciprocalOffset, semiMajorAxisForMeanRate } from '../relativity/rate.js';
import type { Diagnosis, ReviewSpacecraft } from './types.js';

/**
 * Nominal semi-major axes of well-known orbit classes, used only to name the orbit an
 * offset was probably copied from (orbit radii are nominal values from memory [M]).
 */
const KNOWN_ORBITS: readonly { label: string; semiMajorAxis: number }[] = [
  { label: 'a GPS-type MEO (26 561.75 km)', semiMajorAxis: 26_561_750 },
  { label: 'a GLONASS-type MEO (25 510 km)', semiMajorAxis: 25_510_000 },
  { label: 'a Galileo-type MEO (29 599.8 km)', semiMajorAxis: 29_599_800 },
  { label: 'a BeiDou-type MEO (27 906.1 km)', semiMajorAxis: 27_906_100 },
  { label: 'a geosynchronous orbit (42 164.2 km)', semiMajorAxis: 42_164_200 },
];

/** The GPS conventional hardware offset −4.4647e-10 (IS-GPS-200E §3.3.1.1 [V2]; IERS Conventions 2010 §10.2 [V1]). */
const GPS_CONVENTIONAL_OFFSET = -4.4647e-10;

/** GM of the Earth plus the Moon, m³/s² (IERS 2010 GM_E [V2] + GM_Moon 4.9028e12 [M]); a geocentric/barycentric mix-up. */
const GM_EARTH_PLUS_MOON = 3.986004418e14 + 4.9028e12;

/**
 * Factory offset 1/(1+r) − 1 for a fractional rate r (rate.ts's cancellation-free form −r/(1 + r)): in orbit
 * the oscillator then keeps the reference rate.
 */
export const offsetForRate = reciprocalOffset;

/** Mean fractional rate of a Kepler-orbit clock vs TT or TCG for any a and GM: rate.ts's one formula (IERS 2010 eq. 10.9 averaged). */
export function rateFor(a: number, gm: number, lG: number, reference: ReferenceClock): number {
  return meanRateParts(a, gm, lG, reference).fractionalRate;
}

/** A number in exponential notation with `digits` significant digits (non-finite values as text). */
export function fmt(x: number, digits = 6): string {
  return Number.isFinite(x) ? x.toExponential(digits - 1) : String(x);
}

interface Hypothesis {
  code: Diagnosis['code'];
  value: number;
  explain: string;
}

/** Another spacecraft's expected offset (spacecraft sharing one value are listed together). */
export interface OtherExpectation {
  id: string;
  offset: number;
}

function hypotheses(
  sc: ReviewSpacecraft,
  set: ConstantSet,
  reference: ReferenceClock,
  others: readonly OtherExpectation[],
): Hypothesis[] {
  const a = sc.orbit.semiMajorAxis;
  const expected = offsetForRate(rateFor(a, set.gm, set.lG, reference));
  const { gravitational, velocity } = meanRateParts(a, set.gm, set.lG, reference);
  const list: Hypothesis[] = [
    {
      code: 'sign-flipped',
      value: -expected,
      explain:
        'the offset was entered with the wrong sign (the clock must be set LOW on the ground because in orbit it runs fast)',
    },
    {
      code: 'kilometres-for-metres',
      value: offsetForRate(rateFor(a / 1000, set.gm, set.lG, reference)),
      explain: `the semi-major axis was used in kilometres (${a / 1000}) where the formula expects metres`,
    },
    {
      code: 'metres-for-kilometres',
      value: offsetForRate(rateFor(a * 1000, set.gm, set.lG, reference)),
      explain: `the semi-major axis in metres was multiplied by 1000 as if it were kilometres (${a * 1000} m)`,
    },
    {
      code: 'tcg-reference',
      value: offsetForRate(rateFor(a, set.gm, set.lG, reference === 'tt' ? 'tcg' : 'tt')),
      explain:
        reference === 'tt'
          ? 'the rate was referred to TCG (no geoid term L_G) instead of TT / the geoid'
          : 'the rate was referred to TT instead of the requested TCG',
    },
    {
      code: 'gravitational-term-only',
      value: offsetForRate(gravitational),
      explain: 'only the gravitational blueshift was compensated; the second-order Doppler (velocity) term is missing',
    },
    {
      code: 'velocity-term-only',
      value: offsetForRate(velocity),
      explain: 'only the second-order Doppler (velocity) term was compensated; the gravitational term is missing',
    },
    {
      code: 'wrong-gm-set',
      value: offsetForRate(rateFor(a, set.gm / 1e9, set.lG, reference)),
      explain: 'GM was taken in km³/s² (≈ 398 600) where m³/s² is expected',
    },
    {
      code: 'wrong-gm-set',
      value: offsetForRate(rateFor(a, GM_EARTH_PLUS_MOON, set.lG, reference)),
      explain: 'GM of the Earth plus the Moon was used instead of the geocentric GM',
    },
  ];
  for (const other of Object.values(CONSTANT_SETS)) {
    if (other.gm === set.gm) continue;
    list.push({
      code: 'wrong-gm-set',
      value: offsetForRate(rateFor(a, other.gm, set.lG, reference)),
      explain: `the GM of the ${other.name} set (${other.gm}) was used instead of ${set.name} (${set.gm})`,
    });
  }
  list.push({
    code: 'other-orbit',
    value: GPS_CONVENTIONAL_OFFSET,
    explain:
      'the GPS conventional offset −4.4647e-10 (IS-GPS-200, for a ≈ 26 561 400 m) was used for a different orbit',
  });
  for (const orbit of KNOWN_ORBITS) {
    if (Math.abs(orbit.semiMajorAxis - a) < 50_000) continue;
    list.push({
      code: 'other-orbit',
      value: offsetForRate(rateFor(orbit.semiMajorAxis, set.gm, set.lG, reference)),
      explain: `the offset of ${orbit.label} was used`,
    });
  }
  for (const other of others) {
    list.push({
      code: 'copied-from-spacecraft',
      value: other.offset,
      explain: `the offset expected for spacecraft ${other.id} (a different orbit) was copied`,
    });
  }
  return list;
}

/**
 * The recognised mistakes whose value matches the configured offset within `matchWindow` (and differs from the
 * expected one by more), nearest first, one per code.
 */
export function mistakeDiagnoses(
  sc: ReviewSpacecraft,
  set: ConstantSet,
  reference: ReferenceClock,
  others: readonly OtherExpectation[],
  configured: number,
  expected: number,
  matchWindow: number,
): Diagnosis[] {
  return hypotheses(sc, set, reference, others)
    .filter((h) => Math.abs(configured - h.value) <= matchWindow && Math.abs(h.value - expected) > matchWindow)
    .sort((x, y) => Math.abs(configured - x.value) - Math.abs(configured - y.value))
    .filter((h, k, all) => all.findIndex((g) => g.code === h.code) === k)
    .map((h) => ({
      code: h.code,
      matches: true,
      wouldHaveProduced: h.value,
      message: `Configured ${fmt(configured)} matches the value ${fmt(h.value)} produced when ${h.explain} (expected ${fmt(expected)}).`,
    }));
}

/** The note for a failing offset that no mistake explains: the circular orbit that would need it, when there is one. */
export function unexplainedDiagnosis(
  sc: ReviewSpacecraft,
  set: ConstantSet,
  reference: ReferenceClock,
  configured: number,
): Diagnosis {
  let implied = Number.NaN;
  try {
    // The rate this offset compensates, −c/(1 + c): the direct 1/(1 + c) − 1 lost ~7 digits (≈ 9 m of a).
    implied = semiMajorAxisForMeanRate(reciprocalOffset(configured), { constants: set, reference });
  } catch {
    /* no orbit above the Earth needs this offset */
  }
  const plausible = Number.isFinite(implied) && implied < 1e9;
  return {
    code: 'other-orbit',
    matches: false,
    wouldHaveProduced: plausible ? configured : null,
    message: plausible
      ? `No common mistake explains the difference. The configured offset is the one a clock at a = ${implied.toFixed(0)} m would need (planned a = ${sc.orbit.semiMajorAxis} m); check where the value came from.`
      : `No common mistake explains the difference, and no circular orbit needs this offset; check where the value came from.`,
  };
}
