/**
 * Every public SDK function, given hostile arguments, either returns a result whose numbers are
 * all finite or throws a typed Tauline error (a TaulineError subclass naming the field) — never a
 * TypeError/RangeError/plain Error, never NaN or Infinity, never a hang. The exports are
 * enumerated at run time from the package's subpath entries, so a new export is covered without
 * editing this file. fast-check, fixed seed (printed in each test name) so a failure replays.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { argsArb, leafArb, valueArb } from './arbitraries.js';
import { nonFinitePath, type PublicExport, publicExports, untypedError } from './public-surface.js';
import { VALID_CALLS } from './valid-calls.js';

const SEED = 20261203;
const RUNS = 60;
/**
 * Functions whose valid example does real work (a week of steering, a Monte Carlo review, a filter or
 * fit over a series) get fewer damaged calls so the file stays within ~15 s; every one is still run.
 */
const HEAVY_RUNS = 20;
const HEAVY = new Set([
  'planSteering',
  'simulatePlan',
  'predictSteering',
  'steeringCost',
  'validateScenario',
  'reviewOffsets',
  'runClockFilter',
  'diffusionFromStabilityRows',
  'analyzeStability',
  'integrateProperTime',
]);
const runsFor = (name: string): number => (HEAVY.has(name) ? HEAVY_RUNS : RUNS);
/** A call that takes longer than this is reported as a hang (a bound, not a speed target). */
const HANG_MS = 2000;

const EXPORTS = await publicExports();

/**
 * Exports with a different contract, each with its reason. Everything else that is a function is
 * called with arbitrary arguments below.
 */
const DIFFERENT_CONTRACT: Readonly<Record<string, string>> = {
  // Error classes take any message parts by design; constructing one never fails.
  TaulineError: 'error class',
  InvalidArgumentError: 'error class',
  OutOfDomainError: 'error class',
  ConvergenceError: 'error class',
  ParseError: 'error class',
  // Classes are exercised through their constructors and methods in the "classes" block below.
  Instant: 'class',
  LineSplitter: 'class',
  RinexNavParser: 'class',
  Sp3Parser: 'class',
  PreciseCorrectionStream: 'class',
  ClockKalmanFilter: 'class',
  RinexClockParser: 'class',
  RinexClockSeriesCollector: 'class',
};

/**
 * Non-finite values that a function documents as part of its result, matched against
 * `path = value` (array indices as [n]), each with the doc comment that states it.
 */
const DOCUMENTED_NON_FINITE: Readonly<Record<string, RegExp>> = {
  // RinexClockSeries.phase: "NaN for every missing epoch" (missing samples are never interpolated).
  rinexClockSeries: /^result\.phase\[\d+\] = NaN$/,
  // PhaseTextSeries: gaps are NaN samples listed in `gaps` (never interpolated).
  parsePhaseText: /^result\.phase\[\d+\] = NaN$/,
  // ClockFilterRun: "Innovation (s), its variance (s²) and NIS; NaN where the sample is missing" (and at the first, which starts the filter).
  runClockFilter: /^result\.(innovation|innovationVariance|nis)\[\d+\] = NaN$/,
  // parseFortranReal: "returns undefined for a blank field, NaN for text that is not a number" (the readers turn NaN into a located ParseError).
  parseFortranReal: /^result = NaN$/,
  // frequencyFromPhase: "y_i is NaN when x_i or x_{i+1} is missing"; toPhaseSeries keeps NaN = missing.
  frequencyFromPhase: /^result\[\d+\] = NaN$/,
  toPhaseSeries: /^result\.phase\[\d+\] = NaN$/,
  // correctPhaseJumps: "rejected samples become NaN (missing)".
  correctPhaseJumps: /^result\.phase\[\d+\] = NaN$/,
  // ClockCharacterization.noise: a DiffusionInterval is "NaN when the coefficient is held at 0 or not resolved"; χ² and its
  // probability NaN when the covariance is singular or dof = 0; the polynomial's reduced χ² NaN when dof = 0.
  characterizeClock:
    /^result\.(noise\.intervals\.q\d\.(low|high|edf)|noise\.(chiSquare|chiSquareProbability)|polynomial\.reducedChiSquare) = NaN$|^result\.noise\.intervals\.q\d\.high = Infinity$/,
  // DispersionPercentile.daysToPhaseTolerance: "Infinity if never" (a zero residual never leaves the phase tolerance).
  reviewOffsets:
    /^result\.spacecraft\.\d+\.dispersion\.(monteCarlo\.)?percentiles\.\d+\.daysToPhaseTolerance = Infinity$/,
  // NormalizedScenario.actuator.phaseMaxStep: Infinity when the scenario sets no limit on a phase step.
  validateScenario: /^result\.actuator\.phaseMaxStep = Infinity$/,
};

/** Calls `fn`; returns a description of a contract violation, or undefined. */
function violation(name: string, fn: (...args: unknown[]) => unknown, args: unknown[]): string | undefined {
  const started = performance.now();
  let problem: string | undefined;
  try {
    problem = nonFinitePath(fn(...args), DOCUMENTED_NON_FINITE[name]);
  } catch (error) {
    problem = untypedError(error);
  }
  const elapsed = performance.now() - started;
  return problem ?? (elapsed > HANG_MS ? `took ${elapsed.toFixed(0)} ms (hang bound ${HANG_MS} ms)` : undefined);
}

const plainFunctions = EXPORTS.filter((e) => e.kind === 'function' && !(e.name in DIFFERENT_CONTRACT));

describe(`public SDK functions under arbitrary arguments (fast-check seed ${SEED})`, () => {
  it('publicExports() finds the exports of every subpath, and every non-function export is a constant', () => {
    expect(plainFunctions.length).toBeGreaterThan(100);
    for (const e of EXPORTS) {
      if (e.kind === 'value') expect(typeof e.value === 'function', e.name).toBe(false);
      else if (e.kind !== 'function')
        expect(e.name in DIFFERENT_CONTRACT || e.kind !== 'class', `${e.name} is a class without an entry`).toBe(true);
    }
  });

  it.each(plainFunctions.map((e) => [e.name, e] as [string, PublicExport]))(
    '%s(arbitrary JSON, special numbers, damaged objects) returns finite numbers or throws a TaulineError',
    (_name, e) => {
      const fn = e.value as (...args: unknown[]) => unknown;
      fc.assert(
        fc.property(argsArb(fn.length), (args) => {
          const problem = violation(e.name, fn, args);
          if (problem) throw new Error(problem);
        }),
        { seed: SEED, numRuns: runsFor(e.name), includeErrorInReport: true },
      );
    },
  );
});

/** A valid call with one thing damaged: an argument replaced, a nested field replaced/removed, or arguments dropped. */
function damagedCall(valid: () => unknown[]): fc.Arbitrary<unknown[]> {
  return fc
    .tuple(fc.nat(), fc.nat(), fc.oneof(leafArb, valueArb), fc.constantFrom('replace', 'nested', 'remove', 'truncate'))
    .map(([position, pick, replacement, how]) => {
      const args = valid();
      const i = position % Math.max(args.length, 1);
      if (how === 'truncate') return args.slice(0, i);
      if (how === 'replace') {
        args[i] = replacement;
        return args;
      }
      args[i] = damageInside(args[i], pick, replacement, how === 'remove');
      return args;
    });
}

/** Replaces (or removes) one nested value of a plain object/array tree, copying along the path. */
function damageInside(value: unknown, pick: number, replacement: unknown, remove: boolean): unknown {
  const paths: (string | number)[][] = [];
  const walk = (v: unknown, path: (string | number)[]): void => {
    paths.push(path);
    if (Array.isArray(v)) v.forEach((x, k) => walk(x, [...path, k]));
    else if (v !== null && typeof v === 'object' && Object.getPrototypeOf(v) === Object.prototype) {
      for (const [k, x] of Object.entries(v)) walk(x, [...path, k]);
    }
  };
  walk(value, []);
  const path = paths[pick % paths.length]!;
  const rebuild = (v: unknown, depth: number): unknown => {
    if (depth === path.length) return replacement;
    const key = path[depth]!;
    const copy = (Array.isArray(v) ? [...v] : { ...(v as object) }) as Record<string | number, unknown>;
    if (depth === path.length - 1 && remove && !Array.isArray(v)) delete copy[key];
    else copy[key] = rebuild((v as Record<string | number, unknown>)[key], depth + 1);
    return copy;
  };
  return rebuild(value, 0);
}

describe(`public SDK functions with one part of a valid call damaged (fast-check seed ${SEED})`, () => {
  const withExample = plainFunctions.filter((e) => VALID_CALLS[e.name]);

  it.each(withExample.map((e) => [e.name, e] as [string, PublicExport]))(
    '%s(valid example arguments) returns finite numbers (the example the damaged calls start from)',
    (name, e) => {
      const result = (e.value as (...args: unknown[]) => unknown)(...VALID_CALLS[name]!());
      expect(nonFinitePath(result, DOCUMENTED_NON_FINITE[name])).toBeUndefined();
    },
  );

  it.each(withExample.map((e) => [e.name, e] as [string, PublicExport]))(
    '%s(valid call with one argument or field replaced, removed or cut) returns finite numbers or throws a TaulineError',
    (name, e) => {
      const fn = e.value as (...args: unknown[]) => unknown;
      fc.assert(
        fc.property(damagedCall(VALID_CALLS[name]!), (args) => {
          const problem = violation(e.name, fn, args);
          if (problem) throw new Error(problem);
        }),
        { seed: SEED, numRuns: runsFor(e.name), includeErrorInReport: true },
      );
    },
  );
});
