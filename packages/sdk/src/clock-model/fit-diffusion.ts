/**
 * Fit of the diffusion coefficients q1, q2, q3 to measured Allan and Hadamard deviations
 * (weighted, non-negative least squares on the variances).
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requirePositive } from '../internal/validate.js';
import type { Dimensionless, Seconds } from '../units.js';
import { cholesky, element, type Matrix } from './linalg.js';
import { type ClockDiffusion, type ClockStates, requireStates } from './noise.js';

/** A measured stability point for {@link fitDiffusion}. */
export interface MeasuredStabilityPoint {
  /** Averaging time, in seconds. */
  readonly tau: Seconds;
  /** Measured deviation (ADEV/OADEV for `allan`, HDEV/OHDEV for `hadamard`), dimensionless. */
  readonly deviation: Dimensionless;
  /** Which variance the deviation belongs to. */
  readonly kind: 'allan' | 'hadamard';
  /**
   * Equivalent degrees of freedom of the estimate. When every point has one, the weights are
   * absolute (var(σ̂²) = 2σ⁴/edf) and the covariance is not rescaled.
   */
  readonly edf?: number;
}

/** Options of {@link fitDiffusion}. */
export interface DiffusionFitOptions {
  /**
   * 2: fit q1, q2 (q3 = 0); 3: fit q1, q2, q3 (Hadamard points only, since the Allan variance is
   * not stationary with drift noise). Default: 3 when every point is `hadamard`, else 2.
   */
  readonly states?: ClockStates;
}

/** Result of {@link fitDiffusion}. */
export interface DiffusionFit {
  /** Fitted coefficients, each ≥ 0: q1 (s), q2 (1/s), q3 (1/s³; 0 for a 2-state fit). */
  readonly q: Required<ClockDiffusion>;
  /** States of the model fitted. */
  readonly states: ClockStates;
  /** Covariance of [q1, q2(, q3)] (rows/columns of coefficients held at 0 by the constraint are zero). */
  readonly covariance: Matrix;
  /** True when the covariance was scaled by the reduced chi-square (some point had no edf). */
  readonly covarianceScaled: boolean;
  /** Coefficients the non-negativity constraint held at zero. */
  readonly atZero: readonly ('q1' | 'q2' | 'q3')[];
  /** Model variance at each point (dimensionless). */
  readonly modelVariance: readonly number[];
  /** Normalised residual per point: (measured variance − model)/σ(variance estimate). */
  readonly normalizedResiduals: readonly number[];
  /** Σ normalised residual²; with absolute weights it is χ²-distributed with `dof` degrees of freedom. */
  readonly chiSquare: number;
  /** Points minus free coefficients. */
  readonly dof: number;
}

/** Coefficient vector of q in the variance model at τ (Zucca & Tavella 2005 [M citation]; verified by simulation [C]). */
function designRow(tau: number, kind: 'allan' | 'hadamard', states: ClockStates): number[] {
  if (kind === 'allan') return states === 2 ? [1 / tau, tau / 3] : [1 / tau, tau / 3, 0];
  return states === 2 ? [1 / tau, tau / 6] : [1 / tau, tau / 6, (11 * tau ** 3) / 120];
}

/** Weighted least squares on the subset `free` of columns; returns coefficients and (AᵀWA)⁻¹ on the subset. */
function solveSubset(
  rows: readonly number[][],
  targets: readonly number[],
  weights: readonly number[],
  free: readonly number[],
): { beta: number[]; cov: Matrix } | undefined {
  const p = free.length;
  // Column scaling keeps the normal matrix well conditioned (the columns differ by up to τ⁴).
  const scale = free.map((c) => Math.sqrt(rows.reduce((s, r, i) => s + at(weights, i) * at(r, c) ** 2, 0)) || 1);
  const n = new Array(p).fill(0).map(() => new Array<number>(p).fill(0));
  const b = new Array<number>(p).fill(0);
  rows.forEach((r, i) => {
    const w = at(weights, i);
    for (let a = 0; a < p; a++) {
      const ra = at(r, at(free, a)) / at(scale, a);
      b[a] = at(b, a) + w * ra * at(targets, i);
      for (let c = 0; c < p; c++) at(n, a)[c] = element(n, a, c) + w * ra * (at(r, at(free, c)) / at(scale, c));
    }
  });
  const l = cholesky(n);
  if (!l) return undefined;
  // Solve L Lᵀ z = b, then inverse by unit vectors.
  const solve = (rhs: number[]): number[] => {
    const z = rhs.slice();
    for (let i = 0; i < p; i++) {
      for (let k = 0; k < i; k++) z[i] = at(z, i) - element(l, i, k) * at(z, k);
      z[i] = at(z, i) / element(l, i, i);
    }
    for (let i = p - 1; i >= 0; i--) {
      for (let k = i + 1; k < p; k++) z[i] = at(z, i) - element(l, k, i) * at(z, k);
      z[i] = at(z, i) / element(l, i, i);
    }
    return z;
  };
  const z = solve(b);
  const beta = z.map((v, a) => v / at(scale, a));
  const cov: Matrix = [];
  for (let a = 0; a < p; a++) {
    const e = new Array<number>(p).fill(0);
    e[a] = 1;
    const col = solve(e);
    for (let c = 0; c < p; c++) {
      if (!cov[c]) cov[c] = new Array<number>(p).fill(0);
      at(cov, c)[a] = at(col, c) / (at(scale, a) * at(scale, c));
    }
  }
  return { beta, cov };
}

/** The validated points of {@link fitDiffusion}: states, τ (s), measured variances, edf (1 when absent). */
function readDiffusionPoints(
  points: readonly MeasuredStabilityPoint[],
  options: DiffusionFitOptions,
): { states: ClockStates; taus: number[]; measured: number[]; edfs: number[]; allEdf: boolean } {
  if (!Array.isArray(points) || points.length === 0) {
    throw new InvalidArgumentError('points', points, 'a non-empty array of { tau, deviation, kind, edf? }');
  }
  const allHadamard = points.every((p) => typeof p === 'object' && p !== null && p.kind === 'hadamard');
  const states = options.states === undefined ? (allHadamard ? 3 : 2) : requireStates(options.states);
  const taus: number[] = [];
  const measured: number[] = [];
  const edfs: number[] = [];
  let allEdf = true;
  points.forEach((p, i) => {
    if (typeof p !== 'object' || p === null)
      throw new InvalidArgumentError(`points[${i}]`, p, 'an object { tau, deviation, kind, edf? }');
    taus.push(requirePositive(`points[${i}].tau`, p.tau, 's'));
    const dev = requirePositive(`points[${i}].deviation`, p.deviation);
    measured.push(dev * dev);
    if (p.kind !== 'allan' && p.kind !== 'hadamard')
      throw new InvalidArgumentError(`points[${i}].kind`, p.kind, "'allan' or 'hadamard'");
    if (p.kind === 'allan' && states === 3) {
      throw new InvalidArgumentError(
        `points[${i}].kind`,
        p.kind,
        "'hadamard' in a 3-state fit",
        'with random-walk drift noise the Allan variance is not stationary; fit q3 from Hadamard deviations',
      );
    }
    if (p.edf === undefined) {
      allEdf = false;
      edfs.push(1);
    } else {
      edfs.push(requirePositive(`points[${i}].edf`, p.edf));
    }
  });
  const nq = states;
  if (points.length < nq) {
    throw new InvalidArgumentError('points', points.length, `at least ${nq} points for a ${states}-state fit`);
  }
  return { states, taus, measured, edfs, allEdf };
}

/**
 * Iteratively reweighted, non-negative least squares of {@link fitDiffusion}: six passes, each solving every
 * subset of coefficients and keeping the best feasible one; returns it and the last weighting variances.
 */
function nonNegativeIrls(
  rows: readonly number[][],
  measured: readonly number[],
  edfs: readonly number[],
  nq: number,
  points: readonly MeasuredStabilityPoint[],
): { best: { beta: number[]; cov: Matrix; free: number[]; ssr: number }; variances: number[] } {
  const subsets: number[][] = [];
  for (let mask = 1; mask < 1 << nq; mask++) {
    const s: number[] = [];
    for (let c = 0; c < nq; c++) if (mask & (1 << c)) s.push(c);
    subsets.push(s);
  }
  let variances = measured.slice();
  let best: { beta: number[]; cov: Matrix; free: number[]; ssr: number } | undefined;
  for (let iter = 0; iter < 6; iter++) {
    const weights = variances.map((v, i) => at(edfs, i) / (2 * v * v));
    best = undefined;
    for (const free of subsets) {
      const sol = solveSubset(rows, measured, weights, free);
      if (!sol || sol.beta.some((v) => v < 0)) continue;
      const full = new Array<number>(nq).fill(0);
      free.forEach((c, a) => {
        full[c] = at(sol.beta, a);
      });
      let ssr = 0;
      rows.forEach((r, i) => {
        const m = r.reduce((s, v, c) => s + v * at(full, c), 0);
        ssr += at(weights, i) * (at(measured, i) - m) ** 2;
      });
      if (!best || ssr < best.ssr) best = { beta: full, cov: sol.cov, free, ssr };
    }
    if (!best) break;
    const model = rows.map((r) => r.reduce((s, v, c) => s + v * at((best as { beta: number[] }).beta, c), 0));
    // Keep the measured variance where the model gives 0 (no weight information otherwise).
    variances = model.map((m, i) => (m > 0 ? m : at(measured, i)));
  }
  if (!best) {
    // Not reachable for positive τ and deviations (a single-coefficient subset is always solvable and ≥ 0).
    throw new InvalidArgumentError('points', points, 'points from which the coefficients can be determined');
  }
  return { best, variances };
}

/**
 * Fits diffusion coefficients to measured Allan and/or Hadamard deviations by weighted least
 * squares on the variances, with q ≥ 0.
 *
 *   model: σ²(τ) = q1/τ + q2τ/3 (Allan) or q1/τ + q2τ/6 + 11q3τ³/120 (Hadamard)
 *   weight: 1/var(σ̂²), var(σ̂²) = 2·(model σ²)²/edf (χ² statistics of the estimate, NIST SP 1065 §5.3 [M]);
 *           iterated 5 times with the current model (iteratively reweighted least squares), starting
 *           from the measured variances. Without edf, edf = 1 is used for every point (relative weights)
 *           and the covariance is scaled by χ²/dof.
 *   constraint: every subset of coefficients is solved and the best feasible (all ≥ 0) one kept
 *               (exact non-negative least squares for ≤ 3 unknowns).
 *
 * Our own arrangement of standard weighted least squares; the variance relations are from
 * Zucca & Tavella (2005).
 *
 * @param points   Measured points; τ > 0, deviation > 0, optional edf > 0. At least as many as coefficients.
 * @param options  `states` (2 or 3), see {@link DiffusionFitOptions}.
 * @returns {@link DiffusionFit}.
 * @throws {InvalidArgumentError} for an empty/short list, a bad point, Allan points in a 3-state fit,
 *         or states not 2/3.
 * @see Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation]; NIST SP 1065 §5.3 χ² statistics [M].
 */
export function fitDiffusion(
  points: readonly MeasuredStabilityPoint[],
  options: DiffusionFitOptions = {},
): DiffusionFit {
  const { states, taus, measured, edfs, allEdf } = readDiffusionPoints(points, options);
  const nq = states;
  const rows = points.map((p, i) => designRow(at(taus, i), p.kind, states));
  const { best, variances } = nonNegativeIrls(rows, measured, edfs, nq, points);
  const found = best;
  const weights = variances.map((v, i) => at(edfs, i) / (2 * v * v));
  const modelVariance = rows.map((r) => r.reduce((s, v, c) => s + v * at(found.beta, c), 0));
  const normalizedResiduals = modelVariance.map((m, i) => (at(measured, i) - m) * Math.sqrt(at(weights, i)));
  const chiSquare = normalizedResiduals.reduce((s, r) => s + r * r, 0);
  const dof = points.length - found.free.length;
  const scaleCov = !allEdf && dof > 0 ? chiSquare / dof : 1;
  const covariance: Matrix = Array.from({ length: nq }, () => new Array<number>(nq).fill(0));
  found.free.forEach((c, a) => {
    found.free.forEach((d, b) => {
      at(covariance, c)[d] = element(found.cov, a, b) * scaleCov;
    });
  });
  const names = ['q1', 'q2', 'q3'] as const;
  return {
    q: { q1: at(found.beta, 0), q2: at(found.beta, 1), q3: states === 3 ? at(found.beta, 2) : 0 },
    states,
    covariance,
    covarianceScaled: !allEdf && dof > 0,
    atZero: names.slice(0, nq).filter((_, c) => !found.free.includes(c)),
    modelVariance,
    normalizedResiduals,
    chiSquare,
    dof,
  };
}
