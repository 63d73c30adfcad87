/**
 * Phase ↔ fractional-frequency conversion with explicit gaps, and averaging-time lists.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { requireInRange, requireInteger } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import type { PhaseSeries, StabilityData } from './types.js';

/**
 * Largest accepted |sample|: 1e12 in the phase unit (seconds) and 1e6 in the frequency unit. Real clock
 * data are far smaller; the bounds leave room for scaled test sets (NIST SP 1065's NBS14 values are ~1e3)
 * while keeping every sum of squares finite (our own bounds).
 */
const MAX_ABS_PHASE = 1e12;
const MAX_ABS_FREQUENCY = 1e6;
/** Accepted sample spacing τ0, in seconds: 1 ns to 1e9 s (our own bounds; keeps x/τ0 and τ² finite). */
export const TAU0_RANGE = { min: 1e-9, max: 1e9 } as const;

/** Validates a sample spacing τ0 in seconds against {@link TAU0_RANGE}. */
export function requireTau0(argument: string, tau0: unknown): number {
  return requireInRange(argument, tau0, TAU0_RANGE.min, TAU0_RANGE.max, { unit: 's (sample spacing)' });
}

/** Copies `values` into a Float64Array, rejecting non-numbers, ±Infinity and |value| > `limit` (NaN = missing is kept). */
function copySamples(argument: string, values: unknown, unit: string, limit: number, copy = true): Float64Array {
  if (!(Array.isArray(values) || ArrayBuffer.isView(values))) {
    throw new InvalidArgumentError(argument, values, `an array of numbers (${unit}), NaN for a missing sample`);
  }
  if (values instanceof Float64Array) {
    // Typed input (the common case for long records): a monomorphic scan for |v| > limit (±Infinity
    // included; NaN compares false and stays a missing sample), then a bulk copy unless the caller reads
    // it within this call only.
    for (let i = 0; i < values.length; i++) {
      const v = values[i]!;
      if (v > limit || v < -limit) {
        throw new InvalidArgumentError(
          `${argument}[${i}]`,
          v,
          `a finite number in ${unit} with |value| ≤ ${limit}, or NaN for a missing sample`,
        );
      }
    }
    return copy ? values.slice() : values;
  }
  const src = values as ArrayLike<unknown>;
  const out = new Float64Array(src.length);
  for (let i = 0; i < src.length; i++) {
    const v = src[i];
    if (typeof v !== 'number' || v > limit || v < -limit) {
      throw new InvalidArgumentError(
        `${argument}[${i}]`,
        v,
        `a finite number in ${unit} with |value| ≤ ${limit}, or NaN for a missing sample`,
      );
    }
    out[i] = v;
  }
  return out;
}

/**
 * Integrates fractional frequency into phase, keeping gaps as gaps.
 *
 * x_0 = 0, x_{i+1} = x_i + y_i·τ0 (NIST SP 1065 §4, "phase from frequency"). A missing y_i
 * (`NaN`) breaks phase continuity: sample i + 1 starts a new segment (listed in
 * `segmentStarts`) whose phase continues from x_i with an unknown offset, so the estimators
 * never use a term that spans the gap. Nothing is interpolated.
 *
 * @param frequency  Fractional frequency y_i (dimensionless), NaN for missing.
 * @param tau0       Sample spacing τ0, in seconds.
 * @returns Phase series of length N + 1, in seconds.
 * @throws {InvalidArgumentError} if tau0 is not > 0 or a value is ±Infinity or not a number.
 * @see W. J. Riley, Handbook of Frequency Stability Analysis, NIST SP 1065 (2008), §4 [M section; checked by the
 *   phase-and-frequency reference tests, C].
 */
export function phaseFromFrequency(frequency: ArrayLike<number>, tau0: Seconds): PhaseSeries {
  requireTau0('tau0', tau0);
  const y = copySamples('frequency', frequency, 'fractional frequency (dimensionless)', MAX_ABS_FREQUENCY);
  const x = new Float64Array(y.length + 1);
  const segmentStarts: number[] = [];
  let acc = 0;
  for (let i = 0; i < y.length; i++) {
    const yi = y[i]!;
    if (Number.isNaN(yi)) {
      // Unknown increment: the next sample begins a new segment (phase held, offset unknown).
      segmentStarts.push(i + 1);
    } else {
      acc += yi * tau0;
    }
    x[i + 1] = acc;
  }
  return { phase: x, tau0, segmentStarts };
}

/**
 * Differentiates phase into fractional frequency, keeping gaps as gaps.
 *
 * y_i = (x_{i+1} − x_i)/τ0 (NIST SP 1065 §4). y_i is NaN when x_i or x_{i+1} is missing or when
 * i + 1 starts a new segment, so one missing phase point gives two missing frequency values.
 *
 * @param phase  Phase x_i in seconds (NaN for missing), or a {@link PhaseSeries}.
 * @param tau0   Sample spacing τ0, in seconds (ignored when `phase` is a PhaseSeries, which carries its own).
 * @returns Fractional frequency (dimensionless), length N − 1.
 * @throws {InvalidArgumentError} if tau0 is not > 0 or a value is ±Infinity or not a number.
 */
export function frequencyFromPhase(phase: ArrayLike<number> | PhaseSeries, tau0?: Seconds): Float64Array {
  const series = isPhaseSeries(phase)
    ? {
        phase: copySamples('phase.phase', phase.phase, 'seconds', MAX_ABS_PHASE),
        tau0: requireTau0('phase.tau0', phase.tau0),
        segmentStarts: requireSegmentStarts(phase.segmentStarts),
      }
    : {
        phase: copySamples('phase', phase, 'seconds', MAX_ABS_PHASE),
        tau0: requireTau0('tau0', tau0),
        segmentStarts: [],
      };
  const x = series.phase;
  const y = new Float64Array(Math.max(0, x.length - 1));
  for (let i = 0; i < y.length; i++) y[i] = (x[i + 1]! - x[i]!) / series.tau0;
  for (const k of series.segmentStarts) if (k >= 1 && k <= y.length) y[k - 1] = Number.NaN;
  return y;
}

function requireSegmentStarts(starts: unknown): number[] {
  if (!Array.isArray(starts))
    throw new InvalidArgumentError('phase.segmentStarts', starts, 'an array of sample indices');
  return starts.map((k, i) => requireInteger(`phase.segmentStarts[${i}]`, k, 0));
}

function isPhaseSeries(value: unknown): value is PhaseSeries {
  return typeof value === 'object' && value !== null && 'phase' in value && 'segmentStarts' in value && 'tau0' in value;
}

/**
 * Validates stability input and returns it as a phase series (frequency input is integrated
 * by {@link phaseFromFrequency}).
 *
 * @throws {InvalidArgumentError} if neither `phase` nor `frequency` is given, tau0 is not > 0,
 *   or a sample is ±Infinity or not a number.
 */
export function toPhaseSeries(data: StabilityData): PhaseSeries {
  return phaseSeriesOf(data, true);
}

/**
 * As {@link toPhaseSeries}, but a Float64Array of phase is validated and used in place rather than
 * copied: for the statistics, which only read it during one synchronous call (a copy of 10^7 samples costs
 * more than the statistic itself).
 *
 * @internal
 */
export function phaseSeriesForReading(data: StabilityData): PhaseSeries {
  return phaseSeriesOf(data, false);
}

function phaseSeriesOf(data: StabilityData, copy: boolean): PhaseSeries {
  if (typeof data !== 'object' || data === null) {
    throw new InvalidArgumentError('data', data, 'an object { phase, tau0 } or { frequency, tau0 }');
  }
  const hasPhase = 'phase' in data && data.phase !== undefined;
  const hasFrequency = 'frequency' in data && data.frequency !== undefined;
  if (hasPhase === hasFrequency) {
    throw new InvalidArgumentError(
      'data',
      Object.keys(data),
      'exactly one of `phase` (seconds) or `frequency` (dimensionless), plus `tau0`',
    );
  }
  const tau0 = requireTau0('data.tau0', data.tau0);
  if (hasPhase)
    return {
      phase: copySamples('data.phase', (data as { phase: unknown }).phase, 'seconds', MAX_ABS_PHASE, copy),
      tau0,
      segmentStarts: [],
    };
  return phaseFromFrequency((data as { frequency: ArrayLike<number> }).frequency, tau0);
}

/**
 * Averaging factors m = 1, 2, 4, … (octaves) up to and including `maxM`.
 *
 * @param maxM  Largest factor wanted (≥ 1).
 */
export function octaveFactors(maxM: number): number[] {
  requireInteger('maxM', maxM, 1);
  const out: number[] = [];
  for (let m = 1; m <= maxM; m *= 2) out.push(m);
  return out;
}

/**
 * Converts averaging times to factors m = τ/τ0, requiring each to be a whole multiple of τ0
 * (relative tolerance 1e-9). The list is returned sorted with duplicates removed.
 *
 * @param taus  Averaging times in seconds.
 * @param tau0  Sample spacing in seconds.
 * @throws {InvalidArgumentError} if a τ is not a positive whole multiple of τ0.
 */
export function factorsForTaus(taus: readonly Seconds[], tau0: Seconds): number[] {
  requireTau0('tau0', tau0);
  if (!Array.isArray(taus)) throw new InvalidArgumentError('taus', taus, 'an array of averaging times in seconds');
  const set = new Set<number>();
  taus.forEach((tau, i) => {
    const t = requireInRange(`taus[${i}]`, tau, 0, 1e15, { minExclusive: true, unit: 's' });
    const m = Math.round(t / tau0);
    if (m < 1 || Math.abs(t / tau0 - m) > 1e-9 * Math.max(1, m)) {
      throw new InvalidArgumentError(
        `taus[${i}]`,
        tau,
        `a whole multiple m·τ0 of the sample spacing τ0 = ${tau0} s (m = 1, 2, 3, ...)`,
        `τ/τ0 = ${t / tau0}`,
      );
    }
    set.add(m);
  });
  return [...set].sort((a, b) => a - b);
}
