import { readFileSync } from 'node:fs';
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { configuredFraction, parseReviewInput, REVIEW_CAUTION, reviewOffsets } from '../../src/review/index.js';

const examples = new URL('../../examples/review/', import.meta.url);
const load = (name: string): unknown => JSON.parse(readFileSync(new URL(name, examples), 'utf8'));
const schema = JSON.parse(readFileSync(new URL('../../schema/review.schema.json', import.meta.url), 'utf8'));

const base = {
  nominalFrequencyHz: 10.23e6,
  tolerance: { fractional: 5e-13 },
  spacecraft: [{ id: 'A', configured: { fractionalOffset: -4.4647e-10 }, orbit: { semiMajorAxis: 26_561_400.1 } }],
};
const withSpacecraft = (patch: Record<string, unknown>) => ({
  ...base,
  spacecraft: [{ ...base.spacecraft[0], ...patch }],
});

describe('reviewOffsets(document) on the bundled examples', () => {
  it('passes every spacecraft of the correct Block A file', () => {
    const report = reviewOffsets(load('kestrel-block-a.review.json'));
    expect(report.counts).toEqual({ pass: 3, marginal: 0, fail: 0 });
    expect(report.caution).toBe(REVIEW_CAUTION);
    for (const s of report.spacecraft) expect(Math.abs(s.differenceFractional)).toBeLessThan(5e-13 * 0.5);
  });

  it('diagnoses each deliberate mistake of the Block B file with the value it would have produced', () => {
    const report = reviewOffsets(load('kestrel-block-b-mistakes.review.json'));
    const byId = Object.fromEntries(report.spacecraft.map((s) => [s.id, s]));
    const codes = (id: string) => byId[id]!.diagnosis.filter((d) => d.matches).map((d) => d.code);
    expect(codes('KESTREL-11')[0]).toBe('sign-flipped');
    expect(codes('KESTREL-12')[0]).toBe('kilometres-for-metres');
    expect(codes('KESTREL-13')[0]).toBe('tcg-reference');
    expect(codes('KESTREL-14')).toContain('other-orbit');
    expect(codes('KESTREL-15')).toContain('quantisation');
    expect(codes('KESTREL-G1')).toContain('copied-from-spacecraft');
    expect(codes('KESTREL-16')[0]).toBe('gravitational-term-only');
    expect(codes('KESTREL-17')).toContain('wrong-gm-set');
    expect(codes('KESTREL-18')).toContain('actuator-range');
    // Each code is listed once, the unexplained note does not appear when quantisation explains a value,
    // and spacecraft sharing an orbit are named together.
    for (const s of report.spacecraft) expect(new Set(codes(s.id)).size).toBe(codes(s.id).length);
    expect(byId['KESTREL-15']!.diagnosis.map((d) => d.code)).not.toContain('other-orbit');
    expect(byId['KESTREL-G1']!.diagnosis.find((d) => d.code === 'copied-from-spacecraft')!.message).toMatch(
      /KESTREL-11, KESTREL-12/,
    );
    expect(byId['KESTREL-14']!.diagnosis.find((d) => d.code === 'actuator-range')!.message).toMatch(/could absorb/);
    expect(byId['KESTREL-19']!.verdict).toBe('marginal');
    expect(byId['KESTREL-18']!.summary).toMatch(/within tolerance .* fails on actuator-range/);
    for (const id of [
      'KESTREL-11',
      'KESTREL-12',
      'KESTREL-13',
      'KESTREL-14',
      'KESTREL-15',
      'KESTREL-G1',
      'KESTREL-16',
      'KESTREL-17',
      'KESTREL-18',
    ]) {
      expect(byId[id]!.verdict, id).toBe('fail');
    }
    // The value a matching mistake would have produced is the configured value, within the tolerance.
    for (const s of report.spacecraft) {
      for (const d of s.diagnosis.filter(
        (x) => x.matches && x.wouldHaveProduced !== null && x.code !== 'quantisation',
      )) {
        expect(Math.abs(d.wouldHaveProduced! - s.configuredFractionalOffset), `${s.id} ${d.code}`).toBeLessThanOrEqual(
          5e-13,
        );
      }
    }
  });

  it('rejects a seed that is not an unsigned 32-bit integer', () => {
    const doc = load('kestrel-block-a.review.json');
    expect(() => reviewOffsets(doc, { seed: -1 })).toThrow(/options\.seed/);
    expect(() => reviewOffsets(doc, { seed: 2 ** 32 })).toThrow(/options\.seed/);
    expect(() => reviewOffsets(doc, { seed: 1.5 })).toThrow(/options\.seed/);
    expect(reviewOffsets(doc, { seed: 2 ** 32 - 1 }).counts.pass).toBe(3);
  });

  it('is deterministic for a given seed', () => {
    const doc = load('kestrel-block-b-mistakes.review.json');
    expect(JSON.stringify(reviewOffsets(doc, { seed: 7 }))).toBe(JSON.stringify(reviewOffsets(doc, { seed: 7 })));
  });
});

describe('IERS Conventions 2010 §10.2 and IS-GPS-200 through the review', () => {
  it('expects −4.4647e-10 for a = 26 561 400.1 m against TT (IERS 2010 §10.2 [V1]; a from physics-refs §2 [C])', () => {
    const s = reviewOffsets(base).spacecraft[0]!;
    expect(Math.abs(s.expectedFractionalOffset - -4.4647e-10)).toBeLessThan(5e-16);
    expect(s.verdict).toBe('pass');
  });

  it('gives the 10.23 MHz output 10.2299999954326 MHz to 1e-7 Hz (IS-GPS-200E §3.3.1.1 quoted [V2])', () => {
    const s = reviewOffsets(base).spacecraft[0]!;
    expect(Math.abs(s.expectedFrequencyHz - 10_229_999.9954326)).toBeLessThan(1e-7);
  });

  it('dispersion sensitivity is 9.4292e-18 per metre at a = 26 561 750 m (Ashby, PTTI 33 (2001) abstract [V2]; physics-refs §2 [C])', () => {
    const doc = withSpacecraft({
      orbit: { semiMajorAxis: 26_561_750 },
      dispersion: { semiMajorAxisSigma: 1000 },
      configured: { fractionalOffset: -4.464733e-10 },
    });
    const d = reviewOffsets(doc).spacecraft[0]!.dispersion!;
    expect(d.rateSensitivityPerMetre).toBeCloseTo(9.4292e-18, 21);
  });
});

describe('configuredFraction(configured, nominal)', () => {
  it('reads a 48-bit tuning word exactly: (word·100 MHz/2^48 − 10.23 MHz)/10.23 MHz (exact rational arithmetic in Python, [C])', () => {
    // Python: from fractions import Fraction as F; float((F(28794890104583)*10**8/2**48 - 10230000)/10230000)
    const { fraction, step } = configuredFraction(
      { tuningWord: { word: '28794890104583', clockHz: 1e8, bits: 48 } },
      10.23e6,
    );
    expect(fraction).toBeCloseTo(-4.485903140206679e-10, 22);
    expect(step).toBeCloseTo(1e8 / 2 ** 48 / 10.23e6, 28);
  });

  it('keeps 64-bit words exact', () => {
    const word = 2n ** 64n / 10n; // 0.1 of full scale
    const { fraction } = configuredFraction(
      { tuningWord: { word: word.toString(), clockHz: 102.3e6, bits: 64 } },
      10.23e6,
    );
    // word/2^64 = 0.1 − 0.6/2^64 exactly, so fraction = −6/2^64 (exact algebra).
    expect(fraction).toBeCloseTo(-6 / 2 ** 64, 30);
  });

  it('reads the Hz and frequency forms of IS-GPS-200E §3.3.1.1 as −4.4647e-10 to their printed digits (quoted [V2])', () => {
    // −4.5674e-3 Hz and 10.2299999954326 MHz are printed to ±5e-8 Hz, i.e. ±4.9e-15 at 10.23 MHz.
    expect(Math.abs(configuredFraction({ offsetHz: -4.5674e-3 }, 10.23e6).fraction - -4.4647e-10)).toBeLessThan(
      4.9e-15,
    );
    expect(
      Math.abs(configuredFraction({ offsetFrequencyHz: 10_229_999.9954326 }, 10.23e6).fraction - -4.4647e-10),
    ).toBeLessThan(4.9e-15);
  });
});

describe('the review JSON Schema (validated with ajv, an independent JSON Schema implementation)', () => {
  const ajv = new Ajv2020({ allErrors: true, strict: false });
  const validate = ajv.compile(schema);
  it('accepts both bundled examples', () => {
    for (const name of ['kestrel-block-a.review.json', 'kestrel-block-b-mistakes.review.json']) {
      expect(validate(load(name)), JSON.stringify(validate.errors)).toBe(true);
    }
  });
  it('and parseReviewInput agree on rejecting invalid documents', () => {
    const invalid: unknown[] = [
      { spacecraft: [] },
      withSpacecraft({ orbit: { semiMajorAxis: 26_561.75 } }),
      withSpacecraft({ configured: { fractionalOffset: -4e-10, offsetHz: -4e-3 } }),
      withSpacecraft({ reference: 'TT' }),
      withSpacecraft({ orbit: { semiMajorAxis: 26_561_750, eccentricity: 1.2 } }),
      { ...base, tolerance: { fractional: 0 } },
      withSpacecraft({ constants: 'wgs72' }),
    ];
    for (const doc of invalid) {
      expect(validate(doc), JSON.stringify(doc)).toBe(false);
      expect(() => parseReviewInput(doc), JSON.stringify(doc)).toThrow(InvalidArgumentError);
    }
  });
});

describe('parseReviewInput(document) errors name the field', () => {
  const cases: [unknown, RegExp][] = [
    [null, /review must be an object/],
    [{ spacecraft: 'x' }, /spacecraft must be a non-empty array/],
    [withSpacecraft({ id: '' }), /spacecraft\[0\]\.id/],
    [{ ...base, spacecraft: [base.spacecraft[0], base.spacecraft[0]] }, /spacecraft\[1\]\.id must be an id not used/],
    [
      withSpacecraft({ orbit: { semiMajorAxis: 26_561.75 } }),
      /spacecraft\[0\]\.orbit\.semiMajorAxis.*did you mean 26561\.75 km/,
    ],
    [withSpacecraft({ orbit: { semiMajorAxis: 26_561_750, inclination: 55 } }), /orbit\.inclination.*degrees/],
    [withSpacecraft({ orbit: { semiMajorAxis: 26_561_750, eccentricity: -0.1 } }), /orbit\.eccentricity/],
    [withSpacecraft({ configured: {} }), /configured must be an object with exactly one of/],
    [withSpacecraft({ configured: { offsetFrequencyHz: -4.5674e-3 } }), /give it as "offsetHz"/],
    [withSpacecraft({ configured: { offsetHz: 10_229_999.99 } }), /give it as "offsetFrequencyHz"/],
    [withSpacecraft({ configured: { fractionalOffset: 0.5 } }), /fractionalOffset/],
    [withSpacecraft({ configured: { tuningWord: { word: 'abc', clockHz: 1e8, bits: 48 } } }), /tuningWord\.word/],
    [withSpacecraft({ configured: { tuningWord: { word: '1', clockHz: 1e8, bits: 65 } } }), /tuningWord\.bits/],
    [
      withSpacecraft({ configured: { tuningWord: { word: 2 ** 33, clockHz: 1e8, bits: 32 } } }),
      /an integer in \[0, 2\^32\)/,
    ],
    [withSpacecraft({ configured: { tuningWord: { word: 1, clockHz: 0, bits: 32 } } }), /tuningWord\.clockHz/],
    [{ ...base, nominalFrequencyHz: 10.23 }, /was it given in MHz/],
    [{ ...base, nominalFrequencyHz: undefined }, /spacecraft\[0\]\.nominalFrequencyHz/],
    [{ ...base, tolerance: { fractional: 1 } }, /tolerance\.fractional.*parts per million/],
    [{ ...base, reference: 'utc' }, /reference must be "tt" or "tcg"/],
    [{ ...base, actuator: { rangeFractional: -1 } }, /actuator\.rangeFractional/],
    [{ ...base, phaseToleranceSeconds: 0 }, /phaseToleranceSeconds/],
    [withSpacecraft({ dispersion: { semiMajorAxisSigma: -5 } }), /dispersion\.semiMajorAxisSigma/],
    [{ ...base, title: 3 }, /title must be a string/],
  ];
  it.each(cases.map(([doc, re], i) => [i, doc, re] as const))('case %i', (_i, doc, re) => {
    expect(() => parseReviewInput(doc)).toThrow(re);
  });
});

describe('dispersion analysis', () => {
  it('walk-off time is tolerance/|residual| and Monte Carlo percentiles follow the normal law', () => {
    const doc = {
      ...withSpacecraft({ dispersion: { semiMajorAxisSigma: 2000 }, orbit: { semiMajorAxis: 26_561_400.1 } }),
      phaseToleranceSeconds: 1e-6,
    };
    const d = reviewOffsets(doc, { monteCarloRuns: 40_000 }).spacecraft[0]!.dispersion!;
    expect(d.daysToPhaseToleranceWorst).toBeCloseTo(1e-6 / d.worstResidual / 86400, 10);
    const median = d.monteCarlo.percentiles.find((p) => p.percentile === 50)!;
    const upper = d.monteCarlo.percentiles.find((p) => p.percentile === 84.134)!;
    // Sampling error of a quantile ~ σ·√(p(1−p)/n)/φ(z): < 0.02σ here at 4 standard errors.
    expect(Math.abs(median.semiMajorAxis - 26_561_400.1)).toBeLessThan(0.03 * 2000);
    expect(Math.abs(upper.semiMajorAxis - (26_561_400.1 + 2000))).toBeLessThan(0.05 * 2000);
    expect(d.actuatorCovers).toBeNull();
  });
  it('reviewOffsets(doc).dispersion.percentiles are residual(a0 + kσ) at 100·Φ(k), and the seeded Monte Carlo agrees within its sampling error', () => {
    const a0 = 26_561_400.1;
    const sigma = 2000;
    const doc = {
      ...withSpacecraft({ dispersion: { semiMajorAxisSigma: sigma }, orbit: { semiMajorAxis: a0 } }),
      phaseToleranceSeconds: 1e-6,
    };
    const runs = 40_000;
    const d = reviewOffsets(doc, { monteCarloRuns: runs }).spacecraft[0]!.dispersion!;
    // 100·Φ(k) for k = −3 … 3 (standard normal table values, common practice, no source).
    expect(d.percentiles.map((p) => p.percentile)).toEqual([0.135, 2.275, 15.866, 50, 84.134, 97.725, 99.865]);
    d.percentiles.forEach((p, i) => {
      const k = i - 3;
      expect(p.semiMajorAxis).toBe(a0 + k * sigma);
      // Closed form endpoints equal the ±3σ and nominal residuals computed separately.
      if (k === -3) expect(p.residualFractionalRate).toBe(d.residualAtMinus3Sigma);
      if (k === 0) expect(p.residualFractionalRate).toBe(d.residualNominal);
      if (k === 3) expect(p.residualFractionalRate).toBe(d.residualAtPlus3Sigma);
      // Sampling error of a quantile: σ·√(p(1−p)/n)/φ(k) (asymptotic order-statistic variance, common practice);
      // 4 standard errors allowed. Residual is linear in a to < 1e-9 relative over ±3σ, so the same bound in rate.
      const q = p.percentile / 100;
      const phi = Math.exp((-k * k) / 2) / Math.sqrt(2 * Math.PI);
      const se = (sigma * Math.sqrt((q * (1 - q)) / runs)) / phi;
      const mc = d.monteCarlo.percentiles[i]!;
      expect(mc.percentile).toBe(p.percentile);
      expect(Math.abs(mc.semiMajorAxis - p.semiMajorAxis), `k = ${k}`).toBeLessThan(4 * se);
      expect(Math.abs(mc.residualFractionalRate - p.residualFractionalRate)).toBeLessThan(
        4 * se * d.rateSensitivityPerMetre * 1.001,
      );
    });
  });
  it('flags a tolerance tighter than the J2 osculating/mean-a ambiguity as marginal', () => {
    const doc = {
      ...withSpacecraft({ orbit: { semiMajorAxis: 26_561_400.1, inclination: 0.96 } }),
      tolerance: { fractional: 1e-14 },
    };
    const s = reviewOffsets(doc).spacecraft[0]!;
    expect(s.verdict).toBe('marginal');
    // physics-refs §5 [C]: osculating and mean a differ by ~1.6 km for GPS, ~1.5e-14 in rate.
    expect(s.budget.j2Ambiguity).toBeGreaterThan(1.3e-14);
    expect(s.budget.j2Ambiguity).toBeLessThan(1.8e-14);
  });
});

describe('J2 in the expected offset', () => {
  it('includes the J2 secular term only when the kind of a is stated, and agrees with j2SecularClockRate', async () => {
    const { j2SecularClockRate } = await import('../../src/relativity/j2.js');
    const orbit = { semiMajorAxis: 26_561_750, inclination: 0.3 };
    const plain = reviewOffsets(withSpacecraft({ orbit })).spacecraft[0]!;
    const mean = reviewOffsets(withSpacecraft({ orbit: { ...orbit, semiMajorAxisKind: 'mean' } })).spacecraft[0]!;
    const j2 = j2SecularClockRate({ ...orbit, eccentricity: 0, semiMajorAxisKind: 'mean' }).j2Correction;
    expect(plain.budget.j2Included).toBe(false);
    expect(mean.budget.j2Included).toBe(true);
    expect(mean.budget.j2).toBe(j2);
    // offset = −r/(1+r), so a rate change δ moves it by −δ/(1+r)²: equal to −δ within 2r·δ ≈ 3e-23.
    expect(mean.expectedFractionalOffset - plain.expectedFractionalOffset).toBeCloseTo(-j2, 21);
    expect(() => parseReviewInput(withSpacecraft({ orbit: { ...orbit, semiMajorAxisKind: 'osculating' } }))).toThrow(
      /argumentOfLatitude/,
    );
    expect(() => parseReviewInput(withSpacecraft({ orbit: { ...orbit, semiMajorAxisKind: 'average' } }))).toThrow(
      /semiMajorAxisKind/,
    );
  });
});

describe('reviewOffsets(document, { onProgress })', () => {
  it('reports the Monte Carlo draws over every dispersed spacecraft, increasing to the total, without changing the report', () => {
    const calls: [number, number][] = [];
    const doc = load('kestrel-block-a.review.json');
    const withProgress = reviewOffsets(doc, {
      monteCarloRuns: 1000,
      onProgress: (done, total) => {
        calls.push([done, total]);
      },
    });
    const dispersed = withProgress.spacecraft.filter((f) => f.dispersion).length;
    expect(calls.length).toBeGreaterThan(0);
    expect(calls.every(([, total]) => total === 1000 * dispersed)).toBe(true);
    expect(calls.every(([done], k) => k === 0 || done > calls[k - 1]![0])).toBe(true);
    expect(calls.at(-1)![0]).toBe(1000 * dispersed);
    expect(withProgress).toEqual(reviewOffsets(doc, { monteCarloRuns: 1000 }));
  });
});
