/**
 * The typed errors at the public boundary that the hostile-input review asked for by name: null or
 * non-object options, the review's Monte Carlo settings, absurd magnitudes, the kilometre hint and
 * malformed constant sets. Each check asserts the error class, the field it names and its range.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  analyzeStability,
  boundStateCheck,
  ClockKalmanFilter,
  characterizeClock,
  createGravityField,
  defineConstantSet,
  deviations,
  elementsToState,
  evaluateBroadcastEphemeris,
  fitClockPolynomial,
  GPS_ICD,
  groundClockRate,
  IERS_2010,
  InvalidArgumentError,
  identifyNoise,
  integrateProperTime,
  j2Potential,
  j2SecularClockRate,
  j2SecularRates,
  meanClockRate,
  meanMotion,
  moonPositionLowPrecision,
  parseRinexNav,
  periodicCorrectionFromElements,
  periodicCorrectionFromStatesBatch,
  periodicCorrectionOnTimeGrid,
  planSteering,
  propagateJ2Secular,
  reviewOffsets,
  runClockFilter,
  selectEphemeris,
  simulateClock,
  simulatePlan,
  sunPositionLowPrecision,
  tcgRateVsTT,
  tuningWordFrequency,
} from '../../src/index.js';
import { EPOCH } from '../clock-model/test-epoch.js';

const example = (path: string): Record<string, unknown> =>
  JSON.parse(readFileSync(new URL(`../../examples/${path}`, import.meta.url), 'utf8')) as Record<string, unknown>;
const REVIEW = example('review/kestrel-block-a.review.json');
const SCENARIO = example('steering/orin-3-meo.json');
const PHASE = { phase: Array.from({ length: 40 }, (_, i) => 1e-9 * Math.sin(i)), tau0: 1 };
const STATE = { position: [26_560_000, 0, 0] as const, velocity: [0, 3874, 0] as const };
const ORBIT = { semiMajorAxis: 26_560_000, eccentricity: 0.01, inclination: 0.96, semiMajorAxisKind: 'mean' as const };
const MEAN_ELEMENTS = { ...ORBIT, raan: 1, argumentOfPerigee: 0.5, meanAnomaly: 2 };

/** Runs `call` and returns the InvalidArgumentError it must throw. */
function invalid(call: () => unknown): InvalidArgumentError {
  try {
    call();
  } catch (error) {
    expect(error).toBeInstanceOf(InvalidArgumentError);
    return error as InvalidArgumentError;
  }
  throw new Error('expected an InvalidArgumentError, the call returned');
}

describe('null or non-object options name the argument (common practice, no source)', () => {
  const cases: [string, (o: unknown) => unknown][] = [
    ['analyzeStability', (o) => analyzeStability(PHASE, o as never)],
    ['deviations', (o) => deviations('oadev', PHASE, o as never)],
    ['identifyNoise', (o) => identifyNoise(PHASE, o as never)],
    ['integrateProperTime', (o) => integrateProperTime(STATE, 3600, 600, o as never)],
    ['reviewOffsets', (o) => reviewOffsets(REVIEW, o as never)],
    [
      'fitClockPolynomial',
      (o) => fitClockPolynomial({ epoch: EPOCH, t: [0, 1, 2, 3], phase: [0, 1e-9, 2e-9, 4e-9] }, o as never),
    ],
    ['simulatePlan', (o) => simulatePlan(SCENARIO, { commands: [] }, o as never)],
    ['groundClockRate', (o) => groundClockRate({ latitude: 0.7, longitude: 0, height: 0 }, o as never)],
    ['createGravityField', (o) => createGravityField('j2', o as never)],
    ['meanClockRate', (o) => meanClockRate(26_560_000, o as never)],
  ];
  it.each(cases)('%s(..., null) and (..., 7) throw InvalidArgumentError naming options', (_name, call) => {
    for (const bad of [null, 7, 'options', [1]]) {
      const error = invalid(() => call(bad));
      expect(error.argument).toBe('options');
    }
  });
});

describe('reviewOffsets options', () => {
  it('reviewOffsets(review, { monteCarloRuns }) refuses 0, 2.5 and 2e7, naming the integer range [1, 10000000]', () => {
    for (const runs of [0, 2.5, 2e7, Number.NaN]) {
      const error = invalid(() => reviewOffsets(REVIEW, { monteCarloRuns: runs }));
      expect(error.argument).toBe('options.monteCarloRuns');
      expect(error.message).toContain('an integer in [1, 10000000]');
    }
  });
  it('reviewOffsets(review, { marginalFraction }) refuses 0, 1.5 and NaN, naming the range (0, 1]', () => {
    for (const fraction of [0, 1.5, Number.NaN, -0.2]) {
      const error = invalid(() => reviewOffsets(REVIEW, { marginalFraction: fraction }));
      expect(error.argument).toBe('options.marginalFraction');
      expect(error.message).toContain('in (0, 1]');
    }
  });
  it('reviewOffsets(review with a tuning word clocked at 1e300 Hz) names the field and the 1 Hz..1 THz range', () => {
    const spacecraft = (REVIEW.spacecraft as Record<string, unknown>[]).map((sc, i) =>
      i !== 2 ? sc : { ...sc, configured: { tuningWord: { word: '28794890104583', clockHz: 1e300, bits: 48 } } },
    );
    const error = invalid(() => reviewOffsets({ ...REVIEW, spacecraft }));
    expect(error.argument).toBe('spacecraft[2].configured.tuningWord.clockHz');
    expect(error.message).toContain('[1, 1000000000000] Hz');
  });
});

describe('absurd magnitudes give typed errors, never NaN or Infinity', () => {
  it('simulateClock({ tau0 }) refuses 1e300 s, 0 s and 1e-12 s, naming the range [1e-9, 1e9] s', () => {
    for (const tau0 of [1e300, 0, 1e-12, Number.POSITIVE_INFINITY]) {
      const error = invalid(() => simulateClock({ samples: 16, tau0, q: { q1: 1e-22, q2: 1e-30 }, seed: 1 }));
      expect(error.argument).toBe('tau0');
      expect(error.message).toContain('in [1e-9, 1000000000] s');
    }
  });
  it('tuningWordFrequency(word, 1e300 Hz, 48) refuses the clock frequency', () => {
    expect(invalid(() => tuningWordFrequency(1n, 1e300, 48)).argument).toBe('clockFrequency');
  });
  it('meanMotion(1e300 m, GM), deviations on 1e300 s phase and a 1e300 s step refuse the value instead of returning Infinity', () => {
    expect(invalid(() => meanMotion(1e300, IERS_2010.gm)).argument).toBe('semiMajorAxis');
    expect(invalid(() => deviations('oadev', { phase: [0, 1e300, 0, 1, 2, 3], tau0: 1 })).argument).toBe(
      'data.phase[1]',
    );
    expect(invalid(() => integrateProperTime(STATE, 1e300, 1e300 / 2)).argument).toBe('duration');
  });
  it('planSteering(null) and planSteering(scenario, null) throw InvalidArgumentError', () => {
    invalid(() => planSteering(null));
    invalid(() => planSteering(SCENARIO, null as never));
  });
});

describe('kilometres given for metres', () => {
  it('elementsToState({ semiMajorAxis: 26 560 }, GM) gives the same kilometre hint as meanClockRate(26 560)', () => {
    const fromElements = invalid(() =>
      elementsToState({ ...ORBIT, raan: 0, argumentOfPerigee: 0, meanAnomaly: 0, semiMajorAxis: 26_560 }, IERS_2010.gm),
    );
    const fromRate = invalid(() => meanClockRate(26_560));
    expect(fromElements.argument).toBe('elements.semiMajorAxis');
    expect(fromElements.hint).toBe('26560 m is inside the Earth; did you mean 26560 km = 26560000 m?');
    expect(fromElements.hint).toBe(fromRate.hint);
  });
});

describe('requireConstantSet at every function that takes constants (IERS Conventions 2010 Table 1.1 ranges [V2])', () => {
  it('j2SecularClockRate(orbit, { constants: {} }) and tcgRateVsTT({ constants: {} }) throw InvalidArgumentError instead of returning NaN', () => {
    expect(invalid(() => j2SecularClockRate(ORBIT, { constants: {} as never })).argument).toBe(
      'options.constants.name',
    );
    expect(invalid(() => tcgRateVsTT({ constants: {} as never })).argument).toBe('options.constants.name');
  });
  it('a set with gm NaN, lG Infinity or a stale relativisticF is refused naming the field and its range', () => {
    const gm = invalid(() => tcgRateVsTT({ constants: { ...IERS_2010, gm: Number.NaN } }));
    expect(gm.argument).toBe('options.constants.gm');
    expect(gm.message).toContain('in [390000000000000, 410000000000000] m³/s²');
    expect(
      invalid(() =>
        periodicCorrectionFromElements(26_560_000, 0.01, 1, {
          constants: { ...IERS_2010, lG: Number.POSITIVE_INFINITY },
        }),
      ).argument,
    ).toBe('options.constants.lG');
    expect(invalid(() => meanClockRate(26_560_000, { constants: { ...IERS_2010, gm: 3.9861e14 } })).argument).toBe(
      'options.constants.relativisticF',
    );
  });
  it('tcgRateVsTT({ constants: IERS_2010 }) still returns L_G/(1 − L_G) = 6.969290134e-10 to 1e-18 (IERS Conventions 2010 §10.1 [V1])', () => {
    expect(Math.abs(tcgRateVsTT({ constants: IERS_2010 }) - 6.969290134e-10 / (1 - 6.969290134e-10))).toBeLessThan(
      1e-25,
    );
    expect(Math.abs(tcgRateVsTT({ constants: IERS_2010 }) - 6.969290134e-10)).toBeLessThan(1e-18);
  });
});

describe('one options convention: a constant set is { constants } in the trailing options, never positional', () => {
  it('a set passed where the options go (the old positional form) is refused with a hint, never replaced by the default', () => {
    const calls: [string, () => unknown][] = [
      ['tcgRateVsTT', () => tcgRateVsTT(GPS_ICD as never)],
      ['periodicCorrectionFromElements', () => periodicCorrectionFromElements(26_560_000, 0.01, 1, GPS_ICD as never)],
      ['j2SecularClockRate', () => j2SecularClockRate(ORBIT, GPS_ICD as never)],
      ['meanClockRate', () => meanClockRate(26_560_000, GPS_ICD as never)],
      ['j2Potential', () => j2Potential([26_560_000, 0, 0], GPS_ICD as never)],
      ['createGravityField', () => createGravityField('j2', GPS_ICD as never)],
      ['j2SecularRates', () => j2SecularRates(MEAN_ELEMENTS, GPS_ICD as never)],
      ['propagateJ2Secular', () => propagateJ2Secular(MEAN_ELEMENTS, 3600, GPS_ICD as never)],
      [
        'periodicCorrectionOnTimeGrid',
        () =>
          periodicCorrectionOnTimeGrid(
            { semiMajorAxis: 26_560_000, eccentricity: 0.01, meanAnomalyAtStart: 0 },
            { stepSeconds: 60, count: 2 },
            GPS_ICD as never,
          ),
      ],
    ];
    for (const [name, call] of calls) {
      const e = invalid(call);
      expect(e.argument, name).toBe('options');
      expect(e.hint, name).toBe('a constant set goes in the options: { constants: set }');
    }
  });
  it('periodicCorrectionOnTimeGrid(orbit, grid, { constants }) checks the set with requireConstantSet (it checked gm and F only, so an F that disagrees with gm passed)', () => {
    const e = invalid(() =>
      periodicCorrectionOnTimeGrid(
        { semiMajorAxis: 26_560_000, eccentricity: 0.01, meanAnomalyAtStart: 0 },
        { stepSeconds: 60, count: 2 },
        { constants: { ...IERS_2010, relativisticF: -4.4e-10 } },
      ),
    );
    expect(e.argument).toBe('options.constants.relativisticF');
  });
  it('defineConstantSet(overrides, set) (the old positional base) is refused with a hint to write { base: set }', () => {
    const e = invalid(() => defineConstantSet({ name: 'mission' }, GPS_ICD as never));
    expect(e.argument).toBe('options');
    expect(e.hint).toBe('a base set goes in the options: { base: set }');
    expect(invalid(() => defineConstantSet({ name: 'mission' }, { base: { ...GPS_ICD, gm: 1 } })).argument).toBe(
      'options.base.gm',
    );
  });
  it("an output array passed where the options go is refused with a hint, so the caller's buffer is never silently left unfilled", () => {
    const e = invalid(() =>
      periodicCorrectionFromStatesBatch(new Float64Array(6).fill(7e6), new Float64Array(1) as never),
    );
    expect(e.argument).toBe('options');
    expect(e.hint).toBe('an output array goes in the options: { out: array }');
  });
  it('{ constants: GPS_ICD } gives the GPS value and omitted options the IERS 2010 one (IS-GPS-200 μ and IERS GM differ by 1.5e-7, F by 7e-8)', () => {
    const gps = periodicCorrectionFromElements(26_560_000, 0.01, 1, { constants: GPS_ICD });
    const iers = periodicCorrectionFromElements(26_560_000, 0.01, 1);
    expect(iers).toBe(periodicCorrectionFromElements(26_560_000, 0.01, 1, {}));
    expect(gps).not.toBe(iers);
    expect(Math.abs(gps / iers - Math.sqrt(GPS_ICD.gm / IERS_2010.gm))).toBeLessThan(1e-15);
  });
});

describe('an orbit or relativity entry point given its epoch as a bare number names the field and says how to make the Instant (ADR draft orbitinst, common practice, no source)', () => {
  const cases: [string, string, (epoch: unknown) => unknown][] = [
    ['sunPositionLowPrecision', 'epoch', (epoch) => sunPositionLowPrecision(epoch as never)],
    ['moonPositionLowPrecision', 'epoch', (epoch) => moonPositionLowPrecision(epoch as never)],
    ['createGravityField', 'options.epoch', (epoch) => createGravityField('full', { epoch: epoch as never })],
    [
      'integrateProperTime',
      'options.epoch',
      (epoch) => integrateProperTime(STATE, 3600, 600, { model: 'full', epoch: epoch as never }),
    ],
    ['boundStateCheck', 'options.epoch', (epoch) => boundStateCheck(STATE, { model: 'full', epoch: epoch as never })],
  ];
  it.each(cases)(
    '%s with 8.1e8 (TT seconds since J2000.0) throws InvalidArgumentError naming %s with the instantFromTtSecondsSinceJ2000 hint',
    (_name, field, call) => {
      const error = invalid(() => call(8.1e8));
      expect(error.argument).toBe(field);
      expect(error.expected).toBe('an Instant, not a number of seconds');
      expect(error.hint).toMatch(/parseIso\('2027-03-01T00:00:00', 'TT'\).*instantFromTtSecondsSinceJ2000\(seconds\)/);
    },
  );
  it("createGravityField(model, { epochTtSecondsSinceJ2000 }) (the former option) is refused naming it, with the new option's name", () => {
    const error = invalid(() => createGravityField('full', { epochTtSecondsSinceJ2000: 8.1e8 } as never));
    expect(error.argument).toBe('options.epochTtSecondsSinceJ2000');
    expect(error.hint).toBe('write { epoch: instantFromTtSecondsSinceJ2000(810000000) } (@tauline/sdk/time)');
  });
});

describe('a clock-model entry point without its epoch names the field and says how to give one (ADR 23, common practice, no source)', () => {
  const t = [0, 300, 600, 900, 1200, 1500, 1800, 2100, 2400, 2700, 3000, 3300, 3600, 3900, 4200, 4500];
  const phase = t.map((ti) => 1e-9 + 1e-13 * ti);
  const initial = {
    t: 0,
    state: [0, 0],
    covariance: [
      [1e-18, 0],
      [0, 1e-24],
    ],
  };
  const cases: [string, string, () => unknown][] = [
    [
      'runClockFilter',
      'series.epoch',
      () => runClockFilter({ phase, t, variance: 1e-20 } as never, { q: { q1: 1e-23, q2: 1e-31 } }),
    ],
    ['characterizeClock', 'record.epoch', () => characterizeClock({ phase, t, tau0: 300 } as never)],
    ['fitClockPolynomial', 'series.epoch', () => fitClockPolynomial({ phase, t } as never)],
    ['ClockKalmanFilter', 'epoch', () => new ClockKalmanFilter({ q: { q1: 1e-23, q2: 1e-31 }, initial } as never)],
  ];
  it.each(cases)(
    '%s without an epoch throws InvalidArgumentError naming %s with the parseIso hint',
    (_name, field, call) => {
      const error = invalid(call);
      expect(error.argument).toBe(field);
      expect(error.message).toMatch(/required.*parseIso\('2027-02-08T06:00:00', 'GPS'\)/);
    },
  );
});

describe('a broadcast-orbit entry point given seconds for an Instant names the argument and says how to build one (issue 16, common practice, no source)', () => {
  const nav = parseRinexNav(
    readFileSync(new URL('../../../../test/fixtures/rinex-nav/mixed-v305.rnx', import.meta.url), 'utf8'),
  );
  const eph = nav.ephemerides[0]!;
  /** The former float count of seconds since 1980-01-06 for the record's t_oe (GPS week 2296 + 0 s). */
  const seconds = 2296 * 604800 + 600;
  const cases: [string, string, () => unknown][] = [
    ['evaluateBroadcastEphemeris', 'time', () => evaluateBroadcastEphemeris(eph, seconds as never)],
    ['selectEphemeris', 'time', () => selectEphemeris([eph], seconds as never)],
  ];
  it.each(cases)(
    '%s(…, seconds since 1980) throws InvalidArgumentError naming %s with the parseIso hint',
    (_name, field, call) => {
      const error = invalid(call);
      expect(error.argument).toBe(field);
      expect(error.message).toMatch(/must be an Instant .*parseIso\('2024-01-07T01:00:00', 'GPS'\)/);
    },
  );
  it('evaluateBroadcastEphemeris / selectEphemeris with a record whose t_oc or t_oe is a number name the field', () => {
    const at = eph.toe.plus(600);
    expect(invalid(() => evaluateBroadcastEphemeris({ ...eph, toe: seconds as never }, at)).argument).toBe(
      'ephemeris.toe',
    );
    expect(invalid(() => selectEphemeris([eph, { ...eph, toc: seconds as never }], at)).argument).toBe(
      'records[1].toc',
    );
  });
});
