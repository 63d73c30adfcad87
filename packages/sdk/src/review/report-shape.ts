/**
 * Shape check of a {@link ReviewReport} handed to the renderers, so that a hand-made or damaged
 * report is refused with the path of the first bad field instead of failing inside the template.
 * Numbers may be non-finite (the renderers print ∞); their type must be right.
 *
 * @internal
 */
import { InvalidArgumentError } from '../errors.js';
import type { ReviewReport, SpacecraftFinding } from './types.js';

type Shape = 'string' | 'number' | 'number|null' | 'boolean' | 'boolean|null' | readonly string[] | { readonly [k: string]: Shape }
  | { readonly arrayOf: Shape } | { readonly nullable: Shape };

const PERCENTILE: Shape = { percentile: 'number', semiMajorAxis: 'number', residualFractionalRate: 'number', daysToPhaseTolerance: 'number|null' };
const DISPERSION: Shape = {
  semiMajorAxisSigma: 'number', rateSensitivityPerMetre: 'number', residualAtMinus3Sigma: 'number', residualNominal: 'number',
  residualAtPlus3Sigma: 'number', worstResidual: 'number', phaseToleranceSeconds: 'number|null', daysToPhaseToleranceWorst: 'number|null',
  actuatorCovers: 'boolean|null', percentiles: { arrayOf: PERCENTILE }, monteCarlo: { runs: 'number', seed: 'number', percentiles: { arrayOf: PERCENTILE } },
};
const FINDING: Shape = {
  id: 'string', verdict: ['pass', 'marginal', 'fail'], constants: 'string', reference: ['tt', 'tcg'], nominalFrequencyHz: 'number',
  semiMajorAxis: 'number', expectedFractionalOffset: 'number', expectedFrequencyHz: 'number', configuredFractionalOffset: 'number',
  configuredFrequencyHz: 'number', differenceFractional: 'number', differenceHz: 'number', differenceNanosecondsPerDay: 'number',
  toleranceFractional: 'number',
  budget: { gravitational: 'number', velocity: 'number', j2: 'number', j2Included: 'boolean', fractionalRate: 'number', j2Ambiguity: 'number' },
  quantisationStepFractional: 'number|null',
  diagnosis: { arrayOf: { code: 'string', message: 'string', wouldHaveProduced: 'number|null', matches: 'boolean' } },
  dispersion: { nullable: DISPERSION },
  summary: 'string',
};
const REPORT: Shape = {
  title: 'string', generatedBy: 'string', caution: 'string', spacecraft: { arrayOf: FINDING },
  counts: { pass: 'number', marginal: 'number', fail: 'number' },
};

function check(path: string, value: unknown, shape: Shape): void {
  const fail = (expected: string): never => { throw new InvalidArgumentError(path, value, expected); };
  if (typeof shape === 'string') {
    const [type, orNull] = shape.split('|');
    if (typeof value !== type && !(orNull === 'null' && value === null)) fail(`a ${shape}`);
  } else if (Array.isArray(shape)) {
    if (!shape.includes(value as string)) fail(`one of ${shape.join(', ')}`);
  } else if ('arrayOf' in shape) {
    if (!Array.isArray(value)) fail('an array');
    (value as unknown[]).forEach((v, i) => check(`${path}[${i}]`, v, shape.arrayOf as Shape));
  } else if ('nullable' in shape) {
    if (value !== null && value !== undefined) check(path, value, shape.nullable as Shape);
  } else {
    if (typeof value !== 'object' || value === null || Array.isArray(value)) fail('an object');
    for (const [key, inner] of Object.entries(shape as Record<string, Shape>)) check(`${path}.${key}`, (value as Record<string, unknown>)[key], inner);
  }
}

/** Throws an {@link InvalidArgumentError} naming the first field of `report` that does not have the type of a review report. */
export function requireReviewReport(argument: string, report: unknown): ReviewReport {
  check(argument, report, REPORT);
  return report as ReviewReport;
}

/** Throws an {@link InvalidArgumentError} naming the first field of `finding` that does not have the type of a spacecraft finding. */
export function requireSpacecraftFinding(argument: string, finding: unknown): SpacecraftFinding {
  check(argument, finding, FINDING);
  return finding as SpacecraftFinding;
}
