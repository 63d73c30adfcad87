/**
 * The steering scenario format (our own; JSON Schema in `schema/scenario.schema.json`) and its
 * validation. `validateScenario` checks every field once, at the boundary, and throws an
 * {@link InvalidArgumentError} whose `argument` is the field path (e.g. `contacts[2].end`).
 * It returns a normalised form with all times in seconds since the scenario epoch.
 *
 * @module
 */

import { diffusionFromStabilitySpec } from '../clock-model/noise.js';
import { CONSTANT_SETS, type ConstantSet, DEFAULT_CONSTANT_SET } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import {
  rejectUnknownKeys,
  requireArray,
  requireFinite,
  requireNonNegative,
  requireOrbitRadius,
  requirePositive,
  requireRecord,
} from '../internal/validate.js';
import { rateChangeForSemiMajorAxisChange } from '../relativity/rate.js';
import type { Instant } from '../time/instant.js';
import type { TimeScales } from '../time/scales.js';
import type { Dimensionless, Metres, PerSecond, Seconds } from '../units.js';
import { type DiffusionCoefficients, type Matrix3, zeros3 } from './clock-math.js';
import {
  validateActuator,
  validateCostWeights,
  validateCovariance,
  validateOperations,
  validateStrategy,
  validateTolerance,
} from './scenario-fields.js';
import { parseUtcStamp, requireInsideTable, resolveTimeScales, type TimeScaleOptions } from './utc-stamps.js';

/** One uplink opportunity (ISO 8601 UTC stamps with a zone designator; `23:59:60Z` where a leap second exists). */
export interface ContactWindow {
  start: string;
  end: string;
}

/** Deviation of one noise type at one averaging time. */
export interface StabilityPoint {
  /** Averaging time τ, in seconds. */
  tau: Seconds;
  /** Deviation at τ (dimensionless): Allan deviation for the frequency noises, Hadamard for drift noise. */
  deviation: Dimensionless;
}

/**
 * A stability specification per noise type, converted to diffusion coefficients with the
 * 3-state model relations of Zucca & Tavella (2005): AVAR_WFM = q1/τ, AVAR_RWFM = q2·τ/3,
 * HVAR_RWD = 11·q3·τ³/120. Each point is the deviation that noise type alone contributes.
 */
export interface StabilitySpec {
  whiteFrequency?: StabilityPoint;
  randomWalkFrequency?: StabilityPoint;
  randomWalkDrift?: StabilityPoint;
}

/** Clock noise: diffusion coefficients directly, or a stability spec that the SDK converts. */
export type NoiseSpec = DiffusionCoefficients | { stability: StabilitySpec };

/** The clock's estimated state at the epoch (offset from system time) and its noise. */
export interface ClockSpec {
  /** Onboard clock minus system time at the epoch, in seconds. */
  phaseSeconds: Seconds;
  /** Fractional frequency offset at the epoch (dimensionless). */
  fractionalFrequency: Dimensionless;
  /** Frequency drift, in 1/s (fractional frequency change per second). */
  driftPerSecond: PerSecond;
  /** Covariance of [phase (s), frequency (1), drift (1/s)] at the epoch; zero when omitted. */
  covariance?: number[][];
  noise: NoiseSpec;
}

export interface ToleranceSpec {
  /** Symmetric bound on the steered offset, in seconds: |offset| ≤ phaseSeconds. */
  phaseSeconds: Seconds;
  /** Confidence the plan must meet at every epoch of the horizon, in (0, 1). */
  probability: number;
}

export interface PhaseStepSpec {
  allowed: boolean;
  /** Phase-step resolution, in seconds (required when allowed). */
  resolution?: Seconds;
  /** Largest single phase step, in seconds (no limit when omitted). */
  maxStep?: Seconds;
}

export interface ActuatorSpec {
  /** Frequency-step resolution (fractional, > 0). Steps are integer multiples of it. */
  frequencyResolution: Dimensionless;
  /** Largest single frequency step (fractional). */
  maxFrequencyStep: Dimensionless;
  /** Allowed range of the cumulative frequency steering (fractional), min ≤ 0 ≤ max. */
  cumulativeFrequencyRange: { min: Dimensionless; max: Dimensionless };
  /** Steering already applied at the epoch (fractional); 0 when omitted. Must lie in the range. */
  initialFrequencySteering?: Dimensionless;
  /** Phase steps; not allowed when omitted. */
  phaseSteps?: PhaseStepSpec;
  /** Minimum time between the execution of two commands, in seconds. */
  minCommandSpacingSeconds: Seconds;
  /** Longest delay between uplink and execution of a time-tagged command, in seconds (0: immediate only). */
  maxTimeTagSeconds: Seconds;
}

/** A planned orbit change. Semi-major axes in metres. */
export interface ManeuverSpec {
  at: string;
  semiMajorAxisBefore: Metres;
  semiMajorAxisAfter: Metres;
}

export interface DeadbandStrategySpec {
  method: 'deadband';
  /** Act when the predicted offset would use more than this fraction of the usable band; default 0.5. */
  thresholdFraction?: number;
  /** Time over which a frequency correction removes the phase offset, in seconds; default 86 400. */
  correctionTimeSeconds?: Seconds;
}

export interface OptimalStrategySpec {
  method: 'optimal';
  /** Spacing of candidate execution epochs, in seconds; default max(grid, minCommandSpacing). */
  decisionIntervalSeconds?: Seconds;
}

export type StrategySpec = DeadbandStrategySpec | OptimalStrategySpec | { method: 'none' };

/** Weights of the expected steering cost (see `steeringCost`). */
export interface CostWeights {
  /** Weight of (step / maxFrequencyStep)² per frequency command; default 0.01. */
  frequencyStep?: number;
  /** Weight of (step / tolerance)² per phase command; default 0.01. */
  phaseStep?: number;
  /** Cost of each command; default 0.002. */
  command?: number;
}

/**
 * Closed-loop operations: ground estimates of the clock offset arrive every
 * `estimateIntervalSeconds`, each with white noise of 1σ `estimateNoiseSeconds`, available
 * `estimateLatencySeconds` after their epoch; the plan is revised at the start of every contact.
 */
export interface OperationsSpec {
  /** Spacing of the estimates, in seconds (> 0, ≤ horizonSeconds). */
  estimateIntervalSeconds: Seconds;
  /** 1σ of each estimate's white noise, in seconds (≥ 0). */
  estimateNoiseSeconds: Seconds;
  /** Delay from an estimate's epoch to its availability, in seconds (≥ 0; default 0). */
  estimateLatencySeconds?: Seconds;
  /** Re-planning policy: `each-contact` (the default and only one). */
  replan?: 'each-contact';
}

/** A steering scenario as written in a scenario file. */
export interface SteeringScenario {
  name?: string;
  description?: string;
  /** Epoch of the clock state and start of the horizon (ISO 8601 UTC). */
  epoch: string;
  horizonSeconds: Seconds;
  /** Spacing of the prediction grid, in seconds; default 900. */
  gridSeconds?: Seconds;
  clock: ClockSpec;
  tolerance: ToleranceSpec;
  contacts: ContactWindow[];
  actuator: ActuatorSpec;
  maneuvers?: ManeuverSpec[];
  strategy: StrategySpec;
  costWeights?: CostWeights;
  /** Constant-set name for the manoeuvre rate changes (default `iers-2010`; see `constantSet`). */
  constants?: string;
  /** Closed-loop operations (optional; needed by `simulateClosedLoop`). */
  operations?: OperationsSpec;
}

/** The scenario after validation: times in seconds since the epoch, noise as q1..q3. */
export interface NormalizedScenario {
  source: SteeringScenario;
  /** The scenario epoch. */
  epoch: Instant;
  /** The time scales (leap-second table) the UTC stamps were read with; plan stamps are printed with them. */
  timeScales: TimeScales;
  horizon: Seconds;
  grid: Seconds;
  state0: [number, number, number];
  covariance0: Matrix3;
  noise: DiffusionCoefficients;
  bound: Seconds;
  probability: number;
  /** Two-sided normal quantile z = Φ⁻¹((1 + p)/2). */
  z: number;
  windows: { start: Seconds; end: Seconds }[];
  actuator: {
    resolution: number;
    maxStep: number;
    rangeMin: number;
    rangeMax: number;
    initial: number;
    phaseAllowed: boolean;
    phaseResolution: number;
    phaseMaxStep: number;
    spacing: Seconds;
    latency: Seconds;
  };
  maneuvers: { t: Seconds; index: number; aBefore: Metres; aAfter: Metres; rateChange: Dimensionless }[];
  strategy: StrategySpec;
  weights: Required<CostWeights>;
  /** The operations block, when given: interval, noise and latency in seconds. */
  operations?: { interval: Seconds; noise: Seconds; latency: Seconds; replan: 'each-contact' };
}

/** Largest horizon accepted (one year): longer open-loop predictions are meaningless. */
const MAX_HORIZON = 366 * 86_400;
/** Most grid points accepted, to keep planning fast. */
const MAX_GRID_POINTS = 200_000;

/** Refuses a field that the format does not define (internal/validate.ts; re-exported for the fleet document). @internal */
export { rejectUnknownKeys };

/**
 * Converts a noise spec to q1, q2, q3 (Zucca & Tavella 2005 relations, physics-refs §11). A stability
 * spec is checked for unknown fields here and converted by the clock-model's
 * `diffusionFromStabilitySpec`; its errors are re-thrown with the scenario path (`spec.x` → `<field>.stability.x`).
 */
export function noiseToDiffusion(noise: NoiseSpec, field = 'clock.noise'): DiffusionCoefficients {
  if (typeof field !== 'string')
    throw new InvalidArgumentError('field', field, 'a string naming the noise spec in error messages');
  const obj = requireRecord(field, noise);
  if ('stability' in obj) {
    rejectUnknownKeys(field, obj, ['stability']);
    const spec = requireRecord(`${field}.stability`, obj.stability);
    rejectUnknownKeys(`${field}.stability`, spec, ['whiteFrequency', 'randomWalkFrequency', 'randomWalkDrift']);
    for (const name of ['whiteFrequency', 'randomWalkFrequency', 'randomWalkDrift']) {
      if (spec[name] === undefined) continue;
      const p = requireRecord(`${field}.stability.${name}`, spec[name]);
      rejectUnknownKeys(`${field}.stability.${name}`, p, ['tau', 'deviation']);
    }
    try {
      return diffusionFromStabilitySpec(spec as StabilitySpec);
    } catch (e) {
      if (!(e instanceof InvalidArgumentError)) throw e;
      const argument =
        e.argument === 'spec' ? `${field}.stability` : e.argument.replace(/^spec\./, `${field}.stability.`);
      throw new InvalidArgumentError(argument, e.received, e.expected, e.hint);
    }
  }
  rejectUnknownKeys(field, obj, ['q1', 'q2', 'q3']);
  return {
    q1: requireNonNegative(`${field}.q1`, obj.q1, 's'),
    q2: requireNonNegative(`${field}.q2`, obj.q2, '1/s'),
    q3: requireNonNegative(`${field}.q3`, obj.q3, '1/s³'),
  };
}

/**
 * Validates a steering scenario and returns its normalised form.
 *
 * Times: every stamp is read with `options.timeScales` (default: the bundled leap-second table,
 * valid until 2027-06-28) and turned into SI seconds since the epoch, t = stamp − epoch as
 * elapsed time (TAI), so a leap second inside the horizon counts as one second.
 *
 * Checks: ISO 8601 UTC stamps with a zone; the whole horizon inside the leap-second table; horizon in (0, 1 year]; grid in (0, horizon]; clock state finite,
 * covariance symmetric positive semi-definite (Cauchy–Schwarz per pair); noise non-negative;
 * tolerance > 0 and probability in (0, 1); contact windows sorted, non-overlapping, with
 * start < end, all inside [epoch, epoch + horizon]; actuator resolution > 0, max step ≥
 * resolution, range min ≤ initial ≤ max with min ≤ 0 ≤ max; phase-step resolution > 0 when
 * allowed; spacing and time-tag ≥ 0; manoeuvres inside the horizon with semi-major axes above
 * the Earth's radius (the relativistic rate change, (3GM/(2c²))(1/aBefore − 1/aAfter), comes from
 * `rateChangeForSemiMajorAxisChange` of the relativity module, with the scenario's `constants` set, default IERS 2010).
 *
 * @param input    The parsed scenario file (unknown JSON).
 * @param options  `timeScales`: the time scales (leap-second table) for the UTC stamps.
 * @returns The scenario with times in seconds since the epoch.
 * @throws {InvalidArgumentError} naming the field path, the value and the expected range.
 * @throws {OutOfDomainError} for a stamp, or a horizon end, outside the leap-second table; the message says how to pass a current table.
 */
export function validateScenario(input: unknown, options: TimeScaleOptions = {}): NormalizedScenario {
  const timeScales = resolveTimeScales(options);
  const root = requireRecord('scenario', input);
  rejectUnknownKeys('', root, [
    '$schema',
    'name',
    'description',
    'epoch',
    'horizonSeconds',
    'gridSeconds',
    'clock',
    'tolerance',
    'contacts',
    'actuator',
    'maneuvers',
    'strategy',
    'costWeights',
    'constants',
    'operations',
  ]);
  const constants = scenarioConstants(root.constants);
  for (const key of ['$schema', 'name', 'description'] as const) {
    if (root[key] !== undefined && typeof root[key] !== 'string')
      throw new InvalidArgumentError(key, root[key], 'a string');
  }
  const epoch = parseUtcStamp(timeScales, 'epoch', root.epoch);
  const { horizon, grid } = validateHorizon(root, timeScales, epoch);
  const stamps: StampReader = {
    epochText: String(root.epoch),
    horizon,
    toSeconds: (field, text) => parseUtcStamp(timeScales, field, text).secondsSince(epoch),
  };
  const { state0, covariance0, noise } = validateClock(root.clock);
  const { bound, probability, z } = validateTolerance(root.tolerance);
  const windows = validateContacts(root.contacts, stamps);
  const actuator = validateActuator(root.actuator);
  const maneuvers = root.maneuvers === undefined ? [] : validateManeuvers(root.maneuvers, stamps, constants);
  const strategy = validateStrategy(root.strategy);
  const weights = validateCostWeights(root.costWeights);
  const operations = root.operations === undefined ? undefined : validateOperations(root.operations, horizon);
  return {
    ...(operations ? { operations } : {}),
    source: input as SteeringScenario,
    epoch,
    timeScales,
    horizon,
    grid,
    state0,
    covariance0,
    noise,
    bound,
    probability,
    z,
    windows,
    actuator,
    maneuvers,
    strategy,
    weights,
  };
}

/** The constant set a scenario names (any letter case), default IERS 2010. */
function scenarioConstants(name: unknown): ConstantSet {
  if (name === undefined) return DEFAULT_CONSTANT_SET;
  const set =
    typeof name === 'string' && Object.hasOwn(CONSTANT_SETS, name.toLowerCase())
      ? CONSTANT_SETS[name.toLowerCase()]
      : undefined;
  if (set === undefined)
    throw new InvalidArgumentError('constants', name, `one of ${Object.keys(CONSTANT_SETS).join(', ')}`);
  return set;
}

/** Horizon in (0, 366 d] and inside the leap-second table; grid in [horizon/200 000, horizon] (default 900 s). */
function validateHorizon(
  root: Record<string, unknown>,
  timeScales: TimeScales,
  epoch: Instant,
): { horizon: number; grid: number } {
  const horizon = requirePositive('horizonSeconds', root.horizonSeconds, 's');
  if (horizon > MAX_HORIZON)
    throw new InvalidArgumentError('horizonSeconds', horizon, `at most ${MAX_HORIZON} s (366 days)`);
  // Plan stamps anywhere in the horizon are printed in UTC, so the whole horizon must lie inside the table.
  requireInsideTable(
    timeScales,
    'horizonSeconds',
    horizon,
    epoch.plus(horizon),
    `the end of the horizon (epoch + ${horizon} s)`,
  );
  const grid =
    root.gridSeconds === undefined ? Math.min(900, horizon) : requirePositive('gridSeconds', root.gridSeconds, 's');
  if (grid > horizon) throw new InvalidArgumentError('gridSeconds', grid, `at most horizonSeconds (${horizon} s)`);
  if (horizon / grid > MAX_GRID_POINTS) {
    throw new InvalidArgumentError(
      'gridSeconds',
      grid,
      `at least horizonSeconds/${MAX_GRID_POINTS} = ${horizon / MAX_GRID_POINTS} s`,
    );
  }
  return { horizon, grid };
}

/** Reads the scenario's UTC stamps as seconds since its epoch, and knows the horizon they must lie in. */
interface StampReader {
  readonly epochText: string;
  readonly horizon: number;
  toSeconds(field: string, text: unknown): number;
}

/** The clock block: finite state with |y| < 1e-3, covariance (zero when omitted) and noise. */
function validateClock(value: unknown): Pick<NormalizedScenario, 'state0' | 'covariance0' | 'noise'> {
  const clock = requireRecord('clock', value);
  rejectUnknownKeys('clock', clock, ['phaseSeconds', 'fractionalFrequency', 'driftPerSecond', 'covariance', 'noise']);
  const state0: [number, number, number] = [
    requireFinite('clock.phaseSeconds', clock.phaseSeconds, 'a finite number of seconds'),
    requireFinite('clock.fractionalFrequency', clock.fractionalFrequency, 'a finite fractional frequency'),
    requireFinite('clock.driftPerSecond', clock.driftPerSecond, 'a finite drift in 1/s'),
  ];
  if (Math.abs(state0[1]) >= 1e-3) {
    throw new InvalidArgumentError(
      'clock.fractionalFrequency',
      state0[1],
      'a fractional frequency |y| < 1e-3',
      'fractional frequency is dimensionless (Δf/f), not hertz',
    );
  }
  const covariance0 =
    clock.covariance === undefined ? zeros3() : validateCovariance('clock.covariance', clock.covariance);
  return { state0, covariance0, noise: noiseToDiffusion(clock.noise as NoiseSpec, 'clock.noise') };
}

/** Contact windows: start < end, sorted, non-overlapping, inside [epoch, epoch + horizon]. */
function validateContacts(value: unknown, stamps: StampReader): NormalizedScenario['windows'] {
  const contacts = requireArray('contacts', value);
  const windows: NormalizedScenario['windows'] = [];
  for (const [i, c] of contacts.entries()) {
    const w = requireRecord(`contacts[${i}]`, c);
    rejectUnknownKeys(`contacts[${i}]`, w, ['start', 'end']);
    const start = stamps.toSeconds(`contacts[${i}].start`, w.start);
    const end = stamps.toSeconds(`contacts[${i}].end`, w.end);
    if (start < 0) {
      throw new InvalidArgumentError(
        `contacts[${i}].start`,
        w.start,
        `at or after the epoch ${stamps.epochText} (inside the horizon)`,
      );
    }
    if (!(end > start))
      throw new InvalidArgumentError(`contacts[${i}].end`, w.end, `after contacts[${i}].start (${String(w.start)})`);
    if (end > stamps.horizon) {
      throw new InvalidArgumentError(
        `contacts[${i}].end`,
        w.end,
        `at or before the end of the horizon (epoch + ${stamps.horizon} s)`,
      );
    }
    const prev = windows[i - 1];
    if (prev && start < prev.end) {
      const previous = contacts[i - 1] as ContactWindow;
      throw new InvalidArgumentError(
        `contacts[${i}].start`,
        w.start,
        start < prev.start
          ? `after contacts[${i - 1}].start (${previous.start}): windows must be sorted by time`
          : `at or after contacts[${i - 1}].end (${previous.end}): windows must not overlap`,
      );
    }
    windows.push({ start, end });
  }
  return windows;
}

/** Manoeuvres inside the horizon, semi-major axes above the Earth's radius, sorted by time, with their rate changes. */
function validateManeuvers(
  value: unknown,
  stamps: StampReader,
  constants: ConstantSet,
): NormalizedScenario['maneuvers'] {
  const maneuvers: NormalizedScenario['maneuvers'] = [];
  for (const [i, m] of requireArray('maneuvers', value).entries()) {
    const o = requireRecord(`maneuvers[${i}]`, m);
    rejectUnknownKeys(`maneuvers[${i}]`, o, ['at', 'semiMajorAxisBefore', 'semiMajorAxisAfter']);
    const t = stamps.toSeconds(`maneuvers[${i}].at`, o.at);
    if (t < 0 || t > stamps.horizon) {
      throw new InvalidArgumentError(
        `maneuvers[${i}].at`,
        o.at,
        `inside the horizon [epoch, epoch + ${stamps.horizon} s]`,
      );
    }
    const aBefore = requireOrbitRadius(`maneuvers[${i}].semiMajorAxisBefore`, o.semiMajorAxisBefore);
    const aAfter = requireOrbitRadius(`maneuvers[${i}].semiMajorAxisAfter`, o.semiMajorAxisAfter);
    maneuvers.push({
      t,
      index: i,
      aBefore,
      aAfter,
      rateChange: rateChangeForSemiMajorAxisChange(aBefore, aAfter, { constants }),
    });
  }
  return maneuvers.sort((a, b) => a.t - b.t || a.index - b.index);
}
