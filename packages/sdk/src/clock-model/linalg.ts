/**
 * Small dense linear algebra for the clock models (matrices of order ≤ 3 plus tall design
 * matrices). Row-major nested arrays; every function returns new arrays.
 *
 * @internal
 */

import { at } from '../internal/checked.js';

/** A dense matrix as rows of numbers. */
export type Matrix = number[][];

/** Element [i][j] of a matrix, or a `RangeError` naming the indices when there is none. */
export function element(a: readonly (readonly number[])[], i: number, j: number): number {
  return at(at(a, i, 'matrix'), j, `matrix[${i}]`);
}

/** xᵀ·M·y summed in the order Σ_k Σ_l x_k M_kl y_l (M square, x and y of its order). */
export function quadraticForm(x: readonly number[], m: readonly (readonly number[])[], y: readonly number[]): number {
  let sum = 0;
  for (const [k, row] of m.entries()) {
    const xk = at(x, k, 'x');
    for (const [l, mkl] of row.entries()) sum += xk * mkl * at(y, l, 'y');
  }
  return sum;
}

/** n × n zero matrix. */
export function zeros(n: number, m = n): Matrix {
  return Array.from({ length: n }, () => new Array<number>(m).fill(0));
}

/** n × n identity. */
export function identity(n: number): Matrix {
  const out = zeros(n);
  for (const [i, row] of out.entries()) row[i] = 1;
  return out;
}

/** Deep copy. */
export function copyMatrix(a: readonly (readonly number[])[]): Matrix {
  return a.map((row) => row.slice());
}

/** A·B. */
export function multiply(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix {
  const m = at(b, 0, 'b').length;
  return a.map((ai) => {
    const oi = new Array<number>(m).fill(0);
    for (const [p, bp] of b.entries()) {
      const aip = at(ai, p, 'a[i]');
      if (aip === 0) continue;
      for (const [j, bpj] of bp.entries()) oi[j] = at(oi, j, 'row') + aip * bpj;
    }
    return oi;
  });
}

/** Aᵀ. */
export function transpose(a: readonly (readonly number[])[]): Matrix {
  return at(a, 0, 'a').map((_, j) => a.map((row) => at(row, j, 'a[i]')));
}

/** A·v. */
export function multiplyVector(a: readonly (readonly number[])[], v: readonly number[]): number[] {
  return a.map((row) => {
    let s = 0;
    for (const [j, aij] of row.entries()) s += aij * at(v, j, 'v');
    return s;
  });
}

/** A·P·Aᵀ, symmetrised. */
export function congruence(a: readonly (readonly number[])[], p: readonly (readonly number[])[]): Matrix {
  return symmetrize(multiply(multiply(a, p), transpose(a)));
}

/** (A + Aᵀ)/2. */
export function symmetrize(a: Matrix): Matrix {
  for (const [i, ai] of a.entries()) {
    for (const [j, aj] of a.entries()) {
      if (j <= i) continue;
      const v = 0.5 * (at(ai, j, 'a[i]') + at(aj, i, 'a[j]'));
      ai[j] = v;
      aj[i] = v;
    }
  }
  return a;
}

/** A + B. */
export function add(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix {
  return a.map((row, i) => row.map((v, j) => v + element(b, i, j)));
}

/**
 * Cholesky factor L (lower triangular, A = L·Lᵀ) of a symmetric matrix, or `undefined` when a pivot
 * is not positive (Golub & Van Loan, Matrix Computations 4th ed., Alg. 4.2.1 [M]). Zero pivots are
 * accepted (positive semi-definite) when `allowSemidefinite`: the column is then set to zero.
 */
export function cholesky(a: readonly (readonly number[])[], allowSemidefinite = false): Matrix | undefined {
  const n = a.length;
  const l = zeros(n);
  // Order ≤ 3: checked reads throughout.
  for (const [j, lj] of l.entries()) {
    let d = element(a, j, j);
    for (const ljk of lj.slice(0, j)) d -= ljk ** 2;
    const scale = Math.abs(element(a, j, j));
    if (!(d > 1e-14 * scale)) {
      if (allowSemidefinite && d >= -1e-12 * scale) {
        lj[j] = 0;
        continue;
      }
      return undefined;
    }
    const ljj = Math.sqrt(d);
    lj[j] = ljj;
    for (const [i, li] of l.entries()) {
      if (i <= j) continue;
      let s = element(a, i, j);
      for (const [k, lik] of li.slice(0, j).entries()) s -= lik * at(lj, k, 'l[j]');
      li[j] = s / ljj;
    }
  }
  return l;
}

/**
 * Inverse of a symmetric positive-definite matrix through its Cholesky factor; `undefined` if
 * the matrix is not positive definite.
 */
export function inverseSpd(a: readonly (readonly number[])[]): Matrix | undefined {
  const n = a.length;
  const l = cholesky(a);
  if (!l) return undefined;
  // inv(L) by forward substitution, then inv(A) = inv(L)ᵀ inv(L).
  const li = zeros(n);
  for (const [j, lij] of li.entries()) {
    lij[j] = 1 / element(l, j, j);
    for (let i = j + 1; i < n; i++) {
      let s = 0;
      for (let k = j; k < i; k++) s -= element(l, i, k) * element(li, k, j);
      at(li, i, 'li')[j] = s / element(l, i, i);
    }
  }
  return symmetrize(multiply(transpose(li), li));
}
