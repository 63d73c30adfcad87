/**
 * Launch-review checks: compares the oscillator offset configured for each spacecraft with
 * the one its planned orbit needs, recognises the classic mistakes, and analyses what the
 * orbit-injection dispersion leaves for steering to absorb.
 *
 * @module
 */
import { type ConstantSet, constantSet, DEFAULT_CONSTANT_SET, SECONDS_PER_DAY } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import { MAX_SEED } from '../internal/random.js';
import { requireInRange, requireInteger, requireOptions } from '../internal/validate.js';
import { j2SecularClockRate, osculatingMinusMeanSemiMajorAxis } from '../relativity/j2.js';
import { meanClockRate, meanRateSensitivity, type RateBreakdown, type ReferenceClock } from '../relativity/rate.js';
import { analyseDispersion } from './dispersion.js';
import { fmt, mistakeDiagnoses, type OtherExpectation, offsetForRate, unexplainedDiagnosis } from './mistakes.js';
import { parseConfigured, parseReviewInput, requireNominalFrequency } from './parse.js';
import { dyadic, quantisationDiagnosis } from './tuning-word.js';
import type {
  ConfiguredOffset,
  Diagnosis,
  DispersionAnalysis,
  ReviewInput,
  ReviewReport,
  ReviewSpacecraft,
  SpacecraftFinding,
  Verdict,
} from './types.js';

/** The caution every review output carries. */
export const REVIEW_CAUTION =
  "These findings support a review; they do not replace it. Confirm every value against the mission's own interface " +
  'specification and have it approved by the responsible engineering authority before it enters a flight configuration.';

/** Options of {@link reviewOffsets}. */
export interface ReviewOptions {
  /** Fraction of the tolerance above which a passing difference is only "marginal", in (0, 1] (default 0.5). */
  readonly marginalFraction?: number;
  /** Runs of the dispersion Monte Carlo, an integer in [1, 10 000 000] (default 20 000; the bound keeps one spacecraft's draws at 80 MB). */
  readonly monteCarloRuns?: number;
  /** Seed of the dispersion Monte Carlo, an integer in [0, 2^32 − 1] (default 1), so reports are reproducible. */
  readonly seed?: number;
  /**
   * Called during the dispersion Monte Carlo with the draws done and the draws in all (over every
   * spacecraft with a dispersion), e.g. for a progress bar; at most about 200 calls per run.
   */
  readonly onProgress?: (done: number, total: number) => void;
  /** Default tolerance when neither the file nor the spacecraft gives one, in (0, 1e-6) (default 1e-12). */
  readonly defaultToleranceFractional?: number;
}

/** Most dispersion Monte Carlo runs a review accepts (80 MB of draws per spacecraft; the CLI's --runs has the same bound). */
const MAX_REVIEW_MONTE_CARLO_RUNS = 10_000_000;

/**
 * Reads the configured offset as a fraction, with the quantisation step of its form (null when exact).
 * For a tuning word, f_out = word·f_clk/2^N (DDS relation; common practice, no source); the difference
 * word·f_clk − f_nominal·2^N is formed exactly in BigInt so that 64-bit words lose nothing.
 */
export function configuredFraction(
  configuredOffset: ConfiguredOffset,
  nominalHz: number,
): { fraction: number; step: number | null } {
  requireNominalFrequency('nominalHz', nominalHz);
  const configured = parseConfigured('configured', configuredOffset, nominalHz);
  if ('fractionalOffset' in configured) return { fraction: configured.fractionalOffset, step: null };
  if ('offsetHz' in configured) return { fraction: configured.offsetHz / nominalHz, step: null };
  if ('offsetFrequencyHz' in configured)
    return { fraction: (configured.offsetFrequencyHz - nominalHz) / nominalHz, step: null };
  const { word, clockHz, bits } = configured.tuningWord;
  const c = dyadic(clockHz);
  const n = dyadic(nominalHz);
  // word·m_c·2^e_c − m_n·2^(e_n + N), brought to the smaller exponent.
  const e = Math.min(c.e, n.e + bits);
  const diff = BigInt(word) * c.m * (1n << BigInt(c.e - e)) - n.m * (1n << BigInt(n.e + bits - e));
  const diffHz = (Number(diff) * 2 ** e) / 2 ** bits;
  return { fraction: diffHz / nominalHz, step: clockHz / 2 ** bits / nominalHz };
}

/**
 * Size of the mean-rate ambiguity from osculating vs mean a under J2: the short-period amplitude
 * (3/2)J2 a_e²/a·sin²i of a_osc − ā (Brouwer 1959 [M], via {@link osculatingMinusMeanSemiMajorAxis})
 * times the rate sensitivity 3GM/(2a²c²) of {@link meanRateSensitivity} (derivative of IERS 2010 eq. 10.9 averaged).
 */
function j2Ambiguity(
  a: number,
  inclination: number,
  constants: ConstantSet,
): { metres: number; fractionalRate: number } {
  const metres = Math.abs(osculatingMinusMeanSemiMajorAxis(a, inclination, 0, { constants }));
  return { metres, fractionalRate: meanRateSensitivity(a, constants.gm) * metres };
}

/**
 * Reviews every spacecraft of a review document.
 *
 * For each: expected factory offset 1/(1+r) − 1 with r = L_G − 3GM/(2ac²) vs TT (or −3GM/(2ac²) vs TCG)
 * (IERS Conventions 2010 eq. 10.9 averaged over a Kepler orbit; Ashby 2003 §5), the configured-minus-expected
 * difference, a verdict, diagnoses of recognised mistakes (each with the value it would have produced), and a
 * dispersion analysis (rate sensitivity 3GM/(2a²c²) per metre, Ashby 2001 PTTI [V2]).
 *
 * Verdict: `fail` when |difference| > tolerance, when the best achievable tuning word cannot meet the tolerance,
 * or when the actuator range cannot absorb the worst ±3σ residual; `marginal` when the difference uses more than
 * `marginalFraction` of the tolerance, or when the tolerance is tighter than the osculating/mean-a ambiguity
 * under J2; otherwise `pass`.
 *
 * @param document A parsed review file (validated here) or an already validated {@link ReviewInput}.
 * @throws {InvalidArgumentError} naming the field path for invalid input.
 */
export function reviewOffsets(document: unknown, options: ReviewOptions = {}): ReviewReport {
  const input = parseReviewInput(document);
  const settings = readOptions(options);
  const resolved = input.spacecraft.map((sc) => resolveSpacecraft(input, sc));
  // Monte Carlo progress over all spacecraft with a dispersion: draws done before the current one, plus its own.
  const { runs, onProgress } = settings;
  const totalDraws = runs * resolved.filter((r) => r.sc.dispersion).length;
  let drawsBefore = 0;
  const progress =
    onProgress === undefined
      ? undefined
      : (done: number): void => {
          onProgress(drawsBefore + done, totalDraws);
          if (done === runs) drawsBefore += runs;
        };
  const findings = resolved.map((r, index) => reviewSpacecraft(r, index, { input, settings, resolved, progress }));
  const counts = { pass: 0, marginal: 0, fail: 0 };
  for (const f of findings) counts[f.verdict]++;
  return {
    title: input.title ?? 'Launch review of configured clock offsets',
    generatedBy: 'tauline review',
    caution: REVIEW_CAUTION,
    spacecraft: findings,
    counts,
  };
}

/** The options of {@link reviewOffsets}, checked and with their defaults. */
interface ReviewSettings {
  readonly marginalFraction: number;
  readonly runs: number;
  readonly seed: number;
  readonly defaultTolerance: number;
  readonly onProgress: ((done: number, total: number) => void) | undefined;
}

function readOptions(value: ReviewOptions): ReviewSettings {
  const options = requireOptions('options', value);
  const marginalFraction = requireInRange('options.marginalFraction', options.marginalFraction ?? 0.5, 0, 1, {
    minExclusive: true,
    unit: '(a fraction of the tolerance)',
  });
  const runs = requireInteger(
    'options.monteCarloRuns',
    options.monteCarloRuns ?? 20_000,
    1,
    MAX_REVIEW_MONTE_CARLO_RUNS,
  );
  const seed = options.seed === undefined ? 1 : requireInteger('options.seed', options.seed, 0, MAX_SEED);
  const defaultTolerance = requireInRange(
    'options.defaultToleranceFractional',
    options.defaultToleranceFractional ?? 1e-12,
    0,
    1e-6,
    { minExclusive: true, maxExclusive: true, unit: '(fractional frequency)' },
  );
  const onProgress = options.onProgress;
  if (onProgress !== undefined && typeof onProgress !== 'function') {
    throw new InvalidArgumentError('options.onProgress', onProgress, 'a function (done, total) => void (or omitted)');
  }
  return { marginalFraction, runs, seed, defaultTolerance, onProgress };
}

/** A spacecraft with its constants, reference and expected offset. */
interface ResolvedSpacecraft {
  readonly sc: ReviewSpacecraft;
  readonly set: ConstantSet;
  readonly reference: ReferenceClock;
  readonly rate: RateBreakdown;
  /** Secular J2 change of the rate (0 when the kind of a is not stated). */
  readonly j2: number;
  readonly totalRate: number;
  readonly expected: number;
}

function resolveSpacecraft(input: ReviewInput, sc: ReviewSpacecraft): ResolvedSpacecraft {
  const set = constantSet(sc.constants ?? input.constants ?? DEFAULT_CONSTANT_SET.name);
  const reference: ReferenceClock = sc.reference ?? input.reference ?? 'tt';
  const { semiMajorAxis, eccentricity = 0, inclination = 0, semiMajorAxisKind: kind, argumentOfLatitude } = sc.orbit;
  const rate = meanClockRate(semiMajorAxis, { constants: set, reference });
  // Only when the kind of a is stated (the J2 term is not applied otherwise); j2SecularClockRate refuses perigees below
  // 25 000 km. parseReviewInput has required the argument of latitude of an osculating a.
  const j2 = kind
    ? j2SecularClockRate(
        {
          semiMajorAxis,
          eccentricity,
          inclination,
          semiMajorAxisKind: kind,
          ...(argumentOfLatitude !== undefined ? { argumentOfLatitude } : {}),
        },
        { constants: set },
      ).j2Correction
    : 0;
  const totalRate = rate.fractionalRate + j2;
  return { sc, set, reference, rate, j2, totalRate, expected: offsetForRate(totalRate) };
}

interface ReviewContext {
  readonly input: ReviewInput;
  readonly settings: ReviewSettings;
  readonly resolved: readonly ResolvedSpacecraft[];
  readonly progress: ((done: number) => void) | undefined;
}

/** The expected offsets of the other spacecraft on other orbits (a copied value is a recognised mistake). */
function otherExpectations(r: ResolvedSpacecraft, resolved: readonly ResolvedSpacecraft[]): OtherExpectation[] {
  const others: OtherExpectation[] = [];
  for (const o of resolved) {
    if (o.sc.id === r.sc.id || Math.abs(o.sc.orbit.semiMajorAxis - r.sc.orbit.semiMajorAxis) <= 1) continue;
    const same = others.find((x) => Math.abs(x.offset - o.expected) <= 1e-18);
    if (same) same.id += `, ${o.sc.id}`;
    else others.push({ id: o.sc.id, offset: o.expected });
  }
  return others;
}

/** What the steering actuator can do about the error: `fails` when it cannot cover the worst ±3σ residual. */
function actuatorDiagnosis(
  dispersion: DispersionAnalysis | null,
  range: number | undefined,
  verdict: Verdict,
  difference: number,
): { diagnosis: Diagnosis; fails: boolean } | undefined {
  if (range === undefined) return undefined;
  if (dispersion && dispersion.actuatorCovers === false) {
    return {
      fails: true,
      diagnosis: {
        code: 'actuator-range',
        matches: true,
        wouldHaveProduced: null,
        message: `The worst ±3σ residual rate ${fmt(dispersion.worstResidual, 3)} exceeds the steering range ±${fmt(range, 3)}.`,
      },
    };
  }
  if (dispersion || verdict !== 'fail') return undefined;
  const absorbable = Math.abs(difference) <= range;
  return {
    fails: false,
    diagnosis: {
      code: 'actuator-range',
      matches: false,
      wouldHaveProduced: null,
      message: absorbable
        ? `In orbit, steering could absorb this error (${fmt(difference, 3)} of the ±${fmt(range, 3)} range), at the cost of that much range for the mission's life.`
        : `In orbit, steering could not absorb this error: ${fmt(difference, 3)} exceeds the steering range ±${fmt(range, 3)}.`,
    },
  };
}

/** The one-line summary of a finding. */
function summaryOf(f: {
  verdict: Verdict;
  difference: number;
  tolerance: number;
  marginalFraction: number;
  expected: number;
  configured: number;
  diagnosis: readonly Diagnosis[];
}): string {
  const { verdict, difference, tolerance, expected } = f;
  const withinTolerance = Math.abs(difference) <= tolerance;
  if (verdict === 'pass') {
    return `configured offset within ${fmt(Math.abs(difference), 2)} of the expected ${fmt(expected)} (tolerance ${fmt(tolerance, 2)})`;
  }
  if (verdict === 'marginal') {
    return withinTolerance && Math.abs(difference) <= f.marginalFraction * tolerance
      ? `within tolerance (difference ${fmt(difference, 3)}), but the kind of semi-major axis is not stated and J2 makes that matter at this tolerance`
      : `within tolerance but with little margin: difference ${fmt(difference, 3)} against tolerance ${fmt(tolerance, 2)}`;
  }
  const failedBy = f.diagnosis
    .filter((d) => d.matches && (d.code === 'actuator-range' || d.code === 'quantisation'))
    .map((d) => d.code);
  return withinTolerance
    ? `the offset is within tolerance (difference ${fmt(difference, 3)}), but the configuration fails on ${failedBy.join(' and ')}`
    : `configured ${fmt(f.configured)} differs from the expected ${fmt(expected)} by ${fmt(difference, 3)}`;
}

/** The semi-major-axis dispersion analysis of one spacecraft, or null when it states no dispersion. */
function dispersionOf(
  r: ResolvedSpacecraft,
  configured: number,
  range: number | undefined,
  index: number,
  ctx: ReviewContext,
): ReturnType<typeof analyseDispersion> | null {
  const { sc, set, reference, j2 } = r;
  const { input, settings } = ctx;
  return sc.dispersion
    ? analyseDispersion({
        a0: sc.orbit.semiMajorAxis,
        sigma: sc.dispersion.semiMajorAxisSigma,
        set,
        reference,
        j2Rate: j2,
        configured,
        actuatorRange: range ?? null,
        phaseTolerance: sc.phaseToleranceSeconds ?? input.phaseToleranceSeconds ?? null,
        runs: settings.runs,
        seed: (settings.seed + index) % (MAX_SEED + 1),
        onProgress: ctx.progress,
      })
    : null;
}

/** Reviews one spacecraft: verdict, diagnoses, J2 caveat, dispersion and summary (see {@link reviewOffsets}). */
function reviewSpacecraft(r: ResolvedSpacecraft, index: number, ctx: ReviewContext): SpacecraftFinding {
  const { sc, set, reference, rate, j2, totalRate, expected } = r;
  const { input, settings } = ctx;
  const nominal = sc.nominalFrequencyHz;
  const tolerance = sc.tolerance?.fractional ?? input.tolerance?.fractional ?? settings.defaultTolerance;
  const { fraction: configured, step } = configuredFraction(sc.configured, nominal);
  const difference = configured - expected;
  const diagnosis: Diagnosis[] = [];
  let verdict: Verdict =
    Math.abs(difference) > tolerance
      ? 'fail'
      : Math.abs(difference) > settings.marginalFraction * tolerance
        ? 'marginal'
        : 'pass';
  let explained = false;
  if (verdict !== 'pass') {
    const matched = mistakeDiagnoses(
      sc,
      set,
      reference,
      otherExpectations(r, ctx.resolved),
      configured,
      expected,
      Math.max(tolerance, step ?? 0),
    );
    diagnosis.push(...matched);
    explained = matched.length > 0;
  }
  const quantisation = quantisationDiagnosis(sc, expected, difference, step, tolerance);
  if (quantisation) {
    diagnosis.push(quantisation.diagnosis);
    if (quantisation.fails) {
      verdict = 'fail';
      explained = true;
    }
  }
  if (!explained && verdict === 'fail') diagnosis.push(unexplainedDiagnosis(sc, set, reference, configured));

  // J2: the mean rate depends on which semi-major axis (osculating or mean) was used.
  const ambiguity = j2Ambiguity(sc.orbit.semiMajorAxis, sc.orbit.inclination ?? 0, set);
  const ambiguous = !sc.orbit.semiMajorAxisKind && ambiguity.fractionalRate > 0.5 * tolerance;
  if (ambiguous && verdict === 'pass') verdict = 'marginal';
  if (ambiguous) {
    diagnosis.push({
      code: 'semi-major-axis-kind',
      matches: false,
      wouldHaveProduced: null,
      message: `Under J2 the osculating and mean semi-major axes differ by up to ${ambiguity.metres.toFixed(0)} m here, a rate ambiguity of ${fmt(ambiguity.fractionalRate, 3)}, which is not small against the tolerance ${fmt(tolerance, 3)}: state which a the orbit value is (orbit.semiMajorAxisKind).`,
    });
  }

  const range = (sc.actuator ?? input.actuator)?.rangeFractional;
  const dispersion = dispersionOf(r, configured, range, index, ctx);
  const actuator = actuatorDiagnosis(dispersion, range, verdict, difference);
  if (actuator) {
    diagnosis.push(actuator.diagnosis);
    if (actuator.fails) verdict = 'fail';
  }

  return {
    id: sc.id,
    verdict,
    constants: set.name,
    reference,
    nominalFrequencyHz: nominal,
    semiMajorAxis: sc.orbit.semiMajorAxis,
    expectedFractionalOffset: expected,
    expectedFrequencyHz: nominal + nominal * expected,
    configuredFractionalOffset: configured,
    configuredFrequencyHz: nominal + nominal * configured,
    differenceFractional: difference,
    differenceHz: nominal * difference,
    differenceNanosecondsPerDay: difference * SECONDS_PER_DAY * 1e9,
    toleranceFractional: tolerance,
    budget: {
      gravitational: rate.gravitational,
      velocity: rate.velocity,
      j2,
      j2Included: Boolean(sc.orbit.semiMajorAxisKind),
      fractionalRate: totalRate,
      j2Ambiguity: ambiguity.fractionalRate,
    },
    quantisationStepFractional: step,
    diagnosis,
    dispersion,
    summary: summaryOf({
      verdict,
      difference,
      tolerance,
      marginalFraction: settings.marginalFraction,
      expected,
      configured,
      diagnosis,
    }),
  };
}
