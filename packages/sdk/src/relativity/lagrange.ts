/**
 * Lagrange interpolation through a few nodes (barycentric form) and the derivative of the
 * interpolating polynomial at a node, used by the precise-orbit correction (`precise.ts`) to form
 * a velocity from positions.
 *
 * @module
 */
import { InvalidArgumentError } from '../errors.js';
import { at } from '../internal/checked.js';
import { requireInRange, requireInteger } from '../internal/validate.js';

/** Default number of Lagrange nodes: 9 (a degree-8 polynomial), common practice for 15-min SP3, no source. */
export const DEFAULT_LAGRANGE_POINTS = 9;

/**
 * Derivative, at node `index`, of the Lagrange polynomial through (times[j], values[j]).
 *
 *   P'(x_i) = Σ_j D_ij y_j,  D_ij = (λ_j/λ_i)/(x_i − x_j) (j ≠ i),  D_ii = −Σ_{j≠i} D_ij,
 *   λ_j = 1 / Π_{m≠j} (x_j − x_m)   (barycentric weights)
 *
 * @param times   Distinct node abscissae, in seconds.
 * @param values  Ordinates at the nodes (any unit U).
 * @param index   Node at which to differentiate.
 * @returns dP/dt at times[index], in U per second.
 * @throws {InvalidArgumentError} for fewer than 2 nodes, mismatched lengths, repeated or non-finite abscissae, or a bad index.
 * @see J.-P. Berrut & L. N. Trefethen, "Barycentric Lagrange Interpolation", SIAM Review 46(3) (2004) 501–517, §9 [M].
 */
export function lagrangeDerivativeAtNode(times: ArrayLike<number>, values: ArrayLike<number>, index: number): number {
  const n = requireNodes(times, values, 2);
  requireInteger('index', index, 0, n - 1);
  return requireFiniteResult(applyDerivativeRow(derivativeRow(times, index), values, index), times);
}

/** Most nodes accepted by the public Lagrange helpers (higher degrees are ill-conditioned; common practice, no source). */
const MAX_LAGRANGE_NODES = 32;
/** Largest |abscissa| (s) and |ordinate| accepted by the public Lagrange helpers (our own bounds). */
const MAX_ABS_NODE = 1e12;
const MAX_ABS_ORDINATE = 1e15;

/** Validates the node arrays of the public Lagrange helpers; returns the node count. */
function requireNodes(times: unknown, values: unknown, min: number): number {
  const isArray = (v: unknown) => Array.isArray(v) || v instanceof Float64Array;
  if (!isArray(times)) throw new InvalidArgumentError('times', times, 'an array of node abscissae in seconds');
  if (!isArray(values)) throw new InvalidArgumentError('values', values, 'an array of ordinates, one per node');
  const t = times as ArrayLike<unknown>;
  const v = values as ArrayLike<unknown>;
  const n = t.length;
  if (n < min || n > MAX_LAGRANGE_NODES || v.length !== n) {
    throw new InvalidArgumentError(
      'times',
      n,
      `${min} to ${MAX_LAGRANGE_NODES} nodes and as many values (${v.length})`,
    );
  }
  for (let j = 0; j < n; j++) {
    requireInRange(`times[${j}]`, t[j], -MAX_ABS_NODE, MAX_ABS_NODE, { unit: 's' });
    requireInRange(`values[${j}]`, v[j], -MAX_ABS_ORDINATE, MAX_ABS_ORDINATE);
  }
  return n;
}

/** Refuses a non-finite interpolation result, which only nodes packed far closer than their span produce. */
function requireFiniteResult(result: number, times: ArrayLike<number>): number {
  if (!Number.isFinite(result)) {
    throw new InvalidArgumentError(
      'times',
      Array.from(times),
      'nodes whose spacing is not negligible against their span (the barycentric weights overflow)',
    );
  }
  return result;
}

/**
 * Row `index` of the differentiation matrix of the Lagrange polynomial through `times`: D_ij for
 * j ≠ i (the entry at `index` holds D_ii = −Σ_{j≠i} D_ij). Depends on the abscissae only, so one
 * row serves every coordinate. Berrut & Trefethen (2004) §9 [M]. Callers have validated n and index.
 */
export function derivativeRow(times: ArrayLike<number>, index: number): Float64Array {
  const nodes = barycentricNodes(times);
  const { x: xi, weight: lambdaI } = at(nodes, index, 'nodes');
  const row = new Float64Array(nodes.length);
  let diag = 0;
  for (const [j, { x, weight }] of nodes.entries()) {
    if (j === index) continue;
    const dij = weight / lambdaI / (xi - x);
    row[j] = dij;
    diag -= dij;
  }
  row[index] = diag;
  return row;
}

/**
 * P'(x_i) = Σ_{j≠i} D_ij y_j + D_ii y_i, summed in the same order as the one-coordinate form always
 * used (j ascending, the diagonal term last), so the result is the same double.
 */
export function applyDerivativeRow(row: Float64Array, values: ArrayLike<number>, index: number): number {
  let d = 0;
  for (const [j, dij] of row.entries()) {
    if (j === index) continue;
    d += dij * at(values, j, 'values');
  }
  return d + at(row, index, 'row') * at(values, index, 'values');
}

/**
 * Value at t of the Lagrange polynomial through (times[j], values[j]) (barycentric form 2).
 *
 *   P(t) = Σ_j (λ_j/(t − x_j)) y_j / Σ_j λ_j/(t − x_j),  or y_i when t = x_i
 *
 * @param times   Distinct node abscissae, in seconds.
 * @param values  Ordinates (unit U).
 * @param t       Abscissa, in seconds.
 * @returns P(t), in U.
 * @throws {InvalidArgumentError} as {@link lagrangeDerivativeAtNode}, or for a non-finite t.
 * @see Berrut & Trefethen (2004) eq. 4.2 [M].
 */
export function lagrangeInterpolate(times: ArrayLike<number>, values: ArrayLike<number>, t: number): number {
  requireNodes(times, values, 1);
  requireInRange('t', t, -MAX_ABS_NODE, MAX_ABS_NODE, { unit: 's' });
  let num = 0;
  let den = 0;
  for (const [j, { x, weight }] of barycentricNodes(times).entries()) {
    const dx = t - x;
    const y = at(values, j, 'values');
    if (dx === 0) return y;
    const w = weight / dx;
    num += w * y;
    den += w;
  }
  return requireFiniteResult(num / den, times);
}

/** The nodes with their barycentric weights λ_j = 1 / Π_{m≠j} (x_j − x_m), scaled by a common factor. */
function barycentricNodes(times: ArrayLike<number>): { x: number; weight: number }[] {
  const xs = Array.from(times);
  // Scale by the span so that the products neither overflow nor underflow.
  let lo = Infinity;
  let hi = -Infinity;
  for (const [j, x] of xs.entries()) {
    if (!Number.isFinite(x)) throw new InvalidArgumentError(`times[${j}]`, x, 'a finite abscissa in seconds');
    lo = Math.min(lo, x);
    hi = Math.max(hi, x);
  }
  const scale = hi > lo ? 4 / (hi - lo) : 1;
  return xs.map((x, j) => {
    let p = 1;
    for (const [m, xm] of xs.entries()) {
      if (m === j) continue;
      const dx = (x - xm) * scale;
      if (dx === 0) throw new InvalidArgumentError('times', x, 'distinct node abscissae (a time is repeated)');
      p *= dx;
    }
    // Unscaled λ_j = scaled λ_j · scale^(n−1); the factor is common to all j and cancels in every ratio used.
    return { x, weight: 1 / p };
  });
}
