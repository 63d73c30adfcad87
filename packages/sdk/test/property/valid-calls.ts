/**
 * One valid call per public function (arguments built fresh on each use), so the property test can
 * damage a call that works — one argument replaced, one nested field replaced or removed, trailing
 * arguments dropped — instead of only throwing noise at the first argument. Functions without an
 * entry are still covered by the arbitrary-argument property; this table only adds depth.
 * Values are the invented scenario's (fictional satellites and files from the fixtures).
 */
import { readFileSync } from 'node:fs';
import {
  analyzeStability,
  BUNDLED_LEAP_SECONDS,
  ClockKalmanFilter,
  createTimeScales,
  GPS_ICD,
  IERS_2010,
  Instant,
  instantFromTtSecondsSinceJ2000,
  integrateProperTime,
  type KeplerianBroadcastEphemeris,
  LineSplitter,
  PreciseCorrectionStream,
  parseRinexClock,
  parseRinexNav,
  parseSp3,
  planFleet,
  planSteering,
  RinexClockParser,
  RinexClockSeriesCollector,
  RinexNavParser,
  Sp3Parser,
  simulateClock,
  steeringPlanToJson,
} from '../../src/index.js';

const fixture = (path: string): string =>
  readFileSync(new URL(`../../../../test/fixtures/${path}`, import.meta.url), 'utf8');
const example = (path: string): unknown =>
  JSON.parse(readFileSync(new URL(`../../examples/${path}`, import.meta.url), 'utf8'));

const A = 26_560_000;
const ELEMENTS = {
  semiMajorAxis: A,
  eccentricity: 0.01,
  inclination: 0.96,
  raan: 1,
  argumentOfPerigee: 0.5,
  meanAnomaly: 2,
};
const STATE = { position: [A, 0, 0], velocity: [0, 3874, 100] };
const Q2 = { q1: 1e-22, q2: 1e-30 };
const Q3 = { q1: 1e-22, q2: 1e-30, q3: 1e-40 };
const PHASE = Array.from({ length: 64 }, (_, i) => 1e-9 * Math.sin(i * 1.7) + 1e-11 * i);
const TIMES = PHASE.map((_, i) => i * 30);
const ESTIMATE = {
  t: 0,
  state: [1e-9, 1e-12],
  covariance: [
    [1e-18, 0],
    [0, 1e-24],
  ],
};
const NAV_TEXT = fixture('rinex-nav/mixed-v305.rnx');
const SP3_TEXT = fixture('sp3/orbit-c-pv.sp3');
const CLK_TEXT = fixture('rinex-clock/fictional-304.clk');
const SCENARIO = example('steering/orin-3-meo.json');
const REVIEW = example('review/kestrel-block-a.review.json');

let fleetPlanCache: unknown;
/** `planFleet` of the VESPER example fleet (invented), built once. */
const fleetPlan = (): unknown => {
  fleetPlanCache ??= planFleet(example('fleet/vesper-constellation.json'));
  return fleetPlanCache;
};

/** Epoch of the pass-prediction calls (invented). */
const passEpoch = (): Instant => createTimeScales(BUNDLED_LEAP_SECONDS).parseIso('2027-03-01T00:00:00Z', 'UTC');

let cache:
  | { eph: KeplerianBroadcastEphemeris; rows: unknown; plan: unknown; clk: unknown; properTime: unknown }
  | undefined;
/** Expensive valid inputs, built once. */
function built(): NonNullable<typeof cache> {
  if (!cache) {
    const nav = parseRinexNav(NAV_TEXT);
    const clk = parseRinexClock(CLK_TEXT);
    cache = {
      eph: nav.ephemerides.find((e) => e.system === 'G') ?? nav.ephemerides[0]!,
      rows: analyzeStability({ phase: simulateClock({ samples: 256, tau0: 1, q: Q2, seed: 3 }).phase, tau0: 1 }).rows,
      plan: planSteering(SCENARIO),
      clk,
      properTime: integrateProperTime(STATE as never, 1200, 600, { model: 'point-mass' }),
    };
  }
  return cache;
}

const leapSpec = (): unknown => ({
  entries: BUNDLED_LEAP_SECONDS.entries.map((e) => ({ ...e })),
  validUntilMjd: BUNDLED_LEAP_SECONDS.validUntilMjd,
  source: 'bundled table (test copy)',
});

/** Valid argument lists keyed by export name. */
export const VALID_CALLS: Readonly<Record<string, () => unknown[]>> = {
  relativisticConstantF: () => [3.986004418e14],
  constantSet: () => ['gps-icd'],
  defineConstantSet: () => [{ name: 'mission', gm: 3.9860044e14 }, { base: GPS_ICD }],
  calendarDateFromMjd: () => [61_000],
  daysInMonth: () => [2028, 2],
  isGregorianLeapYear: () => [2028],
  mjdFromCalendarDate: () => [2027, 3, 1],
  defineLeapSecondTable: () => [leapSpec()],
  parseLeapSecondsList: () => [fixture('time/leap-seconds-test.list'), 'leap.list'],
  instantFromWeekSeconds: () => ['GPS', 2300, 345_600, 1e-12],
  resolveBroadcastWeek: () => [200, 10, 2300],
  resolveBroadcastWeekNear: () => ['GPS', 200, 10, Instant.fromTaiSeconds(8e8)],
  weekSecondsFromInstant: () => [Instant.fromTaiSeconds(8e8), 'GPS'],
  createTimeScales: () => [BUNDLED_LEAP_SECONDS],
  fileTimeScale: () => ['GAL'],
  instantFromFileEpoch: () => [
    createTimeScales(BUNDLED_LEAP_SECONDS),
    { year: 2026, month: 1, day: 4, hour: 0, minute: 0, second: 0.0000001 },
    'GPS',
  ],
  formatFileEpoch: () => [createTimeScales(BUNDLED_LEAP_SECONDS), Instant.fromTaiParts(8e8, 0.25), 'GLO'],
  scaleSecondsFromInstant: () => [Instant.fromTaiParts(8e8, 0.25), 'BDT'],
  instantFromScaleSeconds: () => [1.4e9, 'GST'],
  keplerTolerance: () => [2],
  solveKepler: () => [2, 0.01],
  eccentricToTrueAnomaly: () => [2, 0.01],
  trueToEccentricAnomaly: () => [2, 0.01],
  eccentricToMeanAnomaly: () => [2, 0.01],
  meanMotion: () => [A, IERS_2010.gm],
  orbitalPeriod: () => [A, IERS_2010.gm],
  elementsToState: () => [ELEMENTS, IERS_2010.gm],
  stateToElements: () => [STATE, IERS_2010.gm],
  requireKeplerianElements: () => [ELEMENTS, 'orbit'],
  requireStateVector: () => [STATE, 'state'],
  propagateKepler: () => [ELEMENTS, 3600, IERS_2010.gm],
  propagateKeplerState: () => [ELEMENTS, 3600, IERS_2010.gm],
  geodeticToEcef: () => [{ latitude: 0.73, longitude: 0.4, height: 620 }],
  elevationFromStation: () => [{ latitude: 0.73, longitude: 0.4, height: 620 }, [2e7, 1e7, 1.5e7]],
  earthRotationAngle: () => [passEpoch(), createTimeScales(BUNDLED_LEAP_SECONDS)],
  j2SecularRates: () => [ELEMENTS, { constants: IERS_2010 }],
  propagateJ2Secular: () => [ELEMENTS, 3600, { constants: IERS_2010 }],
  satellitePositionEcef: () => [{ elements: ELEMENTS, epoch: passEpoch() }, passEpoch().plus(600)],
  predictPasses: () => [
    { elements: ELEMENTS, epoch: passEpoch() },
    [{ position: { latitude: 0.73, longitude: 0.4, height: 620 }, elevationMask: 0.17 }],
    passEpoch(),
    43_200,
    { stepSeconds: 120 },
  ],
  systemConstants: () => ['G'],
  weekCrossover: () => [400_000],
  isBeidouGeostationary: () => ['C03'],
  evaluateBroadcastEphemeris: () => [built().eph, built().eph.toe.plus(600)],
  selectEphemeris: () => [[built().eph], built().eph.toe.plus(600)],
  isBroadcastSignal: () => ['L1C/A'],
  signalClockCorrection: () => [built().eph, 1e-4, 'iono-free'],
  signalClockSource: () => ['iono-free'],
  signalsOf: () => ['G'],
  integrateDop853: () => [(_t: number, y: readonly number[]) => [-y[0]!], 0, [1], 10, { relativeTolerance: 1e-10 }],
  createGravityField: () => ['full', { epoch: instantFromTtSecondsSinceJ2000(8e8) }],
  pointMassPotential: () => [[A, 0, 0], IERS_2010.gm],
  j2Potential: () => [[A, 0, 1e6], { constants: IERS_2010 }],
  thirdBodyTidalPotential: () => [[A, 0, 0], [3.8e8, 0, 0], 4.9e12],
  thirdBodyAcceleration: () => [[A, 0, 0], [3.8e8, 0, 0], 4.9e12],
  sunPositionLowPrecision: () => [instantFromTtSecondsSinceJ2000(8e8), 'mean-of-date'],
  moonPositionLowPrecision: () => [instantFromTtSecondsSinceJ2000(8e8), 'mean-of-date'],
  requireReferenceClock: () => ['reference', 'tt'],
  meanClockRate: () => [A, { constants: GPS_ICD, reference: 'tt' }],
  instantaneousClockRate: () => [STATE, { constants: IERS_2010 }],
  rateChangeForSemiMajorAxisChange: () => [A, A + 1000, { constants: IERS_2010 }],
  semiMajorAxisForMeanRate: () => [4.4647e-10, { constants: IERS_2010 }],
  periodicCorrectionFromElements: () => [A, 0.01, 2, { constants: IERS_2010 }],
  periodicCorrectionFromState: () => [STATE],
  periodicAmplitude: () => [A, 0.01, { constants: IERS_2010 }],
  periodicCorrectionAtMeanAnomaly: () => [A, 0.01, 2, { constants: IERS_2010 }],
  lagrangeDerivativeAtNode: () => [[0, 900, 1800, 2700], [1, 2, 4, 8], 1],
  lagrangeInterpolate: () => [[0, 900, 1800, 2700], [1, 2, 4, 8], 1000],
  integrateProperTime: () => [STATE, 3600, 600, { model: 'point-mass' }],
  boundStateCheck: () => [STATE, { model: 'j2' }],
  ttSecondsSinceJ2000: () => [Instant.fromTaiParts(536_500_800, 0.25)],
  instantFromTtSecondsSinceJ2000: () => [8e8],
  properTimeSampleState: () => [built().properTime, 1],
  j2ResidualPeriodicTerm: () => [A, 0.96, 1, { constants: IERS_2010 }],
  j2TotalPeriodicTerm: () => [A, 0.96, 1, { constants: IERS_2010 }],
  j2PeriodicAmplitudes: () => [A, 0.96, { constants: IERS_2010 }],
  osculatingMinusMeanSemiMajorAxis: () => [A, 0.96, 1, { constants: IERS_2010 }],
  j2SecularClockRate: () => [
    { semiMajorAxis: A, eccentricity: 0, inclination: 0.96, semiMajorAxisKind: 'mean' },
    { constants: IERS_2010 },
  ],
  j2SecularClockRateFromState: () => [STATE, { constants: IERS_2010 }],
  normalGravityPotential: () => [0.7, 100],
  normalGravity: () => [0.7],
  groundClockRate: () => [{ latitude: 0.7, longitude: -1.8, height: 1600 }, { constants: IERS_2010 }],
  tcgRateVsTT: () => [{ constants: IERS_2010 }],
  lunarClockRate: () => [{ location: 'orbit', orbitRadius: 1_837_400 }, { constants: IERS_2010 }],
  periodicCorrectionFromElementsBatch: () => [
    A,
    0.01,
    Float64Array.of(0, 1, 2),
    { constants: IERS_2010, out: new Float64Array(3) },
  ],
  periodicCorrectionOnTimeGrid: () => [
    { semiMajorAxis: A, eccentricity: 0.01, meanAnomalyAtStart: 1 },
    { stepSeconds: 60, count: 4 },
    { constants: IERS_2010, out: new Float64Array(4) },
  ],
  periodicCorrectionFromStatesBatch: () => [Float64Array.of(A, 0, 0, 0, 3874, 100), { out: new Float64Array(1) }],
  j2PeriodicTermBatch: () => [
    A,
    0.96,
    Float64Array.of(0, 1, 2),
    'residual',
    { constants: IERS_2010, out: new Float64Array(3) },
  ],
  j2PeriodicTermFromStatesBatch: () => [
    Float64Array.of(A, 0, 0, 0, 3874, 100),
    'total',
    { constants: IERS_2010, out: new Float64Array(1) },
  ],
  offsetFrequency: () => [10.23e6, -4.4647e-10],
  requireFractionalOffset: () => ['offset', -4.4647e-10],
  nearestTuningWord: () => [{ targetFrequency: 10e6, clockFrequency: 100e6, bits: 32 }],
  tuningWordFrequency: () => [28_794_890_104_583n, 100e6, 48],
  fractionalResolution: () => [100e6, 48, 10.23e6],
  reviewOffsets: () => [REVIEW, { monteCarloRuns: 20, seed: 1 }],
  configuredFraction: () => [{ fractionalOffset: -4.4647e-10 }, 10.23e6],
  parseReviewInput: () => [REVIEW],
  phaseFromFrequency: () => [PHASE.map((x) => x * 1e-3), 30],
  frequencyFromPhase: () => [PHASE, 30],
  toPhaseSeries: () => [{ phase: PHASE, tau0: 30 }],
  octaveFactors: () => [32],
  factorsForTaus: () => [[30, 60, 120], 30],
  overlappingAllanEdf: () => ['WFM', 64, 4],
  equivalentDegreesOfFreedom: () => ['oadev', 'WFM', 64, 4, 57],
  chiSquareInterval: () => [1e-12, 20, 0.68],
  noiseForAlpha: () => [0],
  deviations: () => ['oadev', { phase: PHASE, tau0: 30 }, { taus: [30, 60] }],
  identifyNoise: () => [{ phase: PHASE, tau0: 30 }, { taus: [30, 60] }],
  analyzeStability: () => [
    { phase: PHASE, tau0: 30 },
    { statistics: ['oadev', 'mdev'], confidence: 0.9 },
  ],
  maxAveragingFactor: () => ['oadev', 64],
  validateScenario: () => [SCENARIO],
  noiseToDiffusion: () => [{ q1: 1e-22, q2: 1e-30, q3: 0 }],
  planSteering: () => [SCENARIO, { method: 'deadband' }],
  steeringCost: () => [SCENARIO, built().plan],
  predictSteering: () => [SCENARIO, (built().plan as { commands: unknown }).commands],
  steeringPlanToJson: () => [built().plan, {}],
  fleetPlanToJson: () => [fleetPlan(), {}],
  steeringCommandsFromJson: () => [steeringPlanToJson(built().plan as never).commands, { field: 'plan.commands' }],
  simulatePlan: () => [SCENARIO, built().plan, { runs: 4, seed: 7 }],
  sagnacCorrection: () => [
    [A, 0, 0],
    [6_378_137, 0, 0],
  ],
  sagnacDelayForArea: () => [1e13],
  maximumSagnacCorrection: () => [6_378_137, A],
  shapiroDelay: () => [6_378_137, A, 2.2e7],
  shapiroDelayBetween: () => [
    [A, 0, 0],
    [6_378_137, 0, 0],
  ],
  solveLightTimeInertial: () => [0, [6_378_137, 0, 0], () => [A, 0, 0]],
  solveLightTimeEarthFixed: () => [0, [6_378_137, 0, 0], () => [A, 0, 0]],
  parsePhaseText: () => ['0 0\n1 1e-9\n2 2e-9\n', { sourceName: 'p.txt' }],
  parseRinexClock: () => [CLK_TEXT, { sourceName: 'c.clk' }],
  rinexClockSeries: () => [built().clk, (built().clk as { records: { name: string }[] }).records[0]!.name],
  parseFortranReal: () => ['0.1234D-05'],
  parseRinexNav: () => [NAV_TEXT],
  parseSp3: () => [SP3_TEXT],
  clockTransitionMatrix: () => [30, 3],
  clockProcessNoise: () => [30, Q3, 3],
  qFromH: () => [{ h0: 1e-22, hMinus2: 1e-30 }],
  hFromQ: () => [Q3],
  allanVarianceFromQ: () => [30, Q2],
  hadamardVarianceFromQ: () => [30, Q3],
  diffusionFromStabilitySpec: () => [{ randomWalkFrequency: { tau: 86_400, deviation: 1e-14 } }],
  fitDiffusion: () => [
    [30, 300, 3000, 30_000].map((tau) => ({
      tau,
      deviation: 1e-12 / Math.sqrt(tau) + 1e-16 * Math.sqrt(tau),
      kind: 'allan',
    })),
  ],
  fitClockPolynomial: () => [{ epoch: passEpoch(), t: TIMES, phase: PHASE }, { degree: 2 }],
  runClockFilter: () => [
    { epoch: passEpoch(), phase: PHASE, variance: 1e-20, tau0: 30 },
    { q: Q2, states: 2 },
  ],
  forecastClock: () => [ESTIMATE, Q2, [3600]],
  applyClockStep: () => [ESTIMATE, { phase: -1e-9, frequency: -1e-12 }],
  simulateClock: () => [{ samples: 64, tau0: 1, q: Q2, seed: 1, measurementNoise: 1e-11 }],
  diffusionFromStabilityRows: () => [built().rows, { states: 2 }],
  measurementNoiseFromPhase: () => [PHASE],
  characterizeClock: () => [
    { epoch: passEpoch(), phase: PHASE, t: TIMES, tau0: 30 },
    { degree: 1, measurementSigma: 1e-11, maxPasses: 1 },
  ],
  clockMeasurementNoise: () => [1e-11, undefined],
  correctPhaseJumps: () => [
    { epoch: passEpoch(), t: TIMES, phase: PHASE },
    { jumps: [], rejected: [3] },
  ],
  polynomialNoiseCovariance: () => [
    { epoch: passEpoch(), t: TIMES.slice(0, 16) },
    { degree: 1, referenceTime: 0, q: Q2, measurementVariance: 4e-20 },
  ],
};

/**
 * A fresh valid instance of each exported class (and of the object createTimeScales returns), whose
 * methods the property test calls with hostile arguments. Classes without an entry still get their
 * constructor and static methods tested.
 */
export const INSTANCES: Readonly<Record<string, () => object>> = {
  Instant: () => Instant.fromTaiSeconds(8e8),
  LineSplitter: () => new LineSplitter(),
  RinexNavParser: () => new RinexNavParser({ sourceName: 'n.rnx' }),
  Sp3Parser: () => new Sp3Parser({ sourceName: 'o.sp3' }),
  PreciseCorrectionStream: () => new PreciseCorrectionStream({ epochInterval: 900 }),
  ClockKalmanFilter: () => new ClockKalmanFilter({ epoch: passEpoch(), q: Q2, initial: ESTIMATE }),
  RinexClockParser: () => new RinexClockParser({ sourceName: 'c.clk' }),
  RinexClockSeriesCollector: () => new RinexClockSeriesCollector('c.clk', 'G05'),
  'createTimeScales()': () => createTimeScales(BUNDLED_LEAP_SECONDS),
};

/** Valid arguments of the generator and async exports (text sources as strings, arrays or async chunk streams). */
export const VALID_STREAM_CALLS: Readonly<Record<string, () => unknown[]>> = {
  linesOf: () => ['a\nb\n'],
  readLines: () => ['a\nb\n'],
  readLineBatches: () => [['a\n', 'b\n']],
  readPhaseText: () => ['0 0\n1 1e-9\n2 2e-9\n', { sourceName: 'p.txt' }],
  readPhaseTextSeries: () => ['0 0\n1 1e-9\n2 2e-9\n', { sourceName: 'p.txt' }],
  readRinexClock: () => [CLK_TEXT, { sourceName: 'c.clk' }],
  readRinexClockSeries: () => [
    CLK_TEXT,
    (parseRinexClock(CLK_TEXT).records[0] as { name: string }).name,
    { sourceName: 'c.clk' },
  ],
  readRinexNav: () => [NAV_TEXT],
  readSp3: () => [SP3_TEXT],
  preciseRelativisticCorrections: () => [parseSp3(SP3_TEXT).epochs, { epochInterval: 900 }],
};
