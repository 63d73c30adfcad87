/**
 * Seeded simulation of the stochastic 3-state clock model with optional white phase
 * (measurement) noise, deterministic offset/frequency/drift and injected phase or frequency jumps.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { createRandom } from '../internal/random.js';
import { requireInRange, requireInteger, requireOptions } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import { cholesky } from './linalg.js';
import { type ClockDiffusion, clockProcessNoise, requireDiffusion } from './noise.js';

/** A step injected into a simulated clock. */
export interface ClockJump {
  /** Sample index k ≥ 1 at which the step has taken effect. */
  readonly index: number;
  /**
   * `phase`: x_k and every later phase shift by `size` seconds.
   * `frequency`: y_k and later shift by `size` (dimensionless), so the phase bends from x_{k+1} on.
   */
  readonly kind: 'phase' | 'frequency';
  /** Step size: seconds for `phase`, dimensionless for `frequency`. */
  readonly size: number;
}

/** Options of {@link simulateClock}. */
export interface ClockSimulationOptions {
  /** Number of phase samples, an integer in [2, 1e7] (four Float64Arrays of this length are returned: 320 MB at the bound). */
  readonly samples: number;
  /** Sample spacing, in seconds. */
  readonly tau0: Seconds;
  /** Diffusion coefficients q1 (s), q2 (1/s), q3 (1/s³). */
  readonly q: ClockDiffusion;
  /** Seed of the xoshiro128** stream (see internal/random.ts); same seed, same series. */
  readonly seed: number;
  /** Deterministic initial state at sample 0: phase (s), frequency (dimensionless), drift (1/s). Default 0. */
  readonly initial?: { readonly phase?: Seconds; readonly frequency?: number; readonly drift?: number };
  /** Standard deviation of white phase noise added to the reported phase (measurement noise), in seconds. Default 0. */
  readonly measurementNoise?: Seconds;
  /** Steps to inject. */
  readonly jumps?: readonly ClockJump[];
}

/** Result of {@link simulateClock}. */
export interface ClockSimulation {
  /** Sample spacing, in seconds. */
  readonly tau0: Seconds;
  /** Measured phase: true phase plus white measurement noise, in seconds. */
  readonly phase: Float64Array;
  /** True phase x_k, in seconds. */
  readonly truePhase: Float64Array;
  /** True fractional frequency y_k (dimensionless). */
  readonly frequency: Float64Array;
  /** True drift d_k, in 1/s. */
  readonly drift: Float64Array;
}

/** Most samples one simulation returns (memory bound, our own choice). */
const MAX_SIMULATION_SAMPLES = 10_000_000;

/**
 * Simulates the clock model [x, y, d]_{k+1} = Φ(τ0)[x, y, d]_k + w_k, w_k ~ N(0, Q(τ0)), exactly
 * (no discretisation error: w_k is drawn with the covariance of the continuous model over τ0, by its
 * Cholesky factor). Reported phase z_k = x_k + v_k, v_k ~ N(0, measurementNoise²).
 *
 * @param options  See {@link ClockSimulationOptions}.
 * @returns {@link ClockSimulation}: measured and true phase, true frequency and drift.
 * Bounds (our own, far beyond any clock; they keep every result finite): τ0 in [1e-9, 1e9] s, initial phase
 * within ±1e9 s, frequency within ±1, drift within ±1e-3 1/s, measurement noise ≤ 1 s, jump sizes within ±1.
 * @throws {InvalidArgumentError} for samples outside [2, 1e7], τ0 or a noise/initial value outside its bound, negative q, a non-integer seed,
 *         a jump index outside [1, samples − 1] or a jump of unknown kind.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation] (model, Q(τ)); exact discretisation checked by simulation [C].
 */
export function simulateClock(options: ClockSimulationOptions): ClockSimulation {
  if (typeof options !== 'object' || options === null)
    throw new InvalidArgumentError('options', options, 'a simulation options object');
  const n = requireInteger('samples', options.samples, 2, MAX_SIMULATION_SAMPLES);
  const tau0 = requireInRange('tau0', options.tau0, 1e-9, 1e9, { unit: 's (sample spacing)' });
  const q = requireDiffusion('q', options.q);
  const seed = requireInteger('seed', options.seed);
  const sigmaV =
    options.measurementNoise === undefined
      ? 0
      : requireInRange('measurementNoise', options.measurementNoise, 0, 1, { unit: 's' });
  const init = requireOptions('initial', options.initial);
  let x = init.phase === undefined ? 0 : requireInRange('initial.phase', init.phase, -1e9, 1e9, { unit: 's' });
  let y =
    init.frequency === undefined
      ? 0
      : requireInRange('initial.frequency', init.frequency, -1, 1, { unit: '(fractional frequency)' });
  let d = init.drift === undefined ? 0 : requireInRange('initial.drift', init.drift, -1e-3, 1e-3, { unit: '1/s' });
  const phaseJumps = new Float64Array(n);
  const frequencyJumps = new Float64Array(n);
  if (options.jumps !== undefined && !Array.isArray(options.jumps))
    throw new InvalidArgumentError('jumps', options.jumps, 'an array of { index, kind, size }');
  (options.jumps ?? []).forEach((j, i) => {
    if (typeof j !== 'object' || j === null)
      throw new InvalidArgumentError(`jumps[${i}]`, j, 'an object { index, kind, size }');
    const k = requireInteger(`jumps[${i}].index`, j.index, 1, n - 1);
    const size = requireInRange(`jumps[${i}].size`, j.size, -1, 1, {
      unit: '(s for a phase step, dimensionless for a frequency step)',
    });
    if (j.kind === 'phase') phaseJumps[k] = at(phaseJumps, k) + size;
    else if (j.kind === 'frequency') frequencyJumps[k] = at(frequencyJumps, k) + size;
    else throw new InvalidArgumentError(`jumps[${i}].kind`, j.kind, "'phase' or 'frequency'");
  });

  // Q(τ0) is positive semi-definite by construction, so the semi-definite Cholesky always succeeds.
  const [l0, l1, l2] = cholesky(clockProcessNoise(tau0, q, 3), true) as [number[], number[], number[]];
  // The lower triangle of L, read once.
  const [l00, l10, l11, l20, l21, l22] = [at(l0, 0), at(l1, 0), at(l1, 1), at(l2, 0), at(l2, 1), at(l2, 2)];
  const rng = createRandom(seed);
  const t2 = (tau0 * tau0) / 2;
  const truePhase = new Float64Array(n);
  const frequency = new Float64Array(n);
  const drift = new Float64Array(n);
  const phase = new Float64Array(n);
  // Indices bounded by n, the length of every array here.
  for (let k = 0; k < n; k++) {
    if (k > 0) {
      const e0 = rng.normal();
      const e1 = rng.normal();
      const e2 = rng.normal();
      // Φ(τ0)·s + L·e (lower-triangular L)
      const xNew = x + tau0 * y + t2 * d + l00 * e0;
      const yNew = y + tau0 * d + l10 * e0 + l11 * e1;
      const dNew = d + l20 * e0 + l21 * e1 + l22 * e2;
      x = xNew + phaseJumps[k]!;
      y = yNew + frequencyJumps[k]!;
      d = dNew;
    }
    truePhase[k] = x;
    frequency[k] = y;
    drift[k] = d;
    phase[k] = sigmaV > 0 ? x + sigmaV * rng.normal() : x;
  }
  return { tau0, phase, truePhase, frequency, drift };
}
