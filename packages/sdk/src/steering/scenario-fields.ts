/**
 * Field validators of the steering scenario (see `validateScenario` in scenario.ts): each checks one block of
 * the file and names the offending field by its path.
 *
 * @internal
 */
import { InvalidArgumentError } from '../errors.js';
import { normalQuantile } from '../internal/special-functions.js';
import {
  rejectUnknownKeys,
  requireArray,
  requireFinite,
  requireNonNegative,
  requirePositive,
  requireRecord,
} from '../internal/validate.js';
import type { Matrix3 } from './clock-math.js';
import type {
  CostWeights,
  DeadbandStrategySpec,
  NormalizedScenario,
  OptimalStrategySpec,
  StrategySpec,
} from './scenario.js';

/** A 3×3 covariance: finite, symmetric, diagonal ≥ 0 and |c_ij| ≤ √(c_ii c_jj) (positive semi-definite pairs). */
export function validateCovariance(field: string, value: unknown): Matrix3 {
  const rows = requireArray(field, value);
  if (rows.length !== 3) throw new InvalidArgumentError(field, value, 'a 3×3 array of finite numbers');
  const row = (i: number): [number, number, number] => {
    const r = requireArray(`${field}[${i}]`, rows[i]);
    if (r.length !== 3) throw new InvalidArgumentError(`${field}[${i}]`, rows[i], 'an array of three finite numbers');
    const [a, b, c] = r.map((v, j) => requireFinite(`${field}[${i}][${j}]`, v));
    return [a ?? Number.NaN, b ?? Number.NaN, c ?? Number.NaN];
  };
  const m: Matrix3 = [row(0), row(1), row(2)];
  for (const [i, ri] of m.entries()) {
    const cii = ri[i] ?? Number.NaN;
    if (cii < 0) throw new InvalidArgumentError(`${field}[${i}][${i}]`, cii, 'a variance ≥ 0');
    for (let j = 0; j < i; j++) {
      const a = ri[j] ?? Number.NaN;
      const rj = m[j] ?? ri;
      const b = rj[i] ?? Number.NaN;
      const cjj = rj[j] ?? Number.NaN;
      if (Math.abs(a - b) > 1e-9 * Math.max(Math.abs(a), Math.abs(b))) {
        throw new InvalidArgumentError(
          `${field}[${i}][${j}]`,
          a,
          `equal to ${field}[${j}][${i}] = ${b} (a covariance is symmetric)`,
        );
      }
      // Cauchy–Schwarz: |c_ij| ≤ √(c_ii c_jj) for a positive semi-definite matrix.
      if (a * a > cii * cjj * (1 + 1e-9)) {
        throw new InvalidArgumentError(
          `${field}[${i}][${j}]`,
          a,
          `at most √(${field}[${i}][${i}]·${field}[${j}][${j}]) = ` +
            `${Math.sqrt(cii * cjj)} in magnitude (a covariance is positive semi-definite)`,
        );
      }
    }
  }
  return m;
}

/** The closed-loop operations block. */
export function validateOperations(value: unknown, horizon: number): NonNullable<NormalizedScenario['operations']> {
  const o = requireRecord('operations', value);
  rejectUnknownKeys('operations', o, [
    'estimateIntervalSeconds',
    'estimateNoiseSeconds',
    'estimateLatencySeconds',
    'replan',
  ]);
  const interval = requirePositive('operations.estimateIntervalSeconds', o.estimateIntervalSeconds, 's');
  if (interval > horizon)
    throw new InvalidArgumentError(
      'operations.estimateIntervalSeconds',
      interval,
      `at most horizonSeconds (${horizon} s)`,
    );
  const noise = requireNonNegative('operations.estimateNoiseSeconds', o.estimateNoiseSeconds, 's');
  const latency =
    o.estimateLatencySeconds === undefined
      ? 0
      : requireNonNegative('operations.estimateLatencySeconds', o.estimateLatencySeconds, 's');
  if (o.replan !== undefined && o.replan !== 'each-contact')
    throw new InvalidArgumentError('operations.replan', o.replan, '"each-contact"');
  return { interval, noise, latency, replan: 'each-contact' };
}

/** The planner and its settings. */
export function validateStrategy(value: unknown): StrategySpec {
  const s = requireRecord('strategy', value);
  const method = s.method;
  if (method === 'deadband') {
    rejectUnknownKeys('strategy', s, ['method', 'thresholdFraction', 'correctionTimeSeconds']);
    const out: DeadbandStrategySpec = { method };
    if (s.thresholdFraction !== undefined) {
      const f = requireFinite('strategy.thresholdFraction', s.thresholdFraction, 'in (0, 1]');
      if (!(f > 0 && f <= 1)) throw new InvalidArgumentError('strategy.thresholdFraction', f, 'in (0, 1]');
      out.thresholdFraction = f;
    }
    if (s.correctionTimeSeconds !== undefined) {
      out.correctionTimeSeconds = requirePositive('strategy.correctionTimeSeconds', s.correctionTimeSeconds, 's');
    }
    return out;
  }
  if (method === 'optimal') {
    rejectUnknownKeys('strategy', s, ['method', 'decisionIntervalSeconds']);
    const out: OptimalStrategySpec = { method };
    if (s.decisionIntervalSeconds !== undefined) {
      out.decisionIntervalSeconds = requirePositive('strategy.decisionIntervalSeconds', s.decisionIntervalSeconds, 's');
    }
    return out;
  }
  if (method === 'none') {
    rejectUnknownKeys('strategy', s, ['method']);
    return { method };
  }
  throw new InvalidArgumentError('strategy.method', method, '"deadband", "optimal" or "none"');
}

/** The tolerance: bound > 0 s and probability in (0, 1), with the two-sided normal quantile z = Φ⁻¹((1 + p)/2). */
export function validateTolerance(value: unknown): { bound: number; probability: number; z: number } {
  const tol = requireRecord('tolerance', value);
  rejectUnknownKeys('tolerance', tol, ['phaseSeconds', 'probability']);
  const bound = requirePositive('tolerance.phaseSeconds', tol.phaseSeconds, 's');
  const probability = requireFinite('tolerance.probability', tol.probability, 'in (0, 1)');
  if (!(probability > 0 && probability < 1)) {
    throw new InvalidArgumentError(
      'tolerance.probability',
      probability,
      'in (0, 1)',
      probability >= 1 && probability <= 100 ? 'give a fraction, e.g. 0.95, not a percentage' : undefined,
    );
  }
  return { bound, probability, z: normalQuantile((1 + probability) / 2) };
}

/** The phase-step part of the actuator: allowed, resolution (> 0 s when allowed) and largest step (≥ resolution). */
function validatePhaseSteps(value: unknown): { phaseAllowed: boolean; phaseResolution: number; phaseMaxStep: number } {
  if (value === undefined) return { phaseAllowed: false, phaseResolution: 0, phaseMaxStep: Infinity };
  const ps = requireRecord('actuator.phaseSteps', value);
  rejectUnknownKeys('actuator.phaseSteps', ps, ['allowed', 'resolution', 'maxStep']);
  const phaseAllowed = ps.allowed;
  if (typeof phaseAllowed !== 'boolean')
    throw new InvalidArgumentError('actuator.phaseSteps.allowed', phaseAllowed, 'true or false');
  const phaseResolution =
    phaseAllowed || ps.resolution !== undefined
      ? requirePositive('actuator.phaseSteps.resolution', ps.resolution, 's')
      : 0;
  let phaseMaxStep = Infinity;
  if (ps.maxStep !== undefined) {
    phaseMaxStep = requirePositive('actuator.phaseSteps.maxStep', ps.maxStep, 's');
    if (phaseMaxStep < phaseResolution) {
      throw new InvalidArgumentError(
        'actuator.phaseSteps.maxStep',
        phaseMaxStep,
        `at least actuator.phaseSteps.resolution (${phaseResolution} s)`,
      );
    }
  }
  return { phaseAllowed, phaseResolution, phaseMaxStep };
}

/** The actuator: resolution > 0, max step ≥ resolution, range min ≤ initial ≤ max with min ≤ 0 ≤ max, phase steps, spacing and time tag ≥ 0. */
export function validateActuator(value: unknown): NormalizedScenario['actuator'] {
  const act = requireRecord('actuator', value);
  rejectUnknownKeys('actuator', act, [
    'frequencyResolution',
    'maxFrequencyStep',
    'cumulativeFrequencyRange',
    'initialFrequencySteering',
    'phaseSteps',
    'minCommandSpacingSeconds',
    'maxTimeTagSeconds',
  ]);
  const resolution = requirePositive('actuator.frequencyResolution', act.frequencyResolution, '(fractional)');
  const maxStep = requirePositive('actuator.maxFrequencyStep', act.maxFrequencyStep, '(fractional)');
  if (maxStep < resolution) {
    throw new InvalidArgumentError(
      'actuator.maxFrequencyStep',
      maxStep,
      `at least actuator.frequencyResolution (${resolution})`,
    );
  }
  const range = requireRecord('actuator.cumulativeFrequencyRange', act.cumulativeFrequencyRange);
  rejectUnknownKeys('actuator.cumulativeFrequencyRange', range, ['min', 'max']);
  const rangeMin = requireFinite('actuator.cumulativeFrequencyRange.min', range.min, 'a fractional frequency ≤ 0');
  const rangeMax = requireFinite('actuator.cumulativeFrequencyRange.max', range.max, 'a fractional frequency ≥ 0');
  if (rangeMin > 0)
    throw new InvalidArgumentError('actuator.cumulativeFrequencyRange.min', rangeMin, 'a fractional frequency ≤ 0');
  if (rangeMax < 0)
    throw new InvalidArgumentError('actuator.cumulativeFrequencyRange.max', rangeMax, 'a fractional frequency ≥ 0');
  const initial =
    act.initialFrequencySteering === undefined
      ? 0
      : requireFinite('actuator.initialFrequencySteering', act.initialFrequencySteering);
  if (initial < rangeMin || initial > rangeMax) {
    throw new InvalidArgumentError(
      'actuator.initialFrequencySteering',
      initial,
      `inside actuator.cumulativeFrequencyRange [${rangeMin}, ${rangeMax}]`,
    );
  }
  const phase = validatePhaseSteps(act.phaseSteps);
  const spacing = requireNonNegative('actuator.minCommandSpacingSeconds', act.minCommandSpacingSeconds, 's');
  const latency = requireNonNegative('actuator.maxTimeTagSeconds', act.maxTimeTagSeconds, 's');
  return { resolution, maxStep, rangeMin, rangeMax, initial, ...phase, spacing, latency };
}

/** The cost weights, each ≥ 0, with their defaults 0.01, 0.01 and 0.002. */
export function validateCostWeights(value: unknown): Required<CostWeights> {
  const weights: Required<CostWeights> = { frequencyStep: 0.01, phaseStep: 0.01, command: 0.002 };
  if (value === undefined) return weights;
  const cw = requireRecord('costWeights', value);
  rejectUnknownKeys('costWeights', cw, ['frequencyStep', 'phaseStep', 'command']);
  for (const k of ['frequencyStep', 'phaseStep', 'command'] as const) {
    if (cw[k] !== undefined) weights[k] = requireNonNegative(`costWeights.${k}`, cw[k]);
  }
  return weights;
}
